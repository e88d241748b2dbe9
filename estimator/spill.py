"""A spill from source to breathing zone: pool evaporation coupled to the room air.

The pool and the room are integrated together: each component evaporates at a
rate set by the difference between its partial pressure at the pool surface
(Raoult's law) and in the air above it, so a large spill in a small, poorly
ventilated room slows as the air nears saturation and never exceeds it. The air
above the pool is the whole room (well-mixed model) or a near field around the
pool (two-zone model). Outdoors, the initial evaporation rate feeds a Gaussian
plume (`outdoor_spill`).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np

from .constants import EIGHT_HOUR_SHIFT, GAS_CONSTANT, STANDARD_ATMOSPHERE, UNDIKED_SPILL_DEPTH
from .checks import positive
from .errors import InputError
from .evaporation import (
    DEPLETED_FRACTION,
    EvaporationSolverError,
    bubble_check,
    StepBudget,
    mixture_inputs,
    spill_pool_area,
)
from .mixtures import liquid as make_liquid
from .outdoor import ground_level_centerline

__all__ = ["IndoorSpill", "indoor_spill", "OutdoorSpill", "outdoor_spill",
           "liquid_mixture_density"]


def liquid_mixture_density(liq) -> float:
    """Density of a liquid mixture with ideal mixing: 1/ρ = Σ w_i/ρ_i. [kg/m3]"""
    densities = [c.liquid_density for c in liq.components]
    if any(d is None for d in densities):
        missing = [c.name for c, d in zip(liq.components, densities) if d is None]
        raise InputError("liquid", f"no liquid density for {', '.join(missing)}; give the "
                         "spilled mass instead of the volume")
    return float(1.0 / np.sum(liq.mass_fractions / np.asarray(densities)))


@dataclass(frozen=True)
class IndoorSpill:
    """Concentrations over time after a spill indoors.

    Arrays over time have shape (number of times, number of components).

    Attributes
    ----------
    components : tuple of str
    molar_masses : numpy.ndarray
        [kg/mol]
    times : numpy.ndarray
        [s]
    room : numpy.ndarray
        Room air (well-mixed) or far field (two-zone). [kg/m3]
    near_field : numpy.ndarray or None
        Air around the pool and the worker (two-zone only). [kg/m3]
    mass_remaining, evaporation_rate : numpy.ndarray
        Pool contents [kg] and evaporation rate [kg/s].
    initial_mass : numpy.ndarray
        [kg]
    pool_area : float
        [m2]
    pool_gone_time : float
        When every component is gone; inf if not within the run. [s]
    source_removed_time : float or None
        When the pool was taken away (clean-up), if given. [s]
    saturation : numpy.ndarray
        Each component's equilibrium concentration over the initial liquid. [kg/m3]
    temperature, pressure : float
        [K], [Pa]
    mass_balance_error : float
        Largest |pool + air + ventilated - initial| relative to the initial mass. [-]
    model : str
        Zone model and evaporation model used.
    warnings : tuple of str
    """

    components: tuple[str, ...]
    molar_masses: np.ndarray
    times: np.ndarray
    room: np.ndarray
    near_field: np.ndarray | None
    mass_remaining: np.ndarray
    evaporation_rate: np.ndarray
    initial_mass: np.ndarray
    pool_area: float
    pool_gone_time: float
    source_removed_time: float | None
    saturation: np.ndarray
    temperature: float
    pressure: float
    mass_balance_error: float
    model: str
    warnings: tuple[str, ...]

    def volume_fraction(self, zone: str = "room") -> np.ndarray:
        """Per-component volume fractions in a zone ("room" or "near_field"). [-]"""
        c = self.room if zone == "room" else self.near_field
        if c is None:
            raise InputError("zone", "this run has no near field; it used the well-mixed room")
        return c * GAS_CONSTANT * self.temperature / (self.molar_masses * self.pressure)

    def ppm(self, zone: str = "room") -> np.ndarray:
        """Per-component concentration in a zone. [ppm by volume]"""
        return self.volume_fraction(zone) * 1e6


def _spilled_mass(liq, spilled_volume, spilled_mass, v_room, area, dike_area, depth):
    """Spilled mass [kg] and pool area [m2] from the volume or the mass given, and the
    area given, the dike or the undiked spreading depth."""
    if (spilled_volume is None) == (spilled_mass is None):
        raise InputError("spilled volume", "give either the spilled volume or the spilled "
                         "mass (one of the two)")
    if spilled_mass is None:
        vol = positive(spilled_volume, "spilled volume", "m3")
        if vol >= v_room:
            raise InputError("spilled volume", f"{vol:g} m3 is not smaller than the room "
                             f"({v_room:g} m3); check the units")
        mass = vol * liquid_mixture_density(liq)
    else:
        mass = positive(spilled_mass, "spilled mass", "kg")
        vol = None
    if area is None:
        if vol is None:
            vol = mass / liquid_mixture_density(liq)
        area = spill_pool_area(vol, dike_area, depth)
    return mass, positive(area, "pool area", "m2")


def _output_times(times, duration):
    """Output times [s] (every 10 s over the duration, or those given) and the end."""
    if times is None:
        end = positive(duration, "duration", "s")
        t_out = np.linspace(0.0, end, int(round(end / 10.0)) + 1)
    else:
        t_out = np.asarray(times, dtype=float)
        if t_out.ndim != 1 or t_out.size < 2 or not np.all(np.isfinite(t_out)):
            raise InputError("times", "give at least two finite output times")
        if t_out[0] < 0 or np.any(np.diff(t_out) <= 0):
            raise InputError("times", "times must start at or after 0 and increase")
        end = float(t_out[-1])
    return t_out, end


def _integrate_segments(rhs, y0, t_out, segments, atol):
    """Integrate ``rhs`` over each (start, end, source active) segment, reporting the
    state at `t_out` (LSODA through ``scipy.integrate.odeint``)."""
    from scipy.integrate import odeint

    y_out = np.empty((t_out.size, y0.size))
    y_start = y0
    for index, (t0, t1, active) in enumerate(segments):
        mask = (t_out >= t0) & (t_out <= t1) if index else (t_out <= t1)
        if t1 <= t0:
            y_out[mask] = y_start
            continue
        grid = np.concatenate(([t0], t_out[mask & (t_out > t0)], [t1]))
        try:
            values, info = odeint(rhs, y_start, grid, args=(active,), tfirst=True,
                                  rtol=1e-8, atol=atol, full_output=True,
                                  hmax=max((t1 - t0) / 50.0, 1e-3), mxstep=20_000)
        except EvaporationSolverError:
            raise
        except Exception as exc:
            raise EvaporationSolverError(f"the spill integration failed: {exc}") from None
        if info["message"] != "Integration successful.":
            raise EvaporationSolverError(f"the spill integration failed: {info['message']}")
        inside = values[1:-1]
        if t_out[mask][0] == t0:
            inside = np.vstack((values[:1], inside))
        y_out[mask] = inside
        y_start = values[-1]
    if not np.all(np.isfinite(y_out)):
        raise EvaporationSolverError("the spill integration produced no finite result; "
                                     "check the inputs for extreme values")
    return y_out


def _mixing_factor(mixing_factor) -> float:
    """The mixing factor K >= 1 that divides the ventilation rate. [-]"""
    k_mix = float(mixing_factor)
    if not math.isfinite(k_mix) or k_mix < 1.0:
        raise InputError("mixing factor", f"{mixing_factor!r} must be 1 or more: ullage "
                         "divides the ventilation rate by K >= 1 (effective ventilation Q/K)")
    return k_mix


def _near_field(near_field_volume, interzonal_flow, v_room):
    """The near-field volume [m3] and interzonal airflow β [m3/s] of the two-zone
    model, or None for the well-mixed room (neither given)."""
    if near_field_volume is None and interzonal_flow is None:
        return None
    if near_field_volume is None or interzonal_flow is None:
        raise InputError("near field", "the two-zone model needs both the near-field "
                         "volume and the interzonal airflow")
    v_nf = positive(near_field_volume, "near-field volume", "m3")
    beta = positive(interzonal_flow, "interzonal airflow", "m3/s")
    if v_nf >= v_room:
        raise InputError("near-field volume", "must be smaller than the room volume")
    return v_nf, beta


def _effective_ventilation(q, k_mix, end, v_room, notes: list) -> float:
    """Q/K [m3/s], zero when it would change less than a billionth of the room air
    over the run (with a note)."""
    q_eff = q / k_mix
    if 0.0 < q_eff * end / v_room < 1e-9:
        q_eff = 0.0
        notes.append("the ventilation rate changes less than a billionth of the room air "
                     "over the run: treated as a closed room")
    return q_eff


def _pool_sources(per_pascal, surface, to_pressure, floor, n_comp):
    """The evaporation rates of the pool, over a series (``rates``) and at one
    instant (``source``, the fast path the integration calls)."""

    def rates(n, c_drive, active):
        """Evaporation rates [kg/s]; n and c_drive of shape (..., n_comp).

        The last `DEPLETED_FRACTION` of the pool evaporates with a rate that falls
        smoothly to zero (factor total / (total + floor)) instead of stopping at a
        kink, so the solver never chatters at the moment the pool runs dry.
        """
        positive = np.clip(n, 0.0, None)
        total = positive.sum(axis=-1, keepdims=True)
        x = positive / (total + floor)
        g = per_pascal * np.clip(x * surface - c_drive * to_pressure, 0.0, None)
        return np.where(np.asarray(active)[..., None], g, 0.0)

    no_rate = np.zeros(n_comp)

    def source(n, c_drive, active):
        """Evaporation rates at one instant, the fast path of `rates`. [kg/s]"""
        if not active:
            return no_rate
        positive = np.maximum(n, 0.0)
        total = positive.sum()
        return per_pascal * np.maximum(positive * (surface / (total + floor))
                                       - c_drive * to_pressure, 0.0)

    return rates, source


def _room_equations(source, budget, molar, n_comp, q_eff, v_room, near):
    """Right-hand side of the pool and room air: pool moles, air concentrations of
    each zone and the mass ventilated, for ``odeint``."""
    if near is not None:
        v_nf, beta = near
        v_ff = v_room - v_nf

        def rhs(t, y, active):
            budget.tick()
            n = y[:n_comp]
            c_nf, c_ff = y[n_comp:2 * n_comp], y[2 * n_comp:3 * n_comp]
            g = source(n, c_nf, active)
            exchange = beta * (c_nf - c_ff)
            return np.concatenate((-g / molar, (g - exchange) / v_nf,
                                   (exchange - q_eff * c_ff) / v_ff, q_eff * c_ff))
        return rhs

    def rhs(t, y, active):
        budget.tick()
        n = y[:n_comp]
        c = y[n_comp:2 * n_comp]
        g = source(n, c, active)
        return np.concatenate((-g / molar, (g - q_eff * c) / v_room, q_eff * c))
    return rhs


def _integrate_room(rhs, n0, mass, v_room, zones, t_out, end, t_remove):
    """The state at the output times, the pool taken away at ``t_remove`` if given."""
    n_comp = n0.size
    y0 = np.concatenate((n0, np.zeros(zones * n_comp), np.zeros(n_comp)))
    segments = [(0.0, end, True)]
    if t_remove is not None and t_remove < end:
        segments = [(0.0, t_remove, True), (t_remove, end, False)]
    scale = np.concatenate((n0, np.full(zones * n_comp, mass / v_room),
                            np.full(n_comp, mass)))
    atol = np.maximum(scale, 1e-30) * 1e-12
    return _integrate_segments(rhs, y0, t_out, segments, atol)


def _room_series(y_out, n_comp, molar, near, v_room, mass):
    """From the integrated state: pool mass [kg], near-field (or None) and room or
    far-field air [kg/m3], the air that drives evaporation, and the relative
    mass-balance error."""
    zones = 1 if near is None else 2
    n_t = np.clip(y_out[:, :n_comp], 0.0, None)
    air = y_out[:, n_comp:(1 + zones) * n_comp]
    ventilated = y_out[:, (1 + zones) * n_comp:]
    mass_pool = n_t * molar
    if near is not None:
        v_nf = near[0]
        c_nf, c_ff = air[:, :n_comp], air[:, n_comp:]
        in_air = c_nf * v_nf + c_ff * (v_room - v_nf)
        drive_c = c_nf
    else:
        c_nf, c_ff = None, air
        in_air = c_ff * v_room
        drive_c = c_ff
    total0 = float(mass)
    balance = float(np.max(np.abs(mass_pool.sum(1) + in_air.sum(1) + ventilated.sum(1)
                                  - total0)) / total0)
    return n_t, mass_pool, c_nf, c_ff, drive_c, balance


def indoor_spill(liquid, temperature, *, room_volume, ventilation_rate, spilled_volume=None,
                 spilled_mass=None, area=None, dike_area=None, depth=UNDIKED_SPILL_DEPTH,
                 mixing_factor=1.0, air_speed=0.1, times=None, duration=EIGHT_HOUR_SHIFT,
                 near_field_volume=None, interzonal_flow=None, source_removed_at=None,
                 model="mackay-matsugu", pressure=STANDARD_ATMOSPHERE, basis="mass",
                 activity_coefficients=None, time_limit=60.0) -> IndoorSpill:
    r"""Evaporation of a spilled pool into a room, integrated with the room air.

    For each component i, with pool moles n_i and air concentration c_i:

    .. math::
        \frac{dn_i}{dt} = -\frac{G_i}{M_i},\qquad
        G_i = \frac{k_i A M_i}{R T}\left(x_i\gamma_i p_{\mathrm{sat},i}
              - \frac{c_i R T}{M_i}\right)^+

    and the well-mixed room V dc/dt = G - (Q/K) c, or the two-zone model
    (Nicas 1996) V_NF dc_NF/dt = G - β (c_NF - c_FF),
    V_FF dc_FF/dt = β (c_NF - c_FF) - (Q/K) c_FF, with the driving force taken
    from the near field. The mixing factor K >= 1 divides the ventilation rate
    (effective ventilation Q/K). k_i is the Mackay-Matsugu (or EPA RMP)
    mass-transfer coefficient at the indoor air speed. Pool temperature is fixed.

    Parameters
    ----------
    liquid : Liquid, Substance, str or mapping
        As for `estimator.mixtures.liquid`; mapping fractions on `basis`.
    temperature : float
        Pool and room temperature. [K]
    room_volume : float
        [m3]
    ventilation_rate : float
        General ventilation, 0 for a closed room. [m3/s]
    spilled_volume, spilled_mass : float
        The liquid spilled: volume [m3] or mass [kg], one of the two.
    area : float, optional
        Pool area [m2]; by default the spill spread to `depth`, or the dike floor.
    dike_area : float, optional
        Floor area of a dike or bund holding the spill. [m2]
    depth : float
        Spread depth of an undiked spill, 1 cm (US EPA RMP guidance). [m]
    mixing_factor : float
        K >= 1, dividing the ventilation rate. [-]
    air_speed : float
        Air speed over the pool, indoors typically 0.05-0.5 m/s. [m/s]
    times : array_like, optional
        Output times from 0 [s]; by default every 10 s over `duration`.
    duration : float
        Length of the run when `times` is not given. [s]
    near_field_volume, interzonal_flow : float, optional
        Give both for the two-zone model: [m3] and β [m3/s].
    source_removed_at : float, optional
        Time the pool is cleaned up (evaporation stops). [s]
    model : str
        "mackay-matsugu" or "epa-rmp".
    pressure : float
        [Pa]
    time_limit : float
        Wall-clock seconds allowed for the integration. [s]

    Returns
    -------
    IndoorSpill
    """
    liq = make_liquid(liquid, basis, activity_coefficients)
    t_k = positive(temperature, "temperature", "K")
    v_room = positive(room_volume, "room volume", "m3")
    q = positive(ventilation_rate, "ventilation rate", "m3/s", allow_zero=True)
    k_mix = _mixing_factor(mixing_factor)
    mass, pool_area = _spilled_mass(liq, spilled_volume, spilled_mass, v_room, area,
                                    dike_area, depth)
    near = _near_field(near_field_volume, interzonal_flow, v_room)
    t_out, end = _output_times(times, duration)
    t_remove = None
    if source_removed_at is not None:
        t_remove = positive(source_removed_at, "source removed at", "s", allow_zero=True)

    subs = liq.components
    names = tuple(c.name for c in subs)
    _, _, _, _, p, _, p_sat, per_pascal, notes = mixture_inputs(
        subs, t_k, pool_area, air_speed, model, pressure, None)
    notes = list(liq.warnings) + notes
    n_comp = len(subs)
    molar = liq.molar_masses
    x0 = liq.mole_fractions
    gamma = liq.activity_coefficients
    bubble_check(x0, gamma, p_sat, p, notes)
    n0 = mass * liq.mass_fractions / molar
    to_pressure = GAS_CONSTANT * t_k / molar
    surface = gamma * p_sat
    q_eff = _effective_ventilation(q, k_mix, end, v_room, notes)
    budget = StepBudget(400_000, float(time_limit))
    floor = DEPLETED_FRACTION * n0.sum()
    rates, source = _pool_sources(per_pascal, surface, to_pressure, floor, n_comp)
    rhs = _room_equations(source, budget, molar, n_comp, q_eff, v_room, near)
    zones = 1 if near is None else 2
    y_out = _integrate_room(rhs, n0, mass, v_room, zones, t_out, end, t_remove)
    n_t, mass_pool, c_nf, c_ff, drive_c, balance = _room_series(y_out, n_comp, molar, near,
                                                                v_room, mass)
    active_t = np.ones(t_out.size, dtype=bool) if t_remove is None else t_out < t_remove
    rate = rates(n_t, drive_c, active_t)
    gone = np.flatnonzero(n_t.sum(1) <= DEPLETED_FRACTION * n0.sum())
    pool_gone = float(t_out[gone[0]]) if gone.size else math.inf
    saturation = x0 * surface / to_pressure
    if q == 0:
        notes.append("closed room (no ventilation): the air approaches saturation and stays")
    return IndoorSpill(
        components=names, molar_masses=molar, times=t_out, room=c_ff, near_field=c_nf,
        mass_remaining=mass_pool, evaporation_rate=rate, initial_mass=n0 * molar,
        pool_area=pool_area, pool_gone_time=pool_gone, source_removed_time=t_remove,
        saturation=saturation, temperature=t_k, pressure=p, mass_balance_error=balance,
        model=("well-mixed room" if near is None else "two-zone (near field / far field)")
        + f", {model} evaporation",
        warnings=tuple(dict.fromkeys(notes)),
    )


@dataclass(frozen=True)
class OutdoorSpill:
    """Downwind centreline concentrations from a pool outdoors.

    Attributes
    ----------
    components : tuple of str
    emission_rate : numpy.ndarray
        Initial evaporation rate per component, the screening source strength. [kg/s]
    distances : numpy.ndarray
        [m]
    concentration : numpy.ndarray
        Ground-level centreline, shape (distances, components), capped at the
        saturated vapour concentration over the pool. [kg/m3]
    volume_fraction : numpy.ndarray
        Same, as volume fractions at the air temperature and pressure. [-]
    stability : str
    terrain : str
    wind_speed : float
        At 10 m. [m/s]
    warnings : tuple of str
        Validity statements of the screening method.
    pool_area : float
        [m2]
    pool_edge : float
        Where the centreline is first evaluated: the pool radius, at least 1 m. [m]
    volume_rates : numpy.ndarray
        Per component, the emission as vapour at the air temperature and
        pressure. [m3/s]
    saturation_volume_fraction : numpy.ndarray
        Per component, its Raoult partial pressure over the pool / pressure: the
        most the pool can give. [-]
    capped_until : float or None
        The plume formula gives more than that out to this distance; there the
        centreline is capped at it. None: nowhere beyond the pool edge. [m]
    lower_flammability_limits : numpy.ndarray
        Per component, NaN where none. [volume fraction]
    percent_lfl : numpy.ndarray
        Centreline % of the LFL (Le Chatelier over the components) at `distances`. [%]
    lfl_alarm_percent : float
        The site's alarm level. [% LFL]
    distance_to_lfl, distance_to_lfl_alarm : float or None
        How far the centreline stays at or above the LFL and the alarm level; None
        where it is below them at the pool edge. [m]
    lfl_flags, lfl_alarm_flags : tuple of str
        Validity flags of those distances (outside Briggs's range, within the
        capped zone, near-calm wind, dense gas).
    dense_gas : DenseGasCriterion or None
        Britter-McQuaid criterion for the saturated vapour-air mixture over the pool.
    """

    components: tuple[str, ...]
    emission_rate: np.ndarray
    distances: np.ndarray
    concentration: np.ndarray
    volume_fraction: np.ndarray
    stability: str
    terrain: str
    wind_speed: float
    warnings: tuple[str, ...]
    pool_area: float = float("nan")
    pool_edge: float = 1.0
    volume_rates: np.ndarray | None = None
    saturation_volume_fraction: np.ndarray | None = None
    capped_until: float | None = None
    lower_flammability_limits: np.ndarray | None = None
    percent_lfl: np.ndarray | None = None
    lfl_alarm_percent: float = 10.0
    distance_to_lfl: float | None = None
    distance_to_lfl_alarm: float | None = None
    lfl_flags: tuple[str, ...] = ()
    lfl_alarm_flags: tuple[str, ...] = ()
    dense_gas: object = None

    def centreline(self, distances) -> np.ndarray:
        """Capped centreline volume fractions, shape (distances, components). [-]"""
        from .outdoor import centerline_concentration, pasquill_classes, terrain_key

        x = np.atleast_1d(np.asarray(distances, dtype=float))
        shape = centerline_concentration(1.0, self.wind_speed, x, pasquill_classes(self.stability),
                            terrain_key(self.terrain))
        plume = shape[:, None] * self.volume_rates[None, :]
        return np.minimum(plume, self.saturation_volume_fraction[None, :])

    def fraction_of_lfl(self, distances) -> np.ndarray:
        """Centreline fuel concentration over the mixture LFL (1 = at the LFL). [-]"""
        y = self.centreline(distances)
        lfl = self.lower_flammability_limits
        fuel = np.isfinite(lfl)
        return np.sum(np.where(fuel, y / np.where(fuel, lfl, 1.0), 0.0), axis=1)

    def distance_above(self, level, component=None):
        """Distance out to which the capped centreline stays at or above a level.

        Parameters
        ----------
        level : float
            A volume fraction of `component`, or a fraction of the LFL (1 = the LFL)
            when `component` is None. [-]
        component : int, optional

        Returns
        -------
        (float or None, str)
            The distance [m] (None where the centreline is below the level at the
            pool edge; `MAX_OUTDOOR_DISTANCE` where it is still above it there),
            and a note.
        """
        if component is None:
            def value(x):
                return float(self.fraction_of_lfl(x)[0])
        else:
            def value(x):
                return float(self.centreline(x)[0, component])
        return _crossing(value, float(level), self.pool_edge)


#: Farthest distance searched for a crossing. [m]
MAX_OUTDOOR_DISTANCE = 1e5


def _crossing(value, level: float, edge: float):
    """Where a falling function of distance passes `level` (see `OutdoorSpill.distance_above`)."""
    from scipy.optimize import brentq

    if not (level > 0) or value(edge) < level:
        return None, f"below it from the pool edge ({edge:.2g} m) on"
    if value(MAX_OUTDOOR_DISTANCE) >= level:
        return MAX_OUTDOOR_DISTANCE, (f"still above it at {MAX_OUTDOOR_DISTANCE:,.0f} m, the "
                                      "farthest distance searched")

    def f(log_x):
        v = value(math.exp(log_x))
        return math.log(max(v, 1e-300) / level)

    x = math.exp(brentq(f, math.log(edge), math.log(MAX_OUTDOOR_DISTANCE), xtol=1e-10,
                        maxiter=200))
    return x, "the centreline falls to it here"


def _distance_flags(distance, capped_until, wind_speed, dense_gas) -> list[str]:
    """Validity flags of a distance on the screening plume."""
    from .outdoor import BRIGGS_RANGE

    flags = []
    if distance is None:
        return flags
    if distance < BRIGGS_RANGE[0]:
        flags.append("under 100 m, outside the range of the dispersion coefficients")
    if distance > BRIGGS_RANGE[1]:
        flags.append("beyond 10 km, outside the range of the dispersion coefficients")
    if capped_until is not None and distance <= capped_until:
        flags.append("within the zone where the centreline is capped at the saturated "
                     "vapour concentration")
    if wind_speed < 1.0:
        flags.append("near-calm wind: the plume model does not apply")
    if dense_gas is not None and dense_gas.dense:
        flags.append(f"dense gas (Britter-McQuaid criterion {dense_gas.value:.2g} >= "
                     f"{dense_gas.threshold:g}): a dense-gas model is needed")
    return flags


def _lfl_alarm_percent(lfl_alarm_percent) -> float:
    """The site's LFL alarm level, above 0 and at most 100. [% LFL]"""
    alarm = positive(lfl_alarm_percent, "LFL alarm", "% of the LFL")
    if alarm > 100.0:
        raise InputError("LFL alarm", f"{alarm:g} % is above 100 % of the LFL; give the "
                         "alarm as a percentage of the LFL, such as 10")
    return alarm


