"""Reports and exports: content, escaping, self-containment, strict JSON, safe CSV, files."""

import csv
import dataclasses
import html
import io
import json
import math
import os
import re
import xml.etree.ElementTree as ET
from pathlib import Path

import numpy as np
import pytest

from estimator import CAUTIONS
from estimator.errors import InputError
from estimator.limits import format_ppm
from estimator.plots import (
    MAX_PLOT_POINTS,
    cumulative_plot_svg,
    cumulative_points,
    line_plot_svg,
    log_ticks,
    nice_ticks,
    tick_label,
)
from estimator import report
from estimator.report import (
    CSV_COLUMNS,
    MAX_SERIES_POINTS,
    html_report,
    markdown_report,
    result_to_dict,
    results_csv,
    results_json,
    write_report,
)
from estimator.scenario import loads_scenario
from estimator.screening import run_scenario

SCENARIOS = Path(__file__).resolve().parent.parent / "scenarios"
STAMP = "2026-03-01T12:00:00Z"

# A scenario written to try to break the outputs: markup and a spreadsheet formula
# in the title, in names and in the limit sources, and a user substance whose
# source starts with "@".
HOSTILE_TITLE = "=SUM(1) <script>alert('x')</script> & Sons"
HOSTILE_TANK = "T-3 <b>&</b>"
EXTRA = """
[[substance]]
name = "Solvent Q"
molar_mass = "100 g/mol"
boiling_point = "120 degC"
vapor_pressure = [["20 degC", "2 kPa"]]
lower_flammability_limit = "1.1 %"
source = "@SDS rev 3"

[[liquid]]
name = "q"
substance = "Solvent Q"

[[tank]]
name = "Q-1"
liquid = "q"
temperature = "25 degC"
"""


def _hostile_text() -> str:
    text = (SCENARIOS / "coatings-day-tank.toml").read_text(encoding="utf-8")
    text = text.replace('title = "Thinner day tank T-3 on a hot afternoon"',
                        f'title = "{HOSTILE_TITLE}"')
    text = text.replace('name = "T-3"', f'name = "{HOSTILE_TANK}"')
    text = text.replace('item = "T-3"', f'item = "{HOSTILE_TANK}"')
    sources = iter(['=HYPERLINK(\\"http://x\\") site rule 1', "company value 2 & <b>bold</b>",
                    "+national list 3", "-regional code 4"])
    while 'source = "illustrative value for this demo"' in text:
        text = text.replace('source = "illustrative value for this demo"',
                            f'source = "{next(sources)}"', 1)
    return text + EXTRA


@pytest.fixture(scope="module")
def demos(demo_results):
    """The demo results of tests/conftest.py (run once per session)."""
    return demo_results


@pytest.fixture(scope="module")
def hostile():
    return run_scenario(loads_scenario(_hostile_text()))


def _all(demos, hostile):
    return list(demos.values()) + [hostile]


def _csv_rows(text):
    return list(csv.reader(io.StringIO(text)))


def _csv_dicts(text):
    rows = _csv_rows(text)
    return [dict(zip(rows[0], r)) for r in rows[1:]]


def _inline_svgs(page: str) -> list[str]:
    return re.findall(r"<svg\b.*?</svg>", page, flags=re.S)


def _md_text(text: str) -> str:
    """How the Markdown report writes user text (its own escaping)."""
    return report._md(text)


# --------------------------------------------------------------------------- content

def test_every_format_carries_cautions_title_and_limit_sources(demos, hostile):
    """Markdown, HTML, JSON and CSV each hold the cautions, the title and every limit's source."""
    for result in _all(demos, hostile):
        md = markdown_report(result, generated_at=STAMP)
        page = html_report(result, generated_at=STAMP)
        data = json.loads(results_json(result, generated_at=STAMP))
        rows = _csv_dicts(results_csv(result, generated_at=STAMP))
        csv_notes = [r["note"] for r in rows]
        csv_sources = {r["limit_source"] for r in rows}
        title = result.scenario.title
        assert _md_text(title) in md
        assert html.escape(title) in page
        assert data["title"] == title
        assert report.neutralise_cell(title) in csv_notes
        for caution in CAUTIONS:
            assert md.count(_md_text(caution)) >= 2  # at the top and at the end
            assert page.count(html.escape(caution)) >= 2
            assert caution in data["cautions"]
            assert caution in csv_notes
        for lim in result.scenario.limits:
            assert _md_text(lim.source) in md
            assert html.escape(lim.source) in page
            assert lim.source in {x["source"] for x in data["limits"]}
            assert report.neutralise_cell(lim.source) in csv_sources


