//! The analysed state of the workspace: every design, built once, shared by
//! every query of one [`Analysis`] snapshot.

use foldhash::{HashSet, HashSetExt};
use std::path::{Path, PathBuf};
use std::sync::Arc;

use plenum_engine::Evaluation;
use plenum_model::{FileId, Loc, Model, SourceFile, fs::normalize};
use plenum_units::UnitSystem;

use crate::diagnostics::{self, Diagnostic};
use crate::{FileRange, Span};

/// One design: its root file, the model of it and every file it uses, the
/// engine's evaluation, and the diagnostics of all its files.
#[derive(Debug)]
pub(crate) struct DesignData {
    pub root: PathBuf,
    pub model: Model,
    pub eval: Evaluation,
    /// The project's display units (`units ip|si`; IP when not given).
    pub system: UnitSystem,
    /// Diagnostics by file path.
    pub diagnostics: Vec<(PathBuf, Diagnostic)>,
}

impl DesignData {
    /// Build the design whose root file is `root` (already read and
    /// parsed); `parsed` offers files already parsed (see
    /// [`Model::build_parsed`]).
    pub fn build(
        fs: &dyn plenum_model::FileSystem,
        root: &Path,
        root_file: plenum_model::Parsed,
        parsed: &mut dyn FnMut(&Path) -> Option<plenum_model::Parsed>,
    ) -> DesignData {
        let model = Model::build_parsed(fs, root, root_file, parsed);
        let eval = plenum_engine::evaluate(&model.design);
        let config = plenum_checks::Config::discover(fs, root);
        let diagnostics = diagnostics::collect(&model, &eval, &config);
        let system = model
            .design
            .project
            .units
            .map(|u| u.value)
            .unwrap_or_default();
        DesignData {
            root: root.to_path_buf(),
            model,
            eval,
            system,
            diagnostics,
        }
    }

    /// Whether the design reads this file.
    pub fn contains(&self, path: &Path) -> bool {
        self.model.files.iter().any(|f| f.path == path)
    }

    pub fn file_by_path(&self, path: &Path) -> Option<&SourceFile> {
        self.model.files.iter().find(|f| f.path == path)
    }

    pub fn path_of(&self, id: FileId) -> Option<&Path> {
        self.model.file(id).map(|f| f.path.as_path())
    }

    pub fn range(&self, loc: Loc) -> Option<FileRange> {
        Some(FileRange {
            path: self.path_of(loc.file)?.to_path_buf(),
            span: loc.span,
        })
    }
}

/// An immutable snapshot of the analysis: cheap to clone, safe to query
/// from several threads while the host moves on.
#[derive(Clone, Debug, Default)]
pub struct Analysis {
    pub(crate) designs: Arc<Vec<Arc<DesignData>>>,
}

/// A file of a design, found for a query.
pub(crate) struct FileCtx<'a> {
    pub design: &'a DesignData,
    pub file: &'a SourceFile,
}

impl<'a> FileCtx<'a> {
    pub fn text(&self) -> &'a str {
        &self.file.text
    }
    pub fn id(&self) -> FileId {
        self.file.id
    }
    pub fn loc(&self, span: Span) -> Loc {
        Loc {
            file: self.file.id,
            span,
        }
    }
}

impl Analysis {
    /// The design the query about `path` is answered in: the design whose root
    /// it is, else the first design that uses it.
    pub(crate) fn ctx(&self, path: &Path) -> Option<FileCtx<'_>> {
        let path = normalize(path);
        let design = self
            .designs
            .iter()
            .find(|d| d.root == path)
            .or_else(|| self.designs.iter().find(|d| d.contains(&path)))?;
        let file = design.file_by_path(&path)?;
        Some(FileCtx { design, file })
    }

    /// Every design that reads `path`.
    pub(crate) fn designs_with(&self, path: &Path) -> impl Iterator<Item = &DesignData> {
        let path = normalize(path);
        self.designs
            .iter()
            .map(|d| &**d)
            .filter(move |d| d.contains(&path))
    }

    /// The root files of the designs, in order.
    pub fn design_roots(&self) -> Vec<PathBuf> {
        self.designs.iter().map(|d| d.root.clone()).collect()
    }

    /// Every file some design reads, sorted.
    pub fn files(&self) -> Vec<PathBuf> {
        let mut out: Vec<PathBuf> = self
            .designs
            .iter()
            .flat_map(|d| d.model.files.iter().map(|f| f.path.clone()))
            .collect();
        out.sort();
        out.dedup();
        out
    }

    /// Every file of every design that reads `path` (`path` included).
    pub fn related_files(&self, path: &Path) -> Vec<PathBuf> {
        let mut out: Vec<PathBuf> = self
            .designs_with(path)
            .flat_map(|d| d.model.files.iter().map(|f| f.path.clone()))
            .collect();
        out.sort();
        out.dedup();
        out
    }

    /// The text of a file as the analysis read it.
    pub fn text(&self, path: &Path) -> Option<&str> {
        self.ctx(path).map(|c| c.text())
    }

    /// The line index of a file (for converting offsets to positions).
    pub fn line_index(&self, path: &Path) -> Option<&plenum_syntax::LineIndex> {
        self.ctx(path).map(|c| &c.file.lines)
    }

    /// The display unit system of the design a file belongs to.
    pub fn unit_system(&self, path: &Path) -> UnitSystem {
        self.ctx(path).map(|c| c.design.system).unwrap_or_default()
    }

    /// The diagnostics of one file, from every design that reads it (a
    /// finding two designs share is given once), sorted by position.
    pub fn diagnostics(&self, path: &Path) -> Vec<Diagnostic> {
        let path = normalize(path);
        let mut out: Vec<Diagnostic> = Vec::new();
        let designs: Vec<&DesignData> = self.designs_with(&path).collect();
        // What is already in `out`, and (made when first needed) each
        // design's diagnostics of this file: sets, so that the whole is
        // linear in the diagnostics (searching `out` for each was quadratic).
        let mut seen: HashSet<&Diagnostic> = HashSet::new();
        let mut of_design: Option<Vec<HashSet<&Diagnostic>>> = None;
        for d in &designs {
            for (p, diag) in &d.diagnostics {
                if *p != path || seen.contains(diag) {
                    continue;
                }
                // With one design, that design is the one reporting it.
                if diagnostics::ABSENCE.contains(&diag.code.as_str()) && designs.len() > 1 {
                    let sets = of_design.get_or_insert_with(|| {
                        designs
                            .iter()
                            .map(|o| {
                                o.diagnostics
                                    .iter()
                                    .filter(|(q, _)| *q == path)
                                    .map(|(_, e)| e)
                                    .collect()
                            })
                            .collect()
                    });
                    if !sets.iter().all(|s| s.contains(diag)) {
                        continue;
                    }
                }
                seen.insert(diag);
                out.push(diag.clone());
            }
        }
        out.sort_by(|a, b| {
            (a.span.start, a.span.end, &a.code).cmp(&(b.span.start, b.span.end, &b.code))
        });
        out
    }
}
