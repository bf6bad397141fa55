//! Label placement and the vertical layout of the page.
//!
//! The rule is greedy and deterministic. Labels of the states are placed
//! first, in process order, then the apparatus dew point's, then the curve
//! labels. Each state label tries boxes around its marker in eight
//! directions at growing distances and takes the cheapest: a box that
//! leaves the plot, overlaps a label or a marker placed before, or crosses
//! the saturation curve is ruled out; one crossed by a process leg costs
//! more than one a little further away. A box away from its marker gets a
//! leader line. Curve labels then take the first free place along their
//! curve, or are left out: no label is ever drawn over another.

use crate::geom::{Pt, Rect};
use crate::model::{Chart, CurveLabel, CurveOf, Label, LabelOf};
use crate::style;
use crate::text;

/// Inner padding of a state label's box, px.
const PAD_X: f64 = 5.0;
const PAD_Y: f64 = 3.5;
/// Clearance kept between boxes, px.
const CLEAR: f64 = 2.0;

/// Baselines below the plot.
pub const X_TICKS_DY: f64 = 17.0;
/// The dry-bulb axis title.
pub const X_TITLE_DY: f64 = 38.0;
/// The legend.
pub const LEGEND_DY: f64 = 66.0;
/// The table's header.
pub const TABLE_DY: f64 = 100.0;

/// Line height of a state label, px.
pub const LABEL_LINE: f64 = style::LABEL_SIZE * 1.2;

/// The box of a state label: name in bold, a space, the values on one line;
/// or, `stacked`, the name above the values.
pub fn label_size(name: &str, values: &str, stacked: bool) -> (f64, f64) {
    let n = text::width(name, style::LABEL_SIZE, true);
    let v = text::width(values, style::LABEL_SIZE, false);
    if stacked {
        (n.max(v) + 2.0 * PAD_X, 2.0 * LABEL_LINE + 2.0 * PAD_Y)
    } else {
        let w = n + text::width(" ", style::LABEL_SIZE, false) + v;
        (w + 2.0 * PAD_X, LABEL_LINE + 2.0 * PAD_Y)
    }
}

/// Where the table's header sits (baseline).
pub fn table_top() -> f64 {
    style::PLOT_Y1 + TABLE_DY
}

/// The caution's baseline: the last line of the title block, in small print.
pub fn caution_baseline(c: &Chart) -> f64 {
    title_baseline(c.title.lines.len()) - 2.0
}

/// The baseline of title line `i` (0 is the first line under the heading).
pub fn title_baseline(i: usize) -> f64 {
    style::MARGIN + 42.0 + 18.0 * i as f64
}

/// The page height: the table's last row and the margin.
pub fn page_height(c: &Chart) -> f64 {
    table_top() + style::ROW_H * c.table.rows.len() as f64 + style::MARGIN
}

/// A marker's disc.
#[derive(Clone, Copy, Debug)]
struct Disc {
    c: Pt,
    r: f64,
}

impl Disc {
    fn overlaps(&self, rect: &Rect) -> bool {
        rect.nearest(self.c).dist(self.c) < self.r
    }

    fn hits_segment(&self, a: Pt, b: Pt) -> bool {
        let (dx, dy) = (b.x - a.x, b.y - a.y);
        let len2 = dx * dx + dy * dy;
        let t = if len2 > 0.0 {
            (((self.c.x - a.x) * dx + (self.c.y - a.y) * dy) / len2).clamp(0.0, 1.0)
        } else {
            0.0
        };
        Pt::new(a.x + t * dx, a.y + t * dy).dist(self.c) < self.r
    }
}

/// A polyline with the bounding boxes of its runs of points, so that a box
/// far from it is ruled out without testing every segment.
struct Poly {
    pts: Vec<Pt>,
    runs: Vec<(Rect, usize, usize)>,
}

impl Poly {
    const RUN: usize = 16;

    fn new(pts: Vec<Pt>) -> Poly {
        let mut runs = Vec::new();
        let mut i = 0;
        while i + 1 < pts.len() {
            let j = (i + Self::RUN).min(pts.len() - 1);
            let mut b = Rect {
                x0: f64::INFINITY,
                y0: f64::INFINITY,
                x1: f64::NEG_INFINITY,
                y1: f64::NEG_INFINITY,
            };
            for p in &pts[i..=j] {
                b.x0 = b.x0.min(p.x);
                b.y0 = b.y0.min(p.y);
                b.x1 = b.x1.max(p.x);
                b.y1 = b.y1.max(p.y);
            }
            runs.push((b, i, j));
            i = j;
        }
        Poly { pts, runs }
    }