def test_cautions_come_first_in_markdown_and_html(demos):
    """The cautions stand before the inputs and results, not only at the end."""
    result = demos["coatings-day-tank"]
    md = markdown_report(result, generated_at=STAMP)
    page = html_report(result, generated_at=STAMP)
    assert md.index(CAUTIONS[0]) < md.index("## Inputs as written") < md.index("## Results")
    assert page.index('class="cautions"') < page.index("Inputs as written")
    assert md.rstrip().endswith(CAUTIONS[-1] + "**")


def test_reports_show_run_time_site_and_version(demos):
    """The header carries the site, the report time stamp and the ullage version."""
    result = demos["warehouse-drum-spill"]
    for text in (markdown_report(result, generated_at=STAMP),
                 html_report(result, generated_at=STAMP)):
        assert "2026-03-01 12:00:00 UTC" in text
        assert result.version in text
        assert "Kestrel Fold distribution warehouse (invented site)" in text


def test_inputs_appear_as_written(demos):
    """Quantities are shown with the units the scenario was written in."""
    result = demos["coatings-day-tank"]
    md = markdown_report(result, generated_at=STAMP)
    page = html_report(result, generated_at=STAMP)
    for written in ("2500 gal", "400 ft3/min", "46 degC", "45 %", "210 m"):
        assert written in md and written in page
    rows = _csv_dicts(results_csv(result, generated_at=STAMP))
    assert {"quantity": "volume", "note": "2500 gal"}.items() <= next(
        r for r in rows if r["kind"] == "input" and r["quantity"] == "volume").items()


def test_methods_state_vapour_pressure_method_uncertainty_and_source(demos):
    """Each component's vapour-pressure method is named with its stated uncertainty and source."""
    result = demos["coatings-day-tank"]
    md = markdown_report(result, generated_at=STAMP)
    page = html_report(result, generated_at=STAMP)
    for est in result.tanks[0].headspace.vapor_pressure_methods:
        unc = f"±{100 * est.relative_uncertainty:.2g} %"
        for text, esc in ((md, _md_text), (page, html.escape)):
            assert esc(est.description) in text
            assert esc(est.source) in text
            assert unc in text


def test_tank_numbers_match_the_result_objects(demos):
    """Headspace ppm, mg/m3, %LFL, oxygen and ratios shown are the result's numbers."""
    for name in ("coatings-day-tank", "sump-dissolved-solvent"):
        result = demos[name]
        md = markdown_report(result, generated_at=STAMP)
        page = html_report(result, generated_at=STAMP)
        for tank in result.tanks:
            for hs, comparisons in ((tank.headspace, tank.comparisons),
                                    (tank.worst, tank.worst_comparisons)):
                expected = [format_ppm(hs.total_ppm), f"{float(hs.percent_lfl):.3g}",
                            f"{float(hs.oxygen_percent):.3g}"]
                expected += [format_ppm(v) for v in np.asarray(hs.ppm)]
                expected += [format_ppm(v) for v in np.asarray(hs.mg_per_m3)]
                expected += [format_ppm(c.ratio) for c in comparisons]
                for text in expected:
                    assert f"| {text} |" in md, text
                    assert f'<td class="num">{text}</td>' in page, text


def test_spill_numbers_match_the_result_objects(demos):
    """Peak, 8-h TWA, 15-min average, ratios and distances shown are the result's numbers."""
    result = demos["warehouse-drum-spill"]
    md = markdown_report(result, generated_at=STAMP)
    page = html_report(result, generated_at=STAMP)
    expected = []
    for spill in result.spills:
        for e in spill.exposures:
            expected += [format_ppm(e.peak), format_ppm(e.twa), format_ppm(e.short_term)]
            expected += [format_ppm(ratio) for _, _, ratio, _, _ in e.comparisons]
        for _, d, _ in spill.distances:
            expected.append(f"{d:,.0f} m")
        if spill.outdoor is not None:
            expected += [format_ppm(v) for v in np.ravel(spill.outdoor.volume_fraction) * 1e6]
    assert expected
    for text in expected:
        assert f"| {text}" in md, text
        assert f'<td class="num">{text}' in page, text


def test_items_not_computed_are_reported(demos):
    """Entries of result.errors appear, escaped, in every format."""
    result = dataclasses.replace(demos["coatings-day-tank"],
                                 errors=(("tank X-9", "no <data> for it & so on"),))
    assert _md_text("no <data> for it & so on") in markdown_report(result, generated_at=STAMP)
    assert "no &lt;data&gt; for it &amp; so on" in html_report(result, generated_at=STAMP)
    assert result_to_dict(result)["errors"] == [{"item": "tank X-9",
                                                 "message": "no <data> for it & so on"}]
    rows = _csv_dicts(results_csv(result))
    assert any(r["kind"] == "error" and r["item"] == "tank X-9" for r in rows)


