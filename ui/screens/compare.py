"""Two cases side by side: the case on a study page (A) and a copy with one or two
inputs changed (B), with the differences said in words."""

import copy

import streamlit as st

from estimator.scenario import dumps_scenario
from estimator.limits import format_number
from estimator.outdoor import STABILITY_CLASSES
from ullage_ui import case, shared, views
from ullage_ui.case import key, system

STUDIES = {"tank": "Tank headspace", "indoor": "Spill indoors", "outdoor": "Spill outdoors"}
SAME = ""
CLASSES = [SAME, *STABILITY_CLASSES]

slots = shared.setup_page(
    "Two cases side by side",
    lead="Case A is the case on its study page. Case B is a copy of it with the inputs "
         "below changed: what if it is hotter, the fan fails, the wind drops, or it is the "
         "other solvent?")
state = shared.store()
units = system(state)

study = shared.choice("Compare", "cmp.study", list(STUDIES), format_func=STUDIES.get,
                      horizontal=True)
limit_rows = shared.limits_summary(slots)
# the distances that can be used (the outdoor page names the others)
asked = case.receptor_entries(state)[0] if study == "outdoor" else None
doc_a, problems_a = case.study_document(state, study, limits=limit_rows)


def _a_temperature() -> float | None:
    return state.get(key(f"{study}.temperature"))


def seed_b() -> None:
    """Start case B from case A: 10 degrees hotter, the fan off, half the wind."""
    step = 18.0 if system(state) == "US" else 10.0
    t = _a_temperature()
    shared.set_input("cmp.temperature", None if t is None else round(t + step, 6))
    shared.set_input("cmp.substance", SAME)
    shared.set_input("cmp.air_changes", 0.0)
    shared.set_input("cmp.mixing", state.get(key("room.mixing")))
    wind = state.get(key("weather.wind"))
    shared.set_input("cmp.wind", None if wind is None else round(wind / 2.0, 6))
    shared.set_input("cmp.stability", SAME)
    state["cmp.seeded"] = study


if state.get("cmp.seeded") != study:
    seed_b()

st.subheader("What changes in case B")
a, b = st.columns(2)
shared.quantity("Temperature in B", "cmp.temperature", container=a)
labels = shared.substance_choices()  # the table, then liquids found in the library
shared.bound(b.selectbox, "Liquid in B", "cmp.substance", options=[SAME] + list(labels),
             format_func=lambda k: "the same as in A" if k == SAME else labels.get(k, k))
if study == "indoor":
    a, b = st.columns(2)
    shared.quantity("Air changes in B", "cmp.air_changes", container=a,
                    help="0 when the fan fails.")
    shared.number("Mixing factor in B", "cmp.mixing", container=b)
elif study == "outdoor":
    a, b = st.columns(2)
    shared.quantity("Wind speed in B", "cmp.wind", container=a)
    shared.bound(b.selectbox, "Stability class in B", "cmp.stability", options=CLASSES,
                 format_func=lambda k: "the same as in A" if k == SAME else k)
b_slots = shared.Slots()
b_slots.add("general")
st.button("Start B again from A (10 degrees hotter, fan off, half the wind)", on_click=seed_b)
slots.add("general")

#: Inputs of case B, by the (section, key) of the scenario field they set.
B_LABELS = {("tank", "temperature"): "Temperature in B",
            ("spill", "temperature"): "Temperature in B",
            ("room", "air_changes"): "Air changes in B",
            ("room", "mixing_factor"): "Mixing factor in B",
            ("outdoors", "wind_speed"): "Wind speed in B",
            ("outdoors", "stability"): "Stability class in B"}
#: Core argument names fed by an input of case B.
CORE_B_LABELS = {"temperature": "Temperature in B", "wind_speed": "Wind speed in B",
                 "wind speed": "Wind speed in B", "mixing factor": "Mixing factor in B",
                 "ventilation rate": "Air changes in B"}
#: The page state of each input of case B.
B_INPUTS = {"Temperature in B": "cmp.temperature", "Air changes in B": "cmp.air_changes",
            "Mixing factor in B": "cmp.mixing", "Wind speed in B": "cmp.wind",
            "Stability class in B": "cmp.stability"}


