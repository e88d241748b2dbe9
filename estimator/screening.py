"""Run a scenario: every tank and spill through the models, compared with the limits.

`run_scenario` calls the model functions in the one direction of the data flow
(vapour pressure, then headspace or evaporation, then air concentration, then
the comparison) and returns frozen results that carry the values, the method of
each step, the assumptions, the warnings and the cautions.
"""

from __future__ import annotations

import math
import warnings
from dataclasses import dataclass

import numpy as np

from ._meta import CAUTIONS, __version__
from .errors import InputError, UllageError
from .headspace import (
    AboveAtLowestTemperature,
    Headspace,
    FlashPointEstimate,
    estimated_flash_point,
    headspace,
    temperature_for_percent_lfl,
    water_headspace,
)
from .limits import (
    LimitComparison,
    additive_terms,
    compare,
    flammability_findings,
    format_number,
    vapor_hazard_ratio,
)
from .scenario import Scenario, build_liquid

__all__ = [
    "TankResult",
    "ZoneExposure",
    "SpillResult",
    "ScenarioResult",
    "run_scenario",
    "screen_tank",
    "sweep_temperatures",
]

#: Averaging window each limit kind is compared over.
_WINDOW = {"TWA": "8-h TWA", "STEL": "highest 15-min average", "ceiling": "peak",
           "emergency": "peak"}


def _concentrations(hs: Headspace, index=None) -> dict[str, float]:
    y = np.asarray(hs.volume_fractions)
    if index is not None:
        y = y[:, index]
    return {c.key: float(v) for c, v in zip(hs.liquid.components, y)}


@dataclass(frozen=True)
class TankResult:
    """Screening of one tank's vapour space.

    Attributes
    ----------
    name, liquid : str
    temperature, worst_temperature : float or None
        [K]
    pressure : float
        Absolute pressure of the vapour space. [Pa]
    headspace, worst : Headspace or None
        At the stated and the worst temperature.
    sweep : Headspace or None
        Over a range of temperatures, for tables and plots.
    comparisons, worst_comparisons : tuple of LimitComparison
    additive_index, worst_additive_index : float or None
        Σ C_i/L_i over TWA limits, each substance once with its lowest TWA.
    additive_terms, worst_additive_terms : AdditiveIndex or None
        The same with the limit each substance counted with.
    hazard_ratios : dict
        Substance key -> vapour hazard ratio (saturated vapour / TWA) at the stated
        temperature.
    flash_point : FlashPointEstimate or None
    alarm_temperature : float or None
        Liquid temperature at which the headspace reaches the % LFL alarm. [K]
    inventory, filling, breathing, purge : objects from `estimator.tank`, or None
    findings : tuple of str
        Plain-language screening statements.
    warnings : tuple of str
    monte_carlo : MonteCarloResult or None
        Probabilistic screening, when the scenario gives uncertain inputs.
    boiling : BoilingTemperature or None
        Boiling temperature (bubble point of a mixture) at the tank's pressure.
    near_boiling : tuple of str
        The cases ("stated", "worst") whose temperature lies within
        `NEAR_BOILING` of it, or above it.
    """

    name: str
    liquid: str
    temperature: float
    worst_temperature: float | None
    pressure: float
    headspace: Headspace
    worst: Headspace | None
    sweep: Headspace | None
    comparisons: tuple[LimitComparison, ...]
    worst_comparisons: tuple[LimitComparison, ...]
    additive_index: float | None
    worst_additive_index: float | None
    hazard_ratios: dict
    flash_point: FlashPointEstimate | None
    alarm_temperature: float | None
    inventory: object
    filling: object
    breathing: object
    purge: object
    findings: tuple[str, ...]
    warnings: tuple[str, ...]
    monte_carlo: object = None
    additive_terms: object = None
    worst_additive_terms: object = None
    boiling: object = None
    near_boiling: tuple[str, ...] = ()

    @property
    def exceeded(self) -> bool:
        """Whether any limit or alarm is exceeded at the stated or worst temperature."""
        cmp = any(c.exceeded for c in self.comparisons + self.worst_comparisons)
        return cmp or any("at or above" in f or "oxygen-" in f for f in self.findings)


@dataclass(frozen=True)
class ZoneExposure:
    """Exposure metrics of one substance in one zone over a spill run.

    Concentrations in ppm by volume, times in s from the spill.
    """

    zone: str
    substance: str
    peak: float
    peak_time: float
    twa: float
    short_term: float
    comparisons: tuple[tuple[str, float, float, float | None, float | None], ...]
    # (limit label, limit ppm, ratio, first time above, time back below)
    twa_lower_bound: bool = False
    # the run is shorter than the shift: the rest counts as zero exposure


