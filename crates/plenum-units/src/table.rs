//! The unit table: every unit symbol the parser knows, with its factor to SI.
//!
//! Factors are from NIST Special Publication 811 (2008 edition), *Guide for the Use of the
//! International System of Units*, appendix B.8 (factors in alphabetical order) and B.9 (by kind
//! of quantity), cited beside each entry as `B.8: unit → SI unit printed-factor`. Where
//! SP 811 marks a factor exact, or where the factor follows exactly from exact definitions (the
//! international foot and pound, standard gravity 9.806 65 m/s², the IT Btu), the exact value is
//! used and the printed 7-digit factor is checked in `tests/nist.rs`. The printed factors were
//! written from memory of SP 811 (2008) and are the ones `tests/nist.rs` holds the table to.

use crate::dimension::Dimension;
use crate::system::UnitSystem;

/// An absolute temperature scale.
///
/// A lone scale symbol (`57 °F`) is an absolute temperature; inside a compound unit
/// (`Btu/(lb·°F)`, `°F/h`) the symbol means one degree of that scale, a difference.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum TemperatureScale {
    /// Kelvin: T/K.
    Kelvin,
    /// Celsius: T/K = t/°C + 273.15.
    Celsius,
    /// Fahrenheit: T/K = (t/°F + 459.67)/1.8.
    Fahrenheit,
    /// Rankine: T/K = (T/°R)/1.8.
    Rankine,
}

impl TemperatureScale {
    /// Size of one degree, in kelvin.
    pub fn degree(self) -> f64 {
        match self {
            TemperatureScale::Kelvin | TemperatureScale::Celsius => 1.0,
            TemperatureScale::Fahrenheit | TemperatureScale::Rankine => 1.0 / 1.8,
        }
    }

    /// Absolute zero on this scale, negated, in degrees of the scale: T/K = (t + zero)·degree.
    pub fn zero(self) -> f64 {
        match self {
            TemperatureScale::Kelvin | TemperatureScale::Rankine => 0.0,
            TemperatureScale::Celsius => 273.15,
            TemperatureScale::Fahrenheit => 459.67,
        }
    }

    /// Kelvin for a reading on this scale.
    pub fn to_kelvin(self, reading: f64) -> f64 {
        match self {
            TemperatureScale::Kelvin => reading,
            TemperatureScale::Celsius => reading + 273.15,
            TemperatureScale::Fahrenheit => (reading + 459.67) / 1.8,
            TemperatureScale::Rankine => reading / 1.8,
        }
    }

    /// The reading on this scale for a temperature in kelvin.
    pub fn from_kelvin(self, kelvin: f64) -> f64 {
        match self {
            TemperatureScale::Kelvin => kelvin,
            TemperatureScale::Celsius => kelvin - 273.15,
            TemperatureScale::Fahrenheit => kelvin * 1.8 - 459.67,
            TemperatureScale::Rankine => kelvin * 1.8,
        }
    }
}

/// What a unit symbol means beyond its factor.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Kind {
    /// An ordinary multiplicative unit.
    Plain,
    /// A temperature scale: absolute when alone, one degree inside a compound.
    Scale(TemperatureScale),
    /// `%rh`: a ratio the author marked as relative humidity.
    RelativeHumidity,
}

/// One entry of the unit table (one symbol and its aliases).
#[derive(Debug)]
pub struct UnitDef {
    pub(crate) symbol: &'static str,
    pub(crate) aliases: &'static [&'static str],
    pub(crate) name: &'static str,
    /// SI value of one unit (for a scale: the size of one degree, in kelvin).
    pub(crate) factor: f64,
    /// The dimension (for a scale: temperature *difference*, the degree).
    pub(crate) dim: Dimension,
    pub(crate) kind: Kind,
    /// The unit system the symbol belongs to; `None` for units both use (`h`, `%`, `person`).
    pub(crate) system: Option<UnitSystem>,
    pub(crate) source: &'static str,
}

