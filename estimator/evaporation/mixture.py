"""Mixture pools: component rates by Raoult's law (`mixture_evaporation_rates`) and the
weathering of a mixture pool as its composition changes (`mixture_pool`, an ODE).
"""

from __future__ import annotations

import math
import time
import warnings
from dataclasses import dataclass

import numpy as np

from ..checks import positive_array, single
from ..constants import (
    EIGHT_HOUR_SHIFT,
    GAS_CONSTANT,
    SECONDS_PER_MINUTE,
    STANDARD_ATMOSPHERE,
)
from ..errors import InputError, OutOfRangeError, UllageWarning
from .mass_transfer import (
    EvaporationSolverError,
    check_model,
    check_wind_speed,
    pool_mass_transfer,
    validity_notes,
)
from .pool import DEPLETED_FRACTION, check_times

__all__ = [
    "mixture_evaporation_rates",
    "MixturePool",
    "mixture_pool",
]


# --------------------------------------------------------------------------
# mixtures


def mixture_components(components, field="components"):
    from ..substances import as_substance

    if isinstance(components, str) or not hasattr(components, "__len__"):
        raise InputError(field, "give a list of substances or keys, one per component")
    if len(components) == 0:
        raise InputError(field, "give at least one component")
    return [as_substance(c, f"{field}[{i}]") for i, c in enumerate(components)]


def per_component(value, n: int, field: str, unit: str, default: float) -> np.ndarray:
    if value is None:
        return np.full(n, default)
    array = positive_array(value, field, unit, allow_zero=True)
    array = np.broadcast_to(array, (n,)) if array.ndim == 0 else array.ravel()
    if array.size != n:
        raise InputError(field, f"got {array.size} values for {n} components; give one "
                         "per component")
    return np.array(array, dtype=float)


def activity_function(activity_coefficients, n: int):
    """A function x -> γ(x), and whether γ is constant."""
    if callable(activity_coefficients):
        def gamma(x):
            return np.asarray(activity_coefficients(x), dtype=float)
        return gamma, False
    values = per_component(activity_coefficients, n, "activity_coefficients", "", 1.0)
    if np.any(values <= 0.0):
        raise InputError("activity_coefficients", "every activity coefficient must be "
                         "above zero")
    return (lambda x: values[:, None] if np.ndim(x) == 2 else values), True


