//! Invented campus designs of any size, for benchmarks and robustness tests
//! (a development tool: not published, not a user command).
//!
//! [`generate`] writes a [`Campus`] of N air handlers with M zones each in
//! the core syntax, over one file or several (a shared site file that the
//! building files `use`; the last air handler of a building has some of its
//! zones in the next building's file). Values are drawn, per kind of room,
//! from ranges typical of such rooms (*common practice*, from memory); every
//! coil is rated from the engine's own required load, so most units are
//! `ok` and a chosen fraction is undersized. The same [`Campus`] always
//! gives the same text: the random numbers come from a small generator of
//! our own (SplitMix64), not from a library whose streams could change.
//!
//! The output parses, lowers and evaluates without an error, and is already
//! in the canonical layout (`plenum_fmt::format(x) == x`); the crate's tests
//! check both for several seeds and sizes.
//!
//! ```
//! use plenum_gen::{Campus, generate};
//!
//! let files = generate(&Campus::new(3, 4).seed(7).files(3));
//! let names: Vec<_> = files.iter().map(|(p, _)| p.display().to_string()).collect();
//! assert_eq!(names, ["shared/site.plenum", "building-1.plenum", "building-2.plenum"]);
//! let (root, text) = &files[1];
//! assert!(text.starts_with("# Building 1"));
//! assert_eq!(plenum_fmt::format(text).unwrap(), *text);
//! # let _ = root;
//! ```
//!
//! The building blocks ([`blocks`]) write single zones, air handlers and
//! sites, for tests that want designs of their own. [`oracle`] holds the
//! invariant checks the fuzz targets (`fuzz/` at the repository root) share
//! with the regression tests.

pub mod blocks;
pub mod oracle;
mod plan;
mod rng;
mod text;

use std::collections::HashMap;
use std::path::{Path, PathBuf};

use blocks::{Capacity, OutdoorAir};
use plan::{Sizing, Unit};
use rng::Rng;
use text::FileText;

/// What to generate. Build it with [`Campus::new`] and the setters.
#[derive(Clone, Debug, PartialEq)]
pub struct Campus {
    /// Number of air handlers (at least 1).
    pub ahus: usize,
    /// Zones per air handler (at least 1).
    pub zones_per_ahu: usize,
    /// Number of files: 1 writes one self-contained `campus.plenum`; K ≥ 2
    /// writes `shared/site.plenum` and K − 1 building files (at most one
    /// building per air handler).
    pub files: usize,
    /// The seed: the same seed gives the same campus.
    pub seed: u64,
    /// Fraction (0 to 1) of the air handlers whose coil is deliberately
    /// undersized (rated 8 to 22 % below the requirement); the others are
    /// rated at the requirement plus 2 to 22 %, which the engine calls `ok`.
    pub undersized: f64,
}

impl Campus {
    /// `ahus` air handlers of `zones_per_ahu` zones in one file, seed 0,
    /// a tenth of the coils undersized.
    pub fn new(ahus: usize, zones_per_ahu: usize) -> Campus {
        Campus {
            ahus,
            zones_per_ahu,
            files: 1,
            seed: 0,
            undersized: 0.1,
        }
    }

    pub fn files(mut self, files: usize) -> Campus {
        self.files = files;
        self
    }

    pub fn seed(mut self, seed: u64) -> Campus {
        self.seed = seed;
        self
    }

    pub fn undersized(mut self, fraction: f64) -> Campus {
        self.undersized = fraction;
        self
    }

    /// The number of files [`generate`] writes for this campus.
    pub fn file_count(&self) -> usize {
        self.files.clamp(1, self.ahus.max(1) + 1)
    }

    /// The path of the file to check the whole campus from: `campus.plenum`,
    /// or the first building, which `use`s the next, and so on, so that it
    /// loads every file.
    pub fn root(&self) -> PathBuf {
        if self.file_count() == 1 {
            PathBuf::from(ONE_FILE)
        } else {
            PathBuf::from(building_path(0, self.file_count() - 1))
        }
    }

    /// The number of air handlers [`generate`] rates undersized.
    pub fn undersized_count(&self) -> usize {
        let n = self.ahus.max(1);
        ((self.undersized.clamp(0.0, 1.0) * n as f64).round() as usize).min(n)
    }
}

const ONE_FILE: &str = "campus.plenum";
const SITE_FILE: &str = "shared/site.plenum";
/// Share of the air handlers written in SI units.
const SI_SHARE: f64 = 0.12;

fn building_path(b: usize, buildings: usize) -> String {
    let width = buildings.to_string().len();
    format!("building-{:0width$}.plenum", b + 1)
}

