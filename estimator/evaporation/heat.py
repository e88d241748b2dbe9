"""The pool heat balance: heat from the air (Chilton–Colburn analogy), from the ground
(a semi-infinite solid) and the sun, and the pool temperature as it evaporates and
cools (`pool_temperature_balance`).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..checks import float_or_array, positive_array, single
from ..constants import (
    AIR_HEAT_CAPACITY,
    AIR_PRANDTL_NUMBER,
    CONCRETE_THERMAL_CONDUCTIVITY,
    CONCRETE_THERMAL_DIFFUSIVITY,
    EIGHT_HOUR_SHIFT,
    GAS_CONSTANT,
    SOIL_THERMAL_CONDUCTIVITY,
    SOIL_THERMAL_DIFFUSIVITY,
    STANDARD_ATMOSPHERE,
)
from ..errors import InputError
from .air import (
    diffusion_volume_of,
    air_density,
    air_kinematic_viscosity,
    fuller_diffusivity,
)
from .mass_transfer import (
    EvaporationSolverError,
    boiling_check,
    check_model,
    check_wind_speed,
    epa_rmp_rate,
    pool_mass_transfer,
    validity_notes,
)
from .mixture import StepBudget
from .pool import DEPLETED_FRACTION, check_times

__all__ = [
    "GROUND_TYPES",
    "chilton_colburn_heat_transfer_coefficient",
    "semi_infinite_ground_flux",
    "PoolTemperatureHistory",
    "pool_temperature_balance",
]

#: Ground under the pool for `pool_temperature_balance`: keyword -> (thermal
#: conductivity [W/(m K)], thermal diffusivity [m2/s]); "insulated" means no
#: heat from the ground. Values and sources in `estimator.constants`.
GROUND_TYPES = {
    "concrete": (CONCRETE_THERMAL_CONDUCTIVITY, CONCRETE_THERMAL_DIFFUSIVITY),
    "soil": (SOIL_THERMAL_CONDUCTIVITY, SOIL_THERMAL_DIFFUSIVITY),
    "insulated": (0.0, 1.0),
}


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
    return float_or_array(k * rho * air_heat_capacity * ratio ** (2.0 / 3.0))


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
    return float_or_array(thermal_conductivity * dt / np.sqrt(math.pi * thermal_diffusivity * t))


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


def _latent_heat(sub, enthalpy_of_vaporization, notes):
    """The latent heat of vaporization [J/kg] as a function of temperature [K]: the
    given value, Watson's ΔHvap(T), the table's constant value, or Trouton's rule
    (with a note)."""
    from ..vapor import trouton_enthalpy, watson_enthalpy

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
    return latent


def _output_times(times, t_end, rate_at, t_air, m0):
    """Output times [s] and the end of the integration [s]: 201 points to twice the
    pool's life at the ambient rate (at most a shift), or the times given."""
    if times is None:
        if t_end is None:
            r_ambient = rate_at(t_air)
            life = m0 / r_ambient if r_ambient > 0 else math.inf
            t_end = min(2.0 * life, EIGHT_HOUR_SHIFT)
        else:
            t_end = single(positive_array(t_end, "t_end", "s"), "t_end")
        t_out = np.linspace(0.0, t_end, 201)
    else:
        t_out = check_times(times)
        t_end = float(t_out[-1]) if t_end is None else single(
            positive_array(t_end, "t_end", "s"), "t_end")
        if t_out[-1] > t_end or t_end <= 0.0:
            raise InputError("times", "output times must lie within (0, t_end]")
    return t_out, t_end


def _heat_flows(temperature, mass, t_out, rate_at, latent, bounds, ground_factor, t_ground,
                air_conductance, t_air, solar_power, insulated):
    """Evaporation rate [kg/s] and the heat flows [W] into the pool at each output
    time, from the integrated temperature and mass."""
    t_floor, t_ceiling = bounds
    evaporation = np.array([rate_at(tt) if mm > 0.0 else 0.0
                            for tt, mm in zip(temperature, mass)])
    evaporation[np.isnan(temperature)] = 0.0
    with np.errstate(divide="ignore", invalid="ignore"):
        ground_flow = np.where(t_out > 0.0, ground_factor * (t_ground - temperature)
                               / (2.0 * np.sqrt(t_out)), np.nan)
    if insulated:
        ground_flow = np.where(np.isnan(temperature), np.nan, 0.0)
    air_flow = air_conductance * (t_air - temperature)
    solar_flow = np.where(np.isnan(temperature), 0.0, solar_power)
    latent_flow = -np.array([e * latent(min(max(tt, t_floor), t_ceiling))
                             if np.isfinite(tt) else 0.0
                             for e, tt in zip(evaporation, temperature)])
    return evaporation, ground_flow, air_flow, solar_flow, latent_flow


