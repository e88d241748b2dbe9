"""Single-compound property look-ups from the ``chemicals`` package.

Each look-up function takes a CAS registry number and returns a plain
``dict`` whose keys are columns of the substance table (see
:data:`ROW_COLUMNS`); :func:`lookup` collects them all for one compound.
Each group of values comes with a ``*_source`` entry naming the original
publication the number was taken from, followed by ``via chemicals`` when
the value was read from the data files shipped with the ``chemicals``
package.  Missing values are ``None``.

All quantities are in SI units:

* molar mass in kg/mol, temperatures in K, pressures in Pa,
  enthalpies in J/mol, densities in kg/m3,
* flammability limits as volume fractions (0.021, not 2.1 %),
* DIPPR-101 vapour pressure ``ln(p/Pa) = C1 + C2/T + C3 ln T + C4 T**C5``,
* Antoine vapour pressure ``log10(p/Pa) = A - B/(T/K + C)``.

``chemicals`` is an optional dependency and is imported only when a
look-up function runs.  The full references of every source are listed in
``estimator/data/SOURCES.md``.

References
----------
.. [1] Bell, C. and contributors. chemicals: Chemical properties component
   of Chemical Engineering Design Library (ChEDL). MIT licence.
.. [2] Green, D. W., Perry, R. H. (eds.) Perry's Chemical Engineers'
   Handbook, 8th ed. McGraw-Hill, 2008.
.. [3] Poling, B. E., Prausnitz, J. M., O'Connell, J. P. The Properties of
   Gases and Liquids, 5th ed. McGraw-Hill, 2001.
.. [4] Fuller, E. N., Schettler, P. D., Giddings, J. C. "A new method for
   prediction of binary gas-phase diffusion coefficients." Ind. Eng. Chem.
   58 (5) (1966) 18-27.
"""

from __future__ import annotations

import functools
import math
import os
import re
from collections import deque
from typing import Any, Callable

ROW_COLUMNS: tuple[str, ...] = (
    "key",
    "name",
    "synonyms",
    "cas",
    "formula",
    "molar_mass",
    "molar_mass_source",
    "boiling_point",
    "melting_point",
    "phase_change_source",
    "critical_temperature",
    "critical_pressure",
    "critical_source",
    "enthalpy_vaporization_nbp",
    "enthalpy_source",
    "dippr_c1",
    "dippr_c2",
    "dippr_c3",
    "dippr_c4",
    "dippr_c5",
    "dippr_tmin",
    "dippr_tmax",
    "dippr_source",
    "antoine_a",
    "antoine_b",
    "antoine_c",
    "antoine_tmin",
    "antoine_tmax",
    "antoine_source",
    "liquid_density",
    "liquid_density_temperature",
    "liquid_density_source",
    "lfl",
    "ufl",
    "flammability_source",
    "flammability_note",
    "flash_point",
    "flash_point_source",
    "diffusion_volume",
    "diffusion_volume_source",
)
"""Column names of the substance table, in file order."""

VIA = ", via chemicals"

SRC_ATOMIC_WEIGHTS = (
    "IUPAC standard atomic weights (2005 table as carried by chemicals.elements),"
    " computed from formula"
)
SRC_CRC_ORGANIC = (
    "CRC Handbook of Chemistry and Physics 95th ed. (physical constants of organic compounds)" + VIA
)
SRC_CRC_INORGANIC = (
    "CRC Handbook of Chemistry and Physics 95th ed. (physical constants of inorganic compounds)"
    + VIA
)
SRC_OPEN_NOTEBOOK = "Open Notebook Science melting point data set (Bradley, Williams & Lang)" + VIA
SRC_COMMON_CHEMISTRY = "CAS Common Chemistry" + VIA
SRC_WEBBOOK = "NIST Chemistry WebBook (SRD 69)" + VIA
SRC_YAWS = "Yaws, Thermophysical Properties of Chemicals and Hydrocarbons, 2nd ed. (2014)" + VIA
SRC_HEOS = "NIST REFPROP reference equations of state (Huber et al. 2022)" + VIA
SRC_IUPAC_CRITICAL = (
    "IUPAC critical data (Ambrose, Young et al., J. Chem. Eng. Data series 1995-2015)" + VIA
)
SRC_CRC_CRITICAL = "CRC Handbook of Chemistry and Physics 95th ed. (critical constants)" + VIA
SRC_MATHEWS_CRITICAL = (
    "Mathews, Chem. Rev. 72 (1972) 71-100 (critical constants of inorganic substances)" + VIA
)
SRC_PSRK_CRITICAL = (
    "Horstmann et al., Fluid Phase Equilib. 227 (2005) 157-164 (PSRK revision 4 appendix)" + VIA
)
SRC_IAPWS95 = "IAPWS-95 formulation (Wagner & Pruss, J. Phys. Chem. Ref. Data 31 (2002) 387)" + VIA
SRC_IAPWS95_DENSITY = (
    "IAPWS-95 formulation (Wagner & Pruss, J. Phys. Chem. Ref. Data 31 (2002) 387)"
    " at 101325 Pa" + VIA
)
SRC_CRC_HVAP = (
    "CRC Handbook of Chemistry and Physics 95th ed."
    " (enthalpy of vaporization at the normal boiling point)" + VIA
)
SRC_CRC_HVAP_TB = (
    "CRC Handbook of Chemistry and Physics 95th ed."
    " (boiling point listed with the enthalpy of vaporization)" + VIA
)
SRC_PERRY_2_150 = (
    "Perry's Chemical Engineers' Handbook 8th ed., Table 2-150 (DIPPR-106),"
    " evaluated at the tabulated normal boiling point" + VIA
)
SRC_VDI_HVAP = (
    "VDI Heat Atlas 2nd ed. (PPDS12 equation), evaluated at the tabulated normal boiling point"
    + VIA
)
SRC_CHEMSEP_HVAP = (
    "ChemSep v8.32 pure component database (Kooijman & Taylor), DIPPR-106,"
    " evaluated at the tabulated normal boiling point; file shipped with chemicals"
)
SRC_PERRY_2_8 = "Perry's Chemical Engineers' Handbook 8th ed., Table 2-8 (DIPPR-101)" + VIA
SRC_CHEMSEP_PSAT = (
    "ChemSep v8.32 pure component database (Kooijman & Taylor), DIPPR-101;"
    " file shipped with chemicals"
)
SRC_ALCOCK_PSAT = (
    "Alcock, Itkin & Horrigan, Can. Metall. Q. 23 (1984) 309 (metallic elements),"
    " converted to DIPPR-101 form by chemicals"
)
SRC_VDI_PSAT_FIT = (
    "DIPPR-101 least-squares refit of the VDI Heat Atlas 2nd ed."
    " PPDS Wagner (2.5-5 form) equation, max deviation {dev:.2g} % over the stated range" + VIA
)
SRC_POLING_ANTOINE = (
    "Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids, 5th ed.,"
    " Appendix A Antoine set" + VIA
)
SRC_LANDOLT_ANTOINE = (
    "Landolt-Boernstein New Series IV/20 (Dykyj, Svoboda, Wilhoit, Frenkel & Hall,"
    " Springer 1999-2001), Antoine constants converted from ln to log10" + VIA
)
SRC_PERRY_DENSITY = (
    "Perry's Chemical Engineers' Handbook 8th ed., liquid density table (DIPPR-105)" + VIA
)
SRC_VDI_DENSITY = "VDI Heat Atlas 2nd ed. (PPDS saturated liquid density equation)" + VIA
SRC_CHEMSEP_DENSITY = (
    "ChemSep v8.32 pure component database (Kooijman & Taylor), DIPPR-105;"
    " file shipped with chemicals"
)
SRC_CRC_INORGANIC_DENSITY = (
    "CRC Handbook of Chemistry and Physics 95th ed. (physical constants of"
    " inorganic compounds, density at 25 C)" + VIA
)
SRC_IEC = "IEC 60079-20-1:2010" + VIA
SRC_NFPA = "NFPA 497 (2008)" + VIA
FLASH_POINT_NOTE = "; cup type not recorded in the transcribed table"
SRC_FULLER = (
    "Fuller, Schettler & Giddings (1966) atomic diffusion volumes as tabulated in"
    " Poling, Prausnitz & O'Connell 5th ed., Table 11-1; sum computed from formula"
)
SRC_FULLER_MOLECULAR = (
    "Fuller, Schettler & Giddings (1966) molecular diffusion volume as tabulated in"
    " Poling, Prausnitz & O'Connell 5th ed., Table 11-1"
)

