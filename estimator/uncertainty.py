"""Probabilistic screening: uncertain inputs as distributions, propagated by Monte Carlo.

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

- ``fixed``: ``value``; ``{"fixed": "35 degC"}``, or just ``"35 degC"``;
- ``uniform``: ``low``, ``high``; ``{"uniform": ["30 degC", "45 degC"]}``;
- ``triangular``: ``low``, ``mode``, ``high``;
  ``{"triangular": ["20 degC", "30 degC", "40 degC"]}``;
- ``normal``: ``mean``, ``sd``, ``low``, ``high``;
  ``{"normal": {"mean": "35 degC", "sd": "3 K"}}``;
- ``lognormal``: ``gm``, ``gsd``; ``{"lognormal": {"gm": "0.1 m/s", "gsd": 2.0}}``.

Parameters are given either as a list in that order or as a mapping with those
keys; ``low`` and ``high`` of ``normal`` are optional truncation bounds. A bare
value (``"35 degC"``) is a fixed value. The standard deviation of a temperature
is a temperature *difference* ("3 K" or "3 degC" both mean 3 kelvin); ``gsd``
is a plain number above 1.

Vapour-pressure method uncertainty
----------------------------------
ullage states, for each vapour-pressure method, the 95th percentile ``u95`` of
its relative error in its own validation against reference equations of state
(`estimator.vapor.method_uncertainty`). With ``include_method_uncertainty``
each sample multiplies the saturated vapour pressure by a factor F drawn from a
lognormal distribution of median 1 and

.. math:: \\sigma_{\\ln F} = \\ln(1 + u_{95}) / 1.96,

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
"""

from __future__ import annotations

import math
import warnings
from collections.abc import Iterable, Mapping
from dataclasses import dataclass
from types import MappingProxyType

import numpy as np

from .checks import PRESSURE_RANGE, PRESSURE_RANGE_TEXT, number
from .constants import (
    EIGHT_HOUR_SHIFT,
    GAS_CONSTANT,
    OXYGEN_IN_AIR,
    SHORT_TERM_PERIOD,
    STANDARD_ATMOSPHERE,
)
from .errors import InputError, OutOfRangeError, UllageWarning
from .evaporation import HIGH_VOLATILITY_RATIO, LOW_AIR_SPEED, low_air_speed_note
from .indoor import phi1, phi2
from .limits import ExposureLimit

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

#: Percentiles reported for every output. [%]
PERCENTILES = (50, 90, 95, 99)

#: The 97.5th percentile of the standard normal distribution, rounded as usual:
#: a two-sided 95 % interval spans +-1.96 standard deviations (common practice).
NORMAL_975 = 1.96



# --------------------------------------------------------------------------
# input checks


def _sample_count(n) -> int:
    if isinstance(n, bool) or not isinstance(n, (int, np.integer)) or n < 1:
        raise InputError("n", f"{n!r}: the number of samples must be a whole number of 1 "
                         "or more (10 000 is usual for screening)")
    return int(n)


def _generator(seed) -> tuple[int, np.random.Generator]:
    if seed is None:
        seed = int(np.random.SeedSequence().entropy % 2**63)
    elif isinstance(seed, bool) or not isinstance(seed, (int, np.integer)) or seed < 0:
        raise InputError("seed", f"{seed!r}: give a whole number of 0 or more, or None "
                         "for a fresh seed (which the result records)")
    seed = int(seed)
    return seed, np.random.default_rng(seed)


def _unit_text(unit: str) -> str:
    return f" {unit}" if unit else ""


# --------------------------------------------------------------------------
# distributions


@dataclass(frozen=True)
class Fixed:
    """A value known exactly (or taken as known).

    Attributes
    ----------
    value : float
        [SI unit of the input]
    """

    value: float

    def __post_init__(self):
        object.__setattr__(self, "value", number(self.value, "value"))

    def sample(self, n, rng=None) -> np.ndarray:
        """n copies of the value; draws nothing from `rng`."""
        return np.full(_sample_count(n), self.value)

    def describe(self, unit: str = "") -> str:
        """The distribution in words."""
        return f"fixed at {self.value:.6g}{_unit_text(unit)}"


@dataclass(frozen=True)
class Uniform:
    """Every value between two bounds equally likely.

    Attributes
    ----------
    low, high : float
        Bounds, low < high. [SI unit of the input]

    Examples
    --------
    >>> x = Uniform(1.0, 3.0).sample(10_000, np.random.default_rng(0))
    >>> bool(x.min() >= 1.0 and x.max() <= 3.0), round(float(x.mean()), 1)
    (True, 2.0)
    """

    low: float
    high: float

    def __post_init__(self):
        low, high = number(self.low, "low"), number(self.high, "high")
        if not low < high:
            raise InputError("high", f"{high:g} must be above low ({low:g}); for a value "
                             "known exactly use Fixed")
        object.__setattr__(self, "low", low)
        object.__setattr__(self, "high", high)

    def sample(self, n, rng: np.random.Generator) -> np.ndarray:
        """n independent draws."""
        return rng.uniform(self.low, self.high, _sample_count(n))

    def describe(self, unit: str = "") -> str:
        """The distribution in words."""
        return f"uniform from {self.low:.6g} to {self.high:.6g}{_unit_text(unit)}"


@dataclass(frozen=True)
class Triangular:
    """A triangular distribution: a most likely value with hard bounds.

    Attributes
    ----------
    low, mode, high : float
        low <= mode <= high, low < high. [SI unit of the input]
    """

    low: float
    mode: float
    high: float

    def __post_init__(self):
        low, mode, high = (number(self.low, "low"), number(self.mode, "mode"),
                           number(self.high, "high"))
        if not low < high:
            raise InputError("high", f"{high:g} must be above low ({low:g}); for a value "
                             "known exactly use Fixed")
        if not low <= mode <= high:
            raise InputError("mode", f"{mode:g} must lie between low ({low:g}) and high "
                             f"({high:g})")
        object.__setattr__(self, "low", low)
        object.__setattr__(self, "mode", mode)
        object.__setattr__(self, "high", high)

    def sample(self, n, rng: np.random.Generator) -> np.ndarray:
        """n independent draws."""
        return rng.triangular(self.low, self.mode, self.high, _sample_count(n))

    def describe(self, unit: str = "") -> str:
        """The distribution in words."""
        return (f"triangular from {self.low:.6g} to {self.high:.6g}, most likely "
                f"{self.mode:.6g}{_unit_text(unit)}")


