"""What every page shares: the cautions, the sidebar, the input blocks and the charts.

A page calls `setup_page` first: it keeps the inputs of the other pages alive,
loads the first demo scenario on a first visit, draws the sidebar (units,
scenario files) and puts the cautions at the top, always visible.
"""

from __future__ import annotations

import re

import pandas as pd
import streamlit as st

from estimator import CAUTIONS
from estimator.checks import BAROMETRIC_RANGE, ELEVATION_RANGE
from estimator.errors import UllageError

from ullage_ui import case, views
from ullage_ui.case import key, system, unit_label

#: What to do, by the block an error points at.
ADVICE = {
    "temperature": "Enter a liquid temperature at which every component is a liquid: above "
                   "its melting point and below its critical temperature.",
    "liquid": "Check the substance names (use the search box) and the composition.",
    "limits": "Correct the row in the limits table; every limit needs a value, a unit and "
              "its source.",
    "alarms": "Give an LFL alarm above 0 and at most 100 %, and oxygen bounds with "
              "low below high.",
    "site": f"Give a site elevation between {ELEVATION_RANGE[0]:g} and "
            f"{ELEVATION_RANGE[1]:g} m, or a barometric pressure between "
            f"{BAROMETRIC_RANGE[0] / 1e3:g} and {BAROMETRIC_RANGE[1] / 1e3:g} kPa.",
    "tank": "Check the tank volume, fill level and gauge pressure.",
    "details": "Check the tank details (daily temperatures, pumped volume, purge).",
    "amount": "Check the spilled amount and the pool or dike area.",
    "time": "Check the run duration and the clean-up time.",
    "room": "Check the room volume, air changes, mixing factor and air speeds.",
    "weather": "Check the wind speed, its height and the sky or stability class.",
    "receptors": "List downwind distances, each with its unit, separated by commas "
                 "(100 m, 300 m, 1 km).",
    "file": "Fix the file and load it again.",
    "solver": "The calculation could not be finished for these inputs. A slightly different "
              "amount, area or run length usually gets past it; the inputs themselves are "
              "not wrong.",
    "general": "Correct the input named above; the result is shown again once it can be "
               "computed.",
    "uncertainty": "Check the ranges in the Uncertainty section: every value they can give "
                   "must be possible (a temperature below the boiling point, a mixing factor "
                   "of 1 or more, an amount and an air speed above 0).",
}

AREA_NAMES = {"temperature": "Temperature", "liquid": "Liquid", "limits": "Exposure limits",
              "alarms": "Alarm levels", "site": "Site pressure", "tank": "Tank",
              "details": "Tank details", "amount": "Spilled amount", "time": "Times",
              "room": "Room", "weather": "Weather", "receptors": "Downwind distances",
              "file": "Scenario file", "solver": "Calculation", "general": "Input",
              "uncertainty": "Uncertainty"}


class Slots:
    """Places on a page where an error about a block is shown, next to its inputs."""

    def __init__(self):
        self.places = {}
        self.shown = set()
        self.messages = {}

    def add(self, area: str, container=None) -> None:
        self.places[area] = (container or st).empty()

    def show(self, error: dict) -> None:
        area = error.get("area", "general")
        place = self.places.get(area) or self.places.get("general")
        field = error.get("label") or views.field_label(error.get("field") or "")
        words = AREA_NAMES.get(area, "Input")
        head = f"**{field}**" if field else f"**{words}**"
        message = f"{head}: {error.get('reason', '')}.".replace("..", ".")
        lines = self.messages.setdefault(area, [])
        lines.append(message)
        text = "\n\n".join(lines + [ADVICE.get(area, ADVICE["general"])])
        if place is None:
            st.error(text)
        else:
            place.error(text)
        self.shown.add(area)

    def problems(self, area: str, lines) -> None:
        """Show problems found in an input block before the core is called."""
        lines = list(lines)
        if not lines:
            return
        place = self.places.get(area) or self.places.get("general")
        text = f"**{AREA_NAMES.get(area, 'Input')}**: " + "; ".join(lines) + "."
        (place or st).error(text)
        self.shown.add(area)


# ------------------------------------------------------------------- the page

#: Tiles (st.metric) wrap a long value or its unit instead of cutting it off; a
#: table wider than its column scrolls sideways instead of running under the next.
TILE_STYLE = """<style>
[data-testid="stMetricValue"], [data-testid="stMetricValue"] > div {
  white-space: normal !important; overflow: visible !important;
  text-overflow: clip !important; overflow-wrap: break-word; line-height: 1.15;
  font-size: clamp(1.15rem, 1.6vw, 2rem);
}
[data-testid="stMetricLabel"], [data-testid="stMetricLabel"] * {
  white-space: normal !important; overflow: visible !important; text-overflow: clip !important;
  word-break: normal !important; overflow-wrap: normal !important;
}
[data-testid="stMarkdownContainer"] table {
  display: block; max-width: 100%; overflow-x: auto;
}
</style>"""


def show_cautions() -> None:
    """The cautions, at the top of every page, never folded away."""
    with st.container(border=True):
        st.markdown("**Screening estimate — read before using any number on this page**\n\n"
                    + "\n".join(f"- {c}" for c in CAUTIONS))


def store() -> dict:
    """The inputs of every page, kept for the whole visit (a plain dict).

    Widgets have their own keys ("w:" + input name); each page seeds them from
    the store when it draws them and writes their values back, so that the
    session holds only the widgets of the page on screen.
    """
    if "ullage" not in st.session_state:
        st.session_state["ullage"] = {}
    return st.session_state["ullage"]


def _sync_widgets() -> None:
    """After a callback changed the store, show the new values in live widgets."""
    inputs = store()
    for name in list(st.session_state.keys()):
        if isinstance(name, str) and name.startswith("w:") and key(name[2:]) in inputs:
            st.session_state[name] = inputs[key(name[2:])]


