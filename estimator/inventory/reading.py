"""Reading inventory files: CSV (encodings, byte-order marks, chunks) and Excel
workbooks, with size limits.
"""

from __future__ import annotations

import codecs
import csv
import math
import sys
from pathlib import Path

import numpy as np
import pandas as pd

from ..errors import InputError
from .columns import MAX_FILE_BYTES, MAX_ROWS, READ_CHUNK_ROWS, check_duplicate_headers

__all__ = [
    "read_inventory",
]


# ------------------------------------------------------------------- reading files

def _size_text(size: int) -> str:
    return f"{size / 1e6:.1f} MB" if size >= 100_000 else f"{size} bytes"


def _too_large(name: str, size: int, limit: int) -> InputError:
    return InputError("file", f"{name} is {_size_text(size)}, above the "
                      f"{_size_text(limit)} limit for one inventory file; split the "
                      "inventory into several files (on the command line, --max-size "
                      "raises the limit)")


def _default_file_limit() -> int:
    """`MAX_FILE_BYTES` as the package ``estimator.inventory`` holds it now (read at
    call time, so a program that changes ``estimator.inventory.MAX_FILE_BYTES``
    changes the limit)."""
    package = sys.modules.get(__package__)
    return int(getattr(package, "MAX_FILE_BYTES", MAX_FILE_BYTES))


def read_inventory(path, sheet: str | None = None, *,
                   max_bytes: int | None = None) -> pd.DataFrame:
    """Read an inventory table from a CSV file or an Excel workbook.

    Cells are read as they are stored: an Excel formula is kept as its text
    ("=B2*2"), never evaluated, so that the screening reports it. Row i of the
    table is line i + 2 of the file (the header is line 1), as a spreadsheet
    numbers its rows (a quoted CSV cell running over several physical lines counts
    as one); empty rows at the end are dropped, empty rows in between are kept (and
    reported by the screening). CSV files are parsed in chunks, so that the
    parser's memory stays small beside the table it builds.

    Parameters
    ----------
    path : str or os.PathLike
        A ``.csv`` file (comma-, semicolon- or tab-separated) in UTF-8, with or
        without a byte-order mark, or in UTF-16 or UTF-32 (recognised by their
        byte-order mark, or by the zero bytes of ASCII text without one); or an
        ``.xlsx``/``.xlsm`` workbook (needs openpyxl).
    sheet : str, optional
        Worksheet name; the first sheet by default.
    max_bytes : int, optional
        Largest file read; `MAX_FILE_BYTES` by default. [bytes]

    Returns
    -------
    pandas.DataFrame
        CSV cells as text; workbook cells as stored (numbers, text, formula text).

    Raises
    ------
    InputError
        Missing, empty or oversized file, a CSV in an encoding that is not UTF-8,
        UTF-16 or UTF-32, an unreadable workbook, a header without data rows.
    """
    limit = _default_file_limit() if max_bytes is None else int(max_bytes)
    path = Path(path)
    name = path.name
    if not path.is_file():
        raise InputError("file", f"{name}: no such file")
    size = path.stat().st_size
    if size > limit:
        raise _too_large(name, size, limit)
    if size == 0:
        raise InputError("file", f"{name} is empty: it needs a header line with the column "
                         "names (at least container, liquid and a temperature) and one row "
                         "per container")
    suffix = path.suffix.lower()
    if suffix in (".csv", ".txt", ".tsv"):
        frame = _read_csv(path)
    elif suffix in (".xlsx", ".xlsm"):
        frame = _read_workbook(path, sheet)
    elif suffix == ".xls":
        raise InputError("file", f"{name} is an old-style .xls workbook; save it as .xlsx "
                         "or as CSV UTF-8")
    else:
        raise InputError("file", f"{name}: {suffix or 'no extension'} is not a table ullage "
                         "reads; give a .csv file or an .xlsx workbook")
    if frame.shape[1] == 0:
        raise InputError("file", f"{name} has no column names in its first line")
    if len(frame) == 0:
        raise InputError("file", f"{name} has a header line but no data rows")
    return frame


