"""Reports and exports of a scenario run: Markdown, self-contained HTML, JSON and CSV.

Markdown and HTML carry the same content, built once as a list of blocks: the
cautions first, the inputs as written, the methods used and why, the
assumptions, result tables and plots, comparisons with every limit and its
source, findings, warnings, what could not be computed, and the cautions again.
JSON holds every number in SI units (and ppm where relevant) with the inputs
document; CSV is a tidy long table with the cautions as its last rows.

The package holds one idea per module: `common` (number formatting, lookups in a
result, the constants), `blocks` (the document blocks for tanks, spills, Monte
Carlo runs and their plots), `markdown`, `html_page`, `json_export`
(`result_to_dict`, `results_json`), `csv_export` (`results_csv`) and `writer`
(`write_report`). Every public name is importable from `estimator.report`.
"""

from __future__ import annotations

import os  # noqa: F401  (the atomic writer uses it through estimator.files)

from ..files import neutralise_cell, write_text_atomic
from .blocks import monte_carlo_curves
from .blocks import spill_plots as _spill_plots  # noqa: F401
from .common import CSV_COLUMNS, MAX_SERIES_POINTS, REPORT_FORMATS
from .common import file_slug as _slug  # noqa: F401
from .csv_export import results_csv
from .html_page import html_report
from .json_export import result_to_dict, results_json
from .markdown import markdown_report
from .markdown import md_escape as _md  # noqa: F401
from .writer import write_report

__all__ = [
    "write_text_atomic",
    "neutralise_cell",
    "markdown_report",
    "html_report",
    "result_to_dict",
    "results_json",
    "results_csv",
    "write_report",
    "REPORT_FORMATS",
    "CSV_COLUMNS",
    "MAX_SERIES_POINTS",
    "monte_carlo_curves",
]
