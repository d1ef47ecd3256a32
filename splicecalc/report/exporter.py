"""nbconvert exporter for splicecalc calc packages (``--to splicecalc_pdf``).

``CalcPackageExporter`` is nbconvert's PDF exporter with our own LaTeX
template (``latex/calcpackage``): A4 sheets with a title block on every page,
cover sheet, contents, code inputs hidden, check outputs laid out from their
JSON data (see :mod:`splicecalc.report.display`), handcalcs equations split
into page-breakable rows (:func:`splicecalc.report.latexfix.break_handcalcs`),
and XeLaTeX run as many passes as "Sheet N of M" and the contents need.

Command line: ``jupyter nbconvert --to splicecalc_pdf calc.ipynb`` (the
notebook must already be executed; :func:`splicecalc.report.build.build_pdf`
executes and writes atomically).
"""

from __future__ import annotations

import os
import tempfile
from concurrent.futures import ThreadPoolExecutor
from contextlib import contextmanager
from pathlib import Path
from typing import Any

from nbconvert.exporters import LatexExporter, PDFExporter
from nbconvert.preprocessors import Preprocessor
from traitlets import Bool, Unicode, default
from traitlets.config import Config

from .compile import require_tool, run_xelatex
from .display import CHECK_MIME, TABLE_MIME
from .errors import CalcBuildError
from .latexfix import break_handcalcs
from .latexout import check_latex, table_latex
from .metadata import calc_metadata

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


#: pandoc reader of the template's markdown blocks (``data_markdown`` and the first step of ``markdowncell``)
_MD_FORMAT = "markdown+tex_math_double_backslash"


def _pandoc_jobs(nb: Any, priority: list[str]) -> list[tuple[str, str, str, tuple[str, ...]]]:
    """The pandoc calls the template will make whose input is known beforehand: (source, from, to, args).

    Markdown outputs shown as markdown (no richer MIME type ahead of ``text/markdown``
    in ``priority``) go to LaTeX; markdown cells go to pandoc's JSON first. The
    sources pass through the same filters as in the template.
    """
    from nbconvert.filters import citation2latex, strip_files_prefix

    rank = {m: i for i, m in enumerate(priority)}
    jobs = []
    for cell in nb.cells:
        if cell.cell_type == "markdown" and cell.source:
            jobs.append((strip_files_prefix(citation2latex(cell.source)), _MD_FORMAT, "json", ()))
        for out in cell.get("outputs", []):
            data = out.get("data", {})
            md = data.get("text/markdown")
            if md is None or out.get("output_type") not in ("display_data", "execute_result"):
                continue
            if min((rank.get(m, len(rank)) for m in data), default=len(rank)) == rank.get("text/markdown"):
                jobs.append((strip_files_prefix(citation2latex(md)), _MD_FORMAT, "latex", ()))
    return jobs


@contextmanager
def _pandoc_prefetched(nb: Any, priority: list[str], nb_path: str = ""):
    """Run the template's foreseeable pandoc calls side by side, then answer them from memory.

    Each markdown block is one pandoc process (~20 ms, mostly start-up); the
    template asks for them one after another. The same calls, with the same
    arguments, are made beforehand in a few threads and their output handed back
    when the template asks; any other call runs as before. Same text out.
    A markdown cell's second call (JSON -> LaTeX) is foreseen through the
    template's own filters, with ``nb_path`` as nbconvert's LaTeX exporter sets it.
    """
    import nbconvert.filters.pandoc as fp
    from nbconvert.filters.filter_links import resolve_references

    original = fp.pandoc
    relative = fp.ConvertExplicitlyRelativePaths(texinputs=os.path.abspath(nb_path) if nb_path else os.getcwd())
    jobs = list(dict.fromkeys(_pandoc_jobs(nb, priority)))
    done: dict[tuple, str] = {}

    def one(job: tuple) -> None:
        src, fmt, to, args = job
        try:
            out = done[job] = original(src, fmt, to, extra_args=list(args))
            if to == "json":
                second = relative(resolve_references(out))
                done[(second, "json", "latex", ())] = original(second, "json", "latex")
        except Exception:  # noqa: BLE001 - the template's own call reports it
            pass

    if len(jobs) > 1:
        with ThreadPoolExecutor(max_workers=min(8, 2 * (os.cpu_count() or 1))) as pool:
            list(pool.map(one, jobs))

    def memo(source: str, fmt: str, to: str, extra_args: Any = None, encoding: str = "utf-8") -> str:
        hit = done.get((source, fmt, to, tuple(extra_args or ()))) if encoding == "utf-8" else None
        return hit if hit is not None else original(source, fmt, to, extra_args=extra_args, encoding=encoding)

    fp.pandoc = memo
    try:
        yield
    finally:
        fp.pandoc = original


