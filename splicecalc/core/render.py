"""Render a clause function with handcalcs, from the same source that runs on floats.

``render(fn, **kwargs)`` converts the float arguments to forallpeople quantities
(using the units declared by :func:`splicecalc.core.clause.clause`), runs the
function through handcalcs' renderer, and returns the LaTeX together with the
result converted back to a float in the declared unit.

We hand handcalcs only the body of the function, taken with :mod:`ast`, rather
than using ``handcalcs.decorator.handcalc``: the decorator filters source lines
by substring (``def``, ``return``, ``@``), which breaks multi-line signatures
and decorators. The renderer itself (``LatexRenderer``) is handcalcs'.
"""

from __future__ import annotations

import ast
import inspect
import re
import textwrap
from functools import lru_cache
from typing import Any, Callable

from .units import TEX_DISPLAY_UNITS, is_quantity, to_float, to_quantity


#: capital Greek letters that look like Latin ones have no LaTeX macro; handcalcs still writes
#: them for names such as ``gamma_Mu`` (-> ``\gamma_{\Mu}``). They are put back as the letters typed.
_UNDEFINED_GREEK = re.compile(r"\\(Alpha|Beta|Epsilon|Zeta|Eta|Iota|Kappa|Mu|Nu|Omicron|Rho|Tau|Chi)(?![A-Za-z])")


#: a subtraction or addition of a negative number as handcalcs substitutes it: ``1 - -1.000``
_DOUBLE_SIGN = re.compile(r"(?<=[\s(])([-+]) -(?=\d)")
#: the same at the start of a group (``\\sqrt { - -1.000 }``): the minus signs cancel
_UNARY_DOUBLE = re.compile(r"([{(]\s*)- -(?=\d)")
_ABS_OPEN = "\\operatorname{abs} \\left("


def _abs_bars(latex: str) -> str:
    """``\\operatorname{abs} \\left( x \\right)`` -> ``\\left| x \\right|`` (the usual notation)."""
    out, i = [], 0
    while True:
        j = latex.find(_ABS_OPEN, i)
        if j < 0:
            out.append(latex[i:])
            return "".join(out)
        k, depth = j + len(_ABS_OPEN), 1
        while depth and k < len(latex):
            if latex.startswith("\\left", k):
                depth += 1
                k += 5
            elif latex.startswith("\\right", k):
                depth -= 1
                if depth == 0:
                    break
                k += 6
            else:
                k += 1
        if depth or not latex.startswith("\\right)", k):
            out.append(latex[i:j + len(_ABS_OPEN)])          # unbalanced: left as written
            i = j + len(_ABS_OPEN)
            continue
        out.append(latex[i:j] + "\\left|" + latex[j + len(_ABS_OPEN):k] + "\\right|")
        i = k + len("\\right)")


_NUM = r"(-?\d+(?:\.\d+)?)\\ "
#: number + unit as forallpeople writes it, longest unit first (``MN \cdot m`` before ``MN``);
#: the unit may not continue (``\mathrm{N}`` must not match the start of ``\mathrm{N} \cdot \mathrm{m}``
#: when that has its own entry)
_UNIT_RE = re.compile(_NUM + "(" + "|".join(re.escape(u) for u in sorted(TEX_DISPLAY_UNITS, key=len, reverse=True))
                      + ")" + r"(?!\s*(?:\\cdot\s*\\mathrm|/|\^))")


def _shift(number: str, power: int) -> str:
    """``number`` times 10**power, written with as many decimals as it still carries (none invented)."""
    from decimal import Decimal

    d = Decimal(number).scaleb(power)
    places = len(number.split(".")[1]) if "." in number else 0
    places = max(0, places - power) if power > 0 else places
    return f"{d:.{places}f}"


#: significant figures of a section property shown in cm3, cm4 or dm6 (as section tables print them:
#: 25500 cm4, 1287.3 cm3; three decimals of a cm4 only repeat the float's last digits)
SECTION_SIG_FIGS = 5


def _significant(number: str, figures: int) -> str:
    """``number`` with at most ``figures`` significant figures before rounding off decimals only
    (integer digits are never dropped), keeping no more decimals than it had."""
    from decimal import ROUND_HALF_UP, Decimal

    whole = number.lstrip("-").split(".")[0].lstrip("0")
    places = len(number.split(".")[1]) if "." in number else 0
    keep = max(0, min(places, figures - len(whole)))
    return f"{Decimal(number).quantize(Decimal(1).scaleb(-keep), rounding=ROUND_HALF_UP):f}"


