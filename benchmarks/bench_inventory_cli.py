"""`ullage inventory FILE -o out.csv` end to end against a plain pandas + numpy pass.

Both read the same CSV file, compute the vapour pressure and ppm of every row and
write a CSV file; ours also checks every cell, screens the worst case, %LFL, oxygen
and the concern, writes a reason per row and prints the terminal summary. Timed in
one process, ours and the baseline alternately, at 10^3 to 10^6 rows; the peak
memory (resident set size) of each is measured in a fresh process of its own.

    python benchmarks/bench_inventory_cli.py            # 10^3 .. 10^6 rows
    python benchmarks/bench_inventory_cli.py 1e5        # one size
"""

from __future__ import annotations

import contextlib
import io
import json
import subprocess
import sys
import tempfile
import time
import warnings
from pathlib import Path

import numpy as np
import pandas as pd

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE))
sys.path.insert(0, str(HERE.parents[0]))

import estimator  # noqa: E402
from estimator.cli import main as ullage  # noqa: E402

SIZES = (1_000, 10_000, 100_000, 1_000_000)
#: Repeats per size (best of); the largest size is timed once.
REPEATS = {1_000: 7, 10_000: 5, 100_000: 3, 1_000_000: 1}
PRESSURE = 101325.0
T_LOW, T_HIGH = 10.0, 40.0  # degC
#: Share of rows holding a two-component blend whose composition differs row to row.
BLEND_SHARE = 0.1


def _substances(count: int = 8):
    """Table liquids whose preferred correlation covers the range, below boiling."""
    chosen = []
    for sub in estimator.all_substances():
        first = sub.correlations[0]
        if (first.method in ("antoine", "dippr101") and first.tmin <= T_LOW + 273.15
                and T_HIGH + 278.15 <= first.tmax and sub.boiling_point > T_HIGH + 278.15
                and (sub.melting_point or 0.0) < T_LOW + 273.15):
            chosen.append(sub)
    return chosen[:count]


def _blend():
    """The two components of the varied blends: the first two benchmark liquids."""
    first, second = _substances()[:2]
    return first.key, second.key


def make_file(path: Path, rows: int, seed: int = 5, blend_share: float = BLEND_SHARE) -> None:
    """An invented inventory of `rows` containers (pure liquids and varied blends)."""
    rng = np.random.default_rng(seed)
    keys = np.array([s.key for s in _substances()], dtype=object)
    liquid = keys[rng.integers(0, keys.size, rows)]
    blend = rng.random(rows) < blend_share
    share = rng.integers(1000, 9000, blend.sum()) / 100.0
    one, two = _blend()
    liquid[blend] = [f"{one} {a:.2f}%, {two} {100 - a:.2f}%" for a in share]
    frame = pd.DataFrame({
        "container": [f"Yard {i // 1000}-{i % 1000:03d}" for i in range(rows)],
        "liquid": liquid,
        "temperature_C": rng.uniform(T_LOW, T_HIGH, rows).round(1),
        "fill_percent": rng.uniform(5, 95, rows).round(0),
        "area": rng.choice(["north bund", "drum store", "tank farm"], rows),
    })
    frame.to_csv(path, index=False)


def _correlation_arrays():
    """Per substance key: (kind, coefficients, molar mass) of its preferred correlation."""
    out = {}
    for sub in _substances():
        c = sub.correlations[0]
        coefficients = (c.a, c.b, c.c) if c.method == "antoine" else (c.c1, c.c2, c.c3, c.c4,
                                                                       c.c5)
        out[sub.key] = (c.method, coefficients, sub.molar_mass)
    return out


def _p_sat(kind, k, t):
    if kind == "antoine":
        return 10.0 ** (k[0] - k[1] / (t + k[2]))
    return np.exp(k[0] + k[1] / t + k[2] * np.log(t) + k[3] * t ** k[4])


def baseline(source: Path, target: Path, table) -> None:
    """Plain pandas + numpy: read, vapour pressure (Raoult for blends) and ppm, write."""
    frame = pd.read_csv(source)
    t = frame["temperature_C"].to_numpy() + 273.15
    p = np.full(len(frame), np.nan)
    liquid = frame["liquid"]
    is_blend = liquid.str.contains("%", regex=False).to_numpy()
    codes, uniques = pd.factorize(liquid[~is_blend])
    pure_rows = np.flatnonzero(~is_blend)
    for k, key in enumerate(uniques):
        rows = pure_rows[codes == k]
        kind, coefficients, _ = table[key]
        p[rows] = _p_sat(kind, coefficients, t[rows])
    rows = np.flatnonzero(is_blend)
    parts = liquid[is_blend].str.extract(r"^(.+) ([\d.]+)%, (.+) ([\d.]+)%$")
    w = parts[[1, 3]].astype(float).to_numpy() / 100.0
    (ka, ca, ma), (kb, cb, mb) = (table[key] for key in _blend())
    moles = w / np.array([ma, mb])
    x = moles / moles.sum(axis=1, keepdims=True)
    p[rows] = x[:, 0] * _p_sat(ka, ca, t[rows]) + x[:, 1] * _p_sat(kb, cb, t[rows])
    frame["vapor_pressure_pa"] = p
    frame["ppm"] = np.minimum(p, PRESSURE) / PRESSURE * 1e6
    frame.to_csv(target, index=False)


