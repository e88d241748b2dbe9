"""Whole scenario documents from the inputs on screen: one page's study
(`study_document`), the document its result is computed from (`view_document`),
its probabilistic run (`monte_carlo_document`) and the whole case for saving
(`full_document`)."""

from __future__ import annotations

import math

from .items import (alarms, conditions, limit_rows, liquid_item, outdoors_item,
                    own_substance, room_item, spill_item, tank_item, uses_own_substance)
from .uncertain import UNCERTAIN, monte_carlo_table, uncertain_entries
from .units import UNITS, key, system


def _head(state) -> dict:
    title = str(state.get(key("title")) or "").strip() or "Untitled case"
    head = {"title": title}
    base = state.get("case.base", {}).get("scenario", {})
    for field in ("site", "description"):
        if base.get(field):
            head[field] = base[field]
    return head


def monte_carlo_document(state, study: str, *, limits=None) -> dict | None:
    """The smallest scenario document that gives a page's probabilistic run, or None
    when no input is given as a range (or the liquid has problems).

    For the tank only what the sampled headspace uses is kept (liquid, pressure,
    limits, alarms), so that changing the tank volume, fill or purge does not
    draw the samples again; with the temperature given as a range the stated
    temperature, which the samples do not use, is replaced by the low end of the
    range for the same reason.
    """
    doc, problems = study_document(state, study, limits=limits, uncertain=True)
    if problems or "uncertain" not in doc:
        return None
    if study == "tank":
        tank = doc["tank"][0]
        trimmed = {k: tank[k] for k in ("name", "liquid", "temperature", "gauge_pressure")
                   if k in tank}
        for entry in doc["uncertain"]:
            spec = entry["distribution"]
            if entry["input"] == "temperature" and isinstance(spec, dict) and len(spec) == 1:
                values = next(iter(spec.values()))
                if isinstance(values, list) and values and isinstance(values[0], str):
                    trimmed["temperature"] = values[0]
        doc["tank"] = [trimmed]
    return doc


def study_document(state, study: str, *, receptors=None, limits=None,
                   uncertain: bool = False) -> tuple[dict, list[str]]:
    """A scenario document for one study ("tank", "indoor" or "outdoor") with the
    inputs on screen, and the problems found while gathering them.

    `limits` replaces the rows of the limits table (as (row, item) pairs). With
    `uncertain`, the inputs given as ranges go in as [[uncertain]] tables with the
    [monte_carlo] settings (ranges with problems are left out).
    """
    problems = []
    doc = {"scenario": _head(state)}
    if conditions(state):
        doc["conditions"] = conditions(state)
    if alarms(state):
        doc["alarms"] = alarms(state)
    if study == "indoor" and state.get("case.base", {}).get("shift"):
        doc["shift"] = dict(state["case.base"]["shift"])
    if uses_own_substance(state, [study]):
        doc["substance"] = [own_substance(state)]
    liquid, liquid_problems = liquid_item(state, study)
    problems += liquid_problems
    doc["liquid"] = [liquid]
    if study == "tank":
        doc["tank"] = [tank_item(state, liquid["name"])]
    elif study == "indoor":
        doc["room"] = [room_item(state)]
        doc["spill"] = [spill_item(state, "indoor", liquid["name"])]
    else:
        doc["spill"] = [spill_item(state, "outdoor", liquid["name"])]
        doc["outdoors"] = outdoors_item(state, receptors)
    rows = limit_rows(state) if limits is None else limits
    if rows:
        doc["limit"] = [item for _, item in rows]
    if uncertain and study in UNCERTAIN:
        item = doc["tank"][0] if study == "tank" else doc["spill"][0]
        entries, _ = uncertain_entries(state, study, item["name"])
        if entries:
            doc["uncertain"] = entries
            doc["monte_carlo"] = monte_carlo_table(state)
    return doc, problems


def view_document(state, study: str, *, limits=None) -> tuple[dict, list[str]]:
    """The scenario document a page's result is computed from: `study_document`, and
    for the tank a temperature sweep over whole steps (10 °C or 20 °F) that covers
    the stated and worst-case temperatures with a margin (15 °C, 27 °F).

    The sweep then stays the same while the temperature moves within a step, so
    the charts update in place. Saved files and reports keep the core's own range.
    """
    doc, problems = study_document(state, study, limits=limits)
    if study == "tank" and not problems:
        tank = doc["tank"][0]
        stated, worst = state.get(key("tank.temperature")), state.get(key("tank.worst"))
        if stated is not None and "sweep_from" not in tank and "sweep_to" not in tank:
            step, margin = (20.0, 27.0) if system(state) == "US" else (10.0, 15.0)
            top = max(float(stated), float(worst)) if worst is not None else float(stated)
            unit = UNITS["temperature"][system(state)][1]
            tank["sweep_from"] = f"{math.floor((float(stated) - margin) / step) * step!r} {unit}"
            tank["sweep_to"] = f"{math.ceil((top + margin) / step) * step!r} {unit}"
    return doc, problems


