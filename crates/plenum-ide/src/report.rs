//! The figures of an air handler and a zone, worded for people, from the
//! engine's [`Evaluation`] — the one result value that the hover and the
//! CLI report both render, so they cannot disagree. Nothing is recomputed
//! here: every number is a field of the evaluation, converted for display
//! by `plenum-units`.

use std::fmt::Write;

use plenum_engine::{
    AhuResult, AssumedValue, Assumption, CapacityStatus, CaseResult, DesignCase, Evaluation,
    StatePoint, Subject, ZoneResult,
};
use plenum_model::Design;
use plenum_units::{Measure, UnitSystem};

/// The short caution every air-handler summary carries (methods.md §0).
pub const CAUTION: &str = "Design aid only: the inputs are your responsibility, the figures must \
be reviewed by a qualified engineer (licensed where required), and the codes in force where the \
building stands govern.";

/// A number in a measure's IP unit, shown in `system` (`—` when it cannot be).
pub fn show(m: Measure, ip_value: f64, system: UnitSystem) -> String {
    match m.quantity(ip_value, UnitSystem::Ip) {
        Ok(q) => m.format(&q, system),
        Err(_) => "—".to_string(),
    }
}

/// A heat flow in Btu/h as a capacity: `11.8 ton (141,600 Btu/h)` in IP,
/// `41.5 kW` in SI.
pub fn capacity(btuh: f64, system: UnitSystem) -> String {
    let tons = show(Measure::Capacity, btuh / 12_000.0, system);
    match system {
        UnitSystem::Ip => format!("{tons} ({})", show(Measure::Load, btuh, system)),
        UnitSystem::Si => tons,
    }
}

/// A heat flow in Btu/h as a load (`98,400 Btu/h` | `28,840 W`).
pub fn load(btuh: f64, system: UnitSystem) -> String {
    show(Measure::Load, btuh, system)
}

/// A fraction 0–1 as a percentage.
pub fn percent(fraction: f64, system: UnitSystem) -> String {
    show(Measure::Percent, fraction * 100.0, system)
}

/// A margin as a signed percentage (`+6.0 %`, `−3.2 %`).
pub fn margin(m: f64, system: UnitSystem) -> String {
    let text = percent(m.abs(), system);
    if m > 0.0 && text != "0.0 %" {
        format!("+{text}")
    } else if m < 0.0 && text != "0.0 %" {
        format!("−{text}")
    } else {
        text
    }
}

/// A state point: dry bulb, wet bulb, RH and humidity ratio.
pub fn state(s: &StatePoint, system: UnitSystem) -> String {
    format!(
        "{} db, {} wb, {}, {}",
        show(Measure::Temperature, s.tdb_f, system),
        show(Measure::Temperature, s.twb_f, system),
        show(Measure::RelativeHumidity, s.rh_pct, system),
        show(Measure::HumidityRatioGrains, s.w_lb_lb * 7_000.0, system),
    )
}

/// The word for a capacity status.
pub fn status_word(s: CapacityStatus) -> &'static str {
    match s {
        CapacityStatus::Ok => "ok",
        CapacityStatus::Undersized => "UNDERSIZED",
        CapacityStatus::Oversized => "oversized",
        CapacityStatus::Unrated => "not rated",
    }
}

/// One labelled line of a summary.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Row {
    pub label: &'static str,
    pub value: String,
}

/// An air handler's figures, worded.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct AhuSummary {
    /// `ahu ahu_1 "Public areas unit"`.
    pub title: String,
    /// The governing case, when the site gives a dehumidification state.
    pub governing: Option<String>,
    pub rows: Vec<Row>,
    /// The defaults used, one line each.
    pub assumptions: Vec<String>,
    pub caution: &'static str,
}

fn row(label: &'static str, value: String) -> Row {
    Row { label, value }
}

/// The summary of air handler `index` of the design, at its governing case;
/// `Err` with the reason when the engine has no result for it.
pub fn ahu_summary(
    design: &Design,
    eval: &Evaluation,
    index: usize,
    system: UnitSystem,
) -> Option<Result<AhuSummary, String>> {
    let outcome = eval.ahus.get(index)?;
    let ahu = design.ahus.get(index)?;
    let title = match &ahu.label {
        Some(l) => format!("ahu {} \"{l}\"", ahu.name),
        None => format!("ahu {}", ahu.name),
    };
    let r = match &outcome.result {
        Ok(r) => r,
        Err(e) => return Some(Err(format!("{title}: no result ({})", error_words(e)))),
    };
    Some(Ok(summary_of(design, r, title, system)))
}

