//! Quantities and units for Plenum: every value carries a dimension.
//!
//! * [`Dimension`] — integer exponents over length, mass, time, temperature difference,
//!   person and moisture mass, with absolute temperature kept apart from temperature difference.
//!   [`Dimension::name`] gives the word a diagnostic uses ("heat flow", "airflow").
//! * [`Unit`] — a parsed unit expression (`kBtu/h`, `L/s/person`, `Btu/(h·ft²)`, `°F`), built
//!   from the table in [`catalog`] with factors from NIST SP 811 (2008) appendix B.
//!   [`Unit::suggest`] offers the unit that fixes a mismatch.
//! * [`Quantity`] — a finite value in SI base units with its dimension; `+ - * /` return
//!   `Result` and enforce the temperature rules.
//! * [`Measure`] and [`format_auto`] — display in [`UnitSystem::Ip`] or [`UnitSystem::Si`] with
//!   the trade's precision.
//!
//! # Reading a value from a design file
//!
//! The syntax crate hands over the number and the unit's text; the model checks the key's
//! expected dimension:
//!
//! ```
//! use plenum_units::{Dimension, Quantity, QuantityError, Unit};
//!
//! let unit = Unit::parse("kBtu/h")?;
//! let sensible = Quantity::new(38.5, &unit)?.require(Dimension::HEAT_FLOW)?;
//! assert!((sensible.value() - 11_283.2).abs() < 0.1); // watts
//!
//! // `sensible 4_200 cfm`: the wrong dimension, and no single edit of `cfm` fixes it.
//! let cfm = Unit::parse("cfm")?;
//! let wrong = Quantity::new(4_200.0, &cfm)?.require(Dimension::HEAT_FLOW);
//! assert!(matches!(wrong, Err(QuantityError::Mismatch { .. })));
//! assert_eq!(cfm.suggest(Dimension::HEAT_FLOW), None);
//!
//! // `area 2_400 ft`: `ft²` fixes it.
//! let fix = Unit::parse("ft")?.suggest(Dimension::AREA).map(|u| u.to_string());
//! assert_eq!(fix.as_deref(), Some("ft²"));
//! # Ok::<(), Box<dyn std::error::Error>>(())
//! ```
//!
//! # Temperatures
//!
//! A temperature and a temperature difference are different dimensions. `°F − °F` is a
//! difference, `°F + °F` is an error, `°C + K` is a temperature (in arithmetic a kelvin literal
//! is a difference: kelvin is the SI unit of temperature difference), and a key that takes a
//! difference reads a temperature literal as one ([`Quantity::as_difference`], done by
//! [`Quantity::require`]):
//!
//! ```
//! use plenum_units::{Dimension, Quantity, QuantityError, Unit};
//! let f = Unit::parse("°F")?;
//! let t = |v| Quantity::new(v, &f);
//!
//! let dt = (t(75.0)? - t(57.0)?)?;
//! assert_eq!(dt.dimension(), Dimension::TEMPERATURE_DIFFERENCE);
//! assert!((dt.in_unit(&f)? - 18.0).abs() < 1e-9);
//!
//! assert_eq!(t(75.0)? + t(75.0)?, Err(QuantityError::AbsoluteSum));
//!
//! let c = Quantity::new(14.0, &Unit::parse("°C")?)?;
//! let k = Quantity::new(3.0, &Unit::parse("K")?)?;
//! let warmer = (c + k)?;
//! assert_eq!(warmer.dimension(), Dimension::TEMPERATURE);
//! assert!((warmer.in_unit(&Unit::parse("°C")?)? - 17.0).abs() < 1e-9);
//!
//! // `supply_dt 18 °F`: the literal is read as a difference.
//! let supply_dt = t(18.0)?.require(Dimension::TEMPERATURE_DIFFERENCE)?;
//! assert!((supply_dt.value() - 10.0).abs() < 1e-12); // kelvin
//! # Ok::<(), Box<dyn std::error::Error>>(())
//! ```
//!
//! # Engine numbers and display
//!
//! The engine works in IP numbers ([`Quantity::in_system`], [`Quantity::from_system`]); the
//! report and the hover render through a [`Measure`]:
//!
//! ```
//! use plenum_units::{Dimension, Measure, Quantity, UnitSystem};
//! let supply = Quantity::from_system(4_832.4, Dimension::AIRFLOW, UnitSystem::Ip)?;
//! assert_eq!(Measure::Airflow.format(&supply, UnitSystem::Ip), "4,830 cfm");
//! assert_eq!(Measure::Airflow.format(&supply, UnitSystem::Si), "2,281 L/s");
//! assert_eq!(Measure::Airflow.label(UnitSystem::Si), "L/s");
//! # Ok::<(), Box<dyn std::error::Error>>(())
//! ```

