"""Document blocks: the content of the Markdown and HTML reports, built once.

The blocks for tanks, spills and Monte Carlo runs and the plots that go with them."""

from __future__ import annotations

import math
from dataclasses import dataclass
from pathlib import Path

import numpy as np

from ..limits import format_number
from .common import (
    NOT_SHOWN, as_written, celsius_text, file_slug, indoor_zones, kg_text, limit_for,
    limits_of, method_rows, minutes_text, number_text, percent_text, result_items,
    short_limit, spill_input, spill_keys, spill_substances, tank_cases, tank_names,
    unit_text,
)

# ---------------------------------------------------------------------------
# the document as blocks, rendered to Markdown or HTML

@dataclass
class Heading:
    level: int
    text: str


@dataclass
class Para:
    text: str


@dataclass
class Bullets:
    items: list


@dataclass
class Table:
    headers: list
    rows: list
    numeric: tuple = ()


@dataclass
class Plot:
    name: str
    caption: str
    svg: str


@dataclass
class Cautions:
    title: str
    items: list


def _wants_log(series: dict, hlines: dict) -> bool:
    values = np.concatenate([np.ravel(np.asarray(v, dtype=float)) for v in series.values()]
                            + [np.asarray(list(hlines.values()), dtype=float)])
    positive = values[np.isfinite(values) & (values > 0)]
    return positive.size > 1 and float(positive.max()) / float(positive.min()) > 100.0


def _plot(name, caption, x, series, hlines, *, x_label, y_label, title, log_x=False,
          log_y=None):
    from ..plots import line_plot_svg

    svg = line_plot_svg(x, series, x_label=x_label, y_label=y_label, title=title,
                        hlines=hlines, log_x=log_x,
                        log_y=_wants_log(series, hlines) if log_y is None else log_y)
    return Plot(name, caption, svg)


def _limit_lines(result, keys) -> dict:
    """Short label -> ppm of the limits entered for the substances `keys`."""
    return {short_limit(lim): lim.ppm for lim in limits_of(result, set(keys))}


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
    hlines = _limit_lines(result, {c.key for c in comps})
    stem = f"tank{index + 1}-{file_slug(tank.name)}"
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


def _indoor_plots(result, stem, spill) -> list:
    """Concentration against time in each zone (split by zone when there are many
    curves), and % of the LFL against time in the zones where it is judged."""
    out = []
    ind = spill.indoor
    names = list(ind.components)
    hlines = _limit_lines(result, spill_keys(result, spill, names))
    series = {}
    for zone, label in indoor_zones(ind):
        ppm = np.asarray(ind.ppm(zone), dtype=float)
        for j, name in enumerate(names):
            series[f"{label}: {name}" if len(names) > 1 else label] = ppm[:, j]
    minutes = np.asarray(ind.times, dtype=float) / 60.0
    groups = [series]
    if len(series) > 6:
        groups = [{k: v for k, v in series.items() if k.startswith(label + ":")}
                  for _, label in indoor_zones(ind)]
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
    return out


def _centreline_profile(spill, names):
    """Distances, centreline ppm per curve, and the LFL and LFL-alarm lines [ppm] of an
    outdoor spill's plot: the distances asked for, or, when the source can be
    evaluated anywhere, a grid from the pool's edge past the farthest crossing."""
    od = spill.outdoor
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
    return x, series, lfl_lines


def _outdoor_plots(result, stem, spill) -> list:
    """Centreline concentration against downwind distance, with the limits and the LFL."""
    od = spill.outdoor
    names = list(od.components)
    x, series, lfl_lines = _centreline_profile(spill, names)
    hlines = _limit_lines(result, spill_keys(result, spill, names))
    hlines.update(lfl_lines)
    if np.asarray(x).size < 2:
        return []
    return [_plot(
        f"{stem}-centreline-distance", f"Spill {spill.name}: ground-level centreline "
        f"concentration against downwind distance (stability class {od.stability}, "
        f"{od.terrain} terrain, {format_number(od.wind_speed, 2)} m/s at 10 m) from the pool's edge, "
        "capped at the saturated vapour concentration over the pool, with the "
        "exposure limits, the LFL and the LFL alarm (dashed).", x, series, hlines,
        x_label="downwind distance [m]",
        y_label="centreline concentration [ppm by volume]",
        title=f"Spill {spill.name}: centreline by distance", log_x=True)]


