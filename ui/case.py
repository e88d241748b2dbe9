"""The case on screen: input defaults, a loaded scenario turned into inputs, inputs
turned back into a scenario document.

Everything here reads and writes a plain mapping of input values (the page's
``st.session_state``), so it can be used and tested without a running page. Input
values are held in the unit system chosen on screen; the scenario documents built
from them carry those units as text ("34.0 degC", "2500.0 gal"), so that
`estimator.scenario.loads_scenario` converts them at the edge. No physics here.
"""

from __future__ import annotations

import math
from pathlib import Path

import pandas as pd

from estimator.units import convert

EXAMPLE_INVENTORY = Path(__file__).resolve().with_name("example_inventory.csv")

#: Largest scenario upload read. [bytes]
MAX_SCENARIO_UPLOAD = 1_000_000
#: Largest inventory upload read. [bytes]
MAX_INVENTORY_UPLOAD = 20 * 1024 * 1024

SYSTEMS = ("SI", "US")

#: kind -> {system: (label shown, unit written in scenario text, pint expression)}
#: and the pint expression of the SI value the core returns.
UNITS = {
    "temperature": {"SI": ("°C", "degC", "degC"), "US": ("°F", "degF", "degF"), "core": "K"},
    "tank_volume": {"SI": ("m³", "m3", "m**3"), "US": ("gal", "gal", "gallon"), "core": "m**3"},
    "spill_volume": {"SI": ("L", "L", "liter"), "US": ("gal", "gal", "gallon"), "core": "m**3"},
    "room_volume": {"SI": ("m³", "m3", "m**3"), "US": ("ft³", "ft3", "ft**3"), "core": "m**3"},
    "area": {"SI": ("m²", "m2", "m**2"), "US": ("ft²", "ft2", "ft**2"), "core": "m**2"},
    "length": {"SI": ("m", "m", "m"), "US": ("ft", "ft", "ft"), "core": "m"},
    "pressure": {"SI": ("kPa", "kPa", "kPa"), "US": ("psi", "psi", "psi"), "core": "Pa"},
    "barometric": {"SI": ("kPa", "kPa", "kPa"), "US": ("inHg", "inHg", "inHg"), "core": "Pa"},
    "vapour_pressure": {"SI": ("kPa", "kPa", "kPa"), "US": ("mmHg", "mmHg", "mmHg"),
                        "core": "Pa"},
    "wind": {"SI": ("m/s", "m/s", "m/s"), "US": ("mph", "mph", "mph"), "core": "m/s"},
    "air_speed": {"SI": ("m/s", "m/s", "m/s"), "US": ("ft/min", "ft/min", "ft/min"),
                  "core": "m/s"},
    "flow": {"SI": ("m³/h", "m3/h", "m**3/hour"), "US": ("ft³/min", "ft3/min", "ft**3/min"),
             "core": "m**3/s"},
    "density": {"SI": ("kg/m³", "kg/m3", "kg/m**3"), "US": ("lb/gal", "lb/gal", "lb/gallon"),
                "core": "kg/m**3"},
    "mass": {"SI": ("kg", "kg", "kg"), "US": ("lb", "lb", "lb"), "core": "kg"},
    "minutes": {"SI": ("min", "min", "min"), "US": ("min", "min", "min"), "core": "s"},
    "percent": {"SI": ("%", "%", "percent"), "US": ("%", "%", "percent"),
                "core": "dimensionless"},
    "ppm": {"SI": ("ppm", "ppm", "ppm"), "US": ("ppm", "ppm", "ppm"), "core": "dimensionless"},
    "per_hour": {"SI": ("1/h", "1/h", "1/hour"), "US": ("1/h", "1/h", "1/hour"),
                 "core": "1/s"},
    "molar_mass": {"SI": ("g/mol", "g/mol", "g/mol"), "US": ("g/mol", "g/mol", "g/mol"),
                   "core": "kg/mol"},
}

#: The section-9 properties of a safety data sheet shown for checking: name ->
#: (field of `estimator.sds.SdsReading`, kind of unit in UNITS).
SDS_PROPERTIES = {
    "flash point": ("flash_point", "temperature"),
    "vapour pressure": ("vapor_pressure", "vapour_pressure"),
    "at temperature": ("vapor_pressure_temperature", "temperature"),
    "initial boiling point": ("boiling_point", "temperature"),
    "lower flammability limit": ("lower_flammability_limit", "percent"),
    "upper flammability limit": ("upper_flammability_limit", "percent"),
    "density": ("density", "density"),
}

#: Every numeric input with a unit: input name -> (kind, default in SI display units).
#: None as a default leaves the box empty (an optional input).
QUANTITIES = {
    "site.elevation": ("length", 0.0),
    "site.barometric": ("barometric", 101.325),
    "tank.temperature": ("temperature", 25.0),
    "tank.worst": ("temperature", None),
    "tank.volume": ("tank_volume", None),
    "tank.fill": ("percent", 50.0),
    "tank.gauge": ("pressure", 0.0),
    "tank.daily_low": ("temperature", None),
    "tank.daily_high": ("temperature", None),
    "tank.pumped": ("tank_volume", None),
    "tank.purge_rate": ("flow", None),
    "tank.purge_target": ("ppm", None),
    "sds.boiling": ("temperature", 120.0),
    "sds.vp": ("vapour_pressure", 2.0),
    "sds.vp_temperature": ("temperature", 20.0),
    "sds.density": ("density", None),
    "sds.flash": ("temperature", None),
    "indoor.temperature": ("temperature", 20.0),
    "indoor.volume": ("spill_volume", 60.0),
    "indoor.mass": ("mass", 47.0),
    "indoor.area": ("area", None),
    "indoor.dike": ("area", None),
    "indoor.duration": ("minutes", 480.0),
    "indoor.cleanup": ("minutes", None),
    "room.volume": ("room_volume", 500.0),
    "room.air_changes": ("per_hour", 2.0),
    "room.air_speed": ("air_speed", 0.1),
    "room.near_field_radius": ("length", None),
    "room.random_air_speed": ("air_speed", None),
    "outdoor.temperature": ("temperature", 20.0),
    "outdoor.volume": ("spill_volume", 100.0),
    "outdoor.area": ("area", None),
    "outdoor.dike": ("area", None),
    "weather.wind": ("wind", 3.0),
    "weather.wind_height": ("length", 10.0),
    "cmp.temperature": ("temperature", 35.0),
    "cmp.air_changes": ("per_hour", 0.0),
    "cmp.wind": ("wind", 1.5),
}

#: Inputs without a unit: name -> default.
PLAIN = {
    "units": False,
    "title": "Untitled case",
    "site.mode": "sea level",
    "alarm.percent_lfl": 10.0,
    "alarm.oxygen_low": 19.5,
    "alarm.oxygen_high": 23.5,
    "tank.name": "tank 1",
    "tank.purge_mixing": 1.0,
    "tank.details": False,
    "sds.name": "my solvent",
    "sds.molar_mass": 100.0,
    "sds.lfl": None,
    "sds.ufl": None,
    "indoor.name": "spill indoors",
    "indoor.amount_kind": "volume",
    "indoor.model": "mackay-matsugu",
    "room.name": "room 1",
    "room.mixing": 3.0,
    "outdoor.name": "spill outdoors",
    "outdoor.model": "mackay-matsugu",
    "weather.sky": "day",
    "weather.insolation": "moderate",
    "weather.cloud": 4.0,
    "weather.stability": "D",
    "weather.terrain": "open",
    "weather.receptors": "100 m, 300 m, 1 km, 3 km",
    "cmp.study": "tank",
    "cmp.substance": "",
    "cmp.mixing": 3.0,
    "cmp.stability": "",
    "inv.example": False,
}

# ------------------------------------------------------------------ uncertainty

#: Distributions a page offers for an input given as a range, with their
#: parameters in the order of `estimator.uncertainty.DISTRIBUTION_KEYS`. "fixed"
#: uses the value entered above; "file" keeps a distribution of a loaded scenario
#: file that the page cannot edit, exactly as written.
DISTRIBUTIONS = {"fixed": (), "uniform": ("low", "high"), "triangular": ("low", "mode", "high"),
                 "lognormal": ("gm", "gsd"), "file": ()}
