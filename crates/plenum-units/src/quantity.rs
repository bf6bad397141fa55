//! Quantities: a value in SI base units with its dimension, and checked arithmetic.

use std::fmt;
use std::ops::{Add, Div, Mul, Neg, Range, Sub};

use crate::dimension::Dimension;
use crate::system::UnitSystem;
use crate::table::{Kind, TemperatureScale};
use crate::unit::{Unit, UnitError};

/// A value with a dimension. The value is held in SI base units: metres, kilograms, seconds,
/// kelvin (an absolute temperature is kelvin above absolute zero, a difference is kelvin of
/// difference), persons, kilograms of water; a ratio is a plain fraction (`50 %` is `0.5`).
///
/// The value is always finite: every constructor and operation that would make NaN or an
/// infinity returns a [`QuantityError`] instead.
///
/// A quantity also remembers, until the first arithmetic on it, that it was written as a
/// literal with a temperature scale (`3 °F`) — so that a key that takes a difference can read
/// it as one ([`Quantity::as_difference`]) — or with `%rh`
/// ([`Quantity::is_relative_humidity`]). Equality ignores this memory.
#[derive(Clone, Copy, Debug)]
pub struct Quantity {
    value: f64,
    dim: Dimension,
    origin: Origin,
}

/// How a quantity was written, as far as the rules need to know.
#[derive(Clone, Copy, Debug, PartialEq)]
enum Origin {
    Computed,
    /// A literal `reading scale`, e.g. `3 °F`: reading 3.0 on the Fahrenheit scale.
    Scale(TemperatureScale, f64),
    /// A literal in `%rh`.
    RelativeHumidity,
}

/// Why an operation on quantities has no answer.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum QuantityError {
    /// An input value was NaN or infinite.
    NotFinite,
    /// The result would be too large to represent.
    Overflow,
    /// Division by a zero quantity (or a zero base raised to a negative power).
    DivisionByZero,
    /// A dimension power left the representable range (`ft^16` cubed, and so on).
    PowerOutOfRange,
    /// `+` or `-` of two different dimensions.
    Incompatible {
        /// `'+'` or `'-'`.
        op: char,
        /// The left operand's dimension.
        left: Dimension,
        /// The right operand's dimension.
        right: Dimension,
    },
    /// The sum of two absolute temperatures (`75 °F + 75 °F`).
    AbsoluteSum,
    /// A difference minus an absolute temperature.
    DifferenceMinusAbsolute,
    /// An absolute temperature multiplied, divided, raised to a power or negated: the result
    /// would depend on the scale's zero.
    AbsoluteScaled,
    /// A value of one dimension where another was required (conversion into a unit, or
    /// [`Quantity::require`]).
    Mismatch {
        /// The dimension required.
        expected: Dimension,
        /// The dimension found.
        found: Dimension,
    },
    /// [`UnitSystem::preferred_unit`] has no unit for this dimension.
    NoPreferredUnit(Dimension),
}

impl fmt::Display for QuantityError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            QuantityError::NotFinite => f.write_str("the value is not a finite number"),
            QuantityError::Overflow => f.write_str("the result is too large"),
            QuantityError::DivisionByZero => f.write_str("division by zero"),
            QuantityError::PowerOutOfRange => f.write_str("the unit power is out of range"),
            QuantityError::Incompatible { op, left, right } => {
                let verb = if *op == '+' { "add" } else { "subtract" };
                write!(f, "cannot {verb} {left} and {right}")
            }
            QuantityError::AbsoluteSum => f.write_str(
                "cannot add two temperatures; subtract them for a difference, or write the \
                 increment as a difference (`3 K`, `3 Δ°F`)",
            ),
            QuantityError::DifferenceMinusAbsolute => {
                f.write_str("cannot subtract a temperature from a temperature difference")
            }
            QuantityError::AbsoluteScaled => f.write_str(
                "cannot multiply, divide or raise a temperature to a power; use a temperature \
                 difference",
            ),
            QuantityError::Mismatch { expected, found } => {
                write!(f, "expected {expected}, found {found}")
            }
            QuantityError::NoPreferredUnit(d) => write!(f, "no display unit for {d}"),
        }
    }
}

impl std::error::Error for QuantityError {}

