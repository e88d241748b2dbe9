"""Liquid mixtures: composition conversions and Raoult's law.

A `Liquid` is a set of components with mole fractions and optional activity
coefficients; it is what the headspace and evaporation models take.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass

import numpy as np

from .errors import InputError
from .substances import Substance, as_substance

__all__ = [
    "Liquid",
    "liquid",
    "mole_fractions",
    "raoult_partial_pressures",
    "COMPOSITION_BASES",
    "SUM_TOLERANCE",
    "SUM_NORMALISE_LIMIT",
]

#: Composition bases a mixture may be given on.
COMPOSITION_BASES = ("mole", "mass", "volume")

#: A composition summing to within this of 1 is taken as it is. [-]
SUM_TOLERANCE = 1e-6

#: A composition summing to within this of 1 is normalised with a warning; farther
#: off it is an error (a typo rather than rounding). [-]
SUM_NORMALISE_LIMIT = 0.05


@dataclass(frozen=True)
class Liquid:
    """A liquid of one or more components.

    Attributes
    ----------
    components : tuple of Substance
    mole_fractions : numpy.ndarray
        Liquid-phase mole fractions, summing to 1. [-]
    activity_coefficients : numpy.ndarray
        Raoult's-law activity coefficients, 1 for an ideal solution. [-]
    activity_source : str
        Where the activity coefficients come from ("ideal solution" by default).
    warnings : tuple of str
        Notes from building the composition (normalisation and the like).
    activity_model : str
        "given" (entered, or ideal) or "unifac" (estimated at each temperature;
        `activity_coefficients` then holds the estimate at 25 degC, which models
        that take constant coefficients use).
    """

    components: tuple[Substance, ...]
    mole_fractions: np.ndarray
    activity_coefficients: np.ndarray
    activity_source: str = "ideal solution (Raoult's law, all activity coefficients 1)"
    warnings: tuple[str, ...] = ()
    activity_model: str = "given"

    def activity_coefficients_at(self, temperature) -> np.ndarray:
        """Activity coefficients at a temperature, shape (n, *temperature.shape). [-]

        Given (or ideal) coefficients are the same at every temperature; UNIFAC
        estimates are computed at each one.
        """
        t = np.asarray(temperature, dtype=float)
        if self.activity_model == "unifac":
            from .activity import unifac_activity_coefficients

            return unifac_activity_coefficients(self.components, self.mole_fractions, t)
        return np.broadcast_to(self.activity_coefficients.reshape((-1,) + (1,) * t.ndim),
                               (len(self.components),) + t.shape)

    @property
    def names(self) -> tuple[str, ...]:
        return tuple(c.name for c in self.components)

    @property
    def molar_masses(self) -> np.ndarray:
        """[kg/mol]"""
        return np.array([c.molar_mass for c in self.components])

    @property
    def mass_fractions(self) -> np.ndarray:
        """[-]"""
        w = self.mole_fractions * self.molar_masses
        return w / w.sum()

    @property
    def is_pure(self) -> bool:
        return len(self.components) == 1


def mole_fractions(amounts, molar_masses, basis: str = "mole", densities=None,
                   field: str = "composition") -> tuple[np.ndarray, tuple[str, ...]]:
    """Convert a composition on a mole, mass or volume basis to mole fractions.

    Parameters
    ----------
    amounts : array_like
        Fractions on `basis` (summing to 1). [-]
    molar_masses : array_like
        [kg/mol]
    basis : str
        "mole", "mass" or "volume" (volume fractions of the pure liquids before
        mixing, converted with the pure-liquid densities; ideal mixing).
    densities : array_like, optional
        Pure-liquid densities, needed for the volume basis. [kg/m3]
    field : str
        Name of the input, for messages.

    Returns
    -------
    (numpy.ndarray, tuple of str)
        Mole fractions and any warnings (normalisation).

    Examples
    --------
    50/50 by mass toluene (92.14 g/mol) and n-hexane (86.18 g/mol):

    >>> x, _ = mole_fractions([0.5, 0.5], [0.09214, 0.08618], "mass")
    >>> [round(float(v), 4) for v in x]
    [0.4833, 0.5167]
    """
    if basis not in COMPOSITION_BASES:
        raise InputError(f"{field} basis", f"{basis!r} is not a basis; use one of "
                         f"{', '.join(COMPOSITION_BASES)}")
    a = np.asarray(amounts, dtype=float)
    m = np.asarray(molar_masses, dtype=float)
    if a.ndim != 1 or a.size == 0:
        raise InputError(field, "give at least one component")
    if not np.all(np.isfinite(a)):
        raise InputError(field, "every fraction must be a finite number")
    if np.any(a < 0):
        raise InputError(field, "fractions cannot be negative")
    if np.any(a > 1.0 + SUM_TOLERANCE):
        raise InputError(field, "a fraction is above 100 %; give fractions of the whole")
    total = float(a.sum())
    notes: list[str] = []
    if abs(total - 1.0) > SUM_NORMALISE_LIMIT:
        raise InputError(
            field, f"the {basis} fractions add up to {100 * total:.4g} %, "
            f"{100 * abs(total - 1.0):.3g} points {'over' if total > 1 else 'short of'} "
            "100 %; correct the composition")
    if abs(total - 1.0) > SUM_TOLERANCE:
        notes.append(f"the {basis} fractions added up to {100 * total:.4g} %; they were "
                     "scaled to 100 %")
    a = a / total
    if basis == "mole":
        x = a
    else:
        if basis == "volume":
            if densities is None or any(d is None for d in densities):
                raise InputError(field, "a volume-basis composition needs the liquid "
                                 "density of every component")
            a = a * np.asarray(densities, dtype=float)
        moles = a / m
        x = moles / moles.sum()
    return x, tuple(notes)


def _gammas(activity_coefficients, components, field) -> np.ndarray:
    n = len(components)
    if activity_coefficients is None:
        return np.ones(n)
    if isinstance(activity_coefficients, Mapping):
        keyed = {as_substance(k, f"{field} activity coefficients").key: v
                 for k, v in activity_coefficients.items()}
        unknown = set(keyed) - {c.key for c in components}
        if unknown:
            raise InputError(f"{field} activity coefficients",
                             f"{', '.join(sorted(unknown))} is not in the liquid")
        gammas = np.array([keyed.get(c.key, 1.0) for c in components], dtype=float)
    else:
        gammas = np.asarray(activity_coefficients, dtype=float)
        if gammas.shape != (n,):
            raise InputError(f"{field} activity coefficients",
                             f"give one coefficient per component ({n})")
    if not np.all(np.isfinite(gammas)) or np.any(gammas <= 0):
        raise InputError(f"{field} activity coefficients",
                         "every activity coefficient must be a positive number")
    return gammas


def liquid(spec, basis: str = "mole", activity_coefficients=None,
           activity_source: str | None = None, field: str = "liquid") -> Liquid:
    """Build a `Liquid` from a substance, a key, or a mapping of those to fractions.

    Parameters
    ----------
    spec : Liquid, Substance, str or mapping
        A pure liquid, or {substance or key: fraction on `basis`}.
    basis : str
        "mole", "mass" or "volume".
    activity_coefficients : mapping, array_like or "unifac", optional
        Per-component activity coefficients for Raoult's law (user-entered or
        estimated elsewhere), 1 where not given; or "unifac" to estimate them by
        UNIFAC at each temperature (optional `thermo` package; labelled an estimate).
    activity_source : str, optional
        Where the activity coefficients come from, shown in reports.
    field : str
        Name of the input, for messages.

    Returns
    -------
    Liquid

    Examples
    --------
    >>> mix = liquid({"toluene": 0.6, "o-xylene": 0.4}, basis="mass")
    >>> mix.names
    ('Toluene', 'o-Xylene')
    """
    if isinstance(spec, Liquid):
        return spec
    if isinstance(spec, (Substance, str)):
        components = (as_substance(spec, field),)
        amounts = [1.0]
        basis = "mole"
    elif isinstance(spec, Mapping):
        if not spec:
            raise InputError(field, "the mixture has no components")
        components = tuple(as_substance(k, f"{field} component") for k in spec)
        keys = [c.key for c in components]
        if len(set(keys)) != len(keys):
            raise InputError(field, "a component is listed twice (perhaps under two names)")
        amounts = []
        for c, v in zip(components, spec.values()):
            try:
                amounts.append(float(v))
            except (TypeError, ValueError):
                raise InputError(f"{field} {c.name}", f"expected a fraction, got {v!r}") from None
    else:
        raise InputError(field, "give a substance name, or a mapping of names to fractions")
    x, notes = mole_fractions(
        amounts, [c.molar_mass for c in components], basis,
        [c.liquid_density for c in components], field)
    if isinstance(activity_coefficients, str):
        if activity_coefficients.strip().lower() != "unifac":
            raise InputError(f"{field} activity coefficients",
                             f"{activity_coefficients!r} is not an estimation method; use "
                             "'unifac', or give the coefficients")
        from .activity import UNIFAC_SOURCE, unifac_activity_coefficients

        gammas = unifac_activity_coefficients(components, x, 298.15)
        notes = notes + ("activity coefficients estimated by UNIFAC: an estimate; measured "
                         "values are better where they exist",)
        return Liquid(components, x, gammas, UNIFAC_SOURCE, notes, "unifac")
    gammas = _gammas(activity_coefficients, components, field)
    if activity_source is None:
        activity_source = ("ideal solution (Raoult's law, all activity coefficients 1)"
                           if activity_coefficients is None else "user-entered")
    return Liquid(components, x, gammas, activity_source, notes)


def raoult_partial_pressures(mole_fractions, saturation_pressures,
                             activity_coefficients=None):
    """Partial pressures over a liquid by Raoult's law: p_i = x_i γ_i p_sat,i.

    Parameters
    ----------
    mole_fractions : array_like
        Liquid mole fractions, shape (n,). [-]
    saturation_pressures : array_like
        Pure-component vapour pressures, shape (n, ...) for any temperature shape. [Pa]
    activity_coefficients : array_like, optional
        Shape (n,), 1 if omitted. [-]

    Returns
    -------
    numpy.ndarray
        Partial pressures, shape of `saturation_pressures`. [Pa]

    References
    ----------
    Raoult, F.-M. (1887); modified form e.g. Poling, Prausnitz & O'Connell, The
    Properties of Gases and Liquids, 5th ed., Eq. 8-4.1.
    """
    x = np.asarray(mole_fractions, dtype=float)
    p = np.asarray(saturation_pressures, dtype=float)
    g = np.ones_like(x) if activity_coefficients is None else np.asarray(activity_coefficients, float)
    shape = (-1,) + (1,) * (p.ndim - 1)
    return (x * g).reshape(shape) * p

