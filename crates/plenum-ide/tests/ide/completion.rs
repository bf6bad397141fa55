use expect_test::{Expect, expect};

use super::{OFFICE, analyse};

/// The labels offered at the cursor, and what they replace.
fn check(fixture: &str, expect: Expect) {
    let (a, fx) = analyse(fixture);
    let (path, offset) = fx.position();
    let text = fx.text(&path).unwrap();
    let items = a.completions(&path, offset);
    let mut out = String::new();
    if let Some(first) = items.first() {
        out.push_str(&format!("replaces [{}]\n", &text[first.replace.range()]));
    }
    for i in &items {
        out.push_str(&format!("{:?} {}\n", i.kind, i.label));
    }
    expect.assert_eq(&out);
}

#[test]
fn keys_the_block_has_not_given() {
    check(
        r#"
        zone a {
          area 10 ft²
          sens$0
        }
        "#,
        expect![[r#"
            replaces [sens]
            Key people
            Key use
            Key indoor
            Key sensible
            Key latent
            Key distribution_effectiveness
        "#]],
    );
}

#[test]
fn keys_and_nested_blocks_of_an_air_handler_without_alternatives_given() {
    check(
        r#"
        ahu a {
          serves x
          supply_dt 18 °F
          coil { rated 5 ton }
          $0
        }
        "#,
        expect![[r#"
            replaces []
            Key diversity
            Key supply_duct
            Key supply_duct_rise
            Key return_duct
            Key return_duct_rise
            Key plenum_gain
            Key outdoor_air
            Key occupant_diversity
            Key ventilation_efficiency
            Key outdoor_fan_rise
            Keyword fan
        "#]],
    );
}

#[test]
fn units_of_the_keys_dimension_after_a_number() {
    check(
        "zone a {\n  area 1_000 $0\n}\n",
        expect![[r#"
            replaces []
            Unit ft²
            Unit m²
        "#]],
    );
    check(
        "zone a {\n  sensible 12 kBt$0\n}\n",
        expect![[r#"
            replaces [kBt]
            Unit Btu/h
            Unit kBtu/h
            Unit ton
            Unit hp
            Unit W
            Unit kW
            Unit Btuh
            Unit MBH
        "#]],
    );
}

#[test]
fn zone_names_in_serves_not_yet_listed() {
    check(
        &OFFICE.replace("serves      east, west", "serves      east, $0"),
        expect![[r#"
            replaces []
            Zone west
        "#]],
    );
}

#[test]
fn names_after_like() {
    check(
        &OFFICE.replace("zone west like east {", "zone west like $0 {"),
        expect![[r#"
            replaces []
            Zone east
        "#]],
    );
}

#[test]
fn ventilation_categories_after_use_in_a_zone() {
    check(
        "zone a {\n  use $0\n}\n",
        expect![[r#"
            replaces []
            Category office
            Category conference
            Category reception
            Category lobby
            Category corridor
            Category classroom
            Category lecture
            Category library
            Category retail
            Category dining
            Category storage
        "#]],
    );
}

#[test]
fn block_kinds_at_the_top_level() {
    check(
        "site { cooling 95 °F db, 75 °F wb }\n\n$0\n",
        expect![[r#"
            replaces []
            Keyword project
            Keyword site
            Keyword zone
            Keyword ahu
            Keyword let
            Keyword use
        "#]],
    );
}

#[test]
fn words_a_key_takes_and_nothing_in_a_comment() {
    check(
        "ahu a {\n  fan {\n    arrangement $0\n  }\n}\n",
        expect![[r#"
            replaces []
            Word draw_through
            Word blow_through
        "#]],
    );
    check("zone a {\n  # area $0\n}\n", expect![[""]]);
}
