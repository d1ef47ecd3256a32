"""Shear force, bending moment and deflection diagrams of a :class:`SimpleBeam`.

Two steps, so that a drawing can be made away from the calculation (a headless
build draws it in the build process while the kernel goes on with the calc):

* :func:`beam_diagram_data` samples the beam into plain JSON data (x in m, V in kN,
  M in kNm, w in mm, with the maxima, reactions, loads, restraints and splices);
  numpy only;
* :func:`draw_beam_diagrams` draws that data as a :class:`matplotlib.figure.Figure`
  (no pyplot, no global state) sized for the text width of an A4 page.

:func:`beam_diagrams` does both. Sign convention as in :mod:`splicecalc.analysis.beam`:
sagging moment plotted positive (upwards), deflection drawn downwards.

Public API: :func:`beam_diagram_data`, :func:`draw_beam_diagrams`, :func:`beam_diagrams`,
:func:`envelope_diagram`.
"""

from __future__ import annotations

from typing import Any, Sequence

import numpy as np

from ..actions.loads import UDL, PointLoad
from ..core.errors import InputError, require_finite
from ..core.numeric import sorted_unique
from ..core.text import plain_text_figures
from .beam import SimpleBeam
from .envelope import Envelope

#: A4 text width (about 170 mm) in inches
A4_TEXT_WIDTH_IN = 6.7
#: the ``kind`` of the data :func:`beam_diagram_data` returns
DIAGRAM_KIND = "beam_diagrams"


def _positions(values: object, L: float, field: str) -> tuple[float, ...]:
    if values is None:
        return ()
    if isinstance(values, (int, float)):
        values = (values,)
    if not isinstance(values, (list, tuple, np.ndarray)):
        raise InputError(field, values, "a list of positions in mm")
    out = []
    for i, v in enumerate(values):
        x = require_finite(f"{field}[{i}]", v)
        if not 0.0 <= x <= L:
            raise InputError(f"{field}[{i}]", v, f"a position from 0 to the span {L:g} mm")
        out.append(x)
    return tuple(out)


def _sample(beam: SimpleBeam, n: int) -> tuple[np.ndarray, np.ndarray]:
    """x (mm) and V (N) with both sides of every jump, so point loads plot as steps."""
    bp = beam.breakpoints()
    xs = sorted_unique(np.concatenate((np.linspace(0.0, beam.L, n), bp)))
    vl = np.atleast_1d(beam.V(xs, "left"))
    vr = np.atleast_1d(beam.V(xs, "right"))
    x2 = np.repeat(xs, 2)
    v2 = np.empty_like(x2)
    v2[0::2] = vl
    v2[1::2] = vr
    v2[0] = 0.0
    v2[-1] = 0.0
    return x2, v2


def _list(a: Any, scale: float = 1.0) -> list[float]:
    """Plot values as a JSON list (4 decimals of the plotted unit: far below a line's width)."""
    return [round(float(v), 4) for v in np.asarray(a, dtype=float) / scale]


