"""The array core: equilibrium headspace of many rows in one array call per component
set (`headspace_arrays`).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import pandas as pd

from ..checks import pressures_inside
from ..constants import GAS_CONSTANT, OXYGEN_IN_AIR, STANDARD_ATMOSPHERE
from ..errors import InputError
from ..headspace import le_chatelier
from ..mixtures import Liquid
from .columns import FLAMMABILITY_CODES
from .liquids import liquid_bounds, resolve_liquids, temperature_problems

__all__ = [
    "HeadspaceArrays",
    "headspace_arrays",
]


# ------------------------------------------------------------------ the array core

def group_order(codes: np.ndarray, count: int) -> tuple[np.ndarray, np.ndarray]:
    """A stable order of the rows by code and the edges of each code's block.

    Codes are -1 (no group, first) to count-1; the rows of code k are
    ``order[edges[k]:edges[k + 1]]``, ascending. Small integer codes sort by radix.
    """
    small = codes.astype(np.int16 if count < 2**15 - 1 else np.int64)
    order = np.argsort(small, kind="stable")
    edges = np.searchsorted(small[order], np.arange(count + 1))
    return order, edges


def rows_by_code(codes: np.ndarray, count: int) -> list[np.ndarray]:
    """Row positions of each code 0..count-1 (ascending within each), negatives dropped."""
    order, edges = group_order(codes, count)
    return [order[edges[k]:edges[k + 1]] for k in range(count)]


def _saturation_pressure(sub, t: np.ndarray):
    """Vapour pressure of one substance at many temperatures, best method per value
    (`estimator.vapor.vapor_pressure_per_value`: what `vapor_pressure_estimate` gives
    each temperature on its own), with the method index and the extrapolation flag.
    """
    from ..vapor import vapor_pressure_per_value

    pressure, which, extrapolated = vapor_pressure_per_value(sub, t)
    return pressure, which.astype(np.int8), extrapolated


@dataclass(frozen=True)
class LiquidArrays:
    total_volume_fraction: np.ndarray
    mg_per_m3: np.ndarray
    percent_lfl: np.ndarray
    oxygen_percent: np.ndarray
    flammability: np.ndarray
    boiling: np.ndarray
    method_index: np.ndarray      # (n_components, m)
    extrapolated: np.ndarray      # (n_components, m)
    above_own_boiling: np.ndarray  # (n_components, m)


def evaluate_liquid(liq: Liquid, t: np.ndarray, pressure: np.ndarray,
                     weights: np.ndarray | None = None) -> LiquidArrays:
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
    return LiquidArrays(
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


def _evaluate_pure(liq: Liquid, t: np.ndarray, pressure) -> LiquidArrays:
    """`evaluate_liquid` for one component, with scalar limits (the common case)."""
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
    return LiquidArrays(
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
    sets, text_set, text_composition, _, _ = resolve_liquids(texts, [basis] * len(texts))
    row_set = np.where(codes >= 0, text_set[np.maximum(codes, 0)], -1)
    row_composition = text_composition[np.maximum(codes, 0)]
    order, edges = group_order(row_set, len(sets))
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
        codes_t = temperature_problems(liquid_bounds(liq), t_sorted[rows])
        np.copyto(block, codes_t, where=block == 0)
        good = edges[k] + np.flatnonzero(block == 0)
        if good.size == 0:
            continue
        weights = None if liq.is_pure else component_set.fractions[composition_sorted[good]].T
        res = evaluate_liquid(liq, t_sorted[good],
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
