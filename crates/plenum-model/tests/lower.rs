//! Lowering: the typed design holds the values the files give, in IP numbers.

#![allow(clippy::unwrap_used)]

use std::path::Path;

use plenum_model::*;
use plenum_units::{Quantity, Unit, UnitSystem};

fn close(a: f64, b: f64, rel: f64) -> bool {
    (a - b).abs() <= rel * a.abs().max(b.abs()).max(1e-300)
}

fn lower(text: &str) -> Design {
    let (design, diags) = lower_text(text);
    assert!(diags.is_empty(), "{diags:#?}");
    design
}

fn examples_dir() -> std::path::PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../../examples")
}

#[test]
fn the_library_example_lowers_with_its_values() {
    let path = examples_dir().join("library.plenum");
    let text = std::fs::read_to_string(&path).unwrap();
    let model = Model::build(&RealFs, &path, text);
    assert!(model.diagnostics.is_empty(), "{:#?}", model.diagnostics);
    let d = &model.design;
    assert_eq!(
        d.project.name.as_deref(),
        Some("Alder Creek Branch Library")
    );
    let site = d.site.as_ref().unwrap();
    assert_eq!(site.elevation_ft.unwrap().value, 1_250.0);
    assert_eq!(
        site.cooling.unwrap().value,
        AirSpec::DbWb {
            db_f: 96.0,
            wb_f: 66.0
        }
    );
    let reading = d.zone_by_name("reading").unwrap();
    assert_eq!(reading.area_ft2.unwrap().value, 2_400.0);
    // 43.5 kBtu/h + 0.9 W/ft² × 2,400 ft²; 1 W = 3.412141633 Btu/h (NIST SP 811: 1 Btu_IT/h = 0.29307107 W).
    let expected = 43_500.0 + 0.9 * 2_400.0 / 0.293_071_07;
    assert!(close(reading.sensible_btuh.unwrap().value, expected, 1e-7));
    // `stacks` is like `reading`: it inherits the category and indoor state, overrides the rest.
    let stacks = d.zone_by_name("stacks").unwrap();
    assert_eq!(stacks.category.as_ref().unwrap().value, "library");
    assert_eq!(
        stacks.indoor.unwrap().value,
        AirSpec::DbRh {
            db_f: 75.0,
            rh: 0.5
        }
    );
    assert_eq!(stacks.area_ft2.unwrap().value, 1_800.0);
    let ahu = d.ahu_by_name("ahu_1").unwrap();
    assert_eq!(ahu.serves.len(), 3);
    assert_eq!(ahu.diversity.unwrap().value, 0.95);
    assert_eq!(ahu.supply.unwrap().value, SupplyTemp::Temp { f: 55.0 });
    let fan = ahu.fan.as_ref().unwrap();
    assert_eq!(fan.power.unwrap().value, FanPower::Shaft { hp: 5.0 });
    assert_eq!(fan.motor_efficiency.unwrap().value, 0.895);
    let coil = ahu.coil.as_ref().unwrap();
    assert!(close(coil.rated_btuh.unwrap().value, 180_000.0, 1e-12));
    assert_eq!(coil.chilled_water.unwrap().value, (44.0, 56.0));
    let ahu2 = d.ahu_by_name("ahu_2").unwrap();
    assert_eq!(ahu2.return_duct.unwrap().value, ReturnDuct::None);
    assert_eq!(
        ahu2.supply.unwrap().value,
        SupplyTemp::BelowRoom { dt_f: 20.0 }
    );
    assert_eq!(
        ahu2.outdoor_air.unwrap().value,
        OutdoorAir::PerPerson { cfm: 15.0 }
    );
    match ahu2.fan.as_ref().unwrap().power.unwrap().value {
        FanPower::Static { in_wg, efficiency } => {
            assert!(close(in_wg, 2.0, 1e-12));
            assert_eq!(efficiency, 0.6);
        }
        other => panic!("{other:?}"),
    }
}

#[test]
fn the_school_example_reads_its_shared_site() {
    let path = examples_dir().join("middle-school.plenum");
    let text = std::fs::read_to_string(&path).unwrap();
    let model = Model::build(&RealFs, &path, text);
    assert!(model.diagnostics.is_empty(), "{:#?}", model.diagnostics);
    assert_eq!(model.files.len(), 2);
    let d = &model.design;
    assert_eq!(
        d.site.as_ref().unwrap().elevation_ft.unwrap().value,
        4_900.0
    );
    // `people classroom_people` comes from a let in the shared file.
    assert_eq!(
        d.zone_by_name("class_102").unwrap().people.unwrap().value,
        28.0
    );
    assert_eq!(
        d.zone_by_name("class_104").unwrap().people.unwrap().value,
        30.0
    );
    let cafe = d.ahu_by_name("rtu_2").unwrap();
    assert_eq!(
        cafe.fan.as_ref().unwrap().arrangement.unwrap().value,
        FanArrangement::BlowThrough
    );
}

