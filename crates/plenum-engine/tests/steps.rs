//! One test per step of the chain, with numbers a reader can check by hand.
//! Each names its source: the handbook equation (ASHRAE Handbook—
//! Fundamentals 2017 ch. 1), ASHRAE 62.1-2019 (from memory), NIST SP 811,
//! methods.md, or *common practice*.

mod common;

use common::build::*;
use plenum_engine::*;
use plenum_model::*;
use plenum_psychro::ip;

fn close(a: f64, b: f64, rel: f64) -> bool {
    (a - b).abs() <= rel * b.abs().max(1e-300)
}

macro_rules! assert_close {
    ($a:expr, $b:expr, $rel:expr) => {{
        let (a, b) = ($a, $b);
        assert!(
            close(a, b, $rel),
            "{} = {a} vs {} = {b}",
            stringify!($a),
            stringify!($b)
        );
    }};
}

/// A one-zone office at sea level, 95/75 outdoor: the workhorse of these tests.
fn office() -> Design {
    design(
        site(0.0, 95.0, 75.0),
        vec![vent_zone(
            0, "office", 24_000.0, 4_000.0, "office", 2_000.0, 10.0,
        )],
        vec![ahu("rtu_1", &[0])],
    )
}

fn result(d: &Design) -> AhuResult {
    let e = evaluate(d);
    match e.ahus.into_iter().next().map(|a| a.result) {
        Some(Ok(r)) => r,
        other => panic!("no result: {other:?}"),
    }
}

fn error(d: &Design) -> EngineError {
    let e = evaluate(d);
    match e.ahus.into_iter().next().map(|a| a.result) {
        Some(Err(e)) => e,
        other => panic!("expected an error: {other:?}"),
    }
}

// --- §1 site -------------------------------------------------------------

/// Standard atmosphere, Fundamentals ch. 1 eq. 3: at 5,000 ft
/// p = 14.696 (1 − 6.8754e-6 · 5000)^5.2559 = 12.228 psia.
#[test]
fn site_pressure_from_elevation() {
    let mut d = office();
    d.site = Some(site(5_000.0, 95.0, 65.0));
    let s = evaluate(&d).site.unwrap_or_else(|e| panic!("{e:?}"));
    let hand = 14.696 * (1.0 - 6.8754e-6 * 5000.0_f64).powf(5.2559);
    assert_close!(s.pressure_psia, hand, 1e-12);
    assert!((s.pressure_psia - 12.228).abs() < 0.001);
    assert_eq!(
        s.pressure_source,
        PressureSource::Elevation {
            elevation_ft: 5000.0
        }
    );
}

/// `pressure` given is used as is; without either, sea level is assumed
/// and reported (project default, README choice 1).
#[test]
fn site_pressure_given_or_assumed() {
    let mut d = office();
    if let Some(s) = d.site.as_mut() {
        s.pressure_psia = Some(at_n(14.45, 3));
    }
    let e = evaluate(&d);
    let s = e.site.as_ref().unwrap_or_else(|e| panic!("{e:?}"));
    assert_eq!(s.pressure_psia, 14.45);
    assert!(
        e.findings
            .iter()
            .any(|f| matches!(f.kind, FindingKind::ElevationIgnored { .. }) && f.loc == loc_n(3))
    );
    if let Some(s) = d.site.as_mut() {
        s.pressure_psia = None;
        s.elevation_ft = None;
    }
    let s = evaluate(&d).site.unwrap_or_else(|e| panic!("{e:?}"));
    assert_eq!(s.pressure_psia, 14.696);
    assert!(s.assumptions.iter().any(|a| a.key == "elevation"));
}

/// A design with no site, or no cooling state, has no result (methods.md §1:
/// there is no default outdoor condition).
#[test]
fn no_site_or_no_cooling_state_is_an_error() {
    let mut d = office();
    d.site = None;
    let e = evaluate(&d);
    assert!(matches!(e.site, Err(EngineError::NoSite { .. })));
    assert!(matches!(
        e.ahus[0].result,
        Err(EngineError::SiteUnusable { .. })
    ));
    let mut d = office();
    if let Some(s) = d.site.as_mut() {
        s.cooling = None;
    }
    let e = evaluate(&d);
    assert!(matches!(
        e.site,
        Err(EngineError::MissingInput { key: "cooling", .. })
    ));
    let mut d = office();
    d.site = Some(site(0.0, 75.0, 80.0)); // wet bulb above dry bulb
    assert!(matches!(
        evaluate(&d).site,
        Err(EngineError::Psychro { .. })
    ));
}

// --- §3, §4 steps 1–2: supply temperature and airflow -----------------

/// Default supply = room − 18 °F (*common practice*); the zone flow is
/// m_z = q_s / (c_p ΔT) with c_p = 0.240 + 0.444 W_s (methods.md step 2).
#[test]
fn airflow_from_the_sensible_load() {
    let r = result(&office());
    let c = &r.cooling;
    assert_eq!(r.inputs.supply_temp_f, 57.0);
    let w_s = c.states.supply.w_lb_lb;
    assert_close!(c.cp_supply, 0.240 + 0.444 * w_s, 1e-12);
    assert_close!(c.dry_air_flow_lb_h, 24_000.0 / (c.cp_supply * 18.0), 1e-12);
    // cfm at the supply state: m v_s / 60.
    assert_close!(
        c.supply_airflow_cfm,
        c.dry_air_flow_lb_h * c.states.supply.v_ft3_lb / 60.0,
        1e-12
    );
    // By hand: 24,000 / (0.2436 · 18) = 5,474 lb/h.
    assert!((c.dry_air_flow_lb_h - 5_474.0).abs() < 5.0);
}

