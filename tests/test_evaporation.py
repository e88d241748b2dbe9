"""Pool evaporation: transport properties, the two rate models, pool lifetime, mixtures."""

import dataclasses
import math
import warnings

import numpy as np
import pytest

from estimator import evaporation as ev
from estimator.constants import GAS_CONSTANT, MOLAR_MASS_AIR, STANDARD_ATMOSPHERE
from estimator.errors import InputError, OutOfRangeError, UllageWarning
from estimator.substances import TABLE_PATH, user_substance

needs_table = pytest.mark.skipif(not TABLE_PATH.exists(),
                                 reason="bundled substance table not built yet")

#: Fuller atomic diffusion volumes, Poling, Prausnitz & O'Connell, 5th ed.,
#: Table 11-1 (from memory): C, H, O, Cl and the aromatic-ring increment.
FULLER_INCREMENTS = {"C": 15.9, "H": 2.31, "O": 6.11, "Cl": 21.0, "ring": -18.3}


def fuller_sum(carbon=0, hydrogen=0, oxygen=0, chlorine=0, rings=0):
    """Sum of Fuller atomic diffusion volumes from atom counts (Poling Table 11-1)."""
    f = FULLER_INCREMENTS
    return (carbon * f["C"] + hydrogen * f["H"] + oxygen * f["O"] + chlorine * f["Cl"]
            + rings * f["ring"])


def quiet(function, *args, **kwargs):
    """Call with ullage's cautions silenced."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        return function(*args, **kwargs)


#: A toluene stand-in defined the way a user would, from handbook values: 92.14
#: g/mol, Tb 383.75 K, 2.91 kPa at 20 degC and 3.79 kPa at 25 degC, 866.9 kg/m3,
#: ΔHvap(Tb) 33.18 kJ/mol, Tc 591.75 K (CRC Handbook, from memory), with the
#: Fuller sum for C7H8 (one aromatic ring).
TOLUENE = dataclasses.replace(
    user_substance("Toluene (user)", 0.09214, 383.75, [(293.15, 2910.0), (298.15, 3790.0)],
                   liquid_density=866.9, enthalpy_of_vaporization=33180.0,
                   critical_temperature=591.75, melting_point=178.2),
    diffusion_volume=fuller_sum(7, 8, rings=1))

#: An acetone stand-in: 58.08 g/mol, Tb 329.2 K, 24.6 kPa at 20 degC, 784.5 kg/m3,
#: ΔHvap(Tb) 29.1 kJ/mol, Tc 508.1 K, Tm 178.5 K (CRC Handbook, from memory).
ACETONE = dataclasses.replace(
    user_substance("Acetone (user)", 0.05808, 329.2, [(293.15, 24600.0)],
                   liquid_density=784.5, enthalpy_of_vaporization=29100.0,
                   critical_temperature=508.1, melting_point=178.5),
    diffusion_volume=fuller_sum(3, 6, 1))


# ---------------------------------------------------------------- diffusivity

def test_fuller_unit_conversion():
    """SI in/out equals Poling Eq. 11-4.4 evaluated by hand in cm2/s, bar and g/mol."""
    t, volume = 310.0, 90.0
    m_ab = 2.0 / (1.0 / 78.11 + 1.0 / (MOLAR_MASS_AIR * 1000.0))
    by_hand_cm2 = 0.00143 * t**1.75 / (1.0 * m_ab**0.5 * (volume**(1 / 3) + 19.7**(1 / 3))**2)
    assert ev.fuller_diffusivity(t, 1e5, 0.07811, volume) == pytest.approx(by_hand_cm2 * 1e-4,
                                                                          rel=1e-12)


def test_fuller_pressure_and_temperature_scaling():
    """D goes as T^1.75 / P, the form of Fuller's equation."""
    d1 = ev.fuller_diffusivity(300.0, 101325.0, 0.1, 100.0)
    assert ev.fuller_diffusivity(300.0, 2 * 101325.0, 0.1, 100.0) == pytest.approx(d1 / 2)
    assert ev.fuller_diffusivity(600.0, 101325.0, 0.1, 100.0) == pytest.approx(d1 * 2**1.75)


def test_fuller_water_in_air_against_crc_handbook():
    """Water-air within 8 % of the CRC Handbook's "Diffusion in gases" table."""
    # CRC Handbook of Chemistry and Physics, "Diffusion in gases" (after Marrero &
    # Mason 1972, J. Phys. Chem. Ref. Data 1, 3): 0.242 cm2/s at 293.15 K and 0.399
    # cm2/s at 373.15 K, 101.325 kPa. Water's molecular volume 13.1: Poling Table
    # 11-1 (from memory).
    d = ev.fuller_diffusivity(np.array([293.15, 373.15]), 101325.0, 0.018015, 13.1)
    np.testing.assert_allclose(d, [0.242e-4, 0.399e-4], rtol=0.08)