def build_b(doc: dict) -> dict:
    out = copy.deepcopy(doc)
    item = out["tank"][0] if study == "tank" else out["spill"][0]
    if case.text(state, "cmp.temperature") is not None:
        item["temperature"] = case.text(state, "cmp.temperature")
    chosen = state.get(key("cmp.substance")) or SAME
    if chosen != SAME:
        names = {**shared.substance_table().set_index("key")["name"].to_dict(),
                 **{k: v["name"] for k, v in state.get(case.LIBRARY_FOUND, {}).items()}}
        name = names.get(chosen, chosen)
        out["liquid"] = [{"name": f"{name} (case B)", "substance": chosen}]
        item["liquid"] = out["liquid"][0]["name"]
        if "tank" in out and study != "tank":
            out.pop("tank")
    if study == "indoor":
        room = out["room"][0]
        if case.text(state, "cmp.air_changes") is not None:
            room.pop("ventilation_rate", None)  # the file's, replaced by B's air changes
            room["air_changes"] = case.text(state, "cmp.air_changes")
        if state.get(key("cmp.mixing")) is not None:
            room["mixing_factor"] = float(state[key("cmp.mixing")])
    if study == "outdoor":
        weather = out["outdoors"]
        if case.text(state, "cmp.wind") is not None:
            weather["wind_speed"] = case.text(state, "cmp.wind")
        stability = state.get(key("cmp.stability")) or SAME
        if stability != SAME:
            for name in ("daytime", "insolation", "cloud_cover"):
                weather.pop(name, None)
            weather["stability"] = stability
    return out


def _flat(value, path=()):
    if isinstance(value, dict):
        out = {}
        for k, v in value.items():
            out.update(_flat(v, path + (k,)))
        return out
    if isinstance(value, list) and value and all(isinstance(v, dict) for v in value):
        out = {}
        for i, v in enumerate(value):
            out.update(_flat(v, path + ((i,) if len(value) > 1 else ())))
        return out
    return {path: value}


def _words(path) -> str:
    names = [str(p) for p in path if not isinstance(p, int)]
    if len(names) == 2 and tuple(names) in views.FIELD_LABELS:
        return views.FIELD_LABELS[tuple(names)].lower()
    return " ".join(n.replace("_", " ") for n in names)


#: Units as scenario text writes them -> as the pages show them.
_UNIT_WORDS = {"degC": "°C", "degF": "°F", "m3/h": "m³/h", "m3": "m³", "m2": "m²",
               "ft3/min": "ft³/min", "ft3": "ft³", "ft2": "ft²"}


def _value(v) -> str:
    if v is None:
        return "not given"
    if isinstance(v, list):
        return ", ".join(_value(x) for x in v)
    if isinstance(v, float):
        return format_number(v, 6)
    words = str(v).split(" ")
    if len(words) == 2:
        try:
            number = format_number(float(words[0]), 6)
        except ValueError:
            number = words[0]
        return f"{number} {_UNIT_WORDS.get(words[1], words[1])}"
    return str(v)


def differences(doc_a: dict, doc_b: dict) -> list[str]:
    a, b = _flat(doc_a), _flat(doc_b)
    lines = []
    for path in list(dict.fromkeys(list(a) + list(b))):
        if path and path[0] == "scenario":
            continue
        if a.get(path) != b.get(path):
            lines.append(f"**{_words(path)}**: {_value(a.get(path))} in A, "
                         f"**{_value(b.get(path))}** in B")
    return lines


def _times(a: float, b: float) -> str:
    if a <= 0 or b <= 0:
        return ""
    ratio = b / a
    if abs(ratio - 1.0) < 0.005:
        return "about the same"
    return f"{format_number(ratio)} times A"


def _max_ratio(frame) -> float | None:
    if frame is None or not len(frame):
        return None
    return float(frame["ratio"].max())


