"""Strengths for existing (historic) British rolled steel, by era of construction and thickness.

When the grade of an existing member is not known from records, appraisal
practice in the UK assigns a characteristic yield strength by the date of
construction and the element thickness, from tables published in appraisal
guidance for older structural steel. THE VALUES BELOW ARE FROM MEMORY of
that published guidance, deliberately rounded down, and are flagged as such
in every check that uses them: they are placeholders for values confirmed by
records, by survey, or by coupon testing of the actual member.

An era band applies to **steel** only. Cast iron and wrought iron behave
differently (brittle in tension / laminar, no weldability) and are refused.
A modern grade ("S275", "S355", ...) may be given instead of an era: it goes to
:func:`splicecalc.materials.steel.steel` (EN 10025-2). ``"unknown"`` takes the
lowest (earliest) era band, with a prominent caution. Coupon test results give a
characteristic strength by EN 1990 Annex D (:func:`tested_steel`, flagged).
"""

from __future__ import annotations

from dataclasses import dataclass
from math import sqrt

from ..core.clause import clause
from ..core.errors import InputError, require_count, require_in_range, require_positive
from .steel import GRADES, Steel, normalise_grade, steel

#: Caution printed in every calc that relies on existing steelwork.
EXISTING_STEEL_CAUTION = (
    "CAUTION - EXISTING STRUCTURE. The strength, section size and condition of the existing "
    "member used in these calculations are assumptions. They must be verified on site by survey "
    "(measured dimensions, corrosion loss, distortion, previous alterations) and, where the grade "
    "is not known from records, by testing of the material. Confirm that the member is steel: cast "
    "iron and wrought iron are not steel, have different strengths and failure modes, and are not "
    "covered by these checks. Do not weld to old steel until its weldability (chemical composition, "
    "carbon equivalent, laminations) has been confirmed; prefer bolted connections. Historic strengths "
    "by era are from memory of published appraisal guidance and must be confirmed before use."
)

#: Note attached to every CheckRecord that uses an era strength.
HISTORIC_NOTE = ("existing steel strength taken by era of construction from published UK appraisal "
                 "guidance (values from memory, rounded down): verify by records or testing")


@dataclass(frozen=True)
class EraBand:
    """One era band: fy steps by thickness (t_max_mm, fy_MPa) and a lower-bound fu (MPa)."""

    name: str
    first_year: int
    last_year: int
    fy_steps: tuple[tuple[float, float], ...]
    f_u: float
    source: str


#: first year of the era bands: structural steel in common use in British buildings (from memory);
#: an earlier date is refused with the advice to identify and test the material (iron was usual)
STEEL_COMMON_FROM = 1890

#: Era bands of historic British structural steel (values FROM MEMORY, flagged).
#: fy for t <= t_max; above the last step the band is not used (InputError).
ERA_BANDS: dict[str, EraBand] = {b.name: b for b in (
    # structural steel sections came into common use in British buildings around 1890; before that
    # rolled and built-up members were usually wrought iron, castings cast iron (from memory)
    EraBand("before 1909", STEEL_COMMON_FROM, 1908, ((40.0, 200.0), (100.0, 190.0)), 370.0,
            f"early mild steel ({STEEL_COMMON_FROM} to 1908) before the first national standard was in general "
            "use (from memory)"),
    EraBand("1909-1932", 1909, 1932, ((40.0, 210.0), (100.0, 200.0)), 400.0,
            "early issues of the British standard for structural steel (from memory)"),
    EraBand("1933-1949", 1933, 1949, ((16.0, 225.0), (40.0, 220.0), (100.0, 210.0)), 410.0,
            "British standard mild steel, inter-war and war years (from memory)"),
    EraBand("1950-1958", 1950, 1958, ((16.0, 235.0), (40.0, 230.0), (100.0, 220.0)), 430.0,
            "British standard mild steel, post-war issue (from memory)"),
    EraBand("1959-1967", 1959, 1967, ((16.0, 240.0), (40.0, 230.0), (100.0, 225.0)), 430.0,
            "British standard mild steel, metric-transition issue (from memory)"),
    EraBand("1968-1985", 1968, 1985, ((16.0, 265.0), (40.0, 255.0), (63.0, 245.0), (100.0, 235.0)), 430.0,
            "weldable structural steel grade 43 (early issues), from memory"),
    EraBand("1986-1992", 1986, 1992, ((16.0, 275.0), (40.0, 265.0), (63.0, 255.0), (100.0, 245.0)), 430.0,
            "weldable structural steel grade 43 (later issues), from memory"),
)}