/// Diversity scales the system flow and block loads, not the zone flows
/// (methods.md §3, README choice 4).
#[test]
fn diversity_applies_to_the_system_only() {
    let mut d = office();
    d.zones.push(zone(1, "b", 12_000.0, 0.0));
    d.ahus[0].serves.push(at(ZoneId(1)));
    d.ahus[0].diversity = Some(at(0.9));
    let c = result(&d).cooling;
    assert_close!(c.block_sensible_btuh, 0.9 * 36_000.0, 1e-12);
    assert_close!(c.block_latent_btuh, 0.9 * 4_000.0, 1e-12);
    let sum: f64 = c.zones.iter().map(|z| z.design_airflow_lb_h).sum();
    assert_close!(c.dry_air_flow_lb_h, 0.9 * sum, 1e-12);
    assert_close!(
        c.zones[1].design_airflow_lb_h,
        12_000.0 / (c.cp_supply * 18.0),
        1e-12
    );
}

/// Zones at different room temperatures: the default supply is the lowest
/// t_r − 18 °F and each zone uses its own ΔT (§4a); the room dry bulb is
/// the flow-weighted mean (README choice 9).
#[test]
fn zones_at_different_room_temperatures() {
    let mut d = office();
    let mut warm = zone(1, "store", 10_000.0, 0.0);
    warm.indoor = Some(at(AirSpec::DbRh {
        db_f: 80.0,
        rh: 0.5,
    }));
    d.zones.push(warm);
    d.ahus[0].serves.push(at(ZoneId(1)));
    let c = result(&d).cooling;
    assert_eq!(c.zones[0].supply_dt_f, 18.0);
    assert_eq!(c.zones[1].supply_dt_f, 23.0);
    let (m0, m1) = (
        c.zones[0].design_airflow_lb_h,
        c.zones[1].design_airflow_lb_h,
    );
    assert_close!(
        c.states.room.tdb_f,
        (75.0 * m0 + 80.0 * m1) / (m0 + m1),
        1e-12
    );
}

/// `supply_dt` is below the lowest room; a supply not below a room is an error.
#[test]
fn supply_dt_and_supply_not_below_room() {
    let mut d = office();
    d.ahus[0].supply = Some(at(SupplyTemp::BelowRoom { dt_f: 20.0 }));
    assert_eq!(result(&d).inputs.supply_temp_f, 55.0);
    d.ahus[0].supply = Some(at_n(SupplyTemp::Temp { f: 75.0 }, 4));
    assert!(matches!(
        error(&d),
        EngineError::SupplyNotBelowRoom { loc, .. } if loc == loc_n(4)
    ));
}

// --- steps 3–5: rises and the leaving-coil state -----------------------

/// Supply duct 1.5 °F/100 ft (*common practice*), return duct 1.0 °F/100 ft
/// (project default), 3 °F when unknown (*common practice*), none → 0.
#[test]
fn duct_rises() {
    let mut d = office();
    let r = result(&d);
    assert_eq!(r.cooling.rises.supply_duct_f, 3.0);
    assert_eq!(r.cooling.rises.return_duct_f, 3.0);
    d.ahus[0].supply_duct = Some(at(SupplyDuct::Length { ft: 200.0 }));
    d.ahus[0].return_duct = Some(at(ReturnDuct::Length { ft: 50.0 }));
    let r = result(&d);
    assert_close!(r.cooling.rises.supply_duct_f, 3.0, 1e-12);
    assert_close!(r.cooling.rises.return_duct_f, 0.5, 1e-12);
    d.ahus[0].return_duct = Some(at(ReturnDuct::None));
    assert_eq!(result(&d).cooling.rises.return_duct_f, 0.0);
}

/// Fan heat from shaft power (NIST SP 811: 1 hp = 2544.43 Btu/h): a 2 hp
/// motor in the air stream at 90 % (*common practice* default) adds
/// 2544.43·2/0.9 = 5,654.3 Btu/h; outside the air stream 5,088.9 Btu/h.
/// The rise is q_f / (m c_p) (methods.md step 4).
#[test]
fn fan_heat_from_shaft_power() {
    let mut d = office();
    d.ahus[0].fan = Some(Fan {
        power: Some(at(FanPower::Shaft { hp: 2.0 })),
        ..fan()
    });
    let r = result(&d);
    let f = &r.cooling.fan;
    assert_close!(f.heat_btuh, 2544.43 * 2.0 / 0.9, 1e-12);
    assert!((f.heat_btuh - 5_654.3).abs() < 0.1);
    assert_close!(
        f.rise_f,
        f.heat_btuh / (r.cooling.dry_air_flow_lb_h * r.cooling.cp_supply),
        1e-12
    );
    assert!(
        r.assumptions
            .iter()
            .any(|a| a.key == "motor_efficiency" && a.source == Source::CommonPractice)
    );
    d.ahus[0].fan = Some(Fan {
        power: Some(at(FanPower::Shaft { hp: 2.0 })),
        motor: Some(at(MotorLocation::Outside)),
        ..fan()
    });
    assert_close!(result(&d).cooling.fan.heat_btuh, 5_088.86, 1e-12);
}

