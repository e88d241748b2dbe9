"""The unit systems on screen and the inputs that carry a unit.

Every input is held in the page's store under `key(name)`, in the display unit of
the system chosen on screen (SI or US). This module names the units of each kind
(`UNITS`), the inputs with a unit and their SI defaults (`QUANTITIES`), converts
between the display units and the core's SI values, rounds converted values for
the input boxes, writes an input as scenario text with its unit, and converts
every input when the unit system changes.
"""

from __future__ import annotations

import math

import pandas as pd

from estimator.units import convert


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
#: None as a default leaves the box empty (an optional input). The parts of the
#: inputs given as ranges are added by `uncertain`.
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


def unchanged(state, name: str, value_si) -> bool:
    """Whether an input still shows the value a loaded file gave it."""
    shown = state.get(key(name))
    if shown is None or value_si is None:
        return False
    if name in QUANTITIES:
        return to_display(value_si, QUANTITIES[name][0], system(state)) == shown
    return float(shown) == float(value_si)