DISTRIBUTION_WORDS = {"fixed": "fixed (the value above)", "uniform": "uniform",
                      "triangular": "triangular", "lognormal": "lognormal",
                      "file": "as in the scenario file"}
PARAMETER_WORDS = {"low": "Low", "mode": "Most likely", "high": "High",
                   "gm": "Geometric mean", "gsd": "Geometric SD"}

#: Inputs a page can give as a range: study -> scenario input (a key of
#: `estimator.scenario.UNCERTAIN_INPUTS`) -> (input on the page, label, unit kind
#: of `UNITS` or None for a plain number, distributions offered).
UNCERTAIN = {
    "tank": {
        "temperature": ("tank.temperature", "Liquid temperature", "temperature",
                        ("fixed", "uniform", "triangular")),
    },
    "indoor": {
        "temperature": ("indoor.temperature", "Liquid and air temperature", "temperature",
                        ("fixed", "uniform", "triangular")),
        "mass": ("indoor.mass", "Spilled mass", "mass",
                 ("fixed", "uniform", "triangular", "lognormal")),
        "mixing_factor": ("room.mixing", "Mixing factor", None,
                          ("fixed", "uniform", "triangular")),
        "air_speed": ("room.air_speed", "Air speed over the pool", "air_speed",
                      ("fixed", "uniform", "triangular", "lognormal")),
    },
}

#: Samples drawn by default, and at most, on a page.
DEFAULT_SAMPLES = 5_000
MAX_SAMPLES = 50_000
#: Seed used unless the user or a loaded file gives another, so a run repeats.
DEFAULT_SEED = 1


def uncertain_name(study: str, field: str, part: str) -> str:
    """Input name of one part ("kind", "low", ..., "file") of an uncertain input."""
    return f"mc.{study}.{field}.{part}"


for _study, _fields in UNCERTAIN.items():
    for _field, (_page, _label, _kind, _options) in _fields.items():
        PLAIN[uncertain_name(_study, _field, "kind")] = "fixed"
        PLAIN[uncertain_name(_study, _field, "file")] = None
        PLAIN[uncertain_name(_study, _field, "gsd")] = None
        for _part in ("low", "mode", "high", "gm"):
            if _kind is None:
                PLAIN[uncertain_name(_study, _field, _part)] = None
            else:
                QUANTITIES[uncertain_name(_study, _field, _part)] = (_kind, None)
PLAIN["mc.samples"] = DEFAULT_SAMPLES
PLAIN["mc.seed"] = DEFAULT_SEED
PLAIN["mc.method"] = True

LIQUID_PREFIXES = ("tank", "indoor", "outdoor")
LIQUID_DEFAULTS = {"tank": "toluene", "indoor": "acetone", "outdoor": "toluene"}
LIQUID_KINDS = {"table": "One substance from the table", "mixture": "A mixture",
                "own": "My own substance (SDS values)",
                "sds": "From a safety data sheet (paste or upload)",
                "water": "Water with dissolved solvents"}

LIMIT_COLUMNS = ["substance", "kind", "value", "unit", "source"]
MIXTURE_COLUMNS = ["component", "percent"]
DISSOLVED_COLUMNS = ["compound", "mg/L"]

#: Sky states of the outdoor weather block.
SKY = {"day": "Daytime (sun)", "night": "Night (cloud cover)",
       "class": "Stability class given"}


def key(name: str) -> str:
    """Session key of an input."""
    return f"in:{name}"


def table_key(name: str) -> str:
    """Session key holding the current rows of an editable table."""
    return f"tbl:{name}:current"


def system(state) -> str:
    return "US" if state.get(key("units")) else "SI"


def unit_label(kind: str, units: str) -> str:
    return UNITS[kind][units][0]


def from_display(value, kind: str, units: str) -> float:
    """A value in the display unit of `units` as the core's SI value."""
    return convert(float(value), UNITS[kind][units][2], UNITS[kind]["core"])


def system_of(kind: str, label: str | None) -> str:
    """The unit system whose screen label of `kind` is `label` (SI when unknown)."""
    return next((units for units in ("SI", "US") if UNITS[kind][units][0] == label), "SI")


def to_display(value_si, kind: str, units: str):
    """A core SI value in the display unit (None stays None), rounded for the box."""
    if value_si is None:
        return None
    out = convert(float(value_si), UNITS[kind]["core"], UNITS[kind][units][2])
    return round_shown(out)


#: Significant figures kept in an input box after a unit conversion: enough to go
#: SI -> US -> SI without drifting (2500 gal -> 9.464 m³ -> 2500 gal), few enough to
#: read ("9.464 m³", not "9.46353 m³").
SHOWN_DIGITS = 4


def round_shown(value: float, digits: int = SHOWN_DIGITS) -> float:
    """A converted value rounded to sensible steps (4 significant figures, and never
    finer than 0.01 for numbers of 10 or more)."""
    if value == 0 or not math.isfinite(value):
        return float(value)
    out = float(f"{value:.{digits}g}")
    if abs(out) >= 10:
        out = round(out, 2)
    return 0.0 if out == 0 else out


def text(state, name: str) -> str | None:
    """An input as scenario text with its unit ("34.0 degC"), None if empty."""
    value = state.get(key(name))
    if value is None:
        return None
    kind = QUANTITIES[name][0]
    return f"{float(value)!r} {UNITS[kind][system(state)][1]}"


def switch_units(state, old: str, new: str) -> None:
    """Convert every quantity input from one unit system to the other."""
    if old == new:
        return
    for name, (kind, _) in QUANTITIES.items():
        value = state.get(key(name))
        if value is None:
            continue
        state[key(name)] = round_shown(convert(float(value), UNITS[kind][old][2],
                                          UNITS[kind][new][2]))
    # the safety data sheet's property tables, row by row in the unit each names
    for name in [n for n in state if isinstance(n, str) and n.startswith("tbl:")
                 and n.endswith(".sds_properties:current")]:
        frame = state[name]
        if not isinstance(frame, pd.DataFrame) or not len(frame):
            continue
        frame = frame.copy()
        for i, row in frame.iterrows():
            kind = SDS_PROPERTIES.get(row["property"], (None, None))[1]
            if kind is None or row["unit"] != UNITS[kind][old][0]:
                continue
            if pd.notna(row["value"]):
                frame.at[i, "value"] = to_display(from_display(row["value"], kind, old), kind, new)
            frame.at[i, "unit"] = UNITS[kind][new][0]
        state[name] = frame
        state["tbl.generation"] = state.get("tbl.generation", 0) + 1
    # the downwind distances are text with their own units: nothing to convert


# ----------------------------------------------------------------------- defaults

def empty_limits() -> pd.DataFrame:
    return pd.DataFrame({"substance": pd.Series(dtype="object"),
                         "kind": pd.Series(dtype="object"),
                         "value": pd.Series(dtype="float"),
                         "unit": pd.Series(dtype="object"),
                         "source": pd.Series(dtype="object")})


def mixture_frame(rows=()) -> pd.DataFrame:
    frame = pd.DataFrame(list(rows), columns=MIXTURE_COLUMNS)
    return frame.astype({"component": "object", "percent": "float"})


def dissolved_frame(rows=()) -> pd.DataFrame:
    frame = pd.DataFrame(list(rows), columns=DISSOLVED_COLUMNS)
    return frame.astype({"compound": "object", "mg/L": "float"})