def test_fuller_carbon_dioxide_in_air_against_crc_handbook():
    """CO2-air: 0.160 cm2/s at 293.15 K (CRC Handbook, "Diffusion in gases");
    Fuller with the molecular volume 26.7 (Poling Table 11-1, from memory) within 6 %."""
    assert ev.fuller_diffusivity(293.15, 101325.0, 0.04401, 26.7) == pytest.approx(
        0.160e-4, rel=0.06)


def test_fuller_toluene_in_air_against_measurement():
    """Toluene-air at 25 degC: 0.0849 cm2/s measured by Lugg (1968), Anal. Chem. 40, 1072
    (from memory); Fuller with the C7H8 sum is within 10 %."""
    d = ev.fuller_diffusivity(298.15, 101325.0, 0.09214, fuller_sum(7, 8, rings=1))
    assert d == pytest.approx(0.0849e-4, rel=0.10)


def test_liquid_molar_volume_stands_in_for_fuller_sum():
    """For organic liquids M/ρ (CRC densities at 20-25 degC, from memory) lies within
    15 % of the Fuller sum from Poling Table 11-1, as the fallback's note states."""
    cases = {  # molar mass g/mol, density kg/m3, Fuller sum
        "benzene": (78.11, 876.5, fuller_sum(6, 6, rings=1)),
        "toluene": (92.14, 866.9, fuller_sum(7, 8, rings=1)),
        "n-hexane": (86.18, 660.6, fuller_sum(6, 14)),
        "n-octane": (114.23, 702.6, fuller_sum(8, 18)),
        "acetone": (58.08, 784.5, fuller_sum(3, 6, 1)),
        "ethanol": (46.07, 789.3, fuller_sum(2, 6, 1)),
        "ethyl acetate": (88.11, 902.0, fuller_sum(4, 8, 2)),
        "dichloromethane": (84.93, 1326.6, fuller_sum(1, 2, chlorine=2)),
    }
    for name, (molar_mass, density, fuller) in cases.items():
        assert molar_mass / density * 1000.0 == pytest.approx(fuller, rel=0.15), name


def test_diffusivity_fallback_warns_and_missing_data_raises():
    """Without a Fuller volume the liquid molar volume is used with a warning; without a
    density as well, the error names the substance argument and suggests epa-rmp."""
    no_volume = dataclasses.replace(TOLUENE, diffusion_volume=None)
    with pytest.warns(UllageWarning, match="liquid molar volume"):
        d = ev.air_diffusivity(no_volume, 298.15)
    assert d == pytest.approx(ev.air_diffusivity(TOLUENE, 298.15), rel=0.05)
    bare = dataclasses.replace(no_volume, liquid_density=None)
    with pytest.raises(InputError, match="epa-rmp") as info:
        ev.evaporation_rate(bare, 298.15, 1.0, 1.0)
    assert info.value.field == "substance_or_key"
    assert quiet(ev.evaporation_rate, bare, 298.15, 1.0, 1.0, model="epa-rmp") > 0


# ---------------------------------------------------------------------- air

@pytest.mark.requires_coolprop
def test_air_kinematic_viscosity_against_coolprop():
    """Sutherland over ideal-gas density within 1 % of CoolProp's air (Lemmon et al.
    2000 equation of state, Lemmon & Jacobsen 2004 viscosity), 250-350 K, 0.8-1.1 bar."""
    import CoolProp.CoolProp as cp

    for t in (250.0, 273.15, 298.15, 320.0, 350.0):
        for p in (80000.0, 101325.0, 110000.0):
            reference = cp.PropsSI("V", "T", t, "P", p, "Air") / cp.PropsSI(
                "D", "T", t, "P", p, "Air")
            assert ev.air_kinematic_viscosity(t, p) == pytest.approx(reference, rel=0.01)


def test_air_kinematic_viscosity_handbook_value():
    """1.56e-5 m2/s for air at 25 degC and 1 atm (engineering tables, from memory),
    within 1 %; arrays keep their shape."""
    assert ev.air_kinematic_viscosity(298.15) == pytest.approx(1.56e-5, rel=0.01)
    out = ev.air_kinematic_viscosity(np.array([[280.0, 300.0]]))
    assert out.shape == (1, 2) and out[0, 1] > out[0, 0]


@pytest.mark.requires_coolprop
def test_air_density_against_coolprop():
    """Ideal-gas dry air within 0.1 % of CoolProp's air at 1 atm, 260-320 K."""
    import CoolProp.CoolProp as cp

    for t in (260.0, 293.15, 320.0):
        assert ev.air_density(t) == pytest.approx(
            cp.PropsSI("D", "T", t, "P", STANDARD_ATMOSPHERE, "Air"), rel=1e-3)


