"""The review register and PDF mark-ups read back (issue: the checking conversation).

The register rules are tested on their own (no PDF). The mark-up tests build the demo once, then
annotate it as a checker's PDF reader would, with pypdf (a general PDF library outside the
project): a sticky note placed inside a known check's printed box and a highlight over a printed
value must import to that check's id; the same file imported twice adds nothing.
Where a check sits is read back with poppler's ``pdftotext -bbox`` (outside the project), not
with our own anchors, so the mapping is checked against what the page shows.
"""

from __future__ import annotations

import json
import multiprocessing
import re
import subprocess
import sys
from pathlib import Path
from types import SimpleNamespace

import pytest

from splicecalc.core.errors import InputError
from splicecalc.review import (Register, RegisterError, add_comment, comment_flags, import_markups, locate,
                               parse_target)
from splicecalc.review.register import check_basis

CLI = [sys.executable, "-m", "splicecalc.cli.main"]
pdf_mark = pytest.mark.pdf


def cli(*args: str) -> subprocess.CompletedProcess:
    return subprocess.run([*CLI, *args], capture_output=True, text=True, timeout=300)


# ------------------------------------------------------------------ register rules (no PDF)
@pytest.fixture()
def reg(tmp_path):
    job = tmp_path / "job.toml"
    job.write_text('[project]\ntitle = "t"\napproved_by = "C. Approver"\n', encoding="utf-8")
    return Register.for_job(job, approver="C. Approver")


def test_thread_states_open_answered_closed(reg):
    c = reg.add(by="B. Checker", text="Why 0.8 on the bolt group?", target={"kind": "package"})
    assert (c.id, c.state) == ("R1", "open")
    assert reg.reply("R1", by="A. Preparer", text="Tension allowance; see note.").state == "answered"
    assert reg.reply("R1", by="B. Checker", text="Cite the source please.").state == "open"
    assert reg.close("R1", by="B. Checker", note="ok").state == "closed"
    c = reg.comment("R1")
    assert [e.kind for e in c.thread] == ["comment", "reply", "reply", "close"]
    assert reg.counts() == {"open": 0, "answered": 0, "closed": 1}


def test_only_author_or_approver_closes(reg):
    reg.add(by="B. Checker", text="q1", target={"kind": "package"})
    reg.add(by="B. Checker", text="q2", target={"kind": "package"})
    with pytest.raises(InputError, match="author"):
        reg.close("R1", by="A. Preparer")
    assert reg.close("R2", by="c. approver").state == "closed"      # the approver, any case


def test_closed_history_takes_no_edits(reg):
    reg.add(by="B. Checker", text="q", target={"kind": "package"})
    reg.close("R1", by="B. Checker")
    with pytest.raises(RegisterError, match="closed"):
        reg.reply("R1", by="A. Preparer", text="late answer")
    with pytest.raises(RegisterError, match="closed"):
        reg.close("R1", by="B. Checker")


def test_hand_edit_of_an_earlier_line_is_refused(reg):
    reg.add(by="B. Checker", text="flange plate too thin?", target={"kind": "package"})
    reg.add(by="B. Checker", text="second", target={"kind": "package"})
    raw = reg.path.read_text(encoding="utf-8")
    reg.path.write_text(raw.replace("too thin?", "fine."), encoding="utf-8")
    with pytest.raises(RegisterError, match="append-only"):
        reg.comments()


def test_digest_changes_with_every_event(reg):
    d0 = reg.digest()
    reg.add(by="B. Checker", text="q", target={"kind": "package"})
    d1 = reg.digest()
    reg.reply("R1", by="A. Preparer", text="a")
    assert len({d0, d1, reg.digest()}) == 3


def _add_many(path: str, who: str, n: int) -> None:
    r = Register(path)
    for i in range(n):
        r.add(by=who, text=f"{who} {i}", target={"kind": "package"})


def test_concurrent_writers_keep_a_valid_register(reg):
    # two processes appending at once: the lock serialises them; every event lands, the chain holds
    ctx = multiprocessing.get_context("fork")
    ps = [ctx.Process(target=_add_many, args=(str(reg.path), w, 15)) for w in ("P", "Q")]
    for p in ps:
        p.start()
    for p in ps:
        p.join(60)
    cs = reg.comments()
    assert len(cs) == 30 and sorted(c.id for c in cs) == sorted(f"R{i}" for i in range(1, 31))


