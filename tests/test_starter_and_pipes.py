"""`splicecalc new` writes a minimal, commented starter job with no demo data (every design value a
marked placeholder, valid as it stands); output piped into a reader that stops early (`| head`) ends
quietly, without a traceback or an error line."""

from __future__ import annotations

import subprocess
import sys
import tomllib

from splicecalc.job import loads_job
from splicecalc.workflow.package import demo_job_path, starter_job


def test_starter_has_no_demo_data_and_is_valid():
    text = starter_job(project='Hollin "Lane" stores', number="HL-7", title="Beam B1")
    job = loads_job(text)                                        # valid as written
    doc = tomllib.loads(text)
    assert doc["project"] == {"number": "HL-7", "title": "Beam B1", "location": 'Hollin "Lane" stores'}
    demo = tomllib.loads(demo_job_path().read_text(encoding="utf-8"))
    demo_names = {ld["name"] for ld in demo["load"]}
    assert not demo_names & {ld.name for ld in job.loads}       # none of the demo's loads
    assert "splices" not in doc and "support" not in doc         # optional parts only as comments
    assert demo["project"]["title"] not in text
    # every design value is marked as a placeholder to replace
    for key in ("span", "udl"):
        for line in text.splitlines():
            if line.startswith(f"{key} ="):
                assert "REPLACE" in line, line
    assert text.count("#") > 20                                  # commented


def test_starter_without_project_fields():
    text = starter_job()
    assert "# [project]" in text
    loads_job(text)


def _piped(*args: str) -> subprocess.CompletedProcess:
    cmd = [sys.executable, "-m", "splicecalc.cli.main", *args]
    p1 = subprocess.Popen(cmd, stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    p1.stdout.readline()                                         # read one line, then stop reading
    p1.stdout.close()
    err = p1.stderr.read().decode()
    p1.wait(timeout=120)
    return subprocess.CompletedProcess(cmd, p1.returncode, "", err)


def test_pipe_closed_early_is_quiet():
    for args in (("sections", "--json"),):                     # about 130 kB: more than a pipe holds
        p = _piped(*args)
        assert "Traceback" not in p.stderr and "error" not in p.stderr.lower(), p.stderr
        assert p.returncode in (0, 141)
