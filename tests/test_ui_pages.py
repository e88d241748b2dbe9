"""Browser pages, run headless with Streamlit's AppTest: numbers shown equal the core's,
bad input shows an error and never a traceback, the cautions are on every page.

These are wrapper tests: the physics is checked against outside sources in the core's
own test files; here the check is that a page shows what the core computes for the
same inputs, and behaves on bad input.
"""

from pathlib import Path

import pytest
from streamlit import config
from streamlit.testing.v1 import AppTest

from estimator import CAUTIONS
from estimator.headspace import barometric_pressure, headspace
from estimator.inventory import screen_inventory
from estimator.limits import format_number, format_ppm
from estimator.scenario import dumps_scenario, load_scenario, loads_scenario
from estimator.screening import run_scenario

ROOT = Path(__file__).resolve().parents[1]

SCREENS = ROOT / "ui" / "screens"
DEMOS = sorted((ROOT / "scenarios").glob("*.toml"))
WAREHOUSE = ROOT / "scenarios" / "warehouse-drum-spill.toml"
PAGES = ["start.py", "tank.py", "spill_indoors.py", "spill_outdoors.py", "inventory.py", "compare.py",
         "limits.py"]
#: The first demo's thinner, as its file gives it (mass fractions).
THINNER = {"toluene": 0.45, "o-xylene": 0.25, "n-butyl acetate": 0.20, "MEK": 0.10}
#: The first demo's site elevation. [m]
DEMO_ELEVATION = 210.0

config.set_option("browser.gatherUsageStats", False)


def page(name: str, demo: Path | None = DEMOS[0]) -> AppTest:
    """A page run headless; with `demo`, that demo loaded from the sidebar (a new
    session starts empty)."""
    at = AppTest.from_file(str(SCREENS / name), default_timeout=30).run()
    return at if demo is None else load_demo(at, demo)


def metric(at: AppTest, label: str) -> str:
    for m in at.metric:
        if m.label == label:
            return m.value
    raise AssertionError(f"no metric {label!r} among {[m.label for m in at.metric]}")


def errors(at: AppTest) -> str:
    return "\n".join(e.value for e in at.error)


def button(at: AppTest, label: str):
    return next(b for b in at.button if b.label == label)


def load_demo(at: AppTest, path: Path) -> AppTest:
    at.selectbox(key="w:demo").select(path.name)
    at.run()
    at.button(key="load:sidebar").click()
    return at.run()


def test_first_demo_is_on_screen_when_loaded():
    """Loading the first demo puts its tank on the tank page, with its result."""
    at = page("tank.py")
    assert not at.exception
    first = load_scenario(DEMOS[0])
    assert at.number_input(key="w:tank.temperature").value == pytest.approx(
        first.tanks[0]["temperature"] - 273.15)
    assert metric(at, "Total vapour in the headspace").endswith("ppm")
    assert f"On screen: {DEMOS[0].name}" in at.sidebar.markdown[0].value


def test_a_new_session_starts_empty():
    """A first visit loads no demo: no tank name, worst case, elevation or limits."""
    at = page("tank.py", demo=None)
    assert not at.exception
    assert "On screen: a new, empty case" in at.sidebar.markdown[0].value
    assert at.number_input(key="w:tank.worst").value is None
    assert at.text_input(key="w:tank.name").value == "tank 1"
    assert any("No exposure limit entered" in c.value for c in at.caption)
    assert any("sea level (101.325 kpa)" in c.value.lower() for c in at.caption)
    assert at.selectbox(key="w:demo").value is None
    core = headspace("toluene", 298.15, 101325.0)
    assert metric(at, "Total vapour in the headspace") == f"{format_ppm(core.total_ppm)} ppm"


def test_new_case_after_a_demo_drops_everything_of_the_demo():
    """"Start a new, empty case" after the demo leaves none of the demo's inputs."""
    from ullage_ui import case

    at = page("tank.py")
    at.button(key="new:sidebar").click()
    at.run()
    assert not at.exception
    assert "On screen: a new, empty case" in at.sidebar.markdown[0].value
    assert at.number_input(key="w:tank.worst").value is None
    assert at.number_input(key="w:tank.temperature").value == 25.0
    assert at.text_input(key="w:tank.name").value == "tank 1"
    assert at.radio(key="w:mc.tank.temperature.kind").value == "fixed"
    doc = case.full_document(at.session_state["ullage"])
    assert set(doc) == {"scenario"}  # nothing entered yet: nothing but the title


def test_sidebar_names_the_file_loaded_last():
    """After another file is loaded the sidebar names it, not the first demo."""
    at = page("tank.py")
    at.file_uploader(key="up:scenario").set_value(
        ("my-site.toml", WAREHOUSE.read_bytes(), "application/toml"))
    at.run()
    assert not at.exception
    head = at.sidebar.markdown[0].value
    assert "my-site.toml" in head and DEMOS[0].name not in head


def test_tank_headspace_shown_equals_core():
    """After a temperature change the headspace total shown is the core's, formatted alike."""
    at = page("tank.py")
    at.number_input(key="w:tank.temperature").set_value(40.0)
    at.run()
    assert not at.exception
    core = headspace(THINNER, 313.15, barometric_pressure(DEMO_ELEVATION), basis="mass")
    assert metric(at, "Total vapour in the headspace") == f"{format_ppm(core.total_ppm)} ppm"
    assert metric(at, "Flammable vapour [% of LFL]") == f"{float(core.percent_lfl):.3g} %"
    assert metric(at, "Oxygen after displacement") == f"{float(core.oxygen_percent):.3g} %"


def test_units_switch_converts_inputs_and_keeps_the_result():
    """US customary units show the temperature in degF; the result stays the same."""
    at = page("tank.py")
    before = metric(at, "Total vapour in the headspace")
    at.toggle(key="w:units").set_value(True)
    at.run()
    assert not at.exception
    assert at.number_input(key="w:tank.temperature").value == pytest.approx(93.2)
    assert "[°F]" in at.number_input(key="w:tank.temperature").label
    assert metric(at, "Total vapour in the headspace") == before


def test_substance_search_by_synonym_selects_it():
    """Typing a synonym in the search box selects the substance, and the result is its own."""
    at = page("tank.py")
    at.radio(key="w:tank.kind").set_value("table")
    at.run()
    at.text_input(key="w:tank.find").input("MEK")
    at.run()
    assert not at.exception
    assert at.selectbox(key="w:tank.substance").value == "methyl-ethyl-ketone"
    core = headspace("MEK", 307.15, barometric_pressure(DEMO_ELEVATION))
    assert metric(at, "Total vapour in the headspace") == f"{format_ppm(core.total_ppm)} ppm"


