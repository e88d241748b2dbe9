"""Writing the screened inventory as CSV through Arrow in batches, atomically, with
cells that look like formulas neutralised (`write_inventory_csv`).
"""

from __future__ import annotations

import codecs
import csv
import io
import math
from pathlib import Path

import pandas as pd

from .._meta import CAUTIONS
from ..errors import InputError
from ..files import atomic_writer, neutralise_arrow, neutralise_cell
from .cells import is_text_column
from .summary import InventoryScreening

__all__ = [
    "write_inventory_csv",
]


# ------------------------------------------------------------------------- writing

#: Rows converted and written per batch (bounds the memory the writer needs).
_WRITE_BATCH = 100_000


def _arrow_column(column: pd.Series):
    """One column as an Arrow array for the CSV writer, text cells neutralised.

    Floats keep every digit (NaN is written as an empty cell); text and mixed
    columns are written as text, as pandas would print each cell.
    """
    import pyarrow as pa

    if pd.api.types.is_bool_dtype(column.dtype):
        return pa.array(column.astype(str).to_numpy(dtype=object), type=pa.string())
    if pd.api.types.is_numeric_dtype(column.dtype):
        return pa.Array.from_pandas(column)
    if column.dtype == object:
        try:
            array = pa.array(column.to_numpy(), type=pa.string(), from_pandas=True)
        except (pa.ArrowInvalid, pa.ArrowTypeError):
            array = pa.array(column.map(lambda v: None if _is_blank_value(v) else str(v))
                             .to_numpy(), type=pa.string(), from_pandas=True)
    elif is_text_column(column):
        array = pa.array(column.array)
        if not pa.types.is_string(array.type) and not pa.types.is_large_string(array.type):
            array = array.cast(pa.string())
    else:
        array = pa.array(column.astype(str).where(column.notna(), None).to_numpy(),
                         type=pa.string(), from_pandas=True)
    return neutralise_arrow(array)


def _is_blank_value(value) -> bool:
    return value is None or (isinstance(value, float) and math.isnan(value))


def write_inventory_csv(result, path, *, cautions: bool = True) -> Path:
    """Write a screening table to CSV, safe to open in a spreadsheet.

    Text cells (and headers) beginning with =, +, -, @, a tab or a carriage return
    are prefixed with a single quote so that a spreadsheet shows them as text
    instead of running them as formulas; numbers, and text that is a plain number
    such as "-5", are left alone (`estimator.files.neutralise_arrow`). Text cells
    and headers are always quoted. The cautions come first, each on a line of its
    own beginning with "# ", so that ``pandas.read_csv(path, comment="#")`` (or any
    CSV reader told to skip comment lines) reads the table back, the header being
    the first line that is not a comment. UTF-8 with a byte-order mark, which
    spreadsheet programs recognise, and CRLF line ends (RFC 4180).

    The file is written in batches to a temporary file beside the target, which
    then replaces it (`estimator.files.atomic_writer`): a reader never sees half a
    file, and no temporary file is left behind, whatever stops the write.

    Parameters
    ----------
    result : InventoryScreening or pandas.DataFrame
        A screening result, or its table.
    path : str or os.PathLike
        Where to write.
    cautions : bool
        Write `estimator.CAUTIONS` first, one per line, each starting with "# ".

    Returns
    -------
    pathlib.Path
        The path written.
    """
    import pyarrow as pa
    import pyarrow.csv as pa_csv

    frame = result.table if isinstance(result, InventoryScreening) else result
    if not isinstance(frame, pd.DataFrame):
        raise InputError("result", "give a screening result or its table")
    target = Path(path)
    directory = target.parent if str(target.parent) else Path(".")
    if not directory.is_dir():
        raise InputError("path", f"the folder for {target.name} does not exist")
    names = [neutralise_cell(str(c)) for c in frame.columns]
    options = pa_csv.WriteOptions(include_header=False, eol="\r\n", quoting_style="needed",
                                  batch_size=8192)
    with atomic_writer(target, binary=True, field="path") as handle:
        handle.write(codecs.BOM_UTF8)
        if cautions:
            for caution in CAUTIONS:
                handle.write(("# " + " ".join(caution.split()) + "\r\n").encode("utf-8"))
        header = io.StringIO()
        csv.writer(header, lineterminator="\r\n", quoting=csv.QUOTE_ALL).writerow(names)
        handle.write(header.getvalue().encode("utf-8"))
        for start in range(0, len(frame), _WRITE_BATCH):
            part = frame.iloc[start:start + _WRITE_BATCH]
            arrays = [_arrow_column(part.iloc[:, k]) for k in range(part.shape[1])]
            table = pa.Table.from_arrays(arrays, names=[f"c{k}" for k in range(len(arrays))])
            pa_csv.write_csv(table, handle, options)
    return target
