"""Input distributions for the Monte Carlo chains (fixed, uniform, triangular, normal,
log-normal, Dirichlet compositions), their scenario-file form, and the factor that
carries a vapour-pressure method's stated uncertainty.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass

import numpy as np

from ..checks import number
from ..errors import InputError

__all__ = [
    "Fixed",
    "Uniform",
    "Triangular",
    "Normal",
    "LogNormal",
    "DirichletComposition",
    "DISTRIBUTION_KEYS",
    "as_distribution",
    "distribution_from_spec",
    "vapor_pressure_factor",
]

#: The 97.5th percentile of the standard normal distribution, rounded as usual:
#: a two-sided 95 % interval spans +-1.96 standard deviations (common practice).
NORMAL_975 = 1.96



# --------------------------------------------------------------------------
# input checks


def sample_count(n) -> int:
    if isinstance(n, bool) or not isinstance(n, (int, np.integer)) or n < 1:
        raise InputError("n", f"{n!r}: the number of samples must be a whole number of 1 "
                         "or more (10 000 is usual for screening)")
    return int(n)


def random_generator(seed) -> tuple[int, np.random.Generator]:
    if seed is None:
        seed = int(np.random.SeedSequence().entropy % 2**63)
    elif isinstance(seed, bool) or not isinstance(seed, (int, np.integer)) or seed < 0:
        raise InputError("seed", f"{seed!r}: give a whole number of 0 or more, or None "
                         "for a fresh seed (which the result records)")
    seed = int(seed)
    return seed, np.random.default_rng(seed)


def unit_text(unit: str) -> str:
    return f" {unit}" if unit else ""


def _shown(value: float, unit: str = "") -> str:
    """A value of a distribution in words; temperatures in °C, not kelvin."""
    if unit == "K":
        return f"{value - 273.15:.6g} °C"
    return f"{value:.6g}{unit_text(unit)}"


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
        return np.full(sample_count(n), self.value)

    def describe(self, unit: str = "") -> str:
        """The distribution in words."""
        return f"fixed at {_shown(self.value, unit)}"


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
        return rng.uniform(self.low, self.high, sample_count(n))

    def describe(self, unit: str = "") -> str:
        """The distribution in words."""
        return f"uniform from {_shown(self.low, unit)} to {_shown(self.high, unit)}"


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
        return rng.triangular(self.low, self.mode, self.high, sample_count(n))

    def describe(self, unit: str = "") -> str:
        """The distribution in words."""
        return (f"triangular from {_shown(self.low, unit)} to {_shown(self.high, unit)}, "
                f"most likely {_shown(self.mode, unit)}")


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
        count = sample_count(n)
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
        text = f"normal, mean {_shown(self.mean, unit)}, sd {self.sd:.6g}{unit_text(unit)}"
        if self.truncated:
            low = "-inf" if self.low is None else _shown(self.low, unit)
            high = "inf" if self.high is None else _shown(self.high, unit)
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
                                            * rng.standard_normal(sample_count(n)))

    def describe(self, unit: str = "") -> str:
        """The distribution in words."""
        return (f"lognormal, geometric mean {self.geometric_mean:.6g}{unit_text(unit)}, "
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
        out = np.zeros((x.size, sample_count(n)))
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
        A one-key mapping such as ``{"uniform": ["30 °C", "45 °C"]}`` (keys
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
    from ..units import SI_UNITS, parse_quantity

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
