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
from dataclasses import dataclass

import numpy as np

from .constants import EIGHT_HOUR_SHIFT, GAS_CONSTANT, STANDARD_ATMOSPHERE, UNDIKED_SPILL_DEPTH
from .errors import InputError
from .evaporation import (
    DEPLETED_FRACTION,
    EvaporationSolverError,
    _bubble_check,
    _Budget,
    _mixture_inputs,
    spill_pool_area,
)
from .mixtures import liquid as make_liquid

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


def _positive(value, field, unit, allow_zero=False) -> float:
    try:
        v = float(value)
    except (TypeError, ValueError):
        raise InputError(field, f"expected a number in {unit}, got {value!r}") from None
    if not math.isfinite(v) or v < 0 or (v == 0 and not allow_zero):
        raise InputError(field, f"{value!r} must be a {'non-negative' if allow_zero else 'positive'}"
                         f" number in {unit}")
    return v


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
    from scipy.integrate import odeint

    liq = make_liquid(liquid, basis, activity_coefficients)
    t_k = _positive(temperature, "temperature", "K")
    v_room = _positive(room_volume, "room volume", "m3")
    q = _positive(ventilation_rate, "ventilation rate", "m3/s", allow_zero=True)
    k_mix = float(mixing_factor)
    if not math.isfinite(k_mix) or k_mix < 1.0:
        raise InputError("mixing factor", f"{mixing_factor!r} must be 1 or more: ullage "
                         "divides the ventilation rate by K >= 1 (effective ventilation Q/K)")
    if (spilled_volume is None) == (spilled_mass is None):
        raise InputError("spilled volume", "give either the spilled volume or the spilled "
                         "mass (one of the two)")
    if spilled_mass is None:
        vol = _positive(spilled_volume, "spilled volume", "m3")
        if vol >= v_room:
            raise InputError("spilled volume", f"{vol:g} m3 is not smaller than the room "
                             f"({v_room:g} m3); check the units")
        mass = vol * liquid_mixture_density(liq)
    else:
        mass = _positive(spilled_mass, "spilled mass", "kg")
        vol = None
    if area is None:
        if vol is None:
            vol = mass / liquid_mixture_density(liq)
        area = spill_pool_area(vol, dike_area, depth)
    pool_area = _positive(area, "pool area", "m2")
    two_zone = near_field_volume is not None or interzonal_flow is not None
    if two_zone:
        if near_field_volume is None or interzonal_flow is None:
            raise InputError("near field", "the two-zone model needs both the near-field "
                             "volume and the interzonal airflow")
        v_nf = _positive(near_field_volume, "near-field volume", "m3")
        beta = _positive(interzonal_flow, "interzonal airflow", "m3/s")
        if v_nf >= v_room:
            raise InputError("near-field volume", "must be smaller than the room volume")
    if times is None:
        end = _positive(duration, "duration", "s")
        t_out = np.linspace(0.0, end, int(round(end / 10.0)) + 1)
    else:
        t_out = np.asarray(times, dtype=float)
        if t_out.ndim != 1 or t_out.size < 2 or not np.all(np.isfinite(t_out)):
            raise InputError("times", "give at least two finite output times")
        if t_out[0] < 0 or np.any(np.diff(t_out) <= 0):
            raise InputError("times", "times must start at or after 0 and increase")
        end = float(t_out[-1])
    t_remove = None
    if source_removed_at is not None:
        t_remove = _positive(source_removed_at, "source removed at", "s", allow_zero=True)

    subs = liq.components
    names = tuple(c.name for c in subs)
    _, _, _, _, p, _, p_sat, per_pascal, notes = _mixture_inputs(
        subs, t_k, pool_area, air_speed, model, pressure, None)
    notes = list(liq.warnings) + notes
    n_comp = len(subs)
    molar = liq.molar_masses
    x0 = liq.mole_fractions
    gamma = liq.activity_coefficients
    _bubble_check(x0, gamma, p_sat, p, notes)
    n0 = mass * liq.mass_fractions / molar
    to_pressure = GAS_CONSTANT * t_k / molar
    surface = gamma * p_sat
    q_eff = q / k_mix
    if 0.0 < q_eff * end / v_room < 1e-9:
        q_eff = 0.0
        notes.append("the ventilation rate changes less than a billionth of the room air "
                     "over the run: treated as a closed room")
    budget = _Budget(400_000, float(time_limit))
    v_ff = v_room - v_nf if two_zone else v_room

    floor = DEPLETED_FRACTION * n0.sum()

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

    def rhs(t, y, active):
        budget.tick()
        n = y[:n_comp]
        if two_zone:
            c_nf, c_ff = y[n_comp:2 * n_comp], y[2 * n_comp:3 * n_comp]
            g = source(n, c_nf, active)
            exchange = beta * (c_nf - c_ff)
            return np.concatenate((-g / molar, (g - exchange) / v_nf,
                                   (exchange - q_eff * c_ff) / v_ff, q_eff * c_ff))
        c = y[n_comp:2 * n_comp]
        g = source(n, c, active)
        return np.concatenate((-g / molar, (g - q_eff * c) / v_room, q_eff * c))

    zones = 2 if two_zone else 1
    y0 = np.concatenate((n0, np.zeros(zones * n_comp), np.zeros(n_comp)))
    segments = [(0.0, end, True)]
    if t_remove is not None and t_remove < end:
        segments = [(0.0, t_remove, True), (t_remove, end, False)]
    n_state = y0.size
    y_out = np.empty((t_out.size, n_state))
    scale = np.concatenate((n0, np.full(zones * n_comp, mass / v_room),
                            np.full(n_comp, mass)))
    atol = np.maximum(scale, 1e-30) * 1e-12
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
    n_t = np.clip(y_out[:, :n_comp], 0.0, None)
    air = y_out[:, n_comp:(1 + zones) * n_comp]
    ventilated = y_out[:, (1 + zones) * n_comp:]
    mass_pool = n_t * molar
    if two_zone:
        c_nf, c_ff = air[:, :n_comp], air[:, n_comp:]
        in_air = c_nf * v_nf + c_ff * v_ff
        drive_c = c_nf
    else:
        c_nf, c_ff = None, air
        in_air = c_ff * v_room
        drive_c = c_ff
    total0 = float(mass)
    balance = float(np.max(np.abs(mass_pool.sum(1) + in_air.sum(1) + ventilated.sum(1)
                                  - total0)) / total0)
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
        model=("two-zone (near field / far field)" if two_zone else "well-mixed room")
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
        Ground-level centreline, shape (distances, components). [kg/m3]
    volume_fraction : numpy.ndarray
        Same, as volume fractions at the air temperature and pressure. [-]
    stability : str
    terrain : str
    wind_speed : float
        At 10 m. [m/s]
    warnings : tuple of str
        Validity statements of the screening method.
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