@dataclass(frozen=True)
class SpillResult:
    """Screening of one spill.

    Attributes
    ----------
    name, liquid : str
    where : str
        Room name, or "outdoors".
    indoor : IndoorSpill or None
    outdoor : OutdoorSpill or None
    initial_rates : dict
        Model name -> total initial evaporation rate, both models side by side. [kg/s]
    monte_carlo : MonteCarloResult or None
        Probabilistic screening, when the scenario gives uncertain inputs.
    exposures : tuple of ZoneExposure
    distances : tuple of (limit label, distance [m] or None, note)
        Outdoors: how far the centreline stays above each limit.
    findings, warnings : tuple of str
    flammability : tuple of ZoneFlammability
        Indoors: % LFL, flammable state and oxygen of each zone's air over the run.
    """

    name: str
    liquid: str
    where: str
    indoor: object
    outdoor: object
    initial_rates: dict
    exposures: tuple[ZoneExposure, ...]
    distances: tuple
    findings: tuple[str, ...]
    warnings: tuple[str, ...]
    monte_carlo: object = None
    flammability: tuple = ()

    @property
    def exceeded(self) -> bool:
        if any(ratio > 1 for e in self.exposures for _, _, ratio, _, _ in e.comparisons):
            return True
        if any(z.above_alarm_from is not None or z.below_oxygen_alarm_from is not None
               for z in self.flammability):
            return True
        if self.outdoor is not None and getattr(self.outdoor, "distance_to_lfl_alarm", None):
            return True
        return any(d is None or (d or 0) > 0 for _, d, _ in self.distances)


@dataclass(frozen=True)
class ScenarioResult:
    """Everything a scenario run produced.

    Attributes
    ----------
    scenario : Scenario
    tanks : tuple of TankResult
    spills : tuple of SpillResult
    errors : tuple of (item, message)
        Items that could not be computed, and why; the others still are.
    assumptions : tuple of str
    cautions : tuple of str
    version : str
    """

    scenario: Scenario
    tanks: tuple[TankResult, ...]
    spills: tuple[SpillResult, ...]
    errors: tuple[tuple[str, str], ...]
    assumptions: tuple[str, ...]
    cautions: tuple[str, ...] = CAUTIONS
    version: str = __version__

    @property
    def exceeded(self) -> bool:
        """Whether any limit or alarm is exceeded anywhere in the scenario."""
        return any(t.exceeded for t in self.tanks) or any(s.exceeded for s in self.spills)


def sweep_temperatures(liq, low: float, high: float, n: int = 41) -> np.ndarray:
    """Temperatures for a sweep, kept inside the liquid range of every component. [K]"""
    from .headspace import lowest_liquid_temperature

    components = liq.components
    lo = max(low, lowest_liquid_temperature(components) + 0.5)
    hi = min([high] + [(c.critical_temperature or 2000.0) - 1.0 for c in components])
    if hi <= lo:
        raise InputError("sweep", "the range lies outside the liquid range of the liquid")
    return np.linspace(lo, hi, n)


#: A liquid this close to its boiling temperature is flagged. [K] 5 K: within it,
#: small warming builds pressure in a closed tank, pushes vapour out of vents, and
#: a release flashes in part (common practice for a screening margin).
NEAR_BOILING = 5.0


def _boiling_findings(liquid, water, pressure, cases, notes):
    """The tank's boiling temperature, the cases within `NEAR_BOILING` of it, findings."""
    from .headspace import boiling_temperature

    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            boiling = boiling_temperature("water" if water else liquid, pressure)
    except UllageError as exc:
        notes.append(f"boiling temperature not computed: {exc}")
        return None, (), []
    kind = "bubble point" if not water and not liquid.is_pure else "boiling point"
    if water:
        kind = "boiling point of water; the dilute dissolved compounds neglected"
    spread = (f" ± {boiling.uncertainty:.2g} K" if boiling.uncertainty is not None else "")
    out = [f"The liquid boils at {boiling.celsius:.1f} °C{spread} at this tank's "
           f"{pressure / 1000:.4g} kPa ({kind})."]
    near = []
    for case, label, temperature in cases:
        if temperature is None:
            continue
        gap = boiling.temperature - temperature
        if gap <= NEAR_BOILING:
            near.append(case)
            where = (f"{gap:.1f} K below it" if gap > 0 else
                     f"{-gap:.1f} K above it: the liquid boils")
            out.append(f"Near boiling: {label} ({temperature - 273.15:.1f} °C) is {where}. "
                       "Expect pressure build-up in a closed tank, vapour pushed out of the "
                       "vents, and flashing of a release; the equilibrium headspace model "
                       "does not cover a boiling liquid.")
    return boiling, tuple(near), out


def _findings(hs: Headspace, comparisons, alarms, label: str) -> list[str]:
    from .limits import format_ppm

    water = [i for i, c in enumerate(hs.liquid.components) if c.key == "water"]
    of_which = (f" (of which water vapour {format_ppm(float(hs.ppm[water[0]]))} ppm)"
                if water else "")
    out = [f"{label}: headspace {format_ppm(hs.total_ppm)} ppm{of_which}, "
           f"{format_number(float(hs.percent_lfl))} % of the LFL; {hs.flammability_words}."]
    out += flammability_findings(float(hs.percent_lfl), float(hs.oxygen_percent), alarms,
                                 lfl_known=bool(np.isfinite(hs.lfl_mixture)))
    out += ["Headspace " + c.statement + "." for c in comparisons]
    return out


