"""Make handcalcs equations fit the page, and read the LaTeX log.

handcalcs writes every rendered step as one row of an ``aligned`` block,

    lhs &= symbolic = numeric &= result          (short form)
    lhs &= symbolic \\ &= numeric \\ &= result   (long form)

inside ``$$ ... $$`` (or ``\\[ ... \\]`` once pandoc has seen it). A single
``aligned`` block cannot break across pages and a long row runs into the
margin. :func:`break_handcalcs` rewrites each block into one ``calcsteps``
environment (an ``align*`` defined by our LaTeX template, with page
breaks allowed between steps); the symbolic form, the numeric substitution
and the result of each step share a row as far as they fit the page
(:func:`shown_width` estimates the printed width), rows of a step kept together.
``\\calclhs`` measures the left-hand sides first; each row then goes through
``\\calcfit``, which scales it down only when it is still wider than the
space right of the equals sign (a last resort, for very long substitutions).

A block whose shape is not recognised is kept whole in ``\\calcfitblock``
(scaled to the line width if it is too wide), so nothing is ever lost.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

#: ``$$ \begin{aligned} ... \end{aligned} $$`` or ``\[ ... \]`` around it
_BLOCK_RE = re.compile(
    r"(?:\$\$|\\\[)\s*\\begin\{aligned\}(?P<body>.*?)\\end\{aligned\}\s*(?:\$\$|\\\])",
    re.S,
)
_ROWSEP_RE = re.compile(r"\\\\(?:\s*\[[^\]]*\])?")


_TOKENS: dict[str, re.Pattern] = {}
#: what changes the brace depth or is skipped whole: an escape (``\\x``, including ``\\{``) or a brace
_BRACES_RE = re.compile(r"\\.|[{}]", re.S)


def _split_top(text: str, sep: str) -> list[str]:
    """Split ``text`` on ``sep`` at brace depth 0 (``\\{`` escapes ignored); ``sep`` has no backslash or brace.

    Scans only the characters that matter (escapes, braces, ``sep``) with one regular
    expression instead of a Python loop over every character.
    """
    tok = _TOKENS.get(sep)
    if tok is None:
        tok = _TOKENS[sep] = re.compile(r"\\.|[{}]|" + re.escape(sep), re.S)
    parts: list[str] = []
    depth = 0
    start = 0
    for m in tok.finditer(text):
        t = m.group()
        if t == "{":
            depth += 1
        elif t == "}":
            depth -= 1
        elif t == sep and depth == 0:
            parts.append(text[start:m.start()])
            start = m.end()
    parts.append(text[start:])
    return parts


def _rows(body: str) -> list[str]:
    """Rows of an aligned body, split at top-level ``\\\\`` (with optional ``[dim]``)."""
    rows: list[str] = []
    depth = 0
    start = 0
    pos = 0
    while True:
        m = _BRACES_RE.search(body, pos)
        if m is None:
            break
        t = m.group()
        if t == "{":
            depth += 1
        elif t == "}":
            depth -= 1
        elif t == "\\\\" and depth == 0:
            rows.append(body[start:m.start()])
            sep = _ROWSEP_RE.match(body, m.start())
            pos = start = sep.end() if sep else m.end()
            continue
        pos = m.end()
    rows.append(body[start:])
    return [r.strip() for r in rows if r.strip()]


def _clean(s: str) -> str:
    s = s.strip()
    while s.endswith("\\;"):
        s = s[:-2].rstrip()
    return s


class _Unrecognised(Exception):
    pass


def _steps(body: str) -> list[tuple[str, list[str]]]:
    """Group rows into steps: (lhs, [rhs pieces]) or ("", [text]) for prose rows."""
    steps: list[tuple[str, list[str]]] = []
    if "\\begin" in body:
        raise _Unrecognised(body)
    for row in _rows(body):
        cells = [_clean(c) for c in _split_top(row, "&")]
        if len(cells) == 1:
            cells = ["", cells[0]]
        if len(cells) > 3:
            raise _Unrecognised(row)
        lhs = cells[0]
        rhs = [c for c in cells[1:] if c]
        pieces: list[str] = []
        for c in rhs:
            if c.startswith("\\text"):
                pieces.append(c)
                continue
            if c.startswith("="):
                c = c[1:].strip()
            elif not lhs and steps and pieces == [] and not c.startswith("\\text"):
                raise _Unrecognised(row)
            pieces.extend(p.strip() for p in _split_top(c, " = ") if p.strip())
        if not pieces:
            continue
        if lhs:
            steps.append((lhs, pieces))
        elif pieces[0].startswith("\\text"):
            steps.append(("", pieces))
        elif steps and steps[-1][0]:
            steps[-1][1].extend(pieces)
        else:
            raise _Unrecognised(row)
    return steps


#: the room right of the equals sign, in em of the steps' font (\small, 9 pt): the text width 174 mm
#: less \mathindent 6 mm and 3 em (the template's calcsteps) is 449 pt = 49.9 em; the left-hand side comes
#: off it. Keep in step with the template's geometry.
RHS_ROOM_EM = 49.9
#: a row is filled to this share of its room: :func:`shown_width` is within -20 % / +23 % of the width
#: XeTeX sets (measured on the demo's 583 distinct pieces, median 0.96), and ``\\calcfit`` scales a row
#: that is still too wide
ROW_FILL = 0.95
#: width of `` = `` between two pieces (a relation with its spaces), em
_EQ_EM = 1.34

_TEX_TOK = re.compile(r"\\[A-Za-z]+|\\.|[{}^_]|\s+|.", re.S)
#: em widths of glyphs and commands at text size (Latin Modern, binary operators and relations with
#: their math spaces)
_GLYPH_EM = {
    "\\cdot": 0.72, "+": 1.22, "-": 1.22, "\\times": 1.22, "\\pm": 1.22, "=": 1.34, "\\leq": 1.34,
    "\\geq": 1.34, "<": 1.34, ">": 1.34, "\\lt": 1.34, "\\gt": 1.34, "\\rightarrow": 1.56, "\\to": 1.56,
    "\\ ": 0.33, "\\,": 0.17, "\\;": 0.28, "\\:": 0.22, "\\quad": 1.0, "\\qquad": 2.0,
    ",": 0.28, ".": 0.28, ";": 0.28, ":": 0.28, "(": 0.39, ")": 0.39, "[": 0.28, "]": 0.28,
    "|": 0.28, "/": 0.5, "!": 0.28, "'": 0.28,
}
_WRAPPERS = ("\\mathrm", "\\operatorname", "\\text", "\\mathit", "\\textrm", "\\mathbf")


def _argument(toks: list[str], i: int) -> tuple[list[str], int]:
    """The argument starting at ``toks[i]`` (a braced group or one token) and the index after it."""
    while i < len(toks) and toks[i].isspace():
        i += 1
    if i >= len(toks):
        return [], i
    if toks[i] != "{":
        return [toks[i]], i + 1
    depth, j = 1, i + 1
    while j < len(toks) and depth:
        depth += {"{": 1, "}": -1}.get(toks[j], 0)
        j += 1
    return toks[i + 1:j - 1], j


def _width_em(toks: list[str]) -> float:
    w, i = 0.0, 0
    while i < len(toks):
        t = toks[i]
        if t == "{":
            group, i = _argument(toks, i)
            w += _width_em(group)
        elif t.isspace() or t == "}" or t in ("\\displaystyle", "\\limits", "\\nolimits"):
            i += 1
        elif t == "\\frac":                       # stacked: the wider of numerator and denominator
            a, i = _argument(toks, i + 1)
            b, i = _argument(toks, i)
            w += max(_width_em(a), _width_em(b)) + 0.25
        elif t == "\\sqrt":
            a, i = _argument(toks, i + 1)
            w += _width_em(a) + 0.9
        elif t in ("^", "_"):                     # scripts at about 70 %; a sub- and superscript share room
            a, i = _argument(toks, i + 1)
            s = 0.72 * _width_em(a)
            if i < len(toks) and toks[i] in ("^", "_"):
                b, i = _argument(toks, i + 1)
                s = max(s, 0.72 * _width_em(b))
            w += s + 0.05
        elif t in _WRAPPERS:
            a, i = _argument(toks, i + 1)
            w += _width_em(a) + (0.17 if t == "\\operatorname" else 0.0)
        elif t in ("\\left", "\\right"):
            _, i = _argument(toks, i + 1)
            w += 0.8
        else:
            w += _GLYPH_EM.get(t, 0.6 if t.startswith("\\") and len(t) > 2 else
                               0.5 if t.isdigit() else 0.72 if t.isupper() else 0.52)
            i += 1
    return w


def shown_width(piece: str) -> float:
    """Estimated printed width of a LaTeX math piece in display style, in em (fractions stacked,
    scripts smaller, operators with their spaces)."""
    return _width_em(_TEX_TOK.findall(piece))


def _pack(pieces: list[str], room: float) -> list[list[str]]:
    """The pieces of one step (symbolic, numbers, result ...) in as few rows as fit ``room`` em.

    One row when everything fits; else the formula alone and the rest (numbers = result) on the next
    row when that fits; else row by row, each piece joined to the row before while it fits.
    """
    def wide(row: list[str]) -> float:
        return sum(shown_width(p) for p in row) + _EQ_EM * (len(row) - 1)

    if wide(pieces) <= room:
        return [pieces]
    if len(pieces) > 2 and wide(pieces[1:]) <= room:
        return [pieces[:1], pieces[1:]]
    rows: list[list[str]] = [[pieces[0]]]
    for p in pieces[1:]:
        if wide(rows[-1] + [p]) <= room:
            rows[-1].append(p)
        else:
            rows.append([p])
    return rows


def _format_steps(steps: list[tuple[str, list[str]]]) -> str:
    """One ``calcsteps`` (align*) per block; the pieces of a step packed into as few rows as fit
    (:func:`_pack`), rows of a step kept together (``\\*``)."""
    measure = "".join(f"\\calclhs{{{lhs}}}" for lhs, _ in steps if lhs)
    room = ROW_FILL * (RHS_ROOM_EM - max((shown_width(lhs) for lhs, _ in steps if lhs), default=0.0))
    blocks: list[str] = []
    for lhs, pieces in steps:
        if not lhs:
            blocks.append("&\\calcfit{" + " ".join(pieces) + "}")
            continue
        rows = [" = ".join(r) for r in _pack(pieces, room)]
        lines = [f"{lhs} &= \\calcfit{{{rows[0]}}}"] + [f"&= \\calcfit{{{r}}}" for r in rows[1:]]
        blocks.append(" \\\\*\n".join(lines))
    body = " \\\\[0.6ex]\n".join(blocks)
    return "\\calclhsreset" + measure + "\n\\begin{calcsteps}\n" + body + "\n\\end{calcsteps}"


def break_handcalcs(tex: str) -> str:
    """Rewrite every handcalcs ``aligned`` display in ``tex`` into page-breakable ``calcstep`` rows."""

    def repl(m: re.Match) -> str:
        body = m.group("body")
        try:
            steps = _steps(body)
        except _Unrecognised:
            return "\\calcfitblock{\\begin{aligned}" + body + "\\end{aligned}}"
        if not steps:
            return ""
        return "\n" + _format_steps(steps) + "\n"

    return _BLOCK_RE.sub(repl, tex)


# ----------------------------------------------------------------------- log
@dataclass(frozen=True)
class BadBox:
    """One ``Overfull``/``Underfull`` box warning from a LaTeX log."""

    kind: str          # "hbox" or "vbox"
    amount_pt: float   # how much too wide (hbox) or too high (vbox), pt
    where: str         # "in paragraph at lines 120--121" / "detected at line 88"

    def __str__(self) -> str:
        return f"Overfull \\{self.kind} ({self.amount_pt:.2f}pt too {'wide' if self.kind == 'hbox' else 'high'}) {self.where}"


_OVERFULL_RE = re.compile(r"^Overfull \\(hbox|vbox) \((\d+(?:\.\d+)?)pt too (?:wide|high)\) ?(.*)$", re.M)


_MISSING_RE = re.compile(r"^Missing character: There is no (.+?) \(U\+([0-9A-F]{4,6})\) in font", re.M)


def missing_characters(log_text: str) -> list[str]:
    """Characters XeTeX left out because the font has no glyph for them (``X (U+XXXX)``), each once."""
    seen: dict[str, None] = {}
    for m in _MISSING_RE.finditer(log_text):
        seen.setdefault(f"{m.group(1)} (U+{m.group(2)})", None)
    return list(seen)


def overfull_boxes(log_text: str) -> list[BadBox]:
    """All overfull boxes reported in a LaTeX log."""
    return [BadBox(m.group(1), float(m.group(2)), m.group(3).strip())
            for m in _OVERFULL_RE.finditer(log_text)]


_RERUN_RE = re.compile(r"(Rerun to get|Label\(s\) may have changed|rerunfilecheck.*has changed|"
                       r"There were undefined references)", re.I)


def needs_rerun(log_text: str) -> bool:
    """True when the log asks for another LaTeX pass (labels, page total, contents)."""
    return bool(_RERUN_RE.search(log_text))


_ERROR_RE = re.compile(r"^(?:! |\S+\.tex:\d+: )(.*)$", re.M)


def first_error(log_text: str) -> str:
    """The first ``! ...`` error of a LaTeX log with its ``l.<n>`` context line, or ''."""
    m = _ERROR_RE.search(log_text)
    if not m:
        return ""
    tail = log_text[m.end(): m.end() + 600]
    head = re.match(r"^\S+\.tex:(\d+): ", m.group(0))
    if head:
        return f"{m.group(1)} (line {head.group(1)})"
    ctx = re.search(r"^l\.(\d+) (.*)$", tail, re.M)
    return m.group(1) + (f" (line {ctx.group(1)}: {ctx.group(2).strip()[:80]})" if ctx else "")