@pytest.mark.parametrize("text, expected", [
    ("package", {"kind": "package"}),
    ("sheet 12", {"kind": "sheet", "sheet": 12}),
    ("sheet:3", {"kind": "sheet", "sheet": 3}),
    ("S1.flange_bolt_shear", {"kind": "check", "id": "S1.flange_bolt_shear"}),
])
def test_targets(text, expected):
    assert parse_target(text) == expected


@pytest.mark.parametrize("bad", ["", "sheet 0", "x y z", "$\\input{/etc/passwd}$"])
def test_bad_targets_are_one_line_errors(bad):
    with pytest.raises(InputError) as e:
        parse_target(bad)
    assert "\n" not in str(e.value)


def test_unknown_check_id_is_refused_with_a_hint():
    with pytest.raises(InputError, match="Did you mean S1.flange_bolt_shear"):
        parse_target("flange_bolt", ["S1.flange_bolt_shear", "M.bending"])


def test_moved_and_gone_flags():
    rec = {"id": "M.bending", "demand_kNm": 100.0, "resistance_kNm": 200.0, "utilisation": 0.5}
    from splicecalc.review import Comment
    c = Comment(id="R1", revision="P1", by="x", date="d", target={"kind": "check", "id": "M.bending"},
                text="t", basis=check_basis(rec))
    g = Comment(id="R2", revision="P1", by="x", date="d", target={"kind": "check", "id": "S9.gone"}, text="t")
    assert comment_flags([c, g], [rec]) == {"R1": "unchanged", "R2": "gone"}
    assert comment_flags([c], [{**rec, "demand_kNm": 104.0, "utilisation": 0.52}]) == {"R1": "moved"}


# ------------------------------------------------------------------ mark-ups read back from the built PDF
def _demo_records(job_path: Path) -> list[dict]:
    """Check records of a job as the calc computes them (the notebook calls the same run_calc)."""
    from splicecalc.job import load_job
    from splicecalc.workflow import run_calc

    return [r.to_dict() for r in run_calc(load_job(job_path), render=False).summary_records]


@pytest.fixture(scope="module")
def built(tmp_path_factory):
    """The demo built once, with a register holding one open query on a known check before the build."""
    from splicecalc.workflow.package import build_package, demo_job_path

    out = tmp_path_factory.mktemp("review")
    job = out / "job.toml"
    job.write_text(demo_job_path().read_text(encoding="utf-8"), encoding="utf-8")
    from splicecalc.job import load_job
    from splicecalc.workflow import run_calc
    from splicecalc.workflow.display import RULE_CLAUSES

    recs = run_calc(load_job(job), render=False).summary_records
    titles = [r.title for r in recs]
    # a check printed with a heading (a detailing rule is a row of a table: its title follows no number)
    first = next(r.id for r in recs if re.fullmatch(r"[A-Za-z0-9 ,:()-]+", r.title)
                 and titles.count(r.title) == 1 and len(r.title) < 40 and r.checked
                 and not (r.has("detailing") or r.clause.startswith(RULE_CLAUSES)))
    Register.for_job(job).add(by="B. Checker", text="Query before the build: $\\input{/etc/hostname}$ & 50%",
                              target={"kind": "check", "id": first})
    b = build_package(job, out / "calc.pdf", progress=False)
    return SimpleNamespace(pdf=b.pdf, notebook=b.notebook, report=b.report, queried=first)


@pdf_mark
def test_package_prints_the_threads_and_a_margin_mark(built):
    pages = subprocess.run(["pdftotext", "-layout", str(built.pdf), "-"], capture_output=True, text=True,
                           check=True).stdout.split("\f")
    pages = pages[:-1] if not pages[-1].strip() else pages
    cover = pages[0]
    assert re.search(r"Register job\.review\.jsonl: 1 open, 0 answered, 0 closed", cover.replace("\n", " "))
    # the margin mark sits on the sheet where the queried check is printed (poppler finds its title there)
    title = next(r["title"] for r in _demo_records(built.pdf.with_name("job.toml")) if r["id"] == built.queried)
    sheet, _ = _find(built.pdf, len(pages), title.split())
    assert "query" in pages[sheet - 1] and "R1" in pages[sheet - 1]
    # the thread is printed literally (register text never reaches TeX as TeX: had \input run, the
    # command would not be printed)
    assert any("Query before the build: $\\input{/etc/hostname}$ & 50%" in p for p in pages)


