"""Exposure metrics of a concentration time series: TWA, 15-minute peak, crossings.

A series is a pair of arrays, times [s] and concentrations (any unit, used
consistently; the results carry the same unit). Between samples the
concentration is taken as linear (trapezoid rule), which makes every metric here
exact for piecewise-linear series. A step series (constant readings over
periods, as in the US 29 CFR 1910.1000 formula) is written with each change time
repeated; `stepwise_series` builds one. Time outside the series counts as zero
exposure.
"""

from __future__ import annotations

import warnings
from dataclasses import dataclass
from typing import NamedTuple

import numpy as np

from .constants import EIGHT_HOUR_SHIFT, SHORT_TERM_PERIOD
from .errors import InputError, UllageWarning

__all__ = [
    "WorkShift",
    "WindowPeak",
    "Peak",
    "stepwise_series",
    "exposure_integral",
    "time_weighted_average",
    "max_rolling_average",
    "peak",
    "first_time_above",
    "last_time_above",
    "time_back_below",
    "ZoneFlammability",
    "zone_flammability",
]


@dataclass(frozen=True)
class WorkShift:
    """A work shift: when it starts and how long it lasts.

    Attributes
    ----------
    start : float
        Shift start, on the clock of the concentration series. [s]
    duration : float
        Shift length; 8 h by default. [s]
    """

    start: float = 0.0
    duration: float = EIGHT_HOUR_SHIFT

    def __post_init__(self):
        if not np.isfinite(self.start):
            raise InputError("start", "the shift start must be a finite time in s")
        if not (np.isfinite(self.duration) and self.duration > 0.0):
            raise InputError("duration", "the shift duration must be a finite time above 0 s")

    @property
    def end(self) -> float:
        """Shift end. [s]"""
        return self.start + self.duration


class WindowPeak(NamedTuple):
    """Highest average over a sliding window.

    Attributes
    ----------
    value : float
        The highest window average (unit of the concentrations).
    start : float
        Start of the window where it occurs (the earliest, if several tie). [s]
    """

    value: float
    start: float


class Peak(NamedTuple):
    """Highest instantaneous concentration.

    Attributes
    ----------
    value : float
        The highest concentration (unit of the concentrations).
    time : float
        When it first occurs. [s]
    """

    value: float
    time: float


# --------------------------------------------------------------------- helpers

def _series(times, concentrations):
    try:
        t = np.asarray(times, dtype=float)
        c = np.asarray(concentrations, dtype=float)
    except (TypeError, ValueError):
        raise InputError("times", "times and concentrations must be numbers") from None
    if t.ndim != 1 or c.ndim != 1:
        raise InputError("times", "times and concentrations must be one-dimensional")
    if t.size == 0:
        raise InputError("times", "the series is empty; give at least one sample")
    if c.size != t.size:
        raise InputError("concentrations", f"got {c.size} concentrations for {t.size} times; "
                         "give one concentration per time")
    if not np.all(np.isfinite(t)):
        raise InputError("times", "contains NaN or infinity")
    if not np.all(np.isfinite(c)):
        raise InputError("concentrations", "contains NaN or infinity; remove or fill the gaps")
    if np.any(np.diff(t) < 0.0):
        raise InputError("times", "must be in non-decreasing order; sort the series by time")
    if np.any(c < 0.0):
        raise InputError("concentrations", "cannot be negative; set readings below the "
                         "instrument's zero to 0")
    return t, c


def _threshold(value):
    try:
        x = float(value)
    except (TypeError, ValueError):
        raise InputError("threshold", f"expected a number, got {value!r}") from None
    if not np.isfinite(x):
        raise InputError("threshold", "must be a finite number")
    return x


def _cumulative(t, c):
    """Exposure integral from the first sample to each sample (trapezoid rule)."""
    return np.concatenate(([0.0], np.cumsum(0.5 * (c[1:] + c[:-1]) * np.diff(t))))


def _integral_to(t, c, cumulative, x):
    """Exact integral of the piecewise-linear series from -inf to x (zero outside it)."""
    x = np.asarray(x, dtype=float)
    if t.size == 1:
        return np.zeros_like(x)
    k = np.clip(np.searchsorted(t, x, side="right") - 1, 0, t.size - 2)
    width = t[k + 1] - t[k]
    slope = np.divide(c[k + 1] - c[k], width, out=np.zeros_like(width), where=width > 0.0)
    d = np.clip(x - t[k], 0.0, width)
    inside = cumulative[k] + c[k] * d + 0.5 * slope * d * d
    return np.where(x <= t[0], 0.0, np.where(x >= t[-1], cumulative[-1], inside))