def entered() -> None:
    """Mark the study of the page on screen as entered: the saved file holds it.

    Called when the user changes an input of a study page (never when a page is only
    drawn), so that saving writes what was entered and nothing more.
    """
    study = st.session_state.get("page.study")
    if study:
        store().setdefault("case.studies", {})[study] = True


#: While a study page draws its inputs: the key of the fragment that shows its
#: result, which a changed number reruns alone (see `study_page`).
RESULT_FRAGMENT = "page.result_fragment"


def _changed_then(callback=None, args=(), kwargs=None, name: str | None = None,
                  rerun: str | None = None):
    def run():
        entered()
        widget_key = "w:" + name if name else None
        if widget_key in st.session_state:
            # the store holds the new value before anything reads it, also when only
            # the result is drawn again and this widget is not
            store()[key(name)] = st.session_state[widget_key]
        if callback is not None:
            callback(*(args or ()), **(kwargs or {}))
        if rerun:
            st.rerun(rerun)  # only the result depends on this input: draw it alone
    return run


def bound(widget, label: str, name: str, *, marks: bool = True, result_only: bool = False,
          **kwargs):
    """Draw a widget for the input `name`, seeded from and written back to the store.

    A change made on screen marks the page's study as entered (`entered`), unless
    `marks` is false (the sidebar's own inputs). With `result_only`, drawn among a
    study page's inputs, a change reruns only the page's result (its fragment), not
    the inputs around it.
    """
    if marks:
        rerun = st.session_state.get(RESULT_FRAGMENT) if result_only else None
        kwargs["on_change"] = _changed_then(kwargs.pop("on_change", None),
                                            kwargs.pop("args", ()), kwargs.pop("kwargs", None),
                                            name=name, rerun=rerun)
    inputs = store()
    widget_key = "w:" + name
    # The live value wins (a change just made on screen); otherwise the stored one.
    # Writing it back before drawing also carries it over to a widget of the same
    # key on another page (the sidebar), which Streamlit would otherwise reset.
    live = st.session_state[widget_key] if widget_key in st.session_state else inputs.get(
        key(name))
    st.session_state[widget_key] = live
    value = widget(label, key=widget_key, **kwargs)
    inputs[key(name)] = value
    return value


def _first_visit() -> None:
    """A first visit starts a new, empty case; a demo loads only when asked."""
    inputs = store()
    if inputs.get("case.ready"):
        return
    inputs[key("units")] = False
    case.new_case(inputs)
    inputs["units.shown"] = "SI"
    inputs["load.message"] = inputs["load.error"] = ""
    inputs["case.ready"] = True


def start_new_case() -> None:
    """The sidebar's and the start page's control: a new, empty case."""
    inputs = store()
    case.new_case(inputs)
    inputs["load.error"] = ""
    inputs["load.message"] = ("New, empty case: no tank, spill, limits, elevation or worst "
                              "case from any file.")
    _sync_widgets()


def _load_text(text: str, source: str) -> None:
    from estimator.scenario import loads_scenario

    inputs = store()
    try:
        scenario = loads_scenario(text, source)
        notes = case.apply_scenario(inputs, scenario, source)
    except (UllageError, ValueError) as exc:
        record = views.error_record(exc)
        where = views.field_label(record["field"]) or "The file"
        line = re.search(r"\(line (\d+)\)", str(record["field"]))
        if line:
            where += f" (line {line.group(1)} of the file)"
        inputs["load.error"] = (f"{source} was not loaded. {where}: "
                                f"{record['reason']}. Fix the file and load it again.")
        inputs["load.message"] = ""
        return
    inputs["load.error"] = ""
    inputs["load.message"] = " ".join([f"Loaded {source}."] + notes)


def _load_demo(widget: str = "w:demo") -> None:
    name = st.session_state.get(widget)
    if not name:
        store()["load.error"] = "Choose a demo scenario first, then load it."
        return
    for path in case.demo_files():
        if path.name == name:
            _load_text(path.read_text(encoding="utf-8"), path.name)
    _sync_widgets()


def _load_upload() -> None:
    upload = st.session_state.get("up:scenario")
    if upload is None:
        return
    data = upload.getvalue()
    inputs = store()
    if len(data) > case.MAX_SCENARIO_UPLOAD:
        inputs["load.error"] = (f"{upload.name} is {len(data):,} bytes; a scenario file is "
                                f"short text, at most {case.MAX_SCENARIO_UPLOAD:,} bytes.")
        inputs["load.message"] = ""
        return
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError:
        inputs["load.error"] = (f"{upload.name} is not UTF-8 text; save it as UTF-8 and "
                                "load it again.")
        inputs["load.message"] = ""
        return
    _load_text(text, upload.name)
    _sync_widgets()


def _units_changed() -> None:
    inputs = store()
    inputs[key("units")] = bool(st.session_state.get("w:units"))
    new = system(inputs)
    case.switch_units(inputs, inputs.get("units.shown", "SI"), new)
    inputs["units.shown"] = new
    _sync_widgets()


def file_stem(title: str) -> str:
    return re.sub(r"[^a-z0-9]+", "-", title.lower()).strip("-")[:60] or "case"


def loaded_words(inputs) -> str:
    """What is on screen, in words: the file loaded (and its title) or a new case."""
    source = str(inputs.get("case.source") or case.NEW_CASE)
    title = str(inputs.get(key("title")) or "").strip()
    if source == case.NEW_CASE:
        return f"On screen: {case.NEW_CASE}" + (f", “{title}”" if title and title !=
                                                   case.PLAIN["title"] else "") + "."
    return f"On screen: {source}" + (f", “{title}”" if title else "") + "."


def demo_chooser(where: str = "sidebar") -> None:
    """A demo selectbox (empty until one is chosen) and its load button."""
    names = [p.name for p in case.demo_files()]
    if not names:
        return
    widget = "w:demo" if where == "sidebar" else f"w:demo.{where}"
    st.selectbox("Demo scenario (invented sites)", names, index=None, key=widget,
                 placeholder="Choose a demo")
    st.button("Load this demo", on_click=_load_demo, args=(widget,), key=f"load:{where}",
              disabled=not st.session_state.get(widget))


