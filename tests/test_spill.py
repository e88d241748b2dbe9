"""Spills coupled to room air, and outdoors: checks against the separate models."""

import numpy as np
import pytest

import estimator
from estimator.errors import InputError, OutOfRangeError
from estimator.evaporation import evaporation_rate, mixture_pool
from estimator.headspace import headspace
from estimator.indoor import near_field_far_field, well_mixed_room
from estimator.outdoor import ground_level_centerline
from estimator.spill import indoor_spill, liquid_mixture_density, outdoor_spill

HOUR = 3600.0


def test_large_ventilated_room_matches_constant_source_box_model():
    """With a big pool and a large, well-ventilated room the room air stays far below
    saturation, so the coupled run equals the analytic box model with the pool's
    initial rate (Mackay-Matsugu), within 0.5 %."""
    t = np.linspace(0, 2 * HOUR, 241)
    run = indoor_spill("n-decane", 293.15, room_volume=2000.0, ventilation_rate=2.0,
                       spilled_volume=0.2, area=2.0, mixing_factor=2.0, air_speed=0.2,
                       times=t)
    g = evaporation_rate("n-decane", 293.15, 2.0, 0.2)
    expected = well_mixed_room(g, 2000.0, 2.0, t, mixing_factor=2.0)
    np.testing.assert_allclose(run.room[:, 0], expected, rtol=5e-3, atol=1e-12)


def test_steady_state_is_g_k_over_q():
    """Steady state of a constant source is G K / Q (the mixing-factor convention)."""
    run = indoor_spill("n-decane", 293.15, room_volume=100.0, ventilation_rate=0.5,
                       spilled_volume=0.5, area=1.0, mixing_factor=3.0, air_speed=0.1,
                       duration=6 * HOUR)
    g = run.evaporation_rate[-1, 0]
    assert run.room[-1, 0] == pytest.approx(g * 3.0 / 0.5, rel=2e-3)


def test_closed_room_approaches_but_never_exceeds_saturation():
    """A big spill in a small closed room is bounded by the saturated vapour
    concentration, and the evaporation slows as the air approaches it."""
    run = indoor_spill("toluene", 298.15, room_volume=20.0, ventilation_rate=0.0,
                       spilled_volume=0.01, area=5.0, air_speed=0.2, duration=12 * HOUR)
    saturated = float(headspace("toluene", 298.15).total_volume_fraction) * 1e6
    ppm = run.ppm()[:, 0]
    assert ppm.max() <= saturated * (1 + 1e-9)
    assert ppm[-1] > 0.95 * saturated
    assert run.evaporation_rate[-1, 0] < 0.05 * run.evaporation_rate[0, 0]


def test_mass_balance_closes():
    """Pool + air + ventilated out = spilled, to 1e-6 relative."""
    run = indoor_spill({"acetone": 0.3, "toluene": 0.4, "o-xylene": 0.3}, 298.15,
                       room_volume=150.0, ventilation_rate=0.1, spilled_volume=0.004,
                       mixing_factor=2.0, duration=8 * HOUR)
    assert run.mass_balance_error < 1e-6


def test_mixture_in_huge_room_matches_free_pool_weathering():
    """With a room so large its air stays near zero, the pool weathers as the separate
    mixture-pool model says (each component within 0.1 %, or 1e-5 of the spill)."""
    t = np.linspace(0, 3 * HOUR, 181)
    comps = {"acetone": 0.5, "toluene": 0.5}
    run = indoor_spill(comps, 298.15, room_volume=1e5, ventilation_rate=100.0,
                       spilled_mass=2.0, area=1.0, air_speed=0.3, times=t)
    free = mixture_pool(["acetone", "toluene"], run.initial_mass, 298.15, 1.0, 0.3, times=t)
    np.testing.assert_allclose(run.mass_remaining, free.mass_remaining, rtol=1e-3, atol=2e-5)


def test_volatile_component_leaves_first():
    """In a mixture pool the most volatile component is depleted first."""
    run = indoor_spill({"acetone": 0.5, "n-decane": 0.5}, 298.15, room_volume=500.0,
                       ventilation_rate=0.5, spilled_volume=0.001, duration=8 * HOUR)
    left = run.mass_remaining[-1] / run.initial_mass
    assert left[0] < 0.01 < left[1]