def _pool_events(m0, t_floor, t_ceiling):
    """Terminal events of the pool heat balance, in the order the results read
    them: the pool is gone, it reaches its melting point, it reaches its boiling
    point (state y = T [K], m [kg], ...)."""
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
    return [gone, freezing, boiling]


def _checked_scalars(ambient_temperature, initial_mass, area, wind_speed,
                     liquid_heat_capacity, pressure, initial_temperature,
                     ground_temperature, solar_flux):
    """The single numbers of the heat balance, checked: air temperature [K], initial
    mass [kg], area [m2], wind speed [m/s], heat capacity [J/(kg K)], pressure [Pa],
    initial and ground temperatures [K] (ambient by default), solar flux [W/m2]."""
    t_air = single(positive_array(ambient_temperature, "ambient_temperature", "K"),
                    "ambient_temperature")
    m0 = single(positive_array(initial_mass, "initial_mass", "kg"), "initial_mass")
    a = single(positive_array(area, "area", "m2"), "area")
    u = single(check_wind_speed(wind_speed), "wind_speed")
    cp = single(positive_array(liquid_heat_capacity, "liquid_heat_capacity", "J/(kg K)"),
                 "liquid_heat_capacity")
    p = single(positive_array(pressure, "pressure", "Pa"), "pressure")
    t0 = t_air if initial_temperature is None else single(
        positive_array(initial_temperature, "initial_temperature", "K"), "initial_temperature")
    t_ground = t_air if ground_temperature is None else single(
        positive_array(ground_temperature, "ground_temperature", "K"), "ground_temperature")
    solar = single(positive_array(solar_flux, "solar_flux", "W/m2", allow_zero=True), "solar_flux")
    return t_air, m0, a, u, cp, p, t0, t_ground, solar


def _transfer_coefficients(sub, t_air, a, u, p, model, air_convection, notes):
    """The mass-transfer coefficient [m/s] and the Chilton-Colburn heat-transfer
    coefficient [W/(m2 K)] (0 without air convection), at the ambient temperature."""
    volume, note = diffusion_volume_of(sub, "substance")
    if note:
        notes.append(note)
    sc = float(air_kinematic_viscosity(t_air, p)) / float(
        fuller_diffusivity(t_air, p, sub.molar_mass, volume))
    k, _, _, _, _ = pool_mass_transfer(sub, np.asarray(t_air), np.asarray(a), np.asarray(u), p,
                                   model, "substance")
    k = float(k)
    h = float(chilton_colburn_heat_transfer_coefficient(k, sc, t_air, p)) \
        if air_convection else 0.0
    return k, h


def _rate_function(sub, correlation, model, k, a, u, bounds):
    """The evaporation rate [kg/s] as a function of the pool temperature [K], the
    temperature held inside ``bounds`` (just above melting, just below boiling)."""
    t_floor, t_ceiling = bounds

    def rate_at(temperature):
        temperature = min(max(temperature, t_floor), t_ceiling)
        p_sat = float(correlation(temperature))
        if model == "mackay-matsugu":
            return k * a * p_sat * sub.molar_mass / (GAS_CONSTANT * temperature)
        return float(epa_rmp_rate(sub.molar_mass, p_sat, a, u, temperature))

    return rate_at


def _balance_equations(rate_at, latent, bounds, budget, ground_factor, t_ground,
                       air_conductance, t_air, solar_power, cp, t0, m0):
    """Right-hand side of the heat balance in s = sqrt(t): state T, m, and the heat
    from the ground, air, sun, to evaporation and carried away as sensible heat [J]."""
    t_floor, t_ceiling = bounds

    def rhs(s, y):
        budget.tick()
        temperature, mass = y[0], max(y[1], 0.0)
        evaporation = rate_at(temperature) if mass > 0.0 else 0.0
        q_ground = ground_factor * (t_ground - temperature)  # J per unit of s
        q_air = air_conductance * (t_air - temperature)
        q_solar = solar_power
        q_latent = evaporation * latent(min(max(temperature, t_floor), t_ceiling))
        carried = evaporation * cp * (temperature - t0)
        heat = q_ground + 2.0 * s * (q_air + q_solar - q_latent)
        d_temperature = heat / (max(mass, DEPLETED_FRACTION * m0) * cp)
        return np.array([d_temperature, -2.0 * s * evaporation, q_ground,
                         2.0 * s * q_air, 2.0 * s * q_solar, 2.0 * s * q_latent,
                         2.0 * s * carried])

    return rhs


