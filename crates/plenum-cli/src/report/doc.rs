//! The text and markdown forms: one document of headings, tables and
//! lists, rendered either aligned for a terminal or as markdown tables for
//! a pull-request comment.
//!
//! Per design: the coil schedule (one row per computed air handler), the
//! design cases when a dehumidification state is given, the air handlers
//! left out with why, the zone table, the standard-air cross-check, the
//! assumptions, the findings and the diagnostics; the caution closes the
//! report.

use plenum_engine::{PressureSource, StatePoint};
use plenum_units::{Measure, UnitSystem};

use super::collect::{DesignReport, Pos};
use super::conv::Conv;
use super::{CAUTION, Report};

/// How a column's cells line up.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Align {
    Left,
    Right,
}

/// A column: its name, its unit (may be empty) and its alignment.
#[derive(Clone, Debug)]
pub struct Col {
    pub name: String,
    pub unit: String,
    pub align: Align,
}

fn col(name: &str, unit: &str, align: Align) -> Col {
    Col {
        name: name.to_string(),
        unit: unit.to_string(),
        align,
    }
}

fn text_col(name: &str) -> Col {
    col(name, "", Align::Left)
}

fn num_col(name: &str, unit: &str) -> Col {
    col(name, unit, Align::Right)
}

#[derive(Clone, Debug)]
pub struct Table {
    pub cols: Vec<Col>,
    pub rows: Vec<Vec<String>>,
}

#[derive(Clone, Debug)]
pub enum Block {
    Title(String),
    Heading(String),
    Para(String),
    Table(Table),
    Bullets(Vec<String>),
    Caution(String),
}

/// A missing value.
const NONE: &str = "—";

fn dbwb(c: Conv, s: &StatePoint) -> String {
    format!(
        "{} / {}",
        c.num(Measure::Temperature, s.tdb_f),
        c.num(Measure::Temperature, s.twb_f)
    )
}

fn pct(c: Conv, ratio: f64) -> String {
    Measure::Percent.format_number(ratio * 100.0, c.system)
}

fn opt_or_none(v: Option<String>) -> String {
    v.unwrap_or_else(|| NONE.to_string())
}

/// `file:line:column`
fn at(p: &Pos) -> String {
    p.short()
}

fn site_line(d: &DesignReport, c: Conv) -> String {
    match &d.eval.site {
        Ok(s) => {
            let p = c.show(Measure::Pressure, s.pressure_psia);
            let place = match s.pressure_source {
                PressureSource::Given => format!("pressure {p} (given)"),
                PressureSource::Elevation { elevation_ft } => {
                    format!("elevation {}, {p}", c.show(Measure::Length, elevation_ft))
                }
                PressureSource::SeaLevelAssumed => format!("sea level assumed, {p}"),
            };
            let state = |s: &StatePoint| {
                format!(
                    "{} db / {} wb",
                    c.show(Measure::Temperature, s.tdb_f),
                    c.show(Measure::Temperature, s.twb_f)
                )
            };
            let mut line = format!("Site: {place}; cooling design {}", state(&s.cooling));
            if let Some(dh) = &s.dehumid {
                line.push_str(&format!(
                    "; dehumidification design {} dp, {} db",
                    c.show(Measure::Temperature, dh.tdp_f),
                    c.show(Measure::Temperature, dh.tdb_f)
                ));
            }
            line
        }
        Err(_) => "Site: unknown (see the diagnostics)".to_string(),
    }
}

