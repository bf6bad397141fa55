//! Property tests over random designs: conservation of mass and energy in
//! the mixing box (methods.md step 9), the coil energy balance and
//! total = sensible + latent (step 10), the zone sensible and room latent
//! balances (steps 2, 6), every output finite, and no panic on any input.

mod common;

use common::build::*;
use plenum_engine::*;
use plenum_model::*;
use proptest::prelude::*;

fn rel_eq(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol * a.abs().max(b.abs()).max(1.0)
}

/// True when a debug print of a value holds a NaN or an infinity.
fn has_non_finite(text: &str) -> bool {
    text.contains("NaN")
        || text.contains(": inf")
        || text.contains(": -inf")
        || text.contains("(inf")
        || text.contains("(-inf")
}

fn arb_zone(id: u32) -> impl Strategy<Value = Zone> {
    (
        2_000.0..60_000.0f64,
        0.0..0.4f64,
        prop::option::of((70.0..78.0f64, 0.40..0.55f64)),
        100.0..3_000.0f64,
        0.0..30.0f64,
        0usize..=VENTILATION_CATEGORIES.len(),
        prop::option::of(0.8..1.2f64),
    )
        .prop_map(move |(qs, lat, indoor, area, people, cat, ez)| Zone {
            id: ZoneId(id),
            name: format!("z{id}"),
            label: None,
            loc: loc(),
            name_loc: loc(),
            area_ft2: Some(at(area)),
            people: Some(at(people.round())),
            category: VENTILATION_CATEGORIES
                .get(cat)
                .map(|c| at(c.name.to_string())),
            indoor: indoor.map(|(db_f, rh)| at(AirSpec::DbRh { db_f, rh })),
            sensible_btuh: Some(at(qs)),
            latent_btuh: Some(at(lat * qs)),
            distribution_effectiveness: ez.map(at),
        })
}

fn arb_fan() -> impl Strategy<Value = Option<Fan>> {
    prop_oneof![
        Just(None),
        (
            0.5..10.0f64,
            any::<bool>(),
            any::<bool>(),
            prop::option::of(0.8..0.95f64)
        )
            .prop_map(|(hp, outside, blow, eta)| Some(Fan {
                power: Some(at(FanPower::Shaft { hp })),
                motor: Some(at(if outside {
                    MotorLocation::Outside
                } else {
                    MotorLocation::InAirstream
                })),
                arrangement: Some(at(if blow {
                    FanArrangement::BlowThrough
                } else {
                    FanArrangement::DrawThrough
                })),
                motor_efficiency: eta.map(at),
                ..fan()
            })),
        (0.5..4.0f64, 0.5..0.8f64, any::<bool>()).prop_map(|(in_wg, efficiency, blow)| Some(Fan {
            power: Some(at(FanPower::Static { in_wg, efficiency })),
            arrangement: Some(at(if blow {
                FanArrangement::BlowThrough
            } else {
                FanArrangement::DrawThrough
            })),
            ..fan()
        })),
        (0.0..4.0f64).prop_map(|dt| Some(Fan {
            rise_f: Some(at(dt)),
            ..fan()
        })),
    ]
}

fn arb_outdoor_air() -> impl Strategy<Value = Option<OutdoorAir>> {
    prop_oneof![
        Just(None),
        Just(Some(OutdoorAir::Ventilation)),
        Just(Some(OutdoorAir::All)),
        (0.0..0.6f64).prop_map(|fraction| Some(OutdoorAir::FractionOfSupply { fraction })),
        (0.0..3_000.0f64).prop_map(|cfm| Some(OutdoorAir::Airflow { cfm })),
        (5.0..20.0f64).prop_map(|cfm| Some(OutdoorAir::PerPerson { cfm })),
        (0.05..0.5f64).prop_map(|cfm_per_ft2| Some(OutdoorAir::PerArea { cfm_per_ft2 })),
    ]
}

