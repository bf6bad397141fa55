//! Why an air handler (or the site) has no result: the engine's typed errors.
//!
//! An error means a value the chain needs is unknown or has no solution, so
//! the air handler is left out of the results. Every error carries the
//! [`Loc`] it concerns and the numbers needed to word a message; the engine
//! words nothing itself (the checks crate turns these into diagnostics).

use plenum_model::{Loc, ZoneId};
use plenum_psychro::PsychroError;

use crate::result::{DesignCase, Point};

/// What a numeric input must satisfy.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Allowed {
    /// A finite number above zero.
    Positive,
    /// A finite number, zero or above.
    NonNegative,
    /// A fraction 0…1 (0 % to 100 %).
    Fraction,
    /// A fraction above 0 and at most 1 (above 0 %, at most 100 %).
    PositiveFraction,
    /// Any finite number.
    Finite,
}

impl Allowed {
    /// Whether `v` is allowed.
    pub fn admits(self, v: f64) -> bool {
        v.is_finite()
            && match self {
                Allowed::Positive => v > 0.0,
                Allowed::NonNegative => v >= 0.0,
                Allowed::Fraction => (0.0..=1.0).contains(&v),
                Allowed::PositiveFraction => v > 0.0 && v <= 1.0,
                Allowed::Finite => true,
            }
    }
}

/// Which iteration of the method failed to converge.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Iteration {
    /// Steps 2–5: supply airflow, c_p, fan rise and leaving-coil state.
    Airflow,
    /// Step 10: the dry-coil fixed point on the supply humidity ratio.
    DryCoil,
    /// Step 10: the apparatus-dew-point bisection.
    ApparatusDewPoint,
}

/// Why the site, or one air handler, has no result.
#[derive(Clone, Debug, PartialEq)]
pub enum EngineError {
    /// The design has no `site` block.
    NoSite {
        /// The project block, or the start of the root file.
        loc: Loc,
    },
    /// The site is missing or unusable (its own error is
    /// [`crate::Evaluation::site`]); this air handler or zone is left out
    /// because of it.
    SiteUnusable {
        /// The air handler or zone left out.
        loc: Loc,
    },
    /// A served zone's inputs are unusable (its own error is in
    /// [`crate::ZoneResult::inputs`]); the air handler is left out because of it.
    ZoneUnusable {
        /// The zone.
        zone: ZoneId,
        /// Where `serves` names it.
        loc: Loc,
    },
    /// A required value is absent: site `cooling`, zone `sensible`, or an
    /// air handler's `serves`. The model has already reported the missing
    /// key; this names the consequence.
    MissingInput {
        /// The design-file key.
        key: &'static str,
        /// The block that lacks it.
        loc: Loc,
        /// The zone concerned, when it is a zone key.
        zone: Option<ZoneId>,
    },
    /// A number outside the range the method accepts (a negative area, a
    /// fan efficiency of zero, a leaving RH above 100 %, NaN…).
    InvalidInput {
        /// The design-file key (`diversity`, `leaving_rh`, `static`…).
        key: &'static str,
        /// The value as the engine received it (IP, fractions 0–1).
        value: f64,
        /// What the value must satisfy.
        allowed: Allowed,
        /// Where the value was written.
        loc: Loc,
    },
    /// A number that is NaN or infinite.
    InputNotFinite {
        /// The design-file key.
        key: &'static str,
        /// Where the value was written.
        loc: Loc,
    },
    /// Two keys that exclude each other were both given (a fan's `rise`
    /// with its `power` or `static`).
    ConflictingInputs {
        /// The key that was used.
        first: &'static str,
        /// The key that conflicts with it.
        second: &'static str,
        /// Where the second was written.
        loc: Loc,
    },
    /// `serves` names a zone id that is not in the design.
    UnknownZone {
        /// Where the zone was named.
        loc: Loc,
    },
    /// `serves` names the same zone twice.
    ZoneServedTwice {
        /// The zone.
        zone: ZoneId,
        /// Where it was named the second time.
        loc: Loc,
    },
    /// A served zone's `use` is not in the 62.1 category table, so its
    /// ventilation requirement is unknown. The zone's
    /// [`crate::FindingKind::UnknownCategory`] finding says so at the `use`
    /// key; this is the reason the air handler is left out.
    UnknownCategory {
        /// The zone.
        zone: ZoneId,
        /// The category as written.
        written: String,
        /// The `use` value.
        loc: Loc,
    },
    /// The supply air is not colder than a served zone (ΔT ≤ 0): the zone's
    /// sensible load gives no airflow.
    SupplyNotBelowRoom {
        /// The zone.
        zone: ZoneId,
        /// Supply temperature, °F.
        supply_f: f64,
        /// The zone's indoor temperature, °F.
        room_f: f64,
        /// The supply temperature key, or the air handler when defaulted.
        loc: Loc,
    },
    /// A recirculating unit whose outdoor air exceeds its supply (fraction
    /// by mass above 1).
    OutdoorAirExceedsSupply {
        /// The design case.
        case: DesignCase,
        /// Outdoor-air fraction by mass.
        fraction: f64,
        /// Outdoor airflow, cfm at the outdoor state.
        outdoor_cfm: f64,
        /// Supply airflow, cfm at the supply state.
        supply_cfm: f64,
        /// The `outdoor_air` key, or the air handler when defaulted.
        loc: Loc,
    },
    /// A dry coil with no outdoor air: nothing removes the room's moisture,
    /// so the chain has no steady state.
    NoSteadyState {
        /// The design case.
        case: DesignCase,
        /// The air handler.
        loc: Loc,
    },
    /// The air entering the coil is not warmer than the air leaving it, so
    /// it is no cooling coil (and the coil line has no slope).
    CoilNotCooling {
        /// The design case.
        case: DesignCase,
        /// Entering dry bulb, °F.
        entering_f: f64,
        /// Leaving dry bulb, °F.
        leaving_f: f64,
        /// Coil total load, Btu/h.
        total_btuh: f64,
        /// The air handler.
        loc: Loc,
    },
    /// An iteration reached its bound without converging.
    NoConvergence {
        /// Which iteration.
        iteration: Iteration,
        /// Passes made.
        passes: u32,
        /// The design case (none for case-independent loops).
        case: Option<DesignCase>,
        /// The air handler.
        loc: Loc,
    },
    /// The coil line never meets the saturation curve above −100 °F.
    NoApparatusDewPoint {
        /// The design case.
        case: DesignCase,
        /// The air handler.
        loc: Loc,
    },
    /// A state point is outside the psychrometric domain (above saturation,
    /// outside −148…392 °F, …).
    Psychro {
        /// Which state point.
        point: Point,
        /// The design case, when the state belongs to one.
        case: Option<DesignCase>,
        /// What the psychrometric library reported.
        error: PsychroError,
        /// The key or block concerned.
        loc: Loc,
    },
    /// A computed number was NaN or infinite (a guard: the engine returns
    /// an error rather than a non-finite result).
    NotFinite {
        /// The result field, e.g. `coil.total_btuh`.
        field: &'static str,
        /// The air handler (or the site).
        loc: Loc,
    },
}

