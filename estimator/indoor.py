"""Air concentration in a room: the well-mixed room, the near-field/far-field model, purge time.

Units throughout: concentrations in kg/m3, generation (emission) rates in kg/s,
volumes in m3, air flows in m3/s, times in s measured from the start of the
release (t = 0).

Mixing factor convention
------------------------
The mixing factor K >= 1 *divides* the ventilation rate: the room behaves as if
only Q/K of the supply air diluted the vapour (the dilution-ventilation design
convention of the ACGIH Industrial Ventilation manual, where K is typically 1-10).
Some texts instead *multiply* Q by a mixing efficiency m <= 1; the two are the
same model with m = 1/K. K = 1 is a perfectly mixed room.

Source descriptions
-------------------
Every time-dependent model here accepts the generation rate G as

- a number: a constant source from t = 0, solved analytically;
- an array the same length as `times`: G is piecewise-linear through the points
  (times[i], G[i]) and held at G[0] before times[0]; repeat a time to make a step.
  Solved by an exact step-wise exponential integrator (the linear ODE is
  integrated in closed form over each interval, so the only error is rounding);
- a callable G(t) [kg/s]: solved numerically with scipy's LSODA
  (`scipy.integrate.solve_ivp`, relative tolerance 1e-10) with a maximum step tied
  to the time grid, so a pulse as wide as the grid spacing is not stepped over.
"""

from __future__ import annotations

import math
import warnings
from dataclasses import dataclass

import numpy as np

from .checks import finite_array, positive
from .errors import InputError, UllageWarning

__all__ = [
    "air_changes_to_flow",
    "steady_state_concentration",
    "required_ventilation_rate",
    "well_mixed_room",
    "purge_time",
    "PurgeEstimate",
    "NearFieldGeometry",
    "near_field_hemisphere",
    "near_field_box",
    "interzonal_airflow",
    "near_field_far_field",
    "two_zone_steady_state",
    "TwoZoneResult",
    "RANDOM_AIR_SPEED_RANGE",
    "NEAR_FIELD_RADIUS",
    "BOX_FACES",
]

#: Typical random (turbulent) air speeds in indoor workplaces. [m/s] Most of the
#: workplaces surveyed by Baldwin & Maynard (1998), Ann. Occup. Hyg. 42(5),
#: 303-313, lay between about 0.05 and 0.3 m/s; the lower end is the conservative
#: choice for the near-field concentration.
RANDOM_AIR_SPEED_RANGE = (0.05, 0.3)

#: Radius of the hemispherical near field around a worker's breathing zone and the
#: source. [m] 1 m, common practice in the two-zone literature (e.g. Keil, Simmons
#: & Anthony 2009).
NEAR_FIELD_RADIUS = 1.0

#: Faces of a box-shaped near field, with the two edges that span each one.
BOX_FACES = {
    "top": ("length", "width"),
    "bottom": ("length", "width"),
    "front": ("length", "height"),
    "back": ("length", "height"),
    "left": ("width", "height"),
    "right": ("width", "height"),
}

#: Below this reduced step the second exponential-integrator weight uses its series.
SERIES_LIMIT = 1e-3


# --------------------------------------------------------------------------- checks

def _mixing_factor(value):
    k = finite_array(value, "mixing_factor", allow_empty=True)
    if k.ndim != 0:
        raise InputError("mixing_factor", "expected a single number, not an array")
    if float(k) < 1.0:
        raise InputError(
            "mixing_factor",
            f"got {float(k):g}; the mixing factor K must be >= 1 because here it "
            "divides the ventilation rate (effective ventilation Q/K). If your text "
            "multiplies Q by a mixing efficiency m <= 1, use K = 1/m")
    return float(k)


def _time_grid(times):
    t = np.atleast_1d(finite_array(times, "times", allow_empty=True))
    if t.ndim != 1:
        raise InputError("times", "expected a one-dimensional sequence of times")
    if t.size == 0:
        raise InputError("times", "no times given")
    if np.any(t < 0.0):
        raise InputError("times", "times are counted from the start of the release "
                         "(t = 0 s) and cannot be negative")
    if np.any(np.diff(t) < 0.0):
        raise InputError("times", "must be in non-decreasing order; sort them first")
    return t