def display_units(latex: str) -> str:
    """Numbers with units in the rendered text put in the units of :data:`TEX_DISPLAY_UNITS`; section
    properties (cm3, cm4, dm6) to :data:`SECTION_SIG_FIGS` significant figures."""
    def repl(m: re.Match) -> str:
        unit, power = TEX_DISPLAY_UNITS[m.group(2)]
        number = _shift(m.group(1), power)
        if unit.startswith("\\mathrm{dm}"):          # 0.466 dm6 from mm6: the decimals the shift brings
            from decimal import Decimal
            number = f"{Decimal(m.group(1)).scaleb(power):f}"
        if unit.startswith(("\\mathrm{cm}", "\\mathrm{dm}")):
            number = _significant(number, SECTION_SIG_FIGS)
        return f"{number}\\ {unit}"
    return _UNIT_RE.sub(repl, latex)


# ----------------------------------------------------------------------- zero terms
#: what changes the depth of a LaTeX math text: braces and \left / \right (an escape is skipped whole)
_DEPTH_RE = re.compile(r"\\left(?![A-Za-z])|\\right(?![A-Za-z])|\\[A-Za-z]+|\\.|[{}]", re.S)
#: a number shown as zero (``0.000``, ``-0.0``, ``0``)
_ZERO_NUMBER = re.compile(r"^-?0(?:\.0+)?$")
#: a number with its unit (``0.000\ \mathrm{kN}``, ``0.000\ \mathrm{mm}^{2}``)
_NUMBER_UNIT = re.compile(r"^(-?\d+(?:\.\d+)?)(?:\\ \\mathrm\{[^{}]*\}(?:\^\{\s*\d+\s*\})?)?$")
#: commands a numeric substitution holds besides numbers and units; any other command or a letter
#: outside ``\mathrm{...}`` / ``\operatorname{...}`` makes a piece symbolic
_NUMERIC_CMDS = {"\\left", "\\right", "\\frac", "\\cdot", "\\sqrt", "\\times", "\\ ", "\\,", "\\;", "\\:", "\\|"}


def _split_depth0(text: str, seps: tuple[str, ...]) -> list[tuple[str, str]]:
    """``text`` split at any of ``seps`` outside braces and ``\\left ... \\right``: ``[(sep before, part)]``
    (the first part's separator is "")."""
    out: list[tuple[str, str]] = []
    depth, start, before, i = 0, 0, "", 0
    while i < len(text):
        if depth == 0:
            hit = next((s for s in seps if text.startswith(s, i)), None)
            if hit is not None:
                out.append((before, text[start:i]))
                before, i = hit, i + len(hit)
                start = i
                continue
        m = _DEPTH_RE.match(text, i)
        if m is None:
            i += 1
            continue
        t = m.group()
        depth += 1 if t in ("{", "\\left") else -1 if t in ("}", "\\right") else 0
        i = m.end()
    out.append((before, text[start:]))
    return out


def _is_numeric(piece: str) -> bool:
    """A substituted piece: numbers, units and operators only (no symbol left)."""
    body = re.sub(r"\\(?:mathrm|operatorname)\{[^{}]*\}", "", piece)
    if any(c not in _NUMERIC_CMDS for c in re.findall(r"\\[A-Za-z]+|\\.", body)):
        return False
    return not re.search(r"[A-Za-z]", re.sub(r"\\[A-Za-z]+|\\.", "", body))


def _is_zero(term: str) -> bool:
    """A term that prints as zero: a zero number (with its unit), a product with a zero factor, a
    fraction with a zero numerator, ``|0|`` or ``(0)``, or such a bracket to a positive power."""
    t = term.strip()
    m = re.match(r"^(.*\\right[)|])\s*\^\{\s*(\d+(?:\.\d+)?)\s*\}$", t, re.S)
    if m and float(m.group(2)) > 0:
        t = m.group(1).strip()
    factors = _split_depth0(t, (" \\cdot ",))
    if len(factors) > 1:
        return any(_is_zero(f) for _, f in factors)
    if t.startswith("\\frac{"):
        num, end = _brace_group(t, len("\\frac"))
        den, end = _brace_group(t, end)
        if num is not None and den is not None and end == len(t):
            return _is_zero_sum(num)
    for open_, close in (("\\left(", "\\right)"), ("\\left|", "\\right|")):
        if t.startswith(open_) and t.endswith(close) and _closes_at_end(t):
            return _is_zero_sum(t[len(open_):-len(close)])
    m = _NUMBER_UNIT.match(t)
    return bool(m and _ZERO_NUMBER.match(m.group(1)))


