"""Cached runs of the core for the pages, turned into plain numbers, words and tables.

Each function takes hashable inputs (scenario text, strings, floats, tuples), calls
the core, and returns plain values (dicts, strings, floats, DataFrames) that the
pages show as they are. A core error comes back as ``{"error": {...}}`` with the
field at fault, never as an exception. Numbers are only converted to the display
units here (at the edge, with `estimator.units.convert`); nothing is computed.
"""

from __future__ import annotations

import functools
import math
import re
import tempfile
import warnings
from pathlib import Path

import numpy as np
import pandas as pd
import streamlit as st

from estimator.errors import UllageError
from estimator.evaporation import MODEL_NAMES
from estimator.limits import format_number, format_ppm, format_ratio
from estimator.units import convert

from ullage_ui.case import UNITS, unit_label

#: How many points of a time series are drawn (the table keeps every point).
PLOT_POINTS = 400


# ------------------------------------------------------------------------- errors

_SCENARIO_FIELD = re.compile(r"^\[\[?(\w+)\]\]?(?:\s+#(\d+))?(?:\s+([A-Za-z_]+))?")

#: Which block of a page an error belongs to: (section, key) of a scenario field,
#: or a core argument name.
_AREAS = {
    ("tank", "temperature"): "temperature", ("tank", "worst_temperature"): "temperature",
    ("tank", "volume"): "tank", ("tank", "fill"): "tank", ("tank", "gauge_pressure"): "tank",
    ("tank", "name"): "tank",
    ("spill", "temperature"): "temperature", ("spill", "volume"): "amount",
    ("spill", "mass"): "amount", ("spill", "area"): "amount", ("spill", "dike_area"): "amount",
    ("spill", "depth"): "amount", ("spill", "duration"): "time",
    ("spill", "cleanup_after"): "time", ("spill", "model"): "amount",
    ("outdoors", "receptors"): "receptors",
}
_SECTIONS = {"liquid": "liquid", "substance": "liquid", "limit": "limits", "alarms": "alarms",
             "conditions": "site", "room": "room", "outdoors": "weather", "tank": "details",
             "spill": "amount", "scenario": "general", "shift": "time"}
_CORE_FIELDS = {
    "temperature": "temperature", "elevation": "site", "barometric pressure": "site",
    "gauge pressure": "tank", "pressure": "site", "liquid": "liquid", "substance": "liquid",
    "dissolved": "liquid", "dissolved compound": "liquid", "limit substance": "limits",
    "room volume": "room", "ventilation rate": "room", "mixing factor": "room",
    "near field": "room", "near-field volume": "room", "interzonal airflow": "room",
    "spilled volume": "amount", "spilled mass": "amount", "pool area": "amount",
    "duration": "time", "source removed at": "time", "wind_speed": "weather",
    "wind speed": "weather", "stability": "weather", "terrain": "weather",
    "distance": "receptors", "LFL alarm": "alarms", "oxygen bounds": "alarms",
}


#: Screen labels of scenario fields: (section, key) -> the label the page shows.
FIELD_LABELS = {
    ("tank", "name"): "Tank", ("tank", "liquid"): "Liquid",
    ("tank", "temperature"): "Liquid temperature",
    ("tank", "worst_temperature"): "Worst-case temperature",
    ("tank", "volume"): "Tank volume", ("tank", "fill"): "Liquid level",
    ("tank", "gauge_pressure"): "Gauge pressure",
    ("tank", "daily_low"): "Daily low liquid temperature",
    ("tank", "daily_high"): "Daily high liquid temperature",
    ("tank", "pumped_volume"): "Volume pumped in", ("tank", "purge_rate"): "Purge air flow",
    ("tank", "purge_mixing_factor"): "Purge mixing factor",
    ("tank", "purge_target"): "Purge target",
    ("tank", "residual_area"): "Area of liquid left in the tank",
    ("spill", "name"): "Spill", ("spill", "liquid"): "Liquid",
    ("spill", "temperature"): "Liquid and air temperature",
    ("spill", "volume"): "Spilled volume", ("spill", "mass"): "Spilled mass",
    ("spill", "area"): "Pool area", ("spill", "dike_area"): "Dike or bund floor",
    ("spill", "depth"): "Pool depth", ("spill", "duration"): "Time modelled",
    ("spill", "cleanup_after"): "Pool removed at", ("spill", "model"): "Evaporation model",
    ("room", "name"): "Room", ("room", "volume"): "Room volume",
    ("room", "air_changes"): "Air changes", ("room", "ventilation_rate"): "Ventilation rate",
    ("room", "mixing_factor"): "Mixing factor", ("room", "air_speed"): "Air speed over the pool",
    ("room", "near_field_radius"): "Near-field radius",
    ("room", "random_air_speed"): "Random air speed near the source",
    ("outdoors", "wind_speed"): "Wind speed", ("outdoors", "wind_height"):
        "Wind measured at height", ("outdoors", "insolation"): "Incoming sunshine",
    ("outdoors", "cloud_cover"): "Cloud cover", ("outdoors", "stability"):
        "Pasquill stability class", ("outdoors", "terrain"): "Terrain",
    ("outdoors", "receptors"): "Downwind distances",
    ("conditions", "elevation"): "Site elevation",
    ("conditions", "barometric_pressure"): "Barometric pressure",
    ("alarms", "percent_lfl"): "Flammable vapour alarm [% of LFL]",
    ("alarms", "oxygen_low"): "Oxygen low", ("alarms", "oxygen_high"): "Oxygen high",
    ("substance", "molar_mass"): "Molar mass", ("substance", "boiling_point"):
        "Normal boiling point", ("substance", "vapor_pressure"): "Vapour pressure",
    ("substance", "lower_flammability_limit"): "LFL", ("substance",
                                                        "upper_flammability_limit"): "UFL",
    ("substance", "liquid_density"): "Liquid density", ("substance", "flash_point"):
        "Flash point",
    ("limit", "substance"): "Exposure limits: substance", ("limit", "source"):
        "Exposure limits: source",
}

#: Scenario keys -> screen labels (the first section that has the key wins).
_KEY_LABELS = {}
for (_section, _key), _label in FIELD_LABELS.items():
    _KEY_LABELS.setdefault(_key, _label)
_KEY_LABELS["worst_temperature"] = "Worst-case temperature"

#: Core argument names as people know them.
_CORE_LABELS = {"wind_speed": "Wind speed", "pressure": "Pressure in the vapour space",
                "residual_area": "Area of liquid left in the tank",
                "LFL alarm": "Flammable vapour [% of LFL]",
                "oxygen bounds": "Oxygen low [%] and Oxygen high [%]",
                "elevation": "Site elevation", "barometric pressure": "Barometric pressure"}


