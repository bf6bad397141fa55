//! Definitions and references of names, for go-to-definition, find
//! references and rename.

use crate::design::Loc;

#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum SymbolKind {
    Zone,
    Ahu,
    Let,
}

impl SymbolKind {
    pub fn describe(self) -> &'static str {
        match self {
            SymbolKind::Zone => "zone",
            SymbolKind::Ahu => "air handler",
            SymbolKind::Let => "let",
        }
    }
}

/// A defined name.
#[derive(Clone, Debug, PartialEq)]
pub struct SymbolDef {
    pub kind: SymbolKind,
    pub name: String,
    /// The name where it is defined.
    pub name_loc: Loc,
    /// The whole definition (the block or the `let`).
    pub loc: Loc,
}

/// A use of a defined name.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct SymbolRef {
    /// Index into [`Symbols::defs`].
    pub def: usize,
    pub loc: Loc,
}

#[derive(Clone, Debug, Default, PartialEq)]
pub struct Symbols {
    pub defs: Vec<SymbolDef>,
    pub refs: Vec<SymbolRef>,
}

impl Symbols {
    pub fn define(&mut self, kind: SymbolKind, name: String, name_loc: Loc, loc: Loc) -> usize {
        self.defs.push(SymbolDef {
            kind,
            name,
            name_loc,
            loc,
        });
        self.defs.len() - 1
    }

    pub fn reference(&mut self, def: usize, loc: Loc) {
        if !self.refs.iter().any(|r| r.def == def && r.loc == loc) {
            self.refs.push(SymbolRef { def, loc });
        }
    }

    /// The definition whose name or one of whose references is at `loc`'s file and offset.
    pub fn at(&self, file: crate::design::FileId, offset: u32) -> Option<usize> {
        self.defs
            .iter()
            .position(|d| d.name_loc.file == file && d.name_loc.span.touches(offset))
            .or_else(|| {
                self.refs
                    .iter()
                    .find(|r| r.loc.file == file && r.loc.span.touches(offset))
                    .map(|r| r.def)
            })
    }

    /// Every reference of a definition.
    pub fn references(&self, def: usize) -> impl Iterator<Item = &SymbolRef> {
        self.refs.iter().filter(move |r| r.def == def)
    }
}
