//! The engine's results: plain data in IP numbers.
//!
//! Units are in the field names: `_f` °F (a temperature or, for `_dt_f` and
//! rises, a difference), `_lb_lb` lb water per lb dry air, `_btu_lb` Btu per
//! lb dry air, `_ft3_lb` ft³ per lb dry air, `_btuh` Btu/h, `_cfm` ft³/min at
//! the state named in the docs, `_lb_h` lb dry air per hour, `_pct` per cent;
//! other ratios are fractions 0–1.

use plenum_model::{FanArrangement, Loc, MotorLocation, OutdoorAir, VentilationEfficiency, ZoneId};

use crate::assumption::Assumption;
use crate::error::EngineError;
use crate::finding::Finding;
use crate::ventilation::VentilationCategory;

/// The outdoor design state an air handler is evaluated at (methods.md §1).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum DesignCase {
    /// The cooling design state (dry bulb with coincident wet bulb).
    Cooling,
    /// The dehumidification design state (dew point with coincident dry bulb).
    Dehumid,
}

impl DesignCase {
    /// The key of the case in the design file and in reports.
    pub fn key(self) -> &'static str {
        match self {
            DesignCase::Cooling => "cooling",
            DesignCase::Dehumid => "dehumid",
        }
    }
}

/// A named state point of the chain (for errors).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Point {
    /// A site design outdoor state as written.
    DesignOutdoor(DesignCase),
    /// A zone's indoor design state as written.
    ZoneIndoor(ZoneId),
    /// The humidity a zone's own airflow and latent load give.
    ZoneRoom(ZoneId),
    /// Outdoor air.
    Outdoor,
    /// Outdoor air after the outdoor-air fan.
    OutdoorAfterFan,
    /// Return air.
    Return,
    /// Mixed air.
    Mixed,
    /// Air entering the coil.
    Entering,
    /// Air leaving the coil.
    Leaving,
    /// Supply air.
    Supply,
    /// The air handler's room state.
    Room,
    /// A point on the saturation curve (apparatus dew point search).
    Saturation,
    /// The site's barometric pressure (from the elevation).
    SitePressure,
}

/// One moist-air state, every property at the site pressure (ASHRAE
/// Handbook—Fundamentals 2017 ch. 1, via `plenum-psychro`).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct StatePoint {
    /// Dry bulb, °F.
    pub tdb_f: f64,
    /// Thermodynamic wet bulb, °F.
    pub twb_f: f64,
    /// Dew point, °F.
    pub tdp_f: f64,
    /// Humidity ratio, lb/lb.
    pub w_lb_lb: f64,
    /// Enthalpy, Btu/lb dry air (0 °F datum).
    pub h_btu_lb: f64,
    /// Relative humidity, per cent.
    pub rh_pct: f64,
    /// Specific volume, ft³/lb dry air.
    pub v_ft3_lb: f64,
}

/// How the site pressure was obtained.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum PressureSource {
    /// Given directly by `pressure`.
    Given,
    /// From `elevation` by the standard atmosphere (Fundamentals ch. 1 eq. 3).
    Elevation {
        /// The elevation, ft.
        elevation_ft: f64,
    },
    /// Neither given: sea level assumed (reported as an assumption).
    SeaLevelAssumed,
}

/// The site: barometric pressure and the outdoor design states.
#[derive(Clone, Debug, PartialEq)]
pub struct SiteResult {
    /// Barometric pressure, psia.
    pub pressure_psia: f64,
    /// How it was obtained.
    pub pressure_source: PressureSource,
    /// The cooling design outdoor state.
    pub cooling: StatePoint,
    /// The dehumidification design outdoor state, when given.
    pub dehumid: Option<StatePoint>,
    /// Defaults used for the site.
    pub assumptions: Vec<Assumption>,
    /// The `site` block.
    pub loc: Loc,
}

impl SiteResult {
    /// The outdoor state of a design case (`None`: no dehumid state given).
    pub fn outdoor(&self, case: DesignCase) -> Option<&StatePoint> {
        match case {
            DesignCase::Cooling => Some(&self.cooling),
            DesignCase::Dehumid => self.dehumid.as_ref(),
        }
    }
}

