"""UNIFAC activity coefficients (optional thermo package) against measured phase equilibria."""

import numpy as np
import pytest

import estimator
from estimator.errors import InputError

from outside_references import optional_module

CP = optional_module("CoolProp.CoolProp")


@pytest.mark.requires_thermo
def test_ethanol_water_azeotrope():
    """Raoult's law with UNIFAC reproduces the ethanol-water azeotrope at 1 atm: 78.17 degC,
    89.4 mol % ethanol, vapour of the same composition (CRC Handbook azeotrope table,
    from memory): total pressure within 2 % of 101.325 kPa, y within 0.01 of x."""
    hs = estimator.headspace({"ethanol": 0.894, "water": 0.106}, 351.32, 3e5, basis="mole",
                             activity_coefficients="unifac")
    p = hs.partial_pressures
    assert p.sum() == pytest.approx(101325.0, rel=0.02)
    assert p[0] / p.sum() == pytest.approx(0.894, abs=0.01)


@pytest.mark.requires_thermo
@pytest.mark.requires_coolprop
def test_ideal_pair_stays_ideal():
    """Benzene-toluene (near-ideal): UNIFAC bubble pressure within 2 % of CoolProp's
    mixture model, and activity coefficients within 2 % of 1."""
    hs = estimator.headspace({"benzene": 0.5, "toluene": 0.5}, 318.15, basis="mole",
                             activity_coefficients="unifac")
    ref = CP.PropsSI("P", "T", 318.15, "Q", 0, "HEOS::Benzene[0.5]&Toluene[0.5]")
    assert hs.partial_pressures.sum() == pytest.approx(ref, rel=0.02)
    np.testing.assert_allclose(hs.liquid.activity_coefficients, 1.0, atol=0.02)


@pytest.mark.requires_thermo
def test_temperature_sweep_recomputes_and_labels_the_estimate():
    """A sweep gets coefficients at each temperature; the liquid says it is an estimate."""
    hs = estimator.headspace({"methanol": 0.2, "toluene": 0.8}, [288.15, 308.15], basis="mole",
                             activity_coefficients="unifac")
    assert hs.partial_pressures.shape == (2, 2)
    assert "UNIFAC estimate" in hs.liquid.activity_source
    assert any("an estimate" in w for w in hs.warnings)
    ideal = estimator.headspace({"methanol": 0.2, "toluene": 0.8}, 298.15, basis="mole")
    assert ideal.partial_pressures[0] < hs.partial_pressures[0, 0] * 2


def test_bad_method_name():
    """Only 'unifac' is an estimation method."""
    with pytest.raises(InputError, match="unifac"):
        estimator.headspace({"methanol": 0.2, "toluene": 0.8}, 298.15,
                            activity_coefficients="wilson")