impl UnitDef {
    /// The canonical symbol (`ft²` is written `ft` with a power; `°F`, `kBtu`, `in.wg`).
    pub fn symbol(&self) -> &'static str {
        self.symbol
    }
    /// Other spellings the parser accepts for this symbol (`degF`, `CFM`, …).
    pub fn aliases(&self) -> &'static [&'static str] {
        self.aliases
    }
    /// The unit's name in words, for hover and completion.
    pub fn name(&self) -> &'static str {
        self.name
    }
    /// The dimension of the symbol used alone (a temperature scale is an absolute temperature).
    pub fn dimension(&self) -> Dimension {
        match self.kind {
            Kind::Scale(_) => Dimension::TEMPERATURE,
            Kind::Plain | Kind::RelativeHumidity => self.dim,
        }
    }
    /// The value of one unit in SI base units (for a temperature scale, one degree in kelvin).
    pub fn factor(&self) -> f64 {
        self.factor
    }
    /// Where the factor comes from.
    pub fn source(&self) -> &'static str {
        self.source
    }
    /// The unit system the symbol belongs to (`None` for `h`, `%`, `person`, …).
    pub fn system(&self) -> Option<UnitSystem> {
        self.system
    }
    /// Every accepted spelling: the symbol, then the aliases.
    pub(crate) fn spellings(&self) -> impl Iterator<Item = &'static str> {
        std::iter::once(self.symbol).chain(self.aliases.iter().copied())
    }
}

const IP: Option<UnitSystem> = Some(UnitSystem::Ip);
const SI: Option<UnitSystem> = Some(UnitSystem::Si);
const BOTH: Option<UnitSystem> = None;

// Exact definitions that the factors below are built from.
/// International foot, m (B.8: foot → metre 3.048 E−01, exact).
const FT: f64 = 0.3048;
/// Inch, m (B.8: inch → metre 2.54 E−02, exact).
const INCH: f64 = 0.0254;
/// Pound (avoirdupois), kg (B.8: pound → kilogram 4.535 924 E−01; exact 0.453 592 37).
const LB: f64 = 0.453_592_37;
/// Standard acceleration of gravity, m/s² (SP 811 B.8 footnote; exact), for lbf.
const G_N: f64 = 9.806_65;
/// Btu (International Table), J (B.8: 1.055 056 E+03; exact 1.055 055 852 62 E+03).
const BTU: f64 = 1_055.055_852_62;
/// US gallon, m³ (B.8: gallon (U.S.) → m³ 3.785 412 E−03; exact 231 in³).
const GAL: f64 = 231.0 * INCH * INCH * INCH;

macro_rules! def {
    ($id:ident, $sym:expr, [$($alias:expr),*], $name:expr, $factor:expr, $dim:expr, $kind:expr, $sys:expr, $src:expr) => {
        pub(crate) static $id: UnitDef = UnitDef {
            symbol: $sym,
            aliases: &[$($alias),*],
            name: $name,
            factor: $factor,
            dim: $dim,
            kind: $kind,
            system: $sys,
            source: $src,
        };
    };
}

use Kind::{Plain, RelativeHumidity, Scale};

/// The table entries, one per symbol: `def!(ID, symbol, [aliases], name, SI factor, dimension,
/// kind, system, source)`. Kept unformatted so that each factor sits beside its citation.
#[rustfmt::skip]
mod entries {
    use super::*;

