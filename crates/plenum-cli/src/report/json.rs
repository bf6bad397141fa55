//! `--format json`: the interface other tools read.
//!
//! Every number is the engine's own, at full precision, converted to the
//! report's unit system by [`Conv`] and named with its unit as the key's
//! suffix (`supply_airflow_cfm` / `supply_airflow_l_s`). A value that does not
//! exist is `null`. The keys are documented in `schemas/README.md` and fixed
//! by `schemas/report-ip.schema.json` and `schemas/report-si.schema.json`.

use plenum_engine::{
    AhuResult, CaseResult, EvMethod, FanSource, PressureSource, StatePoint, VentilationProcedure,
};
use plenum_model::{FanArrangement, MotorLocation};
use plenum_units::{Measure, UnitSystem};

use super::collect::{Assumed, Note, Pos};
use super::conv::Conv;
use super::jsonw::{J, Obj};
use super::{CAUTION, Report, SCHEMA};

/// The key suffix of a measure's unit.
fn suffix(m: Measure, s: UnitSystem) -> &'static str {
    let ip = s == UnitSystem::Ip;
    match m {
        Measure::Airflow => pick(ip, "cfm", "l_s"),
        Measure::MassFlow => pick(ip, "lb_h", "kg_s"),
        Measure::Load => pick(ip, "btu_h", "w"),
        Measure::Capacity => pick(ip, "tons", "kw"),
        Measure::Temperature => pick(ip, "f", "c"),
        Measure::TemperatureDifference => pick(ip, "f", "k"),
        Measure::HumidityRatio => pick(ip, "lb_lb", "kg_kg"),
        Measure::Enthalpy => pick(ip, "btu_lb", "kj_kg"),
        Measure::Pressure => pick(ip, "psia", "kpa"),
        Measure::Length => pick(ip, "ft", "m"),
        Measure::Area => pick(ip, "ft2", "m2"),
        Measure::Velocity => pick(ip, "fpm", "m_s"),
        Measure::Power => pick(ip, "bhp", "kw"),
        Measure::WaterFlow => pick(ip, "gpm", "l_s"),
        Measure::MoistureFlow => pick(ip, "lb_h", "kg_h"),
        Measure::AirflowPerPerson => pick(ip, "cfm_per_person", "l_s_per_person"),
        Measure::AirflowPerArea => pick(ip, "cfm_per_ft2", "l_s_per_m2"),
        Measure::AirflowPerCapacity => pick(ip, "cfm_per_ton", "l_s_per_kw"),
        Measure::SpecificVolume => pick(ip, "ft3_lb", "m3_kg"),
        _ => "",
    }
}

fn pick(ip: bool, a: &'static str, b: &'static str) -> &'static str {
    if ip { a } else { b }
}

/// Writes keys named by their unit.
#[derive(Clone, Copy)]
struct W {
    c: Conv,
}

impl W {
    fn key(self, base: &str, m: Measure) -> String {
        format!("{base}_{}", suffix(m, self.c.system))
    }

    fn q(self, o: &mut Obj, base: &str, m: Measure, ip_value: f64) {
        o.set(self.key(base, m), self.c.to(m, ip_value));
    }

    fn opt(self, o: &mut Obj, base: &str, m: Measure, ip_value: Option<f64>) {
        o.set(self.key(base, m), ip_value.map(|v| self.c.to(m, v)));
    }

    fn state(self, s: &StatePoint) -> Obj {
        let mut o = Obj::new();
        self.q(&mut o, "tdb", Measure::Temperature, s.tdb_f);
        self.q(&mut o, "twb", Measure::Temperature, s.twb_f);
        self.q(&mut o, "tdp", Measure::Temperature, s.tdp_f);
        self.q(&mut o, "w", Measure::HumidityRatio, s.w_lb_lb);
        self.q(&mut o, "h", Measure::Enthalpy, s.h_btu_lb);
        o.set("rh_pct", s.rh_pct);
        self.q(&mut o, "v", Measure::SpecificVolume, s.v_ft3_lb);
        o
    }