def field_key(field: str) -> tuple[str, str | None] | None:
    """The (section, key) of a scenario field as an error names it ("[[room]] #1
    air_changes (line 9)" -> ("room", "air_changes")); None for a core argument."""
    match = _SCENARIO_FIELD.match(re.sub(r"\s*\(line \d+\)", "", str(field or "")).strip())
    return match.group(1, 3) if match else None


def field_label(field: str) -> str:
    """An error's field as the page labels it: "[[tank]] #1 volume (line 21)" ->
    "Tank volume"; never a TOML path or an internal key ("" when the page's block
    name says it better)."""
    text = re.sub(r"\s*\(line \d+\)", "", str(field or "")).strip()
    match = _SCENARIO_FIELD.match(text)
    if match:
        section, _, name = match.groups()
        if name is None:
            return {"tank": "Tank", "spill": "Spill", "room": "Room", "liquid": "Liquid",
                    "substance": "Own substance", "limit": "Exposure limits",
                    "outdoors": "Weather", "conditions": "Site pressure",
                    "alarms": "Alarm levels"}.get(section, section.replace("_", " "))
        return FIELD_LABELS.get((section, name), name.replace("_", " ").capitalize())
    return _CORE_LABELS.get(text, "")


#: Method ids of the core in words.
METHOD_WORDS = {**MODEL_NAMES, "well-mixed": "well-mixed room", "two-zone": "two-zone"}

#: Phrases of core messages that point at an input this page does not have.
_PAGE_PHRASES = {
    "; give residual_area for the liquid left in it":
        " (a scenario file can give the area of liquid left in the tank)",
}


def plain_words(text: str, names: dict | None = None) -> str:
    """A core message as the page says it: substance keys as their names, input keys
    as their screen labels, method ids in words; never an internal key."""
    out = str(text)
    for phrase, words in _PAGE_PHRASES.items():
        out = out.replace(phrase, words)
    for key_, name in sorted((names or {}).items(), key=lambda kv: -len(kv[0])):
        if key_ and key_ != name:
            out = re.sub(rf"(?<![\w-]){re.escape(key_)}(?![\w-])", name, out)
    for method, words in METHOD_WORDS.items():
        out = re.sub(rf"(?<![\w-]){re.escape(method)}(?![\w-])", words, out)

    def label(match):
        word = match.group(0)
        found = _KEY_LABELS.get(word)
        return found.lower() if found else word.replace("_", " ")

    return re.sub(r"\b[a-z]+(?:_[a-z]+)+\b", label, out)


def _plain_view(view: dict, names: dict) -> dict:
    """Every text of a view in plain words (see `plain_words`)."""
    for field in ("findings", "warnings", "assumptions"):
        if view.get(field):
            view[field] = [plain_words(t, names) for t in view[field]]
    if isinstance(view.get("model"), str):
        view["model"] = plain_words(view["model"], names)
    for field in ("limit_lines", "lines"):
        for line in view.get(field) or []:
            line["limit"] = plain_words(line["limit"], names)
    for field in ("comparisons", "worst_comparisons", "metrics", "distances", "exceedance"):
        frame = view.get(field)
        if isinstance(frame, pd.DataFrame) and len(frame):
            for column in ("substance", "limit", "limit or alarm"):
                if column in frame:
                    frame[column] = [plain_words(v, names) for v in frame[column]]
    return view


def _names(scenario) -> dict:
    """Substance key -> name, for every substance a scenario's texts may name."""
    names = {c.key: c.name for c in _components(scenario)}
    for sub in scenario.substances:
        names[sub.key] = sub.name
    for lim in scenario.limits:
        if lim.substance not in names:
            try:
                from estimator.substances import substance

                names[lim.substance] = substance(lim.substance).name
            except Exception:  # a key that no longer resolves: shown as stored
                pass
    return names


def area_of(field: str) -> str:
    """The block of the page that an error's field points at."""
    text = str(field or "").strip()
    match = _SCENARIO_FIELD.match(text)
    if match:
        section, _, name = match.groups()
        return _AREAS.get((section, name), _SECTIONS.get(section, "general"))
    if text == "scenario file":
        return "file"
    lowered = text.lower()
    for name, area in _CORE_FIELDS.items():
        if lowered == name.lower() or lowered.startswith(name.lower() + " "):
            return area
    if "source" in lowered or lowered.endswith((" twa", " stel", " ceiling", " emergency")):
        return "limits"
    if any(w in lowered for w in ("molar_mass", "boiling_point", "flammability", "density",
                                  "flash_point", "vapour pressure", "vapor_pressure")):
        return "liquid"
    return "general"


def error_record(exc) -> dict:
    field = getattr(exc, "field", "") or ""
    reason = getattr(exc, "reason", None) or str(exc)
    return {"field": field, "reason": reason, "area": area_of(field)}


def _split_message(message: str) -> dict:
    """A run error's text ("field: reason") as an error record."""
    field, _, reason = str(message).partition(": ")
    if not reason or (area_of(field) == "general" and not field.startswith("[")):
        field, reason = "", str(message)
    area = area_of(field)
    if not field and "integration failed" in reason:
        area = "solver"
    return {"field": field, "reason": reason, "area": area}


def _load(toml_text: str):
    from estimator.scenario import loads_scenario

    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        return loads_scenario(toml_text)


# ----------------------------------------------------------------------- helpers

def _ppm(value) -> str:
    return f"{format_ppm(float(value))} ppm"


def _display(values, kind: str, units: str):
    return convert(values, UNITS[kind]["core"], UNITS[kind][units][2])


def _temperature_text(kelvin: float | None, units: str) -> str:
    if kelvin is None:
        return "-"
    return f"{_display(kelvin, 'temperature', units):.1f} {unit_label('temperature', units)}"


def _quantity_text(value, kind: str, units: str, digits: int = 3) -> str:
    if value is None:
        return "-"
    return f"{format_number(_display(value, kind, units), digits)} {unit_label(kind, units)}"


def _minutes(seconds) -> str:
    if seconds is None or (isinstance(seconds, float) and not math.isfinite(seconds)):
        return "-"
    return f"{float(seconds) / 60.0:.0f} min"


def _uncertainty_text(value) -> str:
    return "not validated" if value is None else f"±{format_number(100.0 * value, 2)} % (95 % of checks)"


def _thin(n: int, cap: int = PLOT_POINTS) -> np.ndarray:
    if n <= cap:
        return np.arange(n)
    return np.unique(np.linspace(0, n - 1, cap).round().astype(int))


def _limit_lines(limits, keys=None) -> list[dict]:
    out = []
    for lim in limits:
        if keys is not None and lim.substance not in keys:
            continue
        out.append({"ppm": float(lim.ppm),
                    "limit": f"{lim.substance} {lim.kind} {format_ppm(lim.ppm)} ppm"})
    return out