/// Write the campus: `(path, text)` for each file, paths relative to the
/// campus folder, the site file (if any) first. See [`Campus::root`] for the
/// file that loads them all.
///
/// Sizing the coils runs the model and the engine on the campus once (a
/// second time in the rare case a drawn unit has no result and is redrawn
/// with the plainest choices), so generating costs about as much as
/// checking the result.
pub fn generate(campus: &Campus) -> Vec<(PathBuf, String)> {
    let ahus = campus.ahus.max(1);
    let zones = campus.zones_per_ahu.max(1);
    let rng = Rng::new(campus.seed);
    let site = plan::site(&mut rng.fork(0), "Invented Campus");
    let mut units: Vec<Unit> = (0..ahus)
        .map(|i| {
            let mut r = rng.fork(i as u64 + 1);
            let si = r.chance(SI_SHARE);
            plan::unit(&mut r, i, zones, si)
        })
        .collect();
    let mut r = rng.fork(u64::MAX);
    for &i in r.permutation(ahus).iter().take(campus.undersized_count()) {
        units[i].sizing = Sizing::Undersized(r.range(0.78, 0.92));
    }
    for round in 0..REDRAWS {
        let files = render(campus, &site, &units);
        let results = evaluate(campus, &files);
        let mut redraw = false;
        for u in &mut units {
            match results.get(&u.ahu.name) {
                Some(Ok(req)) => rate(u, req),
                Some(Err(())) | None => {
                    redraw_plainer(u, round);
                    redraw = true;
                }
            }
        }
        if !redraw {
            break;
        }
    }
    render(campus, &site, &units)
}

/// What a coil must deliver, from the engine.
struct Required {
    total_btuh: f64,
    sensible_btuh: f64,
    supply_cfm: f64,
}

fn evaluate(campus: &Campus, files: &[(PathBuf, String)]) -> HashMap<String, Result<Required, ()>> {
    let dir = Path::new("/campus");
    let mut fs = plenum_model::MemoryFs::new();
    for (p, t) in files {
        fs.insert(dir.join(p), t.as_bytes());
    }
    fs.insert(dir.join("plenum.toml"), "");
    let root = campus.root();
    let text = files
        .iter()
        .find(|(p, _)| *p == root)
        .map(|(_, t)| t.clone())
        .unwrap_or_default();
    let model = plenum_model::Model::build(&fs, &dir.join(&root), text);
    let eval = plenum_engine::evaluate(&model.design);
    eval.ahus
        .iter()
        .map(|a| {
            let req = a.result.as_ref().map_err(|_| ()).map(|r| {
                let cases = std::iter::once(&r.cooling).chain(r.dehumid.as_ref());
                let mut req = Required {
                    total_btuh: 0.0,
                    sensible_btuh: 0.0,
                    supply_cfm: 0.0,
                };
                for c in cases {
                    req.total_btuh = req.total_btuh.max(c.coil.total_btuh);
                    req.sensible_btuh = req.sensible_btuh.max(c.coil.sensible_btuh);
                    req.supply_cfm = req.supply_cfm.max(c.supply_airflow_cfm);
                }
                req
            });
            (a.name.clone(), req)
        })
        .collect()
}

fn rate(u: &mut Unit, req: &Required) {
    let Some(coil) = u.ahu.coil.as_mut() else {
        return;
    };
    let rated = plan::capacity(u.capacity_unit, req.total_btuh, u.sizing);
    coil.rated = Some(rated);
    coil.rated_sensible = None;
    if u.rate_sensible {
        let factor = match u.sizing {
            Sizing::Ok(f) => Sizing::Ok(f),
            // An undersized unit is short on its total; its sensible rating
            // still covers the sensible load.
            Sizing::Undersized(_) => Sizing::Ok(1.02),
        };
        let s = plan::capacity(u.capacity_unit, req.sensible_btuh, factor);
        if same_unit(s, rated) && s.btuh() <= rated.btuh() {
            coil.rated_sensible = Some(s);
        }
    }
    coil.face_area_ft2 = u
        .face_velocity_fpm
        .map(|v| ((req.supply_cfm / v) * 2.0).ceil() / 2.0);
}

fn same_unit(a: Capacity, b: Capacity) -> bool {
    std::mem::discriminant(&a) == std::mem::discriminant(&b)
}

/// How many times a unit with no result is redrawn with plainer choices.
const REDRAWS: usize = 4;

/// Plainer choices for a unit that had no result. First: outdoor air by the
/// 62.1 procedure with the simplified E_v, the default fan and supply
/// temperature. Then, for a coil whose entering-to-leaving line misses
/// saturation (much humid outdoor air in little supply air, so no apparatus
/// dew point): a warmer supply (more air for the same load) and a fixed
/// share of outdoor air, then a smaller one.
fn redraw_plainer(u: &mut Unit, round: usize) {
    u.ahu.ventilation_efficiency = None;
    u.ahu.occupant_diversity_pct = None;
    u.ahu.outdoor_fan_rise_f = None;
    u.ahu.fan = None;
    u.comment
        .retain(|c| !c.starts_with("A dedicated outdoor-air unit"));
    if u.ahu.outdoor_air == Some(OutdoorAir::All) {
        u.ahu.return_duct = None;
        u.ahu.return_note = None;
    }
    match round {
        0 => {
            u.ahu.outdoor_air = Some(OutdoorAir::Ventilation);
            u.ahu.supply = None;
        }
        1 => {
            u.ahu.outdoor_air = Some(OutdoorAir::Percent(20.0));
            u.ahu.supply = Some(blocks::Supply::Dt(16.0));
        }
        _ => {
            u.ahu.outdoor_air = Some(OutdoorAir::Percent(10.0));
            u.ahu.supply = Some(blocks::Supply::Dt(15.0));
        }
    }
}

