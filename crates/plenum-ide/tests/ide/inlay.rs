use expect_test::{Expect, expect};

use super::{OFFICE, analyse};

fn check(fixture: &str, expect: Expect) {
    let (a, fx) = analyse(fixture);
    let (path, _) = fx.position();
    let text = fx.text(&path).unwrap();
    let mut out = String::new();
    for h in a.inlay_hints(&path) {
        let line_start = text[..h.offset as usize].rfind('\n').map_or(0, |i| i + 1);
        out.push_str(&format!(
            "{}⟨{}⟩\n",
            text[line_start..h.offset as usize].trim_start(),
            h.label
        ));
    }
    expect.assert_eq(&out);
}

#[test]
fn required_capacity_beside_rated_and_airflow_at_each_zone() {
    check(
        OFFICE,
        expect![[r#"
            zone east "East offices" {⟨900 cfm⟩
            zone west like east {⟨720 cfm⟩
            rated 10 ton⟨required 5.4 ton · margin +85.2 % · oversized⟩
        "#]],
    );
}

#[test]
fn without_rated_the_hint_sits_at_the_header() {
    check(
        &OFFICE.replace("  coil {\n    rated 10 ton\n  }\n", ""),
        expect![[r#"
            zone east "East offices" {⟨900 cfm⟩
            zone west like east {⟨720 cfm⟩
            ahu rtu_1 "Roof unit" {⟨required 5.4 ton⟩
        "#]],
    );
}
