//! Property tests of quantity arithmetic: the algebra of real numbers within floating-point
//! tolerance, the dimension algebra, the temperature rules of methods.md §6 and issue 3, round
//! trips through SI, and that no operation produces NaN or infinity.

use plenum_units::{Dimension, Quantity, QuantityError, Unit, UnitSystem, catalog};
use proptest::prelude::*;

const DIMS: [Dimension; 16] = [
    Dimension::RATIO,
    Dimension::LENGTH,
    Dimension::AREA,
    Dimension::MASS,
    Dimension::TIME,
    Dimension::TEMPERATURE_DIFFERENCE,
    Dimension::ENERGY,
    Dimension::HEAT_FLOW,
    Dimension::AIRFLOW,
    Dimension::PRESSURE,
    Dimension::VELOCITY,
    Dimension::HUMIDITY_RATIO,
    Dimension::SPECIFIC_ENTHALPY,
    Dimension::COUNT,
    Dimension::AIRFLOW_PER_PERSON,
    Dimension::POWER_PER_AREA,
];

fn dim() -> impl Strategy<Value = Dimension> {
    prop::sample::select(&DIMS[..])
}

/// Moderate finite values, so that sums and products stay finite.
fn value() -> impl Strategy<Value = f64> {
    prop_oneof![-1e6..1e6f64, Just(0.0), -1e-3..1e-3f64]
}

fn q(v: f64, d: Dimension) -> Quantity {
    Quantity::from_si(v, d).unwrap_or_else(|e| panic!("{v}: {e}"))
}

fn unit(text: &str) -> Unit {
    Unit::parse(text).unwrap_or_else(|e| panic!("`{text}`: {e}"))
}

fn lit(v: f64, u: &str) -> Quantity {
    Quantity::new(v, &unit(u)).unwrap_or_else(|e| panic!("{v} {u}: {e}"))
}

fn close(a: f64, b: f64, scale: f64) -> bool {
    (a - b).abs() <= 1e-12 * scale.max(1e-300)
}

