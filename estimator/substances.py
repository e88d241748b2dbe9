"""Pure-substance property data: the bundled table, user-defined substances, lookups.

The table ``estimator/data/substances.csv`` holds one row per liquid with its CAS
number, properties in SI units and the source of every value group; it is built by
``tools/build_substance_table.py`` and described in ``estimator/data/SOURCES.md``.
"""

from __future__ import annotations

import csv
import functools
import math
import re
from dataclasses import dataclass, field
from pathlib import Path
from types import MappingProxyType

from .constants import STANDARD_ATMOSPHERE
from .checks import in_range
from .errors import InputError, UllageError, UnknownSubstanceError, suggest
from .correlations import (
    AntoineCorrelation,
    ClausiusClapeyronCorrelation,
    Dippr101Correlation,
    fit_clausius_clapeyron,
    trouton_enthalpy,
)

__all__ = [
    "Substance",
    "substance",
    "as_substance",
    "all_substances",
    "search_substances",
    "user_substance",
    "lookup_cas",
    "cas_check_digit",
    "TABLE_PATH",
]

TABLE_PATH = Path(__file__).with_name("data") / "substances.csv"

_CAS = re.compile(r"^\d{2,7}-\d{2}-\d$")


@dataclass(frozen=True, eq=False)
class Substance:
    """A pure liquid and the properties ullage uses, in SI units.

    Attributes
    ----------
    key : str
        Short identifier, such as "methyl-ethyl-ketone".
    name : str
        Display name.
    cas : str
        CAS registry number, or "" for a user-defined substance without one.
    molar_mass : float
        [kg/mol]
    boiling_point : float
        Normal boiling point, at 101325 Pa. [K]
    critical_temperature : float or None
        [K]
    lower_flammability_limit, upper_flammability_limit : float or None
        In air, at ambient conditions. [volume fraction]
    flash_point : float or None
        Published closed-cup flash point. [K]
    liquid_density : float or None
        [kg/m3] at `liquid_density_temperature`.
    melting_point, critical_pressure, enthalpy_of_vaporization : float or None
        [K], [Pa], [J/mol at the normal boiling point]
    diffusion_volume : float or None
        Fuller-Schettler-Giddings sum of atomic diffusion volumes. [-]
    correlations : tuple
        Vapour-pressure correlations, best first.
    sources : mapping
        Value group -> where the values come from.
    origin : str
        "table", "user" or "lookup".
    """

    key: str
    name: str
    cas: str
    molar_mass: float
    boiling_point: float
    critical_temperature: float | None = None
    lower_flammability_limit: float | None = None
    upper_flammability_limit: float | None = None
    flash_point: float | None = None
    liquid_density: float | None = None
    liquid_density_temperature: float | None = None
    melting_point: float | None = None
    critical_pressure: float | None = None
    enthalpy_of_vaporization: float | None = None
    diffusion_volume: float | None = None
    formula: str = ""
    synonyms: tuple[str, ...] = ()
    correlations: tuple = ()
    sources: MappingProxyType = field(default_factory=lambda: MappingProxyType({}))
    origin: str = "table"
    notes: tuple[str, ...] = ()

    @property
    def flammable(self) -> bool:
        """Whether a lower flammability limit is known."""
        return self.lower_flammability_limit is not None

    def __repr__(self) -> str:
        return f"Substance({self.key!r}, cas={self.cas!r})"

    def _identity(self):
        return (self.key, self.cas, self.origin, self.name, self.molar_mass,
                self.boiling_point, self.correlations)

    def __eq__(self, other) -> bool:
        return isinstance(other, Substance) and self._identity() == other._identity()

    def __hash__(self) -> int:
        return hash((self.key, self.cas, self.origin))


def _float(row: dict, key: str) -> float | None:
    text = (row.get(key) or "").strip() if isinstance(row.get(key), str) else row.get(key)
    if text is None or text == "":
        return None
    value = float(text)
    return None if math.isnan(value) else value