@dataclass(frozen=True)
class Normal:
    """A normal distribution, optionally truncated at physical bounds.

    `mean` and `sd` are those of the normal distribution before truncation; the
    bounds cut it (values outside are never drawn, and the probability inside
    is rescaled). Sampling is by the inverse cumulative distribution, vectorised.

    Attributes
    ----------
    mean : float
        Mean before truncation; it must lie within the bounds. [SI unit]
    sd : float
        Standard deviation before truncation, above 0. [SI unit]
    low, high : float or None
        Truncation bounds; None for none. [SI unit]

    Examples
    --------
    >>> x = Normal(300.0, 5.0, low=295.0).sample(1000, np.random.default_rng(1))
    >>> bool(x.min() >= 295.0)
    True
    """

    mean: float
    sd: float
    low: float | None = None
    high: float | None = None

    def __post_init__(self):
        mean, sd = number(self.mean, "mean"), number(self.sd, "sd")
        if sd <= 0.0:
            raise InputError("sd", f"{sd:g} must be above 0; for a value known exactly use "
                             "Fixed")
        low = None if self.low is None else number(self.low, "low")
        high = None if self.high is None else number(self.high, "high")
        if low is not None and high is not None and not low < high:
            raise InputError("high", f"{high:g} must be above low ({low:g})")
        if low is not None and mean < low:
            raise InputError("mean", f"{mean:g} lies below the lower bound {low:g}; the mean "
                             "must lie within the bounds")
        if high is not None and mean > high:
            raise InputError("mean", f"{mean:g} lies above the upper bound {high:g}; the mean "
                             "must lie within the bounds")
        for name, value in (("mean", mean), ("sd", sd), ("low", low), ("high", high)):
            object.__setattr__(self, name, value)

    @property
    def truncated(self) -> bool:
        """Whether a bound is set."""
        return self.low is not None or self.high is not None

    def sample(self, n, rng: np.random.Generator) -> np.ndarray:
        """n independent draws, inside the bounds."""
        count = _sample_count(n)
        if not self.truncated:
            return rng.normal(self.mean, self.sd, count)
        from scipy.special import ndtr, ndtri

        # The mean lies within the bounds, so the lower bound is at or below the
        # median and the upper at or above it: both probabilities are accurate.
        a = -math.inf if self.low is None else (self.low - self.mean) / self.sd
        b = math.inf if self.high is None else (self.high - self.mean) / self.sd
        p_low, p_high = float(ndtr(a)), float(ndtr(b))
        z = ndtri(p_low + rng.random(count) * (p_high - p_low))
        x = self.mean + self.sd * z
        return np.clip(x, -np.inf if self.low is None else self.low,
                       np.inf if self.high is None else self.high)

    def describe(self, unit: str = "") -> str:
        """The distribution in words."""
        text = f"normal, mean {self.mean:.6g}, sd {self.sd:.6g}{_unit_text(unit)}"
        if self.truncated:
            low = "-inf" if self.low is None else f"{self.low:.6g}"
            high = "inf" if self.high is None else f"{self.high:.6g}"
            text += f", truncated to [{low}, {high}]"
        return text


@dataclass(frozen=True)
class LogNormal:
    """A lognormal distribution by its geometric mean and geometric standard deviation.

    ln X is normal with mean ln GM and standard deviation ln GSD, the way
    occupational exposure data are summarised. The median is GM; about 68 % of
    values lie between GM/GSD and GM*GSD.

    Attributes
    ----------
    geometric_mean : float
        GM, above 0 (the median). [SI unit of the input]
    geometric_sd : float
        GSD, above 1. [-]

    Examples
    --------
    >>> x = LogNormal(0.1, 2.0).sample(20_000, np.random.default_rng(2))
    >>> round(float(np.median(x)), 2)
    0.1
    """

    geometric_mean: float
    geometric_sd: float

    def __post_init__(self):
        gm = number(self.geometric_mean, "geometric_mean")
        gsd = number(self.geometric_sd, "geometric_sd")
        if gm <= 0.0:
            raise InputError("geometric_mean", f"{gm:g} must be above 0")
        if gsd <= 1.0:
            raise InputError("geometric_sd", f"{gsd:g} must be above 1 (a GSD of 1 means no "
                             "spread: use Fixed; a GSD below 1 is not defined)")
        object.__setattr__(self, "geometric_mean", gm)
        object.__setattr__(self, "geometric_sd", gsd)

    def sample(self, n, rng: np.random.Generator) -> np.ndarray:
        """n independent draws."""
        return self.geometric_mean * np.exp(math.log(self.geometric_sd)
                                            * rng.standard_normal(_sample_count(n)))

    def describe(self, unit: str = "") -> str:
        """The distribution in words."""
        return (f"lognormal, geometric mean {self.geometric_mean:.6g}{_unit_text(unit)}, "
                f"geometric sd {self.geometric_sd:.6g}")


_DISTRIBUTIONS = (Fixed, Uniform, Triangular, Normal, LogNormal)


@dataclass(frozen=True)
class DirichletComposition:
    """Composition uncertainty: a Dirichlet distribution centred on the liquid's mole fractions.

    Each sample of mole fractions is Dirichlet with parameters
    ``concentration * x`` (x the nominal mole fractions), so its mean is x and
    the variance of each fraction is x (1 - x) / (concentration + 1). A
    concentration of 100 gives a component at x = 0.5 a standard deviation of
    about 0.05.

    Attributes
    ----------
    concentration : float
        Above 0; larger is tighter. [-]
    """

    concentration: float

    def __post_init__(self):
        value = number(self.concentration, "concentration")
        if value <= 0.0:
            raise InputError("concentration", f"{value:g} must be above 0 (larger values "
                             "give a tighter composition)")
        object.__setattr__(self, "concentration", value)

    def sample(self, mole_fractions, n, rng: np.random.Generator) -> np.ndarray:
        """Mole fractions, shape (number of components, n), each column summing to 1."""
        x = np.asarray(mole_fractions, dtype=float)
        out = np.zeros((x.size, _sample_count(n)))
        present = x > 0.0
        out[present] = rng.dirichlet(self.concentration * x[present], n).T
        return out

    def describe(self) -> str:
        """The distribution in words."""
        return (f"Dirichlet around the nominal mole fractions, concentration "
                f"{self.concentration:.6g}")


