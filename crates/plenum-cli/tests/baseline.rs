//! `plenum check --baseline REV` in a temporary git repository (the `git`
//! binary, with a local user name and e-mail).

#![allow(clippy::unwrap_used)]

use std::path::Path;
use std::process::{Command, Output};

fn git(dir: &Path, args: &[&str]) {
    let out = Command::new("git")
        .args(args)
        .current_dir(dir)
        .env("GIT_CONFIG_NOSYSTEM", "1")
        .env("HOME", dir)
        .output()
        .unwrap();
    assert!(
        out.status.success(),
        "git {args:?}: {}",
        String::from_utf8_lossy(&out.stderr)
    );
}

fn plenum(args: &[&str], dir: &Path, env: &[(&str, &Path)]) -> Output {
    let mut cmd = Command::new(env!("CARGO_BIN_EXE_plenum"));
    cmd.args(args)
        .current_dir(dir)
        .env("NO_COLOR", "1")
        .env_remove("GITHUB_STEP_SUMMARY");
    for (k, v) in env {
        cmd.env(k, v);
    }
    cmd.output().unwrap()
}

fn write(dir: &Path, name: &str, text: &str) {
    let path = dir.join(name);
    std::fs::create_dir_all(path.parent().unwrap()).unwrap();
    std::fs::write(path, text).unwrap();
}

const SITE: &str = "site {\n  elevation 0 ft\n  cooling   95 °F db, 75 °F wb\n}\n";

fn zones(office_sensible: &str) -> String {
    format!(
        "zone office {{\n  area     1_000 ft²\n  people   5\n  use      office\n  sensible {office_sensible}\n  latent   2 kBtu/h\n}}\n\nzone lab {{\n  area     800 ft²\n  people   4\n  use      office\n  sensible 15 kBtu/h\n  latent   1 kBtu/h\n}}\n"
    )
}

const UNITS: &str = "use \"shared/site.plenum\"\nuse \"zones.plenum\"\n\nahu east \"East unit\" {\n  serves office\n  coil { rated 3 ton }\n}\n\nahu west {\n  serves lab\n  coil { rated 2.5 ton }\n}\n";

/// A repository whose second commit adds load to `office`, so that `east`
/// (3 ton) becomes undersized; `west` does not change.
fn repo() -> tempfile::TempDir {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    git(d, &["init", "-q", "-b", "main"]);
    git(d, &["config", "user.name", "Plenum Test"]);
    git(d, &["config", "user.email", "test@example.invalid"]);
    git(d, &["config", "commit.gpgsign", "false"]);
    write(d, "design/shared/site.plenum", SITE);
    write(d, "design/zones.plenum", &zones("20 kBtu/h"));
    write(d, "design/units.plenum", UNITS);
    git(d, &["add", "."]);
    git(d, &["commit", "-q", "-m", "Design revision A"]);
    // The load grows in the `use`d file only.
    write(d, "design/zones.plenum", &zones("32 kBtu/h"));
    git(
        d,
        &["commit", "-q", "-am", "Revision B: the office gains load"],
    );
    dir
}

/// `2.88 ton` → 2.88
fn tons_after(text: &str, marker: &str) -> f64 {
    let rest = text.split(marker).nth(1).unwrap();
    rest.split(" ton").next().unwrap().trim().parse().unwrap()
}

#[test]
fn a_commit_that_undersizes_a_unit_fails_against_its_parent() {
    let dir = repo();
    let d = dir.path();
    let out = plenum(&["check", "--baseline", "HEAD~1"], d, &[]);
    let text = String::from_utf8_lossy(&out.stdout);
    assert_eq!(out.status.code(), Some(1), "{text}");
    assert!(text.contains("undersized-coil"), "{text}");
    // The newly failing unit comes first, with its required tons then and now.
    let callout = text
        .lines()
        .find(|l| l.contains("passed at the baseline and fails now"))
        .unwrap_or_else(|| panic!("{text}"));
    assert!(
        callout.contains("`east` (design/units.plenum)"),
        "{callout}"
    );
    let then = tons_after(callout, "required ");
    let now = tons_after(callout, " then, ");
    assert!(then < 3.0 && now > 3.0, "{then} → {now}: {callout}");
    assert!(callout.contains("rated 3.00 ton"), "{callout}");
    // The table has every unit; `west` is unchanged.
    let west = text
        .lines()
        .find(|l| l.starts_with("west "))
        .unwrap_or_else(|| panic!("{text}"));
    assert!(west.contains("+0.00 ton") && west.contains("ok"), "{west}");
    let east_row = text.lines().find(|l| l.starts_with("east ")).unwrap();
    assert!(east_row.contains("undersized (was ok)"), "{east_row}");

    // The same figures in JSON.
    let out = plenum(
        &["check", "--baseline", "HEAD~1", "--format", "json"],
        d,
        &[],
    );
    assert_eq!(out.status.code(), Some(1));
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let units = v["baseline"]["units"].as_array().unwrap();
    assert_eq!(units.len(), 2);
    assert_eq!(units[0]["unit"], "east");
    assert_eq!(units[0]["newly_failing"], true);
    assert_eq!(units[0]["status_then"], "ok");
    assert_eq!(units[0]["status_now"], "undersized");
    let t = units[0]["required_tons_then"].as_f64().unwrap();
    let n = units[0]["required_tons_now"].as_f64().unwrap();
    assert!((t - then).abs() < 0.006 && (n - now).abs() < 0.006);
    assert_eq!(units[1]["newly_failing"], false);

    // Against the same revision nothing is newly failing.
    let out = plenum(&["check", "--baseline", "HEAD", "--format", "json"], d, &[]);
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert!(
        v["baseline"]["units"]
            .as_array()
            .unwrap()
            .iter()
            .all(|u| u["newly_failing"] == false)
    );
}

