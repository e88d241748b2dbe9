"""Whole-inventory screening: row accounting, agreement with the single-row model, files."""

import csv
import io
import os
import warnings
from pathlib import Path

import numpy as np
import pandas as pd
import pytest

from estimator import CAUTIONS
from estimator.errors import InputError, UllageWarning
from estimator.headspace import barometric_pressure, headspace
from estimator.inventory import (
    FLAMMABILITY_CODES,
    OUTPUT_COLUMNS,
    InventoryScreening,
    headspace_arrays,
    parse_liquid,
    read_inventory,
    screen_inventory,
    sorted_by_concern,
    write_inventory_csv,
)
from estimator.limits import FlammabilityAlarms

EXAMPLE = Path(__file__).resolve().parents[1] / "scenarios" / "inventory_example.csv"


def _screen(frame, **kwargs):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", UllageWarning)
        return screen_inventory(frame, **kwargs)


def _lines_after_cautions(path):
    with open(path, encoding="utf-8-sig", newline="") as handle:
        text = handle.read()
    lines = text.split("\r\n")
    assert lines[:len(CAUTIONS)] == [f"# {c}" for c in CAUTIONS]
    return list(csv.reader(io.StringIO("\r\n".join(lines[len(CAUTIONS):]), newline="")))


# ----------------------------------------------------------------- row accounting

def test_mixed_rows_one_output_row_each_in_order_with_reasons():
    """Good and bad rows: one output row each, in order; bad rows explained by line and column."""
    frame = pd.DataFrame({
        "container": [f"C{i}" for i in range(10)],
        "liquid": ["toluene", "tolune", "acetone", "water", "benzene",
                   "toluene 60%, o-xylene 30%", "MEK", "n-hexane", "methanol", "ethanol"],
        "temperature_C": [25, 25, "warm", None, -20, 20, 20, 500, 20, 20],
        "fill_percent": [50, 50, 50, 50, 50, 50, -3, 50, 50, 120],
        "site_note": list("abcdefghij"),
    })
    result = _screen(frame)
    table = result.table
    assert len(table) == len(frame)
    assert list(table["container"]) == list(frame["container"])
    assert list(table.columns) == list(frame.columns) + list(OUTPUT_COLUMNS)
    expected_bad = {1: "liquid", 2: "temperature_C", 3: "temperature_C", 4: "temperature_C",
                    5: "liquid", 6: "fill_percent", 7: "temperature_C", 9: "fill_percent"}
    for i, column in expected_bad.items():
        assert table["status"].iat[i] == "error"
        assert f"line {i + 2}, column '{column}'" in table["reason"].iat[i]
        assert np.isnan(table["headspace_ppm"].iat[i])
    for i in (0, 8):
        assert table["status"].iat[i] == "ok"
        assert table["headspace_ppm"].iat[i] > 0
    assert "did you mean 'toluene'" in table["reason"].iat[1]
    assert "'warm' is not a number" in table["reason"].iat[2]
    assert "no temperature given" in table["reason"].iat[3]
    assert "below the melting point of Benzene" in table["reason"].iat[4]
    assert "10 points short of 100 %" in table["reason"].iat[5]
    assert "above the critical temperature" in table["reason"].iat[7]
    assert result.summary.counts == {"ok": 2, "warning": 0, "error": 8}
    assert list(table["source_line"]) == list(range(2, 12))


def test_example_file_statuses():
    """The bundled example inventory: each invented row gets the status its note describes."""
    result = _screen(EXAMPLE)
    table = result.table
    status = dict(zip(table["container"], table["status"]))
    assert status["Quarry Lane T-101"] == "ok"
    assert status["Quarry Lane T-102"] == "ok"
    assert status["Quarry Lane D-07"] == "warning"          # full drum
    assert status["Quarry Lane D-08"] == "error"            # misspelt liquid
    assert status["Quarry Lane D-09"] == "error"            # no temperature
    assert status["Ferry Road T-202"] == "error"            # fractions do not sum
    assert status["Ferry Road T-204"] == "warning"          # limit without source
    assert result.cautions == tuple(CAUTIONS)
    assert list(table["area"])[:3] == ["north bund"] * 3    # passed through
    assert result.source == "inventory_example.csv"


# ------------------------------------------------- vectorised path vs single row

def test_vectorised_rows_equal_single_row_headspace():
    """Grouped rows equal estimator.headspace.headspace row by row, mixtures and pressures too."""
    frame = pd.DataFrame({
        "container": list("ABCDEFG"),
        "liquid": ["toluene", "toluene", "acetone", "toluene 60%, o-xylene 40%",
                   "ethanol 95%, water 5%", "n-hexane", "cyclohexane"],
        "basis": ["", "", "", "mass", "", "", ""],
        "temperature_C": [25.0, 0.5, 18.0, 22.0, 25.0, 30.0, 15.0],
        "temperature_high_C": [38.0, None, None, 38.0, 45.0, None, 70.0],
        "pressure_kPa": [None, None, 90.0, None, None, None, None],
        "elevation_m": [None, None, None, None, 1609.0, None, None],
    })
    table = _screen(frame).table
    mixtures = {3: ({"toluene": 0.6, "o-xylene": 0.4}, "mass"),
                4: ({"ethanol": 0.95, "water": 0.05}, "mass")}
    pressures = [101325.0, 101325.0, 90000.0, 101325.0, barometric_pressure(1609.0),
                 101325.0, 101325.0]
    for i in range(len(frame)):
        spec, basis = mixtures.get(i, (frame["liquid"].iat[i], "mole"))
        t = frame["temperature_C"].iat[i] + 273.15
        high = frame["temperature_high_C"].iat[i]
        t_worst = t if np.isnan(high) else high + 273.15
        nominal = headspace(spec, t, pressures[i], basis=basis)
        worst = headspace(spec, t_worst, pressures[i], basis=basis)
        row = table.iloc[i]
        assert row["status"] in ("ok", "warning")
        assert row["headspace_ppm"] == pytest.approx(nominal.total_ppm, rel=1e-12)
        assert row["worst_case_ppm"] == pytest.approx(worst.total_ppm, rel=1e-12)
        assert row["worst_case_mg_per_m3"] == pytest.approx(worst.total_mg_per_m3, rel=1e-12)
        assert row["worst_case_percent_lfl"] == pytest.approx(float(worst.percent_lfl),
                                                              rel=1e-12)
        assert row["worst_case_oxygen_percent"] == pytest.approx(float(worst.oxygen_percent),
                                                                 rel=1e-12)
        assert row["worst_case_flammability"] == worst.flammability.item()
        methods = {e.method for e in nominal.vapor_pressure_methods + worst.vapor_pressure_methods}
        assert all(m in row["vapor_pressure_method"] for m in methods)


