"""Count the liquids ullage can screen through the property library (`chemicals`).

A compound can be screened when the library gives it a molar mass (from its
formula), a normal boiling point from one of the sources ullage reads, and so a
vapour-pressure route (a DIPPR-101 or Antoine correlation, else Clausius-Clapeyron
from the boiling point). Of those, the script counts how many have a
vapour-pressure correlation, a lower flammability limit and a flash point, and how
many are liquid at 20 degC (melting point known and below, boiling point above).

    python tools/library_coverage.py

The figures go into the README's "Substance data" paragraph.
"""

from __future__ import annotations

import sys

from estimator import _chemicals_lookup as lk
from estimator.substances import all_substances


def main() -> int:
    import chemicals
    from chemicals.elements import molecular_weight, simple_formula_parser

    db = lk._identifier_db()
    db.autoload_main_db()
    with_formula = set()
    for cas in lk.boiling_point_cas():
        meta = db.search_CAS(cas, autoload=True)
        if meta and meta.formula:
            try:
                if molecular_weight(simple_formula_parser(meta.formula)) > 0:
                    with_formula.add(cas)
            except Exception:
                continue
    screenable = with_formula
    correlations = set()
    for cas in screenable & lk.correlation_cas():  # confirm with the look-up functions
        tb = lk.phase_change_temperatures(cas)["boiling_point"]
        if lk.dippr_vapor_pressure(cas)["dippr_source"] or \
                lk.antoine_vapor_pressure(cas, tb)["antoine_source"]:
            correlations.add(cas)
    lfl, flash = lk.flammability_cas()
    liquid = set()
    for cas in screenable:
        tb = lk.phase_change_temperatures(cas)
        if tb["melting_point"] is not None and tb["melting_point"] < 293.15 < tb["boiling_point"]:
            liquid.add(cas)
    table = {s.cas for s in all_substances()}
    rows = [
        ("compounds that can be screened (molar mass, boiling point, a vapour-pressure route)",
         len(screenable)),
        ("  of which with a vapour-pressure correlation (DIPPR-101 or Antoine)",
         len(correlations)),
        ("  of which with a lower flammability limit", len(screenable & lfl)),
        ("  of which with a flash point", len(screenable & flash)),
        ("  of which liquid at 20 degC (melting point on record)", len(liquid)),
        ("  liquid at 20 degC with a correlation", len(liquid & correlations)),
        ("curated table (screened first)", len(table)),
        ("table and library together", len(table | screenable)),
    ]
    print(f"chemicals {chemicals.__version__}")
    for label, count in rows:
        print(f"{count:>7}  {label}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
