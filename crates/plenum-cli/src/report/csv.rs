//! `--format csv`: sections of comma-separated values for a spreadsheet.
//!
//! The output is one section per table, separated by an empty line, in this
//! order: `schedule` (one row per air handler, computed or left out),
//! `zone`, `assumption`, `finding`, `diagnostic`, `caution`. Each section
//! has exactly one header row; the first column, `table`, repeats the
//! section's name on every row so that a spreadsheet filter (or a script
//! splitting on it) can take one table out of the file. Units are in the
//! column names (`supply_airflow_cfm`, `total_w`…). Numbers are rounded to the
//! trade's precision by [`Measure`], written without thousands separators;
//! a value that does not exist is an empty cell. RFC 4180 quoting: a cell
//! with a comma, a quote or a line break is quoted, quotes doubled.

use plenum_units::{Measure, UnitSystem};

use super::collect::DesignReport;
use super::conv::Conv;
use super::{CAUTION, Report};

fn cell(s: &str) -> String {
    if s.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_string()
    }
}

fn row(cells: &[String]) -> String {
    let mut line = cells.iter().map(|c| cell(c)).collect::<Vec<_>>().join(",");
    line.push_str("\r\n");
    line
}

/// A number as the spreadsheet reads it: the measure's rounding, no separators.
fn n(c: Conv, m: Measure, ip_value: f64) -> String {
    c.num(m, ip_value).replace(',', "")
}

fn n_ip(m: Measure, v: f64) -> String {
    m.format_number(v, UnitSystem::Ip).replace(',', "")
}

fn pct(c: Conv, ratio: f64) -> String {
    Measure::Percent
        .format_number(ratio * 100.0, c.system)
        .replace(',', "")
}

fn schedule(out: &mut String, designs: &[DesignReport], c: Conv) {
    let air = if c.is_si() { "l_s" } else { "cfm" };
    let t = if c.is_si() { "c" } else { "f" };
    let load = if c.is_si() { "w" } else { "btu_h" };
    let cap = if c.is_si() { "kw" } else { "tons" };
    let header: Vec<String> = [
        "table".to_string(),
        "design".to_string(),
        "air_handler".to_string(),
        "label".to_string(),
        "serves".to_string(),
        "status".to_string(),
        "governing_case".to_string(),
        format!("supply_airflow_{air}"),
        format!("outdoor_airflow_{air}"),
        "outdoor_air_fraction_pct".to_string(),
        format!("ventilation_required_{air}"),
        format!("entering_tdb_{t}"),
        format!("entering_twb_{t}"),
        format!("leaving_tdb_{t}"),
        format!("leaving_twb_{t}"),
        format!("total_{load}"),
        format!("sensible_{load}"),
        format!("latent_{load}"),
        "tons".to_string(),
        format!("rated_{cap}"),
        "margin_pct".to_string(),
        format!("cooling_total_{load}"),
        format!("dehumid_total_{load}"),
        format!("standard_air_supply_airflow_{air}"),
        "standard_air_supply_airflow_diff_pct".to_string(),
        format!("standard_air_coil_total_{load}"),
        "standard_air_coil_total_diff_pct".to_string(),
        "note".to_string(),
    ]
    .to_vec();
    out.push_str(&row(&header));
    for d in designs {
        for a in &d.ahus {
            let mut cells = vec![
                "schedule".to_string(),
                d.file.clone(),
                a.name.clone(),
                a.label.clone().unwrap_or_default(),
                a.serves.join(" "),
            ];
            match d.result(a) {
                Some(r) => {
                    let g = r.governing();
                    let s = &g.states;
                    cells.extend([
                        g.capacity.status.key().to_string(),
                        r.governing.key().to_string(),
                        n(c, Measure::Airflow, g.supply_airflow_cfm),
                        n(c, Measure::Airflow, g.outdoor_airflow_cfm),
                        pct(c, g.outdoor_air_fraction),
                        n(c, Measure::Airflow, g.ventilation_required_cfm),
                        n(c, Measure::Temperature, s.entering.tdb_f),
                        n(c, Measure::Temperature, s.entering.twb_f),
                        n(c, Measure::Temperature, s.leaving.tdb_f),
                        n(c, Measure::Temperature, s.leaving.twb_f),
                        n(c, Measure::Load, g.coil.total_btuh),
                        n(c, Measure::Load, g.coil.sensible_btuh),
                        n(c, Measure::Load, g.coil.latent_btuh),
                        n_ip(Measure::Capacity, g.coil.tons),
                        g.capacity
                            .rated_tons
                            .map(|v| n(c, Measure::Capacity, v))
                            .unwrap_or_default(),
                        g.capacity.margin.map(|m| pct(c, m)).unwrap_or_default(),
                        n(c, Measure::Load, r.cooling.coil.total_btuh),
                        r.dehumid
                            .as_ref()
                            .map(|x| n(c, Measure::Load, x.coil.total_btuh))
                            .unwrap_or_default(),
                        n(c, Measure::Airflow, g.standard_air.supply_airflow_cfm),
                        Measure::Percent
                            .format_number(g.standard_air.supply_airflow_diff_pct, c.system),
                        n(c, Measure::Load, g.standard_air.coil_total_btuh),
                        Measure::Percent
                            .format_number(g.standard_air.coil_total_diff_pct, c.system),
                        String::new(),
                    ]);
                }
                None => {
                    cells.push("left_out".to_string());
                    cells.extend(std::iter::repeat_n(String::new(), header.len() - 7));
                    cells.push(
                        a.reasons
                            .iter()
                            .map(|x| format!("{}: {} [{}]", x.pos.short(), x.message, x.code))
                            .collect::<Vec<_>>()
                            .join("; "),
                    );
                }
            }
            out.push_str(&row(&cells));
        }
    }
}

