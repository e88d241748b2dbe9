"""Safety data sheets: read the composition (section 3, or 2 on older sheets) and the
physical properties (section 9), build the liquid, and screen over the ranges.

A sheet gives each ingredient as a range ("40 - 60 %", ">= 50 - < 70", "< 1 %"),
withholds some as trade secrets, and states a few properties of the product. This
module reads all of that from text, a ``.txt`` file or a ``.pdf`` with a text
layer (`read_sds`), keeps every share it cannot identify, and says in its notes
every assumption and every line it could not read. The reading builds the
`estimator.mixtures.Liquid` used everywhere else, at the normalised midpoints or
at the composition within the ranges that gives the highest headspace hazard,
and checks the sheet's own vapour pressure and flash point against the model.

The layout follows the 16 sections of the GHS (UN, *Globally Harmonized System of
Classification and Labelling of Chemicals*, Annex 4), US OSHA 29 CFR 1910.1200
Appendix D and EU REACH Annex II; older sheets put the composition in section 2.
"""

from __future__ import annotations

import io
import math
import re
from dataclasses import dataclass, field
from pathlib import Path
from types import MappingProxyType

import numpy as np

from .constants import STANDARD_ATMOSPHERE
from .errors import InputError
from .substances import Substance

__all__ = [
    "read_sds",
    "resolve_cas",
    "SdsReading",
    "SdsIngredient",
    "SdsComposition",
    "SdsCheck",
    "inert_substance",
    "ISOMER_MIXTURES",
    "MAX_SDS_BYTES",
    "FLASH_POINT_TOLERANCE",
    "WATER_DENSITY_20C",
    "POINTS",
    "reading_from_ranges",
    "scenario_liquid",
    "sheet_path",
]

#: Largest sheet read, text or PDF. [bytes] A safety data sheet is 10-20 pages.
MAX_SDS_BYTES = 10_000_000

#: Ingredients melting above this are taken as dissolved, non-volatile solids (resins,
#: pigments, additives): solid at ordinary storage temperatures. [K] (40 degC)
SOLID_ABOVE = 313.15

#: Ways of picking one composition within the sheet's ranges.
POINTS = ("mid", "worst")

#: Density of water at 20 degC, the reference for relative density and specific
#: gravity. [kg/m3] IAPWS-95 (998.207 kg/m3 at 20 degC, 101325 Pa).
WATER_DENSITY_20C = 998.2

#: Tolerance of the flash-point cross-check. [K] The estimate (temperature at which
#: the saturated vapour reaches the LFL, `estimator.headspace.estimated_flash_point`)
#: lies within 7 K of the published closed-cup flash point for most pure liquids
#: of the bundled table, with a median 1-4 K below it (ullage's own comparison with
#: IEC 60079-20-1 / NFPA 497 values, tests/test_headspace.py); 3 K more covers the
#: ideal-solution assumption for mixtures, which Liaw et al. (2002) found to
#: predict mixture flash points within a few kelvin for near-ideal mixtures.
FLASH_POINT_TOLERANCE = 10.0

#: Isomer-mixture CAS numbers -> default split (CAS of each part, mass share) and
#: where it comes from.
ISOMER_MIXTURES = MappingProxyType({
    "1330-20-7": (
        "xylene, mixed isomers",
        (("95-47-6", 0.20), ("108-38-3", 0.44), ("106-42-3", 0.20), ("100-41-4", 0.16)),
        "typical commercial mixed xylene: 44 % m-, 20 % o-, 20 % p-xylene and 16 % "
        "ethylbenzene (ATSDR Toxicological Profile for Xylene, 2007, chapter 4; from "
        "memory)"),
    "25551-13-7": (
        "trimethylbenzene, mixed isomers",
        (("95-63-6", 1 / 3), ("108-67-8", 1 / 3), ("526-73-8", 1 / 3)),
        "equal parts of 1,2,4-, 1,3,5- and 1,2,3-trimethylbenzene (a stated convention: "
        "sheets rarely give the split; ask the supplier)"),
    "25340-17-4": (
        "diethylbenzene, mixed isomers",
        (("135-01-3", 1 / 3), ("141-93-5", 1 / 3), ("105-05-5", 1 / 3)),
        "equal parts of o-, m- and p-diethylbenzene (a stated convention: sheets rarely "
        "give the split; ask the supplier)"),
})

_CAS = re.compile(r"(?<![\d-])(\d{2,7}-\d{2}-\d)(?![\d-])")
_NUM = r"\d+(?:[.,]\d+)?"
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
_SECRET = re.compile(r"trade\s*secret|proprietary|confidential|withheld|not\s+disclosed|"
                     r"\bcbi\b|undisclosed", re.IGNORECASE)
_NO_VALUE = re.compile(r"not\s+(?:available|applicable|determined|established|known)|"
                       r"no\s+data|\bn/?a\b|not\s+relevant|none\b", re.IGNORECASE)


# --------------------------------------------------------------------- the reading

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


@dataclass(frozen=True)
class SdsComposition:
    """The composition chosen within the sheet's ranges, and the liquid built from it.

    Attributes
    ----------
    point : str
        "mid" or "worst".
    fractions : mapping
        Ingredient label -> fraction of the whole on `basis`, as chosen. [-]
    basis : str
    liquid : Liquid
    objective : str
        What the worst case maximises ("headspace % LFL", "additive exposure
        index (TWA)", "total vapour"), "" for the midpoint.
    value : float or None
        That quantity for the chosen liquid, re-checked with
        `estimator.headspace.headspace`. [% LFL, -, or ppm]
    temperature, pressure : float or None
        Where the worst case was screened. [K], [Pa]
    notes : tuple of str
    """

    point: str
    fractions: MappingProxyType
    basis: str
    liquid: object
    objective: str = ""
    value: float | None = None
    temperature: float | None = None
    pressure: float | None = None
    notes: tuple[str, ...] = ()


@dataclass(frozen=True)
class SdsCheck:
    """The sheet's own value beside what the model computes from its composition.

    Attributes
    ----------
    quantity : str
        "vapour pressure" or "flash point".
    sheet : float
        The sheet's value. [Pa or K]
    model : float or None
        For the midpoint composition. [Pa or K]
    model_low, model_high : float or None
        Over the composition ranges. [Pa or K]
    tolerance : str
        The tolerance applied, in words.
    agrees : bool or None
        None when the model could not be computed.
    statement : str
        The comparison said plainly.
    """

    quantity: str
    sheet: float
    model: float | None
    model_low: float | None
    model_high: float | None
    tolerance: str
    agrees: bool | None
    statement: str


