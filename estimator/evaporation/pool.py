"""Pool geometry and life: area of a spill (undiked depth or dike), diameter, and the
depletion of a pure pool over time (`pool_depletion`).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..checks import float_or_array, positive_array, single
from ..constants import EIGHT_HOUR_SHIFT, STANDARD_ATMOSPHERE, UNDIKED_SPILL_DEPTH
from ..errors import InputError
from .mass_transfer import (
    MACKAY_MATSUGU_DIAMETER_EXPONENT,
    check_model,
    evaporation_estimate,
)

__all__ = [
    "DEPLETED_FRACTION",
    "pool_area",
    "pool_diameter",
    "spill_pool_area",
    "PoolDepletion",
    "pool_depletion",
]

#: A liquid (or one component of a mixture) counts as effectively gone when
#: less than this fraction of its initial amount remains. [-] An ullage
#: convention: far below anything a screening estimate can resolve.
DEPLETED_FRACTION = 1e-6


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
    return float_or_array(v / h)


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
    return float_or_array(np.sqrt(4.0 * a / math.pi))


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
        return float_or_array(spread)
    dike = positive_array(dike_area, "dike_area", "m2")
    return float_or_array(np.minimum(spread, dike))


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


def check_times(times, field="times") -> np.ndarray:
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
    check_model(model)
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
        t = check_times(times)
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
