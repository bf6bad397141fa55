#!/usr/bin/env python3
"""Write the JSON Schemas of `plenum report --format json` and their key reference.

One table of keys below gives both unit systems: a quantity's key is its base
name and the suffix of its unit (`supply_airflow` + `_cfm` | `_l_s`). From it
this script writes

* schemas/report-ip.schema.json  (--units ip)
* schemas/report-si.schema.json  (--units si)
* schemas/README.md              (the key reference)

Run it from anywhere: `python3 schemas/generate.py`. The Rust tests
(crates/plenum-cli/tests/report.rs) validate every example's output against
the committed schemas with the `jsonschema` crate, so a key added to the
report but not here (or the reverse) fails the tests: every object is closed
(`additionalProperties: false`) and every key is required (a value that does
not exist is `null`, never a missing key).
"""

import json
import pathlib

HERE = pathlib.Path(__file__).resolve().parent
SCHEMA_VERSION = "plenum-report/1"

# Unit kinds: (IP suffix, IP unit, SI suffix, SI unit). Factors: NIST SP 811
# appendix B, through the crate plenum-units.
UNITS = {
    "airflow": ("cfm", "ft³/min at the state named", "l_s", "L/s at the state named"),
    "mass_flow": ("lb_h", "lb of dry air per hour", "kg_s", "kg of dry air per second"),
    "load": ("btu_h", "Btu/h", "w", "W"),
    "capacity": ("tons", "tons of refrigeration (12,000 Btu/h)", "kw", "kW"),
    "temp": ("f", "°F", "c", "°C"),
    "dt": ("f", "°F of temperature difference", "k", "K of temperature difference"),
    "w": ("lb_lb", "lb of water per lb of dry air", "kg_kg", "kg of water per kg of dry air"),
    "h": ("btu_lb", "Btu per lb of dry air, zero for dry air at 0 °F",
          "kj_kg", "kJ per kg of dry air, zero for dry air at 0 °C"),
    "pressure": ("psia", "psia", "kpa", "kPa"),
    "length": ("ft", "ft", "m", "m"),
    "area": ("ft2", "ft²", "m2", "m²"),
    "velocity": ("fpm", "ft/min", "m_s", "m/s"),
    "power": ("bhp", "brake horsepower (550 ft·lbf/s)", "kw", "kW"),
    "water_flow": ("gpm", "US gal/min", "l_s", "L/s"),
    "moisture": ("lb_h", "lb of water per hour", "kg_h", "kg of water per hour"),
    "per_person": ("cfm_per_person", "cfm per person", "l_s_per_person", "L/s per person"),
    "per_area": ("cfm_per_ft2", "cfm per ft² of floor", "l_s_per_m2", "L/s per m² of floor"),
    "v": ("ft3_lb", "ft³ per lb of dry air", "m3_kg", "m³ per kg of dry air"),
    "condensate": ("gal_h", "US gal/h", "l_h", "L/h"),
    "per_capacity": ("cfm_per_ton", "cfm per ton", "l_s_per_kw", "L/s per kW"),
}


class F:
    """One key: base name, unit kind (None: the key is the base), JSON type, whether null is allowed."""

    def __init__(self, base, kind, typ, desc, nullable=False, only=None, extra=None, key=None):
        self.base, self.kind, self.typ, self.desc = base, kind, typ, desc
        self.nullable, self.only, self.extra, self.key_override = nullable, only, extra or {}, key

    def key(self, system):
        if self.key_override is not None:
            return self.key_override[system]
        if self.kind is None:
            return self.base
        ip_suffix, _, si_suffix, _ = UNITS[self.kind]
        suffix = ip_suffix if system == "ip" else si_suffix
        return f"{self.base}_{suffix}" if self.base else suffix

    def unit(self, system):
        if self.kind is None:
            return None
        _, ip_unit, _, si_unit = UNITS[self.kind]
        return ip_unit if system == "ip" else si_unit


def num(base, kind, desc, **kw):
    return F(base, kind, "number", desc, **kw)


