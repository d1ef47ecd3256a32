"""Standards, clause references and cautions printed at the end of every calc package.

The clause list is built from the check records themselves (the distinct
``clause`` fields, grouped by standard), so it lists exactly what the package
cites; the standards list is fixed and states the editions the library implements.
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from typing import Any, Iterable

from ..core.record import CheckRecord

#: the documents the calc packages are based on (edition, title, national annex)
STANDARDS: tuple[tuple[str, str], ...] = (
    ("EN 1990:2002", "Eurocode - Basis of structural design, with the UK National Annex"),
    ("EN 1991-1-1:2002", "Eurocode 1 - Actions on structures - Densities, self-weight, imposed loads for "
                         "buildings, with the UK National Annex"),
    ("EN 1991-1-7:2006", "Eurocode 1 - Actions on structures - Accidental actions (tying), with the UK "
                         "National Annex"),
    ("EN 1993-1-1:2005", "Eurocode 3 - Design of steel structures - General rules and rules for buildings, "
                         "with the UK National Annex (NA+A1:2014 to BS EN 1993-1-1:2005+A1:2014)"),
    ("EN 1993-1-5:2006", "Eurocode 3 - Plated structural elements, with the UK National Annex"),
    ("EN 1993-1-8:2005", "Eurocode 3 - Design of joints, with the UK National Annex"),
    ("EN 10025-2:2004", "Hot rolled products of structural steels - Non-alloy structural steels"),
    ("EN 1090-2", "Execution of steel structures - Technical requirements (bolting, hole clearances, "
                  "slip-resistant surfaces, welding)"),
)

#: guidance used when existing steel of unknown grade is assessed by era of construction
HISTORIC_GUIDANCE = ("Published UK appraisal guidance for existing steel and iron structures "
                     "(strengths of historic rolled steel by era and thickness; values used here are "
                     "from memory, rounded down, and must be confirmed)")
#: guidance the simple-joint and splice methods follow (stated, not cited by clause)
JOINT_GUIDANCE = ("Published UK design guidance for simple joints and bolted cover-plate beam splices "
                  "(detailing rules, share of moment between web and flanges, tying checks)")

#: cautions printed at the end of every package (the cover sheet repeats the general ones)
CAUTIONS: tuple[str, ...] = (
    "These results must be checked and verified by a competent engineer before they are relied upon, "
    "issued for construction or used to order material.",
    "The National Annex in force at the site and the local building regulations govern. The partial "
    "factors and nationally determined parameters used are stated in the calculations (UK National "
    "Annex values by default); confirm them for the site.",
    "Existing steelwork must be verified on site: member sizes (measured), grade or material, "
    "condition, corrosion loss, distortion, previous alterations and the connections it relies on. "
    "Where the grade is not known from records, confirm the assumed strength by testing.",
    "Cast iron and wrought iron are not steel. Confirm by survey that every existing member is steel "
    "before these checks are relied upon; iron members need a specialist appraisal.",
    "Do not weld to old steel until its weldability (chemical composition, carbon equivalent, "
    "laminations) has been confirmed; bolted connections to existing members are preferred.",
)

def execution_cautions(result: Any) -> list[str]:
    """Cautions and specification notes on how the job is built, raised by what it holds: the faying
    surfaces and preload the slip-resistant splices rely on, fit-up between two fixed existing members
    (site packing and the EN 1993-1-8 3.6.1(12) pack limit) and erection stability before the lateral
    restraints are fixed. ``result`` is a :class:`workflow.calc.CalcResult` (or anything with its
    ``splices``, ``connections`` and ``job``)."""
    from ..joints.bolts import MU

    out: list[str] = []
    cats = sorted({getattr(s.spec, "category", "") for s in getattr(result, "splices", ()) if s.spec is not None})
    for cat in (c for c in cats if c in ("B", "C")):
        fc = next(s.spec.friction_class for s in result.splices if s.spec is not None and s.spec.category == cat)
        out.append(f"Category {cat} splices (slip-resistant, EN 1993-1-8 3.4.1: no slip in the clearance holes "
                   f"{'at SLS' if cat == 'B' else 'at ULS'}): the slip resistance assumes class "
                   f"{fc} faying surfaces (slip factor {MU.get(fc, 0.5):g}; class A: blasted, unpainted, EN 1090-2 Table 18) "
                   "and bolts preloaded by a controlled method to EN 1090-2 8.5. Mark the faying surfaces 'no paint'; "
                   "another surface needs its slip factor and a re-check.")
    conns = [c for c in getattr(result, "connections", ()) if getattr(c.spec, "existing_member", None) is not None]
    if len(conns) >= 2:
        d = min(float(c.design.detail.bolt.d) for c in conns)
        holes = {getattr(s.spec, "holes", "normal") for s in getattr(result, "splices", ()) if s.spec is not None}
        kinds = " and ".join(sorted({str(c.design.detail.kind) + "s" for c in conns}))
        holes = "/".join(sorted(holes)) or "normal"
        out.append(f"Fit-up between fixed existing members ({kinds} at both ends, splices in {holes} holes): "
                   "measure the gap on site before the end pieces are made and take up the difference with packs "
                   f"behind the end plates, at most d/3 = {d / 3:.1f} mm (M{d:g}) so that beta_p = 1 (EN 1993-1-8 "
                   "3.6.1(12)); thicker packs reduce the bolt shear by beta_p = 9d/(8d + 3t_p), not checked here.")
    job = getattr(result, "job", None)
    beam = getattr(job, "beam", None)
    if getattr(beam, "restraints", ()) and not getattr(beam, "continuous_restraint", False):
        out.append("Erection: until the restraints (joist hangers) are fixed and the splices fully bolted, the "
                   "pieces are laterally unrestrained: the erector provides temporary restraint, and no construction "
                   "load goes on the beam before then.")
    return out


_STD_RE = re.compile(r"^((?:UK NA to BS EN|BS EN|EN|BS) [0-9]+(?:-[0-9]+)*(?:\+A[0-9]+)?:[0-9]{4}(?:\+A[0-9]+:[0-9]{4})?)(?:, (.*))?$")


@dataclass(frozen=True)
class Reference:
    """One standard cited by the records: its clauses (sorted, distinct) and how many checks cite each."""

    standard: str
    clauses: tuple[str, ...]
    checks: int
    counts: tuple[int, ...] = ()


def _clause_key(text: str) -> tuple:
    """Natural sort key: '3.10.2(2), Eq. 3.9' after '3.6.1, Table 3.4'."""
    return tuple((0, int(t)) if t.isdigit() else (1, t) for t in re.split(r"(\d+)", text))


def cited_clauses(records: Iterable[CheckRecord]) -> tuple[Reference, ...]:
    """Distinct clauses cited by ``records``, grouped by standard (standards sorted by name).

    Citations follow ``core.clause.CITATION_RE``; one that does not is listed
    whole under its own text so nothing cited is dropped.
    """
    by_std: dict[str, dict[str, int]] = {}
    count: dict[str, int] = {}
    for r in records:
        for part in (p.strip() for p in r.clause.split(";") if p.strip()):
            m = _STD_RE.match(part)
            std, cl = (m.group(1), (m.group(2) or "").strip()) if m else (part, "")
            cls = by_std.setdefault(std, {})
            if cl:
                cls[cl] = cls.get(cl, 0) + 1
            count[std] = count.get(std, 0) + 1
    out = []
    for s in sorted(by_std, key=_clause_key):
        names = tuple(sorted(by_std[s], key=_clause_key))
        out.append(Reference(s, names, count[s], tuple(by_std[s][c] for c in names)))
    return tuple(out)


def standards_list(historic_used: bool) -> tuple[tuple[str, str], ...]:
    """The fixed standards list plus the guidance documents used by this package."""
    extra = [("Guidance", JOINT_GUIDANCE)]
    if historic_used:
        extra.append(("Guidance", HISTORIC_GUIDANCE))
    return STANDARDS + tuple(extra)


__all__ = ["CAUTIONS", "execution_cautions", "HISTORIC_GUIDANCE", "JOINT_GUIDANCE", "Reference", "STANDARDS", "cited_clauses",
           "standards_list"]
