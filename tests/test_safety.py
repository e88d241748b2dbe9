"""Faults and security: bounded solvers, atomic writes, capped uploads, no unsafe loaders."""

import ast
import os
from pathlib import Path

import pytest

from estimator import cli
from estimator.errors import UllageError
from estimator.evaporation import EvaporationSolverError
from estimator.inventory import MAX_FILE_BYTES, screen_inventory
from estimator.scenario import MAX_SCENARIO_BYTES, SCHEMA, ScenarioError, load_scenario
from estimator.spill import indoor_spill

ROOT = Path(__file__).resolve().parents[1]
SOURCES = sorted((ROOT / "estimator").rglob("*.py")) + sorted((ROOT / "ui").rglob("*.py"))
UNSAFE_CALLS = {"eval", "exec", "compile", "__import__"}
UNSAFE_MODULES = {"pickle", "marshal", "shelve", "dill", "yaml"}


@pytest.mark.parametrize("path", SOURCES, ids=lambda p: str(p.relative_to(ROOT)))
def test_no_unsafe_evaluation_or_deserialisation(path):
    """No eval/exec/compile, and no pickle, marshal, shelve or YAML loaders anywhere."""
    tree = ast.parse(path.read_text(encoding="utf-8"))
    for node in ast.walk(tree):
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Name):
            assert node.func.id not in UNSAFE_CALLS, (path, node.lineno)
        if isinstance(node, ast.Import):
            assert not {a.name.split(".")[0] for a in node.names} & UNSAFE_MODULES
        if isinstance(node, ast.ImportFrom) and node.module:
            assert node.module.split(".")[0] not in UNSAFE_MODULES, (path, node.lineno)


def test_solver_is_time_bound():
    """A run that exceeds its time budget stops with a clear error, never hangs."""
    with pytest.raises(EvaporationSolverError, match="longer than|evaluations"):
        indoor_spill({"acetone": 0.5, "n-decane": 0.5}, 298.15, room_volume=50.0,
                     ventilation_rate=0.01, spilled_volume=0.01, duration=30 * 24 * 3600.0,
                     time_limit=1e-6)
    assert issubclass(EvaporationSolverError, UllageError)


def test_interrupt_leaves_no_partial_output(tmp_path, monkeypatch, capsys):
    """Ctrl-C during a run writes no output file at all and exits 130."""
    target = tmp_path / "report.html"

    def interrupted(_scenario):
        raise KeyboardInterrupt

    monkeypatch.setattr("estimator.screening.run_scenario", interrupted)
    code = cli.main(["run", str(ROOT / "scenarios" / "coatings-day-tank.toml"), "-o",
                     str(target)])
    assert code == 130
    assert not target.exists()
    assert list(tmp_path.iterdir()) == []
    assert "no partial output" in capsys.readouterr().err


def test_atomic_write_keeps_old_file_when_interrupted(tmp_path, monkeypatch):
    """An interruption while writing leaves the previous file intact and no temp file."""
    from estimator.report import write_text_atomic

    target = tmp_path / "out.csv"
    target.write_text("old")
    real_replace = os.replace

    def boom(*args):
        raise KeyboardInterrupt

    monkeypatch.setattr(os, "replace", boom)
    with pytest.raises(KeyboardInterrupt):
        write_text_atomic(target, "new")
    monkeypatch.setattr(os, "replace", real_replace)
    assert target.read_text() == "old"
    assert [p.name for p in tmp_path.iterdir()] == ["out.csv"]


def test_oversized_uploads_are_refused(tmp_path):
    """Scenario and inventory files above their caps are refused before parsing."""
    big = tmp_path / "big.csv"
    with open(big, "wb") as handle:
        handle.truncate(MAX_FILE_BYTES + 1)
    with pytest.raises(UllageError, match="large|MB|bytes"):
        screen_inventory(big)
    scenario = tmp_path / "big.toml"
    with open(scenario, "wb") as handle:
        handle.truncate(MAX_SCENARIO_BYTES + 1)
    with pytest.raises(ScenarioError, match="short text file"):
        load_scenario(scenario)


