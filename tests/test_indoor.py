"""Indoor air models: well-mixed room, purge time and the near-field/far-field model."""

import math
import warnings

import numpy as np
import pytest
from scipy.integrate import simpson

from estimator.constants import GAS_CONSTANT, STANDARD_ATMOSPHERE, ZERO_CELSIUS
from estimator.errors import InputError, UllageWarning
from estimator.indoor import (
    PurgeEstimate,
    air_changes_to_flow,
    interzonal_airflow,
    near_field_box,
    near_field_far_field,
    near_field_hemisphere,
    purge_time,
    required_ventilation_rate,
    steady_state_concentration,
    two_zone_steady_state,
    well_mixed_room,
)

# US customary units, exact by definition (NIST SP 811, Appendix B).
PINT = 473.176473e-6  # m3, US liquid pint
CUBIC_FOOT = 0.028316846592  # m3
CFM = CUBIC_FOOT / 60.0  # m3/s
# ACGIH "standard air", 70 degF and 29.92 inHg; its 403 constant uses the molar
# volume there (about 24.1 L/mol).
ACGIH_MOLAR_VOLUME = GAS_CONSTANT * (ZERO_CELSIUS + (70.0 - 32.0) / 1.8) / STANDARD_ATMOSPHERE

G = 1e-3 / 60  # kg/s, 1 g/min
V = 100.0  # m3
Q = 10.0 / 60  # m3/s, 10 m3/min
TIMES = np.linspace(0.0, 7200.0, 241)


def ppm_to_kg_per_m3(ppm, molar_mass, molar_volume):
    """Volume ppm to kg/m3 at a stated molar volume (ideal gas)."""
    return ppm * 1e-6 * molar_mass / molar_volume


# ------------------------------------------------------------ well-mixed room

def test_constant_source_closed_form_values():
    """C(t) = G K/Q (1 - exp(-Q t/(K V))) + C0 exp(-Q t/(K V)) at a few times."""
    k, c0 = 2.0, 4e-5
    c = well_mixed_room(G, V, Q, TIMES, mixing_factor=k, initial_concentration=c0)
    lam = Q / (k * V)
    expected = G * k / Q + (c0 - G * k / Q) * np.exp(-lam * TIMES)
    np.testing.assert_allclose(c, expected, rtol=1e-12)


def test_mixing_factor_divides_ventilation():
    """K = 4 with Q gives the same room as K = 1 with Q/4 (the convention)."""
    a = well_mixed_room(G, V, Q, TIMES, mixing_factor=4.0)
    b = well_mixed_room(G, V, Q / 4.0, TIMES)
    np.testing.assert_allclose(a, b, rtol=1e-12)


def test_analytic_matches_exact_stepwise_for_constant_array():
    """A constant source given as an array (exact step-wise integrator) equals the analytic one."""
    a = well_mixed_room(G, V, Q, TIMES, 1.5, 1e-5)
    b = well_mixed_room(np.full(TIMES.size, G), V, Q, TIMES, 1.5, 1e-5)
    np.testing.assert_allclose(b, a, rtol=1e-10)


def test_analytic_matches_numerical_callable():
    """A constant source given as a callable (LSODA) agrees with the analytic one to 1e-6."""
    a = well_mixed_room(G, V, Q, TIMES, 1.5, 1e-5)
    b = well_mixed_room(lambda t: G, V, Q, TIMES, 1.5, 1e-5)
    np.testing.assert_allclose(b, a, rtol=1e-6)


def test_piecewise_linear_series_matches_numerical():
    """A ramp-up, hold, shut-off series: the exact integrator and LSODA agree to 1e-6."""
    grid = np.sort(np.append(np.linspace(0.0, 7200.0, 121), 1800.0))  # 1800 s twice: a step
    rates = np.interp(grid, [0.0, 600.0, 1800.0], [0.0, 2 * G, 2 * G])
    rates[np.searchsorted(grid, 1800.0, side="right") - 1:] = 0.0  # off from the second 1800 s
    exact = well_mixed_room(rates, V, Q, grid)

    def source(time):
        if time <= 600.0:
            return 2 * G * time / 600.0
        return 2 * G if time < 1800.0 else 0.0

    numerical = well_mixed_room(source, V, Q, grid)
    np.testing.assert_allclose(numerical, exact, rtol=1e-6, atol=1e-6 * exact.max())


