"""The one result type every check returns, and the recorder that builds it.

A check function is written once. It calls its clause functions through a
:class:`Calc`; with ``Calc(render=False)`` (design searches) that is a plain
function call on floats, with ``Calc(render=True)`` (the calc sheet) the same
functions are rendered by handcalcs and each step's LaTeX is kept.
"""

from __future__ import annotations

import html
import json
import math
from contextlib import contextmanager
from dataclasses import asdict, dataclass, field
from typing import Any, Callable, Iterator

from .render import render as _render
from .units import convert

#: internal float unit -> unit used in reports and JSON
DISPLAY_UNIT = {
    "N": "kN", "Nmm": "kNm", "N/mm": "kN/m", "mm": "mm", "mm2": "mm2", "mm3": "mm3",
    "mm4": "mm4", "MPa": "MPa", "kg": "kg", "kg/m": "kg/m", "": "", "mm6": "mm6", "Hz": "Hz",
}
#: unit tag used in JSON keys
KEY_TAG = {
    "kN": "kN", "kNm": "kNm", "kN/m": "kN_per_m", "mm": "mm", "mm2": "mm2", "mm3": "mm3",
    "mm4": "mm4", "MPa": "MPa", "kg": "kg", "kg/m": "kg_per_m", "": "", "mm6": "mm6", "Hz": "Hz",
}


#: record status of a check that was made (demand against resistance)
CHECKED = "checked"
#: record status of a check the package does not make: it stays in the summary and is never a pass
NOT_CHECKED = "not checked"
#: record status of information that cannot fail (the cross-section class with its governing c/t,
#: a restraint force, a natural frequency quoted for the reader): ok, utilisation 0, never governs,
#: shown with verdict INFO and no utilisation
INFO = "info"


def display(value: float, unit: str) -> tuple[float, str]:
    """Convert an internal float to its report unit: (value, unit)."""
    du = DISPLAY_UNIT.get(unit, unit)
    return (convert(value, unit, du) if du != unit else value), du


@dataclass(frozen=True)
class CheckRecord:
    """One design check: demand against resistance, with its clause and rendered steps.

    ``utilisation = demand / resistance``; for a *minimum* requirement (e.g. an
    end distance) the demand is the required value and the resistance the
    provided one, so the same ratio applies. ``ok`` is ``utilisation <= 1``.
    ``values`` holds named intermediate results as ``name -> (value, unit)``
    in report units; ``location_mm`` says where along the beam it governs.

    ``status`` is :data:`CHECKED` for a check that was made, or :data:`NOT_CHECKED`
    for a check the package does not make (made with :func:`not_checked`): such a
    record has ``ok`` False (so no "all checks pass" can be printed over it),
    utilisation 0 (it never governs), verdict ``NOT CHECKED`` and its ``note`` says
    why and what information or separate check is needed.
    ``clause`` cites the code (standard, clause, table/equation); ``guidance`` names,
    in general words, published design guidance or a stated method the check also
    relies on (e.g. "published UK simple-joint guidance (from memory)"), never
    dressed up as a code clause. ``tags`` classify the check for code that looks
    records up (e.g. ``("flange", "bolts")``); they are not shown.
    """

    id: str
    title: str
    clause: str
    demand: float
    resistance: float
    unit: str
    utilisation: float
    ok: bool
    values: dict[str, tuple[float, str]] = field(default_factory=dict)
    latex: tuple[str, ...] = ()
    location_mm: float | None = None
    note: str = ""
    status: str = CHECKED
    guidance: str = ""
    tags: tuple[str, ...] = ()

    @property
    def checked(self) -> bool:
        """False for a NOT CHECKED record (:func:`not_checked`)."""
        return self.status != NOT_CHECKED

    def has(self, *tags: str) -> bool:
        """True when the record carries every one of ``tags``."""
        return all(t in self.tags for t in tags)
    @property
    def is_check(self) -> bool:
        """True for a check made (demand over resistance); False for INFO and NOT CHECKED records."""
        return self.status == CHECKED

    # ----------------------------------------------------------------- output
    def to_dict(self) -> dict[str, Any]:
        """JSON-ready dict; keys of values and of demand/resistance carry their unit."""
        tag = KEY_TAG.get(self.unit, self.unit.replace("/", "_per_"))
        sfx = f"_{tag}" if tag else ""
        d = {
            "id": self.id,
            "title": self.title,
            "clause": self.clause,
            f"demand{sfx}": _clean(self.demand),
            f"resistance{sfx}": _clean(self.resistance),
            "unit": self.unit,
            "utilisation": _clean(self.utilisation),
            "ok": self.ok,
            "values": {(f"{k}_{KEY_TAG.get(u, u.replace('/', '_per_'))}" if u else k): _clean(v)
                       for k, (v, u) in self.values.items()},
        }
        if self.location_mm is not None:
            d["location_m"] = round(self.location_mm / 1000.0, 4)
        if self.note:
            d["note"] = self.note
        if not self.checked:
            d["status"] = self.status
            d[f"demand{sfx}"] = d[f"resistance{sfx}"] = d["utilisation"] = None
        if self.guidance:
            d["guidance"] = self.guidance
        if self.status == INFO:
            # information has no utilisation, and no resistance unless it carries a limit (a class
            # limit of c/t): null in the JSON as "-" on the sheet, never "0 kN"
            d["status"] = self.status
            d["utilisation"] = None
            if not self.resistance:
                d[f"resistance{sfx}"] = None
        return d

    def to_json(self) -> str:
        return json.dumps(self.to_dict(), indent=2)

    @property
    def verdict(self) -> str:
        if not self.checked:
            return "NOT CHECKED"
        if self.status == INFO:
            return "INFO"
        return "OK" if self.ok else "NOT OK"

    def summary_line(self) -> str:
        if not self.checked:
            return f"{self.title:<48} {'-':>10}   {'-':>10} {'':<5} u =   -    NOT CHECKED  [{self.clause}]"
        if self.status == INFO:
            return (f"{self.title:<48} {self.demand:10.2f} ({self.resistance:10.2f}) {self.unit:<5} u =   -    "
                    f"INFO  [{self.clause}]")
        return (f"{self.title:<48} {self.demand:10.2f} / {self.resistance:10.2f} {self.unit:<5} "
                f"u = {self.utilisation:5.3f}  {self.verdict:<6}  [{self.clause}]")

    def _repr_markdown_(self) -> str:
        steps = "\n\n".join(self.latex)
        if not self.checked:
            return f"**{html.escape(self.title)}** — *{self.clause}*\n\n**NOT CHECKED**: {html.escape(self.note)}"
        colour = "green" if self.ok else "red"
        return (f"**{html.escape(self.title)}** — *{self.clause}*\n\n{steps}\n\n"
                f"$E_d = {self.demand:.3g}$ {self.unit}, $R_d = {self.resistance:.3g}$ {self.unit}, "
                f"utilisation **{self.utilisation:.3f}** — <span style='color:{colour}'>**{self.verdict}**</span>")


