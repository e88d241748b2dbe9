"""Build ``estimator/data/substances.csv`` from the ``chemicals`` package.

Run from anywhere as::

    python tools/build_substance_table.py

The curated compound list below fixes the key, display name, synonyms, CAS
number and the number of aromatic or heterocyclic rings (for the Fuller
diffusion volume) of every row; every other value is looked up with
``estimator._chemicals_lookup``.  The output is sorted by key and written
with fixed float formatting, so rebuilding with the same ``chemicals``
version reproduces the file byte for byte.  A report of missing value
groups and failed plausibility checks is printed to standard output.
"""

from __future__ import annotations

import argparse
import csv
import importlib
import importlib.util
import io
import math
import re
import sys
from pathlib import Path
from typing import Any, NamedTuple

REPO_ROOT = Path(__file__).resolve().parents[1]
OUTPUT = REPO_ROOT / "estimator" / "data" / "substances.csv"
MODULE_PATH = REPO_ROOT / "estimator" / "_chemicals_lookup.py"
FLOAT_FORMAT = "%.10g"
RANGE_TOLERANCE = 0.5
ANTOINE_TOLERANCE_PERCENT = 2.0
CROSS_CHECK_TOLERANCE_PERCENT = 3.0


class Compound(NamedTuple):
    """One curated entry of the substance table."""

    key: str
    name: str
    synonyms: tuple[str, ...]
    cas: str
    rings: int = 0
    boiling_point_source: str | None = None


