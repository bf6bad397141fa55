//! `plenum check`: every design under the given paths, through the
//! checker's project runner ([`plenum_checks::check_files`]).
//!
//! Output formats: `text` (miette snippets grouped by file, a summary line
//! and the caution), `json` (`{"diagnostics": [...]}`, plus `"baseline"`
//! with `--baseline`), `sarif` (SARIF 2.1.0), `github` (workflow-command
//! annotations) and `markdown` (a pull-request comment).
//!
//! With `--baseline REV` the designs are also checked as of git revision
//! REV and every air handler's required and rated capacity is compared. The
//! comparison is part of the text, JSON and Markdown outputs. With
//! `--format github` it is appended as Markdown to the job summary file
//! named by `GITHUB_STEP_SUMMARY` when that is set, else printed to stderr;
//! with `--format sarif` it is printed to stderr.
//!
//! Exit status: 0 without errors, 1 with errors (or warnings with
//! `--deny warnings`), 2 for a usage error, unreadable input or a baseline
//! that cannot be read.

use std::io::Write;
use std::path::PathBuf;
use std::process::ExitCode;

use clap::ValueEnum;
use plenum_checks::{Severity, check_files};
use plenum_model::RealFs;
use serde::Serialize;

use crate::baseline::{self, Comparison};
use crate::render::{self, CAUTION};
use crate::{files, github, sarif};

#[derive(clap::Args, Debug)]
pub struct CheckArgs {
    /// Files or folders to check (folders are searched for `*.plenum`,
    /// respecting `.gitignore`). Default: the current folder.
    pub paths: Vec<PathBuf>,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Text)]
    pub format: Format,
    /// Fail (exit 1) on these too: `--deny warnings` counts warnings as errors.
    #[arg(long, value_enum, value_name = "WHAT")]
    pub deny: Vec<Deny>,
    /// Also check the designs as of git revision REV and compare every air
    /// handler's required and rated capacity then and now.
    #[arg(long, value_name = "REV")]
    pub baseline: Option<String>,
    /// In text output, also list the infos (each default the engine used,
    /// dry coils and similar notes); otherwise only their count is shown.
    /// The other formats always carry them.
    #[arg(long)]
    pub infos: bool,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum Format {
    /// Human-readable diagnostics with source snippets.
    Text,
    /// Machine-readable JSON.
    Json,
    /// SARIF 2.1.0, for code-scanning tools.
    Sarif,
    /// GitHub Actions workflow-command annotations.
    Github,
    /// Markdown, for a pull-request comment.
    Markdown,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum Deny {
    /// Count warnings as errors for the exit status.
    Warnings,
}

#[derive(Serialize)]
struct JsonOutput {
    diagnostics: Vec<render::JsonDiagnostic>,
    #[serde(skip_serializing_if = "Option::is_none")]
    baseline: Option<Comparison>,
}

pub fn run(args: &CheckArgs) -> Result<ExitCode, String> {
    // Absolute paths, so that `plenum.toml` and the project root are found
    // above every file (output shows them relative to the working folder).
    let paths: Vec<PathBuf> = files::discover(&args.paths)?
        .iter()
        .map(|p| render::absolute(p))
        .collect();
    let project = check_files(&RealFs, &paths);
    for (path, reason) in &project.unreadable {
        eprintln!(
            "error: cannot read `{}`: {reason}",
            render::display_path(path)
        );
    }
    let comparison = match &args.baseline {
        Some(rev) => Some(baseline::compare(rev, &args.paths, &project)?),
        None => None,
    };
    let mut out = String::new();
    match args.format {
        Format::Text => {
            out.push_str(&render::project_text(&project, args.infos));
            if !out.is_empty() && !out.ends_with("\n\n") {
                out.push('\n');
            }
            if let Some(c) = &comparison {
                out.push_str(&baseline::text(c));
                out.push('\n');
            }
            out.push_str(&render::summary(&project));
            let infos = project.count(plenum_checks::Severity::Info);
            if infos > 0 && !args.infos {
                out.push_str(" (--infos lists the infos: the defaults used and similar notes)");
            }
            out.push_str("\n\n");
            out.push_str(CAUTION);
            out.push('\n');
        }
        Format::Json => {
            let value = JsonOutput {
                diagnostics: render::json_diagnostics(&project),
                baseline: comparison.clone(),
            };
            out =
                serde_json::to_string_pretty(&value).map_err(|e| format!("internal error: {e}"))?;
            out.push('\n');
        }
        Format::Sarif => {
            out = sarif::sarif(&project);
            out.push('\n');
            if let Some(c) = &comparison {
                eprint!("{}", baseline::text(c));
            }
        }
        Format::Github => {
            out = github::annotations(&project);
            if let Some(c) = &comparison {
                match std::env::var_os("GITHUB_STEP_SUMMARY") {
                    Some(file) if !file.is_empty() => {
                        let mut f = std::fs::OpenOptions::new()
                            .create(true)
                            .append(true)
                            .open(&file)
                            .map_err(|e| {
                                format!(
                                    "cannot write the job summary `{}`: {e}",
                                    file.to_string_lossy()
                                )
                            })?;
                        let text = format!(
                            "{}\n{}",
                            baseline::markdown(c),
                            baseline::caution_markdown()
                        );
                        f.write_all(text.as_bytes()).map_err(|e| {
                            format!(
                                "cannot write the job summary `{}`: {e}",
                                file.to_string_lossy()
                            )
                        })?;
                    }
                    _ => eprint!("{}", baseline::text(c)),
                }
            }
        }
        Format::Markdown => {
            out.push_str("## Plenum check\n\n");
            if let Some(c) = &comparison {
                out.push_str(&baseline::markdown(c));
                out.push('\n');
            }
            out.push_str(&render::markdown_diagnostics(&project));
            out.push('\n');
            out.push_str(&baseline::caution_markdown());
        }
    }
    print!("{out}");
    let errors = project.count(Severity::Error);
    let warnings = project.count(Severity::Warning);
    let deny_warnings = args.deny.contains(&Deny::Warnings);
    Ok(if !project.unreadable.is_empty() {
        ExitCode::from(2)
    } else if errors > 0 || (deny_warnings && warnings > 0) {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    })
}
