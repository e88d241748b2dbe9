"""Scenario files: what a hazard review asks, written down so it can be rerun and shared.

A scenario is a TOML file. Quantities are text with units ("38 degC", "500 gal",
"4 1/h", "12 ft"), so a file can be written in SI or US customary units. Loading
checks every key and value and says where a mistake is; saving writes the same
document back (load, save, load gives the same scenario) with the ullage version
that wrote it.

Sections (every key is listed in `SCHEMA`):

- ``[scenario]`` title, site, description.
- ``[conditions]`` barometric pressure or site elevation, air temperature.
- ``[alarms]`` % of LFL and oxygen bounds (defaults: US OSHA 29 CFR 1910.146).
- ``[shift]`` work shift start and duration for time-weighted averages.
- ``[[substance]]`` a liquid not in the table, from its safety data sheet.
- ``[[liquid]]`` a named liquid: one substance, a mixture, or dilute solutes in water.
- ``[[tank]]`` a vapour space over a liquid.
- ``[[room]]`` an indoor space a spill can happen in.
- ``[[spill]]`` a pool indoors (in a room) or outdoors.
- ``[outdoors]`` weather and receptors for outdoor spills.
- ``[[limit]]`` exposure limits for one substance, with their source.
- ``[[uncertain]]`` an input of a tank or spill given as a distribution instead of
  a value (see `estimator.uncertainty.distribution_from_spec`), for example
  ``item = "T-3"``, ``input = "temperature"``,
  ``distribution = { triangular = ["30 degC", "34 degC", "42 degC"] }``.
- ``[monte_carlo]`` samples (default 10000), seed, method_uncertainty (default true).
"""

from __future__ import annotations

import difflib
import math
import re
import tomllib
from dataclasses import dataclass, field
from pathlib import Path
from types import MappingProxyType

from ._meta import __version__
from .checks import check_barometric_pressure
from .constants import STANDARD_ATMOSPHERE
from .errors import InputError, UnknownSubstanceError
from .substances import Substance
from .toml_text import toml_key, toml_value
from .units import parse_quantity, parse_temperature

__all__ = [
    "SCHEMA",
    "Scenario",
    "ScenarioError",
    "load_scenario",
    "loads_scenario",
    "dumps_scenario",
    "save_scenario",
    "build_liquid",
    "MAX_SCENARIO_BYTES",
]

#: Largest scenario file read. [bytes]
MAX_SCENARIO_BYTES = 1_000_000

# key -> (kind, required). Kinds: a unit kind of estimator.units, "text", "bool",
# "number", "composition" (table of substance -> fraction), "points" (list of
# [temperature, pressure] pairs), "lengths" (list of lengths), "concentrations"
# (table of substance -> mass concentration).
_TABLES = {
    "scenario": {"title": ("text", True), "site": ("text", False),
                 "description": ("text", False), "ullage_version": ("text", False)},
    "conditions": {"barometric_pressure": ("pressure", False),
                   "elevation": ("length", False), "air_temperature": ("temperature", False)},
    "alarms": {"percent_lfl": ("number", False), "oxygen_low": ("fraction", False),
               "oxygen_high": ("fraction", False), "source": ("text", False)},
    "shift": {"start": ("time", False), "duration": ("time", False)},
    "monte_carlo": {"samples": ("number", False), "seed": ("number", False),
                    "method_uncertainty": ("bool", False)},
    "outdoors": {"wind_speed": ("speed", True), "wind_height": ("length", False),
                 "daytime": ("bool", False), "insolation": ("text", False),
                 "cloud_cover": ("number", False), "stability": ("text", False),
                 "terrain": ("text", False), "receptors": ("lengths", False)},
}
_ARRAYS = {
    "substance": {"name": ("text", True), "cas": ("text", False),
                  "molar_mass": ("molar_mass", True), "boiling_point": ("temperature", True),
                  "vapor_pressure": ("points", False),
                  "lower_flammability_limit": ("fraction", False),
                  "upper_flammability_limit": ("fraction", False),
                  "flash_point": ("temperature", False), "liquid_density": ("density", False),
                  "critical_temperature": ("temperature", False),
                  "melting_point": ("temperature", False), "source": ("text", False)},
    "liquid": {"name": ("text", True), "substance": ("text", False),
               "components": ("composition", False), "basis": ("text", False),
               "activity_coefficients": ("composition", False),
               "activity_source": ("text", False), "activity_estimate": ("text", False),
               "dissolved_in_water": ("concentrations", False),
               # a liquid from a safety data sheet (estimator.sds.scenario_liquid)
               "sds": ("sds_path", False), "sds_text": ("text", False),
               "ranges": ("ranges", False), "unlisted": ("ranges", False),
               "point": ("text", False), "unidentified_as": ("text", False)},
    "tank": {"name": ("text", True), "liquid": ("text", True), "volume": ("volume", False),
             "fill": ("fraction", False), "temperature": ("temperature", True),
             "worst_temperature": ("temperature", False),
             "gauge_pressure": ("pressure", False),
             "daily_low": ("temperature", False), "daily_high": ("temperature", False),
             "pumped_volume": ("volume", False), "purge_rate": ("flow", False),
             "purge_mixing_factor": ("number", False), "purge_target": ("fraction", False),
             "residual_area": ("area", False), "sweep_from": ("temperature", False),
             "sweep_to": ("temperature", False)},
    "room": {"name": ("text", True), "volume": ("volume", True),
             "air_changes": ("rate", False), "ventilation_rate": ("flow", False),
             "mixing_factor": ("number", False), "air_speed": ("speed", False),
             "near_field_radius": ("length", False), "random_air_speed": ("speed", False)},
    "spill": {"name": ("text", True), "liquid": ("text", True), "volume": ("volume", False),
              "mass": ("mass", False), "area": ("area", False), "dike_area": ("area", False),
              "depth": ("length", False), "temperature": ("temperature", True),
              "room": ("text", False), "outdoors": ("bool", False),
              "duration": ("time", False), "cleanup_after": ("time", False),
              "model": ("text", False)},
    "uncertain": {"item": ("text", True), "input": ("text", True),
                  "distribution": ("distribution", True)},
    "limit": {"substance": ("text", True), "TWA": ("limit", False), "STEL": ("limit", False),
              "ceiling": ("limit", False), "emergency": ("limit", False),
              "source": ("text", True)},
}
#: Every section and key a scenario may hold, with its kind and whether required.
SCHEMA = MappingProxyType({**_TABLES, **_ARRAYS})

