"""The columns an inventory file may have: known names and their roles, units written
in headers, output columns, size limits and problem codes.
"""

from __future__ import annotations

import difflib
import re
from collections.abc import Mapping
from dataclasses import dataclass
from types import MappingProxyType

import pandas as pd

from ..constants import FOOT, PRESSURE_UNITS
from ..errors import InputError

__all__ = [
    "MAX_FILE_BYTES",
    "LOCAL_FILE_BYTES",
    "MAX_ROWS",
    "OUTPUT_COLUMNS",
    "FLAMMABILITY_CODES",
    "PROBLEMS",
]

#: Largest inventory file read by default (the Python API and uploads). [bytes]
#: 20 MB holds some 300 000 typical rows; give `max_bytes` to read larger files.
MAX_FILE_BYTES = 20_000_000

#: Default limit of the command line for local files (``--max-size``). [bytes]
#: 200 MB holds some 4 million typical rows, screened in about 2 GiB of memory.
LOCAL_FILE_BYTES = 200_000_000

#: Data rows parsed per chunk when reading a CSV file (bounds the parser's memory).
READ_CHUNK_ROWS = 200_000

#: Largest number of data rows read from a workbook (a guard against huge sheets).
MAX_ROWS = 1_000_000

#: Columns the screening adds after the input columns, in order.
OUTPUT_COLUMNS = (
    "source_line", "status", "reason",
    "liquid_temperature_k", "worst_case_temperature_k", "vapor_space_pressure_pa",
    "headspace_ppm", "worst_case_ppm", "worst_case_mg_per_m3", "worst_case_percent_lfl",
    "worst_case_flammability", "worst_case_oxygen_percent",
    "twa_ratio", "stel_ratio", "ceiling_ratio", "vapor_hazard_ratio",
    "concern", "concern_driver", "concern_rank",
    "vapor_pressure_method", "vapor_pressure_uncertainty",
)

#: Flammability states by integer code, as `HeadspaceArrays.flammability` holds them
#: (the keys of `estimator.headspace.FLAMMABILITY_STATES`); -1 is an invalid row.
FLAMMABILITY_CODES = ("none", "lean", "flammable", "rich")

#: Why `headspace_arrays` could not compute a row, by integer code.
PROBLEMS = {
    0: "",
    1: "the temperature is not a finite number",
    2: "the temperature is at or below absolute zero",
    3: "the temperature is above the critical temperature of a component",
    4: "the temperature is below the melting point of a component",
    5: "the liquid is not known or its composition cannot be used",
    6: "the pressure is not an absolute pressure between 1 kPa and 10 MPa",
}

TEMPERATURE_SCALES = {"c": "degC", "f": "degF", "k": "K"}
TEMPERATURE_WORDS = {
    "c": "c", "degc": "c", "celsius": "c", "degreesc": "c", "degreescelsius": "c",
    "f": "f", "degf": "f", "fahrenheit": "f", "degreesf": "f", "degreesfahrenheit": "f",
    "k": "k", "kelvin": "k", "kelvins": "k",
}
PRESSURE_FACTORS = {"pa": PRESSURE_UNITS["Pa"], "kpa": PRESSURE_UNITS["kPa"],
                     "bar": PRESSURE_UNITS["bar"], "psia": PRESSURE_UNITS["psi"]}
PRESSURE_LABELS = {"pa": "Pa", "kpa": "kPa", "bar": "bar", "psia": "psia"}
ELEVATION_FACTORS = {"m": 1.0, "ft": FOOT}
LIMIT_KINDS = ("twa", "stel", "ceiling")
LIMIT_LABELS = {"twa": "TWA", "stel": "STEL", "ceiling": "ceiling"}
BASIS_WORDS = {
    "mole": "mole", "mol": "mole", "molar": "mole", "mol%": "mole", "mole%": "mole",
    "mass": "mass", "weight": "mass", "wt": "mass", "wt%": "mass", "mass%": "mass",
    "w/w": "mass", "volume": "volume", "vol": "volume", "vol%": "volume", "v/v": "volume",
}
TEMPERATURE_BASES = ("temperature", "temperature_low", "temperature_high")
#: The "unit" of a column whose header names none: every cell gives its own.
UNIT_IN_CELL = "in each cell"
#: Kinds of `estimator.units` and header examples for such columns.
CELL_KINDS = {"temperature": ("temperature", "temperature_C"),
               "temperature_low": ("temperature", "temperature_low_C"),
               "temperature_high": ("temperature", "temperature_high_C"),
               "pressure": ("pressure", "pressure_kPa"), "elevation": ("length", "elevation_m")}


def _known_columns() -> tuple[str, ...]:
    names = ["container", "liquid", "basis", "fill_percent", "limit_source"]
    names += [f"{base}_{s}" for base in TEMPERATURE_BASES for s in TEMPERATURE_SCALES]
    names += [f"pressure_{u}" for u in PRESSURE_FACTORS]
    names += [f"elevation_{u}" for u in ELEVATION_FACTORS]
    names += [f"{k}_ppm" for k in LIMIT_KINDS]
    return tuple(names)


KNOWN_COLUMNS = _known_columns()


