"""Run a function once after a burst of calls (the form recomputes its summary this way).

The scheduler is injectable: ``schedule(delay_s, callback)`` returns a handle
with ``cancel()``, or None when it ran the callback at once. The default uses
the running asyncio loop (the Jupyter kernel's) and, without one (a plain
script, a test), runs the callback immediately.
"""

from __future__ import annotations

import asyncio
from typing import Any, Callable


def loop_schedule(delay_s: float, callback: Callable[[], None]) -> Any:
    """``call_later`` on the running asyncio loop, else call now and return None."""
    try:
        loop = asyncio.get_running_loop()
    except RuntimeError:
        callback()
        return None
    return loop.call_later(delay_s, callback)


class Debouncer:
    """``d()`` asks for ``fn()``; calls within ``delay_s`` of each other give one run."""

    def __init__(self, fn: Callable[[], None], delay_s: float = 0.3,
                 schedule: Callable[[float, Callable[[], None]], Any] | None = None) -> None:
        self.fn = fn
        self.delay_s = float(delay_s)
        self.schedule = schedule or loop_schedule
        self._handle: Any = None
        self.pending = False

    def __call__(self) -> None:
        if self._handle is not None:
            self._handle.cancel()
            self._handle = None
        self.pending = True
        self._handle = self.schedule(self.delay_s, self._fire)

    def _fire(self) -> None:
        self._handle = None
        if not self.pending:
            return
        self.pending = False
        self.fn()

    def flush(self) -> None:
        """Run now if a call is pending (e.g. before saving)."""
        if self._handle is not None:
            self._handle.cancel()
            self._handle = None
        if self.pending:
            self._fire()


__all__ = ["Debouncer", "loop_schedule"]
