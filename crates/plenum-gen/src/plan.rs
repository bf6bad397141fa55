//! Choosing the campus: climate, air handlers and their zones, with values
//! drawn from ranges typical of each kind of room (*common practice*,
//! written from memory; they make realistic designs, they are not design
//! data).

use crate::blocks::{
    Ahu, Amount, Capacity, Coil, Duct, Ev, Fan, FanSource, OutdoorAir, Site, Supply, Units, Zone,
};
use crate::rng::Rng;

/// A room type: its 62.1 category, and typical ranges per floor area.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Room {
    pub category: &'static str,
    /// Labels to choose from.
    pub labels: &'static [&'static str],
    /// Floor area range, ft².
    pub area_ft2: (f64, f64),
    /// Occupant density range, people per 1,000 ft² (62.1 default
    /// densities sit inside these ranges).
    pub people_per_kft2: (f64, f64),
    /// Peak sensible gain range, Btu/h per ft² (lights, equipment, people,
    /// envelope and sun together).
    pub sensible_btuh_ft2: (f64, f64),
    /// Latent gain per person, Btu/h.
    pub latent_per_person: (f64, f64),
}

const fn room(
    category: &'static str,
    labels: &'static [&'static str],
    area_ft2: (f64, f64),
    people_per_kft2: (f64, f64),
    sensible_btuh_ft2: (f64, f64),
    latent_per_person: (f64, f64),
) -> Room {
    Room {
        category,
        labels,
        area_ft2,
        people_per_kft2,
        sensible_btuh_ft2,
        latent_per_person,
    }
}

pub(crate) const OFFICE: Room = room(
    "office",
    &[
        "Open office",
        "Private offices",
        "Work room",
        "Staff offices",
    ],
    (300.0, 3_500.0),
    (4.0, 7.0),
    (13.0, 22.0),
    (180.0, 220.0),
);
pub(crate) const CONFERENCE: Room = room(
    "conference",
    &["Conference room", "Meeting room", "Board room"],
    (250.0, 900.0),
    (30.0, 50.0),
    (24.0, 36.0),
    (180.0, 220.0),
);
pub(crate) const RECEPTION: Room = room(
    "reception",
    &["Reception", "Waiting area", "Front desk"],
    (200.0, 800.0),
    (15.0, 30.0),
    (15.0, 24.0),
    (180.0, 220.0),
);
pub(crate) const LOBBY: Room = room(
    "lobby",
    &["Entry lobby", "Main lobby", "Vestibule and lobby"],
    (300.0, 1_500.0),
    (5.0, 10.0),
    (14.0, 24.0),
    (200.0, 250.0),
);
pub(crate) const CORRIDOR: Room = room(
    "corridor",
    &["Corridor", "Link corridor", "Stair and corridor"],
    (400.0, 2_500.0),
    (0.0, 0.0),
    (3.0, 6.0),
    (0.0, 0.0),
);
pub(crate) const CLASSROOM: Room = room(
    "classroom",
    &["Classroom", "Seminar room", "Studio classroom"],
    (750.0, 1_100.0),
    (25.0, 35.0),
    (18.0, 27.0),
    (150.0, 190.0),
);
pub(crate) const LECTURE: Room = room(
    "lecture",
    &["Lecture hall", "Training room", "Auditorium"],
    (900.0, 3_000.0),
    (40.0, 65.0),
    (26.0, 38.0),
    (150.0, 190.0),
);
pub(crate) const LIBRARY: Room = room(
    "library",
    &["Reading room", "Stacks", "Study hall"],
    (800.0, 4_000.0),
    (6.0, 12.0),
    (14.0, 22.0),
    (180.0, 220.0),
);
pub(crate) const RETAIL: Room = room(
    "retail",
    &["Sales floor", "Campus store", "Shop"],
    (800.0, 6_000.0),
    (8.0, 15.0),
    (14.0, 22.0),
    (200.0, 250.0),
);
pub(crate) const DINING: Room = room(
    "dining",
    &["Dining hall", "Cafe", "Servery seating"],
    (1_000.0, 4_000.0),
    (40.0, 70.0),
    (26.0, 36.0),
    (230.0, 270.0),
);
pub(crate) const STORAGE: Room = room(
    "storage",
    &["Storage", "Supply room", "Archive"],
    (150.0, 1_200.0),
    (0.0, 2.0),
    (3.0, 8.0),
    (180.0, 220.0),
);

