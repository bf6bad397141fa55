//! Formatting a design changes no computed result: every example and every
//! generated reference design (tests/reference/coil/designs, written by the
//! independent Python reference) lowers and evaluates to the same numbers
//! before and after `plenum_fmt::format`, and after formatting a deliberately
//! untidy copy.

#![allow(clippy::unwrap_used)]

use std::path::{Path, PathBuf};

use plenum_model::{MemoryFs, Model};

fn designs() -> Vec<PathBuf> {
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("../..");
    let mut out = Vec::new();
    for dir in ["examples", "tests/reference/coil/designs"] {
        for entry in std::fs::read_dir(root.join(dir)).unwrap() {
            let p = entry.unwrap().path();
            if p.extension().is_some_and(|e| e == "plenum") {
                out.push(p);
            }
        }
    }
    out.sort();
    out
}

/// The evaluation with every source location blanked out: the numbers, the
/// statuses, the findings and the assumptions, not where they were written.
fn results(path: &Path, text: &str) -> String {
    let mut fs = MemoryFs::new();
    // The examples' shared files, so `use` resolves as on disk.
    let dir = path.parent().unwrap();
    for entry in walk(dir) {
        if entry != path {
            fs.insert(&entry, std::fs::read(&entry).unwrap());
        }
    }
    let model = Model::build(&fs, path, text.to_string());
    assert!(
        model.diagnostics.is_empty(),
        "{}: {:#?}",
        path.display(),
        model.diagnostics
    );
    let evaluation = plenum_engine::evaluate(&model.design);
    let debug = format!("{:#?}", evaluation);
    blank_locations(&debug)
}

fn walk(dir: &Path) -> Vec<PathBuf> {
    let mut out = Vec::new();
    for entry in std::fs::read_dir(dir).unwrap() {
        let p = entry.unwrap().path();
        if p.is_dir() {
            out.extend(walk(&p));
        } else if p.extension().is_some_and(|e| e == "plenum") {
            out.push(p);
        }
    }
    out
}

/// `span: 12..40` → `span: _` (spans print as `start..end`).
fn blank_locations(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    for line in s.lines() {
        let trimmed = line.trim_start();
        if let Some(rest) = trimmed.strip_prefix("span: ") {
            let indent = &line[..line.len() - trimmed.len()];
            let tail = if rest.ends_with(',') { "," } else { "" };
            out.push_str(indent);
            out.push_str("span: _");
            out.push_str(tail);
        } else {
            out.push_str(line);
        }
        out.push('\n');
    }
    out
}

/// An untidy copy: lines indented wrongly, keys and values pushed apart,
/// blank lines doubled (comments stay as they are).
fn untidy(text: &str) -> String {
    text.lines()
        .map(|l| {
            let t = l.trim_start();
            if t.is_empty() {
                "\n\n".to_string()
            } else if t.starts_with('#') {
                format!("{t}\n")
            } else {
                format!("      {}\n", t.replacen(' ', "     ", 1))
            }
        })
        .collect()
}

#[test]
fn formatting_changes_no_computed_result() {
    let files = designs();
    assert!(
        files.len() >= 10,
        "expected the examples and the reference designs"
    );
    for path in files {
        let text = std::fs::read_to_string(&path).unwrap();
        let before = results(&path, &text);
        assert!(
            before.contains("total_btuh"),
            "{}: nothing was computed",
            path.display()
        );
        let formatted = plenum_fmt::format(&text).unwrap();
        assert_eq!(before, results(&path, &formatted), "{}", path.display());
        let messy = untidy(&text);
        assert_ne!(messy, text);
        let reformatted = plenum_fmt::format(&messy).unwrap();
        assert_eq!(
            reformatted,
            formatted,
            "{}: formatting is not canonical",
            path.display()
        );
        assert_eq!(before, results(&path, &reformatted), "{}", path.display());
    }
}
