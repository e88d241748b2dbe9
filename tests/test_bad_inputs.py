"""The bad-input catalogue: every entry gives a clear error naming the field and what to do.

One table-driven test across the Python API, scenario files, inventory files, the
command line and the browser front end (AppTest).
Each case: what is fed in, the exact error class (or exit code 2), and a message
fragment that names the field and says what is wrong.
"""

import io
import math
from pathlib import Path

import pandas as pd
import pytest

import estimator
from estimator.cli import main as cli_main
from estimator.errors import InputError, OutOfRangeError, UnknownSubstanceError
from estimator.evaporation import evaporation_rate
from estimator.headspace import headspace, site_pressure, temperature_for_concentration
from estimator.indoor import purge_time, well_mixed_room
from estimator.inventory import screen_inventory
from estimator.limits import exposure_limit
from estimator.outdoor import (
    briggs_sigmas,
    britter_mcquaid_continuous,
    ground_level_centerline,
)
from estimator.scenario import ScenarioError, loads_scenario
from estimator.spill import indoor_spill, outdoor_spill
from estimator.tank import vapor_space_volume
from estimator.units import parse_quantity, parse_temperature
from scenario_texts import MINIMAL_TANK_TOML

ROOT = Path(__file__).resolve().parents[1]
NAN = math.nan
INF = math.inf

