//! Checks against published values and trade practice, each source named.

use plenum_psychro::{PA_PER_PSI, PsychroError, Quantity, ip, si};

fn ok(r: Result<f64, PsychroError>) -> f64 {
    match r {
        Ok(x) => x,
        Err(e) => panic!("unexpected error: {e}"),
    }
}

/// ASHRAE Handbook—Fundamentals, standard atmosphere: 14.696 psia at sea
/// level, about 12.23 psia at 5,000 ft and 10.11 psia at 10,000 ft. These
/// figures were written from memory, not read from the printed table.
#[test]
fn standard_atmosphere_from_memory() {
    assert!((ok(ip::standard_pressure(0.0)) - 14.696).abs() < 1e-12);
    assert!((ok(ip::standard_pressure(5_000.0)) - 12.23).abs() < 0.01);
    assert!((ok(ip::standard_pressure(10_000.0)) - 10.11).abs() < 0.01);
    assert!((ok(si::standard_pressure(0.0)) - 101_325.0).abs() < 1e-9);
    assert_eq!(ip::STANDARD_PRESSURE, 14.696);
    assert_eq!(si::STANDARD_PRESSURE, 101_325.0);
}

/// The SI and IP standard-atmosphere equations (ASHRAE Handbook—Fundamentals
/// 2017 ch. 1 eq. 3, both forms as printed in methods.md §1) describe the same
/// atmosphere: with 1 ft = 0.3048 m (NIST SP 811) they agree within 0.01 %.
#[test]
fn standard_atmosphere_si_and_ip_agree() {
    for z_ft in [0.0, 1_250.0, 5_000.0, 10_000.0, 20_000.0, 36_000.0] {
        let ip_p = ok(ip::standard_pressure(z_ft));
        let si_p = ok(si::standard_pressure(z_ft * 0.3048)) / PA_PER_PSI;
        assert!(
            ((ip_p - si_p) / ip_p).abs() < 1e-4,
            "{z_ft} ft: {ip_p} vs {si_p}"
        );
    }
}

/// Saturation pressure of water, from memory of the steam tables that the
/// handbook's ch. 1 table of saturated-air properties agrees with: 2.339 kPa
/// at 20 °C, 101.42 kPa at 100 °C (slightly above one atmosphere: water boils
/// at 99.97 °C at 101.325 kPa), 0.6117 kPa at the triple point, and over ice
/// 103.3 Pa at −20 °C.
#[test]
fn saturation_pressure_from_memory() {
    assert!((ok(si::sat_vapour_pressure(20.0)) - 2_339.0).abs() < 2.0);
    assert!((ok(si::sat_vapour_pressure(100.0)) - 101_420.0).abs() < 50.0);
    assert!((ok(si::sat_vapour_pressure(0.01)) - 611.7).abs() < 0.5);
    assert!((ok(si::sat_vapour_pressure(-20.0)) - 103.3).abs() < 0.5);
    // Boiling at one standard atmosphere: saturated air does not exist at 100 °C.
    assert!(matches!(
        si::sat_hum_ratio(100.0, 101_325.0),
        Err(PsychroError::AboveBoilingPoint { .. })
    ));
    assert!(si::sat_hum_ratio(99.9, 101_325.0).is_ok());
}

/// The two Hyland–Wexler fits nearly meet at the triple point, where the
/// crate switches between them (0.01 °C): the jump is below 0.01 %.
#[test]
fn saturation_fits_meet_at_the_triple_point() {
    let below = ok(si::sat_vapour_pressure(0.01));
    let above = ok(si::sat_vapour_pressure(0.01 + 1e-9));
    assert!(((above - below) / below).abs() < 1e-4, "{below} {above}");
    let below = ok(ip::sat_vapour_pressure(32.018));
    let above = ok(ip::sat_vapour_pressure(32.018 + 1e-9));
    assert!(((above - below) / below).abs() < 1e-4, "{below} {above}");
}

/// Common practice (no single published source): for standard air, 0.075
/// lb/ft³ at sea level, 60·ρ·c_p ≈ 1.08 Btu/(h·cfm·°F) and 60·ρ ≈ 4.5
/// lb·min/(h·ft³). With ρ the dry-air mass per volume (1/v) and
/// c_p = 0.240 + 0.444 W, both hold within 3 % for dry air at 70 °F and for
/// a comfort state of 75 °F / 50 % RH at sea level.
#[test]
fn standard_air_factors_common_practice() {
    let dry = ok(ip::specific_volume(70.0, 0.0, 14.696));
    assert!(
        (1.0 / dry - 0.075).abs() / 0.075 < 0.03,
        "ρ = {}",
        1.0 / dry
    );
    let comfort = ip::State::from_db_rh(75.0, 0.5, 14.696);
    let comfort = match comfort {
        Ok(s) => s,
        Err(e) => panic!("{e}"),
    };
    for (v, w) in [(dry, 0.0), (comfort.specific_volume(), comfort.hum_ratio())] {
        let cp = 0.240 + 0.444 * w;
        let sensible = 60.0 * cp / v;
        let total = 60.0 / v;
        assert!((sensible - 1.08).abs() / 1.08 < 0.03, "1.08 vs {sensible}");
        assert!((total - 4.5).abs() / 4.5 < 0.03, "4.5 vs {total}");
    }
    // At 5,000 ft the air is 17 % thinner and the factors no longer hold
    // (the reason methods.md computes the exact figure and shows 1.08 beside it).
    let p = ok(ip::standard_pressure(5_000.0));
    let high = ok(ip::specific_volume(70.0, 0.0, p));
    assert!((60.0 / high - 4.5).abs() / 4.5 > 0.1);
}

