"""Test-wide settings.

Hypothesis: no per-example deadline (the 2-core CI machine is shared and timing is not what these
tests check; speed lives in benchmarks/), and on CI (``CI`` set) a derandomised, repeatable run so
that a landing is never decided by the draw; locally the search stays random.
"""

from __future__ import annotations

import os
import sys
from pathlib import Path

from hypothesis import HealthCheck, settings

settings.register_profile("splicecalc", deadline=None, suppress_health_check=[HealthCheck.too_slow])
settings.register_profile("splicecalc-ci", parent=settings.get_profile("splicecalc"), derandomize=True,
                          database=None)
settings.load_profile("splicecalc-ci" if os.environ.get("CI") else "splicecalc")

# tests import one another's helpers (e.g. the formula list of test_clause_registry)
sys.path.insert(0, str(Path(__file__).parent))
