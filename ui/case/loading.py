"""A loaded scenario put on screen: its first tank, indoor spill and outdoor spill,
their liquids, the site, alarms, limits and uncertain inputs become the inputs of
the pages, and what the pages show of the file is remembered (``case.base``,
``case.base_si``, ``case.base_uncertain``) to tell an input left as loaded from
one the user changed."""

from __future__ import annotations

import pandas as pd

from estimator.units import convert

from .defaults import LIMIT_COLUMNS, dissolved_frame, empty_limits, mixture_frame, reset_defaults
from .uncertain import DEFAULT_SEED, DISTRIBUTIONS, MAX_SAMPLES, UNCERTAIN, uncertain_name
from .units import QUANTITIES, UNITS, key, round_shown, system, table_key, to_display


def _set(state, name: str, value_si) -> None:
    kind = QUANTITIES[name][0]
    state[key(name)] = to_display(value_si, kind, system(state))


#: Store key of the liquids found in the property library during this visit.
LIBRARY_FOUND = "lookup.found"


def remember_library_substance(state, sub) -> None:
    """Offer a liquid looked up in the property library in the choosers from now on."""
    if getattr(sub, "origin", None) == "lookup":
        state.setdefault(LIBRARY_FOUND, {})[sub.key] = {
            "name": sub.name,
            "label": f"{sub.name} ({sub.cas}) — property library, not the curated table"}


def _set_liquid(state, prefix: str, entry: dict, scenario) -> None:
    from ullage_ui import sds_input

    if sds_input.set_from_scenario(state, prefix, entry, scenario):
        return
    kind = entry["kind"]
    state[key(f"{prefix}.liquid_name")] = entry["name"]
    state[key(f"{prefix}.find")] = ""
    spec = entry["spec"]
    if kind == "water":
        state[key(f"{prefix}.kind")] = "water"
        state[table_key(f"{prefix}.dissolved")] = dissolved_frame(
            [(s.name, round_shown(convert(c, "kg/m**3", "mg/L"))) for s, c in spec.items()])
        return
    if isinstance(spec, dict):
        state[key(f"{prefix}.kind")] = "mixture"
        state[key(f"{prefix}.basis")] = entry.get("basis", "mass")
        state[table_key(f"{prefix}.mixture")] = mixture_frame(
            [(s.name, round_shown(100.0 * x)) for s, x in spec.items()])
        for s in spec:
            remember_library_substance(state, s)
            if s.origin == "user":
                _set_own(state, s, scenario)
        return
    if spec.origin == "user":
        state[key(f"{prefix}.kind")] = "own"
        _set_own(state, spec, scenario)
        return
    state[key(f"{prefix}.kind")] = "table"
    remember_library_substance(state, spec)
    state[key(f"{prefix}.substance")] = spec.key


def _set_own(state, sub, scenario) -> None:
    from estimator.units import parse_quantity, parse_temperature

    state[key("sds.name")] = sub.name
    state[key("sds.molar_mass")] = round_shown(sub.molar_mass * 1000.0)
    _set(state, "sds.boiling", sub.boiling_point)
    state[key("sds.lfl")] = (None if sub.lower_flammability_limit is None
                             else round_shown(100.0 * sub.lower_flammability_limit))
    state[key("sds.ufl")] = (None if sub.upper_flammability_limit is None
                             else round_shown(100.0 * sub.upper_flammability_limit))
    _set(state, "sds.density", sub.liquid_density)
    _set(state, "sds.flash", sub.flash_point)
    state[key("sds.vp")] = state[key("sds.vp_temperature")] = None
    for raw in scenario.document.get("substance", []):
        if str(raw.get("name", "")).strip().lower() == sub.name.lower():
            points = raw.get("vapor_pressure") or []
            if points:
                t, p = points[0]
                _set(state, "sds.vp_temperature", parse_temperature(t, "vapour pressure"))
                _set(state, "sds.vp", parse_quantity(p, "pressure", "vapour pressure"))


def apply_scenario(state, scenario, source: str) -> list[str]:
    """Put a loaded scenario's first tank, indoor spill and outdoor spill on screen.

    Returns notes on what is shown and what only travels along in the saved file.
    """
    keep_units = state.get(key("units"), False)
    reset_defaults(state)
    state[key("units")] = keep_units
    notes = []
    doc = scenario.document
    state["case.base"] = _plain(doc)
    state["case.source"] = source
    state[key("title")] = scenario.title
    _apply_site_and_alarms(state, scenario)
    studies = {"tank": False, "indoor": False, "outdoor": False}
    if scenario.tanks:
        studies["tank"] = True
        _apply_tank(state, scenario)
        if len(scenario.tanks) > 1:
            notes.append(f"{len(scenario.tanks)} tanks in the file: the first is on the "
                         "tank page; the others are kept in the saved file.")
    indoor = [s for s in scenario.spills if s.get("room")]
    if indoor:
        studies["indoor"] = True
        _apply_indoor(state, indoor[0], scenario)
    outdoor = [s for s in scenario.spills if not s.get("room")]
    if outdoor:
        studies["outdoor"] = True
        _apply_outdoor(state, outdoor[0], scenario)
    state["case.studies"] = studies
    state["case.base_si"] = _base_si(scenario, indoor, outdoor)
    notes += _set_uncertain(state, scenario)
    rows = [(_limit_name(lim, scenario), lim.kind, float(lim.value), lim.unit, lim.source)
            for lim in scenario.limits]
    state[table_key("limits")] = pd.DataFrame(rows, columns=LIMIT_COLUMNS).astype(
        {"value": "float"}) if rows else empty_limits()
    spills = len(scenario.spills) - len(indoor[:1]) - len(outdoor[:1])
    if spills > 0:
        notes.append(f"{spills} further spill(s) in the file are kept in the saved file.")
    return notes


