"""One formula, one place, one name: no two registered clause formulas share a body.

Two formulas are "the same body" when their statements are identical once the local
names are numbered in order and each argument is named by its unit and its order of
first use (so ``I_p(n_r, n_c, p_1, p_2)`` and ``I_p_bolts(n_1, n_2, p_1, p_2)`` match,
and so do ``(1 - rho) W f_y / gamma_M0`` under any argument order). Different code
equations that happen to share their algebra are listed in :data:`DISTINCT` with the
reason; a listed pair must cite different clauses or rows, so the list cannot hide a
real duplicate. Outside reference: none needed (a structural property of the code base).
"""

from __future__ import annotations

import ast
import collections
import inspect
import textwrap

import pytest

from splicecalc.core.clause import clause

from test_clause_registry import FORMULAS

#: pairs of formulas with the same algebra that are different code equations (reason beside each)
DISTINCT: dict[frozenset[str], str] = {
    frozenset({"joints.bolts.F_v_Rd", "joints.bolts.F_t_Rd"}):
        "EN 1993-1-8 Table 3.4: shear row (alpha_v) and tension row (k_2) of the same table",
    frozenset({"actions.formulas.w_k_freq", "actions.formulas.w_k_qp"}):
        "EN 1990 Eq. (6.15b) frequent and Eq. (6.16b) quasi-permanent combinations",
    frozenset({"members.en1993_1_1.N_pl_Rd", "members.en1993_1_1.N_net_Rd"}):
        "EN 1993-1-1 Eq. 6.6 gross section and Eq. 6.8 net section at f_y (category C)",
    frozenset({"joints.splice.forces.N_f_Ed", "joints.connections.formulas.F_hor_Ed"}):
        "axial share of a flange (N b t_f / A) and a bolt's horizontal force (V z y / I_p): unrelated mechanics",
}


def _name(fn) -> str:
    return fn.__module__.split(".", 1)[-1] + "." + fn.__name__


def body_key(fn) -> str:
    """The formula's body with local names numbered and arguments named by unit and order of use."""
    info = fn.__clause__
    tree = ast.parse(textwrap.dedent(inspect.getsource(fn))).body[0]
    body = list(tree.body)
    if body and isinstance(body[0], ast.Expr) and isinstance(body[0].value, ast.Constant):
        body = body[1:]                                            # the docstring
    args = {a.arg for a in tree.args.args + tree.args.kwonlyargs}
    ren: dict[str, str] = {}
    per_unit: collections.Counter = collections.Counter()
    n_local = 0
    for st in body:
        for node in ast.walk(st):
            if isinstance(node, ast.Name) and node.id not in ren:
                if node.id in args:
                    u = info.units.get(node.id, "")
                    ren[node.id] = f"arg[{u}]{per_unit[u]}"
                    per_unit[u] += 1
                elif isinstance(node.ctx, ast.Store):
                    ren[node.id] = f"local{n_local}"
                    n_local += 1

    class Rename(ast.NodeTransformer):
        def visit_Name(self, node):
            return ast.copy_location(ast.Name(id=ren.get(node.id, node.id), ctx=node.ctx), node)

    return info.returns + "|" + ast.dump(ast.Module(body=[Rename().visit(s) for s in body], type_ignores=[]))


def duplicates(formulas) -> list[list[str]]:
    groups: dict[str, list] = collections.defaultdict(list)
    for fn in formulas:
        groups[body_key(fn)].append(fn)
    return [sorted(_name(f) for f in g) for g in groups.values() if len(g) > 1]


def test_no_two_registered_formulas_share_a_body():
    bad = []
    for group in duplicates(FORMULAS):
        for i, a in enumerate(group):
            for b in group[i + 1:]:
                if frozenset({a, b}) not in DISTINCT:
                    bad.append((a, b))
    assert not bad, f"same formula under two names (merge to one home): {bad}"


def test_no_two_registered_formulas_share_a_name():
    names = collections.Counter(fn.__name__ for fn in FORMULAS)
    assert [n for n, c in names.items() if c > 1] == []


def test_listed_distinct_pairs_exist_and_cite_different_equations():
    by_name = {_name(f): f for f in FORMULAS}
    for pair, why in DISTINCT.items():
        a, b = sorted(pair)
        assert a in by_name and b in by_name, f"stale DISTINCT entry {pair}: {why}"
        assert body_key(by_name[a]) == body_key(by_name[b]), f"{pair} no longer share a body: drop the entry"
        ca, cb = by_name[a].__clause__.citation, by_name[b].__clause__.citation
        assert ca != cb or "Table" in ca, f"{pair} cite the same clause {ca}: one formula"


def test_the_detector_catches_a_renamed_copy():
    # a copy of the polar bolt-group formula with other argument names and argument order must be caught
    @clause("EN 1993-1-8:2005, 3.12(3)", units={"p_1": "mm", "p_2": "mm"}, returns="mm2",
            example=dict(n_r=2, n_c=1, p_1=70.0, p_2=0.0))
    def I_p_one(n_r: int, n_c: int, p_1: float, p_2: float) -> float:
        I_p = n_c * n_r * (n_r ** 2 - 1) * p_1 ** 2 / 12 + n_r * n_c * (n_c ** 2 - 1) * p_2 ** 2 / 12
        return I_p

    @clause("EN 1993-1-8:2005, 3.7(1)", units={"a": "mm", "b": "mm"}, returns="mm2",
            example=dict(n_1=2, n_2=1, a=70.0, b=0.0))
    def I_p_two(n_2: int, n_1: int, a: float, b: float) -> float:
        s = n_2 * n_1 * (n_1 ** 2 - 1) * a ** 2 / 12 + n_1 * n_2 * (n_2 ** 2 - 1) * b ** 2 / 12
        return s

    from splicecalc.core.clause import REGISTRY
    try:
        # argument names differ; only the order of first use and the units make them one formula
        assert body_key(I_p_one) == body_key(I_p_two)
        assert duplicates([I_p_one, I_p_two])
    finally:
        REGISTRY.remove(I_p_one)
        REGISTRY.remove(I_p_two)


@pytest.mark.parametrize("pair", sorted(DISTINCT, key=sorted), ids=lambda p: " vs ".join(sorted(p)))
def test_distinct_reasons_are_stated(pair):
    assert len(DISTINCT[pair]) > 20
