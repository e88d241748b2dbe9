"""Whole-inventory screening: the equilibrium headspace of every tank and drum of a site.

One row per container, all rows in one call. Rows are grouped by liquid (the same
substance, or the same mixture composition) and each group's vapour pressures are
evaluated for all its temperatures in one numpy call, so thousands of rows take a
fraction of a second. A row with bad data is reported, with the line of the file it
came from and the column at fault, and skipped; every other row is still computed.

Input table
-----------
Column names are matched without regard to case; surrounding spaces are ignored,
and inner spaces, hyphens and brackets count as underscores ("Temperature (C)" is
``temperature_c``). Columns ullage does not know are kept and passed through; one
that looks like a misspelling of a known column gets a warning with a suggestion.

===========================  =========================================================
column                       content
===========================  =========================================================
``container``  (required)    Identifier of the tank or drum (text, passed through).
``liquid``     (required)    A substance name, synonym or CAS number ("toluene",
                             "MEK", "108-88-3"), or a mixture written as names with
                             percentages: "toluene 60%, o-xylene 40%" (components
                             separated by commas, semicolons or "+"; "60% toluene,
                             40% o-xylene" also works).
``basis``                    Basis of a mixture's percentages: mole, mass or volume.
                             Blank means mass, as safety data sheets give mass %.
``temperature_<unit>``       Liquid temperature; the unit is in the header, one of
                             ``_C``, ``_F``, ``_K`` (also ``_degC``, ``(°C)``...).
                             Cells hold plain numbers; a cell may repeat the header's
                             unit ("38 degC" under ``temperature_C``) but never
                             another one.
``temperature``              Without a unit in the header, every cell gives its own
                             ("38 degC", "100 degF", "311 K"); a cell without one is
                             refused for its row, naming the column. The same holds
                             for ``pressure`` ("95 kPa") and ``elevation`` ("1200 ft").
``temperature_low_<unit>``   Optional range instead of, or beside, the temperature.
``temperature_high_<unit>``  The worst case uses the high end.
``fill_percent``             Liquid level, 0-100 % (checked, passed through; the
                             equilibrium concentration does not depend on it).
``pressure_<unit>``          Absolute pressure of the vapour space for that row;
                             ``_Pa``, ``_kPa``, ``_bar`` or ``_psia``.
``elevation_<unit>``         Site elevation for that row (``_m`` or ``_ft``): the
                             barometric pressure of the standard atmosphere.
``twa_ppm``, ``stel_ppm``,   Exposure limits for that row, in ppm by volume. A limit
``ceiling_ppm``              is only used with a ``limit_source`` saying where it
``limit_source``             comes from; without one it is rejected for that row.
===========================  =========================================================

Per row, the liquid temperature is the ``temperature`` cell, or the low end of the
range when only a range is given (the high end if only that is given). The worst
case is the high end of the range, or the liquid temperature when there is none.
A row's exposure limits apply to the total vapour of its liquid (for a mixture,
enter the limit meant for the mixture, for instance its lowest component limit).
A cell holding a formula (text beginning with "=") is never evaluated: in a column
the screening reads it makes the row an error; elsewhere it is a caution. Files are
CSV in UTF-8, UTF-16 or UTF-32 (`read_inventory`) or .xlsx workbooks, at most
`MAX_FILE_BYTES` unless a larger limit is given (the command line's ``--max-size``,
`LOCAL_FILE_BYTES` by default). `write_inventory_csv` writes the table with the
cautions as leading "#" comment lines; `inventory_summary_text` is the terminal
summary.

Output columns
--------------
All input columns come first, unchanged, then (names in `OUTPUT_COLUMNS`):

- ``source_line``: the row's line in the file, the header being line 1 (for a
  table passed in directly, its position + 2, as if it had been saved to a file).
- ``status``: "ok", "warning" (computed, with cautions in ``reason``) or "error"
  (not computed; ``reason`` says why).
- ``reason``: every problem, as "line N, column 'name': what is wrong".
- ``liquid_temperature_k``, ``worst_case_temperature_k``, ``vapor_space_pressure_pa``.
- ``headspace_ppm``: total vapour at the liquid temperature [ppm by volume].
- ``worst_case_ppm``, ``worst_case_mg_per_m3`` (at the worst-case temperature and the
  vapour-space pressure), ``worst_case_percent_lfl`` (Le Chatelier for mixtures),
  ``worst_case_flammability`` (none, lean, flammable, rich) and
  ``worst_case_oxygen_percent`` (20.9 % air displaced by the vapour).
- ``twa_ratio``, ``stel_ratio``, ``ceiling_ratio``: worst-case ppm over each limit.
- ``vapor_hazard_ratio``: ppm at the liquid temperature over the lowest accepted
  limit of the row (Popendorf 1984).
- ``concern``: the largest of (a) worst-case ppm over the lowest accepted limit,
  (b) worst-case %LFL over the LFL alarm level, (c) the oxygen the vapour displaces
  (20.9 % minus the worst-case oxygen) over that at the low-oxygen alarm. Each term
  is 1 at its limit or alarm, so a concern of 1 or more means that at least one
  limit or alarm is reached in the worst case. ``concern_driver`` names the largest
  term; ``concern_rank`` is 1 for the highest concern. Error rows have none.
- ``vapor_pressure_method`` (per component for mixtures) and
  ``vapor_pressure_uncertainty`` (the largest stated relative uncertainty, 95 %
  coverage, of the methods used).

The equilibrium headspace is the worst case for a closed space after long
standing; it is a screening estimate, and the real atmosphere must be measured.

References
----------
Raoult's law and Le Chatelier's rule as in `estimator.headspace`. Vapour hazard
ratio: Popendorf, W. (1984), Am. Ind. Hyg. Assoc. J. 45(10), 719-726. Default
alarm levels: US OSHA 29 CFR 1910.146(b), hazardous atmosphere.
"""

from __future__ import annotations

import codecs
import csv
import difflib
import io
import math
import os
import re
import warnings
from collections import defaultdict
from collections.abc import Mapping
from dataclasses import dataclass
from pathlib import Path
from types import MappingProxyType

import numpy as np
import pandas as pd

from ._meta import CAUTIONS
from .checks import ELEVATION_RANGE, check_pressure, pressures_inside
from .constants import (
    FOOT,
    GAS_CONSTANT,
    OXYGEN_IN_AIR,
    PRESSURE_UNITS,
    STANDARD_ATMOSPHERE,
    ZERO_CELSIUS,
)
from .errors import InputError, UllageWarning
from .files import atomic_writer, neutralise_arrow, neutralise_cell
from .headspace import barometric_pressure, le_chatelier
from .limits import FlammabilityAlarms
from .mixtures import Liquid, liquid as make_liquid
from .vapor import METHODS, method_uncertainty

__all__ = [
    "screen_inventory",
    "read_inventory",
    "write_inventory_csv",
    "sorted_by_concern",
    "inventory_summary_text",
    "concern_counts",
    "CONCERN_BANDS",
    "headspace_arrays",
    "parse_liquid",
    "HeadspaceArrays",
    "InventoryScreening",
    "InventorySummary",
    "OUTPUT_COLUMNS",
    "MAX_FILE_BYTES",
    "LOCAL_FILE_BYTES",
    "MAX_ROWS",
    "PROBLEMS",
    "FLAMMABILITY_CODES",
]

#: Largest inventory file read by default (the Python API and uploads). [bytes]
#: 20 MB holds some 300 000 typical rows; give `max_bytes` to read larger files.
MAX_FILE_BYTES = 20_000_000

#: Default limit of the command line for local files (``--max-size``). [bytes]
#: 200 MB holds some 4 million typical rows, screened in about 2 GiB of memory.
LOCAL_FILE_BYTES = 200_000_000

#: Data rows parsed per chunk when reading a CSV file (bounds the parser's memory).
_READ_CHUNK_ROWS = 200_000

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

_TEMPERATURE_SCALES = {"c": "degC", "f": "degF", "k": "K"}
_TEMPERATURE_WORDS = {
    "c": "c", "degc": "c", "celsius": "c", "degreesc": "c", "degreescelsius": "c",
    "f": "f", "degf": "f", "fahrenheit": "f", "degreesf": "f", "degreesfahrenheit": "f",
    "k": "k", "kelvin": "k", "kelvins": "k",
}
_PRESSURE_FACTORS = {"pa": PRESSURE_UNITS["Pa"], "kpa": PRESSURE_UNITS["kPa"],
                     "bar": PRESSURE_UNITS["bar"], "psia": PRESSURE_UNITS["psi"]}
_PRESSURE_LABELS = {"pa": "Pa", "kpa": "kPa", "bar": "bar", "psia": "psia"}
_ELEVATION_FACTORS = {"m": 1.0, "ft": FOOT}
_LIMIT_KINDS = ("twa", "stel", "ceiling")
_LIMIT_LABELS = {"twa": "TWA", "stel": "STEL", "ceiling": "ceiling"}
_BASIS_WORDS = {
    "mole": "mole", "mol": "mole", "molar": "mole", "mol%": "mole", "mole%": "mole",
    "mass": "mass", "weight": "mass", "wt": "mass", "wt%": "mass", "mass%": "mass",
    "w/w": "mass", "volume": "volume", "vol": "volume", "vol%": "volume", "v/v": "volume",
}
_TEMPERATURE_BASES = ("temperature", "temperature_low", "temperature_high")
#: The "unit" of a column whose header names none: every cell gives its own.
_UNIT_IN_CELL = "in each cell"
#: Kinds of `estimator.units` and header examples for such columns.
_CELL_KINDS = {"temperature": ("temperature", "temperature_C"),
               "temperature_low": ("temperature", "temperature_low_C"),
               "temperature_high": ("temperature", "temperature_high_C"),
               "pressure": ("pressure", "pressure_kPa"), "elevation": ("length", "elevation_m")}


def _known_columns() -> tuple[str, ...]:
    names = ["container", "liquid", "basis", "fill_percent", "limit_source"]
    names += [f"{base}_{s}" for base in _TEMPERATURE_BASES for s in _TEMPERATURE_SCALES]
    names += [f"pressure_{u}" for u in _PRESSURE_FACTORS]
    names += [f"elevation_{u}" for u in _ELEVATION_FACTORS]
    names += [f"{k}_ppm" for k in _LIMIT_KINDS]
    return tuple(names)


KNOWN_COLUMNS = _known_columns()


# --------------------------------------------------------------------------- liquids

_NUMBER_TEXT = r"(?:\d+(?:[.,]\d+)?|[.,]\d+)"
_NAME_FIRST = re.compile(
    rf"\s*(?P<name>[^;+%]+?)\s+(?P<amount>{_NUMBER_TEXT})\s*%\s*(?:[,;+]|$)")
_AMOUNT_FIRST = re.compile(
    rf"\s*(?P<amount>{_NUMBER_TEXT})\s*%\s*(?P<name>[^;+%]+?)\s*"
    rf"(?:[,;+](?=\s*{_NUMBER_TEXT}\s*%)|$)")


def _mixture_parts(text: str) -> list[tuple[str, float]] | None:
    """(name, fraction) pairs of a mixture text, or None if it cannot be read."""
    stripped = text.strip()
    for pattern in (_NAME_FIRST, _AMOUNT_FIRST):
        parts: list[tuple[str, float]] = []
        position = 0
        while position < len(stripped):
            match = pattern.match(stripped, position)
            if match is None or match.end() == position:
                parts = []
                break
            parts.append((match["name"].strip(),
                          float(match["amount"].replace(",", ".")) / 100.0))
            position = match.end()
            while position < len(stripped) and stripped[position].isspace():
                position += 1
        if parts:
            return parts
    return None


