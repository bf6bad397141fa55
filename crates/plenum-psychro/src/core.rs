//! The handbook equations, written once over the constants of a [`Sys`].
//!
//! Equation numbers are those of ASHRAE Handbook—Fundamentals (2017) ch. 1 as
//! cited in psychrolib's documentation (they were not re-checked against the
//! printed edition).

use crate::error::{PsychroError, Quantity};
use crate::root;
use crate::system::Sys;

/// Ratio of the molecular masses of water and dry air, handbook eq. (20)–(22).
pub(crate) const MW_RATIO: f64 = 0.621_945;
/// 1 / `MW_RATIO` (rounded as printed in the handbook's specific-volume equation, eq. 26).
pub(crate) const INV_MW_RATIO: f64 = 1.607_858;

/// Relative excess over saturation accepted as round-off (and then clamped).
pub(crate) const SAT_ROUND_OFF: f64 = 1e-9;
/// Relative excess over saturation accepted from the wet-bulb energy balance
/// at wet bulb = dry bulb and clamped to saturation: the handbook's IP
/// below-freezing form gives up to about 7e-5 above saturation there, because
/// its coefficients are rounded (0.444 − 0.48 ≠ −0.04).
const WB_SAT_SLACK: f64 = 1e-3;

pub(crate) type R<T> = Result<T, PsychroError>;

/// A finite value, or `NotFinite`.
pub(crate) fn input(x: f64, quantity: Quantity) -> R<f64> {
    if x.is_finite() {
        Ok(x)
    } else {
        Err(PsychroError::NotFinite { quantity })
    }
}

/// A finite result, or `NotRepresentable`.
pub(crate) fn output(x: f64, quantity: Quantity) -> R<f64> {
    if x.is_finite() {
        Ok(x)
    } else {
        Err(PsychroError::NotRepresentable { quantity })
    }
}

/// A temperature inside the range of the correlations.
pub(crate) fn temperature(s: &Sys, t: f64, quantity: Quantity) -> R<f64> {
    let t = input(t, quantity)?;
    if t < s.t_min || t > s.t_max {
        return Err(PsychroError::TemperatureOutOfRange {
            quantity,
            value: t,
            min: s.t_min,
            max: s.t_max,
            unit: s.t_unit,
        });
    }
    Ok(t)
}

/// A positive, finite pressure.
pub(crate) fn pressure(s: &Sys, p: f64, quantity: Quantity) -> R<f64> {
    let p = input(p, quantity)?;
    if p <= 0.0 {
        return Err(PsychroError::PressureNotPositive {
            quantity,
            value: p,
            unit: s.p_unit,
        });
    }
    Ok(p)
}

/// A non-negative, finite humidity ratio.
pub(crate) fn hum_ratio(w: f64) -> R<f64> {
    let w = input(w, Quantity::HumidityRatio)?;
    if w < 0.0 {
        return Err(PsychroError::NegativeHumidityRatio { value: w });
    }
    Ok(w)
}

/// A relative humidity in 0…1.
pub(crate) fn rel_hum(rh: f64) -> R<f64> {
    let rh = input(rh, Quantity::RelativeHumidity)?;
    if !(0.0..=1.0).contains(&rh) {
        return Err(PsychroError::RelativeHumidityOutOfRange { value: rh });
    }
    Ok(rh)
}

/// ln p_ws at a temperature already known to be in range: Hyland–Wexler,
/// eq. (5) over ice at or below the triple point, eq. (6) over liquid water above.
pub(crate) fn ln_p_ws_raw(s: &Sys, t: f64) -> f64 {
    let tk = t + s.abs_zero;
    if t <= s.triple_point {
        let c = &s.ice;
        c[0] / tk + c[1] + tk * (c[2] + tk * (c[3] + tk * (c[4] + tk * c[5]))) + c[6] * tk.ln()
    } else {
        let c = &s.water;
        c[0] / tk + c[1] + tk * (c[2] + tk * (c[3] + tk * c[4])) + c[5] * tk.ln()
    }
}

