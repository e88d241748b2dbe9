"""Units at the edge: parsing user text into SI floats."""

import math

import numpy as np
import pytest

from estimator.errors import InputError
from estimator.units import convert, parse_quantity, parse_temperature


@pytest.mark.parametrize(
    "text, kind, expected",
    [
        # Conversion factors: NIST SP 811 (2008), Appendix B.
        ("500 gal", "volume", 500 * 3.785411784e-3),
        ("12 ft", "length", 12 * 0.3048),
        ("1 atm", "pressure", 101325.0),
        ("760 mmHg", "pressure", 101325.0),
        ("14.6959 psi", "pressure", 101325.0),
        ("29.92 inHg", "pressure", 29.92 * 3386.389),
        ("4 1/h", "rate", 4 / 3600),
        ("4 ACH", "rate", 4 / 3600),
        ("100 cfm", "flow", 100 * 0.3048**3 / 60),
        ("2 m/s", "speed", 2.0),
        ("10 mph", "speed", 10 * 0.44704),
        ("50 %", "fraction", 0.5),
        ("200 ppm", "fraction", 200e-6),
        ("350 mg/m3", "mass_concentration", 350e-6),
        ("92.14 g/mol", "molar_mass", 0.09214),
        ("8 h", "time", 28800.0),
        ("3 m2", "area", 3.0),
        ("1,5 m", "length", 1.5),
    ],
)
def test_parse_quantity_to_si(text, kind, expected):
    """Text with units converts to the SI value (NIST SP 811 factors)."""
    assert parse_quantity(text, kind, "x") == pytest.approx(expected, rel=1e-5)


@pytest.mark.parametrize(
    "text, kelvin",
    [("35 degC", 308.15), ("35 °C", 308.15), ("95 degF", 308.15), ("95 °F", 308.15),
     ("308.15 K", 308.15), ("-40 C", 233.15), ("-40 F", 233.15), ("554.67 degR", 308.15),
     (300.0, 300.0)],
)
def test_parse_temperature(text, kelvin):
    """Celsius, Fahrenheit, Rankine and kelvin all reach kelvin (ITS-90 scale definitions)."""
    assert parse_temperature(text) == pytest.approx(kelvin, abs=1e-9)


def test_temperature_difference_is_not_offset():
    """A 10 degC swing is 10 K, not 283.15 K."""
    assert parse_quantity("10 degC", "temperature_difference", "swing") == pytest.approx(10.0)
    assert parse_quantity("18 degF", "temperature_difference", "swing") == pytest.approx(10.0)


@pytest.mark.parametrize(
    "value, kind, fragment",
    [
        ("20 kg", "temperature", "is not a temperature"),
        ("20", "temperature", "has no unit"),
        ("", "volume", "is empty"),
        ("abc", "volume", "does not start with a number"),
        ("3 blorps", "speed", "not a unit"),
        ("3 m/s)", "speed", "not a unit"),
        ("nan m", "length", "NaN"),
        ("inf m", "length", "infinite"),
        ("5 m", "volume", "is not a volume"),
        (True, "volume", "expected a quantity"),
        ([1, 2], "volume", "expected text"),
    ],
)
def test_bad_quantities_name_the_field(value, kind, fragment):
    """Bad text raises InputError naming the field and what is wrong."""
    with pytest.raises(InputError) as info:
        parse_quantity(value, kind, "tank volume")
    assert info.value.field == "tank volume"
    assert fragment in str(info.value)


def test_below_absolute_zero():
    """-300 degC is rejected as below absolute zero."""
    with pytest.raises(InputError, match="absolute zero"):
        parse_temperature("-300 degC", "liquid temperature")


def test_convert_arrays_and_scalars():
    """convert works on scalars and arrays (1 atm = 760 mmHg to 1e-6, NIST SP 811)."""
    assert convert(101325.0, "Pa", "mmHg") == pytest.approx(760.0, rel=1e-6)
    out = convert(np.array([273.15, 373.15]), "K", "degC")
    np.testing.assert_allclose(out, [0.0, 100.0], atol=1e-9)
    assert math.isclose(convert(1.0, "m3", "L"), 1000.0)
