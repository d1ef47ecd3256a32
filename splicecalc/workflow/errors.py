"""The workflow's own error (kept apart from :mod:`.calc` so the CLI can catch it without importing the calc)."""

from __future__ import annotations


class CalcError(RuntimeError):
    """A part of the calculation cannot be carried out (module missing, input unusable)."""


__all__ = ["CalcError"]
