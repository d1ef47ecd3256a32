"""Numbers a checker reads: the one display-unit table (core.units.TEX_DISPLAY_UNITS / DISPLAY_UNITS)
and the tidying of rendered steps (core.render.tex_clean), checked against hand conversions.

Conversions by definition of the SI prefixes (1 cm = 10 mm, so 1 cm3 = 1e3 mm3, 1 cm4 = 1e4 mm4,
1 dm6 = 1e12 mm6; 1 kN = 1e3 N; 1 MN = 1e3 kN; 1 MN/m = 1e3 kN/m; 1 GPa = 1e3 MPa)."""

from __future__ import annotations

import pytest

from splicecalc.core.record import Calc
from splicecalc.core.render import display_units, drop_zero_terms, tex_clean
from splicecalc.core.units import displayed


@pytest.mark.parametrize("value, unit, shown, want", [
    (1199467.396, "mm3", "cm3", 1199.467396),        # 1 cm3 = 1000 mm3
    (120300000.0, "mm4", "cm4", 12030.0),            # 1 cm4 = 10 000 mm4
    (465949633201.973, "mm6", "dm6", 0.465949633201973),  # 1 dm6 = 1e12 mm6 (UK section tables)
    (94080.0, "N", "kN", 94.08),                      # 1 kN = 1000 N
    (2.6e8, "Nmm", "kNm", 260.0),                     # 1 kN m = 1e6 N mm
    (355.0, "MPa", "MPa", 355.0),                     # N/mm2 = MPa
])
def test_displayed_units_by_hand(value, unit, shown, want):
    v, u = displayed(value, unit)
    assert u == shown and v == pytest.approx(want, rel=1e-12)


@pytest.mark.parametrize("tex, want", [
    # section properties: / 1e3, 1e4, 1e6, then 5 significant figures as section tables print them
    (r"1199467.396\ \mathrm{mm}^{3}", r"1199.5\ \mathrm{cm}^{3}"),            # 1199.467 cm3
    (r"12030641.514\ \mathrm{mm}^{4}", r"1203.1\ \mathrm{cm}^{4}"),           # 1203.064 cm4
    (r"465949633201.973\ \mathrm{mm}^{6}", r"0.46595\ \mathrm{dm}^{6}"),     # 0.465950 dm6
    (r"1.248\ \mathrm{MN/m}", r"1248\ \mathrm{kN/m}"),                       # weld per length, x 1e3
    (r"254999990.508\ \mathrm{mm}^{4}", r"25500\ \mathrm{cm}^{4}"),           # 457x152x60 UKB I_y from geometry
    (r"81234.000\ \mathrm{mm}^{3}", r"81.234\ \mathrm{cm}^{3}"),              # never more decimals than given
    (r"1.022\ \mathrm{MN} \cdot \mathrm{m}", r"1022\ \mathrm{kN} \cdot \mathrm{m}"),  # x 1e3, no digits invented
    (r"210.000\ \mathrm{GPa}", r"210000\ \mathrm{MPa}"),                      # x 1e3
    (r"500.000\ \mathrm{N}", r"0.500\ \mathrm{kN}"),                          # / 1e3
])
def test_rendered_numbers_in_engineers_units(tex, want):
    assert display_units(tex) == want


def test_compound_units_are_left_alone():
    for tex in (r"5.000\ \mathrm{N} / \mathrm{mm}", r"5.000\ \mathrm{N} \cdot \mathrm{mm}",
                r"3.000\ \mathrm{mm}^{2}", r"12.000\ \mathrm{mm}"):
        assert display_units(tex) == tex


def test_no_abs_and_no_double_signs():
    out = tex_clean(r"M &= \operatorname{abs} \left( M_{Ed} \right) + \operatorname{abs} \left( \left( a \right) "
                    r"\cdot b \right) = 1 - -1.000 + -2.500 = \sqrt { - -1.000 }")
    assert "abs" not in out and r"\left| M_{Ed} \right|" in out and r"\left| \left( a \right) \cdot b \right|" in out
    assert "- -" not in out and "+ -" not in out
    assert "1 + 1.000 - 2.500" in out and r"\sqrt { 1.000 }" in out


def test_no_zero_terms_in_numbers():
    # a term that prints as zero is left out of the numeric substitution; the formula keeps its name
    out = tex_clean(r"F_{f_{Ed}} &= \frac{ M }{ z } + \operatorname{abs} \left( N \right)  = \frac{ 242.540\ "
                    r"\mathrm{kN} \cdot \mathrm{m} }{ 441.300\ \mathrm{mm} } + \operatorname{abs} \left( 0.000\ "
                    r"\mathrm{kN} \right) &= 549.603\ \mathrm{kN}")
    assert r"\left| N \right|" in out and "0.000" not in out and r"441.300\ \mathrm{mm} } &=" in out
    out = tex_clean(r"F_{x} &= \frac{ N }{ n } + M \cdot z = \frac{ 0.000\ \mathrm{kN} }{ 8 } + 2.000 \cdot 3.000 &= 6.000")
    assert r"= 2.000 \cdot 3.000 &= 6.000" in out and r"\frac{ N }{ n } + M" in out
    # (a)^2 + (0/b)^beta: the zero power goes; a product that is zero as a whole stays
    assert drop_zero_terms(r"\left( 0.500 \right) ^{ 2 } + \left( \frac{ 0.000 }{ 62.699 } \right) ^{ 1.000 }") == \
        r"\left( 0.500 \right) ^{ 2 }"
    assert drop_zero_terms(r"0.464 \cdot \frac{ 0.000 }{ 6.000 }") == r"0.464 \cdot \frac{ 0.000 }{ 6.000 }"
    assert drop_zero_terms(r"0.000 - 5.000") == "- 5.000"
    assert drop_zero_terms(r"\frac{ 1.000 }{ 0.000 } + 2.000") == r"\frac{ 1.000 }{ 0.000 } + 2.000"  # not zero
    assert drop_zero_terms(r"\frac{ N }{ n } + 0.000") == r"\frac{ N }{ n } + 0.000"      # a symbol: the formula


def test_rendered_check_shows_cm3_and_kNm():
    from splicecalc.members import en1993_1_1 as f11

    calc = Calc(render=True)
    M = calc(f11.M_c_Rd, W_y=1471e3, f_y=355.0, gamma_M0=1.0)
    assert M == pytest.approx(1471e3 * 355.0)                 # EN 1993-1-1 Eq. 6.13 by hand, N mm
    tex = calc.latex[0]
    assert r"1471.0\ \mathrm{cm}^{3}" in tex and r"522.205\ \mathrm{kN} \cdot \mathrm{m}" in tex
    assert r"\mathrm{mm}^{3}" not in tex