def _clausius_clapeyron_family(boiling_point, enthalpy, critical_temperature, tmin,
                               source_enthalpy):
    tmax = critical_temperature if critical_temperature is not None else math.inf
    out = []
    reference = f"normal boiling point with ΔHvap from {source_enthalpy}"
    if enthalpy is not None and critical_temperature is not None:
        out.append(ClausiusClapeyronCorrelation(
            boiling_point, STANDARD_ATMOSPHERE, enthalpy, tmin, tmax, reference,
            method="clausius-clapeyron-watson", critical_temperature=critical_temperature))
    if enthalpy is not None:
        out.append(ClausiusClapeyronCorrelation(
            boiling_point, STANDARD_ATMOSPHERE, enthalpy, tmin, tmax, reference))
    out.append(ClausiusClapeyronCorrelation(
        boiling_point, STANDARD_ATMOSPHERE, float(trouton_enthalpy(boiling_point)), tmin,
        tmax, "normal boiling point with ΔHvap by Trouton's rule (88 J/(mol K) × Tb)",
        method="trouton"))
    return out


def _from_row(row: dict, origin: str) -> Substance:
    f = functools.partial(_float, row)
    sources = {
        group: row[column].strip()
        for group, column in (
            ("molar_mass", "molar_mass_source"),
            ("phase_change", "phase_change_source"),
            ("critical", "critical_source"),
            ("enthalpy_of_vaporization", "enthalpy_source"),
            ("dippr101", "dippr_source"),
            ("antoine", "antoine_source"),
            ("liquid_density", "liquid_density_source"),
            ("flammability", "flammability_source"),
            ("flash_point", "flash_point_source"),
            ("diffusion_volume", "diffusion_volume_source"),
        )
        if (row.get(column) or "").strip()
    }
    correlations = []
    if f("antoine_a") is not None:
        correlations.append(AntoineCorrelation(
            f("antoine_a"), f("antoine_b"), f("antoine_c"), f("antoine_tmin"),
            f("antoine_tmax"), sources.get("antoine", "")))
    if f("dippr_c1") is not None:
        correlations.append(Dippr101Correlation(
            f("dippr_c1"), f("dippr_c2"), f("dippr_c3"), f("dippr_c4"), f("dippr_c5"),
            f("dippr_tmin"), f("dippr_tmax"), sources.get("dippr101", "")))
    melting = f("melting_point")
    correlations.extend(_clausius_clapeyron_family(
        f("boiling_point"), f("enthalpy_vaporization_nbp"), f("critical_temperature"),
        melting if melting is not None else 0.0,
        sources.get("enthalpy_of_vaporization", "")))
    synonyms = tuple(s.strip() for s in (row.get("synonyms") or "").split(";") if s.strip())
    flammability_note = (row.get("flammability_note") or "").strip()
    notes = ((f"{row['name'].strip()}: {flammability_note}",) if flammability_note else ())
    return Substance(
        key=row["key"].strip(),
        name=row["name"].strip(),
        cas=(row.get("cas") or "").strip(),
        formula=(row.get("formula") or "").strip(),
        synonyms=synonyms,
        molar_mass=f("molar_mass"),
        boiling_point=f("boiling_point"),
        melting_point=melting,
        critical_temperature=f("critical_temperature"),
        critical_pressure=f("critical_pressure"),
        enthalpy_of_vaporization=f("enthalpy_vaporization_nbp"),
        liquid_density=f("liquid_density"),
        liquid_density_temperature=f("liquid_density_temperature"),
        lower_flammability_limit=f("lfl"),
        upper_flammability_limit=f("ufl"),
        flash_point=f("flash_point"),
        diffusion_volume=f("diffusion_volume"),
        correlations=tuple(correlations),
        sources=MappingProxyType(sources),
        origin=origin,
        notes=notes,
    )


def _normalise(text: str) -> str:
    return re.sub(r"[^0-9a-z]", "", text.lower())


@functools.cache
def _table() -> tuple[dict[str, Substance], dict[str, str]]:
    with TABLE_PATH.open(newline="", encoding="utf-8") as handle:
        rows = list(csv.DictReader(handle))
    by_key = {}
    index = {}
    for row in rows:
        sub = _from_row(row, "table")
        by_key[sub.key] = sub
        for label in (sub.key, sub.name, sub.cas, *sub.synonyms):
            if label:
                index.setdefault(label.lower().strip(), sub.key)
                index.setdefault(_normalise(label), sub.key)
    return by_key, index


