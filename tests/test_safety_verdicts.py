"""Answers that must be on the safe side: purge volume, limits, units, data bounds."""

import math

import pytest

from estimator.errors import InputError
from estimator.limits import additive_index, additive_terms, compare, exposure_limit
from estimator.scenario import loads_scenario
from estimator.screening import run_scenario
from outside_references import reference_saturation_pressure

TANK = """
[scenario]
title = "purge check (invented)"

[[liquid]]
name = "toluene"
substance = "toluene"

[[tank]]
name = "T-1"
liquid = "toluene"
volume = "10 m3"
fill = "40 %"
temperature = "25 degC"
purge_rate = "0.1 m3/s"
purge_mixing_factor = 3
purge_target = "10 ppm"
"""


@pytest.mark.requires_coolprop
def test_drained_tank_purges_the_whole_tank_volume():
    """Dilution purge t = K V / Q ln(C0 / C) (ACGIH Industrial Ventilation, dilution
    chapter; common practice) with V the whole 10 m3 of a drained tank, not the 6 m3
    vapour space above the liquid, and C0 the saturated toluene vapour at 25 degC
    (CoolProp's reference equation of state)."""
    tank = run_scenario(loads_scenario(TANK)).tanks[0]
    p_sat = float(reference_saturation_pressure("108-88-3", 298.15)[0])
    expected = 3 * 10.0 / 0.1 * math.log(p_sat / 101325.0 / 10e-6)
    assert tank.purge.case == "drained"
    assert tank.purge.volume == pytest.approx(10.0)
    assert tank.purge.time == pytest.approx(expected, rel=0.01)
    assert any("drained and cleaned tank" in f for f in tank.findings)


@pytest.mark.requires_coolprop
def test_tank_holding_liquid_purges_its_vapour_space_with_a_floor():
    """With liquid left in the tank the vapour space (6 m3) is purged while the liquid
    evaporates, so the time is at least K V_space / Q ln(C0 / C) and the case says so."""
    text = TANK + 'residual_area = "1 m2"\n'
    tank = run_scenario(loads_scenario(text)).tanks[0]
    p_sat = float(reference_saturation_pressure("108-88-3", 298.15)[0])
    no_floor = 3 * 6.0 / 0.1 * math.log(p_sat / 101325.0 / 10e-6)
    assert tank.purge.case == "holding liquid"
    assert tank.purge.volume == pytest.approx(6.0)
    assert not tank.purge.reachable or tank.purge.time >= no_floor * 0.999
    assert any("still holding liquid" in f for f in tank.findings)


def test_additive_index_counts_each_substance_once_with_its_lowest_limit():
    """US 29 CFR 1910.1000(d)(2)(i): E = sum C_i / L_i over the substances. Two TWAs for
    toluene (a regulatory 100 ppm and an advisory 20 ppm, illustrative) count once,
    with the lower: 10 ppm toluene and 50 ppm xylene (TWA 100 ppm) give
    10/20 + 50/100 = 1.0, not 1.1."""
    limits = [exposure_limit("toluene", "TWA", 100, "ppm", "illustrative regulatory"),
              exposure_limit("toluene", "TWA", 20, "ppm", "illustrative advisory"),
              exposure_limit("o-xylene", "TWA", 100, "ppm", "illustrative")]
    conc = {"toluene": 10e-6, "o-xylene": 50e-6}
    assert additive_index(conc, limits) == pytest.approx(1.0)
    terms = additive_terms(conc, limits)
    used = {key: lim.source for key, lim, _ in terms.terms}
    assert used["toluene"] == "illustrative advisory"
    assert "lowest TWA" in terms.statement
    # every limit is still compared on its own
    assert len(compare(conc, limits)) == 3


def test_mass_limit_is_compared_at_actual_conditions():
    """A limit in mg/m3 is a mass concentration: at 35 degC and 83.4 kPa (about 1600 m,
    US Standard Atmosphere 1976) 100 ppm of toluene is 100e-6 x P M / (R T) =
    300 mg/m3 (ideal gas), so against a 300 mg/m3 limit the ratio is 1.0, not the
    1.23 the 24.45 L/mol conversion would give."""
    lim = exposure_limit("toluene", "TWA", 300.0, "mg/m3", "illustrative")
    t, p = 308.15, 83400.0
    mass = 100e-6 * p * 0.092138 / (8.314462618 * t) * 1e6
    (cmp,) = compare({"toluene": 100e-6}, [lim], t, p)
    assert cmp.ratio == pytest.approx(mass / 300.0, rel=1e-4)
    assert cmp.ratio == pytest.approx(1.0, abs=0.01)


