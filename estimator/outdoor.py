"""Outdoor screening: Gaussian plume from a continuous ground-level release.

Pasquill-Gifford stability classes from wind and sun or cloud, Briggs's (1973)
dispersion coefficients for open country and urban areas, the ground-level
centreline concentration downwind of a ground-level source, the distance at which
it falls to a limit, wind speed at another height, and the plain
statements of where the screening model stops applying.

Intermediate stability classes. Pasquill's table gives "A-B", "B-C" and "C-D" in
some cells. `stability_class` returns these as they stand by default, and every
function taking a class accepts them: the dispersion coefficients (and wind-profile
exponents) of an intermediate class are the arithmetic mean of its two neighbours',
as Turner (1970) advises for the workbook curves (from memory). Ask
`stability_class(..., intermediate="stable")` for the more stable neighbour
instead, which gives the higher ground-level concentration.

Units: emission rates in kg/s, concentrations in kg/m3, distances and heights in m,
wind speeds in m/s.
"""

from __future__ import annotations

import math
import warnings
from dataclasses import dataclass
from typing import NamedTuple

import numpy as np

from .constants import GAS_CONSTANT, MOLAR_MASS_AIR, STANDARD_GRAVITY
from .checks import positive_array
from .errors import InputError, UllageWarning

__all__ = [
    "STABILITY_CLASSES",
    "INTERMEDIATE_CLASSES",
    "TERRAINS",
    "INSOLATION",
    "BRIGGS_COEFFICIENTS",
    "WIND_PROFILE_EXPONENTS",
    "BRIGGS_RANGE",
    "stability_class",
    "briggs_sigmas",
    "DispersionCoefficients",
    "ground_level_centerline",
    "distance_to_concentration",
    "EndpointDistance",
    "wind_speed_at_height",
    "screening_validity",
    "BRITTER_MCQUAID_CONTINUOUS",
    "britter_mcquaid_continuous",
    "DenseGasCriterion",
    "pool_source_criterion",
]

#: Pasquill-Gifford classes, very unstable (A) to moderately stable (F).
STABILITY_CLASSES = ("A", "B", "C", "D", "E", "F")

#: Intermediate classes of Pasquill's table, with their two neighbours.
INTERMEDIATE_CLASSES = {"A-B": ("A", "B"), "B-C": ("B", "C"), "C-D": ("C", "D")}

#: Terrain keywords: Briggs's open-country ("open", also "rural") and urban sets.
TERRAINS = {"open": "open", "rural": "open", "urban": "urban"}

#: Daytime incoming solar radiation categories of Pasquill's table.
INSOLATION = ("strong", "moderate", "slight")

#: Upper wind-speed bounds (10 m) of the rows of Pasquill's table. [m/s] Rows are
#: <2, 2-3, 3-5, 5-6 and >6 m/s; a speed on a bound goes to the higher row.
_WIND_ROW_BOUNDS = (2.0, 3.0, 5.0, 6.0)

#: Pasquill (1961), as keyed by Turner (1970), AP-26, Table 1: class by wind row.
#: Night cells for winds under 2 m/s are blank in the table; "F" is used (see
#: `stability_class`).
_DAY_TABLE = {
    "strong": ("A", "A-B", "B", "C", "C"),
    "moderate": ("A-B", "B", "B-C", "C-D", "D"),
    "slight": ("B", "C", "C", "D", "D"),
}
_NIGHT_TABLE = {
    "cloudy": ("F", "E", "D", "D", "D"),  # thinly overcast or >= 4/8 low cloud
    "clear": ("F", "F", "E", "D", "D"),  # <= 3/8 cloud
}

