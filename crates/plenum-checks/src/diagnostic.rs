//! The one diagnostic type of Plenum: every syntax error, model finding,
//! engine error and check result becomes a [`Diagnostic`] with a registered
//! code.

use std::fmt;
use std::path::PathBuf;

use plenum_syntax::Span;

/// How serious a diagnostic is.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Severity {
    /// The design is wrong or cannot be evaluated; `plenum check` exits 1.
    Error,
    /// Something is implausible or works against the design; worth a look.
    Warning,
    /// A fact worth knowing, such as a default that was used.
    Info,
}

impl Severity {
    /// `error`, `warning` or `info`.
    pub fn as_str(self) -> &'static str {
        match self {
            Severity::Error => "error",
            Severity::Warning => "warning",
            Severity::Info => "info",
        }
    }
}

impl fmt::Display for Severity {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.as_str())
    }
}

/// A severity as a project sets it in `plenum.toml`: one of the three, or
/// `off` to drop the check.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Level {
    /// The check is not reported.
    Off,
    /// The check is reported at this severity.
    On(Severity),
}

impl Level {
    /// Read `error`, `warning`, `info` or `off`.
    pub fn parse(word: &str) -> Option<Level> {
        Some(match word {
            "error" => Level::On(Severity::Error),
            "warning" => Level::On(Severity::Warning),
            "info" => Level::On(Severity::Info),
            "off" => Level::Off,
            _ => return None,
        })
    }

    /// The word of the level.
    pub fn as_str(self) -> &'static str {
        match self {
            Level::Off => "off",
            Level::On(s) => s.as_str(),
        }
    }
}

/// A place in one file: its path (as the runner was given it, normalised)
/// and a byte span of its text.
#[derive(Clone, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct Loc {
    /// The file.
    pub file: PathBuf,
    /// Byte offsets into the file's text.
    pub span: Span,
}

impl Loc {
    /// A location.
    pub fn new(file: impl Into<PathBuf>, span: Span) -> Loc {
        Loc {
            file: file.into(),
            span,
        }
    }
}

/// A secondary location with a short text (e.g. where a block opened).
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Label {
    /// Where.
    pub loc: Loc,
    /// What it shows.
    pub text: String,
}

/// A text edit: replace the text at `loc` with `text`.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Edit {
    /// The text replaced (an empty span inserts).
    pub loc: Loc,
    /// The replacement.
    pub text: String,
}

/// A fix for a diagnostic: a title (for a code action) and its edits.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Fix {
    /// What the fix does, e.g. "write `ft²`".
    pub title: String,
    /// The edits, in any order; they do not overlap.
    pub edits: Vec<Edit>,
}

/// One diagnostic: a registered code, a severity, a one-line message and
/// where it applies.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Diagnostic {
    /// The registered kebab-case code (see [`crate::registry`]).
    pub code: &'static str,
    /// The severity after the project's settings.
    pub severity: Severity,
    /// One line saying what is wrong, with the figures that show it.
    pub message: String,
    /// The primary location.
    pub loc: Loc,
    /// Short text shown under the primary location.
    pub label: Option<String>,
    /// Other locations that explain the diagnostic.
    pub labels: Vec<Label>,
    /// How to fix it, in a sentence.
    pub help: Option<String>,
    /// An edit that fixes it, when one does.
    pub fix: Option<Fix>,
}

impl Diagnostic {
    /// A diagnostic at the code's default severity.
    ///
    /// An unregistered code is a programming error: it is reported as an
    /// error (and the registry tests make sure every code the crate emits is
    /// registered).
    pub fn new(code: &'static str, loc: Loc, message: impl Into<String>) -> Diagnostic {
        let severity = crate::registry::lookup(code).map_or(Severity::Error, |c| c.severity);
        Diagnostic {
            code,
            severity,
            message: message.into(),
            loc,
            label: None,
            labels: Vec::new(),
            help: None,
            fix: None,
        }
    }

    /// Set the severity.
    pub fn severity(mut self, severity: Severity) -> Self {
        self.severity = severity;
        self
    }

    /// Set the text under the primary location.
    pub fn label(mut self, text: impl Into<String>) -> Self {
        self.label = Some(text.into());
        self
    }

    /// Add a secondary location.
    pub fn related(mut self, loc: Loc, text: impl Into<String>) -> Self {
        self.labels.push(Label {
            loc,
            text: text.into(),
        });
        self
    }

    /// Set the help line.
    pub fn help(mut self, text: impl Into<String>) -> Self {
        self.help = Some(text.into());
        self
    }

    /// Set a one-edit fix.
    pub fn fix(mut self, title: impl Into<String>, loc: Loc, text: impl Into<String>) -> Self {
        self.fix = Some(Fix {
            title: title.into(),
            edits: vec![Edit {
                loc,
                text: text.into(),
            }],
        });
        self
    }
}