FULLER_ATOMIC_VOLUMES: dict[str, float] = {
    "C": 15.9,
    "H": 2.31,
    "O": 6.11,
    "N": 4.54,
    "F": 14.7,
    "Cl": 21.0,
    "Br": 21.9,
    "I": 29.8,
    "S": 22.9,
}
"""Fuller atomic diffusion-volume increments (Poling 5th ed., Table 11-1)."""

FULLER_RING_INCREMENT = -18.3
"""Fuller increment for each aromatic or heterocyclic ring."""

FULLER_MOLECULAR_VOLUMES: dict[str, float] = {
    "7732-18-5": 13.1,
}
"""Fuller diffusion volumes given for whole molecules, keyed by CAS number."""

WATER_CAS = "7732-18-5"
REFERENCE_TEMPERATURE = 298.15


def chemicals_package():
    """Import and return the ``chemicals`` package.

    Raises
    ------
    ImportError
        If ``chemicals`` is not installed.
    """
    try:
        import chemicals
    except ImportError as exc:
        raise ImportError(
            "the optional dependency 'chemicals' is required for property look-ups"
            " (pip install chemicals)"
        ) from exc
    return chemicals


def _value(x: Any) -> float | None:
    """Return ``x`` as a finite float, or None for missing or NaN values."""
    if x is None:
        return None
    try:
        v = float(x)
    except (TypeError, ValueError):
        return None
    if math.isnan(v) or math.isinf(v):
        return None
    return v


def _row(df, cas: str):
    """Return the row of ``df`` indexed by ``cas``, or None."""
    if df is None or cas not in df.index:
        return None
    row = df.loc[cas]
    if getattr(row, "ndim", 1) > 1:
        row = row.iloc[0]
    return row


def _join_sources(parts: dict[str, str | None]) -> str | None:
    """Combine per-quantity sources into one source string.

    Parameters
    ----------
    parts : dict
        Mapping of a quantity label to its source (None where the quantity
        is missing).

    Returns
    -------
    str or None
        The single source when all present quantities share it, otherwise
        ``"label: source; label: source"``; None when nothing is present.
    """
    present = {k: v for k, v in parts.items() if v}
    if not present:
        return None
    unique = set(present.values())
    if len(unique) == 1:
        return unique.pop()
    return "; ".join(f"{k}: {v}" for k, v in present.items())


def dippr101(T: float, c1: float, c2: float, c3: float, c4: float, c5: float) -> float:
    """Evaluate the DIPPR-101 vapour-pressure equation.

    Parameters
    ----------
    T : float
        Temperature [K].
    c1, c2, c3, c4, c5 : float
        Coefficients of ``ln(p/Pa) = c1 + c2/T + c3 ln T + c4 T**c5``.

    Returns
    -------
    float
        Vapour pressure [Pa].

    References
    ----------
    .. [1] Green, D. W., Perry, R. H. (eds.) Perry's Chemical Engineers'
       Handbook, 8th ed. McGraw-Hill, 2008, Table 2-8.
    """
    return math.exp(c1 + c2 / T + c3 * math.log(T) + c4 * T**c5)


def antoine(T: float, a: float, b: float, c: float) -> float:
    """Evaluate the Antoine equation in the table's convention.

    Parameters
    ----------
    T : float
        Temperature [K].
    a, b, c : float
        Coefficients of ``log10(p/Pa) = a - b/(T/K + c)``.

    Returns
    -------
    float
        Vapour pressure [Pa].

    References
    ----------
    .. [1] Poling, B. E., Prausnitz, J. M., O'Connell, J. P. The Properties of
       Gases and Liquids, 5th ed. McGraw-Hill, 2001, Appendix A.
    """
    return 10.0 ** (a - b / (T + c))


@functools.lru_cache(maxsize=1)
def _chemsep_database() -> dict[str, Any]:
    """Parse the ChemSep pure-component XML file shipped with ``chemicals``.

    Returns
    -------
    dict
        Mapping of CAS number to the ``<compound>`` XML element; empty when
        the file is absent.
    """
    import glob
    import xml.etree.ElementTree as ET

    chemicals = chemicals_package()
    folder = os.path.join(os.path.dirname(chemicals.__file__), "Misc")
    paths = sorted(glob.glob(os.path.join(folder, "ChemSep*.xml")))
    if not paths:
        return {}
    db: dict[str, Any] = {}
    for compound in ET.parse(paths[-1]).getroot().iter("compound"):
        cas_el = compound.find("CAS")
        if cas_el is not None and cas_el.get("value"):
            db.setdefault(cas_el.get("value"), compound)
    return db


