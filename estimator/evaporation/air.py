"""Air properties and diffusion: Fuller's diffusivity in air, Sutherland's viscosity of
air, air density and kinematic viscosity, the Schmidt number.

SI in and out (K, Pa, kg/mol, m2/s).
"""

from __future__ import annotations

import warnings

import numpy as np

from ..checks import float_or_array, positive_array
from ..constants import (
    AIR_SUTHERLAND_CONSTANT,
    AIR_SUTHERLAND_TEMPERATURE,
    AIR_SUTHERLAND_VISCOSITY,
    BAR,
    FULLER_VOLUME_AIR,
    GAS_CONSTANT,
    MOLAR_MASS_AIR,
    STANDARD_ATMOSPHERE,
)
from ..errors import InputError, UllageWarning

__all__ = [
    "fuller_diffusivity",
    "air_dynamic_viscosity",
    "air_density",
    "air_kinematic_viscosity",
    "schmidt_number",
    "air_diffusivity",
]

#: Fuller, Schettler & Giddings' constant for D in cm2/s, T in K, P in bar and
#: M in g/mol (Poling, Prausnitz & O'Connell, 5th ed., Eq. 11-4.4).
FULLER_COEFFICIENT = 0.00143

_SQUARE_CENTIMETRE = 1e-4  # m2
GRAMS_PER_KILOGRAM = 1000.0
_CUBIC_CENTIMETRES_PER_CUBIC_METRE = 1e6


# --------------------------------------------------------------------------
# published equations


def fuller_diffusivity(temperature, pressure, molar_mass, diffusion_volume,
                       molar_mass_other=MOLAR_MASS_AIR,
                       diffusion_volume_other=FULLER_VOLUME_AIR):
    r"""Binary gas diffusion coefficient by the method of Fuller, Schettler & Giddings.

    .. math:: D_{AB} = \frac{0.00143\,T^{1.75}}{P\,M_{AB}^{1/2}
              \left[(\Sigma_v)_A^{1/3} + (\Sigma_v)_B^{1/3}\right]^2}

    with :math:`D_{AB}` in cm2/s, T in K, P in bar and
    :math:`M_{AB} = 2/(1/M_A + 1/M_B)` in g/mol; converted here to SI in and out.
    Fuller et al. report an average error of about 4-7 % for non-polar gases.

    Parameters
    ----------
    temperature : float or array_like
        Gas temperature. [K]
    pressure : float or array_like
        Total pressure. [Pa]
    molar_mass : float or array_like
        Molar mass of the diffusing species. [kg/mol]
    diffusion_volume : float or array_like
        Its sum of Fuller atomic diffusion volumes. [-]
    molar_mass_other : float
        Molar mass of the other gas, dry air by default. [kg/mol]
    diffusion_volume_other : float
        Its diffusion volume, 19.7 for air (Poling et al., Table 11-1). [-]

    Returns
    -------
    float or numpy.ndarray
        Binary diffusion coefficient. [m2/s]

    References
    ----------
    Fuller, E. N., Schettler, P. D. & Giddings, J. C. (1966), Ind. Eng. Chem.
    58(5), 18-27; Fuller, Ensley & Giddings (1969), J. Phys. Chem. 73, 3679.
    Form and volumes as in Poling, Prausnitz & O'Connell, The Properties of
    Gases and Liquids, 5th ed. (2001), Eq. 11-4.4 and Table 11-1.

    Examples
    --------
    Water vapour (diffusion volume 13.1) in air at 20 degC and 1 atm; the CRC
    Handbook ("Diffusion in gases", after Marrero & Mason 1972) gives
    2.42e-5 m2/s:

    >>> round(fuller_diffusivity(293.15, 101325.0, 0.018015, 13.1) * 1e5, 3)
    2.431
    """
    t = np.asarray(temperature, dtype=float)
    pressure_bar = np.asarray(pressure, dtype=float) / BAR
    m_a = np.asarray(molar_mass, dtype=float) * GRAMS_PER_KILOGRAM
    m_b = np.asarray(molar_mass_other, dtype=float) * GRAMS_PER_KILOGRAM
    reduced = 2.0 / (1.0 / m_a + 1.0 / m_b)
    volumes = (np.cbrt(np.asarray(diffusion_volume, dtype=float))
               + np.cbrt(np.asarray(diffusion_volume_other, dtype=float)))**2
    d_cm2_per_s = FULLER_COEFFICIENT * t**1.75 / (pressure_bar * np.sqrt(reduced) * volumes)
    return float_or_array(d_cm2_per_s * _SQUARE_CENTIMETRE)


