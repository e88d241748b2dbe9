"""Henry's law for volatile compounds dissolved in water: the vapour over dilute solutions.

Contaminated groundwater, scrubber liquor and wastewater in a sump give off the
volatiles dissolved in them. For a dilute solution the equilibrium partial
pressure of a compound is proportional to its aqueous concentration; the
proportionality is Henry's law constant. This module holds the equation, its van
't Hoff temperature dependence, conversions among the unit conventions in which
the constants are published, the bundled table ``estimator/data/henry_constants.csv``
(described in ``estimator/data/HENRY_SOURCES.md``) and a screening estimate for a
closed headspace over such water that says when the solution is too concentrated
for the law to hold.

The constant kept internally is Sander's solubility form Hcp, the aqueous
concentration over the partial pressure, in mol/(m3 Pa).
"""

from __future__ import annotations

import csv
import functools
import warnings
from dataclasses import dataclass
from pathlib import Path

import numpy as np

from .constants import GAS_CONSTANT, STANDARD_ATMOSPHERE
from .checks import finite_array, positive_array
from .errors import ExtrapolationWarning, InputError, OutOfRangeError, UllageWarning, suggest

__all__ = [
    "henry_solubility",
    "check_dissolved_concentration",
    "SOLUBILITY_REFUSAL_FACTOR",
    "henry_partial_pressure",
    "dimensionless_henry",
    "henry_to_hcp",
    "hcp_to_unit",
    "convert_henry",
    "dilution_warnings",
    "HenryConstants",
    "henry_constants",
    "all_henry_constants",
    "HeadspaceOverWater",
    "headspace_over_water",
    "HENRY_UNITS",
    "HENRY_REFERENCE_TEMPERATURE",
    "WATER_TEMPERATURE_RANGE",
    "WATER_DENSITY_298",
    "MOLAR_MASS_WATER",
    "WATER_MOLAR_CONCENTRATION_298",
    "DILUTE_MASS_FRACTION_LIMIT",
    "CONSTANT_ENTHALPY_LIMIT",
    "TABLE_PATH",
]

#: Reference temperature of tabulated Henry's law constants. [K] 25 degC, the
#: reference of Sander (2015, 2023).
HENRY_REFERENCE_TEMPERATURE = 298.15

#: Liquid water at about atmospheric pressure, from the melting to the normal
#: boiling point. [K] Temperatures outside are refused.
WATER_TEMPERATURE_RANGE = (273.15, 373.15)

#: Molar mass of water. [kg/mol] IAPWS-95 (Wagner & Pruss 2002, J. Phys. Chem. Ref.
#: Data 31, 387).
MOLAR_MASS_WATER = 18.015268e-3

#: Density of liquid water at 298.15 K and 101.325 kPa. [kg/m3] IAPWS-95.
WATER_DENSITY_298 = 997.047

#: Molar concentration of pure water at 25 degC, density over molar mass. [mol/m3]
#: About 55.34 mol/L; the round 55.5 mol/L often quoted is for 1 kg/L.
WATER_MOLAR_CONCENTRATION_298 = WATER_DENSITY_298 / MOLAR_MASS_WATER

#: Mass fraction above which a solution with no known solubility is no longer taken
#: as dilute. [-] 1 %, a screening threshold (common practice); Henry's constants
#: are infinite-dilution values.
DILUTE_MASS_FRACTION_LIMIT = 0.01

#: Above this temperature the constant-enthalpy van 't Hoff form is flagged as an
#: extrapolation. [K] 50 degC; the temperature series seen behind the bundled
#: constants span about 10-35 degC (Ashworth et al. 1988; Gossett 1987), and for
#: trichloroethylene the enthalpy of solution
#: falls with temperature, so a constant-enthalpy line fitted near 25 degC does not
#: hold toward 95 degC (Heron et al. 1998, "Henry's law constant for
#: trichloroethylene between 10 and 95 degC"; journal details from memory, check).
CONSTANT_ENTHALPY_LIMIT = 323.15

#: Pascals per bar. [Pa/bar] SI definition of the bar.
PASCALS_PER_BAR = 1.0e5

#: Cubic metres per litre. [m3/L]
CUBIC_METRES_PER_LITRE = 1.0e-3

