//! Units: parsed unit expressions, their labels, and the "unit that fixes it" suggestion.

use std::fmt;
use std::ops::Range;
use std::str::FromStr;

use crate::dimension::{Dimension, superscript};
use crate::system::UnitSystem;
use crate::table::{self, Kind, TemperatureScale, UnitDef};

/// A unit: a product of table symbols with integer powers (`kBtu/h`, `L/s/person`, `ft²`,
/// `°F`), with its factor to SI and its dimension.
///
/// A unit that is a single temperature-scale symbol (`°F`, `°C`, `K`, `°R`) is an *absolute*
/// temperature scale: [`Quantity::new`](crate::Quantity::new) applies its offset. Inside a
/// compound (`Btu/(lb·°F)`, `°F/h`, `K^2`) a scale symbol means one degree, a difference, so
/// `°F/h` is a rate of temperature change and is accepted.
#[derive(Clone, Debug)]
pub struct Unit {
    terms: Vec<(&'static UnitDef, i32)>,
    factor: f64,
    dim: Dimension,
    kind: Kind,
    label: Option<&'static str>,
}

/// Deepest parenthesis nesting [`Unit::parse`] accepts.
const MAX_DEPTH: usize = 16;
/// Largest power magnitude [`Unit::parse`] accepts in one exponent (`ft^16`).
const MAX_POWER: i32 = 16;

/// Why a unit expression could not be read. Spans are byte ranges in the text given to
/// [`Unit::parse`].
#[derive(Clone, Debug, PartialEq)]
pub enum UnitError {
    /// The text was empty (or only whitespace).
    Empty,
    /// A symbol not in the unit table (for the `unknown-unit` diagnostic).
    UnknownSymbol {
        /// The symbol as written.
        symbol: String,
        /// Where it is in the text.
        span: Range<usize>,
        /// The nearest known symbol by edit distance, when one is close.
        nearest: Option<&'static str>,
        /// The whole text with the symbol replaced by `nearest`.
        corrected: Option<String>,
    },
    /// The expression is not a unit expression (`kW/`, `(ft`, `ft^`, `2ft`).
    Malformed {
        /// Where the problem was found.
        span: Range<usize>,
        /// What was expected, in words.
        reason: &'static str,
    },
    /// A product after a division (`Btu/h·ft²`), which readers take either way.
    Ambiguous {
        /// The product that follows the division.
        span: Range<usize>,
        /// The text with parentheses that make it `Btu/(h·ft²)`.
        suggestion: String,
    },
    /// A power too large or too small to represent (`ft^99`, `(mm^16)^16`).
    OutOfRange {
        /// The offending part.
        span: Range<usize>,
    },
}

impl UnitError {
    /// The byte range the error points at, when it points somewhere.
    pub fn span(&self) -> Option<Range<usize>> {
        match self {
            UnitError::Empty => None,
            UnitError::UnknownSymbol { span, .. }
            | UnitError::Malformed { span, .. }
            | UnitError::Ambiguous { span, .. }
            | UnitError::OutOfRange { span } => Some(span.clone()),
        }
    }

    /// The same error for a unit text that stood after `prefix` in a longer text: spans move
    /// by `prefix.len()` and corrected texts gain the prefix.
    pub(crate) fn after(self, prefix: &str) -> UnitError {
        let shift = |r: Range<usize>| r.start + prefix.len()..r.end + prefix.len();
        match self {
            UnitError::Empty => UnitError::Empty,
            UnitError::UnknownSymbol {
                symbol,
                span,
                nearest,
                corrected,
            } => UnitError::UnknownSymbol {
                symbol,
                span: shift(span),
                nearest,
                corrected: corrected.map(|c| format!("{prefix}{c}")),
            },
            UnitError::Malformed { span, reason } => UnitError::Malformed {
                span: shift(span),
                reason,
            },
            UnitError::Ambiguous { span, suggestion } => UnitError::Ambiguous {
                span: shift(span),
                suggestion: format!("{prefix}{suggestion}"),
            },
            UnitError::OutOfRange { span } => UnitError::OutOfRange { span: shift(span) },
        }
    }
}

impl fmt::Display for UnitError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            UnitError::Empty => f.write_str("missing unit"),
            UnitError::UnknownSymbol {
                symbol, nearest, ..
            } => {
                write!(f, "unknown unit `{symbol}`")?;
                if let Some(n) = nearest {
                    write!(f, "; did you mean `{n}`?")?;
                }
                Ok(())
            }
            UnitError::Malformed { reason, .. } => write!(f, "malformed unit: {reason}"),
            UnitError::Ambiguous { suggestion, .. } => write!(
                f,
                "ambiguous unit: a product after `/`; write `{suggestion}` if that is meant"
            ),
            UnitError::OutOfRange { .. } => f.write_str("unit power out of range"),
        }
    }
}