prop_compose! {
    fn arb_ahu(n_zones: usize)(
        supply in prop::option::of(prop_oneof![
            (15.0..22.0f64).prop_map(|dt_f| SupplyTemp::BelowRoom { dt_f }),
            (52.0..58.0f64).prop_map(|f| SupplyTemp::Temp { f }),
        ]),
        diversity in prop::option::of(0.7..1.0f64),
        supply_duct in prop::option::of(prop_oneof![
            (0.0..300.0f64).prop_map(|ft| SupplyDuct::Length { ft }),
            (0.0..4.0f64).prop_map(|dt_f| SupplyDuct::Rise { dt_f }),
        ]),
        return_duct in prop::option::of(prop_oneof![
            (0.0..300.0f64).prop_map(|ft| ReturnDuct::Length { ft }),
            (0.0..4.0f64).prop_map(|dt_f| ReturnDuct::Rise { dt_f }),
            Just(ReturnDuct::None),
        ]),
        plenum in prop::option::of(0.0..10_000.0f64),
        fan in arb_fan(),
        oa in arb_outdoor_air(),
        occ in prop::option::of(0.3..1.0f64),
        ev in prop::option::of(prop_oneof![
            Just(VentilationEfficiency::Simplified),
            Just(VentilationEfficiency::Calculated),
            (0.6..1.0f64).prop_map(|ev| VentilationEfficiency::Given { ev }),
        ]),
        oa_fan in prop::option::of(0.0..2.0f64),
        coil_in in prop::option::of((prop::option::of(0.85..1.0f64), prop::option::of(5_000.0..400_000.0f64), any::<bool>())),
    ) -> Ahu {
        let mut a = ahu("a", &(0..n_zones as u32).collect::<Vec<_>>());
        a.supply = supply.map(at);
        a.diversity = diversity.map(at);
        a.supply_duct = supply_duct.map(at);
        a.return_duct = return_duct.map(at);
        a.plenum_gain_btuh = plenum.map(at);
        a.fan = fan;
        a.outdoor_air = oa.map(at);
        a.occupant_diversity = occ.map(at);
        a.ventilation_efficiency = ev.map(at);
        a.outdoor_fan_rise_f = oa_fan.map(at);
        a.coil = coil_in.map(|(rh, rated, chw)| Coil {
            leaving_rh: rh.map(at),
            rated_btuh: rated.map(at),
            chilled_water: chw.then(|| at((44.0, 56.0))),
            face_area_ft2: chw.then(|| at(10.0)),
            ..coil()
        });
        a
    }
}

fn arb_design() -> impl Strategy<Value = Design> {
    (1usize..=5)
        .prop_flat_map(|n| {
            let zones: Vec<_> = (0..n as u32).map(arb_zone).collect();
            (
                0.0..8_000.0f64,
                80.0..110.0f64,
                0.10..0.80f64,
                prop::option::of((60.0..76.0f64, 4.0..15.0f64)),
                zones,
                arb_ahu(n),
            )
        })
        .prop_map(|(elev, db, rh, dehumid, zones, a)| {
            let mut s = site(elev, db, db);
            s.cooling = Some(at(AirSpec::DbRh { db_f: db, rh }));
            s.dehumid = dehumid.map(|(dp, ddb)| {
                at(AirSpec::DbDp {
                    db_f: dp + ddb,
                    dp_f: dp,
                })
            });
            design(s, zones, vec![a])
        })
}