/// Fan power from static pressure: P = cfm·Δp/(6356 η) (*common practice*),
/// with the supply cfm at the supply state (README choice 6).
#[test]
fn fan_power_from_static_pressure() {
    let mut d = office();
    d.ahus[0].fan = Some(Fan {
        power: Some(at(FanPower::Static {
            in_wg: 2.0,
            efficiency: 0.6,
        })),
        motor_efficiency: Some(at(0.85)),
        ..fan()
    });
    let c = result(&d).cooling;
    let bhp = c.supply_airflow_cfm * 2.0 / (6356.0 * 0.6);
    assert_close!(c.fan.shaft_power_bhp.unwrap_or(f64::NAN), bhp, 1e-9);
    assert_close!(c.fan.heat_btuh, 2544.43 * bhp / 0.85, 1e-9);
}

/// Draw-through: t_off = t_s − Δt_sd − Δt_f; blow-through: t_off = t_s − Δt_sd
/// and the fan's rise goes on the mixed air (methods.md steps 4, 5, 10).
/// With no fan block a 2 °F draw-through rise is assumed (*common practice*).
#[test]
fn leaving_state_draw_and_blow_through() {
    let d = office();
    let c = result(&d).cooling;
    assert_eq!(c.fan.rise_f, 2.0);
    assert_close!(c.states.leaving.tdb_f, 57.0 - 3.0 - 2.0, 1e-12);
    assert_eq!(c.states.entering.tdb_f, c.states.mixed.tdb_f);
    let mut d = office();
    d.ahus[0].fan = Some(Fan {
        rise_f: Some(at(2.0)),
        arrangement: Some(at(FanArrangement::BlowThrough)),
        ..fan()
    });
    let c = result(&d).cooling;
    assert_close!(c.states.leaving.tdb_f, 57.0 - 3.0, 1e-12);
    assert_close!(c.states.entering.tdb_f, c.states.mixed.tdb_f + 2.0, 1e-12);
    assert_eq!(c.states.entering.w_lb_lb, c.states.mixed.w_lb_lb);
}

/// Leaving coil at 95 % RH (*common practice*): W_off = W(t_off, 0.95) by
/// Fundamentals ch. 1 eq. 22/24, and the supply keeps it (W_s = W_off).
#[test]
fn leaving_state_at_95_percent() {
    let c = result(&office()).cooling;
    let w = ip::hum_ratio_from_rh(52.0, 0.95, 14.696).unwrap_or(f64::NAN);
    assert_close!(c.states.leaving.w_lb_lb, w, 1e-9);
    assert_eq!(c.states.supply.w_lb_lb, c.states.leaving.w_lb_lb);
    assert!((c.states.leaving.rh_pct - 95.0).abs() < 1e-6);
    assert!(c.iterations.airflow >= 2 && c.iterations.airflow < MAX_AIRFLOW_PASSES);
}

// --- steps 6–7: room and return -------------------------------------

/// W_r = W_s + Q_l / (m (1061 + 0.444 t_r)) (methods.md step 6); return
/// t = t_r + duct + plenum rise, plenum rise q_pl/(m c_p(W_r)) (step 7, §4a).
#[test]
fn room_humidity_and_return_air() {
    let mut d = office();
    d.ahus[0].plenum_gain_btuh = Some(at(5_000.0));
    let c = result(&d).cooling;
    let m = c.dry_air_flow_lb_h;
    let w_r = c.states.supply.w_lb_lb + 4_000.0 / (m * (1061.0 + 0.444 * 75.0));
    assert_close!(c.states.room.w_lb_lb, w_r, 1e-12);
    let dt_pl = 5_000.0 / (m * (0.240 + 0.444 * w_r));
    assert_close!(c.rises.plenum_f, dt_pl, 1e-12);
    assert_close!(c.states.return_air.tdb_f, 75.0 + 3.0 + dt_pl, 1e-12);
    assert_eq!(c.states.return_air.w_lb_lb, c.states.room.w_lb_lb);
    // One zone: its own humidity is the air handler's.
    assert_close!(c.zones[0].room_w_lb_lb, w_r, 1e-12);
}

// --- step 8: outdoor air and 62.1 ------------------------------------

/// 62.1 single zone (from memory): office R_p 5, R_a 0.06 — 10 people in
/// 2,000 ft² need 5·10 + 0.06·2000 = 170 cfm; the outdoor air used is
/// that, at the outdoor state (README choice 12).
#[test]
fn ventilation_single_zone_by_hand() {
    let c = result(&office()).cooling;
    assert_eq!(c.ventilation.procedure, VentilationProcedure::SingleZone);
    assert_close!(c.ventilation_required_cfm, 170.0, 1e-12);
    assert_close!(c.outdoor_airflow_cfm, 170.0, 1e-12);
    assert_close!(
        c.outdoor_air_lb_h,
        170.0 * 60.0 / c.states.outdoor.v_ft3_lb,
        1e-12
    );
    assert_close!(
        c.outdoor_air_fraction,
        c.outdoor_air_lb_h / c.dry_air_flow_lb_h,
        1e-12
    );
    assert_eq!(c.zones[0].v_bz_cfm, 170.0);
    // E_z = 0.8 raises V_oz to 170 / 0.8 = 212.5 cfm.
    let mut d = office();
    d.zones[0].distribution_effectiveness = Some(at(0.8));
    assert_close!(result(&d).cooling.ventilation_required_cfm, 212.5, 1e-12);
}