def full_document(state, studies=None, limits=None) -> dict:
    """The whole case as one scenario document, for saving.

    Holds the studies on screen (those of the loaded file, and those the user has
    opened), and carries along the items of a loaded file that are not on screen.
    """
    include = dict(state.get("case.studies", {}))
    include.update(studies or {})
    base = state.get("case.base", {}) or {}
    doc = {"scenario": _head(state)}
    if conditions(state):
        doc["conditions"] = conditions(state)
    if alarms(state):
        doc["alarms"] = alarms(state)
    if base.get("shift"):
        doc["shift"] = dict(base["shift"])
    chosen = [s for s in ("tank", "indoor", "outdoor") if include.get(s)]
    liquids, names = _study_liquids(state, chosen)
    substances = [own_substance(state)] if uses_own_substance(state, chosen) else []
    own = {x["name"].lower() for x in substances}
    substances += [dict(x) for x in base.get("substance", []) if x["name"].lower() not in own]
    tanks = [tank_item(state, names["tank"])] if "tank" in names else []
    rooms = [room_item(state)] if "indoor" in names else []
    spills = []
    if "indoor" in names:
        spills.append(spill_item(state, "indoor", names["indoor"]))
    if "outdoor" in names:
        spills.append(spill_item(state, "outdoor", names["outdoor"]))
    # items of the loaded file beyond the first tank, indoor spill and outdoor spill
    base_tanks, extra_spills = _carried_items(base, liquids, rooms)
    tanks += [dict(x) for x in base_tanks]
    spills += [dict(x) for x in extra_spills]
    if substances:
        doc["substance"] = substances
    if liquids:
        doc["liquid"] = liquids
    if tanks:
        doc["tank"] = tanks
    if rooms:
        doc["room"] = rooms
    if spills:
        doc["spill"] = spills
    if "outdoor" in names:
        doc["outdoors"] = outdoors_item(state)
    elif base.get("outdoors") and any(s.get("outdoors") for s in extra_spills):
        doc["outdoors"] = dict(base["outdoors"])
    rows = limit_rows(state) if limits is None else limits
    if rows:
        doc["limit"] = [item for _, item in rows]
    # inputs given as ranges: the pages' own, then those of the items carried along
    uncertain = []
    if "tank" in names:
        uncertain += uncertain_entries(state, "tank", tanks[0]["name"])[0]
    if "indoor" in names:
        uncertain += uncertain_entries(state, "indoor", spills[0]["name"])[0]
    carried = {str(x.get("name", "")).strip().lower() for x in base_tanks + extra_spills}
    uncertain += [dict(u) for u in base.get("uncertain", []) or []
                  if str(u.get("item", "")).strip().lower() in carried]
    if uncertain:
        doc["uncertain"] = uncertain
    if uncertain or base.get("monte_carlo"):
        doc["monte_carlo"] = monte_carlo_table(state)
    return doc


def _study_liquids(state, chosen) -> tuple[list[dict], dict]:
    """The liquids of the studies on screen, one entry for the same liquid, a name of
    its own for different liquids of the same name; and each study's liquid name."""
    liquids, names = [], {}
    for s in chosen:
        item, _ = liquid_item(state, s)
        same = next((x for x in liquids if x == item), None)
        if same is None:
            taken = {x["name"].lower() for x in liquids}
            if item["name"].lower() in taken:
                item = dict(item, name=f"{item['name']} ({s})")
            liquids.append(item)
            same = item
        names[s] = same["name"]
    return liquids, names


def _carried_items(base: dict, liquids: list, rooms: list) -> tuple[list, list]:
    """The tanks and spills of a loaded file that are not on screen; the liquids and
    rooms they need are added to `liquids` and `rooms`."""
    base_tanks = list(base.get("tank", []))[1:]
    base_spills = list(base.get("spill", []))
    first_indoor = next((i for i, s in enumerate(base_spills) if s.get("room")), None)
    first_outdoor = next((i for i, s in enumerate(base_spills) if not s.get("room")), None)
    extra_spills = [s for i, s in enumerate(base_spills) if i not in (first_indoor, first_outdoor)]
    needed = {str(x.get("liquid", "")).lower() for x in base_tanks + extra_spills}
    needed_rooms = {str(s.get("room", "")).lower() for s in extra_spills if s.get("room")}
    used_names = {x["name"].lower() for x in liquids}
    for item in base.get("liquid", []):
        if item["name"].lower() in needed and item["name"].lower() not in used_names:
            liquids.append(dict(item))
    room_names = {r["name"].lower() for r in rooms}
    for item in base.get("room", []):
        if item["name"].lower() in needed_rooms and item["name"].lower() not in room_names:
            rooms.append(dict(item))
    return base_tanks, extra_spills
