"""Outdoor verdicts: saturation cap, distances to the LFL and the alarm, Britter-McQuaid."""

import math

import numpy as np
import pytest

import estimator
from estimator.errors import InputError
from estimator.outdoor import (
    BRITTER_MCQUAID_CONTINUOUS,
    britter_mcquaid_continuous,
    ground_level_centerline,
    pool_source_criterion,
)
from estimator.spill import outdoor_spill

from outside_references import optional_module

CP = optional_module("CoolProp.CoolProp")


def test_britter_mcquaid_burro_inputs():
    """Burro LNG trial inputs as given in the CCPS (1999) Guidelines for Consequence
    Analysis worked example (0.23 m3/s of liquid at 425.6 kg/m3, vapour 1.76 kg/m3, air
    1.225 kg/m3, 10.9 m/s at 10 m): by hand from the published formula, q0 = 97.888/1.76
    = 55.62 m3/s, g0' = 9.80665 x 0.535/1.225 = 4.283 m/s2, Dc = (q0/U)^0.5 = 2.259 m,
    (g0' q0/Dc)^(1/3)/U = 0.4334: dense (a hand computation, not a published result)."""
    q0 = 0.23 * 425.6 / 1.76
    g0 = 9.80665 * (1.76 - 1.225) / 1.225
    value = britter_mcquaid_continuous(g0, q0, 10.9)
    assert value == pytest.approx(0.4334, abs=5e-4)
    assert value >= BRITTER_MCQUAID_CONTINUOUS == 0.15


def test_britter_mcquaid_source_dimension_and_light_gas():
    """A given source dimension D enters as D^(-1/3); a gas lighter than air gives 0."""
    base = britter_mcquaid_continuous(1.0, 8.0, 2.0, source_dimension=1.0)
    assert base == pytest.approx(2.0 / 2.0)  # (1 x 8 / 1)^(1/3) / 2
    assert britter_mcquaid_continuous(1.0, 8.0, 2.0, source_dimension=8.0) == pytest.approx(
        base / 2.0)
    assert britter_mcquaid_continuous(-2.0, 8.0, 2.0) == 0.0


def test_pool_source_uses_saturated_mixture_density():
    """The source gas is the saturated air-vapour mixture: its density is that of y_sat
    vapour in air (ideal gas, air 28.9644 g/mol), not the pure vapour's."""
    y = 0.03
    crit = pool_source_criterion(0.1, y, 0.092, 298.15, 101325.0, 2.0)
    rho_air = 101325.0 * 0.0289644 / (8.314462618 * 298.15)
    assert crit.air_density == pytest.approx(rho_air, rel=1e-9)
    assert crit.mixture_density == pytest.approx(rho_air * (1 + y * (0.092 / 0.0289644 - 1)),
                                                 rel=1e-9)
    assert crit.volume_rate == pytest.approx(0.1 * 8.314462618 * 298.15 / 101325.0 / y)


def test_passive_pool_gets_no_dense_gas_warning():
    """A small, slowly evaporating pool in a fresh wind: criterion below 0.15, no dense-gas
    warning (the old molar-mass rule warned for every vapour heavier than air)."""
    run = outdoor_spill("n-decane", 288.15, [100.0], wind_speed=6.0, stability="D", area=1.0)
    assert not run.dense_gas.dense and run.dense_gas.value < 0.15
    assert not any("use a dense-gas model" in w for w in run.warnings)
    assert any(f"= {run.dense_gas.value:.2g}" in w for w in run.warnings)


@pytest.mark.requires_coolprop
def test_large_pool_at_night_never_above_saturation():
    """A large acetone pool under stable night air (class F, 1.5 m/s): the centreline at
    the pool edge and a few metres downwind is at most acetone's saturated vapour
    fraction, p_sat/P with p_sat from CoolProp (within the 1 % of the method), and the
    cap is stated with its distance."""
    run = outdoor_spill("acetone", 293.15, [2.0, 5.0, 20.0, 100.0], wind_speed=1.5,
                        stability="F", area=200.0)
    y_sat = CP.PropsSI("P", "T", 293.15, "Q", 0, "Acetone") / 101325.0
    assert np.all(run.volume_fraction <= y_sat * 1.01)
    assert run.capped_until is not None and run.capped_until > run.pool_edge
    assert any("capped at the saturated" in w and f"{run.capped_until:,.0f} m" in w
               for w in run.warnings)
    uncapped = ground_level_centerline(run.emission_rate[0], 1.5, 2.0, "F")
    assert uncapped * 8.314462618 * 293.15 / (0.05808 * 101325.0) > 1.0  # the old defect


def test_mixture_cap_per_component_and_total():
    """Each component at most its Raoult partial pressure / P; the total at most the sum."""
    run = outdoor_spill({"acetone": 0.5, "toluene": 0.5}, 293.15, [1.0, 3.0], wind_speed=1.0,
                        stability="F", area=300.0, basis="mole")
    assert np.all(run.volume_fraction <= run.saturation_volume_fraction[None, :] + 1e-15)
    assert np.all(run.volume_fraction.sum(axis=1)
                  <= run.saturation_volume_fraction.sum() + 1e-15)


