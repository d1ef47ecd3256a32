"""LaTeX for the splicecalc outputs (check, table); used as filters by the exporter.

Every text that is not our own LaTeX goes through :func:`splicecalc.core.text.escape_tex`
(re-exported here as ``escape_tex``; the template's ``escape_latex`` filter is the same
function). ``$...$`` in a table cell or prose line is set as math only in the small syntax
of :func:`splicecalc.core.text.safe_math`; anything else is escaped, so text from a job
file can never run as TeX.

The macros (``\\calccheck``, ``\\calcverdict``, ``calctable`` ...) are defined
in the template ``latex/calcpackage/index.tex.j2``.
"""

from __future__ import annotations

import re
from typing import Any

from ..review.markups import anchor_name
from ..core.text import (FULL_TEXT_TITLE, TEXT_SHORT, _INLINE_MATH_RE, _clean, escape_tex as _escape_tex, long_texts,
                         safe_math, shorten)
from .display import UNIT_TEX, fmt_number

#: the one escaping function for user text (job files, metadata, form, command line)
escape_tex = _escape_tex

#: pandoc reader of the kernel's markdown *outputs* (``data_markdown`` in our template): markdown
#: with no raw TeX, no raw HTML or attributes and no math, so text from a job file inside an
#: output (a load name, a designation) is printed as typed and never runs as TeX
OUTPUT_MD_FORMAT = ("markdown-raw_tex-raw_attribute-raw_html-tex_math_dollars-tex_math_single_backslash"
                    "-tex_math_double_backslash-latex_macros")


_SYMBOL_RE = re.compile(r"\b([A-Za-z]+)_([A-Za-z0-9]+(?:,[A-Za-z0-9]+)*)")
_GREEK = {"gamma", "epsilon", "eta", "rho", "chi", "lambda", "alpha", "beta", "psi", "phi", "mu", "sigma", "tau"}


def _symbol(m: re.Match) -> str:
    base, sub = m.group(1), m.group(2)
    base = f"\\{'varepsilon' if base == 'epsilon' else base}" if base in _GREEK else base
    return f"${base}_{{{sub}}}$"


#: plain-text maths of our own prose (a note's ``sqrt((F_x/F_b,x,Rd)^2 + ...)``) as the sheet prints it
_PLAIN_MATH = (("<=", "≤"), (">=", "≥"), ("sqrt(", "√("), ("^2", "²"), ("^3", "³"))


def _prose_plain(t: str) -> str:
    for a, b in _PLAIN_MATH:
        t = t.replace(a, b)
    out, pos = [], 0
    for m in _SYMBOL_RE.finditer(t):
        out.append(escape_tex(t[pos:m.start()]))
        out.append(_symbol(m))
        pos = m.end()
    out.append(escape_tex(t[pos:]))
    return "".join(out)


def prose_tex(text: str) -> str:
    """A prose line of a check (``Calc.note``, a prose step) -> LaTeX text.

    ``$...$`` in the small math syntax (:func:`splicecalc.core.text.safe_math`) is
    kept as math; everything else is text: escaped, ``<=``/``>=`` set as relations
    and code symbols such as ``V_pl,Rd`` as math (``$V_{pl,Rd}$``). A backslash
    outside such math prints as a backslash.
    """
    t = _clean(str(text))
    out, pos = [], 0
    for m in _INLINE_MATH_RE.finditer(t):
        if safe_math(m.group(1)):
            out.append(_prose_plain(t[pos:m.start()]))
            out.append(f"${m.group(1)}$")
            pos = m.end()
    out.append(_prose_plain(t[pos:]))
    return "".join(out)


#: a code symbol in a check title (``p_3``, ``h_p``, ``F_f,Ed``, ``gamma_M0``): a base of one or two
#: letters or a Greek name; a longer word with an underscore (a load name typed so) stays as typed
_TITLE_SYMBOL_RE = re.compile(r"\b(" + "|".join(sorted(_GREEK, key=len, reverse=True))
                              + r"|[A-Za-z]{1,2})_([A-Za-z0-9]+(?:,[A-Za-z0-9]+)*)\b")


