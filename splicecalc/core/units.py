"""The one place that owns the forallpeople environment and unit conversions.

splicecalc computes internally in plain floats with a fixed unit system:

    force N, length mm, stress MPa (= N/mm2), moment N*mm, mass kg,
    line load N/mm (= kN/m), area mm2, second moment mm4, warping mm6.

Rendering (handcalcs) needs forallpeople quantities instead. ``to_quantity``
and ``to_float`` are the only conversions; nothing else in the package imports
forallpeople or loads an environment.

The forallpeople trap
---------------------
``float(q)`` returns the number *as displayed* (e.g. 94.08 for "94.080 kN"),
while ``q.value`` is the SI base value (94080.0 N). Mixing them silently gives
answers wrong by 10**3 or 10**6. Always convert with ``to_float(q, unit)``,
which divides ``q.value`` by the unit's SI factor.
"""

from __future__ import annotations

import math
from typing import Any

import forallpeople as _si

from .errors import InputError

_si.environment("structural", top_level=False)


#: float unit name -> SI factor (value_SI = value * factor)
SI_FACTOR: dict[str, float] = {
    "": 1.0,
    "N": 1.0,
    "kN": 1e3,
    "mm": 1e-3,
    "m": 1.0,
    "mm2": 1e-6,
    "mm3": 1e-9,
    "mm4": 1e-12,
    "mm6": 1e-18,
    "MPa": 1e6,
    "N/mm": 1e3,
    "kN/m": 1e3,
    "Nmm": 1e-3,
    "kNm": 1e3,
    "kg": 1.0,
    "kg/m": 1.0,
    "1/mm": 1e3,
    "m/s2": 1.0,
    "Hz": 1.0,
}

#: SI base dimensions of each float unit (kg, m, s exponents)
_BASE = {
    "": None,
    "N": lambda: _si.N,
    "kN": lambda: _si.N,
    "mm": lambda: _si.m,
    "m": lambda: _si.m,
    "mm2": lambda: _si.m ** 2,
    "mm3": lambda: _si.m ** 3,
    "mm4": lambda: _si.m ** 4,
    "mm6": lambda: _si.m ** 6,
    "MPa": lambda: _si.Pa,
    "N/mm": lambda: _si.N / _si.m,
    "kN/m": lambda: _si.N / _si.m,
    "Nmm": lambda: _si.N * _si.m,
    "kNm": lambda: _si.N * _si.m,
    "kg": lambda: _si.kg,
    "kg/m": lambda: _si.kg / _si.m,
    "1/mm": lambda: 1 / _si.m,
    "m/s2": lambda: _si.m / _si.s ** 2,
    "Hz": lambda: 1 / _si.s,
}


def _check_unit(unit: str) -> None:
    if unit not in SI_FACTOR:
        raise InputError("unit", unit, f"one of {sorted(SI_FACTOR)}")


def to_quantity(value: float, unit: str) -> Any:
    """Return a forallpeople quantity for ``value`` expressed in ``unit``.

    ``unit`` is one of :data:`SI_FACTOR`; dimensionless (``""``) returns the
    float unchanged.
    """
    _check_unit(unit)
    if unit == "":
        return float(value)
    return float(value) * SI_FACTOR[unit] * _BASE[unit]()


#: The one display-unit table of the calc sheets: the unit forallpeople writes (as LaTeX) ->
#: (the unit engineers use for that quantity, power of ten it scales the number by). Section moduli
#: in cm3, second moments in cm4, warping constants in dm6 (as UK section tables), forces in kN, line
#: loads and resistances per length in kN/m, moments in kN m, moduli
#: in MPa (N/mm2). Applied to the rendered text only (:func:`splicecalc.core.render.tex_clean`):
#: forallpeople's own prefixes are left alone, since a prefixed quantity loses its units in powers.
TEX_DISPLAY_UNITS: dict[str, tuple[str, int]] = {
    r"\mathrm{mm}^{3}": (r"\mathrm{cm}^{3}", -3),
    r"\mathrm{mm}^{4}": (r"\mathrm{cm}^{4}", -4),
    r"\mathrm{mm}^{6}": (r"\mathrm{dm}^{6}", -12),
    r"\mathrm{MN/m}": (r"\mathrm{kN/m}", 3),
    r"\mathrm{MN} \cdot \mathrm{m}": (r"\mathrm{kN} \cdot \mathrm{m}", 3),
    r"\mathrm{N} \cdot \mathrm{m}": (r"\mathrm{kN} \cdot \mathrm{m}", -3),
    r"\mathrm{MN}": (r"\mathrm{kN}", 3),
    r"\mathrm{N}": (r"\mathrm{kN}", -3),
    r"\mathrm{GPa}": (r"\mathrm{MPa}", 3),
}
#: float unit -> (unit shown in tables, factor to it) for numbers a sheet prints itself
DISPLAY_UNITS: dict[str, tuple[str, float]] = {
    "mm3": ("cm3", 1e-3), "mm4": ("cm4", 1e-4), "mm6": ("dm6", 1e-12), "N": ("kN", 1e-3),
    "Nmm": ("kNm", 1e-6), "kN": ("kN", 1.0), "kNm": ("kNm", 1.0), "MPa": ("MPa", 1.0),
}