#: Unit conventions of Henry's law constants that `convert_henry` understands.
HENRY_UNITS = {
    "hcp": "solubility: aqueous concentration over partial pressure, mol/(m3 Pa) "
           "(Sander's Hcp)",
    "m_per_atm": "solubility: mol/(L atm), i.e. M/atm, the unit of many "
                 "atmospheric-chemistry tables",
    "mol_per_kg_bar": "solubility: molality over partial pressure, mol/(kg bar) "
                      "(Sander's Hb); needs the water density",
    "kaw": "volatility: dimensionless gas/aqueous concentration ratio c_gas/c_aq "
           "(US EPA's H', the air-water partition coefficient; Sander's K_H^cc, the "
           "inverse of his dimensionless Hcc); needs the temperature",
    "hpc": "volatility: partial pressure over aqueous concentration, Pa m3/mol",
    "atm_m3_per_mol": "volatility: atm m3/mol, the unit of US EPA tables",
    "kx": "volatility: partial pressure over aqueous mole fraction, Pa (mole-fraction "
          "Henry constant); needs the molar concentration of water",
}

TABLE_PATH = Path(__file__).with_name("data") / "henry_constants.csv"


# --------------------------------------------------------------------------- helpers


def _scalar_or_array(result, *inputs):
    if all(np.ndim(x) == 0 for x in inputs):
        return float(result)
    return result


def _check_water_temperature(temperature, field: str = "temperature") -> np.ndarray:
    t = finite_array(temperature, field, "K", allow_empty=True)
    if t.size == 0:
        raise InputError(field, "no temperatures given")
    lo, hi = WATER_TEMPERATURE_RANGE
    if np.any(t < lo) or np.any(t > hi):
        bad = float(np.min(t)) if np.any(t < lo) else float(np.max(t))
        raise OutOfRangeError(
            field, f"{bad:g} K is outside liquid water at atmospheric pressure "
                   f"({lo:g}-{hi:g} K); temperatures are in kelvin here")
    return t


def _unit_key(unit, field: str) -> str:
    key = unit.strip().lower() if isinstance(unit, str) else None
    if key not in HENRY_UNITS:
        raise InputError(field, f"unknown Henry's law unit {unit!r}; use one of "
                                + ", ".join(repr(u) for u in HENRY_UNITS))
    return key


# --------------------------------------------------------------------------- equations


def henry_solubility(temperature, hcp_298, temperature_dependence):
    r"""Henry's law solubility constant at a temperature, van 't Hoff form.

    .. math:: H^{cp}(T) = H^{cp}_{298} \exp\left[B\left(\frac{1}{T} -
              \frac{1}{298.15\,\mathrm{K}}\right)\right],
              \qquad B = \frac{d\ln H^{cp}}{d(1/T)} = -\frac{\Delta_\mathrm{sol}H}{R}

    Assumes a constant enthalpy of solution; that holds to a few percent over
    0-40 degC and drifts beyond (see `CONSTANT_ENTHALPY_LIMIT`).

    Parameters
    ----------
    temperature : float or array_like
        Water temperature, within 273.15-373.15 K. [K]
    hcp_298 : float
        Henry's law solubility constant at 298.15 K, aqueous concentration over
        partial pressure. [mol/(m3 Pa)]
    temperature_dependence : float
        d ln Hcp / d(1/T), positive for compounds less soluble when warm. [K]

    Returns
    -------
    float or numpy.ndarray
        Henry's law solubility constant at `temperature`. [mol/(m3 Pa)]

    References
    ----------
    Sander, R. (2015), Compilation of Henry's law constants (version 4.0) for water
    as solvent, Atmos. Chem. Phys. 15, 4399-4981 (temperature dependence, Sect. 2),
    doi:10.5194/acp-15-4399-2015; version 5.0: Atmos. Chem. Phys. 23, 10901-12440
    (2023), doi:10.5194/acp-23-10901-2023.

    Examples
    --------
    Benzene (1.7e-3 mol/(m3 Pa), 4200 K; Staudinger & Roberts 2001) at 15 degC:

    >>> round(henry_solubility(288.15, 1.7e-3, 4200.0), 6)
    0.002772
    """
    t = _check_water_temperature(temperature)
    h = positive_array(hcp_298, "hcp_298", "mol/(m3 Pa)", allow_empty=True)
    b = finite_array(temperature_dependence, "temperature_dependence", allow_empty=True)
    out = h * np.exp(b * (1.0 / t - 1.0 / HENRY_REFERENCE_TEMPERATURE))
    return _scalar_or_array(out, temperature, hcp_298, temperature_dependence)