API = [
    ("temperature wrong unit", lambda: parse_temperature("20 kg", "liquid temperature"),
     InputError, "liquid temperature", "not a temperature"),
    ("temperature missing unit", lambda: parse_quantity("20", "temperature", "T"),
     InputError, "T", "has no unit"),
    ("volume as a length", lambda: parse_quantity("3 m", "volume", "tank volume"),
     InputError, "tank volume", "is not a volume"),
    ("unknown unit", lambda: parse_quantity("3 blorps", "length", "depth"),
     InputError, "depth", "not a unit"),
    ("NaN text", lambda: parse_quantity("nan m", "length", "depth"), InputError, "depth", "NaN"),
    ("infinite text", lambda: parse_quantity("inf m3", "volume", "V"), InputError, "V",
     "infinite"),
    ("empty text", lambda: parse_quantity("  ", "volume", "V"), InputError, "V", "empty"),
    ("below absolute zero", lambda: parse_temperature("-300 degC", "T"), InputError, "T",
     "absolute zero"),
    ("vapour pressure at 0 K", lambda: estimator.vapor_pressure("water", 0.0),
     OutOfRangeError, "temperature", "absolute zero"),
    ("vapour pressure NaN", lambda: estimator.vapor_pressure("water", NAN), InputError,
     "temperature", "NaN"),
    ("vapour pressure infinite", lambda: estimator.vapor_pressure("water", INF), InputError,
     "temperature", "infinite"),
    ("above critical point", lambda: estimator.vapor_pressure("acetone", 600.0),
     OutOfRangeError, "temperature", "critical temperature"),
    ("below melting point", lambda: estimator.vapor_pressure("benzene", 260.0),
     OutOfRangeError, "temperature", "melting point"),
    ("unknown substance", lambda: estimator.substance("xylenol-9"), UnknownSubstanceError,
     "substance", "no substance is known"),
    ("typo substance", lambda: estimator.substance("acetnoe"), UnknownSubstanceError,
     "substance", "did you mean"),
    ("empty substance", lambda: estimator.substance(""), InputError, "substance",
     "give a substance"),
    ("fractions short of 100 %", lambda: headspace({"toluene": 0.5, "acetone": 0.3}, 298.0),
     InputError, "liquid", "short of 100 %"),
    ("negative fraction", lambda: headspace({"toluene": 1.2, "acetone": -0.2}, 298.0),
     InputError, "liquid", "negative"),
    ("fraction over 100 %", lambda: headspace({"toluene": 1.3}, 298.0), InputError, "liquid",
     "above 100 %"),
    ("unknown component", lambda: headspace({"toluene": 0.5, "unobtainium": 0.5}, 298.0),
     UnknownSubstanceError, "liquid component", "no substance"),
    ("bad basis", lambda: headspace({"toluene": 1.0}, 298.0, basis="weight"), InputError,
     "basis", "mole, mass, volume"),
    ("zero pressure", lambda: headspace("toluene", 298.0, 0.0), InputError, "pressure",
     "above zero"),
    ("negative pressure", lambda: headspace("toluene", 298.0, -1e5), InputError, "pressure",
     "above zero"),
    ("pressure in bar by mistake", lambda: headspace("toluene", 298.0, 1.01), InputError,
     "pressure", "pascals"),
    ("gauge below vacuum", lambda: site_pressure(gauge=-2e5), InputError, "gauge",
     "below minus the barometric"),
    ("target above 1", lambda: temperature_for_concentration("toluene", 2.0), InputError,
     "volume_fraction", "below 1"),
    ("negative activity coefficient",
     lambda: headspace({"toluene": 0.5, "methanol": 0.5}, 298.0,
                       activity_coefficients={"methanol": -1.0}),
     InputError, "activity coefficients", "positive"),
    ("limit in kg", lambda: exposure_limit("toluene", "TWA", 20, "kg", "x"), InputError,
     "unit", "ppm or mg/m3"),
    ("limit no source", lambda: exposure_limit("toluene", "TWA", 20, "ppm", " "), InputError,
     "source", "where the limit"),
    ("limit negative", lambda: exposure_limit("toluene", "TWA", -1, "ppm", "x"), InputError,
     "TWA", "positive"),
    ("evaporation zero area", lambda: evaporation_rate("toluene", 298.0, 0.0, 1.0),
     InputError, "area", ""),
    ("evaporation negative wind", lambda: evaporation_rate("toluene", 298.0, 1.0, -1.0),
     InputError, "wind_speed", ""),
    ("pool hotter than boiling", lambda: evaporation_rate("n-pentane", 320.0, 1.0, 1.0),
     OutOfRangeError, "temperature", "boil"),
    ("unknown evaporation model", lambda: evaporation_rate("toluene", 298.0, 1.0, 1.0,
                                                           model="magic"),
     ValueError, "", "mackay-matsugu"),
    ("room zero volume", lambda: well_mixed_room(1e-4, 0.0, 0.1, [0, 60]), InputError,
     "volume", ""),
    ("mixing factor below 1", lambda: well_mixed_room(1e-4, 100.0, 0.1, [0, 60],
                                                      mixing_factor=0.5),
     InputError, "mixing_factor", "divides"),
    ("times run backwards", lambda: well_mixed_room(1e-4, 100.0, 0.1, [0, 60, 30]),
     InputError, "times", ""),
    ("negative ventilation", lambda: purge_time(100.0, -1.0, 10.0, 1.0), InputError,
     "ventilation_rate", ""),
    ("spill bigger than room", lambda: indoor_spill("toluene", 298.0, room_volume=10.0,
                                                    ventilation_rate=0.1, spilled_volume=20.0),
     InputError, "spilled volume", "not smaller than the room"),
    ("full tank", lambda: vapor_space_volume(10.0, 1.0), InputError, "fill level",
     "no vapour space"),
    ("unknown stability class", lambda: briggs_sigmas(500.0, "G"), ValueError, "", "A"),
    ("boiling at zero pressure", lambda: estimator.boiling_temperature("toluene", 0.0),
     InputError, "pressure", "above zero"),
    ("boiling at a pressure in bar", lambda: estimator.boiling_temperature("water", 1.2),
     InputError, "pressure", "pascals"),
    ("boiling at NaN pressure", lambda: estimator.boiling_temperature("water", NAN),
     InputError, "pressure", "above zero"),
    ("boiling above the critical pressure", lambda: estimator.boiling_temperature(
        "acetone", 9e6), OutOfRangeError, "pressure", "does not boil below the critical"),
    ("mixture wholly frozen", lambda: headspace({"benzene": 0.5, "p-xylene": 0.5}, 273.15),
     OutOfRangeError, "temperature", "whole liquid would freeze"),
    ("component too far below its melting point", lambda: headspace(
        {"p-xylene": 0.1, "toluene": 0.9}, 250.0), OutOfRangeError, "temperature",
     "25 K below its melting point"),
    ("LFL alarm above 100 %", lambda: outdoor_spill(
        "toluene", 293.15, [100.0], wind_speed=2.0, stability="D", area=1.0,
        lfl_alarm_percent=150.0), InputError, "LFL alarm", "above 100 %"),
    ("Britter-McQuaid zero release rate", lambda: britter_mcquaid_continuous(1.0, 0.0, 2.0),
     InputError, "volume release rate", "above 0"),
    ("zero wind plume", lambda: ground_level_centerline(1.0, 0.0, 500.0, "D"), InputError,
     "wind_speed", ""),
    ("user substance molar mass in g/mol",
     lambda: estimator.user_substance("X", 92.0, 383.0), InputError, "molar_mass", "kg/mol"),
]

