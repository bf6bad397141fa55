//! Property tests (proptest): no NaN, no infinity and no panic for any `f64`
//! input, the invariants of a state, and round trips through the inverses.

use plenum_psychro::{PA_PER_PSI, PsychroError, ip, si};
use proptest::prelude::*;
use proptest::test_runner::Config;

/// Any f64 at all: NaN, ±inf, subnormals, huge values.
fn any() -> impl Strategy<Value = f64> {
    prop_oneof![
        proptest::num::f64::ANY,
        -1e6..1e6f64,
        -300.0..500.0f64,
        0.0..1.0f64,
        Just(0.0),
        Just(-0.0),
        Just(f64::MIN_POSITIVE),
        Just(f64::MAX),
        Just(f64::MIN),
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::NEG_INFINITY),
    ]
}

fn finite_or_err(r: Result<f64, PsychroError>) -> Result<(), TestCaseError> {
    if let Ok(x) = r {
        prop_assert!(x.is_finite(), "returned {x}");
    }
    Ok(())
}

/// Every getter finite, and the physical order dp ≤ wb ≤ db, 0 ≤ RH ≤ 1.
macro_rules! check_state {
    ($s:expr) => {{
        let s = $s;
        for x in [
            s.dry_bulb(),
            s.wet_bulb(),
            s.dew_point(),
            s.rh(),
            s.rh_percent(),
            s.hum_ratio(),
            s.sat_hum_ratio(),
            s.vapour_pressure(),
            s.enthalpy(),
            s.specific_volume(),
            s.density(),
            s.pressure(),
        ] {
            prop_assert!(x.is_finite(), "{s:?}");
        }
        prop_assert!(s.dew_point() <= s.wet_bulb(), "{s:?}");
        prop_assert!(s.wet_bulb() <= s.dry_bulb(), "{s:?}");
        prop_assert!((0.0..=1.0).contains(&s.rh()), "{s:?}");
        prop_assert!(
            s.hum_ratio() >= 0.0 && s.hum_ratio() <= s.sat_hum_ratio(),
            "{s:?}"
        );
        prop_assert!(s.specific_volume() > 0.0 && s.density() > 0.0, "{s:?}");
    }};
}

/// The same battery over one unit-system module.
macro_rules! total_functions {
    ($name:ident, $m:ident) => {
        proptest! {
            #![proptest_config(Config::with_cases(400))]
            #[test]
            fn $name(a in any(), b in any(), c in any()) {
                finite_or_err($m::sat_vapour_pressure(a))?;
                finite_or_err($m::sat_hum_ratio(a, b))?;
                finite_or_err($m::hum_ratio_from_vapour_pressure(a, b))?;
                finite_or_err($m::vapour_pressure_from_hum_ratio(a, b))?;
                finite_or_err($m::hum_ratio_from_rh(a, b, c))?;
                finite_or_err($m::rh_from_hum_ratio(a, b, c))?;
                finite_or_err($m::hum_ratio_from_wet_bulb(a, b, c))?;
                finite_or_err($m::wet_bulb(a, b, c))?;
                finite_or_err($m::hum_ratio_from_dew_point(a, b))?;
                finite_or_err($m::dew_point(a, b))?;
                finite_or_err($m::dew_point_from_vapour_pressure(a))?;
                finite_or_err($m::enthalpy(a, b))?;
                finite_or_err($m::dry_bulb_from_enthalpy(a, b))?;
                finite_or_err($m::specific_volume(a, b, c))?;
                finite_or_err($m::density(a, b, c))?;
                finite_or_err($m::standard_pressure(a))?;
                for s in [
                    $m::State::from_db_w(a, b, c),
                    $m::State::from_db_rh(a, b, c),
                    $m::State::from_db_wb(a, b, c),
                    $m::State::from_db_dp(a, b, c),
                    $m::State::from_h_w(a, b, c),
                ]
                .into_iter()
                .flatten()
                {
                    check_state!(s);
                }
            }
        }
    };
}

total_functions!(si_functions_are_total, si);
total_functions!(ip_functions_are_total, ip);