def test_scenario_files_name_one_confined_path():
    """The one scenario key that is a file path is a [[liquid]]'s safety data sheet
    (`sds`), read-only; every other path comes from the command line or the
    browser's file dialogs. No key can make ullage write anywhere."""
    paths = [(name, key) for name, section in SCHEMA.items()
             for key, (kind, _) in section.items()
             if "path" in kind or "file" in kind or "path" in key or "file" in key]
    assert paths == [("liquid", "sds")]
    assert SCHEMA["liquid"]["sds"][0] == "sds_path"


SHEET = ("3. COMPOSITION/INFORMATION ON INGREDIENTS\nToluene 108-88-3 100 %\n")


def _sds_scenario(path_text):
    return ('[scenario]\ntitle = "t"\n[[liquid]]\nname = "x"\n'
            f'sds = "{path_text}"\n')


@pytest.mark.parametrize("path_text,fragment", [
    ("/etc/passwd.txt", "absolute path"),
    ("C:/sheets/a.txt", "absolute path"),
    ("../outside.txt", "leaves the scenario file's folder"),
    ("sheets/../../outside.txt", "leaves the scenario file's folder"),
    ("link/outside.txt", "leads outside"),
    ("scenario.toml", ".txt or .pdf"),
    ("missing.txt", "not found"),
])
def test_sheet_path_stays_in_the_scenario_folder(tmp_path, path_text, fragment):
    """Absolute paths, '..' and links out of the scenario's folder are refused."""
    outside = tmp_path / "outside.txt"
    outside.write_text(SHEET)
    folder = tmp_path / "case"
    folder.mkdir()
    (folder / "link").symlink_to(tmp_path, target_is_directory=True)
    scenario = folder / "scenario.toml"
    scenario.write_text(_sds_scenario(path_text))
    with pytest.raises(ScenarioError, match=fragment) as info:
        load_scenario(scenario)
    assert "sds" in info.value.field


def test_sheet_path_inside_the_folder_is_read(tmp_path):
    """A sheet beside the scenario is read; the same text not read from a file is refused."""
    (tmp_path / "sheets").mkdir()
    (tmp_path / "sheets" / "t.txt").write_text(SHEET)
    scenario = tmp_path / "scenario.toml"
    scenario.write_text(_sds_scenario("sheets/t.txt"))
    loaded = load_scenario(scenario)
    assert [s.key for s in loaded.liquids["x"]["spec"]] == ["toluene"]
    with pytest.raises(ScenarioError, match="sds_text"):
        from estimator.scenario import loads_scenario
        loads_scenario(scenario.read_text(), "uploaded.toml")


def test_browser_app_binds_to_loopback_by_default():
    """`ullage app` listens on 127.0.0.1 unless told otherwise."""
    args = cli.build_parser().parse_args(["app"])
    assert args.address == "127.0.0.1"


def test_root_finding_failure_is_a_clear_error(monkeypatch):
    """If the temperature search does not converge, the user gets a reason, not a trace."""
    import scipy.optimize

    from estimator.errors import OutOfRangeError
    from estimator.headspace import temperature_for_concentration

    def stuck(*args, **kwargs):
        raise RuntimeError("Failed to converge after 200 iterations")

    monkeypatch.setattr(scipy.optimize, "brentq", stuck)
    with pytest.raises(OutOfRangeError, match="not found within 200 iterations"):
        temperature_for_concentration("toluene", 0.01)


def test_output_to_a_missing_folder_is_a_clear_error(capsys, tmp_path):
    """Writing a report into a folder that does not exist names the folder, no temp file."""
    target = tmp_path / "nowhere" / "report.html"
    code = cli.main(["run", str(ROOT / "scenarios" / "sump-dissolved-solvent.toml"), "-o",
                     str(target)])
    err = capsys.readouterr().err
    assert code == 2 and "does not exist" in err and ".part" not in err