impl std::error::Error for UnitError {}

#[derive(Clone, Copy, Debug)]
enum Tok {
    Atom(&'static UnitDef),
    One,
    Mul,
    Div,
    Open,
    Close,
    Pow(i32),
}

#[derive(Clone, Debug)]
struct Token {
    tok: Tok,
    span: Range<usize>,
}

fn is_operator(c: char) -> bool {
    matches!(c, '/' | '*' | '·' | '⋅' | '×' | '^' | '(' | ')')
}

fn superscript_digit(c: char) -> Option<u32> {
    match c {
        '⁰' => Some(0),
        '¹' => Some(1),
        '²' => Some(2),
        '³' => Some(3),
        '⁴' => Some(4),
        '⁵' => Some(5),
        '⁶' => Some(6),
        '⁷' => Some(7),
        '⁸' => Some(8),
        '⁹' => Some(9),
        _ => None,
    }
}

fn is_atom_char(c: char) -> bool {
    !(c.is_whitespace()
        || is_operator(c)
        || c.is_ascii_digit()
        || c == '⁻'
        || superscript_digit(c).is_some())
}

/// Reads a run of digits (ASCII or superscript, chosen by `digit`) as a power.
fn read_power(
    text: &str,
    start: usize,
    digit: fn(char) -> Option<u32>,
) -> Result<(i32, usize), UnitError> {
    let mut value: i64 = 0;
    let mut end = start;
    for (i, c) in text[start..].char_indices() {
        match digit(c) {
            Some(d) => {
                value = (value * 10 + i64::from(d)).min(1_000);
                end = start + i + c.len_utf8();
            }
            None => break,
        }
    }
    if end == start {
        return Err(UnitError::Malformed {
            span: start..start,
            reason: "expected a power after `^`",
        });
    }
    // `value` is capped at 1000 above, so the conversion cannot fail.
    Ok((i32::try_from(value).unwrap_or(i32::MAX), end))
}

fn lex(text: &str) -> Result<Vec<Token>, UnitError> {
    let mut tokens: Vec<Token> = Vec::new();
    let mut i = 0;
    while let Some(c) = text[i..].chars().next() {
        let start = i;
        let after_factor = matches!(
            tokens.last().map(|t| t.tok),
            Some(Tok::Atom(_) | Tok::Close | Tok::One)
        );
        if c.is_whitespace() {
            i += c.len_utf8();
            continue;
        }
        let single = match c {
            '/' => Some(Tok::Div),
            '*' | '·' | '⋅' | '×' => Some(Tok::Mul),
            '(' => Some(Tok::Open),
            ')' => Some(Tok::Close),
            _ => None,
        };
        if let Some(tok) = single {
            i += c.len_utf8();
            tokens.push(Token {
                tok,
                span: start..i,
            });
            continue;
        }
        if c == '^' {
            let mut j = i + 1;
            let mut sign = 1;
            if let Some(s) = text[j..].chars().next()
                && matches!(s, '-' | '−' | '⁻')
            {
                sign = -1;
                j += s.len_utf8();
            }
            let (n, end) = read_power(text, j, |c| c.to_digit(10))?;
            i = end;
            tokens.push(Token {
                tok: Tok::Pow(sign * n),
                span: start..i,
            });
            continue;
        }
        if c == '⁻' || superscript_digit(c).is_some() {
            let (sign, j) = if c == '⁻' {
                (-1, i + c.len_utf8())
            } else {
                (1, i)
            };
            let (n, end) = read_power(text, j, superscript_digit)?;
            i = end;
            tokens.push(Token {
                tok: Tok::Pow(sign * n),
                span: start..i,
            });
            continue;
        }
        if c.is_ascii_digit() {
            let (n, end) = read_power(text, i, |c| c.to_digit(10))?;
            i = end;
            let tok = if after_factor {
                Tok::Pow(n)
            } else if n == 1 {
                Tok::One
            } else {
                return Err(UnitError::Malformed {
                    span: start..i,
                    reason: "a number cannot stand in a unit (only `1`, as in `1/h`)",
                });
            };
            tokens.push(Token {
                tok,
                span: start..i,
            });
            continue;
        }
        // A symbol. Humidity ratios such as `gr/lb` are single symbols, except after `/`.
        let rest = &text[i..];
        let after_div = matches!(tokens.last().map(|t| t.tok), Some(Tok::Div));
        let slash = if after_div {
            None
        } else {
            table::slash_atoms().find(|(s, _)| {
                rest.starts_with(s) && !rest[s.len()..].chars().next().is_some_and(is_atom_char)
            })
        };
        if let Some((s, def)) = slash {
            i += s.len();
            tokens.push(Token {
                tok: Tok::Atom(def),
                span: start..i,
            });
            continue;
        }
        let len: usize = rest
            .chars()
            .take_while(|&c| is_atom_char(c))
            .map(char::len_utf8)
            .sum();
        i += len;
        let symbol = &text[start..i];
        match table::lookup(symbol) {
            Some(def) => tokens.push(Token {
                tok: Tok::Atom(def),
                span: start..i,
            }),
            None => {
                let nearest = nearest_symbol(symbol);
                let corrected = nearest.map(|n| format!("{}{}{}", &text[..start], n, &text[i..]));
                return Err(UnitError::UnknownSymbol {
                    symbol: symbol.to_string(),
                    span: start..i,
                    nearest,
                    corrected,
                });
            }
        }
    }
    Ok(tokens)
}

/// A partly evaluated expression: its symbols with powers, in written order.
#[derive(Default)]
struct Part {
    terms: Vec<(&'static UnitDef, i32)>,
    atoms: usize,
}

struct Parser<'a> {
    text: &'a str,
    tokens: Vec<Token>,
    pos: usize,
}

impl Parser<'_> {
    fn peek(&self) -> Option<&Token> {
        self.tokens.get(self.pos)
    }