@pytest.mark.requires_coolprop
def test_pure_liquid_ppm_against_coolprop():
    """Pure-liquid ppm within 3 % of CoolProp p_sat/P (Bell et al. 2014, Ind. Eng. Chem. Res. 53)"""
    import CoolProp.CoolProp as cp

    fluids = {"toluene": "Toluene", "acetone": "Acetone", "n-hexane": "n-Hexane",
              "methanol": "Methanol"}
    frame = pd.DataFrame({"container": list(fluids), "liquid": list(fluids),
                          "temperature_C": [25.0, 10.0, 35.0, 20.0]})
    table = _screen(frame).table
    for i, (key, fluid) in enumerate(fluids.items()):
        t = frame["temperature_C"].iat[i] + 273.15
        # CoolProp reference equation of state for this fluid, saturated liquid (Q = 0)
        reference = cp.PropsSI("P", "T", t, "Q", 0, fluid) / 101325.0 * 1e6
        assert table["headspace_ppm"].iat[i] == pytest.approx(reference, rel=0.03), key


@pytest.mark.requires_coolprop
def test_mg_per_m3_and_oxygen_at_actual_conditions():
    """At the worst case (30 degC, 95 kPa) for acetone: ppm = p_sat/P, mg/m3 = p_sat M /
    (R T) (ideal gas, common practice) and O2 = 20.9 % (1 - y) (oxygen meters' fresh
    air, common practice; dry air's 20.946 %, US Standard Atmosphere 1976, is 0.22 %
    higher), with p_sat from CoolProp's acetone (Bell et al. 2014), M 58.079 g/mol
    (IUPAC atomic weights) and R of CODATA 2018: within 1 % (2 % for oxygen, where
    1 - y magnifies the error of y)."""
    import CoolProp.CoolProp as cp

    p_ref = cp.PropsSI("P", "T", 303.15, "Q", 0, "Acetone")
    y_ref = p_ref / 95000.0
    frame = pd.DataFrame({"container": ["A"], "liquid": ["acetone"],
                          "temperature_C": [20.0], "temperature_high_C": [30.0],
                          "pressure_kPa": [95.0]})
    row = _screen(frame).table.iloc[0]
    assert row["worst_case_ppm"] == pytest.approx(y_ref * 1e6, rel=0.01)
    assert row["worst_case_mg_per_m3"] == pytest.approx(
        p_ref * 0.058079 / (8.314462618 * 303.15) * 1e6, rel=0.01)
    assert row["worst_case_oxygen_percent"] == pytest.approx(20.9 * (1 - y_ref), rel=0.02)
    assert row["worst_case_oxygen_percent"] == pytest.approx(20.946 * (1 - y_ref), rel=0.02)


def test_pressure_per_row_scales_the_fraction():
    """Half the pressure doubles the vapour fraction below boiling (Dalton's law, common practice)"""
    frame = pd.DataFrame({"container": ["A", "B"], "liquid": ["toluene", "toluene"],
                          "temperature_C": [25.0, 25.0], "pressure_kPa": [101.325, 50.6625]})
    ppm = _screen(frame).table["headspace_ppm"].to_numpy()
    assert ppm[1] == pytest.approx(2 * ppm[0], rel=1e-12)


def test_temperature_units_in_the_header_agree():
    """degC, degF and K headers agree; a cell may repeat the header's unit but not give another."""
    rows = {"temperature_C": [25.0], "Temperature (°F)": [77.0], " TEMPERATURE_K ": [298.15]}
    ppm = []
    for header, values in rows.items():
        frame = pd.DataFrame({"container": ["A"], "liquid": ["toluene"], header: values})
        ppm.append(_screen(frame).table["headspace_ppm"].iat[0])
    assert ppm[1] == pytest.approx(ppm[0], rel=1e-9)
    assert ppm[2] == pytest.approx(ppm[0], rel=1e-9)
    frame = pd.DataFrame({"container": ["A", "B"], "liquid": ["toluene"] * 2,
                          "temperature_C": ["25 degC", "77 degF"]})
    table = _screen(frame).table
    assert table["headspace_ppm"].iat[0] == pytest.approx(ppm[0], rel=1e-9)
    assert table["status"].iat[1] == "error"
    assert "unit of the column header" in table["reason"].iat[1]


