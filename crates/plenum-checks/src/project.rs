//! The project runner shared by the CLI and the language server: from a set
//! of files to every design's model, evaluation and diagnostics.

use std::collections::BTreeMap;
use std::sync::Mutex;
use std::sync::atomic::{AtomicUsize, Ordering};

use foldhash::{HashMap, HashMapExt, HashSet, HashSetExt};
use std::path::{Path, PathBuf};

use plenum_engine::Evaluation;
use plenum_model::fs::normalize;
use plenum_model::{FileSystem, Model, Parsed};
use plenum_syntax::{Item, LineIndex, Parse, Span};

use crate::config::Config;
use crate::diagnostic::{Diagnostic, Loc};

/// Findings that something is absent (a zone no unit serves, a suppression
/// that silences nothing). In a file that several designs share, each
/// design sees only its part, so such a finding stands only when every
/// design that includes the file reports it.
const ABSENCE: [&str; 2] = ["unused-suppression", "unserved-zone"];

/// One file of the project, with its text and its diagnostics.
#[derive(Clone, Debug)]
pub struct FileReport {
    /// The path, normalised as the runner was given it.
    pub path: PathBuf,
    /// The text the diagnostics point into (for a file that is not UTF-8,
    /// the valid part before the first bad byte).
    pub text: String,
    /// Byte offsets ↔ lines and columns of `text`.
    pub lines: LineIndex,
    /// The file's diagnostics, sorted by position.
    pub diagnostics: Vec<Diagnostic>,
}

/// One design: a root file and everything it `use`s, with its results.
///
/// This is what `plenum report` renders and what the language server's
/// hover reads: the [`Model`] (files, typed design, symbols) and the
/// engine's [`Evaluation`] of it.
#[derive(Clone, Debug)]
pub struct Design {
    /// The root file.
    pub root: PathBuf,
    /// The loaded design.
    pub model: Model,
    /// The engine's results.
    pub evaluation: Evaluation,
    /// The settings that applied to it.
    pub config: Config,
}

/// Everything the runner found.
#[derive(Clone, Debug, Default)]
pub struct Project {
    /// Every file with diagnostics or read as part of a design (the given
    /// files, the files they `use`, and `plenum.toml` files), sorted by path.
    pub files: Vec<FileReport>,
    /// Every design, in the order of its root among the given files.
    pub designs: Vec<Design>,
    /// Given files that could not be read, with the reason.
    pub unreadable: Vec<(PathBuf, String)>,
}

impl Project {
    /// The report of one file.
    pub fn file(&self, path: &Path) -> Option<&FileReport> {
        let path = normalize(path);
        self.files.iter().find(|f| f.path == path)
    }

    /// Every diagnostic of every file.
    pub fn diagnostics(&self) -> impl Iterator<Item = (&FileReport, &Diagnostic)> {
        self.files
            .iter()
            .flat_map(|f| f.diagnostics.iter().map(move |d| (f, d)))
    }

    /// How many diagnostics there are of a severity.
    pub fn count(&self, severity: crate::Severity) -> usize {
        self.diagnostics()
            .filter(|(_, d)| d.severity == severity)
            .count()
    }
}

/// The design roots among `texts`: every file that no other file of the set
/// `use`s. A file that another file `use`s is checked through that design.
pub fn roots(texts: &[(PathBuf, String)]) -> Vec<PathBuf> {
    let uses: Vec<(PathBuf, Vec<PathBuf>)> = texts
        .iter()
        .map(|(p, t)| {
            let p = normalize(p);
            let u = use_paths(&p, &plenum_syntax::parse(t));
            (p, u)
        })
        .collect();
    roots_of(&uses)
}

/// The files a parsed file `use`s, resolved against its folder.
fn use_paths(path: &Path, parse: &Parse) -> Vec<PathBuf> {
    let dir = path.parent().unwrap_or(Path::new(""));
    parse
        .file
        .items
        .iter()
        .filter_map(|item| match item {
            Item::Use(u) => Some(normalize(&dir.join(&u.path.value))),
            _ => None,
        })
        .collect()
}

