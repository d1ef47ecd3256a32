"""Warm the caches once after installing: ``python -m splicecalc.cli.warm``.

Renders every registered clause formula with its example, which fills the
per-line parse cache (``~/.cache/splicecalc``, see splicecalc.core.render) the
way ``compileall`` fills ``__pycache__``: later calc builds skip handcalcs'
grammar work for lines they share. It doubles as a smoke test: it exits 1
naming any formula that no longer renders. With pandoc installed it also
converts the templates' prose (markdown cells) once into the pandoc cache of
:mod:`splicecalc.report.prefetch`.
"""

from __future__ import annotations

import importlib
import pkgutil
import sys


def main() -> int:
    import splicecalc
    from splicecalc.core.clause import REGISTRY
    from splicecalc.core.record import Calc

    for mod in pkgutil.walk_packages(splicecalc.__path__, "splicecalc."):
        if mod.name.startswith(("splicecalc.cli", "splicecalc.report", "splicecalc.form")):
            continue
        importlib.import_module(mod.name)
    failed = []
    for fn in REGISTRY:
        try:
            Calc(render=True)(fn, **fn.__clause__.example)
        except Exception as exc:  # noqa: BLE001 - reported, not hidden
            failed.append(f"{fn.__module__}.{fn.__name__}: {type(exc).__name__}: {exc}")
    print(f"splicecalc: rendered {len(REGISTRY) - len(failed)} of {len(REGISTRY)} clause formulas", file=sys.stderr)
    for line in failed:
        print(f"  failed: {line}", file=sys.stderr)
    try:
        _warm_template_prose()
    except Exception as exc:  # noqa: BLE001 - a cold pandoc cache only costs speed
        print(f"splicecalc: warning: the templates' prose was not converted in advance ({type(exc).__name__}: "
              f"{exc}); the first build converts it", file=sys.stderr)
    return 1 if failed else 0


def _warm_template_prose() -> None:
    """Convert the markdown cells of every template into the pandoc cache (nothing to do without pandoc)."""
    import shutil

    if shutil.which("pandoc") is None:
        return
    import nbformat

    from splicecalc.report.prefetch import PandocPrefetch, pandoc_pool
    from splicecalc.workflow.package import TEMPLATES, template_path

    pool = pandoc_pool()
    try:
        for name in TEMPLATES:
            path = template_path(name)
            prefetch = PandocPrefetch(pool, str(path.parent))
            prefetch.add_cells(c for c in nbformat.read(path, as_version=4).cells if c.cell_type == "markdown")
            prefetch.wait()
            prefetch.save_cache()
    finally:
        pool.shutdown()


if __name__ == "__main__":
    sys.exit(main())
