//! Psychrometric charts of an air handler's process, as SVG.
//!
//! [`build`] turns the site pressure and one air handler's engine result
//! into a [`Chart`]: pure geometry in chart coordinates (dry bulb in °F or
//! °C on x, humidity ratio in gr/lb or g/kg on y) with every curve computed
//! by `plenum-psychro` at the site pressure, plus the placed labels in page
//! coordinates. [`render_svg`] writes it as one self-contained SVG
//! document. The crate does no IO.
//!
//! What a chart shows, for the governing design case:
//!
//! * the saturation curve, relative-humidity curves 10 … 90 % and enthalpy
//!   lines (each labelled), on a dry-bulb and humidity-ratio grid;
//! * the states in process order — outdoor (and after the outdoor-air fan),
//!   return, mixed, entering coil (after a blow-through fan), leaving coil,
//!   supply, room — and the apparatus dew point; states that coincide
//!   share one marker (`Mixed = Entering coil`);
//! * the legs between them: mixing (outdoor and return to mixed), fan heat,
//!   the coil line (dashed on to the apparatus dew point), fan and supply
//!   duct heat, the room load line, return duct and plenum heat;
//! * a label per marker with its dry bulb and humidity ratio, placed so that
//!   labels overlap neither each other, nor a marker, nor the saturation
//!   curve (see [`layout`]);
//! * a title with the air handler, the site pressure (and elevation), the
//!   governing case, the coil figures and a caution in small print; a
//!   legend; and a table of every state (dry bulb, wet bulb, dew point,
//!   humidity ratio, enthalpy, RH).
//!
//! The axes fit every state's dry bulb and dew point and the apparatus dew
//! point with a margin, so the saturation curve beside each state is in
//! view; humidity ratio runs from zero to above the most humid state.
//!
//! ```no_run
//! # fn demo(design: &plenum_model::Design) -> Result<(), Box<dyn std::error::Error>> {
//! let eval = plenum_engine::evaluate(design);
//! let chart = plenum_chart::chart_of(design, &eval, 0, plenum_units::UnitSystem::Ip)?;
//! let svg: String = plenum_chart::render_svg(&chart);
//! # let _ = svg; Ok(()) }
//! ```
//!
//! > **Caution.** A chart is a design aid; the results it shows must be
//! > reviewed by a qualified engineer, and local codes govern.

#![forbid(unsafe_code)]
#![warn(missing_docs)]

pub mod geom;
pub mod layout;
mod model;
pub mod style;
mod svg;
pub mod text;

use plenum_engine::{EngineError, Evaluation};
use plenum_model::Design;
use plenum_units::UnitSystem;

pub use model::{
    Adp, Axis, Chart, ChartError, CurveLabel, CurveOf, EnthalpyLine, Frame, GridLine, Label,
    LabelOf, Leg, LegKind, LegendEntry, Marker, RhCurve, State, StateKind, StateValues, Subject,
    Table, Title, build,
};
pub use svg::state_key;

/// Render a chart as an SVG document.
pub fn render_svg(chart: &Chart) -> String {
    svg::render(chart)
}

/// Why an air handler has no chart.
#[derive(Clone, Debug, PartialEq)]
pub enum Unavailable {
    /// No air handler of that index.
    NoSuchAhu(usize),
    /// The site has no result (its error).
    Site(EngineError),
    /// The air handler has no result (its error).
    Engine(EngineError),
    /// The chart itself could not be computed.
    Chart(ChartError),
}

impl std::fmt::Display for Unavailable {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Unavailable::NoSuchAhu(i) => write!(f, "the design has no air handler number {i}"),
            Unavailable::Site(_) => write!(f, "the site has no usable result"),
            Unavailable::Engine(_) => write!(f, "the air handler has no result"),
            Unavailable::Chart(e) => write!(f, "{e}"),
        }
    }
}

impl std::error::Error for Unavailable {}

/// The chart of the air handler at `index` of the design, from its
/// evaluation, with the design's labels and project name.
pub fn chart_of(
    design: &Design,
    eval: &Evaluation,
    index: usize,
    units: UnitSystem,
) -> Result<Chart, Unavailable> {
    let outcome = eval
        .ahus
        .iter()
        .find(|a| a.index == index)
        .ok_or(Unavailable::NoSuchAhu(index))?;
    let site = eval
        .site
        .as_ref()
        .map_err(|e| Unavailable::Site(e.clone()))?;
    let result = outcome
        .result
        .as_ref()
        .map_err(|e| Unavailable::Engine(e.clone()))?;
    let subject = Subject {
        name: &outcome.name,
        label: design.ahus.get(index).and_then(|a| a.label.as_deref()),
        project: design.project.name.as_deref(),
    };
    build(site, result, &subject, units).map_err(Unavailable::Chart)
}
