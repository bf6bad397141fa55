use expect_test::{Expect, expect};

use super::{OFFICE, analyse};

fn check(fixture: &str, expect: Expect) {
    let (a, fx) = analyse(fixture);
    let (path, offset) = fx.position();
    let actual = match a.hover(&path, offset) {
        Some(h) => {
            let text = fx.text(&path).unwrap();
            format!("[{}]\n{}\n", &text[h.span.range()], h.markdown)
        }
        None => "no hover\n".to_string(),
    };
    expect.assert_eq(&actual);
}

/// The first line of the hover that contains `what`.
fn line_of(fixture: &str, what: &str) -> String {
    let (a, fx) = analyse(fixture);
    let (path, offset) = fx.position();
    let h = a
        .hover(&path, offset)
        .map(|h| h.markdown)
        .unwrap_or_default();
    h.lines()
        .find(|l| l.contains(what))
        .unwrap_or("")
        .to_string()
}

#[test]
fn an_air_handler_shows_its_coil_from_the_evaluation() {
    check(
        &OFFICE.replace("ahu rtu_1", "ahu rtu$0_1"),
        expect![[r#"
            [ahu rtu_1 "Roof unit" {]
            **ahu rtu_1 "Roof unit"**

            - **Coil total**: 5.4 ton (64,810 Btu/h)
            - **Sensible / latent**: 54,370 Btu/h / 10,430 Btu/h · SHR 0.84
            - **Supply airflow**: 1,620 cfm · 300 cfm/ton
            - **Outdoor air**: 225 cfm · 12.9 % of supply (62.1 minimum 225 cfm)
            - **Entering coil**: 80.2 °F db, 63.3 °F wb, 39 %rh, 59.9 gr/lb
            - **Leaving coil**: 50.0 °F db, 49.2 °F wb, 95 %rh, 50.7 gr/lb
            - **Rated**: 10.0 ton · margin +85.2 % · oversized

            Assumed (not given in the file):
            - indoor 75.0 °F, 50 %rh (zone east; common practice)
            - distribution_effectiveness 100.0 % (zone east; ASHRAE 62.1-2019 (from memory))
            - indoor 75.0 °F, 50 %rh (zone west; common practice)
            - distribution_effectiveness 100.0 % (zone west; ASHRAE 62.1-2019 (from memory))
            - diversity 100.0 % (project default)
            - supply_duct 3.0 °F (common practice)
            - return_duct 3.0 °F (common practice)
            - outdoor_air ventilation (project default)
            - occupant_diversity 100.0 % (project default)
            - ventilation_efficiency simplified (project default)
            - fan 2.0 °F (draw-through) (common practice)
            - leaving_rh 95.0 % (common practice)

            *Design aid only: the inputs are your responsibility, the figures must be reviewed by a qualified engineer (licensed where required), and the codes in force where the building stands govern.*
        "#]],
    );
}

/// The hover and the engine's result are one value: the tonnage shown is
/// the evaluation's, rounded by the units crate's capacity rule.
#[test]
fn the_hover_tonnage_is_the_evaluations() {
    let design = plenum_model::lower_text(OFFICE).0;
    let eval = plenum_engine::evaluate(&design);
    let r = eval.ahus[0].result.as_ref().unwrap();
    let tons = plenum_ide::report::show(
        plenum_units::Measure::Capacity,
        r.governing().coil.tons,
        plenum_units::UnitSystem::Ip,
    );
    let line = line_of(&OFFICE.replace("ahu rtu_1", "a$0hu rtu_1"), "Coil total");
    assert!(line.contains(&tons), "{line} / {tons}");
}

#[test]
fn si_projects_show_kilowatts() {
    let si = OFFICE
        .replace("units ip", "units si")
        .replace("ahu rtu_1", "ahu $0rtu_1");
    let line = line_of(&si, "Coil total");
    assert_eq!(line, "- **Coil total**: 19.0 kW");
}

#[test]
fn the_governing_case_is_named_with_a_dehumidification_state() {
    let fx = OFFICE
        .replace(
            "cooling   95 °F db, 75 °F wb",
            "cooling   95 °F db, 75 °F wb\n  dehumid   73 °F dp, 83 °F db",
        )
        .replace("ahu rtu_1", "ahu $0rtu_1");
    let line = line_of(&fx, "Governing case");
    assert!(line.starts_with("Governing case: "), "{line}");
    assert!(
        line.contains("cooling") && line.contains("dehumidification"),
        "{line}"
    );
}

#[test]
fn a_zone_shows_its_airflow_ventilation_and_humidity() {
    check(
        &OFFICE.replace("zone east", "zone ea$0st"),
        expect![[r#"
            [zone east "East offices" {]
            **zone east "East offices"**

            - **Loads**: sensible 20,000 Btu/h · latent 2,000 Btu/h
            - **Served by**: `rtu_1`
            - **Design airflow**: 900 cfm (supply ΔT 20.0 °F)
            - **Ventilation (62.1)**: V_bz 85 cfm · V_oz 85 cfm (R_p 5.0 cfm/person, R_a 0.06 cfm/ft², E_z 1.00)
            - **Resulting RH**: 42 %rh at 75.0 °F (design 50 %rh)

        "#]],
    );
}

#[test]
fn a_zone_named_in_serves_shows_the_zone() {
    let line = line_of(
        &OFFICE.replace("serves      east, west", "serves      east, we$0st"),
        "Design airflow",
    );
    assert!(line.contains("cfm"), "{line}");
}

#[test]
fn a_key_shows_its_meaning_dimension_units_and_default() {
    check(
        &OFFICE.replace("supply_temp 55", "supply_t$0emp 55"),
        expect![[r#"
            [supply_temp]
            **supply_temp** (in `ahu`)

            Supply air temperature at the diffusers.

            - **Value**: a temperature
            - **Units**: `°F`, `°C`, `K`, `°R`
            - **Default**: the lowest indoor temperature of the served zones − 18 °F (common practice)
            - **Instead of**: `supply_dt` (give only one)

            Example: `supply_temp 55 °F`
        "#]],
    );
}

#[test]
fn a_quantity_shows_its_value_in_the_other_system() {
    check(
        &OFFICE.replace("rated 10 ton", "rated 10 t$0on"),
        expect![[r#"
            [10 ton]
            `rated` = 10.0 ton

            In SI units: 35.2 kW
        "#]],
    );
    check(
        "let area = 48 ft * 5$00 ft\n",
        expect![[r#"
            [50 ft]
            `50 ft` = 50 ft = 15.2 m (SI units)
        "#]],
    );
}

#[test]
fn a_let_shows_its_value_in_both_systems() {
    check(
        "let lights = 0.9 W/ft² * 2_400 ft²\nzone z { sensible 10 kBtu/h + lig$0hts }\n",
        expect![[r#"
            [lights]
            ```plenum
            let lights = 0.9 W/ft² * 2_400 ft²
            ```

            `lights` = 7.4 kBtu/h

            In SI units: 2.2 kW

            ---

            `sensible` = 17,370 Btu/h

            In SI units: 5,090 W
        "#]],
    );
}

#[test]
fn a_suppressed_code_shows_the_checks_documentation() {
    let fx = OFFICE.replace(
        "ahu rtu_1",
        "# plenum: allow oversized-c$0oil -- sized for the future wing\nahu rtu_1",
    );
    let (a, f) = analyse(&fx);
    let (path, offset) = f.position();
    let h = a.hover(&path, offset).unwrap();
    assert_eq!(&f.text(&path).unwrap()[h.span.range()], "oversized-coil");
    assert!(h.markdown.starts_with("# oversized-coil"), "{}", h.markdown);
    assert!(h.markdown.contains("## Why it matters"));
}

#[test]
fn nothing_to_show_on_blank_space() {
    check(
        &OFFICE.replace("\nsite {", "\n$0\nsite {"),
        expect!["no hover\n"],
    );
}
