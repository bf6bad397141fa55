//! Feature tests through the `Analysis` façade: fixtures with a `$0` cursor
//! (see `plenum_ide::fixture`), one `check` helper per feature, expected
//! output written inline with `expect_test` (`UPDATE_EXPECT=1` rewrites it).
#![allow(clippy::unwrap_used)]

mod actions;
mod completion;
mod diagnostics;
mod hover;
mod inlay;
mod navigation;
mod outline;

use plenum_ide::fixture::Fixture;
use plenum_ide::{Analysis, SourceChange};

/// The analysis of a fixture, and the fixture.
pub fn analyse(text: &str) -> (Analysis, Fixture) {
    let fx = Fixture::parse(text);
    let mut host = fx.host();
    (host.analysis(), fx)
}

/// The examples of the repository, as a fixture-like set of files.
pub fn example(name: &str) -> String {
    let root = concat!(env!("CARGO_MANIFEST_DIR"), "/../../examples/");
    std::fs::read_to_string(format!("{root}{name}")).unwrap()
}

/// A source change shown as each file's edited text.
pub fn show_change(fx: &Fixture, change: &SourceChange) -> String {
    let mut out = String::new();
    for (path, edits) in &change.edits {
        let text = fx.text(path).unwrap();
        out.push_str(&format!("//- {}\n", path.display()));
        out.push_str(&plenum_ide::apply_edits(text, edits).unwrap());
    }
    out
}

/// A small design used by several tests: one air handler serving two zones.
pub const OFFICE: &str = r#"
project "Test offices" {
  units ip
}

site {
  elevation 0 ft
  cooling   95 °F db, 75 °F wb
}

zone east "East offices" {
  area     1_000 ft²
  people   5
  use      office
  sensible 20 kBtu/h
  latent   2 kBtu/h
}

zone west like east {
  sensible 16 kBtu/h
}

ahu rtu_1 "Roof unit" {
  serves      east, west
  supply_temp 55 °F
  coil {
    rated 10 ton
  }
}
"#;