def reset_defaults(state) -> None:
    """Every input at its default, in SI units (the tables empty)."""
    units = system(state)
    for name, (kind, default) in QUANTITIES.items():
        state[key(name)] = None if default is None else to_display(
            convert(default, UNITS[kind]["SI"][2], UNITS[kind]["core"]), kind, units)
    for name, default in PLAIN.items():
        if name == "units":
            continue
        state[key(name)] = default
    from estimator.limits import FlammabilityAlarms
    state[key("alarm.source")] = FlammabilityAlarms().source
    for p in LIQUID_PREFIXES:
        state[key(f"{p}.kind")] = "table"
        state[key(f"{p}.substance")] = LIQUID_DEFAULTS[p]
        state[key(f"{p}.find")] = ""
        state[key(f"{p}.basis")] = "mass"
        state[key(f"{p}.liquid_name")] = ""
        state[table_key(f"{p}.mixture")] = mixture_frame()
        state[table_key(f"{p}.dissolved")] = dissolved_frame()
    state[table_key("limits")] = empty_limits()
    state["case.base"] = {}
    state["case.base_si"] = {}
    state["case.base_uncertain"] = {}
    state["case.source"] = NEW_CASE
    state.pop("cmp.seeded", None)  # case B starts again from the new case A
    state["case.studies"] = {"tank": False, "indoor": False, "outdoor": False}
    state["tbl.generation"] = state.get("tbl.generation", 0) + 1


#: What the sidebar names when no file is loaded.
NEW_CASE = "a new, empty case"


def new_case(state) -> None:
    """Start a new, empty case: every input at its default, no tank, spill, limits,
    elevation or worst case of any file (the unit system on screen is kept)."""
    keep_units = state.get(key("units"), False)
    reset_defaults(state)
    state[key("units")] = keep_units
    state["units.shown"] = system(state)


def demo_files() -> list[Path]:
    """The demo scenarios that ship with ullage (package data of `estimator`)."""
    from estimator.samples import demo_scenarios

    return demo_scenarios()


# ---------------------------------------------------------------- scenario -> inputs

def _set(state, name: str, value_si) -> None:
    kind = QUANTITIES[name][0]
    state[key(name)] = to_display(value_si, kind, system(state))


def _substance_label(sub) -> str:
    return sub.name


#: Store key of the liquids found in the property library during this visit.
LIBRARY_FOUND = "lookup.found"


def remember_library_substance(state, sub) -> None:
    """Offer a liquid looked up in the property library in the choosers from now on."""
    if getattr(sub, "origin", None) == "lookup":
        state.setdefault(LIBRARY_FOUND, {})[sub.key] = {
            "name": sub.name,
            "label": f"{sub.name} ({sub.cas}) — property library, not the curated table"}


def _set_liquid(state, prefix: str, entry: dict, scenario) -> None:
    from ullage_ui import sds_input

    if sds_input.set_from_scenario(state, prefix, entry, scenario):
        return
    kind = entry["kind"]
    state[key(f"{prefix}.liquid_name")] = entry["name"]
    state[key(f"{prefix}.find")] = ""
    spec = entry["spec"]
    if kind == "water":
        state[key(f"{prefix}.kind")] = "water"
        state[table_key(f"{prefix}.dissolved")] = dissolved_frame(
            [(s.name, round_shown(convert(c, "kg/m**3", "mg/L"))) for s, c in spec.items()])
        return
    if isinstance(spec, dict):
        state[key(f"{prefix}.kind")] = "mixture"
        state[key(f"{prefix}.basis")] = entry.get("basis", "mass")
        state[table_key(f"{prefix}.mixture")] = mixture_frame(
            [(s.name, round_shown(100.0 * x)) for s, x in spec.items()])
        for s in spec:
            remember_library_substance(state, s)
            if s.origin == "user":
                _set_own(state, s, scenario)
        return
    if spec.origin == "user":
        state[key(f"{prefix}.kind")] = "own"
        _set_own(state, spec, scenario)
        return
    state[key(f"{prefix}.kind")] = "table"
    remember_library_substance(state, spec)
    state[key(f"{prefix}.substance")] = spec.key


def _set_own(state, sub, scenario) -> None:
    from estimator.units import parse_quantity, parse_temperature

    state[key("sds.name")] = sub.name
    state[key("sds.molar_mass")] = round_shown(sub.molar_mass * 1000.0)
    _set(state, "sds.boiling", sub.boiling_point)
    state[key("sds.lfl")] = (None if sub.lower_flammability_limit is None
                             else round_shown(100.0 * sub.lower_flammability_limit))
    state[key("sds.ufl")] = (None if sub.upper_flammability_limit is None
                             else round_shown(100.0 * sub.upper_flammability_limit))
    _set(state, "sds.density", sub.liquid_density)
    _set(state, "sds.flash", sub.flash_point)
    state[key("sds.vp")] = state[key("sds.vp_temperature")] = None
    for raw in scenario.document.get("substance", []):
        if str(raw.get("name", "")).strip().lower() == sub.name.lower():
            points = raw.get("vapor_pressure") or []
            if points:
                t, p = points[0]
                _set(state, "sds.vp_temperature", parse_temperature(t, "vapour pressure"))
                _set(state, "sds.vp", parse_quantity(p, "pressure", "vapour pressure"))


def apply_scenario(state, scenario, source: str) -> list[str]:
    """Put a loaded scenario's first tank, indoor spill and outdoor spill on screen.

    Returns notes on what is shown and what only travels along in the saved file.
    """
    keep_units = state.get(key("units"), False)
    reset_defaults(state)
    state[key("units")] = keep_units
    notes = []
    doc = scenario.document
    state["case.base"] = _plain(doc)
    state["case.source"] = source
    state[key("title")] = scenario.title
    _apply_site_and_alarms(state, scenario)
    studies = {"tank": False, "indoor": False, "outdoor": False}
    if scenario.tanks:
        studies["tank"] = True
        _apply_tank(state, scenario)
        if len(scenario.tanks) > 1:
            notes.append(f"{len(scenario.tanks)} tanks in the file: the first is on the "
                         "tank page; the others are kept in the saved file.")
    indoor = [s for s in scenario.spills if s.get("room")]
    if indoor:
        studies["indoor"] = True
        _apply_indoor(state, indoor[0], scenario)
    outdoor = [s for s in scenario.spills if not s.get("room")]
    if outdoor:
        studies["outdoor"] = True
        _apply_outdoor(state, outdoor[0], scenario)
    state["case.studies"] = studies
    state["case.base_si"] = _base_si(scenario, indoor, outdoor)
    notes += _set_uncertain(state, scenario)
    rows = [(_limit_name(lim, scenario), lim.kind, float(lim.value), lim.unit, lim.source)
            for lim in scenario.limits]
    state[table_key("limits")] = pd.DataFrame(rows, columns=LIMIT_COLUMNS).astype(
        {"value": "float"}) if rows else empty_limits()
    spills = len(scenario.spills) - len(indoor[:1]) - len(outdoor[:1])
    if spills > 0:
        notes.append(f"{spills} further spill(s) in the file are kept in the saved file.")
    return notes


def _apply_site_and_alarms(state, scenario) -> None:
    """The site pressure (barometric or by elevation) and the alarm levels."""
    cond = scenario.document.get("conditions", {})
    if "barometric_pressure" in cond:
        state[key("site.mode")] = "barometric"
        _set(state, "site.barometric", scenario.pressure)
    elif "elevation" in cond:
        from estimator.units import parse_quantity

        state[key("site.mode")] = "elevation"
        _set(state, "site.elevation", parse_quantity(cond["elevation"], "length", "elevation"))
    alarms = scenario.alarms
    state[key("alarm.percent_lfl")] = float(alarms.percent_lfl)
    state[key("alarm.oxygen_low")] = float(alarms.oxygen_low)
    state[key("alarm.oxygen_high")] = float(alarms.oxygen_high)
    state[key("alarm.source")] = alarms.source


def _apply_tank(state, scenario) -> None:
    """The first tank onto the tank page."""
    tank = scenario.tanks[0]
    state[key("tank.name")] = tank["name"]
    _set_liquid(state, "tank", scenario.liquids[tank["liquid"]], scenario)
    for name, field in (("tank.temperature", "temperature"), ("tank.worst", "worst_temperature"),
                        ("tank.volume", "volume"), ("tank.gauge", "gauge_pressure"),
                        ("tank.daily_low", "daily_low"), ("tank.daily_high", "daily_high"),
                        ("tank.pumped", "pumped_volume"), ("tank.purge_rate", "purge_rate"),
                        ("tank.purge_target", "purge_target")):
        _set(state, name, tank.get(field))
    if tank.get("fill") is not None:
        _set(state, "tank.fill", tank["fill"])
    state[key("tank.purge_mixing")] = float(tank.get("purge_mixing_factor", 1.0))
    state[key("tank.details")] = any(tank.get(k) is not None for k in (
        "daily_low", "pumped_volume", "purge_rate"))


