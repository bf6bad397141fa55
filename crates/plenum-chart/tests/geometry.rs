//! The chart model's geometry: curves where plenum-psychro (and psychrolib)
//! put them, states where the engine puts them, axes around them, the
//! process in order, and labels that do not collide.

#![allow(clippy::unwrap_used)]

mod common;

use plenum_chart::geom::{Pt, Rect};
use plenum_chart::{Chart, ChartError, LabelOf, LegKind, StateKind, Subject};
use plenum_engine::{DesignCase, StatePoint};
use plenum_psychro::{PA_PER_PSI, ip, si};
use plenum_units::UnitSystem;

fn rel(a: f64, b: f64) -> f64 {
    ((a - b) / b).abs()
}

fn k(units: UnitSystem) -> f64 {
    match units {
        UnitSystem::Ip => ip::GRAINS_PER_POUND,
        UnitSystem::Si => 1000.0,
    }
}

fn w_sat(units: UnitSystem, t: f64, p_psia: f64) -> f64 {
    match units {
        UnitSystem::Ip => ip::sat_hum_ratio(t, p_psia).unwrap(),
        UnitSystem::Si => si::sat_hum_ratio(t, p_psia * PA_PER_PSI).unwrap(),
    }
}

fn engine_states(ex: &str, ahu: &str) -> Vec<(StateKind, StatePoint)> {
    let (_, eval) = common::load(ex);
    let a = eval.ahus.iter().find(|a| a.name == ahu).unwrap();
    let s = a.result.as_ref().unwrap().governing().states;
    let mut v = vec![(StateKind::Outdoor, s.outdoor)];
    if let Some(f) = s.outdoor_after_fan {
        v.push((StateKind::OutdoorAfterFan, f));
    }
    v.extend([
        (StateKind::Return, s.return_air),
        (StateKind::Mixed, s.mixed),
        (StateKind::Entering, s.entering),
        (StateKind::Leaving, s.leaving),
        (StateKind::Supply, s.supply),
        (StateKind::Room, s.room),
    ]);
    v
}

#[test]
fn saturation_curve_points_are_plenum_psychro_at_the_site_pressure() {
    for (ex, ahu, units, c) in common::all_charts() {
        let (ex, ahu, units) = (ex.as_str(), ahu.as_str(), *units);
        let (_, eval) = common::load(ex);
        let p = eval.site.as_ref().unwrap().pressure_psia;
        assert_eq!(c.pressure_psia, p);
        assert!(c.saturation.len() > 20, "{ex} {ahu}");
        for q in &c.saturation {
            let w = w_sat(units, q.x, p) * k(units);
            // Every point but the last is a sample; the last is where the
            // curve meets the top of the axes, found by bisection.
            assert!(
                rel(q.y, w) < 1e-9,
                "{ex} {ahu} {units:?} at {}: {} vs {w}",
                q.x,
                q.y
            );
            assert!(q.x >= c.x.min && q.x <= c.x.max && q.y >= c.y.min && q.y <= c.y.max);
        }
        assert_eq!(c.saturation[0].x, c.x.min);
        let last = c.saturation.last().unwrap();
        assert!(
            (last.y - c.y.max).abs() < 1e-6 * c.y.max || last.x == c.x.max,
            "the curve runs to the top or the right edge"
        );
    }
}

#[test]
fn the_site_pressure_is_the_standard_atmosphere_at_the_examples_elevation() {
    // psychrolib 2.5.0 GetStandardAtmPressure(1250 ft) = 14.04412... psia,
    // computed for this check with the project's pinned version: (p = 14.696
    // (1 − 6.8754e-6 · 1250)^5.2559, ASHRAE Handbook—Fundamentals 2017 ch. 1 eq. 3).
    let (_, eval) = common::load("library.plenum");
    let p = eval.site.as_ref().unwrap().pressure_psia;
    let by_formula = 14.696 * (1.0 - 6.8754e-6 * 1250.0_f64).powf(5.2559);
    assert!(rel(p, by_formula) < 1e-12);
    let chart = plenum_chart::chart_of(&common::load("library.plenum").0, &eval, 0, UnitSystem::Ip)
        .unwrap();
    assert!(chart.title.lines[0].contains("1,250 ft"));
    assert!(chart.title.lines[0].contains("14.044 psia"));
}

