//! The chart model rendered as one self-contained SVG document.
//!
//! A small writer of our own: the document is a few hundred elements of
//! five kinds (path, line, circle, rect, text) styled by one `<style>`
//! block, so a string builder with attribute escaping is all it needs.

use std::fmt::Write as _;

use crate::geom::Pt;
use crate::layout;
use crate::model::{Chart, CurveOf, LegKind};
use crate::style::{self as st, WIDTH};
use crate::text;

/// A number for an attribute: at most two decimals, no trailing zeros, and
/// never NaN or infinity (the model is checked finite; this is the last guard).
fn n(v: f64) -> String {
    if !v.is_finite() {
        return "0".to_string();
    }
    let s = format!("{v:.2}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" || s.is_empty() {
        "0".to_string()
    } else {
        s.to_string()
    }
}

/// Escape text for an element's content or a double-quoted attribute.
pub(crate) fn esc(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    for c in s.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&apos;"),
            c if (c as u32) < 0x20 && c != '\n' && c != '\t' => {}
            c => out.push(c),
        }
    }
    out
}

fn path_d(points: &[Pt]) -> String {
    let mut d = String::with_capacity(points.len() * 14);
    for (i, p) in points.iter().enumerate() {
        let _ = write!(d, "{}{},{}", if i == 0 { "M" } else { "L" }, n(p.x), n(p.y));
    }
    d
}