# -------------------------------------------------------------------- header roles

def normalise_header(header) -> str:
    text = str(header).strip().lower()
    text = text.replace("°", "deg").replace("º", "deg")
    text = re.sub(r"[\s\-()\[\]{}]+", "_", text)
    text = re.sub(r"_+", "_", text).strip("_")
    match = re.fullmatch(r"(temperature(?:_low|_high)?)_?(?:deg_?)?([a-z]+)", text)
    if match and match[2] in TEMPERATURE_WORDS:
        return f"{match[1]}_{TEMPERATURE_WORDS[match[2]]}"
    return text


def check_duplicate_headers(headers) -> None:
    seen: dict[str, str] = {}
    for h in headers:
        key = normalise_header(h)
        if key in seen:
            raise InputError("columns", f"the columns {seen[key]!r} and {str(h).strip()!r} "
                             "are the same once case and spaces are ignored; keep one")
        seen[key] = str(h).strip()


@dataclass(frozen=True)
class ColumnRoles:
    roles: Mapping[str, object]     # role -> original column label
    units: Mapping[str, str]        # role -> unit suffix
    unknown: tuple                  # original labels passed through
    notes: tuple[str, ...]


def resolve_columns(frame: pd.DataFrame) -> ColumnRoles:
    labels = list(frame.columns)
    check_duplicate_headers(labels)
    normalised = {label: normalise_header(label) for label in labels}
    clash = [str(label).strip() for label, key in normalised.items() if key in OUTPUT_COLUMNS]
    if clash:
        raise InputError("columns", f"{', '.join(repr(c) for c in clash)} is a column the "
                         "screening writes; rename it in the input")
    roles: dict[str, object] = {}
    units: dict[str, str] = {}
    unknown = []
    for label, key in normalised.items():
        if key in ("container", "liquid", "basis", "fill_percent", "limit_source"):
            roles[key] = label
            continue
        base, _, unit = key.rpartition("_")
        if base in TEMPERATURE_BASES and unit in TEMPERATURE_SCALES:
            role = base
        elif base == "pressure" and unit in PRESSURE_FACTORS:
            role = "pressure"
        elif base == "elevation" and unit in ELEVATION_FACTORS:
            role = "elevation"
        elif base in LIMIT_KINDS and unit == "ppm":
            role = base
        elif key in TEMPERATURE_BASES or key in ("pressure", "elevation"):
            role, unit = key, UNIT_IN_CELL   # each cell carries its own unit
        else:
            unknown.append(label)
            continue
        if role in roles:
            raise InputError("columns", f"{str(roles[role]).strip()!r} and "
                             f"{str(label).strip()!r} give the same quantity; keep one "
                             "column, in one unit")
        roles[role] = label
        units[role] = unit
    present = [str(label).strip() for label in labels]
    missing = [r for r in ("container", "liquid") if r not in roles]
    if missing:
        shown_as = {normalised[label]: text for label, text in zip(labels, present)}
        hints = []
        for role in missing:
            close = difflib.get_close_matches(role, list(shown_as), n=1, cutoff=0.6)
            if close:
                hints.append(f"is {shown_as[close[0]]!r} meant to be {role!r}?")
        raise InputError("columns", f"missing required column(s) "
                         f"{', '.join(repr(m) for m in missing)}; the file has "
                         f"{', '.join(repr(p) for p in present)}"
                         + (f" ({'; '.join(hints)})" if hints else ""))
    if not any(base in roles for base in TEMPERATURE_BASES):
        close = difflib.get_close_matches("temperature_c", [normalised[l] for l in unknown],
                                          n=1, cutoff=0.5)
        hint = ""
        if close:
            shown = next(str(l).strip() for l in unknown if normalised[l] == close[0])
            hint = f" (rename {shown!r} to temperature_C, temperature_F or temperature_K)"
        raise InputError("columns", "no temperature column: add temperature_C, temperature_F "
                         "or temperature_K (or a temperature_low_C / temperature_high_C "
                         f"pair); the file has {', '.join(repr(p) for p in present)}{hint}")
    notes = []
    for label in unknown:
        key = normalised[label]
        close = difflib.get_close_matches(key, KNOWN_COLUMNS, n=1, cutoff=0.8)
        if close:
            notes.append(f"column {str(label).strip()!r} is not a column ullage reads and is "
                         f"passed through unchanged; did you mean {close[0]!r}?")
    if "limit_source" in roles and not any(k in roles for k in LIMIT_KINDS):
        notes.append("a limit_source column is given but no twa_ppm, stel_ppm or "
                     "ceiling_ppm column; no limits are compared")
    return ColumnRoles(MappingProxyType(roles), MappingProxyType(units), tuple(unknown),
                    tuple(notes))


def resolve_roles(table: pd.DataFrame) -> tuple:
    """Container and liquid columns of a screening table (the first two input roles)."""
    found = {}
    for label in table.columns[:list(table.columns).index("source_line")]:
        key = normalise_header(label)
        if key in ("container", "liquid") and key not in found:
            found[key] = label
    return found.get("container", "source_line"), found.get("liquid", "source_line")
