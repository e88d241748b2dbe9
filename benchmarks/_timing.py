"""Timing helper shared by the benchmarks: best of several repeats, in one process."""

from __future__ import annotations

import time


def best_time(func, repeat: int = 7, number: int = 1) -> float:
    """Shortest wall-clock time of `number` calls of `func`, over `repeat` tries. [s]"""
    best = float("inf")
    for _ in range(repeat):
        start = time.perf_counter()
        for _ in range(number):
            func()
        best = min(best, (time.perf_counter() - start) / number)
    return best


def report(name: str, ours: float, baseline: float, target: str) -> dict:
    """Print one benchmark line and return it as a record."""
    ratio = ours / baseline
    print(f"{name:<48} {ours * 1e3:10.2f} ms  vs {baseline * 1e3:10.2f} ms  "
          f"ratio {ratio:7.3f}  (target {target})")
    return {"benchmark": name, "ours_s": ours, "baseline_s": baseline, "ratio": ratio,
            "target": target}
