"""Saturated vapour pressure of pure liquids: published equations and method choice.

Every equation is a plain function of SI floats or numpy arrays (temperature in K,
pressure in Pa, enthalpy in J/mol). The correlation classes hold one substance's
coefficients with their validity range and source, and `vapor_pressure` picks the
best method a substance has data for.
"""

from __future__ import annotations

import functools
import math
import warnings
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np

from .constants import GAS_CONSTANT, STANDARD_ATMOSPHERE, ZERO_CELSIUS
from .errors import ExtrapolationWarning, InputError, OutOfRangeError

__all__ = [
    "clausius_clapeyron",
    "fit_clausius_clapeyron",
    "ClausiusClapeyronFit",
    "antoine",
    "antoine_to_si",
    "dippr101",
    "watson_enthalpy",
    "clausius_clapeyron_watson",
    "trouton_enthalpy",
    "Dippr101Correlation",
    "AntoineCorrelation",
    "ClausiusClapeyronCorrelation",
    "vapor_pressure",
    "vapor_pressure_estimate",
    "VaporPressureEstimate",
    "METHODS",
    "SUBCOOLED_LIMIT",
    "SUBCOOLED_UNCERTAINTY_PER_KELVIN",
    "component_vapor_pressure_estimates",
]

#: Trouton's constant, the entropy of vaporization at the normal boiling point of
#: non-associating liquids. [J/(mol K)] About 85-88 J/(mol K) (Trouton 1884; e.g.
#: Atkins, Physical Chemistry); 88 is the value commonly used for screening.
TROUTON_ENTROPY = 88.0

#: Watson's exponent. Watson (1943), Ind. Eng. Chem. 35, 398.
WATSON_EXPONENT = 0.38


def _as_float_array(value):
    return np.asarray(value, dtype=float)


def _same_shape(result, like):
    return float(result) if np.ndim(like) == 0 else result


def clausius_clapeyron(temperature, reference_temperature, reference_pressure,
                       enthalpy_of_vaporization):
    r"""Vapour pressure from one reference point, with constant enthalpy of vaporization.

    .. math:: \ln\frac{p}{p_\mathrm{ref}} = -\frac{\Delta H_\mathrm{vap}}{R}
              \left(\frac{1}{T} - \frac{1}{T_\mathrm{ref}}\right)

    Assumes an ideal vapour, a liquid volume negligible beside the vapour's, and a
    constant enthalpy of vaporization. The error grows with the distance from the
    reference point: from the normal boiling point down to room temperature it is
    typically 5-25 % (see ``estimator/data/method_uncertainty.csv``).

    Parameters
    ----------
    temperature : float or array_like
        Liquid temperature. [K]
    reference_temperature : float
        Temperature of the known point. [K]
    reference_pressure : float
        Vapour pressure at the known point. [Pa]
    enthalpy_of_vaporization : float
        Molar enthalpy of vaporization, taken as constant. [J/mol]

    Returns
    -------
    float or numpy.ndarray
        Saturated vapour pressure. [Pa]

    References
    ----------
    Clapeyron (1834); Clausius (1850). Integrated form e.g. in Poling, Prausnitz &
    O'Connell, The Properties of Gases and Liquids, 5th ed. (2001), Eq. 7-2.1.

    Examples
    --------
    Water from its normal boiling point with 40.65 kJ/mol (CRC Handbook):

    >>> round(clausius_clapeyron(353.15, 373.124, 101325.0, 40650.0))
    48290
    """
    t = _as_float_array(temperature)
    p = reference_pressure * np.exp(
        -enthalpy_of_vaporization / GAS_CONSTANT * (1.0 / t - 1.0 / reference_temperature)
    )
    return _same_shape(p, temperature)


