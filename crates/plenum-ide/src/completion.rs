//! Completion: block kinds at the top level, the keys a block has not given
//! yet, units of the key's dimension after a number, zone names in
//! `serves`, names after `like`, 62.1 categories after a zone's `use`, and
//! the words a key takes.

use std::path::Path;

use plenum_engine::VENTILATION_CATEGORIES;
use plenum_model::SymbolKind;
use plenum_model::keys::{BlockKind, ValueKind, dimension_words, key_def, keys_of};
use plenum_syntax::{Block, Entry};
use plenum_units::{Dimension, Measure, Unit, UnitSystem, catalog};

use crate::Span;
use crate::hover::key_markdown;
use crate::syntax_at::{self, kind_of};
use crate::world::{Analysis, FileCtx};

#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum CompletionKind {
    /// A block kind or a top-level keyword (`zone`, `let`, `use`).
    Keyword,
    /// A key of the enclosing block.
    Key,
    /// A unit.
    Unit,
    Zone,
    Ahu,
    Let,
    /// A 62.1 ventilation category.
    Category,
    /// A word a key takes (`ip`, `draw_through`, `ventilation`, `db`).
    Word,
}

#[derive(Clone, Debug, PartialEq, Eq)]
pub struct CompletionItem {
    pub label: String,
    pub kind: CompletionKind,
    /// One line beside the label.
    pub detail: Option<String>,
    /// Markdown documentation.
    pub documentation: Option<String>,
    /// The text that replaces `replace`.
    pub insert_text: String,
    /// The span the item replaces (the partial word at the cursor).
    pub replace: Span,
}

/// Every unit that fits `dim`: the display units of both systems first,
/// then every other symbol of the table that fits.
pub(crate) fn units_for(dim: Dimension) -> Vec<String> {
    let mut out: Vec<String> = Vec::new();
    let push = |s: String, out: &mut Vec<String>| {
        if !s.is_empty() && !out.contains(&s) && Unit::parse(&s).is_ok_and(|u| u.fits(dim)) {
            out.push(s);
        }
    };
    for sys in [UnitSystem::Ip, UnitSystem::Si] {
        if let Some(u) = sys.preferred_unit(dim) {
            push(u.to_string(), &mut out);
        }
        for m in Measure::ALL {
            push(m.label(sys).to_string(), &mut out);
        }
    }
    for def in catalog() {
        push(def.symbol().to_string(), &mut out);
    }
    out
}

fn is_ident_char(c: char) -> bool {
    c.is_alphanumeric() || c == '_' || c == '-'
}

/// A token that is a number literal (`1_250`, `-4`, `38.5`, `1.2e3`).
fn is_number(tok: &str) -> bool {
    let t = tok.strip_prefix(['-', '+']).unwrap_or(tok);
    t.starts_with(|c: char| c.is_ascii_digit() || c == '.')
        && t.replace('_', "").parse::<f64>().is_ok()
}

/// The length of the numeric prefix of a word (`57°` → 2).
fn number_prefix(word: &str) -> usize {
    let mut end = 0;
    for (i, c) in word.char_indices() {
        if c.is_ascii_digit() || c == '_' || c == '.' || (i == 0 && (c == '-' || c == '+')) {
            end = i + c.len_utf8();
        } else {
            break;
        }
    }
    if end > 0 && is_number(&word[..end]) {
        end
    } else {
        0
    }
}

