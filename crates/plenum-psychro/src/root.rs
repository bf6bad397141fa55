//! A bracketed root finder that always terminates.
//!
//! Illinois-modified false position (regula falsi), safeguarded by bisection:
//! the bracket `[lo, hi]` always holds a sign change, a step that would not
//! shrink it by at least half over two steps is replaced by bisection, and
//! the loop stops after [`MAX_ITER`] evaluations whatever happens. Each
//! bisection halves the bracket, so a bracket of 540 degrees reaches a
//! millionth of a degree within about 60 evaluations at worst; smooth
//! functions (the saturation curve, the wet-bulb balance) take 5 to 15.

use crate::error::{PsychroError, Quantity};

/// Hard cap on function evaluations.
pub(crate) const MAX_ITER: usize = 200;

/// Solve `f(x) = 0` for an increasing-or-decreasing `f` on `[lo, hi]`.
///
/// `f_lo` and `f_hi` are `f(lo)` and `f(hi)`; they must have opposite signs
/// (or one of them be zero), else [`PsychroError::NoRootInBracket`]. Stops
/// when the bracket is narrower than `tol`, and returns the end of the final
/// bracket whose residual is smaller. A non-finite residual is an error.
pub(crate) fn solve<F>(
    mut f: F,
    mut lo: f64,
    mut hi: f64,
    mut f_lo: f64,
    mut f_hi: f64,
    tol: f64,
    quantity: Quantity,
) -> Result<f64, PsychroError>
where
    F: FnMut(f64) -> Result<f64, PsychroError>,
{
    let no_root = PsychroError::NoRootInBracket { quantity };
    if !(lo.is_finite() && hi.is_finite() && f_lo.is_finite() && f_hi.is_finite()) || lo > hi {
        return Err(no_root);
    }
    if f_lo == 0.0 {
        return Ok(lo);
    }
    if f_hi == 0.0 {
        return Ok(hi);
    }
    if f_lo.signum() == f_hi.signum() {
        return Err(no_root);
    }
    // Which end was kept by the previous false-position step (for Illinois).
    let mut kept: i8 = 0;
    let mut width_before = hi - lo;
    for iter in 0..MAX_ITER {
        let width = hi - lo;
        if width <= tol {
            return Ok(if f_lo.abs() <= f_hi.abs() { lo } else { hi });
        }
        // Every second step, check progress; bisect if the bracket did not halve.
        let bisect = iter % 2 == 1 && width > 0.5 * width_before;
        if iter % 2 == 1 {
            width_before = width;
        }
        let mut x = if bisect {
            0.5 * (lo + hi)
        } else {
            (lo * f_hi - hi * f_lo) / (f_hi - f_lo)
        };
        if !(x > lo && x < hi) {
            x = 0.5 * (lo + hi);
            if !(x > lo && x < hi) {
                // The bracket is as narrow as floating point allows.
                return Ok(if f_lo.abs() <= f_hi.abs() { lo } else { hi });
            }
        }
        let fx = f(x)?;
        if !fx.is_finite() {
            return Err(no_root);
        }
        if fx == 0.0 {
            return Ok(x);
        }
        if fx.signum() == f_lo.signum() {
            lo = x;
            f_lo = fx;
            if kept == 1 {
                f_hi *= 0.5;
            }
            kept = 1;
        } else {
            hi = x;
            f_hi = fx;
            if kept == -1 {
                f_lo *= 0.5;
            }
            kept = -1;
        }
    }
    Err(PsychroError::NoConvergence { quantity })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn q() -> Quantity {
        Quantity::DewPoint
    }

    #[test]
    fn finds_cube_root_of_two() {
        let f = |x: f64| Ok(x * x * x - 2.0);
        let x = solve(f, 0.0, 2.0, -2.0, 6.0, 1e-12, q());
        let x = x.unwrap_or(f64::NAN);
        assert!((x - 2f64.cbrt()).abs() < 1e-11, "{x}");
    }

    #[test]
    fn handles_a_step_function() {
        // A jump, like the ice/liquid switch: converges to the jump.
        let f = |x: f64| Ok(if x < 0.3 { -1.0 } else { 1.0 });
        let x = solve(f, -10.0, 10.0, -1.0, 1.0, 1e-9, q()).unwrap_or(f64::NAN);
        assert!((x - 0.3).abs() < 1e-8, "{x}");
    }

    #[test]
    fn rejects_a_bracket_without_sign_change() {
        let f = |x: f64| Ok(x * x + 1.0);
        assert_eq!(
            solve(f, -1.0, 1.0, 2.0, 2.0, 1e-9, q()),
            Err(PsychroError::NoRootInBracket { quantity: q() })
        );
    }

    #[test]
    fn rejects_non_finite_residuals() {
        let f = |_x: f64| Ok(f64::NAN);
        assert_eq!(
            solve(f, -1.0, 1.0, -1.0, 1.0, 1e-9, q()),
            Err(PsychroError::NoRootInBracket { quantity: q() })
        );
    }

    #[test]
    fn terminates_on_a_flat_then_steep_function() {
        // False position alone crawls here; the bisection safeguard must cut in.
        let f = |x: f64| Ok(x.powi(21) - 1e-30);
        let mut calls = 0usize;
        let counted = |x: f64| {
            calls += 1;
            f(x)
        };
        let x = solve(counted, 0.0, 1.0, -1e-30, 1.0, 1e-12, q()).unwrap_or(f64::NAN);
        assert!((x - 1e-30f64.powf(1.0 / 21.0)).abs() < 1e-11, "{x}");
        assert!(calls < 120, "{calls} calls");
    }
}
