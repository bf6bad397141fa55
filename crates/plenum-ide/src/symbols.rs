//! The outline of a file (document symbols) and the names of the workspace.

use std::path::{Path, PathBuf};

use plenum_model::SymbolKind;
use plenum_model::keys::BlockKind;
use plenum_syntax::{Block, Entry, Item};

use crate::Span;
use crate::syntax_at::kind_of;
use crate::world::Analysis;

/// What an outline entry is.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum OutlineKind {
    Project,
    Site,
    Zone,
    Ahu,
    Fan,
    Coil,
    /// A block of a kind the format does not have.
    Block,
    Let,
    Use,
    Key,
}

#[derive(Clone, Debug, PartialEq, Eq)]
pub struct DocumentSymbol {
    pub name: String,
    pub detail: Option<String>,
    pub kind: OutlineKind,
    /// The whole entry.
    pub span: Span,
    /// The part to select (the name, or the kind word).
    pub selection: Span,
    pub children: Vec<DocumentSymbol>,
}

#[derive(Clone, Debug, PartialEq, Eq)]
pub struct WorkspaceSymbol {
    pub name: String,
    pub kind: SymbolKind,
    pub path: PathBuf,
    pub span: Span,
    /// The label of the zone or air handler.
    pub detail: Option<String>,
}

fn outline_kind(k: Option<BlockKind>) -> OutlineKind {
    match k {
        Some(BlockKind::Project) => OutlineKind::Project,
        Some(BlockKind::Site) => OutlineKind::Site,
        Some(BlockKind::Zone) => OutlineKind::Zone,
        Some(BlockKind::Ahu) => OutlineKind::Ahu,
        Some(BlockKind::Fan) => OutlineKind::Fan,
        Some(BlockKind::Coil) => OutlineKind::Coil,
        None => OutlineKind::Block,
    }
}

fn block_symbol(b: &Block, text: &str) -> DocumentSymbol {
    let kind = kind_of(b, text);
    let (name, selection) = match b.name {
        Some(n) => (n.text(text).to_string(), n.span),
        None => (b.kind.text(text).to_string(), b.kind.span),
    };
    let mut detail = b.label.as_ref().map(|l| l.value.clone());
    if b.name.is_some() {
        let k = b.kind.text(text);
        detail = Some(match detail {
            Some(l) => format!("{k} \"{l}\""),
            None => k.to_string(),
        });
    }
    let children = b
        .body
        .entries
        .iter()
        .filter_map(|e| match e {
            Entry::Block(inner) => Some(block_symbol(inner, text)),
            Entry::Property(p) => Some(DocumentSymbol {
                name: p.key.text(text).to_string(),
                detail: Some(p.value.span.text(text).to_string()),
                kind: OutlineKind::Key,
                span: p.span,
                selection: p.key.span,
                children: Vec::new(),
            }),
            Entry::Error(_) => None,
        })
        .collect();
    DocumentSymbol {
        name,
        detail,
        kind: outline_kind(kind),
        span: b.span,
        selection,
        children,
    }
}

impl Analysis {
    /// The outline of a file: its blocks (with their keys and nested
    /// blocks), `let`s and `use`s, in order.
    pub fn document_symbols(&self, path: &Path) -> Vec<DocumentSymbol> {
        let Some(ctx) = self.ctx(path) else {
            return Vec::new();
        };
        let text = ctx.text();
        ctx.file
            .parse
            .file
            .items
            .iter()
            .filter_map(|item| match item {
                Item::Block(b) => Some(block_symbol(b, text)),
                Item::Let(l) => Some(DocumentSymbol {
                    name: l.name.text(text).to_string(),
                    detail: Some(l.value.span.text(text).to_string()),
                    kind: OutlineKind::Let,
                    span: l.span,
                    selection: l.name.span,
                    children: Vec::new(),
                }),
                Item::Use(u) => Some(DocumentSymbol {
                    name: u.path.value.clone(),
                    detail: Some("use".to_string()),
                    kind: OutlineKind::Use,
                    span: u.span,
                    selection: u.path.span,
                    children: Vec::new(),
                }),
                Item::Error(_) => None,
            })
            .collect()
    }

    /// The zones, air handlers and `let`s of every design whose name
    /// contains `query` (case-insensitive; every one for an empty query).
    pub fn workspace_symbols(&self, query: &str) -> Vec<WorkspaceSymbol> {
        let q = query.to_lowercase();
        let mut out: Vec<WorkspaceSymbol> = Vec::new();
        for d in self.designs.iter() {
            for def in &d.model.symbols.defs {
                if !def.name.to_lowercase().contains(&q) {
                    continue;
                }
                let Some(r) = d.range(def.name_loc) else {
                    continue;
                };
                let detail = match def.kind {
                    SymbolKind::Zone => d
                        .model
                        .design
                        .zone_by_name(&def.name)
                        .and_then(|z| z.label.clone()),
                    SymbolKind::Ahu => d
                        .model
                        .design
                        .ahu_by_name(&def.name)
                        .and_then(|a| a.label.clone()),
                    SymbolKind::Let => None,
                };
                let s = WorkspaceSymbol {
                    name: def.name.clone(),
                    kind: def.kind,
                    path: r.path,
                    span: r.span,
                    detail,
                };
                if !out.contains(&s) {
                    out.push(s);
                }
            }
        }
        out.sort_by(|a, b| (&a.name, &a.path, a.span).cmp(&(&b.name, &b.path, b.span)));
        out
    }
}