def _outdoor_pool_area(area, spilled_volume, dike_area, depth) -> float:
    """The pool area given, or the spilled volume spread to the dike or to ``depth``. [m2]"""
    if area is None:
        if spilled_volume is None:
            raise InputError("pool area", "give the pool area or the spilled volume")
        area = spill_pool_area(positive(spilled_volume, "spilled volume", "m3"),
                               dike_area, depth)
    return positive(area, "pool area", "m2")


def _saturation_fractions(liq, t, pressure) -> np.ndarray:
    """Per component, its Raoult partial pressure over the pool / pressure, at most 1. [-]"""
    from .vapor import component_vapor_pressure_estimates

    estimates = component_vapor_pressure_estimates(liq.components, t, "temperature")
    p_sat = np.array([float(e.pressure) for e in estimates])
    gamma = np.asarray(liq.activity_coefficients_at(t), dtype=float).reshape(-1)
    return np.minimum(liq.mole_fractions * gamma * p_sat / float(pressure), 1.0)


def _pool_dense_gas(g, y_sat, molar_masses, t, pressure, u):
    """Britter-McQuaid criterion for the saturated vapour-air mixture over the pool,
    or None when the pool gives no vapour."""
    from .outdoor import pool_source_criterion

    if not (g.sum() > 0 and y_sat.sum() > 0):
        return None
    mean_molar_mass = float(np.sum(y_sat * molar_masses) / np.sum(y_sat))
    return pool_source_criterion(float(np.sum(g / molar_masses)),
                                 float(min(y_sat.sum(), 1.0)), mean_molar_mass, t,
                                 float(pressure), u)