def test_close_matches_are_offered():
    """A misspelt name offers close matches as buttons."""
    at = page("tank.py")
    at.radio(key="w:tank.kind").set_value("table")
    at.run()
    at.text_input(key="w:tank.find").input("tolulene")
    at.run()
    assert not at.exception
    assert any("Toluene" in b.label for b in at.button)


def test_unknown_substance_shows_an_error():
    """A name that matches nothing shows an error, not an exception."""
    at = page("tank.py")
    at.radio(key="w:tank.kind").set_value("table")
    at.run()
    at.text_input(key="w:tank.find").input("qqzzxv")
    at.run()
    assert not at.exception
    assert "no substance is known as 'qqzzxv'" in errors(at)


def test_temperature_above_critical_shows_an_error():
    """A liquid temperature above the critical point is refused with what to do."""
    at = page("tank.py")
    at.radio(key="w:tank.kind").set_value("table")
    at.run()
    at.selectbox(key="w:tank.substance").select("acetone")
    at.number_input(key="w:tank.temperature").set_value(300.0)
    at.run()
    assert not at.exception
    text = errors(at)
    assert "critical temperature" in text and "Temperature" in text
    assert not at.metric


def test_own_substance_from_sds_values():
    """A substance defined from SDS values gives the core's headspace for it."""
    from estimator.substances import user_substance

    at = page("tank.py")
    at.radio(key="w:tank.kind").set_value("own")
    at.run()
    at.text_input(key="w:sds.name").input("Solvent X")
    at.number_input(key="w:sds.molar_mass").set_value(100.0)
    at.number_input(key="w:sds.boiling").set_value(110.0)
    at.number_input(key="w:sds.vp").set_value(3.0)
    at.number_input(key="w:sds.vp_temperature").set_value(20.0)
    at.number_input(key="w:sds.lfl").set_value(1.1)
    at.number_input(key="w:sds.ufl").set_value(7.0)
    at.number_input(key="w:tank.temperature").set_value(30.0)
    at.run()
    assert not at.exception, at.exception
    sub = user_substance("Solvent X", 0.100, 383.15, [(293.15, 3000.0)],
                         lower_flammability_limit=0.011, upper_flammability_limit=0.07)
    core = headspace(sub, 303.15, barometric_pressure(DEMO_ELEVATION))
    assert metric(at, "Total vapour in the headspace") == f"{format_ppm(core.total_ppm)} ppm"


def test_limit_without_source_shows_an_error():
    """A limit row with no source is refused, with an error naming the row."""
    at = page("limits.py")
    editor = at.data_editor[0]
    at.session_state[editor.key] = {"edited_rows": {"0": {"source": ""}}, "added_rows": [],
                                    "deleted_rows": []}
    at.run()
    assert not at.exception
    assert "say where the limit comes from" in errors(at)
    assert "row 1" in errors(at)


def test_alarm_levels_default_to_osha_and_refuse_nonsense():
    """The alarm levels show the OSHA 29 CFR 1910.146 defaults; a low above high is refused."""
    at = page("limits.py")
    assert at.number_input(key="w:alarm.percent_lfl").value == 10.0
    assert at.number_input(key="w:alarm.oxygen_low").value == 19.5
    assert at.number_input(key="w:alarm.oxygen_high").value == 23.5
    assert any("1910.146" in c.value for c in at.caption)
    at.number_input(key="w:alarm.oxygen_low").set_value(25.0)
    at.run()
    assert not at.exception
    assert "oxygen" in errors(at).lower()


def test_malformed_scenario_upload_shows_an_error():
    """A scenario file that is not TOML is refused with the reason; the case is kept."""
    at = page("tank.py")
    before = metric(at, "Total vapour in the headspace")
    at.file_uploader(key="up:scenario").set_value(
        ("broken.toml", b"[scenario\ntitle = 'x'\n", "application/toml"))
    at.run()
    assert not at.exception
    assert "broken.toml was not loaded" in errors(at)
    assert "not valid TOML" in errors(at)
    assert metric(at, "Total vapour in the headspace") == before


def test_oversized_scenario_upload_is_refused():
    """A scenario upload above 1 MB is refused before it is parsed."""
    at = page("tank.py")
    at.file_uploader(key="up:scenario").set_value(
        ("huge.toml", b"#" * 1_100_000, "application/toml"))
    at.run()
    assert not at.exception
    assert "at most 1,000,000 bytes" in errors(at)


def test_scenario_upload_is_loaded():
    """A good scenario file puts its indoor spill on the indoor page."""
    at = page("spill_indoors.py")
    at.file_uploader(key="up:scenario").set_value(
        (WAREHOUSE.name, WAREHOUSE.read_bytes(), "application/toml"))
    at.run()
    assert not at.exception
    assert at.text_input(key="w:indoor.name").value == "punctured drum"


def test_indoor_spill_shown_equals_core(demo_results):
    """The indoor page shows the peak and 8-h TWA the core computes for the demo spill."""
    at = page("spill_indoors.py")
    load_demo(at, WAREHOUSE)
    assert not at.exception
    spill = next(s for s in demo_results["warehouse-drum-spill"].spills if s.indoor)
    near = next(e for e in spill.exposures if e.zone == "near field")
    assert metric(at, "Peak, near field") == f"{format_ppm(near.peak)} ppm"
    assert metric(at, "8-h TWA") == f"{format_ppm(near.twa)} ppm"


def test_fan_failure_changes_the_indoor_result():
    """No ventilation (fan off) is accepted and raises the 8-h TWA."""
    at = page("spill_indoors.py")
    load_demo(at, WAREHOUSE)
    before = metric(at, "8-h TWA")
    at.number_input(key="w:room.air_changes").set_value(0.0)
    at.run()
    assert not at.exception
    after = metric(at, "8-h TWA")
    assert float(after.split()[0].replace(",", "")) > float(before.split()[0].replace(",", ""))


def test_outdoor_spill_shown_equals_core(demo_results):
    """The outdoor page shows the release rate to air and stability the core computes."""
    at = page("spill_outdoors.py")
    load_demo(at, WAREHOUSE)
    assert not at.exception
    spill = next(s for s in demo_results["warehouse-drum-spill"].spills if s.outdoor)
    rate = 1000.0 * float(spill.outdoor.emission_rate.sum())
    assert metric(at, "Release rate to air") == f"{format_number(rate)} g/s"
    assert metric(at, "Stability class") == spill.outdoor.stability


def test_bad_receptor_list_shows_an_error():
    """Downwind distances that are not lengths are refused next to the box."""
    at = page("spill_outdoors.py")
    at.text_input(key="w:weather.receptors").input("100 m, far")
    at.run()
    assert not at.exception
    assert "**Downwind distances**" in errors(at)