@dataclass(frozen=True)
class ClausiusClapeyronFit:
    """Clausius-Clapeyron line fitted to measured points: ln p = intercept - slope / T.

    Attributes
    ----------
    enthalpy_of_vaporization : float
        Mean enthalpy of vaporization over the fitted range, slope times R. [J/mol]
    intercept : float
        Intercept of ln(p / Pa) against 1/T. [-]
    temperature_range : tuple of float
        Lowest and highest fitted temperature. [K]
    rms_log_residual : float
        Root-mean-square residual in ln p, about the relative error of the fit at
        the fitted points; 0 for two points. [-]
    max_relative_residual : float
        Largest relative difference between the line and a fitted point. [-]
    n_points : int
        Number of points fitted.
    """

    enthalpy_of_vaporization: float
    intercept: float
    temperature_range: tuple[float, float]
    rms_log_residual: float
    max_relative_residual: float
    n_points: int

    def __call__(self, temperature):
        """Vapour pressure on the fitted line. [Pa]"""
        t = _as_float_array(temperature)
        p = np.exp(self.intercept - self.enthalpy_of_vaporization / (GAS_CONSTANT * t))
        return _same_shape(p, temperature)


def fit_clausius_clapeyron(temperatures, pressures) -> ClausiusClapeyronFit:
    """Fit the Clausius-Clapeyron line to two or more (temperature, pressure) points.

    Least squares on ln p against 1/T. With two points (for example a safety data
    sheet's boiling point and its vapour pressure at 20 degC) the line passes
    through both; interpolating between them is good, extrapolating is worse.

    Parameters
    ----------
    temperatures : array_like
        Temperatures of the points. [K]
    pressures : array_like
        Vapour pressures at those temperatures. [Pa]

    Returns
    -------
    ClausiusClapeyronFit
        The fitted line, callable on temperature. [Pa]

    Examples
    --------
    Toluene's normal boiling point and 2.91 kPa at 20 degC (CRC Handbook values,
    from memory):

    >>> fit = fit_clausius_clapeyron([383.75, 293.15], [101325.0, 2910.0])
    >>> round(fit.enthalpy_of_vaporization / 1000, 1)
    36.7
    """
    t = np.atleast_1d(_as_float_array(temperatures)).ravel()
    p = np.atleast_1d(_as_float_array(pressures)).ravel()
    if t.size != p.size:
        raise InputError("pressures", f"got {p.size} pressures for {t.size} temperatures; "
                         "give one pressure per temperature")
    if t.size < 2:
        raise InputError("temperatures", "need at least two points to fit a line")
    if not (np.all(np.isfinite(t)) and np.all(np.isfinite(p))):
        raise InputError("temperatures", "every point must be a finite number")
    if np.any(t <= 0.0):
        raise InputError("temperatures", "every temperature must be above 0 K")
    if np.any(p <= 0.0):
        raise InputError("pressures", "every vapour pressure must be above 0 Pa")
    x = 1.0 / t
    if np.ptp(x) <= 1e-12 * np.abs(x).max():
        raise InputError("temperatures", "the points need at least two different temperatures")
    y = np.log(p)
    slope, intercept = np.polyfit(x, y, 1)
    residual = y - (intercept + slope * x)
    enthalpy = -slope * GAS_CONSTANT
    if enthalpy <= 0.0:
        raise InputError("pressures", "the vapour pressure must rise with temperature; "
                         "check that each pressure sits with its temperature")
    return ClausiusClapeyronFit(
        enthalpy_of_vaporization=float(enthalpy),
        intercept=float(intercept),
        temperature_range=(float(t.min()), float(t.max())),
        rms_log_residual=float(np.sqrt(np.mean(residual**2))),
        max_relative_residual=float(np.max(np.abs(np.expm1(-residual)))),
        n_points=int(t.size),
    )