def beam_diagram_data(beam: SimpleBeam, *, splices_mm: Sequence[float] | None = None,
                      restraints_mm: Sequence[float] | None = None, title: str | None = None,
                      n: int = 401, show_loads: bool = True, deflection_of: SimpleBeam | None = None,
                      deflection_label: str = "") -> dict[str, Any]:
    """The diagrams of ``beam`` as JSON data for :func:`draw_beam_diagrams` (units in the key names).

    splices_mm, restraints_mm: positions from support A, mm. n: plotting points (>= 11).
    show_loads: include the load sketch (values as held by ``beam``, e.g. factored).
    deflection_of: the w panel shows this beam instead (same span, ``I`` set), e.g. the SLS
    combination of a ULS figure; ``deflection_label`` names it on the panel's axis.
    """
    if not isinstance(beam, SimpleBeam):
        raise InputError("beam", beam, "a SimpleBeam")
    L = beam.L
    splices = _positions(splices_mm, L, "splices_mm")
    restraints = _positions(restraints_mm, L, "restraints_mm")
    if isinstance(n, bool) or not isinstance(n, (int, np.integer)) or n < 11:
        raise InputError("n", n, "an integer >= 11")
    if title is not None and not isinstance(title, str):
        raise InputError("title", title, "a text")
    if not isinstance(show_loads, bool):
        raise InputError("show_loads", show_loads, "True or False")
    if deflection_of is not None and (not isinstance(deflection_of, SimpleBeam) or deflection_of.I is None
                                      or abs(deflection_of.L - L) > 1e-9 * L):
        raise InputError("deflection_of", deflection_of, "a SimpleBeam of the same span with I set")
    if not isinstance(deflection_label, str):
        raise InputError("deflection_label", deflection_label, "a text")

    loads = None
    if show_loads:
        loads = []
        for ld in beam.loads:
            if isinstance(ld, UDL):
                a, b = ld.extent(L)
                loads.append({"type": "udl", "name": ld.name, "w_kN_per_m": float(ld.w), "from_m": a / 1e3,
                              "to_m": b / 1e3, "level": getattr(ld, "applied_to", "flange")})
            elif isinstance(ld, PointLoad):
                loads.append({"type": "point", "name": ld.name, "P_kN": ld.P / 1e3, "at_m": ld.x / 1e3,
                              "level": getattr(ld, "applied_to", "flange")})
    xv, v = _sample(beam, n)
    vmx = beam.V_max()
    xm = sorted_unique(np.concatenate((np.linspace(0.0, L, n), beam.breakpoints())))
    mmx = beam.M_max()
    w_beam = deflection_of if deflection_of is not None else (beam if beam.I is not None else None)
    deflection = None
    if w_beam is not None:
        xw = sorted_unique(np.concatenate((np.linspace(0.0, L, n), w_beam.breakpoints())))
        wmx = w_beam.w_max()
        deflection = {"x_m": _list(xw, 1e3), "w_mm": _list(np.atleast_1d(w_beam.w(xw))), "label": deflection_label,
                      "max": {"x_m": wmx.x_mm / 1e3, "value_mm": float(wmx.value)}}
    return {
        "kind": DIAGRAM_KIND, "span_m": L / 1e3, "title": title or "", "loads": loads,
        "shear": {"x_m": _list(xv, 1e3), "V_kN": _list(v, 1e3), "R_A_kN": beam.R_A / 1e3, "R_B_kN": beam.R_B / 1e3,
                  "max": {"x_m": vmx.x_mm / 1e3, "value_kN": vmx.value / 1e3, "abs_kN": vmx.abs / 1e3}},
        "moment": {"x_m": _list(xm, 1e3), "M_kNm": _list(np.atleast_1d(beam.M(xm)), 1e6),
                   "max": {"x_m": mmx.x_mm / 1e3, "value_kNm": mmx.value / 1e6}},
        "deflection": deflection,
        "restraints_m": [x / 1e3 for x in restraints],
        "splices": [{"x_m": x / 1e3, "M_kNm": float(beam.M(x)) / 1e6, "V_kN": float(beam.V(x)) / 1e3,
                     "V_abs_kN": max(abs(float(beam.V(x, "left"))), abs(float(beam.V(x, "right")))) / 1e3}
                    for x in splices],
    }


# ======================================================================== drawing (matplotlib)
def _style_axis(ax: Any, L_m: float, ylabel: str) -> None:
    ax.axhline(0.0, color="black", lw=0.8)
    ax.set_xlim(-0.02 * L_m, 1.02 * L_m)
    ax.set_ylabel(ylabel, fontsize=8)
    ax.margins(y=0.18)
    ax.tick_params(labelsize=7)
    ax.grid(True, lw=0.3, alpha=0.5)


def _supports(ax: Any, L_m: float) -> None:
    for xs, lab in ((0.0, "A"), (L_m, "B")):
        ax.plot([xs], [0.0], marker="^", ms=9, color="black", clip_on=False, zorder=5)
        ax.annotate(lab, (xs, 0.0), xytext=(0, -14), textcoords="offset points", ha="center", fontsize=7)


