//! Plenum's checker: one [`Diagnostic`] type for everything the toolchain
//! finds, the code [`registry`] with each check's documentation, severities
//! set per project in `plenum.toml`, suppressions for one block in the
//! design file, and the project runner ([`check_files`]) that the CLI and
//! the language server share.
//!
//! ```
//! use plenum_checks::{check_files, Severity};
//! use plenum_model::MemoryFs;
//! use std::path::PathBuf;
//!
//! let mut fs = MemoryFs::new();
//! fs.insert(
//!     "/p/office.plenum",
//!     "site { cooling 94 °F db, 75 °F wb }\n\
//!      zone office { area 1_000 ft²; people 5; use office; sensible 30 kBtu/h; latent 3 kBtu/h }\n\
//!      ahu a { serves office; coil { rated 2 ton } }\n",
//! );
//! let project = check_files(&fs, &[PathBuf::from("/p/office.plenum")]);
//! let (_, d) = project
//!     .diagnostics()
//!     .find(|(_, d)| d.code == "undersized-coil")
//!     .expect("the coil is too small");
//! assert_eq!(d.severity, Severity::Error);
//! assert!(d.message.contains("is rated 2.00 ton (24,000 Btu/h)"));
//! ```
//!
//! # Codes
//!
//! Every syntax error kind, every model finding and every engine error and
//! finding maps to a registered kebab-case code; `plenum explain CODE`
//! prints its documentation (what it checks, why it matters, an example,
//! how to fix it, its source). Codes are stable: CI configurations, SARIF
//! consumers and editors rely on them.
//!
//! # Design cases
//!
//! When a site has a dehumidification design state, the engine solves every
//! air handler at both states. A finding that holds at both is reported
//! once, at the worse case, and the message names it ("at the dehumid design
//! state, the worse of both"); one that holds at one case names that case.
//! `oversized-coil` is judged at the governing case only (the one with the
//! larger coil load, which the coil is selected for): being far above the
//! smaller load is expected. `undersized-coil` holds when the coil falls
//! short at either case, since it must meet both.
//!
//! While any file of a design has a syntax error, the engine's findings are
//! not reported: the design is incomplete, and figures computed from it would
//! mislead. The syntax errors are reported, and fail CI, on their own.
//!
//! # Settings: `plenum.toml`
//!
//! ```toml
//! [checks]
//! "oversized-coil" = "error"
//! "assumption" = "off"
//! ```
//!
//! Each entry sets a check's severity: `error`, `warning`, `info` or `off`.
//! The file is the nearest `plenum.toml` above the design's root file; its
//! settings apply to the whole design. Other tables belong to other tools.
//! An unknown code is reported (`unknown-code`) with the nearest code
//! suggested; a bad file or value is `invalid-config`. Checks that mean the
//! design cannot be read or evaluated as written (syntax, model and engine
//! errors) cannot be adjusted.
//!
//! # Suppressions
//!
//! ```text
//! # plenum: allow oversized-coil -- selected for the future east wing
//! ahu ahu_3 "East wing unit" {
//!   ...
//! }
//! ```
//!
//! A comment line of its own directly above a block (other comment lines may
//! stand between) silences the named codes for diagnostics inside that block.
//! The reason after `--` is required; see [`suppress`] for the rules.

//! # Adding a check
//!
//! 1. Register it in [`registry::CHECKS`]: a kebab-case code, its default
//!    severity, a one-line summary, whether a project may adjust it, and the
//!    five parts of its documentation, with an example that triggers it.
//! 2. Emit it: engine facts are mapped in `convert.rs` ([`finding_code`],
//!    [`error_code`] are exhaustive matches); a check over the results is a
//!    function there too.
//! 3. Add a fixture under `tests/fixtures/` whose annotations expect it. The
//!    tests fail until every registered code has a documentation block whose
//!    example reports it, and a fixture that triggers it.

#![forbid(unsafe_code)]
#![warn(missing_docs)]

pub mod config;
mod convert;
mod diagnostic;
mod number;
pub mod project;
pub mod registry;
pub mod suppress;

use foldhash::{HashSet, HashSetExt};

use plenum_engine::Evaluation;
use plenum_model::Model;