SCENARIO_BASE = MINIMAL_TANK_TOML

SCENARIO = [
    ("toml syntax error", SCENARIO_BASE.replace('title = "t"', 'title = "t'), "scenario file",
     "not valid TOML"),
    ("unknown key", SCENARIO_BASE.replace("temperature", "temprature"), "temprature",
     "did you mean"),
    ("unknown section", SCENARIO_BASE.replace("[[tank]]", "[[tanker]]"), "[tanker]",
     "unknown section"),
    ("missing title", SCENARIO_BASE.replace('title = "t"', 'site = "x"'), "title",
     "missing required key"),
    ("temperature in kg", SCENARIO_BASE.replace('"25 degC"', '"25 kg"'), "temperature",
     "not a temperature"),
    ("temperature without unit", SCENARIO_BASE.replace('"25 degC"', "25"), "temperature",
     "has no unit"),
    ("unknown liquid reference", SCENARIO_BASE.replace('liquid = "solvent"', 'liquid = "x"'),
     "liquid", "no [[liquid]] is named"),
    ("unknown substance in liquid", SCENARIO_BASE.replace('"toluene"', '"tolune"'),
     "substance", "did you mean"),
    ("fill over 100 %", SCENARIO_BASE + 'fill = "120 %"\n', "fill", "below 100 %"),
    ("negative volume", SCENARIO_BASE + 'volume = "-3 m3"\n', "volume", "above 0"),
    ("both pressure and elevation", SCENARIO_BASE.replace(
        'title = "t"', 'title = "t"\n[conditions]\nelevation = "100 m"\n'
        'barometric_pressure = "99 kPa"'), "elevation", "not both"),
    ("composition does not add up", SCENARIO_BASE.replace(
        'substance = "toluene"', 'components = { toluene = "50 %", acetone = "20 %" }'),
     "components", "short of 100 %"),
    ("limit without source", SCENARIO_BASE + '[[limit]]\nsubstance = "toluene"\nTWA = "2 ppm"\n',
     "source", "missing required key"),
    ("limit without unit", SCENARIO_BASE + '[[limit]]\nsubstance = "toluene"\nTWA = 2\n'
     'source = "x"\n', "TWA", "has no unit"),
    ("room mixing factor below 1", SCENARIO_BASE + '[[room]]\nname = "r"\nvolume = "10 m3"\n'
     'air_changes = "2 1/h"\nmixing_factor = 0.5\n', "mixing_factor", "1 or more"),
    ("spill in unknown room", SCENARIO_BASE + '[[spill]]\nname = "s"\nliquid = "solvent"\n'
     'volume = "1 L"\ntemperature = "20 degC"\nroom = "nowhere"\n', "room",
     "no [[room]] is named"),
    ("table written as array", SCENARIO_BASE + '[[conditions]]\nelevation = "1 m"\n',
     "[conditions]", "single [conditions] table"),
]

INVENTORY_HEADER = "container,liquid,temperature_C\n"
INVENTORY = [
    ("empty file", "", "empty"),
    ("header only", INVENTORY_HEADER, "no data rows"),
    ("missing liquid column", "container,temperature_C\nT1,20\n", "liquid"),
]

INVENTORY_ROWS = [
    ("unknown substance row", "T1,tolune,20\n", "did you mean"),
    ("temperature text row", "T1,toluene,hot\n", "temperature"),
    ("above critical row", "T1,acetone,400\n", "critical"),
    ("formula cell row", "T1,=HYPERLINK(\"x\"),20\n", "formula"),
    ("mixture not summing row", "T1,\"toluene 60%, o-xylene 10%\",20\n", "100 %"),
]

