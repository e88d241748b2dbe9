"""Mass transfer from a pool surface: the Mackay–Matsugu coefficient, the flux it
drives, EPA RMP Eq. D-1, and the substance-level `evaporation_rate`,
`evaporation_estimate` and `compare_models`, with the validity cautions of
`estimator.evaporation`.
"""

from __future__ import annotations

import math
import warnings
from dataclasses import dataclass

import numpy as np

from ..checks import float_or_array, positive_array
from ..constants import (
    FOOT,
    GAS_CONSTANT,
    MILLIMETRE_OF_MERCURY,
    POUND_MASS,
    SECONDS_PER_HOUR,
    SECONDS_PER_MINUTE,
    STANDARD_ATMOSPHERE,
)
from ..errors import OutOfRangeError, UllageError, UllageWarning
from .air import (
    GRAMS_PER_KILOGRAM,
    diffusion_volume_of,
    air_kinematic_viscosity,
    fuller_diffusivity,
)

__all__ = [
    "MODELS",
    "MODEL_NAMES",
    "EvaporationSolverError",
    "mackay_matsugu_coefficient",
    "evaporation_flux",
    "epa_rmp_rate",
    "EvaporationEstimate",
    "evaporation_estimate",
    "evaporation_rate",
    "ModelComparison",
    "compare_models",
]

#: Model keywords and what they are.
MODELS = {
    "mackay-matsugu": "Mackay & Matsugu (1973) mass-transfer coefficient, Schmidt number "
                      "from Fuller's diffusion coefficient and Sutherland's air viscosity",
    "epa-rmp": "US EPA RMP offsite consequence analysis guidance (1999/2009), "
               "Appendix D, Eq. D-1",
}

#: Model keywords and their short names, for screens and tables.
MODEL_NAMES = {"mackay-matsugu": "Mackay–Matsugu", "epa-rmp": "US EPA RMP"}

#: Mackay & Matsugu's coefficient for k and U in m/h and X in m. [-]
MACKAY_MATSUGU_COEFFICIENT = 0.0292
#: Exponents of wind speed, pool diameter and Schmidt number (Mackay & Matsugu 1973).
MACKAY_MATSUGU_WIND_EXPONENT = 0.78
MACKAY_MATSUGU_DIAMETER_EXPONENT = -0.11
MACKAY_MATSUGU_SCHMIDT_EXPONENT = -0.67
#: The same coefficient for k and U in m/s: 0.0292 * 3600**0.78 / 3600 (about
#: 0.00482), derived here rather than retyped.
MACKAY_MATSUGU_COEFFICIENT_SI = (
    MACKAY_MATSUGU_COEFFICIENT * SECONDS_PER_HOUR**MACKAY_MATSUGU_WIND_EXPONENT
    / SECONDS_PER_HOUR
)

#: Coefficient, wind exponent and gas constant of EPA RMP Eq. D-1 as published
#: (QR in lb/min, U in m/s, MW in g/mol, A in ft2, VP in mmHg, T in K; 82.05 is
#: the gas constant in atm cm3/(mol K)).
EPA_RMP_COEFFICIENT = 0.284
EPA_RMP_WIND_EXPONENT = 0.78
EPA_RMP_GAS_CONSTANT = 82.05

#: Above this ratio of vapour pressure to ambient pressure the film-theory
#: rate is more than about 20 % low (the high-flux factor -ln(1-y)/y exceeds
#: 1.19 at y = 0.3; Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed.,
#: Section 22.8, from memory).
HIGH_VOLATILITY_RATIO = 0.3

#: Air speed below which results carry the low-air-speed caution. [m/s]
LOW_AIR_SPEED = 0.5


class EvaporationSolverError(UllageError, RuntimeError):
    """An evaporation integration that failed or ran past its time budget."""


# --------------------------------------------------------------------------
# input checks


def check_model(model: str) -> str:
    if model not in MODELS:
        raise ValueError(f"unknown evaporation model {model!r}; expected one of "
                         f"{list(MODELS)}")
    return model


def check_wind_speed(value, field: str = "wind_speed") -> np.ndarray:
    return positive_array(value, field, "m/s", hint=(
        "; these models need moving air (for still indoor air use a typical room "
        "air speed of 0.05-0.3 m/s, Baldwin & Maynard 1998)"))


