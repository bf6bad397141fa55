//! Moist-air (psychrometric) properties for Plenum.
//!
//! Pure functions of the equations in ASHRAE Handbook—Fundamentals (2017),
//! chapter 1, "Psychrometrics", in two unit systems:
//!
//! | module | temperature | pressure | humidity ratio | enthalpy | specific volume | density | elevation |
//! | --- | --- | --- | --- | --- | --- | --- | --- |
//! | [`si`] | °C | **Pa** | kg/kg | kJ/kg, datum 0 °C | m³/kg | kg/m³ | m |
//! | [`ip`] | °F | psia | lb/lb | Btu/lb, datum 0 °F | ft³/lb | lb/ft³ | ft |
//!
//! Relative humidity is a fraction, 0…1, everywhere (`rh_percent()` gives
//! per cent). Humidity ratio, enthalpy and specific volume are per mass of dry
//! air; density is the mass of air *and* vapour per volume, (1 + W)/v. The SI
//! pressure is in pascals (not kPa), so that every SI input is a base or
//! coherent unit.
//!
//! ```
//! use plenum_psychro::{ip, si};
//!
//! // A design outdoor state, 94 °F dry bulb / 75 °F wet bulb, at 1,250 ft.
//! let p = ip::standard_pressure(1250.0)?;
//! let s = ip::State::from_db_wb(94.0, 75.0, p)?;
//! // psychrolib 2.5.0 gives 42.30 % RH, 67.619 °F dew point, 0.0151881 lb/lb.
//! assert!((s.rh_percent() - 42.3).abs() < 0.1);
//! assert!((s.dew_point() - 67.62).abs() < 0.01);
//! let grains = s.hum_ratio() * ip::GRAINS_PER_POUND; // gr/lb
//! assert!((grains - 106.3).abs() < 0.1);
//! // Enthalpy (Btu/lb, 0 °F datum), specific volume (ft³/lb), density (lb/ft³):
//! let (_h, _v, _rho) = (s.enthalpy(), s.specific_volume(), s.density());
//!
//! // The same air in SI (re-evaluated with the SI forms of the equations):
//! let si_state: si::State = s.to_si()?;
//! assert!((si_state.dry_bulb() - (94.0 - 32.0) / 1.8).abs() < 1e-9);
//!
//! // Out-of-domain inputs are typed errors, never NaN or a panic.
//! assert!(ip::State::from_db_wb(75.0, 80.0, 14.696).is_err());
//! assert!(ip::State::from_db_rh(75.0, 50.0, 14.696).is_err()); // RH is a fraction
//! assert!(ip::enthalpy(f64::NAN, 0.01).is_err());
//! # Ok::<(), plenum_psychro::PsychroError>(())
//! ```
//!
//! # The equations and their sources
//!
//! All from ASHRAE Handbook—Fundamentals (2017) ch. 1. The equation numbers
//! are those cited by psychrolib's documentation (a PyPI library that codes
//! the same chapter); they were not re-checked against the printed edition.
//!
//! | quantity | equation | SI form | IP form |
//! | --- | --- | --- | --- |
//! | saturation pressure p_ws | Hyland–Wexler, eq. 5 (over ice, −100 °C to the triple point) and eq. 6 (over liquid water, triple point to 200 °C), T in kelvin / rankine | coefficients of the SI edition | coefficients of the IP edition |
//! | humidity ratio | eq. 22: W = 0.621945 p_w / (p − p_w); eq. 23 at saturation | | |
//! | relative humidity | eq. 24: φ = p_w / p_ws(t) | | |
//! | enthalpy | eq. 30 | h = 1.006 t + W (2501 + 1.86 t) | h = 0.240 t + W (1061 + 0.444 t) |
//! | specific volume | eq. 26 | v = 287.042 (t + 273.15)(1 + 1.607858 W) / p | v = 0.370486 (t + 459.67)(1 + 1.607858 W) / p |
//! | density | eq. 11: ρ = (1 + W) / v | | |
//! | wet bulb, t* ≥ freezing | eq. 33: W = ((a − b t*) W_s* − c_pa (t − t*)) / (a + c_pv t − c t*) | a, b, c = 2501, 2.326, 4.186 | a, b, c = 1093, 0.556, 1 |
//! | wet bulb, t* < freezing | eq. 35 (same shape, over ice) | a, b, c = 2830, 0.24, 2.1 | a, b, c = 1220, 0.04, 0.48 |
//! | dew / frost point | eq. 5/6 inverted (not the handbook's regressions eq. 37/38) | | |
//! | dry bulb from (h, W) | eq. 30 solved for t | t = (h − 2501 W) / (1.006 + 1.86 W) | t = (h − 1061 W) / (0.240 + 0.444 W) |
//! | standard atmosphere | eq. 3 | p = 101 325 (1 − 2.25577·10⁻⁵ Z)^5.2559 Pa | p = 14.696 (1 − 6.8754·10⁻⁶ Z)^5.2559 psia |
//!
//! The saturation pressure switches from ice to liquid water at the triple
//! point (0.01 °C, 32.018 °F) rather than at 0 °C: the two fits meet there,
//! so inverting them for the dew point has no gap. The wet-bulb balance
//! switches at the freezing point (0 °C, 32 °F), as the handbook prints it.
//! Below the triple point [`si::dew_point`] is the frost point.
//!
//! # Why the IP entry points use the IP form of each equation
//!
//! The handbook prints each equation twice, once per unit system, and the two
//! are separate roundings, not exact conversions: c_pa is 1.006 kJ/(kg·K) in
//! SI but 0.240 Btu/(lb·°F) = 1.00483 kJ/(kg·K) in IP, and likewise for the
//! wet-bulb coefficients. The enthalpy datum differs too (dry air at 0 °C in
//! SI, at 0 °F in IP: h_IP = h_SI / 2.326 + 0.240·32 Btu/lb for the same
//! air). Converting SI results to IP was measured against psychrolib's IP
//! tables (test `si_converted_to_ip_misses_psychrolib_ip_on_enthalpy_and_wet_bulb`
//! in `tests/reference.rs`): humidity ratio, specific volume and dew point
//! stay well inside the 0.05 % / 0.02 °F tolerances (worst 9·10⁻⁷, 7·10⁻⁶
//! and 1·10⁻⁵ °F), but enthalpy does not — the dry-air term differs by 0.2 %,
//! which is 21 % of h at 0 °F and 5 % RH, where h is near zero — and neither
//! does the wet bulb (worst 0.028 °F, at 50 °F and 5 % RH). So the [`ip`] module
//! evaluates the IP form of every equation natively, as psychrolib does; the
//! SI module the SI form. Both are generated from one text of the equations
//! with two coefficient sets, so they cannot drift apart in structure.
//! [`ip::State::to_si`] and [`si::State::to_ip`] convert dry bulb, humidity
//! ratio and pressure exactly (NIST SP 811) and re-evaluate every other
//! property in the target system: never convert an enthalpy by a factor alone.
//!
//! # The wet bulb near freezing
//!
//! The handbook's two wet-bulb forms do not meet at the freezing point (the
//! ice form carries the heat of fusion). For a dry bulb above freezing and a
//! wet bulb within about a degree of it, a humidity ratio can therefore
//! satisfy both forms (two wet bulbs, up to about 1.1 °F apart) or neither.
//! Where neither does, the wet bulb is the freezing point itself; where both
//! do, the crate takes the root that bisection of [dew point, dry bulb]
//! selects, which is psychrolib's procedure, so that the results match the
//! reference implementation named by the project's accuracy target. CoolProp,
//! whose model has no such jump, differs from both by up to 1.25 °F there.
//!
//! # Agreement with the reference libraries
//!
//! Measured over every row of the committed tables in
//! `tests/reference/psychro/` (dry bulb −20…120 °F, RH 5…100 %, 0…10,000 ft,
//! plus dry-bulb/wet-bulb pairs), see `tests/reference.rs`:
//!
//! * psychrolib 2.5.0 (the handbook equations): W, h, v, ρ within 7·10⁻¹⁰
//!   relative (SI) and 3·10⁻⁷ (IP, where the handbook's 0.370486 is rounded
//!   from psychrolib's 53.350/144); at wet bulb = dry bulb below freezing the
//!   IP ice form gives W 6.6·10⁻⁵ above saturation and the crate keeps W at
//!   saturation. Wet bulb within 0.0009 °F (psychrolib's own bisection
//!   tolerance), dew point within 1·10⁻⁶ °F.
//! * CoolProp 8.0.0 (real-gas humid air, `HAPropsSI`): W within 0.61 %, dew
//!   point within 0.034 °F, wet bulb within 0.052 °F except within 1.5 °F of
//!   freezing (up to 1.25 °F, see above), specific volume within 0.11 %. For
//!   the same (dry bulb, wet bulb) of very dry air W differs by up to 9 %:
//!   the difference of the two models' saturation humidity ratio (CoolProp's
//!   enhancement factor, about 0.45 %) is multiplied by W_s(t*)/W in the
//!   energy balance.
//!
//! # Root finders
//!
//! The wet bulb (eq. 33/35 solved for t*) and the dew point (eq. 5/6
//! inverted) are found by a bracketed Illinois false-position solver with a
//! bisection safeguard: the bracket always holds a sign change (it is checked
//! before the first step, and an empty bracket is a typed error), it at least
//! halves every two steps, and the loop stops after 200 evaluations at most.
//! Both are solved to a millionth of a degree (the dew point to 1.8·10⁻⁶ °F,
//! far inside the 0.001 °F required).
//!
//! # Domain
//!
//! Temperatures −100…200 °C (−148…392 °F), the range of the Hyland–Wexler
//! fits. Any pressure above zero. Where a saturation humidity ratio is needed
//! (relative humidity, wet bulb, a [`si::State`]), the temperature must be
//! below the boiling point at that pressure. A state also needs its dew point
//! and wet bulb inside the range of the correlations, so perfectly dry air
//! (W = 0, RH = 0) is not a state: its dew point does not exist. Every
//! violation is a [`PsychroError`]; no public function returns NaN or
//! infinity or panics, for any `f64` input.

