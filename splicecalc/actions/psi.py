"""Combination factors psi_0, psi_1, psi_2 for buildings.

EN 1990:2002, A1.2.2, Table A1.1, with the values of the UK National Annex
(NA to BS EN 1990:2002+A1:2005, Table NA.A1.1) as the default table. Values
are *from memory* of those tables; they are data, passed explicitly as a
frozen :class:`PsiTable` so another annex is a new instance.

UK NA (from memory):

=====================================  =====  =====  =====
action                                 psi_0  psi_1  psi_2
=====================================  =====  =====  =====
imposed A domestic, residential        0.7    0.5    0.3
imposed B offices                      0.7    0.5    0.3
imposed C congregation                 0.7    0.7    0.6
imposed D shopping                     0.7    0.7    0.6
imposed E storage                      1.0    0.9    0.8
imposed F traffic, vehicle <= 30 kN    0.7    0.7    0.6
imposed G traffic, 30 to 160 kN        0.7    0.5    0.3
imposed H roofs                        0.7    0      0
snow, site altitude <= 1000 m          0.5    0.2    0
wind                                   0.5    0.2    0
=====================================  =====  =====  =====

EN recommended values differ for H roofs (psi_0 = 0) and wind (psi_0 = 0.6).
The UK NA note to category H refers to EN 1991-1-1:2002, 3.3.2 (imposed roof
load not combined with snow or wind): that rule is not applied automatically.

Public API: :class:`PsiFactors`, :class:`PsiTable`, :data:`PSI_UK_NA`,
:data:`PSI_EN_RECOMMENDED`, :func:`psi_factors`.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from ..core.errors import InputError, require_choice
from .loads import ACTIONS, CATEGORIES, Load


@dataclass(frozen=True)
class PsiFactors:
    """psi_0 (combination), psi_1 (frequent), psi_2 (quasi-permanent) of one variable action."""

    psi_0: float
    psi_1: float
    psi_2: float


def _uk() -> dict[str, PsiFactors]:
    return {
        "imposed A": PsiFactors(0.7, 0.5, 0.3),
        "imposed B": PsiFactors(0.7, 0.5, 0.3),
        "imposed C": PsiFactors(0.7, 0.7, 0.6),
        "imposed D": PsiFactors(0.7, 0.7, 0.6),
        "imposed E": PsiFactors(1.0, 0.9, 0.8),
        "imposed F": PsiFactors(0.7, 0.7, 0.6),
        "imposed G": PsiFactors(0.7, 0.5, 0.3),
        "imposed H": PsiFactors(0.7, 0.0, 0.0),
        "snow": PsiFactors(0.5, 0.2, 0.0),
        "wind": PsiFactors(0.5, 0.2, 0.0),
    }


@dataclass(frozen=True)
class PsiTable:
    """psi factors per action key (``"imposed B"``, ``"snow"``, ``"wind"``), with its source."""

    name: str = "UK NA"
    source: str = "EN 1990:2002, A1.2.2, Table A1.1 (UK NA Table NA.A1.1)"
    factors: dict[str, PsiFactors] = field(default_factory=_uk)

    def __hash__(self) -> int:  # dict field: hash by name and values
        return hash((self.name, tuple(sorted((k, v) for k, v in self.factors.items()))))

    def get(self, action: str, category: str | None = None) -> PsiFactors:
        """psi factors of a variable action type (``category`` for imposed loads)."""
        require_choice("action", action, ACTIONS)
        if action == "permanent":
            raise InputError("action", action, "a variable action (imposed, snow, wind): "
                             "psi factors do not apply to permanent actions")
        key = action
        if action == "imposed":
            require_choice("category", category, CATEGORIES)
            key = f"imposed {category}"
        if key not in self.factors:
            raise InputError("action", key, "one of " + ", ".join(sorted(self.factors)))
        return self.factors[key]

    def of(self, load: Load) -> PsiFactors:
        """psi factors of the action type of ``load``."""
        return self.get(load.action, load.category)


#: UK National Annex values (default)
PSI_UK_NA = PsiTable()
#: EN 1990 recommended values, Table A1.1 (from memory): H roofs 0/0/0, wind 0.6/0.2/0
PSI_EN_RECOMMENDED = PsiTable(
    name="EN recommended", source="EN 1990:2002, A1.2.2, Table A1.1",
    factors={**_uk(), "imposed H": PsiFactors(0.0, 0.0, 0.0), "wind": PsiFactors(0.6, 0.2, 0.0)})


def psi_factors(action: str, category: str | None = None, table: PsiTable = PSI_UK_NA) -> PsiFactors:
    """psi_0, psi_1, psi_2 of a variable action, EN 1990:2002, Table A1.1 (UK NA by default)."""
    if not isinstance(table, PsiTable):
        raise InputError("table", table, "a PsiTable")
    if isinstance(category, str):
        category = category.strip().upper()
    return table.get(action, category)