def _tank_headspace(entry, temperature, pressure, notes: list) -> Headspace:
    """The headspace over a scenario liquid (or over water with dissolved
    volatiles), its warnings added to ``notes``."""
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        if entry["kind"] == "water":
            hs = water_headspace({s.key: c for s, c in entry["spec"].items()},
                                 temperature, pressure)
        else:
            hs = headspace(build_liquid(entry), temperature, pressure)
    notes.extend(str(w.message) for w in caught)
    return hs


def _worst_case(evaluate, t, worst_t, notes: list):
    """The worst-case temperature (never below the stated one) and the headspace
    there; the headspace is None when the tank gives no such case or it fails."""
    if worst_t is not None and worst_t < t:
        notes.append(f"the worst-case temperature {worst_t - 273.15:.1f} °C is below the stated "
                     f"temperature {t - 273.15:.1f} °C; the stated temperature is used as the "
                     "worst case: check both")
        worst_t = t
    worst = None
    if worst_t is not None:
        try:
            worst = evaluate(worst_t)
        except UllageError as exc:
            notes.append(f"worst case at {worst_t - 273.15:.1f} °C not computed: {exc}")
    return worst_t, worst


def _additive_index(hs, worst, limits, t, worst_t, pressure):
    """The TWA additive index at the stated and the worst temperature, the vapour
    hazard ratios, and the finding on the mixture when several substances count."""
    ratios = {}
    findings = []
    y = _concentrations(hs)
    additive = additive_terms(y, limits, "TWA", t, pressure)
    worst_additive = (additive_terms(_concentrations(worst), limits, "TWA", worst_t, pressure)
                      if worst else None)
    if additive is not None:
        for key, lim, _ in additive.terms:
            ratios[key] = vapor_hazard_ratio(y[key], lim, t, pressure)
        several = len(additive.terms) > 1 or len(additive.terms) < sum(
            1 for lim in limits if lim.kind == "TWA" and lim.substance in y)
        if several:
            findings.append(f"Headspace {additive.statement}"
                            + (": above 1, the mixture exceeds it." if additive.value > 1
                               else "."))
    return additive, worst_additive, ratios, findings


def _tank_sweep(tank, hs, water, evaluate, t, worst_t, notes: list):
    """The headspace over the tank's sweep range, or None (with a note)."""
    lo = tank.get("sweep_from", t - 15.0)
    hi = tank.get("sweep_to", (worst_t or t) + 15.0)
    try:
        if water:
            grid = np.linspace(max(lo, 273.65), min(hi, 372.65), 41)
        else:
            grid = sweep_temperatures(hs.liquid, lo, hi)
        return evaluate(grid)
    except UllageError as exc:
        notes.append(f"temperature sweep not computed: {exc}")
    return None


def _flash_and_alarm(liquid, alarms, pressure, notes: list):
    """The estimated flash point, the liquid temperature of the % LFL alarm, and
    their findings."""
    flash = alarm_t = None
    findings = []
    try:
        flash = estimated_flash_point(liquid, pressure)
    except UllageError as exc:
        notes.append(f"flash-point estimate: {exc}")
    try:
        alarm_t = temperature_for_percent_lfl(liquid, alarms.percent_lfl, pressure)
    except AboveAtLowestTemperature as exc:
        findings.append(f"The headspace is at or above {alarms.percent_lfl:g} % "
                        f"of the LFL at every liquid temperature down to "
                        f"{exc.temperature - 273.15:.1f} °C, the lowest temperature "
                        "computed (the highest melting point of its components).")
    except UllageError as exc:
        notes.append(f"{alarms.percent_lfl:g} % LFL temperature: {exc}")
    if flash is not None:
        text = f"Estimated flash point {flash.estimate - 273.15:.1f} °C"
        if flash.published is not None:
            text += f" (published {flash.published - 273.15:.1f} °C, {flash.published_source})"
        if flash.flammable_whenever_liquid:
            text += (", below the melting point (a subcooled-liquid extrapolation): the vapour "
                     "over this liquid is flammable at every temperature at which it is liquid")
        findings.append(text + ".")
    if alarm_t is not None:
        findings.append(f"The headspace reaches {alarms.percent_lfl:g} % of the LFL "
                        f"at {alarm_t - 273.15:.1f} °C.")
    return flash, alarm_t, findings


def _tank_purge(scenario: Scenario, tank: dict, hs, t, space, pressure, notes: list):
    """The entry purge of the tank down to its target (by default the alarm's share of
    the LFL), or None (with a note)."""
    from .tank import entry_purge

    target = tank.get("purge_target")
    if target is None:
        target = 0.01 * scenario.alarms.percent_lfl * float(hs.lfl_mixture) \
            if np.isfinite(hs.lfl_mixture) else None
    if target is None:
        notes.append("purge not computed: give purge_target (no LFL to aim below)")
        return None
    holding = bool(tank.get("residual_area"))
    try:
        return entry_purge(hs.liquid, t, space if holding else tank["volume"],
                           tank["purge_rate"], target, tank.get("purge_mixing_factor", 1.0),
                           tank.get("residual_area", 0.0), 0.1, pressure)
    except UllageError as exc:
        notes.append(f"purge: {exc}")
    return None


