//! Suppressions: silencing a check for one block, with a written reason.
//!
//! ```text
//! # plenum: allow oversized-coil -- selected for the future east wing
//! ahu ahu_3 "East wing unit" {
//! ```
//!
//! A suppression is a comment line of its own, directly above the block it
//! applies to (other comment lines may stand between, so several can be
//! stacked; a blank line may not). After `plenum:` come `allow`, one or
//! more codes separated by commas, `--` and the reason. It silences those
//! codes for every diagnostic whose primary location is inside the block,
//! nested blocks included.
//!
//! - A suppression without a reason is an error (`suppression-without-reason`)
//!   and has no effect.
//! - An unknown code is an error (`unknown-code`) with the nearest code
//!   suggested; the other codes of the comment still apply.
//! - A code that cannot be adjusted (syntax, model and engine errors: the
//!   design cannot be read or evaluated as written) cannot be suppressed
//!   (`invalid-suppression`).
//! - A code the block does not report is itself reported
//!   (`unused-suppression`, a warning), with a fix that deletes the comment.

use std::path::{Path, PathBuf};

use plenum_syntax::{Block, Entry, Item, Parse, Span};

use crate::diagnostic::{Diagnostic, Loc};
use crate::registry;

/// One code of a suppression.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct AllowedCode {
    /// The registered code.
    pub code: &'static str,
    /// Where it is written in the comment.
    pub span: Span,
}

/// A valid suppression.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Suppression {
    /// The file holding it.
    pub file: PathBuf,
    /// The comment.
    pub comment: Span,
    /// The comment's whole line, with its line break (for the delete fix).
    pub line: Span,
    /// The block it applies to.
    pub block: Span,
    /// The codes it silences.
    pub codes: Vec<AllowedCode>,
    /// The reason given.
    pub reason: String,
}

impl Suppression {
    /// Whether it silences `d`.
    pub fn covers(&self, d: &Diagnostic) -> bool {
        d.loc.file == self.file
            && self.block.start <= d.loc.span.start
            && d.loc.span.start < self.block.end
            && self.codes.iter().any(|c| c.code == d.code)
    }
}

/// The suppressions of one file, and what is wrong with the ones that are
/// not valid.
pub fn suppressions(path: &Path, text: &str, parse: &Parse) -> (Vec<Suppression>, Vec<Diagnostic>) {
    let mut out = Vec::new();
    let mut diags = Vec::new();
    for &comment in &parse.comments {
        let Some(raw) = text.get(comment.range()) else {
            continue;
        };
        let body = raw.trim_start_matches('#').trim_start();
        let Some(directive) = body.strip_prefix("plenum:") else {
            continue;
        };
        let at = |span: Span| Loc::new(path, span);
        let directive_start = comment.end - directive.len() as u32;
        let line_start = text[..comment.start as usize]
            .rfind('\n')
            .map_or(0, |i| i + 1);
        let own_line = text[line_start..comment.start as usize].trim().is_empty();
        let line_end = text[comment.end as usize..]
            .find('\n')
            .map_or(text.len(), |i| comment.end as usize + i + 1);
        let line = Span::from_range(line_start..line_end);
        let rest = directive.trim_start();
        let Some(list) = rest.strip_prefix("allow") else {
            diags.push(
                Diagnostic::new(
                    "invalid-suppression",
                    at(comment),
                    "a `# plenum:` comment must read `# plenum: allow CODE -- REASON`",
                )
                .help("write `allow`, the codes separated by commas, `--` and the reason"),
            );
            continue;
        };
        if !list.is_empty() && !list.starts_with(char::is_whitespace) {
            diags.push(Diagnostic::new(
                "invalid-suppression",
                at(comment),
                "a `# plenum:` comment must read `# plenum: allow CODE -- REASON`",
            ));
            continue;
        }
        let list_start = comment.end - list.len() as u32;
        let (codes_text, reason) = match list.find("--") {
            Some(i) => (&list[..i], Some(list[i + 2..].trim())),
            None => (list, None),
        };
        let _ = directive_start;
        // The codes, each with its span.
        let mut codes = Vec::new();
        let mut offset = 0usize;
        let mut valid = true;
        for part in codes_text.split(',') {
            let lead = part.len() - part.trim_start().len();
            let word = part.trim();
            let start = list_start + (offset + lead) as u32;
            let span = Span::new(start, start + word.len() as u32);
            offset += part.len() + 1;
            if word.is_empty() {
                continue;
            }
            match registry::lookup(word) {
                None => {
                    let mut d = Diagnostic::new(
                        "unknown-code",
                        at(span),
                        format!("`{word}` is not a check code"),
                    )
                    .label("no check has this code");
                    d = match registry::suggest(word) {
                        Some(s) => d.help(format!("did you mean `{s}`?")).fix(
                            format!("write `{s}`"),
                            at(span),
                            s,
                        ),
                        None => d.help("`plenum explain --list` lists every code"),
                    };
                    diags.push(d);
                }
                Some(check) if !check.adjustable => {
                    diags.push(
                        Diagnostic::new(
                            "invalid-suppression",
                            at(span),
                            format!(
                                "`{}` cannot be suppressed: it means the design cannot be read or evaluated as written",
                                check.code
                            ),
                        )
                        .help("fix what it reports instead"),
                    );
                }
                Some(check) => codes.push(AllowedCode {
                    code: check.code,
                    span,
                }),
            }
        }
        if codes_text.trim().is_empty() {
            diags.push(Diagnostic::new(
                "invalid-suppression",
                at(comment),
                "the suppression names no check code",
            ));
            valid = false;
        }
        match reason {
            Some(r) if !r.is_empty() => {}
            _ => {
                diags.push(
                    Diagnostic::new(
                        "suppression-without-reason",
                        at(comment),
                        "a suppression must give its reason after `--`; this one has no effect",
                    )
                    .help("write why the finding is accepted, e.g. `# plenum: allow oversized-coil -- selected for the future east wing`"),
                );
                valid = false;
            }
        }
        if !own_line {
            diags.push(
                Diagnostic::new(
                    "invalid-suppression",
                    at(comment),
                    "a suppression must be a comment line of its own, directly above a block",
                )
                .help("move the comment to the line above the block"),
            );
            continue;
        }
        let Some(block) = block_below(text, parse, line_end) else {
            diags.push(
                Diagnostic::new(
                    "invalid-suppression",
                    at(comment),
                    "a suppression must stand directly above a block (only comment lines may come between)",
                )
                .help("move the comment to the line above the block it is for"),
            );
            continue;
        };
        if valid && !codes.is_empty() {
            out.push(Suppression {
                file: path.to_path_buf(),
                comment,
                line,
                block,
                codes,
                reason: reason.unwrap_or_default().to_string(),
            });
        }
    }
    (out, diags)
}

