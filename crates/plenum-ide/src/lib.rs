//! The analysis façade of Plenum: everything an editor asks about a design
//! file, answered as plain data in byte offsets.
//!
//! * [`AnalysisHost`] holds the open documents (an overlay over a base
//!   [`FileSystem`]) and the design files known on disk, and re-analyses only
//!   the designs an edit affects: those whose files include the edited file.
//! * [`Analysis`] is an immutable snapshot that answers the questions:
//!   diagnostics per file, hover, inlay hints, completion, definition,
//!   references, rename, document and workspace symbols, folding ranges,
//!   document links, semantic tokens, code actions and formatting.
//!
//! Nothing here knows LSP or JSON: positions are byte offsets into the text
//! of one file (`plenum-lsp` converts them with
//! [`LineIndex`](plenum_syntax::LineIndex)); files are normalised paths. The
//! only IO is through [`plenum_model::FileSystem`].
//!
//! ```
//! use plenum_ide::AnalysisHost;
//! use plenum_model::MemoryFs;
//! use std::path::Path;
//!
//! let mut host = AnalysisHost::new(MemoryFs::new());
//! let path = Path::new("/w/office.plenum");
//! host.set_document(path, "site { cooling 94 °F db, 75 °F wb }\n\
//!     zone office { area 1_000 ft²; people 5; use office; sensible 20 kBtu/h; latent 2 kBtu/h }\n\
//!     ahu rtu_1 { serves office }\n".to_string());
//! let analysis = host.analysis();
//! let at = analysis.text(path).unwrap().find("rtu_1").unwrap() as u32;
//! let hover = analysis.hover(path, at).unwrap();
//! assert!(hover.markdown.contains("ton"));
//! ```

mod actions;
mod completion;
mod diagnostics;
pub mod fixture;
mod folding;
mod format;
mod host;
mod hover;
mod inlay;
mod links;
mod navigation;
pub mod report;
mod symbols;
mod syntax_at;
mod tokens;
mod world;

use std::path::{Path, PathBuf};

pub use plenum_model::{FileSystem, MemoryFs, RealFs};
pub use plenum_syntax::Span;

pub use actions::{CodeAction, STANDARD_SIZES_TON, next_standard_size};
pub use completion::{CompletionItem, CompletionKind};
pub use diagnostics::{Diagnostic, Fix, Related, Severity};
pub use folding::{FoldKind, FoldingRange};
pub use format::FormatError;
pub use host::AnalysisHost;
pub use inlay::{InlayHint, InlayKind};
pub use links::DocumentLink;
pub use navigation::{NavigationTarget, RenameError};
pub use symbols::{DocumentSymbol, OutlineKind, WorkspaceSymbol};
pub use tokens::{SemanticToken, TokenKind};
pub use world::Analysis;

/// Replace the bytes of `span` by `new_text` (in one file).
#[derive(Clone, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct TextEdit {
    pub span: Span,
    pub new_text: String,
}

/// Edits to several files, each file's edits sorted and non-overlapping.
#[derive(Clone, Debug, Default, PartialEq, Eq, Hash)]
pub struct SourceChange {
    pub edits: std::collections::BTreeMap<PathBuf, Vec<TextEdit>>,
}

impl SourceChange {
    /// Add one edit (kept sorted; an identical edit is added once).
    pub fn insert(&mut self, path: &Path, edit: TextEdit) {
        let list = self.edits.entry(path.to_path_buf()).or_default();
        if !list.contains(&edit) {
            list.push(edit);
            list.sort();
        }
    }

    pub fn is_empty(&self) -> bool {
        self.edits.values().all(Vec::is_empty)
    }
}

/// A place in a file.
#[derive(Clone, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct FileRange {
    pub path: PathBuf,
    pub span: Span,
}

/// What a hover shows: Markdown, and the span it is about.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Hover {
    pub span: Span,
    pub markdown: String,
}

/// Apply sorted, non-overlapping edits to a text (for tests and clients).
/// `None` when an edit does not fit the text.
pub fn apply_edits(text: &str, edits: &[TextEdit]) -> Option<String> {
    let mut sorted: Vec<&TextEdit> = edits.iter().collect();
    sorted.sort_by_key(|e| (e.span.start, e.span.end));
    let mut out = String::with_capacity(text.len());
    let mut at = 0usize;
    for e in sorted {
        let (s, t) = (e.span.start as usize, e.span.end as usize);
        if s < at || t > text.len() || !text.is_char_boundary(s) || !text.is_char_boundary(t) {
            return None;
        }
        out.push_str(&text[at..s]);
        out.push_str(&e.new_text);
        at = t;
    }
    out.push_str(&text[at..]);
    Some(out)
}