    // ---- length ---------------------------------------------------------------------------
    def!(M, "m", [], "metre", 1.0, Dimension::LENGTH, Plain, SI,
         "SI base unit");
    def!(MM, "mm", [], "millimetre", 1e-3, Dimension::LENGTH, Plain, SI,
         "SI prefix milli (SP 811 §4.3, exact)");
    def!(CM, "cm", [], "centimetre", 1e-2, Dimension::LENGTH, Plain, SI,
         "SI prefix centi (SP 811 §4.3, exact)");
    def!(KM, "km", [], "kilometre", 1e3, Dimension::LENGTH, Plain, SI,
         "SI prefix kilo (SP 811 §4.3, exact)");
    def!(FOOT, "ft", ["feet"], "foot", FT, Dimension::LENGTH, Plain, IP,
         "B.8: foot → metre 3.048 E−01 (exact)");
    def!(IN, "in", ["inch"], "inch", INCH, Dimension::LENGTH, Plain, IP,
         "B.8: inch → metre 2.54 E−02 (exact)");
    // ---- volume ---------------------------------------------------------------------------
    def!(LITRE, "L", ["l"], "litre", 1e-3, Dimension::VOLUME, Plain, SI,
         "B.8: liter → cubic metre 1.0 E−03 (exact)");
    def!(GALLON, "gal", [], "US gallon", GAL, Dimension::VOLUME, Plain, IP,
         "B.8: gallon (U.S.) → cubic metre 3.785 412 E−03 (231 in³, exact)");
    // ---- mass -----------------------------------------------------------------------------
    def!(KG, "kg", [], "kilogram", 1.0, Dimension::MASS, Plain, SI,
         "SI base unit");
    def!(GRAM, "g", [], "gram", 1e-3, Dimension::MASS, Plain, SI,
         "SI prefix (SP 811 §4.3, exact)");
    def!(POUND, "lb", ["lbm", "lbs"], "pound (avoirdupois)", LB, Dimension::MASS, Plain, IP,
         "B.8: pound (avoirdupois) → kilogram 4.535 924 E−01 (exact 0.453 592 37)");
    def!(GRAIN, "gr", [], "grain", LB / 7000.0, Dimension::MASS, Plain, IP,
         "B.8: grain → kilogram 6.479 891 E−05 (exact, 1/7000 lb)");
    // ---- time -----------------------------------------------------------------------------
    def!(SECOND, "s", ["sec"], "second", 1.0, Dimension::TIME, Plain, BOTH,
         "SI base unit");
    def!(MINUTE, "min", [], "minute", 60.0, Dimension::TIME, Plain, BOTH,
         "B.8: minute → second 6.0 E+01 (exact)");
    def!(HOUR, "h", ["hr"], "hour", 3600.0, Dimension::TIME, Plain, BOTH,
         "B.8: hour → second 3.6 E+03 (exact)");
    // ---- energy ---------------------------------------------------------------------------
    def!(JOULE, "J", [], "joule", 1.0, Dimension::ENERGY, Plain, SI,
         "SI derived unit");
    def!(KJ, "kJ", [], "kilojoule", 1e3, Dimension::ENERGY, Plain, SI,
         "SI prefix kilo (exact)");
    def!(KWH, "kWh", [], "kilowatt hour", 3.6e6, Dimension::ENERGY, Plain, SI,
         "B.8: kilowatt hour → joule 3.6 E+06 (exact)");
    def!(BTU_, "Btu", ["BTU"], "British thermal unit (IT)", BTU, Dimension::ENERGY, Plain, IP,
         "B.8: British thermal unit_IT → joule 1.055 056 E+03 (exact 1.055 055 852 62 E+03)");
    def!(KBTU, "kBtu", ["kBTU"], "thousand Btu (IT)", 1e3 * BTU, Dimension::ENERGY, Plain, IP,
         "1000 Btu_IT; B.8: Btu_IT → joule 1.055 056 E+03");
    // ---- heat flow and power --------------------------------------------------------------
    def!(WATT, "W", [], "watt", 1.0, Dimension::HEAT_FLOW, Plain, SI,
         "SI derived unit");
    def!(KW, "kW", [], "kilowatt", 1e3, Dimension::HEAT_FLOW, Plain, SI,
         "SI prefix kilo (exact)");
    def!(BTUH, "Btuh", ["BTUH"], "Btu (IT) per hour", BTU / 3600.0, Dimension::HEAT_FLOW, Plain, IP,
         "B.8: British thermal unit_IT per hour → watt 2.930 711 E−01");
    def!(MBH, "MBH", [], "thousand Btu (IT) per hour", 1e3 * BTU / 3600.0, Dimension::HEAT_FLOW, Plain, IP,
         "1000 Btu_IT/h (trade usage, M = thousand); B.8: Btu_IT/h → watt 2.930 711 E−01");
    def!(TON, "ton", ["tons"], "ton of refrigeration", 12_000.0 * BTU / 3600.0, Dimension::HEAT_FLOW, Plain, IP,
         "B.8: ton of refrigeration (12 000 Btu_IT/h) → watt 3.516 853 E+03");
    def!(HP, "hp", [], "horsepower (550 ft·lbf/s)", 550.0 * FT * LB * G_N, Dimension::HEAT_FLOW, Plain, IP,
         "B.8: horsepower (550 ft·lbf/s) → watt 7.456 999 E+02");
    // ---- pressure -------------------------------------------------------------------------
    def!(PA, "Pa", [], "pascal", 1.0, Dimension::PRESSURE, Plain, SI,
         "SI derived unit");
    def!(KPA, "kPa", [], "kilopascal", 1e3, Dimension::PRESSURE, Plain, SI,
         "SI prefix kilo (exact)");
    def!(PSI, "psi", [], "pound-force per square inch", LB * G_N / (INCH * INCH), Dimension::PRESSURE, Plain, IP,
         "B.8: pound-force per square inch → pascal 6.894 757 E+03");
    def!(PSIA, "psia", [], "pound-force per square inch, absolute", LB * G_N / (INCH * INCH), Dimension::PRESSURE, Plain, IP,
         "B.8: pound-force per square inch → pascal 6.894 757 E+03 (absolute pressure)");
    def!(INWG, "in.wg", ["in.w.g.", "inwg", "in.wc", "inwc"], "inch of water (60 °F)", 248.84, Dimension::PRESSURE, Plain, IP,
         "B.8: inch of water (60 °F) → pascal 2.4884 E+02");
    // ---- velocity and volume flow ---------------------------------------------------------
    def!(FPM, "fpm", ["FPM"], "foot per minute", FT / 60.0, Dimension::VELOCITY, Plain, IP,
         "B.8: foot per minute → metre per second 5.08 E−03 (exact)");
    def!(CFM, "cfm", ["CFM"], "cubic foot per minute", FT * FT * FT / 60.0, Dimension::AIRFLOW, Plain, IP,
         "B.8: cubic foot per minute → cubic metre per second 4.719 474 E−04");
    def!(GPM, "gpm", ["GPM"], "US gallon per minute", GAL / 60.0, Dimension::WATER_FLOW, Plain, IP,
         "B.8: gallon (U.S.) per minute → cubic metre per second 6.309 020 E−05");
    // ---- humidity ratio (mass of water per mass of dry air) --------------------------------
    def!(LB_LB, "lb/lb", [], "pound of water per pound of dry air", 1.0, Dimension::HUMIDITY_RATIO, Plain, IP,
         "mass ratio (identity)");
    def!(KG_KG, "kg/kg", [], "kilogram of water per kilogram of dry air", 1.0, Dimension::HUMIDITY_RATIO, Plain, SI,
         "mass ratio (identity)");
    def!(GR_LB, "gr/lb", [], "grain of water per pound of dry air", 1.0 / 7000.0, Dimension::HUMIDITY_RATIO, Plain, IP,
         "7000 gr = 1 lb (B.8: grain 6.479 891 E−05 kg, pound 4.535 924 E−01 kg, both exact)");
    def!(G_KG, "g/kg", [], "gram of water per kilogram of dry air", 1e-3, Dimension::HUMIDITY_RATIO, Plain, SI,
         "SI prefix (exact)");
    // ---- temperature ----------------------------------------------------------------------
    def!(DEG_F, "°F", ["degF", "℉"], "degree Fahrenheit", 1.0 / 1.8, Dimension::TEMPERATURE_DIFFERENCE, Scale(TemperatureScale::Fahrenheit), IP,
         "B.9: T/K = (t/°F + 459.67)/1.8");
    def!(DEG_C, "°C", ["degC", "℃"], "degree Celsius", 1.0, Dimension::TEMPERATURE_DIFFERENCE, Scale(TemperatureScale::Celsius), SI,
         "B.9: T/K = t/°C + 273.15");
    def!(KELVIN, "K", [], "kelvin", 1.0, Dimension::TEMPERATURE_DIFFERENCE, Scale(TemperatureScale::Kelvin), SI,
         "SI base unit");
    def!(DEG_R, "°R", ["degR"], "degree Rankine", 1.0 / 1.8, Dimension::TEMPERATURE_DIFFERENCE, Scale(TemperatureScale::Rankine), IP,
         "B.9: T/K = (T/°R)/1.8");
    def!(DELTA_F, "Δ°F", ["ΔdegF", "ΔF"], "degree Fahrenheit of difference", 1.0 / 1.8, Dimension::TEMPERATURE_DIFFERENCE, Plain, IP,
         "B.9: a difference of 1 °F = 1/1.8 K (exact)");
    def!(DELTA_C, "Δ°C", ["ΔdegC", "ΔC"], "degree Celsius of difference", 1.0, Dimension::TEMPERATURE_DIFFERENCE, Plain, SI,
         "B.9: a difference of 1 °C = 1 K (exact)");
    // ---- ratio and count ------------------------------------------------------------------
    def!(PERCENT, "%", [], "percent", 0.01, Dimension::RATIO, Plain, BOTH,
         "1 % = 0.01 (exact)");
    def!(PERCENT_RH, "%rh", ["%RH"], "percent relative humidity", 0.01, Dimension::RATIO, RelativeHumidity, BOTH,
         "1 % = 0.01 (exact)");
    def!(PERSON, "person", ["people", "persons"], "person (occupant)", 1.0, Dimension::COUNT, Plain, BOTH,
         "count");
}