def _le_chatelier_distance(run, fraction, lfl):
    """Independent solve: the distance where sum_i y_i(x)/LFL_i = fraction, with
    y_i(x) = G_i R T / (M_i P) / (pi u sigma_y sigma_z) (Turner 1970 Eq. 3.4, H = 0) and
    Le Chatelier's rule (Mashuga & Crowl 2000), by bisection on a log grid."""
    import warnings

    from scipy.optimize import brentq

    def f(log_x):
        x = math.exp(log_x)
        y = [float(ground_level_centerline(g, run.wind_speed, x, run.stability))
             * 8.314462618 * 293.15 / (m * 101325.0) for g, m in zip(run.emission_rate, lfl[1])]
        return sum(yi / li for yi, li in zip(y, lfl[0])) - fraction

    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # distances under 100 m, flagged in the run
        return math.exp(brentq(f, math.log(run.capped_until or run.pool_edge) + 1e-9,
                               math.log(1e5)))


def test_distances_to_lfl_and_alarm_by_le_chatelier():
    """Acetone-toluene pool: the distances to the LFL and to the 10 % alarm agree with an
    independent Le Chatelier solve on the plume formula within 0.1 %."""
    liquid = {"acetone": 0.5, "toluene": 0.5}
    run = outdoor_spill(liquid, 293.15, [100.0], wind_speed=2.0, stability="D", area=20.0,
                        basis="mole")
    subs = [estimator.substance("acetone"), estimator.substance("toluene")]
    lfl = ([s.lower_flammability_limit for s in subs], [s.molar_mass for s in subs])
    assert run.distance_to_lfl == pytest.approx(_le_chatelier_distance(run, 1.0, lfl),
                                                rel=1e-3)
    assert run.distance_to_lfl_alarm == pytest.approx(_le_chatelier_distance(run, 0.1, lfl),
                                                      rel=1e-3)
    assert run.distance_to_lfl_alarm > run.distance_to_lfl
    assert any("under 100 m" in f for f in run.lfl_flags)


def test_lfl_never_reached_is_none():
    """n-decane at 5 degC: the saturated vapour (about 0.04 kPa) is far below its LFL, so
    the centreline never reaches it: None, also for a 10 % alarm."""
    run = outdoor_spill("n-decane", 278.15, [100.0], wind_speed=2.0, stability="F",
                        area=500.0, lfl_alarm_percent=10.0)
    assert run.distance_to_lfl is None
    assert run.percent_lfl[0] < 100.0


@pytest.mark.parametrize("value, fragment", [(0.0, "positive"), (150.0, "above 100 %"),
                                             ("ten", "expected a number")])
def test_bad_lfl_alarm(value, fragment):
    """An LFL alarm that is not a percentage in (0, 100] is refused, naming the field."""
    with pytest.raises(InputError, match=fragment) as info:
        outdoor_spill("toluene", 293.15, [100.0], wind_speed=2.0, stability="D", area=1.0,
                      lfl_alarm_percent=value)
    assert info.value.field == "LFL alarm"


SCENARIO = """
[scenario]
title = "Yard spill"
site = "invented"

[conditions]
barometric_pressure = "101.325 kPa"

[[liquid]]
name = "acetone"
substance = "acetone"

[[spill]]
name = "yard"
liquid = "acetone"
volume = "200 L"
temperature = "20 degC"
outdoors = true
duration = "1 h"

[outdoors]
wind_speed = "1.5 m/s"
daytime = false
cloud_cover = 1
terrain = "open"
receptors = ["100 m", "300 m"]
"""


def test_scenario_reports_lfl_distances_everywhere():
    """The JSON keys the issue names, and the same figures in the findings, the HTML,
    Markdown and CSV reports; the plot starts at the pool's edge."""
    from estimator.report import (
        _spill_plots,
        html_report,
        markdown_report,
        result_to_dict,
        results_csv,
    )

    result = estimator.run_scenario(estimator.loads_scenario(SCENARIO))
    spill = result.spills[0]
    od = result_to_dict(result)["spills"][0]["outdoor"]
    assert od["distance_to_lfl_m"] == pytest.approx(spill.outdoor.distance_to_lfl)
    assert od["distance_to_lfl_alarm_m"] == pytest.approx(spill.outdoor.distance_to_lfl_alarm)
    assert od["dense_gas"]["threshold"] == 0.15
    d = f"{spill.outdoor.distance_to_lfl_alarm:,.0f} m"
    assert any("10 % of the LFL" in f and d in f for f in spill.findings)
    for text in (markdown_report(result), html_report(result)):
        assert "Distance to the LFL alarm (10 % LFL)" in text and d in text
    assert "distance to the LFL alarm (10 % LFL)" in results_csv(result)
    plot = _spill_plots(result, 0, spill)[0]
    assert "logarithmic x axis" in plot.svg and "LFL alarm" in plot.svg


def test_screening_validity_refuses_a_bare_density_ratio():
    """The old density-ratio argument is refused with what to give instead."""
    from estimator.outdoor import screening_validity

    with pytest.raises(InputError, match="pool_source_criterion") as info:
        screening_validity(2.0, 200.0, 3.2)
    assert info.value.field == "dense_gas"


def test_log_distance_axis_places_decades_evenly():
    """On the logarithmic x axis, 10 m sits halfway between 1 m and 100 m (common
    practice for a log scale), and the decades are labelled."""
    import re

    from estimator.plots import line_plot_svg

    svg = line_plot_svg([1.0, 10.0, 100.0], {"c": [3.0, 2.0, 1.0]}, x_label="x [m]",
                        y_label="ppm", title="t", log_x=True)
    path = re.search(r'<path d="M([^"]+)"', svg).group(1)
    xs = [float(p.split(",")[0]) for p in path.split(" L")]
    assert xs[1] - xs[0] == pytest.approx(xs[2] - xs[1], abs=0.01)
    assert "logarithmic x axis" in svg and ">100<" in svg
