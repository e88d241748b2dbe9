"""CSV export: a tidy long table of results with the cautions as its last rows."""

from __future__ import annotations

import csv
import io
import math

import numpy as np

from ..files import neutralise_cell
from .common import (
    CSV_COLUMNS, NOT_XML, as_written, limit_for, method_rows, result_items, spill_input,
    spill_keys, spill_substances, tank_cases, timestamp, unit_text,
)

def _monte_carlo_rows(row, item, mc) -> None:
    if mc is None:
        return
    note = f"{mc.n} samples, seed {mc.seed}"
    for name, table in dict(mc.percentiles).items():
        unit = unit_text(dict(mc.units).get(name)) or "1"
        for q, v in dict(table).items():
            row(item, "probabilistic", f"{q}{'st' if q == 1 else 'th'} percentile", "", name,
                v, unit, note=note)
    for label, p in dict(mc.exceedance).items():
        row(item, "probabilistic", "exceedance", "", "probability of exceeding", p, "1",
            limit=label, note=note)


# ---------------------------------------------------------------------------
# CSV

def _outdoor_flammability_rows(row, item, od) -> None:
    """CSV rows of the downwind flammability verdicts."""
    if od.percent_lfl is not None and np.any(np.isfinite(od.lower_flammability_limits)):
        for what, d, flags in (("distance to the LFL", od.distance_to_lfl, od.lfl_flags),
                               (f"distance to the LFL alarm ({od.lfl_alarm_percent:g} % LFL)",
                                od.distance_to_lfl_alarm, od.lfl_alarm_flags)):
            row(item, "flammability", "outdoors", "all vapour", what, d, "m",
                note="never reached (below it at the pool edge)" if d is None
                else "; ".join(flags))
        for d, p in zip(np.asarray(od.distances, dtype=float), od.percent_lfl):
            row(item, "flammability", f"{d:g} m downwind", "all vapour", "% of the LFL", p, "%")
    if od.capped_until is not None:
        row(item, "centreline", "outdoors", "all vapour",
            "capped at the saturated vapour concentration out to", od.capped_until, "m")
    if od.dense_gas is not None:
        row(item, "dense gas", "outdoors", "all vapour", "Britter-McQuaid criterion",
            od.dense_gas.value, "1", limit=f"{od.dense_gas.threshold:g}",
            note="density effects matter" if od.dense_gas.dense else "passive dispersion")


def _row_sink(rows: list):
    """A function that appends one CSV row (a dict by column) to `rows`, with
    numbers that are not finite left empty and noted."""

    def row(item, kind, case="", substance="", quantity="", value=None, unit="", limit="",
            limit_source="", ratio=None, note=""):
        cells = {"item": item, "kind": kind, "case": case, "substance": substance,
                 "quantity": quantity, "value": value, "unit": unit, "limit": limit,
                 "limit_source": limit_source, "ratio": ratio, "note": note}
        for key in ("value", "ratio"):
            v = cells[key]
            if v is not None and not isinstance(v, str):
                v = float(v)
                if not math.isfinite(v):
                    cells["note"] = (cells["note"] + "; " if cells["note"] else "") + (
                        f"{key} not finite ({v})")
                    v = None
            cells[key] = "" if v is None else v
        rows.append(cells)

    return row


def _scenario_rows(row, result, generated_at) -> None:
    """Rows of the scenario head, the inputs as written, limits, alarms, assumptions."""
    scenario = result.scenario
    head = dict(scenario.document.get("scenario", {}))
    row("scenario", "scenario", quantity="title", note=scenario.title)
    for key in ("site", "description"):
        if key in head:
            row("scenario", "scenario", quantity=key, note=as_written(head[key]))
    row("scenario", "scenario", quantity="ullage version", note=result.version)
    row("scenario", "scenario", quantity="generated",
        note=timestamp(generated_at).isoformat().replace("+00:00", "Z"))
    row("scenario", "scenario", quantity="barometric pressure", value=scenario.pressure,
        unit="Pa")
    for section, content in scenario.document.items():
        items = content if isinstance(content, (list, tuple)) else [content]
        for i, item in enumerate(items):
            if not hasattr(item, "items"):
                continue
            label = f"[[{section}]] {i + 1}" if isinstance(content, (list, tuple)) else f"[{section}]"
            for key, value in item.items():
                row(label, "input", quantity=key, note=as_written(value))
    for lim in scenario.limits:
        row("limits", "limit", substance=lim.substance, quantity=lim.kind, value=lim.value,
            unit=lim.unit, limit=lim.label, limit_source=lim.source,
            note=f"{lim.ppm!r} ppm")
    al = scenario.alarms
    row("alarms", "alarm", quantity="% LFL alarm", value=al.percent_lfl, unit="%",
        limit_source=al.source)
    row("alarms", "alarm", quantity="oxygen low", value=al.oxygen_low, unit="%",
        limit_source=al.source)
    row("alarms", "alarm", quantity="oxygen high", value=al.oxygen_high, unit="%",
        limit_source=al.source)
    for text in result.assumptions:
        row("assumptions", "assumption", note=text)