def test_schmidt_number_of_toluene_vapour():
    """Sc of toluene in air at 25 degC is about 1.9 (ν 1.56e-5 over D 0.0849 cm2/s
    measured by Lugg 1968, from memory: 1.84); ullage's Fuller-based value within 6 %."""
    sc = ev.schmidt_number(ev.air_kinematic_viscosity(298.15), ev.air_diffusivity(TOLUENE,
                                                                                   298.15))
    assert sc == pytest.approx(1.56e-5 / 0.0849e-4, rel=0.06)


# ------------------------------------------------------------ rate equations

def test_mackay_matsugu_si_form_equals_original_units():
    """k [m/s] × 3600 equals 0.0292 U^0.78 X^-0.11 Sc^-0.67 with U, k in m/h
    (Mackay & Matsugu 1973); the SI coefficient is the 0.00482 of the literature."""
    u, x, sc = np.array([0.5, 1.5, 6.0]), np.array([0.3, 5.0, 40.0]), np.array([0.6, 1.9, 2.8])
    k_m_per_h = 0.0292 * (u * 3600.0)**0.78 * x**-0.11 * sc**-0.67
    np.testing.assert_allclose(ev.mackay_matsugu_coefficient(u, x, sc) * 3600.0, k_m_per_h,
                               rtol=1e-12)
    assert ev.MACKAY_MATSUGU_COEFFICIENT_SI == pytest.approx(0.00482, rel=1e-3)


def test_evaporation_flux_form_and_clipping():
    """Flux = k (p - p_air) M / (R T), and zero, not negative, when p_air > p."""
    assert ev.evaporation_flux(0.004, 5000.0, 0.1, 300.0, 1000.0) == pytest.approx(
        0.004 * 4000.0 * 0.1 / (GAS_CONSTANT * 300.0))
    out = ev.evaporation_flux(0.004, np.array([100.0, 5000.0]), 0.1, 300.0, 2000.0)
    assert out[0] == 0.0 and out[1] > 0.0


def test_epa_rmp_unit_conversion_against_pint():
    """Eq. D-1 evaluated in its own units (lb/min, ft2, mmHg; EPA 550-B-99-009
    Appendix D) with pint's conversions equals the SI function."""
    from estimator.units import registry

    q = registry().Quantity
    molar_mass, vp, area, wind, t = 0.09214, 3790.0, 100.0, 1.5, 298.15
    area_ft2 = q(area, "m**2").to("ft**2").magnitude
    vp_mmhg = q(vp, "Pa").to("mmHg").magnitude
    lb_per_min = 0.284 * wind**0.78 * 92.14**(2 / 3) * area_ft2 * vp_mmhg / (82.05 * t)
    expected = q(lb_per_min, "lb/min").to("kg/s").magnitude
    assert ev.epa_rmp_rate(molar_mass, vp, area, wind, t) == pytest.approx(expected,
                                                                           rel=1e-9)


def test_epa_rmp_scales_linearly_with_area_and_pressure():
    """Eq. D-1 is linear in area and vapour pressure and goes as U^0.78."""
    base = ev.epa_rmp_rate(0.1, 1000.0, 10.0, 2.0, 300.0)
    assert ev.epa_rmp_rate(0.1, 3000.0, 20.0, 2.0, 300.0) == pytest.approx(6 * base)
    assert ev.epa_rmp_rate(0.1, 1000.0, 10.0, 4.0, 300.0) == pytest.approx(base * 2**0.78)


def toluene_rates_by_hand(area, wind):
    """(EPA Eq. D-1, Mackay-Matsugu) for toluene at 25 degC, each evaluated in the
    units of its paper from outside inputs: p_sat 3.79 kPa (28.43 mmHg) and M 92.14
    g/mol (CRC Handbook, from memory); for Mackay & Matsugu (1973), k = 0.0292
    U^0.78 X^-0.11 Sc^-0.67 in m/h with U in m/h, Sc = ν/D from air's 1.56e-5 m2/s
    (engineering tables, from memory) and toluene's measured D = 0.0849 cm2/s (Lugg
    1968, from memory). [kg/s]"""
    area_ft2 = area / 0.09290304                              # ft2, exact (NIST SP 811)
    vp_mmhg = 3790.0 / 133.322368                              # mmHg, exact definition
    epa_lb_per_min = 0.284 * wind**0.78 * 92.14**(2 / 3) * area_ft2 * vp_mmhg / (82.05 * 298.15)
    diameter = math.sqrt(4.0 * area / math.pi)
    k_m_per_h = 0.0292 * (wind * 3600.0)**0.78 * diameter**-0.11 * (1.56e-5 / 0.0849e-4)**-0.67
    mm = k_m_per_h / 3600.0 * area * 3790.0 * 0.09214 / (8.314462618 * 298.15)
    return epa_lb_per_min * 0.45359237 / 60.0, mm


