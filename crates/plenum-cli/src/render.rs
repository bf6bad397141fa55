//! Rendering diagnostics: miette text for people, JSON, SARIF and GitHub
//! annotations for tools, Markdown for pull-request comments.

use std::io::IsTerminal;
use std::path::Path;

use miette::{GraphicalReportHandler, GraphicalTheme, LabeledSpan, MietteDiagnostic, NamedSource};
use plenum_checks::{Diagnostic, Project};
use plenum_syntax::{ColumnUnit, LineIndex, Span};
use serde::Serialize;

use crate::diag::{Diag, Severity};

/// The caution every text and Markdown output ends with (methods.md §0).
pub const CAUTION: &str = "Caution: Plenum is a design aid. The inputs are your responsibility; the results must be reviewed by a qualified engineer (licensed where required), and the codes in force where the building stands govern.";

/// Diagnostics shown per file in text output at most; the rest are counted.
pub const MAX_SHOWN: usize = 200;

/// Diagnostics of one file, with the text they point into.
pub struct FileReport {
    pub name: String,
    pub text: String,
    pub diags: Vec<Diag>,
}

fn miette_span(span: Span, len: usize) -> miette::SourceSpan {
    let start = (span.start as usize).min(len);
    let end = (span.end as usize).clamp(start, len);
    (start, end - start).into()
}

fn handler() -> GraphicalReportHandler {
    let color = std::io::stdout().is_terminal()
        && std::io::stderr().is_terminal()
        && std::env::var_os("NO_COLOR").is_none();
    let theme = if color {
        GraphicalTheme::unicode()
    } else {
        GraphicalTheme::unicode_nocolor()
    };
    GraphicalReportHandler::new_themed(theme).with_context_lines(1)
}

/// Render one file's diagnostics with source snippets.
pub fn text(report: &FileReport) -> String {
    let handler = handler();
    let mut out = String::new();
    for d in &report.diags {
        let mut labels = vec![LabeledSpan::new_primary_with_span(
            d.label.clone(),
            miette_span(d.span, report.text.len()),
        )];
        for (span, text) in &d.related {
            labels.push(LabeledSpan::new_with_span(
                Some(text.clone()),
                miette_span(*span, report.text.len()),
            ));
        }
        let mut diag = MietteDiagnostic::new(d.message.clone())
            .with_code(d.code)
            .with_severity(match d.severity {
                Severity::Error => miette::Severity::Error,
                Severity::Warning => miette::Severity::Warning,
                Severity::Info => miette::Severity::Advice,
            })
            .with_labels(labels);
        if let Some(help) = &d.help {
            diag = diag.with_help(help.clone());
        }
        let report_value = miette::Report::new(diag)
            .with_source_code(NamedSource::new(report.name.clone(), report.text.clone()));
        if handler
            .render_report(&mut out, report_value.as_ref())
            .is_err()
        {
            out.push_str(&format!(
                "{}: {}: {} [{}]\n",
                report.name,
                d.severity.as_str(),
                d.message,
                d.code
            ));
        }
    }
    out
}

/// The working folder, once.
fn cwd() -> Option<&'static Path> {
    static CWD: std::sync::OnceLock<Option<std::path::PathBuf>> = std::sync::OnceLock::new();
    CWD.get_or_init(|| std::env::current_dir().ok()).as_deref()
}

/// The name a file is shown by: relative to the working folder when it is
/// inside it, with forward slashes.
pub fn display_path(path: &Path) -> String {
    let shown = cwd()
        .and_then(|c| path.strip_prefix(c).ok())
        .filter(|p| !p.as_os_str().is_empty())
        .unwrap_or(path);
    shown.to_string_lossy().replace('\\', "/")
}

/// `path` as an absolute path (relative paths start at the working folder),
/// so that `plenum.toml` and the project root are found above it.
pub fn absolute(path: &Path) -> std::path::PathBuf {
    match cwd() {
        Some(c) if path.is_relative() => plenum_model::fs::normalize(&c.join(path)),
        _ => plenum_model::fs::normalize(path),
    }
}

/// One-based line and column (in characters) of the start and end of `span`.
pub fn positions(index: &LineIndex, span: Span) -> (u32, u32, u32, u32) {
    let s = index.line_col(span.start, ColumnUnit::Char);
    let e = index.line_col(span.end, ColumnUnit::Char);
    (s.line + 1, s.col + 1, e.line + 1, e.col + 1)
}

