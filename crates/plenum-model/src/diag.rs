//! What the model finds wrong: located, coded, with help and a fix where one
//! edit repairs it. The checks crate maps these into its diagnostic type.

use crate::design::Loc;

/// The model's findings. Each has a stable kebab-case code.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum ModelCode {
    UnitMismatch,
    UnknownUnit,
    MissingUnit,
    InvalidArithmetic,
    UnknownName,
    DuplicateName,
    UnknownKey,
    DuplicateKey,
    MissingKey,
    ConflictingKeys,
    UnknownBlock,
    InvalidValue,
    OutOfRange,
    UseNotFound,
    UseOutsideProject,
    UseCycle,
    LikeCycle,
    LetCycle,
    MissingSite,
    UnservedZone,
    ZoneServedTwice,
}

/// How serious a finding is by default (projects may change it).
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Severity {
    Error,
    Warning,
    Info,
}

impl ModelCode {
    pub const ALL: [ModelCode; 21] = [
        ModelCode::UnitMismatch,
        ModelCode::UnknownUnit,
        ModelCode::MissingUnit,
        ModelCode::InvalidArithmetic,
        ModelCode::UnknownName,
        ModelCode::DuplicateName,
        ModelCode::UnknownKey,
        ModelCode::DuplicateKey,
        ModelCode::MissingKey,
        ModelCode::ConflictingKeys,
        ModelCode::UnknownBlock,
        ModelCode::InvalidValue,
        ModelCode::OutOfRange,
        ModelCode::UseNotFound,
        ModelCode::UseOutsideProject,
        ModelCode::UseCycle,
        ModelCode::LikeCycle,
        ModelCode::LetCycle,
        ModelCode::MissingSite,
        ModelCode::UnservedZone,
        ModelCode::ZoneServedTwice,
    ];

    pub fn code(self) -> &'static str {
        match self {
            ModelCode::UnitMismatch => "unit-mismatch",
            ModelCode::UnknownUnit => "unknown-unit",
            ModelCode::MissingUnit => "missing-unit",
            ModelCode::InvalidArithmetic => "invalid-arithmetic",
            ModelCode::UnknownName => "unknown-name",
            ModelCode::DuplicateName => "duplicate-name",
            ModelCode::UnknownKey => "unknown-key",
            ModelCode::DuplicateKey => "duplicate-key",
            ModelCode::MissingKey => "missing-key",
            ModelCode::ConflictingKeys => "conflicting-keys",
            ModelCode::UnknownBlock => "unknown-block",
            ModelCode::InvalidValue => "invalid-value",
            ModelCode::OutOfRange => "out-of-range",
            ModelCode::UseNotFound => "use-not-found",
            ModelCode::UseOutsideProject => "use-outside-project",
            ModelCode::UseCycle => "use-cycle",
            ModelCode::LikeCycle => "like-cycle",
            ModelCode::LetCycle => "let-cycle",
            ModelCode::MissingSite => "missing-site",
            ModelCode::UnservedZone => "unserved-zone",
            ModelCode::ZoneServedTwice => "zone-served-twice",
        }
    }

    /// Findings about the design as a whole (what is missing or unresolved),
    /// which a syntax error elsewhere can cause by hiding a block or a key.
    /// They are held back while any file of the design has a syntax error, so
    /// that one mistake does not cascade into many findings.
    pub fn is_global(self) -> bool {
        matches!(
            self,
            ModelCode::UnknownName
                | ModelCode::MissingKey
                | ModelCode::MissingSite
                | ModelCode::UnservedZone
                | ModelCode::ZoneServedTwice
        )
    }

    pub fn default_severity(self) -> Severity {
        match self {
            ModelCode::UnservedZone => Severity::Warning,
            _ => Severity::Error,
        }
    }
}

/// A text edit: replace the text at `loc` with `text`.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Edit {
    pub loc: Loc,
    pub text: String,
}

/// A fix for a finding: a title for the code action and its edits.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Fix {
    pub title: String,
    pub edits: Vec<Edit>,
}

/// One finding of the model.
#[derive(Clone, Debug, PartialEq)]
pub struct ModelDiagnostic {
    pub code: ModelCode,
    pub severity: Severity,
    pub message: String,
    pub loc: Loc,
    /// Short text under the primary location.
    pub label: Option<String>,
    pub related: Vec<(Loc, String)>,
    pub help: Option<String>,
    pub fix: Option<Fix>,
}

impl ModelDiagnostic {
    pub fn new(code: ModelCode, loc: Loc, message: impl Into<String>) -> ModelDiagnostic {
        ModelDiagnostic {
            code,
            severity: code.default_severity(),
            message: message.into(),
            loc,
            label: None,
            related: Vec::new(),
            help: None,
            fix: None,
        }
    }

    pub fn label(mut self, text: impl Into<String>) -> Self {
        self.label = Some(text.into());
        self
    }

    pub fn help(mut self, text: impl Into<String>) -> Self {
        self.help = Some(text.into());
        self
    }

    pub fn related(mut self, loc: Loc, text: impl Into<String>) -> Self {
        self.related.push((loc, text.into()));
        self
    }

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
