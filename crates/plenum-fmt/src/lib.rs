//! The canonical formatter for Plenum design files (`*.plenum`), and the
//! project's style reference.
//!
//! [`format`](fn@format) rewrites a file in the one layout described below;
//! [`format_edits`] gives the same result as a list of small text edits (what
//! an editor applies on a formatting request). A file with syntax errors is
//! never formatted: both return [`FormatError::Syntax`].
//!
//! ```
//! let untidy = "site {elevation 1250ft;cooling 94°F db,75 °F wb}\n";
//! assert_eq!(
//!     plenum_fmt::format(untidy).unwrap(),
//!     "site {\n  elevation 1250 ft\n  cooling   94 °F db, 75 °F wb\n}\n",
//! );
//! ```
//!
//! The formatter changes only whitespace, line breaks and `;`, and moves no
//! comment past a token (one exception: the note after a one-line block, see
//! *Comments*). Before it returns, it parses its own output and checks that
//! the tree (every block, key, number, unit and name, compared without
//! positions) and the comments, in order, are those of the input; if they are
//! not, it returns [`FormatError::Internal`] and the file must be left as it
//! is.
//!
//! A file in the canonical layout (a doc test checks that it is):
//!
//! ```
//! let canonical = r#"# Demo wing: the main rules in one file.
//!
//! use "shared/site.plenum"
//!
//! let lights = 0.9 W/ft² * 2_400 ft²
//!
//! zone reading "Reading room" {  # the header's note
//!   area     2_400 ft²
//!   people   40
//!   ## an own-line comment does not break the alignment
//!   sensible 38.5 kBtu/h + lights  # trailing comments of a group align
//!   latent   8.2 kBtu/h            # in one column
//!
//!   indoor 75 °F, 50 %rh  # a blank line starts a new group
//! }
//!
//! zone stacks "Stacks" like reading {}
//!
//! ahu ahu_1 {
//!   serves      reading,  # a comment inside a list keeps its line break
//!               stacks
//!   supply_temp 57 °F
//!   fan {
//!     static           2.5 in.wg with efficiency 62 %
//!     motor_efficiency 91 %
//!   }
//!   outdoor_air 15 cfm/person
//!   ## the last line of the block
//! }
//! "#;
//! assert_eq!(plenum_fmt::format(canonical).unwrap(), canonical);
//! ```
//!
//! # The layout
//!
//! ## Lines and indentation
//! - One item per line: items joined by `;` are split, and `;` is not written.
//! - Two spaces of indent per block level. Tabs and other indentation are
//!   replaced.
//! - A block header is written on one line with its `{`:
//!   `KIND [NAME] ["Label"] [like OTHER] {`, one space between the parts. Its
//!   entries follow, one level deeper, and `}` closes it on a line of its own
//!   at the header's indent. A block with nothing inside (no entry, no
//!   comment) is written `KIND NAME {}` on one line.
//! - `let NAME = VALUE` and `use "PATH"`, one space between the parts.
//! - A value is written on one line, however long: a list such as
//!   `serves a, b, c, …` is never wrapped, and line breaks the author put
//!   inside a value (after a comma or an operator) are removed, except where
//!   a comment stands (see *Comments*).
//! - The file's line ending is kept: CRLF when its first line break is CRLF,
//!   otherwise LF, for every line. The file ends with exactly one line break.
//!   A file with no item and no comment formats to the empty text. A leading
//!   byte-order mark is kept.
//!
//! ## Blank lines
//! - Blank lines the author left between two entries of a block, or between
//!   two top-level items that are not blocks, are kept, but a run of them
//!   becomes one blank line.
//! - At the top level every block is set off by exactly one blank line from
//!   what precedes and what follows it. Own-line comments written directly
//!   above a block (no blank line between) stay with it: the blank line goes
//!   above them.
//! - No blank line at the start or the end of the file or of a block body.
//!
//! ## Spacing inside a value
//! - A number and its unit are separated by one space: `1250ft` becomes
//!   `1250 ft`, `57°F` becomes `57 °F`, `50%rh` becomes `50 %rh`.
//! - Numbers, `_` digit groups, units and names are written exactly as in the
//!   source: `1_250` stays `1_250`, `1.2e3` stays `1.2e3`, `ft2` stays `ft2`
//!   (never `ft²`), `degF` stays `degF`. A unit never contains a space (a space
//!   would end it), so `W/ft²` stays as written.
//! - One space around a binary operator (`+`, `-`, `*`, `·`, `/`), each kept
//!   as written; none after a sign (`-4`), inside parentheses (`(a + b)`) or
//!   before a comma; one after a comma.
//! - One space before a qualifier (`db`, `wb`, `dp`), around `to` and before
//!   and after `with` and its key.
//! - Strings (block labels, `use` paths) are kept exactly as written,
//!   escapes included.
//!
//! ## Alignment
//! - Within one block, the values of its properties start in one column: each
//!   key is padded with spaces to the longest key of its *alignment group*,
//!   then one space separates it from the value.
//! - An alignment group is a run of the block's entries not separated by a
//!   blank line. A blank line starts a new group; an own-line comment does
//!   not, and neither does a nested block: the properties before and after a
//!   nested `fan { … }` align with each other. The nested block's header is
//!   not padded and its own properties form their own groups.
//! - Top-level `let` and `use` lines are not aligned.
//!
//! ## Comments
//! Every comment stays where it was relative to the tokens around it. Its
//! text is kept, from `#` to the end of the line, less trailing whitespace.
//! - A *trailing* comment (after code on its line) stays after that code,
//!   at least two spaces after it. The trailing comments of the one-line
//!   properties of one alignment group start in one column: two spaces after
//!   the longest of those lines that carry a comment. Other trailing comments
//!   (after a block header's `{`, after a `}`, after a `let` or `use`, after
//!   a property broken over lines) are two spaces after their line.
//! - An *own-line* comment (alone on its line) is printed on a line of its
//!   own, at the indent of the entries around it: before an entry, at that
//!   entry's indent; at the end of a block, before its `}`, at the block's
//!   entry indent (one level deeper than the `}`, since the comment is inside
//!   the block); at the top level, at column 0. A blank line the author left
//!   before it is kept (one at most), as for entries.
//! - A comment inside an item, where the format allows a line break (after
//!   a comma, an operator, `=`, `like`, `to` or `with`, or anywhere inside
//!   parentheses), keeps the line break that follows it: the item continues
//!   on the next line, aligned under the value's first character (for a
//!   property) or indented four spaces deeper than the item (a `let` or a
//!   block header). Own-line comments there are printed at that
//!   continuation column. This is the only way an item spans lines.
//! - A block written on one line with a comment after its `}`
//!   (`zone a { area 5 ft²; people 2 }  # note`) is split over lines, and the
//!   comment moves to the header line after the `{`, where it was read as the
//!   block's note. An empty block keeps it after `{}`.
//!
//! ## Stability
//! Formatting is idempotent: `format(format(x)) == format(x)`. The layout is
//! decided by the tokens, the comments, and where the author left blank lines
//! and one-line blocks; it depends on nothing else of the original spacing.