def _apply_indoor(state, spill, scenario) -> None:
    """The first indoor spill and its room onto the indoor page."""
    room = next(r for r in scenario.rooms if r["name"] == spill["room"])
    _set_spill(state, "indoor", spill, scenario)
    state[key("indoor.duration")] = to_display(spill["duration"], "minutes", "SI")
    if spill.get("cleanup_after") is not None:
        state[key("indoor.cleanup")] = to_display(spill["cleanup_after"], "minutes", "SI")
    if spill.get("mass") is not None:
        state[key("indoor.amount_kind")] = "mass"
        _set(state, "indoor.mass", spill["mass"])
    state[key("room.name")] = room["name"]
    _set(state, "room.volume", room["volume"])
    _set(state, "room.air_changes", room["ventilation_rate"] / room["volume"])
    state[key("room.mixing")] = float(room["mixing_factor"])
    _set(state, "room.air_speed", room["air_speed"])
    _set(state, "room.near_field_radius", room.get("near_field_radius"))
    _set(state, "room.random_air_speed", room.get("random_air_speed"))


def _apply_outdoor(state, spill, scenario) -> None:
    """The first outdoor spill and the weather onto the outdoor page; the distances as
    written in the file."""
    _set_spill(state, "outdoor", spill, scenario)
    od = scenario.outdoors
    _set(state, "weather.wind", od["wind_speed"])
    _set(state, "weather.wind_height", od.get("wind_height", 10.0))
    if od.get("stability"):
        state[key("weather.sky")] = "class"
        state[key("weather.stability")] = od["stability"]
    elif od.get("daytime", True):
        state[key("weather.sky")] = "day"
        state[key("weather.insolation")] = od.get("insolation") or "moderate"
    else:
        state[key("weather.sky")] = "night"
        state[key("weather.cloud")] = float(od.get("cloud_cover", 4.0) or 0.0)
    state[key("weather.terrain")] = od.get("terrain", "open")
    units = system(state)
    written = list(scenario.document.get("outdoors", {}).get("receptors") or [])
    state[key("weather.receptors")] = ", ".join(
        str(x) for x in written) if written else ", ".join(
        f"{to_display(x, 'length', units):g} {UNITS['length'][units][1]}"
        for x in od["receptors"])


def _base_si(scenario, indoor, outdoor) -> dict:
    """The SI values of the items of a loaded file that the pages show, to tell an
    input left as loaded from one the user changed (see `kept`)."""
    out = {"pressure": scenario.pressure}
    cond = scenario.document.get("conditions", {})
    if "elevation" in cond:
        from estimator.units import parse_quantity

        out["elevation"] = parse_quantity(cond["elevation"], "length", "elevation")
    if scenario.tanks:
        out["tank"] = _plain(dict(scenario.tanks[0]))
    if indoor:
        out["indoor"] = _plain(dict(indoor[0]))
        room = next(r for r in scenario.rooms if r["name"] == indoor[0]["room"])
        out["room"] = _plain(dict(room))
        out["room"]["air_changes"] = room["ventilation_rate"] / room["volume"]
    if outdoor:
        out["outdoor"] = _plain(dict(outdoor[0]))
        out["outdoors"] = _plain(dict(scenario.outdoors or {}))
    return out


def _set_uncertain(state, scenario) -> list[str]:
    """Put the distributions of the first tank and indoor spill in the Uncertainty boxes."""
    notes = []
    first = {"tank": scenario.tanks[0]["name"] if scenario.tanks else None,
             "indoor": next((s["name"] for s in scenario.spills if s.get("room")), None)}
    written = list(scenario.document.get("uncertain", []))
    kept = 0
    for entry, raw in zip(scenario.uncertain, written):
        study = "tank" if entry["kind"] == "tank" else "indoor"
        if entry["item"] != first[study] or entry["input"] not in UNCERTAIN[study]:
            kept += 1
            continue
        _set_distribution(state, study, entry["input"], entry["distribution"],
                          raw.get("distribution"))
    if kept:
        notes.append(f"{kept} uncertain input(s) in the file are not edited on the pages; "
                     "they are kept in the saved file and in the runs of their items.")
    mc = scenario.monte_carlo
    samples = int(mc["samples"])
    if samples > MAX_SAMPLES:
        notes.append(f"The file asks for {samples:,} Monte Carlo samples; the pages draw at "
                     f"most {MAX_SAMPLES:,}.")
    state[key("mc.samples")] = max(100, min(samples, MAX_SAMPLES))
    if mc["seed"] is not None:
        state[key("mc.seed")] = int(mc["seed"])
    elif scenario.uncertain:
        notes.append(f"The file gives no Monte Carlo seed; seed {DEFAULT_SEED} is used so the "
                     "run repeats.")
    state[key("mc.method")] = bool(mc["method_uncertainty"])
    return notes


def _set_distribution(state, study: str, field: str, dist, written) -> None:
    from estimator.uncertainty import LogNormal, Triangular, Uniform

    _, _, kind, options = UNCERTAIN[study][field]

    def put(part, value_si):
        name = uncertain_name(study, field, part)
        if kind is None:
            state[key(name)] = round_shown(float(value_si))
        else:
            _set(state, name, value_si)

    choice = "file"
    if isinstance(dist, Uniform) and "uniform" in options:
        choice = "uniform"
        put("low", dist.low)
        put("high", dist.high)
    elif isinstance(dist, Triangular) and "triangular" in options:
        choice = "triangular"
        put("low", dist.low)
        put("mode", dist.mode)
        put("high", dist.high)
    elif isinstance(dist, LogNormal) and "lognormal" in options:
        choice = "lognormal"
        put("gm", dist.geometric_mean)
        state[key(uncertain_name(study, field, "gsd"))] = round_shown(dist.geometric_sd)
    state[key(uncertain_name(study, field, "kind"))] = choice
    state[key(uncertain_name(study, field, "file"))] = (_plain(written) if choice == "file"
                                                        else None)
    if choice != "file":
        si = {"low": getattr(dist, "low", None), "mode": getattr(dist, "mode", None),
              "high": getattr(dist, "high", None), "gm": getattr(dist, "geometric_mean", None),
              "gsd": getattr(dist, "geometric_sd", None)}
        state.setdefault("case.base_uncertain", {})[f"{study}.{field}"] = {
            "choice": choice, "si": {p: si[p] for p in DISTRIBUTIONS[choice]},
            "written": _plain(written)}


def _limit_name(limit, scenario) -> str:
    for sub in scenario.substances:
        if sub.key == limit.substance:
            return sub.name
    try:
        from estimator.substances import substance

        return substance(limit.substance).name
    except Exception:  # a key that no longer resolves: show it as stored
        return limit.substance


def _set_spill(state, prefix: str, spill: dict, scenario) -> None:
    state[key(f"{prefix}.name")] = spill["name"]
    _set_liquid(state, prefix, scenario.liquids[spill["liquid"]], scenario)
    _set(state, f"{prefix}.temperature", spill["temperature"])
    if spill.get("volume") is not None:
        _set(state, f"{prefix}.volume", spill["volume"])
    _set(state, f"{prefix}.area", spill.get("area"))
    _set(state, f"{prefix}.dike", spill.get("dike_area"))
    state[key(f"{prefix}.model")] = spill.get("model", "mackay-matsugu")


def _plain(value):
    """A scenario document as plain dicts and lists (for copying and saving)."""
    if isinstance(value, dict) or hasattr(value, "items"):
        return {k: _plain(v) for k, v in value.items()}
    if isinstance(value, list):
        return [_plain(v) for v in value]
    return value


# ---------------------------------------------------------------- inputs -> scenario