/// Saturation pressure of water vapour, eq. (5)/(6).
pub(crate) fn p_ws(s: &Sys, t: f64) -> R<f64> {
    let t = temperature(s, t, Quantity::DryBulb)?;
    output(ln_p_ws_raw(s, t).exp(), Quantity::SaturationPressure)
}

/// Humidity ratio from water-vapour pressure, eq. (22): W = 0.621945 p_w / (p − p_w).
pub(crate) fn w_from_pw(s: &Sys, p_w: f64, p: f64) -> R<f64> {
    let p_w = input(p_w, Quantity::VapourPressure)?;
    let p = pressure(s, p, Quantity::Pressure)?;
    if p_w < 0.0 {
        return Err(PsychroError::PressureNotPositive {
            quantity: Quantity::VapourPressure,
            value: p_w,
            unit: s.p_unit,
        });
    }
    if p_w >= p {
        return Err(PsychroError::VapourPressureNotBelowTotal {
            vapour_pressure: p_w,
            pressure: p,
            unit: s.p_unit,
        });
    }
    output(MW_RATIO * p_w / (p - p_w), Quantity::HumidityRatio)
}

/// Water-vapour pressure from humidity ratio, eq. (22) inverted: p_w = p W / (0.621945 + W).
pub(crate) fn pw_from_w(s: &Sys, w: f64, p: f64) -> R<f64> {
    let w = hum_ratio(w)?;
    let p = pressure(s, p, Quantity::Pressure)?;
    output(p * (w / (MW_RATIO + w)), Quantity::VapourPressure)
}

/// Saturation humidity ratio, eq. (23). An error where water boils (p_ws ≥ p).
pub(crate) fn w_sat(s: &Sys, t: f64, p: f64) -> R<f64> {
    let p = pressure(s, p, Quantity::Pressure)?;
    let pws = p_ws(s, t)?;
    if pws >= p {
        return Err(PsychroError::AboveBoilingPoint {
            temperature: t,
            t_unit: s.t_unit,
            pressure: p,
            p_unit: s.p_unit,
        });
    }
    output(MW_RATIO * pws / (p - pws), Quantity::HumidityRatio)
}

/// Check `w` against saturation at `t`, clamping round-off; returns `(w, w_s)`.
pub(crate) fn not_above_saturation(s: &Sys, t: f64, w: f64, p: f64, slack: f64) -> R<(f64, f64)> {
    let w = hum_ratio(w)?;
    let ws = w_sat(s, t, p)?;
    if w > ws * (1.0 + slack) {
        return Err(PsychroError::AboveSaturation {
            humidity_ratio: w,
            saturation: ws,
        });
    }
    Ok((w.min(ws), ws))
}

/// Humidity ratio from relative humidity, eq. (24) and (22).
pub(crate) fn w_from_rh(s: &Sys, t: f64, rh: f64, p: f64) -> R<f64> {
    let rh = rel_hum(rh)?;
    let p = pressure(s, p, Quantity::Pressure)?;
    let pws = p_ws(s, t)?;
    let p_w = rh * pws;
    if p_w >= p {
        return Err(PsychroError::AboveBoilingPoint {
            temperature: t,
            t_unit: s.t_unit,
            pressure: p,
            p_unit: s.p_unit,
        });
    }
    w_from_pw(s, p_w, p)
}

/// Relative humidity φ = p_w / p_ws(t), eq. (24). W above saturation is an error.
pub(crate) fn rh_from_w(s: &Sys, t: f64, w: f64, p: f64) -> R<f64> {
    let (w, _) = not_above_saturation(s, t, w, p, SAT_ROUND_OFF)?;
    let p_w = pw_from_w(s, w, p)?;
    let pws = p_ws(s, t)?;
    output((p_w / pws).clamp(0.0, 1.0), Quantity::RelativeHumidity)
}

