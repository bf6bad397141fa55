//! Display precision rules (common practice of HVAC design documents: tons to 0.1, Btu/h to
//! 10, cfm to 5, temperatures to 0.1, RH to whole percent), rounding edges, separators,
//! negative zero, and totality.

use plenum_units::{Dimension, Measure, Quantity, Unit, UnitSystem, format_auto};
use proptest::prelude::*;

use Measure as M;
use UnitSystem::{Ip, Si};

fn lit(v: f64, u: &str) -> Quantity {
    let unit = Unit::parse(u).unwrap_or_else(|e| panic!("`{u}`: {e}"));
    Quantity::new(v, &unit).unwrap_or_else(|e| panic!("{v} {u}: {e}"))
}

#[track_caller]
fn check(m: Measure, v: f64, unit: &str, system: UnitSystem, expected: &str) {
    assert_eq!(
        m.format(&lit(v, unit), system),
        expected,
        "{v} {unit} as {m:?} in {system}"
    );
}

#[test]
fn airflow_to_the_nearest_5_cfm_and_1_l_per_s() {
    check(M::Airflow, 4_832.4, "cfm", Ip, "4,830 cfm");
    check(M::Airflow, 4_832.5, "cfm", Ip, "4,835 cfm");
    check(M::Airflow, 4_837.4, "cfm", Ip, "4,835 cfm");
    check(M::Airflow, 4_837.5, "cfm", Ip, "4,840 cfm");
    check(M::Airflow, 2.4, "cfm", Ip, "0 cfm");
    check(M::Airflow, -2.4, "cfm", Ip, "0 cfm");
    check(M::Airflow, 1_234_567.0, "cfm", Ip, "1,234,565 cfm");
    check(M::Airflow, 2_280.0, "L/s", Si, "2,280 L/s");
    check(M::Airflow, 2_280.5, "L/s", Si, "2,281 L/s");
    // 4,830 cfm = 2,279.5 L/s (cfm = 0.471 947 4 L/s, NIST SP 811 B.8)
    check(M::Airflow, 4_830.0, "cfm", Si, "2,280 L/s");
    check(M::Airflow, 1.0, "m³/s", Ip, "2,120 cfm");
}

#[test]
fn capacity_to_a_tenth_of_a_ton() {
    check(M::Capacity, 12.46, "ton", Ip, "12.5 ton");
    check(M::Capacity, 12.45, "ton", Ip, "12.5 ton");
    check(M::Capacity, 12.44, "ton", Ip, "12.4 ton");
    check(M::Capacity, 12.0, "ton", Ip, "12.0 ton");
    check(M::Capacity, 149_400.0, "Btu/h", Ip, "12.5 ton"); // 12.45 ton exactly
    check(M::Capacity, 12.5, "ton", Si, "44.0 kW"); // 43.96 kW
    check(M::Capacity, 0.04, "ton", Ip, "0.0 ton");
    check(M::Capacity, -0.04, "ton", Ip, "0.0 ton");
}

#[test]
fn loads_to_10_btu_per_hour_or_compact() {
    check(M::Load, 38_504.0, "Btu/h", Ip, "38,500 Btu/h");
    check(M::Load, 38_505.0, "Btu/h", Ip, "38,510 Btu/h");
    check(M::Load, 38.5, "kBtu/h", Ip, "38,500 Btu/h");
    check(M::Load, 38.5, "kBtu/h", Si, "11,280 W"); // 11,283.2 W
    check(M::Load, -1_234.5, "Btu/h", Ip, "-1,230 Btu/h");
    check(M::Load, 4.0, "Btu/h", Ip, "0 Btu/h");
    check(M::LoadCompact, 38_500.0, "Btu/h", Ip, "38.5 kBtu/h");
    check(M::LoadCompact, 8.25, "MBH", Ip, "8.3 kBtu/h");
    check(M::LoadCompact, 38.5, "kBtu/h", Si, "11.3 kW");
    check(M::LoadCompact, 2_160.0, "W", Ip, "7.4 kBtu/h");
}

#[test]
fn power_and_water_flow() {
    check(M::Power, 7.5, "hp", Ip, "7.50 hp");
    check(M::Power, 7.5, "hp", Si, "5.59 kW"); // 5.592 kW
    check(M::WaterFlow, 32.44, "gpm", Ip, "32.4 gpm");
    check(M::WaterFlow, 32.44, "gpm", Si, "2.05 L/s"); // 2.0466 L/s
}

