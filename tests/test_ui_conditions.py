"""Conditions as documents: "modified from" after the first edit, save under a name, open, print.

The app is built with the same factory as ``deckload open`` (create_app), on the demo vessel
with its stock conditions beside the profile, the working folder and the log in tmp folders.
"""

from __future__ import annotations

import pytest

from deckload.io import paths
from deckload.io.condition_files import ConditionNotFound, resolve
from deckload.logbook import Logbook
from deckload.io.profiles import load_condition
from deckload.ui.conditions import OpenConditionScreen, ReportWritten, SaveAsForm
from deckload.ui.launch import create_app
from deckload.ui.session import Session
from deckload.ui.widgets import LinePanel
from demo_vessels import demo_departure


@pytest.fixture(scope="module")
def demo():
    return demo_departure()


@pytest.fixture
def app(demo, tmp_path):
    v, c = demo
    return create_app(v, c, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="JS",
                      profile_path=paths.DEMO_PROFILE)


def panel(app, name: str) -> str:
    return app.screen.query_one(f"#{name}", LinePanel).plain()


def test_first_edit_marks_modified_from_and_undo_clears_it(demo, tmp_path):
    v, c = demo
    s = Session(v, c, save_path=None)
    assert s.title == "Departure, full stores"
    s.commit(c.with_density(1.010), "ρ")
    assert s.condition.modified_from == "Departure, full stores"
    assert s.title == "Departure, full stores (modified from Departure, full stores)"
    s.commit(s.condition.with_density(1.000), "ρ again")
    assert s.condition.modified_from == "Departure, full stores"  # still from the stock one, not from itself
    s.undo()
    s.undo()
    assert s.condition == c and s.title == c.name


def test_save_as_writes_a_new_file_that_reads_back_unmodified(demo, tmp_path):
    v, c = demo
    s = Session(v, c, save_path=tmp_path / "w.condition.toml")
    s.commit(c.with_density(1.010), "ρ")
    target = tmp_path / "saved" / "sailing.condition.toml"
    s.save_as("Sailing 2 Dec", target)
    back = load_condition(target, v)
    assert back.name == "Sailing 2 Dec" and back.modified_from == ""
    assert back.water_density_t_m3 == 1.010
    assert s.condition == back and s.title == "Sailing 2 Dec"
    # the stock file is untouched
    assert load_condition(paths.DEMO_CONDITIONS["departure"], v) == c


def test_modified_from_survives_the_working_file(demo, tmp_path):
    from deckload.io.profiles import save_condition

    v, c = demo
    path = tmp_path / "w.condition.toml"
    s = Session(v, c, save_path=path, save=save_condition)
    s.commit(c.with_density(1.010), "ρ")
    s.flush()
    assert load_condition(path, v).modified_from == "Departure, full stores"


def test_resolve_finds_stock_working_and_saved_by_short_name(demo, tmp_path):
    v, c = demo
    work = tmp_path / "work"
    name = v.particulars.name
    assert resolve(paths.DEMO_PROFILE, "Departure", name, work) == paths.DEMO_CONDITIONS["departure"]
    with pytest.raises(ConditionNotFound, match="no working condition yet"):
        resolve(paths.DEMO_PROFILE, "working", name, work)
    w = paths.working_file(work, name)
    w.parent.mkdir(parents=True)
    w.write_text(paths.DEMO_CONDITIONS["arrival"].read_text())
    assert resolve(paths.DEMO_PROFILE, "working", name, work) == w
    s = Session(v, c, save_path=w)
    target = paths.saved_conditions_dir(work, name) / "sailing-2-dec.condition.toml"
    s.save_as("Sailing 2 Dec", target)
    assert resolve(paths.DEMO_PROFILE, "sailing-2-dec", name, work) == target
    assert resolve(paths.DEMO_PROFILE, "Sailing 2 Dec", name, work) == target
    with pytest.raises(ConditionNotFound) as err:
        resolve(paths.DEMO_PROFILE, "nosuch", name, work)
    for listed in ("departure", "midvoyage", "arrival", "light", "working", "sailing-2-dec"):
        assert listed in str(err.value)


