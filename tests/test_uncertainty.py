"""Monte Carlo screening: distributions, specs, seeds, deterministic limits, exceedance."""

import math
import warnings

import numpy as np
import pytest
from scipy import stats
from scipy.integrate import trapezoid
from scipy.optimize import brentq

import estimator
from estimator.constants import EIGHT_HOUR_SHIFT, GAS_CONSTANT, STANDARD_ATMOSPHERE
from estimator.errors import InputError, OutOfRangeError
from estimator.evaporation import evaporation_rate
from estimator.exposure import max_rolling_average
from estimator.headspace import (
    headspace,
    temperature_for_concentration,
    temperature_for_percent_lfl,
)
from estimator.indoor import well_mixed_room
from estimator.limits import exposure_limit
from estimator.mixtures import liquid
from estimator.uncertainty import (
    DirichletComposition,
    Fixed,
    LogNormal,
    MonteCarloResult,
    Normal,
    Triangular,
    Uniform,
    as_distribution,
    distribution_from_spec,
    headspace_monte_carlo,
    indoor_spill_monte_carlo,
    rank_correlations,
    vapor_pressure_factor,
)
from estimator.vapor import vapor_pressure, vapor_pressure_estimate

N = 20_000
HOUR = 3600.0


def rng(seed=12345):
    """A fresh generator for one test."""
    return np.random.default_rng(seed)


def standard_error(p, n):
    """Binomial standard error of an estimated probability."""
    return math.sqrt(max(p * (1.0 - p), 1e-12) / n)