def _capped_until(volume_rates, y_sat, u, edge, classes, land):
    """How far the plume formula gives some component more than its saturated
    fraction over the pool (the zone where the centreline is capped); None where
    it does nowhere beyond the pool edge. [m]"""
    from .outdoor import centerline_concentration

    capped_until = None
    shape_edge = float(centerline_concentration(1.0, u, edge, classes, land))
    for j in range(len(volume_rates)):
        if volume_rates[j] * shape_edge > y_sat[j] > 0:
            def over(log_x, j=j):
                return math.log(float(centerline_concentration(1.0, u, math.exp(log_x), classes, land))
                                * volume_rates[j] / y_sat[j])
            from scipy.optimize import brentq

            xj = math.exp(brentq(over, math.log(edge), math.log(MAX_OUTDOOR_DISTANCE),
                                 xtol=1e-10, maxiter=200))
            capped_until = xj if capped_until is None else max(capped_until, xj)
    return capped_until


def _cap_note(capped_until, y_sat) -> str:
    """The note on the capped zone near the pool."""
    return (f"the plume formula gives more vapour than the pool can saturate the air with "
            f"out to about {capped_until:,.0f} m: there the centreline is capped at the "
            f"saturated vapour concentration over the pool ({1e6 * y_sat.sum():,.0f} ppm of "
            "vapour in all, each component at its Raoult partial pressure); the real plume "
            "near the pool is not resolved by this point-source model")


