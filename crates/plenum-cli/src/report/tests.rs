//! Unit tests of the report: which units are left out and why, which files
//! are designs, the unit system, and the layout of each format.

use std::path::PathBuf;

use plenum_engine::CapacityStatus;
use plenum_model::MemoryFs;

use super::doc::{Align, Block, Col, Table};
use super::*;

/// Two zones, each on its own unit; `two` is rated well below its load.
const BASE: &str = "\
site {
  cooling 95 °F db, 75 °F wb
}

let lights = 2 kBtu/h

zone a {
  area     1_000 ft²
  people   5
  use      office
  sensible 20 kBtu/h + lights
  latent   2 kBtu/h
}

zone b {
  area     800 ft²
  people   4
  use      office
  sensible 14 kBtu/h
  latent   1.5 kBtu/h
}

zone c like b {
}

ahu one {
  serves a
  coil { rated 3 ton }
}

ahu two {
  serves b
  coil { rated 1 ton }
}

ahu three {
  serves c
}
";

fn report_of(text: &str) -> Report {
    let mut fs = MemoryFs::new();
    fs.insert("d.plenum", text);
    build(&fs, &[PathBuf::from("d.plenum")], None).0
}

/// The names of the computed and of the left-out units.
fn split(r: &Report) -> (Vec<String>, Vec<String>) {
    let d = &r.designs[0];
    (
        d.computed().map(|(a, _)| a.name.clone()).collect(),
        d.left_out().map(|a| a.name.clone()).collect(),
    )
}

fn names(v: &[&str]) -> Vec<String> {
    v.iter().map(|s| s.to_string()).collect()
}

#[test]
fn the_base_design_computes_every_unit() {
    let r = report_of(BASE);
    assert_eq!(split(&r), (names(&["one", "two", "three"]), vec![]));
    assert!(r.designs[0].diagnostics.is_empty());
    assert!(!r.incomplete());
}

#[test]
fn findings_never_leave_a_unit_out() {
    let r = report_of(BASE);
    let d = &r.designs[0];
    let (two, result) = d
        .computed()
        .find(|(a, _)| a.name == "two")
        .unwrap_or_else(|| panic!("two is computed"));
    assert_eq!(result.status(), CapacityStatus::Undersized);
    assert!(two.findings.iter().any(|f| f.code == "undersized-coil"));
    let (_, three) = d
        .computed()
        .find(|(a, _)| a.name == "three")
        .unwrap_or_else(|| panic!("three is computed"));
    assert_eq!(three.status(), CapacityStatus::Unrated);
}

#[test]
fn an_error_in_one_unit_leaves_only_that_unit_out() {
    let text = BASE.replace("  serves b\n", "  serves b\n  supply_temp 55 cfm\n");
    let r = report_of(&text);
    assert_eq!(split(&r), (names(&["one", "three"]), names(&["two"])));
    let two = r.designs[0]
        .left_out()
        .next()
        .unwrap_or_else(|| panic!("two is left out"));
    assert_eq!(two.reasons.len(), 1);
    assert_eq!(two.reasons[0].code, "unit-mismatch");
    assert_eq!(two.reasons[0].pos.line, 33);
    assert!(r.incomplete());
}

#[test]
fn an_error_in_a_zone_leaves_out_its_unit_and_the_units_of_zones_like_it() {
    let text = BASE.replace("area     800 ft²", "area     800 ft");
    let r = report_of(&text);
    assert_eq!(split(&r), (names(&["one"]), names(&["two", "three"])));
    for a in r.designs[0].left_out() {
        assert_eq!(a.reasons[0].pos.line, 16, "{}", a.name);
    }
    // The zone table says why the zones have no figures.
    let b = &r.designs[0].zones[1];
    assert!(b.flow.is_none());
    assert_eq!(b.note.as_deref(), Some("`two` left out"));
}

#[test]
fn an_error_in_a_let_leaves_out_the_units_that_use_it() {
    let text = BASE.replace("let lights = 2 kBtu/h", "let lights = 2 kBtu/h + 3 ft");
    let r = report_of(&text);
    assert_eq!(split(&r), (names(&["two", "three"]), names(&["one"])));
}

