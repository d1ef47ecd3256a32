"""Time signing and verifying a built calc package (PDF + executed notebook).

    .venv/bin/python benchmarks/bench_signoff.py [FOLDER_WITH_BUILT_DEMO]

Without an argument the demo package is built once into a temporary folder (about 30 s,
not timed). Each timed run starts from a fresh copy of the unsigned package:

* sign prepared, then sign checked (``sign_package``: PAdES signature with pyHanko as an
  incremental update + the notebook's detached signature, with the checks before and the
  verification after that it does);
* verify the twice-signed package (``verify_package``: pyHanko for integrity, signature,
  certificate path and coverage, our quick rule for what later updates changed), against
  the named alternative ``thorough=True`` (pyHanko's full difference analysis as well).

Imports are warmed first (the one-off import of pyHanko is printed apart): those are the
in-process figures. Then the same from the command line, each in a NEW process
(``python -m splicecalc.cli.main sign|verify``, the passphrase from the environment), which is
what a user waits for: interpreter start, imports (pyHanko imports its HTTP client aiohttp for
time stamps, ~0.1 s, whether or not it is used), reading the key (PBKDF of the .p12) and the work.
The sources are byte-compiled first (``compileall``: with PYTHONDONTWRITEBYTECODE set, as in the
development shell, nothing would be cached otherwise and every run would compile pyHanko anew).
Targets (issue 10): signing < 1 s, verifying < 1 s.
"""

from __future__ import annotations

import os
import shutil
import statistics
import sys
import tempfile
import time
from pathlib import Path

NAME = "demo_workshop_gallery"


def _compile() -> None:
    import compileall
    import sysconfig

    for d in (Path(__file__).resolve().parents[1] / "splicecalc", Path(sysconfig.get_paths()["purelib"])):
        compileall.compile_dir(str(d), quiet=1, workers=1)


def _cli_times(built: Path, tdp: Path, keyfiles: tuple[Path, Path], pw: bytes, rounds: int = 5):
    """Wall and CPU (user + system of the child) times of `splicecalc sign` (prepared, then checked) and
    `splicecalc verify`, each a new process. On a shared machine the wall time grows with the load; the CPU
    time is what the command itself costs."""
    import resource
    import subprocess

    def cpu() -> float:
        r = resource.getrusage(resource.RUSAGE_CHILDREN)
        return r.ru_utime + r.ru_stime

    env = dict(os.environ, SPLICECALC_PASSPHRASE=pw.decode())
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    cli = [sys.executable, "-m", "splicecalc.cli.main"]
    start = [sys.executable, "-c", "pass"]
    sign_t, verify_t, bare_t, sign_c, verify_c = [], [], [], [], []
    for i in range(rounds):
        d = tdp / f"cli{i}"
        d.mkdir()
        for f in built.iterdir():
            if f.is_file() and not f.name.startswith("."):
                shutil.copy2(f, d / f.name)
        pdf = str(d / f"{NAME}.pdf")
        for role, key, extra in (("prepared", keyfiles[0], []),
                                 ("checked", keyfiles[1], ["--accept-not-checked", "covered by calc S2 (benchmark)"])):
            t, c = time.perf_counter(), cpu()
            r = subprocess.run([*cli, "sign", pdf, "--role", role, "--key", str(key), *extra], env=env,
                               capture_output=True, text=True)
            sign_t.append(time.perf_counter() - t)
            sign_c.append(cpu() - c)
            assert r.returncode == 0, r.stderr
        t, c = time.perf_counter(), cpu()
        r = subprocess.run([*cli, "verify", pdf], env=env, capture_output=True, text=True)
        verify_t.append(time.perf_counter() - t)
        verify_c.append(cpu() - c)
        assert r.returncode == 0, r.stdout + r.stderr
        t = time.perf_counter()
        subprocess.run(start, env=env)
        bare_t.append(time.perf_counter() - t)
    return sign_t, verify_t, bare_t, sign_c, verify_c


def main(argv: list[str]) -> int:
    _compile()
    t0 = time.perf_counter()
    import pyhanko.sign.signers  # noqa: F401
    import pyhanko.sign.validation  # noqa: F401
    imports_s = time.perf_counter() - t0

    from splicecalc.signoff import keys, pdfsign
    from splicecalc.signoff.package import sign_package, verify_package

    with tempfile.TemporaryDirectory(prefix="bench-sign-") as td:
        tdp = Path(td)
        os.environ[keys.TRUST_DIR_ENV] = str(tdp / "trust")
        if argv:
            built = Path(argv[0])
        else:
            from splicecalc.workflow.package import build_demo

            built = tdp / "built"
            build_demo(built, progress=False)
        pw = b"benchmark passphrase"
        a = keys.new_key("A. Preparer", tdp / "a.p12", pw)
        b = keys.new_key("B. Checker", tdp / "b.p12", pw)
        sign_t, verify_t, thorough_t = [], [], []
        for i in range(5):
            d = tdp / f"run{i}"
            d.mkdir()
            for f in built.iterdir():
                if f.is_file() and not f.name.startswith("."):
                    shutil.copy2(f, d / f.name)
            pdf = d / f"{NAME}.pdf"
            t1 = time.perf_counter()
            sign_package(pdf, "prepared", keys.load_key(a.path, pw))
            t2 = time.perf_counter()
            sign_package(pdf, "checked", keys.load_key(b.path, pw),
                         accept_not_checked="covered by a separate calc (benchmark)")
            t3 = time.perf_counter()
            st = verify_package(pdf)
            t4 = time.perf_counter()
            assert st.state == "valid", st.lines
            sigs = pdfsign.validate_pdf_bytes(pdf.read_bytes(), [], thorough=True)
            t5 = time.perf_counter()
            assert not any(s.problems for s in sigs)
            sign_t += [t2 - t1, t3 - t2]
            verify_t.append(t4 - t3)
            thorough_t.append(t5 - t4)
        cli_sign, cli_verify, bare, cli_sign_cpu, cli_verify_cpu = _cli_times(built, tdp, (a.path, b.path), pw)
        from pyhanko.pdf_utils.reader import PdfFileReader

        with open(built / f"{NAME}.pdf", "rb") as fh:
            pages = f"demo package ({PdfFileReader(fh).root['/Pages']['/Count']} sheets)"
    ms = lambda xs: statistics.median(xs) * 1e3  # noqa: E731
    print(f"{pages}; pyHanko import (once per process): {imports_s * 1e3:.0f} ms")
    print(f"sign (PDF + notebook)      : median {ms(sign_t):7.1f} ms  (target < 1000 ms)")
    print(f"verify (PDF + notebook)    : median {ms(verify_t):7.1f} ms  (target < 1000 ms)")
    print(f"  alternative: pyHanko full difference analysis: median {ms(thorough_t):7.1f} ms "
          f"({statistics.median(thorough_t) / statistics.median(verify_t):.1f}x the quick rule)")
    print(f"new process, `splicecalc sign` : median {ms(cli_sign):7.1f} ms wall, {ms(cli_sign_cpu):7.1f} ms CPU "
          f"(target < 1000 ms; python -c pass: {ms(bare):.0f} ms)")
    print(f"new process, `splicecalc verify`: median {ms(cli_verify):7.1f} ms wall, {ms(cli_verify_cpu):7.1f} ms CPU "
          f"(target < 1000 ms)")
    print(f"load average while measured: {os.getloadavg()[0]:.1f} ({os.cpu_count()} CPUs)")
    worst = max(statistics.median(x) for x in (sign_t, verify_t, cli_sign, cli_verify))
    return 0 if worst < 1.0 else 1


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
