"""The `ullage` command line.

Results go to standard output, errors to standard error. Exit codes: 0 done,
1 a limit or alarm exceeded (only with --signal-exceedance), 2 bad input or items
(scenario items, inventory rows) that could not be computed.
"""

from __future__ import annotations

import argparse
import sys
import textwrap
from pathlib import Path

from ._meta import CAUTIONS, __version__
from .errors import UllageError

from .cli_common import EXIT_BAD_INPUT, EXIT_LIMIT, EXIT_OK, BadInput, cautions_block


def _out(text: str, output: str | None) -> None:
    if output:
        from .files import write_text_atomic

        write_text_atomic(output, text)
        print(f"wrote {output}", file=sys.stderr)
    else:
        text = text if text.endswith("\n") else text + "\n"
        try:
            sys.stdout.write(text)
        except UnicodeEncodeError:  # a terminal without °C or m²: replaced, not a traceback
            encoding = sys.stdout.encoding or "ascii"
            sys.stdout.write(text.encode(encoding, "replace").decode(encoding))


def _cmd_substances(args) -> int:
    from .substances import all_substances, search_substances, substance

    if args.text:
        try:
            hits = [substance(args.text)]
        except UllageError as exc:
            hits = [] if _looks_like_cas(args.text) else search_substances(args.text)
            if not hits:
                print(f"ullage: nothing matches {args.text!r}: {exc.reason}", file=sys.stderr)
                return EXIT_BAD_INPUT
        if len(hits) == 1:
            print(_describe(hits[0]))
            return EXIT_OK
    else:
        hits = list(all_substances())
    print(f"{'key':<26} {'CAS':<12} {'name':<32} {'Tb [°C]':>9}")
    for s in hits:
        mark = "  (property library)" if s.origin == "lookup" else ""
        print(f"{s.key:<26} {s.cas:<12} {s.name[:32]:<32} "
              f"{s.boiling_point - 273.15:9.1f}{mark}")
    print(f"\n{len(hits)} substance(s). `ullage substances NAME` shows one in full; any "
          "name, synonym or CAS number the property library (chemicals) knows works too.")
    return EXIT_OK


def _looks_like_cas(text: str) -> bool:
    import re

    return re.fullmatch(r"\s*\d{2,7}-\d{2}-\d\s*", text) is not None


#: Shown for a value the data do not hold.
NOT_ON_RECORD = "not on record: enter it from the safety data sheet"


def _describe(s) -> str:
    from .vapor import method_uncertainty

    def celsius(k, missing="-"):
        return missing if k is None else f"{k - 273.15:.1f} °C"

    def percent(v):
        return "-" if v is None else f"{100 * v:.3g} %"

    stated = method_uncertainty()

    def method(c):
        u = stated.get(c.method)
        if u is None:
            return c.method
        return f"{c.method} (±{100 * u[0]:.2g} %)" if u[0] < 0.1 else \
            f"{c.method} (±{100 * u[0]:.0f} %)"

    flammability = (NOT_ON_RECORD if s.lower_flammability_limit is None else
                    f"{percent(s.lower_flammability_limit)} / "
                    f"{percent(s.upper_flammability_limit)}")
    rows = [
        ("name", s.name), ("key", s.key), ("CAS", s.cas), ("formula", s.formula),
        ("data from", {"table": "ullage's curated table",
                       "lookup": "the property library (chemicals), not the curated "
                                 "table: check against the safety data sheet",
                       "user": "values you entered"}.get(s.origin, s.origin)),
        ("synonyms", "; ".join(s.synonyms) or "-"),
        ("molar mass", f"{1000 * s.molar_mass:.2f} g/mol"),
        ("normal boiling point", celsius(s.boiling_point)),
        ("melting point", celsius(s.melting_point)),
        ("critical temperature", celsius(s.critical_temperature)),
        ("liquid density", "-" if s.liquid_density is None else f"{s.liquid_density:.0f} kg/m3"),
        ("LFL / UFL in air", flammability),
        ("flash point", celsius(s.flash_point, NOT_ON_RECORD)),
        ("vapour-pressure methods", ", ".join(method(c) for c in s.correlations)),
    ]
    out = [f"{label:<26} {value}" for label, value in rows]
    out.append("  (± stated uncertainty of each method: 95 % of validation points within it)")
    out.append("\nSources:")
    out += [f"  {group}: {source}" for group, source in s.sources.items()]
    out += [textwrap.fill("note: " + n, width=78, subsequent_indent="      ") for n in s.notes]
    return "\n".join(out) + "\n" + cautions_block()


