//! Edit sequences for the server benchmarks: keystroke-sized edits at
//! random places of a design, each of which changes its diagnostics (so
//! the server publishes after every one).

use crate::rng::Rng;

/// One edit: replace the bytes `start..end` of the current text by `text`.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Edit {
    pub start: usize,
    pub end: usize,
    pub text: String,
}

impl Edit {
    /// Apply the edit to `text`.
    pub fn apply(&self, text: &mut String) {
        text.replace_range(self.start..self.end, &self.text);
    }
}

/// The byte offset just after each property key that starts a line (`area`,
/// `sensible`, `serves` …, after the indentation).
pub fn key_ends(text: &str) -> Vec<usize> {
    let mut out = Vec::new();
    let mut at = 0usize;
    for line in text.split_inclusive('\n') {
        let trimmed = line.trim_start();
        let indent = line.len() - trimmed.len();
        if indent > 0 {
            let key: usize = trimmed
                .bytes()
                .take_while(|b| b.is_ascii_lowercase() || *b == b'_')
                .count();
            let after = trimmed.as_bytes().get(key).copied();
            if key > 0 && after == Some(b' ') {
                out.push(at + indent + key);
            }
        }
        at += line.len();
    }
    out
}

/// `n` edits in pairs: type one letter at the end of a random property key
/// (an unknown key, so the diagnostics change), then delete it again. The
/// text after every second edit is the text the sequence started from.
pub fn key_typos(text: &str, n: usize, seed: u64) -> Vec<Edit> {
    let ends = key_ends(text);
    let mut rng = Rng::new(seed);
    let mut out = Vec::with_capacity(n);
    while out.len() < n && !ends.is_empty() {
        let at = ends[rng.below(ends.len())];
        out.push(Edit {
            start: at,
            end: at,
            text: "x".to_string(),
        });
        out.push(Edit {
            start: at,
            end: at + 1,
            text: String::new(),
        });
    }
    out.truncate(n);
    out
}

/// The byte offset of the first digit of each number on a `sensible` line.
pub fn sensible_digits(text: &str) -> Vec<usize> {
    let mut out = Vec::new();
    let mut from = 0;
    while let Some(i) = text[from..].find("sensible ") {
        let at = from + i + "sensible ".len();
        let digit = text[at..]
            .bytes()
            .position(|b| b.is_ascii_digit())
            .filter(|&d| d < 8);
        if let Some(d) = digit {
            out.push(at + d);
        }
        from = at;
    }
    out
}

/// `n` edits in pairs that keep the design valid: type a digit `1` before
/// the first digit of a random zone's sensible load (ten times or more the
/// load), then delete it.
pub fn load_digits(text: &str, n: usize, seed: u64) -> Vec<Edit> {
    let digits = sensible_digits(text);
    let mut rng = Rng::new(seed);
    let mut out = Vec::with_capacity(n);
    while out.len() < n && !digits.is_empty() {
        let at = digits[rng.below(digits.len())];
        out.push(Edit {
            start: at,
            end: at,
            text: "1".to_string(),
        });
        out.push(Edit {
            start: at,
            end: at + 1,
            text: String::new(),
        });
    }
    out.truncate(n);
    out
}