def mackay_matsugu_coefficient(wind_speed, pool_diameter, schmidt_number):
    r"""Mass-transfer coefficient over a pool by the Mackay & Matsugu correlation.

    .. math:: k = 0.0292\,U^{0.78} X^{-0.11} \mathrm{Sc}^{-0.67}

    as published, with k and U in m/h and X in m. Here U and k are in m/s; the
    coefficient becomes 0.0292 × 3600^0.78 / 3600 ≈ 0.004819.

    Parameters
    ----------
    wind_speed : float or array_like
        Wind speed; secondary sources take it at 10 m height (check). [m/s]
    pool_diameter : float or array_like
        Pool diameter (downwind length). [m]
    schmidt_number : float or array_like
        Schmidt number of the vapour in air. [-]

    Returns
    -------
    float or numpy.ndarray
        Mass-transfer coefficient. [m/s]

    References
    ----------
    Mackay, D. & Matsugu, R. S. (1973), "Evaporation rates of liquid hydrocarbon
    spills on land and water", Can. J. Chem. Eng. 51, 434-439.

    Examples
    --------
    >>> round(mackay_matsugu_coefficient(1.0, 1.0, 1.0), 6)
    0.004819
    """
    u = np.asarray(wind_speed, dtype=float)
    x = np.asarray(pool_diameter, dtype=float)
    sc = np.asarray(schmidt_number, dtype=float)
    return float_or_array(MACKAY_MATSUGU_COEFFICIENT_SI * u**MACKAY_MATSUGU_WIND_EXPONENT
                * x**MACKAY_MATSUGU_DIAMETER_EXPONENT * sc**MACKAY_MATSUGU_SCHMIDT_EXPONENT)


def evaporation_flux(mass_transfer_coefficient, vapor_pressure, molar_mass, temperature,
                     partial_pressure_air=0.0):
    r"""Evaporation flux from a mass-transfer coefficient and a partial-pressure difference.

    .. math:: E = k\,\frac{(p_\mathrm{sat} - p_\mathrm{air})\,M}{R\,T}

    The driving force is clipped at zero: condensation of vapour from the air
    onto the pool is not modelled, so the flux is never negative.

    Parameters
    ----------
    mass_transfer_coefficient : float or array_like
        [m/s]
    vapor_pressure : float or array_like
        Partial pressure of the vapour at the liquid surface (the saturated
        vapour pressure for a pure liquid). [Pa]
    molar_mass : float or array_like
        [kg/mol]
    temperature : float or array_like
        Temperature of the liquid surface. [K]
    partial_pressure_air : float or array_like
        Partial pressure of the same vapour in the air far from the pool, 0 by
        default. [Pa]

    Returns
    -------
    float or numpy.ndarray
        Evaporation flux. [kg/(m2 s)]

    References
    ----------
    Mackay & Matsugu (1973), Can. J. Chem. Eng. 51, 434.

    Examples
    --------
    >>> round(evaporation_flux(0.003, 3000.0, 0.092, 298.15) * 1e4, 3)
    3.34
    """
    driving = np.clip(np.asarray(vapor_pressure, dtype=float)
                      - np.asarray(partial_pressure_air, dtype=float), 0.0, None)
    return float_or_array(np.asarray(mass_transfer_coefficient, dtype=float) * driving
                * np.asarray(molar_mass, dtype=float)
                / (GAS_CONSTANT * np.asarray(temperature, dtype=float)))


