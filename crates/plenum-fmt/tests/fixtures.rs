//! Fixture pairs: `fixtures/NAME.in` formats to `fixtures/NAME.out` exactly.
//! The `.out` files are the layout rules of the crate docs, by example; they
//! are kept byte for byte (`fixtures/.gitattributes` stops line-ending
//! conversion, for the CRLF pair). The extensions are not `.plenum` so that
//! `plenum fmt` run over the repository leaves the untidy inputs alone.

#![allow(clippy::unwrap_used)] // test helpers: a failure is the test failing

mod common;

use std::path::PathBuf;

fn dir() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures")
}

fn read(name: &str, ext: &str) -> String {
    let path = dir().join(format!("{name}.{ext}"));
    std::fs::read_to_string(&path).unwrap_or_else(|e| panic!("{}: {e}", path.display()))
}

fn check(name: &str) {
    let input = read(name, "in");
    let expected = read(name, "out");
    let got = plenum_fmt::format(&input).unwrap_or_else(|e| panic!("{name}: {e}"));
    assert!(
        got == expected,
        "{name}: formatted text differs from {name}.out\n--- got ---\n{got}--- expected ---\n{expected}---"
    );
    // The expected text is itself formatted, means what the input means, and
    // keeps the comments in order.
    assert_eq!(
        plenum_fmt::format(&expected).unwrap(),
        expected,
        "{name}: .out is not stable"
    );
    assert_eq!(
        common::meaning(&input),
        common::meaning(&expected),
        "{name}: meaning changed"
    );
    let edits = plenum_fmt::format_edits(&input).unwrap();
    assert_eq!(
        plenum_fmt::apply_edits(&input, &edits).as_deref(),
        Some(expected.as_str())
    );
}

macro_rules! fixtures {
    ($($name:ident),* $(,)?) => {
        $(
            #[test]
            fn $name() {
                check(stringify!($name));
            }
        )*

        #[test]
        fn every_fixture_file_has_a_test() {
            let listed = [$(stringify!($name)),*];
            let mut found = Vec::new();
            for entry in std::fs::read_dir(dir()).unwrap() {
                let path = entry.unwrap().path();
                let Some(ext) = path.extension().and_then(|e| e.to_str()) else { continue };
                if ext == "in" || ext == "out" {
                    let stem = path.file_stem().unwrap().to_str().unwrap().to_string();
                    assert!(
                        listed.contains(&stem.as_str()),
                        "{} has no test in fixtures.rs",
                        path.display()
                    );
                    found.push((stem, ext.to_string()));
                }
            }
            for name in listed {
                for ext in ["in", "out"] {
                    assert!(
                        found.iter().any(|(s, e)| s == name && e == ext),
                        "missing fixtures/{name}.{ext}"
                    );
                }
            }
        }
    };
}

fixtures!(
    alignment,
    blank_lines,
    comments_block_end,
    comments_file_start_end,
    comments_first_item,
    comments_interior,
    comments_own_line,
    comments_trailing,
    crlf,
    empty_blocks,
    indentation,
    semicolons,
    units_spacing,
);

#[test]
fn crlf_fixture_really_is_crlf() {
    // Guards against a checkout that converted the line endings.
    let input = read("crlf", "in");
    let expected = read("crlf", "out");
    assert!(
        input.starts_with("zone a {\r\n"),
        "the first line break is CRLF"
    );
    assert!(input.ends_with("}\n"), "the input mixes in one LF line");
    assert_eq!(
        expected.matches('\n').count(),
        expected.matches("\r\n").count()
    );
}