@dataclass(frozen=True)
class SdsReading:
    """What a safety data sheet says, in SI units.

    Attributes
    ----------
    product : str or None
    components : tuple of SdsIngredient
        Ingredients whose CAS number the property data know.
    unidentified : tuple of SdsIngredient
        Shares with no usable CAS number (trade secrets, proprietary blends,
        unknown CAS numbers, and the remainder the sheet does not list).
    flash_point : float or None
        [K]
    vapor_pressure : tuple of (float, float) or None
        (temperature [K], pressure [Pa]).
    boiling_point : float or None
        Initial boiling point. [K]
    lower_flammability_limit, upper_flammability_limit : float or None
        [volume fraction]
    density : float or None
        [kg/m3]
    notes : tuple of str
        Every assumption and every line that could not be read.
    layout : str
        Where the composition was found ("section 3" or "section 2").
    text : str
        The sheet's text, as read.
    source : str
        File name, or "pasted text".
    """

    product: str | None
    components: tuple[SdsIngredient, ...]
    unidentified: tuple[SdsIngredient, ...]
    flash_point: float | None
    vapor_pressure: tuple[float, float] | None
    boiling_point: float | None
    lower_flammability_limit: float | None
    upper_flammability_limit: float | None
    density: float | None
    notes: tuple[str, ...]
    layout: str = "section 3"
    text: str = field(default="", repr=False)
    source: str = "pasted text"

    @property
    def basis(self) -> str:
        """Composition basis of the sheet ("mass", "volume" or "mole")."""
        for item in self.components + self.unidentified:
            return item.basis
        return "mass"

    def liquid(self, point: str = "mid", *, unidentified="inert", temperature=298.15,
               pressure=STANDARD_ATMOSPHERE, limits=(), limit_kind: str = "TWA"):
        """The `Liquid` of the sheet at a point within its composition ranges.

        Parameters
        ----------
        point : str
            "mid": the normalised midpoints of the ranges. "worst": the composition
            within the ranges that gives the highest headspace % LFL at
            `temperature` (or the highest additive exposure index when `limits`
            are given); see `screen`.
        unidentified : "inert", Substance or str
            How unidentified shares are treated: as an inert, non-volatile diluent
            (default), or as a surrogate substance the user picks (a key, name or
            CAS number).
        temperature : float
            Screening temperature of the worst case. [K]
        pressure : float
            Absolute pressure of the vapour space. [Pa]
        limits : sequence of ExposureLimit
            Exposure limits; with one of `limit_kind` for a component, the worst
            case maximises the additive exposure index instead of % LFL.
        limit_kind : str
            Kind of limit the additive index uses.

        Returns
        -------
        Liquid
            Its warnings state the composition chosen and the treatment of the
            unidentified shares, so that every result built from it says so.
        """
        return self.screen(point, unidentified=unidentified, temperature=temperature,
                           pressure=pressure, limits=limits, limit_kind=limit_kind).liquid

    def screen(self, point: str = "mid", *, unidentified="inert", temperature=298.15,
               pressure=STANDARD_ATMOSPHERE, limits=(), limit_kind: str = "TWA"
               ) -> SdsComposition:
        """The composition chosen within the ranges, with the liquid and the reasons.

        The worst case is a bounded optimisation: with Raoult's law below the
        boiling point, % LFL (Le Chatelier) and the additive exposure index are
        both linear in the liquid's mole fractions, so over mass fractions within
        the ranges (summing to 1) they are linear-fractional, and the
        Charnes-Cooper transformation makes the problem a linear programme
        (`scipy.optimize.linprog`, HiGHS). The result is then re-checked with
        `estimator.headspace.headspace` at the chosen composition.

        Parameters
        ----------
        As for `liquid`.

        Returns
        -------
        SdsComposition

        References
        ----------
        Charnes, A. & Cooper, W.W. (1962), Programming with linear fractional
        functionals, Naval Research Logistics Quarterly 9, 181-186.
        """
        if point not in POINTS:
            raise InputError("point", f"{point!r} is not a point within the ranges; use "
                             "'mid' or 'worst'")
        model = _Model.build(self, unidentified)
        if point == "mid":
            w = model.midpoints()
            liq = model.liquid(w, "normalised midpoints of the sheet's ranges")
            return SdsComposition("mid", model.labelled(w), model.basis, liq,
                                  notes=tuple(liq.warnings))
        return model.worst(temperature, pressure, tuple(limits), limit_kind)

    def composition_ranges(self, unidentified="inert"):
        """The liquid at the midpoints and its composition uncertainty for Monte Carlo.

        Returns
        -------
        (Liquid, mapping, str)
            The midpoint liquid; component -> distribution of its fraction on the
            sheet's basis (`Uniform` within its range, `Fixed` for a single value)
            for `estimator.uncertainty.headspace_monte_carlo`'s ``composition``
            (with ``composition_basis`` the sheet's basis); and the method in words.
        """
        from .uncertainty import Fixed, Uniform

        model = _Model.build(self, unidentified)
        liq = model.liquid(model.midpoints(), "normalised midpoints of the sheet's ranges")
        lows, highs = model.substance_bounds()
        spec = {}
        for sub, lo, hi in zip(model.substances, lows, highs):
            spec[sub] = Fixed(lo) if hi - lo < 1e-12 else Uniform(lo, hi)
        method = ("composition from the safety data sheet's ranges: each component's "
                  f"{model.basis} fraction drawn uniformly within its stated range, "
                  "independently, and every sample scaled to sum to 100 % (so the "
                  "ranges describe relative amounts, and scaling can carry a sample a "
                  "little outside a stated range; point='worst' keeps every range)"
                  + model.treatment_words())
        return liq, MappingProxyType(spec), method

    def monte_carlo(self, temperature, pressure=STANDARD_ATMOSPHERE, *, unidentified="inert",
                    **kwargs):
        """`estimator.uncertainty.headspace_monte_carlo` with the ranges as composition
        uncertainty; the method is stated first in the result's warnings."""
        from .uncertainty import headspace_monte_carlo

        liq, spec, method = self.composition_ranges(unidentified)
        basis = self.basis
        if basis == "volume":
            raise InputError("composition basis", "composition uncertainty by volume is not "
                             "sampled; give the ranges by mass")
        result = headspace_monte_carlo(liq, temperature, pressure, composition=dict(spec),
                                       composition_basis=basis, **kwargs)
        from dataclasses import replace

        return replace(result, warnings=(method,) + tuple(result.warnings))

    def cross_check(self, unidentified="inert", pressure=STANDARD_ATMOSPHERE
                    ) -> tuple[SdsCheck, ...]:
        """Compare the sheet's vapour pressure and flash point with the model.

        The vapour pressure of the liquid built from the composition is
        Raoult's sum at the sheet's temperature, for the midpoints and for the
        lowest and highest values the ranges allow; it disagrees when the sheet's
        value lies outside that span widened by the stated uncertainty of the
        vapour-pressure methods (`relative_uncertainty` of the estimates). The
        flash point is estimated as the temperature where the saturated vapour
        reaches the LFL (`estimator.headspace.estimated_flash_point`), for the
        midpoints and for the compositions with the highest and lowest % LFL at
        the sheet's flash point, and disagrees beyond `FLASH_POINT_TOLERANCE`.

        Returns
        -------
        tuple of SdsCheck
            One per value the sheet gives.
        """
        model = _Model.build(self, unidentified)
        checks = []
        if self.vapor_pressure is not None:
            checks.append(model.check_vapor_pressure(*self.vapor_pressure, pressure))
        if self.flash_point is not None:
            checks.append(model.check_flash_point(self.flash_point, pressure))
        return tuple(checks)

    def to_toml(self, name: str | None = None, *, point: str = "mid",
                unidentified="inert") -> str:
        """The ``[[liquid]]`` block of a scenario file, with the ranges."""
        from .toml_text import toml_key, toml_value

        label = name or self.product or "liquid from safety data sheet"
        lines = [f"# Read from {self.source} by ullage: check every line against the sheet.",
                 "[[liquid]]", f"name = {toml_value(label)}",
                 f"basis = {toml_value(self.basis)}", f"point = {toml_value(point)}"]
        ranges = {}
        for item in self.components:
            ranges[item.cas] = [f"{100 * item.low:.6g} %", f"{100 * item.high:.6g} %"]
        if ranges:
            lines.append("ranges = " + toml_value(ranges))
        unlisted = {}
        for item in self.unidentified:
            label_u = item.name if item.name not in unlisted else f"{item.name} ({item.cas})"
            unlisted[label_u] = [f"{100 * item.low:.6g} %", f"{100 * item.high:.6g} %"]
        if unlisted:
            lines.append("unlisted = " + toml_value(unlisted))
        treat = unidentified if isinstance(unidentified, str) else unidentified.name
        lines.append(f"unidentified_as = {toml_value(treat)}")
        for item in self.components:
            lines.append(f"# {toml_key(item.cas)}: {item.name}")
        return "\n".join(lines) + "\n"

    def summary(self) -> str:
        """What was read, in plain text, with the notes."""
        def kelvin(v):
            return "not given" if v is None else f"{v - 273.15:.1f} °C"

        out = [f"Product: {self.product or 'not given'}  (composition in {self.layout}, "
               f"read from {self.source})", "", f"Ingredients ({self.basis} %):"]
        for item in self.components:
            out.append(f"  {item.cas:<12} {item.name:<34} {100 * item.low:>6.4g} - "
                       f"{100 * item.high:<6.4g}")
        for item in self.unidentified:
            out.append(f"  {item.cas or '(none)':<12} {item.name:<34} {100 * item.low:>6.4g} - "
                       f"{100 * item.high:<6.4g} unidentified: {item.reason}")
        vp = ("not given" if self.vapor_pressure is None else
              f"{self.vapor_pressure[1] / 1000:.4g} kPa at "
              f"{self.vapor_pressure[0] - 273.15:.1f} °C")
        out += ["", "Properties (section 9):",
                f"  flash point            {kelvin(self.flash_point)}",
                f"  vapour pressure        {vp}",
                f"  initial boiling point  {kelvin(self.boiling_point)}",
                "  flammability limits    " + " - ".join(
                    "?" if v is None else f"{100 * v:.3g} %"
                    for v in (self.lower_flammability_limit, self.upper_flammability_limit)),
                "  density                " + ("not given" if self.density is None
                                               else f"{self.density:.4g} kg/m3")]
        if self.notes:
            out += ["", "Notes:"] + [f"  - {n}" for n in self.notes]
        return "\n".join(out)