#: Briggs (1973) dispersion coefficients, sigma = a x (1 + b x)^p with x in m,
#: as (a, b, p) for sigma_y and sigma_z. Source: Briggs, G. A. (1973), Diffusion
#: Estimation for Small Emissions, ATDL Contribution File No. 79, NOAA; as
#: tabulated by Griffiths (1994), Atmos. Environ. 28(17), 2861-2865, Table 1, and
#: in the CCPS Guidelines for Chemical Process Quantitative Risk Analysis (2000),
#: Table 2.13. Open-country E and F sigma_z use the power -1, not -1/2 (a
#: misprint Griffiths discusses).
BRIGGS_COEFFICIENTS = {
    "open": {
        "A": ((0.22, 1e-4, -0.5), (0.20, 0.0, 0.0)),
        "B": ((0.16, 1e-4, -0.5), (0.12, 0.0, 0.0)),
        "C": ((0.11, 1e-4, -0.5), (0.08, 2e-4, -0.5)),
        "D": ((0.08, 1e-4, -0.5), (0.06, 1.5e-3, -0.5)),
        "E": ((0.06, 1e-4, -0.5), (0.03, 3e-4, -1.0)),
        "F": ((0.04, 1e-4, -0.5), (0.016, 3e-4, -1.0)),
    },
    "urban": {
        "A": ((0.32, 4e-4, -0.5), (0.24, 1e-3, 0.5)),
        "B": ((0.32, 4e-4, -0.5), (0.24, 1e-3, 0.5)),
        "C": ((0.22, 4e-4, -0.5), (0.20, 0.0, 0.0)),
        "D": ((0.16, 4e-4, -0.5), (0.14, 3e-4, -0.5)),
        "E": ((0.11, 4e-4, -0.5), (0.08, 1.5e-3, -0.5)),
        "F": ((0.11, 4e-4, -0.5), (0.08, 1.5e-3, -0.5)),
    },
}

#: Distances over which Briggs's formulas were fitted. [m] 100 m to 10 km.
BRIGGS_RANGE = (100.0, 10_000.0)

#: Wind-profile power-law exponents by class, u(z) = u_ref (z / z_ref)^p. US EPA
#: (1995), User's Guide for the Industrial Source Complex (ISC3) Dispersion
#: Models, Vol. II, EPA-454/B-95-003b, section 1.1.5 (rural values from Irwin
#: 1979, Atmos. Environ. 13, 191); from memory, checked against a second
#: transcription.
WIND_PROFILE_EXPONENTS = {
    "open": {"A": 0.07, "B": 0.07, "C": 0.10, "D": 0.15, "E": 0.35, "F": 0.55},
    "urban": {"A": 0.15, "B": 0.15, "C": 0.20, "D": 0.25, "E": 0.30, "F": 0.30},
}

#: Wind speed under which the screening plume is not meaningful. [m/s] About
#: 1 m/s, common practice: in near-calm the plume meanders and u -> 0 makes C blow up.
_CALM_WIND = 1.0

#: Britter & McQuaid's (1988) threshold for a continuous release: at or above it,
#: density effects on the dispersion matter. [-] Workbook on the Dispersion of Dense
#: Gases, HSE Contract Research Report 17/1988; also CCPS (1999), Guidelines for
#: Consequence Analysis of Chemical Releases.
BRITTER_MCQUAID_CONTINUOUS = 0.15


# --------------------------------------------------------------------- helpers

def terrain_key(terrain):
    """The key of `TERRAINS` a terrain text stands for (refused with the allowed ones)."""
    key = str(terrain).strip().lower()
    if key not in TERRAINS:
        raise InputError("terrain", f"unknown terrain {terrain!r}; allowed: "
                         f"{', '.join(repr(k) for k in TERRAINS)}")
    return TERRAINS[key]


def pasquill_classes(stability):
    """The one or two Pasquill classes a stability string stands for."""
    key = str(stability).strip().upper().replace("\u2013", "-").replace(" ", "")
    if key in STABILITY_CLASSES:
        return (key,)
    if key in INTERMEDIATE_CLASSES:
        return INTERMEDIATE_CLASSES[key]
    allowed = list(STABILITY_CLASSES) + list(INTERMEDIATE_CLASSES)
    raise InputError("stability", f"unknown stability class {stability!r}; allowed: "
                     f"{', '.join(allowed)}")


