//! Rendering quantities in IP or SI with the trade's usual precision.

use crate::dimension::Dimension;
use crate::quantity::Quantity;
use crate::system::{Terms, UnitSystem};
use crate::table::{
    BTU_, CFM, DEG_C, DEG_F, DELTA_C, DELTA_F, FOOT, FPM, G_KG, GALLON, GR_LB, HOUR, HP, INWG,
    KBTU, KG, KG_KG, KJ, KPA, KW, LB_LB, LITRE, M, MINUTE, PA, PERCENT, PERCENT_RH, PERSON, POUND,
    PSIA, SECOND, TON, WATT,
};
use crate::unit::Unit;

/// What a displayed number is *for* — a zone load, a coil capacity, a supply airflow, a
/// chilled-water flow — which decides the unit and the rounding. The rules (the precision is
/// *common practice* of HVAC design documents, not a published standard):
///
/// | measure | IP | SI |
/// | --- | --- | --- |
/// | `Load` | Btu/h to 10 | W to 10 |
/// | `LoadCompact` | kBtu/h to 0.1 | kW to 0.1 |
/// | `Capacity` | ton to 0.1 | kW to 0.1 |
/// | `Power` (fans, motors) | hp to 0.01 | kW to 0.01 |
/// | `Airflow` | cfm to 5 | L/s to 1 |
/// | `WaterFlow` | gpm to 0.1 | L/s to 0.01 |
/// | `Temperature` | °F to 0.1 | °C to 0.1 |
/// | `TemperatureDifference` | °F to 0.1 | K to 0.1 |
/// | `RelativeHumidity` | %rh to 1 | %rh to 1 |
/// | `HumidityRatio` | lb/lb, 4 significant digits | kg/kg, 4 significant digits |
/// | `HumidityRatioGrains` | gr/lb to 0.1 | g/kg to 0.01 |
/// | `Enthalpy` | Btu/lb to 0.01 | kJ/kg to 0.01 |
/// | `Pressure` (barometric) | psia to 0.001 | kPa to 0.001 |
/// | `StaticPressure` | in.wg to 0.01 | Pa to 1 |
/// | `Length` | ft to 1 | m to 0.1 |
/// | `Area` | ft² to 1 | m² to 0.1 |
/// | `Volume` | ft³ to 1 | m³ to 0.01 |
/// | `Mass` | lb to 0.1 | kg to 0.1 |
/// | `Time` | h to 0.01 | h to 0.01 |
/// | `Energy` | Btu to 1 | kJ to 0.1 |
/// | `Velocity` | fpm to 1 | m/s to 0.01 |
/// | `AirflowPerPerson` | cfm/person to 0.1 | L/s/person to 0.1 |
/// | `AirflowPerArea` | cfm/ft² to 0.01 | L/s/m² to 0.01 |
/// | `PowerPerArea` | W/ft² to 0.01 | W/m² to 0.1 |
/// | `AirflowPerCapacity` | cfm/ton to 1 | L/s/kW to 0.1 |
/// | `MassFlow` | lb/h to 10 | kg/s to 0.001 |
/// | `MoistureFlow` (condensate) | lb/h to 0.1 | kg/h to 0.1 |
/// | `Density` | lb/ft³ to 0.0001 | kg/m³ to 0.001 |
/// | `SpecificVolume` | ft³/lb to 0.01 | m³/kg to 0.0001 |
/// | `Percent` | % to 0.1 | % to 0.1 |
/// | `Factor` (SHR, bypass factor) | to 0.01, no unit | to 0.01, no unit |
/// | `Count` | people to 1 | people to 1 |
///
/// Rounding is half away from zero on the decimal value the reader sees (12.45 ton prints
/// 12.5 even though 12.45 is 12.4499… in binary: values within 1e-12 relative of a half round
/// away). The shown decimals are fixed by the step (`12.0 ton`, `4,830 cfm`). Integer parts
/// take `,` thousands separators in both systems. A result that rounds to zero prints `0`
/// with no minus sign. The unit spelling is one per measure: `ton` (never `tons`), `%rh` for
/// relative humidity (as the file format writes it), `people` (`person` for exactly 1).
///
/// Every function here is total: a NaN or infinite value (which a [`Quantity`] cannot hold,
/// but a raw `f64` can) renders as `—`, and a quantity of the wrong dimension for the measure is
/// rendered by [`format_auto`] instead, in a unit that is true to its dimension.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Measure {
    /// A heat gain or load: Btu/h to 10 | W to 10.
    Load,
    /// A load in a compact column: kBtu/h to 0.1 | kW to 0.1.
    LoadCompact,
    /// A cooling capacity: ton to 0.1 | kW to 0.1.
    Capacity,
    /// Fan or motor power: hp to 0.01 | kW to 0.01.
    Power,
    /// An airflow: cfm to 5 | L/s to 1.
    Airflow,
    /// A water flow: gpm to 0.1 | L/s to 0.01.
    WaterFlow,
    /// A temperature: °F to 0.1 | °C to 0.1.
    Temperature,
    /// A temperature difference: °F to 0.1 | K to 0.1.
    TemperatureDifference,
    /// Relative humidity: %rh to 1.
    RelativeHumidity,
    /// Humidity ratio: lb/lb | kg/kg, 4 significant digits.
    HumidityRatio,
    /// Humidity ratio in small units: gr/lb to 0.1 | g/kg to 0.01.
    HumidityRatioGrains,
    /// Specific enthalpy of moist air: Btu/lb to 0.01 | kJ/kg to 0.01.
    Enthalpy,
    /// Barometric pressure: psia to 0.001 | kPa to 0.001.
    Pressure,
    /// Fan static pressure: in.wg to 0.01 | Pa to 1.
    StaticPressure,
    /// Length: ft to 1 | m to 0.1.
    Length,
    /// Floor area: ft² to 1 | m² to 0.1.
    Area,
    /// Volume: ft³ to 1 | m³ to 0.01.
    Volume,
    /// Mass: lb to 0.1 | kg to 0.1.
    Mass,
    /// Time: h to 0.01.
    Time,
    /// Energy: Btu to 1 | kJ to 0.1.
    Energy,
    /// Velocity (coil face velocity): fpm to 1 | m/s to 0.01.
    Velocity,
    /// Ventilation rate per person: cfm/person to 0.1 | L/s/person to 0.1.
    AirflowPerPerson,
    /// Ventilation rate per floor area: cfm/ft² to 0.01 | L/s/m² to 0.01.
    AirflowPerArea,
    /// Lighting or equipment density: W/ft² to 0.01 | W/m² to 0.1.
    PowerPerArea,
    /// Airflow per ton of capacity: cfm/ton to 1 | L/s/kW to 0.1.
    AirflowPerCapacity,
    /// Dry-air mass flow: lb/h to 10 | kg/s to 0.001.
    MassFlow,
    /// Water mass flow (condensate): lb/h to 0.1 | kg/h to 0.1.
    MoistureFlow,
    /// Density: lb/ft³ to 0.0001 | kg/m³ to 0.001.
    Density,
    /// Specific volume: ft³/lb to 0.01 | m³/kg to 0.0001.
    SpecificVolume,
    /// A ratio as a percentage: % to 0.1.
    Percent,
    /// A plain factor (SHR, bypass factor): to 0.01, no unit.
    Factor,
    /// Occupants: people to 1.
    Count,
}

