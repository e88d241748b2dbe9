"""The Monte Carlo chain through an indoor spill: pool evaporation into a well-mixed
room, solved in closed form per sample (`indoor_spill_monte_carlo`).
"""

from __future__ import annotations

import warnings
from collections.abc import Mapping
from dataclasses import dataclass

import numpy as np

from ..checks import number
from ..constants import (
    EIGHT_HOUR_SHIFT,
    GAS_CONSTANT,
    SHORT_TERM_PERIOD,
    STANDARD_ATMOSPHERE,
)
from ..errors import InputError, UllageWarning
from ..evaporation import HIGH_VOLATILITY_RATIO, LOW_AIR_SPEED, low_air_speed_note
from ..indoor import phi1, phi2
from .results import MonteCarloResult
from .sampling import add_limit_ratios, check_bounds, check_pressures, start_chain

__all__ = [
    "indoor_spill_monte_carlo",
]


# --------------------------------------------------------------------------
# indoor spill chain


@dataclass(frozen=True)
class _RoomHistory:
    """Piecewise analytic concentration of a well-mixed room, one value per sample.

    A constant source a = G/V [kg/(m3 s)] from t = 0 until the pool is dry at
    `dry_time`, then none; effective air-change rate lam = Q/(K V) [1/s]; the
    concentration is capped at `saturation` [kg/m3] (reached at
    `saturation_time`, inf if never on the rising branch).
    """

    source: np.ndarray
    decay_rate: np.ndarray
    saturation: np.ndarray
    dry_time: np.ndarray
    saturation_time: np.ndarray
    dry_concentration: np.ndarray

    @classmethod
    def build(cls, source, decay_rate, saturation, dry_time):
        with np.errstate(divide="ignore", invalid="ignore"):
            # the cap as a fraction of the uncapped steady state G K / Q
            reach = saturation * decay_rate / source
            safe_rate = np.where(decay_rate > 0.0, decay_rate, 1.0)
            ventilated = np.where(reach < 1.0,
                                  -np.log1p(-np.where(reach < 1.0, reach, 0.0)) / safe_rate,
                                  np.inf)
        saturation_time = np.where(decay_rate > 0.0, ventilated, saturation / source)
        rising = source * dry_time * phi1(decay_rate * dry_time)
        return cls(source, decay_rate, saturation, dry_time, saturation_time,
                   np.minimum(rising, saturation))

    def concentration(self, t):
        """C(t). [kg/m3]"""
        rise = np.minimum(self.source * t * phi1(self.decay_rate * t), self.saturation)
        after = np.maximum(t - self.dry_time, 0.0)
        fall = self.dry_concentration * np.exp(-self.decay_rate * after)
        return np.where(t <= self.dry_time, rise, fall)

    def integral(self, t):
        """Integral of C from 0 to t. [kg s/m3]"""
        uncapped = np.minimum(t, np.minimum(self.saturation_time, self.dry_time))
        rise = self.source * uncapped**2 * phi2(self.decay_rate * uncapped)
        plateau = self.saturation * np.clip(np.minimum(t, self.dry_time)
                                            - self.saturation_time, 0.0, None)
        after = np.maximum(t - self.dry_time, 0.0)
        fall = self.dry_concentration * after * phi1(self.decay_rate * after)
        return rise + plateau + fall

    def highest_window_average(self, end, window):
        """Highest average over a window of length `window` inside [0, end]. [kg/m3]

        C rises (to the cap) until the pool is dry and decays after, so the best
        window either ends at `end` (pool not dry by then) or holds the dry time
        with C equal at its two ends; that condition is solved in closed form.
        """
        if end <= window:
            return self.integral(np.full_like(self.source, end)) / window
        t_dry, lam, t_sat = self.dry_time, self.decay_rate, self.saturation_time
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            # rising branch C_ss (1 - e^{-lam s}) equal to the decay C_d e^{-lam (s + w - t_dry)}
            ratio = self.dry_concentration * lam / self.source  # C_d / C_ss
            safe_lam = np.where(lam > 0.0, lam, 1.0)
            crossing = np.logaddexp(0.0, np.log(np.where(lam > 0.0, ratio, 1.0))
                                    + lam * (t_dry - window)) / safe_lam
        crossing = np.where(lam > 0.0, crossing, t_dry)
        start_dry = np.where(crossing < t_sat, crossing, np.maximum(t_dry - window, t_sat))
        start_dry = np.clip(start_dry, np.maximum(t_dry - window, 0.0),
                            np.minimum(t_dry, end - window))
        start = np.where(t_dry < end, start_dry, end - window)
        return (self.integral(start + window) - self.integral(start)) / window