fn summary_of(design: &Design, r: &AhuResult, title: String, system: UnitSystem) -> AhuSummary {
    let g = r.governing();
    let c = &g.coil;
    let mut rows = vec![
        row("Coil total", capacity(c.total_btuh, system)),
        row(
            "Sensible / latent",
            format!(
                "{} / {} · SHR {}",
                load(c.sensible_btuh, system),
                load(c.latent_btuh, system),
                show(Measure::Factor, c.shr, system)
            ),
        ),
        row(
            "Supply airflow",
            format!(
                "{} · {}",
                show(Measure::Airflow, g.supply_airflow_cfm, system),
                per_ton(c.cfm_per_ton, system)
            ),
        ),
        row(
            "Outdoor air",
            format!(
                "{} · {} of supply (62.1 minimum {})",
                show(Measure::Airflow, g.outdoor_airflow_cfm, system),
                percent(g.outdoor_air_fraction, system),
                show(Measure::Airflow, g.ventilation_required_cfm, system)
            ),
        ),
        row("Entering coil", state(&g.states.entering, system)),
        row("Leaving coil", state(&g.states.leaving, system)),
    ];
    rows.push(row("Rated", rated(g, system)));
    let governing = r.dehumid.as_ref().map(|d| {
        let (cool, dehum) = (&r.cooling.coil, &d.coil);
        let which = match r.governing {
            DesignCase::Cooling => "cooling",
            DesignCase::Dehumid => "dehumidification",
        };
        format!(
            "{which} governs (cooling {}, dehumidification {})",
            show(Measure::Capacity, cool.tons, system),
            show(Measure::Capacity, dehum.tons, system)
        )
    });
    let assumptions = r
        .assumptions
        .iter()
        .map(|a| assumption(design, a, system))
        .collect();
    AhuSummary {
        title,
        governing,
        rows,
        assumptions,
        caution: CAUTION,
    }
}

fn per_ton(cfm_per_ton: f64, system: UnitSystem) -> String {
    show(Measure::AirflowPerCapacity, cfm_per_ton, system)
}

fn rated(g: &CaseResult, system: UnitSystem) -> String {
    let cap = &g.capacity;
    let status = status_word(cap.status);
    match (cap.rated_btuh, cap.margin) {
        (Some(rated), Some(m)) => format!(
            "{} · margin {} · {status}",
            show(Measure::Capacity, rated / 12_000.0, system),
            margin(m, system)
        ),
        (Some(rated), None) => format!(
            "{} · {status}",
            show(Measure::Capacity, rated / 12_000.0, system)
        ),
        (None, _) => match cap.rated_sensible_btuh {
            Some(s) => format!("sensible {} · {status}", load(s, system)),
            None => "no `rated` capacity given".to_string(),
        },
    }
}

/// One default used, in words: `supply_temp 57.0 °F (zone reading; common practice)`.
pub fn assumption(design: &Design, a: &Assumption, system: UnitSystem) -> String {
    let value = match a.value {
        AssumedValue::LengthFt(v) => show(Measure::Length, v, system),
        AssumedValue::TemperatureF(v) => show(Measure::Temperature, v, system),
        AssumedValue::TemperatureDifferenceF(v) => show(Measure::TemperatureDifference, v, system),
        AssumedValue::Ratio(v) => percent(v, system),
        AssumedValue::Count(v) => show(Measure::Count, v, system),
        AssumedValue::HeatBtuh(v) => load(v, system),
        AssumedValue::IndoorState { db_f, rh } => format!(
            "{}, {}",
            show(Measure::Temperature, db_f, system),
            show(Measure::RelativeHumidity, rh * 100.0, system)
        ),
        AssumedValue::BelowLowestRoom { dt_f, supply_f } => format!(
            "{} below the lowest room: {}",
            show(Measure::TemperatureDifference, dt_f, system),
            show(Measure::Temperature, supply_f, system)
        ),
        AssumedValue::RisePer100Ft { dt_f, rise_f } => format!(
            "{} per 100 ft: {}",
            show(Measure::TemperatureDifference, dt_f, system),
            show(Measure::TemperatureDifference, rise_f, system)
        ),
        AssumedValue::FanRise { dt_f, arrangement } => format!(
            "{} ({})",
            show(Measure::TemperatureDifference, dt_f, system),
            match arrangement {
                plenum_model::FanArrangement::DrawThrough => "draw-through",
                plenum_model::FanArrangement::BlowThrough => "blow-through",
            }
        ),
        AssumedValue::Keyword(k) => k.to_string(),
    };
    let whom = match a.subject {
        Subject::Site => "site".to_string(),
        Subject::Zone(z) => design
            .zone(z)
            .map_or_else(|| "zone".to_string(), |z| format!("zone {}", z.name)),
        Subject::Ahu(_) => String::new(),
    };
    if whom.is_empty() {
        format!("{} {value} ({})", a.key, a.source.label())
    } else {
        format!("{} {value} ({whom}; {})", a.key, a.source.label())
    }
}