def _tank_case_rows(row, item, tank, al) -> None:
    """Rows of each temperature case of a tank: headspace, flammability, comparisons."""
    for case, t, hs, comparisons, additive in tank_cases(tank):
        label = f"{case} {float(t) - 273.15:.1f} °C"
        row(item, "headspace", label, quantity="temperature", value=t, unit="K")
        for comp, method, desc, unc, basis, source, why in method_rows(hs, t):
            row(item, "method", label, comp.key, "vapour pressure method", unit="",
                note=f"{desc}; stated uncertainty {unc}; {source}")
        comps = list(hs.liquid.components)
        for j, comp in enumerate(comps):
            row(item, "headspace", label, comp.key, "liquid mole fraction",
                float(np.asarray(hs.liquid.mole_fractions)[j]), "1")
            row(item, "headspace", label, comp.key, "partial pressure",
                float(np.asarray(hs.partial_pressures)[j]), "Pa")
            row(item, "headspace", label, comp.key, "concentration",
                float(np.asarray(hs.ppm)[j]), "ppm")
            row(item, "headspace", label, comp.key, "concentration",
                float(np.asarray(hs.mg_per_m3)[j]), "mg/m3",
                note="at the vapour-space temperature and pressure")
        row(item, "headspace", label, "all vapour", "concentration", hs.total_ppm, "ppm")
        row(item, "headspace", label, "all vapour", "concentration", hs.total_mg_per_m3,
            "mg/m3")
        row(item, "flammability", label, "all vapour", "mixture LFL",
            float(hs.lfl_mixture), "volume fraction")
        row(item, "flammability", label, "all vapour", "% of LFL", float(hs.percent_lfl),
            "%", limit=f"alarm {al.percent_lfl:g} % LFL", limit_source=al.source,
            ratio=float(hs.percent_lfl) / al.percent_lfl,
            note=str(hs.flammability_words))
        row(item, "flammability", label, "all vapour", "oxygen", float(hs.oxygen_percent),
            "%", limit_source=al.source)
        for c in comparisons:
            row(item, "comparison", label, c.limit.substance, "concentration",
                c.concentration * 1e6, "ppm", c.limit.label, c.limit.source, c.ratio,
                "above" if c.exceeded else "below")
        if additive is not None:
            row(item, "comparison", label, "all vapour", "additive index (TWA)",
                additive, "1", ratio=additive)