#: Keys of a loaded file's items that the pages edit; the other keys of those items
#: travel along into the saved file as written.
EDITED_KEYS = {
    "tank": {"name", "liquid", "temperature", "worst_temperature", "volume", "fill",
             "gauge_pressure", "daily_low", "daily_high", "pumped_volume", "purge_rate",
             "purge_target", "purge_mixing_factor"},
    "indoor": {"name", "liquid", "temperature", "volume", "mass", "area", "dike_area", "room",
               "duration", "cleanup_after", "model"},
    "outdoor": {"name", "liquid", "temperature", "volume", "mass", "area", "dike_area",
                "outdoors", "room", "model"},
    "room": {"name", "volume", "air_changes", "ventilation_rate", "mixing_factor", "air_speed",
             "near_field_radius", "random_air_speed"},
    "outdoors": {"wind_speed", "wind_height", "stability", "daytime", "cloud_cover",
                 "insolation", "terrain", "receptors"},
}


def base_item(state, which: str) -> dict:
    """The written item of the loaded file shown on a page ("tank", "indoor",
    "outdoor", "room", "outdoors"), or an empty dict."""
    base = state.get("case.base", {}) or {}
    si = (state.get("case.base_si", {}) or {}).get(which)
    if not si:
        return {}
    if which == "outdoors":
        return dict(base.get("outdoors") or {})
    section = {"tank": "tank", "indoor": "spill", "outdoor": "spill", "room": "room"}[which]
    name = str(si.get("name", "")).strip().lower()
    return next((dict(x) for x in base.get(section, []) or []
                 if str(x.get("name", "")).strip().lower() == name), {})


def unchanged(state, name: str, value_si) -> bool:
    """Whether an input still shows the value a loaded file gave it."""
    shown = state.get(key(name))
    if shown is None or value_si is None:
        return False
    if name in QUANTITIES:
        return to_display(value_si, QUANTITIES[name][0], system(state)) == shown
    return float(shown) == float(value_si)


def kept(state, name: str, which: str, field: str):
    """An input as scenario text: as the loaded file wrote it while it is unchanged on
    screen (left out when the file left it to its default), else as entered."""
    si = ((state.get("case.base_si", {}) or {}).get(which) or {}).get(field)
    if si is None or not unchanged(state, name, si):
        return text(state, name)
    return base_item(state, which).get(field)


def _carry(item: dict, state, which: str) -> dict:
    """Add the keys of the loaded item that no page edits, as written."""
    for name, value in base_item(state, which).items():
        if name not in item and name not in EDITED_KEYS[which]:
            item[name] = value
    return item


def filled_rows(frame) -> list[dict]:
    """The non-empty rows of a table as dicts, blanks as None."""
    if frame is None or len(frame) == 0:
        return []
    columns = list(frame.columns)
    out = []
    for values in frame.itertuples(index=False, name=None):
        cleaned = {c: (None if _blank(v) else v) for c, v in zip(columns, values)}
        if any(v is not None for v in cleaned.values()):
            out.append(cleaned)
    return out


def _blank(value) -> bool:
    if value is None:
        return True
    if isinstance(value, float) and math.isnan(value):
        return True
    return isinstance(value, str) and not value.strip()


def own_substance(state) -> dict:
    """The user's own substance as a [[substance]] table."""
    item = {"name": str(state.get(key("sds.name")) or "").strip() or "my solvent",
            "molar_mass": f"{float(state.get(key('sds.molar_mass')) or 0.0)!r} g/mol",
            "boiling_point": text(state, "sds.boiling") or "",
            "source": "user-entered (safety data sheet)"}
    vp, vp_t = text(state, "sds.vp"), text(state, "sds.vp_temperature")
    if vp is not None and vp_t is not None:
        item["vapor_pressure"] = [[vp_t, vp]]
    for field, name in (("lower_flammability_limit", "sds.lfl"),
                        ("upper_flammability_limit", "sds.ufl")):
        value = state.get(key(name))
        if value is not None:
            item[field] = f"{float(value)!r} %"
    if text(state, "sds.density") is not None:
        item["liquid_density"] = text(state, "sds.density")
    if text(state, "sds.flash") is not None:
        item["flash_point"] = text(state, "sds.flash")
    return item


def liquid_item(state, prefix: str) -> tuple[dict, list[str]]:
    """The [[liquid]] table of one page, and problems found in its rows."""
    from estimator.substances import substance

    kind = state.get(key(f"{prefix}.kind"), "table")
    named = str(state.get(key(f"{prefix}.liquid_name")) or "").strip()
    problems = []
    if kind == "sds":
        from ullage_ui import sds_input

        return sds_input.liquid_item(state, prefix)
    if kind == "own":
        name = own_substance(state)["name"]
        return {"name": named or name, "substance": name}, problems
    if kind == "mixture":
        components = {}
        for i, row in enumerate(filled_rows(state.get(table_key(f"{prefix}.mixture"))), 1):
            if row.get("component") is None:
                problems.append(f"row {i}: choose the component")
                continue
            if row.get("percent") is None:
                problems.append(f"row {i}: give the percentage of {row['component']}")
                continue
            components[str(row["component"])] = f"{float(row['percent'])!r} %"
        if not components:
            problems.append("enter at least one component and its percentage")
        item = {"name": named or "mixture", "components": components,
                "basis": state.get(key(f"{prefix}.basis"), "mass")}
        return item, problems
    if kind == "water":
        dissolved = {}
        for i, row in enumerate(filled_rows(state.get(table_key(f"{prefix}.dissolved"))), 1):
            if row.get("compound") is None or row.get("mg/L") is None:
                problems.append(f"row {i}: give the compound and its concentration in mg/L")
                continue
            dissolved[str(row["compound"])] = f"{float(row['mg/L'])!r} mg/L"
        if not dissolved:
            problems.append("enter at least one dissolved compound and its concentration")
        return {"name": named or "water with dissolved solvents",
                "dissolved_in_water": dissolved}, problems
    chosen = state.get(key(f"{prefix}.substance")) or LIQUID_DEFAULTS.get(prefix, "toluene")
    try:
        name = substance(chosen).name
    except Exception:  # shown by the substance chooser; keep the text for the message
        name = str(chosen)
    loaded = _loaded_liquid(state, prefix)
    if loaded and loaded.get("substance") == chosen and named:
        name = named  # the loaded file's own name for this liquid
    return {"name": name, "substance": chosen}, problems


def _loaded_liquid(state, prefix: str) -> dict:
    """The written [[liquid]] table of the loaded item on a page, or an empty dict."""
    wanted = str(base_item(state, prefix).get("liquid", "")).strip().lower()
    base = state.get("case.base", {}) or {}
    return next((dict(x) for x in base.get("liquid", []) or []
                 if wanted and str(x.get("name", "")).strip().lower() == wanted), {})


def uses_own_substance(state, prefixes) -> bool:
    name = own_substance(state)["name"].lower()
    for p in prefixes:
        kind = state.get(key(f"{p}.kind"))
        if kind == "own":
            return True
        if kind == "mixture" and any(str(r.get("component", "")).lower() == name
                                     for r in filled_rows(state.get(table_key(f"{p}.mixture")))):
            return True
    return any(str(r.get("substance", "")).lower() == name
               for r in filled_rows(state.get(table_key("limits"))))


def conditions(state) -> dict:
    mode = state.get(key("site.mode"), "sea level")
    out = {}
    si = state.get("case.base_si", {}) or {}
    written = (state.get("case.base", {}) or {}).get("conditions", {})
    if mode == "elevation" and text(state, "site.elevation"):
        out["elevation"] = (written["elevation"] if "elevation" in written
                            and unchanged(state, "site.elevation", si.get("elevation"))
                            else text(state, "site.elevation"))
    elif mode == "barometric" and text(state, "site.barometric"):
        out["barometric_pressure"] = (
            written["barometric_pressure"] if "barometric_pressure" in written
            and unchanged(state, "site.barometric", si.get("pressure"))
            else text(state, "site.barometric"))
    air = (state.get("case.base", {}) or {}).get("conditions", {}).get("air_temperature")
    if air:
        out["air_temperature"] = air
    return out