    fn here(&self) -> Range<usize> {
        match self.peek() {
            Some(t) => t.span.clone(),
            None => self.text.len()..self.text.len(),
        }
    }

    fn expr(&mut self, depth: usize) -> Result<Part, UnitError> {
        let mut acc = self.term(depth)?;
        // Start of the operand after the latest `/` at this level.
        let mut after_div: Option<usize> = None;
        while let Some(tok) = self.peek().cloned() {
            match tok.tok {
                Tok::Mul => {
                    if let Some(start) = after_div {
                        return Err(self.ambiguous(start, tok.span));
                    }
                    self.pos += 1;
                    let rhs = self.term(depth)?;
                    acc.terms.extend(rhs.terms);
                    acc.atoms += rhs.atoms;
                }
                Tok::Div => {
                    self.pos += 1;
                    after_div = Some(self.here().start);
                    let rhs = self.term(depth)?;
                    acc.terms
                        .extend(rhs.terms.into_iter().map(|(d, e)| (d, -e)));
                    acc.atoms += rhs.atoms;
                }
                _ => break,
            }
        }
        Ok(acc)
    }

    fn ambiguous(&self, start: usize, mul: Range<usize>) -> UnitError {
        // The operand of `/` runs to the end of this nesting level.
        let mut depth = 0usize;
        let mut end = self.text.len();
        for t in &self.tokens[self.pos..] {
            match t.tok {
                Tok::Open => depth += 1,
                Tok::Close if depth == 0 => {
                    end = t.span.start;
                    break;
                }
                Tok::Close => depth -= 1,
                _ => {}
            }
        }
        let suggestion = format!(
            "{}({}){}",
            &self.text[..start],
            &self.text[start..end],
            &self.text[end..]
        );
        UnitError::Ambiguous {
            span: mul.start..end,
            suggestion,
        }
    }

    fn term(&mut self, depth: usize) -> Result<Part, UnitError> {
        let mut part = self.primary(depth)?;
        if let Some(Token {
            tok: Tok::Pow(n),
            span,
        }) = self.peek().cloned()
        {
            self.pos += 1;
            if n == 0 || n.abs() > MAX_POWER {
                return Err(if n == 0 {
                    UnitError::Malformed {
                        span,
                        reason: "a power of zero",
                    }
                } else {
                    UnitError::OutOfRange { span }
                });
            }
            for (_, e) in &mut part.terms {
                *e = e
                    .checked_mul(n)
                    .ok_or(UnitError::OutOfRange { span: span.clone() })?;
            }
            if let Some(Token {
                tok: Tok::Pow(_),
                span,
            }) = self.peek().cloned()
            {
                return Err(UnitError::Malformed {
                    span,
                    reason: "two powers in a row; use parentheses",
                });
            }
        }
        Ok(part)
    }