def obj_ref(base, ref, desc, nullable=False):
    return F(base, None, {"$ref": f"#/$defs/{ref}"}, desc, nullable=nullable)


def arr_of(base, ref, desc):
    return F(base, None, {"type": "array", "items": {"$ref": f"#/$defs/{ref}"}}, desc)


def strings(base, desc):
    return F(base, None, {"type": "array", "items": {"type": "string"}}, desc)


def enum(base, values, desc, nullable=False):
    return F(base, None, "string", desc, nullable=nullable, extra={"enum": list(values)})


def text(base, desc, nullable=False):
    return F(base, None, "string", desc, nullable=nullable)


def integer(base, desc):
    return F(base, None, "integer", desc, extra={"minimum": 1})


POSITION = [
    text("file", "The file, as its path was given or reached by `use`."),
    integer("line", "The line, counted from 1."),
    integer("column", "The column in characters, counted from 1."),
]

CASES = ["cooling", "dehumid"]

DEFS = {}

DEFS["state"] = ("A moist-air state point at the site's barometric pressure (ASHRAE Handbook—Fundamentals 2017 ch. 1 equations, IP form, as the engine computes them).", [
    num("tdb", "temp", "Dry-bulb temperature."),
    num("twb", "temp", "Thermodynamic wet-bulb temperature."),
    num("tdp", "temp", "Dew-point temperature."),
    num("w", "w", "Humidity ratio."),
    num("h", "h", "Specific enthalpy of the moist air. In SI the engine's IP value with the datum moved to 0 °C: h_SI = 2.326 (h_IP − 7.68), so that mass flow × Δh equals the coil loads."),
    num("rh_pct", None, "Relative humidity, per cent (0–100).", extra={"minimum": 0, "maximum": 100}),
    num("v", "v", "Specific volume of the moist air."),
])

DEFS["coil"] = ("The cooling coil at one design case (methods.md §4 step 10).", [
    num("total", "load", "Total coil load Q_c = m [(h_on − h_off) − (W_on − W_off) h_w]."),
    num("sensible", "load", "Sensible coil load m (0.240 + 0.444 W_off)(t_on − t_off)."),
    num("latent", "load", "Latent coil load: total − sensible."),
    num("tons", None, "Total coil load in tons of refrigeration (12,000 Btu/h), in both unit systems."),
    num("total", "capacity", "Total coil load in kW (SI only; the same figure as total_w / 1000).", only="si"),
    num("shr", None, "Coil sensible heat ratio, sensible / total."),
    num("adp", "temp", "Apparatus dew point: where the line from entering through leaving state meets saturation."),
    num("bypass_factor", None, "Bypass factor (t_off − t_adp) / (t_on − t_adp)."),
    num("condensate", "condensate", "Condensate volume flow, at 8.34 lb/gal."),
    num("condensate", "moisture", "Condensate mass flow m (W_on − W_off)."),
    F("dry", None, "boolean", "True when the coil runs dry: nothing condenses."),
    num("chilled_water", "water_flow", "Chilled-water flow Q_c / (500 Δt_w) (common practice); null without `chilled_water` temperatures.", nullable=True),
    num("face_velocity", "velocity", "Coil face velocity; null without `face_area`.", nullable=True),
    num("", "per_capacity", "Supply airflow per ton of coil load (per kW in SI)."),
])

DEFS["standard_air"] = ("The hand-calculation cross-check (methods.md §4 step 12, common practice): figures with 1.08 and 4.5, which assume 0.075 lb/ft³ air, beside the exact ones.", [
    num("supply_airflow", "airflow", "d Σ q_s,z / (1.08 ΔT_z)."),
    num("supply_airflow_diff_pct", None, "100 (standard-air / exact − 1), per cent."),
    num("coil_total", "load", "4.5 × supply cfm × (h_on − h_off)."),
    num("coil_total_diff_pct", None, "100 (standard-air / exact − 1), per cent."),
])

