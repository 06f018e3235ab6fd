"""The voyage-log screen, driven by keys through textual's pilot."""

from __future__ import annotations

from datetime import date, datetime, timedelta, timezone

import pytest
from textual.app import App
from textual.widgets import DataTable, Input, Static

from deckload.core.model import Condition, MassItem, TankFill
from deckload.core.stability import evaluate
from deckload.logbook import Logbook
from deckload.ui.log_screen import EntryScreen, LogScreen, RestoreRequest, parse_day, select_entries
from vessel_factories import barge_tanks, box_barge


class DayClock:
    """Each append lands 9 hours after the previous one (so entries span several days)."""

    def __init__(self):
        self.t = datetime(2026, 12, 1, 6, 0, tzinfo=timezone.utc)

    def __call__(self):
        self.t += timedelta(hours=9)
        return self.t


@pytest.fixture
def filled(tmp_path):
    vessel = box_barge(tanks=barge_tanks(), name="Demo Islander")
    book = Logbook.open(tmp_path, "Demo Islander", ship_offset="+00:00", clock=DayClock())
    conds = []
    for i, (kind, pct) in enumerate([("condition", 40.0), ("ballast", 60.0), ("transfer", 20.0),
                                     ("condition", 80.0), ("remark", None)]):
        if pct is None:
            book.append(kind=kind, by="AB", change_text="pilot boarded [/]", change_data={}, result=None,
                        condition=None)
            conds.append(None)
            continue
        c = Condition(name=f"Condition {i + 1}", tanks=(TankFill("DB1P", "percent", pct),),
                      constants=(MassItem("Crew", 1.2, 30.0, 6.0),))
        book.append(kind=kind, by="JM", change_text=f"{kind} step {i + 1}", change_data={"pct": pct},
                    result=evaluate(vessel, c), condition=c)
        conds.append(c)
    yield book, vessel, conds
    book.close()


class Host(App):
    def __init__(self, book, vessel):
        super().__init__()
        self.book, self.vessel = book, vessel
        self.answers: list = []

    def on_mount(self):
        self.push_screen(LogScreen(self.book, self.vessel), callback=self.answers.append)


def rows(screen) -> list[str]:
    t = screen.query_one("#log-table", DataTable)
    return [str(t.get_row_at(i)[0]) for i in range(t.row_count)]


def test_select_entries_by_kind_and_ship_date(filled):
    book, _, _ = filled
    es = book.entries()
    # ship's times (offset +00:00): 12-01 15:00, 12-02 00:00, 12-02 09:00, 12-02 18:00, 12-03 03:00
    assert [e.seq for e in select_entries(es, day_from=date(2026, 12, 2), day_to=date(2026, 12, 2))] == [2, 3, 4]
    assert [e.seq for e in select_entries(es, kind="condition")] == [1, 4]
    assert [e.seq for e in select_entries(es, kind="condition", day_from=date(2026, 12, 2))] == [4]
    with pytest.raises(ValueError, match="YYYY-MM-DD"):
        parse_day("2.12.2026")


