"""Make handcalcs equations fit the page, and read the LaTeX log.

handcalcs writes every rendered step as one row of an ``aligned`` block,

    lhs &= symbolic = numeric &= result          (short form)
    lhs &= symbolic \\ &= numeric \\ &= result   (long form)

inside ``$$ ... $$`` (or ``\\[ ... \\]`` once pandoc has seen it). A single
``aligned`` block cannot break across pages and a long row runs into the
margin. :func:`break_handcalcs` rewrites each block into one ``calcsteps``
environment (an ``align*`` defined by our LaTeX template, with page
breaks allowed between steps) with the symbolic form, the numeric
substitution and the result of each step on separate rows kept together.
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


#: a step whose pieces print in fewer characters than this is set on one line (about half the text width)
ONE_LINE_CHARS = 44
_CMD_RE = re.compile(r"\\(mathrm|operatorname|left|right|text|mathit|displaystyle)\b|\\[,;: ]|[{}^_ ]")
_SYM_RE = re.compile(r"\\[A-Za-z]+")


def shown_chars(piece: str) -> int:
    """Rough count of the characters a LaTeX math piece prints (commands and braces not counted,
    a symbol command counted as one)."""
    return len(_SYM_RE.sub("x", _CMD_RE.sub("", piece)))


def _format_steps(steps: list[tuple[str, list[str]]]) -> str:
    """One ``calcsteps`` (align*) per block; rows of a step are kept together (``\\*``)."""
    measure = "".join(f"\\calclhs{{{lhs}}}" for lhs, _ in steps if lhs)
    blocks: list[str] = []
    for lhs, pieces in steps:
        if not lhs:
            blocks.append("&\\calcfit{" + " ".join(pieces) + "}")
            continue
        if len(pieces) > 1 and sum(shown_chars(p) for p in pieces) <= ONE_LINE_CHARS:
            # a short step reads best on one line: symbol = formula = numbers = result
            blocks.append(f"{lhs} &= \\calcfit{{{' = '.join(pieces)}}}")
            continue
        rows = [f"{lhs} &= \\calcfit{{{pieces[0]}}}"]
        rows += [f"&= \\calcfit{{{p}}}" for p in pieces[1:]]
        blocks.append(" \\\\*\n".join(rows))
    body = " \\\\[0.9ex]\n".join(blocks)
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