def _brace_group(t: str, i: int) -> tuple[str | None, int]:
    """The text of the brace group opening at ``t[i]`` and the index after it, or ``(None, i)``."""
    if not t.startswith("{", i):
        return None, i
    depth = 0
    for m in _DEPTH_RE.finditer(t, i):
        g = m.group()
        depth += 1 if g == "{" else -1 if g == "}" else 0
        if depth == 0:
            return t[i + 1:m.start()], m.end()
    return None, i


def _closes_at_end(t: str) -> bool:
    """True when the bracket opening ``t`` closes at its very end (one group, not ``(a) (b)``)."""
    depth = 0
    for m in _DEPTH_RE.finditer(t):
        g = m.group()
        depth += 1 if g in ("{", "\\left") else -1 if g in ("}", "\\right") else 0
        if depth == 0 and m.start() < len(t) - len("\\right") - 1:
            return False
    return depth == 0


def _is_zero_sum(expr: str) -> bool:
    terms = _split_depth0(expr.strip(), (" + ", " - "))
    return all(_is_zero(t) for _, t in terms if t.strip())


def drop_zero_terms(piece: str) -> str:
    """A numeric substitution without the terms that print as zero (``+ |0.000 kN|``,
    ``0.000 kN / 10 +``): the formula above still names them. Kept whole when every term is zero or
    the piece holds a symbol."""
    body = piece.lstrip()
    lead = piece[:len(piece) - len(body)]
    if body.startswith("="):                       # a row continuing with ``&= ...``
        rest = body[1:].lstrip()
        lead, body = lead + body[:len(body) - len(rest)], rest
    if not _is_numeric(body):
        return piece
    terms = _split_depth0(body, (" + ", " - "))
    kept = [(op, t) for op, t in terms if not _is_zero(t)]
    if len(kept) == len(terms) or not kept:
        return piece
    first_op, first = kept[0]
    text = ("- " if first_op == " - " else "") + first.lstrip()
    text += "".join(op + t for op, t in kept[1:])
    return lead + text.rstrip() + body[len(body.rstrip()):]


def _drop_zero_terms_latex(latex: str) -> str:
    """:func:`drop_zero_terms` on every right-hand piece of a rendered block (rows at ``\\\\``, cells
    at ``&``, pieces at `` = `` outside braces); the left-hand side and the formula are untouched."""
    rows = _split_depth0(latex, ("\\\\",))
    out = []
    for sep, row in rows:
        cells = _split_depth0(row, ("&",))
        new_cells = []
        for k, (csep, cell) in enumerate(cells):
            if k == 0 or "\\text" in cell:
                new_cells.append(csep + cell)
                continue
            pieces = _split_depth0(cell, (" = ",))
            new_cells.append(csep + "".join(psep + drop_zero_terms(p) for psep, p in pieces))
        out.append(sep + "".join(new_cells))
    return "".join(out)


#: a name such as ``lamb_bar`` (handcalcs: ``\\lambda_{bar}``) is the code's barred symbol: ``\\bar{\\lambda}``,
#: ``lamb_bar_z`` -> ``\\bar{\\lambda}_{z}``; never "bar" as a subscript
_BAR_SUB = re.compile(r"\\(lambda|eta|chi)_\{bar(?:[_,]([A-Za-z0-9,]+))?\}")


def tex_clean(latex: str) -> str:
    """Tidy what handcalcs writes: macros LaTeX does not define (:data:`_UNDEFINED_GREEK`),
    ``abs(x)`` as ``|x|``, numbers in the units of :data:`TEX_DISPLAY_UNITS`, a double sign from substituting a
    negative number (``1 - -1.000`` -> ``1 + 1.000``, ``1 + -1.000`` -> ``1 - 1.000``) and no term that prints
    as zero in a numeric substitution (:func:`drop_zero_terms`)."""
    latex = _UNDEFINED_GREEK.sub(lambda m: m.group(1), latex)
    latex = _BAR_SUB.sub(lambda m: f"\\bar{{\\{m.group(1)}}}" + (f"_{{{m.group(2)}}}" if m.group(2) else ""), latex)
    latex = display_units(_abs_bars(latex))
    latex = _UNARY_DOUBLE.sub(r"\1", latex)
    latex = _DOUBLE_SIGN.sub(lambda m: "+ " if m.group(1) == "-" else "- ", latex)
    return _drop_zero_terms_latex(latex)