def _source(generation_rate, times):
    """Classify the generation rate: ("constant", G), ("series", G_i) or ("function", G)."""
    if callable(generation_rate):
        try:
            sample = np.array([float(generation_rate(float(t))) for t in times])
        except (TypeError, ValueError) as error:
            raise InputError("generation_rate",
                             f"calling it on the times failed: {error}") from None
        if not np.all(np.isfinite(sample)):
            raise InputError("generation_rate", "the function returned NaN or infinity")
        if np.any(sample < 0.0):
            raise InputError("generation_rate", "the function returned a negative rate; "
                             "a source cannot remove vapour")
        return "function", generation_rate, sample
    g = finite_array(generation_rate, "generation_rate", allow_empty=True)
    if np.any(g < 0.0):
        raise InputError("generation_rate", "cannot be negative; a source cannot remove vapour")
    if g.ndim == 0:
        return "constant", float(g), np.full(times.shape, float(g))
    if g.ndim != 1 or g.size != times.size:
        raise InputError("generation_rate", f"an array of rates needs one value per time: "
                         f"got shape {g.shape} for {times.size} times")
    return "series", g, g


# --------------------------------------------------------------- exact integrator

def phi1(z):
    """(1 - exp(-z)) / z, equal to 1 at z = 0 (and for z <= 0), elementwise.

    The first weight of the exact exponential integrator (the "phi functions" of
    Hochbruck & Ostermann, Acta Numerica 19 (2010) 209).

    Examples
    --------
    >>> round(float(phi1(1.0)), 6)
    0.632121
    """
    z = np.asarray(z, dtype=float)
    safe = np.where(z > 0.0, z, 1.0)
    return np.where(z > 0.0, -np.expm1(-safe) / safe, 1.0)


def phi2(z):
    """(z - 1 + exp(-z)) / z**2, equal to 1/2 at z = 0, elementwise (a series below
    `SERIES_LIMIT`, where the closed form loses digits).

    Examples
    --------
    >>> round(float(phi2(1.0)), 6), float(phi2(0.0))
    (0.367879, 0.5)
    """
    z = np.asarray(z, dtype=float)
    large = np.where(z >= SERIES_LIMIT, z, 1.0)
    series = 0.5 - z / 6.0 + z**2 / 24.0 - z**3 / 120.0
    return np.where(z >= SERIES_LIMIT, (large + np.expm1(-large)) / large**2, series)


def _relaxation_steps(decay_rate, times, forcing, start_value, cap=None):
    """Exact solution of dy/dt = -decay_rate*y + f(t) at `times`, f piecewise-linear.

    `forcing` holds f at each time (linear in between); y(times[0]) = start_value.
    Over a step of length h with f = f_i + (f_{i+1} - f_i) tau / h,
    y_{i+1} = e^{-z} y_i + f_i h phi1(z) + (f_{i+1} - f_i) h phi2(z), z = decay_rate h.
    With `cap`, y is limited to the cap at every grid time.
    """
    h = np.diff(times)
    z = decay_rate * h
    decay = np.exp(-z).tolist()
    increment = (forcing[:-1] * h * phi1(z) + np.diff(forcing) * h * phi2(z)).tolist()
    y = float(start_value)
    values = [y]
    if cap is None:
        for a, b in zip(decay, increment):
            y = a * y + b
            values.append(y)
    else:
        for a, b in zip(decay, increment):
            y = min(a * y + b, cap)
            values.append(y)
    return np.array(values)


def _from_zero(times, *series):
    """Prepend t = 0 (holding each series at its first value) when the grid starts later."""
    if times[0] > 0.0:
        return (np.concatenate(([0.0], times)),
                *(np.concatenate((s[:1], s)) for s in series), 1)
    return (times, *series, 0)


def _max_step(times):
    """The solver's largest step: the finest grid spacing, but no finer than 1e-5 of the span."""
    spacing = np.diff(np.concatenate(([0.0], times)))
    positive = spacing[spacing > 0.0]
    if positive.size == 0:
        return np.inf
    return max(float(positive.min()), float(times[-1]) * 1e-5)


def _solve_numerically(rhs, times, start, scale):
    """Integrate y' = rhs(t, y) from t = 0 with y(0) = start, report at `times`."""
    from scipy.integrate import solve_ivp

    start = np.asarray(start, dtype=float)
    out = np.empty((start.size, times.size))
    if times[-1] == 0.0:
        out[:] = start[:, None]
        return out
    unique, inverse = np.unique(times, return_inverse=True)
    solution = solve_ivp(rhs, (0.0, float(unique[-1])), start, method="LSODA",
                         t_eval=unique, rtol=1e-10, atol=1e-13 * max(scale, 1e-300),
                         max_step=_max_step(unique))
    if not solution.success:  # pragma: no cover - LSODA failing on a linear ODE
        raise RuntimeError(f"the time integration failed: {solution.message}")
    return solution.y[:, inverse]