/// `sensible 4_200 cfm` is the issue's own example of a unit mismatch.
#[test]
fn a_wrong_dimension_names_the_key() {
    let (_, diags) = lower_text("zone a {\n  sensible 4_200 cfm\n}\n");
    let d = diags
        .iter()
        .find(|d| d.code == ModelCode::UnitMismatch)
        .unwrap();
    assert!(d.message.contains("`sensible`"), "{}", d.message);
    assert!(d.message.contains("heat flow") && d.message.contains("airflow"));
}

#[test]
fn temperature_differences_and_sums() {
    let d = lower(
        "site { cooling 94 °F db, 75 °F wb }\nzone z { sensible 1 kBtu/h }\nahu a { serves z; supply_dt 75 °F - 57 °F }\n",
    );
    let SupplyTemp::BelowRoom { dt_f } = d.ahus[0].supply.unwrap().value else {
        panic!()
    };
    assert!(close(dt_f, 18.0, 1e-12));
    let (_, diags) = lower_text("let t = 75 °F + 75 °F\n");
    assert_eq!(diags.len(), 1);
    assert_eq!(diags[0].code, ModelCode::InvalidArithmetic);
}

#[test]
fn fixes_are_offered_where_one_edit_repairs() {
    let (_, diags) = lower_text("zone z {\n  area 1_000 ft\n  sensible 38500\n  latnet 3 kW\n}\n");
    let fixes: Vec<&str> = diags
        .iter()
        .filter_map(|d| d.fix.as_ref())
        .map(|f| f.edits[0].text.as_str())
        .collect();
    assert_eq!(fixes, vec!["ft²", " Btu/h", "latent"], "{diags:#?}");
}

#[test]
fn a_compound_let_names_an_air_state() {
    let d = lower("let summer = 94 °F db, 75 °F wb\nsite { cooling summer }\n");
    assert_eq!(
        d.site.unwrap().cooling.unwrap().value,
        AirSpec::DbWb {
            db_f: 94.0,
            wb_f: 75.0
        }
    );
}

#[test]
fn an_ahu_like_another_merges_its_nested_blocks() {
    let d = lower(
        "site { cooling 94 °F db, 75 °F wb }\nzone a { sensible 1 kBtu/h }\nzone b { sensible 1 kBtu/h }\n\
         ahu one { serves a; supply_temp 55 °F; coil { rated 3 ton; leaving_rh 93 % } }\n\
         ahu two like one { serves b; supply_dt 20 °F; coil { rated 4 ton } }\n",
    );
    let two = d.ahu_by_name("two").unwrap();
    assert_eq!(
        two.supply.unwrap().value,
        SupplyTemp::BelowRoom { dt_f: 20.0 }
    );
    let coil = two.coil.as_ref().unwrap();
    assert!(close(coil.rated_btuh.unwrap().value, 48_000.0, 1e-12));
    assert_eq!(coil.leaving_rh.unwrap().value, 0.93);
}

