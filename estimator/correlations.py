"""Vapour-pressure equations and the correlation objects that hold their coefficients.

Every equation is a plain function of SI floats or numpy arrays (temperature in K,
pressure in Pa, enthalpy in J/mol): Clausius–Clapeyron (one point, or a line
fitted through several), Antoine, DIPPR-101, Watson's ΔHvap(T) and Trouton's
rule. The correlation classes hold one substance's coefficients with their
validity range and source. Method choice lives in `estimator.vapor`; the
substance table (`estimator.substances`) builds these objects. Both import this
module, which imports neither.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from .constants import GAS_CONSTANT, PRESSURE_UNITS, ZERO_CELSIUS
from .errors import InputError

__all__ = [
    "TROUTON_ENTROPY",
    "WATSON_EXPONENT",
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
]


def as_float_array(value):
    """The value as a numpy array of floats."""
    return np.asarray(value, dtype=float)


def same_shape(result, like):
    """A plain float when ``like`` is a scalar, else the array ``result``."""
    return float(result) if np.ndim(like) == 0 else result


#: Trouton's constant, the entropy of vaporization at the normal boiling point of
#: non-associating liquids. [J/(mol K)] About 85-88 J/(mol K) (Trouton 1884; e.g.
#: Atkins, Physical Chemistry); 88 is the value commonly used for screening.
TROUTON_ENTROPY = 88.0

#: Watson's exponent. Watson (1943), Ind. Eng. Chem. 35, 398.
WATSON_EXPONENT = 0.38


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
    t = as_float_array(temperature)
    p = reference_pressure * np.exp(
        -enthalpy_of_vaporization / GAS_CONSTANT * (1.0 / t - 1.0 / reference_temperature)
    )
    return same_shape(p, temperature)


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
        t = as_float_array(temperature)
        p = np.exp(self.intercept - self.enthalpy_of_vaporization / (GAS_CONSTANT * t))
        return same_shape(p, temperature)


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
    t = np.atleast_1d(as_float_array(temperatures)).ravel()
    p = np.atleast_1d(as_float_array(pressures)).ravel()
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
    t = as_float_array(temperature)
    p = np.power(base, a - b / (t + c))
    return same_shape(p, temperature)


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
    if pressure_unit not in PRESSURE_UNITS:
        raise ValueError(f"unknown pressure unit {pressure_unit!r}; "
                         f"expected one of {sorted(PRESSURE_UNITS)}")
    if temperature_unit not in ("degC", "K"):
        raise ValueError("temperature_unit must be 'degC' or 'K'")
    if base == 10.0:
        a10, b10 = a, b
    elif abs(base - math.e) < 1e-12:
        a10, b10 = a / math.log(10.0), b / math.log(10.0)
    else:
        raise ValueError("base must be 10 or e")
    a10 = a10 + math.log10(PRESSURE_UNITS[pressure_unit])
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
    t = as_float_array(temperature)
    p = np.exp(c1 + c2 / t + c3 * np.log(t) + c4 * t**c5)
    return same_shape(p, temperature)


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
    t = as_float_array(temperature)
    ratio = np.clip(1.0 - t / critical_temperature, 0.0, None) / (
        1.0 - reference_temperature / critical_temperature
    )
    return same_shape(reference_enthalpy * ratio**exponent, temperature)


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
    t = as_float_array(temperature)
    half = 0.5 * (t - reference_temperature)
    nodes = reference_temperature + half[..., None] * (_GAUSS_NODES + 1.0)
    enthalpy = watson_enthalpy(nodes, reference_temperature, reference_enthalpy,
                               critical_temperature, exponent)
    integral = half * np.sum(_GAUSS_WEIGHTS * enthalpy / (GAS_CONSTANT * nodes**2), axis=-1)
    return same_shape(reference_pressure * np.exp(integral), temperature)


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
