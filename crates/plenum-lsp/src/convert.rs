//! Every conversion between LSP and the analysis, in one place: positions
//! (line and column in the negotiated encoding) to byte offsets and back,
//! ranges, text changes, and `file:` URIs to paths and back.
//!
//! * Columns are UTF-16 code units unless the client offered UTF-8 (LSP
//!   3.17 `positionEncoding`); [`LineIndex`] does the counting, with CRLF
//!   line breaks and characters of 2 and 4 bytes.
//! * A position past the end of its line clamps to the line's end, a line
//!   past the end of the text to the end of the text, and a column inside a
//!   character (half a surrogate pair) to the character's start: no position
//!   a client sends is an error.
//! * URIs: `file:///home/a/b.plenum`, `file:///C:/x/y.plenum`,
//!   `file:///c%3A/x/y.plenum` (a drive letter as VS Code writes it),
//!   `file://server/share/x.plenum` (UNC) and percent-encoded characters.

use std::path::{Path, PathBuf};
use std::str::FromStr;

use plenum_syntax::{ColumnUnit, LineCol, LineIndex, Span};
use tower_lsp_server::ls_types::{Position, PositionEncodingKind, Range, Uri};

/// The negotiated position encoding.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
pub enum Encoding {
    Utf8,
    #[default]
    Utf16,
}

impl Encoding {
    /// UTF-8 when the client offers it, else UTF-16 (the LSP default).
    pub fn negotiate(offered: Option<&[PositionEncodingKind]>) -> Encoding {
        match offered {
            Some(list) if list.contains(&PositionEncodingKind::UTF8) => Encoding::Utf8,
            _ => Encoding::Utf16,
        }
    }

    pub fn kind(self) -> PositionEncodingKind {
        match self {
            Encoding::Utf8 => PositionEncodingKind::UTF8,
            Encoding::Utf16 => PositionEncodingKind::UTF16,
        }
    }

    fn unit(self) -> ColumnUnit {
        match self {
            Encoding::Utf8 => ColumnUnit::Utf8,
            Encoding::Utf16 => ColumnUnit::Utf16,
        }
    }
}

/// A client position as a byte offset (clamped; never fails).
pub fn offset(index: &LineIndex, pos: Position, enc: Encoding) -> u32 {
    index.offset(
        LineCol {
            line: pos.line,
            col: pos.character,
        },
        enc.unit(),
    )
}

/// A byte offset as a client position.
pub fn position(index: &LineIndex, offset: u32, enc: Encoding) -> Position {
    let lc = index.line_col(offset, enc.unit());
    Position {
        line: lc.line,
        character: lc.col,
    }
}

pub fn range(index: &LineIndex, span: Span, enc: Encoding) -> Range {
    Range {
        start: position(index, span.start, enc),
        end: position(index, span.end, enc),
    }
}

/// A client range as a span (ends swapped when given backwards).
pub fn span(index: &LineIndex, r: Range, enc: Encoding) -> Span {
    let a = offset(index, r.start, enc);
    let b = offset(index, r.end, enc);
    Span::new(a.min(b), a.max(b))
}

/// Apply one `didChange` content change to a text: a range replacement, or
/// the whole text when `range` is `None`.
pub fn apply_change(text: &mut String, range: Option<Range>, new_text: &str, enc: Encoding) {
    match range {
        None => {
            text.clear();
            text.push_str(new_text);
        }
        Some(r) => {
            let index = LineIndex::new(text);
            let s = span(&index, r, enc);
            text.replace_range(s.range(), new_text);
        }
    }
}

