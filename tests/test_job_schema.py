"""The job-file reference and JSON Schema (splicecalc.job.schema) stay in step with the parsers, the
example job files validate against the schema (checked with the `jsonschema` library, a general
validator from PyPI), and the files in docs/ are the generated ones."""

from __future__ import annotations

import tomllib
from pathlib import Path

import jsonschema
import pytest

from splicecalc.job import loader
from splicecalc.job.model import PROJECT_KEYS
from splicecalc.job.schema import documented_keys, json_schema, reference_markdown, schema_json_text
from splicecalc.joints.connections import spec as support_spec
from splicecalc.joints.splice import spec as splice_spec

ROOT = Path(__file__).resolve().parents[1]


def test_every_parser_key_is_documented_and_no_other():
    doc = documented_keys()
    assert set(doc) == set(loader.TOP_KEYS)
    assert doc["project"] == set(PROJECT_KEYS)
    assert doc["beam"] == set(loader.BEAM_KEYS)
    assert doc["load"] == set(loader.LOAD_KEYS)
    assert doc["splices"] == set(splice_spec._KEYS)
    assert doc["support"] == set(support_spec._KEYS)


@pytest.mark.parametrize("path", sorted((ROOT / "examples").glob("*.toml")), ids=lambda p: p.name)
def test_examples_validate_against_the_schema(path):
    jsonschema.validate(tomllib.loads(path.read_text(encoding="utf-8")), json_schema())


def test_schema_refuses_what_the_loader_refuses():
    bad = {"beam": {"span": "7.2", "grade": "S355"}, "load": [{"action": "permanent", "udl": "5 kN/m"}]}
    with pytest.raises(jsonschema.ValidationError):
        jsonschema.validate(bad, json_schema())                          # a span without its unit
    with pytest.raises(jsonschema.ValidationError):
        jsonschema.validate({"beam": {"span": "7 m", "spam": 1}, "load": []}, json_schema())  # unknown key
    ok = {"beam": {"span": "7.2 m"}, "load": [{"action": "imposed", "udl": "5 kN/m2", "width": "2.5 m"}]}
    jsonschema.validate(ok, json_schema())


def test_docs_are_the_generated_files():
    assert (ROOT / "docs" / "job-schema.json").read_text(encoding="utf-8") == schema_json_text()
    assert (ROOT / "docs" / "job-file.md").read_text(encoding="utf-8") == reference_markdown() + "\n"
