//! Edit-to-diagnostics latency: one keystroke-sized edit to a generated
//! design of about 2,000 lines, then the diagnostics of the file (the design
//! is rebuilt, evaluated and checked). Target: under 20 ms.
//!
//! Run with `cargo bench -p plenum-ide --bench edit`. Besides criterion's
//! figures the bench prints the p50 and p95 of 200 timed edits.

use std::hint::black_box;
use std::path::Path;
use std::time::{Duration, Instant};

use criterion::{Criterion, criterion_group, criterion_main};
use plenum_ide::AnalysisHost;
use plenum_model::MemoryFs;

/// An invented office block: `units` air handlers of `per_unit` zones each,
/// with varied loads, areas and occupancies so every coil is computed.
fn office_block(units: usize, per_unit: usize) -> String {
    let mut s = String::from(
        "# Generated office block for the edit benchmark (invented).\n\
         project \"Bench Offices\" {\n  units ip\n}\n\n\
         site {\n  elevation 820 ft\n  cooling   92 °F db, 75 °F wb\n}\n\n\
         let task_lights = 0.7 W/ft²\n\n",
    );
    for u in 0..units {
        for z in 0..per_unit {
            let area = 400 + (u * 53 + z * 91) % 1_100;
            s.push_str(&format!(
                "zone r{u}x{z} \"Room {u}.{z}\" {{\n  area     {area} ft²\n  people   {people}\n  use      office\n  sensible {sens}.{tenth} kBtu/h + task_lights * {area} ft²\n  latent   {lat}.2 kBtu/h\n}}\n\n",
                people = 2 + (u + z) % 7,
                sens = 6 + (u * 3 + z) % 11,
                tenth = z % 10,
                lat = 1 + z % 3,
            ));
        }
        let serves: Vec<String> = (0..per_unit).map(|z| format!("r{u}x{z}")).collect();
        s.push_str(&format!(
            "ahu unit_{u} \"Floor unit {u}\" {{\n  serves      {}\n  supply_temp 55 °F\n  supply_duct {} ft\n  return_duct 50 ft\n  fan {{\n    power 3 hp\n  }}\n  outdoor_air ventilation\n  coil {{\n    rated 25 ton\n  }}\n}}\n\n",
            serves.join(", "),
            90 + u * 7 % 100,
        ));
    }
    s
}

fn percentile(sorted: &[Duration], p: f64) -> Duration {
    let i = ((sorted.len() as f64 - 1.0) * p).round() as usize;
    sorted[i.min(sorted.len() - 1)]
}

fn bench(c: &mut Criterion) {
    let text = office_block(20, 11);
    let lines = text.lines().count();
    let path = Path::new("/w/offices.plenum");
    let mut host = AnalysisHost::new(MemoryFs::new());
    host.set_document(path, text.clone());
    let first = host.analysis().diagnostics(path);
    let errors = first
        .iter()
        .filter(|d| d.severity == plenum_ide::Severity::Error)
        .count();
    assert_eq!(errors, 0, "the generated design has no errors");
    eprintln!(
        "generated design: {lines} lines, {} bytes, {} diagnostics (assumptions, warnings)",
        text.len(),
        first.len()
    );

    // One edit: a zone's sensible load changes by a digit, back and forth.
    let needle = "sensible 6.0 kBtu/h";
    let at = text.find(needle).expect("the generator writes this load");
    let edited = |i: usize| {
        let mut t = text.clone();
        t.replace_range(
            at..at + needle.len(),
            &format!("sensible {}.0 kBtu/h", 6 + i % 3),
        );
        t
    };
    let mut samples = Vec::new();
    for i in 0..200 {
        let t = edited(i);
        let start = Instant::now();
        host.set_document(path, t);
        let d = host.analysis().diagnostics(path);
        samples.push(start.elapsed());
        black_box(d);
    }
    samples.sort();
    eprintln!(
        "edit-to-diagnostics over 200 edits: p50 {:.2} ms, p95 {:.2} ms, max {:.2} ms",
        percentile(&samples, 0.50).as_secs_f64() * 1e3,
        percentile(&samples, 0.95).as_secs_f64() * 1e3,
        percentile(&samples, 1.0).as_secs_f64() * 1e3,
    );

    let mut group = c.benchmark_group("ide");
    group.sample_size(30);
    let mut i = 0usize;
    group.bench_function("edit-to-diagnostics (2,000 lines)", |b| {
        b.iter(|| {
            i += 1;
            host.set_document(path, edited(i));
            black_box(host.analysis().diagnostics(path))
        })
    });
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
