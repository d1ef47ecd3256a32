"""The form's values, independent of any widget: field values -> job dict -> TOML text.

:class:`FormState` holds what the engineer typed, as text, in job-file terms:

* ``fields``: flat values named like the job-file keys they become
  (``"beam.span"``, ``"splices.bolts"``, ``"project.title"``), so an
  :class:`~splicecalc.core.errors.InputError` from the job loader names the
  form field that caused it;
* ``loads``: one dict per ``[[load]]`` row (``name``, ``action``, ``category``,
  ``kind`` = ``"udl"`` or ``"point"``, ``value`` with its unit, ``from`` / ``to``
  or ``at``, ``group``);
* ``supports``: one dict per ``[[support]]`` table, in file order;
* ``extras``: every key of the job file the form has no control for (national
  annex overrides, an explicit splice layout, tie forces, measured existing
  members...). They are written back unchanged, so opening and saving a job
  file never drops a value silently.

:meth:`FormState.to_job_dict` builds the TOML dict that
:func:`splicecalc.job.loader.job_from_dict` reads, :meth:`FormState.to_job`
validates it with that loader (every bad value raises ``InputError`` naming
the key), :meth:`FormState.from_job_dict` is the inverse. Quantities stay the
strings the engineer typed (``"7.2 m"``, ``"12.5 kN/m"``): the loader parses
them, so what was typed is what the calc reads and prints.
"""

from __future__ import annotations

import copy
import math
import re
import tomllib
from typing import Any

from ..actions.loads import ACTIONS, CATEGORIES
from ..core.errors import InputError, require_choice
from ..job.loader import dumps_toml, job_from_dict
from ..job.model import COMBINATIONS, FAMILIES, LOAD_LEVELS, PROJECT_KEYS, Job

# ---------------------------------------------------------------- choices shown by the form
#: splice modes: how the pieces of the beam are defined
SPLICE_MODES: tuple[str, ...] = ("none", "pieces", "positions", "access")
#: the [splices] keys each mode writes
SPLICE_MODE_KEYS: dict[str, tuple[str, ...]] = {
    "none": (),
    "pieces": ("pieces",),
    "positions": ("positions",),
    "access": ("max_piece_length", "max_piece_mass"),
}
#: [splices] options the form shows, with the default the splice parser assumes when absent
SPLICE_OPTIONS: dict[str, str] = {
    "bolts": "auto",
    "category": "A",
    "friction_class": "A",
    "flange_plates": "outer",
    "plate_grade": "S355",
    "mass_margin": "",
    "slip": "computed",
}
SUPPORT_ENDS: tuple[str, ...] = ("start", "end")
CONNECTION_TYPES: tuple[str, ...] = ("fin plate", "end plate")
EXISTING_FACES: tuple[str, ...] = ("column flange", "column web", "beam web")
#: [[support]] keys the form shows (all optional text except at / connection)
SUPPORT_FIELDS: tuple[str, ...] = ("connection", "bolts", "plate", "existing_member", "existing_face",
                                   "existing_steel", "notch_top")
#: starting values of a new support row (all are written, as shown)
SUPPORT_DEFAULTS: dict[str, str] = {
    "connection": "fin plate",
    "bolts": "M20 8.8",
    "plate": "10 mm S275",
    "existing_member": "",
    "existing_face": "column flange",
    "existing_steel": "S275",
    "notch_top": "",
}
LOAD_KINDS: tuple[str, ...] = ("udl", "point")
LOAD_FIELDS: tuple[str, ...] = ("name", "action", "category", "kind", "value", "from", "to", "at", "group")

#: beam fields of the form, with the value of a new form
BEAM_DEFAULTS: dict[str, Any] = {
    "span": "",
    "grade": "S355",
    "section": "auto",
    "families": ["UKB"],
    "max_depth": "",
    "bearing_length": "",          # blank: the beam hangs on end connections (no web bearing check)
    "end_distance": "",
    "restraints": "",
    "load_level": "top flange",
    "deflection_limit": "360",
    "total_deflection_limit": "",
    "combination": "6.10ab",
}
_SPLICE_FIELDS: tuple[str, ...] = ("mode", "pieces", "positions", "max_piece_length", "max_piece_mass",
                                   *SPLICE_OPTIONS)
_LIST_SPLIT = re.compile(r"[,;]")


