"""The error boundary, the screen's start-up and typed amounts under hostile input (issue 12).

Cases held here, each with its triggering input: an error escaping validation (exit 3, one
paragraph, a crash file), ``100.000000001%`` typed for a tank, a bad saved working
condition, ``deckload open demo bad.condition.toml``, two vessels sharing a working file,
``"1"×1000 + "!"`` typed, terminal escapes in names, and temporary files left by a kill.
"""

from __future__ import annotations

import pytest

from deckload.io import paths
from deckload.cli.main import main
from deckload.core.model import Condition
from deckload.core.stability import evaluate
from deckload.io.paths import DEMO_CONDITIONS
from deckload.io.profiles import ProfileError, load_condition, parse_condition
from deckload.ui import entry
from deckload.ui.launch import create_app, load_inputs
from deckload.ui.session import working_path
from demo_vessels import demo_vessel

DEPARTURE = DEMO_CONDITIONS["departure"].read_text(encoding="utf-8")


@pytest.fixture(scope="module")
def vessel():
    return demo_vessel()


@pytest.fixture
def home(tmp_path, monkeypatch):
    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path / "home"))
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path / "logs"))
    return tmp_path / "home"


# ------------------------------------------------------------------ case 2: one error boundary per entry point


def test_an_error_escaping_validation_gives_exit_3_one_paragraph_and_a_crash_file(home, monkeypatch, capsys):
    import deckload.cli.calc

    def broken(*a, **k):
        raise ZeroDivisionError("float division by zero")

    monkeypatch.setattr(deckload.cli.calc, "load_and_evaluate", broken)
    assert main(["calc", "demo", "departure"]) == 3
    err = capsys.readouterr().err
    assert "Traceback" not in err and err.count("\n") == 1
    assert "internal error while running 'calc'" in err and "demo_islander.toml" in err
    (crash,) = (home / "crashes").iterdir()
    assert str(crash) in err and "ZeroDivisionError" in crash.read_text()


def test_the_log_has_the_same_boundary(home, monkeypatch, capsys):
    import deckload.cli.log

    monkeypatch.setattr(deckload.cli.log, "_show", lambda args: 1 / 0)
    assert main(["log", "show"]) == 3
    assert "internal error while running 'log show'" in capsys.readouterr().err


@pytest.mark.parametrize("argv", [["calc", "demo", "working"], ["report", "demo", "working", "--txt"],
                                  ["marks", "demo", "working"]])
def test_finding_a_condition_by_its_name_is_inside_the_boundary(home, monkeypatch, capsys, argv):
    """The lookup of a condition named by key or title reads the profile and every condition file
    beside it, before the command proper: whatever escapes it is the command's internal error
    (exit 3, one paragraph), not a traceback."""
    import deckload.io.condition_files

    def broken(*a, **k):
        raise RecursionError("maximum recursion depth exceeded")

    monkeypatch.setattr(deckload.io.condition_files, "resolve", broken)
    assert main(argv) == 3
    err = capsys.readouterr().err
    assert "Traceback" not in err and err.count("\n") == 1
    assert f"internal error while running '{argv[0]}'" in err and "RecursionError" in err


def test_the_documented_exit_codes_are_in_the_readme():
    text = (paths.PACKAGE_DATA.parents[1] / "README.md").read_text(encoding="utf-8")
    assert "3 — internal error" in text


# ------------------------------------------------------------------ case 3: typed amounts consistent with the calculation


@pytest.mark.parametrize("typed", ["100.000000001%", "100.0000001%"])
def test_a_hair_over_full_is_full_for_the_entry_and_the_calculation(vessel, typed):
    """Both the entry and the calculation allow 1e-9·max(1, limit) of round-off."""
    tank = vessel.tanks[0]
    c = entry.tank_from_text(Condition(), tank, typed)
    assert c.tank_fill(tank.id).value == 100.0
    assert evaluate(vessel, c).tanks[0].fill_pct == pytest.approx(100.0, abs=1e-9)


def test_more_than_a_hair_over_full_is_refused_with_the_value_shown(vessel):
    with pytest.raises(entry.EntryError, match=r"100\.00001 % is more than 100 %"):
        entry.tank_from_text(Condition(), vessel.tanks[0], "100.00001%")