def test_range_worst_case_uses_the_high_end():
    """Low/high pair: liquid temperature is the low end, worst case the high; backwards is an error."""
    frame = pd.DataFrame({"container": ["A", "B"], "liquid": ["acetone", "acetone"],
                          "temperature_low_C": [10.0, 30.0],
                          "temperature_high_C": [30.0, 10.0]})
    table = _screen(frame).table
    assert table["liquid_temperature_k"].iat[0] == pytest.approx(283.15)
    assert table["worst_case_temperature_k"].iat[0] == pytest.approx(303.15)
    assert table["worst_case_ppm"].iat[0] == pytest.approx(
        headspace("acetone", 303.15).total_ppm, rel=1e-12)
    assert table["status"].iat[1] == "error"
    assert "column 'temperature_high_C'" in table["reason"].iat[1]


# ------------------------------------------------------------ limits and concern

def test_limits_need_a_source_and_give_ratios():
    """Sourced limits give worst-case ratios; a limit without a source is rejected with a reason."""
    frame = pd.DataFrame({"container": ["A", "B"], "liquid": ["toluene", "toluene"],
                          "temperature_C": [20.0, 20.0], "temperature_high_C": [30.0, 30.0],
                          "TWA_ppm": [20.0, 20.0], "stel_ppm": [100.0, None],
                          "limit_source": ["illustrative", ""]})
    table = _screen(frame).table
    a, b = table.iloc[0], table.iloc[1]
    assert a["twa_ratio"] == pytest.approx(a["worst_case_ppm"] / 20.0)
    assert a["stel_ratio"] == pytest.approx(a["worst_case_ppm"] / 100.0)
    assert a["vapor_hazard_ratio"] == pytest.approx(a["headspace_ppm"] / 20.0)
    assert b["status"] == "warning"
    assert np.isnan(b["twa_ratio"]) and b["worst_case_ppm"] > 0
    assert "line 3, column 'TWA_ppm'" in b["reason"] and "limit_source" in b["reason"]


def test_concern_is_the_largest_normalised_term():
    """concern = max of ppm/limit, %LFL/alarm, O2 displaced/alarm (29 CFR 1910.146(b) defaults)."""
    frame = pd.DataFrame({"container": ["A", "B", "C"],
                          "liquid": ["toluene", "water", "acetone"],
                          "temperature_C": [20.0, 20.0, 0.0],
                          "twa_ppm": [None, None, 1e5], "limit_source": ["", "", "x"]})
    table = _screen(frame).table
    tol, wat, ace = table.iloc[0], table.iloc[1], table.iloc[2]
    assert tol["concern"] == pytest.approx(tol["worst_case_percent_lfl"] / 10.0)
    assert tol["concern_driver"] == "LFL alarm"
    assert wat["concern"] == pytest.approx(
        (20.9 - wat["worst_case_oxygen_percent"]) / (20.9 - 19.5))
    assert wat["concern_driver"] == "oxygen"
    terms = [ace["worst_case_ppm"] / 1e5, ace["worst_case_percent_lfl"] / 10.0,
             (20.9 - ace["worst_case_oxygen_percent"]) / 1.4]
    assert ace["concern"] == pytest.approx(max(terms))
    stricter = _screen(frame, alarms=FlammabilityAlarms(percent_lfl=5.0)).table
    assert stricter["concern"].iat[0] == pytest.approx(2 * tol["concern"])


def test_sorted_by_concern_keeps_every_row():
    """The sorted view has every row once, highest concern first, errors last."""
    result = _screen(EXAMPLE)
    ordered = sorted_by_concern(result)
    assert sorted(ordered["source_line"]) == sorted(result.table["source_line"])
    concern = ordered["concern"].to_numpy()
    finite = concern[np.isfinite(concern)]
    assert np.all(np.diff(finite) <= 0)
    assert np.all(np.isnan(concern[len(finite):]))
    assert ordered["concern_rank"].iat[0] == 1
    assert list(result.summary.worst["source_line"]) == list(ordered["source_line"][:len(
        result.summary.worst)])


# ------------------------------------------------------------------ large tables