# --------------------------------------------------------------------- metrics

def stepwise_series(durations, levels, start=0.0):
    """Build a step series: each level held for its duration, one after another.

    Parameters
    ----------
    durations : array_like
        Length of each period, each at least 0. [s]
    levels : array_like
        Concentration during each period (any unit).
    start : float
        Time the first period starts. [s]

    Returns
    -------
    tuple of numpy.ndarray
        (times, concentrations), two samples per period, change times repeated.

    Examples
    --------
    >>> t, c = stepwise_series([3600.0, 3600.0], [10.0, 0.0])
    >>> t.tolist(), c.tolist()
    ([0.0, 3600.0, 3600.0, 7200.0], [10.0, 10.0, 0.0, 0.0])
    """
    d = np.atleast_1d(np.asarray(durations, dtype=float))
    level = np.atleast_1d(np.asarray(levels, dtype=float))
    if d.ndim != 1 or d.size == 0 or level.shape != d.shape:
        raise InputError("levels", "give one level per duration, at least one of each")
    if not np.all(np.isfinite(d)) or np.any(d < 0.0):
        raise InputError("durations", "every duration must be a finite time of at least 0 s")
    edges = float(start) + np.concatenate(([0.0], np.cumsum(d)))
    times = np.repeat(edges, 2)[1:-1]
    return times, np.repeat(level, 2)


def exposure_integral(times, concentrations, start, end):
    """Integral of concentration over time between two instants (zero outside the series).

    Parameters
    ----------
    times : array_like
        Sample times, non-decreasing. [s]
    concentrations : array_like
        Concentration at each time (any unit), linear in between.
    start, end : float
        The interval, end >= start. [s]

    Returns
    -------
    float
        Exposure integral [concentration unit x s].

    Examples
    --------
    >>> exposure_integral([0.0, 100.0], [0.0, 2.0], 0.0, 50.0)
    25.0
    """
    t, c = _series(times, concentrations)
    if not (np.isfinite(start) and np.isfinite(end)) or end < start:
        raise InputError("end", "the interval must be finite with end at or after start")
    cumulative = _cumulative(t, c)
    a, b = _integral_to(t, c, cumulative, [start, end])
    return float(b - a)


def time_weighted_average(times, concentrations, averaging_time=EIGHT_HOUR_SHIFT, start=None,
                          shift=None):
    r"""Time-weighted average over a work shift.

    .. math:: \mathrm{TWA} = \frac{1}{T_\mathrm{avg}} \int_{t_s}^{t_e} C(t)\,dt

    The integral is exact for the piecewise-linear series (trapezoid rule); a step
    series reproduces the sum of C_i T_i of the regulation. Time inside the window
    but outside the series counts as zero exposure, and a warning says so: other
    exposures during the shift must be added by the user.

    Parameters
    ----------
    times : array_like
        Sample times, non-decreasing. [s]
    concentrations : array_like
        Concentration at each time (any unit).
    averaging_time : float
        Divisor T_avg, 8 h by default (29 CFR 1910.1000(d)(1)(i) divides by 8 h
        whatever the shift length). [s]
    start : float, optional
        Start of the window [start, start + averaging_time]; 0 if omitted. [s]
    shift : WorkShift, optional
        Integrate over this shift instead (a 10-h shift is then integrated over
        10 h and divided by `averaging_time`). Give `start` or `shift`, not both.

    Returns
    -------
    float
        Time-weighted average (unit of the concentrations).

    References
    ----------
    US 29 CFR 1910.1000(d)(1)(i): E = (C_a T_a + C_b T_b + ... + C_n T_n) / 8.

    Examples
    --------
    The regulation's example: 2 h at 150 ppm, 2 h at 75 ppm, 4 h at 50 ppm.

    >>> t, c = stepwise_series([7200.0, 7200.0, 14400.0], [150.0, 75.0, 50.0])
    >>> time_weighted_average(t, c)
    81.25
    """
    t, c = _series(times, concentrations)
    if not (np.isfinite(averaging_time) and averaging_time > 0.0):
        raise InputError("averaging_time", "must be a finite time above 0 s")
    if shift is not None and start is not None:
        raise InputError("start", "give either start or shift, not both")
    if shift is not None:
        window_start, window_end = shift.start, shift.end
    else:
        window_start = 0.0 if start is None else float(start)
        if not np.isfinite(window_start):
            raise InputError("start", "must be a finite time in s")
        window_end = window_start + float(averaging_time)
    covered = min(window_end, t[-1]) - max(window_start, t[0])
    if covered < (window_end - window_start) * (1.0 - 1e-12):
        warnings.warn(
            f"the series covers {max(covered, 0.0) / 3600:.3g} h of the "
            f"{(window_end - window_start) / 3600:.3g} h window; the rest counts as zero "
            "exposure. Add any other exposure during the shift", UllageWarning, stacklevel=2)
    cumulative = _cumulative(t, c)
    a, b = _integral_to(t, c, cumulative, [window_start, window_end])
    return float((b - a) / averaging_time)


