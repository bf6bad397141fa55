#!/usr/bin/env python3
"""Independent reference recomputation of the Plenum air-side chain.

This script is the outside reference the Rust coil engine is tested against
(issue 5, part 5). It is written only from the design documents:

* /work/shared/design/methods.md sections 1-4a (the method, followed exactly),
* language.md and the project key list (the design-file spellings),

and it does not read, call or imitate the Rust code.

For every case in ``cases/*.json`` it

1. writes ``designs/<case>.plenum``, the same design in the Plenum syntax, and
2. computes with psychrolib (PyPI ``PsychroLib``, IP mode, at the site pressure)
   the whole chain for every air handler and writes ``expected/<case>.json``.

Sources of the equations (each named again where it is used):

* ASHRAE Handbook--Fundamentals (2017), ch. 1, as implemented by psychrolib:
  standard-atmosphere pressure, saturation pressure (Hyland-Wexler), humidity
  ratio from RH / wet bulb / dew point, wet bulb, dew point, specific volume.
* methods.md section 2: enthalpy h = 0.240 t + W (1061 + 0.444 t) and
  c_p = 0.240 + 0.444 W (the same handbook forms psychrolib uses in IP).
* methods.md section 4 and 4a: the chain itself; common-practice defaults are
  marked there and again here.
* ANSI/ASHRAE Standard 62.1-2019, ventilation rate procedure and Table 6-1
  rates: WRITTEN FROM MEMORY (see VRP_RATES), check against the edition in
  force before relying on them.
* NIST SP 811 (2008) appendix B / exact definitions for unit conversions.

Usage::

    python3 tests/reference/coil/generate.py            # rewrite designs/ and expected/
    python3 tests/reference/coil/generate.py --out DIR  # write DIR/designs and DIR/expected

Output is deterministic: floats are rounded to 7 significant digits and the
JSON key order is fixed, so a rerun is byte-identical.
"""

from __future__ import annotations

import argparse
import json
import math
import re
import sys
from importlib import metadata
from pathlib import Path

import psychrolib as psy

PSYCHROLIB_PIN = "2.5.0"
COMMAND = "python3 tests/reference/coil/generate.py"
SCRIPT = "tests/reference/coil/generate.py"
HERE = Path(__file__).resolve().parent

psy.SetUnitSystem(psy.IP)

# ---------------------------------------------------------------------------
# Tolerances (methods.md section 4 step 5 and step 10)
# ---------------------------------------------------------------------------
AIRFLOW_REL_TOL = 1e-9  # airflow / fan-rise / c_p loop: relative change of m
DRY_COIL_W_TOL = 1e-12  # dry-coil fixed point on W_s: absolute change (lb/lb)
ADP_T_TOL = 1e-9  # apparatus dew point bisection, deg F (our choice, tight)
MAX_PASSES = 100_000

# ---------------------------------------------------------------------------
# Unit conversions to IP (NIST SP 811 (2008) appendix B, exact definitions:
# 1 ft = 0.3048 m, 1 lb = 0.45359237 kg, g_n = 9.80665 m/s^2,
# 1 Btu_IT = 1055.05585262 J; 1 in. of water (60 deg F) = 248.84 Pa as in
# methods.md section 6).
# ---------------------------------------------------------------------------
FT_M = 0.3048
BTU_J = 1055.05585262
W_PER_BTU_H = BTU_J / 3600.0  # 0.29307107... W
LBF_N = 0.45359237 * 9.80665
HP_W = 550.0 * FT_M * LBF_N  # 745.69987... W
PSI_PA = LBF_N / (0.0254**2)  # 6894.757... Pa
INWG_PA = 248.84
CFM_L_S = FT_M**3 * 1000.0 / 60.0  # 0.47194745 L/s

BTU_PER_HP_H = 2544.43  # methods.md step 4 (NIST SP 811): 1 hp = 2544.43 Btu/h
LB_PER_GAL = 8.34  # methods.md step 10: condensate 8.34 lb/gal

# ---------------------------------------------------------------------------
# ANSI/ASHRAE 62.1-2019 Table 6-1 rates, WRITTEN FROM MEMORY (the project's
# table as given in the brief): R_p cfm/person, R_a cfm/ft^2.
# ---------------------------------------------------------------------------
VRP_RATES = {
    "office": (5.0, 0.06),
    "conference": (5.0, 0.06),
    "reception": (5.0, 0.06),
    "lobby": (7.5, 0.06),  # main entry lobby
    "corridor": (0.0, 0.06),
    "classroom": (10.0, 0.12),  # ages 9 plus
    "lecture": (7.5, 0.06),  # lecture classroom
    "library": (5.0, 0.12),
    "retail": (7.5, 0.12),  # sales
    "dining": (7.5, 0.18),  # restaurant dining room
    "storage": (0.0, 0.06),  # occupiable storage, dry materials
}

# Key lists (language.md core plus the project key list); a case using any
# other key is rejected so that the design files only use fixed spellings.
SITE_KEYS = ["elevation", "pressure", "cooling", "dehumid"]
ZONE_KEYS = [
    "area",
    "people",
    "use",
    "indoor",
    "sensible",
    "latent",
    "distribution_effectiveness",
]
AHU_KEYS = [
    "serves",
    "supply_temp",
    "supply_dt",
    "diversity",
    "supply_duct",
    "supply_duct_rise",
    "return_duct",
    "return_duct_rise",
    "plenum_gain",
    "outdoor_air",
    "occupant_diversity",
    "ventilation_efficiency",
    "outdoor_fan_rise",
    "fan",
    "coil",
]
FAN_KEYS = ["power", "static", "rise", "motor_efficiency", "motor", "arrangement"]
COIL_KEYS = ["leaving_rh", "rated", "rated_sensible", "chilled_water", "face_area"]


class CaseError(Exception):
    """A case that cannot be computed (a dead end is an error, never NaN)."""


# ---------------------------------------------------------------------------
# Quantity parsing (the values in the case files are written exactly as they
# appear in the design file, e.g. "2_400 ft²", "38.5 kBtu/h", "57 °F").
# ---------------------------------------------------------------------------
NUM = r"[-+]?\d[\d_]*(?:\.\d+)?(?:[eE][-+]?\d+)?"


def parse_number(text: str) -> float:
    text = text.strip()
    if not re.fullmatch(NUM, text):
        raise CaseError(f"not a number: {text!r}")
    return float(text.replace("_", ""))


def split_quantity(text: str) -> tuple[float, str]:
    m = re.fullmatch(rf"\s*({NUM})\s*(.*?)\s*", text)
    if not m:
        raise CaseError(f"not a quantity: {text!r}")
    return parse_number(m.group(1)), m.group(2)


def _norm_unit(unit: str) -> str:
    return unit.replace("ft^2", "ft²").replace("ft2", "ft²").replace("m^2", "m²").replace("m2", "m²")