def all_substances() -> tuple[Substance, ...]:
    """Every substance of the bundled table, sorted by key."""
    by_key, _ = _table()
    return tuple(by_key[k] for k in sorted(by_key))


def cas_check_digit(cas: str) -> int:
    """The check digit a CAS registry number must end with.

    The last digit of a CAS number is the sum of the other digits, each times its
    position counted from the right (1 for the digit before the check digit), modulo 10.

    Parameters
    ----------
    cas : str
        A CAS number ("108-88-3"); its own check digit is ignored.

    Returns
    -------
    int

    References
    ----------
    .. [1] CAS, "CAS Registry Number: check digit verification", CAS Registry
       documentation (American Chemical Society).

    Examples
    --------
    >>> cas_check_digit("108-88-3")
    3
    >>> cas_check_digit("7732-18-5")
    5
    """
    digits = [int(c) for c in cas.replace("-", "")[:-1]]
    return sum(weight * d for weight, d in enumerate(reversed(digits), start=1)) % 10


def _cas_neighbours(cas: str) -> list[str]:
    """Valid CAS numbers one typing slip away from `cas`: another check digit, one
    digit changed, or two neighbouring digits swapped."""
    body, check = cas.replace("-", "")[:-1], cas[-1]
    shape = [len(part) for part in cas.split("-")]

    def dashed(digits: str) -> str:
        return f"{digits[:shape[0]]}-{digits[shape[0]:shape[0] + 2]}-{digits[-1]}"

    out = [dashed(body + str(cas_check_digit(cas)))]
    whole = body + check
    for i in range(len(whole)):
        for d in "0123456789":
            if d != whole[i] and not (i == 0 and d == "0"):
                out.append(dashed(whole[:i] + d + whole[i + 1:]))
        if i + 1 < len(whole) and whole[i] != whole[i + 1]:
            out.append(dashed(whole[:i] + whole[i + 1] + whole[i] + whole[i + 2:]))
    return [c for c in dict.fromkeys(out) if int(c[-1]) == cas_check_digit(c)]


def _library():
    """The look-up module over the ``chemicals`` package, or None if it is missing."""
    try:
        from . import _chemicals_lookup

        _chemicals_lookup.chemicals_package()
    except ImportError:
        return None
    return _chemicals_lookup


def _known_name(cas: str) -> str | None:
    """Display name of a CAS number in the table or the library, or None."""
    by_key, index = _table()
    if cas in index:
        return by_key[index[cas]].name
    lib = _library()
    if lib is not None and lib.cas_is_known(cas):
        return lib.identity(cas)["name"] or cas
    return None


def _bad_check_digit(text: str, field: str) -> UnknownSubstanceError:
    expected = cas_check_digit(text)
    hints, labels = [], []
    for candidate in _cas_neighbours(text):
        name = _known_name(candidate)
        if name is not None:
            hints.append(candidate)
            labels.append(f"{candidate} ({name})")
        if len(hints) == 3:
            break
    return UnknownSubstanceError(
        field, text, hints,
        reason=f"{text!r} is not a valid CAS number: its check digit (the last digit) "
               f"should be {expected} for the digits before it, so a digit is mistyped",
        hint=("did you mean " + " or ".join(labels) + "?") if labels else
             "check the number on the safety data sheet")


def _name_hints(text: str, n: int = 3) -> list[str]:
    """Up to `n` close matches of `text` among the table's keys, names and synonyms
    and the library's compound names, closest first (the table's key on a tie)."""
    by_key, _ = _table()
    labels = {label: s.key for s in by_key.values() for label in (s.key, s.name, *s.synonyms)}
    scored = []  # (-similarity, 0 table / 1 library, hint, CAS)
    for label in suggest(text, sorted(labels), n=2 * n):
        sub = by_key[labels[label]]
        scored.append((-_similarity(text, label), 0, sub.key, sub.cas))
    lib = _library()
    if lib is not None:
        pool = lib.suggestion_names()
        for name in suggest(text, pool, n=2 * n):
            scored.append((-_similarity(text, name), 1, name, pool[name]))
    hints, seen = [], set()
    for _, _, hint, cas in sorted(scored):
        if cas not in seen and hint not in hints:
            hints.append(hint)
            seen.add(cas)
    return hints[:n]


