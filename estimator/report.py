"""Reports and exports of a scenario run: Markdown, self-contained HTML, JSON and CSV.

Markdown and HTML carry the same content, built once as a list of blocks: the
cautions first, the inputs as written, the methods used and why, the
assumptions, result tables and plots, comparisons with every limit and its
source, findings, warnings, what could not be computed, and the cautions again.
JSON holds every number in SI units (and ppm where relevant) with the inputs
document; CSV is a tidy long table with the cautions as its last rows.
"""

from __future__ import annotations

import csv
import datetime as _dt
import html
import io
import json
import math
import os  # noqa: F401  (the atomic writer uses it through estimator.files)
import re
import warnings
from dataclasses import dataclass
from pathlib import Path

import numpy as np

from .errors import InputError
from .files import neutralise_cell, write_text_atomic  # noqa: F401  (re-exported)
from .limits import format_number

__all__ = [
    "write_text_atomic",
    "neutralise_cell",
    "markdown_report",
    "html_report",
    "result_to_dict",
    "results_json",
    "results_csv",
    "write_report",
    "REPORT_FORMATS",
    "CSV_COLUMNS",
    "MAX_SERIES_POINTS",
    "monte_carlo_curves",
]

#: Format name -> file endings that select it.
REPORT_FORMATS = {
    "markdown": (".md", ".markdown"),
    "html": (".html", ".htm"),
    "json": (".json",),
    "csv": (".csv",),
}

#: Columns of `results_csv`, in order.
CSV_COLUMNS = ("item", "kind", "case", "substance", "quantity", "value", "unit", "limit",
               "limit_source", "ratio", "note")

#: Points kept per time series or sweep in the JSON export; longer series are
#: downsampled to evenly spaced samples plus each concentration's peak, and say so.
MAX_SERIES_POINTS = 2000

_NOT_SHOWN = "–"
_NOT_XML = re.compile("[\x00-\x08\x0b\x0c\x0e-\x1f\x7f\ufffe\uffff]")


# ---------------------------------------------------------------------------
# numbers and words, formatted once for Markdown and HTML alike

def _finite(value) -> bool:
    return value is not None and math.isfinite(float(value))


def _n(value) -> str:
    """Three significant figures with thousands separators (as `format_ppm`)."""
    from .limits import format_ppm

    if value is None:
        return _NOT_SHOWN
    if not _finite(value):
        return "not finite"
    return format_ppm(float(value))


def _pct(value) -> str:
    if value is None:
        return _NOT_SHOWN
    return _n(value)


def _celsius(kelvin) -> str:
    return _NOT_SHOWN if kelvin is None else f"{float(kelvin) - 273.15:.1f} °C"


def _minutes(seconds, none: str = _NOT_SHOWN) -> str:
    if seconds is None:
        return none
    if not _finite(seconds):
        return "not within the run"
    return f"{float(seconds) / 60:.0f} min"


def _kg(value) -> str:
    return _NOT_SHOWN if value is None else f"{_n(value)} kg"


def _timestamp(generated_at) -> _dt.datetime:
    if generated_at is None:
        return _dt.datetime.now(_dt.timezone.utc).replace(microsecond=0)
    if isinstance(generated_at, str):
        try:
            generated_at = _dt.datetime.fromisoformat(generated_at.replace("Z", "+00:00"))
        except ValueError:
            raise InputError("generated_at", f"{generated_at!r} is not an ISO 8601 date "
                             "and time such as '2026-03-01T12:00:00Z'") from None
    if not isinstance(generated_at, _dt.datetime):
        raise InputError("generated_at", "give a datetime or an ISO 8601 text")
    if generated_at.tzinfo is None:
        generated_at = generated_at.replace(tzinfo=_dt.timezone.utc)
    return generated_at.astimezone(_dt.timezone.utc).replace(microsecond=0)


def _as_written(value) -> str:
    """A scenario value the way it reads in the file."""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, str):
        return value
    if isinstance(value, (list, tuple)):
        return "[" + ", ".join(_as_written(v) for v in value) + "]"
    if isinstance(value, dict) or hasattr(value, "items"):
        return "{ " + ", ".join(f"{k} = {_as_written(v)}" for k, v in value.items()) + " }"
    if isinstance(value, (_dt.date, _dt.time)):
        return value.isoformat()
    return str(value)


def _slug(text: str) -> str:
    slug = re.sub(r"[^a-z0-9]+", "-", str(text).lower()).strip("-")[:40].strip("-")
    return slug or "item"


# ---------------------------------------------------------------------------
# reading the result objects

def _cases(tank):
    """(case name, temperature [K], Headspace, comparisons, additive index)."""
    out = [("stated", tank.temperature, tank.headspace, tank.comparisons, tank.additive_index)]
    if tank.worst is not None:
        out.append(("worst case", tank.worst_temperature, tank.worst, tank.worst_comparisons,
                    tank.worst_additive_index))
    return out


def _limit_for(result, substance: str, label: str):
    for lim in result.scenario.limits:
        if lim.substance == substance and lim.label == label:
            return lim
    return None


def _limits_of(result, keys):
    return [lim for lim in result.scenario.limits if lim.substance in keys]


def _short_limit(lim) -> str:
    text = f"{lim.substance} {lim.kind} {lim.value:g} {lim.unit}"
    if lim.unit != "ppm":
        text += f" ({_n(lim.ppm)} ppm)"
    return text


def _spill_input(result, spill) -> dict:
    for item in result.scenario.spills:
        if item.get("name") == spill.name:
            return item
    return {}


def _spill_substances(result, spill, names) -> list:
    """Substances of a spill's liquid, in the order of the model's component names."""
    entry = result.scenario.liquids.get(spill.liquid, {})
    spec = entry.get("spec")
    pool = list(spec) if isinstance(spec, dict) else ([spec] if spec is not None else [])
    out = []
    for name in names:
        out.append(next((s for s in pool if getattr(s, "name", None) == name), None))
    return out


def _spill_keys(result, spill, names) -> list[str]:
    subs = _spill_substances(result, spill, names)
    return [s.key if s is not None else name for s, name in zip(subs, names)]


def _zones(indoor):
    if indoor.near_field is not None:
        return [("near_field", "near field"), ("room", "far field")]
    return [("room", "room")]


def _method_rows(hs, temperature):
    """(substance, method, description, uncertainty text, basis, source, why) per component."""
    rows = []
    estimates = list(hs.vapor_pressure_methods)
    components = list(hs.liquid.components)
    water_case = len(estimates) != len(components)
    for j, comp in enumerate(components):
        if water_case and j > 0:
            source = ""
            try:
                from .henry import henry_constants

                source = henry_constants(comp.key).source
            except InputError:  # not in the table: the run itself said why
                source = "bundled Henry's law table"
            rows.append((comp, "henry", "Henry's law constant with van 't Hoff temperature "
                         "dependence (dissolved in water)", "not stated", "", source,
                         "dilute solute in water: its partial pressure follows Henry's law"))
            continue
        est = estimates[j if not water_case else 0]
        unc = ("not validated" if est.relative_uncertainty is None
               else f"±{format_number(100 * est.relative_uncertainty, 2)} %")
        lo, hi = est.valid_range if est.valid_range else (None, None)
        t = np.atleast_1d(np.asarray(temperature, dtype=float))
        inside = lo is not None and float(t.min()) >= lo and float(t.max()) <= hi
        why = ("first method on record whose data cover this temperature"
               f" ({_celsius(lo)} to {_celsius(hi)})" if inside else
               "no method's data cover this temperature: extrapolated (see the warnings)")
        rows.append((comp, est.method, est.description, unc, est.uncertainty_basis,
                     est.source, why))
    return rows


# ---------------------------------------------------------------------------
# the document as blocks, rendered to Markdown or HTML

@dataclass
class _Heading:
    level: int
    text: str


@dataclass
class _Para:
    text: str


@dataclass
class _Bullets:
    items: list


@dataclass
class _Table:
    headers: list
    rows: list
    numeric: tuple = ()


@dataclass
class _Plot:
    name: str
    caption: str
    svg: str


@dataclass
class _Cautions:
    title: str
    items: list


def _wants_log(series: dict, hlines: dict) -> bool:
    values = np.concatenate([np.ravel(np.asarray(v, dtype=float)) for v in series.values()]
                            + [np.asarray(list(hlines.values()), dtype=float)])
    positive = values[np.isfinite(values) & (values > 0)]
    return positive.size > 1 and float(positive.max()) / float(positive.min()) > 100.0


