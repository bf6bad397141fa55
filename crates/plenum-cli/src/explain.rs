//! `plenum explain CODE` and `plenum explain --list`.

use std::process::ExitCode;

use plenum_checks::{CHECKS, lookup, suggest};

#[derive(clap::Args, Debug)]
pub struct ExplainArgs {
    /// The check code, e.g. `undersized-coil`.
    #[arg(required_unless_present = "list", conflicts_with = "list")]
    pub code: Option<String>,
    /// List every code with its default severity and summary.
    #[arg(long)]
    pub list: bool,
}

/// Every code, its default severity and summary, one per line.
pub fn list() -> String {
    let width = CHECKS.iter().map(|c| c.code.len()).max().unwrap_or(0);
    let mut out = String::new();
    for c in CHECKS {
        out.push_str(&format!(
            "{:width$}  {:7}  {}\n",
            c.code,
            c.severity.as_str(),
            c.summary
        ));
    }
    out
}

pub fn run(args: &ExplainArgs) -> Result<ExitCode, String> {
    if args.list {
        print!("{}", list());
        return Ok(ExitCode::SUCCESS);
    }
    let code = args.code.as_deref().unwrap_or_default();
    match lookup(code) {
        Some(check) => {
            print!("{}", check.explain());
            Ok(ExitCode::SUCCESS)
        }
        None => Err(match suggest(code) {
            Some(s) => format!(
                "`{code}` is not a check code; did you mean `{s}`? (`plenum explain --list` lists them all)"
            ),
            None => {
                format!("`{code}` is not a check code (`plenum explain --list` lists them all)")
            }
        }),
    }
}