def _similarity(a: str, b: str) -> float:
    import difflib

    return difflib.SequenceMatcher(None, a.lower(), b.lower()).ratio()


def substance(key: str, field: str = "substance") -> Substance:
    """A substance by name, synonym or CAS number: the curated table first, then the
    property library (`chemicals`).

    Parameters
    ----------
    key : str
        Name ("toluene"), synonym ("MEK", "IPA", "isohexane") or CAS number
        ("108-88-3"); case, spaces, hyphens and commas do not matter in the table.
    field : str
        Name of the input, for messages.

    Returns
    -------
    Substance
        From the table (``origin == "table"``), or looked up in the library
        (``origin == "lookup"``, key = CAS number, flagged in `notes`).

    Raises
    ------
    UnknownSubstanceError
        If nothing matches, or the CAS number's check digit is wrong; the message
        suggests close matches.
    InputError
        If the library has the compound but not enough data to screen it.

    Examples
    --------
    >>> substance("MEK").name
    'Methyl ethyl ketone'
    >>> substance("108-88-3").key
    'toluene'
    >>> substance("isohexane").origin
    'lookup'
    """
    if not isinstance(key, str) or not key.strip():
        raise InputError(field, "give a substance name, synonym or CAS number")
    text = key.strip()
    by_key, index = _table()
    hit = index.get(text.lower()) or index.get(_normalise(text))
    if hit is not None:
        return by_key[hit]
    lib = _library()
    if _CAS.match(text):
        if int(text[-1]) != cas_check_digit(text):
            raise _bad_check_digit(text, field)
        if lib is not None and lib.cas_is_known(text):
            return _looked_up(text, field)
        raise UnknownSubstanceError(field, text, (), reason=(
            f"no substance with CAS number {text} is in the table or the property library"))
    cas = lib.cas_of_name(text) if lib is not None else None
    if cas is not None:
        if cas in index:
            return by_key[index[cas]]
        return _looked_up(cas, field)
    raise UnknownSubstanceError(field, key, _name_hints(text))


def as_substance(value, field: str = "substance") -> Substance:
    """A `Substance` as given, or looked up by key."""
    if isinstance(value, Substance):
        return value
    return substance(value, field)


def search_substances(text: str, limit: int = 10) -> list[Substance]:
    """Substances whose key, name, synonyms or CAS contain `text`, then close matches
    (the table's, then the property library's)."""
    by_key, _ = _table()
    needle = _normalise(text)
    found = [
        s for s in all_substances()
        if not needle or any(needle in _normalise(label)
                             for label in (s.key, s.name, s.cas, *s.synonyms))
    ]
    if len(found) < limit and needle:
        known = {s.cas for s in found}
        for hint in _name_hints(text, n=limit):
            try:
                sub = substance(hint)
            except UllageError:
                continue
            if sub.cas not in known and sub not in found:
                found.append(sub)
                known.add(sub.cas)
    return found[:limit]


