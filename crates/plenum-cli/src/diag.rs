//! The diagnostics the CLI prints, independent of their origin.

use plenum_syntax::{Span, SyntaxError};

#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub enum Severity {
    Error,
    Warning,
    Info,
}

impl Severity {
    pub fn as_str(self) -> &'static str {
        match self {
            Severity::Error => "error",
            Severity::Warning => "warning",
            Severity::Info => "info",
        }
    }
}

/// One finding, located in one file.
#[derive(Clone, Debug)]
pub struct Diag {
    pub code: &'static str,
    pub severity: Severity,
    pub message: String,
    pub span: Span,
    pub label: Option<String>,
    pub related: Vec<(Span, String)>,
    pub help: Option<String>,
}

impl From<&SyntaxError> for Diag {
    fn from(e: &SyntaxError) -> Diag {
        Diag {
            code: e.kind.code(),
            severity: Severity::Error,
            message: e.message.clone(),
            span: e.span,
            label: e.label.clone(),
            related: e.related.clone(),
            help: e.help.clone(),
        }
    }
}
