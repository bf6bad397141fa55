//! End-to-end tests of `plenum chart`: which files it writes, what is in
//! them, and its exit codes. They need the `chart` subcommand declared in
//! `src/main.rs` (`mod chart;`, `Command::Chart(chart::ChartArgs)` and its
//! dispatch to `chart::run`).

#![allow(clippy::unwrap_used)]

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn example(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("../../examples")
        .join(name)
}

fn plenum_in(dir: &Path, args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_plenum"))
        .current_dir(dir)
        .args(args)
        .env("NO_COLOR", "1")
        .output()
        .unwrap()
}

fn stdout(o: &Output) -> String {
    String::from_utf8(o.stdout.clone()).unwrap()
}

fn stderr(o: &Output) -> String {
    String::from_utf8(o.stderr.clone()).unwrap()
}

/// The file parses as SVG; its `<title>` and text.
fn svg(path: &Path) -> (String, String) {
    let text = std::fs::read_to_string(path).unwrap();
    let doc = roxmltree::Document::parse(&text).unwrap();
    assert_eq!(doc.root_element().tag_name().name(), "svg");
    let title = doc
        .descendants()
        .find(|n| n.has_tag_name("title"))
        .and_then(|n| n.text())
        .unwrap()
        .to_string();
    (title, text)
}

fn svg_files(dir: &Path) -> Vec<String> {
    let mut v: Vec<String> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n.ends_with(".svg"))
        .collect();
    v.sort();
    v
}

