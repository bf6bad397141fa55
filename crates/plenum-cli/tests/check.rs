//! End-to-end tests of `plenum check`: the real binary on real files.

#![allow(clippy::unwrap_used)]

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn plenum(args: &[&str], dir: &Path) -> Output {
    Command::new(env!("CARGO_BIN_EXE_plenum"))
        .args(args)
        .current_dir(dir)
        .env("NO_COLOR", "1")
        .output()
        .unwrap()
}

fn repo() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

fn json(out: &Output) -> serde_json::Value {
    serde_json::from_slice(&out.stdout)
        .unwrap_or_else(|e| panic!("not JSON ({e}): {}", String::from_utf8_lossy(&out.stdout)))
}

fn diagnostics(out: &Output) -> Vec<serde_json::Value> {
    json(out)["diagnostics"].as_array().unwrap().clone()
}

/// The errors and warnings (infos, such as the defaults used, left out).
fn problems(out: &Output) -> Vec<serde_json::Value> {
    diagnostics(out)
        .into_iter()
        .filter(|d| d["severity"] != "info")
        .collect()
}

fn write(dir: &Path, name: &str, bytes: &[u8]) -> PathBuf {
    let path = dir.join(name);
    if let Some(parent) = path.parent() {
        std::fs::create_dir_all(parent).unwrap();
    }
    std::fs::write(&path, bytes).unwrap();
    path
}

#[test]
fn the_examples_check_cleanly() {
    let out = plenum(&["check", "examples"], &repo());
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
}

#[test]
fn three_independent_errors_are_reported_at_their_lines() {
    let dir = tempfile::tempdir().unwrap();
    write(
        dir.path(),
        "three.plenum",
        b"zone a {\n  area 2_400 ft\xc2\xb2 12\n  people 40\n  sensible = 38.5 kBtu/h\n}\n\nahu b {\n  serves a\n  supply_temp 55 \xc2\xb0F +\n}\n",
    );
    let out = plenum(&["check", "three.plenum", "--format", "json"], dir.path());
    assert_eq!(out.status.code(), Some(1));
    let diags = diagnostics(&out);
    let lines: Vec<u64> = diags.iter().map(|d| d["line"].as_u64().unwrap()).collect();
    assert_eq!(lines, vec![2, 4, 10], "{diags:#?}");
    for d in &diags {
        assert_eq!(d["severity"], "error");
        assert_eq!(d["code"], "syntax-error");
        assert_eq!(d["file"], "three.plenum");
    }
    // Columns count characters: `12` follows `ft²` (3 characters, 4 bytes).
    assert_eq!(diags[0]["column"], 18);
    assert_eq!(diags[0]["end_column"], 20);
}

#[test]
fn a_missing_last_brace_is_one_error_at_the_end() {
    let dir = tempfile::tempdir().unwrap();
    write(
        dir.path(),
        "open.plenum",
        b"zone a { sensible 1 kBtu/h }\nahu b {\n  serves a\n  coil {\n    rated 1 ton\n  }\n",
    );
    let out = plenum(&["check", "open.plenum", "--format", "json"], dir.path());
    assert_eq!(out.status.code(), Some(1));
    let diags = diagnostics(&out);
    assert_eq!(diags.len(), 1, "{diags:#?}");
    assert_eq!(diags[0]["code"], "unclosed-block");
    assert_eq!(diags[0]["line"], 7);
    assert_eq!(diags[0]["column"], 1);
}