def spill_plots(result, index, spill) -> list:
    """The plots of one spill: indoor concentrations and % LFL by time, the outdoor
    centreline by distance."""
    out = []
    stem = f"spill{index + 1}-{file_slug(spill.name)}"
    if spill.indoor is not None:
        out += _indoor_plots(result, stem, spill)
    if spill.outdoor is not None:
        out += _outdoor_plots(result, stem, spill)
    return out


def _head_blocks(result, generated) -> list:
    """The report's head table, the cautions and the summary."""
    scenario = result.scenario
    doc = scenario.document
    head = dict(doc.get("scenario", {}))
    b: list = []
    b.append(Table(["", ""], [
        ["Site", head.get("site", "not given")],
        ["Description", head.get("description", "not given")],
        ["Report generated", generated.strftime("%Y-%m-%d %H:%M:%S UTC")],
        ["ullage version", result.version],
        ["Scenario written for ullage", head.get("ullage_version", "not recorded")],
        ["Scenario file", Path(scenario.source_path).name if scenario.source_path
         else "not from a file"],
    ]))
    b.append(Cautions("Cautions", list(result.cautions)))

    # summary
    b.append(Heading(2, "Summary"))
    verdict = ("At least one exposure limit or flammability/oxygen alarm is exceeded in "
               "this screening." if result.exceeded else
               "No exposure limit or flammability/oxygen alarm is exceeded in this "
               "screening.")
    b.append(Para(f"{verdict} {len(result.tanks)} tank(s) and {len(result.spills)} "
                   f"spill(s) were screened; {len(result.errors)} item(s) could not be "
                   "computed."))
    return b


def _input_blocks(scenario) -> list:
    """The inputs as written, the limits entered and the alarm levels."""
    doc = scenario.document
    b: list = []
    b.append(Heading(2, "Inputs as written"))
    b.append(Para("The scenario's values exactly as entered, with their units."))
    for section, content in doc.items():
        if isinstance(content, (list, tuple)):
            for i, item in enumerate(content):
                name = item.get("name") or item.get("substance") or item.get("item") or ""
                b.append(Heading(3, f"[[{section}]] {i + 1}" + (f": {name}" if name else "")))
                b.append(Table(["key", "value"], [[k, as_written(v)] for k, v in item.items()]))
        elif hasattr(content, "items"):
            b.append(Heading(3, f"[{section}]"))
            b.append(Table(["key", "value"], [[k, as_written(v)] for k, v in content.items()]))
    b.append(Heading(3, "Exposure limits entered"))
    if scenario.limits:
        b.append(Table(["substance", "kind", "as entered", "in ppm", "source"], [
            [lim.substance, lim.kind, f"{lim.value:g} {lim.unit}", number_text(lim.ppm), lim.source]
            for lim in scenario.limits], numeric=(3,)))
    else:
        b.append(Para("No exposure limits were entered: only flammability and oxygen are "
                       "compared."))
    al = scenario.alarms
    b.append(Para(f"Alarm levels: {al.percent_lfl:g} % of the LFL; oxygen below "
                   f"{al.oxygen_low:g} % or above {al.oxygen_high:g} % ({al.source}). "
                   f"Barometric pressure {scenario.pressure / 1000:.2f} kPa."))
    return b


def _tank_method_blocks(result) -> list:
    """The headspace methods, per tank, case and component."""
    b: list = []
    b.append(Heading(3, "Headspace"))
    b.append(Para("Equilibrium vapour space over the liquid: each component's partial "
                   "pressure by Raoult's law from its saturated vapour pressure (Henry's "
                   "law for compounds dissolved in water), concentrations from the "
                   "partial pressures, the mixture's flammability limits by Le "
                   "Chatelier's rule (Mashuga & Crowl 2000), oxygen by displacement of "
                   "air. Why: a closed vapour space left to settle reaches equilibrium, "
                   "the highest concentration it can hold at that temperature."))
    grouped = {}
    for tank in result.tanks:
        for case, t, hs, _, _ in tank_cases(tank):
            for comp, method, desc, unc, basis, source, why in method_rows(hs, t):
                key = (tank.name, comp.name, desc, unc, basis or NOT_SHOWN, source, why)
                grouped.setdefault(key, []).append(case)
    rows = [[key[0], ", ".join(cases), *key[1:]] for key, cases in grouped.items()]
    b.append(Para("Vapour pressure, per component:"))
    b.append(Table(["tank", "case", "substance", "method", "stated uncertainty (95 %)",
                     "uncertainty basis", "source", "why"], rows))
    activity = sorted({t.headspace.liquid.activity_source for t in result.tanks})
    b.append(Para("Liquid-phase activity: " + "; ".join(activity) + "."))
    return b


