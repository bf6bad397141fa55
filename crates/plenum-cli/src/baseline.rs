//! `plenum check --baseline REV`: the same designs as of a git revision,
//! and every air handler's capacity then and now.
//!
//! The revision is read through git alone (`git ls-tree` for the files that
//! exist there, `git show REV:path` for their text), never through the
//! working tree, so `use`d files come from the revision too. The designs
//! compared are the `*.plenum` files of the revision under the paths given
//! (all of the current folder by default), checked by the same project
//! runner as the working tree.

use std::collections::{BTreeMap, HashSet};
use std::io;
use std::path::{Path, PathBuf};
use std::process::Command;

use plenum_checks::Project;
use plenum_engine::CapacityStatus;
use plenum_model::FileSystem;
use plenum_model::fs::normalize;
use serde::Serialize;

use crate::render::{CAUTION, display_path, md_cell};

/// A [`FileSystem`] that reads the files of one git revision.
pub struct GitFs {
    /// The repository's top folder (canonical).
    root: PathBuf,
    /// The working folder (canonical), which relative paths start from.
    cwd: PathBuf,
    rev: String,
    /// Files of the revision, relative to the top folder.
    files: HashSet<PathBuf>,
    /// Folders of the revision, relative to the top folder.
    dirs: HashSet<PathBuf>,
}

fn git(dir: &Path, args: &[&str]) -> Result<Vec<u8>, String> {
    let out = Command::new("git")
        .arg("-C")
        .arg(dir)
        .args(args)
        .output()
        .map_err(|e| format!("cannot run git: {e}"))?;
    if out.status.success() {
        Ok(out.stdout)
    } else {
        let err = String::from_utf8_lossy(&out.stderr);
        Err(format!(
            "git {}: {}",
            args.join(" "),
            err.lines().next().unwrap_or("failed").trim()
        ))
    }
}

impl GitFs {
    /// Open revision `rev` of the repository holding the working folder.
    pub fn open(rev: &str) -> Result<GitFs, String> {
        let cwd = std::env::current_dir()
            .and_then(|d| d.canonicalize())
            .map_err(|e| format!("cannot find the working folder: {e}"))?;
        let top = git(&cwd, &["rev-parse", "--show-toplevel"])
            .map_err(|e| format!("--baseline needs a git repository ({e})"))?;
        let top = String::from_utf8_lossy(&top).trim().to_string();
        let root = PathBuf::from(&top)
            .canonicalize()
            .map_err(|e| format!("cannot open the repository folder `{top}`: {e}"))?;
        let commit = format!("{rev}^{{commit}}");
        git(&root, &["rev-parse", "--verify", "--quiet", &commit])
            .map_err(|_| format!("--baseline `{rev}` is not a revision of this repository"))?;
        let listing = git(
            &root,
            &["ls-tree", "-r", "-z", "--name-only", "--full-tree", rev],
        )?;
        let mut files = HashSet::new();
        let mut dirs = HashSet::new();
        for name in listing.split(|b| *b == 0).filter(|n| !n.is_empty()) {
            let path = PathBuf::from(String::from_utf8_lossy(name).into_owned());
            let mut parent = path.parent();
            while let Some(p) = parent.filter(|p| !p.as_os_str().is_empty()) {
                dirs.insert(p.to_path_buf());
                parent = p.parent();
            }
            files.insert(path);
        }
        Ok(GitFs {
            root,
            cwd,
            rev: rev.to_string(),
            files,
            dirs,
        })
    }

    /// `path` (absolute, or relative to the working folder) relative to the
    /// repository's top folder; `None` outside the repository.
    fn in_repo(&self, path: &Path) -> Option<PathBuf> {
        let abs = if path.is_absolute() {
            normalize(path)
        } else {
            normalize(&self.cwd.join(path))
        };
        let rel = abs.strip_prefix(&self.root).ok()?;
        if rel.as_os_str().is_empty() {
            return Some(PathBuf::from("."));
        }
        Some(rel.to_path_buf())
    }

    /// The `*.plenum` files of the revision under `paths` (the working
    /// folder when none), as absolute paths.
    pub fn designs(&self, paths: &[PathBuf]) -> Vec<PathBuf> {
        let default = [PathBuf::from(".")];
        let roots = if paths.is_empty() {
            &default[..]
        } else {
            paths
        };
        let prefixes: Vec<PathBuf> = roots.iter().filter_map(|p| self.in_repo(p)).collect();
        let mut out: Vec<PathBuf> = self
            .files
            .iter()
            .filter(|f| f.extension().is_some_and(|e| e == crate::files::EXTENSION))
            .filter(|f| {
                prefixes
                    .iter()
                    .any(|p| p.as_os_str() == "." || f.starts_with(p))
            })
            .map(|f| self.root.join(f))
            .collect();
        out.sort();
        out
    }

    /// The key a design is compared by: its path in the repository.
    pub fn key(&self, path: &Path) -> String {
        self.in_repo(path)
            .map(|p| display_path(&p))
            .unwrap_or_else(|| display_path(path))
    }
}