def dimensionless_henry(hcp, temperature):
    r"""Dimensionless gas/aqueous concentration ratio from the solubility constant.

    .. math:: K_\mathrm{aw} = \frac{c_\mathrm{gas}}{c_\mathrm{aq}} = \frac{1}{H^{cp} R T}

    This is US EPA's dimensionless H' and Sander's K_H^cc; note that Sander's
    dimensionless solubility Hcc is the inverse, c_aq / c_gas.

    Parameters
    ----------
    hcp : float or array_like
        Henry's law solubility constant at `temperature`. [mol/(m3 Pa)]
    temperature : float or array_like
        Temperature of the equilibrium. [K]

    Returns
    -------
    float or numpy.ndarray
        Gas-phase over aqueous-phase molar (or mass) concentration. [-]

    References
    ----------
    Sander (2015), Atmos. Chem. Phys. 15, 4399, Sect. 2 (definitions of Hcc and
    K_H^cc); US EPA (2001), Fact sheet: Correcting the Henry's law constant for
    soil temperature, Eq. (1).

    Examples
    --------
    >>> round(dimensionless_henry(1.7e-3, 298.15), 4)
    0.2373
    """
    h = positive_array(hcp, "hcp", "mol/(m3 Pa)", allow_empty=True)
    t = positive_array(temperature, "temperature", "K", allow_empty=True)
    return _scalar_or_array(1.0 / (h * GAS_CONSTANT * t), hcp, temperature)


def henry_to_hcp(value, unit, temperature=HENRY_REFERENCE_TEMPERATURE,
                 water_density=WATER_DENSITY_298,
                 water_molar_concentration=WATER_MOLAR_CONCENTRATION_298):
    """Convert a Henry's law constant from a published unit to Hcp.

    Parameters
    ----------
    value : float or array_like
        The constant in `unit`. [see `HENRY_UNITS`]
    unit : str
        A key of `HENRY_UNITS`: "hcp", "m_per_atm", "mol_per_kg_bar", "kaw",
        "hpc", "atm_m3_per_mol" or "kx".
    temperature : float, optional
        Temperature the value belongs to; only "kaw" needs it. [K] Default
        298.15 K.
    water_density : float, optional
        Density of the water; only "mol_per_kg_bar" needs it. [kg/m3] Default
        997.047, IAPWS-95 at 25 degC.
    water_molar_concentration : float, optional
        Moles of water per volume of (dilute) solution; only "kx" needs it.
        [mol/m3] Default 55 345, pure water at 25 degC (IAPWS-95 density over the
        molar mass of water); the solute's own moles are neglected (dilute).

    Returns
    -------
    float or numpy.ndarray
        Henry's law solubility constant. [mol/(m3 Pa)]

    Raises
    ------
    InputError
        For an unknown unit (field "unit") or a value that is not a positive
        finite number (field "value").

    References
    ----------
    Sander (2015), Atmos. Chem. Phys. 15, 4399, Section 2 and Table 1 (unit
    conversions); US EPA (2001), Fact sheet: Correcting the Henry's law constant
    for soil temperature, Eq. (1) (H' = HLC / (R T), R = 8.205e-5 atm m3/(mol K)).

    Examples
    --------
    Benzene, 0.172 M/atm (TAMOC ChemData.csv, after Sander):

    >>> round(henry_to_hcp(0.172, "m_per_atm"), 6)
    0.001698
    """
    key = _unit_key(unit, "unit")
    v = positive_array(value, "value", key, allow_empty=True)
    if key == "hcp":
        out = v
    elif key == "m_per_atm":
        out = v / CUBIC_METRES_PER_LITRE / STANDARD_ATMOSPHERE
    elif key == "mol_per_kg_bar":
        rho = float(positive_array(water_density, "water_density", "kg/m3", allow_empty=True))
        out = v * rho / PASCALS_PER_BAR
    elif key == "kaw":
        t = positive_array(temperature, "temperature", "K", allow_empty=True)
        out = 1.0 / (v * GAS_CONSTANT * t)
    elif key == "hpc":
        out = 1.0 / v
    elif key == "atm_m3_per_mol":
        out = 1.0 / (v * STANDARD_ATMOSPHERE)
    else:  # "kx"
        cw = float(positive_array(water_molar_concentration, "water_molar_concentration",
                                   "mol/m3", allow_empty=True))
        out = cw / v
    return _scalar_or_array(out, value, *((temperature,) if key == "kaw" else ()))