fn zones(out: &mut String, designs: &[DesignReport], c: Conv) {
    let air = if c.is_si() { "l_s" } else { "cfm" };
    let dt = if c.is_si() { "k" } else { "f" };
    out.push_str(&row(&[
        "table".to_string(),
        "design".to_string(),
        "zone".to_string(),
        "label".to_string(),
        "air_handler".to_string(),
        "case".to_string(),
        format!("design_airflow_{air}"),
        format!("supply_dt_{dt}"),
        format!("v_oz_{air}"),
        "room_rh_pct".to_string(),
        "design_rh_pct".to_string(),
        "note".to_string(),
    ]));
    for d in designs {
        for z in &d.zones {
            let ahu = z
                .ahu
                .and_then(|i| d.ahus.get(i))
                .map_or_else(|| z.served_by.join(" "), |a| a.name.clone());
            let f = z.flow.as_ref();
            let rh = |v: f64| Measure::RelativeHumidity.format_number(v, c.system);
            out.push_str(&row(&[
                "zone".to_string(),
                d.file.clone(),
                z.name.clone(),
                z.label.clone().unwrap_or_default(),
                ahu,
                z.case.map(|x| x.key().to_string()).unwrap_or_default(),
                f.map(|f| n(c, Measure::Airflow, f.design_airflow_cfm))
                    .unwrap_or_default(),
                f.map(|f| n(c, Measure::TemperatureDifference, f.supply_dt_f))
                    .unwrap_or_default(),
                f.map(|f| n(c, Measure::Airflow, f.v_oz_cfm))
                    .unwrap_or_default(),
                f.map(|f| rh(f.room_rh_pct)).unwrap_or_default(),
                f.map(|f| rh(f.design_rh_pct)).unwrap_or_default(),
                z.note.clone().unwrap_or_default(),
            ]));
        }
    }
}

fn assumptions(out: &mut String, designs: &[DesignReport]) {
    out.push_str(&row(&[
        "table".to_string(),
        "design".to_string(),
        "applies_to".to_string(),
        "key".to_string(),
        "value".to_string(),
        "source".to_string(),
    ]));
    for d in designs {
        for a in &d.assumptions {
            out.push_str(&row(&[
                "assumption".to_string(),
                d.file.clone(),
                a.subject.clone(),
                a.key.to_string(),
                a.value.clone(),
                a.source.to_string(),
            ]));
        }
    }
}

fn findings(out: &mut String, designs: &[DesignReport]) {
    out.push_str(&row(&[
        "table".to_string(),
        "design".to_string(),
        "severity".to_string(),
        "code".to_string(),
        "air_handler".to_string(),
        "message".to_string(),
        "file".to_string(),
        "line".to_string(),
        "column".to_string(),
    ]));
    for d in designs {
        for x in d.all_findings() {
            out.push_str(&row(&[
                "finding".to_string(),
                d.file.clone(),
                x.severity.as_str().to_string(),
                x.code.to_string(),
                x.ahu.clone().unwrap_or_default(),
                x.message.clone(),
                x.pos.file.clone(),
                x.pos.line.to_string(),
                x.pos.column.to_string(),
            ]));
        }
    }
}

fn diagnostics(out: &mut String, designs: &[DesignReport]) {
    out.push_str(&row(&[
        "table".to_string(),
        "design".to_string(),
        "severity".to_string(),
        "code".to_string(),
        "message".to_string(),
        "file".to_string(),
        "line".to_string(),
        "column".to_string(),
    ]));
    for d in designs {
        for x in &d.diagnostics {
            out.push_str(&row(&[
                "diagnostic".to_string(),
                d.file.clone(),
                x.severity.as_str().to_string(),
                x.code.to_string(),
                x.message.clone(),
                x.pos.file.clone(),
                x.pos.line.to_string(),
                x.pos.column.to_string(),
            ]));
        }
    }
}

/// The report as CSV sections.
pub fn render(report: &Report) -> String {
    let c = report.conv;
    let mut out = String::new();
    schedule(&mut out, &report.designs, c);
    out.push_str("\r\n");
    zones(&mut out, &report.designs, c);
    out.push_str("\r\n");
    assumptions(&mut out, &report.designs);
    out.push_str("\r\n");
    findings(&mut out, &report.designs);
    out.push_str("\r\n");
    diagnostics(&mut out, &report.designs);
    out.push_str("\r\n");
    out.push_str(&row(&["table".to_string(), "text".to_string()]));
    out.push_str(&row(&["caution".to_string(), CAUTION.to_string()]));
    out
}