def _tank_rows(row, result, tank) -> None:
    """Rows of one tank."""
    al = result.scenario.alarms
    item = f"tank {tank.name}"
    for comp in tank.headspace.liquid.components:
        for group, source in dict(comp.sources).items():
            row(item, "substance_source", substance=comp.key, quantity=group, note=source)
    _tank_case_rows(row, item, tank, al)
    fp = tank.flash_point
    if fp is not None:
        row(item, "tank", substance="liquid", quantity="estimated flash point",
            value=fp.estimate, unit="K", note=fp.note)
        if fp.published is not None:
            row(item, "tank", substance="liquid", quantity="published flash point",
                value=fp.published, unit="K", note=fp.published_source)
    bt = getattr(tank, "boiling", None)
    if bt is not None:
        row(item, "tank", substance="liquid", quantity=f"boiling temperature at "
            f"{bt.pressure / 1000:.4g} kPa", value=bt.temperature, unit="K",
            note=(("near boiling: " + ", ".join(tank.near_boiling) + "; ")
                  if tank.near_boiling else "") + bt.method)
    if tank.alarm_temperature is not None:
        row(item, "tank", substance="liquid", quantity=f"temperature at "
            f"{al.percent_lfl:g} % LFL", value=tank.alarm_temperature, unit="K")
    for key, ratio in tank.hazard_ratios.items():
        row(item, "tank", substance=key, quantity="vapour hazard ratio", ratio=ratio,
            note="saturated vapour / TWA")
    for label, obj in (("vapour in the vapour space", tank.inventory),
                       ("vapour expelled by filling", tank.filling),
                       ("vapour vented per daily warming", tank.breathing)):
        if obj is None:
            continue
        for name, mass in zip(obj.names, np.atleast_1d(obj.masses)):
            row(item, "tank", substance=name, quantity=label, value=mass, unit="kg")
        row(item, "tank", substance="all vapour", quantity=label, value=obj.total_mass,
            unit="kg")
    if tank.purge is not None:
        p = tank.purge
        row(item, "tank", substance="all vapour", quantity="purge time", value=p.time,
            unit="s", note=f"{p.case_words}; {p.note}")
        row(item, "tank", substance="all vapour", quantity="purge target",
            value=p.target_volume_fraction * 1e6, unit="ppm")
    _monte_carlo_rows(row, item, getattr(tank, "monte_carlo", None))


def _spill_flammability_rows(row, item, spill, al) -> None:
    """Rows of % LFL and oxygen in each zone of a spill."""
    for z in spill.flammability:
        alarm = f"alarm {al.percent_lfl:g} % LFL"
        if z.judged:
            row(item, "flammability", z.zone, "all vapour", "highest % of LFL",
                z.peak_percent_lfl, "%", alarm, al.source,
                z.peak_percent_lfl / al.percent_lfl, note=f"at {z.peak_time:.0f} s")
            for quantity, value, limit in (
                    ("above the LFL alarm from", z.above_alarm_from, alarm),
                    ("back below the LFL alarm", z.back_below_alarm, alarm),
                    ("above the LFL from", z.above_lfl_from, "100 % LFL"),
                    ("back below the LFL", z.back_below_lfl, "100 % LFL")):
                if value is not None:
                    row(item, "flammability", z.zone, "all vapour", quantity, value, "s",
                        limit, al.source)
        else:
            row(item, "flammability", z.zone, "all vapour", "% of LFL",
                note="not judged: no component has a flammability limit on record")
        row(item, "flammability", z.zone, "all vapour", "lowest oxygen", z.lowest_oxygen,
            "%", f"oxygen alarm {al.oxygen_low:g} %", al.source,
            note=f"at {z.lowest_oxygen_time:.0f} s")
        if z.below_oxygen_alarm_from is not None:
            row(item, "flammability", z.zone, "all vapour", "below the oxygen alarm from",
                z.below_oxygen_alarm_from, "s", f"oxygen alarm {al.oxygen_low:g} %",
                al.source)


def _exposure_rows(row, result, item, spill) -> None:
    """Rows of each exposure of a spill and its comparisons with the limits."""
    for e in spill.exposures:
        row(item, "exposure", e.zone, e.substance, "peak", e.peak, "ppm")
        row(item, "exposure", e.zone, e.substance, "peak time", e.peak_time, "s")
        row(item, "exposure", e.zone, e.substance, "8-h TWA", e.twa, "ppm")
        row(item, "exposure", e.zone, e.substance, "highest 15-min average", e.short_term,
            "ppm")
        for label, limit_ppm, ratio, first, back in e.comparisons:
            lim = limit_for(result, e.substance, label)
            kind = lim.kind if lim else label.split()[0]
            quantity, metric = {"TWA": ("8-h TWA", e.twa),
                                "STEL": ("highest 15-min average", e.short_term)
                                }.get(kind, ("peak", e.peak))
            when = ("never above" if first is None else
                    f"above from {first:.0f} s, " + (
                        f"back below at {back:.0f} s" if back is not None
                        else "not back below within the run"))
            row(item, "comparison", e.zone, e.substance, quantity, metric, "ppm", label,
                lim.source if lim else "", ratio, when)
            if first is not None:
                row(item, "comparison", e.zone, e.substance, "first time above", first,
                    "s", label, lim.source if lim else "")
                if back is not None:
                    row(item, "comparison", e.zone, e.substance, "time back below", back,
                        "s", label, lim.source if lim else "")