/// How a value is rounded for display.
#[derive(Clone, Copy, Debug)]
enum Round {
    /// To a multiple of `mantissa · 10^exp`.
    Step(i64, i32),
    /// To this many significant digits.
    Significant(u32),
}

/// One side (IP or SI) of a measure.
struct Side {
    terms: Terms,
    label: &'static str,
    round: Round,
}

struct Spec {
    dim: Dimension,
    ip: Side,
    si: Side,
}

/// A `'static` slice of unit terms (a static, so that it may refer to the table's statics).
macro_rules! t {
    ($($term:tt)*) => {{
        static TERMS: Terms = &$($term)*;
        TERMS
    }};
}

const fn side(terms: Terms, label: &'static str, round: Round) -> Side {
    Side {
        terms,
        label,
        round,
    }
}

const TO_10: Round = Round::Step(1, 1);
const TO_5: Round = Round::Step(5, 0);
const TO_1: Round = Round::Step(1, 0);
const TO_0_1: Round = Round::Step(1, -1);
const TO_0_01: Round = Round::Step(1, -2);
const TO_0_001: Round = Round::Step(1, -3);
const TO_0_0001: Round = Round::Step(1, -4);

impl Measure {
    /// Every measure.
    pub const ALL: [Measure; 32] = [
        Measure::Load,
        Measure::LoadCompact,
        Measure::Capacity,
        Measure::Power,
        Measure::Airflow,
        Measure::WaterFlow,
        Measure::Temperature,
        Measure::TemperatureDifference,
        Measure::RelativeHumidity,
        Measure::HumidityRatio,
        Measure::HumidityRatioGrains,
        Measure::Enthalpy,
        Measure::Pressure,
        Measure::StaticPressure,
        Measure::Length,
        Measure::Area,
        Measure::Volume,
        Measure::Mass,
        Measure::Time,
        Measure::Energy,
        Measure::Velocity,
        Measure::AirflowPerPerson,
        Measure::AirflowPerArea,
        Measure::PowerPerArea,
        Measure::AirflowPerCapacity,
        Measure::MassFlow,
        Measure::MoistureFlow,
        Measure::Density,
        Measure::SpecificVolume,
        Measure::Percent,
        Measure::Factor,
        Measure::Count,
    ];