    fn pos(self, o: &mut Obj, p: &Pos) {
        o.set("file", p.file.as_str());
        o.set("line", p.line);
        o.set("column", p.column);
    }

    /// The figures of one design case, as keys of `o`.
    fn case(self, o: &mut Obj, r: &CaseResult) {
        self.q(o, "supply_airflow", Measure::Airflow, r.supply_airflow_cfm);
        self.q(o, "dry_air_flow", Measure::MassFlow, r.dry_air_flow_lb_h);
        self.q(
            o,
            "outdoor_airflow",
            Measure::Airflow,
            r.outdoor_airflow_cfm,
        );
        self.q(
            o,
            "outdoor_dry_air_flow",
            Measure::MassFlow,
            r.outdoor_air_lb_h,
        );
        o.set("outdoor_air_fraction", r.outdoor_air_fraction);
        self.q(
            o,
            "ventilation_required",
            Measure::Airflow,
            r.ventilation_required_cfm,
        );
        self.q(
            o,
            "ventilation_shortfall",
            Measure::Airflow,
            r.ventilation_shortfall_cfm,
        );
        self.q(o, "block_sensible", Measure::Load, r.block_sensible_btuh);
        self.q(o, "block_latent", Measure::Load, r.block_latent_btuh);
        let s = &r.states;
        let mut states = Obj::new();
        states.set("outdoor", self.state(&s.outdoor));
        states.set(
            "outdoor_after_fan",
            s.outdoor_after_fan.as_ref().map(|x| self.state(x)),
        );
        states.set("return", self.state(&s.return_air));
        states.set("mixed", self.state(&s.mixed));
        states.set("entering", self.state(&s.entering));
        states.set("leaving", self.state(&s.leaving));
        states.set("supply", self.state(&s.supply));
        states.set("room", self.state(&s.room));
        o.set("states", states);
        let k = &r.coil;
        let mut coil = Obj::new();
        self.q(&mut coil, "total", Measure::Load, k.total_btuh);
        self.q(&mut coil, "sensible", Measure::Load, k.sensible_btuh);
        self.q(&mut coil, "latent", Measure::Load, k.latent_btuh);
        coil.set("tons", k.tons);
        if self.c.is_si() {
            self.q(&mut coil, "total", Measure::Capacity, k.tons);
        }
        coil.set("shr", k.shr);
        self.q(&mut coil, "adp", Measure::Temperature, k.adp_f);
        coil.set("bypass_factor", k.bypass_factor);
        coil.set(
            pick(!self.c.is_si(), "condensate_gal_h", "condensate_l_h"),
            self.c.condensate_volume(k.condensate_gal_h),
        );
        self.q(
            &mut coil,
            "condensate",
            Measure::MoistureFlow,
            k.condensate_lb_h,
        );
        coil.set("dry", k.dry);
        self.opt(
            &mut coil,
            "chilled_water",
            Measure::WaterFlow,
            k.chilled_water_gpm,
        );
        self.opt(
            &mut coil,
            "face_velocity",
            Measure::Velocity,
            k.face_velocity_fpm,
        );
        coil.set(
            suffix(Measure::AirflowPerCapacity, self.c.system),
            self.c.to(Measure::AirflowPerCapacity, k.cfm_per_ton),
        );
        o.set("coil", coil);
        let cap = &r.capacity;
        o.set("rated_tons", cap.rated_tons);
        if self.c.is_si() {
            self.opt(o, "rated", Measure::Capacity, cap.rated_tons);
        }
        self.opt(o, "rated", Measure::Load, cap.rated_btuh);
        self.opt(o, "rated_sensible", Measure::Load, cap.rated_sensible_btuh);
        o.set("margin", cap.margin);
        o.set("sensible_margin", cap.sensible_margin);
        o.set("status", cap.status.key());
        let sa = &r.standard_air;
        let mut std = Obj::new();
        self.q(
            &mut std,
            "supply_airflow",
            Measure::Airflow,
            sa.supply_airflow_cfm,
        );
        std.set("supply_airflow_diff_pct", sa.supply_airflow_diff_pct);
        self.q(&mut std, "coil_total", Measure::Load, sa.coil_total_btuh);
        std.set("coil_total_diff_pct", sa.coil_total_diff_pct);
        o.set("standard_air", std);
        let mut rises = Obj::new();
        let dt = Measure::TemperatureDifference;
        self.q(&mut rises, "supply_duct", dt, r.rises.supply_duct_f);
        self.q(&mut rises, "fan", dt, r.rises.fan_f);
        self.q(&mut rises, "return_duct", dt, r.rises.return_duct_f);
        self.q(&mut rises, "plenum", dt, r.rises.plenum_f);
        self.q(&mut rises, "outdoor_fan", dt, r.rises.outdoor_fan_f);
        o.set("rises", rises);
        let f = &r.fan;
        let mut fan = Obj::new();
        fan.set(
            "arrangement",
            match f.arrangement {
                FanArrangement::DrawThrough => "draw_through",
                FanArrangement::BlowThrough => "blow_through",
            },
        );
        fan.set(
            "motor",
            match f.motor {
                MotorLocation::InAirstream => "in_airstream",
                MotorLocation::Outside => "outside",
            },
        );
        fan.set(
            "source",
            match f.source {
                FanSource::Power => "power",
                FanSource::Static => "static",
                FanSource::Rise => "rise",
                FanSource::Default => "default",
            },
        );
        self.opt(&mut fan, "shaft_power", Measure::Power, f.shaft_power_bhp);
        self.q(&mut fan, "heat", Measure::Load, f.heat_btuh);
        self.q(&mut fan, "rise", dt, f.rise_f);
        o.set("fan", fan);
        let v = &r.ventilation;
        let mut vent = Obj::new();
        vent.set(
            "procedure",
            match v.procedure {
                VentilationProcedure::SingleZone => "single_zone",
                VentilationProcedure::MultipleZone => "multiple_zone",
                VentilationProcedure::AllOutdoorAir => "all_outdoor_air",
            },
        );
        self.q(&mut vent, "sum_v_oz", Measure::Airflow, v.sum_v_oz_cfm);
        self.q(&mut vent, "v_ot", Measure::Airflow, v.v_ot_cfm);
        vent.set(
            "multiple_zone",
            v.multiple_zone.map(|m| {
                let mut mz = Obj::new();
                mz.set("occupant_diversity", m.occupant_diversity);
                self.q(&mut mz, "v_ou", Measure::Airflow, m.v_ou_cfm);
                self.q(&mut mz, "v_ps", Measure::Airflow, m.v_ps_cfm);
                mz.set("x_s", m.x_s);
                mz.set(
                    "e_v_method",
                    match m.e_v_method {
                        EvMethod::Simplified => "simplified",
                        EvMethod::Calculated => "calculated",
                        EvMethod::Given => "given",
                    },
                );
                mz.set("e_v", m.e_v);
                mz
            }),
        );
        o.set("ventilation", vent);
    }

