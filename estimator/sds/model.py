"""The liquid built from a sheet's ranges: at the normalised midpoints, or at the
composition within the ranges with the highest headspace hazard (a linear programme).

The sheet's entries (each a range) are mapped onto the liquid's substances by
`SheetModel`: isomer mixtures are split, solids become dissolved, non-volatile
components, and unidentified shares become an inert pseudo-component or a
surrogate. scipy, the headspace and the mixtures are imported only when used.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from types import MappingProxyType

import numpy as np

from ..errors import InputError
from ..substances import Substance
from .cas import ISOMER_MIXTURES, resolve_cas


#: Ingredients melting above this are taken as dissolved, non-volatile solids (resins,
#: pigments, additives): solid at ordinary storage temperatures. [K] (40 degC)
SOLID_ABOVE = 313.15

#: Ways of picking one composition within the sheet's ranges.
POINTS = ("mid", "worst")


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
    from ..substances import as_substance

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
class SheetModel:
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
    def build(cls, reading, unidentified) -> "SheetModel":
        """The model of an `SdsReading`, with its unidentified shares as inert or as a
        surrogate (see `SdsReading.liquid`)."""
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
        from ..mixtures import liquid as make_liquid

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

    def coefficients(self, temperature, pressure, limits, limit_kind):
        """(coefficient per substance, objective in words, kind): the quantity the worst
        case maximises is the sum of coefficient x mole fraction."""
        from ..checks import check_pressure
        from ..vapor import vapor_pressure_estimate

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
    def measure(hs, kind, limits, limit_kind):
        """That quantity for a headspace result."""
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
        from ..headspace import headspace

        c, objective, kind = self.coefficients(temperature, pressure, limits, limit_kind)
        w = self.extreme(c, maximise=True)
        extra = [f"worst case within the ranges: the composition with the highest "
                 f"{objective} at {temperature - 273.15:.1f} °C (linear programme on "
                 "Raoult's partial pressures, re-checked with the headspace model)"]
        if not (self.lows.sum() <= 1.0 + 1e-9 and self.highs.sum() >= 1.0 - 1e-9):
            extra.append("the ranges cannot add up to 100 %: they were read as relative "
                         "amounts and the result normalised")
        liq = self.liquid(w, "worst case within the ranges", extra)
        hs = headspace(liq, temperature, pressure)
        value = self.measure(hs, kind, limits, limit_kind)
        notes = list(liq.warnings)
        mid_liq = self.liquid(self.midpoints(), "normalised midpoints")
        mid_value = self.measure(headspace(mid_liq, temperature, pressure), kind, limits,
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

    def mole_fractions(self, w) -> np.ndarray:
        """Mole fractions of the substances for entry fractions `w`."""
        f = w @ self.shares
        moles = f * self.amounts_per_basis()
        return moles / moles.sum()


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
