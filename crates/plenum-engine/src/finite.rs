//! The guard that no result carries NaN or infinity.
//!
//! Every result type lists each of its `f64` fields by exhaustive
//! destructuring (no `..`), so a field added later without being listed here
//! does not compile. The check runs in release builds too: it is an ordinary
//! test that returns an error, not a `debug_assert`.

use plenum_model::{Loc, OutdoorAir, VentilationEfficiency};

use crate::assumption::{AssumedValue, Assumption};
use crate::error::EngineError;
use crate::finding::{Finding, FindingKind};
use crate::result::{
    AhuInputs, AhuOutcome, AhuResult, Capacity, CaseResult, CoilResult, Evaluation, FanInput,
    FanResult, MultipleZone, PressureSource, Rises, SiteResult, StandardAir, StatePoint, States,
    VentilationResult, ZoneFlow, ZoneInputs, ZoneResult,
};

/// Visit every `f64` of a value, with the name of its field.
pub(crate) trait Floats {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64));
}

/// The first non-finite field of `value`, as an error located at `loc`.
pub(crate) fn ensure_finite<T: Floats>(value: &T, loc: Loc) -> Result<(), EngineError> {
    let mut bad: Option<&'static str> = None;
    value.floats(&mut |name, v| {
        if bad.is_none() && !v.is_finite() {
            bad = Some(name);
        }
    });
    match bad {
        Some(field) => Err(EngineError::NotFinite { field, loc }),
        None => Ok(()),
    }
}

impl Evaluation {
    /// The name of the first `f64` of the whole evaluation (site, zones, air
    /// handlers, findings and assumptions) that is NaN or infinite, or `None`
    /// when every number is finite. The same guard that checks each result
    /// before it is returned, applied to everything at once: for tests and
    /// fuzzing, which must not take the guard on trust.
    pub fn first_non_finite(&self) -> Option<&'static str> {
        let mut bad: Option<&'static str> = None;
        self.floats(&mut |name, v| {
            if bad.is_none() && !v.is_finite() {
                bad = Some(name);
            }
        });
        bad
    }
}

impl<T: Floats, E> Floats for Result<T, E> {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        if let Ok(v) = self {
            v.floats(f);
        }
    }
}

impl Floats for Evaluation {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let Evaluation {
            site,
            zones,
            ahus,
            findings,
        } = self;
        site.floats(f);
        zones.floats(f);
        ahus.floats(f);
        findings.floats(f);
    }
}

impl Floats for ZoneResult {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let ZoneResult {
            zone: _,
            name: _,
            loc: _,
            inputs,
            served_by: _,
            flow,
            assumptions,
        } = self;
        inputs.floats(f);
        flow.floats(f);
        assumptions.floats(f);
    }
}

impl Floats for AhuOutcome {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let AhuOutcome {
            index: _,
            name: _,
            loc: _,
            result,
        } = self;
        result.floats(f);
    }
}

fn opt(f: &mut dyn FnMut(&'static str, f64), name: &'static str, v: Option<f64>) {
    if let Some(v) = v {
        f(name, v);
    }
}

impl<T: Floats> Floats for Option<T> {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        if let Some(v) = self {
            v.floats(f);
        }
    }
}

impl<T: Floats> Floats for Vec<T> {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        for v in self {
            v.floats(f);
        }
    }
}

impl Floats for StatePoint {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let StatePoint {
            tdb_f,
            twb_f,
            tdp_f,
            w_lb_lb,
            h_btu_lb,
            rh_pct,
            v_ft3_lb,
        } = *self;
        f("state.tdb_f", tdb_f);
        f("state.twb_f", twb_f);
        f("state.tdp_f", tdp_f);
        f("state.w_lb_lb", w_lb_lb);
        f("state.h_btu_lb", h_btu_lb);
        f("state.rh_pct", rh_pct);
        f("state.v_ft3_lb", v_ft3_lb);
    }
}

