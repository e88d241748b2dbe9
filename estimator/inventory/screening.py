"""Screening an inventory: every check gathers its problems as (rows, text) arrays,
rows are screened by component set, and reasons are joined at the end
(`screen_inventory`).
"""

from __future__ import annotations

import os
import warnings
from collections.abc import Mapping
from dataclasses import dataclass
from pathlib import Path
from types import MappingProxyType

import numpy as np
import pandas as pd

from .._meta import CAUTIONS
from ..checks import ELEVATION_RANGE, check_pressure, pressures_inside
from ..constants import OXYGEN_IN_AIR, STANDARD_ATMOSPHERE, ZERO_CELSIUS
from ..errors import InputError, UllageWarning
from ..headspace import barometric_pressure
from ..limits import FlammabilityAlarms
from ..mixtures import Liquid
from ..vapor import METHODS, method_uncertainty
from .cells import blank_cells, is_formula, number_cells, same_text, text_cells, unit_cells
from .columns import (
    ColumnRoles,
    ELEVATION_FACTORS,
    FLAMMABILITY_CODES,
    LIMIT_KINDS,
    LIMIT_LABELS,
    OUTPUT_COLUMNS,
    PRESSURE_FACTORS,
    PRESSURE_LABELS,
    TEMPERATURE_BASES,
    TEMPERATURE_SCALES,
    TEMPERATURE_WORDS,
    UNIT_IN_CELL,
    resolve_columns,
)
from .core import LiquidArrays, evaluate_liquid, group_order, rows_by_code
from .liquids import LiquidBounds, liquid_bounds, resolve_liquids, temperature_problems
from .reading import read_inventory
from .summary import InventoryScreening, InventorySummary

__all__ = [
    "screen_inventory",
]


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
        status = same_text(n, "ok")
        reason = same_text(n, "")
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
        return f"{kelvin - ZERO_CELSIUS:.1f} °C"
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
    columns = resolve_columns(frame)
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
        rows = np.flatnonzero(is_formula(column))
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
    text, blank = text_cells(column)
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


def _empty_rows(frame: pd.DataFrame, candidates: np.ndarray) -> np.ndarray:
    """Rows whose every cell is blank, looked for among `candidates` only."""
    empty = np.zeros(len(frame), dtype=bool)
    rows = np.flatnonzero(candidates)
    if rows.size:
        part = frame.iloc[rows]
        every = np.ones(rows.size, dtype=bool)
        for k in range(part.shape[1]):
            every &= blank_cells(part.iloc[:, k])
        empty[rows[every]] = True
    return empty


def _read_temperatures(frame, roles, units, issues: _Issues, skip: np.ndarray):
    """Liquid and worst-case temperatures [K], and which column each came from."""
    n = len(frame)
    columns: dict[str, _TemperatureColumn] = {}
    unreadable = np.zeros(n, dtype=bool)
    for base in TEMPERATURE_BASES:
        if base not in roles:
            continue
        label, unit = roles[base], units[base]
        if unit == UNIT_IN_CELL:
            unit = "k"
            values, blank, (bad, texts) = unit_cells(frame[label], base, label)
        else:
            values, blank, (bad, texts) = number_cells(frame[label], TEMPERATURE_WORDS,
                                                        unit, TEMPERATURE_SCALES[unit])
        issues.error(bad, label, texts)
        unreadable[bad] = True
        columns[base] = _TemperatureColumn(label, unit, values, _to_kelvin(values, unit),
                                           blank)
    nominal = np.full(n, np.nan)
    nominal_from = np.full(n, -1, dtype=np.int8)
    for index, base in enumerate(TEMPERATURE_BASES):
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
                         + f" {TEMPERATURE_SCALES[high.unit]} is below the "
                         + _format_each(low.values[wrong], "g")
                         + f" {TEMPERATURE_SCALES[low.unit]} in "
                         f"{str(low.label).strip()!r}; a range runs from low to high")
    return columns, nominal, nominal_from, worst, worst_from