COMPOUNDS: tuple[Compound, ...] = (
    Compound("acetone", "Acetone", ("2-propanone", "propanone", "dimethyl ketone"), "67-64-1"),
    Compound(
        "methyl-ethyl-ketone", "Methyl ethyl ketone", ("MEK", "2-butanone", "butanone"), "78-93-3"
    ),
    Compound(
        "methyl-isobutyl-ketone",
        "Methyl isobutyl ketone",
        ("MIBK", "hexone", "4-methyl-2-pentanone"),
        "108-10-1",
    ),
    Compound(
        "ethyl-acetate", "Ethyl acetate", ("EtOAc", "ethyl ethanoate", "acetic ether"), "141-78-6"
    ),
    Compound(
        "n-butyl-acetate",
        "n-Butyl acetate",
        ("butyl acetate", "butyl ethanoate", "nBuAc"),
        "123-86-4",
    ),
    Compound("methanol", "Methanol", ("methyl alcohol", "MeOH", "wood alcohol"), "67-56-1"),
    Compound("ethanol", "Ethanol", ("ethyl alcohol", "EtOH", "grain alcohol"), "64-17-5"),
    Compound(
        "1-propanol",
        "1-Propanol",
        ("n-propanol", "n-propyl alcohol", "propan-1-ol", "NPA"),
        "71-23-8",
    ),
    Compound(
        "isopropanol",
        "Isopropanol",
        ("IPA", "isopropyl alcohol", "2-propanol", "propan-2-ol"),
        "67-63-0",
    ),
    Compound("1-butanol", "1-Butanol", ("n-butanol", "n-butyl alcohol", "butan-1-ol"), "71-36-3"),
    Compound(
        "isobutanol", "Isobutanol", ("isobutyl alcohol", "2-methyl-1-propanol", "IBA"), "78-83-1"
    ),
    Compound("benzene", "Benzene", ("benzol",), "71-43-2", 1),
    Compound("toluene", "Toluene", ("methylbenzene", "toluol"), "108-88-3", 1),
    Compound("o-xylene", "o-Xylene", ("1,2-dimethylbenzene", "ortho-xylene"), "95-47-6", 1),
    Compound("m-xylene", "m-Xylene", ("1,3-dimethylbenzene", "meta-xylene"), "108-38-3", 1),
    Compound("p-xylene", "p-Xylene", ("1,4-dimethylbenzene", "para-xylene"), "106-42-3", 1),
    Compound("ethylbenzene", "Ethylbenzene", ("phenylethane", "ethylbenzol"), "100-41-4", 1),
    Compound(
        "styrene", "Styrene", ("vinylbenzene", "phenylethene", "styrene monomer"), "100-42-5", 1
    ),
    Compound("cumene", "Cumene", ("isopropylbenzene", "(1-methylethyl)benzene"), "98-82-8", 1),
    Compound("n-pentane", "n-Pentane", ("pentane",), "109-66-0"),
    Compound("isopentane", "Isopentane", ("2-methylbutane",), "78-78-4"),
    Compound("n-hexane", "n-Hexane", ("hexane",), "110-54-3"),
    Compound("n-heptane", "n-Heptane", ("heptane",), "142-82-5"),
    Compound("n-octane", "n-Octane", ("octane",), "111-65-9"),
    Compound("n-nonane", "n-Nonane", ("nonane",), "111-84-2"),
    Compound("n-decane", "n-Decane", ("decane",), "124-18-5"),
    Compound("cyclopentane", "Cyclopentane", ("pentamethylene",), "287-92-3"),
    Compound("cyclohexane", "Cyclohexane", ("hexahydrobenzene", "hexamethylene"), "110-82-7"),
    Compound(
        "diethyl-ether", "Diethyl ether", ("ether", "ethyl ether", "ethoxyethane", "DEE"), "60-29-7"
    ),
    Compound(
        "methyl-tert-butyl-ether",
        "Methyl tert-butyl ether",
        ("MTBE", "tert-butyl methyl ether", "2-methoxy-2-methylpropane"),
        "1634-04-4",
    ),
    Compound(
        "tetrahydrofuran",
        "Tetrahydrofuran",
        ("THF", "oxolane", "tetramethylene oxide"),
        "109-99-9",
        1,
    ),
    Compound(
        "1-4-dioxane", "1,4-Dioxane", ("dioxane", "p-dioxane", "diethylene dioxide"), "123-91-1", 1
    ),
    Compound(
        "dichloromethane",
        "Dichloromethane",
        ("DCM", "methylene chloride", "methylene dichloride"),
        "75-09-2",
    ),
    Compound("chloroform", "Chloroform", ("trichloromethane", "TCM"), "67-66-3"),
    Compound(
        "carbon-tetrachloride",
        "Carbon tetrachloride",
        ("tetrachloromethane", "CCl4", "carbon tet"),
        "56-23-5",
    ),
    Compound(
        "1-2-dichloroethane",
        "1,2-Dichloroethane",
        ("EDC", "ethylene dichloride", "1,2-DCA"),
        "107-06-2",
    ),
    Compound(
        "trichloroethylene", "Trichloroethylene", ("TCE", "trichloroethene", "trike"), "79-01-6"
    ),
    Compound(
        "tetrachloroethylene",
        "Tetrachloroethylene",
        ("PCE", "perchloroethylene", "perc", "tetrachloroethene"),
        "127-18-4",
    ),
    Compound(
        "chlorobenzene",
        "Chlorobenzene",
        ("monochlorobenzene", "MCB", "phenyl chloride"),
        "108-90-7",
        1,
    ),
    Compound("acetonitrile", "Acetonitrile", ("ACN", "methyl cyanide", "ethanenitrile"), "75-05-8"),
    Compound(
        "acrylonitrile",
        "Acrylonitrile",
        ("vinyl cyanide", "2-propenenitrile", "propenenitrile"),
        "107-13-1",
    ),
    Compound(
        "vinyl-acetate",
        "Vinyl acetate",
        ("VAM", "vinyl acetate monomer", "ethenyl acetate"),
        "108-05-4",
    ),
    Compound(
        "methyl-methacrylate",
        "Methyl methacrylate",
        ("MMA", "methyl 2-methylpropenoate"),
        "80-62-6",
    ),
    Compound("carbon-disulfide", "Carbon disulfide", ("CS2", "carbon bisulfide"), "75-15-0"),
    Compound("dimethyl-carbonate", "Dimethyl carbonate", ("DMC", "methyl carbonate"), "616-38-6"),
    Compound(
        "acetic-acid", "Acetic acid", ("glacial acetic acid", "ethanoic acid", "AcOH"), "64-19-7"
    ),
    Compound(
        "n-n-dimethylformamide",
        "N,N-Dimethylformamide",
        ("DMF", "dimethylformamide", "DMFA"),
        "68-12-2",
    ),
    Compound(
        "ethylene-glycol",
        "Ethylene glycol",
        ("MEG", "monoethylene glycol", "1,2-ethanediol", "glycol"),
        "107-21-1",
    ),
    Compound(
        "propylene-glycol",
        "Propylene glycol",
        ("MPG", "monopropylene glycol", "1,2-propanediol"),
        "57-55-6",
    ),
    Compound("water", "Water", ("H2O",), "7732-18-5"),
    Compound("methyl-acetate", "Methyl acetate", ("MeOAc", "methyl ethanoate"), "79-20-9"),
    Compound(
        "n-propyl-acetate",
        "n-Propyl acetate",
        ("propyl acetate", "NPAc", "propyl ethanoate"),
        "109-60-4",
    ),
    Compound(
        "isobutyl-acetate", "Isobutyl acetate", ("2-methylpropyl acetate", "IBAc"), "110-19-0"
    ),
    Compound(
        "2-2-4-trimethylpentane",
        "2,2,4-Trimethylpentane",
        ("isooctane", "iso-octane"),
        "540-84-1",
    ),
    Compound("methylcyclohexane", "Methylcyclohexane", ("cyclohexylmethane", "MCH"), "108-87-2"),
    Compound("cyclohexene", "Cyclohexene", ("tetrahydrobenzene",), "110-83-8"),
    Compound("1-hexene", "1-Hexene", ("hex-1-ene", "hexylene"), "592-41-6"),
    Compound(
        "1-pentanol", "1-Pentanol", ("n-pentanol", "n-amyl alcohol", "pentan-1-ol"), "71-41-0"
    ),
    Compound(
        "2-butanol",
        "2-Butanol",
        ("sec-butanol", "sec-butyl alcohol", "SBA", "butan-2-ol"),
        "78-92-2",
    ),
    Compound("cyclohexanone", "Cyclohexanone", ("anone", "pimelic ketone"), "108-94-1"),
    Compound(
        "2-pentanone", "2-Pentanone", ("methyl propyl ketone", "MPK", "pentan-2-one"), "107-87-9"
    ),
    Compound("acetaldehyde", "Acetaldehyde", ("ethanal", "acetic aldehyde"), "75-07-0"),
    Compound("propionaldehyde", "Propionaldehyde", ("propanal", "propyl aldehyde"), "123-38-6"),
    Compound("butyraldehyde", "Butyraldehyde", ("butanal", "n-butyraldehyde"), "123-72-8"),
    Compound("acrolein", "Acrolein", ("propenal", "2-propenal", "acrylaldehyde"), "107-02-8"),
    Compound("diisopropyl-ether", "Diisopropyl ether", ("DIPE", "isopropyl ether"), "108-20-3"),
    Compound(
        "di-n-butyl-ether", "Di-n-butyl ether", ("dibutyl ether", "butyl ether", "DBE"), "142-96-1"
    ),
    Compound("methyl-formate", "Methyl formate", ("methyl methanoate",), "107-31-3"),
    Compound("ethyl-formate", "Ethyl formate", ("ethyl methanoate",), "109-94-4"),
    Compound(
        "methyl-acrylate",
        "Methyl acrylate",
        ("methyl propenoate", "methyl 2-propenoate"),
        "96-33-3",
    ),
    Compound("formic-acid", "Formic acid", ("methanoic acid",), "64-18-6"),
    Compound("propionic-acid", "Propionic acid", ("propanoic acid",), "79-09-4"),
    Compound("acetic-anhydride", "Acetic anhydride", ("ethanoic anhydride", "Ac2O"), "108-24-7"),
    Compound("nitromethane", "Nitromethane", ("nitrocarbol",), "75-52-5"),
    Compound("triethylamine", "Triethylamine", ("N,N-diethylethanamine",), "121-44-8"),
    Compound("diethylamine", "Diethylamine", ("N-ethylethanamine",), "109-89-7"),
    Compound(
        "ethylenediamine",
        "Ethylenediamine",
        ("EDA", "1,2-diaminoethane", "1,2-ethanediamine"),
        "107-15-3",
    ),
    Compound("pyridine", "Pyridine", ("azabenzene", "azine"), "110-86-1", 1),
    Compound("aniline", "Aniline", ("aminobenzene", "phenylamine", "benzenamine"), "62-53-3", 1),
    Compound(
        "1-1-dichloroethane",
        "1,1-Dichloroethane",
        ("ethylidene dichloride", "1,1-DCA"),
        "75-34-3",
        boiling_point_source="CRC_HVAP",
    ),
    Compound("1-2-dichloropropane", "1,2-Dichloropropane", ("propylene dichloride",), "78-87-5"),
    Compound(
        "o-dichlorobenzene", "o-Dichlorobenzene", ("1,2-dichlorobenzene", "ODCB"), "95-50-1", 1
    ),
    Compound(
        "furfural",
        "Furfural",
        ("2-furaldehyde", "furfuraldehyde", "2-furancarboxaldehyde"),
        "98-01-1",
        1,
    ),
    Compound(
        "propylene-oxide",
        "Propylene oxide",
        ("1,2-epoxypropane", "methyloxirane", "PO"),
        "75-56-9",
        1,
    ),
    Compound(
        "1-1-1-trichloroethane",
        "1,1,1-Trichloroethane",
        ("methyl chloroform", "TCA", "1,1,1-TCA"),
        "71-55-6",
    ),
)
"""Curated compounds: key, display name, synonyms, CAS number, ring count.

``boiling_point_source`` is set only where the preferred source's boiling
point disagrees with every other source and with both vapour-pressure
correlations: 1,1-dichloroethane is listed at 329.45 K in the CRC organic
constants as carried by ``chemicals`` but at 330.45 K in the CRC
enthalpy-of-vaporization table (330.45-330.55 K in CAS Common Chemistry,
NIST WebBook and Yaws), where Perry's DIPPR-101 and Poling's Antoine
equations give 101.3 kPa within 1 %.
"""