#[test]
fn temperatures_to_a_tenth() {
    check(M::Temperature, 57.0, "°F", Ip, "57.0 °F");
    check(M::Temperature, 57.0, "°F", Si, "13.9 °C");
    check(M::Temperature, 14.0, "°C", Ip, "57.2 °F");
    check(M::Temperature, -0.04, "°F", Ip, "0.0 °F");
    check(M::Temperature, -40.0, "°C", Ip, "-40.0 °F");
    check(M::Temperature, 0.0, "°C", Ip, "32.0 °F");
    let dt = (lit(75.0, "°F") - lit(57.0, "°F")).expect("dt");
    assert_eq!(M::TemperatureDifference.format(&dt, Ip), "18.0 °F");
    assert_eq!(M::TemperatureDifference.format(&dt, Si), "10.0 K");
    assert_eq!(M::TemperatureDifference.format_value(&dt, Si), "10.0");
    // A temperature difference may be shown as a temperature measure's degrees.
    assert_eq!(M::Temperature.format(&dt, Ip), "18.0 °F");
}

#[test]
fn humidity() {
    check(M::RelativeHumidity, 50.0, "%rh", Ip, "50 %rh");
    check(M::RelativeHumidity, 49.5, "%", Ip, "50 %rh");
    check(M::RelativeHumidity, 49.49, "%", Si, "49 %rh");
    check(M::HumidityRatio, 0.0098, "lb/lb", Ip, "0.009800 lb/lb");
    check(
        M::HumidityRatio,
        0.009_812_34,
        "lb/lb",
        Ip,
        "0.009812 lb/lb",
    );
    check(M::HumidityRatio, 0.009_999_7, "kg/kg", Si, "0.01000 kg/kg");
    check(M::HumidityRatio, 68.0, "gr/lb", Ip, "0.009714 lb/lb");
    check(M::HumidityRatio, 0.0, "lb/lb", Ip, "0 lb/lb");
    check(M::HumidityRatioGrains, 68.04, "gr/lb", Ip, "68.0 gr/lb");
    check(M::HumidityRatioGrains, 0.0098, "lb/lb", Ip, "68.6 gr/lb");
    check(M::HumidityRatioGrains, 0.0098, "kg/kg", Si, "9.80 g/kg");
}

#[test]
fn enthalpy_pressure_and_geometry() {
    check(M::Enthalpy, 28.123, "Btu/lb", Ip, "28.12 Btu/lb");
    check(M::Enthalpy, 28.125, "Btu/lb", Ip, "28.13 Btu/lb");
    check(M::Enthalpy, 1.0, "Btu/lb", Si, "2.33 kJ/kg"); // 2.326 kJ/kg exactly
    check(M::Pressure, 14.696, "psia", Ip, "14.696 psia");
    check(M::Pressure, 14.696, "psia", Si, "101.325 kPa");
    check(M::StaticPressure, 2.5, "in.wg", Ip, "2.50 in.wg");
    check(M::StaticPressure, 2.5, "in.wg", Si, "622 Pa"); // 622.1 Pa
    check(M::Area, 2_400.0, "ft²", Ip, "2,400 ft²");
    check(M::Area, 2_400.0, "ft²", Si, "223.0 m²");
    check(M::Length, 1_250.0, "ft", Ip, "1,250 ft");
    check(M::Length, 1_250.0, "ft", Si, "381.0 m");
    check(M::Velocity, 500.0, "fpm", Si, "2.54 m/s");
    check(M::Volume, 1.0, "m³", Ip, "35 ft³");
}