    fn hits(&self, r: &Rect) -> bool {
        self.runs.iter().any(|(b, i, j)| {
            b.x0 <= r.x1
                && r.x0 <= b.x1
                && b.y0 <= r.y1
                && r.y0 <= b.y1
                && r.hits_polyline(&self.pts[*i..=*j])
        })
    }
}

struct Obstacles {
    markers: Vec<Disc>,
    /// The other labels' markers (centres).
    others: Vec<Pt>,
    leaders: Vec<(Pt, Pt)>,
    legs: Vec<(Pt, Pt)>,
    saturation: Poly,
    rh: Vec<Poly>,
    placed: Vec<Rect>,
}

/// Place every label of the chart.
pub fn place(c: &mut Chart) {
    let f = c.frame;
    let mut obs = Obstacles {
        markers: c
            .markers
            .iter()
            .map(|m| Disc {
                c: f.to_page(m.at),
                r: style::MARKER_R + CLEAR,
            })
            .chain(c.adp.iter().map(|a| Disc {
                c: f.to_page(a.at),
                r: style::MARKER_R,
            }))
            .collect(),
        legs: c
            .legs
            .iter()
            .map(|l| (f.to_page(l.from), f.to_page(l.to)))
            .collect(),
        saturation: Poly::new(c.saturation.iter().map(|p| f.to_page(*p)).collect()),
        rh: c
            .rh_curves
            .iter()
            .map(|r| Poly::new(r.points.iter().map(|p| f.to_page(*p)).collect()))
            .collect(),
        placed: Vec::new(),
        leaders: Vec::new(),
        others: Vec::new(),
    };
    let plot = f.plot.inflate(-CLEAR);
    let mut wanted: Vec<(LabelOf, String, String, Pt)> = c
        .markers
        .iter()
        .enumerate()
        .map(|(i, m)| {
            (
                LabelOf::Marker(i),
                m.name.clone(),
                m.values.clone(),
                f.to_page(m.at),
            )
        })
        .collect();
    if let Some(a) = &c.adp {
        let t = plenum_units::Measure::Temperature.format_number_with_unit(a.t, c.units);
        wanted.push((LabelOf::Adp, "ADP".to_string(), t, f.to_page(a.at)));
    }
    // Greedy in several fixed orders, each followed by rounds in which every
    // label in turn is placed again against all the others; the layout of
    // least total cost wins (ties to the earlier order).
    let sizes: Vec<[(f64, f64); 2]> = wanted
        .iter()
        .map(|(_, name, values, _)| {
            [
                label_size(name, values, false),
                label_size(name, values, true),
            ]
        })
        .collect();
    let anchors: Vec<Pt> = wanted.iter().map(|w| w.3).collect();
    let n = wanted.len();
    let mut orders: Vec<Vec<usize>> = vec![(0..n).collect(), (0..n).rev().collect()];
    for key in [|p: &Pt| p.x, |p: &Pt| -p.x, |p: &Pt| p.y, |p: &Pt| -p.y] {
        let mut o: Vec<usize> = (0..n).collect();
        o.sort_by(|&a, &b| key(&anchors[a]).total_cmp(&key(&anchors[b])));
        orders.push(o);
    }
    let mut best: Option<(f64, Vec<Option<Place>>)> = None;
    for order in &orders {
        let boxes = arrange(&anchors, &sizes, order, &plot, &mut obs);
        let total: f64 = (0..n)
            .filter_map(|i| {
                let p = boxes[i]?;
                with_others(&anchors, &boxes, i, &mut obs);
                Some(box_cost(&p, anchors[i], &plot, &obs))
            })
            .sum();
        if best.as_ref().is_none_or(|(b, _)| total < *b) {
            best = Some((total, boxes));
        }
    }
    let boxes = best.map(|(_, b)| b).unwrap_or_else(|| vec![None; n]);
    let mut labels = Vec::new();
    for ((of, name, values, anchor), b) in wanted.into_iter().zip(boxes) {
        let Some(Place {
            rect, gap, stacked, ..
        }) = b
        else {
            continue;
        };
        labels.push(Label {
            of,
            name,
            values,
            rect,
            anchor,
            leader: leader(anchor, &rect, gap),
            stacked,
        });
    }
    obs.placed = labels.iter().map(|l| l.rect).collect();
    obs.leaders.clear();
    // Leaders are obstacles for the curve labels, like the legs.
    obs.legs.extend(labels.iter().filter_map(|l| l.leader));
    c.labels = labels;
    let mut curve_labels = Vec::new();
    for (i, r) in c.rh_curves.iter().enumerate() {
        let text = format!("{} %", r.percent);
        if let Some(rect) = rh_box(&obs.rh[i].pts, &text, i, &plot, &obs) {
            obs.placed.push(rect);
            curve_labels.push(CurveLabel {
                of: CurveOf::Rh(r.percent),
                text,
                rect,
            });
        }
    }
    // Enthalpy labels sit where each line ends at its upper left: just
    // beyond the saturation curve, or outside the plot where the line
    // leaves it at the top or the left edge.
    let page_top = style::PLOT_Y0 - 16.0;
    for e in &c.enthalpy_lines {
        let (Some(first), Some(next)) = (e.points.first(), e.points.get(1)) else {
            continue;
        };
        let text = plenum_units::Measure::Enthalpy
            .format_number(e.h, c.units)
            .trim_end_matches(".00")
            .to_string();
        let w = text::width(&text, style::SMALL_SIZE, false) + 4.0;
        let h = style::SMALL_SIZE * 1.25;
        let (p, q) = (f.to_page(*first), f.to_page(*next));
        let mut options: Vec<(Rect, bool)> = Vec::new();
        if e.on_saturation.is_some() {
            let d = p.dist(q).max(1e-9);
            let u = Pt::new((p.x - q.x) / d, (p.y - q.y) / d);
            for gap in [3.0, 7.0, 12.0] {
                let a = Pt::new(p.x + u.x * gap, p.y + u.y * gap);
                options.push((
                    Rect {
                        x0: a.x - w,
                        y0: a.y - h,
                        x1: a.x,
                        y1: a.y,
                    },
                    true,
                ));
            }
        } else if (first.y - f.y.1).abs() <= 1e-9 * (1.0 + f.y.1.abs()) {
            options.push((Rect::at(p.x - w / 2.0, f.plot.y0 - 2.0 - h, w, h), false));
        } else if (first.x - f.x.0).abs() <= 1e-9 * (1.0 + f.x.0.abs()) {
            options.push((Rect::at(f.plot.x0 - 3.0 - w, p.y - h / 2.0, w, h), false));
        }
        for (rect, inside) in options {
            let ok = if inside {
                free(&rect, &plot, &obs, None)
            } else {
                rect.x0 >= 4.0
                    && rect.x1 <= f.plot.x1 - 8.0
                    && rect.y0 >= page_top
                    && rect.y1 <= f.plot.y1
                    && !obs.placed.iter().any(|o| o.inflate(CLEAR).overlaps(&rect))
            };
            if ok {
                obs.placed.push(rect);
                curve_labels.push(CurveLabel {
                    of: CurveOf::Enthalpy(e.h),
                    text: text.clone(),
                    rect,
                });
                break;
            }
        }
    }
    c.curve_labels = curve_labels;
}

