"""End connection drawing for the calc sheet: elevation and a second view, to a stated scale.

:func:`connection_drawing_data` gives the drawing as JSON data (all from the designed
detail: nothing is computed here), :func:`draw_connection_data` draws it with matplotlib
(imported inside), as every figure of the package is made (``report.figures.DRAWERS``,
kind ``"connection"``).

* Elevation: the existing member at the left (x = 0 its face), the new beam to the right
  (y = 0 its top, the beam below), the plate, bolt rows, welds, top notch, dimensioned
  (plate top, e1, pitch, plate depth, notch depth x length, top and bottom notches); on an existing
  beam web the existing section is drawn at its level against the new beam (``top_below_existing_mm``).
* Second view: for an end plate the view on the plate (width, gauge, edge distance, bolt
  holes, web welds each side); for a fin plate a plan section through the bolts (support,
  plate, beam web, bolt line distance z, gap).

Both views share one axis in millimetres, so one scale holds for the whole figure: the
figure is made :data:`PRINT_WIDTH_MM` wide (the width the calc package prints figures at)
and the limits are chosen so that the printed drawing is at a standard ratio (1:2.5, 1:5,
1:10 ...), stated under it. No plot axes; dimensions in mm.
"""

from __future__ import annotations

from typing import Any

from ...core.text import plain_text_figures

from ..sheet_scale import PRINT_WIDTH_MM, SCALES, fit_scale


def connection_drawing_data(design: Any, title: str = "") -> dict[str, Any]:
    """JSON data of the drawing of a :class:`~splicecalc.joints.connections.design.ConnectionDesign`."""
    det, spec, beam = design.detail, design.spec, design.beam
    ex = spec.existing_member
    return {
        "kind": "connection",
        "title": title or f"End {'A' if spec.at == 'start' else 'B'}: {det.kind}",
        "detail": det.kind,
        "beam": {"designation": beam.designation, "h_mm": beam.h, "b_mm": beam.b, "tw_mm": beam.tw,
                 "tf_mm": beam.tf, "r_mm": beam.r},
        "existing": {"designation": getattr(ex, "designation", ""), "h_mm": ex.h, "b_mm": ex.b,
                     "tw_mm": ex.tw, "tf_mm": ex.tf, "face": spec.existing_face},
        "plate": {"t_mm": det.t_p, "h_mm": det.h_p, "b_mm": det.b_p, "top_mm": det.top, "grade": det.plate_grade},
        "bolts": {"size": det.bolt.size, "class": det.bolt.bolt_class, "d_mm": det.bolt.d, "d0_mm": det.bolt.d_0,
                  "rows": det.n_1, "lines": det.n_2, "p1_mm": det.p_1, "e1_mm": det.e_1, "e2_mm": det.e_2,
                  "p3_mm": det.p_3, "z_mm": det.z, "gap_mm": det.gap, "e2b_mm": det.e_2b},
        "weld_leg_mm": det.weld_leg,
        "notch": {"depth_mm": spec.notch_depth or 0.0, "length_mm": spec.notch_length or 0.0},
        "notch_bottom": {"depth_mm": getattr(spec, "notch_bottom_depth", None) or 0.0,
                         "length_mm": getattr(spec, "notch_bottom_length", None) or 0.0},
        "top_below_existing_mm": getattr(spec, "level", 0.0),
    }