def sidebar(study: str | None) -> None:
    from estimator.scenario import dumps_scenario

    inputs = store()
    with st.sidebar:
        st.markdown(f"**{loaded_words(inputs)}**")
        st.button("Start a new, empty case", on_click=start_new_case, key="new:sidebar")
        bound(st.toggle, "US customary units (°F, gal, ft, psi)", "units",
              on_change=_units_changed, marks=False)
        bound(st.text_input, "Case title", "title", marks=False)
        st.markdown("**Scenario files**")
        demo_chooser()
        st.file_uploader("Load a scenario file (.toml, up to 1 MB)", type=["toml"],
                         key="up:scenario", on_change=_load_upload, max_upload_size=1)
        if inputs.get("load.error"):
            st.error(inputs["load.error"])
        elif inputs.get("load.message"):
            st.caption(inputs["load.message"])
        title = str(inputs.get(key("title")) or "case")
        st.download_button("Save the inputs as a scenario file",
                           data=lambda: dumps_scenario(case.full_document(inputs)),
                           file_name=f"{file_stem(title)}.toml", mime="application/toml",
                           on_click="ignore")
        st.caption("The file holds what is loaded and what you entered, nothing more.")


def setup_page(title: str, study: str | None = None, lead: str = "") -> Slots:
    """Start a page: first demo on a first visit, sidebar, cautions, title."""
    _first_visit()
    st.session_state["page.study"] = study
    sidebar(study)
    st.html(TILE_STYLE)
    show_cautions()
    st.title(title)
    if lead:
        st.caption(lead)
    return Slots()


# -------------------------------------------------------------------- inputs

def quantity(label: str, name: str, *, help: str | None = None, optional: bool = False,
             container=None):
    """A number box for an input with a unit, labelled with the unit on screen."""
    kind = case.QUANTITIES[name][0]
    target = container or st
    extra = {"value": None} if optional else {}
    return bound(target.number_input, f"{label} [{unit_label(kind, system(store()))}]", name,
                 help=help, format="%g", result_only=True, **extra)


def number(label: str, name: str, *, help: str | None = None, optional: bool = False,
           container=None, **kwargs):
    target = container or st
    extra = {"value": None} if optional else {}
    return bound(target.number_input, label, name, help=help, format="%g", result_only=True,
                 **extra, **kwargs)


def text_box(label: str, name: str, container=None, **kwargs):
    return bound((container or st).text_input, label, name, **kwargs)


def choice(label: str, name: str, options, container=None, **kwargs):
    inputs = store()
    if inputs.get(key(name)) not in options:
        inputs[key(name)] = options[0]
        st.session_state.pop("w:" + name, None)
    return bound((container or st).radio, label, name, options=options, **kwargs)


@st.cache_data(show_spinner=False)
def substance_table() -> pd.DataFrame:
    """The bundled substance table: key, name, CAS, for choosers."""
    from estimator.substances import all_substances

    rows = [{"key": s.key, "name": s.name, "cas": s.cas} for s in all_substances()]
    return pd.DataFrame(rows).sort_values("name", key=lambda c: c.str.lower(),
                                          ignore_index=True)


@st.cache_data(show_spinner=False)
def substance_labels() -> dict:
    table = substance_table()
    return {k: (f"{n} ({c})" if c else n) for k, n, c in table[["key", "name", "cas"]].values}


@st.cache_data(show_spinner=False, max_entries=256)
def find_substance(text: str) -> dict:
    """An exact match of a name, synonym or CAS (the curated table first, then the
    property library), or close matches, or the reason none.

    ``library`` maps the keys of liquids from the property library among the hit and
    the matches to their name and label; ``notes`` are the hit's cautions.
    """
    from estimator.substances import search_substances, substance

    found = {}
    try:
        sub = substance(text, "substance search")
    except UllageError as exc:
        cas_like = re.fullmatch(r"\s*\d{2,7}-\d{2}-\d\s*", text) is not None
        subs = [] if cas_like else search_substances(text, limit=6)
        for s in subs:
            case.remember_library_substance(found, s)
        return {"key": None, "matches": [s.key for s in subs],
                "error": None if subs else exc.reason,
                "library": found.get(case.LIBRARY_FOUND, {}), "notes": []}
    case.remember_library_substance(found, sub)
    return {"key": sub.key, "matches": [], "error": None,
            "library": found.get(case.LIBRARY_FOUND, {}),
            "notes": list(sub.notes) if sub.origin == "lookup" else []}


def _library_found() -> dict:
    """Liquids from the property library found during this visit: key -> name, label."""
    return store().setdefault(case.LIBRARY_FOUND, {})


def substance_choices() -> dict:
    """Substance key -> label: the curated table, then liquids found in the library."""
    return {**substance_labels(), **{k: v["label"] for k, v in _library_found().items()}}


def substance_names() -> list[str]:
    names = list(substance_table()["name"]) + [v["name"] for v in _library_found().values()]
    own = str(store().get(key("sds.name")) or "").strip()
    return ([own] if own else []) + names


def set_input(name: str, value) -> None:
    store()[key(name)] = value
    if "w:" + name in st.session_state:
        st.session_state["w:" + name] = value


def _found(prefix: str) -> None:
    text = str(st.session_state.get(f"w:{prefix}.find") or "").strip()
    store()[key(f"{prefix}.find")] = text
    if text:
        hit = find_substance(text)
        _library_found().update(hit["library"])
        if hit["key"]:
            set_input(f"{prefix}.substance", hit["key"])


def _pick(prefix: str, substance_key: str) -> None:
    entered()
    set_input(f"{prefix}.substance", substance_key)
    set_input(f"{prefix}.find", "")