def test_models_agree_within_a_factor_of_two_for_toluene():
    """Toluene, 25 degC, 100 m2, 1.5 m/s: each model against its published equation
    evaluated by hand (toluene_rates_by_hand: EPA 0.0752 kg/s, Mackay-Matsugu
    0.0475 kg/s, ratio 1.58), and the ratio within the factor of about 2 expected.
    EPA within 1 % (same inputs, unit conversions exact); Mackay-Matsugu and the
    ratio within 6 %: ullage's D comes from the Fuller correlation, stated to about
    5 % (Poling et al. 2001, Sec. 11-4), which enters as D^0.67."""
    epa, mm = toluene_rates_by_hand(100.0, 1.5)
    comparison = ev.compare_models(TOLUENE, 298.15, 100.0, 1.5)
    assert comparison.epa_rmp == pytest.approx(epa, rel=0.01)
    assert comparison.mackay_matsugu == pytest.approx(mm, rel=0.06)
    assert comparison.ratio == pytest.approx(epa / mm, rel=0.06)
    assert 1.0 < comparison.ratio < 2.0


def test_models_agree_for_a_small_indoor_spill():
    """Acetone, 20 degC, 1 m2, 1 m/s: ratio between 1 and 2 (observed 1.32)."""
    comparison = ev.compare_models(ACETONE, 293.15, 1.0, 1.0)
    assert 1.0 < comparison.ratio < 2.0


# ---------------------------------------------------------------- geometry

def test_pool_geometry():
    """1 m3 at the EPA's 1 cm covers 100 m2; a dike caps the area; circle diameter."""
    assert ev.pool_area(1.0) == pytest.approx(100.0)
    assert ev.pool_area(1.0, 0.05) == pytest.approx(20.0)
    assert ev.spill_pool_area(1.0) == pytest.approx(100.0)
    assert ev.spill_pool_area(1.0, dike_area=30.0) == pytest.approx(30.0)
    assert ev.spill_pool_area(0.1, dike_area=30.0) == pytest.approx(10.0)
    assert ev.pool_diameter(math.pi) == pytest.approx(2.0)
    np.testing.assert_allclose(ev.pool_diameter(np.array([math.pi, 4 * math.pi])), [2, 4])


def test_pool_geometry_rejects_bad_input():
    """Zero or negative volume, depth, area and NaN raise InputError naming the field."""
    for call, field in ((lambda: ev.pool_area(0.0), "volume"),
                        (lambda: ev.pool_area(1.0, -0.01), "depth"),
                        (lambda: ev.pool_diameter(float("nan")), "area"),
                        (lambda: ev.spill_pool_area(1.0, dike_area=0.0), "dike_area")):
        with pytest.raises(InputError) as info:
            call()
        assert info.value.field == field


# ----------------------------------------------------------- stable API

def test_evaporation_rate_by_hand():
    """The public rate for both models against their published equations evaluated by
    hand in their own units (toluene_rates_by_hand), 20 m2 at 3 m/s: EPA within 1 %,
    Mackay-Matsugu within the 6 % of the Fuller diffusivity (see above)."""
    epa_hand, mm_hand = toluene_rates_by_hand(20.0, 3.0)
    assert ev.evaporation_rate(TOLUENE, 298.15, 20.0, 3.0) == pytest.approx(mm_hand, rel=0.06)
    epa = ev.evaporation_rate(TOLUENE, 298.15, 20.0, 3.0, model="epa-rmp")
    assert epa == pytest.approx(epa_hand, rel=0.01)


def test_evaporation_rate_arrays_broadcast():
    """Arrays of temperature and wind broadcast; scalars give floats."""
    out = ev.evaporation_rate(TOLUENE, np.array([283.15, 293.15, 303.15]), 5.0,
                              np.array([1.0, 2.0, 4.0]))
    assert out.shape == (3,) and np.all(np.diff(out) > 0)
    assert isinstance(ev.evaporation_rate(TOLUENE, 293.15, 5.0, 2.0), float)


def test_background_partial_pressure_reduces_and_stops_evaporation():
    """Vapour already in the air lowers the rate; at or above p_sat the rate is zero
    (no condensation), with a note."""
    full = ev.evaporation_rate(TOLUENE, 298.15, 5.0, 2.0)
    half = ev.evaporation_rate(TOLUENE, 298.15, 5.0, 2.0, partial_pressure_air=1895.0)
    assert half == pytest.approx(full / 2, rel=0.02)
    estimate = ev.evaporation_estimate(TOLUENE, 298.15, 5.0, 2.0, partial_pressure_air=1e4)
    assert estimate.rate == 0.0
    assert any("condensation" in w for w in estimate.warnings)


def test_unknown_model_lists_both():
    """An unknown model keyword raises ValueError naming both models."""
    with pytest.raises(ValueError, match="mackay-matsugu.*epa-rmp"):
        ev.evaporation_rate(TOLUENE, 298.15, 1.0, 1.0, model="sutton")