def alarms(state) -> dict:
    from estimator.limits import FlammabilityAlarms

    default = FlammabilityAlarms()
    values = {"percent_lfl": state.get(key("alarm.percent_lfl")),
              "oxygen_low": state.get(key("alarm.oxygen_low")),
              "oxygen_high": state.get(key("alarm.oxygen_high"))}
    source = str(state.get(key("alarm.source")) or "").strip()
    if (values["percent_lfl"] == default.percent_lfl
            and values["oxygen_low"] == default.oxygen_low
            and values["oxygen_high"] == default.oxygen_high and source == default.source):
        return {}
    out = {}
    if values["percent_lfl"] is not None:
        out["percent_lfl"] = float(values["percent_lfl"])
    for name in ("oxygen_low", "oxygen_high"):
        if values[name] is not None:
            out[name] = f"{float(values[name])!r} %"
    out["source"] = source or "entered on screen"
    return out


def limit_rows(state) -> list[tuple[int, dict]]:
    """(row number, [[limit]] table) for every non-empty row of the limits table."""
    out = []
    for i, row in enumerate(filled_rows(state.get(table_key("limits"))), 1):
        item = {"substance": "" if row.get("substance") is None else str(row["substance"])}
        kind = row.get("kind") or "TWA"
        value = row.get("value")
        unit = row.get("unit") or "ppm"
        item[str(kind)] = "" if value is None else f"{float(value)!r} {unit}"
        item["source"] = "" if row.get("source") is None else str(row["source"]).strip()
        out.append((i, item))
    return out


def _head(state) -> dict:
    title = str(state.get(key("title")) or "").strip() or "Untitled case"
    head = {"title": title}
    base = state.get("case.base", {}).get("scenario", {})
    for field in ("site", "description"):
        if base.get(field):
            head[field] = base[field]
    return head


def tank_item(state, liquid_name: str) -> dict:
    item = {"name": str(state.get(key("tank.name")) or "tank 1").strip() or "tank 1",
            "liquid": liquid_name,
            "temperature": kept(state, "tank.temperature", "tank", "temperature")}
    for field, name in (("worst_temperature", "tank.worst"), ("volume", "tank.volume"),
                        ("fill", "tank.fill"), ("gauge_pressure", "tank.gauge")):
        value = kept(state, name, "tank", field)
        if value is not None:
            item[field] = value
    if state.get(key("tank.details")):
        for field, name in (("daily_low", "tank.daily_low"), ("daily_high", "tank.daily_high"),
                            ("pumped_volume", "tank.pumped"), ("purge_rate", "tank.purge_rate"),
                            ("purge_target", "tank.purge_target")):
            value = kept(state, name, "tank", field)
            if value is not None:
                item[field] = value
        if item.get("purge_rate") and state.get(key("tank.purge_mixing")) not in (None, 1.0):
            item["purge_mixing_factor"] = float(state[key("tank.purge_mixing")])
    if item.get("fill") is not None and item.get("volume") is None:
        item.pop("fill")
    return _carry(item, state, "tank")


def room_item(state) -> dict:
    item = {"name": str(state.get(key("room.name")) or "room 1").strip() or "room 1",
            "volume": kept(state, "room.volume", "room", "volume"),
            "air_changes": text(state, "room.air_changes"),
            "mixing_factor": float(state.get(key("room.mixing")) or 1.0),
            "air_speed": kept(state, "room.air_speed", "room", "air_speed")}
    written = base_item(state, "room")
    si = (state.get("case.base_si", {}) or {}).get("room") or {}
    if written and unchanged(state, "room.air_changes", si.get("air_changes")) and (
            unchanged(state, "room.volume", si.get("volume"))):
        if "ventilation_rate" in written:
            item.pop("air_changes")
            item["ventilation_rate"] = written["ventilation_rate"]
        elif "air_changes" in written:
            item["air_changes"] = written["air_changes"]
    if written and "mixing_factor" in written and unchanged(state, "room.mixing",
                                                             si.get("mixing_factor")):
        item["mixing_factor"] = written["mixing_factor"]
    for field, name in (("near_field_radius", "room.near_field_radius"),
                        ("random_air_speed", "room.random_air_speed")):
        value = kept(state, name, "room", field)
        if value is not None:
            item[field] = value
    return _carry({k: v for k, v in item.items() if v is not None}, state, "room")


def spill_item(state, prefix: str, liquid_name: str) -> dict:
    item = {"name": str(state.get(key(f"{prefix}.name")) or prefix).strip() or prefix,
            "liquid": liquid_name,
            "temperature": kept(state, f"{prefix}.temperature", prefix, "temperature")}
    if prefix == "indoor" and state.get(key("indoor.amount_kind")) == "mass":
        item["mass"] = kept(state, "indoor.mass", prefix, "mass")
    else:
        item["volume"] = kept(state, f"{prefix}.volume", prefix, "volume")
    for field, name in (("area", f"{prefix}.area"), ("dike_area", f"{prefix}.dike")):
        value = kept(state, name, prefix, field)
        if value is not None:
            item[field] = value
    written = base_item(state, prefix)
    if prefix == "indoor":
        item["room"] = room_item(state)["name"]
        item["duration"] = kept(state, "indoor.duration", prefix, "duration")
        if item["duration"] is None and text(state, "indoor.duration") is not None:
            item["duration"] = text(state, "indoor.duration")
        value = kept(state, "indoor.cleanup", prefix, "cleanup_after")
        if value is not None:
            item["cleanup_after"] = value
    else:
        item["outdoors"] = True
        if not written:
            item["duration"] = "60.0 min"
    model = state.get(key(f"{prefix}.model"), "mackay-matsugu")
    if model != "mackay-matsugu" or "model" in written:
        item["model"] = model
    return _carry({k: v for k, v in item.items() if v is not None}, state, prefix)


def receptor_entries(state) -> tuple[list[float], list[str]]:
    """The downwind distances typed that can be used, in the display length unit, and
    the problem of each of the others (each is left out, the rest kept)."""
    from estimator.checks import positive
    from estimator.errors import UllageError

    values, problems = [], []
    for part in str(state.get(key("weather.receptors")) or "").replace(";", ",").split(","):
        part = part.strip()
        if not part:
            continue
        try:
            (distance,) = receptor_distances(part)
        except (UllageError, ValueError) as exc:
            problems.append(getattr(exc, "reason", None) or f"'{part}' is not a distance")
            continue
        try:
            positive(distance, "Downwind distances", "m")
        except UllageError:
            problems.append(f"'{part}' is not above 0; a distance downwind of the pool "
                            "must be positive")
            continue
        values.append(to_display(distance, "length", system(state)))
    return values, problems


def receptor_distances(raw: str) -> list[float]:
    """Downwind distances typed as text with units ("100 m, 0.5 km, 2000 ft") -> [m].

    A number without a unit is refused (InputError naming the field): the box takes
    any length unit, so a bare number could mean metres or feet.
    """
    from estimator.errors import InputError
    from estimator.units import parse_quantity

    out = []
    for part in str(raw).replace(";", ",").split(","):
        part = part.strip()
        if not part:
            continue
        try:
            float(part)
        except ValueError:
            out.append(parse_quantity(part, "length", "Downwind distances"))
            continue
        raise InputError("Downwind distances", f"'{part}' has no unit; write it with one, "
                         f"for example '{part} m' or '{part} ft'")
    return out