def antoine(temperature, a, b, c, base=10.0):
    r"""Antoine equation: log_base(p / Pa) = A - B / (T / K + C).

    Parameters
    ----------
    temperature : float or array_like
        Liquid temperature. [K]
    a, b, c : float
        Coefficients for pressure in Pa and temperature in K; convert others with
        `antoine_to_si`. [-, K, K]
    base : float
        Base of the logarithm, 10 or e.

    Returns
    -------
    float or numpy.ndarray
        Saturated vapour pressure. [Pa]

    References
    ----------
    Antoine, C. (1888), Comptes Rendus 107, 681-684.

    Examples
    --------
    Water, 1-100 degC (Stull 1947 via common tables, mmHg and degC: 8.07131,
    1730.63, 233.426; from memory), converted:

    >>> a, b, c = antoine_to_si(8.07131, 1730.63, 233.426, "mmHg", "degC")
    >>> round(antoine(373.15, a, b, c))
    101337
    """
    t = _as_float_array(temperature)
    p = np.power(base, a - b / (t + c))
    return _same_shape(p, temperature)


#: Pascals per unit, for Antoine coefficient conversion (exact by definition, or
#: NIST SP 811 for mmHg and psi).
_PRESSURE_UNITS = {
    "Pa": 1.0,
    "kPa": 1e3,
    "MPa": 1e6,
    "bar": 1e5,
    "mbar": 1e2,
    "atm": STANDARD_ATMOSPHERE,
    "mmHg": 133.322387415,
    "torr": STANDARD_ATMOSPHERE / 760.0,
    "psi": 6894.757293168361,
}


def antoine_to_si(a, b, c, pressure_unit="mmHg", temperature_unit="degC", base=10.0):
    """Convert Antoine coefficients to log10, pascals and kelvin.

    Parameters
    ----------
    a, b, c : float
        Coefficients as published.
    pressure_unit : str
        Pressure unit of the source: one of Pa, kPa, MPa, bar, mbar, atm, mmHg,
        torr, psi.
    temperature_unit : str
        "degC" or "K".
    base : float
        Logarithm base of the source, 10 or e (``math.e``).

    Returns
    -------
    tuple of float
        (A, B, C) for ``antoine(T, A, B, C)`` with T in K and p in Pa, base 10.

    Examples
    --------
    >>> a, b, c = antoine_to_si(4.0, 1000.0, -50.0, "bar", "K")
    >>> round(a, 6), b, c
    (9.0, 1000.0, -50.0)
    """
    if pressure_unit not in _PRESSURE_UNITS:
        raise ValueError(f"unknown pressure unit {pressure_unit!r}; "
                         f"expected one of {sorted(_PRESSURE_UNITS)}")
    if temperature_unit not in ("degC", "K"):
        raise ValueError("temperature_unit must be 'degC' or 'K'")
    if base == 10.0:
        a10, b10 = a, b
    elif abs(base - math.e) < 1e-12:
        a10, b10 = a / math.log(10.0), b / math.log(10.0)
    else:
        raise ValueError("base must be 10 or e")
    a10 = a10 + math.log10(_PRESSURE_UNITS[pressure_unit])
    c_kelvin = c - ZERO_CELSIUS if temperature_unit == "degC" else c
    return float(a10), float(b10), float(c_kelvin)


def dippr101(temperature, c1, c2, c3, c4, c5):
    r"""DIPPR equation 101, a wide-range vapour-pressure correlation.

    .. math:: \ln(p / \mathrm{Pa}) = C_1 + C_2/T + C_3 \ln T + C_4 T^{C_5}

    Valid from about the triple point to the critical point with the coefficients
    of Perry's Chemical Engineers' Handbook, Table 2-8.

    Parameters
    ----------
    temperature : float or array_like
        Liquid temperature. [K]
    c1, c2, c3, c4, c5 : float
        Coefficients for p in Pa and T in K.

    Returns
    -------
    float or numpy.ndarray
        Saturated vapour pressure. [Pa]

    References
    ----------
    Green & Perry (eds.), Perry's Chemical Engineers' Handbook, 8th ed. (2008),
    Table 2-8; DIPPR 801 database, equation 101.

    Examples
    --------
    Water, Perry's 8th ed. Table 2-8 (73.649, -7258.2, -7.3037, 4.1653e-6, 2):

    >>> round(dippr101(373.15, 73.649, -7258.2, -7.3037, 4.1653e-6, 2.0))
    101261
    """
    t = _as_float_array(temperature)
    p = np.exp(c1 + c2 / t + c3 * np.log(t) + c4 * t**c5)
    return _same_shape(p, temperature)


