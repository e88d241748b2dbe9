"""The ullage command line: exit codes, messages on stderr, cautions on every result."""

import subprocess
import sys
from pathlib import Path

import pytest

from estimator import CAUTIONS, __version__
from estimator.cli import main

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "scenarios" / "coatings-day-tank.toml"


def run(capsys, *argv):
    code = main(list(argv))
    out, err = capsys.readouterr()
    return code, out, err


def test_version(capsys):
    """--version prints the version."""
    code, out, _ = run(capsys, "--version")
    assert code == 0 and __version__ in out


@pytest.mark.parametrize("command", ["run", "check", "sweep", "inventory", "substances",
                                     "demo", "app"])
def test_help_on_every_level(capsys, command):
    """Every subcommand has --help."""
    code, out, _ = run(capsys, command, "--help")
    assert code == 0 and "usage: ullage" in out


def test_substances_list_and_one(capsys):
    """The table lists, and one substance shows with its sources."""
    code, out, _ = run(capsys, "substances")
    assert code == 0 and "toluene" in out and "substance(s)" in out
    code, out, _ = run(capsys, "substances", "MEK")
    assert code == 0 and "78-93-3" in out and "Sources:" in out


def test_demo_prints_results_and_cautions(capsys):
    """The demo runs every demo scenario and shows the cautions."""
    code, out, _ = run(capsys, "demo")
    assert code == 0
    assert out.count(CAUTIONS[1][:40]) >= 3
    assert "Tank T-3" in out and "Spill punctured drum" in out


def test_run_text_and_exit_codes(capsys):
    """run prints the summary; --signal-exceedance exits 1 when a limit is exceeded."""
    code, out, err = run(capsys, "run", str(DEMO))
    assert code == 0 and "Tank T-3" in out and CAUTIONS[0] in out and not err
    code, _, _ = run(capsys, "run", str(DEMO), "--signal-exceedance")
    assert code == 1


def test_check(capsys):
    """check validates and lists assumptions without running."""
    code, out, _ = run(capsys, "check", str(DEMO))
    assert code == 0 and "valid scenario" in out and "Assumptions" in out


def test_sweep_table_and_csv(capsys, tmp_path):
    """sweep prints a table, or writes CSV atomically."""
    code, out, _ = run(capsys, "sweep", "toluene", "--from", "10 degC", "--to", "30 degC",
                       "--step", "10 K")
    assert code == 0 and "total ppm" in out and CAUTIONS[0] in out
    target = tmp_path / "sweep.csv"
    code, _, err = run(capsys, "sweep", "acetone 50%, water 50%", "--csv", "-o", str(target))
    assert code == 0 and target.read_text().startswith("T [degC],total ppm")
    code, out, _ = run(capsys, "sweep", "--scenario", str(DEMO), "--tank", "T-3")
    assert code == 0 and "o-Xylene" in out


@pytest.mark.parametrize(
    "argv, fragment",
    [
        (["run", "missing.toml"], "cannot read"),
        (["sweep", "toluene", "--from", "20 kg"], "--from"),
        (["sweep", "tolune"], "did you mean"),
        (["sweep", "toluene", "--from", "40 degC", "--to", "30 degC"], "--to"),
        (["sweep"], "give a liquid"),
        (["sweep", "--scenario", str(DEMO), "--tank", "T-9"], "no tank"),
        (["run"], "required"),
        (["nonsense"], "invalid choice"),
    ],
)
def test_bad_input_exit_2_message_on_stderr(capsys, argv, fragment):
    """Bad input exits 2 with a message on stderr and no traceback."""
    code, out, err = run(capsys, *argv)
    assert code == 2
    assert fragment in err
    assert "Traceback" not in err + out


def test_bad_scenario_file(capsys, tmp_path):
    """A scenario with an unknown key is refused, naming it and its line."""
    bad = tmp_path / "bad.toml"
    bad.write_text(DEMO.read_text().replace("worst_temperature", "worst_temp"))
    code, _, err = run(capsys, "check", str(bad))
    assert code == 2 and "worst_temp" in err and "line" in err


def test_console_script_module_entry():
    """python -m estimator works as a process, with errors on stderr."""
    done = subprocess.run([sys.executable, "-m", "estimator", "sweep", "toluene", "--from",
                           "nan degC"], capture_output=True, text=True, timeout=120)
    assert done.returncode == 2 and "NaN" in done.stderr and "Traceback" not in done.stderr


def test_inventory_screen_and_export(capsys, tmp_path):
    """inventory prints the summary with bad rows explained, exports CSV, exits 2 (bad rows)."""
    source = ROOT / "scenarios" / "inventory_example.csv"
    target = tmp_path / "screened.csv"
    code, out, _ = run(capsys, "inventory", str(source), "-o", str(target))
    assert code == 2
    assert "no substance is known as 'tolune'" in " ".join(out.split())
    assert "row(s)" in out and CAUTIONS[0] in out
    assert target.exists() and "Quarry Lane T-101" in target.read_text(encoding="utf-8-sig")


def test_items_not_computed_exit_2(capsys, tmp_path):
    """A scenario whose items cannot all be computed exits 2, even with results printed."""
    bad = tmp_path / "vac.toml"
    bad.write_text(DEMO.read_text().replace('fill = "40 %"', 'fill = "40 %"\ngauge_pressure = "-200 kPa"'))
    code, out, err = run(capsys, "run", str(bad), "--signal-exceedance")
    assert code == 2 and "could not be computed" in err and "Not computed" in out


def test_sweep_csv_carries_cautions(capsys):
    """CSV output of a sweep ends with the cautions."""
    code, out, _ = run(capsys, "sweep", "toluene", "--csv")
    assert code == 0 and out.strip().splitlines()[-1].startswith("caution,")


def test_bad_input_message_is_plain(capsys):
    """Command-line argument errors read as field: message, not as a tuple."""
    code, _, err = run(capsys, "sweep")
    assert code == 2 and "error: liquid: give a liquid" in err
