//! Test fixtures: one or more files in one string, with a `$0` cursor.
//!
//! ```text
//! //- /w/shared/site.plenum
//! site { cooling 94 °F db, 75 °F wb }
//! //- /w/main.plenum
//! use "shared/site.plenum"
//! zone a$0 { sensible 10 kBtu/h }
//! ```
//!
//! * A line `//- PATH` starts a file (`//` is not Plenum syntax, so a marker
//!   can never be mistaken for a line of the file). Without any marker the
//!   whole text is `/w/design.plenum`.
//! * `$0` marks the cursor; a second `$0` in the same file marks the end of a
//!   selected range. The markers are removed from the text.
//! * The common indentation of the lines is removed, and a first empty line,
//!   so fixtures can be indented raw strings.
//! * [`Fixture::host`] puts every file on an in-memory disk, lists them as
//!   the workspace's design files, and opens the file with the cursor (the
//!   others are read from the disk, as the server does for files not open).

use std::path::{Path, PathBuf};

use plenum_model::MemoryFs;

use crate::{AnalysisHost, Span};

/// The path of a fixture without a `//-` marker.
pub const DEFAULT_PATH: &str = "/w/design.plenum";

/// The cursor marker.
pub const CURSOR: &str = "$0";

#[derive(Clone, Debug, Default)]
pub struct Fixture {
    pub files: Vec<(PathBuf, String)>,
    /// The file with the cursor and its offset.
    pub cursor: Option<(PathBuf, u32)>,
    /// A selection, when the file has two markers.
    pub range: Option<(PathBuf, Span)>,
}

/// Remove the common indentation (and a first empty line).
pub fn trim_indent(text: &str) -> String {
    let text = text.strip_prefix('\n').unwrap_or(text);
    let indent = text
        .lines()
        .filter(|l| !l.trim().is_empty())
        .map(|l| l.len() - l.trim_start_matches(' ').len())
        .min()
        .unwrap_or(0);
    let mut out = String::with_capacity(text.len());
    for l in text.split_inclusive('\n') {
        if l.trim().is_empty() {
            out.push_str(if l.ends_with("\r\n") {
                "\r\n"
            } else if l.ends_with('\n') {
                "\n"
            } else {
                ""
            });
        } else {
            out.push_str(l.get(indent..).unwrap_or(l));
        }
    }
    out
}

impl Fixture {
    pub fn parse(text: &str) -> Fixture {
        let text = trim_indent(text);
        let mut files: Vec<(PathBuf, String)> = Vec::new();
        if text.lines().any(|l| l.starts_with("//- ")) {
            for l in text.split_inclusive('\n') {
                if let Some(p) = l.strip_prefix("//- ") {
                    files.push((PathBuf::from(p.trim()), String::new()));
                } else if let Some((_, body)) = files.last_mut() {
                    body.push_str(l);
                }
            }
        } else {
            files.push((PathBuf::from(DEFAULT_PATH), text));
        }
        let mut fx = Fixture::default();
        for (path, body) in files {
            let mut marks = Vec::new();
            let mut clean = String::with_capacity(body.len());
            let mut rest = body.as_str();
            while let Some(i) = rest.find(CURSOR) {
                clean.push_str(&rest[..i]);
                marks.push(u32::try_from(clean.len()).unwrap_or(u32::MAX));
                rest = &rest[i + CURSOR.len()..];
            }
            clean.push_str(rest);
            match marks.as_slice() {
                [a] => fx.cursor = Some((path.clone(), *a)),
                [a, b, ..] => {
                    fx.cursor = Some((path.clone(), *a));
                    fx.range = Some((path.clone(), Span::new(*a, *b)));
                }
                [] => {}
            }
            fx.files.push((path, clean));
        }
        fx
    }

    /// The text of one file.
    pub fn text(&self, path: &Path) -> Option<&str> {
        self.files
            .iter()
            .find(|(p, _)| p == path)
            .map(|(_, t)| t.as_str())
    }

    /// A host with every file on disk and the cursor's file open.
    pub fn host(&self) -> AnalysisHost {
        let mut fs = MemoryFs::new();
        for (p, t) in &self.files {
            fs.insert(p, t.as_bytes());
        }
        let mut host = AnalysisHost::new(fs);
        host.set_disk_files(
            self.files
                .iter()
                .filter(|(p, _)| p.extension().is_some_and(|e| e == "plenum"))
                .map(|(p, _)| p.clone()),
        );
        let open = self.cursor.as_ref().map(|(p, _)| p.clone()).or_else(|| {
            self.files
                .iter()
                .find(|(p, _)| p.extension().is_some_and(|e| e == "plenum"))
                .map(|(p, _)| p.clone())
        });
        if let Some(p) = open
            && let Some(t) = self.text(&p)
        {
            host.set_document(&p, t.to_string());
        }
        host
    }

    /// The cursor, or the start of the first design file.
    pub fn position(&self) -> (PathBuf, u32) {
        self.cursor.clone().unwrap_or_else(|| {
            (
                self.files
                    .iter()
                    .find(|(p, _)| p.extension().is_some_and(|e| e == "plenum"))
                    .or(self.files.first())
                    .map(|(p, _)| p.clone())
                    .unwrap_or_else(|| PathBuf::from(DEFAULT_PATH)),
                0,
            )
        })
    }
}
