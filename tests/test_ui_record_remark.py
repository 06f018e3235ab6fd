"""The record form keeps a remark the log would refuse, and takes a pasted remark of several
lines whole; a report that cannot be written names its file (found by a real-terminal audit:
a remark over 2000 characters closed the form with "Not recorded" and was lost, a pasted remark
kept its first line only, and "Report NOT written: Permission denied" named no file)."""

from __future__ import annotations

import pytest
from textual import events
from textual.widgets import Input

from deckload.logbook import Logbook
from deckload.logbook.book import MAX_TEXT_CHARS
from vessel_factories import pilot_app


@pytest.fixture
def app(tmp_path):
    return pilot_app(tmp_path, log_dir=tmp_path / "logs", officer="TS")


def entries(app, tmp_path):
    book = Logbook.open(tmp_path / "logs", app.session.vessel.particulars.name, readonly=True)
    return [(e.kind, e.remark) for e in book.entries()]


async def test_a_remark_too_long_is_refused_in_the_form_and_kept(app, tmp_path):
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("s", "tab")
        field = app.screen.query_one("#record-remark", Input)
        field.value = "x" * (MAX_TEXT_CHARS + 1)
        await pilot.press("enter")
        await pilot.pause()
        assert app.screen.query_one("#record-remark", Input).value == "x" * (MAX_TEXT_CHARS + 1)  # still open, kept
        assert f"at most {MAX_TEXT_CHARS} characters" in str(app.screen.query_one("#form-message").render())
        field.value = "x" * MAX_TEXT_CHARS
        await pilot.press("enter")
        await pilot.pause()
    assert entries(app, tmp_path) == [("condition", "x" * MAX_TEXT_CHARS)]


async def test_a_pasted_remark_of_several_lines_is_taken_whole(app, tmp_path):
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("s", "tab")
        app.screen.query_one("#record-remark", Input).post_message(events.Paste("Bunkered MGO\nat the berth\n\n 40 t"))
        await pilot.pause()
        await pilot.press("enter")
        await pilot.pause()
    assert entries(app, tmp_path) == [("condition", "Bunkered MGO at the berth 40 t")]


async def test_a_report_that_cannot_be_written_names_its_file(app, monkeypatch):
    from deckload.ui.widgets import LinePanel

    def refused(path, data):
        raise PermissionError(13, "Permission denied", str(path))

    monkeypatch.setattr("deckload.io.atomicfile.write_atomic", refused)
    async with app.run_test(size=(200, 40)) as pilot:
        app.screen.action_print_report()
        await pilot.pause()
        said = " ".join(app.screen.query_one("#status", LinePanel).plain().split())
    assert "Report NOT written: " in said and ".html: Permission denied" in said
    assert str(app.session.reports_dir.name) in said