def _tank_operations(scenario: Scenario, tank: dict, hs, water, t, pressure, notes: list):
    """Vapour inventory, filling displacement, thermal breathing and entry purge of the
    tank, each None where the tank gives no input for it."""
    from .tank import filling_displacement, thermal_breathing, vapor_inventory

    inventory = filling = breathing = purge = None
    space = None
    if tank.get("volume") is not None:
        space = tank["volume"] * (1.0 - tank.get("fill", 0.0))
    if water:
        if any(tank.get(k) for k in ("pumped_volume", "daily_low", "purge_rate")):
            notes.append("filling, breathing and purge are not computed for water with "
                         "dissolved volatiles")
        return inventory, filling, breathing, purge
    liquid = hs.liquid
    if space:
        inventory = vapor_inventory(liquid, t, space, pressure)
    if tank.get("pumped_volume"):
        filling = filling_displacement(liquid, t, tank["pumped_volume"], pressure)
    if tank.get("daily_low") is not None and space:
        try:
            breathing = thermal_breathing(liquid, tank["daily_low"], tank["daily_high"],
                                          space, pressure)
        except UllageError as exc:
            notes.append(f"thermal breathing: {exc}")
    if tank.get("purge_rate") and tank.get("volume"):
        purge = _tank_purge(scenario, tank, hs, t, space, pressure, notes)
    return inventory, filling, breathing, purge


def _purge_finding(purge) -> str:
    """The finding on an entry purge: the time to its target, or why it is not reached."""
    case = f" (case computed: {purge.case_words}; give residual_area for liquid left in it)" \
        if purge.case == "drained" else f" (case computed: {purge.case_words})"
    return (f"Purging at the given rate reaches {format_number(purge.target_volume_fraction * 1e6)} ppm "
            "in "
            f"about {purge.time / 60:.0f} min{case}: plan on that, then measure before "
            "entry." if purge.reachable
            else purge.note[:1].upper() + purge.note[1:] + case + ".")


def screen_tank(scenario: Scenario, tank: dict) -> TankResult:
    """Screen one tank of a scenario (see `TankResult`)."""
    entry = scenario.liquids[tank["liquid"]]
    pressure = scenario.pressure + tank.get("gauge_pressure", 0.0)
    t = tank["temperature"]
    notes: list[str] = []
    water = entry["kind"] == "water"

    def evaluate(temperature):
        return _tank_headspace(entry, temperature, pressure, notes)

    hs = evaluate(t)
    worst_t, worst = _worst_case(evaluate, t, tank.get("worst_temperature"), notes)
    limits = scenario.limits
    comparisons = tuple(compare(_concentrations(hs), limits, t, pressure))
    worst_comparisons = (tuple(compare(_concentrations(worst), limits, worst_t, pressure))
                         if worst else ())
    findings = _findings(hs, comparisons, scenario.alarms, f"At {t - 273.15:.1f} °C")
    if worst is not None:
        findings += _findings(worst, worst_comparisons, scenario.alarms,
                              f"At the worst case, {worst_t - 273.15:.1f} °C")
    additive, worst_additive, ratios, said = _additive_index(hs, worst, limits, t, worst_t,
                                                             pressure)
    findings += said
    sweep = _tank_sweep(tank, hs, water, evaluate, t, worst_t, notes)
    flash = alarm_t = None
    if not water and any(c.lower_flammability_limit for c in hs.liquid.components):
        flash, alarm_t, said = _flash_and_alarm(hs.liquid, scenario.alarms, pressure, notes)
        findings += said
    boiling, near_boiling, said = _boiling_findings(
        hs.liquid, water, pressure, [("stated", "the stated temperature", t),
                                     ("worst", "the worst-case temperature", worst_t)], notes)
    findings += said
    inventory, filling, breathing, purge = _tank_operations(scenario, tank, hs, water, t,
                                                            pressure, notes)
    if purge is not None:
        findings.append(_purge_finding(purge))
    return TankResult(
        name=tank["name"], liquid=tank["liquid"], temperature=t, worst_temperature=worst_t,
        pressure=pressure, headspace=hs, worst=worst, sweep=sweep, comparisons=comparisons,
        worst_comparisons=worst_comparisons,
        additive_index=None if additive is None else additive.value,
        worst_additive_index=None if worst_additive is None else worst_additive.value,
        additive_terms=additive, worst_additive_terms=worst_additive,
        hazard_ratios=ratios, flash_point=flash, alarm_temperature=alarm_t,
        inventory=inventory, filling=filling, breathing=breathing, purge=purge,
        boiling=boiling, near_boiling=near_boiling,
        findings=tuple(findings),
        warnings=tuple(dict.fromkeys(list(hs.warnings) + notes
                                     + (list(worst.warnings) if worst else []))),
    )


