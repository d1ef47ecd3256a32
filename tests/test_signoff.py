"""Sign-off: digests, signature order, tamper detection, append-only revisions.

Reference: SHA-256 from Python's hashlib (FIPS 180-4); the notebook format from nbformat.
"""

from __future__ import annotations

import hashlib
import json

import nbformat
import pytest

from splicecalc.core.errors import InputError
from splicecalc.signoff import CHECK_MIME, add_revision, compute_digest, sign_notebook, verify_path
from splicecalc.signoff.digest import JOB_MIME, canonical_json, digest_payload
from splicecalc.signoff.ledger import EXIT_CHANGED, EXIT_UNSIGNED, EXIT_VALID, is_protected, issue_pdf, write_sidecar


def _record(u=0.5):
    return {"id": "bolt_shear", "clause": "EN 1993-1-8:2005, 3.6.1, Table 3.4", "demand_kN": 47.04 * u * 2,
            "resistance_kN": 94.08, "utilisation": u, "ok": u <= 1}


def _nb(path, span="7.2 m", u=0.5):
    nb = nbformat.v4.new_notebook()
    c1 = nbformat.v4.new_code_cell("job = load('job.toml')")
    c1.outputs = [nbformat.v4.new_output("display_data", data={JOB_MIME: {"beam": {"span": span}}, "text/plain": "job"})]
    c2 = nbformat.v4.new_code_cell("show(check)")
    c2.outputs = [nbformat.v4.new_output("display_data", data={CHECK_MIME: _record(u), "text/plain": "rec"})]
    nb.cells = [nbformat.v4.new_markdown_cell("# Calc"), c1, c2]
    nbformat.write(nb, str(path))
    return path


def test_digest_is_sha256_of_canonical_payload(tmp_path):
    nb = nbformat.read(str(_nb(tmp_path / "a.ipynb")), as_version=4)
    expected = hashlib.sha256(canonical_json(digest_payload(nb)).encode()).hexdigest()  # hashlib reference
    assert compute_digest(nb) == expected
    assert len(expected) == 64


def test_unsigned_then_signed_then_checked(tmp_path):
    p = _nb(tmp_path / "a.ipynb")
    assert verify_path(p).exit_code == EXIT_UNSIGNED
    st = sign_notebook(p, "prepared", "A. Preparer", date="2026-12-01")
    assert st.state == "valid" and st.label == "PREPARED"
    st = sign_notebook(p, "checked", "B. Checker", date="2026-12-02")
    assert st.label == "CHECKED" and verify_path(p).exit_code == EXIT_VALID


def test_checker_must_differ_and_order_enforced(tmp_path):
    p = _nb(tmp_path / "a.ipynb")
    with pytest.raises(InputError, match="prepared"):
        sign_notebook(p, "checked", "B. Checker")
    sign_notebook(p, "prepared", "A. Preparer")
    with pytest.raises(InputError, match="other than the preparer"):
        sign_notebook(p, "checked", "a. preparer")
    with pytest.raises(InputError, match="checked"):
        sign_notebook(p, "approved", "C. Approver")
    with pytest.raises(InputError, match="role"):
        sign_notebook(p, "reviewed", "C. Approver")


@pytest.mark.parametrize("edit", ["input", "record", "code"])
def test_any_change_after_signing_is_detected(tmp_path, edit):
    p = _nb(tmp_path / "a.ipynb")
    sign_notebook(p, "prepared", "A. Preparer")
    nb = nbformat.read(str(p), as_version=4)
    if edit == "input":
        nb.cells[1].outputs[0]["data"][JOB_MIME]["beam"]["span"] = "7.3 m"
    elif edit == "record":
        nb.cells[2].outputs[0]["data"][CHECK_MIME]["utilisation"] = 0.49
    else:
        nb.cells[2].source = "show(check)  # edited"
    nbformat.write(nb, str(p))
    st = verify_path(p)
    assert st.exit_code == EXIT_CHANGED
    assert "CHANGED" in st.label
    # history is kept
    assert [s.role for s in st.signatures] == ["prepared"]


def test_revisions_are_append_only(tmp_path):
    p = _nb(tmp_path / "a.ipynb")
    add_revision(p, "A", "First issue for checking", date="2026-12-01")
    revs = add_revision(p, "B", "Splice bolts changed to M24", date="2026-12-02")
    assert [r.letter for r in revs] == ["A", "B"]
    with pytest.raises(InputError, match="append-only"):
        add_revision(p, "A", "rewrite history")
    with pytest.raises(InputError):
        add_revision(p, "not a code!", "x")


def test_pdf_sidecar_verify_and_protection(tmp_path):
    p = _nb(tmp_path / "a.ipynb")
    sign_notebook(p, "prepared", "A. Preparer")
    pdf = tmp_path / "a.pdf"
    pdf.write_bytes(b"%PDF-1.5 fake body for hashing only")
    nb = nbformat.read(str(p), as_version=4)
    write_sidecar(pdf, nb, p)
    assert verify_path(pdf).exit_code == EXIT_VALID
    assert not is_protected(pdf)
    issue_pdf(pdf)
    assert is_protected(pdf)
    pdf.write_bytes(b"%PDF-1.5 tampered")
    assert verify_path(pdf).exit_code == EXIT_CHANGED
    data = json.loads((tmp_path / "a.pdf.json").read_text())
    assert data["issued"] is True


def test_unexecuted_notebook_cannot_be_signed(tmp_path):
    nb = nbformat.v4.new_notebook()
    nb.cells = [nbformat.v4.new_code_cell("x = 1")]
    p = tmp_path / "empty.ipynb"
    nbformat.write(nb, str(p))
    with pytest.raises(InputError, match="executed"):
        sign_notebook(p, "prepared", "A. Preparer")


def test_edited_job_file_shows_as_changed_before_a_rebuild(tmp_path):
    # the notebook names its job file; the printed inputs are the job's canonical dict
    from splicecalc.job import load_job

    src = __import__("pathlib").Path(__file__).resolve().parents[1] / "examples" / "mezzanine_infill.toml"
    job_path = tmp_path / "job.toml"
    job_path.write_text(src.read_text())
    nb = nbformat.v4.new_notebook()
    c0 = nbformat.v4.new_code_cell('job_file = "job.toml"')
    c1 = nbformat.v4.new_code_cell("publish(job)")
    c1.outputs = [nbformat.v4.new_output("display_data", data={
        JOB_MIME: load_job(job_path).to_canonical_dict(), "text/plain": "job"})]
    c2 = nbformat.v4.new_code_cell("show(check)")
    c2.outputs = [nbformat.v4.new_output("display_data", data={CHECK_MIME: _record(), "text/plain": "rec"})]
    nb.cells = [c0, c1, c2]
    p = tmp_path / "calc.ipynb"
    nbformat.write(nb, str(p))
    sign_notebook(p, "prepared", "A. Preparer")
    assert verify_path(p).exit_code == EXIT_VALID
    job_path.write_text(job_path.read_text().replace('span = "7.2 m"', 'span = "7.5 m"'))
    st = verify_path(p)
    assert st.exit_code == EXIT_CHANGED and "job file" in st.detail