/// Why [`Quantity::parse`] could not read a quantity. Spans are byte ranges in the whole text.
#[derive(Clone, Debug, PartialEq)]
pub enum ParseQuantityError {
    /// The text does not start with a number.
    Number {
        /// Where a number was expected.
        span: Range<usize>,
    },
    /// A number without a unit (for the `missing-unit` diagnostic).
    MissingUnit {
        /// The number that was read.
        value: f64,
    },
    /// The unit could not be read.
    Unit(UnitError),
    /// The number does not fit in the unit (`1e306 MBH`).
    Value(QuantityError),
}

impl fmt::Display for ParseQuantityError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            ParseQuantityError::Number { .. } => f.write_str("expected a number"),
            ParseQuantityError::MissingUnit { value } => write!(f, "`{value}` has no unit"),
            ParseQuantityError::Unit(e) => e.fmt(f),
            ParseQuantityError::Value(e) => e.fmt(f),
        }
    }
}

impl std::error::Error for ParseQuantityError {}

/// The length of the number at the start of `text`: `[+-]digits[_digits][.digits][e[+-]digits]`.
fn number_len(text: &str) -> usize {
    let b = text.as_bytes();
    let mut i = 0;
    if matches!(b.first(), Some(b'+' | b'-')) {
        i += 1;
    }
    let digits = |i: &mut usize| {
        let start = *i;
        while *i < b.len() && (b[*i].is_ascii_digit() || (b[*i] == b'_' && *i > start)) {
            *i += 1;
        }
        *i > start
    };
    let mut any = digits(&mut i);
    if i < b.len() && b[i] == b'.' {
        i += 1;
        any |= digits(&mut i);
    }
    if !any {
        return 0;
    }
    if i < b.len() && matches!(b[i], b'e' | b'E') {
        let mut j = i + 1;
        if j < b.len() && matches!(b[j], b'+' | b'-') {
            j += 1;
        }
        if j < b.len() && b[j].is_ascii_digit() && digits(&mut j) {
            i = j;
        }
    }
    i
}

fn finite(value: f64) -> Result<f64, QuantityError> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(QuantityError::Overflow)
    }
}

impl Quantity {
    /// A quantity from a number in a unit: `Quantity::new(57.0, &°F)` is 287.04 K absolute.
    ///
    /// ```
    /// use plenum_units::{Dimension, Quantity, Unit};
    /// let q = Quantity::new(12.5, &Unit::parse("ton")?)?;
    /// assert_eq!(q.dimension(), Dimension::HEAT_FLOW);
    /// assert!((q.in_unit(&Unit::parse("kBtu/h")?)? - 150.0).abs() < 1e-9);
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn new(value: f64, unit: &Unit) -> Result<Quantity, QuantityError> {
        if !value.is_finite() {
            return Err(QuantityError::NotFinite);
        }
        match unit.kind() {
            Kind::Scale(scale) => Ok(Quantity {
                value: finite(scale.to_kelvin(value))?,
                dim: Dimension::TEMPERATURE,
                origin: Origin::Scale(scale, value),
            }),
            Kind::RelativeHumidity => Ok(Quantity {
                value: finite(value * unit.factor())?,
                dim: unit.dimension(),
                origin: Origin::RelativeHumidity,
            }),
            Kind::Plain => Ok(Quantity {
                value: finite(value * unit.factor())?,
                dim: unit.dimension(),
                origin: Origin::Computed,
            }),
        }
    }

    /// Reads a number and its unit, with or without a space between: `1250ft`, `381 m`,
    /// `12.2 psia`, `1_250 ft`, `-4 °F`, `1.2e3 cfm` (for command-line options such as
    /// `--elevation`; the design file's own parser hands over number and unit separately).
    ///
    /// ```
    /// use plenum_units::{Dimension, ParseQuantityError, Quantity};
    /// let z = Quantity::parse("1250ft")?;
    /// assert_eq!(z.dimension(), Dimension::LENGTH);
    /// assert!((z.value() - 381.0).abs() < 1e-9);
    /// assert_eq!(Quantity::parse("1250"), Err(ParseQuantityError::MissingUnit { value: 1250.0 }));
    /// # Ok::<(), ParseQuantityError>(())
    /// ```
    pub fn parse(text: &str) -> Result<Quantity, ParseQuantityError> {
        let start = text.len() - text.trim_start().len();
        let len = number_len(&text[start..]);
        let end = start + len;
        let number: String = text[start..end].chars().filter(|&c| c != '_').collect();
        let value: f64 = match number.parse() {
            Ok(v) if len > 0 => v,
            _ => {
                return Err(ParseQuantityError::Number {
                    span: start
                        ..end.max(start + text[start..].chars().next().map_or(0, char::len_utf8)),
                });
            }
        };
        let rest = &text[end..];
        let unit = match Unit::parse(rest) {
            Ok(u) => u,
            Err(UnitError::Empty) => return Err(ParseQuantityError::MissingUnit { value }),
            Err(e) => return Err(ParseQuantityError::Unit(e.after(&text[..end]))),
        };
        Quantity::new(value, &unit).map_err(ParseQuantityError::Value)
    }