_ORDER = ["scenario", "conditions", "alarms", "shift", "substance", "liquid", "tank", "room",
          "spill", "outdoors", "limit", "uncertain", "monte_carlo"]

#: Inputs that may be uncertain, per kind of item, with their unit kind.
UNCERTAIN_INPUTS = {
    "tank": {"temperature": "temperature"},
    "spill": {"temperature": "temperature", "area": "area", "air_speed": "speed",
              "ventilation_rate": "flow", "mixing_factor": "fraction", "mass": "mass"},
}


class ScenarioError(InputError):
    """A scenario file that cannot be used; the field names the key and the line."""


@dataclass(frozen=True)
class Scenario:
    """A loaded, checked scenario.

    Attributes
    ----------
    document : mapping
        The scenario as written (text values kept as entered), for saving.
    title : str
    pressure : float
        Barometric pressure at the site. [Pa]
    air_temperature : float or None
        [K]
    substances : tuple of Substance
        User-defined substances.
    liquids : mapping
        Liquid name -> dict(kind="liquid"|"water", spec=..., basis=..., ...).
    tanks, rooms, spills : tuple of dict
        Each item with SI values.
    outdoors : dict or None
    limits : tuple of ExposureLimit
    alarms : FlammabilityAlarms
    shift : WorkShift
    assumptions : tuple of str
        Every default the run applies, said plainly.
    source_path : str
    uncertain : tuple of dict
        Inputs given as distributions: item, kind, input, distribution.
    monte_carlo : dict
        samples, seed (None: drawn and recorded), method_uncertainty.
    """

    document: MappingProxyType
    title: str
    pressure: float
    air_temperature: float | None
    substances: tuple
    liquids: MappingProxyType
    tanks: tuple
    rooms: tuple
    spills: tuple
    outdoors: dict | None
    limits: tuple
    alarms: object
    shift: object
    assumptions: tuple[str, ...]
    source_path: str = ""
    uncertain: tuple = ()
    monte_carlo: dict = field(default_factory=lambda: {"samples": 10_000, "seed": None,
                                                       "method_uncertainty": True})

    def resolve(self, name: str, field: str):
        """A substance by name: the scenario's own first, then the curated table, then
        the property library (by name, synonym or CAS number)."""
        from .substances import substance

        for sub in self.substances:
            if sub.name.lower() == str(name).strip().lower():
                return sub
        return substance(name, field)

    def liquid(self, name: str):
        """The model-ready `Liquid` of the scenario's liquid called ``name`` (None
        for water with dissolved substances)."""
        return build_liquid(self.liquids[name])


def _line_of(text: str, section: str, index: int | None, key: str | None) -> int | None:
    """Best-effort line number of a key in a section (tomllib keeps no positions)."""
    lines = text.splitlines()
    header = re.compile(r"^\s*\[\[?\s*" + re.escape(section) + r"\s*\]\]?\s*(#.*)?$")
    starts = [i for i, line in enumerate(lines) if header.match(line)]
    if not starts:
        return None
    start = starts[min(index or 0, len(starts) - 1)]
    if key is None:
        return start + 1
    pattern = re.compile(r'^\s*"?' + re.escape(key) + r'"?\s*=')
    for i in range(start + 1, len(lines)):
        if re.match(r"^\s*\[", lines[i]):
            break
        if pattern.match(lines[i]):
            return i + 1
    return start + 1


