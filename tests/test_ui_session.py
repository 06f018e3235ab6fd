"""The loading screen's edit session without the UI: undo/redo, out-of-range, saving, logging."""

from __future__ import annotations

import pytest

from deckload.core.model import Condition, DeckItem, TankFill
from deckload.logbook import Logbook
from deckload.io.profiles import load_condition, save_condition
from deckload.ui.entry import EntryError
from deckload.ui.session import Journal, Session, working_path
from vessel_factories import barge_tanks, box_barge
from demo_vessels import demo_vessel


@pytest.fixture(scope="module")
def vessel():
    return box_barge(tanks=barge_tanks())


def c_with(*fills):
    return Condition(name="Test", tanks=tuple(fills))


def test_undo_and_redo_walk_back_and_forth_through_whole_conditions(vessel, tmp_path):
    c0 = c_with(TankFill("DB1P", "percent", 50.0))
    s = Session(vessel, c0, save_path=tmp_path / "w.condition.toml")
    c1 = c0.with_tank(TankFill("DB1S", "percent", 20.0)).replace(modified_from="Test")  # an edit is marked
    c2 = c1.with_density(1.0)
    s.commit(c1, "DB1S 20%")
    s.commit(c2, "density")
    assert (s.undo_depth, s.redo_depth) == (2, 0)
    s.undo()
    assert s.condition == c1
    s.undo()
    assert s.condition == c0 and not s.can_undo
    with pytest.raises(EntryError, match="Nothing to undo"):
        s.undo()
    s.redo()
    assert s.condition == c1
    s.commit(c1.with_tank(TankFill("FW1C", "percent", 10.0)), "new branch")
    assert not s.can_redo  # a new change drops the redo stack


def test_each_change_is_saved_and_reads_back(vessel, tmp_path):
    path = tmp_path / "work" / "barge.condition.toml"
    s = Session(vessel, c_with(), save_path=path, save=save_condition)
    c1 = c_with(TankFill("DB1P", "sounding_m", 0.4)).replace(modified_from="Test")
    s.commit(c1, "DB1P 0.4m")
    assert load_condition(path, vessel) == c1
    s.undo()
    assert load_condition(path, vessel) == c_with()


def test_displacement_outside_the_tables_keeps_the_last_good_result(vessel, tmp_path):
    """The barge's tables end at Δ = ρ·L·B·3.5 = 1435 t; 2000 t on deck is beyond them."""
    s = Session(vessel, c_with(), save_path=None)
    good = s.result
    heavy = Condition(name="Test", deck_items=(DeckItem("Ingot", 2000.0, 20.0, 5.0),))
    s.commit(heavy, "too heavy")
    assert s.stale and s.result is good and "outside the table" in s.problem
    s.undo()
    assert not s.stale and s.problem is None


def test_condition_the_engine_rejects_is_refused_and_changes_nothing(vessel):
    c0 = c_with(TankFill("DB1P", "percent", 50.0))
    s = Session(vessel, c0, save_path=None)
    with pytest.raises(EntryError, match="Refused by the calculation"):
        s.commit(c_with(TankFill("DB1P", "percent", 150.0)), "bad")
    assert s.condition == c0 and not s.can_undo
    with pytest.raises(EntryError, match="No change"):
        s.commit(c0, "same")


def test_changes_are_logged_under_the_officer_of_the_watch(vessel, tmp_path):
    book = Logbook.open(tmp_path, vessel.particulars.name)
    journal = Journal(book)
    s = Session(vessel, c_with(), save_path=None, journal=journal)
    s.commit(c_with(TankFill("DB1P", "percent", 10.0)), "before signing on")
    assert book.entries() == []  # nobody on watch: nothing written, and the title line says so
    journal.officer = "TS"
    s.commit(c_with(TankFill("DB1P", "percent", 20.0)), "DB1P set to 20%", kind="ballast", data={"tank": "DB1P"})
    s.undo()
    s.record("JM", "departure check")
    kinds = [(e.kind, e.by) for e in book.entries()]
    assert kinds == [("ballast", "TS"), ("edit", "TS"), ("condition", "JM")]
    book.close()