def _default_fields() -> dict[str, Any]:
    f: dict[str, Any] = {f"project.{k}": "" for k in PROJECT_KEYS}
    f.update({f"beam.{k}": copy.deepcopy(v) for k, v in BEAM_DEFAULTS.items()})
    f.update({"splices.mode": "none", "splices.pieces": "", "splices.positions": "",
              "splices.max_piece_length": "", "splices.max_piece_mass": ""})
    f.update({f"splices.{k}": v for k, v in SPLICE_OPTIONS.items()})
    return f


def _text(v: Any) -> str:
    """A job-file value as the text a form field shows."""
    if v is None:
        return ""
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, float) and v.is_integer() and abs(v) < 1e15:
        return repr(v)
    return str(v)


def _join(v: Any) -> str:
    if isinstance(v, (list, tuple)):
        return ", ".join(_text(x) for x in v)
    return _text(v)


def split_list(text: str) -> list[str]:
    """``"2.4 m, 4.8 m"`` -> ``["2.4 m", "4.8 m"]`` (commas or semicolons; blanks dropped)."""
    return [p.strip() for p in _LIST_SPLIT.split(text or "") if p.strip()]


def parse_number(field: str, text: Any, strict: bool = True) -> Any:
    """A plain number typed in a text field (``"360"`` -> 360); InputError naming ``field`` if not."""
    if isinstance(text, (int, float)) and not isinstance(text, bool):
        return text
    s = str(text).strip()
    try:
        return int(s)
    except ValueError:
        pass
    try:
        x = float(s)
    except ValueError:
        x = math.nan
    if math.isfinite(x):
        return x
    if strict:
        raise InputError(field, text, "a plain number without a unit, e.g. 360 for span/360")
    return s


def parse_whole(field: str, text: Any, strict: bool = True) -> Any:
    """A whole number typed in a text field (``"3"`` -> 3)."""
    if isinstance(text, int) and not isinstance(text, bool):
        return text
    s = str(text).strip()
    try:
        return int(s)
    except ValueError:
        if strict:
            raise InputError(field, text, "a whole number, e.g. 3") from None
        return s


