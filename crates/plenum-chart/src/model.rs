//! The chart model: every curve, state, process leg and label of one air
//! handler's chart, as plain data. Curves and states are in chart
//! coordinates (dry bulb in °F or °C, humidity ratio in gr/lb or g/kg);
//! the placed labels and the table are in page coordinates (px, y down),
//! because their size is the size of their text.

use plenum_engine::{AhuResult, CaseResult, DesignCase, PressureSource, SiteResult, StatePoint};
use plenum_psychro::{PA_PER_PSI, PsychroError, ip, si};
use plenum_units::{Measure, UnitSystem};

use crate::geom::{Pt, Rect, nice_step, ticks};
use crate::layout;
use crate::style;

/// What the chart is of: the air handler's name and label, and the project.
#[derive(Clone, Copy, Debug, Default)]
pub struct Subject<'a> {
    /// The air handler's name in the design (`ahu_1`).
    pub name: &'a str,
    /// Its label (`"Public areas unit"`), when it has one.
    pub label: Option<&'a str>,
    /// The project's name, when the design gives one.
    pub project: Option<&'a str>,
}

/// Why a chart could not be built.
#[derive(Clone, Debug, PartialEq)]
pub enum ChartError {
    /// A curve or state of the chart has no psychrometric solution at the
    /// site pressure.
    Psychro {
        /// What was being computed.
        what: &'static str,
        /// What the psychrometric library reported.
        error: PsychroError,
    },
    /// A curve that must be drawn does not cross the axes.
    NoCurve {
        /// Which curve.
        what: &'static str,
    },
    /// A computed coordinate was NaN or infinite.
    NotFinite {
        /// What was being computed.
        what: &'static str,
    },
}

impl std::fmt::Display for ChartError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            ChartError::Psychro { what, error } => {
                write!(
                    f,
                    "the chart's {what} has no psychrometric solution: {error}"
                )
            }
            ChartError::NoCurve { what } => {
                write!(f, "the chart's {what} does not cross its axes")
            }
            ChartError::NotFinite { what } => {
                write!(f, "the chart's {what} is not a finite number")
            }
        }
    }
}

impl std::error::Error for ChartError {}

type R<T> = Result<T, ChartError>;

/// A named state of the process.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum StateKind {
    /// Outdoor design state.
    Outdoor,
    /// Outdoor air after the outdoor-air fan.
    OutdoorAfterFan,
    /// Return air.
    Return,
    /// Mixed air.
    Mixed,
    /// Entering the coil (after a blow-through fan).
    Entering,
    /// Leaving the coil.
    Leaving,
    /// Supply air at the diffusers.
    Supply,
    /// The room.
    Room,
}

impl StateKind {
    /// Its name on the chart.
    pub fn name(self) -> &'static str {
        match self {
            StateKind::Outdoor => "Outdoor",
            StateKind::OutdoorAfterFan => "After OA fan",
            StateKind::Return => "Return",
            StateKind::Mixed => "Mixed",
            StateKind::Entering => "Entering coil",
            StateKind::Leaving => "Leaving coil",
            StateKind::Supply => "Supply",
            StateKind::Room => "Room",
        }
    }
}

/// One state's properties in the chart's units.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct StateValues {
    /// Dry bulb, °F or °C.
    pub tdb: f64,
    /// Wet bulb, °F or °C.
    pub twb: f64,
    /// Dew point, °F or °C.
    pub tdp: f64,
    /// Humidity ratio, lb/lb or kg/kg.
    pub w: f64,
    /// Humidity ratio in the axis unit, gr/lb or g/kg.
    pub w_axis: f64,
    /// Enthalpy, Btu/lb (0 °F datum) or kJ/kg (0 °C datum).
    pub h: f64,
    /// Relative humidity, per cent.
    pub rh_pct: f64,
}

/// A state of the process at its chart coordinates.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct State {
    /// Which state.
    pub kind: StateKind,
    /// (dry bulb, humidity ratio in the axis unit).
    pub at: Pt,
    /// Its properties.
    pub values: StateValues,
}

/// One marker: a state, or several states that coincide on the chart
/// (mixed and entering air without a blow-through fan).
#[derive(Clone, Debug, PartialEq)]
pub struct Marker {
    /// The states it stands for, in process order.
    pub kinds: Vec<StateKind>,
    /// Chart coordinates.
    pub at: Pt,
    /// Its name on the chart (`Mixed = Entering coil`).
    pub name: String,
    /// Its values on the chart (`79.4 °F · 75.6 gr/lb`).
    pub values: String,
}

/// A leg of the process, drawn from one state to the next.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum LegKind {
    /// Outdoor or return air to the mixed state.
    Mixing,
    /// The outdoor-air fan's heat.
    OutdoorFan,
    /// A blow-through fan's heat, before the coil.
    BlowThroughFan,
    /// The coil: entering to leaving.
    Coil,
    /// The coil line extended from the leaving state to the apparatus dew point.
    CoilToAdp,
    /// Leaving coil to supply: a draw-through fan's heat and the supply duct's.
    SupplyHeat,
    /// Supply to room: the room's sensible and latent load.
    RoomLine,
    /// Room to return: the return duct and plenum.
    ReturnHeat,
}

