//! Every design under `examples/` is already formatted, and formatting any
//! re-spaced copy of one gives it back.

#![allow(clippy::unwrap_used)] // test helpers: a failure is the test failing

mod common;

use std::path::{Path, PathBuf};

use proptest::prelude::*;

fn examples() -> Vec<(PathBuf, String)> {
    fn walk(dir: &Path, out: &mut Vec<PathBuf>) {
        for entry in std::fs::read_dir(dir).unwrap() {
            let path = entry.unwrap().path();
            if path.is_dir() {
                walk(&path, out);
            } else if path.extension().is_some_and(|e| e == "plenum") {
                out.push(path);
            }
        }
    }
    let root = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../examples");
    let mut paths = Vec::new();
    walk(&root, &mut paths);
    paths.sort();
    assert!(
        paths.len() >= 3,
        "examples not found under {}",
        root.display()
    );
    paths
        .into_iter()
        .map(|p| {
            let text = std::fs::read_to_string(&p).unwrap();
            (p, text)
        })
        .collect()
}

#[test]
fn every_example_is_formatted() {
    for (path, text) in examples() {
        let formatted =
            plenum_fmt::format(&text).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
        assert!(
            formatted == text,
            "{} is not formatted; `plenum fmt` gives:\n{formatted}",
            path.display()
        );
        assert!(plenum_fmt::format_edits(&text).unwrap().is_empty());
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 48, ..ProptestConfig::default() })]

    /// Re-space an example at random (every token and comment kept, line
    /// breaks and blank lines kept where there were some): formatting gives
    /// the example back, so the layout depends on nothing else.
    #[test]
    fn respaced_examples_format_back(seed in any::<u64>()) {
        for (path, text) in examples() {
            let messy = common::perturb(&text, seed);
            let formatted = plenum_fmt::format(&messy)
                .unwrap_or_else(|e| panic!("{}: {e}\n{messy}", path.display()));
            prop_assert_eq!(common::meaning(&messy), common::meaning(&text));
            prop_assert_eq!(common::meaning(&formatted), common::meaning(&text));
            prop_assert_eq!(plenum_fmt::format(&formatted).unwrap(), formatted.clone());
            let edits = plenum_fmt::format_edits(&messy).unwrap();
            prop_assert_eq!(plenum_fmt::apply_edits(&messy, &edits), Some(formatted.clone()));
            // The blank lines were kept and the example is formatted: it
            // comes back, in the line ending of the copy.
            let expected = if messy.contains("\r\n") {
                text.replace('\n', "\r\n")
            } else {
                text.clone()
            };
            prop_assert_eq!(formatted, expected, "{}", path.display());
        }
    }
}