# ------------------------------------------------------------ CAS numbers

def cas_checksum_ok(cas: str) -> bool:
    """Whether a CAS number's check digit is right (CAS registry rule)."""
    digits = cas.replace("-", "")
    body, check = digits[:-1], int(digits[-1])
    return sum((i + 1) * int(d) for i, d in enumerate(reversed(body))) % 10 == check


def resolve_cas(cas: str) -> Substance | None:
    """The substance of a CAS number: the bundled table, then any CAS through
    `estimator.substances.lookup_cas`; None if the property data do not know it."""
    from .substances import lookup_cas, substance

    try:
        return substance(cas, "cas")
    except InputError:  # unknown to the table (UnknownSubstanceError) or refused
        pass
    try:
        return lookup_cas(cas)
    except InputError:
        return None


# ----------------------------------------------------------------- text in

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


def _text_of(source) -> tuple[str, str]:
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


def _clean(text: str) -> str:
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

def _sections(lines: list[str]) -> dict[int, tuple[int, int, str]]:
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


def _composition_section(lines, sections, notes) -> tuple[list[str], str]:
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


# ------------------------------------------------------------- numbers

def _number(text: str) -> float:
    if re.fullmatch(r"\d+,\d{1,2}", text) or re.fullmatch(r"\d+,\d{4,}", text):
        text = text.replace(",", ".")
    return float(text.replace(",", ""))


_RANGE = re.compile(
    rf"(?P<op1>>=|<=|>|<)?\s*(?P<a>{_NUM})\s*(?P<p1>%)?\s*(?:-|to)\s*(?P<op2>>=|<=|>|<)?"
    rf"\s*(?P<b>{_NUM})\s*(?P<p2>%)?", re.IGNORECASE)
_UPPER = re.compile(rf"(?P<op><=|<)\s*(?P<a>{_NUM})\s*(?P<p>%)?")
_LOWER = re.compile(rf"(?P<op>>=|>)\s*(?P<a>{_NUM})\s*(?P<p>%)?")
_SINGLE = re.compile(rf"(?<![\d.,-])(?P<a>{_NUM})\s*(?P<p>%)?(?![\d.,]|\s*-\s*\d)")
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
    return _number(value) / 100.0


def _find_range(text: str, need_percent: bool, allow_single: bool = True):
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


def _strip_noise(text: str) -> str:
    for pattern in _NOISE:
        text = pattern.sub(" ", text)
    return text


def _basis_of(text: str) -> str | None:
    low = text.lower()
    if re.search(r"v\s*/\s*v|vol(?:ume)?\.?\s*%|%\s*(?:by\s+)?vol|\(v\)", low):
        return "volume"
    if re.search(r"mol(?:e)?\.?\s*%|%\s*(?:by\s+)?mol", low):
        return "mole"
    if re.search(r"w\s*/\s*w|wt\.?\s*%|weight|mass|%\s*by\s*wt", low):
        return "mass"
    return None


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


# ------------------------------------------------------------- composition

def _composition(lines: list[str], notes: list[str]):
    section = "\n".join(lines)
    section_basis = _basis_of(section)
    basis = section_basis or "mass"
    if section_basis is None:
        notes.append("the sheet does not say whether its percentages are by mass, volume "
                     "or mole: taken as mass % (what safety data sheets usually give)")
    # a table whose values carry no % sign (the unit in its header) is read without
    need_percent = bool(re.search(rf"{_NUM}\s*%", section))
    found, unknown = [], []
    used: set[int] = set()
    for k, raw in enumerate(lines):
        line = raw.strip()
        if not line or k in used:
            continue
        m = _CAS.search(line)
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
        found.append((cas, name or cas, lo, hi, _basis_of(line) or basis, line))
    return found, unknown


def _numbered_ingredient(lines, k, line, m, need_percent, used):
    """The name and range (or None) of the ingredient on line `k`, whose first CAS
    number is the match `m`; a range on one of the next lines is taken (that line's
    number added to `used`) when the line has none."""
    before, after = line[:m.start()], line[m.end():]
    cleaned = _strip_noise(_CAS.sub(" ", after))
    hit = _find_range(cleaned, True) or _find_range(cleaned, False)
    j = k + 1
    while hit is None and j < min(k + 6, len(lines)) and not _CAS.search(lines[j]):
        nxt = _strip_noise(lines[j])
        if len(re.findall(r"[A-Za-z]{2,}", nxt)) <= 4:
            hit = _find_range(nxt, True) or _find_range(nxt, False, False)
        if hit is not None:
            used.add(j)
        j += 1
    name = _name(before)
    if not name:
        head = cleaned if hit is None else cleaned[:cleaned.find(hit[2])]
        name = _name(re.sub(r"\d", " ", head)) if re.search("[A-Za-z]{3}", head) else ""
    if not name and k > 0 and not _CAS.search(lines[k - 1]) \
            and _find_range(lines[k - 1], need_percent) is None:
        name = _name(lines[k - 1])
    return name, hit


def _unnumbered_ingredient(line, need_percent, basis, notes):
    """An ingredient line without a CAS number as an unidentified share, or None
    (no range, or a sentence, noted)."""
    stripped = _strip_noise(line)
    hit = None if re.match(r"^\s*\d+(?:\.\d+)+\s", line) else (
        _find_range(stripped, True) or _find_range(stripped, need_percent, False))
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
    return SdsIngredient("", name, lo, hi, _basis_of(line) or basis, None, reason, line)


def _ingredients(found, unknown, notes):
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


# ------------------------------------------------------------- properties

def _temperatures(text: str) -> list[float]:
    """Temperatures in `text`, in order, converted to K ("110 - 140 °C" gives both)."""
    out = []
    pattern = re.compile(
        rf"(?P<a>-?\s?{_NUM})(?:\s*(?:-|to)\s*(?P<b>-?{_NUM}))?\s*°\s*(?P<u>[CFK])\b"
        rf"|(?P<k>{_NUM})\s*K\b", re.IGNORECASE)
    for m in pattern.finditer(text):
        if m.group("k"):
            out.append(_number(m.group("k")))
            continue
        unit = m.group("u").upper()
        values = [m.group("a").replace(" ", "")] + ([m.group("b")] if m.group("b") else [])
        for v in values:
            x = _number(v.lstrip("-")) * (-1 if v.startswith("-") else 1)
            out.append(x + 273.15 if unit == "C" else (x - 32) * 5 / 9 + 273.15
                       if unit == "F" else x)
    return out


_PRESSURE = re.compile(rf"(?P<a>{_NUM})\s*(?P<u>kPa|hPa|MPa|mbar|bar|mm\s*Hg|torr|psia|psi|"
                       rf"atm|Pa)\b", re.IGNORECASE)