/// What an air handler serves: a mix of room types, by weight.
#[derive(Clone, Copy, Debug)]
struct Kind {
    name: &'static str,
    prefix: &'static str,
    rooms: &'static [(Room, f64)],
}

const KINDS: &[(Kind, f64)] = &[
    (
        Kind {
            name: "office floor",
            prefix: "ahu",
            rooms: &[
                (OFFICE, 6.0),
                (CONFERENCE, 1.5),
                (RECEPTION, 0.7),
                (CORRIDOR, 1.0),
                (STORAGE, 0.5),
            ],
        },
        4.0,
    ),
    (
        Kind {
            name: "classroom wing",
            prefix: "rtu",
            rooms: &[
                (CLASSROOM, 6.0),
                (LECTURE, 0.6),
                (CORRIDOR, 1.0),
                (OFFICE, 0.7),
                (STORAGE, 0.4),
            ],
        },
        3.0,
    ),
    (
        Kind {
            name: "library",
            prefix: "ahu",
            rooms: &[
                (LIBRARY, 5.0),
                (OFFICE, 1.0),
                (CONFERENCE, 1.0),
                (LOBBY, 0.6),
            ],
        },
        1.0,
    ),
    (
        Kind {
            name: "student centre",
            prefix: "ahu",
            rooms: &[
                (DINING, 2.0),
                (RETAIL, 1.5),
                (LOBBY, 1.0),
                (CONFERENCE, 1.0),
                (STORAGE, 0.5),
            ],
        },
        1.0,
    ),
    (
        Kind {
            name: "clinic",
            prefix: "rtu",
            rooms: &[(RECEPTION, 1.0), (OFFICE, 4.0), (CORRIDOR, 1.0)],
        },
        0.7,
    ),
];

/// An invented place: its site data (design states in the range of
/// published climate tables for such places; the values are invented).
struct Climate {
    town: &'static str,
    elevation_ft: f64,
    cooling_f: (f64, f64),
    dehumid_f: Option<(f64, f64)>,
}

const CLIMATES: &[Climate] = &[
    Climate {
        town: "Harlow Bend (an invented river town)",
        elevation_ft: 480.0,
        cooling_f: (93.0, 76.0),
        dehumid_f: Some((73.0, 82.0)),
    },
    Climate {
        town: "Quillan Mesa (an invented high-plains town)",
        elevation_ft: 5_200.0,
        cooling_f: (92.0, 61.0),
        dehumid_f: None,
    },
    Climate {
        town: "Saltmarsh Point (an invented coastal town)",
        elevation_ft: 20.0,
        cooling_f: (90.0, 77.0),
        dehumid_f: Some((75.0, 83.0)),
    },
    Climate {
        town: "Dunmore Flats (an invented desert town)",
        elevation_ft: 2_300.0,
        cooling_f: (108.0, 71.0),
        dehumid_f: None,
    },
    Climate {
        town: "Ashgrove (an invented foothill town)",
        elevation_ft: 1_250.0,
        cooling_f: (95.0, 72.0),
        dehumid_f: Some((68.0, 78.0)),
    },
    Climate {
        town: "Kettle Lake (an invented northern town)",
        elevation_ft: 900.0,
        cooling_f: (87.0, 71.0),
        dehumid_f: None,
    },
];

/// Campus-wide `let`s, written in the site file.
pub(crate) const LET_LIGHTS: &str = "lights";
pub(crate) const LET_CLASS_PEOPLE: &str = "class_people";
pub(crate) const CLASS_PEOPLE: f64 = 28.0;

