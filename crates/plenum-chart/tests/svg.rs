//! The SVG document: well-formed XML (parsed with roxmltree), every element
//! of the model in it at the model's page coordinates, and nothing that is
//! not a number where a number belongs.

#![allow(clippy::unwrap_used)]

mod common;

use plenum_chart::{StateKind, Subject, render_svg, state_key};
use plenum_units::UnitSystem;

fn num(node: roxmltree::Node<'_, '_>, attr: &str) -> f64 {
    node.attribute(attr).unwrap().parse().unwrap()
}

#[test]
fn every_chart_is_well_formed_svg_with_its_parts() {
    for (ex, ahu, units, c) in common::all_charts() {
        let svg = render_svg(c);
        let doc = roxmltree::Document::parse(&svg)
            .unwrap_or_else(|e| panic!("{ex} {ahu} {units:?}: {e}"));
        let root = doc.root_element();
        assert_eq!(root.tag_name().name(), "svg");
        assert_eq!(
            root.tag_name().namespace(),
            Some("http://www.w3.org/2000/svg")
        );
        assert_eq!(num(root, "width"), plenum_chart::style::WIDTH);
        assert!((num(root, "height") - c.height).abs() < 0.01);
        assert!(!svg.contains("NaN"), "{ex} {ahu}: NaN in the SVG");
        for node in doc.descendants().filter(|n| n.is_element()) {
            for attr in [
                "x", "y", "x1", "y1", "x2", "y2", "cx", "cy", "r", "width", "height",
            ] {
                if let Some(v) = node.attribute(attr) {
                    let v: f64 = v.parse().unwrap();
                    assert!(v.is_finite(), "{ex} {ahu}: {attr}");
                }
            }
            if let Some(d) = node.attribute("d") {
                for part in d.split(|c: char| c.is_ascii_alphabetic() || c == ',') {
                    if !part.is_empty() {
                        assert!(part.parse::<f64>().unwrap().is_finite(), "{ex} {ahu}: d");
                    }
                }
            }
        }
        let by_id = |id: &str| {
            doc.descendants()
                .find(|n| n.attribute("id") == Some(id))
                .unwrap_or_else(|| panic!("{ex} {ahu}: no #{id}"))
        };
        let title = doc
            .descendants()
            .find(|n| n.has_tag_name("title"))
            .unwrap()
            .text()
            .unwrap();
        assert!(title.contains(ahu.as_str()));
        assert!(by_id("saturation").attribute("d").unwrap().starts_with('M'));
        assert_eq!(
            by_id("rh-curves")
                .children()
                .filter(|n| n.is_element())
                .count(),
            c.rh_curves.len()
        );
        assert_eq!(
            by_id("enthalpy-lines")
                .children()
                .filter(|n| n.is_element())
                .count(),
            c.enthalpy_lines.len()
        );
        // One process line per leg, in order.
        let legs: Vec<_> = by_id("process")
            .children()
            .filter(|n| n.has_tag_name("line"))
            .collect();
        assert_eq!(legs.len(), c.legs.len());
        for (node, leg) in legs.iter().zip(&c.legs) {
            let a = c.frame.to_page(leg.from);
            let b = c.frame.to_page(leg.to);
            for (attr, v) in [("x1", a.x), ("y1", a.y), ("x2", b.x), ("y2", b.y)] {
                assert!(
                    (num(*node, attr) - v).abs() <= 0.005,
                    "{ex} {ahu} {:?}",
                    leg.kind
                );
            }
        }
        // One disc per marker, at the marker's page coordinates.
        let discs: Vec<_> = doc
            .descendants()
            .filter(|n| n.has_tag_name("circle") && n.attribute("class") == Some("marker"))
            .collect();
        assert_eq!(discs.len(), c.markers.len());
        for m in &c.markers {
            let key: Vec<&str> = m.kinds.iter().map(|k| state_key(*k)).collect();
            let disc = discs
                .iter()
                .find(|d| d.attribute("data-state") == Some(key.join(" ").as_str()))
                .unwrap();
            let p = c.frame.to_page(m.at);
            assert!((num(*disc, "cx") - p.x).abs() <= 0.005);
            assert!((num(*disc, "cy") - p.y).abs() <= 0.005);
        }
        // Every label's text is in the document.
        let texts: Vec<String> = doc
            .descendants()
            .filter(|n| n.has_tag_name("text"))
            .map(|n| {
                n.descendants()
                    .filter(|d| d.is_text())
                    .filter_map(|d| d.text())
                    .collect::<Vec<_>>()
                    .concat()
            })
            .collect();
        for l in &c.labels {
            let want = if l.stacked {
                format!("{}{}", l.name, l.values)
            } else {
                format!("{} {}", l.name, l.values)
            };
            assert!(texts.contains(&want), "{ex} {ahu}: no `{want}`");
        }
        for t in [&c.x.title, &c.y.title, &c.title.heading, &c.title.caution] {
            assert!(texts.contains(t), "{ex} {ahu}: no `{t}`");
        }
        assert!(
            texts
                .iter()
                .any(|t| t == "Dew point, °F" || t == "Dew point, °C")
        );
    }
}

#[test]
fn text_from_the_design_is_escaped() {
    let (_, eval) = common::load("library.plenum");
    let site = eval.site.as_ref().unwrap();
    let ahu = eval.ahus[0].result.as_ref().unwrap();
    let subject = Subject {
        name: "ahu_1",
        label: Some("Tom & Jerry's <\"unit\">"),
        project: Some("A < B"),
    };
    let chart = plenum_chart::build(site, ahu, &subject, UnitSystem::Si).unwrap();
    let svg = render_svg(&chart);
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let heading = doc
        .descendants()
        .find(|n| n.attribute("class") == Some("heading"))
        .unwrap();
    assert_eq!(heading.text(), Some("ahu_1 — Tom & Jerry's <\"unit\">"));
    assert!(svg.contains("A &lt; B"));
}

#[test]
fn rendering_is_deterministic() {
    let (design, eval) = common::load("middle-school.plenum");
    let a = plenum_chart::chart_of(&design, &eval, 0, UnitSystem::Ip).unwrap();
    let b = plenum_chart::chart_of(&design, &eval, 0, UnitSystem::Ip).unwrap();
    assert_eq!(render_svg(&a), render_svg(&b));
    assert!(
        a.markers
            .iter()
            .any(|m| m.kinds.contains(&StateKind::Outdoor))
    );
}
