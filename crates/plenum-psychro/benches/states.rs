//! States per second: from (dry bulb, wet bulb) to every property.
//!
//! Run with `cargo bench -p plenum-psychro --bench states`. One iteration
//! builds a full state (humidity ratio from the wet-bulb balance, dew point by
//! the root finder, RH, enthalpy, volume, density) for each of a fixed set of
//! ordinary design conditions, in IP and in SI.

use criterion::{Criterion, Throughput, criterion_group, criterion_main};
use plenum_psychro::{ip, si};
use std::hint::black_box;

/// (dry bulb °F, wet bulb °F, pressure psia): 64 invented conditions across
/// the design range, sea level to about 10,000 ft.
fn ip_inputs() -> Vec<(f64, f64, f64)> {
    let mut v = Vec::new();
    for (i, db) in [20.0, 45.0, 60.0, 75.0, 85.0, 94.0, 105.0, 115.0]
        .iter()
        .enumerate()
    {
        for (j, dep) in [0.5, 3.0, 6.0, 9.0, 12.0, 15.0, 18.0, 21.0]
            .iter()
            .enumerate()
        {
            let p = 14.696 - 0.55 * ((i + j) % 8) as f64;
            let wb: f64 = db - dep;
            v.push((*db, wb.max(db - 8.0), p));
        }
    }
    v
}

fn bench(c: &mut Criterion) {
    let ip_in = ip_inputs();
    let si_in: Vec<(f64, f64, f64)> = ip_in
        .iter()
        .map(|(db, wb, p)| {
            (
                (db - 32.0) / 1.8,
                (wb - 32.0) / 1.8,
                p * plenum_psychro::PA_PER_PSI,
            )
        })
        .collect();
    let mut g = c.benchmark_group("psychro");
    g.measurement_time(std::time::Duration::from_secs(3));
    g.warm_up_time(std::time::Duration::from_secs(1));
    g.throughput(Throughput::Elements(ip_in.len() as u64));
    g.bench_function("ip_state_from_db_wb", |b| {
        b.iter(|| {
            let mut acc = 0.0;
            for &(db, wb, p) in &ip_in {
                if let Ok(s) = ip::State::from_db_wb(black_box(db), black_box(wb), black_box(p)) {
                    acc += s.rh() + s.dew_point() + s.enthalpy() + s.density();
                }
            }
            acc
        })
    });
    g.bench_function("si_state_from_db_wb", |b| {
        b.iter(|| {
            let mut acc = 0.0;
            for &(db, wb, p) in &si_in {
                if let Ok(s) = si::State::from_db_wb(black_box(db), black_box(wb), black_box(p)) {
                    acc += s.rh() + s.dew_point() + s.enthalpy() + s.density();
                }
            }
            acc
        })
    });
    // The same conditions as (db, W): the wet bulb alone, by the root finder.
    let ip_w: Vec<(f64, f64, f64)> = ip_in
        .iter()
        .filter_map(|&(db, wb, p)| ip::State::from_db_wb(db, wb, p).ok())
        .map(|s| (s.dry_bulb(), s.hum_ratio(), s.pressure()))
        .collect();
    assert_eq!(
        ip_w.len(),
        ip_in.len(),
        "every benchmark condition is a valid state"
    );
    g.bench_function("ip_wet_bulb_from_db_w", |b| {
        b.iter(|| {
            let mut acc = 0.0;
            for &(db, w, p) in &ip_w {
                if let Ok(t) = ip::wet_bulb(black_box(db), black_box(w), black_box(p)) {
                    acc += t;
                }
            }
            acc
        })
    });
    g.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