def _out_of_range_note(distance):
    lo, hi = float(np.min(distance)), float(np.max(distance))
    if lo < BRIGGS_RANGE[0] or hi > BRIGGS_RANGE[1]:
        return (f"distances {lo:g}-{hi:g} m reach outside 100 m - 10 km, the range "
                "Briggs's dispersion coefficients were fitted over; values there are "
                "extrapolations")
    return None


def _sigmas(x, classes, terrain):
    """Mean of Briggs's sigma_y, sigma_z over the given classes (no checks, no warnings)."""
    table = BRIGGS_COEFFICIENTS[terrain]
    sy = np.zeros_like(x)
    sz = np.zeros_like(x)
    for letter in classes:
        (ay, by, py), (az, bz, pz) = table[letter]
        sy = sy + ay * x * (1.0 + by * x) ** py
        sz = sz + az * x * (1.0 + bz * x) ** pz
    return sy / len(classes), sz / len(classes)


def centerline_concentration(rate, u, x, classes, terrain):
    """Ground-level centreline concentration of a ground source, inputs already checked.

    ``classes`` from `pasquill_classes`, ``terrain`` from `terrain_key`; rate [kg/s],
    u [m/s], x [m]; the result in kg/m3 (the body of `ground_level_centerline`).
    """
    sy, sz = _sigmas(x, classes, terrain)
    return rate / (math.pi * u * sy * sz)


def _same_shape(result, like):
    return float(result) if np.ndim(like) == 0 else result


# ------------------------------------------------------------------- functions

def stability_class(wind_speed, daytime, insolation=None, cloud_cover=None,
                    intermediate="table"):
    """Pasquill-Gifford stability class from wind speed and sun or cloud.

    Pasquill's key as given by Turner (1970), Table 1 (wind at 10 m):

    ========  ======  ========  ======  ===============  =======
    wind m/s  strong  moderate  slight  night >= 4/8     <= 3/8
    ========  ======  ========  ======  ===============  =======
    < 2       A       A-B       B       (F)              (F)
    2-3       A-B     B         C       E                F
    3-5       B       B-C       C       D                E
    5-6       C       C-D       D       D                D
    > 6       C       D         D       D                D
    ========  ======  ========  ======  ===============  =======

    A speed on a row boundary goes to the higher row. Class D applies to overcast
    skies (8/8) by day or night. The table leaves night winds under 2 m/s blank
    (near-calm nights, where the plume meanders); F, the most stable class here,
    is returned for them, and `screening_validity` flags winds under 1 m/s.

    Parameters
    ----------
    wind_speed : float
        Wind speed at 10 m. [m/s]
    daytime : bool
        True from about an hour after sunrise to an hour before sunset.
    insolation : str, optional
        Daytime incoming solar radiation: "strong", "moderate" or "slight" (Turner
        relates them to solar elevation above 60, 35-60 and 15-35 degrees in clear
        skies). Needed by day unless the sky is overcast.
    cloud_cover : float, optional
        Cloud cover in oktas (eighths of the sky), 0-8. Needed at night; 8
        (overcast) gives D by day too. [oktas]
    intermediate : str
        "table": return "A-B", "B-C" or "C-D" as the table gives them (the other
        functions average the neighbouring classes); "stable": return the more
        stable neighbour (B, C or D), the conservative choice for ground-level
        concentrations.

    Returns
    -------
    str
        One of "A"-"F", or "A-B", "B-C", "C-D" with ``intermediate="table"``.

    References
    ----------
    Pasquill, F. (1961), Meteorol. Mag. 90, 33-49; Turner, D. B. (1970), Workbook of
    Atmospheric Dispersion Estimates, US EPA AP-26, Table 1.

    Examples
    --------
    >>> stability_class(2.5, True, "strong"), stability_class(2.5, False, cloud_cover=2)
    ('A-B', 'F')
    >>> stability_class(2.5, True, "strong", intermediate="stable")
    'B'
    """
    u = np.asarray(wind_speed, dtype=float)
    if u.ndim != 0 or not np.isfinite(u) or u <= 0.0:
        raise InputError("wind_speed", "must be a single number above 0 m/s (wind at 10 m)")
    if intermediate not in ("table", "stable"):
        raise InputError("intermediate", f"unknown choice {intermediate!r}; allowed: "
                         "'table', 'stable'")
    if cloud_cover is not None:
        try:
            cloud = float(cloud_cover)
        except (TypeError, ValueError):
            raise InputError("cloud_cover",
                             f"expected a number of oktas, got {cloud_cover!r}") from None
        if not (0.0 <= cloud <= 8.0):
            raise InputError("cloud_cover", "give it in oktas (eighths of the sky), 0 to 8")
    row = int(np.searchsorted(_WIND_ROW_BOUNDS, float(u), side="right"))
    if cloud_cover is not None and float(cloud_cover) >= 8.0:
        result = "D"
    elif daytime:
        if insolation is None:
            raise InputError("insolation", "by day give 'strong', 'moderate' or 'slight' "
                             "(or cloud_cover=8 for an overcast sky)")
        key = str(insolation).strip().lower()
        if key not in _DAY_TABLE:
            raise InputError("insolation", f"unknown insolation {insolation!r}; allowed: "
                             f"{', '.join(INSOLATION)}")
        result = _DAY_TABLE[key][row]
    else:
        if cloud_cover is None:
            raise InputError("cloud_cover", "at night give the cloud cover in oktas (0-8)")
        result = _NIGHT_TABLE["cloudy" if float(cloud_cover) >= 4.0 else "clear"][row]
    if intermediate == "stable" and result in INTERMEDIATE_CLASSES:
        result = INTERMEDIATE_CLASSES[result][1]
    return result


