"""Site inventory: the equilibrium headspace of every tank and drum in one file."""

from pathlib import Path

import streamlit as st

from estimator.errors import UllageError
from ullage_ui import case, shared, views
from ullage_ui.case import key

slots = shared.setup_page(
    "Site inventory",
    lead="Every tank and drum of a site at once: the equilibrium headspace at the liquid "
         "temperature and in the worst case, ranked by concern.")
state = shared.store()

st.markdown(
    "A CSV file (UTF-8) or an .xlsx workbook with one row per container. Required columns: "
    "`container`, `liquid` (a name, synonym or CAS number, or a mixture such as "
    "\"toluene 60%, o-xylene 40%\") and a temperature whose unit is in the header "
    "(`temperature_C`, `temperature_F` or `temperature_K`). Optional: `basis`, "
    "`temperature_high_C` (worst case), `fill_percent`, `pressure_kPa`, `elevation_m`, "
    "`twa_ppm`, `stel_ppm`, `ceiling_ppm` with `limit_source` (a limit without a source "
    "is not used). Other columns are passed through.")
a, b = st.columns([3, 2])
upload = a.file_uploader("Inventory file (.csv or .xlsx, up to 20 MB)",
                         type=["csv", "xlsx", "xlsm"], key="up:inventory", max_upload_size=20)
use_example = shared.bound(b.toggle, "Use the example inventory (invented site)",
                           "inv.example")
slots.add("file")
st.caption("Alarm levels and the site pressure for rows without their own come from the "
           "page *Limits, alarms and site*; exposure limits come from the file's columns.")
slots.add("general")


def _site():
    """The site pressure [Pa] or elevation [m], converted at the edge."""
    from estimator.units import parse_quantity

    conditions = case.conditions(state)
    if "elevation" in conditions:
        return None, parse_quantity(conditions["elevation"], "length", "elevation")
    if "barometric_pressure" in conditions:
        return parse_quantity(conditions["barometric_pressure"], "pressure",
                              "barometric pressure"), None
    return None, None


data = name = None
if upload is not None:
    data, name = upload.getvalue(), upload.name
    if len(data) > case.MAX_INVENTORY_UPLOAD:
        slots.show({"field": name, "area": "file",
                    "reason": f"is {len(data) / 1e6:.1f} MB, above the 20 MB limit for one "
                              "inventory file; split it into several files"})
        data = None
elif use_example:
    data, name = case.EXAMPLE_INVENTORY.read_bytes(), case.EXAMPLE_INVENTORY.name

if data is not None:
    try:
        pressure, elevation = _site()
        alarms = (float(state.get(key("alarm.percent_lfl"))),
                  float(state.get(key("alarm.oxygen_low"))),
                  float(state.get(key("alarm.oxygen_high"))),
                  str(state.get(key("alarm.source")) or "entered on screen"))
    except (UllageError, ValueError, TypeError) as exc:
        view = {"error": views.error_record(exc)}
    else:
        view = views.inventory_view(data, name, pressure, elevation, alarms)
    if view["error"]:
        slots.show(view["error"])
    else:
        counts = view["counts"]
        a, b, c, d = st.columns(4)
        a.metric("Rows screened", f"{view['rows']:,}")
        b.metric("At or above a limit or alarm", f"{view['at_or_above']:,}",
                 help="Worst case reaches a limit, the % LFL alarm or the low-oxygen alarm.")
        c.metric("Computed with warnings", f"{counts.get('warning', 0):,}")
        d.metric("Not computed (errors)", f"{counts.get('error', 0):,}")
        st.caption(f"{view['liquids']} distinct liquids; default vapour-space pressure "
                   f"{view['pressure_text']}.")
        if len(view["worst"]):
            st.markdown("**Highest concern first** (a concern of 1 or more means a limit or "
                        "alarm is reached in the worst case)")
            st.dataframe(view["worst"], hide_index=True, width="stretch")
        if view["errors"]:
            st.error("**Rows not computed**\n\n" + shared.bullet_list(view["errors"][:50]))
        if view["warnings"]:
            st.warning("**About the file**\n\n" + shared.bullet_list(view["warnings"]))
        with st.expander("Every row, highest concern first"):
            st.dataframe(view["table"], hide_index=True, width="stretch")
        st.download_button("Download the screened table (CSV)", data=view["csv"],
                           file_name=f"{Path(name).stem}-screened.csv", mime="text/csv",
                           on_click="ignore")
else:
    st.info("Upload an inventory file, or switch on the example inventory.")
