//! Unit-expression parsing: every spelling the design format uses, the typed errors, labels,
//! and the "unit that fixes it" suggestion.

use plenum_units::{Dimension, TemperatureScale, Unit, UnitError, UnitSystem};

fn parse(text: &str) -> Unit {
    Unit::parse(text).unwrap_or_else(|e| panic!("`{text}`: {e}"))
}

#[test]
fn spellings_of_language_md_and_issue_3() {
    use Dimension as D;
    let cases: &[(&str, Dimension)] = &[
        ("kBtu/h", D::HEAT_FLOW),
        ("MBH", D::HEAT_FLOW),
        ("Btu/h", D::HEAT_FLOW),
        ("Btu", D::ENERGY),
        ("W", D::HEAT_FLOW),
        ("kW", D::HEAT_FLOW),
        ("ton", D::HEAT_FLOW),
        ("hp", D::POWER),
        ("cfm", D::AIRFLOW),
        ("L/s", D::AIRFLOW),
        ("m³/s", D::AIRFLOW),
        ("m³/h", D::AIRFLOW),
        ("m3/h", D::AIRFLOW),
        ("m^3/h", D::AIRFLOW),
        ("cfm/ft²", D::AIRFLOW_PER_AREA),
        ("cfm/person", D::AIRFLOW_PER_PERSON),
        ("L/s/person", D::AIRFLOW_PER_PERSON),
        ("L/(s·person)", D::AIRFLOW_PER_PERSON),
        ("L/s/m²", D::AIRFLOW_PER_AREA),
        ("L/(s·m²)", D::AIRFLOW_PER_AREA),
        ("L/(s*m^2)", D::AIRFLOW_PER_AREA),
        ("W/ft²", D::POWER_PER_AREA),
        ("W/m²", D::POWER_PER_AREA),
        ("Btu/(h·ft²)", D::POWER_PER_AREA),
        ("in.wg", D::PRESSURE),
        ("Pa", D::PRESSURE),
        ("kPa", D::PRESSURE),
        ("psia", D::PRESSURE),
        ("psi", D::PRESSURE),
        ("gr/lb", D::HUMIDITY_RATIO),
        ("g/kg", D::HUMIDITY_RATIO),
        ("lb/lb", D::HUMIDITY_RATIO),
        ("kg/kg", D::HUMIDITY_RATIO),
        ("Btu/lb", D::SPECIFIC_ENTHALPY),
        ("kJ/kg", D::SPECIFIC_ENTHALPY),
        ("°F", D::TEMPERATURE),
        ("degF", D::TEMPERATURE),
        ("°C", D::TEMPERATURE),
        ("degC", D::TEMPERATURE),
        ("K", D::TEMPERATURE),
        ("°R", D::TEMPERATURE),
        ("Δ°F", D::TEMPERATURE_DIFFERENCE),
        ("%", D::RATIO),
        ("%rh", D::RATIO),
        ("fpm", D::VELOCITY),
        ("ft/min", D::VELOCITY),
        ("m/s", D::VELOCITY),
        ("gpm", D::WATER_FLOW),
        ("ft", D::LENGTH),
        ("in", D::LENGTH),
        ("m", D::LENGTH),
        ("mm", D::LENGTH),
        ("ft²", D::AREA),
        ("ft2", D::AREA),
        ("ft^2", D::AREA),
        ("m²", D::AREA),
        ("m2", D::AREA),
        ("m^2", D::AREA),
        ("ft³", D::VOLUME),
        ("m³", D::VOLUME),
        ("lb", D::MASS),
        ("kg", D::MASS),
        ("h", D::TIME),
        ("min", D::TIME),
        ("s", D::TIME),
        ("person", D::COUNT),
        ("people", D::COUNT),
        ("lb/h", D::MASS_FLOW),
        ("Btu/(lb·°F)", D::SPECIFIC_HEAT),
        ("cfm/ton", D::AIRFLOW_PER_CAPACITY),
        (
            "1/h",
            Dimension::RATIO.checked_div(D::TIME).unwrap_or(D::RATIO),
        ),
    ];
    for &(text, dim) in cases {
        assert_eq!(parse(text).dimension(), dim, "`{text}`");
    }
}

