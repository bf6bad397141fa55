//! The registry's promises: every code documented in five parts, every
//! example reporting its own code, every syntax, model and engine kind
//! mapped to a registered code.

#![allow(clippy::unwrap_used)]

use std::path::{Path, PathBuf};

use plenum_checks::{CHECKS, check_files, lookup};
use plenum_model::MemoryFs;

/// The files of an example: `# file: NAME` starts the next one. U+FFFD
/// stands for the byte E9 (a Latin-1 `é`), so that `invalid-utf8` has an
/// example too.
fn example_files(example: &str) -> Vec<(String, Vec<u8>)> {
    let mut files = vec![("design.plenum".to_string(), String::new())];
    for line in example.lines() {
        if let Some(name) = line.strip_prefix("# file: ") {
            files.push((name.trim().to_string(), String::new()));
        } else {
            let last = files.last_mut().unwrap();
            last.1.push_str(line);
            last.1.push('\n');
        }
    }
    files
        .into_iter()
        .map(|(n, t)| {
            let mut bytes = Vec::new();
            for c in t.chars() {
                if c == '\u{FFFD}' {
                    bytes.push(0xE9);
                } else {
                    let mut buf = [0u8; 4];
                    bytes.extend_from_slice(c.encode_utf8(&mut buf).as_bytes());
                }
            }
            (n, bytes)
        })
        .collect()
}

#[test]
fn every_check_has_all_five_parts_of_its_documentation() {
    assert!(CHECKS.len() >= 50, "{} checks", CHECKS.len());
    for c in CHECKS {
        let d = c.doc;
        for (part, text) in [
            ("summary", c.summary),
            ("what it checks", d.what),
            ("why it matters", d.why),
            ("example", d.example),
            ("how to fix it", d.fix),
            ("source", d.source),
        ] {
            assert!(
                text.trim().len() >= 10,
                "{}: the {part} is missing or too short",
                c.code
            );
        }
        assert!(!c.summary.contains('\n'), "{}: one-line summary", c.code);
        let explained = c.explain();
        for heading in [
            "## What it checks",
            "## Why it matters",
            "## Example",
            "## How to fix it",
            "## Source",
        ] {
            assert!(explained.contains(heading), "{}", c.code);
        }
    }
}

#[test]
fn every_example_reports_its_own_code() {
    let mut failures = Vec::new();
    for c in CHECKS {
        let mut fs = MemoryFs::new();
        let mut given = Vec::new();
        for (name, bytes) in example_files(c.doc.example) {
            let path = PathBuf::from("/ex").join(&name);
            if name.ends_with(".plenum") {
                given.push(path.clone());
            }
            fs.insert(&path, bytes);
        }
        let project = check_files(&fs, &given);
        let codes: Vec<&str> = project.diagnostics().map(|(_, d)| d.code).collect();
        for code in &codes {
            assert!(lookup(code).is_some(), "unregistered code {code}");
        }
        if !codes.contains(&c.code) {
            let all: Vec<String> = project
                .diagnostics()
                .map(|(_, d)| format!("{}: {}", d.code, d.message))
                .collect();
            failures.push(format!("{}: reported {all:#?}", c.code));
        }
    }
    assert!(failures.is_empty(), "\n{}", failures.join("\n"));
}

#[test]
fn every_syntax_and_model_kind_has_a_registered_code() {
    for k in plenum_syntax::SyntaxErrorKind::ALL {
        let c = lookup(k.code()).unwrap_or_else(|| panic!("{k:?}"));
        assert_eq!(c.severity, plenum_checks::Severity::Error);
    }
    for m in plenum_model::ModelCode::ALL {
        let c = lookup(m.code()).unwrap_or_else(|| panic!("{m:?}"));
        let sev = match m.default_severity() {
            plenum_model::Severity::Error => plenum_checks::Severity::Error,
            plenum_model::Severity::Warning => plenum_checks::Severity::Warning,
            plenum_model::Severity::Info => plenum_checks::Severity::Info,
        };
        assert_eq!(c.severity, sev, "{}", m.code());
    }
    let _ = Path::new("");
}

/// The suppression example of `grammar/README.md` is valid: two
/// suppressions, each above its block, with reasons.
#[test]
fn the_documented_suppression_example_is_valid() {
    let doc = std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("../../grammar/README.md"),
    )
    .unwrap();
    let section = doc.split("## Suppressions").nth(1).unwrap();
    let block = section
        .split("```plenum\n")
        .nth(1)
        .unwrap()
        .split("```")
        .next()
        .unwrap();
    let parse = plenum_syntax::parse(block);
    assert!(parse.errors.is_empty());
    let (s, d) = plenum_checks::suppress::suppressions(Path::new("x.plenum"), block, &parse);
    assert!(d.is_empty(), "{d:#?}");
    assert_eq!(s.len(), 2);
    assert!(block[s[0].block.range()].starts_with("ahu ahu_3"));
    assert!(block[s[1].block.range()].starts_with("coil {"));
    assert_eq!(s[1].codes.len(), 2);
}