# ------------------------------------------------------------------------ tank

def _headspace_summary(hs, units: str) -> dict:
    comps = hs.liquid.components
    y = np.asarray(hs.volume_fractions, dtype=float)
    mg = np.asarray(hs.mg_per_m3, dtype=float)
    p_sat = np.asarray(hs.saturation_pressures, dtype=float)
    p_i = np.asarray(hs.partial_pressures, dtype=float)
    x = np.asarray(hs.liquid.mole_fractions, dtype=float)
    plabel = unit_label("vapour_pressure", units)
    rows = []
    for i, c in enumerate(comps):
        rows.append({
            "component": c.name,
            "mole fraction in liquid": f"{format_number(x[i])}",
            f"vapour pressure [{plabel}]": ("-" if not np.isfinite(p_sat[i]) else
                                             f"{format_number(_display(p_sat[i], 'vapour_pressure', units))}"),
            f"partial pressure [{plabel}]": f"{format_number(_display(p_i[i], 'vapour_pressure', units))}",
            "headspace [ppm]": format_ppm(y[i] * 1e6),
            "headspace [mg/m³]": f"{format_number(mg[i])}",
        })
    methods = []
    for i, est in enumerate(hs.vapor_pressure_methods):
        methods.append({"component": comps[i].name, "method": est.description,
                        "stated uncertainty": _uncertainty_text(est.relative_uncertainty),
                        "data source": est.source})
    state = str(np.asarray(hs.flammability).item())
    return {
        "total_ppm": float(hs.total_ppm),
        "total_ppm_text": _ppm(hs.total_ppm),
        "total_mg_text": f"{format_number(float(hs.total_mg_per_m3))} mg/m³",
        "percent_lfl": float(hs.percent_lfl),
        "percent_lfl_text": f"{format_number(float(hs.percent_lfl))} %",
        "oxygen_text": f"{format_number(float(hs.oxygen_percent))} %",
        "flammability": state,
        "flammability_words": str(hs.flammability_words),
        "components": pd.DataFrame(rows),
        "methods": pd.DataFrame(methods),
        "uncertainty": _uncertainty_text(hs.relative_uncertainty),
        "activity": hs.liquid.activity_source,
        "pressure_text": _quantity_text(hs.pressure, "barometric", units, 4),
        "warnings": list(hs.warnings),
    }


def _comparison_rows(comparisons) -> pd.DataFrame:
    rows = []
    for c in comparisons:
        lim = c.limit
        rows.append({"substance": lim.substance, "limit": f"{lim.kind} {format_number(lim.value, 6)} {lim.unit}",
                     "headspace": _ppm(c.concentration * 1e6),
                     "against the limit": f"{format_ratio(c.ratio)} the limit",
                     "ratio": float(c.ratio), "source": lim.source})
    return pd.DataFrame(rows, columns=["substance", "limit", "headspace", "against the limit",
                                       "ratio", "source"])


#: Tank inputs whose results stand apart from the headspace: a bad one is left out
#: (with the inputs that only work with it) and the rest is still computed.
_SEPARABLE = {
    "volume": ("volume", "fill", "pumped_volume", "purge_rate", "purge_target",
               "purge_mixing_factor", "residual_area"),
    "fill": ("fill",), "worst_temperature": ("worst_temperature",),
    "daily_low": ("daily_low", "daily_high"), "daily_high": ("daily_low", "daily_high"),
    "pumped_volume": ("pumped_volume",),
    "purge_rate": ("purge_rate", "purge_target", "purge_mixing_factor", "residual_area"),
    "purge_target": ("purge_target",), "purge_mixing_factor": ("purge_mixing_factor",),
    "residual_area": ("residual_area",), "sweep_from": ("sweep_from", "sweep_to"),
    "sweep_to": ("sweep_from", "sweep_to"),
}


@st.cache_data(max_entries=64, show_spinner=False)
def tank_view(toml_text: str, units: str) -> dict:
    """Screen the tank of a one-tank scenario; plain values for the tank page.

    An input that fails alone (a negative tank volume, a bad purge flow) is left out
    and reported in ``field_errors``; the results that do not depend on it are kept.
    """
    return _separated(toml_text, lambda text: _tank_view(text, units))


def _tank_view(toml_text: str, units: str) -> dict:
    from estimator.screening import screen_tank

    try:
        scenario = _load(toml_text)
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            result = screen_tank(scenario, scenario.tanks[0])
    except (UllageError, ValueError) as exc:
        return {"error": error_record(exc)}
    hs = result.headspace
    view = {"error": None, "name": result.name, "liquid": result.liquid,
            "temperature_text": _temperature_text(result.temperature, units),
            "now": _headspace_summary(hs, units),
            "worst": None if result.worst is None else _headspace_summary(result.worst, units),
            "worst_temperature_text": _temperature_text(result.worst_temperature, units),
            "comparisons": _comparison_rows(result.comparisons),
            "worst_comparisons": _comparison_rows(result.worst_comparisons),
            "additive_index": result.additive_index,
            "worst_additive_index": result.worst_additive_index,
            "findings": list(result.findings), "warnings": list(result.warnings),
            "assumptions": list(scenario.assumptions),
            "flash_point_text": None, "alarm_temperature_text": None,
            "alarm_percent": float(scenario.alarms.percent_lfl),
            "alarm_source": scenario.alarms.source, "details": []}
    if result.flash_point is not None:
        fp = result.flash_point
        text = f"{_temperature_text(fp.estimate, units)} (estimated; {fp.note})"
        if fp.published is not None:
            text += f"; published closed cup {_temperature_text(fp.published, units)}"
        view["flash_point_text"] = text
    if result.alarm_temperature is not None:
        view["alarm_temperature_text"] = _temperature_text(result.alarm_temperature, units)
    mass = "mass"
    if result.inventory is not None:
        view["details"].append(("Vapour in the tank's vapour space",
                                _quantity_text(result.inventory.total_mass, mass, units)))
    if result.filling is not None:
        view["details"].append(("Vapour pushed out by filling",
                                _quantity_text(result.filling.total_mass, mass, units)))
    if result.breathing is not None:
        view["details"].append(("Vapour breathed out over one day's temperature swing",
                                _quantity_text(result.breathing.total_mass, mass, units)))
    if result.purge is not None:
        purge = result.purge
        view["details"].append(("Purge before entry",
                                f"{_minutes(purge.time)} to reach "
                                f"{format_ppm(purge.target_volume_fraction * 1e6)} ppm"
                                if purge.reachable else purge.note))
    if result.sweep is not None:
        sweep = result.sweep
        t = _display(np.asarray(sweep.temperature, dtype=float), "temperature", units)
        frames = [pd.DataFrame({"temperature": t, "ppm": np.asarray(sweep.total_ppm),
                                "series": "all vapour"})]
        comps = sweep.liquid.components
        if len(comps) > 1:
            for i, c in enumerate(comps):
                frames.append(pd.DataFrame({"temperature": t, "ppm": sweep.ppm[i],
                                            "series": c.name}))
        view["sweep"] = pd.concat(frames, ignore_index=True)
        view["sweep_lfl"] = pd.DataFrame({"temperature": t,
                                          "percent_lfl": np.asarray(sweep.percent_lfl)})
    else:
        view["sweep"] = view["sweep_lfl"] = None
    view["limit_lines"] = _limit_lines(scenario.limits)
    view["temperature_unit"] = unit_label("temperature", units)
    view["stated_temperature"] = float(_display(result.temperature, "temperature", units))
    return _plain_view(view, _names(scenario))