#: Byte-order marks and the codec that reads the text after them (UTF-32 first:
#: its little-endian mark begins with that of UTF-16).
_BYTE_ORDER_MARKS = (
    (codecs.BOM_UTF32_LE, "utf-32-le", "UTF-32"), (codecs.BOM_UTF32_BE, "utf-32-be", "UTF-32"),
    (codecs.BOM_UTF8, "utf-8", "UTF-8"),
    (codecs.BOM_UTF16_LE, "utf-16-le", "UTF-16"), (codecs.BOM_UTF16_BE, "utf-16-be", "UTF-16"),
)


def _encoding_of(start: bytes) -> tuple[str, int, str]:
    """(codec, bytes to skip, name) of a CSV file from its first bytes."""
    for mark, codec, label in _BYTE_ORDER_MARKS:
        if start.startswith(mark):
            return codec, len(mark), label
    # No mark: ASCII text in UTF-16/32 shows its zero bytes in a fixed pattern.
    sample = start[:4096]
    usable = len(sample) - len(sample) % 4
    if usable >= 4 and b"\x00" in sample[:usable]:
        quads = [sample[i:i + 4] for i in range(0, usable, 4)]
        if all(q[1:] == b"\x00\x00\x00" for q in quads):
            return "utf-32-le", 0, "UTF-32"
        if all(q[:3] == b"\x00\x00\x00" for q in quads):
            return "utf-32-be", 0, "UTF-32"
        if all(q[1] == 0 and q[3] == 0 for q in quads):
            return "utf-16-le", 0, "UTF-16"
        if all(q[0] == 0 and q[2] == 0 for q in quads):
            return "utf-16-be", 0, "UTF-16"
    return "utf-8", 0, "UTF-8"


def _check_decodes(path: Path, codec: str, skip: int, label: str) -> str:
    """Decode the whole file block by block, keeping nothing; return the first line.

    A byte that does not decode is reported with its line.
    """
    decoder = codecs.getincrementaldecoder(codec)("strict")
    newline = "\n".encode(codec)
    lines_before = 0
    first = ""
    with open(path, "rb") as handle:
        handle.seek(skip)
        tail = b""
        while True:
            block = handle.read(1 << 22)
            try:
                text = decoder.decode(block, final=not block)
            except UnicodeDecodeError as exc:
                data = tail + block
                bad = len(tail) + exc.start
                line = lines_before + data[:bad].count(newline) + 1
                if label == "UTF-8" and b"\x00" in data[:4096] + tail:
                    advice = ("It holds zero bytes, as UTF-16 or UTF-32 text without a "
                              "byte-order mark does")
                elif label == "UTF-8":
                    advice = ("The file is probably saved in a legacy encoding such as "
                              "Latin-1 or Windows-1252")
                else:
                    advice = (f"The file starts as {label} text but is not valid {label} "
                              "there")
                raise InputError(
                    "file", f"{path.name} is not {label} text: byte "
                    f"0x{data[bad:bad + 1].hex()} on line {line} is not valid {label}. "
                    f"{advice}; save it again as 'CSV UTF-8' (in Excel: Save As, CSV UTF-8) "
                    "and screen it again") from None
            if "\n" not in first and len(first) < (1 << 24):
                first += text
            if not block:
                break
            tail = decoder.getstate()[0]
            lines_before += text.count("\n")
    return first.split("\n", 1)[0]


def _has_text(path: Path, codec: str, skip: int) -> bool:
    with open(path, encoding=codec, newline="") as handle:
        handle.seek(skip)
        return any(line.strip() for line in handle)