def watson_enthalpy(temperature, reference_temperature, reference_enthalpy,
                    critical_temperature, exponent=WATSON_EXPONENT):
    r"""Enthalpy of vaporization at another temperature, by Watson's relation.

    .. math:: \Delta H_2 = \Delta H_1 \left(\frac{1 - T_2/T_c}{1 - T_1/T_c}\right)^{0.38}

    Parameters
    ----------
    temperature : float or array_like
        Temperature wanted. [K]
    reference_temperature : float
        Temperature of the known value, usually the normal boiling point. [K]
    reference_enthalpy : float
        Enthalpy of vaporization at `reference_temperature`. [J/mol]
    critical_temperature : float
        Critical temperature. [K]
    exponent : float
        Watson's exponent, 0.38.

    Returns
    -------
    float or numpy.ndarray
        Enthalpy of vaporization; zero at and above the critical temperature. [J/mol]

    References
    ----------
    Watson, K. M. (1943), Ind. Eng. Chem. 35, 398-406.

    Examples
    --------
    Water from 40.65 kJ/mol at 373.12 K to 298.15 K (Tc 647.1 K); the steam
    tables give 43.99 kJ/mol (IAPWS-95):

    >>> round(watson_enthalpy(298.15, 373.124, 40650.0, 647.096) / 1000, 2)
    44.56
    """
    t = _as_float_array(temperature)
    ratio = np.clip(1.0 - t / critical_temperature, 0.0, None) / (
        1.0 - reference_temperature / critical_temperature
    )
    return _same_shape(reference_enthalpy * ratio**exponent, temperature)


#: Gauss-Legendre nodes and weights on [-1, 1] for the Watson integral.
_GAUSS_NODES, _GAUSS_WEIGHTS = np.polynomial.legendre.leggauss(16)


def clausius_clapeyron_watson(temperature, reference_temperature, reference_pressure,
                              reference_enthalpy, critical_temperature,
                              exponent=WATSON_EXPONENT):
    r"""Clausius-Clapeyron integrated with Watson's temperature-dependent enthalpy.

    .. math:: \ln\frac{p}{p_\mathrm{ref}} = \int_{T_\mathrm{ref}}^{T}
              \frac{\Delta H_\mathrm{vap}(T')}{R T'^2}\,\mathrm{d}T'

    with :math:`\Delta H_\mathrm{vap}(T')` from `watson_enthalpy`, integrated by
    16-point Gauss-Legendre quadrature (exact to far better than the model).

    Parameters
    ----------
    temperature : float or array_like
        Liquid temperature, below the critical temperature. [K]
    reference_temperature : float
        Temperature of the known point. [K]
    reference_pressure : float
        Vapour pressure at the known point. [Pa]
    reference_enthalpy : float
        Enthalpy of vaporization at the known point. [J/mol]
    critical_temperature : float
        Critical temperature. [K]
    exponent : float
        Watson's exponent, 0.38.

    Returns
    -------
    float or numpy.ndarray
        Saturated vapour pressure. [Pa]

    Examples
    --------
    Water at 80 degC from its normal boiling point (IAPWS-95 gives 47.41 kPa):

    >>> round(clausius_clapeyron_watson(353.15, 373.124, 101325.0, 40650.0, 647.096))
    47795
    """
    t = _as_float_array(temperature)
    half = 0.5 * (t - reference_temperature)
    nodes = reference_temperature + half[..., None] * (_GAUSS_NODES + 1.0)
    enthalpy = watson_enthalpy(nodes, reference_temperature, reference_enthalpy,
                               critical_temperature, exponent)
    integral = half * np.sum(_GAUSS_WEIGHTS * enthalpy / (GAS_CONSTANT * nodes**2), axis=-1)
    return _same_shape(reference_pressure * np.exp(integral), temperature)


