//! Document links: each `use` path points at the file it includes.

use std::path::{Path, PathBuf};

use plenum_model::fs::normalize;
use plenum_syntax::Item;

use crate::Span;
use crate::world::Analysis;

#[derive(Clone, Debug, PartialEq, Eq)]
pub struct DocumentLink {
    /// The path string, quotes included.
    pub span: Span,
    pub target: PathBuf,
}

/// A `use` path resolved against the folder of the file that writes it.
pub(crate) fn resolve(file: &Path, rel: &str) -> PathBuf {
    normalize(&file.parent().unwrap_or(Path::new("")).join(rel))
}

impl Analysis {
    /// The `use` paths of a file that lead to a file of the design.
    pub fn document_links(&self, path: &Path) -> Vec<DocumentLink> {
        let Some(ctx) = self.ctx(path) else {
            return Vec::new();
        };
        ctx.file
            .parse
            .file
            .items
            .iter()
            .filter_map(|i| match i {
                Item::Use(u) if !u.path.value.is_empty() => {
                    let target = resolve(&ctx.file.path, &u.path.value);
                    ctx.design.contains(&target).then_some(DocumentLink {
                        span: u.path.span,
                        target,
                    })
                }
                _ => None,
            })
            .collect()
    }
}