/// Rows of a committed reference table of psychrolib 2.5.0 (tests/reference/psychro).
fn reference_rows(file: &str, elevation: &str) -> Vec<(f64, f64, f64, f64)> {
    let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("../../tests/reference/psychro")
        .join(file);
    let text = std::fs::read_to_string(path).unwrap();
    text.lines()
        .filter(|l| !l.starts_with('#') && !l.starts_with("elevation"))
        .filter_map(|l| {
            let f: Vec<&str> = l.split(',').collect();
            (f[0] == elevation).then(|| {
                let n = |i: usize| f[i].parse::<f64>().unwrap();
                // (pressure, tdb, rh, pl_w)
                (n(1), n(2), n(3), n(4))
            })
        })
        .collect()
}

/// The chart's polyline at `x`, linearly interpolated.
fn at_x(points: &[Pt], x: f64) -> Option<f64> {
    points.windows(2).find_map(|w| {
        (w[0].x <= x && x <= w[1].x)
            .then(|| w[0].y + (w[1].y - w[0].y) * (x - w[0].x) / (w[1].x - w[0].x))
    })
}

fn design_chart(text: &str, units: UnitSystem) -> Chart {
    let (design, diags) = plenum_model::lower_text(text);
    assert!(diags.is_empty(), "{diags:?}");
    let eval = plenum_engine::evaluate(&design);
    plenum_chart::chart_of(&design, &eval, 0, units).unwrap()
}

#[test]
fn curves_drawn_match_psychrolib_tables_at_5000_ft_and_1500_m() {
    // Tolerance 0.05 % on W (methods.md §2's accuracy target), which covers
    // the linear interpolation between the chart's samples.
    let ip_chart = design_chart(
        "site { elevation 5_000 ft; cooling 95 °F db, 62 °F wb }\n\
         zone a { area 1_000 ft²; people 5; use office; sensible 20 kBtu/h; latent 2 kBtu/h }\n\
         ahu u { serves a }\n",
        UnitSystem::Ip,
    );
    let si_chart = design_chart(
        "site { elevation 1_500 m; cooling 35 °C db, 17 °C wb }\n\
         zone a { area 100 m²; people 5; use office; sensible 6 kW; latent 0.6 kW }\n\
         ahu u { serves a }\n",
        UnitSystem::Si,
    );
    for (c, file, elevation, p_to_psia) in [
        (&ip_chart, "ip_rh.csv", "5000", 1.0),
        (&si_chart, "si_rh.csv", "1500", 1.0 / PA_PER_PSI),
    ] {
        let rows = reference_rows(file, elevation);
        assert!(!rows.is_empty());
        assert!(rel(c.pressure_psia, rows[0].0 * p_to_psia) < 1e-5);
        let mut checked = 0;
        for (_, t, rh, w) in rows {
            let curve = if rh == 1.0 {
                Some(&c.saturation)
            } else {
                c.rh_curves
                    .iter()
                    .find(|r| {
                        f64::from(r.percent) == (rh * 100.0).round()
                            && (rh * 10.0).fract().abs() < 1e-9
                    })
                    .map(|r| &r.points)
            };
            let Some(curve) = curve else { continue };
            let Some(y) = at_x(curve, t) else { continue };
            let want = w * k(c.units);
            assert!(rel(y, want) < 5e-4, "{file} {t} {rh}: {y} vs {want}");
            checked += 1;
        }
        assert!(checked >= 6, "{file}: only {checked} rows inside the chart");
    }
}