def substance_chooser(prefix: str, slots: Slots) -> None:
    """A selectbox over the table and a search box with close matches."""
    inputs = store()
    current = inputs.get(key(f"{prefix}.substance"))
    if current and current not in substance_choices():  # a liquid named in a loaded scenario
        hit = find_substance(str(current))
        _library_found().update(hit["library"])
        if hit["key"]:
            set_input(f"{prefix}.substance", hit["key"])
    labels = substance_choices()
    options = list(labels)
    if inputs.get(key(f"{prefix}.substance")) not in labels:
        set_input(f"{prefix}.substance", case.LIQUID_DEFAULTS.get(prefix, options[0]))
    left, right = st.columns([3, 2])
    bound(left.selectbox, "Substance", f"{prefix}.substance", options=options,
          format_func=labels.get)
    bound(right.text_input, "Find by name, synonym or CAS", f"{prefix}.find",
          on_change=_found, args=(prefix,), placeholder="e.g. MEK or 67-64-1")
    text = str(inputs.get(key(f"{prefix}.find")) or "").strip()
    if text:
        hit = find_substance(text)
        _library_found().update(hit["library"])
        labels = substance_choices()
        if hit["key"]:
            st.caption(f"'{text}' is {labels.get(hit['key'], hit['key'])}.")
            if hit["notes"]:
                st.warning("\n".join(f"- {n}" for n in hit["notes"]))
        elif hit["matches"]:
            st.caption(f"No exact match for '{text}'. Close matches:")
            cols = st.columns(min(3, len(hit["matches"])))
            for i, match in enumerate(hit["matches"]):
                cols[i % len(cols)].button(labels.get(match, match), key=f"pick:{prefix}:{match}",
                                           on_click=_pick, args=(prefix, match))
        else:
            st.error(f"**Substance search**: {hit['error']}")


def table_editor(name: str, column_config: dict, *, help_text: str = "") -> pd.DataFrame:
    """An editable table whose rows survive page switches and scenario loads."""
    inputs = store()
    generation = inputs.get("tbl.generation", 0)
    editor = f"tbl:{name}:editor:{generation}"
    base = f"tbl:{name}:base"
    if editor not in st.session_state or inputs.get(base, (None,))[0] != generation:
        inputs[base] = (generation,
                        pd.DataFrame(inputs.get(case.table_key(name))).reset_index(drop=True))
    edited = st.data_editor(inputs[base][1], key=editor, num_rows="dynamic", hide_index=True,
                            column_config=column_config, width="stretch", on_change=entered)
    inputs[case.table_key(name)] = edited
    if help_text:
        st.caption(help_text)
    return edited


def own_substance_block(slots: Slots) -> None:
    """A substance defined from its safety data sheet."""
    text_box("Name", "sds.name")
    a, b = st.columns(2)
    number("Molar mass [g/mol]", "sds.molar_mass", container=a)
    quantity("Normal boiling point", "sds.boiling", container=b)
    a, b = st.columns(2)
    quantity("Vapour pressure", "sds.vp", optional=True, container=a,
             help="As the safety data sheet gives it, with the temperature beside.")
    quantity("at the temperature", "sds.vp_temperature", optional=True, container=b)
    a, b, c = st.columns(3)
    number("LFL [% by volume]", "sds.lfl", optional=True, container=a)
    number("UFL [% by volume]", "sds.ufl", optional=True, container=b)
    quantity("Liquid density", "sds.density", optional=True, container=c)
    st.caption("Without a vapour pressure, the boiling point and Trouton's rule give a rough "
               "curve (the result says so). Leave a box empty when the sheet gives no value.")


def liquid_block(prefix: str, slots: Slots, *, allow_water: bool = False) -> None:
    kinds = ["table", "mixture", "own", "sds"] + (["water"] if allow_water else [])
    kind = choice("Liquid", f"{prefix}.kind", kinds, format_func=case.LIQUID_KINDS.get,
                  horizontal=True)
    if kind == "table":
        substance_chooser(prefix, slots)
    elif kind == "mixture":
        a, b = st.columns([3, 2])
        text_box("Name of the mixture", f"{prefix}.liquid_name", container=a,
                 placeholder="mixture")
        choice("Percentages by", f"{prefix}.basis", ["mass", "mole", "volume"], container=b,
               horizontal=True)
        table_editor(f"{prefix}.mixture", {
            "component": st.column_config.SelectboxColumn(
                "component", options=substance_names(), required=True),
            "percent": st.column_config.NumberColumn("percent", min_value=0.0,
                                                     max_value=100.0, format="%g")},
            help_text="Safety data sheets give mass %. Percentages are normalised when they "
                      "add up to within 5 % of 100 (with a note).")
    elif kind == "own":
        own_substance_block(slots)
    elif kind == "sds":
        from ullage_ui.sds_input import sds_block

        sds_block(prefix, slots)
    else:
        text_box("Name of the water", f"{prefix}.liquid_name",
                 placeholder="water with dissolved solvents")
        table_editor(f"{prefix}.dissolved", {
            "compound": st.column_config.SelectboxColumn(
                "compound", options=list(substance_table()["name"]), required=True),
            "mg/L": st.column_config.NumberColumn("mg/L", min_value=0.0, format="%g")},
            help_text="Dilute solutions only (Henry's law).")
    slots.add("liquid")


LIMIT_KINDS = ["TWA", "STEL", "ceiling", "emergency"]


def _check_limit(number_in_table: int, item: dict) -> str | None:
    from estimator.scenario import dumps_scenario

    doc = {"scenario": {"title": "limit check"}, "limit": [item]}
    own = case.own_substance(store())
    if item.get("substance", "").strip().lower() == own["name"].lower():
        doc["substance"] = [own]
    problem = views.scenario_problem(dumps_scenario(doc))
    if problem is None or not problem["field"].startswith("[[limit]]"):
        return None
    kind = next((k for k in LIMIT_KINDS if k in item), "")
    what = " ".join(x for x in (item.get("substance", ""), kind) if x)
    return f"row {number_in_table} ({what}): {problem['reason']}; this row is left out"


def accepted_limits() -> tuple[list, list[str]]:
    """The rows of the limits table the core accepts, as (row, item) pairs, and the
    problems of the others (each left out)."""
    good, problems = [], []
    for row, item in case.limit_rows(store()):
        problem = _check_limit(row, item)
        if problem:
            problems.append(problem)
        else:
            good.append((row, item))
    return good, problems