/// The same design written in IP and in SI lowers to the same numbers.
#[test]
fn ip_and_si_inputs_lower_to_the_same_design() {
    // (key, IP value, IP unit, SI unit)
    let zone = [
        ("area", 2_400.0, "ft²", "m²"),
        ("sensible", 38.5, "kBtu/h", "W"),
        ("latent", 8.2, "kBtu/h", "kW"),
    ];
    let ahu = [
        ("supply_temp", 55.0, "°F", "°C"),
        ("supply_duct", 180.0, "ft", "m"),
        ("plenum_gain", 4.1, "kBtu/h", "kW"),
    ];
    let to_si = |v: f64, ip: &str, si: &str| {
        let q = Quantity::new(v, &Unit::parse(ip).unwrap()).unwrap();
        format!("{:.17e}", q.in_unit(&Unit::parse(si).unwrap()).unwrap())
    };
    let write = |si: bool| {
        let mut s = String::from("site {\n");
        if si {
            s += &format!("  elevation {} m\n", to_si(1_250.0, "ft", "m"));
            s += &format!(
                "  cooling {} °C db, {} °C wb\n}}\n",
                to_si(94.0, "°F", "°C"),
                to_si(75.0, "°F", "°C")
            );
        } else {
            s += "  elevation 1_250 ft\n  cooling 94 °F db, 75 °F wb\n}\n";
        }
        s += "zone z {\n";
        for (k, v, ip, siu) in zone {
            if si {
                s += &format!("  {k} {} {siu}\n", to_si(v, ip, siu));
            } else {
                s += &format!("  {k} {v} {ip}\n");
            }
        }
        s += "}\nahu a {\n  serves z\n";
        for (k, v, ip, siu) in ahu {
            if si {
                s += &format!("  {k} {} {siu}\n", to_si(v, ip, siu));
            } else {
                s += &format!("  {k} {v} {ip}\n");
            }
        }
        if si {
            s += &format!(
                "  outdoor_air {} L/s\n  fan {{ static {} Pa with efficiency 62 % }}\n  coil {{ rated {} kW }}\n}}\n",
                to_si(1_200.0, "cfm", "L/s"),
                to_si(2.5, "in.wg", "Pa"),
                to_si(12.5, "ton", "kW")
            );
        } else {
            s += "  outdoor_air 1_200 cfm\n  fan { static 2.5 in.wg with efficiency 62 % }\n  coil { rated 12.5 ton }\n}\n";
        }
        s
    };
    let ip = lower(&write(false));
    let si = lower(&write(true));
    let zi = &ip.zones[0];
    let zs = &si.zones[0];
    let pairs = [
        (zi.area_ft2.unwrap().value, zs.area_ft2.unwrap().value),
        (
            zi.sensible_btuh.unwrap().value,
            zs.sensible_btuh.unwrap().value,
        ),
        (zi.latent_btuh.unwrap().value, zs.latent_btuh.unwrap().value),
        (
            ip.site.as_ref().unwrap().elevation_ft.unwrap().value,
            si.site.as_ref().unwrap().elevation_ft.unwrap().value,
        ),
    ];
    for (a, b) in pairs {
        assert!(close(a, b, 1e-9), "{a} vs {b}");
    }
    let (ai, asi) = (&ip.ahus[0], &si.ahus[0]);
    let f = |s: SupplyTemp| match s {
        SupplyTemp::Temp { f } => f,
        SupplyTemp::BelowRoom { dt_f } => dt_f,
    };
    assert!(close(
        f(ai.supply.unwrap().value),
        f(asi.supply.unwrap().value),
        1e-9
    ));
    let oa = |o: OutdoorAir| match o {
        OutdoorAir::Airflow { cfm } => cfm,
        _ => f64::NAN,
    };
    assert!(close(
        oa(ai.outdoor_air.unwrap().value),
        oa(asi.outdoor_air.unwrap().value),
        1e-9
    ));
    assert!(close(
        ai.coil.as_ref().unwrap().rated_btuh.unwrap().value,
        asi.coil.as_ref().unwrap().rated_btuh.unwrap().value,
        1e-9
    ));
    match (
        ai.fan.as_ref().unwrap().power.unwrap().value,
        asi.fan.as_ref().unwrap().power.unwrap().value,
    ) {
        (FanPower::Static { in_wg: a, .. }, FanPower::Static { in_wg: b, .. }) => {
            assert!(close(a, b, 1e-9))
        }
        other => panic!("{other:?}"),
    }
    let (ci, cs) = (
        ip.site.as_ref().unwrap().cooling.unwrap().value,
        si.site.as_ref().unwrap().cooling.unwrap().value,
    );
    match (ci, cs) {
        (AirSpec::DbWb { db_f: a, wb_f: b }, AirSpec::DbWb { db_f: c, wb_f: d }) => {
            assert!(close(a, c, 1e-9) && close(b, d, 1e-9))
        }
        other => panic!("{other:?}"),
    }
    assert_eq!(ip.project.units, None);
    let _ = UnitSystem::Si;
}

fn memory(files: &[(&str, &str)]) -> MemoryFs {
    let mut fs = MemoryFs::new();
    fs.insert("/p/plenum.toml", "");
    for (path, text) in files {
        fs.insert(format!("/p/{path}"), *text);
    }
    fs
}

fn build(fs: &MemoryFs, path: &str) -> Model {
    let full = format!("/p/{path}");
    let text = String::from_utf8(fs.read(Path::new(&full)).unwrap()).unwrap();
    Model::build(fs, Path::new(&full), text)
}

fn codes(m: &Model) -> Vec<&'static str> {
    m.diagnostics.iter().map(|d| d.code.code()).collect()
}

#[test]
fn names_resolve_across_used_files() {
    let fs = memory(&[
        (
            "main.plenum",
            "use \"zones/east.plenum\"\nuse \"site.plenum\"\nahu a { serves office, lab }\n",
        ),
        (
            "zones/east.plenum",
            "use \"../site.plenum\"\nzone office { sensible 1 kW }\nzone lab like office {}\n",
        ),
        ("site.plenum", "site { cooling 90 °F db, 72 °F wb }\n"),
    ]);
    let m = build(&fs, "main.plenum");
    assert!(m.diagnostics.is_empty(), "{:#?}", m.diagnostics);
    assert_eq!(m.files.len(), 3, "a file used twice is read once");
    assert_eq!(m.design.ahus[0].serves.len(), 2);
    // Go-to-definition data: `office` in `serves` refers to the zone in east.plenum.
    let office = m
        .symbols
        .defs
        .iter()
        .position(|d| d.name == "office")
        .unwrap();
    assert_eq!(m.symbols.references(office).count(), 2); // `serves` and `like`
}

