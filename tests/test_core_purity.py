"""The computation core stays pure: numpy and the standard library only, no files, no clock.

DEVELOPERS.md: data flows one way, and ``deckload.core`` never imports textual, rich or
tomllib, never opens files and never reads the clock.  This test reads the source of every
core module and fails on any import or call that would break that.
"""

import ast
from pathlib import Path

import deckload.core

CORE = Path(deckload.core.__file__).parent
ALLOWED_TOP = {"__future__", "dataclasses", "typing", "math", "numpy", "deckload", "functools", "collections"}
FORBIDDEN_CALLS = {"open", "print", "input"}
FORBIDDEN_ATTRS = {"time", "now", "utcnow", "today", "read_text", "write_text", "read_bytes", "write_bytes"}


def _modules():
    files = sorted(CORE.rglob("*.py"))
    assert len(files) >= 8, "core modules not found"
    return files


def test_core_imports_only_numpy_and_stdlib_math():
    bad = []
    for f in _modules():
        tree = ast.parse(f.read_text(encoding="utf-8"))
        for node in ast.walk(tree):
            names = []
            if isinstance(node, ast.Import):
                names = [a.name for a in node.names]
            elif isinstance(node, ast.ImportFrom) and node.level == 0:
                names = [node.module or ""]
            for n in names:
                top = n.split(".")[0]
                if top not in ALLOWED_TOP or (top == "deckload" and not n.startswith("deckload.core")):
                    bad.append(f"{f.name}:{node.lineno} imports {n}")
    assert bad == []


def test_core_touches_no_files_and_no_clock():
    bad = []
    for f in _modules():
        tree = ast.parse(f.read_text(encoding="utf-8"))
        for node in ast.walk(tree):
            if isinstance(node, ast.Call):
                fn = node.func
                if isinstance(fn, ast.Name) and fn.id in FORBIDDEN_CALLS:
                    bad.append(f"{f.name}:{node.lineno} calls {fn.id}()")
                if isinstance(fn, ast.Attribute) and fn.attr in FORBIDDEN_ATTRS:
                    bad.append(f"{f.name}:{node.lineno} calls .{fn.attr}()")
    assert bad == []


def test_purity_check_catches_a_forbidden_import(tmp_path):
    """The checker itself must be able to fail."""
    src = "import textual\nfrom rich import print\nopen('x')\n"
    tree = ast.parse(src)
    imports = [n for n in ast.walk(tree) if isinstance(n, (ast.Import, ast.ImportFrom))]
    tops = {(a.name if isinstance(n, ast.Import) else n.module).split(".")[0] for n in imports for a in n.names}
    assert tops - ALLOWED_TOP == {"textual", "rich"}
