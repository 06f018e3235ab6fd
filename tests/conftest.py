"""Fixtures shared by the whole suite (DEVELOPERS.md, "Tests": how the suite stays fast).

- ``demo_vessel``, ``trawler_vessel``: the demo vessels read once per test process
  (``tests/demo_vessels.py``; the model is immutable, so sharing it is safe).
- Every test gets its own per-user data folder (``DECKLOAD_HOME`` in a fresh temporary folder):
  nothing a test does reaches the real ``~/.local/share/deckload``, and tests running side by side
  in several worker processes (pytest-xdist, ``-n auto`` in pyproject.toml) never share one.  A test
  that sets ``DECKLOAD_HOME`` itself (monkeypatch) still wins.
"""

from __future__ import annotations

import pytest

import demo_vessels


@pytest.fixture(autouse=True)
def _own_data_home(tmp_path_factory, monkeypatch):
    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path_factory.mktemp("deckload-home")))


@pytest.fixture(scope="session")
def demo_vessel():
    return demo_vessels.demo_vessel()


@pytest.fixture(scope="session")
def trawler_vessel():
    return demo_vessels.trawler_vessel()
