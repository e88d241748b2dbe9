"""Line plots as plain SVG text, for reports that must stand alone.

No plotting library is needed: `line_plot_svg` writes the axes, round-number
ticks (linear or logarithmic concentration axis), a legend and labelled dashed
limit lines itself; `cumulative_plot_svg` does the same for the empirical
cumulative distribution of Monte Carlo samples, with the limits as vertical
lines. Every piece of text is escaped, so labels typed by a user
cannot inject markup, and the same input always gives the same output, byte for
byte.

Series are told apart by colour and by dash pattern, so a plot still reads when
printed in grey or seen with a colour-vision deficiency.
"""

from __future__ import annotations

import hashlib
import html
import math
import re
from dataclasses import dataclass

import numpy as np

from .errors import InputError

__all__ = ["SERIES_STYLES", "LIMIT_STYLE", "MAX_PLOT_POINTS", "line_plot_svg",
           "cumulative_plot_svg", "cumulative_points", "nice_ticks", "log_ticks", "tick_label"]

#: (stroke colour, dash pattern) of successive series. Hues spread around the
#: wheel with clearly different lightness (blue, amber, green, plum, grey, ochre),
#: each with its own dash pattern, so no two series depend on hue alone.
SERIES_STYLES = (
    ("#1f4f8f", ""),               # deep blue, solid
    ("#c8661a", "9 4"),            # amber, long dashes
    ("#23866b", "2 3"),            # green, dots
    ("#7d3c87", "10 3 2 3"),       # plum, dash-dot
    ("#505050", "5 2 1 2 1 2"),    # grey, dash-dot-dot
    ("#967400", "14 4 4 4"),       # ochre, long-short
)

#: (stroke colour, dash pattern, width) of horizontal limit lines: thin, dark
#: brick red, evenly dashed, labelled in place.
LIMIT_STYLE = ("#8c2a22", "6 3", 1.3)

#: Dash patterns of successive limit lines (the first is LIMIT_STYLE's), so that
#: two limits differ by more than a label; each is also labelled in place.
LIMIT_DASHES = ("6 3", "2 3", "12 3 2 3", "12 5", "4 2 1 2", "1 5")

#: Points drawn per series at most; longer series are thinned keeping each
#: interval's lowest and highest value, so peaks survive.
MAX_PLOT_POINTS = 1200

#: Decades shown at most on a logarithmic axis, counted down from the top.
MAX_LOG_DECADES = 7

_FONT = "system-ui, -apple-system, 'Segoe UI', Helvetica, Arial, sans-serif"
_CHAR_WIDTH = 0.56  # average glyph width over font size, for layout estimates
_NOT_XML = re.compile("[\x00-\x08\x0b\x0c\x0e-\x1f\x7f\ufffe\uffff]")
_SUPERSCRIPT = str.maketrans("-0123456789", "⁻⁰¹²³⁴⁵⁶⁷⁸⁹")


def _text(value) -> str:
    """User text made safe inside SVG/XML: escaped, control characters dropped."""
    return html.escape(_NOT_XML.sub("", str(value)), quote=True)


def _coordinate(value: float) -> str:
    text = f"{value:.1f}"
    return "0.0" if text == "-0.0" else text


def nice_ticks(low: float, high: float, target: int = 6) -> list[float]:
    """Round-number ticks covering [low, high]: steps of 1, 2 or 5 times a power of ten.

    Parameters
    ----------
    low, high : float
        Data range, low < high.
    target : int
        About how many intervals to aim for.

    Returns
    -------
    list of float
        Ticks from a multiple of the step at or below `low` to one at or above
        `high`.

    References
    ----------
    Heckbert, P. S. (1990), "Nice numbers for graph labels", in Graphics Gems,
    Academic Press, pp. 61-63 (the 1-2-5 rule).

    Examples
    --------
    >>> nice_ticks(0.0, 61116.0)
    [0.0, 20000.0, 40000.0, 60000.0, 80000.0]
    """
    span = high - low
    raw = span / max(target, 1)
    magnitude = 10.0 ** math.floor(math.log10(raw))
    step = next(m * magnitude for m in (1.0, 2.0, 5.0, 10.0) if m * magnitude >= raw * 0.999)
    first = math.floor(low / step + 1e-9)
    last = math.ceil(high / step - 1e-9)
    digits = max(0, -math.floor(math.log10(step))) + 2
    ticks = [round(k * step, digits) for k in range(first, last + 1)]
    return [0.0 if t == 0 else t for t in ticks]


