"""Equilibrium headspace: concentrations, flammability, oxygen, against outside references."""

import numpy as np
import pytest

import estimator
from estimator.errors import InputError, OutOfRangeError, UnknownSubstanceError
from estimator.headspace import (
    barometric_pressure,
    estimated_flash_point,
    headspace,
    le_chatelier,
    site_pressure,
    temperature_for_concentration,
    temperature_for_percent_lfl,
)

from outside_references import optional_module

CP = optional_module("CoolProp.CoolProp")


@pytest.mark.requires_coolprop
def test_pure_toluene_against_coolprop():
    """Pure toluene at 25 degC: y = p_sat/P with p_sat within 1 % of CoolProp's EOS."""
    hs = headspace("toluene", 298.15)
    p_ref = CP.PropsSI("P", "T", 298.15, "Q", 0, "Toluene")
    assert hs.total_volume_fraction == pytest.approx(p_ref / 101325.0, rel=0.01)
    assert hs.total_ppm == pytest.approx(p_ref / 101325.0 * 1e6, rel=0.01)


@pytest.mark.requires_coolprop
def test_mg_per_m3_at_actual_conditions():
    """mg/m3 = y P M / (R T) = p_sat M / (R T) at the actual temperature and pressure
    (ideal gas, common practice), not the 25 degC convention: acetone at 35 degC under
    90 kPa, p_sat from CoolProp's acetone (Bell et al. 2014), M 58.079 g/mol (IUPAC
    atomic weights), R of CODATA 2018; within the 1 % of the vapour pressure."""
    p_ref = CP.PropsSI("P", "T", 308.15, "Q", 0, "Acetone")
    expected = p_ref * 0.058079 / (8.314462618 * 308.15) * 1e6
    hs = headspace("acetone", 308.15, pressure=90000.0)
    assert hs.total_mg_per_m3 == pytest.approx(expected, rel=0.01)
    assert float(hs.total_volume_fraction) == pytest.approx(p_ref / 90000.0, rel=0.01)


@pytest.mark.requires_coolprop
def test_benzene_toluene_bubble_pressure_against_coolprop_mixture():
    """Equimolar benzene-toluene at 25-60 degC: Raoult's total pressure within 3 % of
    CoolProp's multi-fluid mixture model (GERG-type departure functions), a near-ideal pair."""
    for t in (298.15, 313.15, 333.15):
        hs = headspace({"benzene": 0.5, "toluene": 0.5}, t)
        p_raoult = hs.partial_pressures.sum()
        p_ref = CP.PropsSI("P", "T", t, "Q", 0, "HEOS::Benzene[0.5]&Toluene[0.5]")
        assert p_raoult == pytest.approx(p_ref, rel=0.03)


def test_mixture_reduces_to_pure():
    """A mixture of one component at mole fraction 1 equals the pure liquid."""
    a = headspace("ethyl acetate", 300.0)
    b = headspace({"ethyl acetate": 1.0}, 300.0)
    assert float(a.total_volume_fraction) == pytest.approx(float(b.total_volume_fraction))


def test_mass_basis_composition():
    """A 50/50 mass mix is converted to mole fractions with the molar masses: toluene
    C7H8 92.138 and n-hexane C6H14 86.175 g/mol (IUPAC atomic weights) give
    x_toluene = (0.5/92.138) / (0.5/92.138 + 0.5/86.175) = 0.48328."""
    hs = headspace({"toluene": 0.5, "n-hexane": 0.5}, 298.15, basis="mass")
    assert hs.liquid.mole_fractions[0] == pytest.approx(0.48328, rel=1e-4)


def test_composition_normalised_with_warning_or_refused():
    """99 % total is scaled with a warning; 80 % is an error saying by how much."""
    hs = headspace({"toluene": 0.5, "o-xylene": 0.49}, 298.15)
    assert any("scaled to 100 %" in w for w in hs.warnings)
    with pytest.raises(InputError, match="20 points short of 100 %"):
        headspace({"toluene": 0.5, "o-xylene": 0.3}, 298.15)