def _chemsep_equation(cas: str, tag: str, eqno: str) -> dict[str, float] | None:
    """Return ChemSep coefficients of one temperature correlation.

    Parameters
    ----------
    cas : str
        CAS number.
    tag : str
        XML tag of the property (e.g. ``"VaporPressure"``).
    eqno : str
        Required DIPPR equation number (e.g. ``"101"``).

    Returns
    -------
    dict or None
        Coefficients ``A``..``E`` (missing ones as 0.0) and ``Tmin``,
        ``Tmax``; None if the compound or correlation is absent.
    """
    compound = _chemsep_database().get(cas)
    if compound is None:
        return None
    el = compound.find(tag)
    if el is None or el.find("eqno") is None or el.find("eqno").get("value") != eqno:
        return None
    out: dict[str, float] = {}
    for name in ("A", "B", "C", "D", "E", "Tmin", "Tmax"):
        sub = el.find(name)
        out[name] = _value(sub.get("value")) if sub is not None else None
    for name in ("A", "B", "C", "D", "E"):
        if out[name] is None:
            out[name] = 0.0
    if out["Tmin"] is None or out["Tmax"] is None:
        return None
    return out


def _chemsep_scalar(cas: str, tag: str) -> float | None:
    """Return a scalar ChemSep property value, or None."""
    compound = _chemsep_database().get(cas)
    if compound is None:
        return None
    el = compound.find(tag)
    return _value(el.get("value")) if el is not None else None


def identity(cas: str) -> dict[str, Any]:
    """Look up the name and formula of a compound.

    Parameters
    ----------
    cas : str
        CAS registry number.

    Returns
    -------
    dict
        ``cas``, ``name`` (the common name in the ``chemicals`` database)
        and ``formula`` (Hill order); name and formula are None if unknown.
    """
    chemicals_package()
    from chemicals.identifiers import search_chemical

    try:
        meta = search_chemical(cas)
    except Exception:
        return {"cas": cas, "name": None, "formula": None}
    return {"cas": cas, "name": meta.common_name, "formula": meta.formula}


def parse_formula(formula: str) -> dict[str, int]:
    """Count the atoms in a simple molecular formula.

    Parameters
    ----------
    formula : str
        Formula without brackets or charges, e.g. ``"C2H6O"``.

    Returns
    -------
    dict
        Element symbol to atom count.

    Raises
    ------
    ValueError
        If the formula contains anything other than element symbols and
        counts.
    """
    if not re.fullmatch(r"(?:[A-Z][a-z]?\d*)+", formula):
        raise ValueError(f"unsupported formula {formula!r}")
    atoms: dict[str, int] = {}
    for symbol, count in re.findall(r"([A-Z][a-z]?)(\d*)", formula):
        atoms[symbol] = atoms.get(symbol, 0) + (int(count) if count else 1)
    return atoms


def molar_mass(cas: str, formula: str | None = None) -> dict[str, Any]:
    """Compute the molar mass from the molecular formula.

    Parameters
    ----------
    cas : str
        CAS registry number; used to find the formula when none is given.
    formula : str, optional
        Molecular formula.

    Returns
    -------
    dict
        ``formula``, ``molar_mass`` [kg/mol] and ``molar_mass_source``.
    """
    chemicals_package()
    from chemicals.elements import molecular_weight, simple_formula_parser

    if formula is None:
        formula = identity(cas)["formula"]
    if not formula:
        return {"formula": None, "molar_mass": None, "molar_mass_source": None}
    try:
        mw = molecular_weight(simple_formula_parser(formula))
    except Exception:
        return {"formula": formula, "molar_mass": None, "molar_mass_source": None}
    return {
        "formula": formula,
        "molar_mass": mw / 1000.0,
        "molar_mass_source": SRC_ATOMIC_WEIGHTS,
    }


def _first_method(getter: Callable[..., Any], cas: str, methods: list[tuple[str, str]]):
    """Return ``(value, source)`` from the first method that has a value."""
    for method, source in methods:
        try:
            v = _value(getter(cas, method=method))
        except Exception:
            v = None
        if v is not None and v > 0.0:
            return v, source
    return None, None


BOILING_POINT_SOURCES: dict[str, str] = {
    "CRC_ORG": SRC_CRC_ORGANIC,
    "CRC_INORG": SRC_CRC_INORGANIC,
    "HEOS": SRC_HEOS,
    "CRC_HVAP": SRC_CRC_HVAP_TB,
    "COMMON_CHEMISTRY": SRC_COMMON_CHEMISTRY,
    "WEBBOOK": SRC_WEBBOOK,
    "YAWS": SRC_YAWS,
}
"""Boiling-point sources in order of preference, keyed by method name."""


def _boiling_point(cas: str, method: str) -> float | None:
    """Return the boiling point [K] of ``cas`` from one source, or None."""
    from chemicals import phase_change

    if method == "CRC_HVAP":
        row = _row(phase_change.Hvap_data_CRC, cas)
        v = _value(row["Tb"]) if row is not None else None
    else:
        try:
            v = _value(phase_change.Tb(cas, method=method))
        except Exception:
            v = None
    return v if v is not None and v > 0.0 else None


