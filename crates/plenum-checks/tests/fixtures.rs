//! Fixture tests: designs that carry their expected diagnostics as
//! annotations (the syntax is documented in `plenum-testkit`), run through
//! the project runner exactly as `plenum check` runs them.
//!
//! - `tests/fixtures/*.plenum`: a design of one file. It is checked beside a
//!   `plenum.toml` that switches `assumption` off, so that each fixture
//!   annotates only what it is about (`assumptions/` has its own project).
//! - `tests/fixtures/NAME/`: a project of several files, checked as given
//!   (every `*.plenum` file is passed to the runner, its `plenum.toml` if it
//!   has one applies). Every file, `plenum.toml` included (TOML comments are
//!   `#` too), carries its own annotations.
//!
//! A file that is not UTF-8 is compared in its valid prefix, the text the
//! runner keeps.
//!
//! A last test requires every registered code to be triggered by at least
//! one fixture: these, or for syntax and model codes the fixtures of the
//! `plenum-syntax` and `plenum-model` crates.

#![allow(clippy::unwrap_used)]

use std::collections::BTreeSet;
use std::path::{Path, PathBuf};

use plenum_checks::{CHECKS, Group, check_files, lookup};
use plenum_model::MemoryFs;
use plenum_testkit::{Actual, annotations, check};

fn fixtures_dir() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures")
}

/// A project's files: (name, bytes).
type Files = Vec<(String, Vec<u8>)>;

const SINGLE_CONFIG: &str = "[checks]\n\"assumption\" = \"off\"\n";

/// The valid UTF-8 prefix of a file's bytes.
fn text_of(bytes: &[u8]) -> String {
    match std::str::from_utf8(bytes) {
        Ok(t) => t.to_string(),
        Err(e) => String::from_utf8_lossy(&bytes[..e.valid_up_to()]).into_owned(),
    }
}

/// Check one project: `files` are (name, bytes) under `/fixtures/`.
fn run(files: &[(String, Vec<u8>)]) -> Result<(), String> {
    let root = PathBuf::from("/fixtures");
    let mut fs = MemoryFs::new();
    let mut given = Vec::new();
    for (name, bytes) in files {
        let path = root.join(name);
        if name.ends_with(".plenum") {
            given.push(path.clone());
        }
        fs.insert(&path, bytes.clone());
    }
    let project = check_files(&fs, &given);
    let mut problems = Vec::new();
    for (_, d) in project.diagnostics() {
        if lookup(d.code).is_none() {
            problems.push(format!("unregistered code `{}`: {}", d.code, d.message));
        }
        let words: Vec<&str> = d.message.split(|c: char| !c.is_alphanumeric()).collect();
        assert!(
            !words.contains(&"NaN") && !words.contains(&"inf"),
            "{}",
            d.message
        );
    }
    for (name, bytes) in files {
        let path = root.join(name);
        let text = text_of(bytes);
        let actual: Vec<Actual> = project
            .file(&path)
            .map(|f| {
                f.diagnostics
                    .iter()
                    .map(|d| Actual {
                        code: d.code.to_string(),
                        severity: d.severity.as_str().to_string(),
                        start: d.loc.span.start as usize,
                        end: d.loc.span.end as usize,
                        message: d.message.clone(),
                    })
                    .collect()
            })
            .unwrap_or_default();
        if let Err(e) = check(&text, &actual) {
            problems.push(format!("{name}:\n{e}"));
        }
    }
    if problems.is_empty() {
        Ok(())
    } else {
        Err(problems.join("\n"))
    }
}

fn read_dir_files(dir: &Path, prefix: &str, out: &mut Vec<(String, Vec<u8>)>) {
    let mut entries: Vec<_> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .collect();
    entries.sort();
    for p in entries {
        let name = format!("{prefix}{}", p.file_name().unwrap().to_string_lossy());
        if p.is_dir() {
            read_dir_files(&p, &format!("{name}/"), out);
        } else {
            out.push((name, std::fs::read(&p).unwrap()));
        }
    }
}

