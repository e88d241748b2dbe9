"""Files written safely: atomic replacement, no partial files left, inert spreadsheet cells.

Every file ullage writes goes to a temporary file beside the target, named
``.<target name>.ullage-partial-<process id>-<random>.tmp``, which then replaces
the target in one step (`os.replace`), so a reader never sees half a file. The
temporary file is removed on every failure, including Ctrl-C and SIGTERM during
the write; one left by a run that was killed outright (SIGKILL, power loss) is
recognised by that name and removed by the next write to the same target, once
the process that made it is gone.

Text cells of CSV files are made inert for spreadsheet programs (formula
injection, OWASP "CSV Injection"): text beginning with =, +, -, @, a tab or a
carriage return gets a leading single quote, unless it is a plain number ("-5").
"""

from __future__ import annotations

import contextlib
import os
import re
import secrets
import signal
import threading
from pathlib import Path

from .errors import InputError

__all__ = [
    "atomic_writer",
    "write_text_atomic",
    "clear_stale_partials",
    "partial_name_pattern",
    "neutralise_cell",
    "neutralise_arrow",
    "parse_size",
    "PARTIAL_MARK",
]

#: Marks the name of a temporary file ullage is writing (see the module notes).
PARTIAL_MARK = ".ullage-partial-"

_FORMULA_START = ("=", "+", "-", "@", "\t", "\r")
_PLAIN_NUMBER = re.compile(r"[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?")
_FORMULA_PATTERN = r"^[=+\-@\t\r]"
_NUMBER_PATTERN = r"^[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?$"


def partial_name_pattern(target) -> re.Pattern:
    """The names of the temporary files of writes to `target` (group 1: process id)."""
    name = Path(target).name
    return re.compile(rf"\.{re.escape(name)}{re.escape(PARTIAL_MARK)}(\d+)-[0-9a-f]{{16}}\.tmp")


def _process_alive(pid: int) -> bool:
    if pid == os.getpid():
        return True
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except (PermissionError, OSError):
        return True
    return True


def clear_stale_partials(target) -> list[Path]:
    """Remove temporary files left beside `target` by earlier writes that were killed.

    Only files named as this module names them, for this target, whose process is
    no longer running, are removed; a write in progress in another process keeps
    its file.

    Parameters
    ----------
    target : str or os.PathLike
        The file about to be written.

    Returns
    -------
    list of pathlib.Path
        The files removed.
    """
    target = Path(target)
    folder = target.parent if str(target.parent) else Path(".")
    pattern = partial_name_pattern(target)
    removed = []
    try:
        entries = list(os.scandir(folder))
    except OSError:
        return removed
    for entry in entries:
        match = pattern.fullmatch(entry.name)
        if match is None or _process_alive(int(match[1])):
            continue
        with contextlib.suppress(OSError):
            if entry.is_file(follow_symlinks=False):
                os.unlink(entry.path)
                removed.append(Path(entry.path))
    return removed


def _file_mode(target: Path) -> int:
    """Permissions for a written file: the old file's, else what a plain open gives."""
    try:
        return target.stat().st_mode & 0o777
    except OSError:
        mask = os.umask(0o022)
        os.umask(mask)
        return 0o666 & ~mask


class _Terminated(BaseException):
    """SIGTERM arrived during a write (turned into an exception so cleanup runs)."""


@contextlib.contextmanager
def _sigterm_raises():
    """While active (main thread only), SIGTERM raises `_Terminated` instead of killing."""
    if threading.current_thread() is not threading.main_thread():
        yield
        return

    def handler(signum, frame):
        raise _Terminated()

    try:
        previous = signal.signal(signal.SIGTERM, handler)
    except (ValueError, OSError):
        yield
        return
    try:
        yield
    finally:
        signal.signal(signal.SIGTERM, previous)


