//! The language server's latency on a generated design of about 20,000
//! lines (118 air handlers × 20 zones, one file): edit to diagnostics and
//! hover, as p50 and p95. Targets: edit to diagnostics p95 under 10 ms,
//! hover p95 under 2 ms.
//!
//! Two harnesses, one after the other:
//!
//! 1. `plenum-ide`'s host, in process: set the document's new text, then
//!    ask the analysis for the file's diagnostics (what the server does
//!    before it converts them to LSP).
//! 2. The real server (`plenum_lsp::run`, as `plenum lsp`) over stdio
//!    JSON-RPC: an incremental `didChange`, until the
//!    `publishDiagnostics` of that version arrives; a hover request until
//!    its response arrives.
//!
//! Edits are keystrokes at random places (a letter typed at the end of a
//! property key, then deleted; for the host also a digit typed into a
//! zone's load, then deleted). Hovers are on air handler names (the
//! coil summary), zone names and anywhere.
//!
//! Run with `cargo bench -p plenum-bench --bench server`; the p50/p95
//! lines are printed to standard error, followed by criterion's figures
//! for the host.

use std::hint::black_box;
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

use criterion::{Criterion, criterion_group, criterion_main};
use plenum_bench::edits::{Edit, key_typos, load_digits};
use plenum_bench::lsp::{Client, file_uri, position};
use plenum_bench::{Generated, hover_targets, summary};
use plenum_gen::Campus;
use plenum_ide::AnalysisHost;
use plenum_model::MemoryFs;
use serde_json::json;

const EDITS: usize = 200;
const HOVERS: usize = 100;
const TIMEOUT: Duration = Duration::from_secs(60);

fn design() -> (PathBuf, String) {
    let g = Generated::new(Campus::new(118, 20));
    let text = g.root_text().to_string();
    eprintln!(
        "design: {} lines, {} bytes, 118 air handlers x 20 zones",
        text.lines().count(),
        text.len()
    );
    (g.root.clone(), text)
}

fn host_edits(
    host: &mut AnalysisHost,
    path: &Path,
    text: &mut String,
    edits: &[Edit],
) -> Vec<Duration> {
    let mut samples = Vec::with_capacity(edits.len());
    for e in edits {
        e.apply(text);
        let start = Instant::now();
        host.set_document(path, text.clone());
        let d = host.analysis().diagnostics(path);
        samples.push(start.elapsed());
        black_box(d);
    }
    samples
}

fn host_harness(c: &mut Criterion, path: &Path, text: &str) {
    let mut host = AnalysisHost::new(MemoryFs::new());
    host.set_document(path, text.to_string());
    let first = host.analysis().diagnostics(path);
    eprintln!("host: {} diagnostics on the design", first.len());
    let mut current = text.to_string();
    let mut s = host_edits(&mut host, path, &mut current, &key_typos(text, EDITS, 1));
    eprintln!("host: edit to diagnostics (key typos): {}", summary(&mut s));
    let mut s = host_edits(&mut host, path, &mut current, &load_digits(text, EDITS, 2));
    eprintln!(
        "host: edit to diagnostics (load digits): {}",
        summary(&mut s)
    );
    assert_eq!(current, text, "every edit pair restores the text");

    let analysis = host.analysis();
    let targets = hover_targets(text, HOVERS, 3);
    for kind in ["air handler name", "zone name", "anywhere"] {
        let mut s: Vec<Duration> = targets
            .iter()
            .filter(|(k, _)| *k == kind)
            .map(|&(_, at)| {
                let start = Instant::now();
                black_box(analysis.hover(path, at as u32));
                start.elapsed()
            })
            .collect();
        eprintln!("host: hover on {kind}: {}", summary(&mut s));
    }

    let mut group = c.benchmark_group("ide-20k-lines");
    group.sample_size(20);
    let typos = key_typos(text, 2 * EDITS, 4);
    let mut i = 0usize;
    group.bench_function("edit-to-diagnostics", |b| {
        b.iter(|| {
            typos[i % typos.len()].apply(&mut current);
            i += 1;
            host.set_document(path, current.clone());
            black_box(host.analysis().diagnostics(path))
        })
    });
    let analysis = host.analysis();
    let ahus: Vec<usize> = targets
        .iter()
        .filter(|(k, _)| *k == "air handler name")
        .map(|&(_, at)| at)
        .collect();
    let mut j = 0usize;
    group.bench_function("hover air handler", |b| {
        b.iter(|| {
            j += 1;
            black_box(analysis.hover(path, ahus[j % ahus.len()] as u32))
        })
    });
    group.finish();
}

fn server_harness(path: &Path, text: &str) -> Result<(), String> {
    let server = Path::new(env!("CARGO_BIN_EXE_plenum-bench-lsp"));
    let caps = json!({ "general": { "positionEncodings": ["utf-8", "utf-16"] } });
    let (mut client, init) = Client::start(server, &[], caps, None, TIMEOUT)?;
    let utf8 = init["capabilities"]["positionEncoding"] == "utf-8";
    let uri = file_uri(path);
    let start = Instant::now();
    client.open(&uri, 1, text)?;
    let first = client.wait_published(&uri, TIMEOUT, |p| p.version == Some(1))?;
    eprintln!(
        "server: open to first diagnostics {:.1} ms, {} diagnostics",
        start.elapsed().as_secs_f64() * 1e3,
        first.diagnostics.len()
    );
    let mut current = text.to_string();
    let mut samples = Vec::with_capacity(EDITS);
    for (i, e) in key_typos(text, EDITS, 1).iter().enumerate() {
        let version = i as i64 + 2;
        let change = json!([{
            "range": {
                "start": position(&current, e.start, utf8),
                "end": position(&current, e.end, utf8),
            },
            "text": e.text,
        }]);
        e.apply(&mut current);
        let sent = Instant::now();
        client.change(&uri, version, change)?;
        let p = client.wait_published(&uri, TIMEOUT, |p| p.version == Some(version))?;
        samples.push(p.at.duration_since(sent));
    }
    eprintln!(
        "server: edit to published diagnostics: {}",
        summary(&mut samples)
    );
    for kind in ["air handler name", "zone name", "anywhere"] {
        let mut s = Vec::new();
        for &(k, at) in &hover_targets(text, HOVERS, 3) {
            if k != kind {
                continue;
            }
            let params = json!({
                "textDocument": { "uri": uri },
                "position": position(&current, at, utf8),
            });
            let sent = Instant::now();
            client.request("textDocument/hover", params, TIMEOUT)?;
            s.push(sent.elapsed());
        }
        eprintln!("server: hover on {kind}: {}", summary(&mut s));
    }
    let status = client.shutdown(TIMEOUT)?;
    if !status.success() {
        return Err(format!("the server exited with {status}"));
    }
    Ok(())
}

fn bench(c: &mut Criterion) {
    let (path, text) = design();
    if let Err(e) = server_harness(&path, &text) {
        eprintln!("server harness failed: {e}");
    }
    host_harness(c, &path, &text);
}

criterion_group!(benches, bench);
criterion_main!(benches);
