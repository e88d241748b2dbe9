"""Safety data sheets: every field of each invented sheet, the worst case against brute
force, the cross-check, the ranges in the Monte Carlo, and the PDF route.

The sheets in tests/data/sds/ are invented products of invented suppliers at invented
sites; their CAS numbers are real and their property values plausible for the
components. Expected values are what each sheet says, converted with the unit
definitions (NIST SP 811, 2008 edition, Appendix B): 1 mmHg = 133.322387 Pa,
1 psi = 6894.757 Pa, 1 lb = 0.45359237 kg, 1 US gal = 3.785411784 L,
°F = 1.8 °C + 32.
"""

import itertools
from pathlib import Path

import numpy as np
import pytest

import estimator
from estimator.headspace import headspace
from estimator.limits import exposure_limit
from estimator.sds import (FLASH_POINT_TOLERANCE, WATER_DENSITY_20C, cas_checksum_ok,
                           read_sds, resolve_cas)
from sds_pdf import text_pdf

DATA = Path(__file__).resolve().parent / "data" / "sds"
MMHG = 133.322387415
PSI = 6894.757293168
LB_PER_GAL = 0.45359237 / 3.785411784e-3


def c(celsius):
    return celsius + 273.15


def f(fahrenheit):
    return (fahrenheit - 32.0) / 1.8 + 273.15


# sheet -> every field: product, layout, basis, components (cas, name, low, high),
# unidentified (cas, name, low, high), flash point, (T, p), boiling point, LFL, UFL,
# density
EXPECTED = {
    "reach-thinner.txt": dict(
        notes=[],
        product="Harbourline Thinner 210", layout="section 3", basis="mass",
        components=[("108-88-3", "Toluene", 0.40, 0.60),
                    ("123-86-4", "n-Butyl acetate", 0.20, 0.30),
                    ("141-78-6", "Ethyl acetate", 0.10, 0.20)],
        unidentified=[], flash_point=c(2), vapor_pressure=(c(20), 3800.0),
        boiling_point=c(77), lfl=0.012, ufl=0.078, density=870.0),
    "hazcom-degreaser.txt": dict(
        notes=["the sheet says: '*The specific chemical identity",
               'Proprietary surfactant blend: 1-5 % withheld as a trade secret',
               'the remainder (4-39 %)',
               'relative density 0.79'],
        product="QuickStrip Degreaser 44", layout="section 3", basis="mass",
        components=[("67-63-0", "Isopropyl alcohol", 0.50, 0.70),
                    ("67-64-1", "Acetone", 0.10, 0.20),
                    ("142-82-5", "n-Heptane", 0.0, 0.01)],
        unidentified=[("", "Proprietary surfactant blend", 0.01, 0.05),
                      ("", "remainder not listed on the sheet", 0.04, 0.39)],
        flash_point=f(35), vapor_pressure=(f(68), 60 * MMHG), boiling_point=f(133),
        lfl=0.020, ufl=0.127, density=0.79 * WATER_DENSITY_20C),
    "older-cleaner.txt": dict(
        notes=['section 2 (older sheet layout)'],
        product="Brightwell Parts Cleaner PC-3", layout="section 2", basis="mass",
        components=[("78-93-3", "Methyl ethyl ketone", 0.10, 0.30),
                    ("108-88-3", "Toluene", 0.60, 0.80),
                    ("67-56-1", "Methanol", 0.0, 0.05)],
        unidentified=[], flash_point=f(21), vapor_pressure=(f(68), 0.86 * PSI),
        boiling_point=f(176), lfl=0.012, ufl=0.075, density=7.2 * LB_PER_GAL),
    "xylene-blend.txt": dict(
        notes=['taken as mass %', 'names an isomer mixture', 'relative density 0.865'],
        product="Ferncliff Aromatic Solvent X", layout="section 3", basis="mass",
        components=[("1330-20-7", "Xylene (mixed isomers)", 0.75, 0.90),
                    ("100-41-4", "Ethylbenzene", 0.10, 0.25)],
        unidentified=[], flash_point=c(24), vapor_pressure=(c(20), 850.0),
        boiling_point=c(137), lfl=0.010, ufl=0.070, density=0.865 * WATER_DENSITY_20C),
    "resin-coating.txt": dict(
        notes=['taken as mass %',
               '9004-70-0 (Nitrocellulose) is not known',
               '64742-95-6',
               '1330-20-7 (Xylene) names an isomer mixture',
               'Proprietary modified resin: 5-10 % withheld',
               'the remainder (10-50 %)',
               'no lower flammability limit'],
        product="Tidewater Epoxy Topcoat Part A", layout="section 3", basis="mass",
        components=[("1330-20-7", "Xylene", 0.10, 0.20),
                    ("123-86-4", "n-Butyl acetate", 0.05, 0.10)],
        unidentified=[("", "Proprietary modified resin", 0.05, 0.10),
                      ("9004-70-0", "Nitrocellulose", 0.20, 0.30),
                      ("64742-95-6", "Solvent naphtha (petroleum), light arom", 0.10, 0.20),
                      ("", "remainder not listed on the sheet", 0.10, 0.50)],
        flash_point=c(27), vapor_pressure=(c(20), 1000.0), boiling_point=c(126),
        lfl=None, ufl=None, density=1200.0),
    "mislabelled-acetate.txt": dict(
        notes=['relative density 0.88'],
        product="Orchard Row Butyl Acetate 98", layout="section 3", basis="mass",
        components=[("123-86-4", "n-Butyl acetate", 0.95, 1.00),
                    ("78-83-1", "Isobutanol", 0.0, 0.02)],
        unidentified=[], flash_point=f(72), vapor_pressure=(f(68), 80 * MMHG),
        boiling_point=f(259), lfl=0.012, ufl=0.075, density=0.88 * WATER_DENSITY_20C),
    "sanitiser-volume.txt": dict(
        notes=[],
        product="Meadowgate Hand Rub 70", layout="section 3", basis="volume",
        components=[("64-17-5", "Ethanol", 0.60, 0.70), ("67-63-0", "Propan-2-ol", 0.05, 0.10),
                    ("7732-18-5", "Water", 0.20, 0.35)],
        unidentified=[], flash_point=c(21), vapor_pressure=(c(20), 4000.0),
        boiling_point=c(80), lfl=0.033, ufl=0.19, density=870.0),
    "stripper-pdf.txt": dict(
        notes=['taken as mass %',
               'Confidential thickener: 1-3 % withheld',
               'relative density 1.22',
               'no flash point'],
        product="Kestrel Paint Stripper 9", layout="section 3", basis="mass",
        components=[("75-09-2", "Dichloromethane", 0.60, 0.80),
                    ("67-56-1", "Methanol", 0.05, 0.15), ("108-88-3", "Toluene", 0.10, 0.20)],
        unidentified=[("", "Confidential thickener", 0.01, 0.03)],
        flash_point=None, vapor_pressure=(c(20), 35000.0), boiling_point=c(40),
        lfl=0.060, ufl=0.36, density=1.22 * WATER_DENSITY_20C),
}