def test_rebuild_flags_comments_whose_check_moved(tmp_path):
    from splicecalc.review import review_payload
    from splicecalc.workflow.package import demo_job_path

    job = tmp_path / "job.toml"
    text = demo_job_path().read_text(encoding="utf-8")
    job.write_text(text, encoding="utf-8")
    recs = _demo_records(job)
    reg = Register.for_job(job)
    bending = next(r for r in recs if "bending" in r["id"] and r.get("utilisation"))
    reg.add(by="B. Checker", text="u looks low", target={"kind": "check", "id": bending["id"]},
            basis=check_basis(bending))
    reg.add(by="B. Checker", text="gone soon", target={"kind": "check", "id": "X9.not_a_check"})
    assert {c["id"]: c["flag"] for c in review_payload(job, recs)["comments"]} == {"R1": "unchanged", "R2": "gone"}
    # an input change: every UDL 20 % heavier -> the bending check moves
    heavier = re.sub(r'(udl\s*=\s*")([0-9.]+)', lambda m: m.group(1) + f"{float(m.group(2)) * 1.2:g}", text)
    assert heavier != text
    job.write_text(heavier, encoding="utf-8")
    assert review_payload(job, _demo_records(job))["comments"][0]["flag"] == "moved"


def _words(pdf: Path, page: int) -> list[tuple[str, float, float, float, float]]:
    """(word, x0, y0, x1, y1) of one page in PDF points, y up (poppler's pdftotext -bbox, outside the project)."""
    html = subprocess.run(["pdftotext", "-bbox", "-f", str(page), "-l", str(page), str(pdf), "-"],
                          capture_output=True, text=True, check=True).stdout
    h = float(re.search(r'<page width="[\d.]+" height="([\d.]+)"', html).group(1))
    out = []
    for m in re.finditer(r'<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)</word>', html):
        x0, y0, x1, y1 = (float(m.group(i)) for i in range(1, 5))
        out.append((m.group(5), x0, h - y1, x1, h - y0))
    return out


def _first_section_sheet(pdf: Path) -> int:
    """Sheet of the first numbered section (from the PDF's bookmarks, read with pypdf): the body
    starts there, after the cover and the contents (which list every check's title too)."""
    from pypdf import PdfReader

    r = PdfReader(str(pdf))
    first = r.outline[0]
    while isinstance(first, list):
        first = first[0]
    return r.get_destination_page_number(first) + 1


def _outline_pages(pdf: Path) -> list[tuple[str, int]]:
    """(title, sheet) of every bookmark of the PDF (read with pypdf)."""
    from pypdf import PdfReader

    r = PdfReader(str(pdf))
    out: list[tuple[str, int]] = []

    def walk(items):
        for it in items:
            if isinstance(it, list):
                walk(it)
            else:
                out.append((" ".join(str(it.title).split()), r.get_destination_page_number(it) + 1))
    walk(r.outline)
    return out


def _find(pdf: Path, npages: int, phrase: list[str]) -> tuple[int, tuple[float, float, float, float]]:
    """Sheet and box of a check's heading: the words of ``phrase`` following one another after its
    number ("5.4"). A title is also printed in the contents list and in tables, and the contents may
    share a sheet with the start of the body: the sheet is the one the PDF's bookmark of that title
    points to, and on it the last match (the contents come first)."""
    title = " ".join(phrase)
    sheets = [pg for t, pg in _outline_pages(pdf) if t.endswith(title)]
    candidates = sheets or list(range(_first_section_sheet(pdf), npages + 1))
    for p in candidates:
        ws = _words(pdf, p)
        found = None
        for i in range(1, len(ws) - len(phrase) + 1):
            if [w[0] for w in ws[i:i + len(phrase)]] == phrase and re.fullmatch(r"\d+(\.\d+)+", ws[i - 1][0]):
                box = ws[i:i + len(phrase)]
                found = p, (min(b[1] for b in box), min(b[2] for b in box), max(b[3] for b in box), max(b[4] for b in box))
        if found:
            return found
    raise AssertionError(f"{phrase} not printed")


