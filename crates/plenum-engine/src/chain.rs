//! The air-side chain of one air handler at one design case: methods.md §4
//! steps 2–12 with the §4a conventions and the reference README's choices
//! 4–26 (numbers in the comments).

use plenum_model::{FanArrangement, MotorLocation, OutdoorAir, VentilationEfficiency};
use plenum_psychro::{PsychroError, ip};

use crate::error::{EngineError, Iteration};
use crate::finding::{
    CFM_PER_TON_RANGE, FACE_VELOCITY_LIMIT_FPM, Finding, FindingKind, LEAVING_RH_MIN_PCT,
    OVERSIZE_MARGIN, ROOM_RH_COMFORT_PCT, ROOM_RH_LIMIT_PCT,
};
use crate::inputs::{AhuIn, record};
use crate::result::{
    Capacity, CapacityStatus, CaseResult, CoilResult, DesignCase, EvMethod, FanInput, FanResult,
    FanSource, Iterations, MultipleZone, Point, Rises, StandardAir, StatePoint, States,
    VentilationProcedure, VentilationResult, ZoneFlow,
};
use crate::ventilation::{breathing_zone_cfm, simplified_ev};

/// Specific heat of dry air in the IP enthalpy equation, Btu/(lb·°F) (Fundamentals ch. 1 eq. 30).
pub const CP_DRY_AIR: f64 = 0.240;
/// Specific heat of water vapour in the IP enthalpy equation, Btu/(lb·°F) (Fundamentals ch. 1 eq. 30).
pub const CP_VAPOUR: f64 = 0.444;
/// Enthalpy of water vapour at 0 °F, Btu/lb (Fundamentals ch. 1 eq. 30).
pub const H_G0: f64 = 1061.0;
/// 1 hp = 2544.43 Btu/h (NIST SP 811).
pub const BTUH_PER_HP: f64 = 2544.43;
/// Fan power from airflow and static pressure: P = cfm·Δp/(6356 η) (*common practice*).
pub const FAN_CONSTANT: f64 = 6356.0;
/// Condensate density, lb/gal (methods.md §4 step 10).
pub const LB_PER_GAL: f64 = 8.34;
/// Chilled-water factor, gpm = Q/(500 Δt) (*common practice*, water at about 60 °F).
pub const CHW_FACTOR: f64 = 500.0;
/// Btu/h per ton of refrigeration.
pub const BTUH_PER_TON: f64 = 12_000.0;
/// Standard-air sensible factor, Btu/(h·cfm·°F) (*common practice*, 0.075 lb/ft³).
pub const STD_SENSIBLE: f64 = 1.08;
/// Standard-air total factor, (lb·min)/(ft³·h) (*common practice*, 0.075 lb/ft³).
pub const STD_TOTAL: f64 = 4.5;

/// Relative tolerance of the airflow loop (methods.md §4 step 5).
pub const AIRFLOW_TOL: f64 = 1e-9;
/// Absolute tolerance of the dry-coil fixed point on W_s, lb/lb (methods.md §4 step 10).
pub const DRY_COIL_TOL: f64 = 1e-12;
/// Apparatus-dew-point bisection tolerance, °F (README choice 21).
pub const ADP_TOL_F: f64 = 1e-9;
/// Bound on the airflow loop's passes.
pub const MAX_AIRFLOW_PASSES: u32 = 200;
/// Bound on the dry-coil fixed point's passes (each shrinks the error by 1 − x).
pub const MAX_DRY_PASSES: u32 = 100_000;
/// Bound on the apparatus-dew-point bisection.
const MAX_ADP_STEPS: u32 = 200;
/// Lowest temperature searched for the apparatus dew point, °F (README choice 21).
const ADP_FLOOR_F: f64 = -100.0;

/// c_p = 0.240 + 0.444 W, Btu/(lb dry air·°F) (methods.md §2, §4a).
pub fn cp_moist(w: f64) -> f64 {
    CP_DRY_AIR + CP_VAPOUR * w
}

/// h = 0.240 t + W (1061 + 0.444 t), Btu/lb dry air (methods.md §2).
pub fn enthalpy(t: f64, w: f64) -> f64 {
    CP_DRY_AIR * t + w * (H_G0 + CP_VAPOUR * t)
}

