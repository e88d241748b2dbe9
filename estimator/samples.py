"""The invented demo scenarios and sample inventory that ship with ullage.

In a checkout they live in the top-level ``scenarios/`` folder; an installed
wheel carries the same files (one copy) as ``estimator/demos/``, mapped there by
``pyproject.toml``. Everything in them is invented, limits included.
"""

from __future__ import annotations

from pathlib import Path

__all__ = ["demo_folder", "demo_scenarios", "demo_scenario", "sample_inventory"]

_INSTALLED = Path(__file__).resolve().with_name("demos")
_CHECKOUT = Path(__file__).resolve().parents[1] / "scenarios"

#: File name of the sample inventory among the demos.
SAMPLE_INVENTORY = "inventory_example.csv"


def demo_folder() -> Path:
    """The folder holding the demo files: the installed copy, else the checkout's."""
    return _INSTALLED if _INSTALLED.is_dir() else _CHECKOUT


def demo_scenarios() -> list[Path]:
    """Every demo scenario file, sorted by name (empty when none ship)."""
    return sorted(demo_folder().glob("*.toml"))


def demo_scenario(name: str) -> Path | None:
    """The demo scenario called `name` ("coatings-day-tank", with or without
    ".toml"), or None."""
    stem = Path(str(name).strip()).name
    stem = stem[:-5] if stem.lower().endswith(".toml") else stem
    for path in demo_scenarios():
        if path.stem.lower() == stem.lower():
            return path
    return None


def sample_inventory() -> Path:
    """The invented sample inventory (CSV) with good and bad rows."""
    return demo_folder() / SAMPLE_INVENTORY