    fn spec(self) -> Spec {
        use Measure as X;
        let (dim, ip, si) = match self {
            X::Load => (
                Dimension::HEAT_FLOW,
                side(t!([(&BTU_, 1), (&HOUR, -1)]), "Btu/h", TO_10),
                side(t!([(&WATT, 1)]), "W", TO_10),
            ),
            X::LoadCompact => (
                Dimension::HEAT_FLOW,
                side(t!([(&KBTU, 1), (&HOUR, -1)]), "kBtu/h", TO_0_1),
                side(t!([(&KW, 1)]), "kW", TO_0_1),
            ),
            X::Capacity => (
                Dimension::HEAT_FLOW,
                side(t!([(&TON, 1)]), "ton", TO_0_1),
                side(t!([(&KW, 1)]), "kW", TO_0_1),
            ),
            X::Power => (
                Dimension::POWER,
                side(t!([(&HP, 1)]), "hp", TO_0_01),
                side(t!([(&KW, 1)]), "kW", TO_0_01),
            ),
            X::Airflow => (
                Dimension::AIRFLOW,
                side(t!([(&CFM, 1)]), "cfm", TO_5),
                side(t!([(&LITRE, 1), (&SECOND, -1)]), "L/s", TO_1),
            ),
            X::WaterFlow => (
                Dimension::WATER_FLOW,
                side(t!([(&GALLON, 1), (&MINUTE, -1)]), "gpm", TO_0_1),
                side(t!([(&LITRE, 1), (&SECOND, -1)]), "L/s", TO_0_01),
            ),
            X::Temperature => (
                Dimension::TEMPERATURE,
                side(t!([(&DEG_F, 1)]), "°F", TO_0_1),
                side(t!([(&DEG_C, 1)]), "°C", TO_0_1),
            ),
            X::TemperatureDifference => (
                Dimension::TEMPERATURE_DIFFERENCE,
                side(t!([(&DELTA_F, 1)]), "°F", TO_0_1),
                side(t!([(&DELTA_C, 1)]), "K", TO_0_1),
            ),
            X::RelativeHumidity => (
                Dimension::RATIO,
                side(t!([(&PERCENT_RH, 1)]), "%rh", TO_1),
                side(t!([(&PERCENT_RH, 1)]), "%rh", TO_1),
            ),
            X::HumidityRatio => (
                Dimension::HUMIDITY_RATIO,
                side(t!([(&LB_LB, 1)]), "lb/lb", Round::Significant(4)),
                side(t!([(&KG_KG, 1)]), "kg/kg", Round::Significant(4)),
            ),
            X::HumidityRatioGrains => (
                Dimension::HUMIDITY_RATIO,
                side(t!([(&GR_LB, 1)]), "gr/lb", TO_0_1),
                side(t!([(&G_KG, 1)]), "g/kg", TO_0_01),
            ),
            X::Enthalpy => (
                Dimension::SPECIFIC_ENTHALPY,
                side(t!([(&BTU_, 1), (&POUND, -1)]), "Btu/lb", TO_0_01),
                side(t!([(&KJ, 1), (&KG, -1)]), "kJ/kg", TO_0_01),
            ),
            X::Pressure => (
                Dimension::PRESSURE,
                side(t!([(&PSIA, 1)]), "psia", TO_0_001),
                side(t!([(&KPA, 1)]), "kPa", TO_0_001),
            ),
            X::StaticPressure => (
                Dimension::PRESSURE,
                side(t!([(&INWG, 1)]), "in.wg", TO_0_01),
                side(t!([(&PA, 1)]), "Pa", TO_1),
            ),
            X::Length => (
                Dimension::LENGTH,
                side(t!([(&FOOT, 1)]), "ft", TO_1),
                side(t!([(&M, 1)]), "m", TO_0_1),
            ),
            X::Area => (
                Dimension::AREA,
                side(t!([(&FOOT, 2)]), "ft²", TO_1),
                side(t!([(&M, 2)]), "m²", TO_0_1),
            ),
            X::Volume => (
                Dimension::VOLUME,
                side(t!([(&FOOT, 3)]), "ft³", TO_1),
                side(t!([(&M, 3)]), "m³", TO_0_01),
            ),
            X::Mass => (
                Dimension::MASS,
                side(t!([(&POUND, 1)]), "lb", TO_0_1),
                side(t!([(&KG, 1)]), "kg", TO_0_1),
            ),
            X::Time => (
                Dimension::TIME,
                side(t!([(&HOUR, 1)]), "h", TO_0_01),
                side(t!([(&HOUR, 1)]), "h", TO_0_01),
            ),
            X::Energy => (
                Dimension::ENERGY,
                side(t!([(&BTU_, 1)]), "Btu", TO_1),
                side(t!([(&KJ, 1)]), "kJ", TO_0_1),
            ),
            X::Velocity => (
                Dimension::VELOCITY,
                side(t!([(&FPM, 1)]), "fpm", TO_1),
                side(t!([(&M, 1), (&SECOND, -1)]), "m/s", TO_0_01),
            ),
            X::AirflowPerPerson => (
                Dimension::AIRFLOW_PER_PERSON,
                side(t!([(&CFM, 1), (&PERSON, -1)]), "cfm/person", TO_0_1),
                side(
                    t!([(&LITRE, 1), (&SECOND, -1), (&PERSON, -1)]),
                    "L/s/person",
                    TO_0_1,
                ),
            ),
            X::AirflowPerArea => (
                Dimension::AIRFLOW_PER_AREA,
                side(t!([(&CFM, 1), (&FOOT, -2)]), "cfm/ft²", TO_0_01),
                side(
                    t!([(&LITRE, 1), (&SECOND, -1), (&M, -2)]),
                    "L/s/m²",
                    TO_0_01,
                ),
            ),
            X::PowerPerArea => (
                Dimension::POWER_PER_AREA,
                side(t!([(&WATT, 1), (&FOOT, -2)]), "W/ft²", TO_0_01),
                side(t!([(&WATT, 1), (&M, -2)]), "W/m²", TO_0_1),
            ),
            X::AirflowPerCapacity => (
                Dimension::AIRFLOW_PER_CAPACITY,
                side(t!([(&CFM, 1), (&TON, -1)]), "cfm/ton", TO_1),
                side(
                    t!([(&LITRE, 1), (&SECOND, -1), (&KW, -1)]),
                    "L/s/kW",
                    TO_0_1,
                ),
            ),
            X::MassFlow => (
                Dimension::MASS_FLOW,
                side(t!([(&POUND, 1), (&HOUR, -1)]), "lb/h", TO_10),
                side(t!([(&KG, 1), (&SECOND, -1)]), "kg/s", TO_0_001),
            ),
            X::MoistureFlow => (
                Dimension::MOISTURE_FLOW,
                side(t!([(&LB_LB, 1), (&POUND, 1), (&HOUR, -1)]), "lb/h", TO_0_1),
                side(t!([(&KG_KG, 1), (&KG, 1), (&HOUR, -1)]), "kg/h", TO_0_1),
            ),
            X::Density => (
                Dimension::DENSITY,
                side(t!([(&POUND, 1), (&FOOT, -3)]), "lb/ft³", TO_0_0001),
                side(t!([(&KG, 1), (&M, -3)]), "kg/m³", TO_0_001),
            ),
            X::SpecificVolume => (
                Dimension::SPECIFIC_VOLUME,
                side(t!([(&FOOT, 3), (&POUND, -1)]), "ft³/lb", TO_0_01),
                side(t!([(&M, 3), (&KG, -1)]), "m³/kg", TO_0_0001),
            ),
            X::Percent => (
                Dimension::RATIO,
                side(t!([(&PERCENT, 1)]), "%", TO_0_1),
                side(t!([(&PERCENT, 1)]), "%", TO_0_1),
            ),
            X::Factor => (
                Dimension::RATIO,
                side(t!([]), "", TO_0_01),
                side(t!([]), "", TO_0_01),
            ),
            X::Count => (
                Dimension::COUNT,
                side(t!([(&PERSON, 1)]), "people", TO_1),
                side(t!([(&PERSON, 1)]), "people", TO_1),
            ),
        };
        Spec { dim, ip, si }
    }

