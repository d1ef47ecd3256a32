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
