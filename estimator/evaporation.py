"""Evaporation from liquid pools: mass-transfer equations, pool geometry, depletion.

Rates are in kg/s, fluxes in kg/(m2 s), areas in m2, speeds in m/s, temperatures
in K and pressures in Pa. Each published equation is its own function; the
substance-level functions (`evaporation_rate`, `pool_depletion`, `mixture_pool`)
combine them with the vapour pressure of `estimator.vapor`.

Two model families are offered, chosen by keyword:

- ``"mackay-matsugu"``: the Mackay & Matsugu (1973) mass-transfer coefficient,
  with the Schmidt number from Sutherland's air viscosity and Fuller's
  diffusion coefficient;
- ``"epa-rmp"``: Equation D-1 of the US EPA Risk Management Program guidance
  for offsite consequence analysis (1999, revised 2009).

Limits of validity, stated once here and repeated in the warnings of results:

- The pool is at a known, uniform temperature (ambient by default); evaporative
  cooling is an optional refinement in `pool_temperature_balance`.
- The pool is below its boiling point. A pool at or above its boiling point is
  a boiling pool or a flashing release, driven by heat input rather than mass
  transfer, and is refused.
- Condensation from air that is richer in the vapour than the pool surface is
  not modelled: the driving force is clipped at zero.
- Mass-transfer correlations fitted outdoors tend to under-predict evaporation
  at the low air speeds found indoors (Lennert, Nielsen & Breum 1997, Ann.
  Occup. Hyg. 41, 625).
- Wide-boiling mixtures such as fuels and crude oils evaporate in a way that
  a few-component Raoult's-law pool does not capture (their evaporation is
  often limited by diffusion inside the liquid and follows empirical
  time laws; Fingas 2004, J. Hazard. Mater. 107, 27).
- The dilute-vapour film theory behind both models under-predicts when the
  vapour pressure is a large fraction of the ambient pressure.
"""

from __future__ import annotations

import math
import time
import warnings
from dataclasses import dataclass

import numpy as np

from .constants import (
    AIR_HEAT_CAPACITY,
    AIR_PRANDTL_NUMBER,
    AIR_SUTHERLAND_CONSTANT,
    AIR_SUTHERLAND_TEMPERATURE,
    AIR_SUTHERLAND_VISCOSITY,
    BAR,
    CONCRETE_THERMAL_CONDUCTIVITY,
    CONCRETE_THERMAL_DIFFUSIVITY,
    EIGHT_HOUR_SHIFT,
    FOOT,
    FULLER_VOLUME_AIR,
    GAS_CONSTANT,
    MILLIMETRE_OF_MERCURY,
    MOLAR_MASS_AIR,
    POUND_MASS,
    SECONDS_PER_HOUR,
    SECONDS_PER_MINUTE,
    SOIL_THERMAL_CONDUCTIVITY,
    SOIL_THERMAL_DIFFUSIVITY,
    STANDARD_ATMOSPHERE,
    UNDIKED_SPILL_DEPTH,
)
from .checks import positive_array, single
from .errors import InputError, OutOfRangeError, UllageError, UllageWarning

__all__ = [
    "MODELS",
    "GROUND_TYPES",
    "DEPLETED_FRACTION",
    "fuller_diffusivity",
    "air_dynamic_viscosity",
    "air_density",
    "air_kinematic_viscosity",
    "schmidt_number",
    "mackay_matsugu_coefficient",
    "evaporation_flux",
    "epa_rmp_rate",
    "pool_area",
    "pool_diameter",
    "spill_pool_area",
    "chilton_colburn_heat_transfer_coefficient",
    "semi_infinite_ground_flux",
    "air_diffusivity",
    "evaporation_estimate",
    "evaporation_rate",
    "compare_models",
    "pool_depletion",
    "mixture_evaporation_rates",
    "mixture_pool",
    "pool_temperature_balance",
    "EvaporationEstimate",
    "ModelComparison",
    "PoolDepletion",
    "MixturePool",
    "PoolTemperatureHistory",
    "EvaporationSolverError",
]

#: Model keywords and what they are.
MODELS = {
    "mackay-matsugu": "Mackay & Matsugu (1973) mass-transfer coefficient, Schmidt number "
                      "from Fuller's diffusion coefficient and Sutherland's air viscosity",
    "epa-rmp": "US EPA RMP offsite consequence analysis guidance (1999/2009), "
               "Appendix D, Eq. D-1",
}

#: Ground under the pool for `pool_temperature_balance`: keyword -> (thermal
#: conductivity [W/(m K)], thermal diffusivity [m2/s]); "insulated" means no
#: heat from the ground. Values and sources in `estimator.constants`.
GROUND_TYPES = {
    "concrete": (CONCRETE_THERMAL_CONDUCTIVITY, CONCRETE_THERMAL_DIFFUSIVITY),
    "soil": (SOIL_THERMAL_CONDUCTIVITY, SOIL_THERMAL_DIFFUSIVITY),
    "insulated": (0.0, 1.0),
}

#: A liquid (or one component of a mixture) counts as effectively gone when
#: less than this fraction of its initial amount remains. [-] An ullage
#: convention: far below anything a screening estimate can resolve.
DEPLETED_FRACTION = 1e-6

#: Fuller, Schettler & Giddings' constant for D in cm2/s, T in K, P in bar and
#: M in g/mol (Poling, Prausnitz & O'Connell, 5th ed., Eq. 11-4.4).
FULLER_COEFFICIENT = 0.00143

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

_SQUARE_CENTIMETRE = 1e-4  # m2
_GRAMS_PER_KILOGRAM = 1000.0
_CUBIC_CENTIMETRES_PER_CUBIC_METRE = 1e6

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


def _out(result):
    result = np.asarray(result, dtype=float)
    return float(result) if result.ndim == 0 else result


def _check_model(model: str) -> str:
    if model not in MODELS:
        raise ValueError(f"unknown evaporation model {model!r}; expected one of "
                         f"{list(MODELS)}")
    return model


def _wind(value, field: str = "wind_speed") -> np.ndarray:
    return positive_array(value, field, "m/s", hint=(
        "; these models need moving air (for still indoor air use a typical room "
        "air speed of 0.05-0.3 m/s, Baldwin & Maynard 1998)"))


# --------------------------------------------------------------------------
# published equations


def fuller_diffusivity(temperature, pressure, molar_mass, diffusion_volume,
                       molar_mass_other=MOLAR_MASS_AIR,
                       diffusion_volume_other=FULLER_VOLUME_AIR):
    r"""Binary gas diffusion coefficient by the method of Fuller, Schettler & Giddings.

    .. math:: D_{AB} = \frac{0.00143\,T^{1.75}}{P\,M_{AB}^{1/2}
              \left[(\Sigma_v)_A^{1/3} + (\Sigma_v)_B^{1/3}\right]^2}

    with :math:`D_{AB}` in cm2/s, T in K, P in bar and
    :math:`M_{AB} = 2/(1/M_A + 1/M_B)` in g/mol; converted here to SI in and out.
    Fuller et al. report an average error of about 4-7 % for non-polar gases.

    Parameters
    ----------
    temperature : float or array_like
        Gas temperature. [K]
    pressure : float or array_like
        Total pressure. [Pa]
    molar_mass : float or array_like
        Molar mass of the diffusing species. [kg/mol]
    diffusion_volume : float or array_like
        Its sum of Fuller atomic diffusion volumes. [-]
    molar_mass_other : float
        Molar mass of the other gas, dry air by default. [kg/mol]
    diffusion_volume_other : float
        Its diffusion volume, 19.7 for air (Poling et al., Table 11-1). [-]

    Returns
    -------
    float or numpy.ndarray
        Binary diffusion coefficient. [m2/s]

    References
    ----------
    Fuller, E. N., Schettler, P. D. & Giddings, J. C. (1966), Ind. Eng. Chem.
    58(5), 18-27; Fuller, Ensley & Giddings (1969), J. Phys. Chem. 73, 3679.
    Form and volumes as in Poling, Prausnitz & O'Connell, The Properties of
    Gases and Liquids, 5th ed. (2001), Eq. 11-4.4 and Table 11-1.

    Examples
    --------
    Water vapour (diffusion volume 13.1) in air at 20 degC and 1 atm; the CRC
    Handbook ("Diffusion in gases", after Marrero & Mason 1972) gives
    2.42e-5 m2/s:

    >>> round(fuller_diffusivity(293.15, 101325.0, 0.018015, 13.1) * 1e5, 3)
    2.431
    """
    t = np.asarray(temperature, dtype=float)
    pressure_bar = np.asarray(pressure, dtype=float) / BAR
    m_a = np.asarray(molar_mass, dtype=float) * _GRAMS_PER_KILOGRAM
    m_b = np.asarray(molar_mass_other, dtype=float) * _GRAMS_PER_KILOGRAM
    reduced = 2.0 / (1.0 / m_a + 1.0 / m_b)
    volumes = (np.cbrt(np.asarray(diffusion_volume, dtype=float))
               + np.cbrt(np.asarray(diffusion_volume_other, dtype=float)))**2
    d_cm2_per_s = FULLER_COEFFICIENT * t**1.75 / (pressure_bar * np.sqrt(reduced) * volumes)
    return _out(d_cm2_per_s * _SQUARE_CENTIMETRE)