def limits_block(slots: Slots) -> list:
    """The limits table; returns the rows the core accepts, as (row, item) pairs."""
    st.markdown("**Exposure limits** (ullage ships none: enter those that apply to you, "
                "each with its source)")
    table_editor("limits", {
        "substance": st.column_config.SelectboxColumn("substance", options=substance_names(),
                                                      required=True),
        "kind": st.column_config.SelectboxColumn("kind", options=LIMIT_KINDS, default="TWA",
                                                 required=True),
        "value": st.column_config.NumberColumn("value", min_value=0.0, format="%g"),
        "unit": st.column_config.SelectboxColumn("unit", options=["ppm", "mg/m3"],
                                                 default="ppm", required=True),
        "source": st.column_config.TextColumn(
            "source", help="Where the value comes from: regulation, standard, company value "
                           "or 'illustrative'. Required.")})
    slots.add("limits")
    good, problems = accepted_limits()
    slots.problems("limits", problems)
    return good


def limits_summary(slots: Slots) -> list:
    """On a study page: which limits and alarms are in use, and any left out."""
    good, problems = accepted_limits()
    inputs = store()
    alarms = case.alarms(inputs)
    words = f"{len(good)} exposure limit(s) in use" if good else "No exposure limit entered"
    alarm_words = (f"alarms {inputs.get(key('alarm.percent_lfl'))} % LFL, oxygen "
                   f"{inputs.get(key('alarm.oxygen_low'))}–{inputs.get(key('alarm.oxygen_high'))} %"
                   + (" (edited)" if alarms else " (OSHA 29 CFR 1910.146 defaults)"))
    site = SITE_MODES.get(inputs.get(key("site.mode")), "")
    st.caption(f"{words}; {alarm_words}; site pressure: {site.lower()}. Change them on the "
               "page *Limits, alarms and site*.")
    slots.add("limits")
    slots.add("alarms")
    slots.add("site")
    slots.problems("limits", problems)
    return good


def alarms_block(slots: Slots) -> None:
    from estimator.limits import FlammabilityAlarms

    default = FlammabilityAlarms()
    st.markdown("**Alarm levels**")
    a, b, c = st.columns(3)
    number("Flammable vapour [% of LFL]", "alarm.percent_lfl", container=a)
    number("Oxygen low [%]", "alarm.oxygen_low", container=b)
    number("Oxygen high [%]", "alarm.oxygen_high", container=c)
    text_box("Source of these alarm levels", "alarm.source")
    st.caption(f"Defaults: {default.percent_lfl:g} % of the LFL, oxygen "
               f"{default.oxygen_low:g}–{default.oxygen_high:g} % — {default.source}.")
    slots.add("alarms")


SITE_MODES = {"sea level": "Sea level (101.325 kPa)", "elevation": "From the site elevation",
              "barometric": "Measured barometric pressure"}


def site_block(slots: Slots) -> None:
    mode = choice("Site pressure", "site.mode", list(SITE_MODES), format_func=SITE_MODES.get,
                  horizontal=True)
    if mode == "elevation":
        quantity("Site elevation", "site.elevation")
    elif mode == "barometric":
        quantity("Barometric pressure", "site.barometric")
    slots.add("site")


# --------------------------------------------------------------- uncertainty

def _starting_range(study: str, field: str) -> None:
    """When a distribution is chosen, fill its empty boxes with a range around the
    value entered above, as a starting point to edit."""
    inputs = store()
    name = case.uncertain_name(study, field, "kind")
    chosen = st.session_state.get("w:" + name, inputs.get(key(name)))
    inputs[key(name)] = chosen
    page_name, _, kind, _ = case.UNCERTAIN[study][field]
    value = inputs.get(key(page_name))
    if value is None:
        return
    v = float(value)
    if kind == "temperature":
        guess = {"low": v - 5.0, "mode": v, "high": v + 5.0}
    else:
        low = max(1.0, 0.5 * v) if field == "mixing_factor" else 0.5 * v
        guess = {"low": low, "mode": v, "high": max(1.5 * v, low * 1.5), "gm": v, "gsd": 2.0}
    for part in case.DISTRIBUTIONS.get(chosen, ()):
        part_name = case.uncertain_name(study, field, part)
        if inputs.get(key(part_name)) is None:
            set_input(part_name, case.round_shown(guess[part]))


def uncertainty_inputs(study: str, slots: Slots) -> dict:
    """The inputs of the Uncertainty section: each input fixed or given as a range,
    the number of samples, the seed and the method uncertainty.

    A problem with a range is shown right under it; returns them (input -> message).
    """
    inputs = store()
    reason = case.uncertainty_unavailable(inputs, study)
    if reason:
        st.info(reason)
        return {}
    problems = {}
    for field, (page_name, label, kind, options) in case.UNCERTAIN[study].items():
        file_spec = inputs.get(key(case.uncertain_name(study, field, "file")))
        offered = list(options) + (["file"] if file_spec is not None else [])
        chosen = choice(label, case.uncertain_name(study, field, "kind"), offered,
                        format_func=case.DISTRIBUTION_WORDS.get, horizontal=True,
                        on_change=_starting_range, args=(study, field))
        parts = case.DISTRIBUTIONS.get(chosen, ())
        if parts:
            columns = st.columns(len(parts))
            for column, part in zip(columns, parts):
                name = case.uncertain_name(study, field, part)
                words = case.PARAMETER_WORDS[part]
                if kind is None or part == "gsd":
                    number(words, name, optional=True, container=column)
                else:
                    quantity(words, name, optional=True, container=column)
        elif chosen == "file":
            st.caption("As written in the file: "
                       + case.written_distribution(file_spec) + ".")
        problem = None if chosen == "fixed" else case.distribution_problem(inputs, study, field)
        if problem:
            problems[field] = problem
            st.error(f"**{label}** (range): {problem}. This range is left out until it is "
                     "corrected.")
    carried = case.carried_uncertain(inputs, study)
    if carried:
        st.caption("Also given as ranges in the scenario file, kept as written: " + "; ".join(
            f"{views.input_words(u.get('input', ''))} "
            f"{case.written_distribution(u.get('distribution'))}" for u in carried) + ".")
    a, b = st.columns(2)
    bound(a.number_input, "Samples", "mc.samples", min_value=100,
          max_value=case.MAX_SAMPLES, step=1000,
          help=f"Up to {case.MAX_SAMPLES:,}; {case.DEFAULT_SAMPLES:,} give percentiles to "
               "about two figures.")
    bound(b.number_input, "Seed", "mc.seed", min_value=0, step=1,
          help="The same seed gives the same samples, so a run can be repeated exactly.")
    bound(st.checkbox, "Vapour-pressure method uncertainty", "mc.method",
          help="Multiply each sample's vapour pressure by a factor spread as the stated "
               "uncertainty of its method (shown with the methods above).")
    slots.add("uncertainty")
    return problems


