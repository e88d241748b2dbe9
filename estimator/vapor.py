"""Saturated vapour pressure of pure liquids: the best method a substance has data for.

`vapor_pressure` and `vapor_pressure_estimate` pick the best correlation a
substance carries and state its uncertainty (`method_uncertainty`); subcooled
components of mixtures go through `component_vapor_pressure_estimates`. The
equations themselves and the correlation classes live in
`estimator.correlations` and are re-exported here.
"""

from __future__ import annotations

import functools
import math
import warnings
from dataclasses import dataclass
from pathlib import Path

import numpy as np

from . import correlations
from .correlations import (  # re-exported: the equations' public home is here too
    AntoineCorrelation,
    ClausiusClapeyronCorrelation,
    ClausiusClapeyronFit,
    Dippr101Correlation,
    TROUTON_ENTROPY,
    WATSON_EXPONENT,
    antoine,
    antoine_to_si,
    clausius_clapeyron,
    clausius_clapeyron_watson,
    dippr101,
    fit_clausius_clapeyron,
    trouton_enthalpy,
    watson_enthalpy,
)
from .correlations import as_float_array as _as_float_array
from .correlations import same_shape as _same_shape
from .errors import ExtrapolationWarning, InputError, OutOfRangeError

__all__ = [
    *correlations.__all__,  # the re-exported equations, constants and correlation objects
    "vapor_pressure",
    "vapor_pressure_estimate",
    "VaporPressureEstimate",
    "METHODS",
    "vapor_pressure_per_value",
    "SUBCOOLED_LIMIT",
    "SUBCOOLED_UNCERTAINTY_PER_KELVIN",
    "component_vapor_pressure_estimates",
]

#: Methods `vapor_pressure` knows, best first, with a plain description.
METHODS = {
    "antoine": "Antoine equation",
    "dippr101": "DIPPR-101 wide-range correlation",
    "clausius-clapeyron-fit": "Clausius-Clapeyron line through the given points",
    "clausius-clapeyron-watson": "Clausius-Clapeyron from the normal boiling point, "
                                 "Watson's ΔHvap(T)",
    "clausius-clapeyron": "Clausius-Clapeyron from the normal boiling point, constant ΔHvap",
    "trouton": "Clausius-Clapeyron from the normal boiling point, ΔHvap by Trouton's rule",
    "non-volatile": "taken as non-volatile (no vapour): an inert share of a liquid",
}

_UNCERTAINTY_FILE = Path(__file__).with_name("data") / "method_uncertainty.csv"


@functools.cache
def method_uncertainty() -> dict[str, tuple[float, str]]:
    """Stated relative uncertainty of each method, from ullage's own validation.

    Returns
    -------
    dict
        method -> (relative uncertainty covering 95 % of the validation points,
        a sentence saying what it was validated against).
    """
    import csv

    out: dict[str, tuple[float, str]] = {}
    if not _UNCERTAINTY_FILE.exists():
        return out
    with _UNCERTAINTY_FILE.open(newline="", encoding="utf-8") as handle:
        for row in csv.DictReader(handle):
            basis = (
                f"95th percentile of |error| over {row['n_points']} points, "
                f"{row['n_compounds']} compounds, {row['temperature_range'].replace('degC', '°C')}, "
                f"against {row['reference']}"
            )
            out[row["method"]] = (float(row["p95_relative_error"]), basis)
    return out


@dataclass(frozen=True)
class VaporPressureEstimate:
    """A vapour pressure with the method used, its stated uncertainty and warnings.

    Attributes
    ----------
    pressure : float or numpy.ndarray
        Saturated vapour pressure. [Pa]
    method : str
        Key of the method used (see `METHODS`).
    description : str
        The method in plain words.
    relative_uncertainty : float or None
        Relative uncertainty covering 95 % of ullage's validation points for this
        method, None where the method was not validated. [-]
    uncertainty_basis : str
        What the uncertainty was derived from.
    source : str
        Where the coefficients or reference point come from.
    valid_range : tuple of float
        Temperatures the method's data cover. [K]
    warnings : tuple of str
        Extrapolation and other cautions.
    """

    pressure: object
    method: str
    description: str
    relative_uncertainty: float | None
    uncertainty_basis: str
    source: str
    valid_range: tuple[float, float]
    warnings: tuple[str, ...] = ()