#![forbid(unsafe_code)]
#![warn(missing_docs)]

#[macro_use]
mod api;
mod core;
mod error;
mod root;
mod state;
mod system;

pub use error::{PsychroError, Quantity};

/// Pascals per pound-force per square inch (exact from the definitions of the
/// pound, the standard acceleration of gravity and the inch; NIST SP 811
/// (2008) appendix B gives 6.894 757 E+03).
pub const PA_PER_PSI: f64 = 6_894.757_293_168_361;

/// SI entry points: °C, Pa, kg/kg, kJ/kg (dry air and liquid water at 0 °C),
/// m³/kg, kg/m³, m.
pub mod si {
    unit_api! {
        sys: crate::system::SI,
        name: "SI",
        module: "si",
        t: "°C",
        p: "Pa",
        w: "kg/kg",
        h: "kJ/kg",
        v: "m³/kg",
        rho: "kg/m³",
        z: "m",
        z_range: "−600…11,000 m",
        t_range: "−100…200 °C",
        example_db: "34.4",
        example_wb: "23.9",
        example_p: "101_325.0"
    }

    /// Standard-atmosphere pressure at sea level, Pa (ASHRAE Handbook—Fundamentals 2017, ch. 1).
    pub const STANDARD_PRESSURE: f64 = 101_325.0;