    /// A quantity from a value already in SI base units (kelvin for an absolute temperature).
    pub fn from_si(value: f64, dim: Dimension) -> Result<Quantity, QuantityError> {
        if !value.is_finite() {
            return Err(QuantityError::NotFinite);
        }
        Ok(Quantity {
            value,
            dim,
            origin: Origin::Computed,
        })
    }

    /// A plain number ([`Dimension::RATIO`]).
    pub fn number(value: f64) -> Result<Quantity, QuantityError> {
        Quantity::from_si(value, Dimension::RATIO)
    }

    /// A quantity from a number in the [preferred unit](UnitSystem::preferred_unit) of its
    /// dimension in `system` (`Btu/h`, `cfm`, `°F`, … for IP): the engine's way back in.
    pub fn from_system(
        value: f64,
        dim: Dimension,
        system: UnitSystem,
    ) -> Result<Quantity, QuantityError> {
        let unit = system
            .preferred_unit(dim)
            .ok_or(QuantityError::NoPreferredUnit(dim))?;
        Quantity::new(value, &unit)
    }

    /// The value in SI base units (kelvin for temperatures, a fraction for ratios).
    pub fn value(&self) -> f64 {
        self.value
    }

    /// The dimension.
    pub fn dimension(&self) -> Dimension {
        self.dim
    }

    /// Whether the quantity is a literal written in `%rh`.
    pub fn is_relative_humidity(&self) -> bool {
        self.origin == Origin::RelativeHumidity
    }

    /// The quantity read as a temperature difference, for a key that takes one: a difference is
    /// itself; a *literal* written with a temperature scale (`3 °F`, `3 K`, also through a
    /// `let`) is that many degrees of difference (methods.md §6: a field that takes a difference
    /// reads `3 °F` as a difference); anything else — including a computed absolute temperature
    /// such as `57 °F + 3 K` — is `None`.
    ///
    /// ```
    /// use plenum_units::{Dimension, Quantity, Unit};
    /// let lit = Quantity::new(18.0, &Unit::parse("°F")?)?;
    /// let dt = lit.as_difference().map(|d| d.value());
    /// assert!(dt.is_some_and(|k| (k - 10.0).abs() < 1e-12)); // 18 °F of difference = 10 K
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn as_difference(&self) -> Option<Quantity> {
        if self.dim == Dimension::TEMPERATURE_DIFFERENCE {
            return Some(*self);
        }
        match self.origin {
            Origin::Scale(scale, reading) => Some(Quantity {
                value: reading * scale.degree(),
                dim: Dimension::TEMPERATURE_DIFFERENCE,
                origin: Origin::Computed,
            }),
            _ => None,
        }
    }

    /// The quantity if it has the `expected` dimension — reading a temperature literal as a
    /// difference where a difference is expected ([`Quantity::as_difference`]) — else
    /// [`QuantityError::Mismatch`]. This is the check behind the `unit-mismatch` diagnostic.
    ///
    /// ```
    /// use plenum_units::{Dimension, Quantity, QuantityError, Unit};
    /// let q = Quantity::new(4_200.0, &Unit::parse("cfm")?)?;
    /// assert_eq!(
    ///     q.require(Dimension::HEAT_FLOW),
    ///     Err(QuantityError::Mismatch { expected: Dimension::HEAT_FLOW, found: Dimension::AIRFLOW })
    /// );
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn require(&self, expected: Dimension) -> Result<Quantity, QuantityError> {
        if self.dim == expected {
            return Ok(*self);
        }
        if expected == Dimension::TEMPERATURE_DIFFERENCE
            && let Some(d) = self.as_difference()
        {
            return Ok(d);
        }
        Err(QuantityError::Mismatch {
            expected,
            found: self.dim,
        })
    }

