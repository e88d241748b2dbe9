"""Scenario items from the inputs on screen: the [[liquid]], [[tank]], [[room]],
[[spill]] and [outdoors] tables of the pages, the user's own [[substance]], the
[[limit]] rows, [alarms] and [conditions].

Inputs are written as text with their unit ("34.0 degC"), so that
`estimator.scenario.loads_scenario` converts them at the edge. An input left as
a loaded file gave it is written as the file wrote it, and the keys of a loaded
item that no page edits travel along as written.
"""

from __future__ import annotations

import math

from .defaults import LIQUID_DEFAULTS
from .units import UNITS, key, system, table_key, text, to_display, unchanged


#: Keys of a loaded file's items that the pages edit; the other keys of those items
#: travel along into the saved file as written.
EDITED_KEYS = {
    "tank": {"name", "liquid", "temperature", "worst_temperature", "volume", "fill",
             "gauge_pressure", "daily_low", "daily_high", "pumped_volume", "purge_rate",
             "purge_target", "purge_mixing_factor"},
    "indoor": {"name", "liquid", "temperature", "volume", "mass", "area", "dike_area", "room",
               "duration", "cleanup_after", "model"},
    "outdoor": {"name", "liquid", "temperature", "volume", "mass", "area", "dike_area",
                "outdoors", "room", "model"},
    "room": {"name", "volume", "air_changes", "ventilation_rate", "mixing_factor", "air_speed",
             "near_field_radius", "random_air_speed"},
    "outdoors": {"wind_speed", "wind_height", "stability", "daytime", "cloud_cover",
                 "insolation", "terrain", "receptors"},
}


def base_item(state, which: str) -> dict:
    """The written item of the loaded file shown on a page ("tank", "indoor",
    "outdoor", "room", "outdoors"), or an empty dict."""
    base = state.get("case.base", {}) or {}
    si = (state.get("case.base_si", {}) or {}).get(which)
    if not si:
        return {}
    if which == "outdoors":
        return dict(base.get("outdoors") or {})
    section = {"tank": "tank", "indoor": "spill", "outdoor": "spill", "room": "room"}[which]
    name = str(si.get("name", "")).strip().lower()
    return next((dict(x) for x in base.get(section, []) or []
                 if str(x.get("name", "")).strip().lower() == name), {})


def kept(state, name: str, which: str, field: str):
    """An input as scenario text: as the loaded file wrote it while it is unchanged on
    screen (left out when the file left it to its default), else as entered."""
    si = ((state.get("case.base_si", {}) or {}).get(which) or {}).get(field)
    if si is None or not unchanged(state, name, si):
        return text(state, name)
    return base_item(state, which).get(field)


def _carry(item: dict, state, which: str) -> dict:
    """Add the keys of the loaded item that no page edits, as written."""
    for name, value in base_item(state, which).items():
        if name not in item and name not in EDITED_KEYS[which]:
            item[name] = value
    return item


def filled_rows(frame) -> list[dict]:
    """The non-empty rows of a table as dicts, blanks as None."""
    if frame is None or len(frame) == 0:
        return []
    columns = list(frame.columns)
    out = []
    for values in frame.itertuples(index=False, name=None):
        cleaned = {c: (None if _blank(v) else v) for c, v in zip(columns, values)}
        if any(v is not None for v in cleaned.values()):
            out.append(cleaned)
    return out


def _blank(value) -> bool:
    if value is None:
        return True
    if isinstance(value, float) and math.isnan(value):
        return True
    return isinstance(value, str) and not value.strip()


def own_substance(state) -> dict:
    """The user's own substance as a [[substance]] table."""
    item = {"name": str(state.get(key("sds.name")) or "").strip() or "my solvent",
            "molar_mass": f"{float(state.get(key('sds.molar_mass')) or 0.0)!r} g/mol",
            "boiling_point": text(state, "sds.boiling") or "",
            "source": "user-entered (safety data sheet)"}
    vp, vp_t = text(state, "sds.vp"), text(state, "sds.vp_temperature")
    if vp is not None and vp_t is not None:
        item["vapor_pressure"] = [[vp_t, vp]]
    for field, name in (("lower_flammability_limit", "sds.lfl"),
                        ("upper_flammability_limit", "sds.ufl")):
        value = state.get(key(name))
        if value is not None:
            item[field] = f"{float(value)!r} %"
    if text(state, "sds.density") is not None:
        item["liquid_density"] = text(state, "sds.density")
    if text(state, "sds.flash") is not None:
        item["flash_point"] = text(state, "sds.flash")
    return item


