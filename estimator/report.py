"""Reports and exports of a scenario run: Markdown, self-contained HTML, JSON and CSV."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

__all__ = ["write_text_atomic", "neutralise_cell"]

_FORMULA_START = ("=", "+", "-", "@", "\t", "\r")


def write_text_atomic(path, text: str) -> None:
    """Write text to a file so that an interruption never leaves half a file.

    The text goes to a temporary file in the same folder, which then replaces the
    target in one step (os.replace).
    """
    target = Path(path)
    folder = target.parent if str(target.parent) else Path(".")
    fd, temporary = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".part", dir=folder)
    try:
        with os.fdopen(fd, "w", encoding="utf-8", newline="") as handle:
            handle.write(text)
        os.replace(temporary, target)
    except BaseException:
        try:
            os.unlink(temporary)
        except OSError:
            pass
        raise


def neutralise_cell(value):
    """Make a text cell inert in spreadsheets (formula injection): prefix a quote.

    Text beginning with =, +, -, @, a tab or a carriage return would be run as a
    formula by spreadsheet programs (OWASP, CSV injection). Numbers are left alone.
    """
    if isinstance(value, str) and value.startswith(_FORMULA_START):
        return "'" + value
    return value