def quiet(func, *args, **kwargs):
    """Call a deterministic model with its screening warnings silenced (checked elsewhere)."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        return func(*args, **kwargs)


# ------------------------------------------------------------------ distributions

def test_fixed_repeats_value_and_draws_nothing():
    """Fixed gives n copies and leaves the generator untouched."""
    a, b = rng(), rng()
    x = Fixed(3.5).sample(4, a)
    assert x.tolist() == [3.5] * 4
    assert a.random() == b.random()


def test_uniform_moments_and_percentiles():
    """Uniform(a, b): mean (a+b)/2, variance (b-a)^2/12, p-th percentile a + p (b-a)
    (from the definition of the uniform distribution)."""
    low, high = 303.15, 318.15
    x = Uniform(low, high).sample(N, rng())
    sd = (high - low) / math.sqrt(12.0)
    assert x.min() >= low and x.max() <= high
    assert x.mean() == pytest.approx((low + high) / 2, abs=5 * sd / math.sqrt(N))
    assert x.std() == pytest.approx(sd, rel=0.02)
    for p in (10, 50, 90):
        assert np.percentile(x, p) == pytest.approx(low + p / 100 * (high - low), abs=0.15)


def test_triangular_mean_and_median():
    """Triangular(a, c, b): mean (a+b+c)/3; for c >= (a+b)/2 the median is
    a + sqrt((b-a)(c-a)/2), from its CDF (x-a)^2/((b-a)(c-a)) on [a, c]
    (definition of the triangular distribution)."""
    a, c, b = 293.15, 308.15, 313.15
    x = Triangular(a, c, b).sample(N, rng())
    assert x.min() >= a and x.max() <= b
    assert x.mean() == pytest.approx((a + b + c) / 3, abs=0.1)
    assert np.median(x) == pytest.approx(a + math.sqrt((b - a) * (c - a) / 2), abs=0.15)


def test_normal_untruncated_moments():
    """Normal(mu, sigma): mean, sd, and 95 % of values within mu +- 1.96 sigma
    (definition of the normal distribution)."""
    x = Normal(308.15, 3.0).sample(N, rng())
    assert x.mean() == pytest.approx(308.15, abs=5 * 3.0 / math.sqrt(N))
    assert x.std() == pytest.approx(3.0, rel=0.02)
    inside = np.mean(np.abs(x - 308.15) <= 1.96 * 3.0)
    assert inside == pytest.approx(0.95, abs=4 * standard_error(0.95, N))


def test_truncated_normal_respects_bounds_and_mean():
    """Truncated normal: never outside [low, high]; its mean is
    mu + sigma (phi(a) - phi(b)) / (Phi(b) - Phi(a)) (Johnson, Kotz & Balakrishnan,
    Continuous Univariate Distributions vol. 1, 2nd ed., ch. 13, from memory) and
    its percentiles match scipy.stats.truncnorm (reference library)."""
    mu, sigma, low, high = 300.0, 5.0, 296.0, 310.0
    x = Normal(mu, sigma, low=low, high=high).sample(N, rng())
    assert x.min() >= low and x.max() <= high
    a, b = (low - mu) / sigma, (high - mu) / sigma
    mean = mu + sigma * (stats.norm.pdf(a) - stats.norm.pdf(b)) / (stats.norm.cdf(b)
                                                                    - stats.norm.cdf(a))
    assert x.mean() == pytest.approx(mean, abs=0.05)
    reference = stats.truncnorm(a, b, loc=mu, scale=sigma)
    for p in (5, 50, 95):
        assert np.percentile(x, p) == pytest.approx(reference.ppf(p / 100), abs=0.12)


def test_half_normal_from_one_bound():
    """Normal(0, 1) cut at 0 is the half-normal, mean sqrt(2/pi) (definition)."""
    x = Normal(0.0, 1.0, low=0.0).sample(N, rng())
    assert x.min() >= 0.0
    assert x.mean() == pytest.approx(math.sqrt(2 / math.pi), abs=0.015)


def test_lognormal_median_and_geometric_sd():
    """LogNormal(GM, GSD): ln X ~ N(ln GM, ln GSD), so the median is GM, the 84.13th
    percentile GM*GSD, the 15.87th GM/GSD and the mean GM exp(ln(GSD)^2 / 2)
    (definition of the lognormal distribution)."""
    gm, gsd = 0.1, 2.0
    x = LogNormal(gm, gsd).sample(N, rng())
    assert x.min() > 0.0
    assert np.median(x) == pytest.approx(gm, rel=0.02)
    assert np.percentile(x, 100 * stats.norm.cdf(1.0)) == pytest.approx(gm * gsd, rel=0.03)
    assert np.percentile(x, 100 * stats.norm.cdf(-1.0)) == pytest.approx(gm / gsd, rel=0.03)
    assert x.mean() == pytest.approx(gm * math.exp(math.log(gsd) ** 2 / 2), rel=0.03)


def test_sample_shapes_for_one_and_many():
    """Every distribution returns a 1-d array of n values, n = 1 included."""
    for dist in (Fixed(1.0), Uniform(0.0, 1.0), Triangular(0.0, 0.5, 1.0), Normal(0.0, 1.0),
                 Normal(0.0, 1.0, -1.0, 1.0), LogNormal(1.0, 1.5)):
        assert dist.sample(1, rng()).shape == (1,)
        assert dist.sample(7, rng()).shape == (7,)


@pytest.mark.parametrize("make, field, fragment", [
    (lambda: Uniform(2.0, 1.0), "high", "above low"),
    (lambda: Uniform(1.0, 1.0), "high", "above low"),
    (lambda: Triangular(0.0, 5.0, 4.0), "mode", "between"),
    (lambda: Triangular(0.0, 0.0, 0.0), "high", "above low"),
    (lambda: Normal(1.0, 0.0), "sd", "above 0"),
    (lambda: Normal(1.0, -2.0), "sd", "above 0"),
    (lambda: Normal(1.0, 1.0, low=2.0), "mean", "within the bounds"),
    (lambda: Normal(1.0, 1.0, low=2.0, high=0.0), "high", "above low"),
    (lambda: LogNormal(1.0, 1.0), "geometric_sd", "above 1"),
    (lambda: LogNormal(1.0, 0.5), "geometric_sd", "above 1"),
    (lambda: LogNormal(0.0, 2.0), "geometric_mean", "above 0"),
    (lambda: Uniform(float("nan"), 1.0), "low", "finite"),
    (lambda: Fixed(float("inf")), "value", "finite"),
    (lambda: Normal("warm", 1.0), "mean", "expected a number"),
    (lambda: DirichletComposition(0.0), "concentration", "above 0"),
])
def test_bad_distribution_parameters(make, field, fragment):
    """Broken parameters raise InputError naming the parameter."""
    with pytest.raises(InputError, match=fragment) as caught:
        make()
    assert caught.value.field == field


def test_sample_count_must_be_positive_whole_number():
    """n = 0, negative or fractional raises InputError naming n."""
    for n in (0, -3, 2.5, True):
        with pytest.raises(InputError) as caught:
            Uniform(0.0, 1.0).sample(n, rng())
        assert caught.value.field == "n"


def test_as_distribution_takes_numbers_and_refuses_text():
    """Floats become Fixed; text with units must go through distribution_from_spec."""
    assert as_distribution(2.0, "pool_area") == Fixed(2.0)
    dist = Uniform(1.0, 2.0)
    assert as_distribution(dist, "pool_area") is dist
    with pytest.raises(InputError, match="distribution_from_spec") as caught:
        as_distribution("2 m2", "pool_area")
    assert caught.value.field == "pool_area"
    with pytest.raises(InputError) as caught:
        as_distribution(float("nan"), "pool_area")
    assert caught.value.field == "pool_area"


# ------------------------------------------------------------------ specs

def test_spec_forms_with_units():
    """Each spec key parses, with degC to K (SI definition, 273.15 K offset)."""
    f = "liquid temperature"
    assert distribution_from_spec({"uniform": ["30 degC", "45 degC"]}, "temperature", f) \
        == Uniform(303.15, 318.15)
    assert distribution_from_spec({"uniform": {"low": "30 degC", "high": "45 degC"}},
                                  "temperature", f) == Uniform(303.15, 318.15)
    tri = distribution_from_spec({"triangular": ["20 degC", "30 degC", "40 degC"]},
                                 "temperature", f)
    assert (tri.low, tri.mode, tri.high) == pytest.approx((293.15, 303.15, 313.15))
    normal = distribution_from_spec({"normal": {"mean": "35 degC", "sd": "3 K",
                                                "low": "25 degC", "high": "45 degC"}},
                                    "temperature", f)
    assert (normal.mean, normal.sd, normal.low, normal.high) == pytest.approx(
        (308.15, 3.0, 298.15, 318.15))
    lognormal = distribution_from_spec({"lognormal": {"gm": "0.1 m/s", "gsd": 2.0}},
                                       "speed", "air speed")
    assert lognormal == LogNormal(0.1, 2.0)
    assert distribution_from_spec({"fixed": "20 m3"}, "volume", "room volume") == Fixed(20.0)
    assert distribution_from_spec("35 degC", "temperature", f) == Fixed(308.15)
    assert distribution_from_spec(3.0, "fraction", "mixing factor") == Fixed(3.0)


def test_spec_temperature_sd_is_a_difference():
    """A temperature's sd is a difference: 3 K = 3 degC = 5.4 degF (SI definitions)."""
    for text in ("3 K", "3 degC", "5.4 degF"):
        dist = distribution_from_spec({"normal": {"mean": "35 degC", "sd": text}},
                                      "temperature", "T")
        assert dist.sd == pytest.approx(3.0)


