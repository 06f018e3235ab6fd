"""The log screen's date fields and an opened entry as a real terminal shows them (found by a
real-terminal trial on the Demo Trawler): the 'from' field read '026-12-03' after Tab, and an
opened entry at 100×30 read 'Margin to the mark (+ below)-0.075 m', its verdict wrapped twice
into fragments and its deadweight by kind carried on at column 1."""

from __future__ import annotations

import dataclasses
import re
from datetime import datetime, timedelta, timezone

import pytest
from textual.app import App
from textual.widgets import Input

from deckload.core.stability import evaluate
from deckload.logbook import Logbook
from deckload.ui.log_screen import EntryScreen, LogScreen, entry_details
from demo_vessels import trawler_vessel
from deckload.io import paths
from deckload.io.profiles import load_condition


class _Clock:
    def __init__(self):
        self.t = datetime(2026, 12, 3, 9, 0, tzinfo=timezone.utc)

    def __call__(self):
        self.t += timedelta(minutes=7)
        return self.t


@pytest.fixture
def book(tmp_path):
    """A trawler's log with a departure entry and an edit, as the screen writes them."""
    vessel = trawler_vessel()
    condition = load_condition(paths.TRAWLER_CONDITIONS["departure"], vessel)
    book = Logbook.open(tmp_path, vessel.particulars.name, ship_offset="+00:00", clock=_Clock())
    book.append(kind="condition", by="JK", change_text="condition recorded: departure", change_data={},
                result=evaluate(vessel, condition), condition=condition)
    heavier = condition.replace(holds=tuple(dataclasses.replace(h, mass_t=45.0) for h in condition.holds))
    book.append(kind="edit", by="JK", change_text="FH 10 t → 45 t", change_data={"hold": "FH"},
                result=evaluate(vessel, heavier), condition=heavier)
    yield book, vessel
    book.close()


class _Host(App):
    def __init__(self, book, vessel):
        super().__init__()
        self.book, self.vessel = book, vessel

    def on_mount(self):
        self.push_screen(LogScreen(self.book, self.vessel))


def _rows(app) -> list[str]:
    return ["".join(seg.text for seg in strip) for strip in app.screen._compositor.render_strips()]


@pytest.mark.parametrize("size", [(80, 24), (100, 30)])
async def test_a_typed_date_shows_all_ten_characters_after_tab(book, size):
    app = _Host(*book)
    async with app.run_test(size=size) as pilot:
        await pilot.pause()
        await pilot.press("d")
        assert isinstance(app.focused, Input) and app.focused.id == "log-from"
        await pilot.press(*"2026-12-03", "tab")
        await pilot.pause()
        assert app.focused.id == "log-to"
        await pilot.press(*"2026-12-04")  # the 'to' field with the cursor after its last character
        await pilot.pause()
        for name, typed in (("#log-from", "2026-12-03"), ("#log-to", "2026-12-04")):
            field = app.screen.query_one(name, Input)
            assert field.region.right <= size[0] - 1  # the field whole on the screen, its edge too
            row = _rows(app)[field.region.y + 1][field.region.x: field.region.right]  # inside the border
            assert typed in row, (name, row)


def _painted(widget) -> list[str]:
    """A widget's lines as textual paints them (the whole widget, wherever its box is scrolled)."""
    from textual.geometry import Region

    return ["".join(seg.text for seg in strip)
            for strip in widget.render_lines(Region(0, 0, widget.size.width, widget.size.height))]


@pytest.mark.parametrize("size", [(80, 24), (100, 30), (120, 40)])
async def test_an_opened_entry_keeps_its_columns_and_wraps_each_line_once(book, size):
    app = _Host(*book)
    async with app.run_test(size=size) as pilot:
        await pilot.pause()
        await pilot.press("o")
        await pilot.pause()
        assert isinstance(app.screen, EntryScreen)
        await pilot.pause()
        entry = app.screen.entry
        made = entry_details(entry).plain.splitlines()
        # the lines that start at the box's first column are the entry's own, none a wrapped remnant
        own = {x.split()[0] for x in made if x and not x[0].isspace()}
        summary = app.screen.query_one("#log-entry-summary")
        painted = _painted(summary)
        assert len(painted) >= 10
        for line in painted:
            if line and not line[0].isspace():
                assert line.split()[0] in own, (line, painted)
        text = "\n".join(painted)
        # a label and its value apart ('Margin to the mark (+ below)-0.075 m')
        for label in ("Margin to the mark (+ below)", "Displacement", "GM fluid"):
            found = re.search(re.escape(label) + r"( +)[-+]?\d", text)
            assert found and len(found.group(1)) >= 2, (label, text)
        # every row's value starts in one column, and a row's continuation lines under it
        value_at = {re.match(r"  \S.*?  +(?=\S)", x).end() for x in painted
                    if re.match(r"  (Displacement|Deadweight|Trim|List|GM fluid|Margin to the mark) ", x)}
        assert len(value_at) == 1, painted
        col = value_at.pop()
        at = next(i for i, x in enumerate(painted) if x.startswith("  Deadweight by kind"))
        assert painted[at][col:].startswith("Cargo ")
        dwt = [painted[at][col:]]
        for x in painted[at + 1:]:
            if not x.startswith(" " * col) or not x.strip():
                break
            assert x[col] != " " and not x[col:].startswith("·"), x  # under the first value, whole
            dwt.append(x[col:])
        # each item of the list whole on one line: 'Lube oil 1.28' / 't · Fresh water' was a trial's
        items = [i.strip() for i in " ".join(x.strip() for x in dwt).split("·")]
        for item in items:
            assert any(item in x for x in dwt), (item, dwt)
        # the heading's dates keep their times (no-break spaces): '2026-12-03' / '10:00:00 UTC' was
        assert re.search(r"\d{4}-\d\d-\d\d\u00a0\d\d:\d\d:\d\d UTC", text), text[:300]
        assert all(len(x.rstrip()) <= summary.size.width for x in painted)
