"""Start: a new, empty case or an invented demo, and where each study lives."""

import streamlit as st

from ullage_ui import shared

shared.setup_page(
    "Start a case",
    lead="Begin from an empty case for your own job, or look at an invented demo first. "
         "Nothing of a demo is carried into a new case.")
state = shared.store()

left, right = st.columns(2, gap="large")
with left:
    st.subheader("Your own job")
    st.markdown("Every input at a neutral default: no tank name, no limits, sea-level "
                "pressure and no worst-case temperature. Enter your liquid, temperatures "
                "and the limits that apply to you.")
    st.button("Start a new, empty case", on_click=shared.start_new_case, key="new:start",
              type="primary")
with right:
    st.subheader("An invented demo")
    st.markdown("Three invented sites with illustrative limits, to see what each page "
                "shows. Load one only when you want it.")
    shared.demo_chooser("start")

st.markdown(f"**{shared.loaded_words(state)}**")
if state.get("load.error"):
    st.error(state["load.error"])
elif state.get("load.message"):
    st.caption(state["load.message"])
st.subheader("Pages")
st.markdown(shared.bullet_list([
    "**Tank headspace**: the vapour above a stored liquid, against your limits and alarms.",
    "**Spill indoors**: a pool evaporating into a room, over time.",
    "**Spill outdoors**: a pool's vapour carried downwind.",
    "**Site inventory**: every tank and drum of a file at once.",
    "**Two cases side by side**: today against a worst case, fan on against fan off.",
    "**Limits, alarms and site**: the exposure limits, alarm levels and site pressure.",
]))
