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

import innerscope
from handcalcs.handcalcs import LatexRenderer

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


def display_units(latex: str) -> str:
    """Numbers with units in the rendered text put in the units of :data:`TEX_DISPLAY_UNITS`."""
    def repl(m: re.Match) -> str:
        unit, power = TEX_DISPLAY_UNITS[m.group(2)]
        return f"{_shift(m.group(1), power)}\\ {unit}"
    return _UNIT_RE.sub(repl, latex)


def tex_clean(latex: str) -> str:
    """Tidy what handcalcs writes: macros LaTeX does not define (:data:`_UNDEFINED_GREEK`),
    ``abs(x)`` as ``|x|``, numbers in the units of :data:`TEX_DISPLAY_UNITS`, and a double sign from substituting a negative number
    (``1 - -1.000`` -> ``1 + 1.000``, ``1 + -1.000`` -> ``1 - 1.000``)."""
    latex = _UNDEFINED_GREEK.sub(lambda m: m.group(1), latex)
    latex = display_units(_abs_bars(latex))
    latex = _UNARY_DOUBLE.sub(r"\1", latex)
    return _DOUBLE_SIGN.sub(lambda m: "+ " if m.group(1) == "-" else "- ", latex)


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
    return innerscope.scoped_function(fn)


def _render_uncached(fn: Callable, precision: int, kwargs: dict[str, Any]) -> tuple[str, Any]:
    qargs = quantity_args(fn, kwargs)
    scope = _scoped(fn)(**qargs)
    line_args = {"override": "", "precision": precision, "sci_not": None}
    latex = LatexRenderer(_body_source(fn), scope, line_args).render()
    latex = tex_clean("".join(latex.replace("\\[", "", 1).rsplit("\\]", 1)).strip())
    result = scope.return_value
    unit = fn.__clause__.returns
    if isinstance(result, tuple):
        return latex, result
    return latex, to_float(result, unit) if unit else (float(result) if not is_quantity(result) else to_float(result, ""))
