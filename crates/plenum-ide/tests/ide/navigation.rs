use expect_test::{Expect, expect};

use super::{analyse, show_change};

const TWO_FILES: &str = r#"
//- /w/shared/zones.plenum
let lights = 0.9 W/ft² * 1_000 ft²
zone east "East" {
  area     1_000 ft²
  sensible 10 kBtu/h + lights
}
//- /w/main.plenum
use "shared/zones.plenum"
site { cooling 95 °F db, 75 °F wb }
zone west like east {
  sensible 8 kBtu/h + lights
}
ahu rtu_1 { serves ea$0st, west }
"#;

fn check_refs(fixture: &str, expect: Expect) {
    let (a, fx) = analyse(fixture);
    let (path, offset) = fx.position();
    let mut out = String::new();
    for r in a.references(&path, offset, true) {
        let text = fx.text(&r.path).unwrap();
        let line = text[..r.span.start as usize].matches('\n').count() + 1;
        out.push_str(&format!(
            "{}:{line} {}\n",
            r.path.display(),
            &text[r.span.range()]
        ));
    }
    expect.assert_eq(&out);
}

#[test]
fn definition_across_files() {
    let (a, fx) = analyse(TWO_FILES);
    let (path, offset) = fx.position();
    let targets = a.definition(&path, offset);
    assert_eq!(targets.len(), 1);
    let t = &targets[0];
    assert_eq!(t.path.to_str(), Some("/w/shared/zones.plenum"));
    let text = fx.text(&t.path).unwrap();
    assert_eq!(&text[t.focus_span.range()], "east");
    assert!(text[t.full_span.range()].starts_with("zone east"));
}

#[test]
fn references_across_files() {
    check_refs(
        TWO_FILES,
        expect![[r#"
            /w/main.plenum:3 east
            /w/main.plenum:6 east
            /w/shared/zones.plenum:2 east
        "#]],
    );
    check_refs(
        &TWO_FILES
            .replace("ea$0st", "east")
            .replace("8 kBtu/h + lights", "8 kBtu/h + li$0ghts"),
        expect![[r#"
            /w/main.plenum:4 lights
            /w/shared/zones.plenum:1 lights
            /w/shared/zones.plenum:4 lights
        "#]],
    );
}

#[test]
fn rename_edits_every_file() {
    let (a, fx) = analyse(TWO_FILES);
    let (path, offset) = fx.position();
    let change = a.rename(&path, offset, "east_wing").unwrap();
    expect![[r#"
        //- /w/main.plenum
        use "shared/zones.plenum"
        site { cooling 95 °F db, 75 °F wb }
        zone west like east_wing {
          sensible 8 kBtu/h + lights
        }
        ahu rtu_1 { serves east_wing, west }
        //- /w/shared/zones.plenum
        let lights = 0.9 W/ft² * 1_000 ft²
        zone east_wing "East" {
          area     1_000 ft²
          sensible 10 kBtu/h + lights
        }
    "#]]
    .assert_eq(&show_change(&fx, &change));
}

#[test]
fn rename_checks_the_new_name() {
    let (a, fx) = analyse(TWO_FILES);
    let (path, offset) = fx.position();
    let err = |n: &str| a.rename(&path, offset, n).unwrap_err().to_string();
    assert!(err("2nd").contains("is not a name"));
    assert!(err("east wing").contains("is not a name"));
    assert!(err("like").contains("keyword"));
    assert!(err("west").contains("already defined in /w/main.plenum"));
    assert_eq!(a.prepare_rename(&path, offset).map(|s| s.len()), Ok(4));
    // Not a name: nothing to rename.
    assert!(a.prepare_rename(&path, 0).is_err());
}
