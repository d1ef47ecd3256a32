"""The job form as ipywidgets: a thin layer over :class:`~splicecalc.form.files.FormFile`.

>>> form = JobForm("beam.toml")        # doctest: +SKIP
>>> form                               # in a notebook: the form; saves to beam.toml  # doctest: +SKIP

Every control writes its value into the :class:`~splicecalc.form.state.FormState`
as typed; the status banner and the utilisation summary are recomputed shortly
after the last change (a :class:`~splicecalc.form.debounce.Debouncer`). Bad
input shows the InputError message naming the field and outlines that field;
nothing is written until Save, and Save writes nothing for bad input.
"""

from __future__ import annotations

import html
import os
import re
from typing import Any, Callable

import ipywidgets as W

from ..core.errors import InputError
from ..job.model import FAMILIES, LOAD_LEVELS, PROJECT_KEYS
from ..materials.historic import ERA_BANDS
from ..materials.steel import GRADES
from ..actions.loads import ACTIONS, CATEGORIES
from .debounce import Debouncer
from .files import FormFile, FormStatus
from .pick import filter_sections
from .state import (EXISTING_FACES, SPLICE_MODE_KEYS, SUPPORT_ENDS, SUPPORT_FIELDS, FormState)
from .summary import Summary, SummaryCache

_DESC = {"description_width": "170px"}
def _wide() -> W.Layout:
    return W.Layout(width="460px")

_BOLTS = ("M16 8.8", "M20 8.8", "M24 8.8", "M27 8.8", "M30 8.8", "M20 10.9", "M24 10.9")
_ERROR_BORDER = "2px solid #b00020"
_LEVEL_STYLE = {"error": "background:#fde8ea;border-left:4px solid #b00020;padding:2px 6px;margin:2px 0",
                "warn": "background:#fff4dc;border-left:4px solid #c77700;padding:2px 6px;margin:2px 0",
                "ok": "background:#eef6ee;border-left:4px solid #2e7d32;padding:2px 6px;margin:2px 0"}
_SPLICE_MODE_LABELS = (("one piece (no splice)", "none"), ("number of pieces", "pieces"),
                       ("splice positions", "positions"), ("access limits (piece length, mass)", "access"))
_SUPPORT_LABEL = {"start": "Support A (start of the span)", "end": "Support B (end of the span)"}


def _set_choice(w: W.Widget, value: Any) -> None:
    """Set a drop-down's value, adding the value as an option when the file holds another spelling."""
    opts = list(w.options)
    vals = [o[1] if isinstance(o, tuple) else o for o in opts]
    if value not in vals:
        w.options = opts + [(str(value), value) if opts and isinstance(opts[0], tuple) else value]
    w.value = value


def _guarded(fn: Callable[..., Any]) -> Callable[..., Any]:
    """Wrap a widget callback: any failure is shown in the form as one line, never a traceback."""
    def run(self: "JobForm", *args: Any, **kwargs: Any) -> Any:
        try:
            return fn(self, *args, **kwargs)
        except Exception as err:  # the engineer sees the message, the kernel log stays clean
            self._show_failure(err)
            return None
    run.__name__ = fn.__name__
    run.__doc__ = fn.__doc__
    return run


