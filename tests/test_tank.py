"""Tank vapour space: inventory, filling displacement and thermal breathing."""

import numpy as np
import pytest

import estimator
from estimator.constants import GAS_CONSTANT
from estimator.errors import InputError, OutOfRangeError
from estimator.headspace import headspace
from estimator.tank import (
    filling_displacement,
    thermal_breathing,
    vapor_inventory,
    vapor_space_volume,
)


def test_vapor_space_volume():
    """A 10 m3 tank 80 % full has 2 m3 of vapour space."""
    assert vapor_space_volume(10.0, 0.8) == pytest.approx(2.0)
    with pytest.raises(InputError, match="fill level"):
        vapor_space_volume(10.0, 1.0)


def test_inventory_is_ideal_gas_mass():
    """m = y P V M / (R T) (ideal gas, common practice)."""
    inv = vapor_inventory("toluene", 298.15, 5.0)
    hs = headspace("toluene", 298.15)
    m = estimator.substance("toluene").molar_mass
    expected = float(hs.total_volume_fraction) * 101325.0 * 5.0 * m / (GAS_CONSTANT * 298.15)
    assert inv.total_mass == pytest.approx(expected)


def test_filling_matches_ap42_working_loss():
    """AP-42 Ch. 7.1 working loss with K_N = K_P = K_B = 1 is V_Q W_V, W_V = M_V P_VA/(R T)
    (form from memory): one pumped cubic metre carries out W_V kilograms."""
    t = 303.15
    out = filling_displacement("methanol", t, 2.0)
    sub = estimator.substance("methanol")
    w_v = sub.molar_mass * estimator.vapor_pressure(sub, t) / (GAS_CONSTANT * t)
    assert out.total_mass == pytest.approx(2.0 * w_v, rel=1e-9)


def test_breathing_air_only_is_charles_law():
    """With a barely volatile liquid the vented gas is P V/R (1/T1 - 1/T2) (ideal gas)."""
    loss = thermal_breathing("ethylene glycol", 283.15, 303.15, 10.0)
    expected = 101325.0 * 10.0 / GAS_CONSTANT * (1 / 283.15 - 1 / 303.15)
    assert loss.gas_vented == pytest.approx(expected, rel=0.01)


def test_breathing_against_ap42_expansion_factor():
    """For a small swing the vented vapour matches AP-42 Ch. 7.1 standing loss for one
    day, V_V W_V K_E with K_E = ΔT/T_LA + ΔP_V/(P_A - P_VA), K_S = 1 (form from memory),
    within 10 %."""
    t1, t2, v = 293.15, 301.15, 20.0
    loss = thermal_breathing("toluene", t1, t2, v)
    sub = estimator.substance("toluene")
    p1, p2 = estimator.vapor_pressure(sub, t1), estimator.vapor_pressure(sub, t2)
    t_mean = 0.5 * (t1 + t2)
    p_mean = estimator.vapor_pressure(sub, t_mean)
    w_v = sub.molar_mass * p_mean / (GAS_CONSTANT * t_mean)
    k_e = (t2 - t1) / t_mean + (p2 - p1) / (101325.0 - p_mean)
    assert loss.total_mass == pytest.approx(v * w_v * k_e, rel=0.10)


def test_breathing_mixture_components():
    """Each component leaves in proportion to its vapour fraction."""
    loss = thermal_breathing({"n-hexane": 0.5, "toluene": 0.5}, 288.15, 303.15, 5.0)
    assert loss.masses.shape == (2,)
    assert loss.masses[0] > loss.masses[1] > 0


def test_breathing_bad_inputs():
    """Swing that runs backwards, or boils, is refused."""
    with pytest.raises(InputError, match="above the lowest"):
        thermal_breathing("toluene", 300.0, 290.0, 5.0)
    with pytest.raises(OutOfRangeError, match="boils"):
        thermal_breathing("n-pentane", 290.0, 320.0, 5.0)
    with pytest.raises(InputError, match="positive"):
        thermal_breathing("toluene", 290.0, 300.0, -1.0)


def test_entry_purge_matches_acgih_purge_equation():
    """No residual liquid: t = (K V / Q) ln(C0 / C), the purge equation of ACGIH
    Industrial Ventilation (dilution ventilation chapter; form from memory)."""
    from estimator.tank import entry_purge

    r = entry_purge("toluene", 298.15, 20.0, 0.2, 10e-6, mixing_factor=3.0)
    y0 = float(headspace("toluene", 298.15).total_volume_fraction)
    assert r.time == pytest.approx(3.0 * 20.0 / 0.2 * np.log(y0 / 10e-6), rel=1e-9)
    assert r.reachable


def test_entry_purge_residual_liquid_sets_a_floor():
    """A residual heel sets the floor G K / Q (mol basis); a target below is never met."""
    from estimator.evaporation import evaporation_rate
    from estimator.tank import entry_purge

    r = entry_purge("toluene", 298.15, 20.0, 0.2, 10e-6, mixing_factor=3.0,
                    residual_area=2.0, air_speed=0.5)
    g = evaporation_rate("toluene", 298.15, 2.0, 0.5) / estimator.substance("toluene").molar_mass
    floor = g * 3.0 / 0.2 / (101325.0 / (GAS_CONSTANT * 298.15))
    assert r.floor_volume_fraction == pytest.approx(floor, rel=1e-6)
    assert not r.reachable and r.time == float("inf")
    assert "never be reached" in r.note
