//! The engine against the independent Python reference
//! (`tests/reference/coil/`, psychrolib 2.5.0, written from methods.md only),
//! with each `Design` built by hand from the reference's own resolved inputs.
//!
//! Until the design files can be lowered by `plenum-model`, this test builds
//! each case's `Design` from two committed files: `cases/<case>.json` says
//! which keys the designer wrote (a key not written stays `None`, so the
//! engine applies its own default), and `expected/<case>.json` gives each
//! written value already converted to IP (its `zones` and `inputs`, rounded
//! to 7 significant digits, which moves results by about 1e-7). Every
//! headline number of every air handler and design state is then compared:
//! 0.5 % on flows and loads, 0.2 °F on states (the tolerances).

mod common;

use plenum_engine::evaluate;
use plenum_model::*;
use serde_json::Value;

use common::{Worst, case_names, num, read_json, reference_dir};

fn loc() -> Loc {
    Loc {
        file: FileId(0),
        span: Default::default(),
    }
}

fn at<T>(v: T) -> At<T> {
    At::new(v, loc())
}

/// The keys written for a zone, `like` applied (the parent's, then its own).
fn zone_keys(case: &Value, name: &str, depth: usize) -> Vec<String> {
    let zones = case["zones"].as_array().cloned().unwrap_or_default();
    let Some(z) = zones.iter().find(|z| z["name"].as_str() == Some(name)) else {
        return Vec::new();
    };
    let mut keys = match (z["like"].as_str(), depth < 10) {
        (Some(parent), true) => zone_keys(case, parent, depth + 1),
        _ => Vec::new(),
    };
    if let Some(obj) = z["keys"].as_object() {
        keys.extend(obj.keys().cloned());
    }
    keys
}

fn some_if<T>(written: bool, v: T) -> Option<At<T>> {
    written.then(|| at(v))
}

