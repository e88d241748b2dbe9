"""JSON export: every number in SI units (and ppm where relevant) with the inputs."""

from __future__ import annotations

import datetime as _dt
import json
import math
from pathlib import Path

import numpy as np

from .common import (
    MAX_SERIES_POINTS, indoor_zones, limit_for, method_rows, spill_input, spill_keys,
    tank_cases, timestamp,
)

def _monte_carlo_dict(mc):
    if mc is None:
        return None
    return {"model": mc.model, "samples": mc.n, "seed": mc.seed, "inputs": dict(mc.inputs),
            "units": dict(mc.units),
            "percentiles": {k: {str(q): v for q, v in dict(t).items()}
                            for k, t in dict(mc.percentiles).items()},
            "exceedance_probability": dict(mc.exceedance),
            "sensitivity_rank_correlation": {k: dict(v) for k, v in dict(mc.sensitivity).items()},
            "warnings": list(mc.warnings),
            "samples_exported": False,
            "note": "summary statistics only; the seed and inputs reproduce the samples"}


# ---------------------------------------------------------------------------
# JSON

def _plain(value, path: str, nulls: list):
    """JSON-safe copy: numpy to Python, non-finite floats to None (path recorded)."""
    if isinstance(value, np.ndarray):
        value = value.tolist()
    elif isinstance(value, np.generic):
        value = value.item()
    if value is None or isinstance(value, (bool, str, int)):
        return value
    if isinstance(value, float):
        if math.isfinite(value):
            return value
        nulls.append(path)
        return None
    if isinstance(value, (_dt.datetime, _dt.date, _dt.time)):
        return value.isoformat()
    if isinstance(value, dict) or hasattr(value, "items"):
        return {str(k): _plain(v, f"{path}.{k}" if path else str(k), nulls)
                for k, v in value.items()}
    if isinstance(value, (list, tuple)):
        return [_plain(v, f"{path}[{i}]" if isinstance(v, (dict, list, tuple)) and
                       not _numeric_list(v) else path, nulls) for i, v in enumerate(value)]
    return str(value)


def _numeric_list(value) -> bool:
    return isinstance(value, (list, tuple)) and all(
        isinstance(v, (int, float, list, tuple)) and not isinstance(v, bool) and
        (not isinstance(v, (list, tuple)) or _numeric_list(v)) for v in value)


def _sample(n: int, peaks: list[np.ndarray]) -> tuple[np.ndarray, dict]:
    """Indices kept of a series of n points, and what was done."""
    if n <= MAX_SERIES_POINTS:
        return np.arange(n), {"points": n, "downsampled": False}
    extra = set()
    for y in peaks:
        y = np.asarray(y, dtype=float)
        if y.size == n and np.any(np.isfinite(y)):
            extra.add(int(np.nanargmax(y)))
    base = np.linspace(0, n - 1, MAX_SERIES_POINTS - len(extra)).round().astype(int)
    keep = np.array(sorted(set(base.tolist()) | extra))
    return keep, {"points": int(keep.size), "downsampled": True, "original_points": n,
                  "method": f"evenly spaced samples plus each concentration's peak, to at "
                            f"most {MAX_SERIES_POINTS} points; the exposure metrics were "
                            "computed on the full series"}


def _limit_dict(lim) -> dict:
    return {"substance": lim.substance, "kind": lim.kind, "value": lim.value,
            "unit": lim.unit, "source": lim.source, "label": lim.label,
            "volume_fraction": lim.volume_fraction, "ppm": lim.ppm,
            "compared_as": ("volume fraction" if lim.unit == "ppm" else
                            "mass concentration at the actual temperature and pressure")}