class DispersionCoefficients(NamedTuple):
    """Plume spreads at a downwind distance.

    Attributes
    ----------
    sigma_y : float or numpy.ndarray
        Crosswind (horizontal) standard deviation of the plume. [m]
    sigma_z : float or numpy.ndarray
        Vertical standard deviation of the plume. [m]
    """

    sigma_y: object
    sigma_z: object


def briggs_sigmas(distance, stability, terrain="open") -> DispersionCoefficients:
    """Briggs's (1973) plume dispersion coefficients for open country or urban areas.

    Each is sigma = a x (1 + b x)^p with the coefficients of
    `BRIGGS_COEFFICIENTS` (open country: sigma_y = c x (1 + 0.0001 x)^-1/2 for all
    classes; the E and F sigma_z use (1 + 0.0003 x)^-1). Fitted for 100 m to
    10 km; outside that range the value is still computed and a warning is
    issued. Averaging time about 10 minutes (that of the Pasquill-Gifford curves).

    Parameters
    ----------
    distance : float or array_like
        Downwind distance from the source, above 0. [m]
    stability : str
        Pasquill class "A"-"F", or "A-B", "B-C", "C-D" (mean of the neighbours).
    terrain : str
        "open" (open country; "rural" is accepted) or "urban".

    Returns
    -------
    DispersionCoefficients
        (sigma_y, sigma_z). [m]

    Warns
    -----
    UllageWarning
        When a distance lies outside 100 m - 10 km.

    References
    ----------
    Briggs, G. A. (1973), Diffusion Estimation for Small Emissions, ATDL
    Contribution File No. 79, NOAA; Griffiths, R. F. (1994), Atmos. Environ.
    28(17), 2861-2865 (the formulas and their misprints).

    Examples
    --------
    >>> sy, sz = briggs_sigmas(1000.0, "D")
    >>> round(sy, 2), round(sz, 2)
    (76.28, 37.95)
    """
    x = positive_array(distance, "distance", "m", hint=" (downwind of the source)")
    classes = pasquill_classes(stability)
    land = terrain_key(terrain)
    note = _out_of_range_note(x)
    if note:
        warnings.warn(note, UllageWarning, stacklevel=2)
    sy, sz = _sigmas(x, classes, land)
    return DispersionCoefficients(_same_shape(sy, distance), _same_shape(sz, distance))


