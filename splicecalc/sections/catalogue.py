"""The section catalogue: UKB and UKC (BS 4-1), IPE, HEA and HEB (EN 10365).

The CSV files in ``data/`` hold only the defining dimensions and the nominal
mass; the first line of each file names its source. The catalogue is read and
all properties computed once, on first use, then cached.

Look-up is tolerant of case and spacing: ``"533x210x92 UKB"``,
``"533 x 210 x 92 ukb"``, ``"533x210x92UB"``, ``"533x210x92"``, ``"IPE 300"``,
``"ipe300"``, ``"HEA 300"``, ``"HE 300 A"``, ``"HE300B"`` all work.
"""

from __future__ import annotations

import csv
import difflib
import re
from functools import lru_cache
from pathlib import Path

from ..core.errors import InputError
from .section import FAMILIES, Section

_DATA = Path(__file__).with_name("data")
_FILES = {"UKB": "ukb.csv", "UKC": "ukc.csv", "IPE": "ipe.csv", "HEA": "hea.csv", "HEB": "heb.csv"}
_ALIASES = {"UB": "UKB", "UC": "UKC", "UKB": "UKB", "UKC": "UKC", "IPE": "IPE", "HEA": "HEA",
            "HEB": "HEB", "HE A": "HEA", "HE B": "HEB", "HE-A": "HEA", "HE-B": "HEB"}


def _read_family(family: str) -> tuple[Section, ...]:
    path = _DATA / _FILES[family]
    with path.open(encoding="utf-8", newline="") as fh:
        first = fh.readline()
        if not first.startswith("#"):
            raise RuntimeError(f"{path.name}: first line must be a '# source' comment")
        m = re.match(r"#\s*((?:BS|EN) [0-9-]+:[0-9]{4})", first)
        standard = m.group(1) if m else first[1:].strip()
        rows = list(csv.DictReader(fh))
    out = []
    for i, row in enumerate(rows, start=3):
        name = row["designation"].strip()
        designation = f"{name} {family}" if family in ("UKB", "UKC") else name
        try:
            out.append(Section(designation, family, float(row["h_mm"]), float(row["b_mm"]),
                               float(row["tw_mm"]), float(row["tf_mm"]), float(row["r_mm"]),
                               float(row["mass_kg_per_m"]), standard))
        except ValueError as err:     # InputError is a ValueError
            raise RuntimeError(f"{path.name} line {i}: {err}") from err
    return tuple(out)


@lru_cache(maxsize=1)
def _catalogue() -> tuple[tuple[Section, ...], dict[str, Section]]:
    """All sections in catalogue order and the look-up index (built once)."""
    sections: list[Section] = []
    for fam in FAMILIES:
        sections.extend(_read_family(fam))
    index: dict[str, Section] = {}
    for s in sections:
        index[_key(s.designation)] = s
    return tuple(sections), index


def _key(text: str) -> str:
    """Normal form of a designation: lower case, no spaces, 'x' as the only separator.

    '533 x 210 x 92 UB' -> '533x210x92ukb'; 'HE 300 A' -> 'hea300'; 'IPE300' -> 'ipe300'.
    """
    s = text.strip().lower().replace("×", "x").replace("*", "x")
    s = re.sub(r"[\s_\-]+", "", s)
    m = re.fullmatch(r"(\d+)x(\d+)x(\d+(?:\.\d+)?)(ukb|ukc|ub|uc)?", s)
    if m:
        serial = f"{m.group(1)}x{m.group(2)}"
        fam = {"ub": "ukb", "uc": "ukc"}.get(m.group(4) or "", m.group(4) or "")
        mass = m.group(3)
        if "." in mass:
            mass = mass.rstrip("0").rstrip(".")
        return f"{serial}x{mass}{fam}"
    m = re.fullmatch(r"he(\d+)([abm])", s)
    if m:
        return f"he{m.group(2)}{m.group(1)}"
    return s


def get_section(designation: str) -> Section:
    """The catalogue section with this designation (case and spacing do not matter).

    Unknown designations raise :class:`~splicecalc.core.errors.InputError`
    listing the nearest catalogue designations.
    """
    if not isinstance(designation, str) or not designation.strip():
        raise InputError("section", designation, "a section designation such as '533x210x92 UKB' or 'IPE 300'")
    sections, index = _catalogue()
    key = _key(designation)
    for k in (key, key + "ukb", key + "ukc"):   # UK serial sizes do not clash between UKB and UKC
        found = index.get(k)
        if found is not None:
            return found
    near = difflib.get_close_matches(key, list(index), n=5, cutoff=0.6)
    hint = ("Nearest matches: " + ", ".join(index[k].designation for k in near)) if near else \
        "List the catalogue with `splicecalc sections UKB` (or UKC, IPE, HEA, HEB)"
    raise InputError("section", designation, "a designation in the catalogue (UKB, UKC, IPE, HEA, HEB)", hint)


def list_sections(family: str | None = None) -> list[Section]:
    """Catalogue sections, in catalogue order (serial size ascending, light to heavy).

    ``family`` is one of ``UKB``, ``UKC``, ``IPE``, ``HEA``, ``HEB`` (``UB``/``UC``
    accepted), or ``None`` for all.
    """
    sections, _ = _catalogue()
    if family is None:
        return list(sections)
    fam = _ALIASES.get(str(family).strip().upper()) if isinstance(family, str) else None
    if fam is None:
        raise InputError("family", family, "one of " + ", ".join(FAMILIES) + " (or None for all)")
    return [s for s in sections if s.family == fam]


def clear_cache() -> None:
    """Forget the computed catalogue (used by the benchmark to time a cold build)."""
    _catalogue.cache_clear()


__all__ = ["clear_cache", "get_section", "list_sections"]
