"""Tests of the property look-ups from the optional ``chemicals`` package."""

import csv
import math
from pathlib import Path

import pytest

from estimator import _chemicals_lookup as lk  # noqa: E402

TABLE = Path(__file__).resolve().parents[1] / "estimator" / "data" / "substances.csv"


@pytest.fixture(scope="module")
def acetone():
    return lk.lookup("67-64-1")


def test_lookup_returns_every_column(acetone):
    assert set(acetone) == set(lk.ROW_COLUMNS)
    assert acetone["formula"] == "C3H6O"
    assert acetone["molar_mass"] == pytest.approx(0.05808, rel=1e-4)
    assert acetone["boiling_point"] == pytest.approx(329.2, abs=0.2)
    assert acetone["critical_temperature"] == pytest.approx(508.1, abs=0.5)
    assert "Table 2-8" in acetone["dippr_source"]


def test_antoine_conversion_matches_dippr(acetone):
    dippr = lk.dippr101(298.15, *[acetone[f"dippr_c{i}"] for i in range(1, 6)])
    antoine = lk.antoine(298.15, acetone["antoine_a"], acetone["antoine_b"], acetone["antoine_c"])
    assert dippr == pytest.approx(30.75e3, rel=0.01)
    assert antoine == pytest.approx(dippr, rel=0.005)


def test_landolt_antoine_is_converted_to_log10():
    row = lk.antoine_vapor_pressure("127-18-4")
    assert "Landolt" in row["antoine_source"]
    dippr = lk.dippr_vapor_pressure("127-18-4")
    t = 330.0
    p_dippr = lk.dippr101(t, *[dippr[f"dippr_c{i}"] for i in range(1, 6)])
    p_antoine = lk.antoine(t, row["antoine_a"], row["antoine_b"], row["antoine_c"])
    assert p_antoine == pytest.approx(p_dippr, rel=0.03)


def test_unknown_cas_gives_empty_values():
    row = lk.lookup("1-11-1")
    assert row["molar_mass"] is None
    assert row["boiling_point"] is None
    assert row["dippr_source"] is None


@pytest.mark.parametrize(
    ("formula", "rings", "cas", "expected"),
    [
        ("C6H6", 1, None, 6 * 15.9 + 6 * 2.31 - 18.3),
        ("C2H6O", 0, None, 2 * 15.9 + 6 * 2.31 + 6.11),
        ("H2O", 0, "7732-18-5", 13.1),
        ("CH2Cl2", 0, None, 15.9 + 2 * 2.31 + 2 * 21.0),
    ],
)
def test_fuller_diffusion_volume(formula, rings, cas, expected):
    assert lk.fuller_diffusion_volume(formula, rings, cas)["diffusion_volume"] == pytest.approx(
        expected
    )


def test_fuller_volume_missing_for_elements_without_increment():
    assert lk.fuller_diffusion_volume("Hg", 0)["diffusion_volume"] is None


@pytest.mark.parametrize(
    ("smiles", "rings"),
    [
        ("C1=CC=CC=C1", 1),
        ("c1ccncc1", 1),
        ("C1CCCCC1", 0),
        ("C1=CCCCC1", 0),
        ("O=C1CCCCC1", 0),
        ("C1CCOC1", 1),
        ("CC1CO1", 1),
        ("C1=CC=C2C=CC=CC2=C1", 2),
        ("CCO", 0),
    ],
)
def test_smiles_ring_count(smiles, rings):
    assert lk.smiles_ring_count(smiles) == rings


def test_table_columns_and_sources():
    with TABLE.open(newline="", encoding="utf-8") as handle:
        reader = csv.DictReader(handle)
        assert tuple(reader.fieldnames) == lk.ROW_COLUMNS
        rows = list(reader)
    assert len(rows) >= 60
    keys = [r["key"] for r in rows]
    assert keys == sorted(keys)
    groups = {
        "molar_mass_source": ("molar_mass",),
        "phase_change_source": ("boiling_point", "melting_point"),
        "critical_source": ("critical_temperature", "critical_pressure"),
        "enthalpy_source": ("enthalpy_vaporization_nbp",),
        "dippr_source": ("dippr_c1", "dippr_tmin", "dippr_tmax"),
        "antoine_source": ("antoine_a", "antoine_tmin", "antoine_tmax"),
        "liquid_density_source": ("liquid_density", "liquid_density_temperature"),
        "flammability_source": ("lfl", "ufl"),
        "flash_point_source": ("flash_point",),
        "diffusion_volume_source": ("diffusion_volume",),
    }
    for row in rows:
        for source, columns in groups.items():
            if any(row[c] for c in columns):
                assert row[source], (row["key"], source)
        assert 0.01 <= float(row["molar_mass"]) <= 0.5
        if row["lfl"] and row["ufl"]:
            assert 0.0 < float(row["lfl"]) < float(row["ufl"]) <= 1.0
        if row["flash_point"]:
            assert float(row["flash_point"]) < float(row["boiling_point"])


def test_table_dippr_reproduces_boiling_point():
    with TABLE.open(newline="", encoding="utf-8") as handle:
        rows = list(csv.DictReader(handle))
    for row in rows:
        tb = float(row["boiling_point"])
        if not row["dippr_c1"] or not float(row["dippr_tmin"]) <= tb <= float(row["dippr_tmax"]):
            continue
        p = lk.dippr101(tb, *[float(row[f"dippr_c{i}"]) for i in range(1, 6)])
        assert math.isclose(p, 101325.0, rel_tol=0.03), row["key"]
