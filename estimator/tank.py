"""The vapour space of a storage tank: vapour held, pushed out by filling, breathed out.

First-principles screening: ideal gas, a saturated vapour space at the liquid
temperature, a free vent at constant pressure. US EPA AP-42 Chapter 7.1 gives
the regulatory emission-estimating method for fixed-roof tanks, and the two
relate differently for the two losses:

- filling (`filling_displacement`) is AP-42's working loss with its turnover,
  product and vent factors set to 1: the displaced volume leaves saturated;
- thermal breathing (`thermal_breathing`) is not AP-42's standing loss with
  factors of 1: it integrates the mole balance of the venting vapour space
  exactly over the temperature swing, where AP-42 uses the linearised
  vapour-space expansion factor K_E = ΔT_V/T_LA + ΔP_V/(P_A - P_VA) and a
  vented-vapour saturation factor K_S. For a small swing the two agree to first
  order in ΔT (with K_S = 1); for a wide swing they differ.
"""

from __future__ import annotations

import math
import warnings
from dataclasses import dataclass

import numpy as np

from .constants import GAS_CONSTANT, STANDARD_ATMOSPHERE
from .checks import positive
from .errors import InputError, OutOfRangeError
from .headspace import headspace
from .mixtures import liquid as make_liquid

__all__ = [
    "vapor_space_volume",
    "VaporInventory",
    "vapor_inventory",
    "filling_displacement",
    "BreathingLoss",
    "thermal_breathing",
    "EntryPurge",
    "entry_purge",
]


def vapor_space_volume(tank_volume, fill_fraction) -> float:
    """Volume of the vapour space of a tank filled to a fraction of its volume.

    Parameters
    ----------
    tank_volume : float
        Total internal volume. [m3]
    fill_fraction : float
        Liquid volume over tank volume, 0 to below 1. [-]

    Returns
    -------
    float
        [m3]
    """
    v = positive(tank_volume, "tank volume", "m3")
    f = float(fill_fraction)
    if not math.isfinite(f) or not 0.0 <= f < 1.0:
        raise InputError("fill level", f"{fill_fraction!r} must be from 0 to below 1 "
                         "(0.8 for 80 % full); a full tank has no vapour space")
    return v * (1.0 - f)


@dataclass(frozen=True)
class VaporInventory:
    """Vapour held in a vapour space at equilibrium.

    Attributes
    ----------
    names : tuple of str
    masses : numpy.ndarray
        Per component. [kg]
    total_mass : float
        [kg]
    volume : float
        Vapour-space volume. [m3]
    """

    names: tuple[str, ...]
    masses: np.ndarray
    total_mass: float
    volume: float


def vapor_inventory(liquid, temperature, volume, pressure=STANDARD_ATMOSPHERE,
                    **liquid_options) -> VaporInventory:
    """Mass of vapour in a saturated vapour space: m_i = y_i P V M_i / (R T).

    Parameters
    ----------
    liquid : as for `estimator.headspace.headspace`
    temperature : float
        [K]
    volume : float
        Vapour-space volume. [m3]
    pressure : float
        Absolute pressure. [Pa]

    Returns
    -------
    VaporInventory
    """
    v = positive(volume, "vapour-space volume", "m3")
    hs = headspace(liquid, float(temperature), pressure, **liquid_options)
    masses = np.asarray(hs.mass_concentrations, dtype=float) * v
    return VaporInventory(hs.liquid.names, masses, float(masses.sum()), v)


def filling_displacement(liquid, temperature, volume_pumped, pressure=STANDARD_ATMOSPHERE,
                         **liquid_options) -> VaporInventory:
    """Vapour pushed out of the vent while liquid is pumped in.

    Each cubic metre pumped in displaces one cubic metre of saturated vapour-air
    mixture (the upper bound: AP-42 Chapter 7.1 working loss with turnover,
    product and vent factors of 1).

    Parameters
    ----------
    liquid : as for `estimator.headspace.headspace`
    temperature : float
        [K]
    volume_pumped : float
        Liquid volume pumped in. [m3]
    pressure : float
        Absolute pressure. [Pa]

    Returns
    -------
    VaporInventory
        Mass expelled per component, for the displaced volume.
    """
    return vapor_inventory(liquid, temperature, positive(volume_pumped, "volume pumped",
                                                          "m3"), pressure, **liquid_options)