def liquid_item(state, prefix: str) -> tuple[dict, list[str]]:
    """The [[liquid]] table of one page, and problems found in its rows."""
    from estimator.substances import substance

    kind = state.get(key(f"{prefix}.kind"), "table")
    named = str(state.get(key(f"{prefix}.liquid_name")) or "").strip()
    problems = []
    if kind == "sds":
        from ullage_ui import sds_input

        return sds_input.liquid_item(state, prefix)
    if kind == "own":
        name = own_substance(state)["name"]
        return {"name": named or name, "substance": name}, problems
    if kind == "mixture":
        components = {}
        for i, row in enumerate(filled_rows(state.get(table_key(f"{prefix}.mixture"))), 1):
            if row.get("component") is None:
                problems.append(f"row {i}: choose the component")
                continue
            if row.get("percent") is None:
                problems.append(f"row {i}: give the percentage of {row['component']}")
                continue
            components[str(row["component"])] = f"{float(row['percent'])!r} %"
        if not components:
            problems.append("enter at least one component and its percentage")
        item = {"name": named or "mixture", "components": components,
                "basis": state.get(key(f"{prefix}.basis"), "mass")}
        return item, problems
    if kind == "water":
        dissolved = {}
        for i, row in enumerate(filled_rows(state.get(table_key(f"{prefix}.dissolved"))), 1):
            if row.get("compound") is None or row.get("mg/L") is None:
                problems.append(f"row {i}: give the compound and its concentration in mg/L")
                continue
            dissolved[str(row["compound"])] = f"{float(row['mg/L'])!r} mg/L"
        if not dissolved:
            problems.append("enter at least one dissolved compound and its concentration")
        return {"name": named or "water with dissolved solvents",
                "dissolved_in_water": dissolved}, problems
    chosen = state.get(key(f"{prefix}.substance")) or LIQUID_DEFAULTS.get(prefix, "toluene")
    try:
        name = substance(chosen).name
    except Exception:  # shown by the substance chooser; keep the text for the message
        name = str(chosen)
    loaded = _loaded_liquid(state, prefix)
    if loaded and loaded.get("substance") == chosen and named:
        name = named  # the loaded file's own name for this liquid
    return {"name": name, "substance": chosen}, problems


def _loaded_liquid(state, prefix: str) -> dict:
    """The written [[liquid]] table of the loaded item on a page, or an empty dict."""
    wanted = str(base_item(state, prefix).get("liquid", "")).strip().lower()
    base = state.get("case.base", {}) or {}
    return next((dict(x) for x in base.get("liquid", []) or []
                 if wanted and str(x.get("name", "")).strip().lower() == wanted), {})


def uses_own_substance(state, prefixes) -> bool:
    name = own_substance(state)["name"].lower()
    for p in prefixes:
        kind = state.get(key(f"{p}.kind"))
        if kind == "own":
            return True
        if kind == "mixture" and any(str(r.get("component", "")).lower() == name
                                     for r in filled_rows(state.get(table_key(f"{p}.mixture")))):
            return True
    return any(str(r.get("substance", "")).lower() == name
               for r in filled_rows(state.get(table_key("limits"))))


def conditions(state) -> dict:
    mode = state.get(key("site.mode"), "sea level")
    out = {}
    si = state.get("case.base_si", {}) or {}
    written = (state.get("case.base", {}) or {}).get("conditions", {})
    if mode == "elevation" and text(state, "site.elevation"):
        out["elevation"] = (written["elevation"] if "elevation" in written
                            and unchanged(state, "site.elevation", si.get("elevation"))
                            else text(state, "site.elevation"))
    elif mode == "barometric" and text(state, "site.barometric"):
        out["barometric_pressure"] = (
            written["barometric_pressure"] if "barometric_pressure" in written
            and unchanged(state, "site.barometric", si.get("pressure"))
            else text(state, "site.barometric"))
    air = (state.get("case.base", {}) or {}).get("conditions", {}).get("air_temperature")
    if air:
        out["air_temperature"] = air
    return out


