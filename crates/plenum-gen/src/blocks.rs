//! The building blocks of a generated design — a site, zones and air
//! handlers, each described by what its block says — and their text in the
//! core syntax, in the canonical layout.
//!
//! Every field is what the block writes: `None` leaves the key out (the
//! model's default, or what a `like` zone inherits). Values are given in IP
//! (°F, ft², Btu/h, cfm, ft, hp, in. w.g.); a block whose [`Units`] is
//! [`Units::Si`] writes them converted to SI (°C, m², kW, L/s, m, kW, Pa) by
//! the NIST SP 811 factors, rounded as a person would write them, so the
//! model reads back values within that rounding.
//!
//! [`design_text`] writes a one-file design from blocks: the property tests
//! use it with random values in valid ranges, and the campus generator is
//! built from the same pieces.

use crate::text::{BlockText, FileText, Line, num, q};

/// NIST SP 811: 1 ft = 0.3048 m exactly.
const M_PER_FT: f64 = 0.3048;
/// NIST SP 811: 1 Btu_IT/h = 0.293 071 1 W.
const W_PER_BTUH: f64 = 0.293_071_1;
/// NIST SP 811: 1 ft³/min = 0.471 947 4 L/s.
const LPS_PER_CFM: f64 = 0.471_947_4;
/// NIST SP 811: 1 hp (550 ft·lbf/s) = 745.699 9 W.
const W_PER_HP: f64 = 745.699_9;
/// NIST SP 811: 1 conventional inch of water = 249.089 Pa (from memory).
const PA_PER_IN_WG: f64 = 249.089;

/// The units a block is written in.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Units {
    Ip,
    Si,
}

/// A value that is a number (in the key's IP unit) or an expression written
/// as is (a `let` name, `18 kBtu/h + lights`).
#[derive(Clone, Debug, PartialEq)]
pub enum Amount {
    Value(f64),
    Expr(String),
}

/// The `site` block and the project around it.
#[derive(Clone, Debug, PartialEq)]
pub struct Site {
    /// The project's name (the `project` block's label).
    pub project: String,
    /// Display units of the project.
    pub units: Units,
    /// Elevation, ft (written as `elevation`), or
    pub elevation_ft: Option<f64>,
    /// barometric pressure, psia (written as `pressure`).
    pub pressure_psia: Option<f64>,
    /// Cooling design dry bulb and coincident wet bulb, °F.
    pub cooling_f: (f64, f64),
    /// Dehumidification design dew point and coincident dry bulb, °F.
    pub dehumid_f: Option<(f64, f64)>,
    /// A trailing comment on the `elevation` line.
    pub elevation_note: Option<String>,
}

/// A `zone` block.
#[derive(Clone, Debug, PartialEq)]
pub struct Zone {
    pub name: String,
    pub label: Option<String>,
    /// The zone this one is `like`.
    pub like: Option<String>,
    /// A note after the header's `{`.
    pub note: Option<String>,
    pub units: Units,
    /// Floor area, ft².
    pub area: Option<Amount>,
    /// Occupants.
    pub people: Option<Amount>,
    /// 62.1 category (`use`).
    pub category: Option<&'static str>,
    /// Indoor dry bulb °F and relative humidity %.
    pub indoor: Option<(f64, f64)>,
    /// Peak sensible gain, Btu/h.
    pub sensible: Option<Amount>,
    /// A trailing comment on the `sensible` line.
    pub sensible_note: Option<String>,
    /// Peak latent gain, Btu/h.
    pub latent: Option<Amount>,
    /// 62.1 zone air distribution effectiveness, %.
    pub distribution_effectiveness_pct: Option<f64>,
}

/// The supply air temperature of an air handler.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Supply {
    /// `supply_temp`, °F.
    Temp(f64),
    /// `supply_dt`, °F below the lowest indoor temperature.
    Dt(f64),
}

/// A duct: its length or its temperature rise.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Duct {
    /// Length, ft.
    Length(f64),
    /// Rise, °F.
    Rise(f64),
    /// `return_duct none` (return only).
    None,
}

/// The `outdoor_air` of an air handler.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum OutdoorAir {
    /// `ventilation`: the 62.1 procedure.
    Ventilation,
    /// An airflow at the outdoor state, cfm.
    Airflow(f64),
    /// A percentage of the supply mass flow.
    Percent(f64),
    /// cfm per person.
    PerPerson(f64),
    /// cfm per ft² of floor.
    PerArea(f64),
    /// `100 %`: a dedicated outdoor-air unit.
    All,
}

