"""What an inventory screening returns and how it is summarised: the result objects,
sorting by concern, concern bands and the terminal summary.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass

import numpy as np
import pandas as pd

from ..errors import InputError
from ..limits import FlammabilityAlarms
from .columns import resolve_roles

__all__ = [
    "InventorySummary",
    "InventoryScreening",
    "sorted_by_concern",
    "CONCERN_BANDS",
    "concern_counts",
    "inventory_summary_text",
]


# --------------------------------------------------------------------- the screening

@dataclass(frozen=True)
class InventorySummary:
    """Counts and the worst rows of a screening.

    Attributes
    ----------
    rows : int
        Rows screened (every input row).
    counts : mapping
        "ok", "warning" and "error" -> number of rows.
    at_or_above_alarm : int
        Computed rows with a concern of 1 or more (a limit or alarm reached).
    liquids : int
        Distinct liquids (substance or composition) evaluated.
    worst : pandas.DataFrame
        The rows of highest concern, highest first (see `sorted_by_concern`).
    """

    rows: int
    counts: Mapping[str, int]
    at_or_above_alarm: int
    liquids: int
    worst: pd.DataFrame


@dataclass(frozen=True)
class InventoryScreening:
    """The result of `screen_inventory`.

    Attributes
    ----------
    table : pandas.DataFrame
        One row per input row, in input order: the input columns, then
        `OUTPUT_COLUMNS`.
    summary : InventorySummary
    cautions : tuple of str
        `estimator.CAUTIONS`, shown with every result.
    warnings : tuple of str
        Notes on the table as a whole (columns not read, duplicate containers).
    pressure : float
        Vapour-space pressure used for rows without their own. [Pa]
    alarms : FlammabilityAlarms
        The LFL and oxygen alarm levels the concern uses.
    source : str
        The file name, or "table" for a DataFrame.
    """

    table: pd.DataFrame
    summary: InventorySummary
    cautions: tuple[str, ...]
    warnings: tuple[str, ...]
    pressure: float
    alarms: FlammabilityAlarms
    source: str


def sorted_by_concern(table) -> pd.DataFrame:
    """The screened rows, highest concern first, without losing any row.

    Rows of equal concern keep their input order; rows not computed (errors)
    come last, in input order.

    Parameters
    ----------
    table : pandas.DataFrame or InventoryScreening
        A screening table (or result).

    Returns
    -------
    pandas.DataFrame
        The same rows and columns, reordered.
    """
    frame = table.table if isinstance(table, InventoryScreening) else table
    if "concern" not in frame.columns or "source_line" not in frame.columns:
        raise InputError("table", "this is not a screening table (no concern column); "
                         "pass the result of screen_inventory")
    return frame.sort_values(["concern", "source_line"], ascending=[False, True],
                             na_position="last", kind="stable")


#: Bands of the concern counted in the terminal summary: (label, low, high).
CONCERN_BANDS = (
    ("1 or more (a limit or alarm reached)", 1.0, math.inf),
    ("0.5 to 1", 0.5, 1.0),
    ("0.1 to 0.5", 0.1, 0.5),
    ("below 0.1", -math.inf, 0.1),
)


def concern_counts(table) -> dict[str, int]:
    """Rows per band of `CONCERN_BANDS`, then those without a concern (not computed).

    Parameters
    ----------
    table : pandas.DataFrame or InventoryScreening

    Returns
    -------
    dict
        Band label -> number of rows; "not computed" for rows without a concern.
    """
    frame = table.table if isinstance(table, InventoryScreening) else table
    concern = frame["concern"].to_numpy(dtype=float)
    counts = {}
    for label, low, high in CONCERN_BANDS:
        with np.errstate(invalid="ignore"):
            counts[label] = int(((concern >= low) & (concern < high)).sum())
    counts["not computed"] = int(np.isnan(concern).sum())
    return counts


def _short(values, width: int) -> list[str]:
    text = pd.Series(values, dtype=object).fillna("").astype(str)
    longer = text.str.len() > width
    text[longer] = text[longer].str[:width - 1] + "~"
    return text.tolist()


def inventory_summary_text(result: InventoryScreening, top: int = 10,
                           output=None) -> str:
    """A summary of a screening for the terminal, whatever the number of rows.

    Counts by status and by band of concern, the `top` rows of highest concern,
    every row that could not be computed with its reason, and the notes on the
    table. The cautions are the caller's to print with it.

    Parameters
    ----------
    result : InventoryScreening
    top : int
        Rows of highest concern listed.
    output : str or os.PathLike, optional
        Where the full table was written, to say so.

    Returns
    -------
    str
    """
    from ..limits import format_ppm

    table = result.table
    summary = result.summary
    counts = summary.counts
    lines = [f"Inventory {result.source}: {summary.rows} row(s), {summary.liquids} distinct "
             f"liquid(s); vapour-space pressure {result.pressure / 1000:.4g} kPa unless a "
             "row gives its own.",
             "SCREENING ESTIMATE: measure with calibrated instruments before entry.", "",
             f"Status: {counts['ok']} computed without cautions, {counts['warning']} computed with cautions, "
             f"{counts['error']} not computed.",
             "Concern in the worst case (worst-case ppm over the lowest limit, %LFL over "
             f"the {result.alarms.percent_lfl:g} % alarm, oxygen displaced over that at "
             "the low-oxygen alarm):"]
    lines += [f"  {label:<40} {count:>9}" for label, count in concern_counts(table).items()]
    concern = table["concern"].to_numpy(dtype=float)
    order = np.argsort(np.where(np.isnan(concern), np.inf, -concern), kind="stable")
    shown = order[:max(int(top), 0)]
    shown = shown[np.isfinite(concern[shown])]
    roles = resolve_roles(table)
    if shown.size:
        lines += ["", f"Highest concern ({shown.size} of {summary.rows} rows):",
                  f"{'rank':>5} {'line':>7}  {'container':<22} {'liquid':<26} "
                  f"{'worst ppm':>10} {'% LFL':>7} {'O2 %':>5} {'concern':>8}  driver"]
        part = table.iloc[shown]
        columns = zip(part["concern_rank"].tolist(), part["source_line"].tolist(),
                      _short(part[roles[0]], 22), _short(part[roles[1]], 26),
                      part["worst_case_ppm"].tolist(), part["worst_case_percent_lfl"].tolist(),
                      part["worst_case_oxygen_percent"].tolist(), part["concern"].tolist(),
                      part["concern_driver"].tolist(), part["status"].tolist())
        for rank, line, container, liquid, ppm, lfl, oxygen, value, driver, status in columns:
            lines.append(f"{rank:>5} {line:>7}  {container:<22} {liquid:<26} "
                         f"{format_ppm(ppm):>10} {lfl:>7.3g} {oxygen:>5.3g} {value:>8.3g}  "
                         f"{driver}" + ("  (with cautions)" if status == "warning" else ""))
    failed = table["status"].to_numpy(dtype=object) == "error"
    if failed.any():
        part = table[failed]
        lines += ["", f"Not computed ({int(failed.sum())} row(s)):"]
        text = ("  " + pd.Series(_short(part[roles[0]], 30), dtype=object) + ": "
                + part["reason"].astype(str).to_numpy(dtype=object))
        lines += text.tolist()
    lines += [f"note: {w}" for w in result.warnings]
    if counts["warning"]:
        lines.append(f"{counts['warning']} computed row(s) carry cautions; the reason column "
                     "of the table gives them.")
    lines.append("")
    lines.append(f"Every row, with its reasons, is in {output}." if output else
                 "Write every row, with its reasons, with --output FILE.csv.")
    return "\n".join(lines)
