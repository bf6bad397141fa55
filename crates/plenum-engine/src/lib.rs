//! The coil-load engine: from zone cooling loads to cooling-coil loads.
//!
//! [`evaluate`] takes a lowered [`Design`] (IP numbers, every value with its
//! source location) and returns an [`Evaluation`]: the site, every zone and,
//! for every air handler, either its full result at each outdoor design
//! state or the typed [`EngineError`] that leaves it out. The engine words
//! no diagnostics: it returns plain facts ([`Finding`]s and errors, each
//! with its [`Loc`](plenum_model::Loc) and numbers) that the checks crate
//! turns into coded diagnostics.
//!
//! > **Caution.** These figures are a design aid. The inputs are the user's
//! > responsibility, the results must be reviewed by a qualified (licensed
//! > where required) engineer, and the codes in force where the building
//! > stands take precedence over any default used here.
//!
//! # The chain, step by step
//!
//! The method is the project's `methods.md` (§1–§5), with the conventions
//! of its §4a and the 26 choices listed in the coil reference's README
//! (`tests/reference/coil/README.md`), which an independent Python
//! implementation makes the same way. Every state is computed from the
//! psychrometric equations of ASHRAE Handbook—Fundamentals (2017) ch. 1
//! (crate `plenum-psychro`) at the site's pressure; the standard-air
//! constants are used only for the cross-check reported beside the answer.
//!
//! 1. **Site.** The barometric pressure comes from `pressure`, or from the
//!    `elevation` by the standard-atmosphere equation
//!    p = 14.696 (1 − 6.8754·10⁻⁶ Z)^5.2559 psia (Fundamentals ch. 1,
//!    eq. 3), or is taken at sea level when neither is given (an
//!    assumption). The cooling design state is required; a
//!    dehumidification state is optional and, when given, every air handler
//!    is solved at both and the larger coil total governs.
//! 2. **Zones and block loads.** Each zone brings its peak sensible and
//!    latent gains, indoor state (75 °F / 50 % RH by default, *common
//!    practice*), area, occupants, 62.1 category and E_z. The block loads
//!    are Q_s = d Σ q_s,z and Q_l = d Σ q_l,z with the diversity d.
//! 3. **Supply temperature** t_s: given, or a ΔT below the lowest zone's
//!    indoor temperature (18 °F by default, *common practice*).
//! 4. **Airflow.** Each zone needs m_z = q_s,z / (c_p (t_r,z − t_s)) lb/h of
//!    dry air, from its own undiversified load and ΔT, with
//!    c_p = 0.240 + 0.444 W_s (the moist-air specific heat of the handbook's
//!    enthalpy equation, at the supply humidity ratio); the system flow is
//!    m = d Σ m_z. Volumetric flows are m·v/60 at the state where they are
//!    measured (supply airflow at the supply state).
//! 5. **Rises between coil and room.** The supply duct adds 1.5 °F per
//!    100 ft (*common practice*; 3 °F when the length is unknown). The fan
//!    adds its heat: shaft power (given, or cfm·Δp/(6356 η) from static
//!    pressure, *common practice*) times 2544.43 Btu/h per hp (NIST SP 811),
//!    divided by the motor efficiency when the motor is in the air stream
//!    (90 % by default, *common practice*); the rise is q_f/(m c_p). With no
//!    fan described, a 2 °F draw-through rise is assumed (*common
//!    practice*). A draw-through fan heats the air after the coil, a
//!    blow-through fan before it.
//! 6. **Leaving-coil state.** t_off = t_s − Δt_sd − Δt_f (draw-through) or
//!    t_s − Δt_sd (blow-through), at 95 % RH by default (*common practice*);
//!    W_s = W_off. Steps 4–6 depend on each other through c_p and the fan
//!    rise, so they are iterated until m changes by at most 10⁻⁹ relative.
//! 7. **Room humidity.** W_r = W_s + Q_l / (m (1061 + 0.444 t_r)), the
//!    moisture balance of the room with the latent heat of vapour at the
//!    room temperature; t_r is the flow-weighted mean of the zones. Each
//!    zone's own humidity follows from its own flow and latent load, and a
//!    room that ends up more humid than its design state is a finding.
//! 8. **Return air.** t_ret = t_r + return duct rise (1.0 °F per 100 ft, a
//!    project default; 3 °F when unknown, *common practice*; none for
//!    `return_duct none`) + plenum gain / (m c_p) with c_p at the room
//!    humidity ratio.
//! 9. **Outdoor air.** Given as airflow (at the outdoor state), as a
//!    fraction of the supply mass flow, per person, per area, as 100 %, or
//!    by the ventilation rate procedure of ANSI/ASHRAE 62.1-2019 (*from
//!    memory*, see [`VENTILATION_CATEGORIES`]): V_bz = R_p P_z + R_a A_z,
//!    V_oz = V_bz / E_z; a single-zone unit needs V_oz, a 100 % outdoor-air
//!    unit Σ V_oz, a multiple-zone unit V_ou / E_v with
//!    V_ou = D Σ R_p P_z + Σ R_a A_z and E_v from the simplified procedure
//!    (0.75, or 0.88 D + 0.22 below D = 0.60), the calculated one
//!    (min 1 + X_s − Z_pz) or a given ratio. The 62.1 minimum is always
//!    computed and a shortfall is a finding.
//! 10. **Mixing** by mass and energy: W_m and h_m are the mass-weighted
//!     means of the outdoor stream (after any outdoor-air fan rise) and the
//!     return; t_m follows from (h_m, W_m) by the handbook's enthalpy
//!     equation. A recirculating unit cannot take more outdoor air than it
//!     supplies.
//! 11. **Coil.** It enters at the mixed state (plus a blow-through fan's
//!     rise). If the leaving humidity ratio of a wet coil would be above the
//!     entering one, the coil runs dry: the supply keeps the entering
//!     humidity, which depends on the room's, which depends on the supply's,
//!     so the chain is solved again as a fixed point on W_s to 10⁻¹². The
//!     total is the coil's energy balance with the condensate leaving at
//!     t_off (ASHRAE Handbook—HVAC Systems and Equipment, cooling coils,
//!     from memory): Q_c = m [(h_on − h_off) − (W_on − W_off)(t_off − 32)];
//!     sensible m c_p (t_on − t_off) at the leaving humidity; latent the
//!     rest. The apparatus dew point is where the entering–leaving line in
//!     the (t, W) plane meets saturation; the bypass factor is
//!     (t_off − ADP)/(t_on − ADP). Condensate is m (W_on − W_off) at
//!     8.34 lb/gal; chilled water Q/(500 Δt_w) gpm (*common practice*).
//! 12. **Capacity.** Rated below required (total, or sensible when given)
//!     is undersized; more than 25 % above is oversized (*common practice*).
//! 13. **Standard-air cross-check.** Q_s/(1.08 ΔT) and 4.5 · cfm · Δh are
//!     reported with their difference from the exact figures: at sea level
//!     they agree within a few per cent, at elevation the exact ones are
//!     right.
//!
//! # Where the reference leaves a case open
//!
//! The engine makes the reference README's 26 choices. Where a design goes
//! beyond what the reference accepts, the engine decides as follows (no
//! reference case exercises these):
//!
//! * a `fan` block with neither `power`, `static` nor `rise` gets the 2 °F
//!   default rise with the block's arrangement (an assumption), where the
//!   reference rejects it; `rise` together with `power` or `static` is an
//!   error, as there;
//! * `rated_sensible` without `rated` still makes a coil undersized when the
//!   required sensible exceeds it (otherwise the status is `unrated`);
//! * a zone's sensible gain must be above zero (it sets the zone's airflow;
//!   with none, its Z_pz and its resulting humidity have no value);
//! * a zone with a 62.1 category whose area rate is not zero but no `area`
//!   is a finding, and 0 ft² is used, as the reference does;
//! * the assumptions also name `people 0`, `use` none, and the per-length
//!   duct rates (1.5 and 1.0 °F per 100 ft), which the reference's
//!   `defaults_used` leaves out.
//!
//! Every default applied is an [`Assumption`] naming the key, the value and
//! its source. Every numerical dead end — no root, no convergence within
//! the bounded passes, outdoor air above supply, a state outside the
//! psychrometric domain — is an [`EngineError`]; before a result is
//! returned every `f64` in it is checked to be finite.
//!
//! ```
//! use plenum_engine::{evaluate, CapacityStatus};
//! # use plenum_model::*;
//! # let loc = Loc { file: FileId(0), span: Default::default() };
//! # let at = |v| At::new(v, loc);
//! let design = Design {
//!     site: Some(Site {
//!         loc,
//!         elevation_ft: Some(at(0.0)),
//!         pressure_psia: None,
//!         cooling: Some(At::new(AirSpec::DbWb { db_f: 95.0, wb_f: 75.0 }, loc)),
//!         dehumid: None,
//!     }),
//!     zones: vec![Zone {
//!         id: ZoneId(0),
//!         name: "office".into(),
//!         label: None,
//!         loc,
//!         name_loc: loc,
//!         area_ft2: Some(at(1_000.0)),
//!         people: Some(at(5.0)),
//!         category: Some(At::new("office".to_string(), loc)),
//!         indoor: None,
//!         sensible_btuh: Some(at(20_000.0)),
//!         latent_btuh: Some(at(2_000.0)),
//!         distribution_effectiveness: None,
//!     }],
//!     ahus: vec![Ahu {
//!         name: "rtu_1".into(),
//!         label: None,
//!         loc,
//!         name_loc: loc,
//!         serves: vec![At::new(ZoneId(0), loc)],
//!         supply: None, diversity: None, supply_duct: None, return_duct: None,
//!         plenum_gain_btuh: None, fan: None, outdoor_air: None,
//!         occupant_diversity: None, ventilation_efficiency: None,
//!         outdoor_fan_rise_f: None, coil: None,
//!     }],
//!     ..Design::default()
//! };
//! let eval = evaluate(&design);
//! let ahu = eval.ahus[0].result.as_ref().expect("a result");
//! let r = ahu.governing();
//! // 62.1 single zone: 5 people × 5 cfm + 1,000 ft² × 0.06 cfm/ft² = 85 cfm.
//! assert!((r.ventilation_required_cfm - 85.0).abs() < 1e-9);
//! assert!(r.coil.total_btuh > 20_000.0 + 2_000.0); // room load plus fan, ducts and outdoor air
//! assert_eq!(ahu.status(), CapacityStatus::Unrated);
//! assert!(ahu.assumptions.iter().any(|a| a.key == "supply_temp"));
//! ```