def parse_liquid(text: str, basis: str = "mass", field: str = "liquid") -> Liquid:
    """A `Liquid` from inventory text: one substance, or names with percentages.

    Parameters
    ----------
    text : str
        A substance name, synonym or CAS number ("toluene", "108-88-3"), or a
        mixture such as "toluene 60%, o-xylene 40%" (or "60% toluene; 40% o-xylene").
    basis : str
        Basis of a mixture's percentages: "mole", "mass" or "volume". Mass by
        default, as safety data sheets give compositions by mass.
    field : str
        Name of the input, for messages.

    Returns
    -------
    Liquid

    Raises
    ------
    InputError
        Unknown substance, unreadable mixture text, or a composition that does not
        add up to 100 % (within 5 points; closer totals are scaled with a warning).

    Examples
    --------
    >>> mix = parse_liquid("toluene 60%, o-xylene 40%")
    >>> mix.names, [round(float(x), 3) for x in mix.mole_fractions]
    (('Toluene', 'o-Xylene'), [0.633, 0.367])
    """
    if not isinstance(text, str) or not text.strip():
        raise InputError(field, "no liquid given: enter a substance name, synonym or CAS "
                         "number, or a mixture such as 'toluene 60%, o-xylene 40%'")
    if "%" not in text:
        return make_liquid(text.strip(), field=field)
    parts = _mixture_parts(text)
    if parts is None:
        raise InputError(field, f"{text.strip()!r} cannot be read as a mixture: write each "
                         "component as a name followed by its percentage, separated by "
                         "commas, for example 'toluene 60%, o-xylene 40%'")
    names = [name.lower() for name, _ in parts]
    if len(set(names)) != len(names):
        raise InputError(field, "a component is listed twice; give each component once")
    return make_liquid(dict(parts), basis, field=field)


@dataclass(frozen=True)
class _Bounds:
    melting: float
    melting_name: str
    critical: float
    critical_name: str


def _bounds(liq: Liquid) -> _Bounds:
    melting, melting_name = -math.inf, ""
    critical, critical_name = math.inf, ""
    from .headspace import lowest_liquid_temperature

    for c in liq.components:
        if c.melting_point is not None and c.melting_point > melting:
            melting, melting_name = c.melting_point, c.name
    if len(liq.components) > 1 and melting_name:
        # components of a mixture may be subcooled (estimator.vapor.SUBCOOLED_LIMIT)
        melting = lowest_liquid_temperature(liq.components)
    for c in liq.components:
        if c.critical_temperature is not None and c.critical_temperature < critical:
            critical, critical_name = c.critical_temperature, c.name
    return _Bounds(melting, melting_name, critical, critical_name)


def _temperature_problems(bounds: _Bounds, temperatures: np.ndarray) -> np.ndarray:
    """Integer codes of `PROBLEMS` for each temperature (0 where usable)."""
    t = temperatures
    codes = np.zeros(t.shape, dtype=np.int8)
    with np.errstate(invalid="ignore"):
        codes[t < bounds.melting] = 4
        codes[t > bounds.critical] = 3
        codes[t <= 0.0] = 2
    codes[~np.isfinite(t)] = 1
    return codes


# ------------------------------------------------------------------ the array core

def _group_order(codes: np.ndarray, count: int) -> tuple[np.ndarray, np.ndarray]:
    """A stable order of the rows by code and the edges of each code's block.

    Codes are -1 (no group, first) to count-1; the rows of code k are
    ``order[edges[k]:edges[k + 1]]``, ascending. Small integer codes sort by radix.
    """
    small = codes.astype(np.int16 if count < 2**15 - 1 else np.int64)
    order = np.argsort(small, kind="stable")
    edges = np.searchsorted(small[order], np.arange(count + 1))
    return order, edges


def _rows_by_code(codes: np.ndarray, count: int) -> list[np.ndarray]:
    """Row positions of each code 0..count-1 (ascending within each), negatives dropped."""
    order, edges = _group_order(codes, count)
    return [order[edges[k]:edges[k + 1]] for k in range(count)]


def _saturation_pressure(sub, t: np.ndarray):
    """Vapour pressure of one substance at many temperatures, best method per value.

    The first correlation is used directly when it covers every temperature (one
    numpy call); otherwise each temperature gets the first correlation whose range
    covers it, as `estimator.vapor.vapor_pressure_estimate` chooses for a single
    temperature, and temperatures no correlation covers get the first one, flagged
    as extrapolated. Below the melting point (a subcooled component of a mixture)
    the correlation is chosen as at 0.5 K above the melting point and extrapolated,
    as `vapor_pressure_estimate` does, and flagged as extrapolated.
    """
    correlations = sub.correlations
    first = correlations[0]
    tm = sub.melting_point
    subcooled = np.zeros(t.shape, dtype=bool) if tm is None else t < tm
    t_pick = np.where(subcooled, (tm or 0.0) + 0.5, t)
    lo = -math.inf if first.tmin is None else first.tmin
    hi = math.inf if first.tmax is None else first.tmax
    if t.size and lo <= t_pick.min() and t_pick.max() <= hi:
        return (np.asarray(first(t), dtype=float), np.zeros(t.shape, dtype=np.int8),
                subcooled)
    pressure = np.empty(t.shape)
    which = np.zeros(t.shape, dtype=np.int8)
    remaining = np.ones(t.shape, dtype=bool)
    for index, correlation in enumerate(correlations):
        lo = -math.inf if correlation.tmin is None else correlation.tmin
        hi = math.inf if correlation.tmax is None else correlation.tmax
        chosen = remaining & (t_pick >= lo) & (t_pick <= hi)
        if chosen.any():
            pressure[chosen] = correlation(t[chosen])
            which[chosen] = index
            remaining &= ~chosen
        if not remaining.any():
            break
    if remaining.any():
        pressure[remaining] = first(t[remaining])
    return pressure, which, remaining | subcooled


@dataclass(frozen=True)
class _LiquidArrays:
    total_volume_fraction: np.ndarray
    mg_per_m3: np.ndarray
    percent_lfl: np.ndarray
    oxygen_percent: np.ndarray
    flammability: np.ndarray
    boiling: np.ndarray
    method_index: np.ndarray      # (n_components, m)
    extrapolated: np.ndarray      # (n_components, m)
    above_own_boiling: np.ndarray  # (n_components, m)


def _evaluate_liquid(liq: Liquid, t: np.ndarray, pressure: np.ndarray,
                     weights: np.ndarray | None = None) -> _LiquidArrays:
    """Equilibrium headspace of one liquid (or component set) at valid temperatures.

    The same equations as `estimator.headspace.headspace`: Raoult's law, vapour
    fractions over max(total vapour pressure, space pressure), Le Chatelier's rule
    and oxygen by displacement. `weights` gives x_i γ_i per row, shape
    (components, rows), for compositions that differ row by row; by default the
    liquid's own.
    """
    n = len(liq.components)
    if n == 1 and weights is None:
        return _evaluate_pure(liq, t, pressure)
    p_sat = np.empty((n, t.size))
    method_index = np.empty((n, t.size), dtype=np.int8)
    extrapolated = np.empty((n, t.size), dtype=bool)
    for i, component in enumerate(liq.components):
        p_sat[i], method_index[i], extrapolated[i] = _saturation_pressure(component, t)
    if weights is None:
        weights = (liq.mole_fractions * liq.activity_coefficients)[:, None]
    p_i = weights * p_sat
    p_sum = p_i.sum(axis=0)
    boiling = p_sum >= pressure
    y = p_i / np.maximum(p_sum, pressure)
    y_total = y.sum(axis=0)
    molar = liq.molar_masses[:, None]
    mg = (y * molar).sum(axis=0) * (pressure / (GAS_CONSTANT * t)) * 1e6
    lfl = np.array([c.lower_flammability_limit or np.nan for c in liq.components])
    ufl = np.array([c.upper_flammability_limit or np.nan for c in liq.components])
    has_lfl = np.isfinite(lfl)
    state = np.zeros(t.size, dtype=np.int8)
    if has_lfl.any():
        lfl_mix = le_chatelier(y, lfl)
        ufl_mix = le_chatelier(y, ufl)
        fuel = y[has_lfl].sum(axis=0)
        with np.errstate(invalid="ignore", divide="ignore"):
            percent = np.where(np.isfinite(lfl_mix), 100.0 * fuel / lfl_mix, 0.0)
            rich = np.isfinite(ufl_mix) & (fuel > ufl_mix)
        state[:] = np.where(~np.isfinite(lfl_mix), 0,
                            np.where(fuel < lfl_mix, 1, np.where(rich, 3, 2)))
    else:
        percent = np.zeros(t.size)
    return _LiquidArrays(
        total_volume_fraction=y_total,
        mg_per_m3=mg,
        percent_lfl=percent,
        oxygen_percent=100.0 * OXYGEN_IN_AIR * (1.0 - y_total),
        flammability=state,
        boiling=boiling,
        method_index=method_index,
        extrapolated=extrapolated,
        above_own_boiling=p_sat >= pressure,
    )


def _evaluate_pure(liq: Liquid, t: np.ndarray, pressure) -> _LiquidArrays:
    """`_evaluate_liquid` for one component, with scalar limits (the common case)."""
    component = liq.components[0]
    p_sat, which, extrapolated = _saturation_pressure(component, t)
    weight = float(liq.mole_fractions[0] * liq.activity_coefficients[0])
    p_i = p_sat if weight == 1.0 else weight * p_sat
    boiling = p_i >= pressure
    y = p_i / np.maximum(p_i, pressure)
    mg = y * (component.molar_mass * 1e6 / GAS_CONSTANT) * (pressure / t)
    lfl = component.lower_flammability_limit
    ufl = component.upper_flammability_limit
    if lfl:
        percent = y * (100.0 / lfl)
        state = np.where(y < lfl, 1, 2).astype(np.int8)
        if ufl:
            state[y > ufl] = 3
    else:
        percent = np.zeros(t.size)
        state = np.zeros(t.size, dtype=np.int8)
    return _LiquidArrays(
        total_volume_fraction=y,
        mg_per_m3=mg,
        percent_lfl=percent,
        oxygen_percent=(100.0 * OXYGEN_IN_AIR) * (1.0 - y),
        flammability=state,
        boiling=boiling,
        method_index=which[None, :],
        extrapolated=extrapolated[None, :],
        above_own_boiling=(p_sat >= pressure)[None, :],
    )


@dataclass(frozen=True)
class HeadspaceArrays:
    """Equilibrium headspace of many rows at once, NaN where a row is not valid.

    Attributes
    ----------
    valid : numpy.ndarray of bool
        Rows that were computed.
    problem : numpy.ndarray of int
        Why a row was not computed: a key of `PROBLEMS` (0 for valid rows).
    total_volume_fraction : numpy.ndarray
        All vapour. [volume fraction]
    mg_per_m3 : numpy.ndarray
        All vapour, at the row's temperature and pressure. [mg/m3]
    percent_lfl : numpy.ndarray
        Fuel over the (Le Chatelier) LFL; 0 without fuel. [% of LFL]
    oxygen_percent : numpy.ndarray
        Oxygen left after the vapour displaces air. [% by volume]
    flammability : numpy.ndarray of int
        Index into `FLAMMABILITY_CODES`, -1 for rows not computed.
    boiling : numpy.ndarray of bool
        Where the total vapour pressure reaches the pressure of the space.
    extrapolated : numpy.ndarray of bool
        Where a component's vapour pressure lies outside every correlation's range.
    """

    valid: np.ndarray
    problem: np.ndarray
    total_volume_fraction: np.ndarray
    mg_per_m3: np.ndarray
    percent_lfl: np.ndarray
    oxygen_percent: np.ndarray
    flammability: np.ndarray
    boiling: np.ndarray
    extrapolated: np.ndarray

    @property
    def ppm(self) -> np.ndarray:
        """All vapour. [ppm by volume]"""
        return self.total_volume_fraction * 1e6

    @property
    def flammability_states(self) -> np.ndarray:
        """The flammability state of each row as text ("" for rows not computed)."""
        words = np.array(FLAMMABILITY_CODES + ("",), dtype=object)
        return words[self.flammability]


