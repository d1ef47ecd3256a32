"""Dimensioned elevation and plan of a cover-plate splice, to scale (matplotlib).

Two steps, so that the drawing can be made away from the calculation (a headless
build draws it in the build process): :func:`splice_drawing_data` takes the
dimensions of a :class:`~splicecalc.joints.splice.design.SpliceDesign` as plain
JSON data (mm), :func:`draw_splice_data` draws them as a
:class:`matplotlib.figure.Figure` with two axes at equal scale: the elevation
(beam ends, gap, flange cover plates, web plates, web bolt holes, pitches and end
distances) and the plan of the top flange (flange, outer plate, holes, gauge,
pitch, e1, e2). :func:`draw_splice` does both. No state is left in pyplot.
"""

from __future__ import annotations

from typing import Any

from ...core.errors import InputError
from ...core.text import plain_text_figures

#: the ``kind`` of the data :func:`splice_drawing_data` returns
SPLICE_KIND = "splice"
#: the dimensions (mm) and counts taken from the splice geometry
_GEOMETRY_KEYS = ("L_fp", "L_wp", "e1_f", "p1_f", "t_po", "t_pi", "b_po", "b_pi", "e2_po", "g_f", "p2o_f",
                  "h_wp", "t_wp", "e1_w", "g_w", "e_v", "p_w", "n_r", "n_c")

_DIM = dict(color="0.25", lw=0.6)


#: a dimension's text: on a white ground (a centre line or hatch behind it never strikes it), drawn over lines
_LABEL = dict(bbox=dict(fc="white", ec="none", pad=0.4), zorder=6)


def _dim(ax, x1, y1, x2, y2, text, off=0.0, vertical=False, fs=6, where=""):
    """A dimension line with end arrows and its text (mm). The text is set off the line by a few points
    of paper (whatever the scale), so it never sits on its own arrow: above a horizontal line (``where``
    "below": under it; "right": past its right-hand end, for a dimension shorter than its text) or beside
    a vertical one (right of it)."""
    if vertical:
        x = x1 + off
        ax.annotate("", xy=(x, y1), xytext=(x, y2), arrowprops=dict(arrowstyle="<->", **_DIM))
        ax.annotate(text, xy=(x, (y1 + y2) / 2), xytext=(2.0, 0.0), textcoords="offset points", fontsize=fs,
                    va="center", ha="left", rotation=90, **_LABEL)
    else:
        y = y1 + off
        ax.annotate("", xy=(x1, y), xytext=(x2, y), arrowprops=dict(arrowstyle="<->", **_DIM))
        if where == "right":
            ax.annotate(text, xy=(max(x1, x2), y), xytext=(3.0, 0.0), textcoords="offset points", fontsize=fs,
                        ha="left", va="center", **_LABEL)
        elif where == "below":
            ax.annotate(text, xy=((x1 + x2) / 2, y), xytext=(0.0, -1.5), textcoords="offset points", fontsize=fs,
                        ha="center", va="top", **_LABEL)
        else:
            ax.annotate(text, xy=((x1 + x2) / 2, y), xytext=(0.0, 1.5), textcoords="offset points", fontsize=fs,
                        ha="center", va="bottom", **_LABEL)


def splice_drawing_data(design: Any, title: str | None = None) -> dict[str, Any]:
    """The dimensions of ``design`` (a SpliceDesign) for :func:`draw_splice_data`: JSON data, mm."""
    if not all(hasattr(design, a) for a in ("section", "geometry", "layout")):
        raise InputError("design", type(design).__name__, "a SpliceDesign (section, geometry and layout)")
    if title is not None and not isinstance(title, str):
        raise InputError("title", title, "a text")
    s, g, lay = design.section, design.geometry, design.layout
    return {"kind": SPLICE_KIND, "title": title or "",
            "section": {"designation": getattr(s, "designation", ""),
                        **{k: float(getattr(s, k)) for k in ("h", "b", "tf", "tw")}},
            "geometry": {k: _plain(getattr(g, k)) for k in _GEOMETRY_KEYS},
            "flange_rows": lay.flange.rows, "flange_columns": lay.flange.columns,
            "bolt_size": lay.bolt_size, "bolt_class": lay.bolt_class, "d_0": float(_d0(design))}