/// 62.1 multiple zone, simplified E_v (from memory): three zones —
/// office 10 p/2,000 ft², conference 20 p/500 ft², corridor 0 p/400 ft².
/// V_ou = D Σ R_p P + Σ R_a A = 1·(50 + 100 + 0) + (120 + 30 + 24) = 324 cfm;
/// E_v = 0.75 (D ≥ 0.60) → V_ot = 432 cfm. With D = 0.5:
/// V_ou = 75 + 174 = 249, E_v = 0.88·0.5 + 0.22 = 0.66 → 377.27 cfm.
#[test]
fn ventilation_multiple_zone_simplified_by_hand() {
    let mut d = office();
    d.zones.push(vent_zone(
        1,
        "conf",
        8_000.0,
        2_000.0,
        "conference",
        500.0,
        20.0,
    ));
    d.zones
        .push(vent_zone(2, "hall", 3_000.0, 0.0, "corridor", 400.0, 0.0));
    d.ahus[0].serves = vec![at(ZoneId(0)), at(ZoneId(1)), at(ZoneId(2))];
    let c = result(&d).cooling;
    let mz = c
        .ventilation
        .multiple_zone
        .unwrap_or_else(|| panic!("multiple zone"));
    assert_eq!(c.ventilation.procedure, VentilationProcedure::MultipleZone);
    assert_close!(mz.v_ou_cfm, 324.0, 1e-12);
    assert_eq!(mz.e_v, 0.75);
    assert_close!(c.ventilation_required_cfm, 432.0, 1e-12);
    assert_close!(c.ventilation.sum_v_oz_cfm, 324.0, 1e-12);
    d.ahus[0].occupant_diversity = Some(at(0.5));
    let c = result(&d).cooling;
    assert_close!(c.ventilation_required_cfm, 249.0 / 0.66, 1e-12);
    // The calculated procedure: E_v = min(1 + X_s − Z_pz).
    d.ahus[0].ventilation_efficiency = Some(at(VentilationEfficiency::Calculated));
    let c = result(&d).cooling;
    let mz = c
        .ventilation
        .multiple_zone
        .unwrap_or_else(|| panic!("multiple zone"));
    let xs = 249.0 / c.supply_airflow_cfm;
    let min_evz = c
        .zones
        .iter()
        .map(|z| 1.0 + xs - z.v_oz_cfm / z.design_airflow_cfm)
        .fold(f64::INFINITY, f64::min);
    assert_close!(mz.e_v, min_evz, 1e-12);
    assert_eq!(mz.e_v_method, EvMethod::Calculated);
}

/// 62.1 with 100 % outdoor air (from memory): V_ot = Σ V_oz, here
/// 170 + (5·20 + 0.06·500 = 130) = 300 cfm; the unit takes all its supply
/// from outdoors (x = 1, README choice 13).
#[test]
fn ventilation_all_outdoor_air_by_hand() {
    let mut d = office();
    d.zones.push(vent_zone(
        1,
        "conf",
        8_000.0,
        2_000.0,
        "conference",
        500.0,
        20.0,
    ));
    d.ahus[0].serves.push(at(ZoneId(1)));
    d.ahus[0].outdoor_air = Some(at(OutdoorAir::All));
    let c = result(&d).cooling;
    assert_eq!(c.ventilation.procedure, VentilationProcedure::AllOutdoorAir);
    assert_close!(c.ventilation_required_cfm, 300.0, 1e-12);
    assert_eq!(c.outdoor_air_fraction, 1.0);
    assert_close!(c.states.mixed.w_lb_lb, c.states.outdoor.w_lb_lb, 1e-12);
    assert_close!(c.states.mixed.tdb_f, 95.0, 1e-9);
}

/// Every outdoor-air form of the key list: cfm at the outdoor state, % of
/// supply mass, per person (× Σ P), per area (× Σ A) (§4a, README choices 12–13).
#[test]
fn outdoor_air_forms() {
    let mut d = office();
    let v_o = |c: &CaseResult| c.states.outdoor.v_ft3_lb;
    d.ahus[0].outdoor_air = Some(at(OutdoorAir::Airflow { cfm: 400.0 }));
    let c = result(&d).cooling;
    assert_close!(c.outdoor_airflow_cfm, 400.0, 1e-12);
    assert_close!(c.outdoor_air_lb_h, 400.0 * 60.0 / v_o(&c), 1e-12);
    d.ahus[0].outdoor_air = Some(at(OutdoorAir::FractionOfSupply { fraction: 0.3 }));
    assert_close!(result(&d).cooling.outdoor_air_fraction, 0.3, 1e-12);
    d.ahus[0].outdoor_air = Some(at(OutdoorAir::PerPerson { cfm: 15.0 }));
    assert_close!(result(&d).cooling.outdoor_airflow_cfm, 150.0, 1e-12);
    d.ahus[0].outdoor_air = Some(at(OutdoorAir::PerArea { cfm_per_ft2: 0.1 }));
    assert_close!(result(&d).cooling.outdoor_airflow_cfm, 200.0, 1e-12);
}