# ----------------------------------------------------------------------- spills

#: Argument names of the spill models -> the scenario field they come from, so that
#: an error of a run names the input on screen and lands beside its block.
_RUN_FIELDS = {"source removed at": "[[spill]] cleanup_after",
               "radius": "[[room]] near_field_radius",
               "random_air_speed": "[[room]] random_air_speed",
               "reference_height": "[outdoors] wind_height",
               "distance": "[outdoors] receptors"}


def _run_error(message: str) -> dict:
    """A spill run's error as a record naming the scenario field of its input."""
    name, _, reason = str(message).partition(": ")
    field = _RUN_FIELDS.get(name)
    if field is None or not reason:
        return _split_message(message)
    return {"field": field, "reason": reason, "area": area_of(field)}


def _spill_result(toml_text: str):
    from estimator.screening import run_scenario

    scenario = _load(toml_text)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        result = run_scenario(scenario)
    if result.errors:
        return scenario, None, _run_error(result.errors[0][1])
    return scenario, result.spills[0], None


def _outdoor_wind_at_10_m(doc: dict) -> bool:
    """True when the wind is given at 10 m: the release rate then does not depend on
    the stability class (elsewhere the power law taking it to 10 m does)."""
    from estimator.units import parse_quantity

    height = doc.get("outdoors", {}).get("wind_height")
    try:
        return height is None or abs(parse_quantity(height, "length", "wind height")
                                     - 10.0) < 1e-9
    except (UllageError, ValueError):
        return False


#: Spill inputs whose results stand apart from the rest: (section, key) of the
#: field -> (keys taken out of that section, or replaced, as key -> value; the
#: result groups left out; what is shown instead, in words; when it applies).
#: "run" is every result over time of an indoor spill, "plume" every result
#: downwind of an outdoor one.
_SPILL_SEPARABLE = {
    ("room", "near_field_radius"): (
        {"near_field_radius": None, "random_air_speed": None}, ("near field",),
        "the near-field results are left out until it is corrected (the room is shown "
        "well mixed)", None),
    ("spill", "cleanup_after"): (
        {"cleanup_after": None}, ("clean-up",),
        "until it is corrected the pool is left in place until it is dry (an upper "
        "bound of the exposure)", None),
    ("spill", "duration"): (
        {"duration": None}, ("run",),
        "the results over time are left out until it is corrected", None),
    ("outdoors", "cloud_cover"): (
        {"cloud_cover": None, "insolation": None, "daytime": None, "stability": "D"},
        ("plume",), "the stability class and every result downwind are left out until "
        "it is corrected", _outdoor_wind_at_10_m),
}
_SPILL_SEPARABLE[("room", "random_air_speed")] = _SPILL_SEPARABLE[("room", "near_field_radius")]
_SPILL_SEPARABLE[("outdoors", "daytime")] = _SPILL_SEPARABLE[("outdoors", "cloud_cover")]
_SPILL_SEPARABLE[("outdoors", "insolation")] = _SPILL_SEPARABLE[("outdoors", "cloud_cover")]


def _leave_out(toml_text: str, error: dict | None):
    """The scenario text without the input an error names, when that input fails
    alone (`_SEPARABLE` for a tank, `_SPILL_SEPARABLE` for a spill), as (text, the
    reason to show, the result groups left out); None when the error is not one
    of those."""
    import tomllib

    from estimator.scenario import dumps_scenario

    match = _SCENARIO_FIELD.match(str(error["field"])) if error else None
    if not match:
        return None
    section, name = match.group(1, 3)
    if section == "tank" and name in _SEPARABLE:
        changes, groups, applies = dict.fromkeys(_SEPARABLE[name]), (), None
        words = "the results that depend on it are left out until it is corrected"
    elif (section, name) in _SPILL_SEPARABLE:
        changes, groups, words, applies = _SPILL_SEPARABLE[(section, name)]
    else:
        return None
    doc = tomllib.loads(toml_text)
    if applies is not None and not applies(doc):
        return None
    found = doc.get(section)
    table = found[0] if isinstance(found, list) and found else found
    if not isinstance(table, dict):
        return None
    for key_, value in changes.items():
        if value is None:
            table.pop(key_, None)
        else:
            table[key_] = value
    return dumps_scenario(doc), f"{error['reason']}; {words}", groups


def _separated(toml_text: str, view_function) -> dict:
    """Run `view_function` on a one-item scenario, leaving out each input that fails
    alone (`_leave_out`) with the results that depend on it; the view lists the
    errors in ``field_errors`` and the result groups left out in ``left_out``."""
    field_errors, left_out = [], []
    text = toml_text
    for _ in range(len(_SEPARABLE) + len(_SPILL_SEPARABLE)):
        view = view_function(text)
        separated = _leave_out(text, view["error"])
        if separated is None:
            break
        text, reason, groups = separated
        field_errors.append(dict(view["error"], reason=reason))
        left_out += [g for g in groups if g not in left_out]
    view["field_errors"] = field_errors
    view["left_out"] = left_out
    return view


def _exposure_tables(spill) -> tuple[pd.DataFrame, pd.DataFrame]:
    metrics, comparisons = [], []
    for e in spill.exposures:
        metrics.append({"zone": e.zone, "substance": e.substance, "peak": _ppm(e.peak),
                        "peak at": _minutes(e.peak_time), "8-h TWA": _ppm(e.twa),
                        "highest 15-min average": _ppm(e.short_term)})
        for label, limit_ppm, ratio, first, back in e.comparisons:
            comparisons.append({
                "zone": e.zone, "substance": e.substance, "limit": label,
                "against the limit": f"{format_ratio(ratio)} the limit", "ratio": float(ratio),
                "above from": _minutes(first),
                "back below at": ("not within the run" if first is not None and back is None
                                  else _minutes(back))})
    return pd.DataFrame(metrics), pd.DataFrame(
        comparisons, columns=["zone", "substance", "limit", "against the limit", "ratio",
                              "above from", "back below at"])