class _Reader:
    """Walks the parsed document, checking keys and converting values."""

    def __init__(self, text: str):
        self.text = text
        self.assumptions: list[str] = []

    def where(self, section, index, key=None) -> str:
        label = f"[{section}]" if index is None else f"[[{section}]] #{index + 1}"
        if key is not None:
            label += f" {key}"
        line = _line_of(self.text, section, index, key)
        return f"{label} (line {line})" if line else label

    def fail(self, section, index, key, message):
        raise ScenarioError(self.where(section, index, key), message)

    def check_keys(self, section, index, table):
        allowed = SCHEMA[section]
        if not isinstance(table, dict):
            self.fail(section, index, None, "expected a table of keys and values")
        for key in table:
            if key not in allowed:
                close = difflib.get_close_matches(key, list(allowed), n=1, cutoff=0.6)
                hint = (f"did you mean {close[0]!r}?" if close
                        else f"allowed keys: {', '.join(allowed)}")
                self.fail(section, index, key, f"unknown key {key!r}; {hint}")
        for key, (_, required) in allowed.items():
            if required and key not in table:
                self.fail(section, index, key, f"missing required key {key!r}")

    def value(self, section, index, table, key, default=None):
        if key not in table:
            return default
        kind = SCHEMA[section][key][0]
        raw = table[key]
        where = self.where(section, index, key)
        try:
            return _convert(raw, kind, where)
        except ScenarioError:
            raise
        except InputError as exc:
            raise ScenarioError(where, exc.reason) from None


def _convert(raw, kind, where):
    if kind == "text":
        if not isinstance(raw, str):
            raise ScenarioError(where, f"expected text in quotes, got {raw!r}")
        return raw.strip()
    if kind == "bool":
        if not isinstance(raw, bool):
            raise ScenarioError(where, f"expected true or false, got {raw!r}")
        return raw
    if kind == "number":
        if isinstance(raw, bool) or not isinstance(raw, (int, float)) or not math.isfinite(raw):
            raise ScenarioError(where, f"expected a plain number, got {raw!r}")
        return float(raw)
    if kind == "temperature":
        if isinstance(raw, (int, float)) and not isinstance(raw, bool):
            raise ScenarioError(where, f"{raw!r} has no unit; write it as text such as "
                                f"'{raw} degC'")
        return parse_temperature(raw, where)
    if kind in ("limit", "distribution"):
        return raw
    if kind == "sds_path":
        return _convert(raw, "text", where)
    if kind == "ranges":
        if not isinstance(raw, dict) or not raw:
            raise ScenarioError(where, "expected a table such as { toluene = [\"40 %\", "
                                "\"60 %\"] }")
        out = {}
        for k, v in raw.items():
            pair = v if isinstance(v, list) else [v, v]
            if len(pair) != 2:
                raise ScenarioError(f"{where} {k}", "give [low, high], such as [\"40 %\", "
                                    "\"60 %\"], or one value")
            out[str(k)] = tuple(parse_quantity(x, "fraction", f"{where} {k}") for x in pair)
        return out
    if kind in ("composition", "concentrations"):
        if not isinstance(raw, dict) or not raw:
            raise ScenarioError(where, "expected a table such as { toluene = \"60 %\" }")
        unit_kind = "fraction" if kind == "composition" else "mass_concentration"
        return {str(k): parse_quantity(v, unit_kind, f"{where} {k}") for k, v in raw.items()}
    if kind == "points":
        if not isinstance(raw, list) or not all(isinstance(p, list) and len(p) == 2 for p in raw):
            raise ScenarioError(where, "expected a list of [temperature, pressure] pairs, "
                                "such as [[\"20 degC\", \"2.9 kPa\"]]")
        return [(parse_temperature(t, where), parse_quantity(p, "pressure", where))
                for t, p in raw]
    if kind == "lengths":
        if not isinstance(raw, list) or not raw:
            raise ScenarioError(where, "expected a list of distances such as [\"100 m\", \"1 km\"]")
        return [parse_quantity(x, "length", where) for x in raw]
    if isinstance(raw, bool) or not isinstance(raw, (str, int, float)):
        raise ScenarioError(where, f"expected a quantity such as '3 m', got {raw!r}")
    if isinstance(raw, (int, float)) and kind != "fraction":
        raise ScenarioError(where, f"{raw!r} has no unit; write it as text with a unit")
    return parse_quantity(raw, kind, where)


def _positive(reader, section, index, key, value, allow_zero=False):
    if value is None:
        return None
    if value < 0 or (value == 0 and not allow_zero) or not math.isfinite(value):
        reader.fail(section, index, key, f"must be {'0 or more' if allow_zero else 'above 0'}")
    return value