def to_ip(text: str, dim: str) -> float:
    """Convert a quantity string to the IP unit of its dimension.

    length ft; area ft²; heat Btu/h; temp °F; tdiff °F (difference);
    ratio fraction; pressure psia; static in.wg; airflow cfm; power hp;
    per_person cfm/person; per_area cfm/ft².
    """
    value, unit = split_quantity(text)
    unit = _norm_unit(unit)
    table = {
        "length": {"ft": 1.0, "m": 1.0 / FT_M},
        "area": {"ft²": 1.0, "m²": 1.0 / FT_M**2},
        "heat": {
            "Btu/h": 1.0,
            "kBtu/h": 1000.0,
            "MBH": 1000.0,
            "ton": 12000.0,
            "W": 1.0 / W_PER_BTU_H,
            "kW": 1000.0 / W_PER_BTU_H,
        },
        "ratio": {"%": 0.01},
        "pressure": {"psia": 1.0, "kPa": 1000.0 / PSI_PA, "Pa": 1.0 / PSI_PA},
        "static": {"in.wg": 1.0, "Pa": 1.0 / INWG_PA, "kPa": 1000.0 / INWG_PA},
        "airflow": {"cfm": 1.0, "L/s": 1.0 / CFM_L_S},
        "power": {"hp": 1.0, "kW": 1000.0 / HP_W, "W": 1.0 / HP_W},
        "per_person": {"cfm/person": 1.0},
        "per_area": {"cfm/ft²": 1.0},
        "tdiff": {"°F": 1.0, "degF": 1.0, "K": 1.8, "°C": 1.8, "degC": 1.8},
    }
    if dim == "temp":
        if unit in ("°F", "degF"):
            return value
        if unit in ("°C", "degC"):
            return value * 1.8 + 32.0
        raise CaseError(f"{text!r} is not a temperature")
    factors = table[dim]
    if unit not in factors:
        raise CaseError(f"{text!r}: unit {unit!r} is not a {dim}")
    return value * factors[unit]


# ---------------------------------------------------------------------------
# Psychrometrics (ASHRAE Handbook--Fundamentals 2017 ch. 1 via psychrolib,
# enthalpy and c_p in the explicit methods.md section 2 forms).
# ---------------------------------------------------------------------------
def enthalpy(t: float, w: float) -> float:
    """methods.md section 2: h = 0.240 t + W (1061 + 0.444 t), Btu/lb dry air."""
    return 0.240 * t + w * (1061.0 + 0.444 * t)


def cp_moist(w: float) -> float:
    """methods.md section 2 / 4a: c_p = 0.240 + 0.444 W, Btu/(lb dry air · °F)."""
    return 0.240 + 0.444 * w


def tdb_from_h_w(h: float, w: float) -> float:
    """methods.md section 2: t = (h - 1061 W) / (0.240 + 0.444 W)."""
    return (h - 1061.0 * w) / (0.240 + 0.444 * w)


def w_from_rh(t: float, rh: float, p: float) -> float:
    if not 0.0 <= rh <= 1.0:
        raise CaseError(f"relative humidity {rh * 100} % outside 0-100 %")
    return psy.GetHumRatioFromRelHum(t, rh, p)


def volume(t: float, w: float, p: float) -> float:
    """Specific volume, ft³/lb dry air (ASHRAE Fundamentals ch. 1 eq. 26 via psychrolib)."""
    return psy.GetMoistAirVolume(t, w, p)


def w_sat(t: float, p: float) -> float:
    return psy.GetSatHumRatio(t, p)


def parse_air_state(text: str, p: float) -> tuple[float, float]:
    """Air state string -> (dry bulb °F, humidity ratio lb/lb) at pressure p psia."""
    tdb = None
    hum = None  # (kind, value)
    for part in text.split(","):
        part = part.strip()
        m = re.fullmatch(rf"({NUM})\s*(°F|degF|°C|degC|%rh|lb/lb|gr/lb|kg/kg|g/kg)\s*(db|wb|dp)?", part)
        if not m:
            raise CaseError(f"air state part {part!r} not understood")
        num, unit, qual = parse_number(m.group(1)), m.group(2), m.group(3)
        if unit in ("°F", "degF", "°C", "degC"):
            t = num if unit in ("°F", "degF") else num * 1.8 + 32.0
            if qual in (None, "db"):
                tdb = t
            else:
                hum = (qual, t)
        elif unit == "%rh":
            hum = ("rh", num / 100.0)
        elif unit in ("lb/lb", "kg/kg"):
            hum = ("w", num)
        elif unit == "gr/lb":
            hum = ("w", num / 7000.0)
        elif unit == "g/kg":
            hum = ("w", num / 1000.0)
    if tdb is None or hum is None:
        raise CaseError(f"air state {text!r} needs a dry bulb and one humidity")
    kind, val = hum
    if kind == "wb":
        if val > tdb:
            raise CaseError(f"wet bulb above dry bulb in {text!r}")
        w = psy.GetHumRatioFromTWetBulb(tdb, val, p)
    elif kind == "dp":
        if val > tdb:
            raise CaseError(f"dew point above dry bulb in {text!r}")
        w = psy.GetHumRatioFromTDewPoint(val, p)
    elif kind == "rh":
        w = w_from_rh(tdb, val, p)
    else:
        w = val
    return tdb, w


def state_record(t: float, w: float, p: float) -> dict:
    """One state point: the keys every state in expected/*.json carries."""
    return {
        "tdb_f": t,
        "twb_f": psy.GetTWetBulbFromHumRatio(t, w, p),
        "tdp_f": psy.GetTDewPointFromHumRatio(t, w, p),
        "w_lb_lb": w,
        "h_btu_lb": enthalpy(t, w),
        "rh_pct": 100.0 * psy.GetRelHumFromHumRatio(t, w, p),
        "v_ft3_lb": volume(t, w, p),
    }


def saturation_crossing(t_on: float, w_on: float, t_off: float, w_off: float, p: float) -> float:
    """Apparatus dew point: the straight line (in the t, W plane) from the
    entering through the leaving state, extended past the leaving state toward
    lower temperature, meets the saturation curve W_s(t). The first crossing
    below t_off is bracketed by stepping down 0.5 °F at a time and refined by
    bisection to ADP_T_TOL. A dry coil (w_on == w_off) gives a horizontal line:
    the ADP is the entering dew point."""
    slope = (w_on - w_off) / (t_on - t_off)

    def f(t: float) -> float:
        return w_off + slope * (t - t_off) - w_sat(t, p)

    hi = t_off
    if f(hi) >= 0.0:  # leaving state on (or above) saturation: ADP = leaving
        return t_off
    lo = hi
    while True:
        lo = hi - 0.5
        if lo < -100.0:
            raise CaseError("apparatus dew point: no saturation crossing above -100 °F")
        if f(lo) >= 0.0:
            break
        hi = lo
    while hi - lo > ADP_T_TOL:
        mid = 0.5 * (lo + hi)
        if f(mid) >= 0.0:
            lo = mid
        else:
            hi = mid
    return 0.5 * (lo + hi)


