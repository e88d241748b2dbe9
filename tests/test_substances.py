"""The bundled property table: integrity, lookup, and user-defined substances."""

import csv
import math

import pytest

import estimator
from estimator.errors import InputError, UnknownSubstanceError
from estimator.substances import TABLE_PATH, all_substances, search_substances, substance

REQUIRED = [
    "acetone", "methyl-ethyl-ketone", "methyl-isobutyl-ketone", "ethyl-acetate",
    "n-butyl-acetate", "methanol", "ethanol", "1-propanol", "isopropanol", "1-butanol",
    "isobutanol", "benzene", "toluene", "o-xylene", "m-xylene", "p-xylene", "ethylbenzene",
    "styrene", "cumene", "n-pentane", "isopentane", "n-hexane", "n-heptane", "n-octane",
    "n-nonane", "n-decane", "cyclopentane", "cyclohexane", "diethyl-ether",
    "methyl-tert-butyl-ether", "tetrahydrofuran", "1-4-dioxane", "dichloromethane",
    "chloroform", "carbon-tetrachloride", "1-2-dichloroethane", "trichloroethylene",
    "tetrachloroethylene", "chlorobenzene", "acetonitrile", "acrylonitrile",
    "vinyl-acetate", "methyl-methacrylate", "carbon-disulfide", "dimethyl-carbonate",
    "acetic-acid", "n-n-dimethylformamide", "ethylene-glycol", "propylene-glycol", "water",
]


@pytest.fixture(scope="module")
def rows():
    with TABLE_PATH.open(newline="", encoding="utf-8") as handle:
        return list(csv.DictReader(handle))


def test_row_count(rows):
    """At least 60 liquids."""
    assert len(rows) >= 60


def test_required_substances_present():
    """Every liquid the project promises is in the table."""
    keys = {s.key for s in all_substances()}
    missing = [k for k in REQUIRED if k not in keys]
    assert not missing, missing


def test_unique_identifiers(rows):
    """No duplicate CAS number, key, name or synonym."""
    cas = [r["cas"] for r in rows]
    assert len(cas) == len(set(cas))
    labels = []
    for r in rows:
        labels += [r["key"].lower(), r["name"].lower()]
        labels += [s.strip().lower() for s in r["synonyms"].split(";") if s.strip()]
    dupes = {x for x in labels if labels.count(x) > 1}
    own = {r["key"].lower() for r in rows if r["key"].lower() == r["name"].lower()}
    assert not (dupes - own), dupes - own


def test_cas_check_digits(rows):
    """Every CAS number has a valid check digit (CAS registry rule, common practice)."""
    for r in rows:
        digits = r["cas"].replace("-", "")
        body, check = digits[:-1], int(digits[-1])
        total = sum((i + 1) * int(d) for i, d in enumerate(reversed(body)))
        assert total % 10 == check, r["cas"]


def test_physical_bounds():
    """Every value lies within physical bounds and is self-consistent."""
    for s in all_substances():
        assert 0.01 < s.molar_mass < 0.5, s.key
        assert s.melting_point is None or s.melting_point < 298.15, s.key
        assert 250.0 < s.boiling_point < s.critical_temperature, s.key
        assert 1e6 < s.critical_pressure < 2e8, s.key  # mercury: 161 MPa
        assert s.liquid_density is None or 500.0 < s.liquid_density < 2000.0, s.key
        if s.lower_flammability_limit is not None:
            assert 0.0 < s.lower_flammability_limit < 0.2, s.key
            ufl = s.upper_flammability_limit
            assert ufl is None or s.lower_flammability_limit < ufl <= 1.0, s.key
        if s.flash_point is not None:
            assert s.flash_point < s.boiling_point, s.key
        assert s.enthalpy_of_vaporization is None or 1e4 < s.enthalpy_of_vaporization < 8e4
        for c in s.correlations:
            assert c.tmin < c.tmax, (s.key, c.method)


def test_vapor_pressure_at_boiling_point():
    """The best correlation gives ~101.325 kPa at the tabulated normal boiling point
    (a cross-check between independently sourced columns)."""
    for s in all_substances():
        p = estimator.vapor_pressure(s, s.boiling_point)
        assert p == pytest.approx(101325.0, rel=0.03), s.key


def test_every_value_group_has_a_source(rows):
    """Each non-empty value group names where it comes from."""
    groups = {
        "molar_mass": "molar_mass_source", "boiling_point": "phase_change_source",
        "critical_temperature": "critical_source",
        "enthalpy_vaporization_nbp": "enthalpy_source", "dippr_c1": "dippr_source",
        "antoine_a": "antoine_source", "liquid_density": "liquid_density_source",
        "lfl": "flammability_source", "flash_point": "flash_point_source",
        "diffusion_volume": "diffusion_volume_source",
    }
    for r in rows:
        for value, source in groups.items():
            if r[value].strip():
                assert r[source].strip(), (r["key"], source)


def test_every_row_has_a_wide_range_correlation_covering_0_60_c():
    """Each row has a DIPPR-101 correlation covering 0-60 degC, or from its melting point."""
    for s in all_substances():
        c = next(c for c in s.correlations if c.method == "dippr101")
        assert c.tmin <= max(273.15, (s.melting_point or 0) + 1.0), s.key
        assert c.tmax >= 333.15 or c.tmax >= s.critical_temperature - 1, s.key