def test_spec_other_units_convert():
    """Flows and air speeds convert to SI: 360 m3/h = 0.1 m3/s, 20 ft/min = 0.1016 m/s
    (NIST SP 811 exact foot)."""
    flow = distribution_from_spec({"uniform": ["360 m3/h", "720 m3/h"]}, "flow", "Q")
    assert (flow.low, flow.high) == pytest.approx((0.1, 0.2))
    speed = distribution_from_spec({"lognormal": ["20 ft/min", 1.8]}, "speed", "air speed")
    assert speed.geometric_mean == pytest.approx(20 * 0.3048 / 60)


@pytest.mark.parametrize("spec, field, fragment", [
    ({"uniform": ["45 degC", "30 degC"]}, "liquid temperature high", "above low"),
    ({"normal": {"mean": "35 degC"}}, "liquid temperature sd", "missing"),
    ({"normal": {"mean": "35 degC", "sd": "3 m"}}, "liquid temperature sd", "temperature"),
    ({"normal": {"mean": "35 degC", "sd": "-3 K"}}, "liquid temperature sd", "above 0"),
    ({"normal": {"mean": "35 degC", "sd": "3 K", "width": 2}}, "liquid temperature width",
     "not a parameter"),
    ({"gaussian": ["35 degC", "3 K"]}, "liquid temperature", "not a distribution"),
    ({"uniform": ["30 degC", "45 degC"], "normal": {}}, "liquid temperature", "exactly one"),
    ({"uniform": ["30 degC"]}, "liquid temperature", "takes 2"),
    ({"triangular": ["20 degC", "50 degC", "40 degC"]}, "liquid temperature mode", "between"),
    ({"lognormal": {"gm": "35 degC", "gsd": 0.5}}, "liquid temperature gsd", "above 1"),
    ({"uniform": ["30", "45 degC"]}, "liquid temperature low", "no unit"),
    ({"uniform": "30 degC"}, "liquid temperature", "list"),
])
def test_bad_specs_name_the_field(spec, field, fragment):
    """Malformed specs raise InputError naming the input and the parameter."""
    with pytest.raises(InputError, match=fragment) as caught:
        distribution_from_spec(spec, "temperature", "liquid temperature")
    assert caught.value.field == field


def test_spec_unknown_kind_is_value_error():
    """An unknown kind of quantity is a programming error: ValueError listing kinds."""
    with pytest.raises(ValueError, match="unknown kind"):
        distribution_from_spec({"uniform": [1, 2]}, "colour", "x")


# ------------------------------------------------------------------ method uncertainty

def test_method_factor_covers_95_percent():
    """ln-sigma = ln(1 + u95) / 1.96: 95 % of factors between 1/(1+u) and 1+u, median 1
    (the lognormal definition with the two-sided 95 % normal quantile 1.96)."""
    u = 0.10
    factor = vapor_pressure_factor(u)
    assert factor.geometric_sd == pytest.approx(math.exp(math.log(1.1) / 1.96))
    f = factor.sample(N, rng())
    inside = np.mean((f >= 1 / (1 + u)) & (f <= 1 + u))
    assert inside == pytest.approx(0.95, abs=4 * standard_error(0.95, N))
    assert np.median(f) == pytest.approx(1.0, abs=0.002)
    assert np.mean(np.abs(f - 1.0) <= u) >= 0.95 - 4 * standard_error(0.95, N)


def test_method_factor_edge_cases():
    """u95 = 0 gives Fixed(1); a negative u95 is refused."""
    assert vapor_pressure_factor(0.0) == Fixed(1.0)
    with pytest.raises(InputError) as caught:
        vapor_pressure_factor(-0.1)
    assert caught.value.field == "relative_uncertainty"