fn schedule(d: &DesignReport, c: Conv) -> Table {
    let load = c.label(Measure::LoadCompact);
    let cap = c.label(Measure::Capacity);
    let cols = vec![
        text_col("AHU"),
        num_col("Supply", c.label(Measure::Airflow)),
        num_col("OA", c.label(Measure::Airflow)),
        num_col("OA", "% mass"),
        num_col("Entering db / wb", c.label(Measure::Temperature)),
        num_col("Leaving db / wb", c.label(Measure::Temperature)),
        num_col("Total", load),
        num_col("Sensible", load),
        num_col("Latent", load),
        num_col("Coil", "ton"),
        num_col("Rated", cap),
        num_col("Margin", "%"),
        text_col("Status"),
        text_col("Case"),
        text_col("Serves"),
    ];
    let rows = d
        .computed()
        .map(|(a, r)| {
            let g = r.governing();
            vec![
                a.name.clone(),
                c.num(Measure::Airflow, g.supply_airflow_cfm),
                c.num(Measure::Airflow, g.outdoor_airflow_cfm),
                pct(c, g.outdoor_air_fraction),
                dbwb(c, &g.states.entering),
                dbwb(c, &g.states.leaving),
                c.heat_num(Measure::LoadCompact, g.coil.total_btuh),
                c.heat_num(Measure::LoadCompact, g.coil.sensible_btuh),
                c.heat_num(Measure::LoadCompact, g.coil.latent_btuh),
                Measure::Capacity.format_number(g.coil.tons, UnitSystem::Ip),
                opt_or_none(g.capacity.rated_tons.map(|t| c.num(Measure::Capacity, t))),
                opt_or_none(g.capacity.margin.map(|m| pct(c, m))),
                g.capacity.status.key().to_string(),
                r.governing.key().to_string(),
                a.serves.join(", "),
            ]
        })
        .collect();
    Table { cols, rows }
}

fn cases(d: &DesignReport, c: Conv) -> Option<Table> {
    let with_dehumid: Vec<_> = d.computed().filter(|(_, r)| r.dehumid.is_some()).collect();
    if with_dehumid.is_empty() {
        return None;
    }
    let load = c.label(Measure::LoadCompact);
    let cols = vec![
        text_col("AHU"),
        num_col("Cooling total", load),
        num_col("Cooling", "ton"),
        num_col("Cooling supply", c.label(Measure::Airflow)),
        num_col("Dehumid total", load),
        num_col("Dehumid", "ton"),
        num_col("Dehumid supply", c.label(Measure::Airflow)),
        text_col("Governs"),
    ];
    let rows = with_dehumid
        .into_iter()
        .filter_map(|(a, r)| {
            let dh = r.dehumid.as_ref()?;
            Some(vec![
                a.name.clone(),
                c.heat_num(Measure::LoadCompact, r.cooling.coil.total_btuh),
                Measure::Capacity.format_number(r.cooling.coil.tons, UnitSystem::Ip),
                c.num(Measure::Airflow, r.cooling.supply_airflow_cfm),
                c.heat_num(Measure::LoadCompact, dh.coil.total_btuh),
                Measure::Capacity.format_number(dh.coil.tons, UnitSystem::Ip),
                c.num(Measure::Airflow, dh.supply_airflow_cfm),
                r.governing.key().to_string(),
            ])
        })
        .collect();
    Some(Table { cols, rows })
}

fn zones(d: &DesignReport, c: Conv) -> Table {
    let cols = vec![
        text_col("Zone"),
        text_col("AHU"),
        num_col("Design airflow", c.label(Measure::Airflow)),
        num_col("Supply ΔT", c.label(Measure::TemperatureDifference)),
        num_col("62.1 V_oz", c.label(Measure::Airflow)),
        num_col("Room RH", "%rh"),
        num_col("Design RH", "%rh"),
        text_col("Note"),
    ];
    let rows = d
        .zones
        .iter()
        .map(|z| {
            let ahu = z
                .ahu
                .and_then(|i| d.ahus.get(i))
                .map_or_else(|| z.served_by.join(", "), |a| a.name.clone());
            let rh = |v: f64| Measure::RelativeHumidity.format_number(v, c.system);
            match &z.flow {
                Some(f) => vec![
                    z.name.clone(),
                    ahu,
                    c.num(Measure::Airflow, f.design_airflow_cfm),
                    c.num(Measure::TemperatureDifference, f.supply_dt_f),
                    c.num(Measure::Airflow, f.v_oz_cfm),
                    rh(f.room_rh_pct),
                    rh(f.design_rh_pct),
                    if f.above_design_humidity {
                        "more humid than its design state".to_string()
                    } else {
                        String::new()
                    },
                ],
                None => vec![
                    z.name.clone(),
                    ahu,
                    NONE.to_string(),
                    NONE.to_string(),
                    NONE.to_string(),
                    NONE.to_string(),
                    NONE.to_string(),
                    z.note.clone().unwrap_or_default(),
                ],
            }
        })
        .collect();
    Table { cols, rows }
}