def _zone_exposure(zone, key, times, ppm, limits, shift, temperature,
                   pressure) -> ZoneExposure:
    from .exposure import first_time_above, max_rolling_average, peak, time_back_below
    from .exposure import time_weighted_average

    top = peak(times, ppm)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        twa = time_weighted_average(times, ppm, shift=shift)
    window = max_rolling_average(times, ppm) if times[-1] - times[0] >= 900 else None
    short = window.value if window is not None else float(np.mean(ppm))
    rows = []
    covered = float(times[-1] - times[0])
    for lim in limits:
        if lim.substance != key:
            continue
        metric = {"TWA": twa, "STEL": short}.get(lim.kind, top.value)
        level = lim.ppm_at(temperature, pressure)
        first = first_time_above(times, ppm, level)
        back = time_back_below(times, ppm, level) if first is not None else None
        rows.append((lim.label, level, metric / level, first, back))
    return ZoneExposure(zone, key, top.value, top.time, twa, short, tuple(rows),
                        twa_lower_bound=covered < shift.duration - 1e-6)


def _zone_flammability(indoor, zone, label, liq, alarms):
    """% LFL, flammable state and oxygen of one zone of an indoor spill, over the run."""
    from .exposure import zone_flammability
    from .headspace import air_flammability, component_limits

    air = air_flammability(indoor.volume_fraction(zone).T, component_limits(liq.components))
    return zone_flammability(
        label, indoor.times, air.percent_lfl, air.oxygen_percent, judged=air.judged,
        percent_ufl=None if air.ufl_missing or not air.judged else air.percent_ufl,
        alarm_percent_lfl=alarms.percent_lfl, oxygen_alarm=alarms.oxygen_low)


def format_duration(seconds) -> str:
    """A time from the spill as people read it: "40 s", "12 min", "3 h 20 min"."""
    s = float(seconds)
    if s < 60:
        return f"{s:.0f} s"
    minutes = round(s / 60.0)
    if minutes < 120:
        return f"{minutes} min"
    hours, rest = divmod(minutes, 60)
    return f"{hours} h {rest} min" if rest else f"{hours} h"


_ZONE_WORDS = {"room": "The room air", "near field": "The air near the pool (near field)",
               "far field": "The air of the rest of the room (far field)"}


def _flammability_findings(zones, end) -> list[str]:
    """Flammability and oxygen verdicts in plain words, worst zone first."""
    out = []
    for z in zones:
        who = _ZONE_WORDS.get(z.zone, z.zone)
        if not z.judged:
            out.append(f"{who}: flammability not judged: no component has a flammability "
                       "limit on record (it may still burn); enter the LFL from the safety "
                       "data sheet.")
        elif z.above_alarm_from is None:
            out.append(f"{who} stays below the {z.alarm_percent_lfl:g} % LFL alarm (highest "
                       f"{z.peak_percent_lfl:.3g} % of the LFL, at "
                       f"{format_duration(z.peak_time)}).")
        else:
            text = (f"{who} passes {z.alarm_percent_lfl:g} % of the LFL at "
                    f"{format_duration(z.above_alarm_from)} and ")
            text += (f"stays above it until {format_duration(z.back_below_alarm)}"
                     if z.back_below_alarm is not None
                     else f"is still above it at the end of the run "
                          f"({format_duration(end)})")
            if z.above_lfl_from is not None:
                until = (f"to {format_duration(z.back_below_lfl)}" if z.back_below_lfl
                         is not None else "to the end of the run")
                text += (f"; it is within the flammable range from "
                         f"{format_duration(z.above_lfl_from)} {until}")
                if z.rich_from is not None:
                    back = (f"to {format_duration(z.back_below_ufl)}"
                            if z.back_below_ufl is not None else "to the end of the run")
                    text += (f" (above the UFL, too rich to burn but flammable again as it "
                             f"dilutes, from {format_duration(z.rich_from)} {back})")
            text += (f"; highest {z.peak_percent_lfl:,.3g} % of the LFL at "
                     f"{format_duration(z.peak_time)}.")
            if z.above_lfl_from is not None:
                text += (" Remove ignition sources, keep people out, ventilate from a safe "
                         "place and measure with a calibrated combustible-gas meter before "
                         "anyone goes in.")
            else:
                text += (" Control ignition sources and measure with a calibrated "
                         "combustible-gas meter before work goes on.")
            out.append(text)
        if z.below_oxygen_alarm_from is not None:
            back = (f", back above it at {format_duration(z.back_above_oxygen_alarm)}"
                    if z.back_above_oxygen_alarm is not None else
                    ", not back above it within the run")
            out.append(f"{who}: oxygen falls below the {z.oxygen_alarm:g} % alarm at "
                       f"{format_duration(z.below_oxygen_alarm_from)}{back} (lowest "
                       f"{z.lowest_oxygen:.3g} % at {format_duration(z.lowest_oxygen_time)}): "
                       "oxygen-deficient; nobody enters without measurement and "
                       "supplied-air protection.")
        else:
            out.append(f"{who}: oxygen stays above the {z.oxygen_alarm:g} % alarm (lowest "
                       f"{z.lowest_oxygen:.3g} %).")
    return out