CLI = [
    (["run", "no-such-file.toml"], "cannot read"),
    (["sweep", "toluene", "--from", "20 kg"], "--from"),
    (["sweep", "toluene", "--step", "0 K"], "--step"),
    (["sweep", "toluene", "--pressure", "-5 kPa"], "pressure"),
    (["sweep", "acetone 50%, water 20%"], "100 %"),
    (["inventory", "no-such-file.csv"], "no such file"),
    (["substances", "zzzzzz"], "nothing matches"),
    (["run"], "required"),
]


@pytest.mark.parametrize("case", API, ids=[c[0] for c in API])
def test_api(case):
    """Python API: exact error class, the field named, what to do."""
    _, call, exc, field, fragment = case
    with pytest.raises(exc) as info:
        call()
    if isinstance(info.value, InputError):
        assert field in info.value.field
    assert fragment in str(info.value)


@pytest.mark.parametrize("case", SCENARIO, ids=[c[0] for c in SCENARIO])
def test_scenario_files(case):
    """Scenario files: ScenarioError naming the key and saying what to do."""
    _, text, field, fragment = case
    with pytest.raises(ScenarioError) as info:
        loads_scenario(text)
    assert field in info.value.field
    assert fragment in str(info.value)


@pytest.mark.parametrize("case", INVENTORY, ids=[c[0] for c in INVENTORY])
def test_inventory_files(case, tmp_path):
    """Whole inventory files that cannot be screened are refused with the reason."""
    _, text, fragment = case
    path = tmp_path / "inv.csv"
    path.write_text(text, encoding="utf-8")
    with pytest.raises(InputError) as info:
        screen_inventory(path)
    assert fragment in str(info.value).lower()


@pytest.mark.parametrize("case", INVENTORY_ROWS, ids=[c[0] for c in INVENTORY_ROWS])
def test_inventory_rows(case):
    """A bad row is explained and the good row beside it is still computed."""
    _, row, fragment = case
    frame = pd.read_csv(io.StringIO(INVENTORY_HEADER + row + "T2,toluene,20\n"),
                        dtype=str, keep_default_na=False)
    table = screen_inventory(frame).table
    assert list(table["status"]) [0] == "error"
    assert fragment.lower() in table["reason"].iloc[0].lower()
    assert table["status"].iloc[1] in ("ok", "warning")


def test_inventory_quantity_without_unit_in_cell():
    """Header without a unit: a cell without one is refused for its row, naming the column."""
    frame = pd.DataFrame({"container": ["T1", "T2"], "liquid": ["toluene"] * 2,
                          "temperature": ["20", "20 degC"]})
    table = screen_inventory(frame).table
    assert table["status"].iloc[0] == "error"
    assert "column 'temperature': '20' has no unit" in table["reason"].iloc[0]
    assert table["status"].iloc[1] == "ok"


def _latin1(path):
    path.write_bytes("container,liquid,temperature_C\nCaf\xe9 T1,toluene,20\n".encode("latin-1"))


def _huge(path):
    from estimator.inventory import MAX_FILE_BYTES

    with open(path, "wb") as handle:
        handle.truncate(MAX_FILE_BYTES + 1)


def _xlsx_formula(path):
    import openpyxl

    book = openpyxl.Workbook()
    sheet = book.active
    sheet.append(["container", "liquid", "temperature_C"])
    sheet.append(["T1", "toluene", "=20+5"])
    sheet.append(["T2", "toluene", 20])
    book.save(path)


def _misspelt_column(path):
    path.write_text("container,liquid,temperature_C,twa_ppn\nT1,toluene,20,5\n")


INVENTORY_FILES = [
    ("wrong encoding", "inv.csv", _latin1, "error", "utf-8"),
    ("huge file", "inv.csv", _huge, "error", "mb"),
    ("excel formula cell", "inv.xlsx", _xlsx_formula, "row", "formula"),
    ("misspelt extra column", "inv.csv", _misspelt_column, "warning", "twa_ppm"),
]
#: Cases that write an .xlsx file need openpyxl (marker of tests/conftest.py).
NEEDS_OPENPYXL = {"excel formula cell"}