#[test]
fn the_baseline_is_read_from_git_not_from_the_working_tree() {
    let dir = repo();
    let d = dir.path();
    // An uncommitted edit that breaks the shared site file: the baseline
    // still reads the committed one, and the working tree shows the error.
    write(
        d,
        "design/shared/site.plenum",
        "site {\n  cooling 95 °F db\n}\n",
    );
    let out = plenum(
        &["check", "--baseline", "HEAD", "--format", "json", "design"],
        d,
        &[],
    );
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let units = v["baseline"]["units"].as_array().unwrap();
    let east = units.iter().find(|u| u["unit"] == "east").unwrap();
    assert!(east["required_tons_then"].as_f64().unwrap() > 3.0);
    assert_eq!(east["status_then"], "undersized");
    // From a subfolder, with the path given relative to it.
    let out = plenum(
        &["check", "--baseline", "HEAD~1", "--format", "json", "."],
        &d.join("design"),
        &[],
    );
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let units = v["baseline"]["units"].as_array().unwrap();
    assert_eq!(units.len(), 2, "{v:#}");
    assert!(units.iter().all(|u| u["file"] == "design/units.plenum"));
    // The working tree is untouched.
    let site = std::fs::read_to_string(d.join("design/shared/site.plenum")).unwrap();
    assert_eq!(site, "site {\n  cooling 95 °F db\n}\n");
}

#[test]
fn markdown_and_github_formats_carry_the_comparison() {
    let dir = repo();
    let d = dir.path();
    let out = plenum(
        &["check", "--baseline", "HEAD~1", "--format", "markdown"],
        d,
        &[],
    );
    assert_eq!(out.status.code(), Some(1));
    let md = String::from_utf8_lossy(&out.stdout);
    assert!(md.contains("### Coil capacity against `HEAD~1`"), "{md}");
    assert!(md.contains("**Newly failing:**"), "{md}");
    assert!(md.contains("| **east** | design/units.plenum |"), "{md}");
    assert!(md.contains("| **undersized (was ok)** |"), "{md}");
    assert!(
        md.trim_end().ends_with("where the building stands govern."),
        "{md}"
    );

    // GitHub: annotations on stdout, the table in the job summary file.
    let summary = d.join("summary.md");
    let out = plenum(
        &[
            "check",
            "--baseline",
            "HEAD~1",
            "--format",
            "github",
            "design",
        ],
        d,
        &[("GITHUB_STEP_SUMMARY", &summary)],
    );
    assert_eq!(out.status.code(), Some(1));
    let annotations = String::from_utf8_lossy(&out.stdout);
    assert!(
        annotations
            .lines()
            .any(|l| l.starts_with("::error file=design/units.plenum,")
                && l.contains("undersized-coil")),
        "{annotations}"
    );
    let written = std::fs::read_to_string(&summary).unwrap();
    assert!(written.contains("| **east** |"), "{written}");
    // Without the variable, the table goes to stderr.
    let out = plenum(
        &["check", "--baseline", "HEAD~1", "--format", "github"],
        d,
        &[],
    );
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.contains("passed at the baseline and fails now"),
        "{err}"
    );
}

#[test]
fn a_bad_revision_or_no_repository_is_a_usage_error() {
    let dir = repo();
    let out = plenum(&["check", "--baseline", "no-such-rev"], dir.path(), &[]);
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("`no-such-rev` is not a revision"), "{err}");
    let plain = tempfile::tempdir().unwrap();
    write(plain.path(), "a.plenum", SITE);
    let out = plenum(&["check", "--baseline", "HEAD"], plain.path(), &[]);
    assert_eq!(out.status.code(), Some(2));
}
