//! Findings: plain facts about a design and its results, for the checks
//! crate to turn into coded diagnostics.
//!
//! A finding never stops a result: the air handler has its figures and the
//! finding says what about them needs attention. Each carries the numbers
//! needed to word a message and the [`Loc`] it concerns. The limits named in
//! the kinds are those of methods.md §5 (marked there *common practice*,
//! physics, or ASHRAE 62.1 from memory).

use plenum_model::{Loc, ZoneId};

use crate::result::DesignCase;

/// Supply ΔT plausibility range, °F (methods.md §5, *common practice*).
pub const SUPPLY_DT_RANGE_F: (f64, f64) = (10.0, 25.0);
/// Airflow per ton plausibility range, cfm/ton (methods.md §5, *common practice*).
pub const CFM_PER_TON_RANGE: (f64, f64) = (300.0, 500.0);
/// Lowest plausible leaving-coil RH, per cent (methods.md §5, *common practice*).
pub const LEAVING_RH_MIN_PCT: f64 = 85.0;
/// Room RH comfort band, per cent (methods.md §5, *common practice*).
pub const ROOM_RH_COMFORT_PCT: (f64, f64) = (40.0, 60.0);
/// Room RH limit, per cent (methods.md §5; ASHRAE 62.1, from memory).
pub const ROOM_RH_LIMIT_PCT: f64 = 65.0;
/// Coil face velocity limit, fpm (methods.md §5, *common practice*: condensate carry-over).
pub const FACE_VELOCITY_LIMIT_FPM: f64 = 500.0;
/// Oversize threshold on the capacity margin (methods.md §4 step 11, *common practice*).
pub const OVERSIZE_MARGIN: f64 = 0.25;

/// What a finding says, with its numbers (IP; RH in per cent).
#[derive(Clone, Debug, PartialEq)]
pub enum FindingKind {
    /// A zone's `use` is not in the 62.1 category table; completion and the
    /// nearest-name suggestion can use [`crate::VENTILATION_CATEGORIES`].
    UnknownCategory {
        /// The zone.
        zone: ZoneId,
        /// The category as written.
        written: String,
    },
    /// A zone with a 62.1 category that has an area rate but no `area`
    /// (0 ft² used, so its area outdoor air is missing).
    AreaMissingForVentilation {
        /// The zone.
        zone: ZoneId,
        /// The category.
        category: &'static str,
    },
    /// Both `pressure` and `elevation` given: the pressure is used.
    ElevationIgnored {
        /// The elevation given, ft.
        elevation_ft: f64,
        /// The pressure used, psia.
        pressure_psia: f64,
    },
    /// A motor efficiency was given for a motor outside the air stream,
    /// where the whole shaft power (not the motor loss) reaches the air; it is not used.
    MotorEfficiencyIgnored {
        /// The value given, 0–1.
        motor_efficiency: f64,
    },
    /// Outdoor air below the 62.1 minimum (an error in methods.md §5).
    VentilationShortfall {
        /// Outdoor air provided, cfm.
        provided_cfm: f64,
        /// 62.1 minimum V_ot, cfm.
        required_cfm: f64,
    },
    /// A zone runs more humid than its indoor design state.
    RoomAboveDesignHumidity {
        /// The zone.
        zone: ZoneId,
        /// Resulting humidity ratio, lb/lb.
        room_w_lb_lb: f64,
        /// Design humidity ratio, lb/lb.
        design_w_lb_lb: f64,
        /// Resulting RH, %.
        room_rh_pct: f64,
        /// Design RH, %.
        design_rh_pct: f64,
    },
    /// A zone's resulting RH is above 65 % (an error in methods.md §5).
    RoomRhAboveLimit {
        /// The zone.
        zone: ZoneId,
        /// Resulting RH, %.
        room_rh_pct: f64,
        /// The limit, %.
        limit_pct: f64,
    },
    /// A zone's resulting RH is outside the 40–60 % comfort band (but not above 65 %).
    RoomRhOutsideComfort {
        /// The zone.
        zone: ZoneId,
        /// Resulting RH, %.
        room_rh_pct: f64,
        /// The band, %.
        low_pct: f64,
        /// The band, %.
        high_pct: f64,
    },
    /// The leaving-coil RH is below 85 %.
    LeavingRhLow {
        /// Leaving RH, %.
        leaving_rh_pct: f64,
        /// The lowest plausible value, %.
        min_pct: f64,
    },
    /// A zone's supply ΔT is outside 10–25 °F.
    SupplyDtOutOfRange {
        /// The zone.
        zone: ZoneId,
        /// t_r,z − t_s, °F.
        dt_f: f64,
        /// Range, °F.
        min_f: f64,
        /// Range, °F.
        max_f: f64,
    },
    /// Supply airflow per ton outside 300–500 cfm/ton.
    CfmPerTonOutOfRange {
        /// cfm per ton.
        cfm_per_ton: f64,
        /// Range.
        min: f64,
        /// Range.
        max: f64,
    },
    /// Coil face velocity above 500 fpm.
    FaceVelocityHigh {
        /// Face velocity, fpm.
        face_velocity_fpm: f64,
        /// The limit, fpm.
        limit_fpm: f64,
    },
    /// A wet coil's leaving air is not drier than a served zone's indoor
    /// design state (its dew point is not below the design dew point), so the
    /// coil cannot hold that zone at its design humidity (an error in
    /// methods.md §5). A zone with a latent load needs supply air strictly
    /// drier than its design state; a zone without one, no wetter. One
    /// finding per zone.
    CoilCannotDehumidify {
        /// The zone.
        zone: ZoneId,
        /// Leaving-coil dew point, °F.
        leaving_dp_f: f64,
        /// Leaving-coil humidity ratio, lb/lb.
        leaving_w_lb_lb: f64,
        /// The zone's indoor design humidity ratio, lb/lb.
        design_w_lb_lb: f64,
        /// The zone's indoor design relative humidity, %.
        design_rh_pct: f64,
    },
    /// The coil runs dry: nothing condenses.
    DryCoil {
        /// Leaving RH of the dry coil, %.
        leaving_rh_pct: f64,
    },
    /// Rated capacity below the required (an error: the finding CI fails on).
    Undersized {
        /// Rated total, Btu/h.
        rated_btuh: Option<f64>,
        /// Required total, Btu/h.
        required_btuh: f64,
        /// Rated sensible, Btu/h.
        rated_sensible_btuh: Option<f64>,
        /// Required sensible, Btu/h.
        required_sensible_btuh: f64,
    },
    /// Rated capacity more than 25 % above the required (humidity control suffers).
    Oversized {
        /// Rated total, Btu/h.
        rated_btuh: f64,
        /// Required total, Btu/h.
        required_btuh: f64,
        /// rated / required − 1.
        margin: f64,
    },
}

/// One finding.
#[derive(Clone, Debug, PartialEq)]
pub struct Finding {
    /// What it says.
    pub kind: FindingKind,
    /// The design case it belongs to (none when it holds for both).
    pub case: Option<DesignCase>,
    /// The key, zone or air handler it concerns.
    pub loc: Loc,
}
