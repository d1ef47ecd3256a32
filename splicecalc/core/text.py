"""Text from users (job files, notebook metadata, the form, the command line) made safe for TeX.

One rule: every such string reaches TeX through :func:`escape_tex`. Nothing a user
typed is ever passed to XeLaTeX as TeX, to pandoc as raw TeX or math, or to
matplotlib as mathtext:

* :func:`escape_tex` -- plain text -> LaTeX text mode. Escapes ``# $ % & _ { } ~ ^ \\``
  (so ``^^5c`` and ``\\input{...}`` print as typed), turns newlines and tabs into
  spaces, drops other control characters (XeTeX stops on some of them), sets the few
  symbols Latin Modern lacks as math, and puts break points into long unbroken runs
  (paths, hashes, 200-character words) so they wrap instead of running off the sheet.
* :func:`safe_math` -- the one small syntax through which ``$...$`` written in a
  table cell or a prose line is set as math: letters, digits, sub- and superscripts,
  braces, a few operators and a fixed list of control words (Greek letters,
  ``\\mathrm``, ``\\leq`` ...). ``\\input``, ``\\write18``, ``\\catcode``, ``^^`` and
  every other control word are refused, and the text is then escaped instead. So a
  load called ``$G_{k,floor}$`` prints with a subscript, and
  ``$\\input{/etc/passwd}$`` prints as those characters.
* :func:`plain_text_figures` -- the drawing functions run with matplotlib's
  ``text.parse_math`` (and ``text.usetex``) off, so every label, title and annotation
  prints as typed: a ``$`` or ``\\`` in a load name can neither start mathtext nor
  stop the drawing.

This module imports nothing heavy (no matplotlib, no nbconvert).
"""

from __future__ import annotations

import functools
import re
import unicodedata
from typing import Any, Callable, TypeVar

_TEX_SPECIAL = {
    "&": r"\&", "%": r"\%", "$": r"\$", "#": r"\#", "_": r"\_", "{": r"\{", "}": r"\}",
    "~": r"\textasciitilde{}", "^": r"\textasciicircum{}", "\\": r"\textbackslash{}",
    "<": r"\textless{}", ">": r"\textgreater{}", '"': r"\textquotedbl{}",
    # braced so that text starting with them is never an optional argument (``\\[2pt]``) or a star form
    "[": "{[}", "]": "{]}", "*": "{*}",
}
_TEX_RE = re.compile("|".join(re.escape(k) for k in _TEX_SPECIAL))
#: characters the Latin Modern text fonts lack, set as math (each a fixed string of ours)
_UNICODE = {"≤": r"$\leq$", "≥": r"$\geq$", "×": r"$\times$", "·": r"$\cdot$", "√": r"$\surd$",
            "²": r"\textsuperscript{2}", "³": r"\textsuperscript{3}", "⁴": r"\textsuperscript{4}",
            "γ": r"$\gamma$", "ε": r"$\varepsilon$", "ρ": r"$\rho$", "χ": r"$\chi$", "λ": r"$\lambda$"}
#: a run of this many characters without a space gets break points
LONG_RUN = 24
#: ... between every character (a narrow column, 12 mm of a revision code, must wrap too)
BREAK_EVERY = 1
#: what is put between two characters of a long run: a line may break there, nothing is printed
BREAK_POINT = r"\hspace{0pt}"
#: ... and a new source line after this many break points
LINE_CHUNKS = 80
_RUN_RE = re.compile(r"\S{%d,}" % LONG_RUN)


def _clean(text: str) -> str:
    """Newlines, tabs and other whitespace controls -> one space; other control characters,
    surrogates and unassigned code points dropped (XeTeX refuses some of them outright)."""
    out = []
    for ch in text:
        o = ord(ch)
        if ch in "\n\r\t\v\f\x85\u2028\u2029":
            out.append(" ")
        elif o < 32 or 0x7F <= o < 0xA0:
            continue
        else:
            cat = unicodedata.category(ch)
            if cat in ("Cs", "Cn", "Co"):      # surrogates, unassigned, private use
                continue
            out.append(ch)
    return "".join(out)


