"""The text of a safety data sheet: from a file, bytes or a PDF's text layer, cleaned,
and cut at its section headings.

A sheet is UTF-8 text (a ``.txt`` file, pasted text or uploaded bytes) or a PDF
with a text layer, read by pypdf (imported only when a PDF is read). The section
headings follow the 16 sections of the GHS (UN, *Globally Harmonized System of
Classification and Labelling of Chemicals*, Annex 4); the composition is in
section 3, or in section 2 on older sheets.
"""

from __future__ import annotations

import io
import re
from pathlib import Path

from ..errors import InputError

#: Largest sheet read, text or PDF. [bytes] A safety data sheet is 10-20 pages.
MAX_SDS_BYTES = 10_000_000

_SECTION_WORDS = {
    1: ("identification",), 2: ("hazard", "composition", "ingredient"),
    3: ("composition", "ingredient", "hazard"), 4: ("first",), 5: ("fire",),
    6: ("accidental", "release"), 7: ("handling", "storage"), 8: ("exposure", "protection"),
    9: ("physical", "chemical", "propert"), 10: ("stability", "reactivity"),
    11: ("toxicolog",), 12: ("ecolog",), 13: ("disposal",), 14: ("transport",),
    15: ("regulatory",), 16: ("other",),
}
_HEADER = re.compile(r"^\s*(?:section\s*(\d{1,2})\s*[:.)-]?|(\d{1,2})\s*(?:[:.)]|\s-))"
                     r"\s*([A-Za-z].*)$", re.IGNORECASE)


def _decode(data: bytes, name: str) -> str:
    if data.startswith(b"\xef\xbb\xbf"):
        data = data[3:]
    if data.startswith((b"\xff\xfe", b"\xfe\xff")):
        try:
            return data.decode("utf-16")
        except UnicodeDecodeError:
            pass
    try:
        return data.decode("utf-8")
    except UnicodeDecodeError:
        raise InputError("safety data sheet", f"{name} is not UTF-8 text (perhaps saved as "
                         "Windows-1252 or Latin-1); save it as UTF-8 and read it again, or "
                         "read the PDF itself") from None


def _pdf_text(data: bytes, name: str) -> str:
    try:
        from pypdf import PdfReader
        from pypdf.errors import PdfReadError
    except ImportError:  # pragma: no cover - pypdf is a core dependency
        raise InputError("safety data sheet", "reading a PDF needs the pypdf package: "
                         "pip install pypdf") from None
    try:
        reader = PdfReader(io.BytesIO(data))
        if reader.is_encrypted and not reader.decrypt(""):
            raise InputError("safety data sheet", f"{name} is password-protected; save an "
                             "unprotected copy, or paste the text")
        pages = [page.extract_text() or "" for page in reader.pages]
    except InputError:
        raise
    except (PdfReadError, ValueError, KeyError, TypeError, OSError, IndexError) as exc:
        raise InputError("safety data sheet", f"{name} could not be read as a PDF ({exc}); "
                         "open it and copy the text into a .txt file, or paste it") from None
    text = "\n".join(pages)
    if len(re.sub(r"\s", "", text)) < 20:
        raise InputError("safety data sheet", f"{name} has no text layer (it is a scanned "
                         "image); ask the supplier for the electronic sheet, or run it "
                         "through text recognition (OCR), check the result and paste the text")
    return text


