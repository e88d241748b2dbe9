"""Exposure metrics of concentration series: TWA, 15-minute peak, peaks and crossings."""

import warnings

import numpy as np
import pytest

from estimator.errors import InputError, UllageWarning
from estimator.exposure import (
    Peak,
    WindowPeak,
    WorkShift,
    exposure_integral,
    first_time_above,
    last_time_above,
    max_rolling_average,
    peak,
    stepwise_series,
    time_back_below,
    time_weighted_average,
)

HOUR = 3600.0


def brute_force_rolling_max(t, c, window, n=20001):
    """Window averages on a fine grid of starts by dense trapezoid integration (check only)."""
    starts = np.linspace(t[0], t[-1] - window, n)
    fine = np.linspace(t[0], t[-1], 200001)
    cf = np.interp(fine, t, c)
    cumulative = np.concatenate(([0.0], np.cumsum(0.5 * (cf[1:] + cf[:-1]) * np.diff(fine))))
    integral = np.interp(starts + window, fine, cumulative) - np.interp(starts, fine, cumulative)
    return (integral / window).max()


def test_cfr_1910_1000_twa_worked_example():
    """US 29 CFR 1910.1000(d)(1)(i) worked example (regulation text, from memory):
    2 h at 150 ppm, 2 h at 75 ppm, 4 h at 50 ppm -> (300 + 150 + 200) / 8 = 81.25 ppm."""
    t, c = stepwise_series([2 * HOUR, 2 * HOUR, 4 * HOUR], [150.0, 75.0, 50.0])
    with warnings.catch_warnings():
        warnings.simplefilter("error")  # the series covers the whole shift: no warning
        assert time_weighted_average(t, c) == pytest.approx(81.25, rel=1e-14)


def test_twa_counts_time_outside_series_as_zero_and_warns():
    """A 2-h exposure at 100 ppm inside an 8-h shift averages 25 ppm, with a warning."""
    t, c = stepwise_series([2 * HOUR], [100.0], start=HOUR)
    with pytest.warns(UllageWarning, match="zero"):
        assert time_weighted_average(t, c) == pytest.approx(25.0)


def test_twa_of_linear_ramp_is_exact():
    """C = a t over 8 h has the analytic TWA a * 4 h (trapezoid rule exact)."""
    a = 1e-3
    t = np.array([0.0, 8 * HOUR])
    assert time_weighted_average(t, a * t) == pytest.approx(a * 4 * HOUR, rel=1e-14)


def test_twa_window_start_and_shift():
    """`start` moves the 8-h window; a 10-h shift is integrated over 10 h and divided by 8 h."""
    t, c = stepwise_series([10 * HOUR], [40.0])
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        assert time_weighted_average(t, c, start=2 * HOUR) == pytest.approx(40.0)
        assert time_weighted_average(t, c, shift=WorkShift(0.0, 10 * HOUR)) == pytest.approx(50.0)
    with pytest.raises(InputError, match="not both"):
        time_weighted_average(t, c, start=0.0, shift=WorkShift())


def test_exposure_integral_partial_segment():
    """Integral of a ramp 0 -> 2 over [0, 100] s between 0 and 50 s is 25."""
    assert exposure_integral([0.0, 100.0], [0.0, 2.0], 0.0, 50.0) == pytest.approx(25.0)
    assert exposure_integral([0.0, 100.0], [0.0, 2.0], -50.0, 500.0) == pytest.approx(100.0)


def test_constant_series_metrics():
    """A constant series: TWA, 15-min maximum and peak all equal the constant."""
    t = np.linspace(0.0, 8 * HOUR, 97)
    c = np.full(t.size, 12.5)
    assert time_weighted_average(t, c) == pytest.approx(12.5)
    best = max_rolling_average(t, c)
    assert isinstance(best, WindowPeak)
    assert best.value == pytest.approx(12.5) and best.start == pytest.approx(0.0)
    assert peak(t, c) == Peak(12.5, 0.0)


def test_max_rolling_average_triangle_analytic():
    """Triangle 0 -> 100 -> 0 over 30 min: best 15-min window is centred, average 75."""
    value, start = max_rolling_average([0.0, 900.0, 1800.0], [0.0, 100.0, 0.0])
    assert value == pytest.approx(75.0, rel=1e-13)
    assert start == pytest.approx(450.0, rel=1e-12)


def test_max_rolling_average_asymmetric_peak_interior_vertex():
    """Asymmetric triangle (rise 10 min, fall 40 min): the maximum is at an interior vertex.
    Analytic: the window [s, s+w] with equal end values; here s = 600 - w/5 (check by
    hand: c(s) = 10 s/60, c(s+w) = 100 (3000 - s - w)/2400, equal when 5 s = 3000 - w)."""
    t, c = np.array([0.0, 600.0, 3000.0]), np.array([0.0, 100.0, 0.0])
    w = 900.0
    s = (3000.0 - w) / 5.0
    slope_up, slope_down = 100.0 / 600.0, 100.0 / 2400.0

    def conc(x):
        return np.where(x <= 600.0, slope_up * x, 100.0 - slope_down * (x - 600.0))

    expected = 0.5 * (conc(s) + 100.0) * (600.0 - s) + 0.5 * (100.0 + conc(s + w)) * (s + w - 600.0)
    value, start = max_rolling_average(t, c, w)
    assert start == pytest.approx(s, rel=1e-10)
    assert value == pytest.approx(expected / w, rel=1e-12)


