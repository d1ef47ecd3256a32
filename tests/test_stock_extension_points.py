"""splicecalc extends other libraries only through their public extension points (issue 14).

A static look at every module of the package: no assignment into another library's module
or class (monkeypatching), no ``setattr`` on one, no private name (``_x``) of one read or imported.
Reference: the user's rule "nbclient hooks, nbconvert preprocessors / templates / exporters,
handcalcs' public API; no monkeypatching, no private names of other packages".
"""

from __future__ import annotations

import ast
from pathlib import Path

import splicecalc

FOREIGN = ("handcalcs", "forallpeople", "nbconvert", "nbclient", "jupyter_client", "jupyter_core", "nbformat",
           "traitlets", "pyparsing", "innerscope", "matplotlib", "ipykernel", "IPython", "pyhanko", "cryptography")
ROOT = Path(splicecalc.__file__).parent


def _foreign(module: str | None) -> bool:
    return bool(module) and module.split(".")[0] in FOREIGN


def _root(node: ast.AST) -> ast.AST:
    while isinstance(node, (ast.Attribute, ast.Call, ast.Subscript)):
        node = node.value if not isinstance(node, ast.Call) else (node.args[0] if node.args and isinstance(
            node.func, ast.Name) and node.func.id == "type" else node.func)
    return node


def _private(name: str) -> bool:
    return name.startswith("_") and not (name.startswith("__") and name.endswith("__"))


def _faults(path: Path) -> list[str]:
    tree = ast.parse(path.read_text(encoding="utf-8"), str(path))
    aliases: set[str] = set()
    faults: list[str] = []
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for a in node.names:
                if _foreign(a.name):
                    aliases.add((a.asname or a.name).split(".")[0])
        elif isinstance(node, ast.ImportFrom) and node.level == 0 and _foreign(node.module):
            for a in node.names:
                aliases.add(a.asname or a.name)
                if _private(a.name):
                    faults.append(f"{path.name}:{node.lineno}: imports the private name {node.module}.{a.name}")
    for node in ast.walk(tree):
        targets = node.targets if isinstance(node, ast.Assign) else (
            [node.target] if isinstance(node, (ast.AugAssign, ast.AnnAssign)) else [])
        for t in targets:
            if isinstance(t, ast.Attribute) and isinstance(_root(t), ast.Name) and _root(t).id in aliases:
                faults.append(f"{path.name}:{node.lineno}: assigns into {ast.unparse(t)}")
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Name) and node.func.id == "setattr" and node.args:
            r = _root(node.args[0])
            if isinstance(r, ast.Name) and r.id in aliases:
                faults.append(f"{path.name}:{node.lineno}: setattr on {ast.unparse(node.args[0])}")
        if isinstance(node, ast.Attribute) and _private(node.attr):
            r = _root(node.value)
            if isinstance(r, ast.Name) and r.id in aliases:
                faults.append(f"{path.name}:{node.lineno}: uses the private name {ast.unparse(node)}")
            elif isinstance(node.value, ast.Call) and isinstance(node.value.func, ast.Name) \
                    and node.value.func.id == "super":
                faults.append(f"{path.name}:{node.lineno}: calls the inherited private {ast.unparse(node)}")
    return faults


def test_no_monkeypatching_and_no_private_names_of_other_libraries():
    faults = [f for p in sorted(ROOT.rglob("*.py")) for f in _faults(p)]
    assert not faults, "\n".join(faults)


def test_no_subclass_overrides_a_private_method_of_another_library():
    import importlib
    import inspect
    import pkgutil

    faults = []
    for mod in pkgutil.walk_packages(splicecalc.__path__, "splicecalc."):
        if mod.name.startswith("splicecalc.form"):
            continue                    # ipywidgets front end: imports a display stack
        module = importlib.import_module(mod.name)
        for cls in vars(module).values():
            if not inspect.isclass(cls) or cls.__module__ != module.__name__:
                continue
            foreign = [b for b in cls.__mro__[1:] if _foreign(b.__module__)]
            for name, value in vars(cls).items():
                if _private(name) and inspect.isfunction(value) and not name.startswith(f"_{cls.__name__}") and any(name in vars(b) for b in foreign):
                    faults.append(f"{cls.__module__}.{cls.__qualname__}.{name} overrides a private method")
    assert not faults, "\n".join(faults)


def test_the_check_finds_what_it_looks_for(tmp_path):
    # the check itself: each kind of fault in a small module is found
    bad = tmp_path / "bad.py"
    bad.write_text("import handcalcs.handcalcs as hc\nimport forallpeople as si\n"
                   "from nbconvert.filters import _private\n"
                   "hc.expr_parser = lambda line: line\n"
                   "type(si.environment).units_by_factor = property(lambda s: 1)\n"
                   "x = hc._secret\nsetattr(hc, 'y', 1)\n"
                   "class K(hc.LatexRenderer):\n    def f(self):\n        return super()._hidden()\n")
    found = _faults(bad)
    assert len(found) == 6, found
