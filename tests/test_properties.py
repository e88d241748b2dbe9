"""Property-based tests (hypothesis): physical laws every result must obey."""

import math
import warnings

import numpy as np
import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

import estimator
from estimator.headspace import headspace
from estimator.indoor import steady_state_concentration, well_mixed_room
from estimator.scenario import dumps_scenario, loads_scenario
from estimator.units import convert, parse_quantity

SETTINGS = settings(max_examples=60, deadline=None,
                    suppress_health_check=[HealthCheck.too_slow])
KEYS = [s.key for s in estimator.all_substances()]


def liquid_range(sub):
    lo = max(sub.melting_point or 0.0, 150.0) + 1.0
    hi = min(sub.critical_temperature - 1.0, 600.0)
    return lo, hi


@SETTINGS
@given(key=st.sampled_from(KEYS), a=st.floats(0, 1), b=st.floats(0, 1))
def test_vapor_pressure_increases_with_temperature(key, a, b):
    """p_sat(T) rises with T for every substance, across the whole liquid range."""
    sub = estimator.substance(key)
    lo, hi = liquid_range(sub)
    t1, t2 = sorted((lo + a * (hi - lo), lo + b * (hi - lo)))
    assume(t2 - t1 > 1e-3)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        assert estimator.vapor_pressure(sub, t2) > estimator.vapor_pressure(sub, t1)


#: Where the best-method choice changes correlation (common practice: a vapour pressure
#: rises with temperature everywhere in the liquid range): the edge of toluene's
#: Antoine set (286.44 K, to DIPPR-101, blended over 5 K inside the edge), and points
#: beyond the end of a fitted set (trichloroethylene's DIPPR-101 ends at 456.84 K,
#: isobutanol's begins at 233.15 K), where it is extrapolated rather than replaced.
#: The random property above finds such points only now and then.
METHOD_BOUNDARIES = [("toluene", 286.44), ("toluene", 409.61),
                     ("trichloroethylene", 466.84), ("isobutanol", 223.15)]


@pytest.mark.parametrize("key, boundary", METHOD_BOUNDARIES,
                         ids=[f"{c[0]}-{c[1]}" for c in METHOD_BOUNDARIES])
def test_vapor_pressure_rises_across_method_boundaries(key, boundary):
    """p_sat rises across each point where the best method changes (0.1 K steps)."""
    sub = estimator.substance(key)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        p = [estimator.vapor_pressure(sub, boundary + d)
             for d in (-5.05, -4.95, -0.15, -0.05, 0.05, 0.15, 10.05)]
    assert np.all(np.diff(p) > 0), p


@st.composite
def mixtures(draw):
    keys = draw(st.lists(st.sampled_from(KEYS), min_size=1, max_size=4, unique=True))
    weights = draw(st.lists(st.floats(0.01, 1.0), min_size=len(keys), max_size=len(keys)))
    total = sum(weights)
    return {k: w / total for k, w in zip(keys, weights)}


def _common_temperature(mix, fraction):
    subs = [estimator.substance(k) for k in mix]
    lo = max(liquid_range(s)[0] for s in subs)
    hi = min(liquid_range(s)[1] for s in subs)
    assume(hi > lo)
    return lo + fraction * (hi - lo)


@SETTINGS
@given(mix=mixtures(), fraction=st.floats(0, 1), pressure=st.floats(5e4, 3e5))
def test_concentrations_within_bounds_and_oxygen_never_rises(mix, fraction, pressure):
    """0 <= ppm <= 1e6, %LFL >= 0, and oxygen at or below fresh air's 20.9 %."""
    t = _common_temperature(mix, fraction)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        hs = headspace(mix, t, pressure)
    assert np.all(hs.ppm >= 0) and 0 <= float(hs.total_ppm) <= 1e6 * (1 + 1e-12)
    assert float(hs.percent_lfl) >= 0
    assert float(hs.oxygen_percent) <= 20.9 + 1e-9


@SETTINGS
@given(mix=mixtures(), fraction=st.floats(0, 1), extra=st.floats(1e-3, 0.5))
def test_adding_vapour_never_raises_oxygen(mix, fraction, extra):
    """A warmer liquid (more vapour) never leaves more oxygen."""
    t = _common_temperature(mix, fraction)
    subs = [estimator.substance(k) for k in mix]
    hi = min(liquid_range(s)[1] for s in subs)
    t2 = min(t + extra * 50.0, hi)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        cold, warm = headspace(mix, t), headspace(mix, t2)
    assert float(warm.oxygen_percent) <= float(cold.oxygen_percent) + 1e-12


@SETTINGS
@given(key=st.sampled_from(KEYS), other=st.sampled_from(KEYS), fraction=st.floats(0, 1))
def test_mixture_with_mole_fraction_one_is_the_pure_liquid(key, other, fraction):
    """A mixture with one mole fraction 1 (the other 0) equals the pure-liquid result."""
    assume(key != other)
    t = _common_temperature({key: 1.0, other: 0.0}, fraction)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        pure = headspace(key, t)
        mix = headspace({key: 1.0, other: 0.0}, t)
    assert float(mix.total_volume_fraction) == pytest.approx(float(pure.total_volume_fraction),
                                                            rel=1e-12)
    assert float(mix.percent_lfl) == pytest.approx(float(pure.percent_lfl), rel=1e-12)