def check_fields(reading, expected):
    assert reading.product == expected["product"]
    assert reading.layout == expected["layout"]
    assert reading.basis == expected["basis"]
    got = [(i.cas, i.name, i.low, i.high) for i in reading.components]
    assert [g[:2] for g in got] == [e[:2] for e in expected["components"]]
    for g, e in zip(got, expected["components"]):
        assert g[2:] == pytest.approx(e[2:], abs=1e-12)
    got = [(i.cas, i.name, i.low, i.high) for i in reading.unidentified]
    assert [g[:2] for g in got] == [e[:2] for e in expected["unidentified"]]
    for g, e in zip(got, expected["unidentified"]):
        assert g[2:] == pytest.approx(e[2:], abs=1e-9)
    assert all(i.basis == expected["basis"] for i in reading.components + reading.unidentified)
    for name, key in (("flash_point", "flash_point"), ("boiling_point", "boiling_point"),
                      ("lower_flammability_limit", "lfl"),
                      ("upper_flammability_limit", "ufl"), ("density", "density")):
        value = getattr(reading, name)
        if expected[key] is None:
            assert value is None, name
        else:
            assert value == pytest.approx(expected[key], rel=1e-9), name
    assert len(reading.notes) == len(expected["notes"]), reading.notes
    for fragment in expected["notes"]:
        assert any(fragment in n for n in reading.notes), fragment
    if expected["vapor_pressure"] is None:
        assert reading.vapor_pressure is None
    else:
        assert reading.vapor_pressure == pytest.approx(expected["vapor_pressure"], rel=1e-9)


@pytest.mark.parametrize("name", sorted(EXPECTED))
def test_every_field_of_each_sheet(name):
    """Each invented sheet reads to exactly what it says, in SI units."""
    check_fields(read_sds(DATA / name), EXPECTED[name])