def test_two_zone_near_field_exceeds_far_field_and_matches_nicas_steady_state():
    """Two-zone (Nicas 1996): near field above far field; at steady state
    C_NF - C_FF = G / β."""
    run = indoor_spill("n-decane", 293.15, room_volume=200.0, ventilation_rate=0.3,
                       spilled_volume=0.5, area=0.5, near_field_volume=2.1,
                       interzonal_flow=0.25, air_speed=0.1, duration=8 * HOUR)
    g = run.evaporation_rate[-1, 0]
    assert np.all(run.near_field[1:, 0] > run.room[1:, 0])
    assert run.near_field[-1, 0] - run.room[-1, 0] == pytest.approx(g / 0.25, rel=2e-3)
    steady = near_field_far_field(g, 200.0, 0.3, np.array([0.0, 20 * HOUR]), 2.1, 0.25)
    assert run.room[-1, 0] == pytest.approx(steady.far_field[-1], rel=5e-3)


def test_source_removal_stops_evaporation_and_air_clears():
    """After clean-up the pool stops and the room decays at Q/(K V)."""
    run = indoor_spill("toluene", 298.15, room_volume=100.0, ventilation_rate=0.1,
                       spilled_volume=0.002, source_removed_at=HOUR, duration=4 * HOUR)
    after = run.times > HOUR
    assert np.all(run.evaporation_rate[after] == 0)
    c = run.room[:, 0]
    i, j = np.searchsorted(run.times, [2 * HOUR, 3 * HOUR])
    assert c[j] / c[i] == pytest.approx(np.exp(-0.1 / 100.0 * HOUR), rel=1e-3)


def test_mixture_density_ideal_mixing():
    """1/ρ = Σ w_i/ρ_i (ideal mixing, common practice)."""
    liq = estimator.mixtures.liquid({"toluene": 0.5, "water": 0.5}, basis="mass")
    rho_t = estimator.substance("toluene").liquid_density
    rho_w = estimator.substance("water").liquid_density
    assert liquid_mixture_density(liq) == pytest.approx(1 / (0.5 / rho_t + 0.5 / rho_w))


@pytest.mark.parametrize(
    "kwargs, field",
    [
        (dict(room_volume=-1.0), "room volume"),
        (dict(ventilation_rate=-0.1), "ventilation rate"),
        (dict(mixing_factor=0.5), "mixing factor"),
        (dict(spilled_volume=200.0), "spilled volume"),
        (dict(spilled_volume=None), "spilled volume"),
        (dict(area=0.0), "pool area"),
        (dict(times=[0.0, 10.0, 5.0]), "times"),
        (dict(near_field_volume=1.0), "near field"),
        (dict(near_field_volume=150.0, interzonal_flow=0.1), "near-field volume"),
    ],
)
def test_bad_spill_inputs(kwargs, field):
    """Bad geometry, ventilation, mixing factor or times are refused, naming the field."""
    args = dict(room_volume=100.0, ventilation_rate=0.1, spilled_volume=0.001)
    args.update(kwargs)
    with pytest.raises(InputError) as info:
        indoor_spill("toluene", 298.15, **args)
    assert info.value.field == field


def test_hot_pool_is_refused():
    """A pool above its boiling point is outside the evaporation models."""
    with pytest.raises(OutOfRangeError, match="boil"):
        indoor_spill("n-pentane", 315.0, room_volume=100.0, ventilation_rate=0.1,
                     spilled_volume=0.001)


def test_outdoor_plume_uses_initial_rate():
    """Outdoors: centreline = Q/(π u σy σz) with Q the pool's initial evaporation rate."""
    run = outdoor_spill("toluene", 298.15, [100.0, 500.0], wind_speed=2.0, stability="D",
                        area=50.0)
    g = evaporation_rate("toluene", 298.15, 50.0, 2.0)
    assert run.emission_rate[0] == pytest.approx(g, rel=1e-9)
    np.testing.assert_allclose(run.concentration[:, 0],
                               ground_level_centerline(g, 2.0, [100.0, 500.0], "D"))
    assert any("Britter-McQuaid criterion" in w for w in run.warnings)
