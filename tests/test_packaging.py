"""The installable product: a built wheel carries the front end, the demos and the
sample inventory; nothing finds its way by editing sys.path."""

import re
import subprocess
import sys
import zipfile
from pathlib import Path

import pytest

from estimator import cli
from estimator.samples import demo_scenario, demo_scenarios, sample_inventory

ROOT = Path(__file__).resolve().parents[1]


@pytest.fixture(scope="module")
def wheel(tmp_path_factory) -> zipfile.ZipFile:
    """A wheel built from the checkout (not editable), as `pip wheel --no-deps .`."""
    out = tmp_path_factory.mktemp("wheel")
    run = subprocess.run([sys.executable, "-m", "pip", "wheel", "--no-deps", "-q",
                          "-w", str(out), str(ROOT)], capture_output=True, text=True,
                         timeout=600)
    if run.returncode != 0:
        pytest.fail(f"building the wheel failed:\n{run.stderr[-2000:]}")
    (path,) = out.glob("ullage-*.whl")
    return zipfile.ZipFile(path)


def test_wheel_holds_everything_the_job_needs(wheel):
    """Front end, every page, demos (one copy each), sample inventories, data tables."""
    names = set(wheel.namelist())
    expected = {
        "ullage_ui/__init__.py", "ullage_ui/app.py", "ullage_ui/launch.py",
        "ullage_ui/shared.py", "ullage_ui/views.py",
        "ullage_ui/example_inventory.csv",
        "estimator/demos/inventory_example.csv",
        "estimator/data/substances.csv", "estimator/data/method_uncertainty.csv",
        "estimator/data/henry_constants.csv",
    }
    expected |= {f"ullage_ui/screens/{p.name}" for p in (ROOT / "ui" / "screens").glob("*.py")}
    expected |= {f"ullage_ui/case/{p.name}" for p in (ROOT / "ui" / "case").glob("*.py")}
    expected |= {f"estimator/demos/{p.name}" for p in (ROOT / "scenarios").glob("*.toml")}
    assert expected <= names, sorted(expected - names)
    assert not any(n.startswith(("ui/", "tests/", "scenarios/")) for n in names)
    assert sum(n.endswith(".toml") for n in names) == len(list((ROOT / "scenarios").glob("*.toml")))


def test_wheel_requires_the_library_and_streamlit(wheel):
    """chemicals and streamlit are required dependencies, not extras."""
    meta = next(n for n in wheel.namelist() if n.endswith(".dist-info/METADATA"))
    requires = [line for line in wheel.read(meta).decode().splitlines()
                if line.startswith("Requires-Dist:") and "extra ==" not in line]
    assert any(re.match(r"Requires-Dist: chemicals\b", r) for r in requires)
    assert any(re.match(r"Requires-Dist: streamlit\b", r) for r in requires)
    entry = next(n for n in wheel.namelist() if n.endswith("entry_points.txt"))
    assert "ullage = estimator.cli:main" in wheel.read(entry).decode()


@pytest.mark.parametrize("folder", ["ui", "tests"])
def test_no_sys_path_edits_and_no_bare_ui_imports(folder):
    """The front end imports as the package ullage_ui; nothing edits sys.path."""
    for path in (ROOT / folder).rglob("*.py"):
        text = path.read_text(encoding="utf-8")
        assert not re.search(r"sys\.path\.(insert|append)", text), path
        assert not re.search(r"^\s*(from ui[ .]|import ui\b)", text, re.M), path


def test_demos_and_sample_inventory_are_found():
    """The demo folder (checkout or installed) holds the scenarios and the inventory."""
    assert len(demo_scenarios()) >= 3
    assert sample_inventory().is_file()
    assert demo_scenario("coatings-day-tank") == demo_scenario("coatings-day-tank.toml")
    assert demo_scenario("no-such-demo") is None


def test_a_demo_runs_by_name_from_any_folder(capsys, monkeypatch, tmp_path):
    """`ullage run coatings-day-tank` works away from the checkout."""
    monkeypatch.chdir(tmp_path)
    assert cli.main(["check", "coatings-day-tank"]) == 0
    assert cli.main(["run", "coatings-day-tank"]) == 0
    assert "T-3" in capsys.readouterr().out


def test_demo_command_runs_every_demo(capsys, monkeypatch, tmp_path):
    """`ullage demo` from another folder prints every demo with the cautions."""
    monkeypatch.chdir(tmp_path)
    assert cli.main(["demo"]) == 0
    out = capsys.readouterr().out
    for path in demo_scenarios():
        assert f"=== {path.name} ===" in out
    assert "calibrated" in out


def test_browser_demo_list_is_the_package_data():
    """The browser's "load a demo" lists the same files `ullage demo` runs."""
    from ullage_ui import case

    assert case.demo_files() == demo_scenarios()
    assert case.EXAMPLE_INVENTORY.is_file()
