//! The typed design: what the engine computes from.
//!
//! Every number is an IP value in the unit its field name says (`_f` °F,
//! `_btuh` Btu/h, `_ft2` ft², `_cfm` cfm, `_psia` psia, `_hp` hp, `_in_wg`
//! in. of water, `_ft` ft, ratios as fractions 0–1). A value the file did not
//! give is `None`, so the engine can apply its default and report it as an
//! assumption. Every value keeps the place in the source it came from.

use plenum_syntax::Span;
use plenum_units::UnitSystem;

/// Which loaded file a span belongs to.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct FileId(pub u32);

/// A place in one of the design's files.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct Loc {
    pub file: FileId,
    pub span: Span,
}

/// A value and where it was written.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct At<T> {
    pub value: T,
    pub loc: Loc,
}

impl<T> At<T> {
    pub fn new(value: T, loc: Loc) -> At<T> {
        At { value, loc }
    }
}

/// A whole design: one project's site, zones and air handlers.
#[derive(Clone, Debug, PartialEq, Default)]
pub struct Design {
    pub project: Project,
    /// `None` when no file has a `site` block (an error is reported).
    pub site: Option<Site>,
    pub zones: Vec<Zone>,
    pub ahus: Vec<Ahu>,
}

impl Design {
    pub fn zone(&self, id: ZoneId) -> Option<&Zone> {
        self.zones.get(id.0 as usize)
    }

    pub fn zone_by_name(&self, name: &str) -> Option<&Zone> {
        self.zones.iter().find(|z| z.name == name)
    }

    pub fn ahu_by_name(&self, name: &str) -> Option<&Ahu> {
        self.ahus.iter().find(|a| a.name == name)
    }
}

#[derive(Clone, Debug, PartialEq, Default)]
pub struct Project {
    pub name: Option<String>,
    /// Display units (`units ip|si`); IP when not given.
    pub units: Option<At<UnitSystem>>,
    pub loc: Option<Loc>,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Site {
    pub loc: Loc,
    pub elevation_ft: Option<At<f64>>,
    /// Barometric pressure given directly (instead of from the elevation).
    pub pressure_psia: Option<At<f64>>,
    /// The cooling design outdoor state (required; `None` only when missing or invalid).
    pub cooling: Option<At<AirSpec>>,
    /// The dehumidification design outdoor state.
    pub dehumid: Option<At<AirSpec>>,
}

/// An air state as written: a dry bulb and one humidity measure. The engine
/// turns it into a psychrometric state at the site's pressure.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum AirSpec {
    /// Dry bulb and thermodynamic wet bulb, °F.
    DbWb { db_f: f64, wb_f: f64 },
    /// Dry bulb °F and relative humidity 0–1.
    DbRh { db_f: f64, rh: f64 },
    /// Dry bulb and dew point, °F.
    DbDp { db_f: f64, dp_f: f64 },
    /// Dry bulb °F and humidity ratio lb/lb.
    DbW { db_f: f64, w: f64 },
}

impl AirSpec {
    pub fn db_f(&self) -> f64 {
        match *self {
            AirSpec::DbWb { db_f, .. }
            | AirSpec::DbRh { db_f, .. }
            | AirSpec::DbDp { db_f, .. }
            | AirSpec::DbW { db_f, .. } => db_f,
        }
    }
}

/// Index of a zone in [`Design::zones`].
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct ZoneId(pub u32);