/// Set the obstacles' placed boxes, leaders and markers of others to every
/// label's but `i`'s.
fn with_others(anchors: &[Pt], boxes: &[Option<Place>], i: usize, obs: &mut Obstacles) {
    obs.placed.clear();
    obs.leaders.clear();
    obs.others.clear();
    for (j, b) in boxes.iter().enumerate() {
        if j == i {
            continue;
        }
        if let Some(p) = b {
            obs.placed.push(p.rect);
            obs.leaders.extend(leader(anchors[j], &p.rect, p.gap));
        }
    }
    obs.others.extend(
        anchors
            .iter()
            .enumerate()
            .filter(|(j, _)| *j != i)
            .map(|(_, a)| *a),
    );
}

/// A candidate box: where, how far from its marker, the rank of its
/// direction (east first; two lines after one), and whether the name stands
/// above the values.
#[derive(Clone, Copy, Debug)]
struct Place {
    rect: Rect,
    gap: f64,
    rank: f64,
    stacked: bool,
}

/// Greedy placement in `order`, then three rounds of re-placing each label
/// against all the others, keeping a new box only when it costs less.
fn arrange(
    anchors: &[Pt],
    sizes: &[[(f64, f64); 2]],
    order: &[usize],
    plot: &Rect,
    obs: &mut Obstacles,
) -> Vec<Option<Place>> {
    let mut boxes: Vec<Option<Place>> = vec![None; anchors.len()];
    for round in 0..4 {
        let mut moved = false;
        for &i in order {
            with_others(anchors, &boxes, i, obs);
            let candidate = best_box(anchors[i], sizes[i], plot, obs);
            boxes[i] = match boxes[i] {
                Some(old) if round > 0 => {
                    let old_cost = box_cost(&old, anchors[i], plot, obs);
                    let new_cost = box_cost(&candidate, anchors[i], plot, obs);
                    if new_cost < old_cost {
                        moved = true;
                        Some(candidate)
                    } else {
                        Some(old)
                    }
                }
                _ => Some(candidate),
            };
        }
        if round > 0 && !moved {
            break;
        }
    }
    boxes
}

