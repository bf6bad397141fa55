//! Benchmark support (a development tool, not published): generated
//! campuses held in memory, percentiles, the process's peak memory, and a
//! small JSON-RPC client for the language server over stdio.

pub mod edits;
pub mod lsp;
pub mod rng;

use std::path::{Path, PathBuf};
use std::time::Duration;

use plenum_gen::{Campus, generate};
use plenum_model::MemoryFs;

/// The folder the in-memory campuses live in.
pub const CAMPUS_DIR: &str = "/campus";

/// A generated campus in memory: its files under [`CAMPUS_DIR`], the root
/// path, and the total size in bytes.
pub struct Generated {
    pub campus: Campus,
    pub files: Vec<(PathBuf, String)>,
    pub root: PathBuf,
    pub bytes: usize,
}

impl Generated {
    pub fn new(campus: Campus) -> Generated {
        let files: Vec<(PathBuf, String)> = generate(&campus)
            .into_iter()
            .map(|(p, t)| (Path::new(CAMPUS_DIR).join(p), t))
            .collect();
        let root = Path::new(CAMPUS_DIR).join(campus.root());
        let bytes = files.iter().map(|(_, t)| t.len()).sum();
        Generated {
            campus,
            files,
            root,
            bytes,
        }
    }

    /// Every file in a [`MemoryFs`].
    pub fn fs(&self) -> MemoryFs {
        let mut fs = MemoryFs::new();
        for (p, t) in &self.files {
            fs.insert(p, t.as_bytes());
        }
        fs
    }

    /// The paths of every file (what `plenum check DIR` is given).
    pub fn paths(&self) -> Vec<PathBuf> {
        self.files.iter().map(|(p, _)| p.clone()).collect()
    }

    /// The text of the one file of a single-file campus, or of the root.
    pub fn root_text(&self) -> &str {
        self.files
            .iter()
            .find(|(p, _)| *p == self.root)
            .map_or("", |(_, t)| t.as_str())
    }
}

/// The `p`-quantile (0 to 1) of sorted samples, nearest rank.
pub fn percentile(sorted: &[Duration], p: f64) -> Duration {
    if sorted.is_empty() {
        return Duration::ZERO;
    }
    let i = ((sorted.len() as f64 - 1.0) * p).round() as usize;
    sorted[i.min(sorted.len() - 1)]
}

/// Milliseconds, for printing.
pub fn ms(d: Duration) -> f64 {
    d.as_secs_f64() * 1e3
}

/// A field of `/proc/self/status` in kB (`VmHWM`: the peak resident set;
/// `VmRSS`: the current one). `None` off Linux.
pub fn proc_status_kb(field: &str) -> Option<u64> {
    let status = std::fs::read_to_string("/proc/self/status").ok()?;
    status.lines().find_map(|l| {
        let rest = l.strip_prefix(field)?.strip_prefix(':')?;
        rest.trim().trim_end_matches("kB").trim().parse().ok()
    })
}

/// Offsets to hover at: the names of `n` random air handlers, of `n`
/// random zones, and `n` offsets anywhere in the text (on a character
/// boundary), with what each is.
pub fn hover_targets(text: &str, n: usize, seed: u64) -> Vec<(&'static str, usize)> {
    let names = |kw: &str| -> Vec<usize> {
        let mut out = Vec::new();
        let mut at = 0usize;
        for line in text.split_inclusive('\n') {
            if let Some(rest) = line.strip_prefix(kw)
                && rest.starts_with(|c: char| c.is_ascii_alphanumeric() || c == '_')
            {
                out.push(at + kw.len() + 1);
            }
            at += line.len();
        }
        out
    };
    let ahus = names("ahu ");
    let zones = names("zone ");
    let mut rng = rng::Rng::new(seed);
    let mut out = Vec::with_capacity(3 * n);
    for _ in 0..n {
        if !ahus.is_empty() {
            out.push(("air handler name", ahus[rng.below(ahus.len())]));
        }
        if !zones.is_empty() {
            out.push(("zone name", zones[rng.below(zones.len())]));
        }
        let mut at = rng.below(text.len().max(1));
        while at > 0 && !text.is_char_boundary(at) {
            at -= 1;
        }
        out.push(("anywhere", at));
    }
    out
}

/// p50, p95 and the largest of some samples, in milliseconds, for printing.
pub fn summary(samples: &mut [Duration]) -> String {
    samples.sort();
    format!(
        "p50 {:.2} ms, p95 {:.2} ms, max {:.2} ms ({} samples)",
        ms(percentile(samples, 0.50)),
        ms(percentile(samples, 0.95)),
        ms(percentile(samples, 1.0)),
        samples.len()
    )
}