#[test]
fn every_air_handler_into_the_current_folder() {
    let dir = tempfile::tempdir().unwrap();
    let lib = example("library.plenum");
    let out = plenum_in(dir.path(), &["chart", lib.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    assert_eq!(stdout(&out), "library-ahu_1.svg\nlibrary-ahu_2.svg\n");
    assert_eq!(
        svg_files(dir.path()),
        ["library-ahu_1.svg", "library-ahu_2.svg"]
    );
    let (title, text) = svg(&dir.path().join("library-ahu_1.svg"));
    assert!(title.contains("ahu_1") && title.contains("Public areas unit"));
    // The design's units (IP): °F and gr/lb, the site's pressure.
    assert!(text.contains("Dry-bulb temperature, °F"));
    assert!(text.contains("gr/lb"));
    assert!(text.contains("14.044 psia"));
    // Designs that `use` other files are read whole.
    let out = plenum_in(
        dir.path(),
        &["chart", example("middle-school.plenum").to_str().unwrap()],
    );
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    assert_eq!(stdout(&out).lines().count(), 3);
}

#[test]
fn one_air_handler_to_a_named_file_in_si() {
    let dir = tempfile::tempdir().unwrap();
    let lib = example("library.plenum");
    let out = plenum_in(
        dir.path(),
        &[
            "chart",
            lib.to_str().unwrap(),
            "--ahu",
            "ahu_2",
            "-o",
            "staff.svg",
            "--units",
            "si",
        ],
    );
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    assert_eq!(svg_files(dir.path()), ["staff.svg"]);
    let (title, text) = svg(&dir.path().join("staff.svg"));
    assert!(title.contains("ahu_2"));
    assert!(text.contains("Dry-bulb temperature, °C"));
    assert!(text.contains("g/kg dry air"));
    assert!(text.contains("kPa"));
    assert!(!text.contains("°F"));
}

#[test]
fn several_with_an_output_name_get_the_unit_appended() {
    let dir = tempfile::tempdir().unwrap();
    let lib = example("library.plenum");
    let out = plenum_in(
        dir.path(),
        &[
            "chart",
            lib.to_str().unwrap(),
            "--ahu",
            "ahu_2",
            "--ahu",
            "ahu_1",
            "--ahu",
            "ahu_2",
            "-o",
            "charts/lib.svg",
        ],
    );
    // The folder does not exist: writing fails, a usage-level error.
    assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
    assert!(stderr(&out).contains("cannot write"));
    std::fs::create_dir(dir.path().join("charts")).unwrap();
    let out = plenum_in(
        dir.path(),
        &[
            "chart",
            lib.to_str().unwrap(),
            "--ahu",
            "ahu_2",
            "--ahu",
            "ahu_1",
            "--ahu",
            "ahu_2",
            "-o",
            "charts/lib.svg",
        ],
    );
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    assert_eq!(stdout(&out), "charts/lib-ahu_2.svg\ncharts/lib-ahu_1.svg\n");
    assert_eq!(
        svg_files(&dir.path().join("charts")),
        ["lib-ahu_1.svg", "lib-ahu_2.svg"]
    );
}

#[test]
fn one_chart_to_stdout() {
    let dir = tempfile::tempdir().unwrap();
    let lib = example("library.plenum");
    let out = plenum_in(
        dir.path(),
        &["chart", lib.to_str().unwrap(), "--ahu", "ahu_1", "-o", "-"],
    );
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    let text = stdout(&out);
    let doc = roxmltree::Document::parse(&text).unwrap();
    assert_eq!(doc.root_element().tag_name().name(), "svg");
    assert!(svg_files(dir.path()).is_empty());
}

#[test]
fn usage_errors_exit_2() {
    let dir = tempfile::tempdir().unwrap();
    let lib = example("library.plenum");
    let lib = lib.to_str().unwrap();
    let out = plenum_in(dir.path(), &["chart", lib, "--ahu", "ahu_9"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(
        stderr(&out).contains("no such air handler; the design has `ahu_1`, `ahu_2`"),
        "{}",
        stderr(&out)
    );
    let out = plenum_in(dir.path(), &["chart", lib, "-o", "-"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(stderr(&out).contains("--ahu NAME"));
    let out = plenum_in(dir.path(), &["chart", "missing.plenum"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(stderr(&out).contains("cannot read `missing.plenum`"));
    let out = plenum_in(dir.path(), &["chart"]);
    assert_eq!(out.status.code(), Some(2));
    let out = plenum_in(dir.path(), &["chart", lib, "--units", "metric"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(svg_files(dir.path()).is_empty());
}

#[test]
fn a_design_with_errors_draws_nothing_and_exits_1() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(
        dir.path().join("bad.plenum"),
        "site { cooling 95 °F db, 75 °F wb }\n\
         zone z { area 1_000 ft; sensible 20 kBtu/h }\n\
         ahu a { serves z }\n",
    )
    .unwrap();
    let out = plenum_in(dir.path(), &["chart", "bad.plenum"]);
    assert_eq!(out.status.code(), Some(1), "{}", stderr(&out));
    let err = stderr(&out);
    assert!(err.contains("bad.plenum:2:"), "{err}");
    assert!(err.contains("plenum check bad.plenum"), "{err}");
    assert!(svg_files(dir.path()).is_empty());
}

#[test]
fn a_unit_that_cannot_be_computed_exits_1_and_the_others_are_drawn() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(
        dir.path().join("two.plenum"),
        "project \"Two units\" { units si }\n\
         site { elevation 300 m; cooling 34 °C db, 24 °C wb }\n\
         zone z { area 100 m²; people 5; use office; sensible 6 kW; latent 0.6 kW }\n\
         zone y { area 100 m²; people 5; use office; sensible 6 kW; latent 0.6 kW }\n\
         ahu a { serves z }\n\
         ahu b { serves y; supply_temp 27 °C }\n",
    )
    .unwrap();
    let out = plenum_in(dir.path(), &["chart", "two.plenum"]);
    assert_eq!(out.status.code(), Some(1), "{}", stderr(&out));
    assert_eq!(stdout(&out), "two-a.svg\n");
    let err = stderr(&out);
    assert!(err.contains("no chart of `b`"), "{err}");
    assert!(err.contains("supply-not-below-room"), "{err}");
    // The design's own units: SI.
    let (_, text) = svg(&dir.path().join("two-a.svg"));
    assert!(text.contains("°C") && text.contains("Two units"));
    // Asking only for the good one succeeds.
    let out = plenum_in(dir.path(), &["chart", "two.plenum", "--ahu", "a"]);
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
}