def _clean(x: float) -> float | None:
    if x is None:
        return None
    if isinstance(x, float) and not math.isfinite(x):
        return None
    return round(float(x), 6)


def utilisation(demand: float, resistance: float) -> float:
    """demand / resistance, +inf when the resistance is nil."""
    if resistance <= 0.0:
        return math.inf if demand > 0 else 0.0
    return abs(demand) / resistance


_GREEK = {"alpha", "beta", "gamma", "delta", "epsilon", "zeta", "eta", "theta", "lambda", "mu", "nu", "xi",
          "rho", "sigma", "tau", "phi", "chi", "psi", "omega", "Phi", "Delta"}


def _tex_symbol(name: str) -> str:
    """How handcalcs prints a name: ``gamma_M2`` -> ``\\gamma_{M2}``, ``p_2_min`` -> ``p_{2_{min}}``."""
    parts = name.split("_")
    b = "\\" + parts[0] if parts[0] in _GREEK else parts[0]
    if len(parts) == 1:
        return b
    sub = parts[-1]
    for part in reversed(parts[1:-1]):
        sub = f"{part}_{{{sub}}}"
    return f"{b}_{{{sub}}}"


class Calc:
    """Runs clause functions, optionally rendering each step.

    >>> calc = Calc()                       # fast path
    >>> F = calc(F_v_Rd, alpha_v=0.6, f_ub=800, A_s=245, gamma_M2=1.25)  # doctest: +SKIP
    """

    __slots__ = ("render", "precision", "latex", "values", "renamed")

    def __init__(self, render: bool = False, precision: int = 3) -> None:
        self.render = render
        self.precision = precision
        self.latex: list[str] = []
        self.values: dict[str, tuple[float, str]] = {}
        #: symbol shown for a formula's parameter (``gamma_M2`` -> ``gamma_Mu``), see :meth:`symbols`
        self.renamed: dict[str, str] = {}

    def __call__(self, fn: Callable, **kwargs: Any) -> Any:
        if not self.render:
            return fn(**kwargs)
        latex, result = _render(fn, precision=self.precision, **kwargs)
        for old, new in self.renamed.items():
            latex = latex.replace(_tex_symbol(old), _tex_symbol(new))
        self.latex.append(latex)
        return result

    @contextmanager
    def symbols(self, **renamed: str) -> Iterator["Calc"]:
        """Show a formula's symbol (parameter or result) as the quantity it stands for, within the block:
        ``with calc.symbols(gamma_M2="gamma_Mu"): calc(F_t_Rd, ..., gamma_M2=na.gamma_Mu)`` renders
        gamma_Mu (tying); ``with calc.symbols(n_i="n_y")`` names the axis of a formula written for either.
        The formula stays the one formula; only its printed symbol changes."""
        before = dict(self.renamed)
        self.renamed.update(renamed)
        try:
            yield self
        finally:
            self.renamed = before

    def note(self, text: str) -> None:
        """Add a prose line (LaTeX text mode) to the rendered steps."""
        if self.render:
            self.latex.append(text)

    def keep(self, name: str, value: float, unit: str = "") -> float:
        """Remember a named intermediate value (internal unit) for the record."""
        v, u = display(value, unit)
        self.values[name] = (v, u)
        return value

    def record(self, *, id: str, title: str, clause: str, demand: float, resistance: float,
               unit: str, location_mm: float | None = None, note: str = "", guidance: str = "",
               tags: tuple[str, ...] = ()) -> CheckRecord:
        """Close the check: convert to report units and compute the utilisation."""
        d, du = display(demand, unit)
        r, _ = display(resistance, unit)
        u = utilisation(demand, resistance)
        rec = CheckRecord(id=id, title=title, clause=clause, demand=d, resistance=r, unit=du,
                          utilisation=u, ok=u <= 1.0 + 1e-9, values=dict(self.values),
                          latex=tuple(self.latex), location_mm=location_mm, note=note, guidance=guidance,
                          tags=tuple(tags))
        self.latex = []
        self.values = {}
        return rec

    def info(self, *, id: str, title: str, clause: str, demand: float = 0.0, resistance: float = 0.0,
             unit: str = "", location_mm: float | None = None, note: str = "") -> CheckRecord:
        """Close an information record (status :data:`INFO`, no utilisation): e.g. the class with its
        governing c/t (``demand``) and the limit of the class reached (``resistance``)."""
        rec = self.record(id=id, title=title, clause=clause, demand=demand, resistance=resistance, unit=unit,
                          location_mm=location_mm, note=note)
        return CheckRecord(**{**rec.__dict__, "utilisation": 0.0, "ok": True, "status": INFO})