impl LegKind {
    /// The colour family (and CSS class) of the leg.
    pub fn class(self) -> &'static str {
        match self {
            LegKind::Mixing => "mix",
            LegKind::OutdoorFan
            | LegKind::BlowThroughFan
            | LegKind::SupplyHeat
            | LegKind::ReturnHeat => "heat",
            LegKind::Coil => "coil",
            LegKind::CoilToAdp => "coil adp",
            LegKind::RoomLine => "room",
        }
    }
}

/// One leg, in chart coordinates.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Leg {
    /// What it is.
    pub kind: LegKind,
    /// Where it starts.
    pub from: Pt,
    /// Where it ends (the arrow points here).
    pub to: Pt,
}

/// A curve of constant relative humidity.
#[derive(Clone, Debug, PartialEq)]
pub struct RhCurve {
    /// Relative humidity, per cent.
    pub percent: u32,
    /// Chart coordinates, by increasing dry bulb, inside the axes.
    pub points: Vec<Pt>,
}

/// A line of constant enthalpy.
#[derive(Clone, Debug, PartialEq)]
pub struct EnthalpyLine {
    /// Enthalpy, Btu/lb or kJ/kg.
    pub h: f64,
    /// Chart coordinates from the saturation curve (or the edge) down to
    /// zero humidity (or the edge), inside the axes.
    pub points: Vec<Pt>,
    /// Where it meets the saturation curve, when that is inside the axes.
    pub on_saturation: Option<Pt>,
}

/// The apparatus dew point.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Adp {
    /// Chart coordinates, on the saturation curve.
    pub at: Pt,
    /// Its temperature, °F or °C.
    pub t: f64,
    /// Its properties (saturated air).
    pub values: StateValues,
}

/// An axis: its range, ticks and title.
#[derive(Clone, Debug, PartialEq)]
pub struct Axis {
    /// Lower end, chart units.
    pub min: f64,
    /// Upper end.
    pub max: f64,
    /// Tick step.
    pub step: f64,
    /// The ticks, multiples of the step from min to max.
    pub ticks: Vec<f64>,
    /// Decimals of the tick labels.
    pub decimals: usize,
    /// Title with unit (`Dry-bulb temperature, °F`).
    pub title: String,
}

/// A grid line, in chart coordinates.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct GridLine {
    /// One end.
    pub from: Pt,
    /// The other.
    pub to: Pt,
}

/// The mapping from chart to page coordinates.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Frame {
    /// The plot area in page px.
    pub plot: Rect,
    /// Dry-bulb range (left, right).
    pub x: (f64, f64),
    /// Humidity-ratio range (bottom, top).
    pub y: (f64, f64),
}

impl Frame {
    /// Chart to page coordinates.
    pub fn to_page(&self, p: Pt) -> Pt {
        let fx = (p.x - self.x.0) / (self.x.1 - self.x.0);
        let fy = (p.y - self.y.0) / (self.y.1 - self.y.0);
        Pt::new(
            self.plot.x0 + fx * self.plot.width(),
            self.plot.y1 - fy * self.plot.height(),
        )
    }

    /// The axes' box in chart coordinates.
    pub fn chart_box(&self) -> Rect {
        Rect {
            x0: self.x.0,
            y0: self.y.0,
            x1: self.x.1,
            y1: self.y.1,
        }
    }
}

/// What a placed label names.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum LabelOf {
    /// The marker of this index in [`Chart::markers`].
    Marker(usize),
    /// The apparatus dew point.
    Adp,
}

/// A state's label, placed (page px).
#[derive(Clone, Debug, PartialEq)]
pub struct Label {
    /// What it names.
    pub of: LabelOf,
    /// Bold part.
    pub name: String,
    /// Values after the name.
    pub values: String,
    /// Its box.
    pub rect: Rect,
    /// The marker's centre.
    pub anchor: Pt,
    /// A leader from the marker to the box, when the box is not beside it.
    pub leader: Option<(Pt, Pt)>,
    /// The name stands above the values (a wide label in a narrow place).
    pub stacked: bool,
}

/// What a curve label names.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum CurveOf {
    /// A relative-humidity curve, per cent.
    Rh(u32),
    /// An enthalpy line.
    Enthalpy(f64),
}

/// A curve's label, placed (page px). The text is centred in the box.
#[derive(Clone, Debug, PartialEq)]
pub struct CurveLabel {
    /// What it names.
    pub of: CurveOf,
    /// Its text.
    pub text: String,
    /// Its box.
    pub rect: Rect,
}

/// The title block.
#[derive(Clone, Debug, PartialEq)]
pub struct Title {
    /// The air handler's name and label.
    pub heading: String,
    /// Site, governing case, coil and airflow, one line each.
    pub lines: Vec<String>,
    /// The caution, in small print under the other title lines.
    pub caution: String,
}

/// The table of states under the chart.
#[derive(Clone, Debug, PartialEq)]
pub struct Table {
    /// Column titles, each with its unit.
    pub header: Vec<String>,
    /// One row per state, then the apparatus dew point.
    pub rows: Vec<Vec<String>>,
}