def test_max_rolling_average_matches_brute_force_on_random_series():
    """On an irregular series the exact method is at least the dense brute force, within 1e-6."""
    rng = np.random.default_rng(7)
    t = np.cumsum(rng.uniform(10.0, 300.0, 80))
    c = rng.uniform(0.0, 50.0, 80)
    exact = max_rolling_average(t, c, 900.0).value
    brute = brute_force_rolling_max(t, c, 900.0)
    assert exact >= brute - 1e-9
    assert exact == pytest.approx(brute, rel=1e-3)


def test_max_rolling_average_step_series_and_short_series():
    """Step: 20 min at 80 then 0 gives 80; a 5-min series is averaged over 15 min with zeros."""
    t, c = stepwise_series([1200.0, 3600.0], [80.0, 0.0])
    assert max_rolling_average(t, c).value == pytest.approx(80.0)
    short = max_rolling_average([0.0, 300.0], [30.0, 30.0])
    assert short.value == pytest.approx(10.0) and short.start == 0.0


def test_crossings_interpolate_linearly():
    """Ramp 0 -> 50 -> 0 over 200 s crosses 10 at 20 s and 180 s."""
    t, c = [0.0, 100.0, 200.0], [0.0, 50.0, 0.0]
    assert first_time_above(t, c, 10.0) == pytest.approx(20.0)
    assert last_time_above(t, c, 10.0) == pytest.approx(180.0)
    assert time_back_below(t, c, 10.0) == pytest.approx(180.0)
    assert peak(t, c) == Peak(50.0, 100.0)


def test_crossings_none_cases():
    """Never above: None; still above at the end: last sample / None from time_back_below."""
    t, c = [0.0, 100.0, 200.0], [0.0, 5.0, 1.0]
    assert first_time_above(t, c, 10.0) is None
    assert last_time_above(t, c, 10.0) is None
    rising = [0.0, 20.0, 40.0]
    assert last_time_above(t, rising, 10.0) == 200.0
    assert time_back_below(t, rising, 10.0) is None


def test_time_back_below_after_given_time():
    """Two excursions: searching after the first finds the second return below."""
    t = [0.0, 10.0, 20.0, 30.0, 40.0, 50.0]
    c = [0.0, 30.0, 0.0, 0.0, 40.0, 0.0]
    assert time_back_below(t, c, 10.0) == pytest.approx(47.5)  # after the peak at 40 s
    assert time_back_below(t, c, 10.0, after=5.0) == pytest.approx(10.0 + 20.0 / 3.0)
    assert time_back_below(t, c, 10.0, after=25.0) == 25.0  # already below there
    assert first_time_above(t, c, 10.0) == pytest.approx(10.0 / 3.0)


def test_series_starting_above_threshold():
    """A series that starts above the threshold is above from its first sample."""
    assert first_time_above([5.0, 10.0], [20.0, 0.0], 10.0) == 5.0


@pytest.mark.parametrize("times, concentrations, field, fragment", [
    ([], [], "times", "empty"),
    ([0.0, 20.0, 10.0], [1.0, 2.0, 3.0], "times", "non-decreasing"),
    ([0.0, 10.0], [1.0], "concentrations", "one concentration per time"),
    ([0.0, 10.0], [1.0, float("nan")], "concentrations", "NaN"),
    ([0.0, float("inf")], [1.0, 1.0], "times", "NaN or infinity"),
    ([0.0, 10.0], [1.0, -2.0], "concentrations", "negative"),
])
def test_bad_series_raise_input_error(times, concentrations, field, fragment):
    """Empty, unsorted, mismatched, NaN and negative series raise InputError by field."""
    for metric in (time_weighted_average, max_rolling_average, peak):
        with pytest.raises(InputError, match=fragment) as info:
            metric(times, concentrations)
        assert info.value.field == field


def test_bad_windows_and_shifts():
    """Zero averaging time or window, and a zero-length shift, raise InputError."""
    with pytest.raises(InputError) as info:
        time_weighted_average([0.0, 1.0], [1.0, 1.0], averaging_time=0.0)
    assert info.value.field == "averaging_time"
    with pytest.raises(InputError) as info:
        max_rolling_average([0.0, 1.0], [1.0, 1.0], window=-5.0)
    assert info.value.field == "window"
    with pytest.raises(InputError) as info:
        WorkShift(0.0, 0.0)
    assert info.value.field == "duration"
    with pytest.raises(InputError) as info:
        first_time_above([0.0, 1.0], [1.0, 1.0], float("nan"))
    assert info.value.field == "threshold"