@pytest.mark.parametrize("case", [
    pytest.param(c, id=c[0],
                 marks=[pytest.mark.requires_openpyxl] if c[0] in NEEDS_OPENPYXL else [])
    for c in INVENTORY_FILES])
def test_inventory_file_faults(case, tmp_path):
    """Encodings, size, formulas and misspelt columns: refused, flagged or warned."""
    _, name, make, outcome, fragment = case
    path = tmp_path / name
    make(path)
    if outcome == "error":
        with pytest.raises(InputError) as info:
            screen_inventory(path)
        assert fragment in str(info.value).lower()
        return
    result = screen_inventory(path)
    if outcome == "row":
        row = result.table.iloc[0]
        assert row["status"] == "error" and fragment in row["reason"].lower()
        assert result.table.iloc[1]["status"] in ("ok", "warning")
    else:
        assert any(fragment in w for w in result.warnings)


@pytest.mark.parametrize("case", CLI, ids=[" ".join(c[0]) for c in CLI])
def test_command_line(case, capsys):
    """Command line: exit code 2, the message on stderr, never a traceback."""
    argv, fragment = case
    code = cli_main(argv)
    out, err = capsys.readouterr()
    assert code == 2
    assert fragment in err
    assert "Traceback" not in out + err


def test_catalogue_size():
    """The catalogue holds at least 60 distinct bad inputs."""
    total = (len(API) + len(SCENARIO) + len(INVENTORY) + len(INVENTORY_ROWS)
             + len(INVENTORY_FILES) + len(CLI) + len(BROWSER))
    assert total >= 60


def _page(name):
    from streamlit.testing.v1 import AppTest

    at = AppTest.from_file(str(ROOT / "ui" / "screens" / name), default_timeout=30)
    return at.run()


def _browser_unknown_substance(at):
    at.radio(key="w:tank.kind").set_value("table")
    at.run()
    at.text_input(key="w:tank.find").input("qqzzxv")


def _browser_above_critical(at):
    at.radio(key="w:tank.kind").set_value("table")
    at.run()
    at.selectbox(key="w:tank.substance").select("acetone")
    at.number_input(key="w:tank.temperature").set_value(300.0)


def _browser_broken_scenario(at):
    at.file_uploader(key="up:scenario").set_value(
        ("broken.toml", b"[scenario\ntitle = 'x'\n", "application/toml"))


def _browser_huge_scenario(at):
    at.file_uploader(key="up:scenario").set_value(
        ("huge.toml", b"#" * 1_100_000, "application/toml"))


def _browser_bad_receptors(at):
    at.text_input(key="w:weather.receptors").input("100 m, far")


def _browser_inventory_columns(at):
    at.file_uploader(key="up:inventory").set_value(
        ("plant.csv", b"tank,stuff\nA,toluene\n", "text/csv"))


def _browser_oxygen_bounds(at):
    at.number_input(key="w:alarm.oxygen_low").set_value(25.0)


BROWSER = [
    ("unknown substance", "tank.py", _browser_unknown_substance, "no substance is known"),
    ("temperature above critical", "tank.py", _browser_above_critical, "critical temperature"),
    ("malformed scenario upload", "tank.py", _browser_broken_scenario, "not valid TOML"),
    ("oversized scenario upload", "tank.py", _browser_huge_scenario, "1,000,000 bytes"),
    ("receptor distances not numbers", "spill_outdoors.py", _browser_bad_receptors,
     "Downwind distances"),
    ("receptor distance without a unit", "spill_outdoors.py",
     lambda at: at.text_input(key="w:weather.receptors").input("100, 300 m"), "has no unit"),
    ("inventory without required columns", "inventory.py", _browser_inventory_columns,
     "liquid"),
    ("oxygen low above high", "limits.py", _browser_oxygen_bounds, "oxygen"),
]


@pytest.mark.parametrize("case", BROWSER, ids=[c[0] for c in BROWSER])
def test_browser_front_end(case):
    """Browser pages: an error message next to the input, never an exception."""
    _, name, act, fragment = case
    at = _page(name)
    act(at)
    at.run()
    assert not at.exception
    shown = "\n".join(e.value for e in at.error)
    assert fragment.lower() in shown.lower()