    fn side(self, system: UnitSystem) -> Side {
        let spec = self.spec();
        match system {
            UnitSystem::Ip => spec.ip,
            UnitSystem::Si => spec.si,
        }
    }

    /// The dimension of the quantities this measure shows.
    pub fn dimension(self) -> Dimension {
        self.spec().dim
    }

    /// The unit label (`cfm`, `kBtu/h`, `°F`, `%rh`; empty for [`Measure::Factor`]).
    pub fn label(self, system: UnitSystem) -> &'static str {
        self.side(system).label
    }

    /// The unit of this measure in `system`.
    pub fn unit(self, system: UnitSystem) -> Unit {
        let side = self.side(system);
        Unit::known(side.terms, self.dimension(), Some(side.label))
    }

    /// A quantity from a number in this measure's unit: `Measure::WaterFlow.quantity(32.4, Ip)`
    /// is 32.4 gpm.
    pub fn quantity(
        self,
        value: f64,
        system: UnitSystem,
    ) -> Result<Quantity, crate::QuantityError> {
        Quantity::new(value, &self.unit(system))
    }

    /// The measure [`format_auto`] uses for a dimension, when it has one: heat flow shows as
    /// [`Measure::LoadCompact`], volume flow as [`Measure::Airflow`], pressure as
    /// [`Measure::Pressure`], a ratio as [`Measure::Percent`].
    pub fn for_dimension(dim: Dimension) -> Option<Measure> {
        const AUTO: [Measure; 24] = [
            Measure::LoadCompact,
            Measure::Airflow,
            Measure::Temperature,
            Measure::TemperatureDifference,
            Measure::HumidityRatio,
            Measure::Enthalpy,
            Measure::Pressure,
            Measure::Length,
            Measure::Area,
            Measure::Volume,
            Measure::Mass,
            Measure::Time,
            Measure::Energy,
            Measure::Velocity,
            Measure::AirflowPerPerson,
            Measure::PowerPerArea,
            Measure::AirflowPerCapacity,
            Measure::MassFlow,
            Measure::MoistureFlow,
            Measure::Density,
            Measure::SpecificVolume,
            Measure::Percent,
            Measure::Count,
            Measure::Factor,
        ];
        AUTO.into_iter().find(|m| m.dimension() == dim)
    }

    /// The number alone, rounded and with separators (`4,830`); `—` when it cannot be shown.
    ///
    /// ```
    /// use plenum_units::{Measure, Quantity, Unit, UnitSystem};
    /// let q = Quantity::new(4_832.4, &Unit::parse("cfm")?)?;
    /// assert_eq!(Measure::Airflow.format_value(&q, UnitSystem::Ip), "4,830");
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn format_value(self, q: &Quantity, system: UnitSystem) -> String {
        match q.in_unit(&self.unit(system)) {
            Ok(v) => self.format_number(v, system),
            Err(_) => auto_parts(q, system).0,
        }
    }

    /// The number with its unit (`4,830 cfm`, `12.5 ton`, `57.0 °F`, `0.78`).
    ///
    /// ```
    /// use plenum_units::{Measure, Quantity, Unit, UnitSystem};
    /// let q = Quantity::new(149_520.0, &Unit::parse("Btu/h")?)?;
    /// assert_eq!(Measure::Capacity.format(&q, UnitSystem::Ip), "12.5 ton");
    /// assert_eq!(Measure::Capacity.format(&q, UnitSystem::Si), "43.8 kW");
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn format(self, q: &Quantity, system: UnitSystem) -> String {
        match q.in_unit(&self.unit(system)) {
            Ok(v) => self.format_number_with_unit(v, system),
            Err(_) => format_auto(q, system),
        }
    }

    /// A raw number, already in this measure's unit, rounded (`—` for NaN or infinity).
    pub fn format_number(self, value: f64, system: UnitSystem) -> String {
        round_to_string(value, self.side(system).round)
    }

    /// A raw number, already in this measure's unit, with the unit.
    pub fn format_number_with_unit(self, value: f64, system: UnitSystem) -> String {
        let number = self.format_number(value, system);
        let label = match (self, number.as_str()) {
            (Measure::Count, "1") => "person",
            _ => self.label(system),
        };
        if label.is_empty() {
            number
        } else {
            format!("{number} {label}")
        }
    }
}

