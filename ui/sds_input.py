"""A liquid from its safety data sheet: paste or upload the sheet, check what was read.

The sheet is read by `estimator.sds.read_sds`; this block only gathers and shows.
What was read goes into editable tables (ingredients with their ranges, shares
with no identity, section-9 properties) that the user confirms before the
liquid is used. The liquid then travels as a [[liquid]] with its ``ranges``,
``unlisted`` shares and the sheet's original text (``sds_text``), so a saved
scenario keeps the sheet it came from.
"""

from __future__ import annotations

import pandas as pd
import streamlit as st

from estimator.errors import UllageError

from ullage_ui import case
from ullage_ui.case import key, table_key

#: Largest sheet uploaded. [MB]
MAX_UPLOAD_MB = 10

INGREDIENT_COLUMNS = ["CAS", "ingredient", "low %", "high %"]
UNLISTED_COLUMNS = ["share", "low %", "high %"]
PROPERTY_COLUMNS = ["property", "value", "unit"]
#: property row -> (reading field, unit shown)
#: The section-9 properties shown for checking: name -> (field of the reading,
#: kind of unit). The table is in the units on screen; its unit column says which.
PROPERTIES = case.SDS_PROPERTIES


def _store() -> dict:
    from ullage_ui.shared import store

    return store()


def _frames(reading) -> tuple[pd.DataFrame, pd.DataFrame, pd.DataFrame]:
    def pct(v):
        return round(100 * v, 6)

    ingredients = pd.DataFrame(
        [(i.cas, i.name, pct(i.low), pct(i.high)) for i in reading.components],
        columns=INGREDIENT_COLUMNS).astype({"CAS": "object", "ingredient": "object",
                                            "low %": "float", "high %": "float"})
    unlisted = pd.DataFrame(
        [(i.name + (f" ({i.cas})" if i.cas else ""), pct(i.low), pct(i.high))
         for i in reading.unidentified], columns=UNLISTED_COLUMNS).astype(
        {"share": "object", "low %": "float", "high %": "float"})
    properties = property_frame(reading, case.system(_store()))
    return ingredients, unlisted, properties


def property_frame(reading, units: str) -> pd.DataFrame:
    """The section-9 values of a reading in the unit system on screen."""
    vp = reading.vapor_pressure
    si = {"flash_point": reading.flash_point,
          "vapor_pressure": None if vp is None else vp[1],
          "vapor_pressure_temperature": None if vp is None else vp[0],
          "boiling_point": reading.boiling_point,
          "lower_flammability_limit": reading.lower_flammability_limit,
          "upper_flammability_limit": reading.upper_flammability_limit,
          "density": reading.density}
    rows = [(name, case.to_display(si[field], kind, units), case.UNITS[kind][units][0])
            for name, (field, kind) in PROPERTIES.items()]
    return pd.DataFrame(rows, columns=PROPERTY_COLUMNS).astype(
        {"property": "object", "value": "float", "unit": "object"})


def _put(prefix: str, reading, text: str, source: str) -> None:
    """Show a new reading: its tables, notes and text, not yet confirmed."""
    state = _store()
    ingredients, unlisted, properties = _frames(reading)
    state[table_key(f"{prefix}.sds_ingredients")] = ingredients
    state[table_key(f"{prefix}.sds_unlisted")] = unlisted
    state[table_key(f"{prefix}.sds_properties")] = properties
    state["tbl.generation"] = state.get("tbl.generation", 0) + 1
    state[key(f"{prefix}.sds_text")] = text
    state[key(f"{prefix}.sds_source")] = source
    state[key(f"{prefix}.sds_basis")] = reading.basis
    state[key(f"{prefix}.sds_notes")] = list(reading.notes)
    state[key(f"{prefix}.sds_confirmed")] = False
    st.session_state.pop(f"w:{prefix}.sds_confirmed", None)
    if reading.product:
        state[key(f"{prefix}.liquid_name")] = reading.product
        st.session_state.pop(f"w:{prefix}.liquid_name", None)
    state[f"{prefix}.sds.error"] = ""


def _read(prefix: str, given, source: str) -> None:
    from estimator.sds import read_sds

    try:
        reading = read_sds(given, source=source)
    except (UllageError, ValueError) as exc:
        reason = getattr(exc, "reason", str(exc))
        _store()[f"{prefix}.sds.error"] = f"{source} was not read: {reason}"
        return
    _put(prefix, reading, reading.text, source)


