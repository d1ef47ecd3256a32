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
import atexit
import copy
import hashlib
import inspect
import os
import pickle
import re
import textwrap
from collections import deque
from functools import lru_cache
from itertools import islice
from pathlib import Path
from typing import Any, Callable

import handcalcs.handcalcs as _hc
import innerscope
from handcalcs.handcalcs import LatexRenderer

from .files import write_atomic
from .units import is_quantity, to_float, to_quantity


# Two speed patches of handcalcs internals (same output; pinned handcalcs < 2 for them):
# handcalcs rebuilds its pyparsing grammar and re-parses every source line on every render; the
# lines of a clause function never change, so the parse is memoised per line (a deep copy is
# handed out because handcalcs mutates the deques it gets), in memory and in a small pickle in
# the user's cache folder so that a fresh kernel does not parse again. Same output, faster.
_expr_parser_uncached = _hc.expr_parser
_PARSED: dict[str, object] = {}
_PARSE_STATE = {"loaded": False, "dirty": False}


def _parse_cache_file() -> Path:
    import handcalcs

    base = Path(os.environ.get("XDG_CACHE_HOME") or Path.home() / ".cache")
    return base / "splicecalc" / f"handcalcs-{getattr(handcalcs, '__version__', 'x')}-lines.pickle"


def _load_parse_cache() -> None:
    _PARSE_STATE["loaded"] = True
    try:
        with open(_parse_cache_file(), "rb") as fh:
            data = pickle.load(fh)
        if isinstance(data, dict):
            # line parses (keyed by the line) and formula bodies (keyed by ("body", file, name));
            # anything else is left over from an older layout and dropped
            _PARSED.update((k, v) for k, v in data.items()
                           if isinstance(k, str) or (isinstance(k, tuple) and len(k) == 3 and k[0] == "body"))
    except (OSError, ValueError, EOFError, pickle.UnpicklingError, AttributeError, ImportError):
        pass  # no cache yet, or an unreadable one: parse afresh


@atexit.register
def _save_parse_cache() -> None:
    if not _PARSE_STATE["dirty"]:
        return
    try:
        path = _parse_cache_file()
        path.parent.mkdir(parents=True, exist_ok=True)
        write_atomic(path, pickle.dumps(_PARSED, protocol=pickle.HIGHEST_PROTOCOL))
    except OSError:
        pass  # a read-only home only costs speed


def _fresh(parsed: Any) -> Any:
    """A copy of a parse result (nested deques of strings) for handcalcs to mutate.

    Four times faster than :func:`copy.deepcopy` for these; anything else is deep-copied.
    """
    if type(parsed) is deque:
        return deque(_fresh(p) for p in parsed)
    if type(parsed) is str:
        return parsed
    return copy.deepcopy(parsed)


def _expr_parser_memo(line: str):
    if not _PARSE_STATE["loaded"]:
        _load_parse_cache()
    parsed = _PARSED.get(line)
    if parsed is None:
        parsed = _PARSED[line] = _expr_parser_uncached(line)
        _PARSE_STATE["dirty"] = True
    return _fresh(parsed)


_hc.expr_parser = _expr_parser_memo


def _get_function_name(d: deque) -> str:
    """handcalcs' ``get_function_name`` without its deep copy (called ~15 times per rendered line).

    The original deep-copies ``d`` only to drop its first item before a test that
    reads ``len``, the first two and the last item; a shallow slice gives the same
    answer. An empty deque raises IndexError, as the original does.
    """
    if not d:
        raise IndexError("pop from an empty deque")
    if _hc.test_for_function_name(d):
        return d[0]
    rest = deque(islice(d, 1, None))
    if _hc.test_for_function_name(rest):
        return rest[0]
    return ""


_hc.get_function_name = _get_function_name

#: capital Greek letters that look like Latin ones have no LaTeX macro; handcalcs still writes
#: them for names such as ``gamma_Mu`` (-> ``\gamma_{\Mu}``). They are put back as the letters typed.
_UNDEFINED_GREEK = re.compile(r"\\(Alpha|Beta|Epsilon|Zeta|Eta|Iota|Kappa|Mu|Nu|Omicron|Rho|Tau|Chi)(?![A-Za-z])")


def tex_clean(latex: str) -> str:
    """Replace macros handcalcs writes that LaTeX does not define (see :data:`_UNDEFINED_GREEK`)."""
    return _UNDEFINED_GREEK.sub(lambda m: m.group(1), latex)


@lru_cache(maxsize=None)
def _file_digest(path: str) -> str | None:
    """SHA-256 of a source file's bytes (None when it cannot be read)."""
    try:
        return hashlib.sha256(Path(path).read_bytes()).hexdigest()
    except OSError:
        return None


@lru_cache(maxsize=None)
def _body_source(fn: Callable) -> str:
    """The statements of ``fn`` that handcalcs renders (no docstring, no return), dedented.

    Remembered with the line parses, one entry per function, under the SHA-256 of its
    source file's bytes and its first line, so that a fresh kernel does not tokenize
    every formula module again; any edit to the file (whatever its size or time
    stamp) makes the entry miss and the body is read afresh.
    """
    code = getattr(fn, "__code__", None)
    digest = _file_digest(code.co_filename) if code is not None else None
    if digest is None:
        return _body_of(fn)
    if not _PARSE_STATE["loaded"]:
        _load_parse_cache()
    key = ("body", code.co_filename, fn.__qualname__)
    stamp = (digest, code.co_firstlineno)
    hit = _PARSED.get(key)
    if isinstance(hit, tuple) and len(hit) == 2 and hit[0] == stamp and isinstance(hit[1], str):
        return hit[1]
    body = _body_of(fn)
    _PARSED[key] = (stamp, body)
    _PARSE_STATE["dirty"] = True
    return body


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
