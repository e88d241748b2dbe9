"""Parsing cells: numbers, numbers with units and formulas, cast once per column (text
parsed once per distinct cell).
"""

from __future__ import annotations

import math
import re
from collections.abc import Mapping

import numpy as np
import pandas as pd

from ..errors import InputError
from .columns import CELL_KINDS

__all__ = [
]


# --------------------------------------------------------------------- cell parsing

_CELL_NUMBER = re.compile(
    r"^\s*([-+]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")


def is_text_column(column: pd.Series) -> bool:
    """Whether a column can hold text (object or string dtype)."""
    return (pd.api.types.is_object_dtype(column.dtype)
            or pd.api.types.is_string_dtype(column.dtype))


def text_cells(column: pd.Series) -> tuple[pd.Series, np.ndarray]:
    """Stripped text of each cell (a text Series, "" where missing) and the blank mask."""
    missing = column.isna().to_numpy()
    if missing.any():
        column = column.where(~missing, "")
    text = column.astype("str").str.strip().reset_index(drop=True)
    return text, (text == "").to_numpy(dtype=bool)


def is_formula(column: pd.Series) -> np.ndarray:
    """Text cells beginning with "=": formulas (or text a spreadsheet would run).

    Numbers never print with a leading "=", so every cell is looked at as text.
    """
    if not is_text_column(column):
        return np.zeros(len(column), dtype=bool)
    if column.dtype == object:
        column = column.where(column.notna(), "").astype(str)
    return column.str.lstrip().str.startswith("=").fillna(False).to_numpy(dtype=bool)


def number_cells(column: pd.Series, unit_words: Mapping[str, str], unit: str,
                  label: str) -> tuple[np.ndarray, np.ndarray, tuple[np.ndarray, np.ndarray]]:
    """Numbers of a column in its header unit.

    Returns the values (NaN where blank or unusable), the blank mask and the
    problems as (positions, texts). Cells that are not plain numbers are parsed
    once per distinct content.
    """
    n = len(column)
    none = (np.empty(0, dtype=np.intp), np.empty(0, dtype=object))
    if pd.api.types.is_bool_dtype(column):
        positions = np.arange(n)
        texts = np.array([f"{v!r} is not a number in {label}" for v in pd.unique(column)],
                         dtype=object)[pd.factorize(column)[0]]
        return np.full(n, np.nan), np.zeros(n, dtype=bool), (positions, texts)
    if pd.api.types.is_numeric_dtype(column):
        values = column.to_numpy(dtype=float, na_value=np.nan).copy()
        blank = np.isnan(values)
        bad = np.flatnonzero(np.isinf(values))
        values[bad] = np.nan
        return values, blank, (bad, np.array([f"{column.iat[i]!r} is not a finite number"
                                              for i in bad], dtype=object))
    values = _fast_numbers(column)
    if values is None:
        values = pd.to_numeric(column, errors="coerce").to_numpy(dtype=float, na_value=np.nan)
    values = values.copy()
    if column.dtype == object:
        booleans = column.map(type).isin([bool, np.bool_]).to_numpy()
        values[booleans] = np.nan
    blank = np.zeros(n, dtype=bool)
    look = np.flatnonzero(~np.isfinite(values))
    if look.size == 0:
        return values, blank, none
    cells = column.iloc[look]
    missing = cells.isna().to_numpy()
    stripped = cells.where(~cells.isna(), "").astype(str).str.strip().to_numpy(dtype=object)
    empty = missing | (stripped == "")
    blank[look[empty]] = True
    look = look[~empty]
    if look.size == 0:
        return values, blank, none
    raw = column.to_numpy(dtype=object)[look]
    codes, distinct = pd.factorize(pd.Series(raw, dtype=object).map(repr))
    first = np.unique(codes, return_index=True)[1]
    parsed = [_parse_text_number(raw[i], unit_words, unit, label) for i in first]
    numbers = np.array([p[0] for p in parsed], dtype=float)
    problems = np.array([p[1] for p in parsed], dtype=object)
    values[look] = numbers[codes]
    bad = problems[codes] != ""
    return values, blank, (look[bad], problems[codes][bad])