fn standard_air(d: &DesignReport, c: Conv) -> Table {
    let air = c.label(Measure::Airflow);
    let load = c.label(Measure::LoadCompact);
    let cols = vec![
        text_col("AHU"),
        num_col("Supply, exact", air),
        num_col("Q_s / (1.08 ΔT)", air),
        num_col("Difference", "%"),
        num_col("Coil total, exact", load),
        num_col("4.5 · cfm · Δh", load),
        num_col("Difference", "%"),
    ];
    let rows = d
        .computed()
        .map(|(a, r)| {
            let g = r.governing();
            let s = &g.standard_air;
            vec![
                a.name.clone(),
                c.num(Measure::Airflow, g.supply_airflow_cfm),
                c.num(Measure::Airflow, s.supply_airflow_cfm),
                Measure::Percent.format_number(s.supply_airflow_diff_pct, c.system),
                c.heat_num(Measure::LoadCompact, g.coil.total_btuh),
                c.heat_num(Measure::LoadCompact, s.coil_total_btuh),
                Measure::Percent.format_number(s.coil_total_diff_pct, c.system),
            ]
        })
        .collect();
    Table { cols, rows }
}

fn assumptions(d: &DesignReport) -> Table {
    Table {
        cols: vec![
            text_col("Applies to"),
            text_col("Key"),
            text_col("Value used"),
            text_col("Source"),
        ],
        rows: d
            .assumptions
            .iter()
            .map(|a| {
                vec![
                    a.subject.clone(),
                    a.key.to_string(),
                    a.value.clone(),
                    a.source.to_string(),
                ]
            })
            .collect(),
    }
}

fn findings(d: &DesignReport) -> Table {
    Table {
        cols: vec![
            text_col("Severity"),
            text_col("AHU"),
            text_col("Where"),
            text_col("Finding"),
        ],
        rows: d
            .all_findings()
            .map(|n| {
                vec![
                    n.severity.as_str().to_string(),
                    n.ahu.clone().unwrap_or_else(|| NONE.to_string()),
                    at(&n.pos),
                    format!("{} [{}]", n.message, n.code),
                ]
            })
            .collect(),
    }
}

/// A unit's status word with what makes it so, for the summary line.
fn count_status(d: &DesignReport) -> String {
    let mut counts = std::collections::BTreeMap::new();
    for (_, r) in d.computed() {
        *counts.entry(r.status().key()).or_insert(0usize) += 1;
    }
    let left_out = d.left_out().count();
    let mut parts: Vec<String> = counts.iter().map(|(k, n)| format!("{n} {k}")).collect();
    if left_out > 0 {
        parts.push(format!("{left_out} left out"));
    }
    if parts.is_empty() {
        "no air handlers".to_string()
    } else {
        format!("Air handlers: {}", parts.join(", "))
    }
}