/// h_g = 1061 + 0.444 t, Btu/lb (methods.md §4 step 6).
pub fn h_g(t: f64) -> f64 {
    H_G0 + CP_VAPOUR * t
}

/// The solved airflow loop (steps 2–5).
#[derive(Clone, Debug)]
pub(crate) struct Flow {
    pub w_s: f64,
    pub cp: f64,
    pub m_z: Vec<f64>,
    pub m: f64,
    pub v_s: f64,
    pub cfm_s: f64,
    pub bhp: Option<f64>,
    pub q_f: f64,
    pub dt_f: f64,
    pub t_off: f64,
    pub passes: u32,
}

/// Steps 6–9 for a solved airflow.
#[derive(Clone, Debug)]
pub(crate) struct Chain {
    pub t_room: f64,
    pub w_room: f64,
    pub q_l: f64,
    pub dt_pl: f64,
    pub t_ret: f64,
    pub w_ret: f64,
    pub vent: Vent,
    pub m_oa: f64,
    pub cfm_oa: f64,
    pub x: f64,
    pub t_o_mix: f64,
    pub t_mix: f64,
    pub w_mix: f64,
    pub t_on: f64,
    pub w_on: f64,
}

#[derive(Clone, Debug)]
pub(crate) struct ZoneVent {
    pub vbz: f64,
    pub voz: f64,
    pub vpz: f64,
    pub zpz: f64,
    pub evz: Option<f64>,
}

#[derive(Clone, Debug)]
pub(crate) struct Vent {
    pub zones: Vec<ZoneVent>,
    pub result: VentilationResult,
}

struct Ctx<'a> {
    a: &'a AhuIn,
    p: f64,
    case: DesignCase,
    out_t: f64,
    out_w: f64,
}