def test_activity_coefficients_scale_partial_pressures():
    """γ = 2 doubles a component's partial pressure (modified Raoult's law)."""
    ideal = headspace({"methanol": 0.2, "toluene": 0.8}, 298.15)
    real = headspace({"methanol": 0.2, "toluene": 0.8}, 298.15,
                     activity_coefficients={"methanol": 2.0})
    assert real.partial_pressures[0] == pytest.approx(2 * ideal.partial_pressures[0])
    assert real.partial_pressures[1] == pytest.approx(ideal.partial_pressures[1])


#: Oxygen in dry air, US Standard Atmosphere 1976 (NOAA/NASA/USAF), Table 3. [%]
DRY_AIR_OXYGEN = 20.946
#: The fresh-air figure oxygen meters are set to (common practice). [%]
METER_FRESH_AIR_OXYGEN = 20.9


def test_oxygen_in_fresh_air_over_a_barely_volatile_liquid():
    """Over ethylene glycol at 25 degC (about 10 Pa of vapour) the space holds fresh
    air: the meter convention's 20.9 % to 0.01 point, and the 20.946 % of dry air (US
    Standard Atmosphere 1976) to within the 0.05 point by which the convention
    rounds it."""
    o2 = float(headspace("ethylene glycol", 298.15).oxygen_percent)
    assert o2 == pytest.approx(METER_FRESH_AIR_OXYGEN, abs=0.01)
    assert o2 == pytest.approx(DRY_AIR_OXYGEN, abs=0.05)
    assert o2 <= DRY_AIR_OXYGEN


@pytest.mark.requires_coolprop
def test_oxygen_by_displacement():
    """O2 % = 20.9 x (1 - y) (oxygen displacement, common practice) over n-pentane at
    20 degC, y = p_sat/P with p_sat from CoolProp's n-pentane (Bell et al. 2014):
    9.23 %, within 1.5 % (the 1 % of p_sat, magnified by 1 - y = 0.44). Against the
    20.946 % of dry air (US Standard Atmosphere 1976) the meter convention reads
    0.22 % low, inside the same tolerance."""
    y_ref = CP.PropsSI("P", "T", 293.15, "Q", 0, "n-Pentane") / 101325.0
    o2 = float(headspace("n-pentane", 293.15).oxygen_percent)
    assert o2 == pytest.approx(METER_FRESH_AIR_OXYGEN * (1 - y_ref), rel=0.015)
    assert o2 == pytest.approx(DRY_AIR_OXYGEN * (1 - y_ref), rel=0.015)


def test_le_chatelier_rule():
    """Le Chatelier: 1/Σ(f_i/L_i) on a fuel-only basis (Mashuga & Crowl 2000, Eq. 1)."""
    assert float(le_chatelier([0.01, 0.03], [0.02, 0.04])) == pytest.approx(0.04 / (0.5 + 0.75))
    assert np.isnan(le_chatelier([0.01], [np.nan]))


def test_flammability_states():
    """Lean, flammable and too-rich states in plain words."""
    cold = headspace("toluene", 273.15 + 0.0)
    warm = headspace("toluene", 273.15 + 25.0)
    hot = headspace("toluene", 273.15 + 80.0)
    assert cold.flammability.item() == "lean"
    assert warm.flammability.item() == "flammable"
    assert hot.flammability.item() == "rich"
    assert "diluted with air" in hot.flammability_words
    assert headspace("water", 300.0).flammability.item() == "none"


def test_boiling_is_reported():
    """Above the boiling point the space is essentially pure vapour, and says so."""
    hs = headspace("acetone", 335.0)
    assert bool(hs.boiling)
    assert float(hs.total_volume_fraction) == pytest.approx(1.0)
    assert any("boiling point" in w for w in hs.warnings)