/// One entry of the legend.
#[derive(Clone, Debug, PartialEq)]
pub struct LegendEntry {
    /// The CSS class of its sample line (`mix`, `heat`, `coil`, `room`,
    /// `rh`, `enthalpy`, `sat`).
    pub class: &'static str,
    /// Its text.
    pub text: String,
}

/// A whole chart, ready to render.
#[derive(Clone, Debug, PartialEq)]
pub struct Chart {
    /// Unit system of every number.
    pub units: UnitSystem,
    /// Site pressure, psia (the curves are computed at it).
    pub pressure_psia: f64,
    /// The design case drawn (the governing one).
    pub case: DesignCase,
    /// Dry-bulb axis.
    pub x: Axis,
    /// Humidity-ratio axis (right side).
    pub y: Axis,
    /// The saturation curve, by increasing dry bulb, inside the axes.
    pub saturation: Vec<Pt>,
    /// Relative-humidity curves, 10 … 90 %.
    pub rh_curves: Vec<RhCurve>,
    /// Enthalpy lines.
    pub enthalpy_lines: Vec<EnthalpyLine>,
    /// Enthalpy step between lines.
    pub enthalpy_step: f64,
    /// Dry-bulb grid lines (from zero humidity up to saturation).
    pub db_grid: Vec<GridLine>,
    /// Humidity-ratio grid lines (from saturation to the right edge).
    pub w_grid: Vec<GridLine>,
    /// The states in process order.
    pub states: Vec<State>,
    /// One marker per distinct point.
    pub markers: Vec<Marker>,
    /// The process legs in order.
    pub legs: Vec<Leg>,
    /// The apparatus dew point, when the coil line meets saturation.
    pub adp: Option<Adp>,
    /// Chart to page.
    pub frame: Frame,
    /// State labels (and the ADP's).
    pub labels: Vec<Label>,
    /// Relative-humidity and enthalpy labels.
    pub curve_labels: Vec<CurveLabel>,
    /// Title block.
    pub title: Title,
    /// States table.
    pub table: Table,
    /// Legend entries.
    pub legend: Vec<LegendEntry>,
    /// Page height, px (the width is [`style::WIDTH`]).
    pub height: f64,
}

/// The psychrometric functions in the chart's unit system, at the site pressure.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Psy {
    pub units: UnitSystem,
    pub p_psia: f64,
}

fn psy<T>(what: &'static str, r: Result<T, PsychroError>) -> R<T> {
    r.map_err(|error| ChartError::Psychro { what, error })
}

impl Psy {
    fn p(self) -> f64 {
        match self.units {
            UnitSystem::Ip => self.p_psia,
            UnitSystem::Si => self.p_psia * PA_PER_PSI,
        }
    }

    /// Axis units per lb/lb or kg/kg: grains per pound, grams per kilogram.
    pub fn w_scale(self) -> f64 {
        match self.units {
            UnitSystem::Ip => ip::GRAINS_PER_POUND,
            UnitSystem::Si => 1000.0,
        }
    }

    /// A temperature of the engine (°F) in the chart's unit.
    fn t(self, f: f64) -> f64 {
        match self.units {
            UnitSystem::Ip => f,
            UnitSystem::Si => (f - 32.0) / 1.8,
        }
    }

    /// The lowest and highest temperatures the curves may be searched over.
    fn t_bounds(self) -> (f64, f64) {
        match self.units {
            UnitSystem::Ip => (-140.0, 380.0),
            UnitSystem::Si => (-95.0, 195.0),
        }
    }

    pub fn w_sat(self, t: f64) -> Result<f64, PsychroError> {
        match self.units {
            UnitSystem::Ip => ip::sat_hum_ratio(t, self.p()),
            UnitSystem::Si => si::sat_hum_ratio(t, self.p()),
        }
    }

    pub fn w_rh(self, t: f64, rh: f64) -> Result<f64, PsychroError> {
        match self.units {
            UnitSystem::Ip => ip::hum_ratio_from_rh(t, rh, self.p()),
            UnitSystem::Si => si::hum_ratio_from_rh(t, rh, self.p()),
        }
    }

    pub fn enthalpy(self, t: f64, w: f64) -> Result<f64, PsychroError> {
        match self.units {
            UnitSystem::Ip => ip::enthalpy(t, w),
            UnitSystem::Si => si::enthalpy(t, w),
        }
    }

    pub fn db_from_h(self, h: f64, w: f64) -> Result<f64, PsychroError> {
        match self.units {
            UnitSystem::Ip => ip::dry_bulb_from_enthalpy(h, w),
            UnitSystem::Si => si::dry_bulb_from_enthalpy(h, w),
        }
    }

    pub fn dew_point(self, w: f64) -> Result<f64, PsychroError> {
        match self.units {
            UnitSystem::Ip => ip::dew_point(w, self.p()),
            UnitSystem::Si => si::dew_point(w, self.p()),
        }
    }

