"""NOT CHECKED records: a check the package does not make is shown, never silently passed.

Outside reference: the binding rule of the project brief / issue 11 item 8 ("all checks pass" is never
printed over a gap); the values below are the record's own conventions (no engineering numbers).
"""

from __future__ import annotations

import json

import pytest

from splicecalc.core.record import (NOT_CHECKED, Calc, count_verdicts, not_checked, summary_order,
                                    verdict_sentence)
from splicecalc.report.display import CheckOutput, check_payload, summary_output
from splicecalc.report.latexout import check_latex, table_latex


def _ok():
    return Calc().record(id="a", title="A passing check", clause="EN 1993-1-1:2005, 6.2.6(2), Eq. 6.18",
                         demand=50e3, resistance=100e3, unit="N")


def _gap():
    return not_checked(id="gap", title="Existing column as a member", clause="EN 1993-1-1:2005, 6.3.3",
                       reason="the existing loads are not given: add [support.existing_loads]")


def test_not_checked_is_never_a_pass_and_never_governs():
    r = _gap()
    assert r.status == NOT_CHECKED and not r.checked and not r.ok
    assert r.verdict == "NOT CHECKED"
    assert r.utilisation == 0.0
    recs = [_ok(), r]
    assert verdict_sentence([_ok()]) == "All checks pass."
    s = verdict_sentence(recs)
    assert "All checks pass" not in s and "1 check(s) NOT CHECKED" in s and "NOT OK" not in s
    assert count_verdicts(recs) == (0, 1)
    assert sorted(recs, key=summary_order)[0] is r          # gaps listed first


def test_not_checked_json_has_no_numbers():
    d = json.loads(_gap().to_json())
    assert d["status"] == "not checked" and d["utilisation"] is None and d["demand"] is None
    assert "existing loads" in d["note"]
    assert "status" not in _ok().to_dict()                  # made checks keep their old JSON


def test_not_checked_needs_a_reason():
    with pytest.raises(ValueError):
        not_checked(id="x", title="x", clause="EN 1990:2002, 6.4.3.2", reason=" ")


def test_outputs_show_not_checked():
    r = _gap()
    p = check_payload(r)
    assert p["verdict"] == "NOT CHECKED" and p["utilisation"] is None
    tex = check_latex(p)
    assert "NOT CHECKED" in tex and "0.00" not in tex
    md = CheckOutput(r)._repr_mimebundle_()["text/markdown"]
    assert "NOT CHECKED" in md and "utilisation" not in md
    t = summary_output([_ok(), r])
    assert t.payload["notes"].startswith("1 check(s) NOT CHECKED")
    assert t.payload["rows"][0][-1] == "NOT CHECKED"
    assert "NOT CHECKED" in table_latex(t.payload)


def test_part_verdict_of_the_summary_by_part():
    from splicecalc.workflow.display import _part_verdict

    bad = Calc().record(id="b", title="A failing check", clause="EN 1993-1-1:2005, 6.2.6(2), Eq. 6.18",
                        demand=150e3, resistance=100e3, unit="N")
    assert _part_verdict([_ok()]) == "OK"
    assert _part_verdict([_ok(), _gap()]) == "NOT CHECKED"           # a gap is not a failure, nor a pass
    assert _part_verdict([bad, _gap()]) == "NOT OK"