def _degc(kelvin: float) -> str:
    """A temperature in a message, as people read it: "46.0 °C"."""
    return f"{float(kelvin) - 273.15:.1f} °C"


#: How far below its own melting point a component of a liquid mixture may be taken
#: as a subcooled liquid. [K] 25 K: the liquid correlation is extrapolated below
#: the melting point, which assumes the liquid's enthalpy of vaporization keeps its
#: trend; over 0-25 K below the melting point ullage's correlations stay within 7 %
#: (after their offset at the melting point) of an independent extrapolation, the
#: Wagner equation of Poling et al. (2001), Appendix A, for the table compounds that
#: melt near room temperature (acetic acid, formic acid, benzene, p-xylene,
#: cyclohexanone, dimethyl carbonate), and water within 3 % of Murphy & Koop (2005)
#: for supercooled water. Farther below, the subcooled liquid's heat capacity departs
#: from the trend (water's rises steeply towards 228 K) and the component would
#: most likely crystallise out of the mixture: refused.
SUBCOOLED_LIMIT = 25.0

#: Extra relative uncertainty of a subcooled-liquid vapour pressure per kelvin below
#: the melting point. [1/K] 1 % per kelvin, added to the method's stated
#: uncertainty: about three times the largest drift (7 % over 25 K) between the
#: extrapolated correlations and the Wagner extrapolation of Poling et al. (2001)
#: for the compounds named at `SUBCOOLED_LIMIT`, because both are extrapolations.
SUBCOOLED_UNCERTAINTY_PER_KELVIN = 0.01


def _check_temperature(substance, t: np.ndarray, field: str,
                       subcooled: bool = False) -> tuple[float, float]:
    if t.size == 0:
        raise InputError(field, "no temperatures given")
    lo = float(np.min(t))
    hi = float(np.max(t))
    if math.isnan(lo) or math.isnan(hi):
        raise InputError(field, "contains NaN; give finite temperatures in kelvin")
    if math.isinf(lo) or math.isinf(hi):
        raise InputError(field, "contains an infinite value; give finite temperatures")
    if lo <= 0.0:
        raise OutOfRangeError(field, f"{lo:g} K is at or below absolute zero; "
                              "temperatures are in kelvin here")
    tc = substance.critical_temperature
    if tc is not None and hi > tc:
        raise OutOfRangeError(
            field, f"{_degc(hi)} is above the critical temperature of {substance.name} "
            f"({_degc(tc)}): no liquid can exist there, so it has no vapour pressure")
    tm = substance.melting_point
    if tm is not None and subcooled and lo < tm - SUBCOOLED_LIMIT:
        raise OutOfRangeError(
            field, f"{lo:g} K is {tm - lo:.1f} K below the melting point of {substance.name} "
            f"({tm:g} K): a component of a mixture is taken as a subcooled liquid down to "
            f"{SUBCOOLED_LIMIT:g} K below its melting point only; farther below it would "
            "crystallise out of the liquid, which ullage does not model")
    if tm is not None and lo < tm and not subcooled:
        raise OutOfRangeError(
            field, f"{_degc(lo)} is below the melting point of {substance.name} "
            f"({_degc(tm)}): it would be solid; ullage does not model sublimation")
    return lo, hi


