"""Citations of the member checks stay consistent (one format, the right edition, the right clause).

Sources: the UK National Annex to EN 1993-1-1 in force is NA+A1:2014 to BS EN 1993-1-1:2005+A1:2014
(from memory); EN 1993-1-5:2006 gives the transverse-force resistance in 6.2 (Eq. 6.1) and its
verification in 6.6 (Eq. 6.14); the UK NA suggests deflection limits for variable actions only
(NA.2.23), so a total-deflection limit is one agreed for the project (EN 1990 A1.4.3).
"""

from __future__ import annotations

import importlib
import pkgutil
from pathlib import Path

import pytest

import splicecalc
from splicecalc.actions import UDL, PointLoad
from splicecalc.core.clause import CITATION_RE, REGISTRY, citation_of
from splicecalc.design.beam import design_beam
from splicecalc.job import BeamSpec, Job

ROOT = Path(splicecalc.__file__).resolve().parent
NA_1993_1_1 = "UK NA to BS EN 1993-1-1:2005+A1:2014"


@pytest.fixture(scope="module")
def design():
    job = Job(beam=BeamSpec(span=7200.0, grade="S355", section="457x191x67 UKB", restraints=(2400.0, 4800.0),
                            bearing_length=100.0, total_deflection_limit=250.0),
              loads=(UDL("floor", "permanent", 12.0), UDL("office", "imposed", 10.0, category="B"),
                     PointLoad("plant", "permanent", 30e3, 3000.0)))
    return design_beam(job)


def test_no_old_na_edition_in_the_sources():
    bad = [str(p.relative_to(ROOT)) for p in ROOT.rglob("*.py") if "1993-1-1:2008" in p.read_text(encoding="utf-8")]
    assert not bad


def test_registered_member_formulas_cite_the_current_na():
    for m in pkgutil.iter_modules(splicecalc.members.__path__):
        importlib.import_module(f"splicecalc.members.{m.name}")
    for fn in REGISTRY:
        c = citation_of(fn)
        assert CITATION_RE.match(c), c
        if "NA to BS EN 1993-1-1" in c:
            assert c.startswith(NA_1993_1_1), c


def test_member_records_cite_one_format_and_the_right_clause(design):
    for r in design.records:
        assert CITATION_RE.match(r.clause), r.clause
        if "NA to BS EN 1993-1-1" in r.clause:
            assert r.clause.startswith(NA_1993_1_1)
    for r in design.records:
        if r.id.startswith(("web_bearing_", "transverse_force")):
            assert r.clause == "EN 1993-1-5:2006, 6.6, Eq. 6.14"           # verification, not 6.2 Eq. 6.1
    assert design.record("deflection").clause == f"{NA_1993_1_1}, NA.2.23"
    assert "NA.2.23" not in design.record("deflection_total").clause       # not a UK NA limit
    assert design.record("deflection_total").clause == "EN 1990:2002, A1.4.3"