def test_at_least_eight_sheets():
    """Eight or more sheets, every one of them checked."""
    files = sorted(p.name for p in DATA.glob("*.txt"))
    assert len(files) >= 8 and files == sorted(EXPECTED)


def test_pasted_text_reads_like_the_file():
    """Text pasted in reads the same as the .txt file."""
    path = DATA / "hazcom-degreaser.txt"
    pasted = read_sds(path.read_text(encoding="utf-8"))
    check_fields(pasted, EXPECTED["hazcom-degreaser.txt"])
    assert pasted.source == "pasted text"


def test_pdf_made_from_text(tmp_path):
    """A PDF with a text layer, written in the test, reads like its text."""
    text = (DATA / "stripper-pdf.txt").read_text(encoding="utf-8")
    path = tmp_path / "stripper.pdf"
    path.write_bytes(text_pdf(text))
    reading = read_sds(path)
    check_fields(reading, EXPECTED["stripper-pdf.txt"])
    assert reading.source == "stripper.pdf"
    assert "Kestrel" in reading.text
    check_fields(read_sds(path.read_bytes()), EXPECTED["stripper-pdf.txt"])


def test_several_pages_of_pdf(tmp_path):
    """Composition and properties on different pages of a PDF are both found."""
    text = (DATA / "reach-thinner.txt").read_text(encoding="utf-8")
    reading = read_sds(text_pdf(text, lines_per_page=12))
    check_fields(reading, EXPECTED["reach-thinner.txt"])


def test_trade_secret_kept_with_its_range():
    """A trade-secret line is never dropped: it is an unidentified share, said in the notes."""
    r = read_sds(DATA / "hazcom-degreaser.txt")
    secret = r.unidentified[0]
    assert secret.reason == "withheld as a trade secret" and secret.cas == ""
    assert any("trade secret" in n for n in r.notes)
    shares = r.screen("mid").fractions
    assert shares["Proprietary surfactant blend"] > 0


def test_unknown_cas_kept_as_unidentified():
    """A CAS number the property data do not know stays, with its share and a note."""
    r = read_sds(DATA / "resin-coating.txt")
    assert resolve_cas("64742-95-6") is None  # a petroleum stream, not one compound
    naphtha = [i for i in r.unidentified if i.cas == "64742-95-6"][0]
    assert naphtha.reason == "CAS number not known to the property data"
    assert any("64742-95-6" in n and "unidentified" in n for n in r.notes)


def test_isomer_mixture_split_and_merged():
    """Mixed xylenes split by the stated default; ethylbenzene listed too is merged."""
    r = read_sds(DATA / "xylene-blend.txt")
    assert any("isomer mixture" in n and "ATSDR" in n for n in r.notes)
    liq = r.liquid("mid")
    keys = [s.key for s in liq.components]
    assert sorted(keys) == ["ethylbenzene", "m-xylene", "o-xylene", "p-xylene"]
    mass = dict(zip(keys, liq.mass_fractions))
    # midpoints 82.5 % xylene and 17.5 % ethylbenzene (sum 100 %): m-xylene 44 % of it,
    # ethylbenzene 16 % of the xylene plus its own line
    assert mass["m-xylene"] == pytest.approx(0.44 * 0.825, rel=1e-9)
    assert mass["ethylbenzene"] == pytest.approx(0.16 * 0.825 + 0.175, rel=1e-9)


def test_check_digits():
    """CAS check digits (CAS registry rule): toluene right, a typo wrong."""
    assert cas_checksum_ok("108-88-3") and cas_checksum_ok("7732-18-5")
    assert not cas_checksum_ok("108-88-4")
    sheet = ("3. COMPOSITION/INFORMATION ON INGREDIENTS\nToluene 108-88-4 90 - 100 %\n"
             "Acetone 67-64-1 0 - 10 %\n")
    r = read_sds(sheet)
    assert r.unidentified[0].cas == "108-88-4"
    assert any("check digit" in n for n in r.notes)


# ----------------------------------------------------------------- midpoints

def test_midpoints_are_normalised():
    """point='mid' uses the midpoints scaled to 100 % (MEK 20, toluene 70, methanol 2.5)."""
    r = read_sds(DATA / "older-cleaner.txt")
    liq = r.liquid("mid")
    total = 0.20 + 0.70 + 0.025
    assert dict(zip(liq.names, liq.mass_fractions)) == pytest.approx(
        {"Methyl ethyl ketone": 0.20 / total, "Toluene": 0.70 / total,
         "Methanol": 0.025 / total}, rel=1e-9)
    assert any("normalised midpoints" in w for w in liq.warnings)