# ------------------------------------------------------------ safety data sheets

def _sds_cases():
    from estimator.sds import MAX_SDS_BYTES
    from sds_pdf import image_only_pdf

    sheet = ("SECTION 3: Composition/information on ingredients\n"
             "Toluene 108-88-3 90 - 100 %\nFlash point: 4 °C\n")
    return [
        ("image-only PDF", image_only_pdf(), "no text layer", "OCR"),
        ("empty file", b"", "is empty", "give the sheet's text"),
        ("blank text file", b"  \n\n ", "is empty", "PDF from the supplier"),
        ("no composition section", "SECTION 9: Physical and chemical properties\n"
         "Flash point: 4 °C\n", "no composition section", "enter the mixture by hand"),
        ("composition without concentrations", "SECTION 3: Composition/information on "
         "ingredients\nToluene 108-88-3\n", "lists no ingredient", "enter the mixture"),
        ("oversize text", "x" * (MAX_SDS_BYTES + 1), "longer than", "paste only the sheet"),
        ("oversize bytes", b"x" * (MAX_SDS_BYTES + 1), "bytes", "at most"),
        ("Windows-1252 text", sheet.encode("cp1252"), "not UTF-8", "save it as UTF-8"),
        ("not a PDF inside", b"%PDF-1.4\nbroken", "could not be read as a PDF", "paste it"),
        ("unknown point", lambda: estimator.read_sds(sheet).liquid("best"), "not a point",
         "'mid' or 'worst'"),
        ("nothing identified", lambda: estimator.read_sds(
            "3. COMPOSITION/INFORMATION ON INGREDIENTS\nSecret blend  trade secret  100 %\n"
            ).liquid(), "nothing to screen", "pick a surrogate"),
    ]


@pytest.mark.parametrize("case", _sds_cases(), ids=[c[0] for c in _sds_cases()])
def test_safety_data_sheets(case):
    """Safety data sheets: InputError naming the sheet, saying what is wrong and what to do."""
    _, given, fragment, advice = case
    with pytest.raises(InputError) as info:
        given() if callable(given) else estimator.read_sds(given)
    assert fragment in str(info.value) and advice in str(info.value)
    assert info.value.field in ("safety data sheet", "point")


def test_safety_data_sheet_files(tmp_path, capsys):
    """`ullage sds` on bad files: exit 2, the reason, no traceback; big files refused unread."""
    from estimator.sds import MAX_SDS_BYTES

    big = tmp_path / "big.pdf"
    with open(big, "wb") as handle:
        handle.truncate(MAX_SDS_BYTES + 1)
    cases = [([str(big)], "at most"), ([str(tmp_path / "none.txt")], "cannot read"),
             ([str(tmp_path / "sheet.docx")], ".txt or .pdf"),
             ([str(big), "-o", "out.csv"], ".toml")]
    (tmp_path / "sheet.docx").write_bytes(b"x")
    for argv, fragment in cases:
        code = cli_main(["sds"] + argv)
        out, err = capsys.readouterr()
        assert code == 2 and fragment in err and "Traceback" not in out + err, argv


@pytest.mark.parametrize("name,data,fragment", [
    ("scan.pdf", None, "no text layer"),
    ("sheet.txt", "SECTION 3: Composition\nToluene 108-88-3 100 °C %\n".encode("cp1252"),
     "not UTF-8"),
    ("empty.txt", b"", "is empty"),
])
def test_browser_safety_data_sheet_uploads(name, data, fragment):
    """Browser: a bad sheet upload is explained next to the liquid input, never raised."""
    from sds_pdf import image_only_pdf

    at = _page("tank.py")
    at.radio(key="w:tank.kind").set_value("sds")
    at.run()
    at.file_uploader(key="up:tank.sds").set_value(
        (name, image_only_pdf() if data is None else data,
         "application/pdf" if name.endswith(".pdf") else "text/plain"))
    at.run()
    assert not at.exception
    assert any(fragment in e.value for e in at.error)
