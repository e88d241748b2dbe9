"""Limits, alarms and site: the exposure limits, alarm levels and site pressure that
every page compares with."""

import streamlit as st

from estimator.errors import UllageError
from estimator.limits import format_number
from ullage_ui import case, shared
from ullage_ui.case import key

slots = shared.setup_page(
    "Limits, alarms and site",
    lead="The exposure limits, alarm levels and site pressure used on every page.")
state = shared.store()

rows = shared.limits_block(slots)
if rows:
    st.caption(f"{len(rows)} limit(s) in use. A limit applies to its own substance wherever "
               "it appears (a mixture component, a dissolved compound).")
shared.alarms_block(slots)
shared.site_block(slots)


def _check_alarms() -> None:
    from estimator.limits import FlammabilityAlarms

    try:
        FlammabilityAlarms(float(state.get(key("alarm.percent_lfl")) or 0.0),
                           float(state.get(key("alarm.oxygen_low")) or 0.0),
                           float(state.get(key("alarm.oxygen_high")) or 0.0),
                           str(state.get(key("alarm.source")) or ""))
    except (UllageError, ValueError) as exc:
        slots.show({"field": getattr(exc, "field", ""), "reason": getattr(exc, "reason", str(exc)),
                    "area": "alarms"})


def _check_site() -> None:
    from estimator.headspace import barometric_pressure
    from estimator.units import parse_quantity

    conditions = case.conditions(state)
    try:
        if "elevation" in conditions:
            pressure = barometric_pressure(parse_quantity(conditions["elevation"], "length",
                                                          "elevation"))
        elif "barometric_pressure" in conditions:
            pressure = parse_quantity(conditions["barometric_pressure"], "pressure",
                                      "barometric pressure")
            if not 3e4 < pressure < 1.2e5:
                raise ValueError("the barometric pressure must be between 30 and 120 kPa")
        else:
            pressure = 101325.0
    except (UllageError, ValueError) as exc:
        slots.show({"field": getattr(exc, "field", ""), "reason": getattr(exc, "reason", str(exc)),
                    "area": "site"})
        return
    st.caption(f"Pressure used: {format_number(pressure / 1000.0)} kPa (barometric; a tank's gauge "
               "pressure is added on the tank page).")


_check_alarms()
_check_site()