def test_probabilistic_summaries_are_reported(demos):
    """A Monte Carlo run's sample count, seed and exceedance probabilities appear in each format."""
    found = [(r, item.monte_carlo) for r in demos.values() for item in r.tanks + r.spills
             if getattr(item, "monte_carlo", None) is not None]
    if not found:
        pytest.skip("no demo scenario has uncertain inputs")
    for result, mc in found:
        md = markdown_report(result, generated_at=STAMP)
        page = html_report(result, generated_at=STAMP)
        data = results_json(result, generated_at=STAMP)
        rows = _csv_dicts(results_csv(result, generated_at=STAMP))
        for text in (md, page):
            assert f"{mc.n:,} samples (seed {mc.seed}" in text
            for p in dict(mc.exceedance).values():
                assert f"{100 * p:.3g} %" in text
        assert f'"seed": {mc.seed}' in data
        assert any(r["kind"] == "probabilistic" and r["quantity"] == "probability of exceeding"
                   and float(r["value"]) == p for p in dict(mc.exceedance).values()
                   for r in rows)


def _probabilistic(demos):
    """(result, item kind, index, item, MonteCarloResult) for every demo item with a run."""
    out = []
    for result in demos.values():
        for kind, items in (("tank", result.tanks), ("spill", result.spills)):
            for i, item in enumerate(items):
                if getattr(item, "monte_carlo", None) is not None:
                    out.append((result, kind, i, item, item.monte_carlo))
    return out


def test_demos_with_uncertain_inputs_have_probabilistic_runs(demos):
    """The day-tank and drum-spill demos give uncertain inputs, so both carry a Monte Carlo run."""
    kinds = {(kind, item.name) for _, kind, _, item, _ in _probabilistic(demos)}
    assert ("tank", "T-3") in kinds and ("spill", "punctured drum") in kinds


def test_probabilistic_cumulative_plot_in_html_and_markdown(demos, tmp_path):
    """Each probabilistic item has a cumulative plot, inline in HTML and as an SVG file."""
    ns = "{http://www.w3.org/2000/svg}"
    for result, kind, i, item, mc in _probabilistic(demos):
        page = html_report(result, generated_at=STAMP)
        title = (f"{'Tank' if kind == 'tank' else 'Spill'} {item.name}: "
                 f"{'headspace' if kind == 'tank' else 'room air'}, cumulative distribution")
        plots = [svg for svg in _inline_svgs(page)
                 if ET.fromstring(svg).find(ns + "title").text == title]
        assert len(plots) == 1, title
        root = ET.fromstring(plots[0])
        assert root.tag == ns + "svg"
        limit_group = next(g for g in root.iter(ns + "g") if g.get("stroke") == "#8c2a22")
        lines = [x.find(ns + "title").text for x in limit_group]
        dashes = [x.get("stroke-dasharray") for x in limit_group]
        assert len(set(dashes)) == len(dashes)  # each limit its own dash pattern
        ratios = [name for name in mc.outputs if name.startswith("ratio to ")]
        assert len(lines) == len(ratios) > 0
        for line in lines:
            assert line.endswith(" ppm")
        texts = {t.text for t in root.iter(ns + "text")}
        assert "concentration [ppm by volume]" in texts
        assert "fraction of samples at or below" in texts
        md = markdown_report(result, tmp_path / f"plots-{kind}", generated_at=STAMP)
        stem = f"{kind}{i + 1}-{report._slug(item.name)}-probability-cumulative.svg"
        assert f"(plots-{kind}/{stem})" in md
        saved = ET.fromstring((tmp_path / f"plots-{kind}" / stem).read_text(encoding="utf-8"))
        assert saved.find(ns + "title").text == title


def test_probabilistic_exceedance_shown_equals_the_result(demos):
    """The exceedance rows of HTML and Markdown are the run's probabilities, limit by limit."""
    for result, _, _, _, mc in _probabilistic(demos):
        md = markdown_report(result, generated_at=STAMP)
        page = html_report(result, generated_at=STAMP)
        assert mc.exceedance
        for label, p in dict(mc.exceedance).items():
            shown = f"{100 * p:.3g} %"
            assert f"| {_md_text(label)} | {shown} |" in md
            assert f'<tr><td>{html.escape(label)}</td><td class="num">{shown}</td></tr>' in page