/// A checker diagnostic as the text renderer shows it: labels in other
/// files become notes under the help.
fn to_diag(project: &Project, d: &Diagnostic) -> Diag {
    let mut related = Vec::new();
    let mut notes = Vec::new();
    for l in &d.labels {
        if l.loc.file == d.loc.file {
            related.push((l.loc.span, l.text.clone()));
        } else if let Some(f) = project.file(&l.loc.file) {
            let (line, col, _, _) = positions(&f.lines, l.loc.span);
            notes.push(format!(
                "{}: {}:{line}:{col}",
                l.text,
                display_path(&l.loc.file)
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
        code: d.code,
        severity: d.severity,
        message: d.message.clone(),
        span: d.loc.span,
        label: d.label.clone(),
        related,
        help,
    }
}

/// Every file's diagnostics, grouped by file: errors and warnings with
/// their source snippets, then — when `infos` — the file's infos
/// (assumptions and notes) one line each, so that a design with many defaults
/// stays readable. Without `infos` they are only counted in the summary.
pub fn project_text(project: &Project, infos: bool) -> String {
    let mut out = String::new();
    let show_infos = infos;
    for f in &project.files {
        let name = display_path(&f.path);
        let (mut infos, shown): (Vec<&Diagnostic>, Vec<&Diagnostic>) = f
            .diagnostics
            .iter()
            .partition(|d| d.severity == plenum_checks::Severity::Info);
        if !show_infos {
            infos.clear();
        }
        if shown.is_empty() && infos.is_empty() {
            continue;
        }
        let hidden = shown.len().saturating_sub(MAX_SHOWN);
        let report = FileReport {
            name: name.clone(),
            text: f.text.clone(),
            diags: shown
                .iter()
                .take(MAX_SHOWN)
                .map(|d| to_diag(project, d))
                .collect(),
        };
        out.push_str(&text(&report));
        if hidden > 0 {
            out.push_str(&format!(
                "… {hidden} more errors and warnings in {name} are not shown (the JSON and SARIF outputs have them all)\n\n"
            ));
        }
        if !infos.is_empty() {
            for d in infos.iter().take(MAX_SHOWN) {
                let (line, col, _, _) = positions(&f.lines, d.loc.span);
                out.push_str(&format!(
                    "{name}:{line}:{col}: info[{}]: {}\n",
                    d.code, d.message
                ));
            }
            if infos.len() > MAX_SHOWN {
                out.push_str(&format!(
                    "… {} more infos in {name} are not shown\n",
                    infos.len() - MAX_SHOWN
                ));
            }
            out.push('\n');
        }
    }
    out
}

fn plural(n: usize, word: &str) -> String {
    if n == 1 {
        format!("{n} {word}")
    } else {
        format!("{n} {word}s")
    }
}

/// `3 errors, 1 warning, 0 infos in 2 files`
pub fn summary(project: &Project) -> String {
    let e = project.count(plenum_checks::Severity::Error);
    let w = project.count(plenum_checks::Severity::Warning);
    let i = project.count(plenum_checks::Severity::Info);
    let files = plural(project.files.len(), "file");
    format!(
        "{}, {}, {} in {files}",
        plural(e, "error"),
        plural(w, "warning"),
        plural(i, "info")
    )
}

#[derive(Serialize)]
pub struct JsonDiagnostic {
    pub code: &'static str,
    pub severity: &'static str,
    pub message: String,
    pub file: String,
    pub line: u32,
    pub column: u32,
    pub end_line: u32,
    pub end_column: u32,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub help: Option<String>,
}

/// `{"diagnostics": [...]}`: one-based lines, columns in characters.
pub fn json_diagnostics(project: &Project) -> Vec<JsonDiagnostic> {
    project
        .diagnostics()
        .map(|(f, d)| {
            let (line, column, end_line, end_column) = positions(&f.lines, d.loc.span);
            JsonDiagnostic {
                code: d.code,
                severity: d.severity.as_str(),
                message: d.message.clone(),
                file: display_path(&f.path),
                line,
                column,
                end_line,
                end_column,
                help: d.help.clone(),
            }
        })
        .collect()
}

/// A Markdown table of every diagnostic, for a pull-request comment.
pub fn markdown_diagnostics(project: &Project) -> String {
    let mut out = format!("**{}**\n\n", summary(project));
    let rows: Vec<_> = project.diagnostics().collect();
    if rows.is_empty() {
        return out;
    }
    out.push_str("| Severity | Code | Where | Message |\n| --- | --- | --- | --- |\n");
    for (f, d) in rows {
        let (line, col, _, _) = positions(&f.lines, d.loc.span);
        out.push_str(&format!(
            "| {} | `{}` | `{}:{line}:{col}` | {} |\n",
            d.severity,
            d.code,
            display_path(&f.path),
            md_cell(&d.message)
        ));
    }
    out
}

/// Text safe in a Markdown table cell.
pub fn md_cell(s: &str) -> String {
    s.replace('|', "\\|").replace(['\n', '\r'], " ")
}
