"""The GZ curve's title keeps every fact and never breaks one inside ("max 0.374 | m at 29.2°")."""

from __future__ import annotations

import pytest

from deckload.core.stability import evaluate
from deckload.io import paths
from deckload.io.profiles import load_condition
from deckload.ui.main_screen import gz_title_lines
from deckload.ui.views import gz_caption
from demo_vessels import demo_vessel


@pytest.mark.parametrize("width", range(24, 80, 3))
def test_the_title_breaks_only_between_its_parts(width):
    v = demo_vessel()
    r = evaluate(v, load_condition(paths.DEMO_CONDITIONS["departure"], v))
    parts = [p.strip() for p in gz_caption(r).plain.split("  ") if p.strip()]
    lines = [ln.plain for ln in gz_title_lines(r, width)]
    assert all(len(ln) <= width for ln in lines)
    got = [p.strip() for ln in lines for p in ln.split("  ") if p.strip()]
    # every fact, whole and in order ("GZ curve" may shorten to "GZ")
    assert [g.replace(" GZ", "GZ") for g in got[1:]] == parts[1:], lines
    assert got[0].startswith("GZ")