NON_FLAMMABLE: frozenset[str] = frozenset(
    {"water", "chloroform", "carbon-tetrachloride", "tetrachloroethylene"}
)
"""Keys of compounds without flammability limits or a flash point."""


def load_lookup_module():
    """Import ``estimator._chemicals_lookup`` as a package module or by path.

    Returns
    -------
    module
        The look-up module.
    """
    if str(REPO_ROOT) not in sys.path:
        sys.path.insert(0, str(REPO_ROOT))
    if (REPO_ROOT / "estimator" / "__init__.py").exists():
        return importlib.import_module("estimator._chemicals_lookup")
    name = "estimator._chemicals_lookup"
    spec = importlib.util.spec_from_file_location(name, MODULE_PATH)
    module = importlib.util.module_from_spec(spec)
    sys.modules[name] = module
    spec.loader.exec_module(module)
    return module


def format_value(value: Any) -> str:
    """Format one cell: floats with ``%.10g``, None as the empty string."""
    if value is None:
        return ""
    if isinstance(value, bool):
        return str(value)
    if isinstance(value, float):
        if math.isnan(value):
            return ""
        return FLOAT_FORMAT % value
    if isinstance(value, int):
        return FLOAT_FORMAT % value
    return str(value)


VALUE_GROUPS: dict[str, tuple[tuple[str, ...], str]] = {
    "molar_mass": (("molar_mass",), "molar_mass_source"),
    "phase_change": (("boiling_point", "melting_point"), "phase_change_source"),
    "critical": (("critical_temperature", "critical_pressure"), "critical_source"),
    "enthalpy": (("enthalpy_vaporization_nbp",), "enthalpy_source"),
    "dippr": (
        ("dippr_c1", "dippr_c2", "dippr_c3", "dippr_c4", "dippr_c5", "dippr_tmin", "dippr_tmax"),
        "dippr_source",
    ),
    "antoine": (
        ("antoine_a", "antoine_b", "antoine_c", "antoine_tmin", "antoine_tmax"),
        "antoine_source",
    ),
    "liquid_density": (("liquid_density", "liquid_density_temperature"), "liquid_density_source"),
    "flammability": (("lfl", "ufl"), "flammability_source"),
    "flash_point": (("flash_point",), "flash_point_source"),
    "diffusion_volume": (("diffusion_volume",), "diffusion_volume_source"),
}
"""Value columns of each group and the source column that covers them."""