def test_method_uncertainty_spreads_the_headspace():
    """A fixed temperature with the method factor: median at the deterministic value and
    p95/p50 = GSD^1.645 (lognormal percentiles; u95 from the validation file)."""
    t = 298.15
    u = vapor_pressure_estimate("toluene", t).relative_uncertainty
    r = headspace_monte_carlo("toluene", t, n=N, seed=4)
    deterministic = headspace("toluene", t).total_ppm
    gsd = vapor_pressure_factor(u).geometric_sd
    assert r.percentiles["total_ppm"][50] == pytest.approx(deterministic, rel=2e-4)
    assert r.percentiles["total_ppm"][95] / r.percentiles["total_ppm"][50] == pytest.approx(
        gsd ** stats.norm.ppf(0.95), rel=5e-4)
    assert "vapor_pressure_factor" in r.inputs


# ------------------------------------------------------------------ reproducibility

def spill_inputs():
    """An uncertain indoor toluene spill used by several tests."""
    return dict(substance_or_key="toluene", temperature=Uniform(293.15, 303.15),
                pool_area=Triangular(0.5, 1.0, 2.0), air_speed=LogNormal(0.1, 1.6),
                room_volume=Uniform(150.0, 250.0), ventilation_rate=Uniform(0.2, 0.6),
                mixing_factor=Uniform(1.0, 5.0), spilled_mass=Uniform(0.5, 2.0))


def test_same_seed_same_samples():
    """The same seed reproduces every sample; another seed does not."""
    a = indoor_spill_monte_carlo(**spill_inputs(), n=2000, seed=11)
    b = indoor_spill_monte_carlo(**spill_inputs(), n=2000, seed=11)
    c = indoor_spill_monte_carlo(**spill_inputs(), n=2000, seed=12)
    assert a.seed == 11
    for name in a.outputs:
        np.testing.assert_array_equal(a.outputs[name], b.outputs[name])
    assert not np.array_equal(a.outputs["twa_ppm"], c.outputs["twa_ppm"])
    h1 = headspace_monte_carlo("acetone", Normal(300.0, 4.0), n=2000, seed=5)
    h2 = headspace_monte_carlo("acetone", Normal(300.0, 4.0), n=2000, seed=5)
    np.testing.assert_array_equal(h1.outputs["total_ppm"], h2.outputs["total_ppm"])


def test_seed_is_recorded_when_not_given():
    """Without a seed a fresh one is drawn and recorded; rerunning with it repeats the run."""
    a = headspace_monte_carlo("acetone", Uniform(290.0, 300.0), n=500)
    assert isinstance(a.seed, int) and a.seed >= 0
    b = headspace_monte_carlo("acetone", Uniform(290.0, 300.0), n=500, seed=a.seed)
    np.testing.assert_array_equal(a.outputs["total_ppm"], b.outputs["total_ppm"])


def test_seed_must_be_whole_and_non_negative():
    """A negative or fractional seed raises InputError naming seed."""
    for seed in (-1, 1.5, "7"):
        with pytest.raises(InputError) as caught:
            headspace_monte_carlo("acetone", 300.0, n=10, seed=seed)
        assert caught.value.field == "seed"


def test_result_is_read_only():
    """Sample arrays and mappings of the result cannot be changed in place."""
    r = headspace_monte_carlo("acetone", Uniform(290.0, 300.0), n=100, seed=1)
    assert isinstance(r, MonteCarloResult)
    with pytest.raises(ValueError):
        r.outputs["total_ppm"][0] = 0.0
    with pytest.raises(TypeError):
        r.outputs["total_ppm"] = np.zeros(100)


# ------------------------------------------------------------------ headspace chain

@pytest.mark.parametrize("spec, temperature, pressure", [
    ("toluene", 300.0, STANDARD_ATMOSPHERE),
    ({"benzene": 0.3, "toluene": 0.7}, 310.0, 95000.0),
    ({"acetone": 0.6, "ethanol": 0.4}, 290.0, 101325.0),
    ("acetone", 335.0, STANDARD_ATMOSPHERE),  # above its boiling point: capped
])
def test_all_fixed_headspace_equals_deterministic(spec, temperature, pressure):
    """All inputs fixed, no method uncertainty: every sample equals estimator.headspace."""
    reference = quiet(headspace, spec, temperature, pressure)
    r = headspace_monte_carlo(spec, temperature, pressure, n=50, seed=1,
                              include_method_uncertainty=False)
    np.testing.assert_allclose(r.outputs["total_ppm"], reference.total_ppm, rtol=1e-14)
    np.testing.assert_allclose(r.outputs["percent_lfl"], reference.percent_lfl, rtol=1e-14)
    np.testing.assert_allclose(r.outputs["oxygen_percent"], reference.oxygen_percent,
                               rtol=1e-14)
    assert r.sensitivity["total_ppm"] == {}


