"""Liquids outside the curated table, resolved through the property library
(`chemicals`) by CAS number or name on every face: the Python API, scenario files,
`ullage substances`, inventory rows and the browser's search box."""

import csv
import json
from pathlib import Path

import numpy as np
import pytest

import estimator
from estimator import cli
from estimator.errors import InputError, UnknownSubstanceError
from estimator.substances import TABLE_PATH, cas_check_digit, search_substances, substance
from estimator.vapor import vapor_pressure_estimate

from outside_references import (
    coolprop_fluids_by_cas,
    reference_is_consistent,
    reference_saturation_pressure,
)

TABLE_CAS = {row["cas"] for row in csv.DictReader(TABLE_PATH.open(encoding="utf-8"))}

#: Library-only liquids that CoolProp carries: CAS -> a name users type.
COOLPROP_LIQUIDS = {
    "107-83-5": "2-methylpentane",            # isohexane
    "112-40-3": "dodecane",
    "76-13-1": "1,1,2-trichlorotrifluoroethane",  # CFC-113, a cleaning solvent
    "1717-00-6": "1,1-dichloro-1-fluoroethane",   # HCFC-141b
    "75-69-4": "trichlorofluoromethane",           # CFC-11
}


def test_the_examples_are_not_in_the_table():
    """The liquids used below are library-only, so the tests exercise the look-up."""
    for cas in [*COOLPROP_LIQUIDS, "108-67-8", "111-76-2", "75-65-0"]:
        assert cas not in TABLE_CAS


@pytest.mark.parametrize("text", ["2-methylpentane", "107-83-5", "isohexane", "Isohexane",
                                  "2 methylpentane"])
def test_api_resolves_name_synonym_and_cas(text):
    """substance() finds a library liquid by name, synonym or CAS; key is the CAS."""
    s = substance(text)
    assert (s.key, s.cas, s.origin) == ("107-83-5", "107-83-5", "lookup")
    # CRC Handbook: 2-methylpentane boils at 60.3 degC, M = 86.18 g/mol (from memory)
    assert s.boiling_point == pytest.approx(333.4, abs=0.5)
    assert s.molar_mass == pytest.approx(0.08618, rel=1e-3)


def test_synonyms_of_other_liquids():
    """Mesitylene by its systematic name, 2-butoxyethanol by a trade synonym."""
    assert substance("1,3,5-trimethylbenzene").cas == "108-67-8"
    assert substance("mesitylene").cas == "108-67-8"
    assert substance("butyl cellosolve").cas == "111-76-2"
    assert substance("tert-butanol").cas == "75-65-0"


def test_table_stays_first():
    """A name the library maps to a table compound returns the curated row."""
    s = substance("toluol")
    assert s.origin == "table" and s.key == "toluene"
    assert substance("Phenylmethane").key == "toluene"  # synonym known only to the library


def test_formulas_and_smiles_are_not_read_as_names():
    """'CO' (carbon monoxide? methanol's SMILES?) and 'C6H14' (five isomers) refuse."""
    for text in ("CO", "C6H14"):
        with pytest.raises(UnknownSubstanceError):
            substance(text)


def test_lookup_is_cached():
    """The same CAS gives the same object (functools.cache), whatever name led to it."""
    assert substance("isohexane") is substance("107-83-5")


def test_every_value_keeps_its_source_and_each_method_its_uncertainty():
    """Sources name the original compilation; the methods are the table's keys."""
    s = substance("2-methylpentane")
    assert "Perry" in s.sources["dippr101"] and "chemicals" in s.sources["dippr101"]
    assert "Poling" in s.sources["antoine"]
    stated = estimator.vapor.method_uncertainty()
    assert all(c.method in stated for c in s.correlations)
    est = vapor_pressure_estimate(s, 298.15)
    assert est.method == "antoine"
    assert est.relative_uncertainty == stated["antoine"][0]
    assert "Poling" in est.source


def test_missing_flammability_is_not_on_record_never_non_flammable():
    """2-methylpentane has no LFL in IEC 60079-20-1 or NFPA 497 as carried by chemicals,
    yet it burns: the notes say 'not on record', and the headspace is 'not judged'."""
    s = substance("2-methylpentane")
    assert s.lower_flammability_limit is None and s.flash_point is None
    notes = " ".join(s.notes)
    assert "lower flammability limit not on record: enter it from the safety data sheet" \
        in notes
    assert "flash point not on record: enter it from the safety data sheet" in notes
    assert "not in ullage's curated table" in notes
    hs = estimator.headspace("2-methylpentane", 298.15)
    assert hs.flammability.item() == "none"
    assert any("not on record" in w for w in hs.warnings)
    assert not any("non-flammable" in w.lower() for w in hs.warnings)