impl Floats for AssumedValue {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        match *self {
            AssumedValue::LengthFt(v)
            | AssumedValue::TemperatureF(v)
            | AssumedValue::TemperatureDifferenceF(v)
            | AssumedValue::Ratio(v)
            | AssumedValue::Count(v)
            | AssumedValue::HeatBtuh(v) => f("assumption.value", v),
            AssumedValue::IndoorState { db_f, rh } => {
                f("assumption.db_f", db_f);
                f("assumption.rh", rh);
            }
            AssumedValue::BelowLowestRoom { dt_f, supply_f } => {
                f("assumption.dt_f", dt_f);
                f("assumption.supply_f", supply_f);
            }
            AssumedValue::RisePer100Ft { dt_f, rise_f } => {
                f("assumption.dt_f", dt_f);
                f("assumption.rise_f", rise_f);
            }
            AssumedValue::FanRise {
                dt_f,
                arrangement: _,
            } => f("assumption.dt_f", dt_f),
            AssumedValue::Keyword(_) => {}
        }
    }
}

impl Floats for Assumption {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        self.value.floats(f);
    }
}

impl Floats for Finding {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        match &self.kind {
            FindingKind::UnknownCategory { .. } | FindingKind::AreaMissingForVentilation { .. } => {
            }
            FindingKind::ElevationIgnored {
                elevation_ft,
                pressure_psia,
            } => {
                f("finding.elevation_ft", *elevation_ft);
                f("finding.pressure_psia", *pressure_psia);
            }
            FindingKind::MotorEfficiencyIgnored { motor_efficiency } => {
                f("finding.motor_efficiency", *motor_efficiency)
            }
            FindingKind::VentilationShortfall {
                provided_cfm,
                required_cfm,
            } => {
                f("finding.provided_cfm", *provided_cfm);
                f("finding.required_cfm", *required_cfm);
            }
            FindingKind::RoomAboveDesignHumidity {
                zone: _,
                room_w_lb_lb,
                design_w_lb_lb,
                room_rh_pct,
                design_rh_pct,
            } => {
                f("finding.room_w_lb_lb", *room_w_lb_lb);
                f("finding.design_w_lb_lb", *design_w_lb_lb);
                f("finding.room_rh_pct", *room_rh_pct);
                f("finding.design_rh_pct", *design_rh_pct);
            }
            FindingKind::RoomRhAboveLimit {
                zone: _,
                room_rh_pct,
                limit_pct,
            } => {
                f("finding.room_rh_pct", *room_rh_pct);
                f("finding.limit_pct", *limit_pct);
            }
            FindingKind::RoomRhOutsideComfort {
                zone: _,
                room_rh_pct,
                low_pct,
                high_pct,
            } => {
                f("finding.room_rh_pct", *room_rh_pct);
                f("finding.low_pct", *low_pct);
                f("finding.high_pct", *high_pct);
            }
            FindingKind::LeavingRhLow {
                leaving_rh_pct,
                min_pct,
            } => {
                f("finding.leaving_rh_pct", *leaving_rh_pct);
                f("finding.min_pct", *min_pct);
            }
            FindingKind::SupplyDtOutOfRange {
                zone: _,
                dt_f,
                min_f,
                max_f,
            } => {
                f("finding.dt_f", *dt_f);
                f("finding.min_f", *min_f);
                f("finding.max_f", *max_f);
            }
            FindingKind::CfmPerTonOutOfRange {
                cfm_per_ton,
                min,
                max,
            } => {
                f("finding.cfm_per_ton", *cfm_per_ton);
                f("finding.min", *min);
                f("finding.max", *max);
            }
            FindingKind::FaceVelocityHigh {
                face_velocity_fpm,
                limit_fpm,
            } => {
                f("finding.face_velocity_fpm", *face_velocity_fpm);
                f("finding.limit_fpm", *limit_fpm);
            }
            FindingKind::CoilCannotDehumidify {
                zone: _,
                leaving_dp_f,
                leaving_w_lb_lb,
                design_w_lb_lb,
                design_rh_pct,
            } => {
                f("finding.leaving_dp_f", *leaving_dp_f);
                f("finding.leaving_w_lb_lb", *leaving_w_lb_lb);
                f("finding.design_w_lb_lb", *design_w_lb_lb);
                f("finding.design_rh_pct", *design_rh_pct);
            }
            FindingKind::DryCoil { leaving_rh_pct } => f("finding.leaving_rh_pct", *leaving_rh_pct),
            FindingKind::Undersized {
                rated_btuh,
                required_btuh,
                rated_sensible_btuh,
                required_sensible_btuh,
            } => {
                opt(f, "finding.rated_btuh", *rated_btuh);
                f("finding.required_btuh", *required_btuh);
                opt(f, "finding.rated_sensible_btuh", *rated_sensible_btuh);
                f("finding.required_sensible_btuh", *required_sensible_btuh);
            }
            FindingKind::Oversized {
                rated_btuh,
                required_btuh,
                margin,
            } => {
                f("finding.rated_btuh", *rated_btuh);
                f("finding.required_btuh", *required_btuh);
                f("finding.margin", *margin);
            }
        }
    }
}