DEFS["rises"] = ("The temperature rises of the air-side chain.", [
    num("supply_duct", "dt", "Supply duct heat gain as a rise."),
    num("fan", "dt", "Supply fan heat as a rise."),
    num("return_duct", "dt", "Return duct heat gain as a rise."),
    num("plenum", "dt", "Return plenum gain as a rise."),
    num("outdoor_fan", "dt", "Outdoor-air fan rise (0 without one)."),
])

DEFS["fan"] = ("The supply fan.", [
    enum("arrangement", ["draw_through", "blow_through"], "Draw-through (heat after the coil) or blow-through (heat before it)."),
    enum("motor", ["in_airstream", "outside"], "Where the motor sits."),
    enum("source", ["power", "static", "rise", "default"], "Where the fan heat comes from: shaft power, static pressure and efficiency, a given rise, or the 2 °F default."),
    num("shaft_power", "power", "Shaft power; null for a given or default rise.", nullable=True),
    num("heat", "load", "Fan heat added to the air."),
    num("rise", "dt", "Fan temperature rise."),
])

DEFS["multiple_zone"] = ("The ASHRAE 62.1 multiple-zone figures (written from memory of the 2016–2019 editions).", [
    num("occupant_diversity", None, "Occupant diversity D, 0–1."),
    num("v_ou", "airflow", "Uncorrected outdoor air intake V_ou = D Σ R_p P_z + Σ R_a A_z."),
    num("v_ps", "airflow", "System primary airflow V_ps."),
    num("x_s", None, "X_s = V_ou / V_ps."),
    enum("e_v_method", ["simplified", "calculated", "given"], "How E_v was found."),
    num("e_v", None, "System ventilation efficiency E_v."),
])

DEFS["ventilation"] = ("The ASHRAE 62.1 ventilation requirement of the unit (rates written from memory: check the edition in force).", [
    enum("procedure", ["single_zone", "multiple_zone", "all_outdoor_air"], "The procedure that gives the required outdoor air."),
    num("sum_v_oz", "airflow", "Σ V_oz of the served zones."),
    num("v_ot", "airflow", "Required outdoor airflow V_ot."),
    obj_ref("multiple_zone", "multiple_zone", "The multiple-zone figures; null for the other procedures.", nullable=True),
])

DEFS["states"] = ("The state points of the chain at one design case.", [
    obj_ref("outdoor", "state", "The outdoor design state."),
    obj_ref("outdoor_after_fan", "state", "Outdoor air after the outdoor-air fan; null without a rise.", nullable=True),
    obj_ref("return", "state", "Return air (room plus return duct and plenum rises)."),
    obj_ref("mixed", "state", "Mixed air, by mass and energy balance."),
    obj_ref("entering", "state", "Air entering the coil (mixed, plus a blow-through fan's rise)."),
    obj_ref("leaving", "state", "Air leaving the coil."),
    obj_ref("supply", "state", "Supply air at the diffusers."),
    obj_ref("room", "state", "The unit's room state (flow-weighted dry bulb, the humidity the latent load gives)."),
])

