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

struct Collector<'a> {
    syms: &'a plenum_model::Symbols,
    file: plenum_model::FileId,
    out: Vec<SemanticToken>,
}

impl Collector<'_> {
    fn push(&mut self, span: Span, kind: TokenKind, definition: bool) {
        if !span.is_empty() {
            self.out.push(SemanticToken {
                span,
                kind,
                definition,
            });
        }
    }

    fn symbol_kind(&self, span: Span) -> Option<(TokenKind, bool)> {
        let as_token = |k: SymbolKind| match k {
            SymbolKind::Zone => TokenKind::Zone,
            SymbolKind::Ahu => TokenKind::Ahu,
            SymbolKind::Let => TokenKind::Let,
        };
        let syms = self.syms;
        if let Some(d) = syms
            .defs
            .iter()
            .find(|d| d.name_loc.file == self.file && d.name_loc.span == span)
        {
            return Some((as_token(d.kind), true));
        }
        syms.refs
            .iter()
            .find(|r| r.loc.file == self.file && r.loc.span == span)
            .and_then(|r| syms.defs.get(r.def))
            .map(|d| (as_token(d.kind), false))
    }

    fn name(&mut self, span: Span, otherwise: Option<TokenKind>) {
        match (self.symbol_kind(span), otherwise) {
            (Some((k, d)), _) => self.push(span, k, d),
            (None, Some(k)) => self.push(span, k, false),
            (None, None) => {}
        }
    }

    fn value(&mut self, v: &Value) {
        let mut names = Vec::new();
        value_names(v, &mut names);
        for n in names {
            self.name(n.span, Some(TokenKind::Word));
        }
        let mut numbers = Vec::new();
        value_numbers(v, &mut numbers);
        for n in numbers {
            if let Some(u) = n.unit {
                self.push(u.span, TokenKind::Unit, false);
            }
        }
        for el in v.elements.iter() {
            if let Some(q) = el.qualifier {
                self.push(q.span, TokenKind::Word, false);
            }
            if let Some(r) = &el.range_end {
                self.push(r.keyword, TokenKind::Keyword, false);
                if let Some(q) = r.qualifier {
                    self.push(q.span, TokenKind::Word, false);
                }
            }
        }
        for w in &v.with {
            self.push(w.keyword, TokenKind::Keyword, false);
            self.push(w.key.span, TokenKind::Key, false);
        }
    }

    fn block(&mut self, b: &Block) {
        self.push(b.kind.span, TokenKind::Keyword, false);
        if let Some(n) = b.name {
            self.name(n.span, None);
        }
        if let Some(l) = &b.like {
            self.push(l.keyword, TokenKind::Keyword, false);
            self.name(l.name.span, None);
        }
        for e in &b.body.entries {
            match e {
                Entry::Property(p) => {
                    self.push(p.key.span, TokenKind::Key, false);
                    self.value(&p.value);
                }
                Entry::Block(inner) => self.block(inner),
                Entry::Error(_) => {}
            }
        }
    }
}

impl Analysis {
    /// The semantic tokens of a file, sorted and non-overlapping.
    pub fn semantic_tokens(&self, path: &Path) -> Vec<SemanticToken> {
        let Some(ctx) = self.ctx(path) else {
            return Vec::new();
        };
        let mut c = Collector {
            syms: &ctx.design.model.symbols,
            file: ctx.id(),
            out: Vec::new(),
        };
        for item in &ctx.file.parse.file.items {
            match item {
                Item::Block(b) => c.block(b),
                Item::Let(l) => {
                    c.push(l.keyword, TokenKind::Keyword, false);
                    c.name(l.name.span, None);
                    c.value(&l.value);
                }
                Item::Use(u) => c.push(u.keyword, TokenKind::Keyword, false),
                Item::Error(_) => {}
            }
        }
        let mut out = c.out;
        out.sort();
        out.dedup_by(|b, a| b.span.start < a.span.end);
        out
    }
}