@pytest.mark.parametrize("kwargs, field", [
    ({"area": 0.0}, "area"),
    ({"area": -2.0}, "area"),
    ({"wind_speed": 0.0}, "wind_speed"),
    ({"temperature": float("nan")}, "temperature"),
    ({"area": float("nan")}, "area"),
    ({"partial_pressure_air": -1.0}, "partial_pressure_air"),
    ({"pressure": 0.0}, "pressure"),
])
def test_evaporation_rate_rejects_bad_input(kwargs, field):
    """Non-positive area or wind, NaN and negative pressures raise InputError by name."""
    args = {"temperature": 298.15, "area": 1.0, "wind_speed": 1.0, **kwargs}
    with pytest.raises(InputError) as info:
        ev.evaporation_rate(TOLUENE, args.pop("temperature"), args.pop("area"),
                            args.pop("wind_speed"), **args)
    assert info.value.field == field


def test_boiling_pool_is_refused():
    """At or above the boiling point the error says it is a boiling pool / flashing
    release; so does a pressure below the vapour pressure (high altitude)."""
    for t in (TOLUENE.boiling_point, TOLUENE.boiling_point + 5.0):
        with pytest.raises(OutOfRangeError, match="boiling pool") as info:
            ev.evaporation_rate(TOLUENE, t, 1.0, 1.0)
        assert info.value.field == "temperature"
    with pytest.raises(OutOfRangeError, match="flashing"):
        ev.evaporation_rate(ACETONE, 320.0, 1.0, 1.0, pressure=60000.0)


def test_low_air_speed_and_high_volatility_are_flagged():
    """Indoor air speeds and near-boiling pools give a result and a warning."""
    with pytest.warns(UllageWarning, match="Lennert"):
        ev.evaporation_rate(TOLUENE, 298.15, 1.0, 0.1)
    with pytest.warns(UllageWarning, match="under-predict by a factor"):
        ev.evaporation_rate(ACETONE, 320.0, 1.0, 2.0)


# ------------------------------------------------------------ pool lifetime

def test_fixed_area_pool_empties_linearly():
    """Fixed (diked) area: constant rate, m0 / R lifetime, zero rate afterwards."""
    rate = ev.evaporation_rate(TOLUENE, 293.15, 4.0, 2.0)
    result = ev.pool_depletion(TOLUENE, 293.15, 10.0, 4.0, 2.0,
                               times=np.array([0.0, 100.0, 1e7]))
    assert result.depletion_time == pytest.approx(10.0 / rate)
    np.testing.assert_allclose(result.mass_remaining, [10.0, 10.0 - 100.0 * rate, 0.0])
    np.testing.assert_allclose(result.evaporation_rate, [rate, rate, 0.0])
    np.testing.assert_allclose(result.mass_remaining + result.mass_evaporated, 10.0)


def test_shrinking_pool_matches_numerical_integration():
    """Constant-depth pool: the analytic power-law (Mackay-Matsugu) and exponential
    (EPA) solutions match a numerical integration of dm/dt = -R(A(m))."""
    from scipy.integrate import solve_ivp

    m0, a0 = 5.0, 2.0
    for model in ("mackay-matsugu", "epa-rmp"):
        result = ev.pool_depletion(TOLUENE, 293.15, m0, a0, 2.0, model=model,
                                   area_shrinks=True, times=np.linspace(0, 2e4, 21))

        def rhs(_t, m):
            area = a0 * max(m[0], 0.0) / m0
            return [-quiet(ev.evaporation_rate, TOLUENE, 293.15, max(area, 1e-12), 2.0,
                           model=model)]

        numeric = solve_ivp(rhs, (0, 2e4), [m0], t_eval=result.times, rtol=1e-9, atol=1e-12)
        np.testing.assert_allclose(result.mass_remaining, numeric.y[0], rtol=1e-5)
        assert result.mass_remaining[-1] < m0
    assert result.depletion_time == pytest.approx(
        -math.log(ev.DEPLETED_FRACTION) * m0 / result.initial_rate)


def test_pool_depletion_rejects_bad_mass_and_arrays():
    """initial_mass must be positive; temperature must be a single value here."""
    with pytest.raises(InputError) as info:
        ev.pool_depletion(TOLUENE, 293.15, 0.0, 1.0, 1.0)
    assert info.value.field == "initial_mass"
    with pytest.raises(InputError, match="single number"):
        ev.pool_depletion(TOLUENE, np.array([290.0, 293.0]), 1.0, 1.0, 1.0)


# ------------------------------------------------------------------ mixtures

def alkane(n, boiling_point, pressure_20c):
    """An n-alkane defined from its boiling point and vapour pressure at 20 degC."""
    molar_mass = (12.011 * n + 1.008 * (2 * n + 2)) / 1000.0
    return dataclasses.replace(
        user_substance(f"C{n}", molar_mass, boiling_point, [(293.15, pressure_20c)],
                       liquid_density=700.0),
        diffusion_volume=fuller_sum(n, 2 * n + 2))


