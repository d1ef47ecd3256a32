"""Mark-ups a checker made in any PDF reader, read back and tied to the checks they sit on.

The built package carries, for every check, a named destination where the check starts
(``chk-<id>``) and one where it ends (``chkend-<id>``), written by the LaTeX template
(``\\calcmark``). An annotation (sticky note, highlight, text box, shape, ink) on sheet ``n`` at
height ``y`` belongs to the check whose start lies above it and whose end lies below it, in
reading order; anything else belongs to the sheet. Each imported mark-up gets a key made from
its sheet, kind, position and text, so the same mark-up is never imported twice.

Read with pypdf (a well-kept pure-Python PDF library); nothing is written to the PDF.
"""

from __future__ import annotations

import hashlib
import os
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from ..core.errors import InputError

#: annotation kinds that are mark-ups (links, form widgets and pop-up windows are not)
MARKUP_KINDS = ("/Text", "/Highlight", "/FreeText", "/Underline", "/StrikeOut", "/Squiggly", "/Square",
                "/Circle", "/Line", "/Polygon", "/PolyLine", "/Ink", "/Stamp", "/Caret")
#: a mark-up up to this far above a check's start (its heading line) still belongs to the check, pt
HEADING_ROOM_PT = 24.0
START, END = "chk-", "chkend-"


@dataclass(frozen=True)
class Markup:
    sheet: int                 # 1-based page number
    kind: str                  # Text, Highlight, ...
    rect: tuple[float, float, float, float]
    text: str                  # the note's text (with the highlighted words, for text mark-ups)
    author: str
    key: str
    check_id: str | None       # the check it sits on, or None (then: the sheet)

    @property
    def target(self) -> dict[str, Any]:
        return {"kind": "check", "id": self.check_id} if self.check_id else {"kind": "sheet", "sheet": self.sheet}


def anchor_name(check_id: str, end: bool = False) -> str:
    """The named destination the template writes for a check id (``[A-Za-z0-9_.:-]`` only)."""
    safe = "".join(ch if ch.isascii() and (ch.isalnum() or ch in "_.:-") else "-" for ch in check_id)
    return (END if end else START) + safe


def _text_in(page: Any, rect: tuple[float, float, float, float]) -> str:
    """Words printed inside ``rect`` on ``page`` (for highlights), best effort."""
    x0, y0, x1, y1 = rect
    words: list[str] = []

    def visit(text: str, cm: list, tm: list, _font: Any = None, size: Any = 10.0) -> None:
        if not text.strip():
            return
        x, y = tm[4], tm[5]
        px = cm[0] * x + cm[2] * y + cm[4]
        py = cm[1] * x + cm[3] * y + cm[5]
        # a text run starts at (px, py); its width is estimated at half an em a character
        width = len(text) * 0.5 * float(size or 10.0) * abs(tm[0] * cm[0] or 1.0)
        if px <= x1 + 2 and px + width >= x0 - 2 and y0 - 4 <= py <= y1 + 2:
            words.append(text.strip())

    try:
        page.extract_text(visitor_text=visit)
    except Exception:   # noqa: BLE001 - the highlighted words are a courtesy; the mark-up stands without them
        return ""
    return " ".join(words)[:300]


def _anchors(reader: Any) -> list[tuple[int, float, str, bool]]:
    """(page index, top, check id, is_end) for every check destination, in reading order.

    Walks the document's /Dests name tree directly and keeps only the check destinations (a
    package has several hundred other destinations: sections, pages, figures).
    """
    page_of = {p.indirect_reference.idnum: i for i, p in enumerate(reader.pages) if p.indirect_reference}
    try:
        tree = reader.trailer["/Root"]["/Names"]["/Dests"]
    except (KeyError, TypeError):
        return []
    out: list[tuple[int, float, str, bool]] = []
    stack, seen = [tree], set()
    while stack:
        node = stack.pop().get_object()
        if id(node) in seen or len(seen) > 100_000:
            continue
        seen.add(id(node))
        stack.extend(node.get("/Kids") or [])
        arr = node.get("/Names") or []
        for i in range(0, len(arr) - 1, 2):
            name = str(arr[i])
            end = name.startswith(END)
            if not (end or name.startswith(START)):
                continue
            try:
                dest = arr[i + 1].get_object()
                if hasattr(dest, "get") and "/D" in dest:
                    dest = dest["/D"].get_object()
                page = page_of.get(dest[0].idnum)
                top = float(dest[3]) if len(dest) > 3 and dest[3] is not None else 0.0
            except (AttributeError, IndexError, KeyError, TypeError, ValueError):
                continue
            if page is not None:
                out.append((page, top, name[len(END if end else START):], end))
    out.sort(key=lambda a: (a[0], -a[1], a[3]))
    return out


