//! Severity overrides per project, from `plenum.toml`.
//!
//! ```toml
//! [checks]
//! "oversized-coil" = "error"
//! "assumption" = "off"
//! ```
//!
//! The file is found by walking up from the design's root file
//! ([`plenum_model::fs::config_file`], the one discovery routine of the CLI
//! and the language server). Tables other than `[checks]` belong to other
//! tools and are left alone. A file that cannot be read or a setting that
//! is wrong is a diagnostic located in `plenum.toml`, never a crash; the
//! settings that can be read still apply.

use std::collections::HashMap;
use std::ops::Range;
use std::path::{Path, PathBuf};

use plenum_model::FileSystem;
use plenum_syntax::Span;

use crate::diagnostic::{Diagnostic, Level, Loc};
use crate::registry;

/// A project's settings for the checker.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Config {
    /// The `plenum.toml` they were read from (`None`: no file, defaults).
    pub path: Option<PathBuf>,
    /// The file's text, for locating its diagnostics.
    pub text: String,
    /// The severity set for each code.
    pub levels: HashMap<&'static str, Level>,
    /// What was wrong with the file.
    pub diagnostics: Vec<Diagnostic>,
}

impl Config {
    /// No settings: every check at its default severity.
    pub fn new() -> Config {
        Config::default()
    }

    /// The settings that apply to the design whose root file is `design`,
    /// read through `fs`.
    pub fn discover(fs: &dyn FileSystem, design: &Path) -> Config {
        match plenum_model::fs::config_file(fs, design) {
            Some(path) => Config::read(fs, &path),
            None => Config::new(),
        }
    }

    /// Read the settings of the `plenum.toml` at `path`.
    pub fn read(fs: &dyn FileSystem, path: &Path) -> Config {
        let path = plenum_model::fs::normalize(path);
        match fs.read(&path) {
            Ok(bytes) => match String::from_utf8(bytes) {
                Ok(text) => Config::parse(&path, &text),
                Err(e) => {
                    let at = e.utf8_error().valid_up_to();
                    let text = String::from_utf8_lossy(&e.into_bytes()[..at]).into_owned();
                    let span = Span::from_range(at..at);
                    let d = Diagnostic::new(
                        "invalid-config",
                        Loc::new(&path, span),
                        "plenum.toml is not valid UTF-8 text: its settings are not applied",
                    )
                    .help("save the file as UTF-8");
                    Config {
                        path: Some(path),
                        text,
                        levels: HashMap::new(),
                        diagnostics: vec![d],
                    }
                }
            },
            Err(e) => {
                let d = Diagnostic::new(
                    "invalid-config",
                    Loc::new(&path, Span::empty(0)),
                    format!("cannot read plenum.toml ({e}): its settings are not applied"),
                );
                Config {
                    path: Some(path),
                    text: String::new(),
                    levels: HashMap::new(),
                    diagnostics: vec![d],
                }
            }
        }
    }

