#![allow(clippy::unwrap_used)]
//! Property test (issue 9): random designs built from the generator's
//! blocks, with random values in valid ranges, give only finite numbers in
//! every field of the engine's results, checked by the engine's own guard
//! applied to the whole evaluation (`Evaluation::first_non_finite`). The
//! model must accept every such design without an error; the engine may
//! still find that a unit has no solution (a typed error, not a number).

use plenum_gen::blocks::*;
use proptest::prelude::*;

fn arb_site() -> impl Strategy<Value = Site> {
    (
        prop::option::of(0.0..9_000.0f64),
        75.0..115.0f64,
        0.0..1.0f64,
        prop::option::of((45.0..80.0f64, 2.0..15.0f64)),
        any::<bool>(),
    )
        .prop_map(|(elevation, db, depression, dehumid, si)| {
            let db = (db * 2.0).round() / 2.0;
            // Wet bulb between 45 % and 100 % of the way from 40 °F to the dry bulb.
            let wb = (40.0 + (db - 40.0) * (0.45 + 0.55 * depression)).min(db);
            let wb = (wb * 10.0).floor() / 10.0;
            let by_pressure = elevation.is_none();
            Site {
                project: "Property test".to_string(),
                units: if si { Units::Si } else { Units::Ip },
                elevation_ft: elevation.map(|e| e.round()),
                pressure_psia: by_pressure.then_some(14.2),
                cooling_f: (db, wb),
                dehumid_f: dehumid.map(|(dp, spread)| (dp.round(), (dp + spread).round())),
                elevation_note: None,
            }
        })
}

const CATEGORIES: [&str; 11] = [
    "office",
    "conference",
    "reception",
    "lobby",
    "corridor",
    "classroom",
    "lecture",
    "library",
    "retail",
    "dining",
    "storage",
];

fn arb_zone(i: usize, si: bool) -> impl Strategy<Value = Zone> {
    (
        50.0..6_000.0f64,
        0u32..200,
        0usize..CATEGORIES.len(),
        prop::option::of((70.0..80.0f64, 35.0..60.0f64)),
        500.0..150_000.0f64,
        0.0..0.6f64,
        prop::option::of(50.0..130.0f64),
    )
        .prop_map(
            move |(area, people, cat, indoor, sensible, latent, ez)| Zone {
                name: format!("z{i}"),
                label: Some(format!("Zone {i}")),
                like: None,
                note: None,
                units: if si { Units::Si } else { Units::Ip },
                area: Some(Amount::Value(area.round())),
                people: Some(Amount::Value(f64::from(people))),
                category: Some(CATEGORIES[cat]),
                indoor: indoor.map(|(t, rh)| (t.round(), rh.round())),
                sensible: Some(Amount::Value((sensible / 100.0).round() * 100.0)),
                sensible_note: None,
                latent: Some(Amount::Value((sensible * latent / 100.0).round() * 100.0)),
                distribution_effectiveness_pct: ez.map(f64::round),
            },
        )
}

fn arb_fan() -> impl Strategy<Value = Option<Fan>> {
    let source = prop_oneof![
        Just(None),
        (0.1..60.0f64).prop_map(|hp| Some(FanSource::Power((hp * 4.0).round() / 4.0))),
        (0.2..8.0f64, 30.0..85.0f64).prop_map(|(p, e)| Some(FanSource::Static {
            in_wg: (p * 10.0).round() / 10.0,
            efficiency_pct: e.round(),
        })),
        (0.0..5.0f64).prop_map(|r| Some(FanSource::Rise((r * 2.0).round() / 2.0))),
    ];
    prop::option::of((
        source,
        prop::option::of(60.0..98.0f64),
        prop::option::of(any::<bool>()),
        prop::option::of(any::<bool>()),
    ))
    .prop_map(|f| {
        f.map(|(source, eff, motor, draw)| Fan {
            source,
            // A motor efficiency goes with a power or static fan in the air stream.
            motor_efficiency_pct: match (source, motor) {
                (Some(FanSource::Rise(_)), _) | (_, Some(false)) => None,
                _ => eff.map(f64::round),
            },
            motor_in_airstream: motor,
            draw_through: draw,
        })
    })
}

fn arb_outdoor_air() -> impl Strategy<Value = Option<OutdoorAir>> {
    prop_oneof![
        Just(None),
        Just(Some(OutdoorAir::Ventilation)),
        (0.0..5_000.0f64).prop_map(|c| Some(OutdoorAir::Airflow(c.round()))),
        (0.0..100.0f64).prop_map(|p| Some(OutdoorAir::Percent(p.round()))),
        (0.0..30.0f64).prop_map(|r| Some(OutdoorAir::PerPerson(r.round()))),
        (0.0..1.5f64).prop_map(|r| Some(OutdoorAir::PerArea((r * 100.0).round() / 100.0))),
        Just(Some(OutdoorAir::All)),
    ]
}