#[test]
fn rates_and_densities() {
    check(
        M::AirflowPerPerson,
        15.0,
        "cfm/person",
        Ip,
        "15.0 cfm/person",
    );
    check(
        M::AirflowPerPerson,
        15.0,
        "cfm/person",
        Si,
        "7.1 L/s/person",
    ); // 7.079
    check(M::AirflowPerArea, 0.06, "cfm/ft²", Ip, "0.06 cfm/ft²");
    check(M::AirflowPerArea, 0.06, "cfm/ft²", Si, "0.30 L/s/m²"); // 0.3048
    check(M::PowerPerArea, 0.9, "W/ft²", Ip, "0.90 W/ft²");
    check(M::PowerPerArea, 0.9, "W/ft²", Si, "9.7 W/m²"); // 9.688
    check(M::AirflowPerCapacity, 400.0, "cfm/ton", Ip, "400 cfm/ton");
    check(M::Density, 0.075, "lb/ft³", Ip, "0.0750 lb/ft³");
    check(M::Density, 0.075, "lb/ft³", Si, "1.201 kg/m³"); // 1.2014
    check(M::SpecificVolume, 13.33, "ft³/lb", Ip, "13.33 ft³/lb");
    check(M::MassFlow, 21_456.0, "lb/h", Ip, "21,460 lb/h");
}

#[test]
fn ratios_factors_and_counts() {
    check(M::Percent, 23.44, "%", Ip, "23.4 %");
    check(M::Percent, 100.0, "%", Si, "100.0 %");
    let shr = Quantity::number(0.784_9).expect("shr");
    assert_eq!(M::Factor.format(&shr, Ip), "0.78");
    assert_eq!(M::Factor.format_value(&shr, Si), "0.78");
    assert_eq!(M::Factor.label(Ip), "");
    check(M::Count, 40.0, "people", Ip, "40 people");
    check(M::Count, 1.0, "person", Ip, "1 person");
    check(M::Count, 1_200.0, "person", Si, "1,200 people");
}

#[test]
fn value_only_and_labels() {
    let q = lit(4_832.4, "cfm");
    assert_eq!(M::Airflow.format_value(&q, Ip), "4,830");
    assert_eq!(M::Airflow.format_value(&q, Si), "2,281");
    assert_eq!(M::Airflow.label(Ip), "cfm");
    assert_eq!(M::Airflow.label(Si), "L/s");
    assert_eq!(M::Capacity.label(Ip), "ton");
    assert_eq!(M::Temperature.label(Si), "°C");
    assert_eq!(M::RelativeHumidity.label(Si), "%rh");
    assert_eq!(M::Airflow.unit(Si).to_string(), "L/s");
    assert_eq!(M::Load.unit(Ip).dimension(), Dimension::HEAT_FLOW);
}

#[test]
fn raw_numbers_and_non_finite_values() {
    assert_eq!(M::Airflow.format_number(f64::NAN, Ip), "—");
    assert_eq!(
        M::Airflow.format_number_with_unit(f64::INFINITY, Ip),
        "— cfm"
    );
    assert_eq!(M::Capacity.format_number(-0.0, Ip), "0.0");
    assert_eq!(M::Airflow.format_number(-0.0, Ip), "0");
    assert_eq!(M::Airflow.format_number(1e300, Ip), "1.000e300");
    assert_eq!(M::Capacity.format_number_with_unit(12.46, Ip), "12.5 ton");
}

#[test]
fn measures_build_quantities_in_their_unit() {
    let gpm = M::WaterFlow.quantity(32.4, Ip).expect("32.4 gpm");
    assert_eq!(gpm.dimension(), Dimension::WATER_FLOW);
    assert!((gpm.in_unit(&Unit::parse("gpm").expect("gpm")).expect("gpm") - 32.4).abs() < 1e-12);
    let t = M::Temperature.quantity(13.9, Si).expect("13.9 °C");
    assert_eq!(t.dimension(), Dimension::TEMPERATURE);
    let dt = M::TemperatureDifference.quantity(10.0, Si).expect("10 K");
    assert_eq!(dt.dimension(), Dimension::TEMPERATURE_DIFFERENCE);
    assert!(M::Airflow.quantity(f64::NAN, Ip).is_err());
}

#[test]
fn wrong_dimension_falls_back_to_a_true_rendering() {
    let load = lit(38.5, "kBtu/h");
    assert_eq!(M::Airflow.format(&load, Ip), "38.5 kBtu/h");
    assert_eq!(M::Airflow.format_value(&load, Ip), "38.5");
    // Unnamed dimensions render in SI base units with their formula.
    let odd = (load * lit(2.0, "ft")).expect("odd");
    assert_eq!(format_auto(&odd, Ip), "6,878 m³·kg·s⁻³");
}