# ---------------------------------------------------------------------------
# Case resolution: `like` inheritance, key checks, conversion to IP numbers.
# ---------------------------------------------------------------------------
def resolve_zones(case: dict) -> dict:
    raw = {z["name"]: z for z in case["zones"]}
    resolved: dict[str, dict] = {}

    def get(name: str, stack: tuple = ()) -> dict:
        if name in resolved:
            return resolved[name]
        if name in stack:
            raise CaseError(f"`like` cycle through zone {name}")
        if name not in raw:
            raise CaseError(f"unknown zone {name}")
        z = raw[name]
        keys = {}
        if "like" in z:
            keys.update(get(z["like"], stack + (name,))["keys"])
        for k in z["keys"]:
            if k not in ZONE_KEYS:
                raise CaseError(f"zone {name}: unknown key {k}")
        keys.update(z["keys"])
        resolved[name] = {"name": name, "label": z["label"], "keys": keys}
        return resolved[name]

    for n in raw:
        get(n)
    return {n: resolved[n] for n in raw}


def zone_inputs(z: dict, p: float) -> tuple[dict, list]:
    k = z["keys"]
    defaults = []
    if "sensible" not in k:
        raise CaseError(f"zone {z['name']}: `sensible` is required")
    if "indoor" in k:
        tr, wr_design = parse_air_state(k["indoor"], p)
    else:
        # methods.md section 3: 75 °F / 50 % RH default (common practice)
        tr, wr_design = 75.0, w_from_rh(75.0, 0.50, p)
        defaults.append(f"zone {z['name']}: indoor 75 °F, 50 %rh")
    if "latent" not in k:
        defaults.append(f"zone {z['name']}: latent 0")
    if "distribution_effectiveness" not in k:
        defaults.append(f"zone {z['name']}: distribution_effectiveness 100 %")
    use = k.get("use")
    if use is not None and use not in VRP_RATES:
        raise CaseError(f"zone {z['name']}: unknown use {use}")
    return (
        {
            "name": z["name"],
            "label": z["label"],
            "area_ft2": to_ip(k["area"], "area") if "area" in k else 0.0,
            "people": parse_number(k["people"]) if "people" in k else 0.0,
            "use": use,
            "tr": tr,
            "w_design": wr_design,
            "qs": to_ip(k["sensible"], "heat"),
            "ql": to_ip(k["latent"], "heat") if "latent" in k else 0.0,
            "ez": to_ip(k["distribution_effectiveness"], "ratio") if "distribution_effectiveness" in k else 1.0,
        },
        defaults,
    )


def ahu_inputs(a: dict, zones: dict) -> tuple[dict, list]:
    """Resolve one air handler's keys to IP numbers, recording each default used."""
    k = a["keys"]
    for key in k:
        if key not in AHU_KEYS:
            raise CaseError(f"ahu {a['name']}: unknown key {key}")
    defaults: list[str] = []
    serves = k["serves"]
    for n in serves:
        if n not in zones:
            raise CaseError(f"ahu {a['name']}: serves unknown zone {n}")
    zs = [zones[n] for n in serves]
    tr_min = min(z["tr"] for z in zs)
    # step 1 / 4a: supply temperature, default lowest t_r - 18 °F (common practice)
    if "supply_temp" in k:
        ts = to_ip(k["supply_temp"], "temp")
    elif "supply_dt" in k:
        ts = tr_min - to_ip(k["supply_dt"], "tdiff")
    else:
        ts = tr_min - 18.0
        defaults.append("supply_temp: lowest zone t_r - 18 °F")
    if "diversity" in k:
        d = to_ip(k["diversity"], "ratio")
    else:
        d = 1.0
        defaults.append("diversity 100 %")
    # step 3: supply duct rise (1.5 °F / 100 ft, or 3 °F when not known: common practice)
    if "supply_duct_rise" in k:
        dt_sd = to_ip(k["supply_duct_rise"], "tdiff")
    elif "supply_duct" in k:
        dt_sd = to_ip(k["supply_duct"], "length") * 1.5 / 100.0
    else:
        dt_sd = 3.0
        defaults.append("supply_duct_rise 3 °F")
    # step 7: return duct rise (1.0 °F / 100 ft project default, 3 °F when not known, none -> 0)
    if "return_duct_rise" in k:
        dt_rd = to_ip(k["return_duct_rise"], "tdiff")
    elif "return_duct" in k:
        dt_rd = 0.0 if k["return_duct"] == "none" else to_ip(k["return_duct"], "length") * 1.0 / 100.0
    else:
        dt_rd = 3.0
        defaults.append("return_duct_rise 3 °F")
    q_pl = to_ip(k["plenum_gain"], "heat") if "plenum_gain" in k else 0.0
    # step 8: outdoor air form
    oa_text = k.get("outdoor_air", "ventilation")
    if "outdoor_air" not in k:
        defaults.append("outdoor_air ventilation")
    if oa_text == "ventilation":
        oa = ("ventilation", None)
    else:
        val, unit = split_quantity(oa_text)
        unit = _norm_unit(unit)
        if unit == "%":
            oa = ("doas", 1.0) if val == 100.0 else ("fraction", val / 100.0)
        elif unit == "cfm/person":
            oa = ("per_person", val)
        elif unit == "cfm/ft²":
            oa = ("per_area", val)
        else:
            oa = ("airflow", to_ip(oa_text, "airflow"))
    if "occupant_diversity" in k:
        occ_d = to_ip(k["occupant_diversity"], "ratio")
    else:
        occ_d = 1.0
        if len(zs) > 1 and oa[0] != "doas":
            defaults.append("occupant_diversity 100 %")
    ev_text = k.get("ventilation_efficiency", "simplified")
    if "ventilation_efficiency" not in k and len(zs) > 1 and oa[0] != "doas":
        defaults.append("ventilation_efficiency simplified")
    if ev_text in ("simplified", "calculated"):
        ev_mode = (ev_text, None)
    else:
        ev_mode = ("given", to_ip(ev_text, "ratio"))
    oa_fan_rise = to_ip(k["outdoor_fan_rise"], "tdiff") if "outdoor_fan_rise" in k else 0.0
    # step 4: fan
    fan = {"arrangement": "draw_through", "motor": "in_airstream"}
    if "fan" in k:
        fk = k["fan"]
        for key in fk:
            if key not in FAN_KEYS:
                raise CaseError(f"ahu {a['name']} fan: unknown key {key}")
        fan["arrangement"] = fk.get("arrangement", "draw_through")
        fan["motor"] = fk.get("motor", "in_airstream")
        if "arrangement" not in fk:
            defaults.append("fan arrangement draw_through")
        if "motor" not in fk and ("power" in fk or "static" in fk):
            defaults.append("fan motor in_airstream")
        sources = [s for s in ("power", "static", "rise") if s in fk]
        if len(sources) != 1:
            raise CaseError(f"ahu {a['name']} fan: give exactly one of power, static, rise")
        src = sources[0]
        fan["source"] = src
        if src == "power":
            fan["bhp"] = to_ip(fk["power"], "power")
        elif src == "static":
            m = re.fullmatch(r"(.*?)\s+with\s+efficiency\s+(.*)", fk["static"])
            if not m:
                raise CaseError(f"fan static {fk['static']!r}: expected `<pressure> with efficiency <ratio>`")
            fan["static_inwg"] = to_ip(m.group(1), "static")
            fan["fan_efficiency"] = to_ip(m.group(2), "ratio")
        else:
            fan["rise"] = to_ip(fk["rise"], "tdiff")
        if src in ("power", "static") and fan["motor"] == "in_airstream":
            if "motor_efficiency" in fk:
                fan["motor_efficiency"] = to_ip(fk["motor_efficiency"], "ratio")
            else:
                fan["motor_efficiency"] = 0.90  # keys.md: 90 % assumed (common practice)
                defaults.append("fan motor_efficiency 90 %")
    else:
        fan["source"] = "default"
        fan["rise"] = 2.0  # step 4: 2 °F draw-through when not described (common practice)
        defaults.append("fan: 2 °F draw-through rise")
    coil = {"leaving_rh": 0.95, "rated": None, "rated_sensible": None, "chw_dt": None, "chw": None, "face_area": None}
    ck = k.get("coil", {})
    for key in ck:
        if key not in COIL_KEYS:
            raise CaseError(f"ahu {a['name']} coil: unknown key {key}")
    if "leaving_rh" in ck:
        coil["leaving_rh"] = to_ip(ck["leaving_rh"], "ratio")
    else:
        defaults.append("coil leaving_rh 95 %")
    if "rated" in ck:
        coil["rated"] = to_ip(ck["rated"], "heat")
    if "rated_sensible" in ck:
        coil["rated_sensible"] = to_ip(ck["rated_sensible"], "heat")
    if "chilled_water" in ck:
        m = re.fullmatch(r"(.*?)\s+to\s+(.*)", ck["chilled_water"])
        if not m:
            raise CaseError("chilled_water: expected `<t> to <t>`")
        tw1, tw2 = to_ip(m.group(1), "temp"), to_ip(m.group(2), "temp")
        coil["chw"] = (tw1, tw2)
        coil["chw_dt"] = tw2 - tw1
    if "face_area" in ck:
        coil["face_area"] = to_ip(ck["face_area"], "area")
    return (
        {
            "zones": zs,
            "single_zone": len(zs) == 1,
            "ts": ts,
            "d": d,
            "dt_sd": dt_sd,
            "dt_rd": dt_rd,
            "q_pl": q_pl,
            "oa": oa,
            "occ_d": occ_d,
            "ev_mode": ev_mode,
            "oa_fan_rise": oa_fan_rise,
            "fan": fan,
            "coil": coil,
        },
        defaults,
    )