def _annotate(src: Path, dst: Path, notes: list[tuple[int, str, tuple[float, float, float, float], str]]) -> None:
    from pypdf import PdfReader, PdfWriter
    from pypdf.annotations import FreeText, Highlight, Text
    from pypdf.generic import ArrayObject, FloatObject

    w = PdfWriter(clone_from=PdfReader(str(src)))
    for sheet, kind, (x0, y0, x1, y1), text in notes:
        if kind == "note":
            a = Text(rect=(x0, y0, x0 + 18, y0 + 18), text=text)
        elif kind == "box":
            a = FreeText(text=text, rect=(x0, y0, x1, y1))
        else:
            quad = ArrayObject([FloatObject(v) for v in (x0, y1, x1, y1, x0, y0, x1, y0)])
            a = Highlight(rect=(x0, y0, x1, y1), quad_points=quad)
            a[__import__("pypdf").generic.NameObject("/Contents")] = __import__("pypdf").generic.TextStringObject(text)
        w.add_annotation(page_number=sheet - 1, annotation=a)
    with open(dst, "wb") as fh:
        w.write(fh)




@pdf_mark
def test_markups_import_to_the_check_they_sit_on(built, tmp_path):
    from splicecalc.signoff.digest import collect_records
    import nbformat

    records = collect_records(nbformat.read(built.notebook, as_version=4))
    npages = built.report.pages
    # two checks whose titles are printed as headings (short, unique): find them on the page with poppler
    titles = [r["title"] for r in records]
    unique = [r for r in records if titles.count(r["title"]) == 1 and len(r["title"]) < 40
              and not any(t != r["title"] and r["title"] in t for t in titles)
              and r.get("layout") != "row" and r.get("status") not in ("info", "not checked")]
    target_a, target_b = unique[2], unique[-3]
    sa, box_a = _find(built.pdf, npages, target_a["title"].split())
    sb, box_b = _find(built.pdf, npages, target_b["title"].split())
    # a sticky note just below the first check's heading; a highlight over the second's heading words
    annotated = tmp_path / "marked.pdf"
    _annotate(built.pdf, annotated, [
        (sa, "note", (box_a[0] + 40, box_a[1] - 30, 0, 0), "Check the lever arm used here."),
        (sb, "highlight", box_b, "Where does this come from?"),
        (1, "box", (300, 40, 500, 80), "General: add the survey reference."),
    ])
    res = import_markups(built.pdf, annotated, by="B. Checker")
    assert len(res.added) == 3
    got = {c.text.split("]")[-1].strip(): c.target for c in res.added}
    assert got["Check the lever arm used here."] == {"kind": "check", "id": target_a["id"]}
    assert got["Where does this come from?"] == {"kind": "check", "id": target_b["id"]}
    assert got["General: add the survey reference."] == {"kind": "sheet", "sheet": 1}
    hl = next(c for c in res.added if "Where does" in c.text)
    assert target_b["title"].split()[0] in hl.text            # the highlighted words are kept
    # the same mark-ups handed back again (or a copy with more mark-ups): nothing imported twice
    again = import_markups(built.pdf, annotated, by="B. Checker")
    assert again.added == () and len(again.skipped) == 3
    # the CLI lists them, as JSON too
    out = cli("review", "list", str(built.pdf), "--json")
    assert out.returncode == 0, out.stderr
    data = json.loads(out.stdout)
    assert data["counts"]["open"] == 4 and {c["check_flag"] for c in data["comments"]} <= {"unchanged", None}