_PRESSURE_UNITS = {"kpa": "kPa", "hpa": "hPa", "mpa": "MPa", "mbar": "mbar", "bar": "bar",
                   "mmhg": "mmHg", "torr": "torr", "psia": "psi", "psi": "psi", "atm": "atm",
                   "pa": "Pa"}

_LABELS = {
    "flash_point": re.compile(r"flash\s*-?\s*point", re.I),
    "vapor_pressure": re.compile(r"vapou?r\s*pressure", re.I),
    "boiling_point": re.compile(r"boiling\s*(?:point|range)|initial\s+boiling", re.I),
    "flammability": re.compile(r"flammab|explosi|\bLEL\b|\bUEL\b|\bLFL\b|\bUFL\b", re.I),
    "density": re.compile(r"^(?:[a-z]\)\s*)?(?:relative\s+density|specific\s+gravity|"
                          r"density)\b|^(?:[a-z]\)\s*)?(?!vapou?r|bulk)[\w ]{0,12}density\b",
                          re.I),
}


def _value_part(line: str, label: re.Pattern) -> str:
    m = label.search(line)
    rest = line[m.end():] if m else line
    if ":" in rest[:60]:
        rest = rest[rest.find(":") + 1:]
    return rest


def _vapor_pressure_line(line: str, next_line: str, notes: list[str]):
    """(temperature [K], vapour pressure [Pa]) read from a property line (or the
    next line of a two-line layout), or None."""
    from .units import parse_quantity

    part = _value_part(line, _LABELS["vapor_pressure"])
    m = _PRESSURE.search(part) or _PRESSURE.search(next_line)
    if m:
        unit = _PRESSURE_UNITS[re.sub(r"\s", "", m.group("u").lower())]
        p = parse_quantity(f"{_number(m.group('a'))} {unit}", "pressure",
                           "vapour pressure")
        source_text = part if _PRESSURE.search(part) else next_line
        temps = _temperatures(source_text[source_text.find(m.group(0)):]) or \
            _temperatures(source_text)
        if temps:
            t = temps[0]
        else:
            t = 293.15
            notes.append("the vapour pressure is given without a temperature: "
                         "20 °C assumed (the usual reference on sheets)")
        if p > 0:
            return (t, p)
    elif not _NO_VALUE.search(part):
        notes.append(f"could not read the vapour pressure from {line!r}")
    return None


def _flammability_line(line: str, notes: list[str]):
    """(lower, upper) flammability limits [% by volume] read from a line; None for
    a limit it does not give."""
    part = _value_part(line, _LABELS["flammability"])
    label_text = line[:len(line) - len(part)].lower()
    lower = re.search(rf"(?:lower|\blel\b|\blfl\b)\D{{0,20}}?({_NUM})", part, re.I)
    upper = re.search(rf"(?:upper|\buel\b|\bufl\b)\D{{0,20}}?({_NUM})", part, re.I)
    values = [_number(v) for v in re.findall(rf"(?<![\d.])({_NUM})(?=\s*%|\s*-|\s*vol"
                                             rf"|\s*$|\s*\()", part)]
    lfl = ufl = None
    if lower or upper:
        lfl = _number(lower.group(1)) if lower else None
        ufl = _number(upper.group(1)) if upper else None
    elif len(values) >= 2:
        lfl, ufl = min(values[:2]), max(values[:2])
    elif len(values) == 1:
        has_low = re.search(r"lower|\blel\b|\blfl\b", label_text)
        has_up = re.search(r"upper|\buel\b|\bufl\b", label_text)
        if has_low and not has_up:
            lfl = values[0]
        elif has_up and not has_low:
            ufl = values[0]
    if lfl is None and ufl is None and not _NO_VALUE.search(part) and re.search(r"\d", part):
        notes.append(f"could not read a flammability limit from {line!r}")
    return lfl, ufl


def _density_line(line: str, notes: list[str]):
    """Liquid density [kg/m3] read from a property line (a value with a unit, or a
    relative density times water at 20 degC), or None."""
    from .units import parse_quantity

    part = _value_part(line, _LABELS["density"])
    part = re.sub(r"\(\s*(?:water|h2o|air)\s*=\s*1\s*\)|(?:water|h2o)\s*=\s*1",
                  " ", part, flags=re.I)
    m = re.search(rf"({_NUM})\s*(kg\s*/\s*m3|g\s*/\s*cm3|g\s*/\s*ml|g\s*/\s*cc|"
                  rf"kg\s*/\s*l|g\s*/\s*l|lbs?\s*/\s*gal)\b", part, re.I)
    relative = re.search(r"relative|specific\s+gravity", line, re.I)
    if m:
        unit = re.sub(r"\s", "", m.group(2).lower()).replace("lbs", "lb")
        unit = {"g/cc": "g/cm3", "g/ml": "g/mL", "kg/l": "kg/L", "g/l": "g/L"}.get(
            unit, unit)
        return parse_quantity(f"{_number(m.group(1))} {unit}", "density", "density")
    else:
        n = re.search(rf"(?<![\d.])({_NUM})", part)
        if n and not _NO_VALUE.search(part):
            value = _number(n.group(1))
            if relative or value < 3.0:
                density = value * WATER_DENSITY_20C
                what = "relative density" if relative else "unitless value"
                notes.append(f"density from the {what} {value:g} × water at 20 "
                             f"°C ({WATER_DENSITY_20C:g} kg/m3)")
                return density
            else:
                notes.append(f"could not read the density from {line!r} (no unit)")
        elif not _NO_VALUE.search(part):
            notes.append(f"could not read the density from {line!r}")
    return None


def _properties(lines: list[str], notes: list[str]) -> dict:
    props = dict(flash_point=None, vapor_pressure=None, boiling_point=None,
                 lower_flammability_limit=None, upper_flammability_limit=None, density=None)

    def following(i):
        """The next line, when this one holds only the label (a two-line layout)."""
        part = lines[i].split(":", 1)[1] if ":" in lines[i] else ""
        if part.strip() or i + 1 >= len(lines):
            return ""
        nxt = lines[i + 1].strip()
        return "" if any(p.search(nxt) for p in _LABELS.values()) else nxt

    for i, raw in enumerate(lines):
        line = raw.strip()
        if not line:
            continue
        low = line.lower()
        if _LABELS["flash_point"].search(line) and props["flash_point"] is None:
            part = _value_part(line, _LABELS["flash_point"])
            temps = _temperatures(part) or _temperatures(following(i))
            if temps:
                props["flash_point"] = temps[0]
                if re.search(r"[<>]", part.split("°")[0]):
                    notes.append(f"flash point given as a bound ({line!r}); the bound is used")
            elif not _NO_VALUE.search(part):
                notes.append(f"could not read the flash point from {line!r}")
        elif _LABELS["vapor_pressure"].search(line) and props["vapor_pressure"] is None:
            read = _vapor_pressure_line(line, following(i), notes)
            if read is not None:
                props["vapor_pressure"] = read
        elif _LABELS["boiling_point"].search(line) and props["boiling_point"] is None:
            part = _value_part(line, _LABELS["boiling_point"])
            temps = _temperatures(part) or _temperatures(following(i))
            if temps:
                props["boiling_point"] = temps[0]
            elif not _NO_VALUE.search(part):
                notes.append(f"could not read the boiling point from {line!r}")
        elif _LABELS["flammability"].search(line) and "flammability (solid" not in low \
                and not re.match(r"^\W*flammability\s*(?:\(|:|$)", low):
            lfl, ufl = _flammability_line(line, notes)
            if lfl is not None and props["lower_flammability_limit"] is None:
                props["lower_flammability_limit"] = lfl / 100.0
            if ufl is not None and props["upper_flammability_limit"] is None:
                props["upper_flammability_limit"] = ufl / 100.0
        elif _LABELS["density"].search(line) and props["density"] is None \
                and not re.search(r"vapou?r\s+density|bulk\s+density|relative\s+vapou?r",
                                  low):
            props["density"] = _density_line(line, notes)
    return props