def component_conductances(subs, t, area, wind, model, pressure):
    """Per component: vapour pressure [Pa], rate per pascal of driving force
    [kg/(s Pa)], and notes."""
    from ..vapor import component_vapor_pressure_estimates

    names = [s.name for s in subs]
    notes = []
    p_sat = np.empty(len(subs))
    per_pascal = np.empty(len(subs))
    estimates = component_vapor_pressure_estimates(subs, t, "temperature")
    for i, sub in enumerate(subs):
        estimate = estimates[i]
        p_sat[i] = float(estimate.pressure)
        notes += list(estimate.warnings) + list(sub.notes)
        k, _, _, _, more = pool_mass_transfer(sub, np.asarray(t), np.asarray(area),
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
    notes += validity_notes("the mixture (Raoult's law)", bubble, pressure, np.inf)
    if bubble >= pressure:
        raise OutOfRangeError("temperature", (
            f"the mixture's vapour pressure by Raoult's law ({bubble:.0f} Pa) reaches the "
            f"ambient pressure ({pressure:.0f} Pa): the pool would boil (a boiling pool or "
            "flashing release), which lies outside these evaporation models"))
    return bubble


def mixture_inputs(components, temperature, area, wind_speed, model, pressure,
                   partial_pressures_air):
    """Checked inputs of a mixture pool, shared by the weathering and spill models."""
    check_model(model)
    subs = mixture_components(components)
    t = single(positive_array(temperature, "temperature", "K"), "temperature")
    a = single(positive_array(area, "area", "m2"), "area")
    u = single(check_wind_speed(wind_speed), "wind_speed")
    p = single(positive_array(pressure, "pressure", "Pa"), "pressure")
    p_air = per_component(partial_pressures_air, len(subs), "partial_pressures_air", "Pa",
                           0.0)
    p_sat, per_pascal, notes = component_conductances(subs, t, a, u, model, p)
    notes += validity_notes("the mixture", 0.0, p, np.asarray(u))
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
    gamma_of, _ = activity_function(activity_coefficients, len(subs))
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


def _initial_moles(initial_amounts, amount_basis, molar_mass) -> np.ndarray:
    """Initial moles of each component from amounts in kg or mol (zeros allowed,
    not all zero). [mol]"""
    n_comp = molar_mass.size
    unit = "kg" if amount_basis == "mass" else "mol"
    amounts = positive_array(initial_amounts, "initial_amounts", unit, allow_zero=True).ravel()
    if amounts.size != n_comp:
        raise InputError("initial_amounts", f"got {amounts.size} amounts for {n_comp} "
                         "components; give one per component")
    if amounts.sum() <= 0.0:
        raise InputError("initial_amounts", "all amounts are zero; give at least one "
                         "positive amount")
    return amounts / molar_mass if amount_basis == "mass" else amounts.copy()


def _initial_activity(activity_coefficients, x0):
    """γ as a function of the mole fractions, whether it is constant, and its
    checked values at the initial composition."""
    n_comp = x0.size
    gamma_of, gamma_constant = activity_function(activity_coefficients, n_comp)
    gamma0 = gamma_of(x0)
    if gamma0.shape != (n_comp,) or np.any(~np.isfinite(gamma0)) or np.any(gamma0 <= 0):
        raise InputError("activity_coefficients", "must give one positive, finite "
                         "activity coefficient per component")
    return gamma_of, gamma_constant, gamma0


def _weathering_times(t_end, times):
    """Output times [s] (one a minute by default) and the end of the integration [s]."""
    if t_end is not None:
        t_end = single(positive_array(t_end, "t_end", "s"), "t_end")
    if times is None:
        t_end = EIGHT_HOUR_SHIFT if t_end is None else t_end
        t_out = np.linspace(0.0, t_end, int(round(t_end / SECONDS_PER_MINUTE)) + 1)
        if t_out.size < 2:
            t_out = np.array([0.0, t_end])
        return t_out, t_end
    t_out = check_times(times)
    if t_end is None:
        t_end = float(t_out[-1])
    if t_out[-1] > t_end:
        raise InputError("times", f"the last output time {t_out[-1]:g} s lies after "
                         f"t_end = {t_end:g} s")
    if t_end <= 0.0:
        raise InputError("times", "need an output time after zero")
    return t_out, t_end


def _weathering_equations(gamma_of, gamma0, gamma_constant, surface, p_air,
                          molar_per_pascal, budget):
    """The driving force of each component (``drive``), the right-hand side of the
    pool moles and the moles evaporated (``rhs``), and its Jacobian when γ is
    constant (``jac``, else None)."""
    n_comp = surface.size

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

    if not gamma_constant:
        return drive, rhs, None
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

    return drive, rhs, jac


def _depletion_events(n0, present):
    """One event per component present as it falls to `DEPLETED_FRACTION` of its
    initial amount, then a terminal one when every component has."""
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
    return events


def _weathering_history(solution, n0, present, n_times):
    """Moles left and evaporated at the output times (the pool empty after the run
    stopped), when the pool was gone [s], and when each component was. [s]"""
    n_comp = n0.size
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
    return moles, evaporated, pool_gone, depletion


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
    n0 = _initial_moles(initial_amounts, amount_basis, molar_mass)
    x0 = n0 / n0.sum()
    gamma_of, gamma_constant, gamma0 = _initial_activity(activity_coefficients, x0)
    bubble_check(x0, gamma0, p_sat, p, notes)
    no_drive = (x0 * gamma0 * p_sat <= p_air) & (n0 > 0)
    for i in np.flatnonzero(no_drive):
        notes.append(f"{subs[i].name}: its partial pressure in the air is at or above its "
                     "surface partial pressure, so it does not evaporate (condensation is "
                     "not modelled)")
    t_out, t_end = _weathering_times(t_end, times)

    molar_per_pascal = per_pascal / molar_mass  # mol/(s Pa)
    budget = StepBudget(int(max_evaluations), float(time_limit))
    drive, rhs, jac = _weathering_equations(gamma_of, gamma0, gamma_constant, p_sat.copy(),
                                            p_air, molar_per_pascal, budget)
    present = np.flatnonzero(n0 > 0.0)
    y0 = np.concatenate((n0, np.zeros(n_comp)))
    scale = float(n0.sum())
    solution = solve_ivp(rhs, (0.0, t_end), y0, method="LSODA", t_eval=t_out,
                         events=_depletion_events(n0, present), rtol=1e-8,
                         atol=1e-13 * scale, jac=jac)
    if solution.status < 0:
        raise EvaporationSolverError(f"the mixture integration failed: {solution.message}")
    moles, evaporated, pool_gone, depletion = _weathering_history(solution, n0, present,
                                                                  t_out.size)

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