/// One air handler of the campus with its zones, before its coil is sized.
#[derive(Clone, Debug)]
pub(crate) struct Unit {
    pub ahu: Ahu,
    pub zones: Vec<Zone>,
    /// A `let` this unit's zones use, written before them.
    pub lets: Vec<String>,
    /// Comment lines before the air handler.
    pub comment: Vec<String>,
    /// How its coil is to be rated.
    pub sizing: Sizing,
    /// Whether to give a rated sensible capacity too.
    pub rate_sensible: bool,
    /// The face velocity its coil's face area is chosen for, fpm.
    pub face_velocity_fpm: Option<f64>,
    /// The unit its capacities are written in.
    pub capacity_unit: CapacityUnit,
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum Sizing {
    /// Rated at the requirement times this factor (1.02 to 1.12), rounded
    /// up to a catalogue step.
    Ok(f64),
    /// Rated at the requirement times this factor (below 1), rounded down.
    Undersized(f64),
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum CapacityUnit {
    Ton,
    KBtuh,
    Mbh,
    Kw,
}

pub(crate) fn site(rng: &mut Rng, name: &str) -> Site {
    let c = &CLIMATES[(rng.next_u64() % CLIMATES.len() as u64) as usize];
    let by_pressure = rng.chance(0.15);
    // The standard atmosphere (ASHRAE Handbook—Fundamentals ch. 1, eq. 3).
    let pressure = 14.696 * (1.0 - 6.8754e-6 * c.elevation_ft).powf(5.2559);
    Site {
        project: format!("{name} — {}", c.town),
        units: Units::Ip,
        elevation_ft: (!by_pressure).then_some(c.elevation_ft),
        pressure_psia: by_pressure.then_some((pressure * 100.0).round() / 100.0),
        cooling_f: c.cooling_f,
        dehumid_f: c.dehumid_f,
        elevation_note: Some(if by_pressure {
            "barometric pressure from the site survey".to_string()
        } else {
            "campus datum".to_string()
        }),
    }
}

fn round_to(v: f64, step: f64) -> f64 {
    (v / step).round() * step
}

/// Air handler `index` (zero-based) of the campus with `zones` zones.
pub(crate) fn unit(rng: &mut Rng, index: usize, zones: usize, si: bool) -> Unit {
    let kind: Kind = rng.weighted(KINDS);
    let n = index + 1;
    let units = if si { Units::Si } else { Units::Ip };
    let ahu_name = format!("{}_{n}", kind.prefix);
    // Indoor design of the unit: most at the default, some written.
    let indoor_choice = rng.weighted(&[
        (None, 5.0),
        (Some((75.0, 50.0)), 2.0),
        (Some((74.0, 50.0)), 1.0),
        (Some((76.0, 50.0)), 1.0),
        (Some((73.0, 45.0)), 0.5),
    ]);
    let mut out_zones: Vec<Zone> = Vec::with_capacity(zones);
    let mut lets = Vec::new();
    let mut base: Option<(usize, Room)> = None;
    let mut total_sensible = 0.0;
    let mut total_people = 0.0;
    let mut total_area = 0.0;
    let mut min_indoor: f64 = 200.0;
    for z in 0..zones {
        let zname = format!("z{n}_{}", z + 1);
        // A run of the same room type: often `like` the first of the run.
        let same_as_base = match base {
            Some((_, r)) => rng.chance(0.35) && r.category != "corridor",
            None => false,
        };
        let r: Room = match (same_as_base, base) {
            (true, Some((_, r))) => r,
            _ => rng.weighted(kind.rooms),
        };
        let label_base = rng.pick(r.labels);
        let label = Some(format!("{label_base} {n}.{}", z + 1));
        let area = round_to(rng.range(r.area_ft2.0, r.area_ft2.1), 10.0);
        let people = (area * rng.range(r.people_per_kft2.0, r.people_per_kft2.1) / 1_000.0).round();
        let sensible = round_to(
            area * rng.range(r.sensible_btuh_ft2.0, r.sensible_btuh_ft2.1),
            100.0,
        )
        .max(500.0);
        let latent_people = people * rng.range(r.latent_per_person.0, r.latent_per_person.1);
        let latent = round_to(
            (latent_people + area * rng.range(0.0, 0.15)).min(0.35 * sensible),
            100.0,
        );
        let indoor = match (r.category, indoor_choice) {
            ("storage", _) if rng.chance(0.3) => Some((78.0, 50.0)),
            (_, i) => i,
        };
        min_indoor = min_indoor.min(indoor.map_or(75.0, |(t, _)| t));
        total_sensible += sensible;
        total_people += people;
        total_area += area;
        let mut zone = Zone {
            name: zname.clone(),
            label,
            like: None,
            note: None,
            units,
            area: Some(Amount::Value(area)),
            people: Some(Amount::Value(people)),
            category: Some(r.category),
            indoor,
            sensible: Some(Amount::Value(sensible)),
            sensible_note: None,
            latent: Some(Amount::Value(latent)),
            distribution_effectiveness_pct: None,
        };
        if r.category == "classroom" && !si && rng.chance(0.3) {
            zone.people = Some(Amount::Expr(LET_CLASS_PEOPLE.to_string()));
            total_people += CLASS_PEOPLE - people;
        }
        if !si && r.category != "corridor" && rng.chance(0.06) {
            // A room measured on the drawings, its lighting from the
            // campus-wide power density.
            let lname = format!("a{n}_{}", z + 1);
            let w = round_to(area.sqrt() * rng.range(0.7, 1.3), 1.0).max(10.0);
            let d = (area / w).round().max(10.0);
            lets.push(format!("let {lname} = {} * {}", q(w, "ft"), q(d, "ft")));
            zone.area = Some(Amount::Expr(lname.clone()));
            zone.sensible = Some(Amount::Expr(format!(
                "{} + {LET_LIGHTS} * {lname}",
                crate::text::q(sensible * 0.85 / 1_000.0, 1, "kBtu/h")
            )));
        }
        if rng.chance(0.03) {
            zone.distribution_effectiveness_pct = Some(rng.pick(&[80.0, 100.0, 120.0]));
            if zone.distribution_effectiveness_pct == Some(120.0) {
                zone.note = Some("ceiling supply of cool air, floor return".to_string());
            }
        }
        if rng.chance(0.08) {
            zone.sensible_note = Some(
                rng.pick(&[
                    "west glass",
                    "from the load run, revision B",
                    "includes the copier alcove",
                    "roof above",
                    "south exposure",
                ])
                .to_string(),
            );
        }
        match base {
            Some((bi, br)) if same_as_base && br.category == r.category => {
                // Inherit use and indoor (and sometimes the area) from the base.
                let b = &out_zones[bi];
                zone.like = Some(b.name.clone());
                zone.category = None;
                zone.indoor = None;
                zone.distribution_effectiveness_pct = None;
                if rng.chance(0.5) && zone.area == Some(Amount::Value(area)) {
                    zone.area = None;
                    zone.people = None;
                    let (ba, bp) = (value_of(&b.area), value_of(&b.people));
                    total_area += ba - area;
                    total_people += bp - people;
                    if rng.chance(0.4) {
                        zone.sensible = None;
                        zone.latent = None;
                        total_sensible += value_of(&b.sensible) - sensible;
                    }
                }
                if zone.sensible.is_some() && rng.chance(0.3) {
                    zone.latent = None;
                }
            }
            _ => base = Some((z, r)),
        }
        out_zones.push(zone);
    }
    // Supply air.
    let (temp, dt) = (rng_half(rng, 53.0, 57.5), rng_half(rng, 17.0, 22.0));
    let supply = rng.weighted(&[
        (Some(Supply::Temp(temp)), 6.0),
        (Some(Supply::Dt(dt)), 2.5),
        (None, 1.5),
    ]);
    let t_supply = match supply {
        Some(Supply::Temp(t)) => t.min(min_indoor - 12.0),
        Some(Supply::Dt(d)) => min_indoor - d,
        None => min_indoor - 18.0,
    };
    let supply = match supply {
        Some(Supply::Temp(_)) => Some(Supply::Temp(t_supply)),
        s => s,
    };
    // Estimated supply airflow (standard air, *common practice*) for the
    // outdoor air, fan and face area choices.
    let est_cfm = total_sensible / (1.08 * (min_indoor - t_supply).max(8.0));
    let single = zones == 1;
    let doas = !single && zones <= 8 && kind.name == "office floor" && rng.chance(0.12);
    let outdoor_air = if doas {
        OutdoorAir::All
    } else {
        let airflow = round_to(est_cfm * rng.range(0.15, 0.3), 10.0).max(50.0);
        let percent = rng.range(15.0, 35.0).round();
        let per_person = rng.pick(&[15.0, 17.5, 20.0]);
        let per_area = rng.pick(&[0.1, 0.15, 0.2, 0.25]);
        let candidate = rng.weighted(&[
            (OutdoorAir::Ventilation, 8.0),
            (OutdoorAir::Airflow(airflow), 1.5),
            (OutdoorAir::Percent(percent), 1.2),
            (OutdoorAir::PerPerson(per_person), 1.0),
            (OutdoorAir::PerArea(per_area), 0.8),
        ]);
        // Keep the outdoor air below half the supply: a recirculating unit
        // cannot take more than it supplies.
        let est_oa = match candidate {
            OutdoorAir::Airflow(c) => c,
            OutdoorAir::Percent(p) => est_cfm * p / 100.0,
            OutdoorAir::PerPerson(r) => r * total_people,
            OutdoorAir::PerArea(r) => r * total_area,
            OutdoorAir::Ventilation | OutdoorAir::All => 0.0,
        };
        if est_oa > 0.5 * est_cfm {
            OutdoorAir::Ventilation
        } else {
            candidate
        }
    };
    let multiple = !single && outdoor_air == OutdoorAir::Ventilation;
    let occupant_diversity_pct =
        (multiple && rng.chance(0.3)).then(|| rng.range(70.0, 95.0).round());
    let given_ev = rng.range(70.0, 90.0).round();
    let ventilation_efficiency = if multiple {
        rng.weighted(&[
            (None, 6.0),
            (Some(Ev::Simplified), 2.0),
            (Some(Ev::Calculated), 1.0),
            (Some(Ev::Given(given_ev)), 1.0),
        ])
    } else {
        None
    };

    // Fan: its shaft power from the airflow and a plausible static pressure.
    let in_wg = round_to(rng.range(1.2, 3.8), 0.1);
    let efficiency = rng.range(55.0, 70.0).round();
    let bhp = est_cfm * in_wg / (6356.0 * efficiency / 100.0);
    let fan = if rng.chance(0.08) {
        None
    } else {
        let power = round_to(bhp * rng.range(1.0, 1.25), 0.25).max(0.25);
        let rise = rng_half(rng, 1.0, 3.0);
        let source = rng.weighted(&[
            (Some(FanSource::Power(power)), 4.5),
            (
                Some(FanSource::Static {
                    in_wg,
                    efficiency_pct: efficiency,
                }),
                4.0,
            ),
            (Some(FanSource::Rise(rise)), 0.6),
            (None, 0.4),
        ]);
        let motor_in_airstream =
            rng.weighted(&[(Some(true), 4.0), (Some(false), 2.5), (None, 3.5)]);
        let motor_efficiency_pct = match (motor_in_airstream, source) {
            (Some(false), _) | (_, Some(FanSource::Rise(_))) => None,
            _ => rng
                .chance(0.6)
                .then(|| rng.pick(&[84.0, 86.5, 89.5, 91.0, 91.7, 93.0, 94.1])),
        };
        Some(Fan {
            source,
            motor_efficiency_pct,
            motor_in_airstream,
            draw_through: rng.weighted(&[(Some(true), 6.0), (Some(false), 2.5), (None, 1.5)]),
        })
    };

    let (length, rise) = (
        round_to(rng.range(40.0, 320.0), 10.0),
        rng_half(rng, 1.0, 3.0),
    );
    let supply_duct = rng.weighted(&[
        (Some(Duct::Length(length)), 6.0),
        (Some(Duct::Rise(rise)), 1.5),
        (None, 2.5),
    ]);
    let (length, rise) = (
        round_to(rng.range(20.0, 160.0), 10.0),
        rng_half(rng, 0.5, 2.0),
    );
    let (return_duct, return_note) = if outdoor_air == OutdoorAir::All {
        (
            Some(Duct::None),
            Some("relief to the corridor; no return".to_string()),
        )
    } else {
        let d = rng.weighted(&[
            (Some(Duct::Length(length)), 5.0),
            (Some(Duct::Rise(rise)), 1.0),
            (Some(Duct::None), 1.5),
            (None, 2.0),
        ]);
        let note =
            (d == Some(Duct::None) && rng.chance(0.5)).then(|| "ceiling plenum return".to_string());
        (d, note)
    };
    let plenum_gain_btuh = (outdoor_air != OutdoorAir::All && rng.chance(0.3))
        .then(|| round_to(total_sensible * rng.range(0.03, 0.08), 100.0));
    let diversity_pct = (!single && rng.chance(0.5)).then(|| rng.pick(&[85.0, 90.0, 95.0, 100.0]));
    let outdoor_fan_rise_f = rng.chance(0.05).then(|| rng_half(rng, 0.5, 1.5));

    let coil = Coil {
        leaving_rh_pct: rng.chance(0.3).then(|| rng.pick(&[90.0, 92.0, 93.0, 95.0])),
        rated: None,
        rated_sensible: None,
        chilled_water_f: rng.chance(0.5).then(|| {
            let s = rng.pick(&[42.0, 44.0, 45.0]);
            (s, s + rng.pick(&[10.0, 12.0, 14.0]))
        }),
        face_area_ft2: None,
    };
    let label = format!(
        "{} unit {n}",
        match kind.name {
            "office floor" => "Office floor",
            "classroom wing" => "Classroom wing",
            "library" => "Library",
            "student centre" => "Student centre",
            _ => "Clinic",
        }
    );
    let mut comment = vec![format!(
        "Air handler {n}: {} ({} zone{}).",
        kind.name,
        zones,
        if zones == 1 { "" } else { "s" }
    )];
    if outdoor_air == OutdoorAir::All {
        comment.push("A dedicated outdoor-air unit: all of its supply is outdoor air.".to_string());
    }
    let capacity_unit = if si {
        CapacityUnit::Kw
    } else {
        rng.weighted(&[
            (CapacityUnit::Ton, 6.0),
            (CapacityUnit::KBtuh, 1.5),
            (CapacityUnit::Mbh, 1.0),
        ])
    };
    Unit {
        ahu: Ahu {
            name: ahu_name,
            label: Some(label),
            units,
            serves: out_zones.iter().map(|z| z.name.clone()).collect(),
            supply,
            diversity_pct,
            supply_duct,
            return_duct,
            return_note,
            plenum_gain_btuh,
            fan,
            outdoor_air: Some(outdoor_air),
            occupant_diversity_pct,
            ventilation_efficiency,
            outdoor_fan_rise_f,
            coil: Some(coil),
        },
        zones: out_zones,
        lets,
        comment,
        sizing: Sizing::Ok(rng.range(1.02, 1.12)),
        rate_sensible: rng.chance(0.3),
        face_velocity_fpm: rng.chance(0.2).then(|| rng.range(380.0, 480.0)),
        capacity_unit,
    }
}

fn q(v: f64, unit: &str) -> String {
    crate::text::q(v, 0, unit)
}

fn rng_half(rng: &mut Rng, lo: f64, hi: f64) -> f64 {
    round_to(rng.range(lo, hi), 0.5)
}

fn value_of(a: &Option<Amount>) -> f64 {
    match a {
        Some(Amount::Value(v)) => *v,
        _ => 0.0,
    }
}

/// The rated capacity for a required total (or sensible) load, Btu/h, in
/// steps a catalogue would have: 0.5 ton; 1 kBtu/h (0.1 below 20 kBtu/h);
/// 0.5 kW (0.1 below 10 kW). Rounded up for an `Ok` sizing (so the rating is
/// at least the load, and with a factor of at most 1.12 and a step of at
/// most a tenth of the load, at most 1.22 times it), down for `Undersized`.
pub(crate) fn capacity(unit: CapacityUnit, required_btuh: f64, sizing: Sizing) -> Capacity {
    let (target, up) = match sizing {
        Sizing::Ok(f) => (required_btuh * f, true),
        Sizing::Undersized(f) => (required_btuh * f, false),
    };
    let round = |v: f64, step: f64| {
        let n = if up {
            (v / step).ceil()
        } else {
            (v / step).floor()
        };
        // Round away the binary noise of n·step (0.1 is not exact).
        let x = n.max(1.0) * step;
        (x * 10.0).round() / 10.0
    };
    let kbtuh_step = if required_btuh >= 20_000.0 { 1.0 } else { 0.1 };
    // Large coils are catalogued in tons whatever the unit's habit.
    let tons = match unit {
        CapacityUnit::Ton => required_btuh >= 60_000.0,
        CapacityUnit::KBtuh | CapacityUnit::Mbh => required_btuh >= 120_000.0,
        CapacityUnit::Kw => false,
    };
    match unit {
        _ if tons => Capacity::Ton(round(target / 12_000.0, 0.5)),
        CapacityUnit::Ton | CapacityUnit::KBtuh => {
            Capacity::KBtuh(round(target / 1_000.0, kbtuh_step))
        }
        CapacityUnit::Mbh => Capacity::Mbh(round(target / 1_000.0, kbtuh_step)),
        CapacityUnit::Kw => {
            let kw = target * 0.293_071_1 / 1_000.0;
            Capacity::Kw(round(kw, if kw >= 10.0 { 0.5 } else { 0.1 }))
        }
    }
}
