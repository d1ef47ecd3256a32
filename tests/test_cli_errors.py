"""Every command's error paths: one line on stderr, the documented exit code, never a traceback.

File-system failures (a read-only or forbidden folder, a full disk) name the path and what to
do, and leave nothing half-written (no ``.part`` file, no file under the final name).
"""

from __future__ import annotations

import errno
import shutil
from pathlib import Path

import pytest

from splicecalc.cli.main import main

ROOT = Path(__file__).resolve().parents[1]
JOB = ROOT / "examples" / "mezzanine_infill.toml"


def _one_line(capsys) -> str:
    err = capsys.readouterr().err
    lines = [ln for ln in err.splitlines() if ln.strip() and "MissingIDFieldWarning" not in ln and "_validate(" not in ln]
    assert len(lines) == 1, err
    assert lines[0].startswith(("splicecalc: error:", "splicecalc: build failed:")), err
    assert "Traceback" not in err and "unexpected" not in err, err
    return lines[0]


@pytest.fixture
def files(tmp_path):
    (tmp_path / "bad.ipynb").write_text("not json", encoding="utf-8")
    (tmp_path / "bad.pdf").write_bytes(b"%PDF-1.4 junk")
    (tmp_path / "bad.toml").write_bytes(b"[beam\nspan = ")
    (tmp_path / "latin1.toml").write_bytes("[project]\ntitle = 'Caf\xe9'\n".encode("latin-1"))
    (tmp_path / "folder.toml").mkdir()
    return tmp_path


BAD_COMMANDS = [
    ["section", "ZZZ"], ["sections", "QQ"], ["sections", "UKB", "--max-depth", "-1"], ["sections", "--min-wpl", "nan"],
    ["bolt", "M99"], ["bolt", "M20", "--class", "3.3"], ["weld", "-5"], ["weld", "nan"], ["weld", "1e308"],
    ["weld", "8", "--grade", "S999"],
    ["run", "{d}/missing.toml"], ["run", "{d}/bad.toml"], ["run", "{d}/latin1.toml"], ["run", "{d}/folder.toml"],
    ["run", "{d}/bad.ipynb"], ["run"], ["frobnicate"], ["new", "nonesuch", "{d}/p"],
    ["new", "beam_splice", "{d}/p", "--job", "{d}/bad.toml"],
    ["build", "{d}/missing.toml"], ["build", "{d}/bad.ipynb"], ["build", "{d}/bad.toml"],
    ["build", str(JOB), "-o", "{d}/out.txt"],
    ["sign", "{d}/missing.ipynb", "--role", "prepared", "--name", "A"],
    ["sign", "{d}/bad.ipynb", "--role", "prepared", "--name", "A"],
    ["sign", "{d}/bad.ipynb", "--role", "boss", "--name", "A"],
    ["revise", "{d}/bad.ipynb", "--revision", "P2", "--description", "x"],
    ["revise", "{d}/missing.ipynb", "--revision", "P2", "--description", "x"],
    ["issue", "{d}/bad.pdf"], ["issue", "{d}/missing.pdf"],
    ["verify", "{d}/missing.pdf"], ["verify", "{d}/bad.ipynb"],
    ["review", "list", "{d}/missing.toml"], ["new", "beam_splice", "{d}/q", "--title", "x" * 20_001],
]


BAD_COMMANDS += [
    ["keys", "new", "--name", "A", "--out", "/sys/splicecalc-k.p12"], ["keys", "trust", "{d}/missing.pem"],
    ["keys", "trust", "{d}/bad.pdf"], ["keys", "frob"], ["sign", "{d}/bad.pdf", "--role", "prepared", "--key",
                                                           "{d}/missing.p12"],
    ["schema", "--frob"],
]


@pytest.mark.parametrize("argv", BAD_COMMANDS, ids=[" ".join(a)[:60] for a in BAD_COMMANDS])
def test_bad_input_is_one_line_exit_2(argv, files, capsys, monkeypatch):
    monkeypatch.setenv("SPLICECALC_PASSPHRASE", "a long test passphrase")
    args = [a.format(d=files) for a in argv]
    try:
        code = main(args)
    except SystemExit as exc:          # argparse's own refusals
        code = exc.code
    assert code == 2
    _one_line(capsys)


def test_verify_of_a_malformed_pdf_is_not_a_traceback(files, capsys):
    code = main(["verify", str(files / "bad.pdf")])
    assert code in (1, 2, 3)                   # changed / bad input / unsigned: never a crash
    err = capsys.readouterr().err
    assert "Traceback" not in err and "unexpected" not in err


