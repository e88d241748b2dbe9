"""Units at the edge: turn text such as "35 degC" or "500 gal" into SI floats.

The models never see pint. Everything that crosses into them is a float or a numpy
array in SI units; this module is the one place that converts. The pint registry
is built on first use, so importing ullage stays fast.
"""

from __future__ import annotations

import functools
import math
import re

import numpy as np

from .errors import InputError

__all__ = [
    "registry",
    "parse_quantity",
    "parse_temperature",
    "convert",
    "SI_UNITS",
]

#: The SI unit each kind of input is converted to.
SI_UNITS = {
    "temperature": "K",
    "temperature_difference": "delta_degC",
    "pressure": "Pa",
    "length": "m",
    "area": "m**2",
    "volume": "m**3",
    "time": "s",
    "speed": "m/s",
    "flow": "m**3/s",
    "rate": "1/s",
    "mass": "kg",
    "mass_rate": "kg/s",
    "mass_concentration": "kg/m**3",
    "density": "kg/m**3",
    "molar_mass": "kg/mol",
    "molar_energy": "J/mol",
    "fraction": "dimensionless",
}

_NUMBER = re.compile(
    r"^\s*([-+]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][-+]?\d+)?|[-+]?inf(?:inity)?|nan)\s*(.*?)\s*$",
    re.IGNORECASE,
)

_SPELLINGS = {
    "°c": "degC",
    "ºc": "degC",
    "℃": "degC",
    "c": "degC",
    "celsius": "degC",
    "°f": "degF",
    "ºf": "degF",
    "℉": "degF",
    "f": "degF",
    "fahrenheit": "degF",
    "°r": "degR",
    "r": "degR",
    "kelvin": "K",
    "k": "K",
    "%": "percent",
    "m3": "m**3",
    "m2": "m**2",
    "ft3": "ft**3",
    "ft2": "ft**2",
    "mg/m3": "mg/m**3",
    "mg/m³": "mg/m**3",
    "m³": "m**3",
    "m²": "m**2",
    "ach": "1/hour",
    "1/h": "1/hour",
    "/h": "1/hour",
    "cfm": "ft**3/min",
    "gpm": "gallon/min",
}

_TEMPERATURE_UNITS = {"degC", "degF", "degR", "K"}


@functools.cache
def registry():
    """The one pint unit registry of ullage, built on first use."""
    import pint

    ureg = pint.UnitRegistry()
    if "ppm" not in ureg:
        ureg.define("ppm = 1e-6 = parts_per_million")
    if "ppb" not in ureg:
        ureg.define("ppb = 1e-9 = parts_per_billion")
    return ureg


def _split(text: str, field: str) -> tuple[float, str]:
    match = _NUMBER.match(text)
    if not match:
        raise InputError(
            field,
            f"{text!r} does not start with a number; write a number and a unit, "
            "for example '35 degC' or '500 gal'",
        )
    number, unit = match.groups()
    if "," in number and "." not in number:
        number = number.replace(",", ".")
    return float(number), unit.strip()


_POWER = re.compile(r"(?<=[A-Za-z])([23])(?![0-9*])")


def _normalise_unit(unit: str, kind: str) -> str:
    unit = unit.replace("³", "3").replace("²", "2")
    if "**" not in unit and "^" not in unit:
        unit = _POWER.sub(r"**\1", unit)
    key = unit.strip().lower()
    if key in ("c", "f", "r") and kind not in ("temperature", "temperature_difference"):
        return unit
    spelled = _SPELLINGS.get(key, unit)
    if kind == "temperature_difference" and spelled in ("degC", "degF", "degR"):
        return "delta_" + spelled
    return spelled


def _check_value(value: float, field: str) -> None:
    if math.isnan(value):
        raise InputError(field, "is not a number (NaN); enter a finite value")
    if math.isinf(value):
        raise InputError(field, "is infinite; enter a finite value")


def parse_quantity(value, kind: str, field: str, *, default_unit: str | None = None) -> float:
    """Convert one user value to an SI float.

    Parameters
    ----------
    value : str, float or int
        Text with a number and a unit ("500 gal", "4 1/h"), or a bare number. A bare
        number is taken in `default_unit`; if there is none, a bare number is only
        accepted for dimensionless kinds.
    kind : str
        One of the keys of `SI_UNITS`, such as "volume" or "pressure".
    field : str
        The name of the input, used in error messages.
    default_unit : str, optional
        The unit of a bare number.

    Returns
    -------
    float
        The value in the SI unit of `kind`. [SI]

    Examples
    --------
    >>> round(parse_quantity("500 gal", "volume", "tank volume"), 4)
    1.8927
    >>> parse_quantity("35 degC", "temperature", "liquid temperature")
    308.15
    """
    if kind not in SI_UNITS:
        raise ValueError(f"unknown kind {kind!r}; expected one of {sorted(SI_UNITS)}")
    if isinstance(value, bool):
        raise InputError(field, f"expected a quantity, got {value!r}")
    if isinstance(value, (int, float, np.integer, np.floating)):
        number, unit = float(value), ""
    elif isinstance(value, str):
        if not value.strip():
            raise InputError(field, "is empty; enter a number and a unit")
        number, unit = _split(value, field)
    else:
        raise InputError(
            field, f"expected text such as '35 degC' or a number, got {type(value).__name__}"
        )
    _check_value(number, field)
    target = SI_UNITS[kind]
    if not unit:
        if default_unit is not None:
            unit = default_unit
        elif target == "dimensionless":
            return number
        else:
            raise InputError(
                field,
                f"{value!r} has no unit; write the number with its unit, such as "
                f"{_EXAMPLES[kind]}",
            )
    return _convert_scalar(number, _normalise_unit(unit, kind), target, field, value)


