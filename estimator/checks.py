"""Input checks shared by every model: numbers, signs, ranges and site pressures.

Each check takes the value, the field as the user knows it and the unit, and
either returns the value in SI (a float, or a numpy array of floats) or raises
`estimator.errors.InputError` naming the field and saying what to do. The
accepted range of absolute pressures and of site elevations is written here
once, for the single-case models, the inventory and the Monte Carlo chains.
"""

from __future__ import annotations

import math

import numpy as np

from .errors import InputError

__all__ = [
    "number",
    "positive",
    "in_range",
    "finite_array",
    "positive_array",
    "single",
    "float_or_array",
    "PRESSURE_RANGE",
    "PRESSURE_RANGE_TEXT",
    "ELEVATION_RANGE",
    "BAROMETRIC_RANGE",
    "check_barometric_pressure",
    "check_pressure",
    "pressures_inside",
]

#: Absolute pressures accepted anywhere (vapour spaces, sites, inventory rows,
#: sampled pressures): 1 kPa to 10 MPa, both included. [Pa] A screening range
#: (common practice): below it the ideal-gas headspace is no tank atmosphere
#: people meet; above it the ideal-gas vapour phase is no longer a fair guess.
PRESSURE_RANGE = (1e3, 1e7)

#: The same range in words, for error messages.
PRESSURE_RANGE_TEXT = ("pressures are absolute, in pascals (101325 Pa = 1 atm), "
                       "from 1 kPa to 10 MPa")

#: Site elevations accepted, those of the standard troposphere. [m] ISO 2533:1975.
ELEVATION_RANGE = (-500.0, 11000.0)

#: Barometric pressures accepted for a site, both excluded: 30 to 120 kPa. [Pa]
#: The standard atmosphere (ISO 2533:1975) gives about 107.5 kPa at -500 m and
#: 30 kPa near 9 km; the upper bound leaves room for weather. A reading outside
#: it is a unit slip (hPa, psi, a gauge reading) far more often than a real site
#: (common practice).
BAROMETRIC_RANGE = (3e4, 1.2e5)


def _unit(unit: str) -> str:
    return f" {unit}" if unit else ""


def number(value, field: str, unit: str = "") -> float:
    """A finite number. [unit]

    Examples
    --------
    >>> number("2.5", "depth", "m")
    2.5
    """
    if isinstance(value, bool):
        raise InputError(field, f"expected a number{' in ' + unit if unit else ''}, "
                                f"got {value!r}")
    if np.ndim(value) > 0:
        if np.size(value) != 1:
            raise InputError(field, "give a single number here, not an array")
        value = np.asarray(value).reshape(()).item()
    try:
        v = float(value)
    except (TypeError, ValueError):
        raise InputError(field, f"expected a number{' in ' + unit if unit else ''}, "
                                f"got {value!r}") from None
    if math.isnan(v):
        raise InputError(field, f"is NaN; give a finite number{' in ' + unit if unit else ''}")
    if math.isinf(v):
        raise InputError(field, f"is infinite; give a finite number"
                                f"{' in ' + unit if unit else ''}")
    return v


def positive(value, field: str, unit: str = "", *, allow_zero: bool = False,
             hint: str = "") -> float:
    """A finite number above zero (or zero or more with ``allow_zero``). [unit]

    Examples
    --------
    >>> positive(0.0, "depth", "m", allow_zero=True)
    0.0
    """
    v = number(value, field, unit)
    if allow_zero and v < 0.0:
        raise InputError(field, f"{v:g}{_unit(unit)} is negative; it must be at least 0"
                                f"{hint}")
    if not allow_zero and v <= 0.0:
        raise InputError(field, f"{v:g}{_unit(unit)} is not above 0; it must be "
                                f"positive{hint}")
    return v