def _rates_text(spill) -> str:
    parts = [f"{MODEL_NAMES.get(m, m)} {format_number(1000.0 * r)} g/s"
             for m, r in spill.initial_rates.items()]
    return ", ".join(parts)


@st.cache_data(max_entries=64, show_spinner=False)
def indoor_view(toml_text: str, units: str) -> dict:
    """Run the indoor spill of a one-spill scenario; plain values for the page.

    An input that fails alone (the near field, the clean-up time, the time modelled)
    is left out and reported in ``field_errors``; ``left_out`` names the results
    that depend on it, which the page does not show.
    """
    view = _separated(toml_text, lambda text: _indoor_view(text, units))
    if "run" in view["left_out"] and not view["error"]:
        # only the pool and the initial evaporation rates stand without the run
        for name in ("peak_text", "twa_text", "short_text", "lfl_peak_text",
                     "oxygen_text", "pool_text", "mass_balance_text"):
            view[name] = None
        view["series"] = view["lfl_series"] = None
        view["findings"] = []
        view["metrics"] = view["metrics"].iloc[0:0]
        view["comparisons"] = view["comparisons"].iloc[0:0]
    return view


def _indoor_view(toml_text: str, units: str) -> dict:
    try:
        scenario, spill, problem = _spill_result(toml_text)
    except (UllageError, ValueError) as exc:
        return {"error": error_record(exc)}
    if problem is not None:
        return {"error": problem}
    run = spill.indoor
    zones = [("room", "far field" if run.near_field is not None else "room")]
    if run.near_field is not None:
        zones.insert(0, ("near_field", "near field"))
    keep = _thin(run.times.size)
    frames = []
    for zone, label in zones:
        ppm = run.ppm(zone)
        for j, name in enumerate(run.components):
            frames.append(pd.DataFrame({"minutes": run.times[keep] / 60.0,
                                        "ppm": ppm[keep, j], "series": f"{label}: {name}"}))
    metrics, comparisons = _exposure_tables(spill)
    first = spill.exposures[0] if spill.exposures else None
    judged = [z for z in spill.flammability if z.judged]
    top = max(judged, key=lambda z: z.peak_percent_lfl) if judged else None
    alarm = scenario.alarms.percent_lfl
    lfl_log = bool(top and top.peak_percent_lfl > 5 * alarm)
    # on a log axis the clean air at the start is drawn at 0.01 % of the LFL
    lfl_frames = [pd.DataFrame({"minutes": z.times[keep] / 60.0,
                                "percent": np.maximum(z.percent_lfl[keep], 0.01) if lfl_log
                                else z.percent_lfl[keep], "series": z.zone})
                  for z in judged]
    gone = run.pool_gone_time
    if math.isfinite(gone):
        pool = f"evaporated after {_minutes(gone)}"
    elif run.source_removed_time is not None and run.source_removed_time < run.times[-1]:
        pool = f"cleaned up at {_minutes(run.source_removed_time)}"
    else:
        pool = "still there at the end of the run"
    return _plain_view({
        "error": None, "name": spill.name, "where": spill.where,
        "peak_text": _ppm(first.peak) if first else "-",
        "peak_zone": first.zone if first else "",
        "peak_time_text": _minutes(first.peak_time) if first else "-",
        "lfl_peak_text": (f"{format_number(top.peak_percent_lfl)} %" if top
                          else "not judged"),
        "lfl_peak_help": (f"highest in the {top.zone}, at {_minutes(top.peak_time)}"
                          if top else "no component has a flammability limit on record: "
                          "enter the LFL from the safety data sheet"),
        "lfl_series": pd.concat(lfl_frames, ignore_index=True) if lfl_frames else None,
        "oxygen_text": (f"{format_number(min(z.lowest_oxygen for z in spill.flammability))} %"
                        if spill.flammability else "-"),
        "oxygen_help": "; ".join(
            f"{z.zone}: below the {format_number(z.oxygen_alarm)} % alarm from "
            f"{_minutes(z.below_oxygen_alarm_from)}" if z.below_oxygen_alarm_from is not None
            else f"{z.zone}: stays above the {format_number(z.oxygen_alarm)} % alarm"
            for z in spill.flammability) or None,
        "lfl_lines": [{"percent": alarm, "limit": f"LFL alarm {format_number(alarm)} %"},
                      {"percent": 100.0, "limit": "LFL 100 %"}],
        "lfl_log": lfl_log,
        "twa_text": _ppm(first.twa) if first else "-",
        "short_text": _ppm(first.short_term) if first else "-",
        "pool_text": pool,
        "pool_area_text": _quantity_text(run.pool_area, "area", units),
        "model": run.model, "rates_text": _rates_text(spill),
        "mass_balance_text": f"{format_number(100.0 * run.mass_balance_error, 2)} %",
        "series": pd.concat(frames, ignore_index=True),
        "metrics": metrics, "comparisons": comparisons,
        "limit_lines": _limit_lines(scenario.limits, {c.key for c in _components(scenario)}),
        "findings": list(spill.findings), "warnings": list(spill.warnings),
        "assumptions": list(scenario.assumptions),
    }, _names(scenario))


def _components(scenario):
    """The substances of every liquid of a scenario."""
    out = []
    for entry in scenario.liquids.values():
        spec = entry["spec"]
        out.extend(spec if isinstance(spec, dict) else [spec])
    return out


@st.cache_data(max_entries=64, show_spinner=False)
def outdoor_view(toml_text: str, units: str, receptors: tuple) -> dict:
    """Run the outdoor spill of a one-spill scenario; plain values for the page.

    `receptors` are the distances the user asked for, in the display length unit;
    the scenario may hold more (a grid for the plot). A bad cloud cover leaves the
    stability class and everything downwind out (``left_out``), the release rate is
    kept when the wind is given at 10 m.
    """
    view = _separated(toml_text, lambda text: _outdoor_view(text, units, receptors))
    if "plume" in view["left_out"] and not view["error"]:
        view["findings"] = [f for f in view["findings"] if not f.startswith(
            ("Downwind", "Near the pool", "Britter", "Release rate to air"))]
        view["warnings"] = [w for w in view["warnings"] if not any(
            word in w for word in ("centreline", "stability class", "Briggs", "downwind"))]
    return view