def test_sweep_shapes():
    """A temperature array gives arrays of every output."""
    t = np.linspace(273.15, 313.15, 9)
    hs = headspace({"toluene": 0.7, "ethylbenzene": 0.3}, t)
    assert hs.volume_fractions.shape == (2, 9)
    assert hs.percent_lfl.shape == (9,)
    assert np.all(np.diff(hs.total_volume_fraction) > 0)


def test_barometric_pressure_standard_atmosphere():
    """U.S. Standard Atmosphere 1976 table (from memory): 1000 m 89.88 kPa, 2000 m
    79.50 kPa, 3000 m 70.12 kPa."""
    np.testing.assert_allclose(barometric_pressure(np.array([1000.0, 2000.0, 3000.0])),
                               [89876.0, 79501.0, 70121.0], rtol=2e-4)
    assert barometric_pressure(0.0) == pytest.approx(101325.0)


def test_site_pressure_gauge():
    """Absolute = barometric + gauge; both barometric and elevation is an error."""
    assert site_pressure(barometric=100000.0, gauge=5000.0) == pytest.approx(105000.0)
    with pytest.raises(InputError, match="not both"):
        site_pressure(barometric=1e5, elevation=100.0)
    with pytest.raises(InputError, match="gauge"):
        site_pressure(gauge=-2e5)


def test_temperature_for_concentration_inverts_headspace():
    """The temperature found gives back the target concentration."""
    t = temperature_for_concentration({"toluene": 0.5, "o-xylene": 0.5}, 0.01)
    hs = headspace({"toluene": 0.5, "o-xylene": 0.5}, t)
    assert float(hs.total_volume_fraction) == pytest.approx(0.01, rel=1e-6)


def test_temperature_for_percent_lfl_alarm():
    """The 10 % LFL temperature lies below the flash-point estimate."""
    t10 = temperature_for_percent_lfl("n-heptane", 10.0)
    t100 = temperature_for_percent_lfl("n-heptane", 100.0)
    assert t10 < t100
    assert float(headspace("n-heptane", t10).percent_lfl) == pytest.approx(10.0, rel=1e-6)


def test_unreachable_targets_are_explained():
    """Targets below the value at the melting point are refused with the reason."""
    with pytest.raises(OutOfRangeError, match="lowest temperature"):
        temperature_for_concentration("water", 1e-4)
    with pytest.raises(InputError, match="lower flammability limit"):
        temperature_for_percent_lfl("water", 10.0)
    with pytest.raises(InputError, match="above 0 and below 1"):
        temperature_for_concentration("toluene", 1.5)


# Flash-point estimates against the published values of IEC 60079-20-1:2010, or NFPA
# 497 (2008) where IEC has none (as carried by the chemicals package; the
# transcription does not record the cup type).
# The estimate is the temperature at which the saturated vapour reaches the LFL
# (ASTM E1232 lower temperature limit), usually a few kelvin below the closed-cup
# flash point. One tolerance for every compound, from a published figure: 6.9 K,
# the reproducibility (95 %: two laboratories differ by more in one case in 20) of
# the Pensky-Martens closed cup, ASTM D93 Procedure A, in the 2001 interlaboratory
# programme quoted in ASTM D7094, Sec. 14.3, Note 6. It is the widest of the closed-
# cup methods (Tag, ASTM D56, 4.1-5.8 K in the 1991 interlaboratory study of
# Montemayor et al.), as the cup behind each published value is not recorded: an
# estimate further off than that is further off than the measurement itself.
FLASH_POINT_TOLERANCE = 6.9
#: Compounds that miss the tolerance, and why (published values compared as carried
#: by the chemicals package: IEC 60079-20-1, NFPA 497, DIPPR via Serat et al. 2017).
FLASH_POINT_MISSES = {
    "carbon-disulfide": "26 K low with its IEC LFL (0.6 %), still 15 K low with NFPA "
                        "497's 1.3 %; the rest not established",
    "n-n-dimethylformamide": "13 K low: the published flash points disagree by 15 K "
                             "(IEC/NFPA 58 degC, DIPPR 43 degC), and IEC's LFL (1.8 %) is "
                             "below NFPA's 2.2 %",
    "n-pentane": "12 K low: the published flash points disagree by 9 K (IEC/NFPA -40 degC, "
                 "DIPPR -49 degC), and IEC's LFL (1.1 %) is below NFPA's 1.5 %",
    "tetrahydrofuran": "10 K low: the published flash points disagree by 10 K (IEC/NFPA "
                       "-14 degC, DIPPR -24 degC), and IEC's LFL (1.5 %) is below NFPA's 2.0 %",
    "formic-acid": "9 K high against IEC's 42 degC; NFPA gives 50 degC, within the "
                   "tolerance; its vapour dimerises, which ideal-gas Raoult's law ignores",
    "methyl-formate": "9 K low: cause not established; the published flash points agree "
                      "(IEC -20 degC, NFPA -19 degC)",
    "aniline": "8 K low against IEC's 75 degC; the published flash points disagree by 8 K "
               "(NFPA 70 degC, DIPPR 67 degC), within the tolerance of both",
    "isobutyl-acetate": "7.3 K high: its NFPA 497 LFL (2.4 %; IEC has none) is high for an "
                        "acetate of its size, and Wikidata carries 1.3 %",
}
#: Their LFL temperature lies below their melting point: no liquid there.
FREEZES_ABOVE_LFL_TEMPERATURE = ("benzene", "cyclohexane", "1-4-dioxane")