def test_distance_without_a_unit_is_refused_naming_the_field():
    """A distance typed without its unit is refused, naming the box (issue 11, section 6)."""
    at = page("spill_outdoors.py")
    at.text_input(key="w:weather.receptors").input("100, 300 m")
    at.run()
    assert not at.exception
    assert "'100' has no unit" in errors(at)
    assert "Downwind distances" in errors(at)
    at.text_input(key="w:weather.receptors").input("100 ft, 0.3 km")
    at.run()
    assert not errors(at)
    rows = table_rows(at)
    assert "| 30.48 |" in rows and "| 300 |" in rows  # 100 ft = 30.48 m (exact by definition)


def test_inventory_example_shown_equals_core():
    """The example inventory's counts are those of the core's screening of the file."""
    from ullage_ui.case import EXAMPLE_INVENTORY

    at = page("inventory.py")
    at.toggle(key="w:inv.example").set_value(True)
    at.run()
    assert not at.exception
    core = screen_inventory(EXAMPLE_INVENTORY)
    assert metric(at, "Rows screened") == f"{core.summary.rows:,}"
    assert metric(at, "At or above a limit or alarm") == f"{core.summary.at_or_above_alarm:,}"
    assert metric(at, "Not computed (errors)") == f"{core.summary.counts['error']:,}"
    assert "unknown solvent" in errors(at)


def test_inventory_upload_without_required_columns_shows_an_error():
    """An inventory file without the required columns is refused with the reason."""
    at = page("inventory.py")
    at.file_uploader(key="up:inventory").set_value(
        ("plant.csv", b"tank,stuff\nA,toluene\n", "text/csv"))
    at.run()
    assert not at.exception
    assert errors(at)


def test_compare_page_shows_both_cases_and_the_difference():
    """Case B starts 10 degrees hotter; both numbers are the core's, the change is in words."""
    at = page("compare.py")
    assert not at.exception
    shown = [m.value for m in at.metric if m.label == "Total vapour in the headspace"]
    pressure = barometric_pressure(DEMO_ELEVATION)
    a = headspace(THINNER, 307.15, pressure, basis="mass")
    b = headspace(THINNER, 317.15, pressure, basis="mass")
    assert shown == [f"{format_ppm(a.total_ppm)} ppm", f"{format_ppm(b.total_ppm)} ppm"]
    text = "\n".join(m.value for m in at.markdown)
    assert "**liquid temperature**: 34 °C in A, **44 °C** in B" in text


def test_compare_page_other_solvent():
    """Choosing another solvent for case B names the change and runs it."""
    at = page("compare.py")
    at.selectbox(key="w:cmp.substance").select("acetone")
    at.run()
    assert not at.exception
    text = "\n".join(m.value for m in at.markdown)
    assert "Acetone (case B)" in text


def test_compare_page_offers_liquids_found_in_the_library():
    """A liquid found in the property library on another page can be case B's liquid;
    its headspace is the core's for that liquid at B's temperature."""
    from ullage_ui import case

    tank = page("tank.py")
    tank.radio(key="w:tank.kind").set_value("table")
    tank.run()
    tank.text_input(key="w:tank.find").input("isohexane")
    tank.run()
    found = tank.session_state["ullage"][case.LIBRARY_FOUND]
    (isohexane,) = [k for k, v in found.items() if "107-83-5" in v["label"]]
    at = AppTest.from_file(str(SCREENS / "compare.py"), default_timeout=30)
    at.session_state["ullage"] = tank.session_state["ullage"]
    at.run()
    assert isohexane in at.selectbox(key="w:cmp.substance").options or any(
        "107-83-5" in o for o in at.selectbox(key="w:cmp.substance").options)
    at.selectbox(key="w:cmp.substance").set_value(isohexane)
    at.run()
    assert not at.exception, at.exception
    shown = [m.value for m in at.metric if m.label == "Total vapour in the headspace"]
    core = headspace({isohexane: 1.0}, 317.15, barometric_pressure(DEMO_ELEVATION))
    assert shown[1] == f"{format_ppm(core.total_ppm)} ppm"


@pytest.mark.parametrize("name", PAGES)
def test_cautions_on_every_page(name):
    """Every page shows every caution, unfolded, and runs without an exception."""
    at = page(name)
    assert not at.exception
    shown = "\n".join(m.value for m in at.markdown)
    for caution in CAUTIONS:
        assert caution in shown
    assert not at.expander or all(caution not in "\n".join(
        m.value for e in at.expander for m in e.markdown) for caution in CAUTIONS)


def test_app_navigates_every_page():
    """The entry script's navigation reaches every page without an exception."""
    at = AppTest.from_file(str(ROOT / "ui" / "app.py"), default_timeout=30).run()
    assert not at.exception
    titles = []
    for name in PAGES:
        at.switch_page(f"screens/{name}").run()
        assert not at.exception, name
        titles.append(at.title[0].value)
    assert titles == ["Start a case", "Tank headspace", "Spill indoors", "Spill outdoors", "Site inventory",
                      "Two cases side by side", "Limits, alarms and site"]


def test_inputs_survive_a_page_switch():
    """A value typed on one page is still there after visiting another page."""
    at = AppTest.from_file(str(ROOT / "ui" / "app.py"), default_timeout=30).run()
    at.switch_page("screens/tank.py").run()
    at.number_input(key="w:tank.temperature").set_value(41.0)
    at.run()
    at.switch_page("screens/spill_indoors.py").run()
    at.switch_page("screens/tank.py").run()
    assert at.number_input(key="w:tank.temperature").value == 41.0


def test_units_choice_survives_a_page_switch():
    """US customary units stay chosen on every page, and the numbers keep their meaning."""
    at = AppTest.from_file(str(ROOT / "ui" / "app.py"), default_timeout=30).run()
    at.switch_page("screens/tank.py").run()
    load_demo(at, DEMOS[0])
    before = metric(at, "Total vapour in the headspace")
    at.toggle(key="w:units").set_value(True)
    at.run()
    at.switch_page("screens/spill_outdoors.py").run()
    assert at.toggle(key="w:units").value is True
    assert "[°F]" in at.number_input(key="w:outdoor.temperature").label
    at.switch_page("screens/tank.py").run()
    assert not at.exception
    assert metric(at, "Total vapour in the headspace") == before


def test_saved_scenario_reloads_to_the_same_case():
    """The scenario text saved from the inputs loads back to the same tank and limits."""
    from ullage_ui import case

    state = {}
    case.apply_scenario(state, load_scenario(DEMOS[0]), DEMOS[0].name)
    again = loads_scenario(dumps_scenario(case.full_document(state)))
    first = load_scenario(DEMOS[0])
    assert again.tanks[0]["temperature"] == pytest.approx(first.tanks[0]["temperature"])
    assert again.tanks[0]["volume"] == pytest.approx(first.tanks[0]["volume"], rel=1e-6)
    assert [(x.substance, x.kind, x.ppm) for x in again.limits] == [
        (x.substance, x.kind, pytest.approx(x.ppm)) for x in first.limits]
    assert again.pressure == pytest.approx(first.pressure)


