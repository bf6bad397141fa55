//! The engine against the independent Python reference
//! (`tests/reference/coil/`, psychrolib 2.5.0, written from methods.md only):
//! every design file in `designs/` is lowered by `plenum_model::lower_text`
//! and evaluated, and every headline number of every air handler and design
//! state is compared with `expected/<case>.json` — 0.5 % on flows and loads,
//! 0.2 °F on states (the tolerances). `clinic_si.plenum` is written
//! entirely in SI; its expected figures are IP.

mod common;

use plenum_engine::{AssumedValue, Source, evaluate};
use plenum_model::{Severity, lower_text};

use common::{Worst, case_names, num, read_json, reference_dir};

#[test]
fn every_reference_design_file() {
    let dir = reference_dir();
    let names = case_names();
    assert!(names.len() >= 9, "reference cases found: {names:?}");
    let mut worst = Worst::default();
    for name in &names {
        let path = dir.join("designs").join(format!("{name}.plenum"));
        let text =
            std::fs::read_to_string(&path).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
        let (design, diags) = lower_text(&text);
        let errors: Vec<_> = diags
            .iter()
            .filter(|d| d.severity == Severity::Error)
            .collect();
        assert!(errors.is_empty(), "{name}: model errors {errors:?}");
        let exp = read_json(&dir.join("expected").join(format!("{name}.json")))
            .unwrap_or_else(|e| panic!("{e}"));
        let eval = evaluate(&design);
        match &eval.site {
            Ok(s) => worst.rel(
                "site pressure_psia",
                name,
                s.pressure_psia,
                num(&exp, "site.pressure_psia").unwrap_or(f64::NAN),
                0.0,
            ),
            Err(e) => panic!("{name}: site {e:?}"),
        }
        let want_ahus = exp["air_handlers"].as_array().cloned().unwrap_or_default();
        assert_eq!(eval.ahus.len(), want_ahus.len(), "{name}");
        for (outcome, want) in eval.ahus.iter().zip(&want_ahus) {
            match &outcome.result {
                Ok(r) => {
                    let zname = |i: usize| {
                        design
                            .zones
                            .get(i)
                            .map(|z| z.name.clone())
                            .unwrap_or_default()
                    };
                    common::compare_ahu(&mut worst, name, r, want, &zname);
                    // The defaults-only case lists one assumption per default,
                    // as the reference does (its `defaults_used`).
                    let n_defaults = want["defaults_used"].as_array().map_or(0, Vec::len);
                    assert!(
                        r.assumptions.len() >= n_defaults,
                        "{name}: {} assumptions, reference {n_defaults}",
                        r.assumptions.len()
                    );
                }
                Err(e) => worst
                    .failures
                    .push(format!("{name}/{}: {e:?}", outcome.name)),
            }
        }
    }
    println!(
        "{} comparisons over {} design files\n{}",
        worst.compared,
        names.len(),
        worst.report()
    );
    assert!(
        worst.failures.is_empty(),
        "{} mismatches:\n{}",
        worst.failures.len(),
        worst.failures.join("\n")
    );
}

/// The defaults-only design lists the defaults of methods.md with their
/// sources (reference: `insurance_office_defaults`, methods.md §3–§4).
#[test]
fn defaults_only_design_reports_each_default() {
    let path = reference_dir().join("designs/insurance_office_defaults.plenum");
    let text = std::fs::read_to_string(&path).unwrap_or_else(|e| panic!("{e}"));
    let (design, _) = lower_text(&text);
    let eval = evaluate(&design);
    let r = match &eval.ahus[0].result {
        Ok(r) => r,
        Err(e) => panic!("{e:?}"),
    };
    let has = |key: &str, source: Source| {
        r.assumptions
            .iter()
            .any(|a| a.key == key && a.source == source)
    };
    assert!(has("elevation", Source::ProjectDefault));
    assert!(has("indoor", Source::CommonPractice));
    assert!(has("supply_temp", Source::CommonPractice));
    assert!(has("supply_duct", Source::CommonPractice));
    assert!(has("return_duct", Source::CommonPractice));
    assert!(has("fan", Source::CommonPractice));
    assert!(has("leaving_rh", Source::CommonPractice));
    assert!(has("outdoor_air", Source::ProjectDefault));
    assert!(has(
        "distribution_effectiveness",
        Source::Ashrae621FromMemory
    ));
    let fan = r
        .assumptions
        .iter()
        .find(|a| a.key == "fan")
        .map(|a| a.value);
    assert!(matches!(fan, Some(AssumedValue::FanRise { dt_f, .. }) if dt_f == 2.0));
}