@lru_cache(maxsize=None)
def _body_source(fn: Callable) -> str:
    """The statements of ``fn`` that handcalcs renders (no docstring, no return), dedented."""
    return _body_of(fn)


def _body_of(fn: Callable) -> str:
    src = textwrap.dedent(inspect.getsource(fn))
    tree = ast.parse(src)
    fdef = tree.body[0]
    assert isinstance(fdef, (ast.FunctionDef, ast.AsyncFunctionDef))
    stmts = list(fdef.body)
    if stmts and isinstance(stmts[0], ast.Expr) and isinstance(getattr(stmts[0], "value", None), ast.Constant) \
            and isinstance(stmts[0].value.value, str):
        stmts = stmts[1:]
    lines = src.splitlines()
    keep: list[str] = []
    for st in stmts:
        if isinstance(st, ast.Return):
            continue
        seg = lines[st.lineno - 1: st.end_lineno]
        keep.extend(seg)
    return textwrap.dedent("\n".join(keep))


def quantity_args(fn: Callable, kwargs: dict[str, Any]) -> dict[str, Any]:
    """Convert float kwargs (and unit-bearing defaults) to quantities per the declared units."""
    info = fn.__clause__
    sig = inspect.signature(fn)
    bound = sig.bind(**kwargs)
    bound.apply_defaults()
    out = {}
    for name, val in bound.arguments.items():
        unit = info.units.get(name, "")
        if unit and not is_quantity(val) and isinstance(val, (int, float)):
            out[name] = to_quantity(val, unit)
        else:
            out[name] = val
    return out


#: plain argument types whose ``repr`` identifies the rendered text exactly (``-0.0`` and ``0.0``,
#: ``1`` and ``1.0`` render differently, so the key holds the type and the repr, never the value)
_PLAIN = (float, int, str, bool, type(None))
_RENDERED: dict[tuple, tuple[str, Any]] = {}
_RENDERED_MAX = 4096


def _render_key(fn: Callable, precision: int, kwargs: dict[str, Any]) -> tuple | None:
    if not all(type(v) in _PLAIN for v in kwargs.values()):
        return None
    return (fn, precision, tuple(sorted((k, type(v).__name__, repr(v)) for k, v in kwargs.items())))


def render(fn: Callable, precision: int = 3, **kwargs: Any) -> tuple[str, float]:
    """Return ``(latex, result_as_float)`` for ``fn(**kwargs)`` rendered by handcalcs.

    The searches check the same candidate with the same plain arguments more than
    once; the rendering is a pure function of ``fn``, ``precision`` and those
    arguments, so it is memoised in memory (plain float/int/str arguments and
    results only; anything else is rendered afresh). Same text, same numbers.
    """
    key = _render_key(fn, precision, kwargs)
    if key is not None:
        hit = _RENDERED.get(key)
        if hit is not None:
            return hit
    out = _render_uncached(fn, precision, kwargs)
    res = out[1]
    if key is not None and all(type(v) in _PLAIN for v in (res if isinstance(res, tuple) else (res,))):
        if len(_RENDERED) >= _RENDERED_MAX:
            _RENDERED.clear()
        _RENDERED[key] = out
    return out


@lru_cache(maxsize=None)
def _scoped(fn: Callable) -> Any:
    """innerscope's wrapper of ``fn`` (made once: building it rewrites the function's code, ~1 ms)."""
    import innerscope     # here, not at the top: plain-float runs (`splicecalc run`) never render

    return innerscope.scoped_function(fn)


def _render_uncached(fn: Callable, precision: int, kwargs: dict[str, Any]) -> tuple[str, Any]:
    qargs = quantity_args(fn, kwargs)
    scope = _scoped(fn)(**qargs)
    line_args = {"override": "", "precision": precision, "sci_not": None}
    from handcalcs.handcalcs import LatexRenderer   # imported on the first render only

    latex = LatexRenderer(_body_source(fn), scope, line_args).render()
    latex = tex_clean("".join(latex.replace("\\[", "", 1).rsplit("\\]", 1)).strip())
    result = scope.return_value
    unit = fn.__clause__.returns
    if isinstance(result, tuple):
        return latex, result
    return latex, to_float(result, unit) if unit else (float(result) if not is_quantity(result) else to_float(result, ""))
