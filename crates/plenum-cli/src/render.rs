//! Rendering diagnostics: miette text for people, JSON for tools.

use std::io::IsTerminal;

use miette::{GraphicalReportHandler, GraphicalTheme, LabeledSpan, MietteDiagnostic, NamedSource};
use plenum_syntax::{ColumnUnit, LineIndex, Span};
use serde::Serialize;

use crate::diag::{Diag, Severity};

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
    let color = std::io::stderr().is_terminal() && std::env::var_os("NO_COLOR").is_none();
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

#[derive(Serialize)]
pub struct JsonOutput {
    pub diagnostics: Vec<JsonDiagnostic>,
}

/// One-based line and column (in characters) of the start and end of `span`.
pub fn positions(index: &LineIndex, span: Span) -> (u32, u32, u32, u32) {
    let s = index.line_col(span.start, ColumnUnit::Char);
    let e = index.line_col(span.end, ColumnUnit::Char);
    (s.line + 1, s.col + 1, e.line + 1, e.col + 1)
}

pub fn json(reports: &[FileReport]) -> String {
    let mut diagnostics = Vec::new();
    for r in reports {
        let index = LineIndex::new(&r.text);
        for d in &r.diags {
            let (line, column, end_line, end_column) = positions(&index, d.span);
            diagnostics.push(JsonDiagnostic {
                code: d.code,
                severity: d.severity.as_str(),
                message: d.message.clone(),
                file: r.name.clone(),
                line,
                column,
                end_line,
                end_column,
                help: d.help.clone(),
            });
        }
    }
    let out = JsonOutput { diagnostics };
    serde_json::to_string_pretty(&out).unwrap_or_else(|_| "{\"diagnostics\":[]}".to_string())
}

/// `3 errors, 1 warning in 2 files`
pub fn summary(reports: &[FileReport]) -> String {
    let count = |s: Severity| {
        reports
            .iter()
            .flat_map(|r| &r.diags)
            .filter(|d| d.severity == s)
            .count()
    };
    let plural = |n: usize, word: &str| {
        if n == 1 {
            format!("{n} {word}")
        } else {
            format!("{n} {word}s")
        }
    };
    let (e, w) = (count(Severity::Error), count(Severity::Warning));
    let files = plural(reports.len(), "file");
    if e == 0 && w == 0 {
        format!("no problems found in {files}")
    } else {
        format!(
            "{}, {} in {files}",
            plural(e, "error"),
            plural(w, "warning")
        )
    }
}