#: Spec keys of `distribution_from_spec` and their parameters, in list order.
DISTRIBUTION_KEYS = {
    "fixed": ("value",),
    "uniform": ("low", "high"),
    "triangular": ("low", "mode", "high"),
    "normal": ("mean", "sd", "low", "high"),
    "lognormal": ("gm", "gsd"),
}

_REQUIRED = {"fixed": 1, "uniform": 2, "triangular": 3, "normal": 2, "lognormal": 2}


def as_distribution(value, field: str):
    """A distribution as given, or a number as `Fixed`.

    Parameters
    ----------
    value : float or distribution
        In SI units.
    field : str
        Name of the input, for messages.

    Returns
    -------
    Fixed, Uniform, Triangular, Normal or LogNormal
    """
    if isinstance(value, _DISTRIBUTIONS):
        return value
    if isinstance(value, (str, Mapping)):
        raise InputError(field, "give a number in SI units or a distribution object; "
                         "text with units and scenario-file specs go through "
                         "distribution_from_spec first")
    try:
        return Fixed(value)
    except InputError as error:
        raise InputError(field, error.reason) from None


def distribution_from_spec(spec, kind: str, field: str):
    """Read a distribution from a scenario-file spec, with units.

    Parameters
    ----------
    spec : mapping, str or float
        A one-key mapping such as ``{"uniform": ["30 degC", "45 degC"]}`` (keys
        and parameters in the module notes and `DISTRIBUTION_KEYS`), or a bare
        value for a fixed one.
    kind : str
        Kind of quantity for `estimator.units.parse_quantity`, such as
        "temperature", "speed", "flow", "rate", "area", "volume", "mass" or
        "fraction".
    field : str
        Name of the input, used in error messages (a parameter's messages name
        it as "<field> <parameter>").

    Returns
    -------
    Fixed, Uniform, Triangular, Normal or LogNormal
        In the SI unit of `kind`.

    Raises
    ------
    InputError
        For an unknown or malformed spec, a value that is not of `kind`, and
        parameters that break the distribution's rules (low < high, mode within
        the bounds, sd > 0, GSD > 1, finite values).

    Examples
    --------
    >>> distribution_from_spec({"normal": {"mean": "35 degC", "sd": "3 K"}},
    ...                        "temperature", "liquid temperature")
    Normal(mean=308.15, sd=3.0, low=None, high=None)
    >>> distribution_from_spec({"uniform": ["30 degC", "45 degC"]}, "temperature", "T")
    Uniform(low=303.15, high=318.15)
    """
    from .units import SI_UNITS, parse_quantity

    if kind not in SI_UNITS:
        raise ValueError(f"unknown kind {kind!r}; expected one of {sorted(SI_UNITS)}")
    if isinstance(spec, _DISTRIBUTIONS):
        return spec
    if not isinstance(spec, Mapping):
        return Fixed(parse_quantity(spec, kind, field))
    if len(spec) != 1:
        raise InputError(field, f"give exactly one distribution, such as "
                         f"{{'uniform': [low, high]}}; got keys {list(spec)}")
    (name, parameters), = spec.items()
    key = str(name).strip().lower()
    if key not in DISTRIBUTION_KEYS:
        raise InputError(field, f"{name!r} is not a distribution ullage knows; use one of "
                         f"{', '.join(DISTRIBUTION_KEYS)}")
    names = DISTRIBUTION_KEYS[key]
    values = _spec_parameters(parameters, key, names, field)
    spread_kind = "temperature_difference" if kind == "temperature" else kind
    parsed = {}
    for pname, raw in values.items():
        label = f"{field} {pname}"
        if pname == "sd":
            parsed[pname] = parse_quantity(raw, spread_kind, label)
        elif pname == "gsd":
            parsed[pname] = parse_quantity(raw, "fraction", label)
        else:
            parsed[pname] = parse_quantity(raw, kind, label)
    rename = {"geometric_mean": "gm", "geometric_sd": "gsd"}
    try:
        if key == "fixed":
            return Fixed(parsed["value"])
        if key == "uniform":
            return Uniform(parsed["low"], parsed["high"])
        if key == "triangular":
            return Triangular(parsed["low"], parsed["mode"], parsed["high"])
        if key == "normal":
            return Normal(parsed["mean"], parsed["sd"], parsed.get("low"), parsed.get("high"))
        return LogNormal(parsed["gm"], parsed["gsd"])
    except InputError as error:
        raise InputError(f"{field} {rename.get(error.field, error.field)}",
                         error.reason) from None


def _spec_parameters(parameters, key: str, names: tuple[str, ...], field: str) -> dict:
    required = _REQUIRED[key]
    if isinstance(parameters, Mapping):
        unknown = [p for p in parameters if p not in names]
        if unknown:
            raise InputError(f"{field} {unknown[0]}", f"is not a parameter of a {key} "
                             f"distribution; use {', '.join(names)}")
        missing = [p for p in names[:required] if p not in parameters]
        if missing:
            raise InputError(f"{field} {missing[0]}", f"is missing; a {key} distribution "
                             f"needs {', '.join(names[:required])}")
        return {p: parameters[p] for p in names if p in parameters}
    if isinstance(parameters, (list, tuple)):
        if not required <= len(parameters) <= len(names):
            raise InputError(field, f"a {key} distribution takes "
                             f"{' or '.join(sorted({str(required), str(len(names))}))} "
                             f"values ({', '.join(names)}); got {len(parameters)}")
        return dict(zip(names, parameters))
    if key == "fixed":
        return {"value": parameters}
    raise InputError(field, f"give the {key} parameters as a list [{', '.join(names)}] or "
                     f"a mapping with those keys")


def vapor_pressure_factor(relative_uncertainty):
    """Multiplicative uncertainty of a vapour-pressure method as a lognormal factor.

    .. math:: \\sigma_{\\ln F} = \\ln(1 + u_{95}) / 1.96, \\qquad
              \\mathrm{GSD} = \\exp(\\sigma_{\\ln F})

    with median 1, so that 95 % of factors lie between 1/(1 + u95) and
    1 + u95. An approximation (see the module notes): the stated figure is a
    population statistic of the method over ullage's validation set.

    Parameters
    ----------
    relative_uncertainty : float
        The method's stated 95th-percentile relative error, u95 >= 0
        (`VaporPressureEstimate.relative_uncertainty`). [-]

    Returns
    -------
    LogNormal or Fixed
        Fixed at 1 for u95 = 0.

    Examples
    --------
    >>> round(vapor_pressure_factor(0.10).geometric_sd, 4)
    1.0498
    """
    u = number(relative_uncertainty, "relative_uncertainty")
    if u < 0.0:
        raise InputError("relative_uncertainty", f"{u:g} cannot be negative")
    if u == 0.0:
        return Fixed(1.0)
    return LogNormal(1.0, math.exp(math.log1p(u) / NORMAL_975))


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


