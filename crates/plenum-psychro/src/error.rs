//! The one error type of the crate.

use std::fmt;

/// A quantity named in an error.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Quantity {
    /// Dry-bulb temperature.
    DryBulb,
    /// Thermodynamic wet-bulb temperature.
    WetBulb,
    /// Dew-point (or, below the triple point, frost-point) temperature.
    DewPoint,
    /// Relative humidity.
    RelativeHumidity,
    /// Humidity ratio (mass of water vapour per mass of dry air).
    HumidityRatio,
    /// Specific enthalpy of moist air per mass of dry air.
    Enthalpy,
    /// Total (barometric) pressure.
    Pressure,
    /// Partial pressure of water vapour.
    VapourPressure,
    /// Saturation pressure of water vapour.
    SaturationPressure,
    /// Elevation above sea level.
    Elevation,
    /// Specific volume of moist air per mass of dry air.
    SpecificVolume,
    /// Density of moist air.
    Density,
}

impl fmt::Display for Quantity {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Quantity::DryBulb => "dry-bulb temperature",
            Quantity::WetBulb => "wet-bulb temperature",
            Quantity::DewPoint => "dew-point temperature",
            Quantity::RelativeHumidity => "relative humidity",
            Quantity::HumidityRatio => "humidity ratio",
            Quantity::Enthalpy => "enthalpy",
            Quantity::Pressure => "pressure",
            Quantity::VapourPressure => "water-vapour pressure",
            Quantity::SaturationPressure => "saturation pressure",
            Quantity::Elevation => "elevation",
            Quantity::SpecificVolume => "specific volume",
            Quantity::Density => "density",
        })
    }
}

/// Why a psychrometric calculation has no answer.
///
/// Every public function of the crate returns this instead of NaN, infinity
/// or a panic. Values and ranges are in the units of the call (the unit label
/// is carried in the error).
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum PsychroError {
    /// An input was NaN or infinite.
    NotFinite {
        /// The input.
        quantity: Quantity,
    },
    /// A temperature lies outside the range of the correlations
    /// (−100…200 °C, −148…392 °F).
    TemperatureOutOfRange {
        /// Which temperature.
        quantity: Quantity,
        /// The value given or computed.
        value: f64,
        /// Lowest accepted value.
        min: f64,
        /// Highest accepted value.
        max: f64,
        /// Temperature unit.
        unit: &'static str,
    },
    /// A solved temperature (dew point, wet bulb) would lie outside the range
    /// of the correlations: the air is too dry (or too hot) for them.
    SolutionOutOfRange {
        /// Which temperature.
        quantity: Quantity,
        /// Lowest temperature of the correlations.
        min: f64,
        /// Highest temperature of the correlations.
        max: f64,
        /// Temperature unit.
        unit: &'static str,
    },
    /// Relative humidity outside 0…1 (0…100 %).
    RelativeHumidityOutOfRange {
        /// The value given, as a fraction.
        value: f64,
    },
    /// Negative humidity ratio.
    NegativeHumidityRatio {
        /// The value given.
        value: f64,
    },
    /// More water vapour than saturated air holds at that dry bulb and pressure.
    AboveSaturation {
        /// The humidity ratio given or computed.
        humidity_ratio: f64,
        /// The saturation humidity ratio at that dry bulb and pressure.
        saturation: f64,
    },
    /// Wet bulb above dry bulb.
    WetBulbAboveDryBulb {
        /// Wet bulb given.
        wet_bulb: f64,
        /// Dry bulb given.
        dry_bulb: f64,
        /// Temperature unit.
        unit: &'static str,
    },
    /// Wet bulb so far below the dry bulb that the air would need a negative
    /// humidity ratio.
    WetBulbTooLow {
        /// Wet bulb given.
        wet_bulb: f64,
        /// Dry bulb given.
        dry_bulb: f64,
        /// Temperature unit.
        unit: &'static str,
    },
    /// Dew point above dry bulb.
    DewPointAboveDryBulb {
        /// Dew point given.
        dew_point: f64,
        /// Dry bulb given.
        dry_bulb: f64,
        /// Temperature unit.
        unit: &'static str,
    },
    /// A pressure that is zero or negative.
    PressureNotPositive {
        /// Which pressure.
        quantity: Quantity,
        /// The value given.
        value: f64,
        /// Pressure unit.
        unit: &'static str,
    },
    /// The saturation pressure of water at this temperature reaches the total
    /// pressure: the water boils, and saturated moist air does not exist.
    AboveBoilingPoint {
        /// The temperature.
        temperature: f64,
        /// Its unit.
        t_unit: &'static str,
        /// The total pressure.
        pressure: f64,
        /// Its unit.
        p_unit: &'static str,
    },
    /// Water-vapour pressure not below the total pressure.
    VapourPressureNotBelowTotal {
        /// The vapour pressure.
        vapour_pressure: f64,
        /// The total pressure.
        pressure: f64,
        /// Pressure unit.
        unit: &'static str,
    },
    /// Elevation outside the range of the standard-atmosphere equation.
    ElevationOutOfRange {
        /// The value given.
        value: f64,
        /// Lowest accepted value.
        min: f64,
        /// Highest accepted value.
        max: f64,
        /// Elevation unit.
        unit: &'static str,
    },
    /// The root finder's bracket held no root.
    NoRootInBracket {
        /// The quantity being solved for.
        quantity: Quantity,
    },
    /// The root finder reached its iteration cap.
    NoConvergence {
        /// The quantity being solved for.
        quantity: Quantity,
    },
    /// The result is too large to represent as a finite number.
    NotRepresentable {
        /// The quantity computed.
        quantity: Quantity,
    },
}

