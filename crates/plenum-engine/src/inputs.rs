//! From the typed design to resolved IP inputs: defaults applied (each one
//! recorded as an [`Assumption`]), every number checked against what the
//! method accepts.

use plenum_model::{
    Ahu, AirSpec, At, Design, FanArrangement, FanPower, Loc, MotorLocation, OutdoorAir, ReturnDuct,
    Site, SupplyDuct, SupplyTemp, VentilationEfficiency, Zone, ZoneId,
};
use plenum_psychro::{PsychroError, ip};

use crate::assumption::{AssumedValue, Assumption, Source, Subject};
use crate::error::{Allowed, EngineError, check};
use crate::finding::{Finding, FindingKind};
use crate::result::{
    AhuInputs, DesignCase, FanInput, Point, PressureSource, SiteResult, StatePoint, ZoneInputs,
};
use crate::ventilation::ventilation_category;

/// Default indoor state, 75 °F / 50 % RH (methods.md §3, *common practice*).
pub const DEFAULT_INDOOR: (f64, f64) = (75.0, 0.50);
/// Default supply ΔT below the lowest zone, °F (methods.md §4 step 1, *common practice*).
pub const DEFAULT_SUPPLY_DT_F: f64 = 18.0;
/// Supply duct rise per 100 ft, °F (methods.md §4 step 3, *common practice*).
pub const SUPPLY_DUCT_F_PER_100FT: f64 = 1.5;
/// Return duct rise per 100 ft, °F (methods.md §4 step 7, project default).
pub const RETURN_DUCT_F_PER_100FT: f64 = 1.0;
/// Duct rise when the length is not known, °F (methods.md §4 steps 3 and 7, *common practice*).
pub const UNKNOWN_DUCT_RISE_F: f64 = 3.0;
/// Fan rise when the fan is not described, °F (methods.md §4 step 4, *common practice*).
pub const DEFAULT_FAN_RISE_F: f64 = 2.0;
/// Motor efficiency when not given (keys.md, *common practice*).
pub const DEFAULT_MOTOR_EFFICIENCY: f64 = 0.90;
/// Leaving-coil RH of a wet coil (methods.md §4 step 5, *common practice*).
pub const DEFAULT_LEAVING_RH: f64 = 0.95;

/// A psychrometric state from an air spec as written (README choice 2).
pub(crate) fn spec_state(spec: &AirSpec, p: f64) -> Result<ip::State, PsychroError> {
    match *spec {
        AirSpec::DbWb { db_f, wb_f } => ip::State::from_db_wb(db_f, wb_f, p),
        AirSpec::DbRh { db_f, rh } => ip::State::from_db_rh(db_f, rh, p),
        AirSpec::DbDp { db_f, dp_f } => ip::State::from_db_dp(db_f, dp_f, p),
        AirSpec::DbW { db_f, w } => ip::State::from_db_w(db_f, w, p),
    }
}

/// A result state record from a psychrometric state.
pub(crate) fn record(s: &ip::State) -> StatePoint {
    StatePoint {
        tdb_f: s.dry_bulb(),
        twb_f: s.wet_bulb(),
        tdp_f: s.dew_point(),
        w_lb_lb: s.hum_ratio(),
        h_btu_lb: s.enthalpy(),
        rh_pct: s.rh_percent(),
        v_ft3_lb: s.specific_volume(),
    }
}

fn given<T: Copy>(v: &Option<At<T>>) -> Option<(T, Loc)> {
    v.as_ref().map(|a| (a.value, a.loc))
}

/// The place of a missing top-level block: the project block, or the start of the root file.
pub(crate) fn design_loc(design: &Design) -> Loc {
    design.project.loc.unwrap_or(Loc {
        file: plenum_model::FileId(0),
        span: Default::default(),
    })
}