    /// The properties of an engine state (IP numbers) in the chart's units:
    /// as computed in IP, or re-evaluated with the SI equations (the SI
    /// enthalpy has its own datum, so it is never converted by a factor).
    fn values(self, s: &StatePoint, what: &'static str) -> R<StateValues> {
        match self.units {
            UnitSystem::Ip => {
                // The engine computed the state at this pressure; checking it
                // keeps a mismatched pressure from drawing air above saturation.
                psy(what, ip::State::from_db_w(s.tdb_f, s.w_lb_lb, self.p_psia))?;
                Ok(StateValues {
                    tdb: s.tdb_f,
                    twb: s.twb_f,
                    tdp: s.tdp_f,
                    w: s.w_lb_lb,
                    w_axis: s.w_lb_lb * self.w_scale(),
                    h: s.h_btu_lb,
                    rh_pct: s.rh_pct,
                })
            }
            UnitSystem::Si => {
                let st = psy(what, ip::State::from_db_w(s.tdb_f, s.w_lb_lb, self.p_psia))?;
                let st = psy(what, st.to_si())?;
                Ok(StateValues {
                    tdb: st.dry_bulb(),
                    twb: st.wet_bulb(),
                    tdp: st.dew_point(),
                    w: st.hum_ratio(),
                    w_axis: st.hum_ratio() * self.w_scale(),
                    h: st.enthalpy(),
                    rh_pct: st.rh_percent(),
                })
            }
        }
    }

    /// Saturated air at `t` (chart units).
    fn saturated(self, t: f64) -> R<StateValues> {
        let w = psy("apparatus dew point", self.w_sat(t))?;
        let h = psy("apparatus dew point", self.enthalpy(t, w))?;
        Ok(StateValues {
            tdb: t,
            twb: t,
            tdp: t,
            w,
            w_axis: w * self.w_scale(),
            h,
            rh_pct: 100.0,
        })
    }
}

