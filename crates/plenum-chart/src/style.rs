//! The chart's visual design: one light sheet with dark ink.
//!
//! The whole chart sits on an opaque warm-white panel, so it reads the same
//! on a light page, a dark page and paper: no colour depends on what is
//! behind it. The air domain (below saturation) is a whiter sheet than the
//! margin around it, so the saturation curve reads as the edge of the
//! paper. Ink is a blue-black slate; the psychrometric grid is pale steel
//! (relative humidity) and pale sand (enthalpy); the process is drawn in
//! four saturated hues that stay apart in greyscale by weight and dash:
//!
//! | role | colour | line |
//! | --- | --- | --- |
//! | mixing | violet `#6a3d9a` | 2.2 px |
//! | heat of fans, ducts, plenum | brick `#b3401a` | 2.2 px |
//! | cooling coil | deep teal `#00607a` | 3 px; to the apparatus dew point dashed |
//! | room load line | moss `#3d7a1f` | 2.2 px |
//!
//! State markers are slate discs with a white ring; the apparatus dew point
//! is a hollow teal ring on the saturation curve.

/// The font stack, widest-first (see [`crate::text`]).
pub const FONT_STACK: &str = "'DejaVu Sans', Verdana, 'Segoe UI', sans-serif";

/// The panel behind everything.
pub const PAPER: &str = "#f7f5ef";
/// The air domain, below the saturation curve.
pub const SHEET: &str = "#fffefa";
/// Ink of text, axes and markers.
pub const INK: &str = "#1c2833";
/// Secondary text (tick labels, captions).
pub const MUTED: &str = "#55606b";
/// The panel's border and the table's rules.
pub const RULE: &str = "#d8d3c4";
/// Dry-bulb and humidity-ratio grid.
pub const GRID: &str = "#e9e5da";
/// Relative-humidity curves.
pub const RH: &str = "#a9bccb";
/// Their labels.
pub const RH_TEXT: &str = "#4f6a80";
/// Enthalpy lines.
pub const ENTHALPY: &str = "#d9c08f";
/// Their labels.
pub const ENTHALPY_TEXT: &str = "#7d5f22";
/// The saturation curve.
pub const SATURATION: &str = "#1f4e6e";
/// Mixing legs.
pub const MIXING: &str = "#6a3d9a";
/// Sensible heat added by fans, ducts and the plenum.
pub const HEAT: &str = "#b3401a";
/// The coil line.
pub const COIL: &str = "#00607a";
/// The room load line.
pub const ROOM: &str = "#3d7a1f";
/// State markers (and the rendered test's colour to look for).
pub const MARKER: &str = "#1c2833";

/// Page width, px.
pub const WIDTH: f64 = 1040.0;
/// Outer margin, px.
pub const MARGIN: f64 = 28.0;
/// Plot area, page px.
pub const PLOT_X0: f64 = 44.0;
/// Right edge of the plot (the humidity-ratio axis).
pub const PLOT_X1: f64 = 900.0;
/// Top of the plot.
pub const PLOT_Y0: f64 = 148.0;
/// Bottom of the plot (the dry-bulb axis).
pub const PLOT_Y1: f64 = 668.0;

/// Heading size, px.
pub const HEADING_SIZE: f64 = 21.0;
/// Title lines under the heading.
pub const SUBTITLE_SIZE: f64 = 12.5;
/// State labels.
pub const LABEL_SIZE: f64 = 12.0;
/// Tick labels, curve labels.
pub const SMALL_SIZE: f64 = 10.5;
/// Table text.
pub const TABLE_SIZE: f64 = 11.5;
/// The caution line.
pub const FINE_SIZE: f64 = 10.0;
/// Radius of a state marker, px.
pub const MARKER_R: f64 = 5.5;
/// Line height of the table, px.
pub const ROW_H: f64 = 18.0;