    fn ahu(self, design: &str, entry: &super::collect::AhuEntry, r: &AhuResult) -> Obj {
        let mut o = Obj::new();
        o.set("design", design);
        o.set("name", entry.name.as_str());
        o.set("label", entry.label.clone());
        self.pos(&mut o, &entry.pos);
        o.set(
            "serves",
            entry
                .serves
                .iter()
                .map(|z| J::from(z.as_str()))
                .collect::<Vec<_>>(),
        );
        o.set("governing_case", r.governing.key());
        self.q(
            &mut o,
            "supply_temp",
            Measure::Temperature,
            r.inputs.supply_temp_f,
        );
        self.case(&mut o, r.governing());
        let mut cases = Obj::new();
        let mut cooling = Obj::new();
        self.case(&mut cooling, &r.cooling);
        cases.set("cooling", cooling);
        cases.set(
            "dehumid",
            r.dehumid.as_ref().map(|d| {
                let mut x = Obj::new();
                self.case(&mut x, d);
                x
            }),
        );
        o.set("cases", cases);
        o.set(
            "assumptions",
            entry.assumptions.iter().map(assumption).collect::<Vec<_>>(),
        );
        o.set(
            "findings",
            entry
                .findings
                .iter()
                .map(|n| self.note(n))
                .collect::<Vec<_>>(),
        );
        o
    }