def _product(lines: list[str], sections) -> str | None:
    end = sections[2][0] if 2 in sections else min(len(lines), 40)
    for line in lines[:end]:
        m = re.match(r"^\s*(?:product\s*(?:name|identifier)|trade\s*name|name\s+of\s+the\s+"
                     r"product)\s*[:\-]?\s*(.+)$", line, re.I)
        if m and m.group(1).strip(" :"):
            return m.group(1).strip(" :")
    return None


def read_sds(text_or_path, *, source: str | None = None) -> SdsReading:
    """Read a safety data sheet: composition, unidentified shares and section-9 properties.

    Parameters
    ----------
    text_or_path : str, pathlib.Path or bytes
        The sheet's text; a path to a ``.txt`` (UTF-8) or ``.pdf`` file with a
        text layer; or the bytes of either (an upload).
    source : str, optional
        Name shown in notes and reports (the file name by default).

    Returns
    -------
    SdsReading
        Missing values are None; `notes` say every assumption and every line
        that could not be read.

    Raises
    ------
    InputError
        For an empty or oversized file, a PDF without a text layer, text that is
        not UTF-8, or a sheet with no composition section; the message says what
        to do.

    Examples
    --------
    >>> sheet = '''1. IDENTIFICATION
    ... Product name: Example thinner
    ... 3. COMPOSITION/INFORMATION ON INGREDIENTS
    ... Toluene   108-88-3   60 - 80 %
    ... Acetone   67-64-1    20 - 40 %
    ... 9. PHYSICAL AND CHEMICAL PROPERTIES
    ... Flash point: -18 °C (closed cup)
    ... '''
    >>> r = read_sds(sheet)
    >>> r.product, [c.cas for c in r.components], round(r.flash_point, 2)
    ('Example thinner', ['108-88-3', '67-64-1'], 255.15)
    """
    text, name = _text_of(text_or_path)
    text = _clean(text)
    if not text.strip():
        raise InputError("safety data sheet", f"{name} holds no text; give the sheet's text "
                         "or the PDF from the supplier")
    lines = text.split("\n")
    notes: list[str] = []
    sections = _sections(lines)
    comp_lines, layout = _composition_section(lines, sections, notes)
    if layout == "section 2":
        notes.append("composition read from section 2 (older sheet layout)")
    found, unknown = _composition(comp_lines, notes)
    if not found and not unknown:
        raise InputError("safety data sheet", f"the composition ({layout}) lists no "
                         "ingredient with a concentration that could be read; enter the "
                         "mixture by hand")
    components, unidentified = _ingredients(found, unknown, notes)
    if 9 in sections:
        start, end, _ = sections[9]
        prop_lines = lines[start:end]
    else:
        prop_lines = lines
        notes.append("no section 9 (physical and chemical properties) heading was found: "
                     "the properties were looked for in the whole text")
    props = _properties(prop_lines, notes)
    for key, words in (("flash_point", "flash point"), ("vapor_pressure", "vapour pressure"),
                       ("boiling_point", "initial boiling point"),
                       ("lower_flammability_limit", "lower flammability limit"),
                       ("density", "density")):
        if props[key] is None:
            notes.append(f"the sheet gives no {words} that could be read")
    return SdsReading(
        product=_product(lines, sections), components=components, unidentified=unidentified,
        notes=tuple(dict.fromkeys(notes)), layout=layout, text=text,
        source=source or name, **props)


# ------------------------------------------------------------- screening model

class _NonVolatile:
    """A vapour-pressure 'correlation' of zero: the inert share gives off no vapour."""

    method = "non-volatile"
    tmin = 0.0
    tmax = math.inf
    source = "unidentified share taken as inert (no vapour)"

    def __call__(self, temperature):
        t = np.asarray(temperature, dtype=float)
        return 0.0 * t if t.ndim else 0.0


def inert_substance(molar_mass: float, liquid_density: float | None) -> Substance:
    """The inert, non-volatile stand-in for unidentified shares.

    Parameters
    ----------
    molar_mass : float
        [kg/mol]; the mean of the identified components, so that its mole share
        equals its mass share.
    liquid_density : float or None
        [kg/m3]
    """
    return Substance(
        key="unidentified-inert", name="Unidentified share (taken as inert)", cas="",
        molar_mass=float(molar_mass), boiling_point=math.inf,
        liquid_density=liquid_density, correlations=(_NonVolatile(),),
        # it gives off no vapour, so its diffusion coefficient never matters; a
        # typical solvent's Fuller volume keeps the evaporation models whole
        diffusion_volume=100.0,
        sources=MappingProxyType({"all": "unidentified share of a safety data sheet, taken "
                                  "as a non-volatile, non-flammable diluent"}),
        origin="user")


def dissolved_solid(sub: Substance) -> Substance:
    """A solid ingredient (a resin, an additive) as a dissolved, non-volatile component
    with its own molar mass."""
    return Substance(
        key=f"{sub.key}-dissolved", name=f"{sub.name} (dissolved solid)", cas=sub.cas,
        molar_mass=sub.molar_mass, boiling_point=math.inf,
        liquid_density=sub.liquid_density, correlations=(_NonVolatile(),),
        diffusion_volume=100.0,
        sources=MappingProxyType({**dict(sub.sources), "vapour pressure": "solid at "
                                  "ordinary temperatures: taken as non-volatile"}),
        origin="user")


@dataclass
class _Entries:
    """The entries of a sheet as they are mapped: each entry's substances with their
    shares, label and range; the substances once each, in order of first use."""

    substances: list = field(default_factory=list)
    rows: list = field(default_factory=list)
    labels: list = field(default_factory=list)
    lows: list = field(default_factory=list)
    highs: list = field(default_factory=list)

    def index(self, sub) -> int:
        """The position of `sub` (by key) among the substances, added if new."""
        for k, s in enumerate(self.substances):
            if s.key == sub.key:
                return k
        self.substances.append(sub)
        return len(self.substances) - 1

    def add(self, parts, label, item) -> None:
        """One entry: (substance index, share) parts, its label and the item's range."""
        self.rows.append(parts)
        self.labels.append(label)
        self.lows.append(item.low)
        self.highs.append(item.high)

    def shares(self) -> np.ndarray:
        """The share of each substance in each entry, entries x substances."""
        shares = np.zeros((len(self.rows), len(self.substances)))
        for e, parts in enumerate(self.rows):
            for k, share in parts:
                shares[e, k] += share
        return shares


def _add_unidentified(entries, items, unidentified, inert) -> str:
    """Add the unidentified shares as the inert pseudo-component or the user's
    surrogate; returns the words that say which."""
    from .substances import as_substance

    if unidentified == "inert" or unidentified is None:
        surrogate = inert
        treatment = ("unidentified shares taken as inert: a non-volatile, "
                     "non-flammable diluent with the mean molar mass of the "
                     "identified components; if they are volatile this "
                     "under-estimates the vapour: pick a surrogate substance")
    else:
        surrogate = as_substance(unidentified, "surrogate for unidentified shares")
        treatment = (f"unidentified shares taken as {surrogate.name} (surrogate "
                     "chosen by the user)")
    k = entries.index(surrogate)
    for item in items:
        entries.add([(k, 1.0)], item.name + (f" ({item.cas})" if item.cas else ""), item)
    return treatment