def build_rows(lookup_module) -> list[dict[str, Any]]:
    """Look up every curated compound.

    Parameters
    ----------
    lookup_module : module
        ``estimator._chemicals_lookup``.

    Returns
    -------
    list of dict
        Rows sorted by key.
    """
    rows = []
    for compound in sorted(COMPOUNDS, key=lambda c: c.key):
        row = lookup_module.lookup(
            compound.cas, rings=compound.rings, boiling_point_source=compound.boiling_point_source
        )
        row["key"] = compound.key
        row["name"] = compound.name
        row["synonyms"] = "; ".join(compound.synonyms)
        row["cas"] = compound.cas
        rows.append(row)
    return rows


def _fold(label: str) -> str:
    """Fold a label for comparison: lower case, letters and digits only."""
    return re.sub(r"[^0-9a-z]", "", label.casefold())


def check_uniqueness() -> list[str]:
    """Check that keys, names, synonyms and CAS numbers are unique.

    Labels are compared case-insensitively and again with everything but
    letters and digits removed, across all compounds.

    Returns
    -------
    list of str
        Problems found.
    """
    problems = []
    owners: dict[str, str] = {}
    for c in COMPOUNDS:
        if not re.fullmatch(r"[a-z0-9]+(?:-[a-z0-9]+)*", c.key):
            problems.append(f"{c.key}: key is not a lower-case slug")
        own: set[str] = set()
        for label in (c.key, c.name, c.cas, *c.synonyms):
            if not label.strip() or ";" in label or label != label.strip():
                problems.append(f"{c.key}: invalid label {label!r}")
                continue
            for folded in {label.casefold(), _fold(label)}:
                if folded in owners and owners[folded] != c.key:
                    problems.append(f"{c.key}: label {label!r} clashes with {owners[folded]}")
                owners.setdefault(folded, c.key)
            if label.casefold() in own and label not in (c.key, c.name):
                problems.append(f"{c.key}: label {label!r} repeated")
            own.add(label.casefold())
    cas_numbers = [c.cas for c in COMPOUNDS]
    if len(set(cas_numbers)) != len(cas_numbers):
        problems.append("duplicate CAS number")
    return problems


