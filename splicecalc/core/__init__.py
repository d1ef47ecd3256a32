"""Core: units, errors, clause registry, handcalcs rendering, check records."""

from .clause import REGISTRY, ClauseInfo, citation_of, clause
from .errors import (InputError, require_choice, require_finite, require_in_range,
                     require_non_negative, require_positive)
from .record import Calc, CheckRecord, display, records_to_json, utilisation
from .units import convert, parse_quantity, to_float, to_quantity

__all__ = [
    "REGISTRY", "ClauseInfo", "citation_of", "clause", "InputError", "require_choice",
    "require_finite", "require_in_range", "require_non_negative", "require_positive",
    "Calc", "CheckRecord", "display", "records_to_json", "utilisation", "convert",
    "parse_quantity", "to_float", "to_quantity",
]