#: TeX ligatures of the text fonts (``--`` en dash, ``''`` and ``` `` ``` quotes, ``,,``, ``!``` ...)
#: broken up, so that the sheet shows the characters typed
_LIGATURE_RE = re.compile(r"(?<=-)(?=-)|(?<=,)(?=,)")


def _escape_run(run: str) -> str:
    s = _TEX_RE.sub(lambda m: _TEX_SPECIAL[m.group(0)], run)
    if "'" in s or "`" in s:
        s = s.replace("'", r"\textquotesingle{}").replace("`", r"\textasciigrave{}")
    return _LIGATURE_RE.sub("{}", s)


#: longest text of any text field of a job file or of the notebook's title block (characters). Longer is
#: refused when the job is read, in one line. Why 20 000: five times the longest remark seen in a checking
#: conversation, and still a few sheets when printed in full; past that a text is a document of its own
#: (attach it, refer to it). The limit keeps a build's TeX and PDF small and fast whatever a field holds.
TEXT_HARD_MAX = 20_000
#: a text longer than this may be shortened where room is short (title strip, table cells, headings,
#: figure labels) and is then printed in full once, in the package's "Texts in full" list
TEXT_SHORT = 200
FULL_TEXT_TITLE = "Texts in full"


#: the marker of a shortened text in a one-line place (the running strip): the text is on the cover or
#: in "Texts in full"
SHORT_MARK = " [...]"


def shorten(text: Any, limit: int = TEXT_SHORT, *, mark: str | None = None) -> str:
    """``text`` (cleaned) cut to ``limit`` characters with a marker saying so and where it is in full
    (``mark``: a marker of one's own, such as :data:`SHORT_MARK`, the whole result then at most ``limit``).

    Used where room is short; :func:`long_texts` lists what the package prints in full."""
    s = _clean("" if text is None else str(text))
    if len(s) <= limit:
        return s
    if mark is not None:
        return s[:max(1, limit - len(mark))].rstrip() + mark
    return f"{s[:limit].rstrip()} [... {len(s) - limit} more characters: in full under {FULL_TEXT_TITLE}]"


def long_texts(tree: Any, prefix: str = "", limit: int = TEXT_SHORT) -> list[tuple[str, str]]:
    """``(field, text)`` of every string longer than ``limit`` in a JSON-like tree (the job inputs, the
    title block), fields named as in the job file (``load[2].name``)."""
    out: list[tuple[str, str]] = []
    if isinstance(tree, str):
        if len(tree) > limit:
            out.append((prefix or "text", tree))
    elif isinstance(tree, dict):
        for k, v in tree.items():
            out += long_texts(v, f"{prefix}.{k}" if prefix else str(k), limit)
    elif isinstance(tree, (list, tuple)):
        for i, v in enumerate(tree):
            out += long_texts(v, f"{prefix}[{i + 1}]", limit)
    return out


#: an unbroken run (no space) longer than this is a job text pasted into our own prose or a table (a load
#: name in a combination's description ...): shortened there with the marker, printed in full once
RUN_MAX = TEXT_SHORT
_HUGE_RUN_RE = re.compile(r"\S{%d,}" % (RUN_MAX + 1))


