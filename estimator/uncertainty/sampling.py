"""Steps every Monte Carlo chain shares: the sample count and seed, drawing an input,
physical bounds on samples, the limits compared and the vapour-pressure method
factors.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping

import numpy as np

from ..checks import PRESSURE_RANGE, PRESSURE_RANGE_TEXT
from ..errors import InputError, OutOfRangeError
from ..limits import ExposureLimit
from .distributions import as_distribution, unit_text, vapor_pressure_factor

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
