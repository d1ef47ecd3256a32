"""Partial factors and national choices, as one explicit object.

Defaults are the UK National Annex values. Another annex is a new instance:
``NationalAnnex(gamma_M2=1.25, ...)``; nothing reads hidden globals.
"""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class NationalAnnex:
    """Nationally determined parameters used by splicecalc (UK NA defaults).

    gamma_M0, gamma_M1: UK NA to BS EN 1993-1-1, NA.2.15 (1.00, 1.00).
    gamma_M2_member: UK NA to BS EN 1993-1-1, NA.2.15, tension fracture of
        net sections of members (1.10).
    gamma_M2: UK NA to BS EN 1993-1-8, Table NA.1, bolts, welds, pins and
        plates in bearing (1.25).
    gamma_M3, gamma_M3_ser: slip at ULS / SLS (1.25 / 1.10).
    gamma_Mu: UK NA to BS EN 1993-1-8, tying resistance (1.10).
    lambda_LT_0, beta_LT: UK NA to BS EN 1993-1-1, NA.2.17, rolled sections (0.4, 0.75).
    eta: EN 1993-1-5, 5.1(2) with UK NA (1.00).
    xi: EN 1990 Eq. 6.10b reduction factor, UK NA Table NA.A1.2(B) (0.925).
    gamma_G, gamma_Q: EN 1990 Table A1.2(B) with UK NA (1.35, 1.5).
    """

    name: str = "UK"
    gamma_M0: float = 1.00
    gamma_M1: float = 1.00
    gamma_M2_member: float = 1.10
    gamma_M2: float = 1.25
    gamma_M3: float = 1.25
    gamma_M3_ser: float = 1.10
    gamma_M7: float = 1.10
    gamma_Mu: float = 1.10
    lambda_LT_0: float = 0.4
    beta_LT: float = 0.75
    eta: float = 1.0
    xi: float = 0.925
    gamma_G: float = 1.35
    gamma_G_inf: float = 1.0
    gamma_Q: float = 1.5
    combination: str = "6.10ab"  # "6.10" or "6.10ab" (worse of 6.10a and 6.10b)


#: UK National Annex defaults
UK_NA = NationalAnnex()
#: EN recommended values where they differ from the UK NA
EN_RECOMMENDED = NationalAnnex(name="EN recommended", gamma_M2_member=1.25, lambda_LT_0=0.4,
                               beta_LT=0.75, eta=1.2, xi=0.85, combination="6.10ab")


def require_national_annex(na: object, field: str = "na") -> NationalAnnex:
    """``na`` itself when it is a :class:`NationalAnnex`, else an InputError naming ``field``."""
    if not isinstance(na, NationalAnnex):
        from ..core.errors import InputError

        raise InputError(field, na, "a NationalAnnex (e.g. splicecalc.materials.UK_NA)")
    return na