@pytest.mark.long
async def test_log_screen_lists_filters_opens_and_restores(filled):
    book, vessel, conds = filled
    app = Host(book, vessel)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, LogScreen)
        assert rows(screen) == ["1", "2", "3", "4", "5"]
        table = screen.query_one("#log-table", DataTable)
        assert table.cursor_row == 4  # newest selected
        # the row shows GM fluid and the verdict from the stored summary
        row4 = table.get_row_at(3)
        assert str(row4[5]) == f"{book.entries()[3].gm_fluid_m:.3f}" and str(row4[6]) == "met, n/a A2.2"  # the set assessed; A 2.3 not (the barge has no windage data)
        # the entry's details give the verdict as recorded: the set, and what was not assessed and why
        from deckload.ui.log_screen import entry_details

        details = " ".join(entry_details(book.entries()[3]).plain.split())
        assert ("Verdict: Met where assessable, 1 set of criteria not assessed — assessed: "
                "IS Code 2008 Part A 2.2 general criteria.") in details
        assert "IS Code 2008 Part A 2.3 weather criterion (the profile has no windage data)" in details
        assert "all met" not in details.lower()

        await pilot.press("k")  # condition
        assert rows(screen) == ["1", "4"]
        await pilot.press("k")  # transfer
        assert rows(screen) == ["3"]
        await pilot.press("c")
        assert rows(screen) == ["1", "2", "3", "4", "5"]

        await pilot.press("d")
        assert isinstance(app.focused, Input) and app.focused.id == "log-from"
        await pilot.press(*"2026-12-02", "enter")
        assert rows(screen) == ["2", "3", "4", "5"]
        await pilot.press(*"2026-12-02", "enter")
        assert rows(screen) == ["2", "3", "4"]
        assert isinstance(app.focused, DataTable)

        # open the entry under the cursor (the newest shown: #4) read-only, by o and by enter
        await pilot.press("o")
        await pilot.pause()
        assert isinstance(app.screen, EntryScreen)
        await pilot.press("escape")
        await pilot.pause()
        await pilot.press("enter")
        await pilot.pause()
        assert isinstance(app.screen, EntryScreen)
        summary = str(app.screen.query_one("#log-entry-summary", Static).render())
        e4 = book.entries()[3]
        assert "Entry #4" in summary and f"{e4.gm_fluid_m:.3f} m" in summary
        condition_text = str(app.screen.query_one("#log-entry-condition", Static).render())
        assert 'name = "Condition 4"' in condition_text
        await pilot.press("escape")
        await pilot.pause()
        assert app.screen is screen

        # restore #3: the screen hands the condition back, it does not write the log
        await pilot.press("up")
        n_before = len(book.entries())
        await pilot.press("r")
        await pilot.pause()
        assert app.answers == []  # the first r only asks
        assert any("Press r again" in str(n.message) for n in app._notifications)
        await pilot.press("r")
        await pilot.pause()
        assert len(app.answers) == 1
        req = app.answers[0]
        assert isinstance(req, RestoreRequest) and req.entry_seq == 3
        assert req.condition == conds[2]
        assert req.change_data["restored_sha256"] == book.entries()[2].sha256
        assert len(book.entries()) == n_before


async def test_restoring_an_entry_without_a_condition_says_so(filled):
    book, vessel, _ = filled
    app = Host(book, vessel)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        await pilot.press("r")  # newest entry is a remark
        await pilot.pause()
        assert isinstance(app.screen, LogScreen) and app.answers == []
        assert any("holds no loading condition" in str(n.message) for n in app._notifications)
        await pilot.press("escape")
        await pilot.pause()
        assert app.answers == [None]


async def test_verify_key_and_a_condition_that_no_longer_fits_the_profile(filled):
    book, _, _ = filled
    other = box_barge(name="Demo Islander")  # same name, but no tanks: DB1P is unknown to it
    app = Host(book, other)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        await pilot.press("v")
        await pilot.pause()
        assert any("Chain intact: 5 entries" in str(n.message) for n in app._notifications)
        await pilot.press("up", "r")
        await pilot.pause()
        assert isinstance(app.screen, LogScreen) and app.answers == []
        msgs = [str(n.message) for n in app._notifications]
        assert any("Entry #4 cannot be restored" in m and "log line 4" in m and "DB1P" in m for m in msgs), msgs


async def test_an_edited_line_is_marked_on_the_screen_as_it_opens(filled):
    """A line changed by hand still reads; the status line says the chain is broken at once,
    before anyone presses v."""
    book, vessel, _ = filled
    app = Host(book, vessel)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        assert "BROKEN" not in str(app.screen.query_one("#log-status", Static).render())
    book.path.write_bytes(book.path.read_bytes().replace(b'"by":"JM"', b'"by":"XY"', 1))
    app = Host(book, vessel)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        status = str(app.screen.query_one("#log-status", Static).render())
        assert "CHAIN BROKEN (1 problem(s))" in status and "press v" in status


async def test_a_filter_key_does_not_verify_the_log_again(filled, monkeypatch):
    """The status line's chain check reads and hashes the whole log: it is made again when the
    log or its head record changes on disk, not on every key that redraws the table."""
    book, vessel, _ = filled
    calls = []
    real = book.verify
    monkeypatch.setattr(book, "verify", lambda: calls.append(1) or real())
    app = Host(book, vessel)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        assert len(calls) == 1
        await pilot.press("k", "k", "c")
        await pilot.pause()
        assert len(calls) == 1
        book.append(kind="remark", by="AB", change_text="a remark", change_data={}, result=None, condition=None)
        app.screen.refresh_entries()
        assert len(calls) == 2