def _headspace_dict(hs, comparisons=(), additive=None) -> dict:
    comps = list(hs.liquid.components)
    ppm = np.asarray(hs.ppm, dtype=float)
    out = {
        "temperature_k": hs.temperature,
        "pressure_pa": hs.pressure,
        "components": [],
        "total_volume_fraction": hs.total_volume_fraction,
        "total_ppm": hs.total_ppm,
        "total_mass_concentration_kg_per_m3": np.asarray(hs.mass_concentrations,
                                                         dtype=float).sum(axis=0),
        "total_mg_per_m3": hs.total_mg_per_m3,
        "lfl_mixture_volume_fraction": hs.lfl_mixture,
        "ufl_mixture_volume_fraction": hs.ufl_mixture,
        "percent_lfl": hs.percent_lfl,
        "oxygen_percent": hs.oxygen_percent,
        "boiling": np.asarray(hs.boiling),
        "flammability": np.asarray(hs.flammability),
        "relative_uncertainty": hs.relative_uncertainty,
        "warnings": list(hs.warnings),
    }
    if np.ndim(hs.temperature) == 0:
        out["flammability_words"] = hs.flammability_words
    for j, comp in enumerate(comps):
        out["components"].append({
            "key": comp.key, "name": comp.name,
            "saturation_pressure_pa": np.asarray(hs.saturation_pressures)[j],
            "partial_pressure_pa": np.asarray(hs.partial_pressures)[j],
            "volume_fraction": np.asarray(hs.volume_fractions)[j],
            "ppm": ppm[j],
            "mass_concentration_kg_per_m3": np.asarray(hs.mass_concentrations)[j],
            "mg_per_m3": np.asarray(hs.mg_per_m3)[j],
        })
    if comparisons or additive is not None:
        out["comparisons"] = [{"limit": _limit_dict(c.limit), "volume_fraction": c.concentration,
                               "ppm": c.concentration * 1e6, "ratio": c.ratio,
                               "exceeded": c.exceeded} for c in comparisons]
        out["additive_index_twa"] = additive
    return out


def _tank_case_dict(tank, case, t, h, comparisons, additive) -> dict:
    """One case of a tank: the headspace, the vapour-pressure methods and the terms
    of the additive index."""
    data = _headspace_dict(h, comparisons, additive)
    data["vapor_pressure_methods"] = [
        {"substance": comp.key, "method": method, "description": desc,
         "relative_uncertainty": next((e.relative_uncertainty for e in
                                       h.vapor_pressure_methods if e.method == method
                                       and e.source == source), None),
         "uncertainty_basis": basis, "source": source, "why": why}
        for comp, method, desc, _, basis, source, why in method_rows(h, t)]
    terms = tank.additive_terms if case == "stated" else tank.worst_additive_terms
    if terms is not None:
        data["additive_index_twa_terms"] = [
            {"substance": key, "limit": lim.label, "ratio": ratio}
            for key, lim, ratio in terms.terms]
    return data


def _masses_dict(obj, extra=()):
    """Vapour masses by substance and in all, with more attributes (attribute, key)."""
    if obj is None:
        return None
    d = {"names": list(obj.names), "masses_kg": np.atleast_1d(obj.masses),
         "total_mass_kg": obj.total_mass}
    for attr, key in extra:
        d[key] = getattr(obj, attr)
    return d


def _tank_temperatures(tank) -> dict:
    """Flash point, boiling temperature, the temperature at the LFL alarm and the
    vapour hazard ratios."""
    fp = tank.flash_point
    bt = getattr(tank, "boiling", None)
    return {
        "flash_point": None if fp is None else {
            "estimate_k": fp.estimate, "published_k": fp.published,
            "published_source": fp.published_source, "note": fp.note,
            "flammable_whenever_liquid": fp.flammable_whenever_liquid},
        "boiling_temperature": None if bt is None else {
            "temperature_k": bt.temperature, "temperature_c": bt.temperature - 273.15,
            "pressure_pa": bt.pressure, "uncertainty_k": bt.uncertainty, "method": bt.method,
            "near_boiling": list(tank.near_boiling)},
        "alarm_temperature_k": tank.alarm_temperature,
        "hazard_ratios": dict(tank.hazard_ratios),
    }