def _spill_method_blocks(result) -> list:
    """The evaporation, air and dispersion methods of each spill."""
    from ..evaporation import MODELS

    scenario = result.scenario
    b: list = []
    b.append(Heading(3, "Spills"))
    rows = []
    for spill in result.spills:
        spec = spill_input(result, spill)
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
    b.append(Table(["spill", "step", "method", "why"], rows))
    shift = scenario.shift
    b.append(Para(f"Exposure metrics: the 8-h TWA over a work shift of "
                   f"{shift.duration / 3600:g} h from {shift.start / 3600:g} h; the "
                   "highest 15-min rolling average (compared with STEL values; over the "
                   "whole run when it is shorter than 15 min); the peak (compared with "
                   "ceiling and emergency values). Computed on the full series."))
    return b


def _substance_blocks(result) -> list:
    """The sources of the substance data used."""
    b: list = []
    subs = {}
    for tank in result.tanks:
        for comp in tank.headspace.liquid.components:
            subs.setdefault(comp.key, comp)
    for spill in result.spills:
        run = spill.indoor or spill.outdoor
        for sub in spill_substances(result, spill, list(run.components)):
            if sub is not None:
                subs.setdefault(sub.key, sub)
    if subs:
        b.append(Heading(3, "Substance data"))
        grouped: dict = {}
        for sub in subs.values():
            for group, source in dict(sub.sources).items():
                grouped.setdefault((source, group), []).append(
                    f"{sub.name} ({sub.cas})" if sub.cas else sub.name)
        rows = [[group.replace("_", " "), source, ", ".join(names)]
                for (source, group), names in grouped.items()]
        b.append(Table(["values", "source", "substances"], rows))
        looked_up = [f"{sub.name} ({sub.cas})" for sub in subs.values()
                     if sub.origin == "lookup"]
        if looked_up:
            b.append(Para("Not in ullage's curated table, taken from the property "
                           "library (chemicals) as compiled there: " + ", ".join(looked_up)
                           + ". Check these values against the supplier's safety data "
                           "sheet; a flammability limit or flash point not on record "
                           "must be entered from the safety data sheet."))

    return b


def _result_blocks(result) -> tuple[list, bool]:
    """The results of each tank and spill, and whether they hold plots."""
    b: list = []
    has_plots = False
    for i, tank in enumerate(result.tanks):
        b += _tank_blocks(result, i, tank)
        plots = _tank_plots(result, i, tank)
        mc = getattr(tank, "monte_carlo", None)
        mc_plots = _monte_carlo_plots(result, f"tank{i + 1}-{file_slug(tank.name)}",
                                      f"Tank {tank.name}", mc, tank_names(tank))
        has_plots |= bool(plots) or bool(mc_plots)
        b += plots
        b += _monte_carlo_blocks(mc)
        b += mc_plots
    for i, spill in enumerate(result.spills):
        b += _spill_blocks(result, spill)
        plots = spill_plots(result, i, spill)
        mc = getattr(spill, "monte_carlo", None)
        mc_plots = _monte_carlo_plots(result, f"spill{i + 1}-{file_slug(spill.name)}",
                                      f"Spill {spill.name}", mc, None)
        has_plots |= bool(plots) or bool(mc_plots)
        b += plots
        b += _monte_carlo_blocks(mc)
        b += mc_plots
    if not result.tanks and not result.spills:
        b.append(Para("No tank or spill was computed."))

    return b, has_plots


def _notes_blocks(result, heading, attribute) -> list:
    """A section listing each item's findings or warnings (`attribute`), or "None."."""
    b: list = [Heading(2, heading)]
    for label, item in result_items(result):
        notes = getattr(item, attribute)
        if notes:
            b.append(Heading(3, label))
            b.append(Bullets(list(notes)))
    if len(b) == 1:
        b.append(Para("None."))
    return b