def test_inert_and_surrogate_are_said():
    """Unidentified shares are inert by default or a chosen surrogate, and results say so."""
    r = read_sds(DATA / "resin-coating.txt")
    inert = r.liquid("mid")
    assert "Unidentified share (taken as inert)" in inert.names
    hs = headspace(inert, c(20))
    k = inert.names.index("Unidentified share (taken as inert)")
    assert float(hs.partial_pressures[k]) == 0.0
    assert any("taken as inert" in w for w in hs.warnings)
    cumene = r.liquid("mid", unidentified="cumene")
    assert "Cumene" in cumene.names
    assert any("taken as Cumene" in w for w in headspace(cumene, c(20)).warnings)
    # a volatile surrogate raises the vapour the inert default leaves out
    assert headspace(cumene, c(20)).total_ppm > hs.total_ppm


# ----------------------------------------------------------------- worst case

def _ranges_sheet(lines):
    rows = "\n".join(f"{name}  {cas}  {lo:g} - {hi:g} %" for name, cas, lo, hi in lines)
    return f"SECTION 3: Composition/information on ingredients\n{rows}\n"


def _grid_maximum(keys, lows, highs, temperature, measure, steps=101):
    """Brute force: every grid composition within the ranges that sums to 100 %."""
    best, best_w = -np.inf, None
    axes = [np.linspace(lo, hi, steps) for lo, hi in zip(lows[:-1], highs[:-1])]
    for head in itertools.product(*axes):
        last = 1.0 - sum(head)
        if not lows[-1] - 1e-12 <= last <= highs[-1] + 1e-12:
            continue
        w = dict(zip(keys, list(head) + [last]))
        value = measure(headspace(w, temperature, basis="mass"))
        if value > best:
            best, best_w = value, w
    return best, best_w


@pytest.mark.parametrize("lines,temperature", [
    ([("Acetone", "67-64-1", 20, 60), ("Toluene", "108-88-3", 40, 80)], c(20)),
    ([("n-Hexane", "110-54-3", 5, 30), ("Ethanol", "64-17-5", 40, 70),
      ("n-Butyl acetate", "123-86-4", 10, 40)], c(15)),
])
def test_worst_case_against_brute_force(lines, temperature):
    """The linear programme finds the grid's highest % LFL, within the ranges."""
    r = read_sds(_ranges_sheet(lines))
    worst = r.screen("worst", temperature=temperature)
    keys = [resolve_cas(cas).key for _, cas, _, _ in lines]
    lows = [lo / 100 for _, _, lo, _ in lines]
    highs = [hi / 100 for _, _, _, hi in lines]
    best, _ = _grid_maximum(keys, lows, highs, temperature, lambda hs: float(hs.percent_lfl),
                            steps=201 if len(lines) == 2 else 61)
    assert worst.value >= best * (1 - 1e-9)
    assert worst.value <= best * 1.01  # the grid is close to the optimum
    chosen = list(worst.fractions.values())
    assert sum(chosen) == pytest.approx(1.0)
    for value, lo, hi in zip(chosen, lows, highs):
        assert lo - 1e-9 <= value <= hi + 1e-9
    assert float(headspace(worst.liquid, temperature).percent_lfl) == pytest.approx(worst.value)
    assert worst.value >= float(headspace(r.liquid("mid"), temperature).percent_lfl)
    assert worst.objective == "headspace % LFL"
    assert any("worst case within the ranges" in n for n in worst.notes)


def test_worst_case_for_the_exposure_index_against_brute_force():
    """With limits, the worst case maximises the additive index (29 CFR 1910.1000(d)(2)(i))."""
    lines = [("Acetone", "67-64-1", 30, 70), ("Toluene", "108-88-3", 30, 70)]
    r = read_sds(_ranges_sheet(lines))
    limits = [exposure_limit("acetone", "TWA", 250, "ppm", "illustrative"),
              exposure_limit("toluene", "TWA", 20, "ppm", "illustrative")]
    worst = r.screen("worst", temperature=c(25), limits=limits)

    def index(hs):
        y = dict(zip([s.key for s in hs.liquid.components], hs.volume_fractions))
        return float(y["acetone"] / 250e-6 + y["toluene"] / 20e-6)

    best, best_w = _grid_maximum(["acetone", "toluene"], [0.3, 0.3], [0.7, 0.7], c(25),
                                 index, steps=401)
    assert worst.objective == "additive exposure index (TWA)"
    assert worst.value == pytest.approx(best, rel=1e-3)
    assert best_w["toluene"] == pytest.approx(0.7)  # toluene's limit is the lower
    # % LFL alone would pick the other end: more acetone
    assert read_sds(_ranges_sheet(lines)).screen("worst", temperature=c(25)).fractions[
        "Acetone (67-64-1)"] == pytest.approx(0.7)