fn write_site(f: &mut FileText, site: &blocks::Site) {
    f.block(&site.project_block());
    f.block(&site.site_block());
    f.line(&format!(
        "let {} = 0.9 W/ft²  # lighting power density of the campus",
        plan::LET_LIGHTS
    ));
    f.line(&format!(
        "let {} = {}",
        plan::LET_CLASS_PEOPLE,
        plan::CLASS_PEOPLE
    ));
}

fn render(campus: &Campus, site: &blocks::Site, units: &[Unit]) -> Vec<(PathBuf, String)> {
    let count = campus.file_count();
    let n = units.len();
    let zones = campus.zones_per_ahu.max(1);
    let header = [
        "An invented campus, generated by plenum-gen for benchmarks and tests.".to_string(),
        format!(
            "{n} air handlers of {zones} zone{} each, seed {}; every name and number is invented.",
            if zones == 1 { "" } else { "s" },
            campus.seed
        ),
    ];
    if count == 1 {
        let mut f = FileText::new();
        f.comments(&header, false);
        write_site(&mut f, site);
        for u in units {
            write_unit(&mut f, u, &u.zones);
        }
        return vec![(PathBuf::from(ONE_FILE), f.text)];
    }
    let buildings = count - 1;
    let mut out = Vec::with_capacity(count);
    let mut s = FileText::new();
    s.comments(&header, false);
    s.comments(
        &["The site and the campus-wide values, used by every building file."],
        false,
    );
    write_site(&mut s, site);
    out.push((PathBuf::from(SITE_FILE), s.text));
    let building_of = |i: usize| i * buildings / n;
    // How many zones the last unit of building b keeps in building b + 1.
    let moved = |b: usize| -> usize {
        if b + 1 < buildings {
            zones.div_ceil(4)
        } else {
            0
        }
    };
    for b in 0..buildings {
        let members: Vec<usize> = (0..n).filter(|&i| building_of(i) == b).collect();
        let (first, last) = (members.first().copied(), members.last().copied());
        let mut f = FileText::new();
        f.comments(
            &[format!(
                "Building {} of the campus: air handlers {} to {}.",
                b + 1,
                first.map_or(0, |i| i + 1),
                last.map_or(0, |i| i + 1)
            )],
            false,
        );
        f.line(&format!("use \"{SITE_FILE}\""));
        if moved(b) > 0 {
            f.line(&format!(
                "use \"{}\"  # the zones of {} in the link wing",
                building_path(b + 1, buildings),
                last.map_or("", |i| units[i].ahu.name.as_str())
            ));
        }
        if b > 0
            && moved(b - 1) > 0
            && let Some(p) = (0..n).rfind(|&i| building_of(i) == b - 1)
        {
            let u = &units[p];
            let k = moved(b - 1).min(u.zones.len());
            let comment = [format!(
                "Link wing: zones served by {} in {}.",
                u.ahu.name,
                building_path(b - 1, buildings)
            )];
            write_zones(&mut f, u, &u.zones[u.zones.len() - k..], &comment);
        }
        for &i in &members {
            let u = &units[i];
            let keep = if Some(i) == last && moved(b) > 0 {
                u.zones.len() - moved(b).min(u.zones.len())
            } else {
                u.zones.len()
            };
            write_unit(&mut f, u, &u.zones[..keep]);
        }
        out.push((PathBuf::from(building_path(b, buildings)), f.text));
    }
    out
}

/// Zones with the `let`s they use, under a comment attached to the first.
fn write_zones(f: &mut FileText, u: &Unit, zones: &[blocks::Zone], comment: &[String]) {
    let mut commented = false;
    let mut comment_once = |f: &mut FileText| {
        if !commented {
            f.comments(comment, true);
            commented = true;
        }
    };
    for l in &u.lets {
        let name = l.split_whitespace().nth(1).unwrap_or("");
        if zones
            .iter()
            .any(|z| matches!(&z.area, Some(blocks::Amount::Expr(e)) if e == name))
        {
            comment_once(f);
            f.line(l);
        }
    }
    for z in zones {
        comment_once(f);
        f.block(&z.block());
    }
    comment_once(f);
}

/// A unit's zones (those written in this file) and then its air handler.
fn write_unit(f: &mut FileText, u: &Unit, zones: &[blocks::Zone]) {
    write_zones(f, u, zones, &u.comment);
    f.block(&u.ahu.block());
}
