"""Liquids written in inventory cells ("toluene 60%, o-xylene 40%"), resolved once per
distinct text and grouped by component set, with each set's temperature bounds.
"""

from __future__ import annotations

import math
import re
from collections import defaultdict
from dataclasses import dataclass

import numpy as np

from ..errors import InputError
from ..mixtures import Liquid, liquid as make_liquid
from .cells import same_text
from .columns import BASIS_WORDS

__all__ = [
    "parse_liquid",
]


# --------------------------------------------------------------------------- liquids

_NUMBER_TEXT = r"(?:\d+(?:[.,]\d+)?|[.,]\d+)"
_NAME_FIRST = re.compile(
    rf"\s*(?P<name>[^;+%]+?)\s+(?P<amount>{_NUMBER_TEXT})\s*%\s*(?:[,;+]|$)")
_AMOUNT_FIRST = re.compile(
    rf"\s*(?P<amount>{_NUMBER_TEXT})\s*%\s*(?P<name>[^;+%]+?)\s*"
    rf"(?:[,;+](?=\s*{_NUMBER_TEXT}\s*%)|$)")


def _mixture_parts(text: str) -> list[tuple[str, float]] | None:
    """(name, fraction) pairs of a mixture text, or None if it cannot be read."""
    stripped = text.strip()
    for pattern in (_NAME_FIRST, _AMOUNT_FIRST):
        parts: list[tuple[str, float]] = []
        position = 0
        while position < len(stripped):
            match = pattern.match(stripped, position)
            if match is None or match.end() == position:
                parts = []
                break
            parts.append((match["name"].strip(),
                          float(match["amount"].replace(",", ".")) / 100.0))
            position = match.end()
            while position < len(stripped) and stripped[position].isspace():
                position += 1
        if parts:
            return parts
    return None


def parse_liquid(text: str, basis: str = "mass", field: str = "liquid") -> Liquid:
    """A `Liquid` from inventory text: one substance, or names with percentages.

    Parameters
    ----------
    text : str
        A substance name, synonym or CAS number ("toluene", "108-88-3"), or a
        mixture such as "toluene 60%, o-xylene 40%" (or "60% toluene; 40% o-xylene").
    basis : str
        Basis of a mixture's percentages: "mole", "mass" or "volume". Mass by
        default, as safety data sheets give compositions by mass.
    field : str
        Name of the input, for messages.

    Returns
    -------
    Liquid

    Raises
    ------
    InputError
        Unknown substance, unreadable mixture text, or a composition that does not
        add up to 100 % (within 5 points; closer totals are scaled with a warning).

    Examples
    --------
    >>> mix = parse_liquid("toluene 60%, o-xylene 40%")
    >>> mix.names, [round(float(x), 3) for x in mix.mole_fractions]
    (('Toluene', 'o-Xylene'), [0.633, 0.367])
    """
    if not isinstance(text, str) or not text.strip():
        raise InputError(field, "no liquid given: enter a substance name, synonym or CAS "
                         "number, or a mixture such as 'toluene 60%, o-xylene 40%'")
    if "%" not in text:
        return make_liquid(text.strip(), field=field)
    parts = _mixture_parts(text)
    if parts is None:
        raise InputError(field, f"{text.strip()!r} cannot be read as a mixture: write each "
                         "component as a name followed by its percentage, separated by "
                         "commas, for example 'toluene 60%, o-xylene 40%'")
    names = [name.lower() for name, _ in parts]
    if len(set(names)) != len(names):
        raise InputError(field, "a component is listed twice; give each component once")
    return make_liquid(dict(parts), basis, field=field)


@dataclass(frozen=True)
class LiquidBounds:
    melting: float
    melting_name: str
    critical: float
    critical_name: str


