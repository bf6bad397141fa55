//! Parse one file and print how long it took (a profiling aid):
//! `cargo run --release -p plenum-syntax --example parse_file -- FILE`
fn main() {
    let Some(path) = std::env::args().nth(1) else {
        eprintln!("usage: parse_file FILE");
        std::process::exit(2);
    };
    let text = match std::fs::read_to_string(&path) {
        Ok(t) => t,
        Err(e) => {
            eprintln!("cannot read {path}: {e}");
            std::process::exit(2);
        }
    };
    // The trees are kept until after the clock stops: the figure is lexing and parsing.
    let mut kept = Vec::new();
    let start = std::time::Instant::now();
    let runs: usize = std::env::var("RUNS")
        .ok()
        .and_then(|r| r.parse().ok())
        .unwrap_or(5);
    for _ in 0..runs {
        kept.push(plenum_syntax::parse(&text));
    }
    let secs = start.elapsed().as_secs_f64() / runs.max(1) as f64;
    let errors = kept.last().map_or(0, |p| p.errors.len());
    println!(
        "{:.1} MB in {:.1} ms: {:.0} MB/s, {errors} errors",
        text.len() as f64 / 1e6,
        secs * 1e3,
        text.len() as f64 / 1e6 / secs
    );
}
