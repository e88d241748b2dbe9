"""An 8-hour indoor spill of a 10-component mixture at 1-s output against the analytic box model.

The coupled pool-and-room integration (estimator.spill.indoor_spill) against the
analytic constant-source well-mixed room evaluated for the same ten components
over the same 28,801 output times.
"""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent))
sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from _timing import best_time, report  # noqa: E402

from estimator.indoor import well_mixed_room  # noqa: E402
from estimator.spill import indoor_spill  # noqa: E402

COMPONENTS = ["acetone", "methanol", "ethanol", "toluene", "o-xylene", "n-hexane",
              "n-heptane", "ethyl-acetate", "methyl-ethyl-ketone", "isopropanol"]


def run() -> dict:
    times = np.arange(0.0, 8 * 3600.0 + 1.0, 1.0)
    liquid = {k: 0.1 for k in COMPONENTS}

    def ours():
        return indoor_spill(liquid, 298.15, room_volume=300.0, ventilation_rate=0.2,
                            spilled_volume=0.02, mixing_factor=2.0, times=times)

    rates = ours().evaporation_rate[0]

    def analytic():
        return [well_mixed_room(g, 300.0, 0.2, times, mixing_factor=2.0) for g in rates]

    return report("indoor spill, 10 components, 8 h at 1 s vs analytic box",
                  best_time(ours, repeat=5), best_time(analytic, repeat=5), "< 20")


if __name__ == "__main__":
    run()