/// The path of a `file:` URI; `None` for other schemes or malformed ones.
pub fn path_from_uri(uri: &str) -> Option<PathBuf> {
    let rest = strip_scheme(uri)?;
    let (authority, path) = match rest.strip_prefix("//") {
        Some(r) => match r.find('/') {
            Some(i) => (&r[..i], &r[i..]),
            None => (r, "/"),
        },
        None => ("", rest),
    };
    let path = path.split(['?', '#']).next().unwrap_or("");
    let decoded = percent_decode(path)?;
    let authority = percent_decode(authority)?;
    // `/C:/x` → `C:/x` (a Windows drive letter).
    let bytes = decoded.as_bytes();
    let local = if bytes.len() >= 3
        && bytes[0] == b'/'
        && bytes[1].is_ascii_alphabetic()
        && bytes[2] == b':'
    {
        decoded[1..].to_string()
    } else {
        decoded
    };
    if !authority.is_empty() && authority != "localhost" {
        // UNC: \\server\share\path, written with forward slashes.
        return Some(PathBuf::from(format!("//{authority}{local}")));
    }
    if local.is_empty() {
        return None;
    }
    Some(PathBuf::from(local))
}

fn strip_scheme(uri: &str) -> Option<&str> {
    let (scheme, rest) = uri.split_once(':')?;
    scheme.eq_ignore_ascii_case("file").then_some(rest)
}

fn percent_decode(s: &str) -> Option<String> {
    let bytes = s.as_bytes();
    let mut out = Vec::with_capacity(bytes.len());
    let mut i = 0;
    while i < bytes.len() {
        if bytes[i] == b'%' {
            let hex = s.get(i + 1..i + 3)?;
            out.push(u8::from_str_radix(hex, 16).ok()?);
            i += 3;
        } else {
            out.push(bytes[i]);
            i += 1;
        }
    }
    String::from_utf8(out).ok()
}

/// A path as a `file:` URI: each segment percent-encoded, a drive letter as
/// `/C:`, backslashes as `/`.
pub fn uri_string_from_path(path: &Path) -> String {
    let raw = path.to_string_lossy().replace('\\', "/");
    let (prefix, rest) = if let Some(unc) = raw.strip_prefix("//") {
        match unc.find('/') {
            Some(i) => (format!("file://{}", &unc[..i]), unc[i..].to_string()),
            None => (format!("file://{unc}"), "/".to_string()),
        }
    } else if raw.len() >= 2 && raw.as_bytes()[0].is_ascii_alphabetic() && raw.as_bytes()[1] == b':'
    {
        ("file://".to_string(), format!("/{raw}"))
    } else {
        ("file://".to_string(), raw)
    };
    let mut out = prefix;
    for (i, c) in rest.char_indices() {
        let keep = c.is_ascii_alphanumeric()
            || matches!(
                c,
                '/' | '-'
                    | '.'
                    | '_'
                    | '~'
                    | '!'
                    | '$'
                    | '&'
                    | '\''
                    | '('
                    | ')'
                    | '*'
                    | '+'
                    | ','
                    | ';'
                    | '='
                    | '@'
            )
            || (c == ':' && i == 2 && rest.starts_with('/'));
        if keep {
            out.push(c);
        } else {
            let mut buf = [0u8; 4];
            for b in c.encode_utf8(&mut buf).bytes() {
                out.push_str(&format!("%{b:02X}"));
            }
        }
    }
    out
}