def sheet_text(source) -> tuple[str, str]:
    """(text, name) of a sheet given as text, a path or bytes, within `MAX_SDS_BYTES`."""
    if isinstance(source, (bytes, bytearray)):
        data, name = bytes(source), "the sheet"
    elif isinstance(source, Path) or (isinstance(source, str) and "\n" not in source
                                      and len(source) < 1024
                                      and re.search(r"\.[A-Za-z0-9]{1,5}$", source.strip())):
        path = Path(source)
        name = path.name
        if path.suffix.lower() not in (".txt", ".pdf", ".text"):
            raise InputError("safety data sheet", f"{name}: give a .txt or .pdf file")
        try:
            size = path.stat().st_size
        except OSError as exc:
            raise InputError("safety data sheet", f"cannot read {name}: "
                             f"{exc.strerror}") from None
        if size > MAX_SDS_BYTES:
            raise InputError("safety data sheet", f"{name} is {size:,} bytes; a safety data "
                             f"sheet is at most {MAX_SDS_BYTES:,} bytes (split it or save "
                             "only the text)")
        try:
            data = path.read_bytes()
        except OSError as exc:
            raise InputError("safety data sheet", f"cannot read {name}: "
                             f"{exc.strerror}") from None
    elif isinstance(source, str):
        if len(source.encode("utf-8", "replace")) > MAX_SDS_BYTES:
            raise InputError("safety data sheet", f"the text is longer than {MAX_SDS_BYTES:,} "
                             "bytes; paste only the sheet")
        return source, "pasted text"
    else:
        raise InputError("safety data sheet", "give the sheet's text, or a .txt or .pdf file")
    if len(data) > MAX_SDS_BYTES:
        raise InputError("safety data sheet", f"{name} is {len(data):,} bytes; a safety data "
                         f"sheet is at most {MAX_SDS_BYTES:,} bytes")
    if not data.strip():
        raise InputError("safety data sheet", f"{name} is empty; give the sheet's text or "
                         "the PDF from the supplier")
    if data.lstrip()[:5] == b"%PDF-":
        return _pdf_text(data, name), name
    return _decode(data, name), name


def clean_text(text: str) -> str:
    """The text with typographic signs made plain (≥ as >=, dashes as -, °C...)."""
    table = {"\u2265": ">=", "\u2264": "<=", "\u2013": "-", "\u2014": "-", "\u2011": "-",
             "\u2212": "-", "\u00ba": "°", "\u02da": "°", "\uff05": "%", "\u00a0": " ",
             "\u2009": " ", "\u202f": " ", "\u2103": "°C", "\u2109": "°F", "\r": "",
             "\u00b3": "3", "\u2032": "'"}
    for a, b in table.items():
        text = text.replace(a, b)
    text = re.sub(r"=\s*>", ">=", text)
    text = re.sub(r"=\s*<", "<=", text)
    text = re.sub(r"(?<=\d)\s*deg(?:rees?)?\.?\s*([CFK])\b", r" °\1", text, flags=re.I)
    return text


# ------------------------------------------------------------- sections

def find_sections(lines: list[str]) -> dict[int, tuple[int, int, str]]:
    """Section number -> (first line, end line, title), first occurrence of each."""
    heads = []
    for i, line in enumerate(lines):
        m = _HEADER.match(line.strip())
        if not m:
            continue
        number, title = int(m.group(1) or m.group(2)), m.group(3).lower()
        if number in _SECTION_WORDS and any(w in title for w in _SECTION_WORDS[number]) \
                and len(title) < 120:
            heads.append((i, number, m.group(3).strip()))
    out = {}
    for k, (i, number, title) in enumerate(heads):
        end = heads[k + 1][0] if k + 1 < len(heads) else len(lines)
        out.setdefault(number, (i + 1, end, title))
    return out


def composition_lines(lines, sections, notes) -> tuple[list[str], str]:
    """The lines of the composition section and where it is ("section 3" or "section 2")."""
    for number in (3, 2):
        if number in sections:
            start, end, title = sections[number]
            low = title.lower()
            if "composition" in low or "ingredient" in low:
                return lines[start:end], f"section {number}"
    raise InputError("safety data sheet", "no composition section was found (section 3, "
                     "'Composition/information on ingredients', or section 2 on older "
                     "sheets); check that this is the whole safety data sheet, or enter "
                     "the mixture by hand")


def product_name(lines: list[str], sections) -> str | None:
    """The product name given before section 2, or None."""
    end = sections[2][0] if 2 in sections else min(len(lines), 40)
    for line in lines[:end]:
        m = re.match(r"^\s*(?:product\s*(?:name|identifier)|trade\s*name|name\s+of\s+the\s+"
                     r"product)\s*[:\-]?\s*(.+)$", line, re.I)
        if m and m.group(1).strip(" :"):
            return m.group(1).strip(" :")
    return None



