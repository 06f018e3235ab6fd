"""Leaving the loading screen without losing a change unseen (textual pilot, on the analytic box
barge): closed by a signal, quitting after a save that failed, and a second window on the same
vessel, which saves nothing.  The process itself on a real terminal: test_screen_in_a_terminal.py.
"""

from __future__ import annotations

import signal

import pytest

from deckload.core.model import Condition, TankFill
from deckload.io.profiles import load_condition
from deckload.logbook import Logbook
from deckload.ui.launch import create_app
from deckload.ui.widgets import LinePanel
from vessel_factories import barge_tanks, box_barge


def _condition() -> Condition:
    return Condition(name="Pilot", tanks=(TankFill("DB1P", "percent", 50.0),))


def panel(app, name: str) -> str:
    return app.screen.query_one(f"#{name}", LinePanel).plain()


async def type_amount(pilot, text: str) -> None:
    await pilot.press("enter")
    await pilot.press(*text, "enter")
    await pilot.pause()


def _log_changes(logs, vessel) -> list[str]:
    with Logbook.open(logs, vessel.particulars.name, readonly=True) as book:
        return [e.change_text for e in book.entries()]


@pytest.mark.parametrize("sig, status", [(signal.SIGTERM, 143), (signal.SIGHUP, 129), (signal.SIGINT, 130)])
async def test_a_signal_writes_the_held_run_saves_and_leaves_with_128_plus_its_number(tmp_path, sig, status):
    """A retype is a run (its log entry waits RUN_PAUSE_S for more); a signal in that pause, with a
    form open, still writes it, saves the condition, ends the writer thread and exits 128 + n."""
    vessel = box_barge(tanks=barge_tanks())
    app = create_app(vessel, _condition(), work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        await type_amount(pilot, "55%")
        assert _log_changes(tmp_path / "logs", vessel) == []  # held back: a run waits for more
        await pilot.press("enter")  # a form open over the screen does not stop it
        app.close_on_signal(sig)
        app.close_on_signal(signal.SIGTERM)  # a second signal while closing changes nothing
        await pilot.pause()
    assert app.return_code == status and app.closed_by_signal == sig
    assert _log_changes(tmp_path / "logs", vessel) == ["DB1P 50 % → 55 %, 14.8 t → 16.2 t"]
    saved = load_condition(app.session.save_path, vessel)
    assert saved.tank_fill("DB1P") == TankFill("DB1P", "percent", 55.0)
    assert app.session._writer is None  # joined when the screen went
    assert app.exit_problems == []


def _unwritable_work_dir(tmp_path):
    """A working folder that cannot be made (its parent is a file): every save fails with an OSError,
    whoever runs the test (root ignores permissions)."""
    blocker = tmp_path / "blocker"
    blocker.write_text("not a folder", encoding="utf-8")
    return blocker, blocker / "work"


async def test_quit_after_a_failed_save_warns_naming_the_file_and_leaves_on_the_second(tmp_path):
    vessel = box_barge(tanks=barge_tanks())
    blocker, work = _unwritable_work_dir(tmp_path)
    app = create_app(vessel, _condition(), work_dir=work, log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        await type_amount(pilot, "55%")
        app.session.flush()
        await pilot.pause()
        assert "NOT SAVED" in panel(app, "titlebar")  # lasting, while the newest condition is in no file
        await pilot.press("q")
        await pilot.pause()
        assert app.is_running
        status = panel(app, "status").replace("\n  ", " ")
        assert status.strip().startswith("✖ Condition on screen NOT SAVED: quit again to leave anyway")
        assert str(app.session.save_path)[:40] in status  # where it could not be saved (cut at its end)
        assert str(app.session.save_path) in app.session.unsaved
        # A further change after the warning warns again; a save that lands clears it.
        await pilot.press("plus")
        await pilot.press("q")
        await pilot.pause()
        assert app.is_running
        blocker.unlink()
        await pilot.press("plus")
        app.session.flush()
        await pilot.pause()
        assert app.session.unsaved is None and "NOT SAVED" not in panel(app, "titlebar")
        assert load_condition(app.session.save_path, vessel).tank_fill("DB1P") == TankFill("DB1P", "percent", 57.0)
        await pilot.press("q")
        await pilot.pause()
    assert not app.is_running and app.return_code == 0


def _app_that_cannot_save(tmp_path):
    _, work = _unwritable_work_dir(tmp_path)
    return create_app(box_barge(tanks=barge_tanks()), _condition(), work_dir=work, log_dir=tmp_path / "logs",
                      officer="TS")


async def test_quit_again_after_the_warning_leaves(tmp_path):
    app = _app_that_cannot_save(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await type_amount(pilot, "55%")
        await pilot.press("q")
        await pilot.pause()
        assert app.is_running
        await pilot.press("q")
        await pilot.pause()
    assert not app.is_running and app.return_code == 0


async def test_a_signal_after_a_failed_save_leaves_and_says_it_was_not_saved(tmp_path):
    app = _app_that_cannot_save(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await type_amount(pilot, "55%")
        app.close_on_signal(signal.SIGTERM)
        await pilot.pause()
    assert app.return_code == 143
    assert len(app.exit_problems) == 1 and "NOT SAVED" in app.exit_problems[0]
    assert str(app.session.save_path) in app.exit_problems[0]


@pytest.mark.parametrize("width", [80])  # the narrow title, where the mark must still show
async def test_a_second_window_on_the_vessel_says_for_as_long_as_it_is_open_that_it_saves_nothing(tmp_path, width):
    """The first window holds the log's writer lock and owns the working file; the second says
    NOT SAVING in its title from the start and after every edit (not only in a notice that goes),
    and quitting it after an edit warns first; no file holds its edit."""
    vessel = box_barge(tanks=barge_tanks())
    logs = tmp_path / "logs"
    with Logbook.open(logs, vessel.particulars.name):  # the first window's lock
        app = create_app(vessel, _condition(), work_dir=tmp_path / "work", log_dir=logs, officer="TS")
        async with app.run_test(size=(width, 40)) as pilot:
            assert app.session.save_path is None
            assert "NOT SAVING" in panel(app, "titlebar")
            await pilot.press("q")  # nothing changed here: nothing to lose, it leaves at once
            await pilot.pause()
        assert not app.is_running

        app = create_app(vessel, _condition(), work_dir=tmp_path / "work", log_dir=logs, officer="TS")
        async with app.run_test(size=(width, 40)) as pilot:
            await type_amount(pilot, "55%")
            await pilot.pause(0.2)
            title = panel(app, "titlebar")
            assert "NOT SAVING" in title and title.index("NOT SAVING") < title.index("undo")
            assert "not saved: this window saves nothing" in " ".join(panel(app, "status").split())
            await pilot.press("q")
            await pilot.pause()
            assert app.is_running
            status = panel(app, "status").replace("\n  ", " ")
            assert "NOT SAVED: quit again to leave anyway" in status
            assert "another deckload has this vessel open" in app.session.unsaved
            await pilot.press("q")
            await pilot.pause()
        assert not app.is_running and app.return_code == 0
    assert not (tmp_path / "work").exists() or not any((tmp_path / "work").rglob("*.toml"))
