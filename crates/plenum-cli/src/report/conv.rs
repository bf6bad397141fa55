//! The engine's IP numbers in the report's unit system.
//!
//! The engine works in IP (°F, Btu/h, cfm, lb/h). A report in SI converts
//! each number with the units of the [`Measure`] it is shown as, so every
//! factor comes from the one unit table (NIST SP 811, appendix B) and no
//! figure is computed again. Two quantities need more than a factor:
//!
//! * temperatures (°F → °C) go through the scale's offset, differences
//!   (°F → K) do not — both by [`plenum_units`];
//! * enthalpy changes datum: the engine's enthalpy is the IP form of the
//!   ASHRAE equation, zero for dry air at 0 °F; SI enthalpy is zero for dry
//!   air at 0 °C. The report moves the datum by the dry-air enthalpy of
//!   32 °F in that same equation (c_p,a · 32 °F = 7.68 Btu/lb) and converts
//!   by the factor (1 Btu/lb = 2.326 kJ/kg exactly): h_SI = 2.326 (h_IP − 7.68).
//!   So m · Δh in the report equals the coil load in either system. (The SI
//!   form of the handbook equation is a separate rounding, c_p,a = 1.006
//!   against 0.240 Btu/(lb·°F) = 1.0048 kJ/(kg·K); at comfort states it gives
//!   a value about 0.03 kJ/kg higher — see plenum-psychro's notes.)
//!
//! A conversion that fails (it cannot for the engine's finite numbers) gives
//! NaN: text shows it as `—` and the JSON writer refuses it.

use plenum_units::{Measure, Quantity, Unit, UnitSystem};

/// The report's unit system, and the conversions into it.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Conv {
    pub system: UnitSystem,
}

impl Conv {
    pub fn new(system: UnitSystem) -> Conv {
        Conv { system }
    }

    pub fn is_si(self) -> bool {
        self.system == UnitSystem::Si
    }

    /// An engine number (IP, in `measure`'s IP unit) in `measure`'s unit of
    /// the report's system.
    pub fn to(self, measure: Measure, ip_value: f64) -> f64 {
        match self.system {
            UnitSystem::Ip => ip_value,
            UnitSystem::Si => {
                if measure == Measure::Enthalpy {
                    return between(
                        ip_value - plenum_engine::CP_DRY_AIR * 32.0,
                        &measure.unit(UnitSystem::Ip),
                        &measure.unit(UnitSystem::Si),
                    );
                }
                between(
                    ip_value,
                    &measure.unit(UnitSystem::Ip),
                    &measure.unit(UnitSystem::Si),
                )
            }
        }
    }

    /// An engine number shown with the trade's precision (no unit).
    pub fn num(self, measure: Measure, ip_value: f64) -> String {
        measure.format_number(self.to(measure, ip_value), self.system)
    }

    /// An engine number shown with the trade's precision and its unit.
    pub fn show(self, measure: Measure, ip_value: f64) -> String {
        measure.format_number_with_unit(self.to(measure, ip_value), self.system)
    }

    /// A heat flow from the engine (Btu/h) in `measure`'s unit of the
    /// report's system: kBtu/h or kW for [`Measure::LoadCompact`], ton or kW
    /// for [`Measure::Capacity`].
    pub fn heat(self, measure: Measure, btuh: f64) -> f64 {
        between(
            btuh,
            &Measure::Load.unit(UnitSystem::Ip),
            &measure.unit(self.system),
        )
    }

    /// [`Conv::heat`] shown with the trade's precision (no unit).
    pub fn heat_num(self, measure: Measure, btuh: f64) -> String {
        measure.format_number(self.heat(measure, btuh), self.system)
    }

    /// The unit label of a measure in the report's system.
    pub fn label(self, measure: Measure) -> &'static str {
        measure.label(self.system)
    }

    /// Condensate: US gal/h in IP, L/h in SI (no [`Measure`] has these units).
    pub fn condensate_volume(self, gal_h: f64) -> f64 {
        match self.system {
            UnitSystem::Ip => gal_h,
            UnitSystem::Si => match (Unit::parse("gal/h"), Unit::parse("L/h")) {
                (Ok(from), Ok(to)) => between(gal_h, &from, &to),
                _ => f64::NAN,
            },
        }
    }
}