def escape_tex(text: Any, *, breaks: bool = True, limit: int | None = None, full: bool = False,
               one_line: bool = False) -> str:
    """Any text -> LaTeX for text mode that prints exactly those characters.

    ``breaks``: put invisible break points between the characters of runs of more than
    :data:`LONG_RUN` characters without a space (off for PDF metadata strings such as the title).
    ``limit``: where room is short, texts longer than this are cut with a marker (:func:`shorten`).
    Unbroken runs longer than :data:`RUN_MAX` are cut the same way unless ``full`` (the package's
    "Texts in full", where each such text is printed once as it is). ``one_line``: the short marker
    :data:`SHORT_MARK` (the running strip).
    """
    s = _clean("" if text is None else str(text))
    if limit is not None and len(s) > limit:
        s = shorten(s, limit, mark=SHORT_MARK if one_line else None)
    if not full and len(s) > RUN_MAX and _HUGE_RUN_RE.search(s):
        s = _HUGE_RUN_RE.sub(lambda m: shorten(m.group(0), RUN_MAX), s)
    if breaks and _RUN_RE.search(s):
        parts = []
        for piece in re.split(r"(\s+)", s):
            if len(piece) >= LONG_RUN and not piece.isspace():
                chunks = [piece[i:i + BREAK_EVERY] for i in range(0, len(piece), BREAK_EVERY)]
                # a source line every LINE_CHUNKS break points ("%" ends it without a space): TeX reads a
                # line of at most buf_size (200 000) characters, a 20 kB text escaped is more than that
                parts.append("".join(BREAK_POINT + ("%\n" if i % LINE_CHUNKS == 0 else "") + _escape_run(c)
                                     if i else _escape_run(c) for i, c in enumerate(chunks)))
            else:
                parts.append(_escape_run(piece))
        s = "".join(parts)
    else:
        s = _escape_run(s)
    for k, v in _UNICODE.items():
        if k in s:
            s = s.replace(k, v)
    return s


# ---------------------------------------------------------------- the small math syntax
#: control words allowed inside $...$ (nothing that reads, writes, defines or changes catcodes)
SAFE_MATH_WORDS = frozenset({
    "alpha", "beta", "gamma", "delta", "epsilon", "varepsilon", "zeta", "eta", "theta", "kappa",
    "lambda", "mu", "nu", "xi", "pi", "rho", "sigma", "tau", "phi", "varphi", "chi", "psi", "omega",
    "Gamma", "Delta", "Theta", "Lambda", "Sigma", "Phi", "Psi", "Omega",
    "mathrm", "mathit", "mathbf", "max", "min", "sum", "infty", "leq", "geq", "le", "ge",
    "neq", "approx", "times", "cdot", "pm", "surd", "ell", "circ", "quad",
    "bar", "hat", "tilde", "overline", "text",
})
#: control symbols allowed: thin / medium / negative spaces and an escaped percent sign
SAFE_MATH_SYMBOLS = frozenset({",", ";", "!", " ", ":", "%"})
_MATH_CHARS = re.compile(r"[A-Za-z0-9 _^{}()\[\],.+\-=/|:;<>!*\\]*")
#: control words that take one argument (a character or a group)
_ONE_ARG = frozenset({"mathrm", "mathit", "mathbf", "text", "bar", "hat", "tilde", "overline"})
_CS_RE = re.compile(r"\\([A-Za-z]+|.)", re.S)
#: longest math accepted (math cannot break across lines)
SAFE_MATH_MAX = 120


def safe_math(body: str) -> bool:
    """True when ``body`` (the text between ``$`` and ``$``) uses only the small math syntax."""
    if not isinstance(body, str) or not body.strip() or len(body) > SAFE_MATH_MAX:
        return False
    if not _MATH_CHARS.fullmatch(body) or "^^" in body:
        return False
    for m in _CS_RE.finditer(body):
        name = m.group(1)
        if name not in SAFE_MATH_WORDS and name not in SAFE_MATH_SYMBOLS:
            return False
    return _well_formed(_tokens(body))


def _tokens(body: str) -> list[str]:
    out, i = [], 0
    while i < len(body):
        if body[i] == "\\":
            m = _CS_RE.match(body, i)
            out.append(m.group(0))
            i = m.end()
        elif body[i] == " ":
            i += 1
        else:
            out.append(body[i])
            i += 1
    return out