    /// The number of `unit`s in this quantity. The dimensions must agree, except that a
    /// temperature difference may be given in a temperature scale's degrees (`°F`, `K`).
    ///
    /// ```
    /// use plenum_units::{Quantity, Unit};
    /// let t = Quantity::new(57.0, &Unit::parse("°F")?)?;
    /// assert!((t.in_unit(&Unit::parse("°C")?)? - 13.888_888_888_9).abs() < 1e-9);
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn in_unit(&self, unit: &Unit) -> Result<f64, QuantityError> {
        if let Some(scale) = unit.temperature_scale() {
            return match self.dim {
                d if d == Dimension::TEMPERATURE => finite(scale.from_kelvin(self.value)),
                d if d == Dimension::TEMPERATURE_DIFFERENCE => finite(self.value / scale.degree()),
                found => Err(QuantityError::Mismatch {
                    expected: Dimension::TEMPERATURE,
                    found,
                }),
            };
        }
        if unit.dimension() != self.dim {
            return Err(QuantityError::Mismatch {
                expected: unit.dimension(),
                found: self.dim,
            });
        }
        finite(self.value / unit.factor())
    }

    /// The number in the [preferred unit](UnitSystem::preferred_unit) of the dimension in
    /// `system`: Btu/h, cfm, °F, lb/lb… for IP. A ratio is a fraction in both systems.
    ///
    /// ```
    /// use plenum_units::{Quantity, Unit, UnitSystem};
    /// let q = Quantity::new(38.5, &Unit::parse("kBtu/h")?)?;
    /// assert!((q.in_system(UnitSystem::Ip)? - 38_500.0).abs() < 1e-9);
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn in_system(&self, system: UnitSystem) -> Result<f64, QuantityError> {
        let unit = system
            .preferred_unit(self.dim)
            .ok_or(QuantityError::NoPreferredUnit(self.dim))?;
        self.in_unit(&unit)
    }

    /// Raises the quantity to an integer power (`(20 ft)^2`). An absolute temperature only to
    /// the power 1; a kelvin literal is a difference here.
    pub fn powi(self, n: i32) -> Result<Quantity, QuantityError> {
        if n != 1 {
            return self.kelvin_as_difference().powi_resolved(n);
        }
        self.powi_resolved(n)
    }

    fn powi_resolved(self, n: i32) -> Result<Quantity, QuantityError> {
        if self.dim.is_absolute_temperature() {
            return if n == 1 {
                Ok(self.computed())
            } else {
                Err(QuantityError::AbsoluteScaled)
            };
        }
        if self.value == 0.0 && n < 0 {
            return Err(QuantityError::DivisionByZero);
        }
        let dim = self
            .dim
            .checked_pow(n)
            .ok_or(QuantityError::PowerOutOfRange)?;
        Ok(Quantity {
            value: finite(self.value.powi(n))?,
            dim,
            origin: Origin::Computed,
        })
    }

    fn computed(self) -> Quantity {
        Quantity {
            origin: Origin::Computed,
            ..self
        }
    }

    fn with(value: f64, dim: Dimension) -> Result<Quantity, QuantityError> {
        Ok(Quantity {
            value: finite(value)?,
            dim,
            origin: Origin::Computed,
        })
    }

    /// A kelvin literal (`3 K`) as a difference: in arithmetic, kelvin is the SI unit of
    /// temperature difference. Anything else unchanged.
    fn kelvin_as_difference(self) -> Quantity {
        match self.origin {
            Origin::Scale(TemperatureScale::Kelvin, reading) => Quantity {
                value: reading,
                dim: DIFF,
                origin: Origin::Computed,
            },
            _ => self,
        }
    }
}

impl PartialEq for Quantity {
    /// Equal values and dimensions; how the quantity was written does not matter.
    fn eq(&self, other: &Self) -> bool {
        self.value == other.value && self.dim == other.dim
    }
}

const ABS: Dimension = Dimension::TEMPERATURE;
const DIFF: Dimension = Dimension::TEMPERATURE_DIFFERENCE;

impl Add for Quantity {
    type Output = Result<Quantity, QuantityError>;