def indoor_spill_monte_carlo(substance_or_key, temperature, pool_area, air_speed, room_volume,
                             ventilation_rate, mixing_factor, spilled_mass, limits=(),
                             duration=EIGHT_HOUR_SHIFT, n=10_000, seed=None,
                             include_method_uncertainty=True, *,
                             pressure=STANDARD_ATMOSPHERE,
                             source_removed_at=None, lfl_alarm=10.0) -> MonteCarloResult:
    r"""A spill of pure liquid in a well-mixed room with uncertain inputs, by Monte Carlo.

    Pure liquids only (a mixture's pool changes composition as it weathers; use
    `estimator.spill.indoor_spill` for one deterministic case). For every
    sample at once:

    1. the saturated vapour pressure at the sampled temperature (all
       temperatures through `estimator.vapor.vapor_pressure_estimate` as one
       array), times the method-uncertainty factor;
    2. the evaporation rate G by Mackay & Matsugu (1973) with the Schmidt number
       from Fuller's diffusion coefficient and Sutherland's air viscosity, the
       air and the pool both at the sampled temperature, exactly as
       `estimator.evaporation.evaporation_rate`;
    3. the well-mixed room, :math:`V\,dC/dt = G - (Q/K)\,C` from clean air, for
       a constant source until the pool is dry at :math:`t_d = m/G`, then an
       exponential decay; the concentration is capped at the saturated vapour
       concentration :math:`\min(p_\mathrm{sat}, P) M / (R T)`. All in closed
       form (`estimator.indoor.well_mixed_room` gives the same curve);
    4. the peak concentration over the period, the 8-h TWA (the exact integral
       over the period divided by 8 h, as US 29 CFR 1910.1000(d)(1)(i) divides
       by 8 h), and the highest 15-min average (exact for this piecewise curve:
       the window that ends at the period's end when the pool is still
       evaporating, otherwise the window around the dry time where the
       concentration is equal at both ends).

    Assumptions to keep in mind: the pool is at the air temperature (no
    evaporative cooling, which over-predicts for volatile liquids); the pool
    area is fixed; the evaporation rate ignores the vapour already in the room,
    so near saturation it is too high, the cap holds the air there and the pool
    is taken to be dry at m/G all the same (in reality it lasts longer); the
    room is well mixed (next to the pool it is higher; see the near-field model).

    Parameters
    ----------
    substance_or_key : Substance or str
        A pure liquid.
    temperature : float or distribution
        Pool and room air temperature, below the normal boiling point. [K]
    pool_area : float or distribution
        [m2]
    air_speed : float or distribution
        Air speed over the pool; indoors typically 0.05-0.3 m/s (Baldwin &
        Maynard 1998). [m/s]
    room_volume : float or distribution
        [m3]
    ventilation_rate : float or distribution
        General ventilation Q, 0 or more. [m3/s]
    mixing_factor : float or distribution
        K >= 1, dividing Q (the convention of `estimator.indoor`). [-]
    spilled_mass : float or distribution
        [kg]
    limits : sequence of ExposureLimit
        TWA limits are compared with the 8-h TWA, STEL with the highest 15-min
        average, ceiling and emergency values with the peak.
    duration : float
        Period from the spill over which the worker is in the room, 8 h by
        default. [s]
    n : int
        Number of samples.
    seed : int, optional
        Seed of `numpy.random.default_rng`; a fresh one (recorded) if omitted.
    include_method_uncertainty : bool
        Multiply the vapour pressure by its method-uncertainty factor.
    pressure : float
        Ambient pressure, 101325 Pa by default. [Pa]
    source_removed_at : float, optional
        Time the pool is cleaned up, after which it no longer evaporates (the
        source ends at the earlier of this and the dry time). [s]
    lfl_alarm : float
        LFL alarm level the peak is compared with, 10 % by default (US OSHA 29
        CFR 1910.146(b)). [% of LFL]

    Returns
    -------
    MonteCarloResult
        Outputs ``evaporation_rate`` [kg/s], ``pool_lifetime`` [s],
        ``peak_ppm``, ``twa_ppm``, ``short_term_ppm`` (highest 15-min average)
        [ppm], ``peak_percent_lfl`` [% of LFL] when the liquid has an LFL on
        record, and ``ratio to <limit label>`` [-]; exceedance of each limit
        (ratio above 1) and the probability that the peak reaches the LFL
        alarm (``"<alarm> % LFL alarm"``).

    References
    ----------
    Mackay & Matsugu (1973), Can. J. Chem. Eng. 51, 434; Keil, Simmons &
    Anthony (2009), Mathematical Models for Estimating Occupational Exposure to
    Chemicals, 2nd ed., AIHA Press (well-mixed room).

    Examples
    --------
    One kilogram of toluene on 1 m2 in a 200 m3 room, 20-30 degC, uncertain air
    speed and ventilation, K = 3:

    >>> from estimator.uncertainty import LogNormal, Uniform
    >>> r = indoor_spill_monte_carlo("toluene", Uniform(293.15, 303.15), 1.0,
    ...                              LogNormal(0.1, 1.5), 200.0, Uniform(0.2, 0.6), 3.0,
    ...                              1.0, n=2000, seed=3)
    >>> round(r.percentiles["twa_ppm"][50]), next(iter(r.sensitivity["twa_ppm"]))
    (69, 'ventilation_rate')
    """
    sub = _pure_substance(substance_or_key)
    period = number(duration, "duration")
    if period <= 0.0:
        raise InputError("duration", f"{period:g} s must be above 0")
    samples, alarm, limit_list = start_chain(n, seed, lfl_alarm, limits,
                                             include_method_uncertainty, sub.notes)
    p_air = float(check_pressures(np.asarray(number(pressure, "pressure")), "pressure"))
    spill = _SpillDraws.draw(samples, sub, temperature, pool_area, air_speed, room_volume,
                             ventilation_rate, mixing_factor, spilled_mass)
    t = spill.temperature
    p_sat = samples.saturation_pressures([sub], t, include_method_uncertainty,
                                         ["vapor_pressure_factor"])[0]
    if not include_method_uncertainty:
        samples.notes.append("the uncertainty of the vapour-pressure method is not included")
    rate = _evaporation_rate(sub, spill, p_sat, p_air, samples.notes)
    with np.errstate(divide="ignore"):  # a rate that underflows to 0 never runs dry
        lifetime = spill.mass / rate

    # well-mixed room, constant source until dry, capped at saturation
    saturation = np.minimum(p_sat, p_air) * sub.molar_mass / (GAS_CONSTANT * t)
    source_end = lifetime if source_removed_at is None else np.minimum(
        lifetime, float(source_removed_at))
    room = _RoomHistory.build(rate / spill.volume, spill.flow / (spill.mixing * spill.volume),
                              saturation, source_end)
    to_ppm = GAS_CONSTANT * t / (p_air * sub.molar_mass) * 1e6
    outputs = {
        "evaporation_rate": rate,
        "pool_lifetime": lifetime,
        "peak_ppm": room.concentration(np.minimum(source_end, period)) * to_ppm,
        "twa_ppm": room.integral(np.full(samples.count, period)) / EIGHT_HOUR_SHIFT * to_ppm,
        "short_term_ppm": room.highest_window_average(period, SHORT_TERM_PERIOD) * to_ppm,
    }
    units = {"evaporation_rate": "kg/s", "pool_lifetime": "s", "peak_ppm": "ppm",
             "twa_ppm": "ppm", "short_term_ppm": "ppm"}
    exceedance = _compare(sub, outputs, units, limit_list, alarm, t, p_air, samples.notes)
    _add_spill_notes(samples.notes, room.saturation_time < np.minimum(source_end, period),
                     spill.speed, p_sat / p_air, period)
    return samples.result("indoor spill", outputs, units, exceedance)