def test_headspace_limit_ratio_is_component_concentration_over_limit():
    """The ratio to a limit is the component's equilibrium volume fraction over the limit
    (the vapour hazard ratio, Popendorf 1984)."""
    mix = {"benzene": 0.1, "toluene": 0.9}
    lim = exposure_limit("benzene", "TWA", 1.0, "ppm", "illustrative")
    other = exposure_limit("acetone", "TWA", 250.0, "ppm", "illustrative")
    r = headspace_monte_carlo(mix, 298.15, limits=[lim, other], n=10, seed=1,
                              include_method_uncertainty=False)
    y = headspace(mix, 298.15).volume_fractions[0]
    np.testing.assert_allclose(r.outputs[f"ratio to {lim.label}"], y / 1e-6, rtol=1e-12)
    assert r.exceedance[lim.label] == 1.0
    assert any("acetone" in w and "left out" in w for w in r.warnings)


def test_headspace_exceedance_matches_temperature_threshold():
    """Headspace ppm rises with temperature, so for T uniform on [a, b]
    P(ppm > L) = (b - T_L) / (b - a) with T_L from temperature_for_concentration
    (an analytic-vs-sampling check)."""
    low, high = 287.15, 313.15
    lim = exposure_limit("toluene", "ceiling", 30000.0, "ppm", "illustrative")
    t_limit = temperature_for_concentration("toluene", 0.03)
    assert vapor_pressure_estimate("toluene", [low, high]).method == \
        vapor_pressure_estimate("toluene", t_limit).method
    r = headspace_monte_carlo("toluene", Uniform(low, high), limits=[lim], n=N, seed=21,
                              include_method_uncertainty=False)
    expected = (high - t_limit) / (high - low)
    assert r.exceedance[lim.label] == pytest.approx(expected, abs=4 * standard_error(expected, N))


def test_lfl_alarm_exceedance_matches_temperature_threshold():
    """P(%LFL >= 100) = P(T >= T_LFL) with T_LFL from temperature_for_percent_lfl."""
    low, high = 265.15, 285.15
    t_lfl = temperature_for_percent_lfl("toluene", 100.0)
    r = quiet(headspace_monte_carlo, "toluene", Uniform(low, high), n=N, seed=22,
              include_method_uncertainty=False, lfl_alarm=100.0)
    expected = (high - t_lfl) / (high - low)
    assert r.exceedance["100 % LFL alarm"] == pytest.approx(
        expected, abs=4 * standard_error(expected, N))


def test_headspace_sensitivity_ranks_temperature_first():
    """Uncertain temperature, pressure and method: temperature leads the rank correlation
    of total ppm (positive); pressure is negative (y = p_sat / P, Dalton's law)."""
    r = headspace_monte_carlo("toluene", Uniform(288.15, 308.15),
                              Normal(101325.0, 1500.0, low=95000.0, high=105000.0),
                              n=5000, seed=8)
    ranking = r.sensitivity["total_ppm"]
    assert list(ranking)[0] == "temperature"
    assert ranking["temperature"] > 0.95
    assert ranking["pressure"] < 0.0
    assert r.sensitivity["oxygen_percent"]["temperature"] < -0.95


def test_rank_correlations_match_scipy_spearman():
    """Our vectorised Spearman coefficients equal scipy.stats.spearmanr (reference library),
    ties included, and are sorted by magnitude."""
    g = rng(3)
    a = g.normal(size=500)
    b = np.round(g.uniform(size=500), 1)  # many ties
    out = {"y": a**3 - 2 * b + 0.1 * g.normal(size=500)}
    rho = rank_correlations({"a": a, "b": b, "constant": np.ones(500)}, out)["y"]
    assert rho["a"] == pytest.approx(stats.spearmanr(a, out["y"]).statistic, abs=1e-12)
    assert rho["b"] == pytest.approx(stats.spearmanr(b, out["y"]).statistic, abs=1e-12)
    assert "constant" not in rho
    assert list(rho) == sorted(rho, key=lambda k: -abs(rho[k]))


def test_dirichlet_composition_moments():
    """Dirichlet(alpha0 x): mean x and variance x(1-x)/(alpha0+1) (Dirichlet definition);
    each sample sums to 1."""
    x = np.array([0.2, 0.3, 0.5])
    samples = DirichletComposition(40.0).sample(x, N, rng())
    np.testing.assert_allclose(samples.sum(axis=0), 1.0, rtol=1e-12)
    np.testing.assert_allclose(samples.mean(axis=1), x, atol=0.002)
    np.testing.assert_allclose(samples.var(axis=1), x * (1 - x) / 41.0, rtol=0.05)


def test_composition_uncertainty_in_headspace():
    """A Dirichlet composition: the mean mole fractions stay nominal; more benzene (the more
    volatile) raises the headspace."""
    r = headspace_monte_carlo({"benzene": 0.5, "toluene": 0.5}, 300.0,
                              composition=DirichletComposition(50.0), n=4000, seed=2,
                              include_method_uncertainty=False)
    assert r.input_samples["mole_fraction[Benzene]"].mean() == pytest.approx(0.5, abs=0.01)
    assert r.sensitivity["total_ppm"]["mole_fraction[Benzene]"] > 0.99