#: C5-C14 n-alkanes: normal boiling points and vapour pressures at 20 degC
#: (CRC Handbook, rounded, from memory).
ALKANES = [alkane(n, tb, p) for n, tb, p in [
    (5, 309.2, 56000.0), (6, 341.9, 16200.0), (7, 371.6, 4750.0), (8, 398.8, 1390.0),
    (9, 424.0, 430.0), (10, 447.3, 130.0), (11, 469.0, 40.0), (12, 489.5, 12.0),
    (13, 508.6, 4.0), (14, 526.7, 1.3)]]


def test_single_component_mixture_matches_pure_pool():
    """A one-component 'mixture' empties at the pure-liquid rate and lifetime."""
    rate = ev.evaporation_rate(TOLUENE, 293.15, 2.0, 2.0)
    pure = ev.pool_depletion(TOLUENE, 293.15, 1.0, 2.0, 2.0)
    mix = ev.mixture_pool([TOLUENE], [1.0], 293.15, 2.0, 2.0, times=np.linspace(0, 2000, 11))
    assert mix.evaporation_rate[0, 0] == pytest.approx(rate, rel=1e-10)
    np.testing.assert_allclose(mix.mass_remaining[:, 0],
                               np.clip(1.0 - rate * mix.times, 0.0, None), rtol=1e-6)
    assert mix.pool_gone_time == pytest.approx(pure.depletion_time, rel=1e-5)


def test_ideal_binary_initial_rates_follow_raoult():
    """Initial component rates equal mole fraction × pure-liquid rate (Raoult's law)."""
    pure = [ev.evaporation_rate(s, 293.15, 3.0, 2.0) for s in (TOLUENE, ACETONE)]
    x = np.array([0.25, 0.75])
    rates = ev.mixture_evaporation_rates([TOLUENE, ACETONE], x, 293.15, 3.0, 2.0)
    np.testing.assert_allclose(rates, x * np.array(pure), rtol=1e-10)
    doubled = ev.mixture_evaporation_rates([TOLUENE, ACETONE], x, 293.15, 3.0, 2.0,
                                           activity_coefficients=[2.0, 1.0])
    assert doubled[0] == pytest.approx(2 * rates[0]) and doubled[1] == pytest.approx(rates[1])


def test_ten_component_mixture_eight_hours_conserving():
    """10 alkanes, 8 h at 1 s output: mass conserved to 1e-6 per component, lighter
    components gone first, heavy ones left (its speed: benchmarks/bench_spill.py)."""
    result = quiet(ev.mixture_pool, ALKANES, np.ones(10), 293.15, 10.0, 2.0,
                   times=np.arange(0.0, 8 * 3600.0 + 1.0, 1.0))
    assert result.mass_remaining.shape == (28801, 10)
    closure = result.mass_remaining + result.mass_evaporated
    np.testing.assert_allclose(closure, np.broadcast_to(result.initial_mass, closure.shape),
                               rtol=1e-6)
    assert result.mass_balance_error < 1e-6
    gone = result.depletion_times
    assert np.all(np.diff(gone[np.isfinite(gone)]) > 0)
    assert np.isfinite(gone[0]) and not np.isfinite(gone[-1])
    assert math.isinf(result.pool_gone_time)
    i = int(np.searchsorted(result.times, gone[0]))
    assert result.moles_remaining[i, 0] <= ev.DEPLETED_FRACTION * result.moles_remaining[0, 0]
    np.testing.assert_allclose(result.liquid_mole_fractions.sum(axis=1), 1.0)


def test_mixture_pool_empties_and_stops():
    """A volatile binary is gone before t_end; afterwards amounts and rates are zero
    and the evaporated mass equals the initial mass."""
    result = ev.mixture_pool([ACETONE, TOLUENE], [0.2, 0.1], 293.15, 5.0, 3.0,
                             t_end=3600.0)
    assert math.isfinite(result.pool_gone_time) and result.pool_gone_time < 3600.0
    assert result.depletion_times[0] < result.depletion_times[1] <= result.pool_gone_time
    np.testing.assert_allclose(result.mass_evaporated[-1], result.initial_mass)
    assert np.all(result.evaporation_rate[-1] == 0.0)


def test_mixture_activity_coefficient_function_matches_constants():
    """A callable returning constant γ gives the same history as the constant array."""
    gamma = np.array([1.5, 0.8])
    times = np.linspace(0.0, 1800.0, 31)
    constant = ev.mixture_pool([ACETONE, TOLUENE], [0.5, 0.5], 293.15, 1.0, 1.0,
                               activity_coefficients=gamma, times=times)
    function = ev.mixture_pool([ACETONE, TOLUENE], [0.5, 0.5], 293.15, 1.0, 1.0,
                               activity_coefficients=lambda x: gamma.reshape(
                                   (2,) + (1,) * (np.ndim(x) - 1)) * np.ones_like(x),
                               times=times)
    np.testing.assert_allclose(function.mass_remaining, constant.mass_remaining, rtol=1e-6)