# ---------------------------------------------------------------------------
# The chain (methods.md section 4, steps 1-12, with the 4a conventions)
# ---------------------------------------------------------------------------
def fan_heat(fan: dict, cfm_s: float) -> tuple[float | None, float | None]:
    """Step 4: shaft power (bhp) and fan heat (Btu/h); None when the rise is given.

    Static form: P = cfm · Δp / (6356 η_fan) (common practice) with cfm the
    supply airflow at the supply state (our choice, see README)."""
    if fan["source"] == "power":
        bhp = fan["bhp"]
    elif fan["source"] == "static":
        bhp = cfm_s * fan["static_inwg"] / (6356.0 * fan["fan_efficiency"])
    else:
        return None, None
    if fan["motor"] == "in_airstream":
        q = BTU_PER_HP_H * bhp / fan["motor_efficiency"]
    else:
        q = BTU_PER_HP_H * bhp
    return bhp, q


def solve_airflow(A: dict, p: float, w_s_fixed: float | None) -> dict:
    """Steps 2-5: iterate m, fan rise, c_p (and W_off for a wet coil) until m
    changes by less than 1e-9 relative. For a dry coil W_s is held fixed."""
    zs, ts, fan = A["zones"], A["ts"], A["fan"]
    phi = A["coil"]["leaving_rh"]
    if w_s_fixed is None:
        w_s = w_from_rh(ts - A["dt_sd"] - 2.0, phi, p)  # starting guess only
    else:
        w_s = w_s_fixed
    m_prev = None
    for _ in range(MAX_PASSES):
        cp = cp_moist(w_s)
        m_z = []
        for z in zs:
            dtz = z["tr"] - ts
            if dtz <= 0.0:
                raise CaseError(f"zone {z['name']}: supply temperature not below room temperature")
            m_z.append(z["qs"] / (cp * dtz))
        m = A["d"] * sum(m_z)
        if not m > 0.0:
            raise CaseError("no supply airflow (zero sensible load)")
        v_s = volume(ts, w_s, p)
        cfm_s = m * v_s / 60.0
        bhp, q_f = fan_heat(fan, cfm_s)
        dt_f = fan["rise"] if q_f is None else q_f / (m * cp)
        if fan["arrangement"] == "draw_through":
            t_off = ts - A["dt_sd"] - dt_f
        else:
            t_off = ts - A["dt_sd"]
        converged = m_prev is not None and abs(m - m_prev) <= AIRFLOW_REL_TOL * m
        if converged:
            return {
                "w_s": w_s,
                "cp": cp,
                "m_z": m_z,
                "m": m,
                "v_s": v_s,
                "cfm_s": cfm_s,
                "bhp": bhp,
                "q_f": q_f,
                "dt_f": dt_f,
                "t_off": t_off,
            }
        m_prev = m
        if w_s_fixed is None:
            w_s = w_from_rh(t_off, phi, p)  # W_s = W_off (step 2 and 5)
    raise CaseError("airflow loop did not converge")


