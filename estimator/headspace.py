"""The equilibrium headspace over a liquid: concentrations, flammability and oxygen.

The vapour space of a closed tank left long enough reaches equilibrium with the
liquid: each component's partial pressure follows Raoult's law from its saturated
vapour pressure. That is the worst case for a closed space, and it is what this
module computes; the real atmosphere must still be measured before entry.
"""

from __future__ import annotations

import math
import warnings
from dataclasses import dataclass

import numpy as np

from .constants import (
    GAS_CONSTANT,
    MOLAR_MASS_AIR,
    OXYGEN_IN_AIR,
    STANDARD_ATMOSPHERE,
    STANDARD_GRAVITY,
)
from .errors import InputError, OutOfRangeError
from .mixtures import Liquid, liquid as make_liquid
from .vapor import VaporPressureEstimate, vapor_pressure_estimate

__all__ = [
    "Headspace",
    "headspace",
    "temperature_for_concentration",
    "temperature_for_percent_lfl",
    "estimated_flash_point",
    "water_headspace",
    "FlashPointEstimate",
    "barometric_pressure",
    "site_pressure",
    "le_chatelier",
    "FLAMMABILITY_STATES",
]

#: Plain-language flammability states of a vapour-air mixture.
FLAMMABILITY_STATES = {
    "none": "flammability not judged: no component has a flammability limit on record "
            "(it may still burn; enter the limits from the safety data sheet)",
    "lean": "below the lower flammability limit (too lean to burn)",
    "flammable": "within the flammable range: it can ignite",
    "rich": "above the upper flammability limit (too rich to burn): it becomes "
            "flammable when diluted with air, for example when the tank is vented or opened",
}

#: Temperature lapse rate of the standard troposphere. [K/m] ISO 2533:1975.
_LAPSE_RATE = 0.0065
#: Sea-level temperature of the standard atmosphere. [K] ISO 2533:1975.
_SEA_LEVEL_TEMPERATURE = 288.15


def barometric_pressure(elevation):
    """Barometric pressure at a site elevation by the standard atmosphere.

    Parameters
    ----------
    elevation : float or array_like
        Height above mean sea level, -500 to 11000 m (the troposphere). [m]

    Returns
    -------
    float or numpy.ndarray
        Pressure. [Pa]

    References
    ----------
    ISO 2533:1975 Standard Atmosphere; U.S. Standard Atmosphere 1976, Eq. 33a.

    Examples
    --------
    Denver, 1609 m (the 1976 standard atmosphere tables give 83.4 kPa):

    >>> round(barometric_pressure(1609.0))
    83431
    """
    h = np.asarray(elevation, dtype=float)
    if not np.all(np.isfinite(h)) or np.any(h < -500.0) or np.any(h > 11000.0):
        raise InputError("elevation", "must be between -500 m and 11000 m above sea level")
    exponent = STANDARD_GRAVITY * MOLAR_MASS_AIR / (GAS_CONSTANT * _LAPSE_RATE)
    p = STANDARD_ATMOSPHERE * (1.0 - _LAPSE_RATE * h / _SEA_LEVEL_TEMPERATURE) ** exponent
    return float(p) if np.ndim(elevation) == 0 else p


def site_pressure(barometric=None, elevation=None, gauge=0.0) -> float:
    """Absolute pressure in a vapour space: barometric (given or from elevation) + gauge.

    Parameters
    ----------
    barometric : float, optional
        Measured barometric pressure. [Pa]
    elevation : float, optional
        Site elevation, used when no barometric pressure is given. [m]
    gauge : float
        Gauge pressure of a closed tank; negative for a vacuum. [Pa]

    Returns
    -------
    float
        Absolute pressure. [Pa]
    """
    if barometric is not None and elevation is not None:
        raise InputError("barometric pressure", "give either the barometric pressure or "
                         "the site elevation, not both")
    if barometric is not None:
        base = _check_pressure(barometric, "barometric pressure")
    elif elevation is not None:
        base = barometric_pressure(elevation)
    else:
        base = STANDARD_ATMOSPHERE
    total = base + float(gauge)
    if not math.isfinite(total) or total <= 0:
        raise InputError("gauge pressure", f"the absolute pressure would be {total:g} Pa; "
                         "a gauge pressure cannot be below minus the barometric pressure")
    return total