def test_steady_state_is_g_k_over_q():
    """Long after the start the room sits at G K / Q, and the function says the same."""
    k = 3.0
    c = well_mixed_room(G, V, Q, [1e6], mixing_factor=k)
    assert c[0] == pytest.approx(G * k / Q, rel=1e-12)
    assert steady_state_concentration(G, Q, k) == pytest.approx(G * k / Q, rel=1e-15)


def test_mass_balance_closes_constant_source():
    """G t = V C(t) + integral of (Q/K) C dt, to 1e-6 (Simpson on a fine grid)."""
    k = 2.0
    t = np.linspace(0.0, 5400.0, 5401)
    c = well_mixed_room(G, V, Q, t, mixing_factor=k)
    removed = Q / k * simpson(c, x=t)
    assert V * c[-1] + removed == pytest.approx(G * t[-1], rel=1e-6)


def test_mass_balance_closes_time_varying_source():
    """Mass emitted = mass in the air + mass ventilated, for a triangular emission pulse."""
    t = np.linspace(0.0, 5400.0, 5401)
    g = np.interp(t, [0.0, 900.0, 1800.0, 5400.0], [0.0, 3 * G, 0.0, 0.0])
    c = well_mixed_room(g, V, Q, t, mixing_factor=1.5)
    emitted = 0.5 * 1800.0 * 3 * G
    assert V * c[-1] + Q / 1.5 * simpson(c, x=t) == pytest.approx(emitted, rel=1e-6)


def test_closed_room_rises_linearly():
    """Q = 0: C = C0 + G t / V, for a constant and for an array source."""
    c = well_mixed_room(G, V, 0.0, TIMES, initial_concentration=2e-5)
    np.testing.assert_allclose(c, 2e-5 + G * TIMES / V, rtol=1e-13)
    c = well_mixed_room(np.full(TIMES.size, G), V, 0.0, TIMES)
    np.testing.assert_allclose(c, G * TIMES / V, rtol=1e-12)


def test_grid_not_starting_at_zero_holds_first_rate():
    """An array source on a grid starting after t = 0 is held at its first value before it."""
    t = np.array([600.0, 1200.0])
    c = well_mixed_room(np.array([G, G]), V, Q, t)
    np.testing.assert_allclose(c, well_mixed_room(G, V, Q, t), rtol=1e-12)


def test_saturation_cap_holds_and_warns():
    """The cap is never exceeded, a warning says so, and the room decays from the cap."""
    cap = 5e-5
    t = np.linspace(0.0, 7200.0, 721)
    with pytest.warns(UllageWarning, match="saturation"):
        c = well_mixed_room(G, V, Q, t, saturation_concentration=cap)
    assert c.max() <= cap
    g = np.where(t < 3600.0, G, 0.0)
    with pytest.warns(UllageWarning):
        c = well_mixed_room(g, V, Q, t, saturation_concentration=cap)
    assert c.max() <= cap
    i = np.searchsorted(t, 3600.0)
    assert c[i - 1] == pytest.approx(cap)
    assert c[-1] < cap * math.exp(-Q / V * 3000.0)


def test_saturation_cap_callable_source():
    """The cap also holds for a callable source."""
    with pytest.warns(UllageWarning):
        c = well_mixed_room(lambda t: G, V, Q, TIMES, saturation_concentration=5e-5)
    assert c.max() <= 5e-5


def test_no_warning_when_cap_not_reached():
    """A cap far above the room's concentration changes nothing and does not warn."""
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        c = well_mixed_room(G, V, Q, TIMES, saturation_concentration=1.0)
    np.testing.assert_allclose(c, well_mixed_room(G, V, Q, TIMES), rtol=0)


def test_air_changes_to_flow_scalar_and_array():
    """ACH x volume / 3600, for a float and an array."""
    assert air_changes_to_flow(6.0, 300.0) == pytest.approx(0.5)
    np.testing.assert_allclose(air_changes_to_flow(np.array([0.0, 1.0, 12.0]), 36.0),
                               [0.0, 0.01, 0.12])


def test_steady_state_array_input():
    """steady_state_concentration broadcasts over arrays of rates."""
    np.testing.assert_allclose(steady_state_concentration(np.array([G, 2 * G]), Q),
                               [G / Q, 2 * G / Q])