def hcp_to_unit(hcp, unit, temperature=HENRY_REFERENCE_TEMPERATURE,
                water_density=WATER_DENSITY_298,
                water_molar_concentration=WATER_MOLAR_CONCENTRATION_298):
    """Express a Henry's law solubility constant Hcp in another published unit.

    The inverse of `henry_to_hcp`; the arguments mean the same.

    Parameters
    ----------
    hcp : float or array_like
        Henry's law solubility constant. [mol/(m3 Pa)]
    unit : str
        A key of `HENRY_UNITS`.
    temperature : float, optional
        Needed for "kaw". [K] Default 298.15 K.
    water_density : float, optional
        Needed for "mol_per_kg_bar". [kg/m3] Default 997.047 (IAPWS-95, 25 °C).
    water_molar_concentration : float, optional
        Needed for "kx". [mol/m3] Default 55 345 (pure water, 25 °C).

    Returns
    -------
    float or numpy.ndarray
        The constant in `unit`. [see `HENRY_UNITS`]

    Examples
    --------
    Benzene at 25 degC in US EPA's volatility units:

    >>> round(hcp_to_unit(1.7e-3, "atm_m3_per_mol"), 6)
    0.005805
    """
    key = _unit_key(unit, "unit")
    h = positive_array(hcp, "hcp", "mol/(m3 Pa)", allow_empty=True)
    if key == "hcp":
        out = h
    elif key == "m_per_atm":
        out = h * STANDARD_ATMOSPHERE * CUBIC_METRES_PER_LITRE
    elif key == "mol_per_kg_bar":
        rho = float(positive_array(water_density, "water_density", "kg/m3", allow_empty=True))
        out = h * PASCALS_PER_BAR / rho
    elif key == "kaw":
        t = positive_array(temperature, "temperature", "K", allow_empty=True)
        out = 1.0 / (h * GAS_CONSTANT * t)
    elif key == "hpc":
        out = 1.0 / h
    elif key == "atm_m3_per_mol":
        out = 1.0 / (h * STANDARD_ATMOSPHERE)
    else:  # "kx"
        cw = float(positive_array(water_molar_concentration, "water_molar_concentration",
                                   "mol/m3", allow_empty=True))
        out = cw / h
    return _scalar_or_array(out, hcp, *((temperature,) if key == "kaw" else ()))


def convert_henry(value, from_unit, to_unit, temperature=HENRY_REFERENCE_TEMPERATURE,
                  water_density=WATER_DENSITY_298,
                  water_molar_concentration=WATER_MOLAR_CONCENTRATION_298):
    """Convert a Henry's law constant between any two units of `HENRY_UNITS`.

    Parameters
    ----------
    value : float or array_like
        The constant in `from_unit`.
    from_unit, to_unit : str
        Keys of `HENRY_UNITS`.
    temperature : float, optional
        Temperature of the constant, used by "kaw". [K] Default 298.15 K.
    water_density : float, optional
        Used by "mol_per_kg_bar". [kg/m3] Default 997.047 (IAPWS-95, 25 °C).
    water_molar_concentration : float, optional
        Used by "kx". [mol/m3] Default 55 345 (pure water, 25 °C).

    Returns
    -------
    float or numpy.ndarray
        The constant in `to_unit`.

    Examples
    --------
    Dichloromethane, 286 Pa m3/mol at 25 degC (a US Geological Survey mean of
    measurements), as US EPA's dimensionless H':

    >>> round(convert_henry(286.0, "hpc", "kaw"), 3)
    0.115
    """
    _unit_key(from_unit, "from_unit")
    _unit_key(to_unit, "to_unit")
    hcp = henry_to_hcp(value, from_unit, temperature, water_density, water_molar_concentration)
    return hcp_to_unit(hcp, to_unit, temperature, water_density, water_molar_concentration)


