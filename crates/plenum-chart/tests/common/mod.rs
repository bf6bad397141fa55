//! The example designs, loaded and evaluated, and their charts.

#![allow(dead_code)]

use std::path::PathBuf;
use std::sync::OnceLock;

use plenum_chart::Chart;
use plenum_engine::Evaluation;
use plenum_model::{Design, Model, RealFs};
use plenum_units::UnitSystem;

/// The examples of the repository.
pub const EXAMPLES: [&str; 2] = ["library.plenum", "middle-school.plenum"];

pub fn example_path(name: &str) -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("../../examples")
        .join(name)
}

pub fn load(name: &str) -> (Design, Evaluation) {
    let path = example_path(name);
    let text = std::fs::read_to_string(&path).unwrap();
    let model = Model::build(&RealFs, &path, text);
    assert!(
        !model.has_errors(),
        "{name} has errors: {:?}",
        model.diagnostics
    );
    let eval = plenum_engine::evaluate(&model.design);
    (model.design, eval)
}

/// Every chart of every example, in both unit systems: (example, ahu, units,
/// chart), built once per test binary.
pub fn all_charts() -> &'static [(String, String, UnitSystem, Chart)] {
    static CHARTS: OnceLock<Vec<(String, String, UnitSystem, Chart)>> = OnceLock::new();
    CHARTS.get_or_init(|| {
        let mut out = Vec::new();
        for ex in EXAMPLES {
            let (design, eval) = load(ex);
            for a in &eval.ahus {
                for units in [UnitSystem::Ip, UnitSystem::Si] {
                    let chart = plenum_chart::chart_of(&design, &eval, a.index, units).unwrap();
                    out.push((ex.to_string(), a.name.clone(), units, chart));
                }
            }
        }
        out
    })
}