def title_tex(title: str, heading: bool = False) -> str:
    """A check title as LaTeX text: escaped, code symbols set as math with their subscripts
    (``Gauge p_3 <= 140 mm`` -> ``Gauge $p_{3}$ $\\leq$ 140 mm``), never a raw underscore. For a
    ``heading`` the plain title goes to the PDF bookmarks (``\\texorpdfstring``)."""
    t = _clean(str(title))
    out, pos = [], 0
    for m in _TITLE_SYMBOL_RE.finditer(t):
        out.append(escape_tex(t[pos:m.start()].replace("<=", "≤").replace(">=", "≥")))
        out.append(_symbol(m))
        pos = m.end()
    out.append(escape_tex(t[pos:].replace("<=", "≤").replace(">=", "≥")))
    tex = "".join(out)
    if heading and tex != escape_tex(t):
        plain = escape_tex(t)
        return f"\\texorpdfstring{{{tex}}}{{{plain}}}"
    return tex


#: a code symbol as pandoc writes it in LaTeX text (``f\\_y``, ``M\\_c,Rd``, ``gamma\\_Q``): a base of one or
#: two letters or a Greek name at the start of a word; a longer word with an underscore stays as written
_PANDOC_SYMBOL_RE = re.compile(r"(?<![A-Za-z\\])(" + "|".join(sorted(_GREEK, key=len, reverse=True))
                               + r"|[A-Za-z]{1,2})\\_([A-Za-z0-9]+(?:,[A-Za-z0-9]+)*)(?![A-Za-z0-9])")


def prose_symbols_tex(latex: str) -> str:
    """Code symbols in the LaTeX pandoc made of a markdown output (notes, cautions, method text) set as
    math with their subscripts (``f\\_y`` -> ``$f_{y}$``): never a raw underscore on a sheet. Only
    letters, digits and commas go into the math (see :func:`_symbol`)."""
    for a, b in _PANDOC_PLAIN_MATH:
        latex = latex.replace(a, b)
    return _PANDOC_SYMBOL_RE.sub(_symbol, latex)


#: the same plain-text maths as pandoc writes it in LaTeX (``h <= 540`` -> ``h \textless{}= 540``)
_PANDOC_PLAIN_MATH = ((r"\textless{}=", r"$\leq$"), (r"\textgreater{}=", r"$\geq$"),
                      (r"\textless=", r"$\leq$"), (r"\textgreater=", r"$\geq$"), ("sqrt(", r"$\surd$("),
                      (r"\^{}2", r"\textsuperscript{2}"), (r"\^{}3", r"\textsuperscript{3}"))


#: longest table cell printed whole (characters; about a third of a sheet in a narrow column)
CELL_MAX = 1200


def cell_tex(cell: str) -> str:
    """Table cell: ``$...$`` in the small math syntax is kept as math, anything else is escaped text."""
    c = _clean(str(cell)).strip()
    if len(c) >= 2 and c.startswith("$") and c.endswith("$") and safe_math(c[1:-1]):
        return c
    # a row cannot break across sheets: a text longer than CELL_MAX is shortened here. Only a job or
    # title-block text can be that long (each is printed in full under "Texts in full", which lists every
    # such text longer than TEXT_SHORT); our own cells (the clauses cited by a standard, a part's gaps)
    # are printed whole, so no marker points to a section that is not there
    if len(c) > CELL_MAX:
        return escape_tex(c, limit=CELL_MAX)
    return title_tex(c)     # code symbols (G_k, psi_1, k_T) with their subscripts, never a raw underscore