mod comments;
mod edits;
mod printer;
mod verify;

use std::fmt;

use plenum_syntax::{ColumnUnit, LineIndex, SyntaxError};

pub use edits::{TextEdit, apply_edits, diff_edits};

/// Why a text was not formatted.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum FormatError {
    /// The file has syntax errors; it is not formatted.
    Syntax {
        /// How many syntax errors the file has (at least one).
        count: usize,
        /// The first of them, in source order.
        first: Box<SyntaxError>,
        /// One-based line of the first error.
        line: u32,
        /// One-based column of the first error, counted in characters.
        column: u32,
    },
    /// The formatter could not lay the file out without changing what it
    /// says. This is a bug in the formatter; the text must be left as it is.
    Internal { message: String },
}

impl fmt::Display for FormatError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            FormatError::Syntax {
                count,
                first,
                line,
                column,
            } => {
                let errors = if *count == 1 {
                    "1 syntax error".to_string()
                } else {
                    format!("{count} syntax errors")
                };
                write!(
                    f,
                    "not formatted: the file has {errors}; the first is at line {line}, \
                     column {column}: {}",
                    first.message
                )
            }
            FormatError::Internal { message } => write!(
                f,
                "not formatted: the formatter's output would not mean what the file says \
                 ({message}); this is a bug in plenum-fmt",
            ),
        }
    }
}

impl std::error::Error for FormatError {}