proptest! {
    #[test]
    fn addition_and_multiplication_commute(a in value(), b in value(), d in dim(), e in dim()) {
        prop_assert_eq!(q(a, d) + q(b, d), q(b, d) + q(a, d));
        prop_assert_eq!(q(a, d) * q(b, e), q(b, e) * q(a, d));
    }

    #[test]
    fn addition_associates_within_tolerance(a in value(), b in value(), c in value(), d in dim()) {
        let left = ((q(a, d) + q(b, d))? + q(c, d))?;
        let right = (q(a, d) + (q(b, d) + q(c, d))?)?;
        prop_assert_eq!(left.dimension(), right.dimension());
        prop_assert!(close(left.value(), right.value(), a.abs() + b.abs() + c.abs()));
    }

    #[test]
    fn multiplication_associates_within_tolerance(
        a in value(), b in value(), c in value(), d in dim(), e in dim(), f in dim()
    ) {
        let left = ((q(a, d) * q(b, e))? * q(c, f))?;
        let right = (q(a, d) * (q(b, e) * q(c, f))?)?;
        prop_assert_eq!(left.dimension(), right.dimension());
        prop_assert!(close(left.value(), right.value(), (a * b * c).abs()));
    }

    #[test]
    fn multiplication_distributes_over_addition(
        a in value(), b in value(), c in value(), d in dim(), e in dim()
    ) {
        let left = (q(a, d) * (q(b, e) + q(c, e))?)?;
        let right = ((q(a, d) * q(b, e))? + (q(a, d) * q(c, e))?)?;
        prop_assert_eq!(left.dimension(), right.dimension());
        prop_assert!(close(left.value(), right.value(), a.abs() * (b.abs() + c.abs())));
    }

    #[test]
    fn quotient_times_divisor_has_the_dimension_of_the_dividend(
        a in value(), b in value().prop_filter("nonzero", |b| *b != 0.0), d in dim(), e in dim()
    ) {
        let back = ((q(a, d) / q(b, e))? * q(b, e))?;
        prop_assert_eq!(back.dimension(), d);
        prop_assert!(close(back.value(), a, a.abs()));
        // and the dimension algebra agrees with the quantity algebra
        prop_assert_eq!(d.checked_div(e).and_then(|x| x.checked_mul(e)), Some(d));
    }

    #[test]
    fn subtraction_undoes_addition(a in value(), b in value(), d in dim()) {
        let back = ((q(a, d) + q(b, d))? - q(b, d))?;
        prop_assert!(close(back.value(), a, a.abs() + b.abs()));
        prop_assert_eq!((q(a, d) - q(a, d))?.value(), 0.0);
    }

    #[test]
    fn different_dimensions_do_not_add(a in value(), b in value(), d in dim(), e in dim()) {
        prop_assume!(d != e);
        prop_assert_eq!(
            q(a, d) + q(b, e),
            Err(QuantityError::Incompatible { op: '+', left: d, right: e })
        );
        let sub = matches!(q(a, d) - q(b, e), Err(QuantityError::Incompatible { op: '-', .. }));
        prop_assert!(sub);
    }

    #[test]
    fn powers_multiply_dimensions(a in -1e3..1e3f64, n in -4i32..=4, d in dim()) {
        match q(a, d).powi(n) {
            Ok(p) => {
                prop_assert_eq!(Some(p.dimension()), d.checked_pow(n));
                prop_assert!(close(p.value(), a.powi(n), a.powi(n).abs()));
            }
            Err(e) => prop_assert!(a == 0.0 && n < 0 && e == QuantityError::DivisionByZero),
        }
    }

    /// No NaN or infinity from any operation, on any input, of any dimension: every result is
    /// a finite quantity or a typed error.
    #[test]
    fn no_operation_produces_nan_or_infinity(
        a in any::<f64>(), b in any::<f64>(), d in dim(), e in dim(), n in any::<i32>(),
        abs_a in any::<bool>(), abs_b in any::<bool>()
    ) {
        let make = |v: f64, d: Dimension, abs: bool| {
            let d = if abs { Dimension::TEMPERATURE } else { d };
            Quantity::from_si(v, d)
        };
        let (qa, qb) = match (make(a, d, abs_a), make(b, e, abs_b)) {
            (Ok(x), Ok(y)) => (x, y),
            (x, y) => {
                // Only non-finite inputs are refused.
                prop_assert_eq!(x.is_err(), !a.is_finite());
                prop_assert_eq!(y.is_err(), !b.is_finite());
                return Ok(());
            }
        };
        let results = [qa + qb, qa - qb, qa * qb, qa / qb, qa.powi(n), -qa];
        for r in results.into_iter().flatten() {
            prop_assert!(r.value().is_finite());
        }
        for u in ["°F", "°C", "kBtu/h", "cfm", "%", "gr/lb"] {
            if let Ok(v) = qa.in_unit(&unit(u)) {
                prop_assert!(v.is_finite());
            }
        }
        prop_assert!(Quantity::new(a, &unit("°F")).map(|x| x.value().is_finite()).unwrap_or(true));
    }

    #[test]
    fn every_unit_round_trips_through_si(i in 0usize..1000, v in -1e6..1e6f64) {
        let defs = catalog();
        let def = defs[i % defs.len()];
        let u = unit(def.symbol());
        let back = Quantity::new(v, &u)?.in_unit(&u)?;
        // Affine scales lose a little to the offset (|v| + 460 instead of |v|).
        prop_assert!((back - v).abs() <= 1e-12 * (v.abs() + 500.0), "{} {} → {}", v, def.symbol(), back);
    }

    #[test]
    fn compound_units_round_trip_through_si(i in 0usize..1000, v in -1e6..1e6f64) {
        const UNITS: [&str; 12] = [
            "kBtu/h", "L/s/person", "cfm/ft²", "W/ft²", "m³/h", "Btu/(h·ft²)", "Btu/lb",
            "kJ/kg", "°F/h", "L/(s·m²)", "ft^3/lb", "Btu/(lb·°F)",
        ];
        let u = unit(UNITS[i % UNITS.len()]);
        let back = Quantity::new(v, &u)?.in_unit(&u)?;
        prop_assert!(close(back, v, v.abs()), "{} {} → {}", v, u, back);
    }

    #[test]
    fn preferred_units_round_trip(v in -1e6..1e6f64, d in dim(), ip in any::<bool>()) {
        let system = if ip { UnitSystem::Ip } else { UnitSystem::Si };
        let x = Quantity::from_system(v, d, system)?;
        prop_assert_eq!(x.dimension(), d);
        prop_assert!(close(x.in_system(system)?, v, v.abs()));
    }

    // ---- temperatures -------------------------------------------------------------------

    #[test]
    fn temperature_minus_temperature_is_a_difference(
        a in -100.0..200.0f64, b in -100.0..200.0f64, sa in 0usize..3, sb in 0usize..3
    ) {
        // °F, °C, °R (a kelvin literal is a difference in arithmetic, tested below).
        let left = ["°F", "°C", "°R"][sa];
        let right = ["°F", "°C", "°R"][sb];
        let (ta, tb) = (lit(a, left), lit(b, right));
        let dt = (ta - tb)?;
        prop_assert_eq!(dt.dimension(), Dimension::TEMPERATURE_DIFFERENCE);
        prop_assert!(close(dt.value(), ta.value() - tb.value(), 1e3));
        // temperature − difference = temperature, and it gives back the subtrahend
        let back = (ta - dt)?;
        prop_assert_eq!(back.dimension(), Dimension::TEMPERATURE);
        prop_assert!((back.value() - tb.value()).abs() < 1e-9);
        // temperature + difference = temperature, in either order
        let t2 = (tb + dt)?;
        prop_assert_eq!(t2.dimension(), Dimension::TEMPERATURE);
        prop_assert_eq!((dt + tb)?.dimension(), Dimension::TEMPERATURE);
        prop_assert!((t2.value() - ta.value()).abs() < 1e-9);
        // difference − temperature is refused
        prop_assert_eq!(dt - tb, Err(QuantityError::DifferenceMinusAbsolute));
    }

    #[test]
    fn temperature_plus_temperature_is_an_error(
        a in -100.0..200.0f64, b in -100.0..200.0f64, sa in 0usize..3, sb in 0usize..3
    ) {
        let scales = ["°F", "°C", "°R"];
        prop_assert_eq!(lit(a, scales[sa]) + lit(b, scales[sb]), Err(QuantityError::AbsoluteSum));
        // and a computed temperature (not a literal) is no exception
        let computed = (lit(a, scales[sa]) + lit(1.0, "Δ°F"))?;
        prop_assert_eq!(computed + computed, Err(QuantityError::AbsoluteSum));
        // while a kelvin literal is an increment to it
        prop_assert_eq!((computed + lit(b.abs(), "K"))?.dimension(), Dimension::TEMPERATURE);
    }

    #[test]
    fn kelvin_literal_is_an_increment_next_to_a_temperature(t in -50.0..50.0f64, k in 0.0..30.0f64) {
        let c = lit(t, "°C");
        let warmer = (c + lit(k, "K"))?;
        prop_assert_eq!(warmer.dimension(), Dimension::TEMPERATURE);
        prop_assert!((warmer.in_unit(&unit("°C"))? - (t + k)).abs() < 1e-9);
        prop_assert_eq!((lit(k, "K") + c)?.dimension(), Dimension::TEMPERATURE);
        let cooler = (c - lit(k, "K"))?;
        prop_assert_eq!(cooler.dimension(), Dimension::TEMPERATURE);
        prop_assert!((cooler.in_unit(&unit("°C"))? - (t - k)).abs() < 1e-9);
        // kelvin literals combine as differences
        let diff = Dimension::TEMPERATURE_DIFFERENCE;
        prop_assert_eq!((lit(k, "K") + lit(t.abs(), "K"))?.dimension(), diff);
        prop_assert_eq!((lit(k, "K") - lit(t.abs(), "K"))?.dimension(), diff);
        prop_assert_eq!((lit(k, "K") + lit(t, "Δ°F"))?.dimension(), diff);
        prop_assert_eq!((lit(t, "Δ°F") - lit(k, "K"))?.dimension(), diff);
        prop_assert_eq!((lit(2.0, "%") * lit(k, "K"))?.dimension(), diff);
        prop_assert_eq!((-lit(k, "K"))?.value(), -k);
        // except on the left of a temperature: `300 K - 14 °C` is 12.85 K of difference
        let d = (lit(k + 273.15, "K") - c)?;
        prop_assert_eq!(d.dimension(), diff);
        prop_assert!((d.value() - (k - t)).abs() < 1e-9);
        // and alone, for a temperature key, it is a temperature
        prop_assert_eq!(lit(k, "K").require(Dimension::TEMPERATURE)?.dimension(), Dimension::TEMPERATURE);
    }

    #[test]
    fn differences_add_and_subtract(a in -50.0..50.0f64, b in -50.0..50.0f64) {
        let (da, db) = (lit(a, "Δ°F"), lit(b, "K"));
        prop_assert_eq!((da + db)?.dimension(), Dimension::TEMPERATURE_DIFFERENCE);
        prop_assert_eq!((da - db)?.dimension(), Dimension::TEMPERATURE_DIFFERENCE);
        prop_assert!(close((da + db)?.value(), a / 1.8 + b, 100.0));
    }

    #[test]
    fn temperatures_do_not_scale(t in -100.0..200.0f64, x in value(), d in dim(), n in -3i32..=3) {
        let ta = lit(t, "°F");
        prop_assert_eq!(ta * q(x, d), Err(QuantityError::AbsoluteScaled));
        prop_assert_eq!(q(x, d) * ta, Err(QuantityError::AbsoluteScaled));
        prop_assert_eq!(ta / q(1.0, d), Err(QuantityError::AbsoluteScaled));
        prop_assert_eq!(q(x, d) / ta, Err(QuantityError::AbsoluteScaled));
        prop_assert_eq!(-ta, Err(QuantityError::AbsoluteScaled));
        if n == 1 {
            prop_assert_eq!(ta.powi(n), Ok(ta));
        } else {
            prop_assert_eq!(ta.powi(n), Err(QuantityError::AbsoluteScaled));
        }
    }

    #[test]
    fn a_temperature_literal_reads_as_a_difference(v in -100.0..200.0f64, s in 0usize..4) {
        let (u, degree) = [("°F", 1.0 / 1.8), ("°C", 1.0), ("K", 1.0), ("°R", 1.0 / 1.8)][s];
        let d = lit(v, u).require(Dimension::TEMPERATURE_DIFFERENCE)?;
        prop_assert_eq!(d.dimension(), Dimension::TEMPERATURE_DIFFERENCE);
        prop_assert!(close(d.value(), v * degree, v.abs()));
        prop_assert!(close(d.in_unit(&unit(u))?, v, v.abs()));
        // through a `let`: the literal is copied, not recomputed
        let named = lit(v, u);
        prop_assert!(named.as_difference().is_some());
        // a computed temperature is not a literal
        let computed = (lit(v, ["°F", "°C", "°R", "°C"][s]) + lit(1.0, "Δ°F"))?;
        prop_assert_eq!(computed.dimension(), Dimension::TEMPERATURE);
        prop_assert_eq!(computed.as_difference(), None);
        prop_assert!(computed.require(Dimension::TEMPERATURE_DIFFERENCE).is_err());
    }

    /// The unit parser never panics, and what it accepts has a finite positive factor.
    #[test]
    fn parser_is_total(text in "\\PC{0,24}", number in "[-+]?[0-9_]{0,5}[.]?[0-9]{0,3}([eE][-+]?[0-9]{0,3})? ?") {
        if let Ok(u) = Unit::parse(&text) {
            prop_assert!(u.factor().is_finite() && u.factor() > 0.0);
        }
        let whole = format!("{number}{text}");
        match Quantity::parse(&whole) {
            Ok(x) => prop_assert!(x.value().is_finite()),
            Err(plenum_units::ParseQuantityError::Unit(e)) => {
                let span = e.span().unwrap_or(0..0);
                prop_assert!(span.end <= whole.len() && whole.is_char_boundary(span.start) && whole.is_char_boundary(span.end));
            }
            Err(_) => {}
        }
    }

    #[test]
    fn parser_is_total_on_unit_like_text(
        text in "[()/*·^²³⁻0-9]{0,3}(ft|m|kBtu|h|°F|cfm|gr/lb|L|s|person|%rh|in\\.wg)?[()/*·^²³⁻0-9-]{0,4}(ft|m|kW|h|°C|s)?[()/*^²0-9]{0,3}"
    ) {
        match Unit::parse(&text) {
            Ok(u) => {
                prop_assert!(u.factor().is_finite() && u.factor() > 0.0);
                // The canonical label reads back as the same unit.
                let again = Unit::parse(&u.to_string());
                if !u.to_string().is_empty() && u.to_string() != "1" {
                    let again = again.map_err(|e| TestCaseError::fail(format!("{u}: {e}")))?;
                    prop_assert_eq!(again.dimension(), u.dimension());
                    prop_assert!(close(again.factor(), u.factor(), u.factor()));
                }
            }
            Err(e) => {
                if let Some(span) = e.span() {
                    prop_assert!(span.start <= span.end && span.end <= text.len());
                    prop_assert!(text.is_char_boundary(span.start) && text.is_char_boundary(span.end));
                }
            }
        }
    }
}