def test_acgih_dilution_example_methyl_chloroform():
    """ACGIH Industrial Ventilation manual, dilution-ventilation example (from memory):
    methyl chloroform lost at 1.5 pints per 60 min, SG 1.32, MW 133.42, TLV 350 ppm,
    K = 6: Q' = 403 SG ER 1e6 / (MW C) = 285 cfm and Q = Q' K = 1710 cfm (the manual's
    answer). In SI our steady state at 1710 cfm is 350 ppm and the required flow is
    1710 cfm, within 0.5 % (the manual's 403 rounds its standard-air constant)."""
    sg, mw, tlv, k = 1.32, 133.42, 350.0, 6.0
    er = 1.5 / 60.0  # pints/min
    generation = er * PINT * sg * 1000.0 / 60.0  # kg/s (SG relative to 1000 kg/m3)
    target = ppm_to_kg_per_m3(tlv, mw * 1e-3, ACGIH_MOLAR_VOLUME)
    c = steady_state_concentration(generation, 1710.0 * CFM, k)
    assert c == pytest.approx(target, rel=5e-3)
    assert required_ventilation_rate(generation, target, k) / CFM == pytest.approx(1710.0,
                                                                                   rel=5e-3)


def test_acgih_purge_equation_us_units():
    """ACGIH purge equation ln(C2/C1) = -(Q'/V) t in ft3, cfm and min (Q' = Q/K; ACGIH
    Industrial Ventilation, dilution chapter, form from memory), worked by hand in its
    own units: 20 000 ft3, 2000 cfm, K = 3, 200 -> 25 ppm takes (20 000 / 666.7) ln 8
    = 30 x 2.079442 = 62.3832 min. The SI function, fed the volume and flow converted
    with NIST SP 811's exact factors, gives the same to 1e-4 min."""
    result = purge_time(20000.0 * CUBIC_FOOT, 2000.0 * CFM, 200.0, 25.0, mixing_factor=3.0)
    assert result.time / 60.0 == pytest.approx(62.3832, abs=1e-4)


def test_purge_time_formula_and_simulation():
    """t = (K V/Q) ln(C0/C), and the room simulated from C0 reaches C at that time."""
    result = purge_time(V, Q, 1e-3, 1e-5, mixing_factor=2.0)
    assert isinstance(result, PurgeEstimate)
    assert result.reachable and result.floor == 0.0
    assert result.time == pytest.approx(2.0 * V / Q * math.log(100.0), rel=1e-14)
    c = well_mixed_room(0.0, V, Q, [result.time], 2.0, 1e-3)
    assert c[0] == pytest.approx(1e-5, rel=1e-12)


def test_purge_time_with_residual_source():
    """With a residual source the decay is towards G K/Q; the simulation confirms the time."""
    floor = G * 1.5 / Q
    result = purge_time(V, Q, 10 * floor, 2 * floor, 1.5, G)
    assert result.floor == pytest.approx(floor)
    assert result.time == pytest.approx(1.5 * V / Q * math.log(9.0), rel=1e-13)
    c = well_mixed_room(G, V, Q, [result.time], 1.5, 10 * floor)
    assert c[0] == pytest.approx(2 * floor, rel=1e-12)


def test_purge_target_at_or_below_floor_is_never_reached():
    """A target at or below G K/Q gives math.inf and says it can never be reached."""
    floor = G / Q
    for target in (floor, 0.5 * floor):
        result = purge_time(V, Q, 10 * floor, target, residual_generation_rate=G)
        assert result.time == math.inf and not result.reachable
        assert "never" in result.note
    assert purge_time(V, Q, 1e-3, 0.0).time == math.inf


def test_purge_edge_cases():
    """Already below the target: 0 s; no ventilation: never."""
    assert purge_time(V, Q, 1e-6, 1e-5).time == 0.0
    closed = purge_time(V, 0.0, 1e-3, 1e-5)
    assert closed.time == math.inf and not closed.reachable


# ------------------------------------------------------------------- two zones

ROOM = 5.0 * 6.0 * 3.0  # m3
HEMI = near_field_hemisphere(1.0)
BETA = interzonal_airflow(HEMI.free_surface_area, 0.1)
QR = air_changes_to_flow(3.0, ROOM)
GR = 10e-6 / 60  # kg/s, 10 mg/min
T2 = np.linspace(0.0, 3 * 3600.0, 541)


