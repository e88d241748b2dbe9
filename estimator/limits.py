"""Exposure and flammability limits the user enters, and comparisons with them.

ullage ships no exposure limits. Each limit is entered by the user with a label
saying where it comes from (a regulation, a standard, a company value); demo
scenarios carry illustrative values that say so.
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Mapping
from dataclasses import dataclass

import numpy as np

from .constants import (
    GAS_CONSTANT,
    HYGIENE_MOLAR_VOLUME,
    STANDARD_ATMOSPHERE,
)
from .errors import InputError

__all__ = [
    "LIMIT_KINDS",
    "ExposureLimit",
    "FlammabilityAlarms",
    "LimitComparison",
    "exposure_limit",
    "ppm_to_mg_per_m3",
    "mg_per_m3_to_ppm",
    "compare",
    "additive_index",
    "additive_terms",
    "AdditiveIndex",
    "LIMIT_CONVENTION",
    "vapor_hazard_ratio",
    "flammability_findings",
    "format_ppm",
    "format_ratio",
]

#: Kinds of exposure limit, with the averaging time each applies over.
LIMIT_KINDS = {
    "TWA": "8-hour time-weighted average",
    "STEL": "15-minute short-term exposure limit",
    "ceiling": "ceiling, not to be exceeded at any time",
    "emergency": "emergency or immediately-dangerous value",
}

_UNITS = ("ppm", "mg/m3")


def ppm_to_mg_per_m3(ppm, molar_mass, temperature=None, pressure=STANDARD_ATMOSPHERE):
    """Convert ppm by volume to mg/m3.

    Parameters
    ----------
    ppm : float or array_like
        [ppm by volume]
    molar_mass : float
        [kg/mol]
    temperature : float, optional
        Air temperature [K]. Omitted, the occupational-hygiene convention of
        24.45 L/mol (25 degC, 1 atm) is used.
    pressure : float
        Air pressure [Pa], used with `temperature`.

    Returns
    -------
    float or numpy.ndarray
        [mg/m3]

    Examples
    --------
    Toluene, 92.14 g/mol, 20 ppm (24.45 L/mol convention):

    >>> round(ppm_to_mg_per_m3(20, 0.09214), 1)
    75.4
    """
    molar_volume = (HYGIENE_MOLAR_VOLUME if temperature is None
                    else GAS_CONSTANT * temperature / pressure)
    out = np.asarray(ppm, dtype=float) * molar_mass / molar_volume
    return float(out) if out.ndim == 0 else out


def mg_per_m3_to_ppm(mg_per_m3, molar_mass, temperature=None, pressure=STANDARD_ATMOSPHERE):
    """Convert mg/m3 to ppm by volume (inverse of `ppm_to_mg_per_m3`).

    Examples
    --------
    >>> round(mg_per_m3_to_ppm(75.37, 0.09214), 2)
    20.0
    """
    molar_volume = (HYGIENE_MOLAR_VOLUME if temperature is None
                    else GAS_CONSTANT * temperature / pressure)
    out = np.asarray(mg_per_m3, dtype=float) * molar_volume / molar_mass
    return float(out) if out.ndim == 0 else out


@dataclass(frozen=True)
class ExposureLimit:
    """One exposure limit for one substance, as the user entered it.

    Attributes
    ----------
    substance : str
        Key of the substance it applies to.
    kind : str
        A key of `LIMIT_KINDS`.
    value : float
        As entered.
    unit : str
        "ppm" or "mg/m3", as entered.
    source : str
        Where the value comes from (jurisdiction, standard, company), required.
    volume_fraction : float
        The limit as a volume fraction; a mg/m3 value is shown in ppm with the
        24.45 L/mol convention (25 degC, 1 atm). Comparisons use
        `volume_fraction_at`, which converts a mg/m3 value at the actual
        temperature and pressure instead. [-]
    molar_mass : float or None
        Of the substance, for mg/m3 conversions. [kg/mol]
    """

    substance: str
    kind: str
    value: float
    unit: str
    source: str
    volume_fraction: float
    molar_mass: float | None = None

    @property
    def ppm(self) -> float:
        """The limit in ppm (a mg/m3 value at the 24.45 L/mol convention). [ppm]"""
        return self.volume_fraction * 1e6

    def volume_fraction_at(self, temperature=None, pressure=STANDARD_ATMOSPHERE):
        """The volume fraction at which the air reaches this limit at given conditions.

        A limit in ppm is a volume fraction at any temperature and pressure. A
        limit in mg/m3 is a mass concentration: the air reaches it at the volume
        fraction c R T / (P M) of the actual temperature and pressure, which is
        the higher-ratio (conservative) reading in heat and at altitude. Without
        a temperature the 24.45 L/mol convention is used.

        Parameters
        ----------
        temperature : float or array_like, optional
            Air temperature. [K]
        pressure : float or array_like
            Air pressure. [Pa]

        Returns
        -------
        float or numpy.ndarray
            [volume fraction]

        Examples
        --------
        100 mg/m3 of toluene (92.14 g/mol) at 35 degC and 83.4 kPa (1600 m):

        >>> lim = exposure_limit("toluene", "TWA", 100, "mg/m3", "illustrative")
        >>> round(lim.volume_fraction_at(308.15, 83400.0) * 1e6, 1)
        33.3
        """
        if self.unit == "ppm" or temperature is None or self.molar_mass is None:
            if np.ndim(temperature) == 0:
                return self.volume_fraction
            return np.full(np.shape(temperature), self.volume_fraction)
        t = np.asarray(temperature, dtype=float)
        out = self.value * 1e-6 * GAS_CONSTANT * t / (np.asarray(pressure, dtype=float)
                                                      * self.molar_mass)
        return float(out) if out.ndim == 0 else out

    def ppm_at(self, temperature=None, pressure=STANDARD_ATMOSPHERE):
        """`volume_fraction_at` in ppm. [ppm]"""
        return self.volume_fraction_at(temperature, pressure) * 1e6

    def mass_concentration_at(self, temperature, pressure=STANDARD_ATMOSPHERE):
        """The limit as a mass concentration at given conditions. [kg/m3]"""
        if self.unit == "mg/m3":
            return self.value * 1e-6
        return self.volume_fraction * pressure * self.molar_mass / (GAS_CONSTANT * temperature)

    @property
    def label(self) -> str:
        return f"{self.kind} {self.value:g} {self.unit} ({self.source})"


def exposure_limit(substance, kind: str, value, unit: str, source: str) -> ExposureLimit:
    """Build an `ExposureLimit`, checking each field.

    Parameters
    ----------
    substance : Substance or str
        The substance, or its name, synonym or CAS number.
    kind : str
        "TWA", "STEL", "ceiling" or "emergency".
    value : float
        The limit's value in `unit`.
    unit : str
        "ppm" or "mg/m3".
    source : str
        Where it comes from, e.g. "site permit 2026" or a regulation's name.

    Examples
    --------
    >>> lim = exposure_limit("toluene", "TWA", 75.4, "mg/m3", "illustrative")
    >>> round(lim.ppm, 2)
    20.01
    """
    from .substances import as_substance

    sub = as_substance(substance, "limit substance")
    if kind not in LIMIT_KINDS:
        lowered = {k.lower(): k for k in LIMIT_KINDS}
        if isinstance(kind, str) and kind.strip().lower() in lowered:
            kind = lowered[kind.strip().lower()]
        else:
            raise InputError("limit kind", f"{kind!r} is not a kind of limit; use one of "
                             f"{', '.join(LIMIT_KINDS)}")
    unit_key = str(unit).strip().replace("³", "3").replace("**", "").lower()
    if unit_key not in _UNITS:
        raise InputError(f"{sub.name} {kind} unit", f"{unit!r} is not a limit unit; give "
                         "the limit in ppm or mg/m3")
    try:
        number = float(value)
    except (TypeError, ValueError):
        raise InputError(f"{sub.name} {kind}", f"expected a number, got {value!r}") from None
    if not math.isfinite(number) or number <= 0:
        raise InputError(f"{sub.name} {kind}", f"{value!r} must be a positive number")
    if not isinstance(source, str) or not source.strip():
        raise InputError(f"{sub.name} {kind} source",
                         "say where the limit comes from (regulation, standard, company "
                         "value, or 'illustrative')")
    fraction = (number * 1e-6 if unit_key == "ppm"
                else mg_per_m3_to_ppm(number, sub.molar_mass) * 1e-6)
    if fraction >= 1.0:
        raise InputError(f"{sub.name} {kind}", "the limit is above 100 % by volume; check "
                         "the value and unit")
    return ExposureLimit(sub.key, kind, number, unit_key, source.strip(), fraction,
                         sub.molar_mass)

#: How comparisons treat the unit of a limit, for reports.
LIMIT_CONVENTION = (
    "limits in ppm are compared with the volume fraction; limits in mg/m³ with the mass "
    "concentration at the actual temperature and pressure (not first turned into ppm at "
    "24.45 L/mol, the 25 °C, 1 atm convention, which is used only to show a mg/m³ limit "
    "in ppm)")


@dataclass(frozen=True)
class FlammabilityAlarms:
    """Flammability and oxygen levels that make an atmosphere hazardous.

    Defaults are the US OSHA 29 CFR 1910.146(b) definition of a hazardous
    atmosphere in a permit-required confined space: flammable vapour above 10 %
    of its LFL, oxygen below 19.5 % or above 23.5 %. Edit them to the rules that
    apply to you.
    """

    percent_lfl: float = 10.0
    oxygen_low: float = 19.5
    oxygen_high: float = 23.5
    source: str = "US OSHA 29 CFR 1910.146(b), hazardous atmosphere (default)"

    def __post_init__(self):
        if not 0 < self.percent_lfl <= 100:
            raise InputError("LFL alarm", "must be above 0 and at most 100 % of the LFL")
        if not 0 < self.oxygen_low < self.oxygen_high <= 100:
            raise InputError("oxygen bounds", "need 0 < low < high <= 100 % oxygen")


@dataclass(frozen=True)
class LimitComparison:
    """One concentration set against one limit.

    Attributes
    ----------
    limit : ExposureLimit
    concentration : float
        [volume fraction]
    ratio : float
        concentration / limit. [-]
    """

    limit: ExposureLimit
    concentration: float
    ratio: float

    @property
    def exceeded(self) -> bool:
        return self.ratio > 1.0

    @property
    def statement(self) -> str:
        lim = self.limit
        if self.ratio == 1.0:
            return (f"{lim.substance} {format_ppm(self.concentration * 1e6)} ppm reaches "
                    f"the {lim.kind} of {format_ppm(lim.ppm)} ppm ({lim.source})")
        verb = "above" if self.exceeded else "below"
        value = (f"{format_ppm(lim.ppm)} ppm" if lim.unit == "ppm"
                 else f"{lim.value:g} mg/m³ (compared at the actual temperature and pressure)")
        return (f"{lim.substance} {format_ppm(self.concentration * 1e6)} ppm is "
                f"{format_ratio(self.ratio)} the {lim.kind} of {value} "
                f"({lim.source}): {verb} it")


#: Smallest magnitude written out in decimals; anything smaller reads "below" it.
_SMALLEST_SHOWN = 1e-9


def format_number(value: float, digits: int = 3) -> str:
    """A number as people read it: `digits` significant figures, thousands
    separators, never scientific notation.

    >>> [format_number(v) for v in (31875.0, 1416.7, 521.4, 4.2, 0.05204, 0.0)]
    ['31,900', '1,420', '521', '4.2', '0.052', '0']
    >>> format_number(2.5e6), format_number(-0.00012345, 2)
    ('2,500,000', '-0.00012')
    """
    v = float(value)
    if math.isnan(v):
        return "not a number"
    if math.isinf(v):
        return "infinite" if v > 0 else "minus infinite"
    if v == 0:
        return "0"
    if abs(v) < _SMALLEST_SHOWN:
        return f"{'-' if v < 0 else ''}below {_SMALLEST_SHOWN:.9f}"
    rounded = float(f"{v:.{digits}g}")
    exponent = math.floor(math.log10(abs(rounded)))
    decimals = max(0, digits - 1 - exponent)
    text = f"{rounded:,.{decimals}f}"
    if "." in text:
        text = text.rstrip("0").rstrip(".")
    return text


def format_ppm(value: float) -> str:
    """A ppm figure as people read it: 28,400 / 312 / 4.2 / 0.052."""
    return format_number(value)


def format_ratio(ratio: float) -> str:
    """A ratio to a limit in words: "1,420 times", "reaches" (exactly 1) or "0.35 of"."""
    r = float(ratio)
    if r == 1:
        return "reaches"
    if r >= 1:
        return f"{format_ppm(r)} times"
    return f"{format_number(r, 2)} of"


def compare(concentrations: Mapping[str, float], limits: Iterable[ExposureLimit],
            temperature=None, pressure=STANDARD_ATMOSPHERE):
    """Ratio of each substance's concentration to each of its limits.

    Parameters
    ----------
    concentrations : mapping
        Substance key -> concentration. [volume fraction]
    limits : iterable of ExposureLimit
    temperature, pressure : float, optional
        Conditions of the air, for limits entered in mg/m3 (see
        `ExposureLimit.volume_fraction_at`). [K], [Pa]

    Returns
    -------
    list of LimitComparison
        One per limit whose substance has a concentration.
    """
    out = []
    for lim in limits:
        if lim.substance in concentrations:
            c = float(concentrations[lim.substance])
            out.append(LimitComparison(lim, c, c / lim.volume_fraction_at(temperature,
                                                                           pressure)))
    return out


@dataclass(frozen=True)
class AdditiveIndex:
    """Additive mixture exposure index and the limit each substance counted with.

    Attributes
    ----------
    value : float
        E = Σ C_i / L_i. [-]
    kind : str
        Kind of limit summed.
    terms : tuple of (substance key, ExposureLimit, ratio)
        One per substance: its lowest limit of the kind, and C_i / L_i.
    """

    value: float
    kind: str
    terms: tuple

    @property
    def statement(self) -> str:
        used = "; ".join(f"{key} {_ratio_words(r)} its {lim.label}" for key, lim, r in
                         self.terms)
        return (f"additive index over {self.kind} limits {format_number(self.value)} (each substance "
                f"counted once, with its lowest {self.kind}: {used})")


def _ratio_words(ratio: float) -> str:
    return f"at {format_number(ratio)} times" if ratio >= 1 else f"at {format_number(ratio)} of"


def additive_terms(concentrations: Mapping[str, float], limits: Iterable[ExposureLimit],
                   kind: str = "TWA", temperature=None,
                   pressure=STANDARD_ATMOSPHERE) -> AdditiveIndex | None:
    """Additive mixture exposure index E = Σ C_i / L_i, with the limit each term used.

    Each substance counts once: where it has several limits of the kind (a
    regulatory and an advisory TWA, say), the lowest at the air's conditions is
    used, which gives the highest term. Common practice for substances with
    similar effects on the same organs; an index above 1 means the mixture
    exceeds the limit. US OSHA 29 CFR 1910.1000(d)(2)(i).

    Returns
    -------
    AdditiveIndex or None
        None when no substance present has a limit of that kind.
    """
    lowest: dict[str, ExposureLimit] = {}
    for lim in limits:
        if lim.kind != kind or lim.substance not in concentrations:
            continue
        held = lowest.get(lim.substance)
        if held is None or (lim.volume_fraction_at(temperature, pressure)
                            < held.volume_fraction_at(temperature, pressure)):
            lowest[lim.substance] = lim
    if not lowest:
        return None
    terms = tuple((key, lim, float(concentrations[key])
                   / lim.volume_fraction_at(temperature, pressure))
                  for key, lim in lowest.items())
    return AdditiveIndex(float(sum(r for _, _, r in terms)), kind, terms)


def additive_index(concentrations: Mapping[str, float], limits: Iterable[ExposureLimit],
                   kind: str = "TWA", temperature=None,
                   pressure=STANDARD_ATMOSPHERE) -> float | None:
    """Additive mixture exposure index E = Σ C_i / L_i for limits of one kind.

    Each substance counts once, with its lowest limit of the kind (see
    `additive_terms`, which also says which limit each term used). US OSHA 29
    CFR 1910.1000(d)(2)(i).

    Returns
    -------
    float or None
        None when no substance present has a limit of that kind.
    """
    index = additive_terms(concentrations, limits, kind, temperature, pressure)
    return None if index is None else index.value


def vapor_hazard_ratio(saturated_volume_fraction, limit: ExposureLimit, temperature=None,
                       pressure=STANDARD_ATMOSPHERE) -> float:
    """Saturated vapour concentration over an exposure limit.

    How many times the limit the air could reach at equilibrium: a measure of the
    potential for overexposure by vapour (Popendorf 1984, Am. Ind. Hyg. Assoc. J.
    45(10), 719-726). A mg/m3 limit is taken at `temperature` and `pressure`.
    """
    return float(saturated_volume_fraction) / limit.volume_fraction_at(temperature, pressure)


def flammability_findings(percent_lfl, oxygen_percent, alarms: FlammabilityAlarms,
                          lfl_known: bool = True) -> list[str]:
    """Plain-language screening statements on %LFL and oxygen against the alarms.

    With `lfl_known` False (no component has a flammability limit on record) the
    vapour is not compared with the LFL alarm at all, rather than reported below it.
    """
    out = []
    pl, ox = float(percent_lfl), float(oxygen_percent)
    if not lfl_known:
        out.append("Not compared with the LFL alarm: no flammability limit is on record for "
                   "this liquid; enter it from the safety data sheet if it can burn.")
    elif pl >= alarms.percent_lfl:
        out.append(f"Flammable vapour at {pl:.3g} % of the LFL is at or above the "
                   f"{alarms.percent_lfl:g} % LFL alarm level ({alarms.source}).")
    else:
        out.append(f"Flammable vapour at {pl:.3g} % of the LFL is below the "
                   f"{alarms.percent_lfl:g} % LFL alarm level ({alarms.source}).")
    if ox < alarms.oxygen_low:
        out.append(f"Oxygen at {ox:.3g} % is below {alarms.oxygen_low:g} %: "
                   "oxygen-deficient.")
    elif ox > alarms.oxygen_high:
        out.append(f"Oxygen at {ox:.3g} % is above {alarms.oxygen_high:g} %: "
                   "oxygen-enriched.")
    else:
        out.append(f"Oxygen at {ox:.3g} % is within {alarms.oxygen_low:g}-"
                   f"{alarms.oxygen_high:g} %.")
    return out
