"""Shared by the whole suite (DEVELOPERS.md, "Tests": how the suite stays fast).

Every test gets its own per-user data folder (``DECKLOAD_HOME`` in a fresh temporary folder):
nothing a test does reaches the real ``~/.local/share/deckload``, and tests running side by side in
several worker processes (pytest-xdist, ``-n auto`` in pyproject.toml) never share one.  A test that
sets ``DECKLOAD_HOME`` itself (monkeypatch) still wins.  The demo vessels, read once per process,
are in ``tests/demo_vessels.py`` (plain functions, so helpers that are not fixtures use them too).
"""

from __future__ import annotations

import pytest


@pytest.fixture(autouse=True)
def _own_data_home(tmp_path_factory, monkeypatch):
    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path_factory.mktemp("deckload-home")))
