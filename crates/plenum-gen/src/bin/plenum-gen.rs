//! `plenum-gen`: write an invented campus design (a development tool).
//!
//! ```text
//! plenum-gen --ahus 2000 --zones 20 --files 8 --seed 1 --out /tmp/campus
//! plenum-gen --ahus 50 --zones 10 --stdout > campus.plenum
//! ```

use std::io::Write;
use std::path::PathBuf;
use std::process::ExitCode;

use clap::Parser;
use plenum_gen::{Campus, generate};

/// Write an invented campus of air handlers and zones in the core syntax.
#[derive(Parser, Debug)]
#[command(name = "plenum-gen", version)]
struct Args {
    /// Number of air handlers.
    #[arg(long, default_value_t = 100)]
    ahus: usize,
    /// Zones per air handler.
    #[arg(long, default_value_t = 20)]
    zones: usize,
    /// Number of files: 1 is one self-contained file; K ≥ 2 is a shared
    /// site file and K − 1 building files.
    #[arg(long, default_value_t = 1)]
    files: usize,
    /// Seed of the random choices: the same seed gives the same campus.
    #[arg(long, default_value_t = 0)]
    seed: u64,
    /// Fraction of the coils rated deliberately undersized (0 to 1).
    #[arg(long, default_value_t = 0.1)]
    undersized: f64,
    /// Folder to write the files into (created if needed).
    #[arg(long, required_unless_present = "stdout", conflicts_with = "stdout")]
    out: Option<PathBuf>,
    /// Write one file to standard output instead (implies --files 1).
    #[arg(long)]
    stdout: bool,
}

fn main() -> ExitCode {
    let args = Args::parse();
    if !(0.0..=1.0).contains(&args.undersized) {
        eprintln!("plenum-gen: --undersized must be between 0 and 1");
        return ExitCode::from(2);
    }
    if args.stdout && args.files > 1 {
        eprintln!("plenum-gen: --stdout writes one file; leave out --files or use --out");
        return ExitCode::from(2);
    }
    let campus = Campus::new(args.ahus, args.zones)
        .files(if args.stdout { 1 } else { args.files })
        .seed(args.seed)
        .undersized(args.undersized);
    let files = generate(&campus);
    if args.stdout {
        let mut out = std::io::stdout().lock();
        for (_, text) in &files {
            if let Err(e) = out.write_all(text.as_bytes()) {
                eprintln!("plenum-gen: cannot write to standard output: {e}");
                return ExitCode::FAILURE;
            }
        }
        return ExitCode::SUCCESS;
    }
    let Some(dir) = args.out else {
        return ExitCode::from(2);
    };
    let mut bytes = 0;
    for (path, text) in &files {
        let full = dir.join(path);
        if let Some(parent) = full.parent()
            && let Err(e) = std::fs::create_dir_all(parent)
        {
            eprintln!("plenum-gen: cannot create {}: {e}", parent.display());
            return ExitCode::FAILURE;
        }
        if let Err(e) = std::fs::write(&full, text) {
            eprintln!("plenum-gen: cannot write {}: {e}", full.display());
            return ExitCode::FAILURE;
        }
        bytes += text.len();
    }
    eprintln!(
        "plenum-gen: wrote {} file{} ({bytes} bytes) to {}; check from {}",
        files.len(),
        if files.len() == 1 { "" } else { "s" },
        dir.display(),
        dir.join(campus.root()).display()
    );
    ExitCode::SUCCESS
}