#[test]
fn an_error_in_the_site_leaves_every_unit_out() {
    let text = BASE.replace("75 °F wb", "75 cfm wb");
    let r = report_of(&text);
    assert_eq!(split(&r), (vec![], names(&["one", "two", "three"])));
}

#[test]
fn a_syntax_error_leaves_every_unit_out_and_says_where() {
    let text = BASE.replace("latent   1.5 kBtu/h", "latent   1.5 kBtu/h )");
    let r = report_of(&text);
    assert_eq!(split(&r), (vec![], names(&["one", "two", "three"])));
    let d = &r.designs[0];
    assert!(
        d.diagnostics
            .iter()
            .any(|x| x.code == "syntax-error" && x.pos.line == 20)
    );
    for a in d.left_out() {
        assert!(
            a.reasons.iter().any(|x| x.code == "syntax-error"),
            "{}",
            a.name
        );
    }
}

#[test]
fn an_error_in_the_project_block_leaves_no_unit_out() {
    let text = format!("project \"P\" {{\n  units metric\n}}\n{BASE}");
    let r = report_of(&text);
    assert_eq!(split(&r).1, Vec::<String>::new());
    assert!(!r.designs[0].diagnostics.is_empty());
    assert!(r.incomplete());
}

#[test]
fn an_engine_error_names_its_cause() {
    let text = BASE.replace("  serves b\n", "  serves b\n  supply_temp 80 °F\n");
    let r = report_of(&text);
    assert_eq!(split(&r).1, names(&["two"]));
    let d = &r.designs[0];
    let two = d.left_out().next().unwrap_or_else(|| panic!("left out"));
    assert_eq!(two.reasons[0].code, "supply-not-below-room");
    assert!(
        two.reasons[0].message.contains("80.0 °F"),
        "{}",
        two.reasons[0].message
    );
    assert!(
        d.diagnostics
            .iter()
            .any(|x| x.code == "supply-not-below-room")
    );
}

#[test]
fn a_file_another_uses_is_not_a_design_of_its_own() {
    let mut fs = MemoryFs::new();
    fs.insert("p/site.plenum", "site {\n  cooling 95 °F db, 75 °F wb\n}\n");
    fs.insert(
        "p/main.plenum",
        "use \"site.plenum\"\nzone a { sensible 10 kBtu/h }\nahu x { serves a }\n",
    );
    let (r, unreadable) = build(
        &fs,
        &[
            PathBuf::from("p/main.plenum"),
            PathBuf::from("p/site.plenum"),
        ],
        None,
    );
    assert!(unreadable.is_empty());
    assert_eq!(r.designs.len(), 1);
    assert_eq!(r.designs[0].file, "p/main.plenum");
    assert_eq!(r.designs[0].computed().count(), 1);
    // Files that use each other in a circle: the first is the design, and the
    // cycle is a diagnostic that leaves its unit out.
    let mut fs = MemoryFs::new();
    fs.insert("q/a.plenum", "use \"b.plenum\"\nsite { cooling 95 °F db, 75 °F wb }\nzone z { sensible 1 kBtu/h }\nahu u { serves z }\n");
    fs.insert("q/b.plenum", "use \"a.plenum\"\n");
    let (r, _) = build(
        &fs,
        &[PathBuf::from("q/a.plenum"), PathBuf::from("q/b.plenum")],
        None,
    );
    assert_eq!(r.designs.len(), 1);
    assert!(
        r.designs[0]
            .diagnostics
            .iter()
            .any(|x| x.code == "use-cycle")
    );
    assert_eq!(r.designs[0].left_out().count(), 1);
}

#[test]
fn a_file_that_cannot_be_read_is_named() {
    let mut fs = MemoryFs::new();
    fs.insert("d.plenum", BASE);
    fs.insert("bad.plenum", b"zone a { sensible 1 kBtu/h }\xff\n".to_vec());
    let (r, unreadable) = build(
        &fs,
        &[
            PathBuf::from("d.plenum"),
            PathBuf::from("bad.plenum"),
            PathBuf::from("missing.plenum"),
        ],
        None,
    );
    assert_eq!(r.designs.len(), 1);
    assert_eq!(unreadable.len(), 2, "{unreadable:?}");
    assert!(
        unreadable
            .iter()
            .any(|m| m.contains("bad.plenum") && m.contains("UTF-8"))
    );
    assert!(unreadable.iter().any(|m| m.contains("missing.plenum")));
}