# ------------------------------------------------------------------- one zone

def air_changes_to_flow(air_changes_per_hour, volume):
    """Ventilation rate from air changes per hour.

    Parameters
    ----------
    air_changes_per_hour : float or array_like
        Air changes per hour, the supply (or exhaust) flow divided by the room
        volume. [1/h]
    volume : float
        Room volume. [m3]

    Returns
    -------
    float or numpy.ndarray
        Ventilation rate. [m3/s]

    Examples
    --------
    Six air changes per hour in a 300 m3 room:

    >>> air_changes_to_flow(6.0, 300.0)
    0.5
    """
    ach = finite_array(air_changes_per_hour, "air_changes_per_hour", allow_empty=True)
    if np.any(ach < 0.0):
        raise InputError("air_changes_per_hour", "cannot be negative; use 0 for a closed room")
    v = positive(volume, "volume", "m3")
    flow = ach * v / 3600.0
    return float(flow) if flow.ndim == 0 else flow


def steady_state_concentration(generation_rate, ventilation_rate, mixing_factor=1.0):
    """Steady concentration of a well-mixed room with a constant source, C = G K / Q.

    Parameters
    ----------
    generation_rate : float or array_like
        Vapour generation (emission) rate. [kg/s]
    ventilation_rate : float or array_like
        General ventilation rate, above 0 (a closed room has no steady state). [m3/s]
    mixing_factor : float
        K >= 1, dividing Q (see the module notes). [-]

    Returns
    -------
    float or numpy.ndarray
        Steady-state concentration. [kg/m3]

    References
    ----------
    ACGIH, Industrial Ventilation: A Manual of Recommended Practice for Design,
    chapter on general (dilution) ventilation; Keil, Simmons & Anthony (2009),
    Mathematical Models for Estimating Occupational Exposure to Chemicals, 2nd ed.,
    AIHA Press (well-mixed room model).

    Examples
    --------
    1 g/min into 10 m3/min with K = 3 holds 0.3 g/m3:

    >>> round(steady_state_concentration(1e-3 / 60, 10.0 / 60, 3.0), 6)
    0.0003
    """
    g = finite_array(generation_rate, "generation_rate", allow_empty=True)
    if np.any(g < 0.0):
        raise InputError("generation_rate", "cannot be negative")
    q = finite_array(ventilation_rate, "ventilation_rate", allow_empty=True)
    if np.any(q <= 0.0):
        raise InputError("ventilation_rate", "must be above 0 m3/s for a steady state; "
                         "without ventilation the concentration rises until the source "
                         "stops or the air saturates (use well_mixed_room)")
    k = _mixing_factor(mixing_factor)
    c = g * k / q
    return float(c) if c.ndim == 0 else c


def required_ventilation_rate(generation_rate, target_concentration, mixing_factor=1.0):
    """Dilution ventilation that holds a constant source at a target, Q = G K / C.

    Parameters
    ----------
    generation_rate : float or array_like
        Vapour generation rate. [kg/s]
    target_concentration : float or array_like
        Concentration to hold the room at, above 0. [kg/m3]
    mixing_factor : float
        K >= 1, dividing Q. [-]

    Returns
    -------
    float or numpy.ndarray
        Required general ventilation rate. [m3/s]

    References
    ----------
    ACGIH, Industrial Ventilation: A Manual of Recommended Practice for Design,
    dilution-ventilation equation (in US units Q = 403 SG ER 10^6 K / (MW C)).

    Examples
    --------
    >>> round(required_ventilation_rate(1e-3 / 60, 3e-4, 3.0) * 60, 6)
    10.0
    """
    g = finite_array(generation_rate, "generation_rate", allow_empty=True)
    if np.any(g < 0.0):
        raise InputError("generation_rate", "cannot be negative")
    c = finite_array(target_concentration, "target_concentration", allow_empty=True)
    if np.any(c <= 0.0):
        raise InputError("target_concentration", "must be above 0 kg/m3")
    q = g * _mixing_factor(mixing_factor) / c
    return float(q) if q.ndim == 0 else q