def result_words(va: dict, vb: dict) -> list[str]:
    out = []
    if study == "tank":
        a, b = va["now"], vb["now"]
        out.append(f"Headspace: {a['total_ppm_text']} in A, {b['total_ppm_text']} in B "
                   f"({_times(a['total_ppm'], b['total_ppm'])}).")
        out.append(f"Flammable vapour: {a['percent_lfl_text']} of the LFL in A, "
                   f"{b['percent_lfl_text']} in B.")
        if a["flammability"] != b["flammability"]:
            out.append(f"Flammability changes: A is {a['flammability_words']}; B is "
                       f"**{b['flammability_words']}**.")
        out.append(f"Oxygen: {a['oxygen_text']} in A, {b['oxygen_text']} in B.")
        ra, rb = _max_ratio(va["comparisons"]), _max_ratio(vb["comparisons"])
    elif study == "indoor":
        out.append(f"Peak ({va['peak_zone']}): {va['peak_text']} in A, {vb['peak_text']} "
                   "in B.")
        out.append(f"8-h TWA: {va['twa_text']} in A, {vb['twa_text']} in B.")
        out.append(f"Highest 15-min average: {va['short_text']} in A, {vb['short_text']} "
                   "in B.")
        out.append(f"Pool: {va['pool_text']} in A; {vb['pool_text']} in B.")
        ra, rb = _max_ratio(va["comparisons"]), _max_ratio(vb["comparisons"])
    else:
        out.append(f"Release rate to air: {va['source_text']} in A, {vb['source_text']} in B; "
                   f"stability class {va['stability']} in A, {vb['stability']} in B.")
        for (_, ra_row), (_, rb_row) in zip(va["distances"].iterrows(),
                                            vb["distances"].iterrows()):
            out.append(f"{ra_row['limit']}: above it out to "
                       f"{ra_row['centreline above it out to']} in A, "
                       f"{rb_row['centreline above it out to']} in B.")
        ra = rb = None
    if ra is not None and rb is not None:
        out.append(f"Highest ratio to a limit: {format_number(ra)} in A, {format_number(rb)} in B.")
    return out


def b_label(error: dict) -> str | None:
    """The label of case B's own input that an error of case B is about, or None when
    the error is about an input B shares with A (entered on the study page)."""
    where = views.field_key(error.get("field"))
    if where is None:  # a core argument: the input of B that feeds it
        label = CORE_B_LABELS.get(str(error.get("field") or "").strip().lower())
        return label if label and state.get(key(B_INPUTS[label])) is not None else None
    if where[0] in ("liquid", "substance") or where[1] == "liquid":
        return "Liquid in B" if (state.get(key("cmp.substance")) or SAME) != SAME else None
    label = B_LABELS.get(where)
    if label is None or state.get(key(B_INPUTS[label])) in (None, SAME):
        return None
    return label


def errors_of(view: dict, label: str, here) -> None:
    """Show the errors of one case: those of B's own inputs beside them, the others
    in the case's column, named by their label on the study page."""
    page = STUDIES[study]
    for error in list(view.get("field_errors", ())) + ([view["error"]] if view["error"]
                                                      else []):
        own = b_label(error) if label == "B" else None
        if own:
            b_slots.show(dict(error, label=own))
            continue
        name = views.field_label(error.get("field") or "")
        here.show(dict(error, label=f"{name} (on the page {page})" if name else ""))


def column(view: dict, label: str) -> None:
    st.markdown(f"### Case {label}")
    here = shared.Slots()
    here.add("general")
    errors_of(view, label, here)
    if view["error"]:
        if label == "B" and b_label(view["error"]):
            st.info(f"Case B is shown once **{b_label(view['error'])}** above is corrected.")
        return
    if study == "tank":
        now = view["now"]
        st.metric("Total vapour in the headspace", now["total_ppm_text"])
        st.metric("Flammable vapour [% of LFL]", now["percent_lfl_text"])
        st.markdown(f"**Flammability:** {now['flammability_words']}.")
        table = view["comparisons"]
    elif study == "indoor":
        st.metric(f"Peak, {view['peak_zone']}", view["peak_text"])
        st.metric("8-h TWA", view["twa_text"])
        table = view["comparisons"]
    else:
        st.metric("Release rate to air", view["source_text"])
        st.metric("Stability class", view["stability"])
        table = view["distances"]
    if table is not None and len(table):
        shared.table(table.drop(columns=[c for c in ("ratio", "note") if c in table]))
    if view.get("warnings"):
        st.caption("Warnings: " + " ".join(view["warnings"]))


def run(doc: dict) -> dict:
    text = dumps_scenario(doc)
    if study == "tank":
        return views.tank_view(text, units)
    if study == "indoor":
        return views.indoor_view(text, units)
    return views.outdoor_view(text, units, tuple(asked or ()))


if problems_a:
    slots.problems("liquid", problems_a)
else:
    doc_b = build_b(doc_a)
    view_a, view_b = run(doc_a), run(doc_b)
    changed = differences(doc_a, doc_b)
    st.subheader("What differs")
    if changed:
        st.markdown("Inputs: " + "; ".join(changed) + ".")
    else:
        st.markdown("Inputs: none yet. Change an input of case B above.")
    if not view_a["error"] and not view_b["error"]:
        st.markdown(shared.bullet_list(result_words(view_a, view_b)))
    left, right = st.columns(2)
    with left:
        column(view_a, "A")
    with right:
        column(view_b, "B")
