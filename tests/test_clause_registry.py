"""Every registered clause formula renders with handcalcs and gives the float result.

This is the guard for "one formula, one place": the same function runs on
floats (design searches) and, converted to forallpeople quantities, through
handcalcs for the calc sheet. Both paths must agree for each formula's example.
"""

from __future__ import annotations

import importlib
import math
import pkgutil

import pytest

import splicecalc
from splicecalc.core.clause import CITATION_RE, REGISTRY
from splicecalc.core.record import Calc


def _import_all() -> None:
    for mod in pkgutil.walk_packages(splicecalc.__path__, "splicecalc."):
        if ".cli" in mod.name or ".report" in mod.name:
            continue
        importlib.import_module(mod.name)


_import_all()
FORMULAS = sorted(set(REGISTRY), key=lambda f: f.__module__ + "." + f.__name__)


def test_registry_is_populated():
    # the package has clause formulas in several code parts
    assert len(FORMULAS) >= 10


@pytest.mark.parametrize("fn", FORMULAS, ids=lambda f: f.__module__.split(".", 1)[1] + "." + f.__name__)
def test_formula_renders_same_number(fn):
    info = fn.__clause__
    assert CITATION_RE.match(info.citation), info.citation
    assert info.example, f"{fn.__name__}: @clause needs example= for this test"
    plain = fn(**info.example)
    calc = Calc(render=True)
    rendered = calc(fn, **info.example)
    assert calc.latex and calc.latex[0].strip(), "no LaTeX produced"
    if isinstance(plain, tuple):
        return
    assert math.isclose(float(plain), float(rendered), rel_tol=1e-9, abs_tol=1e-9), (plain, rendered)