/// [`roots`] from each (normalised) file's `use`s.
fn roots_of(uses: &[(PathBuf, Vec<PathBuf>)]) -> Vec<PathBuf> {
    let used: HashSet<&PathBuf> = uses.iter().flat_map(|(_, u)| u).collect();
    let mut roots: Vec<PathBuf> = uses
        .iter()
        .map(|(p, _)| p.clone())
        .filter(|p| !used.contains(p))
        .collect();
    // Files that only use each other in a circle have no root: the first of
    // each circle becomes one, so that the cycle is reported (once).
    let by_path: HashMap<&Path, &[PathBuf]> = uses
        .iter()
        .map(|(p, u)| (p.as_path(), u.as_slice()))
        .collect();
    let mut reached = HashSet::new();
    for r in &roots {
        reachable(&by_path, r, &mut reached);
    }
    for (p, _) in uses {
        if !reached.contains(p) {
            reachable(&by_path, p, &mut reached);
            roots.push(p.clone());
        }
    }
    roots
}

/// Add the files reachable by `use` from `from` (itself included) to `seen`.
fn reachable(uses: &HashMap<&Path, &[PathBuf]>, from: &Path, seen: &mut HashSet<PathBuf>) {
    if !seen.insert(from.to_path_buf()) {
        return;
    }
    let mut stack: Vec<PathBuf> = vec![from.to_path_buf()];
    while let Some(p) = stack.pop() {
        for q in uses.get(p.as_path()).copied().unwrap_or_default() {
            if seen.insert(q.clone()) {
                stack.push(q.clone());
            }
        }
    }
}

