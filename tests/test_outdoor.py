"""Outdoor screening plume: stability classes, Briggs sigmas, centreline and distances."""

import math
import warnings

import numpy as np
import pytest

from estimator.errors import InputError, UllageWarning
from estimator.outdoor import (
    BRIGGS_COEFFICIENTS,
    EndpointDistance,
    briggs_sigmas,
    distance_to_concentration,
    ground_level_centerline,
    screening_validity,
    stability_class,
    wind_speed_at_height,
)

# sigma_y, sigma_z [m] at 1 km, computed by hand from Briggs's (1973) formulas as
# printed in Griffiths (1994), Atmos. Environ. 28, 2861, Table 1, and in CCPS (2000),
# Guidelines for Chemical Process Quantitative Risk Analysis, Table 2.13 (from memory).
# Open: sigma_y = a * 1000 / sqrt(1.1); urban: a * 1000 / sqrt(1.4).
BRIGGS_AT_1_KM = {
    "open": {
        "A": (209.76, 200.00), "B": (152.55, 120.00), "C": (104.88, 73.03),
        "D": (76.28, 37.95), "E": (57.21, 23.08), "F": (38.14, 12.31),
    },
    "urban": {
        "A": (270.45, 339.41), "B": (270.45, 339.41), "C": (185.93, 200.00),
        "D": (135.22, 122.79), "E": (92.97, 50.60), "F": (92.97, 50.60),
    },
}

# Pasquill-Gifford curves (Turner 1970, AP-26, Figs. 3-2 and 3-3) at 1 km, from the
# curve fits of US EPA (1995), ISC3 User's Guide Vol. II, EPA-454/B-95-003b, Eqs.
# 1-32 to 1-34 with Tables 1-1 and 1-2 (coefficients transcribed; check):
# sigma_y = 465.11628 x tan(c degrees) at x = 1 km, sigma_z = a (1 km)^b = a.
PG_TANGENT_DEGREES = {"A": 24.1670, "B": 18.3330, "C": 12.5000, "D": 8.3330, "E": 6.2500,
                      "F": 4.1667}
PG_SIGMA_Z_1_KM = {"B": 109.30, "C": 61.141, "D": 32.093, "E": 21.628, "F": 13.953}


@pytest.mark.parametrize("terrain", ["open", "urban"])
@pytest.mark.parametrize("letter", list("ABCDEF"))
def test_briggs_sigmas_at_1_km(terrain, letter):
    """Briggs sigma_y, sigma_z at 1 km equal the hand-computed values from the printed formulas."""
    sy, sz = briggs_sigmas(1000.0, letter, terrain)
    expected_y, expected_z = BRIGGS_AT_1_KM[terrain][letter]
    assert sy == pytest.approx(expected_y, abs=0.006)
    assert sz == pytest.approx(expected_z, abs=0.006)


@pytest.mark.parametrize("letter", list("ABCDEF"))
def test_briggs_open_country_sigma_y_near_pasquill_gifford(letter):
    """Open-country sigma_y at 1 km lies within 15 % of the P-G curve (ISC3 fit of Turner's
    curves), which Briggs's open-country set was fitted to."""
    pg = 465.11628 * math.tan(math.radians(PG_TANGENT_DEGREES[letter]))
    assert briggs_sigmas(1000.0, letter).sigma_y == pytest.approx(pg, rel=0.15)


@pytest.mark.parametrize("letter", list("BCDEF"))
def test_briggs_open_country_sigma_z_near_pasquill_gifford(letter):
    """Open-country sigma_z at 1 km lies within 20 % of the P-G curve for B-F (A departs
    by design: Briggs keeps A linear where the P-G curve turns up steeply)."""
    assert briggs_sigmas(1000.0, letter).sigma_z == pytest.approx(PG_SIGMA_Z_1_KM[letter],
                                                                  rel=0.20)


def test_open_country_e_f_sigma_z_use_power_minus_one():
    """Open-country E and F sigma_z use (1 + 0.0003 x)^-1, not ^-1/2 (Griffiths 1994)."""
    x = 5000.0
    assert briggs_sigmas(x, "E").sigma_z == pytest.approx(0.03 * x / (1 + 0.0003 * x))
    assert briggs_sigmas(x, "F").sigma_z == pytest.approx(0.016 * x / (1 + 0.0003 * x))


def test_briggs_sigmas_vectorised_and_scalar():
    """An array of distances gives arrays; a float gives floats."""
    x = np.array([200.0, 1000.0, 5000.0])
    sy, sz = briggs_sigmas(x, "C", "urban")
    assert sy.shape == (3,) and sz.shape == (3,)
    assert sy[1] == pytest.approx(BRIGGS_AT_1_KM["urban"]["C"][0], abs=0.006)
    assert isinstance(briggs_sigmas(1000.0, "C").sigma_y, float)


