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
from estimator.limits import format_ppm
from estimator.scenario import dumps_scenario, load_scenario, loads_scenario
from estimator.screening import run_scenario

ROOT = Path(__file__).resolve().parents[1]

SCREENS = ROOT / "ui" / "screens"
DEMOS = sorted((ROOT / "scenarios").glob("*.toml"))
WAREHOUSE = ROOT / "scenarios" / "warehouse-drum-spill.toml"
PAGES = ["tank.py", "spill_indoors.py", "spill_outdoors.py", "inventory.py", "compare.py",
         "limits.py"]
#: The first demo's thinner, as its file gives it (mass fractions).
THINNER = {"toluene": 0.45, "o-xylene": 0.25, "n-butyl acetate": 0.20, "MEK": 0.10}
#: The first demo's site elevation. [m]
DEMO_ELEVATION = 210.0

config.set_option("browser.gatherUsageStats", False)


def page(name: str) -> AppTest:
    at = AppTest.from_file(str(SCREENS / name), default_timeout=30)
    return at.run()


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
    button(at, "Load this demo").click()
    return at.run()


def test_first_demo_is_on_screen_at_start():
    """The tank page opens with the first demo scenario's tank and its result."""
    at = page("tank.py")
    assert not at.exception
    first = load_scenario(DEMOS[0])
    assert at.number_input(key="w:tank.temperature").value == pytest.approx(
        first.tanks[0]["temperature"] - 273.15)
    assert metric(at, "Headspace, all vapour").endswith("ppm")


def test_tank_headspace_shown_equals_core():
    """After a temperature change the headspace total shown is the core's, formatted alike."""
    at = page("tank.py")
    at.number_input(key="w:tank.temperature").set_value(40.0)
    at.run()
    assert not at.exception
    core = headspace(THINNER, 313.15, barometric_pressure(DEMO_ELEVATION), basis="mass")
    assert metric(at, "Headspace, all vapour") == f"{format_ppm(core.total_ppm)} ppm"
    assert metric(at, "Flammable vapour [% of LFL]") == f"{float(core.percent_lfl):.3g} %"
    assert metric(at, "Oxygen left") == f"{float(core.oxygen_percent):.3g} %"


def test_units_switch_converts_inputs_and_keeps_the_result():
    """US customary units show the temperature in degF; the result stays the same."""
    at = page("tank.py")
    before = metric(at, "Headspace, all vapour")
    at.toggle(key="w:units").set_value(True)
    at.run()
    assert not at.exception
    assert at.number_input(key="w:tank.temperature").value == pytest.approx(93.2)
    assert "[°F]" in at.number_input(key="w:tank.temperature").label
    assert metric(at, "Headspace, all vapour") == before


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
    assert metric(at, "Headspace, all vapour") == f"{format_ppm(core.total_ppm)} ppm"


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
    assert metric(at, "Headspace, all vapour") == f"{format_ppm(core.total_ppm)} ppm"


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
    before = metric(at, "Headspace, all vapour")
    at.file_uploader(key="up:scenario").set_value(
        ("broken.toml", b"[scenario\ntitle = 'x'\n", "application/toml"))
    at.run()
    assert not at.exception
    assert "broken.toml was not loaded" in errors(at)
    assert "not valid TOML" in errors(at)
    assert metric(at, "Headspace, all vapour") == before


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
    """The outdoor page shows the source strength and stability the core computes."""
    at = page("spill_outdoors.py")
    load_demo(at, WAREHOUSE)
    assert not at.exception
    spill = next(s for s in demo_results["warehouse-drum-spill"].spills if s.outdoor)
    rate = 1000.0 * float(spill.outdoor.emission_rate.sum())
    assert metric(at, "Source strength") == f"{rate:.3g} g/s"
    assert metric(at, "Stability class") == spill.outdoor.stability


def test_bad_receptor_list_shows_an_error():
    """Downwind distances that are not numbers are refused next to the box."""
    at = page("spill_outdoors.py")
    at.text_input(key="w:weather.receptors").input("100, far")
    at.run()
    assert not at.exception
    assert "not a list of numbers" in errors(at)


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
    shown = [m.value for m in at.metric if m.label == "Headspace, all vapour"]
    pressure = barometric_pressure(DEMO_ELEVATION)
    a = headspace(THINNER, 307.15, pressure, basis="mass")
    b = headspace(THINNER, 317.15, pressure, basis="mass")
    assert shown == [f"{format_ppm(a.total_ppm)} ppm", f"{format_ppm(b.total_ppm)} ppm"]
    text = "\n".join(m.value for m in at.markdown)
    assert "tank temperature" in text and "44.0 degC" in text


