//! Fixture files that carry their expected diagnostics as annotations.
//!
//! An annotation is a comment line under the line it annotates:
//!
//! ```text
//!   area 2_400 ft² 12
//! #                ^^ error[syntax-error]: expected the end of the line
//! ```
//!
//! - Carets mark character columns of the nearest preceding line that is not
//!   an annotation. The diagnostic must start at the first caret and, when it
//!   ends on the same line, end after the last one. When the first caret
//!   directly follows the `#`, the carets are shifted one column left, so `#^`
//!   marks column 0 and `#^^^^` columns 0–3.
//! - `#@eof SEVERITY[CODE]: TEXT` is a diagnostic at the very end of the file.
//! - SEVERITY is `error`, `warning` or `info`; TEXT must occur in the message.
//!
//! The diagnostics must equal the annotations exactly: nothing missing, nothing extra.

/// A diagnostic as the code under test reported it.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Actual {
    pub code: String,
    pub severity: String,
    /// Byte offsets into the fixture text.
    pub start: usize,
    pub end: usize,
    pub message: String,
}

/// One annotation.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Expected {
    /// Zero-based line and character columns.
    pub line: usize,
    pub start_col: usize,
    pub end_col: usize,
    pub severity: String,
    pub code: String,
    pub text: String,
    pub at_eof: bool,
}

fn parse_tail(tail: &str) -> Option<(String, String, String)> {
    let tail = tail.trim_start();
    let open = tail.find('[')?;
    let severity = tail[..open].to_string();
    if !matches!(severity.as_str(), "error" | "warning" | "info") {
        return None;
    }
    let rest = &tail[open + 1..];
    let close = rest.find(']')?;
    let code = rest[..close].to_string();
    let text = rest[close + 1..].trim_start_matches(':').trim().to_string();
    Some((severity, code, text))
}

/// True for a line that is an annotation (carets or `#@eof`).
pub fn is_annotation(line: &str) -> bool {
    let t = line.trim_start();
    t.starts_with("#@eof") || (t.starts_with('#') && t[1..].trim_start().starts_with('^'))
}

/// The annotations of a fixture. Panics on a malformed annotation (a broken fixture).
pub fn annotations(text: &str) -> Vec<Expected> {
    let mut out = Vec::new();
    let mut target: Option<usize> = None;
    for (n, line) in text.lines().enumerate() {
        if let Some(rest) = line.trim_start().strip_prefix("#@eof") {
            let (severity, code, text) = parse_tail(rest)
                .unwrap_or_else(|| panic!("bad #@eof annotation on line {}: {line}", n + 1));
            out.push(Expected {
                line: 0,
                start_col: 0,
                end_col: 0,
                severity,
                code,
                text,
                at_eof: true,
            });
        } else if is_annotation(line) {
            let chars: Vec<char> = line.chars().collect();
            let hash = chars.iter().position(|&c| c == '#').unwrap_or(0);
            let first = chars.iter().position(|&c| c == '^').unwrap_or(0);
            let mut last = first;
            while last + 1 < chars.len() && chars[last + 1] == '^' {
                last += 1;
            }
            let shift = usize::from(first == hash + 1);
            let tail: String = chars[last + 1..].iter().collect();
            let (severity, code, msg) = parse_tail(&tail)
                .unwrap_or_else(|| panic!("bad caret annotation on line {}: {line}", n + 1));
            out.push(Expected {
                line: target
                    .unwrap_or_else(|| panic!("annotation on line {} annotates nothing", n + 1)),
                start_col: first - shift,
                end_col: last + 1 - shift,
                severity,
                code,
                text: msg,
                at_eof: false,
            });
        } else {
            target = Some(n);
        }
    }
    out
}

/// Zero-based line and character column of a byte offset.
pub fn line_col(text: &str, offset: usize) -> (usize, usize) {
    let offset = offset.min(text.len());
    let before = text.get(..offset).unwrap_or(text);
    let line = before.matches('\n').count();
    let line_start = before.rfind('\n').map_or(0, |i| i + 1);
    (line, before[line_start..].chars().count())
}

/// Compare what was reported with what the fixture expects.
pub fn check(text: &str, actual: &[Actual]) -> Result<(), String> {
    let mut expected = annotations(text);
    let mut problems = Vec::new();
    for a in actual {
        let (sl, sc) = line_col(text, a.start);
        let (el, ec) = line_col(text, a.end);
        let at_eof = a.start == text.len();
        let pos = expected.iter().position(|x| {
            x.code == a.code
                && x.severity == a.severity
                && a.message.contains(&x.text)
                && if x.at_eof {
                    at_eof
                } else {
                    x.line == sl && x.start_col == sc && (el != sl || x.end_col == ec)
                }
        });
        match pos {
            Some(i) => {
                expected.remove(i);
            }
            None => problems.push(format!(
                "unexpected {}[{}] at {}:{}-{}:{}: {}",
                a.severity,
                a.code,
                sl + 1,
                sc,
                el + 1,
                ec,
                a.message
            )),
        }
    }
    for x in expected {
        if x.at_eof {
            problems.push(format!(
                "missing {}[{}] at end of file: {}",
                x.severity, x.code, x.text
            ));
        } else {
            problems.push(format!(
                "missing {}[{}] at {}:{}-{}: {}",
                x.severity,
                x.code,
                x.line + 1,
                x.start_col,
                x.end_col,
                x.text
            ));
        }
    }
    if problems.is_empty() {
        Ok(())
    } else {
        Err(problems.join("\n"))
    }
}

/// Every `*.plenum` fixture directly in `dir`, sorted.
pub fn fixtures(dir: &std::path::Path) -> Vec<std::path::PathBuf> {
    let mut out: Vec<_> = std::fs::read_dir(dir)
        .unwrap_or_else(|e| panic!("fixture folder {}: {e}", dir.display()))
        .filter_map(Result::ok)
        .map(|e| e.path())
        .filter(|p| p.extension().is_some_and(|e| e == "plenum"))
        .collect();
    out.sort();
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_carets_shifted_carets_and_eof() {
        let text = "zone a {\n  area 1 ft² 2\n#             ^ error[syntax-error]: expected\n#^^^ warning[x]: y\n#@eof error[unclosed-block]: close\n";
        let a = annotations(text);
        assert_eq!(a.len(), 3);
        assert_eq!((a[0].line, a[0].start_col, a[0].end_col), (1, 14, 15));
        assert_eq!((a[1].line, a[1].start_col, a[1].end_col), (1, 0, 3));
        assert_eq!(a[1].severity, "warning");
        assert!(a[2].at_eof);
    }

    #[test]
    fn check_reports_missing_and_unexpected() {
        let text = "abc def\n#   ^^^ error[e]: bad\n";
        let ok = [Actual {
            code: "e".into(),
            severity: "error".into(),
            start: 4,
            end: 7,
            message: "bad thing".into(),
        }];
        assert!(check(text, &ok).is_ok());
        let wrong_place = [Actual {
            start: 0,
            end: 3,
            ..ok[0].clone()
        }];
        let err = check(text, &wrong_place).unwrap_err();
        assert!(
            err.contains("unexpected") && err.contains("missing"),
            "{err}"
        );
        assert!(check(text, &[]).is_err());
    }

    #[test]
    fn line_col_counts_characters() {
        assert_eq!(line_col("a²b\ncd", 4), (0, 3));
        assert_eq!(line_col("a²b\ncd", 6), (1, 1));
    }
}
