"""Vapour-pressure equations against published values and the IAPWS-95 water standard."""

import math

import numpy as np
import pytest

from estimator.constants import GAS_CONSTANT
from estimator.errors import InputError
from estimator.vapor import (
    antoine,
    antoine_to_si,
    clausius_clapeyron,
    clausius_clapeyron_watson,
    dippr101,
    fit_clausius_clapeyron,
    trouton_enthalpy,
    watson_enthalpy,
)

from outside_references import optional_module

iapws = optional_module("iapws")

WATER_MOLAR_MASS = 18.015268e-3  # kg/mol, IAPWS-95
WATER_TC = 647.096  # K, IAPWS-95
WATER_TB = 373.1243  # K at 101325 Pa, IAPWS-95


def iapws_psat(t):
    """Water saturation pressure from IAPWS-95 (iapws package). [Pa]"""
    return np.array([iapws.IAPWS95(T=float(x), x=0).P * 1e6 for x in np.atleast_1d(t)])


def iapws_hvap(t):
    """Water enthalpy of vaporization from IAPWS-95. [J/mol]"""
    liquid, vapour = iapws.IAPWS95(T=t, x=0), iapws.IAPWS95(T=t, x=1)
    return (vapour.h - liquid.h) * 1000 * WATER_MOLAR_MASS


T_WATER = np.arange(274.15, 373.2, 5.0)


@pytest.mark.requires_iapws
def test_antoine_water_against_iapws95():
    """Antoine water coefficients (8.07131, 1730.63, 233.426; mmHg, degC, 1-100 degC;
    from memory) converted to Pa/K agree with IAPWS-95 within 1 %."""
    a, b, c = antoine_to_si(8.07131, 1730.63, 233.426, "mmHg", "degC")
    np.testing.assert_allclose(antoine(T_WATER, a, b, c), iapws_psat(T_WATER), rtol=0.01)


def test_antoine_conversion_conventions_agree():
    """One Antoine line written in four unit conventions gives one pressure."""
    t = np.array([280.0, 300.0, 320.0])
    reference = antoine(t, 9.5, 1500.0, -40.0)
    a, b, c = antoine_to_si(9.5 - 3.0, 1500.0, -40.0 + 273.15, "kPa", "degC")
    np.testing.assert_allclose(antoine(t, a, b, c), reference, rtol=1e-12)
    a, b, c = antoine_to_si((9.5 - 5.0) * math.log(10), 1500.0 * math.log(10), -40.0,
                            "bar", "K", base=math.e)
    np.testing.assert_allclose(antoine(t, a, b, c), reference, rtol=1e-12)
    a, b, c = antoine_to_si(9.5 - math.log10(133.322387415), 1500.0, 233.15, "mmHg", "degC")
    np.testing.assert_allclose(antoine(t, a, b, c), reference, rtol=1e-12)


def test_antoine_conversion_rejects_unknown_units():
    """Unknown units in a coefficient conversion are refused, listing the known ones."""
    with pytest.raises(ValueError, match="mmHg"):
        antoine_to_si(1, 2, 3, "inH2O", "degC")
    with pytest.raises(ValueError, match="degC"):
        antoine_to_si(1, 2, 3, "Pa", "degF")
    with pytest.raises(ValueError, match="base"):
        antoine_to_si(1, 2, 3, "Pa", "K", base=2)


@pytest.mark.requires_iapws
def test_dippr101_water_against_iapws95():
    """Perry's 8th ed. Table 2-8 water coefficients (from memory) match IAPWS-95 to 0.3 %."""
    p = dippr101(T_WATER, 73.649, -7258.2, -7.3037, 4.1653e-6, 2.0)
    np.testing.assert_allclose(p, iapws_psat(T_WATER), rtol=0.003)


@pytest.mark.requires_iapws
def test_watson_water_25c_against_iapws95():
    """Watson from ΔHvap(Tb) (IAPWS-95) gives ΔHvap at 25 degC within 1.5 % of IAPWS-95."""
    h_tb = iapws_hvap(WATER_TB)
    estimate = watson_enthalpy(298.15, WATER_TB, h_tb, WATER_TC)
    assert estimate == pytest.approx(iapws_hvap(298.15), rel=0.015)
    assert estimate == pytest.approx(44565.0, rel=1e-3)


def test_watson_is_zero_at_and_above_critical():
    """ΔHvap vanishes at the critical point."""
    out = watson_enthalpy(np.array([WATER_TC, WATER_TC + 10]), WATER_TB, 40650.0, WATER_TC)
    np.testing.assert_array_equal(out, [0.0, 0.0])


def test_clausius_clapeyron_reproduces_reference_point():
    """At the reference temperature the reference pressure comes back exactly."""
    assert clausius_clapeyron(350.0, 350.0, 12345.0, 30000.0) == pytest.approx(12345.0)


@pytest.mark.requires_iapws
def test_clausius_clapeyron_water_error_is_as_documented():
    """Constant ΔHvap(Tb) from water's boiling point over-predicts at 25 degC by about 18 %
    against IAPWS-95; with Watson's ΔHvap(T) the error falls below 3 % over 1-100 degC."""
    h_tb = iapws_hvap(WATER_TB)
    reference = iapws_psat(T_WATER)
    plain = clausius_clapeyron(T_WATER, WATER_TB, 101325.0, h_tb) / reference - 1
    watson = clausius_clapeyron_watson(T_WATER, WATER_TB, 101325.0, h_tb, WATER_TC) / reference - 1
    at_25 = clausius_clapeyron(298.15, WATER_TB, 101325.0, h_tb) / iapws_psat(298.15)[0] - 1
    assert 0.15 < at_25 < 0.22
    assert plain.max() > 0.3
    assert np.abs(watson).max() < 0.03


