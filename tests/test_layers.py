"""The folders of ``deckload/`` are its layers, and each imports only the layers below it.

DEVELOPERS.md, "Architecture": core → io → logbook → report → cli / ui.  This test reads the
source of every module (imports inside functions included) and fails on an import that
crosses a layer upward, on a module left at the top of the package, and on a test-only
dependency imported by the installed package (``pip install .`` without the test extra must
import every module).
"""

import ast
import importlib
import pkgutil
from pathlib import Path

import pytest

import deckload

PACKAGE = Path(deckload.__file__).parent

# layer → the deckload layers it may import (besides itself).
MAY_IMPORT = {
    "core": set(),
    "io": {"core"},
    "logbook": {"core", "io"},
    "report": {"core", "io", "logbook"},
    "cli": {"core", "io", "logbook", "report", "ui"},
    "ui": {"core", "io", "logbook", "report", "cli.boundary"},
}
TOP_LEVEL_ALLOWED = {"__init__.py", "__main__.py"}
TEST_ONLY = {"pytest", "trimesh", "shapely", "mutmut", "pytest_textual_snapshot", "syrupy"}


def _deckload_imports(source: str) -> list[tuple[int, str]]:
    out = []
    for node in ast.walk(ast.parse(source)):
        if isinstance(node, ast.Import):
            out += [(node.lineno, a.name) for a in node.names]
        elif isinstance(node, ast.ImportFrom) and node.level == 0 and node.module:
            if node.module == "deckload":
                out += [(node.lineno, f"deckload.{a.name}") for a in node.names]
            else:
                out.append((node.lineno, node.module))
    return out


def _crossings(layer: str, source: str, name: str) -> list[str]:
    allowed = MAY_IMPORT[layer]
    bad = []
    for line, mod in _deckload_imports(source):
        parts = mod.split(".")
        if parts[0] in TEST_ONLY:
            bad.append(f"{name}:{line} imports test-only {mod}")
        if parts[0] != "deckload" or len(parts) < 2 or parts[1] in ("__version__",):
            continue
        target = parts[1]
        if target == layer:
            continue
        if target in allowed or ".".join(parts[1:3]) in allowed:
            continue
        bad.append(f"{name}:{line} ({layer}) imports {mod}")
    return bad


def test_no_module_is_left_at_the_top_of_the_package():
    loose = sorted(p.name for p in PACKAGE.glob("*.py") if p.name not in TOP_LEVEL_ALLOWED)
    assert loose == []
    assert {p.name for p in PACKAGE.iterdir() if p.is_dir() and not p.name.startswith("__")} == set(
        MAY_IMPORT
    ) | {"data"}


def test_each_layer_imports_only_the_layers_below_it():
    bad = []
    for layer in MAY_IMPORT:
        for f in sorted((PACKAGE / layer).rglob("*.py")):
            bad += _crossings(layer, f.read_text(encoding="utf-8"), str(f.relative_to(PACKAGE)))
    assert bad == []


def test_the_layer_check_can_fail():
    src = "from deckload.ui.app import X\nimport trimesh\nfrom deckload import report\nfrom deckload.core import model\n"
    assert _crossings("io", src, "x.py") == [
        "x.py:1 (io) imports deckload.ui.app",
        "x.py:2 imports test-only trimesh",
        "x.py:3 (io) imports deckload.report",
    ]
    assert _crossings("ui", "from deckload.cli.main import main\nfrom deckload.cli.boundary import f\n", "y.py") == [
        "y.py:1 (ui) imports deckload.cli.main"
    ]


@pytest.mark.parametrize(
    "name",
    sorted(m.name for m in pkgutil.walk_packages([str(PACKAGE)], "deckload.") if m.name != "deckload.__main__"),
)
def test_every_module_of_the_package_imports(name):
    importlib.import_module(name)