@plain_text_figures
def draw_connection_data(data: dict[str, Any]) -> Any:
    """Draw :func:`connection_drawing_data` (elevation + second view) to a stated scale; a Figure."""
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
    from matplotlib.patches import Circle, Polygon, Rectangle

    bm, ex, pl, bo = data["beam"], data["existing"], data["plate"], data["bolts"]
    end_plate = data["detail"] == "end plate"
    h, tw, tf = bm["h_mm"], bm["tw_mm"], bm["tf_mm"]
    tp, hp, bp, top = pl["t_mm"], pl["h_mm"], pl["b_mm"], pl["top_mm"]
    leg = data["weld_leg_mm"]
    dn, c = data["notch"]["depth_mm"], data["notch"]["length_mm"]
    nb = data.get("notch_bottom") or {}
    dnb, cb = nb.get("depth_mm", 0.0), nb.get("length_mm", 0.0)
    lv = data.get("top_below_existing_mm", 0.0)             # existing top at y = +lv
    rows = [-top - bo["e1_mm"] - i * bo["p1_mm"] for i in range(bo["rows"])]
    steel = dict(facecolor="0.86", edgecolor="black", linewidth=0.7)
    new = dict(facecolor="white", edgecolor="black", linewidth=0.9)
    plate = dict(facecolor="0.62", edgecolor="black", linewidth=0.7)
    weld = dict(facecolor="black", edgecolor="black", linewidth=0.3)
    txt = dict(fontsize=6.5, family="sans-serif")

    fig = plt.figure()
    ax = fig.add_axes((0.0, 0.0, 1.0, 1.0))
    ax.set_axis_off()
    ax.set_aspect("equal")

    def dim_v(x: float, y0: float, y1: float, label: str, side: str = "right") -> None:
        ax.annotate("", xy=(x, y0), xytext=(x, y1), arrowprops=dict(arrowstyle="<->", linewidth=0.5,
                                                                       shrinkA=0, shrinkB=0))
        ax.text(x + (3 if side == "right" else -3), (y0 + y1) / 2, label, va="center",
                ha="left" if side == "right" else "right", **txt)

    def dim_h(y: float, x0: float, x1: float, label: str, below: bool = True) -> None:
        ax.annotate("", xy=(x0, y), xytext=(x1, y), arrowprops=dict(arrowstyle="<->", linewidth=0.5,
                                                                       shrinkA=0, shrinkB=0))
        ax.text((x0 + x1) / 2, y + (-3 if below else 3), label, ha="center", va="top" if below else "bottom", **txt)

    # ------------------------------------------------------------------ elevation
    y_top, y_bot = 60.0, -h - 60.0
    face = ex["face"]
    if face == "beam web":
        cx, eb, eh, etf, etw = -ex["tw_mm"] / 2, ex["b_mm"], ex["h_mm"], ex["tf_mm"], ex["tw_mm"]
        pts = [(cx - eb / 2, 0), (cx + eb / 2, 0), (cx + eb / 2, -etf), (cx + etw / 2, -etf),
               (cx + etw / 2, -eh + etf), (cx + eb / 2, -eh + etf), (cx + eb / 2, -eh), (cx - eb / 2, -eh),
               (cx - eb / 2, -eh + etf), (cx - etw / 2, -eh + etf), (cx - etw / 2, -etf), (cx - eb / 2, -etf)]
        ax.add_patch(Polygon([(x, y - lv) for x, y in pts], closed=True, **steel))
        x_left = cx - eb / 2
        y_top = max(y_top, -lv + 30.0)
        y_bot = min(y_bot, -lv - eh - 30.0)
    else:
        t_face = ex["tf_mm"] if face == "column flange" else ex["tw_mm"]
        ax.add_patch(Rectangle((-t_face, y_bot), t_face, y_top - y_bot, **steel))
        x_left = -t_face - 40.0
        ax.plot([x_left + 10, x_left + 10], [y_bot, y_top], color="0.4", linewidth=0.5, linestyle="-.")
    x0 = tp if end_plate else bo["gap_mm"]
    L = max(0.55 * h, bp + 120.0)                        # length of new beam shown (broken off)
    outline = [(x0 + c, 0.0), (x0 + L, 0.0), (x0 + L, -h)]
    outline += [(x0 + cb, -h), (x0 + cb, -h + dnb), (x0, -h + dnb)] if dnb else [(x0, -h)]
    outline += [(x0, -dn), (x0 + c, -dn)] if dn else [(x0, 0.0)]
    ax.add_patch(Polygon(outline, closed=True, **new))
    ax.plot([x0 + (c if dn else 0.0), x0 + L], [-tf, -tf], color="black", linewidth=0.5)
    ax.plot([x0 + (cb if dnb else 0.0), x0 + L], [-h + tf, -h + tf], color="black", linewidth=0.5)
    for xx in (x0 + L,):                                   # break line at the far end
        ax.plot([xx, xx], [0, -h], color="white", linewidth=1.6)
        ax.plot([xx - 6, xx + 6, xx - 6, xx + 6], [-h * 0.45, -h * 0.48, -h * 0.52, -h * 0.55], color="black",
                linewidth=0.6)
    yp0, yp1 = -top, -top - hp
    if end_plate:
        ax.add_patch(Rectangle((0.0, yp1), tp, hp, **plate))
        ax.add_patch(Rectangle((tp, yp1), leg, hp, **weld))          # web fillet (seen edge-on)
        t_through = ex["tf_mm"] if face == "column flange" else ex["tw_mm"]
        for y in rows:
            ax.add_patch(Rectangle((-t_through - 10, y - bo["d_mm"] / 2), t_through + tp + 22, bo["d_mm"],
                                   facecolor="0.25", edgecolor="black", linewidth=0.4))
    else:
        ax.add_patch(Rectangle((0.0, yp1), bp, hp, **plate))
        ax.add_patch(Rectangle((0.0, yp1), leg, hp, **weld))          # fillet to the support
        for y in rows:
            ax.add_patch(Circle((bo["z_mm"], y), bo["d0_mm"] / 2, facecolor="white", edgecolor="black",
                                linewidth=0.6))
    xd = x0 + max(bp if not end_plate else 0.0, 0.0) + 45.0
    dim_v(xd, 0.0, yp0, f"{top:g}")
    dim_v(xd, yp0, rows[0], f"e1 {bo['e1_mm']:g}")
    if bo["rows"] > 1:
        dim_v(xd, rows[0], rows[-1], f"{bo['rows'] - 1} x p1 {bo['p1_mm']:g}")
    dim_v(xd, rows[-1], yp1, f"{bo['e1_mm']:g}")
    dim_v(xd + 95, yp0, yp1, f"plate {hp:g}")
    if dn:
        dim_h(12.0, x0, x0 + c, f"notch {c:g}", below=False)
        dim_v(x0 + c + 8, 0.0, -dn, f"{dn:g}")
    if dnb:
        dim_h(-h - 12.0, x0, x0 + cb, f"notch {cb:g}")
        dim_v(x0 + cb + 8, -h, -h + dnb, f"{dnb:g}")
        y_bot = min(y_bot, -h - 40.0)
    if face == "beam web":
        ax.text(x0 + L - 8, 4.0, "tops of steel level" if abs(lv) < 1e-9 else
                f"new top {abs(lv):g} {'below' if lv > 0 else 'above'} existing top", ha="right", va="bottom",
                **txt)
    ax.text(x0 + L - 8, -h - 6.0 if dnb else -h + tf + 8, f"new beam {bm['designation']}", ha="right",
            va="top" if dnb else "bottom", **txt)
    weld_note = (f"{leg:g} mm fillet welds,\nboth sides of the web" if end_plate
                 else f"{leg:g} mm fillet welds,\nboth sides, to the support")
    ax.annotate(weld_note, xy=((tp + leg / 2) if end_plate else leg / 2, yp1 + 0.3 * hp),
                xytext=(x0 + 60, yp1 - 45 if yp1 - 45 > y_bot + 10 else yp1 + 20),
                arrowprops=dict(arrowstyle="-", linewidth=0.4), **txt)
    ax.text(x_left, y_top + 4, "ELEVATION", ha="left", va="bottom", fontsize=7, fontweight="bold",
            family="sans-serif")
    # "existing: existing stanchion" said the word twice: the prefix only when the name lacks it
    ex_name = str(ex['designation'] or 'member')
    ex_label = ex_name if ex_name.lower().startswith("existing") else f"existing: {ex_name}"
    if face == "beam web":
        ax.text(x_left, y_bot + 6, f"{ex_label}\n({face})", ha="left", va="bottom",
                **txt)
    else:                                   # along the column, left of its face, clear of the bolts
        ax.text(x_left + 2, y_bot + 10, f"{ex_label} ({face})", rotation=90,
                ha="left", va="bottom", **txt)
    x_right = max(x0 + L + 12, xd + 150)

    # ------------------------------------------------------------------ second view
    X = x_right + 50.0
    if end_plate:
        xc = X + max(bm["b_mm"], bp) / 2 + 10
        bb = bm["b_mm"]
        for y0f in (0.0, -h + tf):                                        # beam flanges behind, dashed
            ax.add_patch(Rectangle((xc - bb / 2, y0f - tf), bb, tf, fill=False, edgecolor="0.45", linewidth=0.5,
                                   linestyle="--"))
        ax.add_patch(Rectangle((xc - tw / 2, -h + tf), tw, h - 2 * tf, fill=False, edgecolor="0.45",
                               linewidth=0.5, linestyle="--"))
        ax.add_patch(Rectangle((xc - bp / 2, yp1), bp, hp, **plate))
        ax.add_patch(Rectangle((xc - tw / 2, yp1), tw, hp, facecolor="white", edgecolor="black", linewidth=0.6))
        for s in (-1, 1):
            xw = xc + s * tw / 2 + (0 if s > 0 else -leg)
            ax.add_patch(Rectangle((xw, yp1), leg, hp, **weld))
        for y in rows:
            for s in (-1, 1):
                ax.add_patch(Circle((xc + s * bo["p3_mm"] / 2, y), bo["d0_mm"] / 2, facecolor="white",
                                    edgecolor="black", linewidth=0.6))
        dim_h(yp1 - 14, xc - bp / 2, xc + bp / 2, f"plate {bp:g}")
        dim_h(yp1 - 34, xc - bo["p3_mm"] / 2, xc + bo["p3_mm"] / 2, f"gauge p3 {bo['p3_mm']:g}")
        dim_h(yp0 + 14, xc + bo["p3_mm"] / 2, xc + bp / 2, f"e2 {bo['e2_mm']:g}", below=False)
        ax.text(xc - max(bb, bp) / 2, y_top + 4, "VIEW ON THE END PLATE", ha="left", va="bottom", fontsize=7,
                fontweight="bold", family="sans-serif")
        ax.text(xc, y_bot + 8, f"plate {bp:g} x {hp:g} x {tp:g} {pl['grade']}; "
                f"{bo['rows'] * bo['lines']} {bo['size']} {bo['class']} bolts", ha="center", va="bottom", **txt)
        x_end = xc + max(bb, bp) / 2 + 10
    else:
        yc = -h / 2                                                          # plan section, centred
        sup_t = ex["tf_mm"] if face == "column flange" else ex["tw_mm"]
        w = max(bm["b_mm"], 120.0)
        ax.add_patch(Rectangle((X - sup_t, yc - w / 2), sup_t, w, **steel))
        ax.add_patch(Rectangle((X, yc), bp, tp, **plate))
        gap = bo["gap_mm"]
        ax.add_patch(Rectangle((X + gap, yc + tp), L, tw, **new))
        for s in (0, 1):
            yw = yc - leg if s == 0 else yc + tp
            ax.add_patch(Polygon([(X, yw), (X + leg, yw if s else yw + leg), (X, yw + leg)], closed=True, **weld))
        ax.add_patch(Rectangle((X + bo["z_mm"] - bo["d_mm"] / 2, yc - 12), bo["d_mm"], tp + tw + 24,
                               facecolor="0.25", edgecolor="black", linewidth=0.4))
        dim_h(yc - 24, X, X + bo["z_mm"], f"z {bo['z_mm']:g}")
        dim_h(yc + tp + tw + 10, X, X + gap, f"gap {gap:g}", below=False)
        ax.text(X - sup_t, yc + w / 2 + 6, "PLAN SECTION THROUGH THE BOLTS", ha="left", va="bottom", fontsize=7,
                fontweight="bold", family="sans-serif")
        ax.text(X + L / 2, yc - w / 2 - 4, f"fin plate {bp:g} x {hp:g} x {tp:g} {pl['grade']}; "
                f"{bo['rows']} {bo['size']} {bo['class']} bolts", ha="center", va="top", **txt)
        x_end = X + gap + L + 10

    # ------------------------------------------------------------------ scale
    width = x_end - x_left + 20.0
    height = y_top - y_bot
    sc = fit_scale(width, height + 24.0 * 5, room_h=150.0)
    pad = 7.0 * sc                                         # 7 mm of paper above and below
    W = PRINT_WIDTH_MM * sc
    ax.set_xlim(x_left - 10.0, x_left - 10.0 + W)
    ax.set_ylim(y_bot - pad, y_top + pad)
    ax.text(x_left, y_bot - pad + 1.0 * sc, f"Scale 1:{sc:g} when printed {PRINT_WIDTH_MM:g} mm wide (as on the "
            "calc sheet). Dimensions in mm.", ha="left", va="bottom", fontsize=6.5, style="italic",
            family="sans-serif")
    fig.set_size_inches(PRINT_WIDTH_MM / 25.4, (height + 2 * pad) / sc / 25.4)
    fig.splicecalc_tight = False                           # saved uncropped: the scale holds on paper
    return fig


__all__ = ["PRINT_WIDTH_MM", "SCALES", "connection_drawing_data", "draw_connection_data"]