def _check_pressure(pressure, field="pressure") -> float:
    try:
        p = float(pressure)
    except (TypeError, ValueError):
        raise InputError(field, f"expected a pressure in Pa, got {pressure!r}") from None
    if not math.isfinite(p) or p <= 0:
        raise InputError(field, f"{p:g} Pa: the absolute pressure must be above zero")
    if p < 1e3 or p > 1e7:
        raise InputError(field, f"{p:g} Pa is outside 1 kPa-10 MPa; pressures are "
                         "absolute, in pascals (101325 Pa = 1 atm)")
    return p


def le_chatelier(volume_fractions, limits):
    """Flammability limit of a fuel mixture by Le Chatelier's rule.

    .. math:: L_\\mathrm{mix} = \\frac{\\sum_i y_i}{\\sum_i y_i / L_i}

    on a fuel-only basis (components without a limit are left out; their inerting
    effect is neglected, which errs on the safe side for the LFL).

    Parameters
    ----------
    volume_fractions : array_like
        Shape (n, ...). [volume fraction]
    limits : array_like
        Shape (n,), NaN for components without a limit. [volume fraction]

    Returns
    -------
    numpy.ndarray
        The mixture's limit, NaN where no fuel is present. [volume fraction]

    References
    ----------
    Le Chatelier, H. (1891), Ann. Mines 19, 388; Mashuga & Crowl (2000), Process
    Safety Progress 19(2), 112-117.

    Examples
    --------
    >>> round(float(le_chatelier([0.5, 0.5], [0.011, 0.012])), 5)
    0.01148
    """
    y = np.asarray(volume_fractions, dtype=float)
    lim = np.asarray(limits, dtype=float).reshape((-1,) + (1,) * (y.ndim - 1))
    fuel = np.isfinite(lim)
    fuel_total = np.sum(np.where(fuel, y, 0.0), axis=0)
    weighted = np.sum(np.where(fuel, y / np.where(fuel, lim, 1.0), 0.0), axis=0)
    with np.errstate(invalid="ignore", divide="ignore"):
        return np.where(weighted > 0, fuel_total / weighted, np.nan)


@dataclass(frozen=True)
class Headspace:
    """Equilibrium vapour space over a liquid.

    Arrays have shape (n_components, *temperature.shape) per component, and the
    temperature's shape for totals.

    Attributes
    ----------
    liquid : Liquid
    temperature : float or numpy.ndarray
        [K]
    pressure : float
        Absolute pressure of the vapour space. [Pa]
    saturation_pressures, partial_pressures : numpy.ndarray
        Pure-component vapour pressures and Raoult partial pressures. [Pa]
    volume_fractions : numpy.ndarray
        Per component. [volume fraction]
    total_volume_fraction : numpy.ndarray
        Of all vapour. [volume fraction]
    mass_concentrations : numpy.ndarray
        Per component, at the actual temperature and pressure. [kg/m3]
    lfl_mixture, ufl_mixture : numpy.ndarray
        Le Chatelier limits of the vapour's fuel mix, NaN if none. [volume fraction]
    percent_lfl : numpy.ndarray
        Fuel concentration as a percentage of the mixture LFL (0 if no fuel). [%]
    oxygen_percent : numpy.ndarray
        Oxygen left after the vapour displaces air. [% by volume]
    boiling : numpy.ndarray of bool
        Where the total vapour pressure reaches the vapour-space pressure.
    flammability : numpy.ndarray of str
        Keys of `FLAMMABILITY_STATES`.
    vapor_pressure_methods : tuple of VaporPressureEstimate
        The method used for each component.
    relative_uncertainty : float or None
        Largest stated uncertainty among the components' methods. [-]
    warnings : tuple of str
    """

    liquid: Liquid
    temperature: object
    pressure: float
    saturation_pressures: np.ndarray
    partial_pressures: np.ndarray
    volume_fractions: np.ndarray
    total_volume_fraction: np.ndarray
    mass_concentrations: np.ndarray
    lfl_mixture: np.ndarray
    ufl_mixture: np.ndarray
    percent_lfl: np.ndarray
    oxygen_percent: np.ndarray
    boiling: np.ndarray
    flammability: np.ndarray
    vapor_pressure_methods: tuple[VaporPressureEstimate, ...]
    relative_uncertainty: float | None
    warnings: tuple[str, ...]

    @property
    def ppm(self) -> np.ndarray:
        """Per component. [ppm by volume]"""
        return self.volume_fractions * 1e6

    @property
    def total_ppm(self):
        """All vapour. [ppm by volume]"""
        return _scalar(self.total_volume_fraction * 1e6)

    @property
    def mg_per_m3(self) -> np.ndarray:
        """Per component, at the actual temperature and pressure. [mg/m3]"""
        return self.mass_concentrations * 1e6

    @property
    def total_mg_per_m3(self):
        """All vapour, at the actual temperature and pressure. [mg/m3]"""
        return _scalar(self.mass_concentrations.sum(axis=0) * 1e6)

    @property
    def flammability_words(self):
        """The flammability state in plain words."""
        words = np.vectorize(FLAMMABILITY_STATES.get, otypes=[object])(self.flammability)
        return words.item() if words.ndim == 0 else words