def phase_change_temperatures(cas: str, boiling_point_source: str | None = None) -> dict[str, Any]:
    """Look up the normal boiling point and the melting point.

    Boiling point: the first of :data:`BOILING_POINT_SOURCES` with a value
    (CRC organic and inorganic constants, NIST REFPROP, the CRC
    enthalpy-of-vaporization table, CAS Common Chemistry, NIST WebBook,
    Yaws).  Melting point: the first of CRC organic and inorganic constants,
    Open Notebook Science, CAS Common Chemistry and NIST WebBook.

    Parameters
    ----------
    cas : str
        CAS registry number.
    boiling_point_source : str, optional
        Key of :data:`BOILING_POINT_SOURCES` to try first.

    Returns
    -------
    dict
        ``boiling_point`` [K, at 101325 Pa], ``melting_point`` [K] and
        ``phase_change_source``.

    Raises
    ------
    ValueError
        If ``boiling_point_source`` is not a known source.
    """
    chemicals_package()
    from chemicals import phase_change

    order = list(BOILING_POINT_SOURCES)
    if boiling_point_source is not None:
        if boiling_point_source not in BOILING_POINT_SOURCES:
            raise ValueError(f"unknown boiling point source {boiling_point_source!r}")
        order.remove(boiling_point_source)
        order.insert(0, boiling_point_source)
    tb, tb_src = None, None
    for method in order:
        tb = _boiling_point(cas, method)
        if tb is not None:
            tb_src = BOILING_POINT_SOURCES[method]
            break
    tm, tm_src = _first_method(
        phase_change.Tm,
        cas,
        [
            ("CRC_ORG", SRC_CRC_ORGANIC),
            ("CRC_INORG", SRC_CRC_INORGANIC),
            ("OPEN_NTBKM", SRC_OPEN_NOTEBOOK),
            ("COMMON_CHEMISTRY", SRC_COMMON_CHEMISTRY),
            ("WEBBOOK", SRC_WEBBOOK),
        ],
    )
    return {
        "boiling_point": tb,
        "melting_point": tm,
        "phase_change_source": _join_sources({"Tb": tb_src, "Tm": tm_src}),
    }


def critical_constants(cas: str) -> dict[str, Any]:
    """Look up the critical temperature and pressure.

    Both constants are taken from the first source that lists both, in the
    order IUPAC, CRC, Mathews (inorganic), Yaws, PSRK revision 4; water uses
    IAPWS-95.

    Parameters
    ----------
    cas : str
        CAS registry number.

    Returns
    -------
    dict
        ``critical_temperature`` [K], ``critical_pressure`` [Pa] and
        ``critical_source``.
    """
    chemicals_package()
    from chemicals import critical, iapws

    if cas == WATER_CAS:
        return {
            "critical_temperature": float(iapws.iapws95_Tc),
            "critical_pressure": float(iapws.iapws95_Pc),
            "critical_source": SRC_IAPWS95,
        }
    for method, source in (
        ("IUPAC", SRC_IUPAC_CRITICAL),
        ("CRC", SRC_CRC_CRITICAL),
        ("MATTHEWS", SRC_MATHEWS_CRITICAL),
        ("YAWS", SRC_YAWS),
        ("PSRK", SRC_PSRK_CRITICAL),
    ):
        try:
            tc = _value(critical.Tc(cas, method=method))
            pc = _value(critical.Pc(cas, method=method))
        except Exception:
            continue
        if tc and pc:
            return {"critical_temperature": tc, "critical_pressure": pc, "critical_source": source}
    return {"critical_temperature": None, "critical_pressure": None, "critical_source": None}


def enthalpy_of_vaporization(cas: str, boiling_point: float | None = None) -> dict[str, Any]:
    """Look up the enthalpy of vaporization at the normal boiling point.

    The CRC value at Tb is preferred.  Otherwise a temperature correlation
    (Perry's Table 2-150 DIPPR-106, VDI PPDS12, ChemSep DIPPR-106) is
    evaluated at ``boiling_point``.

    Parameters
    ----------
    cas : str
        CAS registry number.
    boiling_point : float, optional
        Normal boiling point [K] at which correlations are evaluated; looked
        up with :func:`phase_change_temperatures` when not given.

    Returns
    -------
    dict
        ``enthalpy_vaporization_nbp`` [J/mol] and ``enthalpy_source``.
    """
    chemicals_package()
    from chemicals import phase_change
    from chemicals.dippr import EQ106

    empty = {"enthalpy_vaporization_nbp": None, "enthalpy_source": None}
    row = _row(phase_change.Hvap_data_CRC, cas)
    if row is not None and _value(row["HvapTb"]):
        return {"enthalpy_vaporization_nbp": _value(row["HvapTb"]), "enthalpy_source": SRC_CRC_HVAP}
    if boiling_point is None:
        boiling_point = phase_change_temperatures(cas)["boiling_point"]
    if boiling_point is None:
        return empty
    tb = boiling_point
    row = _row(phase_change.phase_change_data_Perrys2_150, cas)
    if row is not None and row["Tmin"] <= tb <= row["Tmax"] and tb < row["Tc"]:
        h = EQ106(tb, row["Tc"], row["C1"], row["C2"], row["C3"], row["C4"])
        return {"enthalpy_vaporization_nbp": float(h), "enthalpy_source": SRC_PERRY_2_150}
    row = _row(phase_change.phase_change_data_VDI_PPDS_4, cas)
    if row is not None and tb < row["Tc"]:
        h = phase_change.PPDS12(tb, row["Tc"], row["A"], row["B"], row["C"], row["D"], row["E"])
        return {"enthalpy_vaporization_nbp": float(h), "enthalpy_source": SRC_VDI_HVAP}
    eq = _chemsep_equation(cas, "HeatOfVaporization", "106")
    tc = _chemsep_scalar(cas, "CriticalTemperature")
    if eq is not None and tc and eq["Tmin"] <= tb <= eq["Tmax"] and tb < tc:
        h = EQ106(tb, tc, eq["A"], eq["B"], eq["C"], eq["D"], eq["E"]) / 1000.0
        return {"enthalpy_vaporization_nbp": float(h), "enthalpy_source": SRC_CHEMSEP_HVAP}
    return empty


def _round_significant(x: float, digits: int = 8) -> float:
    """Round ``x`` to ``digits`` significant digits."""
    if x == 0.0:
        return 0.0
    return float(f"{x:.{digits - 1}e}")


def _fit_dippr101(func: Callable[[float], float], tmin: float, tmax: float, c5: float):
    """Least-squares DIPPR-101 fit with a fixed exponent to a vapour-pressure curve.

    The fit minimises the squared error in ``ln p`` at 400 temperatures
    evenly spaced in ``1/T``; the coefficients are rounded to eight
    significant digits so that the result does not depend on the linear
    algebra library.

    Parameters
    ----------
    func : callable
        Vapour pressure [Pa] as a function of temperature [K].
    tmin, tmax : float
        Fit range [K].
    c5 : float
        Fixed exponent ``C5``.

    Returns
    -------
    tuple
        ``(c1, c2, c3, c4, c5, max_relative_deviation_percent)``.
    """
    import numpy as np

    inv = np.linspace(1.0 / tmax, 1.0 / tmin, 400)
    ts = 1.0 / inv
    y = np.log([func(t) for t in ts])
    design = np.column_stack([np.ones_like(ts), 1.0 / ts, np.log(ts), ts**c5])
    scale = np.abs(design).max(axis=0)
    coef, *_ = np.linalg.lstsq(design / scale, y, rcond=None)
    c1, c2, c3, c4 = (_round_significant(float(c)) for c in coef / scale)
    fitted = np.log([dippr101(float(t), c1, c2, c3, c4, c5) for t in ts])
    dev = float(np.max(np.abs(np.expm1(fitted - y)))) * 100.0
    return c1, c2, c3, c4, float(c5), dev