/// A zone's inputs after defaults, in IP numbers.
#[derive(Clone, Debug, PartialEq)]
pub struct ZoneInputs {
    /// Indoor design dry bulb t_r, °F.
    pub indoor_tdb_f: f64,
    /// Indoor design humidity ratio, lb/lb.
    pub indoor_w_lb_lb: f64,
    /// Peak sensible gain q_s,z, Btu/h.
    pub sensible_btuh: f64,
    /// Peak latent gain q_l,z, Btu/h.
    pub latent_btuh: f64,
    /// Floor area, ft² (0 when not given).
    pub area_ft2: f64,
    /// Occupants (0 when not given).
    pub people: f64,
    /// The 62.1 category, when `use` names a known one.
    pub category: Option<&'static VentilationCategory>,
    /// The category as written when it is not in the table.
    pub unknown_category: Option<String>,
    /// 62.1 zone air distribution effectiveness E_z.
    pub e_z: f64,
}

/// One zone of the design, with its result at the governing design case of
/// the air handler that serves it.
#[derive(Clone, Debug, PartialEq)]
pub struct ZoneResult {
    /// The zone.
    pub zone: ZoneId,
    /// Its name.
    pub name: String,
    /// The zone's name in the source.
    pub loc: Loc,
    /// Its inputs, or why they are unusable.
    pub inputs: Result<ZoneInputs, EngineError>,
    /// Indices (in [`Evaluation::ahus`]) of the air handlers that serve it.
    pub served_by: Vec<usize>,
    /// Airflow, ventilation and resulting humidity at the governing design
    /// case of the first air handler that serves it and has a result.
    pub flow: Option<ZoneFlow>,
    /// Defaults used for this zone.
    pub assumptions: Vec<Assumption>,
}

/// A served zone's results at one design case.
#[derive(Clone, Debug, PartialEq)]
pub struct ZoneFlow {
    /// The zone.
    pub zone: ZoneId,
    /// Its name.
    pub name: String,
    /// t_r,z − t_s, °F.
    pub supply_dt_f: f64,
    /// Zone design airflow m_z (undiversified), lb dry air/h.
    pub design_airflow_lb_h: f64,
    /// The same, cfm at the supply state (62.1 V_pz).
    pub design_airflow_cfm: f64,
    /// 62.1 R_p, cfm/person (0 without `use`).
    pub r_p_cfm_per_person: f64,
    /// 62.1 R_a, cfm/ft² (0 without `use`).
    pub r_a_cfm_per_ft2: f64,
    /// 62.1 E_z.
    pub e_z: f64,
    /// Breathing-zone outdoor airflow V_bz, cfm.
    pub v_bz_cfm: f64,
    /// Zone outdoor airflow V_oz = V_bz / E_z, cfm.
    pub v_oz_cfm: f64,
    /// Primary outdoor-air fraction Z_pz = V_oz / V_pz.
    pub z_pz: f64,
    /// Zone ventilation efficiency E_vz = 1 + X_s − Z_pz (multiple-zone units only).
    pub e_vz: Option<f64>,
    /// The zone's indoor dry bulb, °F.
    pub room_tdb_f: f64,
    /// The humidity ratio the zone's own airflow and latent load give, lb/lb.
    pub room_w_lb_lb: f64,
    /// The RH that gives at the zone's dry bulb, per cent.
    pub room_rh_pct: f64,
    /// The zone's indoor design humidity ratio, lb/lb.
    pub design_w_lb_lb: f64,
    /// Its RH, per cent.
    pub design_rh_pct: f64,
    /// The room runs more humid than its design state.
    pub above_design_humidity: bool,
}

/// Where the fan's heat was taken from.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum FanSource {
    /// Shaft power given.
    Power,
    /// Total static pressure and fan efficiency.
    Static,
    /// Temperature rise given.
    Rise,
    /// Not described: the 2 °F default rise.
    Default,
}

/// The fan at one design case.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FanResult {
    /// Draw- or blow-through.
    pub arrangement: FanArrangement,
    /// Motor in or outside the air stream.
    pub motor: MotorLocation,
    /// Where the heat came from.
    pub source: FanSource,
    /// Shaft power, bhp (none for a given or default rise).
    pub shaft_power_bhp: Option<f64>,
    /// Heat added to the air, Btu/h (m c_p Δt_f for a given rise).
    pub heat_btuh: f64,
    /// Temperature rise, °F.
    pub rise_f: f64,
}

