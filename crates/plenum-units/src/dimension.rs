//! Physical dimensions as integer exponents over six base dimensions.

use std::fmt;

/// Number of base dimensions.
const BASES: usize = 6;

/// The base dimensions, in the order the exponents are stored.
///
/// Besides the four mechanical/thermal bases (length, mass, time, temperature difference)
/// there are two bookkeeping bases the trade needs kept apart:
///
/// * [`Base::Person`] — an occupant count, so that `cfm/person` differs from `cfm`;
/// * [`Base::Moisture`] — mass of water vapour, so that a humidity ratio (lb of water per lb of
///   dry air) is not a plain ratio: `0.0098 lb/lb` is a humidity ratio, `50 %` is not.
///
/// Mass ([`Base::Mass`]) is the mass of dry air wherever the two are distinguished: specific
/// enthalpy `Btu/lb` is per pound of dry air.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Base {
    /// Length (metre).
    Length,
    /// Mass, of dry air where it matters (kilogram).
    Mass,
    /// Time (second).
    Time,
    /// Temperature *difference* (kelvin). Absolute temperature is a flag, see
    /// [`Dimension::TEMPERATURE`].
    Temperature,
    /// Occupant count (person).
    Person,
    /// Mass of water vapour (kilogram of water).
    Moisture,
}

impl Base {
    const ALL: [Base; BASES] = [
        Base::Length,
        Base::Mass,
        Base::Time,
        Base::Temperature,
        Base::Person,
        Base::Moisture,
    ];

    fn index(self) -> usize {
        match self {
            Base::Length => 0,
            Base::Mass => 1,
            Base::Time => 2,
            Base::Temperature => 3,
            Base::Person => 4,
            Base::Moisture => 5,
        }
    }

    /// SI symbol used when a dimension without a name is printed.
    fn symbol(self) -> &'static str {
        match self {
            Base::Length => "m",
            Base::Mass => "kg",
            Base::Time => "s",
            Base::Temperature => "K",
            Base::Person => "person",
            Base::Moisture => "kg(water)",
        }
    }
}

/// A physical dimension: integer exponents over the [`Base`] dimensions, plus a flag that marks
/// an **absolute** temperature.
///
/// Absolute temperature ([`Dimension::TEMPERATURE`], e.g. `57 °F`) and temperature difference
/// ([`Dimension::TEMPERATURE_DIFFERENCE`], e.g. `18 °F` of supply ΔT) have the same exponents
/// but are different dimensions: they compare unequal, and [`Quantity`](crate::Quantity)
/// arithmetic keeps them apart. Only a lone temperature can be absolute; products, quotients and
/// powers of temperatures are always built from differences (`Btu/(lb·°F)` is per degree).
///
/// Some names share one physical dimension; the constants are aliases of one value:
///
/// | constants | name |
/// | --- | --- |
/// | `HEAT_FLOW`, `POWER` | "heat flow" (fan and motor power included) |
/// | `AIRFLOW`, `WATER_FLOW`, `VOLUME_FLOW` | "airflow" (`gpm` is a volume flow too; the display [`Measure`](crate::Measure) tells air from water) |
/// | `VELOCITY`, `AIRFLOW_PER_AREA` | "ventilation rate per area or velocity" (1 cfm/ft² is exactly 1 fpm) |
#[derive(Clone, Copy, PartialEq, Eq, Hash)]
pub struct Dimension {
    exps: [i8; BASES],
    absolute: bool,
}

const fn dim(l: i8, m: i8, t: i8, th: i8, n: i8, w: i8) -> Dimension {
    Dimension {
        exps: [l, m, t, th, n, w],
        absolute: false,
    }
}