def _result(model, n, seed, inputs, input_samples, outputs, units, exceedance, notes):
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


# --------------------------------------------------------------------------
# shared pieces of the chains


def _draw(value, field, unit, n, rng, inputs, input_samples) -> np.ndarray:
    dist = as_distribution(value, field)
    samples = dist.sample(n, rng)
    inputs[field] = dist.describe(unit)
    input_samples[field] = samples
    return samples


def _bounded(samples, field, unit, *, minimum=None, above=None, maximum=None, below=None,
             why=""):
    """Check sampled values against physical bounds, naming the input."""
    hint = ("; bound the distribution (Normal with low/high, or Uniform/Triangular) "
            "within the physical range" if samples.size > 1 else "")
    u = _unit_text(unit)
    if minimum is not None and np.any(samples < minimum):
        raise InputError(field, f"a sampled value of {float(samples.min()):g}{u} is "
                         f"below {minimum:g}{u}{why}{hint}")
    if above is not None and np.any(samples <= above):
        raise InputError(field, f"a sampled value of {float(samples.min()):g}{u} is "
                         f"not above {above:g}{u}{why}{hint}")
    if maximum is not None and np.any(samples > maximum):
        raise OutOfRangeError(field, f"a sampled value of {float(samples.max()):g}{u} is "
                              f"above {maximum:g}{u}{why}{hint}")
    if below is not None and np.any(samples >= below):
        raise OutOfRangeError(field, f"a sampled value of {float(samples.max()):g}{u} is "
                              f"not below {below:g}{u}{why}{hint}")


def _check_pressures(samples, field):
    """Sampled absolute pressures inside `estimator.checks.PRESSURE_RANGE`."""
    low, high = PRESSURE_RANGE
    _bounded(samples, field, "Pa", minimum=low, maximum=high,
             why=f" ({PRESSURE_RANGE_TEXT})")
    return samples


def _limit_tuple(limits) -> tuple[ExposureLimit, ...]:
    if isinstance(limits, ExposureLimit):
        limits = (limits,)
    if not isinstance(limits, Iterable) or isinstance(limits, (str, Mapping)):
        raise InputError("limits", "give a sequence of ExposureLimit objects "
                         "(see estimator.limits.exposure_limit)")
    out = tuple(limits)
    for lim in out:
        if not isinstance(lim, ExposureLimit):
            raise InputError("limits", f"{lim!r} is not an ExposureLimit; build limits with "
                             "estimator.limits.exposure_limit")
    return out


def unique_labels(limits) -> list[str]:
    """Each limit's label, numbered ("TWA #2") where two limits share one."""
    seen: dict[str, int] = {}
    labels = []
    for lim in limits:
        count = seen.get(lim.label, 0) + 1
        seen[lim.label] = count
        labels.append(lim.label if count == 1 else f"{lim.label} #{count}")
    return labels


def _saturation_estimate(sub, temperature, subcooled=False):
    """Vapour-pressure estimate over the sampled temperatures, with a hint on failure
    (`subcooled` for a component of a mixture, see `estimator.vapor`)."""
    from .vapor import vapor_pressure_estimate

    try:
        return vapor_pressure_estimate(sub, temperature, field="temperature",
                                       subcooled=subcooled)
    except OutOfRangeError as error:
        hint = ("; bound the temperature distribution to the liquid range"
                if np.size(temperature) > 1 else "")
        raise OutOfRangeError(error.field, error.reason + hint) from None


def _method_factors(estimate, name, n, rng, include, inputs, input_samples, notes,
                    input_name):
    """Per-sample vapour-pressure factors of one component (ones when not applied)."""
    basis = (f"{name}: vapour pressure by the {estimate.description} ({estimate.source}); "
             f"stated uncertainty ")
    if estimate.relative_uncertainty is None:
        notes.append(basis + "none (the method was not validated), so no method "
                     "uncertainty is applied to it")
        return np.ones(n)
    u = estimate.relative_uncertainty
    notes.append(basis + f"{100 * u:.3g} % ({estimate.uncertainty_basis})")
    if not include:
        return np.ones(n)
    factor = vapor_pressure_factor(u)
    values = factor.sample(n, rng)
    inputs[input_name] = (factor.describe() + f" (approximation from the stated {100 * u:.3g} "
                          f"% uncertainty of the {estimate.description})")
    input_samples[input_name] = values
    return values


# --------------------------------------------------------------------------
# headspace chain


def _composition_samples(liq, composition, basis, n, rng, inputs, input_samples):
    """Mole fractions, shape (components, n)."""
    from .substances import as_substance

    nominal = liq.mole_fractions
    k = nominal.size
    if composition is None:
        return np.broadcast_to(nominal[:, None], (k, n))
    if liq.is_pure:
        raise InputError("composition", "a pure liquid has no composition to vary")
    if basis not in ("mole", "mass"):
        raise InputError("composition_basis", f"{basis!r} is not a basis here; use 'mole' "
                         "or 'mass'")
    if isinstance(composition, DirichletComposition):
        if basis != "mole":
            raise InputError("composition_basis", "a Dirichlet composition is centred on "
                             "the liquid's mole fractions; leave the basis as 'mole'")
        x = composition.sample(nominal, n, rng)
        for c, row, nominal_x in zip(liq.components, x, nominal):
            name = f"mole_fraction[{c.name}]"
            inputs[name] = composition.describe() + f" (nominal {nominal_x:.4g})"
            input_samples[name] = row
        return x
    if not isinstance(composition, Mapping):
        raise InputError("composition", "give a DirichletComposition, or a mapping of "
                         "component to a distribution of its fraction")
    keyed = {}
    for key, value in composition.items():
        sub = as_substance(key, "composition")
        if sub.key not in {c.key for c in liq.components}:
            raise InputError("composition", f"{sub.name} is not a component of the liquid "
                             f"({', '.join(liq.names)})")
        keyed[sub.key] = value
    nominal_basis = nominal if basis == "mole" else liq.mass_fractions
    weights = np.empty((k, n))
    descriptions = []
    for i, c in enumerate(liq.components):
        field = f"composition {c.name}"
        dist = as_distribution(keyed.get(c.key, float(nominal_basis[i])), field)
        weights[i] = dist.sample(n, rng)
        descriptions.append(dist.describe(f"{basis} fraction, before renormalising"))
        _bounded(weights[i], field, "", minimum=0.0,
                 why=" (a fraction cannot be negative)")
    total = weights.sum(axis=0)
    if np.any(total <= 0.0):
        raise InputError("composition", "a sample has every fraction at zero; keep at "
                         "least one component present")
    fractions = weights / total
    for c, row, text in zip(liq.components, fractions, descriptions):
        name = f"{basis}_fraction[{c.name}]"
        inputs[name] = text
        input_samples[name] = row
    if basis == "mole":
        return fractions
    moles = fractions / liq.molar_masses[:, None]
    return moles / moles.sum(axis=0)


