//! Shared helpers of the reference comparisons: reading the committed
//! reference (`tests/reference/coil/`, an independent psychrolib
//! implementation of methods.md, see its README) and comparing the engine's
//! results with it quantity by quantity.
//!
//! Tolerances are the issue's: 0.5 % on flows and loads, 0.2 °F on states.

#![allow(dead_code)]

pub mod build;

use std::collections::BTreeMap;
use std::path::PathBuf;

use plenum_engine::{AhuResult, CaseResult, DesignCase, FindingKind, StatePoint};
use serde_json::Value;

/// Relative tolerance on flows and loads.
pub const REL: f64 = 0.005;
/// Absolute tolerance on temperatures, °F.
pub const TEMP_F: f64 = 0.2;

pub fn reference_dir() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../tests/reference/coil")
}

pub fn read_json(path: &std::path::Path) -> Result<Value, String> {
    let text = std::fs::read_to_string(path).map_err(|e| format!("{}: {e}", path.display()))?;
    serde_json::from_str(&text).map_err(|e| format!("{}: {e}", path.display()))
}

/// Every case name (file stem of `expected/*.json`), sorted.
pub fn case_names() -> Vec<String> {
    let mut names: Vec<String> = std::fs::read_dir(reference_dir().join("expected"))
        .map(|rd| {
            rd.filter_map(|e| e.ok())
                .filter_map(|e| {
                    let p = e.path();
                    (p.extension()? == "json")
                        .then(|| p.file_stem()?.to_str().map(str::to_string))
                        .flatten()
                })
                .collect()
        })
        .unwrap_or_default();
    names.sort();
    names
}

pub fn num(v: &Value, path: &str) -> Option<f64> {
    let mut cur = v;
    for k in path.split('.') {
        cur = cur.get(k)?;
    }
    cur.as_f64()
}

/// Worst error seen per quantity.
#[derive(Default)]
pub struct Worst {
    pub rel: BTreeMap<&'static str, (f64, String)>,
    pub abs: BTreeMap<&'static str, (f64, String)>,
    pub failures: Vec<String>,
    pub compared: usize,
}

impl Worst {
    /// Relative comparison; `scale` (when larger) is the denominator, for
    /// quantities that may be near zero beside a larger related one.
    pub fn rel(&mut self, what: &'static str, ctx: &str, got: f64, want: f64, scale: f64) {
        self.compared += 1;
        let denom = want.abs().max(scale.abs()).max(1e-300);
        let err = (got - want).abs() / denom;
        let e = self.rel.entry(what).or_insert((0.0, String::new()));
        if e.1.is_empty() || err > e.0 {
            *e = (err, ctx.to_string());
        }
        if err.is_nan() || err > REL {
            self.failures.push(format!(
                "{ctx} {what}: engine {got} vs reference {want} ({:.3} %)",
                err * 100.0
            ));
        }
    }

    pub fn abs(&mut self, what: &'static str, ctx: &str, got: f64, want: f64, tol: f64) {
        self.compared += 1;
        let err = (got - want).abs();
        let e = self.abs.entry(what).or_insert((0.0, String::new()));
        if e.1.is_empty() || err > e.0 {
            *e = (err, ctx.to_string());
        }
        if err.is_nan() || err > tol {
            self.failures.push(format!(
                "{ctx} {what}: engine {got} vs reference {want} (|Δ| {err})"
            ));
        }
    }

    pub fn same<T: PartialEq + std::fmt::Debug>(&mut self, what: &str, ctx: &str, got: T, want: T) {
        self.compared += 1;
        if got != want {
            self.failures.push(format!(
                "{ctx} {what}: engine {got:?} vs reference {want:?}"
            ));
        }
    }

    pub fn report(&self) -> String {
        let mut s = String::from("worst relative error (flows, loads, ratios):\n");
        for (k, (e, ctx)) in &self.rel {
            s.push_str(&format!("  {k:<28} {:.2e}  ({ctx})\n", e));
        }
        s.push_str("worst absolute error:\n");
        for (k, (e, ctx)) in &self.abs {
            s.push_str(&format!("  {k:<28} {:.2e}  ({ctx})\n", e));
        }
        s
    }
}