pub(crate) use entries::*;

/// Every unit symbol, in the order the nearest-name search prefers them on a tie.
pub(crate) static TABLE: [&UnitDef; 47] = [
    &CFM,
    &FOOT,
    &IN,
    &M,
    &MM,
    &CM,
    &KM,
    &LITRE,
    &GALLON,
    &KG,
    &GRAM,
    &POUND,
    &GRAIN,
    &HOUR,
    &MINUTE,
    &SECOND,
    &BTU_,
    &KBTU,
    &JOULE,
    &KJ,
    &KWH,
    &WATT,
    &KW,
    &BTUH,
    &MBH,
    &TON,
    &HP,
    &PA,
    &KPA,
    &PSIA,
    &PSI,
    &INWG,
    &FPM,
    &GPM,
    &LB_LB,
    &KG_KG,
    &GR_LB,
    &G_KG,
    &DEG_F,
    &DEG_C,
    &KELVIN,
    &DEG_R,
    &DELTA_F,
    &DELTA_C,
    &PERCENT,
    &PERCENT_RH,
    &PERSON,
];

/// The whole unit table, for completion lists and documentation.
///
/// ```
/// let cfm = plenum_units::catalog().iter().find(|u| u.symbol() == "cfm");
/// assert_eq!(cfm.map(|u| u.dimension()), Some(plenum_units::Dimension::AIRFLOW));
/// ```
pub fn catalog() -> &'static [&'static UnitDef] {
    &TABLE
}

/// The table entry for one exact spelling.
pub(crate) fn lookup(spelling: &str) -> Option<&'static UnitDef> {
    TABLE
        .iter()
        .copied()
        .find(|def| def.spellings().any(|s| s == spelling))
}

/// Spellings that contain `/` and are read as one symbol (humidity ratios).
pub(crate) fn slash_atoms() -> impl Iterator<Item = (&'static str, &'static UnitDef)> {
    TABLE
        .iter()
        .copied()
        .flat_map(|def| def.spellings().map(move |s| (s, def)))
        .filter(|(s, _)| s.contains('/'))
}
