//! Fixture tests: each file under `tests/fixtures/` is parsed and its syntax
//! errors are compared with the annotations written in the file itself.
//!
//! Annotation syntax (a comment line under the line it annotates):
//!
//! ```text
//!   area 12 ft² 12
//! #             ^^ error[syntax-error]: expected the end of the line
//! ```
//!
//! - Carets mark character columns of the nearest preceding line that is not an
//!   annotation. The error must start at the first caret and, when it is on one
//!   line, end after the last one. When the first caret directly follows the
//!   `#`, the carets are shifted one column left, so `#^` marks column 0 and
//!   `#^^^^` marks columns 0–3.
//! - `#@eof error[CODE]: TEXT` is an error located at the very end of the file.
//! - TEXT must occur in the error's message.
//! - Files under `valid/` must have no errors and no annotations.
//!
//! The set of errors must equal the set of annotations exactly.

use std::path::Path;

use plenum_syntax::{ColumnUnit, LineIndex, parse};

#[derive(Debug, Clone, PartialEq)]
struct Expected {
    line: u32,
    start_col: u32,
    end_col: Option<u32>,
    code: String,
    text: String,
    at_eof: bool,
}

fn parse_annotation_tail(tail: &str) -> Option<(String, String)> {
    let tail = tail.trim_start();
    let rest = tail.strip_prefix("error[")?;
    let close = rest.find(']')?;
    let code = rest[..close].to_string();
    let text = rest[close + 1..].trim_start_matches(':').trim().to_string();
    Some((code, text))
}

fn annotations(text: &str) -> Vec<Expected> {
    let mut out = Vec::new();
    let mut target_line: Option<u32> = None;
    for (n, line) in text.lines().enumerate() {
        let n = n as u32;
        let trimmed = line.trim_start();
        if let Some(rest) = line.strip_prefix("#@eof") {
            let (code, text) = parse_annotation_tail(rest).expect("bad #@eof annotation");
            out.push(Expected {
                line: 0,
                start_col: 0,
                end_col: None,
                code,
                text,
                at_eof: true,
            });
            continue;
        }
        let is_caret_line = trimmed.starts_with('#')
            && trimmed[1..].trim_start().starts_with('^')
            && line.contains('^');
        if is_caret_line {
            let chars: Vec<char> = line.chars().collect();
            let hash = chars.iter().position(|&c| c == '#').unwrap_or(0);
            let first = chars.iter().position(|&c| c == '^').unwrap_or(0);
            let mut last = first;
            while last + 1 < chars.len() && chars[last + 1] == '^' {
                last += 1;
            }
            // `#^` shifts the carets one column left, so that column 0 can be marked.
            let shift = usize::from(first == hash + 1);
            let start = first - shift;
            let tail: String = chars[last + 1..].iter().collect();
            let (code, msg) = parse_annotation_tail(&tail)
                .unwrap_or_else(|| panic!("bad caret annotation on line {}: {line}", n + 1));
            out.push(Expected {
                line: target_line.expect("caret annotation before any code line"),
                start_col: start as u32,
                end_col: Some((last + 1 - shift) as u32),
                code,
                text: msg,
                at_eof: false,
            });
        } else {
            target_line = Some(n);
        }
    }
    out
}

fn check_file(path: &Path, expect_valid: bool) -> Result<(), String> {
    let text = std::fs::read_to_string(path).map_err(|e| e.to_string())?;
    let parsed = parse(&text);
    let index = LineIndex::new(&text);
    let mut expected = annotations(&text);
    if expect_valid && !expected.is_empty() {
        return Err("a valid fixture must not carry annotations".into());
    }
    let mut problems = Vec::new();
    for err in &parsed.errors {
        let start = index.line_col(err.span.start, ColumnUnit::Char);
        let end = index.line_col(err.span.end, ColumnUnit::Char);
        let at_eof = err.span.start as usize == text.len();
        let pos = expected.iter().position(|x| {
            x.code == err.kind.code()
                && err.message.contains(&x.text)
                && if x.at_eof {
                    at_eof
                } else {
                    x.line == start.line
                        && x.start_col == start.col
                        && (end.line != start.line || x.end_col == Some(end.col))
                }
        });
        match pos {
            Some(i) => {
                expected.remove(i);
            }
            None => problems.push(format!(
                "unexpected error at {}:{}-{}:{} [{}] {}",
                start.line + 1,
                start.col,
                end.line + 1,
                end.col,
                err.kind.code(),
                err.message
            )),
        }
    }
    for x in expected {
        problems.push(format!("missing error: {x:?}"));
    }
    if problems.is_empty() {
        Ok(())
    } else {
        Err(problems.join("\n"))
    }
}

fn run_dir(dir: &str, valid: bool) {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("tests/fixtures")
        .join(dir);
    let mut entries: Vec<_> = std::fs::read_dir(&root)
        .expect("fixture folder")
        .filter_map(Result::ok)
        .map(|e| e.path())
        .filter(|p| p.extension().is_some_and(|e| e == "plenum"))
        .collect();
    entries.sort();
    assert!(!entries.is_empty(), "no fixtures in {}", root.display());
    let mut failures = Vec::new();
    for path in &entries {
        if let Err(e) = check_file(path, valid) {
            failures.push(format!("{}:\n{e}", path.display()));
        }
    }
    assert!(failures.is_empty(), "\n{}", failures.join("\n\n"));
}

#[test]
fn valid_fixtures_parse_without_errors() {
    run_dir("valid", true);
}

#[test]
fn invalid_fixtures_report_exactly_their_annotations() {
    run_dir("invalid", false);
}

#[test]
fn annotation_syntax_reads_carets_and_eof() {
    let text = "zone a {\n  area 1 ft² 2\n#             ^ error[syntax-error]: expected\n#^^^ error[x]: y\n#@eof error[unclosed-block]: close\n";
    let a = annotations(text);
    assert_eq!(a.len(), 3);
    assert_eq!((a[0].line, a[0].start_col, a[0].end_col), (1, 14, Some(15)));
    assert_eq!((a[1].line, a[1].start_col, a[1].end_col), (1, 0, Some(3)));
    assert!(a[2].at_eof);
}
