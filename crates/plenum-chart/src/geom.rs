//! Points, rectangles and the few tests between them that the layout needs.

/// A point, in chart coordinates (dry bulb, humidity ratio in the chart's
/// units) or in page coordinates (pixels, y down), as the field says.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Pt {
    /// Abscissa.
    pub x: f64,
    /// Ordinate.
    pub y: f64,
}

impl Pt {
    /// A point.
    pub const fn new(x: f64, y: f64) -> Pt {
        Pt { x, y }
    }

    /// Distance to another point.
    pub fn dist(self, o: Pt) -> f64 {
        (self.x - o.x).hypot(self.y - o.y)
    }
}

/// An axis-aligned rectangle, `x0 ≤ x1`, `y0 ≤ y1` (page coordinates: y0 is the top).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Rect {
    /// Left.
    pub x0: f64,
    /// Top.
    pub y0: f64,
    /// Right.
    pub x1: f64,
    /// Bottom.
    pub y1: f64,
}

impl Rect {
    /// The rectangle of a corner and a size.
    pub fn at(x: f64, y: f64, w: f64, h: f64) -> Rect {
        Rect {
            x0: x,
            y0: y,
            x1: x + w,
            y1: y + h,
        }
    }

    /// The square of half-side `r` around `c`.
    pub fn around(c: Pt, r: f64) -> Rect {
        Rect {
            x0: c.x - r,
            y0: c.y - r,
            x1: c.x + r,
            y1: c.y + r,
        }
    }

    /// Width.
    pub fn width(&self) -> f64 {
        self.x1 - self.x0
    }

    /// Height.
    pub fn height(&self) -> f64 {
        self.y1 - self.y0
    }

    /// Grown by `d` on every side (shrunk for a negative `d`).
    pub fn inflate(&self, d: f64) -> Rect {
        Rect {
            x0: self.x0 - d,
            y0: self.y0 - d,
            x1: self.x1 + d,
            y1: self.y1 + d,
        }
    }

    /// The interiors overlap (touching edges do not count).
    pub fn overlaps(&self, o: &Rect) -> bool {
        self.x0 < o.x1 && o.x0 < self.x1 && self.y0 < o.y1 && o.y0 < self.y1
    }

    /// `o` lies inside (edges included).
    pub fn contains(&self, o: &Rect) -> bool {
        o.x0 >= self.x0 && o.x1 <= self.x1 && o.y0 >= self.y0 && o.y1 <= self.y1
    }

    /// The point lies inside (edges included).
    pub fn contains_pt(&self, p: Pt) -> bool {
        p.x >= self.x0 && p.x <= self.x1 && p.y >= self.y0 && p.y <= self.y1
    }

    /// The point of the rectangle nearest to `p`.
    pub fn nearest(&self, p: Pt) -> Pt {
        Pt::new(p.x.clamp(self.x0, self.x1), p.y.clamp(self.y0, self.y1))
    }

    /// The segment `a`–`b` passes through the rectangle (Liang–Barsky clipping).
    pub fn hits_segment(&self, a: Pt, b: Pt) -> bool {
        clip_segment(a, b, self).is_some()
    }

    /// Any segment of the polyline passes through the rectangle.
    pub fn hits_polyline(&self, points: &[Pt]) -> bool {
        points.windows(2).any(|w| self.hits_segment(w[0], w[1]))
    }
}

/// The parts of a polyline inside `r` (edges included), clipped at its edges.
pub fn clip_polyline(points: &[Pt], r: &Rect) -> Vec<Vec<Pt>> {
    let mut out: Vec<Vec<Pt>> = Vec::new();
    let mut cur: Vec<Pt> = Vec::new();
    for w in points.windows(2) {
        match clip_segment(w[0], w[1], r) {
            Some((a, b)) => {
                if cur.last().is_none_or(|l| l.dist(a) > 1e-12) {
                    if !cur.is_empty() {
                        out.push(std::mem::take(&mut cur));
                    }
                    cur.push(a);
                }
                cur.push(b);
            }
            None => {
                if !cur.is_empty() {
                    out.push(std::mem::take(&mut cur));
                }
            }
        }
    }
    if !cur.is_empty() {
        out.push(cur);
    }
    out.retain(|p| p.len() >= 2);
    out
}

