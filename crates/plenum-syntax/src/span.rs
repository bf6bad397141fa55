//! Byte spans and the line index that turns them into editor positions.

use std::fmt;
use std::ops::Range;

/// A half-open byte range `start..end` into one source text.
///
/// Offsets are `u32`: a design file is at most 4 GiB (the lexer reports an error
/// beyond that rather than truncating).
#[derive(Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Default)]
pub struct Span {
    pub start: u32,
    pub end: u32,
}

impl Span {
    pub const fn new(start: u32, end: u32) -> Span {
        Span { start, end }
    }

    /// An empty span at `offset`.
    pub const fn empty(offset: u32) -> Span {
        Span {
            start: offset,
            end: offset,
        }
    }

    pub fn from_range(r: Range<usize>) -> Span {
        Span {
            start: clamp_u32(r.start),
            end: clamp_u32(r.end),
        }
    }

    pub const fn len(self) -> u32 {
        self.end - self.start
    }

    pub const fn is_empty(self) -> bool {
        self.start == self.end
    }

    /// The smallest span covering both.
    pub fn cover(self, other: Span) -> Span {
        Span {
            start: self.start.min(other.start),
            end: self.end.max(other.end),
        }
    }

    pub fn contains(self, offset: u32) -> bool {
        self.start <= offset && offset < self.end
    }

    /// Like [`Span::contains`] but also true at the end offset (a cursor just after a token).
    pub fn touches(self, offset: u32) -> bool {
        self.start <= offset && offset <= self.end
    }

    pub fn range(self) -> Range<usize> {
        self.start as usize..self.end as usize
    }

    /// The text this span covers; empty when the span does not fit `text`.
    pub fn text(self, text: &str) -> &str {
        text.get(self.range()).unwrap_or("")
    }
}

fn clamp_u32(v: usize) -> u32 {
    u32::try_from(v).unwrap_or(u32::MAX)
}

impl fmt::Debug for Span {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}..{}", self.start, self.end)
    }
}

impl From<Range<usize>> for Span {
    fn from(r: Range<usize>) -> Span {
        Span::from_range(r)
    }
}

impl chumsky::span::Span for Span {
    type Context = ();
    type Offset = u32;

    fn new(_context: (), range: Range<u32>) -> Span {
        Span {
            start: range.start,
            end: range.end,
        }
    }

    fn context(&self) {}

    fn start(&self) -> u32 {
        self.start
    }

    fn end(&self) -> u32 {
        self.end
    }
}

/// A position as an editor shows it: zero-based line and column.
#[derive(Clone, Copy, PartialEq, Eq, Debug, Hash, PartialOrd, Ord)]
pub struct LineCol {
    pub line: u32,
    /// Column in the unit the caller asked for (bytes, UTF-16 code units or characters).
    pub col: u32,
}

/// The unit a column is counted in.
#[derive(Clone, Copy, PartialEq, Eq, Debug, Hash)]
pub enum ColumnUnit {
    /// UTF-8 bytes (LSP `utf-8` position encoding).
    Utf8,
    /// UTF-16 code units (the LSP default).
    Utf16,
    /// Unicode scalar values (what a person counts; used by the CLI's JSON output).
    Char,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
struct WideChar {
    /// Byte offset of the character from the start of its line.
    col: u32,
    len_utf8: u8,
    len_utf16: u8,
}

/// Maps byte offsets to lines and columns and back, in UTF-8, UTF-16 or characters.
///
/// Lines end at `\n`; a `\r` before it (CRLF) belongs to the line break, so the
/// column after the last visible character of a CRLF line is the same as in LF text.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct LineIndex {
    /// Byte offset where each line starts; `line_starts[0] == 0`.
    line_starts: Vec<u32>,
    /// Byte length of each line's content, not counting `\r\n` or `\n`.
    line_lens: Vec<u32>,
    /// Non-ASCII characters per line, for column conversions.
    wide: Vec<Vec<WideChar>>,
    len: u32,
}