def _summary(result) -> str:
    """A plain-text summary of a scenario run for the terminal."""
    sc = result.scenario
    lines = [f"ullage {result.version}: {sc.title}"]
    site = sc.document.get("scenario", {}).get("site")
    if site:
        lines.append(site)
    lines.append("")
    lines.append("SCREENING ESTIMATE: measure with calibrated instruments before entry.")
    for item, kind in [(t, "Tank") for t in result.tanks] + [(s, "Spill") for s in result.spills]:
        where = f" ({item.where})" if kind == "Spill" else ""
        lines += ["", f"{kind} {item.name}{where}, liquid {item.liquid}"]
        for finding in item.findings:
            lines.append(textwrap.fill(finding, width=78, initial_indent="  - ",
                                       subsequent_indent="    "))
        for warning in item.warnings:
            lines.append(textwrap.fill("note: " + warning, width=78, initial_indent="  ! ",
                                       subsequent_indent="    "))
    for item, message in result.errors:
        lines.append(f"\nNot computed: {item}: {message}")
    if result.assumptions:
        lines += ["", "Assumptions:"]
        lines += [textwrap.fill(a, width=78, initial_indent="  - ", subsequent_indent="    ")
                  for a in result.assumptions]
    return "\n".join(lines) + "\n" + cautions_block() + "\n"


def _load(path):
    from .samples import demo_scenario
    from .scenario import load_scenario

    demo = None if Path(path).exists() else demo_scenario(path)
    return load_scenario(demo or path)


def _render(result, fmt: str) -> str:
    from . import report

    if fmt == "text":
        return _summary(result)
    return {"markdown": report.markdown_report, "html": report.html_report,
            "json": report.results_json, "csv": report.results_csv}[fmt](result)


def _exit(result, args) -> int:
    if result.errors:
        print(f"ullage: {len(result.errors)} item(s) could not be computed; see the report",
              file=sys.stderr)
        return EXIT_BAD_INPUT
    return EXIT_LIMIT if getattr(args, "signal_exceedance", False) and result.exceeded \
        else EXIT_OK


def _cmd_run(args) -> int:
    from .screening import run_scenario

    result = run_scenario(_load(args.scenario))
    fmt = args.format or _format_from_path(args.output) or "text"
    if args.output and fmt != "text":
        from .report import write_report

        write_report(result, args.output, fmt)
        print(f"wrote {args.output}", file=sys.stderr)
    else:
        _out(_render(result, fmt), args.output)
    return _exit(result, args)


def _format_from_path(path):
    if not path:
        return None
    suffix = Path(path).suffix.lower()
    return {".md": "markdown", ".html": "html", ".htm": "html", ".json": "json",
            ".csv": "csv", ".txt": "text"}.get(suffix)


def _cmd_check(args) -> int:
    from .screening import run_scenario

    scenario = _load(args.scenario)
    # every check `run` makes: the items are computed, nothing is written
    result = run_scenario(scenario)
    counts = (f"{len(scenario.tanks)} tank(s), {len(scenario.spills)} spill(s), "
              f"{len(scenario.limits)} limit value(s)")
    if result.errors:
        print(f"{args.scenario}: scenario {scenario.title!r} ({counts}) has "
              f"{len(result.errors)} item(s) that cannot be computed:", file=sys.stderr)
        for item, message in result.errors:
            print(textwrap.fill(f"{item}: {message}", width=78, initial_indent="  - ",
                                subsequent_indent="    "), file=sys.stderr)
        return EXIT_BAD_INPUT
    print(f"{args.scenario}: valid scenario {scenario.title!r}: {counts}; every item "
          "computes")
    if scenario.assumptions:
        print("Assumptions the run will make:")
        for a in scenario.assumptions:
            print(textwrap.fill(a, width=78, initial_indent="  - ", subsequent_indent="    "))
    return EXIT_OK