fn state(w: &mut Worst, ctx: &str, got: &StatePoint, want: &Value) {
    let n = |k| num(want, k).unwrap_or(f64::NAN);
    w.abs("state tdb_f", ctx, got.tdb_f, n("tdb_f"), TEMP_F);
    w.abs("state twb_f", ctx, got.twb_f, n("twb_f"), TEMP_F);
    w.abs("state tdp_f", ctx, got.tdp_f, n("tdp_f"), TEMP_F);
    w.rel("state w_lb_lb", ctx, got.w_lb_lb, n("w_lb_lb"), 0.0);
    w.rel("state h_btu_lb", ctx, got.h_btu_lb, n("h_btu_lb"), 0.0);
    w.abs("state rh_pct", ctx, got.rh_pct, n("rh_pct"), 0.5);
    w.rel("state v_ft3_lb", ctx, got.v_ft3_lb, n("v_ft3_lb"), 0.0);
}

fn opt_rel(w: &mut Worst, what: &'static str, ctx: &str, got: Option<f64>, want: Option<f64>) {
    match (got, want) {
        (Some(g), Some(e)) => w.rel(what, ctx, g, e, 0.0),
        (g, e) => w.same(what, ctx, g.is_some(), e.is_some()),
    }
}

/// The engine's findings at one case, in the reference's words.
pub fn finding_names(
    r: &AhuResult,
    case: DesignCase,
    zone_name: impl Fn(usize) -> String,
) -> Vec<String> {
    let mut out = Vec::new();
    for f in &r.findings {
        if f.case != Some(case) {
            continue;
        }
        match &f.kind {
            FindingKind::DryCoil { .. } => out.push("dry_coil".to_string()),
            FindingKind::VentilationShortfall { .. } => out.push("ventilation_shortfall".into()),
            FindingKind::Undersized { .. } => out.push("undersized".into()),
            FindingKind::Oversized { .. } => out.push("oversized".into()),
            FindingKind::RoomAboveDesignHumidity { zone, .. } => out.push(format!(
                "room_above_design_humidity:{}",
                zone_name(zone.0 as usize)
            )),
            FindingKind::CoilCannotDehumidify { zone, .. } => out.push(format!(
                "coil_cannot_dehumidify:{}",
                zone_name(zone.0 as usize)
            )),
            _ => {}
        }
    }
    out.sort();
    out
}