def uncertainty_results(study: str, slots: Slots, limit_rows, units: str,
                        stated_ok: bool = True, side=None) -> None:
    """Run (cached) and show the probabilistic screening of the inputs on a page.

    `stated_ok` says whether the result at the stated values could be computed;
    until it can, the samples are not shown either. `side` is where the table of
    the inputs sampled goes (under the inputs); beside the results without it.
    """
    from estimator.scenario import dumps_scenario

    inputs = store()
    if case.uncertainty_unavailable(inputs, study):
        return
    _, problems = case.study_document(inputs, study, limits=limit_rows)
    if problems or not stated_ok:
        st.info("The probabilistic screening is shown once the result at the stated values "
                "above can be computed.")
        return
    doc = case.monte_carlo_document(inputs, study, limits=limit_rows)
    if doc is None:
        st.info("Every input is fixed. Choose a distribution for one of them to see how far "
                "the result can spread, and how likely each limit is to be exceeded.")
        return
    view = views.uncertainty_view(dumps_scenario(doc), units)
    if view["error"]:
        slots.show(view["error"])
        return
    show_uncertainty(view)
    with side if side is not None else st.container():
        st.markdown("**Inputs sampled**")
        table(view["inputs"])


def _chart_height(data: pd.DataFrame, color: str | None, lines) -> int:
    """Height of a chart [px]: the plot itself plus room for every legend entry."""
    entries = (data[color].nunique() if color and color in data else 0) + len(list(lines))
    titles = (1 if color else 0) + (1 if lines else 0)
    return 280 + 21 * entries + 24 * titles


def cumulative_chart(data: pd.DataFrame, *, lines=(), log_x: bool = False) -> None:
    """Cumulative distribution curves with the limits as labelled vertical dashed lines."""
    x_enc = {"field": "ppm", "type": "quantitative", "title": "concentration [ppm]"}
    if log_x:
        x_enc["scale"] = {"type": "log"}
    encoding = {"x": x_enc,
                "y": {"field": "fraction", "type": "quantitative",
                      "title": "fraction of samples at or below",
                      "scale": {"domain": [0, 1]}},
                "color": {"field": "series", "type": "nominal", "title": None,
                          "legend": LEGEND},
                "strokeDash": {"field": "series", "type": "nominal", "legend": None},
                "tooltip": [{"field": "series", "type": "nominal"},
                            {"field": "ppm", "type": "quantitative", "format": ",.3~r"},
                            {"field": "fraction", "type": "quantitative", "format": ",.3~r"}]}
    layers = [{"mark": {"type": "line", "strokeWidth": 2}, "encoding": encoding}]
    if lines:
        layers.append({"data": {"values": [dict(v) for v in lines]},
                       "mark": {"type": "text", "align": "right", "baseline": "bottom",
                                "dx": -4, "dy": -3, "angle": 270, "fontSize": 11,
                                "color": "#3a1c1c"},
                       "encoding": {"x": {"field": "ppm", "type": "quantitative"},
                                    "y": {"value": 4}, "text": {"field": "limit"}}})
        layers.append({"data": {"values": [dict(v) for v in lines]},
                       "mark": {"type": "rule", "strokeWidth": 1.5},
                       "encoding": {"x": {"field": "ppm", "type": "quantitative"},
                                    "strokeDash": {"field": "limit", "type": "nominal",
                                                   "scale": {"range": LIMIT_DASHES},
                                                   "title": "limits (dashed)",
                                                   "legend": LIMIT_LEGEND},
                                    "color": {"field": "limit", "type": "nominal",
                                              "title": "limits (dashed)",
                                              "scale": {"range": LIMIT_COLOURS},
                                              "legend": LIMIT_LEGEND},
                                    "tooltip": [{"field": "limit", "type": "nominal"},
                                                {"field": "ppm", "type": "quantitative",
                                                 "format": ",.3~r"}]}})
    spec = {"layer": layers,
            "resolve": {"scale": {"color": "independent", "strokeDash": "independent"},
                        "legend": {"color": "independent"}}}
    st.vega_lite_chart(data, spec, width="stretch",
                     height=_chart_height(data, "series", lines))


def show_uncertainty(view: dict) -> None:
    """The results of a probabilistic run: percentiles, exceedance, driver, curve."""
    st.caption(f"{view['n_text']} (the seed repeats the run exactly).")
    tiles = view["key_percentiles"]
    if tiles:
        for column, (label, value) in zip(st.columns(len(tiles)), tiles):
            column.metric(label, value)
    st.markdown("**Percentiles over the samples**")
    table(view["percentiles"])
    if len(view.get("low_percentiles", ())):
        st.markdown("**Oxygen: its low percentiles** (the hazard is too little oxygen)")
        table(view["low_percentiles"])
    st.markdown("**Probability of exceeding each limit and alarm**")
    table(view["exceedance"])
    if view["driver_text"]:
        st.markdown(view["driver_text"])
        table(view["sensitivity"])
        st.caption("A rank correlation near ±1 means the output follows that input closely; "
                   "it is not a share of the variance.")
    cumulative_chart(view["curve"], lines=view["lines"], log_x=view["log_x"])
    st.caption("Where a curve crosses a limit line, one minus its height is the probability "
               "of exceeding that limit.")
    if view["warnings"]:
        st.warning("**About the probabilistic screening**\n\n" + bullet_list(view["warnings"]))