def test_mixture_moles_basis():
    """Amounts in moles and the same amounts in kg give one history."""
    masses = np.array([0.3, 0.2])
    moles = masses / np.array([ACETONE.molar_mass, TOLUENE.molar_mass])
    times = np.linspace(0, 600, 7)
    by_mass = ev.mixture_pool([ACETONE, TOLUENE], masses, 293.15, 1.0, 1.0, times=times)
    by_moles = ev.mixture_pool([ACETONE, TOLUENE], moles, 293.15, 1.0, 1.0, times=times,
                               amount_basis="moles")
    np.testing.assert_allclose(by_moles.mass_remaining, by_mass.mass_remaining, rtol=1e-9)


@pytest.mark.parametrize("amounts, field", [
    ([1.0, -0.1], "initial_amounts"),
    ([0.0, 0.0], "initial_amounts"),
    ([1.0], "initial_amounts"),
    ([1.0, float("nan")], "initial_amounts"),
])
def test_mixture_pool_rejects_bad_amounts(amounts, field):
    """Negative, all-zero, wrong-length and NaN amounts raise InputError by name."""
    with pytest.raises(InputError) as info:
        ev.mixture_pool([ACETONE, TOLUENE], amounts, 293.15, 1.0, 1.0)
    assert info.value.field == field


def test_mixture_rates_reject_bad_composition():
    """Mole fractions that are negative or do not sum to 1 are refused by name."""
    for x, fragment in (([0.5, 0.4], "sum to 0.9"), ([1.2, -0.2], "negative")):
        with pytest.raises(InputError, match=fragment) as info:
            ev.mixture_evaporation_rates([ACETONE, TOLUENE], x, 293.15, 1.0, 1.0)
        assert info.value.field == "mole_fractions"


def test_boiling_mixture_is_refused():
    """A mixture whose Raoult's-law vapour pressure reaches ambient is a boiling pool."""
    with pytest.raises(OutOfRangeError, match="boiling pool"):
        quiet(ev.mixture_pool, ALKANES[:2], [1.0, 0.1], 312.0, 1.0, 1.0)


def test_mixture_solver_budget_stops_a_runaway():
    """A tiny evaluation budget ends the integration with an error, never a hang."""
    with pytest.raises(ev.EvaporationSolverError, match="evaluations"):
        quiet(ev.mixture_pool, ALKANES, np.ones(10), 293.15, 10.0, 2.0, max_evaluations=5)


# -------------------------------------------------------- evaporative cooling

def test_ground_flux_integrates_to_the_semi_infinite_solid_heat():
    """The time integral of the flux is 2λΔT√(t/(πα)) (Carslaw & Jaeger 1959, §2.5)."""
    from scipy.integrate import quad

    t_end = 3600.0
    total, _ = quad(lambda t: ev.semi_infinite_ground_flux(300.0, 290.0, t), 0.0, t_end)
    alpha = ev.GROUND_TYPES["concrete"][1]
    assert total == pytest.approx(2 * 1.4 * 10.0 * math.sqrt(t_end / (math.pi * alpha)),
                                  rel=1e-6)


def test_chilton_colburn_for_water_matches_lewis_relation():
    """For water vapour in air the Lewis relation h ≈ k ρ c_p holds within about 15 %
    (Lewis 1922, Trans. ASME 44, 325; from memory)."""
    d = ev.fuller_diffusivity(298.15, STANDARD_ATMOSPHERE, 0.018015, 13.1)
    sc = ev.air_kinematic_viscosity(298.15) / d
    h = ev.chilton_colburn_heat_transfer_coefficient(0.005, sc, 298.15)
    assert h / (0.005 * ev.air_density(298.15) * 1006.0) == pytest.approx(1.0, rel=0.15)


def test_volatile_pool_cools_below_ambient():
    """Acetone at 20 degC and 3 m/s on concrete cools by several kelvin, then the ground
    and air hold it at a steady deficit; energy is conserved by the integration."""
    result = quiet(ev.pool_temperature_balance, ACETONE, 293.15, 10.0, 1.0, 3.0, 2160.0)
    assert result.minimum_temperature < 293.15 - 5.0
    assert np.nanmax(result.temperature[1:]) < 293.15
    assert result.evaporation_rate[-1] < result.evaporation_rate[0]
    assert result.energy_balance_error < 1e-6