def dilution_warnings(concentration, solubility=None, water_density=WATER_DENSITY_298,
                      name: str = "the compound") -> tuple[str, ...]:
    """Cautions when a solution is too concentrated for Henry's law.

    Henry's law constants describe infinite dilution. Above the aqueous solubility
    a separate liquid phase is present and the vapour is that of the pure
    compound (Raoult's law), not Henry's. Where the solubility is not known, a
    mass fraction above `DILUTE_MASS_FRACTION_LIMIT` (1 %) is flagged instead; the
    mass fraction is taken as concentration over the water density.

    Parameters
    ----------
    concentration : float or array_like
        Dissolved compound per volume of water. [kg/m3] (1 mg/L = 1e-3 kg/m3)
    solubility : float, optional
        Aqueous solubility of the compound near 25 degC. [kg/m3]
    water_density : float, optional
        [kg/m3] Default 997.047 (IAPWS-95, 25 degC).
    name : str
        Name used in the messages.

    Returns
    -------
    tuple of str
        Empty when the solution is dilute.
    """
    c = positive_array(concentration, "concentration", "kg/m3", allow_zero=True,
                       allow_empty=True)
    if c.size == 0:
        return ()
    top = float(np.max(c))
    if solubility is not None:
        s = float(positive_array(solubility, "solubility", "kg/m3", allow_empty=True))
        if top > s:
            return (f"{name}: {top:g} kg/m3 exceeds its water solubility of about {s:g} "
                    "kg/m3 near 25 °C; a separate liquid layer is likely and the "
                    "vapour follows the pure liquid's vapour pressure, not Henry's law "
                    "- screen it as a liquid",)
        return ()
    limit = DILUTE_MASS_FRACTION_LIMIT * float(positive_array(water_density, "water_density",
                                                               "kg/m3", allow_empty=True))
    if top > limit:
        return (f"{name}: {top:g} kg/m3 is above {100 * DILUTE_MASS_FRACTION_LIMIT:g} % by "
                "mass; Henry's law is an infinite-dilution law and loses accuracy here, "
                "and no solubility is on record to check for a separate liquid layer",)
    return ()


#: A dissolved concentration more than this many times the compound's water solubility
#: is refused rather than warned about. [-] 2, chosen here: tabulated solubilities
#: near 25 degC scatter by tens of percent between sources and with temperature, so
#: up to twice the solubility may still be a (supersaturated or warmer) solution;
#: beyond it a separate liquid layer is certain and Henry's law does not apply.
SOLUBILITY_REFUSAL_FACTOR = 2.0


def check_dissolved_concentration(key: str, concentration: float,
                                  field: str = "dissolved concentration") -> float:
    """Refuse a dissolved concentration far above the compound's water solubility.

    Parameters
    ----------
    key : str
        Compound, as for `henry_constants`.
    concentration : float
        Dissolved compound per volume of water. [kg/m3]
    field : str
        Name of the input, for messages.

    Returns
    -------
    float
        The concentration. [kg/m3]

    Raises
    ------
    InputError
        Above `SOLUBILITY_REFUSAL_FACTOR` times the solubility on record.
    """
    c = float(concentration)
    constants = henry_constants(key)
    s = constants.solubility_298
    if s is not None and c > SOLUBILITY_REFUSAL_FACTOR * s:
        raise InputError(field, f"{c * 1000:g} mg/L is more than {SOLUBILITY_REFUSAL_FACTOR:g} "
                         f"times the water solubility of {constants.name} (about "
                         f"{s * 1000:g} mg/L near 25 °C): it cannot all be dissolved; a "
                         "separate liquid layer is there, so screen that layer as a liquid "
                         "instead of by Henry's law")
    return c