def full_texts_latex(nb: Any) -> str:
    """The package's "Texts in full": every job-file or title-block text longer than
    :data:`core.text.TEXT_SHORT` (shortened with a marker where room is short), printed once in full
    as paragraphs (they break across sheets), each under its field name. Empty when there is none."""
    from ..signoff.digest import JOB_MIME

    found: list[tuple[str, str]] = []
    meta = nb.get("metadata", {}).get("splicecalc", {}) if hasattr(nb, "get") else {}
    if isinstance(meta, dict):
        found += long_texts({k: v for k, v in meta.items() if k not in ("sign_off", "signatures")},
                            "title block")
    for cell in nb.get("cells", []) if hasattr(nb, "get") else []:
        for out in cell.get("outputs", []) or []:
            data = out.get("data", {}) or {}
            if JOB_MIME in data:
                found += long_texts(data[JOB_MIME], "job")
    fields: dict[str, list[str]] = {}          # each text once, under every field that holds it
    for field, text in found:
        fields.setdefault(text, []).append(field)
    # a text held inside a longer one (the title block's project line joins the client and the location)
    # is printed once, in the longer one
    for text in sorted(fields, key=len):
        home = next((t for t in fields if len(t) > len(text) and text in t), None)
        if home is not None:
            fields[home] += fields.pop(text)
    rows = [f"\\calcfulltext{{{escape_tex('; '.join(names))}}}{{{escape_tex(text, full=True)}}}" for text, names in fields.items()]
    if not rows:
        return ""
    return (f"\\section*{{{escape_tex(FULL_TEXT_TITLE)}}}\\addcontentsline{{toc}}{{section}}{{{escape_tex(FULL_TEXT_TITLE)}}}\n"
            "{\\small Texts of the job file and the title block longer than "
            f"{TEXT_SHORT} characters, shortened where room is short (marked there), are printed here in full.}}\n"
            + "\n".join(rows) + "\n")


#: control words never taken as rendered math, whoever wrote the step (files, shell, catcodes, definitions)
_UNSAFE_TEX = re.compile(r"\^\^|\\(?:input|include|openin|openout|read|write|immediate|catcode|def|edef|gdef|xdef"
                         r"|let|futurelet|csname|special|VerbatimInput|lstinputlisting|usepackage|RequirePackage"
                         r"|directlua|everyjob|everypar|scantokens|endinput|newcommand|renewcommand"
                         r"|providecommand|makeatletter|shipout|jobname|openout)(?![A-Za-z])")


def _is_math(step: str) -> bool:
    """A rendered formula (handcalcs LaTeX) rather than a prose line: display math, and nothing
    in it that reads or writes files or redefines TeX."""
    s = step.strip()
    shaped = ((s.startswith("$$") and s.endswith("$$")) or (s.startswith("\\[") and s.endswith("\\]"))
              or (s.startswith("\\begin{") and s.rstrip().endswith("}")))
    return shaped and not _UNSAFE_TEX.search(s)


def steps_latex(steps: list[str]) -> str:
    """Rendered steps that are not a check of their own: display math kept (see :func:`_is_math`),
    prose lines through :func:`prose_tex`."""
    return "\n".join(s.strip() if _is_math(s) else f"\\par{{\\small {prose_tex(s.strip())}}}\\par"
                     for s in steps if s.strip())


def _unit_tex(unit: str) -> str:
    return f"\\,${UNIT_TEX.get(unit, escape_tex(unit))}$" if unit else ""