def check_row(row: dict[str, Any], lookup_module, rings: int) -> tuple[list[str], list[str]]:
    """Run the plausibility checks on one row.

    Parameters
    ----------
    row : dict
        Table row.
    lookup_module : module
        ``estimator._chemicals_lookup``.
    rings : int
        Curated ring count.

    Returns
    -------
    tuple of list of str
        ``(missing, warnings)`` for the row.
    """
    key = row["key"]
    missing: list[str] = []
    warnings: list[str] = []

    for group, (columns, source) in VALUE_GROUPS.items():
        present = [row[c] is not None for c in columns]
        if not any(present):
            if not (group in ("flammability", "flash_point") and key in NON_FLAMMABLE):
                missing.append(group)
            if row[source]:
                warnings.append(f"{group}: source given without values")
        elif not all(present):
            if group == "flammability":
                warnings.append(f"{group}: only some values present")
            else:
                absent = [c for c, p in zip(columns, present) if not p]
                warnings.append(
                    f"{group}: incomplete ({', '.join(absent)})",
                )
        if any(present) and not row[source]:
            warnings.append(f"{group}: values without a source")

    mm = row["molar_mass"]
    if mm is not None and not 0.01 <= mm <= 0.5:
        warnings.append(f"molar mass {mm:.4g} kg/mol outside 0.01-0.5")
    tm, tb = row["melting_point"], row["boiling_point"]
    tc, pc = row["critical_temperature"], row["critical_pressure"]
    if tm is not None and tm >= 298.15:
        warnings.append(f"melting point {tm:.5g} K is not below 298.15 K")
    if tb is not None and tb < 293.0:
        warnings.append(f"boiling point {tb:.5g} K is below 293 K")
    if tc is not None and tc <= 298.15:
        warnings.append(f"Tc {tc:.5g} K not above 298.15 K")
    if tb is not None and tc is not None and tb >= tc:
        warnings.append(f"Tb {tb:.5g} K not below Tc {tc:.5g} K")
    if pc is not None and not 1e6 <= pc <= 2.5e7:
        warnings.append(f"Pc {pc:.4g} Pa outside 1e6-2.5e7")
    lfl, ufl = row["lfl"], row["ufl"]
    if lfl is not None and ufl is not None and not 0.0 < lfl < ufl <= 1.0:
        warnings.append(f"flammability limits {lfl}, {ufl} not ordered in (0, 1]")
    rho = row["liquid_density"]
    if rho is not None and not 500.0 <= rho <= 2000.0:
        warnings.append(f"liquid density {rho:.5g} kg/m3 outside 500-2000")
    fp = row["flash_point"]
    if fp is not None and tb is not None and fp >= tb:
        warnings.append(f"flash point {fp:.5g} K not below Tb {tb:.5g} K")
    if fp is not None and key in NON_FLAMMABLE:
        warnings.append("compound listed as non-flammable has a flash point")

    if row["dippr_c1"] is not None:
        coeffs = [row[f"dippr_c{i}"] for i in range(1, 6)]
        tmin, tmax = row["dippr_tmin"], row["dippr_tmax"]
        need_lo = max(273.15, tm) if tm is not None else 273.15
        need_hi = min(333.15, tc) if tc is not None else 333.15
        if tmin > need_lo + RANGE_TOLERANCE or tmax < need_hi - RANGE_TOLERANCE:
            warnings.append(
                f"DIPPR range {tmin:.5g}-{tmax:.5g} K does not cover the liquid range"
                f" {need_lo:.5g}-{need_hi:.5g} K within 273.15-333.15 K",
            )
        if tb is not None and tmin <= tb <= tmax:
            p_tb = lookup_module.dippr101(tb, *coeffs)
            dev = (p_tb / 101325.0 - 1.0) * 100.0
            if abs(dev) > 3.0:
                warnings.append(f"DIPPR p(Tb) = {p_tb:.6g} Pa ({dev:+.2f} % from 101325 Pa)")
        comparison = antoine_comparison(row, lookup_module)
        if comparison is None and row["antoine_a"] is not None:
            warnings.append("Antoine and DIPPR ranges do not overlap")
        elif comparison is not None and abs(comparison[1]) > ANTOINE_TOLERANCE_PERCENT:
            t_cmp, dev = comparison
            warnings.append(f"Antoine differs from DIPPR by {dev:+.2f} % at {t_cmp:.5g} K")

    if row["formula"]:
        from chemicals.identifiers import search_chemical

        try:
            smiles = search_chemical(row["cas"]).smiles
        except Exception:
            smiles = None
        derived = lookup_module.smiles_ring_count(smiles) if smiles else None
        if (
            row["cas"] not in lookup_module.FULLER_MOLECULAR_VOLUMES
            and derived is not None
            and derived != rings
        ):
            warnings.append(
                f"curated ring count {rings} differs from SMILES count {derived} ({smiles})",
            )
    return missing, warnings


