"""Analysis of a simply supported span (exact, closed form), envelopes and diagrams.

Sign convention: x from support A (mm); loads downward positive; V = R_A minus the
load left of the section (N); M sagging positive (N*mm); w downward positive (mm).

Public API
----------
SimpleBeam(span_mm, loads, E=210000, I=None)
    .R_A, .R_B, .total_load (N); .V(x, side="right"|"left"), .M(x), .theta(x) / .slope(x),
    .w(x) / .deflection(x); .M_max(), .V_max(), .w_max() -> Extreme(value, x_mm); .breakpoints()
Extreme(value, x_mm)
governing_M(combos, span_mm), governing_V(combos, span_mm), governing_w(combos, span_mm, I, E)
    -> Governing(combination, extreme, beam)
envelope(combos, span_mm, n=201), envelope_at(combos, span_mm, x_mm) -> Envelope(x_mm, M_Ed, V_Ed, ...)
beam_diagrams(beam, splices_mm=, restraints_mm=, title=, show_loads=True) -> matplotlib Figure (loads, V, M, w)
    = draw_beam_diagrams(beam_diagram_data(beam, ...)): JSON data, then the drawing
envelope_diagram(env, splices_mm=, title=) -> matplotlib Figure
"""

from ..core.lazy import lazy_exports

# names imported on first use (splicecalc.core.lazy): matplotlib loads only when a diagram is drawn
__getattr__, __dir__, __all__ = lazy_exports(__name__, {
    **{n: ".beam" for n in ("Extreme", "SimpleBeam")},
    **{n: ".diagrams" for n in ("A4_TEXT_WIDTH_IN", "DIAGRAM_KIND", "beam_diagram_data", "beam_diagrams",
                                "draw_beam_diagrams", "envelope_diagram")},
    **{n: ".envelope" for n in ("Envelope", "Governing", "envelope", "envelope_at", "governing_M", "governing_V",
                                "governing_w")},
})