#[test]
fn rh_curves_and_enthalpy_lines_are_plenum_psychro() {
    for (ex, ahu, units, c) in common::all_charts() {
        let (ex, ahu, units) = (ex.as_str(), ahu.as_str(), *units);
        let p = c.pressure_psia;
        assert_eq!(
            c.rh_curves.iter().map(|r| r.percent).collect::<Vec<_>>(),
            vec![10, 20, 30, 40, 50, 60, 70, 80, 90],
            "{ex} {ahu}"
        );
        for r in &c.rh_curves {
            let rh = f64::from(r.percent) / 100.0;
            for q in &r.points {
                let w = match units {
                    UnitSystem::Ip => ip::hum_ratio_from_rh(q.x, rh, p).unwrap(),
                    UnitSystem::Si => si::hum_ratio_from_rh(q.x, rh, p * PA_PER_PSI).unwrap(),
                } * k(units);
                assert!(rel(q.y, w) < 1e-9, "{ex} {ahu} rh {}", r.percent);
            }
        }
        assert!(c.enthalpy_lines.len() >= 3, "{ex} {ahu}");
        for e in &c.enthalpy_lines {
            for q in &e.points {
                let h = match units {
                    UnitSystem::Ip => ip::enthalpy(q.x, q.y / k(units)).unwrap(),
                    UnitSystem::Si => si::enthalpy(q.x, q.y / k(units)).unwrap(),
                };
                assert!(
                    (h - e.h).abs() < 1e-7 * (1.0 + e.h.abs()),
                    "{ex} {ahu} h {}",
                    e.h
                );
                assert!(q.x >= c.x.min - 1e-9 && q.x <= c.x.max + 1e-9);
                assert!(q.y >= c.y.min - 1e-9 && q.y <= c.y.max + 1e-9);
            }
            // Labelled lines step evenly.
            assert!((e.h / c.enthalpy_step - (e.h / c.enthalpy_step).round()).abs() < 1e-9);
        }
    }
}

#[test]
fn state_markers_sit_at_the_engine_states() {
    for (ex, ahu, units, c) in common::all_charts() {
        let (ex, ahu, units) = (ex.as_str(), ahu.as_str(), *units);
        let engine = engine_states(ex, ahu);
        assert_eq!(c.states.len(), engine.len());
        for (s, (kind, sp)) in c.states.iter().zip(&engine) {
            assert_eq!(s.kind, *kind);
            let (t, w) = match units {
                UnitSystem::Ip => (sp.tdb_f, sp.w_lb_lb * 7000.0),
                // °C = (°F − 32) / 1.8 (NIST SP 811 B.8); g/kg = 1000 kg/kg.
                UnitSystem::Si => ((sp.tdb_f - 32.0) / 1.8, sp.w_lb_lb * 1000.0),
            };
            assert!((s.at.x - t).abs() < 1e-9, "{ex} {ahu} {kind:?}");
            assert!(rel(s.at.y, w) < 1e-12, "{ex} {ahu} {kind:?}");
            assert_eq!(s.at, Pt::new(s.values.tdb, s.values.w_axis));
            // The marker of the state is where the state is.
            let m = c.markers.iter().find(|m| m.kinds.contains(kind)).unwrap();
            assert!(m.at.dist(s.at) <= 1e-3 * (c.x.max - c.x.min).hypot(c.y.max - c.y.min));
        }
        // Every marker stands for at least one state, and no state twice.
        let n: usize = c.markers.iter().map(|m| m.kinds.len()).sum();
        assert_eq!(n, c.states.len());
    }
}