@dataclass
class _Model:
    """Entries of the sheet (each a range) mapped onto the liquid's substances."""

    labels: list
    lows: np.ndarray
    highs: np.ndarray
    shares: np.ndarray           # entries x substances
    substances: list
    basis: str
    treatment: str
    notes: list

    @classmethod
    def build(cls, reading: SdsReading, unidentified) -> "_Model":
        basis = reading.basis
        notes = []
        bases = {i.basis for i in reading.components + reading.unidentified}
        if len(bases) > 1:
            notes.append(f"the sheet mixes composition bases ({', '.join(sorted(bases))}): "
                         f"all taken as {basis}")
        entries = _Entries()
        solids = [i for i in reading.components if i.substance is not None
                  and (i.substance.melting_point or 0.0) > SOLID_ABOVE]
        for item in reading.components:
            if item in solids:
                continue
            if item.substance is not None:
                parts = [(entries.index(item.substance), 1.0)]
            else:
                _, split, _ = ISOMER_MIXTURES[item.cas]
                parts = [(entries.index(resolve_cas(c)), share) for c, share in split]
            entries.add(parts, f"{item.name} ({item.cas})", item)
        as_inert = unidentified == "inert" or unidentified is None
        if not entries.substances and as_inert:
            raise InputError("safety data sheet", "no ingredient of the sheet is known by its "
                             "CAS number, so there is nothing to screen; pick a surrogate "
                             "substance for the unidentified shares, or enter the liquid "
                             "by hand")
        inert = None
        if reading.unidentified and as_inert:
            if not entries.substances:
                raise InputError("safety data sheet", "no volatile ingredient of the sheet "
                                 "is known by its CAS number, so there is nothing to screen; "
                                 "pick a surrogate substance or enter the liquid by hand")
            inert = inert_substance(*_mean_properties(
                reading, entries.substances, entries.rows, entries.lows, entries.highs, basis))
        for item in solids:
            entries.add([(entries.index(dissolved_solid(item.substance)), 1.0)],
                        f"{item.name} ({item.cas})", item)
            notes.append(f"{item.name} ({item.cas}) melts at "
                         f"{item.substance.melting_point - 273.15:.0f} °C: taken as a "
                         "dissolved, non-volatile solid with its own molar mass")
        treatment = ""
        if reading.unidentified:
            treatment = _add_unidentified(entries, reading.unidentified, unidentified, inert)
            notes.append(treatment)
        return cls(entries.labels, np.array(entries.lows), np.array(entries.highs),
                   entries.shares(), entries.substances, basis, treatment, notes)

    def treatment_words(self) -> str:
        return f"; {self.treatment}" if self.treatment else ""

    def midpoints(self) -> np.ndarray:
        mid = 0.5 * (self.lows + self.highs)
        return mid / mid.sum()

    def labelled(self, w) -> MappingProxyType:
        return MappingProxyType({label: float(v) for label, v in zip(self.labels, w)})

    def substance_bounds(self):
        return self.lows @ self.shares, self.highs @ self.shares

    def amounts_per_basis(self) -> np.ndarray:
        """Moles per unit of each substance on the basis (mass, volume or mole)."""
        m = np.array([s.molar_mass for s in self.substances])
        if self.basis == "mass":
            return 1.0 / m
        if self.basis == "volume":
            rho = [s.liquid_density for s in self.substances]
            if any(r is None for r in rho):
                raise InputError("composition basis", "a composition by volume needs the "
                                 "liquid density of every component")
            return np.array(rho) / m
        return np.ones(len(self.substances))

    def liquid(self, w, how: str, extra=()):
        from .mixtures import liquid as make_liquid

        f = w @ self.shares
        spec = {s: float(v) for s, v in zip(self.substances, f)}
        words = ", ".join(f"{label} {100 * v:.3g} %" for label, v in zip(self.labels, w))
        outside = [label for label, v, lo, hi in zip(self.labels, w, self.lows, self.highs)
                   if v < lo - 1e-6 or v > hi + 1e-6]
        liq = make_liquid(spec, self.basis, field="composition from the safety data sheet")
        notes = [f"composition from the safety data sheet, {how} ({self.basis} %): {words}"]
        inert = [k for k, c in enumerate(liq.components) if c.key == "unidentified-inert"]
        if inert and liq.mole_fractions[inert[0]] < 1.0:
            x = float(liq.mole_fractions[inert[0]])
            notes.append(f"the inert share is {100 * x:.3g} % of the liquid's moles (taken "
                         "with the mean molar mass of the identified components); were it "
                         "much heavier (a resin, say) the vapour would be up to "
                         f"{1 / (1 - x):.3g} times higher")
        if outside:
            notes.append("normalising put " + ", ".join(outside) + " outside the sheet's "
                         "range: the ranges do not fit together")
        notes += self.notes + list(extra)
        return type(liq)(**{**liq.__dict__, "warnings": tuple(dict.fromkeys(
            notes + [x for x in liq.warnings if "scaled to 100" not in x]))})

    def extreme(self, coefficients, maximise: bool = True) -> np.ndarray:
        """Entry fractions within the ranges that maximise (or minimise) Σ c_s x_s.

        x are mole fractions; the Charnes-Cooper transformation of the
        linear-fractional programme in the entry fractions w (Σ w = 1,
        low <= w <= high) is solved by `scipy.optimize.linprog`. When the ranges
        cannot sum to 100 %, the constraint Σ w = 1 is dropped and the result
        normalised (the ranges read as relative amounts).
        """
        from scipy.optimize import linprog

        n = len(self.labels)
        amounts = self.amounts_per_basis()
        moles = self.shares @ amounts                      # moles per unit of each entry
        values = self.shares @ (amounts * np.asarray(coefficients, dtype=float))
        strict = self.lows.sum() <= 1.0 + 1e-9 and self.highs.sum() >= 1.0 - 1e-9
        cost = np.concatenate([-values if maximise else values, [0.0]])
        a_ub = np.zeros((2 * n, n + 1))
        for e in range(n):
            a_ub[e, e], a_ub[e, n] = 1.0, -self.highs[e]
            a_ub[n + e, e], a_ub[n + e, n] = -1.0, self.lows[e]
        a_eq = [np.concatenate([moles, [0.0]])]
        b_eq = [1.0]
        if strict:
            a_eq.append(np.concatenate([np.ones(n), [-1.0]]))
            b_eq.append(0.0)
        result = linprog(cost, A_ub=a_ub, b_ub=np.zeros(2 * n), A_eq=np.array(a_eq),
                         b_eq=np.array(b_eq), bounds=[(0, None)] * (n + 1), method="highs")
        if result.status != 0 or result.x[n] <= 0:
            raise InputError("composition ranges", "no composition within the sheet's "
                             f"ranges could be found ({result.message}); check the ranges")
        w = result.x[:n] / result.x[n]
        w = np.clip(w, self.lows, self.highs) if strict else w
        return w / w.sum()

    def _coefficients(self, temperature, pressure, limits, limit_kind):
        from .checks import check_pressure
        from .vapor import vapor_pressure_estimate

        p_total = check_pressure(pressure)
        p_sat = np.array([float(vapor_pressure_estimate(s, temperature).pressure)
                          for s in self.substances])
        keyed = {}
        for lim in limits:
            if lim.kind == limit_kind:
                keyed.setdefault(lim.substance, lim.volume_fraction)
        if any(s.key in keyed for s in self.substances):
            c = np.array([p / p_total / keyed[s.key] if s.key in keyed else 0.0
                          for s, p in zip(self.substances, p_sat)])
            return c, f"additive exposure index ({limit_kind})", "index"
        lfl = [s.lower_flammability_limit for s in self.substances]
        if any(lfl):
            c = np.array([100.0 * p / p_total / v if v else 0.0 for p, v in zip(p_sat, lfl)])
            return c, "headspace % LFL", "lfl"
        return p_sat / p_total * 1e6, "total vapour (ppm)", "ppm"

    @staticmethod
    def _measure(hs, kind, limits, limit_kind):
        if kind == "lfl":
            return float(hs.percent_lfl)
        if kind == "ppm":
            return float(hs.total_ppm)
        keyed = {}
        for lim in limits:
            if lim.kind == limit_kind:
                keyed.setdefault(lim.substance, lim.volume_fraction)
        return float(sum(float(y) / keyed[c.key] for c, y in
                         zip(hs.liquid.components, hs.volume_fractions) if c.key in keyed))

    def worst(self, temperature, pressure, limits, limit_kind) -> SdsComposition:
        from .headspace import headspace

        c, objective, kind = self._coefficients(temperature, pressure, limits, limit_kind)
        w = self.extreme(c, maximise=True)
        extra = [f"worst case within the ranges: the composition with the highest "
                 f"{objective} at {temperature - 273.15:.1f} °C (linear programme on "
                 "Raoult's partial pressures, re-checked with the headspace model)"]
        if not (self.lows.sum() <= 1.0 + 1e-9 and self.highs.sum() >= 1.0 - 1e-9):
            extra.append("the ranges cannot add up to 100 %: they were read as relative "
                         "amounts and the result normalised")
        liq = self.liquid(w, "worst case within the ranges", extra)
        hs = headspace(liq, temperature, pressure)
        value = self._measure(hs, kind, limits, limit_kind)
        notes = list(liq.warnings)
        mid_liq = self.liquid(self.midpoints(), "normalised midpoints")
        mid_value = self._measure(headspace(mid_liq, temperature, pressure), kind, limits,
                                  limit_kind)
        if np.any(hs.boiling):
            notes.append("the chosen composition boils at the screening temperature: the "
                         "linear programme assumed Raoult's law below the boiling point, "
                         "so the choice is approximate there")
        if value < mid_value * (1 - 1e-6):
            notes.append(f"re-check: the midpoint composition gives a higher {objective} "
                         f"({mid_value:.4g}) than the chosen one ({value:.4g}); the midpoint "
                         "is used")
            liq, w, value = mid_liq, self.midpoints(), mid_value
        return SdsComposition("worst", self.labelled(w), self.basis, liq, objective, value,
                              float(temperature), float(pressure), tuple(dict.fromkeys(notes)))

    # -- cross-checks

    def check_vapor_pressure(self, t_sheet, p_sheet, pressure) -> SdsCheck:
        from .headspace import headspace

        words = f"{p_sheet / 1000:.3g} kPa at {t_sheet - 273.15:.1f} °C"
        try:
            liq = self.liquid(self.midpoints(), "normalised midpoints")
            hs = headspace(liq, t_sheet, max(pressure, 1.01 * p_sheet, 1e3))
            p_sat = np.asarray(hs.saturation_pressures, dtype=float).reshape(-1)
            gammas = liq.activity_coefficients
            coefficients = gammas * p_sat
            model = float(np.sum(liq.mole_fractions * coefficients))
            x_hi = self._mole_fractions(self.extreme(coefficients, True))
            x_lo = self._mole_fractions(self.extreme(coefficients, False))
            high, low = float(x_hi @ coefficients), float(x_lo @ coefficients)
        except InputError as exc:
            return SdsCheck("vapour pressure", p_sheet, None, None, None, "", None,
                            f"The sheet gives a vapour pressure of {words}; the model could "
                            f"not compute one for its composition: {exc.reason}")
        u = hs.relative_uncertainty or 0.0
        lo_band, hi_band = low / (1 + u), high * (1 + u)
        agrees = lo_band <= p_sheet <= hi_band
        tolerance = (f"the span over the composition ranges widened by the stated "
                     f"uncertainty of the vapour-pressure methods (±{100 * u:.3g} %); "
                     "Raoult's law for an ideal solution unless activity coefficients are "
                     "given (mixtures with water or alcohols can deviate)")
        model_words = (f"{model / 1000:.3g} kPa at the midpoints ({low / 1000:.3g}-"
                       f"{high / 1000:.3g} kPa over the ranges)")
        if agrees:
            statement = (f"Vapour pressure: the sheet gives {words}; its composition gives "
                         f"{model_words}: consistent within {100 * u:.3g} %.")
        else:
            ratio = p_sheet / model if model > 0 else math.inf
            statement = (f"Vapour pressure DISAGREES: the sheet gives {words}, but its "
                         f"composition gives {model_words}, a factor {ratio:.3g} "
                         f"{'above' if ratio > 1 else 'below'} the midpoint value and beyond "
                         f"the {100 * u:.3g} % uncertainty of the method. A gap this large "
                         "usually means a wrong composition or a mislabelled unit (some "
                         "sheets give the vapour pressure of the main solvent): check the "
                         "sheet before trusting either.")
            if self.treatment and ratio > 1:
                statement += " The unidentified shares are taken as inert; if they are " \
                             "volatile they may explain part of the gap."
        return SdsCheck("vapour pressure", p_sheet, model, low, high, tolerance, agrees,
                        statement)

    def _mole_fractions(self, w) -> np.ndarray:
        f = w @ self.shares
        moles = f * self.amounts_per_basis()
        return moles / moles.sum()

    def check_flash_point(self, t_sheet, pressure) -> SdsCheck:
        from .errors import UllageError
        from .headspace import estimated_flash_point

        words = f"{t_sheet - 273.15:.1f} °C"
        tol = FLASH_POINT_TOLERANCE
        tolerance = (f"±{tol:g} K (the method's spread against published closed-cup flash "
                     "points, with a margin for mixtures)")
        try:
            mid = estimated_flash_point(self.liquid(self.midpoints(), "normalised midpoints"),
                                        pressure).estimate
            c, _, kind = self._coefficients(t_sheet, pressure, (), "")
            if kind != "lfl":
                raise InputError("flash point", "no component has a lower flammability limit")
            estimates = [mid]
            for maximise in (True, False):
                w = self.extreme(c, maximise)
                estimates.append(estimated_flash_point(
                    self.liquid(w, "range end"), pressure).estimate)
        except UllageError as exc:
            reason = getattr(exc, "reason", str(exc))
            return SdsCheck("flash point", t_sheet, None, None, None, tolerance, None,
                            f"The sheet gives a flash point of {words}; the model could not "
                            f"estimate one for its composition: {reason}")
        low, high = min(estimates), max(estimates)
        agrees = low - tol <= t_sheet <= high + tol
        model_words = (f"{mid - 273.15:.1f} °C at the midpoints ({low - 273.15:.1f} to "
                       f"{high - 273.15:.1f} °C over the ranges)")
        if agrees:
            statement = (f"Flash point: the sheet gives {words}; the temperature at which "
                         f"the saturated vapour of its composition reaches the LFL is "
                         f"{model_words}: consistent within {tol:g} K.")
        else:
            statement = (f"Flash point DISAGREES: the sheet gives {words}, but its "
                         f"composition reaches the LFL at {model_words}, more than {tol:g} K "
                         "apart. This usually means a wrong composition, a mislabelled unit "
                         "(°F for °C) or an open-cup value: check the sheet before trusting "
                         "either.")
        return SdsCheck("flash point", t_sheet, mid, low, high, tolerance, agrees, statement)


