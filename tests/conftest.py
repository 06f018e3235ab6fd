"""Settings and fixtures shared by every test (DEVELOPERS.md, "Tests": how the suite stays fast).

Every test gets its own per-user data folder (``DECKLOAD_HOME`` in a fresh temporary folder):
nothing a test does reaches the real ``~/.local/share/deckload``, and tests running side by side in
several worker processes (pytest-xdist, ``-n auto`` in pyproject.toml) never share one.  A test that
sets ``DECKLOAD_HOME`` itself (monkeypatch) still wins.  The demo vessels, read once per process,
are in ``tests/demo_vessels.py`` (plain functions, so helpers that are not fixtures use them too).

After collection, everything alive (the modules of deckload, textual, numpy, hypothesis, trimesh and
the tests) is moved out of the garbage collector's sight (``gc.freeze``): it lives to the end of the
run anyway, and every full collection would otherwise walk it again (full collections took about a
fifth of the screen tests' CPU; freezing took about a third off that).
"""

from __future__ import annotations

import atexit
import gc
import os
import shutil
import tempfile

import pytest
import textual._wait
import textual.screen

# The suite never reads or writes the user's cache of validated profiles (deckload.io.profile_cache):
# a test's result must not depend on what an earlier run left in ~/.local/share/deckload.  Each test
# process has a fresh cache folder of its own instead, shared by its tests and the programs they
# start: the command-line and screen tests read the demo profiles some 200 times, and each read from
# the files (about 0.3 s of CPU) became one read and then ~3 ms hits (DEVELOPERS.md, "How the suite
# stays fast").  An entry is used only for the same bytes of every file read and the same program
# sources, so sharing it is what the program does for its user.  The cache's own tests
# (tests/test_profile_cache.py) keep it in each test's data folder.  The cache and the tests' data
# folders live in one scratch folder per process, removed when it ends.
_SCRATCH = tempfile.mkdtemp(prefix="deckload-tests-")
atexit.register(shutil.rmtree, _SCRATCH, True)
os.environ["DECKLOAD_CACHE_DIR"] = os.path.join(_SCRATCH, "profile-cache")


# textual's pilot, after every key it presses and in ``pause()``, waits until the process looks idle:
# it sleeps SLEEP_GRANULARITY (20 ms in textual 8.2) again and again until one such sleep used less
# than SLEEP_IDLE (a twentieth of it) of CPU.  Each key therefore costs at least two 20 ms sleeps,
# and more than half of a screen test's wall clock was this sleeping (cProfile: 1.8 s of 3.7 s in
# ``epoll`` for a 30-key test).  The sleep must outlast a screen's update period (a change of
# layout is applied on the screen's next update, 1/60 s after it is asked for: textual's 20 ms does),
# or "idle" is seen before the update runs.  So both are a tenth of textual's: the screens update
# within 1.5 ms, and the pilot's test of idleness runs on 2 ms (still under a twentieth of it busy).
# A key costs its own work and about three such sleeps.  The whole suite took 74 s instead of 113 s
# of wall clock at a quarter, and 2 ms took another 5–7 s off (DEVELOPERS.md, "How the suite stays
# fast").  The pilot's deterministic part (every message queued before the wait is handled) is as it was.
textual.screen.UPDATE_PERIOD = 0.0015
textual._wait.SLEEP_GRANULARITY = 0.002
textual._wait.SLEEP_IDLE = textual._wait.SLEEP_GRANULARITY / 20.0


def pytest_xdist_auto_num_workers(config):
    """``-n auto``: three worker processes for two cores this process may use (half as many again as
    cores, rounded up).  A screen test spends much of its wall clock asleep in the pilot's idle wait
    above, and a third worker fills those gaps: the whole suite took 41–42 s with three or four
    workers against 44–45 s with two, on this two-core machine (DEVELOPERS.md, "How the suite stays
    fast")."""
    cores = len(os.sched_getaffinity(0)) if hasattr(os, "sched_getaffinity") else (os.cpu_count() or 1)
    return -(-3 * cores // 2)


def pytest_collection_modifyitems(session, config, items):
    """Hand the files with a ``long`` test to the workers first, then the rest by number of tests.

    With ``--dist loadfile`` a file is one unit of work, and pytest-xdist's own order (most tests
    first) left the files of one long test for the end: the power-cut run (about 5 s) started when
    the other workers had nearly finished, and the run ended on it alone.  ``--no-loadscope-reorder``
    (pyproject.toml) makes xdist keep this order.  Within a file the order is unchanged."""
    files: dict[str, list[pytest.Item]] = {}
    for item in items:
        files.setdefault(item.nodeid.split("::", 1)[0], []).append(item)

    def rank(group: list[pytest.Item]) -> tuple[bool, int]:
        return (not any(i.get_closest_marker("long") for i in group), -len(group))

    items[:] = [item for group in sorted(files.values(), key=rank) for item in group]


def pytest_collection_finish(session):
    gc.collect()
    gc.freeze()


@pytest.fixture(autouse=True)
def _own_data_home(monkeypatch):
    # A fresh folder per test, made in one step: pytest's numbered ``mktemp`` lists every folder
    # made before it to pick the next number, a cost that grows with each test (1500 empty tests
    # in one process: 7.4 s with it, 3.6 s with this).
    monkeypatch.setenv("DECKLOAD_HOME", tempfile.mkdtemp(prefix="home-", dir=_SCRATCH))
    # ``deckload --no-cache`` run in-process sets DECKLOAD_NO_CACHE for the rest of the process;
    # monkeypatch puts back what was there before each test, so it ends with the test.
    monkeypatch.delenv("DECKLOAD_NO_CACHE", raising=False)
