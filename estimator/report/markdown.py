"""Markdown report, written from the document blocks."""

from __future__ import annotations

import re
from pathlib import Path

from ..files import write_text_atomic
from .blocks import Bullets, Cautions, Heading, Para, Plot, Table, document_blocks
from .common import NOT_XML, timestamp

# ---------------------------------------------------------------------------
# Markdown

_MD_SPECIAL = re.compile(r"([\\`*\[\]<>|#~]|(?<![A-Za-z0-9])_|_(?![A-Za-z0-9]))")


def md_escape(text) -> str:
    """User text made inert in Markdown: punctuation that starts markup is escaped."""
    clean = NOT_XML.sub("", str(text)).replace("\r", " ").replace("\n", " ")
    return _MD_SPECIAL.sub(lambda m: "\\" + m.group(0), clean)


def _md_table(table: Table) -> list[str]:
    headers = [md_escape(h) or " " for h in table.headers]
    align = ["---:" if i in table.numeric else "---" for i in range(len(headers))]
    out = ["| " + " | ".join(headers) + " |", "| " + " | ".join(align) + " |"]
    for row in table.rows:
        out.append("| " + " | ".join(md_escape(c) for c in row) + " |")
    return out + [""]


def markdown_report(result, plot_dir=None, *, generated_at=None) -> str:
    """A Markdown report of a scenario run, for a hazard-review record.

    Parameters
    ----------
    result : ScenarioResult
        From `estimator.screening.run_scenario`.
    plot_dir : path, optional
        Folder to write the SVG plots to (created if missing). Links to them are
        relative to the folder that holds `plot_dir`, where the Markdown file is
        meant to sit (as `write_report` does). Without it no plot is written and
        the report says the HTML report carries them.
    generated_at : datetime or str, optional
        Time stamp shown as the report time; now (UTC) by default.

    Returns
    -------
    str
    """
    generated = timestamp(generated_at)
    blocks, has_plots = document_blocks(result, generated)
    folder = Path(plot_dir) if plot_dir is not None else None
    if folder is not None:
        folder.mkdir(parents=True, exist_ok=True)
    out = [f"# {md_escape(result.scenario.title)}", ""]
    for block in blocks:
        if isinstance(block, Heading):
            out += ["#" * block.level + " " + md_escape(block.text), ""]
        elif isinstance(block, Para):
            out += [md_escape(block.text), ""]
        elif isinstance(block, Bullets):
            out += [f"- {md_escape(item)}" for item in block.items] + [""]
        elif isinstance(block, Table):
            out += _md_table(block)
        elif isinstance(block, Cautions):
            out += [f"> **{md_escape(block.title)}**", ">"]
            out += [f"> - **{md_escape(item)}**" for item in block.items] + [""]
            if block is blocks[1] and has_plots and folder is None:
                out += ["Plots are not included in this Markdown report; the HTML report "
                        "carries them inline.", ""]
        elif isinstance(block, Plot):
            if folder is None:
                continue
            file = f"{block.name}.svg"
            write_text_atomic(folder / file, block.svg)
            out += [f"![{md_escape(block.caption)}]({folder.name}/{file})", "",
                    f"*{md_escape(block.caption)}*", ""]
    return "\n".join(out).rstrip() + "\n"