def _check_sections(doc):
    """Refuse unknown sections and sections of the wrong shape."""
    for key in doc:
        if key not in SCHEMA:
            close = difflib.get_close_matches(key, list(SCHEMA), n=1, cutoff=0.6)
            hint = f"did you mean {close[0]!r}?" if close else f"sections: {', '.join(_ORDER)}"
            raise ScenarioError(f"[{key}]", f"unknown section; {hint}")
    for key in _ARRAYS:
        if key in doc and not isinstance(doc[key], list):
            raise ScenarioError(f"[{key}]", f"write it as [[{key}]] (one table per item)")
    for key in _TABLES:
        if key in doc and not isinstance(doc[key], dict):
            raise ScenarioError(f"[{key}]", f"write it as a single [{key}] table")
    if "scenario" not in doc:
        raise ScenarioError("[scenario]", "missing; start the file with [scenario] and a title")


def _read_conditions(r, doc):
    """Site pressure [Pa] and air temperature [K] of [conditions]."""
    from .headspace import barometric_pressure

    cond = doc.get("conditions", {})
    r.check_keys("conditions", None, cond)
    baro = r.value("conditions", None, cond, "barometric_pressure")
    elev = r.value("conditions", None, cond, "elevation")
    if baro is not None and elev is not None:
        r.fail("conditions", None, "elevation", "give the barometric pressure or the "
               "elevation, not both")
    if baro is not None:
        try:
            pressure = check_barometric_pressure(baro)
        except InputError as exc:
            r.fail("conditions", None, "barometric_pressure", exc.reason)
    elif elev is not None:
        try:
            pressure = barometric_pressure(elev)
        except InputError as exc:
            r.fail("conditions", None, "elevation", exc.reason)
        r.assumptions.append(f"barometric pressure {pressure / 1000:.2f} kPa from the site "
                             f"elevation by the standard atmosphere (ISO 2533)")
    else:
        pressure = STANDARD_ATMOSPHERE
        r.assumptions.append("no barometric pressure or elevation given: 101.325 kPa "
                             "(sea level) assumed")
    air_t = r.value("conditions", None, cond, "air_temperature")
    return pressure, air_t


def _read_alarms(r, doc):
    """The [alarms] table as `FlammabilityAlarms`."""
    from .limits import FlammabilityAlarms

    al = doc.get("alarms", {})
    r.check_keys("alarms", None, al)
    alarm_args = {}
    if "percent_lfl" in al:
        alarm_args["percent_lfl"] = r.value("alarms", None, al, "percent_lfl")
    for key in ("oxygen_low", "oxygen_high"):
        if key in al:
            alarm_args[key] = 100.0 * r.value("alarms", None, al, key)
    if "source" in al:
        alarm_args["source"] = r.value("alarms", None, al, "source")
    elif alarm_args:
        alarm_args["source"] = "scenario file"
    try:
        alarms = FlammabilityAlarms(**alarm_args)
    except InputError as exc:
        raise ScenarioError(r.where("alarms", None), exc.reason) from None
    if not al:
        r.assumptions.append(f"alarm levels: {alarms.percent_lfl:g} % LFL, oxygen "
                             f"{alarms.oxygen_low:g}-{alarms.oxygen_high:g} % ({alarms.source})")
    return alarms


def _read_shift(r, doc):
    """The [shift] table as a `WorkShift`."""
    from .exposure import WorkShift

    sh = doc.get("shift", {})
    r.check_keys("shift", None, sh)
    try:
        shift = WorkShift(start=r.value("shift", None, sh, "start", 0.0),
                          duration=r.value("shift", None, sh, "duration", 8 * 3600.0))
    except InputError as exc:
        raise ScenarioError(r.where("shift", None, exc.field), exc.reason) from None
    if not sh:
        r.assumptions.append("work shift: 8 h from the start of each spill")
    return shift


def _read_substances(r, doc):
    """User-defined [[substance]] tables."""
    from .substances import user_substance

    subs = []
    for i, item in enumerate(doc.get("substance", [])):
        r.check_keys("substance", i, item)
        v = {k: r.value("substance", i, item, k) for k in item}
        try:
            subs.append(user_substance(
                v["name"], v["molar_mass"], v["boiling_point"], v.get("vapor_pressure", ()),
                lower_flammability_limit=v.get("lower_flammability_limit"),
                upper_flammability_limit=v.get("upper_flammability_limit"),
                flash_point=v.get("flash_point"), liquid_density=v.get("liquid_density"),
                critical_temperature=v.get("critical_temperature"),
                melting_point=v.get("melting_point"), cas=v.get("cas", ""),
                source=v.get("source", "user-entered (safety data sheet)")))
        except InputError as exc:
            raise ScenarioError(r.where("substance", i, exc.field.split()[0]), exc.reason) from None
        r.assumptions.extend(subs[-1].notes)
    return subs