@contextlib.contextmanager
def atomic_writer(path, *, binary: bool = False, encoding: str = "utf-8",
                  field: str = "output"):
    """Open a temporary file beside `path`; on success it replaces `path` in one step.

    On any failure inside the block (an exception, Ctrl-C, SIGTERM) the temporary
    file is removed and the old file, if any, is left as it was. Stale temporary
    files of earlier killed writes to the same target are removed first
    (`clear_stale_partials`).

    Parameters
    ----------
    path : str or os.PathLike
        The file to write.
    binary : bool
        Yield a binary handle instead of a text handle.
    encoding : str
        Text encoding (text handles only); newlines are written as given.
    field : str
        Name of the input, for the message when the folder does not exist.

    Yields
    ------
    file object
    """
    target = Path(path)
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise InputError(field, f"the folder {str(folder)!r} does not exist; create it or "
                         "choose another place to write")
    clear_stale_partials(target)
    temporary = folder / (f".{target.name}{PARTIAL_MARK}{os.getpid()}-"
                          f"{secrets.token_hex(8)}.tmp")
    with _sigterm_raises():
        try:
            descriptor = os.open(temporary, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o600)
            try:
                handle = (os.fdopen(descriptor, "wb") if binary else
                          os.fdopen(descriptor, "w", encoding=encoding, newline=""))
            except BaseException:
                os.close(descriptor)
                raise
            with handle:
                yield handle
                handle.flush()
                os.fsync(handle.fileno())
            os.chmod(temporary, _file_mode(target))
            os.replace(temporary, target)
        except _Terminated:
            with contextlib.suppress(OSError):
                os.unlink(temporary)
            raise SystemExit(128 + signal.SIGTERM) from None
        except BaseException:
            with contextlib.suppress(OSError):
                os.unlink(temporary)
            raise


def write_text_atomic(path, text: str) -> None:
    """Write text (UTF-8) to a file so that an interruption never leaves half a file.

    See `atomic_writer`.
    """
    with atomic_writer(path) as handle:
        handle.write(text)


def neutralise_cell(value):
    """Make a text cell inert in spreadsheets (formula injection): prefix a quote.

    Text beginning with =, +, -, @, a tab or a carriage return would be run as a
    formula by spreadsheet programs (OWASP, CSV injection). Numbers, and text that
    is a plain number such as "-5", are left alone.
    """
    if (isinstance(value, str) and value.startswith(_FORMULA_START)
            and not _PLAIN_NUMBER.fullmatch(value)):
        return "'" + value
    return value


def neutralise_arrow(array):
    """`neutralise_cell` over a pyarrow string array, in Arrow compute kernels.

    Parameters
    ----------
    array : pyarrow.Array or pyarrow.ChunkedArray of strings

    Returns
    -------
    pyarrow.Array or pyarrow.ChunkedArray
    """
    import pyarrow as pa
    import pyarrow.compute as pc

    starts = pc.match_substring_regex(array, _FORMULA_PATTERN)
    if not pc.any(starts).as_py():
        return array
    risky = pc.and_(starts, pc.invert(pc.match_substring_regex(array, _NUMBER_PATTERN)))
    if not pc.any(risky).as_py():
        return array
    quote, empty = pa.scalar("'", array.type), pa.scalar("", array.type)
    return pc.if_else(risky, pc.binary_join_element_wise(quote, array, empty), array)


_SIZE = re.compile(r"\s*(\d+(?:\.\d*)?|\.\d+)\s*([a-zA-Z]*)\s*")
_SIZE_UNITS = {"b": 1, "byte": 1, "bytes": 1, "kb": 10**3, "mb": 10**6, "gb": 10**9,
               "kib": 2**10, "mib": 2**20, "gib": 2**30}


def parse_size(text, field: str = "--max-size") -> int:
    """A file size such as "500 MB", "2 GB" or "800 MiB" in bytes.

    kB, MB and GB are decimal (10^3, 10^6, 10^9 bytes); KiB, MiB and GiB binary
    (2^10, 2^20, 2^30), as IEC 80000-13 defines them. A bare number is refused:
    the unit is needed.

    Parameters
    ----------
    text : str
        The size with its unit.
    field : str
        Name of the input, for messages.

    Returns
    -------
    int
        [bytes]

    Examples
    --------
    >>> parse_size("500 MB"), parse_size("1 GiB")
    (500000000, 1073741824)
    """
    match = _SIZE.fullmatch(str(text))
    if match is None:
        raise InputError(field, f"{text!r} is not a size; write a number and a unit, for "
                         "example '500 MB' or '2 GB'")
    number, unit = float(match[1]), match[2].lower()
    if not unit:
        raise InputError(field, f"{text!r} has no unit; write it with one, for example "
                         f"'{match[1]} MB'")
    if unit not in _SIZE_UNITS:
        raise InputError(field, f"{match[2]!r} is not a unit of size; use B, kB, MB, GB "
                         "(or KiB, MiB, GiB)")
    size = int(number * _SIZE_UNITS[unit])
    if size <= 0:
        raise InputError(field, "must be above zero")
    return size
