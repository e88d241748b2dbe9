"""What a sheet says (`SdsReading`) and how it is read (`read_sds`): composition,
unidentified shares and section-9 properties, with the liquid, the worst case, the
Monte Carlo ranges, the cross-check and the ``[[liquid]]`` block of the reading."""

from __future__ import annotations

from dataclasses import dataclass, field
from types import MappingProxyType

from ..constants import STANDARD_ATMOSPHERE
from ..errors import InputError
from .composition import SdsIngredient, read_composition, resolve_ingredients
from .cross_check import SdsCheck, check_flash_point, check_vapor_pressure
from .model import POINTS, SdsComposition, SheetModel
from .properties import read_properties
from .text import clean_text, composition_lines, find_sections, product_name, sheet_text


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
        model = SheetModel.build(self, unidentified)
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
        from ..uncertainty import Fixed, Uniform

        model = SheetModel.build(self, unidentified)
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
        from ..uncertainty import headspace_monte_carlo

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
        model = SheetModel.build(self, unidentified)
        checks = []
        if self.vapor_pressure is not None:
            checks.append(check_vapor_pressure(model, *self.vapor_pressure, pressure))
        if self.flash_point is not None:
            checks.append(check_flash_point(model, self.flash_point, pressure))
        return tuple(checks)

    def to_toml(self, name: str | None = None, *, point: str = "mid",
                unidentified="inert") -> str:
        """The ``[[liquid]]`` block of a scenario file, with the ranges."""
        from ..toml_text import toml_key, toml_value

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
    text, name = sheet_text(text_or_path)
    text = clean_text(text)
    if not text.strip():
        raise InputError("safety data sheet", f"{name} holds no text; give the sheet's text "
                         "or the PDF from the supplier")
    lines = text.split("\n")
    notes: list[str] = []
    sections = find_sections(lines)
    comp_lines, layout = composition_lines(lines, sections, notes)
    if layout == "section 2":
        notes.append("composition read from section 2 (older sheet layout)")
    found, unknown = read_composition(comp_lines, notes)
    if not found and not unknown:
        raise InputError("safety data sheet", f"the composition ({layout}) lists no "
                         "ingredient with a concentration that could be read; enter the "
                         "mixture by hand")
    components, unidentified = resolve_ingredients(found, unknown, notes)
    if 9 in sections:
        start, end, _ = sections[9]
        prop_lines = lines[start:end]
    else:
        prop_lines = lines
        notes.append("no section 9 (physical and chemical properties) heading was found: "
                     "the properties were looked for in the whole text")
    props = read_properties(prop_lines, notes)
    for key, words in (("flash_point", "flash point"), ("vapor_pressure", "vapour pressure"),
                       ("boiling_point", "initial boiling point"),
                       ("lower_flammability_limit", "lower flammability limit"),
                       ("density", "density")):
        if props[key] is None:
            notes.append(f"the sheet gives no {words} that could be read")
    return SdsReading(
        product=product_name(lines, sections), components=components,
        unidentified=unidentified, notes=tuple(dict.fromkeys(notes)), layout=layout,
        text=text, source=source or name, **props)