#[test]
fn axes_contain_every_state_its_dew_point_and_the_adp_with_margins() {
    for (ex, ahu, units, c) in common::all_charts() {
        let (ex, ahu, units) = (ex.as_str(), ahu.as_str(), *units);
        let margin = match units {
            UnitSystem::Ip => 3.0,
            UnitSystem::Si => 1.5,
        };
        assert_eq!(c.y.min, 0.0);
        for s in &c.states {
            let v = s.values;
            assert!(v.tdb <= c.x.max - margin + 1e-9, "{ex} {ahu} {:?}", s.kind);
            assert!(v.tdp >= c.x.min + margin - 1e-9, "{ex} {ahu} {:?}", s.kind);
            assert!(v.tdb >= v.tdp);
            assert!(v.w_axis < c.y.max && v.w_axis > c.y.min);
        }
        if let Some(a) = &c.adp {
            assert!(a.t >= c.x.min + margin - 1e-9);
            assert!(rel(a.at.y, w_sat(units, a.t, c.pressure_psia) * k(units)) < 1e-12);
        }
        // Ticks are whole steps from end to end.
        assert_eq!(c.x.ticks.first(), Some(&c.x.min));
        assert_eq!(c.x.ticks.last(), Some(&c.x.max));
        assert!(c.x.ticks.len() >= 5 && c.y.ticks.len() >= 5);
        // The saturation curve beside the most humid state is in view.
        let most = c
            .states
            .iter()
            .max_by(|a, b| a.values.w.total_cmp(&b.values.w))
            .unwrap();
        assert!(c.saturation.iter().any(|p| p.y >= most.at.y));
    }
}

#[test]
fn process_legs_run_in_order_between_the_states() {
    let charts = common::all_charts();
    let find = |ex: &str, ahu: &str| {
        charts
            .iter()
            .find(|c| c.0 == ex && c.1 == ahu && c.2 == UnitSystem::Ip)
            .map(|c| &c.3)
            .unwrap()
    };
    let at = |c: &Chart, k: StateKind| c.states.iter().find(|s| s.kind == k).unwrap().at;
    // Draw-through unit with ducts both ways: mixed = entering.
    let c = find("library.plenum", "ahu_1");
    let kinds: Vec<LegKind> = c.legs.iter().map(|l| l.kind).collect();
    assert_eq!(
        kinds,
        [
            LegKind::Mixing,
            LegKind::Mixing,
            LegKind::Coil,
            LegKind::CoilToAdp,
            LegKind::SupplyHeat,
            LegKind::RoomLine,
            LegKind::ReturnHeat
        ]
    );
    let ends: Vec<(Pt, Pt)> = c.legs.iter().map(|l| (l.from, l.to)).collect();
    assert_eq!(
        ends[0],
        (at(c, StateKind::Outdoor), at(c, StateKind::Mixed))
    );
    assert_eq!(ends[1], (at(c, StateKind::Return), at(c, StateKind::Mixed)));
    assert_eq!(
        ends[2],
        (at(c, StateKind::Entering), at(c, StateKind::Leaving))
    );
    assert_eq!(ends[3], (at(c, StateKind::Leaving), c.adp.unwrap().at));
    assert_eq!(
        ends[4],
        (at(c, StateKind::Leaving), at(c, StateKind::Supply))
    );
    assert_eq!(ends[5], (at(c, StateKind::Supply), at(c, StateKind::Room)));
    assert_eq!(ends[6], (at(c, StateKind::Room), at(c, StateKind::Return)));
    assert!(c.markers.iter().any(|m| m.name == "Mixed = Entering coil"));
    // The mixed state lies on the straight mixing line (mass and energy
    // balance; in (t, W) it is straight to within the curvature of h(t, W)).
    let (o, r, m) = (
        at(c, StateKind::Outdoor),
        at(c, StateKind::Return),
        at(c, StateKind::Mixed),
    );
    let cross = (m.x - r.x) * (o.y - r.y) - (m.y - r.y) * (o.x - r.x);
    assert!(cross.abs() / (o.dist(r) * o.dist(r)) < 2e-3);
    // The coil line extended meets saturation at the ADP.
    let (e, l, a) = (
        at(c, StateKind::Entering),
        at(c, StateKind::Leaving),
        c.adp.unwrap().at,
    );
    let slope = (e.y - l.y) / (e.x - l.x);
    assert!((l.y + slope * (a.x - l.x) - a.y).abs() < 0.01);

    // Blow-through unit without a return duct: a fan leg before the coil,
    // return = room, no return leg.
    let c = find("library.plenum", "ahu_2");
    let kinds: Vec<LegKind> = c.legs.iter().map(|l| l.kind).collect();
    assert_eq!(
        kinds,
        [
            LegKind::Mixing,
            LegKind::Mixing,
            LegKind::BlowThroughFan,
            LegKind::Coil,
            LegKind::CoilToAdp,
            LegKind::SupplyHeat,
            LegKind::RoomLine
        ]
    );
    assert!(c.markers.iter().any(|m| m.name == "Return = Room"));
    let bt = c.legs[2];
    assert_eq!(
        (bt.from, bt.to),
        (at(c, StateKind::Mixed), at(c, StateKind::Entering))
    );
    assert_eq!(bt.from.y, bt.to.y, "fan heat is sensible only");
}

