use expect_test::expect;

use plenum_ide::DocumentSymbol;

use super::{OFFICE, analyse};

fn tree(symbols: &[DocumentSymbol], depth: usize, out: &mut String) {
    for s in symbols {
        out.push_str(&format!(
            "{}{:?} {}{}\n",
            "  ".repeat(depth),
            s.kind,
            s.name,
            s.detail
                .as_ref()
                .map(|d| format!(" ({d})"))
                .unwrap_or_default()
        ));
        tree(&s.children, depth + 1, out);
    }
}

#[test]
fn document_symbols_outline_blocks_keys_and_lets() {
    let (a, fx) = analyse(&format!("use \"x.plenum\"\nlet l = 2 ft\n{OFFICE}"));
    let (path, _) = fx.position();
    let mut out = String::new();
    tree(&a.document_symbols(&path), 0, &mut out);
    expect![[r#"
        Use x.plenum (use)
        Let l (2 ft)
        Project project (Test offices)
          Key units (ip)
        Site site
          Key elevation (0 ft)
          Key cooling (95 °F db, 75 °F wb)
        Zone east (zone "East offices")
          Key area (1_000 ft²)
          Key people (5)
          Key use (office)
          Key sensible (20 kBtu/h)
          Key latent (2 kBtu/h)
        Zone west (zone)
          Key sensible (16 kBtu/h)
        Ahu rtu_1 (ahu "Roof unit")
          Key serves (east, west)
          Key supply_temp (55 °F)
          Coil coil
            Key rated (10 ton)
    "#]]
    .assert_eq(&out);
}

#[test]
fn workspace_symbols_match_by_substring() {
    let (a, _) = analyse(OFFICE);
    let names: Vec<String> = a
        .workspace_symbols("ST")
        .iter()
        .map(|s| format!("{:?} {}", s.kind, s.name))
        .collect();
    assert_eq!(names, ["Zone east", "Zone west"]);
    assert_eq!(a.workspace_symbols("").len(), 3);
}

#[test]
fn folding_ranges_for_blocks_and_comment_runs() {
    let (a, fx) = analyse(
        "# one\n# two\n# three\nzone a {\n  area 5 ft²\n  sensible 1 kBtu/h\n}\nsite { cooling 95 °F db, 75 °F wb }\n",
    );
    let (path, _) = fx.position();
    let text = fx.text(&path).unwrap();
    let out: Vec<String> = a
        .folding_ranges(&path)
        .iter()
        .map(|r| format!("{:?} {:?}", r.kind, &text[r.span.range()]))
        .collect();
    expect![[r##"
        [
            "Comment \"# one\\n# two\\n# three\"",
            "Block \"{\\n  area 5 ft²\\n  sensible 1 kBtu/h\\n}\"",
        ]
    "##]]
    .assert_debug_eq(&out);
}

#[test]
fn document_links_on_use_paths() {
    let (a, fx) = analyse(
        "//- /w/plenum.toml\n//- /w/site.plenum\nsite { cooling 95 °F db, 75 °F wb }\n//- /w/a/main.plenum\nuse \"../site.plenum\"\nuse \"missing.plenum\"\n$0\n",
    );
    let (path, _) = fx.position();
    let links = a.document_links(&path);
    assert_eq!(links.len(), 1, "{links:?}");
    assert_eq!(links[0].target.to_str(), Some("/w/site.plenum"));
    assert_eq!(
        &fx.text(&path).unwrap()[links[0].span.range()],
        "\"../site.plenum\""
    );
}

#[test]
fn semantic_tokens_name_zones_air_handlers_lets_keys_and_units() {
    let (a, fx) = analyse(
        "let lights = 2 W/ft²\nzone a { sensible 1 kBtu/h + lights }\nzone b like a {}\nahu u { serves a, b }\n",
    );
    let (path, _) = fx.position();
    let text = fx.text(&path).unwrap();
    let out: Vec<String> = a
        .semantic_tokens(&path)
        .iter()
        .map(|t| {
            format!(
                "{:?}{} {}",
                t.kind,
                if t.definition { "*" } else { "" },
                &text[t.span.range()]
            )
        })
        .collect();
    expect![[r#"
        [
            "Keyword let",
            "Let* lights",
            "Unit W/ft²",
            "Keyword zone",
            "Zone* a",
            "Key sensible",
            "Unit kBtu/h",
            "Let lights",
            "Keyword zone",
            "Zone* b",
            "Keyword like",
            "Zone a",
            "Keyword ahu",
            "Ahu* u",
            "Key serves",
            "Zone a",
            "Zone b",
        ]
    "#]]
    .assert_debug_eq(&out);
}