# ----------------------------------------------------------------- cross-check

def test_cross_check_flags_a_contradicting_sheet():
    """80 mmHg for ~98 % n-butyl acetate, ten times its 1.1 kPa at 20 degC, is flagged."""
    checks = {ck.quantity: ck for ck in read_sds(DATA / "mislabelled-acetate.txt").cross_check()}
    vp = checks["vapour pressure"]
    assert vp.agrees is False and "DISAGREES" in vp.statement
    # n-butyl acetate near 20 degC: about 1.2 kPa (CRC Handbook, 97th ed., vapour pressure
    # of organic compounds; from memory 10 mmHg at 20 degC)
    assert 900.0 < vp.model < 1500.0
    assert checks["flash point"].agrees is True  # 22 degC closed cup (NFPA 497: 22 degC)


def test_cross_check_agrees_for_a_consistent_sheet():
    """The thinner's own 38 hPa and 2 degC fit its composition."""
    checks = read_sds(DATA / "reach-thinner.txt").cross_check()
    assert [ck.agrees for ck in checks] == [True, True]
    assert all(ck.model_low <= ck.model <= ck.model_high for ck in checks)


def test_flash_point_tolerance_catches_a_unit_mix_up():
    """A flash point written in °F but labelled °C (the thinner's 2 °C as 36 °C) is flagged."""
    text = (DATA / "reach-thinner.txt").read_text(encoding="utf-8").replace(
        "Flash point: 2 °C", "Flash point: 36 °C")
    check = [ck for ck in read_sds(text).cross_check() if ck.quantity == "flash point"][0]
    assert check.agrees is False and FLASH_POINT_TOLERANCE == 10.0


def test_cross_check_mentions_the_inert_assumption():
    """A gap with unidentified shares taken as inert says they may be volatile."""
    vp = read_sds(DATA / "resin-coating.txt").cross_check()[0]
    assert vp.agrees is False and "taken as inert" in vp.statement


# ----------------------------------------------------------------- Monte Carlo

def test_ranges_feed_the_monte_carlo():
    """Samples drawn within the ranges and normalised; % LFL within the corners' span."""
    r = read_sds(DATA / "reach-thinner.txt")
    result = r.monte_carlo(c(20), n=4000, seed=3, include_method_uncertainty=False)
    assert "drawn uniformly within its stated range" in result.warnings[0]
    toluene = result.input_samples["mass_fraction[Toluene]"]
    total = 0.4 + 0.2 + 0.1
    assert toluene.min() >= 0.4 / (0.6 + 0.3 + 0.2) - 1e-9
    assert toluene.max() <= 0.6 / total + 1e-9
    # a linear-fractional function over a box peaks at a corner: every corner of the
    # ranges, normalised, bounds the samples
    corners = [dict(zip(["toluene", "n-butyl acetate", "ethyl acetate"], v))
               for v in itertools.product((0.4, 0.6), (0.2, 0.3), (0.1, 0.2))]
    values = [float(headspace({k: x / sum(w.values()) for k, x in w.items()}, c(20),
                              basis="mass").percent_lfl) for w in corners]
    sampled = result.outputs["percent_lfl"]
    assert min(values) * (1 - 1e-6) <= float(sampled.min())
    assert float(sampled.max()) <= max(values) * (1 + 1e-6)
    mid = float(headspace(r.liquid("mid"), c(20)).percent_lfl)
    assert float(np.median(sampled)) == pytest.approx(mid, rel=0.02)


# ----------------------------------------------------------------- scenario block

def test_toml_block_round_trips_into_a_scenario(tmp_path):
    """The [[liquid]] block written for a sheet loads, keeping its ranges."""
    r = read_sds(DATA / "hazcom-degreaser.txt")
    block = r.to_toml("degreaser")
    scenario = estimator.loads_scenario(
        '[scenario]\ntitle = "t"\n' + block +
        '[[tank]]\nname = "T1"\nliquid = "degreaser"\ntemperature = "20 degC"\n')
    spec = scenario.liquids["degreaser"]["spec"]
    mid = r.screen("mid")
    got = {s.key: v for s, v in spec.items()}
    want = {s.key: float(v) for s, v in zip(mid.liquid.components, mid.liquid.mass_fractions)}
    assert got == pytest.approx(want, rel=1e-9)