# ---------------------------------------------------------------- file-system failures
def _no_partial(folder: Path) -> None:
    if folder.exists():
        assert not sorted(folder.rglob("*.part")), sorted(folder.rglob("*.part"))


@pytest.mark.parametrize("argv", [
    ["new", "beam_splice", "/sys/splicecalc-pkg"],
    ["new", "beam_splice", "/proc/splicecalc-pkg"],
    ["demo", "--out", "/sys/splicecalc-demo"],
])
def test_forbidden_folder_names_the_path(argv, capsys):
    code = main(argv)
    assert code == 2
    line = _one_line(capsys)
    assert argv[-1] in line and ("folder" in line or "permission" in line or "read-only" in line)


def _disk_full(monkeypatch):
    import splicecalc.core.files as files_mod

    def full(fd):
        raise OSError(errno.ENOSPC, "No space left on device")

    monkeypatch.setattr(files_mod.os, "fsync", full)


def test_new_on_a_full_disk(tmp_path, monkeypatch, capsys):
    _disk_full(monkeypatch)
    code = main(["new", "beam_splice", str(tmp_path / "pkg")])
    assert code == 2
    line = _one_line(capsys)
    assert "disk is full" in line and str(tmp_path / "pkg") in line
    _no_partial(tmp_path)
    assert not (tmp_path / "pkg" / "beam_splice.ipynb").exists()


def test_revise_on_a_full_disk_leaves_the_notebook_as_it_was(tmp_path, monkeypatch, capsys):
    assert main(["new", "beam_splice", str(tmp_path / "pkg")]) == 0
    capsys.readouterr()
    nb = tmp_path / "pkg" / "beam_splice.ipynb"
    before = nb.read_bytes()
    _disk_full(monkeypatch)
    code = main(["revise", str(nb), "--revision", "P2", "--description", "second issue"])
    err = capsys.readouterr().err
    assert "Traceback" not in err and "unexpected" not in err, err
    assert code == 2, err
    assert "disk is full" in err
    assert nb.read_bytes() == before
    _no_partial(tmp_path)


@pytest.mark.pdf
def test_build_into_a_forbidden_folder(tmp_path, capsys):
    if shutil.which("xelatex") is None:
        pytest.skip("XeLaTeX not installed")
    code = main(["build", str(JOB), "-o", "/sys/splicecalc-out.pdf", "--quiet"])
    assert code == 2
    line = _one_line(capsys)
    assert "/sys/" in line


def test_missing_tex_names_the_install_command(tmp_path, monkeypatch, capsys):
    import splicecalc.report.compile as compile_mod

    real = shutil.which
    monkeypatch.setattr(compile_mod.shutil, "which", lambda name, *a, **k: None if name in ("xelatex", "pandoc")
                        else real(name, *a, **k))
    shutil.copy(JOB, tmp_path / "job.toml")
    code = main(["build", str(tmp_path / "job.toml"), "--quiet"])
    assert code in (1, 2)
    line = _one_line(capsys)
    assert "apt-get install" in line or "install" in line
    assert not (tmp_path / "job.pdf").exists() and not (tmp_path / "job.ipynb").exists()


@pytest.mark.pdf
@pytest.mark.parametrize("size", ["300k", "700k"])
def test_build_on_a_really_full_disk(tmp_path, capsys, size):
    """A small tmpfs (needs the right to mount; skipped elsewhere): one line naming the folder and
    the disk, no PDF, no partial file, at the size where the notebook fits but LaTeX does not too."""
    import subprocess

    if shutil.which("xelatex") is None:
        pytest.skip("XeLaTeX not installed")
    mnt = tmp_path / "tiny"
    mnt.mkdir()
    if subprocess.run(["mount", "-t", "tmpfs", "-o", f"size={size}", "tmpfs", str(mnt)],
                      capture_output=True).returncode != 0:
        pytest.skip("cannot mount a small file system here")
    try:
        code = main(["build", str(JOB), "-o", str(mnt / "m.pdf"), "--quiet"])
        assert code in (1, 2)
        line = _one_line(capsys)
        assert str(mnt) in line and ("disk" in line or "space" in line), line
        assert not (mnt / "m.pdf").exists()
        _no_partial(mnt)
    finally:
        subprocess.run(["umount", str(mnt)], capture_output=True)