def epa_rmp_rate(molar_mass, vapor_pressure, area, wind_speed, temperature):
    r"""Evaporation rate of a pool by Equation D-1 of the EPA RMP guidance.

    .. math:: Q_R = \frac{0.284\,U^{0.78}\,MW^{2/3}\,A\,VP}{82.05\,T}

    as published, with :math:`Q_R` in lb/min, U in m/s, MW in g/mol, A in ft2,
    VP in mmHg and T in K. The equation is evaluated in those units, with the
    named conversion factors of `estimator.constants`, and the result is
    returned in kg/s. There is no pool-size term.

    Parameters
    ----------
    molar_mass : float or array_like
        [kg/mol]
    vapor_pressure : float or array_like
        Vapour pressure at the pool temperature (minus any background partial
        pressure, if the caller wants that). [Pa]
    area : float or array_like
        Pool area. [m2]
    wind_speed : float or array_like
        Wind speed; the guidance's worst case is 1.5 m/s. [m/s]
    temperature : float or array_like
        Pool temperature. [K]

    Returns
    -------
    float or numpy.ndarray
        Evaporation rate. [kg/s]

    References
    ----------
    US EPA (1999), Risk Management Program Guidance for Offsite Consequence
    Analysis, EPA 550-B-99-009 (revised March 2009), Appendix D, Eq. D-1.

    Examples
    --------
    Toluene (92.14 g/mol, 3.79 kPa at 25 degC) over 100 m2 at 1.5 m/s:

    >>> round(epa_rmp_rate(0.09214, 3790.0, 100.0, 1.5, 298.15), 4)
    0.0752
    """
    mw_grams = np.asarray(molar_mass, dtype=float) * GRAMS_PER_KILOGRAM
    area_ft2 = np.asarray(area, dtype=float) / FOOT**2
    vp_mmhg = np.asarray(vapor_pressure, dtype=float) / MILLIMETRE_OF_MERCURY
    u = np.asarray(wind_speed, dtype=float)
    t = np.asarray(temperature, dtype=float)
    rate_lb_per_min = (EPA_RMP_COEFFICIENT * u**EPA_RMP_WIND_EXPONENT * mw_grams ** (2.0 / 3.0)
                       * area_ft2 * vp_mmhg / (EPA_RMP_GAS_CONSTANT * t))
    return float_or_array(rate_lb_per_min * POUND_MASS / SECONDS_PER_MINUTE)


@dataclass(frozen=True)
class EvaporationEstimate:
    """A pool evaporation rate with the quantities behind it.

    Attributes
    ----------
    rate : float or numpy.ndarray
        Evaporation rate. [kg/s]
    flux : float or numpy.ndarray
        Rate per unit pool area. [kg/(m2 s)]
    model : str
        Model keyword (see `MODELS`).
    vapor_pressure : float or numpy.ndarray
        Saturated vapour pressure at the pool temperature. [Pa]
    mass_transfer_coefficient : float or numpy.ndarray
        The model's mass-transfer coefficient; for "epa-rmp" the coefficient
        implied by Eq. D-1. [m/s]
    diffusivity : float, numpy.ndarray or None
        Diffusion coefficient in air (Mackay-Matsugu only). [m2/s]
    schmidt_number : float, numpy.ndarray or None
        (Mackay-Matsugu only). [-]
    pool_diameter : float or numpy.ndarray
        Equivalent diameter of the pool. [m]
    warnings : tuple of str
        Cautions about validity and estimated inputs.
    """

    rate: object
    flux: object
    model: str
    vapor_pressure: object
    mass_transfer_coefficient: object
    diffusivity: object
    schmidt_number: object
    pool_diameter: object
    warnings: tuple[str, ...] = ()


def boiling_check(sub, t: np.ndarray, p_sat, pressure, field: str) -> None:
    hot = t >= sub.boiling_point
    if np.any(hot):
        raise OutOfRangeError(field, (
            f"{float(np.max(t)) - 273.15:.1f} °C is at or above the normal boiling point of "
            f"{sub.name} ({sub.boiling_point - 273.15:.1f} °C): the pool would boil (a boiling "
            "pool or a flashing release), which is driven by heat input and lies "
            "outside these evaporation models; use a boiling-pool or flash model"))
    if p_sat is not None and np.any(np.asarray(p_sat) >= np.asarray(pressure)):
        raise OutOfRangeError(field, (
            f"the vapour pressure of {sub.name} reaches the ambient pressure at "
            f"{float(np.max(t)) - 273.15:.1f} °C: the pool would boil (a boiling pool or a "
            "flashing release), which lies outside these evaporation models"))


def low_air_speed_note(share=None) -> str:
    """The caution for air speeds below `LOW_AIR_SPEED`; ``share`` is the fraction of
    Monte Carlo samples below it (None for a single case)."""
    where = "" if share is None else f" in {100 * share:.3g} % of samples"
    return (f"air speed below {LOW_AIR_SPEED:g} m/s{where}: the models tend to "
            "under-predict evaporation at low air speeds (Lennert, Nielsen & Breum 1997)")