@dataclass(frozen=True)
class BreathingLoss:
    """Vapour vented by one warming of a tank's vapour space.

    Attributes
    ----------
    names : tuple of str
    masses : numpy.ndarray
        Vapour vented per component, per cycle. [kg]
    total_mass : float
        [kg]
    gas_vented : float
        Vapour-air mixture vented, in moles. [mol]
    """

    names: tuple[str, ...]
    masses: np.ndarray
    total_mass: float
    gas_vented: float


def thermal_breathing(liquid, temperature_low, temperature_high, volume,
                      pressure=STANDARD_ATMOSPHERE, steps=400, **liquid_options) -> BreathingLoss:
    """Vapour vented by a daily temperature swing of a tank's vapour space.

    As the vapour space warms from `temperature_low` to `temperature_high` at
    constant pressure (a free vent), its gas expands and the vapour pressure
    rises, and gas leaves. Air is neither made nor lost except by venting, so the
    moles leaving are dn_out = -d[(1 - y) n] / (1 - y) with n = P V / (R T), and
    component i leaves at y_i dn_out. Integrated over the swing (liquid and
    vapour space at the same temperature; the liquid's own expansion neglected).

    Parameters
    ----------
    liquid : as for `estimator.headspace.headspace`
    temperature_low, temperature_high : float
        Coolest and warmest vapour-space temperature of the cycle. [K]
    volume : float
        Vapour-space volume. [m3]
    pressure : float
        Absolute pressure held by the vent. [Pa]
    steps : int
        Integration steps over the swing.

    Returns
    -------
    BreathingLoss

    References
    ----------
    Compare US EPA AP-42, 5th ed., Chapter 7.1 (2020), standing loss with the
    vapour-space expansion factor K_E = ΔT_V/T_LA + ΔP_V/(P_A - P_VA).
    """
    v = positive(volume, "vapour-space volume", "m3")
    lo = positive(temperature_low, "lowest temperature", "K")
    hi = positive(temperature_high, "highest temperature", "K")
    if hi <= lo:
        raise InputError("highest temperature", "must be above the lowest temperature")
    liq = make_liquid(liquid, **liquid_options)
    t = np.linspace(lo, hi, int(steps) + 1)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        hs = headspace(liq, t, pressure)
    if np.any(hs.boiling):
        raise OutOfRangeError("highest temperature", "the liquid boils within the swing; "
                              "the vapour space vents pure vapour and this model does not apply")
    y_i = np.asarray(hs.volume_fractions)
    y = y_i.sum(axis=0)
    air = (1.0 - y) * pressure * v / (GAS_CONSTANT * t)
    d_air = -np.diff(air)
    y_mid_i = 0.5 * (y_i[:, 1:] + y_i[:, :-1])
    y_mid = y_mid_i.sum(axis=0)
    out_total = d_air / (1.0 - y_mid)
    moles_i = np.sum(y_mid_i * out_total, axis=1)
    masses = moles_i * liq.molar_masses
    return BreathingLoss(liq.names, masses, float(masses.sum()), float(out_total.sum()))


