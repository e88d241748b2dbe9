"""The bundled vapour-pressure data against reference equations of state, 0-60 degC.

References: CoolProp (Bell et al. 2014, Ind. Eng. Chem. Res. 53, 2498), one
reference or technical equation of state per fluid, matched by CAS number; and
IAPWS-95 (iapws package) for water. Reference points where CoolProp's saturation
pressure breaks the exact Clapeyron equation are left out (see
outside_references.reference_is_consistent).
"""

import csv
import warnings

import numpy as np
import pytest

import estimator
from estimator.vapor import _UNCERTAINTY_FILE, vapor_pressure_estimate

from outside_references import (  # noqa: E402
    WATER_CAS,
    coolprop_range,
    has_reference,
    reference_is_consistent,
    reference_saturation_pressure,
)

GRID = np.arange(273.15, 333.16, 1.0)


def _grid(sub):
    lo, hi = (sub.melting_point or 0.0), sub.critical_temperature
    if sub.cas != WATER_CAS:
        t_triple, t_crit = coolprop_range(sub.cas)
        lo, hi = max(lo, t_triple), min(hi, t_crit)
    t = GRID[(GRID > lo) & (GRID < hi)]
    return t[reference_is_consistent(sub.cas, t)]


@pytest.fixture(scope="module")
def compared():
    """(key, best-method relative errors) for every table compound with a reference."""
    out = []
    for sub in estimator.all_substances():
        if has_reference(sub.cas):
            t = _grid(sub)
            p = estimator.vapor_pressure(sub, t)
            out.append((sub.key, p / reference_saturation_pressure(sub.cas, t) - 1.0))
    return out


@pytest.mark.requires_coolprop
def test_reference_screen_leaves_out_only_inconsistent_points():
    """The Clapeyron screen drops propylene glycol's low-temperature points (CoolProp's
    saturation curve there is 50 % off its own ΔHvap) and keeps toluene's."""
    assert not reference_is_consistent("57-55-6", [274.15]).any()
    assert reference_is_consistent("108-88-3", GRID).all()


@pytest.mark.requires_coolprop
@pytest.mark.requires_iapws
def test_enough_compounds_have_a_reference(compared):
    """At least 20 table compounds are checked against an outside reference."""
    assert len(compared) >= 20


@pytest.mark.requires_coolprop
@pytest.mark.requires_iapws
def test_best_method_within_3_percent_everywhere(compared):
    """The built-in data agree with CoolProp / IAPWS-95 within 3 % at every point."""
    worst = {k: float(np.max(np.abs(e))) for k, e in compared}
    bad = {k: v for k, v in worst.items() if v > 0.03}
    assert not bad, bad


@pytest.mark.requires_coolprop
@pytest.mark.requires_iapws
def test_best_method_median_within_1_percent(compared):
    """The median absolute deviation over all points is within 1 %."""
    flat = np.abs(np.concatenate([e for _, e in compared]))
    assert np.median(flat) < 0.01


def _stated():
    with _UNCERTAINTY_FILE.open(newline="", encoding="utf-8") as handle:
        return {row["method"]: row for row in csv.DictReader(handle)}


@pytest.mark.requires_coolprop
@pytest.mark.requires_iapws
@pytest.mark.parametrize(
    "method", ["dippr101", "antoine", "clausius-clapeyron-watson", "clausius-clapeyron",
               "trouton"])
def test_stated_uncertainty_is_reproduced(method):
    """The 95th-percentile error stated for each method is what a fresh comparison
    with CoolProp / IAPWS-95 gives (within 10 % of itself)."""
    stated = float(_stated()[method]["p95_relative_error"])
    errors = []
    for sub in estimator.all_substances():
        if has_reference(sub.cas) and any(c.method == method for c in sub.correlations):
            t = _grid(sub)
            correlation = next(c for c in sub.correlations if c.method == method)
            t = t[(t >= correlation.tmin) & (t <= correlation.tmax)]
            if not t.size:
                continue
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                p = vapor_pressure_estimate(sub, t, method=method).pressure
            errors.append(np.abs(p / reference_saturation_pressure(sub.cas, t) - 1.0))
    fresh = np.percentile(np.concatenate(errors), 95)
    assert fresh == pytest.approx(stated, rel=0.10)


def test_clausius_clapeyron_from_boiling_point_is_honestly_worse():
    """Clausius-Clapeyron with constant ΔHvap(Tb) is stated as far less certain than the
    correlation: its 95th-percentile error over 0-60 degC exceeds 5 %."""
    stated = _stated()
    assert float(stated["clausius-clapeyron"]["p95_relative_error"]) > 0.05
    assert (float(stated["clausius-clapeyron"]["p95_relative_error"])
            > 3 * float(stated["dippr101"]["p95_relative_error"]))


def test_estimate_reports_method_and_uncertainty():
    """vapor_pressure_estimate names its method, source and stated uncertainty."""
    est = vapor_pressure_estimate("toluene", 298.15)
    assert est.method == "antoine"
    assert "Poling" in est.source
    wide = vapor_pressure_estimate("toluene", [250.0, 500.0])
    assert wide.method == "dippr101"
    assert "Perry" in wide.source
    assert 0 < est.relative_uncertainty < 0.03
    assert "CoolProp" in est.uncertainty_basis


def test_handbook_values_from_memory():
    """Handbook values (from memory): water 3.169 kPa at 25 degC (IAPWS-95 steam
    tables), benzene 12.7 kPa and toluene 3.79 kPa at 25 degC (CRC Handbook)."""
    assert estimator.vapor_pressure("water", 298.15) == pytest.approx(3169.9, rel=0.01)
    assert estimator.vapor_pressure("benzene", 298.15) == pytest.approx(12700.0, rel=0.02)
    assert estimator.vapor_pressure("toluene", 298.15) == pytest.approx(3790.0, rel=0.02)