def _plot(name, caption, x, series, hlines, *, x_label, y_label, title, log_x=False,
          log_y=None):
    from .plots import line_plot_svg

    svg = line_plot_svg(x, series, x_label=x_label, y_label=y_label, title=title,
                        hlines=hlines, log_x=log_x,
                        log_y=_wants_log(series, hlines) if log_y is None else log_y)
    return _Plot(name, caption, svg)


def _tank_plots(result, index, tank) -> list:
    sweep = tank.sweep
    if sweep is None or np.ndim(sweep.temperature) == 0:
        return []
    out = []
    t_c = np.asarray(sweep.temperature, dtype=float) - 273.15
    comps = list(sweep.liquid.components)
    ppm = np.asarray(sweep.ppm, dtype=float)
    series = {c.name: ppm[j] for j, c in enumerate(comps)}
    if len(comps) > 1:
        series["all vapour"] = np.asarray(sweep.total_ppm, dtype=float)
    hlines = {_short_limit(lim): lim.ppm for lim in _limits_of(result, {c.key for c in comps})}
    stem = f"tank{index + 1}-{_slug(tank.name)}"
    out.append(_plot(
        f"{stem}-headspace-ppm", f"Tank {tank.name}: equilibrium headspace concentration "
        "against liquid temperature, with the exposure limits (dashed).", t_c, series, hlines,
        x_label="liquid temperature [°C]", y_label="headspace [ppm by volume]",
        title=f"Tank {tank.name}: headspace by temperature"))
    lfl = np.asarray(sweep.lfl_mixture, dtype=float)
    if np.any(np.isfinite(lfl)):
        alarms = result.scenario.alarms
        out.append(_plot(
            f"{stem}-percent-lfl", f"Tank {tank.name}: headspace as a percentage of the "
            f"mixture LFL against liquid temperature, with the {alarms.percent_lfl:g} % LFL "
            f"alarm ({alarms.source}) and the LFL itself.", t_c,
            {"headspace": np.asarray(sweep.percent_lfl, dtype=float)},
            {f"alarm {alarms.percent_lfl:g} % LFL": alarms.percent_lfl, "LFL (100 %)": 100.0},
            x_label="liquid temperature [°C]", y_label="% of the LFL",
            title=f"Tank {tank.name}: % of LFL by temperature",
            # logarithmic once the curve runs far above the alarm, so that the alarm
            # and LFL lines stay clear of the axis
            log_y=bool(np.nanmax(np.asarray(sweep.percent_lfl, dtype=float))
                       > 5.0 * alarms.percent_lfl)))
    return out


def _spill_plots(result, index, spill) -> list:
    out = []
    stem = f"spill{index + 1}-{_slug(spill.name)}"
    if spill.indoor is not None:
        ind = spill.indoor
        names = list(ind.components)
        keys = _spill_keys(result, spill, names)
        hlines = {_short_limit(lim): lim.ppm for lim in _limits_of(result, set(keys))}
        series = {}
        for zone, label in _zones(ind):
            ppm = np.asarray(ind.ppm(zone), dtype=float)
            for j, name in enumerate(names):
                series[f"{label}: {name}" if len(names) > 1 else label] = ppm[:, j]
        minutes = np.asarray(ind.times, dtype=float) / 60.0
        groups = [series]
        if len(series) > 6:
            groups = [{k: v for k, v in series.items() if k.startswith(label + ":")}
                      for _, label in _zones(ind)]
        for g, group in enumerate(groups):
            suffix = "" if len(groups) == 1 else f"-{g + 1}"
            out.append(_plot(
                f"{stem}-concentration-time{suffix}", f"Spill {spill.name}: concentration "
                f"against time after the spill in {spill.where} ({ind.model}), with the "
                "exposure limits (dashed).", minutes, group, hlines,
                x_label="time after the spill [min]", y_label="concentration [ppm by volume]",
                title=f"Spill {spill.name}: concentration by time"))
        judged = [z for z in spill.flammability if z.judged and z.percent_lfl is not None]
        if judged:
            alarm = judged[0].alarm_percent_lfl
            lines = {f"LFL alarm ({alarm:g} % of the LFL)": alarm, "LFL (100 %)": 100.0}
            out.append(_plot(
                f"{stem}-percent-lfl-time", f"Spill {spill.name}: vapour as % of the LFL "
                f"against time in {spill.where}, with the LFL alarm and the LFL (dashed).",
                np.asarray(judged[0].times, dtype=float) / 60.0,
                {z.zone: np.asarray(z.percent_lfl, dtype=float) for z in judged}, lines,
                x_label="time after the spill [min]", y_label="% of the LFL",
                title=f"Spill {spill.name}: % of the LFL by time"))
    if spill.outdoor is not None:
        od = spill.outdoor
        names = list(od.components)
        keys = _spill_keys(result, spill, names)
        distances = np.asarray(od.distances, dtype=float)
        y = np.asarray(od.volume_fraction, dtype=float) * 1e6
        x = distances
        series = {name: y[:, j] for j, name in enumerate(names)}
        reach = [d for _, d, _ in spill.distances if d is not None and math.isfinite(d)]
        reach += [d for d in (getattr(od, "distance_to_lfl", None),
                              getattr(od, "distance_to_lfl_alarm", None)) if d is not None]
        hi = 1.5 * max(list(distances) + reach) if distances.size else 0.0
        lo = float(getattr(od, "pool_edge", 0.0) or (distances.min() if distances.size else 0.0))
        if hi <= lo:
            hi = 10.0 * lo
        lfl_lines = {}
        if hi > lo > 0 and od.volume_rates is not None:
            # the plot starts at the pool's edge, so that every limit line's crossing shows
            grid = np.geomspace(lo, hi, 160)
            profile = od.centreline(grid) * 1e6
            x, series = grid, {name: profile[:, j] for j, name in enumerate(names)}
            lfl = od.lower_flammability_limits
            fuel = np.isfinite(lfl)
            if np.any(fuel):
                fraction = od.fraction_of_lfl(grid)
                total = profile[:, fuel].sum(axis=1)
                if len(names) > 1:
                    series["all flammable vapour"] = total
                # the mixture's LFL in ppm (Le Chatelier over the plume's composition)
                lfl_ppm = float(np.median(np.divide(total, fraction, out=np.full_like(
                    total, np.nan), where=fraction > 0)))
                if math.isfinite(lfl_ppm):
                    lfl_lines = {"LFL": lfl_ppm,
                                 f"{od.lfl_alarm_percent:g} % LFL alarm":
                                     lfl_ppm * od.lfl_alarm_percent / 100.0}
        hlines = {_short_limit(lim): lim.ppm for lim in _limits_of(result, set(keys))}
        hlines.update(lfl_lines)
        if np.asarray(x).size >= 2:
            out.append(_plot(
                f"{stem}-centreline-distance", f"Spill {spill.name}: ground-level centreline "
                f"concentration against downwind distance (stability class {od.stability}, "
                f"{od.terrain} terrain, {format_number(od.wind_speed, 2)} m/s at 10 m) from the pool's edge, "
                "capped at the saturated vapour concentration over the pool, with the "
                "exposure limits, the LFL and the LFL alarm (dashed).", x, series, hlines,
                x_label="downwind distance [m]",
                y_label="centreline concentration [ppm by volume]",
                title=f"Spill {spill.name}: centreline by distance", log_x=True))
    return out


