//! `plenum`: the command-line front end.
//!
//! Exit codes: 0 when no errors were found, 1 when errors were found, 2 for a
//! usage error, unreadable input or an internal error.

mod air;
mod check;
mod fmt;
mod diag;
mod files;
mod render;

use std::path::PathBuf;
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
    Check(CheckArgs),
    /// Show the properties of one moist-air state.
    Air(air::AirArgs),
    /// Rewrite design files in the canonical layout.
    Fmt(fmt::FmtArgs),
}

#[derive(clap::Args, Debug)]
struct CheckArgs {
    /// Files or folders to check (folders are searched for `*.plenum`,
    /// respecting `.gitignore`). Default: the current folder.
    paths: Vec<PathBuf>,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Text)]
    format: Format,
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

#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
enum Format {
    /// Human-readable diagnostics with source snippets.
    Text,
    /// Machine-readable JSON.
    Json,
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
        Command::Check(args) => check::run(&args.paths, args.format),
        Command::Air(args) => air::run(&args),
        Command::Fmt(args) => fmt::run(&args),
    };
    match result {
        Ok(code) => code,
        Err(message) => {
            eprintln!("error: {message}");
            ExitCode::from(2)
        }
    }
}