/// The document of a whole report.
pub fn build(report: &Report) -> Vec<Block> {
    let c = report.conv;
    let mut doc = Vec::new();
    for d in &report.designs {
        let title = match &d.project {
            Some(p) => format!("Coil report: {p}"),
            None => format!("Coil report: {}", d.file),
        };
        doc.push(Block::Title(title));
        let uses: Vec<String> = d
            .model
            .files
            .iter()
            .skip(1)
            .map(|f| f.path.display().to_string())
            .collect();
        let mut head = format!("Design: {}", d.file);
        if !uses.is_empty() {
            head.push_str(&format!(" (uses {})", uses.join(", ")));
        }
        head.push_str(&format!(
            ". Units: {}.",
            match c.system {
                UnitSystem::Ip => "IP",
                UnitSystem::Si => "SI",
            }
        ));
        doc.push(Block::Para(head));
        doc.push(Block::Para(site_line(d, c)));
        doc.push(Block::Para(format!("{}.", count_status(d))));

        doc.push(Block::Heading("Coil schedule".to_string()));
        let sched = schedule(d, c);
        if sched.rows.is_empty() {
            doc.push(Block::Para("No air handler could be computed.".to_string()));
        } else {
            doc.push(Block::Table(sched));
            doc.push(Block::Para(
                "Figures at the governing design case (the one with the larger coil total). \
                 OA % is the outdoor-air fraction by mass; margin is rated / required − 1."
                    .to_string(),
            ));
        }
        if let Some(t) = cases(d, c) {
            doc.push(Block::Heading("Design cases".to_string()));
            doc.push(Block::Table(t));
        }
        let left: Vec<String> = d
            .left_out()
            .flat_map(|a| {
                a.reasons.iter().map(move |x| {
                    format!(
                        "`{}` ({}): {}: {} [{}]",
                        a.name,
                        at(&a.pos),
                        at(&x.pos),
                        x.message,
                        x.code
                    )
                })
            })
            .collect();
        if !left.is_empty() {
            doc.push(Block::Heading("Air handlers left out".to_string()));
            doc.push(Block::Para(
                "These could not be computed: a value they need is unknown.".to_string(),
            ));
            doc.push(Block::Bullets(left));
        }
        doc.push(Block::Heading("Zones".to_string()));
        if d.zones.is_empty() {
            doc.push(Block::Para("No zones.".to_string()));
        } else {
            doc.push(Block::Table(zones(d, c)));
        }
        let std = standard_air(d, c);
        if !std.rows.is_empty() {
            doc.push(Block::Heading("Standard-air cross-check".to_string()));
            doc.push(Block::Table(std));
            doc.push(Block::Para(
                "Hand-calculation figures (common practice): 1.08 and 4.5 assume air of \
                 0.075 lb/ft³; the exact figures use the psychrometric state at the site \
                 pressure and are the ones to use."
                    .to_string(),
            ));
        }
        let asm = assumptions(d);
        if !asm.rows.is_empty() {
            doc.push(Block::Heading("Assumptions".to_string()));
            doc.push(Block::Table(asm));
        }
        let f = findings(d);
        doc.push(Block::Heading("Findings".to_string()));
        if f.rows.is_empty() {
            doc.push(Block::Para("None.".to_string()));
        } else {
            doc.push(Block::Table(f));
        }
        if !d.diagnostics.is_empty() {
            doc.push(Block::Heading("Diagnostics".to_string()));
            doc.push(Block::Bullets(
                d.diagnostics
                    .iter()
                    .map(|x| {
                        format!(
                            "{}: {}: {} [{}]",
                            at(&x.pos),
                            x.severity.as_str(),
                            x.message,
                            x.code
                        )
                    })
                    .collect(),
            ));
        }
    }
    if report.designs.is_empty() {
        doc.push(Block::Para("No designs.".to_string()));
    }
    doc.push(Block::Caution(CAUTION.to_string()));
    doc
}

fn width(s: &str) -> usize {
    s.chars().count()
}

fn pad(s: &str, w: usize, align: Align) -> String {
    let fill = " ".repeat(w.saturating_sub(width(s)));
    match align {
        Align::Left => format!("{s}{fill}"),
        Align::Right => format!("{fill}{s}"),
    }
}

fn wrap(text: &str, max: usize) -> Vec<String> {
    let mut lines = Vec::new();
    let mut line = String::new();
    for word in text.split_whitespace() {
        if !line.is_empty() && width(&line) + 1 + width(word) > max {
            lines.push(std::mem::take(&mut line));
        }
        if !line.is_empty() {
            line.push(' ');
        }
        line.push_str(word);
    }
    if !line.is_empty() {
        lines.push(line);
    }
    lines
}

/// Text width for paragraphs.
const TEXT_WIDTH: usize = 100;