def _purge_dict(p):
    if p is None:
        return None
    return {
        "time_s": p.time, "initial_volume_fraction": p.initial_volume_fraction,
        "target_volume_fraction": p.target_volume_fraction,
        "target_ppm": p.target_volume_fraction * 1e6,
        "floor_volume_fraction": p.floor_volume_fraction,
        "residual_evaporation_kg_per_s": p.residual_evaporation, "reachable": p.reachable,
        "note": p.note, "case": p.case, "case_words": p.case_words, "volume_m3": p.volume}


def _tank_dict(result, tank) -> dict:
    hs = tank.headspace
    out = {
        "name": tank.name, "liquid": tank.liquid, "pressure_pa": tank.pressure,
        "temperature_k": tank.temperature, "worst_temperature_k": tank.worst_temperature,
        "components": [{
            "key": c.key, "name": c.name, "cas": c.cas, "origin": c.origin,
            "liquid_mole_fraction": float(np.asarray(hs.liquid.mole_fractions)[j]),
            "molar_mass_kg_per_mol": c.molar_mass, "sources": dict(c.sources)}
            for j, c in enumerate(hs.liquid.components)],
        "activity_source": hs.liquid.activity_source,
        "cases": {},
    }
    for case, t, h, comparisons, additive in tank_cases(tank):
        out["cases"]["stated" if case == "stated" else "worst"] = _tank_case_dict(
            tank, case, t, h, comparisons, additive)
    if tank.sweep is not None:
        sweep = _headspace_dict(tank.sweep)
        sweep.pop("warnings", None)
        out["sweep"] = sweep
        n = int(np.size(tank.sweep.temperature))
        out["sweep"]["series"] = {"points": n, "downsampled": False}
    else:
        out["sweep"] = None
    out.update(_tank_temperatures(tank))
    out["inventory"] = _masses_dict(tank.inventory, [("volume", "volume_m3")])
    out["filling"] = _masses_dict(tank.filling, [("volume", "volume_pumped_m3")])
    out["breathing"] = _masses_dict(tank.breathing, [("gas_vented", "gas_vented_mol")])
    out["purge"] = _purge_dict(tank.purge)
    out["monte_carlo"] = _monte_carlo_dict(getattr(tank, "monte_carlo", None))
    out["findings"] = list(tank.findings)
    out["warnings"] = list(tank.warnings)
    return out


def _flammability_dict(z) -> dict:
    """One zone's flammability verdicts; the first nine keys are a promise to scripts."""
    return {
        "zone": z.zone, "peak_percent_lfl": z.peak_percent_lfl, "peak_time_s": z.peak_time,
        "above_alarm_from_s": z.above_alarm_from, "back_below_alarm_s": z.back_below_alarm,
        "above_lfl_from_s": z.above_lfl_from, "back_below_lfl_s": z.back_below_lfl,
        "lowest_oxygen_percent": z.lowest_oxygen,
        "below_oxygen_alarm_from_s": z.below_oxygen_alarm_from,
        "judged": z.judged, "lowest_oxygen_time_s": z.lowest_oxygen_time,
        "back_above_oxygen_alarm_s": z.back_above_oxygen_alarm,
        "above_ufl_from_s": z.rich_from, "back_below_ufl_s": z.back_below_ufl,
        "alarm_percent_lfl": z.alarm_percent_lfl, "oxygen_alarm_percent": z.oxygen_alarm,
    }


def _by_key(keys, values) -> dict:
    """Substance key -> value, for values given per component."""
    return {k: v for k, v in zip(keys, np.atleast_1d(values))}