def _indoor_run(scenario: Scenario, spill: dict, liq, geometry: dict):
    """The spill in its room: the run, the pool area, each zone's flammability and
    exposures, and what happened to the pool."""
    from .spill import indoor_spill

    t = spill["temperature"]
    pressure = scenario.pressure
    findings: list[str] = []
    exposures = []
    room = next(r for r in scenario.rooms if r["name"] == spill["room"])
    air_speed = room["air_speed"]
    two_zone = {}
    if room.get("near_field_radius"):
        from .indoor import interzonal_airflow, near_field_hemisphere

        geo = near_field_hemisphere(room["near_field_radius"])
        two_zone = dict(near_field_volume=geo.volume,
                        interzonal_flow=interzonal_airflow(geo.free_surface_area,
                                                           room["random_air_speed"]))
    amount = ({"spilled_volume": spill["volume"]} if spill.get("volume")
              else {"spilled_mass": spill["mass"]})
    indoor = indoor_spill(
        liq, t, room_volume=room["volume"], ventilation_rate=room["ventilation_rate"],
        mixing_factor=room["mixing_factor"], air_speed=air_speed,
        duration=spill["duration"], source_removed_at=spill.get("cleanup_after"),
        model=spill["model"], pressure=pressure, **amount, **two_zone, **geometry)
    area = indoor.pool_area
    zones = [("room", "far field" if two_zone else "room")]
    if two_zone:
        zones.insert(0, ("near_field", "near field"))
    flammability = [_zone_flammability(indoor, zone, label, liq, scenario.alarms)
                    for zone, label in zones]
    findings.extend(_flammability_findings(flammability, indoor.times[-1]))
    for zone, label in zones:
        ppm = indoor.ppm(zone)
        for j, c in enumerate(liq.components):
            exposures.append(_zone_exposure(label, c.key, indoor.times, ppm[:, j],
                                            scenario.limits, scenario.shift, t,
                                            pressure))
    gone = indoor.pool_gone_time
    removed = indoor.source_removed_time
    left = float(indoor.mass_remaining[-1].sum())
    if math.isfinite(gone):
        text = f"The pool ({format_number(area)} m²) has evaporated after {gone / 60:.0f} min."
    elif removed is not None and removed < indoor.times[-1]:
        at = int(np.searchsorted(indoor.times, removed))
        text = (f"The pool ({format_number(area)} m²) is cleaned up at {removed / 60:.0f} min "
                f"with {format_number(float(indoor.mass_remaining[at].sum()))} kg still in it.")
    else:
        text = (f"The pool ({format_number(area)} m²) still holds {format_number(left)} kg at the end "
                "of the run.")
    findings.append(text)
    return indoor, area, flammability, exposures, findings


def _outdoor_run(scenario: Scenario, spill: dict, liq, geometry: dict, notes: list):
    """The spill outdoors: stability class, wind at 10 m, the run, and the distances
    to each limit."""
    from .spill import outdoor_spill

    t = spill["temperature"]
    pressure = scenario.pressure
    findings: list[str] = []
    distances = []
    od = scenario.outdoors
    stability = od.get("stability")
    if stability is None:
        from .outdoor import stability_class

        stability = stability_class(od["wind_speed"], od.get("daytime", True),
                                    od.get("insolation"), od.get("cloud_cover"))
        notes.append(f"stability class {stability} from the wind speed and "
                     f"{'insolation' if od.get('daytime', True) else 'cloud cover'}")
    wind = od["wind_speed"]
    if od.get("wind_height", 10.0) != 10.0:
        from .outdoor import wind_speed_at_height

        wind = wind_speed_at_height(od["wind_speed"], 10.0, od["wind_height"],
                                    stability.split("-")[-1], od["terrain"])
        notes.append(f"wind speed {format_number(od['wind_speed'], 2)} m/s at "
                     f"{od['wind_height']:g} m taken to {format_number(wind, 2)} m/s at 10 m "
                     "(power law)")
    volume = spill.get("volume") or spill["mass"] / _density(liq)
    outdoor = outdoor_spill(liq, t, od["receptors"], wind_speed=wind,
                            stability=stability, terrain=od["terrain"],
                            spilled_volume=volume, model=spill["model"],
                            pressure=pressure, **geometry,
                            lfl_alarm_percent=scenario.alarms.percent_lfl)
    for lim in scenario.limits:
        keys = [c.key for c in liq.components]
        if lim.substance not in keys:
            continue
        d, note = outdoor.distance_above(
            lim.volume_fraction_at(t, pressure), keys.index(lim.substance))
        from .spill import MAX_OUTDOOR_DISTANCE

        d = 0.0 if d is None else (None if d >= MAX_OUTDOOR_DISTANCE else d)
        distances.append((lim.label, d, note))
    findings.append(f"Release rate to air {format_number(1000 * outdoor.emission_rate.sum())} g/s "
                    f"(initial evaporation rate), stability class {stability}.")
    findings += _outdoor_lfl_findings(outdoor)
    return outdoor, wind, distances, findings


