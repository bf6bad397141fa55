//! `plenum chart`: a psychrometric chart (SVG) of each air handler's process.
//!
//! One SVG file per air handler, at the governing design case:
//!
//! * no `--ahu`: every air handler of the design; `--ahu NAME` (repeatable)
//!   picks some, in the order given;
//! * without `-o`, each chart is written to the current folder as
//!   `<design>-<ahu>.svg` (`library-ahu_1.svg` for `examples/library.plenum`);
//! * with `-o FILE.svg` and one air handler, to that file; with several,
//!   beside it as `FILE-<ahu>.svg`; `-o -` writes the one chart to stdout.
//!
//! The paths written are printed, one a line. Units: `--units`, else the
//! design's `project { units }`, else IP.
//!
//! Exit codes: 0 when every chart asked for was written; 1 when the design
//! has errors (nothing is written; `plenum check` shows them) or an air
//! handler asked for could not be computed (the others are still written);
//! 2 for a usage error or a file that cannot be read or written.

use std::path::{Path, PathBuf};
use std::process::ExitCode;

use plenum_chart::Unavailable;
use plenum_checks::{Config, Diagnostic, Severity};
use plenum_model::{Model, RealFs};
use plenum_units::UnitSystem;

use crate::files::{self, Loaded};

#[derive(clap::Args, Debug)]
pub struct ChartArgs {
    /// The design file (its root file; the files it `use`s are read too).
    pub path: PathBuf,
    /// The air handler to chart, by name; repeat for several. Default: all.
    #[arg(long = "ahu", value_name = "NAME")]
    pub ahu: Vec<String>,
    /// Where to write the SVG (`-` for stdout). With several air handlers,
    /// `FILE-<ahu>.svg` beside it. Default: `<design>-<ahu>.svg` in the
    /// current folder.
    #[arg(short = 'o', long = "output", value_name = "FILE.svg")]
    pub output: Option<PathBuf>,
    /// Units of the chart. Default: the design's `project { units }`, else IP.
    #[arg(long, value_enum)]
    pub units: Option<crate::Units>,
}

/// Where each chart goes.
#[derive(Debug, PartialEq, Eq)]
enum Target {
    Stdout,
    File(PathBuf),
}

/// The output of each of `names` (at least one).
fn targets(design: &Path, output: Option<&Path>, names: &[&str]) -> Result<Vec<Target>, String> {
    let stem = |p: &Path| {
        p.file_stem()
            .map(|s| s.to_string_lossy().into_owned())
            .unwrap_or_else(|| "chart".to_string())
    };
    match output {
        Some(o) if o == Path::new("-") => {
            if names.len() == 1 {
                Ok(vec![Target::Stdout])
            } else {
                Err(format!(
                    "`-o -` writes one chart to stdout, but {} air handlers were asked for; \
                     pick one with `--ahu NAME`",
                    names.len()
                ))
            }
        }
        Some(o) if names.len() == 1 => Ok(vec![Target::File(o.to_path_buf())]),
        Some(o) => {
            let ext = o
                .extension()
                .map_or_else(|| "svg".to_string(), |e| e.to_string_lossy().into_owned());
            let dir = o.parent().unwrap_or(Path::new(""));
            Ok(names
                .iter()
                .map(|n| Target::File(dir.join(format!("{}-{}.{ext}", stem(o), file_part(n)))))
                .collect())
        }
        None => Ok(names
            .iter()
            .map(|n| {
                Target::File(PathBuf::from(format!(
                    "{}-{}.svg",
                    stem(design),
                    file_part(n)
                )))
            })
            .collect()),
    }
}

/// An air handler's name as part of a file name (names are identifiers;
/// anything else is replaced, so a name never leaves the folder).
fn file_part(name: &str) -> String {
    name.chars()
        .map(|c| {
            if c.is_alphanumeric() || c == '_' || c == '-' {
                c
            } else {
                '_'
            }
        })
        .collect()
}