impl Floats for SiteResult {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let SiteResult {
            pressure_psia,
            pressure_source,
            cooling,
            dehumid,
            assumptions,
            loc: _,
        } = self;
        f("site.pressure_psia", *pressure_psia);
        if let PressureSource::Elevation { elevation_ft } = pressure_source {
            f("site.elevation_ft", *elevation_ft);
        }
        cooling.floats(f);
        dehumid.floats(f);
        assumptions.floats(f);
    }
}

impl Floats for ZoneInputs {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let ZoneInputs {
            indoor_tdb_f,
            indoor_w_lb_lb,
            sensible_btuh,
            latent_btuh,
            area_ft2,
            people,
            category: _,
            unknown_category: _,
            e_z,
        } = self;
        f("zone.indoor_tdb_f", *indoor_tdb_f);
        f("zone.indoor_w_lb_lb", *indoor_w_lb_lb);
        f("zone.sensible_btuh", *sensible_btuh);
        f("zone.latent_btuh", *latent_btuh);
        f("zone.area_ft2", *area_ft2);
        f("zone.people", *people);
        f("zone.e_z", *e_z);
    }
}

impl Floats for ZoneFlow {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let ZoneFlow {
            zone: _,
            name: _,
            supply_dt_f,
            design_airflow_lb_h,
            design_airflow_cfm,
            r_p_cfm_per_person,
            r_a_cfm_per_ft2,
            e_z,
            v_bz_cfm,
            v_oz_cfm,
            z_pz,
            e_vz,
            room_tdb_f,
            room_w_lb_lb,
            room_rh_pct,
            design_w_lb_lb,
            design_rh_pct,
            above_design_humidity: _,
        } = self;
        f("zone.supply_dt_f", *supply_dt_f);
        f("zone.design_airflow_lb_h", *design_airflow_lb_h);
        f("zone.design_airflow_cfm", *design_airflow_cfm);
        f("zone.r_p_cfm_per_person", *r_p_cfm_per_person);
        f("zone.r_a_cfm_per_ft2", *r_a_cfm_per_ft2);
        f("zone.e_z", *e_z);
        f("zone.v_bz_cfm", *v_bz_cfm);
        f("zone.v_oz_cfm", *v_oz_cfm);
        f("zone.z_pz", *z_pz);
        opt(f, "zone.e_vz", *e_vz);
        f("zone.room_tdb_f", *room_tdb_f);
        f("zone.room_w_lb_lb", *room_w_lb_lb);
        f("zone.room_rh_pct", *room_rh_pct);
        f("zone.design_w_lb_lb", *design_w_lb_lb);
        f("zone.design_rh_pct", *design_rh_pct);
    }
}

impl Floats for States {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let States {
            outdoor,
            outdoor_after_fan,
            return_air,
            mixed,
            entering,
            leaving,
            supply,
            room,
        } = self;
        outdoor.floats(f);
        outdoor_after_fan.floats(f);
        return_air.floats(f);
        mixed.floats(f);
        entering.floats(f);
        leaving.floats(f);
        supply.floats(f);
        room.floats(f);
    }
}