def _vlines(axes: Any, xs_m: Sequence[float], style: dict, labels: Sequence[str]) -> None:
    for x, lab in zip(xs_m, labels):
        for k, ax in enumerate(axes):
            ax.axvline(x, **style)
            if k == 0:
                ax.annotate(lab, (x, 1.0), xycoords=("data", "axes fraction"), xytext=(0, 2),
                            textcoords="offset points", ha="center", va="bottom", fontsize=7,
                            color=style.get("color", "black"))


def _mark(ax: Any, x_m: float, y: float, text: str, colour: str, L_m: float) -> None:
    ax.plot([x_m], [y], "o", ms=4, color=colour, zorder=6)
    right = x_m > 0.6 * L_m
    ax.annotate(text, (x_m, y), xytext=(-6 if right else 6, 4 if y >= 0 else -11), textcoords="offset points",
                ha="right" if right else "left", fontsize=7, color=colour, zorder=7,
                bbox=dict(boxstyle="round,pad=0.15", fc="white", ec="none", alpha=0.85))


#: width of the diagrams' figure in points (A4 text width), for placing the load labels clear of point loads
LOAD_PANEL_WIDTH_PT = 72.0 * A4_TEXT_WIDTH_IN


def _load_panel(ax: Any, loads: list[dict], L_m: float) -> None:
    """Sketch of the loads: UDLs as stacked bands, point loads as arrows, values in kN/m and kN."""
    from matplotlib.patches import Rectangle

    ax.plot([0.0, L_m], [0.0, 0.0], color="black", lw=2.5, solid_capstyle="butt")
    level = 0.15
    for ld in loads:
        if ld["type"] == "udl":
            a, b = ld["from_m"], ld["to_m"]
            ax.add_patch(Rectangle((a, level), b - a, 0.22, fc="tab:orange", alpha=0.25, ec="tab:orange", lw=0.8))
            where = "" if a <= 1e-9 and b >= L_m - 1e-9 else f", x = {a:.3g} to {b:.3g} m"
            if ld.get("level", "flange") != "flange":      # a line load at a level of its own
                where += f", at the {ld['level']}"
            # the label where no point-load arrow runs through it: the middle, a quarter or three quarters
            # of the band, whichever is furthest from every point load; on a light ground over the arrow
            label = f"{ld['name']}: {ld['w_kN_per_m']:.3g} kN/m{where}"
            pts = [p["at_m"] for p in loads if p["type"] == "point"]
            # half the label's width in metres of span (6.5 pt text, about 3.6 pt a character, on an axis about
            # 0.8 of the figure's width); candidates that keep the label within the span, the middle first
            half = 0.5 * len(label) * 3.6 / (0.8 * LOAD_PANEL_WIDTH_PT) * 1.04 * L_m
            cands = [min(max(a + f * (b - a), half), L_m - half) for f in (0.5, 0.25, 0.75, 0.1, 0.9)]
            xl = next((x for x in cands if all(abs(x - q) > half + 0.02 * L_m for q in pts)), cands[0])
            ax.annotate(label, (xl, level + 0.11), ha="center",
                        va="center", fontsize=6.5, zorder=5,
                        bbox=dict(fc="white", ec="none", alpha=0.75, pad=0.3))
            level += 0.3
    top = level + 0.1
    for ld in loads:
        if ld["type"] == "point":
            ax.annotate("", (ld["at_m"], 0.02), xytext=(ld["at_m"], top + 0.35),
                        arrowprops=dict(arrowstyle="-|>", color="tab:brown", lw=1.2))
            lvl = ld.get("level", "flange")
            on = "" if lvl == "flange" else f", {'through the web' if lvl == 'web' else 'at the ' + lvl}"
            ax.annotate(f"{ld['name']}: {ld['P_kN']:.3g} kN at x = {ld['at_m']:.3g} m{on}", (ld["at_m"], top + 0.37),
                        ha="center",
                        va="bottom", fontsize=6.5, color="tab:brown")
    ax.set_ylim(-0.3, top + 0.75)
    ax.set_yticks([])
    ax.set_ylabel("loads", fontsize=8)
    ax.set_xlim(-0.02 * L_m, 1.02 * L_m)
    for side in ("left", "right", "top"):
        ax.spines[side].set_visible(False)


