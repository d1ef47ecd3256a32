"""`restraints = "continuous"`: the top flange held along the whole span (a floor fixed to it). A simply
supported beam under downward loads has its top flange in compression everywhere, so lateral-torsional
buckling cannot occur (EN 1993-1-1 6.3.2.1: LTB concerns members not restrained laterally); the check
becomes an information record naming the restraint to be confirmed, never a silent omission."""

from __future__ import annotations

from pathlib import Path

import pytest

from splicecalc.core.errors import InputError
from splicecalc.design.beam import design_beam
from splicecalc.job import loads_job

EXAMPLE = Path(__file__).resolve().parents[1] / "examples" / "mezzanine_infill.toml"


def _job(restraints: str):
    text = EXAMPLE.read_text(encoding="utf-8")
    line = next(ln for ln in text.splitlines() if ln.startswith("restraints"))
    return loads_job(text.replace(line, f"restraints = {restraints}"))


def test_continuous_restraint_replaces_ltb_by_an_information_record():
    job = _job('"continuous"')
    assert job.beam.continuous_restraint and job.beam.restraints == ()
    assert loads_job(job.to_toml()) == job                              # written back as "continuous"
    d = design_beam(job)
    ltb = [r for r in d.records if "lateral-torsional" in r.title.lower()]
    assert len(ltb) == 1 and ltb[0].status == "info" and "restrained continuously" in ltb[0].title
    assert "to be confirmed" in ltb[0].note
    # without any restraint the same beam must be checked for LTB and is at least as heavy
    free = design_beam(_job("[]"))
    assert any(r.id.startswith("ltb") and r.checked for r in free.records)
    assert free.section.mass_nominal >= d.section.mass_nominal


def test_continuous_and_positions_together_is_refused():
    from splicecalc.job.model import BeamSpec

    with pytest.raises(InputError) as e:
        BeamSpec(span=7200.0, restraints=(2400.0,), continuous_restraint=True)
    assert str(e.value).startswith("beam.restraints")
    with pytest.raises(InputError) as e:
        _job('"everywhere"')
    assert "continuous" in str(e.value)
