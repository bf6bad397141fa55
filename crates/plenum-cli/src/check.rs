//! `plenum check`

use std::collections::{BTreeMap, HashSet};
use std::path::{Path, PathBuf};
use std::process::ExitCode;

use plenum_model::{Model, ModelDiagnostic, RealFs};
use plenum_syntax::{Item, Span, SyntaxError, SyntaxErrorKind};

use crate::Format;
use crate::diag::{Diag, Severity};
use crate::files::{self, Loaded};
use crate::render::{self, FileReport};

/// Diagnostics shown per file at most; the rest are counted in one line.
const MAX_SHOWN: usize = 200;

pub fn run(paths: &[PathBuf], format: Format) -> Result<ExitCode, String> {
    let files = files::discover(paths)?;
    let mut unreadable = false;
    let mut texts: Vec<(PathBuf, String)> = Vec::new();
    let mut reports: BTreeMap<PathBuf, FileReport> = BTreeMap::new();
    for path in &files {
        match files::load(path) {
            Ok(Loaded::Text(text)) => texts.push((plenum_model::fs::normalize(path), text)),
            Ok(Loaded::NotUtf8 { prefix, offset }) => {
                reports.insert(path.clone(), not_utf8(path, prefix, offset));
            }
            Err(message) => {
                eprintln!("error: {message}");
                unreadable = true;
            }
        }
    }
    // A file that another checked file `use`s is checked as part of that
    // design, not as a design of its own.
    let used = used_files(&texts);
    let mut syntax_done: HashSet<PathBuf> = HashSet::new();
    let mut seen: HashSet<(PathBuf, &'static str, Span, String)> = HashSet::new();
    for (path, text) in &texts {
        if used.contains(path) {
            continue;
        }
        let model = Model::build(&RealFs, path, text.clone());
        for f in &model.files {
            let report = reports.entry(f.path.clone()).or_insert_with(|| FileReport {
                name: f.path.display().to_string(),
                text: f.text.clone(),
                diags: Vec::new(),
            });
            if syntax_done.insert(f.path.clone()) {
                report.diags.extend(f.parse.errors.iter().map(Diag::from));
            }
        }
        for d in &model.diagnostics {
            let Some(file) = model.file(d.loc.file) else {
                continue;
            };
            let diag = from_model(&model, d);
            if !seen.insert((
                file.path.clone(),
                diag.code,
                diag.span,
                diag.message.clone(),
            )) {
                continue;
            }
            if let Some(report) = reports.get_mut(&file.path) {
                report.diags.push(diag);
            }
        }
    }
    let mut reports: Vec<FileReport> = reports.into_values().collect();
    for r in &mut reports {
        r.diags.sort_by_key(|d| (d.span.start, d.span.end));
        cap(&mut r.diags, r.text.len());
    }
    match format {
        Format::Text => {
            let mut out = String::new();
            for r in &reports {
                out.push_str(&render::text(r));
            }
            print!("{out}");
            eprintln!("{}", render::summary(&reports));
        }
        Format::Json => println!("{}", render::json(&reports)),
    }
    let errors = reports
        .iter()
        .flat_map(|r| &r.diags)
        .any(|d| d.severity == Severity::Error);
    Ok(if unreadable {
        ExitCode::from(2)
    } else if errors {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    })
}

/// The files that some file of the set names in a `use`.
fn used_files(texts: &[(PathBuf, String)]) -> HashSet<PathBuf> {
    let mut used = HashSet::new();
    for (path, text) in texts {
        let dir = path.parent().unwrap_or(Path::new(""));
        for item in &plenum_syntax::parse(text).file.items {
            if let Item::Use(u) = item {
                used.insert(plenum_model::fs::normalize(&dir.join(&u.path.value)));
            }
        }
    }
    used
}

fn from_model(model: &Model, d: &ModelDiagnostic) -> Diag {
    let mut related = Vec::new();
    let mut notes = Vec::new();
    for (loc, text) in &d.related {
        if loc.file == d.loc.file {
            related.push((loc.span, text.clone()));
        } else if let Some(f) = model.file(loc.file) {
            let lc = f
                .lines
                .line_col(loc.span.start, plenum_syntax::ColumnUnit::Char);
            notes.push(format!(
                "{text}: {}:{}:{}",
                f.path.display(),
                lc.line + 1,
                lc.col + 1
            ));
        }
    }
    let help = match (&d.help, notes.is_empty()) {
        (Some(h), true) => Some(h.clone()),
        (Some(h), false) => Some(format!("{h}\n{}", notes.join("\n"))),
        (None, false) => Some(notes.join("\n")),
        (None, true) => None,
    };
    Diag {
        code: d.code.code(),
        severity: match d.severity {
            plenum_model::Severity::Error => Severity::Error,
            plenum_model::Severity::Warning => Severity::Warning,
            plenum_model::Severity::Info => Severity::Info,
        },
        message: d.message.clone(),
        span: d.loc.span,
        label: d.label.clone(),
        related,
        help,
    }
}

fn not_utf8(path: &Path, prefix: String, offset: usize) -> FileReport {
    let at = u32::try_from(offset).unwrap_or(u32::MAX);
    let err = SyntaxError::new(
        SyntaxErrorKind::InvalidCharacter,
        Span::empty(at),
        "file is not valid UTF-8".to_string(),
    )
    .with_label("the first invalid byte is here")
    .with_help("save the file as UTF-8");
    let mut d = Diag::from(&err);
    d.code = "invalid-utf8";
    FileReport {
        name: path.display().to_string(),
        text: prefix,
        diags: vec![d],
    }
}

fn cap(diags: &mut Vec<Diag>, len: usize) {
    if diags.len() > MAX_SHOWN {
        let hidden = diags.len() - MAX_SHOWN;
        diags.truncate(MAX_SHOWN);
        let end = u32::try_from(len).unwrap_or(u32::MAX);
        diags.push(Diag {
            code: "too-many-errors",
            severity: Severity::Error,
            message: format!("{hidden} more errors in this file are not shown"),
            span: Span::empty(end),
            label: None,
            related: Vec::new(),
            help: Some("fix the errors above and check again".to_string()),
        });
    }
}
