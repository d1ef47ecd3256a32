"""Automatic splice layout and the top-level design: passing cheapest layout, alternatives,
explicit layouts checked as given, rendering, drawing, clear errors.

Reference for the section: 457x191x67 UKB dimensions (BS 4-1 table, from memory).
"""

from __future__ import annotations

import pytest
from matplotlib.figure import Figure

from splicecalc.core.errors import InputError
from splicecalc.core.record import Calc
from splicecalc.design.splice_layout import design_splice
from splicecalc.joints.splice import parse_splices
from splicecalc.joints.bolts import F_r_Ed, I_p, U_b_2d
from splicecalc.joints.plates import M_V_Rd_el
from splicecalc.joints.splice.checks import W_el_net_plate
from splicecalc.joints.splice.forces import F_f_Ed, I_web, M_w_Ed, e_w
from splicecalc.sections import measured_section

UKB457 = measured_section(h=453.4, b=189.9, tw=8.5, tf=12.7, r=10.2, designation="457x191x67 UKB (measured)")


def test_auto_layout_passes_and_is_cheapest_of_those_found():
    spec = parse_splices({})
    d = design_splice(UKB457, "S355", 250e6, 200e3, spec=spec)
    assert d.ok and d.max_utilisation <= 1.0
    assert 1 <= len(d.alternatives) <= 2
    assert all(a.ok and a.cost >= d.cost - 1e-9 for a in d.alternatives)
    assert all((a.layout.bolt_size, a.layout.flange, a.layout.web) !=
               (d.layout.bolt_size, d.layout.flange, d.layout.web) for a in d.alternatives)
    # stated cost: per_bolt x bolts + per_kg x plate mass
    assert d.cost == pytest.approx(1.0 * d.n_bolts + 0.5 * d.plate_mass)


def test_cost_weights_change_the_choice_direction():
    cheap_bolts = design_splice(UKB457, "S355", 250e6, 200e3, spec=parse_splices({"cost": {"per_bolt": 0.01, "per_kg": 1.0}}))
    cheap_steel = design_splice(UKB457, "S355", 250e6, 200e3, spec=parse_splices({"cost": {"per_bolt": 1.0, "per_kg": 0.001}}))
    assert cheap_bolts.plate_mass <= cheap_steel.plate_mass + 1e-9
    assert cheap_steel.n_bolts <= cheap_bolts.n_bolts


def test_fixed_bolt_and_inner_plates_and_category_c():
    spec = parse_splices({"bolts": "M20 8.8", "flange_plates": "outer+inner", "category": "C"})
    d = design_splice(UKB457, "S355", 300e6, 150e3, spec=spec)
    assert d.ok and d.layout.bolt_size == "M20" and d.layout.flange.inner_plate > 0
    ids = {r.id for r in d.records}
    assert {"flange_bolt_slip", "web_bolt_slip", "inner_plate_tension", "block_inner_plate"} <= ids


def test_explicit_layout_checked_as_given_and_failing_reported():
    spec = parse_splices({"bolts": "M20 8.8", "layout": {
        "flange": {"rows": 1, "columns": 2, "pitch": "70 mm", "gauge": "100 mm", "plate": "8 mm"},
        "web": {"rows": 3, "columns": 1, "pitch": "70 mm", "plate": "8 mm"}}})
    d = design_splice(UKB457, "S355", 400e6, 300e3, spec=spec)
    assert d.layout.flange.rows == 1 and not d.ok and d.alternatives == ()


def test_no_passing_layout_is_a_clear_error():
    with pytest.raises(InputError, match="splice"):
        design_splice(UKB457, "S355", 5000e6, 200e3, spec=parse_splices({"bolts": "M12 8.8"}))


def test_bad_inputs():
    with pytest.raises(InputError):
        design_splice(UKB457, "S355", float("nan"), 1e3, spec=parse_splices({}))
    with pytest.raises(InputError):
        design_splice("457x191x67", "S355", 1e6, 1e3, spec=parse_splices({}))
    with pytest.raises(InputError):
        design_splice(UKB457, "S999", 1e6, 1e3, spec=parse_splices({}))


def test_render_and_drawing():
    d = design_splice(UKB457, "S355", 250e6, 200e3, spec=parse_splices({"bolts": "M24 8.8"}), render=True)
    fig = d.drawing()
    assert isinstance(fig, Figure) and len(fig.axes) == 2
    assert len(d.force_latex) >= 8 and any(r.latex for r in d.records)
    plain = design_splice(UKB457, "S355", 250e6, 200e3, spec=parse_splices({"bolts": "M24 8.8"}))
    assert [r.utilisation for r in d.records] == pytest.approx([r.utilisation for r in plain.records], rel=1e-6)
    assert d.to_dict()["n_bolts"] == d.n_bolts


@pytest.mark.parametrize("fn", [I_web, M_w_Ed, F_f_Ed, e_w, I_p, U_b_2d, F_r_Ed, W_el_net_plate, M_V_Rd_el])
def test_splice_formulas_render_like_floats(fn):
    ex = fn.__clause__.example
    latex = Calc(render=True)
    r = latex(fn, **ex)
    assert r == pytest.approx(fn(**ex), rel=1e-6)
    assert latex.latex and "\\" in latex.latex[0]
