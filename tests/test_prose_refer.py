"""An existing member's checks repeat one long prose line (combination, reaction, eccentricity, forces) word
for word: after the first check prints it, later ones refer to it by title and keep the forces; formulas,
short lines and the numbers of the records are never touched (issue 13, concise package)."""
from splicecalc.core.record import CheckRecord
from splicecalc.workflow.display import PROSE_REFER_MIN, refer_repeated_prose

BASIS = ("Combination ULS 6.10b, leading: imposed H: 0.925 x 1.35 G + 1.5 Q. Reaction 91.4 kN at e = 227.0 mm "
         "from the column axis (nominal eccentricity of simple construction), 1 of R e taken by this length as an "
         "end moment at the connection end: N_Ed = 270.1 kN, M_y,Ed = 20.76 kNm, M_z,Ed = 0.00 kNm.")
MATH = "$$\\begin{aligned} N_{cr} &= 10000\\ \\mathrm{kN} \\end{aligned}$$"


def rec(i, steps):
    return CheckRecord(id=f"c{i}", title=f"Check {i}", clause="EN 1993-1-1:2005, 6.3.1.1", demand=1.0,
                       resistance=2.0 + i, unit="kN", utilisation=1.0 / (2.0 + i), ok=True, latex=tuple(steps))


def test_a_repeated_basis_refers_to_the_first_check_and_keeps_its_forces():
    assert len(BASIS) >= PROSE_REFER_MIN
    a, b, c = refer_repeated_prose([rec(1, [BASIS, MATH]), rec(2, [BASIS, MATH]), rec(3, ["short", MATH])])
    assert a.latex == (BASIS, MATH)                      # the first prints it in full
    assert b.latex[1] == MATH                            # formulas are never referred
    assert b.latex[0].startswith("Combination, actions and basis as stated for Check 1 above")
    assert b.latex[0].endswith("N_Ed = 270.1 kN, M_y,Ed = 20.76 kNm, M_z,Ed = 0.00 kNm.")
    assert c.latex == ("short", MATH)
    assert (b.id, b.demand, b.resistance, b.utilisation) == ("c2", 1.0, 4.0, 0.25)


def test_a_different_basis_is_printed_in_full():
    other = BASIS.replace("270.1", "264.7")
    _, b = refer_repeated_prose([rec(1, [BASIS]), rec(2, [other])])
    assert b.latex == (other,)
