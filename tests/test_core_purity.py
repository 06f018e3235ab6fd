"""The computation core stays pure: numpy and the standard library only, no files, no clock.

DEVELOPERS.md: data flows one way, and ``deckload.core`` never imports textual, rich or
tomllib, never opens files and never reads the clock.  This test reads the source of every
core module and fails on any import or call that would break that.
"""

import ast
from pathlib import Path

import deckload.core

CORE = Path(deckload.core.__file__).parent
ALLOWED_TOP = {"__future__", "dataclasses", "typing", "math", "numpy", "deckload", "functools", "collections",
               "operator", "reprlib", "inspect", "itertools"}
# operator, reprlib, inspect: core/frozen.py (attribute getters, a recursion guard, the signature dataclass
# gives __init__); itertools: ballast_plan.py (the combinations of amounts a little less or more)
FORBIDDEN_CALLS = {"open", "print", "input"}
FORBIDDEN_ATTRS = {"time", "now", "utcnow", "today", "read_text", "write_text", "read_bytes", "write_bytes"}


def _modules():
    files = sorted(CORE.rglob("*.py"))
    assert len(files) >= 8, "core modules not found"
    return files


def _impurities(source: str, name: str) -> list[str]:
    """Every import outside numpy/stdlib maths and every file, print or clock call in ``source``."""
    bad = []
    for node in ast.walk(ast.parse(source)):
        names = []
        if isinstance(node, ast.Import):
            names = [a.name for a in node.names]
        elif isinstance(node, ast.ImportFrom) and node.level == 0:
            names = [node.module or ""]
        for n in names:
            top = n.split(".")[0]
            if top not in ALLOWED_TOP or (top == "deckload" and not n.startswith("deckload.core")):
                bad.append(f"{name}:{node.lineno} imports {n}")
        if isinstance(node, ast.Call):
            fn = node.func
            if isinstance(fn, ast.Name) and fn.id in FORBIDDEN_CALLS:
                bad.append(f"{name}:{node.lineno} calls {fn.id}()")
            if isinstance(fn, ast.Attribute) and fn.attr in FORBIDDEN_ATTRS:
                bad.append(f"{name}:{node.lineno} calls .{fn.attr}()")
    return bad


def test_core_is_pure():
    bad = [p for f in _modules() for p in _impurities(f.read_text(encoding="utf-8"), f.name)]
    assert bad == []


def test_purity_check_catches_each_kind_of_breach():
    """The checker itself must be able to fail."""
    src = "import textual\nfrom rich import print\nimport deckload.io.profiles\nopen('x')\nimport time\ntime.time()\n"
    found = _impurities(src, "bad.py")
    assert sorted(found) == [
        "bad.py:1 imports textual",
        "bad.py:2 imports rich",
        "bad.py:3 imports deckload.io.profiles",
        "bad.py:4 calls open()",
        "bad.py:5 imports time",
        "bad.py:6 calls .time()",
    ]