    fn primary(&mut self, depth: usize) -> Result<Part, UnitError> {
        let Some(tok) = self.peek().cloned() else {
            return Err(UnitError::Malformed {
                span: self.here(),
                reason: "expected a unit symbol at the end",
            });
        };
        match tok.tok {
            Tok::Atom(def) => {
                self.pos += 1;
                Ok(Part {
                    terms: vec![(def, 1)],
                    atoms: 1,
                })
            }
            Tok::One => {
                self.pos += 1;
                Ok(Part::default())
            }
            Tok::Open => {
                if depth >= MAX_DEPTH {
                    return Err(UnitError::Malformed {
                        span: tok.span,
                        reason: "parentheses nested too deeply",
                    });
                }
                self.pos += 1;
                let inner = self.expr(depth + 1)?;
                match self.peek() {
                    Some(Token {
                        tok: Tok::Close, ..
                    }) => {
                        self.pos += 1;
                        Ok(inner)
                    }
                    _ => Err(UnitError::Malformed {
                        span: tok.span.start..self.here().end,
                        reason: "`(` without its `)`",
                    }),
                }
            }
            Tok::Close | Tok::Mul | Tok::Div | Tok::Pow(_) => Err(UnitError::Malformed {
                span: tok.span,
                reason: "expected a unit symbol",
            }),
        }
    }
}

impl Unit {
    /// Reads a unit expression: table symbols combined with `/`, `*`, `·`, powers (`^2`, `^-1`,
    /// `²`, `³`, `⁻¹`, or digits right after a symbol: `ft2`, `m3`) and parentheses.
    ///
    /// Division chains read left to right (`L/s/person` is `L/(s·person)`); a product after a
    /// division (`Btu/h·ft²`) is refused as ambiguous, with the parenthesised form as its
    /// suggestion. Humidity ratios (`lb/lb`, `gr/lb`, `kg/kg`, `g/kg`) are single symbols.
    /// Whitespace between tokens is skipped; spans in errors are byte ranges in `text`.
    ///
    /// ```
    /// use plenum_units::{Dimension, Unit, UnitError};
    /// assert_eq!(Unit::parse("kBtu/h")?.dimension(), Dimension::HEAT_FLOW);
    /// assert_eq!(Unit::parse("Btu/(h·ft²)")?.dimension(), Dimension::POWER_PER_AREA);
    /// assert_eq!(Unit::parse("L/s/person")?.dimension(), Dimension::AIRFLOW_PER_PERSON);
    /// assert_eq!(Unit::parse("ft2")?.to_string(), "ft²");
    /// match Unit::parse("kbtu/h") {
    ///     Err(UnitError::UnknownSymbol { nearest, corrected, .. }) => {
    ///         assert_eq!(nearest, Some("kBtu"));
    ///         assert_eq!(corrected.as_deref(), Some("kBtu/h"));
    ///     }
    ///     other => panic!("{other:?}"),
    /// }
    /// # Ok::<(), UnitError>(())
    /// ```
    pub fn parse(text: &str) -> Result<Unit, UnitError> {
        let tokens = lex(text)?;
        if tokens.is_empty() {
            return Err(UnitError::Empty);
        }
        let mut parser = Parser {
            text,
            tokens,
            pos: 0,
        };
        let part = parser.expr(0)?;
        if let Some(t) = parser.peek() {
            return Err(UnitError::Malformed {
                span: t.span.clone(),
                reason: match t.tok {
                    Tok::Close => "`)` without its `(`",
                    _ => "expected `/`, `*` or `·` between units",
                },
            });
        }
        let single = part.atoms == 1;
        Unit::from_terms(part.terms, single, None).ok_or(UnitError::OutOfRange {
            span: 0..text.len(),
        })
    }

