//! End-to-end tests of `plenum air` against psychrolib.
//!
//! Reference values from PsychroLib 2.5.0 (PyPI), computed with:
//!   IP: p = GetStandardAtmPressure(1250); W = GetHumRatioFromTWetBulb(94, 75, p); then
//!       GetTDewPointFromHumRatio, GetRelHumFromHumRatio, GetMoistAirEnthalpy,
//!       GetMoistAirVolume, GetMoistAirDensity at (94 °F, W, p).
//!   SI: at 101325 Pa, 24 °C and W = 0.0093 kg/kg: GetTWetBulbFromHumRatio,
//!       GetTDewPointFromHumRatio, GetRelHumFromHumRatio, GetMoistAirEnthalpy (J/kg),
//!       GetMoistAirVolume, GetMoistAirDensity.
//! Tolerances are the issue's: 0.05 % relative on W, h and v; 0.02 °F on wet bulb and
//! dew point (0.011 K in SI).

#![allow(clippy::unwrap_used)]

use std::process::{Command, Output};

fn plenum(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_plenum"))
        .args(args)
        .env("NO_COLOR", "1")
        .output()
        .unwrap()
}

fn json(out: &Output) -> serde_json::Value {
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&out.stdout).unwrap()
}

fn rel(a: f64, b: f64) -> f64 {
    ((a - b) / b).abs()
}

#[test]
fn ip_state_at_elevation_matches_psychrolib() {
    for elevation in ["1250 ft", "1250ft"] {
        let v = json(&plenum(&[
            "air",
            "94 °F db, 75 °F wb",
            "--elevation",
            elevation,
            "--format",
            "json",
        ]));
        let f = |k: &str| v[k].as_f64().unwrap_or_else(|| panic!("missing {k}"));
        assert!(rel(f("pressure_psia"), 14.044201509445424) < 1e-9);
        assert!((f("tdb_f") - 94.0).abs() < 1e-9);
        assert!((f("twb_f") - 75.0).abs() < 0.02);
        assert!((f("tdp_f") - 67.61859752936539).abs() < 0.02);
        assert!((f("rh_pct") - 42.29807308294929).abs() < 0.05);
        assert!(rel(f("w_lb_lb"), 0.015188075995153516) < 5e-4);
        assert!(rel(f("w_gr_lb"), 106.3165319660746) < 5e-4);
        assert!(rel(f("h_btu_lb"), 39.30843817059161) < 5e-4);
        assert!(rel(f("v_ft3_lb"), 14.962495569452024) < 5e-4);
        assert!(rel(f("rho_lb_ft3"), 0.06784884722491069) < 5e-4);
    }
}

#[test]
fn si_state_matches_psychrolib() {
    let v = json(&plenum(&[
        "air",
        "24 °C, 0.0093 kg/kg",
        "--units",
        "si",
        "--format",
        "json",
    ]));
    let f = |k: &str| v[k].as_f64().unwrap_or_else(|| panic!("missing {k}"));
    assert!((f("tdb_c") - 24.0).abs() < 1e-9);
    assert!((f("twb_c") - 17.069048134760806).abs() < 0.011);
    assert!((f("tdp_c") - 12.948789318273674).abs() < 0.011);
    assert!((f("rh_pct") - 50.00791956240662).abs() < 0.05);
    assert!(rel(f("w_kg_kg"), 0.0093) < 1e-9);
    assert!(rel(f("w_g_kg"), 9.3) < 1e-9);
    assert!(rel(f("h_kj_kg"), 47.81845199999999) < 5e-4);
    assert!(rel(f("v_m3_kg"), 0.854378940873048) < 5e-4);
    assert!(rel(f("rho_kg_m3"), 1.181325933629223) < 5e-4);
    assert!(rel(f("pressure_kpa"), 101.325) < 1e-9);
}

#[test]
fn every_json_key_is_present_in_both_systems() {
    let ip = json(&plenum(&["air", "75 °F, 50 %rh", "--format", "json"]));
    for k in [
        "tdb_f",
        "twb_f",
        "tdp_f",
        "rh_pct",
        "w_lb_lb",
        "w_gr_lb",
        "h_btu_lb",
        "v_ft3_lb",
        "rho_lb_ft3",
        "pressure_psia",
    ] {
        assert!(ip[k].is_number(), "{k}");
    }
    let si = json(&plenum(&[
        "air",
        "55 °F dp, 80 °F db",
        "--pressure",
        "12.2 psia",
        "--units",
        "si",
        "--format",
        "json",
    ]));
    for k in [
        "tdb_c",
        "twb_c",
        "tdp_c",
        "rh_pct",
        "w_kg_kg",
        "w_g_kg",
        "h_kj_kg",
        "v_m3_kg",
        "rho_kg_m3",
        "pressure_kpa",
    ] {
        assert!(si[k].is_number(), "{k}");
    }
    assert!((si["pressure_kpa"].as_f64().unwrap() - 12.2 * 6.894757).abs() < 1e-3);
}

#[test]
fn the_text_table_names_every_property() {
    let out = plenum(&["air", "94 °F db, 75 °F wb", "--elevation", "381 m"]);
    assert_eq!(out.status.code(), Some(0));
    let text = String::from_utf8_lossy(&out.stdout);
    for word in [
        "dry bulb",
        "wet bulb",
        "dew point",
        "relative humidity",
        "humidity ratio",
        "gr/lb",
        "enthalpy",
        "specific volume",
        "density",
        "psia",
    ] {
        assert!(text.contains(word), "{word} missing from\n{text}");
    }
}

#[test]
fn impossible_states_and_bad_options_are_clear_errors() {
    let out = plenum(&["air", "70 °F db, 75 °F wb"]);
    assert_eq!(out.status.code(), Some(1));
    assert!(String::from_utf8_lossy(&out.stderr).contains("above the dry bulb"));
    let out = plenum(&["air", "75 °F, 120 %rh"]);
    assert_eq!(out.status.code(), Some(1));
    let out = plenum(&["air", "94 °F db, 75 °F wb", "--elevation", "1250"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("unit"));
    let out = plenum(&["air", "94 °F db, 75 °F wb", "--elevation", "3 psia"]);
    assert_eq!(out.status.code(), Some(2));
    let out = plenum(&[
        "air",
        "94 °F db, 75 °F wb",
        "--elevation",
        "1 ft",
        "--pressure",
        "14 psia",
    ]);
    assert_eq!(out.status.code(), Some(2));
    // A temperature beyond the correlations is a typed error, not NaN.
    let out = plenum(&["air", "900 °F, 50 %rh", "--format", "json"]);
    assert_eq!(out.status.code(), Some(1));
    assert!(!String::from_utf8_lossy(&out.stdout).contains("NaN"));
}