def ours(source: Path, target: Path) -> int:
    """The command line, in this process, with the terminal summary captured."""
    with contextlib.redirect_stdout(io.StringIO()), contextlib.redirect_stderr(io.StringIO()), \
            warnings.catch_warnings():
        warnings.simplefilter("ignore")
        return ullage(["inventory", str(source), "-o", str(target), "--max-size", "2 GB"])


_PEAK = """
import re, sys, warnings
sys.path.insert(0, {root!r}); sys.path.insert(0, {here!r})
warnings.simplefilter("ignore")
import bench_inventory_cli as b
from pathlib import Path
if sys.argv[1] == "ours":
    b.ours(Path(sys.argv[2]), Path(sys.argv[3]))
else:
    b.baseline(Path(sys.argv[2]), Path(sys.argv[3]), b._correlation_arrays())
# VmHWM: the peak resident set of this program (ru_maxrss would also count the
# memory of the benchmark process this one was started from).
status = open("/proc/self/status").read()
print(int(re.search(r"VmHWM:\\s+(\\d+) kB", status)[1]) * 1024)
"""


def peak_memory(which: str, source: Path, target: Path) -> int:
    """Peak resident set size of a fresh process doing one pass. [bytes]"""
    code = _PEAK.format(root=str(HERE.parents[0]), here=str(HERE))
    done = subprocess.run([sys.executable, "-c", code, which, str(source), str(target)],
                          capture_output=True, text=True, check=True)
    return int(done.stdout.split()[-1])


def _best(func, repeat: int) -> float:
    best = float("inf")
    for _ in range(repeat):
        start = time.perf_counter()
        func()
        best = min(best, time.perf_counter() - start)
    return best


def run(sizes=SIZES, memory: bool = True) -> list[dict]:
    table = _correlation_arrays()
    records = []
    with tempfile.TemporaryDirectory() as folder:
        folder = Path(folder)
        for rows in sizes:
            source = folder / f"inventory_{rows}.csv"
            make_file(source, rows)
            out_ours, out_base = folder / "ours.csv", folder / "base.csv"
            code = ours(source, out_ours)  # warm-up, and a check of the result
            baseline(source, out_base, table)
            mine = pd.read_csv(out_ours, comment="#")
            base = pd.read_csv(out_base)
            np.testing.assert_allclose(mine["headspace_ppm"], base["ppm"], rtol=1e-9)
            t_ours = t_base = float("inf")
            for _ in range(REPEATS.get(rows, 1)):
                t_base = min(t_base, _best(lambda: baseline(source, out_base, table), 1))
                t_ours = min(t_ours, _best(lambda: ours(source, out_ours), 1))
            record = {"rows": rows, "file_mb": source.stat().st_size / 1e6, "ours_s": t_ours,
                      "baseline_s": t_base, "ratio": t_ours / t_base, "exit": code}
            if memory:
                record["ours_peak_mib"] = peak_memory("ours", source, out_ours) / 2**20
                record["baseline_peak_mib"] = peak_memory("base", source, out_base) / 2**20
            records.append(record)
            line = (f"{rows:>9} rows ({record['file_mb']:6.1f} MB): ours {t_ours:8.3f} s, "
                    f"baseline {t_base:8.3f} s, ratio {record['ratio']:5.2f} (target <= 3)")
            if memory:
                line += (f"; peak RSS ours {record['ours_peak_mib']:6.0f} MiB, baseline "
                         f"{record['baseline_peak_mib']:6.0f} MiB")
            print(line, flush=True)
        if 100_000 in sizes:
            # Every row a blend of its own composition (each text distinct).
            source = folder / "blends.csv"
            make_file(source, 100_000, blend_share=1.0)
            ours(source, folder / "ours.csv")
            t_base = min(_best(lambda: baseline(source, folder / "base.csv", table), 1)
                         for _ in range(3))
            t_ours = min(_best(lambda: ours(source, folder / "ours.csv"), 1) for _ in range(3))
            records.append({"rows": 100_000, "all_blends": True, "ours_s": t_ours,
                            "baseline_s": t_base, "ratio": t_ours / t_base})
            print(f"   100000 rows, every row a distinct blend: ours {t_ours:8.3f} s, baseline "
                  f"{t_base:8.3f} s, ratio {t_ours / t_base:5.2f}", flush=True)
    records_by_size = [r for r in records if not r.get("all_blends")]
    for previous, current in zip(records_by_size, records_by_size[1:]):
        print(f"  x10 rows {previous['rows']:>9} -> {current['rows']:>9}: ours x"
              f"{current['ours_s'] / previous['ours_s']:.1f}, baseline x"
              f"{current['baseline_s'] / previous['baseline_s']:.1f}")
    return records


if __name__ == "__main__":
    chosen = tuple(int(float(a)) for a in sys.argv[1:]) or SIZES
    print(json.dumps(run(chosen), indent=1))