def _blocks(result, generated) -> tuple[list, bool]:
    """The report as blocks, and whether it holds plots."""
    from .evaporation import MODELS

    scenario = result.scenario
    doc = scenario.document
    head = dict(doc.get("scenario", {}))
    b: list = []
    b.append(_Table(["", ""], [
        ["Site", head.get("site", "not given")],
        ["Description", head.get("description", "not given")],
        ["Report generated", generated.strftime("%Y-%m-%d %H:%M:%S UTC")],
        ["ullage version", result.version],
        ["Scenario written for ullage", head.get("ullage_version", "not recorded")],
        ["Scenario file", Path(scenario.source_path).name if scenario.source_path
         else "not from a file"],
    ]))
    b.append(_Cautions("Cautions", list(result.cautions)))

    # summary
    b.append(_Heading(2, "Summary"))
    verdict = ("At least one exposure limit or flammability/oxygen alarm is exceeded in "
               "this screening." if result.exceeded else
               "No exposure limit or flammability/oxygen alarm is exceeded in this "
               "screening.")
    b.append(_Para(f"{verdict} {len(result.tanks)} tank(s) and {len(result.spills)} "
                   f"spill(s) were screened; {len(result.errors)} item(s) could not be "
                   "computed."))

    # inputs
    b.append(_Heading(2, "Inputs as written"))
    b.append(_Para("The scenario's values exactly as entered, with their units."))
    for section, content in doc.items():
        if isinstance(content, (list, tuple)):
            for i, item in enumerate(content):
                name = item.get("name") or item.get("substance") or item.get("item") or ""
                b.append(_Heading(3, f"[[{section}]] {i + 1}" + (f": {name}" if name else "")))
                b.append(_Table(["key", "value"], [[k, _as_written(v)] for k, v in item.items()]))
        elif hasattr(content, "items"):
            b.append(_Heading(3, f"[{section}]"))
            b.append(_Table(["key", "value"], [[k, _as_written(v)] for k, v in content.items()]))
    b.append(_Heading(3, "Exposure limits entered"))
    if scenario.limits:
        b.append(_Table(["substance", "kind", "as entered", "in ppm", "source"], [
            [lim.substance, lim.kind, f"{lim.value:g} {lim.unit}", _n(lim.ppm), lim.source]
            for lim in scenario.limits], numeric=(3,)))
    else:
        b.append(_Para("No exposure limits were entered: only flammability and oxygen are "
                       "compared."))
    al = scenario.alarms
    b.append(_Para(f"Alarm levels: {al.percent_lfl:g} % of the LFL; oxygen below "
                   f"{al.oxygen_low:g} % or above {al.oxygen_high:g} % ({al.source}). "
                   f"Barometric pressure {scenario.pressure / 1000:.2f} kPa."))

    # methods
    b.append(_Heading(2, "Methods used and why"))
    if result.tanks:
        b.append(_Heading(3, "Headspace"))
        b.append(_Para("Equilibrium vapour space over the liquid: each component's partial "
                       "pressure by Raoult's law from its saturated vapour pressure (Henry's "
                       "law for compounds dissolved in water), concentrations from the "
                       "partial pressures, the mixture's flammability limits by Le "
                       "Chatelier's rule (Mashuga & Crowl 2000), oxygen by displacement of "
                       "air. Why: a closed vapour space left to settle reaches equilibrium, "
                       "the highest concentration it can hold at that temperature."))
        grouped = {}
        for tank in result.tanks:
            for case, t, hs, _, _ in _cases(tank):
                for comp, method, desc, unc, basis, source, why in _method_rows(hs, t):
                    key = (tank.name, comp.name, desc, unc, basis or _NOT_SHOWN, source, why)
                    grouped.setdefault(key, []).append(case)
        rows = [[key[0], ", ".join(cases), *key[1:]] for key, cases in grouped.items()]
        b.append(_Para("Vapour pressure, per component:"))
        b.append(_Table(["tank", "case", "substance", "method", "stated uncertainty (95 %)",
                         "uncertainty basis", "source", "why"], rows))
        activity = sorted({t.headspace.liquid.activity_source for t in result.tanks})
        b.append(_Para("Liquid-phase activity: " + "; ".join(activity) + "."))
    if result.spills:
        b.append(_Heading(3, "Spills"))
        rows = []
        for spill in result.spills:
            spec = _spill_input(result, spill)
            model = spec.get("model", "mackay-matsugu")
            rows.append([spill.name, "evaporation", MODELS.get(model, model),
                         "chosen in the scenario (Mackay-Matsugu unless another is named: it "
                         "accounts for pool size and each vapour's diffusivity); the other "
                         "model's initial rate is shown beside it for comparison"])
            if spill.indoor is not None:
                room = next((r for r in scenario.rooms if r.get("name") == spill.where), {})
                mixing = room.get("mixing_factor", 1.0)
                if spill.indoor.near_field is not None:
                    rows.append([spill.name, "air", "two-zone near-field/far-field model "
                                 "(Nicas 1996), pool and air integrated together, effective "
                                 f"ventilation Q/K with mixing factor K = {mixing:g}",
                                 "a near field was given: a worker at the pool breathes air "
                                 "richer than the room average"])
                else:
                    rows.append([spill.name, "air", "well-mixed room (Keil, Simmons & "
                                 "Anthony 2009), pool and air integrated together, effective "
                                 f"ventilation Q/K with mixing factor K = {mixing:g}",
                                 "no near field was given; close to the pool the air is "
                                 "richer than this room average"])
            if spill.outdoor is not None:
                od = spill.outdoor
                rows.append([spill.name, "dispersion", "Gaussian plume from a continuous "
                             "ground-level source, ground-level centreline (Turner 1970, "
                             "AP-26, Eq. 3.4), Briggs (1973) dispersion coefficients, "
                             f"{od.terrain} terrain, stability class {od.stability}, wind "
                             f"{format_number(od.wind_speed, 2)} m/s at 10 m",
                             "a screening plume: the pool's initial (highest) evaporation "
                             "rate is taken as a continuous source, which errs high"])
        b.append(_Table(["spill", "step", "method", "why"], rows))
        shift = scenario.shift
        b.append(_Para(f"Exposure metrics: the 8-h TWA over a work shift of "
                       f"{shift.duration / 3600:g} h from {shift.start / 3600:g} h; the "
                       "highest 15-min rolling average (compared with STEL values; over the "
                       "whole run when it is shorter than 15 min); the peak (compared with "
                       "ceiling and emergency values). Computed on the full series."))
    subs = {}
    for tank in result.tanks:
        for comp in tank.headspace.liquid.components:
            subs.setdefault(comp.key, comp)
    for spill in result.spills:
        run = spill.indoor or spill.outdoor
        for sub in _spill_substances(result, spill, list(run.components)):
            if sub is not None:
                subs.setdefault(sub.key, sub)
    if subs:
        b.append(_Heading(3, "Substance data"))
        grouped: dict = {}
        for sub in subs.values():
            for group, source in dict(sub.sources).items():
                grouped.setdefault((source, group), []).append(
                    f"{sub.name} ({sub.cas})" if sub.cas else sub.name)
        rows = [[group.replace("_", " "), source, ", ".join(names)]
                for (source, group), names in grouped.items()]
        b.append(_Table(["values", "source", "substances"], rows))
        looked_up = [f"{sub.name} ({sub.cas})" for sub in subs.values()
                     if sub.origin == "lookup"]
        if looked_up:
            b.append(_Para("Not in ullage's curated table, taken from the property "
                           "library (chemicals) as compiled there: " + ", ".join(looked_up)
                           + ". Check these values against the supplier's safety data "
                           "sheet; a flammability limit or flash point not on record "
                           "must be entered from the safety data sheet."))

    b.append(_Heading(2, "Assumptions"))
    b.append(_Bullets(list(result.assumptions)) if result.assumptions
             else _Para("None beyond the methods above."))

    # results
    b.append(_Heading(2, "Results"))
    has_plots = False
    for i, tank in enumerate(result.tanks):
        b += _tank_blocks(result, i, tank)
        plots = _tank_plots(result, i, tank)
        mc = getattr(tank, "monte_carlo", None)
        mc_plots = _monte_carlo_plots(result, f"tank{i + 1}-{_slug(tank.name)}",
                                      f"Tank {tank.name}", mc, _tank_names(tank))
        has_plots |= bool(plots) or bool(mc_plots)
        b += plots
        b += _monte_carlo_blocks(mc)
        b += mc_plots
    for i, spill in enumerate(result.spills):
        b += _spill_blocks(result, spill)
        plots = _spill_plots(result, i, spill)
        mc = getattr(spill, "monte_carlo", None)
        mc_plots = _monte_carlo_plots(result, f"spill{i + 1}-{_slug(spill.name)}",
                                      f"Spill {spill.name}", mc, None)
        has_plots |= bool(plots) or bool(mc_plots)
        b += plots
        b += _monte_carlo_blocks(mc)
        b += mc_plots
    if not result.tanks and not result.spills:
        b.append(_Para("No tank or spill was computed."))

    b.append(_Heading(2, "Findings"))
    any_findings = False
    for label, item in _items(result):
        if item.findings:
            any_findings = True
            b.append(_Heading(3, label))
            b.append(_Bullets(list(item.findings)))
    if not any_findings:
        b.append(_Para("None."))

    b.append(_Heading(2, "Warnings"))
    any_warnings = False
    for label, item in _items(result):
        if item.warnings:
            any_warnings = True
            b.append(_Heading(3, label))
            b.append(_Bullets(list(item.warnings)))
    if not any_warnings:
        b.append(_Para("None."))

    b.append(_Heading(2, "Not computed"))
    if result.errors:
        b.append(_Table(["item", "why"], [[item, message] for item, message in result.errors]))
    else:
        b.append(_Para("Everything the scenario asks for was computed."))

    b.append(_Cautions("Cautions (again)", list(result.cautions)))
    return b, has_plots


