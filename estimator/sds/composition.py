"""The composition section: each ingredient line read by its CAS number and range, and
the shares that stay unidentified (trade secrets, unknown numbers, the remainder)."""

from __future__ import annotations

import re
from dataclasses import dataclass

from ..substances import Substance
from .cas import CAS_NUMBER, ISOMER_MIXTURES, cas_checksum_ok, resolve_cas
from .values import NUMBER, basis_of, find_range, strip_noise


_SECRET = re.compile(r"trade\s*secret|proprietary|confidential|withheld|not\s+disclosed|"
                     r"\bcbi\b|undisclosed", re.IGNORECASE)


@dataclass(frozen=True)
class SdsIngredient:
    """One ingredient line of a sheet.

    Attributes
    ----------
    cas : str
        CAS number as written, "" when the sheet gives none.
    name : str
        The ingredient's name on the sheet (or the known substance's name).
    low, high : float
        The stated range as fractions of the whole, 0-1. [-]
    basis : str
        "mass" unless the sheet says volume or mole.
    substance : Substance or None
        The substance the CAS number resolves to (None for unidentified shares).
    reason : str
        Why an unidentified share is unidentified.
    line : str
        The line of the sheet it was read from.
    """

    cas: str
    name: str
    low: float
    high: float
    basis: str = "mass"
    substance: Substance | None = None
    reason: str = ""
    line: str = ""

    @property
    def mid(self) -> float:
        """Midpoint of the range. [-]"""
        return 0.5 * (self.low + self.high)


def _name(text: str) -> str:
    text = re.sub(r"^\s*(?:chemical|substance|component|ingredient|product)?\s*name\s*:\s*",
                  "", text.strip(), flags=re.I)
    text = re.sub(r"(?:\s+|\|)(?:trade\s*secret|proprietary|withheld|confidential|"
                  r"not\s+(?:available|disclosed)|n/?a|-)\s*[|;]?\s*$", "", text.strip(),
                  flags=re.I)
    text = re.sub(r"\b(?:CAS(?:[- ]?(?:No|Number|RN|#))?\.?|EC(?:[- ]?No)?\.?|"
                  r"Index(?:[- ]?No)?\.?)\s*[:#]?\s*$", "", text.strip(), flags=re.I)
    text = re.sub(r"[|;:\t]+", " ", text)
    text = re.sub(r"\s{2,}", " ", text).strip(" -*,.")
    return text


def read_composition(lines: list[str], notes: list[str]):
    """The ingredient lines of the composition section: (found, unknown), found as
    (cas, name, low, high, basis, line) tuples and unknown as unidentified
    `SdsIngredient` shares; what could not be read goes to `notes`."""
    section = "\n".join(lines)
    section_basis = basis_of(section)
    basis = section_basis or "mass"
    if section_basis is None:
        notes.append("the sheet does not say whether its percentages are by mass, volume "
                     "or mole: taken as mass % (what safety data sheets usually give)")
    # a table whose values carry no % sign (the unit in its header) is read without
    need_percent = bool(re.search(rf"{NUMBER}\s*%", section))
    found, unknown = [], []
    used: set[int] = set()
    for k, raw in enumerate(lines):
        line = raw.strip()
        if not line or k in used:
            continue
        m = CAS_NUMBER.search(line)
        if m is None:
            item = _unnumbered_ingredient(line, need_percent, basis, notes)
            if item is not None:
                unknown.append(item)
            continue
        name, hit = _numbered_ingredient(lines, k, line, m, need_percent, used)
        cas = m.group(1)
        if hit is None:
            notes.append(f"could not read a concentration on the line {line!r}; the "
                         f"ingredient {cas} was left out: enter it by hand")
            continue
        lo, hi, _ = hit
        found.append((cas, name or cas, lo, hi, basis_of(line) or basis, line))
    return found, unknown


def _numbered_ingredient(lines, k, line, m, need_percent, used):
    """The name and range (or None) of the ingredient on line `k`, whose first CAS
    number is the match `m`; a range on one of the next lines is taken (that line's
    number added to `used`) when the line has none."""
    before, after = line[:m.start()], line[m.end():]
    cleaned = strip_noise(CAS_NUMBER.sub(" ", after))
    hit = find_range(cleaned, True) or find_range(cleaned, False)
    j = k + 1
    while hit is None and j < min(k + 6, len(lines)) and not CAS_NUMBER.search(lines[j]):
        nxt = strip_noise(lines[j])
        if len(re.findall(r"[A-Za-z]{2,}", nxt)) <= 4:
            hit = find_range(nxt, True) or find_range(nxt, False, False)
        if hit is not None:
            used.add(j)
        j += 1
    name = _name(before)
    if not name:
        head = cleaned if hit is None else cleaned[:cleaned.find(hit[2])]
        name = _name(re.sub(r"\d", " ", head)) if re.search("[A-Za-z]{3}", head) else ""
    if not name and k > 0 and not CAS_NUMBER.search(lines[k - 1]) \
            and find_range(lines[k - 1], need_percent) is None:
        name = _name(lines[k - 1])
    return name, hit