def _mean_properties(reading, subs, rows, lows, highs, basis):
    """Molar mass and density of the inert stand-in: the identified components' mean."""
    mid = np.array([0.5 * (lo + hi) for lo, hi in zip(lows, highs)])
    f = np.zeros(len(subs))
    for e, parts in enumerate(rows):
        for k, share in parts:
            f[k] += mid[e] * share
    if f.sum() <= 0:
        f = np.ones(len(subs))
    f = f / f.sum()
    m = np.array([s.molar_mass for s in subs])
    rho = [s.liquid_density for s in subs]
    if basis == "mole":
        molar_mass = float(f @ m)
    else:
        molar_mass = float(1.0 / np.sum(f / m))
    density = None if any(r is None for r in rho) else float(1.0 / np.sum(f / np.array(rho)))
    return molar_mass, density


# ------------------------------------------------------------- scenario files

#: [[liquid]] keys of a liquid given by a safety data sheet or its ranges.
SCENARIO_KEYS = ("sds", "sds_text", "ranges", "unlisted", "point", "unidentified_as")


def sheet_path(value: str, base_dir, field: str) -> Path:
    """The sheet file a scenario names, confined to the scenario's own folder.

    Refuses absolute paths, drive letters, ``..`` and anything (a link, say)
    that resolves outside the folder of the scenario file, and files other than
    ``.txt`` and ``.pdf``; a scenario that was not read from a file (pasted or
    uploaded) cannot name a file at all.
    """
    from pathlib import PurePosixPath, PureWindowsPath

    text = str(value).strip()
    if base_dir is None:
        raise InputError(field, "this scenario was not read from a file on disk, so it "
                         "cannot name a sheet file; put the sheet's text in sds_text (the "
                         "browser does this when you paste or upload a sheet)")
    if not text:
        raise InputError(field, "give the sheet's file name, relative to the scenario file")
    if (PurePosixPath(text).is_absolute() or PureWindowsPath(text).is_absolute()
            or PureWindowsPath(text).drive or text.startswith(("~", "\\"))):
        raise InputError(field, f"{text!r} is an absolute path; name the sheet relative to "
                         "the scenario file's folder, such as \"sheets/thinner.pdf\"")
    parts = PureWindowsPath(text).parts
    if ".." in parts:
        raise InputError(field, f"{text!r} leaves the scenario file's folder ('..'); keep "
                         "the sheet in that folder or below it")
    base = Path(base_dir).resolve()
    full = (base / Path(*parts)).resolve()
    if not full.is_relative_to(base):
        raise InputError(field, f"{text!r} leads outside the scenario file's folder; keep "
                         "the sheet in that folder or below it")
    if full.suffix.lower() not in (".txt", ".pdf"):
        raise InputError(field, f"{text!r}: a sheet is a .txt or .pdf file")
    if not full.is_file():
        raise InputError(field, f"{text!r} was not found beside the scenario file")
    return full


