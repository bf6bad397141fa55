//! End-to-end tests of the checker's outputs: the undersized unit CI must
//! fail on, `plenum explain`, SARIF validated against the published SARIF
//! 2.1.0 schema (OASIS SARIF TC, `tests/sarif/`), GitHub annotations, JSON,
//! Markdown, `--deny warnings` and `plenum.toml` settings.

#![allow(clippy::unwrap_used)]

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn plenum(args: &[&str], dir: &Path) -> Output {
    Command::new(env!("CARGO_BIN_EXE_plenum"))
        .args(args)
        .current_dir(dir)
        .env("NO_COLOR", "1")
        .env_remove("GITHUB_STEP_SUMMARY")
        .output()
        .unwrap()
}

fn stdout(out: &Output) -> String {
    String::from_utf8_lossy(&out.stdout).into_owned()
}

fn write(dir: &Path, name: &str, text: &str) -> PathBuf {
    let path = dir.join(name);
    if let Some(parent) = path.parent() {
        std::fs::create_dir_all(parent).unwrap();
    }
    std::fs::write(&path, text).unwrap();
    path
}

/// An office whose 2-ton coil is far below its load.
const UNDERSIZED: &str = "site {\n  elevation 0 ft\n  cooling   95 °F db, 75 °F wb\n}\n\nzone office \"Open office\" {\n  area     1_000 ft²\n  people   5\n  use      office\n  sensible 30 kBtu/h\n  latent   3 kBtu/h\n}\n\nahu rtu_1 \"Office unit\" {\n  serves office\n  coil { rated 2 ton }\n}\n";

#[test]
fn an_undersized_unit_fails_the_check_naming_unit_required_and_rated() {
    let dir = tempfile::tempdir().unwrap();
    write(dir.path(), "office.plenum", UNDERSIZED);
    let out = plenum(&["check", "office.plenum"], dir.path());
    assert_eq!(out.status.code(), Some(1));
    let text = stdout(&out);
    assert!(text.contains("undersized-coil"), "{text}");
    assert!(
        text.contains("`rtu_1` (\"Office unit\") is undersized"),
        "{text}"
    );
    assert!(text.contains("is rated 2.00 ton (24,000 Btu/h)"), "{text}");
    // The required capacity in tons and Btu/h, and the margin.
    let needs = text.split("needs ").nth(1).unwrap();
    assert!(
        needs.contains(" ton (") && needs.contains(" Btu/h) total"),
        "{text}"
    );
    assert!(text.contains("a margin of -"), "{text}");
    assert!(text.contains("1 error, 0 warnings"), "{text}");

    let out = plenum(&["explain", "undersized-coil"], dir.path());
    assert_eq!(out.status.code(), Some(0));
    let doc = stdout(&out);
    for part in [
        "# undersized-coil (error, result)",
        "## What it checks",
        "## Why it matters",
        "## Example",
        "## How to fix it",
        "## Source",
        "methods.md §4 step 11",
    ] {
        assert!(doc.contains(part), "{part}: {doc}");
    }
}

#[test]
fn the_json_output_keeps_its_shape() {
    let dir = tempfile::tempdir().unwrap();
    write(dir.path(), "office.plenum", UNDERSIZED);
    let out = plenum(&["check", "--format", "json", "office.plenum"], dir.path());
    assert_eq!(out.status.code(), Some(1));
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let diags = v["diagnostics"].as_array().unwrap();
    let d = diags
        .iter()
        .find(|d| d["code"] == "undersized-coil")
        .unwrap();
    for key in [
        "code",
        "severity",
        "message",
        "file",
        "line",
        "column",
        "end_line",
        "end_column",
    ] {
        assert!(!d[key].is_null(), "{key}");
    }
    assert_eq!(d["severity"], "error");
    assert_eq!(d["file"], "office.plenum");
    // `rated 2 ton` on line 16, from column 10 (1-based, characters).
    assert_eq!(
        (d["line"].as_u64(), d["column"].as_u64()),
        (Some(16), Some(10))
    );
    assert_eq!(d["end_column"], 21);
    assert!(v.get("baseline").is_none());
}

#[test]
fn explain_lists_every_code_and_suggests_the_nearest() {
    let dir = tempfile::tempdir().unwrap();
    let out = plenum(&["explain", "--list"], dir.path());
    assert_eq!(out.status.code(), Some(0));
    let list = stdout(&out);
    for c in plenum_checks::CHECKS {
        let line = list
            .lines()
            .find(|l| l.split_whitespace().next() == Some(c.code))
            .unwrap_or_else(|| panic!("{} not listed", c.code));
        assert!(
            line.contains(c.severity.as_str()) && line.contains(c.summary),
            "{line}"
        );
    }
    let out = plenum(&["explain", "oversize-coil"], dir.path());
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("did you mean `oversized-coil`?"), "{err}");
    let out = plenum(&["explain"], dir.path());
    assert_eq!(out.status.code(), Some(2));
}