def test_ten_thousand_rows_with_five_percent_corrupted():
    """10,000 rows, 5 % corrupted: 10,000 rows out, good rows computed, bad rows explained, fast."""
    rng = np.random.default_rng(7)
    n = 10_000
    liquids = np.array(["toluene", "acetone", "n-hexane", "methanol", "water", "MEK",
                        "ethyl acetate", "toluene 60%, o-xylene 40%", "isopropanol"])
    frame = pd.DataFrame({
        "container": [f"Bay {i // 100}-{i % 100:02d}" for i in range(n)],
        "liquid": rng.choice(liquids, n).astype(object),
        "temperature_C": rng.uniform(10.0, 45.0, n).round(1).astype(object),
        "fill_percent": rng.uniform(5.0, 95.0, n).round(0),
    })
    bad = rng.choice(n, size=n // 20, replace=False)
    corruptions = [
        ("liquid", "xylol-ish"),
        ("liquid", "toluene 70%, o-xylene 10%"),
        ("temperature_C", "hot"),
        ("temperature_C", None),
        ("temperature_C", 900.0),
        ("temperature_C", -150.0),
        ("temperature_C", "=A2+3"),
        ("fill_percent", -10.0),
    ]
    expected = {}
    for k, row in enumerate(bad):
        column, value = corruptions[k % len(corruptions)]
        frame.at[row, column] = value
        expected[row] = column
    table = _screen(frame).table
    assert len(table) == n
    assert list(table["container"]) == list(frame["container"])
    is_bad = np.zeros(n, dtype=bool)
    is_bad[bad] = True
    good = table[~is_bad]
    assert (good["status"] != "error").all()
    assert np.isfinite(good["headspace_ppm"]).all() and (good["headspace_ppm"] > 0).all()
    for row, column in expected.items():
        assert table["status"].iat[row] == "error"
        assert f"line {row + 2}, column '{column}'" in table["reason"].iat[row]
    for row in rng.choice(np.flatnonzero(~is_bad), 5, replace=False):
        spec = frame["liquid"].iat[row]
        if "%" in spec:
            spec = {"toluene": 0.6, "o-xylene": 0.4}
        single = headspace(spec, frame["temperature_C"].iat[row] + 273.15, basis="mass")
        assert table["headspace_ppm"].iat[row] == pytest.approx(single.total_ppm, rel=1e-12)


def test_headspace_arrays_marks_bad_rows_instead_of_raising():
    """The array core marks NaN, 0 K, >Tc, <Tm, unknown liquids and bad pressures, never raises."""
    liquids = ["toluene"] * 5 + ["unobtainium", "acetone", None]
    t = [298.15, np.nan, -1.0, 700.0, 150.0, 298.15, 298.15, 298.15]
    hs = headspace_arrays(liquids, t, pressure=[101325.0] * 6 + [10.0, 101325.0])
    assert hs.problem.tolist() == [0, 1, 2, 3, 4, 5, 6, 5]
    assert hs.valid.tolist() == [True] + [False] * 7
    assert hs.ppm[0] == pytest.approx(headspace("toluene", 298.15).total_ppm, rel=1e-12)
    assert np.all(np.isnan(hs.ppm[1:]))
    assert hs.flammability_states[0] == "flammable" and hs.flammability_states[1] == ""
    single = headspace_arrays("acetone", np.array([280.0, 300.0]))
    assert single.valid.all()
    assert FLAMMABILITY_CODES[single.flammability[1]] == "rich"
    low = headspace_arrays("acetone", np.array([280.0, 300.0]), pressure=500.0)
    assert low.problem.tolist() == [6, 6]
    with pytest.raises(InputError, match="temperatures"):
        headspace_arrays("acetone", [[300.0]])


# ---------------------------------------------------------------------- liquids

def test_mixture_text_forms():
    """'name NN%' and 'NN% name' read alike; commas inside names are kept; duplicates refused."""
    a = parse_liquid("toluene 60%, o-xylene 40%")
    b = parse_liquid("60% toluene; 40% o-xylene")
    assert a.names == b.names == ("Toluene", "o-Xylene")
    np.testing.assert_allclose(a.mole_fractions, b.mole_fractions)
    c = parse_liquid("1,1-dichloroethane 50%, toluene 50%", basis="mole")
    np.testing.assert_allclose(c.mole_fractions, [0.5, 0.5])
    with pytest.raises(InputError, match="cannot be read as a mixture"):
        parse_liquid("toluene 60%, o-xylene")
    with pytest.raises(InputError, match="listed twice"):
        parse_liquid("toluene 50%, Toluene 50%")


def test_basis_column():
    """The basis column selects mole, mass or volume; an unknown basis is reported."""
    frame = pd.DataFrame({"container": list("ABC"),
                          "liquid": ["toluene 50%, n-hexane 50%"] * 3,
                          "basis": ["mole", "wt%", "cups"], "temperature_C": [25.0] * 3})
    table = _screen(frame).table
    mole = headspace({"toluene": 0.5, "n-hexane": 0.5}, 298.15, basis="mole")
    mass = headspace({"toluene": 0.5, "n-hexane": 0.5}, 298.15, basis="mass")
    assert table["headspace_ppm"].iat[0] == pytest.approx(mole.total_ppm, rel=1e-12)
    assert table["headspace_ppm"].iat[1] == pytest.approx(mass.total_ppm, rel=1e-12)
    assert table["status"].iat[2] == "error" and "column 'basis'" in table["reason"].iat[2]


# ------------------------------------------------------------------------ files

@pytest.mark.requires_openpyxl
def test_excel_formula_cell_reported_not_evaluated(tmp_path):
    """An .xlsx formula cell is reported, never evaluated; in a passed-through column, a caution."""
    import openpyxl

    book = openpyxl.Workbook()
    sheet = book.active
    sheet.append(["container", "liquid", "temperature_C", "remarks"])
    sheet.append(["Kiln store 1", "toluene", 25, "fine"])
    sheet.append(["Kiln store 2", "acetone", "=20+5", "fine"])
    sheet.append(["Kiln store 3", "acetone", 20, "=HYPERLINK(\"x\")"])
    path = tmp_path / "site.xlsx"
    book.save(path)
    frame = read_inventory(path)
    assert frame["temperature_C"].iat[1] == "=20+5"
    table = _screen(path).table
    assert table["status"].tolist() == ["ok", "error", "warning"]
    assert "line 3, column 'temperature_C': holds a formula" in table["reason"].iat[1]
    assert np.isnan(table["headspace_ppm"].iat[1])
    assert "line 4, column 'remarks'" in table["reason"].iat[2]
    assert "not evaluated" in table["reason"].iat[2]


def test_latin1_csv_is_a_clear_error(tmp_path):
    """A Latin-1 CSV with a non-ASCII byte is refused, not guessed, naming encoding and line."""
    path = tmp_path / "legacy.csv"
    path.write_bytes("container,liquid,temperature_C\nCuve n°2,toluene,20\n".encode("latin-1"))
    with pytest.raises(InputError, match="not UTF-8") as info:
        read_inventory(path)
    assert info.value.field == "file"
    assert "line 2" in str(info.value) and "CSV UTF-8" in str(info.value)


def test_utf8_with_bom_and_semicolons(tmp_path):
    """UTF-8 with a byte-order mark, semicolons and decimal commas (European exports) are read."""
    path = tmp_path / "bom.csv"
    path.write_bytes("container;liquid;temperature_C\nCuve n°2;toluene;25,0\n"
                     .encode("utf-8-sig"))
    table = _screen(path).table
    assert list(table.columns[:3]) == ["container", "liquid", "temperature_C"]
    assert table["container"].iat[0] == "Cuve n°2"
    assert table["headspace_ppm"].iat[0] == pytest.approx(
        headspace("toluene", 298.15).total_ppm, rel=1e-12)


def test_empty_header_only_and_missing_columns(tmp_path):
    """Empty file, header only, missing or unit-less columns and name clashes: clear messages."""
    empty = tmp_path / "empty.csv"
    empty.write_bytes(b"")
    with pytest.raises(InputError, match="is empty"):
        read_inventory(empty)
    header = tmp_path / "header.csv"
    header.write_text("container,liquid,temperature_C\n", encoding="utf-8")
    with pytest.raises(InputError, match="no data rows"):
        screen_inventory(header)
    missing = pd.DataFrame({"tank": ["A"], "temperature_C": [20.0]})
    with pytest.raises(InputError, match="missing required column.*'container', 'liquid'"):
        screen_inventory(missing)
    no_temperature = pd.DataFrame({"container": ["A"], "liquid": ["toluene"],
                                   "temp_c": [20.0]})
    with pytest.raises(InputError, match="no temperature column.*rename 'temp_c'"):
        screen_inventory(no_temperature)
    unitless = pd.DataFrame({"container": ["A"], "liquid": ["toluene"], "temperature": [20]})
    row = _screen(unitless).table.iloc[0]       # refused for the row, naming the column
    assert row["status"] == "error"
    assert "line 2, column 'temperature': 20 has no unit" in row["reason"]
    assert "temperature_C" in row["reason"]
    clash = pd.DataFrame({"container": ["A"], "liquid": ["toluene"], "temperature_C": [20],
                          "Status": ["in use"]})
    with pytest.raises(InputError, match="'Status' is a column the screening writes"):
        screen_inventory(clash)
    with pytest.raises(InputError, match="no rows"):
        screen_inventory(pd.DataFrame(columns=["container", "liquid", "temperature_C"]))


def test_extra_columns_pass_through_and_misspellings_warn():
    """Unknown columns pass through unchanged; a close misspelling warns with a suggestion."""
    frame = pd.DataFrame({"Container ": ["A"], "LIQUID": ["toluene"], "temperature_C": [20],
                          "temprature_high_c": [40], "owner": ["stores"]})
    with pytest.warns(UllageWarning, match="did you mean 'temperature_high_c'"):
        result = screen_inventory(frame)
    assert result.table["owner"].iat[0] == "stores"
    assert result.table["temprature_high_c"].iat[0] == 40
    assert result.table["worst_case_temperature_k"].iat[0] == pytest.approx(293.15)
    assert any("temprature_high_c" in w for w in result.warnings)


def test_file_size_cap(tmp_path, monkeypatch):
    """A file above the size cap is refused before it is read, stating the limit."""
    import estimator.inventory as inventory

    path = tmp_path / "big.csv"
    path.write_text("container,liquid,temperature_C\n" + "A,toluene,20\n" * 100,
                    encoding="utf-8")
    monkeypatch.setattr(inventory, "MAX_FILE_BYTES", 1000)
    with pytest.raises(InputError, match="above the 1000 bytes limit for one inventory"):
        read_inventory(path)
    assert inventory.MAX_FILE_BYTES == 1000


def test_bad_arguments():
    """A bad file-level pressure, elevation or source is an InputError naming the argument."""
    frame = pd.DataFrame({"container": ["A"], "liquid": ["toluene"], "temperature_C": [20]})
    with pytest.raises(InputError, match="pressure"):
        screen_inventory(frame, pressure=-5.0)
    with pytest.raises(InputError, match="elevation"):
        screen_inventory(frame, pressure=90000.0, elevation=500.0)
    with pytest.raises(InputError, match="source"):
        screen_inventory(42)
    with pytest.raises(InputError, match="no such file"):
        screen_inventory("no-such-inventory.csv")
    result = _screen(frame, elevation=1609.0)
    assert result.pressure == pytest.approx(barometric_pressure(1609.0))
    assert isinstance(result, InventoryScreening)


# ----------------------------------------------------------------------- export

def test_csv_export_neutralises_formula_injection(tmp_path):
    """Export quotes text starting with = + - @ tab CR (OWASP CSV injection); numbers untouched."""
    frame = pd.DataFrame({
        "container": ["=1+2", "+SUM(A1)", "-2+3", "@cmd", "\tx", "\rx", "-5", "plain"],
        "liquid": ["toluene"] * 8, "temperature_C": [20.0] * 8,
        "offset": [-3.5] * 8, "=evil": ["a"] * 8,
    })
    result = _screen(frame)
    path = tmp_path / "out.csv"
    assert write_inventory_csv(result, path) == path
    rows = _lines_after_cautions(path)
    header, body = rows[0], rows[1:]
    assert header[:5] == ["container", "liquid", "temperature_C", "offset", "'=evil"]
    assert [r[0] for r in body] == ["'=1+2", "'+SUM(A1)", "'-2+3", "'@cmd", "'\tx", "'\rx",
                                    "-5", "plain"]
    assert all(r[3] == "-3.5" for r in body)
    assert len(body) == len(frame)
    assert float(body[7][header.index("headspace_ppm")]) == pytest.approx(
        result.table["headspace_ppm"].iat[7])


def test_csv_export_is_atomic(tmp_path, monkeypatch):
    """Export writes a temporary file then replaces: on failure the old file stays, no temp left."""
    result = _screen(EXAMPLE)
    path = tmp_path / "screened.csv"
    path.write_text("previous", encoding="utf-8")

    def broken(*args, **kwargs):
        raise OSError("disk full")

    monkeypatch.setattr(os, "replace", broken)
    with pytest.raises(OSError, match="disk full"):
        write_inventory_csv(result, path)
    assert path.read_text(encoding="utf-8") == "previous"
    assert os.listdir(tmp_path) == ["screened.csv"]
    monkeypatch.undo()
    write_inventory_csv(result.table, path, cautions=False)
    assert os.listdir(tmp_path) == ["screened.csv"]
    back = pd.read_csv(path, encoding="utf-8-sig")
    assert len(back) == len(result.table)


def test_subcooled_component_rows_are_computed():
    """Mixed xylenes at 5 degC (p-xylene melts at 13.3 degC) and 5 % benzene in toluene
    at 0 degC are computed, equal to the headspace function (itself checked against the
    Wagner extrapolation of Poling et al. in test_subcooled); pure benzene at 0 degC and
    a mixture below every melting point are refused."""
    liquids = ["o-xylene 20%, m-xylene 44%, p-xylene 20%, ethylbenzene 16%",
               "benzene 5%, toluene 95%", "benzene", "benzene 50%, p-xylene 50%"]
    t = np.array([278.15, 273.15, 273.15, 273.15])
    hs = headspace_arrays(liquids, t, basis="mass")
    assert hs.valid.tolist() == [True, True, False, False]
    single = headspace({"o-xylene": 0.2, "m-xylene": 0.44, "p-xylene": 0.2,
                        "ethylbenzene": 0.16}, 278.15, basis="mass")
    assert hs.ppm[0] == pytest.approx(single.total_ppm, rel=1e-9)
    single = headspace({"benzene": 0.05, "toluene": 0.95}, 273.15, basis="mass")
    assert hs.ppm[1] == pytest.approx(single.total_ppm, rel=1e-9)


# ------------------------------------------------------------- inventory at scale

def _cli(capsys, *argv):
    from estimator.cli import main

    with warnings.catch_warnings():
        warnings.simplefilter("ignore", UllageWarning)
        code = main(["inventory", *map(str, argv)])
    out, err = capsys.readouterr()
    return code, out, err


def _small_file(path, rows=("T1,toluene,20", "T2,acetone,18")):
    path.write_text("container,liquid,temperature_C\n" + "\n".join(rows) + "\n",
                    encoding="utf-8")
    return path


def test_output_csv_reads_back_with_pandas_comment_lines(tmp_path):
    """pandas.read_csv(out, comment="#") gives the table back: header first, every row and cell."""
    frame = pd.DataFrame({
        "container": ["Tank #3", "a,b \"quoted\"", "line\nbreak", "=evil", "-5", "plain"],
        "liquid": ["toluene", "acetone", "toluene 60%, o-xylene 40%", "MEK", "tolune",
                   "n-hexane"],
        "temperature_C": [20.0, 18.0, 22.0, 25.0, 20.0, 15.0],
        "note #": ["x", "", "# not a comment", "y", "z", "w"],
    })
    result = _screen(frame)
    path = tmp_path / "out.csv"
    write_inventory_csv(result, path)
    with open(path, encoding="utf-8-sig") as handle:
        head = [handle.readline().rstrip("\n") for _ in range(len(CAUTIONS))]
    assert head == [f"# {c}" for c in CAUTIONS]          # the cautions stay in the file
    back = pd.read_csv(path, comment="#", encoding="utf-8-sig", keep_default_na=False)
    table = result.table
    assert list(back.columns) == list(table.columns)
    assert len(back) == len(table)
    assert list(back["container"]) == ["Tank #3", "a,b \"quoted\"", "line\nbreak", "'=evil",
                                       "-5", "plain"]
    assert list(back["note #"]) == ["x", "", "# not a comment", "y", "z", "w"]
    assert list(back["status"]) == list(table["status"])
    assert list(back["reason"]) == list(table["reason"])
    computed = table["status"] != "error"
    for column in ("headspace_ppm", "worst_case_ppm", "concern", "worst_case_percent_lfl"):
        # floats are written with every digit, so they read back exactly
        np.testing.assert_array_equal(pd.to_numeric(back[column][computed]),
                                      table[column][computed].to_numpy())
    assert (back["headspace_ppm"][~computed] == "").all()


def test_cli_exit_status_says_when_rows_were_not_computed(tmp_path, capsys):
    """Rows not computed: exit 2 as for `run`, every row still in the output; else 0 (or 1)."""
    bad = _small_file(tmp_path / "bad.csv", ("T1,toluene,20", "T2,tolune,20", "T3,acetone,x"))
    out = tmp_path / "out.csv"
    code, stdout, err = _cli(capsys, bad, "-o", out)
    assert code == 2
    assert "2 row(s) could not be computed" in err
    back = pd.read_csv(out, comment="#", encoding="utf-8-sig")
    assert list(back["container"]) == ["T1", "T2", "T3"]
    assert list(back["status"]) == ["ok", "error", "error"]
    good = _small_file(tmp_path / "good.csv")
    assert _cli(capsys, good, "-o", out)[0] == 0
    limits = tmp_path / "limits.csv"
    limits.write_text("container,liquid,temperature_C,twa_ppm,limit_source\n"
                      "T1,toluene,20,20,illustrative value\n", encoding="utf-8")
    assert _cli(capsys, limits)[0] == 0
    assert _cli(capsys, limits, "--signal-exceedance")[0] == 1


def test_writer_failure_leaves_no_temporary_file(tmp_path, monkeypatch):
    """A failure, Ctrl-C or SIGTERM inside the writer leaves the old file and no temporary."""
    import signal

    import pyarrow.csv

    result = _screen(EXAMPLE)
    path = tmp_path / "screened.csv"
    path.write_text("previous", encoding="utf-8")
    real = pyarrow.csv.write_csv

    def half_then(error):
        def write(table, handle, options):
            real(table.slice(0, 2), handle, options)   # part of the file is on disk
            if error == "sigterm":
                os.kill(os.getpid(), signal.SIGTERM)
            raise error
        return write

    for error, expected in ((OSError("disk full (simulated)"), OSError),
                            (KeyboardInterrupt(), KeyboardInterrupt),
                            ("sigterm", SystemExit)):
        monkeypatch.setattr(pyarrow.csv, "write_csv", half_then(error))
        with pytest.raises(expected):
            write_inventory_csv(result, path)
        assert os.listdir(tmp_path) == ["screened.csv"], error
        assert path.read_text(encoding="utf-8") == "previous"
    assert signal.getsignal(signal.SIGTERM) == signal.SIG_DFL   # handler restored
    monkeypatch.undo()
    write_inventory_csv(result, path)
    assert os.listdir(tmp_path) == ["screened.csv"]


def test_stale_temporary_files_of_killed_runs_are_cleared(tmp_path):
    """Temporaries of a dead process are removed before writing; others are left alone."""
    import subprocess
    import sys

    from estimator.files import PARTIAL_MARK

    done = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"],
                          capture_output=True, text=True, check=True)
    dead = int(done.stdout)
    stale = tmp_path / f".screened.csv{PARTIAL_MARK}{dead}-0123456789abcdef.tmp"
    stale.write_bytes(b"x" * 1000)
    live = tmp_path / f".screened.csv{PARTIAL_MARK}{os.getpid()}-fedcba9876543210.tmp"
    live.write_bytes(b"in progress")
    other = tmp_path / f".other.csv{PARTIAL_MARK}{dead}-0123456789abcdef.tmp"
    other.write_bytes(b"another target")
    mine = tmp_path / ".screened.csv.keep"
    mine.write_bytes(b"user file")
    write_inventory_csv(_screen(EXAMPLE), tmp_path / "screened.csv")
    assert sorted(p.name for p in tmp_path.iterdir()) == sorted(
        [live.name, other.name, mine.name, "screened.csv"])