def headspace_arrays(liquids, temperatures, pressure=STANDARD_ATMOSPHERE, *,
                     basis: str = "mass") -> HeadspaceArrays:
    """Equilibrium headspace for many (liquid, temperature) rows in grouped numpy calls.

    The array core of `screen_inventory`: rows are grouped by liquid and each
    group's vapour pressures are evaluated in one call per correlation. Rows that
    cannot be computed (unknown liquid; temperature NaN, at or below 0 K, above a
    component's critical temperature or below its melting point; pressure out of
    range) are marked in `problem`, never raised.

    Parameters
    ----------
    liquids : str or array_like of str
        One liquid for every row, or one per row: substance names, synonyms or CAS
        numbers, or mixtures as `parse_liquid` reads them.
    temperatures : array_like
        Liquid (and vapour-space) temperature of each row, 1-D. [K]
    pressure : float or array_like
        Absolute pressure of the vapour space, one value or one per row. [Pa]
    basis : str
        Basis of mixture percentages, "mass" by default.

    Returns
    -------
    HeadspaceArrays

    Examples
    --------
    >>> hs = headspace_arrays(["toluene", "acetone", "no-such-liquid"],
    ...                       [298.15, 298.15, 298.15])
    >>> [round(float(v), -3) for v in hs.ppm[:2]], hs.problem.tolist()
    ([37000.0, 304000.0], [0, 0, 5])
    """
    t = np.asarray(temperatures, dtype=float)
    if t.ndim != 1:
        raise InputError("temperatures", "give a 1-D array, one temperature per row")
    m = t.size
    p = np.broadcast_to(np.asarray(pressure, dtype=float), t.shape)
    if isinstance(liquids, str):
        codes, uniques = np.zeros(m, dtype=np.intp), [liquids]
    else:
        keys = np.asarray(liquids, dtype=object)
        if keys.shape != t.shape:
            raise InputError("liquids", f"got {keys.size} liquids for {m} temperatures; "
                             "give one liquid, or one per temperature")
        codes, uniques = pd.factorize(keys)
    texts = [u.strip() if isinstance(u, str) else "" for u in uniques]
    sets, text_set, text_composition, _, _ = _resolve_liquids(texts, [basis] * len(texts))
    row_set = np.where(codes >= 0, text_set[np.maximum(codes, 0)], -1)
    row_composition = text_composition[np.maximum(codes, 0)]
    order, edges = _group_order(row_set, len(sets))
    t_sorted = t[order]
    scalar_pressure = np.ndim(pressure) == 0
    p_sorted = float(pressure) if scalar_pressure else p[order]
    problem = np.zeros(m, dtype=np.int8)
    inside = pressures_inside(p_sorted)
    problem[np.broadcast_to(~inside, t.shape)] = 6
    problem[:edges[0]] = 5  # rows without a usable liquid sort first
    out = {name: np.full(m, np.nan) for name in
           ("total_volume_fraction", "mg_per_m3", "percent_lfl", "oxygen_percent")}
    flammability = np.full(m, -1, dtype=np.int8)
    boiling = np.zeros(m, dtype=bool)
    extrapolated = np.zeros(m, dtype=bool)
    composition_sorted = row_composition[order]
    for k, component_set in enumerate(sets):
        rows = slice(edges[k], edges[k + 1])
        liq = component_set.liquid
        block = problem[rows]
        codes_t = _temperature_problems(_bounds(liq), t_sorted[rows])
        np.copyto(block, codes_t, where=block == 0)
        good = edges[k] + np.flatnonzero(block == 0)
        if good.size == 0:
            continue
        weights = None if liq.is_pure else component_set.fractions[composition_sorted[good]].T
        res = _evaluate_liquid(liq, t_sorted[good],
                               p_sorted if scalar_pressure else p_sorted[good], weights)
        out["total_volume_fraction"][good] = res.total_volume_fraction
        out["mg_per_m3"][good] = res.mg_per_m3
        out["percent_lfl"][good] = res.percent_lfl
        out["oxygen_percent"][good] = res.oxygen_percent
        flammability[good] = res.flammability
        boiling[good] = res.boiling
        extrapolated[good] = res.extrapolated.any(axis=0)
    unsorted = {}
    for name, values in (("problem", problem), ("flammability", flammability),
                         ("boiling", boiling), ("extrapolated", extrapolated), *out.items()):
        back = np.empty_like(values)
        back[order] = values
        unsorted[name] = back
    return HeadspaceArrays(valid=unsorted["problem"] == 0, **unsorted)


# ------------------------------------------------------------------- reading files

def _size_text(size: int) -> str:
    return f"{size / 1e6:.1f} MB" if size >= 100_000 else f"{size} bytes"


def _too_large(name: str, size: int, limit: int) -> InputError:
    return InputError("file", f"{name} is {_size_text(size)}, above the "
                      f"{_size_text(limit)} limit for one inventory file; split the "
                      "inventory into several files (on the command line, --max-size "
                      "raises the limit)")


def read_inventory(path, sheet: str | None = None, *,
                   max_bytes: int | None = None) -> pd.DataFrame:
    """Read an inventory table from a CSV file or an Excel workbook.

    Cells are read as they are stored: an Excel formula is kept as its text
    ("=B2*2"), never evaluated, so that the screening reports it. Row i of the
    table is line i + 2 of the file (the header is line 1), as a spreadsheet
    numbers its rows (a quoted CSV cell running over several physical lines counts
    as one); empty rows at the end are dropped, empty rows in between are kept (and
    reported by the screening). CSV files are parsed in chunks, so that the
    parser's memory stays small beside the table it builds.

    Parameters
    ----------
    path : str or os.PathLike
        A ``.csv`` file (comma-, semicolon- or tab-separated) in UTF-8, with or
        without a byte-order mark, or in UTF-16 or UTF-32 (recognised by their
        byte-order mark, or by the zero bytes of ASCII text without one); or an
        ``.xlsx``/``.xlsm`` workbook (needs openpyxl).
    sheet : str, optional
        Worksheet name; the first sheet by default.
    max_bytes : int, optional
        Largest file read; `MAX_FILE_BYTES` by default. [bytes]

    Returns
    -------
    pandas.DataFrame
        CSV cells as text; workbook cells as stored (numbers, text, formula text).

    Raises
    ------
    InputError
        Missing, empty or oversized file, a CSV in an encoding that is not UTF-8,
        UTF-16 or UTF-32, an unreadable workbook, a header without data rows.
    """
    limit = MAX_FILE_BYTES if max_bytes is None else int(max_bytes)
    path = Path(path)
    name = path.name
    if not path.is_file():
        raise InputError("file", f"{name}: no such file")
    size = path.stat().st_size
    if size > limit:
        raise _too_large(name, size, limit)
    if size == 0:
        raise InputError("file", f"{name} is empty: it needs a header line with the column "
                         "names (at least container, liquid and a temperature) and one row "
                         "per container")
    suffix = path.suffix.lower()
    if suffix in (".csv", ".txt", ".tsv"):
        frame = _read_csv(path)
    elif suffix in (".xlsx", ".xlsm"):
        frame = _read_workbook(path, sheet)
    elif suffix == ".xls":
        raise InputError("file", f"{name} is an old-style .xls workbook; save it as .xlsx "
                         "or as CSV UTF-8")
    else:
        raise InputError("file", f"{name}: {suffix or 'no extension'} is not a table ullage "
                         "reads; give a .csv file or an .xlsx workbook")
    if frame.shape[1] == 0:
        raise InputError("file", f"{name} has no column names in its first line")
    if len(frame) == 0:
        raise InputError("file", f"{name} has a header line but no data rows")
    return frame


#: Byte-order marks and the codec that reads the text after them (UTF-32 first:
#: its little-endian mark begins with that of UTF-16).
_BYTE_ORDER_MARKS = (
    (codecs.BOM_UTF32_LE, "utf-32-le", "UTF-32"), (codecs.BOM_UTF32_BE, "utf-32-be", "UTF-32"),
    (codecs.BOM_UTF8, "utf-8", "UTF-8"),
    (codecs.BOM_UTF16_LE, "utf-16-le", "UTF-16"), (codecs.BOM_UTF16_BE, "utf-16-be", "UTF-16"),
)


def _encoding_of(start: bytes) -> tuple[str, int, str]:
    """(codec, bytes to skip, name) of a CSV file from its first bytes."""
    for mark, codec, label in _BYTE_ORDER_MARKS:
        if start.startswith(mark):
            return codec, len(mark), label
    # No mark: ASCII text in UTF-16/32 shows its zero bytes in a fixed pattern.
    sample = start[:4096]
    usable = len(sample) - len(sample) % 4
    if usable >= 4 and b"\x00" in sample[:usable]:
        quads = [sample[i:i + 4] for i in range(0, usable, 4)]
        if all(q[1:] == b"\x00\x00\x00" for q in quads):
            return "utf-32-le", 0, "UTF-32"
        if all(q[:3] == b"\x00\x00\x00" for q in quads):
            return "utf-32-be", 0, "UTF-32"
        if all(q[1] == 0 and q[3] == 0 for q in quads):
            return "utf-16-le", 0, "UTF-16"
        if all(q[0] == 0 and q[2] == 0 for q in quads):
            return "utf-16-be", 0, "UTF-16"
    return "utf-8", 0, "UTF-8"


def _check_decodes(path: Path, codec: str, skip: int, label: str) -> str:
    """Decode the whole file block by block, keeping nothing; return the first line.

    A byte that does not decode is reported with its line.
    """
    decoder = codecs.getincrementaldecoder(codec)("strict")
    newline = "\n".encode(codec)
    lines_before = 0
    first = ""
    with open(path, "rb") as handle:
        handle.seek(skip)
        tail = b""
        while True:
            block = handle.read(1 << 22)
            try:
                text = decoder.decode(block, final=not block)
            except UnicodeDecodeError as exc:
                data = tail + block
                bad = len(tail) + exc.start
                line = lines_before + data[:bad].count(newline) + 1
                if label == "UTF-8" and b"\x00" in data[:4096] + tail:
                    advice = ("It holds zero bytes, as UTF-16 or UTF-32 text without a "
                              "byte-order mark does")
                elif label == "UTF-8":
                    advice = ("The file is probably saved in a legacy encoding such as "
                              "Latin-1 or Windows-1252")
                else:
                    advice = (f"The file starts as {label} text but is not valid {label} "
                              "there")
                raise InputError(
                    "file", f"{path.name} is not {label} text: byte "
                    f"0x{data[bad:bad + 1].hex()} on line {line} is not valid {label}. "
                    f"{advice}; save it again as 'CSV UTF-8' (in Excel: Save As, CSV UTF-8) "
                    "and screen it again") from None
            if "\n" not in first and len(first) < (1 << 24):
                first += text
            if not block:
                break
            tail = decoder.getstate()[0]
            lines_before += text.count("\n")
    return first.split("\n", 1)[0]


def _has_text(path: Path, codec: str, skip: int) -> bool:
    with open(path, encoding=codec, newline="") as handle:
        handle.seek(skip)
        return any(line.strip() for line in handle)


def _read_csv(path: Path) -> pd.DataFrame:
    with open(path, "rb") as handle:
        start = handle.read(4096)
    codec, skip, label = _encoding_of(start)
    head = _check_decodes(path, codec, skip, label)
    if not head.strip() and not _has_text(path, codec, skip):
        raise InputError("file", f"{path.name} holds only blank lines: it needs a header "
                         "line and one row per container")
    first = head.rstrip("\r")
    separator = max((",", ";", "\t"), key=first.count)
    header = next(csv.reader([first], delimiter=separator))
    _check_duplicate_headers(header)
    try:
        with open(path, "rb") as handle:
            handle.seek(skip)
            reader = pd.read_csv(handle, sep=separator, dtype=str, keep_default_na=False,
                                 skip_blank_lines=False, encoding=codec,
                                 chunksize=_READ_CHUNK_ROWS)
            chunks = list(reader)
    except pd.errors.EmptyDataError:
        raise InputError("file", f"{path.name} has no column names in its first line") from None
    except pd.errors.ParserError as exc:
        raise InputError("file", f"{path.name} cannot be read as CSV: {exc}; check that "
                         "every row has as many fields as the header") from None
    frame = chunks[0] if len(chunks) == 1 else pd.concat(chunks, ignore_index=True)
    del chunks
    return _drop_trailing_blank_rows(frame)


def _is_blank(value) -> bool:
    if value is None:
        return True
    if isinstance(value, float):
        return math.isnan(value)
    if isinstance(value, str):
        return not value.strip()
    return False


def _drop_trailing_blank_rows(frame: pd.DataFrame) -> pd.DataFrame:
    if len(frame) == 0:
        return frame
    if not all(_is_blank(v) for v in frame.iloc[-1].tolist()):
        return frame
    blank = frame.isna() | frame.apply(lambda col: col.astype(str).str.strip() == "")
    filled = np.flatnonzero(~blank.all(axis=1).to_numpy())
    last = filled[-1] + 1 if filled.size else 0
    return frame.iloc[:last].reset_index(drop=True)


