"""Tank headspace: the equilibrium vapour space over a liquid in a closed tank."""

import streamlit as st

from estimator.limits import format_number
from ullage_ui import shared, views
from ullage_ui.case import key

shared.setup_page(
    "Tank headspace", "tank",
    "The equilibrium vapour space over the liquid in a closed tank: what the air in it "
    "holds after long standing, the worst case for a closed space.")
state = shared.store()


def worst_below_stated(inputs: dict) -> bool:
    """Whether the worst-case temperature entered is below the liquid temperature."""
    stated, worst_case = inputs.get(key("tank.temperature")), inputs.get(key("tank.worst"))
    return stated is not None and worst_case is not None and worst_case < stated


def draw_inputs(slots):
    """The page's inputs; returns the limit rows in use."""
    st.subheader("Tank and liquid")
    shared.text_box("Tank", "tank.name")
    shared.liquid_block("tank", slots, allow_water=True)
    a, b = st.columns(2)
    shared.quantity("Liquid temperature", "tank.temperature", container=a)
    shared.quantity("Worst-case temperature", "tank.worst", optional=True, container=b,
                    help="The hottest the liquid gets (sun, process heat); leave empty to "
                         "screen only the stated temperature.")
    slots.add("temperature")
    if worst_below_stated(state):
        st.warning("**Worst-case temperature** is below the liquid temperature: the liquid "
                   "temperature is used as the worst case. Check both.")
    st.caption("Not sure of the liquid temperature? Give it as a range under "
               "[Uncertainty](#uncertainty) below.")
    a, b, c = st.columns(3)
    shared.quantity("Tank volume", "tank.volume", optional=True, container=a)
    shared.quantity("Liquid level", "tank.fill", container=b)
    shared.quantity("Gauge pressure", "tank.gauge", container=c)
    slots.add("tank")
    if shared.bound(st.toggle, "Filling, daily breathing and purge before entry",
                    "tank.details"):
        a, b = st.columns(2)
        shared.quantity("Daily low liquid temperature", "tank.daily_low", optional=True,
                        container=a)
        shared.quantity("Daily high liquid temperature", "tank.daily_high", optional=True,
                        container=b)
        a, b = st.columns(2)
        shared.quantity("Volume pumped in", "tank.pumped", optional=True, container=a)
        shared.quantity("Purge air flow", "tank.purge_rate", optional=True, container=b)
        a, b = st.columns(2)
        shared.number("Purge mixing factor", "tank.purge_mixing", container=a,
                      help="1 for perfect mixing; 3-10 for real tanks.")
        shared.quantity("Purge target", "tank.purge_target", optional=True, container=b,
                        help="Empty: the % LFL alarm level.")
    slots.add("details")
    return shared.limits_summary(slots)


def show(view: dict) -> None:
    """The result: tiles, then the findings in a few blocks of text (fewer elements
    to send when only the result is drawn again), the charts and the method."""
    now = view["now"]
    st.subheader(f"{view['name']}: {view['liquid']} at {view['temperature_text']}")
    a, b, c = st.columns([1.4, 1, 1])
    a.metric("Total vapour in the headspace", now["total_ppm_text"],
             help=now["total_mg_text"])
    b.metric("Flammable vapour [% of LFL]", now["percent_lfl_text"],
             help=f"Alarm level {view['alarm_percent']:g} % of the LFL ({view['alarm_source']})")
    c.metric("Oxygen after displacement", now["oxygen_text"])
    st.caption("LFL (LEL): the lower flammability limit, also called the lower explosive "
               "limit; % of LFL is what a combustible-gas meter reads.")
    st.markdown("\n\n".join(_summary(view)))
    if not len(view["comparisons"]):
        st.info("No exposure limit entered for these substances: only flammability and "
                "oxygen are compared.")
    if view["sweep"] is not None:
        _charts(view)
    st.markdown(f"**Method.** Raoult's law with {now['activity']}; vapour pressure by the "
                f"method below. Largest stated uncertainty of the vapour pressure: "
                f"{now['uncertainty']}.\n\n"
                + "\n\n".join(shared.markdown_table(t) for t in (now["methods"], now["components"])
                              if t is not None and len(t)))
    shared.show_notes(view)


def _summary(view: dict) -> list[str]:
    """The paragraphs under the tiles: flammability, concentration, worst case, the
    comparison with the limits and the other findings."""
    now = view["now"]
    parts = [f"**Flammability:** {now['flammability_words']}.  \n"
             f"**Concentration:** {now['total_ppm_text']} = {now['total_mg_text']} at "
             f"{now['pressure_text']}."]
    worst = view["worst"]
    if worst is not None:
        parts.append(f"**Worst case, {view['worst_temperature_text']}:** "
                     f"{worst['total_ppm_text']}, {worst['percent_lfl_text']} of the LFL, "
                     f"oxygen {worst['oxygen_text']}; {worst['flammability_words']}.")
    if len(view["comparisons"]):
        parts.append("**Against the exposure limits** (at the liquid temperature"
                     + (", then the worst case)" if len(view["worst_comparisons"]) else ")"))
        table = view["comparisons"].drop(columns=["ratio"])
        if len(view["worst_comparisons"]):
            table["worst case"] = list(view["worst_comparisons"]["against the limit"])
        parts.append(shared.markdown_table(table))
        if view["additive_index"] is not None:
            parts.append(f"Mixture exposure index Σ C/TWA = "
                         f"{format_number(view['additive_index'])} (above 1: the mixture "
                         "exceeds; for substances acting on the same organs).")
    extra = []
    if view["flash_point_text"]:
        extra.append(f"Flash point: {view['flash_point_text']}.")
    if view["alarm_temperature_text"]:
        extra.append(f"The headspace reaches the {view['alarm_percent']:g} % LFL alarm at "
                     f"{view['alarm_temperature_text']}.")
    extra += [f"{label}: {value}." for label, value in view["details"]]
    if extra:
        parts.append(shared.bullet_list(extra))
    return parts


def _charts(view: dict) -> None:
    """The headspace and the % LFL over the range of liquid temperatures."""
    unit = view["temperature_unit"]
    shared.chart(view["sweep"], x="temperature", x_title=f"liquid temperature [{unit}]",
                 y="ppm", y_title="headspace [ppm]", log_y=True,
                 lines=view["limit_lines"], marker=view["stated_temperature"])
    lfl_lines = [{"percent_lfl": view["alarm_percent"],
                  "limit": f"alarm {view['alarm_percent']:g} % LFL"},
                 {"percent_lfl": 100.0, "limit": "LFL"}]
    highest = float(view["sweep_lfl"]["percent_lfl"].max())
    # a logarithmic axis once the curve runs far above the alarm, so the alarm and LFL
    # lines stay clear of the axis
    shared.chart(view["sweep_lfl"], x="temperature", x_title=f"liquid temperature [{unit}]",
                 y="percent_lfl", y_title="flammable vapour [% of LFL]", color=None,
                 log_y=highest > 5.0 * view["alarm_percent"],
                 lines=lfl_lines, line_field="percent_lfl",
                 marker=view["stated_temperature"])


UNCERTAINTY_CAPTION = (
    "Give the liquid temperature as a range instead of one value: the headspace is "
    "then computed for every temperature drawn from it (Monte Carlo), each with the "
    "vapour-pressure method's stated uncertainty if ticked. The result is the spread "
    "of the headspace and the probability of exceeding each limit and alarm."
)

shared.study_page("tank", draw_inputs, views.tank_view, show, UNCERTAINTY_CAPTION,
                  input_notes=worst_below_stated)