/// Moist air is lighter than dry air at the same dry bulb and pressure
/// (ASHRAE Handbook—Fundamentals ch. 1: water vapour's molar mass is 18.015
/// against 28.966 for dry air), and density is (1 + W)/v (eq. 11).
#[test]
fn density_definition() {
    let (t, p) = (80.0, 14.696);
    let w = ok(ip::hum_ratio_from_rh(t, 0.8, p));
    let rho_dry = ok(ip::density(t, 0.0, p));
    let rho = ok(ip::density(t, w, p));
    assert!(rho < rho_dry);
    let v = ok(ip::specific_volume(t, w, p));
    assert!((rho - (1.0 + w) / v).abs() < 1e-15);
}

/// Each enthalpy datum (methods.md §2, ASHRAE Handbook—Fundamentals 2017
/// ch. 1 eq. 30): dry air is zero at 0 °F in IP and at 0 °C in SI.
#[test]
fn enthalpy_datums() {
    assert_eq!(ok(ip::enthalpy(0.0, 0.0)), 0.0);
    assert_eq!(ok(si::enthalpy(0.0, 0.0)), 0.0);
    assert!((ok(ip::enthalpy(32.0, 0.0)) - 7.68).abs() < 1e-12);
    // 75 °F, W = 0.0093: 0.240·75 + 0.0093·(1061 + 0.444·75) = 28.177 Btu/lb.
    let h = ok(ip::enthalpy(75.0, 0.0093));
    assert!((h - (18.0 + 0.0093 * (1061.0 + 33.3))).abs() < 1e-12);
    // Dry bulb from (h, W): t = (h − 1061 W) / (0.240 + 0.444 W).
    assert!((ok(ip::dry_bulb_from_enthalpy(h, 0.0093)) - 75.0).abs() < 1e-12);
}

/// The design-condition example of issue 4, against psychrolib 2.5.0
/// (`CalcPsychrometricsFromTWetBulb(94, 75, GetStandardAtmPressure(1250))`:
/// W 0.015188076, dew point 67.618598 °F, RH 0.42298073, h 39.308438 Btu/lb,
/// v 14.962496 ft³/lb), within the methods.md tolerances.
#[test]
fn design_example_against_psychrolib() {
    let p = ok(ip::standard_pressure(1250.0));
    assert!((p - 14.044_201_509).abs() < 1e-8);
    let s = match ip::State::from_db_wb(94.0, 75.0, p) {
        Ok(s) => s,
        Err(e) => panic!("{e}"),
    };
    assert!((s.hum_ratio() / 0.015_188_076 - 1.0).abs() < 5e-4);
    assert!((s.dew_point() - 67.618_598).abs() < 0.02);
    assert!((s.rh() - 0.422_980_73).abs() < 5e-4);
    assert!((s.enthalpy() / 39.308_438 - 1.0).abs() < 5e-4);
    assert!((s.specific_volume() / 14.962_496 - 1.0).abs() < 5e-4);
    assert!((s.wet_bulb() - 75.0).abs() < 1e-12);
}

