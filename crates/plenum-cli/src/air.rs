//! `plenum air`: the properties of one moist-air state.

use std::process::ExitCode;

use plenum_model::AirSpec;
use plenum_psychro::{PsychroError, ip, si};
use plenum_syntax::Span;
use plenum_units::{Dimension, Measure, Quantity, Unit, UnitSystem};
use serde::Serialize;

use crate::diag::{Diag, Severity};
use crate::render::{self, FileReport};

#[derive(clap::Args, Debug)]
pub struct AirArgs {
    /// The air state, as in a design file: `94 °F db, 75 °F wb`, `75 °F, 50 %rh`,
    /// `55 °F dp, 80 °F db`, `24 °C, 0.0093 kg/kg`.
    pub state: String,
    /// Site elevation, with its unit (`1250ft`, `"381 m"`); default sea level.
    #[arg(long, allow_hyphen_values = true, conflicts_with = "pressure")]
    pub elevation: Option<String>,
    /// Barometric pressure, with its unit (`"12.2 psia"`, `"84.1 kPa"`).
    #[arg(long)]
    pub pressure: Option<String>,
    /// Units of the output.
    #[arg(long, value_enum, default_value_t = crate::Units::Ip)]
    pub units: crate::Units,
    /// Output format.
    #[arg(long, value_enum, default_value_t = AirFormat::Text)]
    pub format: AirFormat,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, clap::ValueEnum)]
pub enum AirFormat {
    Text,
    Json,
}

/// The JSON keys other tools rely on (IP).
#[derive(Serialize)]
struct IpJson {
    tdb_f: f64,
    twb_f: f64,
    tdp_f: f64,
    rh_pct: f64,
    w_lb_lb: f64,
    w_gr_lb: f64,
    h_btu_lb: f64,
    v_ft3_lb: f64,
    rho_lb_ft3: f64,
    pressure_psia: f64,
}

/// The JSON keys other tools rely on (SI).
#[derive(Serialize)]
struct SiJson {
    tdb_c: f64,
    twb_c: f64,
    tdp_c: f64,
    rh_pct: f64,
    w_kg_kg: f64,
    w_g_kg: f64,
    h_kj_kg: f64,
    v_m3_kg: f64,
    rho_kg_m3: f64,
    pressure_kpa: f64,
}

/// Parse `--elevation` or `--pressure`: one quantity of `dim`; the value in `unit`.
fn option_quantity(flag: &str, text: &str, dim: Dimension, unit: &str) -> Result<f64, String> {
    let q = Quantity::parse(text.trim()).map_err(|e| {
        format!(
            "--{flag} `{text}`: {e} (write it with its unit, e.g. `--{flag} \"{}\"`)",
            example(flag)
        )
    })?;
    let q = q
        .require(dim)
        .map_err(|e| format!("--{flag} `{text}`: {e}"))?;
    let u = Unit::parse(unit).map_err(|e| e.to_string())?;
    q.in_unit(&u).map_err(|e| format!("--{flag} `{text}`: {e}"))
}

fn example(flag: &str) -> &'static str {
    if flag == "elevation" {
        "1250 ft"
    } else {
        "12.2 psia"
    }
}