CASE_FIELDS = [
    num("supply_airflow", "airflow", "Supply airflow m·v/60 at the supply state."),
    num("dry_air_flow", "mass_flow", "System dry-air mass flow m (diversified), conserved through the chain."),
    num("outdoor_airflow", "airflow", "Outdoor airflow used, at the outdoor state."),
    num("outdoor_dry_air_flow", "mass_flow", "Outdoor dry-air mass flow m_oa."),
    num("outdoor_air_fraction", None, "Outdoor-air fraction by mass, m_oa / m, 0–1.", extra={"minimum": 0, "maximum": 1}),
    num("ventilation_required", "airflow", "The ASHRAE 62.1 minimum outdoor airflow V_ot."),
    num("ventilation_shortfall", "airflow", "By how much the outdoor air falls short of V_ot (0 when it does not)."),
    num("block_sensible", "load", "Block sensible load Q_s = d Σ q_s,z."),
    num("block_latent", "load", "Block latent load Q_l = d Σ q_l,z."),
    obj_ref("states", "states", "The state points."),
    obj_ref("coil", "coil", "The cooling coil."),
    num("rated_tons", None, "Rated (selected) total capacity in tons, in both unit systems; null when not given.", nullable=True),
    num("rated", "capacity", "Rated total capacity in kW (SI only); null when not given.", nullable=True, only="si"),
    num("rated", "load", "Rated total capacity; null when not given.", nullable=True),
    num("rated_sensible", "load", "Rated sensible capacity; null when not given.", nullable=True),
    num("margin", None, "Capacity margin rated / required − 1 (−0.1 is 10 % short); null for an unrated coil.", nullable=True),
    num("sensible_margin", None, "Rated sensible / required sensible − 1; null without a rated sensible capacity.", nullable=True),
    enum("status", ["ok", "undersized", "oversized", "unrated"], "Capacity status: undersized below the required total or sensible; oversized more than 25 % above (common practice); unrated without a rating."),
    obj_ref("standard_air", "standard_air", "The standard-air cross-check."),
    obj_ref("rises", "rises", "The temperature rises."),
    obj_ref("fan", "fan", "The supply fan."),
    obj_ref("ventilation", "ventilation", "The 62.1 requirement."),
]

DEFS["case"] = ("One air handler at one outdoor design state.", CASE_FIELDS)

DEFS["cases"] = ("Both design cases of a unit.", [
    obj_ref("cooling", "case", "At the cooling design state."),
    obj_ref("dehumid", "case", "At the dehumidification design state; null when the site gives none.", nullable=True),
])

DEFS["assumption"] = ("A default the engine used where the design gave no value.", [
    text("key", "The design-file key that was not given (e.g. `supply_duct`, `indoor`)."),
    text("value", "The value used, in the report's units, as words (e.g. `3.0 °F rise`)."),
    enum("source", ["common practice", "project default", "ASHRAE 62.1-2019 (from memory)"], "Where the default comes from."),
    text("subject", "What it applies to: `site`, `zone NAME` or `ahu NAME`."),
    text("zone", "The zone's name for a zone's default, else null.", nullable=True),
])

DEFS["finding"] = ("A finding: a fact about the design that needs attention. It never leaves a value out.", [
    text("code", "The registered code of `plenum check` (`plenum explain CODE` documents it), e.g. `undersized-coil`, `ventilation-shortfall`."),
    enum("severity", ["error", "warning", "info"], "The severity after the project's `plenum.toml`."),
    text("message", "The finding in words, as `plenum check` words it (it names the design case when it holds at one)."),
    text("help", "How to act on it, when known; else null.", nullable=True),
] + POSITION)

DEFS["diagnostic"] = ("An error that left a value unknown (a syntax error, an unresolved name, a missing required key, an engine error).", [
    text("design", "The design's root file."),
] + POSITION + [
    integer("end_line", "The line where the span ends."),
    integer("end_column", "The column where the span ends."),
    text("code", "The registered code of `plenum check`, e.g. `syntax-error`, `unknown-name`, `missing-key`, `not-evaluated`."),
    enum("severity", ["error", "warning", "info"], "`error`, except an engine `not-evaluated` note that another error explains (then `warning`)."),
    text("message", "What is wrong."),
    text("help", "How to fix it, when known; else null.", nullable=True),
])

DEFS["site"] = ("The site as the engine used it.", [
    num("pressure", "pressure", "Barometric pressure."),
    enum("pressure_source", ["given", "elevation", "sea_level_assumed"], "Where the pressure comes from."),
    num("elevation", "length", "Elevation, when the pressure comes from it; else null.", nullable=True),
    obj_ref("cooling", "state", "The cooling design outdoor state."),
    obj_ref("dehumid", "state", "The dehumidification design outdoor state; null when not given.", nullable=True),
])