/// Outdoor air below the 62.1 minimum is a finding with both numbers, at
/// the `outdoor_air` key (methods.md §5; README choice 17).
#[test]
fn ventilation_shortfall_finding() {
    let mut d = office();
    d.ahus[0].outdoor_air = Some(at_n(OutdoorAir::Airflow { cfm: 100.0 }, 5));
    let r = result(&d);
    assert!(r.cooling.ventilation_shortfall());
    assert_close!(r.cooling.ventilation_shortfall_cfm, 70.0, 1e-12);
    let f = r
        .findings
        .iter()
        .find(|f| matches!(f.kind, FindingKind::VentilationShortfall { .. }));
    match f {
        Some(Finding {
            kind:
                FindingKind::VentilationShortfall {
                    provided_cfm,
                    required_cfm,
                },
            case: Some(DesignCase::Cooling),
            loc,
        }) => {
            assert_close!(*provided_cfm, 100.0, 1e-12);
            assert_close!(*required_cfm, 170.0, 1e-12);
            assert_eq!(*loc, loc_n(5));
        }
        other => panic!("{other:?}"),
    }
}

/// A recirculating unit cannot take more outdoor air than it supplies (§4a).
#[test]
fn outdoor_air_above_supply_is_an_error() {
    let mut d = office();
    d.ahus[0].outdoor_air = Some(at(OutdoorAir::Airflow { cfm: 5_000.0 }));
    assert!(matches!(
        error(&d),
        EngineError::OutdoorAirExceedsSupply { fraction, .. } if fraction > 1.0
    ));
}

/// The outdoor-air fan's rise goes on the outdoor stream before mixing
/// (README choice 14).
#[test]
fn outdoor_fan_rise() {
    let mut d = office();
    d.ahus[0].outdoor_fan_rise_f = Some(at(1.5));
    let c = result(&d).cooling;
    let after = c
        .states
        .outdoor_after_fan
        .unwrap_or_else(|| panic!("state"));
    assert_close!(after.tdb_f, 96.5, 1e-12);
    assert_eq!(after.w_lb_lb, c.states.outdoor.w_lb_lb);
}

// --- step 9: mixing --------------------------------------------------

/// Mixing by mass and energy (methods.md step 9): W_m and h_m are the
/// mass-weighted means; t_m = (h − 1061 W)/(0.240 + 0.444 W) (Fundamentals eq. 30).
#[test]
fn mixing_by_mass_and_energy() {
    let mut d = office();
    d.ahus[0].outdoor_air = Some(at(OutdoorAir::FractionOfSupply { fraction: 0.25 }));
    let c = result(&d).cooling;
    let (o, r, m) = (c.states.outdoor, c.states.return_air, c.states.mixed);
    assert_close!(m.w_lb_lb, 0.25 * o.w_lb_lb + 0.75 * r.w_lb_lb, 1e-12);
    assert_close!(m.h_btu_lb, 0.25 * o.h_btu_lb + 0.75 * r.h_btu_lb, 1e-12);
    assert_close!(
        m.tdb_f,
        (m.h_btu_lb - 1061.0 * m.w_lb_lb) / (0.240 + 0.444 * m.w_lb_lb),
        1e-12
    );
}

// --- step 10: the coil -------------------------------------------------

/// Coil energy balance with the condensate at t_off (HVAC Systems and
/// Equipment, cooling coils, from memory): Q_c = m[(h_on − h_off) −
/// (W_on − W_off)(t_off − 32)]; sensible m c_p(W_off)(t_on − t_off); the
/// rest latent; tons = Q/12,000; condensate m ΔW at 8.34 lb/gal;
/// chilled water Q/(500 Δt) (*common practice*).
#[test]
fn coil_loads_by_hand() {
    let mut d = office();
    d.ahus[0].coil = Some(Coil {
        chilled_water: Some(at((44.0, 56.0))),
        face_area_ft2: Some(at(2.0)),
        ..coil()
    });
    let c = result(&d).cooling;
    let (on, off) = (c.states.entering, c.states.leaving);
    let m = c.dry_air_flow_lb_h;
    let q = m * ((on.h_btu_lb - off.h_btu_lb) - (on.w_lb_lb - off.w_lb_lb) * (off.tdb_f - 32.0));
    assert_close!(c.coil.total_btuh, q, 1e-9);
    let qs = m * (0.240 + 0.444 * off.w_lb_lb) * (on.tdb_f - off.tdb_f);
    assert_close!(c.coil.sensible_btuh, qs, 1e-12);
    assert_close!(c.coil.latent_btuh, q - qs, 1e-9);
    assert_close!(c.coil.tons, q / 12_000.0, 1e-9);
    assert_close!(c.coil.shr, qs / q, 1e-9);
    let cond = m * (on.w_lb_lb - off.w_lb_lb);
    assert_close!(c.coil.condensate_lb_h, cond, 1e-9);
    assert_close!(c.coil.condensate_gal_h, cond / 8.34, 1e-9);
    assert_close!(
        c.coil.chilled_water_gpm.unwrap_or(f64::NAN),
        q / (500.0 * 12.0),
        1e-9
    );
    assert_close!(
        c.coil.face_velocity_fpm.unwrap_or(f64::NAN),
        c.supply_airflow_cfm / 2.0,
        1e-12
    );
    assert_close!(
        c.coil.cfm_per_ton,
        c.supply_airflow_cfm / c.coil.tons,
        1e-12
    );
    assert!(!c.coil.dry);
}