/// Site pressure and outdoor design states (methods.md §1, README choices 1–2).
pub(crate) fn site(
    design: &Design,
    findings: &mut Vec<Finding>,
) -> Result<SiteResult, EngineError> {
    let Some(site) = design.site.as_ref() else {
        return Err(EngineError::NoSite {
            loc: design_loc(design),
        });
    };
    let Site {
        loc,
        elevation_ft,
        pressure_psia,
        cooling,
        dehumid,
    } = site;
    let loc = *loc;
    let mut assumptions = Vec::new();
    let (p, source) = match (given(pressure_psia), given(elevation_ft)) {
        (Some((p, ploc)), elev) => {
            let p = check("pressure", p, Allowed::Positive, ploc)?;
            if let Some((z, _)) = elev.filter(|(z, _)| z.is_finite()) {
                findings.push(Finding {
                    kind: FindingKind::ElevationIgnored {
                        elevation_ft: z,
                        pressure_psia: p,
                    },
                    case: None,
                    loc: ploc,
                });
            }
            (p, PressureSource::Given)
        }
        (None, Some((z, zloc))) => {
            let z = check("elevation", z, Allowed::Finite, zloc)?;
            let p = ip::standard_pressure(z).map_err(|error| EngineError::Psychro {
                point: Point::SitePressure,
                case: None,
                error,
                loc: zloc,
            })?;
            (p, PressureSource::Elevation { elevation_ft: z })
        }
        (None, None) => {
            assumptions.push(Assumption {
                subject: Subject::Site,
                key: "elevation",
                value: AssumedValue::LengthFt(0.0),
                source: Source::ProjectDefault,
                loc,
            });
            (ip::STANDARD_PRESSURE, PressureSource::SeaLevelAssumed)
        }
    };
    let Some(cooling) = cooling else {
        return Err(EngineError::MissingInput {
            key: "cooling",
            loc,
            zone: None,
        });
    };
    let outdoor = |spec: &At<AirSpec>, case| {
        spec_state(&spec.value, p)
            .map(|s| record(&s))
            .map_err(|error| EngineError::Psychro {
                point: Point::DesignOutdoor(case),
                case: Some(case),
                error,
                loc: spec.loc,
            })
    };
    let cooling = outdoor(cooling, DesignCase::Cooling)?;
    let dehumid = match dehumid {
        Some(d) => Some(outdoor(d, DesignCase::Dehumid)?),
        None => None,
    };
    Ok(SiteResult {
        pressure_psia: p,
        pressure_source: source,
        cooling,
        dehumid,
        assumptions,
        loc,
    })
}

/// A zone's inputs (methods.md §3, §4 step 8; README choice 15).
pub(crate) fn zone(
    z: &Zone,
    p: f64,
    assumptions: &mut Vec<Assumption>,
    findings: &mut Vec<Finding>,
) -> Result<ZoneInputs, EngineError> {
    let id = z.id;
    let assume = |assumptions: &mut Vec<Assumption>, key, value, source| {
        assumptions.push(Assumption {
            subject: Subject::Zone(id),
            key,
            value,
            source,
            loc: z.loc,
        })
    };
    let sensible = match given(&z.sensible_btuh) {
        Some((v, loc)) => check("sensible", v, Allowed::Positive, loc)?,
        None => {
            return Err(EngineError::MissingInput {
                key: "sensible",
                loc: z.loc,
                zone: Some(id),
            });
        }
    };
    let (t_r, w_design) = match &z.indoor {
        Some(spec) => {
            let s = spec_state(&spec.value, p).map_err(|error| EngineError::Psychro {
                point: Point::ZoneIndoor(id),
                case: None,
                error,
                loc: spec.loc,
            })?;
            (s.dry_bulb(), s.hum_ratio())
        }
        None => {
            let (t, rh) = DEFAULT_INDOOR;
            let w = ip::hum_ratio_from_rh(t, rh, p).map_err(|error| EngineError::Psychro {
                point: Point::ZoneIndoor(id),
                case: None,
                error,
                loc: z.loc,
            })?;
            assume(
                assumptions,
                "indoor",
                AssumedValue::IndoorState { db_f: t, rh },
                Source::CommonPractice,
            );
            (t, w)
        }
    };
    let latent = match given(&z.latent_btuh) {
        Some((v, loc)) => check("latent", v, Allowed::NonNegative, loc)?,
        None => {
            assume(
                assumptions,
                "latent",
                AssumedValue::HeatBtuh(0.0),
                Source::ProjectDefault,
            );
            0.0
        }
    };
    let people = match given(&z.people) {
        Some((v, loc)) => check("people", v, Allowed::NonNegative, loc)?,
        None => {
            assume(
                assumptions,
                "people",
                AssumedValue::Count(0.0),
                Source::ProjectDefault,
            );
            0.0
        }
    };
    let area = match given(&z.area_ft2) {
        Some((v, loc)) => Some(check("area", v, Allowed::NonNegative, loc)?),
        None => None,
    };
    let (category, unknown_category) = match &z.category {
        Some(c) => match ventilation_category(&c.value) {
            Some(cat) => (Some(cat), None),
            None => {
                findings.push(Finding {
                    kind: FindingKind::UnknownCategory {
                        zone: id,
                        written: c.value.clone(),
                    },
                    case: None,
                    loc: c.loc,
                });
                (None, Some(c.value.clone()))
            }
        },
        None => {
            assume(
                assumptions,
                "use",
                AssumedValue::Keyword("none"),
                Source::ProjectDefault,
            );
            (None, None)
        }
    };
    if let (Some(cat), None) = (category, area)
        && cat.r_a_cfm_per_ft2 > 0.0
    {
        findings.push(Finding {
            kind: FindingKind::AreaMissingForVentilation {
                zone: id,
                category: cat.name,
            },
            case: None,
            loc: z.name_loc,
        });
    }
    let e_z = match given(&z.distribution_effectiveness) {
        Some((v, loc)) => check("distribution_effectiveness", v, Allowed::Positive, loc)?,
        None => {
            assume(
                assumptions,
                "distribution_effectiveness",
                AssumedValue::Ratio(1.0),
                Source::Ashrae621FromMemory,
            );
            1.0
        }
    };
    Ok(ZoneInputs {
        indoor_tdb_f: t_r,
        indoor_w_lb_lb: w_design,
        sensible_btuh: sensible,
        latent_btuh: latent,
        area_ft2: area.unwrap_or(0.0),
        people,
        category,
        unknown_category,
        e_z,
    })
}