def ground_level_centerline(emission_rate, wind_speed, distance, stability, terrain="open"):
    r"""Centreline concentration at ground level downwind of a ground-level source.

    .. math:: C(x) = \frac{Q}{\pi u \sigma_y(x) \sigma_z(x)}

    the Gaussian plume with full reflection at the ground, source and receptor
    both at ground level. Continuous release, neutrally buoyant vapour, flat
    unobstructed ground, steady wind; about a 10-minute average.

    Parameters
    ----------
    emission_rate : float or array_like
        Continuous release rate Q, at least 0. [kg/s]
    wind_speed : float or array_like
        Mean wind speed u carrying the plume, above 0 (the 10 m value is the usual
        screening choice). [m/s]
    distance : float or array_like
        Downwind distance x. [m]
    stability : str
        Pasquill class, as for `briggs_sigmas`.
    terrain : str
        "open" or "urban".

    Returns
    -------
    float or numpy.ndarray
        Concentration on the plume axis at ground level. [kg/m3]

    References
    ----------
    Turner (1970), Workbook of Atmospheric Dispersion Estimates, AP-26, Eq. 3.4
    with H = 0, y = 0, z = 0; Briggs (1973) coefficients.

    Examples
    --------
    1 g/s, 2 m/s, class D open country, 1 km downwind:

    >>> round(ground_level_centerline(1e-3, 2.0, 1000.0, "D") * 1e9, 1)
    55.0
    """
    rate = np.asarray(emission_rate, dtype=float)
    if not np.all(np.isfinite(rate)) or np.any(rate < 0.0):
        raise InputError("emission_rate", "must be a finite rate of at least 0 kg/s")
    u = positive_array(wind_speed, "wind_speed", "m/s", hint="; calm conditions are outside "
                        "the Gaussian plume model")
    x = positive_array(distance, "distance", "m", hint=" (downwind of the source)")
    classes = pasquill_classes(stability)
    land = terrain_key(terrain)
    note = _out_of_range_note(x)
    if note:
        warnings.warn(note, UllageWarning, stacklevel=2)
    c = centerline_concentration(rate, u, x, classes, land)
    return float(c) if c.ndim == 0 else c


@dataclass(frozen=True)
class EndpointDistance:
    """Distance at which the plume centreline falls to a concentration of concern.

    Attributes
    ----------
    distance : float or None
        Downwind distance where the ground-level centreline concentration equals
        the endpoint [m]. 0.0 when it is already at or below it at `min_distance`
        (the plume exceeds it, if at all, only closer than that); None when it is
        still above it at `max_distance` (the endpoint lies farther away).
    found : bool
        True when a crossing was found between `min_distance` and `max_distance`.
    note : str
        The outcome in plain words.
    warnings : tuple of str
        Validity cautions (distance outside the fitted range).
    """

    distance: float | None
    found: bool
    note: str
    warnings: tuple[str, ...] = ()