def test_composition_mapping_renormalised_and_mass_basis():
    """Fixed mass fractions given as a composition mapping reproduce a mass-basis liquid;
    sampled fractions are renormalised to 1."""
    spec = {"toluene": 0.5, "benzene": 0.5}
    reference = headspace(spec, 300.0, basis="mass")
    r = headspace_monte_carlo(liquid(spec), 300.0, composition=spec, composition_basis="mass",
                              n=10, seed=1, include_method_uncertainty=False)
    np.testing.assert_allclose(r.outputs["total_ppm"], reference.total_ppm, rtol=1e-12)
    varied = headspace_monte_carlo(liquid(spec), 300.0,
                                   composition={"toluene": Uniform(0.3, 0.7)}, n=1000, seed=1)
    total = (varied.input_samples["mole_fraction[Toluene]"]
             + varied.input_samples["mole_fraction[Benzene]"])
    np.testing.assert_allclose(total, 1.0, rtol=1e-12)
    assert varied.sensitivity["total_ppm"]["mole_fraction[Toluene]"] < -0.9


@pytest.mark.parametrize("kwargs, field, fragment", [
    (dict(liquid="toluene", composition=DirichletComposition(10.0)), "composition", "pure"),
    (dict(liquid={"benzene": 0.5, "toluene": 0.5}, composition={"acetone": 0.2}),
     "composition", "not a component"),
    (dict(liquid={"benzene": 0.5, "toluene": 0.5}, composition={"toluene": Normal(0.5, 1.0)}),
     "composition Toluene", "negative"),
    (dict(liquid={"benzene": 0.5, "toluene": 0.5}, composition={"toluene": 0.5},
          composition_basis="volume"), "composition_basis", "mole"),
    (dict(liquid="toluene", temperature=Uniform(300.0, 700.0)), "temperature", "critical"),
    (dict(liquid="toluene", temperature=Normal(300.0, 200.0)), "temperature", "kelvin"),
    (dict(liquid="toluene", pressure=Normal(101325.0, 1e5)), "pressure", "absolute"),
    (dict(liquid="toluene", lfl_alarm=0.0), "lfl_alarm", "above 0"),
    (dict(liquid="toluene", oxygen_alarm=25.0), "oxygen_alarm", "fresh air"),
    (dict(liquid="toluene", limits=["TWA 20 ppm"]), "limits", "ExposureLimit"),
    (dict(liquid="toluene", n=0), "n", "whole number"),
])
def test_headspace_bad_inputs(kwargs, field, fragment):
    """Bad inputs of the headspace chain raise InputError naming the field."""
    kwargs.setdefault("temperature", 300.0)
    with pytest.raises(InputError, match=fragment) as caught:
        headspace_monte_carlo(n=kwargs.pop("n", 200), seed=1, **kwargs)
    assert caught.value.field == field


def test_headspace_out_of_range_is_out_of_range_error():
    """A temperature sample above the critical point is an OutOfRangeError."""
    with pytest.raises(OutOfRangeError):
        headspace_monte_carlo("toluene", Uniform(300.0, 700.0), n=200, seed=1)


# ------------------------------------------------------------------ indoor chain

def deterministic_room(substance_key, temperature, area, speed, volume, flow, mixing, mass,
                       duration=EIGHT_HOUR_SHIFT, points=28801):
    """The same spill by evaporation_rate and well_mixed_room on a dense grid (check only):
    constant source until the pool is dry (a step in the piecewise-linear source), capped at
    the saturated concentration. Returns (times, concentrations [kg/m3], to_ppm)."""
    sub = estimator.substance(substance_key)
    rate = quiet(evaporation_rate, sub, temperature, area, speed)
    dry = mass / rate
    grid = np.linspace(0.0, duration, points)
    if dry < duration:
        grid = np.sort(np.append(grid, [dry, dry]))
        source = np.where(grid < dry, rate, 0.0)
        source[np.searchsorted(grid, dry)] = rate
    else:
        source = np.full(grid.size, rate)
    saturation = vapor_pressure(sub, temperature) * sub.molar_mass / (GAS_CONSTANT * temperature)
    c = quiet(well_mixed_room, source, volume, flow, grid, mixing,
              saturation_concentration=saturation)
    to_ppm = GAS_CONSTANT * temperature / (STANDARD_ATMOSPHERE * sub.molar_mass) * 1e6
    return grid, c, to_ppm, rate