def max_rolling_average(times, concentrations, window=SHORT_TERM_PERIOD) -> WindowPeak:
    """Highest average over any window of the given length (15 min by default).

    Exact for a piecewise-linear series: the window average
    A(s) = (I(s + w) - I(s)) / w, with I the cumulative integral, is quadratic in
    the window start s between the instants where s or s + w meets a sample, so
    the maximum is at one of those instants or at the vertex of one of the
    quadratics; all are evaluated at once (no loop over samples). Windows lie
    inside the series; a series shorter than the window is averaged over the
    window with zero outside it.

    Parameters
    ----------
    times : array_like
        Sample times, non-decreasing. [s]
    concentrations : array_like
        Concentration at each time (any unit).
    window : float
        Averaging window, 900 s (the 15-minute short-term period). [s]

    Returns
    -------
    WindowPeak
        (value, start) of the highest window average.

    Examples
    --------
    A triangle 0 -> 100 -> 0 over 30 min: the best 15-min window is centred.

    >>> peak15 = max_rolling_average([0.0, 900.0, 1800.0], [0.0, 100.0, 0.0])
    >>> peak15.value, peak15.start
    (75.0, 450.0)
    """
    t, c = _series(times, concentrations)
    if not (np.isfinite(window) and window > 0.0):
        raise InputError("window", "must be a finite time above 0 s")
    w = float(window)
    cumulative = _cumulative(t, c)
    if t[-1] - t[0] <= w:
        return WindowPeak(float(cumulative[-1] / w), float(t[0]))

    def average(s):
        return (_integral_to(t, c, cumulative, s + w) - _integral_to(t, c, cumulative, s)) / w

    low, high = t[0], t[-1] - w
    breaks = np.concatenate(([low, high], t, t - w))
    breaks = np.unique(breaks[(breaks >= low) & (breaks <= high)])
    at_breaks = average(breaks)
    left, right = breaks[:-1], breaks[1:]
    a0, a1 = at_breaks[:-1], at_breaks[1:]
    am = average(0.5 * (left + right))
    curvature = 2.0 * a0 + 2.0 * a1 - 4.0 * am  # A(u) = a0 + linear u + curvature u^2, u in [0, 1]
    linear = 4.0 * am - 3.0 * a0 - a1
    vertex = np.divide(-linear, 2.0 * curvature, out=np.full_like(linear, -1.0),
                       where=curvature < 0.0)
    inner = (vertex > 0.0) & (vertex < 1.0)
    starts = np.concatenate((breaks, left[inner] + vertex[inner] * (right - left)[inner]))
    values = np.concatenate((at_breaks, average(starts[breaks.size:])))
    order = np.argsort(starts, kind="stable")
    starts, values = starts[order], values[order]
    best = values.max()
    first = int(np.argmax(values >= best - 1e-12 * abs(best)))
    return WindowPeak(float(values[first]), float(starts[first]))


def peak(times, concentrations) -> Peak:
    """Highest concentration and when it first occurs.

    Parameters
    ----------
    times : array_like
        Sample times, non-decreasing. [s]
    concentrations : array_like
        Concentration at each time (any unit).

    Returns
    -------
    Peak
        (value, time).

    Examples
    --------
    >>> peak([0.0, 60.0, 120.0], [1.0, 5.0, 2.0])
    Peak(value=5.0, time=60.0)
    """
    t, c = _series(times, concentrations)
    i = int(np.argmax(c))
    return Peak(float(c[i]), float(t[i]))


def _crossings(t, c, threshold, rising):
    """Times the series passes a threshold, interpolated linearly: rising (from at or
    below it to above it) or falling (from above it to at or below it)."""
    above, at_or_below = c > threshold, c <= threshold
    passes = at_or_below[:-1] & above[1:] if rising else above[:-1] & at_or_below[1:]
    i = np.flatnonzero(passes)
    fraction = (threshold - c[i]) / (c[i + 1] - c[i])
    return t[i] + fraction * (t[i + 1] - t[i])


