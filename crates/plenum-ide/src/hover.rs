//! Hover: an air handler's coil figures, a zone's airflow, a key's meaning,
//! a quantity in the other unit system, a diagnostic code's explanation.

use std::fmt::Write;
use std::path::Path;

use plenum_model::SymbolKind;
use plenum_model::keys::{BlockKind, KeyDef, ValueKind, key_def};
use plenum_syntax::{Block, Number, Property};
use plenum_units::{Measure, Quantity, Unit, UnitSystem, format_auto};

use crate::report;
use crate::syntax_at::{self, Node, kind_of};
use crate::world::{Analysis, FileCtx};
use crate::{Hover, Span};

impl Analysis {
    /// What to show when the pointer rests at `offset` of `path`.
    pub fn hover(&self, path: &Path, offset: u32) -> Option<Hover> {
        let ctx = self.ctx(path)?;
        let text = ctx.text();
        let parse = &ctx.file.parse;
        let at = syntax_at::locate(&parse.file, &parse.comments, offset);
        let parent = at.block().and_then(|b| kind_of(b, text));
        match at.node? {
            Node::BlockKind(b) | Node::BlockName(b) | Node::Header(b) => block_hover(&ctx, b),
            Node::LikeName(name) => symbol_hover(&ctx, name.span),
            Node::Key(p) => {
                let block = parent?;
                let def = key_def(block, p.key.text(text))?;
                Some(Hover {
                    span: p.key.span,
                    markdown: key_markdown(def),
                })
            }
            Node::ValueName(p, name) => symbol_hover(&ctx, name.span)
                .map(|mut h| {
                    if let Some(q) = property_quantity(&ctx, p) {
                        h.markdown.push_str("\n\n---\n\n");
                        h.markdown.push_str(&q);
                    }
                    h
                })
                .or_else(|| {
                    property_quantity(&ctx, p).map(|markdown| Hover {
                        span: p.value.span,
                        markdown,
                    })
                }),
            Node::Number(p, n) => {
                let whole = property_quantity(&ctx, p);
                let lit = literal(text, n, ctx.design.system);
                let markdown = match (whole, lit) {
                    (Some(w), Some(l)) if p.value.span != n.span() => format!("{l}\n\n{w}"),
                    (Some(w), _) => w,
                    (None, Some(l)) => l,
                    (None, None) => return None,
                };
                Some(Hover {
                    span: n.span(),
                    markdown,
                })
            }
            Node::Value(p) => property_quantity(&ctx, p).map(|markdown| Hover {
                span: p.value.span,
                markdown,
            }),
            Node::LetName(l) => symbol_hover(&ctx, l.name.span),
            Node::LetValueName(name) => symbol_hover(&ctx, name.span),
            Node::LetNumber(n) => literal(text, n, ctx.design.system).map(|markdown| Hover {
                span: n.span(),
                markdown,
            }),
            Node::Use(u) => {
                let target = crate::links::resolve(&ctx.file.path, &u.path.value);
                Some(Hover {
                    span: u.path.span,
                    markdown: format!(
                        "Includes `{}`: its blocks and `let`s become part of this design.",
                        target.display()
                    ),
                })
            }
            Node::Comment(span) => comment_hover(&ctx, span, offset),
        }
    }
}

/// A hover on a comment: a diagnostic code written in it (a suppression's
/// `# plenum: allow CODE -- reason`, or a code named in a note) is explained
/// from the checks registry; elsewhere on a suppression, every code it
/// allows is.
fn comment_hover(ctx: &FileCtx<'_>, span: Span, offset: u32) -> Option<Hover> {
    let text = ctx.text();
    let (sups, _) = plenum_checks::suppress::suppressions(&ctx.file.path, text, &ctx.file.parse);
    let sup = sups.iter().find(|s| s.comment == span);
    if let Some(s) = sup
        && let Some(c) = s.codes.iter().find(|c| c.span.touches(offset))
        && let Some(check) = plenum_checks::lookup(c.code)
    {
        return Some(Hover {
            span: c.span,
            markdown: check.explain(),
        });
    }
    // A registered code under the cursor, in any comment.
    let comment = span.text(text);
    let rel = offset.checked_sub(span.start)? as usize;
    let is_code_char = |c: char| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '-';
    let start = comment[..rel.min(comment.len())]
        .rfind(|c: char| !is_code_char(c))
        .map_or(0, |i| i + 1);
    let end = comment[start..]
        .find(|c: char| !is_code_char(c))
        .map_or(comment.len(), |i| start + i);
    if let Some(check) = comment.get(start..end).and_then(plenum_checks::lookup) {
        return Some(Hover {
            span: Span::new(span.start + start as u32, span.start + end as u32),
            markdown: check.explain(),
        });
    }
    let s = sup?;
    let mut md = format!(
        "**Suppression**: {}\n\nReason: {}\n",
        s.codes
            .iter()
            .map(|c| format!("`{}`", c.code))
            .collect::<Vec<_>>()
            .join(", "),
        s.reason
    );
    for c in &s.codes {
        if let Some(check) = plenum_checks::lookup(c.code) {
            let _ = write!(md, "\n- `{}`: {}", check.code, check.summary);
        }
    }
    Some(Hover { span, markdown: md })
}

fn block_hover(ctx: &FileCtx<'_>, b: &Block) -> Option<Hover> {
    let text = ctx.text();
    let span = b.header_span();
    match kind_of(b, text) {
        Some(BlockKind::Ahu) => {
            let name = b.name?;
            ahu_hover(ctx, name.text(text), span)
        }
        Some(BlockKind::Zone) => {
            let name = b.name?;
            zone_hover(ctx, name.text(text), span)
        }
        Some(k) => Some(Hover {
            span: b.kind.span,
            markdown: format!("**{}**\n\n{}", k.keyword(), k.doc()),
        }),
        None => None,
    }
}

