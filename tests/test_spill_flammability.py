"""Flammability and oxygen verdicts for indoor spills, zone by zone and over time."""

import json

import numpy as np
import pytest

from estimator.cli import main
from estimator.exposure import zone_flammability
from estimator.headspace import air_flammability
from estimator.report import html_report, markdown_report, result_to_dict, results_csv
from estimator.scenario import loads_scenario
from estimator.screening import run_scenario
from estimator.substances import substance
from outside_references import reference_saturation_pressure

STORE_ROOM = """
[scenario]
title = "Solvent store, drum knocked over (invented)"

[[liquid]]
name = "solvent"
substance = "{liquid}"

[[room]]
name = "store"
volume = "30 m3"
{ventilation}
mixing_factor = 3
air_speed = "0.2 m/s"
{two_zone}

[[spill]]
name = "drum"
liquid = "solvent"
volume = "{volume}"
area = "{area}"
temperature = "22 degC"
room = "store"
duration = "{duration}"
"""

FLAMMABILITY_KEYS = ["zone", "peak_percent_lfl", "peak_time_s", "above_alarm_from_s",
                     "back_below_alarm_s", "above_lfl_from_s", "back_below_lfl_s",
                     "lowest_oxygen_percent", "below_oxygen_alarm_from_s"]


def _store(liquid="toluene", ventilation='air_changes = "1 1/h"', two_zone="",
           volume="20 L", area="2 m2", duration="4 h"):
    text = STORE_ROOM.format(liquid=liquid, ventilation=ventilation, two_zone=two_zone,
                             volume=volume, area=area, duration=duration)
    return run_scenario(loads_scenario(text))


def test_le_chatelier_worked_example():
    """Crowl & Louvar, Chemical Process Safety, example of a gas mixture (from memory):
    0.8 % hexane (LFL 1.2 %), 2.0 % methane (5.3 %), 0.5 % ethylene (3.1 %) in air has
    a mixture LFL of 2.74 %, so the 3.3 % of fuel is within the flammable range."""
    air = air_flammability([0.008, 0.020, 0.005], ([0.012, 0.053, 0.031],
                                                    [0.075, 0.15, 0.32]))
    assert float(air.lfl_mixture) == pytest.approx(0.0274, abs=5e-5)
    assert float(air.percent_lfl) == pytest.approx(3.3 / 2.74 * 100, rel=2e-3)
    assert str(air.state) == "flammable"


def test_oxygen_by_displacement_follows_the_meter_convention():
    """10 % of vapour leaves 90 % of the air: 0.9 x 20.9 % = 18.81 % oxygen (the oxygen
    meter's fresh-air figure, common practice); pure vapour gives 0 %, never less."""
    air = air_flammability([[0.10, 1.0, 1.2]], ([np.nan], [np.nan]))
    np.testing.assert_allclose(air.oxygen_percent, [18.81, 0.0, 0.0])
    assert not air.judged and set(air.state.ravel()) == {"none"}


def test_zone_verdicts_on_a_piecewise_linear_series():
    """Crossing times are those of the straight lines between samples (common
    practice for sampled series): 10 % is passed at 12 s on 0 -> 50 % over 60 s."""
    z = zone_flammability("room", [0, 60, 120, 180, 240], [0, 50, 150, 50, 5],
                          [20.9, 20.0, 19.0, 19.8, 20.9])
    assert z.above_alarm_from == pytest.approx(12.0)
    assert z.back_below_alarm == pytest.approx(180 + 60 * 40 / 45)
    assert z.above_lfl_from == pytest.approx(90.0)
    assert z.back_below_lfl == pytest.approx(150.0)
    assert z.peak_percent_lfl == 150 and z.peak_time == 120
    assert z.lowest_oxygen == 19.0
    assert z.below_oxygen_alarm_from == pytest.approx(60 + 60 * 0.5 / 1.0)


@pytest.mark.requires_coolprop
def test_store_room_spill_passes_the_lfl_and_says_so():
    """A 20 L toluene spill in a 30 m3 store with one air change an hour: the room
    passes the LFL (the saturated vapour at 22 degC, 3.3 kPa by CoolProp, is three
    times the 1.1 % LFL), and the findings say so before the exposure findings."""
    result = _store()
    spill = result.spills[0]
    (zone,) = spill.flammability
    assert zone.zone == "room"
    assert zone.peak_percent_lfl > 100
    assert zone.above_alarm_from < zone.above_lfl_from
    first = next(i for i, f in enumerate(spill.findings) if "LFL" in f)
    exposure = [i for i, f in enumerate(spill.findings) if "TWA" in f or "ppm" in f]
    assert not exposure or first < min(exposure)
    assert "Remove ignition sources" in spill.findings[first]
    assert spill.exceeded
    # never above the saturated vapour: % LFL at most y_sat / LFL
    p_sat = float(reference_saturation_pressure("108-88-3", 295.15)[0])
    lfl = substance("toluene").lower_flammability_limit
    assert zone.peak_percent_lfl <= 100 * p_sat / 101325.0 / lfl * 1.02