class FormState:
    """Everything the form holds, as plain Python values (see the module docstring)."""

    def __init__(self) -> None:
        self.fields: dict[str, Any] = _default_fields()
        self.loads: list[dict[str, Any]] = []
        self.supports: list[dict[str, Any]] = []
        #: keys the form does not show, written back unchanged: "top" (top-level tables),
        #: "project", "beam", "splices"; each load / support row keeps its own under "_extra"
        self.extras: dict[str, dict[str, Any]] = {"top": {}, "project": {}, "beam": {}, "splices": {}}
        #: splice option keys present in the loaded file (written even when equal to the default)
        self.present: set[str] = set()
        #: [beam] keys of the loaded file (None: a new form, which writes every choice it shows);
        #: a choice the file left out is written only when the engineer changes it from the default
        self.beam_present: set[str] | None = None

    # ------------------------------------------------------------ fields
    def get(self, name: str) -> Any:
        if name not in self.fields:
            raise InputError("form field", name, "one of " + ", ".join(sorted(self.fields)))
        return self.fields[name]

    def set(self, name: str, value: Any) -> None:
        """Set one flat field (``"beam.span"``...). Unknown names raise InputError."""
        if name not in self.fields:
            raise InputError("form field", name, "one of " + ", ".join(sorted(self.fields)))
        if name == "splices.mode":
            require_choice("splices.mode", value, SPLICE_MODES)
        if name == "beam.families":
            value = [value] if isinstance(value, str) else list(value)
        self.fields[name] = value

    def set_splice_mode(self, mode: str) -> None:
        """Choose how the pieces are defined; the fields of the other modes are cleared
        (an explicit choice of the engineer, so nothing is dropped silently)."""
        require_choice("splices.mode", mode, SPLICE_MODES)
        for m, keys in SPLICE_MODE_KEYS.items():
            if m != mode:
                for k in keys:
                    self.fields[f"splices.{k}"] = ""
        self.fields["splices.mode"] = mode

    # ------------------------------------------------------------ loads
    def add_load(self, kind: str = "udl", **values: Any) -> int:
        """Append a load row; returns its index (from 0)."""
        require_choice("load kind", kind, LOAD_KINDS)
        row: dict[str, Any] = {"name": f"load {len(self.loads) + 1}", "action": "permanent", "category": "",
                               "kind": kind, "value": "", "from": "", "to": "", "at": "", "group": "",
                               "_extra": {}}
        for k, v in values.items():
            require_choice("load field", k, LOAD_FIELDS)
            row[k] = v
        self.loads.append(row)
        return len(self.loads) - 1

    def remove_load(self, index: int) -> None:
        if not 0 <= index < len(self.loads):
            raise InputError("load row", index, f"a row from 0 to {len(self.loads) - 1}")
        del self.loads[index]

    def set_load(self, index: int, key: str, value: Any) -> None:
        if not 0 <= index < len(self.loads):
            raise InputError("load row", index, f"a row from 0 to {len(self.loads) - 1}")
        require_choice("load field", key, LOAD_FIELDS)
        if key == "kind":
            require_choice(f"load[{index + 1}].kind", value, LOAD_KINDS)
        self.loads[index][key] = value

    # ------------------------------------------------------------ supports
    def support(self, at: str) -> dict[str, Any] | None:
        """The first support row at ``"start"`` or ``"end"``, or None."""
        require_choice("support end", at, SUPPORT_ENDS)
        for row in self.supports:
            if str(row.get("at", "")).strip().lower() == at:
                return row
        return None

    def set_connection(self, at: str, connection: str | None) -> None:
        """Add (with :data:`SUPPORT_DEFAULTS`), change or remove (None) the connection at one end."""
        require_choice("support end", at, SUPPORT_ENDS)
        row = self.support(at)
        if connection is None:
            if row is not None:
                self.supports.remove(row)
            return
        require_choice(f"support {at} connection", connection, CONNECTION_TYPES)
        if row is None:
            row = {"at": at, **SUPPORT_DEFAULTS, "_extra": {}}
            # keep start before end
            self.supports.insert(0 if at == "start" else len(self.supports), row)
        row["connection"] = connection

    def set_support(self, at: str, key: str, value: Any) -> None:
        require_choice("support field", key, SUPPORT_FIELDS)
        row = self.support(at)
        if row is None:
            raise InputError(f"support {at}", None, "a connection first (choose fin plate or end plate)")
        if key == "connection":
            self.set_connection(at, value)
            return
        row[key] = value
        if key == "existing_member" and str(value).strip():
            row["_extra"].pop("existing_member", None)   # typed designation replaces measured dims

    # ------------------------------------------------------------ to the job dict
    def to_job_dict(self, strict: bool = True) -> dict[str, Any]:
        """The TOML dict the job loader reads. ``strict=False`` keeps unparsable numbers as text
        (for comparing forms) instead of raising InputError."""
        f = self.fields
        out: dict[str, Any] = {}
        proj = {k: f[f"project.{k}"].strip() for k in PROJECT_KEYS if str(f[f"project.{k}"]).strip()}
        proj.update(copy.deepcopy(self.extras["project"]))
        if proj:
            out["project"] = proj
        out["beam"] = self._beam_dict(strict)
        loads = [self._load_dict(i, row) for i, row in enumerate(self.loads)]
        if loads:
            out["load"] = loads
        sp = self._splices_dict(strict)
        if sp is not None:
            out["splices"] = sp
        sup = [self._support_dict(i, row, strict) for i, row in enumerate(self.supports)]
        if sup:
            out["support"] = sup
        for k, v in self.extras["top"].items():
            out.setdefault(k, copy.deepcopy(v))
        return out

    def _beam_dict(self, strict: bool) -> dict[str, Any]:
        f = self.fields
        b: dict[str, Any] = {}
        for k in ("span", "grade", "section", "families", "max_depth", "bearing_length", "end_distance",
                  "restraints", "load_level", "deflection_limit", "total_deflection_limit", "combination"):
            v = f[f"beam.{k}"]
            if k in ("span", "grade", "section"):
                # written even when blank, so a blank field is reported by the loader under
                # its own name instead of being replaced by the loader's default
                b[k] = str(v).strip()
            elif k == "families":
                b[k] = [str(x) for x in v]
            elif k == "restraints":
                if str(v).strip().lower() == "continuous":
                    b[k] = "continuous"
                elif split_list(v):
                    b[k] = split_list(v)
            elif str(v).strip():
                v = str(v).strip()
                b[k] = parse_number(f"beam.{k}", v, strict) if k.endswith("deflection_limit") else v
        if self.beam_present is not None:
            # the file left these out and the form still shows the loader's default: leave them out
            for k in _OMITTED_DEFAULTS:
                if k not in self.beam_present and k in b and b[k] == _written_default(k):
                    del b[k]
        for k, v in self.extras["beam"].items():
            b.setdefault(k, copy.deepcopy(v))
        return b

    @staticmethod
    def _load_dict(i: int, row: dict[str, Any]) -> dict[str, Any]:
        d: dict[str, Any] = {}
        name = str(row.get("name", "")).strip()
        if name:
            d["name"] = name
        d["action"] = str(row.get("action", "")).strip()
        # every non-empty value is written (the loader judges it); the widget clears the
        # category when the action is not imposed and the positions of the other load kind
        for k in ("category", "group"):
            v = str(row.get(k, "") or "").strip()
            if v:
                d[k] = v
        d["udl" if row.get("kind", "udl") == "udl" else "point"] = str(row.get("value", "")).strip()
        for k in ("from", "to", "at"):
            v = str(row.get(k, "") or "").strip()
            if v:
                d[k] = v
        for k, v in row.get("_extra", {}).items():
            d.setdefault(k, copy.deepcopy(v))
        return d

    def _splices_dict(self, strict: bool) -> dict[str, Any] | None:
        f = self.fields
        mode = f["splices.mode"]
        if mode == "none":
            return None
        s: dict[str, Any] = {}
        # every non-empty piece definition is written (a file may combine them); switching the
        # mode in the form clears the others (set_splice_mode)
        if str(f["splices.pieces"]).strip():
            s["pieces"] = parse_whole("splices.pieces", f["splices.pieces"], strict)
        pos = split_list(f["splices.positions"])
        if pos:
            s["positions"] = pos
        for k in ("max_piece_length", "max_piece_mass"):
            v = str(f[f"splices.{k}"]).strip()
            if v:
                s[k] = v
        for k, default in SPLICE_OPTIONS.items():
            v = str(f[f"splices.{k}"]).strip()
            if v and (v != default or k in self.present):
                s[k] = v
        for k, v in self.extras["splices"].items():
            s.setdefault(k, copy.deepcopy(v))
        return s

    @staticmethod
    def _support_dict(i: int, row: dict[str, Any], strict: bool = True) -> dict[str, Any]:
        d: dict[str, Any] = {"at": str(row.get("at", "")).strip()}
        for k in SUPPORT_FIELDS:
            v = str(row.get(k, "") or "").strip()
            if v:
                d[k] = v
        member = str(row.get("existing_member", "") or "").strip()
        if is_measured_text(member):
            kept = row.get("_measured")
            if kept is not None and kept[0] == member:
                d["existing_member"] = copy.deepcopy(kept[1])     # as read: the file's own values
            else:
                d["existing_member"] = parse_measured(f"support[{i + 1}].existing_member", member, strict)
        for k, v in row.get("_extra", {}).items():
            d.setdefault(k, copy.deepcopy(v))
        return d

    # ------------------------------------------------------------ validated outputs
    def to_job(self) -> Job:
        """Validate with the job loader; raises InputError naming the key of the bad value."""
        return job_from_dict(self.to_job_dict(strict=True))

    def to_toml(self) -> str:
        """TOML text of the (validated) job dict, as typed. Raises InputError when invalid."""
        self.to_job()
        return dumps_toml(self.to_job_dict(strict=True))

    def check(self) -> tuple[Job | None, InputError | None]:
        """``(job, None)`` when valid, ``(None, error)`` otherwise; never raises InputError."""
        try:
            return self.to_job(), None
        except InputError as err:
            return None, err

    def copy(self) -> "FormState":
        new = FormState()
        new.fields = copy.deepcopy(self.fields)
        new.loads = copy.deepcopy(self.loads)
        new.supports = copy.deepcopy(self.supports)
        new.extras = copy.deepcopy(self.extras)
        new.present = set(self.present)
        new.beam_present = None if self.beam_present is None else set(self.beam_present)
        return new

    # ------------------------------------------------------------ from a job dict / text
    @classmethod
    def from_job_dict(cls, data: dict[str, Any]) -> "FormState":
        """A form holding a job-file dict (need not be valid: the form shows what is there)."""
        st = cls()
        if not isinstance(data, dict):
            raise InputError("job file", type(data).__name__, "a TOML document (a table)")
        for top, v in data.items():
            if top not in ("project", "beam", "load", "splices", "support"):
                st.extras["top"][top] = copy.deepcopy(v)
        proj = data.get("project")
        if isinstance(proj, dict):
            for k, v in proj.items():
                if k in PROJECT_KEYS and isinstance(v, (str, int, float)) and not isinstance(v, bool):
                    st.fields[f"project.{k}"] = _text(v)
                else:
                    st.extras["project"][k] = copy.deepcopy(v)
        elif proj is not None:
            st.extras["top"]["project"] = copy.deepcopy(proj)
        beam = data.get("beam")
        if isinstance(beam, dict):
            st._read_beam(beam)
        elif beam is not None:
            st.extras["top"]["beam"] = copy.deepcopy(beam)
        loads = data.get("load")
        if isinstance(loads, list) and all(isinstance(t, dict) for t in loads):
            st.loads = [_read_load(t) for t in loads]
        elif loads is not None:
            st.extras["top"]["load"] = copy.deepcopy(loads)
        sp = data.get("splices")
        if isinstance(sp, dict):
            st._read_splices(sp)
        elif sp is not None:
            st.extras["top"]["splices"] = copy.deepcopy(sp)
        sup = data.get("support")
        if isinstance(sup, list) and all(isinstance(t, dict) for t in sup):
            st.supports = [_read_support(t) for t in sup]
        elif sup is not None:
            st.extras["top"]["support"] = copy.deepcopy(sup)
        return st

    def _read_beam(self, beam: dict[str, Any]) -> None:
        f = self.fields
        self.beam_present = set(beam)
        # keys absent from the file are blank in the form (the loader's defaults apply),
        # except the choices, which show the default the loader uses
        for k in ("span", "max_depth", "bearing_length", "end_distance", "deflection_limit",
                  "total_deflection_limit"):
            f[f"beam.{k}"] = ""
        simple = {"span", "grade", "section", "max_depth", "bearing_length", "end_distance", "load_level",
                  "deflection_limit", "total_deflection_limit", "combination"}
        for k, v in beam.items():
            if k in simple and isinstance(v, (str, int, float)) and not isinstance(v, bool):
                f[f"beam.{k}"] = _text(v)
            elif k == "families" and (isinstance(v, str) or (isinstance(v, list)
                                                             and all(isinstance(x, str) for x in v))):
                f["beam.families"] = [v] if isinstance(v, str) else list(v)
            elif k == "restraints" and isinstance(v, list) and all(isinstance(x, str) and not _LIST_SPLIT.search(x)
                                                                    for x in v):
                f["beam.restraints"] = _join(v)
            else:
                self.extras["beam"][k] = copy.deepcopy(v)

    def _read_splices(self, sp: dict[str, Any]) -> None:
        f = self.fields
        mode = "access"
        if "positions" in sp:
            mode = "positions"
        elif "pieces" in sp:
            mode = "pieces"
        f["splices.mode"] = mode
        for k, v in sp.items():
            if k == "pieces" and isinstance(v, int) and not isinstance(v, bool):
                f["splices.pieces"] = str(v)
            elif k == "positions" and isinstance(v, list) and all(isinstance(x, str) and not _LIST_SPLIT.search(x)
                                                                   for x in v):
                f["splices.positions"] = _join(v)
            elif k in ("max_piece_length", "max_piece_mass") and isinstance(v, str):
                f[f"splices.{k}"] = v
            elif k in SPLICE_OPTIONS and isinstance(v, str):
                f[f"splices.{k}"] = v
                self.present.add(k)
            else:
                self.extras["splices"][k] = copy.deepcopy(v)

    @classmethod
    def from_toml(cls, text: str, source: str = "job file") -> "FormState":
        try:
            data = tomllib.loads(text)
        except tomllib.TOMLDecodeError as err:
            raise InputError(source, "...", f"valid TOML ({err})") from None
        return cls.from_job_dict(data)