def _choose(substance, lo: float, hi: float, method: str | None):
    available = {c.method: c for c in substance.correlations}
    if method is not None:
        if method not in METHODS:
            raise ValueError(f"unknown method {method!r}; expected one of {list(METHODS)}")
        if method not in available:
            raise InputError("method", f"{substance.name} has no data for {method!r}; "
                             f"it has {list(available)}")
        return available[method]
    def reach(c):
        return max(0.0, c.tmin - lo) + max(0.0, hi - c.tmax)

    # The first fitted set that covers the range. Outside every fitted range the
    # DIPPR-101 form, which is built to extrapolate (it follows ln p ~ A + B/T +
    # C ln T towards the critical and the triple point), is taken even when it
    # must extrapolate: a switch to a Clausius-Clapeyron estimate from the boiling
    # point at some distance would make the vapour pressure jump (by 25 % or more)
    # where it changes. Another fitted set within `EXTRAPOLATION_MARGIN`, then a
    # boiling-point estimate that covers the range, then the least extrapolation.
    fitted = [c for c in substance.correlations if c.method in _FITTED]
    for correlation in fitted:
        if reach(correlation) == 0.0:
            return correlation
    wide = [c for c in fitted if c.method == "dippr101"]
    if wide:
        return wide[0]
    for correlation in fitted:
        if reach(correlation) <= EXTRAPOLATION_MARGIN:
            return correlation
    for correlation in substance.correlations:
        if reach(correlation) == 0.0:
            return correlation
    return min(substance.correlations, key=reach)


def _blend_at_edges(substance, correlation, temperature):
    """Vapour pressure of a narrow-range set blended into the wide-range one near its edges.

    An Antoine set is more accurate inside its range than the DIPPR-101 set, but the
    two differ by up to about a percent at its edges, where the choice changes
    from one to the other. Within `BLEND_BAND` of an edge, ln p is the linear blend
    of the two (all Antoine at the band's inner side, all DIPPR-101 at the edge),
    so the vapour pressure stays continuous and rising across the change.
    """
    wide = next((c for c in substance.correlations if c.method == "dippr101"), None)
    p = correlation(temperature)
    if correlation.method != "antoine" or wide is None:
        return p
    t = np.asarray(temperature, dtype=float)
    inside = np.minimum(t - correlation.tmin, correlation.tmax - t)
    weight = np.clip(inside / BLEND_BAND, 0.0, 1.0)
    if np.all(weight >= 1.0):
        return p
    blended = np.exp(weight * np.log(p) + (1.0 - weight) * np.log(wide(temperature)))
    return _same_shape(blended, temperature)


def vapor_pressure_per_value(substance, temperature):
    """Best-method vapour pressure of one substance, chosen for each temperature alone.

    Each value gets what `vapor_pressure_estimate` gives that temperature on its own
    (the same choice and the same blend at the edges of an Antoine set), in one pass
    of array operations: for inventories, where the temperatures of many rows differ.

    Parameters
    ----------
    substance : Substance
    temperature : numpy.ndarray
        Temperatures, already checked (below the melting point only for subcooled
        components: the choice is then made as at 0.5 K above it). [K]

    Returns
    -------
    (numpy.ndarray, numpy.ndarray, numpy.ndarray)
        Pressures [Pa], the index of the correlation chosen in
        ``substance.correlations``, and whether the value is an extrapolation.
    """
    t = np.asarray(temperature, dtype=float)
    correlations = substance.correlations
    tm = substance.melting_point
    below = np.zeros(t.shape, dtype=bool) if tm is None else t < tm
    t_pick = np.where(below, (tm or 0.0) + 0.5, t)
    which = np.full(t.shape, -1, dtype=np.int16)

    def claim(mask, index):
        free = mask & (which < 0)
        which[free] = index

    ranked = list(enumerate(correlations))
    covers = [(t_pick >= c.tmin) & (t_pick <= c.tmax) for _, c in ranked]
    reach = [np.maximum(c.tmin - t_pick, 0.0) + np.maximum(t_pick - c.tmax, 0.0)
             for _, c in ranked]
    for (i, c), cov in zip(ranked, covers):
        if c.method in _FITTED:
            claim(cov, i)
    for i, c in ranked:
        if c.method == "dippr101":
            claim(np.ones(t.shape, dtype=bool), i)
            break
    for (i, c), r in zip(ranked, reach):
        if c.method in _FITTED:
            claim(r <= EXTRAPOLATION_MARGIN, i)
    for (i, _), cov in zip(ranked, covers):
        claim(cov, i)
    if np.any(which < 0):
        nearest = np.argmin(np.stack(reach), axis=0)
        which = np.where(which < 0, nearest, which)
    pressure = np.empty(t.shape)
    for i, c in ranked:
        chosen = which == i
        if chosen.any():
            pressure[chosen] = _blend_at_edges(substance, c, t[chosen])
    chosen_reach = np.choose(which, np.stack(reach)) if len(ranked) > 1 else reach[0]
    return pressure, which, (chosen_reach > 0) | below


