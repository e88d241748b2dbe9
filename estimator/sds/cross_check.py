"""The sheet's own vapour pressure and flash point checked against what the model
computes from its composition."""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..errors import InputError, UllageError


#: Tolerance of the flash-point cross-check. [K] The estimate (temperature at which
#: the saturated vapour reaches the LFL, `estimator.headspace.estimated_flash_point`)
#: lies within 7 K of the published closed-cup flash point for most pure liquids
#: of the bundled table, with a median 1-4 K below it (ullage's own comparison with
#: IEC 60079-20-1 / NFPA 497 values, tests/test_headspace.py); 3 K more covers the
#: ideal-solution assumption for mixtures, which Liaw et al. (2002) found to
#: predict mixture flash points within a few kelvin for near-ideal mixtures.
FLASH_POINT_TOLERANCE = 10.0


@dataclass(frozen=True)
class SdsCheck:
    """The sheet's own value beside what the model computes from its composition.

    Attributes
    ----------
    quantity : str
        "vapour pressure" or "flash point".
    sheet : float
        The sheet's value. [Pa or K]
    model : float or None
        For the midpoint composition. [Pa or K]
    model_low, model_high : float or None
        Over the composition ranges. [Pa or K]
    tolerance : str
        The tolerance applied, in words.
    agrees : bool or None
        None when the model could not be computed.
    statement : str
        The comparison said plainly.
    """

    quantity: str
    sheet: float
    model: float | None
    model_low: float | None
    model_high: float | None
    tolerance: str
    agrees: bool | None
    statement: str


def check_vapor_pressure(sheet_model, t_sheet, p_sheet, pressure) -> SdsCheck:
    """The sheet's vapour pressure `p_sheet` [Pa] at `t_sheet` [K] beside Raoult's sum
    of the `SheetModel` at the midpoints and over the ranges (see
    `SdsReading.cross_check`)."""
    from ..headspace import headspace

    words = f"{p_sheet / 1000:.3g} kPa at {t_sheet - 273.15:.1f} °C"
    try:
        liq = sheet_model.liquid(sheet_model.midpoints(), "normalised midpoints")
        hs = headspace(liq, t_sheet, max(pressure, 1.01 * p_sheet, 1e3))
        p_sat = np.asarray(hs.saturation_pressures, dtype=float).reshape(-1)
        gammas = liq.activity_coefficients
        coefficients = gammas * p_sat
        model = float(np.sum(liq.mole_fractions * coefficients))
        x_hi = sheet_model.mole_fractions(sheet_model.extreme(coefficients, True))
        x_lo = sheet_model.mole_fractions(sheet_model.extreme(coefficients, False))
        high, low = float(x_hi @ coefficients), float(x_lo @ coefficients)
    except InputError as exc:
        return SdsCheck("vapour pressure", p_sheet, None, None, None, "", None,
                        f"The sheet gives a vapour pressure of {words}; the model could "
                        f"not compute one for its composition: {exc.reason}")
    u = hs.relative_uncertainty or 0.0
    lo_band, hi_band = low / (1 + u), high * (1 + u)
    agrees = lo_band <= p_sheet <= hi_band
    tolerance = (f"the span over the composition ranges widened by the stated "
                 f"uncertainty of the vapour-pressure methods (±{100 * u:.3g} %); "
                 "Raoult's law for an ideal solution unless activity coefficients are "
                 "given (mixtures with water or alcohols can deviate)")
    model_words = (f"{model / 1000:.3g} kPa at the midpoints ({low / 1000:.3g}-"
                   f"{high / 1000:.3g} kPa over the ranges)")
    if agrees:
        statement = (f"Vapour pressure: the sheet gives {words}; its composition gives "
                     f"{model_words}: consistent within {100 * u:.3g} %.")
    else:
        ratio = p_sheet / model if model > 0 else math.inf
        statement = (f"Vapour pressure DISAGREES: the sheet gives {words}, but its "
                     f"composition gives {model_words}, a factor {ratio:.3g} "
                     f"{'above' if ratio > 1 else 'below'} the midpoint value and beyond "
                     f"the {100 * u:.3g} % uncertainty of the method. A gap this large "
                     "usually means a wrong composition or a mislabelled unit (some "
                     "sheets give the vapour pressure of the main solvent): check the "
                     "sheet before trusting either.")
        if sheet_model.treatment and ratio > 1:
            statement += " The unidentified shares are taken as inert; if they are " \
                         "volatile they may explain part of the gap."
    return SdsCheck("vapour pressure", p_sheet, model, low, high, tolerance, agrees,
                    statement)


def check_flash_point(sheet_model, t_sheet, pressure) -> SdsCheck:
    """The sheet's flash point `t_sheet` [K] beside the temperature at which the
    saturated vapour of the `SheetModel` reaches its LFL, at the midpoints and at the
    range ends, within `FLASH_POINT_TOLERANCE` (see `SdsReading.cross_check`)."""
    from ..headspace import estimated_flash_point

    words = f"{t_sheet - 273.15:.1f} °C"
    tol = FLASH_POINT_TOLERANCE
    tolerance = (f"±{tol:g} K (the method's spread against published closed-cup flash "
                 "points, with a margin for mixtures)")
    try:
        mid_liquid = sheet_model.liquid(sheet_model.midpoints(), "normalised midpoints")
        mid = estimated_flash_point(mid_liquid, pressure).estimate
        c, _, kind = sheet_model.coefficients(t_sheet, pressure, (), "")
        if kind != "lfl":
            raise InputError("flash point", "no component has a lower flammability limit")
        estimates = [mid]
        for maximise in (True, False):
            w = sheet_model.extreme(c, maximise)
            estimates.append(estimated_flash_point(
                sheet_model.liquid(w, "range end"), pressure).estimate)
    except UllageError as exc:
        reason = getattr(exc, "reason", str(exc))
        return SdsCheck("flash point", t_sheet, None, None, None, tolerance, None,
                        f"The sheet gives a flash point of {words}; the model could not "
                        f"estimate one for its composition: {reason}")
    low, high = min(estimates), max(estimates)
    agrees = low - tol <= t_sheet <= high + tol
    model_words = (f"{mid - 273.15:.1f} °C at the midpoints ({low - 273.15:.1f} to "
                   f"{high - 273.15:.1f} °C over the ranges)")
    if agrees:
        statement = (f"Flash point: the sheet gives {words}; the temperature at which "
                     f"the saturated vapour of its composition reaches the LFL is "
                     f"{model_words}: consistent within {tol:g} K.")
    else:
        statement = (f"Flash point DISAGREES: the sheet gives {words}, but its "
                     f"composition reaches the LFL at {model_words}, more than {tol:g} K "
                     "apart. This usually means a wrong composition, a mislabelled unit "
                     "(°F for °C) or an open-cup value: check the sheet before trusting "
                     "either.")
    return SdsCheck("flash point", t_sheet, mid, low, high, tolerance, agrees, statement)