fn assert_labels_clear(ex: &str, ahu: &str, units: UnitSystem, c: &Chart) {
    let f = c.frame;
    let ctx = format!("{ex} {ahu} {units:?}");
    assert_eq!(
        c.labels.len(),
        c.markers.len() + usize::from(c.adp.is_some())
    );
    for (i, m) in c.markers.iter().enumerate() {
        let n = c
            .labels
            .iter()
            .filter(|l| l.of == LabelOf::Marker(i))
            .count();
        assert_eq!(n, 1, "{ctx}: one label for {}", m.name);
    }
    let markers: Vec<Pt> = c
        .markers
        .iter()
        .map(|m| f.to_page(m.at))
        .chain(c.adp.iter().map(|a| f.to_page(a.at)))
        .collect();
    let sat: Vec<Pt> = c.saturation.iter().map(|p| f.to_page(*p)).collect();
    let all: Vec<(&str, Rect)> = c
        .labels
        .iter()
        .map(|l| (l.name.as_str(), l.rect))
        .chain(c.curve_labels.iter().map(|l| (l.text.as_str(), l.rect)))
        .collect();
    for (i, (a, ra)) in all.iter().enumerate() {
        for (b, rb) in &all[i + 1..] {
            assert!(!ra.overlaps(rb), "{ctx}: `{a}` overlaps `{b}`");
        }
    }
    for l in &c.labels {
        assert!(
            f.plot.contains(&l.rect),
            "{ctx}: `{}` leaves the plot",
            l.name
        );
        assert!(
            !l.rect.hits_polyline(&sat),
            "{ctx}: `{}` crosses saturation",
            l.name
        );
        for m in &markers {
            assert!(
                l.rect.nearest(*m).dist(*m) >= plenum_chart::style::MARKER_R,
                "{ctx}: `{}` covers a marker",
                l.name
            );
        }
        // Beside its marker, or joined to it by a leader.
        let gap = l.rect.nearest(l.anchor).dist(l.anchor);
        assert!(
            gap < 14.0 || l.leader.is_some(),
            "{ctx}: `{}` is adrift",
            l.name
        );
        if let Some((_, end)) = l.leader {
            for o in c.labels.iter().filter(|o| o.of != l.of) {
                assert!(
                    !o.rect.inflate(-0.5).hits_segment(l.anchor, end),
                    "{ctx}: the leader of `{}` runs through `{}`",
                    l.name,
                    o.name
                );
            }
        }
    }
    for l in &c.curve_labels {
        assert!(
            !l.rect.hits_polyline(&sat),
            "{ctx}: `{}` crosses saturation",
            l.text
        );
    }
}