def nicas_two_zone(g, q, beta, v_near, v_far, t):
    """Nicas's (1996) two-exponential solution in its published form (from memory; as
    reprinted in Keil, Simmons & Anthony 2009). Returns (C_NF, C_FF)."""
    b = (beta * v_far + v_near * (beta + q)) / (v_near * v_far)
    root = math.sqrt(b**2 - 4 * beta * q / (v_near * v_far))
    l1, l2 = 0.5 * (-b + root), 0.5 * (-b - root)
    k1 = (beta * q + l2 * v_near * (beta + q)) / (beta * q * v_near * (l1 - l2))
    k2 = (beta * q + l1 * v_near * (beta + q)) / (beta * q * v_near * (l1 - l2))
    near = g / q + g / beta + g * k1 * np.exp(l1 * t) - g * k2 * np.exp(l2 * t)
    far = (g / q + g * (l1 * v_near + beta) / beta * k1 * np.exp(l1 * t)
           - g * (l2 * v_near + beta) / beta * k2 * np.exp(l2 * t))
    return near, far


def test_near_field_geometry():
    """Hemisphere: 2/3 pi r^3 and 2 pi r^2; box: only the open faces count."""
    assert HEMI.volume == pytest.approx(2.0 / 3.0 * math.pi)
    assert HEMI.free_surface_area == pytest.approx(2.0 * math.pi)
    box = near_field_box(1.0, 2.0, 1.5)
    assert box.volume == pytest.approx(3.0)
    assert box.free_surface_area == pytest.approx(1.0 * 2.0 + 2 * 1.0 * 1.5 + 2 * 2.0 * 1.5)
    assert BETA == pytest.approx(0.5 * 2.0 * math.pi * 0.1)


def test_two_zone_matches_published_solution():
    """The analytic result equals Nicas's published two-exponential formulas."""
    r = near_field_far_field(GR, ROOM, QR, T2, HEMI.volume, BETA, mixing_factor=2.0)
    near, far = nicas_two_zone(GR, QR / 2.0, BETA, HEMI.volume, ROOM - HEMI.volume, T2)
    assert r.method == "analytic"
    np.testing.assert_allclose(r.near_field, near, rtol=1e-9, atol=1e-15)
    np.testing.assert_allclose(r.far_field, far, rtol=1e-9, atol=1e-15)


def test_two_zone_steady_states():
    """C_FF -> G K/Q and C_NF -> G K/Q + G/beta, and two_zone_steady_state says so."""
    r = near_field_far_field(GR, ROOM, QR, [1e6], HEMI.volume, BETA, mixing_factor=2.0)
    assert r.far_field[0] == pytest.approx(GR * 2.0 / QR, rel=1e-10)
    assert r.near_field[0] == pytest.approx(GR * 2.0 / QR + GR / BETA, rel=1e-10)
    near, far = two_zone_steady_state(GR, QR, BETA, 2.0)
    assert (near, far) == (pytest.approx(GR * 2.0 / QR + GR / BETA), pytest.approx(GR * 2.0 / QR))


def test_two_zone_analytic_matches_stepwise_and_numerical():
    """Constant source: analytic, exact step-wise (array) and LSODA (callable) agree to 1e-6."""
    a = near_field_far_field(GR, ROOM, QR, T2, HEMI.volume, BETA)
    b = near_field_far_field(np.full(T2.size, GR), ROOM, QR, T2, HEMI.volume, BETA)
    c = near_field_far_field(lambda t: GR, ROOM, QR, T2, HEMI.volume, BETA)
    assert (b.method, c.method) == ("exact-stepwise", "numerical")
    for other in (b, c):
        np.testing.assert_allclose(other.near_field, a.near_field, rtol=1e-6, atol=1e-15)
        np.testing.assert_allclose(other.far_field, a.far_field, rtol=1e-6, atol=1e-15)


def test_two_zone_time_varying_source_agrees_and_balances_mass():
    """A 30-min task: step-wise and LSODA agree, and emitted = held + ventilated mass."""
    t = np.sort(np.append(np.linspace(0.0, 7200.0, 7201), 1800.0))  # 1800 s twice: a step
    g = np.where(t < 1800.0, GR, 0.0)
    g[np.searchsorted(t, 1800.0)] = GR  # the first of the two 1800 s samples is still on
    stepwise = near_field_far_field(g, ROOM, QR, t, HEMI.volume, BETA)
    numerical = near_field_far_field(lambda s: GR if s < 1800.0 else 0.0, ROOM, QR, t,
                                     HEMI.volume, BETA)
    np.testing.assert_allclose(numerical.near_field, stepwise.near_field, rtol=1e-5,
                               atol=1e-6 * stepwise.near_field.max())
    emitted = GR * 1800.0
    held = HEMI.volume * stepwise.near_field[-1] + (ROOM - HEMI.volume) * stepwise.far_field[-1]
    i = np.searchsorted(t, 1800.0) + 1  # integrate on each side of the step
    ventilated = QR * (simpson(stepwise.far_field[:i], x=t[:i])
                       + simpson(stepwise.far_field[i:], x=t[i:]))
    assert held + ventilated == pytest.approx(emitted, rel=1e-6)