/// A quantity in `system`, in the measure its dimension usually takes
/// ([`Measure::for_dimension`]; `%rh` literals as [`Measure::RelativeHumidity`]; a velocity
/// below 10 fpm as [`Measure::AirflowPerArea`], since 1 cfm/ft² is 1 fpm), else as an SI value
/// to 4 significant digits with the dimension's SI formula. For the hover's "value in the other
/// unit system" and for `let` values; a key with a known meaning should name its [`Measure`].
///
/// ```
/// use plenum_units::{format_auto, Quantity, Unit, UnitSystem};
/// let q = Quantity::new(38.5, &Unit::parse("kBtu/h")?)?;
/// assert_eq!(format_auto(&q, UnitSystem::Si), "11.3 kW");
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
pub fn format_auto(q: &Quantity, system: UnitSystem) -> String {
    let (number, label) = auto_parts(q, system);
    if label.is_empty() {
        number
    } else {
        format!("{number} {label}")
    }
}

/// 10 fpm in m/s: below it, [`format_auto`] reads a velocity as a ventilation rate per area.
const SLOW: f64 = 10.0 * 0.3048 / 60.0;

fn auto_parts(q: &Quantity, system: UnitSystem) -> (String, String) {
    let measure = if q.is_relative_humidity() {
        Some(Measure::RelativeHumidity)
    } else if q.dimension() == Dimension::AIRFLOW_PER_AREA && q.value().abs() < SLOW {
        // Same dimension as velocity; below 10 fpm it is a ventilation rate per area.
        Some(Measure::AirflowPerArea)
    } else {
        Measure::for_dimension(q.dimension())
    };
    if let Some(m) = measure
        && let Ok(v) = q.in_unit(&m.unit(system))
    {
        let text = m.format_number_with_unit(v, system);
        let number = m.format_number(v, system);
        let label = text[number.len()..].trim_start().to_string();
        return (number, label);
    }
    (
        round_to_string(q.value(), Round::Significant(4)),
        q.dimension().formula(),
    )
}

