//! `plenum report`: the coil schedule, the zone table, the assumptions and
//! the standard-air cross-check of each design, as text for a terminal,
//! markdown for a pull-request comment, CSV for a spreadsheet or JSON for
//! other tools.
//!
//! A design is a root file and the files it uses: a file that another
//! given file `use`s is reported as part of that design, not on its own
//! (`plenum_checks::roots`). Every figure is the engine's
//! ([`plenum_engine::evaluate`], through the project runner of
//! `plenum-checks`); the report only converts units ([`conv`]) and rounds for
//! display through [`plenum_units::Measure`]. Findings and errors carry the
//! codes and words of `plenum check`, after the project's `plenum.toml` and
//! the files' suppressions.
//!
//! Findings (an undersized coil, a ventilation shortfall…) never stop the
//! report: they are shown in the status column and the findings list. An
//! error that leaves a value unknown leaves out the air handlers it
//! concerns, and the report names each with the reason and its place
//! ([`collect`] says which errors concern which units).
//!
//! Exit status: 0 when the report was produced with every air handler
//! computed (findings or not); 1 when some air handler could not be
//! computed or some value is unknown (the report's diagnostics are not
//! empty); 2 for a usage error or input that could not be read.

mod collect;
mod conv;
mod csv;
mod doc;
mod json;
mod jsonw;
mod words;

use std::path::PathBuf;
use std::process::ExitCode;

use plenum_model::{FileSystem, RealFs};
use plenum_units::UnitSystem;

use crate::files;

pub use collect::DesignReport;
pub use conv::Conv;

/// The version of the JSON form (`schema` key). A change that removes or
/// renames a key, or changes a key's meaning or unit, takes a new number.
pub const SCHEMA: &str = "plenum-report/1";

/// The caution at the end of every report (methods.md §0).
pub const CAUTION: &str = "Caution: this report is a design aid. The inputs are the user's \
responsibility, and every figure must be reviewed by a qualified engineer (licensed where \
required) before it is used to select or install equipment. The mechanical code, the \
ventilation standard and the energy code in force where the building stands take precedence \
over every default and rule of thumb used here.";

#[derive(clap::Args, Debug)]
pub struct ReportArgs {
    /// Design files or folders (folders are searched for `*.plenum`,
    /// respecting `.gitignore`). Default: the current folder.
    pub paths: Vec<PathBuf>,
    /// Output format.
    #[arg(long, value_enum, default_value_t = ReportFormat::Text)]
    pub format: ReportFormat,
    /// Units of the printed values. Default: the project's `units`, else IP.
    #[arg(long, value_enum)]
    pub units: Option<crate::Units>,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, clap::ValueEnum)]
pub enum ReportFormat {
    /// Aligned tables for a terminal.
    Text,
    /// Tables for a pull-request comment.
    Markdown,
    /// Sections of comma-separated values for a spreadsheet.
    Csv,
    /// The JSON form other tools read (schemas/report-ip.schema.json, report-si.schema.json).
    Json,
}

/// Everything one run reports.
pub struct Report {
    pub conv: Conv,
    pub designs: Vec<DesignReport>,
}

impl Report {
    /// Whether some air handler was left out or some value is unknown.
    pub fn incomplete(&self) -> bool {
        self.designs
            .iter()
            .any(|d| !d.diagnostics.is_empty() || d.left_out().next().is_some())
    }
}

pub fn run(args: &ReportArgs) -> Result<ExitCode, String> {
    let paths = files::discover(&args.paths)?;
    if paths.is_empty() {
        let place = if args.paths.is_empty() {
            "the current folder".to_string()
        } else {
            args.paths
                .iter()
                .map(|p| format!("`{}`", p.display()))
                .collect::<Vec<_>>()
                .join(", ")
        };
        return Err(format!("no design files (`*.plenum`) found in {place}"));
    }
    let (report, unreadable) = build(&RealFs, &paths, args.units.map(crate::Units::system));
    for message in &unreadable {
        eprintln!("error: {message}");
    }
    let out = render(&report, args.format)?;
    print!("{out}");
    Ok(if !unreadable.is_empty() {
        ExitCode::from(2)
    } else if report.incomplete() {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    })
}

/// The report in one format.
pub fn render(report: &Report, format: ReportFormat) -> Result<String, String> {
    match format {
        ReportFormat::Json => json::render(report).map(|s| s + "\n"),
        ReportFormat::Text => Ok(doc::text(&doc::build(report))),
        ReportFormat::Markdown => Ok(doc::markdown(&doc::build(report))),
        ReportFormat::Csv => Ok(csv::render(report)),
    }
}

/// Read the given design files through `fs`, find the designs (a root file
/// and what it uses: `plenum_checks::roots`), evaluate and check each
/// (`plenum_checks::check_files`, the runner `plenum check` uses, with the
/// project's `plenum.toml` and the files' suppressions), and collect the
/// report. `units` overrides the projects' own. Also returns a message per
/// file that could not be read (or is not UTF-8).
pub fn build(
    fs: &dyn FileSystem,
    paths: &[PathBuf],
    units: Option<UnitSystem>,
) -> (Report, Vec<String>) {
    let project = plenum_checks::check_files(fs, paths);
    let mut unreadable: Vec<String> = project
        .unreadable
        .iter()
        .map(|(p, e)| format!("cannot read `{}`: {e}", p.display()))
        .collect();
    for f in &project.files {
        if f.diagnostics.iter().any(|d| d.code == "invalid-utf8") {
            unreadable.push(format!(
                "cannot read `{}`: it is not valid UTF-8; save it as UTF-8",
                f.path.display()
            ));
        }
    }
    let system = units.unwrap_or_else(|| {
        let mut systems = project.designs.iter().map(|d| {
            d.model
                .design
                .project
                .units
                .map_or(UnitSystem::Ip, |u| u.value)
        });
        match systems.next() {
            Some(first) if systems.all(|s| s == first) => first,
            _ => UnitSystem::Ip,
        }
    });
    let conv = Conv::new(system);
    let plenum_checks::Project { files, designs, .. } = project;
    let designs = designs
        .into_iter()
        .map(|d| {
            let checks = plenum_checks::check(&d.model, &d.evaluation, &d.config);
            collect::design(&d.root, d.model, d.evaluation, checks, &files, conv)
        })
        .collect();
    (Report { conv, designs }, unreadable)
}

#[cfg(test)]
mod tests;