def _outdoor_view(toml_text: str, units: str, receptors: tuple) -> dict:
    try:
        scenario, spill, problem = _spill_result(toml_text)
    except (UllageError, ValueError) as exc:
        return {"error": error_record(exc)}
    if problem is not None:
        return {"error": problem}
    run = spill.outdoor
    distance = _display(np.asarray(run.distances, dtype=float), "length", units)
    ppm = np.asarray(run.volume_fraction, dtype=float) * 1e6
    # the plotted profile starts at the pool's edge, so every limit line's crossing shows
    reach = [d for d in (run.distance_to_lfl, run.distance_to_lfl_alarm) if d is not None]
    reach += [d for _, d, _ in spill.distances if d]
    far = max([float(np.max(run.distances))] + [1.5 * d for d in reach])
    grid = np.geomspace(run.pool_edge, max(far, 2.0 * run.pool_edge), 120)
    profile = run.centreline(grid) * 1e6
    shown = _display(grid, "length", units)
    frames = [pd.DataFrame({"distance": shown, "ppm": profile[:, j], "series": name})
              for j, name in enumerate(run.components)]
    lines = _limit_lines(scenario.limits, set(_keys(scenario)))
    fuel = np.isfinite(run.lower_flammability_limits)
    if np.any(fuel):
        fraction = run.fraction_of_lfl(grid)
        total = profile[:, fuel].sum(axis=1)
        if len(run.components) > 1:
            frames.append(pd.DataFrame({"distance": shown, "ppm": total,
                                        "series": "all flammable vapour"}))
        lfl_ppm = float(np.median(total[fraction > 0] / fraction[fraction > 0]))
        lines += [{"ppm": lfl_ppm, "limit": f"LFL {format_ppm(lfl_ppm)} ppm"},
                  {"ppm": lfl_ppm * run.lfl_alarm_percent / 100.0,
                   "limit": f"{run.lfl_alarm_percent:g} % LFL alarm"}]

    def reach_text(d, flags):
        if d is None:
            return "never (below it at the pool edge)"
        return _quantity_text(d, "length", units) + (
            f" ({'; '.join(flags)})" if flags else "")
    rows = []
    for r in receptors:
        i = int(np.argmin(np.abs(distance - r)))
        row = {f"distance [{unit_label('length', units)}]": format_number(r, 6)}
        for j, name in enumerate(run.components):
            row[name] = _ppm(ppm[i, j])
        rows.append(row)
    distances = [{"limit": label,
                  "centreline above it out to": ("beyond the farthest distance computed"
                                                 if d is None else "stays below it" if d == 0
                                                 else _quantity_text(d, "length", units)),
                  "note": note} for label, d, note in spill.distances]
    return _plain_view({
        "error": None, "name": spill.name,
        "source_text": f"{format_number(1000.0 * float(np.sum(run.emission_rate)))} g/s",
        "stability": run.stability, "terrain": run.terrain,
        "wind_text": _quantity_text(run.wind_speed, "wind", units, 2),
        "rates_text": _rates_text(spill),
        "series": pd.concat(frames, ignore_index=True),
        "receptors": pd.DataFrame(rows), "distances": pd.DataFrame(distances),
        "limit_lines": lines,
        "findings": list(spill.findings), "warnings": list(spill.warnings),
        "assumptions": list(scenario.assumptions),
        "distance_unit": unit_label("length", units),
        "flammable": bool(np.any(fuel)),
        "lfl_text": reach_text(run.distance_to_lfl, run.lfl_flags),
        "alarm_label": f"Distance to {run.lfl_alarm_percent:g} % LFL",
        "alarm_text": reach_text(run.distance_to_lfl_alarm, run.lfl_alarm_flags),
        "dense_text": (None if run.dense_gas is None else
                       f"{run.dense_gas.value:.2g} ("
                       + ("dense" if run.dense_gas.dense else "passive") + ")"),
        "dense_statement": None if run.dense_gas is None else run.dense_gas.statement,
        "cap_text": (None if run.capped_until is None else
                     "Near the pool, out to "
                     + _quantity_text(run.capped_until, "length", units)
                     + ", the centreline is capped at the saturated vapour concentration "
                     "over the pool (the most the pool can give)."),
    }, _names(scenario))


def _keys(scenario):
    return [c.key for c in _components(scenario)]


# ------------------------------------------------------------------ uncertainty

#: Unit kinds of the page (`ui.case.UNITS`) for the unit kinds of uncertain
#: scenario inputs (`estimator.scenario.UNCERTAIN_INPUTS`); None: a plain number.
_UNCERTAIN_KINDS = {"temperature": "temperature", "area": "area", "speed": "air_speed",
                    "flow": "flow", "mass": "mass", "fraction": None}

#: Inputs of the sampled chains in plain words.
_INPUT_WORDS = {"temperature": "temperature", "pool_area": "pool area", "area": "pool area",
                "air_speed": "air speed over the pool", "room_volume": "room volume",
                "ventilation_rate": "ventilation rate", "mixing_factor": "mixing factor",
                "spilled_mass": "spilled mass", "mass": "spilled mass",
                "pressure": "pressure", "vapor_pressure_factor": "vapour-pressure method"}

#: Outputs shown with their percentiles: model -> (output, words, how to format).
_PERCENTILE_OUTPUTS = {
    "headspace": (("total_ppm", "total vapour in the headspace", "ppm"),
                  ("percent_lfl", "flammable vapour (% of LFL)", "percent"),
                  ("oxygen_percent", "oxygen after displacement", "percent")),
    "indoor spill": (("twa_ppm", "8-h TWA (room)", "ppm"),
                     ("short_term_ppm", "highest 15-min average (room)", "ppm"),
                     ("peak_ppm", "peak (room)", "ppm"),
                     ("pool_lifetime", "pool lasts", "minutes"),
                     ("evaporation_rate", "evaporation rate", "grams")),
}

#: The output whose spread the page explains, per model, and its name in a sentence.
_KEY_OUTPUT = {"headspace": "total_ppm", "indoor spill": "twa_ppm"}
_KEY_WORDS = {"headspace": "total headspace concentration", "indoor spill": "8-h TWA in the room"}


#: Column heads of percentiles.
_PERCENTILE_WORDS = {1: "1st percentile", 5: "5th percentile", 50: "median",
                     90: "90th percentile", 95: "95th percentile", 99: "99th percentile"}


def input_words(name: str) -> str:
    """A chain input's name in plain words ("vapor_pressure_factor[Toluene]" ->
    "vapour-pressure method (Toluene)")."""
    base, _, inner = str(name).partition("[")
    words = _INPUT_WORDS.get(base, base.replace("_", " "))
    return f"{words} ({inner.rstrip(']')})" if inner else words


def _statistic_text(value: float, how: str) -> str:
    if not math.isfinite(value):
        return "not within the run" if how == "minutes" else "not finite"
    if how == "ppm":
        return _ppm(value)
    if how == "percent":
        return f"{format_number(value)} %"
    if how == "minutes":
        return _minutes(value)
    return f"{format_number(1000.0 * value)} g/s"