/// One served zone as the chain sees it.
#[derive(Clone, Debug)]
pub(crate) struct ZoneIn {
    pub id: ZoneId,
    pub name: String,
    pub loc: Loc,
    pub t_r: f64,
    pub w_design: f64,
    pub q_s: f64,
    pub q_l: f64,
    pub area: f64,
    pub people: f64,
    pub r_p: f64,
    pub r_a: f64,
    pub e_z: f64,
}

/// Where an air handler's keys were written (or the air handler, when defaulted).
#[derive(Clone, Copy, Debug)]
pub(crate) struct AhuLocs {
    pub ahu: Loc,
    pub supply: Loc,
    pub outdoor_air: Loc,
    pub leaving_rh: Loc,
    pub rated: Loc,
    pub face_area: Loc,
}

/// An air handler's resolved inputs with its zones.
#[derive(Clone, Debug)]
pub(crate) struct AhuIn {
    pub inputs: AhuInputs,
    pub zones: Vec<ZoneIn>,
    pub locs: AhuLocs,
}

impl AhuIn {
    pub fn single_zone(&self) -> bool {
        self.zones.len() == 1
    }
}

/// Resolve one air handler (methods.md §4, §4a; README choices 3, 6, 7, 11–16, 22).
pub(crate) fn ahu(
    index: usize,
    a: &Ahu,
    design: &Design,
    zone_inputs: &[Result<ZoneInputs, EngineError>],
    assumptions: &mut Vec<Assumption>,
    findings: &mut Vec<Finding>,
) -> Result<AhuIn, EngineError> {
    let aloc = a.name_loc;
    let assume = |assumptions: &mut Vec<Assumption>, key, value, source| {
        assumptions.push(Assumption {
            subject: Subject::Ahu(index),
            key,
            value,
            source,
            loc: a.loc,
        })
    };
    if a.serves.is_empty() {
        return Err(EngineError::MissingInput {
            key: "serves",
            loc: a.loc,
            zone: None,
        });
    }
    let mut zones: Vec<ZoneIn> = Vec::with_capacity(a.serves.len());
    let mut ids = Vec::with_capacity(a.serves.len());
    for s in &a.serves {
        let id = s.value;
        let (Some(z), Some(zin)) = (design.zone(id), zone_inputs.get(id.0 as usize)) else {
            return Err(EngineError::UnknownZone { loc: s.loc });
        };
        if ids.contains(&id) {
            return Err(EngineError::ZoneServedTwice {
                zone: id,
                loc: s.loc,
            });
        }
        let Ok(zin) = zin else {
            return Err(EngineError::ZoneUnusable {
                zone: id,
                loc: s.loc,
            });
        };
        if let Some(written) = &zin.unknown_category {
            let loc = z.category.as_ref().map_or(z.name_loc, |c| c.loc);
            return Err(EngineError::UnknownCategory {
                zone: id,
                written: written.clone(),
                loc,
            });
        }
        ids.push(id);
        zones.push(ZoneIn {
            id,
            name: z.name.clone(),
            loc: z.name_loc,
            t_r: zin.indoor_tdb_f,
            w_design: zin.indoor_w_lb_lb,
            q_s: zin.sensible_btuh,
            q_l: zin.latent_btuh,
            area: zin.area_ft2,
            people: zin.people,
            r_p: zin.category.map_or(0.0, |c| c.r_p_cfm_per_person),
            r_a: zin.category.map_or(0.0, |c| c.r_a_cfm_per_ft2),
            e_z: zin.e_z,
        });
    }
    let tr_min = zones.iter().map(|z| z.t_r).fold(f64::INFINITY, f64::min);
    // Step 1 and §4a: supply temperature (README choice 3).
    let (t_s, supply_loc) = match given(&a.supply) {
        Some((SupplyTemp::Temp { f }, loc)) => {
            (check("supply_temp", f, Allowed::Finite, loc)?, loc)
        }
        Some((SupplyTemp::BelowRoom { dt_f }, loc)) => (
            tr_min - check("supply_dt", dt_f, Allowed::Positive, loc)?,
            loc,
        ),
        None => {
            let t_s = tr_min - DEFAULT_SUPPLY_DT_F;
            assume(
                assumptions,
                "supply_temp",
                AssumedValue::BelowLowestRoom {
                    dt_f: DEFAULT_SUPPLY_DT_F,
                    supply_f: t_s,
                },
                Source::CommonPractice,
            );
            (t_s, aloc)
        }
    };
    for z in &zones {
        if z.t_r - t_s <= 0.0 {
            return Err(EngineError::SupplyNotBelowRoom {
                zone: z.id,
                supply_f: t_s,
                room_f: z.t_r,
                loc: supply_loc,
            });
        }
    }
    let diversity = match given(&a.diversity) {
        Some((d, loc)) => check("diversity", d, Allowed::Positive, loc)?,
        None => {
            assume(
                assumptions,
                "diversity",
                AssumedValue::Ratio(1.0),
                Source::ProjectDefault,
            );
            1.0
        }
    };
    // Step 3: supply duct rise.
    let dt_sd = match given(&a.supply_duct) {
        Some((SupplyDuct::Length { ft }, loc)) => {
            let rise = check("supply_duct", ft, Allowed::NonNegative, loc)?
                * SUPPLY_DUCT_F_PER_100FT
                / 100.0;
            assume(
                assumptions,
                "supply_duct",
                AssumedValue::RisePer100Ft {
                    dt_f: SUPPLY_DUCT_F_PER_100FT,
                    rise_f: rise,
                },
                Source::CommonPractice,
            );
            rise
        }
        Some((SupplyDuct::Rise { dt_f }, loc)) => {
            check("supply_duct_rise", dt_f, Allowed::NonNegative, loc)?
        }
        None => {
            assume(
                assumptions,
                "supply_duct",
                AssumedValue::TemperatureDifferenceF(UNKNOWN_DUCT_RISE_F),
                Source::CommonPractice,
            );
            UNKNOWN_DUCT_RISE_F
        }
    };
    // Step 7: return duct rise (README choice 11).
    let dt_rd = match given(&a.return_duct) {
        Some((ReturnDuct::Length { ft }, loc)) => {
            let rise = check("return_duct", ft, Allowed::NonNegative, loc)?
                * RETURN_DUCT_F_PER_100FT
                / 100.0;
            assume(
                assumptions,
                "return_duct",
                AssumedValue::RisePer100Ft {
                    dt_f: RETURN_DUCT_F_PER_100FT,
                    rise_f: rise,
                },
                Source::ProjectDefault,
            );
            rise
        }
        Some((ReturnDuct::Rise { dt_f }, loc)) => {
            check("return_duct_rise", dt_f, Allowed::NonNegative, loc)?
        }
        Some((ReturnDuct::None, _)) => 0.0,
        None => {
            assume(
                assumptions,
                "return_duct",
                AssumedValue::TemperatureDifferenceF(UNKNOWN_DUCT_RISE_F),
                Source::CommonPractice,
            );
            UNKNOWN_DUCT_RISE_F
        }
    };
    let q_pl = match given(&a.plenum_gain_btuh) {
        Some((q, loc)) => check("plenum_gain", q, Allowed::NonNegative, loc)?,
        None => 0.0,
    };
    // Step 8: outdoor air form (README choices 12–13).
    let (outdoor_air, oa_loc) = match given(&a.outdoor_air) {
        Some((oa, loc)) => {
            match oa {
                OutdoorAir::Ventilation | OutdoorAir::All => {}
                OutdoorAir::Airflow { cfm } => {
                    check("outdoor_air", cfm, Allowed::NonNegative, loc)?;
                }
                OutdoorAir::FractionOfSupply { fraction } => {
                    check("outdoor_air", fraction, Allowed::Fraction, loc)?;
                }
                OutdoorAir::PerPerson { cfm } => {
                    check("outdoor_air", cfm, Allowed::NonNegative, loc)?;
                }
                OutdoorAir::PerArea { cfm_per_ft2 } => {
                    check("outdoor_air", cfm_per_ft2, Allowed::NonNegative, loc)?;
                }
            }
            (oa, loc)
        }
        None => {
            assume(
                assumptions,
                "outdoor_air",
                AssumedValue::Keyword("ventilation"),
                Source::ProjectDefault,
            );
            (OutdoorAir::Ventilation, aloc)
        }
    };
    let multiple_zone = zones.len() > 1 && outdoor_air != OutdoorAir::All;
    let occupant_diversity = match given(&a.occupant_diversity) {
        Some((d, loc)) => check("occupant_diversity", d, Allowed::Fraction, loc)?,
        None => {
            if multiple_zone {
                assume(
                    assumptions,
                    "occupant_diversity",
                    AssumedValue::Ratio(1.0),
                    Source::ProjectDefault,
                );
            }
            1.0
        }
    };
    let ventilation_efficiency = match given(&a.ventilation_efficiency) {
        Some((VentilationEfficiency::Given { ev }, loc)) => {
            check("ventilation_efficiency", ev, Allowed::Positive, loc)?;
            VentilationEfficiency::Given { ev }
        }
        Some((v, _)) => v,
        None => {
            if multiple_zone {
                assume(
                    assumptions,
                    "ventilation_efficiency",
                    AssumedValue::Keyword("simplified"),
                    Source::ProjectDefault,
                );
            }
            VentilationEfficiency::Simplified
        }
    };
    let outdoor_fan_rise = match given(&a.outdoor_fan_rise_f) {
        Some((v, loc)) => check("outdoor_fan_rise", v, Allowed::NonNegative, loc)?,
        None => 0.0,
    };
    // Step 4: the fan (README choices 6–7).
    let (arrangement, motor, fan, motor_efficiency) = match &a.fan {
        None => {
            assume(
                assumptions,
                "fan",
                AssumedValue::FanRise {
                    dt_f: DEFAULT_FAN_RISE_F,
                    arrangement: FanArrangement::DrawThrough,
                },
                Source::CommonPractice,
            );
            (
                FanArrangement::DrawThrough,
                MotorLocation::InAirstream,
                FanInput::Default {
                    dt_f: DEFAULT_FAN_RISE_F,
                },
                None,
            )
        }
        Some(f) => {
            let assume_fan = |assumptions: &mut Vec<Assumption>, key, value, source| {
                assumptions.push(Assumption {
                    subject: Subject::Ahu(index),
                    key,
                    value,
                    source,
                    loc: f.loc,
                })
            };
            let arrangement = match given(&f.arrangement) {
                Some((v, _)) => v,
                None => {
                    assume_fan(
                        assumptions,
                        "arrangement",
                        AssumedValue::Keyword("draw_through"),
                        Source::ProjectDefault,
                    );
                    FanArrangement::DrawThrough
                }
            };
            let fan = match (given(&f.power), given(&f.rise_f)) {
                (Some((power, _)), Some((_, rloc))) => {
                    let first = match power {
                        FanPower::Shaft { .. } => "power",
                        FanPower::Static { .. } => "static",
                    };
                    return Err(EngineError::ConflictingInputs {
                        first,
                        second: "rise",
                        loc: rloc,
                    });
                }
                (Some((FanPower::Shaft { hp }, loc)), None) => FanInput::Power {
                    bhp: check("power", hp, Allowed::NonNegative, loc)?,
                },
                (Some((FanPower::Static { in_wg, efficiency }, loc)), None) => FanInput::Static {
                    in_wg: check("static", in_wg, Allowed::NonNegative, loc)?,
                    efficiency: check("efficiency", efficiency, Allowed::PositiveFraction, loc)?,
                },
                (None, Some((dt, loc))) => FanInput::Rise {
                    dt_f: check("rise", dt, Allowed::NonNegative, loc)?,
                },
                (None, None) => {
                    assume_fan(
                        assumptions,
                        "rise",
                        AssumedValue::FanRise {
                            dt_f: DEFAULT_FAN_RISE_F,
                            arrangement,
                        },
                        Source::CommonPractice,
                    );
                    FanInput::Default {
                        dt_f: DEFAULT_FAN_RISE_F,
                    }
                }
            };
            let from_power = matches!(fan, FanInput::Power { .. } | FanInput::Static { .. });
            let motor = match given(&f.motor) {
                Some((m, _)) => m,
                None => {
                    if from_power {
                        assume_fan(
                            assumptions,
                            "motor",
                            AssumedValue::Keyword("in_airstream"),
                            Source::ProjectDefault,
                        );
                    }
                    MotorLocation::InAirstream
                }
            };
            let motor_efficiency = match (from_power, motor, given(&f.motor_efficiency)) {
                (true, MotorLocation::InAirstream, Some((e, loc))) => Some(check(
                    "motor_efficiency",
                    e,
                    Allowed::PositiveFraction,
                    loc,
                )?),
                (true, MotorLocation::InAirstream, None) => {
                    assume_fan(
                        assumptions,
                        "motor_efficiency",
                        AssumedValue::Ratio(DEFAULT_MOTOR_EFFICIENCY),
                        Source::CommonPractice,
                    );
                    Some(DEFAULT_MOTOR_EFFICIENCY)
                }
                (_, MotorLocation::Outside, Some((e, loc))) => {
                    findings.push(Finding {
                        kind: FindingKind::MotorEfficiencyIgnored {
                            motor_efficiency: e,
                        },
                        case: None,
                        loc,
                    });
                    None
                }
                _ => None,
            };
            (arrangement, motor, fan, motor_efficiency)
        }
    };
    // The coil block (README choices 22–23).
    let mut locs = AhuLocs {
        ahu: aloc,
        supply: supply_loc,
        outdoor_air: oa_loc,
        leaving_rh: aloc,
        rated: aloc,
        face_area: aloc,
    };
    let mut leaving_rh = None;
    let mut rated = None;
    let mut rated_sensible = None;
    let mut chilled_water = None;
    let mut face_area = None;
    if let Some(c) = &a.coil {
        locs.leaving_rh = c.loc;
        locs.rated = c.loc;
        locs.face_area = c.loc;
        if let Some((v, loc)) = given(&c.leaving_rh) {
            leaving_rh = Some(check("leaving_rh", v, Allowed::PositiveFraction, loc)?);
            locs.leaving_rh = loc;
        }
        if let Some((v, loc)) = given(&c.rated_btuh) {
            rated = Some(check("rated", v, Allowed::Positive, loc)?);
            locs.rated = loc;
        }
        if let Some((v, loc)) = given(&c.rated_sensible_btuh) {
            rated_sensible = Some(check("rated_sensible", v, Allowed::Positive, loc)?);
            if rated.is_none() {
                locs.rated = loc;
            }
        }
        if let Some(((ws, wr), loc)) = given(&c.chilled_water) {
            check("chilled_water", ws, Allowed::Finite, loc)?;
            check("chilled_water", wr, Allowed::Finite, loc)?;
            check("chilled_water", wr - ws, Allowed::Positive, loc)?;
            chilled_water = Some((ws, wr));
        }
        if let Some((v, loc)) = given(&c.face_area_ft2) {
            face_area = Some(check("face_area", v, Allowed::Positive, loc)?);
            locs.face_area = loc;
        }
    }
    let leaving_rh = match leaving_rh {
        Some(v) => v,
        None => {
            assumptions.push(Assumption {
                subject: Subject::Ahu(index),
                key: "leaving_rh",
                value: AssumedValue::Ratio(DEFAULT_LEAVING_RH),
                source: Source::CommonPractice,
                loc: a.coil.as_ref().map_or(a.loc, |c| c.loc),
            });
            DEFAULT_LEAVING_RH
        }
    };
    Ok(AhuIn {
        inputs: AhuInputs {
            zones: ids,
            supply_temp_f: t_s,
            diversity,
            supply_duct_rise_f: dt_sd,
            return_duct_rise_f: dt_rd,
            plenum_gain_btuh: q_pl,
            outdoor_air,
            occupant_diversity,
            ventilation_efficiency,
            outdoor_fan_rise_f: outdoor_fan_rise,
            fan_arrangement: arrangement,
            fan_motor: motor,
            fan,
            motor_efficiency,
            leaving_rh,
            rated_btuh: rated,
            rated_sensible_btuh: rated_sensible,
            chilled_water_f: chilled_water,
            face_area_ft2: face_area,
        },
        zones,
        locs,
    })
}
