"""Scenario files: validation messages, lossless round trips, and runs of the demos."""

import pytest

from estimator.scenario import (
    ScenarioError,
    dumps_scenario,
    load_scenario,
    loads_scenario,
    save_scenario,
)
from estimator.screening import run_scenario


def test_there_are_three_demo_scenarios(demo_paths):
    """At least three demo scenarios ship with the project."""
    assert len(demo_paths) >= 3


def test_demo_runs_end_to_end(demo_path):
    """Each demo loads, runs without item errors, and labels its limits illustrative."""
    scenario = load_scenario(demo_path)
    result = run_scenario(scenario)
    assert not result.errors
    assert result.tanks or result.spills
    assert all("illustrative" in lim.source for lim in scenario.limits)
    assert result.cautions


def test_round_trip_is_lossless(demo_path, tmp_path):
    """load -> save -> load gives the same scenario, and records the version."""
    first = load_scenario(demo_path)
    target = tmp_path / "copy.toml"
    save_scenario(first, target)
    second = load_scenario(target)
    assert second.document["scenario"]["ullage_version"]
    doc1 = {k: v for k, v in first.document.items() if k != "scenario"}
    doc2 = {k: v for k, v in second.document.items() if k != "scenario"}
    assert doc1 == doc2
    assert (first.tanks, first.spills, first.rooms, first.limits, first.pressure) == \
        (second.tanks, second.spills, second.rooms, second.limits, second.pressure)
    assert dumps_scenario(second) == dumps_scenario(load_scenario(target))


def test_units_us_customary_equal_si(minimal_tank_toml):
    """A tank in gallons and degF equals the same tank in m3 and degC (NIST SP 811)."""
    si = loads_scenario(minimal_tank_toml.replace('"25 degC"', '"35 degC"') + 'volume = "3.785411784 m3"\n')
    us = loads_scenario(minimal_tank_toml.replace('"25 degC"', '"95 degF"') + 'volume = "1000 gal"\n')
    assert si.tanks[0]["temperature"] == pytest.approx(us.tanks[0]["temperature"])
    assert si.tanks[0]["volume"] == pytest.approx(us.tanks[0]["volume"])


@pytest.mark.parametrize(
    "change, where, fragment",
    [
        (("temperature = \"25 degC\"", "temprature = \"25 degC\""), "temprature",
         "did you mean 'temperature'"),
        (("temperature = \"25 degC\"", "temperature = \"25 kg\""), "temperature",
         "not a temperature"),
        (("temperature = \"25 degC\"", "temperature = 25"), "temperature", "has no unit"),
        (("substance = \"toluene\"", "substance = \"tolune\""), "substance",
         "did you mean 'toluene'"),
        (("liquid = \"solvent\"\ntemperature", "liquid = \"solvant\"\ntemperature"), "liquid",
         "did you mean 'solvent'"),
        (("[[tank]]", "[[tanks]]"), "[tanks]", "did you mean 'tank'"),
        (("title = \"t\"", "title = \"t\"\n[conditions]\nelevation = \"-900 m\""), "elevation",
         "-500 m"),
        (("title = \"t\"", "title = 5"), "title", "expected text"),
        (("title = \"t\"", "title = \"t"), "scenario file", "not valid TOML"),
    ],
)
def test_errors_name_the_key_and_line(change, where, fragment, minimal_tank_toml):
    """Bad keys and values raise ScenarioError naming the key (and line) and what to do."""
    text = minimal_tank_toml.replace(*change)
    with pytest.raises(ScenarioError) as info:
        loads_scenario(text)
    assert where in info.value.field
    assert fragment in str(info.value)


def test_error_gives_line_number(minimal_tank_toml):
    """The line of the offending key is reported."""
    text = minimal_tank_toml.replace("temperature = \"25 degC\"", "temperature = \"hot\"")
    with pytest.raises(ScenarioError) as info:
        loads_scenario(text)
    line = next(i + 1 for i, t in enumerate(text.splitlines()) if t.startswith("temperature"))
    assert f"line {line}" in info.value.field


def test_defaults_show_in_assumptions(minimal_tank_toml):
    """Nothing is defaulted silently: sea-level pressure and the OSHA alarms are listed."""
    sc = loads_scenario(minimal_tank_toml)
    text = " ".join(sc.assumptions)
    assert "101.325 kPa" in text and "1910.146" in text and "no exposure limits" in text


def test_user_substance_from_sds_in_a_scenario(minimal_tank_toml):
    """A [[substance]] from SDS values can be used in a liquid and a limit."""
    text = minimal_tank_toml.replace('substance = "toluene"', 'substance = "Thinner Q"') + '''
[[substance]]
name = "Thinner Q"
molar_mass = "100 g/mol"
boiling_point = "115 degC"
vapor_pressure = [["20 degC", "2.5 kPa"]]
lower_flammability_limit = "1.1 %"
upper_flammability_limit = "7 %"

[[limit]]
substance = "Thinner Q"
TWA = "50 ppm"
source = "supplier SDS"
'''
    sc = loads_scenario(text)
    result = run_scenario(sc)
    assert result.tanks[0].comparisons[0].limit.source == "supplier SDS"
    assert float(result.tanks[0].headspace.total_volume_fraction) > 0