def test_two_zone_closed_room():
    """Q = 0: the total mass G t is all in the room, and the near field leads the far field."""
    r = near_field_far_field(GR, ROOM, 0.0, T2, HEMI.volume, BETA)
    held = HEMI.volume * r.near_field + (ROOM - HEMI.volume) * r.far_field
    np.testing.assert_allclose(held, GR * T2, rtol=1e-10, atol=1e-18)
    assert np.all(r.near_field[1:] > r.far_field[1:])


def test_two_zone_reduces_to_well_mixed_for_large_beta():
    """With very fast interzonal exchange both zones approach the well-mixed room."""
    r = near_field_far_field(GR, ROOM, QR, T2, HEMI.volume, 1e3)
    well = well_mixed_room(GR, ROOM, QR, T2)
    np.testing.assert_allclose(r.far_field[1:], well[1:], rtol=1e-3)


# ------------------------------------------------------------------ bad inputs

@pytest.mark.parametrize("kwargs, field, fragment", [
    ({"volume": 0.0}, "volume", "above 0"),
    ({"volume": -5.0}, "volume", "above 0"),
    ({"ventilation_rate": -0.1}, "ventilation_rate", "at least 0"),
    ({"mixing_factor": 0.5}, "mixing_factor", "divides"),
    ({"times": [0.0, 10.0, 5.0]}, "times", "non-decreasing"),
    ({"times": [-1.0, 10.0]}, "times", "negative"),
    ({"times": []}, "times", "no times"),
    ({"generation_rate": -1e-6}, "generation_rate", "negative"),
    ({"generation_rate": float("nan")}, "generation_rate", "finite"),
    ({"generation_rate": [1e-6, 2e-6]}, "generation_rate", "one value per time"),
    ({"volume": float("inf")}, "volume", "finite"),
    ({"initial_concentration": 1.0, "saturation_concentration": 0.1},
     "initial_concentration", "saturation"),
])
def test_well_mixed_room_bad_inputs(kwargs, field, fragment):
    """Bad inputs raise InputError naming the field, with a useful message."""
    args = {"generation_rate": G, "volume": V, "ventilation_rate": Q,
            "times": [0.0, 60.0, 120.0]}
    args.update(kwargs)
    with pytest.raises(InputError, match=fragment) as info:
        well_mixed_room(**args)
    assert info.value.field == field


def test_callable_returning_negative_rate_is_rejected():
    """A callable source that returns a negative rate raises InputError."""
    with pytest.raises(InputError, match="negative") as info:
        well_mixed_room(lambda t: -1.0, V, Q, TIMES)
    assert info.value.field == "generation_rate"


def test_two_zone_bad_inputs():
    """Near field as big as the room, zero beta and K < 1 are refused by name."""
    with pytest.raises(InputError, match="smaller than the room") as info:
        near_field_far_field(GR, ROOM, QR, T2, ROOM, BETA)
    assert info.value.field == "near_field_volume"
    with pytest.raises(InputError) as info:
        near_field_far_field(GR, ROOM, QR, T2, HEMI.volume, 0.0)
    assert info.value.field == "interzonal_flow"
    with pytest.raises(InputError, match="K must be >= 1"):
        near_field_far_field(GR, ROOM, QR, T2, HEMI.volume, BETA, mixing_factor=0.9)
    with pytest.raises(InputError) as info:
        interzonal_airflow(6.28, 0.0)
    assert info.value.field == "random_air_speed"
    with pytest.raises(InputError, match="unknown face"):
        near_field_box(1.0, 1.0, 1.0, ("top", "roof"))


def test_steady_state_needs_ventilation():
    """A closed room has no steady state: InputError on ventilation_rate."""
    with pytest.raises(InputError, match="steady state") as info:
        steady_state_concentration(G, 0.0)
    assert info.value.field == "ventilation_rate"


def test_purge_bad_inputs():
    """Negative concentrations or K < 1 in purge_time raise InputError by name."""
    with pytest.raises(InputError) as info:
        purge_time(V, Q, -1.0, 1e-5)
    assert info.value.field == "initial_concentration"
    with pytest.raises(InputError, match="divides"):
        purge_time(V, Q, 1e-3, 1e-5, mixing_factor=0.0)
