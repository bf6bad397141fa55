use expect_test::{Expect, expect};

use super::analyse;

/// Each diagnostic of every file of the fixture: file, code, the text it
/// flags and its message.
fn check(fixture: &str, expect: Expect) {
    let (a, fx) = analyse(fixture);
    let mut out = String::new();
    for (path, text) in &fx.files {
        for d in a.diagnostics(path) {
            if d.code == "assumption" {
                continue;
            }
            out.push_str(&format!(
                "{} {:?} {} [{}] {}\n",
                path.display(),
                d.severity,
                d.code,
                &text[d.span.range()],
                d.message
            ));
        }
    }
    expect.assert_eq(&out);
}

#[test]
fn syntax_model_and_engine_findings_of_a_design() {
    check(
        r#"
        site { cooling 95 °F db, 75 °F wb }
        zone a { area 10 ft; sensible 30 kBtu/h; peple 3 }
        ahu u { serves a; coil { rated 1 ton } }
        "#,
        expect![[r#"
            /w/design.plenum Error unit-mismatch [10 ft] `area` expects an area, found a length
            /w/design.plenum Error unknown-key [peple] `peple` is not a key of a `zone` block
            /w/design.plenum Error undersized-coil [rated 1 ton] `u` is undersized: needs 3.61 ton (43,333 Btu/h) total and is rated 1.00 ton (12,000 Btu/h), a margin of -72.3 %
        "#]],
    );
}

#[test]
fn a_mistake_in_a_used_file_is_reported_in_that_file_once() {
    check(
        r#"
        //- /w/shared/site.plenum
        site { cooling 95 °F db, 75 °F wb; elevaton 100 ft }
        //- /w/a.plenum
        use "shared/site.plenum"
        zone a { sensible 10 kBtu/h }
        ahu x { serves a }
        //- /w/b.plenum
        use "shared/site.plenum"
        zone b { sensible 10 kBtu/h }
        ahu y { serves b }
        "#,
        expect![[r#"
            /w/shared/site.plenum Error unknown-key [elevaton] `elevaton` is not a key of a `site` block
        "#]],
    );
}

#[test]
fn a_syntax_error_does_not_cascade() {
    check(
        r#"
        site { cooling 95 °F db, 75 °F wb }
        zone a { sensible 10 kBtu/h
        ahu u { serves a }
        "#,
        expect![[r#"
            /w/design.plenum Error unknown-block [ahu] unknown block `ahu`
            /w/design.plenum Error unclosed-block [] expected `}` to close `zone a` before the end of the file
        "#]],
    );
}

#[test]
fn project_severities_from_plenum_toml() {
    check(
        r#"
        //- /w/plenum.toml
        [checks]
        "oversized-coil" = "error"
        //- /w/a.plenum
        site { cooling 95 °F db, 75 °F wb }
        zone a { area 500 ft²; people 2; use office; sensible 10 kBtu/h }
        ahu u { serves a; coil { rated 20 ton } }
        "#,
        expect![[r#"
            /w/a.plenum Error oversized-coil [rated 20 ton] `u` is oversized: it needs 1.36 ton (16,277 Btu/h) total and is rated 20.00 ton (240,000 Btu/h), a margin of +1374.5 % (more than 25 %)
        "#]],
    );
}