@pytest.mark.parametrize("codec, bom", [("utf-16", b""), ("utf-16-le", b""),
                                        ("utf-16-be", b""), ("utf-32", b""),
                                        ("utf-8", b"\xef\xbb\xbf")])
def test_utf16_and_utf32_files_are_read(tmp_path, codec, bom):
    """UTF-16/32 files (by byte-order mark, or by their zero bytes without one) read like UTF-8."""
    text = "container;liquid;temperature_C\r\nCuve n°2;toluene;25,0\r\nCuve 3;acétone?;20\r\n"
    path = tmp_path / "wide.csv"
    path.write_bytes(bom + text.encode(codec))
    table = _screen(path).table
    assert list(table["container"]) == ["Cuve n°2", "Cuve 3"]
    assert table["headspace_ppm"].iat[0] == pytest.approx(headspace("toluene", 298.15).total_ppm,
                                                          rel=1e-12)
    assert "line 3, column 'liquid'" in table["reason"].iat[1]


def test_broken_utf16_is_named_as_utf16(tmp_path):
    """A UTF-16 file with a broken character is called UTF-16, not a legacy encoding."""
    path = tmp_path / "broken.csv"
    path.write_bytes("container,liquid,temperature_C\nT1,toluene,20\n".encode("utf-16")
                     + b"\x00\xd8T\x00")   # an unpaired high surrogate
    with pytest.raises(InputError, match="not UTF-16 text") as info:
        read_inventory(path)
    assert "Latin-1" not in str(info.value) and "line 3" in str(info.value)
    wide = tmp_path / "wide.csv"   # UTF-16 without a mark, text beyond ASCII
    wide.write_bytes("contenant;liquide\nCuve n°2 – été;toluène\n".encode("utf-16-le"))
    with pytest.raises(InputError, match="UTF-16 or UTF-32 text without a byte-order mark"):
        read_inventory(wide)


