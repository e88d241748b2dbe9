"""Shared test set-up: markers for the optional reference libraries, and scenarios that
several test files use.

Markers
-------
A test that needs a library outside the core dependencies carries its marker
(``@pytest.mark.requires_coolprop`` ...). Without the library the test is skipped,
and only that test; in CI (``CI=true``) a missing library is a failure instead, so
the reference checks can never be dropped silently there. ``chemicals``, ``pypdf``
and ``streamlit`` are core dependencies and have no marker.
"""

from __future__ import annotations

import importlib.util
import os
import shutil
from pathlib import Path

import pytest
from scenario_texts import MINIMAL_TANK_TOML

ROOT = Path(__file__).resolve().parents[1]
DEMO_FOLDER = ROOT / "scenarios"
CHROMIUM = "/usr/bin/chromium"


def _module_missing(name: str) -> str | None:
    try:
        found = importlib.util.find_spec(name) is not None
    except ImportError:
        found = False
    return None if found else f"the {name} package is not installed"


def _chromium_missing() -> str | None:
    missing = _module_missing("playwright")
    if missing is not None:
        return "the Playwright Python package is not installed"
    if not (os.path.exists(CHROMIUM) or shutil.which("chromium")):
        return f"no chromium browser at {CHROMIUM} (apt-get install chromium)"
    return None


#: marker -> (what it needs, in words for --markers; a check that returns why it is missing)
REQUIREMENTS = {
    "requires_coolprop": ("CoolProp, the reference equations of state (test extra)",
                          lambda: _module_missing("CoolProp")),
    "requires_iapws": ("iapws, IAPWS-95 for water (test extra)",
                       lambda: _module_missing("iapws")),
    "requires_thermo": ("thermo, for UNIFAC activity coefficients (optional extra 'unifac')",
                        lambda: _module_missing("thermo")),
    "requires_openpyxl": ("openpyxl, for Excel inventories (optional extra 'excel')",
                          lambda: _module_missing("openpyxl")),
    "requires_chromium": ("Playwright and Debian's chromium, for the real-browser test",
                          _chromium_missing),
}


def in_ci() -> bool:
    """Whether the suite runs in CI (CI=true), where nothing may be skipped for a
    missing library."""
    return os.environ.get("CI") == "true"


def pytest_configure(config):
    for name, (words, _) in REQUIREMENTS.items():
        config.addinivalue_line(
            "markers", f"{name}: needs {words}; skipped without it, a failure when CI=true")


def pytest_runtest_setup(item):
    for marker in item.iter_markers():
        requirement = REQUIREMENTS.get(marker.name)
        if requirement is None:
            continue
        reason = requirement[1]()
        if reason is None:
            continue
        if in_ci():
            pytest.fail(f"{item.nodeid} cannot run in CI: {reason}", pytrace=False)
        pytest.skip(f"{marker.name}: {reason}")


# ------------------------------------------------------------------ shared scenarios

#: The bundled demo scenarios by name (invented sites).
DEMO_NAMES = ("warehouse-drum-spill", "coatings-day-tank", "sump-dissolved-solvent")


@pytest.fixture
def minimal_tank_toml() -> str:
    """Text of the smallest valid scenario: toluene in tank "A" at 25 degC."""
    return MINIMAL_TANK_TOML


@pytest.fixture(scope="session")
def demo_paths() -> list[Path]:
    """The demo scenario files of the checkout, sorted by name."""
    return sorted(DEMO_FOLDER.glob("*.toml"))


@pytest.fixture(scope="session")
def warehouse_path() -> Path:
    """The demo with an indoor and an outdoor spill."""
    return DEMO_FOLDER / "warehouse-drum-spill.toml"


@pytest.fixture(scope="session")
def demo_results():
    """Each demo scenario loaded and run once for the whole session, by name."""
    from estimator.scenario import load_scenario
    from estimator.screening import run_scenario

    return {name: run_scenario(load_scenario(DEMO_FOLDER / f"{name}.toml"))
            for name in DEMO_NAMES}


def pytest_generate_tests(metafunc):
    """A test that takes ``demo_path`` runs once per demo scenario file."""
    if "demo_path" in metafunc.fixturenames:
        paths = sorted(DEMO_FOLDER.glob("*.toml"))
        metafunc.parametrize("demo_path", paths, ids=[p.stem for p in paths])