#![forbid(unsafe_code)]
#![warn(missing_docs)]

mod assumption;
mod chain;
mod error;
mod finding;
mod finite;
mod inputs;
mod result;
mod ventilation;

use foldhash::{HashMap, HashMapExt};

use plenum_model::{Ahu, Design, ZoneId};

pub use assumption::{AssumedValue, Assumption, Source, Subject};
pub use chain::{
    AIRFLOW_TOL, BTUH_PER_HP, CHW_FACTOR, CP_DRY_AIR, CP_VAPOUR, DRY_COIL_TOL, FAN_CONSTANT, H_G0,
    LB_PER_GAL, MAX_AIRFLOW_PASSES, MAX_DRY_PASSES, STD_SENSIBLE, STD_TOTAL, cp_moist, enthalpy,
    h_g,
};
pub use error::{Allowed, EngineError, Iteration};
pub use finding::{
    CFM_PER_TON_RANGE, FACE_VELOCITY_LIMIT_FPM, Finding, FindingKind, LEAVING_RH_MIN_PCT,
    OVERSIZE_MARGIN, ROOM_RH_COMFORT_PCT, ROOM_RH_LIMIT_PCT, SUPPLY_DT_RANGE_F,
};
pub use inputs::{
    DEFAULT_FAN_RISE_F, DEFAULT_INDOOR, DEFAULT_LEAVING_RH, DEFAULT_MOTOR_EFFICIENCY,
    DEFAULT_SUPPLY_DT_F, RETURN_DUCT_F_PER_100FT, SUPPLY_DUCT_F_PER_100FT, UNKNOWN_DUCT_RISE_F,
};
pub use result::{
    AhuInputs, AhuOutcome, AhuResult, Capacity, CapacityStatus, CaseResult, CoilResult, DesignCase,
    EvMethod, Evaluation, FanInput, FanResult, FanSource, Iterations, MultipleZone, Point,
    PressureSource, Rises, SiteResult, StandardAir, StatePoint, States, VentilationProcedure,
    VentilationResult, ZoneFlow, ZoneInputs, ZoneResult,
};
pub use ventilation::{
    VENTILATION_CATEGORIES, VENTILATION_NOTE, VENTILATION_SOURCE, VentilationCategory,
    breathing_zone_cfm, simplified_ev, ventilation_category,
};