    /// Parse the text of a `plenum.toml` at `path`.
    pub fn parse(path: &Path, text: &str) -> Config {
        let mut config = Config {
            path: Some(path.to_path_buf()),
            text: text.to_string(),
            levels: HashMap::new(),
            diagnostics: Vec::new(),
        };
        let at = |r: Range<usize>| Loc::new(path, Span::from_range(r));
        let table = match toml::de::DeTable::parse(text) {
            Ok(t) => t,
            Err(e) => {
                let span = e.span().unwrap_or(0..0);
                let message = e.message().lines().next().unwrap_or("invalid TOML").trim();
                config.diagnostics.push(
                    Diagnostic::new(
                        "invalid-config",
                        at(span),
                        format!("plenum.toml is not valid TOML ({message}): its settings are not applied"),
                    )
                    .help("see https://toml.io for the syntax; check settings look like `\"oversized-coil\" = \"error\"` under `[checks]`"),
                );
                return config;
            }
        };
        let Some((key, checks)) = table
            .get_ref()
            .iter()
            .find(|(k, _)| k.get_ref().as_ref() == "checks")
        else {
            return config;
        };
        let Some(checks_table) = checks.get_ref().as_table() else {
            config.diagnostics.push(
                Diagnostic::new(
                    "invalid-config",
                    at(key.span().start..checks.span().end),
                    "`checks` must be a table of check codes and severities",
                )
                .help("write `[checks]` and below it lines like `\"oversized-coil\" = \"error\"`"),
            );
            return config;
        };
        let mut entries: Vec<_> = checks_table.iter().collect();
        entries.sort_by_key(|(k, _)| k.span().start);
        for (code_key, value) in entries {
            let written = code_key.get_ref().as_ref();
            let key_loc = at(code_key.span());
            let Some(check) = registry::lookup(written) else {
                let mut d = Diagnostic::new(
                    "unknown-code",
                    key_loc.clone(),
                    format!("`{written}` is not a check code"),
                )
                .label("no check has this code");
                d = match registry::suggest(written) {
                    Some(s) => d.help(format!("did you mean `{s}`?")).fix(
                        format!("write `{s}`"),
                        key_loc,
                        format!("\"{s}\""),
                    ),
                    None => d.help("`plenum explain --list` lists every code"),
                };
                config.diagnostics.push(d);
                continue;
            };
            let value_loc = at(value.span());
            let Some(level) = value.get_ref().as_str().and_then(Level::parse) else {
                let shown = text.get(value.span()).unwrap_or("this value");
                config.diagnostics.push(
                    Diagnostic::new(
                        "invalid-config",
                        value_loc,
                        format!(
                            "the severity of `{}` must be \"error\", \"warning\", \"info\" or \"off\", not {shown}",
                            check.code
                        ),
                    )
                    .label("not a severity"),
                );
                continue;
            };
            if !check.adjustable {
                config.diagnostics.push(
                    Diagnostic::new(
                        "invalid-config",
                        value_loc,
                        format!(
                            "the severity of `{}` cannot be changed: it means the design cannot be read or evaluated as written",
                            check.code
                        ),
                    )
                    .help("fix what it reports instead; `plenum explain` says which checks can be adjusted"),
                );
                continue;
            }
            config.levels.insert(check.code, level);
        }
        config
    }

    /// The severity a project set for `code`, if it set one.
    pub fn level(&self, code: &str) -> Option<Level> {
        self.levels.get(code).copied()
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::diagnostic::Severity;

    #[test]
    fn reads_levels_and_reports_bad_entries() {
        let text = "[fmt]\nwidth = 100\n\n[checks]\n\"oversized-coil\" = \"error\"\nassumption = \"off\"\n\"oversize-coil\" = \"warning\"\n\"airflow-per-ton\" = \"loud\"\n\"unit-mismatch\" = \"off\"\n";
        let c = Config::parse(Path::new("/p/plenum.toml"), text);
        assert_eq!(c.level("oversized-coil"), Some(Level::On(Severity::Error)));
        assert_eq!(c.level("assumption"), Some(Level::Off));
        assert_eq!(c.level("airflow-per-ton"), None);
        let codes: Vec<_> = c.diagnostics.iter().map(|d| d.code).collect();
        assert_eq!(codes, ["unknown-code", "invalid-config", "invalid-config"]);
        assert!(c.diagnostics[0].help.as_deref() == Some("did you mean `oversized-coil`?"));
        let span = c.diagnostics[0].loc.span;
        assert_eq!(&text[span.range()], "\"oversize-coil\"");
    }

    #[test]
    fn bad_toml_is_one_located_diagnostic() {
        let text = "[checks]\n\"oversized-coil\" = \n";
        let c = Config::parse(Path::new("plenum.toml"), text);
        assert_eq!(c.diagnostics.len(), 1);
        assert_eq!(c.diagnostics[0].code, "invalid-config");
        assert!(c.levels.is_empty());
        let c = Config::parse(Path::new("plenum.toml"), "checks = 3\n");
        assert_eq!(c.diagnostics.len(), 1);
        assert!(c.diagnostics[0].message.contains("must be a table"));
    }
}
