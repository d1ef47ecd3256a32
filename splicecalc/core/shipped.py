"""Folders shipped with splicecalc: the calc templates and the example job files.

The repository keeps them at its top level (``templates/``, ``examples/``: their
source). A wheel carries copies inside the package (``splicecalc/templates``,
``splicecalc/examples``; see ``setup.py``), found here through
:mod:`importlib.resources`, so an installed splicecalc works from any folder.
A source checkout or an editable install has no copies inside the package and
uses the repository's folders.
"""

from __future__ import annotations

from functools import lru_cache
from importlib.resources import files
from pathlib import Path

#: the folders shipped as package data
SHIPPED: tuple[str, ...] = ("templates", "examples")


@lru_cache(maxsize=None)
def shipped_dir(name: str) -> Path:
    """The folder ``name`` (``"templates"`` or ``"examples"``): inside the installed package when the
    wheel shipped it there, otherwise the repository's top-level folder."""
    if name not in SHIPPED:
        raise ValueError(f"shipped folder {name!r}: expected one of {', '.join(SHIPPED)}")
    inside = files("splicecalc") / name
    if isinstance(inside, Path) and inside.is_dir():
        return inside
    return Path(__file__).resolve().parents[2] / name


__all__ = ["SHIPPED", "shipped_dir"]