#: Width of the band inside an Antoine range where it is blended into DIPPR-101. [K]
#: Chosen here: 5 K, wide enough that the blend's slope stays that of a vapour
#: pressure for the differences of about 1 % seen at the edges of the table's sets.
BLEND_BAND = 5.0


#: Methods fitted to measured vapour pressures (the others estimate from the boiling
#: point).
_FITTED = ("antoine", "dippr101", "clausius-clapeyron-fit")

#: How far outside its range a correlation may be extrapolated before a better-covering
#: method is preferred. [K] Chosen here: 10 K, within which the fitted sets of the
#: table stay smooth and monotonic (checked by the property tests).
EXTRAPOLATION_MARGIN = 10.0


def vapor_pressure_estimate(substance, temperature, method: str | None = None,
                            field: str = "temperature",
                            subcooled: bool = False) -> VaporPressureEstimate:
    """Saturated vapour pressure with the method used, its uncertainty and warnings.

    The best method the substance has data for is chosen: the first of its
    correlations whose range covers every temperature given; if none covers them,
    the first one, with an extrapolation warning. For table substances the order
    is Antoine (fitted to data over a narrower range, and the more accurate inside
    it in ullage's validation), the DIPPR-101 wide-range correlation, then the
    Clausius-Clapeyron variants; for user substances, the line through the given
    points first.

    Parameters
    ----------
    substance : Substance or str
        A substance, or a name, synonym or CAS number of the table.
    temperature : float or array_like
        Liquid temperature. [K]
    method : str, optional
        Force one method (a key of `METHODS`).
    field : str
        Name of the temperature input, for messages.
    subcooled : bool
        Allow temperatures down to `SUBCOOLED_LIMIT` below the melting point: the
        subcooled-liquid vapour pressure of a component dissolved in a liquid
        mixture, the liquid correlation extrapolated below the melting point, with
        a warning and the stated uncertainty widened by
        `SUBCOOLED_UNCERTAINTY_PER_KELVIN` per kelvin below it. A pure liquid
        below its melting point is solid and always refused (no sublimation).

    Returns
    -------
    VaporPressureEstimate

    References
    ----------
    Poling, B. E., Prausnitz, J. M. & O'Connell, J. P. (2001), The Properties of
    Gases and Liquids, 5th ed., McGraw-Hill, ch. 7 (range of each vapour-pressure
    equation) and Appendix A (Wagner coefficients, used to judge the subcooled
    extrapolation); Murphy, D. M. & Koop, T. (2005), Q. J. R. Meteorol. Soc. 131,
    1539-1565 (supercooled water).
    """
    from .substances import as_substance

    sub = as_substance(substance)
    t = _as_float_array(temperature)
    lo, hi = _check_temperature(sub, t, field, subcooled)
    tm = sub.melting_point
    below = tm is not None and lo < tm
    # the correlation is chosen for the liquid range; below it, it is extrapolated
    # (0.5 K above the melting point, as table ranges start at the triple point)
    if below:
        correlation = _choose(sub, tm + 0.5, max(hi, tm + 0.5), method)
    else:
        correlation = _choose(sub, lo, hi, method)
    notes = []
    if below:
        notes.append(
            f"{sub.name}: {tm - lo:.1f} K below its melting point ({tm - 273.15:.1f} °C), "
            "taken as a subcooled liquid in the mixture: its vapour pressure is the "
            f"{METHODS[correlation.method]} extrapolated below the melting point, with "
            f"{100 * SUBCOOLED_UNCERTAINTY_PER_KELVIN:g} % added to the stated uncertainty "
            f"per kelvin below it (+{100 * SUBCOOLED_UNCERTAINTY_PER_KELVIN * (tm - lo):.0f} "
            "%); it may crystallise out of the liquid, which is not modelled")
    elif lo < correlation.tmin or hi > correlation.tmax:
        notes.append(
            f"{sub.name}: {_degc(lo)} to {_degc(hi)} lies outside the "
            f"{_degc(correlation.tmin)} to {_degc(correlation.tmax)} range of the {METHODS[correlation.method]}; "
            "the value is an extrapolation")
    relative, basis = method_uncertainty().get(correlation.method, (None, "not validated"))
    if below:
        extra = SUBCOOLED_UNCERTAINTY_PER_KELVIN * (tm - lo)
        relative = extra + (relative or 0.0)
        basis += (f"; plus {100 * extra:.0f} % for the extrapolation {tm - lo:.1f} K below "
                  "the melting point (1 % per kelvin, from comparison with the Wagner "
                  "extrapolation of Poling et al. and, for water, Murphy & Koop 2005)")
    return VaporPressureEstimate(
        pressure=correlation(temperature) if method is not None
        else _blend_at_edges(sub, correlation, temperature),
        method=correlation.method,
        description=METHODS[correlation.method],
        relative_uncertainty=relative,
        uncertainty_basis=basis,
        source=correlation.source,
        valid_range=(correlation.tmin, correlation.tmax),
        warnings=tuple(notes),
    )


