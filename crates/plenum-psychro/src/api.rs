//! The public functions and `State` type of one unit system, generated for
//! SI and IP from the same text so that the two stay alike.

/// Expands to the free functions and the `State` type of one unit system.
macro_rules! unit_api {
    (
        sys: $sys:path,
        name: $name:literal,
        module: $module:literal,
        t: $t:literal,
        p: $p:literal,
        w: $w:literal,
        h: $h:literal,
        v: $v:literal,
        rho: $rho:literal,
        z: $z:literal,
        z_range: $zr:literal,
        t_range: $tr:literal,
        example_db: $edb:literal,
        example_wb: $ewb:literal,
        example_p: $ep:literal
    ) => {
        use crate::core;
        use crate::error::PsychroError;
        use crate::state::{self, Props};

        const SYS: &crate::system::Sys = &$sys;

        #[doc = concat!("Saturation pressure of water vapour, ", $p, ", at temperature `t` (", $t, ").")]
        ///
        /// Hyland–Wexler: over ice at or below the triple point of water, over
        /// liquid water above it (ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 5 and 6).
        #[doc = concat!("`t` must lie in the correlations' range, ", $tr, ".")]
        pub fn sat_vapour_pressure(t: f64) -> Result<f64, PsychroError> {
            core::p_ws(SYS, t)
        }

        #[doc = concat!("Humidity ratio (", $w, ") of saturated air at temperature `t` (", $t, ") and pressure `p` (", $p, ").")]
        ///
        /// W_s = 0.621945 p_ws / (p − p_ws) (ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 23).
        /// An error where p_ws(t) ≥ p: water boils there and saturated air does not exist.
        pub fn sat_hum_ratio(t: f64, p: f64) -> Result<f64, PsychroError> {
            core::w_sat(SYS, t, p)
        }

        #[doc = concat!("Humidity ratio (", $w, ") from water-vapour pressure `p_w` and total pressure `p` (both ", $p, ").")]
        ///
        /// W = 0.621945 p_w / (p − p_w) (ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 22).
        pub fn hum_ratio_from_vapour_pressure(p_w: f64, p: f64) -> Result<f64, PsychroError> {
            core::w_from_pw(SYS, p_w, p)
        }

        #[doc = concat!("Water-vapour pressure (", $p, ") from humidity ratio `w` (", $w, ") and total pressure `p` (", $p, ").")]
        ///
        /// Eq. 22 of ASHRAE Handbook—Fundamentals (2017) ch. 1 solved for p_w.
        pub fn vapour_pressure_from_hum_ratio(w: f64, p: f64) -> Result<f64, PsychroError> {
            core::pw_from_w(SYS, w, p)
        }

        #[doc = concat!("Humidity ratio (", $w, ") from dry bulb `t` (", $t, "), relative humidity `rh` (a fraction, 0…1) and pressure `p` (", $p, ").")]
        ///
        /// p_w = φ p_ws(t) (eq. 24), then eq. 22 (ASHRAE Handbook—Fundamentals 2017, ch. 1).
        pub fn hum_ratio_from_rh(t: f64, rh: f64, p: f64) -> Result<f64, PsychroError> {
            core::w_from_rh(SYS, t, rh, p)
        }

        #[doc = concat!("Relative humidity (a fraction, 0…1) from dry bulb `t` (", $t, "), humidity ratio `w` (", $w, ") and pressure `p` (", $p, ").")]
        ///
        /// φ = p_w / p_ws(t) (ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 24).
        /// A humidity ratio above saturation is an error.
        pub fn rh_from_hum_ratio(t: f64, w: f64, p: f64) -> Result<f64, PsychroError> {
            core::rh_from_w(SYS, t, w, p)
        }

        #[doc = concat!("Humidity ratio (", $w, ") from dry bulb `t` and thermodynamic wet bulb `t_wb` (", $t, ") at pressure `p` (", $p, ").")]
        ///
        /// The adiabatic-saturation energy balance, over liquid water for a wet
        /// bulb at or above freezing and over ice below (ASHRAE
        /// Handbook—Fundamentals 2017, ch. 1, eq. 33 and 35). A wet bulb above
        /// the dry bulb, or so low that W would be negative, is an error.
        pub fn hum_ratio_from_wet_bulb(t: f64, t_wb: f64, p: f64) -> Result<f64, PsychroError> {
            core::w_from_wb(SYS, t, t_wb, p)
        }

        #[doc = concat!("Thermodynamic wet bulb (", $t, ") from dry bulb `t` (", $t, "), humidity ratio `w` (", $w, ") and pressure `p` (", $p, ").")]
        ///
        /// Eq. 33/35 of ASHRAE Handbook—Fundamentals (2017) ch. 1 solved for t*
        /// by the crate's bracketed root finder, to a millionth of a degree.
        pub fn wet_bulb(t: f64, w: f64, p: f64) -> Result<f64, PsychroError> {
            core::wet_bulb(SYS, t, w, p)
        }

        #[doc = concat!("Humidity ratio (", $w, ") of air whose dew point is `t_dp` (", $t, ") at pressure `p` (", $p, ").")]
        ///
        /// W = W_s(t_dp, p) (ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 23 at the dew point).
        pub fn hum_ratio_from_dew_point(t_dp: f64, p: f64) -> Result<f64, PsychroError> {
            core::w_sat(SYS, t_dp, p)
        }

        #[doc = concat!("Dew point (", $t, ") of air of humidity ratio `w` (", $w, ") at pressure `p` (", $p, ").")]
        ///
        /// Below the triple point of water this is the frost point (saturation
        /// over ice), as the handbook's Hyland–Wexler split gives. Found by
        /// inverting eq. 5/6 of ASHRAE Handbook—Fundamentals (2017) ch. 1 with
        /// the bracketed root finder, to a millionth of a degree. Air so dry
        /// that its dew point lies below −100 °C (W = 0 included) is an error.
        pub fn dew_point(w: f64, p: f64) -> Result<f64, PsychroError> {
            core::dew_point(SYS, w, p)
        }

        #[doc = concat!("Dew point (", $t, ") at which the saturation pressure equals `p_w` (", $p, ").")]
        ///
        /// See [`dew_point`].
        pub fn dew_point_from_vapour_pressure(p_w: f64) -> Result<f64, PsychroError> {
            core::dew_point_from_pw(SYS, p_w)
        }

        #[doc = concat!("Moist-air enthalpy (", $h, ") at dry bulb `t` (", $t, ") and humidity ratio `w` (", $w, ").")]
        ///
        /// ASHRAE Handbook—Fundamentals (2017) ch. 1, eq. 30 (see the crate docs for both forms).
        pub fn enthalpy(t: f64, w: f64) -> Result<f64, PsychroError> {
            core::enthalpy(SYS, t, w)
        }

        #[doc = concat!("Dry bulb (", $t, ") from enthalpy `h` (", $h, ") and humidity ratio `w` (", $w, ").")]
        ///
        /// Eq. 30 of ASHRAE Handbook—Fundamentals (2017) ch. 1 solved for t.
        pub fn dry_bulb_from_enthalpy(h: f64, w: f64) -> Result<f64, PsychroError> {
            core::db_from_h_w(SYS, h, w)
        }

        #[doc = concat!("Specific volume (", $v, ", per mass of dry air) at dry bulb `t` (", $t, "), humidity ratio `w` (", $w, ") and pressure `p` (", $p, ").")]
        ///
        /// ASHRAE Handbook—Fundamentals (2017) ch. 1, eq. 26.
        pub fn specific_volume(t: f64, w: f64, p: f64) -> Result<f64, PsychroError> {
            core::volume(SYS, t, w, p)
        }

        #[doc = concat!("Density of moist air (", $rho, ": mass of air and vapour per volume) at dry bulb `t` (", $t, "), humidity ratio `w` (", $w, ") and pressure `p` (", $p, ").")]
        ///
        /// ρ = (1 + W) / v (ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 11).
        pub fn density(t: f64, w: f64, p: f64) -> Result<f64, PsychroError> {
            core::density(SYS, t, w, p)
        }

        #[doc = concat!("Standard-atmosphere pressure (", $p, ") at elevation `z` (", $z, ").")]
        ///
        /// ASHRAE Handbook—Fundamentals (2017) ch. 1, eq. 3; accepted for
        #[doc = concat!("elevations ", $zr, " (up to the top of the troposphere).")]
        pub fn standard_pressure(z: f64) -> Result<f64, PsychroError> {
            core::standard_pressure(SYS, z)
        }

        #[doc = concat!("A state of moist air in ", $name, " units: dry bulb, humidity ratio and pressure, with every other property computed once at construction.")]
        ///
        /// Construct it from any pair of the usual inputs; each constructor
        /// validates its inputs and returns a [`PsychroError`] for anything
        /// outside the domain of the equations. Getters never fail and never
        /// return NaN or infinity.
        ///
        #[doc = concat!("Units: temperatures ", $t, ", pressure ", $p, ", humidity ratio ", $w, ", enthalpy ", $h, ", specific volume ", $v, ", density ", $rho, "; relative humidity as a fraction 0…1.")]
        ///
        /// ```
        #[doc = concat!("use plenum_psychro::", $module, "::State;")]
        #[doc = concat!("let s = State::from_db_wb(", $edb, ", ", $ewb, ", ", $ep, ")?;")]
        /// assert!(s.dew_point() <= s.wet_bulb() && s.wet_bulb() <= s.dry_bulb());
        /// assert!(s.rh() > 0.0 && s.rh() < 1.0);
        /// # Ok::<(), plenum_psychro::PsychroError>(())
        /// ```
        #[derive(Debug, Clone, Copy, PartialEq)]
        pub struct State(Props);

        impl State {
            #[doc = concat!("From dry bulb `db` (", $t, "), humidity ratio `w` (", $w, ") and pressure `p` (", $p, "). W above saturation is an error.")]
            pub fn from_db_w(db: f64, w: f64, p: f64) -> Result<Self, PsychroError> {
                state::from_db_w(SYS, db, w, p).map(Self)
            }

            #[doc = concat!("From dry bulb `db` (", $t, "), relative humidity `rh` (a fraction, 0…1) and pressure `p` (", $p, ").")]
            pub fn from_db_rh(db: f64, rh: f64, p: f64) -> Result<Self, PsychroError> {
                state::from_db_rh(SYS, db, rh, p).map(Self)
            }

            #[doc = concat!("From dry bulb `db` and thermodynamic wet bulb `wb` (", $t, ") at pressure `p` (", $p, ").")]
            pub fn from_db_wb(db: f64, wb: f64, p: f64) -> Result<Self, PsychroError> {
                state::from_db_wb(SYS, db, wb, p).map(Self)
            }

            #[doc = concat!("From dry bulb `db` and dew point `dp` (", $t, ") at pressure `p` (", $p, ").")]
            pub fn from_db_dp(db: f64, dp: f64, p: f64) -> Result<Self, PsychroError> {
                state::from_db_dp(SYS, db, dp, p).map(Self)
            }

            #[doc = concat!("From enthalpy `h` (", $h, ") and humidity ratio `w` (", $w, ") at pressure `p` (", $p, "), e.g. a mixed-air state.")]
            pub fn from_h_w(h: f64, w: f64, p: f64) -> Result<Self, PsychroError> {
                state::from_h_w(SYS, h, w, p).map(Self)
            }

            #[doc = concat!("Dry-bulb temperature, ", $t, ".")]
            pub fn dry_bulb(&self) -> f64 {
                self.0.db
            }

            #[doc = concat!("Thermodynamic wet-bulb temperature, ", $t, ".")]
            pub fn wet_bulb(&self) -> f64 {
                self.0.wb
            }

            #[doc = concat!("Dew-point temperature, ", $t, " (the frost point when below the triple point of water).")]
            pub fn dew_point(&self) -> f64 {
                self.0.dp
            }

            /// Relative humidity as a fraction, 0…1.
            pub fn rh(&self) -> f64 {
                self.0.rh
            }

            /// Relative humidity in per cent, 0…100.
            pub fn rh_percent(&self) -> f64 {
                self.0.rh * 100.0
            }

            #[doc = concat!("Humidity ratio, ", $w, " (mass of water vapour per mass of dry air).")]
            pub fn hum_ratio(&self) -> f64 {
                self.0.w
            }

            #[doc = concat!("Humidity ratio of saturated air at this dry bulb and pressure, ", $w, ".")]
            pub fn sat_hum_ratio(&self) -> f64 {
                self.0.ws
            }

            #[doc = concat!("Partial pressure of water vapour, ", $p, ".")]
            pub fn vapour_pressure(&self) -> f64 {
                self.0.pw
            }

            #[doc = concat!("Enthalpy per mass of dry air, ", $h, ".")]
            pub fn enthalpy(&self) -> f64 {
                self.0.h
            }

            #[doc = concat!("Specific volume per mass of dry air, ", $v, ".")]
            pub fn specific_volume(&self) -> f64 {
                self.0.v
            }

            #[doc = concat!("Density of the moist air (air and vapour per volume), ", $rho, ".")]
            pub fn density(&self) -> f64 {
                self.0.rho
            }

            #[doc = concat!("Total (barometric) pressure, ", $p, ".")]
            pub fn pressure(&self) -> f64 {
                self.0.p
            }
        }
    };
}