def air_dynamic_viscosity(temperature):
    r"""Dynamic viscosity of air by Sutherland's law.

    .. math:: \mu = \mu_0 \left(\frac{T}{T_0}\right)^{3/2} \frac{T_0 + S}{T + S}

    with :math:`\mu_0` = 1.716e-5 Pa s at :math:`T_0` = 273.15 K and S = 110.4 K;
    independent of pressure in the dilute-gas range.

    Parameters
    ----------
    temperature : float or array_like
        Air temperature. [K]

    Returns
    -------
    float or numpy.ndarray
        Dynamic viscosity. [Pa s]

    References
    ----------
    Sutherland, W. (1893), Phil. Mag. 36, 507; constants from White, Viscous
    Fluid Flow, 3rd ed. (2006), Table 1-2.

    Examples
    --------
    >>> round(air_dynamic_viscosity(298.15) * 1e5, 3)
    1.837
    """
    t = np.asarray(temperature, dtype=float)
    t0 = AIR_SUTHERLAND_TEMPERATURE
    s = AIR_SUTHERLAND_CONSTANT
    return _out(AIR_SUTHERLAND_VISCOSITY * (t / t0) ** 1.5 * (t0 + s) / (t + s))


def air_density(temperature, pressure=STANDARD_ATMOSPHERE):
    """Density of dry air as an ideal gas, p M / (R T).

    Parameters
    ----------
    temperature : float or array_like
        Air temperature. [K]
    pressure : float or array_like
        Air pressure, 101325 Pa by default. [Pa]

    Returns
    -------
    float or numpy.ndarray
        Density. [kg/m3]

    Examples
    --------
    >>> round(air_density(298.15), 4)
    1.1839
    """
    t = np.asarray(temperature, dtype=float)
    return _out(np.asarray(pressure, dtype=float) * MOLAR_MASS_AIR / (GAS_CONSTANT * t))


def air_kinematic_viscosity(temperature, pressure=STANDARD_ATMOSPHERE):
    """Kinematic viscosity of dry air: Sutherland's viscosity over ideal-gas density.

    Parameters
    ----------
    temperature : float or array_like
        Air temperature. [K]
    pressure : float or array_like
        Air pressure, 101325 Pa by default. [Pa]

    Returns
    -------
    float or numpy.ndarray
        Kinematic viscosity. [m2/s]

    References
    ----------
    White, Viscous Fluid Flow, 3rd ed. (2006), Table 1-2 (Sutherland constants).

    Examples
    --------
    About 1.55e-5 m2/s at 25 degC and 1 atm (handbooks give 1.56e-5, from memory):

    >>> round(air_kinematic_viscosity(298.15) * 1e5, 3)
    1.552
    """
    return _out(np.asarray(air_dynamic_viscosity(temperature))
                / np.asarray(air_density(temperature, pressure)))


