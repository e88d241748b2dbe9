"""vapor_pressure over 10^6 temperatures against bare numpy of the same formula."""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent))
sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from _timing import best_time, report  # noqa: E402

import estimator  # noqa: E402


def run() -> dict:
    sub = estimator.substance("toluene")
    corr = next(c for c in sub.correlations if c.method == "dippr101")
    t = np.random.default_rng(1).uniform(200.0, 550.0, 1_000_000)
    assert estimator.vapor_pressure_estimate(sub, t).method == "dippr101"
    c1, c2, c3, c4, c5 = corr.c1, corr.c2, corr.c3, corr.c4, corr.c5

    def bare():
        return np.exp(c1 + c2 / t + c3 * np.log(t) + c4 * t**c5)

    def ours():
        return estimator.vapor_pressure(sub, t)

    np.testing.assert_allclose(ours(), bare(), rtol=1e-12)
    return report("vapor_pressure, 1e6 temperatures vs bare numpy", best_time(ours),
                  best_time(bare), "<= 1.5")


if __name__ == "__main__":
    run()