    /// Sum of equal dimensions. Temperatures: temperature + difference = temperature (either
    /// order); difference + difference = difference; temperature + temperature is
    /// [`QuantityError::AbsoluteSum`]. A kelvin literal is a difference here (`14 °C + 3 K` is
    /// 17 °C, `3 K + 2 K` is 5 K of difference).
    fn add(self, rhs: Quantity) -> Self::Output {
        let (a, b) = (self.kelvin_as_difference(), rhs.kelvin_as_difference());
        let sum = a.value + b.value;
        match (a.dim, b.dim) {
            (ABS, ABS) => Err(QuantityError::AbsoluteSum),
            (ABS, DIFF) | (DIFF, ABS) => Quantity::with(sum, ABS),
            (x, y) if x == y => Quantity::with(sum, x),
            (left, right) => Err(QuantityError::Incompatible {
                op: '+',
                left,
                right,
            }),
        }
    }
}

impl Sub for Quantity {
    type Output = Result<Quantity, QuantityError>;

    /// Difference of equal dimensions. Temperatures: temperature − temperature = difference;
    /// temperature − difference = temperature; difference − difference = difference;
    /// difference − temperature is [`QuantityError::DifferenceMinusAbsolute`]. A kelvin literal
    /// is a difference here (`20 °C - 3 K` is 17 °C), except on the left of a temperature of
    /// another scale, where only the absolute reading makes sense (`300 K - 14 °C` is 12.85 K
    /// of difference).
    fn sub(self, rhs: Quantity) -> Self::Output {
        let b = rhs.kelvin_as_difference();
        let a = if b.dim == ABS {
            self
        } else {
            self.kelvin_as_difference()
        };
        let diff = a.value - b.value;
        match (a.dim, b.dim) {
            (ABS, ABS) => Quantity::with(diff, DIFF),
            (ABS, DIFF) => Quantity::with(diff, ABS),
            (DIFF, ABS) => Err(QuantityError::DifferenceMinusAbsolute),
            (x, y) if x == y => Quantity::with(diff, x),
            (left, right) => Err(QuantityError::Incompatible {
                op: '-',
                left,
                right,
            }),
        }
    }
}

impl Mul for Quantity {
    type Output = Result<Quantity, QuantityError>;

    /// Product; dimensions multiply. An absolute temperature is refused, even times a plain
    /// number (2 × 20 °C is not 2 × 68 °F); a kelvin literal is a difference here.
    fn mul(self, rhs: Quantity) -> Self::Output {
        let (a, b) = (self.kelvin_as_difference(), rhs.kelvin_as_difference());
        Quantity::mul_resolved(a, b)
    }
}

impl Quantity {
    fn mul_resolved(self, rhs: Quantity) -> Result<Quantity, QuantityError> {
        if self.dim.is_absolute_temperature() || rhs.dim.is_absolute_temperature() {
            return Err(QuantityError::AbsoluteScaled);
        }
        let dim = self
            .dim
            .checked_mul(rhs.dim)
            .ok_or(QuantityError::PowerOutOfRange)?;
        Quantity::with(self.value * rhs.value, dim)
    }
}

impl Div for Quantity {
    type Output = Result<Quantity, QuantityError>;

    /// Quotient; dimensions divide. Division by zero and absolute temperatures are refused; a
    /// kelvin literal is a difference here.
    fn div(self, rhs: Quantity) -> Self::Output {
        let (a, b) = (self.kelvin_as_difference(), rhs.kelvin_as_difference());
        Quantity::div_resolved(a, b)
    }
}

impl Quantity {
    fn div_resolved(self, rhs: Quantity) -> Result<Quantity, QuantityError> {
        if self.dim.is_absolute_temperature() || rhs.dim.is_absolute_temperature() {
            return Err(QuantityError::AbsoluteScaled);
        }
        if rhs.value == 0.0 {
            return Err(QuantityError::DivisionByZero);
        }
        let dim = self
            .dim
            .checked_div(rhs.dim)
            .ok_or(QuantityError::PowerOutOfRange)?;
        Quantity::with(self.value / rhs.value, dim)
    }
}

impl Neg for Quantity {
    type Output = Result<Quantity, QuantityError>;

    /// Negation; refused for an absolute temperature (write `-4 °F` as a negative literal); a
    /// kelvin literal is a difference here.
    fn neg(self) -> Self::Output {
        let this = self.kelvin_as_difference();
        if this.dim.is_absolute_temperature() {
            return Err(QuantityError::AbsoluteScaled);
        }
        Quantity::with(-this.value, this.dim)
    }
}