_IRON_WORDS = ("iron", "cast", "wrought")


def allowed_materials() -> str:
    """Human list of the accepted era bands and grades (for error messages)."""
    return ("an era band (" + ", ".join(repr(k) for k in ERA_BANDS) + "), 'unknown' (lowest band), a grade ("
            + ", ".join(GRADES) + ") or coupon tests {tested_fy, tested_fu, samples}")


def _normalise_era(text: str) -> str | None:
    s = text.strip().lower().replace("\u2013", "-").replace(" to ", "-").replace(" ", "")
    for name in ERA_BANDS:
        if s == name.replace(" ", ""):
            return name
    if s in ("pre-1909", "pre1909", "before1909", "<1909"):
        return "before 1909"
    # a single year or a range wholly inside one band
    parts = s.split("-")
    if not s.isascii():            # years in the digits 0-9 only (int() would read other scripts' digits)
        return None
    try:
        years = [int(p) for p in parts if p]
    except ValueError:
        return None
    if not years or len(years) > 2:
        return None
    lo, hi = min(years), max(years)
    for band in ERA_BANDS.values():
        if band.first_year <= lo and hi <= band.last_year:
            return band.name
    return None


def _era_hint(text: str) -> str:
    """Advice for a text that is neither a known era band nor a grade."""
    first, last = min(b.first_year for b in ERA_BANDS.values()), max(b.last_year for b in ERA_BANDS.values())
    years = [int(p) for p in text.replace("\u2013", "-").replace(" ", "").split("-") if p.isdigit()]
    if years and min(years) < first:
        return (f"Structural steel was not in common use before {first}: members of that date are usually "
                "wrought or cast iron. Have the material identified and tested, then give the tested strengths "
                "as existing_steel = {tested_fy, tested_fu, samples} if it is steel, or appraise the iron "
                "member by a specialist method")
    if len(years) == 2 and first <= min(years) and max(years) <= last:
        return ("The years cross two era bands: give the band of the earliest year (the lower strength) "
                "unless records date the steel")
    return (f"Era bands cover {first} to {last}; for later steel give its grade (e.g. 'S275'), for earlier "
            "or unidentified material have it identified and tested (it may be iron, not steel)")


@dataclass(frozen=True)
class ExistingSteel:
    """Material of an existing member: label, Steel (fy, fu at the thickness), historic flag, note."""

    label: str
    material: Steel
    historic: bool
    note: str

    @property
    def f_y(self) -> float:
        return self.material.f_y

    @property
    def f_u(self) -> float:
        return self.material.f_u


def historic_steel(era: str, t_mm: float, field: str = "existing_steel") -> Steel:
    """fy and fu (MPa) of historic British steel of era band ``era`` at thickness ``t_mm`` (from memory)."""
    if not isinstance(era, str):
        raise InputError(field, era, allowed_materials())
    name = _normalise_era(era)
    if name is None:
        raise InputError(field, era, allowed_materials(), _era_hint(era))
    t = require_positive(field + " thickness", t_mm, "mm")
    band = ERA_BANDS[name]
    for t_max, fy in band.fy_steps:
        if t <= t_max:
            return Steel(f"historic {name}", t, fy, band.f_u)
    raise InputError(field + " thickness", t_mm,
                     f"at most {band.fy_steps[-1][0]:g} mm for era {name}: test the material")


def existing_steel(text: str, t_mm: float, field: str = "existing_steel") -> ExistingSteel:
    """Material of an existing member from an era band or a modern grade.

    Cast or wrought iron, unknown eras and unknown grades raise :class:`InputError`
    listing the allowed era bands and grades.
    """
    if not isinstance(text, str) or not text.strip():
        raise InputError(field, text, allowed_materials())
    low = text.lower()
    if any(w in low for w in _IRON_WORDS):
        raise InputError(field, text, allowed_materials(),
                         "Cast iron and wrought iron are not steel: these checks do not apply; "
                         "appraise the iron member by a specialist method")
    if text.strip().lower() == "unknown":
        band = min(ERA_BANDS.values(), key=lambda b: b.first_year)
        return ExistingSteel(f"unknown steel (lowest era band, {band.name})",
                             historic_steel(band.name, t_mm, field), True, UNKNOWN_NOTE)
    if text.strip().upper().startswith("S"):
        try:
            g = normalise_grade(text)
        except InputError:
            raise InputError(field, text, allowed_materials()) from None
        return ExistingSteel(g, steel(g, t_mm, field + " thickness"), False,
                             "existing steel grade as stated by the user: verify by records or testing")
    name = _normalise_era(text)
    if name is None:
        raise InputError(field, text, allowed_materials(), _era_hint(text))
    return ExistingSteel(f"historic steel {name}", historic_steel(name, t_mm, field), True, HISTORIC_NOTE)