/// Apparatus dew point (methods.md step 10, README choice 21): on the
/// saturation curve and on the entering–leaving line; BF = (t_off − ADP)/(t_on − ADP).
#[test]
fn apparatus_dew_point_and_bypass_factor() {
    let c = result(&office()).cooling;
    let (on, off) = (c.states.entering, c.states.leaving);
    let adp = c.coil.adp_f;
    let line =
        off.w_lb_lb + (on.w_lb_lb - off.w_lb_lb) / (on.tdb_f - off.tdb_f) * (adp - off.tdb_f);
    let sat = ip::sat_hum_ratio(adp, 14.696).unwrap_or(f64::NAN);
    assert_close!(line, sat, 1e-7);
    assert!(adp < off.tdb_f);
    assert_close!(
        c.coil.bypass_factor,
        (off.tdb_f - adp) / (on.tdb_f - adp),
        1e-12
    );
    assert!(c.coil.bypass_factor > 0.0 && c.coil.bypass_factor < 0.3);
}

/// A dry coil (a desert site): nothing condenses, W_off = W_s = W_on, the
/// latent load is zero and the ADP is the entering dew point (methods.md
/// step 10, README choice 19); the fixed point converges to 1e-12.
#[test]
fn dry_coil_fixed_point() {
    let mut d = office();
    d.site = Some(site(4_000.0, 100.0, 58.0));
    d.zones[0].latent_btuh = Some(at(500.0));
    d.ahus[0].outdoor_air = Some(at(OutdoorAir::FractionOfSupply { fraction: 0.3 }));
    let r = result(&d);
    let c = &r.cooling;
    assert!(c.coil.dry);
    assert!(c.iterations.dry_coil > 0);
    assert!((c.states.entering.w_lb_lb - c.states.leaving.w_lb_lb).abs() < 1e-12);
    assert_eq!(c.states.leaving.w_lb_lb, c.states.supply.w_lb_lb);
    assert_eq!(c.coil.condensate_lb_h, 0.0);
    assert_eq!(c.coil.latent_btuh, 0.0);
    assert!((c.coil.adp_f - c.states.entering.tdp_f).abs() < 1e-4);
    assert!(c.states.leaving.rh_pct < 95.0);
    // The fixed point holds: W_on from the mixing of outdoor and return.
    let x = c.outdoor_air_fraction;
    let w_on = x * c.states.outdoor.w_lb_lb + (1.0 - x) * c.states.return_air.w_lb_lb;
    assert!((w_on - c.states.supply.w_lb_lb).abs() < 1e-11);
    assert!(
        r.findings
            .iter()
            .any(|f| matches!(f.kind, FindingKind::DryCoil { .. }))
    );
}

// --- step 11: capacity -------------------------------------------------

/// Capacity status (methods.md step 11): below required → undersized;
/// more than 25 % above → oversized (*common practice*); else ok; none → unrated.
#[test]
fn capacity_status() {
    let mut d = office();
    let total = result(&d).cooling.coil.total_btuh;
    let status = |d: &mut Design, rated: f64, rated_s: Option<f64>| {
        d.ahus[0].coil = Some(Coil {
            rated_btuh: Some(at(rated)),
            rated_sensible_btuh: rated_s.map(at),
            ..coil()
        });
        result(d).cooling.capacity
    };
    assert_eq!(
        status(&mut d, total * 0.95, None).status,
        CapacityStatus::Undersized
    );
    let ok = status(&mut d, total * 1.10, None);
    assert_eq!(ok.status, CapacityStatus::Ok);
    assert_close!(ok.margin.unwrap_or(f64::NAN), 0.10, 1e-9);
    assert_eq!(
        status(&mut d, total * 1.30, None).status,
        CapacityStatus::Oversized
    );
    // Enough total but too little sensible is undersized.
    assert_eq!(
        status(&mut d, total * 1.10, Some(1_000.0)).status,
        CapacityStatus::Undersized
    );
    d.ahus[0].coil = None;
    assert_eq!(result(&d).cooling.capacity.status, CapacityStatus::Unrated);
}

// --- step 12: standard air ----------------------------------------------

/// Standard-air rules at sea level for a 75 °F / 50 % room (*common
/// practice*): the exact airflow is within 3 % of q_s/(1.08 ΔT) and the
/// coil load within 3 % of 4.5·cfm·Δh.
#[test]
fn standard_air_rules_at_sea_level() {
    for (db, wb, oa) in [(95.0, 75.0, 0.15), (91.0, 74.0, 0.25), (100.0, 72.0, 0.10)] {
        let mut d = office();
        d.site = Some(site(0.0, db, wb));
        d.ahus[0].outdoor_air = Some(at(OutdoorAir::FractionOfSupply { fraction: oa }));
        let c = result(&d).cooling;
        let rule_cfm = 24_000.0 / (1.08 * 18.0);
        assert!(
            (c.supply_airflow_cfm / rule_cfm - 1.0).abs() < 0.03,
            "{db}: {}",
            c.supply_airflow_cfm
        );
        let dh = c.states.entering.h_btu_lb - c.states.leaving.h_btu_lb;
        let rule_coil = 4.5 * c.supply_airflow_cfm * dh;
        assert!((c.coil.total_btuh / rule_coil - 1.0).abs() < 0.03, "{db}");
        assert_close!(c.standard_air.supply_airflow_cfm, rule_cfm, 1e-12);
        assert_close!(c.standard_air.coil_total_btuh, rule_coil, 1e-9);
        assert_close!(
            c.standard_air.supply_airflow_diff_pct,
            100.0 * (rule_cfm / c.supply_airflow_cfm - 1.0),
            1e-9
        );
    }
}