def distance_to_concentration(emission_rate, wind_speed, concentration, stability,
                              terrain="open", max_distance=1e5,
                              min_distance=1.0) -> EndpointDistance:
    """Downwind distance at which the ground-level centreline falls to a concentration.

    The centreline concentration falls monotonically with distance for every
    class, so the crossing is unique; it is found by Brent's method on ln C
    against ln x (at most 200 iterations, relative tolerance 1e-10).

    Parameters
    ----------
    emission_rate : float
        Continuous release rate. [kg/s]
    wind_speed : float
        Mean wind speed, above 0. [m/s]
    concentration : float
        Endpoint (the concentration of a limit), above 0. [kg/m3]
    stability : str
        Pasquill class, as for `briggs_sigmas`.
    terrain : str
        "open" or "urban".
    max_distance : float
        Farthest distance searched. [m]
    min_distance : float
        Nearest distance searched; the point-source plume is singular at the
        source. [m]

    Returns
    -------
    EndpointDistance

    Examples
    --------
    >>> r = distance_to_concentration(1e-3, 2.0, 5.5e-8, "D")
    >>> round(r.distance, -1), r.found
    (1000.0, True)
    """
    from scipy.optimize import brentq

    rate = float(emission_rate)
    if not np.isfinite(rate) or rate < 0.0:
        raise InputError("emission_rate", "must be a finite rate of at least 0 kg/s")
    u = float(positive_array(wind_speed, "wind_speed", "m/s"))
    target = float(positive_array(concentration, "concentration", "kg/m3"))
    near = float(positive_array(min_distance, "min_distance", "m"))
    far = float(positive_array(max_distance, "max_distance", "m"))
    if far <= near:
        raise InputError("max_distance", f"must be beyond min_distance ({near:g} m)")
    classes = pasquill_classes(stability)
    land = terrain_key(terrain)

    def log_excess(log_x):
        return math.log(centerline_concentration(rate, u, np.exp(log_x), classes, land) / target)

    if rate == 0.0 or centerline_concentration(rate, u, near, classes, land) <= target:
        return EndpointDistance(0.0, False, f"the centreline is at or below the endpoint "
                                f"from {near:g} m on; it is exceeded, if at all, only "
                                "closer to the source")
    if centerline_concentration(rate, u, far, classes, land) > target:
        return EndpointDistance(None, False, f"the centreline is still above the endpoint "
                                f"at {far:g} m, the farthest distance searched",
                                (f"the endpoint lies beyond {far:g} m, outside the range "
                                 "of this screening model",))
    log_x = brentq(log_excess, math.log(near), math.log(far), xtol=1e-12, rtol=1e-10,
                   maxiter=200)
    x = math.exp(log_x)
    note = _out_of_range_note(np.array([x]))
    return EndpointDistance(x, True, "the centreline falls to the endpoint here",
                            (note,) if note else ())


def wind_speed_at_height(speed, height, reference_height=10.0, stability="D",
                         terrain="open"):
    """Wind speed at another height by the power law u(z) = u_ref (z / z_ref)^p.

    Exponents p by class from `WIND_PROFILE_EXPONENTS` (rural/open: 0.07, 0.07,
    0.10, 0.15, 0.35, 0.55; urban: 0.15, 0.15, 0.20, 0.25, 0.30, 0.30 for A-F; an
    intermediate class takes the mean of its neighbours).

    Parameters
    ----------
    speed : float or array_like
        Wind speed measured at `reference_height`. [m/s]
    height : float or array_like
        Height wanted, above 0. [m]
    reference_height : float
        Height of the measurement, 10 m (the standard anemometer height). [m]
    stability : str
        Pasquill class.
    terrain : str
        "open" or "urban".

    Returns
    -------
    float or numpy.ndarray
        Wind speed at `height`. [m/s]

    References
    ----------
    US EPA (1995), User's Guide for the Industrial Source Complex (ISC3) Dispersion
    Models, Vol. II, EPA-454/B-95-003b, wind-profile exponents; Irwin, J. S. (1979),
    Atmos. Environ. 13, 191-194.

    Examples
    --------
    >>> round(wind_speed_at_height(3.0, 2.0, stability="F"), 3)
    1.238
    """
    u = positive_array(speed, "speed", "m/s")
    z = positive_array(height, "height", "m")
    z_ref = float(positive_array(reference_height, "reference_height", "m"))
    classes = pasquill_classes(stability)
    land = terrain_key(terrain)
    exponent = sum(WIND_PROFILE_EXPONENTS[land][c] for c in classes) / len(classes)
    result = u * (z / z_ref) ** exponent
    return float(result) if result.ndim == 0 else result