/// The 62.1 system ventilation efficiency.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Ev {
    Simplified,
    Calculated,
    /// A given E_v, %.
    Given(f64),
}

/// What gives the fan's heat.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum FanSource {
    /// Shaft power, hp.
    Power(f64),
    /// Total static pressure, in. w.g., with the fan efficiency, %.
    Static { in_wg: f64, efficiency_pct: f64 },
    /// A temperature rise across the fan, °F.
    Rise(f64),
}

/// The `fan` block.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Fan {
    pub source: Option<FanSource>,
    /// Motor efficiency, %.
    pub motor_efficiency_pct: Option<f64>,
    /// `true`: `in_airstream`; `false`: `outside`.
    pub motor_in_airstream: Option<bool>,
    /// `true`: `draw_through`; `false`: `blow_through`.
    pub draw_through: Option<bool>,
}

/// A coil capacity in the unit it is written in.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Capacity {
    Ton(f64),
    KBtuh(f64),
    Mbh(f64),
    Kw(f64),
}

impl Capacity {
    /// The capacity in Btu/h (1 ton = 12 000 Btu/h; kW by NIST SP 811).
    pub fn btuh(self) -> f64 {
        match self {
            Capacity::Ton(t) => t * 12_000.0,
            Capacity::KBtuh(k) | Capacity::Mbh(k) => k * 1_000.0,
            Capacity::Kw(k) => k * 1_000.0 / W_PER_BTUH,
        }
    }

    fn text(self) -> String {
        match self {
            Capacity::Ton(t) => q(t, 1, "ton"),
            Capacity::KBtuh(k) => q(k, 1, "kBtu/h"),
            Capacity::Mbh(k) => q(k, 1, "MBH"),
            Capacity::Kw(k) => q(k, 1, "kW"),
        }
    }
}

/// The `coil` block.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Coil {
    /// Leaving relative humidity, %.
    pub leaving_rh_pct: Option<f64>,
    pub rated: Option<Capacity>,
    pub rated_sensible: Option<Capacity>,
    /// Chilled water supply and return, °F.
    pub chilled_water_f: Option<(f64, f64)>,
    /// Face area, ft².
    pub face_area_ft2: Option<f64>,
}

/// An `ahu` block.
#[derive(Clone, Debug, PartialEq)]
pub struct Ahu {
    pub name: String,
    pub label: Option<String>,
    pub units: Units,
    pub serves: Vec<String>,
    pub supply: Option<Supply>,
    /// Block diversity, %.
    pub diversity_pct: Option<f64>,
    pub supply_duct: Option<Duct>,
    pub return_duct: Option<Duct>,
    /// A trailing comment on the return duct line.
    pub return_note: Option<String>,
    /// Return plenum gain, Btu/h.
    pub plenum_gain_btuh: Option<f64>,
    pub fan: Option<Fan>,
    pub outdoor_air: Option<OutdoorAir>,
    /// 62.1 occupant diversity, %.
    pub occupant_diversity_pct: Option<f64>,
    pub ventilation_efficiency: Option<Ev>,
    /// Outdoor-air fan rise, °F.
    pub outdoor_fan_rise_f: Option<f64>,
    pub coil: Option<Coil>,
}

fn f_to_c(f: f64) -> f64 {
    (f - 32.0) / 1.8
}

fn temp(units: Units, f: f64) -> String {
    match units {
        Units::Ip => q(f, 1, "°F"),
        Units::Si => q(f_to_c(f), 1, "°C"),
    }
}

fn temp_diff(units: Units, df: f64) -> String {
    match units {
        Units::Ip => q(df, 1, "°F"),
        Units::Si => q(df / 1.8, 1, "K"),
    }
}

fn length(units: Units, ft: f64) -> String {
    match units {
        Units::Ip => q(ft, 0, "ft"),
        Units::Si => q(ft * M_PER_FT, 0, "m"),
    }
}

fn area(units: Units, ft2: f64) -> String {
    match units {
        Units::Ip => q(ft2, 0, "ft²"),
        Units::Si => q(ft2 * M_PER_FT * M_PER_FT, 1, "m²"),
    }
}

fn heat(units: Units, btuh: f64) -> String {
    match units {
        Units::Ip if btuh.abs() < 1_000.0 => q(btuh, 0, "Btu/h"),
        Units::Ip => q(btuh / 1_000.0, 1, "kBtu/h"),
        Units::Si => q(btuh * W_PER_BTUH / 1_000.0, 2, "kW"),
    }
}

