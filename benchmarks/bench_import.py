"""Import time of estimator against import of numpy, scipy and pandas, in fresh processes."""

from __future__ import annotations

import subprocess
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from _timing import report  # noqa: E402

ROOT = Path(__file__).resolve().parents[1]


def _fresh(statement: str, repeat: int = 5) -> float:
    best = float("inf")
    for _ in range(repeat):
        start = time.perf_counter()
        subprocess.run([sys.executable, "-c", statement], check=True, cwd=ROOT)
        best = min(best, time.perf_counter() - start)
    return best


def run() -> dict:
    empty = _fresh("pass")
    ours = _fresh("import estimator") - empty
    baseline = _fresh("import numpy, scipy, pandas") - empty
    return report("import estimator vs import numpy, scipy, pandas", ours, baseline,
                  "<= 1.5")


if __name__ == "__main__":
    run()
