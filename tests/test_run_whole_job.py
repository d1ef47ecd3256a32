"""``splicecalc run``: the whole job (beam, positions, splices, end connections, existing members).

Outside reference for the comparison: the calc package's own path, ``run_calc(job, render=True)``
(what the notebook calls; handcalcs renders each formula from the same function). ``run`` takes
the plain-float path of the same function; both must give the same records, demand for demand.
The CLI is run as a user would, in a subprocess, and its exit codes and messages are checked.
"""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest

from splicecalc.job import load_job
from splicecalc.workflow import run_calc
from splicecalc.workflow.parts import job_parts, whole_job_dict

EXAMPLES = Path(__file__).resolve().parents[1] / "examples"
DEMO = EXAMPLES / "demo_workshop_gallery.toml"
CLI = [sys.executable, "-m", "splicecalc.cli.main"]


def cli(*args: str) -> subprocess.CompletedProcess:
    return subprocess.run([*CLI, *args], capture_output=True, text=True, timeout=300)


@pytest.fixture(scope="module")
def demo_json():
    p = cli("run", str(DEMO), "--json")
    assert p.returncode == 3, p.stderr      # the demo's beam-web tying yield lines are NOT CHECKED (no pass)
    return json.loads(p.stdout)


def test_json_has_every_part_of_the_job(demo_json):
    kinds = [p["kind"] for p in demo_json["parts"]]
    job = load_job(DEMO)
    n_splices = len(demo_json["splice_positions"]["positions_m"])
    assert n_splices >= 1                                                 # the demo is cut (access limits)
    assert kinds == ["member", "positions"] + ["splice"] * n_splices + ["connection"] * len(job.supports) \
        + ["existing"] * len(job.supports)
    ids = [c["id"] for p in demo_json["parts"] for c in p["checks"]]
    assert len(ids) == len(set(ids)) == demo_json["checks_count"]
    for p in demo_json["parts"]:
        made = [c for c in p["checks"] if c["utilisation"] is not None]   # NOT CHECKED / INFO never govern
        worst = max(made, key=lambda c: c["utilisation"])
        assert p["governing"]["id"] == worst["id"]


def test_run_equals_the_package_path(demo_json):
    # the package renders every check (render=True); run takes plain floats: same records
    rendered = run_calc(load_job(DEMO), render=True)
    assert [r.id for r in rendered.records] == [c["id"] for p in demo_json["parts"] for c in p["checks"]]
    by_id = {c["id"]: c for p in demo_json["parts"] for c in p["checks"]}
    for r in rendered.records:
        c = by_id[r.id]
        d = r.to_dict()
        for key in d:
            if key.startswith(("demand", "resistance")) and d[key] is not None:
                assert c[key] == pytest.approx(d[key], rel=1e-9, abs=1e-9), (r.id, key)
        if d["utilisation"] is None:                                    # NOT CHECKED / INFO: no numbers
            assert c["utilisation"] is None
            continue
        assert c["utilisation"] == pytest.approx(d["utilisation"], rel=1e-9)
        assert c["clause"] == r.clause and c["ok"] == r.ok


def test_parts_cover_every_record_once():
    res = run_calc(load_job(EXAMPLES / "plant_room_trimmer.toml"), render=False)
    parts = job_parts(res)
    flat = [r for p in parts for r in p.records]
    assert [r.id for r in flat] == [r.id for r in res.records]
    d = whole_job_dict(res, "x.toml")
    assert d["ok"] == res.ok and d["checks_count"] == len(res.records)


def test_text_has_one_table_per_part_and_our_wording():
    p = cli("run", str(DEMO))
    assert p.returncode == 3, p.stderr      # NOT CHECKED items: exit 3, listed, never "all checks within"
    out = p.stdout
    assert "NOT CHECKED" in out and "All " not in out
    res = run_calc(load_job(DEMO), render=False)
    for part in job_parts(res):
        assert part.title in out
    assert out.count("governing: ") == len(job_parts(res))
    assert "within capacity" in out and "E_d" in out and "R_d" in out and "clause" in out
    first_words = {ln.split()[0] for ln in out.splitlines() if ln.strip()}
    assert not first_words & {"PASS", "FAIL", "PASS:", "FAIL:"}
    assert "ltb_" not in out                                             # internal ids never printed


def _write(tmp_path: Path, text: str) -> Path:
    f = tmp_path / "job.toml"
    f.write_text(text, encoding="utf-8")
    return f


def test_exit_1_when_a_check_exceeds_capacity(tmp_path):
    text = (EXAMPLES / "mezzanine_infill.toml").read_text(encoding="utf-8")
    new = text.replace('section = "auto"', 'section = "254x102x22 UKB"')
    assert new != text
    p = cli("run", str(_write(tmp_path, new)))
    assert p.returncode == 1, p.stderr
    assert "EXCEEDS capacity" in p.stdout and "Traceback" not in p.stderr
    assert "OVER" in p.stdout                                            # the failing rows are marked


def test_exit_2_on_bad_input_one_line(tmp_path):
    text = DEMO.read_text(encoding="utf-8").replace("[beam]", "[beam]\nspan_typo = 3", 1)
    p = cli("run", str(_write(tmp_path, text)))
    assert p.returncode == 2
    assert len(p.stderr.strip().splitlines()) == 1 and "Traceback" not in p.stderr
    p = cli("run", str(tmp_path / "missing.toml"))
    assert p.returncode == 2 and "Traceback" not in p.stderr


def test_run_loads_no_renderer_no_scipy():
    # what keeps `splicecalc run` quick (benchmarks/bench_run.py): the plain-float path never imports the
    # renderer (handcalcs, innerscope), scipy (the M_cr eigenproblem is solved with numpy) or numpy.ma
    # (np.unique pulls it in; core.numeric.sorted_unique does not). A structural check, not a timing.
    code = ("import sys, io, contextlib\n"
            "from splicecalc.cli.main import main\n"
            f"sys.argv = ['splicecalc', 'run', {str(DEMO)!r}, '--json']\n"
            "with contextlib.redirect_stdout(io.StringIO()):\n"
            "    try:\n        main()\n    except SystemExit:\n        pass\n"
            "print(sorted(m for m in ('handcalcs', 'innerscope', 'scipy', 'numpy.ma', 'matplotlib') if m in sys.modules))")
    p = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, timeout=300)
    assert p.returncode == 0, p.stderr
    assert p.stdout.strip() == "[]"
