//! Go to definition, find references and rename, across the files of every
//! design that reads the file asked about.

use std::fmt;
use std::path::{Path, PathBuf};

use plenum_model::{SymbolKind, fs::normalize};

use crate::world::{Analysis, DesignData};
use crate::{FileRange, SourceChange, Span, TextEdit};

/// Where a name is defined.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct NavigationTarget {
    pub path: PathBuf,
    /// The whole definition (block or `let`).
    pub full_span: Span,
    /// The name in it.
    pub focus_span: Span,
    pub name: String,
    pub kind: SymbolKindName,
}

/// The kind of a named thing (a copy of the model's, for plain data).
pub type SymbolKindName = SymbolKind;

/// Why a rename cannot be done.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum RenameError {
    /// Nothing renamable at the cursor.
    NoSymbol,
    /// The new name is not an identifier (`[A-Za-z_][A-Za-z0-9_-]*`).
    InvalidName(String),
    /// The new name is a keyword of the format.
    Keyword(String),
    /// Another definition of that kind already has the name.
    Taken { name: String, existing: FileRange },
}

impl fmt::Display for RenameError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            RenameError::NoSymbol => {
                f.write_str("only the name of a zone, an air handler or a `let` can be renamed")
            }
            RenameError::InvalidName(n) => write!(
                f,
                "`{n}` is not a name: use letters, digits, `_` and `-`, starting with a letter or `_`"
            ),
            RenameError::Keyword(n) => write!(f, "`{n}` is a keyword of the format"),
            RenameError::Taken { name, existing } => write!(
                f,
                "`{name}` is already defined in {}",
                existing.path.display()
            ),
        }
    }
}

impl std::error::Error for RenameError {}

const KEYWORDS: [&str; 6] = ["use", "let", "like", "to", "with", "none"];

fn is_identifier(s: &str) -> bool {
    let mut chars = s.chars();
    matches!(chars.next(), Some(c) if c.is_ascii_alphabetic() || c == '_')
        && chars.all(|c| c.is_ascii_alphanumeric() || c == '_' || c == '-')
}

/// The symbol at a place in one design: (kind, name).
fn symbol_at(d: &DesignData, path: &Path, offset: u32) -> Option<(SymbolKind, String)> {
    let file = d.file_by_path(path)?;
    let i = d.model.symbols.at(file.id, offset)?;
    let def = d.model.symbols.defs.get(i)?;
    Some((def.kind, def.name.clone()))
}

impl Analysis {
    fn symbol(&self, path: &Path, offset: u32) -> Option<(SymbolKind, String)> {
        let path = normalize(path);
        self.designs_with(&path)
            .find_map(|d| symbol_at(d, &path, offset))
    }

    /// The definition of the name at the cursor.
    pub fn definition(&self, path: &Path, offset: u32) -> Vec<NavigationTarget> {
        let Some((kind, name)) = self.symbol(path, offset) else {
            return Vec::new();
        };
        let mut out: Vec<NavigationTarget> = Vec::new();
        for d in self.designs_with(path) {
            for def in &d.model.symbols.defs {
                if def.kind != kind || def.name != name {
                    continue;
                }
                let (Some(full), Some(focus)) = (d.range(def.loc), d.range(def.name_loc)) else {
                    continue;
                };
                let t = NavigationTarget {
                    path: focus.path,
                    full_span: full.span,
                    focus_span: focus.span,
                    name: def.name.clone(),
                    kind,
                };
                if !out.contains(&t) {
                    out.push(t);
                }
            }
        }
        out.sort_by(|a, b| (&a.path, a.focus_span).cmp(&(&b.path, b.focus_span)));
        out
    }

    /// Every place the name at the cursor is written: its definition (when
    /// `include_declaration`) and every use, in every design that reads the file.
    pub fn references(
        &self,
        path: &Path,
        offset: u32,
        include_declaration: bool,
    ) -> Vec<FileRange> {
        let Some((kind, name)) = self.symbol(path, offset) else {
            return Vec::new();
        };
        // The definitions the name stands for, where the file is read…
        let mut defined: Vec<FileRange> = Vec::new();
        for d in self.designs_with(path) {
            for def in &d.model.symbols.defs {
                if def.kind == kind
                    && def.name == name
                    && let Some(r) = d.range(def.name_loc)
                {
                    defined.push(r);
                }
            }
        }
        // …and every design that sees one of those definitions (a file
        // shared by several designs is referred to from each).
        let mut out: Vec<FileRange> = Vec::new();
        for d in self.designs.iter() {
            let syms = &d.model.symbols;
            for (i, def) in syms.defs.iter().enumerate() {
                if def.kind != kind || def.name != name {
                    continue;
                }
                let Some(at) = d.range(def.name_loc) else {
                    continue;
                };
                if !defined.contains(&at) {
                    continue;
                }
                if include_declaration {
                    out.push(at);
                }
                for r in syms.references(i) {
                    if let Some(r) = d.range(r.loc) {
                        out.push(r);
                    }
                }
            }
        }
        out.sort();
        out.dedup();
        out
    }

    /// The span of the name at the cursor, when it can be renamed.
    pub fn prepare_rename(&self, path: &Path, offset: u32) -> Result<Span, RenameError> {
        let path = normalize(path);
        for d in self.designs_with(&path) {
            let Some(file) = d.file_by_path(&path) else {
                continue;
            };
            let syms = &d.model.symbols;
            if let Some(def) = syms
                .defs
                .iter()
                .find(|def| def.name_loc.file == file.id && def.name_loc.span.touches(offset))
            {
                return Ok(def.name_loc.span);
            }
            if let Some(r) = syms
                .refs
                .iter()
                .find(|r| r.loc.file == file.id && r.loc.span.touches(offset))
            {
                return Ok(r.loc.span);
            }
        }
        Err(RenameError::NoSymbol)
    }

    /// Rename the zone, air handler or `let` at the cursor everywhere it is written.
    pub fn rename(
        &self,
        path: &Path,
        offset: u32,
        new_name: &str,
    ) -> Result<SourceChange, RenameError> {
        let (kind, old) = self.symbol(path, offset).ok_or(RenameError::NoSymbol)?;
        if !is_identifier(new_name) {
            return Err(RenameError::InvalidName(new_name.to_string()));
        }
        if KEYWORDS.contains(&new_name) {
            return Err(RenameError::Keyword(new_name.to_string()));
        }
        let mut change = SourceChange::default();
        if new_name == old {
            return Ok(change);
        }
        for d in self.designs_with(path) {
            if let Some(existing) = d
                .model
                .symbols
                .defs
                .iter()
                .find(|def| def.kind == kind && def.name == new_name)
                .and_then(|def| d.range(def.name_loc))
            {
                return Err(RenameError::Taken {
                    name: new_name.to_string(),
                    existing,
                });
            }
        }
        for r in self.references(path, offset, true) {
            change.insert(
                &r.path,
                TextEdit {
                    span: r.span,
                    new_text: new_name.to_string(),
                },
            );
        }
        Ok(change)
    }
}
