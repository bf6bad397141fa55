//! `plenum check`

use std::path::PathBuf;
use std::process::ExitCode;

use plenum_syntax::{Span, SyntaxError, SyntaxErrorKind};

use crate::Format;
use crate::diag::{Diag, Severity};
use crate::files::{self, Loaded};
use crate::render::{self, FileReport};

/// Diagnostics shown per file at most; the rest are counted in one line.
const MAX_SHOWN: usize = 200;

pub fn run(paths: &[PathBuf], format: Format) -> Result<ExitCode, String> {
    let files = files::discover(paths)?;
    let mut reports = Vec::new();
    let mut unreadable = false;
    for path in &files {
        let name = path.display().to_string();
        let loaded = match files::load(path) {
            Ok(l) => l,
            Err(message) => {
                eprintln!("error: {message}");
                unreadable = true;
                continue;
            }
        };
        reports.push(check_one(name, loaded));
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

fn check_one(name: String, loaded: Loaded) -> FileReport {
    match loaded {
        Loaded::Text(text) => {
            let parsed = plenum_syntax::parse(&text);
            let mut diags: Vec<Diag> = parsed.errors.iter().map(Diag::from).collect();
            cap(&mut diags, text.len());
            FileReport { name, text, diags }
        }
        Loaded::NotUtf8 { prefix, offset } => {
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
                name,
                text: prefix,
                diags: vec![d],
            }
        }
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
