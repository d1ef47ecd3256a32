"""Calc packages for one joint: a splice for given forces, an end connection for a given reaction.

The inputs are typed in the template's ``parameters`` cell (plain values with
units in the names or in the text, as in a job file). They are validated by the
same parsers as a job file (:func:`~splicecalc.joints.splice.parse_splices`,
:func:`~splicecalc.joints.connections.parse_support`) and designed by the same
functions as the full calculation; :attr:`JointResult.inputs` is the canonical
inputs dict published for the sign-off digest.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

from ..core.errors import InputError, require_positive
from ..core.record import CheckRecord
from ..core.units import convert
from ..materials import UK_NA, normalise_grade
from .calc import ConnectionPart, END_LETTER, PackageRecords, SplicePart, _relabel


def _finite(field: str, v: Any) -> float:
    if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v):
        raise InputError(field, v, "a finite number")
    return float(v)


def _section(designation: Any, field: str = "section") -> Any:
    from ..sections import get_section

    if not isinstance(designation, str) or not designation.strip():
        raise InputError(field, designation, "a catalogue designation such as '406x178x60 UKB'")
    try:
        return get_section(designation)
    except InputError as err:
        raise InputError(field, designation, err.allowed, err.hint) from None


@dataclass(frozen=True)
class JointResult(PackageRecords):
    """Result of a one-joint package: the section, the inputs dict and one splice or connection."""

    kind: str
    section: Any
    grade: str
    inputs: dict
    splices: tuple[SplicePart, ...] = ()
    connections: tuple[ConnectionPart, ...] = ()

    @property
    def records(self) -> tuple[CheckRecord, ...]:
        return self.joint_records

    @property
    def ok(self) -> bool:
        return all(r.ok for r in self.records)

    @property
    def headline(self) -> str:
        what = "Splice" if self.kind == "splice" else "End connection"
        return f"{what} of beam {self.section.designation} {self.grade}"


def run_splice_only(section: str, grade: str, M_Ed_kNm: float, V_Ed_kN: float, N_Ed_kN: float = 0.0,
                    splices: dict | None = None, position: str = "", render: bool = True) -> JointResult:
    """Design (or check, with an explicit layout in ``splices``) one splice for given forces.

    ``splices``: a ``[splices]`` table as in a job file (bolts, category, plates, layout...).
    Forces in kNm / kN (N tension positive). ``position`` is text for the record.
    """
    from ..design.splice_layout import design_splice
    from ..joints.splice import moment_resistance, parse_splices

    sec = _section(section)
    try:
        g = normalise_grade(grade)
    except InputError as err:
        raise InputError("grade", grade, err.allowed) from None
    M = convert(_finite("M_Ed_kNm", M_Ed_kNm), "kNm", "Nmm")
    V = convert(_finite("V_Ed_kN", V_Ed_kN), "kN", "N")
    N = convert(_finite("N_Ed_kN", N_Ed_kN), "kN", "N")
    table = dict(splices or {})
    for k in ("positions", "pieces", "max_piece_length", "max_piece_mass"):
        if k in table:
            raise InputError(f"splices.{k}", table[k], "no positions or piece limits in a one-splice package "
                             "(use the beam_splice template for a whole beam)")
    spec = parse_splices(table)
    d = design_splice(sec, g, M, abs(V), N, spec, UK_NA, render=render,
                      M_c_Rd=moment_resistance(sec, g, UK_NA) if spec.min_design_moment > 0 else None)
    part = SplicePart(index=1, x_mm=math.nan, M_Ed=M, V_Ed=V, N_Ed=N, combination=position or "given forces",
                      design=d, records=tuple(_relabel(r, "S1", "Splice") for r in d.records), spec=spec)
    inputs = {"template": "splice_only", "section": sec.designation, "grade": g,
              "M_Ed": f"{M_Ed_kNm:.12g} kNm", "V_Ed": f"{V_Ed_kN:.12g} kN", "N_Ed": f"{N_Ed_kN:.12g} kN",
              "position": position, "splices": {k: table[k] for k in sorted(table)}}
    return JointResult(kind="splice", section=sec, grade=g, inputs=inputs, splices=(part,))


def run_end_connection(section: str, grade: str, V_Ed_kN: float, support: dict, render: bool = True) -> JointResult:
    """Design one end connection (``support``: a ``[[support]]`` table) for the reaction V_Ed (kN)."""
    from ..joints.connections import design_end_connection, parse_support

    sec = _section(section)
    try:
        g = normalise_grade(grade)
    except InputError as err:
        raise InputError("grade", grade, err.allowed) from None
    V = convert(require_positive("V_Ed_kN", V_Ed_kN, "kN"), "kN", "N")
    if not isinstance(support, dict):
        raise InputError("support", support, "a table of [[support]] keys (at, connection, bolts, ...)")
    spec = parse_support(dict(support), 1)
    d = design_end_connection(sec, g, V, spec, UK_NA, render=render)
    end = END_LETTER[spec.at]
    ex_ids = {r.id for r in d.existing.records}
    own = tuple(_relabel(r, end, f"End {end}") for r in d.records if r.id not in ex_ids)
    ex = tuple(_relabel(r, end, f"End {end}") for r in d.records if r.id in ex_ids)
    part = ConnectionPart(index=1, end=end, V_Ed=V, combination="given design reaction", design=d, records=own,
                          existing_records=ex)
    inputs = {"template": "end_connection", "section": sec.designation, "grade": g,
              "V_Ed": f"{V_Ed_kN:.12g} kN", "support": {k: support[k] for k in sorted(support)}}
    return JointResult(kind="connection", section=sec, grade=g, inputs=inputs, connections=(part,))


__all__ = ["JointResult", "run_end_connection", "run_splice_only"]
