"""Start-up of the loading screen on the demo vessel: first run, restart, unreadable working file."""

from __future__ import annotations

from pathlib import Path

from deckload.io import paths
from deckload.io.profiles import load_condition
from deckload.ui.launch import create_app, load_inputs
from deckload.ui.session import working_path
from demo_vessels import demo_vessel


async def test_first_run_opens_departure_and_a_restart_restores_the_working_condition(tmp_path, monkeypatch):
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path / "logs"))
    work = paths.working_dir()
    vessel, first, notices, _, _ = load_inputs(None, None, work)
    assert first == load_condition(paths.DEMO_CONDITIONS["departure"], vessel) and notices == []
    app = create_app(vessel, first, work_dir=work, log_dir=paths.log_dir(), officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("enter", *"12.5m3", "enter")
        await pilot.press("plus")
        await pilot.pause()
        edited = app.session.condition
    assert edited != first
    _, restored, notices, _, _ = load_inputs(None, None, work)
    assert restored == edited and notices == []


def test_an_unreadable_working_file_is_set_aside_not_overwritten(tmp_path):
    vessel = demo_vessel()
    saved = working_path(tmp_path, vessel)
    saved.parent.mkdir(parents=True, exist_ok=True)
    saved.write_text("format = 'deckload-condition-1'\n[tanks.NOPE]\npercent = 50\n")
    _, condition, notices, _, _ = load_inputs(None, None, tmp_path)
    assert condition == load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    aside = saved.with_name(saved.name + ".unreadable")
    assert aside.read_text().startswith("format = 'deckload-condition-1'") and not saved.exists()
    assert "moved to" in notices[0] and "NOPE" in notices[0]


def test_a_condition_argument_wins_over_the_working_file(tmp_path):
    vessel = demo_vessel()
    arrival = paths.DEMO_CONDITIONS["arrival"]
    _, condition, _, _, _ = load_inputs(paths.DEMO_PROFILE, arrival, tmp_path)
    assert condition == load_condition(arrival, vessel)


def test_a_log_held_by_another_writer_opens_read_only_and_says_so(tmp_path):
    from deckload.logbook import Logbook
    from deckload.ui.launch import open_journal

    holder = Logbook.open(tmp_path, "Demo Islander")
    try:
        journal = open_journal(tmp_path, "Demo Islander")
        assert not journal.writable and "read-only" in journal.problem
        journal.officer = "TS"
        assert journal.append(kind="edit", change_text="x", change_data={}, result=None, condition=None) is None
        assert holder.entries() == []
    finally:
        holder.close()


def test_a_torn_log_line_is_reported_at_start(tmp_path):
    """A power cut mid-append leaves half a line: the screen must say it was set aside."""
    from deckload.logbook import Logbook
    from deckload.ui.launch import open_journal

    book = Logbook.open(tmp_path, "Torn Test")
    path = book.path
    book.close()
    with open(path, "ab") as fh:
        fh.write(b'{"seq": 1, "half a line')
    journal = open_journal(tmp_path, "Torn Test")
    try:
        assert journal.writable
        assert journal.notice is not None and "interrupted write" in journal.notice
    finally:
        journal.logbook.close()


def test_a_second_unreadable_working_file_does_not_overwrite_the_first(tmp_path):
    vessel = demo_vessel()
    saved = working_path(tmp_path, vessel)
    saved.parent.mkdir(parents=True, exist_ok=True)
    for n in (1, 2):
        saved.write_text(f"format = 'deckload-condition-1'\n# copy {n}\n[tanks.NOPE]\npercent = 50\n")
        load_inputs(None, None, tmp_path)
    first = saved.with_name(saved.name + ".unreadable")
    second = saved.with_name(saved.name + ".unreadable.2")
    assert "# copy 1" in first.read_text() and "# copy 2" in second.read_text()


def test_opening_a_named_condition_keeps_the_previous_working_file(tmp_path):
    vessel = demo_vessel()
    saved = working_path(tmp_path, vessel)
    saved.parent.mkdir(parents=True, exist_ok=True)
    saved.write_text(paths.DEMO_CONDITIONS["midvoyage"].read_text())
    _, condition, notices, _, _ = load_inputs(paths.DEMO_PROFILE, paths.DEMO_CONDITIONS["arrival"], tmp_path)
    assert condition == load_condition(paths.DEMO_CONDITIONS["arrival"], vessel)
    kept = saved.with_name(saved.name + ".previous")
    assert kept.read_text() == paths.DEMO_CONDITIONS["midvoyage"].read_text()
    assert str(kept) in notices[0]


def test_a_second_window_on_the_same_vessel_does_not_save_the_working_condition(tmp_path):
    from deckload.logbook import Logbook

    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    holder = Logbook.open(tmp_path / "logs", vessel.particulars.name)
    try:
        app = create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs")
        assert app.session.save_path is None
        assert any("does not save the working condition" in n for n in app.notices)
    finally:
        holder.close()


async def test_a_notice_with_brackets_does_not_break_the_screen(tmp_path):
    """Notices carry file names and user text: they are shown as plain text, never as markup."""
    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    app = create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs",
                     notices=["value 'x[/]' in [tanks.A] was refused"])
    async with app.run_test(size=(120, 40), notifications=True) as pilot:
        await pilot.pause(0.3)
        toasts = [str(t.render()) for t in app.screen.query("Toast")]
        assert "value 'x[/]' in [tanks.A] was refused" in toasts