/// A path as a URI value.
pub fn uri_from_path(path: &Path) -> Option<Uri> {
    Uri::from_str(&uri_string_from_path(path)).ok()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn unix_windows_unc_and_encoded_uris() {
        assert_eq!(
            path_from_uri("file:///home/a/b%20c.plenum"),
            Some(PathBuf::from("/home/a/b c.plenum"))
        );
        assert_eq!(
            path_from_uri("file:///c%3A/Users/x/site.plenum"),
            Some(PathBuf::from("c:/Users/x/site.plenum"))
        );
        assert_eq!(
            path_from_uri("file:///C:/Users/x/site.plenum"),
            Some(PathBuf::from("C:/Users/x/site.plenum"))
        );
        assert_eq!(
            path_from_uri("file://server/share/a.plenum"),
            Some(PathBuf::from("//server/share/a.plenum"))
        );
        assert_eq!(
            path_from_uri("file://localhost/etc/a.plenum"),
            Some(PathBuf::from("/etc/a.plenum"))
        );
        assert_eq!(
            path_from_uri("file:///w/%C2%B0F.plenum"),
            Some(PathBuf::from("/w/°F.plenum"))
        );
        assert_eq!(path_from_uri("untitled:Untitled-1"), None);
        assert_eq!(path_from_uri("file:///bad%zz"), None);
    }

    #[test]
    fn paths_round_trip_through_uris() {
        for p in [
            "/home/a/b c.plenum",
            "/w/°F #1.plenum",
            "C:/Users/x/site.plenum",
            "//server/share/a.plenum",
        ] {
            let uri = uri_string_from_path(Path::new(p));
            assert!(uri.starts_with("file://"), "{uri}");
            assert!(Uri::from_str(&uri).is_ok(), "{uri}");
            assert_eq!(path_from_uri(&uri), Some(PathBuf::from(p)), "{uri}");
        }
        assert_eq!(
            uri_string_from_path(Path::new("C:\\Users\\x\\a b.plenum")),
            "file:///C:/Users/x/a%20b.plenum"
        );
    }

    #[test]
    fn positions_in_both_encodings_with_wide_characters_and_crlf() {
        // `°` is 2 bytes / 1 UTF-16 unit, `²` 2 / 1, the emoji 4 / 2.
        let text = "zone a {\r\n  area 1 ft² # 🌡 °\r\n  x\r\n}";
        let index = LineIndex::new(text);
        let x = text.find('x').unwrap() as u32;
        let after_emoji = (text.find('🌡').unwrap() + 4) as u32;
        for enc in [Encoding::Utf8, Encoding::Utf16] {
            let p = position(&index, x, enc);
            assert_eq!((p.line, p.character), (2, 2));
            assert_eq!(offset(&index, p, enc), x);
            let p = position(&index, after_emoji, enc);
            assert_eq!(offset(&index, p, enc), after_emoji);
        }
        let p16 = position(&index, after_emoji, Encoding::Utf16);
        let p8 = position(&index, after_emoji, Encoding::Utf8);
        // `  area 1 ft² # 🌡`: 14 ASCII characters, `²` and the emoji.
        assert_eq!(p16.character, 14 + 1 + 2);
        assert_eq!(p8.character, 14 + 2 + 4);
        // Out of range: clamped.
        let end_of_line_1 = (text.find("°\r\n").unwrap() + 2) as u32;
        assert_eq!(
            offset(
                &index,
                Position {
                    line: 1,
                    character: 999
                },
                Encoding::Utf16
            ),
            end_of_line_1
        );
        assert_eq!(
            offset(
                &index,
                Position {
                    line: 99,
                    character: 0
                },
                Encoding::Utf8
            ),
            text.len() as u32
        );
    }

    #[test]
    fn incremental_changes_apply_in_either_encoding() {
        let mut t = "a °F\r\nb\r\n".to_string();
        apply_change(
            &mut t,
            Some(Range {
                start: Position {
                    line: 0,
                    character: 4,
                },
                end: Position {
                    line: 0,
                    character: 4,
                },
            }),
            " db",
            Encoding::Utf16,
        );
        assert_eq!(t, "a °F db\r\nb\r\n");
        apply_change(
            &mut t,
            Some(Range {
                start: Position {
                    line: 0,
                    character: 5,
                },
                end: Position {
                    line: 1,
                    character: 0,
                },
            }),
            "",
            Encoding::Utf8,
        );
        // UTF-8 column 5 is after `a °F` (`°` is two bytes).
        assert_eq!(t, "a °Fb\r\n");
        apply_change(&mut t, None, "whole", Encoding::Utf16);
        assert_eq!(t, "whole");
    }
}
