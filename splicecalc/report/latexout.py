"""LaTeX for the splicecalc outputs (check, table); used as filters by the exporter.

The macros (``\\calccheck``, ``\\calcverdict``, ``calctable`` ...) are defined
in the template ``latex/calcpackage/index.tex.j2``.
"""

from __future__ import annotations

import re
from typing import Any

from ..review.markups import anchor_name
from .display import UNIT_TEX, fmt_number

_TEX_SPECIAL = {
    "&": r"\&", "%": r"\%", "$": r"\$", "#": r"\#", "_": r"\_", "{": r"\{", "}": r"\}",
    "~": r"\textasciitilde{}", "^": r"\textasciicircum{}", "\\": r"\textbackslash{}",
    "<": r"\textless{}", ">": r"\textgreater{}",
}
_TEX_RE = re.compile("|".join(re.escape(k) for k in _TEX_SPECIAL))
#: characters Latin Modern text fonts lack, mapped to LaTeX
_UNICODE = {"≤": r"$\leq$", "≥": r"$\geq$", "×": r"$\times$", "·": r"$\cdot$", "√": r"$\surd$",
            "²": r"\textsuperscript{2}", "³": r"\textsuperscript{3}", "⁴": r"\textsuperscript{4}",
            "γ": r"$\gamma$", "ε": r"$\varepsilon$", "ρ": r"$\rho$", "χ": r"$\chi$", "λ": r"$\lambda$"}


def escape_tex(text: Any) -> str:
    """Plain text -> LaTeX text mode."""
    s = _TEX_RE.sub(lambda m: _TEX_SPECIAL[m.group(0)], str(text))
    for k, v in _UNICODE.items():
        s = s.replace(k, v)
    return s


_SYMBOL_RE = re.compile(r"\b([A-Za-z]+)_([A-Za-z0-9]+(?:,[A-Za-z0-9]+)*)")
_GREEK = {"gamma", "epsilon", "eta", "rho", "chi", "lambda", "alpha", "beta", "psi", "phi", "mu", "sigma", "tau"}


def _symbol(m: re.Match) -> str:
    base, sub = m.group(1), m.group(2)
    base = f"\\{'varepsilon' if base == 'epsilon' else base}" if base in _GREEK else base
    return f"${base}_{{{sub}}}$"


def prose_tex(text: str) -> str:
    """A prose line of a check (``Calc.note``) -> LaTeX text.

    Text already written as LaTeX (containing ``$`` or a backslash) is kept;
    plain text is escaped, ``<=``/``>=`` become relations and code symbols such
    as ``V_pl,Rd`` are set as math (``$V_{pl,Rd}$``).
    """
    if "$" in text or "\\" in text:
        return text
    t = text.replace("<=", "≤").replace(">=", "≥")
    out, pos = [], 0
    for m in _SYMBOL_RE.finditer(t):
        out.append(escape_tex(t[pos:m.start()]))
        out.append(_symbol(m))
        pos = m.end()
    out.append(escape_tex(t[pos:]))
    return "".join(out)


def cell_tex(cell: str) -> str:
    """Table cell: ``$...$`` is kept as math, anything else is escaped text."""
    c = cell.strip()
    if len(c) >= 2 and c.startswith("$") and c.endswith("$"):
        return c
    return escape_tex(c)


def _is_math(step: str) -> bool:
    s = step.lstrip()
    return s.startswith("$$") or s.startswith("\\[") or s.startswith("\\begin{")