/// The temperature rises of the chain, °F.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Rises {
    /// Supply duct.
    pub supply_duct_f: f64,
    /// Supply fan.
    pub fan_f: f64,
    /// Return duct.
    pub return_duct_f: f64,
    /// Return plenum gain.
    pub plenum_f: f64,
    /// Outdoor-air fan.
    pub outdoor_fan_f: f64,
}

/// Which 62.1 procedure gives the required outdoor air.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum VentilationProcedure {
    /// One zone: V_ot = V_oz.
    SingleZone,
    /// Recirculating unit serving several zones: V_ot = V_ou / E_v.
    MultipleZone,
    /// 100 % outdoor air: V_ot = Σ V_oz.
    AllOutdoorAir,
}

/// How E_v was found.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum EvMethod {
    /// 62.1 simplified procedure (by D).
    Simplified,
    /// 62.1 calculated procedure (min E_vz).
    Calculated,
    /// Given in the design.
    Given,
}

/// The multiple-zone procedure's figures.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct MultipleZone {
    /// Occupant diversity D.
    pub occupant_diversity: f64,
    /// Uncorrected outdoor air intake V_ou = D Σ R_p P_z + Σ R_a A_z, cfm.
    pub v_ou_cfm: f64,
    /// System primary airflow V_ps (supply, supply state), cfm.
    pub v_ps_cfm: f64,
    /// X_s = V_ou / V_ps.
    pub x_s: f64,
    /// How E_v was found.
    pub e_v_method: EvMethod,
    /// System ventilation efficiency E_v.
    pub e_v: f64,
}

/// The 62.1 requirement of one air handler.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct VentilationResult {
    /// The procedure used.
    pub procedure: VentilationProcedure,
    /// Σ V_oz of the served zones, cfm.
    pub sum_v_oz_cfm: f64,
    /// The multiple-zone figures, for that procedure.
    pub multiple_zone: Option<MultipleZone>,
    /// The required outdoor airflow V_ot, cfm.
    pub v_ot_cfm: f64,
}

/// The state points of one design case.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct States {
    /// Outdoor design state.
    pub outdoor: StatePoint,
    /// Outdoor air after the outdoor-air fan (only when it has a rise).
    pub outdoor_after_fan: Option<StatePoint>,
    /// Return air (room plus return duct and plenum rises).
    pub return_air: StatePoint,
    /// Mixed air.
    pub mixed: StatePoint,
    /// Entering the coil (mixed, plus a blow-through fan's rise).
    pub entering: StatePoint,
    /// Leaving the coil.
    pub leaving: StatePoint,
    /// Supply air at the diffusers.
    pub supply: StatePoint,
    /// The air handler's room state (flow-weighted t_r, the W_r the latent load gives).
    pub room: StatePoint,
}

/// The cooling coil at one design case.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CoilResult {
    /// Nothing condenses (W_off would be above W_on).
    pub dry: bool,
    /// Total load Q_c, Btu/h.
    pub total_btuh: f64,
    /// Sensible load, Btu/h.
    pub sensible_btuh: f64,
    /// Latent load, Btu/h.
    pub latent_btuh: f64,
    /// Q_c / 12,000.
    pub tons: f64,
    /// Sensible heat ratio.
    pub shr: f64,
    /// Apparatus dew point, °F.
    pub adp_f: f64,
    /// Bypass factor.
    pub bypass_factor: f64,
    /// Condensate, lb/h.
    pub condensate_lb_h: f64,
    /// Condensate, US gal/h (8.34 lb/gal).
    pub condensate_gal_h: f64,
    /// Chilled water, gpm (with `chilled_water`).
    pub chilled_water_gpm: Option<f64>,
    /// Face velocity, fpm (with `face_area`).
    pub face_velocity_fpm: Option<f64>,
    /// Supply cfm per ton of coil load.
    pub cfm_per_ton: f64,
}

/// Rated against required capacity.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum CapacityStatus {
    /// Rated at least the required and not more than 25 % above.
    Ok,
    /// Rated total below the required total, or rated sensible below the required sensible.
    Undersized,
    /// More than 25 % above the required total (*common practice*).
    Oversized,
    /// No rated capacity given.
    Unrated,
}

impl CapacityStatus {
    /// The status word of the JSON report.
    pub fn key(self) -> &'static str {
        match self {
            CapacityStatus::Ok => "ok",
            CapacityStatus::Undersized => "undersized",
            CapacityStatus::Oversized => "oversized",
            CapacityStatus::Unrated => "unrated",
        }
    }
}

