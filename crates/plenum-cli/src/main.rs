//! `plenum`: the command-line front end.
//!
//! Exit codes: 0 when no errors were found, 1 when errors were found (or
//! warnings, with `plenum check --deny warnings`), 2 for a usage error,
//! unreadable input or an internal error.

mod air;
mod baseline;
mod chart;
mod check;
mod diag;
mod explain;
mod files;
mod fmt;
mod github;
mod render;
mod report;
mod sarif;

use std::process::ExitCode;

use clap::{Parser, Subcommand, ValueEnum};

#[derive(Parser, Debug)]
#[command(
    name = "plenum",
    version,
    about = "Check HVAC air-side design files: from zone loads to cooling-coil capacity",
    propagate_version = true
)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand, Debug)]
enum Command {
    /// Check design files and report every problem found.
    Check(check::CheckArgs),
    /// Print the documentation of a check code, or list every code.
    Explain(explain::ExplainArgs),
    /// Show the properties of one moist-air state.
    Air(air::AirArgs),
    /// Rewrite design files in the canonical layout.
    Fmt(fmt::FmtArgs),
    /// Print the coil schedule, zones, assumptions and findings of each design.
    Report(report::ReportArgs),
    /// Draw a psychrometric chart (SVG) of each air handler's process.
    Chart(chart::ChartArgs),
    /// Start the language server on standard input and output.
    Lsp,
}

/// The unit system of printed values.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum Units {
    /// Inch-pound: °F, Btu/h, cfm, psia.
    Ip,
    /// SI: °C, W, L/s, kPa.
    Si,
}

impl Units {
    pub fn system(self) -> plenum_units::UnitSystem {
        match self {
            Units::Ip => plenum_units::UnitSystem::Ip,
            Units::Si => plenum_units::UnitSystem::Si,
        }
    }
}

fn main() -> ExitCode {
    let cli = match Cli::try_parse() {
        Ok(cli) => cli,
        Err(e) => {
            let code = if e.use_stderr() { 2 } else { 0 };
            let _ = e.print();
            return ExitCode::from(code);
        }
    };
    let result = match cli.command {
        Command::Check(args) => check::run(&args),
        Command::Explain(args) => explain::run(&args),
        Command::Air(args) => air::run(&args),
        Command::Fmt(args) => fmt::run(&args),
        Command::Report(args) => report::run(&args),
        Command::Chart(args) => chart::run(&args),
        Command::Lsp => Ok(plenum_lsp::run()),
    };
    match result {
        Ok(code) => code,
        Err(message) => {
            eprintln!("error: {message}");
            ExitCode::from(2)
        }
    }
}