#[test]
fn operators_and_whitespace() {
    let a = parse("Btu/(h·ft²)");
    for same in [
        "Btu/(h*ft^2)",
        "Btu/(h⋅ft2)",
        "Btu / (h · ft²)",
        "Btu·h⁻¹·ft⁻²",
        "Btu*h^-1*ft^-2",
        "Btu/h/ft²",
        "(Btu/h)/ft²",
    ] {
        let b = parse(same);
        assert_eq!(b.dimension(), a.dimension(), "`{same}`");
        assert!((b.factor() / a.factor() - 1.0).abs() < 1e-15, "`{same}`");
    }
    assert_eq!(parse("(ft)^2").dimension(), Dimension::AREA);
    assert_eq!(parse("ft·ft").to_string(), "ft²");
    assert_eq!(parse("ft/ft").dimension(), Dimension::RATIO);
}

#[test]
fn canonical_labels() {
    let cases = [
        ("ft2", "ft²"),
        ("ft^2", "ft²"),
        ("degF", "°F"),
        ("CFM", "cfm"),
        ("kBtu/h", "kBtu/h"),
        ("L/(s·person)", "L/s/person"),
        ("Btu/(h·ft²)", "Btu/h/ft²"),
        ("m^3/h", "m³/h"),
        ("Btu*h^-1", "Btu/h"),
        ("1/h", "1/h"),
        ("gr/lb", "gr/lb"),
        ("in.w.g.", "in.wg"),
    ];
    for (text, label) in cases {
        assert_eq!(parse(text).to_string(), label, "`{text}`");
    }
    assert_eq!(Unit::one().to_string(), "1");
}

#[test]
fn temperature_scale_alone_is_absolute_and_in_a_compound_is_a_degree() {
    assert_eq!(
        parse("°F").temperature_scale(),
        Some(TemperatureScale::Fahrenheit)
    );
    assert_eq!(
        parse("(°C)").temperature_scale(),
        Some(TemperatureScale::Celsius)
    );
    // `°F/h` is a rate of temperature change: accepted, built from the degree.
    let rate = parse("°F/h");
    assert_eq!(rate.temperature_scale(), None);
    assert_eq!(
        rate.dimension(),
        Dimension::TEMPERATURE_DIFFERENCE
            .checked_div(Dimension::TIME)
            .unwrap_or(Dimension::RATIO)
    );
    assert!((rate.factor() - 1.0 / 1.8 / 3600.0).abs() < 1e-18);
    assert_eq!(parse("K^2").temperature_scale(), None);
    assert_eq!(parse("Δ°F").temperature_scale(), None);
}

#[test]
fn relative_humidity_is_a_tagged_ratio() {
    assert!(parse("%rh").is_relative_humidity());
    assert!(parse("%RH").is_relative_humidity());
    assert!(!parse("%").is_relative_humidity());
    assert!(!parse("%rh/h").is_relative_humidity());
    assert_eq!(parse("%rh").dimension(), Dimension::RATIO);
}

#[test]
fn systems_of_units() {
    assert_eq!(parse("cfm/person").system(), Some(UnitSystem::Ip));
    assert_eq!(parse("L/s/person").system(), Some(UnitSystem::Si));
    assert_eq!(parse("W/ft²").system(), None);
    assert_eq!(parse("%").system(), None);
}

#[test]
fn unknown_symbols_name_the_nearest_known_one() {
    let cases: &[(&str, &str, Option<&str>, Option<&str>)] = &[
        ("kbtu/h", "kbtu", Some("kBtu"), Some("kBtu/h")),
        ("cmf", "cmf", Some("cfm"), Some("cfm")),
        ("KW", "KW", Some("kW"), Some("kW")),
        ("F", "F", Some("°F"), Some("°F")),
        ("W/sqm", "sqm", None, None),
        ("in.w", "in.w", Some("in.wg"), Some("in.wg")),
        ("Btu/hr/ftt", "ftt", Some("ft"), Some("Btu/hr/ft")),
        ("furlong", "furlong", None, None),
    ];
    for &(text, symbol, nearest, corrected) in cases {
        match Unit::parse(text) {
            Err(UnitError::UnknownSymbol {
                symbol: s,
                span,
                nearest: n,
                corrected: c,
            }) => {
                assert_eq!(s, symbol, "`{text}`");
                assert_eq!(&text[span], symbol, "`{text}` span");
                assert_eq!(n, nearest, "`{text}`");
                assert_eq!(c.as_deref(), corrected, "`{text}`");
            }
            other => panic!("`{text}`: {other:?}"),
        }
    }
}