fn design(case: &Value, exp: &Value) -> Result<Design, String> {
    let site_in = &case["site"];
    let site_out = &exp["site"];
    let spec = |s: &Value| -> Option<At<AirSpec>> {
        Some(at(AirSpec::DbW {
            db_f: num(s, "tdb_f")?,
            w: num(s, "w_lb_lb")?,
        }))
    };
    let site = Site {
        loc: loc(),
        elevation_ft: site_in
            .get("elevation")
            .and_then(|_| num(site_out, "elevation_ft"))
            .map(at),
        pressure_psia: site_in
            .get("pressure")
            .and_then(|_| num(site_out, "pressure_psia"))
            .map(at),
        cooling: spec(&site_out["cooling"]),
        dehumid: if site_out["dehumid"].is_null() {
            None
        } else {
            spec(&site_out["dehumid"])
        },
    };
    let mut zones = Vec::new();
    let zlist = exp["zones"].as_array().ok_or("no zones")?;
    for (i, z) in zlist.iter().enumerate() {
        let name = z["name"].as_str().ok_or("zone name")?.to_string();
        let keys = zone_keys(case, &name, 0);
        let has = |k: &str| keys.iter().any(|x| x == k);
        let n = |k: &str| num(z, k).unwrap_or(f64::NAN);
        zones.push(Zone {
            id: ZoneId(i as u32),
            name,
            label: z["label"].as_str().map(str::to_string),
            loc: loc(),
            name_loc: loc(),
            area_ft2: some_if(has("area"), n("area_ft2")),
            people: some_if(has("people"), n("people")),
            category: z["use"].as_str().map(|s| at(s.to_string())),
            indoor: some_if(
                has("indoor"),
                AirSpec::DbW {
                    db_f: n("indoor_tdb_f"),
                    w: n("indoor_w_lb_lb"),
                },
            ),
            sensible_btuh: some_if(has("sensible"), n("sensible_btu_h")),
            latent_btuh: some_if(has("latent"), n("latent_btu_h")),
            distribution_effectiveness: some_if(
                has("distribution_effectiveness"),
                n("distribution_effectiveness"),
            ),
        });
    }
    let zone_id =
        |name: &str| -> Option<ZoneId> { zones.iter().find(|z| z.name == name).map(|z| z.id) };
    let mut ahus = Vec::new();
    let cases_ahus = case["ahus"].as_array().ok_or("no ahus")?;
    for (a_in, a_out) in cases_ahus
        .iter()
        .zip(exp["air_handlers"].as_array().ok_or("ahus")?)
    {
        let k = &a_in["keys"];
        let has = |key: &str| k.get(key).is_some();
        let inp = &a_out["inputs"];
        let n = |key: &str| num(inp, key).unwrap_or(f64::NAN);
        let serves = a_out["serves"]
            .as_array()
            .ok_or("serves")?
            .iter()
            .filter_map(|s| zone_id(s.as_str()?))
            .map(at)
            .collect();
        let served: Vec<f64> = a_out["serves"]
            .as_array()
            .ok_or("serves")?
            .iter()
            .filter_map(|s| zlist.iter().find(|z| z["name"] == *s))
            .filter_map(|z| num(z, "indoor_tdb_f"))
            .collect();
        let tr_min = served.iter().copied().fold(f64::INFINITY, f64::min);
        let supply = if has("supply_temp") {
            Some(at(SupplyTemp::Temp {
                f: n("supply_temp_f"),
            }))
        } else if has("supply_dt") {
            Some(at(SupplyTemp::BelowRoom {
                dt_f: tr_min - n("supply_temp_f"),
            }))
        } else {
            None
        };
        let supply_duct = if has("supply_duct_rise") {
            Some(at(SupplyDuct::Rise {
                dt_f: n("supply_duct_rise_f"),
            }))
        } else if has("supply_duct") {
            Some(at(SupplyDuct::Length {
                ft: n("supply_duct_rise_f") / 1.5 * 100.0,
            }))
        } else {
            None
        };
        let return_duct = if has("return_duct_rise") {
            Some(at(ReturnDuct::Rise {
                dt_f: n("return_duct_rise_f"),
            }))
        } else if k["return_duct"].as_str() == Some("none") {
            Some(at(ReturnDuct::None))
        } else if has("return_duct") {
            Some(at(ReturnDuct::Length {
                ft: n("return_duct_rise_f") * 100.0,
            }))
        } else {
            None
        };
        let oa_value = num(inp, "outdoor_air_value").unwrap_or(f64::NAN);
        let outdoor_air = match inp["outdoor_air_form"].as_str() {
            Some("ventilation") => OutdoorAir::Ventilation,
            Some("airflow") => OutdoorAir::Airflow { cfm: oa_value },
            Some("fraction") => OutdoorAir::FractionOfSupply { fraction: oa_value },
            Some("per_person") => OutdoorAir::PerPerson { cfm: oa_value },
            Some("per_area") => OutdoorAir::PerArea {
                cfm_per_ft2: oa_value,
            },
            Some("doas") => OutdoorAir::All,
            other => return Err(format!("outdoor_air_form {other:?}")),
        };
        let ventilation_efficiency = match &inp["ventilation_efficiency"] {
            Value::String(s) if s == "simplified" => VentilationEfficiency::Simplified,
            Value::String(s) if s == "calculated" => VentilationEfficiency::Calculated,
            v => VentilationEfficiency::Given {
                ev: v.as_f64().unwrap_or(f64::NAN),
            },
        };
        let fin = &inp["fan"];
        let fk = &k["fan"];
        let fan = if has("fan") {
            let fhas = |key: &str| fk.get(key).is_some();
            let fnum = |key: &str| num(fin, key).unwrap_or(f64::NAN);
            Some(Fan {
                loc: loc(),
                power: if fhas("power") {
                    Some(at(FanPower::Shaft {
                        hp: fnum("shaft_power_bhp"),
                    }))
                } else if fhas("static") {
                    Some(at(FanPower::Static {
                        in_wg: fnum("static_in_wg"),
                        efficiency: fnum("fan_efficiency"),
                    }))
                } else {
                    None
                },
                rise_f: some_if(fhas("rise"), fnum("rise_f")),
                motor_efficiency: some_if(fhas("motor_efficiency"), fnum("motor_efficiency")),
                motor: some_if(
                    fhas("motor"),
                    if fin["motor"] == "outside" {
                        MotorLocation::Outside
                    } else {
                        MotorLocation::InAirstream
                    },
                ),
                arrangement: some_if(
                    fhas("arrangement"),
                    if fin["arrangement"] == "blow_through" {
                        FanArrangement::BlowThrough
                    } else {
                        FanArrangement::DrawThrough
                    },
                ),
            })
        } else {
            None
        };
        let cin = &inp["coil"];
        let ck = &k["coil"];
        let coil = if has("coil") {
            let chas = |key: &str| ck.get(key).is_some();
            let cnum = |key: &str| num(cin, key).unwrap_or(f64::NAN);
            Some(Coil {
                loc: loc(),
                leaving_rh: some_if(chas("leaving_rh"), cnum("leaving_rh")),
                rated_btuh: some_if(chas("rated"), cnum("rated_btu_h")),
                rated_sensible_btuh: some_if(chas("rated_sensible"), cnum("rated_sensible_btu_h")),
                chilled_water: some_if(
                    chas("chilled_water"),
                    (
                        cnum("chilled_water_supply_f"),
                        cnum("chilled_water_return_f"),
                    ),
                ),
                face_area_ft2: some_if(chas("face_area"), cnum("face_area_ft2")),
            })
        } else {
            None
        };
        ahus.push(Ahu {
            name: a_out["name"].as_str().ok_or("ahu name")?.to_string(),
            label: None,
            loc: loc(),
            name_loc: loc(),
            serves,
            supply,
            diversity: some_if(has("diversity"), n("diversity")),
            supply_duct,
            return_duct,
            plenum_gain_btuh: some_if(has("plenum_gain"), n("plenum_gain_btu_h")),
            fan,
            outdoor_air: some_if(has("outdoor_air"), outdoor_air),
            occupant_diversity: some_if(has("occupant_diversity"), n("occupant_diversity")),
            ventilation_efficiency: some_if(has("ventilation_efficiency"), ventilation_efficiency),
            outdoor_fan_rise_f: some_if(has("outdoor_fan_rise"), n("outdoor_fan_rise_f")),
            coil,
        });
    }
    Ok(Design {
        project: Project::default(),
        site: Some(site),
        zones,
        ahus,
    })
}