pub fn run(args: &AirArgs) -> Result<ExitCode, String> {
    let system = args.units.system();
    let spec = match plenum_model::parse_air_state(&args.state) {
        Ok(s) => s,
        Err(errors) => {
            let report = FileReport {
                name: "STATE".to_string(),
                text: args.state.clone(),
                diags: errors
                    .into_iter()
                    .map(|e| Diag {
                        code: e.code,
                        severity: Severity::Error,
                        message: e.message,
                        span: e.span,
                        label: None,
                        related: Vec::new(),
                        help: e.help,
                    })
                    .collect(),
            };
            eprint!("{}", render::text(&report));
            return Ok(ExitCode::from(1));
        }
    };
    // The pressure by the standard-atmosphere form of the output's unit system,
    // so that sea level is exactly 14.696 psia or 101.325 kPa.
    let pressure_psia = match (&args.elevation, &args.pressure, system) {
        (Some(e), _, UnitSystem::Ip) => {
            let ft = option_quantity("elevation", e, Dimension::LENGTH, "ft")?;
            ip::standard_pressure(ft).map_err(|err| format!("--elevation `{e}`: {err}"))?
        }
        (Some(e), _, UnitSystem::Si) => {
            let m = option_quantity("elevation", e, Dimension::LENGTH, "m")?;
            si::standard_pressure(m).map_err(|err| format!("--elevation `{e}`: {err}"))?
                / plenum_psychro::PA_PER_PSI
        }
        (None, Some(p), _) => {
            let psia = option_quantity("pressure", p, Dimension::PRESSURE, "psia")?;
            if psia <= 0.0 {
                return Err(format!("--pressure `{p}` must be above zero"));
            }
            psia
        }
        (None, None, UnitSystem::Ip) => ip::STANDARD_PRESSURE,
        (None, None, UnitSystem::Si) => si::STANDARD_PRESSURE / plenum_psychro::PA_PER_PSI,
    };
    let out = match system {
        UnitSystem::Ip => ip_state(spec, pressure_psia).map(|s| Output::Ip(Box::new(s))),
        UnitSystem::Si => si_state(spec, pressure_psia).map(|s| Output::Si(Box::new(s))),
    };
    let out = match out {
        Ok(o) => o,
        Err(e) => {
            let report = FileReport {
                name: "STATE".to_string(),
                text: args.state.clone(),
                diags: vec![Diag {
                    code: "out-of-range",
                    severity: Severity::Error,
                    message: format!("this air state has no psychrometric solution: {e}"),
                    span: Span::new(0, u32::try_from(args.state.len()).unwrap_or(u32::MAX)),
                    label: None,
                    related: Vec::new(),
                    help: None,
                }],
            };
            eprint!("{}", render::text(&report));
            return Ok(ExitCode::from(1));
        }
    };
    match args.format {
        AirFormat::Json => println!("{}", out.json()),
        AirFormat::Text => print!("{}", out.text(args)),
    }
    Ok(ExitCode::SUCCESS)
}

enum Output {
    Ip(Box<ip::State>),
    Si(Box<si::State>),
}

fn ip_state(spec: AirSpec, p: f64) -> Result<ip::State, PsychroError> {
    match spec {
        AirSpec::DbWb { db_f, wb_f } => ip::State::from_db_wb(db_f, wb_f, p),
        AirSpec::DbRh { db_f, rh } => ip::State::from_db_rh(db_f, rh, p),
        AirSpec::DbDp { db_f, dp_f } => ip::State::from_db_dp(db_f, dp_f, p),
        AirSpec::DbW { db_f, w } => ip::State::from_db_w(db_f, w, p),
    }
}

fn c(f: f64) -> f64 {
    (f - 32.0) / 1.8
}

/// The state computed with the SI forms of the equations, so that what was
/// given in SI reads back as given.
fn si_state(spec: AirSpec, p_psia: f64) -> Result<si::State, PsychroError> {
    let p = p_psia * plenum_psychro::PA_PER_PSI;
    match spec {
        AirSpec::DbWb { db_f, wb_f } => si::State::from_db_wb(c(db_f), c(wb_f), p),
        AirSpec::DbRh { db_f, rh } => si::State::from_db_rh(c(db_f), rh, p),
        AirSpec::DbDp { db_f, dp_f } => si::State::from_db_dp(c(db_f), c(dp_f), p),
        AirSpec::DbW { db_f, w } => si::State::from_db_w(c(db_f), w, p),
    }
}

/// The properties of the state in the output's unit system (°F, lb/lb, gr/lb,
/// Btu/lb, ft³/lb, lb/ft³, psia — or °C, kg/kg, g/kg, kJ/kg, m³/kg, kg/m³, kPa).
struct Props {
    system: UnitSystem,
    tdb: f64,
    twb: f64,
    tdp: f64,
    rh_pct: f64,
    w: f64,
    /// Humidity ratio in grains per pound or grams per kilogram.
    w_small: f64,
    h: f64,
    v: f64,
    rho: f64,
    pressure: f64,
}