def _read_liquid(r, doc, i, item, liquids, resolve, partial, base_dir):
    """One [[liquid]] table as a liquid entry (checked by building it once)."""
    r.check_keys("liquid", i, item)
    v = {k: r.value("liquid", i, item, k) for k in item}
    given = [k for k in ("substance", "components", "dissolved_in_water") if k in v]
    from_sheet = [k for k in ("ranges", "sds", "sds_text") if k in v]
    if len(given) + bool(from_sheet) != 1 or {"sds", "sds_text"} <= set(v):
        r.fail("liquid", i, None, "give exactly one of 'substance', 'components', "
               "'dissolved_in_water', or a safety data sheet ('sds' file or 'sds_text', "
               "and/or its 'ranges')")
    name = v["name"]
    if name.lower() in {n.lower() for n in liquids}:
        r.fail("liquid", i, "name", f"the name {name!r} is used twice")
    basis = v.get("basis", "mass")
    if "basis" not in v and "components" in v:
        r.assumptions.append(f"liquid {name!r}: composition taken as mass fractions "
                             "(no basis given; safety data sheets give mass %)")
    if basis not in ("mole", "mass", "volume"):
        r.fail("liquid", i, "basis", f"{basis!r} is not a basis; use mole, mass or volume")
    entry = {"name": name, "basis": basis}
    if from_sheet:
        from .sds import scenario_liquid

        try:
            sheet_entry, notes = scenario_liquid(
                v, doc, base_dir, lambda k: partial.resolve(k, "ranges"),
                f"[[liquid]] #{i + 1}")
        except InputError as exc:
            key = next((k for k in ("ranges", "unlisted", "sds_text", "sds", "point",
                                    "unidentified_as") if k in exc.field), from_sheet[0])
            raise ScenarioError(r.where("liquid", i, key), exc.reason) from None
        r.assumptions.extend(notes)
        entry.update(kind="liquid", **sheet_entry)
    elif "substance" in v:
        entry.update(kind="liquid", spec=resolve("liquid", i, "substance", v["substance"]))
    elif "components" in v:
        spec = {resolve("liquid", i, "components", k): x for k, x in v["components"].items()}
        entry.update(kind="liquid", spec=spec)
    else:
        spec = {resolve("liquid", i, "dissolved_in_water", k): c
                for k, c in v["dissolved_in_water"].items()}
        from .henry import check_dissolved_concentration

        for sub, c in spec.items():
            try:
                check_dissolved_concentration(sub.key, c, sub.name)
            except InputError as exc:
                r.fail("liquid", i, "dissolved_in_water", f"{exc.field}: {exc.reason}")
        entry.update(kind="water", spec=spec)
    gammas = v.get("activity_coefficients")
    if v.get("activity_estimate"):
        if gammas:
            r.fail("liquid", i, "activity_estimate", "give activity_coefficients or "
                   "activity_estimate, not both")
        if v["activity_estimate"].lower() != "unifac":
            r.fail("liquid", i, "activity_estimate", f"{v['activity_estimate']!r} is not "
                   "an estimation method; use \"unifac\"")
        entry["activity_coefficients"] = "unifac"
    if gammas:
        entry["activity_coefficients"] = {
            resolve("liquid", i, "activity_coefficients", k): g for k, g in gammas.items()}
        entry["activity_source"] = v.get("activity_source", "user-entered")
    try:
        build_liquid(entry)
    except InputError as exc:
        raise ScenarioError(r.where("liquid", i, "components"), exc.reason) from None
    return entry


def _read_liquids(r, doc, resolve, partial, base_dir):
    """Every [[liquid]] table by name."""
    liquids = {}
    for i, item in enumerate(doc.get("liquid", [])):
        entry = _read_liquid(r, doc, i, item, liquids, resolve, partial, base_dir)
        liquids[entry["name"]] = entry
    return liquids


def _liquid_name(r, liquids, section, i, item):
    """The [[liquid]] name an item refers to (matched without regard to case)."""
    name = item.get("liquid")
    match = {n.lower(): n for n in liquids}.get(str(name).strip().lower())
    if match is None:
        close = difflib.get_close_matches(str(name), list(liquids), n=1)
        hint = f"did you mean {close[0]!r}?" if close else (
            "define it in a [[liquid]] table" if not liquids
            else f"liquids defined: {', '.join(liquids)}")
        r.fail(section, i, "liquid", f"no [[liquid]] is named {name!r}; {hint}")
    return match


def _read_tanks(r, doc, liquids):
    """Every [[tank]] table, with its defaults."""
    tanks = []
    for i, item in enumerate(doc.get("tank", [])):
        r.check_keys("tank", i, item)
        v = {k: r.value("tank", i, item, k) for k in item}
        v["liquid"] = _liquid_name(r, liquids, "tank", i, item)
        for key in ("volume", "pumped_volume", "purge_rate", "residual_area"):
            _positive(r, "tank", i, key, v.get(key))
        if "fill" in v and not 0 <= v["fill"] < 1:
            r.fail("tank", i, "fill", "must be from 0 % to below 100 %")
        if v.get("purge_rate") is not None and v.get("volume") is None:
            r.fail("tank", i, "volume", "a purge needs the tank volume")
        if ("daily_low" in v) != ("daily_high" in v):
            r.fail("tank", i, "daily_high", "give both daily_low and daily_high, or neither")
        if "daily_low" in v and v["daily_high"] <= v["daily_low"]:
            r.fail("tank", i, "daily_high", "must be above daily_low")
        if "purge_mixing_factor" in v and v["purge_mixing_factor"] < 1:
            r.fail("tank", i, "purge_mixing_factor", "must be 1 or more (it divides the "
                   "purge rate)")
        if "worst_temperature" not in v:
            r.assumptions.append(f"tank {v['name']!r}: no worst_temperature given; only the "
                                 "stated temperature is screened")
        if "gauge_pressure" not in v:
            v["gauge_pressure"] = 0.0
        tanks.append(v)
    return tanks