def test_size_option_and_size_text(tmp_path, capsys, monkeypatch):
    """--max-size sets the limit of a local file (default far above the upload cap)."""
    import estimator.inventory as inventory
    from estimator.files import parse_size

    assert parse_size("500 MB") == 500_000_000
    assert parse_size("2GB") == 2_000_000_000
    assert parse_size("1 GiB") == 2**30       # IEC 80000-13 binary prefix
    for text, fragment in (("500", "has no unit"), ("5 parsecs", "not a unit of size"),
                           ("lots", "not a size"), ("0 MB", "above zero")):
        with pytest.raises(InputError, match=fragment) as info:
            parse_size(text)
        assert info.value.field == "--max-size"
    path = _small_file(tmp_path / "inv.csv", [f"T{i},toluene,20" for i in range(200)])
    code, _, err = _cli(capsys, path, "--max-size", "1 kB")
    assert code == 2 and "above the 1000 bytes limit" in err and "--max-size" in err
    assert _cli(capsys, path, "--max-size", "1 MB")[0] == 0
    code, _, err = _cli(capsys, path, "--max-size", "300")
    assert code == 2 and "--max-size" in err and "no unit" in err
    monkeypatch.setattr(inventory, "MAX_FILE_BYTES", 1000)
    with pytest.raises(InputError, match="1000 bytes limit"):
        screen_inventory(path)                   # the API keeps the small default
    assert screen_inventory(path, max_bytes=10_000).summary.rows == 200
    assert _cli(capsys, path)[0] == 0            # the command line: LOCAL_FILE_BYTES
    assert inventory.LOCAL_FILE_BYTES >= 100_000_000