def test_probabilistic_curves_cross_the_limits_at_the_exceedance(demos):
    """Above each limit line lies the share of its curve's samples reported as exceedance."""
    for result, kind, _, item, mc in _probabilistic(demos):
        names = ({c.key: c.name for c in item.headspace.liquid.components} if kind == "tank"
                 else None)
        curves, lines = report.monte_carlo_curves(mc, result.scenario.limits, names)
        assert lines
        for line in lines:
            above = float(np.mean(curves[line["compared"]] > line["ppm"]))
            assert above == pytest.approx(mc.exceedance[line["label"]], abs=1.0 / mc.n)
        if kind == "spill":
            assert {"8-h TWA", "peak"} <= set(curves)
            assert np.array_equal(curves["8-h TWA"], mc.outputs["twa_ppm"])
        else:
            assert np.array_equal(curves["all vapour"], mc.outputs["total_ppm"])


# --------------------------------------------------------------------------- HTML and SVG

def test_html_is_self_contained(demos, hostile):
    """No external source or link, no script, no stylesheet link; plots are inline SVG."""
    for result in _all(demos, hostile):
        page = html_report(result, generated_at=STAMP)
        assert page.startswith("<!DOCTYPE html>")
        assert not re.search(r"<script", page, flags=re.I)
        assert not re.search(r"""(?:src|href)\s*=\s*["']?\s*(?:https?:)?//""", page, flags=re.I)
        assert "<link" not in page and "@import" not in page
        assert re.findall(r"url\(([^)]*)\)", page) == [
            u for u in re.findall(r"url\(([^)]*)\)", page) if u.startswith("#")]
        assert _inline_svgs(page)


def test_user_text_is_escaped_in_html_markdown_and_svg(hostile):
    """Markup typed into the title and names comes out as text, never as tags."""
    page = html_report(hostile, generated_at=STAMP)
    assert "<script" not in page and "<b>" not in page
    assert html.escape(HOSTILE_TITLE) in page
    assert html.escape(HOSTILE_TANK) in page
    md = markdown_report(hostile, generated_at=STAMP)
    assert not re.search(r"(?<!\\)<", md)  # every "<" of user text is backslash-escaped
    svgs = _inline_svgs(page)
    titles = []
    for svg in svgs:
        assert "<b>" not in svg and "<script" not in svg
        root = ET.fromstring(svg)
        titles.append(root.find("{http://www.w3.org/2000/svg}title").text)
    assert any(HOSTILE_TANK in t for t in titles)  # parsed back to the raw text


def test_inline_svg_plots_are_well_formed(demos):
    """Every plot in the HTML parses as XML with an SVG root."""
    for result in demos.values():
        svgs = _inline_svgs(html_report(result, generated_at=STAMP))
        assert svgs
        for svg in svgs:
            assert ET.fromstring(svg).tag == "{http://www.w3.org/2000/svg}svg"


def test_html_output_is_deterministic(demos):
    """The same result and time stamp give the same page, byte for byte."""
    result = demos["warehouse-drum-spill"]
    assert html_report(result, generated_at=STAMP) == html_report(result, generated_at=STAMP)


# --------------------------------------------------------------------------- JSON

def _reject_constant(name):
    raise AssertionError(f"non-standard JSON constant {name}")


def test_json_round_trips_strictly(demos, hostile):
    """JSON parses with no NaN or Infinity and carries version, inputs and assumptions."""
    for result in _all(demos, hostile):
        text = results_json(result, generated_at=STAMP)
        data = json.loads(text, parse_constant=_reject_constant)
        assert data["ullage_version"] == result.version
        assert data["assumptions"] == list(result.assumptions)
        assert data["inputs"]["scenario"]["title"] == result.scenario.title
        assert data["generated_at"] == STAMP
        assert json.loads(json.dumps(data, allow_nan=False)) == data


def test_json_non_finite_values_become_null_and_say_so(demos):
    """The pool never gone within the run (infinite time) is null and listed as such."""
    result = demos["warehouse-drum-spill"]
    assert math.isinf(result.spills[0].indoor.pool_gone_time)
    data = result_to_dict(result, generated_at=STAMP)
    assert data["spills"][0]["indoor"]["pool_gone_time_s"] is None
    assert "spills[0].indoor.pool_gone_time_s" in data["null_values"]["fields"]
    assert "not finite" in data["null_values"]["meaning"]


def test_json_numbers_are_the_result_numbers_in_si(demos):
    """JSON values equal the result objects' SI values exactly."""
    result = demos["coatings-day-tank"]
    tank = result.tanks[0]
    data = result_to_dict(result, generated_at=STAMP)["tanks"][0]
    assert data["temperature_k"] == tank.temperature
    assert data["pressure_pa"] == tank.pressure
    stated = data["cases"]["stated"]
    assert stated["total_ppm"] == tank.headspace.total_ppm
    assert stated["percent_lfl"] == float(tank.headspace.percent_lfl)
    assert [c["volume_fraction"] for c in stated["components"]] == \
        np.asarray(tank.headspace.volume_fractions).tolist()
    assert [c["ratio"] for c in stated["comparisons"]] == [c.ratio for c in tank.comparisons]
    assert data["purge"]["time_s"] == tank.purge.time
    assert data["sweep"]["temperature_k"] == np.asarray(tank.sweep.temperature).tolist()