/// Check a set of design files read through `fs`.
///
/// Finds the design roots ([`roots`]), builds each design's model, evaluates
/// it, runs the checks with the settings of the `plenum.toml` above the root
/// ([`Config::discover`]) and merges the diagnostics per file: a diagnostic
/// that several designs share (one in a `use`d file) is reported once; a
/// suppression in a shared file is unused, and a zone in it unserved, only
/// when no design uses the suppression or serves the zone. A
/// file that is not UTF-8 gets one `invalid-utf8` error and is not built.
pub fn check_files(fs: &dyn FileSystem, paths: &[PathBuf]) -> Project {
    let mut project = Project::default();
    let mut reports: BTreeMap<PathBuf, FileReport> = BTreeMap::new();
    let mut texts: Vec<(PathBuf, String)> = Vec::new();
    let mut given: HashSet<PathBuf> = HashSet::new();
    for path in paths {
        let path = normalize(path);
        if !given.insert(path.clone()) {
            continue;
        }
        match fs.read(&path) {
            Ok(bytes) => match String::from_utf8(bytes) {
                Ok(text) => texts.push((path, text)),
                Err(e) => {
                    let at = e.utf8_error().valid_up_to();
                    let prefix = String::from_utf8_lossy(&e.into_bytes()[..at]).into_owned();
                    let d = Diagnostic::new(
                        "invalid-utf8",
                        Loc::new(&path, Span::from_range(at..at)),
                        "file is not valid UTF-8",
                    )
                    .label("the first invalid byte is here")
                    .help("save the file as UTF-8");
                    reports.insert(
                        path.clone(),
                        FileReport {
                            lines: LineIndex::new(&prefix),
                            path,
                            text: prefix,
                            diagnostics: vec![d],
                        },
                    );
                }
            },
            Err(e) => project.unreadable.push((path, e.to_string())),
        }
    }
    // Each file is parsed once: for its `use`s here, and for its design.
    let uses: Vec<(PathBuf, Vec<PathBuf>)>;
    let mut pool: HashMap<PathBuf, (Parsed, usize)> = HashMap::new();
    {
        let parsed = parse_all(texts);
        uses = parsed
            .iter()
            .map(|(p, f)| (p.clone(), use_paths(p, &f.parse)))
            .collect();
        pool.extend(parsed.into_iter().map(|(p, f)| (p, (f, 0))));
    }
    let roots = roots_of(&uses);
    // How many designs may read each file: the last one takes the parse,
    // the others get a copy.
    {
        let by_path: HashMap<&Path, &[PathBuf]> = uses
            .iter()
            .map(|(p, u)| (p.as_path(), u.as_slice()))
            .collect();
        for root in &roots {
            let mut reached = HashSet::new();
            reachable(&by_path, root, &mut reached);
            for p in reached {
                if let Some((_, n)) = pool.get_mut(&p) {
                    *n += 1;
                }
            }
        }
    }
    let mut take = |path: &Path| -> Option<Parsed> {
        let (_, n) = pool.get_mut(path)?;
        if *n > 1 {
            *n -= 1;
            return pool.get(path).map(|(f, _)| f.clone());
        }
        pool.remove(path).map(|(f, _)| f)
    };
    let mut configs: HashMap<PathBuf, Config> = HashMap::new();
    // Per finding of an absence (file, code, span): how many designs reported it.
    let mut unused: HashMap<(PathBuf, &'static str, Span), (usize, Diagnostic)> = HashMap::new();
    // Per file: how many designs include it.
    let mut designs_of: HashMap<PathBuf, usize> = HashMap::new();
    let mut seen: Seen = HashMap::new();
    // Reading (through `fs`) on this thread; lowering, evaluating and
    // checking each design on as many threads as there are cores.
    let mut loaded = Vec::with_capacity(roots.len());
    for root in &roots {
        let Some(root_file) = take(root) else {
            continue;
        };
        let files = Model::load(fs, root, root_file, &mut take);
        let config = match plenum_model::fs::config_file(fs, root) {
            Some(cfg) => configs
                .entry(cfg.clone())
                .or_insert_with(|| Config::read(fs, &cfg))
                .clone(),
            None => Config::new(),
        };
        loaded.push((root.clone(), files, config));
    }
    let bytes: usize = loaded
        .iter()
        .flat_map(|(_, l, _)| l.files())
        .map(|f| f.text.len())
        .sum();
    let built = par_map(loaded, bytes, |(root, files, config)| {
        let model = files.lower();
        let evaluation = plenum_engine::evaluate(&model.design);
        let diagnostics = crate::check(&model, &evaluation, &config);
        (
            Design {
                root,
                model,
                evaluation,
                config,
            },
            diagnostics,
        )
    });
    for (design, diagnostics) in built {
        for f in &design.model.files {
            *designs_of.entry(f.path.clone()).or_default() += 1;
            reports.entry(f.path.clone()).or_insert_with(|| FileReport {
                path: f.path.clone(),
                text: f.text.clone(),
                lines: f.lines.clone(),
                diagnostics: Vec::new(),
            });
        }
        for d in diagnostics {
            if ABSENCE.contains(&d.code) {
                let key = (d.loc.file.clone(), d.code, d.loc.span);
                unused.entry(key).or_insert((0, d)).0 += 1;
                continue;
            }
            push(&mut reports, &mut seen, d);
        }
        project.designs.push(design);
    }
    let mut unused: Vec<_> = unused.into_iter().collect();
    unused.sort_by(|a, b| a.0.cmp(&b.0));
    for ((file, _, _), (count, d)) in unused {
        if designs_of.get(&file).copied().unwrap_or(0) <= count {
            push(&mut reports, &mut seen, d);
        }
    }
    let mut configs: Vec<Config> = configs.into_values().collect();
    configs.sort_by(|a, b| a.path.cmp(&b.path));
    for c in configs {
        let Some(path) = &c.path else { continue };
        if c.diagnostics.is_empty() {
            continue;
        }
        let report = reports.entry(path.clone()).or_insert_with(|| FileReport {
            path: path.clone(),
            lines: LineIndex::new(&c.text),
            text: c.text.clone(),
            diagnostics: Vec::new(),
        });
        report.diagnostics.extend(c.diagnostics.iter().cloned());
    }
    for r in reports.values_mut() {
        r.diagnostics
            .sort_by_key(|d| (d.loc.span.start, d.loc.span.end));
    }
    project.files = reports.into_values().collect();
    project
}

/// Below this many bytes in all, work is done on the calling thread:
/// starting threads costs more than it saves.
const PARALLEL_BYTES: usize = 256 * 1024;

/// `f` of every item, on as many threads as there are cores (each thread
/// takes the next item not yet taken), when there are several items and
/// `bytes` (the size of the work) reaches [`PARALLEL_BYTES`]; else on the
/// calling thread. The results are in the order of the items.
fn par_map<T: Send, R: Send>(items: Vec<T>, bytes: usize, f: impl Fn(T) -> R + Sync) -> Vec<R> {
    let threads = std::thread::available_parallelism()
        .map_or(1, |n| n.get())
        .min(items.len());
    if threads <= 1 || bytes < PARALLEL_BYTES {
        return items.into_iter().map(f).collect();
    }
    let n = items.len();
    let slots: Vec<Mutex<Option<T>>> = items.into_iter().map(|t| Mutex::new(Some(t))).collect();
    let next = AtomicUsize::new(0);
    let mut done: Vec<(usize, R)> = std::thread::scope(|scope| {
        let handles: Vec<_> = (0..threads)
            .map(|_| {
                scope.spawn(|| {
                    let mut out = Vec::new();
                    loop {
                        let i = next.fetch_add(1, Ordering::Relaxed);
                        let Some(slot) = slots.get(i) else {
                            break;
                        };
                        let item = match slot.lock() {
                            Ok(mut g) => g.take(),
                            Err(poisoned) => poisoned.into_inner().take(),
                        };
                        if let Some(item) = item {
                            out.push((i, f(item)));
                        }
                    }
                    out
                })
            })
            .collect();
        handles
            .into_iter()
            .flat_map(|h| match h.join() {
                Ok(out) => out,
                Err(panic) => std::panic::resume_unwind(panic),
            })
            .collect()
    });
    debug_assert_eq!(done.len(), n);
    done.sort_by_key(|(i, _)| *i);
    done.into_iter().map(|(_, r)| r).collect()
}

/// Parse every file (in parallel when there are several and enough text),
/// largest first; the result is in the order given.
fn parse_all(texts: Vec<(PathBuf, String)>) -> Vec<(PathBuf, Parsed)> {
    let total: usize = texts.iter().map(|(_, t)| t.len()).sum();
    let mut files: Vec<(usize, (PathBuf, String))> = texts.into_iter().enumerate().collect();
    files.sort_by_key(|(_, (_, t))| std::cmp::Reverse(t.len()));
    let mut parsed = par_map(files, total, |(i, (p, text))| {
        let parse = plenum_syntax::parse(&text);
        (i, (p, Parsed { text, parse }))
    });
    parsed.sort_by_key(|(i, _)| *i);
    parsed.into_iter().map(|(_, f)| f).collect()
}

/// Per file, per (span, code): where the diagnostics pushed so far are in
/// the file's report, so that a repeat (the same code, place and message)
/// is found without keeping a copy of every path and message.
type Seen = HashMap<PathBuf, HashMap<(Span, &'static str), Vec<usize>>>;

fn push(reports: &mut BTreeMap<PathBuf, FileReport>, seen: &mut Seen, d: Diagnostic) {
    let Some(r) = reports.get_mut(&d.loc.file) else {
        return;
    };
    let of_file = match seen.get_mut(&d.loc.file) {
        Some(m) => m,
        None => seen.entry(d.loc.file.clone()).or_default(),
    };
    let at = of_file.entry((d.loc.span, d.code)).or_default();
    if at
        .iter()
        .any(|&i| r.diagnostics.get(i).is_some_and(|e| e.message == d.message))
    {
        return;
    }
    at.push(r.diagnostics.len());
    r.diagnostics.push(d);
}