impl LineIndex {
    pub fn new(text: &str) -> LineIndex {
        let len = clamp_u32(text.len());
        let mut line_starts = vec![0u32];
        let mut line_lens = Vec::new();
        let mut wide: Vec<Vec<WideChar>> = vec![Vec::new()];
        let bytes = text.as_bytes();
        let mut line_start = 0usize;
        if text.is_ascii() {
            for (i, &b) in bytes.iter().enumerate() {
                if b == b'\n' {
                    let content_end = if i > line_start && bytes[i - 1] == b'\r' {
                        i - 1
                    } else {
                        i
                    };
                    line_lens.push(clamp_u32(content_end - line_start));
                    line_start = i + 1;
                    line_starts.push(clamp_u32(line_start));
                    wide.push(Vec::new());
                }
            }
        } else {
            for (i, c) in text.char_indices() {
                if c == '\n' {
                    let content_end = if i > line_start && bytes[i - 1] == b'\r' {
                        i - 1
                    } else {
                        i
                    };
                    line_lens.push(clamp_u32(content_end - line_start));
                    line_start = i + 1;
                    line_starts.push(clamp_u32(line_start));
                    wide.push(Vec::new());
                } else if !c.is_ascii()
                    && let Some(w) = wide.last_mut()
                {
                    w.push(WideChar {
                        col: clamp_u32(i - line_start),
                        len_utf8: c.len_utf8() as u8,
                        len_utf16: c.len_utf16() as u8,
                    });
                }
            }
        }
        // The last line has no line break (a lone `\r` at the very end is content).
        line_lens.push(clamp_u32(text.len() - line_start));
        LineIndex {
            line_starts,
            line_lens,
            wide,
            len,
        }
    }

    /// Number of lines (a text without newline has one line).
    pub fn line_count(&self) -> u32 {
        clamp_u32(self.line_starts.len())
    }

    /// Length of the text in bytes.
    pub fn len(&self) -> u32 {
        self.len
    }

    pub fn is_empty(&self) -> bool {
        self.len == 0
    }

    /// Byte offset at which `line` starts, if the line exists.
    pub fn line_start(&self, line: u32) -> Option<u32> {
        self.line_starts.get(line as usize).copied()
    }

    /// Byte span of the line's content (without its line break).
    pub fn line_span(&self, line: u32) -> Option<Span> {
        let start = self.line_start(line)?;
        let len = *self.line_lens.get(line as usize)?;
        Some(Span::new(start, start + len))
    }

    /// Line and byte column of `offset` (clamped to the text; an offset inside a
    /// multi-byte character is moved back to the character's start).
    pub fn line_col_utf8(&self, offset: u32) -> LineCol {
        let offset = offset.min(self.len);
        let line = match self.line_starts.binary_search(&offset) {
            Ok(l) => l,
            Err(l) => l - 1,
        };
        let mut col = offset - self.line_starts[line];
        for w in &self.wide[line] {
            if w.col < col && col < w.col + u32::from(w.len_utf8) {
                col = w.col;
                break;
            }
        }
        LineCol {
            line: clamp_u32(line),
            col,
        }
    }

    /// Line and column of `offset`, the column counted in `unit`.
    pub fn line_col(&self, offset: u32, unit: ColumnUnit) -> LineCol {
        let lc = self.line_col_utf8(offset);
        LineCol {
            line: lc.line,
            col: self.byte_col_to(lc.line, lc.col, unit),
        }
    }

    fn byte_col_to(&self, line: u32, byte_col: u32, unit: ColumnUnit) -> u32 {
        if unit == ColumnUnit::Utf8 {
            return byte_col;
        }
        let mut col = byte_col;
        for w in self
            .wide
            .get(line as usize)
            .map(Vec::as_slice)
            .unwrap_or(&[])
        {
            if w.col >= byte_col {
                break;
            }
            let units = match unit {
                ColumnUnit::Utf16 => u32::from(w.len_utf16),
                _ => 1,
            };
            col = col - u32::from(w.len_utf8) + units;
        }
        col
    }