def rule_row_latex(p: dict[str, Any]) -> str:
    """One check as a row of a rule table (``\\calcrule``: rule, E_d, R_d, u, verdict, clause; a rule with no
    code clause shows its source, the record's ``guidance``)."""
    ut = _unit_tex(p.get("unit", ""))
    u = p.get("utilisation")
    u_txt = r"$\infty$" if u is None else f"{u:.2f}"
    verdict = "\\calcok" if p.get("ok") else "\\calcfail"
    r_txt = f"{fmt_number(p.get('resistance'))}{ut}"
    if p.get("status") == "info":            # core.record.INFO: no resistance, no utilisation, never OK
        u_txt, verdict = "-", "\\textbf{INFO}"
        if not p.get("resistance"):
            r_txt = "-"
    start = f"\\calcmark{{{anchor_name(str(p.get('id', '')))}}}\\calcrevmark{{{anchor_name(str(p.get('id', '')))}}}"
    return (f"\\calcrule{{{start}{title_tex(p.get('label') or p.get('title', ''))}}}{{{fmt_number(p.get('demand'))}{ut}}}"
            f"{{{r_txt}}}{{{u_txt}}}{{{verdict}}}{{{escape_tex(p.get('clause') or p.get('guidance', ''))}}}"
            f"\\calcmark{{{anchor_name(str(p.get('id', '')), end=True)}}}\n")


def check_latex(p: dict[str, Any]) -> str:
    """One check: heading with clause, steps, verdict line (a row of a rule table for ``layout`` "row")."""
    if p.get("layout") == "row" and p.get("status") != "not checked":
        return rule_row_latex(p)
    out = [f"\\calccheck{{{title_tex(shorten(p.get('title', ''), TEXT_SHORT), heading=True)}}}"
           f"{{{escape_tex(p.get('clause', ''), limit=TEXT_SHORT)}}}"
           f"\\calcmark{{{anchor_name(str(p.get('id', '')))}}}\\calcrevmark{{{anchor_name(str(p.get('id', '')))}}}"]
    if p.get("guidance"):
        out.append("\\calcsteptext{" + prose_tex("Method from: " + p["guidance"]) + "}")
    steps = [s for s in p.get("steps", []) if s.strip()]
    last_math = max((i for i, s in enumerate(steps) if _is_math(s)), default=-1)
    for i, step in enumerate(steps):
        if not _is_math(step):
            out.append("\\calcsteptext{" + prose_tex(step.strip()) + "}")
        else:
            out.append(("\\calckeepnext\n" if i == last_math else "") + step.strip())
    if p.get("note"):
        out.append(f"\\calcnote{{{prose_tex(p['note'])}}}")
    unit = p.get("unit", "")
    ut = f"\\,${UNIT_TEX.get(unit, escape_tex(unit))}$" if unit else ""
    u = p.get("utilisation")
    u_txt = r"$\infty$" if u is None else f"{u:.2f}"
    verdict = "\\calcok" if p.get("ok") else "\\calcfail"
    d_txt, r_txt = fmt_number(p.get("demand")), fmt_number(p.get("resistance"))
    if p.get("status") == "not checked":     # core.record.NOT_CHECKED: no numbers, never a pass
        ut, u_txt, verdict = "", "-", "\\textcolor{failred}{\\textbf{NOT CHECKED}}"
    elif p.get("status") == "info":          # core.record.INFO: information, no utilisation
        # information has no resistance (unless it carries a limit): "-", never "0 kN"
        u_txt, verdict = "-", "\\textbf{INFO}"
        if not p.get("resistance"):
            r_txt = "-"
        if not p.get("demand"):
            ut, d_txt = "", "-"
    r_ut = "" if r_txt == "-" else ut
    out.append(f"\\calcverdict{{{d_txt}{ut}}}{{{r_txt}{r_ut}}}"
               f"{{{u_txt}}}{{{verdict}}}\\calcmark{{{anchor_name(str(p.get('id', '')), end=True)}}}")
    return "\n\n".join(out) + "\n"


def verbatim_text(text: Any) -> str:
    """Printed text (stdout) for the template's ``Verbatim`` block: control characters other
    than newlines and tabs dropped, and a line that would end the block (``\\end{Verbatim}``)
    kept as text (a zero-width space inside the name)."""
    s = "".join(ch for ch in str(text) if ch in "\n\t" or not (ord(ch) < 32 or 0x7F <= ord(ch) < 0xA0))
    return re.sub(r"\\end(\s*)\{Verbatim", "\\\\end\\1{Verbatim\u200b", s)