def _closing_blocks(result) -> list:
    """Findings, warnings, what was not computed, and the cautions again."""
    b = _notes_blocks(result, "Findings", "findings")
    b += _notes_blocks(result, "Warnings", "warnings")

    b.append(Heading(2, "Not computed"))
    if result.errors:
        b.append(Table(["item", "why"], [[item, message] for item, message in result.errors]))
    else:
        b.append(Para("Everything the scenario asks for was computed."))

    b.append(Cautions("Cautions (again)", list(result.cautions)))
    return b


def document_blocks(result, generated) -> tuple[list, bool]:
    """The report as blocks, and whether it holds plots."""
    b = _head_blocks(result, generated)
    b += _input_blocks(result.scenario)
    b.append(Heading(2, "Methods used and why"))
    if result.tanks:
        b += _tank_method_blocks(result)
    if result.spills:
        b += _spill_method_blocks(result)
    b += _substance_blocks(result)
    b.append(Heading(2, "Assumptions"))
    b.append(Bullets(list(result.assumptions)) if result.assumptions
             else Para("None beyond the methods above."))

    # results
    b.append(Heading(2, "Results"))
    results, has_plots = _result_blocks(result)
    b += results
    b += _closing_blocks(result)
    return b, has_plots



def _monte_carlo_blocks(mc) -> list:
    """Tables of a probabilistic screening run, if there is one."""
    if mc is None:
        return []
    b: list = [Heading(4, "Probabilistic screening"),
               Para(f"{mc.model} chain, {mc.n:,} samples (seed {mc.seed}, which reproduces "
                     "the run). Uncertain inputs:")]
    b.append(Table(["input", "distribution"], [[k, v] for k, v in dict(mc.inputs).items()]))
    rows, low = [], []
    for name, table in dict(mc.percentiles).items():
        table = dict(table)
        head = [name.replace("_", " "), unit_text(dict(mc.units).get(name))]
        if name == "oxygen_percent":  # the hazard is low oxygen: its low percentiles
            low.append(head + [number_text(table.get(q)) for q in (1, 5, 50)])
        else:
            rows.append(head + [number_text(table.get(q)) for q in (50, 90, 95, 99)])
    b.append(Table(["output", "unit", "median", "90th percentile", "95th percentile",
                     "99th percentile"], rows, numeric=(2, 3, 4, 5)))
    if low:
        b.append(Table(["output (low is the hazard)", "unit", "1st percentile",
                         "5th percentile", "median"], low, numeric=(2, 3, 4)))
    if mc.exceedance:
        b.append(Table(["limit or alarm", "probability of exceeding it"],
                        [[label, f"{number_text(100 * p)} %"] for label, p in dict(mc.exceedance).items()],
                        numeric=(1,)))
    rows = []
    for output, ranks in dict(mc.sensitivity).items():
        ranks = dict(ranks)
        if ranks:
            top, rho = next(iter(ranks.items()))
            rows.append([output.replace("_", " "), top, f"{rho:.2f}"])
    if rows:
        b.append(Para("What drives the spread (largest Spearman rank correlation):"))
        b.append(Table(["output", "input", "rank correlation"], rows, numeric=(2,)))
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
    from ..uncertainty import unique_labels

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
            lines.append({"limit": lim, "label": label, "line": short_limit(lim),
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
        lines.append({"limit": lim, "label": label, "line": short_limit(lim),
                      "ppm": float(lim.ppm), "compared": own})
    return curves, lines


def _monte_carlo_plots(result, stem, what, mc, names) -> list:
    """The cumulative curve of a probabilistic run's key concentrations, with the limits."""
    if mc is None:
        return []
    from ..plots import cumulative_plot_svg

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
    return [Plot(f"{stem}-probability-cumulative", caption, svg)]


def _tank_case_rows(tank) -> tuple[list, list, list]:
    """Rows per case of the component table, the whole-vapour table and the
    comparison with each limit."""
    comp_rows, total_rows, cmp_rows = [], [], []
    for case, t, hs, comparisons, index_value in tank_cases(tank):
        comps = list(hs.liquid.components)
        ppm = np.atleast_1d(np.asarray(hs.ppm, dtype=float))
        mg = np.atleast_1d(np.asarray(hs.mg_per_m3, dtype=float))
        x = np.asarray(hs.liquid.mole_fractions, dtype=float)
        for j, comp in enumerate(comps):
            shares = [f"{c.limit.kind}: {number_text(100 * c.ratio)} %" for c in comparisons
                      if c.limit.substance == comp.key]
            p_sat = float(np.atleast_1d(np.asarray(hs.saturation_pressures, dtype=float))[j])
            comp_rows.append([case, celsius_text(t), comp.name, f"{number_text(x[j])}",
                              number_text(p_sat / 1000) if math.isfinite(p_sat) else "Henry's law",
                              number_text(ppm[j]), number_text(mg[j]), "; ".join(shares) or NOT_SHOWN])
        lfl = float(hs.lfl_mixture)
        total_rows.append([case, celsius_text(t), number_text(hs.total_ppm), number_text(hs.total_mg_per_m3),
                           f"{number_text(100 * lfl)} %" if math.isfinite(lfl) else NOT_SHOWN,
                           percent_text(hs.percent_lfl), percent_text(hs.oxygen_percent),
                           str(hs.flammability_words),
                           number_text(index_value) if index_value is not None else NOT_SHOWN])
        names = {c.key: c.name for c in comps}
        for c in comparisons:
            lim = c.limit
            cmp_rows.append([case, names.get(lim.substance, lim.substance),
                             f"{lim.kind} {lim.value:g} {lim.unit}", lim.source,
                             number_text(c.concentration * 1e6), number_text(c.ratio), f"{number_text(100 * c.ratio)} %",
                             "above" if c.exceeded else "below"])
    return comp_rows, total_rows, cmp_rows


def _tank_temperature_rows(result, tank) -> list:
    """Flash point, boiling temperature, the temperature at the LFL alarm and the
    vapour hazard ratios."""
    rows = []
    fp = tank.flash_point
    if fp is not None:
        text = celsius_text(fp.estimate)
        if fp.published is not None:
            text += f" (published {celsius_text(fp.published)}, {fp.published_source})"
        rows.append(["Estimated flash point (saturated vapour at the LFL)", text, fp.note])
    bt = getattr(tank, "boiling", None)
    if bt is not None:
        text = celsius_text(bt.temperature)
        if bt.uncertainty is not None:
            text += f" ± {bt.uncertainty:.1g} K"
        if tank.near_boiling:
            text += " — " + " and ".join(tank.near_boiling) + " case within 5 K: near boiling"
        rows.append([f"Boiling temperature at {bt.pressure / 1000:.4g} kPa", text, bt.method])
    if tank.alarm_temperature is not None:
        rows.append([f"Liquid temperature at {result.scenario.alarms.percent_lfl:g} % LFL",
                     celsius_text(tank.alarm_temperature), ""])
    names = {c.key: c.name for c in tank.headspace.liquid.components}
    for key, ratio in tank.hazard_ratios.items():
        rows.append([f"Vapour hazard ratio, {names.get(key, key)}", number_text(ratio),
                     "saturated vapour / TWA (Popendorf 1984)"])
    return rows


def _tank_vapour_rows(tank) -> list:
    """Vapour held, expelled by filling and vented by breathing, and the purge time."""
    rows = []

    def masses(obj):
        return "; ".join(f"{n} {kg_text(m)}" for n, m in zip(obj.names, np.atleast_1d(obj.masses)))

    if tank.inventory is not None:
        rows.append([f"Vapour held in the vapour space ({number_text(tank.inventory.volume)} m³)",
                     kg_text(tank.inventory.total_mass), masses(tank.inventory)])
    if tank.filling is not None:
        rows.append([f"Vapour expelled by filling ({number_text(tank.filling.volume)} m³ pumped in)",
                     kg_text(tank.filling.total_mass), masses(tank.filling)])
    if tank.breathing is not None:
        rows.append(["Vapour vented per daily warming (thermal breathing)",
                     kg_text(tank.breathing.total_mass),
                     masses(tank.breathing) + f"; {number_text(tank.breathing.gas_vented)} mol of gas"])
    if tank.purge is not None:
        p = tank.purge
        rows.append([f"Purge time to {number_text(p.target_volume_fraction * 1e6)} ppm",
                     minutes_text(p.time) if p.reachable else "not reached",
                     f"{p.case_words}; from {number_text(p.initial_volume_fraction * 1e6)} ppm; floor "
                     f"{number_text(p.floor_volume_fraction * 1e6)} ppm; {p.note}"])
    return rows


def _tank_blocks(result, index, tank) -> list:
    """A tank's results: headspace per case and component, the comparison with each
    limit, and the quantities derived from them."""
    b: list = [Heading(3, f"Tank {tank.name} ({tank.liquid})")]
    comp_rows, total_rows, cmp_rows = _tank_case_rows(tank)
    b.append(Para(f"Vapour-space pressure {tank.pressure / 1000:.2f} kPa (absolute)."))
    b.append(Table(["case", "temperature", "substance", "liquid mole fraction",
                     "vapour pressure of the pure liquid kPa", "ppm",
                     "mg/m3 (at the vapour-space temperature and pressure)", "% of limits"],
                    comp_rows, numeric=(3, 4, 5, 6)))
    b.append(Table(["case", "temperature", "all vapour ppm", "all vapour mg/m3",
                     "mixture LFL", "% of LFL", "oxygen %", "flammability",
                     "additive index (TWA)"], total_rows, numeric=(2, 3, 5, 6, 8)))
    if cmp_rows:
        b.append(Para("Comparison with each limit:"))
        b.append(Table(["case", "substance", "limit", "source", "headspace ppm", "ratio",
                         "% of limit", "verdict"], cmp_rows, numeric=(4, 5, 6)))
    rows = _tank_temperature_rows(result, tank) + _tank_vapour_rows(tank)
    if rows:
        b.append(Table(["quantity", "value", "note"], rows))
    return b


def _flammability_row(z) -> list:
    if not z.judged:
        lfl = ["not judged: no LFL on record"] + [NOT_SHOWN] * 5
    else:
        never = "never"
        lfl = [number_text(z.peak_percent_lfl), minutes_text(z.peak_time),
               minutes_text(z.above_alarm_from, never),
               NOT_SHOWN if z.above_alarm_from is None else minutes_text(z.back_below_alarm,
                                                                      "not within the run"),
               minutes_text(z.above_lfl_from, never),
               NOT_SHOWN if z.above_lfl_from is None else minutes_text(z.back_below_lfl,
                                                                    "not within the run")]
    return [z.zone, *lfl, f"{z.lowest_oxygen:.3g}",
            minutes_text(z.below_oxygen_alarm_from, "never")]


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
                     "; ".join(f"{d:,.0f} m: {number_text(p)} %" for d, p in
                               zip(np.asarray(od.distances, dtype=float), od.percent_lfl)), ""])
    if od.saturation_volume_fraction is not None:
        rows.append(["Centreline capped at the saturated vapour concentration over the pool",
                     "nowhere beyond the pool edge" if od.capped_until is None else
                     f"out to {od.capped_until:,.0f} m",
                     f"{number_text(1e6 * float(np.sum(od.saturation_volume_fraction)))} ppm of vapour "
                     "in all (Raoult's law at the pool temperature)"])
    if od.dense_gas is not None:
        dg = od.dense_gas
        rows.append(["Britter-McQuaid criterion, continuous release",
                     f"{dg.value:.2g} (threshold {dg.threshold:g}): "
                     + ("density effects matter" if dg.dense else "passive dispersion"),
                     dg.statement])
    if not rows:
        return []
    return [Para("Flammability downwind:"), Table(["quantity", "value", "note"], rows)]