def _read_workbook(path: Path, sheet: str | None) -> pd.DataFrame:
    try:
        import openpyxl
        from openpyxl.utils import get_column_letter
    except ImportError:
        raise InputError("file", "reading Excel workbooks needs openpyxl (pip install "
                         "'ullage[excel]'); or save the sheet as CSV UTF-8") from None
    try:
        book = openpyxl.load_workbook(path, read_only=True, data_only=False)
    except Exception as exc:  # openpyxl raises zipfile, KeyError and its own errors
        raise InputError("file", f"{path.name} cannot be opened as an Excel workbook "
                         f"({type(exc).__name__}: {exc})") from None
    try:
        if sheet is None:
            ws = book.worksheets[0]
        elif sheet in book.sheetnames:
            ws = book[sheet]
        else:
            raise InputError("sheet", f"{path.name} has no sheet {sheet!r}; it has "
                             f"{', '.join(repr(s) for s in book.sheetnames)}")
        rows = []
        for index, row in enumerate(ws.iter_rows()):
            if index > MAX_ROWS:
                raise InputError("file", f"{path.name} has more than {MAX_ROWS} rows; "
                                 "split the inventory into several files")
            rows.append([_cell_value(cell) for cell in row])
    finally:
        book.close()
    if not rows or all(_is_blank(v) for v in rows[0]):
        raise InputError("file", f"row 1 of sheet {ws.title!r} in {path.name} is empty; "
                         "put the column names in row 1")
    width = max(len(r) for r in rows)
    while width and all(len(r) < width or _is_blank(r[width - 1]) for r in rows):
        width -= 1
    header = []
    for i in range(width):
        value = rows[0][i] if i < len(rows[0]) else None
        header.append(f"column {get_column_letter(i + 1)}" if _is_blank(value)
                      else str(value).strip())
    _check_duplicate_headers(header)
    body = [list(r[:width]) + [None] * (width - len(r[:width])) for r in rows[1:]]
    frame = pd.DataFrame(body, columns=header, dtype=object)
    return _drop_trailing_blank_rows(frame)


def _cell_value(cell):
    value = cell.value
    if getattr(cell, "data_type", None) == "f" and not isinstance(value, str):
        text = getattr(value, "text", None)
        value = text if isinstance(text, str) else "=(formula)"
        if not value.startswith("="):
            value = "=" + value
    return value


# -------------------------------------------------------------------- header roles

def _normalise_header(header) -> str:
    text = str(header).strip().lower()
    text = text.replace("°", "deg").replace("º", "deg")
    text = re.sub(r"[\s\-()\[\]{}]+", "_", text)
    text = re.sub(r"_+", "_", text).strip("_")
    match = re.fullmatch(r"(temperature(?:_low|_high)?)_?(?:deg_?)?([a-z]+)", text)
    if match and match[2] in _TEMPERATURE_WORDS:
        return f"{match[1]}_{_TEMPERATURE_WORDS[match[2]]}"
    return text


def _check_duplicate_headers(headers) -> None:
    seen: dict[str, str] = {}
    for h in headers:
        key = _normalise_header(h)
        if key in seen:
            raise InputError("columns", f"the columns {seen[key]!r} and {str(h).strip()!r} "
                             "are the same once case and spaces are ignored; keep one")
        seen[key] = str(h).strip()


@dataclass(frozen=True)
class _Columns:
    roles: Mapping[str, object]     # role -> original column label
    units: Mapping[str, str]        # role -> unit suffix
    unknown: tuple                  # original labels passed through
    notes: tuple[str, ...]


def _resolve_columns(frame: pd.DataFrame) -> _Columns:
    labels = list(frame.columns)
    _check_duplicate_headers(labels)
    normalised = {label: _normalise_header(label) for label in labels}
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
        if base in _TEMPERATURE_BASES and unit in _TEMPERATURE_SCALES:
            role = base
        elif base == "pressure" and unit in _PRESSURE_FACTORS:
            role = "pressure"
        elif base == "elevation" and unit in _ELEVATION_FACTORS:
            role = "elevation"
        elif base in _LIMIT_KINDS and unit == "ppm":
            role = base
        elif key in _TEMPERATURE_BASES or key in ("pressure", "elevation"):
            role, unit = key, _UNIT_IN_CELL   # each cell carries its own unit
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
    if not any(base in roles for base in _TEMPERATURE_BASES):
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
    if "limit_source" in roles and not any(k in roles for k in _LIMIT_KINDS):
        notes.append("a limit_source column is given but no twa_ppm, stel_ppm or "
                     "ceiling_ppm column; no limits are compared")
    return _Columns(MappingProxyType(roles), MappingProxyType(units), tuple(unknown),
                    tuple(notes))


# --------------------------------------------------------------------- cell parsing

_CELL_NUMBER = re.compile(
    r"^\s*([-+]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")


def _is_text_column(column: pd.Series) -> bool:
    """Whether a column can hold text (object or string dtype)."""
    return (pd.api.types.is_object_dtype(column.dtype)
            or pd.api.types.is_string_dtype(column.dtype))


def _text_cells(column: pd.Series) -> tuple[pd.Series, np.ndarray]:
    """Stripped text of each cell (a text Series, "" where missing) and the blank mask."""
    missing = column.isna().to_numpy()
    if missing.any():
        column = column.where(~missing, "")
    text = column.astype("str").str.strip().reset_index(drop=True)
    return text, (text == "").to_numpy(dtype=bool)


def _is_formula(column: pd.Series) -> np.ndarray:
    """Text cells beginning with "=": formulas (or text a spreadsheet would run).

    Numbers never print with a leading "=", so every cell is looked at as text.
    """
    if not _is_text_column(column):
        return np.zeros(len(column), dtype=bool)
    if column.dtype == object:
        column = column.where(column.notna(), "").astype(str)
    return column.str.lstrip().str.startswith("=").fillna(False).to_numpy(dtype=bool)


def _number_cells(column: pd.Series, unit_words: Mapping[str, str], unit: str,
                  label: str) -> tuple[np.ndarray, np.ndarray, tuple[np.ndarray, np.ndarray]]:
    """Numbers of a column in its header unit.

    Returns the values (NaN where blank or unusable), the blank mask and the
    problems as (positions, texts). Cells that are not plain numbers are parsed
    once per distinct content.
    """
    n = len(column)
    none = (np.empty(0, dtype=np.intp), np.empty(0, dtype=object))
    if pd.api.types.is_bool_dtype(column):
        positions = np.arange(n)
        texts = np.array([f"{v!r} is not a number in {label}" for v in pd.unique(column)],
                         dtype=object)[pd.factorize(column)[0]]
        return np.full(n, np.nan), np.zeros(n, dtype=bool), (positions, texts)
    if pd.api.types.is_numeric_dtype(column):
        values = column.to_numpy(dtype=float, na_value=np.nan).copy()
        blank = np.isnan(values)
        bad = np.flatnonzero(np.isinf(values))
        values[bad] = np.nan
        return values, blank, (bad, np.array([f"{column.iat[i]!r} is not a finite number"
                                              for i in bad], dtype=object))
    values = _fast_numbers(column)
    if values is None:
        values = pd.to_numeric(column, errors="coerce").to_numpy(dtype=float, na_value=np.nan)
    values = values.copy()
    if column.dtype == object:
        booleans = column.map(type).isin([bool, np.bool_]).to_numpy()
        values[booleans] = np.nan
    blank = np.zeros(n, dtype=bool)
    look = np.flatnonzero(~np.isfinite(values))
    if look.size == 0:
        return values, blank, none
    cells = column.iloc[look]
    missing = cells.isna().to_numpy()
    stripped = cells.where(~cells.isna(), "").astype(str).str.strip().to_numpy(dtype=object)
    empty = missing | (stripped == "")
    blank[look[empty]] = True
    look = look[~empty]
    if look.size == 0:
        return values, blank, none
    raw = column.to_numpy(dtype=object)[look]
    codes, distinct = pd.factorize(pd.Series(raw, dtype=object).map(repr))
    first = np.unique(codes, return_index=True)[1]
    parsed = [_parse_text_number(raw[i], unit_words, unit, label) for i in first]
    numbers = np.array([p[0] for p in parsed], dtype=float)
    problems = np.array([p[1] for p in parsed], dtype=object)
    values[look] = numbers[codes]
    bad = problems[codes] != ""
    return values, blank, (look[bad], problems[codes][bad])


def _unit_cells(column: pd.Series, role: str, label
                ) -> tuple[np.ndarray, np.ndarray, tuple[np.ndarray, np.ndarray]]:
    """Quantities of a column whose header names no unit, each cell with its own, in SI.

    Every distinct cell is converted once (`estimator.units.parse_quantity`); a
    number without a unit is refused for its row, naming the column.
    """
    from .units import parse_quantity

    kind, example = _CELL_KINDS[role]
    n = len(column)
    blank = _blank_cells(column)
    values = np.full(n, np.nan)
    look = np.flatnonzero(~blank)
    if look.size == 0:
        return values, blank, (np.empty(0, dtype=np.intp), np.empty(0, dtype=object))
    raw = column.to_numpy(dtype=object)[look]
    codes, distinct = pd.factorize(pd.Series(raw, dtype=object).map(repr))
    first = np.unique(codes, return_index=True)[1]
    numbers, problems = [], []
    for cell in raw[first]:
        text = cell.strip() if isinstance(cell, str) else cell
        if isinstance(text, str) and text.startswith("="):
            numbers.append(math.nan)
            problems.append(f"holds a formula ({text[:40]!r}); formulas are not evaluated: "
                            "enter the value itself")
            continue
        try:
            numbers.append(parse_quantity(text, kind, str(label).strip()))
            problems.append("")
        except InputError as exc:
            numbers.append(math.nan)
            hint = (f"; or name the unit in the header, for example {example!r}"
                    if "no unit" in exc.reason else "")
            problems.append(exc.reason + hint)
    numbers, problems = np.array(numbers, dtype=float), np.array(problems, dtype=object)
    values[look] = numbers[codes]
    bad = problems[codes] != ""
    return values, blank, (look[bad], problems[codes][bad])


def _fast_numbers(column: pd.Series) -> np.ndarray | None:
    """Plain numbers of an Arrow-backed text column in one cast (None if any cell is not).

    Blank cells become NaN; a column with any other text is left to the full parser.
    """
    try:
        import pyarrow as pa
        import pyarrow.compute as pc
    except ImportError:  # pragma: no cover - pyarrow is a dependency
        return None
    if column.dtype == object or not isinstance(getattr(column, "array", None),
                                                pd.api.extensions.ExtensionArray):
        return None
    try:
        arrow = pa.chunked_array(pa.array(column.array)) if not hasattr(
            column.array, "_pa_array") else column.array._pa_array
        arrow = pc.if_else(pc.equal(pc.utf8_trim_whitespace(arrow), ""), None, arrow)
        return pc.cast(arrow, pa.float64()).to_numpy(zero_copy_only=False).astype(float)
    except (pa.ArrowInvalid, pa.ArrowTypeError, pa.ArrowNotImplementedError, TypeError):
        return None


def _parse_text_number(cell, unit_words, unit: str, label: str) -> tuple[float, str]:
    if isinstance(cell, bool) or not isinstance(cell, (str, int, float)):
        return math.nan, f"{cell!r} is not a number in {label}"
    text = str(cell).strip()
    if text.startswith("="):
        return math.nan, (f"holds a formula ({text[:40]!r}); formulas are not evaluated: "
                          "enter the value itself")
    match = _CELL_NUMBER.match(text)
    if not match:
        return math.nan, f"{text!r} is not a number in {label}"
    number_text, unit_text = match.groups()
    if "," in number_text:
        if "." in number_text or number_text.count(",") > 1:
            return math.nan, f"{text!r} is not a number in {label}"
        number_text = number_text.replace(",", ".")
    number = float(number_text)
    if not math.isfinite(number):
        return math.nan, f"{text!r} is not a finite number"
    if unit_text:
        word = re.sub(r"[\s°º.]", "", unit_text.lower())
        if unit_words.get(word) != unit:
            return math.nan, (f"{text!r} is not a number in {label}, the unit of the "
                              "column header; give plain numbers in that unit")
    return number, ""


# --------------------------------------------------------------------- the screening

@dataclass(frozen=True)
class InventorySummary:
    """Counts and the worst rows of a screening.

    Attributes
    ----------
    rows : int
        Rows screened (every input row).
    counts : mapping
        "ok", "warning" and "error" -> number of rows.
    at_or_above_alarm : int
        Computed rows with a concern of 1 or more (a limit or alarm reached).
    liquids : int
        Distinct liquids (substance or composition) evaluated.
    worst : pandas.DataFrame
        The rows of highest concern, highest first (see `sorted_by_concern`).
    """

    rows: int
    counts: Mapping[str, int]
    at_or_above_alarm: int
    liquids: int
    worst: pd.DataFrame