def not_checked(*, id: str, title: str, clause: str, reason: str, location_mm: float | None = None,
                values: dict[str, tuple[float, str]] | None = None) -> CheckRecord:
    """A record for a check the package does not make: ``reason`` says why and what is needed.

    ``clause`` names where the check would come from (code clause or published guidance).
    The record is never a pass (``ok`` False, verdict ``NOT CHECKED``) and never governs
    (utilisation 0); summaries count it apart from failures.
    """
    if not isinstance(reason, str) or not reason.strip():
        raise ValueError("a NOT CHECKED record needs the reason and what is needed to make the check")
    return CheckRecord(id=id, title=title, clause=clause, demand=0.0, resistance=0.0, unit="", utilisation=0.0,
                       ok=False, values=dict(values or {}), location_mm=location_mm, note=reason.strip(),
                       status=NOT_CHECKED)


def count_verdicts(records) -> tuple[int, int]:
    """(number of checks NOT OK, number NOT CHECKED) among ``records``."""
    bad = gap = 0
    for r in records:
        if not r.checked:
            gap += 1
        elif not r.ok:
            bad += 1
    return bad, gap


def verdict_sentence(records) -> str:
    """"All checks pass." only when every record is a check that passes; otherwise the counts."""
    recs = list(records)
    if not recs:
        return "No checks."
    bad, gap = count_verdicts(recs)
    if not bad and not gap:
        return "All checks pass."
    parts = []
    if bad:
        parts.append(f"{bad} check(s) NOT OK")
    if gap:
        parts.append(f"{gap} check(s) NOT CHECKED (see their notes: not a pass)")
    return "; ".join(parts) + "."


def summary_order(r: CheckRecord) -> tuple:
    """Sort key of a summary: NOT CHECKED first, then highest utilisation, then title."""
    return (r.checked, -r.utilisation, r.title)


def records_to_json(records: list[CheckRecord]) -> str:
    return json.dumps([r.to_dict() for r in records], indent=2)


def find(records, *tags: str) -> list[CheckRecord]:
    """The records carrying every one of ``tags`` (in their order)."""
    return [r for r in records if r.has(*tags)]


__all__ = ["CHECKED", "NOT_CHECKED", "INFO", "not_checked", "count_verdicts", "verdict_sentence", "summary_order",
           "CheckRecord", "Calc", "utilisation", "display", "records_to_json", "asdict", "find"]