MAX_REFIT_DEVIATION_PERCENT = 0.5
"""Largest deviation [%] accepted for a DIPPR-101 refit of another equation."""

REFIT_RANGES = ((0.0, 1.0), (0.0, 0.9), (0.0, 0.8), (233.15, 0.8))
"""Refit ranges tried in order: lower bound [K] (raised to Tm) and upper end as a fraction of Tc."""


def dippr_vapor_pressure(cas: str) -> dict[str, Any]:
    """Look up DIPPR-101 vapour-pressure coefficients.

    Sources in order: Perry's Table 2-8; a DIPPR-101 refit (C5 of 1, 2 or
    6) of the VDI Heat Atlas PPDS Wagner equation over the first range of
    :data:`REFIT_RANGES` it reproduces within
    :data:`MAX_REFIT_DEVIATION_PERCENT`; ChemSep v8.32; Alcock et al.
    (metallic elements).

    Parameters
    ----------
    cas : str
        CAS registry number.

    Returns
    -------
    dict
        ``dippr_c1`` .. ``dippr_c5``, ``dippr_tmin`` [K], ``dippr_tmax`` [K]
        and ``dippr_source``; the form is
        ``ln(p/Pa) = C1 + C2/T + C3 ln T + C4 T**C5``.
    """
    chemicals_package()
    from chemicals import vapor_pressure

    keys = ("dippr_c1", "dippr_c2", "dippr_c3", "dippr_c4", "dippr_c5", "dippr_tmin", "dippr_tmax")

    def pack(values, source):
        out = dict(zip(keys, (float(v) for v in values)))
        out["dippr_source"] = source
        return out

    row = _row(vapor_pressure.Psat_data_Perrys2_8, cas)
    if row is not None:
        return pack(
            (row["C1"], row["C2"], row["C3"], row["C4"], row["C5"], row["Tmin"], row["Tmax"]),
            SRC_PERRY_2_8,
        )
    row = _row(vapor_pressure.Psat_data_VDI_PPDS_3, cas)
    if row is not None:
        tc, pc = float(row["Tc"]), float(row["Pc"])
        a, b, c, d = (float(row[k]) for k in ("A", "B", "C", "D"))
        tmin = float(row["Tm"])

        def wagner(t: float) -> float:
            return vapor_pressure.Wagner(t, tc, pc, a, b, c, d)

        for low, fraction in REFIT_RANGES:
            tlow = max(tmin, low)
            tmax = fraction * tc
            fits = [_fit_dippr101(wagner, tlow, tmax, c5) for c5 in (1.0, 2.0, 6.0)]
            c1, c2, c3, c4, c5, dev = min(fits, key=lambda f: f[-1])
            if dev <= MAX_REFIT_DEVIATION_PERCENT:
                return pack((c1, c2, c3, c4, c5, tlow, tmax), SRC_VDI_PSAT_FIT.format(dev=dev))
    eq = _chemsep_equation(cas, "VaporPressure", "101")
    if eq is not None:
        return pack(
            (eq["A"], eq["B"], eq["C"], eq["D"], eq["E"], eq["Tmin"], eq["Tmax"]), SRC_CHEMSEP_PSAT
        )
    row = _row(vapor_pressure.Psat_data_Alcock_elements, cas)
    if row is not None:
        return pack(
            (row["A"], row["B"], row["C"], row["D"], row["E"], row["Tmin"], row["Tmax"]),
            SRC_ALCOCK_PSAT,
        )
    out = {k: None for k in keys}
    out["dippr_source"] = None
    return out


ANTOINE_BOILING_POINT_TOLERANCE = 0.03
"""Largest relative deviation from 101325 Pa accepted at the boiling point."""


def antoine_vapor_pressure(cas: str, boiling_point: float | None = None) -> dict[str, Any]:
    """Look up Antoine coefficients in the ``log10(p/Pa) = A - B/(T/K + C)`` form.

    ``chemicals`` stores Poling's Appendix A set already converted from the
    book's ``log10(p/bar) = A - B/(T/K + C - 273.15)`` to ``log10(p/Pa)``
    with T in K (A + 5, C - 273.15), so it is used as stored.  The
    Landolt-Boernstein set is stored as ``ln(p/Pa) = A - B/(T/K + C)`` and
    is converted here by dividing A and B by ln 10.  A set whose range
    contains ``boiling_point`` but which misses 101325 Pa there by more than
    :data:`ANTOINE_BOILING_POINT_TOLERANCE` is skipped.

    Parameters
    ----------
    cas : str
        CAS registry number.
    boiling_point : float, optional
        Normal boiling point [K] used for the consistency check.

    Returns
    -------
    dict
        ``antoine_a``, ``antoine_b``, ``antoine_c``, ``antoine_tmin`` [K],
        ``antoine_tmax`` [K] and ``antoine_source``.
    """
    chemicals_package()
    from chemicals import vapor_pressure

    ln10 = math.log(10.0)
    candidates = []
    row = _row(vapor_pressure.Psat_data_AntoinePoling, cas)
    if row is not None:
        candidates.append(
            (float(row["A"]), float(row["B"]), float(row["C"]), row, SRC_POLING_ANTOINE)
        )
    row = _row(vapor_pressure.Psat_data_Landolt_Antoine, cas)
    if row is not None:
        candidates.append(
            (
                float(row["A"]) / ln10,
                float(row["B"]) / ln10,
                float(row["C"]),
                row,
                SRC_LANDOLT_ANTOINE,
            )
        )
    for a, b, c, row, source in candidates:
        tmin, tmax = float(row["Tmin"]), float(row["Tmax"])
        if boiling_point is not None and tmin <= boiling_point <= tmax:
            deviation = antoine(boiling_point, a, b, c) / 101325.0 - 1.0
            if abs(deviation) > ANTOINE_BOILING_POINT_TOLERANCE:
                continue
        return {
            "antoine_a": a,
            "antoine_b": b,
            "antoine_c": c,
            "antoine_tmin": tmin,
            "antoine_tmax": tmax,
            "antoine_source": source,
        }
    return {
        "antoine_a": None,
        "antoine_b": None,
        "antoine_c": None,
        "antoine_tmin": None,
        "antoine_tmax": None,
        "antoine_source": None,
    }