def check_latex(p: dict[str, Any]) -> str:
    """One check: heading with clause, steps, verdict line."""
    out = [f"\\calccheck{{{escape_tex(p.get('title', ''))}}}{{{escape_tex(p.get('clause', ''))}}}"
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
    if p.get("status") == "not checked":     # core.record.NOT_CHECKED: no numbers, never a pass
        ut, u_txt, verdict = "", "-", "\\textcolor{failred}{\\textbf{NOT CHECKED}}"
    out.append(f"\\calcverdict{{{fmt_number(p.get('demand'))}{ut}}}{{{fmt_number(p.get('resistance'))}{ut}}}"
               f"{{{u_txt}}}{{{verdict}}}\\calcmark{{{anchor_name(str(p.get('id', '')), end=True)}}}")
    return "\n\n".join(out) + "\n"


def table_latex(p: dict[str, Any]) -> str:
    """A data or summary table as a page-breakable longtable."""
    cols = p["columns"]
    align = p.get("align") or "l" * len(cols)
    kind = p.get("kind", "data")
    if kind == "summary":
        # check title and clause wrap; numbers stay on one line
        spec = (">{\\raggedright\\arraybackslash}p{0.33\\linewidth}"
                ">{\\raggedright\\arraybackslash}p{0.27\\linewidth}" + "".join(align[2:]))
    else:
        spec = align
    head = " & ".join(f"\\textbf{{{cell_tex(c)}}}" for c in cols) + " \\\\"
    lines = [f"\\begin{{calctable}}{{{spec}}}"]
    if p.get("title"):
        lines.append(f"\\multicolumn{{{len(cols)}}}{{@{{}}l}}{{\\calctabletitle{{{escape_tex(p['title'])}}}}} \\\\")
    lines += ["\\toprule", head, "\\midrule", "\\endhead",
              f"\\midrule\\multicolumn{{{len(cols)}}}{{r@{{}}}}{{\\footnotesize\\itshape continued}} \\\\",
              "\\endfoot", "\\bottomrule", "\\endlastfoot"]
    for row in p["rows"]:
        cells = [cell_tex(c) for c in row]
        if kind == "summary" and row and row[-1].strip().upper() != "OK":
            cells[-1] = f"\\textbf{{{cells[-1]}}}"
        lines.append(" & ".join(cells) + " \\\\")
    lines.append("\\end{calctable}")
    if p.get("notes"):
        lines.append(f"\\calctablenote{{{escape_tex(p['notes'])}}}")
    return "\n".join(lines) + "\n"


_STATE_TEX = {"open": r"\textbf{open}", "answered": "answered", "closed": "closed"}


def review_latex(p: dict[str, Any]) -> str:
    """The review comments: a margin mark at each commented check (through the .aux, so a mark
    can sit beside a check printed before this list) and every thread, flagged where its check
    changed since the comment or is no longer in the package."""
    marks: dict[str, list[str]] = {}
    for c in p.get("comments", []):
        if c.get("anchor") and c.get("state") != "closed":
            marks.setdefault(c["anchor"], []).append(c["id"])
    out = [f"\\calcrevdef{{{a}}}{{{escape_tex(', '.join(ids))}}}" for a, ids in marks.items()]
    n = p.get("counts", {})
    out.append(f"\\calcsteptext{{Register {escape_tex(p.get('register', ''))}: {n.get('open', 0)} open, "
               f"{n.get('answered', 0)} answered, {n.get('closed', 0)} closed. Digest "
               f"\\texttt{{{escape_tex(str(p.get('digest', ''))[:16])}}}.}}")
    for c in p.get("comments", []):
        flag = {"moved": " \\textcolor{failred}{(check changed since the comment)}",
                "gone": " \\textcolor{failred}{(check no longer in the package)}"}.get(c.get("flag") or "", "")
        out.append(f"\\calcrevhead{{{escape_tex(c['id'])}}}{{{_STATE_TEX.get(c.get('state'), escape_tex(c.get('state')))}}}"
                   f"{{{escape_tex(c.get('target_label', ''))}{flag}}}{{{escape_tex(c.get('revision', ''))}}}")
        for e in c.get("thread", []):
            lead = {"comment": "", "reply": "reply: ", "close": "closed: "}.get(e.get("kind"), "")
            out.append(f"\\calcrevline{{{escape_tex(e.get('by', ''))}, {escape_tex(str(e.get('date', ''))[:10])}}}"
                       f"{{{lead}{escape_tex(e.get('text', ''))}}}")
    return "\n".join(out) + "\n"
