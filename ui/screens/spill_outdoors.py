"""Spill outdoors: a pool's vapour carried downwind, on the plume centreline."""

import numpy as np
import streamlit as st

from estimator.evaporation import MODEL_NAMES
from estimator.outdoor import INSOLATION, STABILITY_CLASSES

from estimator.scenario import dumps_scenario
from ullage_ui import case, shared, views
from ullage_ui.case import system


slots = shared.setup_page(
    "Spill outdoors", "outdoor",
    "A pool outdoors: its initial evaporation rate carried downwind by a ground-level "
    "Gaussian plume, on the centreline.")
state = shared.store()
units = system(state)
inputs, results = st.columns([2, 3], gap="large")

with inputs:
    st.subheader("Spill and liquid")
    shared.text_box("Spill", "outdoor.name")
    shared.liquid_block("outdoor", slots)
    shared.quantity("Liquid and air temperature", "outdoor.temperature")
    slots.add("temperature")
    shared.quantity("Spilled volume", "outdoor.volume")
    a, b = st.columns(2)
    shared.quantity("Pool area", "outdoor.area", optional=True, container=a,
                    help="Empty: the liquid spreads to 1 cm depth (US EPA RMP guidance), "
                         "or covers the dike floor.")
    shared.quantity("Dike or bund floor", "outdoor.dike", optional=True, container=b)
    shared.choice("Evaporation model", "outdoor.model", list(MODEL_NAMES),
                  format_func=MODEL_NAMES.get,
                  horizontal=True)
    slots.add("amount")
    st.subheader("Weather")
    a, b = st.columns(2)
    shared.quantity("Wind speed", "weather.wind", container=a)
    shared.quantity("Wind measured at height", "weather.wind_height", container=b)
    sky = shared.choice("Sky", "weather.sky", list(case.SKY), format_func=case.SKY.get,
                        horizontal=True)
    a, b = st.columns(2)
    if sky == "day":
        shared.choice("Incoming sunshine", "weather.insolation", list(INSOLATION), container=a,
                      horizontal=True)
    elif sky == "night":
        shared.number("Cloud cover [oktas, 0-8]", "weather.cloud", container=a)
    else:
        shared.bound(a.selectbox, "Pasquill stability class", "weather.stability",
                     options=list(STABILITY_CLASSES))
    shared.choice("Terrain", "weather.terrain", ["open", "urban"], container=b,
                  horizontal=True)
    slots.add("weather")
    length = case.unit_label("length", units)
    shared.text_box("Downwind distances, each with its unit, separated by commas",
                    "weather.receptors", placeholder=f"e.g. 100 {length}, 300 {length}")
    slots.add("receptors")
    limit_rows = shared.limits_summary(slots)


def show(view: dict) -> None:
    st.subheader(view["name"])
    if "plume" in view.get("left_out", ()):
        # the stability class is unknown: only the release rate stands without it
        st.metric("Release rate to air", view["source_text"], help="initial evaporation rate")
        st.markdown(f"**Method.** Initial evaporation rate by both models: "
                    f"{view['rates_text']} (their spread is a measure of the model "
                    "uncertainty).")
        shared.show_notes(view)
        return
    a, b, c = st.columns(3)
    a.metric("Release rate to air", view["source_text"], help="initial evaporation rate")
    b.metric("Stability class", view["stability"])
    c.metric("Wind at 10 m", view["wind_text"])
    if view["flammable"]:
        a, b, c = st.columns(3)
        a.metric("Distance to the LFL", view["lfl_text"].split(" (")[0],
                 help=view["lfl_text"])
        b.metric(view["alarm_label"], view["alarm_text"].split(" (")[0],
                 help=view["alarm_text"])
        if view["dense_text"]:
            value, _, verdict = view["dense_text"].partition(" (")
            c.metric("Britter-McQuaid criterion", value, help=view["dense_statement"])
            c.caption("density effects matter: a dense-gas model is needed"
                      if verdict.startswith("dense") else "passive dispersion")
        for text in (view["lfl_text"], view["alarm_text"]):
            if " (" in text:
                st.caption(text)
    if view["cap_text"]:
        st.caption(view["cap_text"])
    if len(view["distances"]):
        st.markdown("**How far the centreline stays above each limit**")
        shared.table(view["distances"])
    else:
        st.info("No exposure limit entered for this liquid: no distance to a limit is "
                "computed.")
    st.markdown("**Centreline concentration at the distances asked for**")
    if len(view["receptors"]):
        shared.table(view["receptors"])
    else:
        st.info("No downwind distance that can be used: list them in the box on the left.")
    unit = view["distance_unit"]
    shared.chart(view["series"], x="distance", x_title=f"downwind distance [{unit}]", y="ppm",
                 y_title="centreline concentration [ppm]", log_x=True, log_y=True,
                 lines=view["limit_lines"])
    st.markdown(f"**Method.** Ground-level Gaussian plume (Briggs dispersion coefficients, "
                f"{view['terrain']} terrain) from the pool's initial evaporation rate, a "
                f"steady source: conservative for screening. Initial rate by both models: "
                f"{view['rates_text']} (their spread is a measure of the model uncertainty).")
    shared.show_notes(view)


with results:
    st.subheader("Result")
    slots.add("general")
    asked, bad = case.receptor_entries(state)
    for reason in bad:
        slots.show({"field": "", "area": "receptors",
                    "reason": f"{reason}; this distance is left out until it is corrected, "
                              "the others are shown"})
    grid = [case.to_display(x, "length", units) for x in np.geomspace(100.0, 10000.0, 33)]
    everything = sorted(set(asked) | set(grid))
    doc, problems = case.study_document(state, "outdoor", receptors=everything,
                                        limits=limit_rows)
    if problems:
        slots.problems("liquid", problems)
    else:
        view = views.outdoor_view(dumps_scenario(doc), units, tuple(asked))
        for error in view.get("field_errors", ()):
            slots.show(error)
        if view["error"]:
            slots.show(view["error"])
        else:
            show(view)
            if bad or view.get("field_errors"):
                shared.downloads_withheld()
            else:
                mine, _ = case.study_document(state, "outdoor", limits=limit_rows)
                shared.downloads(dumps_scenario(mine), shared.file_stem(view["name"]))