def component_vapor_pressure_estimates(components, temperature,
                                       field: str = "temperature"
                                       ) -> list[VaporPressureEstimate]:
    """Vapour-pressure estimates of the components of a liquid, pure or mixed.

    In a mixture a component below its own melting point is taken as a subcooled
    liquid (see `vapor_pressure_estimate`, ``subcooled=True``) as long as some
    component is above its own melting point at every temperature given; when
    every component is below its own, the whole liquid would freeze: refused. A
    pure liquid below its melting point is refused.

    Parameters
    ----------
    components : sequence of Substance
    temperature : float or array_like
        [K]
    field : str
        Name of the temperature input, for messages.

    Returns
    -------
    list of VaporPressureEstimate
        In the order of `components`.

    Examples
    --------
    5 % benzene (melts at 5.5 degC) in toluene at 0 degC:

    >>> from estimator.substances import substance
    >>> est = component_vapor_pressure_estimates(
    ...     [substance("benzene"), substance("toluene")], 273.15)
    >>> round(est[0].pressure, -1), est[0].warnings[0][:38]
    (3500.0, 'Benzene: 5.5 K below its melting point')
    """
    subs = list(components)
    if len(subs) < 2:
        return [vapor_pressure_estimate(s, temperature, field=field) for s in subs]
    t = _as_float_array(temperature)
    lo = float(np.min(t)) if t.size else math.nan
    melting = [s.melting_point if s.melting_point is not None else -math.inf for s in subs]
    if math.isfinite(lo) and lo > 0 and lo < min(melting):
        lowest = subs[int(np.argmin(melting))]
        raise OutOfRangeError(
            field, f"{lo:g} K is below the melting point of every component (the lowest is "
            f"{lowest.name}'s, {lowest.melting_point:g} K): the whole liquid would freeze; "
            "ullage does not model sublimation")
    return [vapor_pressure_estimate(s, temperature, field=field, subcooled=True)
            for s in subs]


def vapor_pressure(substance, temperature, method: str | None = None):
    """Saturated vapour pressure of a pure liquid by the best available method.

    Parameters
    ----------
    substance : Substance or str
        A substance, or a name, synonym or CAS number of the table.
    temperature : float or array_like
        Liquid temperature. [K]
    method : str, optional
        Force one method (a key of `METHODS`); by default the best available.

    Returns
    -------
    float or numpy.ndarray
        Saturated vapour pressure. [Pa]

    Raises
    ------
    InputError
        For NaN, temperatures at or below 0 K, above the critical temperature or
        below the melting point, and unknown substances.

    Warns
    -----
    ExtrapolationWarning
        When the temperatures lie outside the range of the method's data.

    Examples
    --------
    >>> round(vapor_pressure("water", 373.15) / 1000, 1)
    101.0
    """
    estimate = vapor_pressure_estimate(substance, temperature, method)
    for note in estimate.warnings:
        warnings.warn(note, ExtrapolationWarning, stacklevel=2)
    return estimate.pressure
