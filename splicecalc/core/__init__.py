"""Core: units, errors, clause registry, handcalcs rendering, check records.

The names are imported on first use (:mod:`.lazy`): ``splicecalc.core.errors``
alone does not load handcalcs.
"""

from .lazy import lazy_exports

__getattr__, __dir__, __all__ = lazy_exports(__name__, {
    **{n: ".clause" for n in ("REGISTRY", "ClauseInfo", "citation_of", "clause")},
    **{n: ".errors" for n in ("InputError", "require_choice", "require_finite", "require_in_range",
                              "require_non_negative", "require_positive")},
    **{n: ".record" for n in ("Calc", "CheckRecord", "display", "records_to_json", "utilisation")},
    **{n: ".units" for n in ("convert", "parse_quantity", "to_float", "to_quantity")},
})
