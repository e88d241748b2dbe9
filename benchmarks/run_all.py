"""Run every benchmark and print the ratios, each measured within one run.

    python benchmarks/run_all.py

Ratios, not seconds, are the figures to compare between machines: each pits
ullage against a baseline timed in the same process moments apart.
"""

from __future__ import annotations

import importlib
import platform
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))
sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

BENCHMARKS = [
    "bench_vapor_pressure",
    "bench_inventory",
    "bench_inventory_cli",
    "bench_monte_carlo",
    "bench_ui",
    "bench_import",
    "bench_spill",
    "bench_browser_sessions",
]


def main() -> int:
    import numpy

    print(f"ullage benchmarks on {platform.machine()}, {platform.processor() or 'cpu'}, "
          f"Python {platform.python_version()}, numpy {numpy.__version__}, "
          f"{time.strftime('%Y-%m-%d')}")
    records = []
    for name in BENCHMARKS:
        module = importlib.import_module(name)
        out = module.run()
        records.extend(out if isinstance(out, list) else [out])
    print(f"\n{len(records)} figures measured.")
    return 0


if __name__ == "__main__":
    sys.exit(main())