def test_a_profile_that_fails_its_audit_is_refused_with_the_findings(tmp_path, capsys, monkeypatch):
    """Issue 8: the audit runs before any profile opens; a contradiction refuses it (exit 2, no screen)."""
    import sys

    import pytest

    sys.path.insert(0, str(Path(__file__).parent))
    from box_profile_text import fv22_text
    from deckload.report.audit_findings import AuditError
    from deckload.ui.launch import run_open

    f = tmp_path / "fv22.toml"
    text = fv22_text().replace("lcg_m = 10.6", "lcg_m = -2.10")
    f.write_text(text, encoding="utf-8")
    line = [i for i, s in enumerate(text.splitlines(), 1) if "lcg_m = -2.10" in s][0]
    with pytest.raises(AuditError) as ei:
        load_inputs(f, None, tmp_path / "work")
    assert [p.key for p in ei.value.problems] == ["lightship.lcg_m"]
    assert str(ei.value).splitlines()[1].startswith(f"{f}:{line}: lightship.lcg_m = -2.1 m from AP: ERROR")
    assert not (tmp_path / "work").exists()
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path / "logs"))
    monkeypatch.setattr("deckload.ui.launch.no_terminal", lambda: None)  # as on a terminal (checked first)
    assert run_open(f, None) == 2
    assert "fails its plausibility audit" in capsys.readouterr().err


def test_audit_warnings_open_the_profile_with_a_notice(tmp_path):
    import sys

    sys.path.insert(0, str(Path(__file__).parent))
    from box_profile_text import fv22_text

    f = tmp_path / "fv22.toml"
    f.write_text(fv22_text().replace("vcg_m = 2.4", "vcg_m = 5.0"), encoding="utf-8")
    vessel, condition, notices, _, _ = load_inputs(f, None, tmp_path / "work")
    assert vessel.lightship.vcg_m == 5.0
    assert len(notices) == 1 and notices[0].startswith("Plausibility audit of fv22.toml: 1 warning")
    assert "lightship.vcg_m = 5 m above keel" in notices[0]


def test_start_up_hands_its_result_to_the_screen_which_does_not_evaluate_again(tmp_path, monkeypatch):
    """The condition start-up checked comes with its result, and the screen starts from that result
    instead of evaluating the same condition a second time; with no result given it evaluates."""
    import deckload.core.stability as stability
    from deckload.core.stability import evaluate

    arrival = paths.DEMO_CONDITIONS["arrival"]
    vessel, condition, _, result, _ = load_inputs(paths.DEMO_PROFILE, arrival, tmp_path)
    assert result is not None
    assert result.to_json_dict() == evaluate(vessel, condition).to_json_dict()

    calls = []

    def counted(v, c, *a, **k):
        calls.append(c)
        return evaluate(v, c, *a, **k)

    monkeypatch.setattr(stability, "evaluate", counted)  # the screen's session imports it when made
    app = create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=None, result=result)
    assert app.session.result is result and calls == []
    app = create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=None)
    assert calls == [condition] and app.session.result is not result