def user_substance(name: str, molar_mass: float, boiling_point: float,
                   vapor_pressure_points=(), *, lower_flammability_limit=None,
                   upper_flammability_limit=None, flash_point=None, liquid_density=None,
                   critical_temperature=None, melting_point=None,
                   enthalpy_of_vaporization=None, cas: str = "",
                   source: str = "user-entered (safety data sheet)") -> Substance:
    """A substance defined from what a safety data sheet gives.

    The vapour pressure is a Clausius-Clapeyron line through the normal boiling
    point and the given points (least squares for more than one). With no point,
    Clausius-Clapeyron from the boiling point with the given ΔHvap, or with
    Trouton's rule as a last resort (flagged in `notes`).

    Parameters
    ----------
    name : str
        Display name.
    molar_mass : float
        [kg/mol]
    boiling_point : float
        Normal boiling point. [K]
    vapor_pressure_points : sequence of (float, float)
        (temperature [K], vapour pressure [Pa]) pairs, such as the SDS's vapour
        pressure at 20 degC.
    lower_flammability_limit, upper_flammability_limit : float, optional
        [volume fraction]
    flash_point : float, optional
        Closed-cup flash point. [K]
    liquid_density : float, optional
        [kg/m3]
    critical_temperature, melting_point : float, optional
        [K]
    enthalpy_of_vaporization : float, optional
        At the boiling point. [J/mol]
    cas : str
        CAS number, if known.
    source : str
        Where the values come from, shown in reports.

    Returns
    -------
    Substance

    Examples
    --------
    >>> s = user_substance("Solvent blend X", 0.100, 380.0, [(293.15, 3000.0)])
    >>> s.correlations[0].method
    'clausius-clapeyron-fit'
    """
    if not isinstance(name, str) or not name.strip():
        raise InputError("name", "give the substance a name")
    molar_mass = in_range(molar_mass, "molar_mass", "kg/mol", 0.002, 2.0,
                           " (molar mass is in kg/mol: 0.092 for 92 g/mol)")
    boiling_point = in_range(boiling_point, "boiling_point", "K", 20.0, 1500.0)
    tc = None if critical_temperature is None else in_range(
        critical_temperature, "critical_temperature", "K", boiling_point, 3000.0,
        " (it must lie above the boiling point)")
    tm = None if melting_point is None else in_range(
        melting_point, "melting_point", "K", 0.0, boiling_point,
        " (it must lie below the boiling point)")
    lfl = None if lower_flammability_limit is None else in_range(
        lower_flammability_limit, "lower_flammability_limit", "volume fraction", 0.0, 1.0,
        " (a fraction: 0.012 for 1.2 %)")
    ufl = None if upper_flammability_limit is None else in_range(
        upper_flammability_limit, "upper_flammability_limit", "volume fraction", 0.0, 1.0001,
        " (a fraction: 0.07 for 7 %)")
    if lfl is not None and ufl is not None and ufl <= lfl:
        raise InputError("upper_flammability_limit",
                         f"{ufl:g} is not above the lower limit {lfl:g}")
    tf = None if flash_point is None else in_range(flash_point, "flash_point", "K", 0.0,
                                                    boiling_point,
                                                    " (it must lie below the boiling point)")
    rho = None if liquid_density is None else in_range(liquid_density, "liquid_density",
                                                        "kg/m3", 100.0, 25000.0)
    dh = None if enthalpy_of_vaporization is None else in_range(
        enthalpy_of_vaporization, "enthalpy_of_vaporization", "J/mol", 1000.0, 2e5,
        " (J/mol: 35000 for 35 kJ/mol)")
    points = _checked_points(vapor_pressure_points, boiling_point, tc)
    notes = []
    correlations = _user_correlations(name, points, boiling_point, dh, tc,
                                      tm if tm is not None else 0.0, source, notes)
    return Substance(
        key=_normalise(name) or "user",
        name=name.strip(),
        cas=cas.strip(),
        molar_mass=molar_mass,
        boiling_point=boiling_point,
        melting_point=tm,
        critical_temperature=tc,
        enthalpy_of_vaporization=dh,
        liquid_density=rho,
        lower_flammability_limit=lfl,
        upper_flammability_limit=ufl,
        flash_point=tf,
        correlations=tuple(correlations),
        sources=MappingProxyType({"all": source}),
        origin="user",
        notes=tuple(notes),
    )


def _checked_points(vapor_pressure_points, boiling_point, tc):
    """The (temperature, pressure) points of `user_substance`, each checked, and
    rising with temperature together with the boiling point."""
    points = [tuple(p) for p in vapor_pressure_points]
    for i, point in enumerate(points):
        if len(point) != 2:
            raise InputError(f"vapor_pressure_points[{i}]",
                             "each point is (temperature in K, pressure in Pa)")
        in_range(point[0], f"vapor_pressure_points[{i}] temperature", "K", 0.0,
                  tc if tc is not None else math.inf)
        in_range(point[1], f"vapor_pressure_points[{i}] pressure", "Pa")
    ordered = sorted([(boiling_point, STANDARD_ATMOSPHERE)] + [(float(t), float(p))
                                                              for t, p in points])
    for (t1, p1), (t2, p2) in zip(ordered, ordered[1:]):
        if t2 > t1 and p2 <= p1:
            raise InputError("vapor_pressure_points", f"the vapour pressure falls from "
                             f"{p1:g} Pa at {t1:g} K to {p2:g} Pa at {t2:g} K (the boiling "
                             "point is 101325 Pa); it must rise with temperature: check the "
                             "units and which pressure goes with which temperature")
    return points