impl Output {
    fn props(&self) -> Props {
        match self {
            Output::Ip(s) => Props {
                system: UnitSystem::Ip,
                tdb: s.dry_bulb(),
                twb: s.wet_bulb(),
                tdp: s.dew_point(),
                rh_pct: s.rh_percent(),
                w: s.hum_ratio(),
                w_small: s.hum_ratio() * ip::GRAINS_PER_POUND,
                h: s.enthalpy(),
                v: s.specific_volume(),
                rho: s.density(),
                pressure: s.pressure(),
            },
            Output::Si(s) => Props {
                system: UnitSystem::Si,
                tdb: s.dry_bulb(),
                twb: s.wet_bulb(),
                tdp: s.dew_point(),
                rh_pct: s.rh_percent(),
                w: s.hum_ratio(),
                w_small: s.hum_ratio() * 1000.0,
                h: s.enthalpy(),
                v: s.specific_volume(),
                rho: s.density(),
                pressure: s.pressure() / 1000.0,
            },
        }
    }

    fn json(&self) -> String {
        let p = self.props();
        let text = match p.system {
            UnitSystem::Ip => serde_json::to_string_pretty(&IpJson {
                tdb_f: p.tdb,
                twb_f: p.twb,
                tdp_f: p.tdp,
                rh_pct: p.rh_pct,
                w_lb_lb: p.w,
                w_gr_lb: p.w_small,
                h_btu_lb: p.h,
                v_ft3_lb: p.v,
                rho_lb_ft3: p.rho,
                pressure_psia: p.pressure,
            }),
            UnitSystem::Si => serde_json::to_string_pretty(&SiJson {
                tdb_c: p.tdb,
                twb_c: p.twb,
                tdp_c: p.tdp,
                rh_pct: p.rh_pct,
                w_kg_kg: p.w,
                w_g_kg: p.w_small,
                h_kj_kg: p.h,
                v_m3_kg: p.v,
                rho_kg_m3: p.rho,
                pressure_kpa: p.pressure,
            }),
        };
        text.unwrap_or_else(|_| "{}".to_string())
    }

    fn text(&self, args: &AirArgs) -> String {
        let p = self.props();
        let u = p.system;
        let t = |v: f64| Measure::Temperature.format_number_with_unit(v, u);
        let rows = [
            ("dry bulb", t(p.tdb)),
            ("wet bulb", t(p.twb)),
            ("dew point", t(p.tdp)),
            ("relative humidity", format!("{:.0} %", p.rh_pct)),
            (
                "humidity ratio",
                format!(
                    "{}  ({})",
                    Measure::HumidityRatio.format_number_with_unit(p.w, u),
                    Measure::HumidityRatioGrains.format_number_with_unit(p.w_small, u)
                ),
            ),
            (
                "enthalpy",
                Measure::Enthalpy.format_number_with_unit(p.h, u),
            ),
            (
                "specific volume",
                Measure::SpecificVolume.format_number_with_unit(p.v, u),
            ),
            (
                "density",
                Measure::Density.format_number_with_unit(p.rho, u),
            ),
        ];
        let pressure = Measure::Pressure.format_number_with_unit(p.pressure, u);
        let site = match (&args.elevation, &args.pressure) {
            (Some(e), _) => format!("at {} ({pressure})", e.trim()),
            (None, Some(_)) => format!("at {pressure}"),
            (None, None) => format!("at sea level ({pressure})"),
        };
        let mut out = format!("{}  {site}\n", args.state.trim());
        for (name, value) in rows {
            out.push_str(&format!("  {name:<18} {value}\n"));
        }
        out.push_str(
            "  (ASHRAE Handbook—Fundamentals ch. 1 equations; check inputs and results before relying on them)\n",
        );
        out
    }
}