def _sweep_grid(args):
    """The temperatures [K] and the pressure [Pa] a sweep asks for, checked."""
    import numpy as np

    from .units import parse_quantity, parse_temperature

    low = parse_temperature(args.low, "--from")
    high = parse_temperature(args.high, "--to")
    if high <= low:
        raise BadInput("--to", "must be above --from")
    step = parse_quantity(args.step, "temperature_difference", "--step")
    if step <= 0:
        raise BadInput("--step", "must be above zero")
    if (high - low) / step > 2000:
        raise BadInput("--step", "gives more than 2000 rows; use a larger step")
    pressure = parse_quantity(args.pressure, "pressure", "--pressure")
    return np.arange(low, high + step / 2, step), pressure


def _sweep_headspace(args, grid, pressure):
    """The headspace over the grid of the liquid given, or of a scenario's tank."""
    from .headspace import headspace, water_headspace
    from .inventory import parse_liquid

    if args.liquid:
        return headspace(parse_liquid(args.liquid, args.basis, "liquid"), grid, pressure)
    if not args.scenario or not args.tank:
        raise BadInput("liquid", "give a liquid (\"toluene\", or \"toluene 60%, o-xylene "
                        "40%\") or --scenario FILE --tank NAME")
    sc = _load(args.scenario)
    tank = {t["name"].lower(): t for t in sc.tanks}.get(args.tank.lower())
    if tank is None:
        raise BadInput("--tank", f"no tank {args.tank!r} in the scenario; tanks: "
                        f"{', '.join(t['name'] for t in sc.tanks) or 'none'}")
    entry = sc.liquids[tank["liquid"]]
    p = sc.pressure + tank.get("gauge_pressure", 0.0)
    if entry["kind"] == "water":
        return water_headspace({s.key: c for s, c in entry["spec"].items()}, grid, p)
    return headspace(sc.liquid(tank["liquid"]), grid, p)


def _sweep_csv(hs, grid, header) -> str:
    """A sweep as CSV text, the cautions as its last rows."""
    import csv
    import io

    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(header)
    n = len(hs.liquid.components)
    for i, t in enumerate(grid):
        writer.writerow([f"{t - 273.15:.2f}", f"{hs.total_volume_fraction[i] * 1e6:.6g}",
                         f"{hs.total_mg_per_m3[i]:.6g}", f"{hs.percent_lfl[i]:.4g}",
                         f"{hs.oxygen_percent[i]:.4g}", str(hs.flammability[i])]
                        + [f"{hs.ppm[j, i]:.6g}" for j in range(n)])
    for caution in CAUTIONS:
        writer.writerow(["caution", caution])
    return buffer.getvalue()


def _sweep_text(hs, grid, header, pressure) -> str:
    """A sweep as a table for the terminal, with its methods, notes and the cautions."""
    from .limits import format_ppm

    lines = [f"Equilibrium headspace, {pressure / 1000:.2f} kPa: "
             + ", ".join(f"{c.name} x={x:.3g}" for c, x in zip(hs.liquid.components,
                                                               hs.liquid.mole_fractions)), ""]
    lines.append("  ".join(f"{h:>12}" for h in header))
    n = len(hs.liquid.components)
    for i, t in enumerate(grid):
        cells = [f"{t - 273.15:.1f}", format_ppm(hs.total_volume_fraction[i] * 1e6),
                 format_ppm(hs.total_mg_per_m3[i]), f"{hs.percent_lfl[i]:.3g}",
                 f"{hs.oxygen_percent[i]:.3g}", str(hs.flammability[i])]
        cells += [format_ppm(hs.ppm[j, i]) for j in range(n)]
        lines.append("  ".join(f"{c:>12}" for c in cells))
    methods = sorted({f"{e.description} ({e.source})" for e in hs.vapor_pressure_methods})
    lines += ["", "Vapour pressure: " + "; ".join(methods)]
    lines += [f"note: {w}" for w in hs.warnings]
    return "\n".join(lines) + "\n" + cautions_block() + "\n"


def _cmd_sweep(args) -> int:
    grid, pressure = _sweep_grid(args)
    hs = _sweep_headspace(args, grid, pressure)
    header = ["T [degC]", "total ppm", "mg/m3", "% LFL", "O2 %", "state"] + \
        [f"{c.key} ppm" for c in hs.liquid.components]
    if args.csv:
        _out(_sweep_csv(hs, grid, header), args.output)
    else:
        _out(_sweep_text(hs, grid, header, pressure), args.output)
    return EXIT_OK