/// Every out-of-domain input gives its typed error (methods.md §5: wet bulb
/// above dry bulb and RH above 100 % are errors), with a readable message.
#[test]
fn out_of_domain_inputs_are_typed_errors() {
    use PsychroError as E;
    let p = 14.696;
    type Case = (Result<ip::State, E>, fn(&E) -> bool);
    let cases: Vec<Case> = vec![
        (ip::State::from_db_wb(75.0, 80.0, p), |e| {
            matches!(e, E::WetBulbAboveDryBulb { .. })
        }),
        (ip::State::from_db_wb(110.0, 40.0, p), |e| {
            matches!(e, E::WetBulbTooLow { .. })
        }),
        (ip::State::from_db_rh(75.0, 1.01, p), |e| {
            matches!(e, E::RelativeHumidityOutOfRange { .. })
        }),
        (ip::State::from_db_rh(75.0, -0.01, p), |e| {
            matches!(e, E::RelativeHumidityOutOfRange { .. })
        }),
        (ip::State::from_db_rh(75.0, 50.0, p), |e| {
            matches!(e, E::RelativeHumidityOutOfRange { .. })
        }),
        (ip::State::from_db_w(75.0, -0.001, p), |e| {
            matches!(e, E::NegativeHumidityRatio { .. })
        }),
        (ip::State::from_db_w(75.0, 0.05, p), |e| {
            matches!(e, E::AboveSaturation { .. })
        }),
        (ip::State::from_db_dp(60.0, 65.0, p), |e| {
            matches!(e, E::DewPointAboveDryBulb { .. })
        }),
        (ip::State::from_db_rh(400.0, 0.5, p), |e| {
            matches!(
                e,
                E::TemperatureOutOfRange {
                    quantity: Quantity::DryBulb,
                    ..
                }
            )
        }),
        (ip::State::from_db_rh(-150.0, 0.5, p), |e| {
            matches!(e, E::TemperatureOutOfRange { .. })
        }),
        (ip::State::from_db_rh(f64::NAN, 0.5, p), |e| {
            matches!(
                e,
                E::NotFinite {
                    quantity: Quantity::DryBulb
                }
            )
        }),
        (ip::State::from_db_rh(75.0, 0.5, 0.0), |e| {
            matches!(e, E::PressureNotPositive { .. })
        }),
        (ip::State::from_db_rh(75.0, 0.5, -14.7), |e| {
            matches!(e, E::PressureNotPositive { .. })
        }),
        (ip::State::from_db_rh(75.0, 0.5, f64::INFINITY), |e| {
            matches!(e, E::NotFinite { .. })
        }),
        (ip::State::from_db_rh(250.0, 0.5, p), |e| {
            matches!(e, E::AboveBoilingPoint { .. })
        }),
        // Perfectly dry air has no dew point.
        (ip::State::from_db_w(75.0, 0.0, p), |e| {
            matches!(
                e,
                E::SolutionOutOfRange {
                    quantity: Quantity::DewPoint,
                    ..
                }
            )
        }),
        (ip::State::from_h_w(1e6, 0.01, p), |e| {
            matches!(e, E::TemperatureOutOfRange { .. })
        }),
        (ip::State::from_h_w(28.0, f64::NAN, p), |e| {
            matches!(
                e,
                E::NotFinite {
                    quantity: Quantity::HumidityRatio
                }
            )
        }),
    ];
    for (i, (result, expected)) in cases.iter().enumerate() {
        match result {
            Ok(s) => panic!("case {i}: expected an error, got {s:?}"),
            Err(e) => {
                assert!(expected(e), "case {i}: wrong error {e:?}");
                assert!(e.to_string().len() > 10, "case {i}: message {e}");
            }
        }
    }
    assert!(matches!(
        ip::standard_pressure(50_000.0),
        Err(E::ElevationOutOfRange { .. })
    ));
    assert!(matches!(
        si::dew_point_from_vapour_pressure(1e-9),
        Err(E::SolutionOutOfRange { .. })
    ));
    assert!(matches!(
        si::specific_volume(20.0, 1e300, 1e-300),
        Err(E::NotRepresentable { .. })
    ));
    assert!(matches!(
        si::hum_ratio_from_vapour_pressure(2e5, 101_325.0),
        Err(E::VapourPressureNotBelowTotal { .. })
    ));
    let msg = ip::State::from_db_wb(75.0, 80.0, p)
        .map(|_| ())
        .err()
        .map(|e| e.to_string());
    assert_eq!(
        msg.as_deref(),
        Some("wet bulb 80 °F is above dry bulb 75 °F")
    );
}

/// Saturated air: wet bulb and dew point equal the dry bulb, in both systems,
/// above and below freezing.
#[test]
fn saturated_air() {
    for t in [-40.0, 0.0, 31.9, 32.0, 32.1, 50.0, 95.0] {
        let s = match ip::State::from_db_rh(t, 1.0, 14.696) {
            Ok(s) => s,
            Err(e) => panic!("{t}: {e}"),
        };
        assert!((s.wet_bulb() - t).abs() < 1e-6, "{t}: {s:?}");
        assert!((s.dew_point() - t).abs() < 1e-5, "{t}: {s:?}");
        let w = match ip::State::from_db_wb(t, t, 14.696) {
            Ok(w) => w,
            Err(e) => panic!("{t}: {e}"),
        };
        assert!((w.rh() - 1.0).abs() < 1e-3, "{t}: {w:?}");
    }
}

/// Below freezing, the dew point of the crate is the frost point (saturation
/// over ice, Hyland–Wexler eq. 5), as psychrolib's: at −20 °F and 50 % RH
/// psychrolib 2.5.0 gives −31.777640 °F.
#[test]
fn frost_point_below_freezing() {
    let s = match ip::State::from_db_rh(-20.0, 0.5, 14.696) {
        Ok(s) => s,
        Err(e) => panic!("{e}"),
    };
    assert!((s.dew_point() - -31.777_640).abs() < 0.001, "{s:?}");
}