def test_a_file_a_hair_over_full_computes(vessel):
    text = DEPARTURE.replace("[tanks.FPT]\npercent = 100.0", "[tanks.FPT]\npercent = 100.00000001")
    assert text != DEPARTURE
    evaluate(vessel, parse_condition(text, "c.toml", vessel))


async def test_the_screen_stays_up_on_hostile_typing(vessel, tmp_path):
    app = create_app(vessel, load_condition(DEMO_CONDITIONS["departure"], vessel), work_dir=tmp_path,
                     log_dir=None)
    async with app.run_test(size=(120, 40)) as pilot:
        for typed in ("100.000000001%", "1" * 1000 + "!", "\x1b[2J5%", "1e308t", "-0%", "nan%"):
            await pilot.press("enter")
            app.screen.query_one("Input").value = typed
            await pilot.press("enter")
            await pilot.pause()
            if app.screen is not app.loading_screen:
                await pilot.press("escape")
        assert app.is_running


# ------------------------------------------------------------------ case 4: a bad saved condition never bricks the screen


@pytest.mark.parametrize("body", [
    DEPARTURE.replace("[tanks.FPT]\npercent = 100.0", "[tanks.FPT]\npercent = 100.001"),
    DEPARTURE + "\n[[constant]]\nname = 'x'\nmass_t = 1" + "0" * 5000 + "\nlcg_m = 1.0\nvcg_m = 1.0\n",
    DEPARTURE + "\nx = " + "[" * 3000 + "]" * 3000 + "\n",
    DEPARTURE + "\n[[constant]]\nname = 'x'\nmass_t = 1e6\nlcg_m = 1.0\nvcg_m = 1.0\n",
], ids=["over-full", "5000-digit", "nested-3000", "mass-1e6"])
def test_a_bad_saved_working_condition_is_set_aside_with_a_notice(vessel, tmp_path, body):
    saved = working_path(tmp_path, vessel)
    saved.parent.mkdir(parents=True, exist_ok=True)
    saved.write_text(body, encoding="utf-8")
    _, condition, notices, _, _ = load_inputs(None, None, tmp_path)
    assert condition == load_condition(DEMO_CONDITIONS["departure"], vessel)
    assert not saved.exists() and saved.with_name(saved.name + ".unreadable").read_text(encoding="utf-8") == body
    assert "could not be read and was moved" in notices[0]


async def test_a_saved_condition_beyond_the_tables_opens_with_the_reason_shown(vessel, tmp_path):
    """300 t at x = 45 m on the empty ship: a draft aft below 0 — kept, shown as not assessable."""
    body = ("format = 'deckload-condition-1'\n[condition]\nname = 'trimmed'\nwater_density_t_m3 = 1.025\n"
            "[[constant]]\nname = 'x'\nmass_t = 300.0\nlcg_m = 45.0\nvcg_m = 1.0\n")
    saved = working_path(tmp_path, vessel)
    saved.parent.mkdir(parents=True, exist_ok=True)
    saved.write_text(body, encoding="utf-8")
    _, condition, notices, _, _ = load_inputs(None, None, tmp_path)
    app = create_app(vessel, condition, work_dir=tmp_path, log_dir=None)
    assert app.session.stale and app.session.result is None and "draft aft" in app.session.problem
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("down", "enter", *"50%", "enter")
        await pilot.pause()
        assert app.is_running


def test_opening_a_bad_named_condition_renames_nothing(vessel, tmp_path, capsys, monkeypatch):
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path / "logs"))
    monkeypatch.setattr("deckload.ui.launch.no_terminal", lambda: None)  # as on a terminal (checked first)
    saved = working_path(paths.working_dir(), vessel)
    saved.parent.mkdir(parents=True, exist_ok=True)
    saved.write_text(DEMO_CONDITIONS["midvoyage"].read_text(encoding="utf-8"), encoding="utf-8")
    bad = tmp_path / "bad.condition.toml"
    bad.write_text(DEPARTURE.replace("percent = 100.0", "percent = 100.001", 1), encoding="utf-8")
    assert main(["open", "demo", str(bad)]) == 2  # the screen does not open
    assert "bad.condition.toml" in capsys.readouterr().err
    assert saved.read_text(encoding="utf-8") == DEMO_CONDITIONS["midvoyage"].read_text(encoding="utf-8")
    assert not saved.with_name(saved.name + ".previous").exists()