def _read_load(t: dict[str, Any]) -> dict[str, Any]:
    row: dict[str, Any] = {"name": "", "action": "", "category": "", "kind": "udl", "value": "", "from": "",
                           "to": "", "at": "", "group": "", "_extra": {}}
    if "point" in t and "udl" not in t:
        row["kind"] = "point"
    for k, v in t.items():
        scalar = isinstance(v, (str, int, float)) and not isinstance(v, bool)
        if k in ("name", "action", "category", "group", "from", "to", "at") and scalar:
            row[k] = _text(v)
        elif k == row["kind"] and scalar:
            row["value"] = _text(v)
        else:
            row["_extra"][k] = copy.deepcopy(v)
    return row


def _read_support(t: dict[str, Any]) -> dict[str, Any]:
    row: dict[str, Any] = {"at": "", **{k: "" for k in SUPPORT_FIELDS}, "_extra": {}}
    for k, v in t.items():
        if k in ("at", *SUPPORT_FIELDS) and isinstance(v, str):
            row[k] = v
        elif k == "existing_member" and _measured_table(v):
            text = measured_text(v)
            row[k] = text
            row["_measured"] = (text, copy.deepcopy(v))
        else:
            row["_extra"][k] = copy.deepcopy(v)
    return row


# ---------------------------------------------------------------- measured existing members
#: keys of a measured existing member table (job file: existing_member = {h = "406 mm", ...})
MEASURED_KEYS: tuple[str, ...] = ("h", "b", "tw", "tf", "r")
_MEASURED_PREFIX = "measured:"
_MEASURED_EXAMPLE = "measured: h = 406 mm, b = 178 mm, tw = 7.9 mm, tf = 12.8 mm, r = 10.2 mm"