#[test]
fn division_by_zero_and_overflow_are_errors() {
    let one = q(1.0, Dimension::HEAT_FLOW);
    let zero = q(0.0, Dimension::AIRFLOW);
    assert_eq!(one / zero, Err(QuantityError::DivisionByZero));
    assert_eq!(
        one / q(-0.0, Dimension::RATIO),
        Err(QuantityError::DivisionByZero)
    );
    assert_eq!(zero.powi(-1), Err(QuantityError::DivisionByZero));
    let big = q(1e200, Dimension::LENGTH);
    assert_eq!(big * big, Err(QuantityError::Overflow));
    assert_eq!(big.powi(2), Err(QuantityError::Overflow));
    assert_eq!(
        q(f64::MAX, Dimension::RATIO) + q(f64::MAX, Dimension::RATIO),
        Err(QuantityError::Overflow)
    );
    assert_eq!(
        Quantity::new(1e306, &unit("MBH")),
        Err(QuantityError::Overflow)
    );
    assert_eq!(
        Quantity::new(f64::NAN, &unit("cfm")),
        Err(QuantityError::NotFinite)
    );
    assert_eq!(
        Quantity::from_si(f64::INFINITY, Dimension::RATIO),
        Err(QuantityError::NotFinite)
    );
    assert_eq!(
        Quantity::number(f64::NEG_INFINITY),
        Err(QuantityError::NotFinite)
    );
    assert_eq!(
        q(1.0, Dimension::LENGTH).powi(200),
        Err(QuantityError::PowerOutOfRange)
    );
}