pub use config::Config;
pub use convert::{ASSUMPTION, error_code, finding_code};
pub use diagnostic::{Diagnostic, Edit, Fix, Label, Level, Loc, Severity};
pub use project::{Design, FileReport, Project, check_files, roots};
pub use registry::{CHECKS, Check, Doc, Group, lookup, suggest};

/// The code of a syntax error kind.
pub fn syntax_code(kind: plenum_syntax::SyntaxErrorKind) -> &'static str {
    kind.code()
}

/// The code of a model finding.
pub fn model_code(code: plenum_model::ModelCode) -> &'static str {
    code.code()
}

/// Every diagnostic of one design: the syntax errors of its files, the
/// model's findings, the engine's errors, findings and assumptions, with
/// the project's severities applied and the file's suppressions honoured.
///
/// The diagnostics of `config` itself (a bad `plenum.toml`) are not
/// included: [`check_files`] reports them once per file.
pub fn check(model: &Model, evaluation: &Evaluation, config: &Config) -> Vec<Diagnostic> {
    let ctx = convert::Ctx::new(model);
    let mut diags: Vec<Diagnostic> = Vec::new();
    let mut syntax_errors = false;
    for f in &model.files {
        for e in &f.parse.errors {
            syntax_errors = true;
            diags.push(convert::syntax(&f.path, e));
        }
    }
    let model_diags: Vec<Diagnostic> = model
        .diagnostics
        .iter()
        .map(|m| ctx.model_diag(m))
        .collect();
    let model_errors = syntax_errors || model_diags.iter().any(|d| d.severity == Severity::Error);
    if !syntax_errors {
        let mut engine = ctx.engine_errors(evaluation);
        // An engine error where the model already reported an error is the
        // same mistake seen twice.
        engine.retain(|d| {
            !model_diags.iter().any(|m| {
                m.severity == Severity::Error
                    && m.loc.file == d.loc.file
                    && (m.code == d.code || overlaps(m.loc.span, d.loc.span))
            })
        });
        let explained = model_errors
            || engine
                .iter()
                .any(|d| d.code != "not-evaluated" && d.severity == Severity::Error);
        for d in &mut engine {
            if d.code == "not-evaluated" && !explained {
                // Nothing else explains it: CI must not pass a unit that
                // was not computed.
                d.severity = Severity::Error;
            }
        }
        let findings = ctx.findings(evaluation);
        let assumptions = ctx.assumptions(evaluation);
        diags.extend(model_diags);
        diags.extend(engine);
        diags.extend(findings);
        diags.extend(assumptions);
    } else {
        diags.extend(model_diags);
    }
    dedupe(&mut diags);
    // Suppressions, then the project's severities.
    let mut suppressions = Vec::new();
    for f in &model.files {
        let (s, d) = suppress::suppressions(&f.path, &f.text, &f.parse);
        suppressions.extend(s);
        diags.extend(d);
    }
    let unused = suppress::apply(&suppressions, &mut diags);
    if !syntax_errors {
        diags.extend(unused);
    }
    diags.retain_mut(|d| match config.level(d.code) {
        Some(Level::Off) => false,
        Some(Level::On(s)) => {
            d.severity = s;
            true
        }
        None => true,
    });
    diags.sort_by(|a, b| {
        (&a.loc.file, a.loc.span.start, a.loc.span.end).cmp(&(
            &b.loc.file,
            b.loc.span.start,
            b.loc.span.end,
        ))
    });
    diags
}

fn overlaps(a: plenum_syntax::Span, b: plenum_syntax::Span) -> bool {
    a.start < b.end && b.start < a.end || a == b
}

/// Drop a diagnostic that repeats an earlier one (the same code, place and
/// message: an engine finding and error that say the same thing).
fn dedupe(diags: &mut Vec<Diagnostic>) {
    // The keys borrow the diagnostics (a copy of every path and message
    // cost more than the comparison).
    let keep: Vec<bool> = {
        let mut seen = HashSet::with_capacity(diags.len());
        diags
            .iter()
            .map(|d| seen.insert((d.code, &d.loc, d.message.as_str())))
            .collect()
    };
    let mut keep = keep.into_iter();
    diags.retain(|_| keep.next().unwrap_or(true));
}