@pytest.mark.requires_coolprop
@pytest.mark.parametrize("cas", sorted(COOLPROP_LIQUIDS))
def test_library_vapour_pressure_against_coolprop(cas):
    """Library-only liquids against CoolProp's equations of state (Bell et al. 2014,
    Ind. Eng. Chem. Res. 53, 2498) over 0-60 degC below the boiling point: within the
    stated uncertainty of the method used."""
    if cas not in coolprop_fluids_by_cas():
        pytest.skip("CoolProp lacks this fluid")
    s = substance(COOLPROP_LIQUIDS[cas])
    assert s.cas == cas and s.origin == "lookup"
    t = np.arange(273.15, 333.16, 2.5)
    t = t[t < s.boiling_point - 0.5]
    t = t[reference_is_consistent(cas, t)]
    est = vapor_pressure_estimate(s, t)
    reference = reference_saturation_pressure(cas, t)
    error = np.abs(np.asarray(est.pressure) / reference - 1.0)
    assert error.max() <= est.relative_uncertainty, (est.method, error.max())


def test_mesitylene_vapour_pressure():
    """Mesitylene at 25 degC: 0.33 kPa (CRC Handbook, vapour pressure of organic
    compounds; from memory). CoolProp has no mesitylene."""
    est = vapor_pressure_estimate(substance("mesitylene"), 298.15)
    assert est.pressure == pytest.approx(330.0, rel=0.08)
    assert est.source


def test_tert_butanol_is_solid_at_20_degc():
    """tert-Butanol melts at 25.7 degC (CRC Handbook, from memory): at 20 degC it is
    refused as a solid, with the reason."""
    s = substance("tert-butanol")
    assert s.melting_point == pytest.approx(298.9, abs=1.0)
    with pytest.raises(InputError, match="melting point"):
        vapor_pressure_estimate(s, 293.15)


def test_cas_check_digit():
    """CAS check digits (CAS Registry documentation): water 7732-18-5, toluene 108-88-3."""
    assert cas_check_digit("7732-18-5") == 5
    assert cas_check_digit("108-88-3") == 3
    assert cas_check_digit("107-83-5") == 5


def test_bad_check_digit_says_so_with_close_matches():
    """A mistyped CAS is refused for its check digit, suggesting real neighbours."""
    with pytest.raises(UnknownSubstanceError) as info:
        substance("108-88-4", "liquid")
    message = str(info.value)
    assert info.value.field == "liquid"
    assert "check digit" in message and "should be 3" in message
    assert "108-88-3 (Toluene)" in message
    assert "108-88-3" in info.value.suggestions
    with pytest.raises(UnknownSubstanceError, match="check digit"):
        estimator.lookup_cas("107-83-4")


def test_unknown_name_gets_close_matches_from_table_and_library():
    """A misspelt library liquid is suggested by its library name."""
    with pytest.raises(UnknownSubstanceError) as info:
        substance("mesitylen")
    assert info.value.suggestions[0] == "mesitylene"
    assert "did you mean" in str(info.value)
    with pytest.raises(UnknownSubstanceError) as info:
        substance("qqzzxv solvent")
    assert "safety data sheet" in str(info.value)


def test_valid_but_unknown_cas():
    """A well-formed CAS with a right check digit that nobody has: a plain refusal."""
    with pytest.raises(UnknownSubstanceError, match="is in the table or the property library"):
        substance("9999999-99-5")


def test_search_offers_library_liquids():
    """The search behind the CLI and the browser ranks library names with the table's."""
    found = search_substances("mesitylen", limit=6)
    assert found[0].cas == "108-67-8" and found[0].origin == "lookup"


# ---------------------------------------------------------------- other faces

SCENARIO = """
[scenario]
title = "library liquid"

[[liquid]]
name = "cleaning solvent"
substance = "{substance}"

[[tank]]
name = "A"
liquid = "cleaning solvent"
temperature = "25 degC"
"""