#: characters of small text across the line (A4, 20 + 16 mm margins: about 493 pt at ~4.5 pt a character)
LINE_CHARS = 110
#: a text column longer than this may be made to wrap
WRAP_CHARS = 30


def _wrapping_spec(rows: list[list[str]], align: str, head: list[str] | None = None) -> str:
    """Column spec: ``l``/``r``/``c`` as given while the table fits the line; when the longest
    cells add up to more than the line (long names typed into a job file, notes), the long
    columns wrap (p columns) in the room the others leave."""
    rows = [*rows, head] if head else rows
    longest = [max((len(str(r[j])) for r in rows if j < len(r)), default=0) for j in range(len(align))]
    if sum(longest) + 2 * len(align) <= LINE_CHARS:
        return align
    wide = [j for j, n in enumerate(longest) if n > WRAP_CHARS]
    if not wide:
        return align
    others = sum(n + 2 for j, n in enumerate(longest) if j not in wide)
    # the room left is shared fairly: a long column that needs less than an equal share (a standard's
    # name beside the list of its clauses) gets what it needs, the rest goes to the longer ones
    room = 1.0 - others / LINE_CHARS - 0.02 * len(wide)
    share: dict[int, float] = {}
    for k, j in enumerate(sorted(wide, key=lambda j: longest[j])):
        fair = room / (len(wide) - k)
        share[j] = max(0.15, min((longest[j] + 2) / LINE_CHARS, fair))
        room -= share[j]
    return "".join(f">{{\\raggedright\\arraybackslash}}p{{{share[j]:.3f}\\linewidth}}" if j in wide else a
                   for j, a in enumerate(align))


def table_latex(p: dict[str, Any]) -> str:
    """A data or summary table as a page-breakable longtable."""
    cols = p["columns"]
    align = "".join(a for a in str(p.get("align") or "") if a in "lrc") or "l" * len(cols)   # never raw TeX
    kind = p.get("kind", "data")
    if kind == "summary":
        # the check title wraps; numbers stay on one line
        spec = ">{\\raggedright\\arraybackslash}p{0.62\\linewidth}" + "".join(align[1:])
    elif kind == "parts":
        # room for the widest verdict, NOT CHECKED (a part whose made checks pass but has a gap)
        spec = (">{\\raggedright\\arraybackslash}p{0.25\\linewidth}"
                ">{\\raggedright\\arraybackslash}p{0.43\\linewidth}" + "".join(align[2:]))
    else:
        spec = _wrapping_spec(p["rows"], align, cols)
    head = " & ".join(f"\\textbf{{{cell_tex(c)}}}" for c in cols) + " \\\\"
    # the full list (every check, one line each) set a size smaller than the summary by part above it
    size = {"summary": "[\\scriptsize]", "parts": "[\\footnotesize]"}.get(kind, "")
    lines = [f"\\begin{{calctable}}{size}{{{spec}}}"]
    if p.get("title"):
        lines.append(f"\\multicolumn{{{len(cols)}}}{{@{{}}l}}{{\\calctabletitle{{{escape_tex(p['title'])}}}}} \\\\")
    lines += ["\\toprule", head, "\\midrule", "\\endhead",
              f"\\midrule\\multicolumn{{{len(cols)}}}{{r@{{}}}}{{\\footnotesize\\itshape continued}} \\\\",
              "\\endfoot", "\\bottomrule", "\\endlastfoot"]
    # a summary's check titles (and a parts table's part and governing check) are record titles
    titles = {"summary": 1, "parts": 2}.get(kind, 0)
    for row in p["rows"]:
        cells = [title_tex(c) if j < titles else cell_tex(c) for j, c in enumerate(row)]
        if kind in ("summary", "parts") and row and row[-1].strip().upper() != "OK":
            cells[-1] = f"\\textbf{{{cells[-1]}}}"
        lines.append(" & ".join(cells) + " \\\\")
    if p.get("title"):
        lines.append(f"\\calctitlespan{{{len(cols)}}}")   # the title's width, once the columns are known
    lines.append("\\end{calctable}")
    if p.get("notes"):
        lines.append(f"\\calctablenote{{{title_tex(p['notes'])}}}")   # symbols as subscripts
    if kind == "parts" and isinstance(p.get("acceptance"), dict):
        lines.append(acceptance_latex(p["acceptance"]))
    return "\n".join(lines) + "\n"