/// Compare one design case of one air handler with the reference's `R`.
pub fn compare_case(w: &mut Worst, ctx: &str, got: &CaseResult, want: &Value) {
    let n = |k: &str| num(want, k).unwrap_or(f64::NAN);
    w.rel(
        "dry_air_flow_lb_h",
        ctx,
        got.dry_air_flow_lb_h,
        n("dry_air_flow_lb_h"),
        0.0,
    );
    w.rel(
        "supply_airflow_cfm",
        ctx,
        got.supply_airflow_cfm,
        n("supply_airflow_cfm"),
        0.0,
    );
    w.rel(
        "block_sensible_btuh",
        ctx,
        got.block_sensible_btuh,
        n("block_sensible_btu_h"),
        0.0,
    );
    w.rel(
        "block_latent_btuh",
        ctx,
        got.block_latent_btuh,
        n("block_latent_btu_h"),
        n("block_sensible_btu_h"),
    );
    w.rel(
        "cp_supply",
        ctx,
        got.cp_supply,
        n("cp_supply_btu_lb_f"),
        0.0,
    );
    w.abs(
        "rise supply_duct_f",
        ctx,
        got.rises.supply_duct_f,
        n("rises_f.supply_duct"),
        TEMP_F,
    );
    w.abs("rise fan_f", ctx, got.rises.fan_f, n("rises_f.fan"), TEMP_F);
    w.abs(
        "rise return_duct_f",
        ctx,
        got.rises.return_duct_f,
        n("rises_f.return_duct"),
        TEMP_F,
    );
    w.abs(
        "rise plenum_f",
        ctx,
        got.rises.plenum_f,
        n("rises_f.plenum"),
        TEMP_F,
    );
    w.abs(
        "rise outdoor_fan_f",
        ctx,
        got.rises.outdoor_fan_f,
        n("rises_f.outdoor_fan"),
        TEMP_F,
    );
    w.rel(
        "fan heat_btuh",
        ctx,
        got.fan.heat_btuh,
        n("fan.heat_btu_h"),
        0.0,
    );
    opt_rel(
        w,
        "fan shaft_power_bhp",
        ctx,
        got.fan.shaft_power_bhp,
        num(want, "fan.shaft_power_bhp"),
    );
    w.rel(
        "ventilation v_ot_cfm",
        ctx,
        got.ventilation.v_ot_cfm,
        n("ventilation.v_ot_cfm"),
        0.0,
    );
    w.rel(
        "ventilation sum_v_oz_cfm",
        ctx,
        got.ventilation.sum_v_oz_cfm,
        n("ventilation.sum_v_oz_cfm"),
        0.0,
    );
    let proc_key = match got.ventilation.procedure {
        plenum_engine::VentilationProcedure::SingleZone => "single_zone",
        plenum_engine::VentilationProcedure::MultipleZone => "multiple_zone",
        plenum_engine::VentilationProcedure::AllOutdoorAir => "100_percent_outdoor_air",
    };
    w.same(
        "ventilation procedure",
        ctx,
        Some(proc_key),
        want.pointer("/ventilation/procedure")
            .and_then(Value::as_str),
    );
    if let Some(mz) = &got.ventilation.multiple_zone {
        w.rel(
            "ventilation v_ou_cfm",
            ctx,
            mz.v_ou_cfm,
            n("ventilation.v_ou_cfm"),
            0.0,
        );
        w.rel(
            "ventilation v_ps_cfm",
            ctx,
            mz.v_ps_cfm,
            n("ventilation.v_ps_cfm"),
            0.0,
        );
        w.rel("ventilation x_s", ctx, mz.x_s, n("ventilation.x_s"), 0.0);
        w.rel("ventilation e_v", ctx, mz.e_v, n("ventilation.e_v"), 0.0);
    }
    w.rel(
        "ventilation_required_cfm",
        ctx,
        got.ventilation_required_cfm,
        n("ventilation_required_cfm"),
        0.0,
    );
    w.rel(
        "outdoor_airflow_cfm",
        ctx,
        got.outdoor_airflow_cfm,
        n("outdoor_airflow_cfm"),
        0.0,
    );
    w.rel(
        "outdoor_air_lb_h",
        ctx,
        got.outdoor_air_lb_h,
        n("outdoor_air_dry_air_flow_lb_h"),
        0.0,
    );
    w.rel(
        "outdoor_air_fraction",
        ctx,
        got.outdoor_air_fraction,
        n("outdoor_air_fraction"),
        0.0,
    );
    w.same(
        "ventilation_shortfall",
        ctx,
        got.ventilation_shortfall(),
        want["ventilation_shortfall"].as_bool().unwrap_or(false),
    );
    w.rel(
        "ventilation_shortfall_cfm",
        ctx,
        got.ventilation_shortfall_cfm,
        n("ventilation_shortfall_cfm"),
        n("ventilation_required_cfm"),
    );
    let st = &got.states;
    let states = &want["states"];
    state(
        w,
        &format!("{ctx} outdoor"),
        &st.outdoor,
        &states["outdoor"],
    );
    match (&st.outdoor_after_fan, states.get("outdoor_after_fan")) {
        (Some(g), Some(e)) => state(w, &format!("{ctx} outdoor_after_fan"), g, e),
        (g, e) => w.same("outdoor_after_fan present", ctx, g.is_some(), e.is_some()),
    }
    state(
        w,
        &format!("{ctx} return"),
        &st.return_air,
        &states["return"],
    );
    state(w, &format!("{ctx} mixed"), &st.mixed, &states["mixed"]);
    state(
        w,
        &format!("{ctx} entering"),
        &st.entering,
        &states["entering"],
    );
    state(
        w,
        &format!("{ctx} leaving"),
        &st.leaving,
        &states["leaving"],
    );
    state(w, &format!("{ctx} supply"), &st.supply, &states["supply"]);
    state(w, &format!("{ctx} room"), &st.room, &states["room"]);
    let c = &got.coil;
    let total = n("coil.total_btu_h");
    w.same(
        "coil dry",
        ctx,
        c.dry,
        want["coil"]["dry"].as_bool().unwrap_or(false),
    );
    w.rel("coil total_btuh", ctx, c.total_btuh, total, 0.0);
    w.rel(
        "coil sensible_btuh",
        ctx,
        c.sensible_btuh,
        n("coil.sensible_btu_h"),
        0.0,
    );
    w.rel(
        "coil latent_btuh (of total)",
        ctx,
        c.latent_btuh,
        n("coil.latent_btu_h"),
        total,
    );
    w.rel("coil tons", ctx, c.tons, n("coil.tons"), 0.0);
    w.rel("coil shr", ctx, c.shr, n("coil.shr"), 0.0);
    w.abs("coil adp_f", ctx, c.adp_f, n("coil.adp_f"), TEMP_F);
    w.abs(
        "coil bypass_factor",
        ctx,
        c.bypass_factor,
        n("coil.bypass_factor"),
        0.01,
    );
    // Condensate can be near zero beside a large air flow: compared as a
    // latent load, relative to the coil total in Btu/h (× 1061 Btu/lb).
    w.rel(
        "coil condensate_lb_h (as latent)",
        ctx,
        c.condensate_lb_h * 1061.0,
        n("coil.condensate_lb_h") * 1061.0,
        total,
    );
    w.rel(
        "coil condensate_gal_h (as latent)",
        ctx,
        c.condensate_gal_h * 1061.0 * 8.34,
        n("coil.condensate_gal_h") * 1061.0 * 8.34,
        total,
    );
    opt_rel(
        w,
        "coil chilled_water_gpm",
        ctx,
        c.chilled_water_gpm,
        num(want, "coil.chilled_water_gpm"),
    );
    opt_rel(
        w,
        "coil face_velocity_fpm",
        ctx,
        c.face_velocity_fpm,
        num(want, "coil.face_velocity_fpm"),
    );
    w.rel(
        "coil cfm_per_ton",
        ctx,
        c.cfm_per_ton,
        n("coil.cfm_per_ton"),
        0.0,
    );
    let cap = &got.capacity;
    opt_rel(
        w,
        "capacity rated_tons",
        ctx,
        cap.rated_tons,
        num(want, "capacity.rated_tons"),
    );
    match (cap.margin, num(want, "capacity.margin")) {
        (Some(g), Some(e)) => w.abs("capacity margin", ctx, g, e, 0.005),
        (g, e) => w.same("capacity margin present", ctx, g.is_some(), e.is_some()),
    }
    match (cap.sensible_margin, num(want, "capacity.sensible_margin")) {
        (Some(g), Some(e)) => w.abs("capacity sensible_margin", ctx, g, e, 0.005),
        (g, e) => w.same(
            "capacity sensible_margin present",
            ctx,
            g.is_some(),
            e.is_some(),
        ),
    }
    w.same(
        "capacity status",
        ctx,
        Some(cap.status.key()),
        want.pointer("/capacity/status").and_then(Value::as_str),
    );
    let sa = &got.standard_air;
    w.rel(
        "standard_air supply_airflow_cfm",
        ctx,
        sa.supply_airflow_cfm,
        n("standard_air.supply_airflow_cfm"),
        0.0,
    );
    w.rel(
        "standard_air coil_total_btuh",
        ctx,
        sa.coil_total_btuh,
        n("standard_air.coil_total_btu_h"),
        0.0,
    );
    w.abs(
        "standard_air airflow diff_pct",
        ctx,
        sa.supply_airflow_diff_pct,
        n("standard_air.supply_airflow_diff_pct"),
        0.5,
    );
    w.abs(
        "standard_air coil diff_pct",
        ctx,
        sa.coil_total_diff_pct,
        n("standard_air.coil_total_diff_pct"),
        0.5,
    );
    let zones = want["zones"].as_array().cloned().unwrap_or_default();
    w.same("zone count", ctx, got.zones.len(), zones.len());
    for (gz, ez) in got.zones.iter().zip(&zones) {
        let zctx = format!("{ctx} zone {}", gz.name);
        let zn = |k: &str| num(ez, k).unwrap_or(f64::NAN);
        w.same(
            "zone name",
            &zctx,
            Some(gz.name.as_str()),
            ez["name"].as_str(),
        );
        w.abs(
            "zone supply_dt_f",
            &zctx,
            gz.supply_dt_f,
            zn("supply_dt_f"),
            TEMP_F,
        );
        w.rel(
            "zone design_airflow_lb_h",
            &zctx,
            gz.design_airflow_lb_h,
            zn("design_airflow_lb_h"),
            0.0,
        );
        w.rel(
            "zone design_airflow_cfm",
            &zctx,
            gz.design_airflow_cfm,
            zn("design_airflow_cfm"),
            0.0,
        );
        w.rel("zone v_bz_cfm", &zctx, gz.v_bz_cfm, zn("v_bz_cfm"), 0.0);
        w.rel("zone v_oz_cfm", &zctx, gz.v_oz_cfm, zn("v_oz_cfm"), 0.0);
        w.rel("zone z_pz", &zctx, gz.z_pz, zn("z_pz"), 0.0);
        opt_rel(w, "zone e_vz", &zctx, gz.e_vz, num(ez, "e_vz"));
        w.rel(
            "zone room_w_lb_lb",
            &zctx,
            gz.room_w_lb_lb,
            zn("room_w_lb_lb"),
            0.0,
        );
        w.abs(
            "zone room_rh_pct",
            &zctx,
            gz.room_rh_pct,
            zn("room_rh_pct"),
            0.5,
        );
        w.rel(
            "zone design_w_lb_lb",
            &zctx,
            gz.design_w_lb_lb,
            zn("design_w_lb_lb"),
            0.0,
        );
        w.same(
            "zone above_design_humidity",
            &zctx,
            gz.above_design_humidity,
            ez["above_design_humidity"].as_bool().unwrap_or(false),
        );
    }
}