def test_compare_page_other_solvent():
    """Choosing another solvent for case B names the change and runs it."""
    at = page("compare.py")
    at.selectbox(key="w:cmp.substance").select("acetone")
    at.run()
    assert not at.exception
    text = "\n".join(m.value for m in at.markdown)
    assert "Acetone (case B)" in text


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
    assert titles == ["Tank headspace", "Spill indoors", "Spill outdoors", "Site inventory",
                      "Two cases side by side", "Limits, alarms and site"]


def test_inputs_survive_a_page_switch():
    """A value typed on one page is still there after visiting another page."""
    at = AppTest.from_file(str(ROOT / "ui" / "app.py"), default_timeout=30).run()
    at.number_input(key="w:tank.temperature").set_value(41.0)
    at.run()
    at.switch_page("screens/spill_indoors.py").run()
    at.switch_page("screens/tank.py").run()
    assert at.number_input(key="w:tank.temperature").value == 41.0


def test_units_choice_survives_a_page_switch():
    """US customary units stay chosen on every page, and the numbers keep their meaning."""
    at = AppTest.from_file(str(ROOT / "ui" / "app.py"), default_timeout=30).run()
    before = metric(at, "Headspace, all vapour")
    at.toggle(key="w:units").set_value(True)
    at.run()
    at.switch_page("screens/spill_outdoors.py").run()
    assert at.toggle(key="w:units").value is True
    assert "[°F]" in at.number_input(key="w:outdoor.temperature").label
    at.switch_page("screens/tank.py").run()
    assert not at.exception
    assert metric(at, "Headspace, all vapour") == before


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
    """Inputs in US customary units are saved with their units and mean the same in SI."""
    from ullage_ui import case

    state = {}
    case.apply_scenario(state, load_scenario(DEMOS[0]), DEMOS[0].name)
    case.switch_units(state, "SI", "US")
    state[case.key("units")] = True
    text = dumps_scenario(case.full_document(state))
    assert "degF" in text and "gal" in text
    again = loads_scenario(text)
    assert again.tanks[0]["temperature"] == pytest.approx(307.15, abs=1e-6)


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
    assert metric(at, "95th percentile, headspace, all vapour").endswith("ppm")
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
    assert metric(at, "95th percentile, headspace, all vapour") == \
        f"{format_ppm(core.percentiles['total_ppm'][95])} ppm"
    rows = table_rows(at)
    oxygen = core.exceedance["oxygen below 19.5 %"]
    assert 0.0 < oxygen < 1.0  # a probability the range really decides
    assert f"| oxygen below 19.5 % | oxygen left | {100 * oxygen:.3g} % |" in rows
    assert f"| 10 % LFL alarm | flammable vapour | " \
           f"{100 * core.exceedance['10 % LFL alarm']:.3g} % |" in rows
    toluene = core.exceedance["TWA 20 ppm (illustrative value for this demo)"]
    assert f"| toluene TWA 20 ppm | Toluene | {100 * toluene:.3g} % |" in rows
    assert "| headspace, all vapour | " in rows
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
    assert metric(at, "Headspace, all vapour").endswith("ppm")  # the stated result stays


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
        assert f"| acetone {label} | {compared} | {100 * p:.3g} % |" in rows
    top = next(iter(core.sensitivity["twa_ppm"]))
    assert top == "air_speed"
    assert "driven most by the air speed over the pool" in "\n".join(m.value for m in at.markdown)


def test_monte_carlo_is_cached_and_fast(monkeypatch):
    """Samples are drawn again only when their own inputs change; 5000 take well under a second."""
    import time

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
    at.run()
    assert not at.exception
    assert calls.count(424242) == 1
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
    start = time.perf_counter()
    view = views.uncertainty_view.__wrapped__(text, "SI")
    assert time.perf_counter() - start < 1.0
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
    assert shown == f"{od['distance_to_lfl_m']:,.0f} m"
    assert metric(at, "Distance to 10 % LFL") == f"{od['distance_to_lfl_alarm_m']:,.0f} m"
    assert metric(at, "Britter-McQuaid criterion").startswith(f"{od['dense_gas']['value']:.2g}")