def ventilation(A: dict, flow: dict) -> dict:
    """Step 8: ASHRAE 62.1-2019 ventilation rate procedure (equations and rates
    from memory). Zone primary airflow V_pz = m_z · v_s / 60 and system primary
    airflow V_ps = m · v_s / 60, both at the supply state (our choice)."""
    zs = A["zones"]
    zrec = []
    sum_rp_p = 0.0
    sum_ra_a = 0.0
    sum_voz = 0.0
    for z, mz in zip(zs, flow["m_z"]):
        if z["use"] is None:
            rp, ra = 0.0, 0.0
        else:
            rp, ra = VRP_RATES[z["use"]]
        vbz = rp * z["people"] + ra * z["area_ft2"]
        voz = vbz / z["ez"]
        vpz = mz * flow["v_s"] / 60.0
        sum_rp_p += rp * z["people"]
        sum_ra_a += ra * z["area_ft2"]
        sum_voz += voz
        zrec.append({"rp": rp, "ra": ra, "vbz": vbz, "voz": voz, "vpz": vpz, "zpz": voz / vpz})
    out = {"zones": zrec, "sum_voz": sum_voz}
    if A["oa"][0] == "doas":
        out.update(procedure="100_percent_outdoor_air", v_ot=sum_voz)
    elif A["single_zone"]:
        out.update(procedure="single_zone", v_ot=zrec[0]["voz"])
    else:
        v_ou = A["occ_d"] * sum_rp_p + sum_ra_a
        v_ps = flow["cfm_s"]
        mode, given = A["ev_mode"]
        xs = v_ou / v_ps
        for zr in zrec:
            zr["evz"] = 1.0 + xs - zr["zpz"]
        if mode == "simplified":
            dd = A["occ_d"]
            ev = 0.88 * dd + 0.22 if dd < 0.60 else 0.75
        elif mode == "calculated":
            ev = min(zr["evz"] for zr in zrec)
        else:
            ev = given
        if not ev > 0.0:
            raise CaseError("system ventilation efficiency not positive")
        out.update(procedure="multiple_zone", v_ou=v_ou, v_ps=v_ps, xs=xs, ev=ev, ev_method=mode, v_ot=v_ou / ev)
    return out


def run_chain(A: dict, p: float, out_t: float, out_w: float, flow: dict) -> dict:
    """Steps 6-9 for a solved airflow: room, return, ventilation, outdoor air,
    mixed and entering states."""
    zs = A["zones"]
    m, w_s = flow["m"], flow["w_s"]
    # 4a: room state = m_z-weighted mean t_r; h_g = 1061 + 0.444 t_r at that mean
    t_room = sum(z["tr"] * mz for z, mz in zip(zs, flow["m_z"])) / sum(flow["m_z"])
    q_l = A["d"] * sum(z["ql"] for z in zs)
    w_room = w_s + q_l / (m * (1061.0 + 0.444 * t_room))  # step 6
    # step 7: return; plenum rise with c_p at the room humidity ratio (4a)
    dt_pl = A["q_pl"] / (m * cp_moist(w_room))
    t_ret = t_room + A["dt_rd"] + dt_pl
    w_ret = w_room
    vent = ventilation(A, flow)
    # step 8: outdoor air actually used
    v_o = volume(out_t, out_w, p)  # outdoor design state (before any OA fan rise)
    kind, val = A["oa"]
    people = sum(z["people"] for z in zs)
    area = sum(z["area_ft2"] for z in zs)
    if kind == "doas":
        m_oa = m
    elif kind == "fraction":
        m_oa = val * m
    else:
        if kind == "ventilation":
            cfm_oa = vent["v_ot"]
        elif kind == "airflow":
            cfm_oa = val
        elif kind == "per_person":
            cfm_oa = val * people
        else:
            cfm_oa = val * area
        m_oa = cfm_oa * 60.0 / v_o
    x = m_oa / m
    if kind != "doas" and x > 1.0:
        raise CaseError(f"outdoor air ({x:.3f} of supply) exceeds the supply of a recirculating unit")
    cfm_oa = m_oa * v_o / 60.0
    # step 9: mixing by mass and energy (outdoor stream after the OA fan rise)
    t_o_mix = out_t + A["oa_fan_rise"]
    h_o = enthalpy(t_o_mix, out_w)
    h_ret = enthalpy(t_ret, w_ret)
    w_mix = x * out_w + (1.0 - x) * w_ret
    h_mix = x * h_o + (1.0 - x) * h_ret
    t_mix = tdb_from_h_w(h_mix, w_mix)
    # step 10: entering = mixed plus the blow-through fan rise
    t_on = t_mix + (flow["dt_f"] if A["fan"]["arrangement"] == "blow_through" else 0.0)
    return {
        "t_room": t_room,
        "w_room": w_room,
        "q_l": q_l,
        "dt_pl": dt_pl,
        "t_ret": t_ret,
        "w_ret": w_ret,
        "vent": vent,
        "v_o": v_o,
        "m_oa": m_oa,
        "cfm_oa": cfm_oa,
        "x": x,
        "t_o_mix": t_o_mix,
        "t_mix": t_mix,
        "w_mix": w_mix,
        "t_on": t_on,
        "w_on": w_mix,
    }


def _close(a: float, b: float, rel: float, what: str) -> None:
    if not abs(a - b) <= rel * max(abs(a), abs(b), 1e-300):
        raise CaseError(f"self-check failed: {what}: {a!r} vs {b!r}")


def self_check(A, p, flow, ch, dry, out_t, out_w, q_c, q_cs, q_cl, adp, t_on, w_on, t_off, w_off) -> None:
    """Invariants of the solved chain, checked on the unrounded numbers before
    anything is written (a failed check is an error, not a silent result)."""
    cp, m, ts = flow["cp"], flow["m"], A["ts"]
    for z, mz in zip(A["zones"], flow["m_z"]):  # step 2: zone sensible balance
        _close(mz * cp * (z["tr"] - ts), z["qs"], 1e-12, f"zone {z['name']} sensible balance")
    _close(m, A["d"] * sum(flow["m_z"]), 1e-12, "system flow = d * sum m_z")
    if flow["q_f"] is not None:  # step 4: fan rise
        _close(m * cp * flow["dt_f"], flow["q_f"], 1e-12, "fan heat = m c_p dt_f")
    dt_f_draw = flow["dt_f"] if A["fan"]["arrangement"] == "draw_through" else 0.0
    _close(t_off, ts - A["dt_sd"] - dt_f_draw, 1e-12, "leaving temperature")
    if dry:  # step 10: dry coil -- leaving RH below the wet-coil value, W unchanged
        if not w_off < w_from_rh(t_off, A["coil"]["leaving_rh"], p):
            raise CaseError("self-check failed: dry coil leaving state above the leaving RH")
        if not abs(ch["w_on"] - w_off) < DRY_COIL_W_TOL:
            raise CaseError("self-check failed: dry coil W_on != W_off")
    else:  # step 5: W_off = W(t_off, phi_off) to the convergence of the loop
        _close(w_off, w_from_rh(t_off, A["coil"]["leaving_rh"], p), 1e-7, "W_off at leaving RH")
        if not ch["w_on"] >= w_off:
            raise CaseError("self-check failed: wet coil with W_on < W_off")
    # step 9: mass and energy balance of the mixing box
    x = ch["x"]
    _close(m * ch["w_mix"], ch["m_oa"] * out_w + (m - ch["m_oa"]) * ch["w_ret"], 1e-12, "moisture balance")
    h_mix = enthalpy(ch["t_mix"], ch["w_mix"])
    h_o = enthalpy(ch["t_o_mix"], out_w)
    _close(m * h_mix, ch["m_oa"] * h_o + (m - ch["m_oa"]) * enthalpy(ch["t_ret"], ch["w_ret"]), 1e-12, "energy balance")
    _close(x, ch["m_oa"] / m, 1e-12, "outdoor-air fraction")
    # step 6: room latent balance
    _close(m * (ch["w_room"] - flow["w_s"]) * (1061.0 + 0.444 * ch["t_room"]), ch["q_l"], 1e-9, "room latent balance")
    # step 10: coil energy balance and split
    _close(q_cs + q_cl, q_c, 1e-12, "total = sensible + latent")
    h_w = t_off - 32.0
    _close(q_c + m * (w_on - w_off) * h_w, m * (enthalpy(t_on, w_on) - enthalpy(t_off, w_off)), 1e-12, "coil energy balance")
    # ADP on the saturation curve and on the coil line
    line_w = w_off + (w_on - w_off) / (t_on - t_off) * (adp - t_off)
    _close(line_w, w_sat(adp, p), 1e-7, "ADP on saturation and coil line")
    if not adp <= t_off:
        raise CaseError("self-check failed: ADP above the leaving temperature")