def _spill_quantity_rows(result, spill, model) -> list:
    """The evaporation model and initial rates, and the indoor pool's figures."""
    rows = [["Evaporation model used", model, ""]]
    for name, rate in spill.initial_rates.items():
        rows.append([f"Initial evaporation rate, {name}", f"{number_text(rate * 1000)} g/s",
                     "used" if name == model else "for comparison"])
    if spill.indoor is not None:
        ind = spill.indoor
        rows.append(["Zone model", ind.model, ""])
        rows.append(["Pool area", f"{number_text(ind.pool_area)} m²", ""])
        rows.append(["Pool evaporated", minutes_text(ind.pool_gone_time), ""])
        if ind.source_removed_time is not None:
            rows.append(["Pool cleaned up", minutes_text(ind.source_removed_time), ""])
        rows.append(["Liquid left at the end of the run",
                     kg_text(float(np.sum(ind.mass_remaining[-1]))), ""])
        rows.append(["Mass balance error", f"{format_number(ind.mass_balance_error, 2)}",
                     "largest |pool + air + ventilated − spilled| / spilled"])
    return rows


def _exposure_blocks(result, spill, key_names) -> list:
    """Exposure metrics by zone and substance, and their comparison with each limit."""
    rows, cmp_rows = [], []
    for e in spill.exposures:
        name = key_names.get(e.substance, e.substance)
        rows.append([e.zone, name, number_text(e.peak), minutes_text(e.peak_time), number_text(e.twa),
                     number_text(e.short_term)])
        for label, limit_ppm, ratio, first, back in e.comparisons:
            lim = limit_for(result, e.substance, label)
            kind = lim.kind if lim else label.split()[0]
            metric = {"TWA": ("8-h TWA", e.twa), "STEL": ("highest 15-min", e.short_term)
                      }.get(kind, ("peak", e.peak))
            cmp_rows.append([
                e.zone, name, f"{kind} {lim.value:g} {lim.unit}" if lim else label,
                lim.source if lim else NOT_SHOWN, metric[0], number_text(metric[1]), number_text(ratio),
                minutes_text(first, "never above"),
                NOT_SHOWN if first is None else minutes_text(back, "not within the run")])
    b: list = [Para("Exposure by zone (ppm by volume):"),
               Table(["zone", "substance", "peak ppm", "peak at", "8-h TWA ppm",
                      "highest 15-min average ppm"], rows, numeric=(2, 3, 4, 5))]
    if cmp_rows:
        b.append(Para("Comparison with each limit:"))
        b.append(Table(["zone", "substance", "limit", "source", "compared as", "ppm",
                         "ratio", "above from", "back below at"], cmp_rows,
                        numeric=(5, 6, 7, 8)))
    return b


