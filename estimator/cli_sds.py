"""`ullage sds FILE`: what a safety data sheet says, its screened liquid and its cross-check."""

from __future__ import annotations

import sys


def add_parser(sub) -> None:
    """Add the ``sds`` command to the `ullage` subcommands."""
    p = sub.add_parser("sds", help="read a safety data sheet (.txt or .pdf)",
                       description="Read a safety data sheet: ingredients with their "
                                   "ranges, unidentified shares, section-9 properties and "
                                   "notes; the liquid at the midpoints and at the worst "
                                   "case within the ranges; and the sheet's vapour "
                                   "pressure and flash point checked against its "
                                   "composition. With -o, write the [[liquid]] block for a "
                                   "scenario file.")
    p.add_argument("file", help="the sheet, .txt (UTF-8) or .pdf with a text layer")
    p.add_argument("--output", "-o", help="write the [[liquid]] block to this .toml file")
    p.add_argument("--name", help="name of the liquid in the block (default: the product)")
    p.add_argument("--point", choices=["mid", "worst"], default="mid",
                   help="composition the block asks for (default mid)")
    p.add_argument("--surrogate", default="inert",
                   help="substance standing in for unidentified shares (default: inert)")
    p.add_argument("--temperature", default="25 degC",
                   help="screening temperature of the worst case (default 25 degC)")
    p.set_defaults(func=command)


def command(args) -> int:
    from .cli_common import EXIT_OK, BadInput, cautions_block
    from .errors import UllageError
    from .headspace import headspace
    from .files import write_text_atomic
    from .sds import read_sds
    from .units import parse_temperature

    if args.output and not args.output.lower().endswith(".toml"):
        raise BadInput("--output", f"{args.output!r}: the [[liquid]] block goes in a .toml "
                        "file")
    temperature = parse_temperature(args.temperature, "--temperature")
    reading = read_sds(args.file)
    treat = args.surrogate
    if treat != "inert":
        from .substances import substance

        treat = substance(treat, "--surrogate")
    out = [reading.summary(), ""]
    try:
        for point in ("mid", "worst"):
            chosen = reading.screen(point, unidentified=treat, temperature=temperature)
            hs = headspace(chosen.liquid, temperature)
            label = "Midpoints" if point == "mid" else "Worst case within the ranges"
            out.append(f"{label} ({chosen.basis} %), headspace at "
                       f"{temperature - 273.15:.1f} °C: {hs.total_ppm:,.0f} ppm, "
                       f"{float(hs.percent_lfl):.3g} % LFL")
            for item, value in chosen.fractions.items():
                out.append(f"  {item:<46} {100 * value:6.3g} %")
        out += ["", "Checked against the sheet:"]
        checks = reading.cross_check(unidentified=treat)
        out += [f"  - {ck.statement}" for ck in checks] or [
            "  - the sheet gives no vapour pressure or flash point to check"]
        notes = reading.screen("mid", unidentified=treat).notes
        out += ["", "Treatment of the composition:"] + [f"  - {n}" for n in notes]
    except UllageError as exc:
        out += [f"The liquid could not be screened: {exc}. What was read is shown above; "
                "correct the composition or pick a surrogate (--surrogate)."]
    sys.stdout.write("\n".join(out) + "\n" + cautions_block() + "\n")
    if args.output:
        write_text_atomic(args.output, reading.to_toml(args.name, point=args.point,
                                                       unidentified=treat))
        print(f"wrote {args.output}", file=sys.stderr)
    return EXIT_OK