impl Analysis {
    /// Completion candidates at `offset` of `path`.
    pub fn completions(&self, path: &Path, offset: u32) -> Vec<CompletionItem> {
        let Some(ctx) = self.ctx(path) else {
            return Vec::new();
        };
        let text = ctx.text();
        let offset = (offset as usize).min(text.len());
        if !text.is_char_boundary(offset) {
            return Vec::new();
        }
        let line_start = text[..offset].rfind('\n').map_or(0, |i| i + 1);
        let line = &text[line_start..offset];
        if in_comment_or_string(line) {
            return Vec::new();
        }
        // The word at the cursor: back over a unit-or-name run.
        let word_start = line
            .char_indices()
            .rev()
            .find(|(_, c)| {
                c.is_whitespace()
                    || matches!(c, ',' | ';' | '{' | '}' | '(' | ')' | '*' | '+' | '=')
            })
            .map_or(0, |(i, c)| i + c.len_utf8());
        let word_end = text[offset..]
            .char_indices()
            .find(|(_, c)| !is_ident_char(*c))
            .map_or(text.len(), |(i, _)| offset + i);
        let mut word = &line[word_start..];
        let mut replace_start = line_start + word_start;
        let mut after_number = false;
        let n = number_prefix(word);
        if n > 0 {
            after_number = true;
            word = &word[n..];
            replace_start += n;
        }
        let _ = word;
        let replace = Span::new(replace_start as u32, word_end.max(offset) as u32);
        // The item so far: after the last `;`, `{` or `}` of the line.
        let stmt_start = line[..word_start]
            .rfind([';', '{', '}'])
            .map_or(0, |i| i + 1);
        let before: Vec<&str> = line[stmt_start..word_start]
            .split(|c: char| c.is_whitespace() || c == ',')
            .filter(|t| !t.is_empty())
            .collect();
        if !after_number && before.last().is_some_and(|t| is_number(t)) {
            after_number = true;
        }
        let parse = &ctx.file.parse;
        let at = syntax_at::locate(&parse.file, &parse.comments, offset as u32);
        let mut out = Vec::new();
        let push = |out: &mut Vec<CompletionItem>,
                    label: &str,
                    kind,
                    detail: Option<String>,
                    doc: Option<String>| {
            out.push(CompletionItem {
                label: label.to_string(),
                kind,
                detail,
                documentation: doc,
                insert_text: label.to_string(),
                replace,
            });
        };
        let Some(block) = at.block() else {
            // Top level.
            match before.as_slice() {
                [] => {
                    for k in BlockKind::TOP_LEVEL {
                        push(
                            &mut out,
                            k.keyword(),
                            CompletionKind::Keyword,
                            Some("block".into()),
                            Some(k.doc().into()),
                        );
                    }
                    push(
                        &mut out,
                        "let",
                        CompletionKind::Keyword,
                        Some("let NAME = VALUE".into()),
                        None,
                    );
                    push(
                        &mut out,
                        "use",
                        CompletionKind::Keyword,
                        Some("use \"PATH\"".into()),
                        None,
                    );
                }
                [kind, .., "like"] => {
                    let want = match BlockKind::from_keyword(kind) {
                        Some(BlockKind::Zone) => SymbolKind::Zone,
                        Some(BlockKind::Ahu) => SymbolKind::Ahu,
                        _ => return out,
                    };
                    names(&ctx, want, &[], &mut out, replace);
                }
                ["let", _, "=", ..] if !after_number => {
                    names(&ctx, SymbolKind::Let, &[], &mut out, replace)
                }
                _ => {}
            }
            return out;
        };
        let Some(kind) = kind_of(block, text) else {
            return out;
        };
        let Some(key) = before.first() else {
            // A key, or a nested block.
            let given = given_keys(block, text);
            for def in keys_of(kind) {
                if given
                    .iter()
                    .any(|g| *g == def.name || def.alternatives.contains(g))
                {
                    continue;
                }
                push(
                    &mut out,
                    def.name,
                    CompletionKind::Key,
                    Some(def.value.describe()),
                    Some(key_markdown(def)),
                );
            }
            for child in kind.children() {
                if !block.blocks().any(|b| b.kind.text(text) == child.keyword()) {
                    push(
                        &mut out,
                        child.keyword(),
                        CompletionKind::Keyword,
                        Some("block".into()),
                        Some(child.doc().into()),
                    );
                }
            }
            return out;
        };
        let Some(def) = key_def(kind, key) else {
            return out;
        };
        let units = |out: &mut Vec<CompletionItem>, dim: Dimension| {
            for u in units_for(dim) {
                let name = Unit::parse(&u).ok().map(|_| dimension_words(dim));
                out.push(CompletionItem {
                    label: u.clone(),
                    kind: CompletionKind::Unit,
                    detail: name,
                    documentation: None,
                    insert_text: u,
                    replace,
                });
            }
        };
        let words = |out: &mut Vec<CompletionItem>, ws: &[&str]| {
            for w in ws {
                out.push(CompletionItem {
                    label: (*w).to_string(),
                    kind: CompletionKind::Word,
                    detail: None,
                    documentation: None,
                    insert_text: (*w).to_string(),
                    replace,
                });
            }
        };
        match def.value {
            ValueKind::ZoneList => {
                // The names already written on the line (the value may run
                // on past a trailing comma while it is being typed).
                let listed: Vec<&str> = before[1..].to_vec();
                names(&ctx, SymbolKind::Zone, &listed, &mut out, replace);
            }
            ValueKind::Category if before.len() == 1 => {
                for c in VENTILATION_CATEGORIES {
                    out.push(CompletionItem {
                        label: c.name.to_string(),
                        kind: CompletionKind::Category,
                        detail: Some(c.description.to_string()),
                        documentation: Some(format!(
                            "R_p {} cfm/person, R_a {} cfm/ft² ({}; {})",
                            c.r_p_cfm_per_person, c.r_a_cfm_per_ft2, c.source, c.note
                        )),
                        insert_text: c.name.to_string(),
                        replace,
                    });
                }
            }
            ValueKind::Word(ws) if before.len() == 1 => words(&mut out, ws.0),
            ValueKind::Quantity(dim) => {
                if after_number {
                    units(&mut out, dim);
                } else {
                    names(&ctx, SymbolKind::Let, &[], &mut out, replace);
                }
            }
            ValueKind::OutdoorAir => {
                if after_number {
                    for dim in [
                        Dimension::AIRFLOW,
                        Dimension::RATIO,
                        Dimension::AIRFLOW_PER_PERSON,
                        Dimension::AIRFLOW_PER_AREA,
                    ] {
                        units(&mut out, dim);
                    }
                } else if before.len() == 1 {
                    words(&mut out, &["ventilation"]);
                }
            }
            ValueKind::LengthOrNone => {
                if after_number {
                    units(&mut out, Dimension::LENGTH);
                } else if before.len() == 1 {
                    words(&mut out, &["none"]);
                }
            }
            ValueKind::AirState => {
                if after_number {
                    units(&mut out, Dimension::TEMPERATURE);
                    units(&mut out, Dimension::HUMIDITY_RATIO);
                    words(&mut out, &["%rh"]);
                } else if before.len() > 1 && before.last().is_some_and(|t| Unit::parse(t).is_ok())
                {
                    words(&mut out, &["db", "wb", "dp"]);
                } else {
                    names(&ctx, SymbolKind::Let, &[], &mut out, replace);
                }
            }
            ValueKind::TemperatureRange => {
                if after_number {
                    units(&mut out, Dimension::TEMPERATURE);
                } else if before.len() > 1 {
                    words(&mut out, &["to"]);
                }
            }
            ValueKind::StaticPressure => {
                if after_number {
                    if before.contains(&"with") {
                        words(&mut out, &["%"]);
                    } else {
                        units(&mut out, Dimension::PRESSURE);
                    }
                } else if before.len() > 1 && !before.contains(&"with") {
                    words(&mut out, &["with"]);
                } else if before.last() == Some(&"with") {
                    words(&mut out, &["efficiency"]);
                }
            }
            ValueKind::Ratio | ValueKind::VentilationEfficiency if after_number => {
                words(&mut out, &["%"]);
            }
            ValueKind::VentilationEfficiency if before.len() == 1 => {
                words(&mut out, &["simplified", "calculated"]);
            }
            ValueKind::Count if !after_number => {
                names(&ctx, SymbolKind::Let, &[], &mut out, replace)
            }
            _ => {}
        }
        out
    }
}