/// Compare one air handler with the reference's `air_handlers[]` entry.
pub fn compare_ahu(
    w: &mut Worst,
    case: &str,
    got: &AhuResult,
    want: &Value,
    zone_name: &dyn Fn(usize) -> String,
) {
    let ctx = format!("{case}/{}", got.name);
    w.same(
        "governing_state",
        &ctx,
        Some(got.governing.key()),
        want["governing_state"].as_str(),
    );
    w.same(
        "status",
        &ctx,
        Some(got.status().key()),
        want["status"].as_str(),
    );
    let states = &want["design_states"];
    for dc in [DesignCase::Cooling, DesignCase::Dehumid] {
        let (g, e) = (got.case(dc), states.get(dc.key()));
        match (g, e) {
            (Some(g), Some(e)) => {
                let cctx = format!("{ctx} {}", dc.key());
                compare_case(w, &cctx, g, e);
                let mut want_f: Vec<String> = e["findings"]
                    .as_array()
                    .map(|a| {
                        a.iter()
                            .filter_map(|v| v.as_str().map(str::to_string))
                            .collect()
                    })
                    .unwrap_or_default();
                want_f.sort();
                w.same("findings", &cctx, finding_names(got, dc, zone_name), want_f);
            }
            (g, e) => w.same("design case present", &ctx, g.is_some(), e.is_some()),
        }
    }
}