def _unit_text(unit) -> str:
    return "" if unit in ("", "-", None) else str(unit)


def _monte_carlo_blocks(mc) -> list:
    """Tables of a probabilistic screening run, if there is one."""
    if mc is None:
        return []
    b: list = [_Heading(4, "Probabilistic screening"),
               _Para(f"{mc.model} chain, {mc.n:,} samples (seed {mc.seed}, which reproduces "
                     "the run). Uncertain inputs:")]
    b.append(_Table(["input", "distribution"], [[k, v] for k, v in dict(mc.inputs).items()]))
    rows, low = [], []
    for name, table in dict(mc.percentiles).items():
        table = dict(table)
        head = [name.replace("_", " "), _unit_text(dict(mc.units).get(name))]
        if name == "oxygen_percent":  # the hazard is low oxygen: its low percentiles
            low.append(head + [_n(table.get(q)) for q in (1, 5, 50)])
        else:
            rows.append(head + [_n(table.get(q)) for q in (50, 90, 95, 99)])
    b.append(_Table(["output", "unit", "median", "90th percentile", "95th percentile",
                     "99th percentile"], rows, numeric=(2, 3, 4, 5)))
    if low:
        b.append(_Table(["output (low is the hazard)", "unit", "1st percentile",
                         "5th percentile", "median"], low, numeric=(2, 3, 4)))
    if mc.exceedance:
        b.append(_Table(["limit or alarm", "probability of exceeding it"],
                        [[label, f"{_n(100 * p)} %"] for label, p in dict(mc.exceedance).items()],
                        numeric=(1,)))
    rows = []
    for output, ranks in dict(mc.sensitivity).items():
        ranks = dict(ranks)
        if ranks:
            top, rho = next(iter(ranks.items()))
            rows.append([output.replace("_", " "), top, f"{rho:.2f}"])
    if rows:
        b.append(_Para("What drives the spread (largest Spearman rank correlation):"))
        b.append(_Table(["output", "input", "rank correlation"], rows, numeric=(2,)))
    return b


#: Curve labels of the indoor-spill chain's outputs, and the limit kinds each is
#: compared with (as `estimator.uncertainty.indoor_spill_monte_carlo` compares them).
_SPILL_CURVES = (("twa_ppm", "8-h TWA", ("TWA",)),
                 ("short_term_ppm", "highest 15-min average", ("STEL",)),
                 ("peak_ppm", "peak", ("ceiling", "emergency")))


def monte_carlo_curves(mc, limits, names=None) -> tuple[dict, list]:
    """What to draw as cumulative curves for a probabilistic run, and the limits that apply.

    The limits that apply are those the run compared: the ones with a
    ``ratio to <limit label>`` output (labels made unique as the run makes them).

    - Headspace: the total concentration (``total_ppm``) as "all vapour"; for a
      mixture also each substance that has a limit, its concentration being the
      ratio times the limit (the ratio is the substance's own concentration
      over the limit), so that each limit line reads against its own substance.
    - Indoor spill: the 8-h TWA (``twa_ppm``) and the peak (``peak_ppm``), and
      the highest 15-min average (``short_term_ppm``) when a STEL applies.

    Parameters
    ----------
    mc : MonteCarloResult
    limits : sequence of ExposureLimit
        The limits the run was given, in the same order (``scenario.limits``).
    names : dict, optional
        Substance key -> name shown, for the substances of a headspace run
        (a single entry means a pure liquid: one curve, named after it).

    Returns
    -------
    (dict, list of dict)
        Curve label -> samples [ppm]; and for each applicable limit a dict with
        ``limit`` (the ExposureLimit), ``label`` (its exceedance label in the
        run), ``line`` (short text for the line), ``ppm`` (its value [ppm]) and
        ``compared`` (the curve label it is compared with).
    """
    from .uncertainty import unique_labels

    limits = list(limits)
    applied = [(lim, label) for lim, label in zip(limits, unique_labels(limits))
               if f"ratio to {label}" in mc.outputs]
    curves: dict = {}
    lines = []
    if mc.model == "indoor spill":
        kinds = {lim.kind for lim, _ in applied}
        for output, text, compared in _SPILL_CURVES:
            if output in mc.outputs and (output != "short_term_ppm" or "STEL" in kinds):
                curves[text] = np.asarray(mc.outputs[output], dtype=float)
        for lim, label in applied:
            text = next(t for _, t, kinds_of in _SPILL_CURVES if lim.kind in kinds_of)
            lines.append({"limit": lim, "label": label, "line": _short_limit(lim),
                          "ppm": float(lim.ppm), "compared": text})
        return curves, lines
    names = dict(names or {})
    pure = len(names) == 1
    total = next(iter(names.values())) if pure else "all vapour"
    curves[total] = np.asarray(mc.outputs["total_ppm"], dtype=float)
    for lim, label in applied:
        own = total if pure else names.get(lim.substance, lim.substance)
        if own not in curves:
            curves[own] = np.asarray(mc.outputs[f"ratio to {label}"], dtype=float) * lim.ppm
        lines.append({"limit": lim, "label": label, "line": _short_limit(lim),
                      "ppm": float(lim.ppm), "compared": own})
    return curves, lines


def _tank_names(tank) -> dict:
    return {c.key: c.name for c in tank.headspace.liquid.components}


def _monte_carlo_plots(result, stem, what, mc, names) -> list:
    """The cumulative curve of a probabilistic run's key concentrations, with the limits."""
    if mc is None:
        return []
    from .plots import cumulative_plot_svg

    curves, lines = monte_carlo_curves(mc, result.scenario.limits, names)
    if not curves:
        return []
    vlines = {item["line"]: item["ppm"] for item in lines}
    base = (f"{what}: cumulative distribution over the {mc.n:,} samples (seed {mc.seed}); "
            "the height of a curve at a concentration is the fraction of samples at or "
            "below it, so where it crosses a dashed limit line, one minus its height is "
            "the probability of exceeding that limit.")
    if mc.model == "indoor spill":
        caption = (base + " Room air (well mixed): TWA limits are compared with the 8-h "
                   "TWA, STEL values with the highest 15-min average, ceiling and emergency "
                   "values with the peak.")
        title = f"{what}: room air, cumulative distribution"
    else:
        caption = base + " Equilibrium headspace" + (
            "; each limit applies to its own substance's curve, the total is shown as all "
            "vapour." if len(curves) > 1 else ".")
        title = f"{what}: headspace, cumulative distribution"
    svg = cumulative_plot_svg(curves, x_label="concentration [ppm by volume]", title=title,
                              vlines=vlines, log_x=_wants_log(curves, vlines))
    return [_Plot(f"{stem}-probability-cumulative", caption, svg)]


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


def _monte_carlo_rows(row, item, mc) -> None:
    if mc is None:
        return
    note = f"{mc.n} samples, seed {mc.seed}"
    for name, table in dict(mc.percentiles).items():
        unit = _unit_text(dict(mc.units).get(name)) or "1"
        for q, v in dict(table).items():
            row(item, "probabilistic", f"{q}{'st' if q == 1 else 'th'} percentile", "", name,
                v, unit, note=note)
    for label, p in dict(mc.exceedance).items():
        row(item, "probabilistic", "exceedance", "", "probability of exceeding", p, "1",
            limit=label, note=note)


def _items(result):
    return ([(f"Tank {t.name}", t) for t in result.tanks]
            + [(f"Spill {s.name}", s) for s in result.spills])


