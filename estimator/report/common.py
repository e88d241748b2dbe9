"""Shared pieces of the reports: number formatting, lookups in a result, constants."""

from __future__ import annotations

import datetime as _dt
import math
import re

import numpy as np

from ..errors import InputError
from ..limits import format_number

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

NOT_SHOWN = "–"
NOT_XML = re.compile("[\x00-\x08\x0b\x0c\x0e-\x1f\x7f\ufffe\uffff]")


# ---------------------------------------------------------------------------
# numbers and words, formatted once for Markdown and HTML alike

def _finite(value) -> bool:
    return value is not None and math.isfinite(float(value))


def number_text(value) -> str:
    """Three significant figures with thousands separators (as `format_ppm`)."""
    from ..limits import format_ppm

    if value is None:
        return NOT_SHOWN
    if not _finite(value):
        return "not finite"
    return format_ppm(float(value))


def percent_text(value) -> str:
    if value is None:
        return NOT_SHOWN
    return number_text(value)


def celsius_text(kelvin) -> str:
    return NOT_SHOWN if kelvin is None else f"{float(kelvin) - 273.15:.1f} °C"


def minutes_text(seconds, none: str = NOT_SHOWN) -> str:
    if seconds is None:
        return none
    if not _finite(seconds):
        return "not within the run"
    return f"{float(seconds) / 60:.0f} min"


def kg_text(value) -> str:
    return NOT_SHOWN if value is None else f"{number_text(value)} kg"


def timestamp(generated_at) -> _dt.datetime:
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


def as_written(value) -> str:
    """A scenario value the way it reads in the file."""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, str):
        return value
    if isinstance(value, (list, tuple)):
        return "[" + ", ".join(as_written(v) for v in value) + "]"
    if isinstance(value, dict) or hasattr(value, "items"):
        return "{ " + ", ".join(f"{k} = {as_written(v)}" for k, v in value.items()) + " }"
    if isinstance(value, (_dt.date, _dt.time)):
        return value.isoformat()
    return str(value)


def file_slug(text: str) -> str:
    slug = re.sub(r"[^a-z0-9]+", "-", str(text).lower()).strip("-")[:40].strip("-")
    return slug or "item"


# ---------------------------------------------------------------------------
# reading the result objects

def tank_cases(tank):
    """(case name, temperature [K], Headspace, comparisons, additive index)."""
    out = [("stated", tank.temperature, tank.headspace, tank.comparisons, tank.additive_index)]
    if tank.worst is not None:
        out.append(("worst case", tank.worst_temperature, tank.worst, tank.worst_comparisons,
                    tank.worst_additive_index))
    return out


def limit_for(result, substance: str, label: str):
    for lim in result.scenario.limits:
        if lim.substance == substance and lim.label == label:
            return lim
    return None


def limits_of(result, keys):
    return [lim for lim in result.scenario.limits if lim.substance in keys]


def short_limit(lim) -> str:
    text = f"{lim.substance} {lim.kind} {lim.value:g} {lim.unit}"
    if lim.unit != "ppm":
        text += f" ({number_text(lim.ppm)} ppm)"
    return text


def spill_input(result, spill) -> dict:
    for item in result.scenario.spills:
        if item.get("name") == spill.name:
            return item
    return {}


def spill_substances(result, spill, names) -> list:
    """Substances of a spill's liquid, in the order of the model's component names."""
    entry = result.scenario.liquids.get(spill.liquid, {})
    spec = entry.get("spec")
    pool = list(spec) if isinstance(spec, dict) else ([spec] if spec is not None else [])
    out = []
    for name in names:
        out.append(next((s for s in pool if getattr(s, "name", None) == name), None))
    return out


def spill_keys(result, spill, names) -> list[str]:
    subs = spill_substances(result, spill, names)
    return [s.key if s is not None else name for s, name in zip(subs, names)]


def indoor_zones(indoor):
    if indoor.near_field is not None:
        return [("near_field", "near field"), ("room", "far field")]
    return [("room", "room")]


def method_rows(hs, temperature):
    """(substance, method, description, uncertainty text, basis, source, why) per component."""
    rows = []
    estimates = list(hs.vapor_pressure_methods)
    components = list(hs.liquid.components)
    water_case = len(estimates) != len(components)
    for j, comp in enumerate(components):
        if water_case and j > 0:
            source = ""
            try:
                from ..henry import henry_constants

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
               f" ({celsius_text(lo)} to {celsius_text(hi)})" if inside else
               "no method's data cover this temperature: extrapolated (see the warnings)")
        rows.append((comp, est.method, est.description, unc, est.uncertainty_basis,
                     est.source, why))
    return rows


def unit_text(unit) -> str:
    return "" if unit in ("", "-", None) else str(unit)


def tank_names(tank) -> dict:
    return {c.key: c.name for c in tank.headspace.liquid.components}


def result_items(result):
    return ([(f"Tank {t.name}", t) for t in result.tanks]
            + [(f"Spill {s.name}", s) for s in result.spills])