# ------------------------------------------------------------------ case 5: one working file per vessel


@pytest.mark.parametrize("a,b", [("Нева", "Волга"), ("Bjørn", "Björn"), ("Demo", "demo")])
def test_no_two_vessels_share_a_working_file(tmp_path, a, b):
    assert paths.working_file(tmp_path, a) != paths.working_file(tmp_path, b)


def test_an_old_working_file_is_moved_to_the_new_name(vessel, tmp_path):
    old = paths.legacy_working_file(tmp_path, vessel.particulars.name)
    assert old.name == "demo-islander.condition.toml"
    old.write_text(DEMO_CONDITIONS["arrival"].read_text(encoding="utf-8"), encoding="utf-8")
    _, condition, notices, _, _ = load_inputs(None, None, tmp_path)
    assert condition == load_condition(DEMO_CONDITIONS["arrival"], vessel)
    assert not old.exists() and working_path(tmp_path, vessel).is_file() and "moved" in notices[0]


def test_an_old_working_file_of_another_vessel_is_left_alone(vessel, tmp_path):
    old = paths.legacy_working_file(tmp_path, vessel.particulars.name)
    other = "format = 'deckload-condition-1'\n[condition]\nname = 'x'\nwater_density_t_m3 = 1.025\n[tanks.ZZ9]\npercent = 5.0\n"
    old.write_text(other, encoding="utf-8")
    load_inputs(None, None, tmp_path)
    assert old.read_text(encoding="utf-8") == other


# ------------------------------------------------------------------ case 6: amount parsing linear, with a limit


def test_a_long_amount_is_refused_at_once_with_the_limit_named():
    with pytest.raises(entry.EntryError, match="at most 64"):
        entry.parse_amount("1" * 1000 + "!")
    with pytest.raises(entry.EntryError, match="at most 64"):
        entry.parse_number("1" * 1500, "Mass", "t")


def test_the_amount_patterns_do_not_backtrack():
    """20,000 digits and a bad end: the old pattern '[0-9]*\\.?[0-9]+' tried every split of the
    run (cubic: 1,000 took 4 s, so this would take hours); the new one fails in one pass."""
    s = "1" * 20_000 + "!"
    assert entry._AMOUNT.match(s) is None and entry._NUMBER.match(s) is None
    assert entry._AMOUNT.match("12.5 m3").group("num") == "12.5"


# ------------------------------------------------------------------ case 9: terminal escapes


ESC_NAME = "Ship\x1b[2J\x1b]0;owned\x07"


def test_a_name_with_terminal_escapes_is_refused_in_a_file(vessel):
    text = DEPARTURE.replace('name = "Small tractor"', 'name = "Small\\u001b[2Jtractor"')
    with pytest.raises(ProfileError) as ei:
        parse_condition(text, "c.toml", vessel)
    (p,) = ei.value.problems
    assert p.key == "deck_item[#3].name" and "control character \\x1b" in p.rule


def test_a_name_with_terminal_escapes_is_refused_in_the_item_form(vessel):
    with pytest.raises(entry.EntryError, match="control character"):
        entry.item_from_form(vessel, entry.ItemForm(ESC_NAME, "1", "10", "2", "0"), deck=False)


def test_no_escape_reaches_the_terminal_from_calc_check_or_the_log(tmp_path, capsys, monkeypatch):
    """A hand-edited log line and an unknown key holding ESC: printed as visible escapes."""
    import json

    from deckload.logbook import Logbook

    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path))
    bad = tmp_path / "esc.condition.toml"
    bad.write_text(DEPARTURE + '\n"x\\u001b[2J" = 1\n', encoding="utf-8")
    main(["check", "demo", str(bad)])
    main(["calc", "demo", str(bad)])
    book = Logbook.open(tmp_path, "Demo Islander")
    book.append(kind="remark", by="JM", change_text="noon", change_data={}, result=None, condition=None)
    book.close()
    line = json.loads(book.path.read_text(encoding="utf-8"))
    line["remark"] = ESC_NAME
    book.path.write_text(json.dumps(line) + "\n", encoding="utf-8")
    main(["log", "show"])
    out = capsys.readouterr()
    assert "\x1b" not in out.out + out.err and "\x07" not in out.out + out.err
    assert "\\x1b[2J" in out.out + out.err