def _read_rooms(r, doc):
    """Every [[room]] table, with its defaults."""
    rooms = []
    for i, item in enumerate(doc.get("room", [])):
        r.check_keys("room", i, item)
        v = {k: r.value("room", i, item, k) for k in item}
        _positive(r, "room", i, "volume", v["volume"])
        if ("air_changes" in v) == ("ventilation_rate" in v):
            r.fail("room", i, "air_changes", "give either air_changes or ventilation_rate")
        if "air_changes" in v:
            _positive(r, "room", i, "air_changes", v["air_changes"], allow_zero=True)
            v["ventilation_rate"] = v["air_changes"] * v["volume"]
        _positive(r, "room", i, "ventilation_rate", v["ventilation_rate"], allow_zero=True)
        if "mixing_factor" not in v:
            v["mixing_factor"] = 1.0
            r.assumptions.append(f"room {v['name']!r}: mixing factor 1 (perfect mixing) "
                                 "assumed; real rooms are often 3-10")
        elif v["mixing_factor"] < 1:
            r.fail("room", i, "mixing_factor", "must be 1 or more: it divides the "
                   "ventilation rate (effective ventilation Q/K)")
        if "air_speed" not in v:
            v["air_speed"] = 0.1
            r.assumptions.append(f"room {v['name']!r}: air speed over a pool 0.1 m/s "
                                 "assumed (indoors typically 0.05-0.5 m/s)")
        if ("near_field_radius" in v) != ("random_air_speed" in v):
            r.fail("room", i, "near_field_radius", "the two-zone model needs both "
                   "near_field_radius and random_air_speed")
        rooms.append(v)
    return rooms


def _read_spills(r, doc, liquids, rooms, shift):
    """Every [[spill]] table, with its defaults."""
    room_names = {room["name"].lower(): room["name"] for room in rooms}
    spills = []
    for i, item in enumerate(doc.get("spill", [])):
        r.check_keys("spill", i, item)
        v = {k: r.value("spill", i, item, k) for k in item}
        v["liquid"] = _liquid_name(r, liquids, "spill", i, item)
        if liquids[v["liquid"]]["kind"] == "water":
            r.fail("spill", i, "liquid", "spills of water with dissolved volatiles are not "
                   "modelled; use a tank for its headspace")
        if ("volume" in v) == ("mass" in v):
            r.fail("spill", i, "volume", "give either the spilled volume or the mass")
        for key in ("volume", "mass", "area", "dike_area", "depth", "duration"):
            _positive(r, "spill", i, key, v.get(key))
        outdoors = v.get("outdoors", False)
        if outdoors == ("room" in v):
            r.fail("spill", i, "room", "name the room it happens in, or set outdoors = true")
        if "room" in v:
            match = room_names.get(v["room"].lower())
            if match is None:
                r.fail("spill", i, "room", f"no [[room]] is named {v['room']!r}")
            v["room"] = match
        if outdoors and "outdoors" not in doc:
            r.fail("spill", i, "outdoors", "an outdoor spill needs an [outdoors] table with "
                   "the wind speed")
        model = v.get("model", "mackay-matsugu")
        if model not in ("mackay-matsugu", "epa-rmp"):
            r.fail("spill", i, "model", f"{model!r} is not a model; use 'mackay-matsugu' or "
                   "'epa-rmp'")
        v["model"] = model
        if "area" not in v and "dike_area" not in v:
            r.assumptions.append(f"spill {v['name']!r}: no area or dike given, the liquid "
                                 "spreads to 1 cm depth (US EPA RMP guidance)")
        v.setdefault("duration", shift.duration)
        spills.append(v)
    return spills


def _read_outdoors(r, doc):
    """The [outdoors] table (None when absent), with its defaults."""
    outdoors = None
    if "outdoors" in doc:
        od = doc["outdoors"]
        r.check_keys("outdoors", None, od)
        outdoors = {k: r.value("outdoors", None, od, k) for k in od}
        _positive(r, "outdoors", None, "wind_speed", outdoors["wind_speed"])
        if "stability" not in outdoors and "daytime" not in outdoors:
            r.fail("outdoors", None, "daytime", "give the stability class, or daytime = true/false "
                   "with the insolation (day) or cloud_cover in oktas (night)")
        if "stability" in outdoors:
            from .outdoor import pasquill_classes

            try:
                pasquill_classes(outdoors["stability"])
            except InputError as exc:
                r.fail("outdoors", None, "stability", exc.reason)
        else:
            from .outdoor import stability_class

            try:
                stability_class(outdoors["wind_speed"], outdoors.get("daytime", True),
                                outdoors.get("insolation"), outdoors.get("cloud_cover"))
            except InputError as exc:
                key = exc.field if exc.field in SCHEMA["outdoors"] else "daytime"
                r.fail("outdoors", None, key, exc.reason)
        outdoors.setdefault("terrain", "open")
        outdoors.setdefault("wind_height", 10.0)
        outdoors.setdefault("receptors", [100.0, 300.0, 1000.0, 3000.0])
    return outdoors