@dataclass(frozen=True)
class InventoryScreening:
    """The result of `screen_inventory`.

    Attributes
    ----------
    table : pandas.DataFrame
        One row per input row, in input order: the input columns, then
        `OUTPUT_COLUMNS`.
    summary : InventorySummary
    cautions : tuple of str
        `estimator.CAUTIONS`, shown with every result.
    warnings : tuple of str
        Notes on the table as a whole (columns not read, duplicate containers).
    pressure : float
        Vapour-space pressure used for rows without their own. [Pa]
    alarms : FlammabilityAlarms
        The LFL and oxygen alarm levels the concern uses.
    source : str
        The file name, or "table" for a DataFrame.
    """

    table: pd.DataFrame
    summary: InventorySummary
    cautions: tuple[str, ...]
    warnings: tuple[str, ...]
    pressure: float
    alarms: FlammabilityAlarms
    source: str


def sorted_by_concern(table) -> pd.DataFrame:
    """The screened rows, highest concern first, without losing any row.

    Rows of equal concern keep their input order; rows not computed (errors)
    come last, in input order.

    Parameters
    ----------
    table : pandas.DataFrame or InventoryScreening
        A screening table (or result).

    Returns
    -------
    pandas.DataFrame
        The same rows and columns, reordered.
    """
    frame = table.table if isinstance(table, InventoryScreening) else table
    if "concern" not in frame.columns or "source_line" not in frame.columns:
        raise InputError("table", "this is not a screening table (no concern column); "
                         "pass the result of screen_inventory")
    return frame.sort_values(["concern", "source_line"], ascending=[False, True],
                             na_position="last", kind="stable")


#: Bands of the concern counted in the terminal summary: (label, low, high).
CONCERN_BANDS = (
    ("1 or more (a limit or alarm reached)", 1.0, math.inf),
    ("0.5 to 1", 0.5, 1.0),
    ("0.1 to 0.5", 0.1, 0.5),
    ("below 0.1", -math.inf, 0.1),
)


def concern_counts(table) -> dict[str, int]:
    """Rows per band of `CONCERN_BANDS`, then those without a concern (not computed).

    Parameters
    ----------
    table : pandas.DataFrame or InventoryScreening

    Returns
    -------
    dict
        Band label -> number of rows; "not computed" for rows without a concern.
    """
    frame = table.table if isinstance(table, InventoryScreening) else table
    concern = frame["concern"].to_numpy(dtype=float)
    counts = {}
    for label, low, high in CONCERN_BANDS:
        with np.errstate(invalid="ignore"):
            counts[label] = int(((concern >= low) & (concern < high)).sum())
    counts["not computed"] = int(np.isnan(concern).sum())
    return counts


def _short(values, width: int) -> list[str]:
    text = pd.Series(values, dtype=object).fillna("").astype(str)
    longer = text.str.len() > width
    text[longer] = text[longer].str[:width - 1] + "~"
    return text.tolist()


def inventory_summary_text(result: InventoryScreening, top: int = 10,
                           output=None) -> str:
    """A summary of a screening for the terminal, whatever the number of rows.

    Counts by status and by band of concern, the `top` rows of highest concern,
    every row that could not be computed with its reason, and the notes on the
    table. The cautions are the caller's to print with it.

    Parameters
    ----------
    result : InventoryScreening
    top : int
        Rows of highest concern listed.
    output : str or os.PathLike, optional
        Where the full table was written, to say so.

    Returns
    -------
    str
    """
    from .limits import format_ppm

    table = result.table
    summary = result.summary
    counts = summary.counts
    lines = [f"Inventory {result.source}: {summary.rows} row(s), {summary.liquids} distinct "
             f"liquid(s); vapour-space pressure {result.pressure / 1000:.4g} kPa unless a "
             "row gives its own.",
             "SCREENING ESTIMATE: measure with calibrated instruments before entry.", "",
             f"Status: {counts['ok']} computed without cautions, {counts['warning']} computed with cautions, "
             f"{counts['error']} not computed.",
             "Concern in the worst case (worst-case ppm over the lowest limit, %LFL over "
             f"the {result.alarms.percent_lfl:g} % alarm, oxygen displaced over that at "
             "the low-oxygen alarm):"]
    lines += [f"  {label:<40} {count:>9}" for label, count in concern_counts(table).items()]
    concern = table["concern"].to_numpy(dtype=float)
    order = np.argsort(np.where(np.isnan(concern), np.inf, -concern), kind="stable")
    shown = order[:max(int(top), 0)]
    shown = shown[np.isfinite(concern[shown])]
    roles = _resolve_roles(table)
    if shown.size:
        lines += ["", f"Highest concern ({shown.size} of {summary.rows} rows):",
                  f"{'rank':>5} {'line':>7}  {'container':<22} {'liquid':<26} "
                  f"{'worst ppm':>10} {'% LFL':>7} {'O2 %':>5} {'concern':>8}  driver"]
        part = table.iloc[shown]
        columns = zip(part["concern_rank"].tolist(), part["source_line"].tolist(),
                      _short(part[roles[0]], 22), _short(part[roles[1]], 26),
                      part["worst_case_ppm"].tolist(), part["worst_case_percent_lfl"].tolist(),
                      part["worst_case_oxygen_percent"].tolist(), part["concern"].tolist(),
                      part["concern_driver"].tolist(), part["status"].tolist())
        for rank, line, container, liquid, ppm, lfl, oxygen, value, driver, status in columns:
            lines.append(f"{rank:>5} {line:>7}  {container:<22} {liquid:<26} "
                         f"{format_ppm(ppm):>10} {lfl:>7.3g} {oxygen:>5.3g} {value:>8.3g}  "
                         f"{driver}" + ("  (with cautions)" if status == "warning" else ""))
    failed = table["status"].to_numpy(dtype=object) == "error"
    if failed.any():
        part = table[failed]
        lines += ["", f"Not computed ({int(failed.sum())} row(s)):"]
        text = ("  " + pd.Series(_short(part[roles[0]], 30), dtype=object) + ": "
                + part["reason"].astype(str).to_numpy(dtype=object))
        lines += text.tolist()
    lines += [f"note: {w}" for w in result.warnings]
    if counts["warning"]:
        lines.append(f"{counts['warning']} computed row(s) carry cautions; the reason column "
                     "of the table gives them.")
    lines.append("")
    lines.append(f"Every row, with its reasons, is in {output}." if output else
                 "Write every row, with its reasons, with --output FILE.csv.")
    return "\n".join(lines)


def _resolve_roles(table: pd.DataFrame) -> tuple:
    """Container and liquid columns of a screening table (the first two input roles)."""
    found = {}
    for label in table.columns[:list(table.columns).index("source_line")]:
        key = _normalise_header(label)
        if key in ("container", "liquid") and key not in found:
            found[key] = label
    return found.get("container", "source_line"), found.get("liquid", "source_line")


class _Issues:
    """Errors and cautions per row, as 'line N, column 'x': text', gathered as arrays.

    `error` and `caution` take one row or an array of rows, and one text for all
    of them or one text per row; the reasons are joined in `assemble` with array
    operations, so that a caution on every row costs no Python loop per row.
    """

    def __init__(self, lines: np.ndarray):
        self.lines = lines
        self._records: list[tuple[int, np.ndarray, object, object]] = []

    def _add(self, kind: int, rows, column, text) -> None:
        rows = np.atleast_1d(np.asarray(rows, dtype=np.intp))
        if rows.size == 0:
            return
        if not isinstance(text, str):
            text = np.asarray(text, dtype=object)
        self._records.append((kind, rows, column, text))

    def error(self, rows, column, text) -> None:
        self._add(0, rows, column, text)

    def caution(self, rows, column, text) -> None:
        self._add(1, rows, column, text)

    def error_mask(self, n: int) -> np.ndarray:
        mask = np.zeros(n, dtype=bool)
        for kind, rows, _, _ in self._records:
            if kind == 0:
                mask[rows] = True
        return mask

    def assemble(self, n: int) -> tuple[np.ndarray, np.ndarray]:
        """Status ("ok", "warning", "error") and reason of every row.

        A row's errors come first, then its cautions, each in the order found,
        without repeats, joined by "; ".
        """
        status = _same_text(n, "ok")
        reason = _same_text(n, "")
        if not self._records:
            return status, reason
        rows_all, kinds, order_all, texts = [], [], [], []
        for seq, (kind, rows, column, text) in enumerate(self._records):
            where = f", column {str(column).strip()!r}: " if column is not None else ": "
            prefix = "line " + self.lines[rows].astype(str).astype(object) + where
            texts.append(prefix + text)
            rows_all.append(rows)
            kinds.append(np.full(rows.size, kind, dtype=np.int8))
            order_all.append(np.full(rows.size, seq, dtype=np.intp))
        r = np.concatenate(rows_all)
        k = np.concatenate(kinds)
        t = np.concatenate(texts)
        order = np.lexsort((np.concatenate(order_all), k, r))
        r, k, t = r[order], k[order], t[order]
        keep = ~pd.DataFrame({"r": r, "t": t}).duplicated().to_numpy()
        r, k, t = r[keep], k[keep], t[keep]
        status[r[k == 1]] = "warning"
        status[r[k == 0]] = "error"
        starts = np.flatnonzero(np.r_[True, r[1:] != r[:-1]])
        rank = np.arange(r.size) - np.repeat(starts, np.diff(np.r_[starts, r.size]))
        first = rank == 0
        reason[r[first]] = t[first]
        for position in range(1, int(rank.max()) + 1):
            at = rank == position
            reason[r[at]] = reason[r[at]] + ("; " + t[at])
        return status, reason


def _same_text(n: int, text: str) -> np.ndarray:
    """An object array of `n` references to one string (np.full would copy it n times)."""
    out = np.empty(n, dtype=object)
    out.fill(text)
    return out


def _format_each(values, spec: str) -> np.ndarray:
    """`format(value, spec)` of each value, formatting each distinct value once."""
    values = np.asarray(values, dtype=float)
    if values.size == 0:
        return np.empty(0, dtype=object)
    distinct, inverse = np.unique(values, return_inverse=True)
    shown = np.array([format(float(v), spec) for v in distinct], dtype=object)
    return shown[np.asarray(inverse).ravel()]


def _format_temperature(kelvin: float, unit: str) -> str:
    if unit == "c":
        return f"{kelvin - ZERO_CELSIUS:.1f} degC"
    if unit == "f":
        return f"{(kelvin - ZERO_CELSIUS) * 9 / 5 + 32:.1f} degF"
    return f"{kelvin:.1f} K"


def _to_kelvin(values: np.ndarray, unit: str) -> np.ndarray:
    if unit == "c":
        return values + ZERO_CELSIUS
    if unit == "f":
        return (values - 32.0) * (5.0 / 9.0) + ZERO_CELSIUS
    return values.copy()


def screen_inventory(source, pressure=STANDARD_ATMOSPHERE, alarms=FlammabilityAlarms(), *,
                     elevation=None, sheet: str | None = None,
                     worst_count: int = 10, max_bytes: int | None = None) -> InventoryScreening:
    """Screen the equilibrium headspace of every container of an inventory.

    The columns read and written are described in the module documentation of
    `estimator.inventory`. Bad rows are reported in ``status`` and ``reason`` and
    skipped; all other rows are computed.

    Parameters
    ----------
    source : pandas.DataFrame, str or os.PathLike
        The inventory, or the path of a CSV file or an Excel workbook
        (`read_inventory`).
    pressure : float
        Absolute vapour-space pressure for rows without their own pressure or
        elevation; 1 atm by default. [Pa]
    alarms : FlammabilityAlarms
        %LFL and oxygen alarm levels for the concern; US OSHA 29 CFR 1910.146(b)
        levels by default.
    elevation : float, optional
        Site elevation for the whole file, instead of `pressure`: the barometric
        pressure of the standard atmosphere there. [m]
    sheet : str, optional
        Worksheet of a workbook; the first by default.
    worst_count : int
        Rows listed in ``summary.worst``.
    max_bytes : int, optional
        Largest file read (`read_inventory`); `MAX_FILE_BYTES` by default. [bytes]

    Returns
    -------
    InventoryScreening

    Raises
    ------
    InputError
        For problems with the table as a whole: unreadable file, missing required
        columns, no data rows, ambiguous headers, a bad `pressure` or `elevation`.
    """
    if isinstance(source, pd.DataFrame):
        frame, name = source, "table"
        if frame.shape[1] == 0:
            raise InputError("table", "has no columns")
        if len(frame) == 0:
            raise InputError("table", "has no rows")
    elif isinstance(source, (str, os.PathLike)):
        frame, name = read_inventory(source, sheet, max_bytes=max_bytes), Path(source).name
    else:
        raise InputError("source", "give a pandas DataFrame or the path of a CSV or .xlsx "
                         f"file, not {type(source).__name__}")
    if not isinstance(alarms, FlammabilityAlarms):
        raise InputError("alarms", "give a FlammabilityAlarms")
    if elevation is not None:
        if pressure != STANDARD_ATMOSPHERE:
            raise InputError("elevation", "give either the pressure or the site elevation, "
                             "not both")
        file_pressure = float(barometric_pressure(float(elevation)))
    else:
        file_pressure = check_pressure(pressure)
    columns = _resolve_columns(frame)
    table, n_liquids, row_notes = _screen(frame, columns, file_pressure, alarms)
    notes = list(columns.notes) + row_notes
    for note in notes:
        warnings.warn(note, UllageWarning, stacklevel=2)
    status = table["status"]
    counts = {s: int((status == s).sum()) for s in ("ok", "warning", "error")}
    worst_columns = ["source_line", columns.roles["container"], columns.roles["liquid"],
                     "status", "worst_case_ppm", "worst_case_percent_lfl", "concern",
                     "concern_driver"]
    concern = table["concern"].to_numpy(dtype=float)
    order = np.argsort(np.where(np.isnan(concern), np.inf, -concern), kind="stable")
    shown = order[:int(worst_count)]
    shown = shown[np.isfinite(concern[shown])]
    worst = table.iloc[shown][worst_columns]
    summary = InventorySummary(
        rows=len(table), counts=MappingProxyType(counts),
        at_or_above_alarm=int((table["concern"] >= 1.0).sum()), liquids=n_liquids,
        worst=worst)
    return InventoryScreening(table=table, summary=summary, cautions=tuple(CAUTIONS),
                              warnings=tuple(notes), pressure=file_pressure, alarms=alarms,
                              source=name)