def probability_text(probability: float) -> str:
    """A probability as the pages and the report show it (3 significant figures, in %)."""
    return f"{format_number(100.0 * float(probability))} %"


def distribution_text(dist, kind: str | None, units: str) -> str:
    """A distribution of an input in words, in the units on screen."""
    from estimator.uncertainty import Fixed, LogNormal, Normal, Triangular, Uniform

    def value(v):
        if kind is None:
            return f"{format_number(v)}"
        return f"{format_number(_display(v, kind, units))} {unit_label(kind, units)}"

    def spread(v):
        if kind is None:
            return f"{format_number(v)}"
        if kind == "temperature":
            return (f"{format_number(convert(v, 'delta_degC', 'delta_degF'))} °F" if units == "US"
                    else f"{format_number(v)} K")
        return value(v)

    if isinstance(dist, Uniform):
        return f"uniform from {value(dist.low)} to {value(dist.high)}"
    if isinstance(dist, Triangular):
        return (f"triangular from {value(dist.low)} to {value(dist.high)}, most likely "
                f"{value(dist.mode)}")
    if isinstance(dist, LogNormal):
        return (f"lognormal, geometric mean {value(dist.geometric_mean)}, geometric SD "
                f"{format_number(dist.geometric_sd)}")
    if isinstance(dist, Normal):
        text = f"normal, mean {value(dist.mean)}, SD {spread(dist.sd)}"
        bounds = [f"{w} {value(b)}" for w, b in (("above", dist.low), ("below", dist.high))
                  if b is not None]
        return text + (", kept " + " and ".join(bounds) if bounds else "")
    if isinstance(dist, Fixed):
        return f"fixed at {value(dist.value)}"
    return str(dist)


def _uncertainty_error(record: dict, prefix: str = "") -> dict:
    """An error record pointed at the Uncertainty section, naming the input in words."""
    field, reason = str(record.get("field") or ""), str(record.get("reason", ""))
    named = re.match(r"^([a-z_]+(?:\[[^\]]*\])?): (.*)$", reason, flags=re.S)
    if not field and named:
        field, reason = named.groups()
    if re.fullmatch(r"[a-z_]+(?:\[[^\]]*\])?", field):
        field = input_words(field)
    return {"error": dict(record, field=field, area="uncertainty", reason=prefix + reason)}


@st.cache_data(max_entries=32, show_spinner=False)
def uncertainty_view(toml_text: str, units: str) -> dict:
    """Run the probabilistic screening of a one-item scenario with [[uncertain]] inputs
    (`estimator.screening.run_scenario`); plain values for the Uncertainty section."""
    from estimator.report import monte_carlo_curves

    found = _monte_carlo_run(toml_text)
    if "error" in found:
        return found
    scenario, item, mc = found["scenario"], found["item"], found["mc"]
    stats, low = _percentile_rows(mc)
    names = ({c.key: c.name for c in item.headspace.liquid.components}
             if mc.model == "headspace" else None)
    curves, lines = monte_carlo_curves(mc, scenario.limits, names)
    driver, sensitivity = _sensitivity(mc)
    log_x, curve = _cumulative_curves(curves, lines)
    return _plain_view({
        "error": None, "model": mc.model, "n": mc.n, "seed": mc.seed,
        "n_text": f"{mc.n:,} samples, seed {mc.seed}",
        "inputs": pd.DataFrame(_sampled_inputs(scenario, mc, units),
                               columns=["input", "distribution"]),
        "percentiles": pd.DataFrame(stats),
        "low_percentiles": pd.DataFrame(low),
        "key_percentiles": _key_percentiles(mc),
        "exceedance": pd.DataFrame(_exceedance_rows(mc, lines),
                                   columns=["limit or alarm", "compared with",
                                            "probability of exceeding"]),
        "exceedance_by_label": {k: probability_text(v) for k, v in mc.exceedance.items()},
        "driver_text": driver, "sensitivity": sensitivity,
        "curve": curve,
        "lines": [{"ppm": x["ppm"], "limit": x["line"]} for x in lines],
        "log_x": bool(log_x),
        "warnings": list(mc.warnings) + [w for w in item.warnings if "probabilistic" in w
                                         and w not in mc.warnings],
    }, _names(scenario))


def _monte_carlo_run(toml_text: str) -> dict:
    """The scenario, its one item and the item's Monte Carlo result, or an error view."""
    from estimator.screening import run_scenario

    text = toml_text
    for _ in range(len(_SEPARABLE) + len(_SPILL_SEPARABLE) + 1):
        try:
            scenario = _load(text)
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                result = run_scenario(scenario)
        except (UllageError, ValueError) as exc:
            record, stated = error_record(exc), False
        else:
            stated = next(((item, _run_error(message)) for item, message in result.errors
                           if not item.endswith("(probabilistic)")), None)
            own = next((_split_message(message) for item, message in result.errors
                        if item.endswith("(probabilistic)")), None)
            if stated is None and own is not None:
                return _uncertainty_error(own)
            if stated is None:
                break
            record = stated[1]
        # an input the stated result does without is left out of the samples too,
        # unless every sample runs over it (the time modelled)
        separated = _leave_out(text, record)
        if separated is None:
            if stated:
                return _uncertainty_error(record, "the result at the stated values could "
                                                  "not be computed, so neither could the "
                                                  "samples: ")
            return _uncertainty_error(record)
        if "run" in separated[2]:
            return _uncertainty_error(dict(record, reason=record["reason"] + "; every sample "
                                           "depends on it, so the samples are left out "
                                           "until it is corrected"))
        text = separated[0]
    items = list(result.tanks) + list(result.spills)
    item = items[0] if items else None
    mc = getattr(item, "monte_carlo", None)
    if mc is None:
        return {"error": {"field": "", "area": "uncertainty",
                          "reason": "no input is given as a range"}}
    return {"scenario": scenario, "item": item, "mc": mc}


def _sampled_inputs(scenario, mc, units: str) -> list[dict]:
    """The inputs drawn, each with its distribution in words."""
    from estimator.scenario import UNCERTAIN_INPUTS

    rows = []
    for entry in scenario.uncertain:
        kind = _UNCERTAIN_KINDS.get(UNCERTAIN_INPUTS[entry["kind"]][entry["input"]])
        rows.append({"input": input_words(entry["input"]),
                     "distribution": distribution_text(entry["distribution"], kind, units)})
    for name, text in mc.inputs.items():
        if name.startswith("vapor_pressure_factor"):
            rows.append({"input": input_words(name), "distribution": text})
    return rows