def _user_correlations(name, points, boiling_point, dh, tc, tmin, source, notes):
    """The vapour-pressure correlations of `user_substance`: a line through the boiling
    point and the points first when there are points (a note when Trouton's rule is
    all there is)."""
    if points:
        fit = fit_clausius_clapeyron([boiling_point] + [p[0] for p in points],
                                     [STANDARD_ATMOSPHERE] + [p[1] for p in points])
        correlations = [_fit_correlation(
            fit, f"line through the boiling point and {len(points)} point(s), {source}")]
        return correlations + _clausius_clapeyron_family(boiling_point, dh, tc, tmin,
                                                         source)[:-1]
    if dh is None:
        notes.append(f"{name}: no vapour pressure given; estimated from the boiling "
                     "point with Trouton's rule, which can be far off (enter the "
                     "SDS vapour pressure)")
    return _clausius_clapeyron_family(boiling_point, dh, tc, tmin, source)


def _fit_correlation(fit, source) -> ClausiusClapeyronCorrelation:
    reference_temperature = fit.temperature_range[1]
    return ClausiusClapeyronCorrelation(
        reference_temperature, float(fit(reference_temperature)),
        fit.enthalpy_of_vaporization, fit.temperature_range[0], fit.temperature_range[1],
        source, method="clausius-clapeyron-fit")


def lookup_cas(cas: str) -> Substance:
    """A substance for a CAS number from the property library (`chemicals`) alone.

    `substance()` calls this for anything the curated table lacks. The values are
    compiled data of that package with their original sources named; check them
    against the supplier's safety data sheet before relying on them.

    Raises
    ------
    InputError
        If the CAS number is malformed (or its check digit wrong) or unknown, or
        the data found are not enough to compute a vapour pressure.
    """
    if not isinstance(cas, str) or not _CAS.match(cas.strip()):
        raise InputError("cas", f"{cas!r} is not a CAS number such as '108-88-3'")
    text = cas.strip()
    if int(text[-1]) != cas_check_digit(text):
        raise _bad_check_digit(text, "cas")
    return _looked_up(text, "cas")


def _looked_up(cas: str, field: str) -> Substance:
    try:
        return _library_substance(cas)
    except InputError as exc:
        raise InputError(field, exc.reason) from None


@functools.cache
def _library_substance(cas: str) -> Substance:
    """The library's data for one CAS number as a `Substance` (cached)."""
    lib = _library()
    if lib is None:
        raise InputError("cas", "looking up a liquid outside the table needs the "
                         "'chemicals' package: pip install chemicals")
    try:
        row = lib.lookup(cas)
    except (KeyError, ValueError, LookupError) as exc:
        raise InputError("cas", f"no data found for {cas}: {exc}") from None
    name = row.get("name") or cas
    if row.get("boiling_point") in (None, "") or row.get("molar_mass") in (None, ""):
        raise InputError("cas", f"the property library has {name} ({cas}) but no "
                         "boiling point or molar mass; define the substance from its "
                         "safety data sheet instead")
    row = {k: ("" if v is None else str(v) if not isinstance(v, str) else v)
           for k, v in row.items()}
    row["key"] = cas
    row["name"] = name
    base = _from_row(row, "lookup")
    notes = [f"{base.name} ({cas}) is not in ullage's curated table: its properties come "
             "from the property library (chemicals package; original source named per "
             "value); check them against the supplier's safety data sheet"]
    if base.lower_flammability_limit is None:
        notes.append(f"{base.name}: lower flammability limit not on record: enter it from "
                     "the safety data sheet (no limit on record does not mean it cannot "
                     "burn)")
    if base.flash_point is None:
        notes.append(f"{base.name}: flash point not on record: enter it from the safety "
                     "data sheet")
    return Substance(**{**base.__dict__, "notes": tuple(notes) + base.notes})