    /// Builds a unit from symbols with powers; `single` says the expression was one symbol.
    fn from_terms(
        written: Vec<(&'static UnitDef, i32)>,
        single: bool,
        label: Option<&'static str>,
    ) -> Option<Unit> {
        let mut terms: Vec<(&'static UnitDef, i32)> = Vec::with_capacity(written.len());
        for (def, e) in written {
            match terms.iter_mut().find(|(d, _)| std::ptr::eq(*d, def)) {
                Some((_, acc)) => *acc = acc.checked_add(e)?,
                None => terms.push((def, e)),
            }
        }
        terms.retain(|(_, e)| *e != 0);
        let mut factor = 1.0f64;
        let mut dim = Dimension::RATIO;
        for (def, e) in &terms {
            factor *= def.factor.powi(*e);
            dim = dim.checked_mul(def.dim.checked_pow(*e)?)?;
        }
        if !(factor.is_finite() && factor > 0.0) {
            return None;
        }
        let kind = match terms.as_slice() {
            [(def, 1)] if single => def.kind,
            _ => Kind::Plain,
        };
        if let Kind::Scale(_) = kind {
            dim = Dimension::TEMPERATURE;
        }
        Some(Unit {
            terms,
            factor,
            dim,
            kind,
            label,
        })
    }

    /// A unit from a table built into the crate; its dimension is given (and tested).
    pub(crate) fn known(
        terms: &'static [(&'static UnitDef, i32)],
        dim: Dimension,
        label: Option<&'static str>,
    ) -> Unit {
        let factor = terms.iter().map(|(d, e)| d.factor.powi(*e)).product();
        let kind = match terms {
            [(def, 1)] => def.kind,
            _ => Kind::Plain,
        };
        Unit {
            terms: terms.to_vec(),
            factor,
            dim,
            kind,
            label,
        }
    }

    /// The unit of a plain number (`0.95`): no symbol, factor 1. It prints as `1`.
    pub fn one() -> Unit {
        Unit {
            terms: Vec::new(),
            factor: 1.0,
            dim: Dimension::RATIO,
            kind: Kind::Plain,
            label: None,
        }
    }

    /// The dimension; [`Dimension::TEMPERATURE`] for a lone temperature scale.
    pub fn dimension(&self) -> Dimension {
        self.dim
    }

    /// SI value of one of this unit (for a temperature scale: one degree, in kelvin).
    pub fn factor(&self) -> f64 {
        self.factor
    }

    /// The scale, when the unit is a lone temperature scale (`°F`, `°C`, `K`, `°R`).
    pub fn temperature_scale(&self) -> Option<TemperatureScale> {
        match self.kind {
            Kind::Scale(s) => Some(s),
            _ => None,
        }
    }

    pub(crate) fn kind(&self) -> Kind {
        self.kind
    }

    /// Whether the author wrote `%rh`: a ratio marked as relative humidity.
    pub fn is_relative_humidity(&self) -> bool {
        self.kind == Kind::RelativeHumidity
    }

    /// The unit system of the symbols: IP when all symbols that belong to one system are IP
    /// (`cfm/person`), SI likewise (`L/s/person`), `None` for a mix or for system-free symbols
    /// only (`h`, `%`, `person`).
    pub fn system(&self) -> Option<UnitSystem> {
        let mut found = None;
        for (def, _) in &self.terms {
            match (found, def.system) {
                (_, None) => {}
                (None, s) => found = s,
                (Some(a), Some(b)) if a != b => return None,
                _ => {}
            }
        }
        found
    }

    /// Whether a value in this unit satisfies `expected`: the dimensions are equal, or a
    /// difference is expected and this is a lone temperature scale (read as a difference).
    pub fn fits(&self, expected: Dimension) -> bool {
        self.dim == expected
            || (expected == Dimension::TEMPERATURE_DIFFERENCE && self.temperature_scale().is_some())
    }

