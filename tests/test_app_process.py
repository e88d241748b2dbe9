"""`ullage app` is the server's process: stopping it by its process id (SIGTERM),
Ctrl-C (SIGINT) or closing the terminal (SIGHUP) leaves no server on the port."""

import os
import signal
import socket
import subprocess
import sys
import time
import urllib.request

import pytest

pytestmark = pytest.mark.skipif(os.name != "posix", reason="POSIX signals")


def free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def port_open(port: int) -> bool:
    with socket.socket() as s:
        s.settimeout(0.5)
        return s.connect_ex(("127.0.0.1", port)) == 0


def start(port: int, tmp_path) -> subprocess.Popen:
    log = open(tmp_path / "app.log", "wb")
    return subprocess.Popen([sys.executable, "-m", "estimator", "app", "--port", str(port)],
                            stdout=log, stderr=subprocess.STDOUT, stdin=subprocess.DEVNULL,
                            cwd=tmp_path)


def wait_for_200(port: int, process: subprocess.Popen, seconds: float = 90.0) -> None:
    deadline = time.monotonic() + seconds
    while time.monotonic() < deadline:
        assert process.poll() is None, "the server stopped on its own"
        try:
            with urllib.request.urlopen(f"http://127.0.0.1:{port}/", timeout=2) as reply:
                if reply.status == 200:
                    return
        except OSError:
            pass
        time.sleep(0.5)
    raise AssertionError(f"no HTTP 200 on port {port} within {seconds:g} s")


@pytest.mark.parametrize("signum", [signal.SIGTERM, signal.SIGINT, signal.SIGHUP],
                         ids=["SIGTERM", "SIGINT", "SIGHUP"])
def test_stopping_the_command_stops_the_server(signum, tmp_path):
    """The command's own PID serves the port; one signal to it closes the port."""
    port = free_port()
    process = start(port, tmp_path)
    try:
        wait_for_200(port, process)
        process.send_signal(signum)
        process.wait(timeout=30)
        deadline = time.monotonic() + 10
        while port_open(port) and time.monotonic() < deadline:
            time.sleep(0.2)
        assert not port_open(port), "a server is still listening after the command stopped"
    finally:
        if process.poll() is None:
            process.kill()
            process.wait()


@pytest.mark.parametrize("value", ["0", "70000", "http", "-1"])
def test_bad_port_is_refused(value, capsys):
    """A port outside 1-65535 or not a number exits 2 naming --port."""
    from estimator import cli

    assert cli.main(["app", "--port", value]) == 2
    err = capsys.readouterr().err
    assert "--port" in err and "65535" in err


def test_address_defaults_to_loopback():
    """127.0.0.1 unless --address says otherwise."""
    from estimator.cli import build_parser

    assert build_parser().parse_args(["app"]).address == "127.0.0.1"
    assert build_parser().parse_args(["app", "--address", "0.0.0.0"]).address == "0.0.0.0"


def test_the_server_neither_polls_its_files_nor_collects_after_every_rerun():
    """An installed app does not change while it runs, and a full garbage collection
    after every rerun cost more CPU than the rerun (benchmarks/README.md): both are
    off by default, and an option given on the command line still wins."""
    from ullage_ui.launch import command

    def options(args):
        return dict(zip(args[5::2], args[6::2]))  # after: python -m streamlit run app.py

    default = options(command([]))
    assert default["--server.fileWatcherType"] == "none"
    assert default["--runner.postScriptGC"] == "false"
    assert default["--server.address"] == "127.0.0.1"
    mine = command(["--runner.postScriptGC", "true"])
    assert mine.count("--runner.postScriptGC") == 1
    assert mine[mine.index("--runner.postScriptGC") + 1] == "true"