def test_intermediate_class_averages_neighbours():
    """'B-C' sigmas are the mean of B and C (Turner 1970's advice for intermediate classes)."""
    b, c, bc = (briggs_sigmas(800.0, k) for k in ("B", "C", "B-C"))
    assert bc.sigma_y == pytest.approx(0.5 * (b.sigma_y + c.sigma_y))
    assert bc.sigma_z == pytest.approx(0.5 * (b.sigma_z + c.sigma_z))


def test_briggs_outside_fitted_range_warns():
    """Below 100 m or beyond 10 km the value is computed and a warning issued."""
    with pytest.warns(UllageWarning, match="100 m - 10 km"):
        sy, _ = briggs_sigmas(50.0, "D")
    assert sy == pytest.approx(0.08 * 50.0 / math.sqrt(1.005))
    with pytest.warns(UllageWarning):
        briggs_sigmas(np.array([500.0, 20000.0]), "D")
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        briggs_sigmas(np.array([100.0, 10000.0]), "D")


# Pasquill's key, Turner (1970), AP-26, Table 1: (wind at 10 m, day?, insolation,
# cloud oktas) -> class.
TURNER_TABLE_CELLS = [
    (1.5, True, "strong", None, "A"),
    (1.5, True, "moderate", None, "A-B"),
    (1.5, True, "slight", None, "B"),
    (2.5, True, "strong", None, "A-B"),
    (2.5, True, "moderate", None, "B"),
    (2.5, True, "slight", None, "C"),
    (4.0, True, "strong", None, "B"),
    (4.0, True, "moderate", None, "B-C"),
    (4.0, True, "slight", None, "C"),
    (5.5, True, "moderate", None, "C-D"),
    (5.5, True, "slight", None, "D"),
    (7.0, True, "strong", None, "C"),
    (7.0, True, "moderate", None, "D"),
    (2.5, False, None, 5, "E"),
    (2.5, False, None, 2, "F"),
    (4.0, False, None, 5, "D"),
    (4.0, False, None, 2, "E"),
    (5.5, False, None, 2, "D"),
    (8.0, False, None, 0, "D"),
]


@pytest.mark.parametrize("wind, day, insolation, cloud, expected", TURNER_TABLE_CELLS)
def test_stability_class_reproduces_turner_table(wind, day, insolation, cloud, expected):
    """Cells of Pasquill's key as tabulated by Turner (1970), AP-26, Table 1."""
    assert stability_class(wind, day, insolation, cloud) == expected


def test_stability_class_overcast_and_choices():
    """Overcast (8/8) is D by day or night (Turner 1970); 'stable' picks the stabler neighbour;
    calm clear nights (blank in the table) give F."""
    assert stability_class(1.5, True, "strong", cloud_cover=8) == "D"
    assert stability_class(1.5, False, cloud_cover=8) == "D"
    assert stability_class(4.0, True, "moderate", intermediate="stable") == "C"
    assert stability_class(1.0, False, cloud_cover=1) == "F"
    assert stability_class(3.0, True, "strong") == "B"  # a boundary speed goes to the higher row


def test_centerline_hand_check():
    """1 kg/s, 5 m/s, class D open, 500 m: by hand sigma_y = 40/sqrt(1.05) = 39.036 m,
    sigma_z = 30/sqrt(1.75) = 22.678 m, C = 1/(pi 5 39.036 22.678) = 7.191e-5 kg/m3."""
    c = ground_level_centerline(1.0, 5.0, 500.0, "D")
    assert c == pytest.approx(1.0 / (math.pi * 5.0 * 39.036 * 22.678), rel=1e-4)
    assert c == pytest.approx(7.191e-5, rel=1e-3)


def test_centerline_array_and_monotonic():
    """Vectorised over distance, and falling with distance for every class and terrain."""
    x = np.geomspace(100.0, 10000.0, 50)
    for terrain in ("open", "urban"):
        for letter in "ABCDEF":
            c = ground_level_centerline(0.1, 3.0, x, letter, terrain)
            assert c.shape == x.shape and np.all(np.diff(c) < 0.0)


def test_distance_to_concentration_back_substitutes():
    """The distance found gives the endpoint concentration back."""
    result = distance_to_concentration(0.5, 2.0, 1e-5, "F")
    assert isinstance(result, EndpointDistance) and result.found
    assert ground_level_centerline(0.5, 2.0, result.distance, "F") == pytest.approx(1e-5,
                                                                                    rel=1e-8)


def test_distance_to_concentration_edge_cases():
    """Still above at max_distance: None; below already at min_distance: 0.0; both say so."""
    far = distance_to_concentration(10.0, 1.5, 1e-9, "F", max_distance=1e4)
    assert far.distance is None and not far.found and "beyond" in far.warnings[0]
    near = distance_to_concentration(1e-6, 5.0, 1.0, "D")
    assert near.distance == 0.0 and not near.found and "closer" in near.note
    assert distance_to_concentration(0.0, 5.0, 1e-6, "D").distance == 0.0


