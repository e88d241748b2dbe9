"""Writing a report file in the format its name asks for, atomically."""

from __future__ import annotations

from pathlib import Path

from ..errors import InputError
from ..files import write_text_atomic
from .common import REPORT_FORMATS
from .csv_export import results_csv
from .html_page import html_report
from .json_export import results_json
from .markdown import markdown_report

# ---------------------------------------------------------------------------
# files

def write_report(result, path, format: str | None = None, *, generated_at=None) -> Path:
    """Write a report or export, chosen by file ending or by `format`.

    Parameters
    ----------
    result : ScenarioResult
    path : path
        File to write; it is replaced in one step (`write_text_atomic`).
    format : str, optional
        "markdown", "html", "json" or "csv"; by default from the ending (.md,
        .html, .json, .csv). Markdown plots go to ``<stem>_plots/`` beside the file.
    generated_at : datetime or str, optional
        Time stamp; now (UTC) by default.

    Returns
    -------
    pathlib.Path
        The file written.

    Raises
    ------
    InputError
        Field "format", for a format or file ending that is not one of the above.
    """
    target = Path(path)
    allowed = ", ".join(REPORT_FORMATS)
    endings = ", ".join(e for ends in REPORT_FORMATS.values() for e in ends)
    if format is None:
        suffix = target.suffix.lower()
        chosen = next((name for name, ends in REPORT_FORMATS.items() if suffix in ends), None)
        if chosen is None:
            raise InputError("format", f"cannot tell the format from the file ending "
                              f"{target.suffix or '(none)'!r}; give format as one of "
                              f"{allowed}, or a file ending in {endings}")
    else:
        chosen = str(format).strip().lower()
        chosen = {"md": "markdown", "htm": "html"}.get(chosen, chosen)
        if chosen not in REPORT_FORMATS:
            raise InputError("format", f"{format!r} is not a report format; use one of "
                              f"{allowed}")
    if chosen == "markdown":
        text = markdown_report(result, target.parent / f"{target.stem}_plots",
                               generated_at=generated_at)
    elif chosen == "html":
        text = html_report(result, generated_at=generated_at)
    elif chosen == "json":
        text = results_json(result, generated_at=generated_at)
    else:
        text = results_csv(result, generated_at=generated_at)
    write_text_atomic(target, text)
    return target