# ------------------------------------------------------------------ coupon tests, EN 1990 Annex D
#: EN 1990:2002 Table D1, k_n for the 5 % characteristic value (from memory): n -> (V_X known, V_X unknown);
#: None where the table gives no value (too few results for that method)
K_N_TABLE: dict[int, tuple[float, float | None]] = {
    1: (2.31, None), 2: (2.01, None), 3: (1.89, 3.37), 4: (1.83, 2.63), 5: (1.80, 2.33), 6: (1.77, 2.18),
    8: (1.74, 2.00), 10: (1.72, 1.92), 20: (1.68, 1.76), 30: (1.67, 1.73), 10**9: (1.64, 1.64),
}
#: minimum number of results for each method (first n with a k_n in Table D1)
MIN_SAMPLES = {"V known": 1, "V unknown": 3}
#: prior coefficients of variation of structural steel strengths for the "V known" method
#: (probabilistic model code values for hot-rolled steel, from memory): f_y 0.07, f_u 0.04
COV_PRIOR = {"f_y": 0.07, "f_u": 0.04}
TESTED_NOTE = ("existing steel strength from coupon tests of the member, characteristic value by EN 1990 "
               "Annex D (Table D1 k_n from memory; method and prior coefficient of variation stated): confirm "
               "that the coupons represent the member (same rolling, position, thickness)")
UNKNOWN_NOTE = ("EXISTING STEEL OF UNKNOWN DATE AND GRADE: the lowest era band of published appraisal guidance "
                "is used (values from memory, rounded down). This is a placeholder only: identify the material "
                "(it may be wrought or cast iron) and confirm its strength by records or coupon tests before "
                "relying on these checks")


def k_n_annex_d(n: int, method: str) -> float:
    """k_n of EN 1990 Table D1 (5 % fractile) for ``n`` results; the next lower tabulated n (conservative)."""
    known = method == "V known"
    best = None
    for m in sorted(K_N_TABLE):
        if m <= n:
            best = K_N_TABLE[m][0 if known else 1]
    if best is None:
        raise InputError("samples", n, f"at least {MIN_SAMPLES[method]} test results for the method '{method}' "
                                       "(EN 1990 Table D1)")
    return best


@clause("EN 1990:2002, D7.2, Eq. (D.1)", units={"m_X": "MPa"}, returns="MPa",
        example=dict(m_X=262.0, k_n=1.89, V_X=0.07))
def X_k_tests(m_X: float, k_n: float, V_X: float) -> float:
    """Characteristic value from n test results: X_k = m_X (1 - k_n V_X), conversion factor eta = 1 (MPa)."""
    X_k = m_X * (1 - k_n * V_X)
    return X_k


@dataclass(frozen=True)
class TestedSteel:
    """Coupon test results of an existing member (MPa): mean or individual values of f_y and f_u."""

    f_y: tuple[float, ...]
    f_u: tuple[float, ...]
    samples: int
    method: str                 # "V known" (prior coefficient of variation) or "V unknown" (from the results)
    cov_fy: float = COV_PRIOR["f_y"]
    cov_fu: float = COV_PRIOR["f_u"]

    def characteristic(self) -> tuple[float, float, str]:
        """(f_yk, f_uk, text of the derivation) by EN 1990 Annex D."""
        out = []
        words = []
        for name, vals, cov in (("f_y", self.f_y, self.cov_fy), ("f_u", self.f_u, self.cov_fu)):
            n = self.samples
            m = sum(vals) / len(vals)
            if self.method == "V unknown":
                s = sqrt(sum((v - m) ** 2 for v in vals) / (len(vals) - 1))
                V = s / m
                src = f"s = {s:.1f} MPa from the {n} results"
            else:
                V = cov
                src = f"V_X = {cov:g} prior (from memory)"
            k = k_n_annex_d(n, self.method)
            xk = X_k_tests(m_X=m, k_n=k, V_X=V)
            out.append(xk)
            words.append(f"{name}: mean {m:.1f} MPa of {n}, {src}, k_n = {k:g} -> {xk:.1f} MPa")
        return out[0], out[1], f"EN 1990 Annex D, D7.2, '{self.method}': " + "; ".join(words)