fn arb_duct(allow_none: bool) -> impl Strategy<Value = Option<Duct>> {
    prop_oneof![
        Just(None),
        (0.0..600.0f64).prop_map(|l| Some(Duct::Length(l.round()))),
        (0.0..6.0f64).prop_map(|r| Some(Duct::Rise((r * 2.0).round() / 2.0))),
        Just(if allow_none { Some(Duct::None) } else { None }),
    ]
}

fn arb_coil() -> impl Strategy<Value = Option<Coil>> {
    prop::option::of((
        prop::option::of(80.0..100.0f64),
        prop::option::of(1.0..200.0f64),
        prop::option::of((38.0..48.0f64, 6.0..16.0f64)),
        prop::option::of(1.0..200.0f64),
    ))
    .prop_map(|c| {
        c.map(|(rh, tons, chw, face)| Coil {
            leaving_rh_pct: rh.map(f64::round),
            rated: tons.map(|t| Capacity::Ton((t * 2.0).round() / 2.0)),
            rated_sensible: None,
            chilled_water_f: chw.map(|(s, d)| (s.round(), (s + d).round())),
            face_area_ft2: face.map(f64::round),
        })
    })
}

fn arb_design() -> impl Strategy<Value = String> {
    (arb_site(), 1usize..6, any::<bool>()).prop_flat_map(|(site, n, si)| {
        let zones: Vec<_> = (0..n).map(|i| arb_zone(i, si)).collect();
        let ahu = (
            prop_oneof![
                Just(None),
                (48.0..62.0f64).prop_map(|t| Some(Supply::Temp(t.round()))),
                (10.0..25.0f64).prop_map(|d| Some(Supply::Dt(d.round()))),
            ],
            prop::option::of(50.0..100.0f64),
            arb_duct(false),
            arb_duct(true),
            prop::option::of(0.0..20_000.0f64),
            arb_fan(),
            arb_outdoor_air(),
            prop::option::of(30.0..100.0f64),
            prop_oneof![
                Just(None),
                Just(Some(Ev::Simplified)),
                Just(Some(Ev::Calculated)),
                (40.0..100.0f64).prop_map(|e| Some(Ev::Given(e.round()))),
            ],
            prop::option::of(0.0..3.0f64),
            arb_coil(),
        );
        (Just(site), zones, ahu).prop_map(move |(site, zones, a)| {
            let (supply, div, sd, rd, plenum, fan, oa, occ, ev, ofr, coil) = a;
            let ahu = Ahu {
                name: "unit".to_string(),
                label: None,
                units: if si { Units::Si } else { Units::Ip },
                serves: zones.iter().map(|z| z.name.clone()).collect(),
                supply,
                diversity_pct: div.map(f64::round),
                supply_duct: sd,
                return_duct: rd,
                return_note: None,
                plenum_gain_btuh: plenum.map(|p| (p / 100.0).round() * 100.0),
                fan,
                outdoor_air: oa,
                occupant_diversity_pct: occ.map(f64::round),
                ventilation_efficiency: ev,
                outdoor_fan_rise_f: ofr.map(|r| (r * 2.0).round() / 2.0),
                coil,
            };
            design_text(&site, &zones, &[ahu])
        })
    })
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 256, ..ProptestConfig::default() })]

    #[test]
    fn every_number_of_a_valid_design_is_finite(text in arb_design()) {
        let parsed = plenum_syntax::parse(&text);
        prop_assert!(parsed.errors.is_empty(), "{:?}\n{}", parsed.errors, text);
        let (design, diagnostics) = plenum_model::lower_text(&text);
        let errors: Vec<_> = diagnostics
            .iter()
            .filter(|d| d.severity == plenum_model::Severity::Error)
            .collect();
        prop_assert!(errors.is_empty(), "{:?}\n{}", errors, text);
        let eval = plenum_engine::evaluate(&design);
        prop_assert_eq!(eval.first_non_finite(), None, "{}", text);
    }
}

/// The valid ranges above are not so wide that the engine rarely answers:
/// most of a fixed sample of designs have a result.
#[test]
fn most_random_designs_have_a_result() {
    use proptest::strategy::ValueTree;
    use proptest::test_runner::{Config, TestRng, TestRunner};
    let mut runner = TestRunner::new_with_rng(
        Config::default(),
        TestRng::from_seed(proptest::test_runner::RngAlgorithm::ChaCha, &[7; 32]),
    );
    let strategy = arb_design();
    let (mut with_result, total) = (0, 200);
    for _ in 0..total {
        let text = strategy.new_tree(&mut runner).unwrap().current();
        let (design, _) = plenum_model::lower_text(&text);
        let eval = plenum_engine::evaluate(&design);
        assert_eq!(eval.first_non_finite(), None);
        if eval.ahus.iter().all(|a| a.result.is_ok()) {
            with_result += 1;
        }
    }
    assert!(
        with_result * 2 > total,
        "{with_result} of {total} have a result"
    );
}