use crate::assumption::Assumption as A;
use crate::finite::ensure_finite;

/// Evaluate every air handler of a design at every outdoor design state.
///
/// Never panics and never returns NaN or infinity: an air handler whose
/// chain has no answer carries the [`EngineError`] that says why.
pub fn evaluate(design: &Design) -> Evaluation {
    let mut findings = Vec::new();
    let site = inputs::site(design, &mut findings)
        .and_then(|s| {
            ensure_finite(&s, s.loc)?;
            Ok(s)
        })
        .map_err(EngineError::finite);
    let mut zone_inputs = Vec::with_capacity(design.zones.len());
    let mut zone_assumptions: Vec<Vec<A>> = Vec::with_capacity(design.zones.len());
    for z in &design.zones {
        let mut assumptions = Vec::new();
        let inputs = match &site {
            Ok(s) => inputs::zone(z, s.pressure_psia, &mut assumptions, &mut findings)
                .and_then(|zi| {
                    ensure_finite(&zi, z.name_loc)?;
                    Ok(zi)
                })
                .map_err(EngineError::finite),
            Err(_) => Err(EngineError::SiteUnusable { loc: z.name_loc }),
        };
        zone_inputs.push(inputs);
        zone_assumptions.push(assumptions);
    }
    let ahus: Vec<AhuOutcome> = design
        .ahus
        .iter()
        .enumerate()
        .map(|(index, a)| AhuOutcome {
            index,
            name: a.name.clone(),
            loc: a.name_loc,
            result: match &site {
                Ok(s) => ahu_result(index, a, design, s, &zone_inputs, &zone_assumptions)
                    .map_err(EngineError::finite),
                Err(_) => Err(EngineError::SiteUnusable { loc: a.name_loc }),
            },
        })
        .collect();
    // The air handlers that serve each zone, in order, each once: one pass
    // over the `serves` lists (a search of every air handler for every zone
    // was quadratic in the design).
    let mut serving: HashMap<ZoneId, Vec<usize>> = HashMap::new();
    for (i, a) in design.ahus.iter().enumerate() {
        for s in &a.serves {
            let list = serving.entry(s.value).or_default();
            if list.last() != Some(&i) {
                list.push(i);
            }
        }
    }
    let zones = design
        .zones
        .iter()
        .zip(zone_inputs)
        .zip(zone_assumptions)
        .map(|((z, inputs), assumptions)| {
            let served_by: Vec<usize> = serving.get(&z.id).cloned().unwrap_or_default();
            let flow = served_by.iter().find_map(|&i| {
                let r = ahus.get(i)?.result.as_ref().ok()?;
                r.governing().zones.iter().find(|f| f.zone == z.id).cloned()
            });
            ZoneResult {
                zone: z.id,
                name: z.name.clone(),
                loc: z.name_loc,
                inputs,
                served_by,
                flow,
                assumptions,
            }
        })
        .collect();
    Evaluation {
        site,
        zones,
        ahus,
        findings,
    }
}

