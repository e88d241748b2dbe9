"""One rerun of the tank page after an input change (the result's fragment alone),
against a trivial Streamlit page (one st.write) rerun, both driven headless by
Streamlit's AppTest."""

from __future__ import annotations

import itertools
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))
sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from _timing import best_time, report  # noqa: E402

ROOT = Path(__file__).resolve().parents[1]
TANK_PAGE = ROOT / "ui" / "screens" / "tank.py"
TRIVIAL_PAGE = 'import streamlit as st\nst.write("ullage")\n'


def run() -> list[dict]:
    from streamlit import config
    from streamlit.testing.v1 import AppTest

    # As the app is launched (ui/launch.py): no usage statistics.
    config.set_option("browser.gatherUsageStats", False)

    trivial = AppTest.from_string(TRIVIAL_PAGE, default_timeout=30).run()
    tank = AppTest.from_file(str(TANK_PAGE), default_timeout=30).run()
    assert not tank.exception and not trivial.exception
    box = "w:tank.temperature"
    fresh = itertools.count()
    seen = itertools.cycle([30.0, 31.0])

    def timed_change(values):
        def change() -> float:
            # a changed number reruns the result alone (its fragment), after which
            # AppTest's tree holds only the result: a full run first, not timed,
            # brings the input box back
            tank.run()
            tank.number_input(key=box).set_value(next(values))
            start = time.perf_counter()
            tank.run()
            return time.perf_counter() - start
        return change

    # a temperature not seen before: the core runs again (nothing cached)
    new_value = timed_change(20.0 + 0.01 * i for i in fresh)
    # alternating between two temperatures: the calculation comes from the cache
    seen_value = timed_change(seen)
    for step in (new_value, seen_value, seen_value, trivial.run):
        step()
    t_trivial = best_time(trivial.run, repeat=15)
    t_new = min(new_value() for _ in range(15))
    t_seen = min(seen_value() for _ in range(15))
    assert not tank.exception
    records = [
        report("tank page rerun, new temperature vs trivial page", t_new, t_trivial, "<= 3"),
        report("tank page rerun, cached temperature vs trivial page", t_seen, t_trivial, "<= 3"),
    ]
    print("A changed temperature redraws the tank page's result alone (tiles, two charts, "
          "tables); the trivial page draws one line.\nA new temperature also runs the core "
          "screening (headspace, sweep, flash point, alarm temperature).")
    return records


if __name__ == "__main__":
    run()