def displayed(value: float, unit: str) -> tuple[float, str]:
    """(number, unit) a calc sheet shows for ``value`` in float ``unit`` (:data:`DISPLAY_UNITS`)."""
    _check_unit(unit)
    shown = DISPLAY_UNITS.get(unit)
    return (float(value) * shown[1], shown[0]) if shown else (float(value), unit)


def is_quantity(x: Any) -> bool:
    """True for a forallpeople quantity."""
    return isinstance(x, _si.Physical)


def to_float(x: Any, unit: str) -> float:
    """Return the plain float of ``x`` in ``unit``.

    Accepts a float (returned unchanged, assumed already in ``unit``) or a
    forallpeople quantity. For quantities this uses ``x.value`` (SI base),
    never ``float(x)`` (the displayed number; see module docstring).
    """
    _check_unit(unit)
    if is_quantity(x):
        return float(x.value) / SI_FACTOR[unit]
    return float(x)


def convert(value: float, from_unit: str, to_unit: str) -> float:
    """Convert a plain float between two float units of the same dimension."""
    _check_unit(from_unit)
    _check_unit(to_unit)
    return value * SI_FACTOR[from_unit] / SI_FACTOR[to_unit]


# ---------------------------------------------------------------- parsing text
#: unit spelling in job files -> (float unit used internally, multiplier)
_TEXT_UNITS: dict[str, tuple[str, float]] = {
    "mm": ("mm", 1.0),
    "cm": ("mm", 10.0),
    "m": ("mm", 1000.0),
    "N": ("N", 1.0),
    "kN": ("N", 1e3),
    "MN": ("N", 1e6),
    "kN/m": ("N/mm", 1.0),
    "N/mm": ("N/mm", 1.0),
    "kN/m2": ("MPa", 1e-3),
    "kPa": ("MPa", 1e-3),
    "MPa": ("MPa", 1.0),
    "N/mm2": ("MPa", 1.0),
    "kNm": ("Nmm", 1e6),
    "kN m": ("Nmm", 1e6),
    "kN*m": ("Nmm", 1e6),
    "Nmm": ("Nmm", 1.0),
    "kg": ("kg", 1.0),
    "t": ("kg", 1000.0),
    "kg/m": ("kg/m", 1.0),
}

#: what each internal unit is called in error messages
DIMENSION_NAME = {
    "mm": "length",
    "N": "force",
    "N/mm": "force per length",
    "MPa": "stress or pressure",
    "Nmm": "moment",
    "kg": "mass",
    "kg/m": "mass per length",
}


_ASCII_DIGITS = "0123456789"


def parse_quantity(text: Any, dimension_unit: str, field: str) -> float:
    """Parse a job-file quantity such as ``"7.2 m"`` or ``"12.5 kN/m"``.

    Returns a float in ``dimension_unit`` (one of the internal units: ``mm``,
    ``N``, ``N/mm``, ``MPa``, ``Nmm``, ``kg``, ``kg/m``). A bare number, a
    missing unit or a unit of the wrong dimension raises :class:`InputError`
    naming ``field``.
    """
    allowed = sorted(k for k, (u, _) in _TEXT_UNITS.items() if u == dimension_unit)
    what = DIMENSION_NAME.get(dimension_unit, dimension_unit)
    if not isinstance(text, str):
        raise InputError(field, text, f"a {what} written with its unit, e.g. '12 {allowed[0]}' (units: {', '.join(allowed)})")
    s = text.strip()
    if any(ch.isdigit() and ch not in _ASCII_DIGITS for ch in s):
        raise InputError(field, text, f"a number written with the digits 0-9, e.g. '12 {allowed[0]}'")
    # split number from unit
    i = 0
    while i < len(s) and (s[i] in _ASCII_DIGITS or s[i] in "+-.eE"):
        # stop at 'e' that is not followed by a digit or sign (unit could start with e)
        if s[i] in "eE" and not (i + 1 < len(s) and (s[i + 1] in _ASCII_DIGITS or s[i + 1] in "+-")):
            break
        i += 1
    num, unit = s[:i].strip(), s[i:].strip().replace("²", "2").replace("·", "*")
    try:
        value = float(num)
    except ValueError:
        raise InputError(field, text, f"a number followed by a unit, e.g. '12 {allowed[0]}'") from None
    if unit not in _TEXT_UNITS:
        raise InputError(field, text, f"a {what} with one of the units {', '.join(allowed)}")
    internal, mult = _TEXT_UNITS[unit]
    if internal != dimension_unit:
        raise InputError(field, text, f"a {what} (units {', '.join(allowed)}), not a {DIMENSION_NAME.get(internal, internal)}")
    value *= mult
    if not math.isfinite(value):
        raise InputError(field, text, "a finite number")
    return value


def format_quantity(value: float, dimension_unit: str) -> str:
    """Inverse of :func:`parse_quantity` for writing job files (engineering units)."""
    out = {"mm": ("mm", 1.0), "N": ("kN", 1e-3), "N/mm": ("kN/m", 1.0), "MPa": ("MPa", 1.0),
           "Nmm": ("kNm", 1e-6), "kg": ("kg", 1.0), "kg/m": ("kg/m", 1.0)}[dimension_unit]
    return f"{value * out[1]:.6g} {out[0]}"