fn check_case(c: &CaseResult, d: f64, q_l_zones: f64) -> Result<(), TestCaseError> {
    let m = c.dry_air_flow_lb_h;
    let m_oa = c.outdoor_air_lb_h;
    let x = c.outdoor_air_fraction;
    let st = &c.states;
    let o = st.outdoor_after_fan.unwrap_or(st.outdoor);
    prop_assert!((0.0..=1.0).contains(&x));
    prop_assert!(rel_eq(x, m_oa / m, 1e-12));
    // Mixing box: moisture and energy by mass (methods.md step 9).
    prop_assert!(rel_eq(
        m * st.mixed.w_lb_lb,
        m_oa * o.w_lb_lb + (m - m_oa) * st.return_air.w_lb_lb,
        1e-9
    ));
    prop_assert!(rel_eq(
        m * st.mixed.h_btu_lb,
        m_oa * o.h_btu_lb + (m - m_oa) * st.return_air.h_btu_lb,
        1e-9
    ));
    // Coil: total = sensible + latent; energy balance with the condensate.
    let k = &c.coil;
    prop_assert!(rel_eq(k.total_btuh, k.sensible_btuh + k.latent_btuh, 1e-9));
    let w_on = if k.dry {
        st.leaving.w_lb_lb
    } else {
        st.entering.w_lb_lb
    };
    let h_on = enthalpy(st.entering.tdb_f, w_on);
    let cond = m * (w_on - st.leaving.w_lb_lb) * (st.leaving.tdb_f - 32.0);
    prop_assert!(rel_eq(
        k.total_btuh + cond,
        m * (h_on - st.leaving.h_btu_lb),
        1e-9
    ));
    prop_assert!(k.total_btuh > 0.0 && k.condensate_lb_h >= 0.0);
    prop_assert!(k.adp_f <= st.leaving.tdb_f && (0.0..1.0).contains(&k.bypass_factor));
    if k.dry {
        prop_assert_eq!(k.condensate_lb_h, 0.0);
        prop_assert!((st.entering.w_lb_lb - st.leaving.w_lb_lb).abs() < 1e-11);
    } else {
        prop_assert!(st.entering.w_lb_lb >= st.leaving.w_lb_lb);
    }
    // Zone sensible balances and the system flow (step 2).
    let mut sum = 0.0;
    for z in &c.zones {
        sum += z.design_airflow_lb_h;
        prop_assert!(z.design_airflow_lb_h * c.cp_supply * z.supply_dt_f > 0.0);
    }
    prop_assert!(rel_eq(m, d * sum, 1e-12));
    // Room latent balance (step 6).
    let q_l = m * (st.room.w_lb_lb - st.supply.w_lb_lb) * h_g(st.room.tdb_f);
    prop_assert!(rel_eq(q_l, d * q_l_zones, 1e-9));
    // Fan heat = m c_p Δt_f (step 4).
    prop_assert!(rel_eq(
        c.fan.heat_btuh,
        m * c.cp_supply * c.fan.rise_f,
        1e-9
    ));
    Ok(())
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 256, ..ProptestConfig::default() })]

    /// Valid random designs: the balances hold and every output is finite.
    #[test]
    fn balances_hold_and_outputs_are_finite(d in arb_design()) {
        let e = evaluate(&d);
        let text = format!("{e:?}");
        prop_assert!(!has_non_finite(&text), "{}", text);
        for a in &e.ahus {
            if let Ok(r) = &a.result {
                let div = r.inputs.diversity;
                let q_l: f64 = d.zones.iter().filter_map(|z| z.latent_btuh.map(|l| l.value)).sum();
                for z in &r.cooling.zones {
                    let qs = d.zones[z.zone.0 as usize].sensible_btuh.map_or(0.0, |s| s.value);
                    prop_assert!(rel_eq(z.design_airflow_lb_h * r.cooling.cp_supply * z.supply_dt_f, qs, 1e-12));
                }
                check_case(&r.cooling, div, q_l)?;
                if let Some(dh) = &r.dehumid {
                    check_case(dh, div, q_l)?;
                }
            }
        }
    }

    /// Any numbers at all (NaN, infinities, negatives, huge): no panic, no
    /// non-finite output.
    #[test]
    fn no_panic_and_nothing_non_finite_on_any_numbers(
        nums in prop::collection::vec(prop_oneof![
            any::<f64>(),
            Just(f64::NAN),
            Just(f64::INFINITY),
            Just(0.0),
            -1.0e3..1.0e3f64,
            0.0..1.0f64,
        ], 24),
        choice in 0usize..8,
    ) {
        let n = |i: usize| nums[i % nums.len()];
        let mut s = site(n(0), n(1), n(2));
        if choice % 2 == 0 {
            s.pressure_psia = Some(at(n(3)));
        }
        if choice % 3 == 0 {
            s.dehumid = Some(at(AirSpec::DbDp { db_f: n(4), dp_f: n(5) }));
        }
        let mut z = vent_zone(0, "z", n(6), n(7), "office", n(8), n(9));
        z.indoor = Some(at(AirSpec::DbRh { db_f: n(10), rh: n(11) }));
        z.distribution_effectiveness = Some(at(n(12)));
        let mut a = ahu("a", &[0]);
        a.supply = Some(at(SupplyTemp::Temp { f: n(13) }));
        a.diversity = Some(at(n(14)));
        a.supply_duct = Some(at(SupplyDuct::Rise { dt_f: n(15) }));
        a.plenum_gain_btuh = Some(at(n(16)));
        a.outdoor_air = Some(at(match choice {
            0 => OutdoorAir::Airflow { cfm: n(17) },
            1 => OutdoorAir::FractionOfSupply { fraction: n(17) },
            2 => OutdoorAir::PerPerson { cfm: n(17) },
            3 => OutdoorAir::PerArea { cfm_per_ft2: n(17) },
            4 => OutdoorAir::All,
            _ => OutdoorAir::Ventilation,
        }));
        a.fan = Some(Fan {
            power: Some(at(FanPower::Static { in_wg: n(18), efficiency: n(19) })),
            motor_efficiency: Some(at(n(20))),
            ..fan()
        });
        a.coil = Some(Coil {
            leaving_rh: Some(at(n(21))),
            rated_btuh: Some(at(n(22))),
            face_area_ft2: Some(at(n(23))),
            ..coil()
        });
        let e = evaluate(&design(s, vec![z], vec![a]));
        let text = format!("{:?} {:?} {:?} {:?}", e.site, e.zones, e.ahus, e.findings);
        prop_assert!(!has_non_finite(&text), "{}", text);
    }
}

/// Most random valid designs have a result (the generator is not vacuous).
#[test]
fn random_valid_designs_mostly_have_results() {
    use proptest::strategy::ValueTree;
    use proptest::test_runner::TestRunner;
    let mut runner = TestRunner::deterministic();
    let strategy = arb_design();
    let (mut ok, mut total) = (0, 0);
    for _ in 0..200 {
        let Ok(tree) = strategy.new_tree(&mut runner) else {
            continue;
        };
        let e = evaluate(&tree.current());
        total += 1;
        ok += usize::from(e.ahus.iter().all(|a| a.result.is_ok()));
    }
    assert!(
        total == 200 && ok * 10 >= total * 7,
        "{ok} of {total} had results"
    );
}
