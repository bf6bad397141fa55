//! Syntax errors: located, with a stable kind that maps to a diagnostic code.

use crate::span::Span;

/// What went wrong. Each kind has a stable kebab-case code (see [`SyntaxErrorKind::code`]).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum SyntaxErrorKind {
    /// The parser expected something else here.
    Unexpected,
    /// A character that is not part of the format.
    InvalidCharacter,
    /// A string without its closing quote.
    UnterminatedString,
    /// A string escape other than `\"` and `\\`.
    InvalidEscape,
    /// A number too large to represent.
    NumberOutOfRange,
    /// More nested `{ }` / `( )` than [`crate::MAX_NESTING`].
    NestingTooDeep,
    /// A block whose closing `}` is missing.
    UnclosedBlock,
    /// A `}` or `)` with no opener.
    UnmatchedClose,
}

impl SyntaxErrorKind {
    /// The diagnostic code, stable across releases.
    pub fn code(self) -> &'static str {
        match self {
            SyntaxErrorKind::Unexpected => "syntax-error",
            SyntaxErrorKind::InvalidCharacter => "invalid-character",
            SyntaxErrorKind::UnterminatedString => "unterminated-string",
            SyntaxErrorKind::InvalidEscape => "invalid-escape",
            SyntaxErrorKind::NumberOutOfRange => "number-out-of-range",
            SyntaxErrorKind::NestingTooDeep => "nesting-too-deep",
            SyntaxErrorKind::UnclosedBlock => "unclosed-block",
            SyntaxErrorKind::UnmatchedClose => "unmatched-delimiter",
        }
    }

    /// Every kind, for registries and documentation tests.
    pub const ALL: [SyntaxErrorKind; 8] = [
        SyntaxErrorKind::Unexpected,
        SyntaxErrorKind::InvalidCharacter,
        SyntaxErrorKind::UnterminatedString,
        SyntaxErrorKind::InvalidEscape,
        SyntaxErrorKind::NumberOutOfRange,
        SyntaxErrorKind::NestingTooDeep,
        SyntaxErrorKind::UnclosedBlock,
        SyntaxErrorKind::UnmatchedClose,
    ];
}

/// A located syntax error with a one-line message, an optional label for the
/// primary span, related locations and a help line.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct SyntaxError {
    pub kind: SyntaxErrorKind,
    pub span: Span,
    pub message: String,
    /// Short text shown under the primary span.
    pub label: Option<String>,
    /// Other places that explain the error (e.g. where an unclosed block opened).
    pub related: Vec<(Span, String)>,
    pub help: Option<String>,
}

impl SyntaxError {
    pub fn new(kind: SyntaxErrorKind, span: Span, message: String) -> SyntaxError {
        SyntaxError {
            kind,
            span,
            message,
            label: None,
            related: Vec::new(),
            help: None,
        }
    }

    pub fn with_label(mut self, label: impl Into<String>) -> SyntaxError {
        self.label = Some(label.into());
        self
    }

    pub fn with_help(mut self, help: impl Into<String>) -> SyntaxError {
        self.help = Some(help.into());
        self
    }

    pub fn with_related(mut self, span: Span, text: impl Into<String>) -> SyntaxError {
        self.related.push((span, text.into()));
        self
    }
}