fn ahu_hover(ctx: &FileCtx<'_>, name: &str, span: Span) -> Option<Hover> {
    let d = ctx.design;
    let index = d.model.design.ahus.iter().position(|a| a.name == name)?;
    let markdown = match report::ahu_summary(&d.model.design, &d.eval, index, d.system)? {
        Ok(s) => s.markdown(),
        Err(why) => format!("{why}\n\n*{}*", report::CAUTION),
    };
    Some(Hover { span, markdown })
}

fn zone_hover(ctx: &FileCtx<'_>, name: &str, span: Span) -> Option<Hover> {
    let d = ctx.design;
    let z = d.eval.zones.iter().find(|z| z.name == name)?;
    Some(Hover {
        span,
        markdown: report::zone_markdown(&d.model.design, &d.eval, z, d.system),
    })
}

/// A hover on a name that refers to (or defines) a zone, air handler or `let`.
fn symbol_hover(ctx: &FileCtx<'_>, span: Span) -> Option<Hover> {
    let syms = &ctx.design.model.symbols;
    let def = syms.defs.get(syms.at(ctx.id(), span.start)?)?;
    match def.kind {
        SymbolKind::Zone => zone_hover(ctx, &def.name, span),
        SymbolKind::Ahu => ahu_hover(ctx, &def.name, span),
        SymbolKind::Let => {
            let file = ctx.design.model.file(def.loc.file)?;
            let src = def.loc.span.text(&file.text);
            let mut markdown = format!("```plenum\n{src}\n```");
            if let Some(q) = ctx
                .design
                .model
                .lets
                .iter()
                .find(|l| l.name_loc == def.name_loc)
                .and_then(|l| l.quantity)
            {
                markdown.push_str("\n\n");
                markdown.push_str(&both_systems(&def.name, &q, ctx.design.system, None));
            }
            Some(Hover { span, markdown })
        }
    }
}

/// The evaluated quantity of a property, in the project's units and the other system.
fn property_quantity(ctx: &FileCtx<'_>, p: &Property) -> Option<String> {
    let loc = ctx.loc(p.span);
    let info = ctx.design.model.properties.iter().find(|i| i.loc == loc)?;
    let q = info.quantity?;
    Some(both_systems(
        info.def.name,
        &q,
        ctx.design.system,
        info.def.measure(),
    ))
}

/// A value in the project's units and the other system, in the key's
/// measure when it has one (a rated capacity in tons), else by dimension.
fn both_systems(what: &str, q: &Quantity, system: UnitSystem, measure: Option<Measure>) -> String {
    let show = |sys| match measure {
        Some(m) if m.dimension() == q.dimension() => m.format(q, sys),
        _ => format_auto(q, sys),
    };
    let here = show(system);
    let there = show(system.other());
    if here == there {
        format!("`{what}` = {here}")
    } else {
        format!(
            "`{what}` = {here}\n\nIn {}: {there}",
            system_name(system.other())
        )
    }
}

fn system_name(s: UnitSystem) -> &'static str {
    match s {
        UnitSystem::Ip => "IP units",
        UnitSystem::Si => "SI units",
    }
}

/// A number literal with its unit, in both systems.
fn literal(text: &str, n: &Number, system: UnitSystem) -> Option<String> {
    let unit = match n.unit {
        Some(u) => Unit::parse(u.text(text)).ok()?,
        None => return None,
    };
    let q = Quantity::new(n.value, &unit).ok()?;
    let written = n.span().text(text);
    let here = format_auto(&q, system);
    let there = format_auto(&q, system.other());
    Some(format!(
        "`{written}` = {here} = {there} ({})",
        system_name(system.other())
    ))
}

/// A key's documentation from the key table.
pub(crate) fn key_markdown(def: &KeyDef) -> String {
    let mut s = format!(
        "**{}** (in `{}`)\n\n{}\n\n",
        def.name,
        def.block.keyword(),
        def.doc
    );
    let _ = writeln!(s, "- **Value**: {}", def.value.describe());
    if let ValueKind::Quantity(dim) = def.value {
        let units: Vec<String> = [UnitSystem::Ip, UnitSystem::Si]
            .iter()
            .filter_map(|sys| sys.preferred_unit(dim).map(|u| format!("`{u}`")))
            .collect();
        let more = crate::completion::units_for(dim);
        let more: Vec<String> = more.iter().take(8).map(|u| format!("`{u}`")).collect();
        if !more.is_empty() {
            let _ = writeln!(s, "- **Units**: {}", more.join(", "));
        } else if !units.is_empty() {
            let _ = writeln!(s, "- **Units**: {}", units.join(", "));
        }
    }
    match (def.default, def.default_source) {
        (Some(d), Some(src)) => {
            let _ = writeln!(s, "- **Default**: {d} ({})", src.describe());
        }
        _ if def.required => s.push_str("- **Required**: no default\n"),
        _ => s.push_str("- **Default**: none\n"),
    }
    if !def.alternatives.is_empty() {
        let alts: Vec<String> = def.alternatives.iter().map(|a| format!("`{a}`")).collect();
        let _ = writeln!(s, "- **Instead of**: {} (give only one)", alts.join(", "));
    }
    let _ = write!(s, "\nExample: `{} {}`", def.name, def.example);
    s
}