proptest! {
    #![proptest_config(Config::with_cases(400))]

    /// Over the whole range of the correlations and any sensible pressure,
    /// a (db, RH) state either exists with all its invariants or is an error.
    #[test]
    fn ip_states_over_the_whole_range(db in -148.0..392.0f64, rh in 0.0..=1.0f64, p in 1.0..60.0f64) {
        if let Ok(s) = ip::State::from_db_rh(db, rh, p) {
            check_state!(s);
            prop_assert!((s.rh() - rh).abs() < 1e-9);
        }
    }

    /// Ordinary conditions always give a state (no spurious errors).
    #[test]
    fn ordinary_conditions_always_give_a_state(
        db in -40.0..120.0f64, rh in 0.02..=1.0f64, z in 0.0..10_000.0f64,
    ) {
        let p = ip::standard_pressure(z);
        prop_assert!(p.is_ok());
        let p = p.unwrap_or(f64::NAN);
        let s = ip::State::from_db_rh(db, rh, p);
        prop_assert!(s.is_ok(), "{s:?}");
    }

    /// W → dew point → W (IP), and the dew point to 0.001 °F.
    #[test]
    fn dew_point_round_trip_ip(tdp in -140.0..200.0f64, p in 5.0..16.0f64) {
        let w = ip::hum_ratio_from_dew_point(tdp, p);
        prop_assume!(w.is_ok());
        let w = w.unwrap_or(f64::NAN);
        let back = ip::dew_point(w, p).unwrap_or(f64::NAN);
        prop_assert!((back - tdp).abs() < 0.001, "{tdp} -> {w} -> {back}");
        let w2 = ip::hum_ratio_from_dew_point(back, p).unwrap_or(f64::NAN);
        prop_assert!(((w2 - w) / w).abs() < 1e-6, "{w} -> {back} -> {w2}");
    }

    /// W → dew point → W (SI), over very dry to very humid air.
    #[test]
    fn dew_point_round_trip_si(log_w in -7.0..-0.5f64, p in 30_000.0..110_000.0f64) {
        let w = 10f64.powf(log_w);
        let tdp = si::dew_point(w, p);
        prop_assume!(tdp.is_ok());
        let tdp = tdp.unwrap_or(f64::NAN);
        let w2 = si::hum_ratio_from_dew_point(tdp, p).unwrap_or(f64::NAN);
        prop_assert!(((w2 - w) / w).abs() < 1e-6, "{w} -> {tdp} -> {w2}");
    }

    /// db + RH → wet bulb → back to RH.
    #[test]
    fn wet_bulb_round_trip_ip(db in -40.0..150.0f64, rh in 0.03..=1.0f64, p in 9.0..15.0f64) {
        let s = ip::State::from_db_rh(db, rh, p);
        prop_assume!(s.is_ok());
        let Ok(s) = s else { unreachable!() };
        // In the narrow band where neither wet-bulb form has a root the wet
        // bulb is pinned at freezing and the balance cannot give W back.
        prop_assume!((s.wet_bulb() - 32.0).abs() > 1e-4);
        let back = ip::State::from_db_wb(db, s.wet_bulb(), p);
        prop_assert!(back.is_ok(), "{back:?}");
        let Ok(back) = back else { unreachable!() };
        prop_assert!((back.rh() - rh).abs() < 1e-5, "{rh} -> {} -> {}", s.wet_bulb(), back.rh());
        prop_assert!(((back.hum_ratio() - s.hum_ratio()) / s.hum_ratio()).abs() < 1e-4);
    }

    #[test]
    fn wet_bulb_round_trip_si(db in -40.0..65.0f64, rh in 0.03..=1.0f64, p in 60_000.0..105_000.0f64) {
        let s = si::State::from_db_rh(db, rh, p);
        prop_assume!(s.is_ok());
        let Ok(s) = s else { unreachable!() };
        prop_assume!(s.wet_bulb().abs() > 1e-4);
        let back = si::State::from_db_wb(db, s.wet_bulb(), p);
        prop_assert!(back.is_ok(), "{back:?}");
        let Ok(back) = back else { unreachable!() };
        prop_assert!((back.rh() - rh).abs() < 1e-5, "{rh} -> {} -> {}", s.wet_bulb(), back.rh());
    }

    /// (h, W) → db → h.
    #[test]
    fn enthalpy_round_trip(db in -140.0..380.0f64, w in 0.0..0.5f64) {
        let h_ip = ip::enthalpy(db, w).unwrap_or(f64::NAN);
        let back_ip = ip::dry_bulb_from_enthalpy(h_ip, w).and_then(|t| ip::enthalpy(t, w));
        let t_si = (db - 32.0) / 1.8;
        let h_si = si::enthalpy(t_si, w).unwrap_or(f64::NAN);
        let back_si = si::dry_bulb_from_enthalpy(h_si, w).and_then(|t| si::enthalpy(t, w));
        for (h, back) in [(h_ip, back_ip), (h_si, back_si)] {
            let h2 = back.unwrap_or(f64::NAN);
            prop_assert!((h2 - h).abs() <= 1e-9 * (1.0 + h.abs()), "{h} -> {h2}");
        }
    }

    /// A (h, W) state reproduces its h and W.
    #[test]
    fn state_from_h_w_round_trip(db in -40.0..120.0f64, rh in 0.05..=1.0f64, p in 10.0..15.0f64) {
        let s = ip::State::from_db_rh(db, rh, p);
        prop_assume!(s.is_ok());
        let Ok(s) = s else { unreachable!() };
        let m = ip::State::from_h_w(s.enthalpy(), s.hum_ratio(), p);
        prop_assert!(m.is_ok(), "{m:?}");
        let Ok(m) = m else { unreachable!() };
        prop_assert!((m.dry_bulb() - db).abs() < 1e-9);
        prop_assert!((m.enthalpy() - s.enthalpy()).abs() < 1e-9 * (1.0 + s.enthalpy().abs()));
    }

    /// IP → SI → IP keeps dry bulb, W and pressure.
    #[test]
    fn unit_system_round_trip(db in -100.0..150.0f64, rh in 0.05..=1.0f64, p in 8.0..15.0f64) {
        let s = ip::State::from_db_rh(db, rh, p);
        prop_assume!(s.is_ok());
        let Ok(s) = s else { unreachable!() };
        let back = s.to_si().and_then(|x| x.to_ip());
        prop_assert!(back.is_ok(), "{back:?}");
        let Ok(back) = back else { unreachable!() };
        prop_assert!((back.dry_bulb() - db).abs() < 1e-9);
        prop_assert!((back.hum_ratio() - s.hum_ratio()).abs() <= 1e-3 * s.hum_ratio());
        prop_assert!((back.pressure() - p).abs() < 1e-9 * p);
        let si_p = s.to_si().map(|x| x.pressure()).unwrap_or(f64::NAN);
        prop_assert!((si_p - p * PA_PER_PSI).abs() < 1e-6);
    }

    /// The wet bulb lies between dew point and dry bulb, and rises with W.
    #[test]
    fn wet_bulb_rises_with_humidity(db in 0.0..110.0f64, r1 in 0.05..1.0f64, r2 in 0.05..1.0f64) {
        let (lo, hi) = if r1 < r2 { (r1, r2) } else { (r2, r1) };
        prop_assume!(hi - lo > 1e-3);
        let a = ip::State::from_db_rh(db, lo, 14.696);
        let b = ip::State::from_db_rh(db, hi, 14.696);
        prop_assume!(a.is_ok() && b.is_ok());
        let (Ok(a), Ok(b)) = (a, b) else { unreachable!() };
        // Monotone except across the handbook's jump at freezing (< 1.2 °F).
        prop_assert!(b.wet_bulb() >= a.wet_bulb() - 1.2, "{a:?} {b:?}");
        prop_assert!(b.dew_point() > a.dew_point());
    }
}