def test_distance_outside_fitted_range_is_flagged():
    """A crossing under 100 m carries a validity warning string."""
    result = distance_to_concentration(1e-3, 3.0, 1e-5, "D")
    assert result.found and result.distance < 100.0
    assert "100 m - 10 km" in result.warnings[0]


#: Wind-profile power-law exponents by stability class A-F (Irwin 1979, Atmos. Environ.
#: 13, 191; the values of the US EPA ISC3 User's Guide, EPA-454/B-95-003b, Vol. II).
#: Read, typed here, from US EPA (2000) Meteorological Monitoring Guidance for
#: Regulatory Modeling Applications, EPA-454/R-99-005, Sec. 6.2.5, as carried (with
#: that citation) in the public source of Liljegren's WBGT program; the rural row is
#: also CALPUFF's default PLX0. Not taken from estimator.outdoor.
IRWIN_EXPONENTS = {
    "open": (0.07, 0.07, 0.10, 0.15, 0.35, 0.55),
    "urban": (0.15, 0.15, 0.20, 0.25, 0.30, 0.30),
}


@pytest.mark.parametrize("terrain", sorted(IRWIN_EXPONENTS))
@pytest.mark.parametrize("index, letter", list(enumerate("ABCDEF")))
def test_wind_profile_exponents(terrain, index, letter):
    """u(z) = u(10 m) (z / 10 m)^p with the published p (IRWIN_EXPONENTS): checked at
    100 m and at 2 m, the height of a person downwind."""
    p = IRWIN_EXPONENTS[terrain][index]
    assert wind_speed_at_height(1.0, 100.0, 10.0, letter, terrain) == pytest.approx(10**p)
    assert wind_speed_at_height(3.0, 2.0, 10.0, letter, terrain) == pytest.approx(
        3.0 * 0.2**p)


def test_wind_speed_at_height_vectorised():
    """Heights as an array give an array; the reference height returns the input speed."""
    u = wind_speed_at_height(4.0, np.array([2.0, 10.0, 50.0]), stability="D")
    assert u.shape == (3,) and u[1] == pytest.approx(4.0)


def test_screening_validity_statements():
    """Calm, near, far and dense cases are each flagged; an ordinary case only notes
    obstacles; a release the Britter-McQuaid criterion judges passive is not flagged."""
    from estimator.outdoor import pool_source_criterion

    passive = pool_source_criterion(0.01, 0.02, 0.092, 298.15, 101325.0, 5.0)
    dense = pool_source_criterion(10.0, 0.5, 0.092, 298.15, 101325.0, 1.5)
    assert not passive.dense and dense.dense
    ordinary = screening_validity(3.0, np.array([200.0, 2000.0]), passive)
    assert len(ordinary) == 1 and "obstacles" in ordinary[0]
    text = " ".join(screening_validity(0.5, np.array([50.0, 20000.0]), dense))
    for fragment in ("near-calm", "under 100 m", "beyond 10 km", "dense gas", "obstacles",
                     f"= {dense.value:.2g}"):
        assert fragment in text


@pytest.mark.parametrize("call, field, fragment", [
    (lambda: ground_level_centerline(1.0, 0.0, 500.0, "D"), "wind_speed", "above 0"),
    (lambda: ground_level_centerline(1.0, -2.0, 500.0, "D"), "wind_speed", "above 0"),
    (lambda: ground_level_centerline(1.0, 2.0, 0.0, "D"), "distance", "above 0"),
    (lambda: ground_level_centerline(-1.0, 2.0, 500.0, "D"), "emission_rate", "at least 0"),
    (lambda: briggs_sigmas(500.0, "G"), "stability", "A, B, C, D, E, F, A-B"),
    (lambda: briggs_sigmas(500.0, "D", "suburban"), "terrain", "'open', 'rural', 'urban'"),
    (lambda: stability_class(0.0, True, "strong"), "wind_speed", "above 0"),
    (lambda: stability_class(3.0, True), "insolation", "strong"),
    (lambda: stability_class(3.0, True, "bright"), "insolation", "allowed"),
    (lambda: stability_class(3.0, False), "cloud_cover", "oktas"),
    (lambda: stability_class(3.0, False, cloud_cover=9), "cloud_cover", "oktas"),
    (lambda: distance_to_concentration(1.0, 2.0, 0.0, "D"), "concentration", "above 0"),
    (lambda: wind_speed_at_height(3.0, 0.0), "height", "above 0"),
])
def test_bad_inputs_raise_input_error(call, field, fragment):
    """Bad inputs raise InputError (a ValueError) naming the field and the allowed values."""
    with pytest.raises(InputError, match=fragment) as info:
        call()
    assert info.value.field == field
    assert isinstance(info.value, ValueError)


def test_coefficient_table_is_complete():
    """Both terrains carry all six classes."""
    for table in BRIGGS_COEFFICIENTS.values():
        assert sorted(table) == list("ABCDEF")