def validity_notes(name, p_sat, pressure, wind) -> list[str]:
    notes = []
    ratio = float(np.max(np.asarray(p_sat) / np.asarray(pressure)))
    if ratio > HIGH_VOLATILITY_RATIO:
        factor = -math.log1p(-min(ratio, 0.999)) / ratio
        notes.append(
            f"{name}: the vapour pressure is {100 * ratio:.0f} % of the ambient "
            f"pressure; the dilute-vapour models may under-predict by a factor of about "
            f"{factor:.2f} this close to boiling")
    if np.min(wind) < LOW_AIR_SPEED:
        notes.append(low_air_speed_note())
    return notes


def prepare_pool(substance_or_key, temperature, area, wind_speed, pressure,
             partial_pressure_air, field="substance_or_key"):
    from ..substances import as_substance
    from ..vapor import vapor_pressure_estimate

    sub = as_substance(substance_or_key, field)
    t = positive_array(temperature, "temperature", "K")
    a = positive_array(area, "area", "m2")
    u = check_wind_speed(wind_speed)
    p = positive_array(pressure, "pressure", "Pa")
    p_air = positive_array(partial_pressure_air, "partial_pressure_air", "Pa", allow_zero=True)
    boiling_check(sub, t, None, p, "temperature")
    estimate = vapor_pressure_estimate(sub, t, field="temperature")
    p_sat = np.asarray(estimate.pressure, dtype=float)
    boiling_check(sub, t, p_sat, p, "temperature")
    notes = list(estimate.warnings) + list(sub.notes) + validity_notes(sub.name, p_sat, p, u)
    return sub, t, a, u, p, p_air, p_sat, notes


def pool_mass_transfer(sub, t, a, u, p, model, field):
    """Mass-transfer coefficient [m/s], diffusivity, Schmidt number, diameter, notes."""
    diameter = np.sqrt(4.0 * a / math.pi)
    if model == "mackay-matsugu":
        volume, note = diffusion_volume_of(sub, field)
        d = np.asarray(fuller_diffusivity(t, p, sub.molar_mass, volume))
        sc = np.asarray(air_kinematic_viscosity(t, p)) / d
        k = np.asarray(mackay_matsugu_coefficient(u, diameter, sc))
        return k, d, sc, diameter, [note] if note else []
    if model == "epa-rmp":
        # Eq. D-1 is linear in VP and A: the coefficient it implies.
        per_pascal = np.asarray(epa_rmp_rate(sub.molar_mass, 1.0, 1.0, u, t))
        k = per_pascal * GAS_CONSTANT * t / sub.molar_mass
        return k * np.ones_like(diameter), None, None, diameter, []
    raise ValueError(f"unknown evaporation model {model!r}; expected one of {list(MODELS)}")


def evaporation_estimate(substance_or_key, temperature, area, wind_speed,
                         model="mackay-matsugu", pressure=STANDARD_ATMOSPHERE,
                         partial_pressure_air=0.0) -> EvaporationEstimate:
    """Evaporation rate of a pure-liquid pool with the quantities behind it.

    Parameters and model keywords as for `evaporation_rate`.

    Returns
    -------
    EvaporationEstimate
    """
    check_model(model)
    sub, t, a, u, p, p_air, p_sat, notes = prepare_pool(
        substance_or_key, temperature, area, wind_speed, pressure, partial_pressure_air)
    k, d, sc, diameter, more = pool_mass_transfer(sub, t, a, u, p, model, "substance_or_key")
    notes += more
    if np.any(p_air >= p_sat):
        notes.append(f"{sub.name}: the partial pressure in the air is at or above the "
                     "vapour pressure; the rate is set to zero (condensation is not "
                     "modelled)")
    flux = np.asarray(evaporation_flux(k, p_sat, sub.molar_mass, t, p_air))
    return EvaporationEstimate(
        rate=float_or_array(flux * a),
        flux=float_or_array(flux),
        model=model,
        vapor_pressure=float_or_array(p_sat),
        mass_transfer_coefficient=float_or_array(k),
        diffusivity=None if d is None else float_or_array(d),
        schmidt_number=None if sc is None else float_or_array(sc),
        pool_diameter=float_or_array(diameter),
        warnings=tuple(dict.fromkeys(notes)),
    )