def _scalar(a):
    a = np.asarray(a)
    return float(a) if a.ndim == 0 else a


def _estimates(liq: Liquid, t, field) -> list[VaporPressureEstimate]:
    return [vapor_pressure_estimate(c, t, field=field) for c in liq.components]


def headspace(liquid, temperature, pressure=STANDARD_ATMOSPHERE, *, basis="mole",
              activity_coefficients=None) -> Headspace:
    """Equilibrium headspace over a pure liquid or a mixture.

    Parameters
    ----------
    liquid : Liquid, Substance, str or mapping
        A liquid; a substance or its name, synonym or CAS number; or a mapping of
        those to fractions on `basis`.
    temperature : float or array_like
        Liquid (and vapour-space) temperature; an array gives a sweep. [K]
    pressure : float
        Absolute pressure of the vapour space (barometric plus gauge). [Pa]
    basis : str
        Basis of a mapping's fractions: "mole", "mass" or "volume".
    activity_coefficients : mapping or array_like, optional
        For Raoult's law; 1 (ideal solution) where not given.

    Returns
    -------
    Headspace

    Examples
    --------
    >>> hs = headspace("toluene", 298.15)
    >>> round(hs.total_ppm, -2), hs.flammability.item()
    (37400.0, 'flammable')
    """
    liq = make_liquid(liquid, basis, activity_coefficients)
    p_total = _check_pressure(pressure)
    estimates = _estimates(liq, temperature, "temperature")
    notes = list(liq.warnings)
    for e in estimates:
        notes.extend(e.warnings)
    p_sat = np.stack([np.asarray(e.pressure, dtype=float) for e in estimates])
    gammas = liq.activity_coefficients_at(temperature)
    p_i = liq.mole_fractions.reshape((-1,) + (1,) * (p_sat.ndim - 1)) * gammas * p_sat
    above_own = [c.name for c, ps in zip(liq.components, p_sat) if np.any(ps >= p_total)]
    if above_own and not liq.is_pure:
        notes.append(f"{', '.join(above_own)} is above its own boiling point at this "
                     "pressure; in an open vessel it would boil off")
    return _assemble(liq, temperature, p_total, p_sat, p_i, tuple(estimates), notes)