def _measured_table(v: Any) -> bool:
    """A measured-member table the form can show as one line (scalar values only)."""
    return (isinstance(v, dict) and bool(v) and set(v) <= {*MEASURED_KEYS, "designation"}
            and all(isinstance(x, (str, int, float)) and not isinstance(x, bool) for x in v.values())
            and all("," not in str(x) and "=" not in str(x) for x in v.values()))


def is_measured_text(text: str) -> bool:
    return str(text).strip().lower().startswith(_MEASURED_PREFIX)


def measured_text(table: dict[str, Any]) -> str:
    """``{h = "406 mm", ...}`` -> ``"measured: h = 406 mm, b = ..."`` (the form's one-line view)."""
    keys = [k for k in (*MEASURED_KEYS, "designation") if k in table]
    return _MEASURED_PREFIX + " " + ", ".join(f"{k} = {_text(table[k])}" for k in keys)


def parse_measured(field: str, text: str, strict: bool = True) -> Any:
    """The one-line view back to the job-file table; InputError naming ``field`` when it is not one."""
    body = str(text).strip()[len(_MEASURED_PREFIX):]
    out: dict[str, Any] = {}
    for part in body.split(","):
        if not part.strip():
            continue
        key, eq, value = part.partition("=")
        key, value = key.strip(), value.strip()
        if not eq or key not in (*MEASURED_KEYS, "designation") or not value or key in out:
            if strict:
                raise InputError(field, text, f"'{_MEASURED_EXAMPLE}' (each of h, b, tw, tf, r once, with "
                                 "its unit), or a catalogue designation such as '254x254x73 UKC'")
            return text
        out[key] = value
    return out


#: [beam] choices a loaded file may leave out (the loader's default then applies)
_OMITTED_DEFAULTS: tuple[str, ...] = ("grade", "section", "families", "load_level", "combination")


def _written_default(k: str) -> Any:
    v = BEAM_DEFAULTS[k]
    return [str(x) for x in v] if isinstance(v, list) else v


#: choices offered by the form's drop-downs (the loader remains the judge)
CHOICES: dict[str, tuple[str, ...]] = {
    "beam.families": FAMILIES,
    "beam.load_level": LOAD_LEVELS,
    "beam.combination": COMBINATIONS,
    "load.action": ACTIONS,
    "load.category": CATEGORIES,
}

__all__ = ["FormState", "CHOICES", "SPLICE_MODES", "SPLICE_MODE_KEYS", "SPLICE_OPTIONS", "SUPPORT_ENDS",
           "CONNECTION_TYPES", "EXISTING_FACES", "SUPPORT_FIELDS", "SUPPORT_DEFAULTS", "LOAD_KINDS",
           "LOAD_FIELDS", "BEAM_DEFAULTS", "MEASURED_KEYS", "split_list", "parse_number", "parse_whole",
           "is_measured_text", "measured_text", "parse_measured"]
