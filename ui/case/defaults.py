"""Defaults and a new case: the inputs without a unit and their defaults (`PLAIN`),
the liquid choices and table columns of the pages, every input back at its
default, the demo files and the upload limits."""

from __future__ import annotations

from pathlib import Path

import pandas as pd

from estimator.units import convert

from .units import QUANTITIES, UNITS, key, system, table_key, to_display


#: The sample inventory offered on the inventory page.
EXAMPLE_INVENTORY = Path(__file__).resolve().parents[1] / "example_inventory.csv"

#: Largest scenario upload read. [bytes]
MAX_SCENARIO_UPLOAD = 1_000_000
#: Largest inventory upload read. [bytes]
MAX_INVENTORY_UPLOAD = 20 * 1024 * 1024

#: Inputs without a unit: name -> default (the parts of the inputs given as ranges
#: are added by `uncertain`).
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