def _read_pasted(prefix: str) -> None:
    text = str(st.session_state.get(f"w:{prefix}.sds_paste") or "")
    _store()[key(f"{prefix}.sds_paste")] = text
    _read(prefix, text, "pasted text")


def _read_upload(prefix: str) -> None:
    upload = st.session_state.get(f"up:{prefix}.sds")
    if upload is None:
        return
    data = upload.getvalue()
    if len(data) > MAX_UPLOAD_MB * 1_000_000:
        _store()[f"{prefix}.sds.error"] = (f"{upload.name} is {len(data):,} bytes; a safety "
                                           f"data sheet is at most {MAX_UPLOAD_MB} MB.")
        return
    _read(prefix, data, upload.name)


def _ranges(state, prefix: str):
    """Ranges and unlisted shares from the tables, and problems found in their rows."""
    problems, ranges, unlisted = [], {}, {}
    for i, row in enumerate(case.filled_rows(state.get(table_key(f"{prefix}.sds_ingredients"))), 1):
        label = str(row.get("CAS") or row.get("ingredient") or "").strip()
        if not label:
            problems.append(f"ingredient row {i}: give the CAS number or the name")
            continue
        lo, hi = row.get("low %"), row.get("high %")
        if lo is None or hi is None or not 0 <= float(lo) <= float(hi) <= 100:
            problems.append(f"ingredient row {i} ({label}): give low and high % with "
                            "0 <= low <= high <= 100")
            continue
        ranges[label] = [f"{float(lo)!r} %", f"{float(hi)!r} %"]
    for i, row in enumerate(case.filled_rows(state.get(table_key(f"{prefix}.sds_unlisted"))), 1):
        label = str(row.get("share") or f"unidentified share {i}").strip()
        lo, hi = row.get("low %"), row.get("high %")
        if lo is None or hi is None or not 0 <= float(lo) <= float(hi) <= 100:
            problems.append(f"unidentified row {i} ({label}): give low and high % with "
                            "0 <= low <= high <= 100")
            continue
        unlisted[label] = [f"{float(lo)!r} %", f"{float(hi)!r} %"]
    if not ranges and not unlisted:
        problems.append("the sheet's tables are empty: paste or upload the sheet")
    return ranges, unlisted, problems


def liquid_item(state, prefix: str) -> tuple[dict, list[str]]:
    """The [[liquid]] table of a liquid from a safety data sheet, and its problems."""
    text = str(state.get(key(f"{prefix}.sds_text")) or "")
    named = str(state.get(key(f"{prefix}.liquid_name")) or "").strip()
    if not text:
        return {"name": named or "liquid from a safety data sheet", "substance": ""}, [
            "paste or upload the safety data sheet, check what was read, and tick "
            "'Use this liquid'"]
    ranges, unlisted, problems = _ranges(state, prefix)
    if not state.get(key(f"{prefix}.sds_confirmed")):
        problems.append("check what was read from the sheet and tick 'Use this liquid'")
    item = {"name": named or "liquid from a safety data sheet",
            "basis": state.get(key(f"{prefix}.sds_basis")) or "mass",
            "point": state.get(key(f"{prefix}.sds_point")) or "mid",
            "unidentified_as": state.get(key(f"{prefix}.sds_surrogate")) or "inert",
            "sds_text": text}
    if ranges:
        item["ranges"] = ranges
    if unlisted:
        item["unlisted"] = unlisted
    return item, problems


