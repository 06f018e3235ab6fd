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

import gc
import os

import pytest

# The suite never reads or writes the user's cache of validated profiles (deckload.io.profile_cache):
# a test's result must not depend on what an earlier run left in ~/.local/share/deckload.  The
# cache's own tests (tests/test_profile_cache.py) turn it on with a data folder of their own.
os.environ["DECKLOAD_NO_CACHE"] = "1"


def pytest_collection_finish(session):
    gc.collect()
    gc.freeze()


@pytest.fixture(autouse=True)
def _own_data_home(tmp_path_factory, monkeypatch):
    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path_factory.mktemp("deckload-home")))