#[derive(Clone, Debug, PartialEq)]
pub struct Zone {
    pub id: ZoneId,
    pub name: String,
    pub label: Option<String>,
    /// The whole `zone` block (the name's own span is `name_loc`).
    pub loc: Loc,
    pub name_loc: Loc,
    pub area_ft2: Option<At<f64>>,
    pub people: Option<At<f64>>,
    /// Ventilation category (the `use` key), as written; checked against the table by the engine.
    pub category: Option<At<String>>,
    /// Indoor design state (default 75 °F, 50 %rh).
    pub indoor: Option<At<AirSpec>>,
    /// Peak sensible gain (required; `None` only when missing or invalid).
    pub sensible_btuh: Option<At<f64>>,
    pub latent_btuh: Option<At<f64>>,
    /// ASHRAE 62.1 zone air distribution effectiveness E_z.
    pub distribution_effectiveness: Option<At<f64>>,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Ahu {
    pub name: String,
    pub label: Option<String>,
    pub loc: Loc,
    pub name_loc: Loc,
    /// The zones served, each where it was named (required: empty when missing).
    pub serves: Vec<At<ZoneId>>,
    pub supply: Option<At<SupplyTemp>>,
    pub diversity: Option<At<f64>>,
    pub supply_duct: Option<At<SupplyDuct>>,
    pub return_duct: Option<At<ReturnDuct>>,
    pub plenum_gain_btuh: Option<At<f64>>,
    pub fan: Option<Fan>,
    pub outdoor_air: Option<At<OutdoorAir>>,
    pub occupant_diversity: Option<At<f64>>,
    pub ventilation_efficiency: Option<At<VentilationEfficiency>>,
    pub outdoor_fan_rise_f: Option<At<f64>>,
    pub coil: Option<Coil>,
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub enum SupplyTemp {
    /// `supply_temp`: the supply air temperature, °F.
    Temp { f: f64 },
    /// `supply_dt`: the supply is this many °F below the lowest zone's indoor temperature.
    BelowRoom { dt_f: f64 },
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub enum SupplyDuct {
    /// `supply_duct`: length of the supply run, ft.
    Length { ft: f64 },
    /// `supply_duct_rise`: the temperature rise, °F.
    Rise { dt_f: f64 },
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub enum ReturnDuct {
    Length {
        ft: f64,
    },
    Rise {
        dt_f: f64,
    },
    /// `return_duct none`: no return duct, no rise.
    None,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Fan {
    pub loc: Loc,
    pub power: Option<At<FanPower>>,
    /// `rise`: the fan's temperature rise given directly, °F.
    pub rise_f: Option<At<f64>>,
    pub motor_efficiency: Option<At<f64>>,
    pub motor: Option<At<MotorLocation>>,
    pub arrangement: Option<At<FanArrangement>>,
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub enum FanPower {
    /// Shaft power, hp.
    Shaft { hp: f64 },
    /// Total static pressure and fan efficiency: P = cfm·Δp / (6356 η).
    Static { in_wg: f64, efficiency: f64 },
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum MotorLocation {
    InAirstream,
    Outside,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum FanArrangement {
    DrawThrough,
    BlowThrough,
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub enum OutdoorAir {
    /// `ventilation`: the ASHRAE 62.1 ventilation rate procedure.
    Ventilation,
    /// A given airflow at the outdoor state, cfm.
    Airflow { cfm: f64 },
    /// A fraction of the supply dry-air mass flow, 0–1 (not 100 %).
    FractionOfSupply { fraction: f64 },
    /// cfm per person, times the served zones' occupants.
    PerPerson { cfm: f64 },
    /// cfm per ft², times the served zones' area.
    PerArea { cfm_per_ft2: f64 },
    /// `100 %`: a dedicated outdoor-air unit.
    All,
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub enum VentilationEfficiency {
    /// 62.1 simplified procedure (table of E_v by D).
    Simplified,
    /// 62.1 calculated procedure (E_vz = 1 + X_s − Z_pz).
    Calculated,
    /// A given E_v, 0–1.
    Given { ev: f64 },
}

#[derive(Clone, Debug, PartialEq)]
pub struct Coil {
    pub loc: Loc,
    pub leaving_rh: Option<At<f64>>,
    pub rated_btuh: Option<At<f64>>,
    pub rated_sensible_btuh: Option<At<f64>>,
    /// Chilled water supply and return temperatures, °F.
    pub chilled_water: Option<At<(f64, f64)>>,
    pub face_area_ft2: Option<At<f64>>,
}
