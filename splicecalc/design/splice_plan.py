"""The one splice-position loop: positions -> splice designs -> positions, until stable.

Splice positions and splice layouts depend on each other: the shortest piece is one
cover-plate length and a splice keeps half its longest plate clear of supports, loads and
restraints. :func:`plan_splices` therefore finds positions with a first guess, designs every
splice there (plain floats), and finds the positions again with the longest cover plate,
until the plate length no longer grows (at most :data:`MAX_ROUNDS` rounds).

Lifting convention (:data:`splicecalc.design.splice_positions.MASS_CONVENTION`, one for the mass
AND the length checks): pieces are carried in and lifted bare; the splice kits (cover plates,
bolt assemblies) and the end connections' bolts are loose items fitted in place. So the piece
mass is the steel plus, on an end piece, what is welded to it (:attr:`EndMass.lifted_kg`: an end
plate; a fin plate belongs to the existing steel), and the piece length is the steel's (no
cover plate projects). The heaviest kit is still found and reported (the loose items to handle).
Every piece mass gets the job's ``mass_margin``. Only then, with ``render=True``, are the final
splices re-run with rendering (same layouts).

This is the only copy of the loop: the calc (:func:`splicecalc.workflow.calc.run_calc`),
the ``run`` CLI (through the calc) and ``benchmarks/bench_splice.py`` call it.
Plain floats: N, mm, N*mm, kg.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Callable, Sequence

from ..core.errors import InputError
from ..materials.partial_factors import UK_NA, NationalAnnex

#: rounds of (positions -> splice design -> positions) before giving up
MAX_ROUNDS = 4
#: shortest piece when no splice has been designed yet (mm): about one cover-plate length
FIRST_SPLICE_ZONE_MM = 600.0


@dataclass(frozen=True)
class EndMass:
    """What an end piece carries of its end connection (kg), for the piece mass."""

    plate_kg: float
    n_bolts: int
    assembly: Any
    what: str

    @property
    def bolts_kg(self) -> float:
        return self.n_bolts * self.assembly.mass_kg if self.assembly is not None else 0.0

    @property
    def mass_kg(self) -> float:
        return self.plate_kg + self.bolts_kg

    @property
    def lifted_kg(self) -> float:
        """What the end piece carries when lifted bare: an end plate welded to the beam; its bolts are loose,
        and a fin plate is fixed to the existing steel, not to the piece."""
        return self.plate_kg if self.what.startswith("end plate") else 0.0


def end_connection_mass(connection_design: Any) -> EndMass:
    """The end plate (welded to the beam) or fin plate with its bolt assemblies, counted with the end
    piece (conservative for a fin plate, which may be fixed to the existing steel first).

    Bolt grips: end plate thickness + the existing flange or web it bolts to; fin plate thickness +
    the beam web."""
    from ..joints.bolts import bolt_assembly
    det = connection_design.detail
    spec = connection_design.spec
    if det.kind == "end plate":
        ex = spec.existing_member
        t2 = ex.tf if spec.existing_face == "column flange" else ex.tw
        grip = det.t_p + t2
    else:
        beam = connection_design.beam
        grip = det.t_p + (beam.tw if beam is not None else det.t_p)
    pre = det.bolt.bolt_class in ("8.8", "10.9") and getattr(spec, "preloaded", False)
    asm = bolt_assembly(det.bolt.size, grip, pre)
    return EndMass(plate_kg=det.mass_kg, n_bolts=det.n_b, assembly=asm,
                   what=f"{det.kind} {det.mass_kg:.1f} kg + {det.n_b} {det.bolt.size} assemblies "
                        f"{asm.mass_kg * det.n_b:.1f} kg")


@dataclass(frozen=True)
class SplicePlan:
    """Positions, the designed splices (same order) and how the loop settled."""

    positions: Any
    designs: tuple
    rounds: int
    kit_plates_kg: float
    kit_bolts_kg: float
    zone_mm: float
    kits: tuple = ()
    serviceability: tuple = ()

    @property
    def kit_mass_kg(self) -> float:
        return self.kit_plates_kg + self.kit_bolts_kg


def plan_splices(section: Any, grade: str, span_mm: float, spec: Any, *, M_abs: Callable, V_abs: Callable,
                 at: Callable | None = None, avoid: Sequence[float] = (), na: NationalAnnex = UK_NA,
                 M_c_Rd: float | None = None, V_c_Rd: float | None = None, mass_per_m: float | None = None,
                 end_mass_kg: tuple[float, float] = (0.0, 0.0),
                 sls_at: Callable[[float], tuple[float, float]] | None = None,
                 render: bool = False) -> SplicePlan:
    """Positions and designs of all splices of a beam (see the module docstring).

    ``M_abs``/``V_abs``/``at``: the ULS envelopes (:func:`splicecalc.design.splice_positions.envelope`
    or :func:`~splicecalc.design.splice_positions.patterned_envelope`); ``M_c_Rd`` (N*mm), ``V_c_Rd``
    (N): the beam's resistances (computed when not given); ``mass_per_m`` (kg/m): the beam
    (default the section's); ``end_mass_kg``: end connections carried by the first and last piece;
    ``sls_at(x) -> (M, V)``: serviceability forces for category B slip.
    """
    from ..joints.splice.design import moment_resistance, splice_kit
    from .splice_layout import design_splice
    from .splice_positions import choose_splice_positions

    if M_c_Rd is None:
        M_c_Rd = moment_resistance(section, grade, na)
    if V_c_Rd is None:
        from ..core.units import convert
        from ..members import check_shear
        V_c_Rd = convert(check_shear(section, grade, 0.0, na).resistance, "kN", "N")
    m = mass_per_m if mass_per_m is not None else getattr(section, "mass_nominal", section.mass)
    kw = dict(M_abs=M_abs, V_abs=V_abs, M_c_Rd=M_c_Rd, V_c_Rd=V_c_Rd, mass_per_m=m, avoid=avoid, at=at,
              end_mass_kg=end_mass_kg, mass_margin=spec.mass_margin)

    def design_all(pos, rend: bool):
        out, ser = [], []
        for s in pos.splices:
            M_ser = V_ser = None
            if spec.category == "B" and sls_at is not None:
                M_ser, V_ser = sls_at(s.x)
            ser.append((M_ser, V_ser))
            out.append(design_splice(section, grade, s.M_Ed, abs(s.V_Ed), s.N_Ed, spec, na, render=rend,
                                     M_Ed_ser=M_ser, V_Ed_ser=V_ser, location_mm=s.x, M_c_Rd=M_c_Rd))
        return tuple(out), tuple(ser)

    used = (0.0, 0.0)                          # kit (plates, bolts) kg used for the positions
    zone = FIRST_SPLICE_ZONE_MM
    pos = designs = ser = kits = None
    for rounds in range(1, MAX_ROUNDS + 1):
        # pieces are lifted bare (MASS_CONVENTION): the kit does not count in a piece's mass
        pos = choose_splice_positions(span_mm, spec, splice_mass_kg=0.0, splice_bolts_kg=0.0,
                                      splice_zone_mm=zone, plate_half_length_mm=0.5 * zone, **kw)
        designs, ser = design_all(pos, False)
        kits = tuple(splice_kit(d, spec) for d in designs)
        need = (max((k.plates_kg for k in kits), default=0.0), max((k.bolts_kg for k in kits), default=0.0))
        need_zone = max([FIRST_SPLICE_ZONE_MM] + [max(d.geometry.L_fp, d.geometry.L_wp) for d in designs])
        if not designs or need_zone <= zone + 1e-9:
            used = need
            break
        used = (max(used[0], need[0]), max(used[1], need[1]))
        zone = max(zone, need_zone)
    else:
        raise InputError("splices", f"max_piece_mass = {spec.max_piece_mass} kg" if spec.max_piece_mass
                         else "piece limits",
                         f"limits the splice kit can meet: positions and splice layouts did not settle in "
                         f"{MAX_ROUNDS} rounds",
                         "Relax the piece limits or give explicit positions.")
    if render and designs:
        designs, ser = design_all(pos, True)
    return SplicePlan(positions=pos, designs=designs, rounds=rounds, kit_plates_kg=used[0], kit_bolts_kg=used[1],
                      zone_mm=zone, kits=kits, serviceability=ser)


@dataclass(frozen=True)
class DeflectionCase:
    """One SLS deflection check to repeat with the splice slip: id, label, limit span/n, and the
    (combination name, SimpleBeam with I) pairs it covers."""

    id: str
    which: str
    n_lim: float
    beams: tuple


def slip_per_splice(designs: Sequence, spec: Any) -> list[float]:
    """Slip s (mm) of each splice's flange joints: the hole clearance d_0 - d, or the job's value."""
    if spec.slip == "given":
        return [float(spec.slip_mm)] * len(designs)
    out = []
    for d in designs:
        from ..joints.splice.design import splice_bolt
        b = splice_bolt(d.layout.bolt_size, d.layout.bolt_class, spec)
        out.append(b.d_0 - b.d)
    return out


def slip_records(plan: SplicePlan, spec: Any, section: Any, span_mm: float, cases: Sequence[DeflectionCase],
                 render: bool = False) -> list:
    """The SLS deflection checks repeated with the kinks of slipping category A splices.

    For category A with ``slip = "computed"`` (hole clearance) or a given slip: one record per
    case, demand = max over x and the case's combinations of (elastic w(x) + slip deflection at x);
    the note says when category B is needed (the check fails with the slip but passes without).
    ``slip = "ignored"``: a NOT CHECKED record. Categories B and C do not slip at SLS: none.
    """
    from ..core.record import Calc, not_checked
    from ..joints.splice.slip import SLIP_GUIDANCE, delta_kink, delta_step, theta_slip
    from ..members.en1993_1_1 import delta_lim
    import numpy as np

    designs = plan.designs
    if not designs or spec.category != "A":
        return []
    if spec.slip == "ignored":
        return [not_checked(id=c.id, title=f"Deflection ({c.which}) with splice slip",
                            clause="EN 1993-1-8:2005, 3.4.1(1)",
                            reason="slip = 'ignored' in [splices]: the deflection added by bolt slip in the "
                                   "category A splices is not computed. Compute it (slip = 'computed') or use "
                                   "category B (preloaded, slip-resistant at SLS).")
                for c in cases]
    L = float(span_mm)
    xs_sp = [d.location_mm for d in designs]
    slips = slip_per_splice(designs, spec)
    z = section.h - section.tf
    thetas = [theta_slip(s=s, z=z) for s in slips]
    grid = sorted(set(np.linspace(0.0, L, 241).tolist()) | set(xs_sp))
    slip_at = {x: sum(delta_kink(theta_s=t, a=a, x=x, L=L) + delta_step(s=s, a=a, x=x, L=L)
                      for t, a, s in zip(thetas, xs_sp, slips)) for x in grid}
    out = []
    for c in cases:
        best = (0.0, L / 2, 0.0, 0.0, "no variable actions")      # (total, x, elastic, slip, combination)
        el_max = 0.0
        for name, beam in c.beams:
            w = np.abs(np.asarray(beam.w(np.array(grid)), dtype=float))
            el_max = max(el_max, float(np.max(w)) if w.size else 0.0)
            for xv, wv in zip(grid, w):
                tot = float(wv) + slip_at[xv]
                if tot > best[0]:
                    best = (tot, xv, float(wv), slip_at[xv], name)
        if not c.beams:
            xg = max(grid, key=lambda x: slip_at[x])
            best = (slip_at[xg], xg, 0.0, slip_at[xg], "no variable actions")
        tot, xg, w_el, w_sl, combo = best
        calc = Calc(render=render)
        for k, (s, a) in enumerate(zip(slips, xs_sp), start=1):
            calc.note(f"Splice S{k} at {a / 1000:.3f} m: slip s = {s:g} mm in each flange joint (a kink over the "
                      f"lever arm z = h - t_f) and in the web joint (a step)")
            th = calc(theta_slip, s=s, z=z)
            calc(delta_kink, theta_s=th, a=a, x=xg, L=L)
            calc(delta_step, s=s, a=a, x=xg, L=L)
        lim = calc(delta_lim, L=L, n_lim=c.n_lim)
        calc.keep("delta_el", w_el, "mm")
        calc.keep("delta_slip", w_sl, "mm")
        calc.keep("delta_lim", lim, "mm")
        note = (f"elastic {w_el:.2f} mm ({combo}) + slip {w_sl:.2f} mm at x = {xg / 1000:.3f} m (the whole slip "
                f"counted in every deflection check: snug-tight bolts may hold by friction under the permanent "
                f"load and slip later; conservative); s = "
                + ", ".join(f"{s:g}" for s in slips) + " mm (" + ("hole clearance d0 - d" if spec.slip == "computed"
                                                                 else "given in the job") + ")")
        if tot > lim * (1 + 1e-9):
            note += ("; FAILS only because of the slip: use category B (preloaded bolts, slip-resistant at SLS, "
                     "EN 1993-1-8 3.4.1) or fitted bolts" if el_max <= lim else
                     "; fails without the slip too (the beam itself is too flexible)")
        else:
            note += "; category A (bearing) acceptable for deflection"
        out.append(calc.record(id=c.id, title=f"Deflection ({c.which}) with splice slip, span/{c.n_lim:g}",
                               clause="UK NA to BS EN 1993-1-1:2005+A1:2014, NA.2.23", demand=tot, resistance=lim, unit="mm",
                               location_mm=xg, note=note, guidance=SLIP_GUIDANCE, tags=("slip", "deflection")))
    return out


def category_b_needed(records: Sequence) -> bool:
    """True when a slip deflection record fails only because of the slip (see :func:`slip_records`)."""
    return any(r.has("slip") and not r.ok and "only because of the slip" in r.note for r in records)


__all__ = ["EndMass", "SplicePlan", "DeflectionCase", "slip_records", "slip_per_splice", "category_b_needed", "end_connection_mass", "plan_splices", "MAX_ROUNDS", "FIRST_SPLICE_ZONE_MM"]