def set_from_scenario(state, prefix: str, entry: dict, scenario) -> bool:
    """Show a loaded scenario's liquid given by a sheet; False if it is not one."""
    from estimator.units import parse_quantity

    raw = next((x for x in scenario.document.get("liquid", []) or []
                if str(x.get("name", "")).strip().lower() == entry["name"].lower()), None)
    if raw is None or not any(k in raw for k in ("ranges", "sds_text", "sds")):
        return False
    if "ranges" in raw or "unlisted" in raw:
        def pairs(table):
            out = []
            for k, v in (table or {}).items():
                lo, hi = v if isinstance(v, list) else (v, v)
                out.append((k, 100 * parse_quantity(lo, "fraction", k),
                            100 * parse_quantity(hi, "fraction", k)))
            return out

        ingredients = pd.DataFrame(
            [(k, "", lo, hi) for k, lo, hi in pairs(raw.get("ranges"))],
            columns=INGREDIENT_COLUMNS).astype({"CAS": "object", "ingredient": "object",
                                                "low %": "float", "high %": "float"})
        from estimator.sds import resolve_cas

        ingredients["ingredient"] = [getattr(resolve_cas(c), "name", "") if "-" in c else c
                                     for c in ingredients["CAS"]]
        state[table_key(f"{prefix}.sds_ingredients")] = ingredients
        state[table_key(f"{prefix}.sds_unlisted")] = pd.DataFrame(
            pairs(raw.get("unlisted")), columns=UNLISTED_COLUMNS).astype(
            {"share": "object", "low %": "float", "high %": "float"})
        text = str(raw.get("sds_text") or "")
        properties = None
        if text:
            try:
                from estimator.sds import read_sds

                properties = _frames(read_sds(text))[2]
            except UllageError:
                properties = None
        state[table_key(f"{prefix}.sds_properties")] = (
            properties if properties is not None else _frames(_empty())[2])
        state[key(f"{prefix}.sds_text")] = text or "(ranges from the scenario file)"
        state[key(f"{prefix}.sds_basis")] = raw.get("basis", "mass")
        state[key(f"{prefix}.sds_notes")] = []
    else:
        from estimator.sds import read_sds

        if "sds_text" not in raw:
            return False  # a sheet file: shown as the mixture it gave
        _put(prefix, read_sds(raw["sds_text"]), raw["sds_text"], "scenario file")
    state[key(f"{prefix}.kind")] = "sds"
    state[key(f"{prefix}.liquid_name")] = entry["name"]
    state[key(f"{prefix}.sds_point")] = raw.get("point", "mid")
    state[key(f"{prefix}.sds_surrogate")] = raw.get("unidentified_as", "inert")
    state[key(f"{prefix}.sds_confirmed")] = True
    state[key(f"{prefix}.sds_source")] = "scenario file"
    return True


def _empty():
    from estimator.sds import SdsReading

    return SdsReading(None, (), (), None, None, None, None, None, None, ())


def _edited_reading(state, prefix: str):
    """The reading as the tables now say, for the checks shown under them."""
    from estimator.sds import reading_from_ranges
    from estimator.units import parse_quantity

    ranges, unlisted, problems = _ranges(state, prefix)
    if problems:
        return None, problems
    values = {}
    rows = {r.get("property"): (r.get("value"), r.get("unit"))
            for r in case.filled_rows(state.get(table_key(f"{prefix}.sds_properties")))}
    for name, (field, kind) in PROPERTIES.items():
        value, unit = rows.get(name, (None, None))
        if value is None:
            continue
        values[field] = case.from_display(value, kind, case.system_of(kind, unit))
    p = values.pop("vapor_pressure", None)
    t = values.pop("vapor_pressure_temperature", None)
    if p is not None:
        values["vapor_pressure"] = (t if t is not None else 293.15, p)
    try:
        reading = reading_from_ranges(
            {k: tuple(parse_quantity(x, "fraction", k) for x in v) for k, v in ranges.items()},
            {k: tuple(parse_quantity(x, "fraction", k) for x in v) for k, v in unlisted.items()},
            state.get(key(f"{prefix}.sds_basis")) or "mass", properties=values)
    except UllageError as exc:
        return None, [getattr(exc, "reason", str(exc))]
    return reading, []


@st.cache_data(show_spinner=False, max_entries=32)
def _checks(reading_args: str, surrogate: str):
    """Cross-check statements of an edited reading (cached on its text form)."""
    import json

    from estimator.sds import reading_from_ranges

    args = json.loads(reading_args)
    props = args["properties"]
    if props.get("vapor_pressure") is not None:
        props["vapor_pressure"] = tuple(props["vapor_pressure"])
    reading = reading_from_ranges({k: tuple(v) for k, v in args["ranges"].items()},
                                  {k: tuple(v) for k, v in args["unlisted"].items()},
                                  args["basis"], properties=props)
    try:
        return [c.statement for c in reading.cross_check(unidentified=surrogate)], ""
    except UllageError as exc:
        return [], getattr(exc, "reason", str(exc))