def _temperature_warnings(t: np.ndarray) -> tuple[str, ...]:
    if t.size and float(np.max(t)) > CONSTANT_ENTHALPY_LIMIT:
        return (f"{float(np.max(t)):.1f} K is above {CONSTANT_ENTHALPY_LIMIT:g} K; the "
                "constant-enthalpy van 't Hoff form is extrapolated there; treat the "
                "partial pressure as uncertain by tens of percent",)
    return ()


def henry_partial_pressure(concentration, molar_mass, temperature, hcp_298,
                           temperature_dependence, solubility=None):
    r"""Partial pressure of a volatile compound over water that holds it dissolved.

    .. math:: p = \frac{c / M}{H^{cp}(T)}

    with Hcp(T) from `henry_solubility`. The water is taken as an infinite
    reservoir: the vapour drawn into a headspace does not lower the concentration
    (see `headspace_over_water` for a closed space with a finite liquid volume).

    Parameters
    ----------
    concentration : float or array_like
        Dissolved compound per volume of water. [kg/m3] (1 mg/L = 1e-3 kg/m3)
    molar_mass : float
        Molar mass of the compound. [kg/mol]
    temperature : float or array_like
        Water temperature, within 273.15-373.15 K. [K]
    hcp_298 : float
        Henry's law solubility constant at 298.15 K. [mol/(m3 Pa)]
    temperature_dependence : float
        d ln Hcp / d(1/T). [K]
    solubility : float, optional
        Aqueous solubility, for the dilution check. [kg/m3] Without it a 1 % mass
        fraction is the limit.

    Returns
    -------
    float or numpy.ndarray
        Equilibrium partial pressure of the compound. [Pa]

    Raises
    ------
    InputError
        For a negative or NaN concentration, a temperature outside liquid water,
        or a constant that is not a positive finite number.

    Warns
    -----
    UllageWarning
        When the concentration is above the solubility (or 1 % by mass).
    ExtrapolationWarning
        Above `CONSTANT_ENTHALPY_LIMIT`.

    References
    ----------
    Henry, W. (1803), Phil. Trans. R. Soc. Lond. 93, 29 (from memory, check); form
    and units after Sander (2015), Atmos. Chem. Phys. 15, 4399.

    Examples
    --------
    Water holding 1 mg/L of benzene (78.11 g/mol) at 25 degC:

    >>> round(henry_partial_pressure(1e-3, 0.078114, 298.15, 1.7e-3, 4200.0), 2)
    7.53
    """
    c = positive_array(concentration, "concentration", "kg/m3", allow_zero=True,
                       allow_empty=True)
    m = positive_array(molar_mass, "molar_mass", "kg/mol", allow_empty=True)
    t = _check_water_temperature(temperature)
    hcp = henry_solubility(t, hcp_298, temperature_dependence)
    for note in dilution_warnings(c, solubility):
        warnings.warn(note, UllageWarning, stacklevel=2)
    for note in _temperature_warnings(t):
        warnings.warn(note, ExtrapolationWarning, stacklevel=2)
    out = (c / m) / hcp
    return _scalar_or_array(out, concentration, molar_mass, temperature)


# --------------------------------------------------------------------------- table


@dataclass(frozen=True)
class HenryConstants:
    """One compound's Henry's law constants in water, with their sources.

    Attributes
    ----------
    key : str
        Identifier, the same as in the substance table ("toluene").
    name : str
        Display name.
    cas : str
        CAS registry number.
    hcp_298 : float
        Henry's law solubility constant at 298.15 K. [mol/(m3 Pa)]
    temperature_dependence : float
        d ln Hcp / d(1/T). [K]
    solubility_298 : float or None
        Aqueous solubility near 25 degC, for the dilution check. [kg/m3]
    source : str
        The original paper and the compilation the constants come from.
    solubility_source : str
        Where the solubility comes from, or why there is none.
    found_in : str
        The public document the numbers were read from.
    """

    key: str
    name: str
    cas: str
    hcp_298: float
    temperature_dependence: float
    solubility_298: float | None
    source: str
    solubility_source: str
    found_in: str

    def hcp(self, temperature):
        """Henry's law solubility constant at `temperature` [K]. [mol/(m3 Pa)]"""
        return henry_solubility(temperature, self.hcp_298, self.temperature_dependence)

    def dimensionless(self, temperature):
        """Gas/aqueous concentration ratio at `temperature` [K]. [-]"""
        return dimensionless_henry(self.hcp(temperature), temperature)


