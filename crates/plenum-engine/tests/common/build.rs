//! Small builders for hand-made designs in tests: every optional key `None`
//! unless a test sets it.

use plenum_model::*;

/// A location marked by its file number, so tests can tell locations apart.
pub fn loc_n(n: u32) -> Loc {
    Loc {
        file: FileId(n),
        span: Default::default(),
    }
}

pub fn loc() -> Loc {
    loc_n(0)
}

pub fn at<T>(v: T) -> At<T> {
    At::new(v, loc())
}

pub fn at_n<T>(v: T, n: u32) -> At<T> {
    At::new(v, loc_n(n))
}

/// A site at `elevation_ft` with a cooling state of dry bulb / wet bulb.
pub fn site(elevation_ft: f64, db_f: f64, wb_f: f64) -> Site {
    Site {
        loc: loc(),
        elevation_ft: Some(at(elevation_ft)),
        pressure_psia: None,
        cooling: Some(at(AirSpec::DbWb { db_f, wb_f })),
        dehumid: None,
    }
}

/// A zone with its sensible and latent loads; everything else unset.
pub fn zone(id: u32, name: &str, sensible: f64, latent: f64) -> Zone {
    Zone {
        id: ZoneId(id),
        name: name.to_string(),
        label: None,
        loc: loc(),
        name_loc: loc(),
        area_ft2: None,
        people: None,
        category: None,
        indoor: None,
        sensible_btuh: Some(at(sensible)),
        latent_btuh: Some(at(latent)),
        distribution_effectiveness: None,
    }
}

/// A zone with a 62.1 category, area and occupants.
pub fn vent_zone(
    id: u32,
    name: &str,
    sensible: f64,
    latent: f64,
    usage: &str,
    area: f64,
    people: f64,
) -> Zone {
    Zone {
        area_ft2: Some(at(area)),
        people: Some(at(people)),
        category: Some(at(usage.to_string())),
        ..zone(id, name, sensible, latent)
    }
}

/// An air handler serving `zones` (by index); everything else unset.
pub fn ahu(name: &str, zones: &[u32]) -> Ahu {
    Ahu {
        name: name.to_string(),
        label: None,
        loc: loc(),
        name_loc: loc(),
        serves: zones.iter().map(|&z| at(ZoneId(z))).collect(),
        supply: None,
        diversity: None,
        supply_duct: None,
        return_duct: None,
        plenum_gain_btuh: None,
        fan: None,
        outdoor_air: None,
        occupant_diversity: None,
        ventilation_efficiency: None,
        outdoor_fan_rise_f: None,
        coil: None,
    }
}

pub fn fan() -> Fan {
    Fan {
        loc: loc(),
        power: None,
        rise_f: None,
        motor_efficiency: None,
        motor: None,
        arrangement: None,
    }
}

pub fn coil() -> Coil {
    Coil {
        loc: loc(),
        leaving_rh: None,
        rated_btuh: None,
        rated_sensible_btuh: None,
        chilled_water: None,
        face_area_ft2: None,
    }
}

pub fn design(site: Site, zones: Vec<Zone>, ahus: Vec<Ahu>) -> Design {
    Design {
        project: Project::default(),
        site: Some(site),
        zones,
        ahus,
    }
}