/// A leader from the marker at `anchor` to its box, when the box is not beside it.
fn leader(anchor: Pt, rect: &Rect, gap: f64) -> Option<(Pt, Pt)> {
    if gap <= 12.0 {
        return None;
    }
    let end = rect.nearest(anchor);
    let d = anchor.dist(end).max(1e-9);
    let r = style::MARKER_R + 1.0;
    Some((
        Pt::new(
            anchor.x + (end.x - anchor.x) * r / d,
            anchor.y + (end.y - anchor.y) * r / d,
        ),
        end,
    ))
}

/// The box is inside the plot, clear of placed boxes, markers, legs, the
/// saturation curve and (except `own`) the relative-humidity curves.
fn free(r: &Rect, plot: &Rect, obs: &Obstacles, own: Option<usize>) -> bool {
    plot.contains(r)
        && !obs.placed.iter().any(|p| p.inflate(CLEAR).overlaps(r))
        && !obs.markers.iter().any(|m| m.overlaps(r))
        && !obs.legs.iter().any(|(a, b)| r.hits_segment(*a, *b))
        && !obs.saturation.hits(r)
        && obs
            .rh
            .iter()
            .enumerate()
            .all(|(i, poly)| Some(i) == own || !poly.hits(r))
}

fn best_box(c: Pt, sizes: [(f64, f64); 2], plot: &Rect, obs: &Obstacles) -> Place {
    const GAPS: [f64; 9] = [8.0, 14.0, 22.0, 34.0, 50.0, 70.0, 95.0, 125.0, 160.0];
    // (dx, dy, align): the side of the marker the box goes to (0 centres
    // it); above or below, `align` -1 ends the box just right of the
    // marker, +1 starts it just left of it.
    const DIRS: [(f64, f64, f64); 12] = [
        (1.0, 0.0, 0.0),
        (1.0, -1.0, 0.0),
        (1.0, 1.0, 0.0),
        (-1.0, 0.0, 0.0),
        (-1.0, -1.0, 0.0),
        (-1.0, 1.0, 0.0),
        (0.0, -1.0, 0.0),
        (0.0, 1.0, 0.0),
        (0.0, -1.0, -1.0),
        (0.0, -1.0, 1.0),
        (0.0, 1.0, -1.0),
        (0.0, 1.0, 1.0),
    ];
    /// What a second line costs, against moving the box further away.
    const STACK_RANK: f64 = 25.0;
    let mut best: Option<(f64, Place)> = None;
    for (stacked, (w, h)) in [(false, sizes[0]), (true, sizes[1])] {
        for gap in GAPS {
            for (di, (dx, dy, align)) in DIRS.iter().enumerate() {
                let g = if *dx != 0.0 && *dy != 0.0 {
                    gap * 0.7
                } else {
                    gap
                };
                let x0 = match (*dx, *align) {
                    (d, _) if d > 0.0 => c.x + g,
                    (d, _) if d < 0.0 => c.x - g - w,
                    (_, a) if a < 0.0 => c.x + 14.0 - w,
                    (_, a) if a > 0.0 => c.x - 14.0,
                    _ => c.x - w / 2.0,
                };
                let y0 = match *dy {
                    d if d > 0.0 => c.y + g,
                    d if d < 0.0 => c.y - g - h,
                    _ => c.y - h / 2.0,
                };
                let place = Place {
                    rect: Rect::at(x0, y0, w, h),
                    gap,
                    rank: di as f64 + if stacked { STACK_RANK } else { 0.0 },
                    stacked,
                };
                let cost = box_cost(&place, c, plot, obs);
                if best.as_ref().is_none_or(|(b, _)| cost < *b) {
                    best = Some((cost, place));
                }
            }
        }
    }
    best.map_or(
        Place {
            rect: Rect::at(c.x, c.y, sizes[0].0, sizes[0].1),
            gap: 0.0,
            rank: 0.0,
            stacked: false,
        },
        |(_, p)| p,
    )
}

