"""Activity coefficients estimated by UNIFAC, for Raoult's law in non-ideal mixtures.

An estimate, always labelled as one: the original UNIFAC group-contribution
method (Fredenslund, Jones & Prausnitz 1975, AIChE J. 21, 1086), with the public
group parameters and the per-compound group assignments of the Dortmund Data
Bank as distributed by the `thermo` package (MIT licence; optional dependency,
``pip install 'ullage[unifac]'``). Measured activity coefficients, entered by
the user, are better where they exist.
"""

from __future__ import annotations

import functools

import numpy as np

from .errors import InputError

__all__ = ["unifac_groups", "unifac_activity_coefficients", "UNIFAC_SOURCE"]

#: How UNIFAC results are labelled wherever they are shown.
UNIFAC_SOURCE = ("UNIFAC estimate (original UNIFAC, Fredenslund et al. 1975; public "
                 "parameters and Dortmund Data Bank group assignments via the thermo package)")


def _thermo():
    try:
        from thermo import unifac
    except ImportError:
        raise InputError("activity coefficients", "the UNIFAC estimate needs the optional "
                         "'thermo' package: pip install 'ullage[unifac]'") from None
    return unifac


@functools.cache
def _assignments():
    unifac = _thermo()
    unifac.load_group_assignments_DDBST()
    return unifac.DDBST_UNIFAC_assignments


@functools.cache
def unifac_groups(cas: str, name: str = "") -> tuple[tuple[int, int], ...]:
    """UNIFAC subgroups of a compound by CAS number, as (subgroup id, count) pairs.

    Raises
    ------
    InputError
        If the compound has no group assignment.
    """
    from chemicals.identifiers import search_chemical

    label = name or cas
    try:
        key = search_chemical(cas).InChI_key
    except Exception:
        raise InputError("activity coefficients", f"{label}: CAS {cas} is not known to the "
                         "group-assignment table; enter activity coefficients instead") from None
    groups = _assignments().get(key)
    if not groups:
        raise InputError("activity coefficients", f"{label} has no UNIFAC group assignment; "
                         "enter its activity coefficient instead")
    return tuple(sorted(groups.items()))


def unifac_activity_coefficients(components, mole_fractions, temperature):
    """Activity coefficients of each component by original UNIFAC.

    Parameters
    ----------
    components : sequence of Substance
        Each needs a CAS number with a UNIFAC group assignment.
    mole_fractions : array_like
        Liquid mole fractions, shape (n,). [-]
    temperature : float or array_like
        [K]

    Returns
    -------
    numpy.ndarray
        Shape (n, *temperature.shape). [-]
    """
    unifac = _thermo()
    groups = [dict(unifac_groups(c.cas, c.name)) for c in components]
    x = [float(v) for v in np.asarray(mole_fractions, dtype=float)]
    t = np.asarray(temperature, dtype=float)
    flat = [unifac.UNIFAC_gammas(float(tk), x, groups, subgroup_data=unifac.UFSG,
                                 interaction_data=unifac.UFIP) for tk in t.ravel()]
    out = np.asarray(flat, dtype=float).T
    return out.reshape((len(components),) + t.shape)