fn text_table(t: &Table, out: &mut String) {
    let has_units = t.cols.iter().any(|c| !c.unit.is_empty());
    let mut widths: Vec<usize> = t
        .cols
        .iter()
        .map(|c| width(&c.name).max(width(&c.unit)))
        .collect();
    for row in &t.rows {
        for (i, cell) in row.iter().enumerate() {
            if let Some(w) = widths.get_mut(i) {
                *w = (*w).max(width(cell));
            }
        }
    }
    let line = |cells: Vec<String>| -> String {
        let joined = cells.join("  ");
        format!("{}\n", joined.trim_end())
    };
    out.push_str(&line(
        t.cols
            .iter()
            .zip(&widths)
            .map(|(c, w)| pad(&c.name, *w, c.align))
            .collect(),
    ));
    if has_units {
        out.push_str(&line(
            t.cols
                .iter()
                .zip(&widths)
                .map(|(c, w)| pad(&c.unit, *w, c.align))
                .collect(),
        ));
    }
    out.push_str(&line(widths.iter().map(|w| "-".repeat(*w)).collect()));
    for row in &t.rows {
        out.push_str(&line(
            t.cols
                .iter()
                .zip(&widths)
                .enumerate()
                .map(|(i, (c, w))| pad(row.get(i).map_or("", String::as_str), *w, c.align))
                .collect(),
        ));
    }
}

/// The document aligned for a terminal.
pub fn text(doc: &[Block]) -> String {
    let mut out = String::new();
    for (i, b) in doc.iter().enumerate() {
        if i > 0 {
            out.push('\n');
        }
        match b {
            Block::Title(t) => {
                out.push_str(&format!("{t}\n{}\n", "=".repeat(width(t))));
            }
            Block::Heading(t) => {
                out.push_str(&format!("{t}\n{}\n", "-".repeat(width(t))));
            }
            Block::Para(p) => {
                for l in wrap(p, TEXT_WIDTH) {
                    out.push_str(&l);
                    out.push('\n');
                }
            }
            Block::Table(t) => text_table(t, &mut out),
            Block::Bullets(items) => {
                for item in items {
                    for (k, l) in wrap(item, TEXT_WIDTH - 2).into_iter().enumerate() {
                        out.push_str(if k == 0 { "- " } else { "  " });
                        out.push_str(&l);
                        out.push('\n');
                    }
                }
            }
            Block::Caution(t) => {
                for l in wrap(t, TEXT_WIDTH) {
                    out.push_str(&l);
                    out.push('\n');
                }
            }
        }
    }
    out
}

fn md_cell(s: &str) -> String {
    s.replace('\\', "\\\\")
        .replace('|', "\\|")
        .replace('\n', " ")
}

/// The document as markdown (GitHub-flavoured tables).
pub fn markdown(doc: &[Block]) -> String {
    let mut out = String::new();
    for (i, b) in doc.iter().enumerate() {
        if i > 0 {
            out.push('\n');
        }
        match b {
            Block::Title(t) => out.push_str(&format!("## {}\n", md_cell(t))),
            Block::Heading(t) => out.push_str(&format!("### {}\n", md_cell(t))),
            Block::Para(p) => out.push_str(&format!("{p}\n")),
            Block::Table(t) => {
                let head: Vec<String> = t
                    .cols
                    .iter()
                    .map(|c| {
                        if c.unit.is_empty() {
                            md_cell(&c.name)
                        } else {
                            md_cell(&format!("{} ({})", c.name, c.unit))
                        }
                    })
                    .collect();
                out.push_str(&format!("| {} |\n", head.join(" | ")));
                let rule: Vec<&str> = t
                    .cols
                    .iter()
                    .map(|c| match c.align {
                        Align::Left => ":---",
                        Align::Right => "---:",
                    })
                    .collect();
                out.push_str(&format!("| {} |\n", rule.join(" | ")));
                for row in &t.rows {
                    let cells: Vec<String> = (0..t.cols.len())
                        .map(|i| md_cell(row.get(i).map_or("", String::as_str)))
                        .collect();
                    out.push_str(&format!("| {} |\n", cells.join(" | ")));
                }
            }
            Block::Bullets(items) => {
                for item in items {
                    out.push_str(&format!("- {item}\n"));
                }
            }
            Block::Caution(t) => match t.strip_prefix("Caution:") {
                Some(rest) => out.push_str(&format!("> **Caution:**{rest}\n")),
                None => out.push_str(&format!("> {t}\n")),
            },
        }
    }
    out
}