# ------------------------------------------------------------------- results

def markdown_table(frame: pd.DataFrame) -> str:
    """A small table as Markdown text (cheaper to send than a data grid)."""
    def cell(value) -> str:
        return str(value).replace("|", "\\|").replace("\n", " ")

    head = "| " + " | ".join(cell(c) for c in frame.columns) + " |"
    rule = "|" + "---|" * len(frame.columns)
    rows = ["| " + " | ".join(cell(v) for v in values) + " |"
            for values in frame.itertuples(index=False, name=None)]
    return "\n".join([head, rule] + rows)


def table(frame: pd.DataFrame) -> None:
    if frame is not None and len(frame):
        st.markdown(markdown_table(frame))


def bullet_list(lines) -> str:
    return "\n".join(f"- {line}" for line in lines)


def show_notes(view: dict) -> None:
    """Findings, warnings and assumptions of a result."""
    if view.get("findings"):
        st.markdown("**What the screening finds**\n\n" + bullet_list(view["findings"]))
    if view.get("warnings"):
        st.warning("**Warnings**\n\n" + bullet_list(view["warnings"]))
    if view.get("assumptions"):
        st.caption("Assumptions: " + "; ".join(view["assumptions"]) + ".")


#: Legends below the plot, one entry a line, never cut short.
LEGEND = {"orient": "bottom", "direction": "vertical", "labelLimit": 0}
#: The limit lines' legend above the plot (colour and dash pattern together), so
#: that the two legends never sit side by side and run out of width.
LIMIT_LEGEND = {"orient": "top", "direction": "vertical", "labelLimit": 0,
                "symbolType": "stroke", "symbolStrokeWidth": 2}

#: Dash patterns of limit lines, one per limit, so that they differ by more than
#: colour (each is also labelled in place).
LIMIT_DASHES = [[6, 4], [2, 3], [10, 3, 2, 3], [12, 4], [4, 2, 1, 2], [1, 4], [8, 2, 2, 2]]

#: Colours of limit lines: dark, warm and clearly apart from the data lines.
LIMIT_COLOURS = ["#7a1f1f", "#a65e00", "#5b3a73", "#375a7f", "#5e5e5e", "#8c4a2f", "#2f5d50"]


def chart(data: pd.DataFrame, *, x: str, x_title: str, y: str, y_title: str,
          log_x: bool = False, log_y: bool = False, lines=(), line_field: str = "ppm",
          color: str | None = "series", marker: float | None = None) -> None:
    """A line chart with limits drawn as labelled horizontal dashed lines."""
    x_enc = {"field": x, "type": "quantitative", "title": x_title}
    y_enc = {"field": y, "type": "quantitative", "title": y_title}
    if log_x:
        x_enc["scale"] = {"type": "log"}
    if log_y:
        y_enc["scale"] = {"type": "log"}
    encoding = {"x": x_enc, "y": y_enc,
                "tooltip": [{"field": x, "type": "quantitative", "format": ",.3~r"},
                            {"field": y, "type": "quantitative", "format": ",.3~r"}]}
    if color:
        encoding["color"] = {"field": color, "type": "nominal", "title": None,
                             "legend": LEGEND}
        encoding["strokeDash"] = {"field": color, "type": "nominal", "legend": None}
        encoding["tooltip"].append({"field": color, "type": "nominal"})
    layers = [{"mark": {"type": "line", "strokeWidth": 2}, "encoding": encoding}]
    if lines:
        values = [dict(v) for v in lines]
        layers.append({"data": {"values": values},
                       "mark": {"type": "text", "align": "left", "dx": 4, "dy": -6,
                                "fontSize": 11, "color": "#3a1c1c"},
                       "encoding": {"y": {"field": line_field, "type": "quantitative"},
                                    "x": {"value": 0}, "text": {"field": "limit"}}})
        layers.append({"data": {"values": values},
                       "mark": {"type": "rule", "strokeWidth": 1.5},
                       "encoding": {"y": {"field": line_field, "type": "quantitative"},
                                    "strokeDash": {"field": "limit", "type": "nominal",
                                                   "scale": {"range": LIMIT_DASHES},
                                                   "title": "limits (dashed)",
                                                   "legend": LIMIT_LEGEND},
                                    "color": {"field": "limit", "type": "nominal",
                                              "title": "limits (dashed)",
                                              "scale": {"range": LIMIT_COLOURS},
                                              "legend": LIMIT_LEGEND},
                                    "tooltip": [{"field": "limit", "type": "nominal"}]}})
    if marker is not None:
        # the marker's place travels with the data, not the spec: a new stated value
        # then updates the chart in place instead of drawing it anew
        data = data.assign(_marker=float(marker))
        layers.append({"mark": {"type": "rule", "color": "#555555", "strokeDash": [2, 3]},
                       "encoding": {"x": {"field": "_marker", "type": "quantitative",
                                          "aggregate": "max"}}})
    spec = {"layer": layers,
            "resolve": {"scale": {"color": "independent", "strokeDash": "independent"},
                        "legend": {"color": "independent"}}}
    st.vega_lite_chart(data, spec, width="stretch",
                     height=_chart_height(data, color, lines))


def downloads_withheld() -> None:
    """Instead of the downloads while an input is left out of the result."""
    st.caption("The report and results downloads come back once the inputs named "
               "beside their boxes are corrected: a report leaves nothing out.")


