"""Saturation pressures from reference libraries outside ullage, for checks only.

- CoolProp (Bell et al. 2014, Ind. Eng. Chem. Res. 53, 2498): reference and
  technical equations of state, one per fluid, matched to ullage's table by CAS
  number.
- iapws (IAPWS-95, Wagner & Pruss 2002, J. Phys. Chem. Ref. Data 31, 387) for
  water, the international standard for its saturation pressure.
"""

from __future__ import annotations

import functools
import importlib

import numpy as np

WATER_CAS = "7732-18-5"


def optional_module(name: str):
    """The module, or None when it is not installed.

    Test files bind the reference libraries with it at import time, so a file
    collects without them; each test that uses one carries the matching marker of
    tests/conftest.py (``requires_coolprop``, ``requires_iapws``, ``requires_thermo``),
    which skips it, or fails it in CI.
    """
    try:
        return importlib.import_module(name)
    except ImportError:
        return None


@functools.cache
def coolprop_fluids_by_cas() -> dict[str, str]:
    """CAS number -> CoolProp fluid name, for the pure fluids CoolProp carries."""
    import CoolProp.CoolProp as CP

    out = {}
    for name in CP.get_global_param_string("FluidsList").split(","):
        cas = CP.get_fluid_param_string(name, "CAS")
        if cas[:1].isdigit() and cas[-1:].isdigit():
            out[cas] = name
    return out


def coolprop_range(cas: str) -> tuple[float, float]:
    """Triple-point and critical temperature of CoolProp's equation of state. [K]"""
    import CoolProp.CoolProp as CP

    name = coolprop_fluids_by_cas()[cas]
    return CP.PropsSI("Ttriple", name), CP.PropsSI("Tcrit", name)


def reference_saturation_pressure(cas: str, temperatures) -> np.ndarray:
    """Saturation pressure from IAPWS-95 (water) or CoolProp (others). [Pa]"""
    t = np.atleast_1d(np.asarray(temperatures, dtype=float))
    if cas == WATER_CAS:
        import iapws

        return np.array([iapws.IAPWS95(T=float(x), x=0).P * 1e6 for x in t])
    import CoolProp.CoolProp as CP

    return np.asarray(CP.PropsSI("P", "T", t, "Q", 0, coolprop_fluids_by_cas()[cas]))


#: Largest violation of the exact Clapeyron equation for a reference point to count. [-]
CLAPEYRON_TOLERANCE = 1e-3


def reference_is_consistent(cas: str, temperatures) -> np.ndarray:
    """Where the reference's saturation pressure obeys the exact Clapeyron equation.

    dp/dT = ΔH / (T Δv) holds exactly for any equation of state at phase
    equilibrium. Where CoolProp's saturation pressure breaks it (with its own ΔH
    and Δv) by more than `CLAPEYRON_TOLERANCE`, the library has not solved phase
    equilibrium there (an ancillary fit stands in, seen for propylene glycol below
    about 25 degC) and the point is no reference.
    """
    t = np.atleast_1d(np.asarray(temperatures, dtype=float))
    if cas == WATER_CAS:
        return np.ones(t.shape, dtype=bool)
    import CoolProp.CoolProp as CP

    name = coolprop_fluids_by_cas()[cas]
    step = 1e-3
    dp_dt = (CP.PropsSI("P", "T", t + step, "Q", 0, name)
             - CP.PropsSI("P", "T", t - step, "Q", 0, name)) / (2 * step)
    dh = CP.PropsSI("H", "T", t, "Q", 1, name) - CP.PropsSI("H", "T", t, "Q", 0, name)
    dv = 1 / CP.PropsSI("D", "T", t, "Q", 1, name) - 1 / CP.PropsSI("D", "T", t, "Q", 0, name)
    return np.abs(t * dv * dp_dt / dh - 1.0) <= CLAPEYRON_TOLERANCE


def has_reference(cas: str) -> bool:
    """Whether an outside reference exists for this CAS number."""
    return cas == WATER_CAS or cas in coolprop_fluids_by_cas()
