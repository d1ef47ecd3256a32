"""End connections of the new beam to existing steelwork (partial-depth end plate, fin plate).

Public API: :func:`parse_support` (job-file ``[[support]]`` table -> :class:`SupportSpec`),
:func:`design_end_connection` (-> :class:`ConnectionDesign`), :func:`check_existing_member`,
:func:`check_notch`, and the caution text :data:`EXISTING_STEEL_CAUTION`.
"""

from ...core.lazy import lazy_exports

# names imported on first use (splicecalc.core.lazy): reading a [[support]] table needs .spec alone
__getattr__, __dir__, __all__ = lazy_exports(__name__, {
    **{n: "...materials.historic" for n in ("EXISTING_STEEL_CAUTION",)},
    **{n: ".design" for n in ("ConnectionDesign", "design_end_connection")},
    **{n: ".detail" for n in ("Detail",)},
    **{n: ".existing" for n in ("ExistingResult", "check_existing_member")},
    **{n: ".notch" for n in ("check_notch",)},
    **{n: ".spec" for n in ("SupportSpec", "parse_support")},
})