def _read_limits(r, doc, resolve):
    """Every [[limit]] table as `ExposureLimit` objects."""
    from .limits import exposure_limit

    limits = []
    for i, item in enumerate(doc.get("limit", [])):
        r.check_keys("limit", i, item)
        sub = resolve("limit", i, "substance", item["substance"])
        source = r.value("limit", i, item, "source")
        kinds = [k for k in ("TWA", "STEL", "ceiling", "emergency") if k in item]
        if not kinds:
            r.fail("limit", i, None, "give at least one of TWA, STEL, ceiling or emergency")
        for kind in kinds:
            raw = item[kind]
            where = r.where("limit", i, kind)
            number, unit = _split_limit(raw, where)
            try:
                limits.append(exposure_limit(sub, kind, number, unit, source))
            except InputError as exc:
                raise ScenarioError(where, exc.reason) from None
    if not limits:
        r.assumptions.append("no exposure limits entered: only flammability and oxygen are "
                             "compared")
    elif any(lim.unit == "mg/m3" for lim in limits):
        from .limits import LIMIT_CONVENTION

        r.assumptions.append(LIMIT_CONVENTION[:1].upper() + LIMIT_CONVENTION[1:])
    return limits


def _read_uncertain(r, doc, tanks, spills, liquids):
    """Every [[uncertain]] table: item, kind, input and distribution."""
    uncertain = []
    items = {t["name"].lower(): ("tank", t) for t in tanks}
    items.update({sp["name"].lower(): ("spill", sp) for sp in spills})
    for i, item in enumerate(doc.get("uncertain", [])):
        r.check_keys("uncertain", i, item)
        name = r.value("uncertain", i, item, "item")
        found = items.get(name.lower())
        if found is None:
            r.fail("uncertain", i, "item", f"no tank or spill is named {name!r}")
        what, target = found
        key = r.value("uncertain", i, item, "input")
        allowed = UNCERTAIN_INPUTS[what]
        if key not in allowed:
            r.fail("uncertain", i, "input", f"{key!r} cannot be uncertain for a {what}; "
                   f"use one of {', '.join(allowed)}")
        if what == "spill":
            if target.get("outdoors"):
                r.fail("uncertain", i, "item", "probabilistic screening covers tanks and "
                       "indoor spills")
            entry = liquids[target["liquid"]]
            if not isinstance(entry["spec"], Substance):
                r.fail("uncertain", i, "item", "probabilistic spills cover pure liquids only")
        from .uncertainty import distribution_from_spec

        where = r.where("uncertain", i, "distribution")
        try:
            dist = distribution_from_spec(item["distribution"], allowed[key], where)
        except InputError as exc:
            part = exc.field[len(where):].strip() if exc.field.startswith(where) else ""
            raise ScenarioError(where, f"{part}: {exc.reason}" if part else exc.reason) from None
        uncertain.append({"item": target["name"], "kind": what, "input": key,
                          "distribution": dist})
    return uncertain


def _read_monte_carlo(r, doc, uncertain):
    """The [monte_carlo] settings: samples, seed, method uncertainty."""
    mc = doc.get("monte_carlo", {})
    r.check_keys("monte_carlo", None, mc)
    samples = r.value("monte_carlo", None, mc, "samples", 10_000.0)
    if not (samples == int(samples) and 100 <= samples <= 1_000_000):
        r.fail("monte_carlo", None, "samples", "must be a whole number from 100 to 1000000")
    seed = r.value("monte_carlo", None, mc, "seed")
    if seed is not None and (seed != int(seed) or seed < 0):
        r.fail("monte_carlo", None, "seed", "must be a whole number, 0 or more")
    monte_carlo = {"samples": int(samples), "seed": None if seed is None else int(seed),
                   "method_uncertainty": mc.get("method_uncertainty", True)}
    if uncertain and seed is None:
        r.assumptions.append("Monte Carlo seed not given: a new one is drawn and recorded in "
                             "the results")
    return monte_carlo