def _plain(v: Any) -> int | float:
    """A JSON number: counts stay integers, dimensions become floats."""
    return int(v) if float(v).is_integer() and not isinstance(v, float) else float(v)


def draw_splice(design: Any, title: str | None = None) -> Any:
    """:func:`draw_splice_data` of :func:`splice_drawing_data`: the drawing of ``design`` (a Figure)."""
    return draw_splice_data(splice_drawing_data(design, title))


@plain_text_figures
def draw_splice_data(data: dict[str, Any]) -> Any:
    """Elevation and plan of a splice from :func:`splice_drawing_data`, to scale; a matplotlib Figure."""
    from types import SimpleNamespace

    from matplotlib.figure import Figure
    from matplotlib.patches import Circle, Rectangle

    if not isinstance(data, dict) or data.get("kind") != SPLICE_KIND:
        raise InputError("data", type(data).__name__, f"the output of splice_drawing_data (kind {SPLICE_KIND!r})")
    s = SimpleNamespace(**data["section"])
    g = SimpleNamespace(**data["geometry"])
    lay = SimpleNamespace(flange=SimpleNamespace(rows=data["flange_rows"], columns=data["flange_columns"]),
                          bolt_size=data["bolt_size"], bolt_class=data["bolt_class"])
    title = data["title"] or None
    gap = g.L_fp - 2 * (2 * g.e1_f + (lay.flange.rows - 1) * g.p1_f)
    d_hole = data["d_0"]
    h, b, tf, tw = s.h, s.b, s.tf, s.tw
    ext = max(g.L_fp, g.L_wp) / 2 + 80.0
    # side by side: the elevation is about as tall as it is wide, the plan much flatter, so
    # stacking them (equal aspect) leaves the elevation tiny on an A4 sheet
    fig = Figure(figsize=(9.0, 5.2))
    ax1 = fig.add_subplot(1, 2, 1)
    ax2 = fig.add_subplot(1, 2, 2)
    # ----------------------------------------------------------- elevation (x along beam, z up; joint at x = 0)
    ax = ax1
    for sgn in (-1, 1):
        x0 = sgn * gap / 2
        x1 = sgn * ext
        lo, hi = min(x0, x1), max(x0, x1)
        ax.add_patch(Rectangle((lo, -h / 2), hi - lo, tf, fc="0.85", ec="k", lw=0.8))
        ax.add_patch(Rectangle((lo, h / 2 - tf), hi - lo, tf, fc="0.85", ec="k", lw=0.8))
        ax.add_patch(Rectangle((lo, -h / 2 + tf), hi - lo, h - 2 * tf, fc="0.95", ec="k", lw=0.5))
    # flange plates
    Lf = g.L_fp
    ax.add_patch(Rectangle((-Lf / 2, h / 2), Lf, g.t_po, fc="#7fa7d9", ec="k", lw=0.8))
    ax.add_patch(Rectangle((-Lf / 2, -h / 2 - g.t_po), Lf, g.t_po, fc="#7fa7d9", ec="k", lw=0.8))
    if g.t_pi > 0:
        ax.add_patch(Rectangle((-Lf / 2, h / 2 - tf - g.t_pi), Lf, g.t_pi, fc="#a9c6ea", ec="k", lw=0.6, ls="--"))
        ax.add_patch(Rectangle((-Lf / 2, -h / 2 + tf), Lf, g.t_pi, fc="#a9c6ea", ec="k", lw=0.6, ls="--"))
    # flange bolts (centre lines)
    for sgn in (-1, 1):
        for i in range(lay.flange.rows):
            x = sgn * (gap / 2 + g.e1_f + i * g.p1_f)
            for zc in (h / 2 + g.t_po, -h / 2 - g.t_po):
                ax.plot([x, x], [zc + (8 if zc > 0 else -8), zc - (tf + g.t_po + g.t_pi + 8) * (1 if zc > 0 else -1)],
                        color="k", lw=1.2)
    # web plate and bolts
    Lw, hw = g.L_wp, g.h_wp
    ax.add_patch(Rectangle((-Lw / 2, -hw / 2), Lw, hw, fc="#f2c48d", ec="k", lw=0.8, alpha=0.9))
    for sgn in (-1, 1):
        for i in range(g.n_r):
            for j in range(g.n_c):
                x = sgn * (gap / 2 + g.e1_w + j * g.g_w)
                z = hw / 2 - g.e_v - i * g.p_w
                ax.add_patch(Circle((x, z), d_hole / 2, fc="white", ec="k", lw=0.8))
    # dimensions (right half)
    x_first = gap / 2 + g.e1_w
    top_b = hw / 2 - g.e_v
    _dim(ax, -gap / 2, -h / 2 - g.t_po - 25, gap / 2, -h / 2 - g.t_po - 25, f"gap {gap:g}", where="right")
    # dimensions in rows of their own where short ones sit side by side (their texts are wider than them)
    _dim(ax, gap / 2, -hw / 2 - 12, x_first, -hw / 2 - 12, f"e1 {g.e1_w:g}", where="right")
    if g.n_c > 1:
        _dim(ax, x_first, -hw / 2 - 34, x_first + g.g_w, -hw / 2 - 34, f"{g.g_w:g}", where="below")
    if g.n_r > 1:
        _dim(ax, Lw / 2 + 15, top_b, Lw / 2 + 15, top_b - g.p_w, f"p {g.p_w:g}", vertical=True)
    _dim(ax, Lw / 2 + 40, hw / 2, Lw / 2 + 40, top_b, f"ev {g.e_v:g}", vertical=True)
    _dim(ax, -Lw / 2 - 40, -hw / 2, -Lw / 2 - 40, hw / 2, f"{hw:g}", vertical=True)
    _dim(ax, -Lf / 2, h / 2 + g.t_po + 20, Lf / 2, h / 2 + g.t_po + 20, f"flange plate {Lf:g}")
    _dim(ax, -Lw / 2, hw / 2 + 12, Lw / 2, hw / 2 + 12, f"web plates {Lw:g}")    # above the plate, clear of bolts
    ax.set_aspect("equal")
    ax.set_xlim(-ext, ext)
    ax.set_ylim(-h / 2 - g.t_po - 60, h / 2 + g.t_po + 60)
    ax.set_title(f"Elevation: {s.designation}, web plates 2 x {g.h_wp:g} x {g.t_wp:g}", fontsize=8)
    ax.axvline(0.0, color="0.5", lw=0.5, ls="-.")
    ax.tick_params(labelsize=6)
    # ------------------------------------------------------------------- plan of the top flange (y across)
    ax = ax2
    for sgn in (-1, 1):
        x0, x1 = sgn * gap / 2, sgn * ext
        lo, hi = min(x0, x1), max(x0, x1)
        ax.add_patch(Rectangle((lo, -b / 2), hi - lo, b, fc="0.85", ec="k", lw=0.8))
        ax.plot([lo, hi], [tw / 2, tw / 2], color="0.4", lw=0.5, ls="--")
        ax.plot([lo, hi], [-tw / 2, -tw / 2], color="0.4", lw=0.5, ls="--")
    ax.add_patch(Rectangle((-Lf / 2, -g.b_po / 2), Lf, g.b_po, fc="#7fa7d9", ec="k", lw=0.8, zorder=2))
    ys = _flange_lines(g, lay.flange.columns)
    for sgn in (-1, 1):
        for i in range(lay.flange.rows):
            x = sgn * (gap / 2 + g.e1_f + i * g.p1_f)
            for y in ys:
                ax.add_patch(Circle((x, y), d_hole / 2, fc="white", ec="k", lw=0.8, zorder=3))
    xr = gap / 2 + g.e1_f
    _dim(ax, gap / 2, -b / 2 - 12, xr, -b / 2 - 12, f"e1 {g.e1_f:g}", where="right")
    if lay.flange.rows > 1:
        _dim(ax, xr, -b / 2 - 30, xr + g.p1_f, -b / 2 - 30, f"p1 {g.p1_f:g}", where="below")
    xd = Lf / 2 + 15
    _dim(ax, xd, -g.g_f / 2, xd, g.g_f / 2, f"gauge {g.g_f:g}", vertical=True)
    _dim(ax, xd + 40, max(ys), xd + 40, g.b_po / 2, f"e2 {g.e2_po:g}", vertical=True)
    _dim(ax, -Lf / 2 - 30, -b / 2, -Lf / 2 - 30, b / 2, f"b {b:g}", vertical=True)
    ax.set_aspect("equal")
    ax.set_xlim(-ext, ext)
    ax.set_ylim(-b / 2 - 60, b / 2 + 30)
    inner = f" + 2 inner {g.b_pi:g} x {g.t_pi:g}" if g.t_pi > 0 else ""
    ax.set_title(f"Plan on top flange: outer plate {g.b_po:g} x {g.t_po:g} x {Lf:g}{inner};\n"
                 f"{lay.bolt_size} {lay.bolt_class} bolts in {d_hole:g} mm holes", fontsize=8)
    ax.axvline(0.0, color="0.5", lw=0.5, ls="-.")
    # ------------------------------------------------------------------- one scale, no plot axes
    # both views at one standard scale (joints.sheet_scale), placed side by side on a figure the
    # width the calc sheet prints it at, saved uncropped so that the stated ratio holds on paper
    from ..sheet_scale import PRINT_WIDTH_MM, fit_scale

    e_w = 2 * ext
    e1_h = h + 2 * g.t_po + 120.0
    e2_h = b + 90.0
    gap_mm, foot_mm, head_mm = 10.0, 7.0, 16.0
    sc = fit_scale(2 * e_w + gap_mm * 10, max(e1_h, e2_h), room_h=150.0)
    H = max(e1_h, e2_h) / sc + foot_mm + head_mm
    fig.set_size_inches(PRINT_WIDTH_MM / 25.4, H / 25.4)
    w = e_w / sc / PRINT_WIDTH_MM
    ax1.set_position((0.0, foot_mm / H, w, e1_h / sc / H))
    ax2.set_position((w + gap_mm / PRINT_WIDTH_MM, (foot_mm + (e1_h - e2_h) / 2 / sc) / H, w, e2_h / sc / H))
    for a in (ax1, ax2):
        a.set_axis_off()
        t = a.get_title()
        a.set_title("")
        a.set_title(t, loc="left", fontsize=7)
    fig.suptitle(title or "Bolted cover-plate splice", fontsize=8, x=0.0, ha="left", y=1.0 - 2.0 / H)
    fig.text(0.0, 1.0 / H, f"Scale 1:{sc:g} when printed {PRINT_WIDTH_MM:g} mm wide (as on the calc sheet). "
             "Dimensions in mm.", fontsize=6.5, style="italic", ha="left", va="bottom")
    fig.splicecalc_tight = False
    return fig


def _d0(design: Any) -> float:
    from ..bolts import get_bolt
    return get_bolt(design.layout.bolt_size, design.layout.bolt_class).d_0


def _flange_lines(g, cols: int) -> list[float]:
    y = g.g_f / 2
    if cols == 2:
        return [-y, y]
    return [-y - g.p2o_f, -y, y, y + g.p2o_f]


__all__ = ["SPLICE_KIND", "draw_splice", "draw_splice_data", "splice_drawing_data"]