def _ranges_reading(ranges, unlisted, basis, resolve, field) -> SdsReading:
    """A reading from a scenario's ranges (CAS number or name -> [low, high])."""
    notes: list[str] = []
    found, unknown, named = [], [], []
    for key, (lo, hi) in (ranges or {}).items():
        if not 0.0 <= lo <= hi <= 1.0:
            raise InputError(f"{field} ranges {key}", f"{lo:g}-{hi:g} is not a range within "
                             "0-100 % with the low end first")
        if _CAS.fullmatch(key.strip()):
            found.append((key.strip(), key.strip(), lo, hi, basis, ""))
        else:
            sub = resolve(key)
            named.append(SdsIngredient(sub.cas, sub.name, lo, hi, basis, sub, "", ""))
    for key, (lo, hi) in (unlisted or {}).items():
        if not 0.0 <= lo <= hi <= 1.0:
            raise InputError(f"{field} unlisted {key}", f"{lo:g}-{hi:g} is not a range "
                             "within 0-100 % with the low end first")
        unknown.append(SdsIngredient("", key, lo, hi, basis, None, "unidentified share", ""))
    from dataclasses import replace

    components, unidentified = _ingredients(found, unknown, notes)
    components = tuple(replace(i, name=i.substance.name) if i.substance is not None else i
                       for i in components)
    return SdsReading(None, tuple(named) + components, unidentified, None, None, None, None,
                      None, None, tuple(notes), "ranges", "", "scenario ranges")


def reading_from_ranges(ranges, unlisted=None, basis: str = "mass", *, properties=None,
                        product=None, text: str = "", source: str = "edited reading"
                        ) -> SdsReading:
    """A reading from ranges a user has checked or edited (the browser's tables).

    Parameters
    ----------
    ranges : mapping
        CAS number or substance name -> (low, high) fractions. [-]
    unlisted : mapping, optional
        Name -> (low, high) of shares with no identity. [-]
    basis : str
        "mass", "volume" or "mole".
    properties : mapping, optional
        Section-9 values in SI: flash_point, vapor_pressure (T, p), boiling_point,
        lower_flammability_limit, upper_flammability_limit, density.
    """
    from dataclasses import replace

    from .substances import substance

    if basis not in ("mass", "volume", "mole"):
        raise InputError("composition basis", f"{basis!r} is not a basis; use mass, volume "
                         "or mole")
    reading = _ranges_reading(ranges, unlisted, basis,
                              lambda k: substance(k, "ingredient"), "ingredient")
    values = {k: v for k, v in (properties or {}).items() if k in (
        "flash_point", "vapor_pressure", "boiling_point", "lower_flammability_limit",
        "upper_flammability_limit", "density")}
    return replace(reading, product=product, text=text, source=source, **values)


def _screening_temperature(name: str, document) -> tuple[float, str]:
    from .units import parse_temperature

    found = []
    for section in ("tank", "spill"):
        for item in document.get(section, []) or []:
            if str(item.get("liquid", "")).strip().lower() != name.lower():
                continue
            for key in ("temperature", "worst_temperature"):
                try:
                    found.append(parse_temperature(item[key], key))
                except (KeyError, InputError, TypeError):
                    pass
    if found:
        return max(found), "the highest liquid temperature of its tanks and spills"
    return 298.15, "25 °C (no tank or spill uses it)"


def scenario_liquid(values: dict, document, base_dir, resolve, field: str):
    """The liquid spec of a scenario's [[liquid]] given by a sheet or by its ranges.

    Parameters
    ----------
    values : dict
        The [[liquid]] keys, converted (ranges as (low, high) fractions).
    document : mapping
        The whole scenario, for the temperatures of the tanks and spills.
    base_dir : path or None
        Folder of the scenario file (None for text not read from a file).
    resolve : callable
        Name -> Substance (the scenario's own substances, then the table).
    field : str
        Where the liquid is, for messages.

    Returns
    -------
    (dict, list of str)
        The liquid entry's keys (``spec`` substance -> fraction on ``basis``, and
        ``composition``, ``composition_basis`` and ``composition_method``, the
        ranges as composition uncertainty for a Monte Carlo run), and the
        assumptions.
    """
    point = values.get("point", "mid")
    if point not in POINTS:
        raise InputError(f"{field} point", f"{point!r} is not a point; use \"mid\" or "
                         "\"worst\"")
    treat = values.get("unidentified_as", "inert")
    if treat != "inert":
        try:
            treat = resolve(treat)
        except InputError as exc:
            raise InputError(f"{field} unidentified_as", exc.reason) from None
    name = values["name"]
    if "sds" in values:
        path = sheet_path(values["sds"], base_dir, f"{field} sds")
    if "ranges" in values or "unlisted" in values:
        reading = _ranges_reading(values.get("ranges"), values.get("unlisted"),
                                  values.get("basis", "mass"), resolve, field)
        origin = "the ranges given"
    elif "sds_text" in values:
        reading = read_sds(values["sds_text"], source=f"the sheet text of {name!r}")
        origin = "the sheet text kept in the file"
    else:
        reading = read_sds(path)
        origin = f"the sheet {values['sds']}"
    notes = [f"liquid {name!r}: composition from {origin}"]
    if point == "worst":
        temperature, why = _screening_temperature(name, document)
        chosen = reading.screen("worst", unidentified=treat, temperature=temperature)
        notes.append(f"liquid {name!r}: worst case within the ranges screened at "
                     f"{temperature - 273.15:.1f} °C, {why}")
    else:
        chosen = reading.screen("mid", unidentified=treat)
    liq = chosen.liquid
    notes += [f"liquid {name!r}: {w}" for w in liq.warnings]
    if reading.vapor_pressure is not None or reading.flash_point is not None:
        notes += [f"liquid {name!r}: {ck.statement}" for ck in reading.cross_check(treat)
                  if ck.agrees is False]
    if reading.basis == "mass":
        entry = {"spec": dict(zip(liq.components, (float(v) for v in liq.mass_fractions))),
                 "basis": "mass"}
    else:
        entry = {"spec": dict(zip(liq.components, (float(v) for v in liq.mole_fractions))),
                 "basis": "mole"}
    if reading.basis in ("mass", "mole") and len(liq.components) > 1:
        _, ranges, method = reading.composition_ranges(treat)
        entry.update(composition=dict(ranges), composition_basis=reading.basis,
                     composition_method=method)
    return entry, notes