def in_range(value, field: str, unit: str, low: float = 0.0, high: float = math.inf,
             hint: str = "") -> float:
    """A finite number strictly between ``low`` and ``high``. [unit]"""
    v = number(value, field, unit)
    if not low < v < high:
        raise InputError(field, f"{v:g}{_unit(unit)} is outside {low:g}-{high:g}"
                                f"{_unit(unit)}{hint}")
    return v


def finite_array(value, field: str, unit: str = "", *, allow_empty: bool = False) -> np.ndarray:
    """Finite numbers as a float array (a scalar gives a 0-d array). [unit]"""
    where = f" in {unit}" if unit else ""
    if isinstance(value, bool):
        raise InputError(field, f"expected a number{where}, got {value!r}")
    try:
        array = np.asarray(value, dtype=float)
    except (TypeError, ValueError):
        raise InputError(field, f"expected a number{where}, got {value!r}") from None
    if array.size == 0:
        if allow_empty:
            return array
        raise InputError(field, f"is empty; give a number{where}")
    if np.isnan(array).any():
        raise InputError(field, f"contains NaN; give a finite number{where}")
    if np.isinf(array).any():
        raise InputError(field, f"is infinite; give a finite number{where}")
    return array


def positive_array(value, field: str, unit: str = "", *, allow_zero: bool = False,
                   hint: str = "", allow_empty: bool = False) -> np.ndarray:
    """Finite numbers above zero (or zero or more with ``allow_zero``). [unit]"""
    array = finite_array(value, field, unit, allow_empty=allow_empty)
    if array.size == 0:
        return array
    if allow_zero and (array < 0.0).any():
        raise InputError(field, f"{array.min():g}{_unit(unit)} is negative; it must be "
                                f"at least 0{hint}")
    if not allow_zero and (array <= 0.0).any():
        raise InputError(field, f"{array.min():g}{_unit(unit)} is not above 0; it must "
                                f"be positive{hint}")
    return array


def single(array, field: str) -> float:
    """The one number of a scalar or one-element array."""
    array = np.asarray(array, dtype=float)
    if array.ndim != 0 and array.size != 1:
        raise InputError(field, "give a single number here, not an array")
    return float(array.reshape(()))


def float_or_array(result):
    """A result as a plain float when it is a scalar, else as a float array."""
    result = np.asarray(result, dtype=float)
    return float(result) if result.ndim == 0 else result


def check_pressure(pressure, field: str = "pressure") -> float:
    """An absolute pressure inside `PRESSURE_RANGE`. [Pa]

    Examples
    --------
    >>> check_pressure(101325.0)
    101325.0
    """
    try:
        p = float(pressure)
    except (TypeError, ValueError):
        raise InputError(field, f"expected a pressure in Pa, got {pressure!r}") from None
    if not math.isfinite(p) or p <= 0:
        raise InputError(field, f"{p:g} Pa: the absolute pressure must be above zero")
    if not pressures_inside(p):
        raise InputError(field, f"{p:g} Pa is outside the accepted range: {PRESSURE_RANGE_TEXT}")
    return p


def check_barometric_pressure(pressure, field: str = "barometric pressure") -> float:
    """A site's barometric pressure inside `BAROMETRIC_RANGE`. [Pa]

    Examples
    --------
    >>> check_barometric_pressure(84000.0)
    84000.0
    """
    p = number(pressure, field, "Pa")
    low, high = BAROMETRIC_RANGE
    if not low < p < high:
        raise InputError(field, f"{p:g} Pa: must be between {low / 1e3:g} and "
                                f"{high / 1e3:g} kPa (a barometric pressure, absolute; "
                                "101.325 kPa at sea level)")
    return p


def pressures_inside(pressures):
    """True where an absolute pressure [Pa] is inside `PRESSURE_RANGE` (NaN: False),
    as a boolean numpy array (0-d for a scalar, so ``~`` negates it)."""
    p = np.asarray(pressures, dtype=float)
    with np.errstate(invalid="ignore"):
        inside = (p >= PRESSURE_RANGE[0]) & (p <= PRESSURE_RANGE[1])
    return inside
