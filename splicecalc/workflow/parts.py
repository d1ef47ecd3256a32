"""The parts of a job and their checks: the one grouping `splicecalc run` and the package share.

A job's result (:class:`~splicecalc.workflow.calc.CalcResult`) is read as a list of
:class:`Part`: the beam member, the splice positions, each splice, each end
connection and each existing member, each with its check records (as the
calculation produced them: nothing here recomputes) and its governing check.

``splicecalc run`` prints one table per part and ``--json`` serialises
:func:`whole_job_dict`; the calc package's summary shows the same parts and the
same records, so the two can be compared record by record
(``tests/test_run_whole_job.py``).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

from ..core.record import CheckRecord

#: part kinds in the order a package shows them
KINDS = ("member", "positions", "splice", "connection", "existing")


@dataclass(frozen=True)
class Part:
    """One part of the job and its check records.

    ``key``: short stable reference (``member``, ``positions``, ``S1``, ``A``, ``existing-A``);
    ``prefix``: the record-title prefix its records carry (``Splice S1``), stripped in tables.
    """

    key: str
    kind: str
    title: str
    records: tuple[CheckRecord, ...]
    prefix: str = ""

    @property
    def governing(self) -> CheckRecord | None:
        """The made check with the highest utilisation (the first of equals); NOT CHECKED never governs."""
        return max((r for r in self.records if r.checked), key=lambda r: r.utilisation, default=None)

    @property
    def ok(self) -> bool:
        return all(r.ok for r in self.records)

    @property
    def utilisation(self) -> float:
        g = self.governing
        return g.utilisation if g is not None else 0.0

    def short_title(self, rec: CheckRecord) -> str:
        """A record's title without the part prefix (``Splice S1: bolt shear`` -> ``bolt shear``)."""
        p = f"{self.prefix}: " if self.prefix else ""
        t = rec.title[len(p):] if p and rec.title.startswith(p) else rec.title
        return t[:1].upper() + t[1:]

    def to_dict(self) -> dict[str, Any]:
        g = self.governing
        return {
            "part": self.key,
            "kind": self.kind,
            "title": self.title,
            "ok": self.ok,
            "checks_count": len(self.records),
            "not_checked": [r.id for r in self.records if not r.checked],
            "governing": None if g is None else {"id": g.id, "title": g.title, "clause": g.clause,
                                                 "utilisation": _clean(g.utilisation)},
            "checks": [r.to_dict() for r in self.records],
        }


def _clean(x: float) -> float | None:
    return round(float(x), 6) if math.isfinite(x) else None


def job_parts(result: Any) -> tuple[Part, ...]:
    """The parts of a :class:`~splicecalc.workflow.calc.CalcResult`, in package order.

    Every record of ``result.records`` is in exactly one part (asserted).
    """
    d = getattr(result, "design", None)      # a one-joint package (workflow.single) has no beam design
    out: list[Part] = []
    if d is not None:
        job = result.job
        out.append(Part("member", "member", f"Beam {d.section.designation} {job.beam.grade}, span "
                        f"{job.beam.span / 1000:g} m", tuple(result.member_records)))
    if getattr(result, "position_records", ()):
        out.append(Part("positions", "positions", "Splice positions and pieces", tuple(result.position_records)))
    if getattr(result, "slip_checks", ()):
        out.append(Part("slip", "positions", "Deflection with splice slip (category A)", tuple(result.slip_checks)))
    for s in result.splices:
        where = f" at x = {s.x_mm / 1000:.3f} m" if math.isfinite(s.x_mm) else ""
        out.append(Part(s.label, "splice", f"Splice {s.label}{where}", tuple(s.records),
                        prefix=f"Splice {s.label}"))
    for c in result.connections:
        out.append(Part(c.end, "connection", f"End connection {c.end} ({c.spec.connection.replace('_', ' ')})",
                        tuple(c.records), prefix=f"End {c.end}"))
    for c in result.connections:
        m = c.spec.existing_member
        name = getattr(m, "designation", "") or "existing member"
        out.append(Part(f"existing-{c.end}", "existing", f"Existing member at end {c.end}: {name}",
                        tuple(c.existing_records), prefix=f"End {c.end}"))
    n = sum(len(p.records) for p in out)
    if n != len(result.records):  # pragma: no cover - a record outside every part is a bug
        raise AssertionError(f"parts hold {n} records, the result {len(result.records)}")
    return tuple(out)