/// Moist-air enthalpy, eq. (30): h = cp_da t + W (h_g0 + cp_wv t).
pub(crate) fn enthalpy(s: &Sys, t: f64, w: f64) -> R<f64> {
    let t = temperature(s, t, Quantity::DryBulb)?;
    let w = hum_ratio(w)?;
    output(s.cp_da * t + w * (s.h_g0 + s.cp_wv * t), Quantity::Enthalpy)
}

/// Dry bulb from enthalpy and humidity ratio, eq. (30) solved for t.
pub(crate) fn db_from_h_w(s: &Sys, h: f64, w: f64) -> R<f64> {
    let h = input(h, Quantity::Enthalpy)?;
    let w = hum_ratio(w)?;
    let t = (h - s.h_g0 * w) / (s.cp_da + s.cp_wv * w);
    if !t.is_finite() {
        // h and W finite but huge: the quotient overflowed or is 0/0-like.
        return Err(PsychroError::NotRepresentable {
            quantity: Quantity::DryBulb,
        });
    }
    temperature(s, t, Quantity::DryBulb)
}

/// Moist-air specific volume per mass of dry air, eq. (26).
pub(crate) fn volume(s: &Sys, t: f64, w: f64, p: f64) -> R<f64> {
    let t = temperature(s, t, Quantity::DryBulb)?;
    let w = hum_ratio(w)?;
    let p = pressure(s, p, Quantity::Pressure)?;
    output(
        s.r_da * (t + s.abs_zero) * (1.0 + INV_MW_RATIO * w) / p,
        Quantity::SpecificVolume,
    )
}

/// Moist-air density ρ = (1 + W) / v, eq. (11).
pub(crate) fn density(s: &Sys, t: f64, w: f64, p: f64) -> R<f64> {
    let v = volume(s, t, w, p)?;
    let w = hum_ratio(w)?;
    output((1.0 + w) / v, Quantity::Density)
}

/// Which form of the wet-bulb energy balance.
#[derive(Clone, Copy)]
enum Phase {
    /// Eq. (33): liquid water on the wick, t* at or above freezing.
    Water,
    /// Eq. (35): ice on the wick, t* below freezing.
    Ice,
}

/// The wet-bulb energy balance in the given form, with `ws_star` = W_s(t*, p).
fn w_balance_in(s: &Sys, phase: Phase, t: f64, t_star: f64, ws_star: f64) -> f64 {
    let [a, b, c] = match phase {
        Phase::Water => s.wb_water,
        Phase::Ice => s.wb_ice,
    };
    ((a - b * t_star) * ws_star - s.cp_da * (t - t_star)) / (a + s.cp_wv * t - c * t_star)
}

/// The wet-bulb energy balance, eq. (33) for t* ≥ freezing and eq. (35)
/// below, with `ws_star` = W_s(t*, p) given.
fn w_balance(s: &Sys, t: f64, t_star: f64, ws_star: f64) -> f64 {
    let phase = if t_star >= s.freezing {
        Phase::Water
    } else {
        Phase::Ice
    };
    w_balance_in(s, phase, t, t_star, ws_star)
}

/// Humidity ratio from dry bulb and thermodynamic wet bulb, eq. (33)/(35).
pub(crate) fn w_from_wb(s: &Sys, t: f64, t_wb: f64, p: f64) -> R<f64> {
    let t = temperature(s, t, Quantity::DryBulb)?;
    let t_wb = temperature(s, t_wb, Quantity::WetBulb)?;
    let p = pressure(s, p, Quantity::Pressure)?;
    if t_wb > t {
        return Err(PsychroError::WetBulbAboveDryBulb {
            wet_bulb: t_wb,
            dry_bulb: t,
            unit: s.t_unit,
        });
    }
    let ws_star = w_sat(s, t_wb, p)?;
    let w = output(w_balance(s, t, t_wb, ws_star), Quantity::HumidityRatio)?;
    if w < 0.0 {
        return Err(PsychroError::WetBulbTooLow {
            wet_bulb: t_wb,
            dry_bulb: t,
            unit: s.t_unit,
        });
    }
    // At (or within round-off of) wet bulb = dry bulb the rounded IP ice form
    // can exceed saturation by ~1e-4 relative: that air is saturated.
    let (w, _) = not_above_saturation(s, t, w, p, WB_SAT_SLACK)?;
    Ok(w)
}

