"""End to end in a real headless browser: the app started as a server, a temperature
changed on the tank page, the headspace result changing, and the HTML report downloaded
with the cautions in it.

Needs Debian's chromium at /usr/bin/chromium and the Playwright Python package. Without
them the test is skipped (marker ``requires_chromium``, tests/conftest.py), except in CI
(CI=true), where a missing browser is a failure.
"""

import html
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


def _metric_text(page) -> str:
    """The value of the headspace tile (found by its label, not by position)."""
    tile = page.locator('[data-testid="stMetric"]').filter(has_text="Headspace, all vapour")
    return tile.first.locator('[data-testid="stMetricValue"]').inner_text().strip()


@pytest.mark.requires_chromium
def test_temperature_change_and_report_download():
    """Raise the tank temperature, see the headspace change, download the report."""
    from playwright.sync_api import sync_playwright

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
            with sync_playwright() as p:
                browser = p.chromium.launch(executable_path=CHROMIUM, args=BROWSER_ARGS)
                try:
                    page = browser.new_page(accept_downloads=True,
                                            viewport={"width": 1400, "height": 1600})
                    page.set_default_timeout(STEP_TIMEOUT_MS)
                    page.goto(base + "/")
                    page.get_by_text("Headspace, all vapour").first.wait_for()
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
                        page.locator('[data-testid="stStatusWidget"]').wait_for(state="hidden")
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
                    browser.close()
        finally:
            process.terminate()
            try:
                process.wait(timeout=10)
            except subprocess.TimeoutExpired:
                process.kill()
                process.wait(timeout=10)