def alarms(state) -> dict:
    from estimator.limits import FlammabilityAlarms

    default = FlammabilityAlarms()
    values = {"percent_lfl": state.get(key("alarm.percent_lfl")),
              "oxygen_low": state.get(key("alarm.oxygen_low")),
              "oxygen_high": state.get(key("alarm.oxygen_high"))}
    source = str(state.get(key("alarm.source")) or "").strip()
    if (values["percent_lfl"] == default.percent_lfl
            and values["oxygen_low"] == default.oxygen_low
            and values["oxygen_high"] == default.oxygen_high and source == default.source):
        return {}
    out = {}
    if values["percent_lfl"] is not None:
        out["percent_lfl"] = float(values["percent_lfl"])
    for name in ("oxygen_low", "oxygen_high"):
        if values[name] is not None:
            out[name] = f"{float(values[name])!r} %"
    out["source"] = source or "entered on screen"
    return out


def limit_rows(state) -> list[tuple[int, dict]]:
    """(row number, [[limit]] table) for every non-empty row of the limits table."""
    out = []
    for i, row in enumerate(filled_rows(state.get(table_key("limits"))), 1):
        item = {"substance": "" if row.get("substance") is None else str(row["substance"])}
        kind = row.get("kind") or "TWA"
        value = row.get("value")
        unit = row.get("unit") or "ppm"
        item[str(kind)] = "" if value is None else f"{float(value)!r} {unit}"
        item["source"] = "" if row.get("source") is None else str(row["source"]).strip()
        out.append((i, item))
    return out


def tank_item(state, liquid_name: str) -> dict:
    item = {"name": str(state.get(key("tank.name")) or "tank 1").strip() or "tank 1",
            "liquid": liquid_name,
            "temperature": kept(state, "tank.temperature", "tank", "temperature")}
    for field, name in (("worst_temperature", "tank.worst"), ("volume", "tank.volume"),
                        ("fill", "tank.fill"), ("gauge_pressure", "tank.gauge")):
        value = kept(state, name, "tank", field)
        if value is not None:
            item[field] = value
    if state.get(key("tank.details")):
        for field, name in (("daily_low", "tank.daily_low"), ("daily_high", "tank.daily_high"),
                            ("pumped_volume", "tank.pumped"), ("purge_rate", "tank.purge_rate"),
                            ("purge_target", "tank.purge_target")):
            value = kept(state, name, "tank", field)
            if value is not None:
                item[field] = value
        if item.get("purge_rate") and state.get(key("tank.purge_mixing")) not in (None, 1.0):
            item["purge_mixing_factor"] = float(state[key("tank.purge_mixing")])
    if item.get("fill") is not None and item.get("volume") is None:
        item.pop("fill")
    return _carry(item, state, "tank")


def room_item(state) -> dict:
    item = {"name": str(state.get(key("room.name")) or "room 1").strip() or "room 1",
            "volume": kept(state, "room.volume", "room", "volume"),
            "air_changes": text(state, "room.air_changes"),
            "mixing_factor": float(state.get(key("room.mixing")) or 1.0),
            "air_speed": kept(state, "room.air_speed", "room", "air_speed")}
    written = base_item(state, "room")
    si = (state.get("case.base_si", {}) or {}).get("room") or {}
    if written and unchanged(state, "room.air_changes", si.get("air_changes")) and (
            unchanged(state, "room.volume", si.get("volume"))):
        if "ventilation_rate" in written:
            item.pop("air_changes")
            item["ventilation_rate"] = written["ventilation_rate"]
        elif "air_changes" in written:
            item["air_changes"] = written["air_changes"]
    if written and "mixing_factor" in written and unchanged(state, "room.mixing",
                                                             si.get("mixing_factor")):
        item["mixing_factor"] = written["mixing_factor"]
    for field, name in (("near_field_radius", "room.near_field_radius"),
                        ("random_air_speed", "room.random_air_speed")):
        value = kept(state, name, "room", field)
        if value is not None:
            item[field] = value
    return _carry({k: v for k, v in item.items() if v is not None}, state, "room")