class JobForm:
    """ipywidgets form editing the TOML job file ``job_path``.

    ``pdf``: the calc-package PDF printed from this job (default: next to the
    job file, same name, ``.pdf``). ``debounce_s``: delay after the last change
    before the summary is recomputed. ``schedule``: the debouncer's scheduler
    (see :mod:`splicecalc.form.debounce`; tests pass their own).
    """

    def __init__(self, job_path: str | os.PathLike, pdf: str | os.PathLike | None = None, *,
                 debounce_s: float = 0.3,
                 schedule: Callable[[float, Callable[[], None]], Any] | None = None) -> None:
        self.file = FormFile(job_path, pdf)
        self._cache = SummaryCache()
        self._updating = False
        self._force_save = False
        self._highlighted: W.Widget | None = None
        self.controls: dict[str, W.Widget] = {}
        self.load_rows: list[dict[str, W.Widget]] = []
        self.support_controls: dict[str, dict[str, W.Widget]] = {}
        self.summary: Summary | None = None
        self.status: FormStatus | None = None
        self._debounce = Debouncer(self.update, debounce_s, schedule)
        self._build()
        self._push_state()
        self.update()

    @property
    def state(self) -> FormState:
        return self.file.state

    # ================================================================ building
    def _text(self, name: str, description: str, placeholder: str = "") -> W.Text:
        w = W.Text(description=description, placeholder=placeholder, style=_DESC, layout=_wide())
        self._bind(name, w)
        return w

    def _dropdown(self, name: str, description: str, options: Any) -> W.Dropdown:
        w = W.Dropdown(description=description, options=options, style=_DESC, layout=_wide())
        self._bind(name, w)
        return w

    def _combo(self, name: str, description: str, options: Any, placeholder: str = "") -> W.Combobox:
        w = W.Combobox(description=description, options=tuple(options), placeholder=placeholder,
                       ensure_option=False, style=_DESC, layout=_wide())
        self._bind(name, w)
        return w

    def _bind(self, name: str, w: W.Widget) -> None:
        self.controls[name] = w

        def on_change(change: dict) -> None:
            if self._updating:
                return
            self.state.set(name, change["new"])
            self._changed()

        w.observe(lambda change: self._call(on_change, change), names="value")

    def _call(self, fn: Callable[..., Any], *args: Any) -> Any:
        try:
            return fn(*args)
        except Exception as err:  # shown in the form as one line, never a traceback
            self._show_failure(err)
            return None

    def _show_failure(self, err: BaseException) -> None:
        text = str(err) if isinstance(err, InputError) else f"{type(err).__name__}: {err}"
        self.message.value = f"<div style='{_LEVEL_STYLE['error']}'>{html.escape(text)}</div>"

    def _build(self) -> None:
        self.header = W.HTML(f"<b>Job file</b> <code>{html.escape(str(self.file.path))}</code>: the calc runs "
                             "from this file; save after editing.")
        self.banner = W.HTML()
        self.message = W.HTML()
        self.save_button = W.Button(description="Save job file", tooltip="Validate and write the job file")
        self.reload_button = W.Button(description="Reload from file",
                                      tooltip="Read the job file again (the form's edits are discarded)")
        self.refresh_button = W.Button(description="Check files",
                                       tooltip="Compare the form with the job file and the printed package again")
        self.save_button.on_click(lambda _b: self.save())
        self.reload_button.on_click(lambda _b: self.reload())
        self.refresh_button.on_click(lambda _b: self.update())
        self.summary_html = W.HTML()
        self.tabs = W.Tab(children=[self._build_project(), self._build_beam(), self._build_loads(),
                                    self._build_splices(), self._build_supports()])
        for i, t in enumerate(("Project", "Beam", "Loads", "Splices", "Supports")):
            self.tabs.set_title(i, t)
        self.widget = W.VBox([self.header, self.banner, W.HBox([self.save_button, self.reload_button, self.refresh_button]),
                              self.message, self.tabs, self.summary_html])

    def _build_project(self) -> W.Widget:
        labels = {"number": "Job number", "title": "Title", "prepared_by": "Prepared by",
                  "checked_by": "Checked by", "client": "Client", "location": "Location", "date": "Date",
                  "revision": "Revision"}
        return W.VBox([self._text(f"project.{k}", labels.get(k, k)) for k in PROJECT_KEYS])

    def _build_beam(self) -> W.Widget:
        span = self._text("beam.span", "Span", "e.g. 7.2 m")
        grade = self._dropdown("beam.grade", "Steel grade", GRADES)
        # ---- section picker: auto search or a chosen catalogue section
        self.section_mode = W.RadioButtons(options=[("lightest passing section (search)", "auto"),
                                                    ("a chosen section", "chosen")],
                                           description="Section", style=_DESC)
        self.family_boxes = {f: W.Checkbox(description=f, indent=False, layout=W.Layout(width="70px"))
                             for f in FAMILIES}
        max_depth = self._text("beam.max_depth", "Max depth h", "headroom limit, e.g. 460 mm (blank: none)")
        self.section_filter = W.Text(description="Search", placeholder="e.g. 457 UKB, IPE 3",
                                     style=_DESC, layout=_wide())
        self.section_select = W.Select(options=[], rows=8, description="Catalogue", style=_DESC, layout=_wide())
        self.controls["beam.section"] = self.section_select
        self.controls["beam.families"] = W.HBox(list(self.family_boxes.values()))
        self.auto_box = W.VBox([W.HBox([W.Label("Families searched", layout=W.Layout(width="174px")),
                                        self.controls["beam.families"]])])
        self.chosen_box = W.VBox([self.section_filter, self.section_select])
        self.section_mode.observe(self._on_section_mode, names="value")
        self.section_filter.observe(lambda c: self._call(self._refresh_section_options), names="value")
        self.section_select.observe(self._on_section_select, names="value")
        for box in self.family_boxes.values():
            box.observe(self._on_family, names="value")
        rest = [
            self._text("beam.bearing_length", "Stiff bearing length", "blank: hangs on end connections"),
            self._text("beam.end_distance", "Beam end to bearing", "blank: 0 mm"),
            self._text("beam.restraints", "Lateral restraints at", "e.g. 2.4 m, 4.8 m (blank: ends only)"),
            self._dropdown("beam.load_level", "Load applied at", LOAD_LEVELS),
            self._text("beam.deflection_limit", "Deflection limit span /", "e.g. 360"),
            self._text("beam.total_deflection_limit", "Total deflection span /", "blank: not checked"),
            self._dropdown("beam.combination", "ULS combination",
                           [("EN 1990 Eq. 6.10", "6.10"), ("worse of Eq. 6.10a and 6.10b", "6.10ab")]),
        ]
        self.beam_extras = W.HTML()
        return W.VBox([span, grade, self.section_mode, self.auto_box, self.chosen_box, max_depth, *rest,
                       self.beam_extras])

    def _build_loads(self) -> W.Widget:
        self.loads_box = W.VBox()
        add_udl = W.Button(description="Add UDL")
        add_point = W.Button(description="Add point load")
        add_udl.on_click(lambda _b: self.add_load("udl"))
        add_point.on_click(lambda _b: self.add_load("point"))
        note = W.HTML("Characteristic loads (the beam self-weight is added by the design). Positions from "
                      "support A; a UDL without from / to covers the whole span.")
        return W.VBox([note, self.loads_box, W.HBox([add_udl, add_point])])

    def _build_splices(self) -> W.Widget:
        self.splice_mode = W.RadioButtons(options=list(_SPLICE_MODE_LABELS), description="Beam delivered as",
                                          style=_DESC)
        self.splice_mode.observe(self._on_splice_mode, names="value")
        self.splice_fields = {
            "pieces": self._text("splices.pieces", "Number of pieces", "e.g. 3"),
            "positions": self._text("splices.positions", "Splices at", "e.g. 2.6 m, 5.0 m (from support A)"),
            "max_piece_length": self._text("splices.max_piece_length", "Longest piece", "e.g. 3.0 m"),
            "max_piece_mass": self._text("splices.max_piece_mass", "Heaviest piece", "e.g. 250 kg"),
        }
        self.splice_options = W.VBox([
            self._combo("splices.bolts", "Bolts", ("auto", *_BOLTS), "auto or e.g. M20 8.8"),
            self._dropdown("splices.category", "Bolted joint category",
                           [("A: bearing type", "A"), ("B: slip-resistant at SLS", "B"),
                            ("C: slip-resistant at ULS", "C")]),
            self._dropdown("splices.friction_class", "Friction surface class", ("A", "B", "C", "D")),
            self._dropdown("splices.flange_plates", "Flange cover plates",
                           [("outer plate only", "outer"), ("outer and inner plates", "outer+inner")]),
            self._dropdown("splices.plate_grade", "Plate grade", GRADES),
            self._text("splices.mass_margin", "Mass margin", "e.g. 3 % (added to every piece mass)"),
            self._combo("splices.slip", "Slip (category A)", ("computed", "ignored"),
                        "computed, ignored, or a slip such as 1.5 mm"),
        ])
        self.controls["splices.category"].observe(lambda c: self._show_friction(), names="value")
        self.splice_extras = W.HTML()
        return W.VBox([self.splice_mode, *self.splice_fields.values(), self.splice_options, self.splice_extras])

    def _build_supports(self) -> W.Widget:
        panels = []
        members = [d for d in filter_sections("", ("UKC", "UKB", "HEA", "HEB", "IPE"))]
        steels = (*ERA_BANDS, *GRADES)
        for at in SUPPORT_ENDS:
            conn = W.Dropdown(description="Connection", options=[("none (not checked)", ""),
                                                                  ("fin plate", "fin plate"),
                                                                  ("end plate (partial depth)", "end plate")],
                              style=_DESC, layout=_wide())
            c: dict[str, W.Widget] = {"connection": conn}
            c["bolts"] = W.Combobox(description="Bolts", options=_BOLTS, ensure_option=False,
                                    placeholder="e.g. M20 8.8", style=_DESC, layout=_wide())
            c["plate"] = W.Text(description="Plate", placeholder="e.g. 10 mm S275 (or S275: thickness chosen)",
                                style=_DESC, layout=_wide())
            c["existing_member"] = W.Combobox(description="Existing member", options=tuple(members),
                                              ensure_option=False, placeholder="e.g. 254x254x73 UKC",
                                              style=_DESC, layout=_wide())
            c["existing_face"] = W.Dropdown(description="Connected to",
                                            options=[("(choose)", ""), *((f, f) for f in EXISTING_FACES)],
                                            style=_DESC, layout=_wide())
            c["existing_steel"] = W.Combobox(description="Existing steel", options=steels, ensure_option=False,
                                             placeholder="era of construction, e.g. 1950-1958, or a grade",
                                             style=_DESC, layout=_wide())
            c["notch_top"] = W.Text(description="Top notch", placeholder="depth x length, e.g. 40 mm x 120 mm "
                                    "(blank: none)", style=_DESC, layout=_wide())
            c["_extras"] = W.HTML()
            c["_details"] = W.VBox([c[k] for k in SUPPORT_FIELDS if k != "connection"] + [c["_extras"]])
            for key in SUPPORT_FIELDS:
                c[key].observe(self._support_handler(at, key), names="value")
            self.support_controls[at] = c
            panels.append(W.VBox([W.HTML(f"<b>{_SUPPORT_LABEL[at]}</b>"), conn, c["_details"]]))
        return W.VBox(panels)

    # ================================================================ state -> widgets
    def _push_state(self) -> None:
        """Show the state's values in every control (no change events reach the state)."""
        self._updating = True
        try:
            f = self.state.fields
            for name, w in self.controls.items():
                if name in ("beam.section", "beam.families"):
                    continue
                v = f[name]
                if isinstance(w, W.Dropdown):
                    _set_choice(w, v)
                else:
                    w.value = "" if v is None else str(v)
            fams = set(f["beam.families"])
            for fam, box in self.family_boxes.items():
                box.value = fam in fams
            self.section_mode.value = "auto" if f["beam.section"] == "auto" else "chosen"
            self._refresh_section_options()
            self.splice_mode.value = f["splices.mode"]
            self._show_splice_fields()
            self._show_friction()
            for at in SUPPORT_ENDS:
                self._push_support(at)
            self._build_load_rows()
            self._show_extras()
            self._show_section_boxes()
        finally:
            self._updating = False

    def _push_support(self, at: str) -> None:
        row = self.state.support(at)
        c = self.support_controls[at]
        was, self._updating = self._updating, True
        try:
            if row is None:
                c["connection"].value = ""
                c["_details"].layout.display = "none"
                c["_extras"].value = ""
                return
            for key in SUPPORT_FIELDS:
                v = str(row.get(key, "") or "")
                if isinstance(c[key], W.Dropdown):
                    _set_choice(c[key], v)
                else:
                    c[key].value = v
            c["_details"].layout.display = ""
            extra = row.get("_extra", {})
            c["_extras"].value = _extras_note(extra)
        finally:
            self._updating = was

    def _show_extras(self) -> None:
        ex = self.state.extras
        self.beam_extras.value = _extras_note({**ex["beam"], **{f"[{k}]": v for k, v in ex["top"].items()},
                                               **{f"project.{k}": v for k, v in ex["project"].items()}})
        self.splice_extras.value = _extras_note(ex["splices"])

    # ================================================================ section picker
    def _show_section_boxes(self) -> None:
        auto = self.section_mode.value == "auto"
        self.chosen_box.layout.display = "none" if auto else ""
        self.auto_box.layout.display = "" if auto else "none"

    def _refresh_section_options(self) -> None:
        current = self.state.fields["beam.section"]
        opts = filter_sections(self.section_filter.value, limit=250)
        if current != "auto" and current and current not in opts:
            opts = [current, *opts]
        was, self._updating = self._updating, True
        try:
            self.section_select.options = opts
            self.section_select.value = current if current in opts else None
        finally:
            self._updating = was

    @_guarded
    def _on_section_mode(self, change: dict) -> None:
        self._show_section_boxes()
        if self._updating:
            return
        if change["new"] == "auto":
            self.state.set("beam.section", "auto")
        else:
            self.state.set("beam.section", self.section_select.value or "")
        self._changed()

    @_guarded
    def _on_section_select(self, change: dict) -> None:
        if self._updating or self.section_mode.value != "chosen" or change["new"] is None:
            return
        self.state.set("beam.section", change["new"])
        self._changed()

    @_guarded
    def _on_family(self, change: dict) -> None:
        if self._updating:
            return
        self.state.set("beam.families", [f for f, b in self.family_boxes.items() if b.value])
        self._changed()

    # ================================================================ loads
    @_guarded
    def add_load(self, kind: str = "udl") -> None:
        self.state.add_load(kind)
        self._build_load_rows()
        self._changed()

    @_guarded
    def remove_load(self, index: int) -> None:
        self.state.remove_load(index)
        self._build_load_rows()
        self._changed()

    def _build_load_rows(self) -> None:
        rows = []
        self.load_rows = []

        def small() -> W.Layout:
            # one Layout per box: a Layout is a shared model, so hiding one box would hide them all
            return W.Layout(width="110px")

        for i, r in enumerate(self.state.loads):
            c: dict[str, W.Widget] = {
                "name": W.Text(value=str(r["name"]), placeholder="name", layout=W.Layout(width="160px")),
                "action": W.Dropdown(options=list(ACTIONS), layout=W.Layout(width="110px")),
                "category": W.Dropdown(options=[("-", "")] + [(f"cat. {k}", k) for k in CATEGORIES],
                                       layout=W.Layout(width="90px")),
                "kind": W.Dropdown(options=[("UDL", "udl"), ("point", "point")], layout=W.Layout(width="80px")),
                "value": W.Text(value=str(r["value"]), placeholder="kN/m" if r["kind"] == "udl" else "kN",
                                layout=small()),
                "from": W.Text(value=str(r["from"]), placeholder="from (m)", layout=small()),
                "to": W.Text(value=str(r["to"]), placeholder="to (m)", layout=small()),
                "at": W.Text(value=str(r["at"]), placeholder="at (m)", layout=small()),
            }
            _set_choice(c["action"], r["action"])
            _set_choice(c["category"], r["category"])
            _set_choice(c["kind"], r["kind"])
            remove = W.Button(description="remove", layout=W.Layout(width="80px"))
            remove.on_click(lambda _b, i=i: self.remove_load(i))
            for key, w in c.items():
                w.observe(self._load_handler(i, key), names="value")
            self.load_rows.append(c)
            self._show_load_fields(i)
            rows.append(W.HBox([*c.values(), remove]))
            kept = {**({"group": r["group"]} if str(r.get("group", "")).strip() else {}), **r.get("_extra", {})}
            if kept:
                rows.append(W.HTML("&nbsp;&nbsp;&nbsp;" + _extras_note(kept)
                                   .replace("from the job file", f"for load {i + 1} from the job file")))
        self.loads_box.children = rows

    def _show_load_fields(self, i: int) -> None:
        c, r = self.load_rows[i], self.state.loads[i]
        udl = r["kind"] == "udl"
        for k in ("from", "to"):
            c[k].layout.display = "" if (udl or r[k]) else "none"
        c["at"].layout.display = "" if (not udl or r["at"]) else "none"
        c["category"].disabled = r["action"] != "imposed" and not r["category"]
        c["value"].placeholder = "e.g. 12.5 kN/m" if udl else "e.g. 35 kN"

    def _load_handler(self, i: int, key: str) -> Callable[[dict], None]:
        def handler(change: dict) -> None:
            if self._updating:
                return
            self.state.set_load(i, key, change["new"])
            c = self.load_rows[i]
            was, self._updating = self._updating, True
            try:
                # explicit switches clear what no longer applies (the engineer sees it go)
                if key == "action" and change["new"] != "imposed":
                    self.state.set_load(i, "category", "")
                    c["category"].value = ""
                if key == "kind":
                    for k in (("at",) if change["new"] == "udl" else ("from", "to")):
                        self.state.set_load(i, k, "")
                        c[k].value = ""
            finally:
                self._updating = was
            self._show_load_fields(i)
            self._changed()
        return lambda change: self._call(handler, change)

    # ================================================================ splices and supports
    def _show_splice_fields(self) -> None:
        mode = self.state.fields["splices.mode"]
        for k, w in self.splice_fields.items():
            show = k in SPLICE_MODE_KEYS[mode] or bool(str(self.state.fields[f"splices.{k}"]).strip())
            w.layout.display = "" if show else "none"
        self.splice_options.layout.display = "none" if mode == "none" else ""

    def _show_friction(self) -> None:
        # the friction class matters for slip-resistant joints (categories B and C) only
        self.controls["splices.friction_class"].disabled = self.controls["splices.category"].value == "A"

    @_guarded
    def _on_splice_mode(self, change: dict) -> None:
        if self._updating:
            return
        self.state.set_splice_mode(change["new"])
        was, self._updating = self._updating, True
        try:
            for k, w in self.splice_fields.items():
                w.value = str(self.state.fields[f"splices.{k}"])
        finally:
            self._updating = was
        self._show_splice_fields()
        self._changed()

    def _support_handler(self, at: str, key: str) -> Callable[[dict], None]:
        def handler(change: dict) -> None:
            if self._updating:
                return
            if key == "connection":
                self.state.set_connection(at, change["new"] or None)
                self._push_support(at)
            else:
                self.state.set_support(at, key, change["new"])
                if key == "existing_member":
                    self._push_support(at)
            self._changed()
        return lambda change: self._call(handler, change)

    # ================================================================ status, summary, actions
    def _changed(self) -> None:
        self.message.value = ""
        self._debounce()

    @_guarded
    def update(self) -> None:
        """Recompute the status banner and the utilisation summary now."""
        self.status = self.file.status()
        self.summary = self._cache.get(self.state)
        self.banner.value = "".join(f"<div style='{_LEVEL_STYLE[lvl]}'>{html.escape(t)}</div>"
                                    for lvl, t in self.status.messages())
        self.summary_html.value = self.summary.html()
        self._highlight(self.status.error.field if self.status.error is not None else None)

    def flush(self) -> None:
        """Run a pending (debounced) update now."""
        self._debounce.flush()

    def save(self) -> bool:
        """Save button: validate and write atomically; True when written."""
        self._debounce.flush()
        try:
            job = self.file.save(force=self._force_save)
        except InputError as err:
            self.message.value = f"<div style='{_LEVEL_STYLE['error']}'>Not saved: {html.escape(str(err))}</div>"
            if err.field == "job file":
                self._force_save = True
                self.save_button.description = "Overwrite job file"
            self.update()
            return False
        except OSError as err:   # disk full, permissions: the old file is intact (atomic write)
            self.message.value = (f"<div style='{_LEVEL_STYLE['error']}'>Not saved: could not write "
                                  f"{html.escape(str(self.file.path))} ({html.escape(str(err))}); the file on "
                                  "disk is unchanged.</div>")
            self.update()
            return False
        self._force_save = False
        self.save_button.description = "Save job file"
        self.message.value = (f"<div style='{_LEVEL_STYLE['ok']}'>Saved {html.escape(self.file.path.name)} "
                              f"({len(job.loads)} loads).</div>"
                              f"<div style='{_LEVEL_STYLE['warn']}'>The calc below this form still shows the "
                              "values it last ran with: run all cells again (Run &gt; Run All Cells) before "
                              "exporting or printing the package.</div>")
        self.update()
        return True

    @_guarded
    def reload(self) -> None:
        """Reload button: read the job file again (the form's edits are discarded)."""
        self.file.reload()
        self._force_save = False
        self.save_button.description = "Save job file"
        self._push_state()
        self.message.value = ""
        self.update()

    def _widget_for(self, field: str | None) -> W.Widget | None:
        if not field:
            return None
        m = re.match(r"^load\[(\d+)\](?:\.(\w+))?", field)
        if m:
            i = int(m.group(1)) - 1
            if not 0 <= i < len(self.load_rows):
                return None
            key = m.group(2) or "value"
            key = "value" if key in ("udl", "point") else key
            return self.load_rows[i].get(key, self.load_rows[i]["value"])
        m = re.match(r"^support\[(\d+)\](?:\.(\w+))?", field)
        if m:
            i = int(m.group(1)) - 1
            if not 0 <= i < len(self.state.supports):
                return None
            at = str(self.state.supports[i].get("at", "")).strip().lower()
            c = self.support_controls.get(at)
            if c is None:
                return None
            return c.get(m.group(2) or "connection", c["connection"])
        name = re.sub(r"\[\d+\]$", "", field)
        while name:
            if name in self.controls:
                return self.controls[name]
            name = name.rpartition(".")[0]
        return None

    def _highlight(self, field: str | None) -> None:
        if self._highlighted is not None:
            self._highlighted.layout.border = ""
        w = self._widget_for(field)
        if w is not None:
            w.layout.border = _ERROR_BORDER
        self._highlighted = w

    # ================================================================ display
    def _repr_mimebundle_(self, **kwargs: Any) -> dict | None:
        bundle = self.widget._repr_mimebundle_(**kwargs)
        if bundle:
            bundle["text/plain"] = (f"Job form for {self.file.path.name} (interactive; the calc runs from the "
                                    "saved job file)")
        return bundle


def _extras_note(extra: dict[str, Any]) -> str:
    if not extra:
        return ""
    keys = ", ".join(html.escape(str(k)) for k in extra)
    return (f"<i>Also kept from the job file (not editable here, written back unchanged): {keys}.</i>")


__all__ = ["JobForm"]