/// Deterministic companion of the property tests: every function and
/// constructor on the cross product of awkward values.
#[test]
fn special_values_cross_product() {
    let vals = [
        f64::NAN,
        f64::INFINITY,
        f64::NEG_INFINITY,
        f64::MAX,
        f64::MIN,
        f64::MIN_POSITIVE,
        f64::EPSILON,
        1e-300,
        -1e-300,
        0.0,
        -0.0,
        1e-9,
        0.5,
        1.0,
        0.01,
        32.0,
        32.018,
        100.0,
        200.0,
        392.0,
        -100.0,
        -148.0,
        14.696,
        101_325.0,
        1e300,
    ];
    let fin = |r: Result<f64, PsychroError>| r.map_or(true, f64::is_finite);
    for &a in &vals {
        for &b in &vals {
            assert!(
                fin(si::sat_hum_ratio(a, b)) && fin(ip::sat_hum_ratio(a, b)),
                "{a} {b}"
            );
            assert!(
                fin(si::dew_point(a, b)) && fin(ip::dew_point(a, b)),
                "{a} {b}"
            );
            assert!(
                fin(si::enthalpy(a, b)) && fin(ip::enthalpy(a, b)),
                "{a} {b}"
            );
            assert!(fin(si::dry_bulb_from_enthalpy(a, b)) && fin(ip::dry_bulb_from_enthalpy(a, b)));
            assert!(fin(si::hum_ratio_from_vapour_pressure(a, b)));
            assert!(fin(ip::vapour_pressure_from_hum_ratio(a, b)));
            for &c in &vals {
                assert!(
                    fin(si::wet_bulb(a, b, c)) && fin(ip::wet_bulb(a, b, c)),
                    "{a} {b} {c}"
                );
                assert!(fin(si::hum_ratio_from_wet_bulb(a, b, c)), "{a} {b} {c}");
                assert!(fin(ip::hum_ratio_from_rh(a, b, c)) && fin(ip::rh_from_hum_ratio(a, b, c)));
                assert!(fin(si::specific_volume(a, b, c)) && fin(ip::density(a, b, c)));
                for s in [
                    ip::State::from_db_w(a, b, c),
                    ip::State::from_db_rh(a, b, c),
                    ip::State::from_db_wb(a, b, c),
                    ip::State::from_db_dp(a, b, c),
                    ip::State::from_h_w(a, b, c),
                ]
                .into_iter()
                .flatten()
                {
                    assert!(s.dry_bulb().is_finite() && s.density().is_finite(), "{s:?}");
                    assert!(s.dew_point() <= s.wet_bulb() && s.wet_bulb() <= s.dry_bulb());
                }
                for s in [
                    si::State::from_db_w(a, b, c),
                    si::State::from_db_rh(a, b, c),
                    si::State::from_db_wb(a, b, c),
                    si::State::from_db_dp(a, b, c),
                    si::State::from_h_w(a, b, c),
                ]
                .into_iter()
                .flatten()
                {
                    assert!(
                        s.enthalpy().is_finite() && s.specific_volume().is_finite(),
                        "{s:?}"
                    );
                    assert!(s.dew_point() <= s.wet_bulb() && s.wet_bulb() <= s.dry_bulb());
                }
            }
        }
        assert!(fin(si::sat_vapour_pressure(a)) && fin(ip::standard_pressure(a)));
        assert!(fin(ip::dew_point_from_vapour_pressure(a)));
    }
}
