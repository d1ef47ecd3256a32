"""Derived dimensions of a cover-plate splice layout (mm) and the detailing defaults.

Conventions (plan of one flange, elevation of the web):

* The joint line is the centre of the gap ``g_a`` between the beam ends.
* Flange: ``e1`` is both the beam-end distance to the first bolt row and the
  cover-plate end distance to the last row, so the plate length is
  ``L_fp = g_a + 2 (2 e1 + (rows - 1) p1)``. The outer plate is centred on the
  web, as wide as the flange rounded down to 5 mm unless given; its edge distance is ``e2 = (b_p - gauge)/2 - gauge_outer`` (4 columns).
  Inner plates (outer+inner) sit beside the web, ``5 mm`` clear of the root
  radius, and reach to the flange tip (width rounded down to 5 mm).
* Web: plates centred on the beam depth; ``e1`` horizontal (beam end to the
  first column and last column to the plate end), ``e_v`` vertical edge
  distance; plate depth ``h_wp = (rows - 1) p + 2 e_v``, plate length
  ``L_wp = g_a + 2 (2 e1 + (columns - 1) gauge)``.

Default distances (when the layout does not give them): ``e1 = e_v =
max(1.5 d0, 1.2 d0 rounded up to 5 mm)`` - a detailing preference above the
Table 3.3 minimum of 1.2 d0, rounded up to 5 mm.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from .spec import FlangeLayout, SpliceLayout, WebLayout

#: clearance kept between an inner flange plate and the root radius, mm (detailing choice)
INNER_PLATE_CLEAR = 5.0


def round_up(x: float, step: float = 5.0) -> float:
    return math.ceil(x / step - 1e-9) * step


def round_down(x: float, step: float = 5.0) -> float:
    return math.floor(x / step + 1e-9) * step


def default_edge(d_0: float) -> float:
    """Default end/edge distance (mm): 1.5 d0 rounded up to 5 mm (>= 1.2 d0 of Table 3.3)."""
    return round_up(1.5 * d_0)


@dataclass(frozen=True)
class Geometry:
    """All derived splice dimensions (mm, mm2) for one section + bolt + layout."""

    # flange
    n_f: int            # bolts per flange on one side of the joint
    e1_f: float
    p1_f: float
    g_f: float          # gauge across the web
    p2o_f: float        # gauge_outer (0 for 2 columns)
    b_po: float         # outer plate width
    t_po: float
    e2_po: float        # outer plate edge distance
    e2_bf: float        # beam flange edge distance
    b_pi: float         # each inner plate width (0 when none)
    t_pi: float
    x_pi: float         # inner plate inner edge from web centre
    e2_pi_in: float     # inner plate edge distance towards the web
    e2_pi_out: float    # inner plate edge distance towards the flange tip
    L_fp: float         # flange plate length
    A_po: float         # outer plate gross area
    A_pi: float         # two inner plates gross area
    share_o: float      # share of the flange force in the outer plate
    washer_clear_gauge: float  # minimum gauge clear of the root radius
    # web
    n_w: int
    n_r: int
    n_c: int
    p_w: float
    g_w: float
    e1_w: float
    e_v: float
    h_wp: float
    t_wp: float
    L_wp: float
    d_web: float        # depth between fillets
    # mass
    plate_mass: float   # kg, all plates of one splice (2 flanges x (outer + inner), 2 web plates)
    n_bolts: int        # all bolts of one splice
    g_a: float = 0.0    # gap between the beam ends (mm)


def geometry(section, bolt, layout: SpliceLayout, gap: float, density: float = 7850.0) -> Geometry:
    """Derived dimensions; no validation of fit (see checks.detailing_records)."""
    f: FlangeLayout = layout.flange
    w: WebLayout = layout.web
    d0 = bolt.d_0
    e1f = f.e1 if f.e1 is not None else default_edge(d0)
    p2o = f.gauge_outer if f.columns == 4 else 0.0
    b_po = f.plate_width if f.plate_width is not None else round_down(section.b)
    e2_po = (b_po - f.gauge) / 2 - p2o
    e2_bf = (section.b - f.gauge) / 2 - p2o
    if f.inner_plate > 0.0:
        x_pi = section.tw / 2 + section.r + INNER_PLATE_CLEAR
        b_pi = round_down(section.b / 2 - x_pi)
        t_pi = f.inner_plate
    else:
        x_pi = b_pi = t_pi = 0.0
    e2_in = f.gauge / 2 - x_pi if b_pi > 0 else 0.0
    e2_out = x_pi + b_pi - (f.gauge / 2 + p2o) if b_pi > 0 else 0.0
    L_fp = gap + 2 * (2 * e1f + (f.rows - 1) * f.pitch)
    A_po = b_po * f.plate
    A_pi = 2 * b_pi * t_pi
    share_o = A_po / (A_po + A_pi)
    e1w = w.e1 if w.e1 is not None else default_edge(d0)
    e_v = w.e_v if w.e_v is not None else default_edge(d0)
    h_wp = (w.rows - 1) * w.pitch + 2 * e_v
    L_wp = gap + 2 * (2 * e1w + (w.columns - 1) * w.gauge)
    vol = 2 * (A_po + A_pi) * L_fp + 2 * h_wp * w.plate * L_wp
    n_f = f.rows * f.columns
    n_w = w.rows * w.columns
    return Geometry(
        n_f=n_f, e1_f=e1f, p1_f=f.pitch, g_f=f.gauge, p2o_f=p2o, b_po=b_po, t_po=f.plate, e2_po=e2_po,
        e2_bf=e2_bf, b_pi=b_pi, t_pi=t_pi, x_pi=x_pi, e2_pi_in=e2_in, e2_pi_out=e2_out, L_fp=L_fp, A_po=A_po,
        A_pi=A_pi, share_o=share_o, washer_clear_gauge=section.tw + 2 * section.r + bolt.washer_od,
        n_w=n_w, n_r=w.rows, n_c=w.columns, p_w=w.pitch, g_w=w.gauge, e1_w=e1w, e_v=e_v, h_wp=h_wp,
        t_wp=w.plate, L_wp=L_wp, d_web=section.h - 2 * section.tf - 2 * section.r,
        plate_mass=vol * 1e-9 * density, n_bolts=2 * 2 * n_f + 2 * n_w, g_a=gap)


__all__ = ["Geometry", "geometry", "default_edge", "round_up", "round_down", "INNER_PLATE_CLEAR"]