def evaporation_rate(substance_or_key, temperature, area, wind_speed,
                     model="mackay-matsugu", pressure=101325.0, partial_pressure_air=0.0):
    """Evaporation rate of a pool of pure liquid at a known temperature.

    Parameters
    ----------
    substance_or_key : Substance or str
        A substance, or a name, synonym or CAS number of the table.
    temperature : float or array_like
        Pool temperature, below the boiling point; ambient for a screening
        estimate. [K]
    area : float or array_like
        Pool area (see `spill_pool_area`). [m2]
    wind_speed : float or array_like
        Air speed over the pool; outdoors the wind speed at 10 m, 1.5 m/s in the
        EPA RMP worst case. [m/s]
    model : str
        "mackay-matsugu" (default) or "epa-rmp" (see `MODELS`).
    pressure : float
        Ambient pressure, 101325 Pa by default. [Pa]
    partial_pressure_air : float or array_like
        Partial pressure of the vapour already in the air, 0 by default. [Pa]

    Returns
    -------
    float or numpy.ndarray
        Evaporation rate. [kg/s]

    Raises
    ------
    ValueError
        For an unknown model keyword.
    InputError
        For non-positive area or wind speed, NaN, a temperature at or above the
        boiling point (a boiling pool), or a substance without the data needed.

    Warns
    -----
    UllageWarning
        For low air speeds, vapour pressures close to the ambient pressure and
        estimated diffusion volumes; `ExtrapolationWarning` for vapour pressures
        outside the correlation's range.

    Examples
    --------
    A liquid defined from its safety data sheet; it has no Fuller diffusion
    volume, so its liquid molar volume stands in (with a warning):

    >>> from estimator.substances import user_substance
    >>> liquid = user_substance("Solvent X", 0.09214, 383.75, [(293.15, 2910.0)],
    ...                         liquid_density=867.0)
    >>> import warnings
    >>> with warnings.catch_warnings():
    ...     warnings.simplefilter("ignore")
    ...     round(evaporation_rate(liquid, 293.15, 10.0, 2.0) * 1000, 2)
    5.17
    """
    from ..errors import ExtrapolationWarning

    estimate = evaporation_estimate(substance_or_key, temperature, area, wind_speed, model,
                                    pressure, partial_pressure_air)
    for note in estimate.warnings:
        category = ExtrapolationWarning if "lies outside" in note else UllageWarning
        warnings.warn(note, category, stacklevel=2)
    return estimate.rate


@dataclass(frozen=True)
class ModelComparison:
    """The two evaporation models side by side, for the same pool.

    Attributes
    ----------
    mackay_matsugu : float or numpy.ndarray
        Rate by Mackay & Matsugu (1973). [kg/s]
    epa_rmp : float or numpy.ndarray
        Rate by EPA RMP Eq. D-1. [kg/s]
    ratio : float or numpy.ndarray
        epa_rmp / mackay_matsugu. [-]
    vapor_pressure : float or numpy.ndarray
        [Pa]
    warnings : tuple of str
    """

    mackay_matsugu: object
    epa_rmp: object
    ratio: object
    vapor_pressure: object
    warnings: tuple[str, ...] = ()


def compare_models(substance_or_key, temperature, area, wind_speed,
                   pressure=STANDARD_ATMOSPHERE, partial_pressure_air=0.0) -> ModelComparison:
    """Evaporation rate of one pool by both models, and their ratio.

    The models differ in form (EPA's Eq. D-1 has no pool-size term and folds
    the Schmidt number into the molar mass) and typically agree within a
    factor of about two; in ullage's tests (toluene over 100 m2 at 1.5 m/s,
    acetone over 1 m2 at 1 m/s) EPA's rate is the higher, by 30-65 %.

    Parameters
    ----------
    Same as `evaporation_rate`, without `model`.

    Returns
    -------
    ModelComparison
    """
    mm = evaporation_estimate(substance_or_key, temperature, area, wind_speed,
                              "mackay-matsugu", pressure, partial_pressure_air)
    epa = evaporation_estimate(substance_or_key, temperature, area, wind_speed,
                               "epa-rmp", pressure, partial_pressure_air)
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio = np.asarray(epa.rate) / np.asarray(mm.rate)
    return ModelComparison(
        mackay_matsugu=mm.rate,
        epa_rmp=epa.rate,
        ratio=float_or_array(ratio),
        vapor_pressure=mm.vapor_pressure,
        warnings=tuple(dict.fromkeys(mm.warnings + epa.warnings)),
    )