def well_mixed_room(generation_rate, volume, ventilation_rate, times, mixing_factor=1.0,
                    initial_concentration=0.0, *, saturation_concentration=None):
    r"""Concentration in a well-mixed room over time.

    .. math:: V \frac{dC}{dt} = G(t) - \frac{Q}{K} C

    with the mixing factor K >= 1 dividing the ventilation rate (effective
    ventilation Q/K; some texts instead multiply Q by a mixing efficiency m <= 1,
    which is the same model with m = 1/K). Clean supply air is assumed. For a
    constant G the solution is analytic,

    .. math:: C(t) = \frac{G K}{Q} + \left(C_0 - \frac{G K}{Q}\right)
              e^{-Q t / (K V)},

    and a closed room (Q = 0) gives C = C0 + G t / V. A time-varying G (an array
    over `times`, piecewise-linear, or a callable) is integrated numerically as
    described in the module notes.

    Parameters
    ----------
    generation_rate : float, array_like or callable
        Vapour generation rate G: a constant, one value per time (piecewise-linear
        in time, held at the first value before times[0]), or a function G(t) of
        time in s. [kg/s]
    volume : float
        Room volume V. [m3]
    ventilation_rate : float
        General ventilation (clean supply air) rate Q; 0 for a closed room. [m3/s]
    times : array_like
        Times to report, non-decreasing, counted from the start of the source. [s]
    mixing_factor : float
        K >= 1, dividing Q; 1 for perfect mixing. [-]
    initial_concentration : float
        Concentration C0 at t = 0. [kg/m3]
    saturation_concentration : float, optional
        Cap: the concentration never exceeds it (the saturated vapour
        concentration, p_sat M / (R T)). The excess vapour is taken to stay in the
        liquid; the proper coupling, in which evaporation slows as the air
        approaches saturation, belongs to the spill (evaporation) model. For
        piecewise-linear or callable sources the cap acts at each grid time or
        solver step. A warning is issued when the cap is reached. [kg/m3]

    Returns
    -------
    numpy.ndarray
        Concentration at each time. [kg/m3]

    Raises
    ------
    InputError
        For volume <= 0, ventilation < 0, K < 1, negative or non-finite rates, and
        times that are negative or not in order.

    References
    ----------
    Keil, Simmons & Anthony (2009), Mathematical Models for Estimating Occupational
    Exposure to Chemicals, 2nd ed., AIHA Press, chapter on the well-mixed room;
    ACGIH, Industrial Ventilation: A Manual of Recommended Practice for Design,
    chapter on dilution ventilation (mixing factor K).

    Examples
    --------
    1 g/min of vapour into a 100 m3 room ventilated at 10 m3/min: after one
    time constant (10 min) the room is at 1 - 1/e of its 0.1 g/m3 steady state.

    >>> c = well_mixed_room(1e-3 / 60, 100.0, 10.0 / 60, [0.0, 600.0, 6000.0])
    >>> [round(float(x) * 1e3, 4) for x in c]
    [0.0, 0.0632, 0.1]
    """
    v = positive(volume, "volume", "m3")
    q = positive(ventilation_rate, "ventilation_rate", "m3/s", allow_zero=True, 
                 hint="; use 0 for a closed room")
    k = _mixing_factor(mixing_factor)
    c0 = positive(initial_concentration, "initial_concentration", "kg/m3", allow_zero=True)
    cap = None
    if saturation_concentration is not None:
        cap = positive(saturation_concentration, "saturation_concentration", "kg/m3")
        if c0 > cap:
            raise InputError("initial_concentration", f"{c0:g} kg/m3 is above the saturation "
                             f"concentration {cap:g} kg/m3; no vapour can be held above it")
    t = _time_grid(times)
    kind, source, sample = _source(generation_rate, t)
    decay_rate = q / (k * v)  # [1/s] effective air changes

    if kind == "constant":
        z = decay_rate * t
        c = c0 * np.exp(-z) + source / v * t * phi1(z)
        if cap is not None:
            c = np.minimum(c, cap)
    elif kind == "series":
        grid, g, added = _from_zero(t, source)
        c = _relaxation_steps(decay_rate, grid, g / v, c0, cap)[added:]
    else:
        def rhs(time, y):
            net = (float(source(time)) - q / k * y[0]) / v
            if cap is not None and y[0] >= cap and net > 0.0:
                net = 0.0
            return [net]

        g_max = float(sample.max())
        scale = max(c0, g_max / (v * decay_rate) if decay_rate > 0 else g_max * t[-1] / v)
        c = _solve_numerically(rhs, t, [c0], scale)[0]
        if cap is not None:
            c = np.minimum(c, cap)

    if cap is not None and np.any(c >= cap * (1.0 - 1e-9)):
        warnings.warn(
            f"the room air reaches the saturation concentration {cap:g} kg/m3; the "
            "concentration is capped there and the excess is taken to stay liquid. "
            "Couple the source to the room (evaporation slows near saturation) for a "
            "better estimate", UllageWarning, stacklevel=2)
    return c