def liquid_bounds(liq: Liquid) -> LiquidBounds:
    melting, melting_name = -math.inf, ""
    critical, critical_name = math.inf, ""
    from ..headspace import lowest_liquid_temperature

    for c in liq.components:
        if c.melting_point is not None and c.melting_point > melting:
            melting, melting_name = c.melting_point, c.name
    if len(liq.components) > 1 and melting_name:
        # components of a mixture may be subcooled (estimator.vapor.SUBCOOLED_LIMIT)
        melting = lowest_liquid_temperature(liq.components)
    for c in liq.components:
        if c.critical_temperature is not None and c.critical_temperature < critical:
            critical, critical_name = c.critical_temperature, c.name
    return LiquidBounds(melting, melting_name, critical, critical_name)


def temperature_problems(bounds: LiquidBounds, temperatures: np.ndarray) -> np.ndarray:
    """Integer codes of `PROBLEMS` for each temperature (0 where usable)."""
    t = temperatures
    codes = np.zeros(t.shape, dtype=np.int8)
    with np.errstate(invalid="ignore"):
        codes[t < bounds.melting] = 4
        codes[t > bounds.critical] = 3
        codes[t <= 0.0] = 2
    codes[~np.isfinite(t)] = 1
    return codes


@dataclass(frozen=True)
class _ComponentSet:
    """Liquids of the same components in the same order; compositions per row vary.

    `liquid` is one of them, for what depends on the components only (names,
    bounds, methods, flammability limits); `fractions` holds the mole fractions of
    every distinct composition, one row each.
    """

    liquid: Liquid
    fractions: np.ndarray  # (compositions, components)


_NO_LIQUID = ("no liquid given: enter a substance name, synonym or CAS number, or a "
              "mixture such as 'toluene 60%, o-xylene 40%'")


def _mixture_fractions(amounts: np.ndarray, components, basis: str):
    """Mole fractions of many compositions of one component set, as `mole_fractions`.

    Returns the fractions (k, n), the problem of each composition ("" if none) and
    its note ("" if none), with the messages of `estimator.mixtures.mole_fractions`.
    """
    from ..mixtures import SUM_NORMALISE_LIMIT, SUM_TOLERANCE

    k = amounts.shape[0]
    problem = same_text(k, "")
    note = same_text(k, "")
    total = amounts.sum(axis=1)
    over = (amounts > 1.0 + SUM_TOLERANCE).any(axis=1)
    problem[over] = "a fraction is above 100 %; give fractions of the whole"
    off = ~over & (np.abs(total - 1.0) > SUM_NORMALISE_LIMIT)
    if off.any():
        problem[off] = [f"the {basis} fractions add up to {100 * t:.4g} %, "
                        f"{100 * abs(t - 1.0):.3g} points {'over' if t > 1 else 'short of'} "
                        "100 %; correct the composition" for t in total[off]]
    scaled = ~over & ~off & (np.abs(total - 1.0) > SUM_TOLERANCE)
    if scaled.any():
        note[scaled] = [f"the {basis} fractions added up to {100 * t:.4g} %; they were "
                        "scaled to 100 %" for t in total[scaled]]
    a = amounts / total[:, None]
    if basis == "mole":
        return a, problem, note
    if basis == "volume":
        densities = [c.liquid_density for c in components]
        if any(d is None for d in densities):
            problem[problem == ""] = ("a volume-basis composition needs the liquid density "
                                      "of every component")
            return a, problem, note
        a = a * np.array(densities, dtype=float)
    moles = a / np.array([c.molar_mass for c in components])
    return moles / moles.sum(axis=1, keepdims=True), problem, note


