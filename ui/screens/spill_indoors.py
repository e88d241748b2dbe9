"""Spill indoors: a pool evaporating into a room, and the air people breathe there."""

import streamlit as st

from estimator.evaporation import MODEL_NAMES

from ullage_ui import shared, views


shared.setup_page(
    "Spill indoors", "indoor",
    "A pool evaporating into a room, coupled to the room air: the concentration over time "
    "in the room, or near the pool and in the rest of the room (two-zone model).")
state = shared.store()


def draw_inputs(slots):
    """The page's inputs; returns the limit rows in use."""
    st.subheader("Spill and liquid")
    shared.text_box("Spill", "indoor.name")
    shared.liquid_block("indoor", slots)
    shared.quantity("Liquid and air temperature", "indoor.temperature")
    slots.add("temperature")
    a, b = st.columns(2)
    kind = shared.choice("Amount given as", "indoor.amount_kind", ["volume", "mass"],
                         container=a, horizontal=True)
    if kind == "mass":
        shared.quantity("Spilled mass", "indoor.mass", container=b)
    else:
        shared.quantity("Spilled volume", "indoor.volume", container=b)
    a, b = st.columns(2)
    shared.quantity("Pool area", "indoor.area", optional=True, container=a,
                    help="Empty: the liquid spreads to 1 cm depth (US EPA RMP guidance), "
                         "or covers the dike floor.")
    shared.quantity("Dike or bund floor", "indoor.dike", optional=True, container=b)
    shared.choice("Evaporation model", "indoor.model", list(MODEL_NAMES),
                  format_func=MODEL_NAMES.get,
                  horizontal=True)
    slots.add("amount")
    st.subheader("Room")
    a, b = st.columns(2)
    shared.text_box("Room", "room.name", container=a)
    shared.quantity("Room volume", "room.volume", container=b)
    a, b, c = st.columns(3)
    shared.quantity("Air changes", "room.air_changes", container=a,
                    help="0 when the fan is off or fails.")
    shared.number("Mixing factor", "room.mixing", container=b,
                  help="1 for perfect mixing; real rooms are often 3-10.")
    shared.quantity("Air speed over the pool", "room.air_speed", container=c)
    a, b = st.columns(2)
    shared.quantity("Near-field radius", "room.near_field_radius", optional=True, container=a,
                    help="Give both near-field boxes for the two-zone model.")
    shared.quantity("Random air speed near the source", "room.random_air_speed", optional=True,
                    container=b)
    slots.add("room")
    st.caption("Not sure of the temperature, amount, mixing factor or air speed? Give them "
               "as ranges under [Uncertainty](#uncertainty) below.")
    a, b = st.columns(2)
    shared.quantity("Time modelled", "indoor.duration", container=a)
    shared.quantity("Pool removed at", "indoor.cleanup", optional=True, container=b,
                    help="When the pool is cleaned up or covered; empty: it stays until dry.")
    slots.add("time")
    return shared.limits_summary(slots)


def show(view: dict) -> None:
    st.subheader(f"{view['name']} in {view['where']}")
    if "run" in view.get("left_out", ()):
        # the time modelled is wrong: only what stands without the run is shown
        st.markdown(f"**Pool:** {view['pool_area_text']}.")
        st.markdown(f"**Method.** {view['model']}. Initial evaporation rate by both "
                    f"models: {view['rates_text']}.")
        shared.show_notes(view)
        return
    a, b, c = st.columns(3)
    a.metric(f"Peak, {view['peak_zone']}", view["peak_text"],
             help=f"at {view['peak_time_text']}")
    b.metric("Peak % of the LFL", view["lfl_peak_text"], help=view["lfl_peak_help"])
    c.metric("Lowest oxygen", view["oxygen_text"], help=view["oxygen_help"])
    a, b, _ = st.columns(3)
    a.metric("8-h TWA", view["twa_text"])
    b.metric("Highest 15-min average", view["short_text"])
    pool = f"**Pool:** {view['pool_area_text']}, {view['pool_text']}."
    if len(view["comparisons"]):
        st.markdown(pool + "\n\n**Against the exposure limits**\n\n"
                    + shared.markdown_table(view["comparisons"].drop(columns=["ratio"])))
    else:
        st.markdown(pool)
        st.info("No exposure limit entered for this liquid: the concentrations are shown "
                "without comparison.")
    shared.chart(view["series"], x="minutes", x_title="time after the spill [min]", y="ppm",
                 y_title="concentration [ppm]", lines=view["limit_lines"])
    if view["lfl_series"] is not None:
        shared.chart(view["lfl_series"], x="minutes", x_title="time after the spill [min]",
                     y="percent", y_title="% of the LFL", lines=view["lfl_lines"],
                     line_field="percent", log_y=view["lfl_log"])
    metrics = view["metrics"]
    st.markdown((shared.markdown_table(metrics) + "\n\n" if metrics is not None and len(metrics)
                 else "")
                + f"**Method.** {view['model']}; pool temperature held fixed. Initial "
                f"evaporation rate by both models: {view['rates_text']} (their spread is a "
                f"measure of the model uncertainty). Mass balance closes to "
                f"{view['mass_balance_text']}.")
    shared.show_notes(view)


UNCERTAINTY_CAPTION = (
    "Give the temperature, the spilled mass, the mixing factor or the air speed as a "
    "range instead of one value: the spill is then run for every set of values drawn "
    "(Monte Carlo). Each sample uses a simpler model than the result above: the "
    "Mackay-Matsugu evaporation rate held constant until the pool is dry, into the "
    "well-mixed room (no near field); the pool area stays that of the stated amount."
)

shared.study_page("indoor", draw_inputs, views.indoor_view, show, UNCERTAINTY_CAPTION)