def _edge_above(times, concentrations, threshold, last):
    """First (or `last`) time the series is above a threshold: an end sample time when
    the series is above it there, else the first rise (last fall) through it; None if
    it is never above it."""
    t, c = _series(times, concentrations)
    x = _threshold(threshold)
    end = -1 if last else 0
    if c[end] > x:
        return float(t[end])
    crossings = _crossings(t, c, x, rising=not last)
    return float(crossings[end]) if crossings.size else None


def first_time_above(times, concentrations, threshold):
    """First time the concentration rises above a threshold, interpolated linearly.

    Parameters
    ----------
    times : array_like
        Sample times, non-decreasing. [s]
    concentrations : array_like
        Concentration at each time (any unit).
    threshold : float
        Level of interest, in the unit of the concentrations.

    Returns
    -------
    float or None
        The crossing time (the first sample time if the series starts above the
        threshold) [s]; None if it never rises above it.

    Examples
    --------
    >>> first_time_above([0.0, 100.0], [0.0, 50.0], 10.0)
    20.0
    """
    return _edge_above(times, concentrations, threshold, last=False)


def last_time_above(times, concentrations, threshold):
    """Last time the concentration is above a threshold, interpolated linearly.

    Parameters
    ----------
    times : array_like
        Sample times, non-decreasing. [s]
    concentrations : array_like
        Concentration at each time (any unit).
    threshold : float
        Level of interest, in the unit of the concentrations.

    Returns
    -------
    float or None
        The time of the last fall to the threshold [s]; the last sample time when
        the series ends still above it; None if it is never above it.

    Examples
    --------
    >>> last_time_above([0.0, 100.0, 200.0], [0.0, 50.0, 0.0], 10.0)
    180.0
    """
    return _edge_above(times, concentrations, threshold, last=True)


def time_back_below(times, concentrations, threshold, after=None):
    """First time at or after a given instant that the concentration is at or below a threshold.

    Answers "when is it back below the limit after the peak?" (the default) or
    after any time given.

    Parameters
    ----------
    times : array_like
        Sample times, non-decreasing. [s]
    concentrations : array_like
        Concentration at each time (any unit).
    threshold : float
        Level of interest, in the unit of the concentrations.
    after : float, optional
        Instant to search from; by default the time of the peak. [s]

    Returns
    -------
    float or None
        The time it falls to the threshold, interpolated linearly (`after` itself
        when the concentration there is already at or below it) [s]; None if it
        stays above the threshold to the end of the series.

    Examples
    --------
    >>> time_back_below([0.0, 100.0, 200.0], [0.0, 50.0, 0.0], 10.0)
    180.0
    """
    t, c = _series(times, concentrations)
    x = _threshold(threshold)
    if after is None:
        start = float(t[int(np.argmax(c))])
    else:
        start = float(after)
        if not np.isfinite(start):
            raise InputError("after", "must be a finite time in s")
    if start > t[-1]:
        return None
    if start < t[0]:
        return start  # before the series: zero exposure
    j = int(np.searchsorted(t, start, side="right")) - 1
    # at a sample take its value (the later one of a step); between samples interpolate
    level = float(c[j]) if t[j] == start else float(np.interp(start, t, c))
    if level <= x:
        return start
    later = t > start
    tail_t = np.concatenate(([start], t[later]))
    tail_c = np.concatenate(([level], c[later]))
    crossings = _crossings(tail_t, tail_c, x, rising=False)
    return float(crossings[0]) if crossings.size else None


@dataclass(frozen=True)
class ZoneFlammability:
    """Flammability and oxygen verdicts of one air zone over a run.

    Times are from the start of the series [s]; None where the event never
    happens within it.

    Attributes
    ----------
    zone : str
        "room", "near field" or "far field".
    judged : bool
        False when no component has an LFL on record: the %LFL figures are then
        None and the vapour is not judged (it may still burn).
    peak_percent_lfl, peak_time : float or None
        Highest % of the LFL and when it first occurs. [%], [s]
    above_alarm_from, back_below_alarm : float or None
        When the air first passes the LFL alarm level, and when it last falls back
        to it (None if it is still above at the end). [s]
    above_lfl_from, back_below_lfl : float or None
        The same for 100 % of the LFL. [s]
    rich_from, back_below_ufl : float or None
        The same for the UFL (too rich to burn above it; flammable again as it
        dilutes). [s]
    lowest_oxygen, lowest_oxygen_time : float
        [% by volume], [s]
    below_oxygen_alarm_from, back_above_oxygen_alarm : float or None
        When oxygen first falls below the low-oxygen alarm, and when it is last
        back at or above it. [s]
    alarm_percent_lfl, oxygen_alarm : float
        The alarm levels used. [% of LFL], [% oxygen]
    times, percent_lfl, oxygen_percent : numpy.ndarray
        The series judged, for plots. [s], [% of LFL], [% oxygen]
    """

    zone: str
    judged: bool
    peak_percent_lfl: float | None
    peak_time: float | None
    above_alarm_from: float | None
    back_below_alarm: float | None
    above_lfl_from: float | None
    back_below_lfl: float | None
    rich_from: float | None
    back_below_ufl: float | None
    lowest_oxygen: float
    lowest_oxygen_time: float
    below_oxygen_alarm_from: float | None
    back_above_oxygen_alarm: float | None
    alarm_percent_lfl: float
    oxygen_alarm: float
    times: np.ndarray = None
    percent_lfl: np.ndarray = None
    oxygen_percent: np.ndarray = None


