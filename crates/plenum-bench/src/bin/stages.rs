//! Time each stage once on design files read from disk, for profiling
//! (`perf record`, `valgrind --tool=callgrind`) and quick comparisons.
//!
//! ```text
//! plenum-stages PATH... [--only lex|parse|model|engine|checks|check] [--repeat N]
//! ```
//!
//! PATH is a file or a folder (its `*.plenum` files, recursively). Prints
//! the time of each stage and the throughput over the total size.

use std::path::{Path, PathBuf};
use std::process::ExitCode;
use std::time::Instant;

use plenum_model::{Model, RealFs};

fn collect(path: &Path, out: &mut Vec<PathBuf>) {
    if path.is_dir() {
        let Ok(entries) = std::fs::read_dir(path) else {
            return;
        };
        let mut entries: Vec<PathBuf> = entries.filter_map(|e| e.ok().map(|e| e.path())).collect();
        entries.sort();
        for e in entries {
            collect(&e, out);
        }
    } else if path.extension().is_some_and(|e| e == "plenum") {
        out.push(path.to_path_buf());
    }
}

fn main() -> ExitCode {
    let mut paths = Vec::new();
    let mut only: Option<String> = None;
    let mut repeat = 1usize;
    let mut args = std::env::args().skip(1);
    while let Some(a) = args.next() {
        match a.as_str() {
            "--only" => only = args.next(),
            "--repeat" => repeat = args.next().and_then(|n| n.parse().ok()).unwrap_or(1),
            _ => collect(Path::new(&a), &mut paths),
        }
    }
    if paths.is_empty() {
        eprintln!("usage: plenum-stages PATH... [--only STAGE] [--repeat N]");
        return ExitCode::from(2);
    }
    let texts: Vec<(PathBuf, String)> = paths
        .iter()
        .filter_map(|p| Some((p.clone(), std::fs::read_to_string(p).ok()?)))
        .collect();
    let bytes: usize = texts.iter().map(|(_, t)| t.len()).sum();
    let runs = |stage: &str| only.as_deref().is_none_or(|o| o == stage);
    let report = |stage: &str, secs: f64| {
        let secs = secs / repeat as f64;
        println!(
            "{stage:<8} {:>9.2} ms  {:>8.1} MB/s",
            secs * 1e3,
            bytes as f64 / secs / 1e6
        );
    };
    println!("{} files, {bytes} bytes", texts.len());
    if runs("lex") {
        let t = Instant::now();
        for _ in 0..repeat {
            for (_, text) in &texts {
                std::hint::black_box(plenum_syntax::lex(text).tokens.len());
            }
        }
        report("lex", t.elapsed().as_secs_f64());
    }
    if runs("parse") {
        let t = Instant::now();
        for _ in 0..repeat {
            for (_, text) in &texts {
                std::hint::black_box(plenum_syntax::parse(text));
            }
        }
        report("parse", t.elapsed().as_secs_f64());
    }
    let need_model = ["model", "engine", "checks"].iter().any(|s| runs(s));
    if need_model {
        let roots = plenum_checks::roots(&texts);
        let t = Instant::now();
        let mut models = Vec::new();
        for _ in 0..repeat {
            models.clear();
            for root in &roots {
                let text = std::fs::read_to_string(root).unwrap_or_default();
                models.push(Model::build(&RealFs, root, text));
            }
        }
        if runs("model") {
            report("model", t.elapsed().as_secs_f64());
        }
        let t = Instant::now();
        let mut evals = Vec::new();
        for _ in 0..repeat {
            evals = models
                .iter()
                .map(|m| plenum_engine::evaluate(&m.design))
                .collect();
        }
        if runs("engine") {
            report("engine", t.elapsed().as_secs_f64());
        }
        if runs("checks") {
            let config = plenum_checks::Config::new();
            let t = Instant::now();
            for _ in 0..repeat {
                for (m, e) in models.iter().zip(&evals) {
                    std::hint::black_box(plenum_checks::check(m, e, &config));
                }
            }
            report("checks", t.elapsed().as_secs_f64());
        }
    }
    if only.as_deref() == Some("ide") {
        // Keystroke edits through the language server's analysis host.
        let Some((path, text)) = texts.first() else {
            return ExitCode::from(2);
        };
        let mut host = plenum_ide::AnalysisHost::new(RealFs);
        host.set_document(path, text.clone());
        std::hint::black_box(host.analysis().diagnostics(path));
        let edits = plenum_bench::edits::key_typos(text, 2 * repeat, 1);
        let mut current = text.clone();
        let t = Instant::now();
        for e in &edits {
            e.apply(&mut current);
            host.set_document(path, current.clone());
            std::hint::black_box(host.analysis().diagnostics(path));
        }
        let per = t.elapsed().as_secs_f64() / edits.len() as f64;
        println!("ide edit {:>9.2} ms per edit", per * 1e3);
    }
    if runs("check") {
        let t = Instant::now();
        for _ in 0..repeat {
            std::hint::black_box(plenum_checks::check_files(&RealFs, &paths));
        }
        report("check", t.elapsed().as_secs_f64());
    }
    ExitCode::SUCCESS
}