fn ahu_result(
    index: usize,
    a: &Ahu,
    design: &Design,
    site: &SiteResult,
    zone_inputs: &[Result<ZoneInputs, EngineError>],
    zone_assumptions: &[Vec<A>],
) -> Result<AhuResult, EngineError> {
    let mut own = Vec::new();
    let mut findings = Vec::new();
    let ain = inputs::ahu(index, a, design, zone_inputs, &mut own, &mut findings)?;
    let mut assumptions = site.assumptions.clone();
    for z in &ain.zones {
        if let Some(za) = zone_assumptions.get(z.id.0 as usize) {
            assumptions.extend(za.iter().copied());
        }
    }
    assumptions.extend(own);
    // Supply ΔT per zone (methods.md §5, *common practice*): the same at both cases.
    let (lo, hi) = SUPPLY_DT_RANGE_F;
    for z in &ain.zones {
        let dt = z.t_r - ain.inputs.supply_temp_f;
        if !(lo..=hi).contains(&dt) {
            findings.push(Finding {
                kind: FindingKind::SupplyDtOutOfRange {
                    zone: z.id,
                    dt_f: dt,
                    min_f: lo,
                    max_f: hi,
                },
                case: None,
                loc: ain.locs.supply,
            });
        }
    }
    let p = site.pressure_psia;
    let cooling = chain::solve_case(&ain, p, DesignCase::Cooling, &site.cooling, &mut findings)?;
    let dehumid = match &site.dehumid {
        Some(d) => Some(chain::solve_case(
            &ain,
            p,
            DesignCase::Dehumid,
            d,
            &mut findings,
        )?),
        None => None,
    };
    // §1, choice 24: the larger total governs; a tie goes to cooling.
    let governing = match &dehumid {
        Some(d) if d.coil.total_btuh > cooling.coil.total_btuh => DesignCase::Dehumid,
        _ => DesignCase::Cooling,
    };
    let result = AhuResult {
        name: a.name.clone(),
        inputs: ain.inputs,
        cooling,
        dehumid,
        governing,
        assumptions,
        findings,
    };
    ensure_finite(&result, a.name_loc)?;
    Ok(result)
}