@pytest.mark.long
async def test_name_save_print_and_open_from_the_screen(app, tmp_path):
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("d")
        await pilot.pause()
        await pilot.press(*"1.010", "enter")
        await pilot.pause()
        assert "(modified from Departure, full stores)" in panel(app, "titlebar")
        # a stock condition's name is refused
        await pilot.press("n")
        await pilot.pause()
        assert isinstance(app.screen, SaveAsForm)
        await pilot.press(*"Departure, full stores", "enter")
        await pilot.pause()
        assert isinstance(app.screen, SaveAsForm)
        assert "stock condition" in str(app.screen.query_one("#form-message").render())
        app.screen.query_one("#prompt-input").value = ""
        await pilot.press(*"Dock water trial", "enter")
        await pilot.pause()
        assert not isinstance(app.screen, SaveAsForm)
        saved = paths.saved_conditions_dir(tmp_path / "work", app.session.vessel.particulars.name) \
            / "dock-water-trial.condition.toml"
        assert saved.is_file()
        title = panel(app, "titlebar")
        assert "Dock water trial" in title and "modified" not in title
        # print from the screen
        await pilot.press("p")
        await pilot.pause()
        assert isinstance(app.screen, ReportWritten)
        reports = sorted((tmp_path / "logs" / "reports").iterdir())
        assert [p.suffix for p in reports] == [".html", ".txt"]
        text = reports[1].read_text()
        assert "Condition: Dock water trial" in text and "1.010" in text
        assert f"{app.session.result.gm_fluid_m:.3f}" in text  # the GM on the screen's Afloat panel
        await pilot.press("escape")
        await pilot.pause()
        # saving again under the same name asks for a second ⏎
        await pilot.press("n")
        await pilot.pause()
        await pilot.press("enter")
        await pilot.pause()
        assert isinstance(app.screen, SaveAsForm)
        assert "already holds" in str(app.screen.query_one("#form-message").render())
        await pilot.press("enter")
        await pilot.pause()
        assert not isinstance(app.screen, SaveAsForm)
        # open the stock arrival condition: undoable, not marked modified
        await pilot.press("ctrl+o")
        await pilot.pause()
        assert isinstance(app.screen, OpenConditionScreen)
        titles = [str(app.screen.query_one("#open-list").get_option_at_index(i).prompt)
                  for i in range(app.screen.query_one("#open-list").option_count)]
        k = next(i for i, t in enumerate(titles) if "Arrival" in t)
        app.screen.query_one("#open-list").highlighted = k
        await pilot.press("enter")
        await pilot.pause()
        assert app.session.condition.name.startswith("Arrival")
        assert app.session.condition.modified_from == ""
    book = Logbook.open(tmp_path / "logs", app.session.vessel.particulars.name, readonly=True)
    changes = [e.change_text for e in book.entries()]
    book.close()
    assert any("saved as" in c and "Dock water trial" in c for c in changes)


async def test_opening_another_condition_keeps_an_edited_working_one_beside_it(app, tmp_path):
    """Ctrl+O replaces the working condition: an edited one (in no file of its own; nobody signed
    on, so not in the log either) is kept as the working file's .previous; an unedited one, which
    is its own file, is not copied."""
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("d")
        await pilot.pause()
        await pilot.press(*"1.010", "enter")
        await pilot.pause()
        edited = app.session.condition
        assert edited.modified_from and edited.water_density_t_m3 == 1.010

        async def open_titled(word: str) -> None:
            await pilot.press("ctrl+o")
            await pilot.pause()
            listed = app.screen.query_one("#open-list")
            listed.highlighted = next(i for i in range(listed.option_count)
                                      if word in str(listed.get_option_at_index(i).prompt))
            await pilot.press("enter")
            await pilot.pause()

        await open_titled("Arrival")
        assert app.session.condition.name.startswith("Arrival")
        work = app.session.save_path
        kept = work.with_name(work.name + ".previous")
        assert load_condition(kept, app.session.vessel) == edited
        assert f"the edited one kept as {kept.name}" in " ".join(panel(app, "status").split())
        await open_titled("Departure")  # the arrival, unedited, is in its own file: nothing more kept
        assert sorted(p.name for p in work.parent.iterdir() if ".previous" in p.name) == [kept.name]


@pytest.mark.parametrize("width, key", [(8, "ctrl+o"), (4, "ctrl+o"), (6, "ctrl+p"), (4, "ctrl+p")])
async def test_a_list_of_choices_opens_on_a_terminal_too_narrow_for_its_frame(app, width, key):
    """On 8 columns or fewer the conditions' list (6 or fewer the command palette's) had no width
    left for its text, and textual's layout of its lines raised ValueError: the screen crashed
    (exit 3).  deckload.tcss keeps every OptionList 16 columns wide; the terminal cuts it."""
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.resize_terminal(width, 10)
        await pilot.pause()
        await pilot.press(key)
        await pilot.pause()
        await pilot.press("down", "escape")
        await pilot.pause()
        assert app._exception is None and app.is_running


@pytest.mark.parametrize("typed", ["departure", "ARRIVAL", "Working", "screen", "Departure full stores"])
def test_a_saved_name_never_hides_behind_a_stock_or_the_working_condition(demo, tmp_path, typed):
    """'deckload calc demo departure' finds the stock departure first and 'working' the screen's
    working file: a condition saved under such a name could never be named on the command line."""
    from deckload.ui.conditions import check_name, save_target
    from deckload.ui.entry import EntryError

    app = create_app(*demo, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", profile_path=paths.DEMO_PROFILE)
    _, taken = save_target(app.session)
    with pytest.raises(EntryError):
        check_name(typed, taken)
    assert check_name("Departure after bunkering", taken) == "Departure after bunkering"