def _apply_site_and_alarms(state, scenario) -> None:
    """The site pressure (barometric or by elevation) and the alarm levels."""
    cond = scenario.document.get("conditions", {})
    if "barometric_pressure" in cond:
        state[key("site.mode")] = "barometric"
        _set(state, "site.barometric", scenario.pressure)
    elif "elevation" in cond:
        from estimator.units import parse_quantity

        state[key("site.mode")] = "elevation"
        _set(state, "site.elevation", parse_quantity(cond["elevation"], "length", "elevation"))
    alarms = scenario.alarms
    state[key("alarm.percent_lfl")] = float(alarms.percent_lfl)
    state[key("alarm.oxygen_low")] = float(alarms.oxygen_low)
    state[key("alarm.oxygen_high")] = float(alarms.oxygen_high)
    state[key("alarm.source")] = alarms.source


def _apply_tank(state, scenario) -> None:
    """The first tank onto the tank page."""
    tank = scenario.tanks[0]
    state[key("tank.name")] = tank["name"]
    _set_liquid(state, "tank", scenario.liquids[tank["liquid"]], scenario)
    for name, field in (("tank.temperature", "temperature"), ("tank.worst", "worst_temperature"),
                        ("tank.volume", "volume"), ("tank.gauge", "gauge_pressure"),
                        ("tank.daily_low", "daily_low"), ("tank.daily_high", "daily_high"),
                        ("tank.pumped", "pumped_volume"), ("tank.purge_rate", "purge_rate"),
                        ("tank.purge_target", "purge_target")):
        _set(state, name, tank.get(field))
    if tank.get("fill") is not None:
        _set(state, "tank.fill", tank["fill"])
    state[key("tank.purge_mixing")] = float(tank.get("purge_mixing_factor", 1.0))
    state[key("tank.details")] = any(tank.get(k) is not None for k in (
        "daily_low", "pumped_volume", "purge_rate"))


def _apply_indoor(state, spill, scenario) -> None:
    """The first indoor spill and its room onto the indoor page."""
    room = next(r for r in scenario.rooms if r["name"] == spill["room"])
    _set_spill(state, "indoor", spill, scenario)
    state[key("indoor.duration")] = to_display(spill["duration"], "minutes", "SI")
    if spill.get("cleanup_after") is not None:
        state[key("indoor.cleanup")] = to_display(spill["cleanup_after"], "minutes", "SI")
    if spill.get("mass") is not None:
        state[key("indoor.amount_kind")] = "mass"
        _set(state, "indoor.mass", spill["mass"])
    state[key("room.name")] = room["name"]
    _set(state, "room.volume", room["volume"])
    _set(state, "room.air_changes", room["ventilation_rate"] / room["volume"])
    state[key("room.mixing")] = float(room["mixing_factor"])
    _set(state, "room.air_speed", room["air_speed"])
    _set(state, "room.near_field_radius", room.get("near_field_radius"))
    _set(state, "room.random_air_speed", room.get("random_air_speed"))


def _apply_outdoor(state, spill, scenario) -> None:
    """The first outdoor spill and the weather onto the outdoor page; the distances as
    written in the file."""
    _set_spill(state, "outdoor", spill, scenario)
    od = scenario.outdoors
    _set(state, "weather.wind", od["wind_speed"])
    _set(state, "weather.wind_height", od.get("wind_height", 10.0))
    if od.get("stability"):
        state[key("weather.sky")] = "class"
        state[key("weather.stability")] = od["stability"]
    elif od.get("daytime", True):
        state[key("weather.sky")] = "day"
        state[key("weather.insolation")] = od.get("insolation") or "moderate"
    else:
        state[key("weather.sky")] = "night"
        state[key("weather.cloud")] = float(od.get("cloud_cover", 4.0) or 0.0)
    state[key("weather.terrain")] = od.get("terrain", "open")
    units = system(state)
    written = list(scenario.document.get("outdoors", {}).get("receptors") or [])
    state[key("weather.receptors")] = ", ".join(
        str(x) for x in written) if written else ", ".join(
        f"{to_display(x, 'length', units):g} {UNITS['length'][units][1]}"
        for x in od["receptors"])