@pdf_mark
def test_cli_thread_on_a_check(built):
    from splicecalc.signoff.digest import collect_records
    import nbformat

    rid = collect_records(nbformat.read(built.notebook, as_version=4))[0]["id"]
    r = cli("review", "add", str(built.notebook), "--on", rid, "--by", "B. Checker", "Section class?")
    assert r.returncode == 0 and re.match(r"R\d+ added on " + re.escape(rid), r.stdout), r.stderr
    cid = r.stdout.split()[0]
    assert cli("review", "reply", str(built.notebook), cid, "--by", "A. Preparer", "Class 1, see table").returncode == 0
    bad = cli("review", "close", str(built.notebook), cid, "--by", "A. Preparer")
    assert bad.returncode == 2 and bad.stderr.count("\n") == 1 and "Traceback" not in bad.stderr
    assert cli("review", "close", str(built.notebook), cid, "--by", "B. Checker").returncode == 0
    lst = cli("review", "list", str(built.notebook), "--open")
    assert cid + " " not in lst.stdout
    bogus = cli("review", "add", str(built.notebook), "--on", "no.such_check", "--by", "B", "x")
    assert bogus.returncode == 2 and "Traceback" not in bogus.stderr


def test_cli_errors_are_one_line(tmp_path):
    for args in (["list", str(tmp_path / "missing.pdf")], ["list", str(tmp_path)],
                 ["import", str(tmp_path / "a.toml"), str(tmp_path / "b.pdf"), "--by", "x"]):
        r = cli("review", *args)
        assert r.returncode == 2 and r.stderr.count("\n") == 1 and "Traceback" not in r.stderr, r.stderr


def test_locate_resolves_notebook_to_job(tmp_path):
    job = tmp_path / "job.toml"
    job.write_text("[project]\nrevision = 'P2'\n", encoding="utf-8")
    nb = {"cells": [{"cell_type": "code", "source": "job_file = \"job.toml\"\n", "metadata": {}, "outputs": []}],
          "metadata": {}, "nbformat": 4, "nbformat_minor": 5}
    (tmp_path / "calc.ipynb").write_text(json.dumps(nb), encoding="utf-8")
    pkg = locate(tmp_path / "calc.ipynb")
    assert pkg.job_file == job.resolve() and pkg.revision() == "P2" and pkg.records() == []
    c = add_comment(tmp_path / "calc.ipynb", on="package", by="B. Checker", text="Survey ref?")
    assert c.revision == "P2" and (tmp_path / "job.review.jsonl").exists()


# ------------------------------------------------------------------ sign-off respects the review
def _package_copy(built, dest: Path) -> Path:
    import shutil

    dest.mkdir()
    for f in built.pdf.parent.iterdir():
        if f.is_file() and not f.name.startswith(".") and not f.name.endswith(".lock"):
            shutil.copy2(f, dest / f.name)
    return dest / built.pdf.name


@pytest.fixture()
def signers(tmp_path, monkeypatch):
    from splicecalc.signoff import keys

    monkeypatch.setenv(keys.TRUST_DIR_ENV, str(tmp_path / "trust"))
    return {k: keys.new_key(n, tmp_path / f"{k}.p12", b"review test") for k, n in
            (("a", "A. Preparer"), ("b", "B. Checker"))}


@pdf_mark
def test_checked_signature_waits_for_closed_comments(built, tmp_path, signers):
    from splicecalc.signoff.package import sign_package, verify_package

    pdf = _package_copy(built, tmp_path / "pkg")
    reg = locate(pdf).register
    assert reg.unresolved(), "the fixture's register holds open queries"
    sign_package(pdf, "prepared", signers["a"])                      # preparing is not held up
    with pytest.raises(InputError, match=r"not closed: R1"):
        sign_package(pdf, "checked", signers["b"], accept_not_checked="covered by a separate calc (test)")
    for c in reg.unresolved():
        reg.close(c.id, by=c.by, note="answered in rev. P1")
    sign_package(pdf, "checked", signers["b"], accept_not_checked="covered by a separate calc (test)")
    st = verify_package(pdf)
    assert st.state == "valid", st.lines
    # comments added after the signature are fine (the register is append-only) ...
    reg.add(by="C. Approver", text="For the next revision: add the survey ref.", target={"kind": "package"})
    assert verify_package(pdf).state == "valid"
    # ... a change to what the signature saw is not
    raw = reg.path.read_bytes()
    reg.path.write_bytes(raw.replace(b"answered in rev. P1", b"answered in rev. P9"))
    st = verify_package(pdf)
    assert st.state == "changed" and "review register" in " ".join(st.lines)
    # junk appended by hand (not an event of the chain) is a change too
    reg.path.write_bytes(raw + b"not an event\n")
    st = verify_package(pdf)
    assert st.state == "changed" and "appended to by hand" in " ".join(st.lines)