def schmidt_number(kinematic_viscosity, diffusivity):
    """Schmidt number, the ratio of momentum to mass diffusivity, Sc = ν / D.

    Parameters
    ----------
    kinematic_viscosity : float or array_like
        Kinematic viscosity of the air. [m2/s]
    diffusivity : float or array_like
        Diffusion coefficient of the vapour in air. [m2/s]

    Returns
    -------
    float or numpy.ndarray
        Schmidt number. [-]

    Examples
    --------
    >>> schmidt_number(1.5e-5, 1.0e-5)
    1.5
    """
    return _out(np.asarray(kinematic_viscosity, dtype=float)
                / np.asarray(diffusivity, dtype=float))


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
    return _out(MACKAY_MATSUGU_COEFFICIENT_SI * u**MACKAY_MATSUGU_WIND_EXPONENT
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
    return _out(np.asarray(mass_transfer_coefficient, dtype=float) * driving
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
    mw_grams = np.asarray(molar_mass, dtype=float) * _GRAMS_PER_KILOGRAM
    area_ft2 = np.asarray(area, dtype=float) / FOOT**2
    vp_mmhg = np.asarray(vapor_pressure, dtype=float) / MILLIMETRE_OF_MERCURY
    u = np.asarray(wind_speed, dtype=float)
    t = np.asarray(temperature, dtype=float)
    rate_lb_per_min = (EPA_RMP_COEFFICIENT * u**EPA_RMP_WIND_EXPONENT * mw_grams ** (2.0 / 3.0)
                       * area_ft2 * vp_mmhg / (EPA_RMP_GAS_CONSTANT * t))
    return _out(rate_lb_per_min * POUND_MASS / SECONDS_PER_MINUTE)


def pool_area(volume, depth=UNDIKED_SPILL_DEPTH):
    """Area of a pool of given volume spread to a uniform depth.

    Parameters
    ----------
    volume : float or array_like
        Liquid volume spilled. [m3]
    depth : float or array_like
        Pool depth; by default 1 cm, the US EPA RMP screening assumption for an
        undiked spill on flat ground (EPA 550-B-99-009, Section 3.2 and
        Appendix D). [m]

    Returns
    -------
    float or numpy.ndarray
        Pool area. [m2]

    Examples
    --------
    One cubic metre spread to 1 cm covers 100 m2:

    >>> round(pool_area(1.0), 6)
    100.0
    """
    v = positive_array(volume, "volume", "m3")
    h = positive_array(depth, "depth", "m")
    return _out(v / h)


def pool_diameter(area):
    """Diameter of the circle with the pool's area, the length scale of the models.

    Parameters
    ----------
    area : float or array_like
        Pool area. [m2]

    Returns
    -------
    float or numpy.ndarray
        Equivalent diameter, sqrt(4 A / π). [m]

    Examples
    --------
    >>> round(pool_diameter(math.pi), 6)
    2.0
    """
    a = positive_array(area, "area", "m2")
    return _out(np.sqrt(4.0 * a / math.pi))


def spill_pool_area(volume, dike_area=None, depth=UNDIKED_SPILL_DEPTH):
    """Screening pool area of a spill, undiked or inside a dike.

    Undiked, the liquid spreads to `depth` (1 cm in the US EPA RMP guidance).
    Inside a dike the pool covers the dike floor, unless spreading to `depth`
    would cover less; the smaller area is used.

    Parameters
    ----------
    volume : float or array_like
        Liquid volume spilled. [m3]
    dike_area : float or array_like, optional
        Floor area inside the dike or bund; None for an undiked spill. [m2]
    depth : float
        Spreading depth on open ground, 1 cm by default. [m]

    Returns
    -------
    float or numpy.ndarray
        Pool area. [m2]

    References
    ----------
    US EPA (1999/2009), EPA 550-B-99-009, Section 3.2 and Appendix D.

    Examples
    --------
    >>> spill_pool_area(2.0, dike_area=50.0)
    50.0
    """
    spread = np.asarray(pool_area(volume, depth))
    if dike_area is None:
        return _out(spread)
    dike = positive_array(dike_area, "dike_area", "m2")
    return _out(np.minimum(spread, dike))


def chilton_colburn_heat_transfer_coefficient(mass_transfer_coefficient, schmidt_number,
                                              air_temperature, pressure=STANDARD_ATMOSPHERE,
                                              prandtl_number=AIR_PRANDTL_NUMBER,
                                              air_heat_capacity=AIR_HEAT_CAPACITY):
    r"""Convective heat-transfer coefficient from a mass-transfer coefficient.

    The Chilton-Colburn analogy, :math:`j_H = j_D`, gives

    .. math:: h = k\,\rho_\mathrm{air}\,c_{p,\mathrm{air}}
              \left(\frac{\mathrm{Sc}}{\mathrm{Pr}}\right)^{2/3}

    Parameters
    ----------
    mass_transfer_coefficient : float or array_like
        [m/s]
    schmidt_number : float or array_like
        Of the vapour in air. [-]
    air_temperature : float or array_like
        [K]
    pressure : float
        [Pa]
    prandtl_number : float
        Of air, 0.707 near room temperature. [-]
    air_heat_capacity : float
        Of air, 1006 J/(kg K). [J/(kg K)]

    Returns
    -------
    float or numpy.ndarray
        Heat-transfer coefficient. [W/(m2 K)]

    References
    ----------
    Chilton, T. H. & Colburn, A. P. (1934), Ind. Eng. Chem. 26, 1183-1187.

    Examples
    --------
    >>> round(chilton_colburn_heat_transfer_coefficient(0.003, 1.9, 298.15), 2)
    6.91
    """
    k = np.asarray(mass_transfer_coefficient, dtype=float)
    ratio = np.asarray(schmidt_number, dtype=float) / prandtl_number
    rho = np.asarray(air_density(air_temperature, pressure))
    return _out(k * rho * air_heat_capacity * ratio ** (2.0 / 3.0))


def semi_infinite_ground_flux(ground_temperature, surface_temperature, time_since_contact,
                              thermal_conductivity=CONCRETE_THERMAL_CONDUCTIVITY,
                              thermal_diffusivity=CONCRETE_THERMAL_DIFFUSIVITY):
    r"""Heat flux from the ground into a pool, as into a semi-infinite solid.

    .. math:: q = \frac{\lambda\,(T_g - T)}{\sqrt{\pi\,\alpha\,t}}

    the exact flux after a sudden, constant change of the surface temperature
    of a semi-infinite solid. Used with a varying pool temperature it is a
    quasi-steady approximation (the exact answer is a Duhamel integral).

    Parameters
    ----------
    ground_temperature : float or array_like
        Undisturbed ground temperature. [K]
    surface_temperature : float or array_like
        Pool (ground surface) temperature. [K]
    time_since_contact : float or array_like
        Time since the liquid covered the ground. [s]
    thermal_conductivity : float
        Of the ground, concrete by default. [W/(m K)]
    thermal_diffusivity : float
        Of the ground, concrete by default. [m2/s]

    Returns
    -------
    float or numpy.ndarray
        Heat flux into the pool. [W/m2]

    References
    ----------
    Carslaw, H. S. & Jaeger, J. C. (1959), Conduction of Heat in Solids, 2nd ed.,
    Section 2.5. Used for spill pools by Kawamura, P. I. & Mackay, D. (1987),
    J. Hazard. Mater. 15, 343-364 (check).

    Examples
    --------
    >>> round(semi_infinite_ground_flux(293.15, 283.15, 3600.0), 1)
    158.3
    """
    dt = (np.asarray(ground_temperature, dtype=float)
          - np.asarray(surface_temperature, dtype=float))
    t = np.asarray(time_since_contact, dtype=float)
    return _out(thermal_conductivity * dt / np.sqrt(math.pi * thermal_diffusivity * t))


# --------------------------------------------------------------------------
# substance-level estimates


def _diffusion_volume(sub, field: str) -> tuple[float, str | None]:
    """The substance's Fuller diffusion volume, or an estimate with a note."""
    if sub.diffusion_volume is not None:
        return float(sub.diffusion_volume), None
    if sub.liquid_density is not None:
        volume = sub.molar_mass / sub.liquid_density * _CUBIC_CENTIMETRES_PER_CUBIC_METRE
        return volume, (
            f"{sub.name}: no Fuller diffusion volume is known; its liquid molar volume "
            f"({volume:.0f} cm3/mol) was used instead (for most organic liquids it lies "
            "within 15 % of the Fuller sum, changing the mass-transfer coefficient by "
            "about 3 %; for small hydrogen-bonded molecules such as water and methanol "
            "it is up to 40 % larger, about 7 % on the coefficient)")
    raise InputError(field, (
        f"{sub.name} has neither a Fuller diffusion volume nor a liquid density, so "
        "its diffusion coefficient in air cannot be estimated; give the liquid density "
        "(safety data sheet) or use model='epa-rmp', which needs neither"))


def air_diffusivity(substance_or_key, temperature, pressure=STANDARD_ATMOSPHERE):
    """Diffusion coefficient of a substance's vapour in air, by Fuller's method.

    Uses the substance's Fuller diffusion volume; without one, its liquid molar
    volume M / ρ (in cm3/mol) stands in, with an `UllageWarning`.

    Parameters
    ----------
    substance_or_key : Substance or str
    temperature : float or array_like
        [K]
    pressure : float
        [Pa]

    Returns
    -------
    float or numpy.ndarray
        [m2/s]
    """
    from .substances import as_substance

    sub = as_substance(substance_or_key, "substance_or_key")
    t = positive_array(temperature, "temperature", "K")
    p = positive_array(pressure, "pressure", "Pa")
    volume, note = _diffusion_volume(sub, "substance_or_key")
    if note:
        warnings.warn(note, UllageWarning, stacklevel=2)
    return fuller_diffusivity(t, p, sub.molar_mass, volume)


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


def _boiling_check(sub, t: np.ndarray, p_sat, pressure, field: str) -> None:
    hot = t >= sub.boiling_point
    if np.any(hot):
        raise OutOfRangeError(field, (
            f"{float(np.max(t)):g} K is at or above the normal boiling point of "
            f"{sub.name} ({sub.boiling_point:g} K): the pool would boil (a boiling "
            "pool or a flashing release), which is driven by heat input and lies "
            "outside these evaporation models; use a boiling-pool or flash model"))
    if p_sat is not None and np.any(np.asarray(p_sat) >= np.asarray(pressure)):
        raise OutOfRangeError(field, (
            f"the vapour pressure of {sub.name} reaches the ambient pressure at "
            f"{float(np.max(t)):g} K: the pool would boil (a boiling pool or a "
            "flashing release), which lies outside these evaporation models"))


def low_air_speed_note(share=None) -> str:
    """The caution for air speeds below `LOW_AIR_SPEED`; ``share`` is the fraction of
    Monte Carlo samples below it (None for a single case)."""
    where = "" if share is None else f" in {100 * share:.3g} % of samples"
    return (f"air speed below {LOW_AIR_SPEED:g} m/s{where}: the models tend to "
            "under-predict evaporation at low air speeds (Lennert, Nielsen & Breum 1997)")


def _validity_notes(name, p_sat, pressure, wind) -> list[str]:
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


def _prepare(substance_or_key, temperature, area, wind_speed, pressure,
             partial_pressure_air, field="substance_or_key"):
    from .substances import as_substance
    from .vapor import vapor_pressure_estimate

    sub = as_substance(substance_or_key, field)
    t = positive_array(temperature, "temperature", "K")
    a = positive_array(area, "area", "m2")
    u = _wind(wind_speed)
    p = positive_array(pressure, "pressure", "Pa")
    p_air = positive_array(partial_pressure_air, "partial_pressure_air", "Pa", allow_zero=True)
    _boiling_check(sub, t, None, p, "temperature")
    estimate = vapor_pressure_estimate(sub, t, field="temperature")
    p_sat = np.asarray(estimate.pressure, dtype=float)
    _boiling_check(sub, t, p_sat, p, "temperature")
    notes = list(estimate.warnings) + list(sub.notes) + _validity_notes(sub.name, p_sat, p, u)
    return sub, t, a, u, p, p_air, p_sat, notes


def _mass_transfer(sub, t, a, u, p, model, field):
    """Mass-transfer coefficient [m/s], diffusivity, Schmidt number, diameter, notes."""
    diameter = np.sqrt(4.0 * a / math.pi)
    if model == "mackay-matsugu":
        volume, note = _diffusion_volume(sub, field)
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
    _check_model(model)
    sub, t, a, u, p, p_air, p_sat, notes = _prepare(
        substance_or_key, temperature, area, wind_speed, pressure, partial_pressure_air)
    k, d, sc, diameter, more = _mass_transfer(sub, t, a, u, p, model, "substance_or_key")
    notes += more
    if np.any(p_air >= p_sat):
        notes.append(f"{sub.name}: the partial pressure in the air is at or above the "
                     "vapour pressure; the rate is set to zero (condensation is not "
                     "modelled)")
    flux = np.asarray(evaporation_flux(k, p_sat, sub.molar_mass, t, p_air))
    return EvaporationEstimate(
        rate=_out(flux * a),
        flux=_out(flux),
        model=model,
        vapor_pressure=_out(p_sat),
        mass_transfer_coefficient=_out(k),
        diffusivity=None if d is None else _out(d),
        schmidt_number=None if sc is None else _out(sc),
        pool_diameter=_out(diameter),
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
    from .errors import ExtrapolationWarning

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
        ratio=_out(ratio),
        vapor_pressure=mm.vapor_pressure,
        warnings=tuple(dict.fromkeys(mm.warnings + epa.warnings)),
    )


# --------------------------------------------------------------------------
# pure-liquid pool lifetime


@dataclass(frozen=True)
class PoolDepletion:
    """Mass of a pure-liquid pool over time, evaporating at a fixed temperature.

    Attributes
    ----------
    times : numpy.ndarray
        [s]
    mass_remaining : numpy.ndarray
        Liquid left in the pool. [kg]
    mass_evaporated : numpy.ndarray
        [kg]
    evaporation_rate : numpy.ndarray
        Zero once the pool is gone. [kg/s]
    area : numpy.ndarray
        Pool area at each time. [m2]
    initial_rate : float
        [kg/s]
    depletion_time : float
        Time when less than `DEPLETED_FRACTION` of the liquid is left; for a
        fixed area, exactly the time the pool is gone. [s]
    area_shrinks : bool
        Whether the area shrinks with the volume (constant depth) or stays
        fixed (a diked pool, or a pool held by the ground's shape).
    model : str
    warnings : tuple of str
    """

    times: np.ndarray
    mass_remaining: np.ndarray
    mass_evaporated: np.ndarray
    evaporation_rate: np.ndarray
    area: np.ndarray
    initial_rate: float
    depletion_time: float
    area_shrinks: bool
    model: str
    warnings: tuple[str, ...] = ()


def _times(times, field="times") -> np.ndarray:
    t = np.atleast_1d(positive_array(times, field, "s", allow_zero=True)).ravel()
    if t.size > 1 and np.any(np.diff(t) <= 0.0):
        raise InputError(field, "must increase strictly; sort the times and drop repeats")
    return t


def pool_depletion(substance, temperature, initial_mass, area, wind_speed,
                   model="mackay-matsugu", times=None, *, area_shrinks=False,
                   pressure=STANDARD_ATMOSPHERE, partial_pressure_air=0.0) -> PoolDepletion:
    r"""How long a pure-liquid pool lasts, and its mass over time.

    At a fixed temperature a pure liquid keeps its vapour pressure, so the
    solution is analytic:

    - fixed area (the default: a diked pool, or a pool held in place): the rate
      is constant, :math:`m(t) = m_0 - R_0 t` until :math:`t = m_0 / R_0`, then zero;
    - ``area_shrinks=True``: the pool keeps its depth and its area shrinks with
      its volume, :math:`A = A_0\,m/m_0`. With the Mackay-Matsugu diameter term
      the rate scales as :math:`(m/m_0)^{1-\beta}`, :math:`\beta = 0.11/2 = 0.055`,
      so :math:`(m/m_0)^\beta = 1 - \beta R_0 t / m_0` (a finite lifetime
      :math:`m_0/(\beta R_0)`); the EPA equation has no size term
      (:math:`\beta = 0`) and gives the exponential :math:`m = m_0\,e^{-R_0 t/m_0}`.
      The reported depletion time is when `DEPLETED_FRACTION` of the mass is left.

    Parameters
    ----------
    substance : Substance or str
    temperature : float
        Pool temperature. [K]
    initial_mass : float
        Liquid in the pool at time zero. [kg]
    area : float
        Pool area at time zero. [m2]
    wind_speed : float
        [m/s]
    model : str
        "mackay-matsugu" or "epa-rmp".
    times : array_like, optional
        Output times; by default 201 times from 0 to the depletion time. [s]
    area_shrinks : bool
        See above; False by default.
    pressure, partial_pressure_air : float
        [Pa]

    Returns
    -------
    PoolDepletion
    """
    _check_model(model)
    estimate = evaporation_estimate(substance, temperature, area, wind_speed, model,
                                    pressure, partial_pressure_air)
    m0 = single(positive_array(initial_mass, "initial_mass", "kg"), "initial_mass")
    a0 = single(np.asarray(area, dtype=float), "area")
    single(np.asarray(temperature, dtype=float), "temperature")
    single(np.asarray(wind_speed, dtype=float), "wind_speed")
    rate0 = float(estimate.rate)
    notes = list(estimate.warnings)
    beta = -MACKAY_MATSUGU_DIAMETER_EXPONENT / 2.0 if model == "mackay-matsugu" else 0.0
    if rate0 <= 0.0:
        notes.append("the pool does not evaporate under these conditions")
        depletion = math.inf
    elif not area_shrinks:
        depletion = m0 / rate0
    elif beta > 0.0:
        depletion = (1.0 - DEPLETED_FRACTION**beta) * m0 / (beta * rate0)
    else:
        depletion = -math.log(DEPLETED_FRACTION) * m0 / rate0
    if times is None:
        end = depletion if math.isfinite(depletion) else EIGHT_HOUR_SHIFT
        t = np.linspace(0.0, end, 201)
    else:
        t = _times(times)
    if rate0 <= 0.0:
        fraction = np.ones_like(t)
    elif not area_shrinks:
        fraction = np.clip(1.0 - rate0 * t / m0, 0.0, None)
    elif beta > 0.0:
        base = np.clip(1.0 - beta * rate0 * t / m0, 0.0, None)
        fraction = base ** (1.0 / beta)
    else:
        fraction = np.exp(-rate0 * t / m0)
    if area_shrinks:
        current_area = a0 * fraction
        rate = rate0 * fraction ** (1.0 - beta)
    else:
        current_area = np.where(fraction > 0.0, a0, 0.0)
        rate = np.where(fraction > 0.0, rate0, 0.0)
    mass = m0 * fraction
    return PoolDepletion(
        times=t,
        mass_remaining=mass,
        mass_evaporated=m0 - mass,
        evaporation_rate=rate,
        area=current_area,
        initial_rate=rate0,
        depletion_time=float(depletion),
        area_shrinks=bool(area_shrinks),
        model=model,
        warnings=tuple(notes),
    )


# --------------------------------------------------------------------------
# mixtures


def _components(components, field="components"):
    from .substances import as_substance

    if isinstance(components, str) or not hasattr(components, "__len__"):
        raise InputError(field, "give a list of substances or keys, one per component")
    if len(components) == 0:
        raise InputError(field, "give at least one component")
    return [as_substance(c, f"{field}[{i}]") for i, c in enumerate(components)]


def _per_component(value, n: int, field: str, unit: str, default: float) -> np.ndarray:
    if value is None:
        return np.full(n, default)
    array = positive_array(value, field, unit, allow_zero=True)
    array = np.broadcast_to(array, (n,)) if array.ndim == 0 else array.ravel()
    if array.size != n:
        raise InputError(field, f"got {array.size} values for {n} components; give one "
                         "per component")
    return np.array(array, dtype=float)


def _gamma_function(activity_coefficients, n: int):
    """A function x -> γ(x), and whether γ is constant."""
    if callable(activity_coefficients):
        def gamma(x):
            return np.asarray(activity_coefficients(x), dtype=float)
        return gamma, False
    values = _per_component(activity_coefficients, n, "activity_coefficients", "", 1.0)
    if np.any(values <= 0.0):
        raise InputError("activity_coefficients", "every activity coefficient must be "
                         "above zero")
    return (lambda x: values[:, None] if np.ndim(x) == 2 else values), True


def _component_conductances(subs, t, area, wind, model, pressure):
    """Per component: vapour pressure [Pa], rate per pascal of driving force
    [kg/(s Pa)], and notes."""
    from .vapor import component_vapor_pressure_estimates

    names = [s.name for s in subs]
    notes = []
    p_sat = np.empty(len(subs))
    per_pascal = np.empty(len(subs))
    estimates = component_vapor_pressure_estimates(subs, t, "temperature")
    for i, sub in enumerate(subs):
        estimate = estimates[i]
        p_sat[i] = float(estimate.pressure)
        notes += list(estimate.warnings) + list(sub.notes)
        k, _, _, _, more = _mass_transfer(sub, np.asarray(t), np.asarray(area),
                                          np.asarray(wind), pressure, model,
                                          f"components[{i}]")
        notes += more
        per_pascal[i] = float(k) * area * sub.molar_mass / (GAS_CONSTANT * t)
    if len(set(names)) < len(names):
        notes.append("two or more components share a name; results are in input order")
    return p_sat, per_pascal, notes


def bubble_check(x, gamma, p_sat, pressure, notes):
    """Refuse a boiling mixture; note one close to boiling."""
    bubble = float(np.sum(x * gamma * p_sat))
    notes += _validity_notes("the mixture (Raoult's law)", bubble, pressure, np.inf)
    if bubble >= pressure:
        raise OutOfRangeError("temperature", (
            f"the mixture's vapour pressure by Raoult's law ({bubble:.0f} Pa) reaches the "
            f"ambient pressure ({pressure:.0f} Pa): the pool would boil (a boiling pool or "
            "flashing release), which lies outside these evaporation models"))
    return bubble


def mixture_inputs(components, temperature, area, wind_speed, model, pressure,
                   partial_pressures_air):
    """Checked inputs of a mixture pool, shared by the weathering and spill models."""
    _check_model(model)
    subs = _components(components)
    t = single(positive_array(temperature, "temperature", "K"), "temperature")
    a = single(positive_array(area, "area", "m2"), "area")
    u = single(_wind(wind_speed), "wind_speed")
    p = single(positive_array(pressure, "pressure", "Pa"), "pressure")
    p_air = _per_component(partial_pressures_air, len(subs), "partial_pressures_air", "Pa",
                           0.0)
    p_sat, per_pascal, notes = _component_conductances(subs, t, a, u, model, p)
    notes += _validity_notes("the mixture", 0.0, p, np.asarray(u))
    return subs, t, a, u, p, p_air, p_sat, per_pascal, notes


def mixture_evaporation_rates(components, mole_fractions, temperature, area, wind_speed,
                              activity_coefficients=None, model="mackay-matsugu",
                              pressure=STANDARD_ATMOSPHERE, partial_pressures_air=None):
    r"""Evaporation rate of each component of a liquid-mixture pool, at one instant.

    Raoult's law with activity coefficients sets each component's surface
    partial pressure, :math:`x_i \gamma_i p_{\mathrm{sat},i}`, and each has its
    own mass-transfer coefficient (its own Schmidt number):

    .. math:: R_i = k_i A \frac{(x_i \gamma_i p_{\mathrm{sat},i} - p_{\mathrm{air},i}) M_i}{R T}

    Parameters
    ----------
    components : sequence of Substance or str
    mole_fractions : array_like
        Liquid mole fractions, one per component, summing to 1 (within 0.001;
        they are then normalised). [-]
    temperature : float
        [K]
    area : float
        [m2]
    wind_speed : float
        [m/s]
    activity_coefficients : array_like or callable, optional
        Constant activity coefficients, or a function of the mole fractions
        returning them; 1 (ideal solution) by default. [-]
    model : str
        "mackay-matsugu" or "epa-rmp" (the EPA equation applied per component).
    pressure : float
        [Pa]
    partial_pressures_air : array_like, optional
        Background partial pressure of each component in the air. [Pa]

    Returns
    -------
    numpy.ndarray
        Evaporation rate of each component. [kg/s]
    """
    subs, t, a, u, p, p_air, p_sat, per_pascal, notes = mixture_inputs(
        components, temperature, area, wind_speed, model, pressure, partial_pressures_air)
    x = positive_array(mole_fractions, "mole_fractions", "", allow_zero=True).ravel()
    if x.size != len(subs):
        raise InputError("mole_fractions", f"got {x.size} mole fractions for {len(subs)} "
                         "components; give one per component")
    total = float(x.sum())
    if abs(total - 1.0) > 1e-3:
        raise InputError("mole_fractions", f"sum to {total:.6g}, not 1; give fractions "
                         "that sum to 1")
    x = x / total
    gamma_of, _ = _gamma_function(activity_coefficients, len(subs))
    gamma = gamma_of(x)
    bubble_check(x, gamma, p_sat, p, notes)
    for note in dict.fromkeys(notes):
        warnings.warn(note, UllageWarning, stacklevel=2)
    return per_pascal * np.clip(x * gamma * p_sat - p_air, 0.0, None)


@dataclass(frozen=True)
class MixturePool:
    """Weathering of a liquid-mixture pool at a fixed temperature and area.

    Arrays over time have shape (number of times, number of components).

    Attributes
    ----------
    components : tuple of str
        Component names, in input order.
    times : numpy.ndarray
        [s]
    moles_remaining : numpy.ndarray
        [mol]
    mass_remaining : numpy.ndarray
        [kg]
    mass_evaporated : numpy.ndarray
        Integrated separately from the amounts left, so that
        ``mass_remaining + mass_evaporated`` checks the integration. [kg]
    evaporation_rate : numpy.ndarray
        [kg/s]
    liquid_mole_fractions : numpy.ndarray
        [-]
    initial_mass : numpy.ndarray
        Per component. [kg]
    depletion_times : numpy.ndarray
        Per component, the time less than `DEPLETED_FRACTION` of its initial
        amount is left; inf if that is not reached by the end. [s]
    pool_gone_time : float
        When every component is gone; inf if not by the end. [s]
    mass_balance_error : float
        Largest |remaining + evaporated - initial| over times and components,
        relative to the initial total mass. [-]
    model : str
    evaluations : int
        Right-hand-side evaluations the solver used.
    warnings : tuple of str
    """

    components: tuple[str, ...]
    times: np.ndarray
    moles_remaining: np.ndarray
    mass_remaining: np.ndarray
    mass_evaporated: np.ndarray
    evaporation_rate: np.ndarray
    liquid_mole_fractions: np.ndarray
    initial_mass: np.ndarray
    depletion_times: np.ndarray
    pool_gone_time: float
    mass_balance_error: float
    model: str
    evaluations: int
    warnings: tuple[str, ...] = ()

    @property
    def total_evaporation_rate(self) -> np.ndarray:
        """Sum over components at each time. [kg/s]"""
        return self.evaporation_rate.sum(axis=1)


class StepBudget:
    """Counts right-hand-side calls and stops a runaway integration."""

    def __init__(self, max_evaluations: int, time_limit: float):
        self.max_evaluations = max_evaluations
        self.deadline = time.monotonic() + time_limit
        self.time_limit = time_limit
        self.count = 0

    def tick(self):
        self.count += 1
        if self.count > self.max_evaluations:
            raise EvaporationSolverError(
                f"the integration needed more than {self.max_evaluations} evaluations; "
                "shorten t_end or check for a component with an extreme vapour pressure")
        if self.count % 256 == 0 and time.monotonic() > self.deadline:
            raise EvaporationSolverError(
                f"the integration ran longer than {self.time_limit:g} s; shorten t_end")


def mixture_pool(components, initial_amounts, temperature, area, wind_speed,
                 activity_coefficients=None, t_end=None, times=None, *,
                 amount_basis="mass", model="mackay-matsugu", pressure=STANDARD_ATMOSPHERE,
                 partial_pressures_air=None, max_evaluations=200_000,
                 time_limit=60.0) -> MixturePool:
    r"""Evaporation of a liquid-mixture pool over time, component by component.

    Integrates, for each component i,

    .. math:: \frac{dn_i}{dt} = -\frac{k_i A\,(x_i \gamma_i p_{\mathrm{sat},i}
              - p_{\mathrm{air},i})}{R T}, \qquad x_i = n_i / \textstyle\sum_j n_j

    (Raoult's law driving each component; each with its own mass-transfer
    coefficient through its own Schmidt number; driving force clipped at zero)
    at a fixed temperature and a fixed area, with
    `scipy.integrate.solve_ivp` (LSODA, stiff-safe, rtol 1e-8). The evaporated
    amount of each component is integrated as a separate state, so the mass
    balance checks the integration. The run stops when every component is
    gone (less than `DEPLETED_FRACTION` of its initial amount left); after
    that the pool is reported empty.

    Parameters
    ----------
    components : sequence of Substance or str
    initial_amounts : array_like
        Initial amount of each component, in kg (``amount_basis="mass"``) or
        mol (``"moles"``); zeros allowed, not all zero.
    temperature : float
        Pool temperature, fixed. [K]
    area : float
        Pool area, fixed (diked, or spread and held). [m2]
    wind_speed : float
        [m/s]
    activity_coefficients : array_like or callable, optional
        Constant activity coefficients, or a function of the liquid mole
        fractions (an array of shape (n,) or (n, m)) returning an array of the
        same shape; 1 (ideal) by default. [-]
    t_end : float, optional
        End of the integration; by default the last of `times`, or one 8-hour
        work shift. [s]
    times : array_like, optional
        Output times, increasing, within [0, t_end]; by default one a minute. [s]
    amount_basis : str
        "mass" (kg) or "moles" (mol).
    model : str
        "mackay-matsugu" or "epa-rmp".
    pressure : float
        [Pa]
    partial_pressures_air : array_like, optional
        Background partial pressure of each component. [Pa]
    max_evaluations : int
        Right-hand-side evaluations allowed before giving up.
    time_limit : float
        Wall-clock seconds allowed before giving up. [s]

    Returns
    -------
    MixturePool

    Raises
    ------
    InputError
        For negative or all-zero amounts, NaN, wrong lengths, or a mixture at
        its bubble point (a boiling pool).
    EvaporationSolverError
        If the integration fails or exceeds its budget.
    """
    from scipy.integrate import solve_ivp

    if amount_basis not in ("mass", "moles"):
        raise ValueError(f"unknown amount_basis {amount_basis!r}; expected one of "
                         "['mass', 'moles']")
    subs, t, a, u, p, p_air, p_sat, per_pascal, notes = mixture_inputs(
        components, temperature, area, wind_speed, model, pressure, partial_pressures_air)
    n_comp = len(subs)
    molar_mass = np.array([s.molar_mass for s in subs])
    unit = "kg" if amount_basis == "mass" else "mol"
    amounts = positive_array(initial_amounts, "initial_amounts", unit, allow_zero=True).ravel()
    if amounts.size != n_comp:
        raise InputError("initial_amounts", f"got {amounts.size} amounts for {n_comp} "
                         "components; give one per component")
    if amounts.sum() <= 0.0:
        raise InputError("initial_amounts", "all amounts are zero; give at least one "
                         "positive amount")
    n0 = amounts / molar_mass if amount_basis == "mass" else amounts.copy()
    gamma_of, gamma_constant = _gamma_function(activity_coefficients, n_comp)
    x0 = n0 / n0.sum()
    gamma0 = gamma_of(x0)
    if gamma0.shape != (n_comp,) or np.any(~np.isfinite(gamma0)) or np.any(gamma0 <= 0):
        raise InputError("activity_coefficients", "must give one positive, finite "
                         "activity coefficient per component")
    bubble_check(x0, gamma0, p_sat, p, notes)
    no_drive = (x0 * gamma0 * p_sat <= p_air) & (n0 > 0)
    for i in np.flatnonzero(no_drive):
        notes.append(f"{subs[i].name}: its partial pressure in the air is at or above its "
                     "surface partial pressure, so it does not evaporate (condensation is "
                     "not modelled)")

    # output grid
    if t_end is not None:
        t_end = single(positive_array(t_end, "t_end", "s"), "t_end")
    if times is None:
        t_end = EIGHT_HOUR_SHIFT if t_end is None else t_end
        t_out = np.linspace(0.0, t_end, int(round(t_end / SECONDS_PER_MINUTE)) + 1)
        if t_out.size < 2:
            t_out = np.array([0.0, t_end])
    else:
        t_out = _times(times)
        if t_end is None:
            t_end = float(t_out[-1])
        if t_out[-1] > t_end:
            raise InputError("times", f"the last output time {t_out[-1]:g} s lies after "
                             f"t_end = {t_end:g} s")
        if t_end <= 0.0:
            raise InputError("times", "need an output time after zero")

    molar_per_pascal = per_pascal / molar_mass  # mol/(s Pa)
    surface = p_sat.copy()
    budget = StepBudget(int(max_evaluations), float(time_limit))

    def drive(n):
        """Driving force [Pa] for amounts n of shape (n_comp,) or (n_comp, m)."""
        positive = np.clip(n, 0.0, None)
        total = positive.sum(axis=0)
        safe = np.where(total > 0.0, total, 1.0)
        x = np.where(total > 0.0, positive / safe, 0.0)
        return np.clip(x * gamma_of(x) * (surface if n.ndim == 1 else surface[:, None])
                       - (p_air if n.ndim == 1 else p_air[:, None]), 0.0, None), x

    def rhs(_t, y):
        budget.tick()
        d, _ = drive(y[:n_comp])
        dn = -molar_per_pascal * d
        return np.concatenate((dn, -dn))

    jac = None
    if gamma_constant:
        g = gamma0 * surface

        def jac(_t, y):
            n = np.clip(y[:n_comp], 0.0, None)
            total = n.sum()
            out = np.zeros((2 * n_comp, 2 * n_comp))
            if total <= 0.0:
                return out
            x = n / total
            active = (x * g - p_air) > 0.0
            block = -(molar_per_pascal * g * active)[:, None] * (
                np.eye(n_comp) - x[:, None]) / total
            out[:n_comp, :n_comp] = block
            out[n_comp:, :n_comp] = -block
            return out

    present = np.flatnonzero(n0 > 0.0)
    limits = DEPLETED_FRACTION * n0

    def make_event(i):
        def event(_t, y):
            return y[i] - limits[i]
        event.terminal = False
        event.direction = -1
        return event

    events = [make_event(i) for i in present]

    def all_gone(_t, y):
        return float(np.max(y[present] - limits[present]))
    all_gone.terminal = True
    all_gone.direction = -1
    events.append(all_gone)

    y0 = np.concatenate((n0, np.zeros(n_comp)))
    scale = float(n0.sum())
    solution = solve_ivp(rhs, (0.0, t_end), y0, method="LSODA", t_eval=t_out,
                         events=events, rtol=1e-8, atol=1e-13 * scale, jac=jac)
    if solution.status < 0:
        raise EvaporationSolverError(f"the mixture integration failed: {solution.message}")

    n_times = t_out.size
    done = solution.y.shape[1]
    moles = np.zeros((n_times, n_comp))
    evaporated = np.tile(n0, (n_times, 1))
    moles[:done] = solution.y[:n_comp].T
    evaporated[:done] = solution.y[n_comp:].T
    moles = np.clip(moles, 0.0, None)

    gone_events = solution.t_events[-1]
    pool_gone = float(gone_events[0]) if len(gone_events) else math.inf
    depletion = np.zeros(n_comp)
    for j, i in enumerate(present):
        hits = solution.t_events[j]
        depletion[i] = float(hits[0]) if len(hits) else pool_gone

    d, x = drive(moles.T)
    rates = (per_pascal[:, None] * d).T
    mass_remaining = moles * molar_mass
    mass_evaporated = evaporated * molar_mass
    initial_mass = n0 * molar_mass
    balance = float(np.max(np.abs(mass_remaining + mass_evaporated - initial_mass))
                    / initial_mass.sum())
    return MixturePool(
        components=tuple(s.name for s in subs),
        times=t_out,
        moles_remaining=moles,
        mass_remaining=mass_remaining,
        mass_evaporated=mass_evaporated,
        evaporation_rate=rates,
        liquid_mole_fractions=x.T,
        initial_mass=initial_mass,
        depletion_times=depletion,
        pool_gone_time=pool_gone,
        mass_balance_error=balance,
        model=model,
        evaluations=budget.count,
        warnings=tuple(dict.fromkeys(notes)),
    )


# --------------------------------------------------------------------------
# optional refinement: pool temperature by an energy balance


@dataclass(frozen=True)
class PoolTemperatureHistory:
    """Temperature and mass of an evaporating pool from an energy balance.

    Heat flows are positive into the pool.

    Attributes
    ----------
    times : numpy.ndarray
        [s]
    temperature : numpy.ndarray
        Pool temperature. [K]
    mass_remaining : numpy.ndarray
        [kg]
    evaporation_rate : numpy.ndarray
        [kg/s]
    ground_heat_flow : numpy.ndarray
        From the ground; unbounded at t = 0 (reported as NaN there). [W]
    air_heat_flow : numpy.ndarray
        Convection from the air. [W]
    solar_heat_flow : numpy.ndarray
        Absorbed sunlight. [W]
    evaporation_heat_flow : numpy.ndarray
        Latent heat taken by the vapour (negative). [W]
    minimum_temperature : float
        Lowest pool temperature at the output times. [K]
    depletion_time : float
        When less than `DEPLETED_FRACTION` of the liquid is left; inf if not
        by the end. [s]
    energy_balance_error : float
        |change of sensible heat - net heat in| relative to the largest energy
        term; a check of the integration. [-]
    warnings : tuple of str
    """

    times: np.ndarray
    temperature: np.ndarray
    mass_remaining: np.ndarray
    evaporation_rate: np.ndarray
    ground_heat_flow: np.ndarray
    air_heat_flow: np.ndarray
    solar_heat_flow: np.ndarray
    evaporation_heat_flow: np.ndarray
    minimum_temperature: float
    depletion_time: float
    energy_balance_error: float
    warnings: tuple[str, ...] = ()


def pool_temperature_balance(substance, ambient_temperature, initial_mass, area, wind_speed,
                             liquid_heat_capacity, *, initial_temperature=None,
                             ground="concrete", ground_temperature=None, solar_flux=0.0,
                             air_convection=True, enthalpy_of_vaporization=None,
                             model="mackay-matsugu", pressure=STANDARD_ATMOSPHERE,
                             t_end=None, times=None, max_evaluations=200_000,
                             time_limit=60.0) -> PoolTemperatureHistory:
    r"""Pool temperature and mass from an energy balance (evaporative cooling).

    An optional refinement: everywhere else the pool is at ambient temperature.
    The pool is well mixed, of fixed area, and

    .. math:: m c_p \frac{dT}{dt} = Q_\mathrm{ground} + Q_\mathrm{air}
              + Q_\mathrm{solar} - E\,\Delta H_\mathrm{vap}, \qquad
              \frac{dm}{dt} = -E(T)

    - ground: conduction from a semi-infinite solid at `ground_temperature`
      (`semi_infinite_ground_flux`), applied quasi-steadily with the current
      pool temperature, as in Kawamura & Mackay (1987) (check);
    - air: convection with a coefficient from the mass-transfer coefficient by
      the Chilton-Colburn analogy (`chilton_colburn_heat_transfer_coefficient`);
    - solar: a given absorbed flux; long-wave radiation is not included;
    - E(T) by the chosen model with the vapour pressure at the pool
      temperature; the transfer coefficients are evaluated at the ambient
      temperature; ΔHvap(T) by Watson's relation from the substance's value at
      the boiling point (or the constant given).

    The ground term goes as :math:`t^{-1/2}`; it is integrated exactly by
    solving in :math:`s = \sqrt{t}`.

    Parameters
    ----------
    substance : Substance or str
    ambient_temperature : float
        Air temperature. [K]
    initial_mass : float
        [kg]
    area : float
        Pool area, fixed. [m2]
    wind_speed : float
        [m/s]
    liquid_heat_capacity : float
        Specific heat capacity of the liquid. [J/(kg K)]
    initial_temperature : float, optional
        Pool temperature at time zero, ambient by default. [K]
    ground : str
        "concrete", "soil" or "insulated" (see `GROUND_TYPES`).
    ground_temperature : float, optional
        Undisturbed ground temperature, ambient by default. [K]
    solar_flux : float
        Absorbed solar flux, 0 by default. [W/m2]
    air_convection : bool
        Include convection from the air (True by default).
    enthalpy_of_vaporization : float, optional
        Constant ΔHvap to use instead of the substance's. [J/mol]
    model : str
        "mackay-matsugu" or "epa-rmp".
    pressure : float
        [Pa]
    t_end : float, optional
        By default the last of `times`, or twice the lifetime of the pool at
        ambient temperature, at most 8 hours. [s]
    times : array_like, optional
        Output times; by default 201 from 0 to `t_end`. [s]
    max_evaluations, time_limit
        Budget of the integration (evaluations, wall-clock seconds).

    Returns
    -------
    PoolTemperatureHistory

    References
    ----------
    Kawamura, P. I. & Mackay, D. (1987), "The evaporation of volatile liquids",
    J. Hazard. Mater. 15, 343-364 (check). Carslaw & Jaeger (1959), Section 2.5.
    Chilton & Colburn (1934), Ind. Eng. Chem. 26, 1183.
    """
    from scipy.integrate import solve_ivp

    from .substances import as_substance
    from .vapor import vapor_pressure_estimate, watson_enthalpy, trouton_enthalpy

    _check_model(model)
    if ground not in GROUND_TYPES:
        raise ValueError(f"unknown ground {ground!r}; expected one of {list(GROUND_TYPES)}")
    sub = as_substance(substance, "substance")
    t_air = single(positive_array(ambient_temperature, "ambient_temperature", "K"),
                    "ambient_temperature")
    m0 = single(positive_array(initial_mass, "initial_mass", "kg"), "initial_mass")
    a = single(positive_array(area, "area", "m2"), "area")
    u = single(_wind(wind_speed), "wind_speed")
    cp = single(positive_array(liquid_heat_capacity, "liquid_heat_capacity", "J/(kg K)"),
                 "liquid_heat_capacity")
    p = single(positive_array(pressure, "pressure", "Pa"), "pressure")
    t0 = t_air if initial_temperature is None else single(
        positive_array(initial_temperature, "initial_temperature", "K"), "initial_temperature")
    t_ground = t_air if ground_temperature is None else single(
        positive_array(ground_temperature, "ground_temperature", "K"), "ground_temperature")
    solar = single(positive_array(solar_flux, "solar_flux", "W/m2", allow_zero=True), "solar_flux")
    _boiling_check(sub, np.asarray(max(t0, t_air)), None, p, "initial_temperature"
                   if t0 > t_air else "ambient_temperature")

    notes = list(sub.notes)
    ambient = vapor_pressure_estimate(sub, t_air, field="ambient_temperature")
    method = ambient.method
    correlation = next(c for c in sub.correlations if c.method == method)
    _boiling_check(sub, np.asarray(t_air), ambient.pressure, p, "ambient_temperature")

    # transfer coefficients at the ambient temperature
    volume, note = _diffusion_volume(sub, "substance")
    if note:
        notes.append(note)
    sc = float(air_kinematic_viscosity(t_air, p)) / float(
        fuller_diffusivity(t_air, p, sub.molar_mass, volume))
    k, _, _, _, _ = _mass_transfer(sub, np.asarray(t_air), np.asarray(a), np.asarray(u), p,
                                   model, "substance")
    k = float(k)
    h = float(chilton_colburn_heat_transfer_coefficient(k, sc, t_air, p)) \
        if air_convection else 0.0
    conductivity, diffusivity = GROUND_TYPES[ground]
    ground_factor = 2.0 * conductivity * a / math.sqrt(math.pi * diffusivity)

    if enthalpy_of_vaporization is not None:
        dh_const = single(positive_array(enthalpy_of_vaporization, "enthalpy_of_vaporization",
                                     "J/mol"), "enthalpy_of_vaporization")

        def latent(_t):
            return dh_const / sub.molar_mass
    elif sub.enthalpy_of_vaporization is not None and sub.critical_temperature is not None:
        def latent(temperature):
            return float(watson_enthalpy(temperature, sub.boiling_point,
                                         sub.enthalpy_of_vaporization,
                                         sub.critical_temperature)) / sub.molar_mass
    elif sub.enthalpy_of_vaporization is not None:
        def latent(_t):
            return sub.enthalpy_of_vaporization / sub.molar_mass
    else:
        dh_trouton = float(trouton_enthalpy(sub.boiling_point))
        notes.append(f"{sub.name}: no enthalpy of vaporization known; Trouton's rule "
                     "was used")

        def latent(_t):
            return dh_trouton / sub.molar_mass

    t_floor = (sub.melting_point if sub.melting_point is not None else 0.5 * t_air) + 0.01
    t_ceiling = sub.boiling_point - 0.01

    def rate_at(temperature):
        temperature = min(max(temperature, t_floor), t_ceiling)
        p_sat = float(correlation(temperature))
        if model == "mackay-matsugu":
            return k * a * p_sat * sub.molar_mass / (GAS_CONSTANT * temperature)
        return float(epa_rmp_rate(sub.molar_mass, p_sat, a, u, temperature))

    if times is None:
        if t_end is None:
            r_ambient = rate_at(t_air)
            life = m0 / r_ambient if r_ambient > 0 else math.inf
            t_end = min(2.0 * life, EIGHT_HOUR_SHIFT)
        else:
            t_end = single(positive_array(t_end, "t_end", "s"), "t_end")
        t_out = np.linspace(0.0, t_end, 201)
    else:
        t_out = _times(times)
        t_end = float(t_out[-1]) if t_end is None else single(
            positive_array(t_end, "t_end", "s"), "t_end")
        if t_out[-1] > t_end or t_end <= 0.0:
            raise InputError("times", "output times must lie within (0, t_end]")

    budget = StepBudget(int(max_evaluations), float(time_limit))

    # state in s = sqrt(t): T, m, ground, air, solar, latent, carried sensible [J]
    def rhs(s, y):
        budget.tick()
        temperature, mass = y[0], max(y[1], 0.0)
        evaporation = rate_at(temperature) if mass > 0.0 else 0.0
        q_ground = ground_factor * (t_ground - temperature)  # J per unit of s
        q_air = h * a * (t_air - temperature)
        q_solar = solar * a
        q_latent = evaporation * latent(min(max(temperature, t_floor), t_ceiling))
        carried = evaporation * cp * (temperature - t0)
        heat = q_ground + 2.0 * s * (q_air + q_solar - q_latent)
        d_temperature = heat / (max(mass, DEPLETED_FRACTION * m0) * cp)
        return np.array([d_temperature, -2.0 * s * evaporation, q_ground,
                         2.0 * s * q_air, 2.0 * s * q_solar, 2.0 * s * q_latent,
                         2.0 * s * carried])

    def gone(_s, y):
        return y[1] - DEPLETED_FRACTION * m0
    gone.terminal = True
    gone.direction = -1

    def freezing(_s, y):
        return y[0] - t_floor
    freezing.terminal = True
    freezing.direction = -1

    def boiling(_s, y):
        return t_ceiling - y[0]
    boiling.terminal = True
    boiling.direction = -1

    s_out = np.sqrt(t_out)
    y0 = np.array([t0, m0, 0.0, 0.0, 0.0, 0.0, 0.0])
    solution = solve_ivp(rhs, (0.0, math.sqrt(t_end)), y0, method="LSODA", t_eval=s_out,
                         events=[gone, freezing, boiling], rtol=1e-8,
                         atol=np.array([1e-8, 1e-12 * m0, 1e-6, 1e-6, 1e-6, 1e-6, 1e-6]))
    if solution.status < 0:
        raise EvaporationSolverError(f"the pool energy balance failed: {solution.message}")
    if len(solution.t_events[1]):
        notes.append(f"{sub.name}: the pool cooled to its melting point; the calculation "
                     "stopped there (freezing is not modelled)")
    if len(solution.t_events[2]):
        notes.append(f"{sub.name}: the pool heated to its boiling point; the calculation "
                     "stopped there (boiling is not modelled)")
    done = solution.y.shape[1]
    y = solution.y
    n_times = t_out.size
    temperature = np.full(n_times, np.nan)
    mass = np.full(n_times, np.nan)
    temperature[:done] = y[0]
    mass[:done] = np.clip(y[1], 0.0, None)
    depletion = float(solution.t_events[0][0]) ** 2 if len(solution.t_events[0]) else math.inf
    if math.isfinite(depletion):
        mass[done:] = 0.0
        temperature[done:] = np.nan
        notes.append("after the pool is gone its temperature is reported as NaN")
    evaporation = np.array([rate_at(tt) if mm > 0.0 else 0.0
                            for tt, mm in zip(temperature, mass)])
    evaporation[np.isnan(temperature)] = 0.0
    with np.errstate(divide="ignore", invalid="ignore"):
        ground_flow = np.where(t_out > 0.0, ground_factor * (t_ground - temperature)
                               / (2.0 * np.sqrt(t_out)), np.nan)
    if ground == "insulated":
        ground_flow = np.where(np.isnan(temperature), np.nan, 0.0)
    air_flow = h * a * (t_air - temperature)
    solar_flow = np.where(np.isnan(temperature), 0.0, solar * a)
    latent_flow = -np.array([e * latent(min(max(tt, t_floor), t_ceiling))
                             if np.isfinite(tt) else 0.0
                             for e, tt in zip(evaporation, temperature)])

    # energy check at the end of the integration
    final = y[:, -1]
    sensible = max(final[1], 0.0) * cp * (final[0] - t0)
    net = final[2] + final[3] + final[4] - final[5] - final[6]
    largest = max(abs(final[2]), abs(final[3]), abs(final[4]), abs(final[5]), abs(sensible),
                  1e-30)
    balance = abs(sensible - net) / largest

    if done > 0:
        estimate = vapor_pressure_estimate(sub, np.clip(y[0], t_floor, t_ceiling),
                                           method=method, field="ambient_temperature")
        notes += list(estimate.warnings)
    notes += _validity_notes(sub.name, ambient.pressure, p, np.asarray(u))
    return PoolTemperatureHistory(
        times=t_out,
        temperature=temperature,
        mass_remaining=mass,
        evaporation_rate=evaporation,
        ground_heat_flow=ground_flow,
        air_heat_flow=air_flow,
        solar_heat_flow=solar_flow,
        evaporation_heat_flow=latent_flow,
        minimum_temperature=float(np.nanmin(y[0])),
        depletion_time=depletion,
        energy_balance_error=float(balance),
        warnings=tuple(dict.fromkeys(notes)),
    )
