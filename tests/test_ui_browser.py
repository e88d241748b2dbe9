"""End to end in a real headless browser: the app started as a server (once for the
module), every page at its own address, a new case, numbers as people read them, tiles
that fit, one bad input, saving and loading a scenario, a temperature changed on the
tank page and the HTML report downloaded with the cautions in it.

Needs Debian's chromium at /usr/bin/chromium and the Playwright Python package. Without
them the test is skipped, except in CI (CI=true), where a missing browser is a failure.
"""

import html
import re
import os
import shutil
import socket
import subprocess
import sys
import tempfile
import time
import urllib.request
from pathlib import Path

import pytest

from estimator import CAUTIONS

ROOT = Path(__file__).resolve().parents[1]
CHROMIUM = "/usr/bin/chromium"
BROWSER_ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
                "--disable-component-update", "--disable-sync", "--no-first-run",
                "--disable-quic"]
#: Longest wait for the server to answer, and for the page to update. [s]
START_TIMEOUT = 40.0
STEP_TIMEOUT_MS = 20_000


def _browser_or_skip():
    reason = None
    try:
        from playwright.sync_api import sync_playwright
    except ImportError:
        reason = "the Playwright Python package is not installed"
        sync_playwright = None
    if reason is None and not (os.path.exists(CHROMIUM) or shutil.which("chromium")):
        reason = f"no chromium browser at {CHROMIUM} (apt-get install chromium)"
    if reason is not None:
        if os.environ.get("CI") == "true":
            pytest.fail(f"browser test cannot run in CI: {reason}")
        pytest.skip(reason)
    return sync_playwright


def _free_port() -> int:
    with socket.socket(socket.AF_INET, socket.SOCK_STREAM) as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def _wait_for(url: str, process, log_path: Path) -> None:
    deadline = time.monotonic() + START_TIMEOUT
    while time.monotonic() < deadline:
        if process.poll() is not None:
            pytest.fail("the app stopped before answering:\n" + log_path.read_text()[-3000:])
        try:
            with urllib.request.urlopen(url, timeout=2) as answer:
                if answer.status == 200:
                    return
        except OSError:
            time.sleep(0.3)
    pytest.fail(f"the app did not answer within {START_TIMEOUT:.0f} s:\n"
                + log_path.read_text()[-3000:])


def _metric_text(page, label: str = "Total vapour in the headspace") -> str:
    """The value of a tile (found by its label, not by position)."""
    tile = page.locator('[data-testid="stMetric"]').filter(has_text=label)
    return tile.first.locator('[data-testid="stMetricValue"]').inner_text().strip()


#: Every page and its own address (the start page is the root).
ADDRESSES = {"": "Start a case", "tank": "Tank headspace", "spill-indoors": "Spill indoors",
             "spill-outdoors": "Spill outdoors", "inventory": "Site inventory",
             "compare": "Two cases side by side", "limits": "Limits, alarms and site"}
DEMO = "coatings-day-tank.toml"


@pytest.fixture(scope="module")
def server():
    """The app served on 127.0.0.1 at a free port, for the tests of this module."""
    _browser_or_skip()
    port = _free_port()
    with tempfile.TemporaryDirectory() as folder:
        log_path = Path(folder) / "server.log"
        with open(log_path, "w") as log:
            process = subprocess.Popen(
                [sys.executable, "-m", "streamlit", "run", str(ROOT / "ui" / "app.py"),
                 "--server.address", "127.0.0.1", "--server.port", str(port),
                 "--server.headless", "true", "--browser.gatherUsageStats", "false"],
                cwd=ROOT, stdout=log, stderr=subprocess.STDOUT, stdin=subprocess.DEVNULL)
        try:
            base = f"http://127.0.0.1:{port}"
            _wait_for(f"{base}/_stcore/health", process, log_path)
            yield base
        finally:
            process.terminate()
            try:
                process.wait(timeout=10)
            except subprocess.TimeoutExpired:
                process.kill()
                process.wait(timeout=10)


@pytest.fixture(scope="module")
def browser(server):
    sync_playwright = _browser_or_skip()
    with sync_playwright() as p:
        chromium = p.chromium.launch(executable_path=CHROMIUM, args=BROWSER_ARGS)
        try:
            yield chromium
        finally:
            chromium.close()


def _open(browser, url: str, width: int = 1400):
    """A fresh session (its own browser context) at an address, settled."""
    context = browser.new_context(accept_downloads=True,
                                  viewport={"width": width, "height": 1600})
    page = context.new_page()
    page.set_default_timeout(STEP_TIMEOUT_MS)
    page.goto(url)
    page.locator("h1").first.wait_for()
    _settle(page)
    return page