/// Thermodynamic wet bulb from (t, W, p): eq. (33)/(35) solved for t* in
/// [t_min, t] with the bracketed solver.
pub(crate) fn wet_bulb(s: &Sys, t: f64, w: f64, p: f64) -> R<f64> {
    wet_bulb_above(s, t, w, p, None)
}

/// [`wet_bulb`], with the dew point when it is already known (it is the
/// lower end of the physical bracket [t_dp, t]).
///
/// The two forms of the balance do not meet at the freezing point (the ice
/// form carries the heat of fusion), so for a dry bulb above freezing and a
/// wet bulb near it there are three cases:
/// * one form has a root on its own side of freezing: that is the wet bulb;
/// * neither has (W falls in the gap between the forms): the wet bulb is the
///   freezing point itself;
/// * both have (W falls where the forms overlap, at most about 1 °F apart):
///   the handbook equations have two solutions. The one taken is the one that
///   bisection of [t_dp, t] selects — the procedure of psychrolib, the
///   reference implementation of the chapter that methods.md §2 sets as the
///   accuracy target — so that results stay comparable with it.
pub(crate) fn wet_bulb_above(s: &Sys, t: f64, w: f64, p: f64, dp_hint: Option<f64>) -> R<f64> {
    let t = temperature(s, t, Quantity::DryBulb)?;
    let p = pressure(s, p, Quantity::Pressure)?;
    let (w, ws) = not_above_saturation(s, t, w, p, SAT_ROUND_OFF)?;
    let g = |phase: Phase, t_star: f64| -> R<f64> {
        let ws_star = w_sat(s, t_star, p)?;
        Ok(w_balance_in(s, phase, t, t_star, ws_star) - w)
    };
    let phase_at = |t_star: f64| {
        if t_star >= s.freezing {
            Phase::Water
        } else {
            Phase::Ice
        }
    };
    let g_hi = w_balance_in(s, phase_at(t), t, t, ws) - w;
    if g_hi <= 0.0 {
        // Saturated (within the rounding of the handbook's coefficients).
        return Ok(t);
    }
    let dp_hint = dp_hint.filter(|d| d.is_finite() && *d >= s.t_min && *d < t);
    let dew_point = || -> R<f64> {
        match dp_hint {
            Some(d) => Ok(d),
            None => dew_point_from_pw(s, pw_from_w(s, w, p)?),
        }
    };
    // The bracket [lo, hi] to finish in, with its phase.
    let (phase, mut lo, hi, mut g_lo, g_hi) = if t >= s.freezing {
        let g_water = g(Phase::Water, s.freezing)?;
        let g_ice = g(Phase::Ice, s.freezing)?;
        match (g_water <= 0.0, g_ice > 0.0) {
            // Only the liquid form has a root.
            (true, false) => (Phase::Water, s.freezing, t, g_water, g_hi),
            // Only the ice form has a root, below freezing.
            (false, true) => (Phase::Ice, s.t_min, s.freezing, f64::NAN, g_ice),
            // Neither: in the gap between the forms.
            (false, false) => return output(s.freezing, Quantity::WetBulb),
            // Both: bisect [t_dp, t] until one side of freezing is chosen.
            (true, true) => {
                let (mut lo, mut hi) = (dew_point()?.min(t), t);
                let mut g_lo = g(phase_at(lo), lo)?;
                let mut g_top = g_hi;
                let mut n = 0;
                while lo < s.freezing && hi >= s.freezing && hi - lo > s.t_tol && n < root::MAX_ITER
                {
                    let mid = 0.5 * (lo + hi);
                    let g_mid = g(phase_at(mid), mid)?;
                    if g_mid > 0.0 {
                        hi = mid;
                        g_top = g_mid;
                    } else {
                        lo = mid;
                        g_lo = g_mid;
                    }
                    n += 1;
                }
                if hi < s.freezing {
                    (Phase::Ice, lo, hi, g_lo, g_top)
                } else if lo >= s.freezing {
                    (Phase::Water, lo, hi, g_lo, g_top)
                } else {
                    return output(s.freezing, Quantity::WetBulb);
                }
            }
        }
    } else {
        (Phase::Ice, s.t_min, t, f64::NAN, g_hi)
    };
    if g_lo.is_nan() {
        // An ice-form bracket still to be closed from below: from the dew point
        // if it is known and below the root, else from the bottom of the range.
        let mut closed = false;
        if let Some(d) = dp_hint.filter(|d| *d > lo && *d < hi) {
            let g_d = g(Phase::Ice, d)?;
            if g_d <= 0.0 {
                (lo, g_lo, closed) = (d, g_d, true);
            }
        }
        if !closed {
            g_lo = g(Phase::Ice, lo)?;
        }
        if g_lo > 0.0 {
            return Err(PsychroError::SolutionOutOfRange {
                quantity: Quantity::WetBulb,
                min: s.t_min,
                max: s.t_max,
                unit: s.t_unit,
            });
        }
    }
    if g_hi <= 0.0 {
        return output(hi, Quantity::WetBulb);
    }
    let f = |x: f64| g(phase, x);
    let t_star = root::solve(f, lo, hi, g_lo, g_hi, s.t_tol, Quantity::WetBulb)?;
    output(t_star.clamp(lo, hi), Quantity::WetBulb)
}