def test_summary_output_and_top(capsys, tmp_path):
    """The terminal shows counts by concern, the --top rows by concern and every row not computed."""
    result = _screen(EXAMPLE)
    code, out, _ = _cli(capsys, EXAMPLE, "--top", "3", "-o", tmp_path / "o.csv")
    assert code == 2
    assert "Highest concern (3 of 11 rows)" in out
    ranked = sorted_by_concern(result).head(3)
    body = out.split("Highest concern", 1)[1].split("Not computed", 1)[0].splitlines()[2:5]
    assert [int(line.split()[1]) for line in body] == list(ranked["source_line"])
    assert [int(line.split()[0]) for line in body] == [1, 2, 3]
    failed = result.table[result.table["status"] == "error"]
    assert f"Not computed ({len(failed)} row(s))" in out
    for container, reason in zip(failed["container"], failed["reason"]):
        assert f"{container}: {reason}" in out
    bands = {}
    for line in out.split("Concern in the worst case", 1)[1].splitlines()[1:6]:
        label, count = line.rsplit(None, 1)
        bands[label.strip()] = int(count)
    assert sum(bands.values()) == result.summary.rows
    assert bands["1 or more (a limit or alarm reached)"] == result.summary.at_or_above_alarm
    assert CAUTIONS[0] in out
    # a large file: the terminal holds the summary, not the table
    rows = [f"Bay {i},{'toluene' if i % 2 else 'acetone'},{10 + i % 30}" for i in range(3000)]
    big = _small_file(tmp_path / "big.csv", rows)
    code, out, _ = _cli(capsys, big, "--top", "5", "-o", tmp_path / "big_out.csv")
    assert code == 0 and len(out.splitlines()) < 40
    assert "Every row, with its reasons, is in" in out
    assert len(pd.read_csv(tmp_path / "big_out.csv", comment="#")) == 3000
    assert _cli(capsys, big, "--top", "-1")[0] == 2