def test_json_long_series_are_downsampled_and_say_so(demos):
    """A 2,881-point spill series is cut to at most the cap, keeping its peak."""
    result = demos["warehouse-drum-spill"]
    ind = result.spills[0].indoor
    series = result_to_dict(result, generated_at=STAMP)["spills"][0]["indoor"]["series"]
    assert ind.times.size > MAX_SERIES_POINTS
    assert series["downsampled"] is True
    assert series["original_points"] == ind.times.size
    assert len(series["times_s"]) == series["points"] <= MAX_SERIES_POINTS
    near = series["near field"]["ppm"]["acetone"]
    assert max(near) == float(np.max(ind.ppm("near_field")[:, 0]))


# --------------------------------------------------------------------------- CSV

def test_csv_is_tidy_with_header_first_and_cautions_last(demos):
    """The first row is the header; the cautions are the last rows; every row is full width."""
    for result in demos.values():
        rows = _csv_rows(results_csv(result, generated_at=STAMP))
        assert tuple(rows[0]) == CSV_COLUMNS
        assert all(len(r) == len(CSV_COLUMNS) for r in rows)
        tail = rows[-len(CAUTIONS):]
        assert [r[1] for r in tail] == ["caution"] * len(CAUTIONS)
        assert [r[-1] for r in tail] == list(CAUTIONS)


def test_csv_neutralises_formulas(hostile):
    """Title, limit sources and a substance source starting with = + - @ get a leading quote."""
    rows = _csv_rows(results_csv(hostile, generated_at=STAMP))
    cells = [c for r in rows for c in r]
    for cell in cells:
        if cell.startswith(("=", "+", "-", "@", "\t", "\r")):
            float(cell)  # only numbers may start so
    assert "'" + HOSTILE_TITLE in cells
    assert "'@SDS rev 3" in cells
    assert "'" + '=HYPERLINK("http://x") site rule 1' in cells
    assert "'+national list 3" in cells
    assert "'-regional code 4" in cells


def test_csv_values_are_the_result_numbers(demos):
    """Numbers in the value and ratio columns read back to the result's numbers."""
    result = demos["warehouse-drum-spill"]
    rows = _csv_dicts(results_csv(result, generated_at=STAMP))
    e = result.spills[0].exposures[0]
    peak = next(r for r in rows if r["kind"] == "exposure" and r["case"] == e.zone
                and r["quantity"] == "peak")
    assert float(peak["value"]) == e.peak and peak["unit"] == "ppm"
    label, _, ratio, _, _ = e.comparisons[0]
    row = next(r for r in rows if r["kind"] == "comparison" and r["limit"] == label
               and r["case"] == e.zone and r["ratio"])
    assert float(row["ratio"]) == ratio
    gone = next(r for r in rows if r["quantity"] == "pool evaporated")
    assert gone["value"] == "" and "not finite" in gone["note"]


# --------------------------------------------------------------------------- files

def test_write_report_by_extension(demos, tmp_path):
    """Each ending gives its format; Markdown plots land in <stem>_plots and are linked."""
    result = demos["warehouse-drum-spill"]
    for ending in (".md", ".html", ".json", ".csv"):
        assert write_report(result, tmp_path / f"r{ending}", generated_at=STAMP).exists()
    md = (tmp_path / "r.md").read_text(encoding="utf-8")
    links = re.findall(r"\]\((r_plots/[^)]+\.svg)\)", md)
    assert links
    for link in links:
        svg = (tmp_path / link).read_text(encoding="utf-8")
        assert ET.fromstring(svg).tag.endswith("svg")
    assert (tmp_path / "r.html").read_text(encoding="utf-8").startswith("<!DOCTYPE html>")
    json.loads((tmp_path / "r.json").read_text(encoding="utf-8"))
    assert (tmp_path / "r.csv").read_text(encoding="utf-8").startswith("item,kind,")
    leftovers = [p.name for p in tmp_path.rglob("*") if p.name.startswith(".") or
                 p.name.endswith(".part")]
    assert leftovers == []


def test_write_report_explicit_format_and_bad_format(demos, tmp_path):
    """An explicit format wins over the ending; an unknown one names the field and the options."""
    result = demos["coatings-day-tank"]
    write_report(result, tmp_path / "out.txt", format="json", generated_at=STAMP)
    json.loads((tmp_path / "out.txt").read_text(encoding="utf-8"))
    with pytest.raises(InputError) as err:
        write_report(result, tmp_path / "out.pdf")
    assert err.value.field == "format" and "markdown, html, json, csv" in str(err.value)
    with pytest.raises(InputError) as err:
        write_report(result, tmp_path / "out.md", format="docx")
    assert err.value.field == "format" and "html" in str(err.value)
    assert not (tmp_path / "out.pdf").exists() and not (tmp_path / "out.md").exists()