impl EngineError {
    /// Where the error is located.
    pub fn loc(&self) -> Loc {
        match self {
            EngineError::NoSite { loc }
            | EngineError::SiteUnusable { loc }
            | EngineError::ZoneUnusable { loc, .. }
            | EngineError::MissingInput { loc, .. }
            | EngineError::InvalidInput { loc, .. }
            | EngineError::InputNotFinite { loc, .. }
            | EngineError::ConflictingInputs { loc, .. }
            | EngineError::UnknownZone { loc }
            | EngineError::ZoneServedTwice { loc, .. }
            | EngineError::UnknownCategory { loc, .. }
            | EngineError::SupplyNotBelowRoom { loc, .. }
            | EngineError::OutdoorAirExceedsSupply { loc, .. }
            | EngineError::NoSteadyState { loc, .. }
            | EngineError::CoilNotCooling { loc, .. }
            | EngineError::NoConvergence { loc, .. }
            | EngineError::NoApparatusDewPoint { loc, .. }
            | EngineError::Psychro { loc, .. }
            | EngineError::NotFinite { loc, .. } => *loc,
        }
    }
}

impl EngineError {
    /// Whether every number the error carries is finite (the numbers of a
    /// [`PsychroError`] are finite by that crate's contract).
    pub fn numbers_are_finite(&self) -> bool {
        let all = |v: &[f64]| v.iter().all(|x| x.is_finite());
        match self {
            EngineError::InvalidInput { value, .. } => value.is_finite(),
            EngineError::SupplyNotBelowRoom {
                supply_f, room_f, ..
            } => all(&[*supply_f, *room_f]),
            EngineError::OutdoorAirExceedsSupply {
                fraction,
                outdoor_cfm,
                supply_cfm,
                ..
            } => all(&[*fraction, *outdoor_cfm, *supply_cfm]),
            EngineError::CoilNotCooling {
                entering_f,
                leaving_f,
                total_btuh,
                ..
            } => all(&[*entering_f, *leaving_f, *total_btuh]),
            EngineError::NoSite { .. }
            | EngineError::SiteUnusable { .. }
            | EngineError::ZoneUnusable { .. }
            | EngineError::MissingInput { .. }
            | EngineError::InputNotFinite { .. }
            | EngineError::ConflictingInputs { .. }
            | EngineError::UnknownZone { .. }
            | EngineError::ZoneServedTwice { .. }
            | EngineError::UnknownCategory { .. }
            | EngineError::NoSteadyState { .. }
            | EngineError::NoConvergence { .. }
            | EngineError::NoApparatusDewPoint { .. }
            | EngineError::Psychro { .. }
            | EngineError::NotFinite { .. } => true,
        }
    }

    /// The error itself, or [`EngineError::NotFinite`] when it would carry
    /// a non-finite number.
    pub(crate) fn finite(self) -> EngineError {
        if self.numbers_are_finite() {
            self
        } else {
            EngineError::NotFinite {
                field: "error",
                loc: self.loc(),
            }
        }
    }
}

/// Check a numeric input against what the method accepts.
pub(crate) fn check(
    key: &'static str,
    value: f64,
    allowed: Allowed,
    loc: Loc,
) -> Result<f64, EngineError> {
    if !value.is_finite() {
        return Err(EngineError::InputNotFinite { key, loc });
    }
    if allowed.admits(value) {
        Ok(value)
    } else {
        Err(EngineError::InvalidInput {
            key,
            value,
            allowed,
            loc,
        })
    }
}
