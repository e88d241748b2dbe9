"""Errors and warnings that ullage raises, each naming the input at fault."""

from __future__ import annotations

import difflib
from collections.abc import Iterable

__all__ = [
    "UllageError",
    "InputError",
    "UnknownSubstanceError",
    "OutOfRangeError",
    "UllageWarning",
    "ExtrapolationWarning",
    "suggest",
]


class UllageError(Exception):
    """Base class of every error ullage raises on purpose."""


class InputError(UllageError, ValueError):
    """An input value that cannot be used.

    Parameters
    ----------
    field : str
        The name of the input at fault, as the user knows it.
    message : str
        What is wrong and what to do about it.
    """

    def __init__(self, field: str, message: str):
        self.field = field
        self.reason = message
        super().__init__(f"{field}: {message}")


class UnknownSubstanceError(InputError):
    """A substance key that matches no name, synonym or CAS number."""

    def __init__(self, field: str, key: str, suggestions: Iterable[str] = (),
                 reason: str | None = None, hint: str | None = None):
        self.key = key
        self.suggestions = tuple(suggestions)
        hint = hint or (
            "did you mean " + ", ".join(repr(s) for s in self.suggestions) + "?"
            if self.suggestions
            else "run `ullage substances` to list what is known, or define the "
            "substance from its safety data sheet"
        )
        super().__init__(field, f"{reason or f'no substance is known as {key!r}'}; {hint}")


class OutOfRangeError(InputError):
    """A value outside the range where the model or physics applies."""


class UllageWarning(UserWarning):
    """A result that was computed but needs the user's attention."""


class ExtrapolationWarning(UllageWarning):
    """A correlation used outside the range it was fitted on."""


def suggest(word: str, candidates: Iterable[str], n: int = 3) -> list[str]:
    """Close matches of `word` among `candidates`, best first."""
    pool = list(candidates)
    lowered = {c.lower(): c for c in pool}
    hits = difflib.get_close_matches(word.lower(), list(lowered), n=n, cutoff=0.6)
    return [lowered[h] for h in hits]