#[test]
fn malformed_expressions_are_typed_errors() {
    assert_eq!(Unit::parse(""), Err(UnitError::Empty));
    assert_eq!(Unit::parse("   "), Err(UnitError::Empty));
    for text in [
        "/h",
        "kW/",
        "(ft",
        "ft)",
        "ft^",
        "ft^x",
        "2ft",
        "ft^0",
        "ft^2^3",
        "()",
        "ft**2",
        "·",
        "cfm person",
        "((((((((((((((((((ft))))))))))))))))))",
    ] {
        match Unit::parse(text) {
            Err(UnitError::Malformed { span, reason }) => {
                assert!(span.end <= text.len(), "`{text}`");
                assert!(!reason.is_empty());
            }
            other => panic!("`{text}`: {other:?}"),
        }
    }
    for text in ["ft^17", "ft^99999999999", "(mm^16)^16", "((ft^16)^16)^16"] {
        assert!(
            matches!(Unit::parse(text), Err(UnitError::OutOfRange { .. })),
            "`{text}`: {:?}",
            Unit::parse(text)
        );
    }
}

#[test]
fn product_after_division_is_ambiguous_with_a_fix() {
    let cases = [
        ("Btu/h·ft²", "Btu/(h·ft²)"),
        ("W/m²·K", "W/(m²·K)"),
        ("L/s*m2", "L/(s*m2)"),
        ("(Btu/h·ft²)", "(Btu/(h·ft²))"),
        ("L/s/m²·person", "L/s/(m²·person)"),
    ];
    for (text, fix) in cases {
        match Unit::parse(text) {
            Err(UnitError::Ambiguous { suggestion, .. }) => {
                assert_eq!(suggestion, fix, "`{text}`");
                assert!(
                    Unit::parse(&suggestion).is_ok(),
                    "fix `{suggestion}` parses"
                );
            }
            other => panic!("`{text}`: {other:?}"),
        }
    }
    // A product before the division is not ambiguous.
    assert_eq!(parse("Btu·ft²/h").dimension().to_string(), "m⁴·kg·s⁻³");
}

#[test]
fn error_messages_read_well() {
    let msg = |t: &str| {
        Unit::parse(t)
            .err()
            .map(|e| e.to_string())
            .unwrap_or_default()
    };
    assert_eq!(msg("kbtu/h"), "unknown unit `kbtu`; did you mean `kBtu`?");
    assert_eq!(msg("furlong"), "unknown unit `furlong`");
    assert_eq!(msg(""), "missing unit");
    assert_eq!(
        msg("Btu/h·ft²"),
        "ambiguous unit: a product after `/`; write `Btu/(h·ft²)` if that is meant"
    );
}