def test_the_log_refuses_control_characters_in_a_remark(tmp_path):
    from deckload.logbook import Logbook

    with Logbook.open(tmp_path, "Demo Islander") as book:
        with pytest.raises(ValueError, match="control character"):
            book.append(kind="remark", by="JM", change_text="noon", change_data={}, result=None,
                        condition=None, remark=ESC_NAME)


# ------------------------------------------------------------------ case 11: a kill mid-save


def test_temp_files_of_an_interrupted_save_are_cleaned_and_a_complete_one_kept(vessel, tmp_path):
    saved = working_path(tmp_path, vessel)
    saved.parent.mkdir(parents=True, exist_ok=True)
    saved.write_text(DEMO_CONDITIONS["departure"].read_text(encoding="utf-8"), encoding="utf-8")
    complete = tmp_path / f".{saved.name}.abc123.tmp"
    complete.write_text(DEMO_CONDITIONS["arrival"].read_text(encoding="utf-8"), encoding="utf-8")
    torn = tmp_path / f".{saved.name}.def456.tmp"
    torn.write_text(DEMO_CONDITIONS["arrival"].read_text(encoding="utf-8")[:40], encoding="utf-8")
    stray = tmp_path / ".other.toml.xyz.tmp"
    stray.write_text("x")
    _age(complete, torn, stray)
    _, condition, notices, _, _ = load_inputs(None, None, tmp_path)
    assert condition == load_condition(DEMO_CONDITIONS["departure"], vessel)
    assert not complete.exists() and not torn.exists() and not stray.exists()
    kept = saved.with_name(saved.name + ".interrupted")
    assert kept.read_text(encoding="utf-8") == DEMO_CONDITIONS["arrival"].read_text(encoding="utf-8")
    assert any("interrupted" in n and str(kept) in n for n in notices)


def _age(*files, seconds: float | None = None) -> None:
    """Set the files' modification time ``seconds`` back (default: just past the age at which no live
    save can own a temporary file, launch.STALE_TEMP_S)."""
    import os
    import time

    from deckload.ui.launch import STALE_TEMP_S

    back = STALE_TEMP_S + 1.0 if seconds is None else seconds
    for f in files:
        t = time.time() - back
        os.utime(f, (t, t))


def test_a_save_in_progress_in_the_working_folder_is_left_alone_at_start(vessel, tmp_path):
    """Before: every ``.*.tmp`` in the working folder was removed at start, another vessel's (or
    another window's) save in progress too, which then failed at its rename.  A temporary file
    younger than STALE_TEMP_S may have a live writer: it is left as it is, this vessel's and
    another's alike, and no notice claims an interrupted save."""
    saved = working_path(tmp_path, vessel)
    saved.parent.mkdir(parents=True, exist_ok=True)
    saved.write_text(DEPARTURE, encoding="utf-8")
    other = tmp_path / ".demo-trawler-0123456789.condition.toml.k3j4h5.tmp"  # another vessel's save
    other.write_text(DEMO_CONDITIONS["arrival"].read_text(encoding="utf-8")[:100], encoding="utf-8")
    own = tmp_path / f".{saved.name}.q1w2e3.tmp"  # another window's save of this vessel
    own.write_text(DEMO_CONDITIONS["arrival"].read_text(encoding="utf-8"), encoding="utf-8")
    _age(other, own, seconds=5.0)
    _, condition, notices, _, _ = load_inputs(None, None, tmp_path)
    assert other.exists() and own.exists()
    assert not saved.with_name(saved.name + ".interrupted").exists()
    assert not any("interrupted" in n for n in notices)
    # Once old enough that no live save can own them, they are what an interrupted save left.
    _age(other, own)
    _, _, notices, _, _ = load_inputs(None, None, tmp_path)
    assert not other.exists() and not own.exists()
    assert saved.with_name(saved.name + ".interrupted").exists()