/// The codes other tools rely on, with their severities.
#[test]
fn the_fixed_codes_are_registered_with_their_severities() {
    use plenum_checks::Severity::*;
    for (code, severity) in [
        ("undersized-coil", Error),
        ("oversized-coil", Warning),
        ("ventilation-shortfall", Error),
        ("unit-mismatch", Error),
        ("unknown-unit", Error),
        ("missing-unit", Error),
        ("unknown-name", Error),
        ("duplicate-name", Error),
        ("room-humidity", Warning),
        ("assumption", Info),
        ("unused-suppression", Warning),
        ("suppression-without-reason", Error),
    ] {
        let c = lookup(code).unwrap_or_else(|| panic!("{code} is not registered"));
        assert_eq!(c.severity, severity, "{code}");
    }
}

/// Every engine error and finding kind maps to a registered code (the
/// mapping is an exhaustive match; this checks its targets).
#[test]
fn every_engine_kind_maps_to_a_registered_code() {
    use plenum_engine::{
        Allowed, DesignCase, EngineError as E, FindingKind as F, Iteration, Point,
    };
    use plenum_model::{FileId, Loc, ZoneId};
    let loc = Loc {
        file: FileId(0),
        span: Default::default(),
    };
    let z = ZoneId(0);
    let c = DesignCase::Cooling;
    let errors = [
        E::NoSite { loc },
        E::SiteUnusable { loc },
        E::ZoneUnusable { zone: z, loc },
        E::MissingInput {
            key: "sensible",
            loc,
            zone: Some(z),
        },
        E::InvalidInput {
            key: "sensible",
            value: 0.0,
            allowed: Allowed::Positive,
            loc,
        },
        E::InputNotFinite {
            key: "sensible",
            loc,
        },
        E::ConflictingInputs {
            first: "rise",
            second: "power",
            loc,
        },
        E::UnknownZone { loc },
        E::ZoneServedTwice { zone: z, loc },
        E::UnknownCategory {
            zone: z,
            written: "x".into(),
            loc,
        },
        E::SupplyNotBelowRoom {
            zone: z,
            supply_f: 80.0,
            room_f: 75.0,
            loc,
        },
        E::OutdoorAirExceedsSupply {
            case: c,
            fraction: 2.0,
            outdoor_cfm: 2.0,
            supply_cfm: 1.0,
            loc,
        },
        E::NoSteadyState { case: c, loc },
        E::CoilNotCooling {
            case: c,
            entering_f: 50.0,
            leaving_f: 50.0,
            total_btuh: 0.0,
            loc,
        },
        E::NoConvergence {
            iteration: Iteration::Airflow,
            passes: 1,
            case: None,
            loc,
        },
        E::NoApparatusDewPoint { case: c, loc },
        E::Psychro {
            point: Point::Mixed,
            case: Some(c),
            error: plenum_psychro::PsychroError::RelativeHumidityOutOfRange { value: 2.0 },
            loc,
        },
        E::NotFinite {
            field: "coil.total_btuh",
            loc,
        },
    ];
    for e in &errors {
        let code = plenum_checks::error_code(e);
        assert!(lookup(code).is_some(), "{e:?} → {code}");
    }
    let findings = [
        F::UnknownCategory {
            zone: z,
            written: "x".into(),
        },
        F::AreaMissingForVentilation {
            zone: z,
            category: "office",
        },
        F::ElevationIgnored {
            elevation_ft: 1.0,
            pressure_psia: 14.0,
        },
        F::MotorEfficiencyIgnored {
            motor_efficiency: 0.9,
        },
        F::VentilationShortfall {
            provided_cfm: 1.0,
            required_cfm: 2.0,
        },
        F::RoomAboveDesignHumidity {
            zone: z,
            room_w_lb_lb: 0.011,
            design_w_lb_lb: 0.01,
            room_rh_pct: 55.0,
            design_rh_pct: 50.0,
        },
        F::RoomRhAboveLimit {
            zone: z,
            room_rh_pct: 70.0,
            limit_pct: 65.0,
        },
        F::RoomRhOutsideComfort {
            zone: z,
            room_rh_pct: 30.0,
            low_pct: 40.0,
            high_pct: 60.0,
        },
        F::LeavingRhLow {
            leaving_rh_pct: 70.0,
            min_pct: 85.0,
        },
        F::SupplyDtOutOfRange {
            zone: z,
            dt_f: 5.0,
            min_f: 10.0,
            max_f: 25.0,
        },
        F::CfmPerTonOutOfRange {
            cfm_per_ton: 200.0,
            min: 300.0,
            max: 500.0,
        },
        F::FaceVelocityHigh {
            face_velocity_fpm: 600.0,
            limit_fpm: 500.0,
        },
        F::CoilCannotDehumidify {
            zone: ZoneId(0),
            leaving_dp_f: 55.0,
            leaving_w_lb_lb: 0.0092,
            design_w_lb_lb: 0.0090,
            design_rh_pct: 50.0,
        },
        F::DryCoil {
            leaving_rh_pct: 60.0,
        },
        F::Undersized {
            rated_btuh: Some(1.0),
            required_btuh: 2.0,
            rated_sensible_btuh: None,
            required_sensible_btuh: 1.0,
        },
        F::Oversized {
            rated_btuh: 2.0,
            required_btuh: 1.0,
            margin: 1.0,
        },
    ];
    for f in &findings {
        let code = plenum_checks::finding_code(f);
        assert!(lookup(code).is_some(), "{f:?} → {code}");
    }
    assert!(lookup(plenum_checks::ASSUMPTION).is_some());
}