#[test]
fn labels_overlap_nothing_in_the_examples() {
    for (ex, ahu, units, c) in common::all_charts() {
        let (ex, ahu, units) = (ex.as_str(), ahu.as_str(), *units);
        assert_labels_clear(ex, ahu, units, c);
        // Most curves keep their labels.
        let rh = c
            .curve_labels
            .iter()
            .filter(|l| matches!(l.of, plenum_chart::CurveOf::Rh(_)))
            .count();
        assert!(rh >= 6, "{ex} {ahu} {units:?}: {rh} RH labels");
    }
}

#[test]
fn labels_say_name_dry_bulb_and_humidity_ratio() {
    let charts = common::all_charts();
    let (_, _, _, c) = charts
        .iter()
        .find(|c| c.0 == "library.plenum" && c.1 == "ahu_1" && c.2 == UnitSystem::Ip)
        .unwrap();
    let mixed = c
        .labels
        .iter()
        .find(|l| l.name.starts_with("Mixed"))
        .unwrap();
    let s = c
        .states
        .iter()
        .find(|s| s.kind == StateKind::Mixed)
        .unwrap();
    assert_eq!(
        mixed.values,
        format!("{:.1} °F · {:.1} gr/lb", s.values.tdb, s.values.w * 7000.0)
    );
    let (_, _, _, c) = charts
        .iter()
        .find(|c| c.0 == "library.plenum" && c.1 == "ahu_1" && c.2 == UnitSystem::Si)
        .unwrap();
    let room = c.labels.iter().find(|l| l.name == "Room").unwrap();
    assert!(room.values.ends_with(" g/kg") && room.values.contains(" °C · "));
    assert!(c.x.title.ends_with("°C") && c.y.title.contains("g/kg"));
}

#[test]
fn title_names_the_unit_site_case_and_caution() {
    let (design, eval) = common::load("library.plenum");
    let c = plenum_chart::chart_of(&design, &eval, 0, UnitSystem::Ip).unwrap();
    assert_eq!(c.title.heading, "ahu_1 — Public areas unit");
    assert!(c.title.lines[0].starts_with("Alder Creek Branch Library"));
    let r = eval.ahus[0].result.as_ref().unwrap();
    let case = match r.governing {
        DesignCase::Cooling => "Governing case: cooling design",
        DesignCase::Dehumid => "Governing case: dehumidification design",
    };
    assert_eq!(c.case, r.governing);
    assert!(c.title.lines[1].starts_with(case), "{}", c.title.lines[1]);
    assert!(c.title.lines[2].starts_with("Coil "));
    assert!(c.title.caution.contains("qualified engineer"));
    assert!(c.title.caution.contains("codes"));
}

#[test]
fn a_pressure_without_a_chart_is_an_error_not_a_panic() {
    let (_, eval) = common::load("library.plenum");
    let site = eval.site.as_ref().unwrap();
    let ahu = eval.ahus[0].result.as_ref().unwrap();
    let subject = Subject {
        name: "ahu_1",
        ..Subject::default()
    };
    for p in [f64::NAN, 0.0, -1.0, f64::INFINITY] {
        let mut bad = site.clone();
        bad.pressure_psia = p;
        assert!(matches!(
            plenum_chart::build(&bad, ahu, &subject, UnitSystem::Ip),
            Err(ChartError::NotFinite { .. })
        ));
    }
    // At 0.3 psia water boils near 64 °F: the states of the result have no
    // psychrometric solution there.
    let mut thin = site.clone();
    thin.pressure_psia = 0.3;
    for units in [UnitSystem::Ip, UnitSystem::Si] {
        let r = plenum_chart::build(&thin, ahu, &subject, units);
        assert!(matches!(r, Err(ChartError::Psychro { .. })), "{r:?}");
        assert!(
            r.unwrap_err()
                .to_string()
                .contains("no psychrometric solution")
        );
    }
}