def headspace_monte_carlo(liquid, temperature, pressure=STANDARD_ATMOSPHERE, limits=(),
                          n=10_000, seed=None, include_method_uncertainty=True,
                          lfl_alarm=10.0, *, composition=None, composition_basis="mole",
                          oxygen_alarm=19.5) -> MonteCarloResult:
    """Equilibrium headspace with uncertain inputs, by Monte Carlo.

    The equations of `estimator.headspace.headspace` (Raoult's law, Le
    Chatelier's rule, oxygen by displacement, the boiling cap) evaluated for
    every sample at once, with the vapour pressure of each component optionally
    multiplied by its method-uncertainty factor (`vapor_pressure_factor`).

    Parameters
    ----------
    liquid : Liquid, Substance, str or mapping
        As for `estimator.headspace.headspace` (mappings on the mole basis).
    temperature : float or distribution
        Liquid and vapour-space temperature. [K]
    pressure : float or distribution
        Absolute pressure of the vapour space, 101325 Pa by default. [Pa]
    limits : sequence of ExposureLimit
        Each compared with its substance's equilibrium concentration (the vapour
        hazard ratio, whatever the limit's averaging time).
    n : int
        Number of samples.
    seed : int, optional
        Seed of `numpy.random.default_rng`; a fresh one (recorded) if omitted.
    include_method_uncertainty : bool
        Multiply each vapour pressure by its method-uncertainty factor.
    lfl_alarm : float
        Alarm level, 10 % of the LFL by default (US 29 CFR 1910.146(b)). [% LFL]
    composition : DirichletComposition or mapping, optional
        Composition uncertainty of a mixture (see the module notes).
    composition_basis : str
        Basis of a composition mapping: "mole" or "mass".
    oxygen_alarm : float
        Oxygen-deficiency level, 19.5 % by default (US 29 CFR 1910.146(b)). [%]

    Returns
    -------
    MonteCarloResult
        Outputs ``total_ppm`` [ppm], ``percent_lfl`` [% LFL] (when a component
        has an LFL), ``oxygen_percent`` [%] and ``ratio to <limit label>`` [-];
        exceedance of each limit (ratio above 1), of the LFL alarm (at or above)
        and of the oxygen alarm (below).

    Examples
    --------
    Toluene between 20 and 30 degC:

    >>> r = headspace_monte_carlo("toluene", Uniform(293.15, 303.15), n=2000, seed=1)
    >>> round(r.percentiles["total_ppm"][50], -3), round(r.exceedance["10 % LFL alarm"], 2)
    (37000.0, 1.0)
    """
    from .headspace import le_chatelier
    from .mixtures import liquid as make_liquid

    liq = make_liquid(liquid)
    count = _sample_count(n)
    seed, rng = _generator(seed)
    alarm = number(lfl_alarm, "lfl_alarm")
    if not 0.0 < alarm <= 100.0:
        raise InputError("lfl_alarm", f"{alarm:g} must be above 0 and at most 100 % of the LFL")
    oxygen_level = number(oxygen_alarm, "oxygen_alarm")
    if not 0.0 < oxygen_level < 100.0 * OXYGEN_IN_AIR:
        raise InputError("oxygen_alarm", f"{oxygen_level:g} must be above 0 and below the "
                         f"{100 * OXYGEN_IN_AIR:g} % of fresh air")
    limit_list = _limit_tuple(limits)
    if not isinstance(include_method_uncertainty, bool):
        raise InputError("include_method_uncertainty", "must be True or False")

    inputs: dict[str, str] = {}
    input_samples: dict[str, np.ndarray] = {}
    notes = list(liq.warnings)
    t = _draw(temperature, "temperature", "K", count, rng, inputs, input_samples)
    _bounded(t, "temperature", "K", above=0.0, why=" (temperatures are in kelvin)")
    p_total = _draw(pressure, "pressure", "Pa", count, rng, inputs, input_samples)
    _check_pressures(p_total, "pressure")
    x = _composition_samples(liq, composition, composition_basis, count, rng, inputs,
                             input_samples)

    if not liq.is_pure:
        from .vapor import component_vapor_pressure_estimates

        try:  # refuses a wholly frozen mixture with its reason
            component_vapor_pressure_estimates(liq.components, np.min(t), "temperature")
        except OutOfRangeError as error:
            raise OutOfRangeError(error.field, error.reason + "; bound the temperature "
                                  "distribution to the liquid range") from None
    estimates = [_saturation_estimate(c, t, subcooled=not liq.is_pure)
                 for c in liq.components]
    p_sat = np.stack([np.asarray(e.pressure, dtype=float) for e in estimates])
    for i, (c, e) in enumerate(zip(liq.components, estimates)):
        notes.extend(e.warnings)
        name = ("vapor_pressure_factor" if liq.is_pure
                else f"vapor_pressure_factor[{c.name}]")
        factors = _method_factors(e, c.name, count, rng, include_method_uncertainty, inputs,
                                  input_samples, notes, name)
        if include_method_uncertainty:
            p_sat[i] *= factors
    if not include_method_uncertainty:
        notes.append("the uncertainty of the vapour-pressure methods is not included")

    # Raoult's law and the assembly of estimator.headspace, per sample
    p_i = x * liq.activity_coefficients[:, None] * p_sat
    p_sum = p_i.sum(axis=0)
    boiling = p_sum >= p_total
    y = p_i / np.maximum(p_sum, p_total)
    y_total = y.sum(axis=0)
    if np.any(boiling):
        notes.append(f"in {100 * np.mean(boiling):.3g} % of samples the liquid boils (its "
                     "vapour pressure reaches the pressure of the space, which then holds "
                     "essentially pure vapour)")
    outputs = {"total_ppm": y_total * 1e6}
    units = {"total_ppm": "ppm"}
    exceedance = {}
    lfl = np.array([c.lower_flammability_limit if c.lower_flammability_limit else np.nan
                    for c in liq.components])
    if np.any(np.isfinite(lfl)):
        lfl_mix = le_chatelier(y, lfl)
        fuel = np.sum(np.where(np.isfinite(lfl)[:, None], y, 0.0), axis=0)
        with np.errstate(invalid="ignore"):
            percent = np.where(np.isfinite(lfl_mix), 100.0 * fuel / lfl_mix, 0.0)
        outputs["percent_lfl"] = percent
        units["percent_lfl"] = "% LFL"
        exceedance[f"{alarm:g} % LFL alarm"] = float(np.mean(percent >= alarm))
    else:
        notes.append("no component has a lower flammability limit on record: %LFL is not "
                     "computed (enter the limits from the safety data sheet)")
    oxygen = np.clip(100.0 * OXYGEN_IN_AIR * (1.0 - y_total), 0.0, None)
    outputs["oxygen_percent"] = oxygen
    units["oxygen_percent"] = "% by volume"
    exceedance[f"oxygen below {oxygen_level:g} %"] = float(np.mean(oxygen < oxygen_level))

    keys = [c.key for c in liq.components]
    for lim, label in zip(limit_list, unique_labels(limit_list)):
        if lim.substance not in keys:
            notes.append(f"limit {label} is for {lim.substance}, which is not in the liquid; "
                         "it was left out")
            continue
        ratio = y[keys.index(lim.substance)] / lim.volume_fraction_at(t, p_total)
        outputs[f"ratio to {label}"] = ratio
        units[f"ratio to {label}"] = "-"
        exceedance[label] = float(np.mean(ratio > 1.0))
    notes.append("equilibrium headspace: the worst case for a closed space left long "
                 "enough; measure the real atmosphere before entry")
    return _result("headspace", count, seed, inputs, input_samples, outputs, units,
                   exceedance, notes)