DEFS["design"] = ("One design: a root file and the files it uses.", [
    text("file", "The root file."),
    text("project", "The project's name; null when not given.", nullable=True),
    obj_ref("site", "site", "The site; null when it cannot be evaluated (see the diagnostics).", nullable=True),
    arr_of("findings", "finding", "Findings about the site and the zones, and the model's warnings (an air handler's own findings are with it)."),
])

DEFS["air_handler"] = ("A computed air handler. Its top-level figures are those of the governing design case; `cases` has both.", [
    text("design", "The design's root file."),
    text("name", "The air handler's name."),
    text("label", "Its label (the quoted text after the name); null when not given.", nullable=True),
] + POSITION + [
    strings("serves", "The zones it serves, in `serves` order."),
    enum("governing_case", CASES, "The design case with the larger coil total (a tie goes to cooling)."),
    num("supply_temp", "temp", "Supply air temperature t_s."),
] + CASE_FIELDS + [
    obj_ref("cases", "cases", "Both design cases' full figures."),
    arr_of("assumptions", "assumption", "Every default used for this unit, its zones and the site."),
    arr_of("findings", "finding", "This unit's findings."),
])

DEFS["omitted_air_handler"] = ("An air handler left out: a value it needs is unknown.", [
    text("design", "The design's root file."),
    text("name", "The air handler's name."),
    text("label", "Its label; null when not given.", nullable=True),
] + POSITION + [
    arr_of("reasons", "diagnostic", "Why it is left out, each with its place."),
])

DEFS["zone"] = ("A zone, with its figures at the governing case of the computed air handler that serves it (null when none does).", [
    text("design", "The design's root file."),
    text("name", "The zone's name."),
    text("label", "Its label; null when not given.", nullable=True),
] + POSITION + [
    strings("served_by", "Every air handler that names it in `serves`."),
    text("air_handler", "The computed air handler its figures come from; null when none.", nullable=True),
    enum("case", CASES, "That unit's governing design case; null without figures.", nullable=True),
    num("area", "area", "Floor area (0 when not given); null when the zone's inputs are unusable.", nullable=True),
    num("people", None, "Occupants (0 when not given); null when the inputs are unusable.", nullable=True),
    text("category", "The ASHRAE 62.1 category (`use`); null without one.", nullable=True),
    num("sensible", "load", "Peak sensible gain q_s,z; null when the inputs are unusable.", nullable=True),
    num("latent", "load", "Peak latent gain q_l,z; null when the inputs are unusable.", nullable=True),
    num("supply_dt", "dt", "t_r,z − t_s.", nullable=True),
    num("design_airflow", "airflow", "Zone design airflow (undiversified), at the supply state: 62.1 V_pz.", nullable=True),
    num("design_dry_air_flow", "mass_flow", "Zone design dry-air mass flow m_z.", nullable=True),
    num("r_p", "per_person", "62.1 people outdoor-air rate R_p (0 without `use`).", nullable=True),
    num("r_a", "per_area", "62.1 area outdoor-air rate R_a (0 without `use`).", nullable=True),
    num("e_z", None, "62.1 zone air distribution effectiveness E_z.", nullable=True),
    num("v_bz", "airflow", "Breathing-zone outdoor airflow V_bz = R_p P_z + R_a A_z.", nullable=True),
    num("v_oz", "airflow", "Zone outdoor airflow V_oz = V_bz / E_z.", nullable=True),
    num("z_pz", None, "Primary outdoor-air fraction Z_pz = V_oz / V_pz.", nullable=True),
    num("e_vz", None, "Zone ventilation efficiency E_vz = 1 + X_s − Z_pz (multiple-zone units); null otherwise.", nullable=True),
    num("room_tdb", "temp", "The zone's indoor dry bulb.", nullable=True),
    num("room_w", "w", "The humidity ratio the zone's own airflow and latent load give.", nullable=True),
    num("room_rh_pct", None, "The RH that gives at the zone's dry bulb, per cent.", nullable=True),
    num("design_w", "w", "The zone's indoor design humidity ratio.", nullable=True),
    num("design_rh_pct", None, "Its design RH, per cent.", nullable=True),
    F("above_design_humidity", None, "boolean", "True when the room runs more humid than its design state.", nullable=True),
    text("note", "Why it has no figures (`served by no air handler`, `` `ahu_1` left out``); else null.", nullable=True),
])

