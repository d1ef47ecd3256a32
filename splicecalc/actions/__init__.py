"""Actions: load model (EN 1991), psi factors and combinations (EN 1990 with UK NA).

Public API
----------
Load model (w in N/mm = kN/m, P in N, x in mm; loads downward, positive):
    UDL(name, action, w, x_start=0, x_end=None, category=None, group="")
    PointLoad(name, action, P, x, category=None, group="")
    ACTIONS, CATEGORIES, Load, check_loads_on_span(loads, span_mm), self_weight_udl(mass_kg_per_m), g_n
psi factors (EN 1990 Table A1.1, UK NA default):
    PsiFactors, PsiTable, PSI_UK_NA, PSI_EN_RECOMMENDED, psi_factors(action, category, table)
Combinations (EN 1990 6.4.3.2 / 6.5.3):
    Combination, VariableAction, variable_actions(loads, psi)
    uls_combinations(loads, na=UK_NA, psi=PSI_UK_NA)        6.10, or 6.10a + 6.10b (na.combination)
    sls_characteristic / sls_frequent / sls_quasi_permanent / sls_variable_characteristic / sls_combinations
    governing(combos, effect) -> (combination, value)
    render_line_load(combo, loads, span_mm, na, psi, calc)  rendered EN 1990 equation of the full-span line load
Clause formulas (rendered): w_Ed_610, w_Ed_610a, w_Ed_610b, w_k_char, w_k_freq, w_k_qp, w_acc
"""

from ..core.lazy import lazy_exports

# names imported on first use (splicecalc.core.lazy): reading a job's loads needs .loads alone
__getattr__, __dir__, __all__ = lazy_exports(__name__, {
    **{n: ".combinations" for n in ("Combination", "VariableAction", "governing", "render_line_load",
                                    "sls_characteristic", "sls_combinations", "sls_frequent",
                                    "sls_quasi_permanent", "sls_variable_characteristic", "uls_combinations",
                                    "variable_actions")},
    **{n: ".formulas" for n in ("w_acc", "w_Ed_610", "w_Ed_610a", "w_Ed_610b", "w_k_char", "w_k_freq",
                                "w_k_qp")},
    **{n: ".loads" for n in ("ACTIONS", "CATEGORIES", "UDL", "Load", "PointLoad", "check_loads_on_span", "g_n",
                             "self_weight_udl")},
    **{n: ".psi" for n in ("PSI_EN_RECOMMENDED", "PSI_UK_NA", "PsiFactors", "PsiTable", "psi_factors")},
})