def _centreline_blocks(od, names) -> list:
    """The ground-level centreline at the distances asked for, and flammability downwind."""
    y = np.asarray(od.volume_fraction, dtype=float) * 1e6
    conc = np.asarray(od.concentration, dtype=float) * 1e6
    rows = []
    for i, d in enumerate(np.asarray(od.distances, dtype=float)):
        for j, name in enumerate(names):
            rows.append([f"{d:,.0f} m", name, number_text(y[i, j]), number_text(conc[i, j])])
    b: list = [Para(f"Ground-level centreline downwind, from an initial evaporation rate "
                    f"of {number_text(float(np.sum(od.emission_rate)) * 1000)} g/s:"),
               Table(["distance", "substance", "ppm", "mg/m3"], rows, numeric=(0, 2, 3))]
    return b + _outdoor_flammability_blocks(od)


def _distance_blocks(result, spill) -> list:
    """How far downwind the centreline stays above each limit."""
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
                     else label, lim.source if lim else NOT_SHOWN, text, note])
    return [Para("How far downwind the centreline stays above each limit:"),
            Table(["limit", "source", "distance", "note"], rows, numeric=(2,))]


def _spill_blocks(result, spill) -> list:
    """A spill's results: its figures, flammability by zone, exposures, the outdoor
    centreline and the distances to the limits."""
    b: list = [Heading(3, f"Spill {spill.name} ({spill.liquid}, {spill.where})")]
    model = spill_input(result, spill).get("model", "mackay-matsugu")
    b.append(Table(["quantity", "value", "note"], _spill_quantity_rows(result, spill, model)))
    names = list((spill.indoor or spill.outdoor).components)
    if spill.flammability:
        b.append(Para("Flammability and oxygen by zone (% of the LFL by Le Chatelier's rule "
                       "over the components in the air; oxygen by displacement):"))
        b.append(Table(["zone", "highest % LFL", "at", "above the LFL alarm from",
                         "back below the alarm", "above the LFL from", "back below the LFL",
                         "lowest oxygen %", "below the oxygen alarm from"],
                        [_flammability_row(z) for z in spill.flammability],
                        numeric=(1, 2, 3, 4, 5, 6, 7, 8)))
    if spill.exposures:
        key_names = dict(zip(spill_keys(result, spill, names), names))
        b += _exposure_blocks(result, spill, key_names)
    if spill.outdoor is not None:
        b += _centreline_blocks(spill.outdoor, names)
    if spill.distances:
        b += _distance_blocks(result, spill)
    return b