def _cmd_inventory(args) -> int:
    from .files import parse_size
    from .inventory import inventory_summary_text, screen_inventory, write_inventory_csv
    from .units import parse_quantity

    pressure = parse_quantity(args.pressure, "pressure", "--pressure")
    if args.top < 0:
        raise BadInput("--top", "give a number of rows, 0 or more")
    result = screen_inventory(args.file, pressure=pressure,
                              max_bytes=parse_size(args.max_size, "--max-size"))
    if args.output:
        write_inventory_csv(result, args.output)
        print(f"wrote {args.output}", file=sys.stderr)
    print(inventory_summary_text(result, top=args.top, output=args.output))
    print(cautions_block())
    errors = result.summary.counts.get("error", 0)
    if errors:
        print(f"ullage: {errors} row(s) could not be computed; they are listed above"
              + (" and kept in the output file" if args.output else ""), file=sys.stderr)
        return EXIT_BAD_INPUT
    return EXIT_LIMIT if args.signal_exceedance and result.summary.at_or_above_alarm \
        else EXIT_OK


def _cmd_demo(args) -> int:
    from .samples import demo_scenarios
    from .screening import run_scenario

    files = demo_scenarios()
    if not files:
        raise BadInput("demo", "no demo scenarios are in this installation; reinstall "
                        "ullage (pip install ullage)")
    for path in files:
        result = run_scenario(_load(path))
        print(f"=== {path.name} ===")
        sys.stdout.write(_summary(result))
        print()
    print(f"Run one with `ullage run {files[0].stem} --output report.html` for the full "
          "report with plots (a demo's name or any scenario file).")
    return EXIT_OK


def _port(text: str) -> int:
    """A TCP port number from the command line."""
    try:
        number = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a port number; give a whole "
                                         "number from 1 to 65535, such as 8501") from None
    if not 1 <= number <= 65535:
        raise argparse.ArgumentTypeError(f"{number} is outside 1-65535; give a port such "
                                         "as 8501")
    return number


def _cmd_app(args) -> int:
    import os

    try:
        from ullage_ui import launch
    except ImportError:
        raise BadInput("app", "the browser front end (package ullage_ui) is not in this "
                        "installation; reinstall ullage (pip install ullage)") from None
    command = launch.command(["--server.address", args.address,
                              "--server.port", str(args.port)])
    print(f"ullage: serving on http://{args.address}:{args.port} (Ctrl-C to stop)",
          file=sys.stderr, flush=True)
    sys.stdout.flush()
    if os.name == "posix":
        # Become the server: its process id is this command's, so Ctrl-C, SIGTERM,
        # SIGHUP (the terminal closing) and `kill PID` reach it directly.
        os.execv(command[0], command)
    return launch.forwarding_call(command)


class _Parser(argparse.ArgumentParser):
    def error(self, message):
        self.print_usage(sys.stderr)
        print(f"{self.prog}: error: {message}", file=sys.stderr)
        raise SystemExit(EXIT_BAD_INPUT)


def _add_run_parsers(sub) -> None:
    """The commands that run or check a scenario file."""
    p = sub.add_parser("run", help="run a scenario file and report the results",
                       description="Run a scenario and print a readable summary, or write "
                                   "the report as Markdown, HTML, JSON or CSV.")
    p.add_argument("scenario", help="scenario file (.toml), or a demo's name")
    p.add_argument("--format", choices=["text", "markdown", "html", "json", "csv"],
                   help="output format (default: from --output's extension, else text)")
    p.add_argument("--output", "-o", help="write to this file instead of standard output")
    p.add_argument("--signal-exceedance", action="store_true",
                   help="exit with 1 when any limit or alarm is exceeded")
    p.set_defaults(func=_cmd_run)

    p = sub.add_parser("check", help="check a scenario file without writing a report",
                       description="Check a scenario file with every check a run makes "
                                   "(each item is computed, nothing is written) and list "
                                   "the assumptions a run would make.")
    p.add_argument("scenario", help="scenario file (.toml)")
    p.set_defaults(func=_cmd_check)


