//! Semantic tokens: names by what they name (zone, air handler, `let`),
//! keys, units, block kinds and keywords.

use std::path::Path;

use plenum_model::SymbolKind;
use plenum_syntax::{Block, Entry, Item, Value};

use crate::Span;
use crate::syntax_at::{value_names, value_numbers};
use crate::world::Analysis;

#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum TokenKind {
    /// A zone name.
    Zone,
    /// An air handler name.
    Ahu,
    /// A `let` name.
    Let,
    /// A key.
    Key,
    /// A unit.
    Unit,
    /// A block kind (`zone`, `coil`) or a keyword (`use`, `let`, `like`).
    Keyword,
    /// A word value (`ventilation`, `ip`, `library`, `db`).
    Word,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub struct SemanticToken {
    pub span: Span,
    pub kind: TokenKind,
    /// The name is defined here.
    pub definition: bool,
}

impl Analysis {
    /// The semantic tokens of a file, sorted and non-overlapping.
    pub fn semantic_tokens(&self, path: &Path) -> Vec<SemanticToken> {
        let Some(ctx) = self.ctx(path) else {
            return Vec::new();
        };
        let text = ctx.text();
        let syms = &ctx.design.model.symbols;
        let id = ctx.id();
        let symbol_kind = |span: Span| -> Option<(TokenKind, bool)> {
            let as_token = |k: SymbolKind| match k {
                SymbolKind::Zone => TokenKind::Zone,
                SymbolKind::Ahu => TokenKind::Ahu,
                SymbolKind::Let => TokenKind::Let,
            };
            if let Some(d) = syms
                .defs
                .iter()
                .find(|d| d.name_loc.file == id && d.name_loc.span == span)
            {
                return Some((as_token(d.kind), true));
            }
            syms.refs
                .iter()
                .find(|r| r.loc.file == id && r.loc.span == span)
                .and_then(|r| syms.defs.get(r.def))
                .map(|d| (as_token(d.kind), false))
        };
        let mut out: Vec<SemanticToken> = Vec::new();
        let mut push = |span: Span, kind: TokenKind, definition: bool| {
            if !span.is_empty() {
                out.push(SemanticToken {
                    span,
                    kind,
                    definition,
                });
            }
        };
        let mut value = |v: &Value, push: &mut dyn FnMut(Span, TokenKind, bool)| {
            let mut names = Vec::new();
            value_names(v, &mut names);
            for n in names {
                match symbol_kind(n.span) {
                    Some((k, d)) => push(n.span, k, d),
                    None => push(n.span, TokenKind::Word, false),
                }
            }
            let mut numbers = Vec::new();
            value_numbers(v, &mut numbers);
            for n in numbers {
                if let Some(u) = n.unit {
                    push(u.span, TokenKind::Unit, false);
                }
            }
            for el in v.elements.iter() {
                if let Some(q) = el.qualifier {
                    push(q.span, TokenKind::Word, false);
                }
                if let Some(r) = &el.range_end {
                    push(r.keyword, TokenKind::Keyword, false);
                    if let Some(q) = r.qualifier {
                        push(q.span, TokenKind::Word, false);
                    }
                }
            }
            for w in &v.with {
                push(w.keyword, TokenKind::Keyword, false);
                push(w.key.span, TokenKind::Key, false);
            }
        };
        fn block(
            b: &Block,
            push: &mut dyn FnMut(Span, TokenKind, bool),
            value: &mut dyn FnMut(&Value, &mut dyn FnMut(Span, TokenKind, bool)),
            symbol_kind: &dyn Fn(Span) -> Option<(TokenKind, bool)>,
        ) {
            push(b.kind.span, TokenKind::Keyword, false);
            if let Some(n) = b.name
                && let Some((k, d)) = symbol_kind(n.span)
            {
                push(n.span, k, d);
            }
            if let Some(l) = &b.like {
                push(l.keyword, TokenKind::Keyword, false);
                if let Some((k, d)) = symbol_kind(l.name.span) {
                    push(l.name.span, k, d);
                }
            }
            for e in &b.body.entries {
                match e {
                    Entry::Property(p) => {
                        push(p.key.span, TokenKind::Key, false);
                        value(&p.value, push);
                    }
                    Entry::Block(inner) => block(inner, push, value, symbol_kind),
                    Entry::Error(_) => {}
                }
            }
        }
        for item in &ctx.file.parse.file.items {
            match item {
                Item::Block(b) => block(b, &mut push, &mut value, &symbol_kind),
                Item::Let(l) => {
                    push(l.keyword, TokenKind::Keyword, false);
                    if let Some((k, d)) = symbol_kind(l.name.span) {
                        push(l.name.span, k, d);
                    }
                    value(&l.value, &mut push);
                }
                Item::Use(u) => push(u.keyword, TokenKind::Keyword, false),
                Item::Error(_) => {}
            }
        }
        let _ = text;
        out.sort();
        out.dedup_by(|b, a| b.span.start < a.span.end);
        out
    }
}
