"""What every ``ullage`` subcommand shares: exit statuses, the cautions block and
the error for an argument that cannot be used."""

from __future__ import annotations

import textwrap

from ._meta import CAUTIONS
from .errors import InputError

__all__ = ["EXIT_OK", "EXIT_LIMIT", "EXIT_BAD_INPUT", "cautions_block", "BadInput"]

EXIT_OK = 0
EXIT_LIMIT = 1
EXIT_BAD_INPUT = 2

def cautions_block() -> str:
    """The cautions as an indented block for the end of a command's output."""
    lines = ["", "Cautions:"]
    for caution in CAUTIONS:
        lines.append(textwrap.fill(caution, width=78, initial_indent="  - ",
                                   subsequent_indent="    "))
    return "\n".join(lines)


class BadInput(InputError):
    """A command-line argument that cannot be used."""