def test_distinct_blends_each_equal_the_single_row_model():
    """Blends differing on every row are parsed once each and equal headspace() row by row."""
    rng = np.random.default_rng(11)
    shares = rng.integers(100, 9900, 300) / 100.0
    liquids = [f"toluene {a:.2f}%, o-xylene {100 - a:.2f}%" for a in shares]
    bases = rng.choice(["mass", "mole", "volume"], 300)
    liquids[5] = "toluene 60%, o-xylene 39.5%"           # 99.5 %: scaled, with a caution
    liquids[6] = "toluene 60%, o-xylene 20%"             # 80 %: refused
    liquids[7] = "o-xylene 40%, toluene 60%"             # another order of components
    frame = pd.DataFrame({"container": [f"B{i}" for i in range(300)], "liquid": liquids,
                          "basis": bases, "temperature_C": rng.uniform(15, 40, 300).round(1)})
    result = _screen(frame)
    table = result.table
    for i in rng.choice(np.arange(8, 300), 25, replace=False).tolist() + [5, 7]:
        parts = dict(reversed(p.rsplit(" ", 1)) for p in liquids[i].split(", "))
        spec = {name: float(share.rstrip("%")) / 100 for share, name in parts.items()}
        total = sum(spec.values())
        spec = {k: v / total for k, v in spec.items()}
        single = headspace(spec, frame["temperature_C"].iat[i] + 273.15, basis=bases[i])
        assert table["headspace_ppm"].iat[i] == pytest.approx(single.total_ppm, rel=1e-12)
    mass_rows = np.flatnonzero((bases == "mass") & (np.arange(300) > 7))
    core = headspace_arrays([liquids[i] for i in mass_rows],
                            frame["temperature_C"].to_numpy()[mass_rows] + 273.15)
    np.testing.assert_allclose(core.ppm, table["headspace_ppm"].to_numpy()[mass_rows],
                               rtol=1e-12)
    assert table["status"].iat[5] == "warning" and "scaled to 100 %" in table["reason"].iat[5]
    assert table["status"].iat[6] == "error" and "20 points short" in table["reason"].iat[6]
    assert result.summary.liquids == len({(liquids[i], bases[i]) for i in range(300)} - {
        (liquids[6], bases[6])})


def test_cells_carry_their_unit_under_a_header_without_one():
    """Headers without a unit take a unit in every cell; a bare number is refused for its row."""
    frame = pd.DataFrame({
        "container": list("ABCDE"), "liquid": ["toluene"] * 5,
        "temperature": ["77 degF", "298.15 K", "25", "25 degC", "25 kg"],
        "pressure": ["95 kPa", "", "", "1 atm", ""],
        "elevation": ["", "1200 ft", "", "", ""],
    })
    table = _screen(frame).table
    assert list(table["status"]) == ["ok", "ok", "error", "ok", "error"]
    # 77 degF = 25 degC exactly (NIST SP 811); 1200 ft = 365.76 m (international foot)
    assert table["headspace_ppm"].iat[0] == pytest.approx(
        headspace("toluene", 298.15, 95000.0).total_ppm, rel=1e-12)
    assert table["vapor_space_pressure_pa"].iat[1] == pytest.approx(
        barometric_pressure(365.76), rel=1e-12)
    assert table["vapor_space_pressure_pa"].iat[3] == pytest.approx(101325.0)
    assert "column 'temperature': '25' has no unit" in table["reason"].iat[2]
    assert "column 'temperature'" in table["reason"].iat[4]
    numbers_header = pd.DataFrame({"container": ["A"], "liquid": ["toluene"],
                                   "temperature_C": ["25 degC"]})
    assert _screen(numbers_header).table["status"].iat[0] == "ok"   # header unit repeated