def outdoors_item(state, receptors=None) -> dict:
    length = UNITS["length"][system(state)][1]
    item = {"wind_speed": kept(state, "weather.wind", "outdoors", "wind_speed")}
    height = kept(state, "weather.wind_height", "outdoors", "wind_height")
    if height is not None or not base_item(state, "outdoors"):
        item["wind_height"] = height if height is not None else text(state, "weather.wind_height")
    sky = state.get(key("weather.sky"), "day")
    if sky == "class":
        item["stability"] = str(state.get(key("weather.stability")) or "D")
    elif sky == "night":
        item["daytime"] = False
        item["cloud_cover"] = float(state.get(key("weather.cloud")) or 0.0)
    else:
        item["daytime"] = True
        item["insolation"] = str(state.get(key("weather.insolation")) or "moderate")
    item["terrain"] = str(state.get(key("weather.terrain")) or "open")
    # saving keeps every distance as typed, one that cannot be read included (the
    # page names it); the file then says what is wrong with it when loaded
    values, problems = receptor_entries(state) if receptors is None else (receptors, [])
    written = base_item(state, "outdoors")
    loaded = ((state.get("case.base_si", {}) or {}).get("outdoors") or {}).get("receptors")
    if (receptors is None and not problems and written.get("receptors") and loaded
            and values == [to_display(x, "length", system(state)) for x in loaded]):
        item["receptors"] = list(written["receptors"])
    elif receptors is None and (values or problems):
        item["receptors"] = [part.strip() for part in str(
            state.get(key("weather.receptors")) or "").replace(";", ",").split(",")
            if part.strip()]
    elif values:
        item["receptors"] = [f"{float(v)!r} {length}" for v in values]
    return _carry({k: v for k, v in item.items() if v is not None}, state, "outdoors")


def written_distribution(spec) -> str:
    """A distribution of a scenario file the way it reads there."""
    if isinstance(spec, dict):
        return "{ " + ", ".join(f"{k} = {written_distribution(v)}" for k, v in spec.items()) + " }"
    if isinstance(spec, (list, tuple)):
        return "[" + ", ".join(written_distribution(v) for v in spec) + "]"
    return str(spec)


def uncertainty_unavailable(state, study: str) -> str | None:
    """Why the liquid on a page cannot be screened probabilistically, or None."""
    kind = state.get(key(f"{study}.kind"), "table")
    if study == "tank" and kind == "water":
        return ("Probabilistic screening is not available for water with dissolved "
                "solvents; it covers liquids and their mixtures.")
    if study == "indoor" and kind in ("mixture", "sds"):
        return ("Probabilistic screening of a spill covers one substance: a mixture's pool "
                "changes composition as it evaporates, which the sampled room model does not "
                "follow.")
    return None


def _parameter(state, study: str, field: str, part: str):
    value = state.get(key(uncertain_name(study, field, part)))
    return None if value is None else float(value)


def _parameter_text(state, study: str, field: str, part: str):
    kind = UNCERTAIN[study][field][2]
    if kind is None or part == "gsd":
        return _parameter(state, study, field, part)
    return text(state, uncertain_name(study, field, part))


def distribution_problem(state, study: str, field: str) -> str | None:
    """What is wrong with the range given for one input, in the units on screen, or None.

    Checks the shape of the distribution only (bounds in order, most likely value
    inside them, geometric SD above 1); physical bounds are the core's to check.
    """
    choice = state.get(key(uncertain_name(study, field, "kind")), "fixed")
    parts = DISTRIBUTIONS.get(choice, ())
    if choice == "file" and state.get(key(uncertain_name(study, field, "file"))) is None:
        return "no distribution from a file is held for this input; choose another"
    values = {part: _parameter(state, study, field, part) for part in parts}
    missing = [PARAMETER_WORDS[p].lower() for p, v in values.items() if v is None]
    if missing:
        return f"give the {' and '.join(missing)} value" + ("s" if len(missing) > 1 else "")
    kind = UNCERTAIN[study][field][2]
    unit = f" {unit_label(kind, system(state))}" if kind else ""

    def shown(value):
        return f"{value:g}{unit}"

    if choice in ("uniform", "triangular") and not values["low"] < values["high"]:
        return (f"the low end ({shown(values['low'])}) must be below the high end "
                f"({shown(values['high'])}); for a value known exactly choose fixed")
    if choice == "triangular" and not values["low"] <= values["mode"] <= values["high"]:
        return (f"the most likely value ({shown(values['mode'])}) must lie between the low "
                f"end ({shown(values['low'])}) and the high end ({shown(values['high'])})")
    if choice == "lognormal":
        if not values["gm"] > 0:
            return f"the geometric mean ({shown(values['gm'])}) must be above 0"
        if not values["gsd"] > 1:
            return (f"the geometric SD ({values['gsd']:g}) must be above 1 (1 means no "
                    "spread: choose fixed)")
    return None


def _base_item_name(state, study: str) -> str | None:
    base = state.get("case.base", {}) or {}
    if study == "tank":
        tanks = base.get("tank") or []
        return tanks[0].get("name") if tanks else None
    return next((s.get("name") for s in base.get("spill", []) or [] if s.get("room")), None)


def carried_uncertain(state, study: str) -> list[dict]:
    """[[uncertain]] tables of the loaded file for the item on a page, for inputs the
    page does not edit (such as a pool area or ventilation rate), as written."""
    base = state.get("case.base", {}) or {}
    name = str(_base_item_name(state, study) or "").strip().lower()
    if not name:
        return []
    return [dict(u) for u in base.get("uncertain", []) or []
            if str(u.get("item", "")).strip().lower() == name
            and u.get("input") not in UNCERTAIN[study]]


def uncertain_entries(state, study: str, item_name: str) -> tuple[list[dict], dict]:
    """[[uncertain]] tables for the inputs of one page given as ranges, and the
    problems of those that cannot be used (input -> message; each is left out)."""
    if study not in UNCERTAIN or uncertainty_unavailable(state, study):
        return [], {}
    entries, problems = [], {}
    for field in UNCERTAIN[study]:
        choice = state.get(key(uncertain_name(study, field, "kind")), "fixed")
        if choice == "fixed" or choice not in DISTRIBUTIONS:
            continue
        problem = distribution_problem(state, study, field)
        if problem:
            problems[field] = problem
            continue
        loaded = (state.get("case.base_uncertain", {}) or {}).get(f"{study}.{field}")
        if choice == "file":
            spec = state[key(uncertain_name(study, field, "file"))]
        elif loaded and loaded["choice"] == choice and all(
                _unchanged_part(state, study, field, part, value)
                for part, value in loaded["si"].items()):
            spec = loaded["written"]  # as the loaded file wrote it
        elif choice == "lognormal":
            spec = {"lognormal": {"gm": _parameter_text(state, study, field, "gm"),
                                  "gsd": _parameter(state, study, field, "gsd")}}
        else:
            spec = {choice: [_parameter_text(state, study, field, part)
                             for part in DISTRIBUTIONS[choice]]}
        entries.append({"item": item_name, "input": field, "distribution": spec})
    for entry in carried_uncertain(state, study):
        entries.append(dict(entry, item=item_name))
    return entries, problems


def _unchanged_part(state, study: str, field: str, part: str, value_si) -> bool:
    kind = UNCERTAIN[study][field][2]
    name = uncertain_name(study, field, part)
    shown = state.get(key(name))
    if shown is None or value_si is None:
        return False
    if kind is None or part == "gsd":
        return round_shown(float(value_si)) == float(shown)
    return unchanged(state, name, value_si)


def monte_carlo_table(state) -> dict:
    """The [monte_carlo] table of the settings on screen."""
    samples = state.get(key("mc.samples"))
    samples = DEFAULT_SAMPLES if samples is None else int(samples)
    seed = state.get(key("mc.seed"))
    return {"samples": max(100, min(samples, MAX_SAMPLES)),
            "seed": DEFAULT_SEED if seed is None else max(0, int(seed)),
            "method_uncertainty": bool(state.get(key("mc.method"), True))}


def monte_carlo_document(state, study: str, *, limits=None) -> dict | None:
    """The smallest scenario document that gives a page's probabilistic run, or None
    when no input is given as a range (or the liquid has problems).

    For the tank only what the sampled headspace uses is kept (liquid, pressure,
    limits, alarms), so that changing the tank volume, fill or purge does not
    draw the samples again; with the temperature given as a range the stated
    temperature, which the samples do not use, is replaced by the low end of the
    range for the same reason.
    """
    doc, problems = study_document(state, study, limits=limits, uncertain=True)
    if problems or "uncertain" not in doc:
        return None
    if study == "tank":
        tank = doc["tank"][0]
        trimmed = {k: tank[k] for k in ("name", "liquid", "temperature", "gauge_pressure")
                   if k in tank}
        for entry in doc["uncertain"]:
            spec = entry["distribution"]
            if entry["input"] == "temperature" and isinstance(spec, dict) and len(spec) == 1:
                values = next(iter(spec.values()))
                if isinstance(values, list) and values and isinstance(values[0], str):
                    trimmed["temperature"] = values[0]
        doc["tank"] = [trimmed]
    return doc