def loads_scenario(text: str, source_path: str = "", *, base_dir=None) -> Scenario:
    """Load and check a scenario from TOML text.

    `base_dir` is the folder of the scenario file, where a [[liquid]] ``sds`` file
    is looked for (confined to it); text not read from a file has none.

    Raises
    ------
    ScenarioError
        With the section, key and line of the first problem, and what to do.
    """
    if len(text.encode("utf-8", "replace")) > MAX_SCENARIO_BYTES:
        raise ScenarioError("scenario file", f"is larger than {MAX_SCENARIO_BYTES} bytes; "
                            "a scenario is a short text file")
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise ScenarioError("scenario file", f"is not valid TOML: {exc}") from None
    _check_sections(doc)
    r = _Reader(text)
    head = doc["scenario"]
    r.check_keys("scenario", None, head)
    title = r.value("scenario", None, head, "title")

    pressure, air_t = _read_conditions(r, doc)
    alarms = _read_alarms(r, doc)
    shift = _read_shift(r, doc)
    subs = _read_substances(r, doc)
    partial = Scenario(MappingProxyType({}), title, pressure, air_t, tuple(subs),
                       MappingProxyType({}), (), (), (), None, (), alarms, shift, ())

    def resolve(section, i, key, name):
        try:
            return partial.resolve(name, key)
        except UnknownSubstanceError as exc:
            raise ScenarioError(r.where(section, i, key), exc.reason) from None

    liquids = _read_liquids(r, doc, resolve, partial, base_dir)
    tanks = _read_tanks(r, doc, liquids)
    rooms = _read_rooms(r, doc)
    spills = _read_spills(r, doc, liquids, rooms, shift)
    outdoors = _read_outdoors(r, doc)
    limits = _read_limits(r, doc, resolve)
    uncertain = _read_uncertain(r, doc, tanks, spills, liquids)
    monte_carlo = _read_monte_carlo(r, doc, uncertain)

    return Scenario(
        document=MappingProxyType(doc), title=title, pressure=float(pressure),
        air_temperature=air_t, substances=tuple(subs), liquids=MappingProxyType(liquids),
        tanks=tuple(tanks), rooms=tuple(rooms), spills=tuple(spills), outdoors=outdoors,
        limits=tuple(limits), alarms=alarms, shift=shift,
        assumptions=tuple(dict.fromkeys(r.assumptions)), source_path=source_path,
        uncertain=tuple(uncertain), monte_carlo=monte_carlo)


def _split_limit(raw, where):
    if not isinstance(raw, str):
        raise ScenarioError(where, f"{raw!r} has no unit; write for example \"20 ppm\" or "
                            "\"75 mg/m3\"")
    match = re.match(r"^\s*([-+]?\d+(?:\.\d*)?(?:[eE][-+]?\d+)?)\s*(.*?)\s*$", raw)
    if not match:
        raise ScenarioError(where, f"{raw!r} is not a number with a unit such as \"20 ppm\"")
    return float(match.group(1)), match.group(2)


def build_liquid(entry):
    """The model-ready liquid of a scenario liquid entry (None for water with
    dissolved substances, which `estimator.headspace.water_headspace` takes)."""
    from .mixtures import liquid

    if entry["kind"] == "water":
        return None
    return liquid(entry["spec"], entry["basis"], entry.get("activity_coefficients"),
                  entry.get("activity_source"))


def load_scenario(path) -> Scenario:
    """Load and check a scenario file (UTF-8 TOML, at most `MAX_SCENARIO_BYTES`)."""
    p = Path(path)
    try:
        size = p.stat().st_size
    except OSError as exc:
        raise ScenarioError("scenario file", f"cannot read {p.name}: {exc.strerror}") from None
    if size > MAX_SCENARIO_BYTES:
        raise ScenarioError("scenario file", f"{p.name} is {size} bytes; a scenario is a "
                            f"short text file (at most {MAX_SCENARIO_BYTES} bytes)")
    try:
        text = p.read_text(encoding="utf-8")
    except UnicodeDecodeError:
        raise ScenarioError("scenario file", f"{p.name} is not UTF-8 text; save it as UTF-8") from None
    except OSError as exc:
        raise ScenarioError("scenario file", f"cannot read {p.name}: {exc.strerror}") from None
    return loads_scenario(text, str(p), base_dir=p.resolve().parent)


def dumps_scenario(document) -> str:
    """Write a scenario document as TOML, recording the ullage version.

    Parameters
    ----------
    document : mapping or Scenario
        The document (as `Scenario.document`).
    """
    doc = document.document if isinstance(document, Scenario) else document
    out = []
    for section in _ORDER:
        if section not in doc:
            continue
        if section in _TABLES:
            items = [dict(doc[section])]
            if section == "scenario":
                items[0]["ullage_version"] = __version__
        else:
            items = [dict(item) for item in doc[section]]
        for item in items:
            out.append(f"[{section}]" if section in _TABLES else f"[[{section}]]")
            for key, v in item.items():
                out.append(f"{toml_key(key)} = {toml_value(v)}")
            out.append("")
    return "\n".join(out)


def save_scenario(document, path) -> None:
    """Write a scenario file atomically (temporary file, then rename)."""
    from .files import write_text_atomic

    write_text_atomic(path, dumps_scenario(document))