@pdf_mark
def test_open_comments_ok_is_recorded_in_the_signature(built, tmp_path, signers):
    from splicecalc.signoff.package import sign_package, verify_package

    pdf = _package_copy(built, tmp_path / "pkg")
    sign_package(pdf, "prepared", signers["a"])
    sign_package(pdf, "checked", signers["b"], open_comments_ok="queries R1-R4 are for the next stage",
                 accept_not_checked="covered by a separate calc (test)")
    st = verify_package(pdf)
    assert st.state == "valid"
    assert any("open review comments accepted: queries R1-R4 are for the next stage" in line for line in st.lines)


@pdf_mark
def test_sheet_beyond_the_package_and_a_mark_up_of_another_job_are_refused(built, tmp_path):
    from pypdf import PdfReader, PdfWriter
    from pypdf.annotations import Text

    npages = built.report.pages
    with pytest.raises(InputError, match=f"1 to {npages}"):
        add_comment(built.pdf, on=f"sheet {npages + 1}", by="B. Checker", text="no such sheet")
    # another job's package, marked up, handed to this package's register: refused, nothing imported
    before = len(Register.for_job(built.pdf.parent / "job.toml").comments())
    w = PdfWriter(clone_from=PdfReader(str(built.pdf)))
    w.add_metadata({"/Subject": "Another client, another site, job OTHER-1"})
    w.add_annotation(page_number=0, annotation=Text(rect=(100, 100, 118, 118), text="meant for another job"))
    other = tmp_path / "other_marked.pdf"
    with open(other, "wb") as fh:
        w.write(fh)
    with pytest.raises(InputError, match="another job"):
        import_markups(built.pdf, other, by="B. Checker")
    assert len(Register.for_job(built.pdf.parent / "job.toml").comments()) == before
    # a file that is no PDF: one line on stderr, none of its bytes echoed by the PDF reader
    notpdf = tmp_path / "passwd.pdf"
    notpdf.write_text("root:x:0:0:root:/root:/bin/bash\n", encoding="utf-8")
    r = cli("review", "import", str(built.pdf), str(notpdf), "--by", "B. Checker")
    assert r.returncode == 2 and r.stderr.count("\n") == 1 and "Traceback" not in r.stderr, r.stderr


def test_signed_closure_is_verified_and_an_edited_one_is_not(tmp_path, signers):
    """Audit: `review --by` names are self-asserted. A closure signed with the closer's key (cryptography,
    the key of `splicecalc keys`) is shown as signed, trusted or not; an edit of it shows as INVALID."""
    from splicecalc.report.latexout import review_latex
    from splicecalc.review.register import Register
    from splicecalc.signoff import keys

    reg = Register(tmp_path / "job.review.jsonl")
    c = reg.add(by="B. Checker", text="Check the cover plate bolts.", target={"kind": "package"})
    d = reg.add(by="B. Checker", text="Second query.", target={"kind": "package"})
    with pytest.raises(InputError, match="signing key"):
        reg.close(c.id, by="A. Preparer", key=signers["b"])          # a name other than the key's
    reg.close(d.id, by="B. Checker", note="closed by name only")
    reg.close(c.id, key=signers["b"], note="answered in rev. P1")
    e = reg.comment(c.id).thread[-1]
    assert (e.by, e.signed) == ("B. Checker", "untrusted")
    assert reg.comment(d.id).thread[-1].signed == ""
    keys.export_cert(signers["b"], tmp_path / "b.pem")
    keys.trust_cert(tmp_path / "b.pem")
    assert reg.comment(c.id).thread[-1].signed == "trusted"
    tex = review_latex({"register": reg.path.name, "counts": reg.counts(), "digest": reg.digest(),
                        "comments": [x.to_dict() for x in reg.comments()]})
    assert "signed (trusted)" in tex and "does not prove who wrote" in tex
    # the last line edited (the hash chain cannot see an edit of the last event; its signature does)
    raw = reg.path.read_bytes()
    reg.path.write_bytes(raw.replace(b"answered in rev. P1", b"answered in rev. P9"))
    assert reg.comment(c.id).thread[-1].signed == "invalid"