//! # Decisions
//!
//! * **Shared dimensions.** Heat flow and power are one dimension ("heat flow"); airflow and
//!   water flow are one volume-flow dimension, named "airflow" because every volume flow a
//!   design file enters is air (the engine's water flow is an output, shown through
//!   [`Measure::WaterFlow`]); velocity and ventilation rate per area are one dimension (1 cfm/ft²
//!   is exactly 1 fpm), named "ventilation rate per area or velocity". The `Dimension`
//!   constants `POWER`, `WATER_FLOW`, `VOLUME_FLOW` and `AIRFLOW_PER_AREA` are aliases.
//! * **Humidity ratio is not a ratio.** Water mass is its own base dimension, so `0.0098
//!   lb/lb` never passes for `50 %`. `lb/lb`, `kg/kg`, `gr/lb` and `g/kg` are single symbols
//!   (and `lb/lb` is not `lb` over `lb`).
//! * **Temperature scales.** A lone `°F`, `°C`, `K` or `°R` (also `degF`, `degC`, `degR`) is an
//!   absolute temperature. Inside a compound it is one degree, a difference: `°F/h` is a rate,
//!   `Btu/(lb·°F)` a specific heat — both accepted. A bare `R`, `F` or `C` is not a temperature
//!   (`F` gets `°F` as its nearest unit). `Δ°F` and `Δ°C` write a difference explicitly.
//! * **Kelvin literals.** In arithmetic a kelvin literal is a difference (`14 °C + 3 K` is
//!   17 °C, `1.08 * 18 K` is fine), except on the left of another scale's temperature
//!   (`300 K - 14 °C` is 12.85 K of difference). A `°F` or `°C` literal is never silently a
//!   difference inside an expression: `75 °F + 3 °F` is an error; write `3 Δ°F`. Only a key
//!   that takes a difference reads a whole-value temperature literal as one (`supply_dt 18 °F`).
//! * **Absolute temperatures do not scale.** Multiplying, dividing, raising to a power (other
//!   than 1) or negating one is an error, even by a plain number: the result would depend on
//!   the scale's zero.
//! * **`%rh`** is a ratio like `%`; the literal remembers it was written `%rh`
//!   ([`Quantity::is_relative_humidity`], [`Unit::is_relative_humidity`]) so an air state can
//!   tell relative humidity from another percentage.
//! * **Ambiguous products.** `L/s/person` reads left to right as `L/(s·person)`, but a product
//!   after a division (`Btu/h·ft²`) is an error whose suggestion adds the parentheses
//!   (`Btu/(h·ft²)`), rather than a silent guess (NIST SP 811 §6.1.6 asks for parentheses).
//! * **Letter case matters** (`mm` is not `Mm`); a few trade spellings are aliases (`CFM`,
//!   `GPM`, `FPM`, `BTU`, `Btuh`, `hr`, `lbs`, `tons`), and an unknown symbol that differs only
//!   in case gets the right one as its suggestion.
//! * **No runtime dependencies.** Errors implement [`std::error::Error`] by hand.

mod dimension;
mod display;
mod quantity;
mod system;
mod table;
mod unit;

pub use dimension::{Base, Dimension};
pub use display::{Measure, format_auto};
pub use quantity::{ParseQuantityError, Quantity, QuantityError};
pub use system::{UnitSystem, UnknownUnitSystem};
pub use table::{TemperatureScale, UnitDef, catalog};
pub use unit::{Unit, UnitError};