/// Rounds and renders a number; `—` for NaN or infinity.
fn round_to_string(x: f64, round: Round) -> String {
    if !x.is_finite() {
        return "—".to_string();
    }
    match round {
        Round::Step(mantissa, exp) => {
            step_to_string(x, mantissa, exp).unwrap_or_else(|| scientific(x))
        }
        Round::Significant(n) => {
            if x == 0.0 {
                return "0".to_string();
            }
            let n = n.max(1);
            let e = x.abs().log10().floor() as i32;
            let mut exp = e - (n as i32 - 1);
            // Rounding can carry into one more digit (9.9996e-3 → 1.000e-2).
            if let Some(k) = step_count(x, 1, exp)
                && k.unsigned_abs() >= 10u128.pow(n)
            {
                exp += 1;
            }
            step_to_string(x, 1, exp).unwrap_or_else(|| scientific(x))
        }
    }
}

fn scientific(x: f64) -> String {
    let s = format!("{x:.3e}");
    if s.starts_with('-') && x.abs() == 0.0 {
        s[1..].to_string()
    } else {
        s
    }
}

/// `x / (mantissa · 10^exp)` rounded half away from zero, as an integer, when it fits.
fn step_count(x: f64, mantissa: i64, exp: i32) -> Option<i128> {
    if !(-300..=300).contains(&exp) || mantissa <= 0 {
        return None;
    }
    let scaled = if exp < 0 {
        x * 10f64.powi(-exp) / mantissa as f64
    } else {
        x / 10f64.powi(exp) / mantissa as f64
    };
    if !scaled.is_finite() || scaled.abs() > 1e30 {
        return None;
    }
    // Half away from zero on the decimal the reader sees: nudge by 1e-12 relative so that a
    // value a few ulps below a half (12.45 is 12.4499… in binary) rounds up.
    let r = (scaled.abs() * (1.0 + 1e-12)).round();
    let k = r as i128;
    Some(if scaled < 0.0 { -k } else { k })
}

