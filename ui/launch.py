"""Start the ullage browser front end on this computer only.

    python ui/launch.py [extra streamlit options]      (in a checkout)
    python -m ullage_ui.launch [extra streamlit options]  (installed)

runs

    streamlit run ui/app.py --server.address 127.0.0.1 --server.headless true
        --browser.gatherUsageStats false

so the pages answer only on this machine (http://127.0.0.1:8501 by default) and
nothing is reported to anyone. Options given after the script are passed on and
override these, for example another port: ``python ui/launch.py --server.port 8600``.

To let other computers on a network reach it — a hazard-review room sharing one
screen from a laptop, say — expose it deliberately:

    python ui/launch.py --server.address 0.0.0.0

and only on a network you trust: the pages have no login, and anyone who can reach
the port can use them.
"""

from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

APP = Path(__file__).resolve().with_name("app.py")

#: The settings the front end is launched with, each overridable from the command line.
DEFAULTS = {
    "--server.address": "127.0.0.1",
    "--server.headless": "true",
    "--browser.gatherUsageStats": "false",
    "--client.toolbarMode": "minimal",
    # the installed pages do not change while the app runs: no polling of their files,
    # which would take CPU from every session
    "--server.fileWatcherType": "none",
    "--server.runOnSave": "false",
    # no full garbage collection after every rerun: with the property data and the
    # numerical libraries in memory it took more CPU than the rerun itself (profiled
    # with 8 sessions); Python's own collector still runs
    "--runner.postScriptGC": "false",
}


def command(extra=()) -> list[str]:
    """The streamlit command line, the defaults overridden by `extra` options."""
    extra = list(extra)
    given = {a.split("=", 1)[0] for a in extra if a.startswith("--")}
    args = [sys.executable, "-m", "streamlit", "run", str(APP)]
    for option, value in DEFAULTS.items():
        if option not in given:
            args += [option, value]
    return args + extra


def forwarding_call(args) -> int:
    """Run the server as a child, passing Ctrl-C and termination on to it.

    Used where a process cannot replace itself (`os.execv` on Windows starts a
    new process instead), so that stopping this one stops the server too.
    """
    import signal

    child = subprocess.Popen(args)

    def forward(signum, frame):
        child.send_signal(signum)

    for name in ("SIGINT", "SIGTERM", "SIGBREAK", "SIGHUP"):
        if hasattr(signal, name):
            signal.signal(getattr(signal, name), forward)
    try:
        return child.wait()
    finally:
        if child.poll() is None:
            child.terminate()


def main(argv=None) -> int:
    args = command(sys.argv[1:] if argv is None else argv)
    sys.stdout.flush()
    sys.stderr.flush()
    if os.name == "posix":
        os.execv(args[0], args)  # become the server: signals reach it directly
    return forwarding_call(args)


if __name__ == "__main__":
    raise SystemExit(main())
