"""Run mutmut's mutants of one module inside ONE pytest session, by hand (never in CI).

Usage, from inside the ``mutants/`` folder that ``mutmut run`` prepared (mutants generated and
its test statistics collected)::

    cd mutants
    PYTHONPATH=$PWD:$PWD/tests python ../tests/tools/mutants_in_one_session.py \\
        deckload.core.verdict verdict.json [--fresh | --recheck-survivors] [--cap S] [FUNCTION_PREFIX ...]

It collects the tests mutmut's statistics say reach the module once, runs them once unmutated
(they must pass), and then, for every mutant (or only those whose function starts with a given
prefix, e.g. ``x_stage_curve``), sets ``MUTANT_UNDER_TEST`` (mutmut's trampoline reads it on every
call) and runs the tests that reach the mutated function through pytest's own test protocol,
stopping at the first failure.  Tests that already killed a mutant of the same function go first,
then the rest fastest first, so a kill usually costs one test.  Every fixture is torn down after
each mutant, so nothing a fixture built under one mutant is seen by the next.  A test that uses
more than twenty times its unmutated CPU time (plus 10 s of CPU; CPU, not wall time, so a niced run
on a loaded machine is not cut short) is stopped and recorded as ``timeout``, which counts as a
kill as in mutmut (the suite would hang).  Results go to the JSON file as they come (``killed``,
``timeout``, ``survived``, ``no tests``), so a run can be stopped and resumed.  It replaces an earlier tool that started a new
pytest session per mutant (collection and fixture set-up again each time), which was several times
slower.

``--cap S`` bounds what a survivor costs where many slow tests reach a function: only the tests
that killed some mutant of the module, then the fastest, up to S seconds of their unmutated CPU
time, are run; a mutant that passes them is recorded as ``survived capped`` (not a verdict: re-run
them without the cap with ``--recheck-survivors``).

Caches in the process (the demo vessels and the audit tests' box vessel read once,
``tests/demo_vessels.py``, ``tests/fv22_audit.py``; the per-tank
``lru_cache`` in ``core.free_surface``): by default they keep what the unmutated run filled, so a
mutant in code that only runs while a cache fills (reading a profile) can be hidden (a false
"survived", never a false kill); ``--fresh`` clears them before every mutant, which is slower but
hides nothing; ``--recheck-survivors`` runs only the survivors recorded in the JSON file again
that way.  A survivor can also be checked in a fresh process
(``MUTANT_UNDER_TEST=<name> python -m pytest -x -n0 <tests>``).
"""

from __future__ import annotations

import functools
import gc
import json
import os
import signal
import sys
import time
from pathlib import Path

import pytest
from _pytest.runner import runtestprotocol


class MutantTimeout(BaseException):
    """Raised by the CPU-time alarm inside a test that ran too long (BaseException: no ``except Exception``
    in the program under test can swallow it)."""


_FIRED = [False]
"""Set by the alarm: whatever exception its raise turns into (below) is then the timeout."""


def _alarm(signum, frame):  # noqa: ARG001 - signal handler signature
    _FIRED[0] = True
    raise MutantTimeout


def _clear_caches() -> None:
    for obj in gc.get_objects():
        if isinstance(obj, functools._lru_cache_wrapper):
            mod = getattr(obj, "__module__", "") or ""
            if mod.startswith(("deckload", "demo_vessels", "fv22_audit", "tests")):
                obj.cache_clear()