def _optional_float(text: str) -> float | None:
    text = (text or "").strip()
    return float(text) if text else None


@functools.cache
def _henry_table() -> tuple[dict[str, HenryConstants], dict[str, str]]:
    with TABLE_PATH.open(newline="", encoding="utf-8") as handle:
        rows = list(csv.DictReader(handle))
    by_key: dict[str, HenryConstants] = {}
    index: dict[str, str] = {}
    for row in rows:
        entry = HenryConstants(
            key=row["key"].strip(),
            name=row["name"].strip(),
            cas=row["cas"].strip(),
            hcp_298=float(row["hcp_298"]),
            temperature_dependence=float(row["temperature_dependence"]),
            solubility_298=_optional_float(row["solubility_298"]),
            source=row["source"].strip(),
            solubility_source=row["solubility_source"].strip(),
            found_in=row["found_in"].strip(),
        )
        by_key[entry.key] = entry
        for label in (entry.key, entry.name, entry.cas):
            index.setdefault(label.lower(), entry.key)
    return by_key, index


def _via_substance_synonyms(key: str, index: dict[str, str]) -> str | None:
    """Resolve a synonym ("TCE", "MEK") through the substance table, when it is built."""
    from .substances import substance

    try:
        cas = substance(key).cas
    except (InputError, OSError):
        return None
    return index.get(cas.lower()) if cas else None


def all_henry_constants() -> tuple[HenryConstants, ...]:
    """Every row of the bundled Henry's law table, sorted by key."""
    by_key, _ = _henry_table()
    return tuple(by_key[k] for k in sorted(by_key))


def henry_constants(key: str) -> HenryConstants:
    """Bundled Henry's law constants of a compound in water.

    Parameters
    ----------
    key : str
        Key of the substance table ("trichloroethylene"), display name or CAS
        number, case ignored; once ``estimator/data/substances.csv`` is built, any
        synonym it lists ("TCE", "MEK") as well.

    Returns
    -------
    HenryConstants

    Raises
    ------
    InputError
        Field "key", when the compound is not in the table; the message suggests
        close matches.

    Examples
    --------
    >>> henry_constants("toluene").hcp_298
    0.0015
    >>> henry_constants("79-01-6").key
    'trichloroethylene'
    """
    if not isinstance(key, str) or not key.strip():
        raise InputError("key", "give the compound's key, name or CAS number")
    by_key, index = _henry_table()
    hit = index.get(key.strip().lower())
    if hit is None:
        hit = _via_substance_synonyms(key, index)
    if hit is not None:
        return by_key[hit]
    hints = suggest(key.strip(), by_key)
    hint = ("did you mean " + ", ".join(repr(h) for h in hints) + "?" if hints else
            "the table holds " + ", ".join(sorted(by_key)) +
            "; for another compound pass its constants to henry_partial_pressure")
    raise InputError("key", f"no Henry's law constants are bundled for {key!r}; {hint}")


# --------------------------------------------------------------------------- estimate


@dataclass(frozen=True)
class HeadspaceOverWater:
    """Equilibrium vapour of one dissolved compound in a closed space over water.

    Attributes
    ----------
    key : str
        The compound.
    partial_pressure : float or numpy.ndarray
        Equilibrium partial pressure of the compound. [Pa]
    volume_fraction : float or numpy.ndarray
        Partial pressure over the total pressure (x 1e6 for ppm by volume). [-]
    gas_concentration : float or numpy.ndarray
        Mass of the compound per volume of headspace gas. [kg/m3]
    aqueous_concentration : float or numpy.ndarray
        Concentration left in the water at equilibrium; equal to the initial one
        when the headspace-to-liquid volume ratio is 0. [kg/m3]
    hcp : float or numpy.ndarray
        Henry's law solubility constant used, at the water temperature.
        [mol/(m3 Pa)]
    dimensionless_ratio : float or numpy.ndarray
        Gas/aqueous concentration ratio at the water temperature. [-]
    source : str
        Where the constants come from.
    warnings : tuple of str
        Dilution and extrapolation cautions.
    """

    key: str
    partial_pressure: object
    volume_fraction: object
    gas_concentration: object
    aqueous_concentration: object
    hcp: object
    dimensionless_ratio: object
    source: str
    warnings: tuple[str, ...] = ()