def britter_mcquaid_continuous(reduced_gravity, volume_rate, wind_speed,
                               source_dimension=None) -> float:
    r"""Britter & McQuaid's criterion for density effects in a continuous release.

    .. math:: \frac{(g_0' q_0 / D)^{1/3}}{U}, \quad
              g_0' = g \frac{\rho_0 - \rho_a}{\rho_a}, \quad
              D = \sqrt{q_0 / U}

    Density effects on the dispersion matter where it is at least
    `BRITTER_MCQUAID_CONTINUOUS` (0.15); below, the release disperses as a
    passive (neutrally buoyant) plume.

    Parameters
    ----------
    reduced_gravity : float
        g0', from the density rho_0 of the released gas (here the saturated
        air-vapour mixture over the pool) and that of the air rho_a; at most 0
        means not denser than air. [m/s2]
    volume_rate : float
        Continuous volume release rate q0 of that gas, above 0. [m3/s]
    wind_speed : float
        U, at 10 m, above 0. [m/s]
    source_dimension : float, optional
        D. By default the workbook's characteristic length of a continuous
        release, (q0 / U)^(1/2). [m]

    Returns
    -------
    float
        The criterion's value; 0 for a release not denser than air. [-]

    References
    ----------
    Britter, R. E. & McQuaid, J. (1988), Workbook on the Dispersion of Dense Gases,
    HSE Contract Research Report 17/1988, Health and Safety Executive, Sheffield;
    CCPS (1999), Guidelines for Consequence Analysis of Chemical Releases, AIChE,
    section on dense-gas dispersion.

    Examples
    --------
    >>> round(britter_mcquaid_continuous(4.28, 55.6, 10.9), 3)
    0.433
    """
    g = float(reduced_gravity)
    q = float(positive_array(volume_rate, "volume release rate", "m3/s"))
    u = float(positive_array(wind_speed, "wind_speed", "m/s"))
    if not math.isfinite(g):
        raise InputError("reduced gravity", "must be a finite number in m/s2")
    d = math.sqrt(q / u) if source_dimension is None else float(
        positive_array(source_dimension, "source dimension", "m"))
    if g <= 0.0:
        return 0.0
    return (g * q / d) ** (1.0 / 3.0) / u


@dataclass(frozen=True)
class DenseGasCriterion:
    """Britter & McQuaid's criterion applied to the vapour-air mixture over a pool.

    Attributes
    ----------
    value : float
        (g0' q0 / D)^(1/3) / U. [-]
    threshold : float
        `BRITTER_MCQUAID_CONTINUOUS`. [-]
    dense : bool
        Whether density effects matter (value at or above the threshold).
    mixture_density, air_density : float
        Saturated air-vapour mixture over the pool, and air, at the pool
        temperature and pressure. [kg/m3]
    vapour_fraction : float
        Vapour in the saturated mixture. [volume fraction]
    reduced_gravity : float
        g0'. [m/s2]
    volume_rate : float
        q0, of the saturated mixture. [m3/s]
    source_dimension : float
        D = (q0 / U)^(1/2). [m]
    """

    value: float
    threshold: float
    dense: bool
    mixture_density: float
    air_density: float
    vapour_fraction: float
    reduced_gravity: float
    volume_rate: float
    source_dimension: float

    @property
    def statement(self) -> str:
        """The verdict in words."""
        verdict = ("density effects matter: near the pool the vapour slumps and spreads "
                   "along the ground as a dense gas, which this neutral-density plume does "
                   "not represent; use a dense-gas model" if self.dense else
                   "density effects do not matter; the plume disperses passively")
        return (f"Britter-McQuaid criterion for a continuous release (g0' q0 / D)^(1/3) / U "
                f"= {self.value:.2g} (threshold {self.threshold:g}; saturated vapour-air "
                f"mixture over the pool {self.mixture_density:.3g} kg/m3 against air "
                f"{self.air_density:.3g} kg/m3, q0 = {self.volume_rate:.2g} m3/s, D = "
                f"{self.source_dimension:.2g} m): {verdict}")


