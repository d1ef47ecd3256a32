"""The speed-ups of rendering and export give the same text and numbers as the plain paths."""

from __future__ import annotations

import shutil

import nbformat
import pytest

from splicecalc.core import render
from splicecalc.core.units import to_quantity
from splicecalc.joints.bolts import F_v_Rd


def test_render_memo_same_as_uncached():
    kw = dict(alpha_v=0.6, f_ub=800.0, A_s=245.0, gamma_M2=1.25)
    first = render.render(F_v_Rd, precision=3, **kw)
    assert first == render._render_uncached(F_v_Rd, 3, kw)
    assert render.render(F_v_Rd, precision=3, **kw) == first           # memoised answer, same text
    assert render.render(F_v_Rd, precision=2, **kw) == render._render_uncached(F_v_Rd, 2, kw)


def test_render_key_tells_types_and_signed_zero_apart():
    a = render._render_key(F_v_Rd, 3, {"A_s": 0.0})
    assert a != render._render_key(F_v_Rd, 3, {"A_s": -0.0})
    assert render._render_key(F_v_Rd, 3, {"A_s": 1}) != render._render_key(F_v_Rd, 3, {"A_s": 1.0})
    assert render._render_key(F_v_Rd, 3, {"A_s": to_quantity(1.0, "mm2")}) is None   # rendered afresh


def test_forallpeople_getters_are_stable():
    import forallpeople as si

    env = si.environment
    assert env.units_by_factor is env.units_by_factor
    assert env.units_by_dimension() is env._units_by_dimension
    assert repr(to_quantity(94080.0, "N")) == repr(to_quantity(94080.0, "N"))


@pytest.mark.skipif(shutil.which("pandoc") is None, reason="pandoc not installed")
def test_pandoc_prefetch_gives_the_same_latex(tmp_path, monkeypatch):
    monkeypatch.setenv("XDG_CACHE_HOME", str(tmp_path / "cache"))       # a cache of our own, empty at first
    from contextlib import contextmanager

    from splicecalc.report import exporter, prefetch

    def md(text):
        return nbformat.v4.new_output("display_data", data={"text/markdown": text, "text/plain": "r"})

    nb = nbformat.v4.new_notebook()
    nb.cells = [nbformat.v4.new_markdown_cell("# Scope\n\nA *beam* with $M_{Ed}$ and a list:\n\n- one\n- two"),
                nbformat.v4.new_code_cell("x = 1", outputs=[md("**Result.** $u = 0.5$")]),
                # several markdown outputs of one cell: converted in one pandoc call (headings all different)
                nbformat.v4.new_code_cell("y = 2", outputs=[
                    md("# Splice S1 at x = 3.500 m"), md("*Caption with $I_y$ and 5 % slope.*"),
                    md("**Notes**\n\n- first note, M_c,Rd <= 1.0\n- second note"), md("Plain text after a list."),
                    md("# Splice S2 at x = 7.000 m"), md("**Notes**\n\n- first note, M_c,Rd <= 1.0\n- second note")]),
                # two equal headings in one cell: one call each (labels would differ in one document)
                nbformat.v4.new_code_cell("z = 3", outputs=[md("## Existing member"), md("## Existing member"),
                                                            md("Torsion $T = 1.46$ kNm")]),
                nbformat.v4.new_markdown_cell("## Scope\n\nSame heading again.")]
    res = {"metadata": {"name": "t", "path": str(tmp_path)}}
    fast, _ = exporter.CalcPackageExporter().to_latex(nb, dict(res))      # fills the cache of markdown cells
    cached, _ = exporter.CalcPackageExporter().to_latex(nb, dict(res))    # answers markdown cells from it

    @contextmanager
    def plain(*_a):
        yield                      # every pandoc call made by the template itself

    orig, prefetch.PandocPrefetch.installed = prefetch.PandocPrefetch.installed, plain
    try:
        slow, _ = exporter.CalcPackageExporter().to_latex(nb, dict(res))
    finally:
        prefetch.PandocPrefetch.installed = orig
    assert fast == slow == cached
    assert "Splice S2 at x = 7.000 m" in fast and "SPLICECALCBREAK" not in fast


def test_an_edited_formula_is_never_rendered_from_the_cache(tmp_path):
    # the rendered body of a formula is cached across processes; a same-size edit that keeps the
    # file's modification time (cp -p, rsync -a, reproducible builds) must still be seen
    import os
    import subprocess
    import sys
    import textwrap

    src = textwrap.dedent('''
        from splicecalc.core.clause import clause

        @clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"f_ub": "MPa", "A_s": "mm2"}, returns="kN",
                example=dict(alpha_v=0.6, f_ub=800.0, A_s=245.0, gamma_M2=1.25))
        def F_x(alpha_v: float, f_ub: float, A_s: float, gamma_M2: float) -> float:
            """Test formula."""
            F = 1.0 * alpha_v * f_ub * A_s / gamma_M2
            return F
        ''')
    mod = tmp_path / "modx.py"
    mod.write_text(src)
    run = ("import sys; sys.path.insert(0, sys.argv[1]); import modx; from splicecalc.core.render import render; "
           "print(render(modx.F_x, **modx.F_x.__clause__.example)[0])")
    env = {**os.environ, "XDG_CACHE_HOME": str(tmp_path / "cache")}

    def latex() -> str:
        return subprocess.run([sys.executable, "-c", run, str(tmp_path)], capture_output=True, text=True, env=env,
                              check=True).stdout

    assert "1.0 \\cdot 0.600" in latex()
    st = os.stat(mod)
    mod.write_text(src.replace("1.0 *", "0.5 *"))                     # same size
    os.utime(mod, ns=(st.st_atime_ns, st.st_mtime_ns))                 # same time stamp
    out = latex()
    assert "0.5 \\cdot 0.600" in out and "47.040" in out               # 0.5 x 0.6 x 800 x 245 / 1.25 N = 47.04 kN


@pytest.mark.skipif(shutil.which("pandoc") is None, reason="pandoc not installed")
@pytest.mark.parametrize("blocks", [
    ["## Splice S1: bolts", "## Splice S1 bolts", "plain text"],        # different headings, same label
    ["## End plate A", "See [End plate A] for the bolts.", "more"],     # implicit link to a heading
    ["See [the guide][g].", "[g]: https://example.com", "more"],        # reference defined in another block
    ["Text[^1]\n\n[^1]: first note", "More[^1]\n\n[^1]: second note"],  # footnotes with the same label
    ["Bolts\n-----", "Bolts\n-----", "**Bolts** are M20"],               # setext headings
    ["**Result.** $u = 0.5$", "- a\n- b", "*caption*", "Plain."],       # batched: no context between them
])
def test_batched_markdown_outputs_equal_one_call_each(blocks):
    # pandoc's own output, one call per block, is the reference (it is what the template would get)
    import nbconvert.filters.pandoc as fp

    from splicecalc.report.prefetch import MD_FORMAT, PandocPrefetch, pandoc_pool

    cell = nbformat.v4.new_code_cell("x", outputs=[nbformat.v4.new_output(
        "display_data", data={"text/markdown": b, "text/plain": b}) for b in blocks])
    pool = pandoc_pool()
    try:
        pre = PandocPrefetch(pool, "", use_cache=False)
        pre.add_cells([cell])
        pre.wait()
    finally:
        pool.shutdown()
    for b in blocks:
        assert pre._done[(b, MD_FORMAT, "latex", ())] == fp.pandoc(b, MD_FORMAT, "latex", extra_args=[])
