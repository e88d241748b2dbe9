"""Section 9, physical and chemical properties: flash point, vapour pressure, boiling
point, flammability limits and density, each line read by its label."""

from __future__ import annotations

import re

from .values import NO_VALUE, NUMBER, read_number, read_temperatures


#: Density of water at 20 degC, the reference for relative density and specific
#: gravity. [kg/m3] IAPWS-95 (998.207 kg/m3 at 20 degC, 101325 Pa).
WATER_DENSITY_20C = 998.2

_PRESSURE = re.compile(rf"(?P<a>{NUMBER})\s*(?P<u>kPa|hPa|MPa|mbar|bar|mm\s*Hg|torr|psia|psi|"
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
    from ..units import parse_quantity

    part = _value_part(line, _LABELS["vapor_pressure"])
    m = _PRESSURE.search(part) or _PRESSURE.search(next_line)
    if m:
        unit = _PRESSURE_UNITS[re.sub(r"\s", "", m.group("u").lower())]
        p = parse_quantity(f"{read_number(m.group('a'))} {unit}", "pressure",
                           "vapour pressure")
        source_text = part if _PRESSURE.search(part) else next_line
        temps = read_temperatures(source_text[source_text.find(m.group(0)):]) or \
            read_temperatures(source_text)
        if temps:
            t = temps[0]
        else:
            t = 293.15
            notes.append("the vapour pressure is given without a temperature: "
                         "20 °C assumed (the usual reference on sheets)")
        if p > 0:
            return (t, p)
    elif not NO_VALUE.search(part):
        notes.append(f"could not read the vapour pressure from {line!r}")
    return None


def _flammability_line(line: str, notes: list[str]):
    """(lower, upper) flammability limits [% by volume] read from a line; None for
    a limit it does not give."""
    part = _value_part(line, _LABELS["flammability"])
    label_text = line[:len(line) - len(part)].lower()
    lower = re.search(rf"(?:lower|\blel\b|\blfl\b)\D{{0,20}}?({NUMBER})", part, re.I)
    upper = re.search(rf"(?:upper|\buel\b|\bufl\b)\D{{0,20}}?({NUMBER})", part, re.I)
    values = [read_number(v) for v in re.findall(rf"(?<![\d.])({NUMBER})(?=\s*%|\s*-"
                                                 rf"|\s*vol|\s*$|\s*\()", part)]
    lfl = ufl = None
    if lower or upper:
        lfl = read_number(lower.group(1)) if lower else None
        ufl = read_number(upper.group(1)) if upper else None
    elif len(values) >= 2:
        lfl, ufl = min(values[:2]), max(values[:2])
    elif len(values) == 1:
        has_low = re.search(r"lower|\blel\b|\blfl\b", label_text)
        has_up = re.search(r"upper|\buel\b|\bufl\b", label_text)
        if has_low and not has_up:
            lfl = values[0]
        elif has_up and not has_low:
            ufl = values[0]
    if lfl is None and ufl is None and not NO_VALUE.search(part) and re.search(r"\d", part):
        notes.append(f"could not read a flammability limit from {line!r}")
    return lfl, ufl


def _density_line(line: str, notes: list[str]):
    """Liquid density [kg/m3] read from a property line (a value with a unit, or a
    relative density times water at 20 degC), or None."""
    from ..units import parse_quantity

    part = _value_part(line, _LABELS["density"])
    part = re.sub(r"\(\s*(?:water|h2o|air)\s*=\s*1\s*\)|(?:water|h2o)\s*=\s*1",
                  " ", part, flags=re.I)
    m = re.search(rf"({NUMBER})\s*(kg\s*/\s*m3|g\s*/\s*cm3|g\s*/\s*ml|g\s*/\s*cc|"
                  rf"kg\s*/\s*l|g\s*/\s*l|lbs?\s*/\s*gal)\b", part, re.I)
    relative = re.search(r"relative|specific\s+gravity", line, re.I)
    if m:
        unit = re.sub(r"\s", "", m.group(2).lower()).replace("lbs", "lb")
        unit = {"g/cc": "g/cm3", "g/ml": "g/mL", "kg/l": "kg/L", "g/l": "g/L"}.get(
            unit, unit)
        return parse_quantity(f"{read_number(m.group(1))} {unit}", "density", "density")
    else:
        n = re.search(rf"(?<![\d.])({NUMBER})", part)
        if n and not NO_VALUE.search(part):
            value = read_number(n.group(1))
            if relative or value < 3.0:
                density = value * WATER_DENSITY_20C
                what = "relative density" if relative else "unitless value"
                notes.append(f"density from the {what} {value:g} × water at 20 "
                             f"°C ({WATER_DENSITY_20C:g} kg/m3)")
                return density
            else:
                notes.append(f"could not read the density from {line!r} (no unit)")
        elif not NO_VALUE.search(part):
            notes.append(f"could not read the density from {line!r}")
    return None


def read_properties(lines: list[str], notes: list[str]) -> dict:
    """The section-9 values in SI (None where not given): flash_point, vapor_pressure,
    boiling_point, lower_flammability_limit, upper_flammability_limit, density."""
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
            temps = read_temperatures(part) or read_temperatures(following(i))
            if temps:
                props["flash_point"] = temps[0]
                if re.search(r"[<>]", part.split("°")[0]):
                    notes.append(f"flash point given as a bound ({line!r}); the bound is used")
            elif not NO_VALUE.search(part):
                notes.append(f"could not read the flash point from {line!r}")
        elif _LABELS["vapor_pressure"].search(line) and props["vapor_pressure"] is None:
            read = _vapor_pressure_line(line, following(i), notes)
            if read is not None:
                props["vapor_pressure"] = read
        elif _LABELS["boiling_point"].search(line) and props["boiling_point"] is None:
            part = _value_part(line, _LABELS["boiling_point"])
            temps = read_temperatures(part) or read_temperatures(following(i))
            if temps:
                props["boiling_point"] = temps[0]
            elif not NO_VALUE.search(part):
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
