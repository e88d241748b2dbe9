"""The `ullage` command line."""

from __future__ import annotations

import argparse
import sys
import textwrap

from . import CAUTIONS, __version__
from .errors import UllageError

EXIT_OK = 0
EXIT_LIMIT = 1
EXIT_BAD_INPUT = 2


def _cautions_block() -> str:
    lines = ["", "Cautions:"]
    for caution in CAUTIONS:
        lines.append(textwrap.fill(caution, width=78, initial_indent="  - ",
                                   subsequent_indent="    "))
    return "\n".join(lines)


def _fmt(value, digits=4) -> str:
    return "-" if value is None else f"{value:.{digits}g}"


def _cmd_substances(args) -> int:
    from .substances import all_substances, search_substances, substance

    if args.text:
        try:
            hits = [substance(args.text)]
        except UllageError:
            hits = search_substances(args.text)
        if not hits:
            print(f"nothing matches {args.text!r}", file=sys.stderr)
            return EXIT_BAD_INPUT
    else:
        hits = list(all_substances())
    if len(hits) == 1 and args.text:
        print(_describe(hits[0]))
        return EXIT_OK
    print(f"{'key':<28} {'CAS':<12} {'name':<34} {'Tb [degC]':>9}")
    for s in hits:
        print(f"{s.key:<28} {s.cas:<12} {s.name[:34]:<34} {s.boiling_point - 273.15:9.1f}")
    print(f"\n{len(hits)} substance(s). `ullage substances NAME` shows one in full.")
    return EXIT_OK


def _describe(s) -> str:
    def celsius(k):
        return "-" if k is None else f"{k - 273.15:.1f} degC"

    def percent(v):
        return "-" if v is None else f"{100 * v:.3g} %"

    rows = [
        ("name", s.name), ("key", s.key), ("CAS", s.cas), ("formula", s.formula),
        ("synonyms", "; ".join(s.synonyms) or "-"),
        ("molar mass", f"{1000 * s.molar_mass:.2f} g/mol"),
        ("normal boiling point", celsius(s.boiling_point)),
        ("melting point", celsius(s.melting_point)),
        ("critical temperature", celsius(s.critical_temperature)),
        ("liquid density", "-" if s.liquid_density is None else f"{s.liquid_density:.0f} kg/m3"),
        ("LFL / UFL in air", f"{percent(s.lower_flammability_limit)} / "
                             f"{percent(s.upper_flammability_limit)}"),
        ("flash point (closed cup)", celsius(s.flash_point)),
        ("vapour-pressure methods", ", ".join(c.method for c in s.correlations)),
    ]
    out = [f"{label:<26} {value}" for label, value in rows]
    out.append("\nSources:")
    out += [f"  {group}: {source}" for group, source in s.sources.items()]
    return "\n".join(out)


DEMO_LIQUIDS = ("acetone", "toluene", "n-hexane", "methanol", "water")
DEMO_TEMPERATURES_C = (0.0, 20.0, 35.0, 50.0)


def _cmd_demo(args) -> int:
    from .vapor import vapor_pressure_estimate

    print("ullage demo: saturated vapour pressure of common liquids [kPa]\n")
    header = f"{'liquid':<12}" + "".join(f"{t:>10.0f} C" for t in DEMO_TEMPERATURES_C)
    print(header + "   method (stated uncertainty)")
    for key in DEMO_LIQUIDS:
        estimate = vapor_pressure_estimate(key, [t + 273.15 for t in DEMO_TEMPERATURES_C])
        cells = "".join(f"{p / 1000:12.3g}" for p in estimate.pressure)
        unc = ("not validated" if estimate.relative_uncertainty is None
               else f"±{100 * estimate.relative_uncertainty:.1f} %")
        print(f"{key:<12}{cells}   {estimate.method} ({unc})")
    return EXIT_OK


def build_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="ullage",
        description="Screening estimates of vapour hazards: vapour pressure, tank "
                    "headspace, spill evaporation and air concentration, compared "
                    "with the limits you enter.",
        epilog="Every result is a screening estimate; measure before entry.",
    )
    parser.add_argument("--version", action="version", version=f"ullage {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND")

    p = sub.add_parser("substances", help="list the bundled substances or show one",
                       description="List the bundled substances, or show one in full "
                                   "by name, synonym or CAS number.")
    p.add_argument("text", nargs="?", help="name, synonym, CAS number or part of one")
    p.set_defaults(func=_cmd_substances, cautions=False)

    p = sub.add_parser("demo", help="run a built-in example",
                       description="Run a built-in example and print its results.")
    p.set_defaults(func=_cmd_demo, cautions=True)
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
        code = args.func(args)
    except UllageError as exc:
        print(f"ullage: error: {exc}", file=sys.stderr)
        return EXIT_BAD_INPUT
    except KeyboardInterrupt:
        print("ullage: interrupted", file=sys.stderr)
        return 130
    if args.cautions:
        print(_cautions_block())
    return code


if __name__ == "__main__":
    sys.exit(main())
