//! Lexing and parsing throughput on a generated design of about 10 MB.
//!
//! Run with `cargo bench -p plenum-syntax --bench parse`. Criterion prints the
//! throughput in MiB/s for `lex` and `lex+parse`.

use std::fmt::Write;
use std::hint::black_box;

use criterion::{Criterion, Throughput, criterion_group, criterion_main};

/// A campus of `ahus` air handlers with `zones` zones each, in the core syntax.
fn generate(ahus: usize, zones: usize) -> String {
    let mut s = String::new();
    s.push_str("# Generated campus for benchmarks (invented).\n\nproject \"Bench Campus\" {\n  units ip\n}\n\n");
    s.push_str("site {\n  elevation 1_250 ft\n  cooling   93 °F db, 74 °F wb\n  dehumid   70 °F dp, 80 °F db\n}\n\n");
    s.push_str("let lights = 0.9 W/ft² * 1_000 ft²\n\n");
    for a in 0..ahus {
        for z in 0..zones {
            let _ = write!(
                s,
                "zone z{a}_{z} \"Room {a}-{z}\" {{\n  area      {} ft²\n  people    {}\n  use       office\n  indoor    75 °F, 50 %rh\n  sensible  {}.{} kBtu/h + lights  # from the load run\n  latent    {}.5 kBtu/h\n}}\n\n",
                600 + (z * 37) % 900,
                4 + z % 9,
                8 + (a + z) % 20,
                z % 10,
                1 + z % 4
            );
        }
        let _ = write!(s, "ahu ahu_{a} \"Unit {a}\" {{\n  serves       ");
        for z in 0..zones {
            if z > 0 {
                s.push_str(", ");
            }
            let _ = write!(s, "z{a}_{z}");
        }
        let _ = write!(
            s,
            "\n  supply_temp  55 °F\n  supply_duct  {} ft\n  return_duct  60 ft\n  fan {{\n    static 2.5 in.wg with efficiency 62 %\n    arrangement draw_through\n  }}\n  outdoor_air  ventilation\n  coil {{\n    rated {}.5 ton\n    chilled_water 44 °F to 56 °F\n  }}\n}}\n\n",
            100 + a % 200,
            10 + a % 30
        );
    }
    s
}

fn bench(c: &mut Criterion) {
    // About 10 MB: 2,000 air handlers of 20 zones.
    let text = generate(2_000, 20);
    assert!(plenum_syntax::parse(&text).errors.is_empty());
    let mut group = c.benchmark_group("syntax");
    group.throughput(Throughput::Bytes(text.len() as u64));
    group.sample_size(10);
    group.bench_function("lex", |b| {
        b.iter(|| black_box(plenum_syntax::lex(black_box(&text))).tokens.len())
    });
    // The tree is dropped outside the timed part: the figure is lexing and parsing.
    group.bench_function("lex+parse", |b| {
        b.iter_with_large_drop(|| plenum_syntax::parse(black_box(&text)))
    });
    group.finish();
    eprintln!("generated design: {:.1} MB", text.len() as f64 / 1e6);
}

criterion_group!(benches, bench);
criterion_main!(benches);