def _balance_history(solution, n_times, name, notes):
    """Temperature [K] (NaN after the pool is gone) and mass [kg] at the output
    times, and when the pool was gone [s]; notes on a run stopped at melting or
    boiling."""
    if len(solution.t_events[1]):
        notes.append(f"{name}: the pool cooled to its melting point; the calculation "
                     "stopped there (freezing is not modelled)")
    if len(solution.t_events[2]):
        notes.append(f"{name}: the pool heated to its boiling point; the calculation "
                     "stopped there (boiling is not modelled)")
    done = solution.y.shape[1]
    y = solution.y
    temperature = np.full(n_times, np.nan)
    mass = np.full(n_times, np.nan)
    temperature[:done] = y[0]
    mass[:done] = np.clip(y[1], 0.0, None)
    depletion = float(solution.t_events[0][0]) ** 2 if len(solution.t_events[0]) else math.inf
    if math.isfinite(depletion):
        mass[done:] = 0.0
        temperature[done:] = np.nan
        notes.append("after the pool is gone its temperature is reported as NaN")
    return temperature, mass, depletion


def _energy_balance_error(final, cp, t0) -> float:
    """Relative gap between the pool's sensible heat at the end of the integration
    and the net heat integrated into it. [-]"""
    sensible = max(final[1], 0.0) * cp * (final[0] - t0)
    net = final[2] + final[3] + final[4] - final[5] - final[6]
    largest = max(abs(final[2]), abs(final[3]), abs(final[4]), abs(final[5]), abs(sensible),
                  1e-30)
    return abs(sensible - net) / largest


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

    from ..substances import as_substance
    from ..vapor import vapor_pressure_estimate

    check_model(model)
    if ground not in GROUND_TYPES:
        raise ValueError(f"unknown ground {ground!r}; expected one of {list(GROUND_TYPES)}")
    sub = as_substance(substance, "substance")
    t_air, m0, a, u, cp, p, t0, t_ground, solar = _checked_scalars(
        ambient_temperature, initial_mass, area, wind_speed, liquid_heat_capacity, pressure,
        initial_temperature, ground_temperature, solar_flux)
    boiling_check(sub, np.asarray(max(t0, t_air)), None, p, "initial_temperature"
                   if t0 > t_air else "ambient_temperature")

    notes = list(sub.notes)
    ambient = vapor_pressure_estimate(sub, t_air, field="ambient_temperature")
    method = ambient.method
    correlation = next(c for c in sub.correlations if c.method == method)
    boiling_check(sub, np.asarray(t_air), ambient.pressure, p, "ambient_temperature")

    k, h = _transfer_coefficients(sub, t_air, a, u, p, model, air_convection, notes)
    conductivity, diffusivity = GROUND_TYPES[ground]
    ground_factor = 2.0 * conductivity * a / math.sqrt(math.pi * diffusivity)

    latent = _latent_heat(sub, enthalpy_of_vaporization, notes)

    t_floor = (sub.melting_point if sub.melting_point is not None else 0.5 * t_air) + 0.01
    t_ceiling = sub.boiling_point - 0.01
    rate_at = _rate_function(sub, correlation, model, k, a, u, (t_floor, t_ceiling))
    t_out, t_end = _output_times(times, t_end, rate_at, t_air, m0)

    budget = StepBudget(int(max_evaluations), float(time_limit))
    rhs = _balance_equations(rate_at, latent, (t_floor, t_ceiling), budget, ground_factor,
                             t_ground, h * a, t_air, solar * a, cp, t0, m0)
    s_out = np.sqrt(t_out)
    y0 = np.array([t0, m0, 0.0, 0.0, 0.0, 0.0, 0.0])
    solution = solve_ivp(rhs, (0.0, math.sqrt(t_end)), y0, method="LSODA", t_eval=s_out,
                         events=_pool_events(m0, t_floor, t_ceiling), rtol=1e-8,
                         atol=np.array([1e-8, 1e-12 * m0, 1e-6, 1e-6, 1e-6, 1e-6, 1e-6]))
    if solution.status < 0:
        raise EvaporationSolverError(f"the pool energy balance failed: {solution.message}")
    temperature, mass, depletion = _balance_history(solution, t_out.size, sub.name, notes)
    evaporation, ground_flow, air_flow, solar_flow, latent_flow = _heat_flows(
        temperature, mass, t_out, rate_at, latent, (t_floor, t_ceiling), ground_factor,
        t_ground, h * a, t_air, solar * a, ground == "insulated")
    y = solution.y
    balance = _energy_balance_error(y[:, -1], cp, t0)

    if y.shape[1] > 0:
        estimate = vapor_pressure_estimate(sub, np.clip(y[0], t_floor, t_ceiling),
                                           method=method, field="ambient_temperature")
        notes += list(estimate.warnings)
    notes += validity_notes(sub.name, ambient.pressure, p, np.asarray(u))
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