def parts_index(parts: tuple[Part, ...]) -> list[dict[str, Any]]:
    """The grouping as data (part key, kind, title, record-title prefix, record ids in order): published
    with the package's summary by part, so that a notebook alone is read by part (``splicecalc compare``)."""
    return [{"part": p.key, "kind": p.kind, "title": p.title, "prefix": p.prefix, "ids": [r.id for r in p.records]}
            for p in parts]


def parts_from_index(index: list[dict[str, Any]], records: dict[str, CheckRecord]) -> tuple[Part, ...]:
    """The :class:`Part` s of a published :func:`parts_index`, with the records (by id) read back with them;
    an id without a record is left out (the index and the records come from the same notebook)."""
    return tuple(Part(str(p["part"]), str(p["kind"]), str(p["title"]),
                      tuple(records[i] for i in p["ids"] if i in records), prefix=str(p.get("prefix", "")))
                 for p in index)


def _kits(result: Any) -> list:
    """The splice kits of the plan (None for each splice when the result has no plan)."""
    plan = getattr(result, "splice_plan", None)
    kits = list(plan.kits) if plan is not None else []
    return kits if len(kits) == len(result.splices) else [None] * len(result.splices)


def whole_job_dict(result: Any, source: str = "") -> dict[str, Any]:
    """JSON-ready whole job: project, beam design, splice positions, every part and its records."""
    job = result.job
    d = result.design
    parts = job_parts(result)
    recs = result.records
    gov = result.governing
    out: dict[str, Any] = {
        "job_file": source,
        "project": {k: v for k, v in vars(job.project).items() if v},
        "ok": result.ok,
        "headline": result.headline,
        "checks_count": len(recs),
        "failing_checks": [r.id for r in recs if not r.ok and r.checked],
        "not_checked": [r.id for r in recs if not r.checked],
        "governing": None if gov is None else {"id": gov.id, "title": gov.title, "clause": gov.clause,
                                               "utilisation": _clean(gov.utilisation)},
        "beam": {k: v for k, v in d.to_dict().items() if k != "checks"},
    }
    pos = result.positions
    if pos is not None:
        out["splice_positions"] = {
            "method": pos.method,
            "positions_m": [round(x / 1000.0, 4) for x in pos.positions],
            "pieces_m": [round(x / 1000.0, 4) for x in pos.pieces_mm],
            "piece_mass_kg": [round(m, 2) for m in pos.piece_mass_kg],
            "splice_kit_mass_kg": round(result.splice_kit_mass_kg, 2),
            "piece_mass_build_up": [p.to_dict() for p in pos.piece_masses],
            "mass_margin": pos.mass_margin,
        }
    out["splices"] = [{"splice": s.label, "x_m": round(s.x_mm / 1000.0, 4), "combination": s.combination,
                       "M_Ed_kNm": round(s.M_Ed / 1e6, 4), "V_Ed_kN": round(s.V_Ed / 1e3, 4),
                       "N_Ed_kN": round(s.N_Ed / 1e3, 4), "bolts": s.design.n_bolts,
                       "plate_mass_kg": round(s.design.plate_mass, 2),
                       **({"bolt_sets_kg": round(kit.bolts_kg, 2), "kit_mass_kg": round(kit.mass_kg, 2)}
                          if kit is not None else {})}
                      for s, kit in zip(result.splices, _kits(result))]
    out["connections"] = [{"end": c.end, "connection": c.spec.connection, "V_Ed_kN": round(c.V_Ed / 1e3, 4),
                           "combination": c.combination, "detail": c.design.detail.describe()}
                          for c in result.connections]
    out["parts"] = [p.to_dict() for p in parts]
    if result.cautions:
        out["cautions"] = list(result.cautions)
    if job.notes:
        out["notes"] = list(job.notes)
    return out


__all__ = ["KINDS", "Part", "job_parts", "parts_from_index", "parts_index", "whole_job_dict"]
