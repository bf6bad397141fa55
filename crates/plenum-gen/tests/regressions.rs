#![allow(clippy::unwrap_used)]
//! Every input the fuzzers ever crashed on, kept under
//! `fuzz/regressions/<target>/`, replayed through the same check as its fuzz
//! target — so CI covers them without the fuzzer. The committed seeds under
//! `fuzz/seeds/` go through all three checks too.

use std::fs;
use std::path::{Path, PathBuf};

use plenum_gen::oracle::{check_analysis, check_format, check_parse, split_analysis_input};

fn fuzz_dir() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../../fuzz")
}

/// The inputs in a folder (not its README), sorted for a stable order.
fn inputs(dir: &Path) -> Vec<(PathBuf, Vec<u8>)> {
    let mut out: Vec<(PathBuf, Vec<u8>)> = fs::read_dir(dir)
        .unwrap_or_else(|e| panic!("{}: {e}", dir.display()))
        .map(|e| e.unwrap().path())
        .filter(|p| p.is_file() && p.file_name().is_some_and(|n| n != "README.md"))
        .map(|p| {
            let bytes = fs::read(&p).unwrap();
            (p, bytes)
        })
        .collect();
    out.sort();
    out
}

fn run(target: &str, data: &[u8]) -> Result<(), String> {
    match target {
        "parse" => check_parse(&String::from_utf8_lossy(data)),
        "analysis" => {
            let (root, other) = split_analysis_input(data);
            check_analysis(&root, &other)
        }
        "format" => check_format(&String::from_utf8_lossy(data)),
        _ => Err(format!("no fuzz target `{target}`")),
    }
}

#[test]
fn every_saved_crasher_passes_its_target_check() {
    let mut failures = Vec::new();
    for target in ["parse", "analysis", "format"] {
        let dir = fuzz_dir().join("regressions").join(target);
        for (path, data) in inputs(&dir) {
            if let Err(e) = run(target, &data) {
                failures.push(format!("{}: {e}", path.display()));
            }
        }
    }
    assert!(failures.is_empty(), "{failures:#?}");
}

#[test]
fn the_seeds_pass_every_check() {
    let seeds = inputs(&fuzz_dir().join("seeds"));
    assert!(
        !seeds.is_empty(),
        "fuzz/seeds holds the committed seed inputs"
    );
    for (path, data) in seeds {
        for target in ["parse", "analysis", "format"] {
            assert_eq!(run(target, &data), Ok(()), "{} ({target})", path.display());
        }
    }
}
