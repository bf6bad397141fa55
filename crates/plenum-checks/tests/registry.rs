//! The registry's promises: every code documented in five parts, every
//! example reporting its own code, every syntax, model and engine kind
//! mapped to a registered code.

#![allow(clippy::unwrap_used)]

use std::path::{Path, PathBuf};

use plenum_checks::{CHECKS, check_files, lookup};
use plenum_model::MemoryFs;

/// The files of an example: `# file: NAME` starts the next one. U+FFFD
/// stands for the byte E9 (a Latin-1 `é`), so that `invalid-utf8` has an
/// example too.
fn example_files(example: &str) -> Vec<(String, Vec<u8>)> {
    let mut files = vec![("design.plenum".to_string(), String::new())];
    for line in example.lines() {
        if let Some(name) = line.strip_prefix("# file: ") {
            files.push((name.trim().to_string(), String::new()));
        } else {
            let last = files.last_mut().unwrap();
            last.1.push_str(line);
            last.1.push('\n');
        }
    }
    files
        .into_iter()
        .map(|(n, t)| {
            let mut bytes = Vec::new();
            for c in t.chars() {
                if c == '\u{FFFD}' {
                    bytes.push(0xE9);
                } else {
                    let mut buf = [0u8; 4];
                    bytes.extend_from_slice(c.encode_utf8(&mut buf).as_bytes());
                }
            }
            (n, bytes)
        })
        .collect()
}

#[test]
fn every_check_has_all_five_parts_of_its_documentation() {
    assert!(CHECKS.len() >= 50, "{} checks", CHECKS.len());
    for c in CHECKS {
        let d = c.doc;
        for (part, text) in [
            ("summary", c.summary),
            ("what it checks", d.what),
            ("why it matters", d.why),
            ("example", d.example),
            ("how to fix it", d.fix),
            ("source", d.source),
        ] {
            assert!(
                text.trim().len() >= 10,
                "{}: the {part} is missing or too short",
                c.code
            );
        }
        assert!(!c.summary.contains('\n'), "{}: one-line summary", c.code);
        let explained = c.explain();
        for heading in [
            "## What it checks",
            "## Why it matters",
            "## Example",
            "## How to fix it",
            "## Source",
        ] {
            assert!(explained.contains(heading), "{}", c.code);
        }
    }
}

#[test]
fn every_example_reports_its_own_code() {
    let mut failures = Vec::new();
    for c in CHECKS {
        let mut fs = MemoryFs::new();
        let mut given = Vec::new();
        for (name, bytes) in example_files(c.doc.example) {
            let path = PathBuf::from("/ex").join(&name);
            if name.ends_with(".plenum") {
                given.push(path.clone());
            }
            fs.insert(&path, bytes);
        }
        let project = check_files(&fs, &given);
        let codes: Vec<&str> = project.diagnostics().map(|(_, d)| d.code).collect();
        for code in &codes {
            assert!(lookup(code).is_some(), "unregistered code {code}");
        }
        if !codes.contains(&c.code) {
            let all: Vec<String> = project
                .diagnostics()
                .map(|(_, d)| format!("{}: {}", d.code, d.message))
                .collect();
            failures.push(format!("{}: reported {all:#?}", c.code));
        }
    }
    assert!(failures.is_empty(), "\n{}", failures.join("\n"));
}

#[test]
fn every_syntax_and_model_kind_has_a_registered_code() {
    for k in plenum_syntax::SyntaxErrorKind::ALL {
        let c = lookup(k.code()).unwrap_or_else(|| panic!("{k:?}"));
        assert_eq!(c.severity, plenum_checks::Severity::Error);
    }
    for m in plenum_model::ModelCode::ALL {
        let c = lookup(m.code()).unwrap_or_else(|| panic!("{m:?}"));
        let sev = match m.default_severity() {
            plenum_model::Severity::Error => plenum_checks::Severity::Error,
            plenum_model::Severity::Warning => plenum_checks::Severity::Warning,
            plenum_model::Severity::Info => plenum_checks::Severity::Info,
        };
        assert_eq!(c.severity, sev, "{}", m.code());
    }
    let _ = Path::new("");
}