def test_scenario_with_the_sheet_text_and_the_worst_case():
    """A scenario keeps the sheet's text; point = "worst" screens at its tank's temperature."""
    from estimator.scenario import dumps_scenario, loads_scenario
    from estimator.screening import run_scenario

    text = (DATA / "older-cleaner.txt").read_text(encoding="utf-8")
    doc = {"scenario": {"title": "t"},
           "liquid": [{"name": "cleaner", "sds_text": text, "point": "worst"}],
           "tank": [{"name": "T1", "liquid": "cleaner", "temperature": "30 degC"}]}
    scenario = loads_scenario(dumps_scenario(doc))
    assert any("worst case within the ranges screened at 30.0 °C" in a
               for a in scenario.assumptions)
    spec = {s.key: v for s, v in scenario.liquids["cleaner"]["spec"].items()}
    worst = read_sds(text).screen("worst", temperature=c(30))
    assert spec == pytest.approx({s.key: float(v) for s, v in zip(
        worst.liquid.components, worst.liquid.mass_fractions)}, rel=1e-9)
    result = run_scenario(scenario)
    assert float(result.tanks[0].headspace.percent_lfl) == pytest.approx(worst.value, rel=1e-6)
    again = loads_scenario(dumps_scenario(scenario))
    assert again.document["liquid"][0]["sds_text"] == text


def test_scenario_with_a_surrogate():
    """unidentified_as names the surrogate for unidentified shares."""
    from estimator.scenario import loads_scenario

    block = read_sds(DATA / "stripper-pdf.txt").to_toml("stripper", unidentified="toluene")
    scenario = loads_scenario('[scenario]\ntitle = "t"\n' + block)
    keys = [s.key for s in scenario.liquids["stripper"]["spec"]]
    assert "unidentified-inert" not in keys and "toluene" in keys
    assert any("taken as Toluene" in a for a in scenario.assumptions)


def test_command_line_reads_and_writes_the_block(tmp_path, capsys):
    """`ullage sds FILE -o liquid.toml`: what was read, the cross-check, the cautions,
    and a block that loads in a scenario."""
    from estimator.cli import main
    from estimator.scenario import loads_scenario

    target = tmp_path / "liquid.toml"
    code = main(["sds", str(DATA / "mislabelled-acetate.txt"), "-o", str(target),
                 "--name", "acetate", "--point", "worst"])
    out = capsys.readouterr().out
    assert code == 0
    assert "n-Butyl acetate" in out and "DISAGREES" in out
    assert all(caution in " ".join(out.split()) for caution in estimator.CAUTIONS)
    block = target.read_text(encoding="utf-8")
    assert 'point = "worst"' in block and '123-86-4 = ["95 %", "100 %"]' in block
    scenario = loads_scenario('[scenario]\ntitle = "t"\n' + block)
    assert "acetate" in scenario.liquids


def test_scenario_monte_carlo_samples_the_ranges():
    """A tank of a sheet's liquid with an uncertain temperature also samples the ranges."""
    from estimator.scenario import loads_scenario
    from estimator.screening import run_scenario

    block = read_sds(DATA / "reach-thinner.txt").to_toml("thinner")
    scenario = loads_scenario(
        '[scenario]\ntitle = "t"\n' + block + '[[tank]]\nname = "T1"\nliquid = "thinner"\n'
        'temperature = "20 degC"\n[[uncertain]]\nitem = "T1"\ninput = "temperature"\n'
        'distribution = { uniform = ["18 degC", "22 degC"] }\n'
        '[monte_carlo]\nsamples = 2000\nseed = 5\n')
    mc = run_scenario(scenario).tanks[0].monte_carlo
    assert "mass_fraction[Toluene]" in mc.inputs
    assert any("drawn uniformly within its stated range" in w
               for w in run_scenario(scenario).tanks[0].warnings)
    toluene = mc.input_samples["mass_fraction[Toluene]"]
    assert 0.4 / 1.1 - 1e-9 <= toluene.min() and toluene.max() <= 0.6 / 0.7 + 1e-9


# ----------------------------------------------------------------- formats

def _one(composition_line, property_line=""):
    return read_sds("SECTION 3: Composition/information on ingredients\n"
                    f"{composition_line}\nSECTION 9: Physical and chemical properties\n"
                    f"{property_line}\n")


