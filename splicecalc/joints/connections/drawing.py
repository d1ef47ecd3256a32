"""Elevation of an end connection, drawn to scale with matplotlib (mm, equal aspect).

x runs along the new beam from the face of the existing member (x = 0), y upwards from
the top of the new beam (y = 0, the beam hangs below). :func:`draw_connection` returns
the Figure; with ``path`` it also writes the file atomically (PNG or PDF by suffix).
"""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402
from matplotlib.patches import Circle, Polygon, Rectangle  # noqa: E402

from ...core.errors import InputError  # noqa: E402
from ...core.text import plain_text_figures  # noqa: E402

_STEEL = dict(facecolor="0.85", edgecolor="black", linewidth=0.8)
_NEW = dict(facecolor="white", edgecolor="black", linewidth=1.0)
_PLATE = dict(facecolor="0.6", edgecolor="black", linewidth=0.8)


def _dim(ax, x, y0, y1, text):
    ax.annotate("", xy=(x, y0), xytext=(x, y1), arrowprops=dict(arrowstyle="<->", linewidth=0.6))
    ax.text(x + 4, (y0 + y1) / 2, text, fontsize=7, va="center")


def _existing(ax, design, y_top, y_bot):
    ex = design.spec.existing_member
    face = design.spec.existing_face
    if face == "column flange":
        ax.add_patch(Rectangle((-ex.tf, y_bot), ex.tf, y_top - y_bot, **_STEEL))
        ax.add_patch(Rectangle((-ex.h, y_bot), ex.tf, y_top - y_bot, **_STEEL))
        ax.add_patch(Rectangle((-ex.h + ex.tf, y_bot), ex.h - 2 * ex.tf, y_top - y_bot, facecolor="0.95",
                               edgecolor="0.5", linewidth=0.5))
        return f"existing column {ex.designation}, flange face"
    if face == "column web":
        ax.add_patch(Rectangle((-ex.tw, y_bot), ex.tw, y_top - y_bot, **_STEEL))
        out = (ex.b - ex.tw) / 2.0
        for x0 in (-ex.tw - out, 0.0):
            ax.add_patch(Rectangle((x0, y_bot), out, y_top - y_bot, fill=False, edgecolor="0.5", linestyle="--",
                                   linewidth=0.5))
        return f"existing column {ex.designation}, web face (flanges dashed, behind)"
    # beam web: existing beam in cross-section, top flanges level
    cx = -ex.tw / 2.0
    pts = [(cx - ex.b / 2, 0), (cx + ex.b / 2, 0), (cx + ex.b / 2, -ex.tf), (cx + ex.tw / 2, -ex.tf),
           (cx + ex.tw / 2, -ex.h + ex.tf), (cx + ex.b / 2, -ex.h + ex.tf), (cx + ex.b / 2, -ex.h),
           (cx - ex.b / 2, -ex.h), (cx - ex.b / 2, -ex.h + ex.tf), (cx - ex.tw / 2, -ex.h + ex.tf),
           (cx - ex.tw / 2, -ex.tf), (cx - ex.b / 2, -ex.tf)]
    lv = getattr(design.spec, "level", 0.0)
    ax.add_patch(Polygon([(x, y - lv) for x, y in pts], closed=True, **_STEEL))
    where = "tops of steel level" if abs(lv) < 1e-9 else f"new top {lv:g} mm below the existing top"
    return f"existing beam {ex.designation} in section, web face ({where})"