/// Solve `f(t) = 0` for an increasing `f` on `[lo, hi]` by bisection.
fn bisect(
    mut lo: f64,
    mut hi: f64,
    f: impl Fn(f64) -> Result<f64, PsychroError>,
) -> Result<f64, PsychroError> {
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if hi - lo <= 1e-10 * (1.0 + mid.abs()) {
            return Ok(mid);
        }
        if f(mid)? < 0.0 {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    Ok(0.5 * (lo + hi))
}

/// A curve W(t) (axis units) that rises with t, sampled from the left edge
/// to where it leaves the axes (the top, found by bisection, or the right).
fn rising_curve(
    frame: &Frame,
    f: impl Fn(f64) -> Result<f64, PsychroError>,
) -> Result<Vec<Pt>, PsychroError> {
    const N: usize = 240;
    let (x0, x1) = frame.x;
    let (_, top) = frame.y;
    let mut pts = Vec::with_capacity(N + 2);
    let mut prev: Option<f64> = None;
    for i in 0..=N {
        let t = x0 + (x1 - x0) * i as f64 / N as f64;
        let w = f(t)?;
        if w > top {
            if let Some(tp) = prev {
                let tc = bisect(tp, t, |t| Ok(f(t)? - top))?;
                pts.push(Pt::new(tc, f(tc)?.min(top)));
            }
            break;
        }
        pts.push(Pt::new(t, w));
        prev = Some(t);
    }
    Ok(pts)
}

/// The chart of an air handler's governing design case.
pub fn build(
    site: &SiteResult,
    ahu: &AhuResult,
    subject: &Subject<'_>,
    units: UnitSystem,
) -> Result<Chart, ChartError> {
    let case = ahu.governing();
    let ps = Psy {
        units,
        p_psia: site.pressure_psia,
    };
    if !(site.pressure_psia.is_finite() && site.pressure_psia > 0.0) {
        return Err(ChartError::NotFinite {
            what: "site pressure",
        });
    }
    let states = process_states(ps, case)?;
    let adp = adp(ps, case)?;
    let (x, y) = axes(ps, &states, adp.as_ref())?;
    let frame = Frame {
        plot: Rect {
            x0: style::PLOT_X0,
            y0: style::PLOT_Y0,
            x1: style::PLOT_X1,
            y1: style::PLOT_Y1,
        },
        x: (x.min, x.max),
        y: (y.min, y.max),
    };
    let k = ps.w_scale();
    let saturation = psy(
        "saturation curve",
        rising_curve(&frame, |t| Ok(ps.w_sat(t)? * k)),
    )?;
    if saturation.len() < 2 {
        return Err(ChartError::NoCurve {
            what: "saturation curve",
        });
    }
    let mut rh_curves = Vec::new();
    for percent in (10..=90).step_by(10) {
        let rh = f64::from(percent) / 100.0;
        let points = psy(
            "relative-humidity curve",
            rising_curve(&frame, |t| Ok(ps.w_rh(t, rh)? * k)),
        )?;
        if points.len() >= 2 {
            rh_curves.push(RhCurve { percent, points });
        }
    }
    let (enthalpy_lines, enthalpy_step) = enthalpy_lines(ps, &frame)?;
    let (db_grid, w_grid) = grid(ps, &frame, &x, &y)?;
    let markers = markers(&states, &frame, units, case.outdoor_air_fraction);
    let legs = legs(case, &states, adp.as_ref(), &frame);
    let title = title(site, ahu, case, subject, units, adp.as_ref());
    let table = table(&states, adp.as_ref(), units);
    let legend = legend(&legs, units);
    let mut chart = Chart {
        units,
        pressure_psia: site.pressure_psia,
        case: case.case,
        x,
        y,
        saturation,
        rh_curves,
        enthalpy_lines,
        enthalpy_step,
        db_grid,
        w_grid,
        states,
        markers,
        legs,
        adp,
        frame,
        labels: Vec::new(),
        curve_labels: Vec::new(),
        title,
        table,
        legend,
        height: 0.0,
    };
    layout::place(&mut chart);
    chart.height = layout::page_height(&chart);
    ensure_finite(&chart)?;
    Ok(chart)
}

fn process_states(ps: Psy, case: &CaseResult) -> R<Vec<State>> {
    let s = &case.states;
    let mut list: Vec<(StateKind, &StatePoint)> = vec![(StateKind::Outdoor, &s.outdoor)];
    if let Some(f) = &s.outdoor_after_fan {
        list.push((StateKind::OutdoorAfterFan, f));
    }
    list.extend([
        (StateKind::Return, &s.return_air),
        (StateKind::Mixed, &s.mixed),
        (StateKind::Entering, &s.entering),
        (StateKind::Leaving, &s.leaving),
        (StateKind::Supply, &s.supply),
        (StateKind::Room, &s.room),
    ]);
    list.into_iter()
        .map(|(kind, sp)| {
            let values = ps.values(sp, "state")?;
            Ok(State {
                kind,
                at: Pt::new(values.tdb, values.w_axis),
                values,
            })
        })
        .collect()
}

fn adp(ps: Psy, case: &CaseResult) -> R<Option<Adp>> {
    let t = ps.t(case.coil.adp_f);
    let leaving = ps.t(case.states.leaving.tdb_f);
    if !t.is_finite() || t >= leaving - 1e-6 {
        return Ok(None);
    }
    let values = ps.saturated(t)?;
    Ok(Some(Adp {
        at: Pt::new(t, values.w_axis),
        t,
        values,
    }))
}

/// Axis ranges: every state's dry bulb and dew point (so that the saturation
/// curve beside each state is in view) and the apparatus dew point, with a
/// margin, rounded out to whole ticks; humidity ratio from zero to above the
/// most humid state.
fn axes(ps: Psy, states: &[State], adp: Option<&Adp>) -> R<(Axis, Axis)> {
    let mut lo = f64::INFINITY;
    let mut hi = f64::NEG_INFINITY;
    let mut w_hi: f64 = 0.0;
    for s in states {
        lo = lo.min(s.values.tdb).min(s.values.tdp);
        hi = hi.max(s.values.tdb);
        w_hi = w_hi.max(s.values.w_axis);
    }
    if let Some(a) = adp {
        lo = lo.min(a.t);
    }
    if !(lo.is_finite() && hi.is_finite() && w_hi.is_finite()) {
        return Err(ChartError::NotFinite { what: "axis range" });
    }
    let (pad, min_span, t_unit) = match ps.units {
        UnitSystem::Ip => (3.0, 20.0, "°F"),
        UnitSystem::Si => (1.5, 11.0, "°C"),
    };
    let (mut lo, mut hi) = (lo - pad, hi + pad);
    if hi - lo < min_span {
        let mid = 0.5 * (lo + hi);
        lo = mid - min_span / 2.0;
        hi = mid + min_span / 2.0;
    }
    let step = nice_step(hi - lo, 11.0);
    let (x_min, x_max) = ((lo / step).floor() * step, (hi / step).ceil() * step);
    let x = Axis {
        min: x_min,
        max: x_max,
        step,
        ticks: ticks(x_min, x_max, step),
        decimals: decimals(step),
        title: format!("Dry-bulb temperature, {t_unit}"),
    };
    let w_floor = match ps.units {
        UnitSystem::Ip => 40.0,
        UnitSystem::Si => 6.0,
    };
    let top = (w_hi * 1.12).max(w_floor);
    let ystep = nice_step(top, 8.0);
    let y_max = (top / ystep).ceil() * ystep;
    let y = Axis {
        min: 0.0,
        max: y_max,
        step: ystep,
        ticks: ticks(0.0, y_max, ystep),
        decimals: decimals(ystep),
        title: format!(
            "Humidity ratio, {} dry air",
            Measure::HumidityRatioGrains.label(ps.units)
        ),
    };
    Ok((x, y))
}

fn decimals(step: f64) -> usize {
    let mut d = 0;
    let mut s = step;
    while d < 4 && (s - s.round()).abs() > 1e-9 {
        s *= 10.0;
        d += 1;
    }
    d
}

fn enthalpy_lines(ps: Psy, frame: &Frame) -> R<(Vec<EnthalpyLine>, f64)> {
    let what = "enthalpy line";
    let k = ps.w_scale();
    let (x0, x1) = frame.x;
    let top = frame.y.1 / k;
    let h_lo = psy(what, ps.enthalpy(x0, 0.0))?;
    let w_right = psy(what, ps.w_sat(x1))?.min(top);
    let h_hi = psy(what, ps.enthalpy(x1, w_right))?;
    let step = nice_step(h_hi - h_lo, 5.0);
    let (t_min, _) = ps.t_bounds();
    let h_sat = |t: f64| -> Result<f64, PsychroError> { ps.enthalpy(t, ps.w_sat(t)?) };
    let mut lines = Vec::new();
    for h in ticks(h_lo, h_hi, step) {
        if h <= h_lo + 1e-9 {
            continue;
        }
        // Where the line meets saturation: below x1 it has a part below saturation.
        if psy(what, h_sat(x1))? <= h {
            continue;
        }
        let lo = (x0 - 4.0 * (x1 - x0)).max(t_min);
        if psy(what, h_sat(lo))? >= h {
            continue;
        }
        let ts = psy(what, bisect(lo, x1, |t| Ok(h_sat(t)? - h)))?;
        let ws = psy(what, ps.w_sat(ts))?;
        // The line's dry bulb falls as W rises; keep the W where it is
        // inside the axes, each end solved on the line itself.
        let t_of = |w: f64| ps.db_from_h(h, w);
        let mut w_hi = ws.min(top);
        if psy(what, t_of(w_hi))? < x0 {
            w_hi = psy(what, bisect(0.0, w_hi, |w| Ok(x0 - t_of(w)?)))?;
        }
        let w_lo = if psy(what, t_of(0.0))? > x1 {
            psy(what, bisect(0.0, w_hi, |w| Ok(x1 - t_of(w)?)))?
        } else {
            0.0
        };
        if w_hi <= w_lo {
            continue;
        }
        const N: usize = 32;
        let mut points = Vec::with_capacity(N + 1);
        for i in 0..=N {
            let w = w_hi + (w_lo - w_hi) * i as f64 / N as f64;
            let t = psy(what, t_of(w))?.clamp(x0, x1);
            points.push(Pt::new(t, (w * k).min(frame.y.1)));
        }
        let on_saturation = (w_hi == ws).then_some(points[0]);
        lines.push(EnthalpyLine {
            h,
            points,
            on_saturation,
        });
    }
    Ok((lines, step))
}

fn grid(ps: Psy, frame: &Frame, x: &Axis, y: &Axis) -> R<(Vec<GridLine>, Vec<GridLine>)> {
    let k = ps.w_scale();
    let mut db = Vec::new();
    for &t in &x.ticks {
        let top = (psy("grid", ps.w_sat(t))? * k).min(frame.y.1);
        if top > frame.y.0 {
            db.push(GridLine {
                from: Pt::new(t, frame.y.0),
                to: Pt::new(t, top),
            });
        }
    }
    let mut w = Vec::new();
    for &v in &y.ticks {
        if v <= frame.y.0 {
            continue;
        }
        let t = psy("grid", ps.dew_point(v / k))?.max(frame.x.0);
        if t < frame.x.1 {
            w.push(GridLine {
                from: Pt::new(t, v),
                to: Pt::new(frame.x.1, v),
            });
        }
    }
    Ok((db, w))
}

fn fmt_t(v: f64, units: UnitSystem) -> String {
    Measure::Temperature.format_number_with_unit(v, units)
}

fn fmt_w(v: f64, units: UnitSystem) -> String {
    Measure::HumidityRatioGrains.format_number_with_unit(v, units)
}

/// A value the engine gives in IP numbers, shown in `units`.
fn fmt_ip(m: Measure, v: f64, units: UnitSystem) -> String {
    match m.quantity(v, UnitSystem::Ip) {
        Ok(q) => m.format(&q, units),
        Err(_) => "—".to_string(),
    }
}

/// The states' markers. A 100 % outdoor-air unit exhausts its return air,
/// and a unit without outdoor air draws none: their names say so, as no
/// mixing leg is drawn from that state.
fn markers(states: &[State], frame: &Frame, units: UnitSystem, oa_fraction: f64) -> Vec<Marker> {
    let tol_x = (frame.x.1 - frame.x.0) * 1e-3;
    let tol_y = (frame.y.1 - frame.y.0) * 1e-3;
    let name = |k: StateKind| match k {
        StateKind::Return if oa_fraction >= 1.0 - 1e-9 => "Return (exhausted)",
        StateKind::Outdoor if oa_fraction <= 1e-9 => "Outdoor (none taken)",
        k => k.name(),
    };
    let mut out: Vec<Marker> = Vec::new();
    for s in states {
        let same = out
            .iter_mut()
            .find(|m| (m.at.x - s.at.x).abs() <= tol_x && (m.at.y - s.at.y).abs() <= tol_y);
        match same {
            Some(m) => {
                m.kinds.push(s.kind);
                m.name = m
                    .kinds
                    .iter()
                    .map(|k| name(*k))
                    .collect::<Vec<_>>()
                    .join(" = ");
            }
            None => out.push(Marker {
                kinds: vec![s.kind],
                at: s.at,
                name: name(s.kind).to_string(),
                values: format!(
                    "{} · {}",
                    fmt_t(s.values.tdb, units),
                    fmt_w(s.values.w_axis, units)
                ),
            }),
        }
    }
    out
}

fn legs(case: &CaseResult, states: &[State], adp: Option<&Adp>, frame: &Frame) -> Vec<Leg> {
    let at = |k: StateKind| states.iter().find(|s| s.kind == k).map(|s| s.at);
    let x = case.outdoor_air_fraction;
    let oa = at(StateKind::OutdoorAfterFan).or(at(StateKind::Outdoor));
    let mut plan: Vec<(LegKind, Option<Pt>, Option<Pt>)> = Vec::new();
    if at(StateKind::OutdoorAfterFan).is_some() {
        plan.push((
            LegKind::OutdoorFan,
            at(StateKind::Outdoor),
            at(StateKind::OutdoorAfterFan),
        ));
    }
    if x > 1e-9 {
        plan.push((LegKind::Mixing, oa, at(StateKind::Mixed)));
    }
    if x < 1.0 - 1e-9 {
        plan.push((LegKind::Mixing, at(StateKind::Return), at(StateKind::Mixed)));
    }
    plan.extend([
        (
            LegKind::BlowThroughFan,
            at(StateKind::Mixed),
            at(StateKind::Entering),
        ),
        (
            LegKind::Coil,
            at(StateKind::Entering),
            at(StateKind::Leaving),
        ),
    ]);
    if let Some(a) = adp {
        plan.push((LegKind::CoilToAdp, at(StateKind::Leaving), Some(a.at)));
    }
    plan.extend([
        (
            LegKind::SupplyHeat,
            at(StateKind::Leaving),
            at(StateKind::Supply),
        ),
        (
            LegKind::RoomLine,
            at(StateKind::Supply),
            at(StateKind::Room),
        ),
        (
            LegKind::ReturnHeat,
            at(StateKind::Room),
            at(StateKind::Return),
        ),
    ]);
    let tol_x = (frame.x.1 - frame.x.0) * 1e-3;
    let tol_y = (frame.y.1 - frame.y.0) * 1e-3;
    plan.into_iter()
        .filter_map(|(kind, from, to)| {
            let (from, to) = (from?, to?);
            let apart = (from.x - to.x).abs() > tol_x || (from.y - to.y).abs() > tol_y;
            apart.then_some(Leg { kind, from, to })
        })
        .collect()
}

fn title(
    site: &SiteResult,
    ahu: &AhuResult,
    case: &CaseResult,
    subject: &Subject<'_>,
    units: UnitSystem,
    adp: Option<&Adp>,
) -> Title {
    let heading = match subject.label {
        Some(l) if !l.is_empty() => format!("{} — {l}", subject.name),
        _ => subject.name.to_string(),
    };
    let pressure = match units {
        UnitSystem::Ip => Measure::Pressure.format_number_with_unit(site.pressure_psia, units),
        UnitSystem::Si => Measure::Pressure
            .format_number_with_unit(site.pressure_psia * PA_PER_PSI / 1000.0, units),
    };
    let site_text = match site.pressure_source {
        PressureSource::Elevation { elevation_ft } => format!(
            "site at {}, {pressure} (standard atmosphere)",
            fmt_ip(Measure::Length, elevation_ft, units)
        ),
        PressureSource::Given => format!("site pressure {pressure} (given)"),
        PressureSource::SeaLevelAssumed => format!("site at sea level (assumed), {pressure}"),
    };
    let site_line = match subject.project {
        Some(p) if !p.is_empty() => format!("{p} · {site_text}"),
        _ => {
            let mut s = site_text;
            if let Some(c) = s.get(..1) {
                let up = c.to_uppercase();
                s.replace_range(..1, &up);
            }
            s
        }
    };
    let o = &case.states.outdoor;
    let (case_name, outdoor) = match case.case {
        DesignCase::Cooling => (
            "cooling design",
            format!(
                "{} db / {} wb",
                fmt_ip(Measure::Temperature, o.tdb_f, units),
                fmt_ip(Measure::Temperature, o.twb_f, units)
            ),
        ),
        DesignCase::Dehumid => (
            "dehumidification design",
            format!(
                "{} db / {} dp",
                fmt_ip(Measure::Temperature, o.tdb_f, units),
                fmt_ip(Measure::Temperature, o.tdp_f, units)
            ),
        ),
    };
    let other = match (case.case, &ahu.dehumid) {
        (DesignCase::Cooling, Some(_)) => " — larger coil load than the dehumidification case",
        (DesignCase::Dehumid, _) => " — larger coil load than the cooling case",
        (DesignCase::Cooling, None) => "",
    };
    let case_line = format!("Governing case: {case_name}, outdoor {outdoor}{other}");
    let c = &case.coil;
    let mut coil_line = format!(
        "Coil {} total, {} sensible, SHR {}",
        fmt_ip(Measure::Capacity, c.total_btuh / 12_000.0, units),
        fmt_ip(Measure::Capacity, c.sensible_btuh / 12_000.0, units),
        Measure::Factor.format_number(c.shr, units),
    );
    if let Some(a) = adp {
        coil_line.push_str(&format!(
            ", ADP {}, bypass factor {}",
            fmt_t(a.t, units),
            Measure::Factor.format_number(c.bypass_factor, units)
        ));
    }
    if c.dry {
        coil_line.push_str(" (dry coil)");
    }
    coil_line.push_str(&format!(
        " · supply {}, outdoor air {} ({} % of the supply by mass)",
        fmt_ip(Measure::Airflow, case.supply_airflow_cfm, units),
        fmt_ip(Measure::Airflow, case.outdoor_airflow_cfm, units),
        Measure::Percent.format_number(case.outdoor_air_fraction * 100.0, units),
    ));
    Title {
        heading,
        lines: vec![site_line, case_line, coil_line],
        caution: "Design aid only: check every input. Results must be reviewed by a qualified \
                  engineer before use; the codes in force where the building stands govern."
            .to_string(),
    }
}

fn table(states: &[State], adp: Option<&Adp>, units: UnitSystem) -> Table {
    let t = Measure::Temperature.label(units);
    let header = vec![
        "State".to_string(),
        format!("Dry bulb, {t}"),
        format!("Wet bulb, {t}"),
        format!("Dew point, {t}"),
        format!("W, {}", Measure::HumidityRatioGrains.label(units)),
        format!("W, {}", Measure::HumidityRatio.label(units)),
        format!("h, {}", Measure::Enthalpy.label(units)),
        "RH, %".to_string(),
    ];
    let row = |name: &str, v: &StateValues| {
        vec![
            name.to_string(),
            Measure::Temperature.format_number(v.tdb, units),
            Measure::Temperature.format_number(v.twb, units),
            Measure::Temperature.format_number(v.tdp, units),
            Measure::HumidityRatioGrains.format_number(v.w_axis, units),
            Measure::HumidityRatio.format_number(v.w, units),
            Measure::Enthalpy.format_number(v.h, units),
            Measure::RelativeHumidity.format_number(v.rh_pct, units),
        ]
    };
    let mut rows: Vec<Vec<String>> = states
        .iter()
        .map(|s| row(s.kind.name(), &s.values))
        .collect();
    if let Some(a) = adp {
        rows.push(row("Apparatus dew point", &a.values));
    }
    Table { header, rows }
}

fn legend(legs: &[Leg], units: UnitSystem) -> Vec<LegendEntry> {
    let has = |k: LegKind| legs.iter().any(|l| l.kind == k);
    let mut out = Vec::new();
    if has(LegKind::Mixing) {
        out.push(LegendEntry {
            class: "mix",
            text: "mixing".to_string(),
        });
    }
    out.push(LegendEntry {
        class: "coil",
        text: if has(LegKind::CoilToAdp) {
            "coil (dashed: on to ADP)".to_string()
        } else {
            "coil".to_string()
        },
    });
    if [
        LegKind::OutdoorFan,
        LegKind::BlowThroughFan,
        LegKind::SupplyHeat,
        LegKind::ReturnHeat,
    ]
    .into_iter()
    .any(has)
    {
        out.push(LegendEntry {
            class: "heat",
            text: "fan, duct and plenum heat".to_string(),
        });
    }
    if has(LegKind::RoomLine) {
        out.push(LegendEntry {
            class: "room",
            text: "room load".to_string(),
        });
    }
    out.push(LegendEntry {
        class: "rh",
        text: "relative humidity, %".to_string(),
    });
    out.push(LegendEntry {
        class: "enthalpy",
        text: format!("enthalpy, {} dry air", Measure::Enthalpy.label(units)),
    });
    out
}

fn ensure_finite(c: &Chart) -> R<()> {
    let pts = c
        .saturation
        .iter()
        .chain(c.rh_curves.iter().flat_map(|r| r.points.iter()))
        .chain(c.enthalpy_lines.iter().flat_map(|e| e.points.iter()))
        .chain(c.states.iter().map(|s| &s.at))
        .chain(c.legs.iter().flat_map(|l| [&l.from, &l.to]))
        .chain(
            c.db_grid
                .iter()
                .chain(&c.w_grid)
                .flat_map(|g| [&g.from, &g.to]),
        );
    for p in pts {
        if !(p.x.is_finite() && p.y.is_finite()) {
            return Err(ChartError::NotFinite { what: "curve" });
        }
    }
    let rects = c
        .labels
        .iter()
        .map(|l| &l.rect)
        .chain(c.curve_labels.iter().map(|l| &l.rect));
    for r in rects {
        if ![r.x0, r.y0, r.x1, r.y1].iter().all(|v| v.is_finite()) {
            return Err(ChartError::NotFinite { what: "label" });
        }
    }
    let values = c
        .states
        .iter()
        .map(|s| s.values)
        .chain(c.adp.map(|a| a.values));
    for v in values {
        if ![v.tdb, v.twb, v.tdp, v.w, v.w_axis, v.h, v.rh_pct]
            .iter()
            .all(|x| x.is_finite())
        {
            return Err(ChartError::NotFinite { what: "state" });
        }
    }
    if !(c.height.is_finite() && c.x.min < c.x.max && c.y.min < c.y.max) {
        return Err(ChartError::NotFinite { what: "axis range" });
    }
    Ok(())
}