def _assemble(liq: Liquid, temperature, p_total: float, p_sat, p_i, estimates,
              notes: list[str]) -> Headspace:
    """A `Headspace` from the partial pressures of each component."""
    t = np.asarray(temperature, dtype=float)
    p_sum = p_i.sum(axis=0)
    boiling = p_sum >= p_total
    y = p_i / np.maximum(p_sum, p_total)
    y_total = y.sum(axis=0)
    if np.any(boiling):
        at = t[boiling] if t.ndim else t
        notes.append(
            f"at {np.min(at) - 273.15:.1f} °C{' and above' if t.ndim else ''} the liquid "
            f"is at or above its boiling point at {p_total / 1000:.1f} kPa: the vapour "
            "pressure reaches the pressure of the space, which then holds essentially pure "
            "vapour (air displaced)")
    molar = liq.molar_masses.reshape((-1,) + (1,) * t.ndim)
    conc = y * p_total * molar / (GAS_CONSTANT * t)
    lfl = np.array([c.lower_flammability_limit if c.lower_flammability_limit else np.nan
                    for c in liq.components])
    ufl = np.array([c.upper_flammability_limit if c.upper_flammability_limit else np.nan
                    for c in liq.components])
    lfl_mix = le_chatelier(y, lfl)
    ufl_mix = le_chatelier(y, ufl)
    fuel = np.sum(np.where(np.isfinite(lfl).reshape(molar.shape), y, 0.0), axis=0)
    with np.errstate(invalid="ignore"):
        percent = np.where(np.isfinite(lfl_mix), 100.0 * fuel / lfl_mix, 0.0)
        state = np.where(~np.isfinite(lfl_mix), "none",
                         np.where(fuel < lfl_mix, "lean",
                                  np.where(np.isfinite(ufl_mix) & (fuel > ufl_mix),
                                           "rich", "flammable")))
    if np.any(np.isfinite(lfl)) and np.any(~np.isfinite(ufl[np.isfinite(lfl)])):
        notes.append("an upper flammability limit is missing for a flammable component; "
                     "the too-rich state cannot be judged for it")
    uncertainties = [e.relative_uncertainty for e in estimates
                     if e.relative_uncertainty is not None]
    return Headspace(
        liquid=liq,
        temperature=temperature if np.ndim(temperature) == 0 else t,
        pressure=p_total,
        saturation_pressures=p_sat,
        partial_pressures=np.where(boiling, p_i * p_total / np.maximum(p_sum, p_total), p_i),
        volume_fractions=y,
        total_volume_fraction=_scalar(y_total),
        mass_concentrations=conc,
        lfl_mixture=_scalar(lfl_mix),
        ufl_mixture=_scalar(ufl_mix),
        percent_lfl=_scalar(percent),
        oxygen_percent=_scalar(100.0 * OXYGEN_IN_AIR * (1.0 - y_total)),
        boiling=boiling,
        flammability=state,
        vapor_pressure_methods=tuple(estimates),
        relative_uncertainty=max(uncertainties) if uncertainties else None,
        warnings=tuple(dict.fromkeys(notes)),
    )