def _initial_rates(scenario: Scenario, spill: dict, liq, area, wind, notes: list) -> dict:
    """Initial evaporation rate of the spill by each model [kg/s], for comparison."""
    from .evaporation import mixture_evaporation_rates

    t = spill["temperature"]
    pressure = scenario.pressure
    rates = {}
    area_for_rates = area if area is not None else None
    if area_for_rates is None:
        from .evaporation import spill_pool_area

        area_for_rates = spill.get("area") or spill_pool_area(
            spill.get("volume") or spill["mass"] / _density(liq), spill.get("dike_area"),
            spill.get("depth", 0.01))
    speed = (next(r for r in scenario.rooms if r["name"] == spill["room"])["air_speed"]
             if spill.get("room") else wind)
    for model in ("mackay-matsugu", "epa-rmp"):
        try:
            rates[model] = float(np.sum(mixture_evaporation_rates(
                liq.components, liq.mole_fractions, t, area_for_rates, speed,
                liq.activity_coefficients, model, pressure)))
        except UllageError as exc:
            notes.append(f"{model}: {exc}")
    return rates


def _exposure_findings(exposures) -> list[str]:
    """One sentence per exposure comparison of every zone and substance."""
    findings = []
    for e in exposures:
        for label, limit_ppm, ratio, first, back in e.comparisons:
            verb = "exceeds" if ratio > 1 else "reaches" if ratio == 1 else "stays below"
            text = (f"{e.zone}, {e.substance}: {_WINDOW[label.split()[0]]} {verb} the "
                    f"{label} (ratio {format_number(ratio)})")
            if label.startswith("TWA") and e.twa_lower_bound:
                text += (" — a lower bound: the run is shorter than the work shift and the "
                         "rest of the shift counts as no exposure; run the full shift")
            if first is not None:
                text += f"; above {format_number(limit_ppm)} ppm from {first / 60:.0f} min"
                text += (f", back below at {back / 60:.0f} min" if back is not None
                         else ", not back below within the run")
            findings.append(text + ".")
    return findings


def _distance_findings(distances) -> list[str]:
    """One sentence per limit on how far downwind the centreline stays above it."""
    findings = []
    for label, d, note in distances:
        if d is None:
            text = f"Downwind, the {label} is exceeded beyond the farthest distance computed"
        elif d == 0:
            text = f"Downwind, the centreline stays below the {label}"
        else:
            text = (f"Downwind, the centreline stays above the {label} out to about "
                    f"{d:,.0f} m")
            if d < 100:
                text += " (under 100 m, outside the range of the dispersion coefficients)"
        findings.append(text + ".")
    return findings


def _spill(scenario: Scenario, spill: dict) -> SpillResult:
    entry = scenario.liquids[spill["liquid"]]
    liq = build_liquid(entry)
    notes: list[str] = []
    geometry = dict(area=spill.get("area"), dike_area=spill.get("dike_area"))
    if spill.get("depth") is not None:
        geometry["depth"] = spill["depth"]
    distances = []
    flammability = []
    exposures = []
    indoor = outdoor = None
    area = wind = None
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        if spill.get("room"):
            indoor, area, flammability, exposures, findings = _indoor_run(
                scenario, spill, liq, geometry)
        else:
            outdoor, wind, distances, findings = _outdoor_run(scenario, spill, liq, geometry,
                                                              notes)
        rates = _initial_rates(scenario, spill, liq, area, wind, notes)
    notes.extend(str(w.message) for w in caught)
    notes.extend(n for c in liq.components for n in c.notes)
    run = indoor or outdoor
    notes.extend(run.warnings)
    findings += _exposure_findings(exposures)
    findings += _distance_findings(distances)
    return SpillResult(
        name=spill["name"], liquid=spill["liquid"], where=spill.get("room") or "outdoors",
        indoor=indoor, outdoor=outdoor, initial_rates=rates, exposures=tuple(exposures),
        distances=tuple(distances), findings=tuple(findings),
        warnings=tuple(dict.fromkeys(notes)), flammability=tuple(flammability))


def _outdoor_lfl_findings(outdoor) -> list[str]:
    """Downwind flammability verdicts: distances to the LFL and the LFL alarm, the
    saturation cap and the dense-gas criterion, in plain words."""
    out = []
    alarm = outdoor.lfl_alarm_percent
    if np.any(np.isfinite(outdoor.lower_flammability_limits)):
        for what, d, flags in (("the LFL", outdoor.distance_to_lfl, outdoor.lfl_flags),
                               (f"{alarm:g} % of the LFL (the alarm level)",
                                outdoor.distance_to_lfl_alarm, outdoor.lfl_alarm_flags)):
            if d is None:
                out.append(f"Downwind, the centreline is below {what} from the pool edge "
                           f"({outdoor.pool_edge:.2g} m) on.")
            else:
                said = f" ({'; '.join(flags)})" if flags else ""
                out.append(f"Downwind, the centreline is at or above {what} out to about "
                           f"{d:,.0f} m{said}: remove ignition sources within that distance.")
    if outdoor.capped_until is not None:
        out.append(f"Near the pool, out to about {outdoor.capped_until:,.0f} m, the "
                   "centreline is capped at the saturated vapour concentration over the "
                   "pool (the most the pool can give).")
    if outdoor.dense_gas is not None:
        dg = outdoor.dense_gas
        out.append(f"Britter-McQuaid dense-gas criterion {dg.value:.2g} (threshold "
                   f"{dg.threshold:g}): " + ("density effects matter; use a dense-gas model."
                                             if dg.dense else "density effects do not matter."))
    return out