@dataclass(frozen=True)
class PurgeEstimate:
    """How long ventilation takes to bring a room down to a target concentration.

    Attributes
    ----------
    time : float
        Time from the start of purging to reach the target; 0 when the room is
        already at or below it; ``math.inf`` when it is never reached. [s]
    floor : float
        Concentration the room tends to during the purge: G K / Q with a residual
        source, 0 without one; with no ventilation, the initial concentration
        (no source) or infinity (a source). [kg/m3]
    reachable : bool
        Whether the target is reached in finite time.
    note : str
        The outcome in plain words.
    """

    time: float
    floor: float
    reachable: bool
    note: str


def purge_time(volume, ventilation_rate, initial_concentration, target_concentration,
               mixing_factor=1.0, residual_generation_rate=0.0) -> PurgeEstimate:
    r"""Time for dilution ventilation to purge a well-mixed room down to a target.

    Without a source, :math:`t = \frac{K V}{Q} \ln\frac{C_0}{C}`. With a residual
    source G the room decays towards the floor :math:`C_f = G K / Q`,

    .. math:: t = \frac{K V}{Q} \ln\frac{C_0 - C_f}{C - C_f},

    and a target at or below the floor is never reached (``time`` is ``math.inf``
    and ``reachable`` is False).

    Parameters
    ----------
    volume : float
        Room volume V. [m3]
    ventilation_rate : float
        General ventilation (clean air) rate Q; 0 means nothing is purged. [m3/s]
    initial_concentration : float
        Concentration when purging starts, C0. [kg/m3]
    target_concentration : float
        Concentration to reach, C. Any consistent unit works for both
        concentrations (ppm too) when there is no residual source. [kg/m3]
    mixing_factor : float
        K >= 1, dividing Q. [-]
    residual_generation_rate : float
        A source still emitting during the purge, G. [kg/s]

    Returns
    -------
    PurgeEstimate

    References
    ----------
    ACGIH, Industrial Ventilation: A Manual of Recommended Practice for Design,
    purge equation ln(C2/C1) = -(Q'/V)(t2 - t1), Q' = Q/K.

    Examples
    --------
    From 500 to 25 ppm in a 100 m3 room at 1 m3/s, K = 2:

    >>> round(purge_time(100.0, 1.0, 500.0, 25.0, 2.0).time, 1)
    599.1
    """
    v = positive(volume, "volume", "m3")
    q = positive(ventilation_rate, "ventilation_rate", "m3/s", allow_zero=True)
    k = _mixing_factor(mixing_factor)
    c0 = positive(initial_concentration, "initial_concentration", "kg/m3", allow_zero=True)
    target = positive(target_concentration, "target_concentration", "kg/m3", allow_zero=True)
    g = positive(residual_generation_rate, "residual_generation_rate", "kg/s", allow_zero=True)

    if q == 0.0:
        floor = math.inf if g > 0.0 else c0
    else:
        floor = g * k / q
    if c0 <= target:
        note = "the room is already at or below the target"
        if floor > target:
            note += "; the residual source will raise it above the target again"
        return PurgeEstimate(0.0, floor, True, note)
    if q == 0.0:
        return PurgeEstimate(math.inf, floor, False,
                             "with no ventilation the concentration does not fall")
    if target <= floor:
        return PurgeEstimate(
            math.inf, floor, False,
            f"the target can never be reached: the residual source holds the room at "
            f"{floor:g} kg/m3 or above (G K / Q). Stop the source or ventilate more")
    time = k * v / q * math.log((c0 - floor) / (target - floor))
    return PurgeEstimate(time, floor, True, "the target is reached")


# ------------------------------------------------------------------ two zones