def water_headspace(dissolved, temperature, pressure=STANDARD_ATMOSPHERE) -> Headspace:
    """Equilibrium headspace over water holding dilute dissolved volatiles.

    Water by Raoult's law (its mole fraction taken as 1 less the solutes'), each
    solute by Henry's law with the bundled constants and their van 't Hoff
    temperature dependence (`estimator.henry`). For wastewater sumps, scrubber
    liquor and contaminated water; not for solvent layers floating on the water.

    Parameters
    ----------
    dissolved : mapping
        Substance key, name or CAS -> dissolved concentration. [kg/m3]
        (1 mg/L = 1e-3 kg/m3)
    temperature : float or array_like
        Water temperature, 0-100 degC. [K]
    pressure : float
        Absolute pressure of the space. [Pa]

    Returns
    -------
    Headspace
        With water as the first component.

    Examples
    --------
    Water holding 1 mg/L of benzene at 25 degC (Sander 2015 constants):

    >>> hs = water_headspace({"benzene": 1e-3}, 298.15)
    >>> round(float(hs.ppm[1]), 1)
    74.3
    """
    from .henry import henry_constants, henry_partial_pressure
    from .mixtures import Liquid
    from .substances import as_substance

    if not dissolved:
        raise InputError("dissolved", "name at least one dissolved compound")
    p_total = _check_pressure(pressure)
    water = as_substance("water")
    solutes = [as_substance(k, "dissolved compound") for k in dissolved]
    notes: list[str] = []
    t = np.asarray(temperature, dtype=float)
    partial = []
    for sub, value in zip(solutes, dissolved.values()):
        try:
            c = float(value)
        except (TypeError, ValueError):
            raise InputError(f"dissolved {sub.name}", f"expected a concentration in kg/m3, "
                             f"got {value!r}") from None
        if not np.isfinite(c) or c < 0:
            raise InputError(f"dissolved {sub.name}", "must be a concentration of 0 or more")
        constants = henry_constants(sub.key)
        with warnings.catch_warnings(record=True) as caught:
            warnings.simplefilter("always")
            p = henry_partial_pressure(c, sub.molar_mass, temperature, constants.hcp_298,
                                       constants.temperature_dependence,
                                       constants.solubility_298)
        notes.extend(f"{sub.name}: {w.message}" for w in caught)
        partial.append(np.asarray(p, dtype=float))
    water_estimate = vapor_pressure_estimate(water, temperature)
    notes.extend(water_estimate.warnings)
    moles_per_m3 = np.array([float(v) / s.molar_mass for s, v in zip(solutes, dissolved.values())])
    x_solutes = moles_per_m3 / (WATER_MOLAR_CONCENTRATION + moles_per_m3.sum())
    x = np.concatenate(([1.0 - x_solutes.sum()], x_solutes))
    p_water = np.asarray(water_estimate.pressure, dtype=float)
    p_i = np.stack([x[0] * p_water] + partial)
    p_sat = np.stack([p_water] + [np.full(t.shape, np.nan) for _ in solutes])
    liq = Liquid((water, *solutes), x, np.ones(x.size),
                 "water by Raoult's law; dissolved compounds by Henry's law (Sander 2015 "
                 "compilation)")
    notes.append("dissolved compounds by Henry's law, valid for dilute solutions")
    return _assemble(liq, temperature, p_total, p_sat, p_i, (water_estimate,), notes)


#: Molar concentration of liquid water near 25 degC. [mol/m3] IAPWS-95 density
#: 997.05 kg/m3 over 18.015 g/mol.
WATER_MOLAR_CONCENTRATION = 997.047 / 18.015268e-3


class AboveAtLowestTemperature(OutOfRangeError):
    """The target is exceeded at every temperature the liquid exists at.

    Attributes
    ----------
    temperature : float
        The lowest liquid temperature, where the target is already exceeded. [K]
    """

    def __init__(self, field: str, message: str, temperature: float):
        self.temperature = temperature
        super().__init__(field, message)


def _liquid_range(liq: Liquid) -> tuple[float, float]:
    lo = max([c.melting_point or 0.0 for c in liq.components] + [120.0])
    hi = min([c.critical_temperature or 2000.0 for c in liq.components])
    return lo + 1e-6, hi - 1e-6


def _solve(liq, objective, target, pressure, what) -> float:
    from scipy.optimize import brentq

    lo, hi = _liquid_range(liq)

    def f(temperature):
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            hs = headspace(liq, temperature, pressure)
        return objective(hs) - target

    f_lo = f(lo)
    if f_lo >= 0:
        raise AboveAtLowestTemperature(
            what, f"the headspace is already at or above {target:g} at {lo - 273.15:.1f} "
            "°C, the lowest temperature the liquid exists at; no lower temperature "
            "reaches it", lo)
    if f(hi) < 0:
        raise OutOfRangeError(what, f"{target:g} is never reached below the critical "
                              "temperature")
    try:
        return float(brentq(f, lo, hi, xtol=1e-6, rtol=1e-10, maxiter=200))
    except RuntimeError:
        raise OutOfRangeError(what, f"the temperature for {target:g} was not found within "
                              "200 iterations; try a nearby target") from None