def _indoor_dict(ind, names, keys) -> dict:
    """An indoor spill: the pool and the room, with its time series (downsampled when long)."""
    zones = indoor_zones(ind)
    ppm = {zone: np.asarray(ind.ppm(zone), dtype=float) for zone, _ in zones}
    keep, info = _sample(np.size(ind.times), [p[:, j] for p in ppm.values()
                                              for j in range(len(names))])
    series = {"times_s": np.asarray(ind.times, dtype=float)[keep], **info}
    for zone, label in zones:
        conc = np.asarray(ind.room if zone == "room" else ind.near_field, dtype=float)
        series[label] = {
            "ppm": {k: ppm[zone][keep, j] for j, k in enumerate(keys)},
            "mass_concentration_kg_per_m3": {k: conc[keep, j] for j, k in enumerate(keys)}}
    series["mass_remaining_kg"] = {k: np.asarray(ind.mass_remaining)[keep, j]
                                   for j, k in enumerate(keys)}
    series["evaporation_rate_kg_per_s"] = {k: np.asarray(ind.evaporation_rate)[keep, j]
                                           for j, k in enumerate(keys)}
    return {
        "zone_model": ind.model, "temperature_k": ind.temperature,
        "pressure_pa": ind.pressure, "pool_area_m2": ind.pool_area,
        "pool_gone_time_s": ind.pool_gone_time,
        "source_removed_time_s": ind.source_removed_time,
        "initial_mass_kg": _by_key(keys, ind.initial_mass),
        "saturation_kg_per_m3": _by_key(keys, ind.saturation),
        "molar_mass_kg_per_mol": _by_key(keys, ind.molar_masses),
        "mass_balance_error": ind.mass_balance_error, "series": series}


def _dense_gas_dict(dg):
    if dg is None:
        return None
    return {
        "criterion": "Britter-McQuaid continuous release (g0' q0 / D)^(1/3) / U",
        "value": dg.value, "threshold": dg.threshold,
        "density_effects_matter": dg.dense,
        "mixture_density_kg_per_m3": dg.mixture_density,
        "air_density_kg_per_m3": dg.air_density,
        "volume_rate_m3_per_s": dg.volume_rate,
        "source_dimension_m": dg.source_dimension}


def _outdoor_dict(od, keys) -> dict:
    """An outdoor spill: the plume, its flammability and its centreline."""
    y = np.asarray(od.volume_fraction, dtype=float)
    c = np.asarray(od.concentration, dtype=float)
    return {
        "stability": od.stability, "terrain": od.terrain, "wind_speed_m_per_s": od.wind_speed,
        "emission_rate_kg_per_s": _by_key(keys, od.emission_rate),
        "distances_m": np.asarray(od.distances, dtype=float),
        "pool_edge_m": od.pool_edge,
        "distance_to_lfl_m": od.distance_to_lfl,
        "distance_to_lfl_alarm_m": od.distance_to_lfl_alarm,
        "lfl_alarm_percent": od.lfl_alarm_percent,
        "distance_to_lfl_flags": list(od.lfl_flags),
        "distance_to_lfl_alarm_flags": list(od.lfl_alarm_flags),
        "percent_lfl": (None if od.percent_lfl is None
                        else np.asarray(od.percent_lfl, dtype=float)),
        "saturation_volume_fraction": (
            None if od.saturation_volume_fraction is None else
            _by_key(keys, od.saturation_volume_fraction)),
        "saturation_cap_until_m": od.capped_until,
        "dense_gas": _dense_gas_dict(od.dense_gas),
        "centreline": {k: {"volume_fraction": y[:, j], "ppm": y[:, j] * 1e6,
                           "concentration_kg_per_m3": c[:, j]} for j, k in enumerate(keys)}}


def _exposure_dicts(result, spill) -> list:
    """Exposure metrics by zone and substance, with their comparison with each limit."""
    return [{
        "zone": e.zone, "substance": e.substance, "peak_ppm": e.peak,
        "peak_time_s": e.peak_time, "twa_8h_ppm": e.twa, "highest_15min_ppm": e.short_term,
        "comparisons": [{"limit": label, "limit_ppm": limit_ppm, "ratio": ratio,
                         "source": getattr(limit_for(result, e.substance, label), "source", None),
                         "first_above_s": first, "back_below_s": back}
                        for label, limit_ppm, ratio, first, back in e.comparisons]}
        for e in spill.exposures]