FLASH_POINT_CASES = sorted(
    s.key for s in estimator.all_substances()
    if s.flash_point is not None and s.lower_flammability_limit is not None
    and s.key not in FREEZES_ABOVE_LFL_TEMPERATURE)


def test_flash_point_cases_cover_the_table():
    """At least 60 compounds have a flash-point check, and every listed miss is one."""
    assert len(FLASH_POINT_CASES) >= 60
    assert set(FLASH_POINT_MISSES) <= set(FLASH_POINT_CASES)


@pytest.mark.parametrize("key", [
    pytest.param(k, marks=pytest.mark.xfail(strict=True, reason=FLASH_POINT_MISSES[k]))
    if k in FLASH_POINT_MISSES else k
    for k in FLASH_POINT_CASES])
def test_flash_point_estimates_against_published(key):
    """Estimated flash point within 6.9 K (closed-cup reproducibility, ASTM D93 A) of
    IEC 60079-20-1 / NFPA 497; the listed misses are expected failures, each with its
    reason (strict: one that comes inside the tolerance must leave the list)."""
    est = estimated_flash_point(key)
    assert "IEC 60079-20-1" in est.published_source or "NFPA 497" in est.published_source
    assert abs(est.difference) <= FLASH_POINT_TOLERANCE, (key, est.difference)


#: For the misses whose published data disagree: the second published value (as
#: carried by the chemicals package), which the estimate must meet within the same
#: tolerance. (key, what, value, source)
SECOND_PUBLISHED_VALUES = [
    ("n-n-dimethylformamide", "flash point", 273.15 + 43.3, "DIPPR 801 (Serat et al. 2017)"),
    ("n-pentane", "flash point", 273.15 - 49.0, "DIPPR 801 (Serat et al. 2017)"),
    ("tetrahydrofuran", "flash point", 273.15 - 23.8, "DIPPR 801 (Serat et al. 2017)"),
    ("formic-acid", "flash point", 273.15 + 50.0, "NFPA 497 (2008)"),
    ("aniline", "flash point", 273.15 + 70.0, "NFPA 497 (2008)"),
    ("isobutyl-acetate", "LFL", 0.013, "Wikidata, as carried by chemicals"),
]


@pytest.mark.parametrize("key, what, value, source", SECOND_PUBLISHED_VALUES,
                         ids=[c[0] for c in SECOND_PUBLISHED_VALUES])
