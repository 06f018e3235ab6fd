"""Run mutmut's mutants of one module in ONE Python process, by hand (never in CI).

Usage, from inside the ``mutants/`` folder that ``mutmut run`` prepared (mutants generated and
its test statistics collected)::

    cd mutants
    PYTHONPATH=$PWD:$PWD/tests python ../tests/tools/mutants_in_one_process.py \\
        deckload.core.stability results.json [FUNCTION_PREFIX ...]

For every mutant of the module (or only those whose function name starts with a given prefix,
e.g. ``x_stage_curve``) it sets ``MUTANT_UNDER_TEST`` (mutmut's trampoline reads it on every
call) and runs, with ``pytest.main``, the tests mutmut's statistics say reach the mutated
function, fastest first, stopping at the first failure (``-x``): the same tests ``mutmut run``
would run, without a new process, a new pytest session start-up and re-imports per mutant (about
ten times faster on this project).  Results go to the JSON file as they come (``killed``,
``survived``, ``no tests``), so a run can be stopped and resumed.

What it cannot do: a cache that unmutated code filled in this process (the demo vessels read once
per process, tests/demo_vessels.py) is still seen by later mutants.  That can only hide a mutant
(a false "survived"), never fake a kill; check a survivor in a fresh process before reviewing it
(``MUTANT_UNDER_TEST=<name> python -m pytest -x -n0 <tests>``).  mutmut's own record
(``mutmut results``) does not see these results; tests/mutation_survivors/ records them.
"""

from __future__ import annotations

import contextlib
import io
import json
import os
import sys
import time
from pathlib import Path

import pytest

ARGS = ["-x", "-q", "-p", "no:cacheprovider", "-n0"]


def _run(nodes: list[str]) -> int:
    sink = io.StringIO()
    with contextlib.redirect_stdout(sink), contextlib.redirect_stderr(sink):
        return int(pytest.main(nodes + ARGS))


def main(argv: list[str]) -> int:
    if len(argv) < 2:
        print(__doc__)
        return 2
    module, out = argv[0], Path(argv[1])
    prefixes = tuple(f"{module}.{p}" for p in argv[2:])
    stats = json.loads(Path("mutmut-stats.json").read_text())
    tests, duration = stats["tests_by_mangled_function_name"], stats["duration_by_test"]
    meta = json.loads(Path(module.replace(".", "/") + ".py.meta").read_text())
    names = [n for n in meta["exit_code_by_key"] if not prefixes or n.startswith(prefixes)]
    done = json.loads(out.read_text()) if out.exists() else {}

    os.environ["MUTANT_UNDER_TEST"] = ""
    every = sorted({t for f, ts in tests.items() if f.startswith(module + ".") for t in ts},
                   key=lambda t: duration.get(t, 0.0))
    if every and _run(every) != 0:
        print("the unmutated code fails its own tests: nothing to measure", file=sys.stderr)
        return 1
    for name in names:
        if name in done:
            continue
        nodes = sorted(tests.get(name.rpartition("__mutmut_")[0], []), key=lambda t: duration.get(t, 0.0))
        if not nodes:
            done[name] = "no tests"
        else:
            started = time.perf_counter()
            os.environ["MUTANT_UNDER_TEST"] = name
            rc = _run(nodes)
            os.environ["MUTANT_UNDER_TEST"] = ""
            done[name] = {0: "survived", 1: "killed"}.get(rc, f"pytest exit {rc}")
            print(f"{done[name]:9} {name}  {time.perf_counter() - started:.1f} s", flush=True)
        out.write_text(json.dumps(done, indent=0))
    counts: dict[str, int] = {}
    for name in names:
        counts[done[name]] = counts.get(done[name], 0) + 1
    print(f"{module}: {len(names)} mutants: " + ", ".join(f"{v} {k}" for k, v in sorted(counts.items())))
    return 0


if __name__ == "__main__":
    raise SystemExit(main(sys.argv[1:]))