def liquid_density(
    cas: str, molar_mass_kg: float | None = None, temperature: float = REFERENCE_TEMPERATURE
) -> dict[str, Any]:
    """Look up the saturated liquid density at a reference temperature.

    Sources in order: IAPWS-95 (water only, at 101325 Pa), Perry's DIPPR-105
    coefficients, VDI Heat Atlas PPDS equation, ChemSep DIPPR-105, and the
    CRC inorganic constants table (25 C).

    Parameters
    ----------
    cas : str
        CAS registry number.
    molar_mass_kg : float, optional
        Molar mass [kg/mol], needed to convert molar densities; computed
        from the formula when not given.
    temperature : float, optional
        Temperature at which correlations are evaluated [K].

    Returns
    -------
    dict
        ``liquid_density`` [kg/m3], ``liquid_density_temperature`` [K] and
        ``liquid_density_source``.
    """
    chemicals_package()
    from chemicals import iapws, volume
    from chemicals.dippr import EQ105

    T = temperature

    def pack(rho, t, source):
        return {
            "liquid_density": float(rho),
            "liquid_density_temperature": float(t),
            "liquid_density_source": source,
        }

    if cas == WATER_CAS:
        return pack(iapws.iapws95_rho(T, 101325.0), T, SRC_IAPWS95_DENSITY)
    if molar_mass_kg is None:
        molar_mass_kg = molar_mass(cas)["molar_mass"]
    row = _row(volume.rho_data_Perry_8E_105_l, cas)
    if row is not None and molar_mass_kg and row["Tmin"] <= T <= row["Tmax"]:
        rho_molar = EQ105(T, row["C1"], row["C2"], row["C3"], row["C4"])
        return pack(rho_molar * molar_mass_kg, T, SRC_PERRY_DENSITY)
    row = _row(volume.rho_data_VDI_PPDS_2, cas)
    if row is not None and T < row["Tc"]:
        rho = volume.volume_VDI_PPDS(
            T, row["Tc"], row["rhoc"], row["A"], row["B"], row["C"], row["D"]
        )
        return pack(rho, T, SRC_VDI_DENSITY)
    eq = _chemsep_equation(cas, "LiquidDensity", "105")
    if eq is not None and molar_mass_kg and eq["Tmin"] <= T <= eq["Tmax"]:
        rho_kmol = EQ105(T, eq["A"], eq["B"], eq["C"], eq["D"])
        return pack(rho_kmol * 1000.0 * molar_mass_kg, T, SRC_CHEMSEP_DENSITY)
    from chemicals import miscdata

    row = _row(miscdata.CRC_inorganic_data, cas)
    if row is not None and _value(row["rho"]):
        return pack(row["rho"], 298.15, SRC_CRC_INORGANIC_DENSITY)
    return {
        "liquid_density": None,
        "liquid_density_temperature": None,
        "liquid_density_source": None,
    }


#: Relative disagreement between the two compilations above which the lower LFL is
#: used and both are recorded. [-] Chosen here: the two compilations agree within
#: about 10-25 % for most liquids; beyond 30 % the gap exceeds the scatter of the
#: test methods and the safe reading is the lower value.
LFL_DISAGREEMENT = 0.30


def flammability_limits(cas: str) -> dict[str, Any]:
    """Look up the lower and upper flammability limits in air.

    IEC 60079-20-1:2010 is preferred, NFPA 497 (2008) is the fallback; each
    limit is taken separately, so the source may name both. Where both give an
    LFL and they differ by more than `LFL_DISAGREEMENT` (relative to the lower),
    the lower LFL is used and ``flammability_note`` records both with their
    sources.

    Parameters
    ----------
    cas : str
        CAS registry number.

    Returns
    -------
    dict
        ``lfl`` and ``ufl`` [volume fraction], ``flammability_source`` and
        ``flammability_note`` (None unless the compilations disagree).
    """
    chemicals_package()
    from chemicals import safety

    out: dict[str, Any] = {"flammability_note": None}
    sources: dict[str, str | None] = {}
    for col, label in (("LFL", "lfl"), ("UFL", "ufl")):
        out[label] = None
        sources[label.upper()] = None
        found = []
        for df, src in ((safety.IEC_2010_data, SRC_IEC), (safety.NFPA_2008_data, SRC_NFPA)):
            row = _row(df, cas)
            v = _value(row[col]) if row is not None else None
            if v is not None and v > 0.0:
                found.append((v, src))
        if not found:
            continue
        value, src = found[0]
        if label == "lfl" and len(found) == 2:
            low, high = sorted(found)
            if (high[0] - low[0]) / low[0] > LFL_DISAGREEMENT:
                value, src = low
                out["flammability_note"] = (
                    f"the two compilations disagree on the LFL by "
                    f"{100 * (high[0] - low[0]) / low[0]:.0f} %: {100 * low[0]:.3g} % "
                    f"({low[1]}) against {100 * high[0]:.3g} % ({high[1]}); the lower is "
                    "used")
        out[label] = value
        sources[label.upper()] = src
    out["flammability_source"] = _join_sources(sources)
    return out


def flash_point(cas: str) -> dict[str, Any]:
    """Look up the flash point.

    IEC 60079-20-1:2010 is preferred, NFPA 497 (2008) is the fallback.
    Neither transcription records the cup type, which the source string
    states.

    Parameters
    ----------
    cas : str
        CAS registry number.

    Returns
    -------
    dict
        ``flash_point`` [K] and ``flash_point_source``.
    """
    chemicals_package()
    from chemicals import safety

    for df, src in ((safety.IEC_2010_data, SRC_IEC), (safety.NFPA_2008_data, SRC_NFPA)):
        row = _row(df, cas)
        v = _value(row["T_flash"]) if row is not None else None
        if v is not None and v > 0.0:
            return {"flash_point": v, "flash_point_source": src + FLASH_POINT_NOTE}
    return {"flash_point": None, "flash_point_source": None}


_SMILES_TOKEN = re.compile(r"\[[^\]]+\]|Br|Cl|[BCNOPSFI]|[bcnops]|%\d\d|\d|[=#$:/\\.\-]|\(|\)|\*")


