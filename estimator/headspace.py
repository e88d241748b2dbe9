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

from .checks import ELEVATION_RANGE, check_barometric_pressure, check_pressure
from .constants import (
    GAS_CONSTANT,
    MOLAR_MASS_AIR,
    OXYGEN_IN_AIR,
    STANDARD_ATMOSPHERE,
    STANDARD_GRAVITY,
)
from .errors import InputError, OutOfRangeError
from .mixtures import Liquid, liquid as make_liquid
from .vapor import (
    SUBCOOLED_LIMIT,
    VaporPressureEstimate,
    component_vapor_pressure_estimates,
    vapor_pressure_estimate,
)

__all__ = [
    "Headspace",
    "headspace",
    "temperature_for_concentration",
    "temperature_for_percent_lfl",
    "estimated_flash_point",
    "boiling_temperature",
    "BoilingTemperature",
    "water_headspace",
    "FlashPointEstimate",
    "barometric_pressure",
    "site_pressure",
    "le_chatelier",
    "component_limits",
    "air_flammability",
    "AirFlammability",
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
    low, high = ELEVATION_RANGE
    if not np.all(np.isfinite(h)) or np.any(h < low) or np.any(h > high):
        raise InputError("elevation", f"must be between {low:g} m and {high:g} m above sea "
                                      "level")
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
        base = check_barometric_pressure(barometric, "barometric pressure")
    elif elevation is not None:
        base = barometric_pressure(elevation)
    else:
        base = STANDARD_ATMOSPHERE
    total = base + float(gauge)
    if not math.isfinite(total) or total <= 0:
        raise InputError("gauge pressure", f"the absolute pressure would be {total:g} Pa; "
                         "a gauge pressure cannot be below minus the barometric pressure")
    return total


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


def component_limits(components) -> tuple[np.ndarray, np.ndarray]:
    """Lower and upper flammability limits of each component, NaN where none is on record.

    Returns
    -------
    (numpy.ndarray, numpy.ndarray)
        LFLs and UFLs, shape (n,). [volume fraction]
    """
    lfl = np.array([c.lower_flammability_limit or np.nan for c in components], dtype=float)
    ufl = np.array([c.upper_flammability_limit or np.nan for c in components], dtype=float)
    return lfl, ufl


@dataclass(frozen=True)
class AirFlammability:
    """Flammability and oxygen of vapour mixed into air.

    Arrays have the shape of the volume fractions without their first
    (component) axis.

    Attributes
    ----------
    percent_lfl : numpy.ndarray
        Fuel vapour as a percentage of the mixture's LFL (Le Chatelier); 0 where
        no fuel is present or no component has an LFL on record (see `judged`). [%]
    state : numpy.ndarray of str
        Keys of `FLAMMABILITY_STATES`.
    oxygen_percent : numpy.ndarray
        Oxygen left after the vapour displaces air, never below 0. [% by volume]
    percent_ufl : numpy.ndarray
        Fuel vapour as a percentage of the mixture's UFL; NaN where no UFL is on
        record; above 100 the air is too rich to burn. [%]
    lfl_mixture, ufl_mixture : numpy.ndarray
        Le Chatelier limits of the fuel mix, NaN without fuel. [volume fraction]
    judged : bool
        Whether any component has an LFL on record.
    ufl_missing : bool
        Whether a component with an LFL has no UFL (the rich state cannot be judged).
    """

    percent_lfl: np.ndarray
    state: np.ndarray
    oxygen_percent: np.ndarray
    percent_ufl: np.ndarray
    lfl_mixture: np.ndarray
    ufl_mixture: np.ndarray
    judged: bool
    ufl_missing: bool


def air_flammability(volume_fractions, limits) -> AirFlammability:
    """% of the LFL, flammable state and oxygen of vapour in air.

    Le Chatelier's rule on a fuel-only basis gives the mixture's limits; the
    state is lean below the LFL, rich above the UFL and flammable between; the
    oxygen is that of fresh air (20.9 %, the meter convention) times the share
    of air left, 20.9 × (1 − Σ y).

    Parameters
    ----------
    volume_fractions : array_like
        Per component, shape (n, ...). [volume fraction]
    limits : tuple of array_like
        (LFLs, UFLs) of the components, shape (n,), NaN where none is on record
        (`component_limits`). [volume fraction]

    Returns
    -------
    AirFlammability

    References
    ----------
    Le Chatelier (1891); Mashuga & Crowl (2000), Process Safety Progress 19(2),
    112-117. Oxygen by displacement: common practice.

    Examples
    --------
    Half a percent each of toluene (LFL 1.1 %) and acetone (LFL 2.5 %):

    >>> air = air_flammability([0.005, 0.005], ([0.011, 0.025], [0.071, 0.13]))
    >>> round(float(air.percent_lfl), 1), str(air.state), round(float(air.oxygen_percent), 2)
    (65.5, 'lean', 20.69)
    """
    y = np.asarray(volume_fractions, dtype=float)
    lfl = np.asarray(limits[0], dtype=float)
    ufl = np.asarray(limits[1], dtype=float)
    lfl_mix = le_chatelier(y, lfl)
    ufl_mix = le_chatelier(y, ufl)
    has_lfl = np.isfinite(lfl)
    fuel = np.sum(np.where(has_lfl.reshape((-1,) + (1,) * (y.ndim - 1)), y, 0.0), axis=0)
    judged = bool(np.any(has_lfl))
    with np.errstate(invalid="ignore", divide="ignore"):
        percent = np.where(np.isfinite(lfl_mix), 100.0 * fuel / lfl_mix, 0.0)
        percent_ufl = np.where(np.isfinite(ufl_mix), 100.0 * fuel / ufl_mix,
                               np.where(fuel > 0, np.nan, 0.0))
        state = np.where(~np.isfinite(lfl_mix), "none" if not judged else "lean",
                         np.where(fuel < lfl_mix, "lean",
                                  np.where(np.isfinite(ufl_mix) & (fuel > ufl_mix),
                                           "rich", "flammable")))
    if not judged:
        state = np.full(np.shape(fuel), "none")
    oxygen = np.clip(100.0 * OXYGEN_IN_AIR * (1.0 - y.sum(axis=0)), 0.0, None)
    return AirFlammability(
        percent_lfl=percent, state=state, oxygen_percent=oxygen, percent_ufl=percent_ufl,
        lfl_mixture=lfl_mix,
        ufl_mixture=ufl_mix, judged=judged,
        ufl_missing=bool(np.any(has_lfl & ~np.isfinite(ufl))))


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
    return component_vapor_pressure_estimates(liq.components, t, field)


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
    p_total = check_pressure(pressure)
    estimates = _estimates(liq, temperature, "temperature")
    notes = list(liq.warnings) + [n for c in liq.components for n in c.notes]
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
    air = air_flammability(y, component_limits(liq.components))
    if air.ufl_missing:
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
        lfl_mixture=_scalar(air.lfl_mixture),
        ufl_mixture=_scalar(air.ufl_mixture),
        percent_lfl=_scalar(air.percent_lfl),
        oxygen_percent=_scalar(air.oxygen_percent),
        boiling=boiling,
        flammability=air.state,
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
    from .henry import check_dissolved_concentration, henry_constants, henry_partial_pressure
    from .mixtures import Liquid
    from .substances import as_substance

    if not dissolved:
        raise InputError("dissolved", "name at least one dissolved compound")
    p_total = check_pressure(pressure)
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
        check_dissolved_concentration(sub.key, c, f"dissolved {sub.name}")
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


def lowest_liquid_temperature(components) -> float:
    """Lowest temperature a liquid's vapour pressure is computed at. [K]

    A pure liquid's melting point; for a mixture, the lowest temperature at which
    some component is above its own melting point and none is more than
    `estimator.vapor.SUBCOOLED_LIMIT` below its own (a subcooled component). 0
    where no melting point is known.
    """
    melting = [c.melting_point or 0.0 for c in components]
    if len(melting) < 2:
        return melting[0] if melting else 0.0
    return max(min(melting), max(melting) - SUBCOOLED_LIMIT)


def _liquid_range(liq: Liquid) -> tuple[float, float]:
    lo = max([lowest_liquid_temperature(liq.components)] + [120.0])
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
    flammable_whenever_liquid : bool
        True for a pure liquid whose LFL temperature lies below its melting point:
        `estimate` is then the subcooled-liquid estimate (a temperature at which
        the liquid does not exist), and the vapour over the liquid is flammable at
        every temperature at which it is liquid.
    """

    estimate: float
    published: float | None
    published_source: str
    note: str
    flammable_whenever_liquid: bool = False

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
    note = ("temperature at which the saturated vapour reaches the LFL (Le Chatelier "
            "for mixtures); closed-cup flash points usually lie a few kelvin higher")
    whenever_liquid = False
    try:
        estimate = temperature_for_percent_lfl(liq, 100.0, pressure)
    except AboveAtLowestTemperature:
        if not liq.is_pure:
            raise
        estimate = _subcooled_lfl_temperature(liq.components[0], check_pressure(pressure))
        whenever_liquid = True
        note = (f"the vapour over the liquid is flammable at every temperature at which it "
                f"is liquid: the saturated vapour reaches the LFL at {estimate - 273.15:.1f} "
                f"°C, below the melting point ({liq.components[0].melting_point - 273.15:.1f}"
                " °C), by the vapour-pressure correlation extrapolated to the subcooled "
                "liquid (an extrapolation, a temperature at which this liquid does not "
                "exist); closed-cup flash points usually lie a few kelvin higher")
    published, source = None, ""
    if liq.is_pure:
        sub = liq.components[0]
        published = sub.flash_point
        source = sub.sources.get("flash_point", "")
    return FlashPointEstimate(
        estimate=estimate, published=published, published_source=source, note=note,
        flammable_whenever_liquid=whenever_liquid,
    )


#: How far below the melting point the LFL temperature of a pure liquid is sought on
#: the extrapolated (subcooled) vapour-pressure curve. [K] Twice `SUBCOOLED_LIMIT`:
#: the result only marks where the flammable range would start; the liquid freezes
#: first.
_SUBCOOLED_FLASH_SEARCH = 2.0 * SUBCOOLED_LIMIT


def _subcooled_lfl_temperature(sub, pressure: float) -> float:
    """Temperature at which the extrapolated vapour pressure of a pure liquid below its
    melting point gives the LFL. [K]"""
    from scipy.optimize import brentq

    target = sub.lower_flammability_limit * pressure
    tm = sub.melting_point
    lo = tm - _SUBCOOLED_FLASH_SEARCH
    # the correlation the subcooled estimate uses (chosen 0.5 K above the melting point)
    correlation = vapor_pressure_estimate(sub, tm - 1e-3, field="temperature", subcooled=True)
    chosen = next(c for c in sub.correlations if c.method == correlation.method)

    def f(t):
        return math.log(float(chosen(t)) / target)

    if f(lo) >= 0.0:
        raise AboveAtLowestTemperature(
            "temperature", f"{sub.name}: the extrapolated vapour pressure is above the LFL "
            f"even {_SUBCOOLED_FLASH_SEARCH:g} K below the melting point; the vapour over "
            "the liquid is flammable at every temperature at which it is liquid", tm)
    return float(brentq(f, lo, tm, xtol=1e-6, maxiter=200))


@dataclass(frozen=True)
class BoilingTemperature:
    """The temperature at which a liquid boils at a given pressure.

    ``float(result)`` is the temperature in kelvin.

    Attributes
    ----------
    temperature : float
        Boiling temperature (pure liquid) or bubble point (mixture). [K]
    pressure : float
        Absolute pressure it boils at. [Pa]
    method : str
        How it was found, in words.
    uncertainty : float or None
        Stated uncertainty of the temperature: the stated relative uncertainty of
        the vapour pressure carried through the slope of the vapour-pressure curve,
        u_T = u_p / (d ln p / dT); None where the method was not validated. [K]
    relative_uncertainty : float or None
        The stated relative uncertainty of the vapour pressure it rests on. [-]
    warnings : tuple of str
    """

    temperature: float
    pressure: float
    method: str
    uncertainty: float | None
    relative_uncertainty: float | None
    warnings: tuple[str, ...] = ()

    def __float__(self) -> float:
        return self.temperature

    @property
    def celsius(self) -> float:
        """The temperature in degrees Celsius. [°C]"""
        return self.temperature - 273.15


def _bubble_pressure(liq: Liquid, temperature: float, methods=None):
    """Σ x_i γ_i p_sat,i(T) [Pa] and the vapour-pressure estimates (each component by
    the given method, or the best one)."""
    if methods is None:
        estimates = component_vapor_pressure_estimates(liq.components, temperature,
                                                       "temperature")
    else:
        estimates = [vapor_pressure_estimate(c, temperature, m, subcooled=not liq.is_pure)
                     for c, m in zip(liq.components, methods)]
    p_sat = np.array([float(e.pressure) for e in estimates])
    gamma = np.asarray(liq.activity_coefficients_at(temperature), dtype=float).reshape(-1)
    return float(np.sum(liq.mole_fractions * gamma * p_sat)), estimates


def boiling_temperature(liquid, pressure, *, basis="mole",
                        activity_coefficients=None) -> BoilingTemperature:
    r"""Temperature at which a liquid boils at a pressure: boiling point or bubble point.

    A pure liquid boils where its saturated vapour pressure equals the pressure,
    :math:`p_\mathrm{sat}(T) = P` (the normal boiling point moved to that
    pressure); a mixture starts to boil at its bubble point,

    .. math:: \sum_i x_i \gamma_i(T) \, p_{\mathrm{sat},i}(T) = P

    (Raoult's law with the liquid's activity coefficients: entered, ideal, or the
    UNIFAC estimate at each temperature). Each vapour pressure by the best method
    the component has (`estimator.vapor.vapor_pressure_estimate`), subcooled
    components of a mixture included. Solved by Brent's method on ln p between
    the lowest liquid temperature and the lowest critical temperature.

    Parameters
    ----------
    liquid : Liquid, Substance, str or mapping
        As for `headspace`.
    pressure : float
        Absolute pressure: the site's barometric pressure, plus any gauge pressure
        of a closed tank. [Pa]
    basis : str
        Basis of a mapping's fractions: "mole", "mass" or "volume".
    activity_coefficients : mapping or array_like, optional
        For Raoult's law; 1 (ideal solution) where not given.

    Returns
    -------
    BoilingTemperature

    Raises
    ------
    InputError
        For a pressure that is not a number above 0 (field "pressure"), or one the
        liquid does not boil at between its melting and critical temperatures.

    References
    ----------
    Smith, J. M., Van Ness, H. C. & Abbott, M. M., Introduction to Chemical
    Engineering Thermodynamics, VLE chapter (bubble-point calculation, modified
    Raoult's law).

    Examples
    --------
    Water at the 83.4 kPa of a site 1609 m above sea level (IAPWS-95: 94.62 degC):

    >>> round(boiling_temperature("water", 83431.0).celsius, 1)
    94.7
    """
    from scipy.optimize import brentq

    liq = make_liquid(liquid, basis, activity_coefficients)
    p_total = check_pressure(pressure)
    lo, hi = _liquid_range(liq)

    def f(t):
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            return math.log(_bubble_pressure(liq, t)[0] / p_total)

    what = "boiling point" if liq.is_pure else "bubble point"
    if f(hi) < 0.0:
        raise OutOfRangeError("pressure", f"{p_total / 1000:g} kPa: the liquid does not boil "
                              "below the critical temperature (of a component) at this "
                              "pressure; is the pressure absolute, in pascals?")
    if f(lo) > 0.0:
        raise OutOfRangeError("pressure", f"{p_total / 1000:g} kPa is below the vapour "
                              f"pressure of the liquid at {lo - 273.15:.1f} °C, the lowest "
                              "temperature it is liquid at: it would boil (or sublimate) at "
                              "every temperature at which it is liquid")
    t_b = float(brentq(f, lo, hi, xtol=1e-7, rtol=1e-12, maxiter=200))
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        _, estimates = _bubble_pressure(liq, t_b)
    notes = list(liq.warnings) + [w for e in estimates for w in e.warnings]
    methods = [e.method for e in estimates]
    up, down = min(t_b + 0.01, hi), max(t_b - 0.01, lo)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        slope = math.log(_bubble_pressure(liq, up, methods)[0]
                         / _bubble_pressure(liq, down, methods)[0]) / (up - down)  # [1/K]
    relative = [e.relative_uncertainty for e in estimates]
    u_p = None if any(r is None for r in relative) else max(relative)
    u_t = None if u_p is None or slope <= 0 else math.log1p(u_p) / slope
    if liq.is_pure:
        e = estimates[0]
        method = (f"{what} moved to {p_total / 1000:.4g} kPa: the temperature at which the "
                  f"saturated vapour pressure ({e.description}, {e.source}) equals it")
    else:
        method = (f"{what} by Raoult's law, {liq.activity_source}: sum of x_i gamma_i "
                  f"p_sat,i(T) = "
                  f"{p_total / 1000:.4g} kPa; vapour pressures by "
                  + ", ".join(f"{c.name} {e.description}" for c, e in
                              zip(liq.components, estimates)))
    if u_t is not None:
        method += ("; its uncertainty carries the vapour-pressure methods' stated "
                   "uncertainty (validated over 0-60 °C) through the slope of the curve")
    return BoilingTemperature(t_b, p_total, method, u_t, u_p, tuple(dict.fromkeys(notes)))
