"""Searching the section catalogue for the form's section picker (no widgets here)."""

from __future__ import annotations

from functools import lru_cache

from ..sections import list_sections


@lru_cache(maxsize=1)
def _catalogue() -> tuple[tuple[str, str, str], ...]:
    """(designation, family, search key) of every catalogue section, in catalogue order."""
    return tuple((s.designation, s.family, (s.designation + " " + s.family).lower().replace(" ", ""))
                 for s in list_sections())


def filter_sections(text: str = "", families: tuple[str, ...] | list[str] | None = None,
                    limit: int | None = None) -> list[str]:
    """Designations whose name contains every word of ``text`` (case and spaces ignored).

    ``families`` restricts to those families (None: all). ``"457 UKB"`` finds the
    457x191 UKBs, ``"ipe 3"`` finds IPE 300 and IPE 330.
    """
    words = [w.lower() for w in (text or "").replace(",", " ").split()]
    fams = None if families is None else {f.upper() for f in families}
    out = []
    for name, fam, key in _catalogue():
        if fams is not None and fam not in fams:
            continue
        if all(w in key for w in words):
            out.append(name)
            if limit is not None and len(out) >= limit:
                break
    return out


__all__ = ["filter_sections"]