def antoine_comparison(row: dict[str, Any], lookup_module) -> tuple[float, float] | None:
    """Compare the Antoine and DIPPR-101 vapour pressures of one row.

    The comparison temperature is 298.15 K when it lies inside both
    ranges, otherwise the end of the common range nearest to it.

    Returns
    -------
    tuple or None
        ``(temperature [K], 100 * (p_antoine / p_dippr - 1))``; None when
        either correlation is missing or the ranges do not overlap.
    """
    if row["dippr_c1"] is None or row["antoine_a"] is None:
        return None
    lo = max(row["dippr_tmin"], row["antoine_tmin"])
    hi = min(row["dippr_tmax"], row["antoine_tmax"])
    if lo > hi:
        return None
    t_cmp = min(max(298.15, lo), hi)
    p_d = lookup_module.dippr101(t_cmp, *[row[f"dippr_c{i}"] for i in range(1, 6)])
    p_a = lookup_module.antoine(t_cmp, row["antoine_a"], row["antoine_b"], row["antoine_c"])
    return t_cmp, (p_a / p_d - 1.0) * 100.0


def vdi_comparison(rows: list[dict[str, Any]], lookup_module) -> list[str]:
    """Compare DIPPR vapour pressures at 298.15 K with the VDI Heat Atlas PPDS equation.

    Returns
    -------
    list of str
        One line per compound whose values differ by more than
        ``CROSS_CHECK_TOLERANCE_PERCENT``.
    """
    from chemicals import vapor_pressure

    table = vapor_pressure.Psat_data_VDI_PPDS_3
    lines = []
    for row in rows:
        if row["dippr_c1"] is None or row["cas"] not in table.index:
            continue
        if row["dippr_source"] and "VDI" in row["dippr_source"]:
            continue
        v = table.loc[row["cas"]]
        if not v["Tm"] < 298.15 < v["Tc"]:
            continue
        p_ref = vapor_pressure.Wagner(298.15, v["Tc"], v["Pc"], v["A"], v["B"], v["C"], v["D"])
        p = lookup_module.dippr101(298.15, *[row[f"dippr_c{i}"] for i in range(1, 6)])
        dev = 100.0 * (p / p_ref - 1.0)
        if abs(dev) > CROSS_CHECK_TOLERANCE_PERCENT:
            lines.append(
                f"{row['key']:<26} DIPPR {p:11.5g} Pa  VDI PPDS {p_ref:11.5g} Pa  {dev:+6.2f} %"
            )
    return lines