/// A `#` before the cursor outside a string, or an open string.
fn in_comment_or_string(line: &str) -> bool {
    let mut in_str = false;
    let mut escaped = false;
    for c in line.chars() {
        match c {
            _ if escaped => escaped = false,
            '\\' if in_str => escaped = true,
            '"' => in_str = !in_str,
            '#' if !in_str => return true,
            _ => {}
        }
    }
    in_str
}

/// The keys a block gives itself.
fn given_keys<'a>(block: &Block, text: &'a str) -> Vec<&'a str> {
    block
        .body
        .entries
        .iter()
        .filter_map(|e| match e {
            Entry::Property(p) => Some(p.key.text(text)),
            _ => None,
        })
        .collect()
}

fn names(
    ctx: &FileCtx<'_>,
    kind: SymbolKind,
    skip: &[&str],
    out: &mut Vec<CompletionItem>,
    replace: Span,
) {
    let design = &ctx.design.model.design;
    for def in &ctx.design.model.symbols.defs {
        if def.kind != kind || skip.contains(&def.name.as_str()) {
            continue;
        }
        let detail = match kind {
            SymbolKind::Zone => design
                .zone_by_name(&def.name)
                .and_then(|z| z.label.clone())
                .or(Some("zone".into())),
            SymbolKind::Ahu => design
                .ahu_by_name(&def.name)
                .and_then(|a| a.label.clone())
                .or(Some("air handler".into())),
            SymbolKind::Let => ctx
                .design
                .model
                .file(def.loc.file)
                .map(|f| def.loc.span.text(&f.text).to_string()),
        };
        out.push(CompletionItem {
            label: def.name.clone(),
            kind: match kind {
                SymbolKind::Zone => CompletionKind::Zone,
                SymbolKind::Ahu => CompletionKind::Ahu,
                SymbolKind::Let => CompletionKind::Let,
            },
            detail,
            documentation: None,
            insert_text: def.name.clone(),
            replace,
        });
    }
}
