"""Drawing scales of the calc sheet, one place for every to-scale drawing (splices, end connections).

A to-scale drawing is made exactly :data:`PRINT_WIDTH_MM` wide (the width the calc package prints a
figure at: 0.85 of the 174 mm text width in the LaTeX template) and saved without cropping
(``fig.splicecalc_tight = False``), so a millimetre of the drawing is 1/scale millimetres on paper.
"""

from __future__ import annotations

#: printed width of a figure in the calc package (latex template: 0.85 of the text width)
PRINT_WIDTH_MM = 147.9
#: tallest printed drawing (mm) that keeps its scale (the template limits figures to 0.68 of the text height)
PRINT_HEIGHT_MM = 165.0
#: standard reductions offered, largest drawing first
SCALES = (2.0, 2.5, 5.0, 10.0, 20.0, 25.0, 50.0)


def fit_scale(width_mm: float, height_mm: float, room_w: float = PRINT_WIDTH_MM,
              room_h: float = PRINT_HEIGHT_MM) -> float:
    """The smallest standard reduction at which ``width_mm`` x ``height_mm`` of drawing fits the room."""
    for s in SCALES:
        if width_mm / s <= room_w and height_mm / s <= room_h:
            return s
    return SCALES[-1]


__all__ = ["PRINT_HEIGHT_MM", "PRINT_WIDTH_MM", "SCALES", "fit_scale"]