#[test]
fn suggestions_fix_the_common_mistakes() {
    use Dimension as D;
    let cases: &[(&str, Dimension, Option<&str>)] = &[
        ("ft", D::AREA, Some("ft²")),
        ("m", D::AREA, Some("m²")),
        ("ft", D::VOLUME, Some("ft³")),
        ("ft²", D::LENGTH, Some("ft")),
        ("kBtu", D::HEAT_FLOW, Some("kBtu/h")),
        ("Btu", D::HEAT_FLOW, Some("Btu/h")),
        ("kJ", D::HEAT_FLOW, Some("kW")),
        ("J", D::HEAT_FLOW, Some("W")),
        ("kW", D::ENERGY, Some("kWh")),
        ("kBtu/h", D::ENERGY, Some("kBtu")),
        ("cfm", D::AIRFLOW_PER_PERSON, Some("cfm/person")),
        ("L/s", D::AIRFLOW_PER_PERSON, Some("L/s/person")),
        ("cfm", D::AIRFLOW_PER_AREA, Some("cfm/ft²")),
        ("L/s", D::AIRFLOW_PER_AREA, Some("L/s/m²")),
        ("cfm/person", D::AIRFLOW, Some("cfm")),
        ("ft³", D::AIRFLOW, Some("cfm")),
        ("gal", D::WATER_FLOW, Some("gpm")),
        ("fpm", D::AIRFLOW, Some("cfm")),
        ("W/ft²", D::HEAT_FLOW, Some("W")),
        ("W", D::POWER_PER_AREA, Some("W/m²")),
        ("Btu/h", D::POWER_PER_AREA, Some("Btu/h/ft²")),
        ("Btu", D::SPECIFIC_ENTHALPY, Some("Btu/lb")),
        ("kJ", D::SPECIFIC_ENTHALPY, Some("kJ/kg")),
        ("gr", D::HUMIDITY_RATIO, Some("gr/lb")),
        ("g", D::HUMIDITY_RATIO, Some("g/kg")),
        ("in", D::PRESSURE, Some("in.wg")),
        ("Δ°F", D::TEMPERATURE, Some("°F")),
        ("°F/h", D::TEMPERATURE, Some("°F")),
        // Nothing to fix, or nothing that fixes it.
        ("°F", D::TEMPERATURE_DIFFERENCE, None),
        ("cfm", D::AIRFLOW, None),
        ("cfm", D::HEAT_FLOW, None),
        ("%", D::HUMIDITY_RATIO, None),
        ("ton", D::AIRFLOW, None),
        ("°F", D::HEAT_FLOW, None),
    ];
    for &(written, expected, fix) in cases {
        let got = parse(written).suggest(expected);
        assert_eq!(
            got.as_ref().map(|u| u.to_string()).as_deref(),
            fix,
            "`{written}` for {expected}"
        );
        if let Some(u) = got {
            assert!(u.fits(expected), "`{u}` does not fit {expected}");
            // The suggestion is a unit the parser reads back the same.
            assert_eq!(parse(&u.to_string()).dimension(), u.dimension());
        }
    }
}

#[test]
fn quantities_from_command_line_text() {
    use plenum_units::{ParseQuantityError, Quantity};
    let cases: &[(&str, f64, &str)] = &[
        ("1250ft", 1250.0, "ft"),
        ("1250 ft", 1250.0, "ft"),
        ("381 m", 381.0, "m"),
        ("  12.2 psia ", 12.2, "psia"),
        ("1_250 ft", 1250.0, "ft"),
        ("-4 °F", -4.0, "°F"),
        ("1.2e3 cfm", 1200.0, "cfm"),
        ("1.2E-3 kg/kg", 0.0012, "kg/kg"),
        (".5 in.wg", 0.5, "in.wg"),
        ("50 %rh", 50.0, "%rh"),
        ("+3K", 3.0, "K"),
    ];
    for &(text, value, unit) in cases {
        let q = Quantity::parse(text).unwrap_or_else(|e| panic!("`{text}`: {e}"));
        let expected = Quantity::new(value, &parse(unit)).expect("literal");
        assert_eq!(q, expected, "`{text}`");
    }
    assert!(
        Quantity::parse("50 %rh")
            .expect("rh")
            .is_relative_humidity()
    );
    assert_eq!(
        Quantity::parse("0.95"),
        Err(ParseQuantityError::MissingUnit { value: 0.95 })
    );
    for text in ["", "ft", "_1 ft", "-", ". ft", "e3 ft"] {
        assert!(
            matches!(
                Quantity::parse(text),
                Err(ParseQuantityError::Number { .. })
            ),
            "`{text}`: {:?}",
            Quantity::parse(text)
        );
    }
    match Quantity::parse("1250 fet") {
        Err(ParseQuantityError::Unit(UnitError::UnknownSymbol {
            span, corrected, ..
        })) => {
            assert_eq!(span, 5..8);
            assert_eq!(corrected.as_deref(), Some("1250 ft"));
        }
        other => panic!("{other:?}"),
    }
    assert!(matches!(
        Quantity::parse("1e400 ft"),
        Err(ParseQuantityError::Value(_))
    ));
    assert_eq!(
        Quantity::parse("1250 fet").map_err(|e| e.to_string()),
        Err("unknown unit `fet`; did you mean `ft`?".to_string())
    );
}
