"""nbconvert exporter for splicecalc calc packages (``--to Calc_package_PDF``).

``CalcPackageExporter`` is nbconvert's PDF exporter with our own LaTeX
template (``latex/calcpackage``): A4 sheets with a title block on every page,
cover sheet, contents, code inputs hidden, check outputs laid out from their
JSON data (see :mod:`splicecalc.report.display`), handcalcs equations split
into page-breakable rows (:func:`splicecalc.report.latexfix.break_handcalcs`),
and XeLaTeX run as many passes as "Sheet N of M" and the contents need.

Command line: ``jupyter nbconvert --to Calc_package_PDF calc.ipynb`` (the
notebook must already be executed; :func:`splicecalc.report.build.build_pdf`
executes and writes atomically).
"""

from __future__ import annotations

import tempfile
from pathlib import Path
from typing import Any

from nbconvert.exporters import LatexExporter, PDFExporter
from nbconvert.preprocessors import Preprocessor
from traitlets import Any as AnyTrait, Bool, Unicode, default
from traitlets.config import Config

from ..core.errors import InputError
from .compile import require_tool, run_xelatex, save_seed
from .display import DISPLAY_PRIORITY
from .errors import CalcBuildError
from .figures import fill_figures
from .latexfix import break_handcalcs
from .latexout import (check_latex, escape_tex, full_texts_latex, prose_symbols_tex, review_latex, table_latex,
                       verbatim_text)
from .liveonly import LiveOnlyOutputsPreprocessor, StaleInputsPreprocessor
from .metadata import calc_metadata, provenance

#: folder holding our nbconvert template(s)
LATEX_DIR = Path(__file__).with_name("latex")
TEMPLATE_NAME = "calcpackage"


def _signoff_state(nb: Any) -> tuple[str, list[dict]] | None:
    """(status label, signatures valid for the current digest) from the sign-off ledger, if signed."""
    try:
        from ..signoff.ledger import status_of
    except ImportError:
        return None
    if not nb.metadata.get("splicecalc", {}).get("signatures"):
        return None
    st = status_of(nb)
    valid = [dict(role=s.role, name=s.name, date=s.date, digest=s.digest)
             for s in st.signatures if s.digest == st.current_digest]
    return st.label, valid


class RefuseErrorsPreprocessor(Preprocessor):
    """A calc package is never printed from a notebook whose cells raised."""

    enabled = Bool(True).tag(config=True)

    def preprocess(self, nb: Any, resources: Any) -> tuple[Any, Any]:
        code_no = 0
        for i, cell in enumerate(nb.cells, start=1):
            if cell.cell_type != "code":
                continue
            code_no += 1
            for out in cell.get("outputs", []):
                if out.get("output_type") == "error":
                    first = next((ln for ln in cell.source.splitlines() if ln.strip()), "")
                    raise CalcBuildError(f"cell {i} holds an error output ({out.get('ename')}: "
                                         f"{out.get('evalue')}; first line {first!r}); re-run the notebook")
        return nb, resources


class FigurePreprocessor(Preprocessor):
    """Figure outputs printed as data only (:data:`~splicecalc.report.figures.FIGURE_MIME`) get their
    PDF, drawn here (:func:`~splicecalc.report.figures.fill_figures`); a figure that cannot be drawn
    stops the export naming its cell."""

    enabled = Bool(True).tag(config=True)

    def preprocess(self, nb: Any, resources: Any) -> tuple[Any, Any]:
        fill_figures(nb)
        return nb, resources


