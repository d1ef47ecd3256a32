"""Packaging beyond what pyproject.toml can say: the top-level ``templates/`` and
``examples/`` folders (their source) are shipped inside the wheel as
``splicecalc/templates`` and ``splicecalc/examples`` (package data, found by
:mod:`splicecalc.core.shipped` through importlib.resources)."""

from setuptools import find_packages, setup

SHIPPED = {"splicecalc.templates": "templates", "splicecalc.examples": "examples"}

setup(
    packages=find_packages(include=["splicecalc", "splicecalc.*"]) + list(SHIPPED),
    package_dir=SHIPPED,
)