def test_us_units_save_in_us_units():
    """An input changed in US customary units is saved in them and means the same in SI;
    inputs left as loaded are saved as the file wrote them."""
    from ullage_ui import case

    state = {}
    case.apply_scenario(state, load_scenario(DEMOS[0]), DEMOS[0].name)
    case.switch_units(state, "SI", "US")
    state[case.key("units")] = True
    assert state[case.key("tank.temperature")] == pytest.approx(93.2)
    state[case.key("tank.temperature")] = 95.0
    text = dumps_scenario(case.full_document(state))
    assert 'temperature = "95.0 degF"' in text
    assert 'volume = "2500 gal"' in text  # unchanged: as in the file
    again = loads_scenario(text)
    assert again.tanks[0]["temperature"] == pytest.approx(308.15, abs=1e-6)  # 95 °F


def test_load_then_save_gives_the_same_scenario():
    """Every demo, in SI and US units on screen, saves back to the scenario it loaded."""
    from ullage_ui import case

    def summary(s):
        return {"pressure": s.pressure, "air": s.air_temperature,
                "tanks": [dict(x) for x in s.tanks], "rooms": [dict(x) for x in s.rooms],
                "spills": [dict(x) for x in s.spills], "outdoors": s.outdoors,
                "limits": [(x.substance, x.kind, x.ppm, x.source) for x in s.limits],
                "alarms": s.alarms, "shift": s.shift,
                "liquids": {k: (v["kind"], repr(v["spec"])) for k, v in s.liquids.items()},
                "uncertain": [(u["item"], u["input"], vars(u["distribution"]))
                              for u in s.uncertain],
                "monte_carlo": dict(s.monte_carlo)}

    for path in DEMOS:
        first = load_scenario(path)
        for units in ("SI", "US"):
            state = {}
            case.apply_scenario(state, first, path.name)
            if units == "US":
                case.switch_units(state, "SI", "US")
                state[case.key("units")] = True
            again = loads_scenario(dumps_scenario(case.full_document(state)))
            assert summary(again) == summary(first), (path.name, units)


def test_spill_only_file_saves_without_a_tank():
    """A spill-only file loaded while the tank page is open saves with no tank."""
    from ullage_ui import case

    text = WAREHOUSE.read_text(encoding="utf-8")
    at = page("tank.py", demo=None)
    at.file_uploader(key="up:scenario").set_value(
        ("spills.toml", text.encode("utf-8"), "application/toml"))
    at.run()
    assert not at.exception
    saved = loads_scenario(dumps_scenario(case.full_document(at.session_state["ullage"])))
    assert not saved.tanks
    assert [s["name"] for s in saved.spills] == ["punctured drum", "yard transfer hose"]


def test_an_input_changed_on_a_page_puts_its_study_in_the_file():
    """A new case saves a tank once a tank input is changed, and not before."""
    from ullage_ui import case

    at = page("tank.py", demo=None)
    assert "tank" not in case.full_document(at.session_state["ullage"])
    at.number_input(key="w:tank.temperature").set_value(31.0)
    at.run()
    saved = loads_scenario(dumps_scenario(case.full_document(at.session_state["ullage"])))
    assert saved.tanks[0]["temperature"] == pytest.approx(304.15)
    assert not saved.spills and not saved.limits


def test_reports_carry_the_cautions():
    """The HTML report and CSV results of a case on screen carry every caution."""
    import html

    from ullage_ui import case, views

    state = {}
    case.apply_scenario(state, load_scenario(DEMOS[0]), DEMOS[0].name)
    doc, problems = case.study_document(state, "tank")
    assert not problems
    text = dumps_scenario(doc)
    report = html.unescape(views.report_text(text, "html"))
    results = views.report_text(text, "csv")
    for caution in CAUTIONS:
        assert caution in report
        assert caution in results


def test_launcher_binds_to_this_machine_by_default():
    """The launcher binds to 127.0.0.1, runs headless and sends no usage statistics."""
    from ullage_ui.launch import command

    args = command()
    assert args[args.index("--server.address") + 1] == "127.0.0.1"
    assert args[args.index("--server.headless") + 1] == "true"
    assert args[args.index("--browser.gatherUsageStats") + 1] == "false"
    exposed = command(["--server.address", "0.0.0.0"])
    assert exposed.count("--server.address") == 1
    assert exposed[exposed.index("--server.address") + 1] == "0.0.0.0"


# ------------------------------------------------------------------ uncertainty

TANK_RANGE = "w:mc.tank.temperature"


def table_rows(at: AppTest) -> str:
    """Every Markdown table on the page, as one text."""
    return "\n".join(m.value for m in at.markdown if m.value.startswith("|"))


def test_uncertainty_section_starts_with_the_demo_triangular_temperature():
    """The first demo's triangular tank temperature fills the always-visible Uncertainty part."""
    at = page("tank.py")
    assert not at.exception
    assert "Uncertainty" in [h.value for h in at.main.header]
    assert not at.expander  # nothing folded away
    assert at.radio(key=f"{TANK_RANGE}.kind").value == "triangular"
    shown = [at.number_input(key=f"{TANK_RANGE}.{part}").value for part in ("low", "mode", "high")]
    assert shown == [28.0, 34.0, 44.0]  # the file's 28, 34 and 44 degC
    assert at.number_input(key="w:mc.samples").value == 20000
    assert at.number_input(key="w:mc.seed").value == 2026
    assert metric(at, "95th percentile, total vapour in the headspace").endswith("ppm")
    at.toggle(key="w:units").set_value(True)
    at.run()
    assert not at.exception
    assert at.number_input(key=f"{TANK_RANGE}.low").value == pytest.approx(82.4)
    assert "[°F]" in at.number_input(key=f"{TANK_RANGE}.low").label