class ChangeMarkPreprocessor(Preprocessor):
    """Change marks against the previous issued revision (``resources["previous"]``: its ``revision``,
    its executed ``notebook`` as a dict and a ``name``; given by the build, see
    :mod:`splicecalc.signoff.previous`). Each output printed differently from that revision
    (:func:`splicecalc.review.compare.changed_outputs`) is listed in its cell's metadata
    (``splicecalc_changed``: output indices), which the template wraps in the change marks; the
    comparison (:func:`~splicecalc.review.compare.comparison_latex`) becomes the package's last
    section. Runs after the outputs only for Jupyter are dropped, so the indices are the printed ones."""

    enabled = Bool(True).tag(config=True)

    def preprocess(self, nb: Any, resources: Any) -> tuple[Any, Any]:
        prev = resources.get("previous")
        calc = resources.get("calc")
        if not prev or not isinstance(calc, dict):
            return nb, resources
        from ..review.compare import changed_outputs, compare_revisions, comparison_latex

        old = prev["notebook"]
        changed = changed_outputs(old, nb)
        for ci, oi in changed:
            nb.cells[ci].metadata.setdefault("splicecalc_changed", []).append(oi)
        name = prev.get("new_name") or resources.get("metadata", {}).get("name", "") or "this package"
        since = str(prev.get("revision", "") or "-")
        heading = f"Changes since issued revision {since}"
        try:
            c = compare_revisions(old, nb, old_name=str(prev.get("name", "previous")), new_name=str(name))
            latex = comparison_latex(c, heading=heading)
        except InputError as err:       # a notebook that publishes no job inputs: the marks still stand
            latex = "\n".join([r"\clearpage", r"\section{" + escape_tex(heading) + "}", r"\label{calc-changes}",
                                r"{\small " + escape_tex(f"No comparison of inputs and checks: {err}") + r"\par}", ""])
        calc["changes"] = {"since": since, "outputs": len(changed), "latex": latex}
        return nb, resources