/// At 5,000 ft the standard-air airflow is well off (air is ~17 % lighter),
/// which is why the exact figure is the answer (methods.md step 12).
#[test]
fn standard_air_is_off_at_elevation() {
    let mut d = office();
    d.site = Some(site(5_000.0, 93.0, 62.0));
    let c = result(&d).cooling;
    assert!(c.standard_air.supply_airflow_diff_pct < -10.0);
}

// --- §1: the dehumidification design case -------------------------------

/// Both cases are solved with the same inputs; the larger total governs
/// (methods.md §1, README choice 24).
#[test]
fn dehumidification_case_governs_when_larger() {
    let mut d = office();
    if let Some(s) = d.site.as_mut() {
        s.cooling = Some(at(AirSpec::DbWb {
            db_f: 91.0,
            wb_f: 70.0,
        }));
        s.dehumid = Some(at(AirSpec::DbDp {
            db_f: 82.0,
            dp_f: 74.0,
        }));
    }
    d.ahus[0].outdoor_air = Some(at(OutdoorAir::FractionOfSupply { fraction: 0.4 }));
    let r = result(&d);
    let dh = r.dehumid.as_ref().unwrap_or_else(|| panic!("dehumid"));
    assert!(dh.coil.total_btuh > r.cooling.coil.total_btuh);
    assert_eq!(r.governing, DesignCase::Dehumid);
    assert_eq!(r.governing().case, DesignCase::Dehumid);
    assert_eq!(dh.outdoor_air_fraction, r.cooling.outdoor_air_fraction);
}

// --- findings and errors -------------------------------------------------

/// A dense meeting room runs above its design humidity, a very dense one
/// above 65 % (methods.md §5; README choice 10), located at the zone.
#[test]
fn room_humidity_findings() {
    let mut d = office();
    d.zones.push(Zone {
        name_loc: loc_n(9),
        ..vent_zone(1, "meeting", 6_000.0, 9_000.0, "conference", 600.0, 40.0)
    });
    d.ahus[0].serves.push(at(ZoneId(1)));
    let r = result(&d);
    let z = &r.cooling.zones[1];
    assert!(z.above_design_humidity && z.room_rh_pct > 65.0);
    let kinds: Vec<_> = r
        .findings
        .iter()
        .filter(|f| f.loc == loc_n(9))
        .map(|f| &f.kind)
        .collect();
    assert!(
        kinds
            .iter()
            .any(|k| matches!(k, FindingKind::RoomAboveDesignHumidity { .. }))
    );
    assert!(
        kinds
            .iter()
            .any(|k| matches!(k, FindingKind::RoomRhAboveLimit { .. }))
    );
}

/// Plausibility findings (methods.md §5, *common practice*): supply ΔT
/// outside 10–25 °F, cfm/ton outside 300–500, face velocity above 500 fpm.
#[test]
fn plausibility_findings() {
    let mut d = office();
    d.ahus[0].supply = Some(at(SupplyTemp::Temp { f: 67.0 }));
    d.ahus[0].coil = Some(Coil {
        face_area_ft2: Some(at(1.0)),
        ..coil()
    });
    let r = result(&d);
    let has = |p: &dyn Fn(&FindingKind) -> bool| r.findings.iter().any(|f| p(&f.kind));
    assert!(has(
        &|k| matches!(k, FindingKind::SupplyDtOutOfRange { dt_f, .. } if *dt_f == 8.0)
    ));
    assert!(has(&|k| matches!(k, FindingKind::FaceVelocityHigh { .. })));
    assert!(has(&|k| matches!(
        k,
        FindingKind::CfmPerTonOutOfRange { .. }
    )));
}

/// Leaving air not drier than a zone's design state: the coil cannot hold the
/// zone at its design humidity (methods.md §5, README choice 26). A dry design
/// state (75 °F, 35 %rh, W ≈ 0.0065 lb/lb) against a coil leaving at about
/// 53 °F and 95 % (W ≈ 0.0083 lb/lb) fires it; the ordinary 50 %rh design
/// does not, even with no latent load (the old comparison with the resulting
/// room state fired there, wrongly).
#[test]
fn coil_cannot_dehumidify_a_zone_with_a_drier_design_state() {
    let mut d = office();
    d.zones[0].indoor = Some(at(AirSpec::DbRh {
        db_f: 75.0,
        rh: 0.35,
    }));
    let r = result(&d);
    let hit = r.findings.iter().find_map(|f| match f.kind {
        FindingKind::CoilCannotDehumidify {
            leaving_w_lb_lb,
            design_w_lb_lb,
            ..
        } => Some((leaving_w_lb_lb, design_w_lb_lb)),
        _ => None,
    });
    let (leaving, design) = hit.expect("the finding");
    assert!(leaving > design, "{leaving} vs {design}");

    let mut d = office();
    d.zones[0].latent_btuh = Some(at(0.0));
    d.zones[0].indoor = Some(at(AirSpec::DbRh {
        db_f: 75.0,
        rh: 0.5,
    }));
    d.ahus[0].outdoor_air = Some(at(OutdoorAir::FractionOfSupply { fraction: 0.0 }));
    let r = result(&d);
    assert!(
        !r.findings
            .iter()
            .any(|f| matches!(f.kind, FindingKind::CoilCannotDehumidify { .. }))
    );
}

