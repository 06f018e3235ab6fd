"""A line too wide for its panel ends in "…" and never shows part of a number (found by a
real-terminal audit: at 60×20 the board's m³ column read "32" for 32.33 and "12" for 12.52, with
no mark that anything was cut; the README says nothing is cut silently)."""

from __future__ import annotations

import re

import pytest
from rich.text import Text

from deckload.ui.widgets import LoadBoard, fit_width


@pytest.mark.parametrize("width", range(1, 30))
def test_fit_width_never_splits_a_word_and_marks_the_cut(width):
    line = Text("  DB1P      ▕  55.0   32.33   33.14   12.5 ")
    out = fit_width(line, width).plain
    if len(line.plain) <= width:
        assert out == line.plain
        return
    assert len(out) == width and out.endswith("…")
    words = line.plain.split()
    assert all(w in words for w in out[:-1].split())  # each word shown is whole


async def test_the_board_at_60_columns_shows_no_cut_number(tmp_path):
    from deckload.ui.launch import create_app, load_inputs

    start = load_inputs(None, None, tmp_path / "work")
    app = create_app(start.vessel, start.condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(60, 20)) as pilot:
        await pilot.pause()
        board = app.screen.query_one(LoadBoard)
        width = board.scrollable_content_region.width
        cut = 0
        for i, row in enumerate(board.rows[: board.scrollable_content_region.height]):
            shown = "".join(seg.text for seg in board.render_line(i))[:width]
            full = row.text.plain
            if len(full) > width:
                cut += 1
                assert shown.rstrip().endswith("…"), shown
            for m in re.finditer(r"\S+", shown.rstrip("…").rstrip()):
                assert m.group(0) in full.split() or m.group(0) in ("›",), (shown, full)
        assert cut > 0  # the premise: at 60 columns the board's lines are wider than it


def test_fit_width_cuts_a_file_path_where_the_edge_falls():
    """A path split by the edge is cut there, its start kept ("NOT SAVED … File: /tmp/…"): left out
    whole it told nothing of where; a number or an id next to it is still left out whole."""
    line = Text("NOT SAVED. File: /tmp/work/logs/working/demo-islander-cdd36a11ff.condition.toml")
    out = fit_width(line, 40).plain
    assert out == "NOT SAVED. File: /tmp/work/logs/working…" and len(out) == 40
    assert fit_width(Text("GM 0.943 m, DB2P 23.6 t"), 20).plain == "GM 0.943 m, DB2P   …"
