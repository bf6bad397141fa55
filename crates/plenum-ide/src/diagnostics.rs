//! Diagnostics as the editor shows them: located in one file, coded, with
//! related places in any file of the design and an optional fix.
//!
//! [`collect`] is the one function that turns a built design into
//! diagnostics: it runs `plenum_checks::check`, as `plenum check` does.

use std::path::PathBuf;

use plenum_engine::Evaluation;
use plenum_model::Model;

use crate::{FileRange, SourceChange, Span, TextEdit};

#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Severity {
    Error,
    Warning,
    Info,
    Hint,
}

/// Another place that explains a diagnostic.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub struct Related {
    pub range: FileRange,
    pub message: String,
}

/// A fix: a title for the code action and its edits.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub struct Fix {
    pub title: String,
    pub change: SourceChange,
}

/// One diagnostic in one file.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
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

/// Codes that report an absence (a suppression nothing needed, a zone no
/// air handler serves): in a file that several designs read, they hold only
/// when every one of those designs reports them (as `plenum check` does).
pub(crate) const ABSENCE: [&str; 2] = ["unused-suppression", "unserved-zone"];

/// Every diagnostic of a design, by file: `plenum-checks` turns the syntax
/// errors, the model's findings and the engine's errors, findings and
/// assumptions into coded diagnostics, with the severities of the
/// project's `plenum.toml` and the file's suppressions applied — the same
/// function `plenum check` runs.
pub(crate) fn collect(
    model: &Model,
    eval: &Evaluation,
    config: &plenum_checks::Config,
) -> Vec<(PathBuf, Diagnostic)> {
    plenum_checks::check(model, eval, config)
        .into_iter()
        .map(|d| (d.loc.file.clone(), from_checks(d)))
        .collect()
}

fn from_checks(d: plenum_checks::Diagnostic) -> Diagnostic {
    let fix = d.fix.map(|f| {
        let mut change = SourceChange::default();
        for e in f.edits {
            change.insert(
                &e.loc.file,
                TextEdit {
                    span: e.loc.span,
                    new_text: e.text,
                },
            );
        }
        Fix {
            title: f.title,
            change,
        }
    });
    Diagnostic {
        code: d.code.to_string(),
        severity: match d.severity {
            plenum_checks::Severity::Error => Severity::Error,
            plenum_checks::Severity::Warning => Severity::Warning,
            plenum_checks::Severity::Info => Severity::Info,
        },
        message: d.message,
        span: d.loc.span,
        label: d.label,
        related: d
            .labels
            .into_iter()
            .map(|l| Related {
                range: FileRange {
                    path: l.loc.file,
                    span: l.loc.span,
                },
                message: l.text,
            })
            .collect(),
        help: d.help,
        fix,
    }
}