/// Dew point (frost point below the triple point) from water-vapour pressure:
/// eq. (5)/(6) inverted with the bracketed solver over the whole range.
pub(crate) fn dew_point_from_pw(s: &Sys, p_w: f64) -> R<f64> {
    let p_w = input(p_w, Quantity::VapourPressure)?;
    let out_of_range = PsychroError::SolutionOutOfRange {
        quantity: Quantity::DewPoint,
        min: s.t_min,
        max: s.t_max,
        unit: s.t_unit,
    };
    if p_w <= 0.0 {
        // Dry air has no dew point (it would be at absolute zero).
        return Err(out_of_range);
    }
    let target = p_w.ln();
    let f = |t: f64| -> R<f64> { Ok(ln_p_ws_raw(s, t) - target) };
    let (lo, hi) = (s.t_min, s.t_max);
    let f_lo = ln_p_ws_raw(s, lo) - target;
    let f_hi = ln_p_ws_raw(s, hi) - target;
    if f_lo > 0.0 || f_hi < 0.0 {
        return Err(out_of_range);
    }
    let t = root::solve(f, lo, hi, f_lo, f_hi, s.t_tol, Quantity::DewPoint)?;
    output(t, Quantity::DewPoint)
}

/// Dew point from humidity ratio and pressure.
pub(crate) fn dew_point(s: &Sys, w: f64, p: f64) -> R<f64> {
    let p_w = pw_from_w(s, w, p)?;
    dew_point_from_pw(s, p_w)
}

/// Standard-atmosphere pressure, eq. (3): p = p0 (1 − k Z)^5.2559.
pub(crate) fn standard_pressure(s: &Sys, z: f64) -> R<f64> {
    let z = input(z, Quantity::Elevation)?;
    if z < s.z_min || z > s.z_max {
        return Err(PsychroError::ElevationOutOfRange {
            value: z,
            min: s.z_min,
            max: s.z_max,
            unit: s.z_unit,
        });
    }
    output(s.p0 * (1.0 - s.atm_k * z).powf(5.2559), Quantity::Pressure)
}