impl Ctx<'_> {
    fn psy<T>(&self, point: Point, r: Result<T, PsychroError>) -> Result<T, EngineError> {
        r.map_err(|error| EngineError::Psychro {
            point,
            case: Some(self.case),
            error,
            loc: self.a.locs.ahu,
        })
    }

    fn state(&self, point: Point, t: f64, w: f64) -> Result<StatePoint, EngineError> {
        self.psy(point, ip::State::from_db_w(t, w, self.p))
            .map(|s| record(&s))
    }

    fn leaving_w(&self, t_off: f64) -> Result<f64, EngineError> {
        self.psy(
            Point::Leaving,
            ip::hum_ratio_from_rh(t_off, self.a.inputs.leaving_rh, self.p),
        )
    }

    fn flow_not_finite(&self, field: &'static str) -> EngineError {
        EngineError::NotFinite {
            field,
            loc: self.a.locs.ahu,
        }
    }

    /// Steps 2–5: iterate m, c_p, the fan rise and (wet coil) W_off until m
    /// changes by at most 1e-9 relative (README choice 5). With `w_fixed`
    /// (dry coil) W_s is held.
    fn airflow(&self, w_fixed: Option<f64>) -> Result<Flow, EngineError> {
        let inp = &self.a.inputs;
        let t_s = inp.supply_temp_f;
        let mut w_s = match w_fixed {
            Some(w) => w,
            // Starting guess only: W at t_s − Δt_sd − 2 °F and the leaving RH.
            None => self.leaving_w(t_s - inp.supply_duct_rise_f - 2.0)?,
        };
        let mut m_prev: Option<f64> = None;
        for pass in 1..=MAX_AIRFLOW_PASSES {
            let cp = cp_moist(w_s);
            // Step 2 (choice 4): zone flows from undiversified loads, system m = d Σ m_z.
            let m_z: Vec<f64> = self
                .a
                .zones
                .iter()
                .map(|z| z.q_s / (cp * (z.t_r - t_s)))
                .collect();
            let m = inp.diversity * m_z.iter().sum::<f64>();
            if !(m.is_finite() && m > 0.0) {
                return Err(self.flow_not_finite("dry_air_flow_lb_h"));
            }
            let v_s = self.psy(Point::Supply, ip::specific_volume(t_s, w_s, self.p))?;
            let cfm_s = m * v_s / 60.0;
            // Step 4 (choices 6–7): fan heat and rise, c_p at W_s for both arrangements.
            let (bhp, q_f, dt_f) = match inp.fan {
                FanInput::Power { bhp } => {
                    let q = self.fan_heat(bhp);
                    (Some(bhp), q, q / (m * cp))
                }
                FanInput::Static { in_wg, efficiency } => {
                    let bhp = cfm_s * in_wg / (FAN_CONSTANT * efficiency);
                    let q = self.fan_heat(bhp);
                    (Some(bhp), q, q / (m * cp))
                }
                FanInput::Rise { dt_f } | FanInput::Default { dt_f } => (None, m * cp * dt_f, dt_f),
            };
            // Step 5: leaving-coil dry bulb.
            let t_off = match inp.fan_arrangement {
                FanArrangement::DrawThrough => t_s - inp.supply_duct_rise_f - dt_f,
                FanArrangement::BlowThrough => t_s - inp.supply_duct_rise_f,
            };
            if let Some(prev) = m_prev
                && (m - prev).abs() <= AIRFLOW_TOL * m
            {
                return Ok(Flow {
                    w_s,
                    cp,
                    m_z,
                    m,
                    v_s,
                    cfm_s,
                    bhp,
                    q_f,
                    dt_f,
                    t_off,
                    passes: pass,
                });
            }
            m_prev = Some(m);
            if w_fixed.is_none() {
                // Wet coil: W_s = W_off = W(t_off, φ_off) (steps 2 and 5).
                w_s = self.leaving_w(t_off)?;
            }
        }
        Err(EngineError::NoConvergence {
            iteration: Iteration::Airflow,
            passes: MAX_AIRFLOW_PASSES,
            case: Some(self.case),
            loc: self.a.locs.ahu,
        })
    }

    /// Fan heat from shaft power (step 4, choice 7): 2544.43 P / η_m in the
    /// air stream, 2544.43 P outside it.
    fn fan_heat(&self, bhp: f64) -> f64 {
        match (self.a.inputs.fan_motor, self.a.inputs.motor_efficiency) {
            (MotorLocation::InAirstream, Some(eta)) => BTUH_PER_HP * bhp / eta,
            _ => BTUH_PER_HP * bhp,
        }
    }

    /// Step 8: the 62.1 ventilation rate procedure (choices 15–16).
    fn ventilation(&self, flow: &Flow) -> Result<Vent, EngineError> {
        let inp = &self.a.inputs;
        let mut zones = Vec::with_capacity(self.a.zones.len());
        let (mut sum_rp_p, mut sum_ra_a, mut sum_voz) = (0.0, 0.0, 0.0);
        for (z, &mz) in self.a.zones.iter().zip(&flow.m_z) {
            let vbz = breathing_zone_cfm(z.r_p, z.people, z.r_a, z.area);
            let voz = vbz / z.e_z;
            let vpz = mz * flow.v_s / 60.0;
            sum_rp_p += z.r_p * z.people;
            sum_ra_a += z.r_a * z.area;
            sum_voz += voz;
            zones.push(ZoneVent {
                vbz,
                voz,
                vpz,
                zpz: voz / vpz,
                evz: None,
            });
        }
        let result = if inp.outdoor_air == OutdoorAir::All {
            VentilationResult {
                procedure: VentilationProcedure::AllOutdoorAir,
                sum_v_oz_cfm: sum_voz,
                multiple_zone: None,
                v_ot_cfm: sum_voz,
            }
        } else if self.a.single_zone() {
            VentilationResult {
                procedure: VentilationProcedure::SingleZone,
                sum_v_oz_cfm: sum_voz,
                multiple_zone: None,
                v_ot_cfm: zones.first().map_or(0.0, |z| z.voz),
            }
        } else {
            let d = inp.occupant_diversity;
            let v_ou = d * sum_rp_p + sum_ra_a;
            let v_ps = flow.cfm_s;
            let x_s = v_ou / v_ps;
            for zv in &mut zones {
                zv.evz = Some(1.0 + x_s - zv.zpz);
            }
            let (method, e_v) = match inp.ventilation_efficiency {
                VentilationEfficiency::Simplified => (EvMethod::Simplified, simplified_ev(d)),
                VentilationEfficiency::Calculated => (
                    EvMethod::Calculated,
                    zones
                        .iter()
                        .filter_map(|z| z.evz)
                        .fold(f64::INFINITY, f64::min),
                ),
                VentilationEfficiency::Given { ev } => (EvMethod::Given, ev),
            };
            if !(e_v.is_finite() && e_v > 0.0) {
                return Err(EngineError::InvalidInput {
                    key: "ventilation_efficiency",
                    value: e_v,
                    allowed: crate::error::Allowed::Positive,
                    loc: self.a.locs.ahu,
                });
            }
            VentilationResult {
                procedure: VentilationProcedure::MultipleZone,
                sum_v_oz_cfm: sum_voz,
                multiple_zone: Some(MultipleZone {
                    occupant_diversity: d,
                    v_ou_cfm: v_ou,
                    v_ps_cfm: v_ps,
                    x_s,
                    e_v_method: method,
                    e_v,
                }),
                v_ot_cfm: v_ou / e_v,
            }
        };
        Ok(Vent { zones, result })
    }

    /// Steps 6–9 (choices 9, 11–14, 18): room, return, outdoor air, mixed, entering.
    fn chain(&self, flow: &Flow) -> Result<Chain, EngineError> {
        let inp = &self.a.inputs;
        let m = flow.m;
        // §4a, choice 9: room dry bulb = m_z-weighted mean t_r.
        let sum_mz: f64 = flow.m_z.iter().sum();
        let t_room = self
            .a
            .zones
            .iter()
            .zip(&flow.m_z)
            .map(|(z, mz)| z.t_r * mz)
            .sum::<f64>()
            / sum_mz;
        let q_l = inp.diversity * self.a.zones.iter().map(|z| z.q_l).sum::<f64>();
        // Step 6.
        let w_room = flow.w_s + q_l / (m * h_g(t_room));
        // Step 7, choice 11: plenum rise with c_p at the room humidity ratio.
        let dt_pl = inp.plenum_gain_btuh / (m * cp_moist(w_room));
        let t_ret = t_room + inp.return_duct_rise_f + dt_pl;
        let w_ret = w_room;
        let vent = self.ventilation(flow)?;
        // Step 8, choice 12: airflows at the outdoor design state.
        let v_o = self.psy(
            Point::Outdoor,
            ip::specific_volume(self.out_t, self.out_w, self.p),
        )?;
        let people: f64 = self.a.zones.iter().map(|z| z.people).sum();
        let area: f64 = self.a.zones.iter().map(|z| z.area).sum();
        let m_oa = match inp.outdoor_air {
            OutdoorAir::All => m,
            OutdoorAir::FractionOfSupply { fraction } => fraction * m,
            OutdoorAir::Ventilation => vent.result.v_ot_cfm * 60.0 / v_o,
            OutdoorAir::Airflow { cfm } => cfm * 60.0 / v_o,
            OutdoorAir::PerPerson { cfm } => cfm * people * 60.0 / v_o,
            OutdoorAir::PerArea { cfm_per_ft2 } => cfm_per_ft2 * area * 60.0 / v_o,
        };
        let x = if inp.outdoor_air == OutdoorAir::All {
            1.0
        } else {
            m_oa / m
        };
        let cfm_oa = m_oa * v_o / 60.0;
        if x > 1.0 {
            return Err(EngineError::OutdoorAirExceedsSupply {
                case: self.case,
                fraction: x,
                outdoor_cfm: cfm_oa,
                supply_cfm: flow.cfm_s,
                loc: self.a.locs.outdoor_air,
            });
        }
        // Step 9, choices 14 and 18: mixing by mass and energy.
        let t_o_mix = self.out_t + inp.outdoor_fan_rise_f;
        let h_o = enthalpy(t_o_mix, self.out_w);
        let h_ret = enthalpy(t_ret, w_ret);
        let w_mix = x * self.out_w + (1.0 - x) * w_ret;
        let h_mix = x * h_o + (1.0 - x) * h_ret;
        let t_mix = self.psy(Point::Mixed, ip::dry_bulb_from_enthalpy(h_mix, w_mix))?;
        // Step 10, choice 8: entering = mixed plus a blow-through fan's rise.
        let t_on = match inp.fan_arrangement {
            FanArrangement::BlowThrough => t_mix + flow.dt_f,
            FanArrangement::DrawThrough => t_mix,
        };
        Ok(Chain {
            t_room,
            w_room,
            q_l,
            dt_pl,
            t_ret,
            w_ret,
            vent,
            m_oa,
            cfm_oa,
            x,
            t_o_mix,
            t_mix,
            w_mix,
            t_on,
            w_on: w_mix,
        })
    }

    /// Apparatus dew point (choice 21): the coil line in the (t, W) plane,
    /// extended below t_off, meets W_s(t); bracketed in 0.5 °F steps and
    /// bisected to 1e-9 °F.
    fn adp(&self, t_on: f64, w_on: f64, t_off: f64, w_off: f64) -> Result<f64, EngineError> {
        let slope = (w_on - w_off) / (t_on - t_off);
        let f = |t: f64| -> Result<f64, EngineError> {
            let ws = self.psy(Point::Saturation, ip::sat_hum_ratio(t, self.p))?;
            Ok(w_off + slope * (t - t_off) - ws)
        };
        let mut hi = t_off;
        if f(hi)? >= 0.0 {
            return Ok(t_off);
        }
        let mut lo;
        loop {
            lo = hi - 0.5;
            if lo < ADP_FLOOR_F {
                return Err(EngineError::NoApparatusDewPoint {
                    case: self.case,
                    loc: self.a.locs.ahu,
                });
            }
            if f(lo)? >= 0.0 {
                break;
            }
            hi = lo;
        }
        for _ in 0..MAX_ADP_STEPS {
            if hi - lo <= ADP_TOL_F {
                return Ok(0.5 * (lo + hi));
            }
            let mid = 0.5 * (lo + hi);
            if f(mid)? >= 0.0 {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        Err(EngineError::NoConvergence {
            iteration: Iteration::ApparatusDewPoint,
            passes: MAX_ADP_STEPS,
            case: Some(self.case),
            loc: self.a.locs.ahu,
        })
    }
}

/// Solve one air handler at one design case and compute every reported
/// value and its findings (steps 2–12).
pub(crate) fn solve_case(
    a: &AhuIn,
    p: f64,
    case: DesignCase,
    outdoor: &StatePoint,
    findings: &mut Vec<Finding>,
) -> Result<CaseResult, EngineError> {
    let cx = Ctx {
        a,
        p,
        case,
        out_t: outdoor.tdb_f,
        out_w: outdoor.w_lb_lb,
    };
    let inp = &a.inputs;
    // The wet solution first; the coil is dry when W_off > W_on (choice 19).
    let mut flow = cx.airflow(None)?;
    let mut ch = cx.chain(&flow)?;
    let dry = flow.w_s > ch.w_on;
    let mut dry_passes = 0;
    if dry {
        if ch.x == 0.0 {
            return Err(EngineError::NoSteadyState {
                case,
                loc: a.locs.ahu,
            });
        }
        let mut w_s = ch.w_on;
        loop {
            dry_passes += 1;
            if dry_passes > MAX_DRY_PASSES {
                return Err(EngineError::NoConvergence {
                    iteration: Iteration::DryCoil,
                    passes: MAX_DRY_PASSES,
                    case: Some(case),
                    loc: a.locs.ahu,
                });
            }
            flow = cx.airflow(Some(w_s))?;
            ch = cx.chain(&flow)?;
            if (ch.w_on - w_s).abs() < DRY_COIL_TOL {
                break;
            }
            w_s = ch.w_on;
        }
    }
    let t_s = inp.supply_temp_f;
    let m = flow.m;
    let (t_off, w_off) = (flow.t_off, flow.w_s);
    let (t_on, w_on) = (ch.t_on, ch.w_on);
    // Choice 19: a dry coil uses W_on = W_off = W_s exactly.
    let w_on_coil = if dry { w_off } else { w_on };
    if dry {
        // The dry solution must sit below the wet-coil leaving humidity.
        let w_wet = cx.leaving_w(t_off)?;
        if w_off >= w_wet {
            return Err(EngineError::NoConvergence {
                iteration: Iteration::DryCoil,
                passes: dry_passes,
                case: Some(case),
                loc: a.locs.ahu,
            });
        }
    }
    // Step 10, choice 20: coil loads.
    let h_on = enthalpy(t_on, w_on_coil);
    let h_off = enthalpy(t_off, w_off);
    let h_w = t_off - 32.0;
    let q_c = m * ((h_on - h_off) - (w_on_coil - w_off) * h_w);
    if !(t_on > t_off && q_c > 0.0) {
        return Err(EngineError::CoilNotCooling {
            case,
            entering_f: t_on,
            leaving_f: t_off,
            total_btuh: q_c,
            loc: a.locs.ahu,
        });
    }
    let q_cs = m * cp_moist(w_off) * (t_on - t_off);
    let mut q_cl = q_c - q_cs;
    if dry && q_cl.abs() < 1e-9 * q_c.abs() {
        q_cl = 0.0;
    }
    let condensate = m * (w_on_coil - w_off);
    let adp = cx.adp(t_on, w_on_coil, t_off, w_off)?;
    let bf = (t_off - adp) / (t_on - adp);
    let tons = q_c / BTUH_PER_TON;
    // Step 11, choice 23: capacity.
    let rated = inp.rated_btuh;
    let rated_s = inp.rated_sensible_btuh;
    let margin = rated.map(|r| r / q_c - 1.0);
    let sensible_margin = rated_s.map(|r| r / q_cs - 1.0);
    let under_total = rated.is_some_and(|r| r < q_c);
    let under_sensible = rated_s.is_some_and(|r| r < q_cs);
    let status = if under_total || under_sensible {
        CapacityStatus::Undersized
    } else {
        match margin {
            None => CapacityStatus::Unrated,
            Some(mg) if mg > OVERSIZE_MARGIN => CapacityStatus::Oversized,
            Some(_) => CapacityStatus::Ok,
        }
    };
    // Step 12, choice 25: standard-air cross-check.
    let std_cfm = inp.diversity
        * a.zones
            .iter()
            .map(|z| z.q_s / (STD_SENSIBLE * (z.t_r - t_s)))
            .sum::<f64>();
    let std_coil = STD_TOTAL * flow.cfm_s * (h_on - h_off);
    // States (choice 14: the after-fan state only with a rise).
    let states = States {
        outdoor: *outdoor,
        outdoor_after_fan: if inp.outdoor_fan_rise_f != 0.0 {
            Some(cx.state(Point::OutdoorAfterFan, ch.t_o_mix, cx.out_w)?)
        } else {
            None
        },
        return_air: cx.state(Point::Return, ch.t_ret, ch.w_ret)?,
        mixed: cx.state(Point::Mixed, ch.t_mix, ch.w_mix)?,
        entering: cx.state(Point::Entering, t_on, w_on)?,
        leaving: cx.state(Point::Leaving, t_off, w_off)?,
        supply: cx.state(Point::Supply, t_s, flow.w_s)?,
        room: cx.state(Point::Room, ch.t_room, ch.w_room)?,
    };
    // Zones (choice 10).
    let mut zones = Vec::with_capacity(a.zones.len());
    for ((z, &mz), zv) in a.zones.iter().zip(&flow.m_z).zip(&ch.vent.zones) {
        let w_rz = flow.w_s + z.q_l / (mz * h_g(z.t_r));
        let zpsy = |r: Result<f64, PsychroError>| {
            r.map_err(|error| EngineError::Psychro {
                point: Point::ZoneRoom(z.id),
                case: Some(case),
                error,
                loc: z.loc,
            })
        };
        let room_rh = zpsy(ip::rh_from_hum_ratio(z.t_r, w_rz, p))?;
        let design_rh = zpsy(ip::rh_from_hum_ratio(z.t_r, z.w_design, p))?;
        zones.push(ZoneFlow {
            zone: z.id,
            name: z.name.clone(),
            supply_dt_f: z.t_r - t_s,
            design_airflow_lb_h: mz,
            design_airflow_cfm: zv.vpz,
            r_p_cfm_per_person: z.r_p,
            r_a_cfm_per_ft2: z.r_a,
            e_z: z.e_z,
            v_bz_cfm: zv.vbz,
            v_oz_cfm: zv.voz,
            z_pz: zv.zpz,
            e_vz: zv.evz,
            room_tdb_f: z.t_r,
            room_w_lb_lb: w_rz,
            room_rh_pct: 100.0 * room_rh,
            design_w_lb_lb: z.w_design,
            design_rh_pct: 100.0 * design_rh,
            above_design_humidity: w_rz > z.w_design,
        });
    }
    let required = ch.vent.result.v_ot_cfm;
    let chw = inp
        .chilled_water_f
        .map(|(ws, wr)| q_c / (CHW_FACTOR * (wr - ws)));
    let face_v = inp.face_area_ft2.map(|fa| flow.cfm_s / fa);
    let result = CaseResult {
        case,
        dry_air_flow_lb_h: m,
        supply_airflow_cfm: flow.cfm_s,
        block_sensible_btuh: inp.diversity * a.zones.iter().map(|z| z.q_s).sum::<f64>(),
        block_latent_btuh: ch.q_l,
        cp_supply: flow.cp,
        rises: Rises {
            supply_duct_f: inp.supply_duct_rise_f,
            fan_f: flow.dt_f,
            return_duct_f: inp.return_duct_rise_f,
            plenum_f: ch.dt_pl,
            outdoor_fan_f: inp.outdoor_fan_rise_f,
        },
        fan: FanResult {
            arrangement: inp.fan_arrangement,
            motor: inp.fan_motor,
            source: match inp.fan {
                FanInput::Power { .. } => FanSource::Power,
                FanInput::Static { .. } => FanSource::Static,
                FanInput::Rise { .. } => FanSource::Rise,
                FanInput::Default { .. } => FanSource::Default,
            },
            shaft_power_bhp: flow.bhp,
            heat_btuh: flow.q_f,
            rise_f: flow.dt_f,
        },
        ventilation: ch.vent.result,
        ventilation_required_cfm: required,
        outdoor_airflow_cfm: ch.cfm_oa,
        outdoor_air_lb_h: ch.m_oa,
        outdoor_air_fraction: ch.x,
        ventilation_shortfall_cfm: (required - ch.cfm_oa).max(0.0),
        states,
        coil: CoilResult {
            dry,
            total_btuh: q_c,
            sensible_btuh: q_cs,
            latent_btuh: q_cl,
            tons,
            shr: q_cs / q_c,
            adp_f: adp,
            bypass_factor: bf,
            condensate_lb_h: condensate,
            condensate_gal_h: condensate / LB_PER_GAL,
            chilled_water_gpm: chw,
            face_velocity_fpm: face_v,
            cfm_per_ton: flow.cfm_s / tons,
        },
        capacity: Capacity {
            rated_btuh: rated,
            rated_tons: rated.map(|r| r / BTUH_PER_TON),
            rated_sensible_btuh: rated_s,
            margin,
            sensible_margin,
            status,
        },
        standard_air: StandardAir {
            supply_airflow_cfm: std_cfm,
            supply_airflow_diff_pct: 100.0 * (std_cfm / flow.cfm_s - 1.0),
            coil_total_btuh: std_coil,
            coil_total_diff_pct: 100.0 * (std_coil / q_c - 1.0),
        },
        zones,
        iterations: Iterations {
            airflow: flow.passes,
            dry_coil: dry_passes,
        },
    };
    case_findings(a, &result, findings);
    Ok(result)
}

/// The findings of one design case (methods.md §5, choices 10, 17, 23, 26).
fn case_findings(a: &AhuIn, r: &CaseResult, findings: &mut Vec<Finding>) {
    let case = Some(r.case);
    let mut push = |kind, loc| findings.push(Finding { kind, case, loc });
    let ahu = a.locs.ahu;
    if r.coil.dry {
        push(
            FindingKind::DryCoil {
                leaving_rh_pct: r.states.leaving.rh_pct,
            },
            ahu,
        );
    }
    if r.ventilation_shortfall() {
        push(
            FindingKind::VentilationShortfall {
                provided_cfm: r.outdoor_airflow_cfm,
                required_cfm: r.ventilation_required_cfm,
            },
            a.locs.outdoor_air,
        );
    }
    match r.capacity.status {
        CapacityStatus::Undersized => push(
            FindingKind::Undersized {
                rated_btuh: r.capacity.rated_btuh,
                required_btuh: r.coil.total_btuh,
                rated_sensible_btuh: r.capacity.rated_sensible_btuh,
                required_sensible_btuh: r.coil.sensible_btuh,
            },
            a.locs.rated,
        ),
        CapacityStatus::Oversized => {
            if let (Some(rated), Some(margin)) = (r.capacity.rated_btuh, r.capacity.margin) {
                push(
                    FindingKind::Oversized {
                        rated_btuh: rated,
                        required_btuh: r.coil.total_btuh,
                        margin,
                    },
                    a.locs.rated,
                );
            }
        }
        CapacityStatus::Ok | CapacityStatus::Unrated => {}
    }
    for (zf, z) in r.zones.iter().zip(&a.zones) {
        if zf.above_design_humidity {
            push(
                FindingKind::RoomAboveDesignHumidity {
                    zone: zf.zone,
                    room_w_lb_lb: zf.room_w_lb_lb,
                    design_w_lb_lb: zf.design_w_lb_lb,
                    room_rh_pct: zf.room_rh_pct,
                    design_rh_pct: zf.design_rh_pct,
                },
                z.loc,
            );
        }
        let (low, high) = ROOM_RH_COMFORT_PCT;
        if zf.room_rh_pct > ROOM_RH_LIMIT_PCT {
            push(
                FindingKind::RoomRhAboveLimit {
                    zone: zf.zone,
                    room_rh_pct: zf.room_rh_pct,
                    limit_pct: ROOM_RH_LIMIT_PCT,
                },
                z.loc,
            );
        } else if zf.room_rh_pct < low || zf.room_rh_pct > high {
            push(
                FindingKind::RoomRhOutsideComfort {
                    zone: zf.zone,
                    room_rh_pct: zf.room_rh_pct,
                    low_pct: low,
                    high_pct: high,
                },
                z.loc,
            );
        }
    }
    if r.states.leaving.rh_pct < LEAVING_RH_MIN_PCT {
        push(
            FindingKind::LeavingRhLow {
                leaving_rh_pct: r.states.leaving.rh_pct,
                min_pct: LEAVING_RH_MIN_PCT,
            },
            a.locs.leaving_rh,
        );
    }
    let (lo, hi) = CFM_PER_TON_RANGE;
    if r.coil.cfm_per_ton < lo || r.coil.cfm_per_ton > hi {
        push(
            FindingKind::CfmPerTonOutOfRange {
                cfm_per_ton: r.coil.cfm_per_ton,
                min: lo,
                max: hi,
            },
            ahu,
        );
    }
    if let Some(fv) = r.coil.face_velocity_fpm
        && fv > FACE_VELOCITY_LIMIT_FPM
    {
        push(
            FindingKind::FaceVelocityHigh {
                face_velocity_fpm: fv,
                limit_fpm: FACE_VELOCITY_LIMIT_FPM,
            },
            a.locs.face_area,
        );
    }
    if !r.coil.dry {
        let w_off = r.states.leaving.w_lb_lb;
        for (zf, z) in r.zones.iter().zip(&a.zones) {
            let too_moist = if z.q_l > 0.0 {
                w_off >= zf.design_w_lb_lb
            } else {
                w_off > zf.design_w_lb_lb
            };
            if too_moist {
                push(
                    FindingKind::CoilCannotDehumidify {
                        zone: zf.zone,
                        leaving_dp_f: r.states.leaving.tdp_f,
                        leaving_w_lb_lb: w_off,
                        design_w_lb_lb: zf.design_w_lb_lb,
                        design_rh_pct: zf.design_rh_pct,
                    },
                    ahu,
                );
            }
        }
    }
}