def vapor_pressure_comparison(rows: list[dict[str, Any]], lookup_module) -> list[str]:
    """Compare DIPPR vapour pressures at 298.15 K with CoolProp where it has the fluid.

    Returns
    -------
    list of str
        One line per compared compound; empty if CoolProp is unavailable.
    """
    try:
        import CoolProp.CoolProp as CP
    except ImportError:
        return []
    by_cas = {}
    for fluid in CP.get_global_param_string("FluidsList").split(","):
        by_cas[CP.get_fluid_param_string(fluid, "CAS")] = fluid
    lines = []
    for row in rows:
        fluid = by_cas.get(row["cas"])
        if fluid is None or row["dippr_c1"] is None:
            continue
        try:
            p_ref = CP.PropsSI("P", "T", 298.15, "Q", 0, fluid)
        except ValueError:
            continue
        p = lookup_module.dippr101(298.15, *[row[f"dippr_c{i}"] for i in range(1, 6)])
        dev = 100.0 * (p / p_ref - 1.0)
        lines.append(
            f"{row['key']:<26} DIPPR {p:11.5g} Pa  CoolProp {p_ref:11.5g} Pa  {dev:+6.2f} %"
        )
    return lines


def render_csv(rows: list[dict[str, Any]], columns: tuple[str, ...]) -> str:
    """Render rows as CSV text with ``\\n`` line endings."""
    buf = io.StringIO()
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(columns)
    for row in rows:
        writer.writerow([format_value(row[c]) for c in columns])
    return buf.getvalue()