@pytest.mark.parametrize("case", [
    ("toluene", 298.15, 0.5, 0.2, 100.0, 0.2, 2.0, 50.0),  # pool outlasts the shift
    ("toluene", 298.15, 0.5, 0.2, 100.0, 0.2, 2.0, 0.5),  # pool dry after about 2 h
    ("toluene", 298.15, 2.0, 0.3, 10.0, 0.001, 1.0, 5.0),  # room reaches saturation
    ("acetone", 293.15, 1.0, 0.1, 60.0, 0.0, 1.0, 0.2),  # closed room
    ("n-hexane", 303.15, 0.3, 0.15, 80.0, 0.05, 3.0, 0.05),  # dry within 15 min
])
def test_all_fixed_indoor_equals_well_mixed_room(case):
    """All fixed, no method uncertainty: the analytic TWA, peak and highest 15-min average
    agree within 1e-3 with a numerical integration of estimator.indoor.well_mixed_room
    (trapezoid rule) and estimator.exposure.max_rolling_average; the rate equals
    estimator.evaporation.evaporation_rate."""
    key, t, area, speed, volume, flow, mixing, mass = case
    r = indoor_spill_monte_carlo(key, t, area, speed, volume, flow, mixing, mass, n=5, seed=1,
                                 include_method_uncertainty=False)
    grid, c, to_ppm, rate = deterministic_room(*case)
    np.testing.assert_allclose(r.outputs["evaporation_rate"], rate, rtol=1e-14)
    np.testing.assert_allclose(r.outputs["pool_lifetime"], mass / rate, rtol=1e-14)
    twa = trapezoid(c, grid) / EIGHT_HOUR_SHIFT * to_ppm
    np.testing.assert_allclose(r.outputs["twa_ppm"], twa, rtol=1e-3)
    np.testing.assert_allclose(r.outputs["peak_ppm"], c.max() * to_ppm, rtol=1e-3)
    np.testing.assert_allclose(r.outputs["short_term_ppm"],
                               max_rolling_average(grid, c).value * to_ppm, rtol=1e-3)


def test_indoor_short_period():
    """A 10-min stay: the TWA still divides by 8 h (29 CFR 1910.1000(d)(1)(i)) and the
    15-min average counts zero outside the stay, as max_rolling_average does."""
    case = ("toluene", 298.15, 0.5, 0.2, 100.0, 0.2, 2.0, 0.5)
    r = indoor_spill_monte_carlo(*case, duration=600.0, n=3, seed=1,
                                 include_method_uncertainty=False)
    grid, c, to_ppm, _ = deterministic_room(*case, duration=600.0, points=6001)
    np.testing.assert_allclose(r.outputs["twa_ppm"],
                               trapezoid(c, grid) / EIGHT_HOUR_SHIFT * to_ppm, rtol=1e-3)
    np.testing.assert_allclose(r.outputs["short_term_ppm"],
                               max_rolling_average(grid, c).value * to_ppm, rtol=1e-3)


def test_indoor_limits_use_matching_averaging_times():
    """TWA limits against the 8-h TWA, STEL against the 15-min average, ceiling against the
    peak; P(exceed) is the fraction of ratios above 1. The mg/m3 limit is met at the
    volume fraction c R T / (P M) of each sample's temperature (ideal gas)."""
    lims = [exposure_limit("toluene", "TWA", 20.0, "ppm", "illustrative"),
            exposure_limit("toluene", "STEL", 75.4 * 5, "mg/m3", "illustrative"),
            exposure_limit("toluene", "ceiling", 300.0, "ppm", "illustrative")]
    r = indoor_spill_monte_carlo(**spill_inputs(), limits=lims, n=3000, seed=9)
    pairs = zip(lims, ("twa_ppm", "short_term_ppm", "peak_ppm"))
    t = r.input_samples["temperature"]
    for lim, metric in pairs:
        ratio = r.outputs[f"ratio to {lim.label}"]
        level = (lim.value if lim.unit == "ppm" else
                 lim.value * 1e-6 * 8.314462618 * t / (101325.0 * 0.09214) * 1e6)
        np.testing.assert_allclose(ratio, r.outputs[metric] / level, rtol=1e-4)
        assert r.exceedance[lim.label] == pytest.approx(np.mean(ratio > 1.0))
    assert np.all(r.outputs["short_term_ppm"] <= r.outputs["peak_ppm"] * (1 + 1e-12))


def test_indoor_exceedance_matches_mass_threshold():
    """The TWA rises with the spilled mass, so for a uniform mass P(TWA > L) = P(m > m_L),
    m_L found by root-finding on the all-fixed chain (consistency check)."""
    fixed = dict(substance_or_key="toluene", temperature=298.15, pool_area=1.0,
                 air_speed=0.2, room_volume=150.0, ventilation_rate=0.2, mixing_factor=3.0)
    lim = exposure_limit("toluene", "TWA", 20.0, "ppm", "illustrative")

    def twa(mass):
        r = indoor_spill_monte_carlo(**fixed, spilled_mass=mass, n=1, seed=0,
                                     include_method_uncertainty=False)
        return float(r.outputs["twa_ppm"][0]) - 20.0

    m_limit = brentq(twa, 0.01, 10.0, xtol=1e-10)
    low, high = 0.05, 0.4
    r = indoor_spill_monte_carlo(**fixed, spilled_mass=Uniform(low, high), limits=[lim], n=N,
                                 seed=31, include_method_uncertainty=False)
    expected = (high - m_limit) / (high - low)
    assert 0.1 < expected < 0.9
    assert r.exceedance[lim.label] == pytest.approx(expected, abs=4 * standard_error(expected, N))


def test_indoor_sensitivity_directions():
    """More ventilation lowers the TWA, a larger mixing factor raises it (dilution by Q/K)."""
    r = indoor_spill_monte_carlo(**spill_inputs(), n=4000, seed=6)
    rho = r.sensitivity["twa_ppm"]
    assert rho["ventilation_rate"] < -0.3
    assert rho["mixing_factor"] > 0.3
    assert r.sensitivity["evaporation_rate"]["air_speed"] > 0.5


