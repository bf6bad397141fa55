//! Diagnostics as the editor shows them: located in one file, coded, with
//! related places in any file of the design and an optional fix.
//!
//! [`collect`] is the one function that turns a built design into
//! diagnostics. It takes the syntax errors of each file and the model's
//! findings; the engine's findings are worded by the checks crate, which
//! this function calls once it exists.

use std::path::PathBuf;

use plenum_engine::Evaluation;
use plenum_model::{Model, ModelDiagnostic};

use crate::{FileRange, SourceChange, Span, TextEdit};

#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Severity {
    Error,
    Warning,
    Info,
    Hint,
}

/// Another place that explains a diagnostic.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Related {
    pub range: FileRange,
    pub message: String,
}

/// A fix: a title for the code action and its edits.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Fix {
    pub title: String,
    pub change: SourceChange,
}

/// One diagnostic in one file.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Diagnostic {
    /// The stable code (`unknown-key`, `syntax-error`, …).
    pub code: String,
    pub severity: Severity,
    /// One line.
    pub message: String,
    pub span: Span,
    /// Short text under the span.
    pub label: Option<String>,
    pub related: Vec<Related>,
    pub help: Option<String>,
    pub fix: Option<Fix>,
}

/// Every diagnostic of a design, by file. `config` is the project's
/// `plenum.toml` (path and text) when there is one.
pub(crate) fn collect(
    model: &Model,
    eval: &Evaluation,
    config: Option<&(PathBuf, String)>,
) -> Vec<(PathBuf, Diagnostic)> {
    let _ = (eval, config);
    let mut out = Vec::new();
    for f in &model.files {
        for e in &f.parse.errors {
            out.push((
                f.path.clone(),
                Diagnostic {
                    code: e.kind.code().to_string(),
                    severity: Severity::Error,
                    message: e.message.clone(),
                    span: e.span,
                    label: e.label.clone(),
                    related: e
                        .related
                        .iter()
                        .map(|(span, message)| Related {
                            range: FileRange {
                                path: f.path.clone(),
                                span: *span,
                            },
                            message: message.clone(),
                        })
                        .collect(),
                    help: e.help.clone(),
                    fix: None,
                },
            ));
        }
    }
    for d in &model.diagnostics {
        if let Some(f) = model.file(d.loc.file) {
            out.push((f.path.clone(), from_model(model, d)));
        }
    }
    out
}

fn range(model: &Model, loc: plenum_model::Loc) -> Option<FileRange> {
    Some(FileRange {
        path: model.file(loc.file)?.path.clone(),
        span: loc.span,
    })
}

fn from_model(model: &Model, d: &ModelDiagnostic) -> Diagnostic {
    let fix = d.fix.as_ref().map(|f| {
        let mut change = SourceChange::default();
        for e in &f.edits {
            if let Some(r) = range(model, e.loc) {
                change.insert(
                    &r.path,
                    TextEdit {
                        span: r.span,
                        new_text: e.text.clone(),
                    },
                );
            }
        }
        Fix {
            title: f.title.clone(),
            change,
        }
    });
    Diagnostic {
        code: d.code.code().to_string(),
        severity: match d.severity {
            plenum_model::Severity::Error => Severity::Error,
            plenum_model::Severity::Warning => Severity::Warning,
            plenum_model::Severity::Info => Severity::Info,
        },
        message: d.message.clone(),
        span: d.loc.span,
        label: d.label.clone(),
        related: d
            .related
            .iter()
            .filter_map(|(loc, message)| {
                Some(Related {
                    range: range(model, *loc)?,
                    message: message.clone(),
                })
            })
            .collect(),
        help: d.help.clone(),
        fix,
    }
}
