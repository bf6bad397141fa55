//! SARIF 2.1.0 output (OASIS Static Analysis Results Interchange Format).
//!
//! `tool.driver.rules` is built from the check registry: `id` is the code,
//! `shortDescription` the summary, `fullDescription` what the check checks,
//! `help` the whole documentation block, `defaultConfiguration.level` the
//! default severity. Regions are one-based, with columns in Unicode code
//! points (`columnKind: unicodeCodePoints`), the same as the JSON output.
//! Each result carries a `partialFingerprints` entry that survives unrelated
//! edits: a hash of the code, the file, the trimmed text of the flagged line
//! and the occurrence of that triple in the file, so moving a block down by a
//! few lines does not make its findings new.

use std::collections::HashMap;

use plenum_checks::{CHECKS, Project, Severity};
use serde_json::{Value, json};

use crate::render::{display_path, positions};

/// The SARIF result level of a severity.
pub fn level(s: Severity) -> &'static str {
    match s {
        Severity::Error => "error",
        Severity::Warning => "warning",
        Severity::Info => "note",
    }
}

/// FNV-1a, 64 bits: a small hash that is the same on every platform and
/// release (the standard library's hasher promises neither).
pub fn fnv1a(bytes: &[u8]) -> u64 {
    let mut h: u64 = 0xcbf2_9ce4_8422_2325;
    for b in bytes {
        h ^= u64::from(*b);
        h = h.wrapping_mul(0x0100_0000_01b3);
    }
    h
}

/// A relative URI reference for a path: forward slashes, and every byte
/// outside the unreserved set (and `/`) percent-encoded (RFC 3986).
pub fn uri(path: &str) -> String {
    let mut out = String::new();
    for b in path.bytes() {
        match b {
            b'A'..=b'Z' | b'a'..=b'z' | b'0'..=b'9' | b'-' | b'.' | b'_' | b'~' | b'/' => {
                out.push(b as char)
            }
            _ => out.push_str(&format!("%{b:02X}")),
        }
    }
    out
}

fn rules() -> Vec<Value> {
    CHECKS
        .iter()
        .map(|c| {
            json!({
                "id": c.code,
                "name": c.code,
                "shortDescription": { "text": c.summary },
                "fullDescription": { "text": c.doc.what },
                "help": { "text": c.explain(), "markdown": c.explain() },
                "defaultConfiguration": { "level": level(c.severity) },
                "properties": { "tags": [c.group.as_str()] },
            })
        })
        .collect()
}

/// The whole SARIF log of a project.
pub fn sarif(project: &Project) -> String {
    let index: HashMap<&str, usize> = CHECKS
        .iter()
        .enumerate()
        .map(|(i, c)| (c.code, i))
        .collect();
    let mut occurrences: HashMap<(String, &str, String), usize> = HashMap::new();
    let mut results = Vec::new();
    for (f, d) in project.diagnostics() {
        let file = display_path(&f.path);
        let (line, col, end_line, end_col) = positions(&f.lines, d.loc.span);
        let line_text = f
            .lines
            .line_span(line.saturating_sub(1))
            .and_then(|s| f.text.get(s.range()))
            .unwrap_or("")
            .trim()
            .to_string();
        let n = occurrences
            .entry((file.clone(), d.code, line_text.clone()))
            .or_insert(0);
        let fingerprint =
            fnv1a(format!("{}\u{0}{file}\u{0}{line_text}\u{0}{n}", d.code).as_bytes());
        *n += 1;
        let mut message = d.message.clone();
        if let Some(h) = &d.help {
            message.push_str("\nhelp: ");
            message.push_str(h);
        }
        let related: Vec<Value> = d
            .labels
            .iter()
            .enumerate()
            .filter_map(|(i, l)| {
                let lf = project.file(&l.loc.file)?;
                let (sl, sc, el, ec) = positions(&lf.lines, l.loc.span);
                Some(json!({
                    "id": i,
                    "message": { "text": l.text },
                    "physicalLocation": {
                        "artifactLocation": { "uri": uri(&display_path(&l.loc.file)) },
                        "region": { "startLine": sl, "startColumn": sc, "endLine": el, "endColumn": ec },
                    },
                }))
            })
            .collect();
        let mut result = json!({
            "ruleId": d.code,
            "level": level(d.severity),
            "message": { "text": message },
            "locations": [{
                "physicalLocation": {
                    "artifactLocation": { "uri": uri(&file) },
                    "region": {
                        "startLine": line,
                        "startColumn": col,
                        "endLine": end_line,
                        "endColumn": end_col,
                    },
                },
            }],
            "partialFingerprints": { "plenumFingerprint/v1": format!("{fingerprint:016x}") },
        });
        if let Some(i) = index.get(d.code) {
            result["ruleIndex"] = json!(i);
        }
        if !related.is_empty() {
            result["relatedLocations"] = json!(related);
        }
        results.push(result);
    }
    let log = json!({
        "$schema": "https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json",
        "version": "2.1.0",
        "runs": [{
            "tool": {
                "driver": {
                    "name": "plenum",
                    "version": env!("CARGO_PKG_VERSION"),
                    "informationUri": "https://example.invalid/plenum",
                    "rules": rules(),
                },
            },
            "columnKind": "unicodeCodePoints",
            "results": results,
        }],
    });
    serde_json::to_string_pretty(&log).unwrap_or_else(|_| "{}".to_string())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fnv1a_matches_the_published_test_vectors() {
        // FNV-1a 64-bit test vectors (Fowler, Noll, Vo: the FNV reference
        // page's test suite, from memory): "" and "a".
        assert_eq!(fnv1a(b""), 0xcbf2_9ce4_8422_2325);
        assert_eq!(fnv1a(b"a"), 0xaf63_dc4c_8601_ec8c);
    }

    #[test]
    fn uris_are_relative_with_forward_slashes_and_escapes() {
        assert_eq!(uri("east wing/a.plenum"), "east%20wing/a.plenum");
        assert_eq!(uri("caf\u{e9}.plenum"), "caf%C3%A9.plenum");
    }
}