fn step_to_string(x: f64, mantissa: i64, exp: i32) -> Option<String> {
    let k = step_count(x, mantissa, exp)?.checked_mul(i128::from(mantissa))?;
    let negative = k < 0;
    let mut digits = k.unsigned_abs().to_string();
    let (int_part, frac_part) = if exp >= 0 {
        if k != 0 {
            digits.push_str(&"0".repeat(usize::try_from(exp).ok()?));
        }
        (digits, String::new())
    } else {
        let d = usize::try_from(-exp).ok()?;
        if digits.len() <= d {
            digits = format!("{}{}", "0".repeat(d + 1 - digits.len()), digits);
        }
        let split = digits.len() - d;
        (digits[..split].to_string(), digits[split..].to_string())
    };
    let mut out = String::new();
    if negative {
        out.push('-');
    }
    out.push_str(&group_thousands(&int_part));
    if !frac_part.is_empty() {
        out.push('.');
        out.push_str(&frac_part);
    }
    Some(out)
}

fn group_thousands(digits: &str) -> String {
    let mut out = String::with_capacity(digits.len() + digits.len() / 3);
    for (i, c) in digits.chars().enumerate() {
        if i > 0 && (digits.len() - i).is_multiple_of(3) {
            out.push(',');
        }
        out.push(c);
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn grouping() {
        assert_eq!(group_thousands("1"), "1");
        assert_eq!(group_thousands("999"), "999");
        assert_eq!(group_thousands("1000"), "1,000");
        assert_eq!(group_thousands("1234567"), "1,234,567");
    }

    #[test]
    fn every_measure_unit_has_its_dimension() {
        for m in Measure::ALL {
            for sys in [UnitSystem::Ip, UnitSystem::Si] {
                let side = m.side(sys);
                let mut dim = Dimension::RATIO;
                for (def, e) in side.terms {
                    let p = def.dim.checked_pow(*e);
                    dim = p
                        .and_then(|p| dim.checked_mul(p))
                        .unwrap_or(Dimension::RATIO);
                }
                if m == Measure::Temperature {
                    dim = Dimension::TEMPERATURE;
                }
                assert_eq!(dim, m.dimension(), "{m:?} {sys}");
            }
        }
    }

    #[test]
    fn significant_digits_carry() {
        assert_eq!(
            round_to_string(0.009_999_6, Round::Significant(4)),
            "0.01000"
        );
        assert_eq!(
            round_to_string(0.009_812_3, Round::Significant(4)),
            "0.009812"
        );
        assert_eq!(round_to_string(-0.0, Round::Significant(4)), "0");
        assert_eq!(round_to_string(12_345.0, Round::Significant(2)), "12,000");
    }

    #[test]
    fn huge_values_fall_back_to_scientific() {
        assert_eq!(round_to_string(1e300, TO_5), "1.000e300");
        assert_eq!(round_to_string(f64::NAN, TO_5), "—");
        assert_eq!(
            round_to_string(f64::NEG_INFINITY, Round::Significant(4)),
            "—"
        );
    }
}
