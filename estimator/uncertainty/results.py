"""What a Monte Carlo run returns: percentiles, exceedance shares and rank (Spearman)
sensitivity of each output to each input (`MonteCarloResult`).
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass
from types import MappingProxyType

import numpy as np

from ..checks import number
from ..errors import InputError

__all__ = [
    "PERCENTILES",
    "rank_correlations",
    "MonteCarloResult",
]

#: Percentiles reported for every output. [%]
PERCENTILES = (1, 5, 50, 90, 95, 99)


# --------------------------------------------------------------------------
# statistics


def _average_ranks(values: np.ndarray) -> np.ndarray:
    """Ranks 1..n along each row, tied values sharing their average rank."""
    order = np.argsort(values, axis=1)
    ranks = np.empty(values.shape)
    for row, index, out in zip(values, order, ranks):  # a loop over variables, not samples
        ordered = row[index]
        starts = np.flatnonzero(np.concatenate(([True], ordered[1:] != ordered[:-1])))
        ends = np.append(starts[1:], ordered.size)
        out[index] = np.repeat(0.5 * (starts + ends + 1), ends - starts)
    return ranks


def rank_correlations(inputs: Mapping[str, np.ndarray],
                      outputs: Mapping[str, np.ndarray]) -> dict[str, dict[str, float]]:
    """Spearman rank correlation of every output with every input that varies.

    The Pearson correlation of the ranks (ties get their average rank), the
    definition `scipy.stats.spearmanr` uses; computed for all pairs at once.
    Inputs that do not vary are left out; an output that does not vary gets NaN.

    Parameters
    ----------
    inputs, outputs : mapping of str to numpy.ndarray
        Samples, all of the same length n.

    Returns
    -------
    dict
        output -> {input: rho}, inputs ordered by |rho|, largest first (NaN
        last). Empty inner mappings when n < 3 or nothing varies.
    """
    names_in = [k for k, v in inputs.items() if np.ptp(v) > 0.0]
    n = next(iter(outputs.values())).size if outputs else 0
    if not names_in or n < 3:
        return {name: {} for name in outputs}

    def standardised_ranks(arrays):
        ranks = _average_ranks(np.vstack(arrays))
        ranks -= ranks.mean(axis=1, keepdims=True)
        norm = np.sqrt(np.sum(ranks**2, axis=1, keepdims=True))
        with np.errstate(invalid="ignore", divide="ignore"):
            return ranks / norm

    z_in = standardised_ranks([inputs[k] for k in names_in])
    z_out = standardised_ranks(list(outputs.values()))
    rho = np.clip(z_out @ z_in.T, -1.0, 1.0)
    out = {}
    for name, row in zip(outputs, rho):
        pairs = sorted(zip(names_in, row.tolist()),
                       key=lambda p: -abs(p[1]) if math.isfinite(p[1]) else math.inf)
        out[name] = dict(pairs)
    return out


def _percentiles(samples: np.ndarray) -> dict[int, float]:
    values = np.percentile(samples, PERCENTILES)
    return {p: float(v) for p, v in zip(PERCENTILES, values)}


def _frozen(array) -> np.ndarray:
    a = np.array(array, dtype=float)
    a.setflags(write=False)
    return a


# --------------------------------------------------------------------------
# result


@dataclass(frozen=True, eq=False)
class MonteCarloResult:
    """Samples and summary statistics of a Monte Carlo screening run.

    Attributes
    ----------
    model : str
        Which chain ran ("headspace" or "indoor spill").
    n : int
        Number of samples.
    seed : int
        Seed of `numpy.random.default_rng` that reproduces the run.
    inputs : mapping
        Input name -> its distribution in words, with its unit.
    input_samples : mapping
        Input name -> samples (read-only arrays). [SI unit of the input]
    outputs : mapping
        Output name -> samples (read-only arrays), for histograms and
        cumulative curves. [unit in `units`]
    units : mapping
        Output name -> unit text.
    percentiles : mapping
        Output name -> {50: .., 90: .., 95: .., 99: ..}. [unit in `units`]
    exceedance : mapping
        Limit or alarm label -> probability of exceeding it. [-]
    sensitivity : mapping
        Output name -> {input name: Spearman rank correlation}, largest |rho|
        first. [-]
    warnings : tuple of str
        Cautions about validity, approximations and the inputs.
    """

    model: str
    n: int
    seed: int
    inputs: Mapping[str, str]
    input_samples: Mapping[str, np.ndarray]
    outputs: Mapping[str, np.ndarray]
    units: Mapping[str, str]
    percentiles: Mapping[str, Mapping[int, float]]
    exceedance: Mapping[str, float]
    sensitivity: Mapping[str, Mapping[str, float]]
    warnings: tuple[str, ...] = ()

    def __repr__(self) -> str:
        return (f"MonteCarloResult(model={self.model!r}, n={self.n}, seed={self.seed}, "
                f"inputs={list(self.inputs)}, outputs={list(self.outputs)})")

    def exceedance_probability(self, output: str, threshold: float) -> float:
        """Fraction of samples of `output` above `threshold` (in the output's unit). [-]"""
        if output not in self.outputs:
            raise InputError("output", f"{output!r} is not an output of this run; it has "
                             f"{', '.join(self.outputs)}")
        return float(np.mean(self.outputs[output] > number(threshold, "threshold")))

    def table(self):
        """Tidy table of the summary: one statistic per row.

        Returns
        -------
        pandas.DataFrame
            Columns ``section`` ("percentile", "exceedance" or "sensitivity"),
            ``output`` (output name, or limit label for exceedance),
            ``statistic`` ("p50".."p99", "probability", or the input name for a
            rank correlation), ``value`` and ``unit``.
        """
        import pandas as pd

        rows = []
        for name, stats in self.percentiles.items():
            for p, value in stats.items():
                rows.append(("percentile", name, f"p{p}", value, self.units.get(name, "")))
        for label, probability in self.exceedance.items():
            rows.append(("exceedance", label, "probability", probability, "-"))
        for name, pairs in self.sensitivity.items():
            for input_name, rho in pairs.items():
                rows.append(("sensitivity", name, input_name, rho, "-"))
        return pd.DataFrame(rows, columns=["section", "output", "statistic", "value", "unit"])


def monte_carlo_result(model, n, seed, inputs, input_samples, outputs, units, exceedance, notes):
    frozen_outputs = {k: _frozen(v) for k, v in outputs.items()}
    frozen_inputs = {k: _frozen(v) for k, v in input_samples.items()}
    sensitivity = rank_correlations(frozen_inputs, frozen_outputs)
    if n < 3:
        notes.append("fewer than 3 samples: no sensitivity is reported")
    return MonteCarloResult(
        model=model,
        n=n,
        seed=seed,
        inputs=MappingProxyType(dict(inputs)),
        input_samples=MappingProxyType(frozen_inputs),
        outputs=MappingProxyType(frozen_outputs),
        units=MappingProxyType(dict(units)),
        percentiles=MappingProxyType({k: MappingProxyType(_percentiles(v))
                                      for k, v in frozen_outputs.items()}),
        exceedance=MappingProxyType(dict(exceedance)),
        sensitivity=MappingProxyType({k: MappingProxyType(v) for k, v in sensitivity.items()}),
        warnings=tuple(dict.fromkeys(notes)),
    )