/// A project with an error, a warning, an info, a label in the same file
/// and a name with a space and a non-ASCII character.
fn mixed_project(dir: &Path) {
    write(
        dir,
        "east wing/café.plenum",
        "site { cooling 94 °F db, 75 °F wb }\nzone office { area 1_000 ft²; people 5; use office; sensible 20 kBtu/h; latent 2 kBtu/h }\nahu big { serves office; coil { rated 10 ton } }\nzone a { sensible 1 kBtu/h }\nzone b {\n  sensible 2 kBtu/h\n  area 3 ft\n}\n",
    );
}

#[test]
fn sarif_output_validates_against_the_published_schema() {
    let dir = tempfile::tempdir().unwrap();
    mixed_project(dir.path());
    let out = plenum(&["check", "--format", "sarif"], dir.path());
    assert_eq!(out.status.code(), Some(1));
    let log: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let schema_path =
        Path::new(env!("CARGO_MANIFEST_DIR")).join("../../tests/sarif/sarif-schema-2.1.0.json");
    let schema: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(schema_path).unwrap()).unwrap();
    let validator = jsonschema::options()
        .should_validate_formats(true)
        .build(&schema)
        .unwrap();
    let errors: Vec<String> = validator
        .iter_errors(&log)
        .map(|e| format!("{} at {}", e, e.instance_path))
        .collect();
    assert!(errors.is_empty(), "{errors:#?}");

    let run = &log["runs"][0];
    let driver = &run["tool"]["driver"];
    assert_eq!(driver["name"], "plenum");
    assert!(driver["informationUri"].is_string() && driver["version"].is_string());
    let rules = driver["rules"].as_array().unwrap();
    assert_eq!(rules.len(), plenum_checks::CHECKS.len());
    let rule = rules.iter().find(|r| r["id"] == "oversized-coil").unwrap();
    assert_eq!(rule["defaultConfiguration"]["level"], "warning");
    assert!(
        rule["help"]["text"]
            .as_str()
            .unwrap()
            .contains("## Why it matters")
    );
    let results = run["results"].as_array().unwrap();
    let r = results
        .iter()
        .find(|r| r["ruleId"] == "oversized-coil")
        .unwrap();
    assert_eq!(r["level"], "warning");
    let loc = &r["locations"][0]["physicalLocation"];
    assert_eq!(
        loc["artifactLocation"]["uri"],
        "east%20wing/caf%C3%A9.plenum"
    );
    assert_eq!(loc["region"]["startLine"], 3);
    assert_eq!(loc["region"]["startColumn"], 33);
    // The rule index points at the rule.
    let i = r["ruleIndex"].as_u64().unwrap() as usize;
    assert_eq!(rules[i]["id"], "oversized-coil");
    assert!(results.iter().any(|r| r["level"] == "error"));
    assert!(results.iter().any(|r| r["level"] == "note"));
}

#[test]
fn sarif_fingerprints_survive_unrelated_edits() {
    let fingerprints = |text: &str| {
        let dir = tempfile::tempdir().unwrap();
        write(dir.path(), "d.plenum", text);
        let out = plenum(&["check", "--format", "sarif", "d.plenum"], dir.path());
        let log: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
        let mut v: Vec<(String, String, u64)> = log["runs"][0]["results"]
            .as_array()
            .unwrap()
            .iter()
            .map(|r| {
                (
                    r["ruleId"].as_str().unwrap().to_string(),
                    r["partialFingerprints"]["plenumFingerprint/v1"]
                        .as_str()
                        .unwrap()
                        .to_string(),
                    r["locations"][0]["physicalLocation"]["region"]["startLine"]
                        .as_u64()
                        .unwrap(),
                )
            })
            .collect();
        v.sort();
        v
    };
    let before = fingerprints(UNDERSIZED);
    // Comments and blank lines added above: every finding moves down.
    let edited = format!("# Revision D\n\n# (no change to the loads)\n{UNDERSIZED}");
    let after = fingerprints(&edited);
    assert_eq!(before.len(), after.len());
    for (b, a) in before.iter().zip(&after) {
        assert_eq!((&b.0, &b.1), (&a.0, &a.1));
        assert_eq!(a.2, b.2 + 3);
    }
    // Fingerprints differ between findings.
    let mut fps: Vec<&String> = before.iter().map(|f| &f.1).collect();
    fps.sort();
    fps.dedup();
    assert_eq!(fps.len(), before.len());
    // A change to the flagged line changes its fingerprint.
    let changed = fingerprints(&UNDERSIZED.replace("rated 2 ton", "rated 2.5 ton"));
    let fp = |v: &[(String, String, u64)]| {
        v.iter()
            .find(|f| f.0 == "undersized-coil")
            .map(|f| f.1.clone())
    };
    assert_ne!(fp(&before), fp(&changed));
}