def _density(liq) -> float:
    from .spill import liquid_mixture_density

    return liquid_mixture_density(liq)


def _monte_carlo_findings(mc) -> list[str]:
    out = [f"Probabilistic screening, {mc.n:,} samples (seed {mc.seed}):"]
    from .limits import format_ppm

    for name, table in mc.percentiles.items():
        unit = mc.units.get(name, "")
        median, high = table[50], table[95]
        if unit == "s":
            median, high, unit = median / 60.0, high / 60.0, "min"
        text = "" if unit in ("", "-") else " " + unit
        out.append(f"  {name.replace('_', ' ')}: median {format_ppm(median)}{text}, 95th "
                   f"percentile {format_ppm(high)}{text}")
    for label, probability in mc.exceedance.items():
        out.append(f"  probability of exceeding {label}: {format_number(100 * probability)} %")
    for output, ranks in list(mc.sensitivity.items())[:1]:
        if ranks:
            top, rho = next(iter(ranks.items()))
            out.append(f"  the spread of {output} is driven most by {top} (rank "
                       f"correlation {rho:.2f})")
    return out


def _uncertain_inputs(scenario, name):
    return {u["input"]: u["distribution"] for u in scenario.uncertain if u["item"] == name}


def _tank_monte_carlo(scenario, tank, result):
    from .uncertainty import headspace_monte_carlo

    inputs = _uncertain_inputs(scenario, tank["name"])
    entry = scenario.liquids[tank["liquid"]]
    if entry["kind"] == "water":
        raise InputError("uncertain", "probabilistic screening of water with dissolved "
                         "volatiles is not available")
    mc = scenario.monte_carlo
    # a liquid from a safety data sheet brings its ranges as composition uncertainty
    notes = (entry["composition_method"],) if entry.get("composition") else ()
    return notes, headspace_monte_carlo(
        result.headspace.liquid, inputs.get("temperature", tank["temperature"]),
        result.pressure, scenario.limits, n=mc["samples"], seed=mc["seed"],
        include_method_uncertainty=mc["method_uncertainty"],
        lfl_alarm=scenario.alarms.percent_lfl, oxygen_alarm=scenario.alarms.oxygen_low,
        composition=entry.get("composition"),
        composition_basis=entry.get("composition_basis", "mole"))


def _spill_monte_carlo(scenario, spill, result):
    from .uncertainty import indoor_spill_monte_carlo

    inputs = _uncertain_inputs(scenario, spill["name"])
    room = next(r for r in scenario.rooms if r["name"] == spill["room"])
    run = result.indoor
    mass = float(run.initial_mass.sum())
    mc = scenario.monte_carlo
    entry = scenario.liquids[spill["liquid"]]
    notes = []
    if room.get("near_field_radius"):
        notes.append("the probabilistic chain uses the well-mixed room (no near field): "
                     "compare its results with the deterministic far field")
    return notes, indoor_spill_monte_carlo(
        entry["spec"], inputs.get("temperature", spill["temperature"]),
        inputs.get("area", run.pool_area), inputs.get("air_speed", room["air_speed"]),
        room["volume"], inputs.get("ventilation_rate", room["ventilation_rate"]),
        inputs.get("mixing_factor", room["mixing_factor"]), inputs.get("mass", mass),
        scenario.limits, duration=spill["duration"], n=mc["samples"], seed=mc["seed"],
        include_method_uncertainty=mc["method_uncertainty"], pressure=scenario.pressure,
        source_removed_at=spill.get("cleanup_after"), lfl_alarm=scenario.alarms.percent_lfl)


def _with_monte_carlo(result, mc, notes=()):
    from dataclasses import replace

    return replace(result, monte_carlo=mc,
                   findings=result.findings + tuple(_monte_carlo_findings(mc)),
                   warnings=result.warnings + tuple(notes) + tuple(mc.warnings))


def run_scenario(scenario: Scenario) -> ScenarioResult:
    """Run every tank and spill of a scenario.

    An item that cannot be computed is reported in `errors` with the reason; the
    others are still computed.
    """
    errors = []
    uncertain = {u["item"] for u in scenario.uncertain}

    def screen(kind, item, deterministic, probabilistic):
        try:
            result = deterministic(scenario, item)
        except UllageError as exc:
            errors.append((f"{kind} {item['name']}", str(exc)))
            return None
        if item["name"] in uncertain:
            try:
                notes, mc = probabilistic(scenario, item, result)
                result = _with_monte_carlo(result, mc, notes)
            except UllageError as exc:
                errors.append((f"{kind} {item['name']} (probabilistic)", str(exc)))
        return result

    tanks = [r for r in (screen("tank", t, screen_tank, _tank_monte_carlo)
                         for t in scenario.tanks) if r is not None]
    spills = [r for r in (screen("spill", sp, _spill, _spill_monte_carlo)
                          for sp in scenario.spills) if r is not None]
    return ScenarioResult(scenario, tuple(tanks), tuple(spills), tuple(errors),
                          scenario.assumptions)