def _read_csv(path: Path) -> pd.DataFrame:
    with open(path, "rb") as handle:
        start = handle.read(4096)
    codec, skip, label = _encoding_of(start)
    head = _check_decodes(path, codec, skip, label)
    if not head.strip() and not _has_text(path, codec, skip):
        raise InputError("file", f"{path.name} holds only blank lines: it needs a header "
                         "line and one row per container")
    first = head.rstrip("\r")
    separator = max((",", ";", "\t"), key=first.count)
    header = next(csv.reader([first], delimiter=separator))
    check_duplicate_headers(header)
    try:
        with open(path, "rb") as handle:
            handle.seek(skip)
            reader = pd.read_csv(handle, sep=separator, dtype=str, keep_default_na=False,
                                 skip_blank_lines=False, encoding=codec,
                                 chunksize=READ_CHUNK_ROWS)
            chunks = list(reader)
    except pd.errors.EmptyDataError:
        raise InputError("file", f"{path.name} has no column names in its first line") from None
    except pd.errors.ParserError as exc:
        raise InputError("file", f"{path.name} cannot be read as CSV: {exc}; check that "
                         "every row has as many fields as the header") from None
    frame = chunks[0] if len(chunks) == 1 else pd.concat(chunks, ignore_index=True)
    del chunks
    return _drop_trailing_blank_rows(frame)


def _is_blank(value) -> bool:
    if value is None:
        return True
    if isinstance(value, float):
        return math.isnan(value)
    if isinstance(value, str):
        return not value.strip()
    return False


def _drop_trailing_blank_rows(frame: pd.DataFrame) -> pd.DataFrame:
    if len(frame) == 0:
        return frame
    if not all(_is_blank(v) for v in frame.iloc[-1].tolist()):
        return frame
    blank = frame.isna() | frame.apply(lambda col: col.astype(str).str.strip() == "")
    filled = np.flatnonzero(~blank.all(axis=1).to_numpy())
    last = filled[-1] + 1 if filled.size else 0
    return frame.iloc[:last].reset_index(drop=True)


def _read_workbook(path: Path, sheet: str | None) -> pd.DataFrame:
    try:
        import openpyxl
        from openpyxl.utils import get_column_letter
    except ImportError:
        raise InputError("file", "reading Excel workbooks needs openpyxl (pip install "
                         "'ullage[excel]'); or save the sheet as CSV UTF-8") from None
    try:
        book = openpyxl.load_workbook(path, read_only=True, data_only=False)
    except Exception as exc:  # openpyxl raises zipfile, KeyError and its own errors
        raise InputError("file", f"{path.name} cannot be opened as an Excel workbook "
                         f"({type(exc).__name__}: {exc})") from None
    try:
        if sheet is None:
            ws = book.worksheets[0]
        elif sheet in book.sheetnames:
            ws = book[sheet]
        else:
            raise InputError("sheet", f"{path.name} has no sheet {sheet!r}; it has "
                             f"{', '.join(repr(s) for s in book.sheetnames)}")
        rows = []
        for index, row in enumerate(ws.iter_rows()):
            if index > MAX_ROWS:
                raise InputError("file", f"{path.name} has more than {MAX_ROWS} rows; "
                                 "split the inventory into several files")
            rows.append([_cell_value(cell) for cell in row])
    finally:
        book.close()
    if not rows or all(_is_blank(v) for v in rows[0]):
        raise InputError("file", f"row 1 of sheet {ws.title!r} in {path.name} is empty; "
                         "put the column names in row 1")
    width = max(len(r) for r in rows)
    while width and all(len(r) < width or _is_blank(r[width - 1]) for r in rows):
        width -= 1
    header = []
    for i in range(width):
        value = rows[0][i] if i < len(rows[0]) else None
        header.append(f"column {get_column_letter(i + 1)}" if _is_blank(value)
                      else str(value).strip())
    check_duplicate_headers(header)
    body = [list(r[:width]) + [None] * (width - len(r[:width])) for r in rows[1:]]
    frame = pd.DataFrame(body, columns=header, dtype=object)
    return _drop_trailing_blank_rows(frame)


def _cell_value(cell):
    value = cell.value
    if getattr(cell, "data_type", None) == "f" and not isinstance(value, str):
        text = getattr(value, "text", None)
        value = text if isinstance(text, str) else "=(formula)"
        if not value.startswith("="):
            value = "=" + value
    return value