def _pure_substance(substance_or_key):
    """The one substance of a pure liquid; a mixture is refused."""
    from ..mixtures import Liquid
    from ..substances import as_substance

    if isinstance(substance_or_key, Liquid):
        if not substance_or_key.is_pure:
            raise InputError("substance_or_key", "this chain is for pure liquids; a "
                             "mixture's pool changes composition as it evaporates (use "
                             "estimator.spill.indoor_spill for it)")
        substance_or_key = substance_or_key.components[0]
    if isinstance(substance_or_key, Mapping):
        raise InputError("substance_or_key", "this chain is for pure liquids; give one "
                         "substance (use estimator.spill.indoor_spill for a mixture)")
    return as_substance(substance_or_key, "substance_or_key")


@dataclass(frozen=True)
class _SpillDraws:
    """The sampled inputs of an indoor spill, one value per sample (SI units)."""

    temperature: np.ndarray
    area: np.ndarray
    speed: np.ndarray
    volume: np.ndarray
    flow: np.ndarray
    mixing: np.ndarray
    mass: np.ndarray

    @classmethod
    def draw(cls, samples, sub, temperature, pool_area, air_speed, room_volume,
             ventilation_rate, mixing_factor, spilled_mass):
        """Draw the inputs in their fixed order, each checked against its bounds."""
        t = samples.temperature(temperature)
        check_bounds(t, "temperature", "K", below=sub.boiling_point,
                     why=f", the normal boiling point of {sub.name}: the pool would boil, "
                         "which these evaporation models do not cover")
        area = samples.draw(pool_area, "pool_area", "m2", above=0.0)
        speed = samples.draw(air_speed, "air_speed", "m/s", above=0.0,
                             why=" (the evaporation model needs moving air; indoors "
                                 "0.05-0.3 m/s is typical)")
        volume = samples.draw(room_volume, "room_volume", "m3", above=0.0)
        flow = samples.draw(ventilation_rate, "ventilation_rate", "m3/s", minimum=0.0,
                            why=" (use 0 for a closed room)")
        mixing = samples.draw(mixing_factor, "mixing_factor", "", minimum=1.0,
                              why=" (K >= 1 divides the ventilation rate; for a mixing "
                                  "efficiency m <= 1 use K = 1/m)")
        mass = samples.draw(spilled_mass, "spilled_mass", "kg", above=0.0)
        return cls(t, area, speed, volume, flow, mixing, mass)