def evaluate(A: dict, p: float, out_t: float, out_w: float) -> dict:
    """Solve one air handler at one outdoor design state (wet, then the dry-coil
    fixed point if W_off > W_on) and compute the coil and every reported value."""
    flow = solve_airflow(A, p, None)
    ch = run_chain(A, p, out_t, out_w, flow)
    dry = flow["w_s"] > ch["w_on"]
    dry_passes = 0
    if dry:
        if ch["x"] == 0.0:
            raise CaseError("dry coil with no outdoor air: no steady state")
        w_s = ch["w_on"]
        while True:
            dry_passes += 1
            if dry_passes > MAX_PASSES:
                raise CaseError("dry-coil fixed point did not converge")
            flow = solve_airflow(A, p, w_s)
            ch = run_chain(A, p, out_t, out_w, flow)
            if abs(ch["w_on"] - w_s) < DRY_COIL_W_TOL:
                break
            w_s = ch["w_on"]
    ts = A["ts"]
    w_s = flow["w_s"]
    t_off, w_off = flow["t_off"], w_s
    m = flow["m"]
    t_on, w_on = ch["t_on"], ch["w_on"]
    if dry:
        w_on_coil = w_off  # converged to < 1e-12; nothing condenses
    else:
        w_on_coil = w_on
    h_on = enthalpy(t_on, w_on_coil)
    h_off = enthalpy(t_off, w_off)
    h_w = t_off - 32.0  # condensate enthalpy at t_off, Btu/lb
    q_c = m * ((h_on - h_off) - (w_on_coil - w_off) * h_w)
    q_cs = m * cp_moist(w_off) * (t_on - t_off)
    q_cl = q_c - q_cs
    if dry and abs(q_cl) < 1e-9 * abs(q_c):
        q_cl = 0.0  # float noise of an exactly dry coil
    condensate_lb_h = m * (w_on_coil - w_off)
    adp = saturation_crossing(t_on, w_on_coil, t_off, w_off, p)
    bf = (t_off - adp) / (t_on - adp)
    coil_in = A["coil"]
    tons = q_c / 12000.0
    rated = coil_in["rated"]
    rated_s = coil_in["rated_sensible"]
    if rated is None:
        status, margin = "unrated", None
    else:
        margin = rated / q_c - 1.0
        if rated < q_c or (rated_s is not None and rated_s < q_cs):
            status = "undersized"
        elif margin > 0.25:
            status = "oversized"
        else:
            status = "ok"
    zs = A["zones"]
    dts = [z["tr"] - ts for z in zs]
    self_check(A, p, flow, ch, dry, out_t, out_w, q_c, q_cs, q_cl, adp, t_on, w_on_coil, t_off, w_off)
    std_cfm = A["d"] * sum(z["qs"] / (1.08 * dt) for z, dt in zip(zs, dts))
    std_coil = 4.5 * flow["cfm_s"] * (h_on - h_off)
    vent = ch["vent"]
    required = vent["v_ot"]
    shortfall = ch["cfm_oa"] < required
    states = {
        "outdoor": state_record(out_t, out_w, p),
    }
    if A["oa_fan_rise"] != 0.0:
        states["outdoor_after_fan"] = state_record(ch["t_o_mix"], out_w, p)
    states.update(
        {
            "return": state_record(ch["t_ret"], ch["w_ret"], p),
            "mixed": state_record(ch["t_mix"], ch["w_mix"], p),
            "entering": state_record(t_on, w_on, p),
            "leaving": state_record(t_off, w_off, p),
            "supply": state_record(ts, w_s, p),
            "room": state_record(ch["t_room"], ch["w_room"], p),
        }
    )
    zone_out = []
    for z, mz, zr, dt in zip(zs, flow["m_z"], vent["zones"], dts):
        w_rz = w_s + z["ql"] / (mz * (1061.0 + 0.444 * z["tr"]))
        rec = {
            "name": z["name"],
            "supply_dt_f": dt,
            "design_airflow_lb_h": mz,
            "design_airflow_cfm": zr["vpz"],
            "r_p_cfm_per_person": zr["rp"],
            "r_a_cfm_per_ft2": zr["ra"],
            "e_z": z["ez"],
            "v_bz_cfm": zr["vbz"],
            "v_oz_cfm": zr["voz"],
            "z_pz": zr["zpz"],
        }
        if "evz" in zr:
            rec["e_vz"] = zr["evz"]
        rec.update(
            {
                "room_tdb_f": z["tr"],
                "room_w_lb_lb": w_rz,
                "room_rh_pct": 100.0 * psy.GetRelHumFromHumRatio(z["tr"], w_rz, p),
                "design_w_lb_lb": z["w_design"],
                "design_rh_pct": 100.0 * psy.GetRelHumFromHumRatio(z["tr"], z["w_design"], p),
                "above_design_humidity": w_rz > z["w_design"],
            }
        )
        zone_out.append(rec)
    vent_out = {"procedure": vent["procedure"], "sum_v_oz_cfm": vent["sum_voz"]}
    if vent["procedure"] == "multiple_zone":
        vent_out.update(
            {
                "occupant_diversity": A["occ_d"],
                "v_ou_cfm": vent["v_ou"],
                "v_ps_cfm": vent["v_ps"],
                "x_s": vent["xs"],
                "e_v_method": vent["ev_method"],
                "e_v": vent["ev"],
            }
        )
    vent_out["v_ot_cfm"] = required
    findings = []
    if dry:
        findings.append("dry_coil")
    if shortfall:
        findings.append("ventilation_shortfall")
    if status in ("undersized", "oversized"):
        findings.append(status)
    for zrec in zone_out:
        if zrec["above_design_humidity"]:
            findings.append(f"room_above_design_humidity:{zrec['name']}")
    # Choice 26: a wet coil whose leaving air is not drier than a served zone's
    # design state cannot hold that zone at its design humidity. A zone with a
    # latent load needs supply air strictly drier; one without, no wetter.
    if not dry:
        for z in zs:
            w_off = flow["w_s"]
            if (w_off >= z["w_design"]) if z["ql"] > 0.0 else (w_off > z["w_design"]):
                findings.append(f"coil_cannot_dehumidify:{z['name']}")
    fan = A["fan"]
    chw_gpm = None if coil_in["chw_dt"] is None else q_c / (500.0 * coil_in["chw_dt"])
    face_v = None if coil_in["face_area"] is None else flow["cfm_s"] / coil_in["face_area"]
    return {
        "dry_air_flow_lb_h": m,
        "supply_airflow_cfm": flow["cfm_s"],
        "block_sensible_btu_h": A["d"] * sum(z["qs"] for z in zs),
        "block_latent_btu_h": ch["q_l"],
        "cp_supply_btu_lb_f": flow["cp"],
        "rises_f": {
            "supply_duct": A["dt_sd"],
            "fan": flow["dt_f"],
            "return_duct": A["dt_rd"],
            "plenum": ch["dt_pl"],
            "outdoor_fan": A["oa_fan_rise"],
        },
        "fan": {
            "arrangement": fan["arrangement"],
            "source": fan["source"],
            "shaft_power_bhp": flow["bhp"],
            "heat_btu_h": flow["q_f"] if flow["q_f"] is not None else m * flow["cp"] * flow["dt_f"],
            "rise_f": flow["dt_f"],
        },
        "ventilation": vent_out,
        "ventilation_required_cfm": required,
        "outdoor_airflow_cfm": ch["cfm_oa"],
        "outdoor_air_dry_air_flow_lb_h": ch["m_oa"],
        "outdoor_air_fraction": ch["x"],
        "ventilation_shortfall": shortfall,
        "ventilation_shortfall_cfm": max(0.0, required - ch["cfm_oa"]),
        "states": states,
        "coil": {
            "dry": dry,
            "total_btu_h": q_c,
            "sensible_btu_h": q_cs,
            "latent_btu_h": q_cl,
            "tons": tons,
            "shr": q_cs / q_c,
            "adp_f": adp,
            "bypass_factor": bf,
            "condensate_lb_h": condensate_lb_h,
            "condensate_gal_h": condensate_lb_h / LB_PER_GAL,
            "chilled_water_gpm": chw_gpm,
            "face_velocity_fpm": face_v,
            "cfm_per_ton": flow["cfm_s"] / tons,
        },
        "capacity": {
            "rated_btu_h": rated,
            "rated_tons": None if rated is None else rated / 12000.0,
            "rated_sensible_btu_h": rated_s,
            "margin": margin,
            "sensible_margin": None if rated_s is None else rated_s / q_cs - 1.0,
            "status": status,
        },
        "standard_air": {
            "supply_airflow_cfm": std_cfm,
            "supply_airflow_diff_pct": 100.0 * (std_cfm / flow["cfm_s"] - 1.0),
            "coil_total_btu_h": std_coil,
            "coil_total_diff_pct": 100.0 * (std_coil / q_c - 1.0),
        },
        "zones": zone_out,
        "findings": findings,
    }