def resolve_liquids(texts, basis_words):
    """Resolve distinct (liquid text, basis word) pairs into component sets.

    Mixture texts are split once each; their components are looked up once per
    name, and the compositions of each component set are converted to mole
    fractions in one array operation (`_mixture_fractions`).

    Returns
    -------
    sets : list of _ComponentSet
    pair_set, pair_composition : numpy.ndarray
        The set of each pair (-1 where unusable) and its composition in the set.
    pair_problem : list
        None, or (message, where) with where "liquid", "basis" or None (a formula,
        reported elsewhere).
    pair_note : numpy.ndarray
        A note on the composition ("" if none), such as its scaling to 100 %.
    """
    pairs = len(texts)
    pair_problem: list[tuple[str, object] | None] = [None] * pairs
    pair_note = same_text(pairs, "")
    pair_set = np.full(pairs, -1, dtype=np.intp)
    pair_composition = np.zeros(pairs, dtype=np.intp)
    component = _component_lookup()
    pending: dict[tuple, list] = defaultdict(list)  # (keys, basis) -> [(pair, amounts, found)]
    for k, (text, basis_word) in enumerate(zip(texts, basis_words)):
        problem, read = _read_pair(text, basis_word, component)
        if problem is not None:
            pair_problem[k] = problem
            continue
        keys, basis, amounts, found = read
        pending[(keys, basis)].append((k, amounts, found))
    sets: list[_ComponentSet] = []
    set_index: dict[tuple, int] = {}
    for (keys, basis), members in pending.items():
        components = members[0][2]
        members_pairs = np.array([m[0] for m in members])
        x, problems, notes = _mixture_fractions(np.vstack([m[1] for m in members]),
                                                components, basis)
        if keys not in set_index:
            set_index[keys] = len(sets)
            liquid = make_liquid(components[0]) if len(components) == 1 else Liquid(
                components, x[0], np.ones(len(components)))
            sets.append(_ComponentSet(liquid, np.empty((0, len(components)))))
        s_id = set_index[keys]
        offset = sets[s_id].fractions.shape[0]
        good = problems == ""
        sets[s_id] = _ComponentSet(sets[s_id].liquid,
                                   np.vstack([sets[s_id].fractions, x[good]]))
        pair_set[members_pairs[good]] = s_id
        pair_composition[members_pairs[good]] = offset + np.arange(int(good.sum()))
        pair_note[members_pairs[good]] = _with_lookup_notes(notes[good], components)
        for m, problem in zip(members_pairs[~good], problems[~good]):
            pair_problem[m] = (problem, "liquid")
    return sets, pair_set, pair_composition, pair_problem, pair_note


def _component_lookup():
    """A function from a component name to its substance (or the InputError of the
    look-up), each name looked up once."""
    names: dict[str, object] = {}

    def component(name: str):
        if name not in names:
            try:
                names[name] = make_liquid(name, field="liquid component").components[0]
            except InputError as exc:
                names[name] = exc
        return names[name]

    return component


def _read_pair(text, basis_word, component):
    """Read one (liquid text, basis word) pair.

    Returns (problem, None), the problem as `resolve_liquids` reports it, or (None,
    (component keys, basis, amounts, components)).
    """
    if text.startswith("=") or basis_word.startswith("="):
        return ("", None), None  # reported as a formula
    basis = BASIS_WORDS.get(basis_word) if basis_word else "mass"
    if not text:
        return (_NO_LIQUID, "liquid"), None
    if basis is None:
        return (f"{basis_word!r} is not a basis; use mole, mass or volume "
                "(blank means mass)", "basis"), None
    if "%" not in text:
        found = component(text)
        if isinstance(found, InputError):
            return (found.reason, "liquid"), None
        return None, ((found.key,), "mole", np.ones(1), (found,))
    parts = _mixture_parts(text)
    if parts is None:
        return (f"{text!r} cannot be read as a mixture: write each component "
                "as a name followed by its percentage, separated by commas, "
                "for example 'toluene 60%, o-xylene 40%'", "liquid"), None
    lowered = [name.lower() for name, _ in parts]
    if len(set(lowered)) != len(lowered):
        return ("a component is listed twice; give each component once", "liquid"), None
    found = [component(name) for name, _ in parts]
    failed = next((f for f in found if isinstance(f, InputError)), None)
    if failed is not None:
        return (failed.reason, "liquid"), None
    keys = tuple(c.key for c in found)
    if len(set(keys)) != len(keys):
        return ("a component is listed twice (perhaps under two names)", "liquid"), None
    return None, (keys, basis, np.array([a for _, a in parts]), tuple(found))


def _with_lookup_notes(notes, components):
    """The composition notes with the notes of library-looked-up components added."""
    looked_up = "; ".join(n for c in components if c.origin == "lookup" for n in c.notes)
    if not looked_up:
        return notes
    return [f"{n}; {looked_up}" if n else looked_up for n in notes]
