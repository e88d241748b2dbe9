"""Saturation pressures from reference libraries outside ullage, for checks only.

- CoolProp (Bell et al. 2014, Ind. Eng. Chem. Res. 53, 2498): reference and
  technical equations of state, one per fluid, matched to ullage's table by CAS
  number.
- iapws (IAPWS-95, Wagner & Pruss 2002, J. Phys. Chem. Ref. Data 31, 387) for
  water, the international standard for its saturation pressure.
"""

from __future__ import annotations

import functools

import numpy as np

WATER_CAS = "7732-18-5"


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


def has_reference(cas: str) -> bool:
    """Whether an outside reference exists for this CAS number."""
    return cas == WATER_CAS or cas in coolprop_fluids_by_cas()