def test_tank_uniform_temperature_range_shown_equals_core():
    """A uniform 30-45 degC range gives the core's 95th percentile and exceedance probabilities."""
    from estimator.mixtures import liquid
    from estimator.uncertainty import Uniform, headspace_monte_carlo

    at = page("tank.py")
    at.radio(key=f"{TANK_RANGE}.kind").set_value("uniform")
    at.run()
    at.number_input(key=f"{TANK_RANGE}.low").set_value(30.0)
    at.number_input(key=f"{TANK_RANGE}.high").set_value(45.0)
    at.number_input(key="w:mc.samples").set_value(5000)
    at.number_input(key="w:mc.seed").set_value(99)
    at.run()
    assert not at.exception
    core = headspace_monte_carlo(
        liquid(THINNER, "mass"), Uniform(303.15, 318.15), barometric_pressure(DEMO_ELEVATION),
        load_scenario(DEMOS[0]).limits, n=5000, seed=99, include_method_uncertainty=True,
        lfl_alarm=10.0, oxygen_alarm=19.5)
    assert metric(at, "95th percentile, total vapour in the headspace") == \
        f"{format_ppm(core.percentiles['total_ppm'][95])} ppm"
    rows = table_rows(at)
    oxygen = core.exceedance["oxygen below 19.5 %"]
    assert 0.0 < oxygen < 1.0  # a probability the range really decides
    assert f"| oxygen below 19.5 % | oxygen after displacement | {100 * oxygen:.3g} % |" in rows
    assert f"| 10 % LFL alarm | flammable vapour | " \
           f"{100 * core.exceedance['10 % LFL alarm']:.3g} % |" in rows
    toluene = core.exceedance["TWA 20 ppm (illustrative value for this demo)"]
    assert f"| Toluene TWA 20 ppm | Toluene | {100 * toluene:.3g} % |" in rows
    assert "| total vapour in the headspace | " in rows
    assert "driven most by the temperature" in "\n".join(m.value for m in at.markdown)
    assert len(at.get("vega_lite_chart")) == 3  # two sweeps and the cumulative curve


def test_bad_temperature_range_shows_an_error_next_to_the_field():
    """A low end above the high end is refused beside the range, with no exception."""
    at = page("tank.py")
    at.radio(key=f"{TANK_RANGE}.kind").set_value("uniform")
    at.run()
    at.number_input(key=f"{TANK_RANGE}.low").set_value(45.0)
    at.number_input(key=f"{TANK_RANGE}.high").set_value(30.0)
    at.run()
    assert not at.exception
    text = errors(at)
    assert "Liquid temperature" in text
    assert "the low end (45 °C) must be below the high end (30 °C)" in text
    assert not any(m.label.startswith("95th percentile") for m in at.metric)
    assert metric(at, "Total vapour in the headspace").endswith("ppm")  # the stated result stays


def test_indoor_spill_ranges_shown_equal_core():
    """The drum-spill demo's uncertain mass, mixing and air speed give the core's statistics."""
    from estimator.uncertainty import LogNormal, Triangular, Uniform, indoor_spill_monte_carlo

    at = page("spill_indoors.py")
    load_demo(at, WAREHOUSE)
    assert not at.exception
    assert at.radio(key="w:mc.indoor.mass.kind").value == "uniform"
    assert at.radio(key="w:mc.indoor.mixing_factor.kind").value == "triangular"
    assert at.radio(key="w:mc.indoor.air_speed.kind").value == "lognormal"
    assert at.number_input(key="w:mc.indoor.air_speed.gsd").value == 1.8
    at.number_input(key="w:mc.samples").set_value(5000)
    at.run()
    assert not at.exception
    scenario = load_scenario(WAREHOUSE)
    spill = scenario.spills[0]
    room = scenario.rooms[0]
    stated = next(s for s in run_scenario(scenario).spills if s.indoor)
    core = indoor_spill_monte_carlo(
        "acetone", spill["temperature"], stated.indoor.pool_area, LogNormal(0.15, 1.8),
        room["volume"], room["ventilation_rate"], Triangular(2.0, 3.0, 6.0),
        Uniform(20.0, 60.0), scenario.limits, duration=spill["duration"], n=5000, seed=7,
        include_method_uncertainty=True, pressure=scenario.pressure,
        source_removed_at=spill["cleanup_after"])
    assert metric(at, "95th percentile, 8-h TWA (room)") == \
        f"{format_ppm(core.percentiles['twa_ppm'][95])} ppm"
    assert metric(at, "95th percentile, peak (room)") == \
        f"{format_ppm(core.percentiles['peak_ppm'][95])} ppm"
    rows = table_rows(at)
    for label, compared in (("TWA 250 ppm", "8-h TWA"), ("STEL 500 ppm", "highest 15-min average"),
                            ("emergency 2500 ppm", "peak")):
        p = core.exceedance[f"{label} (illustrative value for this demo)"]
        assert f"| Acetone {label} | {compared} | {100 * p:.3g} % |" in rows
    top = next(iter(core.sensitivity["twa_ppm"]))
    assert top == "air_speed"
    assert "driven most by the air speed over the pool" in "\n".join(m.value for m in at.markdown)


def test_monte_carlo_is_cached(monkeypatch):
    """Samples are drawn again only when their own inputs change (the speed of 5000:
    benchmarks/bench_monte_carlo.py)."""
    from estimator import uncertainty
    from ullage_ui import case, views

    calls = []
    real = uncertainty.headspace_monte_carlo

    def counted(*args, **kwargs):
        calls.append(kwargs.get("seed"))
        return real(*args, **kwargs)

    monkeypatch.setattr(uncertainty, "headspace_monte_carlo", counted)
    at = page("tank.py")
    at.number_input(key="w:mc.seed").set_value(424242)  # a seed no other test uses
    at.run()
    assert calls.count(424242) == 1
    at.number_input(key="w:tank.volume").set_value(5.0)
    at.number_input(key="w:tank.temperature").set_value(36.0)  # the range sets the samples
    at.run()  # numbers among the inputs rerun only the result
    assert not at.exception
    assert calls.count(424242) == 1
    at.run()  # the whole page, as the browser keeps it
    at.number_input(key="w:mc.samples").set_value(5000)
    at.run()
    assert calls.count(424242) == 2
    monkeypatch.undo()

    state = {}
    case.apply_scenario(state, load_scenario(DEMOS[0]), DEMOS[0].name)
    state[case.key("mc.samples")] = 5000
    state[case.key("mc.seed")] = 515151
    text = dumps_scenario(case.monte_carlo_document(state, "tank"))
    views.uncertainty_view.__wrapped__(text.replace("515151", "515152"), "SI")  # imports
    view = views.uncertainty_view.__wrapped__(text, "SI")
    assert view["error"] is None and view["n"] == 5000


def test_saved_scenario_keeps_uncertain_inputs():
    """Load, save, load keeps every [[uncertain]] input and the [monte_carlo] settings."""
    from ullage_ui import case

    for path in (DEMOS[0], WAREHOUSE):
        first = load_scenario(path)
        assert first.uncertain
        for units in ("SI", "US"):
            state = {}
            case.apply_scenario(state, first, path.name)
            if units == "US":
                case.switch_units(state, "SI", "US")
                state[case.key("units")] = True
            again = loads_scenario(dumps_scenario(case.full_document(state)))
            assert [(u["item"], u["input"], type(u["distribution"])) for u in again.uncertain] \
                == [(u["item"], u["input"], type(u["distribution"])) for u in first.uncertain]
            for a, b in zip(again.uncertain, first.uncertain):
                assert vars(a["distribution"]) == pytest.approx(vars(b["distribution"]),
                                                                rel=1e-5)
            assert again.monte_carlo == first.monte_carlo


