"""Derive the stated uncertainty of each vapour-pressure method from outside references.

Compares every method ullage offers against CoolProp's equations of state (and
IAPWS-95 for water) for every compound of the bundled table that has such a
reference, at 1 K steps over 0-60 degC (inside each compound's liquid range), and
writes ``estimator/data/method_uncertainty.csv``. Run after changing the table:

    python tools/validate_vapor_pressure.py
"""

from __future__ import annotations

import csv
import datetime
import sys
import warnings
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(ROOT / "tests"))

import estimator  # noqa: E402
from estimator.vapor import METHODS, vapor_pressure_estimate  # noqa: E402
from outside_references import (  # noqa: E402
    coolprop_range,
    has_reference,
    reference_is_consistent,
    reference_saturation_pressure,
    WATER_CAS,
)

TEMPERATURES = np.arange(273.15, 333.15 + 0.5, 1.0)
OUT = ROOT / "estimator" / "data" / "method_uncertainty.csv"
SDS_POINT_TEMPERATURE = 293.15


def grid_for(sub) -> np.ndarray:
    """Temperatures of the grid where the compound is liquid and the reference is valid."""
    lo = sub.melting_point or 0.0
    hi = sub.critical_temperature or np.inf
    if sub.cas != WATER_CAS:
        t_triple, t_crit = coolprop_range(sub.cas)
        lo, hi = max(lo, t_triple), min(hi, t_crit)
    t = TEMPERATURES[(TEMPERATURES > lo) & (TEMPERATURES < hi)]
    return t[reference_is_consistent(sub.cas, t)] if t.size else t


def method_errors() -> dict[str, list[tuple[str, np.ndarray]]]:
    """method -> [(compound key, relative errors on its grid)]."""
    errors: dict[str, list] = {m: [] for m in METHODS}
    for sub in estimator.all_substances():
        if not has_reference(sub.cas):
            continue
        t = grid_for(sub)
        if t.size == 0:
            continue
        reference = reference_saturation_pressure(sub.cas, t)
        for correlation in sub.correlations:
            inside = (t >= correlation.tmin) & (t <= correlation.tmax)
            if not inside.any():
                continue
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                p = vapor_pressure_estimate(sub, t[inside], method=correlation.method).pressure
            errors[correlation.method].append((sub.key, p / reference[inside] - 1.0))
        p20 = float(reference_saturation_pressure(sub.cas, [SDS_POINT_TEMPERATURE])[0])
        sds = estimator.user_substance(sub.name, sub.molar_mass, sub.boiling_point,
                                       [(SDS_POINT_TEMPERATURE, p20)])
        p = sds.correlations[0](t)
        errors["clausius-clapeyron-fit"].append((sub.key, p / reference - 1.0))
    return errors


def summarise(errors):
    rows = []
    for method, per_compound in errors.items():
        if not per_compound:
            continue
        flat = np.abs(np.concatenate([e for _, e in per_compound]))
        worst = max(per_compound, key=lambda item: np.max(np.abs(item[1])))
        rows.append({
            "method": method,
            "n_compounds": len(per_compound),
            "n_points": flat.size,
            "temperature_range": "0-60 degC",
            "median_relative_error": f"{np.median(flat):.4f}",
            "p95_relative_error": f"{np.percentile(flat, 95):.4f}",
            "max_relative_error": f"{flat.max():.4f}",
            "worst_compound": worst[0],
            "reference": "CoolProp equations of state and IAPWS-95 (water)",
        })
    return rows


def main() -> None:
    rows = summarise(method_errors())
    with OUT.open("w", newline="", encoding="utf-8") as handle:
        writer = csv.DictWriter(handle, fieldnames=list(rows[0]), lineterminator="\n")
        writer.writeheader()
        writer.writerows(rows)
    for row in rows:
        print(f"{row['method']:<28} n={row['n_compounds']:>3} median {row['median_relative_error']}"
              f"  p95 {row['p95_relative_error']}  max {row['max_relative_error']}"
              f" ({row['worst_compound']})")
    print(f"wrote {OUT.relative_to(ROOT)} on {datetime.date.today()}")


if __name__ == "__main__":
    main()