def _lfl_distances(run: OutdoorSpill, alarm, notes: list):
    """Distances to the LFL and to the LFL alarm, None (with a note) when no
    component has an LFL on record."""
    if np.any(np.isfinite(run.lower_flammability_limits)):
        d_lfl, _ = run.distance_above(1.0)
        d_alarm, _ = run.distance_above(alarm / 100.0)
        return d_lfl, d_alarm
    notes.append("no component has a lower flammability limit on record: the distances "
                 "to the LFL are not judged")
    return None, None


def outdoor_spill(liquid, temperature, distances, *, wind_speed, stability,
                  terrain="open", spilled_volume=None, area=None, dike_area=None,
                  depth=UNDIKED_SPILL_DEPTH, model="mackay-matsugu",
                  pressure=STANDARD_ATMOSPHERE, basis="mass",
                  activity_coefficients=None, lfl_alarm_percent=10.0) -> OutdoorSpill:
    """Initial evaporation rate of a pool outdoors and its ground-level plume.

    The pool's initial rate (the highest, before the volatile components
    deplete) is taken as a continuous ground-level source, a conservative
    screening choice. Dispersion by `estimator.outdoor.ground_level_centerline`.
    The centreline of each component is capped at its saturated vapour fraction
    over the pool (its Raoult partial pressure over the pressure): the plume
    formula, a point source, gives more than the pool can near it, and the cap
    is stated with the distance out to which it applies. The distances to the
    LFL and to the LFL alarm use Le Chatelier's rule over the components in the
    plume; density effects are judged by Britter & McQuaid's criterion for the
    saturated vapour-air mixture over the pool
    (`estimator.outdoor.pool_source_criterion`).

    Parameters
    ----------
    liquid : as for `estimator.mixtures.liquid`
    temperature : float
        Pool and air temperature. [K]
    distances : array_like
        Downwind receptor distances. [m]
    wind_speed : float
        At 10 m height. [m/s]
    stability : str
        Pasquill class "A".."F" (or an intermediate such as "C-D").
    terrain : str
        "open" or "urban".
    spilled_volume, area, dike_area, depth
        Pool geometry, as for `indoor_spill` (area, or volume spread to depth).
    lfl_alarm_percent : float
        The site's LFL alarm level, above 0 and at most 100. [% LFL]

    Returns
    -------
    OutdoorSpill
    """
    from .evaporation import mixture_evaporation_rates
    from .outdoor import pasquill_classes, screening_validity, terrain_key

    liq = make_liquid(liquid, basis, activity_coefficients)
    alarm = _lfl_alarm_percent(lfl_alarm_percent)
    area = _outdoor_pool_area(area, spilled_volume, dike_area, depth)
    t = float(temperature)
    rates = mixture_evaporation_rates(liq.components, liq.mole_fractions, temperature, area,
                                      wind_speed, liq.activity_coefficients, model, pressure)
    g = np.asarray(getattr(rates, "rates", rates), dtype=float)
    x = np.atleast_1d(np.asarray(distances, dtype=float))
    classes, land = pasquill_classes(stability), terrain_key(terrain)
    for gi in g:  # checks the inputs and warns outside the fitted range, as before
        ground_level_centerline(gi, wind_speed, x, stability, terrain)
    u = float(wind_speed)
    molar_volume = GAS_CONSTANT * t / float(pressure)
    volume_rates = g / liq.molar_masses * molar_volume
    y_sat = _saturation_fractions(liq, t, pressure)
    edge = max(1.0, math.sqrt(area / math.pi))
    lfl = np.array([c.lower_flammability_limit or np.nan for c in liq.components], dtype=float)
    notes = []
    dense = _pool_dense_gas(g, y_sat, liq.molar_masses, t, pressure, u)
    capped_until = _capped_until(volume_rates, y_sat, u, edge, classes, land)
    run = OutdoorSpill(liq.names, g, x, np.zeros((x.size, g.size)), np.zeros((x.size, g.size)),
                       str(stability), terrain, u, (), float(area), edge, volume_rates, y_sat,
                       capped_until, lfl, None, alarm, None, None, (), (), dense)
    y = run.centreline(x)
    conc = y * liq.molar_masses[None, :] / molar_volume
    percent = 100.0 * run.fraction_of_lfl(x)
    if capped_until is not None:
        notes.append(_cap_note(capped_until, y_sat))
    d_lfl, d_alarm = _lfl_distances(run, alarm, notes)
    notes += list(screening_validity(u, x, dense))
    if dense is not None and not dense.dense:
        notes.append(dense.statement)
    notes += list(getattr(rates, "warnings", ()))
    return replace(run, concentration=conc, volume_fraction=y, percent_lfl=percent,
                   distance_to_lfl=d_lfl, distance_to_lfl_alarm=d_alarm,
                   lfl_flags=tuple(_distance_flags(d_lfl, capped_until, u, dense)),
                   lfl_alarm_flags=tuple(_distance_flags(d_alarm, capped_until, u, dense)),
                   warnings=tuple(dict.fromkeys(notes)))