impl Dimension {
    /// A plain number (`50 %`, `0.95`, SHR).
    pub const RATIO: Dimension = dim(0, 0, 0, 0, 0, 0);
    /// Length (`ft`, `m`).
    pub const LENGTH: Dimension = dim(1, 0, 0, 0, 0, 0);
    /// Area (`ft²`, `m²`).
    pub const AREA: Dimension = dim(2, 0, 0, 0, 0, 0);
    /// Volume (`ft³`, `m³`, `L`, `gal`).
    pub const VOLUME: Dimension = dim(3, 0, 0, 0, 0, 0);
    /// Mass (`lb`, `kg`).
    pub const MASS: Dimension = dim(0, 1, 0, 0, 0, 0);
    /// Time (`h`, `min`, `s`).
    pub const TIME: Dimension = dim(0, 0, 1, 0, 0, 0);
    /// Absolute temperature (`57 °F`, `14 °C`, `290 K`). Stored in kelvin.
    pub const TEMPERATURE: Dimension = Dimension {
        exps: [0, 0, 0, 1, 0, 0],
        absolute: true,
    };
    /// Temperature difference (`75 °F - 57 °F`, `3 K`, `18 Δ°F`). Stored in kelvin.
    pub const TEMPERATURE_DIFFERENCE: Dimension = dim(0, 0, 0, 1, 0, 0);
    /// Energy (`Btu`, `kJ`).
    pub const ENERGY: Dimension = dim(2, 1, -2, 0, 0, 0);
    /// Heat flow (`Btu/h`, `kBtu/h`, `MBH`, `ton`, `W`, `kW`); same as [`Dimension::POWER`].
    pub const HEAT_FLOW: Dimension = dim(2, 1, -3, 0, 0, 0);
    /// Power (`hp`, `kW`); the same dimension as [`Dimension::HEAT_FLOW`].
    pub const POWER: Dimension = Dimension::HEAT_FLOW;
    /// Volume flow (`cfm`, `L/s`, `m³/h`, `gpm`), named "airflow".
    pub const AIRFLOW: Dimension = dim(3, 0, -1, 0, 0, 0);
    /// Alias of [`Dimension::AIRFLOW`]: water flow is a volume flow too.
    pub const WATER_FLOW: Dimension = Dimension::AIRFLOW;
    /// Alias of [`Dimension::AIRFLOW`].
    pub const VOLUME_FLOW: Dimension = Dimension::AIRFLOW;
    /// Pressure (`psia`, `psi`, `in.wg`, `Pa`, `kPa`).
    pub const PRESSURE: Dimension = dim(-1, 1, -2, 0, 0, 0);
    /// Velocity (`fpm`, `m/s`); the same dimension as [`Dimension::AIRFLOW_PER_AREA`].
    pub const VELOCITY: Dimension = dim(1, 0, -1, 0, 0, 0);
    /// Ventilation rate per floor area (`cfm/ft²`, `L/s/m²`); equal to [`Dimension::VELOCITY`].
    pub const AIRFLOW_PER_AREA: Dimension = Dimension::VELOCITY;
    /// Ventilation rate per person (`cfm/person`, `L/s/person`).
    pub const AIRFLOW_PER_PERSON: Dimension = dim(3, 0, -1, 0, -1, 0);
    /// Power per floor area, lighting and equipment densities (`W/ft²`, `W/m²`).
    pub const POWER_PER_AREA: Dimension = dim(0, 1, -3, 0, 0, 0);
    /// Humidity ratio, mass of water per mass of dry air (`lb/lb`, `gr/lb`, `kg/kg`, `g/kg`).
    pub const HUMIDITY_RATIO: Dimension = dim(0, -1, 0, 0, 0, 1);
    /// Specific enthalpy, per mass of dry air (`Btu/lb`, `kJ/kg`).
    pub const SPECIFIC_ENTHALPY: Dimension = dim(2, 0, -2, 0, 0, 0);
    /// Occupant count (`person`, `people`).
    pub const COUNT: Dimension = dim(0, 0, 0, 0, 1, 0);
    /// Mass flow of dry air (`lb/h`, `kg/s`).
    pub const MASS_FLOW: Dimension = dim(0, 1, -1, 0, 0, 0);
    /// Mass flow of water, e.g. condensate (humidity ratio × dry-air mass flow).
    pub const MOISTURE_FLOW: Dimension = dim(0, 0, -1, 0, 0, 1);
    /// Density (`lb/ft³`, `kg/m³`).
    pub const DENSITY: Dimension = dim(-3, 1, 0, 0, 0, 0);
    /// Specific volume, per mass of dry air (`ft³/lb`, `m³/kg`).
    pub const SPECIFIC_VOLUME: Dimension = dim(3, -1, 0, 0, 0, 0);
    /// Specific heat (`Btu/(lb·°F)`, `kJ/(kg·K)`).
    pub const SPECIFIC_HEAT: Dimension = dim(2, 0, -2, -1, 0, 0);
    /// Airflow per unit of cooling capacity (`cfm/ton`).
    pub const AIRFLOW_PER_CAPACITY: Dimension = dim(1, -1, 2, 0, 0, 0);