#[test]
fn auto_rendering_for_hover() {
    assert_eq!(format_auto(&lit(38.5, "kBtu/h"), Si), "11.3 kW");
    assert_eq!(format_auto(&lit(12.5, "ton"), Si), "44.0 kW");
    assert_eq!(format_auto(&lit(2_280.0, "L/s"), Ip), "4,830 cfm");
    assert_eq!(format_auto(&lit(14.0, "°C"), Ip), "57.2 °F");
    assert_eq!(format_auto(&lit(50.0, "%rh"), Si), "50 %rh");
    assert_eq!(format_auto(&lit(50.0, "%"), Si), "50.0 %");
    assert_eq!(format_auto(&lit(40.0, "people"), Si), "40 people");
    assert_eq!(format_auto(&lit(2.5, "L/s/person"), Ip), "5.3 cfm/person");
    // 1 cfm/ft² = 5.08 L/s/m² = 1 fpm: small values are ventilation rates, large ones speeds
    assert_eq!(format_auto(&lit(0.3, "L/s/m²"), Ip), "0.06 cfm/ft²");
    assert_eq!(format_auto(&lit(0.06, "cfm/ft²"), Si), "0.30 L/s/m²");
    assert_eq!(format_auto(&lit(500.0, "fpm"), Si), "2.54 m/s");
    assert_eq!(format_auto(&lit(0.0093, "kg/kg"), Ip), "0.009300 lb/lb");
    assert_eq!(format_auto(&lit(1_250.0, "ft"), Si), "381.0 m");
}

fn parse_rendered(s: &str) -> Option<f64> {
    s.replace(',', "").parse().ok()
}

proptest! {
    /// Every renderer is total and never shows NaN, infinity or a negative zero.
    #[test]
    fn renderers_are_total(x in any::<f64>(), i in 0usize..64, ip in any::<bool>()) {
        let m = Measure::ALL[i % Measure::ALL.len()];
        let system = if ip { Ip } else { Si };
        for s in [m.format_number(x, system), m.format_number_with_unit(x, system)] {
            prop_assert!(!s.is_empty());
            prop_assert!(!s.contains("NaN") && !s.contains("inf"), "{}", s);
            if let Some(v) = parse_rendered(s.split(' ').next().unwrap_or("")) {
                prop_assert!(!(v == 0.0 && s.starts_with('-')), "negative zero: {}", s);
            }
        }
        if let Ok(q) = m.quantity(x, system) {
            for sys in [Ip, Si] {
                prop_assert!(!m.format(&q, sys).is_empty());
                prop_assert!(!format_auto(&q, sys).is_empty());
            }
        }
    }

    /// The rendered number is the value rounded to the measure's step: within half a step.
    #[test]
    fn rendering_is_within_half_a_step(x in -1e7..1e7f64, ip in any::<bool>()) {
        let system = if ip { Ip } else { Si };
        let steps = [
            (M::Airflow, if ip { 5.0 } else { 1.0 }),
            (M::Load, 10.0),
            (M::Capacity, 0.1),
            (M::Temperature, 0.1),
            (M::RelativeHumidity, 1.0),
            (M::Enthalpy, 0.01),
        ];
        for (m, step) in steps {
            let s = m.format_number(x, system);
            let v = parse_rendered(&s).ok_or_else(|| TestCaseError::fail(s.clone()))?;
            prop_assert!((v - x).abs() <= step / 2.0 * (1.0 + 1e-9) + 1e-9 * x.abs(), "{:?} {} → {}", m, x, s);
            prop_assert!(((v / step).round() * step - v).abs() <= 1e-6 * step.max(v.abs() * 1e-9), "{} not a multiple of {}", s, step);
        }
    }

    /// Four significant digits for humidity ratio.
    #[test]
    fn humidity_ratio_has_four_significant_digits(x in 1e-6..0.1f64) {
        let s = M::HumidityRatio.format_number(x, Ip);
        let digits: String = s.chars().filter(char::is_ascii_digit).collect();
        let significant = digits.trim_start_matches('0');
        prop_assert_eq!(significant.len(), 4, "{}", s);
        let v = parse_rendered(&s).ok_or_else(|| TestCaseError::fail(s.clone()))?;
        prop_assert!((v - x).abs() <= x * 5e-4 * (1.0 + 1e-9) + 1e-15, "{} → {}", x, s);
    }
}