def air_dynamic_viscosity(temperature):
    r"""Dynamic viscosity of air by Sutherland's law.

    .. math:: \mu = \mu_0 \left(\frac{T}{T_0}\right)^{3/2} \frac{T_0 + S}{T + S}

    with :math:`\mu_0` = 1.716e-5 Pa s at :math:`T_0` = 273.15 K and S = 110.4 K;
    independent of pressure in the dilute-gas range.

    Parameters
    ----------
    temperature : float or array_like
        Air temperature. [K]

    Returns
    -------
    float or numpy.ndarray
        Dynamic viscosity. [Pa s]

    References
    ----------
    Sutherland, W. (1893), Phil. Mag. 36, 507; constants from White, Viscous
    Fluid Flow, 3rd ed. (2006), Table 1-2.

    Examples
    --------
    >>> round(air_dynamic_viscosity(298.15) * 1e5, 3)
    1.837
    """
    t = np.asarray(temperature, dtype=float)
    t0 = AIR_SUTHERLAND_TEMPERATURE
    s = AIR_SUTHERLAND_CONSTANT
    return float_or_array(AIR_SUTHERLAND_VISCOSITY * (t / t0) ** 1.5 * (t0 + s) / (t + s))


def air_density(temperature, pressure=STANDARD_ATMOSPHERE):
    """Density of dry air as an ideal gas, p M / (R T).

    Parameters
    ----------
    temperature : float or array_like
        Air temperature. [K]
    pressure : float or array_like
        Air pressure, 101325 Pa by default. [Pa]

    Returns
    -------
    float or numpy.ndarray
        Density. [kg/m3]

    Examples
    --------
    >>> round(air_density(298.15), 4)
    1.1839
    """
    t = np.asarray(temperature, dtype=float)
    return float_or_array(np.asarray(pressure, dtype=float) * MOLAR_MASS_AIR / (GAS_CONSTANT * t))


def air_kinematic_viscosity(temperature, pressure=STANDARD_ATMOSPHERE):
    """Kinematic viscosity of dry air: Sutherland's viscosity over ideal-gas density.

    Parameters
    ----------
    temperature, pressure : float or array_like
        As for `air_density`. [K], [Pa]

    Returns
    -------
    float or numpy.ndarray
        Kinematic viscosity. [m2/s]

    References
    ----------
    White, Viscous Fluid Flow, 3rd ed. (2006), Table 1-2 (Sutherland constants).

    Examples
    --------
    About 1.55e-5 m2/s at 25 degC and 1 atm (handbooks give 1.56e-5, from memory):

    >>> round(air_kinematic_viscosity(298.15) * 1e5, 3)
    1.552
    """
    return float_or_array(np.asarray(air_dynamic_viscosity(temperature))
                / np.asarray(air_density(temperature, pressure)))


def schmidt_number(kinematic_viscosity, diffusivity):
    """Schmidt number, the ratio of momentum to mass diffusivity, Sc = ν / D.

    Parameters
    ----------
    kinematic_viscosity : float or array_like
        Kinematic viscosity of the air. [m2/s]
    diffusivity : float or array_like
        Diffusion coefficient of the vapour in air. [m2/s]

    Returns
    -------
    float or numpy.ndarray
        Schmidt number. [-]

    Examples
    --------
    >>> schmidt_number(1.5e-5, 1.0e-5)
    1.5
    """
    return float_or_array(np.asarray(kinematic_viscosity, dtype=float)
                / np.asarray(diffusivity, dtype=float))


# --------------------------------------------------------------------------
# substance-level estimates


def diffusion_volume_of(sub, field: str) -> tuple[float, str | None]:
    """The substance's Fuller diffusion volume, or an estimate with a note."""
    if sub.diffusion_volume is not None:
        return float(sub.diffusion_volume), None
    if sub.liquid_density is not None:
        volume = sub.molar_mass / sub.liquid_density * _CUBIC_CENTIMETRES_PER_CUBIC_METRE
        return volume, (
            f"{sub.name}: no Fuller diffusion volume is known; its liquid molar volume "
            f"({volume:.0f} cm3/mol) was used instead (for most organic liquids it lies "
            "within 15 % of the Fuller sum, changing the mass-transfer coefficient by "
            "about 3 %; for small hydrogen-bonded molecules such as water and methanol "
            "it is up to 40 % larger, about 7 % on the coefficient)")
    raise InputError(field, (
        f"{sub.name} has neither a Fuller diffusion volume nor a liquid density, so "
        "its diffusion coefficient in air cannot be estimated; give the liquid density "
        "(safety data sheet) or use model='epa-rmp', which needs neither"))


def air_diffusivity(substance_or_key, temperature, pressure=STANDARD_ATMOSPHERE):
    """Diffusion coefficient of a substance's vapour in air, by Fuller's method.

    Uses the substance's Fuller diffusion volume; without one, its liquid molar
    volume M / ρ (in cm3/mol) stands in, with an `UllageWarning`.

    Parameters
    ----------
    substance_or_key : Substance or str
    temperature : float or array_like
        [K]
    pressure : float
        [Pa]

    Returns
    -------
    float or numpy.ndarray
        [m2/s]
    """
    from ..substances import as_substance

    sub = as_substance(substance_or_key, "substance_or_key")
    t = positive_array(temperature, "temperature", "K")
    p = positive_array(pressure, "pressure", "Pa")
    volume, note = diffusion_volume_of(sub, "substance_or_key")
    if note:
        warnings.warn(note, UllageWarning, stacklevel=2)
    return fuller_diffusivity(t, p, sub.molar_mass, volume)