#[test]
fn every_finding_gives_one_escaped_github_annotation() {
    let dir = tempfile::tempdir().unwrap();
    mixed_project(dir.path());
    let json = plenum(&["check", "--format", "json"], dir.path());
    let v: serde_json::Value = serde_json::from_slice(&json.stdout).unwrap();
    let count = v["diagnostics"].as_array().unwrap().len();
    let out = plenum(&["check", "--format", "github"], dir.path());
    assert_eq!(out.status.code(), Some(1));
    let text = stdout(&out);
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(lines.len(), count, "{text}");
    for l in &lines {
        assert!(
            l.starts_with("::error ") || l.starts_with("::warning ") || l.starts_with("::notice "),
            "{l}"
        );
        assert!(!l.contains('\r'));
    }
    let over = lines
        .iter()
        .find(|l| l.contains("title=plenum oversized-coil"))
        .unwrap();
    assert!(
        over.starts_with(
            "::warning file=east wing/café.plenum,line=3,col=33,endLine=3,endColumn=45,title=plenum oversized-coil::"
        ),
        "{over}"
    );
    // `%` in the message is escaped, and the help follows after an escaped newline.
    assert!(over.contains("+246.8 %25"), "{over}");
    assert!(over.contains("%0Ahelp: "), "{over}");
    let mismatch = lines.iter().find(|l| l.contains("unit-mismatch")).unwrap();
    assert!(mismatch.starts_with("::error "), "{mismatch}");
    assert!(lines.iter().any(|l| l.starts_with("::notice ")));
}

#[test]
fn deny_warnings_turns_warnings_into_a_failing_exit_status() {
    let dir = tempfile::tempdir().unwrap();
    write(
        dir.path(),
        "d.plenum",
        "site { cooling 94 °F db, 75 °F wb }\nzone office { area 1_000 ft²; people 5; use office; sensible 20 kBtu/h; latent 2 kBtu/h }\nahu big { serves office; coil { rated 10 ton } }\n",
    );
    let out = plenum(&["check", "d.plenum"], dir.path());
    assert_eq!(out.status.code(), Some(0), "{}", stdout(&out));
    assert!(stdout(&out).contains("oversized-coil"));
    let out = plenum(&["check", "--deny", "warnings", "d.plenum"], dir.path());
    assert_eq!(out.status.code(), Some(1));
    let out = plenum(&["check", "--deny", "everything", "d.plenum"], dir.path());
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn plenum_toml_sets_severities_and_reports_bad_settings() {
    let dir = tempfile::tempdir().unwrap();
    // The design is in a subfolder: `plenum.toml` is found above it.
    write(
        dir.path(),
        "designs/d.plenum",
        "site { cooling 94 °F db, 75 °F wb }\nzone office { area 1_000 ft²; people 5; use office; sensible 20 kBtu/h; latent 2 kBtu/h }\nahu big { serves office; coil { rated 10 ton } }\n",
    );
    write(
        dir.path(),
        "plenum.toml",
        "[checks]\n\"oversized-coil\" = \"error\"\n\"assumption\" = \"off\"\n",
    );
    let out = plenum(
        &["check", "--format", "json", "designs/d.plenum"],
        dir.path(),
    );
    assert_eq!(out.status.code(), Some(1));
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let diags = v["diagnostics"].as_array().unwrap();
    assert_eq!(diags.len(), 1, "{diags:#?}");
    assert_eq!(diags[0]["code"], "oversized-coil");
    assert_eq!(diags[0]["severity"], "error");
    // A bad file is a diagnostic on it, not a crash.
    write(dir.path(), "plenum.toml", "[checks\n");
    let out = plenum(
        &["check", "--format", "json", "designs/d.plenum"],
        dir.path(),
    );
    assert_eq!(out.status.code(), Some(1));
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let bad: Vec<_> = v["diagnostics"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|d| d["code"] == "invalid-config")
        .collect();
    assert_eq!(bad.len(), 1);
    assert_eq!(bad[0]["file"], "plenum.toml");
    assert_eq!(bad[0]["line"], 1);
}

#[test]
fn markdown_output_is_a_table_with_the_caution() {
    let dir = tempfile::tempdir().unwrap();
    write(dir.path(), "office.plenum", UNDERSIZED);
    let out = plenum(
        &["check", "--format", "markdown", "office.plenum"],
        dir.path(),
    );
    assert_eq!(out.status.code(), Some(1));
    let md = stdout(&out);
    assert!(md.starts_with("## Plenum check"), "{md}");
    assert!(
        md.contains("| error | `undersized-coil` | `office.plenum:16:10` |"),
        "{md}"
    );
    assert!(
        md.trim_end()
            .ends_with("the codes in force where the building stands govern."),
        "{md}"
    );
}