def log_ticks(low: float, high: float) -> tuple[list[float], list[float]]:
    """Labelled and minor ticks of a logarithmic axis covering [low, high] (both > 0).

    Labels fall on powers of ten (every second or third one over many decades);
    within a single decade 2 and 5 times the power are labelled as well.

    Returns
    -------
    (list of float, list of float)
        Labelled ticks, and unlabelled minor ticks.
    """
    first = math.floor(math.log10(low) + 1e-9)
    last = math.ceil(math.log10(high) - 1e-9)
    if last <= first:
        last = first + 1
    decades = last - first
    every = 1 if decades <= 8 else math.ceil(decades / 8)
    major = [10.0 ** k for k in range(first, last + 1) if (k - first) % every == 0]
    minor = []
    if decades <= 6:
        minor = [m * 10.0 ** k for k in range(first, last) for m in range(2, 10)]
    if decades == 1:
        extra = [m * 10.0 ** first for m in (2.0, 5.0)]
        major = sorted(major + extra)
        minor = [m for m in minor if m not in extra]
    return major, minor


def tick_label(value: float, step: float | None = None) -> str:
    """A tick value as people read it: 0.05, 250, 60,000, 2×10⁻⁷.

    Parameters
    ----------
    value : float
    step : float, optional
        Distance between linear ticks, which sets the decimals shown.
    """
    if value == 0:
        return "0"
    size = abs(value)
    if 1e-3 <= size < 1e6:
        if step is not None:
            decimals = max(0, -math.floor(math.log10(step) + 1e-9))
            return f"{value:,.{decimals}f}"
        text = f"{size:.6g}"
        if "e" in text:
            text = f"{size:.6f}".rstrip("0").rstrip(".")
        whole, _, fraction = text.partition(".")
        text = f"{int(whole):,}" + ("." + fraction if fraction else "")
        return ("-" if value < 0 else "") + text
    mantissa, exponent = f"{value:.2e}".split("e")
    mantissa = mantissa.rstrip("0").rstrip(".")
    power = "10" + str(int(exponent)).translate(_SUPERSCRIPT)
    return power if mantissa == "1" else f"{mantissa}×{power}"


