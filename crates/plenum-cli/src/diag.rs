//! The diagnostic the CLI's text renderer draws (the checker's
//! [`plenum_checks::Diagnostic`] is converted into it; `plenum air` builds
//! it directly for a state given on the command line).

use plenum_syntax::Span;

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

impl From<plenum_checks::Severity> for Severity {
    fn from(s: plenum_checks::Severity) -> Severity {
        match s {
            plenum_checks::Severity::Error => Severity::Error,
            plenum_checks::Severity::Warning => Severity::Warning,
            plenum_checks::Severity::Info => Severity::Info,
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