impl FileSystem for GitFs {
    fn read(&self, path: &Path) -> io::Result<Vec<u8>> {
        let rel = self
            .in_repo(path)
            .filter(|r| self.files.contains(r))
            .ok_or_else(|| io::Error::new(io::ErrorKind::NotFound, "not in the revision"))?;
        let spec = format!("{}:{}", self.rev, display_path(&rel));
        git(&self.root, &["show", &spec]).map_err(io::Error::other)
    }
    fn is_file(&self, path: &Path) -> bool {
        self.in_repo(path).is_some_and(|r| self.files.contains(&r))
    }
    fn is_dir(&self, path: &Path) -> bool {
        // The revision has no `.git`, but it is a repository: the project
        // root falls back to its top folder as in the working tree.
        self.in_repo(path).is_some_and(|r| {
            r.as_os_str() == "." || r == Path::new(".git") || self.dirs.contains(&r)
        })
    }
}

/// One air handler's capacity in one revision.
#[derive(Clone, Debug, PartialEq)]
pub struct Unit {
    /// Required total (governing case), tons; `None` when not evaluated.
    pub required_tons: Option<f64>,
    /// Rated total, tons.
    pub rated_tons: Option<f64>,
    /// rated / required − 1.
    pub margin: Option<f64>,
    /// `ok`, `undersized`, `oversized`, `unrated` or `not evaluated`.
    pub status: &'static str,
}

impl Unit {
    fn fails(&self) -> bool {
        matches!(self.status, "undersized" | "not evaluated")
    }
}

/// Every air handler of a project: (design key, unit name) → capacity.
pub fn units(project: &Project, key: impl Fn(&Path) -> String) -> BTreeMap<(String, String), Unit> {
    let mut out = BTreeMap::new();
    for d in &project.designs {
        let k = key(&d.root);
        for a in &d.evaluation.ahus {
            let unit = match &a.result {
                Ok(r) => {
                    let g = r.governing();
                    Unit {
                        required_tons: Some(g.coil.tons),
                        rated_tons: g.capacity.rated_tons,
                        margin: g.capacity.margin,
                        status: match r.status() {
                            CapacityStatus::Ok => "ok",
                            CapacityStatus::Undersized => "undersized",
                            CapacityStatus::Oversized => "oversized",
                            CapacityStatus::Unrated => "unrated",
                        },
                    }
                }
                Err(_) => Unit {
                    required_tons: None,
                    rated_tons: d
                        .model
                        .design
                        .ahus
                        .get(a.index)
                        .and_then(|x| x.coil.as_ref())
                        .and_then(|c| c.rated_btuh)
                        .map(|r| r.value / 12_000.0),
                    margin: None,
                    status: "not evaluated",
                },
            };
            out.insert((k.clone(), a.name.clone()), unit);
        }
    }
    out
}

/// One row of the comparison.
#[derive(Clone, Debug, Serialize)]
pub struct Row {
    pub unit: String,
    pub file: String,
    pub required_tons_then: Option<f64>,
    pub required_tons_now: Option<f64>,
    pub rated_tons_then: Option<f64>,
    pub rated_tons_now: Option<f64>,
    pub margin_pct_then: Option<f64>,
    pub margin_pct_now: Option<f64>,
    pub status_then: Option<&'static str>,
    pub status_now: Option<&'static str>,
    /// Passed at the revision and fails now.
    pub newly_failing: bool,
}

/// The comparison of every air handler, newly failing units first.
#[derive(Clone, Debug, Serialize)]
pub struct Comparison {
    pub revision: String,
    pub units: Vec<Row>,
}

/// Check the designs as of `rev` and compare them with `now`.
pub fn compare(rev: &str, paths: &[PathBuf], now: &Project) -> Result<Comparison, String> {
    let fs = GitFs::open(rev)?;
    let then_files = fs.designs(paths);
    let then = plenum_checks::check_files(&fs, &then_files);
    let key = |p: &Path| fs.key(p);
    let before = units(&then, key);
    let after = units(now, key);
    let mut names: Vec<&(String, String)> = before.keys().chain(after.keys()).collect();
    names.sort();
    names.dedup();
    let pct = |m: Option<f64>| m.map(|m| m * 100.0);
    let mut rows: Vec<Row> = names
        .into_iter()
        .map(|k| {
            let b = before.get(k);
            let a = after.get(k);
            Row {
                unit: k.1.clone(),
                file: k.0.clone(),
                required_tons_then: b.and_then(|u| u.required_tons),
                required_tons_now: a.and_then(|u| u.required_tons),
                rated_tons_then: b.and_then(|u| u.rated_tons),
                rated_tons_now: a.and_then(|u| u.rated_tons),
                margin_pct_then: pct(b.and_then(|u| u.margin)),
                margin_pct_now: pct(a.and_then(|u| u.margin)),
                status_then: b.map(|u| u.status),
                status_now: a.map(|u| u.status),
                newly_failing: b.is_some_and(|u| !u.fails()) && a.is_some_and(Unit::fails),
            }
        })
        .collect();
    rows.sort_by_key(|r| !r.newly_failing);
    Ok(Comparison {
        revision: rev.to_string(),
        units: rows,
    })
}

