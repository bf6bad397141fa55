//! Formatting through `plenum-fmt`: the minimal edits to the canonical layout.

use std::fmt;
use std::path::Path;

use crate::world::Analysis;
use crate::{Span, TextEdit};

/// Why a file was not formatted.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum FormatError {
    /// The file is not part of the analysis.
    UnknownFile,
    /// The formatter declined (syntax errors, or its own safety check).
    Declined(String),
}

impl fmt::Display for FormatError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            FormatError::UnknownFile => f.write_str("the file is not open or not a design file"),
            FormatError::Declined(m) => f.write_str(m),
        }
    }
}

impl std::error::Error for FormatError {}

impl Analysis {
    /// The edits that lay the file out canonically (none when it already is).
    pub fn format(&self, path: &Path) -> Result<Vec<TextEdit>, FormatError> {
        let text = self.text(path).ok_or(FormatError::UnknownFile)?;
        let edits =
            plenum_fmt::format_edits(text).map_err(|e| FormatError::Declined(e.to_string()))?;
        Ok(edits
            .into_iter()
            .map(|e| TextEdit {
                span: Span::from_range(e.range),
                new_text: e.new_text,
            })
            .collect())
    }
}
