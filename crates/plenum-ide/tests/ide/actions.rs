use expect_test::{Expect, expect};

use super::{OFFICE, analyse, show_change};

/// Every action at the cursor (or the selection), with the lines it changes.
fn check(fixture: &str, expect: Expect) {
    let (a, fx) = analyse(fixture);
    let (path, offset) = fx.position();
    let range = fx
        .range
        .as_ref()
        .map(|(_, s)| *s)
        .unwrap_or(plenum_ide::Span::empty(offset));
    let before: Vec<&str> = fx.text(&path).unwrap().lines().collect();
    let mut out = String::new();
    for action in a.code_actions(&path, range) {
        out.push_str(&format!("{}\n", action.title));
        let after = show_change(&fx, &action.change);
        for (i, line) in after.lines().filter(|l| !l.starts_with("//-")).enumerate() {
            if before.get(i) != Some(&line) {
                out.push_str(&format!(
                    "  {} → {}\n",
                    before.get(i).unwrap_or(&"").trim(),
                    line.trim()
                ));
            }
        }
    }
    expect.assert_eq(&out);
}

#[test]
fn add_the_missing_unit() {
    check(
        &OFFICE.replace("area     1_000 ft²", "area     1_0$000"),
        expect![[r#"
            add `ft²`
              area     1_000 → area     1_000 ft²
        "#]],
    );
}

#[test]
fn correct_a_misspelt_key() {
    check(
        &OFFICE.replace("latent   2 kBtu/h", "latnet$0   2 kBtu/h"),
        expect![[r#"
            change to `latent`
              latnet   2 kBtu/h → latent   2 kBtu/h
        "#]],
    );
}

#[test]
fn correct_a_misspelt_unit() {
    check(
        &OFFICE.replace("sensible 20 kBtu/h", "sensible 20 kbtu$0/h"),
        expect![[r#"
            change the unit to `kBtu/h`
              sensible 20 kbtu/h → sensible 20 kBtu/h
        "#]],
    );
}

#[test]
fn raise_an_undersized_coil_to_the_next_standard_size() {
    check(
        &OFFICE.replace("rated 10 ton", "rated 4$0 ton"),
        expect![[r#"
            Raise `rated` to 6 ton, the next standard size above the 5.4 ton required (common practice)
              rated 4 ton → rated 6 ton
        "#]],
    );
}