#[test]
fn hostile_inputs_give_located_errors_and_exit_1() {
    let dir = tempfile::tempdir().unwrap();
    let cases: Vec<(&str, Vec<u8>)> = vec![
        ("binary.plenum", (0u8..=255).cycle().take(4096).collect()),
        ("nul.plenum", b"zone a {\0\0\0}\n".to_vec()),
        (
            "latin1.plenum",
            b"zone caf\xe9 { sensible 1 kBtu/h }\n".to_vec(),
        ),
        ("braces.plenum", "{".repeat(20_000).into_bytes()),
        (
            "digits.plenum",
            format!("let x = 1{} cfm\n", "0".repeat(5_000)).into_bytes(),
        ),
        ("string.plenum", b"project \"never closed\n".to_vec()),
    ];
    for (name, bytes) in &cases {
        write(dir.path(), name, bytes);
        let out = plenum(&["check", name, "--format", "json"], dir.path());
        assert_eq!(
            out.status.code(),
            Some(1),
            "{name}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        let diags = diagnostics(&out);
        assert!(!diags.is_empty(), "{name}");
        for d in &diags {
            assert!(d["line"].as_u64().unwrap() >= 1, "{name}");
            assert!(d["column"].as_u64().unwrap() >= 1, "{name}");
        }
        // The text renderer copes too.
        let text = plenum(&["check", name], dir.path());
        assert_eq!(text.status.code(), Some(1), "{name}");
    }
    let out = plenum(&["check", "latin1.plenum", "--format", "json"], dir.path());
    let d = &diagnostics(&out)[0];
    assert_eq!(d["code"], "invalid-utf8");
    assert_eq!(
        (d["line"].as_u64(), d["column"].as_u64()),
        (Some(1), Some(9))
    );
}

#[test]
fn unreadable_input_and_usage_errors_exit_2() {
    let dir = tempfile::tempdir().unwrap();
    let out = plenum(&["check", "no-such-file.plenum"], dir.path());
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("no such file"));
    let out = plenum(&["check", "--format", "xml"], dir.path());
    assert_eq!(out.status.code(), Some(2));
    let out = plenum(&["frobnicate"], dir.path());
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn folders_are_searched_honouring_gitignore() {
    let dir = tempfile::tempdir().unwrap();
    write(dir.path(), "good.plenum", b"zone a { sensible 1 kBtu/h }\n");
    write(dir.path(), "sub/bad.plenum", b"zone b { sensible = }\n");
    write(dir.path(), "ignored/worse.plenum", b"}}}\n");
    write(dir.path(), "notes.txt", b"}}}\n");
    write(dir.path(), ".gitignore", b"ignored/\n");
    let out = plenum(&["check", "--format", "json"], dir.path());
    assert_eq!(out.status.code(), Some(1));
    let files: Vec<String> = diagnostics(&out)
        .iter()
        .map(|d| d["file"].as_str().unwrap().replace('\\', "/"))
        .collect();
    assert_eq!(files, vec!["sub/bad.plenum".to_string()]);
    // Without errors in scope, the exit status is 0.
    let out = plenum(&["check", "good.plenum"], dir.path());
    assert_eq!(out.status.code(), Some(0));
}

#[test]
fn text_output_shows_the_snippet_and_a_summary() {
    let dir = tempfile::tempdir().unwrap();
    write(
        dir.path(),
        "e.plenum",
        b"zone a {\n  sensible = 3 kBtu/h\n}\n",
    );
    let out = plenum(&["check", "e.plenum"], dir.path());
    let stdout = String::from_utf8_lossy(&out.stdout);
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert!(stdout.contains("expected a value, found `=`"), "{stdout}");
    assert!(stdout.contains("sensible = 3 kBtu/h"), "{stdout}");
    assert!(stdout.contains("without `=`"), "{stdout}");
    assert!(
        stdout.contains("1 error, 0 warnings, 0 infos in 1 file"),
        "{stdout}"
    );
    assert!(stderr.is_empty(), "{stderr}");
    // The text output ends with the caution.
    assert!(
        stdout
            .trim_end()
            .ends_with("the codes in force where the building stands govern."),
        "{stdout}"
    );
}

#[test]
fn a_value_in_the_wrong_unit_is_a_unit_mismatch_at_its_line() {
    let dir = tempfile::tempdir().unwrap();
    write(
        dir.path(),
        "units.plenum",
        "site { cooling 94 °F db, 75 °F wb }\nzone office {\n  area 1_000 ft²\n  sensible 4_200 cfm\n}\nahu a { serves office }\n"
            .as_bytes(),
    );
    let out = plenum(&["check", "units.plenum", "--format", "json"], dir.path());
    assert_eq!(out.status.code(), Some(1));
    let diags = problems(&out);
    assert_eq!(diags.len(), 1, "{diags:#?}");
    assert_eq!(diags[0]["code"], "unit-mismatch");
    assert_eq!(diags[0]["line"], 4);
    assert!(diags[0]["message"].as_str().unwrap().contains("`sensible`"));
}

#[test]
fn a_shared_file_is_checked_through_the_design_that_uses_it() {
    let dir = tempfile::tempdir().unwrap();
    write(dir.path(), "plenum.toml", b"");
    write(
        dir.path(),
        "shared/site.plenum",
        "site { cooling 94 °F db, 75 °F wb }\nlet lights = 2 kW + 3 ft²\n".as_bytes(),
    );
    write(
        dir.path(),
        "a.plenum",
        b"use \"shared/site.plenum\"\nzone z { sensible 1 kW }\nahu u { serves z }\n",
    );
    write(
        dir.path(),
        "b.plenum",
        b"use \"shared/site.plenum\"\nzone y { sensible 1 kW }\nahu v { serves y }\n",
    );
    let out = plenum(&["check", "--format", "json"], dir.path());
    assert_eq!(out.status.code(), Some(1));
    let diags = problems(&out);
    // Reported once, in the shared file, although two designs use it.
    assert_eq!(diags.len(), 1, "{diags:#?}");
    assert_eq!(diags[0]["file"], "shared/site.plenum");
    assert_eq!(diags[0]["code"], "unit-mismatch");
}