    /// Every named dimension, in the order [`Dimension::name`] looks them up.
    const NAMED: [(Dimension, &'static str); 27] = [
        (Dimension::RATIO, "ratio"),
        (Dimension::LENGTH, "length"),
        (Dimension::AREA, "area"),
        (Dimension::VOLUME, "volume"),
        (Dimension::MASS, "mass"),
        (Dimension::TIME, "time"),
        (Dimension::TEMPERATURE, "temperature"),
        (Dimension::TEMPERATURE_DIFFERENCE, "temperature difference"),
        (Dimension::ENERGY, "energy"),
        (Dimension::HEAT_FLOW, "heat flow"),
        (Dimension::AIRFLOW, "airflow"),
        (Dimension::PRESSURE, "pressure"),
        (Dimension::VELOCITY, "ventilation rate per area or velocity"),
        (Dimension::AIRFLOW_PER_PERSON, "ventilation rate per person"),
        (Dimension::POWER_PER_AREA, "power density"),
        (Dimension::HUMIDITY_RATIO, "humidity ratio"),
        (Dimension::SPECIFIC_ENTHALPY, "specific enthalpy"),
        (Dimension::COUNT, "count"),
        (Dimension::MASS_FLOW, "mass flow"),
        (Dimension::MOISTURE_FLOW, "moisture flow"),
        (Dimension::DENSITY, "density"),
        (Dimension::SPECIFIC_VOLUME, "specific volume"),
        (Dimension::SPECIFIC_HEAT, "specific heat"),
        (Dimension::AIRFLOW_PER_CAPACITY, "airflow per capacity"),
        // Entries below only add names for dimensions a user can meet in messages.
        (dim(0, 0, -1, 0, 0, 0), "frequency"),
        (dim(0, 0, 0, 0, 0, 1), "moisture mass"),
        (dim(1, 1, -2, 0, 0, 0), "force"),
    ];

    /// The name used in messages ("heat flow", "airflow", "temperature difference", …), or `None`
    /// for a dimension without one (its [`Display`](fmt::Display) then prints the SI formula).
    ///
    /// ```
    /// use plenum_units::Dimension;
    /// assert_eq!(Dimension::HEAT_FLOW.name(), Some("heat flow"));
    /// assert_eq!(Dimension::WATER_FLOW.name(), Some("airflow"));
    /// ```
    pub fn name(self) -> Option<&'static str> {
        Self::NAMED
            .iter()
            .find(|(d, _)| *d == self)
            .map(|(_, name)| *name)
    }

    /// The exponent of one base dimension.
    pub fn exponent(self, base: Base) -> i8 {
        self.exps[base.index()]
    }

    /// Whether this is an absolute temperature ([`Dimension::TEMPERATURE`]).
    pub fn is_absolute_temperature(self) -> bool {
        self.absolute
    }

    /// Whether this is a plain number ([`Dimension::RATIO`]).
    pub fn is_ratio(self) -> bool {
        self == Dimension::RATIO
    }

    /// The same dimension with an absolute temperature read as a difference; any other dimension
    /// unchanged.
    pub fn as_difference(self) -> Dimension {
        Dimension {
            exps: self.exps,
            absolute: false,
        }
    }

    /// The product dimension; `None` when either side is an absolute temperature or an exponent
    /// would leave the range of `i8`.
    pub fn checked_mul(self, rhs: Dimension) -> Option<Dimension> {
        self.combine(rhs, 1)
    }

    /// The quotient dimension; `None` as for [`Dimension::checked_mul`].
    pub fn checked_div(self, rhs: Dimension) -> Option<Dimension> {
        self.combine(rhs, -1)
    }