@pytest.mark.parametrize("text,low,high", [
    ("Toluene 108-88-3 40 - 60 %", 0.40, 0.60),
    ("Toluene 108-88-3 10-30", 0.10, 0.30),
    ("Toluene 108-88-3 99-100", 0.99, 1.00),
    ("Toluene 108-88-3 < 1 %", 0.0, 0.01),
    ("Toluene 108-88-3 ≤ 5", 0.0, 0.05),
    ("Toluene 108-88-3 ≥ 50 - < 70", 0.50, 0.70),
    ("Toluene 108-88-3 >=50 - <=70 %", 0.50, 0.70),
    ("Toluene 108-88-3 25 %", 0.25, 0.25),
    ("Toluene 108-88-3 12,5 %", 0.125, 0.125),
    ("Toluene 108-88-3 30 to 40 %", 0.30, 0.40),
    ("108-88-3 Toluene 40–60 %", 0.40, 0.60),
])
def test_range_styles(text, low, high):
    """Every range style the issue lists reads to its fractions."""
    item = _one(text).components[0]
    assert (item.cas, item.low, item.high) == ("108-88-3", pytest.approx(low),
                                               pytest.approx(high))
    assert item.name == "Toluene"


@pytest.mark.parametrize("line,field,value", [
    ("Flash point: 7 °C (closed cup)", "flash_point", c(7)),
    ("Flash point: 72 °F (22 °C) TCC", "flash_point", f(72)),
    ("Flash point: -4 °C", "flash_point", c(-4)),
    ("Flash point  45 deg F", "flash_point", f(45)),
    ("Vapour pressure: 2.9 kPa at 20 °C", "vapor_pressure", (c(20), 2900.0)),
    ("Vapour pressure: 29 hPa (20 °C)", "vapor_pressure", (c(20), 2900.0)),
    ("Vapour pressure: 29 mbar at 20 °C", "vapor_pressure", (c(20), 2900.0)),
    ("Vapor pressure: 22 mmHg @ 68 °F", "vapor_pressure", (f(68), 22 * MMHG)),
    ("Vapor pressure: 0.42 psi at 100 °F", "vapor_pressure", (f(100), 0.42 * PSI)),
    ("Vapour pressure: 2900 Pa at 20 °C", "vapor_pressure", (c(20), 2900.0)),
    ("Lower explosion limit: 1.1 % (V)", "lower_flammability_limit", 0.011),
    ("Upper explosion limit: 12.8 %(V)", "upper_flammability_limit", 0.128),
    ("Flammability limits: Lower 1.7 Upper 7.6", "upper_flammability_limit", 0.076),
    ("Explosive limits: 1.2 - 7.1 vol %", "lower_flammability_limit", 0.012),
    ("Density: 870 kg/m3", "density", 870.0),
    ("Density: 0.87 g/ml at 20 °C", "density", 870.0),
    ("Specific gravity (water = 1): 0.87", "density", 0.87 * WATER_DENSITY_20C),
    ("Initial boiling point and boiling range: 110 - 140 °C", "boiling_point", c(110)),
])
def test_property_formats(line, field, value):
    """Flash points, vapour pressures (kPa, hPa, mbar, mmHg, psi, Pa; °C or °F),
    flammability limits and densities in the forms the issue lists."""
    got = getattr(_one("Toluene 108-88-3 100 %", line), field)
    assert got == pytest.approx(value, rel=1e-9)


def test_missing_values_are_none_and_said():
    """A property the sheet does not give is None, with a note; 'not available' is no value."""
    r = _one("Toluene 108-88-3 100 %", "Flash point: not available")
    assert r.flash_point is None and r.vapor_pressure is None and r.density is None
    assert any("no flash point" in n for n in r.notes)
    assert not any("could not read the flash point" in n for n in r.notes)


def test_unreadable_property_line_is_noted():
    """A property line with a value that cannot be read is kept in the notes."""
    r = _one("Toluene 108-88-3 100 %", "Vapour pressure: see technical data sheet 4")
    assert r.vapor_pressure is None
    assert any("could not read the vapour pressure" in n for n in r.notes)


def test_scenario_says_when_the_sheet_disagrees():
    """A scenario liquid from a contradicting sheet carries the disagreement in its
    assumptions, so every report shows it."""
    from estimator.scenario import loads_scenario

    text = (DATA / "mislabelled-acetate.txt").read_text(encoding="utf-8")
    scenario = loads_scenario('[scenario]\ntitle = "t"\n[[liquid]]\nname = "a"\n'
                              f'sds_text = """{text}"""\n')
    assert any("Vapour pressure DISAGREES" in a for a in scenario.assumptions)