#[cfg(test)]
mod tests {
    use super::*;
    use plenum_model::*;

    fn loc() -> Loc {
        Loc {
            file: FileId(0),
            span: Default::default(),
        }
    }

    fn at<T>(v: T) -> At<T> {
        At::new(v, loc())
    }

    fn office(latent: f64) -> Design {
        Design {
            site: Some(Site {
                loc: loc(),
                elevation_ft: None,
                pressure_psia: None,
                cooling: Some(at(AirSpec::DbWb {
                    db_f: 95.0,
                    wb_f: 75.0,
                })),
                dehumid: None,
            }),
            zones: vec![Zone {
                id: ZoneId(0),
                name: "z".into(),
                label: None,
                loc: loc(),
                name_loc: loc(),
                area_ft2: Some(at(1000.0)),
                people: Some(at(5.0)),
                category: Some(at("office".to_string())),
                indoor: None,
                sensible_btuh: Some(at(20_000.0)),
                latent_btuh: Some(at(latent)),
                distribution_effectiveness: None,
            }],
            ahus: vec![Ahu {
                name: "a".into(),
                label: None,
                loc: loc(),
                name_loc: loc(),
                serves: vec![at(ZoneId(0))],
                supply: None,
                diversity: None,
                supply_duct: None,
                return_duct: None,
                plenum_gain_btuh: None,
                fan: None,
                outdoor_air: Some(at(OutdoorAir::FractionOfSupply { fraction: 0.0 })),
                occupant_diversity: None,
                ventilation_efficiency: None,
                outdoor_fan_rise_f: None,
                coil: None,
            }],
            ..Design::default()
        }
    }

    /// The finiteness guard names the first non-finite field it finds.
    #[test]
    fn finiteness_guard_catches_a_nan_anywhere() {
        let e = evaluate(&office(1_000.0));
        let Some(Ok(r)) = e.ahus.first().map(|a| a.result.clone()) else {
            panic!("no result")
        };
        assert!(ensure_finite(&r, loc()).is_ok());
        let mut bad = r.clone();
        bad.cooling.coil.total_btuh = f64::NAN;
        assert!(matches!(
            ensure_finite(&bad, loc()),
            Err(EngineError::NotFinite {
                field: "coil.total_btuh",
                ..
            })
        ));
        let mut bad = r.clone();
        bad.cooling.states.mixed.twb_f = f64::INFINITY;
        assert!(matches!(
            ensure_finite(&bad, loc()),
            Err(EngineError::NotFinite {
                field: "state.twb_f",
                ..
            })
        ));
        let mut bad = r;
        bad.cooling.zones[0].e_vz = Some(f64::NAN);
        assert!(ensure_finite(&bad, loc()).is_err());
    }