@dataclass(frozen=True)
class NearFieldGeometry:
    """Shape of a near field: its volume and the free surface air crosses.

    Attributes
    ----------
    volume : float
        Near-field volume. [m3]
    free_surface_area : float
        Area of the near-field boundary open to the far field (faces against a
        wall, floor or bench excluded). [m2]
    """

    volume: float
    free_surface_area: float


def near_field_hemisphere(radius=NEAR_FIELD_RADIUS) -> NearFieldGeometry:
    """Near field as a hemisphere resting on a bench or floor around the source.

    Volume 2/3 pi r^3; free surface area 2 pi r^2 (the curved surface; the flat
    face is on the bench).

    Parameters
    ----------
    radius : float
        Hemisphere radius; 1 m is common practice for a worker's breathing zone
        around a hand-held or bench source. [m]

    Returns
    -------
    NearFieldGeometry

    Examples
    --------
    >>> g = near_field_hemisphere(1.0)
    >>> round(g.volume, 4), round(g.free_surface_area, 4)
    (2.0944, 6.2832)
    """
    r = positive(radius, "radius", "m")
    return NearFieldGeometry(volume=2.0 / 3.0 * math.pi * r**3,
                             free_surface_area=2.0 * math.pi * r**2)


def near_field_box(length, width, height,
                   open_faces=("top", "front", "back", "left", "right")) -> NearFieldGeometry:
    """Near field as a box; only the faces open to the room count as free surface.

    The default has every face open except the bottom (a box on the floor or a
    bench). Faces: "top"/"bottom" are length x width, "front"/"back" length x
    height, "left"/"right" width x height.

    Parameters
    ----------
    length, width, height : float
        Box edges. [m]
    open_faces : sequence of str
        Faces through which air is exchanged with the far field.

    Returns
    -------
    NearFieldGeometry

    Examples
    --------
    A 2 m x 1 m x 1.5 m box against a wall at its back, on the floor:

    >>> g = near_field_box(2.0, 1.0, 1.5, ("top", "front", "left", "right"))
    >>> g.volume, g.free_surface_area
    (3.0, 8.0)
    """
    edges = {"length": positive(length, "length", "m"),
             "width": positive(width, "width", "m"),
             "height": positive(height, "height", "m")}
    faces = tuple(open_faces)
    unknown = [f for f in faces if f not in BOX_FACES]
    if unknown:
        raise InputError("open_faces", f"unknown face(s) {unknown}; the faces are "
                         f"{list(BOX_FACES)}")
    if len(set(faces)) != len(faces):
        raise InputError("open_faces", "a face is listed twice")
    if not faces:
        raise InputError("open_faces", "a near field needs at least one face open to the room")
    area = sum(edges[a] * edges[b] for a, b in (BOX_FACES[f] for f in faces))
    return NearFieldGeometry(volume=edges["length"] * edges["width"] * edges["height"],
                             free_surface_area=area)


def interzonal_airflow(free_surface_area, random_air_speed):
    """Air exchanged between near and far field, beta = 1/2 x free surface area x speed.

    Half the random air speed crosses the boundary inwards and half outwards.

    Parameters
    ----------
    free_surface_area : float or array_like
        Near-field boundary open to the far field (2 pi r^2 for a hemisphere). [m2]
    random_air_speed : float or array_like
        Random (turbulent) air speed near the source; typically 0.05-0.3 m/s
        indoors (Baldwin & Maynard 1998, Ann. Occup. Hyg. 42(5), 303-313). [m/s]

    Returns
    -------
    float or numpy.ndarray
        Interzonal airflow rate beta. [m3/s]

    References
    ----------
    Nicas (1996), Appl. Occup. Environ. Hyg. 11(11), 1168; Keil, Simmons &
    Anthony (2009), Mathematical Models for Estimating Occupational Exposure to
    Chemicals, 2nd ed., AIHA Press (two-zone model chapter).

    Examples
    --------
    A 1 m hemisphere in air moving at 0.1 m/s exchanges 0.314 m3/s:

    >>> round(interzonal_airflow(2 * 3.141592653589793, 0.1), 4)
    0.3142
    """
    area = finite_array(free_surface_area, "free_surface_area", allow_empty=True)
    if np.any(area <= 0.0):
        raise InputError("free_surface_area", "must be above 0 m2")
    speed = finite_array(random_air_speed, "random_air_speed", allow_empty=True)
    if np.any(speed <= 0.0):
        raise InputError("random_air_speed", "must be above 0 m/s; indoor air is never "
                         "perfectly still (typically 0.05-0.3 m/s)")
    beta = 0.5 * area * speed
    return float(beta) if beta.ndim == 0 else beta


