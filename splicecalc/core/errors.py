"""Errors raised for bad input: always name the field, the value and what is allowed."""

from __future__ import annotations

import math
from typing import Any


def one_line(text: Any) -> str:
    """``text`` with every control character (newline, tab, escape ...) written as its escape, so a
    message built from a job's own keys and values stays one printable line."""
    s = str(text)
    if s.isprintable():
        return s
    return "".join(ch if ch.isprintable() else ch.encode("unicode_escape").decode("ascii") for ch in s)


class InputError(ValueError):
    """Bad user input. ``str(err)`` is a one-line message fit for the CLI (field names and hints may
    come from the job file itself: they are made printable here, once)."""

    def __init__(self, field: str, value: Any, allowed: str, hint: str = "") -> None:
        self.field = field
        self.value = value
        self.allowed = allowed
        self.hint = hint
        f = one_line(field)
        msg = (f"{f} is not given: write {one_line(allowed)}" if value is None
               else f"{f} = {one_line(repr(value))} is not allowed: expected {one_line(allowed)}")
        if hint:
            msg += f". {one_line(hint)}"
        super().__init__(msg)


def require_finite(field: str, value: Any) -> float:
    """Return ``value`` as float, or raise if it is not a finite real number."""
    if isinstance(value, bool):
        raise InputError(field, value, "a finite number")
    if type(value).__name__ == "Physical":
        # float() of a forallpeople quantity is its *displayed* number (kN, mm...), not SI:
        # refuse rather than silently read it in the wrong unit.
        raise InputError(field, value, "a plain float in the documented unit",
                         "Convert quantities with splicecalc.core.units.to_float(q, unit)")
    try:
        x = float(value)
    except (TypeError, ValueError):
        raise InputError(field, value, "a finite number") from None
    if not math.isfinite(x):
        raise InputError(field, value, "a finite number")
    return x


def require_positive(field: str, value: Any, unit: str = "") -> float:
    """Finite and > 0."""
    x = require_finite(field, value)
    if x <= 0.0:
        raise InputError(field, value, f"a finite number > 0{(' ' + unit) if unit else ''}")
    return x


def require_non_negative(field: str, value: Any, unit: str = "") -> float:
    """Finite and >= 0."""
    x = require_finite(field, value)
    if x < 0.0:
        raise InputError(field, value, f"a finite number >= 0{(' ' + unit) if unit else ''}")
    return x


def require_in_range(field: str, value: Any, lo: float, hi: float, unit: str = "") -> float:
    """Finite and lo <= value <= hi."""
    x = require_finite(field, value)
    if not (lo <= x <= hi):
        u = f" {unit}" if unit else ""
        raise InputError(field, value, f"a number from {lo:g}{u} to {hi:g}{u}")
    return x


def require_choice(field: str, value: Any, choices: list | tuple | dict) -> Any:
    """One of ``choices``."""
    if value not in choices:
        raise InputError(field, value, "one of " + ", ".join(repr(c) for c in choices))
    return value


def require_count(field: str, value: Any, minimum: int = 1) -> int:
    """A whole number >= minimum (counts of bolts, planes, holes)."""
    x = require_non_negative(field, value)
    if x < minimum or not float(x).is_integer():
        raise InputError(field, value, f"a whole number >= {minimum}")
    return int(x)


# ---------------------------------------------------------------- file-system failures
def file_error_message(err: OSError, action: str = "write to") -> str:
    """One line for a failed file operation: the path and what to do about it."""
    import errno

    path = err.filename or "(a file)"
    if err.filename2:
        path = f"{path} -> {err.filename2}"
    what = {
        errno.EACCES: "no permission: choose a folder you can write to, or change its permissions",
        errno.EPERM: "not permitted: choose a folder you can write to, or change its permissions",
        errno.EROFS: "the file system is read-only: write to another folder (e.g. -o ~/calcs/NAME.pdf)",
        errno.ENOSPC: "the disk is full: free some space or write to another disk, then run it again",
        errno.EDQUOT: "the disk quota is used up: free some space or write elsewhere, then run it again",
        errno.ENOENT: "no such file or folder: check the path (create the folder first)",
        errno.ENOTDIR: "a part of the path is a file, not a folder: check the path",
        errno.EISDIR: "that is a folder, not a file: give a file name",
        errno.EEXIST: "it exists already: choose another name",
        errno.ENAMETOOLONG: "the name is too long: choose a shorter path",
        errno.EMFILE: "too many open files: close other programs and run it again",
    }.get(err.errno or -1, "check the path, the permissions and the free disk space")
    return f"cannot {action} {path}: {err.strerror or err} ({what}); nothing was left half-written"


__all__ = ["InputError", "require_finite", "require_positive", "require_non_negative", "require_in_range",
           "require_choice", "require_count", "file_error_message"]


#: exit code of run / build / demo / batch when nothing exceeds capacity but some checks are NOT
#: CHECKED (a gap is not a pass); 0 every check within capacity, 1 one exceeds it, 2 bad input
EXIT_NOT_CHECKED = 3