def test_report_from_the_page_carries_the_probabilistic_results():
    """The HTML report offered on the tank page holds the sampled percentiles and the curve."""
    import html

    from ullage_ui import case, views

    state = {}
    case.apply_scenario(state, load_scenario(DEMOS[0]), DEMOS[0].name)
    state[case.key("mc.samples")] = 5000
    doc, problems = case.study_document(state, "tank", uncertain=True)
    assert not problems and doc["uncertain"] and doc["monte_carlo"]["samples"] == 5000
    mc = run_scenario(loads_scenario(dumps_scenario(doc))).tanks[0].monte_carlo
    report = html.unescape(views.report_text(dumps_scenario(doc), "html"))
    assert "Probabilistic screening" in report
    assert f"{mc.n:,} samples (seed {mc.seed}" in report
    assert "Tank T-3: headspace, cumulative distribution" in report
    for label, p in mc.exceedance.items():
        assert f"<td>{label}</td><td class=\"num\">{100 * p:.3g} %</td>" in report


def test_outdoor_page_shows_lfl_distances_of_the_core(demo_results):
    """The outdoor page shows the distances to the LFL and the alarm the core computes."""
    from estimator.report import result_to_dict

    at = page("spill_outdoors.py")
    load_demo(at, WAREHOUSE)
    assert not at.exception
    result = demo_results["warehouse-drum-spill"]
    i = next(i for i, s in enumerate(result.spills) if s.outdoor)
    od = result_to_dict(result)["spills"][i]["outdoor"]
    shown = metric(at, "Distance to the LFL")
    assert shown == f"{format_number(od['distance_to_lfl_m'])} m"
    assert metric(at, "Distance to 10 % LFL") == f"{format_number(od['distance_to_lfl_alarm_m'])} m"
    assert metric(at, "Britter-McQuaid criterion").startswith(f"{od['dense_gas']['value']:.2g}")


# ------------------------------------------------------- inputs that fail alone

def test_negative_tank_volume_marks_its_field_and_keeps_the_headspace():
    """A negative tank volume is refused by its screen label; the headspace stays."""
    at = page("tank.py")
    at.number_input(key="w:tank.volume").set_value(-5.0)
    at.run()
    assert not at.exception
    text = errors(at)
    assert "**Tank volume**: must be above 0" in text
    assert "[[tank]]" not in text and "volume (line" not in text
    core = headspace(THINNER, 307.15, barometric_pressure(DEMO_ELEVATION), basis="mass")
    assert metric(at, "Total vapour in the headspace") == f"{format_ppm(core.total_ppm)} ppm"
    shown = "\n".join(m.value for m in at.markdown)
    assert "Vapour pushed out by filling" not in shown  # depends on the volume


def test_bad_purge_flow_keeps_the_rest_of_the_tank():
    """A purge flow of zero is refused alone; the filling result is still shown."""
    at = page("tank.py")
    at.number_input(key="w:tank.purge_rate").set_value(0.0)
    at.run()
    assert not at.exception
    assert "**Purge air flow**" in errors(at)
    shown = "\n".join(m.value for m in at.markdown)
    assert "Vapour pushed out by filling" in shown
    assert "Purge before entry" not in shown


def test_bad_near_field_radius_keeps_the_room_result():
    """A negative near-field radius is refused by its label beside the room block; the
    well-mixed room result is still shown, the near field is not."""
    at = page("spill_indoors.py")
    load_demo(at, WAREHOUSE)
    at.number_input(key="w:room.near_field_radius").set_value(-1.0)
    at.run()
    assert not at.exception
    text = errors(at)
    assert "**Near-field radius**" in text and "radius:" not in text
    assert "the near-field results are left out" in text
    labels = [m.label for m in at.metric]
    assert "Peak, room" in labels and "8-h TWA" in labels
    assert "Peak, near field" not in labels
    shown = "\n".join(m.value for m in at.markdown)
    assert "| near field |" not in shown  # the table row of the near field


def test_bad_cleanup_time_keeps_the_spill_result_with_the_pool_left_in_place():
    """A negative "Pool removed at" is named; the result is shown with the pool left
    until it is dry, and says so."""
    at = page("spill_indoors.py")
    load_demo(at, WAREHOUSE)
    at.number_input(key="w:indoor.cleanup").set_value(-5.0)
    at.run()
    assert not at.exception
    text = errors(at)
    assert "**Pool removed at**" in text and "left in place until it is dry" in text
    assert "[[spill]]" not in text and "cleanup_after" not in text
    assert "Peak, near field" in [m.label for m in at.metric]
    shown = "\n".join(m.value for m in at.markdown)
    assert "cleaned up at" not in shown  # depends on the clean-up time


def test_bad_time_modelled_keeps_only_what_stands_without_the_run():
    """A run of zero length is refused by its label; the results over time are left
    out, the pool area and the initial evaporation rates are still shown."""
    at = page("spill_indoors.py")
    load_demo(at, WAREHOUSE)
    at.number_input(key="w:indoor.duration").set_value(0.0)
    at.run()
    assert not at.exception
    text = errors(at)
    assert "**Time modelled**: must be above 0" in text
    assert "8-h TWA" not in [m.label for m in at.metric]
    shown = "\n".join(m.value for m in at.markdown)
    assert "**Pool:**" in shown and "Initial evaporation rate" in shown


def test_one_bad_downwind_distance_leaves_the_others_and_the_release_rate():
    """A negative distance and a word among good distances are each refused by the
    box's label; the good distances and the release rate are still shown."""
    at = page("spill_outdoors.py")
    load_demo(at, WAREHOUSE)
    at.text_input(key="w:weather.receptors").input("100 m, -5 m, far, 1 km")
    at.run()
    assert not at.exception
    text = errors(at)
    assert "**Downwind distances**: '-5 m' is not above 0" in text
    assert "'far' does not start with a number" in text
    assert "[outdoors]" not in text and "receptors" not in text
    rows = table_rows(at)
    assert "| 100 |" in rows and "| 1,000 |" in rows and "| -5 |" not in rows
    assert metric(at, "Release rate to air").endswith("g/s")
    assert "Distance to the LFL" in [m.label for m in at.metric]
    assert not [b for b in at.get("download_button") if "report" in b.proto.label]
    # saving keeps what was typed, the bad entries too; loading names them
    from ullage_ui import case

    doc = case.full_document(at.session_state["ullage"])
    assert doc["outdoors"]["receptors"] == ["100 m", "-5 m", "far", "1 km"]
    with pytest.raises(Exception, match="receptors"):
        loads_scenario(dumps_scenario(doc))


