"""Whether a calc runs headless (a PDF build) or in front of a person (Jupyter).

A build sets :data:`HEADLESS_ENV` for the kernel it starts: the templates then
keep the input form hidden and print figures as data for the build to draw.
Kept in a module of its own so that the build process can name it without
importing the calc library.
"""

from __future__ import annotations

import os

HEADLESS_ENV = "SPLICECALC_HEADLESS"


def is_headless() -> bool:
    """True inside a kernel started by a headless build."""
    return bool(os.environ.get(HEADLESS_ENV))


__all__ = ["HEADLESS_ENV", "is_headless"]