def test_values_without_percent_beside_a_footnote_with_one():
    """A table of bare numbers is read even when a footnote elsewhere has a % sign;
    a numbered sub-heading is not an ingredient."""
    r = read_sds("SECTION 3. COMPOSITION/INFORMATION ON INGREDIENTS\n3.2 Mixtures\n"
                 "Chemical name   CAS number   Weight %\nAcetone   67-64-1   60-80\n"
                 "Toluene   108-88-3   20 - 40\nIngredients below 1 % are not listed.\n")
    assert [(i.cas, i.low, i.high) for i in r.components] == [
        ("67-64-1", 0.6, 0.8), ("108-88-3", 0.2, 0.4)]
    assert r.unidentified == ()


def test_one_cell_per_line_as_pdfs_often_give():
    """A table extracted one cell per line (name, CAS, EC, range) is read row by row."""
    r = read_sds("SECTION 3: Composition/information on ingredients\nToluene\n108-88-3\n"
                 "203-625-9\n40 - 60 %\nAcetone\n67-64-1\n200-662-2\n40 - 60 %\n")
    assert [(i.cas, i.name, i.low, i.high) for i in r.components] == [
        ("108-88-3", "Toluene", 0.4, 0.6), ("67-64-1", "Acetone", 0.4, 0.6)]


def test_solid_ingredient_is_a_dissolved_non_volatile_share():
    """An ingredient melting above 40 degC (here the epoxy resin the property data
    carry with a melting point of 69 degC) is dissolved solid: no vapour, said so."""
    sheet = ("SECTION 3: Composition/information on ingredients\n"
             "Epoxy resin 25068-38-6 50 - 60 %\nToluene 108-88-3 40 - 50 %\n")
    r = read_sds(sheet)
    liq = r.liquid("mid")
    resin = resolve_cas("25068-38-6")
    assert liq.names == ("Toluene", f"{resin.name} (dissolved solid)")
    assert any("dissolved, non-volatile solid" in w for w in liq.warnings)
    # its own molar mass sets its mole share: Raoult's law for toluene alone, with
    # toluene's 3.79 kPa at 25 degC (CRC Handbook, from memory; read to 1.5 %)
    x = (0.45 / 0.09214) / (0.45 / 0.09214 + 0.55 / resin.molar_mass)
    hs = headspace(liq, c(25))
    assert float(hs.partial_pressures[0]) == pytest.approx(x * 3790.0, rel=0.015)
    assert float(hs.partial_pressures[1]) == 0.0
    # with a surrogate for unidentified shares, the solid stays non-volatile
    assert f"{resin.name} (dissolved solid)" in r.liquid("mid", unidentified="acetone").names


@pytest.mark.parametrize("heading", [
    "SECTION 3: Composition/information on ingredients",
    "SECTION 3. COMPOSITION/INFORMATION ON INGREDIENTS",
    "SECTION 3 COMPOSITION/INFORMATION ON INGREDIENTS",
    "Section 3 - Composition / information on ingredients",
    "3. COMPOSITION/INFORMATION ON INGREDIENTS",
    "3) Composition",
])
def test_section_headings(heading):
    """The composition section is found under the headings sheets use (GHS Annex 4)."""
    r = read_sds(f"{heading}\nToluene 108-88-3 100 %\n"
                 "SECTION 9: Physical and chemical properties\nFlash point: 4 °C\n")
    assert r.components[0].cas == "108-88-3" and r.flash_point == pytest.approx(c(4))


def test_ingredient_block_over_several_lines():
    """An EU-style block (name; CAS and EC; index; registration; classes and range on
    later lines) reads as one ingredient each."""
    r = read_sds("SECTION 3: Composition/information on ingredients\n3.2 Mixtures\n"
                 "Toluene\nCAS-No.: 108-88-3     EC-No.: 203-625-9\n"
                 "Index-No.: 601-021-00-3\nRegistration number: 01-2119471310-51-XXXX\n"
                 "Flam. Liq. 2; H225\nAsp. Tox. 1; H304       ≥ 25 - < 50 %\n"
                 "Acetone\nCAS-No.: 67-64-1     EC-No.: 200-662-2\n"
                 "Index-No.: 606-001-00-8\nFlam. Liq. 2; H225   ≥ 50 - < 75 %\n")
    assert [(i.cas, i.name, i.low, i.high) for i in r.components] == [
        ("108-88-3", "Toluene", 0.25, 0.50), ("67-64-1", "Acetone", 0.50, 0.75)]
    assert r.unidentified == ()