/// What a box costs: ruled-out overlaps by the million, crossings by the
/// hundred, and its distance from the marker.
fn box_cost(place: &Place, c: Pt, plot: &Rect, obs: &Obstacles) -> f64 {
    let (r, gap) = (&place.rect, place.gap);
    let mut cost = gap + place.rank;
    // A box nearer another marker than its own reads as that marker's.
    let own = r.nearest(c).dist(c);
    cost += 300.0
        * obs
            .others
            .iter()
            .filter(|m| r.nearest(**m).dist(**m) + 1.0 < own)
            .count() as f64;
    if !plot.contains(r) {
        cost += 1e7;
    }
    cost += 1e6
        * obs
            .placed
            .iter()
            .filter(|p| p.inflate(CLEAR).overlaps(r))
            .count() as f64;
    cost += 1e6 * obs.markers.iter().filter(|m| m.overlaps(r)).count() as f64;
    if obs.saturation.hits(r) {
        cost += 1e5;
    }
    cost += 400.0
        * obs
            .legs
            .iter()
            .filter(|(a, b)| r.hits_segment(*a, *b))
            .count() as f64;
    // Other labels' leaders must not run through this box.
    cost += 1e6
        * obs
            .leaders
            .iter()
            .filter(|(a, b)| r.hits_segment(*a, *b))
            .count() as f64;
    if let Some((start, end)) = leader(c, r, gap) {
        // Nor this box's leader through another label; crossing a leg or
        // another leader is confusing too.
        cost += 1e6
            * obs
                .placed
                .iter()
                .filter(|p| p.hits_segment(start, end))
                .count() as f64;
        cost += 1e6
            * obs
                .markers
                .iter()
                .filter(|m| m.c.dist(c) > 1.0 && m.hits_segment(start, end))
                .count() as f64;
        cost += 300.0
            * obs
                .leaders
                .iter()
                .filter(|(a, b)| segments_cross(start, end, *a, *b))
                .count() as f64;
        cost += 150.0
            * obs
                .legs
                .iter()
                .filter(|(a, b)| segments_cross(start, end, *a, *b))
                .count() as f64;
    }
    cost
}

/// The two segments cross at a point interior to both.
fn segments_cross(p1: Pt, p2: Pt, q1: Pt, q2: Pt) -> bool {
    let d = |a: Pt, b: Pt, c: Pt| (b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x);
    let (d1, d2) = (d(q1, q2, p1), d(q1, q2, p2));
    let (d3, d4) = (d(p1, p2, q1), d(p1, p2, q2));
    d1 * d2 < -1e-9 && d3 * d4 < -1e-9
}

/// A relative-humidity label: centred on its curve, at the first free
/// place walking back from where the curve leaves the plot.
fn rh_box(pts: &[Pt], text: &str, own: usize, plot: &Rect, obs: &Obstacles) -> Option<Rect> {
    let w = text::width(text, style::SMALL_SIZE, false) + 4.0;
    let h = style::SMALL_SIZE * 1.25;
    let mut along = Vec::with_capacity(pts.len());
    let mut s = 0.0;
    for (i, p) in pts.iter().enumerate() {
        if i > 0 {
            s += p.dist(pts[i - 1]);
        }
        along.push(s);
    }
    let total = s;
    let mut back = 16.0;
    while back < total * 0.6 {
        let target = total - back;
        let i = along.iter().position(|&a| a >= target)?;
        let p = pts[i];
        let r = Rect::at(p.x - w / 2.0, p.y - h / 2.0, w, h);
        if free(&r, plot, obs, Some(own)) {
            return Some(r);
        }
        back += 10.0;
    }
    None
}
