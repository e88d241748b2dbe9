r"""Probabilistic screening: uncertain inputs as distributions, propagated by Monte Carlo.

Exposure assessors describe inputs they do not know exactly as distributions
(a liquid temperature somewhere between 30 and 45 degC, an air speed summarised
by a geometric mean and geometric standard deviation, as exposure data are).
This module draws samples of those inputs and pushes all of them through the
deterministic models at once, as numpy arrays: there is no Python loop over
samples. Every run is seeded (`numpy.random.default_rng(seed)`) and the seed is
recorded in the result, so any run can be repeated exactly.

Distributions
-------------
Frozen dataclasses with ``sample(n, rng)`` returning an array of n values in SI
units: `Fixed`, `Uniform`, `Triangular`, `Normal` (optionally truncated at
physical bounds, sampled by the inverse of its cumulative distribution) and
`LogNormal` (geometric mean and geometric standard deviation above 1). Every
chain input may be a distribution or a plain float (taken as `Fixed`).

Scenario-file specs
-------------------
`distribution_from_spec` reads a one-key mapping whose values are text with
units (parsed by `estimator.units.parse_quantity`) or bare numbers for
dimensionless inputs. The keys, with their positional order for the list form:

- ``fixed``: ``value``; ``{"fixed": "35 °C"}``, or just ``"35 °C"``;
- ``uniform``: ``low``, ``high``; ``{"uniform": ["30 °C", "45 °C"]}``;
- ``triangular``: ``low``, ``mode``, ``high``;
  ``{"triangular": ["20 °C", "30 °C", "40 °C"]}``;
- ``normal``: ``mean``, ``sd``, ``low``, ``high``;
  ``{"normal": {"mean": "35 °C", "sd": "3 K"}}``;
- ``lognormal``: ``gm``, ``gsd``; ``{"lognormal": {"gm": "0.1 m/s", "gsd": 2.0}}``.

Parameters are given either as a list in that order or as a mapping with those
keys; ``low`` and ``high`` of ``normal`` are optional truncation bounds. A bare
value (``"35 degC"``) is a fixed value. The standard deviation of a temperature
is a temperature *difference* ("3 K" or "3 °C" both mean 3 kelvin); ``gsd``
is a plain number above 1.

Vapour-pressure method uncertainty
----------------------------------
ullage states, for each vapour-pressure method, the 95th percentile ``u95`` of
its relative error in its own validation against reference equations of state
(`estimator.vapor.method_uncertainty`). With ``include_method_uncertainty``
each sample multiplies the saturated vapour pressure by a factor F drawn from a
lognormal distribution of median 1 and

.. math:: \sigma_{\ln F} = \ln(1 + u_{95}) / 1.96,

so that 95 % of the factors lie between 1/(1 + u95) and 1 + u95 (`vapor_pressure_factor`).
This is an approximation: the stated figure summarises the method's error over
many compounds and temperatures and is applied here to one compound as if it
were that compound's own uncertainty; the error is taken as unbiased and
symmetric in its logarithm (which covers |F - 1| <= u95 with at least 95 %
probability); and one factor per sample applies at all temperatures (the error
of a correlation for one compound is systematic), independently for each
component of a mixture.

Composition uncertainty (headspace chain)
-----------------------------------------
``composition`` may be a `DirichletComposition`, a Dirichlet distribution
centred on the liquid's mole fractions whose concentration sets the spread (the
variance of each fraction is x (1 - x) / (concentration + 1)), or a mapping of
component -> distribution of its fraction on ``composition_basis`` ("mole" or
"mass"). In the mapping form each component is sampled on its own (those not
listed keep their nominal fraction) and every sample is scaled to sum to one,
so the listed distributions describe relative amounts; the renormalised
fractions are what the sensitivity reports.

Indoor spill chain
------------------
Pure liquids only: a mixture's pool changes composition as it evaporates, which
the constant-source room below does not follow. Per sample: the vapour
pressure at the sampled temperature, the Mackay & Matsugu evaporation rate G,
the well-mixed room with that constant source until the pool is dry at
t = m/G and an exponential decay after, capped at the saturated vapour
concentration, all in closed form. The highest 15-min average is exact for
that piecewise curve (not the window ending at the peak, which can be lower
when the decay after the pool is dry is slow): see `indoor_spill_monte_carlo`.

Sampling order
--------------
One generator, ``numpy.random.default_rng(seed)``, draws the inputs in the
order of the function's arguments, then the composition in component order,
then the vapour-pressure factors in component order; `Fixed` inputs draw
nothing.

Results
-------
`MonteCarloResult` holds the raw samples of every key output (for histograms
and cumulative curves), their 50th/90th/95th/99th percentiles (linear
interpolation between order statistics, numpy's default), the probability of
exceeding each limit and alarm, and a rank-correlation (Spearman) sensitivity
of each output to each input that varies. A rank correlation measures how
monotonically an output follows an input; it is not a share of the variance.

References
----------
US EPA (1997), Guiding Principles for Monte Carlo Analysis, EPA/630/R-97/001
(from memory). Spearman, C. (1904), "The proof and measurement of association
between two things", Am. J. Psychol. 15, 72-101 (from memory).

The package holds one idea per module: `distributions`, `results` (percentiles
and rank sensitivity), `sampling` (steps the chains share), `headspace_chain` and
`spill_chain`. Every public name is importable from `estimator.uncertainty`.
"""

from __future__ import annotations

from .distributions import (
    DISTRIBUTION_KEYS,
    DirichletComposition,
    Fixed,
    LogNormal,
    NORMAL_975,
    Normal,
    Triangular,
    Uniform,
    as_distribution,
    distribution_from_spec,
    random_generator,
    sample_count,
    unit_text,
    vapor_pressure_factor,
)
from .results import (
    MonteCarloResult,
    PERCENTILES,
    monte_carlo_result,
    rank_correlations,
)
from .sampling import (
    ChainSamples,
    add_limit_ratios,
    check_bounds,
    check_pressures,
    draw_input,
    limit_tuple,
    method_factors,
    saturation_estimate,
    start_chain,
    unique_labels,
)
from .headspace_chain import (
    headspace_monte_carlo,
)
from .spill_chain import (
    indoor_spill_monte_carlo,
)

__all__ = [
    "Fixed",
    "Uniform",
    "Triangular",
    "Normal",
    "LogNormal",
    "DirichletComposition",
    "DISTRIBUTION_KEYS",
    "PERCENTILES",
    "as_distribution",
    "distribution_from_spec",
    "vapor_pressure_factor",
    "rank_correlations",
    "MonteCarloResult",
    "headspace_monte_carlo",
    "indoor_spill_monte_carlo",
]