def test_indoor_warnings():
    """Low air speed and a saturated room are reported, with the share of samples."""
    r = indoor_spill_monte_carlo("toluene", 298.15, 2.0, Uniform(0.2, 0.8), 10.0, 0.001, 1.0,
                                 5.0, n=500, seed=1)
    assert any("low air speeds" in w for w in r.warnings)
    assert any("saturated vapour concentration" in w for w in r.warnings)


def test_indoor_scalars_and_single_sample():
    """Plain floats everywhere and n = 1 work; no sensitivity with one sample."""
    r = indoor_spill_monte_carlo("toluene", 298.15, 1.0, 0.2, 100.0, 0.3, 2.0, 1.0, n=1,
                                 seed=0)
    assert r.n == 1 and r.outputs["twa_ppm"].shape == (1,)
    assert r.sensitivity["twa_ppm"] == {}


@pytest.mark.parametrize("changes, field, fragment", [
    (dict(temperature=Uniform(370.0, 390.0)), "temperature", "boiling point"),
    (dict(pool_area=Normal(0.5, 1.0)), "pool_area", "bound the distribution"),
    (dict(air_speed=0.0), "air_speed", "moving air"),
    (dict(mixing_factor=Uniform(0.5, 2.0)), "mixing_factor", "K = 1/m"),
    (dict(ventilation_rate=-0.1), "ventilation_rate", "closed room"),
    (dict(room_volume=Fixed(0.0)), "room_volume", "not above 0"),
    (dict(spilled_mass="2 kg"), "spilled_mass", "distribution_from_spec"),
    (dict(substance_or_key={"benzene": 0.5, "toluene": 0.5}), "substance_or_key", "pure"),
    (dict(substance_or_key="tolune"), "substance_or_key", "did you mean"),
    (dict(duration=0.0), "duration", "above 0"),
    (dict(limits=[1.0]), "limits", "ExposureLimit"),
    (dict(include_method_uncertainty="yes"), "include_method_uncertainty", "True or False"),
])
def test_indoor_bad_inputs(changes, field, fragment):
    """Bad inputs of the indoor chain raise InputError naming the field."""
    kwargs = spill_inputs()
    kwargs.update(changes)
    with pytest.raises(InputError, match=fragment) as caught:
        indoor_spill_monte_carlo(**kwargs, n=500, seed=1)
    assert caught.value.field == field


# ------------------------------------------------------------------ result tables

def test_tidy_table_and_exceedance_probability():
    """The tidy table has one statistic per row, matching the result's mappings."""
    lim = exposure_limit("toluene", "TWA", 20.0, "ppm", "illustrative")
    r = indoor_spill_monte_carlo(**spill_inputs(), limits=[lim], n=1000, seed=2)
    table = r.table()
    assert list(table.columns) == ["section", "output", "statistic", "value", "unit"]
    row = table[(table.section == "percentile") & (table.output == "twa_ppm")
                & (table.statistic == "p95")]
    assert float(row.value.iloc[0]) == r.percentiles["twa_ppm"][95]
    assert row.unit.iloc[0] == "ppm"
    exceed = table[table.section == "exceedance"]
    assert float(exceed.value.iloc[0]) == r.exceedance[lim.label]
    assert set(table[table.section == "sensitivity"].output) == set(r.outputs)
    assert r.exceedance_probability("twa_ppm", 20.0) == pytest.approx(r.exceedance[lim.label])
    np.testing.assert_allclose([r.percentiles["twa_ppm"][p] for p in (50, 90, 95, 99)],
                               np.percentile(r.outputs["twa_ppm"], [50, 90, 95, 99]))
    with pytest.raises(InputError) as caught:
        r.exceedance_probability("twa", 1.0)
    assert caught.value.field == "output"


def test_indoor_chain_source_removal_matches_box_model():
    """With all inputs fixed and the pool cleaned up at 30 min, the chain's TWA equals the
    numerically integrated box model whose source stops at 30 min (within 1e-3)."""
    import numpy as np

    from estimator.evaporation import evaporation_rate
    from estimator.indoor import well_mixed_room
    from estimator.uncertainty import indoor_spill_monte_carlo

    t = np.linspace(0.0, 8 * 3600.0, 28801)
    g = evaporation_rate("acetone", 295.0, 4.0, 0.2)
    source = np.where(t < 1800.0, g, 0.0)
    c = well_mixed_room(source, 500.0, 0.2, t, mixing_factor=3.0)
    to_ppm = 8.314462618 * 295.0 / (101325.0 * 0.05808) * 1e6
    expected = np.trapezoid(c, t) / (8 * 3600.0) * to_ppm
    mc = indoor_spill_monte_carlo("acetone", 295.0, 4.0, 0.2, 500.0, 0.2, 3.0, 50.0, n=200,
                                  seed=1, include_method_uncertainty=False,
                                  source_removed_at=1800.0)
    assert mc.outputs["twa_ppm"][0] == pytest.approx(expected, rel=1e-3)