@pytest.mark.parametrize("text", ["107-83-5", "2-methylpentane"])
def test_scenario_file_resolves_library_liquid(tmp_path, text):
    """A scenario names the liquid by CAS or by name; reports mark it as looked up."""
    from estimator.report import markdown_report, results_json

    result = estimator.run_scenario(estimator.loads_scenario(SCENARIO.format(substance=text)))
    assert not result.errors
    tank = result.tanks[0]
    assert tank.headspace.liquid.components[0].cas == "107-83-5"
    # Antoine (Poling) at 25 degC checked against CoolProp above; here only plumbing
    assert tank.headspace.total_ppm == pytest.approx(
        1e6 * vapor_pressure_estimate(substance("107-83-5"), 298.15).pressure / 101325.0,
        rel=1e-6)
    data = json.loads(results_json(result))
    component = data["tanks"][0]["components"][0]
    assert component["origin"] == "lookup"
    assert "Perry" in component["sources"]["dippr101"]
    report = markdown_report(result)
    assert "Not in ullage's curated table" in report
    assert "not on record" in report


def test_scenario_bad_cas_names_the_key():
    """A bad check digit in a scenario file is a scenario error naming the key."""
    from estimator.scenario import ScenarioError

    with pytest.raises(ScenarioError) as info:
        estimator.loads_scenario(SCENARIO.format(substance="107-83-4"))
    assert "check digit" in str(info.value)
    assert "substance" in str(info.value)


def test_cli_substances_shows_library_liquid(capsys):
    """`ullage substances isohexane` shows the library data, marked, with sources."""
    assert cli.main(["substances", "isohexane"]) == 0
    out = capsys.readouterr().out
    assert "2-Methylpentane" in out and "107-83-5" in out
    assert "property library" in out
    assert "not on record: enter it from the safety data sheet" in out
    assert "antoine (±0.55 %)" in out
    assert "Perry's Chemical Engineers' Handbook" in out
    assert "screening estimate" in out


def test_cli_substances_bad_cas_and_close_matches(capsys):
    """A bad CAS exits 2 with the check-digit message; a typo lists close matches."""
    assert cli.main(["substances", "108-88-4"]) == 2
    err = capsys.readouterr().err
    assert "check digit" in err and "108-88-3" in err
    assert cli.main(["substances", "mesitylen"]) == 0
    out = capsys.readouterr().out
    assert "mesitylene" in out and "(property library)" in out


def test_inventory_rows_resolve_library_liquids(tmp_path):
    """Inventory rows by CAS, name and in a mixture; the row says where the data came
    from; a bad CAS row is an error with the reason."""
    import warnings

    from estimator.inventory import screen_inventory

    path = tmp_path / "inventory.csv"
    path.write_text("container,liquid,temperature_C,fill_percent\n"
                    "A,2-methylpentane,25,50\nB,107-83-5,25,50\n"
                    "C,\"isohexane 50%, toluene 50%\",25,50\nD,108-88-4,25,50\n",
                    encoding="utf-8")
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        table = screen_inventory(path).table
    ppm = 1e6 * vapor_pressure_estimate(substance("107-83-5"), 298.15).pressure / 101325.0
    assert table["worst_case_ppm"].iloc[0] == pytest.approx(ppm, rel=1e-6)
    assert table["worst_case_ppm"].iloc[1] == pytest.approx(ppm, rel=1e-6)
    assert list(table["status"]) == ["warning", "warning", "warning", "error"]
    assert "property library" in table["reason"].iloc[0]
    assert "not on record" in table["reason"].iloc[2]
    assert "check digit" in table["reason"].iloc[3]


def test_browser_search_box_finds_library_liquid(demo_results):
    """The tank page's search box selects a library liquid, marks it, and the headspace
    on screen is the core's at the demo tank's temperature and pressure."""
    from streamlit.testing.v1 import AppTest

    from estimator.limits import format_ppm

    demo_tank = demo_results["coatings-day-tank"].tanks[0].headspace

    screens = Path(__file__).resolve().parents[1] / "ui" / "screens"
    at = AppTest.from_file(str(screens / "tank.py"), default_timeout=60).run()
    at.selectbox(key="w:demo").select("coatings-day-tank.toml")
    at.run()
    at.button(key="load:sidebar").click()
    at.run()
    at.radio(key="w:tank.kind").set_value("table")
    at.run()
    at.text_input(key="w:tank.find").input("isohexane")
    at.run()
    assert not at.exception
    assert at.selectbox(key="w:tank.substance").value == "107-83-5"
    assert any("property library" in c.value for c in at.caption)
    assert any("not on record" in w.value for w in at.warning)
    core = estimator.headspace("107-83-5", demo_tank.temperature, demo_tank.pressure)
    shown = next(m.value for m in at.metric if m.label == "Total vapour in the headspace")
    assert shown == f"{format_ppm(core.total_ppm)} ppm"
    at.text_input(key="w:tank.find").input("108-88-4")
    at.run()
    assert "check digit" in "\n".join(e.value for e in at.error)