def _owner(anchors: list[tuple[int, float, str, bool]], page: int, y: float) -> str | None:
    """The check whose [start, end] span contains (page, y) in reading order."""
    pos = (page, -(y - HEADING_ROOM_PT))   # a mark-up on the heading line counts for its check
    current: str | None = None
    for a_page, a_top, cid, is_end in anchors:
        if (a_page, -a_top) > pos:
            break
        current = None if is_end else cid
    if current is not None:
        return current
    # a mark-up in the heading room of a check that starts just below it
    for a_page, a_top, cid, is_end in anchors:
        if not is_end and a_page == page and 0.0 <= y - a_top <= HEADING_ROOM_PT:
            return cid
    return None


def read_markups(pdf: str | os.PathLike, check_ids: dict[str, str] | None = None) -> list[Markup]:
    """Every mark-up in ``pdf`` with the check (or sheet) it sits on.

    ``check_ids`` maps anchor-safe ids back to the package's check ids (see :func:`anchor_name`).
    """
    from pypdf import PdfReader
    from pypdf.errors import PdfReadError

    import logging

    logging.getLogger("pypdf").setLevel(logging.ERROR)   # its warnings are not the one-line error below
    path = Path(pdf)
    try:
        reader = PdfReader(str(path))
        pages = list(reader.pages)
        anchors = _anchors(reader)
    except (OSError, PdfReadError, ValueError, KeyError, RecursionError) as err:
        raise InputError("ANNOTATED_PDF", str(path), "a readable PDF", str(err).splitlines()[0][:120]) from None
    back = check_ids or {}
    out: list[Markup] = []
    for i, page in enumerate(pages):
        annots = page.get("/Annots") or []
        for ref in annots:
            try:
                a = ref.get_object()
                kind = str(a.get("/Subtype", ""))
                if kind not in MARKUP_KINDS:
                    continue
                rect = tuple(float(v) for v in a.get("/Rect", (0, 0, 0, 0)))
            except Exception:   # noqa: BLE001 - a damaged annotation is skipped, the rest still import
                continue
            if len(rect) != 4:
                continue
            x0, y0, x1, y1 = min(rect[0], rect[2]), min(rect[1], rect[3]), max(rect[0], rect[2]), max(rect[1], rect[3])
            note = str(a.get("/Contents") or "").strip()
            if kind in ("/Highlight", "/Underline", "/StrikeOut", "/Squiggly"):
                words = _text_in(page, (x0, y0, x1, y1))
                if words:
                    note = f"[{kind[1:].lower()}: {words}] {note}".strip()
            if not note:
                note = f"({kind[1:]} mark-up with no text)"
            author = str(a.get("/T") or "").strip()
            safe_id = _owner(anchors, i, y1)
            cid = back.get(safe_id, safe_id) if safe_id else None
            key = hashlib.sha256(f"{i}|{kind}|{x0:.0f},{y0:.0f},{x1:.0f},{y1:.0f}|{note}".encode()).hexdigest()[:24]
            out.append(Markup(sheet=i + 1, kind=kind[1:], rect=(x0, y0, x1, y1), text=note, author=author,
                              key=key, check_id=cid))
    return out


__all__ = ["MARKUP_KINDS", "Markup", "anchor_name", "read_markups"]