impl Floats for CaseResult {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let CaseResult {
            case: _,
            dry_air_flow_lb_h,
            supply_airflow_cfm,
            block_sensible_btuh,
            block_latent_btuh,
            cp_supply,
            rises,
            fan,
            ventilation,
            ventilation_required_cfm,
            outdoor_airflow_cfm,
            outdoor_air_lb_h,
            outdoor_air_fraction,
            ventilation_shortfall_cfm,
            states,
            coil,
            capacity,
            standard_air,
            zones,
            iterations: _,
        } = self;
        f("dry_air_flow_lb_h", *dry_air_flow_lb_h);
        f("supply_airflow_cfm", *supply_airflow_cfm);
        f("block_sensible_btuh", *block_sensible_btuh);
        f("block_latent_btuh", *block_latent_btuh);
        f("cp_supply", *cp_supply);
        let Rises {
            supply_duct_f,
            fan_f,
            return_duct_f,
            plenum_f,
            outdoor_fan_f,
        } = *rises;
        f("rises.supply_duct_f", supply_duct_f);
        f("rises.fan_f", fan_f);
        f("rises.return_duct_f", return_duct_f);
        f("rises.plenum_f", plenum_f);
        f("rises.outdoor_fan_f", outdoor_fan_f);
        let FanResult {
            arrangement: _,
            motor: _,
            source: _,
            shaft_power_bhp,
            heat_btuh,
            rise_f,
        } = *fan;
        opt(f, "fan.shaft_power_bhp", shaft_power_bhp);
        f("fan.heat_btuh", heat_btuh);
        f("fan.rise_f", rise_f);
        let VentilationResult {
            procedure: _,
            sum_v_oz_cfm,
            multiple_zone,
            v_ot_cfm,
        } = *ventilation;
        f("ventilation.sum_v_oz_cfm", sum_v_oz_cfm);
        f("ventilation.v_ot_cfm", v_ot_cfm);
        if let Some(MultipleZone {
            occupant_diversity,
            v_ou_cfm,
            v_ps_cfm,
            x_s,
            e_v_method: _,
            e_v,
        }) = multiple_zone
        {
            f("ventilation.occupant_diversity", occupant_diversity);
            f("ventilation.v_ou_cfm", v_ou_cfm);
            f("ventilation.v_ps_cfm", v_ps_cfm);
            f("ventilation.x_s", x_s);
            f("ventilation.e_v", e_v);
        }
        f("ventilation_required_cfm", *ventilation_required_cfm);
        f("outdoor_airflow_cfm", *outdoor_airflow_cfm);
        f("outdoor_air_lb_h", *outdoor_air_lb_h);
        f("outdoor_air_fraction", *outdoor_air_fraction);
        f("ventilation_shortfall_cfm", *ventilation_shortfall_cfm);
        states.floats(f);
        let CoilResult {
            dry: _,
            total_btuh,
            sensible_btuh,
            latent_btuh,
            tons,
            shr,
            adp_f,
            bypass_factor,
            condensate_lb_h,
            condensate_gal_h,
            chilled_water_gpm,
            face_velocity_fpm,
            cfm_per_ton,
        } = *coil;
        f("coil.total_btuh", total_btuh);
        f("coil.sensible_btuh", sensible_btuh);
        f("coil.latent_btuh", latent_btuh);
        f("coil.tons", tons);
        f("coil.shr", shr);
        f("coil.adp_f", adp_f);
        f("coil.bypass_factor", bypass_factor);
        f("coil.condensate_lb_h", condensate_lb_h);
        f("coil.condensate_gal_h", condensate_gal_h);
        opt(f, "coil.chilled_water_gpm", chilled_water_gpm);
        opt(f, "coil.face_velocity_fpm", face_velocity_fpm);
        f("coil.cfm_per_ton", cfm_per_ton);
        let Capacity {
            rated_btuh,
            rated_tons,
            rated_sensible_btuh,
            margin,
            sensible_margin,
            status: _,
        } = *capacity;
        opt(f, "capacity.rated_btuh", rated_btuh);
        opt(f, "capacity.rated_tons", rated_tons);
        opt(f, "capacity.rated_sensible_btuh", rated_sensible_btuh);
        opt(f, "capacity.margin", margin);
        opt(f, "capacity.sensible_margin", sensible_margin);
        let StandardAir {
            supply_airflow_cfm,
            supply_airflow_diff_pct,
            coil_total_btuh,
            coil_total_diff_pct,
        } = *standard_air;
        f("standard_air.supply_airflow_cfm", supply_airflow_cfm);
        f(
            "standard_air.supply_airflow_diff_pct",
            supply_airflow_diff_pct,
        );
        f("standard_air.coil_total_btuh", coil_total_btuh);
        f("standard_air.coil_total_diff_pct", coil_total_diff_pct);
        zones.floats(f);
    }
}

