"""Indoor-spill Monte Carlo: 10^5 samples at once against one sample at a time in a loop."""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent))
sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from _timing import best_time, report  # noqa: E402

from estimator.limits import exposure_limit  # noqa: E402
from estimator.uncertainty import (  # noqa: E402
    LogNormal,
    Triangular,
    Uniform,
    indoor_spill_monte_carlo,
)

VECTOR_SAMPLES = 100_000
LOOP_RUNS = 1_000


def _inputs() -> dict:
    """An uncertain toluene spill in a workroom (illustrative values)."""
    return dict(
        substance_or_key="toluene",
        temperature=Uniform(293.15, 303.15),
        pool_area=Triangular(0.5, 1.0, 2.0),
        air_speed=LogNormal(0.1, 1.6),
        room_volume=Uniform(150.0, 250.0),
        ventilation_rate=Uniform(0.2, 0.6),
        mixing_factor=Uniform(1.0, 5.0),
        spilled_mass=Uniform(0.5, 2.0),
        limits=[exposure_limit("toluene", "TWA", 20.0, "ppm", "illustrative"),
                exposure_limit("toluene", "STEL", 100.0, "ppm", "illustrative")],
    )


def run() -> dict:
    inputs = _inputs()

    def vectorised():
        return indoor_spill_monte_carlo(**inputs, n=VECTOR_SAMPLES, seed=1)

    def looped():
        return [indoor_spill_monte_carlo(**inputs, n=1, seed=i) for i in range(LOOP_RUNS)]

    assert np.isfinite(indoor_spill_monte_carlo(**inputs, n=1, seed=0).outputs["twa_ppm"]).all()
    assert np.isfinite(vectorised().outputs["twa_ppm"]).all()

    per_sample_vectorised = best_time(vectorised, repeat=3) / VECTOR_SAMPLES
    per_sample_loop = best_time(looped, repeat=2) / LOOP_RUNS
    # both as the time for 1e5 samples, so the ratio is the per-sample cost ratio
    record = report("indoor spill MC, 1e5 samples: at once vs looped",
                    per_sample_vectorised * VECTOR_SAMPLES, per_sample_loop * VECTOR_SAMPLES,
                    "<= 0.01")
    speedup = per_sample_loop / per_sample_vectorised
    print(f"{'':<48} per-sample cost ratio (loop / vectorised): {speedup:,.0f} "
          f"({per_sample_loop * 1e6:,.0f} us vs {per_sample_vectorised * 1e6:.2f} us)")
    record["per_sample_cost_ratio"] = speedup
    return record


if __name__ == "__main__":
    run()