/// Every reference case, every air handler, every design state, every
/// headline number (reference: tests/reference/coil, psychrolib 2.5.0).
#[test]
fn every_reference_case_from_its_resolved_inputs() {
    let dir = reference_dir();
    let names = case_names();
    assert!(names.len() >= 9, "reference cases found: {names:?}");
    let mut worst = Worst::default();
    for name in &names {
        let case = read_json(&dir.join("cases").join(format!("{name}.json")));
        let exp = read_json(&dir.join("expected").join(format!("{name}.json")));
        let (case, exp) = match (case, exp) {
            (Ok(c), Ok(e)) => (c, e),
            (c, e) => panic!("{name}: {:?} {:?}", c.err(), e.err()),
        };
        let d = match design(&case, &exp) {
            Ok(d) => d,
            Err(e) => panic!("{name}: {e}"),
        };
        let eval = evaluate(&d);
        let site = eval.site.as_ref().map_err(|e| format!("{e:?}"));
        match site {
            Ok(s) => worst.rel(
                "site pressure_psia",
                name,
                s.pressure_psia,
                num(&exp, "site.pressure_psia").unwrap_or(f64::NAN),
                0.0,
            ),
            Err(e) => panic!("{name}: site {e}"),
        }
        let want_ahus = exp["air_handlers"].as_array().cloned().unwrap_or_default();
        assert_eq!(eval.ahus.len(), want_ahus.len(), "{name}");
        for (outcome, want) in eval.ahus.iter().zip(&want_ahus) {
            match &outcome.result {
                Ok(r) => {
                    let zname =
                        |i: usize| d.zones.get(i).map(|z| z.name.clone()).unwrap_or_default();
                    common::compare_ahu(&mut worst, name, r, want, &zname);
                }
                Err(e) => worst
                    .failures
                    .push(format!("{name}/{}: {e:?}", outcome.name)),
            }
        }
    }
    println!(
        "{} comparisons over {} cases\n{}",
        worst.compared,
        names.len(),
        worst.report()
    );
    assert!(
        worst.failures.is_empty(),
        "{} mismatches:\n{}",
        worst.failures.len(),
        worst.failures.join("\n")
    );
}