def test_non_volatile_pool_relaxes_to_ambient():
    """A warm, nearly non-volatile liquid (0.1 Pa at 20 degC) settles at ambient."""
    oil = dataclasses.replace(
        user_substance("Heavy oil", 0.2, 600.0, [(293.15, 0.1)], liquid_density=850.0),
        diffusion_volume=250.0)
    result = quiet(ev.pool_temperature_balance, oil, 293.15, 10.0, 1.0, 3.0, 2000.0,
                   initial_temperature=303.15, t_end=3 * 3600.0)
    assert result.temperature[0] == pytest.approx(303.15)
    assert result.temperature[-1] == pytest.approx(293.15, abs=0.05)


def test_closed_pool_follows_the_analytic_energy_balance():
    """Insulated, no air convection, constant ΔHvap: m c_p dT = ΔH dm, so
    T = T0 + (ΔH / c_p) ln(m / m0) exactly; the integration reproduces it."""
    dh, cp = 29100.0, 2160.0
    result = quiet(ev.pool_temperature_balance, ACETONE, 293.15, 10.0, 1.0, 3.0, cp,
                   ground="insulated", air_convection=False, enthalpy_of_vaporization=dh,
                   t_end=600.0)
    analytic = 293.15 + dh / ACETONE.molar_mass / cp * np.log(result.mass_remaining / 10.0)
    np.testing.assert_allclose(result.temperature, analytic, atol=1e-5)
    assert result.energy_balance_error < 1e-6
    assert np.all(result.air_heat_flow == 0.0) and np.all(result.ground_heat_flow[1:] == 0.0)


def test_pool_temperature_balance_rejects_bad_input():
    """Unknown ground lists the choices; non-positive heat capacity names the field."""
    with pytest.raises(ValueError, match="concrete"):
        ev.pool_temperature_balance(ACETONE, 293.15, 1.0, 1.0, 1.0, 2000.0, ground="ice")
    with pytest.raises(InputError) as info:
        ev.pool_temperature_balance(ACETONE, 293.15, 1.0, 1.0, 1.0, 0.0)
    assert info.value.field == "liquid_heat_capacity"


# --------------------------------------------------------- table substances

@needs_table
def test_table_toluene_diffusivity_against_measurement():
    """Table toluene's Fuller volume gives D within 10 % of Lugg's (1968) 0.0849 cm2/s
    at 25 degC (from memory)."""
    assert ev.air_diffusivity("toluene", 298.15) == pytest.approx(0.0849e-4, rel=0.10)


@needs_table
def test_table_water_diffusivity_against_crc_handbook():
    """Table water gives D within 8 % of the CRC Handbook's 0.242 cm2/s at 293.15 K."""
    assert ev.air_diffusivity("water", 293.15) == pytest.approx(0.242e-4, rel=0.08)


@needs_table
def test_table_substances_evaporate_in_volatility_order():
    """Acetone > toluene > water over the same pool at 20 degC, dry air, both models."""
    for model in ("mackay-matsugu", "epa-rmp"):
        rates = [quiet(ev.evaporation_rate, key, 293.15, 1.0, 2.0, model=model)
                 for key in ("acetone", "toluene", "water")]
        assert rates[0] > rates[1] > rates[2] > 0.0


@needs_table
def test_table_water_stops_in_saturated_air():
    """Water in air at 100 % relative humidity at the pool temperature does not
    evaporate (partial pressure equal to its own vapour pressure)."""
    from estimator.vapor import vapor_pressure

    p_sat = vapor_pressure("water", 293.15)
    assert quiet(ev.evaporation_rate, "water", 293.15, 1.0, 2.0,
                 partial_pressure_air=p_sat) == 0.0


@needs_table
def test_table_mixture_by_key():
    """A mixture given by table keys integrates and conserves mass."""
    result = quiet(ev.mixture_pool, ["acetone", "toluene", "water"], [1.0, 1.0, 1.0],
                   293.15, 2.0, 2.0, t_end=3600.0)
    assert result.mass_balance_error < 1e-6
    assert result.components[0].lower().startswith("acetone")


@needs_table
def test_table_acetone_pool_cools_with_watson_enthalpy():
    """Table acetone (ΔHvap from Watson's relation) on concrete cools below ambient;
    liquid c_p 2160 J/(kg K) = 125.5 J/(mol K) (CRC Handbook, from memory)."""
    result = quiet(ev.pool_temperature_balance, "acetone", 293.15, 5.0, 1.0, 2.0, 2160.0,
                   t_end=1800.0)
    assert result.minimum_temperature < 288.15
    assert result.energy_balance_error < 1e-6


@needs_table
def test_table_toluene_models_agree_within_factor_two():
    """Table toluene, 25 degC, 100 m2, 1.5 m/s: EPA / Mackay-Matsugu between 1 and 2."""
    comparison = quiet(ev.compare_models, "toluene", 298.15, 100.0, 1.5)
    assert 1.0 < comparison.ratio < 2.0