    /// The unit that fixes a unit mismatch, where one does: `expected` is the dimension the key
    /// wants and `self` the unit the author wrote. Returns `None` when `self` already fits or
    /// no single edit of it does.
    ///
    /// The edits tried: a known rewrite (`in` → `in.wg`, `gr` → `gr/lb`, `Δ°F` → `°F`), a power
    /// or root (`ft` → `ft²`), dropping a division (`kBtu/h` → `kBtu`, `W/ft²` → `W`), and
    /// dividing or multiplying by an hour, minute, second, person, area, mass or length of the
    /// written unit's system (`kBtu` → `kBtu/h`, `cfm` → `cfm/person`, `ft³` → `cfm`).
    ///
    /// ```
    /// use plenum_units::{Dimension, Unit};
    /// let fix = |u: &str, d| Unit::parse(u).ok().and_then(|u| u.suggest(d)).map(|u| u.to_string());
    /// assert_eq!(fix("ft", Dimension::AREA).as_deref(), Some("ft²"));
    /// assert_eq!(fix("kBtu", Dimension::HEAT_FLOW).as_deref(), Some("kBtu/h"));
    /// assert_eq!(fix("cfm", Dimension::AIRFLOW_PER_PERSON).as_deref(), Some("cfm/person"));
    /// assert_eq!(fix("cfm", Dimension::HEAT_FLOW), None);
    /// ```
    pub fn suggest(&self, expected: Dimension) -> Option<Unit> {
        if self.fits(expected) {
            return None;
        }
        let mut candidates: Vec<(Vec<(&'static UnitDef, i32)>, bool)> = Vec::new();
        if let [(def, 1)] = self.terms.as_slice() {
            let rewrite: Option<&'static UnitDef> = match def.symbol {
                "in" => Some(&table::INWG),
                "gr" => Some(&table::GR_LB),
                "g" => Some(&table::G_KG),
                "lb" => Some(&table::LB_LB),
                "kg" => Some(&table::KG_KG),
                "Δ°F" => Some(&table::DEG_F),
                "Δ°C" => Some(&table::DEG_C),
                _ => None,
            };
            if let Some(r) = rewrite {
                candidates.push((vec![(r, 1)], true));
            }
        }
        for n in [2, 3] {
            candidates.push((self.terms.iter().map(|&(d, e)| (d, e * n)).collect(), false));
            if self.terms.iter().all(|(_, e)| e % n == 0) && !self.terms.is_empty() {
                candidates.push((self.terms.iter().map(|&(d, e)| (d, e / n)).collect(), false));
            }
        }
        if let Some(last) = self.terms.iter().rposition(|(_, e)| *e < 0) {
            let mut t = self.terms.clone();
            t.remove(last);
            candidates.push((t, false));
            let numerator: Vec<_> = self.terms.iter().copied().filter(|(_, e)| *e > 0).collect();
            candidates.push((numerator, false));
        }
        let extras: [(&'static UnitDef, i32); 7] = match self.system() {
            Some(UnitSystem::Si) => [
                (&table::SECOND, 1),
                (&table::HOUR, 1),
                (&table::MINUTE, 1),
                (&table::PERSON, 1),
                (&table::M, 2),
                (&table::KG, 1),
                (&table::M, 1),
            ],
            _ => [
                (&table::HOUR, 1),
                (&table::MINUTE, 1),
                (&table::SECOND, 1),
                (&table::PERSON, 1),
                (&table::FOOT, 2),
                (&table::POUND, 1),
                (&table::FOOT, 1),
            ],
        };
        for sign in [-1, 1] {
            for (def, e) in extras {
                let mut t = self.terms.clone();
                t.push((def, sign * e));
                candidates.push((t, false));
            }
        }
        let fitting: Vec<Unit> = candidates
            .into_iter()
            .filter_map(|(terms, single)| {
                let single = single || matches!(terms.as_slice(), [(_, 1)]);
                Unit::from_terms(terms, single, None)
            })
            .filter(|u| u.fits(expected) && !u.terms.is_empty())
            .collect();
        // Prefer a fix that is one familiar symbol (`ft³/min` is `cfm`), else the first found.
        fitting
            .iter()
            .find_map(Unit::simplified)
            .or_else(|| fitting.into_iter().next())
    }

    /// The same unit as one table symbol, for the few compounds the trade writes as one.
    fn simplified(&self) -> Option<Unit> {
        if self.terms.len() < 2 {
            return None;
        }
        [
            &table::CFM,
            &table::GPM,
            &table::WATT,
            &table::KW,
            &table::KWH,
        ]
        .into_iter()
        .find(|def| def.dim == self.dim && (def.factor / self.factor - 1.0).abs() < 1e-12)
        .map(|def| Unit {
            terms: vec![(def, 1)],
            factor: def.factor,
            dim: def.dim,
            kind: def.kind,
            label: None,
        })
    }
}

impl FromStr for Unit {
    type Err = UnitError;
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        Unit::parse(s)
    }
}

impl PartialEq for Unit {
    /// Units are equal when they are written with the same symbols and powers.
    fn eq(&self, other: &Self) -> bool {
        self.terms.len() == other.terms.len()
            && self
                .terms
                .iter()
                .zip(&other.terms)
                .all(|((a, x), (b, y))| std::ptr::eq(*a, *b) && x == y)
    }
}

impl fmt::Display for Unit {
    /// The canonical label: symbols in written order, positive powers joined by `·`, then each
    /// negative power after a `/` (`Btu/h/ft²`, `L/s/person`), powers as superscripts. A plain
    /// number prints as `1`.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if let Some(label) = self.label {
            return f.write_str(label);
        }
        let mut out = String::new();
        let power = |e: i32| {
            if e == 1 {
                String::new()
            } else {
                superscript(e)
            }
        };
        for (def, e) in self.terms.iter().filter(|(_, e)| *e > 0) {
            if !out.is_empty() {
                out.push('·');
            }
            out.push_str(def.symbol);
            out.push_str(&power(*e));
        }
        if out.is_empty() {
            out.push('1');
        }
        for (def, e) in self.terms.iter().filter(|(_, e)| *e < 0) {
            out.push('/');
            out.push_str(def.symbol);
            out.push_str(&power(-*e));
        }
        f.write_str(&out)
    }
}