pub fn run(args: &ChartArgs) -> Result<ExitCode, String> {
    let text = match files::load(&args.path)? {
        Loaded::Text(t) => t,
        Loaded::NotUtf8 { offset, .. } => {
            return Err(format!(
                "cannot read `{}`: it is not valid UTF-8 (byte {offset}); save it as UTF-8",
                args.path.display()
            ));
        }
    };
    let path = plenum_model::fs::normalize(&args.path);
    let model = Model::build(&RealFs, &path, text);
    let design = &model.design;

    // Which air handlers, by index, in the order asked (each once).
    let mut picked: Vec<usize> = Vec::new();
    if args.ahu.is_empty() {
        picked.extend(0..design.ahus.len());
    } else {
        for name in &args.ahu {
            let i = design
                .ahus
                .iter()
                .position(|a| &a.name == name)
                .ok_or_else(|| unknown_ahu(name, &model))?;
            if !picked.contains(&i) {
                picked.push(i);
            }
        }
    }
    let names: Vec<&str> = picked
        .iter()
        .filter_map(|&i| design.ahus.get(i).map(|a| a.name.as_str()))
        .collect();
    if names.is_empty() {
        eprintln!(
            "error: `{}` has no air handler to chart",
            args.path.display()
        );
        return Ok(ExitCode::from(1));
    }
    let targets = targets(&args.path, args.output.as_deref(), &names)?;

    let eval = plenum_engine::evaluate(design);
    let config = Config::discover(&RealFs, &path);
    let diagnostics = plenum_checks::check(&model, &eval, &config);
    if model.has_errors() {
        let errors: Vec<&Diagnostic> = diagnostics
            .iter()
            .filter(|d| d.severity == Severity::Error)
            .collect();
        for d in errors.iter().take(5) {
            eprintln!("{}", one_line(&model, d));
        }
        eprintln!(
            "error: `{}` has errors, so no chart was drawn; `plenum check {}` shows them all",
            args.path.display(),
            args.path.display()
        );
        return Ok(ExitCode::from(1));
    }

    let units = args
        .units
        .map(crate::Units::system)
        .unwrap_or_else(|| design.project.units.map_or(UnitSystem::Ip, |u| u.value));
    let mut failed = false;
    for ((&index, name), target) in picked.iter().zip(&names).zip(&targets) {
        match plenum_chart::chart_of(design, &eval, index, units) {
            Ok(chart) => {
                let svg = plenum_chart::render_svg(&chart);
                match target {
                    Target::Stdout => print!("{svg}"),
                    Target::File(p) => {
                        std::fs::write(p, svg).map_err(|e| {
                            format!("cannot write `{}`: {}", p.display(), files::io_reason(&e))
                        })?;
                        println!("{}", p.display());
                    }
                }
            }
            Err(why) => {
                failed = true;
                let reason = match &why {
                    Unavailable::Engine(e) | Unavailable::Site(e) => {
                        explain(&model, &diagnostics, e)
                    }
                    other => other.to_string(),
                };
                eprintln!("error: no chart of `{name}`: it could not be computed: {reason}");
            }
        }
    }
    Ok(if failed {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    })
}

fn unknown_ahu(name: &str, model: &Model) -> String {
    let known: Vec<String> = model
        .design
        .ahus
        .iter()
        .map(|a| format!("`{}`", a.name))
        .collect();
    if known.is_empty() {
        format!("--ahu `{name}`: the design has no air handler")
    } else {
        format!(
            "--ahu `{name}`: no such air handler; the design has {}",
            known.join(", ")
        )
    }
}

/// The checker's words for an engine error: the error diagnostic at its
/// location, else one with its code, else the code alone.
fn explain(model: &Model, diagnostics: &[Diagnostic], e: &plenum_engine::EngineError) -> String {
    let code = plenum_checks::error_code(e);
    let loc = e.loc();
    let file = model.file(loc.file).map(|f| f.path.clone());
    let errors = || {
        diagnostics
            .iter()
            .filter(|d| d.severity == Severity::Error && d.code != "not-evaluated")
    };
    let at = errors().find(|d| Some(&d.loc.file) == file.as_ref() && d.loc.span == loc.span);
    let same_code = || errors().find(|d| d.code == code);
    match at.or_else(same_code) {
        Some(d) => format!("{} [{}]", d.message, d.code),
        None => format!("see `plenum check` [{code}]"),
    }
}

/// `path:line:col: error[code]: message`.
fn one_line(model: &Model, d: &Diagnostic) -> String {
    let place = model
        .files
        .iter()
        .find(|f| f.path == d.loc.file)
        .map(|f| {
            let lc = f
                .lines
                .line_col(d.loc.span.start, plenum_syntax::ColumnUnit::Char);
            format!("{}:{}:{}", f.path.display(), lc.line + 1, lc.col + 1)
        })
        .unwrap_or_else(|| d.loc.file.display().to_string());
    format!("{place}: error[{}]: {}", d.code, d.message)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn output_names() {
        let d = Path::new("examples/library.plenum");
        assert_eq!(
            targets(d, None, &["ahu_1", "ahu_2"]).unwrap(),
            vec![
                Target::File("library-ahu_1.svg".into()),
                Target::File("library-ahu_2.svg".into())
            ]
        );
        assert_eq!(
            targets(d, Some(Path::new("out/x.svg")), &["ahu_1"]).unwrap(),
            vec![Target::File("out/x.svg".into())]
        );
        assert_eq!(
            targets(d, Some(Path::new("out/x.svg")), &["a", "b"]).unwrap(),
            vec![
                Target::File("out/x-a.svg".into()),
                Target::File("out/x-b.svg".into())
            ]
        );
        assert_eq!(
            targets(d, Some(Path::new("-")), &["a"]).unwrap(),
            vec![Target::Stdout]
        );
        assert!(targets(d, Some(Path::new("-")), &["a", "b"]).is_err());
        assert_eq!(file_part("a/../b"), "a____b");
    }
}