def _tank_blocks(result, index, tank) -> list:
    b: list = [_Heading(3, f"Tank {tank.name} ({tank.liquid})")]
    comp_rows, total_rows, cmp_rows = [], [], []
    for case, t, hs, comparisons, index_value in _cases(tank):
        comps = list(hs.liquid.components)
        ppm = np.atleast_1d(np.asarray(hs.ppm, dtype=float))
        mg = np.atleast_1d(np.asarray(hs.mg_per_m3, dtype=float))
        x = np.asarray(hs.liquid.mole_fractions, dtype=float)
        for j, comp in enumerate(comps):
            shares = [f"{c.limit.kind}: {_n(100 * c.ratio)} %" for c in comparisons
                      if c.limit.substance == comp.key]
            p_sat = float(np.atleast_1d(np.asarray(hs.saturation_pressures, dtype=float))[j])
            comp_rows.append([case, _celsius(t), comp.name, f"{_n(x[j])}",
                              _n(p_sat / 1000) if math.isfinite(p_sat) else "Henry's law",
                              _n(ppm[j]), _n(mg[j]), "; ".join(shares) or _NOT_SHOWN])
        lfl = float(hs.lfl_mixture)
        total_rows.append([case, _celsius(t), _n(hs.total_ppm), _n(hs.total_mg_per_m3),
                           f"{_n(100 * lfl)} %" if math.isfinite(lfl) else _NOT_SHOWN,
                           _pct(hs.percent_lfl), _pct(hs.oxygen_percent),
                           str(hs.flammability_words),
                           _n(index_value) if index_value is not None else _NOT_SHOWN])
        names = {c.key: c.name for c in comps}
        for c in comparisons:
            lim = c.limit
            cmp_rows.append([case, names.get(lim.substance, lim.substance),
                             f"{lim.kind} {lim.value:g} {lim.unit}", lim.source,
                             _n(c.concentration * 1e6), _n(c.ratio), f"{_n(100 * c.ratio)} %",
                             "above" if c.exceeded else "below"])
    b.append(_Para(f"Vapour-space pressure {tank.pressure / 1000:.2f} kPa (absolute)."))
    b.append(_Table(["case", "temperature", "substance", "liquid mole fraction",
                     "vapour pressure of the pure liquid kPa", "ppm",
                     "mg/m3 (at the vapour-space temperature and pressure)", "% of limits"],
                    comp_rows, numeric=(3, 4, 5, 6)))
    b.append(_Table(["case", "temperature", "all vapour ppm", "all vapour mg/m3",
                     "mixture LFL", "% of LFL", "oxygen %", "flammability",
                     "additive index (TWA)"], total_rows, numeric=(2, 3, 5, 6, 8)))
    if cmp_rows:
        b.append(_Para("Comparison with each limit:"))
        b.append(_Table(["case", "substance", "limit", "source", "headspace ppm", "ratio",
                         "% of limit", "verdict"], cmp_rows, numeric=(4, 5, 6)))
    rows = []
    fp = tank.flash_point
    if fp is not None:
        text = _celsius(fp.estimate)
        if fp.published is not None:
            text += f" (published {_celsius(fp.published)}, {fp.published_source})"
        rows.append(["Estimated flash point (saturated vapour at the LFL)", text, fp.note])
    bt = getattr(tank, "boiling", None)
    if bt is not None:
        text = _celsius(bt.temperature)
        if bt.uncertainty is not None:
            text += f" ± {bt.uncertainty:.1g} K"
        if tank.near_boiling:
            text += " — " + " and ".join(tank.near_boiling) + " case within 5 K: near boiling"
        rows.append([f"Boiling temperature at {bt.pressure / 1000:.4g} kPa", text, bt.method])
    if tank.alarm_temperature is not None:
        rows.append([f"Liquid temperature at {result.scenario.alarms.percent_lfl:g} % LFL",
                     _celsius(tank.alarm_temperature), ""])
    names = {c.key: c.name for c in tank.headspace.liquid.components}
    for key, ratio in tank.hazard_ratios.items():
        rows.append([f"Vapour hazard ratio, {names.get(key, key)}", _n(ratio),
                     "saturated vapour / TWA (Popendorf 1984)"])

    def masses(obj):
        return "; ".join(f"{n} {_kg(m)}" for n, m in zip(obj.names, np.atleast_1d(obj.masses)))

    if tank.inventory is not None:
        rows.append([f"Vapour held in the vapour space ({_n(tank.inventory.volume)} m³)",
                     _kg(tank.inventory.total_mass), masses(tank.inventory)])
    if tank.filling is not None:
        rows.append([f"Vapour expelled by filling ({_n(tank.filling.volume)} m³ pumped in)",
                     _kg(tank.filling.total_mass), masses(tank.filling)])
    if tank.breathing is not None:
        rows.append(["Vapour vented per daily warming (thermal breathing)",
                     _kg(tank.breathing.total_mass),
                     masses(tank.breathing) + f"; {_n(tank.breathing.gas_vented)} mol of gas"])
    if tank.purge is not None:
        p = tank.purge
        rows.append([f"Purge time to {_n(p.target_volume_fraction * 1e6)} ppm",
                     _minutes(p.time) if p.reachable else "not reached",
                     f"{p.case_words}; from {_n(p.initial_volume_fraction * 1e6)} ppm; floor "
                     f"{_n(p.floor_volume_fraction * 1e6)} ppm; {p.note}"])
    if rows:
        b.append(_Table(["quantity", "value", "note"], rows))
    return b


def _flammability_row(z) -> list:
    if not z.judged:
        lfl = ["not judged: no LFL on record"] + [_NOT_SHOWN] * 5
    else:
        never = "never"
        lfl = [_n(z.peak_percent_lfl), _minutes(z.peak_time),
               _minutes(z.above_alarm_from, never),
               _NOT_SHOWN if z.above_alarm_from is None else _minutes(z.back_below_alarm,
                                                                      "not within the run"),
               _minutes(z.above_lfl_from, never),
               _NOT_SHOWN if z.above_lfl_from is None else _minutes(z.back_below_lfl,
                                                                    "not within the run")]
    return [z.zone, *lfl, f"{z.lowest_oxygen:.3g}",
            _minutes(z.below_oxygen_alarm_from, "never")]


def _outdoor_distance_text(distance, flags, edge) -> str:
    if distance is None:
        return f"never (below it from the pool edge, {edge:.2g} m, on)"
    text = f"{distance:,.0f} m"
    return text + (f" ({'; '.join(flags)})" if flags else "")


def _outdoor_flammability_blocks(od) -> list:
    """Downwind flammability: % LFL on the centreline, distances to the LFL and the
    alarm, the saturation cap and the dense-gas criterion."""
    rows = []
    if od.percent_lfl is not None and np.any(np.isfinite(od.lower_flammability_limits)):
        rows.append(["Distance to the LFL (Le Chatelier over the plume's components)",
                     _outdoor_distance_text(od.distance_to_lfl, od.lfl_flags, od.pool_edge), ""])
        rows.append([f"Distance to the LFL alarm ({od.lfl_alarm_percent:g} % LFL)",
                     _outdoor_distance_text(od.distance_to_lfl_alarm, od.lfl_alarm_flags,
                                            od.pool_edge), ""])
        rows.append(["% of the LFL at the distances asked for",
                     "; ".join(f"{d:,.0f} m: {_n(p)} %" for d, p in
                               zip(np.asarray(od.distances, dtype=float), od.percent_lfl)), ""])
    if od.saturation_volume_fraction is not None:
        rows.append(["Centreline capped at the saturated vapour concentration over the pool",
                     "nowhere beyond the pool edge" if od.capped_until is None else
                     f"out to {od.capped_until:,.0f} m",
                     f"{_n(1e6 * float(np.sum(od.saturation_volume_fraction)))} ppm of vapour "
                     "in all (Raoult's law at the pool temperature)"])
    if od.dense_gas is not None:
        dg = od.dense_gas
        rows.append(["Britter-McQuaid criterion, continuous release",
                     f"{dg.value:.2g} (threshold {dg.threshold:g}): "
                     + ("density effects matter" if dg.dense else "passive dispersion"),
                     dg.statement])
    if not rows:
        return []
    return [_Para("Flammability downwind:"), _Table(["quantity", "value", "note"], rows)]