def _settle(page) -> None:
    """Wait until the app has finished its rerun (the running indicator is gone)."""
    page.wait_for_timeout(300)
    page.locator('[data-testid="stStatusWidget"]').wait_for(state="hidden")


def _load_demo(page, name: str = DEMO) -> None:
    page.locator('[data-testid="stSidebar"] [data-testid="stSelectbox"]').filter(
        has_text="Demo scenario").click()
    page.get_by_role("option", name=name).click()
    _settle(page)
    page.locator('[data-testid="stSidebar"]').get_by_role(
        "button", name="Load this demo").click()
    page.get_by_text(f"On screen: {name}").wait_for()
    _settle(page)


def _expect():
    from playwright.sync_api import expect

    return expect


def _main_text(page) -> str:
    return page.locator('[data-testid="stMain"]').inner_text()


@pytest.mark.parametrize("address", list(ADDRESSES))
def test_every_page_opens_at_its_own_address(browser, server, address):
    """A bookmark to a page's own address opens that page, with no not-found notice."""
    page = _open(browser, f"{server}/{address}")
    try:
        assert page.locator("h1").first.inner_text().strip() == ADDRESSES[address]
        assert "not found" not in page.locator("body").inner_text().lower()
    finally:
        page.context.close()


def test_new_case_flow(browser, server):
    """A first visit is empty; a demo loads when asked; a new case drops all of it."""
    page = _open(browser, f"{server}/tank")
    try:
        expect = _expect()
        sidebar = page.locator('[data-testid="stSidebar"]')
        expect(sidebar.get_by_text("On screen: a new, empty case")).to_be_visible()
        name = page.get_by_role("textbox", name="Tank", exact=True)
        expect(name).to_have_value("tank 1")
        _load_demo(page)
        expect(name).to_have_value("T-3")
        worst = page.get_by_role("spinbutton", name="Worst-case temperature [°C]")
        expect(worst).to_have_value("46")
        sidebar.get_by_role("button", name="Start a new, empty case").click()
        page.get_by_text("On screen: a new, empty case").wait_for()
        expect(name).to_have_value("tank 1")
        expect(worst).to_have_value("")
        expect(page.get_by_text("No exposure limit entered").first).to_be_visible()
    finally:
        page.context.close()


@pytest.mark.parametrize("address", ["tank", "spill-indoors", "spill-outdoors", "compare"])
def test_no_scientific_notation_in_the_page_text(browser, server, address):
    """What a person reads on a page holds no number in scientific notation."""
    page = _open(browser, f"{server}/{address}")
    try:
        _load_demo(page, DEMO if address in ("tank", "compare") else "warehouse-drum-spill.toml")
        text = _main_text(page)
        assert re.search(r"\d ppm", text)
        assert not re.findall(r"\d(?:\.\d+)?e[+-]?\d", text)
        assert "degC" not in text and "[[" not in text
    finally:
        page.context.close()


@pytest.mark.parametrize("width", [1024, 1400])
def test_tiles_are_not_cut_off(browser, server, width):
    """Every tile's value and label fit in their boxes at 1024 px and wider, and no
    table runs out of its column."""
    page = _open(browser, f"{server}/tank", width)
    try:
        _load_demo(page)
        for address in ("tank", "spill-indoors", "spill-outdoors"):
            if address != "tank":
                page.get_by_role("link", name=ADDRESSES[address]).click()
                page.locator("h1", has_text=ADDRESSES[address]).wait_for()
                _settle(page)
            sizes = page.evaluate("""() => Array.from(document.querySelectorAll(
                '[data-testid="stMetricValue"], [data-testid="stMetricLabel"]')).map(
                e => [e.innerText, e.scrollWidth, e.clientWidth])""")
            assert sizes, address
            for text, scroll, client in sizes:
                assert scroll <= client + 1, (address, width, text)
            # a table wider than its column stays inside it (and scrolls sideways)
            overhangs = page.evaluate("""() => Array.from(document.querySelectorAll(
                '[data-testid="stMarkdownContainer"] table')).map(t =>
                t.getBoundingClientRect().right - t.parentElement.getBoundingClientRect().right)""")
            assert all(x <= 1 for x in overhangs), (address, width, overhangs)
    finally:
        page.context.close()