def smiles_ring_count(smiles: str) -> int | None:
    """Count the rings that take the Fuller ring increment in a SMILES string.

    A ring is counted when any of its atoms is not carbon (heterocyclic
    ring) or when it is aromatic: written with lower-case aromatic atoms,
    or in Kekule form with every ring atom carrying a double bond inside
    the ring.  Each ring-closure bond defines one ring, found as the
    shortest path between its two atoms without that bond.

    Parameters
    ----------
    smiles : str
        SMILES string of a single molecule.

    Returns
    -------
    int or None
        Number of aromatic or heterocyclic rings; None if the string cannot
        be parsed.
    """
    tokens = _SMILES_TOKEN.findall(smiles)
    if "".join(tokens) != smiles:
        return None
    graph = _smiles_graph(tokens)
    if graph is None:
        return None
    elements, aromatic, bonds, closures = graph
    adjacency: dict[int, set[int]] = {i: set() for i in range(len(elements))}
    for a, b in bonds:
        adjacency[a].add(b)
        adjacency[b].add(a)
    count = 0
    for a, b in closures:
        ring = _closure_ring(adjacency, a, b)
        if ring is None:
            return None
        members = set(ring)
        in_ring_double: set[int] = set()
        for (i, j), order in bonds.items():
            if order in ("=", ":") and i in members and j in members:
                in_ring_double.update((i, j))
        kekule_aromatic = in_ring_double == members
        if kekule_aromatic or any(aromatic[i] or elements[i] != "C" for i in ring):
            count += 1
    return count


def _smiles_graph(tokens):
    """The atoms and bonds of tokenised SMILES.

    Returns (elements, aromatic flags, bonds {(i, j): order} with i < j, ring-closure
    atom pairs), or None if the tokens do not form a molecule.
    """
    elements: list[str] = []
    aromatic: list[bool] = []
    bonds: dict[tuple[int, int], str] = {}
    closures: list[tuple[int, int]] = []
    open_rings: dict[str, tuple[int, str]] = {}
    stack: list[int | None] = []
    prev: int | None = None
    pending = "-"
    for tok in tokens:
        if tok == "(":
            stack.append(prev)
        elif tok == ")":
            if not stack:
                return None
            prev = stack.pop()
        elif tok[0].isdigit() or tok[0] == "%":
            if prev is None:
                return None
            if tok in open_rings:
                other, order = open_rings.pop(tok)
                bonds[(min(other, prev), max(other, prev))] = order if order != "-" else pending
                closures.append((other, prev))
            else:
                open_rings[tok] = (prev, pending)
            pending = "-"
        elif tok in "=#$:/\\-":
            pending = tok if tok in "=#$:" else "-"
        elif tok == ".":
            prev = None
            pending = "-"
        else:
            sym = _atom_symbol(tok)
            if sym is None:
                return None
            idx = len(elements)
            is_arom = sym[0].islower()
            elements.append(sym.capitalize() if is_arom else sym)
            aromatic.append(is_arom)
            if prev is not None:
                bonds[(min(prev, idx), max(prev, idx))] = pending
            prev = idx
            pending = "-"
    if open_rings or stack:
        return None
    return elements, aromatic, bonds, closures


def _atom_symbol(tok: str) -> str | None:
    """The element symbol of an atom token (lower case if aromatic); None if unreadable."""
    if not tok.startswith("["):
        return tok
    m = re.match(r"\[\d*([A-Za-z][a-z]?)", tok)
    return m.group(1) if m else None


def _closure_ring(adjacency, a: int, b: int) -> list[int] | None:
    """The atoms of the ring a ring-closure bond a-b closes: the shortest path from a
    to b without that bond (breadth-first); None if there is none."""
    closure = (min(a, b), max(a, b))
    parent: dict[int, int | None] = {a: None}
    queue = deque([a])
    while queue:
        node = queue.popleft()
        if node == b:
            break
        for nxt in adjacency[node]:
            if (min(node, nxt), max(node, nxt)) != closure and nxt not in parent:
                parent[nxt] = node
                queue.append(nxt)
    if b not in parent:
        return None
    ring: list[int] = []
    step: int | None = b
    while step is not None:
        ring.append(step)
        step = parent[step]
    return ring


def fuller_diffusion_volume(
    formula: str | None, rings: int = 0, cas: str | None = None
) -> dict[str, Any]:
    """Sum the Fuller-Schettler-Giddings atomic diffusion volumes.

    Parameters
    ----------
    formula : str or None
        Molecular formula.
    rings : int, optional
        Number of aromatic or heterocyclic rings (each adds -18.3).
    cas : str, optional
        CAS number; compounds with a tabulated molecular value (water) use
        that value.

    Returns
    -------
    dict
        ``diffusion_volume`` [-] and ``diffusion_volume_source``; both None
        when the formula holds an element without a Fuller increment.

    References
    ----------
    .. [1] Fuller, E. N., Schettler, P. D., Giddings, J. C. "A new method for
       prediction of binary gas-phase diffusion coefficients." Ind. Eng.
       Chem. 58 (5) (1966) 18-27.
    .. [2] Poling, B. E., Prausnitz, J. M., O'Connell, J. P. The Properties of
       Gases and Liquids, 5th ed. McGraw-Hill, 2001, Table 11-1.

    Examples
    --------
    >>> fuller_diffusion_volume("C6H6", rings=1)["diffusion_volume"]
    90.96
    """
    if cas in FULLER_MOLECULAR_VOLUMES:
        return {
            "diffusion_volume": FULLER_MOLECULAR_VOLUMES[cas],
            "diffusion_volume_source": SRC_FULLER_MOLECULAR,
        }
    empty = {"diffusion_volume": None, "diffusion_volume_source": None}
    if not formula:
        return empty
    atoms = parse_formula(formula)
    if any(sym not in FULLER_ATOMIC_VOLUMES for sym in atoms):
        return empty
    total = sum(FULLER_ATOMIC_VOLUMES[sym] * n for sym, n in atoms.items())
    total += FULLER_RING_INCREMENT * rings
    return {"diffusion_volume": round(total, 6), "diffusion_volume_source": SRC_FULLER}


