//! The defaults the engine used where the design gave no value.
//!
//! Every default of methods.md and the project key list that the engine
//! applies is recorded once, naming the key, the value used (typed, so a
//! report can show it in either unit system) and its source.

use plenum_model::{FanArrangement, Loc, ZoneId};

/// What a default is attached to.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Subject {
    /// The site.
    Site,
    /// A zone.
    Zone(ZoneId),
    /// An air handler (index in the design).
    Ahu(usize),
}

/// Where a default comes from.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Source {
    /// A rule of thumb of the trade with no single published source.
    CommonPractice,
    /// A default chosen by this project (methods.md, the key list).
    ProjectDefault,
    /// ANSI/ASHRAE Standard 62.1-2019, written from memory.
    Ashrae621FromMemory,
}

impl Source {
    /// A short label for reports.
    pub fn label(self) -> &'static str {
        match self {
            Source::CommonPractice => "common practice",
            Source::ProjectDefault => "project default",
            Source::Ashrae621FromMemory => "ASHRAE 62.1-2019 (from memory)",
        }
    }
}

/// The value a default gave, in IP numbers.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum AssumedValue {
    /// A length, ft.
    LengthFt(f64),
    /// An absolute temperature, °F.
    TemperatureF(f64),
    /// A temperature difference, °F.
    TemperatureDifferenceF(f64),
    /// A ratio, 0–1 (shown as per cent).
    Ratio(f64),
    /// A count (people).
    Count(f64),
    /// A heat flow, Btu/h.
    HeatBtuh(f64),
    /// An indoor state: dry bulb °F and RH 0–1.
    IndoorState {
        /// Dry bulb, °F.
        db_f: f64,
        /// Relative humidity, 0–1.
        rh: f64,
    },
    /// The supply `dt_f` below the lowest served zone, giving `supply_f`.
    BelowLowestRoom {
        /// The difference, °F.
        dt_f: f64,
        /// The supply temperature it gives, °F.
        supply_f: f64,
    },
    /// A duct rise per 100 ft of duct, °F, and the rise it gives.
    RisePer100Ft {
        /// °F per 100 ft.
        dt_f: f64,
        /// The rise it gives, °F.
        rise_f: f64,
    },
    /// A fan rise and its arrangement.
    FanRise {
        /// The rise, °F.
        dt_f: f64,
        /// Where the fan sits.
        arrangement: FanArrangement,
    },
    /// A keyword value (`ventilation`, `simplified`, `draw_through`, `in_airstream`, `none`).
    Keyword(&'static str),
}

/// One default used.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Assumption {
    /// What it is attached to.
    pub subject: Subject,
    /// The design-file key that was not given (for a per-length rate, the
    /// key whose length it converts).
    pub key: &'static str,
    /// The value used.
    pub value: AssumedValue,
    /// Where it comes from.
    pub source: Source,
    /// The block where the key would have been written.
    pub loc: Loc,
}