fn airflow(units: Units, cfm: f64) -> String {
    match units {
        Units::Ip => q(cfm, 0, "cfm"),
        Units::Si => q(cfm * LPS_PER_CFM, 0, "L/s"),
    }
}

fn amount(a: &Amount, write: impl Fn(f64) -> String) -> String {
    match a {
        Amount::Value(v) => write(*v),
        Amount::Expr(e) => e.clone(),
    }
}

fn header(kind: &str, name: &str, label: &Option<String>, like: &Option<String>) -> String {
    let mut h = format!("{kind} {name}");
    if let Some(l) = label {
        h.push_str(" \"");
        h.push_str(&l.replace('\\', "\\\\").replace('"', "\\\""));
        h.push('"');
    }
    if let Some(l) = like {
        h.push_str(" like ");
        h.push_str(l);
    }
    h
}

impl Site {
    /// The `project` block.
    pub fn project_block(&self) -> BlockText {
        let mut b = BlockText::new(format!("project \"{}\"", self.project.replace('"', "'")));
        b.prop(
            "units",
            match self.units {
                Units::Ip => "ip",
                Units::Si => "si",
            },
        );
        b
    }

    /// The `site` block.
    pub fn site_block(&self) -> BlockText {
        let mut b = BlockText::new("site");
        if let Some(e) = self.elevation_ft {
            b.prop_note("elevation", q(e, 0, "ft"), self.elevation_note.clone());
        }
        if let Some(p) = self.pressure_psia {
            b.prop_note("pressure", q(p, 2, "psia"), self.elevation_note.clone());
        }
        let (db, wb) = self.cooling_f;
        b.prop(
            "cooling",
            format!("{} db, {} wb", q(db, 1, "°F"), q(wb, 1, "°F")),
        );
        if let Some((dp, db)) = self.dehumid_f {
            b.prop(
                "dehumid",
                format!("{} dp, {} db", q(dp, 1, "°F"), q(db, 1, "°F")),
            );
        }
        b
    }
}

impl Zone {
    /// The `zone` block.
    pub fn block(&self) -> BlockText {
        let u = self.units;
        let mut b = BlockText::new(header("zone", &self.name, &self.label, &self.like));
        b.note = self.note.clone();
        if let Some(a) = &self.area {
            b.prop("area", amount(a, |v| area(u, v)));
        }
        if let Some(p) = &self.people {
            b.prop("people", amount(p, |v| num(v, 0)));
        }
        if let Some(c) = self.category {
            b.prop("use", c);
        }
        if let Some((t, rh)) = self.indoor {
            b.prop("indoor", format!("{}, {}", temp(u, t), q(rh, 0, "%rh")));
        }
        if let Some(s) = &self.sensible {
            b.prop_note(
                "sensible",
                amount(s, |v| heat(u, v)),
                self.sensible_note.clone(),
            );
        }
        if let Some(l) = &self.latent {
            b.prop("latent", amount(l, |v| heat(u, v)));
        }
        if let Some(e) = self.distribution_effectiveness_pct {
            b.prop("distribution_effectiveness", q(e, 0, "%"));
        }
        b
    }
}