def _thin(x: np.ndarray, ys: list[np.ndarray], cap: int) -> np.ndarray:
    """Indices to draw: all of them, or each bucket's extremes over every series."""
    n = x.size
    if n <= cap:
        return np.arange(n)
    buckets = max(1, cap // 2 - 1)
    edges = np.linspace(0, n, buckets + 1).astype(int)
    keep = {0, n - 1}
    for start, stop in zip(edges[:-1], edges[1:]):
        if stop <= start:
            continue
        keep.add(int(start))
        for y in ys:
            part = y[start:stop]
            finite = np.isfinite(part)
            if finite.any():
                where = np.flatnonzero(finite)
                keep.add(int(start + where[np.argmin(part[finite])]))
                keep.add(int(start + where[np.argmax(part[finite])]))
    return np.array(sorted(keep))


# --------------------------------------------------------------------------
# the parts both plots share: layout, axes, grid, limit lines, series, legend


def _check_size(width, height) -> None:
    if not (200 <= width <= 4000 and 150 <= height <= 4000):
        raise InputError("width", "the plot must be 200-4000 px wide and 150-4000 px high")


def _limit_values(given, field: str, what: str) -> dict:
    """Label -> position of the limit lines given; infinite and NaN ones are left out."""
    lines = {}
    for label, value in (given or {}).items():
        try:
            v = float(value)
        except (TypeError, ValueError):
            raise InputError(field, f"the {what} of {str(label)!r} is not a number") from None
        if math.isfinite(v):
            lines[str(label)] = v
    return lines


def _legend_rows(labels: list[str], usable: float, font: float) -> list[list[tuple[str, float]]]:
    """Legend entries wrapped into rows that fit the width; (label, entry width)."""
    rows: list[list[tuple[str, float]]] = [[]]
    used = 0.0
    for label in labels:
        w = 34 + len(label) * font * _CHAR_WIDTH + 18
        if w > usable:  # too long for one row: wrapped onto lines of its own row
            if rows[-1]:
                rows.append([])
            rows[-1].append(("\n".join(_legend_lines(label, usable, font)), usable))
            rows.append([])
            used = 0.0
            continue
        if rows[-1] and used + w > usable:
            rows.append([])
            used = 0.0
        rows[-1].append((label, w))
        used += w
    return [row for row in rows if row] or [[]]


def _legend_height(rows) -> int:
    """Lines of text the legend takes (a wrapped label takes several)."""
    return sum(max((label.count("\n") + 1 for label, _ in row), default=1) for row in rows)


def _legend_lines(label: str, usable: float, font: float) -> list[str]:
    """A legend label broken at spaces into lines that fit beside its sample line,
    so that no label runs off the plot (never cut short)."""
    room = max(8, int((usable - 52) / (font * _CHAR_WIDTH)))
    lines, current = [], ""
    for word in str(label).split(" "):
        while len(word) > room:  # a single word longer than a line: break it
            if current:
                lines.append(current)
                current = ""
            lines.append(word[:room])
            word = word[room:]
        if current and len(current) + 1 + len(word) > room:
            lines.append(current)
            current = word
        else:
            current = f"{current} {word}" if current else word
    return lines + ([current] if current or not lines else [])




def _line_tag(x1: float, y1: float, x2: float, y2: float, attributes: str = "") -> str:
    """An SVG line from (x1, y1) to (x2, y2), with more attributes (each led by a space)."""
    return (f'<line x1="{_coordinate(x1)}" y1="{_coordinate(y1)}" '
            f'x2="{_coordinate(x2)}" y2="{_coordinate(y2)}"{attributes}/>')


def _dash_attr(dash: str) -> str:
    return f' stroke-dasharray="{dash}"' if dash else ""


def _legend(out: list, frame) -> None:
    """Append the legend below the plot: one sample line and label per series."""
    font, left = frame.font, frame.left
    legend_top = frame.top + frame.plot_h + 52.0
    out.append(f'<g font-size="{font:g}" fill="#1a1a1a">')
    index = 0
    line = 0
    for row in frame.rows:
        x0 = left
        y0 = legend_top + 18.0 * line
        for label, w in row:
            colour_k, dash_k = SERIES_STYLES[index % len(SERIES_STYLES)]
            out.append(_line_tag(x0, y0 - 4, x0 + 28, y0 - 4, f' stroke="{colour_k}" '
                                 f'stroke-width="2.2"{_dash_attr(dash_k)}'))
            parts = label.split("\n")
            spans = "".join(f'<tspan x="{_coordinate(x0 + 34)}" dy="{0 if k == 0 else 18}">'
                            f"{_text(part)}</tspan>" for k, part in enumerate(parts))
            out.append(f'<text x="{_coordinate(x0 + 34)}" y="{_coordinate(y0)}">'
                       + (spans if len(parts) > 1 else _text(label)) + "</text>")
            x0 += w
            index += 1
        line += max((label.count("\n") + 1 for label, _ in row), default=1)
    out.append("</g>")


@dataclass(frozen=True)
class _Frame:
    """Where a plot's parts go: the page size, the plot area and the legend rows."""
    width: int
    height: int
    left: float
    top: float
    plot_w: float
    plot_h: float
    rows: list
    font: float = 12.0


def _frame(labels: list[str], width: int, height: int) -> _Frame:
    """The plot area left inside the margins once a legend of `labels` has its rows."""
    font = 12.0
    left, right, top = 84.0, 24.0, 42.0
    rows = _legend_rows(labels, width - left - right, font)
    bottom = 52.0 + 18.0 * _legend_height(rows)
    plot_h = height - top - bottom
    if plot_h < 60:
        raise InputError("height", f"{height} px leaves no room for the plot and a legend of "
                         f"{len(labels)} series; make it taller")
    return _Frame(width, height, left, top, width - left - right, plot_h, rows, font)


def _scale(lo: float, hi: float, start: float, length: float, *, log=False,
           off: float = math.nan):
    """Page position of a value on an axis from `lo` (at `start`) to `hi` (`length`
    further, negative upwards); on a logarithmic axis a value at or below zero is `off`."""
    if log:
        span = math.log10(hi) - math.log10(lo)

        def position(value):
            if not value > 0:
                return off
            return start + (math.log10(value) - math.log10(lo)) / span * length
        return position

    def position(value):
        return start + (value - lo) / (hi - lo) * length
    return position


def _log_range(values: np.ndarray):
    """Ends (whole decades, at most `MAX_LOG_DECADES` below the highest value),
    labelled ticks, minor ticks and a note (or "") of a logarithmic axis over values."""
    note = ""
    positive = values[values > 0]
    if positive.size == 0:
        lo, hi = 1.0, 10.0
        note = "no value above zero to show on a logarithmic axis"
    else:
        hi = float(positive.max())
        lo = max(float(positive.min()), hi / 10.0 ** MAX_LOG_DECADES)
    ticks, minor = log_ticks(lo * 0.999, hi * 1.001)
    lo = 10.0 ** math.floor(math.log10(ticks[0]) + 1e-9)
    hi = 10.0 ** math.ceil(math.log10(ticks[-1]) - 1e-9)
    return lo, hi, [(t, tick_label(t)) for t in ticks], minor, note


def _linear_range(values: np.ndarray, target: int, margin: bool):
    """Ends (round ticks), labelled ticks, minor ticks (none) and a note (or "") of a
    linear axis over values, from zero when the lowest is under half the highest;
    with `margin`, 2 % of the range is added at the ends before rounding."""
    note = ""
    if values.size == 0:
        lo, hi = 0.0, 1.0
        note = "no finite value to show"
    else:
        lo, hi = float(values.min()), float(values.max())
        if 0 < lo < 0.5 * hi:
            lo = 0.0  # concentrations read best from zero
    if hi <= lo:
        pad = abs(lo) * 0.5 or 1.0
        lo, hi = lo - pad, hi + pad
    if margin:
        extra = 0.02 * (hi - lo)
        ticks = nice_ticks(lo - (extra if lo != 0 else 0.0), hi + extra, target)
    else:
        ticks = nice_ticks(lo, hi, target)
    step = ticks[1] - ticks[0]
    return ticks[0], ticks[-1], [(t, tick_label(t, step)) for t in ticks], [], note


def _clip_id(parts, arrays) -> str:
    """An id for the plot area's clip path, different for different plots, so that
    plots inlined in one page keep their own."""
    digest = hashlib.sha1()
    for part in parts:
        digest.update(part.encode("utf-8", "replace"))
    for a in arrays:
        digest.update(a.tobytes())
    return "plotarea-" + digest.hexdigest()[:12]


def _head(f: _Frame, title: str, desc: str, clip_id: str) -> list[str]:
    """The opening of the SVG document: title, description (`desc`, markup already
    escaped), white background, the plot area's clip path and the title shown."""
    return [
        f'<svg xmlns="http://www.w3.org/2000/svg" width="{f.width}" height="{f.height}" '
        f'viewBox="0 0 {f.width} {f.height}" role="img" font-family="{_text(_FONT)}" '
        f'font-size="{f.font:g}">',
        f"<title>{_text(title)}</title>",
        f"<desc>{desc}</desc>",
        f'<rect x="0" y="0" width="{f.width}" height="{f.height}" fill="#ffffff"/>',
        f'<defs><clipPath id="{clip_id}"><rect x="{_coordinate(f.left)}" '
        f'y="{_coordinate(f.top)}" width="{_coordinate(f.plot_w)}" '
        f'height="{_coordinate(f.plot_h)}"/></clipPath></defs>',
        f'<text x="{_coordinate(f.left)}" y="24" font-size="14" font-weight="600" '
        f'fill="#1a1a1a">{_text(title)}</text>',
    ]


def _grid_and_ticks(f: _Frame, px, py, y_labelled, x_labelled, *, y_minor=(),
                    x_minor=()) -> list[str]:
    """Grid lines with their tick labels ((value, text) pairs), and short unlabelled
    minor ticks on the outside of the axes."""
    left, top, plot_w, plot_h = f.left, f.top, f.plot_w, f.plot_h
    grid = ['<g stroke="#d9d9d9" stroke-width="1">']
    ticks = ['<g fill="#333333">']
    for t, text in y_labelled:
        y = py(t)
        grid.append(_line_tag(left, y, left + plot_w, y))
        ticks.append(f'<text x="{_coordinate(left - 8)}" y="{_coordinate(y + 4)}" '
                     f'text-anchor="end">{_text(text)}</text>')
    for t in y_minor:
        y = py(t)
        if top - 0.5 <= y <= top + plot_h + 0.5:
            grid.append(_line_tag(left - 3, y, left, y, ' stroke="#555555"'))
    for t, text in x_labelled:
        x_px = px(t)
        grid.append(_line_tag(x_px, top, x_px, top + plot_h))
        ticks.append(f'<text x="{_coordinate(x_px)}" y="{_coordinate(top + plot_h + 17)}" '
                     f'text-anchor="middle">{_text(text)}</text>')
    for t in x_minor:
        x_px = px(t)
        if left - 0.5 <= x_px <= left + plot_w + 0.5:
            grid.append(_line_tag(x_px, top + plot_h, x_px, top + plot_h + 3,
                                  ' stroke="#555555"'))
    grid.append("</g>")
    ticks.append("</g>")
    return grid + ticks


def _axis_labels(out: list, f: _Frame, x_label: str, y_label: str) -> None:
    """Append the plot area's border and the two axis labels."""
    left, top, plot_w, plot_h = f.left, f.top, f.plot_w, f.plot_h
    out.append(f'<rect x="{_coordinate(left)}" y="{_coordinate(top)}" '
               f'width="{_coordinate(plot_w)}" height="{_coordinate(plot_h)}" fill="none" '
               'stroke="#333333" stroke-width="1"/>')
    out.append(f'<text x="{_coordinate(left + plot_w / 2)}" '
               f'y="{_coordinate(top + plot_h + 36)}" text-anchor="middle" '
               f'fill="#1a1a1a">{_text(x_label)}</text>')
    out.append(f'<text transform="translate(18 {_coordinate(top + plot_h / 2)}) rotate(-90)" '
               f'text-anchor="middle" fill="#1a1a1a">{_text(y_label)}</text>')


def _limit_dashes(lines: dict) -> dict:
    """Label -> dash pattern of each limit line, in the order given."""
    return {label: LIMIT_DASHES[i % len(LIMIT_DASHES)] for i, label in enumerate(lines)}


def _limits(out: list, clip_id: str, line_tags: list[str], label_tags: list[str]) -> None:
    """Append the limit lines (clipped to the plot area) and their labels, in `LIMIT_STYLE`."""
    colour, _, stroke = LIMIT_STYLE
    out.append(f'<g clip-path="url(#{clip_id})" stroke="{colour}" stroke-width="{stroke:g}">')
    out += line_tags
    out.append("</g>")
    out.append(f'<g fill="{colour}" font-size="11" text-anchor="end">')
    out += label_tags
    out.append("</g>")


def _hline_tags(f: _Frame, lines: dict, py) -> tuple[list[str], list[str]]:
    """Horizontal limit lines, and their labels at the right, nudged apart so they
    stay legible."""
    left, top, plot_w, plot_h = f.left, f.top, f.plot_w, f.plot_h
    placed = sorted(((py(v), label) for label, v in lines.items()), key=lambda item: -item[0])
    dashes = _limit_dashes(lines)
    line_tags = [_line_tag(left, y, left + plot_w, y, f' stroke-dasharray="{dashes[label]}"')
                 for y, label in placed]
    label_tags = []
    boxes: list[tuple[float, float, float]] = []  # (left, right, baseline) of labels placed
    for y, label in placed:
        baseline = max(min(y - 4.0, top + plot_h - 4.0), top + 11.0)
        wide = len(label) * 11.0 * _CHAR_WIDTH
        end = left + plot_w - 4.0
        for _ in range(len(boxes) + 1):
            clash = [b for b in boxes if abs(b[2] - baseline) < 12.0 and b[0] < end
                     and end - wide < b[1]]
            if not clash:
                break
            end = min(b[0] for b in clash) - 10.0
        if end - wide < left + 4.0:  # no room beside the others: stack it above them
            end = left + plot_w - 4.0
            baseline = max(top + 11.0, min(b[2] for b in boxes) - 13.0)
        boxes.append((end - wide, end, baseline))
        label_tags.append(f'<text x="{_coordinate(end)}" y="{_coordinate(baseline)}" '
                          f'paint-order="stroke" stroke="#ffffff" stroke-width="3">'
                          f"{_text(label)}</text>")
    return line_tags, label_tags


def _vline_tags(f: _Frame, lines: dict, px) -> tuple[list[str], list[str]]:
    """Vertical limit lines (those not left of the axis), each labelled along its left
    side, or its right when crowded."""
    left, top, plot_w, plot_h = f.left, f.top, f.plot_w, f.plot_h
    placed = sorted(((px(v), label) for label, v in lines.items()
                     if px(v) >= left - 0.5), key=lambda item: (item[0], item[1]))
    dashes = _limit_dashes(lines)
    line_tags = [f'<line x1="{_coordinate(x_px)}" y1="{_coordinate(top)}" '
                 f'x2="{_coordinate(x_px)}" y2="{_coordinate(top + plot_h)}" '
                 f'stroke-dasharray="{dashes[label]}">'
                 f"<title>{_text(label)}</title></line>" for x_px, label in placed]
    label_tags = []
    room = max(4, int((plot_h - 8.0) / (11.0 * _CHAR_WIDTH)))
    last = -math.inf  # page x of the last label's baseline
    for x_px, label in placed:
        baseline = x_px - 4.0
        if baseline - 11.0 < last + 2.0:
            baseline = max(x_px + 14.0, last + 13.0)
        baseline = min(max(baseline, left + 12.0), left + plot_w - 2.0)
        last = baseline
        shown = label if len(label) <= room else label[: room - 1] + "…"
        label_tags.append(f'<text transform="translate({_coordinate(baseline)} '
                          f'{_coordinate(top + 4.0)}) rotate(-90)" paint-order="stroke" '
                          f'stroke="#ffffff" stroke-width="3">{_text(shown)}</text>')
    return line_tags, label_tags


def _series_paths(out: list, clip_id: str, drawn) -> None:
    """Append the series as paths clipped to the plot area: `drawn` holds (place k
    among the series, which sets the style; label; lists of "x,y" points)."""
    out.append(f'<g clip-path="url(#{clip_id})" fill="none" stroke-width="2.2" '
               'stroke-linejoin="round" stroke-linecap="round">')
    for k, label, segments in drawn:
        colour_k, dash_k = SERIES_STYLES[k % len(SERIES_STYLES)]
        d = " ".join("M" + " L".join(seg) if len(seg) > 1 else f"M{seg[0]} l0.01,0"
                     for seg in segments)
        out.append(f'<path d="{d}" stroke="{colour_k}"{_dash_attr(dash_k)}>'
                   f"<title>{_text(label)}</title></path>")
    out.append("</g>")


# --------------------------------------------------------------------------
# line plot


def _validate(x, series, hlines, width, height):
    xs = np.asarray(x, dtype=float)
    if xs.ndim != 1 or xs.size == 0:
        raise InputError("x", "give a one-dimensional sequence of at least one number")
    if not isinstance(series, dict) or not series:
        raise InputError("series", "give a mapping of label -> y values with at least one series")
    ys = {}
    for label, values in series.items():
        try:
            y = np.asarray(values, dtype=float)
        except (TypeError, ValueError):
            raise InputError("series", f"the values of {str(label)!r} are not numbers") from None
        if y.shape != xs.shape:
            raise InputError("series", f"{str(label)!r} has {y.size} values for {xs.size} x "
                             "values; give one y value per x value")
        ys[str(label)] = y
    lines = _limit_values(hlines, "hlines", "level")
    _check_size(width, height)
    return xs, ys, lines


def _line_x_range(xs: np.ndarray, log_x) -> tuple[float, float, list, bool]:
    """Ends and labelled ticks of a line plot's x axis, and whether it is logarithmic
    (only when asked and two different positive values exist)."""
    finite_x = xs[np.isfinite(xs)]
    if finite_x.size == 0:
        x_lo, x_hi = 0.0, 1.0
    else:
        x_lo, x_hi = float(finite_x.min()), float(finite_x.max())
    if x_hi <= x_lo:
        pad = abs(x_lo) * 0.5 or 1.0
        x_lo, x_hi = x_lo - pad, x_hi + pad
    positive_x = finite_x[finite_x > 0]
    if log_x and positive_x.size >= 2 and positive_x.max() > positive_x.min():
        x_lo, x_hi = float(positive_x.min()), float(positive_x.max())
        major, _ = log_ticks(x_lo, x_hi)
        x_ticks = [t for t in major if x_lo * (1 - 1e-9) <= t <= x_hi * (1 + 1e-9)]
        return x_lo, x_hi, [(t, tick_label(t)) for t in x_ticks], True
    x_ticks = nice_ticks(x_lo, x_hi, 7)
    x_step = x_ticks[1] - x_ticks[0] if len(x_ticks) > 1 else 1.0
    x_ticks = [t for t in x_ticks
               if x_lo - 1e-9 * abs(x_step) <= t <= x_hi + 1e-9 * abs(x_step)]
    return x_lo, x_hi, [(t, tick_label(t, x_step)) for t in x_ticks], False


def _line_segments(xs, y, keep, px, py, f: _Frame, log_x, log_y) -> list[list[str]]:
    """The points of one series, broken where a value cannot be drawn; on a
    logarithmic y axis values off its ends run just past the plot area."""
    top, plot_h = f.top, f.plot_h
    segments, current = [], []
    for i in keep:
        xv, yv = xs[i], y[i]
        if (not math.isfinite(xv) or math.isnan(yv) or (log_x and not xv > 0)
                or (not log_y and not math.isfinite(yv))):
            if current:
                segments.append(current)
            current = []
            continue
        yp = py(yv) if not (log_y and yv == math.inf) else top - 12.0
        yp = min(yp, top + plot_h + 12.0)
        current.append(f"{_coordinate(px(xv))},{_coordinate(yp)}")
    if current:
        segments.append(current)
    return segments


def line_plot_svg(x, series: dict, *, x_label: str, y_label: str, title: str,
                  hlines: dict | None = None, log_y: bool = False, width: int = 720,
                  height: int = 360, log_x: bool = False) -> str:
    """A line plot as a self-contained SVG document.

    Parameters
    ----------
    x : array_like
        Shared x values of every series, one-dimensional.
    series : dict
        Label -> y values, one per x value. NaN breaks a line; on a logarithmic
        axis, values at or below zero (or below the lowest decade shown) run off
        the bottom of the plot.
    x_label, y_label, title : str
        Axis labels with their units, and the plot title.
    hlines : dict, optional
        Label -> y value of horizontal dashed limit lines, labelled in place.
        Their values are kept inside the y range.
    log_y : bool
        Logarithmic y axis (at most `MAX_LOG_DECADES` decades below the top), for
        concentrations that span decades.
    width, height : int
        Size. [px]
    log_x : bool
        Logarithmic x axis (for downwind distances from a pool's edge to
        kilometres); x values at or below zero are left out.

    Returns
    -------
    str
        SVG markup (no XML declaration), the same for the same input.

    Raises
    ------
    InputError
        "x", "series", "hlines" or "width", saying what is wrong.

    Examples
    --------
    >>> svg = line_plot_svg([0, 1, 2], {"room": [0, 5, 3]}, x_label="time [min]",
    ...                     y_label="ppm", title="A & B", hlines={"TWA 4 ppm": 4})
    >>> svg.startswith("<svg") and "A &amp; B" in svg
    True
    """
    xs, ys, lines = _validate(x, series, hlines, width, height)
    labels = list(ys)
    f = _frame(labels, width, height)
    x_lo, x_hi, x_labelled, logarithmic_x = _line_x_range(xs, log_x)
    if not logarithmic_x:
        log_x = False
    px = _scale(x_lo, x_hi, f.left, f.plot_w, log=log_x)
    values = np.concatenate([y[np.isfinite(y) & np.isfinite(xs)] for y in ys.values()]
                            + [np.array(list(lines.values()), dtype=float)])
    y_lo, y_hi, y_labelled, y_minor, note = (
        _log_range(values) if log_y else _linear_range(values, 5, margin=True))
    py = _scale(y_lo, y_hi, f.top + f.plot_h, -f.plot_h, log=log_y,
                off=f.top + f.plot_h + 12.0)

    clip_id = _clip_id((title, x_label, y_label, repr(sorted(lines.items())), repr(labels),
                        str(log_y) + str(log_x), f"{width}x{height}"), [xs, *ys.values()])
    out = _head(f, title, f"{_text(y_label)} against {_text(x_label)}"
                + ("; logarithmic y axis" if log_y else "")
                + ("; logarithmic x axis" if log_x else ""), clip_id)
    out += _grid_and_ticks(f, px, py, y_labelled, x_labelled, y_minor=y_minor)
    _axis_labels(out, f, x_label, y_label)
    _limits(out, clip_id, *_hline_tags(f, lines, py))
    keep = _thin(xs, list(ys.values()), MAX_PLOT_POINTS)
    drawn = [(k, label, _line_segments(xs, y, keep, px, py, f, log_x, log_y))
             for k, (label, y) in enumerate(ys.items())]
    _series_paths(out, clip_id, [item for item in drawn if item[2]])
    _legend(out, f)
    if note:
        out.append(f'<text x="{_coordinate(f.left + f.plot_w / 2)}" '
                   f'y="{_coordinate(f.top + f.plot_h / 2)}" text-anchor="middle" '
                   f'fill="#555555">{_text(note)}</text>')
    out.append("</svg>")
    return "\n".join(out) + "\n"


# --------------------------------------------------------------------------
# cumulative distribution of samples


def _finite_sorted(values, label: str) -> tuple[np.ndarray, int]:
    """Sorted samples without NaN (infinite ones kept), and how many NaN were dropped."""
    try:
        a = np.asarray(values, dtype=float)
    except (TypeError, ValueError):
        raise InputError("samples", f"the samples of {label!r} are not numbers") from None
    if a.ndim != 1:
        raise InputError("samples", f"the samples of {label!r} must be one-dimensional")
    kept = a[~np.isnan(a)]
    if not np.any(np.isfinite(kept)):
        raise InputError("samples", f"{label!r} has no finite sample; give at least one")
    return np.sort(kept), int(a.size - kept.size)


def cumulative_points(samples, max_points: int = MAX_PLOT_POINTS,
                      log_x: bool = False) -> tuple[np.ndarray, np.ndarray]:
    """Points that draw the empirical cumulative distribution of samples.

    The empirical cumulative distribution F(x) is the fraction of samples at or
    below x (NaN samples are left out of the count). It is a staircase rising
    by 1/n at each sample; with few distinct values the staircase is returned
    exactly, otherwise a polyline through at most about `max_points` of its
    corners, chosen evenly in rank and evenly along the x axis (logarithmically
    when `log_x`), with a vertical jump kept wherever many samples share one
    value, so the shape survives.

    Parameters
    ----------
    samples : array_like
        One-dimensional samples. [any unit]
    max_points : int
        Points returned at most (a few more for large tied groups), 20 or more.
    log_x : bool
        Space the points evenly in log x (for a logarithmic axis).

    Returns
    -------
    (numpy.ndarray, numpy.ndarray)
        x [unit of the samples] and F [-], starting at F = 0 at the smallest
        finite sample; infinite samples count in F but are not drawn.

    Raises
    ------
    InputError
        "samples" when there are no finite samples or they are not numbers;
        "max_points" below 20.

    Examples
    --------
    >>> x, f = cumulative_points([3.0, 1.0, 2.0, 2.0])
    >>> x.tolist(), f.tolist()
    ([1.0, 1.0, 2.0, 2.0, 3.0, 3.0], [0.0, 0.25, 0.25, 0.75, 0.75, 1.0])
    """
    if isinstance(max_points, bool) or not isinstance(max_points, (int, np.integer)) \
            or max_points < 20:
        raise InputError("max_points", f"{max_points!r}: give a whole number of 20 or more")
    ordered, _ = _finite_sorted(samples, "samples")
    n = ordered.size
    values, counts = np.unique(ordered, return_counts=True)
    fraction = np.cumsum(counts) / n
    finite = np.isfinite(values)
    before = np.concatenate(([0.0], fraction[:-1]))
    values, fraction, before = values[finite], fraction[finite], before[finite]
    m = values.size
    if 2 * m <= max_points:
        x = np.repeat(values, 2)
        y = np.empty(2 * m)
        y[0::2] = before
        y[1::2] = fraction
        return x, y
    half = max(2, max_points // 2)
    keep = set(np.linspace(0, m - 1, half).round().astype(int).tolist())
    if log_x and values[-1] > 0:
        positive = values[values > 0]
        edges = np.geomspace(positive[0], positive[-1], half)
    else:
        edges = np.linspace(values[0], values[-1], half)
    keep.update((np.searchsorted(values, edges, side="right") - 1).clip(0, m - 1).tolist())
    tied = np.flatnonzero(fraction - before > 1.0 / max_points)  # fewer than max_points
    keep.update(tied.tolist())
    keep.update((tied[tied > 0] - 1).tolist())
    index = np.array(sorted(keep))
    big = fraction[index] - before[index] > 1.0 / max_points
    big[0] = True  # the curve starts from F = 0 at the smallest sample
    x = np.concatenate([values[index], values[index[big]]])
    y = np.concatenate([fraction[index], before[index[big]]])
    order = np.lexsort((y, x))
    return x[order], y[order]



def _samples_of(samples) -> tuple[dict, int]:
    """Label -> sorted samples without NaN, and how many NaN samples were left out."""
    if not isinstance(samples, dict) or not samples:
        raise InputError("samples", "give a mapping of label -> samples with at least one "
                         "series")
    series = {}
    dropped = 0
    for label, values in samples.items():
        ordered, missing = _finite_sorted(values, str(label))
        series[str(label)] = ordered
        dropped += missing
    return series, dropped


def _cumulative_curves(series: dict, px, py, log_x) -> list:
    """(place, label, points) of each series' cumulative curve that has points to draw."""
    drawn = []
    for k, (label, ordered) in enumerate(series.items()):
        xs, fs = cumulative_points(ordered, MAX_PLOT_POINTS, log_x)
        if log_x:
            visible = xs > 0
            xs, fs = xs[visible], fs[visible]
        if xs.size == 0:
            continue
        drawn.append((k, label, [[f"{_coordinate(px(float(xv)))},{_coordinate(py(float(fv)))}"
                                  for xv, fv in zip(xs, fs)]]))
    return drawn


def cumulative_plot_svg(samples: dict, *, x_label: str, title: str,
                        vlines: dict | None = None, log_x: bool = False,
                        y_label: str = "fraction of samples at or below",
                        width: int = 720, height: int = 360) -> str:
    """The empirical cumulative distribution of samples as a self-contained SVG document.

    For every series the curve gives, at each x, the fraction of its samples at
    or below x (`cumulative_points`); where a curve crosses a vertical limit
    line, one minus its height is the probability of exceeding that limit.
    Long series are thinned to at most about `MAX_PLOT_POINTS` points keeping the
    shape. Styles follow `line_plot_svg`: colour and dash tell series apart,
    limit lines are thin, dashed, dark red and labelled in place, all text is
    escaped, and the same input gives the same output byte for byte.

    Parameters
    ----------
    samples : dict
        Label -> one-dimensional samples (NaN left out; at least one finite).
    x_label, title : str
        Axis label with its unit, and the plot title.
    vlines : dict, optional
        Label -> x value of vertical dashed limit lines. They are kept inside
        the x range (on a logarithmic axis, down to `MAX_LOG_DECADES` decades
        below the top; a line lower still is named in a note).
    log_x : bool
        Logarithmic x axis, for concentrations that span decades. Samples at or
        below zero count in the fractions but are not drawn.
    y_label : str
        Label of the y axis (0 to 1).
    width, height : int
        Size. [px]

    Returns
    -------
    str
        SVG markup (no XML declaration).

    Raises
    ------
    InputError
        "samples", "vlines" or "width"/"height", saying what is wrong.

    Examples
    --------
    >>> svg = cumulative_plot_svg({"room <1>": [1.0, 2.0, 4.0]}, x_label="ppm",
    ...                           title="TWA & peak", vlines={"TWA 3 ppm": 3.0})
    >>> svg.startswith("<svg") and "TWA &amp; peak" in svg and "room &lt;1&gt;" in svg
    True
    """
    series, dropped = _samples_of(samples)
    lines = _limit_values(vlines, "vlines", "position")
    _check_size(width, height)
    labels = list(series)
    f = _frame(labels, width, height)
    finite = np.concatenate([a[np.isfinite(a)] for a in series.values()]
                            + [np.array(list(lines.values()), dtype=float)])
    x_lo, x_hi, x_labelled, x_minor, note = (
        _log_range(finite) if log_x else _linear_range(finite, 7, margin=False))
    px = _scale(x_lo, x_hi, f.left, f.plot_w, log=log_x, off=f.left - 12.0)
    py = _scale(0.0, 1.0, f.top + f.plot_h, -f.plot_h)
    notes = [note] if note else []
    below = [label for label, v in lines.items() if px(v) < f.left - 0.5]
    if below:
        notes.append("left of the axis: " + "; ".join(below))
    if dropped:
        notes.append(f"{dropped} sample(s) that are not numbers (NaN) left out")

    clip_id = _clip_id(("cumulative", title, x_label, y_label, repr(sorted(lines.items())),
                        repr(labels), str(log_x), f"{width}x{height}"), series.values())
    out = _head(f, title, f"Cumulative distribution: {_text(y_label)} each value of "
                f"{_text(x_label)}" + ("; logarithmic x axis" if log_x else ""), clip_id)
    y_labelled = [(t, tick_label(t, 0.2)) for t in nice_ticks(0.0, 1.0, 5)]
    out += _grid_and_ticks(f, px, py, y_labelled, x_labelled, x_minor=x_minor)
    _axis_labels(out, f, x_label, y_label)
    _limits(out, clip_id, *_vline_tags(f, lines, px))
    _series_paths(out, clip_id, _cumulative_curves(series, px, py, log_x))
    _legend(out, f)
    for i, note in enumerate(notes):
        out.append(f'<text x="{_coordinate(f.left + 8)}" y="{_coordinate(f.top + 16 + 15 * i)}" '
                   f'fill="#555555">{_text(note)}</text>')
    out.append("</svg>")
    return "\n".join(out) + "\n"