def sds_block(prefix: str, slots) -> None:
    """Paste or upload a safety data sheet, then check and confirm what was read."""
    from ullage_ui.shared import bound, choice, substance_names, text_box

    state = _store()
    paste, upload = st.tabs(["Paste the sheet", "Upload it (.txt or .pdf)"])
    with paste:
        bound(st.text_area, "Text of the safety data sheet", f"{prefix}.sds_paste",
              height=150, placeholder="Copy the whole sheet (at least sections 3 and 9) "
                                      "and paste it here.")
        st.button("Read the pasted sheet", key=f"sds-read:{prefix}", on_click=_read_pasted,
                  args=(prefix,))
    with upload:
        st.file_uploader(f"Safety data sheet (.txt or .pdf with text, up to {MAX_UPLOAD_MB} "
                         "MB)", type=["txt", "pdf"], key=f"up:{prefix}.sds",
                         on_change=_read_upload, args=(prefix,),
                         max_upload_size=MAX_UPLOAD_MB)
    if state.get(f"{prefix}.sds.error"):
        st.error(f"**Safety data sheet**: {state[f'{prefix}.sds.error']}")
    if not state.get(key(f"{prefix}.sds_text")):
        st.info("Paste or upload the sheet: what is read is shown here for you to check "
                "and correct before it is used.")
        return
    st.markdown(f"**Read from {state.get(key(f'{prefix}.sds_source')) or 'the sheet'}** "
                "— check every line against the sheet and correct it here.")
    text_box("Name of the liquid", f"{prefix}.liquid_name")
    _reading_tables(state, prefix)
    notes = state.get(key(f"{prefix}.sds_notes")) or []
    if notes:
        with st.expander(f"Notes on the reading ({len(notes)})"):
            st.markdown("\n".join(f"- {n}" for n in notes))
    a, b = st.columns(2)
    choice("Composition within the ranges", f"{prefix}.sds_point", ["mid", "worst"],
           container=a, format_func={"mid": "midpoints (normalised)",
                                     "worst": "worst case within the ranges"}.get)
    options = ["inert"] + substance_names()
    if state.get(key(f"{prefix}.sds_surrogate")) not in options:
        state[key(f"{prefix}.sds_surrogate")] = "inert"
    bound(b.selectbox, "Unidentified shares taken as", f"{prefix}.sds_surrogate",
          options=options, format_func=lambda o: "inert (no vapour)" if o == "inert" else o)
    _cross_check(state, prefix, slots)
    bound(st.checkbox, "Use this liquid: I have checked what was read against the sheet",
          f"{prefix}.sds_confirmed")


def _reading_tables(state, prefix: str) -> None:
    """The editable tables of what was read: ingredients, unidentified shares and the
    section-9 properties."""
    from ullage_ui.shared import table_editor

    table_editor(f"{prefix}.sds_ingredients", {
        "CAS": st.column_config.TextColumn("CAS"),
        "ingredient": st.column_config.TextColumn("ingredient"),
        "low %": st.column_config.NumberColumn("low %", min_value=0.0, max_value=100.0,
                                               format="%g"),
        "high %": st.column_config.NumberColumn("high %", min_value=0.0, max_value=100.0,
                                                format="%g")},
        help_text=f"Ingredients by CAS number, {state.get(key(f'{prefix}.sds_basis')) or 'mass'}"
                  " % as ranges; a single value has low = high.")
    table_editor(f"{prefix}.sds_unlisted", {
        "share": st.column_config.TextColumn("share with no identity"),
        "low %": st.column_config.NumberColumn("low %", min_value=0.0, max_value=100.0,
                                               format="%g"),
        "high %": st.column_config.NumberColumn("high %", min_value=0.0, max_value=100.0,
                                                format="%g")},
        help_text="Trade secrets, proprietary blends, CAS numbers the data do not know, and "
                  "the remainder the sheet does not list: never dropped.")
    table_editor(f"{prefix}.sds_properties", {
        "property": st.column_config.TextColumn("property", disabled=True),
        "value": st.column_config.NumberColumn("value", format="%g"),
        "unit": st.column_config.TextColumn("unit", disabled=True)},
        help_text="Section 9 as read; empty where the sheet gives no value. Used to check "
                  "the composition, not in the calculation.")


def _cross_check(state, prefix: str, slots) -> None:
    """The sheet's own vapour pressure and flash point against the model's, for the
    composition as edited."""
    import json

    reading, problems = _edited_reading(state, prefix)
    if problems:
        slots.problems("liquid", problems)
    elif reading is not None:
        args = {"ranges": {i.cas or i.name: [i.low, i.high] for i in reading.components},
                "unlisted": {i.name: [i.low, i.high] for i in reading.unidentified},
                "basis": reading.basis,
                "properties": {k: getattr(reading, k) for k in (
                    "flash_point", "vapor_pressure", "boiling_point",
                    "lower_flammability_limit", "upper_flammability_limit", "density")}}
        statements, error = _checks(json.dumps(args, sort_keys=True),
                                    state.get(key(f"{prefix}.sds_surrogate")) or "inert")
        for line in statements:
            (st.warning if "DISAGREES" in line else st.caption)(line)
        if error:
            st.error(f"**Safety data sheet**: {error}")