@plain_text_figures
def draw_beam_diagrams(data: dict[str, Any]) -> Any:
    """Stacked load sketch, V, M (and w) diagrams of :func:`beam_diagram_data` output, with maxima,
    supports A/B, intermediate restraints (dotted, "R1"...) and splices (dashed, "S1"...; M and V
    there labelled). Returns a :class:`matplotlib.figure.Figure`."""
    from matplotlib.figure import Figure

    if not isinstance(data, dict) or data.get("kind") != DIAGRAM_KIND:
        raise InputError("data", type(data).__name__, f"the output of beam_diagram_data (kind {DIAGRAM_KIND!r})")
    L_m = data["span_m"]
    defl = data["deflection"]
    loads = data["loads"]
    title = data["title"]
    nax = 3 if defl is not None else 2
    # fixed margins (inches) rather than a layout engine: the panels are always the same kind, and a
    # constrained layout costs two extra text-layout passes per figure (the PDF is saved with a tight box)
    height = 1.45 * nax + (1.45 if loads is not None else 0.4)
    fig = Figure(figsize=(A4_TEXT_WIDTH_IN, height))
    fig.subplots_adjust(left=0.72 / A4_TEXT_WIDTH_IN, right=1.0 - 0.12 / A4_TEXT_WIDTH_IN,
                        bottom=0.45 / height, top=1.0 - (0.42 if title else 0.12) / height, hspace=0.28)
    fig.splicecalc_tight = False  # everything is drawn inside the figure: no tight-box pass when saving
    if loads is not None:
        all_axes = fig.subplots(nax + 1, 1, sharex=True, gridspec_kw={"height_ratios": [0.8] + [1.0] * nax})
        _load_panel(all_axes[0], loads, L_m)
        axes = all_axes[1:]
    else:
        axes = fig.subplots(nax, 1, sharex=True)

    sh = data["shear"]
    ax = axes[0]
    ax.fill_between(sh["x_m"], sh["V_kN"], 0.0, color="tab:blue", alpha=0.15, lw=0)
    ax.plot(sh["x_m"], sh["V_kN"], color="tab:blue", lw=1.2)
    _style_axis(ax, L_m, "V (kN)")
    ax.annotate(f"RA = {sh['R_A_kN']:.1f} kN", (0.0, 0.0), xytext=(8, -12), textcoords="offset points", fontsize=7)
    ax.annotate(f"RB = {sh['R_B_kN']:.1f} kN", (L_m, 0.0), xytext=(-8, 6), textcoords="offset points",
                ha="right", fontsize=7)
    mx = sh["max"]
    _mark(ax, mx["x_m"], mx["value_kN"], f"|V| max = {mx['abs_kN']:.1f} kN at x = {mx['x_m']:.2f} m", "tab:blue", L_m)

    mo = data["moment"]
    ax = axes[1]
    ax.fill_between(mo["x_m"], mo["M_kNm"], 0.0, color="tab:red", alpha=0.15, lw=0)
    ax.plot(mo["x_m"], mo["M_kNm"], color="tab:red", lw=1.2)
    _style_axis(ax, L_m, "M (kNm), sagging +")
    mx = mo["max"]
    _mark(ax, mx["x_m"], mx["value_kNm"], f"M max = {mx['value_kNm']:.1f} kNm at x = {mx['x_m']:.2f} m",
          "tab:red", L_m)

    if defl is not None:
        ax = axes[2]
        ax.plot(defl["x_m"], defl["w_mm"], color="tab:green", lw=1.2)
        ax.fill_between(defl["x_m"], defl["w_mm"], 0.0, color="tab:green", alpha=0.15, lw=0)
        ax.invert_yaxis()
        lab = defl["label"]
        _style_axis(ax, L_m, f"w (mm){', ' + lab if lab else ''}, down +")
        mx = defl["max"]
        _mark(ax, mx["x_m"], mx["value_mm"], f"w max = {mx['value_mm']:.1f} mm at x = {mx['x_m']:.2f} m",
              "tab:green", L_m)
    for ax in axes:
        _supports(ax, L_m)
    axes[-1].set_xlabel("x from support A (m)", fontsize=8)

    restraints = data["restraints_m"]
    splices = data["splices"]
    _vlines(axes, restraints, dict(color="grey", ls=":", lw=1.0), [f"R{i + 1}" for i in range(len(restraints))])
    _vlines(axes, [s["x_m"] for s in splices], dict(color="tab:purple", ls="--", lw=1.0),
            [f"S{i + 1}" for i in range(len(splices))])
    for s in splices:
        axes[1].annotate(f"M = {s['M_kNm']:.1f} kNm", (s["x_m"], s["M_kNm"]), xytext=(3, -12),
                         textcoords="offset points", fontsize=6.5, color="tab:purple")
        axes[0].annotate(f"|V| = {s['V_abs_kN']:.1f} kN", (s["x_m"], s["V_kN"]), xytext=(3, 3),
                         textcoords="offset points", fontsize=6.5, color="tab:purple")
    if title:
        fig.suptitle(title, fontsize=9)
    return fig