@dataclass(frozen=True)
class _TemperatureColumn:
    label: object
    unit: str
    values: np.ndarray   # as entered, in the header's unit
    kelvin: np.ndarray
    blank: np.ndarray


def _read_formulas(frame: pd.DataFrame, roles: Mapping[str, object], issues: _Issues) -> None:
    """Formulas in text columns: errors where ullage reads them, cautions elsewhere.

    Formulas in numeric columns are reported by the number parser.
    """
    text_roles = {roles.get(r) for r in ("container", "liquid", "basis", "limit_source")}
    read = set(roles.values())
    for label in frame.columns:
        if label in read and label not in text_roles:
            continue
        column = frame[label]
        rows = np.flatnonzero(_is_formula(column))
        if rows.size == 0:
            continue
        shown = column.iloc[rows].astype(str).str[:40].map(repr).to_numpy(dtype=object)
        if label in read:
            issues.error(rows, label, "holds a formula (" + shown + "); formulas are not "
                         "evaluated: enter the value itself")
        else:
            issues.caution(rows, label, "holds a formula (" + shown + "), passed through as "
                           "text, not evaluated")


def _read_containers(column: pd.Series, label, skip: np.ndarray, issues: _Issues,
                     notes: list[str]) -> None:
    text, blank = _text_cells(column)
    issues.caution(np.flatnonzero(blank & ~skip), label, "no container identifier")
    filled = text[~blank]
    try:
        import pyarrow as pa
        import pyarrow.compute as pc

        unique = pc.count_distinct(pa.array(filled.array)).as_py() == len(filled)
    except (ImportError, TypeError, ValueError, AttributeError):  # pragma: no cover
        unique = not filled.duplicated().any()
    if unique:
        return
    repeated = text.duplicated(keep=False).to_numpy() & ~blank
    if repeated.any():
        names = pd.unique(text[repeated])
        notes.append(f"{len(names)} container identifier(s) appear on more than one row "
                     f"(for example {names[0]!r}); each row is screened on its own")


def _blank_cells(column: pd.Series) -> np.ndarray:
    missing = column.isna().to_numpy()
    if not _is_text_column(column):
        return missing
    return missing | (column.where(~missing, "").astype(str).str.strip() == "").to_numpy()


def _empty_rows(frame: pd.DataFrame, candidates: np.ndarray) -> np.ndarray:
    """Rows whose every cell is blank, looked for among `candidates` only."""
    empty = np.zeros(len(frame), dtype=bool)
    rows = np.flatnonzero(candidates)
    if rows.size:
        part = frame.iloc[rows]
        every = np.ones(rows.size, dtype=bool)
        for k in range(part.shape[1]):
            every &= _blank_cells(part.iloc[:, k])
        empty[rows[every]] = True
    return empty


def _read_temperatures(frame, roles, units, issues: _Issues, skip: np.ndarray):
    """Liquid and worst-case temperatures [K], and which column each came from."""
    n = len(frame)
    columns: dict[str, _TemperatureColumn] = {}
    unreadable = np.zeros(n, dtype=bool)
    for base in _TEMPERATURE_BASES:
        if base not in roles:
            continue
        label, unit = roles[base], units[base]
        if unit == _UNIT_IN_CELL:
            unit = "k"
            values, blank, (bad, texts) = _unit_cells(frame[label], base, label)
        else:
            values, blank, (bad, texts) = _number_cells(frame[label], _TEMPERATURE_WORDS,
                                                        unit, _TEMPERATURE_SCALES[unit])
        issues.error(bad, label, texts)
        unreadable[bad] = True
        columns[base] = _TemperatureColumn(label, unit, values, _to_kelvin(values, unit),
                                           blank)
    nominal = np.full(n, np.nan)
    nominal_from = np.full(n, -1, dtype=np.int8)
    for index, base in enumerate(_TEMPERATURE_BASES):
        if base in columns:
            take = (nominal_from < 0) & ~columns[base].blank
            nominal[take] = columns[base].kelvin[take]
            nominal_from[take] = index
    worst, worst_from = nominal.copy(), nominal_from.copy()
    if "temperature_high" in columns:
        high = columns["temperature_high"]
        worst[~high.blank] = high.kelvin[~high.blank]
        worst_from[~high.blank] = 2
    first_label = next(c.label for c in columns.values())
    issues.error(np.flatnonzero((nominal_from < 0) & ~unreadable & ~skip), first_label,
                 "no temperature given")
    for a, b in (("temperature_low", "temperature"), ("temperature", "temperature_high"),
                 ("temperature_low", "temperature_high")):
        if a in columns and b in columns:
            low, high = columns[a], columns[b]
            with np.errstate(invalid="ignore"):
                wrong = np.flatnonzero(~low.blank & ~high.blank & (low.kelvin > high.kelvin))
            issues.error(wrong, high.label, _format_each(high.values[wrong], "g")
                         + f" {_TEMPERATURE_SCALES[high.unit]} is below the "
                         + _format_each(low.values[wrong], "g")
                         + f" {_TEMPERATURE_SCALES[low.unit]} in "
                         f"{str(low.label).strip()!r}; a range runs from low to high")
    return columns, nominal, nominal_from, worst, worst_from


def _read_fill(frame, roles, issues: _Issues) -> None:
    if "fill_percent" not in roles:
        return
    label = roles["fill_percent"]
    values, _, (bad, texts) = _number_cells(frame[label], {"%": "%", "percent": "%"}, "%", "%")
    issues.error(bad, label, texts)
    with np.errstate(invalid="ignore"):
        rows = np.flatnonzero(values < 0)
        issues.error(rows, label, _format_each(values[rows], "g")
                     + " %: a fill level cannot be negative")
        rows = np.flatnonzero(values > 100)
        issues.error(rows, label, _format_each(values[rows], "g")
                     + " %: a fill level cannot exceed 100 %")
        issues.caution(np.flatnonzero(values == 100), label, "the container is full: it has "
                       "no vapour space now; the headspace shown forms as soon as liquid is "
                       "drawn off")


def _read_pressures(frame, roles, units, file_pressure: float, issues: _Issues) -> np.ndarray:
    """Absolute vapour-space pressure of each row. [Pa]"""
    n = len(frame)
    row_pressure = np.full(n, file_pressure)
    given = np.zeros(n, dtype=bool)
    if "pressure" in roles:
        label, unit = roles["pressure"], units["pressure"]
        if unit == _UNIT_IN_CELL:
            unit = "pa"
            values, blank, (bad, texts) = _unit_cells(frame[label], "pressure", label)
        else:
            words = {u: u for u in _PRESSURE_FACTORS} | {"psi": "psia"}
            values, blank, (bad, texts) = _number_cells(frame[label], words, unit,
                                                        _PRESSURE_LABELS[unit])
        issues.error(bad, label, texts)
        pascal = values * _PRESSURE_FACTORS[unit]
        inside = pressures_inside(pascal)
        rows = np.flatnonzero(np.isfinite(pascal) & ~inside)
        issues.error(rows, label, _format_each(values[rows], "g")
                     + f" {_PRESSURE_LABELS[unit]} is not an absolute pressure between 1 kPa "
                     "and 10 MPa (101.325 kPa is 1 atm; add the barometric pressure to a "
                     "gauge reading)")
        row_pressure[inside] = pascal[inside]
        given = ~blank
    if "elevation" in roles:
        label, unit = roles["elevation"], units["elevation"]
        if unit == _UNIT_IN_CELL:
            unit = "m"
            values, blank, (bad, texts) = _unit_cells(frame[label], "elevation", label)
        else:
            values, blank, (bad, texts) = _number_cells(frame[label], {unit: unit}, unit,
                                                        unit)
        issues.error(bad, label, texts)
        metres = values * _ELEVATION_FACTORS[unit]
        with np.errstate(invalid="ignore"):
            inside = (metres >= ELEVATION_RANGE[0]) & (metres <= ELEVATION_RANGE[1])
        rows = np.flatnonzero(np.isfinite(metres) & ~inside)
        issues.error(rows, label, _format_each(values[rows], "g")
                     + f" {unit} is outside -500 to 11000 m above sea level")
        issues.error(np.flatnonzero(~blank & given), label,
                     f"give either {str(roles.get('pressure', '')).strip()!r} or the "
                     "elevation for a row, not both")
        use = inside & ~given
        if use.any():
            row_pressure[use] = barometric_pressure(metres[use])
    return row_pressure


def _read_limits(frame, roles, issues: _Issues) -> dict[str, np.ndarray]:
    """Accepted limits per row [ppm], NaN where none or rejected."""
    n = len(frame)
    if "limit_source" in roles:
        _, no_source = _text_cells(frame[roles["limit_source"]])
    else:
        no_source = np.ones(n, dtype=bool)
    limits = {}
    for kind in _LIMIT_KINDS:
        if kind not in roles:
            limits[kind] = np.full(n, np.nan)
            continue
        label = roles[kind]
        values, blank, (bad_cells, texts) = _number_cells(frame[label], {"ppm": "ppm"},
                                                          "ppm", "ppm")
        issues.caution(bad_cells, label, texts + "; this limit is not used")
        with np.errstate(invalid="ignore"):
            bad = np.isfinite(values) & ((values <= 0) | (values >= 1e6))
        rows = np.flatnonzero(bad)
        issues.caution(rows, label, _format_each(values[rows], "g")
                       + " ppm is not a limit (it must be above 0 and below 1e6 ppm); this "
                       "limit is not used")
        unsourced = np.isfinite(values) & ~bad & no_source
        rows = np.flatnonzero(unsourced)
        issues.caution(rows, label, f"the {_LIMIT_LABELS[kind]} of "
                       + _format_each(values[rows], "g")
                       + " ppm has no limit_source and is not used; say where it comes from "
                       "(regulation, standard, company value)")
        limits[kind] = np.where(bad | unsourced, np.nan, values)
    return limits


@dataclass(frozen=True)
class _ComponentSet:
    """Liquids of the same components in the same order; compositions per row vary.

    `liquid` is one of them, for what depends on the components only (names,
    bounds, methods, flammability limits); `fractions` holds the mole fractions of
    every distinct composition, one row each.
    """

    liquid: Liquid
    fractions: np.ndarray  # (compositions, components)


_NO_LIQUID = ("no liquid given: enter a substance name, synonym or CAS number, or a "
              "mixture such as 'toluene 60%, o-xylene 40%'")


