"""Package attributes imported on first use (PEP 562).

A build process only needs a few light modules before it starts the kernel
that runs the calc; packages whose ``__init__`` re-exports heavy modules
(handcalcs, matplotlib, scipy behind them) name their exports here instead.

    __getattr__, __dir__, __all__ = lazy_exports(__name__, {"run_calc": ".calc"})
"""

from __future__ import annotations

import sys
from importlib import import_module
from importlib.util import find_spec
from typing import Any, Callable


def lazy_exports(package: str, homes: dict[str, str]) -> tuple[Callable[[str], Any], Callable[[], list[str]],
                                                                  list[str]]:
    """``(__getattr__, __dir__, __all__)`` for ``package`` whose names live in the modules ``homes`` gives."""

    def __getattr__(name: str) -> Any:
        home = homes.get(name)
        if home is None:
            # a submodule not imported yet (``pkg.submodule`` worked when __init__ imported everything)
            if not name.startswith("_") and find_spec(f"{package}.{name}") is not None:
                return import_module(f"{package}.{name}")
            raise AttributeError(f"module {package!r} has no attribute {name!r}")
        value = getattr(import_module(home, package), name)
        setattr(sys.modules[package], name, value)   # later look-ups skip this function
        return value

    def __dir__() -> list[str]:
        return sorted(set(vars(sys.modules[package])) | set(homes))

    # a name that is also its module's name (``envelope`` in ``.envelope``) is bound at once: importing
    # that submodule later would otherwise set the package attribute to the module
    for name, home in homes.items():
        if home.lstrip(".") == name:
            __getattr__(name)
    return __getattr__, __dir__, sorted(homes)


__all__ = ["lazy_exports"]