/// The block that starts on the first line after `from` that is not a
/// comment line.
fn block_below(text: &str, parse: &Parse, from: usize) -> Option<Span> {
    let mut pos = from;
    loop {
        let rest = text.get(pos..)?;
        if rest.is_empty() {
            return None;
        }
        let end = rest.find('\n').map_or(text.len(), |i| pos + i + 1);
        let line = &text[pos..end];
        let trimmed = line.trim_start();
        if trimmed.starts_with('#') {
            pos = end;
            continue;
        }
        if trimmed.trim().is_empty() {
            return None;
        }
        let start = (pos + line.len() - trimmed.len()) as u32;
        return find_block_at(&parse.file.items, start);
    }
}

fn find_block_at(items: &[Item], start: u32) -> Option<Span> {
    fn within(b: &Block, start: u32) -> Option<Span> {
        if b.span.start == start {
            return Some(b.span);
        }
        if !b.span.contains(start) {
            return None;
        }
        b.body.entries.iter().find_map(|e| match e {
            Entry::Block(inner) => within(inner, start),
            _ => None,
        })
    }
    items.iter().find_map(|i| match i {
        Item::Block(b) => within(b, start),
        _ => None,
    })
}

/// Remove the diagnostics the suppressions cover; report the codes that
/// covered nothing.
pub fn apply(suppressions: &[Suppression], diags: &mut Vec<Diagnostic>) -> Vec<Diagnostic> {
    let mut used = vec![Vec::<bool>::new(); suppressions.len()];
    for (u, s) in used.iter_mut().zip(suppressions) {
        *u = vec![false; s.codes.len()];
    }
    diags.retain(|d| {
        let mut keep = true;
        for (si, s) in suppressions.iter().enumerate() {
            if s.covers(d) {
                if let Some(ci) = s.codes.iter().position(|c| c.code == d.code) {
                    used[si][ci] = true;
                }
                keep = false;
            }
        }
        keep
    });
    let mut out = Vec::new();
    for (s, u) in suppressions.iter().zip(&used) {
        let all_unused = u.iter().all(|x| !x);
        for (c, &was) in s.codes.iter().zip(u) {
            if was {
                continue;
            }
            let mut d = Diagnostic::new(
                "unused-suppression",
                Loc::new(&s.file, c.span),
                format!(
                    "`{}` is suppressed here but the block reports no such finding",
                    c.code
                ),
            )
            .label("nothing to suppress");
            if all_unused {
                d = d.help("delete the comment").fix(
                    "delete the suppression",
                    Loc::new(&s.file, s.line),
                    "",
                );
            } else {
                d = d.help(format!("remove `{}` from the comment", c.code));
            }
            out.push(d);
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn run(text: &str) -> (Vec<Suppression>, Vec<Diagnostic>) {
        let parse = plenum_syntax::parse(text);
        suppressions(Path::new("d.plenum"), text, &parse)
    }

    #[test]
    fn reads_codes_reason_and_block() {
        let text = "# note\n# plenum: allow oversized-coil, airflow-per-ton -- future wing\n# another note\nahu a {\n  serves z\n}\n";
        let (s, d) = run(text);
        assert!(d.is_empty(), "{d:?}");
        assert_eq!(s.len(), 1);
        assert_eq!(s[0].codes.len(), 2);
        assert_eq!(&text[s[0].codes[1].span.range()], "airflow-per-ton");
        assert_eq!(s[0].reason, "future wing");
        assert!(text[s[0].block.range()].starts_with("ahu a {"));
    }

    #[test]
    fn nested_block_and_errors() {
        let text = "ahu a {\n  # plenum: allow oversized-coil -- spare\n  coil { rated 1 ton }\n}\n# plenum: allow oversized-coil\nzone z {}\n# plenum: allow oversize-coil -- typo\nzone y {}\n# plenum: allow unit-mismatch -- no\nzone x {}\n# plenum: allow oversized-coil -- gap\n\nzone w {}\nzone v {} # plenum: allow oversized-coil -- trailing\n# plenum: deny x\nzone u {}\n";
        let (s, d) = run(text);
        assert_eq!(s.len(), 1);
        assert!(text[s[0].block.range()].starts_with("coil {"));
        let codes: Vec<_> = d.iter().map(|d| d.code).collect();
        assert_eq!(
            codes,
            [
                "suppression-without-reason",
                "unknown-code",
                "invalid-suppression",
                "invalid-suppression",
                "invalid-suppression",
                "invalid-suppression"
            ]
        );
        assert_eq!(d[1].help.as_deref(), Some("did you mean `oversized-coil`?"));
    }
}