@dataclass(frozen=True)
class TwoZoneResult:
    """Near-field and far-field concentrations over time.

    Attributes
    ----------
    times : numpy.ndarray
        Times reported. [s]
    near_field : numpy.ndarray
        Near-field concentration (the worker's breathing zone by the source). [kg/m3]
    far_field : numpy.ndarray
        Far-field concentration (the rest of the room). [kg/m3]
    method : str
        "analytic" (constant source, Nicas's two-exponential solution),
        "exact-stepwise" (piecewise-linear source, exact integration over each
        interval) or "numerical" (callable source, LSODA).
    """

    times: np.ndarray
    near_field: np.ndarray
    far_field: np.ndarray
    method: str


def two_zone_steady_state(generation_rate, ventilation_rate, interzonal_flow,
                          mixing_factor=1.0):
    """Steady near- and far-field concentrations of a constant source in the near field.

    C_FF = G K / Q and C_NF = C_FF + G / beta.

    Parameters
    ----------
    generation_rate : float or array_like
        Source in the near field, G. [kg/s]
    ventilation_rate : float
        General ventilation Q, above 0. [m3/s]
    interzonal_flow : float
        Near-field/far-field airflow beta (see `interzonal_airflow`). [m3/s]
    mixing_factor : float
        K >= 1, dividing Q. [-]

    Returns
    -------
    tuple of float or numpy.ndarray
        (near_field, far_field) concentrations. [kg/m3]

    References
    ----------
    Nicas (1996), Appl. Occup. Environ. Hyg. 11(11), 1168; Keil, Simmons &
    Anthony (2009), AIHA Press, two-zone model chapter.

    Examples
    --------
    100 mg/min, Q = 20 m3/min, beta = 5 m3/min: 5 mg/m3 far, 25 mg/m3 near.

    >>> nf, ff = two_zone_steady_state(100e-6 / 60, 20 / 60, 5 / 60)
    >>> round(nf * 1e6, 6), round(ff * 1e6, 6)
    (25.0, 5.0)
    """
    far = steady_state_concentration(generation_rate, ventilation_rate, mixing_factor)
    beta = positive(interzonal_flow, "interzonal_flow", "m3/s")
    near = far + np.asarray(generation_rate, dtype=float) / beta
    return (float(near) if np.ndim(near) == 0 else near), far


def _two_zone_modes(near_volume, far_volume, beta, q_effective):
    """Eigenvalues and eigenvectors of the two-zone system, source in the near field.

    d/dt [C_NF, C_FF] = A [C_NF, C_FF] + [G / V_NF, 0], with
    A = [[-beta/V_NF, beta/V_NF], [beta/V_FF, -(beta + Q')/V_FF]].
    A is similar to a symmetric matrix, so both eigenvalues are real and, with
    beta > 0, distinct; each eigenvector is (1, 1 + lambda V_NF / beta).
    """
    half_trace = -0.5 * (beta / near_volume + (beta + q_effective) / far_volume)
    determinant = beta * q_effective / (near_volume * far_volume)
    root = math.sqrt(half_trace**2 - determinant)
    fast = half_trace - root  # the more negative eigenvalue, computed without cancellation
    slow = determinant / fast  # product of the roots is the determinant; 0 when Q' = 0
    rates = np.array([slow, fast])
    vectors = np.array([[1.0, 1.0], 1.0 + rates * near_volume / beta])
    return rates, vectors


