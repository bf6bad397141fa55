//! Rasterised with resvg: the picture is not empty, and the state markers,
//! the saturation curve and each process colour are where the model says.
//! The PNGs are left in the target's temporary folder for a look.

#![allow(clippy::unwrap_used)]

mod common;

use plenum_chart::Chart;
use plenum_chart::style;
use plenum_units::UnitSystem;
use resvg::{tiny_skia, usvg};

/// Rasterise; with `fonts`, the system's fonts draw the text (for the PNG
/// left to look at). The checks below do not look at text, so they hold on
/// a machine without fonts too, and text-free rendering keeps the test fast.
fn rasterise(svg: &str, fonts: bool) -> tiny_skia::Pixmap {
    let mut opt = usvg::Options::default();
    if fonts {
        opt.fontdb_mut().load_system_fonts();
        opt.fontdb_mut().set_sans_serif_family("DejaVu Sans");
    }
    let tree = usvg::Tree::from_str(svg, &opt).unwrap();
    let size = tree.size().to_int_size();
    let mut pixmap = tiny_skia::Pixmap::new(size.width(), size.height()).unwrap();
    resvg::render(&tree, tiny_skia::Transform::default(), &mut pixmap.as_mut());
    pixmap
}

fn hex(c: &str) -> [u8; 3] {
    let v = u32::from_str_radix(c.trim_start_matches('#'), 16).unwrap();
    [(v >> 16) as u8, (v >> 8) as u8, v as u8]
}

fn px(p: &tiny_skia::Pixmap, x: f64, y: f64) -> [u8; 3] {
    let c = p.pixel(x.round() as u32, y.round() as u32).unwrap();
    [c.red(), c.green(), c.blue()]
}

fn near(a: [u8; 3], b: [u8; 3], tol: i32) -> bool {
    a.iter()
        .zip(b)
        .all(|(x, y)| (i32::from(*x) - i32::from(y)).abs() <= tol)
}

fn chart(ex: &str, ahu: &str, units: UnitSystem) -> &'static Chart {
    &common::all_charts()
        .iter()
        .find(|c| c.0 == ex && c.1 == ahu && c.2 == units)
        .unwrap()
        .3
}

#[test]
fn rendered_charts_show_markers_curves_and_process() {
    for (i, (ex, ahu, units)) in [
        ("library.plenum", "ahu_1", UnitSystem::Ip),
        ("library.plenum", "ahu_2", UnitSystem::Si),
        ("middle-school.plenum", "ahu_3", UnitSystem::Ip),
    ]
    .into_iter()
    .enumerate()
    {
        let c = chart(ex, ahu, units);
        let pixmap = rasterise(&plenum_chart::render_svg(c), i == 0);
        if i == 0 {
            let dir = std::path::PathBuf::from(env!("CARGO_TARGET_TMPDIR"));
            let name = format!("{}-{ahu}-{units:?}.png", ex.trim_end_matches(".plenum"));
            pixmap.save_png(dir.join(name)).unwrap();
        }
        let ctx = format!("{ex} {ahu} {units:?}");

        // One pass over the pixels: the inked ones (neither paper nor the
        // chart's sheet) and those of each process colour.
        let paper = hex(style::PAPER);
        let sheet = hex(style::SHEET);
        let process = [
            ("mixing", hex(style::MIXING)),
            ("coil", hex(style::COIL)),
            ("heat", hex(style::HEAT)),
            ("room", hex(style::ROOM)),
        ];
        let mut inked = 0usize;
        let mut counts = [0usize; 4];
        for c in pixmap.pixels() {
            let c = [c.red(), c.green(), c.blue()];
            if !near(c, paper, 6) && !near(c, sheet, 6) {
                inked += 1;
                for (n, (_, want)) in counts.iter_mut().zip(&process) {
                    if near(c, *want, 10) {
                        *n += 1;
                    }
                }
            }
        }
        let total = pixmap.pixels().len();
        assert!(
            inked * 50 > total,
            "{ctx}: only {inked} of {total} pixels inked"
        );
        for (n, (name, _)) in counts.iter().zip(&process) {
            assert!(*n > 30, "{ctx}: {n} pixels of the {name} colour");
        }

        // Each marker's centre has the marker's colour.
        let marker = hex(style::MARKER);
        for m in &c.markers {
            let p = c.frame.to_page(m.at);
            assert!(
                near(px(&pixmap, p.x, p.y), marker, 12),
                "{ctx}: marker {} at ({:.0}, {:.0}) is {:?}",
                m.name,
                p.x,
                p.y,
                px(&pixmap, p.x, p.y)
            );
        }
        // A point of the saturation curve away from markers and labels.
        let sat = hex(style::SATURATION);
        let on_sat = c
            .saturation
            .iter()
            .map(|q| c.frame.to_page(*q))
            .filter(|p| {
                c.labels
                    .iter()
                    .all(|l| l.rect.inflate(4.0).nearest(*p).dist(*p) > 0.0)
                    && c.markers
                        .iter()
                        .all(|m| c.frame.to_page(m.at).dist(*p) > 12.0)
                    && c.adp.is_none_or(|a| c.frame.to_page(a.at).dist(*p) > 12.0)
            })
            .filter(|p| near(px(&pixmap, p.x, p.y), sat, 40))
            .count();
        assert!(on_sat > 20, "{ctx}: {on_sat} saturation pixels found");
    }
}