def lookup(
    cas: str, rings: int | None = None, boiling_point_source: str | None = None
) -> dict[str, Any]:
    """Collect every table column for one compound.

    Parameters
    ----------
    cas : str
        CAS registry number.
    rings : int, optional
        Number of aromatic or heterocyclic rings for the Fuller diffusion
        volume; inferred from the SMILES string in ``chemicals`` when not
        given (diffusion volume is None if that fails).
    boiling_point_source : str, optional
        Boiling-point source to prefer, a key of
        :data:`BOILING_POINT_SOURCES`.

    Returns
    -------
    dict
        One value for every name in :data:`ROW_COLUMNS`; ``key`` and
        ``synonyms`` are None, ``name`` is the ``chemicals`` common name,
        and missing values are None.
    """
    cas = cas.strip()
    row: dict[str, Any] = {col: None for col in ROW_COLUMNS}
    row.update(identity(cas))
    row["key"] = None
    row["synonyms"] = None
    row.update(molar_mass(cas, row["formula"]))
    row.update(phase_change_temperatures(cas, boiling_point_source))
    row.update(critical_constants(cas))
    row.update(enthalpy_of_vaporization(cas, row["boiling_point"]))
    row.update(dippr_vapor_pressure(cas))
    row.update(antoine_vapor_pressure(cas, row["boiling_point"]))
    row.update(liquid_density(cas, row["molar_mass"]))
    row.update(flammability_limits(cas))
    row.update(flash_point(cas))
    if rings is None and cas not in FULLER_MOLECULAR_VOLUMES:
        from chemicals.identifiers import search_chemical

        try:
            smiles = search_chemical(cas).smiles
        except Exception:
            smiles = None
        rings = smiles_ring_count(smiles) if smiles else None
        if rings is None:
            row.update({"diffusion_volume": None, "diffusion_volume_source": None})
            return row
    try:
        row.update(fuller_diffusion_volume(row["formula"], rings or 0, cas))
    except ValueError:
        row.update({"diffusion_volume": None, "diffusion_volume_source": None})
    return row


# ---------------------------------------------------------------- identifiers


def _identifier_db():
    """The identifier database of ``chemicals`` (names, synonyms, CAS numbers)."""
    chemicals_package()
    from chemicals.identifiers import get_pubchem_db

    return get_pubchem_db()


@functools.cache
def cas_of_name(name: str) -> str | None:
    """The CAS number of a name or synonym in the identifier database of ``chemicals``.

    Only names are matched (as given, lower case, without spaces, without spaces
    and hyphens), never formulas, SMILES strings or other identifiers: "CO" is
    not read as methanol's SMILES, nor "C6H14" as one of five hexane isomers.

    Parameters
    ----------
    name : str
        A name or synonym, such as "isohexane" or "butyl cellosolve".

    Returns
    -------
    str or None
        The CAS number, or None if the name is not in the database.
    """
    db = _identifier_db()
    text = " ".join(str(name).split())
    if not text:
        return None
    bare = text.replace(" ", "")
    hyphened = text.replace(" ", "-")
    for variant in dict.fromkeys([text, text.lower(), hyphened, hyphened.lower(), bare,
                                  bare.lower(), bare.replace("-", ""),
                                  bare.replace("-", "").lower()]):
        hit = db.search_name(variant, autoload=True)
        if hit:
            return hit.CASs
    return None


@functools.cache
def cas_is_known(cas: str) -> bool:
    """Whether the identifier database of ``chemicals`` has this CAS number."""
    return bool(_identifier_db().search_CAS(cas.strip(), autoload=True))


def _cas_text(value) -> str:
    """A CAS number as text with dashes (some tables index it as an integer)."""
    text = str(value)
    if text.isdigit():
        from chemicals.identifiers import int_to_CAS

        return int_to_CAS(int(text))
    return text


def _index_of(df, mask=None) -> set[str]:
    if df is None:
        return set()
    index = df.index if mask is None else df.index[mask]
    return {_cas_text(c) for c in index}


def boiling_point_cas() -> set[str]:
    """CAS numbers with a normal boiling point in a source of :data:`BOILING_POINT_SOURCES`."""
    chemicals_package()
    from chemicals import phase_change

    phase_change.Tb("7732-18-5")  # loads the tables
    out = _index_of(phase_change.Hvap_data_CRC)
    for method in BOILING_POINT_SOURCES:
        df = phase_change.Tb_sources.get(method)
        if df is not None and "Tb" in df.columns:
            out |= _index_of(df, df["Tb"].astype(float) > 0.0)
    return out


def correlation_cas() -> set[str]:
    """CAS numbers with a DIPPR-101 or Antoine vapour-pressure correlation in a
    source that :func:`dippr_vapor_pressure` or :func:`antoine_vapor_pressure` reads."""
    chemicals_package()
    from chemicals import vapor_pressure

    out: set[str] = set()
    for df in (vapor_pressure.Psat_data_Perrys2_8, vapor_pressure.Psat_data_VDI_PPDS_3,
               vapor_pressure.Psat_data_Alcock_elements,
               vapor_pressure.Psat_data_AntoinePoling,
               vapor_pressure.Psat_data_Landolt_Antoine):
        out |= _index_of(df)
    for cas, compound in _chemsep_database().items():
        el = compound.find("VaporPressure")
        if el is not None and el.find("eqno") is not None \
                and el.find("eqno").get("value") == "101":
            out.add(cas)
    return out


def flammability_cas() -> tuple[set[str], set[str]]:
    """CAS numbers with a lower flammability limit, and with a flash point, in
    IEC 60079-20-1:2010 or NFPA 497 (2008)."""
    chemicals_package()
    from chemicals import safety

    safety.LFL(CASRN="67-64-1")  # loads the tables
    lfl, flash = set(), set()
    for df in (safety.IEC_2010_data, safety.NFPA_2008_data):
        lfl |= _index_of(df, df["LFL"].astype(float) > 0.0)
        flash |= _index_of(df, df["T_flash"].astype(float) > 0.0)
    return lfl, flash


@functools.cache
def suggestion_names() -> dict[str, str]:
    """Names of the library's compounds that have a boiling point and a
    vapour-pressure correlation (the liquids tanks and drums commonly hold),
    mapped to their CAS numbers: the pool for close-match suggestions."""
    db = _identifier_db()
    wanted = boiling_point_cas() & correlation_cas()
    names: dict[str, str] = {}
    for cas in sorted(wanted):
        meta = db.search_CAS(cas, autoload=True)
        if meta and meta.common_name and not re.fullmatch(r"[\d-]+", meta.common_name):
            names.setdefault(meta.common_name, cas)
    return names