/// The capacity check of one design case.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Capacity {
    /// Rated total, Btu/h.
    pub rated_btuh: Option<f64>,
    /// Rated total, tons.
    pub rated_tons: Option<f64>,
    /// Rated sensible, Btu/h.
    pub rated_sensible_btuh: Option<f64>,
    /// rated / required − 1.
    pub margin: Option<f64>,
    /// rated sensible / required sensible − 1.
    pub sensible_margin: Option<f64>,
    /// The status.
    pub status: CapacityStatus,
}

/// The hand-calculation figures beside the exact ones (methods.md §4 step 12).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct StandardAir {
    /// d Σ q_s,z / (1.08 ΔT_z), cfm.
    pub supply_airflow_cfm: f64,
    /// 100 (standard / exact − 1).
    pub supply_airflow_diff_pct: f64,
    /// 4.5 × supply cfm × (h_on − h_off), Btu/h.
    pub coil_total_btuh: f64,
    /// 100 (standard / exact − 1).
    pub coil_total_diff_pct: f64,
}

/// How many passes the iterations took.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Iterations {
    /// Passes of the airflow loop (the last solve).
    pub airflow: u32,
    /// Passes of the dry-coil fixed point (0 for a wet coil).
    pub dry_coil: u32,
}

/// One air handler at one design case.
#[derive(Clone, Debug, PartialEq)]
pub struct CaseResult {
    /// The design case.
    pub case: DesignCase,
    /// System dry-air mass flow m (diversified), lb/h.
    pub dry_air_flow_lb_h: f64,
    /// m v_s / 60 at the supply state, cfm.
    pub supply_airflow_cfm: f64,
    /// Q_s = d Σ q_s,z, Btu/h.
    pub block_sensible_btuh: f64,
    /// Q_l = d Σ q_l,z, Btu/h.
    pub block_latent_btuh: f64,
    /// c_p,s = 0.240 + 0.444 W_s, Btu/(lb·°F).
    pub cp_supply: f64,
    /// The temperature rises.
    pub rises: Rises,
    /// The fan.
    pub fan: FanResult,
    /// The 62.1 requirement.
    pub ventilation: VentilationResult,
    /// The 62.1 minimum V_ot, cfm.
    pub ventilation_required_cfm: f64,
    /// Outdoor air used, cfm at the outdoor design state.
    pub outdoor_airflow_cfm: f64,
    /// Outdoor dry-air mass flow m_oa, lb/h.
    pub outdoor_air_lb_h: f64,
    /// Outdoor-air fraction x = m_oa / m (by mass).
    pub outdoor_air_fraction: f64,
    /// By how much the outdoor air falls short of V_ot, cfm (0 when none).
    pub ventilation_shortfall_cfm: f64,
    /// The state points.
    pub states: States,
    /// The coil.
    pub coil: CoilResult,
    /// The capacity check.
    pub capacity: Capacity,
    /// The standard-air cross-check.
    pub standard_air: StandardAir,
    /// The served zones, in `serves` order.
    pub zones: Vec<ZoneFlow>,
    /// Passes of the iterations.
    pub iterations: Iterations,
}

impl CaseResult {
    /// The outdoor air is below the 62.1 minimum.
    pub fn ventilation_shortfall(&self) -> bool {
        self.outdoor_airflow_cfm < self.ventilation_required_cfm
    }
}

/// The fan as resolved from the design.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum FanInput {
    /// Shaft power, bhp.
    Power {
        /// Shaft power, bhp.
        bhp: f64,
    },
    /// Total static pressure, in. w.g., and fan efficiency.
    Static {
        /// Total static pressure, in. w.g.
        in_wg: f64,
        /// Fan efficiency, 0–1.
        efficiency: f64,
    },
    /// A rise given, °F.
    Rise {
        /// The rise.
        dt_f: f64,
    },
    /// Not described: the default rise, °F.
    Default {
        /// The rise.
        dt_f: f64,
    },
}