def headspace_over_water(compound, concentration, molar_mass, temperature,
                         pressure=STANDARD_ATMOSPHERE, headspace_to_liquid_ratio=0.0):
    r"""Screening estimate of the vapour a dissolved compound gives a closed headspace.

    With the water an infinite reservoir (ratio 0) the partial pressure is
    `henry_partial_pressure`. With a finite liquid volume the compound that moves
    into the gas lowers the aqueous concentration; a mass balance over the closed
    space (no other losses) gives

    .. math:: c_\mathrm{aq} = \frac{c_0}{1 + K_\mathrm{aw}\,V_\mathrm{gas}/V_\mathrm{liq}},
              \qquad c_\mathrm{gas} = K_\mathrm{aw}\,c_\mathrm{aq}

    Parameters
    ----------
    compound : str or HenryConstants
        Key, name or CAS number of the bundled table, or constants the caller holds.
    concentration : float or array_like
        Initial dissolved compound per volume of water. [kg/m3] (1 mg/L = 1e-3 kg/m3)
    molar_mass : float
        Molar mass of the compound. [kg/mol]
    temperature : float or array_like
        Water and headspace temperature, within 273.15-373.15 K. [K]
    pressure : float, optional
        Total headspace pressure. [Pa] Default 101325 Pa.
    headspace_to_liquid_ratio : float, optional
        Gas volume over liquid volume of the closed space. [-] Default 0, an
        infinite reservoir (the larger, conservative partial pressure).

    Returns
    -------
    HeadspaceOverWater
        Dilution and extrapolation cautions are returned in its `warnings`, not
        emitted.

    Raises
    ------
    InputError
        For an unknown compound (field "key"), bad concentrations, temperatures,
        pressures or volume ratios (each naming its field), and for a partial
        pressure above the total pressure.

    Examples
    --------
    >>> r = headspace_over_water("benzene", 1e-3, 0.078114, 298.15)
    >>> round(r.volume_fraction * 1e6, 1)
    74.3
    """
    constants = compound if isinstance(compound, HenryConstants) else henry_constants(compound)
    c0 = positive_array(concentration, "concentration", "kg/m3", allow_zero=True,
                       allow_empty=True)
    m = float(positive_array(molar_mass, "molar_mass", "kg/mol", allow_empty=True))
    t = _check_water_temperature(temperature)
    total = positive_array(pressure, "pressure", "Pa", allow_empty=True)
    ratio = finite_array(headspace_to_liquid_ratio, "headspace_to_liquid_ratio",
                         allow_empty=True)
    if ratio.size and np.any(ratio < 0.0):
        raise InputError("headspace_to_liquid_ratio", "must not be negative [-]")
    hcp = constants.hcp(t)
    kaw = 1.0 / (hcp * GAS_CONSTANT * t)
    c_aq = c0 / (1.0 + kaw * ratio)
    partial = (c_aq / m) / hcp
    if np.any(partial > total):
        raise InputError("concentration", "gives a partial pressure above the total "
                                          "pressure; the solution is far from dilute")
    notes = (*dilution_warnings(c0, constants.solubility_298, name=constants.name),
             *_temperature_warnings(t))
    inputs = (concentration, temperature, pressure, headspace_to_liquid_ratio)

    def shape(x):
        return _scalar_or_array(x, *inputs)

    return HeadspaceOverWater(
        key=constants.key,
        partial_pressure=shape(partial),
        volume_fraction=shape(partial / total),
        gas_concentration=shape(kaw * c_aq),
        aqueous_concentration=shape(c_aq * np.ones_like(partial)),
        hcp=shape(hcp * np.ones_like(partial)),
        dimensionless_ratio=shape(kaw * np.ones_like(partial)),
        source=constants.source,
        warnings=tuple(notes),
    )