def temperature_for_concentration(liquid, volume_fraction, pressure=STANDARD_ATMOSPHERE,
                                  *, basis="mole", activity_coefficients=None) -> float:
    """Liquid temperature at which the equilibrium headspace reaches a concentration.

    Parameters
    ----------
    liquid : Liquid, Substance, str or mapping
        As for `headspace`.
    volume_fraction : float
        Target total vapour concentration, above 0 and below 1 (1e-6 per ppm). [-]
    pressure : float
        Absolute pressure of the vapour space. [Pa]

    Returns
    -------
    float
        Temperature. [K]

    Examples
    --------
    >>> round(temperature_for_concentration("acetone", 0.10) - 273.15, 1)
    1.6
    """
    liq = make_liquid(liquid, basis, activity_coefficients)
    target = float(volume_fraction)
    if not math.isfinite(target) or not 0.0 < target < 1.0:
        raise InputError("volume_fraction", f"{target!r} must be above 0 and below 1 "
                         "(a fraction: 0.001 for 1000 ppm)")
    return _solve(liq, lambda hs: float(hs.total_volume_fraction), target, pressure,
                  "volume_fraction")


def temperature_for_percent_lfl(liquid, percent, pressure=STANDARD_ATMOSPHERE, *,
                                basis="mole", activity_coefficients=None) -> float:
    """Liquid temperature at which the headspace reaches a percentage of its LFL.

    Parameters
    ----------
    liquid : Liquid, Substance, str or mapping
        As for `headspace`; at least one component must have an LFL.
    percent : float
        Target, such as 10 (an alarm level) or 100 (the LFL itself). [% of LFL]
    pressure : float
        Absolute pressure of the vapour space. [Pa]

    Returns
    -------
    float
        Temperature. [K]
    """
    liq = make_liquid(liquid, basis, activity_coefficients)
    if not any(c.lower_flammability_limit for c in liq.components):
        raise InputError("liquid", "no component has a lower flammability limit")
    target = float(percent)
    if not math.isfinite(target) or not 0.0 < target <= 100.0:
        raise InputError("percent of LFL", f"{target!r} must be above 0 and at most 100")
    return _solve(liq, lambda hs: float(hs.percent_lfl), target, pressure, "percent of LFL")


@dataclass(frozen=True)
class FlashPointEstimate:
    """The temperature at which the saturated vapour reaches the LFL, beside the
    published closed-cup flash point.

    Attributes
    ----------
    estimate : float
        [K]
    published : float or None
        Published closed-cup flash point of a pure liquid. [K]
    published_source : str
    note : str
    """

    estimate: float
    published: float | None
    published_source: str
    note: str

    @property
    def difference(self) -> float | None:
        """estimate - published. [K]"""
        return None if self.published is None else self.estimate - self.published


def estimated_flash_point(liquid, pressure=STANDARD_ATMOSPHERE, *, basis="mole",
                          activity_coefficients=None) -> FlashPointEstimate:
    """Estimate the flash point as the temperature where the headspace reaches the LFL.

    This is the lower temperature limit of flammability (ASTM E1232); the closed-cup
    flash point usually lies a few kelvin above it. For mixtures the method is
    that of Liaw et al. (2002), J. Loss Prev. Process Ind. 15, 429-438, with
    Raoult's law and Le Chatelier's rule.

    Returns
    -------
    FlashPointEstimate
    """
    liq = make_liquid(liquid, basis, activity_coefficients)
    estimate = temperature_for_percent_lfl(liq, 100.0, pressure)
    published, source = None, ""
    if liq.is_pure:
        sub = liq.components[0]
        published = sub.flash_point
        source = sub.sources.get("flash_point", "")
    return FlashPointEstimate(
        estimate=estimate, published=published, published_source=source,
        note="temperature at which the saturated vapour reaches the LFL (Le Chatelier "
             "for mixtures); closed-cup flash points usually lie a few kelvin higher",
    )
