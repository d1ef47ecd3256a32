"""End connections of the new beam to existing steelwork (partial-depth end plate, fin plate).

Public API: :func:`parse_support` (job-file ``[[support]]`` table -> :class:`SupportSpec`),
:func:`design_end_connection` (-> :class:`ConnectionDesign`), :func:`check_existing_member`,
:func:`check_notch`, and the caution text :data:`EXISTING_STEEL_CAUTION`.
"""

from ...materials.historic import EXISTING_STEEL_CAUTION
from .design import ConnectionDesign, design_end_connection
from .detail import Detail
from .existing import ExistingResult, check_existing_member
from .notch import check_notch
from .spec import SupportSpec, parse_support

__all__ = ["SupportSpec", "parse_support", "ConnectionDesign", "design_end_connection", "Detail",
           "ExistingResult", "check_existing_member", "check_notch", "EXISTING_STEEL_CAUTION"]