/// The nearest known symbol to an unknown one: a spelling equal but for letter case, else the
/// closest by edit distance — at most 1 edit for a symbol of up to 4 characters, 2 for a longer
/// one, and for a symbol of 1 or 2 characters only a spelling that contains it (`F` finds
/// `°F`, `x` finds nothing). Ties go to the earlier table entry.
pub(crate) fn nearest_symbol(symbol: &str) -> Option<&'static str> {
    let spellings = || {
        table::TABLE
            .iter()
            .flat_map(|def| def.spellings().map(move |s| (s, def.symbol)))
    };
    if let Some((_, canon)) = spellings().find(|(s, _)| s.to_lowercase() == symbol.to_lowercase()) {
        return Some(canon);
    }
    let len = symbol.chars().count();
    let mut best: Option<(usize, &'static str)> = None;
    for (s, canon) in spellings() {
        let d = edit_distance(symbol, s);
        let max = if len <= 4 { 1 } else { 2 };
        let close = d <= max && (len > 2 || s.contains(symbol));
        if close && best.is_none_or(|(bd, _)| d < bd) {
            best = Some((d, canon));
        }
    }
    best.map(|(_, canon)| canon)
}

/// Edit distance over characters (optimal string alignment: insertions, deletions,
/// substitutions and transpositions of neighbours, so `cmf` is one edit from `cfm`).
fn edit_distance(a: &str, b: &str) -> usize {
    let a: Vec<char> = a.chars().collect();
    let b: Vec<char> = b.chars().collect();
    let w = b.len() + 1;
    let mut d = vec![0usize; (a.len() + 1) * w];
    for i in 0..=a.len() {
        d[i * w] = i;
    }
    for (j, cell) in d.iter_mut().enumerate().take(w) {
        *cell = j;
    }
    for i in 1..=a.len() {
        for j in 1..=b.len() {
            let cost = usize::from(a[i - 1] != b[j - 1]);
            let mut v = (d[(i - 1) * w + j - 1] + cost)
                .min(d[(i - 1) * w + j] + 1)
                .min(d[i * w + j - 1] + 1);
            if i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1] {
                v = v.min(d[(i - 2) * w + j - 2] + 1);
            }
            d[i * w + j] = v;
        }
    }
    d[a.len() * w + b.len()]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn edit_distance_basics() {
        assert_eq!(edit_distance("kbtu", "kBtu"), 1);
        assert_eq!(edit_distance("", "abc"), 3);
        assert_eq!(edit_distance("°F", "°F"), 0);
        assert_eq!(edit_distance("cmf", "cfm"), 1);
        assert_eq!(edit_distance("abc", "ca"), 3);
    }

    #[test]
    fn nearest_prefers_case_insensitive_match() {
        assert_eq!(nearest_symbol("KW"), Some("kW"));
        assert_eq!(nearest_symbol("Cfm"), Some("cfm"));
        assert_eq!(nearest_symbol("F"), Some("°F"));
        assert_eq!(nearest_symbol("zzzzzz"), None);
        assert_eq!(nearest_symbol("x"), None);
        assert_eq!(nearest_symbol("sqm"), None);
    }
}
