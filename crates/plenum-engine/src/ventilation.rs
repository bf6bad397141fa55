//! The ASHRAE 62.1 ventilation rate procedure: the category table (the `use`
//! key) and the zone and system outdoor-air equations of methods.md §4 step 8.
//!
//! **Written from memory.** The rates below and the procedure's equations are
//! those of ANSI/ASHRAE Standard 62.1-2019 (Table 6-1 and §6.2) as recalled
//! by the project, not copied from the printed standard: check them against
//! the edition in force where the building stands before relying on them.

/// Where every rate of [`VENTILATION_CATEGORIES`] comes from.
pub const VENTILATION_SOURCE: &str = "ANSI/ASHRAE Standard 62.1-2019, Table 6-1";

/// The caution that goes with every rate of the table.
pub const VENTILATION_NOTE: &str =
    "rates written from memory of the 2016–2019 editions; check them against the edition in force";

/// One occupancy category of the ventilation rate procedure.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct VentilationCategory {
    /// The identifier written after `use` in a zone block.
    pub name: &'static str,
    /// The occupancy category as the standard's table names it.
    pub description: &'static str,
    /// People outdoor-air rate R_p, cfm per person.
    pub r_p_cfm_per_person: f64,
    /// Area outdoor-air rate R_a, cfm per ft².
    pub r_a_cfm_per_ft2: f64,
    /// Where the rates come from ([`VENTILATION_SOURCE`]).
    pub source: &'static str,
    /// The caution on the rates ([`VENTILATION_NOTE`]).
    pub note: &'static str,
}

const fn cat(
    name: &'static str,
    description: &'static str,
    r_p_cfm_per_person: f64,
    r_a_cfm_per_ft2: f64,
) -> VentilationCategory {
    VentilationCategory {
        name,
        description,
        r_p_cfm_per_person,
        r_a_cfm_per_ft2,
        source: VENTILATION_SOURCE,
        note: VENTILATION_NOTE,
    }
}

/// The categories the `use` key accepts, in the order completion lists them.
///
/// Rates from ANSI/ASHRAE 62.1-2019 Table 6-1, **written from memory** (see
/// the module docs).
pub const VENTILATION_CATEGORIES: &[VentilationCategory] = &[
    cat("office", "Office space", 5.0, 0.06),
    cat("conference", "Conference/meeting", 5.0, 0.06),
    cat("reception", "Reception areas", 5.0, 0.06),
    cat("lobby", "Main entry lobbies", 7.5, 0.06),
    cat("corridor", "Corridors", 0.0, 0.06),
    cat("classroom", "Classrooms (age 9 plus)", 10.0, 0.12),
    cat("lecture", "Lecture classroom", 7.5, 0.06),
    cat("library", "Libraries", 5.0, 0.12),
    cat("retail", "Sales (except as below)", 7.5, 0.12),
    cat("dining", "Restaurant dining rooms", 7.5, 0.18),
    cat(
        "storage",
        "Occupiable storage rooms for dry materials",
        0.0,
        0.06,
    ),
];

/// The category of a `use` identifier (exact, case-sensitive match).
pub fn ventilation_category(name: &str) -> Option<&'static VentilationCategory> {
    VENTILATION_CATEGORIES.iter().find(|c| c.name == name)
}

/// 62.1 simplified procedure: system ventilation efficiency from the
/// occupant diversity D — E_v = 0.88 D + 0.22 for D < 0.60, else 0.75
/// (methods.md §4 step 8; from memory).
pub fn simplified_ev(occupant_diversity: f64) -> f64 {
    if occupant_diversity < 0.60 {
        0.88 * occupant_diversity + 0.22
    } else {
        0.75
    }
}

/// Breathing-zone outdoor airflow V_bz = R_p P_z + R_a A_z, cfm (62.1 §6.2, from memory).
pub fn breathing_zone_cfm(r_p: f64, people: f64, r_a: f64, area_ft2: f64) -> f64 {
    r_p * people + r_a * area_ft2
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The required categories are all present, each with its source
    /// and the from-memory note.
    #[test]
    fn table_has_the_required_categories_with_source_and_note() {
        for name in [
            "office",
            "conference",
            "reception",
            "lobby",
            "corridor",
            "classroom",
            "lecture",
            "library",
            "retail",
            "dining",
            "storage",
        ] {
            let c = ventilation_category(name);
            assert!(c.is_some(), "{name} missing");
            if let Some(c) = c {
                assert_eq!(c.source, "ANSI/ASHRAE Standard 62.1-2019, Table 6-1");
                assert!(c.note.contains("from memory"));
                assert!(c.r_p_cfm_per_person >= 0.0 && c.r_a_cfm_per_ft2 > 0.0);
            }
        }
        assert!(ventilation_category("Office").is_none());
        assert!(ventilation_category("warehouse").is_none());
    }

    /// Rates as the reference README lists them (62.1-2019 Table 6-1, from memory).
    #[test]
    fn rates_match_the_project_table() {
        let expect = [
            ("office", 5.0, 0.06),
            ("conference", 5.0, 0.06),
            ("reception", 5.0, 0.06),
            ("lobby", 7.5, 0.06),
            ("corridor", 0.0, 0.06),
            ("classroom", 10.0, 0.12),
            ("lecture", 7.5, 0.06),
            ("library", 5.0, 0.12),
            ("retail", 7.5, 0.12),
            ("dining", 7.5, 0.18),
            ("storage", 0.0, 0.06),
        ];
        for (name, rp, ra) in expect {
            let c = ventilation_category(name).map(|c| (c.r_p_cfm_per_person, c.r_a_cfm_per_ft2));
            assert_eq!(c, Some((rp, ra)), "{name}");
        }
        let mut names: Vec<_> = VENTILATION_CATEGORIES.iter().map(|c| c.name).collect();
        names.sort_unstable();
        names.dedup();
        assert_eq!(
            names.len(),
            VENTILATION_CATEGORIES.len(),
            "names are unique"
        );
    }

    /// 62.1 simplified E_v (from memory): 0.75 at D ≥ 0.60, 0.88 D + 0.22 below.
    #[test]
    fn simplified_ev_by_hand() {
        assert_eq!(simplified_ev(1.0), 0.75);
        assert_eq!(simplified_ev(0.60), 0.75);
        assert!((simplified_ev(0.5) - 0.66).abs() < 1e-12);
        assert!((simplified_ev(0.0) - 0.22).abs() < 1e-12);
    }

    /// V_bz for 20 people in 1,000 ft² of office: 5·20 + 0.06·1000 = 160 cfm.
    #[test]
    fn breathing_zone_by_hand() {
        assert!((breathing_zone_cfm(5.0, 20.0, 0.06, 1000.0) - 160.0).abs() < 1e-12);
    }
}