def beam_diagrams(beam: SimpleBeam, *, splices_mm: Sequence[float] | None = None,
                  restraints_mm: Sequence[float] | None = None, title: str | None = None,
                  n: int = 401, show_loads: bool = True, deflection_of: SimpleBeam | None = None,
                  deflection_label: str = "") -> Any:
    """:func:`draw_beam_diagrams` of :func:`beam_diagram_data` (same arguments): a matplotlib Figure."""
    return draw_beam_diagrams(beam_diagram_data(beam, splices_mm=splices_mm, restraints_mm=restraints_mm,
                                                title=title, n=n, show_loads=show_loads,
                                                deflection_of=deflection_of, deflection_label=deflection_label))


def envelope_diagram(env: Envelope, *, splices_mm: Sequence[float] | None = None,
                     title: str | None = None) -> Any:
    """M_Ed and V_Ed envelopes (kNm, kN) with the maxima and splice positions marked (matplotlib Figure)."""
    from matplotlib.figure import Figure

    if not isinstance(env, Envelope):
        raise InputError("env", env, "an Envelope")
    x = env.x_mm
    L = float(x.max())
    splices = _positions(splices_mm, L, "splices_mm")
    fig = Figure(figsize=(A4_TEXT_WIDTH_IN, 4.6), layout="constrained")
    axes = fig.subplots(2, 1, sharex=True)
    for ax, y, sc, unit, colour, lab in ((axes[0], env.V_Ed, 1e3, "kN", "tab:blue", "|V_Ed| (kN)"),
                                         (axes[1], env.M_Ed, 1e6, "kNm", "tab:red", "|M_Ed| (kNm)")):
        ax.plot(x / 1e3, y / sc, color=colour, lw=1.2)
        ax.fill_between(x / 1e3, y / sc, 0.0, color=colour, alpha=0.15, lw=0)
        _style_axis(ax, L / 1e3, lab)
        i = int(np.argmax(y))
        _mark(ax, x[i] / 1e3, y[i] / sc, f"max {y[i] / sc:.1f} {unit} at x = {x[i] / 1e3:.2f} m", colour, L / 1e3)
        _supports(ax, L / 1e3)
    axes[-1].set_xlabel("x from support A (m)", fontsize=8)
    _vlines(axes, [s / 1e3 for s in splices], dict(color="tab:purple", ls="--", lw=1.0),
            [f"S{i + 1}" for i in range(len(splices))])
    if title:
        fig.suptitle(title, fontsize=9)
    return fig


__all__ = ["A4_TEXT_WIDTH_IN", "DIAGRAM_KIND", "beam_diagram_data", "beam_diagrams", "draw_beam_diagrams",
           "envelope_diagram"]
