//! The two unit systems and the unit each dimension prefers in each.

use std::fmt;
use std::str::FromStr;

use crate::dimension::Dimension;
use crate::table::{self, UnitDef};
use crate::unit::Unit;

/// Inch-pound or SI: the display system of a project (`units ip | si`), and the system an
/// engine works in.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Default)]
pub enum UnitSystem {
    /// Inch-pound units (°F, Btu/h, cfm, ft², psia).
    #[default]
    Ip,
    /// SI units (°C, W, L/s, m², kPa).
    Si,
}

impl UnitSystem {
    /// The other system (for the hover's "value in the other unit system").
    pub fn other(self) -> UnitSystem {
        match self {
            UnitSystem::Ip => UnitSystem::Si,
            UnitSystem::Si => UnitSystem::Ip,
        }
    }

    /// The unit a dimension is worked in, in this system, or `None` for a dimension without
    /// one. These are the engine's numbers (methods.md is written in them): IP uses ft, ft²,
    /// lb, h, °F, Btu, Btu/h, cfm, psia, fpm, lb/lb, Btu/lb, lb/h; SI uses m, m², kg, s, °C, K,
    /// kJ, W, L/s, kPa, m/s, kg/kg, kJ/kg, kg/s. A ratio is a plain fraction (`0.95`, not
    /// `95`) in both.
    ///
    /// ```
    /// use plenum_units::{Dimension, UnitSystem};
    /// let u = UnitSystem::Ip.preferred_unit(Dimension::HEAT_FLOW);
    /// assert_eq!(u.map(|u| u.to_string()).as_deref(), Some("Btu/h"));
    /// ```
    pub fn preferred_unit(self, dim: Dimension) -> Option<Unit> {
        PREFERRED.iter().find(|p| p.dim == dim).map(|p| match self {
            UnitSystem::Ip => Unit::known(p.ip, p.dim, p.ip_label),
            UnitSystem::Si => Unit::known(p.si, p.dim, p.si_label),
        })
    }
}

impl fmt::Display for UnitSystem {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            UnitSystem::Ip => "ip",
            UnitSystem::Si => "si",
        })
    }
}

/// The error of [`UnitSystem::from_str`]: only `ip` and `si` are unit systems.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct UnknownUnitSystem(pub String);

impl fmt::Display for UnknownUnitSystem {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "unknown unit system `{}`: expected `ip` or `si`", self.0)
    }
}

impl std::error::Error for UnknownUnitSystem {}

impl FromStr for UnitSystem {
    type Err = UnknownUnitSystem;

    /// `ip` or `si`, in any letter case.
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        if s.eq_ignore_ascii_case("ip") {
            Ok(UnitSystem::Ip)
        } else if s.eq_ignore_ascii_case("si") {
            Ok(UnitSystem::Si)
        } else {
            Err(UnknownUnitSystem(s.to_string()))
        }
    }
}

pub(crate) type Terms = &'static [(&'static UnitDef, i32)];

struct Preferred {
    dim: Dimension,
    ip: Terms,
    ip_label: Option<&'static str>,
    si: Terms,
    si_label: Option<&'static str>,
}

const fn pref(dim: Dimension, ip: Terms, si: Terms) -> Preferred {
    Preferred {
        dim,
        ip,
        ip_label: None,
        si,
        si_label: None,
    }
}

use table::{
    BTU_, CFM, DEG_C, DEG_F, DELTA_C, DELTA_F, FOOT, FPM, HOUR, KELVIN, KG, KG_KG, KJ, KPA, KW,
    LB_LB, LITRE, M, PERSON, POUND, PSIA, SECOND, TON, WATT,
};

static PREFERRED: [Preferred; 24] = [
    pref(Dimension::RATIO, &[], &[]),
    pref(Dimension::LENGTH, &[(&FOOT, 1)], &[(&M, 1)]),
    pref(Dimension::AREA, &[(&FOOT, 2)], &[(&M, 2)]),
    pref(Dimension::VOLUME, &[(&FOOT, 3)], &[(&M, 3)]),
    pref(Dimension::MASS, &[(&POUND, 1)], &[(&KG, 1)]),
    pref(Dimension::TIME, &[(&HOUR, 1)], &[(&SECOND, 1)]),
    pref(Dimension::TEMPERATURE, &[(&DEG_F, 1)], &[(&DEG_C, 1)]),
    Preferred {
        dim: Dimension::TEMPERATURE_DIFFERENCE,
        ip: &[(&DELTA_F, 1)],
        ip_label: Some("°F"),
        // A kelvin of difference, written with the difference symbol so it is never absolute.
        si: &[(&DELTA_C, 1)],
        si_label: Some("K"),
    },
    pref(Dimension::ENERGY, &[(&BTU_, 1)], &[(&KJ, 1)]),
    pref(
        Dimension::HEAT_FLOW,
        &[(&BTU_, 1), (&HOUR, -1)],
        &[(&WATT, 1)],
    ),
    pref(
        Dimension::AIRFLOW,
        &[(&CFM, 1)],
        &[(&LITRE, 1), (&SECOND, -1)],
    ),
    pref(Dimension::PRESSURE, &[(&PSIA, 1)], &[(&KPA, 1)]),
    pref(Dimension::VELOCITY, &[(&FPM, 1)], &[(&M, 1), (&SECOND, -1)]),
    pref(
        Dimension::AIRFLOW_PER_PERSON,
        &[(&CFM, 1), (&PERSON, -1)],
        &[(&LITRE, 1), (&SECOND, -1), (&PERSON, -1)],
    ),
    pref(
        Dimension::POWER_PER_AREA,
        &[(&WATT, 1), (&FOOT, -2)],
        &[(&WATT, 1), (&M, -2)],
    ),
    pref(Dimension::HUMIDITY_RATIO, &[(&LB_LB, 1)], &[(&KG_KG, 1)]),
    pref(
        Dimension::SPECIFIC_ENTHALPY,
        &[(&BTU_, 1), (&POUND, -1)],
        &[(&KJ, 1), (&KG, -1)],
    ),
    pref(Dimension::COUNT, &[(&PERSON, 1)], &[(&PERSON, 1)]),
    pref(
        Dimension::MASS_FLOW,
        &[(&POUND, 1), (&HOUR, -1)],
        &[(&KG, 1), (&SECOND, -1)],
    ),
    Preferred {
        dim: Dimension::MOISTURE_FLOW,
        // lb of water per hour, written as (lb/lb)·lb/h and labelled `lb/h`.
        ip: &[(&LB_LB, 1), (&POUND, 1), (&HOUR, -1)],
        ip_label: Some("lb/h"),
        si: &[(&KG_KG, 1), (&KG, 1), (&SECOND, -1)],
        si_label: Some("kg/s"),
    },
    pref(
        Dimension::DENSITY,
        &[(&POUND, 1), (&FOOT, -3)],
        &[(&KG, 1), (&M, -3)],
    ),
    pref(
        Dimension::SPECIFIC_VOLUME,
        &[(&FOOT, 3), (&POUND, -1)],
        &[(&M, 3), (&KG, -1)],
    ),
    pref(
        Dimension::SPECIFIC_HEAT,
        &[(&BTU_, 1), (&POUND, -1), (&DEG_F, -1)],
        &[(&KJ, 1), (&KG, -1), (&KELVIN, -1)],
    ),
    pref(
        Dimension::AIRFLOW_PER_CAPACITY,
        &[(&CFM, 1), (&TON, -1)],
        &[(&LITRE, 1), (&SECOND, -1), (&KW, -1)],
    ),
];