def _mixture_fractions(amounts: np.ndarray, components, basis: str):
    """Mole fractions of many compositions of one component set, as `mole_fractions`.

    Returns the fractions (k, n), the problem of each composition ("" if none) and
    its note ("" if none), with the messages of `estimator.mixtures.mole_fractions`.
    """
    from .mixtures import SUM_NORMALISE_LIMIT, SUM_TOLERANCE

    k = amounts.shape[0]
    problem = _same_text(k, "")
    note = _same_text(k, "")
    total = amounts.sum(axis=1)
    over = (amounts > 1.0 + SUM_TOLERANCE).any(axis=1)
    problem[over] = "a fraction is above 100 %; give fractions of the whole"
    off = ~over & (np.abs(total - 1.0) > SUM_NORMALISE_LIMIT)
    if off.any():
        problem[off] = [f"the {basis} fractions add up to {100 * t:.4g} %, "
                        f"{100 * abs(t - 1.0):.3g} points {'over' if t > 1 else 'short of'} "
                        "100 %; correct the composition" for t in total[off]]
    scaled = ~over & ~off & (np.abs(total - 1.0) > SUM_TOLERANCE)
    if scaled.any():
        note[scaled] = [f"the {basis} fractions added up to {100 * t:.4g} %; they were "
                        "scaled to 100 %" for t in total[scaled]]
    a = amounts / total[:, None]
    if basis == "mole":
        return a, problem, note
    if basis == "volume":
        densities = [c.liquid_density for c in components]
        if any(d is None for d in densities):
            problem[problem == ""] = ("a volume-basis composition needs the liquid density "
                                      "of every component")
            return a, problem, note
        a = a * np.array(densities, dtype=float)
    moles = a / np.array([c.molar_mass for c in components])
    return moles / moles.sum(axis=1, keepdims=True), problem, note


def _resolve_liquids(texts, basis_words):
    """Resolve distinct (liquid text, basis word) pairs into component sets.

    Mixture texts are split once each; their components are looked up once per
    name, and the compositions of each component set are converted to mole
    fractions in one array operation (`_mixture_fractions`).

    Returns
    -------
    sets : list of _ComponentSet
    pair_set, pair_composition : numpy.ndarray
        The set of each pair (-1 where unusable) and its composition in the set.
    pair_problem : list
        None, or (message, where) with where "liquid", "basis" or None (a formula,
        reported elsewhere).
    pair_note : numpy.ndarray
        A note on the composition ("" if none), such as its scaling to 100 %.
    """
    pairs = len(texts)
    pair_problem: list[tuple[str, object] | None] = [None] * pairs
    pair_note = _same_text(pairs, "")
    pair_set = np.full(pairs, -1, dtype=np.intp)
    pair_composition = np.zeros(pairs, dtype=np.intp)
    names: dict[str, object] = {}

    def component(name: str):
        if name not in names:
            try:
                names[name] = make_liquid(name, field="liquid component").components[0]
            except InputError as exc:
                names[name] = exc
        return names[name]

    pending: dict[tuple, list] = defaultdict(list)  # (keys, basis) -> [(pair, amounts, found)]
    for k, (text, basis_word) in enumerate(zip(texts, basis_words)):
        if text.startswith("=") or basis_word.startswith("="):
            pair_problem[k] = ("", None)  # reported as a formula
            continue
        basis = _BASIS_WORDS.get(basis_word) if basis_word else "mass"
        if not text:
            pair_problem[k] = (_NO_LIQUID, "liquid")
            continue
        if basis is None:
            pair_problem[k] = (f"{basis_word!r} is not a basis; use mole, mass or volume "
                               "(blank means mass)", "basis")
            continue
        if "%" not in text:
            found = component(text)
            if isinstance(found, InputError):
                pair_problem[k] = (found.reason, "liquid")
                continue
            pending[((found.key,), "mole")].append((k, np.ones(1), (found,)))
            continue
        parts = _mixture_parts(text)
        if parts is None:
            pair_problem[k] = (f"{text!r} cannot be read as a mixture: write each component "
                               "as a name followed by its percentage, separated by commas, "
                               "for example 'toluene 60%, o-xylene 40%'", "liquid")
            continue
        lowered = [name.lower() for name, _ in parts]
        if len(set(lowered)) != len(lowered):
            pair_problem[k] = ("a component is listed twice; give each component once",
                               "liquid")
            continue
        found = [component(name) for name, _ in parts]
        failed = next((f for f in found if isinstance(f, InputError)), None)
        if failed is not None:
            pair_problem[k] = (failed.reason, "liquid")
            continue
        keys = tuple(c.key for c in found)
        if len(set(keys)) != len(keys):
            pair_problem[k] = ("a component is listed twice (perhaps under two names)",
                               "liquid")
            continue
        pending[(keys, basis)].append((k, np.array([a for _, a in parts]), tuple(found)))
    sets: list[_ComponentSet] = []
    set_index: dict[tuple, int] = {}
    for (keys, basis), members in pending.items():
        components = members[0][2]
        members_pairs = np.array([m[0] for m in members])
        x, problems, notes = _mixture_fractions(np.vstack([m[1] for m in members]),
                                                components, basis)
        if keys not in set_index:
            set_index[keys] = len(sets)
            liquid = make_liquid(components[0]) if len(components) == 1 else Liquid(
                components, x[0], np.ones(len(components)))
            sets.append(_ComponentSet(liquid, np.empty((0, len(components)))))
        s_id = set_index[keys]
        offset = sets[s_id].fractions.shape[0]
        good = problems == ""
        sets[s_id] = _ComponentSet(sets[s_id].liquid,
                                   np.vstack([sets[s_id].fractions, x[good]]))
        pair_set[members_pairs[good]] = s_id
        pair_composition[members_pairs[good]] = offset + np.arange(int(good.sum()))
        looked_up = "; ".join(n for c in components if c.origin == "lookup" for n in c.notes)
        pair_note[members_pairs[good]] = ([f"{n}; {looked_up}" if n else looked_up
                                           for n in notes[good]] if looked_up
                                          else notes[good])
        for m, problem in zip(members_pairs[~good], problems[~good]):
            pair_problem[m] = (problem, "liquid")
    return sets, pair_set, pair_composition, pair_problem, pair_note


