"""The layout's import contracts: layers point down, no cycles, review code without pymoo/dask.

grimp/import-linter cannot be used here: they need the checked packages to be top-level, and
cablefam installs its folders under one import name. The module graph is read from the source
with :mod:`ast` (every ``import`` and ``from ... import``, also inside functions).
"""

from __future__ import annotations

import ast
import subprocess
import sys
from pathlib import Path

import pytest

REPO = Path(__file__).resolve().parents[1]
#: Folder -> package name, as pyproject.toml maps them.
PACKAGES = {"physics": "cablefam.physics", "optimizer": "cablefam.optimizer"}
#: Top to bottom; a module may import only from its own layer or the layers below it.
LAYERS = [
    ("cablefam.optimizer.cli",),
    ("cablefam.optimizer.review", "cablefam.optimizer.batch"),
    ("cablefam.optimizer.search",),
    ("cablefam.optimizer.run_folder",),
    ("cablefam.optimizer.inputs",),
    ("cablefam.optimizer.model",),
    ("cablefam.optimizer.errors", "cablefam.optimizer.atomic", "cablefam.optimizer.cautions",
     "cablefam.optimizer.text_table"),
    ("cablefam.physics",),
]


def _modules():
    out = {}
    for folder, package in PACKAGES.items():
        for path in sorted((REPO / folder).rglob("*.py")):
            rel = path.relative_to(REPO / folder).with_suffix("")
            parts = [p for p in rel.parts if p != "__init__"]
            out[".".join([package, *parts])] = path
    return out


def _imports(path: Path) -> set[str]:
    names = set()
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        if isinstance(node, ast.Import):
            names.update(a.name for a in node.names)
        elif isinstance(node, ast.ImportFrom) and node.module and node.level == 0:
            names.add(node.module)
            names.update(f"{node.module}.{a.name}" for a in node.names)
    return names


MODULES = _modules()
GRAPH = {m: {i for i in _imports(p) if i in MODULES and i != m} for m, p in MODULES.items()}


def _layer(module: str) -> int | None:
    for k, group in enumerate(LAYERS):
        if any(module == g or module.startswith(g + ".") for g in group):
            return k
    return None


def test_every_package_module_is_in_a_layer():
    assert [m for m in MODULES if _layer(m) is None and m not in
            ("cablefam.optimizer", "cablefam.optimizer.demo")] == []


def test_imports_point_down_only():
    upward = [(m, i) for m, deps in GRAPH.items() for i in deps
              if _layer(m) is not None and _layer(i) is not None and _layer(i) < _layer(m)]
    assert upward == []


def test_no_import_cycles():
    # Tarjan-free check: depth-first search with colours over the module graph
    state, cycles = {}, []

    def visit(m, stack):
        state[m] = 1
        for d in sorted(GRAPH[m]):
            if d not in GRAPH:
                continue
            if state.get(d) == 1:
                cycles.append(stack[stack.index(d):] + [d])
            elif d not in state:
                visit(d, stack + [d])
        state[m] = 2

    for m in sorted(GRAPH):
        if m not in state:
            visit(m, [m])
    assert cycles == []


def test_physics_imports_nothing_above_it():
    heavy = ("cablefam.optimizer", "pandas", "pyarrow", "pymoo", "dask", "typer")
    bad = [(m, i) for m, p in MODULES.items() if m.startswith("cablefam.physics")
           for i in _imports(p) if i.startswith(heavy)]
    assert bad == []


def test_bare_top_level_names_are_not_importable():
    # the distribution installs one import name only
    code = "import importlib.util as u; print([n for n in ('physics', 'optimizer', 'catalogs') " \
           "if u.find_spec(n)])"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         cwd="/", check=True).stdout.strip()
    assert out == "[]"


@pytest.mark.parametrize("module", ["cablefam.optimizer.cli.app"])
def test_cli_import_is_light(module):
    code = f"import sys, {module}; print(sorted(m for m in ('pymoo', 'dask', 'pandas') if m in sys.modules))"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stdout.strip()
    assert out == "[]"