def study_document(state, study: str, *, receptors=None, limits=None,
                   uncertain: bool = False) -> tuple[dict, list[str]]:
    """A scenario document for one study ("tank", "indoor" or "outdoor") with the
    inputs on screen, and the problems found while gathering them.

    `limits` replaces the rows of the limits table (as (row, item) pairs). With
    `uncertain`, the inputs given as ranges go in as [[uncertain]] tables with the
    [monte_carlo] settings (ranges with problems are left out).
    """
    problems = []
    doc = {"scenario": _head(state)}
    if conditions(state):
        doc["conditions"] = conditions(state)
    if alarms(state):
        doc["alarms"] = alarms(state)
    if study == "indoor" and state.get("case.base", {}).get("shift"):
        doc["shift"] = dict(state["case.base"]["shift"])
    if uses_own_substance(state, [study]):
        doc["substance"] = [own_substance(state)]
    liquid, liquid_problems = liquid_item(state, study)
    problems += liquid_problems
    doc["liquid"] = [liquid]
    if study == "tank":
        doc["tank"] = [tank_item(state, liquid["name"])]
    elif study == "indoor":
        doc["room"] = [room_item(state)]
        doc["spill"] = [spill_item(state, "indoor", liquid["name"])]
    else:
        doc["spill"] = [spill_item(state, "outdoor", liquid["name"])]
        doc["outdoors"] = outdoors_item(state, receptors)
    rows = limit_rows(state) if limits is None else limits
    if rows:
        doc["limit"] = [item for _, item in rows]
    if uncertain and study in UNCERTAIN:
        item = doc["tank"][0] if study == "tank" else doc["spill"][0]
        entries, _ = uncertain_entries(state, study, item["name"])
        if entries:
            doc["uncertain"] = entries
            doc["monte_carlo"] = monte_carlo_table(state)
    return doc, problems


def view_document(state, study: str, *, limits=None) -> tuple[dict, list[str]]:
    """The scenario document a page's result is computed from: `study_document`, and
    for the tank a temperature sweep over whole steps (10 °C or 20 °F) that covers
    the stated and worst-case temperatures with a margin (15 °C, 27 °F).

    The sweep then stays the same while the temperature moves within a step, so
    the charts update in place. Saved files and reports keep the core's own range.
    """
    doc, problems = study_document(state, study, limits=limits)
    if study == "tank" and not problems:
        tank = doc["tank"][0]
        stated, worst = state.get(key("tank.temperature")), state.get(key("tank.worst"))
        if stated is not None and "sweep_from" not in tank and "sweep_to" not in tank:
            step, margin = (20.0, 27.0) if system(state) == "US" else (10.0, 15.0)
            top = max(float(stated), float(worst)) if worst is not None else float(stated)
            unit = UNITS["temperature"][system(state)][1]
            tank["sweep_from"] = f"{math.floor((float(stated) - margin) / step) * step!r} {unit}"
            tank["sweep_to"] = f"{math.ceil((top + margin) / step) * step!r} {unit}"
    return doc, problems


def full_document(state, studies=None, limits=None) -> dict:
    """The whole case as one scenario document, for saving.

    Holds the studies on screen (those of the loaded file, and those the user has
    opened), and carries along the items of a loaded file that are not on screen.
    """
    include = dict(state.get("case.studies", {}))
    include.update(studies or {})
    base = state.get("case.base", {}) or {}
    doc = {"scenario": _head(state)}
    if conditions(state):
        doc["conditions"] = conditions(state)
    if alarms(state):
        doc["alarms"] = alarms(state)
    if base.get("shift"):
        doc["shift"] = dict(base["shift"])
    chosen = [s for s in ("tank", "indoor", "outdoor") if include.get(s)]
    liquids, names = _study_liquids(state, chosen)
    substances = [own_substance(state)] if uses_own_substance(state, chosen) else []
    own = {x["name"].lower() for x in substances}
    substances += [dict(x) for x in base.get("substance", []) if x["name"].lower() not in own]
    tanks = [tank_item(state, names["tank"])] if "tank" in names else []
    rooms = [room_item(state)] if "indoor" in names else []
    spills = []
    if "indoor" in names:
        spills.append(spill_item(state, "indoor", names["indoor"]))
    if "outdoor" in names:
        spills.append(spill_item(state, "outdoor", names["outdoor"]))
    # items of the loaded file beyond the first tank, indoor spill and outdoor spill
    base_tanks, extra_spills = _carried_items(base, liquids, rooms)
    tanks += [dict(x) for x in base_tanks]
    spills += [dict(x) for x in extra_spills]
    if substances:
        doc["substance"] = substances
    if liquids:
        doc["liquid"] = liquids
    if tanks:
        doc["tank"] = tanks
    if rooms:
        doc["room"] = rooms
    if spills:
        doc["spill"] = spills
    if "outdoor" in names:
        doc["outdoors"] = outdoors_item(state)
    elif base.get("outdoors") and any(s.get("outdoors") for s in extra_spills):
        doc["outdoors"] = dict(base["outdoors"])
    rows = limit_rows(state) if limits is None else limits
    if rows:
        doc["limit"] = [item for _, item in rows]
    # inputs given as ranges: the pages' own, then those of the items carried along
    uncertain = []
    if "tank" in names:
        uncertain += uncertain_entries(state, "tank", tanks[0]["name"])[0]
    if "indoor" in names:
        uncertain += uncertain_entries(state, "indoor", spills[0]["name"])[0]
    carried = {str(x.get("name", "")).strip().lower() for x in base_tanks + extra_spills}
    uncertain += [dict(u) for u in base.get("uncertain", []) or []
                  if str(u.get("item", "")).strip().lower() in carried]
    if uncertain:
        doc["uncertain"] = uncertain
    if uncertain or base.get("monte_carlo"):
        doc["monte_carlo"] = monte_carlo_table(state)
    return doc


def _study_liquids(state, chosen) -> tuple[list[dict], dict]:
    """The liquids of the studies on screen, one entry for the same liquid, a name of
    its own for different liquids of the same name; and each study's liquid name."""
    liquids, names = [], {}
    for s in chosen:
        item, _ = liquid_item(state, s)
        same = next((x for x in liquids if x == item), None)
        if same is None:
            taken = {x["name"].lower() for x in liquids}
            if item["name"].lower() in taken:
                item = dict(item, name=f"{item['name']} ({s})")
            liquids.append(item)
            same = item
        names[s] = same["name"]
    return liquids, names


def _carried_items(base: dict, liquids: list, rooms: list) -> tuple[list, list]:
    """The tanks and spills of a loaded file that are not on screen; the liquids and
    rooms they need are added to `liquids` and `rooms`."""
    base_tanks = list(base.get("tank", []))[1:]
    base_spills = list(base.get("spill", []))
    first_indoor = next((i for i, s in enumerate(base_spills) if s.get("room")), None)
    first_outdoor = next((i for i, s in enumerate(base_spills) if not s.get("room")), None)
    extra_spills = [s for i, s in enumerate(base_spills) if i not in (first_indoor, first_outdoor)]
    needed = {str(x.get("liquid", "")).lower() for x in base_tanks + extra_spills}
    needed_rooms = {str(s.get("room", "")).lower() for s in extra_spills if s.get("room")}
    used_names = {x["name"].lower() for x in liquids}
    for item in base.get("liquid", []):
        if item["name"].lower() in needed and item["name"].lower() not in used_names:
            liquids.append(dict(item))
    room_names = {r["name"].lower() for r in rooms}
    for item in base.get("room", []):
        if item["name"].lower() in needed_rooms and item["name"].lower() not in room_names:
            rooms.append(dict(item))
    return base_tanks, extra_spills