impl Floats for AhuInputs {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let AhuInputs {
            zones: _,
            supply_temp_f,
            diversity,
            supply_duct_rise_f,
            return_duct_rise_f,
            plenum_gain_btuh,
            outdoor_air,
            occupant_diversity,
            ventilation_efficiency,
            outdoor_fan_rise_f,
            fan_arrangement: _,
            fan_motor: _,
            fan,
            motor_efficiency,
            leaving_rh,
            rated_btuh,
            rated_sensible_btuh,
            chilled_water_f,
            face_area_ft2,
        } = self;
        f("inputs.supply_temp_f", *supply_temp_f);
        f("inputs.diversity", *diversity);
        f("inputs.supply_duct_rise_f", *supply_duct_rise_f);
        f("inputs.return_duct_rise_f", *return_duct_rise_f);
        f("inputs.plenum_gain_btuh", *plenum_gain_btuh);
        match *outdoor_air {
            OutdoorAir::Ventilation | OutdoorAir::All => {}
            OutdoorAir::Airflow { cfm } | OutdoorAir::PerPerson { cfm } => {
                f("inputs.outdoor_air", cfm)
            }
            OutdoorAir::FractionOfSupply { fraction } => f("inputs.outdoor_air", fraction),
            OutdoorAir::PerArea { cfm_per_ft2 } => f("inputs.outdoor_air", cfm_per_ft2),
        }
        if let VentilationEfficiency::Given { ev } = *ventilation_efficiency {
            f("inputs.ventilation_efficiency", ev);
        }
        f("inputs.occupant_diversity", *occupant_diversity);
        f("inputs.outdoor_fan_rise_f", *outdoor_fan_rise_f);
        match *fan {
            FanInput::Power { bhp } => f("inputs.fan.bhp", bhp),
            FanInput::Static { in_wg, efficiency } => {
                f("inputs.fan.in_wg", in_wg);
                f("inputs.fan.efficiency", efficiency);
            }
            FanInput::Rise { dt_f } | FanInput::Default { dt_f } => f("inputs.fan.dt_f", dt_f),
        }
        opt(f, "inputs.motor_efficiency", *motor_efficiency);
        f("inputs.leaving_rh", *leaving_rh);
        opt(f, "inputs.rated_btuh", *rated_btuh);
        opt(f, "inputs.rated_sensible_btuh", *rated_sensible_btuh);
        if let Some((ws, wr)) = chilled_water_f {
            f("inputs.chilled_water_supply_f", *ws);
            f("inputs.chilled_water_return_f", *wr);
        }
        opt(f, "inputs.face_area_ft2", *face_area_ft2);
    }
}

impl Floats for AhuResult {
    fn floats(&self, f: &mut dyn FnMut(&'static str, f64)) {
        let AhuResult {
            name: _,
            inputs,
            cooling,
            dehumid,
            governing: _,
            assumptions,
            findings,
        } = self;
        inputs.floats(f);
        cooling.floats(f);
        dehumid.floats(f);
        assumptions.floats(f);
        findings.floats(f);
    }
}