def _spill_blocks(result, spill) -> list:
    b: list = [_Heading(3, f"Spill {spill.name} ({spill.liquid}, {spill.where})")]
    spec = _spill_input(result, spill)
    model = spec.get("model", "mackay-matsugu")
    rows = [["Evaporation model used", model, ""]]
    for name, rate in spill.initial_rates.items():
        rows.append([f"Initial evaporation rate, {name}", f"{_n(rate * 1000)} g/s",
                     "used" if name == model else "for comparison"])
    run = spill.indoor or spill.outdoor
    names = list(run.components)
    keys = _spill_keys(result, spill, names)
    key_names = dict(zip(keys, names))
    if spill.indoor is not None:
        ind = spill.indoor
        rows.append(["Zone model", ind.model, ""])
        rows.append(["Pool area", f"{_n(ind.pool_area)} m²", ""])
        rows.append(["Pool evaporated", _minutes(ind.pool_gone_time), ""])
        if ind.source_removed_time is not None:
            rows.append(["Pool cleaned up", _minutes(ind.source_removed_time), ""])
        rows.append(["Liquid left at the end of the run",
                     _kg(float(np.sum(ind.mass_remaining[-1]))), ""])
        rows.append(["Mass balance error", f"{format_number(ind.mass_balance_error, 2)}",
                     "largest |pool + air + ventilated − spilled| / spilled"])
    b.append(_Table(["quantity", "value", "note"], rows))
    if spill.flammability:
        b.append(_Para("Flammability and oxygen by zone (% of the LFL by Le Chatelier's rule "
                       "over the components in the air; oxygen by displacement):"))
        b.append(_Table(["zone", "highest % LFL", "at", "above the LFL alarm from",
                         "back below the alarm", "above the LFL from", "back below the LFL",
                         "lowest oxygen %", "below the oxygen alarm from"],
                        [_flammability_row(z) for z in spill.flammability],
                        numeric=(1, 2, 3, 4, 5, 6, 7, 8)))
    if spill.exposures:
        rows, cmp_rows = [], []
        for e in spill.exposures:
            name = key_names.get(e.substance, e.substance)
            rows.append([e.zone, name, _n(e.peak), _minutes(e.peak_time), _n(e.twa),
                         _n(e.short_term)])
            for label, limit_ppm, ratio, first, back in e.comparisons:
                lim = _limit_for(result, e.substance, label)
                kind = lim.kind if lim else label.split()[0]
                metric = {"TWA": ("8-h TWA", e.twa), "STEL": ("highest 15-min", e.short_term)
                          }.get(kind, ("peak", e.peak))
                cmp_rows.append([
                    e.zone, name, f"{kind} {lim.value:g} {lim.unit}" if lim else label,
                    lim.source if lim else _NOT_SHOWN, metric[0], _n(metric[1]), _n(ratio),
                    _minutes(first, "never above"),
                    _NOT_SHOWN if first is None else _minutes(back, "not within the run")])
        b.append(_Para("Exposure by zone (ppm by volume):"))
        b.append(_Table(["zone", "substance", "peak ppm", "peak at", "8-h TWA ppm",
                         "highest 15-min average ppm"], rows, numeric=(2, 3, 4, 5)))
        if cmp_rows:
            b.append(_Para("Comparison with each limit:"))
            b.append(_Table(["zone", "substance", "limit", "source", "compared as", "ppm",
                             "ratio", "above from", "back below at"], cmp_rows,
                            numeric=(5, 6, 7, 8)))
    if spill.outdoor is not None:
        od = spill.outdoor
        y = np.asarray(od.volume_fraction, dtype=float) * 1e6
        conc = np.asarray(od.concentration, dtype=float) * 1e6
        rows = []
        for i, d in enumerate(np.asarray(od.distances, dtype=float)):
            for j, name in enumerate(names):
                rows.append([f"{d:,.0f} m", name, _n(y[i, j]), _n(conc[i, j])])
        b.append(_Para(f"Ground-level centreline downwind, from an initial evaporation rate "
                       f"of {_n(float(np.sum(od.emission_rate)) * 1000)} g/s:"))
        b.append(_Table(["distance", "substance", "ppm", "mg/m3"], rows, numeric=(0, 2, 3)))
        b += _outdoor_flammability_blocks(od)
    if spill.distances:
        rows = []
        for label, d, note in spill.distances:
            lim = next((lim for lim in result.scenario.limits if lim.label == label), None)
            if d is None:
                text = "beyond the farthest distance computed"
            elif d == 0:
                text = "below it everywhere"
            else:
                text = f"{d:,.0f} m"
                if d < 100:
                    text += " (under 100 m: outside the range of the dispersion coefficients)"
            rows.append([f"{lim.substance} {lim.kind} {lim.value:g} {lim.unit}" if lim
                         else label, lim.source if lim else _NOT_SHOWN, text, note])
        b.append(_Para("How far downwind the centreline stays above each limit:"))
        b.append(_Table(["limit", "source", "distance", "note"], rows, numeric=(2,)))
    return b


# ---------------------------------------------------------------------------
# Markdown

_MD_SPECIAL = re.compile(r"([\\`*\[\]<>|#~]|(?<![A-Za-z0-9])_|_(?![A-Za-z0-9]))")


def _md(text) -> str:
    """User text made inert in Markdown: punctuation that starts markup is escaped."""
    clean = _NOT_XML.sub("", str(text)).replace("\r", " ").replace("\n", " ")
    return _MD_SPECIAL.sub(lambda m: "\\" + m.group(0), clean)


def _md_table(table: _Table) -> list[str]:
    headers = [_md(h) or " " for h in table.headers]
    align = ["---:" if i in table.numeric else "---" for i in range(len(headers))]
    out = ["| " + " | ".join(headers) + " |", "| " + " | ".join(align) + " |"]
    for row in table.rows:
        out.append("| " + " | ".join(_md(c) for c in row) + " |")
    return out + [""]


def markdown_report(result, plot_dir=None, *, generated_at=None) -> str:
    """A Markdown report of a scenario run, for a hazard-review record.

    Parameters
    ----------
    result : ScenarioResult
        From `estimator.screening.run_scenario`.
    plot_dir : path, optional
        Folder to write the SVG plots to (created if missing). Links to them are
        relative to the folder that holds `plot_dir`, where the Markdown file is
        meant to sit (as `write_report` does). Without it no plot is written and
        the report says the HTML report carries them.
    generated_at : datetime or str, optional
        Time stamp shown as the report time; now (UTC) by default.

    Returns
    -------
    str
    """
    generated = _timestamp(generated_at)
    blocks, has_plots = _blocks(result, generated)
    folder = Path(plot_dir) if plot_dir is not None else None
    if folder is not None:
        folder.mkdir(parents=True, exist_ok=True)
    out = [f"# {_md(result.scenario.title)}", ""]
    for block in blocks:
        if isinstance(block, _Heading):
            out += ["#" * block.level + " " + _md(block.text), ""]
        elif isinstance(block, _Para):
            out += [_md(block.text), ""]
        elif isinstance(block, _Bullets):
            out += [f"- {_md(item)}" for item in block.items] + [""]
        elif isinstance(block, _Table):
            out += _md_table(block)
        elif isinstance(block, _Cautions):
            out += [f"> **{_md(block.title)}**", ">"]
            out += [f"> - **{_md(item)}**" for item in block.items] + [""]
            if block is blocks[1] and has_plots and folder is None:
                out += ["Plots are not included in this Markdown report; the HTML report "
                        "carries them inline.", ""]
        elif isinstance(block, _Plot):
            if folder is None:
                continue
            file = f"{block.name}.svg"
            write_text_atomic(folder / file, block.svg)
            out += [f"![{_md(block.caption)}]({folder.name}/{file})", "",
                    f"*{_md(block.caption)}*", ""]
    return "\n".join(out).rstrip() + "\n"


# ---------------------------------------------------------------------------
# HTML