/// An air handler's inputs after defaults, in IP numbers.
#[derive(Clone, Debug, PartialEq)]
pub struct AhuInputs {
    /// The zones served, in `serves` order.
    pub zones: Vec<ZoneId>,
    /// Supply temperature t_s, °F.
    pub supply_temp_f: f64,
    /// Diversity d.
    pub diversity: f64,
    /// Supply duct rise, °F.
    pub supply_duct_rise_f: f64,
    /// Return duct rise, °F.
    pub return_duct_rise_f: f64,
    /// Return plenum gain, Btu/h.
    pub plenum_gain_btuh: f64,
    /// Outdoor air as given (or `Ventilation` by default).
    pub outdoor_air: OutdoorAir,
    /// 62.1 occupant diversity D.
    pub occupant_diversity: f64,
    /// 62.1 E_v procedure.
    pub ventilation_efficiency: VentilationEfficiency,
    /// Outdoor-air fan rise, °F.
    pub outdoor_fan_rise_f: f64,
    /// Fan arrangement.
    pub fan_arrangement: FanArrangement,
    /// Fan motor location.
    pub fan_motor: MotorLocation,
    /// The fan's heat source.
    pub fan: FanInput,
    /// Motor efficiency (used for a motor in the air stream with power or static).
    pub motor_efficiency: Option<f64>,
    /// Leaving-coil RH of a wet coil, 0–1.
    pub leaving_rh: f64,
    /// Rated total, Btu/h.
    pub rated_btuh: Option<f64>,
    /// Rated sensible, Btu/h.
    pub rated_sensible_btuh: Option<f64>,
    /// Chilled water supply and return, °F.
    pub chilled_water_f: Option<(f64, f64)>,
    /// Coil face area, ft².
    pub face_area_ft2: Option<f64>,
}

/// One air handler's results.
#[derive(Clone, Debug, PartialEq)]
pub struct AhuResult {
    /// Its name.
    pub name: String,
    /// Its inputs after defaults.
    pub inputs: AhuInputs,
    /// At the cooling design state.
    pub cooling: CaseResult,
    /// At the dehumidification design state, when the site gives one.
    pub dehumid: Option<CaseResult>,
    /// The case with the larger coil total (a tie goes to cooling).
    pub governing: DesignCase,
    /// Every default used for this air handler, its zones and the site.
    pub assumptions: Vec<Assumption>,
    /// Facts for the checks crate, each located.
    pub findings: Vec<Finding>,
}

impl AhuResult {
    /// The result of the governing case.
    pub fn governing(&self) -> &CaseResult {
        match (self.governing, &self.dehumid) {
            (DesignCase::Dehumid, Some(d)) => d,
            _ => &self.cooling,
        }
    }

    /// The result at a design case.
    pub fn case(&self, case: DesignCase) -> Option<&CaseResult> {
        match case {
            DesignCase::Cooling => Some(&self.cooling),
            DesignCase::Dehumid => self.dehumid.as_ref(),
        }
    }

    /// The capacity status of the governing case.
    pub fn status(&self) -> CapacityStatus {
        self.governing().capacity.status
    }
}

/// One air handler: its result, or why it has none.
#[derive(Clone, Debug, PartialEq)]
pub struct AhuOutcome {
    /// Index in [`plenum_model::Design::ahus`].
    pub index: usize,
    /// Its name.
    pub name: String,
    /// Its name in the source.
    pub loc: Loc,
    /// The result, or the error that leaves it out.
    pub result: Result<AhuResult, EngineError>,
}

/// Everything the engine computed for a design.
#[derive(Clone, Debug, PartialEq)]
pub struct Evaluation {
    /// The site, or why it is unusable.
    pub site: Result<SiteResult, EngineError>,
    /// Every zone of the design, in design order.
    pub zones: Vec<ZoneResult>,
    /// Every air handler, in design order.
    pub ahus: Vec<AhuOutcome>,
    /// Findings about the site and zone inputs (those of an air handler are
    /// in its [`AhuResult::findings`]).
    pub findings: Vec<Finding>,
}

impl Evaluation {
    /// Every finding: the design's, then each air handler's.
    pub fn all_findings(&self) -> impl Iterator<Item = &Finding> {
        self.findings.iter().chain(
            self.ahus
                .iter()
                .filter_map(|a| a.result.as_ref().ok())
                .flat_map(|r| r.findings.iter()),
        )
    }

    /// Every error: the site's, each zone's, each air handler's.
    pub fn all_errors(&self) -> impl Iterator<Item = &EngineError> {
        self.site
            .as_ref()
            .err()
            .into_iter()
            .chain(self.zones.iter().filter_map(|z| z.inputs.as_ref().err()))
            .chain(self.ahus.iter().filter_map(|a| a.result.as_ref().err()))
    }
}