impl Ahu {
    /// The `ahu` block.
    pub fn block(&self) -> BlockText {
        let u = self.units;
        let mut b = BlockText::new(header("ahu", &self.name, &self.label, &None));
        b.prop("serves", self.serves.join(", "));
        match self.supply {
            Some(Supply::Temp(t)) => b.prop("supply_temp", temp(u, t)),
            Some(Supply::Dt(d)) => b.prop("supply_dt", temp_diff(u, d)),
            None => {}
        }
        if let Some(d) = self.diversity_pct {
            b.prop("diversity", q(d, 0, "%"));
        }
        match self.supply_duct {
            Some(Duct::Length(l)) => b.prop("supply_duct", length(u, l)),
            Some(Duct::Rise(r)) => b.prop("supply_duct_rise", temp_diff(u, r)),
            Some(Duct::None) | None => {}
        }
        let note = self.return_note.clone();
        match self.return_duct {
            Some(Duct::Length(l)) => b.prop_note("return_duct", length(u, l), note),
            Some(Duct::Rise(r)) => b.prop_note("return_duct_rise", temp_diff(u, r), note),
            Some(Duct::None) => b.prop_note("return_duct", "none", note),
            None => {}
        }
        if let Some(g) = self.plenum_gain_btuh {
            b.prop("plenum_gain", heat(u, g));
        }
        if let Some(f) = &self.fan {
            b.lines.push(Line::Block(fan_block(u, f)));
        }
        match self.outdoor_air {
            Some(OutdoorAir::Ventilation) => b.prop("outdoor_air", "ventilation"),
            Some(OutdoorAir::Airflow(cfm)) => b.prop("outdoor_air", airflow(u, cfm)),
            Some(OutdoorAir::Percent(p)) => b.prop("outdoor_air", q(p, 0, "%")),
            Some(OutdoorAir::PerPerson(r)) => b.prop(
                "outdoor_air",
                match u {
                    Units::Ip => q(r, 1, "cfm/person"),
                    Units::Si => q(r * LPS_PER_CFM, 1, "L/s/person"),
                },
            ),
            Some(OutdoorAir::PerArea(r)) => b.prop(
                "outdoor_air",
                match u {
                    Units::Ip => q(r, 2, "cfm/ft²"),
                    Units::Si => q(r * LPS_PER_CFM / (M_PER_FT * M_PER_FT), 2, "L/(s·m²)"),
                },
            ),
            Some(OutdoorAir::All) => b.prop("outdoor_air", "100 %"),
            None => {}
        }
        if let Some(d) = self.occupant_diversity_pct {
            b.prop("occupant_diversity", q(d, 0, "%"));
        }
        match self.ventilation_efficiency {
            Some(Ev::Simplified) => b.prop("ventilation_efficiency", "simplified"),
            Some(Ev::Calculated) => b.prop("ventilation_efficiency", "calculated"),
            Some(Ev::Given(e)) => b.prop("ventilation_efficiency", q(e, 0, "%")),
            None => {}
        }
        if let Some(r) = self.outdoor_fan_rise_f {
            b.prop("outdoor_fan_rise", temp_diff(u, r));
        }
        if let Some(c) = &self.coil {
            b.lines.push(Line::Block(coil_block(u, c)));
        }
        b
    }
}

fn fan_block(u: Units, f: &Fan) -> BlockText {
    let mut b = BlockText::new("fan");
    match f.source {
        Some(FanSource::Power(hp)) => b.prop(
            "power",
            match u {
                Units::Ip => q(hp, 2, "hp"),
                Units::Si => q(hp * W_PER_HP / 1_000.0, 2, "kW"),
            },
        ),
        Some(FanSource::Static {
            in_wg,
            efficiency_pct,
        }) => b.prop(
            "static",
            format!(
                "{} with efficiency {}",
                match u {
                    Units::Ip => q(in_wg, 2, "in.wg"),
                    Units::Si => q(in_wg * PA_PER_IN_WG, 0, "Pa"),
                },
                q(efficiency_pct, 0, "%")
            ),
        ),
        Some(FanSource::Rise(r)) => b.prop("rise", temp_diff(u, r)),
        None => {}
    }
    if let Some(e) = f.motor_efficiency_pct {
        b.prop("motor_efficiency", q(e, 1, "%"));
    }
    if let Some(m) = f.motor_in_airstream {
        b.prop("motor", if m { "in_airstream" } else { "outside" });
    }
    if let Some(d) = f.draw_through {
        b.prop(
            "arrangement",
            if d { "draw_through" } else { "blow_through" },
        );
    }
    b
}

fn coil_block(u: Units, c: &Coil) -> BlockText {
    let mut b = BlockText::new("coil");
    if let Some(rh) = c.leaving_rh_pct {
        b.prop("leaving_rh", q(rh, 0, "%"));
    }
    if let Some(r) = c.rated {
        b.prop("rated", r.text());
    }
    if let Some(r) = c.rated_sensible {
        b.prop("rated_sensible", r.text());
    }
    if let Some((s, r)) = c.chilled_water_f {
        b.prop("chilled_water", format!("{} to {}", temp(u, s), temp(u, r)));
    }
    if let Some(a) = c.face_area_ft2 {
        b.prop(
            "face_area",
            match u {
                Units::Ip => q(a, 1, "ft²"),
                Units::Si => q(a * M_PER_FT * M_PER_FT, 2, "m²"),
            },
        );
    }
    b
}

/// A one-file design: the project and site, then every zone and air handler
/// in order, in the canonical layout.
pub fn design_text(site: &Site, zones: &[Zone], ahus: &[Ahu]) -> String {
    let mut f = FileText::new();
    f.block(&site.project_block());
    f.block(&site.site_block());
    for z in zones {
        f.block(&z.block());
    }
    for a in ahus {
        f.block(&a.block());
    }
    f.text
}
