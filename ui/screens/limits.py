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


def _record(exc, area: str) -> dict:
    """A core error as an error record of the block `area`, naming its field."""
    return {"field": getattr(exc, "field", ""), "reason": getattr(exc, "reason", str(exc)),
            "area": area}


def _check_alarms() -> None:
    """The alarm levels, checked on their own: a bad one is named beside its block and
    leaves the limits and the site pressure shown."""
    from estimator.limits import FlammabilityAlarms

    try:
        FlammabilityAlarms(float(state.get(key("alarm.percent_lfl")) or 0.0),
                           float(state.get(key("alarm.oxygen_low")) or 0.0),
                           float(state.get(key("alarm.oxygen_high")) or 0.0),
                           str(state.get(key("alarm.source")) or ""))
    except (UllageError, ValueError) as exc:
        slots.show(_record(exc, "alarms"))


def _check_site() -> None:
    """The site pressure, checked on its own (the range of a barometric pressure is
    `estimator.checks.check_barometric_pressure`'s)."""
    from estimator.checks import check_barometric_pressure
    from estimator.headspace import barometric_pressure
    from estimator.units import parse_quantity

    conditions = case.conditions(state)
    try:
        if "elevation" in conditions:
            pressure = barometric_pressure(parse_quantity(conditions["elevation"], "length",
                                                          "elevation"))
        elif "barometric_pressure" in conditions:
            pressure = check_barometric_pressure(parse_quantity(
                conditions["barometric_pressure"], "pressure", "barometric pressure"))
        else:
            pressure = 101325.0
    except (UllageError, ValueError) as exc:
        slots.show(_record(exc, "site"))
        return
    st.caption(f"Pressure used: {format_number(pressure / 1000.0)} kPa (barometric; a tank's gauge "
               "pressure is added on the tank page).")


_check_alarms()
_check_site()