_CSS = """
:root { --ink: #1c1c1c; --muted: #595959; --rule: #c8c8c4; --band: #f2f2ee;
        --caution: #7a4300; --caution-bg: #fff6e3; }
* { box-sizing: border-box; }
body { font: 15px/1.5 system-ui, -apple-system, "Segoe UI", Helvetica, Arial, sans-serif;
       color: var(--ink); max-width: 64rem; margin: 2rem auto; padding: 0 1.25rem; }
h1 { font-size: 1.65rem; margin: 0 0 .6rem; }
h2 { font-size: 1.25rem; margin: 2.2rem 0 .6rem; padding-bottom: .2rem;
     border-bottom: 2px solid var(--rule); }
h3 { font-size: 1.05rem; margin: 1.6rem 0 .4rem; }
h4 { font-size: .95rem; margin: 1.2rem 0 .3rem; }
p, ul { margin: .4rem 0 .8rem; }
table { border-collapse: collapse; margin: .5rem 0 1.1rem; font-size: .88rem; }
th, td { border: 1px solid var(--rule); padding: .25rem .55rem; text-align: left;
         vertical-align: top; }
th { background: var(--band); font-weight: 600; }
td.num { text-align: right; white-space: nowrap; font-variant-numeric: tabular-nums; }
table.meta th { width: 13rem; }
.cautions { border: 2px solid var(--caution); background: var(--caution-bg);
            padding: .7rem 1.1rem; margin: 1.2rem 0; }
.cautions h2 { border: 0; margin: 0 0 .3rem; padding: 0; color: var(--caution);
               font-size: 1.1rem; }
.cautions li { font-weight: 600; }
nav { font-size: .9rem; color: var(--muted); }
nav ol { margin: .3rem 0; padding-left: 1.4rem; columns: 2; }
figure { margin: 1rem 0 1.4rem; break-inside: avoid; page-break-inside: avoid; }
figcaption { font-size: .85rem; color: var(--muted); max-width: 45rem; }
svg { max-width: 100%; height: auto; }
footer { margin-top: 2rem; font-size: .85rem; color: var(--muted); }
@page { margin: 15mm; }
@media print {
  body { margin: 0; max-width: none; font-size: 10.5pt; }
  nav { display: none; }
  h2, h3, h4 { break-after: avoid; page-break-after: avoid; }
  table, figure, .cautions { break-inside: avoid; page-break-inside: avoid; }
  a { color: inherit; text-decoration: none; }
}
"""


def _h(text) -> str:
    return html.escape(_NOT_XML.sub("", str(text)), quote=True)


def html_report(result, *, generated_at=None) -> str:
    """A self-contained HTML5 report: inline CSS and SVG plots, no scripts or links out.

    Parameters
    ----------
    result : ScenarioResult
    generated_at : datetime or str, optional
        Time stamp shown as the report time; now (UTC) by default.

    Returns
    -------
    str
    """
    generated = _timestamp(generated_at)
    blocks, _ = _blocks(result, generated)
    title = _h(result.scenario.title)
    body = [f"<header><h1>{title}</h1>"]
    sections = [(i, blk.text) for i, blk in enumerate(blocks)
                if isinstance(blk, _Heading) and blk.level == 2]
    anchors = {i: f"section-{k + 1}" for k, (i, _) in enumerate(sections)}
    first_table = True
    figure = 0
    for i, block in enumerate(blocks):
        if isinstance(block, _Heading):
            anchor = f' id="{anchors[i]}"' if i in anchors else ""
            body.append(f"<h{block.level}{anchor}>{_h(block.text)}</h{block.level}>")
        elif isinstance(block, _Para):
            body.append(f"<p>{_h(block.text)}</p>")
        elif isinstance(block, _Bullets):
            body.append("<ul>" + "".join(f"<li>{_h(x)}</li>" for x in block.items) + "</ul>")
        elif isinstance(block, _Table):
            if first_table:
                body.append('<table class="meta">' + "".join(
                    f"<tr><th scope=\"row\">{_h(k)}</th><td>{_h(v)}</td></tr>"
                    for k, v in block.rows) + "</table></header>")
                first_table = False
                continue
            head = "".join(f'<th scope="col">{_h(x)}</th>' for x in block.headers)
            rows = "".join(
                "<tr>" + "".join(f'<td class="num">{_h(c)}</td>' if j in block.numeric
                                 else f"<td>{_h(c)}</td>" for j, c in enumerate(row)) + "</tr>"
                for row in block.rows)
            body.append(f"<table><thead><tr>{head}</tr></thead><tbody>{rows}</tbody></table>")
        elif isinstance(block, _Cautions):
            body.append('<section class="cautions" aria-label="cautions">'
                        f"<h2>{_h(block.title)}</h2><ul>"
                        + "".join(f"<li>{_h(x)}</li>" for x in block.items) + "</ul></section>")
            if i == 1 and sections:
                body.append("<nav><strong>Contents</strong><ol>" + "".join(
                    f'<li><a href="#{anchors[j]}">{_h(text)}</a></li>' for j, text in sections)
                    + "</ol></nav>")
        elif isinstance(block, _Plot):
            figure += 1
            body.append(f"<figure>{block.svg}<figcaption>Figure {figure}. {_h(block.caption)}"
                        "</figcaption></figure>")
    body.append(f"<footer>ullage {_h(result.version)}, "
                f"{generated.strftime('%Y-%m-%d %H:%M:%S UTC')}. A screening estimate; "
                "see the cautions.</footer>")
    return ("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
            "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
            f"<meta name=\"generator\" content=\"ullage {_h(result.version)}\">\n"
            f"<title>{title}</title>\n<style>{_CSS}</style>\n</head>\n<body>\n"
            + "\n".join(body) + "\n</body>\n</html>\n")


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
    for case, t, h, comparisons, additive in _cases(tank):
        data = _headspace_dict(h, comparisons, additive)
        data["vapor_pressure_methods"] = [
            {"substance": comp.key, "method": method, "description": desc,
             "relative_uncertainty": next((e.relative_uncertainty for e in
                                           h.vapor_pressure_methods if e.method == method
                                           and e.source == source), None),
             "uncertainty_basis": basis, "source": source, "why": why}
            for comp, method, desc, _, basis, source, why in _method_rows(h, t)]
        terms = tank.additive_terms if case == "stated" else tank.worst_additive_terms
        if terms is not None:
            data["additive_index_twa_terms"] = [
                {"substance": key, "limit": lim.label, "ratio": ratio}
                for key, lim, ratio in terms.terms]
        out["cases"]["stated" if case == "stated" else "worst"] = data
    if tank.sweep is not None:
        sweep = _headspace_dict(tank.sweep)
        sweep.pop("warnings", None)
        out["sweep"] = sweep
        n = int(np.size(tank.sweep.temperature))
        out["sweep"]["series"] = {"points": n, "downsampled": False}
    else:
        out["sweep"] = None
    fp = tank.flash_point
    out["flash_point"] = None if fp is None else {
        "estimate_k": fp.estimate, "published_k": fp.published,
        "published_source": fp.published_source, "note": fp.note,
        "flammable_whenever_liquid": fp.flammable_whenever_liquid}
    bt = getattr(tank, "boiling", None)
    out["boiling_temperature"] = None if bt is None else {
        "temperature_k": bt.temperature, "temperature_c": bt.temperature - 273.15,
        "pressure_pa": bt.pressure, "uncertainty_k": bt.uncertainty, "method": bt.method,
        "near_boiling": list(tank.near_boiling)}
    out["alarm_temperature_k"] = tank.alarm_temperature
    out["hazard_ratios"] = dict(tank.hazard_ratios)

    def masses(obj, extra=()):
        if obj is None:
            return None
        d = {"names": list(obj.names), "masses_kg": np.atleast_1d(obj.masses),
             "total_mass_kg": obj.total_mass}
        for attr, key in extra:
            d[key] = getattr(obj, attr)
        return d

    out["inventory"] = masses(tank.inventory, [("volume", "volume_m3")])
    out["filling"] = masses(tank.filling, [("volume", "volume_pumped_m3")])
    out["breathing"] = masses(tank.breathing, [("gas_vented", "gas_vented_mol")])
    p = tank.purge
    out["purge"] = None if p is None else {
        "time_s": p.time, "initial_volume_fraction": p.initial_volume_fraction,
        "target_volume_fraction": p.target_volume_fraction,
        "target_ppm": p.target_volume_fraction * 1e6,
        "floor_volume_fraction": p.floor_volume_fraction,
        "residual_evaporation_kg_per_s": p.residual_evaporation, "reachable": p.reachable,
        "note": p.note, "case": p.case, "case_words": p.case_words, "volume_m3": p.volume}
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


