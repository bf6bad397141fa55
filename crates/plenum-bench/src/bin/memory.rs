//! Peak memory of the project runner (`plenum check`'s
//! `plenum_checks::check_files`) on design files read from disk, against
//! the target of 10 × the input plus 30 MB.
//!
//! ```text
//! plenum-memory PATH...            # check_files alone: the figure
//! plenum-memory PATH... --stages   # resident size after each stage
//! ```
//!
//! The peak is the process's `VmHWM` (`/proc/self/status`), so run one
//! measurement per process; the files are read before the measurement
//! starts and counted in it.

use std::path::{Path, PathBuf};
use std::process::ExitCode;

use plenum_bench::proc_status_kb;
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

fn mb(kb: u64) -> f64 {
    kb as f64 * 1024.0 / 1e6
}

fn line(what: &str) {
    let rss = proc_status_kb("VmRSS").unwrap_or(0);
    let hwm = proc_status_kb("VmHWM").unwrap_or(0);
    println!(
        "{what:<28} rss {:>7.1} MB  peak {:>7.1} MB",
        mb(rss),
        mb(hwm)
    );
}

fn main() -> ExitCode {
    let mut paths = Vec::new();
    let mut stages = false;
    for a in std::env::args().skip(1) {
        if a == "--stages" {
            stages = true;
        } else {
            collect(Path::new(&a), &mut paths);
        }
    }
    if paths.is_empty() {
        eprintln!("usage: plenum-memory PATH... [--stages]");
        return ExitCode::from(2);
    }
    let bytes: u64 = paths
        .iter()
        .filter_map(|p| std::fs::metadata(p).ok())
        .map(|m| m.len())
        .sum();
    println!("{} files, {bytes} bytes", paths.len());
    line("start");
    if stages {
        let texts: Vec<(PathBuf, String)> = paths
            .iter()
            .filter_map(|p| Some((p.clone(), std::fs::read_to_string(p).ok()?)))
            .collect();
        line("read");
        let parses: Vec<_> = texts.iter().map(|(_, t)| plenum_syntax::parse(t)).collect();
        line("parsed (kept)");
        drop(parses);
        let roots = plenum_checks::roots(&texts);
        let models: Vec<Model> = roots
            .iter()
            .map(|r| Model::build(&RealFs, r, std::fs::read_to_string(r).unwrap_or_default()))
            .collect();
        line("models");
        let evals: Vec<_> = models
            .iter()
            .map(|m| plenum_engine::evaluate(&m.design))
            .collect();
        line("evaluations");
        let config = plenum_checks::Config::new();
        let diags: Vec<_> = models
            .iter()
            .zip(&evals)
            .map(|(m, e)| plenum_checks::check(m, e, &config))
            .collect();
        line(&format!(
            "diagnostics ({})",
            diags.iter().map(Vec::len).sum::<usize>()
        ));
    } else {
        let project = plenum_checks::check_files(&RealFs, &paths);
        line(&format!(
            "check_files ({} diagnostics)",
            project.diagnostics().count()
        ));
        let peak = proc_status_kb("VmHWM").unwrap_or(0);
        let target = 10.0 * bytes as f64 / 1e6 + 30.0;
        println!(
            "peak {:.1} MB = {:.1} x the input; target {target:.1} MB (10 x input + 30 MB): {}",
            mb(peak),
            mb(peak) / (bytes as f64 / 1e6),
            if mb(peak) < target { "met" } else { "missed" }
        );
    }
    ExitCode::SUCCESS
}