fn error_words(e: &plenum_engine::EngineError) -> String {
    use plenum_engine::EngineError as E;
    match e {
        E::NoSite { .. } | E::SiteUnusable { .. } => "the site is missing or unusable".to_string(),
        E::ZoneUnusable { .. } => "a served zone's inputs are unusable".to_string(),
        E::MissingInput { key, .. } => format!("`{key}` is missing"),
        E::InvalidInput { key, .. } => format!("the value of `{key}` is out of range"),
        E::InputNotFinite { key, .. } => format!("the value of `{key}` is not a finite number"),
        E::ConflictingInputs { first, second, .. } => {
            format!("`{first}` and `{second}` exclude each other")
        }
        E::UnknownZone { .. } => "`serves` names an unknown zone".to_string(),
        _ => "the coil chain has no answer for these inputs; see the diagnostics".to_string(),
    }
}

impl AhuSummary {
    /// The summary as Markdown (the hover text).
    pub fn markdown(&self) -> String {
        let mut s = format!("**{}**\n\n", self.title);
        if let Some(g) = &self.governing {
            let _ = writeln!(s, "Governing case: {g}\n");
        }
        for r in &self.rows {
            let _ = writeln!(s, "- **{}**: {}", r.label, r.value);
        }
        if !self.assumptions.is_empty() {
            s.push_str("\nAssumed (not given in the file):\n");
            for a in &self.assumptions {
                let _ = writeln!(s, "- {a}");
            }
        }
        let _ = write!(s, "\n*{}*", self.caution);
        s
    }
}

/// A zone's figures: design airflow, 62.1 ventilation and resulting RH.
pub fn zone_markdown(
    design: &Design,
    eval: &Evaluation,
    zone: &ZoneResult,
    system: UnitSystem,
) -> String {
    let z = design.zone(zone.zone);
    let title = match z.and_then(|z| z.label.as_ref()) {
        Some(l) => format!("zone {} \"{l}\"", zone.name),
        None => format!("zone {}", zone.name),
    };
    let mut s = format!("**{title}**\n\n");
    if let Ok(i) = &zone.inputs {
        let _ = writeln!(
            s,
            "- **Loads**: sensible {} · latent {}",
            load(i.sensible_btuh, system),
            load(i.latent_btuh, system)
        );
    }
    let served: Vec<String> = zone
        .served_by
        .iter()
        .filter_map(|&i| eval.ahus.get(i).map(|a| format!("`{}`", a.name)))
        .collect();
    if served.is_empty() {
        s.push_str("- Served by no air handler: no airflow is computed.\n");
        return s;
    }
    let _ = writeln!(s, "- **Served by**: {}", served.join(", "));
    match &zone.flow {
        Some(f) => {
            let _ = writeln!(
                s,
                "- **Design airflow**: {} (supply ΔT {})",
                show(Measure::Airflow, f.design_airflow_cfm, system),
                show(Measure::TemperatureDifference, f.supply_dt_f, system)
            );
            let _ = writeln!(
                s,
                "- **Ventilation (62.1)**: V_bz {} · V_oz {} (R_p {}, R_a {}, E_z {})",
                show(Measure::Airflow, f.v_bz_cfm, system),
                show(Measure::Airflow, f.v_oz_cfm, system),
                show(Measure::AirflowPerPerson, f.r_p_cfm_per_person, system),
                show(Measure::AirflowPerArea, f.r_a_cfm_per_ft2, system),
                show(Measure::Factor, f.e_z, system)
            );
            let _ = writeln!(
                s,
                "- **Resulting RH**: {} at {} (design {}){}",
                show(Measure::RelativeHumidity, f.room_rh_pct, system),
                show(Measure::Temperature, f.room_tdb_f, system),
                show(Measure::RelativeHumidity, f.design_rh_pct, system),
                if f.above_design_humidity {
                    " — more humid than the design state"
                } else {
                    ""
                }
            );
        }
        None => s.push_str("- No result: the air handler serving it has none.\n"),
    }
    s
}
