"""The browser's safety-data-sheet input (AppTest): read, check, confirm, then the
number shown is the core's for the liquid the sheet gives."""

from pathlib import Path

import pytest

from streamlit.testing.v1 import AppTest

from estimator.headspace import barometric_pressure, headspace
from estimator.limits import format_ppm
from estimator.sds import read_sds

ROOT = Path(__file__).resolve().parents[1]

SHEETS = ROOT / "tests" / "data" / "sds"
#: The first demo's site elevation, which the tank page starts with. [m]
DEMO_ELEVATION = 210.0


def metric(at, label):
    return next(m.value for m in at.metric if m.label == label)


def pasted(name: str) -> AppTest:
    at = AppTest.from_file(str(ROOT / "ui" / "screens" / "tank.py"), default_timeout=60).run()
    at.radio(key="w:tank.kind").set_value("sds")
    at.run()
    at.text_area(key="w:tank.sds_paste").input((SHEETS / name).read_text(encoding="utf-8"))
    next(b for b in at.button if b.label == "Read the pasted sheet").click()
    return at.run()


def test_pasted_sheet_is_shown_for_checking_then_used():
    """What was read is shown and must be confirmed; then the headspace is the core's."""
    at = pasted("reach-thinner.txt")
    assert not at.exception, at.exception
    shown = "\n".join(e.value for e in at.error)
    assert "Use this liquid" in shown
    assert at.text_input(key="w:tank.liquid_name").value == "Harbourline Thinner 210"
    assert any("Vapour pressure: the sheet gives" in c.value for c in at.caption)
    at.checkbox(key="w:tank.sds_confirmed").check()
    at.number_input(key="w:tank.temperature").set_value(30.0)
    at.run()
    assert not at.exception, at.exception
    liquid = read_sds(SHEETS / "reach-thinner.txt").liquid("mid")
    core = headspace(liquid, 303.15, 101325.0)  # a new case is at sea level
    assert metric(at, "Total vapour in the headspace") == f"{format_ppm(core.total_ppm)} ppm"


def test_contradicting_sheet_is_flagged_on_screen():
    """A sheet whose vapour pressure contradicts its composition is flagged plainly."""
    at = pasted("mislabelled-acetate.txt")
    assert not at.exception
    assert any("DISAGREES" in w.value for w in at.warning)


def test_saved_scenario_keeps_the_sheet_text():
    """The scenario saved from the page holds the sheet's original text and its ranges."""
    from ullage_ui import case

    at = pasted("hazcom-degreaser.txt")
    at.checkbox(key="w:tank.sds_confirmed").check()
    at.run()
    state = at.session_state["ullage"]
    doc = case.full_document(state, {"tank": True})
    item = doc["liquid"][0]
    assert item["sds_text"].startswith("SAFETY DATA SHEET")
    assert item["ranges"]["67-63-0"] == ["50.0 %", "70.0 %"]
    assert "Proprietary surfactant blend" in item["unlisted"]


def test_bad_upload_is_explained():
    """Pasting text with no composition section gives the reason and what to do."""
    at = AppTest.from_file(str(ROOT / "ui" / "screens" / "tank.py"), default_timeout=60).run()
    at.radio(key="w:tank.kind").set_value("sds")
    at.run()
    at.text_area(key="w:tank.sds_paste").input("SECTION 9: Physical and chemical properties\n"
                                                "Flash point: 4 °C\n")
    next(b for b in at.button if b.label == "Read the pasted sheet").click()
    at.run()
    assert not at.exception
    assert any("no composition section" in e.value for e in at.error)


def test_loaded_scenario_shows_the_sheet_liquid_again():
    """A saved scenario with a sheet's liquid loads back into the sheet input, confirmed."""
    from estimator.scenario import dumps_scenario, loads_scenario
    from ullage_ui import case

    at = pasted("older-cleaner.txt")
    at.checkbox(key="w:tank.sds_confirmed").check()
    at.run()
    doc = case.full_document(at.session_state["ullage"], {"tank": True})
    state = {}
    case.apply_scenario(state, loads_scenario(dumps_scenario(doc)), "saved.toml")
    assert state[case.key("tank.kind")] == "sds"
    assert state[case.key("tank.sds_confirmed")] is True
    item, problems = case.liquid_item(state, "tank")
    assert not problems
    assert item["ranges"] == doc["liquid"][0]["ranges"]
    assert item["sds_text"] == doc["liquid"][0]["sds_text"]


def test_uploaded_pdf_is_read():
    """An uploaded PDF with a text layer fills the tables like the text it came from."""
    from sds_pdf import text_pdf

    at = AppTest.from_file(str(ROOT / "ui" / "screens" / "tank.py"), default_timeout=60).run()
    at.radio(key="w:tank.kind").set_value("sds")
    at.run()
    text = (SHEETS / "stripper-pdf.txt").read_text(encoding="utf-8")
    at.file_uploader(key="up:tank.sds").set_value(("stripper.pdf", text_pdf(text),
                                                   "application/pdf"))
    at.run()
    assert not at.exception, at.exception
    assert at.text_input(key="w:tank.liquid_name").value == "Kestrel Paint Stripper 9"
    state = at.session_state["ullage"]
    from ullage_ui import case

    rows = case.filled_rows(state[case.table_key("tank.sds_ingredients")])
    assert [r["CAS"] for r in rows] == ["75-09-2", "67-56-1", "108-88-3"]


def test_property_table_follows_the_unit_switch():
    """With US units the section-9 table shows °F, mmHg and lb/gal (°F = 1.8 °C + 32, and
    1 mmHg = 133.322 Pa, 1 US gallon = 3.785411784 L, 1 lb = 0.45359237 kg: NIST SP 811);
    the checks under it read the same values either way."""
    at = pasted("reach-thinner.txt")
    checks_si = [c.value for c in at.caption if "the sheet gives" in c.value]
    at.toggle(key="w:units").set_value(True)
    at.run()
    assert not at.exception, at.exception
    table = at.session_state["ullage"]["tbl:tank.sds_properties:current"]
    rows = {r["property"]: (r["value"], r["unit"]) for r in table.to_dict("records")}
    reading = read_sds(SHEETS / "reach-thinner.txt")
    value, unit = rows["flash point"]
    assert unit == "°F"
    assert value == pytest.approx(1.8 * (reading.flash_point - 273.15) + 32.0, abs=0.01)
    if reading.vapor_pressure is not None:
        value, unit = rows["vapour pressure"]
        assert unit == "mmHg"
        assert value == pytest.approx(reading.vapor_pressure[1] / 133.322, rel=1e-3)
    if reading.density is not None:
        value, unit = rows["density"]
        assert unit == "lb/gal"
        assert value == pytest.approx(reading.density * 3.785411784e-3 / 0.45359237, rel=1e-3)
    assert [c.value for c in at.caption if "the sheet gives" in c.value] == checks_si
    at.toggle(key="w:units").set_value(False)
    at.run()
    table = at.session_state["ullage"]["tbl:tank.sds_properties:current"]
    assert dict(zip(table["property"], table["unit"]))["flash point"] == "°C"