impl fmt::Display for PsychroError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            PsychroError::NotFinite { quantity } => {
                write!(f, "{quantity} is not a finite number")
            }
            PsychroError::TemperatureOutOfRange {
                quantity,
                value,
                min,
                max,
                unit,
            } => write!(
                f,
                "{quantity} {value} {unit} is outside the range of the ASHRAE correlations \
                 ({min} to {max} {unit})"
            ),
            PsychroError::SolutionOutOfRange {
                quantity,
                min,
                max,
                unit,
            } => write!(
                f,
                "the {quantity} of this air lies outside the range of the ASHRAE correlations \
                 ({min} to {max} {unit})"
            ),
            PsychroError::RelativeHumidityOutOfRange { value } => write!(
                f,
                "relative humidity {} % is outside 0 to 100 %",
                value * 100.0
            ),
            PsychroError::NegativeHumidityRatio { value } => {
                write!(f, "humidity ratio {value} is negative")
            }
            PsychroError::AboveSaturation {
                humidity_ratio,
                saturation,
            } => write!(
                f,
                "humidity ratio {humidity_ratio} is above saturation ({saturation}) \
                 at this dry bulb and pressure"
            ),
            PsychroError::WetBulbAboveDryBulb {
                wet_bulb,
                dry_bulb,
                unit,
            } => write!(
                f,
                "wet bulb {wet_bulb} {unit} is above dry bulb {dry_bulb} {unit}"
            ),
            PsychroError::WetBulbTooLow {
                wet_bulb,
                dry_bulb,
                unit,
            } => write!(
                f,
                "wet bulb {wet_bulb} {unit} is too far below dry bulb {dry_bulb} {unit}: \
                 the air would need a negative humidity ratio"
            ),
            PsychroError::DewPointAboveDryBulb {
                dew_point,
                dry_bulb,
                unit,
            } => write!(
                f,
                "dew point {dew_point} {unit} is above dry bulb {dry_bulb} {unit}"
            ),
            PsychroError::PressureNotPositive {
                quantity,
                value,
                unit,
            } => write!(f, "{quantity} {value} {unit} is not positive"),
            PsychroError::AboveBoilingPoint {
                temperature,
                t_unit,
                pressure,
                p_unit,
            } => write!(
                f,
                "water boils at {temperature} {t_unit} and {pressure} {p_unit}: \
                 saturated moist air does not exist there"
            ),
            PsychroError::VapourPressureNotBelowTotal {
                vapour_pressure,
                pressure,
                unit,
            } => write!(
                f,
                "water-vapour pressure {vapour_pressure} {unit} is not below the total \
                 pressure {pressure} {unit}"
            ),
            PsychroError::ElevationOutOfRange {
                value,
                min,
                max,
                unit,
            } => write!(
                f,
                "elevation {value} {unit} is outside the range of the standard-atmosphere \
                 equation ({min} to {max} {unit})"
            ),
            PsychroError::NoRootInBracket { quantity } => {
                write!(
                    f,
                    "no {quantity} solves the equations in the search bracket"
                )
            }
            PsychroError::NoConvergence { quantity } => write!(
                f,
                "the {quantity} solver reached its iteration cap without converging"
            ),
            PsychroError::NotRepresentable { quantity } => {
                write!(f, "the {quantity} is too large to represent")
            }
        }
    }
}

impl std::error::Error for PsychroError {}