def unit_cells(column: pd.Series, role: str, label
                ) -> tuple[np.ndarray, np.ndarray, tuple[np.ndarray, np.ndarray]]:
    """Quantities of a column whose header names no unit, each cell with its own, in SI.

    Every distinct cell is converted once (`estimator.units.parse_quantity`); a
    number without a unit is refused for its row, naming the column.
    """
    from ..units import parse_quantity

    kind, example = CELL_KINDS[role]
    n = len(column)
    blank = blank_cells(column)
    values = np.full(n, np.nan)
    look = np.flatnonzero(~blank)
    if look.size == 0:
        return values, blank, (np.empty(0, dtype=np.intp), np.empty(0, dtype=object))
    raw = column.to_numpy(dtype=object)[look]
    codes, distinct = pd.factorize(pd.Series(raw, dtype=object).map(repr))
    first = np.unique(codes, return_index=True)[1]
    numbers, problems = [], []
    for cell in raw[first]:
        text = cell.strip() if isinstance(cell, str) else cell
        if isinstance(text, str) and text.startswith("="):
            numbers.append(math.nan)
            problems.append(f"holds a formula ({text[:40]!r}); formulas are not evaluated: "
                            "enter the value itself")
            continue
        try:
            numbers.append(parse_quantity(text, kind, str(label).strip()))
            problems.append("")
        except InputError as exc:
            numbers.append(math.nan)
            hint = (f"; or name the unit in the header, for example {example!r}"
                    if "no unit" in exc.reason else "")
            problems.append(exc.reason + hint)
    numbers, problems = np.array(numbers, dtype=float), np.array(problems, dtype=object)
    values[look] = numbers[codes]
    bad = problems[codes] != ""
    return values, blank, (look[bad], problems[codes][bad])


def _fast_numbers(column: pd.Series) -> np.ndarray | None:
    """Plain numbers of an Arrow-backed text column in one cast (None if any cell is not).

    Blank cells become NaN; a column with any other text is left to the full parser.
    """
    try:
        import pyarrow as pa
        import pyarrow.compute as pc
    except ImportError:  # pragma: no cover - pyarrow is a dependency
        return None
    if column.dtype == object or not isinstance(getattr(column, "array", None),
                                                pd.api.extensions.ExtensionArray):
        return None
    try:
        arrow = pa.chunked_array(pa.array(column.array)) if not hasattr(
            column.array, "_pa_array") else column.array._pa_array
        arrow = pc.if_else(pc.equal(pc.utf8_trim_whitespace(arrow), ""), None, arrow)
        return pc.cast(arrow, pa.float64()).to_numpy(zero_copy_only=False).astype(float)
    except (pa.ArrowInvalid, pa.ArrowTypeError, pa.ArrowNotImplementedError, TypeError):
        return None


def _parse_text_number(cell, unit_words, unit: str, label: str) -> tuple[float, str]:
    if isinstance(cell, bool) or not isinstance(cell, (str, int, float)):
        return math.nan, f"{cell!r} is not a number in {label}"
    text = str(cell).strip()
    if text.startswith("="):
        return math.nan, (f"holds a formula ({text[:40]!r}); formulas are not evaluated: "
                          "enter the value itself")
    match = _CELL_NUMBER.match(text)
    if not match:
        return math.nan, f"{text!r} is not a number in {label}"
    number_text, unit_text = match.groups()
    if "," in number_text:
        if "." in number_text or number_text.count(",") > 1:
            return math.nan, f"{text!r} is not a number in {label}"
        number_text = number_text.replace(",", ".")
    number = float(number_text)
    if not math.isfinite(number):
        return math.nan, f"{text!r} is not a finite number"
    if unit_text:
        word = re.sub(r"[\s°º.]", "", unit_text.lower())
        if unit_words.get(word) != unit:
            return math.nan, (f"{text!r} is not a number in {label}, the unit of the "
                              "column header; give plain numbers in that unit")
    return number, ""


def same_text(n: int, text: str) -> np.ndarray:
    """An object array of `n` references to one string (np.full would copy it n times)."""
    out = np.empty(n, dtype=object)
    out.fill(text)
    return out


def blank_cells(column: pd.Series) -> np.ndarray:
    missing = column.isna().to_numpy()
    if not is_text_column(column):
        return missing
    return missing | (column.where(~missing, "").astype(str).str.strip() == "").to_numpy()