def _writer_session(vessel, tmp_path, officer="TS"):
    """A session writing in the background, with the frame hook and the save under the test's control:
    ``frames`` collects what is to run once a frame is drawn, ``gate`` holds the save until set,
    ``saving`` is set while the writer is inside a save, ``saved`` lists the conditions written."""
    import threading

    book = Logbook.open(tmp_path / "logs", vessel.particulars.name)
    journal = Journal(book)
    journal.officer = officer
    gate, saving, saved, frames = threading.Event(), threading.Event(), [], []

    def slow_save(path, condition):
        saving.set()
        gate.wait(10)
        save_condition(path, condition)
        saved.append(condition)

    path = tmp_path / "work" / "barge.condition.toml"
    s = Session(vessel, c_with(), save_path=path, journal=journal, save=slow_save)
    problems = []
    s.write_in_background(problems.append, after_frame=frames.append)
    return s, book, path, gate, saving, saved, frames, problems


def _frame_drawn(frames):
    for fn in frames:
        fn()
    frames.clear()


def test_queued_saves_coalesce_the_newest_condition_wins_and_every_log_entry_is_kept(vessel, tmp_path):
    """Six logged changes while the first save is stuck on a slow disk: the first save, then ONE save of
    the newest condition (not five); the log gets all six entries in order."""
    s, book, path, gate, saving, saved, frames, problems = _writer_session(vessel, tmp_path)
    conditions = [c_with(TankFill("DB1P", "percent", float(10 * i))).replace(modified_from="Test")
                  for i in range(1, 7)]
    s.commit(conditions[0], "DB1P 10 %")
    assert not saving.is_set() and s.saves_pending == 1  # held until its frame is drawn
    _frame_drawn(frames)
    assert saving.wait(5)  # the writer is now inside the first save, stuck on the gate
    for i, c in enumerate(conditions[1:], start=2):
        s.commit(c, f"DB1P {10 * i} %")
        _frame_drawn(frames)
    assert s.saves_pending == 6
    gate.set()
    assert s.flush() == []
    assert s.saves_pending == 0
    assert saved == [conditions[0], conditions[-1]] and s.saves_written == 2
    assert load_condition(path, vessel) == conditions[-1]
    assert [e.change_text for e in book.entries()] == [f"DB1P {10 * i} %" for i in range(1, 7)]
    assert problems == []
    book.close()


def test_quitting_with_a_save_not_yet_handed_to_the_writer_writes_it(vessel, tmp_path):
    """flush (what quitting calls) writes a change whose frame was never drawn, and waits for it."""
    s, book, path, gate, saving, saved, frames, problems = _writer_session(vessel, tmp_path)
    gate.set()
    c1 = c_with(TankFill("DB1S", "percent", 33.0)).replace(modified_from="Test")
    s.commit(c1, "DB1S 33 %")
    assert frames and not path.exists()
    s.flush()
    assert load_condition(path, vessel) == c1 and s.saves_pending == 0
    assert [e.change_text for e in book.entries()] == ["DB1S 33 %"]
    _frame_drawn(frames)  # the frame's own hand-over, coming late, finds nothing left to write
    assert saved == [c1]
    book.close()


def test_the_screen_saves_the_last_of_quick_edits_and_quitting_waits_for_it(tmp_path):
    """On the loading screen: ten nudges while the disk is slow, then quit at once.  The file on disk
    holds the condition on screen after the last nudge, fewer than ten saves were written, and the
    run of nudges is one log entry (of ten changes)."""
    import asyncio
    import threading

    from deckload.io import paths
    from deckload.ui.launch import create_app

    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    app = create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")
    calls = []

    def slow_save(path, c):
        calls.append(c)
        threading.Event().wait(0.3)  # a slow disk: 0.3 s a save, longer than a key takes
        save_condition(path, c)

    app.session._save = slow_save

    async def run():
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.pause()
            for _ in range(10):
                await pilot.press("plus")
            shown = app.session.condition
            await pilot.press("q")
            return shown

    shown = asyncio.run(run())
    path = app.session.save_path
    assert load_condition(path, vessel) == shown != condition
    assert 1 <= len(calls) < 10 and calls[-1] == shown
    book = Logbook.open(tmp_path / "logs", vessel.particulars.name)
    assert [e.change_data.get("steps") for e in book.entries()] == [10]
    book.close()


def test_working_file_is_named_after_the_vessel(vessel, tmp_path):
    """Slug for the reader, plus the first 10 hex digits of SHA-256("Analytic box barge")."""
    import hashlib

    digest = hashlib.sha256(b"Analytic box barge").hexdigest()[:10]
    assert working_path(tmp_path, vessel).name == f"analytic-box-barge-{digest}.condition.toml"


