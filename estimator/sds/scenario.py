"""A scenario's ``[[liquid]]`` given by a safety data sheet or by its ranges, and the
sheet file it names, confined to the scenario's folder."""

from __future__ import annotations

from pathlib import Path

from ..errors import InputError
from .cas import CAS_NUMBER
from .composition import SdsIngredient, resolve_ingredients
from .model import POINTS
from .reading import SdsReading, read_sds


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
        if CAS_NUMBER.fullmatch(key.strip()):
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

    components, unidentified = resolve_ingredients(found, unknown, notes)
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

    from ..substances import substance

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
    from ..units import parse_temperature

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
