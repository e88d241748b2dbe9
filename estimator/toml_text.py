"""TOML text for scenario files: one value or key at a time.

`estimator.scenario` writes whole documents with these; `estimator.sds` writes
a ``[[liquid]]`` block with the same rules.
"""

from __future__ import annotations

import math
import re

__all__ = ["toml_value", "toml_key"]


def toml_value(value) -> str:
    """One value (bool, number, text, list or table) written as TOML.

    Examples
    --------
    >>> toml_value(["a", 1.5, True])
    '["a", 1.5, true]'
    """
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, float)):
        if isinstance(value, float) and not math.isfinite(value):
            raise ValueError("cannot write a non-finite number to a scenario")
        return repr(value)
    if isinstance(value, str):
        escaped = (value.replace("\\", "\\\\").replace('"', '\\"').replace("\n", "\\n")
                   .replace("\t", "\\t").replace("\r", "\\r"))
        return f'"{escaped}"'
    if isinstance(value, list):
        return "[" + ", ".join(toml_value(v) for v in value) + "]"
    if isinstance(value, dict):
        return "{ " + ", ".join(f"{toml_key(k)} = {toml_value(v)}"
                                for k, v in value.items()) + " }"
    raise ValueError(f"cannot write {type(value).__name__} to a scenario")


def toml_key(key: str) -> str:
    """A key written bare when TOML allows it, else quoted.

    Examples
    --------
    >>> toml_key("name"), toml_key("two words")
    ('name', '"two words"')
    """
    return key if re.fullmatch(r"[A-Za-z0-9_-]+", key) else toml_value(key)
