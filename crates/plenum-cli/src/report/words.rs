//! The words of the assumptions table: what each default applies to and
//! the value it gave, in the report's units. (Findings and errors are worded
//! by `plenum-checks`, the same words `plenum check` prints.)

use plenum_engine::{AssumedValue, Assumption, Subject};
use plenum_model::{Design, FanArrangement, ZoneId};
use plenum_units::Measure;

use super::conv::Conv;

fn zone_name(design: &Design, id: ZoneId) -> String {
    design
        .zone(id)
        .map_or_else(|| format!("#{}", id.0), |z| z.name.clone())
}

fn pct(v: f64) -> String {
    Measure::Percent.format_number_with_unit(v, plenum_units::UnitSystem::Ip)
}

/// What an assumption is attached to, for people.
pub fn subject(a: &Assumption, design: &Design) -> String {
    match a.subject {
        Subject::Site => "site".to_string(),
        Subject::Zone(z) => format!("zone {}", zone_name(design, z)),
        Subject::Ahu(i) => design
            .ahus
            .get(i)
            .map_or_else(|| format!("ahu #{i}"), |a| format!("ahu {}", a.name)),
    }
}

/// The value an assumption gave, in the report's units.
pub fn assumed_value(a: &Assumption, c: Conv) -> String {
    let dt = |v: f64| c.show(Measure::TemperatureDifference, v);
    match a.value {
        AssumedValue::LengthFt(ft) if a.key == "elevation" => {
            format!("{} (sea level)", c.show(Measure::Length, ft))
        }
        AssumedValue::LengthFt(ft) => c.show(Measure::Length, ft),
        AssumedValue::TemperatureF(f) => c.show(Measure::Temperature, f),
        AssumedValue::TemperatureDifferenceF(f) => format!("{} rise", dt(f)),
        AssumedValue::Ratio(r) if a.key == "distribution_effectiveness" => {
            format!("E_z = {}", Measure::Factor.format_number(r, c.system))
        }
        AssumedValue::Ratio(r) => pct(r * 100.0),
        AssumedValue::Count(n) => Measure::Count.format_number_with_unit(n, c.system),
        AssumedValue::HeatBtuh(q) => c.show(Measure::Load, q),
        AssumedValue::IndoorState { db_f, rh: r } => format!(
            "{}, {}",
            c.show(Measure::Temperature, db_f),
            Measure::RelativeHumidity.format_number_with_unit(r * 100.0, c.system)
        ),
        AssumedValue::BelowLowestRoom { dt_f, supply_f } => format!(
            "{} below the lowest room: {}",
            dt(dt_f),
            c.show(Measure::Temperature, supply_f)
        ),
        AssumedValue::RisePer100Ft { dt_f, rise_f } => format!(
            "{} per {} of duct: {} rise",
            dt(dt_f),
            c.show(Measure::Length, 100.0),
            dt(rise_f)
        ),
        AssumedValue::FanRise { dt_f, arrangement } => format!(
            "{} rise, {}",
            dt(dt_f),
            match arrangement {
                FanArrangement::DrawThrough => "draw-through",
                FanArrangement::BlowThrough => "blow-through",
            }
        ),
        AssumedValue::Keyword(k) => k.to_string(),
    }
}