def acceptance_latex(a: dict[str, Any]) -> str:
    """The summary's acceptance boxes of a package with failing checks or NOT CHECKED items: one framed
    box per role (checked, approved) that `splicecalc sign` fills with the signer's stated reasons, in
    the signature's own update (``signoff.pdfsign.ACCEPT_FIELDS``; the template's ``\\acceptbox``)."""
    bad, gap = _count(a.get("failing")), _count(a.get("not_checked"))
    what = " and ".join(x for x in (f"{bad} failing check(s)" if bad else "",
                                    f"{gap} item(s) NOT CHECKED" if gap else "") if x)
    return ("\\calcacceptance{" + escape_tex(what) + "}")


_STATE_TEX = {"open": r"\textbf{open}", "answered": "answered", "closed": "closed"}


def _count(v: Any) -> int:
    """A count for the sheet: a whole number, whatever the payload holds."""
    try:
        return max(0, int(v))
    except (TypeError, ValueError, OverflowError):
        return 0


def review_latex(p: dict[str, Any]) -> str:
    """The review comments: a margin mark at each commented check (through the .aux, so a mark
    can sit beside a check printed before this list) and every thread, flagged where its check
    changed since the comment or is no longer in the package."""
    marks: dict[str, list[str]] = {}
    for c in p.get("comments", []):
        if c.get("anchor") and c.get("state") != "closed":
            marks.setdefault(c["anchor"], []).append(c["id"])
    # an anchor names an aux entry: only the characters anchor_name makes (the register is a file users can edit)
    out = [f"\\calcrevdef{{{re.sub(r'[^A-Za-z0-9_.:-]', '-', str(a))}}}{{{escape_tex(', '.join(ids))}}}"
           for a, ids in marks.items()]
    n = p.get("counts", {})
    out.append(f"\\calcsteptext{{Register {escape_tex(p.get('register', ''))}: {_count(n.get('open'))} open, "
               f"{_count(n.get('answered'))} answered, {_count(n.get('closed'))} closed. Digest "
               f"\\texttt{{{escape_tex(str(p.get('digest', ''))[:16])}}}. Names are as typed with "
               f"\\texttt{{--by}}: the register does not prove who wrote an entry, except a closure marked "
               f"signed (\\texttt{{review close --key}}).}}")
    for c in p.get("comments", []):
        flag = {"moved": " \\textcolor{failred}{(check changed since the comment)}",
                "gone": " \\textcolor{failred}{(check no longer in the package)}"}.get(c.get("flag") or "", "")
        out.append(f"\\calcrevhead{{{escape_tex(c['id'])}}}{{{_STATE_TEX.get(c.get('state'), escape_tex(c.get('state')))}}}"
                   f"{{{escape_tex(c.get('target_label', ''))}{flag}}}{{{escape_tex(c.get('revision', ''))}}}")
        for e in c.get("thread", []):
            lead = {"comment": "", "reply": "reply: ", "close": "closed: "}.get(e.get("kind"), "")
            mark = {"trusted": ", signed (trusted)", "untrusted": ", signed (signer not in the trust list)",
                    "invalid": ", \\textcolor{failred}{signature INVALID}"}.get(str(e.get("signed") or ""), "")
            out.append(f"\\calcrevline{{{escape_tex(e.get('by', ''), limit=80)}, {escape_tex(str(e.get('date', ''))[:10])}{mark}}}"
                       f"{{{lead}{escape_tex(e.get('text', ''), full=True)}}}")
    return "\n".join(out) + "\n"