@pytest.mark.parametrize(
    "text, key",
    [("MEK", "methyl-ethyl-ketone"), ("2-butanone", "methyl-ethyl-ketone"),
     ("IPA", "isopropanol"), ("isopropyl alcohol", "isopropanol"),
     ("108-88-3", "toluene"), ("Toluene", "toluene"), ("  toluene ", "toluene"),
     ("methylene chloride", "dichloromethane"), ("PCE", "tetrachloroethylene"),
     ("1,4-dioxane", "1-4-dioxane"), ("THF", "tetrahydrofuran"), ("7732-18-5", "water")],
)
def test_lookup_by_name_synonym_cas(text, key):
    """Names, synonyms and CAS numbers all find the substance."""
    assert substance(text).key == key


def test_unknown_substance_suggests():
    """A typo gets close-match suggestions; the error is a ValueError subclass."""
    with pytest.raises(UnknownSubstanceError) as info:
        substance("tolune")
    assert "toluene" in str(info.value).lower()
    assert isinstance(info.value, ValueError)
    assert info.value.field == "substance"


def test_search():
    """Search by part of a name returns matches."""
    keys = [s.key for s in search_substances("xylene")]
    assert {"o-xylene", "m-xylene", "p-xylene"} <= set(keys)


def test_user_substance_from_sds():
    """An SDS substance gets a two-point Clausius-Clapeyron line through its data."""
    s = estimator.user_substance("Thinner X", 0.1, 390.0, [(293.15, 2000.0)],
                                 lower_flammability_limit=0.01, upper_flammability_limit=0.07)
    assert estimator.vapor_pressure(s, 293.15) == pytest.approx(2000.0, rel=1e-9)
    assert estimator.vapor_pressure(s, 390.0) == pytest.approx(101325.0, rel=1e-9)
    est = estimator.vapor_pressure_estimate(s, 300.0)
    assert est.method == "clausius-clapeyron-fit"


def test_user_substance_without_vapor_pressure_uses_trouton_and_says_so():
    """No SDS vapour pressure: Trouton's rule, flagged in the notes."""
    s = estimator.user_substance("Unknown solvent", 0.12, 420.0)
    assert s.correlations[0].method == "trouton"
    assert "Trouton" in s.notes[0]


@pytest.mark.parametrize(
    "kwargs, field",
    [
        (dict(molar_mass=92.0), "molar_mass"),
        (dict(molar_mass=float("nan")), "molar_mass"),
        (dict(boiling_point=-5.0), "boiling_point"),
        (dict(lower_flammability_limit=1.2), "lower_flammability_limit"),
        (dict(lower_flammability_limit=0.05, upper_flammability_limit=0.01),
         "upper_flammability_limit"),
        (dict(vapor_pressure_points=[(293.15, -1.0)]), "vapor_pressure_points[0] pressure"),
        (dict(vapor_pressure_points=[(293.15,)]), "vapor_pressure_points[0]"),
        (dict(flash_point=500.0), "flash_point"),
    ],
)
def test_user_substance_bad_values(kwargs, field):
    """Out-of-range SDS values are refused, naming the field."""
    args = dict(name="X", molar_mass=0.1, boiling_point=380.0)
    args.update(kwargs)
    with pytest.raises(InputError) as info:
        estimator.user_substance(**args)
    assert info.value.field == field


def test_lookup_cas_through_chemicals():
    """A compound outside the table is found by CAS in the chemicals package, with a
    warning to check it (cyclohexanol, CAS 108-93-0, Tb 434.3 K per the CRC Handbook,
    from memory)."""
    s = estimator.lookup_cas("108-93-0")
    assert s.origin == "lookup"
    assert s.boiling_point == pytest.approx(434.3, abs=1.5)
    assert "check" in s.notes[0]
    with pytest.raises(InputError, match="CAS number such as"):
        estimator.lookup_cas("not-a-cas")


def test_vapor_pressure_errors():
    """Temperatures outside the liquid range are refused with the reason."""
    with pytest.raises(InputError, match="critical temperature"):
        estimator.vapor_pressure("acetone", 600.0)
    with pytest.raises(InputError, match="melting point"):
        estimator.vapor_pressure("water", 250.0)
    with pytest.raises(InputError, match="NaN"):
        estimator.vapor_pressure("water", [300.0, math.nan])
    with pytest.raises(InputError, match="absolute zero"):
        estimator.vapor_pressure("water", -10.0)
    with pytest.raises(UnknownSubstanceError):
        estimator.vapor_pressure("unobtainium", 300.0)
    with pytest.raises(InputError, match="has no data for"):
        estimator.vapor_pressure("water", 300.0, method="clausius-clapeyron-fit")
    with pytest.raises(ValueError, match="unknown method"):
        estimator.vapor_pressure("water", 300.0, method="magic")


def test_user_substance_vapour_pressure_must_rise():
    """SDS points whose vapour pressure falls with temperature are refused."""
    with pytest.raises(InputError, match="must rise with temperature"):
        estimator.user_substance("X", 0.1, 380.0, [(293.15, 90000.0), (303.15, 10000.0)])
    with pytest.raises(InputError, match="must rise with temperature"):
        estimator.user_substance("X", 0.1, 380.0, [(293.15, 150000.0)])