# ---------------------------------------------------------------------------
# Design-file writer (Plenum syntax, language.md spellings)
# ---------------------------------------------------------------------------
def plenum_string(s: str) -> str:
    return '"' + s.replace("\\", "\\\\").replace('"', '\\"') + '"'


def write_block_lines(keys: dict, indent: str) -> list[str]:
    width = max((len(k) for k in keys if not isinstance(keys[k], dict)), default=0)
    lines = []
    for key, val in keys.items():
        if isinstance(val, dict):
            lines.append(f"{indent}{key} {{")
            lines.extend(write_block_lines(val, indent + "  "))
            lines.append(f"{indent}}}")
        elif isinstance(val, list):
            lines.append(f"{indent}{key.ljust(width)} {', '.join(val)}")
        else:
            lines.append(f"{indent}{key.ljust(width)} {val}")
    return lines


def design_text(name: str, case: dict) -> str:
    out = [
        f"# Generated from cases/{name}.json by tests/reference/coil/generate.py.",
        "# Do not edit by hand: change the case file and rerun the generator.",
    ]
    for line in case["description"]:
        out.append(f"# {line}" if line else "#")
    out.append("")
    proj = case["project"]
    out.append(f"project {plenum_string(proj['name'])} {{")
    if "units" in proj:
        out.append(f"  units {proj['units']}")
    out.append("}")
    out.append("")
    out.append("site {")
    out.extend(write_block_lines(case["site"], "  "))
    out.append("}")
    for z in case["zones"]:
        out.append("")
        like = f" like {z['like']}" if "like" in z else ""
        out.append(f"zone {z['name']} {plenum_string(z['label'])}{like} {{")
        out.extend(write_block_lines(z["keys"], "  "))
        out.append("}")
    for a in case["ahus"]:
        out.append("")
        out.append(f"ahu {a['name']} {plenum_string(a['label'])} {{")
        out.extend(write_block_lines(a["keys"], "  "))
        out.append("}")
    return "\n".join(out) + "\n"


# ---------------------------------------------------------------------------
# Output formatting
# ---------------------------------------------------------------------------
def rounded(obj):
    """Round every float to 7 significant digits (deterministic output)."""
    if isinstance(obj, bool) or obj is None or isinstance(obj, (str, int)):
        return obj
    if isinstance(obj, float):
        if not math.isfinite(obj):
            raise CaseError("non-finite value in output")
        r = float(f"{obj:.7g}")
        return r + 0.0 if r != 0.0 else 0.0
    if isinstance(obj, dict):
        return {k: rounded(v) for k, v in obj.items()}
    if isinstance(obj, list):
        return [rounded(v) for v in obj]
    raise TypeError(type(obj))