def _read_fill(frame, roles, issues: _Issues) -> None:
    if "fill_percent" not in roles:
        return
    label = roles["fill_percent"]
    values, _, (bad, texts) = number_cells(frame[label], {"%": "%", "percent": "%"}, "%", "%")
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
        if unit == UNIT_IN_CELL:
            unit = "pa"
            values, blank, (bad, texts) = unit_cells(frame[label], "pressure", label)
        else:
            words = {u: u for u in PRESSURE_FACTORS} | {"psi": "psia"}
            values, blank, (bad, texts) = number_cells(frame[label], words, unit,
                                                        PRESSURE_LABELS[unit])
        issues.error(bad, label, texts)
        pascal = values * PRESSURE_FACTORS[unit]
        inside = pressures_inside(pascal)
        rows = np.flatnonzero(np.isfinite(pascal) & ~inside)
        issues.error(rows, label, _format_each(values[rows], "g")
                     + f" {PRESSURE_LABELS[unit]} is not an absolute pressure between 1 kPa "
                     "and 10 MPa (101.325 kPa is 1 atm; add the barometric pressure to a "
                     "gauge reading)")
        row_pressure[inside] = pascal[inside]
        given = ~blank
    if "elevation" in roles:
        label, unit = roles["elevation"], units["elevation"]
        if unit == UNIT_IN_CELL:
            unit = "m"
            values, blank, (bad, texts) = unit_cells(frame[label], "elevation", label)
        else:
            values, blank, (bad, texts) = number_cells(frame[label], {unit: unit}, unit,
                                                        unit)
        issues.error(bad, label, texts)
        metres = values * ELEVATION_FACTORS[unit]
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
        _, no_source = text_cells(frame[roles["limit_source"]])
    else:
        no_source = np.ones(n, dtype=bool)
    limits = {}
    for kind in LIMIT_KINDS:
        if kind not in roles:
            limits[kind] = np.full(n, np.nan)
            continue
        label = roles[kind]
        values, blank, (bad_cells, texts) = number_cells(frame[label], {"ppm": "ppm"},
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
        issues.caution(rows, label, f"the {LIMIT_LABELS[kind]} of "
                       + _format_each(values[rows], "g")
                       + " ppm has no limit_source and is not used; say where it comes from "
                       "(regulation, standard, company value)")
        limits[kind] = np.where(bad | unsourced, np.nan, values)
    return limits


def _read_liquids(frame, roles, skip: np.ndarray, issues: _Issues):
    """Resolve each distinct (liquid, basis) text once (`resolve_liquids`).

    Returns the component sets, the set of each row (-1 where unusable) and the
    row's composition within its set.
    """
    n = len(frame)
    liquid_label = roles["liquid"]
    liquid_text, _ = text_cells(frame[liquid_label])
    if "basis" in roles:
        basis_text, _ = text_cells(frame[roles["basis"]])
        basis_key = basis_text.str.lower().str.replace(" ", "")
    else:
        basis_key = same_text(n, "")
    liquid_codes, liquid_uniques = pd.factorize(liquid_text)
    basis_codes, basis_uniques = pd.factorize(basis_key)
    width = len(basis_uniques) + 1
    pair_codes, pair_uniques = pd.factorize(liquid_codes * width + basis_codes)
    liquid_uniques, basis_uniques = list(liquid_uniques), list(basis_uniques)
    sets, pair_set, pair_composition, pair_problem, pair_note = resolve_liquids(
        [liquid_uniques[code // width] for code in pair_uniques],
        [basis_uniques[code % width] for code in pair_uniques])
    labels = {"liquid": liquid_label, "basis": roles.get("basis")}
    # Rows of each pair with a problem or a note: one array call each.
    order, edges = group_order(pair_codes, len(pair_uniques))
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


def _check_temperature_bounds(sets, row_set, temperatures, issues) -> None:
    """Refuse temperatures outside each liquid's range (melting point, critical
    point), one component set at a time."""
    row_set = np.where(issues.error_mask(len(row_set)), -1, row_set)
    for g, rows in enumerate(rows_by_code(row_set, len(sets))):
        if rows.size == 0:
            continue
        liq = sets[g].liquid
        bounds = liquid_bounds(liq)
        for column in temperatures.values():
            codes = temperature_problems(bounds, column.kelvin[rows])
            codes[column.blank[rows]] = 0
            for code in np.unique(codes[codes > 0]):
                bad = rows[codes == code]
                issues.error(bad, column.label, _temperature_messages(
                    int(code), column.values[bad], column.unit, bounds, liq))


def _evaluate_sets(sets, row_set, row_composition, nominal, worst, nominal_from, worst_from,
                   row_pressure, roles, issues):
    """Each component set in one evaluation, at the liquid and the worst-case
    temperatures: the per-row results, flammability state, whether the liquid has
    a fuel, the method labels and the count of distinct compositions evaluated."""
    n = row_set.size
    result = {name: np.full(n, np.nan) for name in
              ("headspace_ppm", "worst_case_ppm", "worst_case_mg_per_m3",
               "worst_case_percent_lfl", "worst_case_oxygen_percent",
               "vapor_pressure_uncertainty")}
    flammability = np.full(n, -1, dtype=np.int8)
    has_fuel = np.zeros(n, dtype=bool)
    method_text = np.full(n, None, dtype=object)
    uncertainty_of = method_uncertainty()
    temperature_label = {i: roles.get(b) for i, b in enumerate(TEMPERATURE_BASES)}
    evaluated = 0
    for g, rows in enumerate(rows_by_code(row_set, len(sets))):
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
        res = evaluate_liquid(liq, t_all, p_all, weights)
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
    return result, flammability, has_fuel, method_text, evaluated


def _concern(result, limits, has_fuel, alarms: FlammabilityAlarms, computed, notes):
    """Limit ratios, vapour hazard ratio and the concern with its driver and rank."""
    n = computed.size
    with np.errstate(invalid="ignore", divide="ignore"):
        ratios = {kind: result["worst_case_ppm"] / limits[kind] for kind in LIMIT_KINDS}
        stacked = np.vstack([limits[k] for k in LIMIT_KINDS])
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
    return ratios, vapor_hazard, concern, driver, rank


def _screen(frame: pd.DataFrame, columns: ColumnRoles, file_pressure: float,
            alarms: FlammabilityAlarms):
    n = len(frame)
    roles, units = columns.roles, columns.units
    lines = np.arange(n) + 2
    issues = _Issues(lines)
    notes: list[str] = []

    _, liquid_blank = text_cells(frame[roles["liquid"]])
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

    _check_temperature_bounds(sets, row_set, temperatures, issues)

    row_set = np.where(issues.error_mask(n), -1, row_set)
    computed = row_set >= 0
    result, flammability, has_fuel, method_text, evaluated = _evaluate_sets(
        sets, row_set, row_composition, nominal, worst, nominal_from, worst_from,
        row_pressure, roles, issues)

    ratios, vapor_hazard, concern, driver, rank = _concern(result, limits, has_fuel,
                                                           alarms, computed, notes)

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


def _group_cautions(liq: Liquid, res: LiquidArrays, rows: np.ndarray, positions: np.ndarray,
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


def _temperature_messages(code: int, values: np.ndarray, unit: str, bounds: LiquidBounds,
                          liq: Liquid) -> np.ndarray:
    """The message of one temperature problem code for many values (in the header unit)."""
    shown = _format_each(values, "g") + f" {TEMPERATURE_SCALES[unit]}"
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