def _well_formed(toks: list[str]) -> bool:
    """Groups balanced (depth <= 4), every script and one-argument word followed by its argument, at
    most one subscript and one superscript per base: what XeLaTeX sets without an error."""
    pos = 0

    def arg(depth: int) -> bool:      # one atom: a character, a control word or a group
        nonlocal pos
        if pos >= len(toks) or toks[pos] in ("}", "_", "^"):
            return False
        t = toks[pos]
        pos += 1
        if t == "{":
            return seq(depth + 1, closing=True)
        if t.startswith("\\") and t[1:] in _ONE_ARG:
            return arg(depth)
        return True

    def seq(depth: int, closing: bool) -> bool:
        nonlocal pos
        if depth > 4:
            return False
        sub = sup = False
        while pos < len(toks):
            t = toks[pos]
            if t == "}":
                if not closing:
                    return False
                pos += 1
                return True
            if t in ("_", "^"):
                if (sub if t == "_" else sup):
                    return False            # double subscript / superscript
                pos += 1
                if not arg(depth):
                    return False
                sub, sup = (True, sup) if t == "_" else (sub, True)
                continue
            if not arg(depth):
                return False
            sub = sup = False
        return not closing

    return seq(0, closing=False)


_INLINE_MATH_RE = re.compile(r"\$([^$]*)\$")


def text_with_math(text: Any) -> str:
    """Text where ``$...$`` in the small math syntax (:func:`safe_math`) is set as math; the rest,
    and any ``$...$`` outside that syntax, escaped with :func:`escape_tex`."""
    s = _clean("" if text is None else str(text))
    out, pos = [], 0
    for m in _INLINE_MATH_RE.finditer(s):
        if safe_math(m.group(1)):
            out.append(escape_tex(s[pos:m.start()]))
            out.append(f"${m.group(1)}$")
            pos = m.end()
    out.append(escape_tex(s[pos:]))
    return "".join(out)


# ---------------------------------------------------------------- matplotlib
# ---------------------------------------------------------------- markdown outputs (Jupyter HTML)
def markdown_safe(text: Any) -> str:
    """Markdown of ours (with job text inside) made safe for Jupyter's HTML: ``& < >`` as entities.

    Jupyter shows a kernel's markdown as HTML; a load name such as ``<img onerror=...>`` must
    not become markup there. pandoc reads the entities back as the characters, so the PDF
    prints them as typed (and reads markdown outputs without raw HTML anyway)."""
    s = "" if text is None else str(text)
    s = _LONG_WORD_RE.sub(lambda m: shorten(m.group(0), MARKDOWN_RUN), s)
    return s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")


#: markdown outputs are typeset by pandoc, which puts no break points into words: an unbroken run longer
#: than this is shortened there (with the marker; the text is in full in the package's "Texts in full")
MARKDOWN_RUN = 60
_LONG_WORD_RE = re.compile(r"[^\s]{%d,}" % (MARKDOWN_RUN + 1))


F = TypeVar("F", bound=Callable[..., Any])
#: longest text on a figure (a label, a title): longer is shortened with the marker
FIGURE_TEXT = 80


def plain_text_figures(func: F) -> F:
    """Decorator of a drawing function: every text it puts on the figure is plain text
    (matplotlib's ``text.parse_math`` off while it draws), so a ``$`` or ``\\`` in a load
    name or a designation prints as typed and cannot stop the drawing."""

    @functools.wraps(func)
    def wrapper(*args: Any, **kwargs: Any) -> Any:
        import matplotlib
        import matplotlib.text

        with matplotlib.rc_context({"text.parse_math": False, "text.usetex": False}):
            fig = func(*args, **kwargs)
            # a label of thousands of characters would make the figure as wide: shortened, with the marker
            for t in (fig.findobj(matplotlib.text.Text) if hasattr(fig, "findobj") else ()):
                if len(t.get_text()) > FIGURE_TEXT:
                    t.set_text(shorten(t.get_text(), FIGURE_TEXT))
            return fig

    return wrapper  # type: ignore[return-value]


__all__ = ["escape_tex", "markdown_safe", "shorten", "long_texts", "TEXT_HARD_MAX", "TEXT_SHORT", "safe_math", "text_with_math", "plain_text_figures",
           "SAFE_MATH_WORDS", "LONG_RUN"]