class Loop:
    def __init__(self, module: str, out: Path, prefixes: tuple[str, ...], fresh: bool,
                 recheck: bool = False, cap_s: float | None = None) -> None:
        stats = json.loads(Path("mutmut-stats.json").read_text())
        self.tests = stats["tests_by_mangled_function_name"]
        self.duration = stats["duration_by_test"]
        meta = json.loads(Path(module.replace(".", "/") + ".py.meta").read_text())
        self.names = [n for n in meta["exit_code_by_key"] if not prefixes or n.startswith(prefixes)]
        self.module, self.out, self.fresh, self.cap_s = module, out, fresh or recheck, cap_s
        self.recheck = recheck
        self.done = json.loads(out.read_text()) if out.exists() else {}
        if recheck:
            # Run the survivors again with every cache cleared before each: a survivor that a
            # cache hid is killed now.
            # They keep their old state until their new one is written (an interrupted recheck
            # loses nothing).
            self.names = [n for n in self.names if self.done.get(n) in ("survived", "survived capped")]
        self.killers_file = out.with_suffix(".killers.json")
        self.killers: dict[str, list[str]] = (json.loads(self.killers_file.read_text())
                                              if self.killers_file.exists() else {})
        self.timed_out = False
        self.base_s: dict[str, float] = {}

    def node_files(self) -> list[str]:
        nodes = {t for n in self.names for t in self.tests.get(self.function(n), [])}
        return sorted({t.split("::")[0] for t in nodes})

    @staticmethod
    def function(name: str) -> str:
        return name.rpartition("__mutmut_")[0]

    def _run(self, session, items: list, stop_at_failure: bool, limit: bool) -> str | None:
        """Run ``items`` through pytest's protocol; return the node id of the first failure."""
        failed = None
        try:
            for i, item in enumerate(items):
                nxt = items[i + 1] if i + 1 < len(items) else None
                _FIRED[0] = False
                if limit:
                    # CPU seconds, not wall: a run niced under a loaded machine is not cut short.
                    signal.setitimer(signal.ITIMER_PROF, 20.0 * self.base_s.get(item.nodeid, 1.0) + 10.0)
                try:
                    reports = runtestprotocol(item, nextitem=nxt, log=False)
                except BaseException:
                    # The alarm can land outside the test's own call, in pytest's reporting, and
                    # inside C code (ast.parse formatting a traceback) its raise comes out as a
                    # SystemError: whatever escapes after it fired is the timeout.
                    if not _FIRED[0]:
                        raise
                    self.timed_out = True
                    failed = item.nodeid
                    break
                finally:
                    signal.setitimer(signal.ITIMER_PROF, 0)
                if any(r.failed for r in reports):
                    if any(r.failed and "MutantTimeout" in str(r.longrepr) for r in reports):
                        self.timed_out = True
                    failed = failed or item.nodeid
                    if stop_at_failure:
                        break
        finally:
            session._setupstate.teardown_exact(None)
        return failed

    def runtestloop(self, session) -> bool:
        signal.signal(signal.SIGPROF, _alarm)
        by_id = {item.nodeid: item for item in session.items}
        wanted = sorted({t for n in self.names for t in self.tests.get(self.function(n), []) if t in by_id},
                        key=lambda t: self.duration.get(t, 0.0))
        os.environ["MUTANT_UNDER_TEST"] = ""
        bad = []
        for t in wanted:
            started = time.process_time()
            if self._run(session, [by_id[t]], True, False):
                bad.append(t)
            self.base_s[t] = time.process_time() - started
        if bad:
            print("the unmutated code fails its own tests, so nothing is measured:", *bad, sep="\n  ",
                  file=sys.stderr)
            session.shouldfail = True
            return True
        for name in self.names:
            if name in self.done and not self.recheck:
                continue
            fn = self.function(name)
            nodes = [t for t in self.tests.get(fn, []) if t in by_id]
            if not nodes:
                self.done[name] = "no tests"
            else:
                first = [t for t in self.killers.get(fn, []) if t in nodes]
                rest = sorted((t for t in nodes if t not in first), key=lambda t: self.base_s.get(t, 0.0))
                capped = False
                if self.cap_s is not None:
                    # The tests that killed any mutant of this module first, then the fastest,
                    # up to cap_s of their unmutated CPU time.
                    known = {t for ks in self.killers.values() for t in ks}
                    rest = [t for t in rest if t in known] + [t for t in rest if t not in known]
                    kept, spent = [], 0.0
                    for t in first + rest:
                        if spent > self.cap_s:
                            capped = True
                            break
                        kept.append(t)
                        spent += self.base_s.get(t, 0.0)
                    first, rest = kept, []
                if self.fresh:
                    _clear_caches()
                started = time.perf_counter()
                os.environ["MUTANT_UNDER_TEST"] = name
                self.timed_out = False
                try:
                    killer = self._run(session, [by_id[t] for t in first + rest], True, True)
                finally:
                    os.environ["MUTANT_UNDER_TEST"] = ""
                if killer and self.timed_out:
                    self.done[name] = "timeout"
                elif killer:
                    self.done[name] = "killed"
                    ks = self.killers.setdefault(fn, [])
                    if killer in ks:
                        ks.remove(killer)
                    ks.insert(0, killer)
                else:
                    self.done[name] = "survived capped" if capped else "survived"
                print(f"{self.done[name]:9} {name}  {time.perf_counter() - started:.1f} s", flush=True)
            self.out.write_text(json.dumps(self.done, indent=0))
            self.killers_file.write_text(json.dumps(self.killers))
        if self.fresh:
            _clear_caches()
        counts: dict[str, int] = {}
        for state in self.done.values():
            counts[state] = counts.get(state, 0) + 1
        print(f"{self.module}: {len(self.done)} mutants: "
              + ", ".join(f"{v} {k}" for k, v in sorted(counts.items())), flush=True)
        return True


class Plugin:
    def __init__(self, loop: Loop) -> None:
        self.loop = loop

    @pytest.hookimpl(tryfirst=True)
    def pytest_runtestloop(self, session):
        return self.loop.runtestloop(session)


def main(argv: list[str]) -> int:
    fresh, recheck = "--fresh" in argv, "--recheck-survivors" in argv
    cap_s = None
    if "--cap" in argv:
        i = argv.index("--cap")
        cap_s = float(argv[i + 1])
        del argv[i:i + 2]
    argv = [a for a in argv if a not in ("--fresh", "--recheck-survivors")]
    if len(argv) < 2:
        print(__doc__)
        return 2
    module, out = argv[0], Path(argv[1])
    loop = Loop(module, out, tuple(f"{module}.{p}" for p in argv[2:]), fresh, recheck, cap_s)
    # A property test that fails under a mutant would otherwise spend its time shrinking the
    # example (tens of seconds, then a timeout): a failure is all a kill needs.  Loaded before the
    # test modules are imported, so their @settings inherit it.
    from hypothesis import Phase, settings

    settings.register_profile("mutants", phases=(Phase.explicit, Phase.reuse, Phase.generate), database=None)
    settings.load_profile("mutants")
    files = loop.node_files()
    if not files:
        print(f"{module}: no selected test reaches it")
        return 0
    return int(pytest.main(files + ["-q", "-p", "no:cacheprovider", "-n0"],
                           plugins=[Plugin(loop)]))


if __name__ == "__main__":
    raise SystemExit(main(sys.argv[1:]))