def _spill_dict(result, spill) -> dict:
    spec = spill_input(result, spill)
    run = spill.indoor or spill.outdoor
    names = list(run.components)
    keys = spill_keys(result, spill, names)
    out = {"name": spill.name, "liquid": spill.liquid, "where": spill.where,
           "evaporation_model": spec.get("model", "mackay-matsugu"),
           "components": [{"key": k, "name": n} for k, n in zip(keys, names)],
           "initial_evaporation_rates_kg_per_s": dict(spill.initial_rates),
           "indoor": None, "outdoor": None}
    if spill.indoor is not None:
        out["indoor"] = _indoor_dict(spill.indoor, names, keys)
    if spill.outdoor is not None:
        out["outdoor"] = _outdoor_dict(spill.outdoor, keys)
    out["flammability"] = [_flammability_dict(z) for z in spill.flammability]
    out["exposures"] = _exposure_dicts(result, spill)
    out["distances"] = [{
        "limit": label, "source": next((lim.source for lim in result.scenario.limits
                                        if lim.label == label), None),
        "distance_m": d, "beyond_farthest_computed": d is None, "note": note}
        for label, d, note in spill.distances]
    out["monte_carlo"] = _monte_carlo_dict(getattr(spill, "monte_carlo", None))
    out["findings"] = list(spill.findings)
    out["warnings"] = list(spill.warnings)
    return out


def result_to_dict(result, *, generated_at=None) -> dict:
    """Everything a run produced, as JSON-safe Python data in SI units (and ppm).

    Non-finite numbers (an infinite time for a target never reached, NaN where a
    quantity does not apply) are written as None (JSON null); ``null_values``
    lists where. Time series longer than `MAX_SERIES_POINTS` are downsampled and
    say so in their ``series`` entry.

    Parameters
    ----------
    result : ScenarioResult
    generated_at : datetime or str, optional
        Time stamp; now (UTC) by default.

    Returns
    -------
    dict
    """
    scenario = result.scenario
    raw = {
        "format": "ullage screening results",
        "ullage_version": result.version,
        "generated_at": timestamp(generated_at).isoformat().replace("+00:00", "Z"),
        "title": scenario.title,
        "cautions": list(result.cautions),
        "units": "SI: temperatures K, pressures Pa, masses kg, lengths m, times s, rates "
                 "kg/s, mass concentrations kg/m3 (mg_per_m3 fields in mg/m3); "
                 "concentrations also as volume fractions and ppm by volume; percentages %",
        "inputs": scenario.document,
        "source_file": Path(scenario.source_path).name if scenario.source_path else None,
        "pressure_pa": scenario.pressure,
        "air_temperature_k": scenario.air_temperature,
        "alarms": {"percent_lfl": scenario.alarms.percent_lfl,
                   "oxygen_low_percent": scenario.alarms.oxygen_low,
                   "oxygen_high_percent": scenario.alarms.oxygen_high,
                   "source": scenario.alarms.source},
        "shift": {"start_s": scenario.shift.start, "duration_s": scenario.shift.duration},
        "limits": [_limit_dict(lim) for lim in scenario.limits],
        "assumptions": list(result.assumptions),
        "exceeded": result.exceeded,
        "tanks": [_tank_dict(result, t) for t in result.tanks],
        "spills": [_spill_dict(result, s) for s in result.spills],
        "errors": [{"item": item, "message": message} for item, message in result.errors],
        "max_series_points": MAX_SERIES_POINTS,
    }
    nulls: list[str] = []
    out = _plain(raw, "", nulls)
    out["null_values"] = {
        "meaning": "null is a value not given, not applicable, or not finite (NaN or "
                   "infinity, such as a time never reached); these fields held a "
                   "non-finite number",
        "fields": list(dict.fromkeys(nulls)),
    }
    return out


def results_json(result, *, generated_at=None, indent: int = 2) -> str:
    """`result_to_dict` as JSON text (strict: no NaN or Infinity)."""
    return json.dumps(result_to_dict(result, generated_at=generated_at), indent=indent,
                      ensure_ascii=False, allow_nan=False) + "\n"