fn css() -> String {
    format!(
        "
.panel{{fill:{paper};stroke:{rule};stroke-width:1}}
.sheet{{fill:{sheet};stroke:{rule};stroke-width:.8}}
.grid{{fill:none;stroke:{grid};stroke-width:.8}}
.rh{{fill:none;stroke:{rh};stroke-width:.9}}
.enthalpy{{fill:none;stroke:{enth};stroke-width:.9;stroke-dasharray:5 3}}
.sat{{fill:none;stroke:{sat};stroke-width:2.4;stroke-linejoin:round}}
.axis{{fill:none;stroke:{ink};stroke-width:1}}
.leg{{fill:none;stroke-width:2.2;stroke-linecap:round}}
.mix{{stroke:{mix}}}
.heat{{stroke:{heat}}}
.room{{stroke:{room}}}
.coil{{stroke:{coil};stroke-width:3}}
.adp{{stroke-width:1.8;stroke-dasharray:6 4}}
.rhs{{stroke:{rh};stroke-width:1.4}}
.enths{{stroke:{enth};stroke-width:1.4;stroke-dasharray:5 3}}
.arrow-mix{{fill:{mix}}}
.arrow-heat{{fill:{heat}}}
.arrow-coil{{fill:{coil}}}
.arrow-room{{fill:{room}}}
.marker{{fill:{marker};stroke:#ffffff;stroke-width:1.6}}
.adp-marker{{fill:{sheet};stroke:{coil};stroke-width:2}}
.leader{{stroke:{muted};stroke-width:.8}}
.lbox{{fill:#ffffff;fill-opacity:.93;stroke:{rule};stroke-width:.8}}
.ltext{{font-size:{label}px;fill:{ink}}}
.lname{{font-weight:700}}
.tick{{font-size:{small}px;fill:{muted}}}
.atitle{{font-size:12px;font-weight:700;fill:{ink}}}
.rhl{{font-size:{small}px;fill:{rht};paint-order:stroke;stroke:{sheet};stroke-width:3px;stroke-linejoin:round}}
.hl{{font-size:{small}px;fill:{enthtext}}}
.heading{{font-size:{heading}px;font-weight:700;fill:{ink}}}
.sub{{font-size:{sub}px;fill:{ink}}}
.legend{{font-size:11px;fill:{ink}}}
.th{{font-size:11px;font-weight:700;fill:{muted}}}
.td{{font-size:{table}px;fill:{ink}}}
.stripe{{fill:#efece3}}
.caution{{font-size:{fine}px;font-style:italic;fill:{muted}}}
",
        paper = st::PAPER,
        rule = st::RULE,
        sheet = st::SHEET,
        grid = st::GRID,
        rh = st::RH,
        enth = st::ENTHALPY,
        sat = st::SATURATION,
        ink = st::INK,
        mix = st::MIXING,
        heat = st::HEAT,
        room = st::ROOM,
        coil = st::COIL,
        marker = st::MARKER,
        muted = st::MUTED,
        label = st::LABEL_SIZE,
        small = st::SMALL_SIZE,
        rht = st::RH_TEXT,
        enthtext = st::ENTHALPY_TEXT,
        heading = st::HEADING_SIZE,
        sub = st::SUBTITLE_SIZE,
        table = st::TABLE_SIZE,
        fine = st::FINE_SIZE,
    )
}

/// Render the chart as an SVG document (UTF-8 text, no external references).
pub fn render(c: &Chart) -> String {
    let f = &c.frame;
    let h = c.height;
    let mut s = String::with_capacity(64 * 1024);
    let _ = writeln!(
        s,
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{w}\" height=\"{hh}\" \
         viewBox=\"0 0 {w} {hh}\" role=\"img\" aria-labelledby=\"chart-title chart-desc\" \
         font-family=\"{font}\">",
        w = n(WIDTH),
        hh = n(h),
        font = esc(st::FONT_STACK),
    );
    let _ = writeln!(
        s,
        "<title id=\"chart-title\">Psychrometric chart: {}</title>",
        esc(&c.title.heading)
    );
    let desc: Vec<String> = c
        .markers
        .iter()
        .map(|m| format!("{} {}", m.name, m.values))
        .collect();
    let _ = writeln!(
        s,
        "<desc id=\"chart-desc\">{}. {}. States: {}.</desc>",
        esc(&c.title.lines.join(". ")),
        esc(&c.title.caution),
        esc(&desc.join("; "))
    );
    let _ = writeln!(s, "<style>{}</style>", css());
    let _ = writeln!(
        s,
        "<rect class=\"panel\" x=\"0.5\" y=\"0.5\" width=\"{}\" height=\"{}\" rx=\"10\"/>",
        n(WIDTH - 1.0),
        n(h - 1.0)
    );

    // Title block.
    let _ = writeln!(s, "<g id=\"title\">");
    let _ = writeln!(
        s,
        "<text class=\"heading\" x=\"{}\" y=\"{}\">{}</text>",
        n(st::MARGIN),
        n(st::MARGIN + 18.0),
        esc(&c.title.heading)
    );
    for (i, line) in c.title.lines.iter().enumerate() {
        let _ = writeln!(
            s,
            "<text class=\"sub\" x=\"{}\" y=\"{}\">{}</text>",
            n(st::MARGIN),
            n(layout::title_baseline(i)),
            esc(line)
        );
    }
    let _ = writeln!(
        s,
        "<text class=\"caution\" x=\"{}\" y=\"{}\">{}</text>",
        n(st::MARGIN),
        n(layout::caution_baseline(c)),
        esc(&c.title.caution)
    );
    let _ = writeln!(s, "</g>");

    // The air domain: below saturation, inside the axes.
    let p = f.plot;
    let mut sheet: Vec<Pt> = vec![Pt::new(p.x0, p.y1)];
    sheet.extend(c.saturation.iter().map(|q| f.to_page(*q)));
    if let Some(last) = sheet.last().copied()
        && last.x < p.x1 - 1e-6
    {
        sheet.push(Pt::new(p.x1, p.y0));
    }
    sheet.push(Pt::new(p.x1, p.y1));
    let _ = writeln!(s, "<g id=\"plot\">");
    let _ = writeln!(s, "<path class=\"sheet\" d=\"{}Z\"/>", path_d(&sheet));

    let _ = writeln!(s, "<g id=\"grid\" class=\"grid\">");
    for g in c.db_grid.iter().chain(&c.w_grid) {
        let (a, b) = (f.to_page(g.from), f.to_page(g.to));
        let _ = writeln!(
            s,
            "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\"/>",
            n(a.x),
            n(a.y),
            n(b.x),
            n(b.y)
        );
    }
    let _ = writeln!(s, "</g>");

    let _ = writeln!(s, "<g id=\"enthalpy-lines\" class=\"enthalpy\">");
    for e in &c.enthalpy_lines {
        let pts: Vec<Pt> = e.points.iter().map(|q| f.to_page(*q)).collect();
        let _ = writeln!(s, "<path data-h=\"{}\" d=\"{}\"/>", n(e.h), path_d(&pts));
    }
    let _ = writeln!(s, "</g>");

    let _ = writeln!(s, "<g id=\"rh-curves\" class=\"rh\">");
    for r in &c.rh_curves {
        let pts: Vec<Pt> = r.points.iter().map(|q| f.to_page(*q)).collect();
        let _ = writeln!(
            s,
            "<path data-rh=\"{}\" d=\"{}\"/>",
            r.percent,
            path_d(&pts)
        );
    }
    let _ = writeln!(s, "</g>");

    let sat: Vec<Pt> = c.saturation.iter().map(|q| f.to_page(*q)).collect();
    let _ = writeln!(
        s,
        "<path id=\"saturation\" class=\"sat\" d=\"{}\"/>",
        path_d(&sat)
    );

    // Axes: the dry-bulb axis at the foot, the humidity-ratio axis at the right.
    let _ = writeln!(
        s,
        "<path class=\"axis\" d=\"M{},{}L{},{}L{},{}\"/>",
        n(p.x0),
        n(p.y1),
        n(p.x1),
        n(p.y1),
        n(p.x1),
        n(p.y0)
    );
    let _ = writeln!(s, "</g>");

    let _ = writeln!(s, "<g id=\"axes\">");
    for &t in &c.x.ticks {
        let q = f.to_page(Pt::new(t, f.y.0));
        let _ = writeln!(
            s,
            "<line class=\"axis\" x1=\"{x}\" y1=\"{}\" x2=\"{x}\" y2=\"{}\"/>\
             <text class=\"tick\" x=\"{x}\" y=\"{}\" text-anchor=\"middle\">{}</text>",
            n(q.y),
            n(q.y + 4.0),
            n(q.y + layout::X_TICKS_DY),
            esc(&format!("{:.*}", c.x.decimals, t)),
            x = n(q.x),
        );
    }
    for &w in &c.y.ticks {
        let q = f.to_page(Pt::new(f.x.1, w));
        let _ = writeln!(
            s,
            "<line class=\"axis\" x1=\"{}\" y1=\"{y}\" x2=\"{}\" y2=\"{y}\"/>\
             <text class=\"tick\" x=\"{}\" y=\"{}\">{}</text>",
            n(q.x),
            n(q.x + 4.0),
            n(q.x + 7.0),
            n(q.y + 3.5),
            esc(&format!("{:.*}", c.y.decimals, w)),
            y = n(q.y),
        );
    }
    let _ = writeln!(
        s,
        "<text class=\"atitle\" x=\"{}\" y=\"{}\" text-anchor=\"middle\">{}</text>",
        n((p.x0 + p.x1) / 2.0),
        n(p.y1 + layout::X_TITLE_DY),
        esc(&c.x.title)
    );
    let (yx, yy) = (p.x1 + 46.0, (p.y0 + p.y1) / 2.0);
    let _ = writeln!(
        s,
        "<text class=\"atitle\" x=\"{x}\" y=\"{y}\" text-anchor=\"middle\" \
         transform=\"rotate(-90 {x} {y})\">{}</text>",
        esc(&c.y.title),
        x = n(yx),
        y = n(yy),
    );
    let _ = writeln!(s, "</g>");

    // The process.
    let _ = writeln!(s, "<g id=\"process\">");
    for l in &c.legs {
        let (a, b) = (f.to_page(l.from), f.to_page(l.to));
        let _ = writeln!(
            s,
            "<line class=\"leg {}\" data-leg=\"{}\" x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\"/>",
            l.kind.class(),
            leg_key(l.kind),
            n(a.x),
            n(a.y),
            n(b.x),
            n(b.y)
        );
        if l.kind != LegKind::CoilToAdp {
            arrow(&mut s, a, b, l.kind.class());
        }
    }
    let _ = writeln!(s, "</g>");

    let _ = writeln!(s, "<g id=\"states\">");
    if let Some(a) = &c.adp {
        let q = f.to_page(a.at);
        let _ = writeln!(
            s,
            "<circle class=\"adp-marker\" data-state=\"adp\" cx=\"{}\" cy=\"{}\" r=\"{}\"/>",
            n(q.x),
            n(q.y),
            n(st::MARKER_R - 1.0)
        );
    }
    for m in &c.markers {
        let q = f.to_page(m.at);
        let keys: Vec<&str> = m.kinds.iter().map(|k| state_key(*k)).collect();
        let _ = writeln!(
            s,
            "<circle class=\"marker\" data-state=\"{}\" cx=\"{}\" cy=\"{}\" r=\"{}\"/>",
            keys.join(" "),
            n(q.x),
            n(q.y),
            n(st::MARKER_R)
        );
    }
    let _ = writeln!(s, "</g>");

    let _ = writeln!(s, "<g id=\"curve-labels\">");
    for l in &c.curve_labels {
        let class = match l.of {
            CurveOf::Rh(_) => "rhl",
            CurveOf::Enthalpy(_) => "hl",
        };
        let _ = writeln!(
            s,
            "<text class=\"{class}\" x=\"{}\" y=\"{}\" text-anchor=\"middle\">{}</text>",
            n((l.rect.x0 + l.rect.x1) / 2.0),
            n(l.rect.y1 - l.rect.height() * 0.24),
            esc(&l.text)
        );
    }
    let _ = writeln!(s, "</g>");

    let _ = writeln!(s, "<g id=\"labels\">");
    for l in &c.labels {
        if let Some((a, b)) = l.leader {
            let _ = writeln!(
                s,
                "<line class=\"leader\" x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\"/>",
                n(a.x),
                n(a.y),
                n(b.x),
                n(b.y)
            );
        }
        let r = l.rect;
        let _ = writeln!(
            s,
            "<rect class=\"lbox\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" rx=\"3\"/>",
            n(r.x0),
            n(r.y0),
            n(r.width()),
            n(r.height()),
        );
        let (x, y) = (r.x0 + 5.0, r.y0 + 14.9);
        if l.stacked {
            let _ = writeln!(
                s,
                "<text class=\"ltext\" x=\"{x}\" y=\"{y}\"><tspan class=\"lname\">{}</tspan>\
                 <tspan x=\"{x}\" y=\"{}\">{}</tspan></text>",
                esc(&l.name),
                n(r.y0 + 14.9 + layout::LABEL_LINE),
                esc(&l.values),
                x = n(x),
                y = n(y),
            );
        } else {
            let _ = writeln!(
                s,
                "<text class=\"ltext\" x=\"{}\" y=\"{}\"><tspan class=\"lname\">{}</tspan> {}</text>",
                n(x),
                n(y),
                esc(&l.name),
                esc(&l.values)
            );
        }
    }
    let _ = writeln!(s, "</g>");

    legend(&mut s, c);
    table(&mut s, c);
    s.push_str("</svg>\n");
    s
}

fn arrow(s: &mut String, a: Pt, b: Pt, class: &str) {
    let len = a.dist(b);
    if len < 26.0 {
        return;
    }
    let u = Pt::new((b.x - a.x) / len, (b.y - a.y) / len);
    let m = Pt::new((a.x + b.x) / 2.0, (a.y + b.y) / 2.0);
    let tip = Pt::new(m.x + u.x * 6.0, m.y + u.y * 6.0);
    let l = Pt::new(m.x - u.x * 5.0 - u.y * 4.5, m.y - u.y * 5.0 + u.x * 4.5);
    let r = Pt::new(m.x - u.x * 5.0 + u.y * 4.5, m.y - u.y * 5.0 - u.x * 4.5);
    let family = class.split(' ').next().unwrap_or(class);
    let _ = writeln!(
        s,
        "<path class=\"arrow-{family}\" d=\"{}Z\"/>",
        path_d(&[tip, l, r])
    );
}

fn legend(s: &mut String, c: &Chart) {
    let y = c.frame.plot.y1 + layout::LEGEND_DY;
    let mut x = st::MARGIN;
    let _ = writeln!(s, "<g id=\"legend\">");
    for e in &c.legend {
        let class = match e.class {
            "rh" => "rhs".to_string(),
            "enthalpy" => "enths".to_string(),
            other => format!("leg {other}"),
        };
        let _ = writeln!(
            s,
            "<line class=\"{class}\" x1=\"{}\" y1=\"{y}\" x2=\"{}\" y2=\"{y}\"/>",
            n(x),
            n(x + 22.0),
            y = n(y - 4.0)
        );
        if e.class == "coil" && e.text.contains("ADP") {
            let _ = writeln!(
                s,
                "<line class=\"leg coil adp\" x1=\"{}\" y1=\"{y}\" x2=\"{}\" y2=\"{y}\"/>",
                n(x + 22.0),
                n(x + 34.0),
                y = n(y - 4.0)
            );
            x += 12.0;
        }
        let _ = writeln!(
            s,
            "<text class=\"legend\" x=\"{}\" y=\"{}\">{}</text>",
            n(x + 28.0),
            n(y),
            esc(&e.text)
        );
        x += 28.0 + text::width(&e.text, 11.0, false) + 20.0;
    }
    let _ = writeln!(s, "</g>");
}

fn table(s: &mut String, c: &Chart) {
    // Right edges of the numeric columns; the state's name is left-aligned.
    const COLS: [f64; 7] = [330.0, 425.0, 520.0, 615.0, 710.0, 805.0, 900.0];
    let top = layout::table_top();
    let _ = writeln!(s, "<g id=\"table\">");
    for (i, h) in c.table.header.iter().enumerate() {
        let (x, anchor) = match i {
            0 => (st::MARGIN + 6.0, "start"),
            _ => (COLS.get(i - 1).copied().unwrap_or(900.0), "end"),
        };
        let _ = writeln!(
            s,
            "<text class=\"th\" x=\"{}\" y=\"{}\" text-anchor=\"{anchor}\">{}</text>",
            n(x),
            n(top),
            esc(h)
        );
    }
    for (r, row) in c.table.rows.iter().enumerate() {
        let y = top + st::ROW_H * (r as f64 + 1.0);
        if r % 2 == 0 {
            let _ = writeln!(
                s,
                "<rect class=\"stripe\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\"/>",
                n(st::MARGIN),
                n(y - st::ROW_H + 5.0),
                n(COLS[6] + 8.0 - st::MARGIN),
                n(st::ROW_H)
            );
        }
        for (i, cell) in row.iter().enumerate() {
            let (x, anchor) = match i {
                0 => (st::MARGIN + 6.0, "start"),
                _ => (COLS.get(i - 1).copied().unwrap_or(900.0), "end"),
            };
            let _ = writeln!(
                s,
                "<text class=\"td\" x=\"{}\" y=\"{}\" text-anchor=\"{anchor}\">{}</text>",
                n(x),
                n(y),
                esc(cell)
            );
        }
    }
    let _ = writeln!(s, "</g>");
}

fn leg_key(k: LegKind) -> &'static str {
    match k {
        LegKind::Mixing => "mixing",
        LegKind::OutdoorFan => "outdoor-fan",
        LegKind::BlowThroughFan => "blow-through-fan",
        LegKind::Coil => "coil",
        LegKind::CoilToAdp => "coil-to-adp",
        LegKind::SupplyHeat => "supply-heat",
        LegKind::RoomLine => "room-line",
        LegKind::ReturnHeat => "return-heat",
    }
}

/// The `data-state` key of a state.
pub fn state_key(k: crate::model::StateKind) -> &'static str {
    use crate::model::StateKind as K;
    match k {
        K::Outdoor => "outdoor",
        K::OutdoorAfterFan => "outdoor-after-fan",
        K::Return => "return",
        K::Mixed => "mixed",
        K::Entering => "entering",
        K::Leaving => "leaving",
        K::Supply => "supply",
        K::Room => "room",
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_and_escapes() {
        assert_eq!(n(1.0), "1");
        assert_eq!(n(1.256), "1.26");
        assert_eq!(n(-0.001), "0");
        assert_eq!(n(f64::NAN), "0");
        assert_eq!(esc("a<b & \"c\""), "a&lt;b &amp; &quot;c&quot;");
    }
}