/// Issue 3 "done when": `let t = 75 °F + 75 °F` is an error; `supply_dt 75 °F - 57 °F` is
/// accepted as 18 °F.
#[test]
fn issue_3_temperature_examples() {
    assert_eq!(
        lit(75.0, "°F") + lit(75.0, "°F"),
        Err(QuantityError::AbsoluteSum)
    );
    let dt = (lit(75.0, "°F") - lit(57.0, "°F"))
        .and_then(|d| d.require(Dimension::TEMPERATURE_DIFFERENCE))
        .expect("75 °F - 57 °F");
    assert!((dt.in_unit(&unit("°F")).expect("in °F") - 18.0).abs() < 1e-9);
    assert!((dt.in_system(UnitSystem::Ip).expect("IP") - 18.0).abs() < 1e-9);
    assert!((dt.in_system(UnitSystem::Si).expect("SI") - 10.0).abs() < 1e-9);
    // `°C + K is °C`
    let t = (lit(14.0, "°C") + lit(3.0, "K")).expect("14 °C + 3 K");
    assert_eq!(t.dimension(), Dimension::TEMPERATURE);
    assert!((t.in_unit(&unit("°C")).expect("°C") - 17.0).abs() < 1e-9);
    // a difference cannot be read as an absolute temperature
    assert_eq!(
        dt.require(Dimension::TEMPERATURE),
        Err(QuantityError::Mismatch {
            expected: Dimension::TEMPERATURE,
            found: Dimension::TEMPERATURE_DIFFERENCE
        })
    );
    // an absolute temperature cannot be converted into a difference unit
    assert!(lit(57.0, "°F").in_unit(&unit("Δ°F")).is_err());
}