def _evaporation_rate(sub, spill, p_sat, p_air, notes):
    """Mackay-Matsugu evaporation rate per sample, as
    `estimator.evaporation.evaporation_rate`. [kg/s]"""
    from ..evaporation import (
        air_diffusivity,
        air_kinematic_viscosity,
        evaporation_flux,
        mackay_matsugu_coefficient,
        pool_diameter,
        schmidt_number,
    )

    t = spill.temperature
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always", UllageWarning)
        diffusivity = np.asarray(air_diffusivity(sub, t, p_air))
    notes.extend(str(w.message) for w in caught)
    sc = np.asarray(schmidt_number(air_kinematic_viscosity(t, p_air), diffusivity))
    k = np.asarray(mackay_matsugu_coefficient(spill.speed, pool_diameter(spill.area), sc))
    return np.asarray(evaporation_flux(k, p_sat, sub.molar_mass, t)) * spill.area


def _compare(sub, outputs, units, limit_list, alarm, t, p_air, notes):
    """Add %LFL and the limit ratios to the outputs; the exceedance probabilities."""
    metric = {"TWA": "twa_ppm", "STEL": "short_term_ppm", "ceiling": "peak_ppm",
              "emergency": "peak_ppm"}
    exceedance = {}
    if sub.lower_flammability_limit:
        outputs["peak_percent_lfl"] = 100.0 * outputs["peak_ppm"] * 1e-6 / \
            sub.lower_flammability_limit
        units["peak_percent_lfl"] = "% LFL"
    else:
        notes.append(f"{sub.name} has no LFL on record: the peak is not compared with the "
                     "LFL alarm (it may still burn; enter the LFL from the safety data sheet)")

    def ratio(lim):
        if lim.substance != sub.key:
            return None
        return outputs[metric[lim.kind]] / lim.ppm_at(t, p_air)

    add_limit_ratios(limit_list, ratio, f", not {sub.key}", outputs, units, exceedance, notes)
    if "peak_percent_lfl" in outputs:
        exceedance[f"{alarm:g} % LFL alarm"] = float(np.mean(
            outputs["peak_percent_lfl"] >= alarm))
    return exceedance


def _add_spill_notes(notes, capped, speed, pressure_ratio, period):
    """The cautions on the samples: capped at saturation, still air, near boiling, a
    period past 8 h, and the model's assumptions."""
    if np.any(capped):
        notes.append(f"in {100 * np.mean(capped):.3g} % of samples the room air reaches the "
                     "saturated vapour concentration and is capped there; evaporation would "
                     "slow and the pool last longer than m/G")
    if np.any(speed < LOW_AIR_SPEED):
        notes.append(low_air_speed_note(float(np.mean(speed < LOW_AIR_SPEED))))
    volatile = pressure_ratio > HIGH_VOLATILITY_RATIO
    if np.any(volatile):
        notes.append(f"in {100 * np.mean(volatile):.3g} % of samples the vapour pressure is "
                     f"above {100 * HIGH_VOLATILITY_RATIO:g} % of the ambient pressure; the "
                     "dilute-vapour evaporation model under-predicts this close to boiling")
    if period > EIGHT_HOUR_SHIFT:
        notes.append(f"the period of {period / 3600:.3g} h is longer than 8 h; its exposure "
                     "is divided by 8 h for the TWA")
    notes.append("pool at the air temperature (no evaporative cooling), fixed pool area, "
                 "well-mixed room: next to the pool the air is more concentrated")