    impl State {
        /// The same air in IP units: dry bulb, humidity ratio and pressure
        /// converted exactly, every other property re-evaluated with the IP
        /// forms of the equations. The saturation fits of the two systems
        /// differ by up to about 0.02 %, so air at saturation in SI is
        /// accepted (and kept at saturation) in IP.
        pub fn to_ip(&self) -> Result<crate::ip::State, PsychroError> {
            crate::ip::State::from_si_parts(
                self.dry_bulb() * 1.8 + 32.0,
                self.hum_ratio(),
                self.pressure() / crate::PA_PER_PSI,
            )
        }

        pub(crate) fn from_ip_parts(db: f64, w: f64, p: f64) -> Result<Self, PsychroError> {
            state::from_db_w_converted(SYS, db, w, p).map(Self)
        }
    }
}

/// IP entry points: °F, psia, lb/lb, Btu/lb (dry air at 0 °F, liquid water at
/// 32 °F), ft³/lb, lb/ft³, ft.
///
/// Enthalpy uses the IP datum: h = 0.240 t + W (1061 + 0.444 t) Btu/lb.
pub mod ip {
    unit_api! {
        sys: crate::system::IP,
        name: "IP",
        module: "ip",
        t: "°F",
        p: "psia",
        w: "lb/lb",
        h: "Btu/lb",
        v: "ft³/lb",
        rho: "lb/ft³",
        z: "ft",
        z_range: "−2,000…36,000 ft",
        t_range: "−148…392 °F",
        example_db: "94.0",
        example_wb: "75.0",
        example_p: "14.696"
    }

    /// Standard-atmosphere pressure at sea level, psia (ASHRAE Handbook—Fundamentals 2017, ch. 1).
    pub const STANDARD_PRESSURE: f64 = 14.696;

    /// Grains per pound (7000 gr = 1 lb, NIST SP 811).
    pub const GRAINS_PER_POUND: f64 = 7000.0;

    impl State {
        /// The same air in SI units: dry bulb, humidity ratio and pressure
        /// converted exactly, every other property re-evaluated with the SI
        /// forms of the equations. The saturation fits of the two systems
        /// differ by up to about 0.02 %, so air at saturation in IP is
        /// accepted (and kept at saturation) in SI.
        pub fn to_si(&self) -> Result<crate::si::State, PsychroError> {
            crate::si::State::from_ip_parts(
                (self.dry_bulb() - 32.0) / 1.8,
                self.hum_ratio(),
                self.pressure() * crate::PA_PER_PSI,
            )
        }

        pub(crate) fn from_si_parts(db: f64, w: f64, p: f64) -> Result<Self, PsychroError> {
            state::from_db_w_converted(SYS, db, w, p).map(Self)
        }
    }
}