def test_limit_without_source_or_unit_is_refused(minimal_tank_toml):
    """A limit needs a source label and a ppm or mg/m3 unit."""
    base = minimal_tank_toml + '[[limit]]\nsubstance = "toluene"\nTWA = "20 ppm"\n'
    with pytest.raises(ScenarioError, match="missing required key 'source'"):
        loads_scenario(base)
    with pytest.raises(ScenarioError, match="ppm or mg/m3"):
        loads_scenario(base.replace('"20 ppm"', '"20 kg"') + 'source = "x"\n')


def test_oversized_and_non_utf8_files(tmp_path, minimal_tank_toml):
    """Huge or non-UTF-8 scenario files are refused with a clear reason."""
    big = tmp_path / "big.toml"
    big.write_bytes(b"#" * 1_100_000)
    with pytest.raises(ScenarioError, match="short text file"):
        load_scenario(big)
    latin = tmp_path / "latin.toml"
    latin.write_bytes(minimal_tank_toml.replace('"t"', '"caf\xe9"').encode("latin-1"))
    with pytest.raises(ScenarioError, match="UTF-8"):
        load_scenario(latin)


def test_item_failure_keeps_the_rest(minimal_tank_toml):
    """A tank that cannot be computed is reported; the others still run."""
    text = minimal_tank_toml + '''
[[tank]]
name = "B"
liquid = "solvent"
temperature = "700 degC"
'''
    result = run_scenario(loads_scenario(text))
    assert [t.name for t in result.tanks] == ["A"]
    assert result.errors[0][0] == "tank B" and "critical" in result.errors[0][1]


def test_uncertain_inputs_run_monte_carlo(minimal_tank_toml):
    """A distribution in the file gives percentiles and exceedance probabilities, seeded."""
    text = minimal_tank_toml + '''
[[limit]]
substance = "toluene"
TWA = "20 ppm"
source = "x"

[[uncertain]]
item = "A"
input = "temperature"
distribution = { uniform = ["15 degC", "35 degC"] }

[monte_carlo]
samples = 2000
seed = 11
'''
    first = run_scenario(loads_scenario(text)).tanks[0].monte_carlo
    again = run_scenario(loads_scenario(text)).tanks[0].monte_carlo
    assert first.seed == 11 and first.n == 2000
    assert first.percentiles["total_ppm"][95] == again.percentiles["total_ppm"][95]
    assert 0 <= first.exceedance["TWA 20 ppm (x)"] <= 1


@pytest.mark.parametrize(
    "block, field, fragment",
    [
        ('item = "Z"\ninput = "temperature"\ndistribution = { uniform = ["1 degC", "2 degC"] }',
         "item", "no tank or spill"),
        ('item = "A"\ninput = "colour"\ndistribution = { uniform = ["1 degC", "2 degC"] }',
         "input", "cannot be uncertain"),
        ('item = "A"\ninput = "temperature"\ndistribution = { uniform = ["5 degC", "2 degC"] }',
         "distribution", "high"),
        ('item = "A"\ninput = "temperature"\ndistribution = { wobbly = ["5 degC"] }',
         "distribution", "uniform"),
    ],
)
def test_bad_uncertain_inputs(block, field, fragment, minimal_tank_toml):
    """Bad uncertain-input tables name the key and what to do."""
    with pytest.raises(ScenarioError) as info:
        loads_scenario(minimal_tank_toml + "\n[[uncertain]]\n" + block + "\n")
    assert field in info.value.field
    assert fragment in str(info.value)


def test_short_run_twa_is_flagged_as_a_lower_bound(minimal_tank_toml):
    """A spill run shorter than the shift says its TWA is a lower bound."""
    text = minimal_tank_toml + '''
[[room]]
name = "r"
volume = "200 m3"
air_changes = "1 1/h"
mixing_factor = 2

[[spill]]
name = "s"
liquid = "solvent"
volume = "5 L"
temperature = "22 degC"
room = "r"
duration = "1 h"

[[limit]]
substance = "toluene"
TWA = "20 ppm"
source = "x"
'''
    result = run_scenario(loads_scenario(text))
    assert any("a lower bound" in f for f in result.spills[0].findings)


def test_no_lfl_is_not_reported_below_the_alarm(minimal_tank_toml):
    """A liquid with no LFL on record is not said to be below the LFL alarm."""
    result = run_scenario(loads_scenario(minimal_tank_toml.replace('"toluene"', '"water"')))
    text = " ".join(result.tanks[0].findings)
    assert "Not compared with the LFL alarm" in text
    assert "below the 10 % LFL" not in text


def test_purge_finding_states_its_assumption(minimal_tank_toml):
    """The purge time says it assumes a drained tank and that measurement follows."""
    text = minimal_tank_toml + 'volume = "10 m3"\nfill = "40 %"\npurge_rate = "0.2 m3/s"\n' \
        'purge_target = "10 ppm"\n'
    tank = run_scenario(loads_scenario(text)).tanks[0]
    assert any("measure before entry" in f and "drained" in f for f in tank.findings)
    assert any("drained and cleaned" in f and "whole 10 m³" in f for f in tank.findings)