def test_markdown_without_plot_dir_points_to_html(demos, tmp_path):
    """Without a plot folder no image is linked and the report says where the plots are."""
    md = markdown_report(demos["coatings-day-tank"], generated_at=STAMP)
    assert "![" not in md and "HTML report carries them" in md


def test_failed_write_keeps_the_old_file(demos, tmp_path, monkeypatch):
    """A failure half-way through writing leaves the previous report intact and no temporary."""
    result = demos["coatings-day-tank"]
    target = tmp_path / "report.html"
    target.write_text("previous report", encoding="utf-8")
    real_fdopen = os.fdopen

    class HalfWriter:
        def __init__(self, handle):
            self.handle = handle

        def __enter__(self):
            return self

        def __exit__(self, *exc):
            self.handle.close()
            return False

        def write(self, text):
            self.handle.write(text[: len(text) // 2])
            raise OSError("disk full (simulated)")

    monkeypatch.setattr(report.os, "fdopen", lambda *a, **k: HalfWriter(real_fdopen(*a, **k)))
    with pytest.raises(OSError, match="simulated"):
        write_report(result, target, generated_at=STAMP)
    monkeypatch.undo()
    assert target.read_text(encoding="utf-8") == "previous report"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["report.html"]


def test_write_keeps_permissions_of_a_replaced_file(demos, tmp_path):
    """Replacing a report keeps the old file's permissions."""
    target = tmp_path / "r.csv"
    target.write_text("old", encoding="utf-8")
    os.chmod(target, 0o640)
    write_report(demos["coatings-day-tank"], target, generated_at=STAMP)
    assert target.stat().st_mode & 0o777 == 0o640


# --------------------------------------------------------------------------- plots

def test_nice_ticks_follow_the_one_two_five_rule():
    """Linear ticks step by 1, 2 or 5 times a power of ten (Heckbert 1990, Graphics Gems)."""
    assert nice_ticks(0.0, 61116.0) == [0.0, 20000.0, 40000.0, 60000.0, 80000.0]
    assert nice_ticks(0.0, 1.0) == [0.0, 0.2, 0.4, 0.6, 0.8, 1.0]
    assert nice_ticks(-3.2, 7.9) == [-4.0, -2.0, 0.0, 2.0, 4.0, 6.0, 8.0]
    major, minor = log_ticks(3e-3, 5163.0)
    assert major == [0.001, 0.01, 0.1, 1.0, 10.0, 100.0, 1000.0, 10000.0]
    assert minor == []  # no minor ticks over more than six decades
    assert len(log_ticks(3e-2, 5163.0)[1]) == 6 * 8
    assert log_ticks(20.0, 90.0)[0] == [10.0, 20.0, 50.0, 100.0]


def test_tick_labels_read_plainly():
    """Tick labels use thousands separators, no float noise, and powers of ten when large."""
    assert [tick_label(v) for v in (0.001, 0.05, 250.0, 60000.0, 1e6, 2e-7)] == \
        ["0.001", "0.05", "250", "60,000", "10⁶", "2×10⁻⁷"]
    assert tick_label(2.5, 0.5) == "2.5" and tick_label(0.30000000000000004, 0.1) == "0.3"


def test_line_plot_escapes_text_and_is_deterministic():
    """Labels with markup are escaped, output repeats exactly, and it parses as XML."""
    args = dict(x_label="time [min]", y_label="ppm", title="Bay <2> & \"yard\"",
                hlines={"TWA <250>": 250.0, "STEL & co": 500.0}, log_y=True)
    series = {"near <field>": [0.0, 100.0, 3000.0, 50.0], "far": [0.0, 10.0, 300.0, np.nan]}
    svg = line_plot_svg([0, 1, 2, 3], series, **args)
    assert svg == line_plot_svg([0, 1, 2, 3], series, **args)
    assert "<2>" not in svg and "<field>" not in svg and "<250>" not in svg
    root = ET.fromstring(svg)
    texts = {t.text for t in root.iter("{http://www.w3.org/2000/svg}text")}
    assert {"TWA <250>", "STEL & co", "near <field>", "Bay <2> & \"yard\""} <= texts
    assert "1,000" in texts  # a decade label of the log axis
    assert svg.count('stroke="#8c2a22" stroke-width') == 1  # the limit-line group


def test_line_plot_draws_each_series_with_its_own_dash():
    """Series differ in dash pattern as well as colour, and each limit gets one line."""
    x = np.linspace(0, 10, 11)
    svg = line_plot_svg(x, {"a": x, "b": 2 * x, "c": 3 * x}, x_label="x", y_label="y",
                        title="t", hlines={"L1": 5.0, "L2": 12.0})
    root = ET.fromstring(svg)
    ns = "{http://www.w3.org/2000/svg}"
    paths = [p for p in root.iter(ns + "path")]
    assert len(paths) == 3
    assert len({(p.get("stroke"), p.get("stroke-dasharray")) for p in paths}) == 3
    assert len({p.get("stroke-dasharray") for p in paths}) == 3
    limit_group = [g for g in root.iter(ns + "g") if g.get("stroke") == "#8c2a22"][0]
    assert len(list(limit_group)) == 2
    assert len({x.get("stroke-dasharray") for x in limit_group}) == 2  # told apart by dash


def test_line_plot_thins_long_series_but_keeps_the_peak():
    """A 50,000-point series is drawn with at most the cap of points, its spike still there."""
    from estimator.plots import MAX_PLOT_POINTS

    x = np.arange(50000.0)
    y = np.zeros_like(x)
    y[31337] = 7.0
    svg = line_plot_svg(x, {"spike": y}, x_label="x", y_label="y", title="t")
    d = ET.fromstring(svg).find(".//{http://www.w3.org/2000/svg}path").get("d")
    points = d.replace("M", " ").replace("L", " ").split()
    assert len(points) <= MAX_PLOT_POINTS + 2
    top = min(float(p.split(",")[1]) for p in points)
    assert top < 100  # the spike reaches up to 7/8 of the plot height; the baseline is at 290


def test_line_plot_bad_inputs_name_the_field():
    """Mismatched lengths, empty x and non-numbers raise InputError naming the argument."""
    with pytest.raises(InputError) as err:
        line_plot_svg([0, 1, 2], {"a": [1, 2]}, x_label="x", y_label="y", title="t")
    assert err.value.field == "series" and "one y value per x value" in str(err.value)
    with pytest.raises(InputError) as err:
        line_plot_svg([], {"a": []}, x_label="x", y_label="y", title="t")
    assert err.value.field == "x"
    with pytest.raises(InputError) as err:
        line_plot_svg([0, 1], {"a": ["p", "q"]}, x_label="x", y_label="y", title="t")
    assert err.value.field == "series"
    with pytest.raises(InputError) as err:
        line_plot_svg([0, 1], {"a": [1, 2]}, x_label="x", y_label="y", title="t",
                      hlines={"L": "high"})
    assert err.value.field == "hlines"


def test_line_plot_log_axis_without_positive_values_says_so():
    """On a log axis a series of zeros gives an empty plot with a note, not an error."""
    svg = line_plot_svg([0, 1], {"a": [0.0, 0.0]}, x_label="x", y_label="y", title="t",
                        log_y=True)
    assert "no value above zero" in svg
    ET.fromstring(svg)


# The empirical distribution function F(x) = (number of samples <= x) / n is the
# textbook definition (common practice); the checks below count samples directly.

def test_cumulative_points_are_the_empirical_distribution():
    """At each drawn corner the height is the fraction of samples at or below it, ties included."""
    x, f = cumulative_points([3.0, 1.0, 2.0, 2.0, np.nan])
    assert x.tolist() == [1.0, 1.0, 2.0, 2.0, 3.0, 3.0]
    assert f.tolist() == [0.0, 0.25, 0.25, 0.75, 0.75, 1.0]
    samples = np.random.default_rng(5).lognormal(3.0, 1.0, 20000)
    samples[:3000] = 40.0  # a large tied group, as a capped output gives
    x, f = cumulative_points(samples, log_x=True)
    assert x.size <= MAX_PLOT_POINTS + 60
    assert np.all(np.diff(x) >= 0) and np.all(np.diff(f) >= 0)
    assert f[0] == 0.0 and f[-1] == 1.0
    ordered = np.sort(samples)
    for xv, fv in zip(x[1:], f[1:]):
        below = np.searchsorted(ordered, xv, side="left") / ordered.size
        at_or_below = np.searchsorted(ordered, xv, side="right") / ordered.size
        assert below - 1e-12 <= fv <= at_or_below + 1e-12
    jump = np.flatnonzero((x[1:] == 40.0) & (x[:-1] == 40.0))
    assert jump.size and np.max(f[jump + 1] - f[jump]) >= 3000 / 20000 - 1e-12


def test_cumulative_points_bad_inputs_name_the_field():
    """No finite sample, or too few points asked for, raise InputError naming the argument."""
    with pytest.raises(InputError) as err:
        cumulative_points([np.nan, np.nan])
    assert err.value.field == "samples" and "no finite sample" in str(err.value)
    with pytest.raises(InputError) as err:
        cumulative_points([1.0, 2.0], max_points=5)
    assert err.value.field == "max_points"


def test_cumulative_plot_escapes_text_is_deterministic_and_thins():
    """Labels are escaped, output repeats exactly, long inputs are thinned, limits are vertical."""
    rng = np.random.default_rng(11)
    series = {"near <field>": rng.lognormal(5.0, 1.0, 50000), "far & away": rng.uniform(1, 9, 40)}
    args = dict(x_label="ppm", title="Bay <2> & \"yard\"",
                vlines={"TWA <250>": 250.0, "STEL & co": 500.0}, log_x=True)
    svg = cumulative_plot_svg(series, **args)
    assert svg == cumulative_plot_svg(series, **args)
    assert "<2>" not in svg and "<field>" not in svg and "<250>" not in svg
    root = ET.fromstring(svg)
    ns = "{http://www.w3.org/2000/svg}"
    texts = {t.text for t in root.iter(ns + "text")}
    assert {"TWA <250>", "STEL & co", "near <field>", "far & away",
            "Bay <2> & \"yard\""} <= texts
    paths = list(root.iter(ns + "path"))
    assert len(paths) == 2
    assert len({(p.get("stroke"), p.get("stroke-dasharray")) for p in paths}) == 2
    points = paths[0].get("d").replace("M", " ").replace("L", " ").split()
    assert len(points) <= MAX_PLOT_POINTS + 60
    limit_group = next(g for g in root.iter(ns + "g") if g.get("stroke") == "#8c2a22")
    for line in limit_group:
        assert line.get("x1") == line.get("x2") and line.get("y1") != line.get("y2")


def test_cumulative_plot_linear_axis_and_a_limit_off_the_log_axis():
    """A linear axis spans samples and limits; a limit at zero on a log axis is named in a note."""
    svg = cumulative_plot_svg({"a": [1.0, 2.0, 3.0]}, x_label="x", title="t",
                              vlines={"L": 8.0})
    ET.fromstring(svg)
    assert "<title>L</title>" in svg
    svg = cumulative_plot_svg({"a": [1.0, 2.0, 3.0]}, x_label="x", title="t",
                              vlines={"zero line": 0.0}, log_x=True)
    assert "left of the axis: zero line" in svg


def test_cumulative_plot_bad_inputs_name_the_field():
    """Empty input, non-numbers and bad line positions raise InputError naming the argument."""
    with pytest.raises(InputError) as err:
        cumulative_plot_svg({}, x_label="x", title="t")
    assert err.value.field == "samples"
    with pytest.raises(InputError) as err:
        cumulative_plot_svg({"a": ["p", "q"]}, x_label="x", title="t")
    assert err.value.field == "samples"
    with pytest.raises(InputError) as err:
        cumulative_plot_svg({"a": [1.0]}, x_label="x", title="t", vlines={"L": "high"})
    assert err.value.field == "vlines"
    with pytest.raises(InputError) as err:
        cumulative_plot_svg({"a": [1.0]}, x_label="x", title="t", width=50)
    assert err.value.field == "width"


def test_long_legend_labels_wrap_inside_the_plot():
    """A legend label longer than the plot is wide wraps onto lines inside it."""
    import re

    from estimator.plots import line_plot_svg

    long = "far field: " + " ".join(["Methyl ethyl ketone"] * 8)
    svg = line_plot_svg([0, 1, 2], {long: [1, 2, 3], "near field": [2, 3, 4]},
                        x_label="time [min]", y_label="ppm", title="t", width=420, height=420)
    root = ET.fromstring(svg)
    ns = "{http://www.w3.org/2000/svg}"
    spans = [t.text for t in root.iter(ns + "tspan")]
    assert " ".join(spans) == long  # every word kept, none cut off
    width = 420
    for t in root.iter(ns + "tspan"):
        x = float(t.get("x"))
        assert x + len(t.text) * 12 * 0.56 <= width  # the layout estimate of the plot
    assert not re.search("…", svg)


def test_percent_lfl_plot_is_logarithmic_far_above_the_alarm(demos):
    """The % LFL sweep of the day tank (far above its 10 % alarm) uses a log axis, so the
    alarm and LFL lines stand clear of the axis."""
    result = demos["coatings-day-tank"]
    page = html_report(result, generated_at=STAMP)
    ns = "{http://www.w3.org/2000/svg}"
    plot = next(svg for svg in _inline_svgs(page)
                if "% of LFL by temperature" in ET.fromstring(svg).find(ns + "title").text)
    texts = [t.text or "" for t in ET.fromstring(plot).iter(ns + "text")]
    assert "10" in texts and "100" in texts  # decade ticks of a log axis