class RefuseErrorsPreprocessor(Preprocessor):
    """A calc package is never printed from a notebook whose cells raised."""

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


class CalcPackageExporter(PDFExporter):
    """PDF calc package: our LaTeX template, XeLaTeX, title block on every sheet."""

    export_from_notebook = "splicecalc calc package (PDF)"
    #: show a tqdm bar over the LaTeX passes (stderr)
    progress = Bool(False, help="Show a progress bar over the LaTeX passes").tag(config=True)
    #: keep the .tex/.log here (a fresh temporary folder when empty)
    build_directory = Unicode("", help="Folder for the .tex, .log and figures").tag(config=True)
    exclude_input = Bool(True, help="Hide code cell inputs").tag(config=True)
    exclude_input_prompt = Bool(True).tag(config=True)
    exclude_output_prompt = Bool(True).tag(config=True)

    @default("template_name")
    def _template_name_default(self) -> str:
        return TEMPLATE_NAME

    @default("extra_template_basedirs")
    def _default_extra_template_basedirs(self) -> list[str]:
        return [str(LATEX_DIR)]

    @property
    def default_config(self) -> Config:
        c = Config({
            "NbConvertBase": {
                "display_data_priority": [
                    CHECK_MIME, TABLE_MIME, "text/latex", "application/pdf", "image/png",
                    "image/jpeg", "text/markdown", "text/plain",
                ]
            },
            "ExtractOutputPreprocessor": {"enabled": True},
            "ExtractAttachmentsPreprocessor": {"enabled": True},
            "SVG2PDFPreprocessor": {"enabled": False},
        })
        base = super().default_config.copy()
        base.merge(c)
        return base

    def __init__(self, *args: Any, **kwargs: Any) -> None:
        super().__init__(*args, **kwargs)
        self.register_preprocessor(RefuseErrorsPreprocessor(), enabled=True)

    def default_filters(self):  # type: ignore[override]
        yield from super().default_filters()
        yield ("calc_check_latex", check_latex)
        yield ("calc_table_latex", table_latex)

    # ------------------------------------------------------------------ LaTeX
    def to_latex(self, nb: Any, resources: dict | None = None, **kw: Any) -> tuple[str, dict]:
        """The LaTeX source of the calc package (no compilation)."""
        require_tool("pandoc")
        resources = dict(resources or {})
        name = resources.get("metadata", {}).get("name", "") or "Calculation"
        resources["calc"] = calc_metadata(nb.metadata, default_title=name, signoff=_signoff_state(nb))
        with _pandoc_prefetched(nb, list(self.config.NbConvertBase.display_data_priority),
                                resources.get("metadata", {}).get("path", "")):
            latex, resources = LatexExporter.from_notebook_node(self, nb, resources=resources, **kw)
        return break_handcalcs(latex), resources

    def from_notebook_node(self, nb: Any, resources: dict | None = None, **kw: Any) -> tuple[bytes, dict]:
        """Notebook -> PDF bytes; ``resources["latex_run"]`` has the passes, timings and log."""
        latex, resources = self.to_latex(nb, resources, **kw)
        if self.build_directory:
            workdir = Path(self.build_directory)
            workdir.mkdir(parents=True, exist_ok=True)
            return self._compile(latex, resources, workdir)
        with tempfile.TemporaryDirectory(prefix="splicecalc-tex-") as td:
            return self._compile(latex, resources, Path(td))

    def _compile(self, latex: str, resources: dict, workdir: Path) -> tuple[bytes, dict]:
        stem = "calc"
        (workdir / f"{stem}.tex").write_text(latex, encoding="utf-8")
        for fname, data in (resources.get("outputs") or {}).items():
            target = workdir / fname
            target.parent.mkdir(parents=True, exist_ok=True)
            target.write_bytes(data if isinstance(data, bytes) else str(data).encode())
        run = run_xelatex(workdir / f"{stem}.tex", progress=self.progress)
        pdf = run.pdf_path.read_bytes()
        resources["latex_run"] = run
        resources["output_extension"] = ".pdf"
        resources.pop("outputs", None)
        resources.pop("attachments", None)
        return pdf, resources


__all__ = ["CalcPackageExporter", "LATEX_DIR", "TEMPLATE_NAME"]