# --------------------------------------------------------------------------
# indoor spill chain


@dataclass(frozen=True)
class _RoomHistory:
    """Piecewise analytic concentration of a well-mixed room, one value per sample.

    A constant source a = G/V [kg/(m3 s)] from t = 0 until the pool is dry at
    `dry_time`, then none; effective air-change rate lam = Q/(K V) [1/s]; the
    concentration is capped at `saturation` [kg/m3] (reached at
    `saturation_time`, inf if never on the rising branch).
    """

    source: np.ndarray
    decay_rate: np.ndarray
    saturation: np.ndarray
    dry_time: np.ndarray
    saturation_time: np.ndarray
    dry_concentration: np.ndarray

    @classmethod
    def build(cls, source, decay_rate, saturation, dry_time):
        with np.errstate(divide="ignore", invalid="ignore"):
            # the cap as a fraction of the uncapped steady state G K / Q
            reach = saturation * decay_rate / source
            safe_rate = np.where(decay_rate > 0.0, decay_rate, 1.0)
            ventilated = np.where(reach < 1.0,
                                  -np.log1p(-np.where(reach < 1.0, reach, 0.0)) / safe_rate,
                                  np.inf)
        saturation_time = np.where(decay_rate > 0.0, ventilated, saturation / source)
        rising = source * dry_time * phi1(decay_rate * dry_time)
        return cls(source, decay_rate, saturation, dry_time, saturation_time,
                   np.minimum(rising, saturation))

    def concentration(self, t):
        """C(t). [kg/m3]"""
        rise = np.minimum(self.source * t * phi1(self.decay_rate * t), self.saturation)
        after = np.maximum(t - self.dry_time, 0.0)
        fall = self.dry_concentration * np.exp(-self.decay_rate * after)
        return np.where(t <= self.dry_time, rise, fall)

    def integral(self, t):
        """Integral of C from 0 to t. [kg s/m3]"""
        uncapped = np.minimum(t, np.minimum(self.saturation_time, self.dry_time))
        rise = self.source * uncapped**2 * phi2(self.decay_rate * uncapped)
        plateau = self.saturation * np.clip(np.minimum(t, self.dry_time)
                                            - self.saturation_time, 0.0, None)
        after = np.maximum(t - self.dry_time, 0.0)
        fall = self.dry_concentration * after * phi1(self.decay_rate * after)
        return rise + plateau + fall

    def highest_window_average(self, end, window):
        """Highest average over a window of length `window` inside [0, end]. [kg/m3]

        C rises (to the cap) until the pool is dry and decays after, so the best
        window either ends at `end` (pool not dry by then) or holds the dry time
        with C equal at its two ends; that condition is solved in closed form.
        """
        if end <= window:
            return self.integral(np.full_like(self.source, end)) / window
        t_dry, lam, t_sat = self.dry_time, self.decay_rate, self.saturation_time
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            # rising branch C_ss (1 - e^{-lam s}) equal to the decay C_d e^{-lam (s + w - t_dry)}
            ratio = self.dry_concentration * lam / self.source  # C_d / C_ss
            safe_lam = np.where(lam > 0.0, lam, 1.0)
            crossing = np.logaddexp(0.0, np.log(np.where(lam > 0.0, ratio, 1.0))
                                    + lam * (t_dry - window)) / safe_lam
        crossing = np.where(lam > 0.0, crossing, t_dry)
        start_dry = np.where(crossing < t_sat, crossing, np.maximum(t_dry - window, t_sat))
        start_dry = np.clip(start_dry, np.maximum(t_dry - window, 0.0),
                            np.minimum(t_dry, end - window))
        start = np.where(t_dry < end, start_dry, end - window)
        return (self.integral(start + window) - self.integral(start)) / window