def pool_source_criterion(vapour_molar_rate, vapour_fraction, vapour_molar_mass,
                          temperature, pressure, wind_speed) -> DenseGasCriterion:
    """Britter & McQuaid's criterion for the vapour leaving a pool.

    The source gas is the saturated air-vapour mixture over the pool: vapour at
    its saturated volume fraction y_sat (Raoult's law over the liquid) in air, of
    density rho_0 = P (y_sat M_v + (1 - y_sat) M_air) / (R T), released at
    q0 = n R T / (P y_sat), where n is the evaporation rate in moles.

    Parameters
    ----------
    vapour_molar_rate : float
        Evaporation rate, above 0. [mol/s]
    vapour_fraction : float
        Saturated vapour fraction over the pool, above 0 and at most 1. [-]
    vapour_molar_mass : float
        Mean molar mass of the evaporating vapour. [kg/mol]
    temperature : float
        Pool and air temperature. [K]
    pressure : float
        Ambient pressure. [Pa]
    wind_speed : float
        At 10 m. [m/s]

    Returns
    -------
    DenseGasCriterion
    """
    y = float(vapour_fraction)
    if not (math.isfinite(y) and 0.0 < y <= 1.0):
        raise InputError("vapour fraction", "must be above 0 and at most 1")
    n = float(positive_array(vapour_molar_rate, "evaporation rate", "mol/s"))
    t = float(positive_array(temperature, "temperature", "K"))
    p = float(positive_array(pressure, "pressure", "Pa"))
    molar_volume = GAS_CONSTANT * t / p
    rho_air = MOLAR_MASS_AIR / molar_volume
    rho_mix = (y * float(vapour_molar_mass) + (1.0 - y) * MOLAR_MASS_AIR) / molar_volume
    g0 = STANDARD_GRAVITY * (rho_mix - rho_air) / rho_air
    q0 = n * molar_volume / y
    u = float(positive_array(wind_speed, "wind_speed", "m/s"))
    value = britter_mcquaid_continuous(g0, q0, u)
    return DenseGasCriterion(value, BRITTER_MCQUAID_CONTINUOUS,
                             value >= BRITTER_MCQUAID_CONTINUOUS, rho_mix, rho_air, y, g0,
                             q0, math.sqrt(q0 / u))


def screening_validity(wind_speed, distance, dense_gas=None) -> tuple[str, ...]:
    """Plain statements of where the screening plume does not apply to a case.

    Checks:

    - wind under about 1 m/s (near-calm: the plume meanders, C ~ 1/u blows up);
    - distances under 100 m or beyond 10 km (outside Briggs's fitted range);
    - density effects, where Britter & McQuaid's criterion for a continuous
      release says they matter (`pool_source_criterion`), with its value;
    - always: buildings, terrain and other obstacles are not modelled, and the
      result is a roughly 10-minute average on the plume axis.

    Parameters
    ----------
    wind_speed : float or array_like
        Wind speed used. [m/s]
    distance : float or array_like
        Distance(s) of interest. [m]
    dense_gas : DenseGasCriterion, optional
        The criterion for this release; warned about only where it is dense.

    Returns
    -------
    tuple of str
        The statements, most serious first.

    Examples
    --------
    >>> notes = screening_validity(0.5, 50.0)
    >>> len(notes)
    3
    """
    u = np.asarray(wind_speed, dtype=float)
    x = np.asarray(distance, dtype=float)
    if dense_gas is not None and not isinstance(dense_gas, DenseGasCriterion):
        raise InputError("dense_gas", "give the Britter-McQuaid criterion of the release "
                         "(estimator.outdoor.pool_source_criterion); a density ratio alone "
                         "does not say whether density effects matter")
    notes = []
    if np.any(u < _CALM_WIND):
        notes.append(f"wind under {_CALM_WIND:g} m/s (near-calm): the plume meanders and "
                     "pools, and the Gaussian plume model does not apply; treat the "
                     "result as unreliable and consider a puff or dense-gas model")
    if dense_gas is not None and dense_gas.dense:
        notes.append(dense_gas.statement)
    if np.any(x < BRIGGS_RANGE[0]):
        notes.append("distances under 100 m lie outside the range of the dispersion "
                     "coefficients; near the source the result depends on the source size "
                     "and local airflow, which the point-source plume ignores")
    if np.any(x > BRIGGS_RANGE[1]):
        notes.append("distances beyond 10 km lie outside the range of the dispersion "
                     "coefficients; wind shifts and terrain dominate there")
    notes.append("buildings, terrain and other obstacles are not modelled; the result is "
                 "a roughly 10-minute average on the plume axis, and short peaks at a point "
                 "are higher")
    return tuple(notes)