def test_scenario_states_the_mass_limit_convention():
    """A scenario with a mg/m3 limit says in its assumptions how it is compared."""
    text = TANK + '\n[[limit]]\nsubstance = "toluene"\nTWA = "75 mg/m3"\nsource = "x"\n'
    scenario = loads_scenario(text)
    assert any("actual temperature and pressure" in a for a in scenario.assumptions)


def test_scenario_temperature_without_unit_is_refused():
    """`temperature = "30"` names no unit: refused with the key, not read as 30 K."""
    text = TANK.replace('temperature = "25 degC"', 'temperature = "30"')
    with pytest.raises(InputError, match=r"\[\[tank\]\] #1 temperature.*no unit"):
        loads_scenario(text)


@pytest.mark.parametrize("argv, field", [
    (["sweep", "toluene", "--from", "300"], "--from"),
    (["sweep", "toluene", "--to", "320"], "--to"),
    (["sweep", "toluene", "--step", "5"], "--step"),
    (["sweep", "toluene", "--pressure", "101325"], "--pressure"),
])
def test_command_line_quantity_without_unit_is_refused(argv, field, capsys):
    """Command-line options with no unit exit 2 and name the option."""
    from estimator.cli import main

    assert main(argv) == 2
    err = capsys.readouterr().err
    assert field in err and "no unit" in err


def test_check_runs_what_run_runs(tmp_path, capsys):
    """`ullage check` fails where `ullage run` would: a daytime outdoor spill without
    the insolation is refused at load, naming the key."""
    from estimator.cli import main

    path = tmp_path / "night.toml"
    path.write_text("""
[scenario]
title = "x"
[[liquid]]
name = "t"
substance = "toluene"
[[spill]]
name = "s"
liquid = "t"
volume = "10 L"
temperature = "20 degC"
outdoors = true
[outdoors]
wind_speed = "3 m/s"
daytime = true
""", encoding="utf-8")
    assert main(["check", str(path)]) == 2
    assert "insolation" in capsys.readouterr().err
    assert main(["run", str(path)]) == 2


def test_check_reports_items_that_cannot_be_computed(tmp_path, capsys):
    """An item that loads but cannot be computed (a tank above the liquid's critical
    temperature) makes `check` exit 2 with the item named, as `run` does."""
    from estimator.cli import main

    path = tmp_path / "hot.toml"
    path.write_text(TANK.replace('"25 degC"', '"400 degC"'), encoding="utf-8")
    assert main(["check", str(path)]) == 2
    assert "tank T-1" in capsys.readouterr().err


def test_lfl_compilations_that_disagree_use_the_lower_and_say_so():
    """n-Butyl acetate: IEC 60079-20-1:2010 gives an LFL of 1.2 % and NFPA 497 (2008)
    1.7 % (as carried by the chemicals package): 42 % apart, so the lower is used and
    both are named in the substance's notes and in results."""
    from estimator.headspace import headspace
    from estimator.substances import substance

    sub = substance("n-butyl acetate")
    assert sub.lower_flammability_limit == pytest.approx(0.012)
    (note,) = [n for n in sub.notes if "disagree" in n]
    assert "1.2 %" in note and "1.7 %" in note and "IEC" in note and "NFPA" in note
    assert any("disagree on the LFL" in w for w in headspace(sub, 298.15).warnings)


def test_dissolved_far_above_solubility_is_refused():
    """Benzene dissolves in water to about 1.78 g/L at 25 degC (Sander 2015 compilation
    via the bundled Henry table; CRC Handbook gives 1.79 g/L, from memory): 5 g/L
    cannot be a solution, so it is refused naming the solubility."""
    from estimator.headspace import water_headspace

    with pytest.raises(InputError, match=r"dissolved Benzene.*solubility.*mg/L"):
        water_headspace({"benzene": 5.0}, 298.15)
    text = """
[scenario]
title = "x"
[[liquid]]
name = "w"
dissolved_in_water = { benzene = "5 g/L" }
"""
    with pytest.raises(InputError, match=r"dissolved_in_water.*solubility"):
        loads_scenario(text)


def test_oxygen_never_below_zero():
    """Pure vapour displaces all the air: 0 % oxygen, never negative (common practice)."""
    from estimator.headspace import headspace

    hs = headspace("acetone", 340.0)  # above acetone's boiling point at 1 atm
    assert float(hs.oxygen_percent) == pytest.approx(0.0, abs=1e-9)