/// An unknown `use` is a zone finding (for a nearest-name suggestion from
/// the exported table) and leaves its air handler out.
#[test]
fn unknown_category() {
    let mut d = office();
    d.zones[0].category = Some(at_n("ofice".to_string(), 6));
    let e = evaluate(&d);
    assert!(e.findings.iter().any(|f| matches!(
        &f.kind,
        FindingKind::UnknownCategory { written, .. } if written == "ofice"
    ) && f.loc == loc_n(6)));
    assert!(matches!(
        &e.ahus[0].result,
        Err(EngineError::UnknownCategory { loc, .. }) if *loc == loc_n(6)
    ));
    assert!(VENTILATION_CATEGORIES.iter().any(|c| c.name == "office"));
}

/// Inputs outside what the method accepts are typed errors at their key.
#[test]
fn invalid_inputs_are_errors() {
    let mut d = office();
    d.zones[0].area_ft2 = Some(at_n(-10.0, 2));
    let e = evaluate(&d);
    assert!(matches!(
        e.zones[0].inputs,
        Err(EngineError::InvalidInput { key: "area", .. })
    ));
    assert!(matches!(
        e.ahus[0].result,
        Err(EngineError::ZoneUnusable { .. })
    ));
    let mut d = office();
    d.ahus[0].coil = Some(Coil {
        leaving_rh: Some(at(1.05)),
        ..coil()
    });
    assert!(matches!(
        error(&d),
        EngineError::InvalidInput {
            key: "leaving_rh",
            ..
        }
    ));
    let mut d = office();
    d.ahus[0].diversity = Some(at(f64::NAN));
    assert!(matches!(
        error(&d),
        EngineError::InputNotFinite {
            key: "diversity",
            ..
        }
    ));
    let mut d = office();
    d.ahus[0].fan = Some(Fan {
        power: Some(at(FanPower::Shaft { hp: 1.0 })),
        rise_f: Some(at(1.0)),
        ..fan()
    });
    assert!(matches!(error(&d), EngineError::ConflictingInputs { .. }));
    let mut d = office();
    d.ahus[0].serves.clear();
    assert!(matches!(
        error(&d),
        EngineError::MissingInput { key: "serves", .. }
    ));
    let mut d = office();
    d.ahus[0].serves.push(at(ZoneId(0)));
    assert!(matches!(error(&d), EngineError::ZoneServedTwice { .. }));
    let mut d = office();
    d.zones[0].sensible_btuh = None;
    assert!(matches!(
        evaluate(&d).zones[0].inputs,
        Err(EngineError::MissingInput {
            key: "sensible",
            ..
        })
    ));
}

/// Each default used is reported with its key and source (methods.md, the
/// key list); given values are not.
#[test]
fn assumptions_name_each_default() {
    let r = result(&office());
    let keys: Vec<&str> = r.assumptions.iter().map(|a| a.key).collect();
    for k in [
        "indoor",
        "distribution_effectiveness",
        "supply_temp",
        "diversity",
        "supply_duct",
        "return_duct",
        "outdoor_air",
        "fan",
        "leaving_rh",
    ] {
        assert!(keys.contains(&k), "{k} missing from {keys:?}");
    }
    // Given in the zone: area, people, use, sensible, latent.
    for k in ["area", "people", "use", "latent", "occupant_diversity"] {
        assert!(!keys.contains(&k), "{k} should not be assumed");
    }
    let st = r.assumptions.iter().find(|a| a.key == "supply_temp");
    assert!(matches!(
        st.map(|a| a.value),
        Some(AssumedValue::BelowLowestRoom { dt_f, supply_f }) if dt_f == 18.0 && supply_f == 57.0
    ));
}

/// Zone results: served-by, and the flow at the governing case.
#[test]
fn zone_results() {
    let mut d = office();
    d.zones.push(zone(1, "orphan", 1_000.0, 0.0));
    let e = evaluate(&d);
    assert_eq!(e.zones[0].served_by, vec![0]);
    let f = e.zones[0].flow.as_ref().unwrap_or_else(|| panic!("flow"));
    assert_close!(f.v_oz_cfm, 170.0, 1e-12);
    assert!(e.zones[1].served_by.is_empty() && e.zones[1].flow.is_none());
}

/// A coil leaving saturated (leaving_rh 100 %) has its ADP at the leaving
/// state and a bypass factor of zero (README choice 21); a leaving RH below
/// 85 % is a finding (methods.md §5, *common practice*).
#[test]
fn saturated_and_low_leaving_rh() {
    let mut d = office();
    d.ahus[0].coil = Some(Coil {
        leaving_rh: Some(at(1.0)),
        ..coil()
    });
    let c = result(&d).cooling;
    assert!((c.coil.adp_f - c.states.leaving.tdb_f).abs() < 1e-6);
    assert!(c.coil.bypass_factor.abs() < 1e-6);
    d.ahus[0].coil = Some(Coil {
        leaving_rh: Some(at_n(0.80, 8)),
        ..coil()
    });
    let r = result(&d);
    assert!(r.findings.iter().any(|f| matches!(
        f.kind,
        FindingKind::LeavingRhLow { leaving_rh_pct, .. } if (leaving_rh_pct - 80.0).abs() < 1e-6
    ) && f.loc == loc_n(8)));
}