DEFS["generator"] = ("The program that wrote the report.", [
    enum("name", ["plenum"], "Always `plenum`."),
    text("version", "Its version."),
])


def top(system):
    return [
        enum("schema", [SCHEMA_VERSION], "The version of this JSON form. A change that removes or renames a key, or changes a key's meaning or unit, takes a new version."),
        enum("units", [system], "The unit system of every number: `ip` or `si`; the unit is the suffix of each key."),
        obj_ref("generator", "generator", "The program that wrote the report."),
        arr_of("designs", "design", "Every design reported: a root file and the files it uses."),
        arr_of("air_handlers", "air_handler", "Every computed air handler, design by design."),
        arr_of("omitted_air_handlers", "omitted_air_handler", "Every air handler left out, with why."),
        arr_of("zones", "zone", "Every zone of every design."),
        arr_of("diagnostics", "diagnostic", "Everything that left a value unknown. Empty when every figure is known."),
        text("caution", "The caution that goes with every report: a design aid; inputs are the user's responsibility; results must be reviewed by a qualified engineer, licensed where required; the codes in force take precedence."),
    ]


def prop_schema(f, system):
    if isinstance(f.typ, dict):
        s = dict(f.typ)
        if f.nullable:
            s = {"anyOf": [s, {"type": "null"}]}
    else:
        s = {"type": [f.typ, "null"] if f.nullable else f.typ}
        s.update(f.extra)
        if f.nullable and "enum" in s:
            s["enum"] = s["enum"] + [None]
    unit = f.unit(system)
    desc = f.desc if unit is None else f"{f.desc} Unit: {unit}."
    return {"description": desc, **s}


def object_schema(desc, fields, system):
    fields = [f for f in fields if f.only in (None, system)]
    keys = [f.key(system) for f in fields]
    dup = {k for k in keys if keys.count(k) > 1}
    assert not dup, f"duplicate keys {dup}"
    return {
        "type": "object",
        "description": desc,
        "properties": {f.key(system): prop_schema(f, system) for f in fields},
        "required": keys,
        "additionalProperties": False,
    }


def schema(system):
    name = "IP" if system == "ip" else "SI"
    root = object_schema(
        f"The JSON form of `plenum report --units {system}` ({name} units), version {SCHEMA_VERSION}. "
        "Every number is the engine's value at full precision in the unit its key names; a value that does not exist is null.",
        top(system),
        system,
    )
    return {
        "$schema": "https://json-schema.org/draft/2020-12/schema",
        "$id": f"https://example.invalid/plenum/schemas/report-{system}.schema.json",
        "title": f"plenum report ({name})",
        **root,
        "$defs": {k: object_schema(d, fs, system) for k, (d, fs) in DEFS.items()},
    }


