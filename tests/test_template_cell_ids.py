"""Every cell of the shipped calc templates carries a unique id (nbformat 4.5), so a build prints no
MissingIDFieldWarning to a new user and later nbformat versions (where it is an error) still read them."""

from __future__ import annotations

import json
import warnings
from pathlib import Path

import nbformat
import pytest

TEMPLATES = sorted((Path(__file__).resolve().parents[1] / "templates").glob("*.ipynb"))


@pytest.mark.parametrize("path", TEMPLATES, ids=lambda p: p.name)
def test_every_template_cell_has_a_unique_id(path):
    nb = json.loads(path.read_text(encoding="utf-8"))
    ids = [c.get("id") for c in nb["cells"]]
    assert None not in ids and len(set(ids)) == len(ids), path.name
    with warnings.catch_warnings():
        warnings.simplefilter("error")          # MissingIDFieldWarning would raise here
        nbformat.validate(nbformat.reads(path.read_text(encoding="utf-8"), as_version=4))


def test_templates_found():
    assert len(TEMPLATES) >= 3