def tested_steel(table: dict, field: str = "existing_steel") -> TestedSteel:
    """Parse ``{tested_fy, tested_fu, samples?, method?, cov_fy?, cov_fu?}``: values as "262 MPa" strings,
    either one mean each with ``samples`` (method "V known", prior coefficient of variation) or lists of
    the individual results (method "V unknown" unless stated). Too few results raise InputError naming the field."""
    from ..core.units import parse_quantity

    keys = ("tested_fy", "tested_fu", "samples", "method", "cov_fy", "cov_fu")
    unknown = sorted(set(table) - set(keys))
    if unknown:
        raise InputError(f"{field}.{unknown[0]}", table[unknown[0]], "one of the keys " + ", ".join(keys))
    vals = {}
    for k in ("tested_fy", "tested_fu"):
        if k not in table:
            raise InputError(f"{field}.{k}", None, "the test result(s) with units, e.g. '262 MPa' or a list of "
                                                   "the individual results")
        v = table[k]
        items = v if isinstance(v, list) else [v]
        if not items:
            raise InputError(f"{field}.{k}", v, "at least one test result, e.g. '262 MPa'")
        nums = []
        for i, x in enumerate(items):
            f = f"{field}.{k}" + (f"[{i}]" if isinstance(v, list) else "")
            q = parse_quantity(x, "MPa", f)
            nums.append(require_in_range(f, q, 150.0, 700.0, "MPa"))
        vals[k] = tuple(nums)
    listed = len(vals["tested_fy"]) > 1 or len(vals["tested_fu"]) > 1
    method = table.get("method", "V unknown" if listed else "V known")
    if method not in MIN_SAMPLES:
        raise InputError(f"{field}.method", method, "'V known' (prior coefficient of variation) or 'V unknown' "
                                                    "(from the individual results), EN 1990 D7.2")
    if listed:
        if len(vals["tested_fy"]) != len(vals["tested_fu"]):
            raise InputError(f"{field}.tested_fu", table["tested_fu"], f"as many results as tested_fy "
                                                                        f"({len(vals['tested_fy'])})")
        n = len(vals["tested_fy"])
        if "samples" in table and table["samples"] != n:
            raise InputError(f"{field}.samples", table["samples"], f"{n}, the number of results listed")
    else:
        if "samples" not in table:
            raise InputError(f"{field}.samples", None, "the number of coupons the mean values come from "
                                                       "(a whole number >= 1)")
        n = require_count(f"{field}.samples", table["samples"], 0)
    if method == "V unknown" and not listed:
        raise InputError(f"{field}.tested_fy", table["tested_fy"], "a list of the individual results for the "
                                                                    "method 'V unknown' (the spread is needed)")
    if n < MIN_SAMPLES[method]:
        raise InputError(f"{field}.samples", n, f"at least {MIN_SAMPLES[method]} test results for the method "
                                                f"'{method}' (EN 1990 Table D1 gives no k_n for fewer)")
    for a, b in zip(vals["tested_fy"], vals["tested_fu"]):
        if b <= a:
            raise InputError(f"{field}.tested_fu", b, f"more than the matching f_y = {a:g} MPa")
    cov = {}
    for k, d in (("cov_fy", COV_PRIOR["f_y"]), ("cov_fu", COV_PRIOR["f_u"])):
        cov[k] = require_in_range(f"{field}.{k}", table.get(k, d), 0.01, 0.3)
    return TestedSteel(vals["tested_fy"], vals["tested_fu"], n, method, cov["cov_fy"], cov["cov_fu"])


def existing_material_of(spec_value, t_mm: float, field: str = "existing_steel") -> ExistingSteel:
    """Material of an existing member at thickness ``t_mm`` from a text (grade, era band, "unknown") or
    a :class:`TestedSteel`."""
    if isinstance(spec_value, TestedSteel):
        fyk, fuk, text = spec_value.characteristic()
        if fuk <= fyk:
            raise InputError(f"{field}.tested_fu", spec_value.f_u, "characteristic f_u above f_y")
        return ExistingSteel(f"tested steel (f_yk {fyk:.0f} MPa)", Steel("tested", t_mm, round(fyk, 1),
                                                                       round(fuk, 1)), True,
                             TESTED_NOTE + ". " + text)
    return existing_steel(spec_value, t_mm, field)


__all__ = ["EXISTING_STEEL_CAUTION", "HISTORIC_NOTE", "UNKNOWN_NOTE", "TESTED_NOTE", "K_N_TABLE", "MIN_SAMPLES",
           "COV_PRIOR", "TestedSteel", "tested_steel", "existing_material_of", "k_n_annex_d", "X_k_tests", "ERA_BANDS", "EraBand", "ExistingSteel",
           "allowed_materials", "historic_steel", "existing_steel"]
