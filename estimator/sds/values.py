"""Numbers, concentration ranges, composition bases and temperatures as a sheet writes them.

"40 - 60 %", ">= 50 - < 70", "< 1 %", "5,5", "110 - 140 °C", "100 °F": each is read
into fractions or kelvin. Identifiers that look like numbers (EC and index numbers,
REACH registrations, hazard statements, M-factors) are stripped first.
"""

from __future__ import annotations

import re


NUMBER = r"\d+(?:[.,]\d+)?"
NO_VALUE = re.compile(r"not\s+(?:available|applicable|determined|established|known)|"
                      r"no\s+data|\bn/?a\b|not\s+relevant|none\b", re.IGNORECASE)


def read_number(text: str) -> float:
    """A number as written, with a decimal comma ("5,5") or thousands commas."""
    if re.fullmatch(r"\d+,\d{1,2}", text) or re.fullmatch(r"\d+,\d{4,}", text):
        text = text.replace(",", ".")
    return float(text.replace(",", ""))


_RANGE = re.compile(
    rf"(?P<op1>>=|<=|>|<)?\s*(?P<a>{NUMBER})\s*(?P<p1>%)?\s*(?:-|to)\s*(?P<op2>>=|<=|>|<)?"
    rf"\s*(?P<b>{NUMBER})\s*(?P<p2>%)?", re.IGNORECASE)
_UPPER = re.compile(rf"(?P<op><=|<)\s*(?P<a>{NUMBER})\s*(?P<p>%)?")
_LOWER = re.compile(rf"(?P<op>>=|>)\s*(?P<a>{NUMBER})\s*(?P<p>%)?")
_SINGLE = re.compile(rf"(?<![\d.,-])(?P<a>{NUMBER})\s*(?P<p>%)?(?![\d.,]|\s*-\s*\d)")
_NOISE = [
    re.compile(r"(?<![\d-])\d{3}-\d{3}-\d{2}-\d(?![\d-])"),           # EU index numbers
    re.compile(r"(?<![\d-])\d{3}-\d{3}-\d(?![\d-])"),                  # EC numbers
    re.compile(r"\b\d{2}-\d{10}-\d{2}(?:-[0-9A-Za-z]+)?\b"),           # REACH registration
    re.compile(r"\bEUH\d{3}\b|\bH\d{3}[A-Za-z]*\b|\bP\d{3}\b", re.I),   # statements
    re.compile(r"\bM\s*=\s*\d+\b"),                                    # M-factors
    re.compile(r"\b(?:cat(?:egory)?\.?)\s*\d[A-Za-z]?\b", re.I),
    re.compile(r"\b[A-Z][A-Za-z]*\.?(?:\s+[A-Z][A-Za-z]*\.?){0,2}\s+\d[A-Za-z]?\b(?!\s*[%.,\d-])"),
    re.compile(r"\(\s*(?:V|v|vol\.?|w/w|v/v|wt\.?)\s*\)"),
]


def _fraction(value: str) -> float:
    return read_number(value) / 100.0


def find_range(text: str, need_percent: bool, allow_single: bool = True):
    """(low, high, matched text) of a concentration range in `text`, or None.

    With `need_percent`, only values with a % sign count; a bare single number
    counts only with `allow_single`.
    """
    patterns = (_RANGE, _UPPER, _LOWER, _SINGLE) if allow_single or need_percent \
        else (_RANGE, _UPPER, _LOWER)
    for pattern in patterns:
        for m in pattern.finditer(text):
            d = m.groupdict()
            has_percent = bool(d.get("p") or d.get("p1") or d.get("p2"))
            if need_percent and not has_percent:
                continue
            if pattern is _RANGE:
                lo, hi = _fraction(d["a"]), _fraction(d["b"])
                if hi < lo:
                    continue
            elif pattern is _UPPER:
                lo, hi = 0.0, _fraction(d["a"])
            elif pattern is _LOWER:
                lo, hi = _fraction(d["a"]), 1.0
            else:
                lo = hi = _fraction(d["a"])
            if not 0.0 <= lo <= hi <= 1.0 or hi == 0.0:
                continue
            return lo, hi, m.group(0)
    return None


def strip_noise(text: str) -> str:
    """The text without identifiers that look like numbers (EC, index, REACH numbers,
    hazard statements, M-factors, categories)."""
    for pattern in _NOISE:
        text = pattern.sub(" ", text)
    return text


def basis_of(text: str) -> str | None:
    """The basis the text names ("volume", "mole" or "mass"), or None."""
    low = text.lower()
    if re.search(r"v\s*/\s*v|vol(?:ume)?\.?\s*%|%\s*(?:by\s+)?vol|\(v\)", low):
        return "volume"
    if re.search(r"mol(?:e)?\.?\s*%|%\s*(?:by\s+)?mol", low):
        return "mole"
    if re.search(r"w\s*/\s*w|wt\.?\s*%|weight|mass|%\s*by\s*wt", low):
        return "mass"
    return None


def read_temperatures(text: str) -> list[float]:
    """Temperatures in `text`, in order, converted to K ("110 - 140 °C" gives both)."""
    out = []
    pattern = re.compile(
        rf"(?P<a>-?\s?{NUMBER})(?:\s*(?:-|to)\s*(?P<b>-?{NUMBER}))?\s*°\s*(?P<u>[CFK])\b"
        rf"|(?P<k>{NUMBER})\s*K\b", re.IGNORECASE)
    for m in pattern.finditer(text):
        if m.group("k"):
            out.append(read_number(m.group("k")))
            continue
        unit = m.group("u").upper()
        values = [m.group("a").replace(" ", "")] + ([m.group("b")] if m.group("b") else [])
        for v in values:
            x = read_number(v.lstrip("-")) * (-1 if v.startswith("-") else 1)
            out.append(x + 273.15 if unit == "C" else (x - 32) * 5 / 9 + 273.15
                       if unit == "F" else x)
    return out