#[test]
fn a_dedicated_outdoor_air_unit_with_its_own_fan() {
    // 100 % outdoor air: nothing mixes; the outdoor-air fan heats the intake
    // (sensible only), the return air is exhausted.
    let c = design_chart(
        "site { elevation 800 ft; cooling 92 °F db, 76 °F wb }\n\
         zone a { area 2_000 ft²; people 60; use classroom; sensible 30 kBtu/h; latent 9 kBtu/h }\n\
         ahu doas { serves a; outdoor_air 100 %; outdoor_fan_rise 1.5 °F; supply_temp 55 °F }\n",
        UnitSystem::Ip,
    );
    let kinds: Vec<LegKind> = c.legs.iter().map(|l| l.kind).collect();
    assert_eq!(
        kinds,
        [
            LegKind::OutdoorFan,
            LegKind::Coil,
            LegKind::CoilToAdp,
            LegKind::SupplyHeat,
            LegKind::RoomLine,
            LegKind::ReturnHeat
        ]
    );
    let fan = c.legs[0];
    assert_eq!(fan.from.y, fan.to.y);
    assert!((fan.to.x - fan.from.x - 1.5).abs() < 1e-9);
    assert!(c.markers.iter().any(|m| m.name == "Return (exhausted)"));
    assert!(
        c.markers
            .iter()
            .any(|m| m.name == "After OA fan = Mixed = Entering coil"),
        "{:?}",
        c.markers.iter().map(|m| &m.name).collect::<Vec<_>>()
    );
    assert_labels_clear("doas", "doas", UnitSystem::Ip, &c);
}

#[test]
fn a_unit_without_outdoor_air_mixes_nothing() {
    let c = design_chart(
        "site { elevation 0 ft; cooling 95 °F db, 75 °F wb }\n\
         zone a { area 1_000 ft²; people 5; use office; sensible 20 kBtu/h; latent 3 kBtu/h }\n\
         ahu fc { serves a; outdoor_air 0 cfm }\n",
        UnitSystem::Si,
    );
    assert!(c.legs.iter().all(|l| l.kind != LegKind::Mixing));
    assert!(c.markers.iter().any(|m| m.name == "Outdoor (none taken)"));
    assert!(
        c.markers
            .iter()
            .any(|m| m.name.starts_with("Return = Mixed"))
    );
    assert_labels_clear("fc", "fc", UnitSystem::Si, &c);
}

#[test]
fn a_sweep_of_climates_and_elevations_charts_cleanly() {
    // Hot-humid, hot-dry and mild outdoor states at three elevations, with
    // a humid room and a dry one: every chart builds, and its labels keep
    // clear of each other, the markers and the saturation curve.
    let mut n = 0;
    for elevation in ["0 ft", "4_500 ft", "9_000 ft"] {
        for outdoor in [
            "95 °F db, 80 °F wb",
            "108 °F db, 66 °F wb",
            "82 °F db, 72 °F wb",
        ] {
            for (latent, oa) in [("9 kBtu/h", "ventilation"), ("0.5 kBtu/h", "40 %")] {
                let text = format!(
                    "site {{ elevation {elevation}; cooling {outdoor} }}\n\
                     zone a {{ area 2_000 ft²; people 30; use classroom; sensible 40 kBtu/h; latent {latent} }}\n\
                     ahu u {{ serves a; outdoor_air {oa} }}\n"
                );
                let (design, diags) = plenum_model::lower_text(&text);
                assert!(diags.is_empty(), "{diags:?}");
                let eval = plenum_engine::evaluate(&design);
                if eval.ahus[0].result.is_err() {
                    continue;
                }
                // The unit systems take turns, to keep the test quick.
                let units = [UnitSystem::Ip, UnitSystem::Si][n % 2];
                let c = plenum_chart::chart_of(&design, &eval, 0, units).unwrap();
                let ctx = format!("{elevation} {outdoor} {latent} {oa}");
                assert_labels_clear(&ctx, "u", units, &c);
                let svg = plenum_chart::render_svg(&c);
                assert!(roxmltree::Document::parse(&svg).is_ok());
                n += 1;
            }
        }
    }
    assert!(n >= 12, "only {n} charts");
}