def test_bad_cloud_cover_keeps_the_release_rate_only_with_the_wind_at_10_m():
    """Cloud cover of 9 oktas is named; the release rate (which does not depend on the
    stability class when the wind is given at 10 m) stays, everything downwind goes.
    With the wind measured at another height the release rate depends on the class
    too (the power law), and the whole result is blanked."""
    at = page("spill_outdoors.py")
    load_demo(at, WAREHOUSE)
    rate = metric(at, "Release rate to air")
    at.number_input(key="w:weather.cloud").set_value(9.0)
    at.run()
    assert not at.exception
    assert "**Cloud cover**: give it in oktas" in errors(at)
    assert metric(at, "Release rate to air") == rate
    labels = [m.label for m in at.metric]
    assert "Stability class" not in labels and "Distance to the LFL" not in labels
    assert "centreline" not in table_rows(at)
    at.number_input(key="w:weather.wind_height").set_value(2.0)
    at.run()
    assert not at.exception
    assert "**Cloud cover**" in errors(at)
    assert "Release rate to air" not in [m.label for m in at.metric]


def test_bad_wind_height_is_named_and_blanks_the_outdoor_result():
    """The wind height feeds the wind at 10 m, which every outdoor result uses."""
    at = page("spill_outdoors.py")
    load_demo(at, WAREHOUSE)
    at.number_input(key="w:weather.wind_height").set_value(-1.0)
    at.run()
    assert not at.exception
    text = errors(at)
    assert "**Wind measured at height**" in text and "reference_height" not in text
    assert not at.metric


def test_bad_alarm_level_is_named_and_leaves_the_rest_of_the_limits_page():
    """An LFL alarm of 150 % is refused by its screen label; the limits in use and the
    site pressure are still shown."""
    at = page("limits.py")
    at.number_input(key="w:alarm.percent_lfl").set_value(150.0)
    at.run()
    assert not at.exception
    text = errors(at)
    assert "**Flammable vapour [% of LFL]**: must be above 0 and at most 100 %" in text
    assert "LFL alarm:" not in text and "percent_lfl" not in text
    captions = "\n".join(c.value for c in at.caption)
    assert "limit(s) in use" in captions
    assert "Pressure used: 98.8 kPa" in captions  # the first demo's 210 m (ISO 2533)


def test_bad_barometric_pressure_is_named_and_leaves_the_alarms_alone():
    """A barometric pressure of 20 kPa is refused (the core's 30-120 kPa range) by its
    label; the alarm levels raise nothing and the limits are still shown."""
    at = page("limits.py")
    at.radio(key="w:site.mode").set_value("barometric")
    at.run()
    at.number_input(key="w:site.barometric").set_value(20.0)
    at.run()
    assert not at.exception
    text = errors(at)
    assert "**Barometric pressure**" in text and "between 30 and 120 kPa" in text
    assert "Flammable vapour" not in text and "Oxygen" not in text
    captions = "\n".join(c.value for c in at.caption)
    assert "limit(s) in use" in captions and "Pressure used" not in captions
    at.number_input(key="w:site.barometric").set_value(95.0)
    at.run()
    assert not errors(at)
    assert "Pressure used: 95 kPa" in "\n".join(c.value for c in at.caption)


def test_bad_input_of_case_b_is_named_beside_it_and_case_a_stays():
    """A mixing factor below 1 in case B is named by B's own label; case A is shown."""
    at = page("compare.py", WAREHOUSE)
    at.radio(key="w:cmp.study").set_value("indoor")
    at.run()
    before = [m.value for m in at.metric if m.label == "8-h TWA"]
    at.number_input(key="w:cmp.mixing").set_value(0.5)
    at.run()
    assert not at.exception
    text = errors(at)
    assert "**Mixing factor in B**: must be 1 or more" in text
    assert "[[room]]" not in text and "mixing_factor" not in text
    assert [m.value for m in at.metric if m.label == "8-h TWA"] == before[:1]


def test_bad_input_of_case_a_leaves_case_b_shown():
    """Case A's air changes (entered on its study page) below 0 blank case A only: B,
    with the fan off, is still computed, and A's error names the study page's box."""
    at = page("compare.py", WAREHOUSE)
    at.radio(key="w:cmp.study").set_value("indoor")
    at.run()
    at.session_state["ullage"]["in:room.air_changes"] = -1.0
    at.run()
    assert not at.exception
    text = errors(at)
    assert "**Air changes (on the page Spill indoors)**" in text
    assert len([m for m in at.metric if m.label == "8-h TWA"]) == 1  # case B's


def test_tank_input_that_fails_alone_keeps_both_cases():
    """A negative tank volume is named in each case; both headspaces are still shown."""
    at = page("compare.py")
    at.session_state["ullage"]["in:tank.volume"] = -5.0
    at.run()
    assert not at.exception
    assert "**Tank volume (on the page Tank headspace)**: must be above 0" in errors(at)
    assert len([m for m in at.metric if m.label == "Total vapour in the headspace"]) == 2


def test_bad_room_volume_still_blanks_the_indoor_result():
    """The room volume feeds every result: a bad one leaves nothing to show."""
    at = page("spill_indoors.py")
    load_demo(at, WAREHOUSE)
    at.number_input(key="w:room.volume").set_value(-1.0)
    at.run()
    assert not at.exception
    assert "**Room volume**" in errors(at)
    assert not [m for m in at.metric if m.label == "8-h TWA"]


# ------------------------------------------------------------ numbers as read

SCIENTIFIC = r"\d(?:\.\d+)?e[+-]?\d"


def page_text(at: AppTest) -> str:
    """Every text a person reads on a page: tiles, Markdown, captions, messages."""
    parts = [f"{m.label} {m.value}" for m in at.metric]
    for kind in ("markdown", "caption", "error", "warning", "info", "subheader", "title"):
        parts += [str(e.value) for e in getattr(at, kind)]
    return "\n".join(parts)


@pytest.mark.parametrize("name,demo", [("tank.py", DEMOS[0]), ("spill_indoors.py", WAREHOUSE),
                                       ("spill_outdoors.py", WAREHOUSE),
                                       ("compare.py", DEMOS[0])])
def test_no_scientific_notation_on_the_pages(name, demo):
    """Nothing a person reads on a page is in scientific notation (1.67e+03)."""
    import re

    at = page(name, demo)
    assert not at.exception
    text = page_text(at)
    assert text.strip()
    assert not re.findall(SCIENTIFIC, text), re.findall(r".{30}" + SCIENTIFIC + ".{10}", text)
    assert "degC" not in text and " m2" not in text
    assert not re.findall(r"\b[a-z]+_[a-z_]+\b", text)  # no internal key (residual_area)
    assert "[[" not in text and "mackay-matsugu" not in text