/// Format a design file in the canonical layout (see the crate docs).
///
/// A text with syntax errors is an error, and so is, defensively, an output
/// that would not parse back to the same design and comments.
pub fn format(text: &str) -> Result<String, FormatError> {
    let parsed = plenum_syntax::parse(text);
    if let Some(first) = parsed.errors.first() {
        let index = LineIndex::new(text);
        let at = index.line_col(first.span.start, ColumnUnit::Char);
        return Err(FormatError::Syntax {
            count: parsed.errors.len(),
            first: Box::new(first.clone()),
            line: at.line + 1,
            column: at.col + 1,
        });
    }
    let lexed = plenum_syntax::lex(text);
    let lines = printer::print(text, &parsed.file, &lexed.tokens, &parsed.comments)
        .map_err(|e| FormatError::Internal { message: e.0 })?;
    let out = join(text, &lines);
    check_same(text, &parsed, &out)?;
    Ok(out)
}

/// The edits that turn `text` into [`format`](fn@format)`(text)`: few and small (a line
/// diff, each changed hunk trimmed to the bytes that differ), sorted and
/// non-overlapping, with byte ranges into `text`. An already formatted text
/// gives no edit.
pub fn format_edits(text: &str) -> Result<Vec<TextEdit>, FormatError> {
    let formatted = format(text)?;
    Ok(diff_edits(text, &formatted))
}

/// The line ending of a text: that of its first line break.
fn line_ending(text: &str) -> &'static str {
    match text.find('\n') {
        Some(i) if i > 0 && text.as_bytes()[i - 1] == b'\r' => "\r\n",
        _ => "\n",
    }
}

fn join(text: &str, lines: &[String]) -> String {
    if lines.is_empty() {
        return String::new();
    }
    let eol = line_ending(text);
    let mut out = String::with_capacity(text.len() + text.len() / 8 + 16);
    if text.starts_with('\u{FEFF}') {
        out.push('\u{FEFF}');
    }
    for l in lines {
        out.push_str(l);
        out.push_str(eol);
    }
    out
}

/// Parse the output and compare it with the input, without positions.
fn check_same(text: &str, before: &plenum_syntax::Parse, out: &str) -> Result<(), FormatError> {
    let after = plenum_syntax::parse(out);
    let problem = if let Some(e) = after.errors.first() {
        Some(format!("the output has a syntax error: {}", e.message))
    } else if verify::dump(text, &before.file) != verify::dump(out, &after.file) {
        Some("the output parses to a different design".to_string())
    } else if verify::comment_texts(text, &before.comments)
        != verify::comment_texts(out, &after.comments)
    {
        Some("the output's comments differ".to_string())
    } else {
        None
    };
    match problem {
        Some(message) => Err(FormatError::Internal { message }),
        None => Ok(()),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_file_with_syntax_errors_is_not_formatted() {
        let text = "site {\n  elevation\n  cooling 94 °F db, , 75\n}\n";
        let Err(FormatError::Syntax {
            count,
            line,
            column,
            first,
        }) = format(text)
        else {
            panic!("expected a syntax error");
        };
        assert_eq!(count, 2);
        assert_eq!((line, column), (2, 12));
        assert_eq!(first.span.start as usize, text.find("\n  cooling").unwrap());
        let message = format(text).unwrap_err().to_string();
        assert!(
            message.starts_with(
                "not formatted: the file has 2 syntax errors; the first is at line 2, column 12"
            ),
            "{message}"
        );
        assert!(format_edits(text).is_err());
    }

    #[test]
    fn one_error_is_singular() {
        let message = format("zone a {\n").unwrap_err().to_string();
        assert!(message.contains("has 1 syntax error;"), "{message}");
    }

    #[test]
    fn empty_and_blank_files_format_to_nothing() {
        assert_eq!(format("").unwrap(), "");
        assert_eq!(format("\n\n  \t\n").unwrap(), "");
        assert_eq!(format("\n# only a comment").unwrap(), "# only a comment\n");
    }

    #[test]
    fn line_ending_follows_the_first_break() {
        assert_eq!(line_ending("a\r\nb\n"), "\r\n");
        assert_eq!(line_ending("a\nb\r\n"), "\n");
        assert_eq!(line_ending("\r\n"), "\r\n");
        assert_eq!(line_ending("abc"), "\n");
    }

    #[test]
    fn a_byte_order_mark_is_kept() {
        assert_eq!(format("\u{FEFF}site {  }\n").unwrap(), "\u{FEFF}site {}\n");
    }

    #[test]
    fn edits_reproduce_the_formatted_text() {
        let text = "zone a {area 5ft;people 2}\n\n\n# c\nzone b {\n   area   7 ft\n}";
        let edits = format_edits(text).unwrap();
        assert_eq!(apply_edits(text, &edits).unwrap(), format(text).unwrap());
        let done = format(text).unwrap();
        assert!(format_edits(&done).unwrap().is_empty());
    }
}
