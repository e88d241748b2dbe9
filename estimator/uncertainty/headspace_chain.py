"""The Monte Carlo chain through the equilibrium headspace of a tank
(`headspace_monte_carlo`), vectorised over the samples.
"""

from __future__ import annotations

from collections.abc import Mapping

import numpy as np

from ..checks import number
from ..constants import OXYGEN_IN_AIR, STANDARD_ATMOSPHERE
from ..errors import InputError, OutOfRangeError
from .distributions import DirichletComposition, as_distribution
from .results import MonteCarloResult
from .sampling import add_limit_ratios, check_bounds, check_pressures, start_chain

__all__ = [
    "headspace_monte_carlo",
]


# --------------------------------------------------------------------------
# headspace chain


def _composition_samples(liq, composition, basis, n, rng, inputs, input_samples):
    """Mole fractions, shape (components, n)."""
    from ..substances import as_substance

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
        check_bounds(weights[i], field, "", minimum=0.0,
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

    >>> from estimator.uncertainty import Uniform
    >>> r = headspace_monte_carlo("toluene", Uniform(293.15, 303.15), n=2000, seed=1)
    >>> round(r.percentiles["total_ppm"][50], -3), round(r.exceedance["10 % LFL alarm"], 2)
    (37000.0, 1.0)
    """
    from ..mixtures import liquid as make_liquid

    liq = make_liquid(liquid)
    samples, alarm, limit_list = start_chain(n, seed, lfl_alarm, limits,
                                             include_method_uncertainty, liq.warnings)
    oxygen_level = number(oxygen_alarm, "oxygen_alarm")
    if not 0.0 < oxygen_level < 100.0 * OXYGEN_IN_AIR:
        raise InputError("oxygen_alarm", f"{oxygen_level:g} must be above 0 and below the "
                         f"{100 * OXYGEN_IN_AIR:g} % of fresh air")
    t = samples.temperature(temperature)
    p_total = check_pressures(samples.draw(pressure, "pressure", "Pa"), "pressure")
    x = _composition_samples(liq, composition, composition_basis, samples.count, samples.rng,
                             samples.inputs, samples.input_samples)
    p_sat = _saturation_pressures(liq, t, samples, include_method_uncertainty)

    # Raoult's law and the assembly of estimator.headspace, per sample
    p_i = x * liq.activity_coefficients[:, None] * p_sat
    p_sum = p_i.sum(axis=0)
    boiling = p_sum >= p_total
    y = p_i / np.maximum(p_sum, p_total)
    if np.any(boiling):
        samples.notes.append(f"in {100 * np.mean(boiling):.3g} % of samples the liquid boils "
                             "(its vapour pressure reaches the pressure of the space, which "
                             "then holds essentially pure vapour)")
    outputs, units, exceedance = _headspace_outputs(liq, y, alarm, oxygen_level,
                                                    samples.notes)
    keys = [c.key for c in liq.components]

    def ratio(lim):
        if lim.substance not in keys:
            return None
        return y[keys.index(lim.substance)] / lim.volume_fraction_at(t, p_total)

    add_limit_ratios(limit_list, ratio, ", which is not in the liquid", outputs, units,
                     exceedance, samples.notes)
    samples.notes.append("equilibrium headspace: the worst case for a closed space left long "
                         "enough; measure the real atmosphere before entry")
    return samples.result("headspace", outputs, units, exceedance)


def _saturation_pressures(liq, t, samples, include_method_uncertainty):
    """Vapour pressure of each component per sample, shape (components, n). [Pa]"""
    if not liq.is_pure:
        from ..vapor import component_vapor_pressure_estimates

        try:  # refuses a wholly frozen mixture with its reason
            component_vapor_pressure_estimates(liq.components, np.min(t), "temperature")
        except OutOfRangeError as error:
            raise OutOfRangeError(error.field, error.reason + "; bound the temperature "
                                  "distribution to the liquid range") from None
    names = (["vapor_pressure_factor"] if liq.is_pure
             else [f"vapor_pressure_factor[{c.name}]" for c in liq.components])
    p_sat = samples.saturation_pressures(liq.components, t, include_method_uncertainty, names,
                                         subcooled=not liq.is_pure)
    if not include_method_uncertainty:
        samples.notes.append("the uncertainty of the vapour-pressure methods is not included")
    return p_sat


def _headspace_outputs(liq, y, alarm, oxygen_level, notes):
    """Total ppm, %LFL (Le Chatelier) and oxygen of the headspace mole fractions `y`, with
    their units and alarm exceedances."""
    from ..headspace import le_chatelier

    y_total = y.sum(axis=0)
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
    return outputs, units, exceedance