@plain_text_figures
def draw_connection(design, path: str | os.PathLike | None = None, length_mm: float | None = None):
    """Elevation of ``design`` (a ConnectionDesign) to scale; write to ``path`` if given."""
    from .design import ConnectionDesign
    if not isinstance(design, ConnectionDesign):
        raise InputError("design", design, "a ConnectionDesign from design_end_connection")
    det, spec = design.detail, design.spec
    beam = _beam_of(design)
    L = length_mm or max(350.0, 1.2 * beam.h)
    fig, ax = plt.subplots(figsize=(7.0, 7.0 * (beam.h + 250) / (L + 400)))
    ex_h = spec.existing_member.h if spec.existing_face == "beam web" else 0.0
    y_top, y_bot = 80.0, -max(beam.h, ex_h) - 110.0
    what = _existing(ax, design, y_top, y_bot)
    x0 = det.t_p if det.kind == "end plate" else det.gap
    dn, c = spec.notch_depth or 0.0, spec.notch_length or 0.0
    # new beam outline (elevation): flanges as bands, notch cut from the top
    dnb, cb = getattr(spec, "notch_bottom_depth", None) or 0.0, getattr(spec, "notch_bottom_length", None) or 0.0
    pts = [(x0 + c, 0.0), (x0 + L, 0.0), (x0 + L, -beam.h)]
    pts += [(x0 + cb, -beam.h), (x0 + cb, -beam.h + dnb), (x0, -beam.h + dnb)] if dnb else [(x0, -beam.h)]
    pts += [(x0, -dn), (x0 + c, -dn)] if dn else [(x0, 0.0)]
    ax.add_patch(Polygon(pts, closed=True, **_NEW))
    ax.plot([x0 + c if dn else x0, x0 + L], [-beam.tf, -beam.tf], color="black", linewidth=0.6)
    ax.plot([x0 + (cb if dnb else 0.0), x0 + L], [-beam.h + beam.tf, -beam.h + beam.tf], color="black",
            linewidth=0.6)
    yp0, yp1 = -det.top, -det.top - det.h_p
    rows = [yp0 - det.e_1 - i * det.p_1 for i in range(det.n_1)]
    d0 = det.bolt.d_0
    if det.kind == "end plate":
        ax.add_patch(Rectangle((0.0, yp1), det.t_p, det.h_p, **_PLATE))
        t2 = design.spec.existing_member.tf if spec.existing_face == "column flange" else \
            design.spec.existing_member.tw
        for y in rows:
            ax.add_patch(Rectangle((-t2 - 14, y - det.bolt.d / 2), t2 + det.t_p + 28, det.bolt.d,
                                   facecolor="black", edgecolor="black"))
        label = "partial-depth end plate"
    else:
        ax.add_patch(Rectangle((0.0, yp1), det.b_p, det.h_p, **_PLATE))
        for y in rows:
            ax.add_patch(Circle((det.z, y), d0 / 2, facecolor="white", edgecolor="black", linewidth=0.8))
        label = "fin plate"
    _dim(ax, max(det.b_p, det.t_p) + x0 + 25, yp0, yp1, f"h_p = {det.h_p:g}")
    if det.n_1 > 1:
        _dim(ax, max(det.b_p, det.t_p) + x0 + 95, rows[0], rows[1], f"p_1 = {det.p_1:g}")
    _dim(ax, max(det.b_p, det.t_p) + x0 + 95, yp0, rows[0], f"e_1 = {det.e_1:g}")
    ax.set_aspect("equal")
    ax.set_xlim(min(-design.spec.existing_member.h if spec.existing_face == "column flange" else
                    -design.spec.existing_member.b, -150) - 20, x0 + L + 20)
    ax.set_ylim(y_bot - 20, y_top + 20)
    ax.set_xlabel("mm from the face of the existing member")
    ax.set_ylabel("mm from the top of the new beam")
    ax.set_title(f"Support {spec.index} ({spec.at}): {label}, elevation to scale", fontsize=9)
    ax.text(0.01, 0.01, f"{what}\nnew beam {beam.designation}; {det.n_b} {det.bolt.size} {det.bolt.bolt_class} "
            f"bolts; plate {det.t_p:g} mm {det.plate_grade}; welds {det.weld_leg:g} mm leg",
            transform=ax.transAxes, fontsize=6, va="bottom")
    ax.tick_params(labelsize=7)
    fig.tight_layout()
    if path is not None:
        p = Path(path)
        fd, tmp = tempfile.mkstemp(suffix=p.suffix or ".png", dir=str(p.parent) if str(p.parent) else ".")
        os.close(fd)
        try:
            fig.savefig(tmp, dpi=200)
            os.replace(tmp, p)
        finally:
            if os.path.exists(tmp):
                os.unlink(tmp)
    return fig


def _beam_of(design):
    beam = getattr(design, "beam", None)
    if beam is None:
        raise InputError("design", design, "a ConnectionDesign that carries its beam section")
    return beam


__all__ = ["draw_connection"]