/// The part of the segment `a`–`b` inside `r` (Liang–Barsky), if any.
pub fn clip_segment(a: Pt, b: Pt, r: &Rect) -> Option<(Pt, Pt)> {
    let (dx, dy) = (b.x - a.x, b.y - a.y);
    let mut t0 = 0.0_f64;
    let mut t1 = 1.0_f64;
    for (p, q) in [
        (-dx, a.x - r.x0),
        (dx, r.x1 - a.x),
        (-dy, a.y - r.y0),
        (dy, r.y1 - a.y),
    ] {
        if p == 0.0 {
            if q < 0.0 {
                return None;
            }
        } else {
            let t = q / p;
            if p < 0.0 {
                t0 = t0.max(t);
            } else {
                t1 = t1.min(t);
            }
            if t0 > t1 {
                return None;
            }
        }
    }
    let at = |t: f64| Pt::new(a.x + t * dx, a.y + t * dy);
    Some((at(t0), at(t1)))
}

/// A "nice" tick step (1, 2 or 5 times a power of ten) giving about
/// `target` intervals over `span`.
pub fn nice_step(span: f64, target: f64) -> f64 {
    if !(span.is_finite() && span > 0.0 && target >= 1.0) {
        return 1.0;
    }
    let raw = span / target;
    let mag = 10f64.powf(raw.log10().floor());
    let f = raw / mag;
    let m = if f < 1.5 {
        1.0
    } else if f < 3.5 {
        2.0
    } else if f < 7.5 {
        5.0
    } else {
        10.0
    };
    m * mag
}

/// The multiples of `step` in `[lo, hi]`, computed as integer multiples so
/// that they do not drift.
pub fn ticks(lo: f64, hi: f64, step: f64) -> Vec<f64> {
    if !(lo.is_finite() && hi.is_finite() && step > 0.0 && hi >= lo) {
        return Vec::new();
    }
    let first = (lo / step - 1e-9).ceil() as i64;
    let last = (hi / step + 1e-9).floor() as i64;
    (first..=last).map(|k| k as f64 * step).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn segments_and_rectangles() {
        let r = Rect::at(0.0, 0.0, 10.0, 10.0);
        assert!(r.hits_segment(Pt::new(-5.0, 5.0), Pt::new(15.0, 5.0)));
        assert!(r.hits_segment(Pt::new(2.0, 2.0), Pt::new(3.0, 3.0)));
        assert!(!r.hits_segment(Pt::new(-5.0, -1.0), Pt::new(15.0, -1.0)));
        assert!(!r.hits_segment(Pt::new(11.0, 0.0), Pt::new(20.0, 10.0)));
        assert!(r.hits_segment(Pt::new(-1.0, 5.0), Pt::new(5.0, -1.0)));
        assert!(!r.hits_segment(Pt::new(-1.0, 0.5), Pt::new(0.5, -1.0)));
        assert!(r.overlaps(&Rect::at(9.0, 9.0, 5.0, 5.0)));
        assert!(!r.overlaps(&Rect::at(10.0, 0.0, 5.0, 5.0)));
        let line = [
            Pt::new(-5.0, 5.0),
            Pt::new(5.0, 5.0),
            Pt::new(5.0, 20.0),
            Pt::new(8.0, 20.0),
        ];
        let parts = clip_polyline(&line, &r);
        assert_eq!(
            parts,
            vec![vec![
                Pt::new(0.0, 5.0),
                Pt::new(5.0, 5.0),
                Pt::new(5.0, 10.0)
            ]]
        );
    }

    #[test]
    fn nice_steps_and_ticks() {
        assert_eq!(nice_step(55.0, 10.0), 5.0);
        assert_eq!(nice_step(120.0, 8.0), 20.0);
        assert_eq!(nice_step(17.0, 8.0), 2.0);
        assert_eq!(ticks(45.0, 100.0, 5.0).len(), 12);
        assert_eq!(ticks(0.1, 0.9, 0.2).len(), 4);
        assert!(ticks(1.0, 0.0, 0.2).is_empty());
    }
}