def compute_case(name: str, case: dict) -> dict:
    site = case["site"]
    for key in site:
        if key not in SITE_KEYS:
            raise CaseError(f"site: unknown key {key}")
    if "pressure" in site:
        p = to_ip(site["pressure"], "pressure")
        elev = None
    else:
        elev = to_ip(site["elevation"], "length") if "elevation" in site else 0.0
        p = psy.GetStandardAtmPressure(elev)  # ASHRAE Fundamentals ch. 1 eq. 3
    site_defaults = [] if ("pressure" in site or "elevation" in site) else ["site elevation 0 ft"]
    if "cooling" not in site:
        raise CaseError("site: `cooling` is required")
    design_states = {"cooling": parse_air_state(site["cooling"], p)}
    if "dehumid" in site:
        design_states["dehumid"] = parse_air_state(site["dehumid"], p)
    zres = resolve_zones(case)
    zones = {}
    zone_defaults = {}
    for zn, z in zres.items():
        zones[zn], zone_defaults[zn] = zone_inputs(z, p)
    served = {}
    ahus_out = []
    for a in case["ahus"]:
        A, ahu_defaults = ahu_inputs(a, zones)
        for z in A["zones"]:
            if z["name"] in served:
                raise CaseError(f"zone {z['name']} served by two air handlers")
            served[z["name"]] = a["name"]
        results = {}
        for sname, (to, wo) in design_states.items():
            results[sname] = evaluate(A, p, to, wo)
        governing = "cooling"
        if "dehumid" in results and results["dehumid"]["coil"]["total_btu_h"] > results["cooling"]["coil"]["total_btu_h"]:
            governing = "dehumid"
        defaults = list(site_defaults)
        for z in A["zones"]:
            defaults.extend(zone_defaults[z["name"]])
        defaults.extend(ahu_defaults)
        fan = A["fan"]
        inputs = {
            "supply_temp_f": A["ts"],
            "diversity": A["d"],
            "supply_duct_rise_f": A["dt_sd"],
            "return_duct_rise_f": A["dt_rd"],
            "plenum_gain_btu_h": A["q_pl"],
            "outdoor_air_form": A["oa"][0],
            "outdoor_air_value": A["oa"][1],
            "occupant_diversity": A["occ_d"],
            "ventilation_efficiency": A["ev_mode"][0] if A["ev_mode"][1] is None else A["ev_mode"][1],
            "outdoor_fan_rise_f": A["oa_fan_rise"],
            "fan": {
                "source": fan["source"],
                "arrangement": fan["arrangement"],
                "motor": fan["motor"],
                "shaft_power_bhp": fan.get("bhp"),
                "static_in_wg": fan.get("static_inwg"),
                "fan_efficiency": fan.get("fan_efficiency"),
                "motor_efficiency": fan.get("motor_efficiency"),
                "rise_f": fan.get("rise"),
            },
            "coil": {
                "leaving_rh": A["coil"]["leaving_rh"],
                "rated_btu_h": A["coil"]["rated"],
                "rated_sensible_btu_h": A["coil"]["rated_sensible"],
                "chilled_water_supply_f": None if A["coil"]["chw"] is None else A["coil"]["chw"][0],
                "chilled_water_return_f": None if A["coil"]["chw"] is None else A["coil"]["chw"][1],
                "face_area_ft2": A["coil"]["face_area"],
            },
        }
        ahus_out.append(
            {
                "name": a["name"],
                "label": a["label"],
                "serves": [z["name"] for z in A["zones"]],
                "inputs": inputs,
                "defaults_used": defaults,
                "governing_state": governing,
                "status": results[governing]["capacity"]["status"],
                "design_states": results,
            }
        )
    zones_out = []
    for zn, z in zones.items():
        zones_out.append(
            {
                "name": zn,
                "label": z["label"],
                "served_by": served.get(zn),
                "area_ft2": z["area_ft2"],
                "people": z["people"],
                "use": z["use"],
                "indoor_tdb_f": z["tr"],
                "indoor_w_lb_lb": z["w_design"],
                "sensible_btu_h": z["qs"],
                "latent_btu_h": z["ql"],
                "distribution_effectiveness": z["ez"],
            }
        )
    site_out = {
        "elevation_ft": elev,
        "pressure_psia": p,
        "cooling": state_record(*design_states["cooling"], p),
        "dehumid": state_record(*design_states["dehumid"], p) if "dehumid" in design_states else None,
    }
    return rounded(
        {
            "case": name,
            "title": case["project"]["name"],
            "generator": {
                "script": SCRIPT,
                "command": COMMAND,
                "psychrolib": f"PsychroLib {PSYCHROLIB_PIN}, IP mode",
                "method": "methods.md sections 1-4a; ASHRAE 62.1-2019 rates from memory",
            },
            "design_file": f"designs/{name}.plenum",
            "input_units": case["project"].get("units", "ip"),
            "deliberate_findings": case.get("deliberate_findings", []),
            "site": site_out,
            "zones": zones_out,
            "air_handlers": ahus_out,
        }
    )


def summary_text(results: list[dict]) -> str:
    """expected/summary.md: the headline numbers of every air handler and design state."""
    lines = [
        "# Reference coil results: headline numbers",
        "",
        f"Generated by `{COMMAND}` with PsychroLib {PSYCHROLIB_PIN} (IP mode); do not edit by hand.",
        "Full results, every state point and every key: `expected/<case>.json` (keys in README.md).",
        "",
        "| case | air handler | design state | site | supply cfm | OA cfm | 62.1 required cfm | OA fraction (mass) | coil tons | SHR | cfm/ton | dry | status | findings |",
        "| --- | --- | --- | --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | --- | --- | --- |",
    ]
    for res in results:
        site = res["site"]
        where = f"{site['elevation_ft']:g} ft" if site["elevation_ft"] is not None else f"{site['pressure_psia']:g} psia"
        for a in res["air_handlers"]:
            for sname, r in a["design_states"].items():
                gov = " (governs)" if sname == a["governing_state"] and len(a["design_states"]) > 1 else ""
                c = r["coil"]
                lines.append(
                    f"| {res['case']} | {a['name']} | {sname}{gov} | {where} | {r['supply_airflow_cfm']:,.0f} | "
                    f"{r['outdoor_airflow_cfm']:,.0f} | {r['ventilation_required_cfm']:,.0f} | "
                    f"{r['outdoor_air_fraction']:.3f} | {c['tons']:.2f} | {c['shr']:.3f} | {c['cfm_per_ton']:.0f} | "
                    f"{'yes' if c['dry'] else 'no'} | {r['capacity']['status']} | {', '.join(r['findings']) or '-'} |"
                )
    return "\n".join(lines) + "\n"


def main() -> int:
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--out", type=Path, default=HERE, help="folder to write designs/ and expected/ into")
    args = ap.parse_args()
    found = metadata.version("PsychroLib")
    if found != PSYCHROLIB_PIN:
        print(f"generate.py: PsychroLib {PSYCHROLIB_PIN} required, {found} installed", file=sys.stderr)
        return 2
    cases = sorted((HERE / "cases").glob("*.json"))
    if not cases:
        print("generate.py: no cases found", file=sys.stderr)
        return 2
    (args.out / "designs").mkdir(parents=True, exist_ok=True)
    (args.out / "expected").mkdir(parents=True, exist_ok=True)
    failed = False
    results = []
    for path in cases:
        name = path.stem
        case = json.loads(path.read_text(encoding="utf-8"))
        try:
            result = compute_case(name, case)
        except CaseError as e:
            print(f"{name}: {e}", file=sys.stderr)
            failed = True
            continue
        (args.out / "designs" / f"{name}.plenum").write_text(design_text(name, case), encoding="utf-8")
        (args.out / "expected" / f"{name}.json").write_text(
            json.dumps(result, indent=2, ensure_ascii=False) + "\n", encoding="utf-8"
        )
        results.append(result)
    if failed:
        return 1
    (args.out / "expected" / "summary.md").write_text(summary_text(results), encoding="utf-8")
    return 0


if __name__ == "__main__":
    sys.exit(main())