class CalcPackageExporter(PDFExporter):
    """PDF calc package: our LaTeX template, XeLaTeX, title block on every sheet."""

    #: JupyterLab and Notebook 7 label the export menu with the entry-point name (pyproject.toml:
    #: ``Calc_package_PDF``, capitalised), not with this attribute, which older front ends read
    export_from_notebook = "Calc package (PDF)"
    #: show a tqdm bar over the LaTeX passes (stderr)
    progress = Bool(False, help="Show a progress bar over the LaTeX passes").tag(config=True)
    #: keep the .tex/.log here (a fresh temporary folder when empty)
    build_directory = Unicode("", help="Folder for the .tex, .log and figures").tag(config=True)
    #: the previous build's .aux/.toc/.out, kept per output name (empty: every build starts from nothing)
    seed_directory = Unicode("", help="Folder keeping the previous build's .aux, .toc and .out to seed "
                                      "the next one (see splicecalc.report.compile)").tag(config=True)
    #: predict the contents list before a first XeLaTeX pass from nothing (two passes instead of three;
    #: splicecalc.report.compile.predicted_toc). False: the plain passes, three for a fresh package
    #: as nbconvert's own PDFExporter runs (``latex_count``); benchmarks/bench_report.py's stock route
    predict_contents = Bool(True, help="Predict the contents list before the first XeLaTeX pass "
                                       "(False: plain passes from nothing)").tag(config=True)
    #: pandoc conversions a build started early (:class:`~splicecalc.report.pandocwork.PandocWork`);
    #: None: nbconvert's ``convert_pandoc`` as it stands
    pandoc_work = AnyTrait(None, allow_none=True, help="convert_pandoc with conversions started early")
    exclude_input = Bool(True, help="Hide code cell inputs").tag(config=True)
    exclude_input_prompt = Bool(True).tag(config=True)
    exclude_output_prompt = Bool(True).tag(config=True)
    #: validate the notebook once after all preprocessors (nbconvert's option) rather than after each
    optimistic_validation = Bool(True).tag(config=True)

    @default("template_name")
    def _template_name_default(self) -> str:
        return TEMPLATE_NAME

    @default("extra_template_basedirs")
    def _default_extra_template_basedirs(self) -> list[str]:
        return [str(LATEX_DIR)]

    @property
    def default_config(self) -> Config:
        c = Config({
            "NbConvertBase": {"display_data_priority": list(DISPLAY_PRIORITY)},
            "ExtractOutputPreprocessor": {"enabled": True},
            "ExtractAttachmentsPreprocessor": {"enabled": True},
            "SVG2PDFPreprocessor": {"enabled": False},
        })
        base = super().default_config.copy()
        base.merge(c)
        return base

    @default("default_preprocessors")
    def _default_preprocessors_default(self) -> list[Any]:
        # ours run after nbconvert's execution (``--execute``) and before outputs are extracted to files
        base = list(PDFExporter.class_traits()["default_preprocessors"].default())
        at = next((i for i, p in enumerate(base) if "ExtractOutputPreprocessor" in str(p)), len(base))
        return base[:at] + [RefuseErrorsPreprocessor, StaleInputsPreprocessor, LiveOnlyOutputsPreprocessor,
                            FigurePreprocessor, ChangeMarkPreprocessor] + base[at:]

    def default_filters(self):  # type: ignore[override]
        yield from super().default_filters()
        yield ("calc_check_latex", check_latex)
        yield ("calc_table_latex", table_latex)
        yield ("calc_review_latex", review_latex)
        yield ("calc_symbols", prose_symbols_tex)
        yield ("calc_full_texts", full_texts_latex)
        # user text in the title block, cover and sign-off: the one escaping function (replaces
        # nbconvert's escape_latex, which leaves control characters and long runs as they are)
        yield ("escape_latex", escape_tex)
        yield ("calc_verbatim", verbatim_text)
        yield ("convert_pandoc", self._convert_pandoc)

    def _convert_pandoc(self, source: str, from_format: str, to_format: str, extra_args: Any = None) -> str:
        """nbconvert's ``convert_pandoc``, answered from :attr:`pandoc_work` when a build started it early."""
        if self.pandoc_work is not None:
            return self.pandoc_work(source, from_format, to_format, extra_args)
        from nbconvert.filters import convert_pandoc

        return convert_pandoc(source, from_format, to_format, extra_args)

    # ------------------------------------------------------------------ LaTeX
    def to_latex(self, nb: Any, resources: dict | None = None, **kw: Any) -> tuple[str, dict]:
        """The LaTeX source of the calc package (no compilation)."""
        require_tool("pandoc")
        resources = dict(resources or {})
        name = resources.get("metadata", {}).get("name", "") or "Calculation"
        resources["calc"] = calc_metadata(nb.metadata, default_title=name, signoff=_signoff_state(nb))
        resources["calc"]["provenance"] = provenance(nb, resources.get("metadata", {}).get("path"))
        if resources.get("changes_note"):
            resources["calc"]["changes_note"] = str(resources["changes_note"])
        latex, resources = LatexExporter.from_notebook_node(self, nb, resources=resources, **kw)
        return break_handcalcs(latex), resources

    def from_notebook_node(self, nb: Any, resources: dict | None = None, **kw: Any) -> tuple[bytes, dict]:
        """Notebook -> PDF bytes; ``resources["latex_run"]`` has the passes, timings and log."""
        latex, resources = self.to_latex(nb, resources, **kw)
        return self.compile(latex, resources)

    def compile(self, latex: str, resources: dict) -> tuple[bytes, dict]:
        """The LaTeX of :meth:`to_latex` (and its output files in ``resources``) -> PDF bytes."""
        if self.build_directory:
            workdir = Path(self.build_directory)
            workdir.mkdir(parents=True, exist_ok=True)
            return self._compile(latex, resources, workdir)
        with tempfile.TemporaryDirectory(prefix="splicecalc-tex-") as td:
            return self._compile(latex, resources, Path(td))

    def _compile(self, latex: str, resources: dict, workdir: Path) -> tuple[bytes, dict]:
        stem = "calc"
        try:
            (workdir / f"{stem}.tex").write_text(latex, encoding="utf-8")
            for fname, data in (resources.get("outputs") or {}).items():
                target = workdir / fname
                target.parent.mkdir(parents=True, exist_ok=True)
                target.write_bytes(data if isinstance(data, bytes) else str(data).encode())
        except OSError as err:      # a full disk or a read-only folder: name the build folder
            raise OSError(err.errno, err.strerror, str(workdir)) from None
        seed = Path(self.seed_directory) if self.seed_directory else None
        run = run_xelatex(workdir / f"{stem}.tex", progress=self.progress, seed_dir=seed,
                          predict_toc=self.predict_contents)
        if seed is not None:
            save_seed(seed, workdir / f"{stem}.tex", run.pages)
        pdf = run.pdf_path.read_bytes()
        resources["latex_run"] = run
        resources["output_extension"] = ".pdf"
        resources.pop("outputs", None)
        resources.pop("attachments", None)
        return pdf, resources


class ComparisonExporter(CalcPackageExporter):
    """The comparison of two revisions as a short PDF on the package's sheets (template
    ``calcpackage/comparison.tex.j2``): the notebook given is an empty one carrying the new
    revision's title block, ``resources["comparison"]`` the LaTeX of
    :func:`splicecalc.review.compare.comparison_latex`."""

    export_from_notebook = None  # type: ignore[assignment]

    @default("template_file")
    def _template_file_default(self) -> str:
        return "comparison.tex.j2"


__all__ = ["CalcPackageExporter", "ChangeMarkPreprocessor", "ComparisonExporter", "LATEX_DIR", "TEMPLATE_NAME"]
