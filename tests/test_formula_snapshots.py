"""The rendered LaTeX of every registered clause formula, for its example, against a stored snapshot.

Guards the rendering path (core/render.py, core/units.py): a change there (a cache, a
library upgrade, a refactor) must not change one character of what a calc sheet shows.
The snapshot (tests/snapshots/formula_latex.json) maps each formula to the SHA-256 of
its source and example and the LaTeX handcalcs rendered for it. A formula whose source
or example has changed since is not compared (its new text is a deliberate change); a
new formula is not in the snapshot yet. Refresh after such a change with

    SPLICECALC_UPDATE_SNAPSHOTS=1 .venv/bin/python -m pytest tests/test_formula_snapshots.py

Reference: the snapshot itself, taken before the rendering path was rewritten (issue 14).
"""

from __future__ import annotations

import hashlib
import importlib
import inspect
import json
import os
import pkgutil
from pathlib import Path

import splicecalc
from splicecalc.core.clause import REGISTRY
from splicecalc.core.record import Calc

SNAPSHOT = Path(__file__).with_name("snapshots") / "formula_latex.json"


def _formulas() -> list:
    for mod in pkgutil.walk_packages(splicecalc.__path__, "splicecalc."):
        if ".cli" in mod.name or ".report" in mod.name or ".form" in mod.name:
            continue
        importlib.import_module(mod.name)
    return sorted(set(REGISTRY), key=lambda f: f.__module__ + "." + f.__name__)


def _name(fn) -> str:
    return f"{fn.__module__}.{fn.__qualname__}"


def _stamp(fn) -> str:
    example = json.dumps(fn.__clause__.example, sort_keys=True, default=repr)
    return hashlib.sha256((inspect.getsource(fn) + "\n" + example).encode("utf-8")).hexdigest()


def _rendered(fn) -> str:
    calc = Calc(render=True)
    calc(fn, **fn.__clause__.example)
    return "\n".join(calc.latex)


def test_rendered_latex_matches_the_snapshot():
    formulas = _formulas()
    current = {_name(fn): {"stamp": _stamp(fn), "latex": _rendered(fn)} for fn in formulas}
    if os.environ.get("SPLICECALC_UPDATE_SNAPSHOTS"):
        SNAPSHOT.parent.mkdir(parents=True, exist_ok=True)
        SNAPSHOT.write_text(json.dumps(current, indent=1, sort_keys=True) + "\n", encoding="utf-8")
    stored = json.loads(SNAPSHOT.read_text(encoding="utf-8"))
    compared, differ = 0, []
    for name, now in current.items():
        old = stored.get(name)
        if old is None or old["stamp"] != now["stamp"]:
            continue                    # new or edited formula: not the rendering path's doing
        compared += 1
        if old["latex"] != now["latex"]:
            differ.append(f"{name}:\n  was {old['latex']!r}\n  now {now['latex']!r}")
    assert compared >= 10, f"only {compared} formulas left to compare: refresh the snapshot"
    assert not differ, "rendered LaTeX changed for unchanged formulas:\n" + "\n".join(differ)


def test_rendering_twice_in_one_process_gives_the_same_text():
    # the in-memory cache of core.render hands back what a first render produced
    fn = _formulas()[0]
    assert _rendered(fn) == _rendered(fn)