def near_field_far_field(generation_rate, room_volume, ventilation_rate, times,
                         near_field_volume, interzonal_flow, mixing_factor=1.0) -> TwoZoneResult:
    r"""Near-field/far-field (two-zone) model of a source beside the worker.

    The room is split into a near field (volume V_NF, around the source and the
    worker's breathing zone) and the far field (V_FF = room - V_NF), which
    exchange air at beta (see `interzonal_airflow`). The far field is ventilated
    by Q/K; both zones start clean:

    .. math::
        V_{NF} \dot C_{NF} = G + \beta (C_{FF} - C_{NF}), \qquad
        V_{FF} \dot C_{FF} = \beta (C_{NF} - C_{FF}) - \frac{Q}{K} C_{FF}

    A constant source uses the analytic two-exponential solution (Nicas 1996),
    written here as C(t) = C_ss + a_1 v_1 e^{lambda_1 t} + a_2 v_2 e^{lambda_2 t}
    with the eigenvalues lambda and eigenvectors v of the system; it tends to
    C_FF = G K / Q and C_NF = C_FF + G / beta. A piecewise-linear source (array)
    and a closed room (Q = 0) are integrated exactly step by step in the same
    eigenbasis; a callable source numerically (LSODA).

    Typical inputs: a 1 m hemispherical near field (2.09 m3, 6.28 m2 of free
    surface, common practice) and random air speeds of 0.05-0.3 m/s
    (Baldwin & Maynard 1998, Ann. Occup. Hyg. 42(5), 303-313).

    Parameters
    ----------
    generation_rate : float, array_like or callable
        Source in the near field: constant, one value per time (piecewise-linear),
        or a function of time in s. [kg/s]
    room_volume : float
        Whole room volume, near field included. [m3]
    ventilation_rate : float
        General ventilation Q; 0 for a closed room. [m3/s]
    times : array_like
        Times to report, non-decreasing, from the start of the source. [s]
    near_field_volume : float
        V_NF, smaller than the room. [m3]
    interzonal_flow : float
        beta, above 0. [m3/s]
    mixing_factor : float
        K >= 1, dividing Q. [-]

    Returns
    -------
    TwoZoneResult

    References
    ----------
    Nicas, M. (1996), Appl. Occup. Environ. Hyg. 11(11), 1168 (the two-zone
    solution; also reprinted in Keil, Simmons & Anthony (2009), Mathematical
    Models for Estimating Occupational Exposure to Chemicals, 2nd ed., AIHA Press).

    Examples
    --------
    100 mg/min in a 100 m3 room, Q = 20 m3/min, V_NF = 8 m3, beta = 5 m3/min,
    after an hour (near the 25 and 5 mg/m3 steady states):

    >>> r = near_field_far_field(100e-6 / 60, 100.0, 20 / 60, [3600.0], 8.0, 5 / 60)
    >>> round(float(r.near_field[0]) * 1e6, 2), round(float(r.far_field[0]) * 1e6, 2)
    (25.0, 5.0)
    """
    v = positive(room_volume, "room_volume", "m3")
    q = positive(ventilation_rate, "ventilation_rate", "m3/s", allow_zero=True, 
                 hint="; use 0 for a closed room")
    k = _mixing_factor(mixing_factor)
    v_near = positive(near_field_volume, "near_field_volume", "m3")
    if v_near >= v:
        raise InputError("near_field_volume", f"{v_near:g} m3 must be smaller than the room "
                         f"volume {v:g} m3; the far field is the rest of the room")
    beta = positive(interzonal_flow, "interzonal_flow", "m3/s")
    t = _time_grid(times)
    kind, source, sample = _source(generation_rate, t)
    v_far = v - v_near
    q_eff = q / k
    rates, vectors = _two_zone_modes(v_near, v_far, beta, q_eff)

    if kind == "constant" and q_eff > 0.0:
        steady = np.array([source / q_eff + source / beta, source / q_eff])
        amplitudes = np.linalg.solve(vectors, -steady)
        concentration = steady[:, None] + vectors @ (amplitudes[:, None] *
                                                     np.exp(rates[:, None] * t[None, :]))
        method = "analytic"
    elif kind in ("constant", "series"):
        grid, g, added = _from_zero(t, sample)
        weights = np.linalg.solve(vectors, np.array([1.0 / v_near, 0.0]))
        modes = np.array([_relaxation_steps(-rate, grid, weight * g, 0.0)
                          for rate, weight in zip(rates, weights)])
        concentration = (vectors @ modes)[:, added:]
        method = "exact-stepwise"
    else:
        def rhs(time, y):
            exchange = beta * (y[1] - y[0])
            return [(float(source(time)) + exchange) / v_near,
                    (-exchange - q_eff * y[1]) / v_far]

        g_max = float(sample.max())
        scale = g_max / q_eff + g_max / beta if q_eff > 0 else g_max * t[-1] / v_near
        concentration = _solve_numerically(rhs, t, [0.0, 0.0], scale)
        method = "numerical"
    return TwoZoneResult(times=t, near_field=concentration[0], far_field=concentration[1],
                         method=method)