    /// The dimension raised to an integer power; `None` for an absolute temperature (other than
    /// the power 1) or an exponent out of range.
    pub fn checked_pow(self, n: i32) -> Option<Dimension> {
        if self.absolute {
            return (n == 1).then_some(self);
        }
        let mut exps = [0i8; BASES];
        for (out, e) in exps.iter_mut().zip(self.exps) {
            *out = i8::try_from(i32::from(e).checked_mul(n)?).ok()?;
        }
        Some(Dimension {
            exps,
            absolute: false,
        })
    }

    fn combine(self, rhs: Dimension, sign: i8) -> Option<Dimension> {
        if self.absolute || rhs.absolute {
            return None;
        }
        let mut exps = [0i8; BASES];
        for ((out, a), b) in exps.iter_mut().zip(self.exps).zip(rhs.exps) {
            *out = a.checked_add(b.checked_mul(sign)?)?;
        }
        Some(Dimension {
            exps,
            absolute: false,
        })
    }

    /// The SI formula of the dimension, such as `m²·kg·s⁻³`; `1` for a plain number.
    pub fn formula(self) -> String {
        let mut out = String::new();
        for base in Base::ALL {
            let e = self.exponent(base);
            if e == 0 {
                continue;
            }
            if !out.is_empty() {
                out.push('·');
            }
            out.push_str(base.symbol());
            if e != 1 {
                out.push_str(&superscript(i32::from(e)));
            }
        }
        if out.is_empty() {
            out.push('1');
        }
        if self.absolute {
            out.push_str(" (absolute)");
        }
        out
    }
}

/// Renders an integer exponent with Unicode superscript digits (`²`, `⁻¹`).
pub(crate) fn superscript(n: i32) -> String {
    const DIGITS: [char; 10] = ['⁰', '¹', '²', '³', '⁴', '⁵', '⁶', '⁷', '⁸', '⁹'];
    let mut out = String::new();
    if n < 0 {
        out.push('⁻');
    }
    for c in n.unsigned_abs().to_string().chars() {
        let d = c.to_digit(10).unwrap_or(0) as usize;
        out.push(DIGITS[d]);
    }
    out
}

impl fmt::Display for Dimension {
    /// The [`Dimension::name`], or the SI formula when the dimension has no name.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.name() {
            Some(name) => f.write_str(name),
            None => f.write_str(&self.formula()),
        }
    }
}

impl fmt::Debug for Dimension {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "Dimension({})", self.formula())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_are_unique_per_dimension() {
        for (i, (a, _)) in Dimension::NAMED.iter().enumerate() {
            for (b, _) in &Dimension::NAMED[i + 1..] {
                assert_ne!(a, b, "{a:?} named twice");
            }
        }
    }

    #[test]
    fn absolute_temperature_does_not_combine() {
        let t = Dimension::TEMPERATURE;
        assert_eq!(t.checked_mul(Dimension::RATIO), None);
        assert_eq!(Dimension::RATIO.checked_div(t), None);
        assert_eq!(t.checked_pow(2), None);
        assert_eq!(t.checked_pow(1), Some(t));
        assert_ne!(t, Dimension::TEMPERATURE_DIFFERENCE);
        assert_eq!(t.as_difference(), Dimension::TEMPERATURE_DIFFERENCE);
    }

    #[test]
    fn exponent_overflow_is_none() {
        let big = Dimension::LENGTH.checked_pow(100);
        assert_eq!(big.map(|d| d.exponent(Base::Length)), Some(100));
        assert_eq!(
            big.and_then(|d| d.checked_mul(Dimension::LENGTH.checked_pow(100)?)),
            None
        );
        assert_eq!(Dimension::LENGTH.checked_pow(i32::MAX), None);
    }

    #[test]
    fn formula_of_unnamed_dimension() {
        let d = Dimension::HEAT_FLOW.checked_mul(Dimension::LENGTH);
        assert_eq!(d.map(|d| d.to_string()), Some("m³·kg·s⁻³".to_string()));
        assert_eq!(Dimension::TEMPERATURE.formula(), "K (absolute)");
    }
}