def _percentile_rows(mc) -> tuple[list[dict], list[dict]]:
    """Rows of the high percentiles of each output, and of oxygen's low ones (the
    hazard is low oxygen)."""
    stats, low = [], []
    for output, words, how in _PERCENTILE_OUTPUTS[mc.model]:
        if output not in mc.percentiles:
            continue
        table = mc.percentiles[output]
        row = {"output": words}
        if output == "oxygen_percent":
            for q in (1, 5, 50):
                row[_PERCENTILE_WORDS[q]] = _statistic_text(table[q], how)
            low.append(row)
            continue
        for q in (50, 90, 95, 99):
            row[_PERCENTILE_WORDS[q]] = _statistic_text(table[q], how)
        stats.append(row)
    return stats, low


def _exceedance_rows(mc, lines) -> list[dict]:
    """The probability of exceeding each limit or alarm: those drawn as lines first."""
    rows, shown = [], set()
    for line in lines:
        rows.append({"limit or alarm": line["line"], "compared with": line["compared"],
                     "probability of exceeding": probability_text(mc.exceedance[line["label"]])})
        shown.add(line["label"])
    for label, probability in mc.exceedance.items():
        if label not in shown:
            compared = ("oxygen after displacement" if label.startswith("oxygen")
                        else "flammable vapour")
            rows.append({"limit or alarm": label, "compared with": compared,
                         "probability of exceeding": probability_text(probability)})
    return rows


def _sensitivity(mc) -> tuple[str | None, pd.DataFrame]:
    """Which input drives the key output most, in words, and the rank correlations."""
    ranks = dict(mc.sensitivity.get(_KEY_OUTPUT[mc.model], {}))
    driver = None
    if ranks:
        top, rho = next(iter(ranks.items()))
        driver = (f"The spread of the {_KEY_WORDS[mc.model]} is driven most by the "
                  f"{input_words(top)} (Spearman rank correlation {rho:.2f}).")
    table = pd.DataFrame([{"input": input_words(k), "rank correlation": f"{v:.2f}"}
                          for k, v in ranks.items()], columns=["input", "rank correlation"])
    return driver, table


def _cumulative_curves(curves: dict, lines) -> tuple[bool, pd.DataFrame]:
    """Whether the concentration axis is logarithmic (over a factor of 100), and the
    cumulative distribution of each curve as one frame."""
    from estimator.plots import cumulative_points

    values = np.concatenate([np.ravel(v) for v in curves.values()]
                            + [np.array([x["ppm"] for x in lines], dtype=float)])
    positive = values[np.isfinite(values) & (values > 0)]
    log_x = positive.size > 1 and float(positive.max()) / float(positive.min()) > 100.0
    frames = []
    for label, samples in curves.items():
        x, f = cumulative_points(samples, 400, log_x)
        keep = np.isfinite(x) & ((x > 0) if log_x else True)
        frames.append(pd.DataFrame({"ppm": x[keep], "fraction": f[keep], "series": label}))
    return log_x, pd.concat(frames, ignore_index=True)


def _key_percentiles(mc) -> list[tuple[str, str]]:
    """The percentiles a tile shows: the 95th of each concentration, the 5th of oxygen."""
    shown = [(f"95th percentile, {words}", _statistic_text(mc.percentiles[output][95], how))
             for output, words, how in _PERCENTILE_OUTPUTS[mc.model]
             if how == "ppm" and output in mc.percentiles and output != "short_term_ppm"]
    if "oxygen_percent" in mc.percentiles:
        shown.append(("5th percentile, oxygen after displacement", _statistic_text(
            mc.percentiles["oxygen_percent"][5], "percent")))
    return shown


# --------------------------------------------------------------------- checks

@functools.lru_cache(maxsize=512)
def scenario_problem(toml_text: str) -> dict | None:
    """The first problem `loads_scenario` finds in a text, or None."""
    try:
        _load(toml_text)
    except (UllageError, ValueError) as exc:
        return error_record(exc)
    return None


@functools.lru_cache(maxsize=32)
def report_text(toml_text: str, kind: str) -> str:
    """The HTML report or the CSV results of a scenario (core `estimator.report`)."""
    from estimator import report
    from estimator.screening import run_scenario

    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        result = run_scenario(_load(toml_text))
    if kind == "html":
        return report.html_report(result)
    if kind == "csv":
        return report.results_csv(result)
    if kind == "markdown":
        return report.markdown_report(result)
    raise ValueError(f"unknown report kind {kind!r}; use html, csv or markdown")


def reports_available() -> bool:
    from estimator import report

    return all(hasattr(report, name) for name in ("html_report", "results_csv"))


# -------------------------------------------------------------------- inventory

def readable(frame: pd.DataFrame) -> pd.DataFrame:
    """A table for reading: every decimal number with three significant figures and
    thousands separators, blanks for missing values (the CSV download keeps the
    full precision)."""
    out = frame.copy()
    for column in out.columns:
        if pd.api.types.is_float_dtype(out[column]):
            out[column] = [("" if not np.isfinite(v) else format_number(v))
                           for v in out[column].to_numpy(dtype=float)]
    return out


@st.cache_data(max_entries=8, show_spinner=False)
def inventory_view(data: bytes, filename: str, pressure: float | None,
                   elevation: float | None, alarms: tuple) -> dict:
    """Screen an uploaded inventory file; plain values for the inventory page.

    `pressure` [Pa] or `elevation` [m] is the site's; `alarms` is
    (percent LFL, oxygen low, oxygen high, source).
    """
    from estimator.inventory import screen_inventory, sorted_by_concern, write_inventory_csv
    from estimator.limits import FlammabilityAlarms

    suffix = Path(filename).suffix.lower() or ".csv"
    try:
        alarm_levels = FlammabilityAlarms(*alarms)
        with tempfile.TemporaryDirectory() as folder:
            path = Path(folder) / f"inventory{suffix}"
            path.write_bytes(data)
            kwargs = {"elevation": elevation} if elevation is not None else (
                {"pressure": pressure} if pressure is not None else {})
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                result = screen_inventory(path, alarms=alarm_levels, **kwargs)
            out = Path(folder) / "screened.csv"
            write_inventory_csv(result, out)
            csv_text = out.read_text(encoding="utf-8-sig")
    except (UllageError, ValueError) as exc:
        return {"error": error_record(exc)}
    table = sorted_by_concern(result)
    summary = result.summary
    errors = table[table["status"] == "error"]
    return {"error": None, "rows": summary.rows, "counts": dict(summary.counts),
            "at_or_above": summary.at_or_above_alarm, "liquids": summary.liquids,
            "worst": readable(summary.worst.reset_index(drop=True)),
            "table": readable(table.reset_index(drop=True)),
            "errors": list(errors["reason"].astype(str)), "warnings": list(result.warnings),
            "csv": csv_text, "pressure_text": f"{format_number(result.pressure / 1000.0)} kPa"}
