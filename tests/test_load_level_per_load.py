"""A load level per load: a point load hung from the bottom flange (`applied_to = "bottom flange"`) acts
below the shear centre and stabilises the beam, one on the top flange destabilises it; the numerical
M_cr of the lateral-torsional buckling check takes each point load at its own height. Reference: the
load-height effect of the closed-form M_cr (C_1, C_2, z_g formula, published NCCI): a larger M_cr for
z_g < 0 than for z_g > 0, the same beam and loads otherwise."""

from __future__ import annotations

from pathlib import Path

from splicecalc.design.beam import design_beam
from splicecalc.job import loads_job

EXAMPLE = Path(__file__).resolve().parents[1] / "examples" / "mezzanine_infill.toml"


def _job(applied_to: str):
    text = EXAMPLE.read_text(encoding="utf-8")
    text = text.replace('section = "auto"', 'section = "356x171x51 UKB"')
    text = text.replace('point = "35 kN"\nat = "3.0 m"', f'point = "35 kN"\nat = "3.0 m"\napplied_to = "{applied_to}"')
    assert applied_to in text
    return loads_job(text)


def _ltb_with_the_point_load(d):
    return [r for r in d.records if r.id.startswith("ltb") and r.checked and "plant skid" in r.note]


def test_bottom_flange_point_load_is_stabilising():
    top = design_beam(_job("top flange"))
    bottom = design_beam(_job("bottom flange"))
    t, b = _ltb_with_the_point_load(top), _ltb_with_the_point_load(bottom)
    assert t and b and len(t) == len(b)
    for rt, rb in zip(t, b):
        assert rb.utilisation < rt.utilisation                     # higher M_cr, lower utilisation
        assert "plant skid at the bottom flange" in rb.note


# ------------------------------------------------------------------ line loads (issue 13)
def _udl_job(applied_to: str | None):
    text = EXAMPLE.read_text(encoding="utf-8").replace('section = "auto"', 'section = "356x171x51 UKB"')
    old = 'udl = "6 kN/m"\nfrom = "0.5 m"\nto = "2.5 m"'
    assert old in text
    if applied_to is not None:
        text = text.replace(old, old + f'\napplied_to = "{applied_to}"')
    return text


def _ltb_segment_1(d):
    return [r for r in d.records if r.id.startswith("ltb") and r.checked and "segment 1" in r.title]


def test_line_load_hung_from_the_bottom_flange_is_stabilising():
    # the storage strip (x = 0.5 to 2.5 m, segment 1) hung from the bottom flange acts below the shear centre:
    # a higher M_cr than on the top flange (the beam's load level), so a lower utilisation; the note says so
    top, bottom = (design_beam(loads_job(_udl_job(a))) for a in (None, "bottom flange"))
    centre = design_beam(loads_job(_udl_job("shear centre")))
    t, b, c = _ltb_segment_1(top)[0], _ltb_segment_1(bottom)[0], _ltb_segment_1(centre)[0]
    assert b.utilisation < c.utilisation < t.utilisation
    assert "storage strip at the bottom flange" in b.note and "storage strip" not in t.note
    # segment 3 (x = 4.8 to 7.2 m), which the strip does not reach, is unchanged (segment 2 holds its last 0.1 m)
    seg3 = lambda d: [r.utilisation for r in d.records if r.id == "ltb_3"]  # noqa: E731
    assert seg3(top) == seg3(bottom) and len(seg3(top)) == 1


def test_line_load_level_round_trips_and_shows_where_it_acts():
    from splicecalc.job.model import load_to_dict
    from splicecalc.workflow.display import job_tables

    job = loads_job(_udl_job("bottom flange"))
    strip = [ld for ld in job.loads if ld.name == "storage strip"][0]
    assert strip.applied_to == "bottom flange" and load_to_dict(strip)["applied_to"] == "bottom flange"
    assert "applied_to" not in load_to_dict([ld for ld in job.loads if ld.name == "office floor"][0])
    loads = [t for t in job_tables(job) if t.payload["title"].startswith("Characteristic loads")][0]
    row = [r for r in loads.payload["rows"] if r[0] == "storage strip"][0]
    assert row[-1] == "0.5 to 2.5 m, at the bottom flange"


def test_line_load_level_bad_value_is_one_line_naming_the_field():
    import pytest

    from splicecalc.core.errors import InputError

    with pytest.raises(InputError) as err:
        loads_job(_udl_job("web"))
    msg = str(err.value)
    assert "load[4].applied_to" in msg and "'web'" in msg and "'bottom flange'" in msg and "\n" not in msg


def test_loading_diagram_says_where_a_line_load_acts():
    from splicecalc.analysis import SimpleBeam, beam_diagram_data, draw_beam_diagrams

    job = loads_job(_udl_job("bottom flange"))
    data = beam_diagram_data(SimpleBeam(job.beam.span, list(job.loads)))
    assert [ld["level"] for ld in data["loads"] if ld["name"] == "storage strip"] == ["bottom flange"]
    texts = [t.get_text() for ax in draw_beam_diagrams(data).axes for t in ax.texts]
    assert any(t.startswith("storage strip:") and t.endswith("at the bottom flange") for t in texts)