def _episode(t, c, threshold):
    """(first rise above, last fall back to) a threshold; None where it does not happen."""
    first = first_time_above(t, c, threshold)
    if first is None:
        return None, None
    if c[-1] > threshold:
        return first, None
    return first, last_time_above(t, c, threshold)


def zone_flammability(zone, times, percent_lfl, oxygen_percent, *, judged=True,
                      percent_ufl=None, alarm_percent_lfl=10.0,
                      oxygen_alarm=19.5) -> ZoneFlammability:
    """When the air of one zone passes the LFL alarm, the LFL and the oxygen alarm.

    Series are linear between samples, as for the exposure metrics.

    Parameters
    ----------
    zone : str
        Name of the zone, for reports.
    times : array_like
        Sample times. [s]
    percent_lfl : array_like
        Fuel vapour as % of the mixture LFL at each time. [%]
    oxygen_percent : array_like
        Oxygen at each time. [% by volume]
    judged : bool
        Whether any component has an LFL on record.
    percent_ufl : array_like, optional
        Fuel vapour as % of the mixture UFL at each time (above 100 the air is too
        rich to burn). [%]
    alarm_percent_lfl : float
        LFL alarm level, 10 % by default (US OSHA 29 CFR 1910.146(b)). [% of LFL]
    oxygen_alarm : float
        Low-oxygen alarm, 19.5 % by default (US OSHA 29 CFR 1910.146(b)). [%]

    Returns
    -------
    ZoneFlammability

    Examples
    --------
    >>> z = zone_flammability("room", [0.0, 60.0, 120.0, 180.0], [0.0, 50.0, 150.0, 5.0],
    ...                       [20.9, 20.7, 20.5, 20.9])
    >>> z.above_alarm_from, z.above_lfl_from, round(z.back_below_lfl, 1)
    (12.0, 90.0, 140.7)
    """
    t, pl = _series(times, percent_lfl)
    _, ox = _series(times, oxygen_percent)
    lowest = int(np.argmin(ox))
    below_from, back_above = _episode(t, 100.0 - ox, 100.0 - float(oxygen_alarm))
    common = dict(zone=zone, lowest_oxygen=float(ox[lowest]),
                  lowest_oxygen_time=float(t[lowest]), below_oxygen_alarm_from=below_from,
                  back_above_oxygen_alarm=back_above,
                  alarm_percent_lfl=float(alarm_percent_lfl), oxygen_alarm=float(oxygen_alarm),
                  times=t, percent_lfl=pl if judged else None, oxygen_percent=ox)
    if not judged:
        return ZoneFlammability(judged=False, peak_percent_lfl=None, peak_time=None,
                                above_alarm_from=None, back_below_alarm=None,
                                above_lfl_from=None, back_below_lfl=None, rich_from=None,
                                back_below_ufl=None, **common)
    top = peak(t, pl)
    alarm_from, alarm_back = _episode(t, pl, float(alarm_percent_lfl))
    lfl_from, lfl_back = _episode(t, pl, 100.0)
    rich_from = rich_back = None
    if percent_ufl is not None:
        _, pu = _series(times, percent_ufl)
        rich_from, rich_back = _episode(t, pu, 100.0)
    return ZoneFlammability(judged=True, peak_percent_lfl=top.value, peak_time=top.time,
                            above_alarm_from=alarm_from, back_below_alarm=alarm_back,
                            above_lfl_from=lfl_from, back_below_lfl=lfl_back,
                            rich_from=rich_from, back_below_ufl=rich_back, **common)