@dataclass(frozen=True)
class EntryPurge:
    """Dilution purge of a tank's vapour space before entry.

    Attributes
    ----------
    time : float
        From the start of purging to the target; inf if never reached. [s]
    initial_volume_fraction, target_volume_fraction, floor_volume_fraction : float
        Start, target, and the level the purge tends to while residual liquid
        keeps evaporating. [-]
    residual_evaporation : float
        Evaporation rate of the residual liquid during the purge. [kg/s]
    reachable : bool
    note : str
    case : str
        "drained" (no liquid left: the whole tank volume is purged) or "holding
        liquid" (the vapour space above the liquid, with its evaporation floor).
    volume : float
        Volume purged. [m3]
    """

    time: float
    initial_volume_fraction: float
    target_volume_fraction: float
    floor_volume_fraction: float
    residual_evaporation: float
    reachable: bool
    note: str
    case: str = "drained"
    volume: float = math.nan

    @property
    def case_words(self) -> str:
        """Which case was computed, in plain words."""
        if self.case == "drained":
            return (f"drained and cleaned tank: the whole {self.volume:.3g} m³ holds vapour "
                    "and is purged")
        return (f"tank still holding liquid: the {self.volume:.3g} m³ vapour space above it "
                "is purged while the liquid keeps evaporating")


def entry_purge(liquid, temperature, vapor_space, purge_rate, target_volume_fraction,
                mixing_factor=1.0, residual_area=0.0, air_speed=0.1,
                pressure=STANDARD_ATMOSPHERE) -> EntryPurge:
    """Time for purge ventilation to bring a saturated vapour space below a target.

    The space starts at its equilibrium headspace and is purged with clean air
    (well-mixed, mixing factor K >= 1 dividing the purge rate),
    t = K V / Q ln(C0 / C). Two cases: a drained, clean tank (no
    `residual_area`), where the whole tank volume holds vapour and must be
    purged; and a tank still holding liquid, where the vapour space above it
    is purged while the liquid of `residual_area` keeps evaporating
    (Mackay-Matsugu at the internal air speed), which sets a floor G K / Q; a
    target at or below it is never reached. Purging is followed by
    measurement: this says how long to plan for, not when the space is safe.

    Parameters
    ----------
    liquid : as for `estimator.headspace.headspace` (a pure liquid or a mapping)
    temperature : float
        [K]
    vapor_space : float
        Volume being purged: the whole tank for a drained tank, the vapour space
        above the liquid for a tank holding liquid. [m3]
    purge_rate : float
        Clean-air purge rate. [m3/s]
    target_volume_fraction : float
        Total vapour to reach, such as 10 % of the LFL or an exposure limit. [-]
    mixing_factor : float
        K >= 1. [-]
    residual_area : float
        Area of liquid left in the tank, 0 for a drained, clean tank. [m2]
    air_speed : float
        Air speed over the residual liquid during purging. [m/s]
    pressure : float
        [Pa]

    Returns
    -------
    EntryPurge
    """
    from .evaporation import mixture_evaporation_rates
    from .indoor import purge_time

    v = positive(vapor_space, "vapour-space volume", "m3")
    q = positive(purge_rate, "purge rate", "m3/s")
    target = float(target_volume_fraction)
    if not math.isfinite(target) or not 0 < target < 1:
        raise InputError("purge target", "must be a volume fraction above 0 and below 1")
    hs = headspace(liquid, float(temperature), pressure)
    y0 = float(hs.total_volume_fraction)
    to_molar = pressure / (GAS_CONSTANT * float(temperature))
    residual = 0.0
    residual_moles = 0.0
    if residual_area and float(residual_area) > 0:
        liq = hs.liquid
        rates = np.asarray(mixture_evaporation_rates(
            liq.components, liq.mole_fractions, float(temperature), float(residual_area),
            air_speed, liq.activity_coefficients, pressure=pressure))
        residual = float(rates.sum())
        residual_moles = float(np.sum(rates / liq.molar_masses))
    estimate = purge_time(v, q, y0 * to_molar, target * to_molar, mixing_factor,
                          residual_moles)
    floor = estimate.floor / to_molar
    note = estimate.note
    if not estimate.reachable and residual > 0:
        note = (f"the residual liquid keeps the space at about {floor * 1e6:.3g} ppm at this "
                f"purge rate, at or above the {target * 1e6:.3g} ppm target: it can never be "
                "reached; remove the liquid or raise the purge rate")
    return EntryPurge(estimate.time, y0, target, float(floor), residual,
                      estimate.reachable, note,
                      "holding liquid" if residual > 0 else "drained", v)