    fn note(self, n: &Note) -> J {
        let mut o = Obj::new();
        o.set("code", n.code);
        o.set("severity", n.severity.as_str());
        o.set("message", n.message.as_str());
        o.set("help", n.help.clone());
        self.pos(&mut o, &n.pos);
        J::Obj(o)
    }

    fn diagnostic(self, design: &str, d: &Note) -> J {
        let mut o = Obj::new();
        o.set("design", design);
        self.pos(&mut o, &d.pos);
        o.set("end_line", d.pos.end_line);
        o.set("end_column", d.pos.end_column);
        o.set("code", d.code);
        o.set("severity", d.severity.as_str());
        o.set("message", d.message.as_str());
        o.set("help", d.help.clone());
        J::Obj(o)
    }
}

fn assumption(a: &Assumed) -> J {
    J::Obj(
        Obj::new()
            .with("key", a.key)
            .with("value", a.value.as_str())
            .with("source", a.source)
            .with("subject", a.subject.as_str())
            .with("zone", a.zone.clone()),
    )
}

/// The whole report as one JSON document.
pub fn render(report: &Report) -> Result<String, String> {
    let w = W { c: report.conv };
    let mut designs = Vec::new();
    let mut ahus = Vec::new();
    let mut left_out = Vec::new();
    let mut zones = Vec::new();
    let mut diagnostics = Vec::new();
    for d in &report.designs {
        let name = d.file.as_str();
        let mut o = Obj::new();
        o.set("file", name);
        o.set("project", d.project.clone());
        o.set(
            "site",
            d.eval.site.as_ref().ok().map(|s| {
                let mut site = Obj::new();
                w.q(&mut site, "pressure", Measure::Pressure, s.pressure_psia);
                let (source, elevation) = match s.pressure_source {
                    PressureSource::Given => ("given", None),
                    PressureSource::Elevation { elevation_ft } => ("elevation", Some(elevation_ft)),
                    PressureSource::SeaLevelAssumed => ("sea_level_assumed", None),
                };
                site.set("pressure_source", source);
                w.opt(&mut site, "elevation", Measure::Length, elevation);
                site.set("cooling", w.state(&s.cooling));
                site.set("dehumid", s.dehumid.as_ref().map(|x| w.state(x)));
                site
            }),
        );
        o.set(
            "findings",
            d.findings.iter().map(|n| w.note(n)).collect::<Vec<_>>(),
        );
        designs.push(J::Obj(o));
        for (entry, r) in d.computed() {
            ahus.push(J::Obj(w.ahu(name, entry, r)));
        }
        for entry in d.left_out() {
            let mut o = Obj::new();
            o.set("design", name);
            o.set("name", entry.name.as_str());
            o.set("label", entry.label.clone());
            w.pos(&mut o, &entry.pos);
            o.set(
                "reasons",
                entry
                    .reasons
                    .iter()
                    .map(|x| w.diagnostic(name, x))
                    .collect::<Vec<_>>(),
            );
            left_out.push(J::Obj(o));
        }
        for z in &d.zones {
            let mut o = Obj::new();
            o.set("design", name);
            o.set("name", z.name.as_str());
            o.set("label", z.label.clone());
            w.pos(&mut o, &z.pos);
            o.set(
                "served_by",
                z.served_by
                    .iter()
                    .map(|a| J::from(a.as_str()))
                    .collect::<Vec<_>>(),
            );
            o.set(
                "air_handler",
                z.ahu.and_then(|i| d.ahus.get(i)).map(|a| a.name.as_str()),
            );
            o.set("case", z.case.map(|c| c.key()));
            let inputs = d
                .eval
                .zones
                .get(z.index)
                .and_then(|x| x.inputs.as_ref().ok());
            w.opt(&mut o, "area", Measure::Area, inputs.map(|i| i.area_ft2));
            o.set("people", inputs.map(|i| i.people));
            o.set("category", inputs.and_then(|i| i.category.map(|c| c.name)));
            w.opt(
                &mut o,
                "sensible",
                Measure::Load,
                inputs.map(|i| i.sensible_btuh),
            );
            w.opt(
                &mut o,
                "latent",
                Measure::Load,
                inputs.map(|i| i.latent_btuh),
            );
            let f = z.flow.as_ref();
            w.opt(
                &mut o,
                "supply_dt",
                Measure::TemperatureDifference,
                f.map(|f| f.supply_dt_f),
            );
            w.opt(
                &mut o,
                "design_airflow",
                Measure::Airflow,
                f.map(|f| f.design_airflow_cfm),
            );
            w.opt(
                &mut o,
                "design_dry_air_flow",
                Measure::MassFlow,
                f.map(|f| f.design_airflow_lb_h),
            );
            w.opt(
                &mut o,
                "r_p",
                Measure::AirflowPerPerson,
                f.map(|f| f.r_p_cfm_per_person),
            );
            w.opt(
                &mut o,
                "r_a",
                Measure::AirflowPerArea,
                f.map(|f| f.r_a_cfm_per_ft2),
            );
            o.set("e_z", f.map(|f| f.e_z));
            w.opt(&mut o, "v_bz", Measure::Airflow, f.map(|f| f.v_bz_cfm));
            w.opt(&mut o, "v_oz", Measure::Airflow, f.map(|f| f.v_oz_cfm));
            o.set("z_pz", f.map(|f| f.z_pz));
            o.set("e_vz", f.and_then(|f| f.e_vz));
            w.opt(
                &mut o,
                "room_tdb",
                Measure::Temperature,
                f.map(|f| f.room_tdb_f),
            );
            w.opt(
                &mut o,
                "room_w",
                Measure::HumidityRatio,
                f.map(|f| f.room_w_lb_lb),
            );
            o.set("room_rh_pct", f.map(|f| f.room_rh_pct));
            w.opt(
                &mut o,
                "design_w",
                Measure::HumidityRatio,
                f.map(|f| f.design_w_lb_lb),
            );
            o.set("design_rh_pct", f.map(|f| f.design_rh_pct));
            o.set("above_design_humidity", f.map(|f| f.above_design_humidity));
            o.set("note", z.note.clone());
            zones.push(J::Obj(o));
        }
        diagnostics.extend(d.diagnostics.iter().map(|x| w.diagnostic(name, x)));
    }
    let top = Obj::new()
        .with("schema", SCHEMA)
        .with("units", report.conv.system.to_string())
        .with(
            "generator",
            Obj::new()
                .with("name", "plenum")
                .with("version", env!("CARGO_PKG_VERSION")),
        )
        .with("designs", designs)
        .with("air_handlers", ahus)
        .with("omitted_air_handlers", left_out)
        .with("zones", zones)
        .with("diagnostics", diagnostics)
        .with("caution", CAUTION);
    let bad = top.non_finite();
    if !bad.is_empty() {
        return Err(format!(
            "internal error: the report has numbers that are not finite at {}",
            bad.join(", ")
        ));
    }
    serde_json::to_string_pretty(&top).map_err(|e| format!("internal error: {e}"))
}