def test_clausius_clapeyron_watson_quadrature_matches_closed_form_limit():
    """With exponent 0 Watson's ΔHvap is constant and the integral is plain Clausius-Clapeyron."""
    t = np.linspace(250.0, 400.0, 7)
    plain = clausius_clapeyron(t, 350.0, 5e4, 32000.0)
    integrated = clausius_clapeyron_watson(t, 350.0, 5e4, 32000.0, 600.0, exponent=0.0)
    np.testing.assert_allclose(integrated, plain, rtol=1e-12)


def test_fit_recovers_slope_of_exact_line():
    """A fit to points on an exact line returns its ΔHvap and zero residual."""
    t = np.array([280.0, 300.0, 320.0, 340.0])
    p = clausius_clapeyron(t, 300.0, 1e4, 38000.0)
    fit = fit_clausius_clapeyron(t, p)
    assert fit.enthalpy_of_vaporization == pytest.approx(38000.0, rel=1e-9)
    assert fit.rms_log_residual < 1e-9
    assert fit(310.0) == pytest.approx(clausius_clapeyron(310.0, 300.0, 1e4, 38000.0))
    assert fit.n_points == 4


@pytest.mark.requires_iapws
def test_fit_water_gives_mean_enthalpy_and_residual():
    """A fit to IAPWS-95 water points 1-96 degC gives ΔHvap between the end values
    (IAPWS-95: 45.0 kJ/mol at 1 degC, 41.1 kJ/mol at 96 degC) and a ~2 % residual."""
    fit = fit_clausius_clapeyron(T_WATER, iapws_psat(T_WATER))
    assert iapws_hvap(369.15) < fit.enthalpy_of_vaporization < iapws_hvap(274.15)
    assert 0.005 < fit.rms_log_residual < 0.03


def test_two_point_fit_passes_through_both():
    """Two points (an SDS's boiling point and 20 degC value) are both reproduced."""
    fit = fit_clausius_clapeyron([383.75, 293.15], [101325.0, 2910.0])
    assert fit(383.75) == pytest.approx(101325.0, rel=1e-9)
    assert fit(293.15) == pytest.approx(2910.0, rel=1e-9)
    assert fit.rms_log_residual == pytest.approx(0.0, abs=1e-12)


@pytest.mark.parametrize(
    "temperatures, pressures, field, fragment",
    [
        ([300.0], [1e3], "temperatures", "at least two"),
        ([300.0, 300.0], [1e3, 2e3], "temperatures", "different temperatures"),
        ([300.0, 310.0], [1e3], "pressures", "one pressure per temperature"),
        ([300.0, -1.0], [1e3, 2e3], "temperatures", "above 0 K"),
        ([300.0, 310.0], [1e3, 0.0], "pressures", "above 0 Pa"),
        ([300.0, np.nan], [1e3, 2e3], "temperatures", "finite"),
        ([300.0, 310.0], [2e3, 1e3], "pressures", "rise with temperature"),
    ],
)
def test_fit_rejects_bad_points(temperatures, pressures, field, fragment):
    """Bad fitting points raise an InputError naming the input."""
    with pytest.raises(InputError) as info:
        fit_clausius_clapeyron(temperatures, pressures)
    assert info.value.field == field
    assert fragment in str(info.value)


@pytest.mark.parametrize(
    "boiling_point, crc_enthalpy, tolerance",
    [
        # CRC Handbook of Chemistry and Physics, "Enthalpy of vaporization" table,
        # ΔHvap at Tb (from memory): benzene 30.72, n-hexane 28.85, toluene 33.18 kJ/mol.
        (353.24, 30720.0, 0.03),
        (341.88, 28850.0, 0.05),
        (383.75, 33180.0, 0.03),
    ],
)
def test_trouton_for_non_associating_liquids(boiling_point, crc_enthalpy, tolerance):
    """Trouton's rule is within a few percent for non-polar liquids."""
    assert trouton_enthalpy(boiling_point) == pytest.approx(crc_enthalpy, rel=tolerance)


@pytest.mark.requires_iapws
def test_trouton_fails_for_water_as_documented():
    """Trouton's rule is ~19 % low for hydrogen-bonded water (IAPWS-95 ΔHvap at Tb)."""
    error = trouton_enthalpy(WATER_TB) / iapws_hvap(WATER_TB) - 1
    assert -0.25 < error < -0.15


def test_scalars_stay_scalars_and_arrays_stay_arrays():
    """Scalar in, float out; array in, array of the same shape out."""
    assert isinstance(clausius_clapeyron(300.0, 350.0, 5e4, 3e4), float)
    assert isinstance(dippr101(300.0, 73.649, -7258.2, -7.3037, 4.1653e-6, 2.0), float)
    grid = np.full((3, 4), 300.0)
    assert antoine(grid, 9.0, 1500.0, -40.0).shape == (3, 4)
    assert clausius_clapeyron_watson(grid, 350.0, 5e4, 3e4, 500.0).shape == (3, 4)


def test_gas_constant_is_codata():
    """R = 8.314462618 J/(mol K) (CODATA 2018, exact)."""
    assert GAS_CONSTANT == 8.314462618