def outdoor_spill(liquid, temperature, distances, *, wind_speed, stability,
                  terrain="open", spilled_volume=None, area=None, dike_area=None,
                  depth=UNDIKED_SPILL_DEPTH, model="mackay-matsugu",
                  pressure=STANDARD_ATMOSPHERE, basis="mass",
                  activity_coefficients=None) -> OutdoorSpill:
    """Initial evaporation rate of a pool outdoors and its ground-level plume.

    The pool's initial rate (the highest, before the volatile components
    deplete) is taken as a continuous ground-level source, a conservative
    screening choice. Dispersion by `estimator.outdoor.ground_level_centerline`.

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

    Returns
    -------
    OutdoorSpill
    """
    from .evaporation import mixture_evaporation_rates
    from .outdoor import ground_level_centerline, screening_validity

    liq = make_liquid(liquid, basis, activity_coefficients)
    if area is None:
        if spilled_volume is None:
            raise InputError("pool area", "give the pool area or the spilled volume")
        area = spill_pool_area(_positive(spilled_volume, "spilled volume", "m3"),
                               dike_area, depth)
    rates = mixture_evaporation_rates(liq.components, liq.mole_fractions, temperature, area,
                                      wind_speed, liq.activity_coefficients, model, pressure)
    g = np.asarray(getattr(rates, "rates", rates), dtype=float)
    x = np.atleast_1d(np.asarray(distances, dtype=float))
    conc = np.stack([np.atleast_1d(ground_level_centerline(gi, wind_speed, x, stability,
                                                           terrain)) for gi in g], axis=1)
    y = conc * GAS_CONSTANT * float(temperature) / (liq.molar_masses * pressure)
    vapour_molar_mass = float(np.sum(g) / np.sum(g / liq.molar_masses)) if g.sum() > 0 else 0.0
    notes = list(screening_validity(wind_speed, x, vapour_molar_mass / 0.0289644))
    notes += list(getattr(rates, "warnings", ()))
    return OutdoorSpill(liq.names, g, x, conc, y, str(stability), terrain, float(wind_speed),
                        tuple(dict.fromkeys(notes)))