def _unnumbered_ingredient(line, need_percent, basis, notes):
    """An ingredient line without a CAS number as an unidentified share, or None
    (no range, or a sentence, noted)."""
    stripped = strip_noise(line)
    hit = None if re.match(r"^\s*\d+(?:\.\d+)+\s", line) else (
        find_range(stripped, True) or find_range(stripped, need_percent, False))
    if hit is None:
        if _SECRET.search(line):
            notes.append(f"the sheet says: {line!r}")
        return None
    words = re.findall(r"[A-Za-z]{2,}", line)
    sentence = (len(words) > 12 or (line.endswith(".") and len(words) > 3)
                or re.search(r"\b(?:are|is|were|been|may|shall)\b", line, re.I))
    if sentence:
        notes.append(f"not read as an ingredient (a sentence): {line!r}")
        return None
    lo, hi, text = hit
    name = _name(line[:line.find(text)] if text in line else line) or "unnamed ingredient"
    reason = ("withheld as a trade secret" if _SECRET.search(line)
              else "no CAS number given")
    return SdsIngredient("", name, lo, hi, basis_of(line) or basis, None, reason, line)


def resolve_ingredients(found, unknown, notes):
    """(components, unidentified): each CAS number checked and resolved (isomer
    mixtures kept whole), the rest and the unlisted remainder as unidentified shares."""
    components, unidentified = list(), list(unknown)
    for cas, name, lo, hi, basis, line in found:
        if not cas_checksum_ok(cas):
            notes.append(f"CAS number {cas} ({name}) has a wrong check digit: kept as an "
                         "unidentified share; check it against the sheet")
            unidentified.append(SdsIngredient(cas, name, lo, hi, basis, None,
                                              "CAS number with a wrong check digit", line))
            continue
        if cas in ISOMER_MIXTURES:
            label, parts, source = ISOMER_MIXTURES[cas]
            subs = [resolve_cas(c) for c, _ in parts]
            if all(s is not None for s in subs):
                notes.append(f"{cas} ({name}) names an isomer mixture ({label}); split by "
                             f"default as {source}")
                components.append(SdsIngredient(cas, name, lo, hi, basis, None,
                                                "isomer mixture", line))
                continue
        sub = resolve_cas(cas)
        if sub is None:
            notes.append(f"CAS number {cas} ({name}) is not known to the property data: kept "
                         "as an unidentified share with its range")
            unidentified.append(SdsIngredient(cas, name, lo, hi, basis, None,
                                              "CAS number not known to the property data",
                                              line))
            continue
        if sub.origin == "lookup":
            notes.extend(sub.notes)
        components.append(SdsIngredient(cas, name or sub.name, lo, hi, basis, sub, "", line))
    for item in unidentified:
        if item.reason == "withheld as a trade secret":
            notes.append(f"{item.name}: {100 * item.low:g}-{100 * item.high:g} % withheld as "
                         "a trade secret; kept as an unidentified share")
    lows = sum(i.low for i in components + unidentified)
    highs = sum(i.high for i in components + unidentified)
    if components or unidentified:
        if highs < 1.0 - 1e-6:
            rest = SdsIngredient("", "remainder not listed on the sheet",
                                 max(0.0, 1.0 - highs), min(1.0, 1.0 - lows),
                                 (components + unidentified)[0].basis, None,
                                 "the listed ranges reach at most "
                                 f"{100 * highs:.4g} %; the rest is not listed", "")
            unidentified.append(rest)
            notes.append(f"the listed ingredients add up to at most {100 * highs:.4g} %: the "
                         f"remainder ({100 * rest.low:.4g}-{100 * rest.high:.4g} %) is kept "
                         "as an unidentified share")
        if lows > 1.0 + 1e-6:
            notes.append(f"the lower ends of the ranges add up to {100 * lows:.4g} %, more "
                         "than 100 %: the ranges cannot all hold; check the sheet")
    return tuple(components), tuple(unidentified)