def test_the_title_says_saving_until_the_change_is_on_disk(tmp_path):
    """An edit shown on screen whose save has not landed must say so (the writer thread saves
    after the frame): the title reads "saving…" while a save is pending and not after it lands."""
    import asyncio
    import threading

    from deckload.io import paths
    from deckload.io.profiles import load_condition, save_condition
    from deckload.ui.launch import create_app

    gate = threading.Event()

    def slow_save(path, condition):
        gate.wait(5)
        save_condition(path, condition)

    async def run():
        vessel = demo_vessel()
        condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
        app = create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")
        app.session._save = slow_save
        async with app.run_test(size=(120, 40)) as pilot:
            title = lambda: app.loading_screen._title(120).plain  # noqa: E731
            assert "saving" not in title()
            await pilot.press("enter", *"20%", "enter")
            await pilot.pause()
            assert "saving…" in title()
            gate.set()
            for _ in range(300):
                if not app.session.saves_pending:
                    break
                await pilot.pause(0.01)
            await pilot.pause()
            assert "saving" not in title()
            assert (tmp_path / "work").is_dir() and any((tmp_path / "work").glob("*.condition.toml"))

    asyncio.run(run())


def test_the_writer_keeps_logging_when_a_save_fails_oddly_and_when_the_screen_is_gone(vessel, tmp_path):
    """A save failing with something other than an OSError is reported (NOT SAVED) and the log entries of
    the same batch are still appended; a report to a screen that is gone (it raises) stops nothing, and
    flush does not wait for ever."""
    book = Logbook.open(tmp_path / "logs", vessel.particulars.name)
    journal = Journal(book)
    journal.officer = "TS"

    def odd_save(path, condition):
        raise ValueError("cannot write this condition")

    told = []

    def gone(problem):
        told.append(problem)
        raise RuntimeError("Event loop is closed")

    s = Session(vessel, c_with(), save_path=tmp_path / "w.condition.toml", journal=journal, save=odd_save)
    s.write_in_background(gone, after_frame=lambda fn: None)  # no frame ever comes: flush hands them over
    s.commit(c_with(TankFill("DB1P", "percent", 10.0)), "DB1P 10 %")
    s.commit(c_with(TankFill("DB1P", "percent", 20.0)), "DB1P 20 %")
    s.flush()
    assert s.saves_pending == 0 and s.saves_written == 0
    assert [e.change_text for e in book.entries()] == ["DB1P 10 %", "DB1P 20 %"]
    assert told and all("NOT SAVED" in t and "cannot write this condition" in t for t in told)
    s.commit(c_with(TankFill("DB1P", "percent", 30.0)), "DB1P 30 %")  # the writer still works
    s.flush()
    assert [e.change_text for e in book.entries()][-1] == "DB1P 30 %"
    book.close()


def test_closing_the_screen_ends_the_writer_thread_and_frees_the_app(tmp_path):
    """The writer thread saves and logs after each frame; when the screen closes, every change is
    on disk and the thread is gone.  A thread left running keeps its app (and every app before it in
    a long process) alive through the stderr it was started with."""
    import asyncio
    import gc
    import threading
    import weakref

    from deckload.io import paths
    from deckload.io.profiles import load_condition
    from deckload.ui.launch import create_app

    def writers():
        return {t for t in threading.enumerate() if t.name.startswith("deckload-writer")}

    # Compared as sets of thread objects, not counts: a writer of an earlier test in this process
    # may still be ending while this one starts, which made a count race under load.  Held weakly:
    # a Thread keeps the stderr it started with, which here leads to the app (a live thread stays
    # in the sets through threading's own table of running threads).
    before = weakref.WeakSet(writers())
    started = weakref.WeakSet()

    async def run():
        vessel = demo_vessel()
        condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
        app = create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")
        async with app.run_test(size=(80, 24)) as pilot:
            await pilot.press("enter", *"20%", "enter")
            for _ in range(300):  # until the edit has landed (the writer saves after the frame)
                await pilot.pause(0.01)
                if not app.session.saves_pending:
                    break
            started.update(writers() - set(before))
            assert len(started) == 1  # the edit went to this app's own writer thread
        assert app.session.saves_pending == 0 and any((tmp_path / "work").glob("*.condition.toml"))
        return weakref.ref(app)

    gone = asyncio.run(run())
    assert not any(t.is_alive() for t in started)
    gc.collect()
    assert gone() is None, "the closed app is still referenced"