@SETTINGS
@given(g=st.floats(1e-7, 1e-2), v=st.floats(1.0, 1e4), q=st.floats(1e-3, 10.0),
       k=st.floats(1.0, 10.0), hours=st.floats(0.01, 24.0))
def test_room_never_exceeds_steady_state_from_zero(g, v, q, k, hours):
    """A constant source from zero never exceeds G K / Q."""
    t = np.linspace(0.0, hours * 3600.0, 50)
    c = well_mixed_room(g, v, q, t, mixing_factor=k)
    steady = steady_state_concentration(g, q, k)
    assert np.all(c <= steady * (1 + 1e-12))
    assert np.all(np.diff(c) >= -1e-12 * steady)


@SETTINGS
@given(mass=st.floats(0.05, 5.0), area=st.floats(0.1, 5.0),
       speed=st.floats(0.1, 2.0), t=st.floats(283.15, 303.15))
def test_pool_evaporation_conserves_mass(mass, area, speed, t):
    """Mixture pool: remaining + evaporated = initial, to 1e-6."""
    from estimator.evaporation import mixture_pool

    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        run = mixture_pool(["acetone", "toluene"], [mass / 2, mass / 2], t, area, speed,
                           t_end=4 * 3600.0)
    assert run.mass_balance_error < 1e-6


@SETTINGS
@given(value=st.floats(1e-3, 1e6), unit=st.sampled_from(
    [("Pa", "psi"), ("Pa", "mmHg"), ("m**3", "gallon"), ("m", "ft"), ("K", "degF"),
     ("K", "degC"), ("m**3/s", "ft**3/min"), ("kg/m**3", "mg/m**3")]))
def test_unit_conversions_round_trip(value, unit):
    """SI -> other -> SI returns the value."""
    si, other = unit
    there = convert(value, si, other)
    assert convert(there, other, si) == pytest.approx(value, rel=1e-9, abs=1e-9)


@SETTINGS
@given(number=st.floats(0.001, 1e5), unit=st.sampled_from(["m", "ft", "km", "inch"]))
def test_parse_quantity_matches_convert(number, unit):
    """Text parsing agrees with numeric conversion."""
    assert parse_quantity(f"{number!r} {unit}", "length", "x") == pytest.approx(
        convert(number, unit, "m"), rel=1e-12)


text = st.text(st.characters(blacklist_categories=("Cs", "Cc")), min_size=1, max_size=30)


@SETTINGS
@given(title=text, site=text, volume=st.floats(0.1, 1e4), fill=st.floats(0, 0.99),
       temp=st.floats(-20, 60), key=st.sampled_from(["toluene", "acetone", "n-hexane"]),
       ppm=st.floats(0.01, 1e4), source=text)
def test_scenario_save_load_round_trips(title, site, volume, fill, temp, key, ppm, source):
    """Generated scenarios survive save and load unchanged."""
    assume(title.strip() and source.strip())
    doc = {
        "scenario": {"title": title, "site": site},
        "liquid": [{"name": "L", "substance": key}],
        "tank": [{"name": "T", "liquid": "L", "volume": f"{volume!r} m3",
                  "fill": f"{100 * fill!r} %", "temperature": f"{temp!r} degC"}],
        "limit": [{"substance": key, "TWA": f"{ppm!r} ppm", "source": source}],
    }
    first = loads_scenario(dumps_scenario(doc))
    second = loads_scenario(dumps_scenario(first))
    assert dict(first.document) == dict(second.document)
    assert first.tanks == second.tanks and first.limits == second.limits
    assert first.title == title.strip()
    assert math.isclose(first.tanks[0]["volume"], volume, rel_tol=1e-12)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(key=st.sampled_from(["acetone", "toluene", "methanol", "n-hexane", "ethyl-acetate"]),
       litres=st.floats(0.1, 200.0), room=st.floats(20.0, 5000.0), ach=st.floats(0.0, 12.0),
       k=st.floats(1.0, 10.0), speed=st.floats(0.05, 1.0), t=st.floats(278.15, 303.15),
       pressure=st.floats(8e4, 1.05e5))
def test_indoor_spill_always_solves_conserves_mass_and_stays_below_saturation(
        key, litres, room, ach, k, speed, t, pressure):
    """Any ordinary spill solves, conserves mass, and never exceeds saturation."""
    from estimator.spill import indoor_spill

    assume(litres / 1000.0 < room / 10)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        run = indoor_spill(key, t, room_volume=room, ventilation_rate=room * ach / 3600.0,
                           spilled_volume=litres / 1000.0, mixing_factor=k, air_speed=speed,
                           duration=8 * 3600.0, pressure=pressure)
    assert run.mass_balance_error < 1e-6
    assert np.all(run.room <= run.saturation * (1 + 1e-6))
