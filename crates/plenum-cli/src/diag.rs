//! The diagnostic the CLI's text renderer draws (the checker's
//! [`plenum_checks::Diagnostic`] is converted into it; `plenum air` builds
//! it directly for a state given on the command line).

use plenum_syntax::Span;

pub use plenum_checks::Severity;

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