def _base_si(scenario, indoor, outdoor) -> dict:
    """The SI values of the items of a loaded file that the pages show, to tell an
    input left as loaded from one the user changed (see `kept`)."""
    out = {"pressure": scenario.pressure}
    cond = scenario.document.get("conditions", {})
    if "elevation" in cond:
        from estimator.units import parse_quantity

        out["elevation"] = parse_quantity(cond["elevation"], "length", "elevation")
    if scenario.tanks:
        out["tank"] = _plain(dict(scenario.tanks[0]))
    if indoor:
        out["indoor"] = _plain(dict(indoor[0]))
        room = next(r for r in scenario.rooms if r["name"] == indoor[0]["room"])
        out["room"] = _plain(dict(room))
        out["room"]["air_changes"] = room["ventilation_rate"] / room["volume"]
    if outdoor:
        out["outdoor"] = _plain(dict(outdoor[0]))
        out["outdoors"] = _plain(dict(scenario.outdoors or {}))
    return out


def _set_uncertain(state, scenario) -> list[str]:
    """Put the distributions of the first tank and indoor spill in the Uncertainty boxes."""
    notes = []
    first = {"tank": scenario.tanks[0]["name"] if scenario.tanks else None,
             "indoor": next((s["name"] for s in scenario.spills if s.get("room")), None)}
    written = list(scenario.document.get("uncertain", []))
    kept = 0
    for entry, raw in zip(scenario.uncertain, written):
        study = "tank" if entry["kind"] == "tank" else "indoor"
        if entry["item"] != first[study] or entry["input"] not in UNCERTAIN[study]:
            kept += 1
            continue
        _set_distribution(state, study, entry["input"], entry["distribution"],
                          raw.get("distribution"))
    if kept:
        notes.append(f"{kept} uncertain input(s) in the file are not edited on the pages; "
                     "they are kept in the saved file and in the runs of their items.")
    mc = scenario.monte_carlo
    samples = int(mc["samples"])
    if samples > MAX_SAMPLES:
        notes.append(f"The file asks for {samples:,} Monte Carlo samples; the pages draw at "
                     f"most {MAX_SAMPLES:,}.")
    state[key("mc.samples")] = max(100, min(samples, MAX_SAMPLES))
    if mc["seed"] is not None:
        state[key("mc.seed")] = int(mc["seed"])
    elif scenario.uncertain:
        notes.append(f"The file gives no Monte Carlo seed; seed {DEFAULT_SEED} is used so the "
                     "run repeats.")
    state[key("mc.method")] = bool(mc["method_uncertainty"])
    return notes


def _set_distribution(state, study: str, field: str, dist, written) -> None:
    from estimator.uncertainty import LogNormal, Triangular, Uniform

    _, _, kind, options = UNCERTAIN[study][field]

    def put(part, value_si):
        name = uncertain_name(study, field, part)
        if kind is None:
            state[key(name)] = round_shown(float(value_si))
        else:
            _set(state, name, value_si)

    choice = "file"
    if isinstance(dist, Uniform) and "uniform" in options:
        choice = "uniform"
        put("low", dist.low)
        put("high", dist.high)
    elif isinstance(dist, Triangular) and "triangular" in options:
        choice = "triangular"
        put("low", dist.low)
        put("mode", dist.mode)
        put("high", dist.high)
    elif isinstance(dist, LogNormal) and "lognormal" in options:
        choice = "lognormal"
        put("gm", dist.geometric_mean)
        state[key(uncertain_name(study, field, "gsd"))] = round_shown(dist.geometric_sd)
    state[key(uncertain_name(study, field, "kind"))] = choice
    state[key(uncertain_name(study, field, "file"))] = (_plain(written) if choice == "file"
                                                        else None)
    if choice != "file":
        si = {"low": getattr(dist, "low", None), "mode": getattr(dist, "mode", None),
              "high": getattr(dist, "high", None), "gm": getattr(dist, "geometric_mean", None),
              "gsd": getattr(dist, "geometric_sd", None)}
        state.setdefault("case.base_uncertain", {})[f"{study}.{field}"] = {
            "choice": choice, "si": {p: si[p] for p in DISTRIBUTIONS[choice]},
            "written": _plain(written)}


def _limit_name(limit, scenario) -> str:
    for sub in scenario.substances:
        if sub.key == limit.substance:
            return sub.name
    try:
        from estimator.substances import substance

        return substance(limit.substance).name
    except Exception:  # a key that no longer resolves: show it as stored
        return limit.substance


def _set_spill(state, prefix: str, spill: dict, scenario) -> None:
    state[key(f"{prefix}.name")] = spill["name"]
    _set_liquid(state, prefix, scenario.liquids[spill["liquid"]], scenario)
    _set(state, f"{prefix}.temperature", spill["temperature"])
    if spill.get("volume") is not None:
        _set(state, f"{prefix}.volume", spill["volume"])
    _set(state, f"{prefix}.area", spill.get("area"))
    _set(state, f"{prefix}.dike", spill.get("dike_area"))
    state[key(f"{prefix}.model")] = spill.get("model", "mackay-matsugu")


def _plain(value):
    """A scenario document as plain dicts and lists (for copying and saving)."""
    if isinstance(value, dict) or hasattr(value, "items"):
        return {k: _plain(v) for k, v in value.items()}
    if isinstance(value, list):
        return [_plain(v) for v in value]
    return value