def trouton_enthalpy(boiling_point, entropy=TROUTON_ENTROPY):
    """Enthalpy of vaporization at the normal boiling point by Trouton's rule.

    A last-resort estimate: it fails for hydrogen-bonded liquids (water, alcohols,
    acids; ΔS is 100-110 J/(mol K) for those) and for very low or high boilers.

    Parameters
    ----------
    boiling_point : float or array_like
        Normal boiling point. [K]
    entropy : float
        Entropy of vaporization at the boiling point, 88. [J/(mol K)]

    Returns
    -------
    float or numpy.ndarray
        Enthalpy of vaporization at the boiling point. [J/mol]

    Examples
    --------
    Benzene boils at 353.2 K; the CRC Handbook gives 30.72 kJ/mol at Tb:

    >>> round(trouton_enthalpy(353.24) / 1000, 2)
    31.09
    """
    return entropy * boiling_point


@dataclass(frozen=True)
class Dippr101Correlation:
    """One substance's DIPPR-101 coefficients, range and source."""

    c1: float
    c2: float
    c3: float
    c4: float
    c5: float
    tmin: float
    tmax: float
    source: str
    method: str = field(default="dippr101", init=False)

    def __call__(self, temperature):
        return dippr101(temperature, self.c1, self.c2, self.c3, self.c4, self.c5)


@dataclass(frozen=True)
class AntoineCorrelation:
    """One substance's Antoine coefficients (log10, Pa, K), range and source."""

    a: float
    b: float
    c: float
    tmin: float
    tmax: float
    source: str
    method: str = field(default="antoine", init=False)

    def __call__(self, temperature):
        return antoine(temperature, self.a, self.b, self.c)


@dataclass(frozen=True)
class ClausiusClapeyronCorrelation:
    """Clausius-Clapeyron from a reference point, optionally with Watson's ΔHvap(T).

    ``method`` names the variant: "clausius-clapeyron" (constant ΔHvap from the
    table), "clausius-clapeyron-watson", "trouton" (constant ΔHvap from
    Trouton's rule) or "clausius-clapeyron-fit" (a line through user points).
    """

    reference_temperature: float
    reference_pressure: float
    enthalpy_of_vaporization: float
    tmin: float
    tmax: float
    source: str
    method: str = "clausius-clapeyron"
    critical_temperature: float | None = None

    def __call__(self, temperature):
        if self.method == "clausius-clapeyron-watson":
            return clausius_clapeyron_watson(
                temperature, self.reference_temperature, self.reference_pressure,
                self.enthalpy_of_vaporization, self.critical_temperature)
        return clausius_clapeyron(temperature, self.reference_temperature,
                                  self.reference_pressure, self.enthalpy_of_vaporization)


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

    # The first correlation that covers the range. A fitted set a few kelvin short
    # of it (one ending just below the critical point, say) extrapolates better
    # than a Clausius-Clapeyron estimate from the boiling point: it is preferred
    # within `EXTRAPOLATION_MARGIN`. With nothing near, the least extrapolation.
    fitted = [c for c in substance.correlations if c.method in _FITTED]
    for correlation in fitted:
        if reach(correlation) == 0.0:
            return correlation
    for correlation in fitted:
        if reach(correlation) <= EXTRAPOLATION_MARGIN:
            return correlation
    for correlation in substance.correlations:
        if reach(correlation) == 0.0:
            return correlation
    return min(substance.correlations, key=reach)


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
        pressure=correlation(temperature),
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
