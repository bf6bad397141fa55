//! The two coefficient sets of the handbook equations: SI and IP.
//!
//! Every equation of this crate is written once, in [`crate::core`], over the
//! constants of one [`Sys`]. The SI set and the IP set are the two forms
//! printed in ASHRAE Handbook—Fundamentals (2017) ch. 1 (SI edition and
//! IP edition); their coefficients are the same as those coded by psychrolib.
//! The two forms are separate fits and differ by up to about 0.02 % (and, for
//! enthalpy, by the datum), which is why the IP entry points use the IP form
//! instead of converting SI results (see the crate docs).

/// One unit system: the handbook's coefficients in that system's units.
#[derive(Debug)]
pub(crate) struct Sys {
    /// Temperature unit label, e.g. `°C`.
    pub t_unit: &'static str,
    /// Pressure unit label, e.g. `Pa`.
    pub p_unit: &'static str,
    /// Elevation unit label, e.g. `m`.
    pub z_unit: &'static str,
    /// Absolute temperature of the scale zero: 273.15 K or 459.67 °R.
    pub abs_zero: f64,
    /// Triple point of water (0.01 °C, 32.018 °F): the ice/liquid switch of
    /// the Hyland–Wexler saturation pressure.
    pub triple_point: f64,
    /// Freezing point (0 °C, 32 °F): the ice/liquid switch of the wet-bulb
    /// energy balance.
    pub freezing: f64,
    /// Lowest temperature of the correlations (−100 °C, −148 °F).
    pub t_min: f64,
    /// Highest temperature of the correlations (200 °C, 392 °F).
    pub t_max: f64,
    /// Hyland–Wexler over ice, handbook eq. (5): C1..C7.
    pub ice: [f64; 7],
    /// Hyland–Wexler over liquid water, handbook eq. (6): C8..C13.
    pub water: [f64; 6],
    /// Specific heat of dry air in the enthalpy equation (1.006 or 0.240).
    pub cp_da: f64,
    /// Enthalpy of water vapour at the datum (2501 or 1061).
    pub h_g0: f64,
    /// Specific heat of water vapour in the enthalpy equation (1.86 or 0.444).
    pub cp_wv: f64,
    /// Wet-bulb energy balance over liquid water (t* ≥ freezing):
    /// `W = ((a − b t*) W_s* − cp_da (t − t*)) / (a + cp_wv t − c t*)`, as `[a, b, c]`.
    pub wb_water: [f64; 3],
    /// The same over ice (t* < freezing), as `[a, b, c]`.
    pub wb_ice: [f64; 3],
    /// Gas-constant factor of the specific-volume equation:
    /// `v = r_da (t + abs_zero)(1 + 1.607858 W) / p`.
    pub r_da: f64,
    /// Standard-atmosphere sea-level pressure (101 325 Pa, 14.696 psia).
    pub p0: f64,
    /// Standard-atmosphere lapse coefficient (2.25577e-5 /m, 6.8754e-6 /ft).
    pub atm_k: f64,
    /// Lowest elevation accepted by the standard-atmosphere equation.
    pub z_min: f64,
    /// Highest elevation accepted (the top of the troposphere, about 11 km).
    pub z_max: f64,
    /// Width to which temperatures are solved (a millionth of a degree).
    pub t_tol: f64,
}

/// SI: °C, Pa, kg/kg, kJ/kg (dry air and liquid water at 0 °C), m³/kg, kg/m³, m.
pub(crate) const SI: Sys = Sys {
    t_unit: "°C",
    p_unit: "Pa",
    z_unit: "m",
    abs_zero: 273.15,
    triple_point: 0.01,
    freezing: 0.0,
    t_min: -100.0,
    t_max: 200.0,
    ice: [
        -5.674_535_9e3,
        6.392_524_7,
        -9.677_843e-3,
        6.221_570_1e-7,
        2.074_782_5e-9,
        -9.484_024e-13,
        4.163_501_9,
    ],
    water: [
        -5.800_220_6e3,
        1.391_499_3,
        -4.864_023_9e-2,
        4.176_476_8e-5,
        -1.445_209_3e-8,
        6.545_967_3,
    ],
    cp_da: 1.006,
    h_g0: 2501.0,
    cp_wv: 1.86,
    wb_water: [2501.0, 2.326, 4.186],
    wb_ice: [2830.0, 0.24, 2.1],
    r_da: 287.042,
    p0: 101_325.0,
    atm_k: 2.255_77e-5,
    z_min: -600.0,
    z_max: 11_000.0,
    t_tol: 1e-6,
};

/// IP: °F, psia, lb/lb, Btu/lb (dry air at 0 °F, liquid water at 32 °F), ft³/lb, lb/ft³, ft.
pub(crate) const IP: Sys = Sys {
    t_unit: "°F",
    p_unit: "psia",
    z_unit: "ft",
    abs_zero: 459.67,
    triple_point: 32.018,
    freezing: 32.0,
    t_min: -148.0,
    t_max: 392.0,
    ice: [
        -1.021_416_5e4,
        -4.893_242_8,
        -5.376_579_4e-3,
        1.920_237_7e-7,
        3.557_583_2e-10,
        -9.034_468_8e-14,
        4.163_501_9,
    ],
    water: [
        -1.044_039_7e4,
        -1.129_465_0e1,
        -2.702_235_5e-2,
        1.289_036_0e-5,
        -2.478_068_1e-9,
        6.545_967_3,
    ],
    cp_da: 0.240,
    h_g0: 1061.0,
    cp_wv: 0.444,
    wb_water: [1093.0, 0.556, 1.0],
    wb_ice: [1220.0, 0.04, 0.48],
    r_da: 0.370_486,
    p0: 14.696,
    atm_k: 6.8754e-6,
    z_min: -2_000.0,
    z_max: 36_000.0,
    t_tol: 1.8e-6,
};