def main(argv: list[str] | None = None) -> int:
    """Build the table, print the report, and write the CSV.

    Parameters
    ----------
    argv : list of str, optional
        Command-line arguments.

    Returns
    -------
    int
        Exit status: 0 on success, 1 if labels are not unique.
    """
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--output", type=Path, default=OUTPUT, help="CSV file to write")
    parser.add_argument(
        "--check", action="store_true", help="compare with the existing file instead of writing"
    )
    args = parser.parse_args(argv)

    lookup_module = load_lookup_module()
    problems = check_uniqueness()
    for p in problems:
        print(f"label problem: {p}")
    if problems:
        return 1

    rows = build_rows(lookup_module)
    rings = {c.key: c.rings for c in COMPOUNDS}
    print(f"{len(rows)} compounds")
    print()
    print("Missing groups and warnings")
    print("---------------------------")
    clean = True
    for row in rows:
        missing, warnings = check_row(row, lookup_module, rings[row["key"]])
        if missing or warnings:
            clean = False
            print(f"{row['key']}:")
            if missing:
                print(f"    missing: {', '.join(missing)}")
            for w in warnings:
                print(f"    {w}")
    if clean:
        print("none")
    deviations = []
    for row in rows:
        comparison = antoine_comparison(row, lookup_module)
        if comparison is not None:
            deviations.append((row["key"], *comparison))
    if deviations:
        magnitudes = sorted(abs(d[2]) for d in deviations)
        median = magnitudes[len(magnitudes) // 2]
        within = sum(m <= ANTOINE_TOLERANCE_PERCENT for m in magnitudes)
        at_298 = sum(d[1] == 298.15 for d in deviations)
        print()
        print("Antoine (converted) against DIPPR-101")
        print("-------------------------------------")
        print(
            f"{len(deviations)} rows compared, median |deviation| {median:.2f} %,"
            f" {within} within {ANTOINE_TOLERANCE_PERCENT:g} %; {at_298} compared at 298.15 K"
        )
        for key, t_cmp, dev in deviations:
            if abs(dev) > ANTOINE_TOLERANCE_PERCENT:
                print(f"{key:<26} {dev:+6.2f} % at {t_cmp:.5g} K")
    cross = vdi_comparison(rows, lookup_module)
    if cross:
        print()
        title = "DIPPR-101 against VDI Heat Atlas PPDS at 298.15 K"
        print(f"{title} (over {CROSS_CHECK_TOLERANCE_PERCENT:g} %)")
        print("-" * (len(title) + 12))
        for line in cross:
            print(line)
    comparison = vapor_pressure_comparison(rows, lookup_module)
    if comparison:
        print()
        print("DIPPR-101 against CoolProp at 298.15 K")
        print("--------------------------------------")
        for line in comparison:
            print(line)

    text = render_csv(rows, lookup_module.ROW_COLUMNS)
    if args.check:
        current = args.output.read_text(encoding="utf-8") if args.output.exists() else ""
        same = current == text
        print()
        print(f"{args.output} is {'up to date' if same else 'out of date'}")
        return 0 if same else 1
    args.output.parent.mkdir(parents=True, exist_ok=True)
    args.output.write_text(text, encoding="utf-8", newline="")
    print()
    print(f"wrote {args.output}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