/// `value` in unit `from`, expressed in unit `to`; NaN when that cannot be.
fn between(value: f64, from: &Unit, to: &Unit) -> f64 {
    Quantity::new(value, from)
        .and_then(|q| q.in_unit(to))
        .unwrap_or(f64::NAN)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn si() -> Conv {
        Conv::new(UnitSystem::Si)
    }

    /// NIST SP 811 appendix B factors, checked against the printed values.
    #[test]
    fn si_factors_are_nist_sp_811() {
        let rel = |a: f64, b: f64| ((a - b) / b).abs();
        // B.8: cubic foot per minute → m³/s 4.719 474 E−04 (so 0.4719474 L/s).
        assert!(rel(si().to(Measure::Airflow, 1.0), 0.471_947_4) < 1e-6);
        // B.8: Btu_IT/h → W 2.930 711 E−01.
        assert!(rel(si().to(Measure::Load, 1.0), 0.293_071_1) < 1e-6);
        // B.8: ton of refrigeration → W 3.516 853 E+03 (so 3.516853 kW).
        assert!(rel(si().to(Measure::Capacity, 1.0), 3.516_853) < 1e-6);
        // lb/h → kg/s: 0.453 592 37 / 3600 (exact).
        assert!(rel(si().to(Measure::MassFlow, 3600.0), 0.453_592_37) < 1e-12);
        // B.8: gallon (U.S.) → m³ 3.785 412 E−03.
        assert!(rel(si().condensate_volume(1.0), 3.785_412) < 1e-6);
        // B.9: t/°C = (t/°F − 32)/1.8; a difference of 1 °F is 1/1.8 K.
        assert!((si().to(Measure::Temperature, 75.2) - 24.0).abs() < 1e-12);
        assert!((si().to(Measure::TemperatureDifference, 18.0) - 10.0).abs() < 1e-12);
        // Humidity ratio and RH are the same number in both systems.
        assert_eq!(si().to(Measure::HumidityRatio, 0.0093), 0.0093);
    }

    /// The enthalpy datum: dry air at 32 °F is 7.68 Btu/lb by the IP form of
    /// the ASHRAE Handbook—Fundamentals (2017) ch. 1 equation and 0 kJ/kg by
    /// the SI form; a difference of 1 Btu/lb is 2.326 kJ/kg exactly.
    #[test]
    fn enthalpy_moves_its_datum_to_zero_celsius() {
        assert!(si().to(Measure::Enthalpy, 7.68).abs() < 1e-12);
        let dh = si().to(Measure::Enthalpy, 30.0) - si().to(Measure::Enthalpy, 20.0);
        assert!((dh - 23.26).abs() < 1e-9);
        // 24 °C, W = 0.0093: the SI form gives 1.006·24 + 0.0093 (2501 + 1.86·24)
        // = 47.82 kJ/kg; the IP form at 75.2 °F converted is within 0.05 kJ/kg.
        let h_ip = 0.240 * 75.2 + 0.0093 * (1061.0 + 0.444 * 75.2);
        let h_si = 1.006 * 24.0 + 0.0093 * (2501.0 + 1.86 * 24.0);
        assert!((si().to(Measure::Enthalpy, h_ip) - h_si).abs() < 0.05);
    }

    #[test]
    fn ip_is_the_engine_number_unchanged() {
        let ip = Conv::new(UnitSystem::Ip);
        assert_eq!(ip.to(Measure::Enthalpy, 28.1), 28.1);
        assert_eq!(ip.to(Measure::Temperature, 55.0), 55.0);
        assert_eq!(ip.condensate_volume(1.5), 1.5);
        assert_eq!(ip.show(Measure::Airflow, 4_832.4), "4,830 cfm");
        assert_eq!(si().show(Measure::Airflow, 4_832.4), "2,281 L/s");
        // Heat flows from Btu/h into the compact and capacity units.
        assert_eq!(ip.heat_num(Measure::LoadCompact, 171_447.6), "171.4");
        assert_eq!(ip.heat_num(Measure::Capacity, 150_000.0), "12.5");
        assert_eq!(si().heat_num(Measure::Capacity, 150_000.0), "44.0");
        assert_eq!(si().heat_num(Measure::LoadCompact, 12_000.0), "3.5");
    }
}