def test_oxygen_is_shown_by_its_low_percentiles():
    """The uncertainty section gives oxygen's 1st and 5th percentiles, not its high ones."""
    import numpy as np

    at = page("tank.py")
    rows = [line for line in table_rows(at).split("\n") if "oxygen after displacement" in line]
    heads = "\n".join(m.value for m in at.markdown if "1st percentile" in m.value)
    assert "| 1st percentile | 5th percentile | median |" in heads
    assert rows and not any("99th" in r for r in rows)
    assert metric(at, "5th percentile, oxygen after displacement").endswith("%")
    # the low percentile is the smaller oxygen (a property of percentiles, common practice)
    values = [float(v.strip(" %")) for v in rows[0].split("|")[2:5]]
    assert values == sorted(values) and np.isfinite(values).all()


def test_ratio_of_exactly_one_reaches_the_limit():
    """A concentration equal to the limit 'reaches' it (not 'below' or '1 times')."""
    from estimator.limits import ExposureLimit, LimitComparison, format_ratio  # noqa: F401

    lim = ExposureLimit("toluene", "TWA", 20.0, "ppm", "illustrative", 20e-6)
    statement = LimitComparison(lim, 20e-6, 1.0).statement
    assert "reaches the TWA of 20 ppm" in statement and "below" not in statement
    assert format_ratio(1.0) == "reaches"


def test_converted_inputs_are_rounded_to_sensible_steps():
    """The demo's 2500 gal tank reads 9.464 m³ (not 9.46353) and back 2500 gal."""
    at = page("tank.py")
    assert at.number_input(key="w:tank.volume").value == 9.464
    assert at.number_input(key="w:tank.purge_rate").value == 679.6  # 400 ft³/min in m³/h
    at.toggle(key="w:units").set_value(True)
    at.run()
    assert at.number_input(key="w:tank.volume").value == 2500.0


# ------------------------------------------------------------ temperature flags

def test_worst_case_below_stated_is_flagged_and_the_stated_used():
    """A worst case cooler than the stated temperature is flagged; the stated one is used."""
    at = page("tank.py")
    at.number_input(key="w:tank.worst").set_value(20.0)  # stated 34 degC
    at.run()
    assert not at.exception
    warnings_shown = "\n".join(w.value for w in at.warning)
    assert "worst-case temperature 20.0 °C is below the stated temperature 34.0 °C" \
        in warnings_shown
    shown = "\n".join(m.value for m in at.markdown)
    assert "**Worst case, 34.0 °C:**" in shown
    # the flag beside the inputs too: the change reran the whole page, not only the result
    assert "**Worst-case temperature** is below the liquid temperature" in warnings_shown
    at.number_input(key="w:tank.worst").set_value(40.0)
    at.run()
    assert "below the liquid temperature" not in "\n".join(w.value for w in at.warning)
    assert at.number_input(key="w:tank.worst").value == 40.0


def test_a_changed_number_reruns_only_the_result():
    """A new liquid temperature redraws the result alone (its fragment): the inputs,
    the sidebar and the Monte Carlo are not sent again. A choice reruns the page."""
    at = page("tank.py")
    before = metric(at, "Total vapour in the headspace")
    at.number_input(key="w:tank.temperature").set_value(20.0)
    at.run()
    assert not at.exception
    assert metric(at, "Total vapour in the headspace") != before
    assert not at.number_input  # the inputs were not drawn again
    assert not at.sidebar
    at.run()
    assert at.number_input(key="w:tank.temperature").value == 20.0
    assert at.number_input(key="w:mc.samples")
    at.toggle[0].set_value(not at.toggle[0].value)
    at.run()  # a toggle shows other inputs: the whole page runs
    assert at.number_input(key="w:tank.temperature").value == 20.0


def test_a_number_that_fails_reruns_the_page_to_mark_its_field():
    """An error beside a block of inputs needs the whole page: a bad tank volume is
    shown by the tank inputs, and cleared there once corrected."""
    at = page("tank.py")
    assert len(at.get("download_button")) >= 2
    at.number_input(key="w:tank.volume").set_value(-5.0)
    at.run()
    assert "Tank volume" in errors(at)
    assert at.number_input(key="w:tank.volume").value == -5.0  # drawn again, kept
    assert metric(at, "Total vapour in the headspace")  # the headspace does not depend on it
    # no report of a case with an input left out, and a word on why
    assert not [b for b in at.get("download_button") if "report" in b.proto.label]
    assert any("downloads come back once" in c.value for c in at.caption)
    at.number_input(key="w:tank.volume").set_value(5.0)
    at.run()
    assert "Tank volume" not in errors(at)
    assert at.number_input(key="w:tank.volume").value == 5.0
    assert [b for b in at.get("download_button") if "report" in b.proto.label]


def test_core_screening_uses_the_stated_temperature_as_worst_case():
    """screen_tank: worst case below the stated temperature -> the stated one, with a note."""
    from estimator.screening import screen_tank

    text = DEMOS[0].read_text(encoding="utf-8").replace(
        'worst_temperature = "46 degC"', 'worst_temperature = "25 degC"')
    assert 'worst_temperature = "25 degC"' in text
    scenario = loads_scenario(text)
    result = screen_tank(scenario, scenario.tanks[0])
    assert result.worst_temperature == result.temperature
    assert float(result.worst.total_ppm) == pytest.approx(float(result.headspace.total_ppm))
    assert any("is below the stated temperature" in w for w in result.warnings)


def test_inventory_tables_read_without_scientific_notation():
    """The inventory tables on screen hold numbers as people read them."""
    import re

    at = page("inventory.py", demo=None)
    at.toggle(key="w:inv.example").set_value(True)
    at.run()
    assert not at.exception
    for frame in at.dataframe:
        text = frame.value.to_csv(index=False)
        assert not re.findall(SCIENTIFIC, text)
        assert not re.findall(r"\d\.\d{5,}", text)  # no long tails of digits


def test_indoor_page_shows_peak_percent_lfl_of_the_core(demo_results):
    """The indoor-spill page shows the peak % LFL tile (the highest of its zones, as
    the core's `spills[i].flammability` gives it)."""
    from estimator.report import result_to_dict

    at = page("spill_indoors.py")
    load_demo(at, WAREHOUSE)
    assert not at.exception
    result = demo_results["warehouse-drum-spill"]
    i = next(i for i, s in enumerate(result.spills) if s.indoor)
    zones = result_to_dict(result)["spills"][i]["flammability"]
    top = max(z["peak_percent_lfl"] for z in zones)
    assert metric(at, "Peak % of the LFL") == f"{format_number(top)} %"