README_HEAD = """# The JSON form of `plenum report`

*Generated by `schemas/generate.py` from one table of keys; edit the script, not this file.*

`plenum report --format json` writes one JSON document that other tools read. Its keys are an
interface: they are fixed by the JSON Schemas (draft 2020-12) beside this file, one per unit
system, and the tests validate every example's output against them.

| file | for |
| --- | --- |
| `report-ip.schema.json` | `--units ip` (and a project with `units ip`, or none) |
| `report-si.schema.json` | `--units si` (and a project with `units si`) |

## Rules

* **Version.** `schema` is `"plenum-report/1"`. A change that removes or renames a key, or
  changes what a key means or its unit, takes a new version; adding a key does not.
* **Units in the key.** A quantity's key is a base name and the unit as a suffix:
  `supply_airflow_cfm` in IP is `supply_airflow_l_s` in SI. Keys without a unit suffix are
  plain numbers (fractions 0–1 such as `outdoor_air_fraction`, `margin`, `shr`; `_pct` is per
  cent). `tons` and `rated_tons` are in tons of refrigeration in both systems; SI adds `_kw`.
* **Full precision.** Numbers are the engine's values, not rounded, converted to SI by the
  factors of NIST SP 811 appendix B (the `plenum-units` crate). Never NaN or infinity: the
  report fails (exit 2) rather than write one.
* **Enthalpy in SI** is the engine's IP enthalpy with its datum moved from 0 °F to 0 °C:
  `h_kj_kg = 2.326 (h_btu_lb − 7.68)`, so that mass flow × Δh still equals the coil loads. The
  SI form of the ASHRAE equation is a separate rounding and gives about 0.03 kJ/kg more at
  comfort states.
* **`null`, never missing.** Every key is always present; `null` where a value does not exist
  (the margin of an unrated coil, the dehumidification case of a site without one).
* **Several designs.** `air_handlers`, `omitted_air_handlers`, `zones` and `diagnostics` are
  flat lists over every design of the run; each entry names its `design` (the root file).
* **Governing case.** An air handler's top-level figures are those of its `governing_case`
  (the larger coil total when a dehumidification state is given); `cases.cooling` and
  `cases.dehumid` hold both in full.
* **Left out.** An air handler that could not be computed is not in `air_handlers`; it is in
  `omitted_air_handlers` with its `reasons`, and the errors that left values unknown are in
  `diagnostics`. Findings (undersized, ventilation shortfall…) never leave a unit out: they
  are in its `status` and `findings`.

## Exit status

0: the report was produced and every air handler computed (findings or not). 1: some air
handler could not be computed, or some value is unknown (`diagnostics` is not empty). 2: a
usage error or input that could not be read.

## The CSV form

`--format csv` writes sections separated by an empty line, each with one header row:
`schedule` (one row per air handler; a unit left out has status `left_out` and its reasons in
`note`), `zone`, `assumption`, `finding`, `diagnostic`, `caution`. The first column, `table`,
names the section on every row. Units are in the column names as in the JSON keys; numbers
are rounded to the trade's precision, without thousands separators; a missing value is an
empty cell.

## Keys
"""


def readme():
    out = [README_HEAD]
    sections = [("Top level", "The document.", top("ip"), top("si"))]
    for k, (d, fs) in DEFS.items():
        sections.append((f"`{k}`", d, fs, fs))
    for title, desc, fields_ip, fields_si in sections:
        out.append(f"\n### {title}\n\n{desc}\n\n| IP key | SI key | type | meaning |\n| --- | --- | --- | --- |\n")
        for f in fields_ip:
            ip_key = f.key("ip") if f.only in (None, "ip") else "—"
            si_key = f.key("si") if f.only in (None, "si") else "—"
            if isinstance(f.typ, dict):
                if "$ref" in f.typ:
                    typ = "`" + f.typ["$ref"].split("/")[-1] + "`"
                else:
                    items = f.typ["items"]
                    typ = "array of " + ("`" + items["$ref"].split("/")[-1] + "`" if "$ref" in items else items["type"])
            else:
                typ = f.typ
                if "enum" in f.extra:
                    typ = " \\| ".join(f"`{v}`" for v in f.extra["enum"])
            if f.nullable:
                typ += " or null"
            units = ""
            if f.kind is not None:
                units = f" IP: {f.unit('ip')}; SI: {f.unit('si')}."
            out.append(f"| `{ip_key}` | `{si_key}` | {typ} | {f.desc}{units} |\n".replace("`—`", "—"))
    return "".join(out)


def main():
    for system in ("ip", "si"):
        path = HERE / f"report-{system}.schema.json"
        path.write_text(json.dumps(schema(system), indent=2, ensure_ascii=False) + "\n", encoding="utf-8")
    (HERE / "README.md").write_text(readme(), encoding="utf-8")


if __name__ == "__main__":
    main()