    /// The byte offset of a line and column counted in `unit`. A column past
    /// the end of the line clamps to the line's end; a line past the end of the
    /// text clamps to the end of the text; a column inside a character (a UTF-16
    /// surrogate pair half) moves to the character's start.
    pub fn offset(&self, pos: LineCol, unit: ColumnUnit) -> u32 {
        let Some(&start) = self.line_starts.get(pos.line as usize) else {
            return self.len;
        };
        let line_len = self.line_lens[pos.line as usize];
        if unit == ColumnUnit::Utf8 {
            let mut col = pos.col.min(line_len);
            for w in &self.wide[pos.line as usize] {
                if w.col < col && col < w.col + u32::from(w.len_utf8) {
                    col = w.col;
                    break;
                }
            }
            return start + col;
        }
        // Walk the wide characters, converting unit columns to byte columns.
        let mut remaining = pos.col;
        let mut byte_col = 0u32;
        for w in &self.wide[pos.line as usize] {
            let ascii_run = w.col - byte_col;
            if remaining <= ascii_run {
                return start + (byte_col + remaining).min(line_len);
            }
            remaining -= ascii_run;
            byte_col = w.col;
            let units = match unit {
                ColumnUnit::Utf16 => u32::from(w.len_utf16),
                _ => 1,
            };
            if remaining < units {
                return start + byte_col;
            }
            remaining -= units;
            byte_col += u32::from(w.len_utf8);
        }
        start + (byte_col + remaining).min(line_len)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ascii_lines_and_columns() {
        let idx = LineIndex::new("ab\ncd\n\nef");
        assert_eq!(idx.line_count(), 4);
        assert_eq!(
            idx.line_col(0, ColumnUnit::Utf8),
            LineCol { line: 0, col: 0 }
        );
        assert_eq!(
            idx.line_col(4, ColumnUnit::Utf8),
            LineCol { line: 1, col: 1 }
        );
        assert_eq!(
            idx.line_col(6, ColumnUnit::Utf8),
            LineCol { line: 2, col: 0 }
        );
        assert_eq!(
            idx.line_col(9, ColumnUnit::Utf8),
            LineCol { line: 3, col: 2 }
        );
        assert_eq!(
            idx.offset(LineCol { line: 3, col: 1 }, ColumnUnit::Utf16),
            8
        );
    }

    #[test]
    fn wide_characters_count_per_unit() {
        // "t 57 °F" : ° is 2 bytes, 1 UTF-16 unit, 1 char. "𝑥" is 4 bytes, 2 UTF-16 units.
        let text = "a °F 𝑥 z\nnext";
        let idx = LineIndex::new(text);
        let z = text.find('z').unwrap() as u32;
        assert_eq!(idx.line_col(z, ColumnUnit::Utf8).col, 11);
        assert_eq!(idx.line_col(z, ColumnUnit::Utf16).col, 8);
        assert_eq!(idx.line_col(z, ColumnUnit::Char).col, 7);
        for unit in [ColumnUnit::Utf8, ColumnUnit::Utf16, ColumnUnit::Char] {
            let lc = idx.line_col(z, unit);
            assert_eq!(idx.offset(lc, unit), z, "{unit:?}");
        }
        // A UTF-16 column in the middle of the surrogate pair moves to the char start.
        let x = text.find('𝑥').unwrap() as u32;
        assert_eq!(
            idx.offset(LineCol { line: 0, col: 6 }, ColumnUnit::Utf16),
            x
        );
    }

    #[test]
    fn crlf_line_breaks() {
        let text = "ab\r\ncd\r\n";
        let idx = LineIndex::new(text);
        assert_eq!(idx.line_count(), 3);
        assert_eq!(
            idx.line_col(4, ColumnUnit::Utf16),
            LineCol { line: 1, col: 0 }
        );
        assert_eq!(idx.line_span(0), Some(Span::new(0, 2)));
        // A column past the end of a CRLF line clamps before the \r.
        assert_eq!(
            idx.offset(LineCol { line: 0, col: 99 }, ColumnUnit::Utf16),
            2
        );
    }

    #[test]
    fn out_of_range_positions_clamp() {
        let idx = LineIndex::new("abc");
        assert_eq!(idx.offset(LineCol { line: 7, col: 0 }, ColumnUnit::Utf8), 3);
        assert_eq!(
            idx.line_col(99, ColumnUnit::Utf8),
            LineCol { line: 0, col: 3 }
        );
    }
}