def test_one_bad_input_fails_alone(browser, server):
    """A negative tank volume is named by its label; the headspace is still shown."""
    page = _open(browser, f"{server}/tank")
    try:
        _load_demo(page)
        before = _metric_text(page)
        box = page.get_by_role("spinbutton", name="Tank volume [m³]", exact=True)
        box.fill("-5")
        box.press("Enter")
        page.get_by_text("must be above 0").first.wait_for()
        _settle(page)
        alert = page.locator('[data-testid="stAlert"]').filter(has_text="Tank volume")
        assert "must be above 0" in alert.first.inner_text()
        assert _metric_text(page) == before
        assert "[[tank]]" not in _main_text(page)
    finally:
        page.context.close()


def test_one_bad_downwind_distance_fails_alone(browser, server):
    """On the outdoor page a negative distance is named by its box's label beside it;
    the other distances and the release rate are still shown."""
    page = _open(browser, f"{server}/spill-outdoors")
    try:
        _load_demo(page, "warehouse-drum-spill.toml")
        before = _metric_text(page, "Release rate to air")
        box = page.get_by_role("textbox", name="Downwind distances, each with its unit, "
                                                "separated by commas")
        box.fill("100 m, -5 m, 1 km")
        box.press("Enter")
        page.get_by_text("is not above 0").first.wait_for()
        _settle(page)
        alert = page.locator('[data-testid="stAlert"]').filter(has_text="Downwind distances")
        assert "'-5 m' is not above 0" in alert.first.inner_text()
        assert _metric_text(page, "Release rate to air") == before
        table = page.locator("table").filter(has_text="distance [m]").first.inner_text()
        assert "1,000" in table and "-5" not in table
        assert "[outdoors]" not in _main_text(page)
    finally:
        page.context.close()


def test_save_then_load_gives_the_same_scenario(browser, server):
    """A saved file, loaded again and saved again, is the same scenario, the same text."""
    from estimator.scenario import load_scenario, loads_scenario

    page = _open(browser, f"{server}/spill-indoors")
    try:
        _load_demo(page, "warehouse-drum-spill.toml")
        saves = []
        for _ in range(2):
            with page.expect_download() as download:
                page.get_by_role("button", name="Save the inputs as a scenario file").click()
            saves.append(Path(download.value.path()).read_text(encoding="utf-8"))
            with tempfile.TemporaryDirectory() as folder:
                path = Path(folder) / "saved.toml"
                path.write_text(saves[-1], encoding="utf-8")
                page.locator('[data-testid="stSidebar"] input[type="file"]').set_input_files(
                    str(path))
                page.get_by_text("On screen: saved.toml").wait_for()
                _settle(page)
        assert saves[0] == saves[1]
        first = load_scenario(ROOT / "scenarios" / "warehouse-drum-spill.toml")
        again = loads_scenario(saves[1])
        assert [dict(s) for s in again.spills] == [dict(s) for s in first.spills]
        assert [dict(r) for r in again.rooms] == [dict(r) for r in first.rooms]
        assert not again.tanks  # a spill-only file gains no tank
        assert [(x.substance, x.kind, x.ppm) for x in again.limits] == [
            (x.substance, x.kind, x.ppm) for x in first.limits]
    finally:
        page.context.close()


def test_temperature_change_and_report_download(browser, server):
    """Raise the tank temperature, see the headspace change, download the report."""
    page = _open(browser, f"{server}/tank")
    try:
        _load_demo(page)
        before = _metric_text(page)
        assert before.endswith("ppm")
        box = page.get_by_role("spinbutton", name="Liquid temperature [°C]", exact=True)
        box.fill("45")
        box.press("Enter")
        deadline = time.monotonic() + STEP_TIMEOUT_MS / 1000
        after = before
        while ((after == before or not after.endswith("ppm"))
               and time.monotonic() < deadline):
            page.wait_for_timeout(200)
            after = _metric_text(page)
        assert after != before, "the headspace did not change"
        assert after.endswith("ppm")
        text = ""
        for _ in range(5):
            # The rerun may still be drawing the downloads of the new case.
            _settle(page)
            with page.expect_download() as download:
                page.get_by_role("button", name="Download the HTML report").click()
            text = Path(download.value.path()).read_text(encoding="utf-8")
            if "45.0" in html.unescape(text):
                break
            page.wait_for_timeout(500)
        assert "<html" in text.lower()
        shown = html.unescape(text)
        for caution in CAUTIONS:
            assert caution in shown
        assert "45.0" in shown
    finally:
        page.context.close()