def _add_sweep_parser(sub) -> None:
    p = sub.add_parser("sweep", help="headspace over a temperature range",
                       description="Equilibrium headspace of a liquid over a temperature "
                                   "range: a substance, a mixture such as \"toluene 60%, "
                                   "o-xylene 40%\", or a tank of a scenario.")
    p.add_argument("liquid", nargs="?", help="substance or mixture (quote it)")
    p.add_argument("--from", dest="low", default="0 degC", help="lowest temperature")
    p.add_argument("--to", dest="high", default="50 degC", help="highest temperature")
    p.add_argument("--step", default="5 K", help="temperature step")
    p.add_argument("--pressure", default="101325 Pa", help="absolute pressure")
    p.add_argument("--basis", default="mass", choices=["mass", "mole", "volume"],
                   help="basis of mixture percentages (default mass)")
    p.add_argument("--scenario", help="take the liquid and pressure of a scenario's tank")
    p.add_argument("--tank", help="tank name in --scenario")
    p.add_argument("--csv", action="store_true", help="write CSV")
    p.add_argument("--output", "-o", help="write to this file")
    p.set_defaults(func=_cmd_sweep)


def _add_inventory_parser(sub) -> None:
    p = sub.add_parser("inventory", help="screen an inventory file of tanks and containers",
                       description="Screen every row of an inventory (CSV or Excel): "
                                   "headspace, %LFL and ratio to each limit, sorted by "
                                   "concern. Bad rows are reported, never dropped.")
    p.add_argument("file", help="inventory .csv or .xlsx")
    p.add_argument("--pressure", default="101325 Pa", help="absolute pressure for all rows")
    p.add_argument("--output", "-o", help="write the screened table (every row) as CSV")
    p.add_argument("--top", type=int, default=10, metavar="N",
                   help="rows of highest concern shown in the summary (default 10)")
    p.add_argument("--max-size", default="200 MB",
                   help="largest file read, with its unit (default 200 MB)")
    p.add_argument("--signal-exceedance", action="store_true",
                   help="exit with 1 when a row reaches a limit or alarm (concern >= 1)")
    p.set_defaults(func=_cmd_inventory)


def _add_other_parsers(sub) -> None:
    """The substance list, the demos and the browser front end."""
    p = sub.add_parser("substances", help="list the bundled substances or show one",
                       description="List the bundled substances, or show one in full by "
                                   "name, synonym or CAS number.")
    p.add_argument("text", nargs="?", help="name, synonym, CAS number or part of one")
    p.set_defaults(func=_cmd_substances)

    p = sub.add_parser("demo", help="run the bundled demo scenarios",
                       description="Run the invented demo scenarios that ship with ullage "
                                   "and print their summaries.")
    p.set_defaults(func=_cmd_demo)

    p = sub.add_parser("app", help="start the browser front end",
                       description="Start the browser front end. It listens on 127.0.0.1 "
                                   "only; give --address 0.0.0.0 to share it on a network "
                                   "deliberately.")
    p.add_argument("--address", default="127.0.0.1", help="address to listen on")
    p.add_argument("--port", type=_port, default=8501, help="port (default 8501)")
    p.set_defaults(func=_cmd_app)


def build_parser() -> argparse.ArgumentParser:
    """The `ullage` command's parser, one subcommand per task."""
    parser = _Parser(
        prog="ullage",
        description="Screening estimates of vapour hazards: vapour pressure, tank "
                    "headspace, spill evaporation and air concentration, compared "
                    "with the limits you enter. Every result is a screening "
                    "estimate: measure before entry.",
        epilog="Exit codes: 0 done, 1 a limit exceeded (with --signal-exceedance), "
               "2 bad input, or items or rows that could not be computed.")
    parser.add_argument("--version", action="version", version=f"ullage {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    _add_run_parsers(sub)
    _add_sweep_parser(sub)
    _add_inventory_parser(sub)
    _add_other_parsers(sub)

    from .cli_sds import add_parser as add_sds_parser

    add_sds_parser(sub)
    return parser


def main(argv=None) -> int:
    parser = build_parser()
    try:
        args = parser.parse_args(argv)
    except SystemExit as exc:
        return int(exc.code or 0)
    if not getattr(args, "func", None):
        parser.print_help()
        return EXIT_OK
    try:
        return args.func(args)
    except UllageError as exc:
        print(f"ullage: error: {exc}", file=sys.stderr)
        return EXIT_BAD_INPUT
    except KeyboardInterrupt:
        print("ullage: interrupted; no partial output was written", file=sys.stderr)
        return 130
    except BrokenPipeError:
        import os

        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return EXIT_OK
    except (OSError, MemoryError) as exc:
        print(f"ullage: error: {exc}", file=sys.stderr)
        return EXIT_BAD_INPUT


if __name__ == "__main__":
    sys.exit(main())