    /// The whole-evaluation guard reaches the zones' flows, the air handlers'
    /// results and the design's own findings.
    #[test]
    fn whole_evaluation_guard_reaches_every_part() {
        let e = evaluate(&office(1_000.0));
        assert_eq!(e.first_non_finite(), None);
        let mut bad = e.clone();
        let Some(flow) = bad.zones[0].flow.as_mut() else {
            panic!("no zone flow")
        };
        flow.room_rh_pct = f64::NAN;
        assert_eq!(bad.first_non_finite(), Some("zone.room_rh_pct"));
        let mut bad = e.clone();
        let Some(Ok(r)) = bad.ahus.first_mut().map(|a| a.result.as_mut()) else {
            panic!("no result")
        };
        r.cooling.coil.shr = f64::INFINITY;
        assert_eq!(bad.first_non_finite(), Some("coil.shr"));
        let mut bad = e;
        bad.findings.push(Finding {
            kind: FindingKind::DryCoil {
                leaving_rh_pct: f64::NEG_INFINITY,
            },
            case: None,
            loc: loc(),
        });
        assert_eq!(bad.first_non_finite(), Some("finding.leaving_rh_pct"));
    }

    /// A dry coil with no outdoor air has no steady state (methods.md step
    /// 10). Through the public inputs this cannot happen — with x = 0 the
    /// coil sees the return air, which is never drier than the supply for a
    /// latent load ≥ 0 — so the guard is exercised here with a negative
    /// latent load that input checking would reject.
    #[test]
    fn dry_coil_without_outdoor_air_has_no_steady_state() {
        let d = office(1_000.0);
        let mut findings = Vec::new();
        let site = inputs::site(&d, &mut findings).unwrap_or_else(|e| panic!("{e:?}"));
        let zone_inputs: Vec<_> = d
            .zones
            .iter()
            .map(|z| inputs::zone(z, site.pressure_psia, &mut Vec::new(), &mut findings))
            .collect();
        let mut a = inputs::ahu(
            0,
            &d.ahus[0],
            &d,
            &zone_inputs,
            &mut Vec::new(),
            &mut findings,
        )
        .unwrap_or_else(|e| panic!("{e:?}"));
        a.zones[0].q_l = -1_000.0;
        let r = chain::solve_case(
            &a,
            site.pressure_psia,
            DesignCase::Cooling,
            &site.cooling,
            &mut findings,
        );
        assert!(matches!(r, Err(EngineError::NoSteadyState { .. })));
        // With zero latent load the coil is wet with no condensate: W_on = W_off.
        a.zones[0].q_l = 0.0;
        let r = chain::solve_case(
            &a,
            site.pressure_psia,
            DesignCase::Cooling,
            &site.cooling,
            &mut findings,
        )
        .unwrap_or_else(|e| panic!("{e:?}"));
        assert!(!r.coil.dry);
        assert_eq!(r.coil.condensate_lb_h, 0.0);
    }

    /// No error carries a non-finite number: such an error becomes `NotFinite`.
    #[test]
    fn errors_never_carry_non_finite_numbers() {
        let e = EngineError::OutdoorAirExceedsSupply {
            case: DesignCase::Cooling,
            fraction: f64::INFINITY,
            outdoor_cfm: 1.0,
            supply_cfm: 1.0,
            loc: loc(),
        };
        assert!(!e.numbers_are_finite());
        assert!(matches!(e.finite(), EngineError::NotFinite { .. }));
        let ok = EngineError::UnknownZone { loc: loc() };
        assert_eq!(ok.clone().finite(), ok);
    }
}
