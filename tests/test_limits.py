"""User-entered limits, unit conventions and comparisons against published rules."""

import pytest

from estimator.constants import HYGIENE_MOLAR_VOLUME
from estimator.errors import InputError
from estimator.limits import (
    FlammabilityAlarms,
    additive_index,
    compare,
    exposure_limit,
    flammability_findings,
    mg_per_m3_to_ppm,
    ppm_to_mg_per_m3,
    vapor_hazard_ratio,
)


def test_hygiene_molar_volume_convention():
    """24.45 L/mol at 25 degC and 1 atm (common practice in industrial hygiene)."""
    assert HYGIENE_MOLAR_VOLUME == pytest.approx(24.45e-3)
    # 100 ppm of a 24.45 g/mol gas is exactly 100 mg/m3 under the convention.
    assert ppm_to_mg_per_m3(100.0, 0.02445) == pytest.approx(100.0)


def test_ppm_mg_actual_conditions():
    """Ideal-gas molar volume at 373 K, 1 atm is about 30.6 L/mol (common practice)."""
    mg = ppm_to_mg_per_m3(1.0, 0.0306, temperature=373.15)
    assert mg == pytest.approx(1.0, rel=0.002)


def test_ppm_mg_round_trip_arrays():
    """ppm -> mg/m3 -> ppm returns the input, scalars and arrays."""
    import numpy as np

    ppm = np.array([0.5, 20.0, 1e4])
    back = mg_per_m3_to_ppm(ppm_to_mg_per_m3(ppm, 0.07811, 300.0, 9e4), 0.07811, 300.0, 9e4)
    np.testing.assert_allclose(back, ppm, rtol=1e-12)
    assert isinstance(ppm_to_mg_per_m3(1.0, 0.05), float)


def test_toluene_limit_in_mg_converts_to_ppm():
    """75.4 mg/m3 of toluene (92.14 g/mol) is 20 ppm at 24.45 L/mol (common practice)."""
    lim = exposure_limit("toluene", "TWA", 75.4, "mg/m3", "illustrative value")
    assert lim.ppm == pytest.approx(20.0, rel=2e-3)
    assert "illustrative" in lim.label


@pytest.mark.parametrize(
    "kwargs, field, fragment",
    [
        (dict(kind="TWA", value=20, unit="kg", source="x"), "unit", "ppm or mg/m3"),
        (dict(kind="TWA", value=20, unit="", source="x"), "unit", "ppm or mg/m3"),
        (dict(kind="average", value=20, unit="ppm", source="x"), "limit kind", "STEL"),
        (dict(kind="TWA", value=-5, unit="ppm", source="x"), "TWA", "positive"),
        (dict(kind="TWA", value=float("nan"), unit="ppm", source="x"), "TWA", "positive"),
        (dict(kind="TWA", value="abc", unit="ppm", source="x"), "TWA", "expected a number"),
        (dict(kind="TWA", value=20, unit="ppm", source=""), "source", "where the limit"),
        (dict(kind="TWA", value=2e6, unit="ppm", source="x"), "TWA", "above 100 %"),
    ],
)
def test_bad_limits_name_the_field(kwargs, field, fragment):
    """A limit with a wrong unit, kind, value or no source is refused, naming the field."""
    with pytest.raises(InputError) as info:
        exposure_limit("toluene", **kwargs)
    assert field in info.value.field
    assert fragment in str(info.value)


def test_limit_kind_is_case_insensitive():
    """'twa' and 'Ceiling' are accepted."""
    assert exposure_limit("toluene", "twa", 1, "ppm", "x").kind == "TWA"
    assert exposure_limit("toluene", "Ceiling", 1, "ppm", "x").kind == "ceiling"


def test_additive_index_cfr_worked_example():
    """US OSHA 29 CFR 1910.1000(d)(2)(i) example (from memory): 500/1000 + 45/200 +
    40/200 = 0.925, within the limit."""
    limits = [
        exposure_limit("acetone", "TWA", 1000, "ppm", "example"),
        exposure_limit("n-butyl-acetate", "TWA", 200, "ppm", "example"),
        exposure_limit("methyl-ethyl-ketone", "TWA", 200, "ppm", "example"),
    ]
    c = {"acetone": 500e-6, "n-butyl-acetate": 45e-6, "methyl-ethyl-ketone": 40e-6}
    assert additive_index(c, limits) == pytest.approx(0.925)
    assert additive_index(c, limits, kind="STEL") is None


def test_compare_and_hazard_ratio():
    """Ratios are concentration over limit, with a statement that says so."""
    lim = exposure_limit("toluene", "TWA", 20, "ppm", "site rule")
    [cmp] = compare({"toluene": 50e-6, "water": 0.01}, [lim])
    assert cmp.ratio == pytest.approx(2.5)
    assert cmp.exceeded
    assert "2.5 times the TWA of 20 ppm" in cmp.statement and "site rule" in cmp.statement
    assert vapor_hazard_ratio(0.0375, lim) == pytest.approx(1875.0)


def test_confined_space_defaults_are_osha():
    """Defaults: 10 % LFL, 19.5 % and 23.5 % oxygen (US OSHA 29 CFR 1910.146(b))."""
    alarms = FlammabilityAlarms()
    assert (alarms.percent_lfl, alarms.oxygen_low, alarms.oxygen_high) == (10.0, 19.5, 23.5)
    assert "1910.146" in alarms.source


def test_alarm_statements():
    """Statements say which side of each alarm level the atmosphere is on."""
    alarms = FlammabilityAlarms()
    text = " ".join(flammability_findings(12.0, 18.0, alarms))
    assert "at or above the 10 % LFL alarm" in text and "oxygen-deficient" in text
    text = " ".join(flammability_findings(2.0, 20.9, alarms))
    assert "below the 10 % LFL" in text and "within 19.5-23.5" in text


def test_bad_alarms():
    """Alarm levels out of order are refused."""
    with pytest.raises(InputError, match="oxygen"):
        FlammabilityAlarms(oxygen_low=25.0)
    with pytest.raises(InputError, match="LFL"):
        FlammabilityAlarms(percent_lfl=0.0)