def indoor_spill_monte_carlo(substance_or_key, temperature, pool_area, air_speed, room_volume,
                             ventilation_rate, mixing_factor, spilled_mass, limits=(),
                             duration=EIGHT_HOUR_SHIFT, n=10_000, seed=None,
                             include_method_uncertainty=True, *,
                             pressure=STANDARD_ATMOSPHERE,
                             source_removed_at=None, lfl_alarm=10.0) -> MonteCarloResult:
    r"""A spill of pure liquid in a well-mixed room with uncertain inputs, by Monte Carlo.

    Pure liquids only (a mixture's pool changes composition as it weathers; use
    `estimator.spill.indoor_spill` for one deterministic case). For every
    sample at once:

    1. the saturated vapour pressure at the sampled temperature (all
       temperatures through `estimator.vapor.vapor_pressure_estimate` as one
       array), times the method-uncertainty factor;
    2. the evaporation rate G by Mackay & Matsugu (1973) with the Schmidt number
       from Fuller's diffusion coefficient and Sutherland's air viscosity, the
       air and the pool both at the sampled temperature, exactly as
       `estimator.evaporation.evaporation_rate`;
    3. the well-mixed room, :math:`V\,dC/dt = G - (Q/K)\,C` from clean air, for
       a constant source until the pool is dry at :math:`t_d = m/G`, then an
       exponential decay; the concentration is capped at the saturated vapour
       concentration :math:`\min(p_\mathrm{sat}, P) M / (R T)`. All in closed
       form (`estimator.indoor.well_mixed_room` gives the same curve);
    4. the peak concentration over the period, the 8-h TWA (the exact integral
       over the period divided by 8 h, as US 29 CFR 1910.1000(d)(1)(i) divides
       by 8 h), and the highest 15-min average (exact for this piecewise curve:
       the window that ends at the period's end when the pool is still
       evaporating, otherwise the window around the dry time where the
       concentration is equal at both ends).

    Assumptions to keep in mind: the pool is at the air temperature (no
    evaporative cooling, which over-predicts for volatile liquids); the pool
    area is fixed; the evaporation rate ignores the vapour already in the room,
    so near saturation it is too high, the cap holds the air there and the pool
    is taken to be dry at m/G all the same (in reality it lasts longer); the
    room is well mixed (next to the pool it is higher; see the near-field model).

    Parameters
    ----------
    substance_or_key : Substance or str
        A pure liquid.
    temperature : float or distribution
        Pool and room air temperature, below the normal boiling point. [K]
    pool_area : float or distribution
        [m2]
    air_speed : float or distribution
        Air speed over the pool; indoors typically 0.05-0.3 m/s (Baldwin &
        Maynard 1998). [m/s]
    room_volume : float or distribution
        [m3]
    ventilation_rate : float or distribution
        General ventilation Q, 0 or more. [m3/s]
    mixing_factor : float or distribution
        K >= 1, dividing Q (the convention of `estimator.indoor`). [-]
    spilled_mass : float or distribution
        [kg]
    limits : sequence of ExposureLimit
        TWA limits are compared with the 8-h TWA, STEL with the highest 15-min
        average, ceiling and emergency values with the peak.
    duration : float
        Period from the spill over which the worker is in the room, 8 h by
        default. [s]
    n : int
        Number of samples.
    seed : int, optional
        Seed of `numpy.random.default_rng`; a fresh one (recorded) if omitted.
    include_method_uncertainty : bool
        Multiply the vapour pressure by its method-uncertainty factor.
    pressure : float
        Ambient pressure, 101325 Pa by default. [Pa]
    source_removed_at : float, optional
        Time the pool is cleaned up, after which it no longer evaporates (the
        source ends at the earlier of this and the dry time). [s]
    lfl_alarm : float
        LFL alarm level the peak is compared with, 10 % by default (US OSHA 29
        CFR 1910.146(b)). [% of LFL]

    Returns
    -------
    MonteCarloResult
        Outputs ``evaporation_rate`` [kg/s], ``pool_lifetime`` [s],
        ``peak_ppm``, ``twa_ppm``, ``short_term_ppm`` (highest 15-min average)
        [ppm], ``peak_percent_lfl`` [% of LFL] when the liquid has an LFL on
        record, and ``ratio to <limit label>`` [-]; exceedance of each limit
        (ratio above 1) and the probability that the peak reaches the LFL
        alarm (``"<alarm> % LFL alarm"``).

    References
    ----------
    Mackay & Matsugu (1973), Can. J. Chem. Eng. 51, 434; Keil, Simmons &
    Anthony (2009), Mathematical Models for Estimating Occupational Exposure to
    Chemicals, 2nd ed., AIHA Press (well-mixed room).

    Examples
    --------
    One kilogram of toluene on 1 m2 in a 200 m3 room, 20-30 degC, uncertain air
    speed and ventilation, K = 3:

    >>> r = indoor_spill_monte_carlo("toluene", Uniform(293.15, 303.15), 1.0,
    ...                              LogNormal(0.1, 1.5), 200.0, Uniform(0.2, 0.6), 3.0,
    ...                              1.0, n=2000, seed=3)
    >>> round(r.percentiles["twa_ppm"][50]), next(iter(r.sensitivity["twa_ppm"]))
    (69, 'ventilation_rate')
    """
    from .evaporation import (
        air_diffusivity,
        air_kinematic_viscosity,
        evaporation_flux,
        mackay_matsugu_coefficient,
        pool_diameter,
        schmidt_number,
    )
    from .mixtures import Liquid
    from .substances import as_substance

    if isinstance(substance_or_key, Liquid):
        if not substance_or_key.is_pure:
            raise InputError("substance_or_key", "this chain is for pure liquids; a "
                             "mixture's pool changes composition as it evaporates (use "
                             "estimator.spill.indoor_spill for it)")
        substance_or_key = substance_or_key.components[0]
    if isinstance(substance_or_key, Mapping):
        raise InputError("substance_or_key", "this chain is for pure liquids; give one "
                         "substance (use estimator.spill.indoor_spill for a mixture)")
    sub = as_substance(substance_or_key, "substance_or_key")
    count = _sample_count(n)
    seed, rng = _generator(seed)
    period = number(duration, "duration")
    if period <= 0.0:
        raise InputError("duration", f"{period:g} s must be above 0")
    alarm = number(lfl_alarm, "lfl_alarm")
    if not 0.0 < alarm <= 100.0:
        raise InputError("lfl_alarm", f"{alarm:g} must be above 0 and at most 100 % of the LFL")
    p_air = float(_check_pressures(np.asarray(number(pressure, "pressure")), "pressure"))
    limit_list = _limit_tuple(limits)
    if not isinstance(include_method_uncertainty, bool):
        raise InputError("include_method_uncertainty", "must be True or False")

    inputs: dict[str, str] = {}
    input_samples: dict[str, np.ndarray] = {}
    notes = list(sub.notes)

    def draw(value, field, unit):
        return _draw(value, field, unit, count, rng, inputs, input_samples)

    t = draw(temperature, "temperature", "K")
    _bounded(t, "temperature", "K", above=0.0, why=" (temperatures are in kelvin)")
    _bounded(t, "temperature", "K", below=sub.boiling_point,
             why=f", the normal boiling point of {sub.name}: the pool would boil, which "
                 "these evaporation models do not cover")
    area = draw(pool_area, "pool_area", "m2")
    _bounded(area, "pool_area", "m2", above=0.0)
    speed = draw(air_speed, "air_speed", "m/s")
    _bounded(speed, "air_speed", "m/s", above=0.0,
             why=" (the evaporation model needs moving air; indoors 0.05-0.3 m/s is typical)")
    volume = draw(room_volume, "room_volume", "m3")
    _bounded(volume, "room_volume", "m3", above=0.0)
    flow = draw(ventilation_rate, "ventilation_rate", "m3/s")
    _bounded(flow, "ventilation_rate", "m3/s", minimum=0.0, why=" (use 0 for a closed room)")
    mixing = draw(mixing_factor, "mixing_factor", "")
    _bounded(mixing, "mixing_factor", "", minimum=1.0,
             why=" (K >= 1 divides the ventilation rate; for a mixing efficiency m <= 1 use "
                 "K = 1/m)")
    mass = draw(spilled_mass, "spilled_mass", "kg")
    _bounded(mass, "spilled_mass", "kg", above=0.0)

    estimate = _saturation_estimate(sub, t)
    notes.extend(estimate.warnings)
    p_sat = np.asarray(estimate.pressure, dtype=float) * _method_factors(
        estimate, sub.name, count, rng, include_method_uncertainty, inputs, input_samples,
        notes, "vapor_pressure_factor")
    if not include_method_uncertainty:
        notes.append("the uncertainty of the vapour-pressure method is not included")

    # Mackay-Matsugu evaporation rate, as estimator.evaporation.evaporation_rate
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always", UllageWarning)
        diffusivity = np.asarray(air_diffusivity(sub, t, p_air))
    notes.extend(str(w.message) for w in caught)
    sc = np.asarray(schmidt_number(air_kinematic_viscosity(t, p_air), diffusivity))
    k = np.asarray(mackay_matsugu_coefficient(speed, pool_diameter(area), sc))
    rate = np.asarray(evaporation_flux(k, p_sat, sub.molar_mass, t)) * area
    with np.errstate(divide="ignore"):  # a rate that underflows to 0 never runs dry
        lifetime = mass / rate

    # well-mixed room, constant source until dry, capped at saturation
    saturation = np.minimum(p_sat, p_air) * sub.molar_mass / (GAS_CONSTANT * t)
    source_end = lifetime if source_removed_at is None else np.minimum(
        lifetime, float(source_removed_at))
    room = _RoomHistory.build(rate / volume, flow / (mixing * volume), saturation, source_end)
    peak = room.concentration(np.minimum(source_end, period))
    twa = room.integral(np.full(count, period)) / EIGHT_HOUR_SHIFT
    short_term = room.highest_window_average(period, SHORT_TERM_PERIOD)
    to_ppm = GAS_CONSTANT * t / (p_air * sub.molar_mass) * 1e6

    outputs = {
        "evaporation_rate": rate,
        "pool_lifetime": lifetime,
        "peak_ppm": peak * to_ppm,
        "twa_ppm": twa * to_ppm,
        "short_term_ppm": short_term * to_ppm,
    }
    units = {"evaporation_rate": "kg/s", "pool_lifetime": "s", "peak_ppm": "ppm",
             "twa_ppm": "ppm", "short_term_ppm": "ppm"}
    metric = {"TWA": "twa_ppm", "STEL": "short_term_ppm", "ceiling": "peak_ppm",
              "emergency": "peak_ppm"}
    exceedance = {}
    if sub.lower_flammability_limit:
        outputs["peak_percent_lfl"] = 100.0 * outputs["peak_ppm"] * 1e-6 / \
            sub.lower_flammability_limit
        units["peak_percent_lfl"] = "% LFL"
    else:
        notes.append(f"{sub.name} has no LFL on record: the peak is not compared with the "
                     "LFL alarm (it may still burn; enter the LFL from the safety data sheet)")
    for lim, label in zip(limit_list, unique_labels(limit_list)):
        if lim.substance != sub.key:
            notes.append(f"limit {label} is for {lim.substance}, not {sub.key}; it was "
                         "left out")
            continue
        ratio = outputs[metric[lim.kind]] / lim.ppm_at(t, p_air)
        outputs[f"ratio to {label}"] = ratio
        units[f"ratio to {label}"] = "-"
        exceedance[label] = float(np.mean(ratio > 1.0))
    if "peak_percent_lfl" in outputs:
        exceedance[f"{alarm:g} % LFL alarm"] = float(np.mean(
            outputs["peak_percent_lfl"] >= alarm))

    capped = room.saturation_time < np.minimum(source_end, period)
    if np.any(capped):
        notes.append(f"in {100 * np.mean(capped):.3g} % of samples the room air reaches the "
                     "saturated vapour concentration and is capped there; evaporation would "
                     "slow and the pool last longer than m/G")
    if np.any(speed < LOW_AIR_SPEED):
        notes.append(low_air_speed_note(float(np.mean(speed < LOW_AIR_SPEED))))
    volatile = p_sat / p_air > HIGH_VOLATILITY_RATIO
    if np.any(volatile):
        notes.append(f"in {100 * np.mean(volatile):.3g} % of samples the vapour pressure is "
                     f"above {100 * HIGH_VOLATILITY_RATIO:g} % of the ambient pressure; the "
                     "dilute-vapour evaporation model under-predicts this close to boiling")
    if period > EIGHT_HOUR_SHIFT:
        notes.append(f"the period of {period / 3600:.3g} h is longer than 8 h; its exposure "
                     "is divided by 8 h for the TWA")
    notes.append("pool at the air temperature (no evaporative cooling), fixed pool area, "
                 "well-mixed room: next to the pool the air is more concentrated")
    return _result("indoor spill", count, seed, inputs, input_samples, outputs, units,
                   exceedance, notes)