def _spill_rows(row, result, spill) -> None:
    """Rows of one spill."""
    scenario = result.scenario
    al = scenario.alarms
    item = f"spill {spill.name}"
    spec = spill_input(result, spill)
    model = spec.get("model", "mackay-matsugu")
    run = spill.indoor or spill.outdoor
    names = list(run.components)
    keys = spill_keys(result, spill, names)
    for sub in spill_substances(result, spill, names):
        if sub is not None:
            for group, source in dict(sub.sources).items():
                row(item, "substance_source", substance=sub.key, quantity=group,
                    note=source)
    for name, rate in spill.initial_rates.items():
        row(item, "evaporation", name, "liquid", "initial evaporation rate", rate, "kg/s",
            note="used" if name == model else "for comparison")
    if spill.indoor is not None:
        ind = spill.indoor
        row(item, "evaporation", quantity="pool area", value=ind.pool_area, unit="m2",
            note=ind.model)
        row(item, "evaporation", quantity="pool evaporated", value=ind.pool_gone_time,
            unit="s")
        if ind.source_removed_time is not None:
            row(item, "evaporation", quantity="pool cleaned up",
                value=ind.source_removed_time, unit="s")
        row(item, "evaporation", quantity="mass balance error",
            value=ind.mass_balance_error, unit="1")
    _spill_flammability_rows(row, item, spill, al)
    _exposure_rows(row, result, item, spill)
    if spill.outdoor is not None:
        od = spill.outdoor
        y = np.asarray(od.volume_fraction, dtype=float) * 1e6
        c = np.asarray(od.concentration, dtype=float) * 1e6
        for j, key in enumerate(keys):
            row(item, "evaporation", "outdoors", key, "source strength",
                float(np.atleast_1d(od.emission_rate)[j]), "kg/s",
                note=f"stability {od.stability}, {od.terrain} terrain, wind "
                     f"{od.wind_speed!r} m/s at 10 m")
        for i, d in enumerate(np.asarray(od.distances, dtype=float)):
            for j, key in enumerate(keys):
                case = f"{d:g} m downwind"
                row(item, "centreline", case, key, "concentration", y[i, j], "ppm")
                row(item, "centreline", case, key, "concentration", c[i, j], "mg/m3")
        _outdoor_flammability_rows(row, item, od)
    for label, d, note in spill.distances:
        lim = next((lim for lim in scenario.limits if lim.label == label), None)
        row(item, "distance", "outdoors", lim.substance if lim else "",
            "distance the centreline stays above the limit", d, "m", label,
            lim.source if lim else "",
            note=note + ("; beyond the farthest distance computed" if d is None else ""))
    _monte_carlo_rows(row, item, getattr(spill, "monte_carlo", None))


def _closing_rows(row, result) -> None:
    """Rows of findings, warnings, what was not computed, and the cautions last."""
    for label, obj in result_items(result):
        for text in obj.findings:
            row(label, "finding", note=text)
    for label, obj in result_items(result):
        for text in obj.warnings:
            row(label, "warning", note=text)
    for item, message in result.errors:
        row(item, "error", note=message)
    row("results", "note", note="time series and temperature sweeps are in the JSON export")
    for text in result.cautions:
        row("ullage", "caution", note=text)



def results_csv(result, *, generated_at=None) -> str:
    """A tidy long table of the results: one row per item, case, substance and quantity.

    The first row is the header (`CSV_COLUMNS`); the cautions are the last rows
    (kind "caution") so they travel with the data. Numbers are in SI units, ppm,
    mg/m3 or %, as the unit column says; a number that is not finite is left
    empty with a note. Every text cell goes through `neutralise_cell`. Time series
    and temperature sweeps are in the JSON export.

    Returns
    -------
    str
    """
    rows: list[dict] = []
    row = _row_sink(rows)
    _scenario_rows(row, result, generated_at)
    for tank in result.tanks:
        _tank_rows(row, result, tank)
    for spill in result.spills:
        _spill_rows(row, result, spill)
    _closing_rows(row, result)

    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\r\n")
    writer.writerow(CSV_COLUMNS)
    for cells in rows:
        writer.writerow([neutralise_cell(NOT_XML.sub("", cells[c]) if isinstance(cells[c], str)
                                         else cells[c]) for c in CSV_COLUMNS])
    return buffer.getvalue()