def _read_liquids(frame, roles, skip: np.ndarray, issues: _Issues):
    """Resolve each distinct (liquid, basis) text once (`_resolve_liquids`).

    Returns the component sets, the set of each row (-1 where unusable) and the
    row's composition within its set.
    """
    n = len(frame)
    liquid_label = roles["liquid"]
    liquid_text, _ = _text_cells(frame[liquid_label])
    if "basis" in roles:
        basis_text, _ = _text_cells(frame[roles["basis"]])
        basis_key = basis_text.str.lower().str.replace(" ", "")
    else:
        basis_key = _same_text(n, "")
    liquid_codes, liquid_uniques = pd.factorize(liquid_text)
    basis_codes, basis_uniques = pd.factorize(basis_key)
    width = len(basis_uniques) + 1
    pair_codes, pair_uniques = pd.factorize(liquid_codes * width + basis_codes)
    liquid_uniques, basis_uniques = list(liquid_uniques), list(basis_uniques)
    sets, pair_set, pair_composition, pair_problem, pair_note = _resolve_liquids(
        [liquid_uniques[code // width] for code in pair_uniques],
        [basis_uniques[code % width] for code in pair_uniques])
    labels = {"liquid": liquid_label, "basis": roles.get("basis")}
    # Rows of each pair with a problem or a note: one array call each.
    order, edges = _group_order(pair_codes, len(pair_uniques))
    for k in range(len(pair_uniques)):
        if pair_problem[k] is None and not pair_note[k]:
            continue
        rows = np.sort(order[edges[k]:edges[k + 1]])
        if pair_problem[k] is not None:
            problem, where = pair_problem[k]
            if problem:
                issues.error(rows[~skip[rows]], labels[where], problem)
        else:
            issues.caution(rows, liquid_label, pair_note[k])
    return sets, pair_set[pair_codes], pair_composition[pair_codes]


def _method_labels(liq: Liquid, method_nominal: np.ndarray, method_worst: np.ndarray,
                   uncertainty_of: Mapping[str, tuple]) -> tuple[np.ndarray, np.ndarray]:
    """Per row: the vapour-pressure methods used and their largest stated uncertainty."""
    m = method_nominal.shape[1]
    used = np.zeros((m, len(liq.components)), dtype=np.int64)
    for c in range(len(liq.components)):
        used[:, c] = ((1 << method_nominal[c].astype(np.int64))
                      | (1 << method_worst[c].astype(np.int64)))
    if (used == used[:1]).all():
        combos, inverse = used[:1], np.zeros(m, dtype=np.intp)
    else:
        combos, inverse = np.unique(used, axis=0, return_inverse=True)
    order = list(METHODS)
    labels, spreads = [], []
    for combo in combos:
        parts, largest = [], np.nan
        for c, component in enumerate(liq.components):
            names = sorted({component.correlations[k].method
                            for k in range(len(component.correlations)) if combo[c] >> k & 1},
                           key=order.index)
            for name in names:
                u = uncertainty_of.get(name, (None, ""))[0]
                if u is not None:
                    largest = u if np.isnan(largest) else max(largest, u)
            text = "+".join(names)
            parts.append(text if liq.is_pure else f"{component.name}: {text}")
        labels.append("; ".join(parts))
        spreads.append(largest)
    inverse = np.asarray(inverse).ravel()
    return np.array(labels, dtype=object)[inverse], np.array(spreads)[inverse]


def _screen(frame: pd.DataFrame, columns: _Columns, file_pressure: float,
            alarms: FlammabilityAlarms):
    n = len(frame)
    roles, units = columns.roles, columns.units
    lines = np.arange(n) + 2
    issues = _Issues(lines)
    notes: list[str] = []

    _, liquid_blank = _text_cells(frame[roles["liquid"]])
    empty = _empty_rows(frame, liquid_blank)
    issues.error(np.flatnonzero(empty), None, "the row is empty")
    _read_formulas(frame, roles, issues)
    _read_containers(frame[roles["container"]], roles["container"], empty, issues, notes)
    temperatures, nominal, nominal_from, worst, worst_from = _read_temperatures(
        frame, roles, units, issues, empty)
    _read_fill(frame, roles, issues)
    row_pressure = _read_pressures(frame, roles, units, file_pressure, issues)
    limits = _read_limits(frame, roles, issues)
    sets, row_set, row_composition = _read_liquids(frame, roles, empty, issues)

    # Temperature limits of each liquid (melting point, critical point), per set.
    row_set = np.where(issues.error_mask(n), -1, row_set)
    for g, rows in enumerate(_rows_by_code(row_set, len(sets))):
        if rows.size == 0:
            continue
        liq = sets[g].liquid
        bounds = _bounds(liq)
        for column in temperatures.values():
            codes = _temperature_problems(bounds, column.kelvin[rows])
            codes[column.blank[rows]] = 0
            for code in np.unique(codes[codes > 0]):
                bad = rows[codes == code]
                issues.error(bad, column.label, _temperature_messages(
                    int(code), column.values[bad], column.unit, bounds, liq))

    # Each component set in one evaluation, at the liquid and worst-case temperatures.
    row_set = np.where(issues.error_mask(n), -1, row_set)
    computed = row_set >= 0
    result = {name: np.full(n, np.nan) for name in
              ("headspace_ppm", "worst_case_ppm", "worst_case_mg_per_m3",
               "worst_case_percent_lfl", "worst_case_oxygen_percent",
               "vapor_pressure_uncertainty")}
    flammability = np.full(n, -1, dtype=np.int8)
    has_fuel = np.zeros(n, dtype=bool)
    method_text = np.full(n, None, dtype=object)
    uncertainty_of = method_uncertainty()
    temperature_label = {i: roles.get(b) for i, b in enumerate(_TEMPERATURE_BASES)}
    evaluated = 0
    for g, rows in enumerate(_rows_by_code(row_set, len(sets))):
        if rows.size == 0:
            continue
        liq = sets[g].liquid
        used = sets[g].fractions[row_composition[rows]]  # (m, components)
        evaluated += np.unique(np.round(sets[g].fractions[np.unique(row_composition[rows])],
                                        12), axis=0).shape[0]
        m = rows.size
        differ = np.flatnonzero(worst[rows] != nominal[rows])
        t_all = np.concatenate([nominal[rows], worst[rows[differ]]])
        p_all = np.concatenate([row_pressure[rows], row_pressure[rows[differ]]])
        weights = None if liq.is_pure else np.concatenate([used, used[differ]]).T
        res = _evaluate_liquid(liq, t_all, p_all, weights)
        at = np.arange(m)
        at_worst = at.copy()
        at_worst[differ] = m + np.arange(differ.size)
        result["headspace_ppm"][rows] = res.total_volume_fraction[at] * 1e6
        result["worst_case_ppm"][rows] = res.total_volume_fraction[at_worst] * 1e6
        result["worst_case_mg_per_m3"][rows] = res.mg_per_m3[at_worst]
        result["worst_case_percent_lfl"][rows] = res.percent_lfl[at_worst]
        result["worst_case_oxygen_percent"][rows] = res.oxygen_percent[at_worst]
        flammability[rows] = res.flammability[at_worst]
        has_fuel[rows] = any(c.lower_flammability_limit for c in liq.components)
        method_text[rows], result["vapor_pressure_uncertainty"][rows] = _method_labels(
            liq, res.method_index[:, at], res.method_index[:, at_worst], uncertainty_of)
        _group_cautions(liq, res, rows, at, t_all, p_all, nominal_from[rows],
                        temperature_label, issues)
        # The worst case adds its own cautions where its temperature or column differs.
        other = (at_worst != at) | (worst_from[rows] != nominal_from[rows])
        _group_cautions(liq, res, rows[other], at_worst[other], t_all, p_all,
                        worst_from[rows][other], temperature_label, issues)
        if any(c.lower_flammability_limit and not c.upper_flammability_limit
               for c in liq.components):
            issues.caution(rows, roles["liquid"], "an upper flammability limit is missing "
                           "for a flammable component; the too-rich state cannot be judged "
                           "for it")

    # Limits, vapour hazard ratio and concern.
    with np.errstate(invalid="ignore", divide="ignore"):
        ratios = {kind: result["worst_case_ppm"] / limits[kind] for kind in _LIMIT_KINDS}
        stacked = np.vstack([limits[k] for k in _LIMIT_KINDS])
        lowest = np.min(np.where(np.isfinite(stacked), stacked, np.inf), axis=0)
        lowest[~np.isfinite(lowest)] = np.nan
        vapor_hazard = result["headspace_ppm"] / lowest
        limit_term = result["worst_case_ppm"] / lowest
        lfl_term = np.where(has_fuel, result["worst_case_percent_lfl"] / alarms.percent_lfl,
                            np.nan)
    fresh = 100.0 * OXYGEN_IN_AIR
    if alarms.oxygen_low < fresh:
        oxygen_term = (fresh - result["worst_case_oxygen_percent"]) / (fresh - alarms.oxygen_low)
    else:
        oxygen_term = np.full(n, np.nan)
        notes.append(f"the low-oxygen alarm of {alarms.oxygen_low:g} % is not below the "
                     f"{fresh:g} % of fresh air; oxygen is left out of the concern")
    terms = np.vstack([limit_term, lfl_term, oxygen_term])
    finite = np.isfinite(terms)
    filled = np.where(finite, terms, -np.inf)
    concern = np.where(computed & finite.any(axis=0), filled.max(axis=0), np.nan)
    driver_names = np.array(["exposure limit", "LFL alarm", "oxygen"], dtype=object)
    driver = np.where(np.isfinite(concern), driver_names[filled.argmax(axis=0)], None)
    rank = pd.Series(concern).rank(ascending=False, method="min").astype("Int64")

    # Status and reason: errors first, then cautions.
    status, reason = issues.assemble(n)

    # Rows left without a result always say why (a guard; every path above reports).
    unexplained = np.flatnonzero(~computed & (status != "error"))
    if unexplained.size:
        status[unexplained] = "error"
        reason[unexplained] = ("line " + lines[unexplained].astype(str).astype(object)
                               + ": the row could not be computed")

    def text(values):
        return pd.Series(values, index=frame.index, dtype=object)

    states = np.array(FLAMMABILITY_CODES + (None,), dtype=object)
    columns_added = {
        "source_line": lines,
        "status": text(status),
        "reason": text(reason),
        "liquid_temperature_k": np.where(computed, nominal, np.nan),
        "worst_case_temperature_k": np.where(computed, worst, np.nan),
        "vapor_space_pressure_pa": np.where(computed, row_pressure, np.nan),
        "headspace_ppm": result["headspace_ppm"],
        "worst_case_ppm": result["worst_case_ppm"],
        "worst_case_mg_per_m3": result["worst_case_mg_per_m3"],
        "worst_case_percent_lfl": result["worst_case_percent_lfl"],
        "worst_case_flammability": text(states[flammability]),
        "worst_case_oxygen_percent": result["worst_case_oxygen_percent"],
        "twa_ratio": ratios["twa"],
        "stel_ratio": ratios["stel"],
        "ceiling_ratio": ratios["ceiling"],
        "vapor_hazard_ratio": vapor_hazard,
        "concern": concern,
        "concern_driver": text(driver),
        "concern_rank": pd.Series(rank.to_numpy(), index=frame.index, dtype="Int64"),
        "vapor_pressure_method": text(method_text),
        "vapor_pressure_uncertainty": result["vapor_pressure_uncertainty"],
    }
    del result, ratios
    # Column by column, so that pandas keeps each array as it is instead of copying
    # all float columns into one block (which would double their memory for a moment).
    table = frame.copy(deep=False)
    for name in OUTPUT_COLUMNS:
        table[name] = columns_added.pop(name)
    return table, evaluated, notes


def _group_cautions(liq: Liquid, res: _LiquidArrays, rows: np.ndarray, positions: np.ndarray,
                    t_all: np.ndarray, p_all: np.ndarray, sources: np.ndarray,
                    source_labels: Mapping[int, object], issues: _Issues):
    """Extrapolation and boiling cautions of one set at one of its temperatures.

    `sources` says which temperature column each row's value came from.
    """
    if rows.size == 0:
        return

    def by_source(mask, texts):
        for source in np.unique(sources[mask]):
            pick = sources[mask] == source
            issues.caution(rows[mask][pick], source_labels[int(source)],
                           texts if isinstance(texts, str) else texts[pick])

    extrapolated = res.extrapolated[:, positions]
    for c in np.flatnonzero(extrapolated.any(axis=1)):
        mask = extrapolated[c]
        component = liq.components[c]
        first = component.correlations[0]
        by_source(mask, f"{component.name}: " + _format_each(t_all[positions[mask]], ".1f")
                  + f" K lies outside the {first.tmin:.1f}-{first.tmax:.1f} K range of the "
                  f"{METHODS[first.method]}; the value is an extrapolation")
    boiling = res.boiling[positions]
    if boiling.any():
        by_source(boiling, "the liquid boils at this temperature and "
                  + _format_each(p_all[positions[boiling]] / 1000, ".1f")
                  + " kPa: the vapour pressure reaches the pressure of the space, which then "
                  "holds essentially pure vapour (air displaced)")
    if not liq.is_pure:
        above = res.above_own_boiling[:, positions]
        flagged = above.any(axis=0) & ~boiling
        if flagged.any():
            combos, inverse = np.unique(above[:, flagged].T, axis=0, return_inverse=True)
            inverse = np.asarray(inverse).ravel()
            texts = np.array([", ".join(liq.components[c].name for c in np.flatnonzero(combo))
                              + " is above its own boiling point at this pressure; in an "
                              "open vessel it would boil off" for combo in combos],
                             dtype=object)[inverse]
            by_source(flagged, texts)


def _temperature_messages(code: int, values: np.ndarray, unit: str, bounds: _Bounds,
                          liq: Liquid) -> np.ndarray:
    """The message of one temperature problem code for many values (in the header unit)."""
    shown = _format_each(values, "g") + f" {_TEMPERATURE_SCALES[unit]}"
    if code == 1:
        return shown + " is not a finite number"
    if code == 2:
        return shown + " is at or below absolute zero; check the unit in the header"
    whose = "" if liq.is_pure else ", a component"
    if code == 3:
        return shown + (f" is above the critical temperature of {bounds.critical_name}{whose} "
                        f"({_format_temperature(bounds.critical, unit)}): no liquid can exist "
                        "there")
    if not liq.is_pure:
        return shown + (f" is below {_format_temperature(bounds.melting, unit)}, the lowest "
                        "temperature computed for this mixture: a component is taken as a "
                        "subcooled liquid at most 25 K below its own melting point, and some "
                        "component must be above its own (the highest melting point is "
                        f"{bounds.melting_name}'s)")
    return shown + (f" is below the melting point of {bounds.melting_name}{whose} "
                    f"({_format_temperature(bounds.melting, unit)}): it would be solid; "
                    "ullage does not model sublimation")


# ------------------------------------------------------------------------- writing

#: Rows converted and written per batch (bounds the memory the writer needs).
_WRITE_BATCH = 100_000


def _arrow_column(column: pd.Series):
    """One column as an Arrow array for the CSV writer, text cells neutralised.

    Floats keep every digit (NaN is written as an empty cell); text and mixed
    columns are written as text, as pandas would print each cell.
    """
    import pyarrow as pa

    if pd.api.types.is_bool_dtype(column.dtype):
        return pa.array(column.astype(str).to_numpy(dtype=object), type=pa.string())
    if pd.api.types.is_numeric_dtype(column.dtype):
        return pa.Array.from_pandas(column)
    if column.dtype == object:
        try:
            array = pa.array(column.to_numpy(), type=pa.string(), from_pandas=True)
        except (pa.ArrowInvalid, pa.ArrowTypeError):
            array = pa.array(column.map(lambda v: None if _is_blank_value(v) else str(v))
                             .to_numpy(), type=pa.string(), from_pandas=True)
    elif _is_text_column(column):
        array = pa.array(column.array)
        if not pa.types.is_string(array.type) and not pa.types.is_large_string(array.type):
            array = array.cast(pa.string())
    else:
        array = pa.array(column.astype(str).where(column.notna(), None).to_numpy(),
                         type=pa.string(), from_pandas=True)
    return neutralise_arrow(array)


def _is_blank_value(value) -> bool:
    return value is None or (isinstance(value, float) and math.isnan(value))


def write_inventory_csv(result, path, *, cautions: bool = True) -> Path:
    """Write a screening table to CSV, safe to open in a spreadsheet.

    Text cells (and headers) beginning with =, +, -, @, a tab or a carriage return
    are prefixed with a single quote so that a spreadsheet shows them as text
    instead of running them as formulas; numbers, and text that is a plain number
    such as "-5", are left alone (`estimator.files.neutralise_arrow`). Text cells
    and headers are always quoted. The cautions come first, each on a line of its
    own beginning with "# ", so that ``pandas.read_csv(path, comment="#")`` (or any
    CSV reader told to skip comment lines) reads the table back, the header being
    the first line that is not a comment. UTF-8 with a byte-order mark, which
    spreadsheet programs recognise, and CRLF line ends (RFC 4180).

    The file is written in batches to a temporary file beside the target, which
    then replaces it (`estimator.files.atomic_writer`): a reader never sees half a
    file, and no temporary file is left behind, whatever stops the write.

    Parameters
    ----------
    result : InventoryScreening or pandas.DataFrame
        A screening result, or its table.
    path : str or os.PathLike
        Where to write.
    cautions : bool
        Write `estimator.CAUTIONS` first, one per line, each starting with "# ".

    Returns
    -------
    pathlib.Path
        The path written.
    """
    import pyarrow as pa
    import pyarrow.csv as pa_csv

    frame = result.table if isinstance(result, InventoryScreening) else result
    if not isinstance(frame, pd.DataFrame):
        raise InputError("result", "give a screening result or its table")
    target = Path(path)
    directory = target.parent if str(target.parent) else Path(".")
    if not directory.is_dir():
        raise InputError("path", f"the folder for {target.name} does not exist")
    names = [neutralise_cell(str(c)) for c in frame.columns]
    options = pa_csv.WriteOptions(include_header=False, eol="\r\n", quoting_style="needed",
                                  batch_size=8192)
    with atomic_writer(target, binary=True, field="path") as handle:
        handle.write(codecs.BOM_UTF8)
        if cautions:
            for caution in CAUTIONS:
                handle.write(("# " + " ".join(caution.split()) + "\r\n").encode("utf-8"))
        header = io.StringIO()
        csv.writer(header, lineterminator="\r\n", quoting=csv.QUOTE_ALL).writerow(names)
        handle.write(header.getvalue().encode("utf-8"))
        for start in range(0, len(frame), _WRITE_BATCH):
            part = frame.iloc[start:start + _WRITE_BATCH]
            arrays = [_arrow_column(part.iloc[:, k]) for k in range(part.shape[1])]
            table = pa.Table.from_arrays(arrays, names=[f"c{k}" for k in range(len(arrays))])
            pa_csv.write_csv(table, handle, options)
    return target
