"""Steps every Monte Carlo chain shares: the sample count and seed, drawing an input,
physical bounds on samples, the limits compared and the vapour-pressure method
factors.
"""

from __future__ import annotations

from collections.abc import Callable, Iterable, Mapping
import dataclasses

import numpy as np

from ..checks import PRESSURE_RANGE, PRESSURE_RANGE_TEXT, number
from ..errors import InputError, OutOfRangeError
from ..limits import ExposureLimit
from .distributions import (
    as_distribution,
    random_generator,
    sample_count,
    unit_text,
    vapor_pressure_factor,
)
from .results import MonteCarloResult, monte_carlo_result

__all__ = [
]


# --------------------------------------------------------------------------
# shared pieces of the chains


def draw_input(value, field, unit, n, rng, inputs, input_samples) -> np.ndarray:
    dist = as_distribution(value, field)
    samples = dist.sample(n, rng)
    inputs[field] = dist.describe(unit)
    input_samples[field] = samples
    return samples


def check_bounds(samples, field, unit, *, minimum=None, above=None, maximum=None, below=None,
             why=""):
    """Check sampled values against physical bounds, naming the input."""
    hint = ("; bound the distribution (Normal with low/high, or Uniform/Triangular) "
            "within the physical range" if samples.size > 1 else "")
    u = unit_text(unit)
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


def check_pressures(samples, field):
    """Sampled absolute pressures inside `estimator.checks.PRESSURE_RANGE`."""
    low, high = PRESSURE_RANGE
    check_bounds(samples, field, "Pa", minimum=low, maximum=high,
             why=f" ({PRESSURE_RANGE_TEXT})")
    return samples


@dataclasses.dataclass
class ChainSamples:
    """What one run of a chain draws and gathers: the sample count, the seed and its
    generator, each input's description and samples (in the order drawn) and the notes.

    Every chain draws through one of these, in a fixed order, so a seed reproduces
    every sample.
    """

    count: int
    seed: int
    rng: np.random.Generator
    notes: list[str]
    inputs: dict[str, str] = dataclasses.field(default_factory=dict)
    input_samples: dict[str, np.ndarray] = dataclasses.field(default_factory=dict)

    def draw(self, value, field, unit, **bounds) -> np.ndarray:
        """Samples of one input (a number or a distribution), recorded under `field` and
        checked against the `bounds` of `check_bounds` when given."""
        samples = draw_input(value, field, unit, self.count, self.rng, self.inputs,
                             self.input_samples)
        if bounds:
            check_bounds(samples, field, unit, **bounds)
        return samples

    def temperature(self, value) -> np.ndarray:
        """Samples of the temperature input, checked to be above 0 K. [K]"""
        return self.draw(value, "temperature", "K", above=0.0,
                         why=" (temperatures are in kelvin)")

    def saturation_pressures(self, components, temperature, include, input_names, *,
                             subcooled=False) -> np.ndarray:
        """Vapour pressures of the components over the sampled temperatures, shape
        (components, count), each times its method-uncertainty factor when `include`
        (the factor drawn under its name in `input_names`). [Pa]"""
        estimates = [saturation_estimate(c, temperature, subcooled=subcooled)
                     for c in components]
        p_sat = np.stack([np.asarray(e.pressure, dtype=float) for e in estimates])
        for i, (c, e, name) in enumerate(zip(components, estimates, input_names)):
            self.notes.extend(e.warnings)
            factors = method_factors(e, c.name, self.count, self.rng, include, self.inputs,
                                     self.input_samples, self.notes, name)
            if include:
                p_sat[i] *= factors
        return p_sat

    def result(self, model, outputs, units, exceedance) -> MonteCarloResult:
        """The chain's `MonteCarloResult` from its outputs and what was drawn."""
        return monte_carlo_result(model, self.count, self.seed, self.inputs,
                                  self.input_samples, outputs, units, exceedance, self.notes)


def start_chain(n, seed, lfl_alarm, limits, include_method_uncertainty, notes):
    """The checked options every chain takes and its samples' start.

    Returns (`ChainSamples`, the LFL alarm level [% LFL], the limits as a tuple).
    """
    count = sample_count(n)
    seed, rng = random_generator(seed)
    alarm = number(lfl_alarm, "lfl_alarm")
    if not 0.0 < alarm <= 100.0:
        raise InputError("lfl_alarm", f"{alarm:g} must be above 0 and at most 100 % of the LFL")
    limit_list = limit_tuple(limits)
    if not isinstance(include_method_uncertainty, bool):
        raise InputError("include_method_uncertainty", "must be True or False")
    return ChainSamples(count, seed, rng, list(notes)), alarm, limit_list


def add_limit_ratios(limits, concentration_ratio: Callable, left_out: str, outputs, units,
                     exceedance, notes) -> None:
    """Add each limit's ``ratio to <label>`` output and its exceedance (ratio above 1).

    `concentration_ratio(limit)` gives the samples' ratios to the limit, or None for a
    limit of another substance, which is left out with a note (`left_out` follows "limit
    <label> is for <substance>").
    """
    for lim, label in zip(limits, unique_labels(limits)):
        ratio = concentration_ratio(lim)
        if ratio is None:
            notes.append(f"limit {label} is for {lim.substance}{left_out}; it was left out")
            continue
        outputs[f"ratio to {label}"] = ratio
        units[f"ratio to {label}"] = "-"
        exceedance[label] = float(np.mean(ratio > 1.0))


def limit_tuple(limits) -> tuple[ExposureLimit, ...]:
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


def saturation_estimate(sub, temperature, subcooled=False):
    """Vapour-pressure estimate over the sampled temperatures, with a hint on failure
    (`subcooled` for a component of a mixture, see `estimator.vapor`)."""
    from ..vapor import vapor_pressure_estimate

    try:
        return vapor_pressure_estimate(sub, temperature, field="temperature",
                                       subcooled=subcooled)
    except OutOfRangeError as error:
        hint = ("; bound the temperature distribution to the liquid range"
                if np.size(temperature) > 1 else "")
        raise OutOfRangeError(error.field, error.reason + hint) from None


def method_factors(estimate, name, n, rng, include, inputs, input_samples, notes,
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