#[test]
fn use_problems_are_reported_at_the_use() {
    let fs = memory(&[
        (
            "a.plenum",
            "use \"b.plenum\"\nuse \"missing.plenum\"\nuse \"../outside.plenum\"\nuse \"/etc/x.plenum\"\n",
        ),
        ("b.plenum", "use \"a.plenum\"\n"),
    ]);
    let m = build(&fs, "a.plenum");
    assert_eq!(
        codes(&m),
        vec![
            "use-not-found",
            "use-outside-project",
            "use-outside-project",
            "use-cycle"
        ],
        "{:#?}",
        m.diagnostics
    );
    let cycle = m
        .diagnostics
        .iter()
        .find(|d| d.code == ModelCode::UseCycle)
        .unwrap();
    assert!(
        cycle
            .message
            .contains("a.plenum → /p/b.plenum → /p/a.plenum"),
        "{}",
        cycle.message
    );
}

#[test]
fn project_root_is_the_folder_with_plenum_toml() {
    let mut fs = MemoryFs::new();
    fs.insert("/w/campus/plenum.toml", "");
    fs.insert(
        "/w/campus/east/main.plenum",
        "use \"../shared.plenum\"\nuse \"../../outside.plenum\"\n",
    );
    fs.insert("/w/campus/shared.plenum", "let x = 1 kW\n");
    fs.insert("/w/outside.plenum", "let y = 1 kW\n");
    let text = "use \"../shared.plenum\"\nuse \"../../outside.plenum\"\n".to_string();
    let m = Model::build(&fs, Path::new("/w/campus/east/main.plenum"), text);
    assert_eq!(m.project_root, Path::new("/w/campus"));
    assert_eq!(codes(&m), vec!["use-outside-project"]);
}

/// Hover's record of properties holds each written property once, with its
/// quantity, however many `like` blocks inherit it.
#[test]
fn an_inherited_property_is_recorded_once_for_hover() {
    let text = "site { cooling 94 °F db, 75 °F wb }\n\
                zone a { area 100 ft²; sensible 2 kBtu/h }\n\
                zone b like a {}\n\
                zone c like a { area 200 ft² }\n\
                zone d like b {}\n\
                ahu u { serves a, b, c, d }\n";
    let model = Model::build(&MemoryFs::new(), Path::new("d.plenum"), text.to_string());
    assert!(model.diagnostics.is_empty(), "{:#?}", model.diagnostics);
    let areas: Vec<_> = model
        .properties
        .iter()
        .filter(|p| p.def.name == "area")
        .collect();
    assert_eq!(areas.len(), 2, "{areas:#?}");
    assert!(areas.iter().all(|p| p.quantity.is_some()));
    let mut locs: Vec<_> = model.properties.iter().map(|p| p.loc).collect();
    let n = locs.len();
    locs.sort();
    locs.dedup();
    assert_eq!(locs.len(), n, "every property once");
}

/// Long `let` and `like` chains are resolved with an explicit stack, parents
/// first: 3,000 links lower on a thread with only 1 MiB of stack (found by
/// fuzzing with hand-built inputs: one recursion per link overflowed 8 MiB
/// at 5,000 lets and 10,000 zones).
#[test]
fn long_let_and_like_chains_need_no_deep_stack() {
    let n = 3_000;
    let mut text = String::from("site { cooling 94 °F db, 75 °F wb }\n");
    for i in 0..n {
        text.push_str(&format!("let v{i} = v{} + 1 W\n", i + 1));
    }
    text.push_str(&format!("let v{n} = 1 W\n"));
    for i in 0..n {
        text.push_str(&format!("zone z{i} like z{} {{}}\n", i + 1));
    }
    text.push_str(&format!("zone z{n} {{ sensible v0 }}\n"));
    let handle = std::thread::Builder::new()
        .stack_size(1 << 20)
        .spawn(move || lower_text(&text))
        .unwrap();
    let (design, diags) = handle.join().expect("no stack overflow");
    assert!(diags.is_empty(), "{:#?}", &diags[..diags.len().min(3)]);
    // Every zone inherits the last one's load: v0 = 3,001 W.
    let first = design.zone_by_name("z0").unwrap();
    assert!(close(
        first.sensible_btuh.unwrap().value,
        3_001.0 / 0.293_071_07,
        1e-9
    ));
}