def spill_item(state, prefix: str, liquid_name: str) -> dict:
    item = {"name": str(state.get(key(f"{prefix}.name")) or prefix).strip() or prefix,
            "liquid": liquid_name,
            "temperature": kept(state, f"{prefix}.temperature", prefix, "temperature")}
    if prefix == "indoor" and state.get(key("indoor.amount_kind")) == "mass":
        item["mass"] = kept(state, "indoor.mass", prefix, "mass")
    else:
        item["volume"] = kept(state, f"{prefix}.volume", prefix, "volume")
    for field, name in (("area", f"{prefix}.area"), ("dike_area", f"{prefix}.dike")):
        value = kept(state, name, prefix, field)
        if value is not None:
            item[field] = value
    written = base_item(state, prefix)
    if prefix == "indoor":
        item["room"] = room_item(state)["name"]
        item["duration"] = kept(state, "indoor.duration", prefix, "duration")
        if item["duration"] is None and text(state, "indoor.duration") is not None:
            item["duration"] = text(state, "indoor.duration")
        value = kept(state, "indoor.cleanup", prefix, "cleanup_after")
        if value is not None:
            item["cleanup_after"] = value
    else:
        item["outdoors"] = True
        if not written:
            item["duration"] = "60.0 min"
    model = state.get(key(f"{prefix}.model"), "mackay-matsugu")
    if model != "mackay-matsugu" or "model" in written:
        item["model"] = model
    return _carry({k: v for k, v in item.items() if v is not None}, state, prefix)


def receptor_entries(state) -> tuple[list[float], list[str]]:
    """The downwind distances typed that can be used, in the display length unit, and
    the problem of each of the others (each is left out, the rest kept)."""
    from estimator.checks import positive
    from estimator.errors import UllageError

    values, problems = [], []
    for part in str(state.get(key("weather.receptors")) or "").replace(";", ",").split(","):
        part = part.strip()
        if not part:
            continue
        try:
            (distance,) = receptor_distances(part)
        except (UllageError, ValueError) as exc:
            problems.append(getattr(exc, "reason", None) or f"'{part}' is not a distance")
            continue
        try:
            positive(distance, "Downwind distances", "m")
        except UllageError:
            problems.append(f"'{part}' is not above 0; a distance downwind of the pool "
                            "must be positive")
            continue
        values.append(to_display(distance, "length", system(state)))
    return values, problems


def receptor_distances(raw: str) -> list[float]:
    """Downwind distances typed as text with units ("100 m, 0.5 km, 2000 ft") -> [m].

    A number without a unit is refused (InputError naming the field): the box takes
    any length unit, so a bare number could mean metres or feet.
    """
    from estimator.errors import InputError
    from estimator.units import parse_quantity

    out = []
    for part in str(raw).replace(";", ",").split(","):
        part = part.strip()
        if not part:
            continue
        try:
            float(part)
        except ValueError:
            out.append(parse_quantity(part, "length", "Downwind distances"))
            continue
        raise InputError("Downwind distances", f"'{part}' has no unit; write it with one, "
                         f"for example '{part} m' or '{part} ft'")
    return out


def outdoors_item(state, receptors=None) -> dict:
    length = UNITS["length"][system(state)][1]
    item = {"wind_speed": kept(state, "weather.wind", "outdoors", "wind_speed")}
    height = kept(state, "weather.wind_height", "outdoors", "wind_height")
    if height is not None or not base_item(state, "outdoors"):
        item["wind_height"] = height if height is not None else text(state, "weather.wind_height")
    sky = state.get(key("weather.sky"), "day")
    if sky == "class":
        item["stability"] = str(state.get(key("weather.stability")) or "D")
    elif sky == "night":
        item["daytime"] = False
        item["cloud_cover"] = float(state.get(key("weather.cloud")) or 0.0)
    else:
        item["daytime"] = True
        item["insolation"] = str(state.get(key("weather.insolation")) or "moderate")
    item["terrain"] = str(state.get(key("weather.terrain")) or "open")
    # saving keeps every distance as typed, one that cannot be read included (the
    # page names it); the file then says what is wrong with it when loaded
    values, problems = receptor_entries(state) if receptors is None else (receptors, [])
    written = base_item(state, "outdoors")
    loaded = ((state.get("case.base_si", {}) or {}).get("outdoors") or {}).get("receptors")
    if (receptors is None and not problems and written.get("receptors") and loaded
            and values == [to_display(x, "length", system(state)) for x in loaded]):
        item["receptors"] = list(written["receptors"])
    elif receptors is None and (values or problems):
        item["receptors"] = [part.strip() for part in str(
            state.get(key("weather.receptors")) or "").replace(";", ",").split(",")
            if part.strip()]
    elif values:
        item["receptors"] = [f"{float(v)!r} {length}" for v in values]
    return _carry({k: v for k, v in item.items() if v is not None}, state, "outdoors")
