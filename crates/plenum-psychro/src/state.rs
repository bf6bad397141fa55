//! Every property of one moist-air state, computed once in one unit system.

use crate::core::{self, R};
use crate::error::{PsychroError, Quantity};
use crate::system::Sys;

/// All properties of a state, in the units of the `Sys` that built it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Props {
    pub db: f64,
    pub w: f64,
    pub p: f64,
    pub wb: f64,
    pub dp: f64,
    pub rh: f64,
    pub pw: f64,
    pub ws: f64,
    pub h: f64,
    pub v: f64,
    pub rho: f64,
}

/// Build a state from (t, W, p), optionally with a wet bulb or dew point
/// already known (given by the caller, so not solved again). `slack` is the
/// relative excess over saturation accepted and clamped.
fn build(
    s: &Sys,
    t: f64,
    w: f64,
    p: f64,
    known_wb: Option<f64>,
    known_dp: Option<f64>,
    slack: f64,
) -> R<Props> {
    let t = core::temperature(s, t, Quantity::DryBulb)?;
    let p = core::pressure(s, p, Quantity::Pressure)?;
    let (w, ws) = core::not_above_saturation(s, t, w, p, slack)?;
    let pw = core::pw_from_w(s, w, p)?;
    let pws = core::p_ws(s, t)?;
    let rh = core::output((pw / pws).clamp(0.0, 1.0), Quantity::RelativeHumidity)?;
    let mut dp = match known_dp {
        Some(dp) => dp,
        None => core::dew_point_from_pw(s, pw)?,
    }
    .min(t);
    let wb = match known_wb {
        Some(wb) => {
            dp = dp.min(wb);
            wb
        }
        None => core::wet_bulb_above(s, t, w, p, Some(dp))?.clamp(dp, t),
    };
    let h = core::enthalpy(s, t, w)?;
    let v = core::volume(s, t, w, p)?;
    let rho = core::density(s, t, w, p)?;
    Ok(Props {
        db: t,
        w,
        p,
        wb,
        dp,
        rh,
        pw,
        ws,
        h,
        v,
        rho,
    })
}

pub(crate) fn from_db_w(s: &Sys, t: f64, w: f64, p: f64) -> R<Props> {
    build(s, t, w, p, None, None, core::SAT_ROUND_OFF)
}

/// Like [`from_db_w`], accepting up to 0.1 % above saturation (clamped): for
/// states carried over from the other unit system, whose saturation fit
/// differs by up to about 0.02 %.
pub(crate) fn from_db_w_converted(s: &Sys, t: f64, w: f64, p: f64) -> R<Props> {
    build(s, t, w, p, None, None, 1e-3)
}

pub(crate) fn from_db_rh(s: &Sys, t: f64, rh: f64, p: f64) -> R<Props> {
    let w = core::w_from_rh(s, t, rh, p)?;
    build(s, t, w, p, None, None, core::SAT_ROUND_OFF)
}

pub(crate) fn from_db_wb(s: &Sys, t: f64, wb: f64, p: f64) -> R<Props> {
    let w = core::w_from_wb(s, t, wb, p)?;
    build(s, t, w, p, Some(wb), None, core::SAT_ROUND_OFF)
}

pub(crate) fn from_db_dp(s: &Sys, t: f64, dp: f64, p: f64) -> R<Props> {
    let t = core::temperature(s, t, Quantity::DryBulb)?;
    let dp = core::temperature(s, dp, Quantity::DewPoint)?;
    if dp > t {
        return Err(PsychroError::DewPointAboveDryBulb {
            dew_point: dp,
            dry_bulb: t,
            unit: s.t_unit,
        });
    }
    let w = core::w_sat(s, dp, p)?;
    build(s, t, w, p, None, Some(dp), core::SAT_ROUND_OFF)
}

pub(crate) fn from_h_w(s: &Sys, h: f64, w: f64, p: f64) -> R<Props> {
    let t = core::db_from_h_w(s, h, w)?;
    build(s, t, w, p, None, None, core::SAT_ROUND_OFF)
}
