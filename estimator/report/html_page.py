"""Self-contained HTML report (inline SVG plots), written from the document blocks."""

from __future__ import annotations

import html

from .blocks import Bullets, Cautions, Heading, Para, Plot, Table, document_blocks
from .common import NOT_XML, timestamp

# ---------------------------------------------------------------------------
# HTML

_CSS = """
:root { --ink: #1c1c1c; --muted: #595959; --rule: #c8c8c4; --band: #f2f2ee;
        --caution: #7a4300; --caution-bg: #fff6e3; }
* { box-sizing: border-box; }
body { font: 15px/1.5 system-ui, -apple-system, "Segoe UI", Helvetica, Arial, sans-serif;
       color: var(--ink); max-width: 64rem; margin: 2rem auto; padding: 0 1.25rem; }
h1 { font-size: 1.65rem; margin: 0 0 .6rem; }
h2 { font-size: 1.25rem; margin: 2.2rem 0 .6rem; padding-bottom: .2rem;
     border-bottom: 2px solid var(--rule); }
h3 { font-size: 1.05rem; margin: 1.6rem 0 .4rem; }
h4 { font-size: .95rem; margin: 1.2rem 0 .3rem; }
p, ul { margin: .4rem 0 .8rem; }
table { border-collapse: collapse; margin: .5rem 0 1.1rem; font-size: .88rem; }
th, td { border: 1px solid var(--rule); padding: .25rem .55rem; text-align: left;
         vertical-align: top; }
th { background: var(--band); font-weight: 600; }
td.num { text-align: right; white-space: nowrap; font-variant-numeric: tabular-nums; }
table.meta th { width: 13rem; }
.cautions { border: 2px solid var(--caution); background: var(--caution-bg);
            padding: .7rem 1.1rem; margin: 1.2rem 0; }
.cautions h2 { border: 0; margin: 0 0 .3rem; padding: 0; color: var(--caution);
               font-size: 1.1rem; }
.cautions li { font-weight: 600; }
nav { font-size: .9rem; color: var(--muted); }
nav ol { margin: .3rem 0; padding-left: 1.4rem; columns: 2; }
figure { margin: 1rem 0 1.4rem; break-inside: avoid; page-break-inside: avoid; }
figcaption { font-size: .85rem; color: var(--muted); max-width: 45rem; }
svg { max-width: 100%; height: auto; }
footer { margin-top: 2rem; font-size: .85rem; color: var(--muted); }
@page { margin: 15mm; }
@media print {
  body { margin: 0; max-width: none; font-size: 10.5pt; }
  nav { display: none; }
  h2, h3, h4 { break-after: avoid; page-break-after: avoid; }
  table, figure, .cautions { break-inside: avoid; page-break-inside: avoid; }
  a { color: inherit; text-decoration: none; }
}
"""


def _h(text) -> str:
    return html.escape(NOT_XML.sub("", str(text)), quote=True)


def html_report(result, *, generated_at=None) -> str:
    """A self-contained HTML5 report: inline CSS and SVG plots, no scripts or links out.

    Parameters
    ----------
    result : ScenarioResult
    generated_at : datetime or str, optional
        Time stamp shown as the report time; now (UTC) by default.

    Returns
    -------
    str
    """
    generated = timestamp(generated_at)
    blocks, _ = document_blocks(result, generated)
    title = _h(result.scenario.title)
    body = [f"<header><h1>{title}</h1>"]
    sections = [(i, blk.text) for i, blk in enumerate(blocks)
                if isinstance(blk, Heading) and blk.level == 2]
    anchors = {i: f"section-{k + 1}" for k, (i, _) in enumerate(sections)}
    first_table = True
    figure = 0
    for i, block in enumerate(blocks):
        if isinstance(block, Heading):
            anchor = f' id="{anchors[i]}"' if i in anchors else ""
            body.append(f"<h{block.level}{anchor}>{_h(block.text)}</h{block.level}>")
        elif isinstance(block, Para):
            body.append(f"<p>{_h(block.text)}</p>")
        elif isinstance(block, Bullets):
            body.append("<ul>" + "".join(f"<li>{_h(x)}</li>" for x in block.items) + "</ul>")
        elif isinstance(block, Table):
            if first_table:
                body.append('<table class="meta">' + "".join(
                    f"<tr><th scope=\"row\">{_h(k)}</th><td>{_h(v)}</td></tr>"
                    for k, v in block.rows) + "</table></header>")
                first_table = False
                continue
            head = "".join(f'<th scope="col">{_h(x)}</th>' for x in block.headers)
            rows = "".join(
                "<tr>" + "".join(f'<td class="num">{_h(c)}</td>' if j in block.numeric
                                 else f"<td>{_h(c)}</td>" for j, c in enumerate(row)) + "</tr>"
                for row in block.rows)
            body.append(f"<table><thead><tr>{head}</tr></thead><tbody>{rows}</tbody></table>")
        elif isinstance(block, Cautions):
            body.append('<section class="cautions" aria-label="cautions">'
                        f"<h2>{_h(block.title)}</h2><ul>"
                        + "".join(f"<li>{_h(x)}</li>" for x in block.items) + "</ul></section>")
            if i == 1 and sections:
                body.append("<nav><strong>Contents</strong><ol>" + "".join(
                    f'<li><a href="#{anchors[j]}">{_h(text)}</a></li>' for j, text in sections)
                    + "</ol></nav>")
        elif isinstance(block, Plot):
            figure += 1
            body.append(f"<figure>{block.svg}<figcaption>Figure {figure}. {_h(block.caption)}"
                        "</figcaption></figure>")
    body.append(f"<footer>ullage {_h(result.version)}, "
                f"{generated.strftime('%Y-%m-%d %H:%M:%S UTC')}. A screening estimate; "
                "see the cautions.</footer>")
    return ("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
            "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
            f"<meta name=\"generator\" content=\"ullage {_h(result.version)}\">\n"
            f"<title>{title}</title>\n<style>{_CSS}</style>\n</head>\n<body>\n"
            + "\n".join(body) + "\n</body>\n</html>\n")