fn tons(v: Option<f64>) -> String {
    v.map_or_else(|| "—".to_string(), |t| format!("{t:.2} ton"))
}

fn margin(v: Option<f64>) -> String {
    v.map_or_else(|| "—".to_string(), |m| format!("{m:+.1} %"))
}

fn change(r: &Row) -> String {
    match (r.required_tons_then, r.required_tons_now) {
        (Some(a), Some(b)) => format!("{:+.2} ton", b - a),
        (None, Some(_)) if r.status_then.is_none() => "new".to_string(),
        (Some(_), None) if r.status_now.is_none() => "removed".to_string(),
        _ => "—".to_string(),
    }
}

fn rated(r: &Row) -> String {
    match (r.rated_tons_then, r.rated_tons_now) {
        (Some(a), Some(b)) if (a - b).abs() > 1e-9 => format!("{a:.2} → {b:.2} ton"),
        (_, Some(b)) => format!("{b:.2} ton"),
        (Some(a), None) => format!("{a:.2} ton (then)"),
        (None, None) => "—".to_string(),
    }
}

fn status(r: &Row) -> String {
    match (r.status_then, r.status_now) {
        (Some(a), Some(b)) if a != b => format!("{b} (was {a})"),
        (_, Some(b)) => b.to_string(),
        (Some(a), None) => format!("removed (was {a})"),
        (None, None) => "—".to_string(),
    }
}

fn callout(r: &Row) -> String {
    format!(
        "`{}` ({}) passed at the baseline and fails now: required {} then, {} now; rated {}; margin {} then, {} now",
        r.unit,
        r.file,
        tons(r.required_tons_then),
        tons(r.required_tons_now),
        rated(r),
        margin(r.margin_pct_then),
        margin(r.margin_pct_now)
    )
}

const HEADERS: [&str; 8] = [
    "Unit",
    "Design",
    "Required then",
    "Required now",
    "Change",
    "Rated",
    "Margin then → now",
    "Status",
];

fn cells(r: &Row) -> [String; 8] {
    [
        r.unit.clone(),
        r.file.clone(),
        tons(r.required_tons_then),
        tons(r.required_tons_now),
        change(r),
        rated(r),
        format!(
            "{} → {}",
            margin(r.margin_pct_then),
            margin(r.margin_pct_now)
        ),
        status(r),
    ]
}

/// The comparison as a text table.
pub fn text(c: &Comparison) -> String {
    let mut out = format!(
        "Coil capacity of every air handler, baseline `{}` against the working tree:\n\n",
        c.revision
    );
    let failing: Vec<&Row> = c.units.iter().filter(|r| r.newly_failing).collect();
    if !failing.is_empty() {
        out.push_str("Newly failing:\n");
        for r in &failing {
            out.push_str(&format!("  {}\n", callout(r)));
        }
        out.push('\n');
    }
    if c.units.is_empty() {
        out.push_str("No air handlers at the baseline or now.\n");
        return out;
    }
    let rows: Vec<[String; 8]> = c.units.iter().map(cells).collect();
    let mut widths = HEADERS.map(|h| h.chars().count());
    for r in &rows {
        for (w, cell) in widths.iter_mut().zip(r) {
            *w = (*w).max(cell.chars().count());
        }
    }
    let line = |cells: &[String]| {
        let mut s = String::new();
        for (i, (cell, w)) in cells.iter().zip(widths).enumerate() {
            if i > 0 {
                s.push_str("  ");
            }
            s.push_str(cell);
            if i + 1 < cells.len() {
                s.push_str(&" ".repeat(w.saturating_sub(cell.chars().count())));
            }
        }
        s.push('\n');
        s
    };
    out.push_str(&line(&HEADERS.map(str::to_string)));
    for r in &rows {
        out.push_str(&line(r));
    }
    out
}

/// The comparison as Markdown, for a pull-request comment or a job summary.
pub fn markdown(c: &Comparison) -> String {
    let mut out = format!("### Coil capacity against `{}`\n\n", md_cell(&c.revision));
    let failing: Vec<&Row> = c.units.iter().filter(|r| r.newly_failing).collect();
    if !failing.is_empty() {
        out.push_str("**Newly failing:**\n\n");
        for r in &failing {
            out.push_str(&format!("- {}\n", md_cell(&callout(r))));
        }
        out.push('\n');
    }
    if c.units.is_empty() {
        out.push_str("No air handlers at the baseline or now.\n");
        return out;
    }
    out.push_str(&format!("| {} |\n", HEADERS.join(" | ")));
    out.push_str(&format!("|{}\n", " --- |".repeat(HEADERS.len())));
    for r in &c.units {
        let mut cells = cells(r).map(|c| md_cell(&c));
        if r.newly_failing {
            cells[0] = format!("**{}**", cells[0]);
            cells[7] = format!("**{}**", cells[7]);
        }
        out.push_str(&format!("| {} |\n", cells.join(" | ")));
    }
    out
}

/// The caution, for Markdown output.
pub fn caution_markdown() -> String {
    format!("> {CAUTION}\n")
}