/// language.md: `let reading_lights = 0.9 W/ft² * 2_400 ft²` is a heat flow of 2,160 W.
#[test]
fn language_md_arithmetic_examples() {
    let lights = (lit(0.9, "W/ft²") * lit(2_400.0, "ft²")).expect("lights");
    assert_eq!(lights.dimension(), Dimension::HEAT_FLOW);
    assert!((lights.value() - 2_160.0).abs() < 1e-9);
    let area = (lit(20.0, "ft") * lit(120.0, "ft")).expect("area");
    assert_eq!(area.dimension(), Dimension::AREA);
    assert!((area.in_unit(&unit("ft²")).expect("ft²") - 2_400.0).abs() < 1e-9);
    // `3 * 250 Btu/h + 1.2 kW`
    let gain = (q(3.0, Dimension::RATIO) * lit(250.0, "Btu/h"))
        .and_then(|x| x + lit(1.2, "kW"))
        .expect("gain");
    assert!(
        (gain.in_unit(&unit("Btu/h")).expect("Btu/h") - (750.0 + 1_200.0 / 0.293_071_070_17)).abs()
            < 1e-6
    );
    // `0.06 cfm/ft² * 2_400 ft² + 5 cfm/person * 40 people` (62.1-style breathing zone)
    let vbz = (lit(0.06, "cfm/ft²") * lit(2_400.0, "ft²"))
        .and_then(|a| Ok((a, (lit(5.0, "cfm/person") * lit(40.0, "people"))?)))
        .and_then(|(a, b)| a + b)
        .expect("Vbz");
    assert_eq!(vbz.dimension(), Dimension::AIRFLOW);
    assert!((vbz.in_unit(&unit("cfm")).expect("cfm") - 344.0).abs() < 1e-9);
}

#[test]
fn relative_humidity_literal_is_remembered_until_arithmetic() {
    let rh = lit(50.0, "%rh");
    assert!(rh.is_relative_humidity());
    assert_eq!(rh.value(), 0.5);
    assert_eq!(rh, lit(50.0, "%"));
    assert!(!lit(50.0, "%").is_relative_humidity());
    assert!(!(rh + lit(5.0, "%")).expect("sum").is_relative_humidity());
}