@pytest.mark.requires_coolprop
def test_closed_room_oxygen_falls_to_the_saturated_value():
    """Acetone in a closed 30 m3 room saturates it: the oxygen falls towards
    20.9 x (1 - p_sat/P), with p_sat at 22 degC from CoolProp's reference equation of
    state, passes below the 19.5 % alarm, and the air goes above the UFL (too rich)."""
    result = _store("acetone", ventilation='air_changes = "0 1/h"', volume="60 L",
                    area="6 m2", duration="8 h")
    (zone,) = result.spills[0].flammability
    p_sat = float(reference_saturation_pressure("67-64-1", 295.15)[0])
    saturated_oxygen = 20.9 * (1 - p_sat / 101325.0)
    assert zone.lowest_oxygen == pytest.approx(saturated_oxygen, abs=0.3)
    assert zone.below_oxygen_alarm_from is not None
    assert zone.rich_from is not None
    text = " ".join(result.spills[0].findings)
    assert "oxygen falls below the 19.5 % alarm" in text
    assert "too rich" in text


def test_two_zone_model_gives_near_and_far_field():
    """The two-zone model judges the near field and the far field separately; the
    near field, where the vapour is made, is never leaner than the far field."""
    result = _store(two_zone='near_field_radius = "1 m"\nrandom_air_speed = "0.1 m/s"')
    zones = {z.zone: z for z in result.spills[0].flammability}
    assert set(zones) == {"near field", "far field"}
    assert zones["near field"].peak_percent_lfl >= zones["far field"].peak_percent_lfl
    assert zones["near field"].above_alarm_from <= zones["far field"].above_alarm_from


def test_no_lfl_on_record_is_not_judged_not_safe():
    """A liquid with no flammability limit on record is 'not judged', never below the
    alarm (common practice: absence of data is not absence of hazard)."""
    result = _store("propylene glycol", volume="5 L")
    (zone,) = result.spills[0].flammability
    assert not zone.judged and zone.peak_percent_lfl is None
    assert any("not judged" in f for f in result.spills[0].findings)


def test_json_flammability_keys_are_exact():
    """`spills[i].flammability` holds one object per zone with the promised keys, and
    null where an event never happens."""
    data = json.loads(json.dumps(result_to_dict(_store())))
    (zone,) = data["spills"][0]["flammability"]
    assert list(zone)[:len(FLAMMABILITY_KEYS)] == FLAMMABILITY_KEYS
    assert zone["zone"] == "room" and zone["peak_percent_lfl"] > 100
    assert zone["below_oxygen_alarm_from_s"] is None or zone["below_oxygen_alarm_from_s"] > 0


def test_reports_and_summary_carry_the_flammability_figures(tmp_path, capsys):
    """The HTML, Markdown and CSV reports and the terminal summary show the verdicts."""
    result = _store()
    assert "Flammability and oxygen by zone" in html_report(result)
    assert "Flammability and oxygen by zone" in markdown_report(result)
    assert "% of the LFL by time" in html_report(result)
    csv_text = results_csv(result)
    assert "highest % of LFL" in csv_text and "above the LFL from" in csv_text
    path = tmp_path / "store.toml"
    path.write_text(STORE_ROOM.format(liquid="toluene", ventilation='air_changes = "1 1/h"',
                                      two_zone="", volume="20 L", area="2 m2",
                                      duration="4 h"), encoding="utf-8")
    assert main(["run", str(path)]) == 0
    out = " ".join(capsys.readouterr().out.split())
    assert "passes 10 % of the LFL" in out and "within the flammable range from" in out


def test_monte_carlo_gives_peak_percent_lfl_and_alarm_probability():
    """The probabilistic indoor chain reports the percentiles of the peak % LFL and
    the probability that the peak reaches the LFL alarm; acetone's LFL is 2.5 % by
    volume (IEC 60079-20-1, from memory), so % LFL = ppm / 250."""
    from estimator.uncertainty import Uniform, indoor_spill_monte_carlo

    mc = indoor_spill_monte_carlo("acetone", 295.15, Uniform(1.0, 6.0), 0.15, 200.0, 0.1,
                                  3.0, 20.0, n=2000, seed=5, lfl_alarm=10.0)
    percent = mc.outputs["peak_percent_lfl"]
    np.testing.assert_allclose(percent, mc.outputs["peak_ppm"] / 250.0, rtol=1e-9)
    assert mc.exceedance["10 % LFL alarm"] == pytest.approx(float(np.mean(percent >= 10.0)))
    assert 0.0 < mc.exceedance["10 % LFL alarm"] <= 1.0
    assert mc.percentiles["peak_percent_lfl"][95] >= mc.percentiles["peak_percent_lfl"][50]