def test_flash_point_misses_meet_a_second_published_value(key, what, value, source):
    """A miss explained by disagreeing published data meets the other published value
    within the same 6.9 K: its flash point, or the flash point estimated with its LFL."""
    import dataclasses

    sub = estimator.substance(key)
    if what == "LFL":
        est = estimated_flash_point(dataclasses.replace(sub, lower_flammability_limit=value))
        target = est.published
    else:
        est = estimated_flash_point(sub)
        target = value
    assert abs(est.estimate - target) <= FLASH_POINT_TOLERANCE, (key, source)


def test_flash_point_median_is_a_few_kelvin_below():
    """The median estimate lies 1-4 K below the published flash point."""
    diffs = [estimated_flash_point(k).difference for k in FLASH_POINT_CASES]
    assert -4.0 < float(np.median(diffs)) < -1.0


@pytest.mark.parametrize(
    "liquid, temperature, pressure, exc, fragment",
    [
        ("tolune", 298.15, 101325.0, UnknownSubstanceError, "did you mean 'toluene'"),
        ({"toluene": -0.1, "o-xylene": 1.1}, 298.15, 101325.0, InputError, "negative"),
        ({"toluene": 1.2}, 298.15, 101325.0, InputError, "above 100 %"),
        ("toluene", 298.15, 0.0, InputError, "above zero"),
        ("toluene", 298.15, -5.0, InputError, "above zero"),
        ("toluene", 298.15, 1.0, InputError, "absolute, in pascals"),
        ("toluene", float("nan"), 101325.0, InputError, "NaN"),
        ("toluene", 0.0, 101325.0, InputError, "absolute zero"),
        ("toluene", 700.0, 101325.0, OutOfRangeError, "critical temperature"),
        ("benzene", 270.0, 101325.0, OutOfRangeError, "melting point"),
        ({}, 298.15, 101325.0, InputError, "no components"),
    ],
)
def test_bad_headspace_inputs(liquid, temperature, pressure, exc, fragment):
    """Bad liquids, temperatures and pressures raise errors that say what to do."""
    with pytest.raises(exc) as info:
        headspace(liquid, temperature, pressure)
    assert fragment in str(info.value)


def test_component_above_own_boiling_point_warns():
    """A volatile component above its own boiling point in a mixture is flagged."""
    hs = headspace({"n-pentane": 0.05, "n-decane": 0.95}, 313.15)
    assert any("own boiling point" in w for w in hs.warnings)


def test_water_headspace_henry_and_raoult():
    """Over dilute water: solutes by Henry's law, water at IAPWS-95's 3.17 kPa. By hand:
    1 mg/L benzene (M 78.112 g/mol, IUPAC) with Hcp = 1.7e-3 mol/(m3 Pa) at 25 degC,
    the first literature-review entry (Staudinger & Roberts 2001) printed in Sander
    (2015) for benzene (read on the compilation's page for CAS 71-43-2, version 4.0):
    p = 1e-3 / 0.078112 / 1.7e-3 = 7.53 Pa. The compilation's other reviews print
    1.6e-3 and 1.8e-3 (Mackay & Shiu 1981): the spread of the method, about 6 %."""
    from estimator.headspace import water_headspace

    hs = water_headspace({"benzene": 1e-3}, 298.15)
    assert hs.partial_pressures[1] == pytest.approx(7.531, rel=1e-3)
    assert 1e-3 / 0.078112 / 1.8e-3 < hs.partial_pressures[1] < 1e-3 / 0.078112 / 1.6e-3
    assert hs.partial_pressures[0] == pytest.approx(3169.9, rel=0.01)
    assert hs.flammability.item() == "lean"
    assert any("Henry" in w for w in hs.warnings)


def test_water_headspace_flags_above_solubility():
    """Toluene above its water solubility (about 0.5 g/L) is flagged as not dilute,
    and refused at more than twice it."""
    from estimator.headspace import water_headspace

    hs = water_headspace({"toluene": 0.8}, 298.15)
    assert any("solubility" in w for w in hs.warnings)
    with pytest.raises(InputError, match="solubility"):
        water_headspace({"toluene": 2.0}, 298.15)
    with pytest.raises(InputError, match="dissolved"):
        water_headspace({"toluene": -1.0}, 298.15)
