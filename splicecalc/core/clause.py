"""Clause-level formula registry.

Every code formula in splicecalc is a plain Python function decorated with
:func:`clause`. The decorator does not wrap the function (the plain-float call
stays as fast as an ordinary function call); it only attaches a
:class:`ClauseInfo` with the citation, the unit of each argument and of the
result, and an example call used by the test-suite to prove that the same
function gives the same number on floats and, rendered by handcalcs, on
forallpeople quantities.

Rules for a clause function body (so handcalcs can render it):

* one statement per line: assignments, one-line ``if c: x = ...`` / ``else: x = ...``;
* no loops, comprehensions, lists, ``//``, comments or ``with``;
* no variable whose name contains ``def``, ``return`` or ``@``;
* end with ``return <name>``;
* dimensional constants (e.g. 235 MPa) are keyword parameters listed in ``units``;
* use ``sqrt``/``min``/``max`` (imported names), not ``math.sqrt``.

The citation format is fixed: ``EN 1993-1-8:2005, 3.6.1, Table 3.4`` —
standard with year, clause, then optional table/equation/figure parts, all
comma separated (see :data:`CITATION_RE`).
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from typing import Any, Callable

#: One citation format for the whole package.
CITATION_RE = re.compile(
    r"^(EN|BS|BS EN|UK NA to BS EN) [0-9]+(-[0-9]+)*(\+A[0-9]+)?:[0-9]{4}(\+A[0-9]+:[0-9]{4})?"
    r"(, [A-Za-z0-9().,\- ]+)?$"
)


@dataclass(frozen=True)
class ClauseInfo:
    """Metadata of one clause-level formula."""

    citation: str
    units: dict[str, str]
    returns: str
    example: dict[str, Any] = field(default_factory=dict)


#: every decorated formula, in import order
REGISTRY: list[Callable] = []


def clause(citation: str, *, units: dict[str, str] | None = None, returns: str = "",
           example: dict[str, Any] | None = None) -> Callable[[Callable], Callable]:
    """Attach citation and unit metadata to a formula function (no wrapping)."""
    if not CITATION_RE.match(citation):
        raise ValueError(f"citation {citation!r} does not follow the format "
                         "'EN 1993-1-8:2005, 3.6.1, Table 3.4'")

    def deco(fn: Callable) -> Callable:
        fn.__clause__ = ClauseInfo(citation, dict(units or {}), returns, dict(example or {}))
        REGISTRY.append(fn)
        return fn

    return deco


def citation_of(fn: Callable) -> str:
    """The citation string of a decorated formula."""
    return fn.__clause__.citation