def _spill_dict(result, spill) -> dict:
    spec = _spill_input(result, spill)
    run = spill.indoor or spill.outdoor
    names = list(run.components)
    keys = _spill_keys(result, spill, names)
    out = {"name": spill.name, "liquid": spill.liquid, "where": spill.where,
           "evaporation_model": spec.get("model", "mackay-matsugu"),
           "components": [{"key": k, "name": n} for k, n in zip(keys, names)],
           "initial_evaporation_rates_kg_per_s": dict(spill.initial_rates),
           "indoor": None, "outdoor": None}
    if spill.indoor is not None:
        ind = spill.indoor
        zones = _zones(ind)
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
        out["indoor"] = {
            "zone_model": ind.model, "temperature_k": ind.temperature,
            "pressure_pa": ind.pressure, "pool_area_m2": ind.pool_area,
            "pool_gone_time_s": ind.pool_gone_time,
            "source_removed_time_s": ind.source_removed_time,
            "initial_mass_kg": {k: v for k, v in zip(keys, np.atleast_1d(ind.initial_mass))},
            "saturation_kg_per_m3": {k: v for k, v in zip(keys, np.atleast_1d(ind.saturation))},
            "molar_mass_kg_per_mol": {k: v for k, v in zip(keys, np.atleast_1d(ind.molar_masses))},
            "mass_balance_error": ind.mass_balance_error, "series": series}
    if spill.outdoor is not None:
        od = spill.outdoor
        y = np.asarray(od.volume_fraction, dtype=float)
        c = np.asarray(od.concentration, dtype=float)
        out["outdoor"] = {
            "stability": od.stability, "terrain": od.terrain, "wind_speed_m_per_s": od.wind_speed,
            "emission_rate_kg_per_s": {k: v for k, v in zip(keys, np.atleast_1d(od.emission_rate))},
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
                {k: v for k, v in zip(keys, np.atleast_1d(od.saturation_volume_fraction))}),
            "saturation_cap_until_m": od.capped_until,
            "dense_gas": None if od.dense_gas is None else {
                "criterion": "Britter-McQuaid continuous release (g0' q0 / D)^(1/3) / U",
                "value": od.dense_gas.value, "threshold": od.dense_gas.threshold,
                "density_effects_matter": od.dense_gas.dense,
                "mixture_density_kg_per_m3": od.dense_gas.mixture_density,
                "air_density_kg_per_m3": od.dense_gas.air_density,
                "volume_rate_m3_per_s": od.dense_gas.volume_rate,
                "source_dimension_m": od.dense_gas.source_dimension},
            "centreline": {k: {"volume_fraction": y[:, j], "ppm": y[:, j] * 1e6,
                               "concentration_kg_per_m3": c[:, j]} for j, k in enumerate(keys)}}
    out["flammability"] = [_flammability_dict(z) for z in spill.flammability]
    out["exposures"] = [{
        "zone": e.zone, "substance": e.substance, "peak_ppm": e.peak,
        "peak_time_s": e.peak_time, "twa_8h_ppm": e.twa, "highest_15min_ppm": e.short_term,
        "comparisons": [{"limit": label, "limit_ppm": limit_ppm, "ratio": ratio,
                         "source": getattr(_limit_for(result, e.substance, label), "source", None),
                         "first_above_s": first, "back_below_s": back}
                        for label, limit_ppm, ratio, first, back in e.comparisons]}
        for e in spill.exposures]
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
        "generated_at": _timestamp(generated_at).isoformat().replace("+00:00", "Z"),
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
    scenario = result.scenario
    rows: list[dict] = []

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

    head = dict(scenario.document.get("scenario", {}))
    row("scenario", "scenario", quantity="title", note=scenario.title)
    for key in ("site", "description"):
        if key in head:
            row("scenario", "scenario", quantity=key, note=_as_written(head[key]))
    row("scenario", "scenario", quantity="ullage version", note=result.version)
    row("scenario", "scenario", quantity="generated",
        note=_timestamp(generated_at).isoformat().replace("+00:00", "Z"))
    row("scenario", "scenario", quantity="barometric pressure", value=scenario.pressure,
        unit="Pa")
    for section, content in scenario.document.items():
        items = content if isinstance(content, (list, tuple)) else [content]
        for i, item in enumerate(items):
            if not hasattr(item, "items"):
                continue
            label = f"[[{section}]] {i + 1}" if isinstance(content, (list, tuple)) else f"[{section}]"
            for key, value in item.items():
                row(label, "input", quantity=key, note=_as_written(value))
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

    for tank in result.tanks:
        item = f"tank {tank.name}"
        for comp in tank.headspace.liquid.components:
            for group, source in dict(comp.sources).items():
                row(item, "substance_source", substance=comp.key, quantity=group, note=source)
        for case, t, hs, comparisons, additive in _cases(tank):
            label = f"{case} {float(t) - 273.15:.1f} °C"
            row(item, "headspace", label, quantity="temperature", value=t, unit="K")
            for comp, method, desc, unc, basis, source, why in _method_rows(hs, t):
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

    for spill in result.spills:
        item = f"spill {spill.name}"
        spec = _spill_input(result, spill)
        model = spec.get("model", "mackay-matsugu")
        run = spill.indoor or spill.outdoor
        names = list(run.components)
        keys = _spill_keys(result, spill, names)
        for sub in _spill_substances(result, spill, names):
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
        for e in spill.exposures:
            row(item, "exposure", e.zone, e.substance, "peak", e.peak, "ppm")
            row(item, "exposure", e.zone, e.substance, "peak time", e.peak_time, "s")
            row(item, "exposure", e.zone, e.substance, "8-h TWA", e.twa, "ppm")
            row(item, "exposure", e.zone, e.substance, "highest 15-min average", e.short_term,
                "ppm")
            for label, limit_ppm, ratio, first, back in e.comparisons:
                lim = _limit_for(result, e.substance, label)
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

    for label, obj in _items(result):
        for text in obj.findings:
            row(label, "finding", note=text)
    for label, obj in _items(result):
        for text in obj.warnings:
            row(label, "warning", note=text)
    for item, message in result.errors:
        row(item, "error", note=message)
    row("results", "note", note="time series and temperature sweeps are in the JSON export")
    for text in result.cautions:
        row("ullage", "caution", note=text)

    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\r\n")
    writer.writerow(CSV_COLUMNS)
    for cells in rows:
        writer.writerow([neutralise_cell(_NOT_XML.sub("", cells[c]) if isinstance(cells[c], str)
                                         else cells[c]) for c in CSV_COLUMNS])
    return buffer.getvalue()


# ---------------------------------------------------------------------------
# files

def write_report(result, path, format: str | None = None, *, generated_at=None) -> Path:
    """Write a report or export, chosen by file ending or by `format`.

    Parameters
    ----------
    result : ScenarioResult
    path : path
        File to write; it is replaced in one step (`write_text_atomic`).
    format : str, optional
        "markdown", "html", "json" or "csv"; by default from the ending (.md,
        .html, .json, .csv). Markdown plots go to ``<stem>_plots/`` beside the file.
    generated_at : datetime or str, optional
        Time stamp; now (UTC) by default.

    Returns
    -------
    pathlib.Path
        The file written.

    Raises
    ------
    InputError
        Field "format", for a format or file ending that is not one of the above.
    """
    target = Path(path)
    allowed = ", ".join(REPORT_FORMATS)
    endings = ", ".join(e for ends in REPORT_FORMATS.values() for e in ends)
    if format is None:
        suffix = target.suffix.lower()
        chosen = next((name for name, ends in REPORT_FORMATS.items() if suffix in ends), None)
        if chosen is None:
            raise InputError("format", f"cannot tell the format from the file ending "
                              f"{target.suffix or '(none)'!r}; give format as one of "
                              f"{allowed}, or a file ending in {endings}")
    else:
        chosen = str(format).strip().lower()
        chosen = {"md": "markdown", "htm": "html"}.get(chosen, chosen)
        if chosen not in REPORT_FORMATS:
            raise InputError("format", f"{format!r} is not a report format; use one of "
                              f"{allowed}")
    if chosen == "markdown":
        text = markdown_report(result, target.parent / f"{target.stem}_plots",
                               generated_at=generated_at)
    elif chosen == "html":
        text = html_report(result, generated_at=generated_at)
    elif chosen == "json":
        text = results_json(result, generated_at=generated_at)
    else:
        text = results_csv(result, generated_at=generated_at)
    write_text_atomic(target, text)
    return target