#[test]
fn every_format_ends_with_the_caution() {
    let r = report_of(BASE);
    for f in [
        ReportFormat::Text,
        ReportFormat::Markdown,
        ReportFormat::Csv,
        ReportFormat::Json,
    ] {
        let out = render(&r, f).unwrap_or_else(|e| panic!("{e}"));
        let tail: String = out
            .chars()
            .rev()
            .take(700)
            .collect::<Vec<_>>()
            .into_iter()
            .rev()
            .collect();
        assert!(
            tail.contains("qualified engineer") && tail.contains("take precedence"),
            "{f:?}: {tail}"
        );
    }
}

fn table() -> Table {
    Table {
        cols: vec![
            Col {
                name: "AHU".into(),
                unit: String::new(),
                align: Align::Left,
            },
            Col {
                name: "Supply".into(),
                unit: "cfm".into(),
                align: Align::Right,
            },
            Col {
                name: "Note".into(),
                unit: String::new(),
                align: Align::Left,
            },
        ],
        rows: vec![
            vec!["ahu_1".into(), "12,345".into(), "a | b".into()],
            vec!["a".into(), "5".into(), String::new()],
        ],
    }
}

#[test]
fn text_tables_align_numbers_right_and_words_left() {
    let out = doc::text(&[Block::Table(table())]);
    assert_eq!(
        out,
        "AHU    Supply  Note\n          cfm\n-----  ------  -----\nahu_1  12,345  a | b\na           5\n"
    );
}

#[test]
fn markdown_tables_escape_pipes_and_carry_units_in_the_header() {
    let out = doc::markdown(&[Block::Table(table())]);
    assert_eq!(
        out,
        "| AHU | Supply (cfm) | Note |\n| :--- | ---: | :--- |\n| ahu_1 | 12,345 | a \\| b |\n| a | 5 |  |\n"
    );
}

#[test]
fn csv_quotes_cells_with_commas_and_quotes() {
    let r = report_of(&BASE.replace("zone a {", "zone a \"Open office, \\\"north\\\"\" {"));
    let out = render(&r, ReportFormat::Csv).unwrap_or_else(|e| panic!("{e}"));
    assert!(out.contains(",\"Open office, \"\"north\"\"\","), "{out}");
    // One header row per section; sections are separated by an empty line.
    let sections: Vec<&str> = out.split("\r\n\r\n").collect();
    assert_eq!(sections.len(), 6);
    for (s, name) in sections.iter().zip([
        "schedule",
        "zone",
        "assumption",
        "finding",
        "diagnostic",
        "caution",
    ]) {
        let mut lines = s.lines();
        assert!(lines.next().is_some_and(|h| h.starts_with("table,")));
        assert!(
            lines.all(|l| l.starts_with(&format!("{name},"))),
            "{name}: {s}"
        );
    }
}

#[test]
fn json_is_one_document_with_the_interface_keys() {
    let r = report_of(BASE);
    let out = render(&r, ReportFormat::Json).unwrap_or_else(|e| panic!("{e}"));
    let v: serde_json::Value = serde_json::from_str(&out).unwrap_or_else(|e| panic!("{e}"));
    assert_eq!(v["schema"], SCHEMA);
    assert_eq!(v["units"], "ip");
    let a = &v["air_handlers"][2];
    assert_eq!(a["name"], "three");
    assert!(a["margin"].is_null());
    assert!(a["rated_tons"].is_null());
    assert_eq!(a["status"], "unrated");
    assert!(a["cases"]["dehumid"].is_null());
    assert!(a["assumptions"].as_array().is_some_and(|x| {
        x.iter().any(|e| {
            e["key"] == "supply_duct"
                && e["value"] == "3.0 °F rise"
                && e["source"] == "common practice"
        })
    }));
}