def downloads(toml_text: str | None, stem: str) -> None:
    """Download buttons for the HTML report and the CSV results of the case on screen."""
    if toml_text is None:
        return
    if not views.reports_available():
        st.info("Reports are not available in this version of ullage.")
        return
    a, b = st.columns(2)
    a.download_button("Download the HTML report", data=lambda: views.report_text(toml_text, "html"),
                      file_name=f"{stem}-report.html", mime="text/html", on_click="ignore",
                      key=f"dl:{stem}:html")
    b.download_button("Download the results (CSV)", data=lambda: views.report_text(toml_text, "csv"),
                      file_name=f"{stem}-results.csv", mime="text/csv", on_click="ignore",
                      key=f"dl:{stem}:csv")


def study_page(kind: str, draw_inputs, view_function, show, caption: str,
               input_notes=None) -> None:
    """The body of a study page: the inputs, the result in a fragment of its own, then
    the uncertainty section.

    A changed number among the inputs reruns only the result (the fragment keyed
    ``result.<kind>``): the inputs, sidebar, cautions and the Monte Carlo are left as
    they are. The whole page runs again instead when the change shows beside the
    inputs (an error in a block of inputs, or what `input_notes` tells of the
    inputs changes) or touches what the samples use (the liquid, the pressure, the
    limits). Other inputs (choices, toggles, tables, text) rerun the whole page. The
    Monte Carlo itself is cached on its own inputs.

    Parameters
    ----------
    kind : str
        "tank" or "indoor".
    draw_inputs : callable
        Slots -> the accepted limit rows; draws the page's inputs.
    view_function : callable
        Scenario text and units -> the view dict the page's `show` draws.
    show : callable
        Draws a view.
    caption : str
        What the uncertainty section does, in plain words.
    input_notes : callable, optional
        The store -> a value standing for the notes that `draw_inputs` shows beside
        the inputs (for example whether the worst case is below the stated
        temperature); the whole page runs again when it changes.
    """
    session = st.session_state
    session["page.full_run"] = True
    slots = Slots()
    inputs_column, results_column = st.columns([2, 3], gap="large")
    session[RESULT_FRAGMENT] = _result_key(kind)
    try:
        with inputs_column:
            limit_rows = draw_inputs(slots)
    finally:
        session.pop(RESULT_FRAGMENT, None)
    session[f"page.notes.{kind}"] = input_notes(store()) if input_notes else None
    with results_column:
        st.fragment(_study_result, key=_result_key(kind))(
            kind, view_function, show, slots, limit_rows, input_notes)
    slots = Slots()
    st.divider()
    st.header("Uncertainty", anchor="uncertainty")
    st.caption(caption)
    range_inputs, range_results = st.columns([2, 3], gap="large")
    with range_inputs:
        uncertainty_inputs(kind, slots)
        sampled_place = st.container()
    with range_results:
        slots.add("general")
        uncertainty_results(kind, slots, limit_rows, case.system(store()),
                            stated_ok=bool(session.get(f"result.ok.{kind}")),
                            side=sampled_place)
    session[f"mc.drawn.{kind}"] = _samples_key(kind, limit_rows)
    session["page.full_run"] = False


def _result_key(kind: str) -> str:
    return f"result.{kind}"


class _WholePage(Exception):
    """Raised while only a result is drawn, when the change shows beside the inputs."""


class _ResultSlots(Slots):
    """The places for errors while only the result is drawn: an error that belongs
    beside a block of inputs needs the whole page."""

    def show(self, error: dict) -> None:
        if error.get("area", "general") != "general":
            raise _WholePage
        super().show(error)

    def problems(self, area: str, lines) -> None:
        if list(lines):
            raise _WholePage


def _samples_key(kind: str, limit_rows) -> tuple:
    """What the page's uncertainty section depends on (see `study_page`)."""
    from estimator.scenario import dumps_scenario

    inputs = store()
    doc = case.monte_carlo_document(inputs, kind, limits=limit_rows)
    return (None if doc is None else dumps_scenario(doc),
            bool(st.session_state.get(f"result.ok.{kind}")),
            case.uncertainty_unavailable(inputs, kind))


def _study_result(kind: str, view_function, show, page_slots: Slots, limit_rows,
                  input_notes) -> None:
    """The result of a study page, with the downloads (see `study_page`).

    In the page's own run it uses the page's slots and limits; run alone it finds
    them anew, and hands over to the whole page where the change shows beside the
    inputs.
    """
    session = st.session_state
    alone = not session.get("page.full_run")
    state = store()
    if alone and (session.get(f"page.beside.{kind}")
                  or (input_notes(state) if input_notes else None)
                  != session.get(f"page.notes.{kind}")):
        st.rerun()  # errors or notes beside the inputs are to be drawn or cleared
    slots = _ResultSlots() if alone else page_slots
    if alone:
        limit_rows = accepted_limits()[0]
    before = set(slots.shown)  # what the inputs showed (a limits row left out...)
    try:
        view = _draw_result(kind, view_function, show, slots, limit_rows)
    except _WholePage:
        st.rerun()
    session[f"page.beside.{kind}"] = bool(slots.shown - before - {"general"})
    session[f"result.ok.{kind}"] = view is not None
    if alone and _samples_key(kind, limit_rows) != session.get(f"mc.drawn.{kind}"):
        st.rerun()  # the change touches the samples too: run the whole page


def _draw_result(kind: str, view_function, show, slots: Slots, limit_rows) -> dict | None:
    """Compute and draw the result; the view drawn, or None when there is none."""
    from estimator.scenario import dumps_scenario

    state = store()
    st.subheader("Result")
    slots.add("general")
    doc, problems = case.view_document(state, kind, limits=limit_rows)
    if problems:
        slots.problems("liquid", problems)
        return None
    view = view_function(dumps_scenario(doc), case.system(state))
    for error in view.get("field_errors", ()):
        slots.show(error)
    if view["error"]:
        slots.show(view["error"])
        return None
    show(view)
    if view.get("field_errors"):
        downloads_withheld()
    else:
        report_doc, _ = case.study_document(state, kind, limits=limit_rows, uncertain=True)
        downloads(dumps_scenario(report_doc), file_stem(view["name"]))
    return view