/// Every fixture as a project: (fixture name, files).
fn all_fixtures() -> Vec<(String, Files)> {
    let mut out = Vec::new();
    let mut entries: Vec<_> = std::fs::read_dir(fixtures_dir())
        .unwrap()
        .map(|e| e.unwrap().path())
        .collect();
    entries.sort();
    for p in entries {
        let name = p.file_name().unwrap().to_string_lossy().to_string();
        if p.is_dir() {
            let mut files = Vec::new();
            read_dir_files(&p, "", &mut files);
            out.push((name, files));
        } else if name.ends_with(".plenum") {
            out.push((
                name.clone(),
                vec![
                    (name, std::fs::read(&p).unwrap()),
                    ("plenum.toml".to_string(), SINGLE_CONFIG.as_bytes().to_vec()),
                ],
            ));
        }
    }
    out
}

#[test]
fn fixtures_report_exactly_their_annotations() {
    let fixtures = all_fixtures();
    assert!(fixtures.len() >= 10, "expected the fixtures");
    let mut failures = Vec::new();
    for (name, files) in &fixtures {
        if let Err(e) = run(files) {
            failures.push(format!("== {name}\n{e}"));
        }
    }
    assert!(failures.is_empty(), "\n{}", failures.join("\n\n"));
}

fn annotated_codes(text: &str) -> impl Iterator<Item = String> {
    annotations(text).into_iter().map(|a| a.code)
}

fn codes_in_dir(dir: &Path, out: &mut BTreeSet<String>) {
    let mut files = Vec::new();
    read_dir_files(dir, "", &mut files);
    for (_, bytes) in files {
        out.extend(annotated_codes(&text_of(&bytes)));
    }
}

#[test]
fn every_registered_code_has_a_fixture_that_triggers_it() {
    // Annotations are compared exactly, so an annotated code is a code the
    // fixture triggers.
    let mut ours = BTreeSet::new();
    codes_in_dir(&fixtures_dir(), &mut ours);
    let crates = Path::new(env!("CARGO_MANIFEST_DIR")).join("..");
    let mut syntax = BTreeSet::new();
    codes_in_dir(&crates.join("plenum-syntax/tests/fixtures"), &mut syntax);
    let mut model = BTreeSet::new();
    codes_in_dir(&crates.join("plenum-model/tests/fixtures"), &mut model);
    let mut missing = Vec::new();
    for c in CHECKS {
        let covered = ours.contains(c.code)
            || (c.group == Group::Syntax && syntax.contains(c.code))
            || (c.group == Group::Model && model.contains(c.code));
        if !covered {
            missing.push(c.code);
        }
    }
    assert!(missing.is_empty(), "codes without a fixture: {missing:?}");
    for code in &ours {
        assert!(
            lookup(code).is_some(),
            "fixture annotates unregistered `{code}`"
        );
    }
}

/// Truncated fixtures and odd suppression comments: the runner never
/// panics, and everything it reports is registered and finite.
#[test]
fn damaged_inputs_never_panic() {
    let mut texts: Vec<String> = Vec::new();
    for (_, files) in all_fixtures() {
        for (name, bytes) in files {
            if !name.ends_with(".plenum") {
                continue;
            }
            let text = text_of(&bytes);
            let bounds: Vec<usize> = (0..=text.len())
                .filter(|&i| text.is_char_boundary(i))
                .collect();
            let step = (bounds.len() / 25).max(1);
            for &b in bounds.iter().step_by(step) {
                texts.push(text[..b].to_string());
            }
        }
    }
    for comment in [
        "# plenum:",
        "#plenum:allow",
        "# plenum: allow -- only a reason",
        "# plenum: allow ,, -- commas",
        "# plenum: allow oversized-coil--no spaces",
        "# plenum: allow oversized-coil -- ",
        "# plenum: allowoversized-coil -- glued",
        "# plenum: allow é -- non-ASCII code",
    ] {
        texts.push(format!("{comment}\nzone a {{ sensible 1 kBtu/h }}\n"));
        texts.push(comment.to_string());
    }
    for text in &texts {
        let mut fs = MemoryFs::new();
        fs.insert("/p/d.plenum", text.as_bytes().to_vec());
        let project = check_files(&fs, &[PathBuf::from("/p/d.plenum")]);
        for (f, d) in project.diagnostics() {
            assert!(lookup(d.code).is_some(), "{}", d.code);
            assert!(d.loc.span.end as usize <= f.text.len(), "{d:?}");
            assert!(!d.message.contains("NaN"), "{}", d.message);
        }
    }
}