_EXAMPLE_UNITS = {
    "temperature": "degC",
    "temperature_difference": "K",
    "pressure": "kPa",
    "length": "m",
    "area": "m**2",
    "volume": "L",
    "time": "min",
    "speed": "m/s",
    "flow": "m**3/h",
    "rate": "1/h",
    "mass": "kg",
    "mass_rate": "g/s",
    "mass_concentration": "mg/m**3",
    "density": "kg/m**3",
    "molar_mass": "g/mol",
    "molar_energy": "kJ/mol",
    "fraction": "percent",
}


#: Written-out examples for the "no unit" message, per kind.
_EXAMPLES = {
    "temperature": "'30 degC', '86 degF' or '303 K'",
    "temperature_difference": "'5 K' or '9 delta_degF'",
    "pressure": "'101.3 kPa', '14.7 psi' or '1 atm'",
    "length": "'3 m' or '10 ft'",
    "area": "'2 m2' or '20 ft2'",
    "volume": "'200 L', '55 gal' or '10 m3'",
    "time": "'40 min' or '2 h'",
    "speed": "'0.2 m/s'",
    "flow": "'0.5 m3/s', '400 cfm' or '1800 m3/h'",
    "rate": "'4 1/h'",
    "mass": "'20 kg' or '44 lb'",
    "mass_rate": "'2 g/s'",
    "mass_concentration": "'5 mg/L' or '75 mg/m3'",
    "density": "'870 kg/m3'",
    "molar_mass": "'92.1 g/mol'",
    "molar_energy": "'38 kJ/mol'",
    "fraction": "'40 %'",
}


def _convert_scalar(number: float, unit: str, target: str, field: str, original) -> float:
    import pint

    ureg = registry()
    try:
        quantity = ureg.Quantity(number, unit)
    except Exception:  # pint raises many kinds of error on malformed unit text
        raise InputError(
            field, f"{unit!r} in {original!r} is not a unit ullage knows; "
            f"try for example '{_EXAMPLE_UNITS.get(_kind_of(target), target)}'"
        ) from None
    try:
        return float(quantity.to(target).magnitude)
    except pint.DimensionalityError:
        raise InputError(
            field,
            f"{original!r} is not a {_kind_of(target).replace('_', ' ')}; "
            f"give it in units such as '{_EXAMPLE_UNITS.get(_kind_of(target), target)}'",
        ) from None
    except pint.OffsetUnitCalculusError:
        raise InputError(field, f"cannot use {unit!r} here; use kelvin or a plain unit") from None


def _kind_of(target: str) -> str:
    for kind, unit in SI_UNITS.items():
        if unit == target:
            return kind
    return target


def parse_temperature(value, field: str = "temperature") -> float:
    """Convert a temperature such as "35 degC", "95 degF" or "308 K" to kelvin.

    Text must carry its unit: "30" alone is refused, because a person who writes
    it means degrees Celsius or Fahrenheit far more often than kelvin. A number
    (not text) is taken in kelvin, the SI unit of the Python API.

    Parameters
    ----------
    value : str or float
        Text with a unit, or a number in kelvin.
    field : str
        The name of the input, used in error messages.

    Returns
    -------
    float
        Thermodynamic temperature. [K]

    Examples
    --------
    >>> round(parse_temperature("95 degF"), 2)
    308.15
    >>> parse_temperature(300.0)
    300.0
    """
    kelvin = parse_quantity(value, "temperature", field,
                            default_unit=None if isinstance(value, str) else "K")
    if kelvin <= 0.0:
        raise InputError(field, f"{value!r} is at or below absolute zero; check the unit")
    return kelvin


def convert(values, from_unit: str, to_unit: str):
    """Convert numbers between two units, for display at the edge.

    Parameters
    ----------
    values : float or array_like
        Magnitudes in `from_unit`.
    from_unit, to_unit : str
        pint unit expressions, such as "Pa" and "mmHg", or "K" and "degC".

    Returns
    -------
    float or numpy.ndarray
        Magnitudes in `to_unit`.

    Examples
    --------
    >>> round(convert(101325.0, "Pa", "mmHg"), 3)
    760.0
    """
    offset, factor = _affine(from_unit, to_unit)
    out = np.asarray(values, dtype=float) * factor + offset
    return float(out) if np.ndim(out) == 0 else out


@functools.lru_cache(maxsize=512)
def _affine(from_unit: str, to_unit: str) -> tuple[float, float]:
    """(offset, factor) of the conversion between two units, found once through pint.

    Every unit ullage shows is an affine map of another (a factor, and an offset
    for temperatures), so a conversion is ``value * factor + offset``; asking pint
    each time costs far more than the arithmetic.
    """
    ureg = registry()
    low, high = ureg.Quantity(np.array([0.0, 1.0]),
                              _SPELLINGS.get(from_unit.lower(), from_unit)).to(
        _SPELLINGS.get(to_unit.lower(), to_unit)).magnitude
    return float(low), float(high - low)
