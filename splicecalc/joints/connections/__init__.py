"""End connections of the new beam to existing steelwork (partial-depth end plate, fin plate).

Public API: :func:`parse_support` (job-file ``[[support]]`` table -> :class:`SupportSpec`),
:func:`design_end_connection` (-> :class:`ConnectionDesign`), :func:`check_existing_member`,
:func:`check_notch`, the existing member checked as a member (:func:`parse_existing_loads` for
``[support.existing_loads]``, :func:`existing_member_checks`, :func:`reactions_by_action`), the tie
force from the loads (:func:`tying_force_from_loads`) and the caution text :data:`EXISTING_STEEL_CAUTION`.
"""

from ...core.lazy import lazy_exports

# names imported on first use (splicecalc.core.lazy): reading a [[support]] table needs .spec alone
__getattr__, __dir__, __all__ = lazy_exports(__name__, {
    **{n: "...materials.historic" for n in ("EXISTING_STEEL_CAUTION",)},
    **{n: ".design" for n in ("ConnectionDesign", "design_end_connection")},
    **{n: ".detail" for n in ("Detail",)},
    **{n: ".existing" for n in ("ExistingResult", "check_existing_member")},
    **{n: ".existing_member" for n in ("ExistingMemberResult", "ReactionPart", "existing_member_checks",
                                        "reactions_by_action")},
    **{n: ".existing_spec" for n in ("parse_existing_loads",)},
    **{n: ".tying" for n in ("tying_force_from_loads",)},
    **{n: ".notch" for n in ("check_notch",)},
    **{n: ".spec" for n in ("SupportSpec", "parse_support")},
})
