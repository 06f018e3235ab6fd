"""The forms driven by keys typed without pauses, the tank picker, the set dialog's hint and preview.

The pilot's ``press`` waits for the app to be idle after every key; an officer typing quickly
does not.  ``type_fast`` hands every key to the terminal driver at once, as a fast typist or a
paste does, and only then waits: each key must land in the field that had focus when it was
typed (before the fix the keys typed while a form was opening were lost or taken by the screen
underneath, and the transfer form's fields filled out of order).
"""

from __future__ import annotations

import dataclasses

import pytest
from textual import events
from textual.widgets import Input

from deckload.io import paths
from deckload.io.profiles import load_condition
from deckload.ui.dialogs import ItemFormScreen, TransferForm
from deckload.ui.entry import EntryError
from deckload.ui.launch import create_app
from deckload.ui.widgets import LinePanel, LoadBoard
from demo_vessels import demo_departure, trawler_vessel

_NAMES = {"%": "percent_sign", ".": "full_stop", " ": "space"}


@pytest.fixture(scope="module")
def demo():
    return demo_departure()


@pytest.fixture
def app(demo, tmp_path):
    v, c = demo
    return create_app(v, c, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


async def type_fast(app, pilot, keys: list[str]) -> None:
    """Every key to the driver at once (no wait between keys), then wait until all are handled."""
    await pilot.pause()
    for k in keys:
        char = k if len(k) == 1 else {"minus": "-", "plus": "+"}.get(k)
        app._driver.send_message(events.Key(_NAMES.get(k, k), char))
    quiet = 0
    for _ in range(1000):  # up to 20 s on a loaded machine; ends once every key is handled
        # pause() first sees every message queued before it handled (the keys included), then
        # sleeps: four looks 20 ms apart (the app's watch of held keys runs every 20 ms).
        await pilot.pause(0.02)
        quiet = quiet + 1 if not app._held_keys and app._key_in_flight is None else 0
        if quiet == 4:
            break
    await pilot.pause()


def fields(app) -> dict[str, str]:
    return {i.id: i.value for i in app.screen.query(Input)}


async def test_a_deck_load_takes_its_side_area_for_the_wind_and_the_weather_criterion_judges_it(app, demo):
    """The item form's last two fields: the side area the load shows to the wind (m²) and its centre's
    height (blank: the VCG).  Given, the weather criterion (IS 2008 A 2.3) counts it and is judged;
    left blank it is unknown, and a pass cannot be told (verdict._without_deck_windage)."""
    v, c0 = demo
    async with app.run_test(size=(120, 40)) as pilot:
        await type_fast(app, pilot, ["a", *"Crane", "tab", *"2", "tab", *"20", "tab", *"6", "tab", *"0", "tab",
                                     "tab", *"8", "tab", *"7.5", "enter"])
        assert not isinstance(app.screen, ItemFormScreen)
        crane = app.session.condition.deck_items[-1]
        assert (crane.name, crane.windage_area_m2, crane.windage_centroid_z_m) == ("Crane", 8.0, 7.5)
        weather = [c for c in app.session.result.criteria if c.set_id == "IS2008-A2.3"]
        assert weather and all(c.assessed for c in weather)
        await type_fast(app, pilot, ["a", *"Drum", "tab", *"1", "tab", *"20", "tab", *"5", "tab", *"0", "enter"])
        drum = app.session.condition.deck_items[-1]
        assert (drum.name, drum.windage_area_m2, drum.windage_centroid_z_m) == ("Drum", None, None)
        weather = [c for c in app.session.result.criteria if c.set_id == "IS2008-A2.3"]
        assert weather and not any(c.assessed and c.passed for c in weather)


def test_the_item_forms_side_area_is_bounded_and_its_centre_defaults_to_the_vcg(demo):
    """The same bound as a condition file's windage_area_m2 (bounds.deck_windage_range: 1.5·LBP × 30 m);
    0 is a hidden load; a centre with no area is refused; editing shows what the item states."""
    from deckload.core import bounds
    from deckload.ui.entry import ItemForm, form_of, item_from_form

    v, _ = demo
    base = ItemForm("Crate", "3", "20", "5", "0")
    assert item_from_form(v, base, deck=True).windage_area_m2 is None
    hidden = item_from_form(v, dataclasses.replace(base, windage="0"), deck=True)
    assert (hidden.windage_area_m2, hidden.windage_centroid_z_m) == (0.0, 5.0)
    top = bounds.deck_windage_range(v.particulars).high
    assert top == 1.5 * v.particulars.lbp_m * 30.0
    with pytest.raises(EntryError, match="above the highest accepted value"):
        item_from_form(v, dataclasses.replace(base, windage=f"{top * 1.01:g}"), deck=True)
    with pytest.raises(EntryError, match="give the area"):
        item_from_form(v, dataclasses.replace(base, windage_z="6"), deck=True)
    stated = item_from_form(v, dataclasses.replace(base, windage="4.5", windage_z="6.2"), deck=True)
    assert (form_of(stated).windage, form_of(stated).windage_z) == ("4.5", "6.2")


async def test_keys_typed_at_once_fill_the_transfer_form_field_by_field(app):
    """t opens the form on WB2P (focus on the amount: from and to are given); the keys that follow
    at once go to the amount, then Tab to the from-tank (the field after the last), and so on."""
    from deckload.ui.widgets import LoadBoard

    async with app.run_test(size=(120, 40)) as pilot:
        app.screen.query_one(LoadBoard).select(("tank", "WB2P"))
        await type_fast(app, pilot, ["t", *"12t", "shift+tab", *"DB1S", "shift+tab", *"WB2S"])
        assert isinstance(app.screen, TransferForm)
        assert fields(app) == {"xfer-from": "WB2S", "xfer-to": "DB1S", "xfer-amount": "12t"}
        assert app.screen.plan is not None and app.screen.plan.from_id == "WB2S"


async def test_keys_typed_at_once_fill_the_deck_item_form_and_enter_saves_it(app, demo):
    v, c0 = demo
    async with app.run_test(size=(120, 40)) as pilot:
        await type_fast(app, pilot, ["a", *"Crane", "tab", *"12", "tab", *"20", "tab", *"6", "tab", *"1.5", "enter"])
        assert not isinstance(app.screen, ItemFormScreen)
        crane = app.session.condition.deck_items[-1]
        assert (crane.name, crane.mass_t, crane.lcg_m, crane.vcg_m, crane.tcg_m) == ("Crane", 12.0, 20.0, 6.0, 1.5)
        assert len(app.session.condition.deck_items) == len(c0.deck_items) + 1


async def test_a_key_typed_after_enter_closes_a_form_reaches_the_loading_screen(app, demo):
    """⏎ commits the amount; the 'u' typed right after it is the loading screen's undo, not a
    letter in the closing form."""
    v, c0 = demo
    async with app.run_test(size=(120, 40)) as pilot:
        await type_fast(app, pilot, ["enter", *"50%", "enter", "u"])
        assert app.session.condition == c0 and app.session.redo_depth == 1


async def test_nudges_typed_at_once_around_a_form_land_in_order_and_never_in_its_field(app, demo):
    """+ and - are taken by the loading screen before the board sees them (commands.Command.first):
    typed at once, the nudges before ⏎ change the tank, the "-" and "+" typed while the set dialog
    is open go into its field (its preview refuses "4-0+" and ⏎ changes nothing), Esc closes it, and the
    "+" after it nudges again, in the order typed."""
    from deckload.ui.dialogs import PromptForm
    from deckload.ui.widgets import LoadBoard

    v, c0 = demo
    async with app.run_test(size=(120, 40)) as pilot:
        app.screen.query_one(LoadBoard).select(("tank", "FO1P"))
        before = c0.tank_fill("FO1P").value
        await type_fast(app, pilot, ["minus", "minus", "plus", "enter", "4", "minus", "0", "plus"])
        assert isinstance(app.screen, PromptForm)
        assert [i.value for i in app.screen.query(Input)] == ["4-0+"]
        assert app.session.condition.tank_fill("FO1P").value == pytest.approx(before - 1.0)  # − − +: one down
        await type_fast(app, pilot, ["escape", "plus"])
        assert not isinstance(app.screen, PromptForm)
        assert app.session.condition.tank_fill("FO1P").value == pytest.approx(before)
        assert app.session.undo_depth == 4


def screen_text(app) -> list[str]:
    """The screen as the terminal shows it, one string per row."""
    return ["".join(seg.text for seg in strip) for strip in app.screen._compositor.render_strips()]


@pytest.mark.parametrize("size", [(80, 24), (120, 40)])
async def test_every_command_is_reachable_from_the_key_line_or_the_help_it_names(app, size):
    """The bottom row holds ? and q at every width; a command not on it is on the help page ? opens."""
    from deckload.ui.commands import COMMANDS
    from deckload.ui.dialogs import HelpScreen, help_page

    async with app.run_test(size=size) as pilot:
        await pilot.pause()
        bottom = screen_text(app)[-1]
        assert bottom.lstrip().startswith("? ") and bottom.rstrip().endswith("q Quit"), bottom
        assert len(bottom.rstrip()) <= size[0]
        if size[0] == 80:
            assert "? all keys" in bottom  # says that more keys are behind it
        await pilot.press("question_mark")
        await pilot.pause()
        assert isinstance(app.screen, HelpScreen)
        from rich.console import Console

        console = Console(width=100, record=True, no_color=True)
        console.print(help_page())
        page = console.export_text()
        for c in COMMANDS:
            on_line = f"{c.key_text} {c.label}" in bottom
            assert on_line or (c.own_key in page and c.help[:30] in " ".join(page.split())), c.action


async def test_a_long_caution_is_wrapped_whole_at_80_columns_and_a_cut_one_says_so(app):
    from deckload.ui.main_screen import alert_lines
    from deckload.ui.views import Alert

    long = Alert("caution", "G is 0.61 m abaft the KN's free-trim LCG 17.40 m: GZ may be off by cm; "
                            "keep the trim small or use the direct calculation (h)")
    lines = [ln.plain for ln in alert_lines([long], 2, 80)]
    assert len(lines) == 2 and all(len(ln) <= 80 for ln in lines)
    assert " ".join(ln.strip() for ln in lines) == long.line().plain  # every word shown, none cut
    short = Alert("danger", "Draft over the load line")
    lines = [ln.plain for ln in alert_lines([short, long, long], 2, 80)]
    assert lines[0] == short.line().plain
    assert lines[1].startswith("(+2 more: w) ") and lines[1].endswith("…(w)") and len(lines[1]) == 80


def test_the_amount_preview_gives_every_form_of_an_ullage_reading():
    """Demo Trawler FO1P (diesel 0.840 t/m³, 11.56 m³, ullage reference 2.87 m above the tank's
    lowest point, sounding zero at the bottom).  Ullage 1.00 m: level = 2.87 − 1.00 = 1.87 m
    (the profile's reference, vessel_profiles/README.md); volume from the tank's calibration table
    interpolated linearly at that level (common practice; the table is the profile's own), mass =
    volume × 0.840, percent = volume / 11.56.  Typing the volume shown gives back the same sounding."""
    import numpy as np

    from deckload.ui import entry

    v = trawler_vessel()
    c = load_condition(paths.TRAWLER_CONDITIONS["departure"], v)
    tank = v.tank("FO1P")
    level = 2.87 - 1.00
    vol = float(np.interp(level, tank.table[:, 0], tank.table[:, 1]))
    shown = entry.amount_preview(c, tank, "1.00u")
    assert shown == (f"= {100 * vol / 11.56:.1f} % · {vol:.2f} m³ · {vol * 0.840:.2f} t · "
                     f"sounding {level:.3f} m · ullage 1.000 m")
    assert f"sounding {level:.3f} m" in entry.amount_preview(c, tank, f"{vol!r}m3")
    with pytest.raises(entry.EntryError, match="no unit"):
        entry.amount_preview(c, tank, "40")


@pytest.mark.parametrize("size", [(80, 24), (120, 40)])
async def test_the_set_dialog_shows_its_whole_hint_and_a_live_preview_before_enter(app, demo, size):
    """LO1 (lube oil sump, 1.57 m³): the hint's every word is on the screen at both sizes, and
    typing 0.3m shows the percent, m³, t and sounding it comes to before ⏎; nothing changes yet."""
    from deckload.ui import entry
    from deckload.ui.dialogs import PromptForm
    from deckload.ui.widgets import LoadBoard

    v, c0 = demo
    async with app.run_test(size=size) as pilot:
        app.screen.query_one(LoadBoard).select(("tank", "LO1"))
        await pilot.press("enter", *"0.3m")
        await pilot.pause()
        assert isinstance(app.screen, PromptForm)
        rows = screen_text(app)
        inside = " ".join(r.split("│")[1].strip() for r in rows if r.count("│") >= 2 and "╭" not in r)
        hint = entry.amount_hint(v.tank("LO1"), c0.tank_fill("LO1"))
        assert hint in inside, (hint, inside)
        assert entry.amount_preview(c0, v.tank("LO1"), "0.3m") in inside
        assert "sounding 0.300 m" in inside
        assert app.session.condition == c0


def preview_text(app) -> str:
    from deckload.ui.widgets import LinePanel

    return app.screen.query_one("#xfer-preview", LinePanel).plain()


async def test_the_transfer_form_offers_matching_tanks_and_tab_takes_the_one_marked(app, demo):
    """From WB2P (ballast, full): in the to-field "DB" lists the double-bottom ballast tanks with
    room, ↓ marks the second (DB1S), Tab takes it and moves to the amount; 5t ⏎ commits."""
    from deckload.ui.widgets import LoadBoard

    v, c0 = demo
    async with app.run_test(size=(120, 40)) as pilot:
        app.screen.query_one(LoadBoard).select(("tank", "WB2P"))
        await type_fast(app, pilot, ["t", "shift+tab", *"DB"])
        shown = preview_text(app)
        assert "Tanks matching 'DB'" in shown
        listed = [ln.split()[1] if ln.startswith("›") else ln.split()[0] for ln in shown.splitlines()[1:] if ln.strip()]
        assert listed == [t.id for t in v.tanks if t.id.startswith("DB")]
        await type_fast(app, pilot, ["down", "tab"])
        assert fields(app)["xfer-to"] == "DB1S" and app.screen.focused.id == "xfer-amount"
        await type_fast(app, pilot, [*"5t", "enter"])
        c1 = app.session.condition
        assert c1.tank_fill("DB1S") is not None and c1.tank_fill("DB1S").value == pytest.approx(5.0 / v.tank("WB2P").density_t_m3)
        # Only liquids of one kind move: typing fuel in the to-field of a ballast transfer offers nothing.
        app.screen.query_one(LoadBoard).select(("tank", "WB2S"))
        await type_fast(app, pilot, ["t", "shift+tab", *"FO1"])
        assert "No tank here matches 'FO1'" in preview_text(app)


async def test_the_planner_tank_field_picks_word_by_word_and_never_offers_a_tank_twice(app):
    async with app.run_test(size=(120, 40)) as pilot:
        await type_fast(app, pilot, ["i", "tab", *"wb1", "tab"])
        assert fields(app)["plan-tanks"] == "WB1P " and app.screen.focused.id == "plan-tanks"
        await type_fast(app, pilot, [*"wb1"])
        shown = preview_text(app)
        assert "WB1S" in shown and "WB1P" not in shown
        await type_fast(app, pilot, ["enter"])  # ⏎ takes the tank; it does not search yet
        assert fields(app)["plan-tanks"] == "WB1P WB1S " and app.screen.proposal is None


# --------------------------------------------------------------------------- texts found cut in a QA trial


def region_text(app, selector: str) -> str:
    """What the screen shows inside a widget's region (a form without its border, a panel), read
    from the rendered rows, as one text with runs of spaces taken out (a wrapped sentence reads
    as it was written)."""
    widget = app.screen.query_one(selector)
    r = widget.region
    rows = screen_text(app)[r.y: r.y + r.height]
    edge = 1 if widget.styles.border_left[0] else 0
    return " ".join(" ".join(row[r.x + edge: r.x + r.width - edge] for row in rows).split())


@pytest.mark.parametrize("size", [(80, 24), (120, 40)])
async def test_the_transfer_preview_shows_every_criterion_row(app, size):
    from deckload.ui import views
    from deckload.ui.widgets import LoadBoard

    async with app.run_test(size=size) as pilot:
        app.screen.query_one(LoadBoard).select(("tank", "WB2P"))
        await pilot.press("t", *"5t")
        await pilot.pause()
        rows = screen_text(app)
        assert any("Transfer 5.00 t" in r for r in rows)  # the message line, below the panel
        for c in app.session.result.criteria:
            name = f"{views.criterion_name(c):<14.14}".rstrip()
            assert any(r.split("│")[1].lstrip().startswith(name) for r in rows if r.count("│") >= 2), name


@pytest.mark.parametrize("size", [(80, 24), (120, 40)])
async def test_the_verdict_page_fits_the_screen_and_keeps_its_caution_whole(app, size):
    app.animation_level = "none"  # End jumps to the page's end instead of scrolling there for a second
    async with app.run_test(size=size) as pilot:
        await pilot.press("v", "end")
        await pilot.pause()
        await pilot.wait_for_scheduled_animations()
        rows = screen_text(app)
        assert all(len(r) <= size[0] for r in rows)
        assert ("deckload supports, and never replaces, the approved stability booklet, the master's judgement "
                "and flag-State and class rules.") in region_text(app, ".form")


@pytest.mark.parametrize("size, keys", [((120, 40), []), ((80, 24), ["g"])])
async def test_the_gz_title_is_shown_whole(app, size, keys):
    """120×40: "GZ curve to port  max 0.407 m at 30°  zero at 56°  θf 40°" was cut at "θf"; no
    fact of the title is left out at either size (it takes two lines where one is too short)."""
    from deckload.ui import views

    async with app.run_test(size=size) as pilot:
        await pilot.press(*keys)
        await pilot.pause()
        r = app.session.result
        title = " ".join(views.gz_caption(r).plain.replace(" GZ curve", " GZ").split())
        shown = region_text(app, "#gz")
        assert title in shown or title.replace(" GZ", " GZ curve", 1) in shown
        for fact in (f"θf {r.downflooding_angle_deg:.1f}°", f"max {r.max_gz_m:.3f} m", f"zero at {r.vanishing_angle_deg:.1f}°"):
            assert fact in shown, fact


def test_a_recorded_entry_says_what_it_is_once():
    """The log screen's entry read 'condition recorded by TS: condition recorded: …', then named
    each criteria set a second time under the verdict that had named them."""
    from datetime import datetime, timezone

    from deckload.logbook import LogEntry
    from deckload.ui.log_screen import entry_details

    summary = {"condition_name": "Departure", "verdict": "Met: IS Code 2008 Part A 2.2 general criteria.",
               "criteria_sets": [{"id": "IS2008-A2.2", "title": "IS Code 2008 Part A 2.2 general criteria", "pass": True}],
               "smallest_margin": {"description": "Angle of maximum GZ", "value": 29.784, "limit": 25.0,
                                   "margin": 4.784, "unit": "deg"}}
    now = datetime(2026, 3, 1, 8, 0, tzinfo=timezone.utc)
    e = LogEntry(line_no=2, seq=2, utc=now, ship_clock="+00:00", vessel="Demo Islander", by="TS", kind="condition",
                 change_text="condition recorded: Departure", change_data={}, remark="", summary=summary,
                 condition=None, prev_sha256="0" * 64, sha256="1" * 64)
    text = entry_details(e).plain
    assert text.count("condition recorded") == 1 and "condition recorded by TS: Departure" in text
    assert text.count("IS Code 2008 Part A 2.2 general criteria") == 1
    assert "29.8 against 25.0 deg (margin 4.8)" in text  # angles to 0.1°


async def test_a_value_typed_at_once_replaces_the_one_shown(app):
    """FO1P holds 95%: ⏎ opens the set dialog with 95% selected; 40% typed at once replaces it
    (the selection is made before the first key lands), and ⏎ sets it."""
    from deckload.ui.widgets import LoadBoard

    async with app.run_test(size=(120, 40)) as pilot:
        app.screen.query_one(LoadBoard).select(("tank", "FO1P"))
        await type_fast(app, pilot, ["enter", *"40%", "enter"])
        assert app.session.condition.tank_fill("FO1P").value == 40.0


async def test_keys_typed_at_once_reach_the_log_screen_as_it_opens(app):
    """s ⏎ records the condition (initials given), l opens the voyage log, Esc typed at once closes
    it again, in the order typed (every screen, not only the forms, takes its keys once it has
    its focus)."""
    from deckload.ui.log_screen import LogScreen
    from deckload.ui.main_screen import LoadingScreen

    async with app.run_test(size=(120, 40)) as pilot:
        await type_fast(app, pilot, ["s", "enter", "l"])
        assert isinstance(app.screen, LogScreen)
        await type_fast(app, pilot, ["escape", "l", "escape"])
        assert isinstance(app.screen, LoadingScreen)
        assert any(e.kind == "condition" for e in app.session.journal.logbook.entries())


def _area_room_t(c, area) -> float:
    """Room under the deck area's permissible uniform load: max_load_t_m2 × area_m2 less the deck
    items already standing on it (the limit core.stability's deck-load check applies)."""
    return area.max_load_t_m2 * area.area_m2 - sum(d.mass_t for d in c.deck_items if d.area_id == area.id)


@pytest.mark.parametrize("size", [(120, 40), (80, 24)])
async def test_the_deck_item_form_offers_the_deck_areas_with_their_room(app, demo, size):
    """The area field lists the areas matching what is typed, each with the load on it and the
    room left; Tab takes the one marked and ⏎ then saves the item on it."""
    v, c0 = demo
    aft = v.deck_area("AFTDECK")
    async with app.run_test(size=size) as pilot:
        await pilot.press("a", *"Crane", "tab", *"12", "tab", *"20", "tab", *"6", "tab", "tab")
        form = app.screen
        assert isinstance(form, ItemFormScreen) and form.focused.id == "item-area"
        await pilot.pause()
        picker = form.query_one("#area-picker", LinePanel)
        assert picker.display
        listed = picker.plain()
        assert listed.startswith("Deck areas · ↑ ↓ choose")
        line = next(x for x in listed.splitlines() if "AFTDECK" in x)
        assert f"room {_area_room_t(c0, aft):7.1f} t" in line and aft.name in line
        await pilot.press(*"aft")
        await pilot.pause()
        assert "Deck areas matching 'aft'" in picker.plain()
        await pilot.press("tab")
        assert fields(app)["item-area"] == "AFTDECK"
        await pilot.press("enter")
        await pilot.pause()
        assert not isinstance(app.screen, ItemFormScreen)
        crane = app.session.condition.deck_items[-1]
        assert (crane.name, crane.mass_t, crane.area_id) == ("Crane", 12.0, "AFTDECK")


async def test_editing_a_deck_item_shows_the_room_without_counting_that_item(app, demo):
    """Editing a load already on an area: the room shown is what the area would have if this load
    were taken off, since the form replaces it (hand sum: limit × area less the other loads)."""
    v, c0 = demo
    aft = v.deck_area("AFTDECK")
    first = c0.deck_items[0]
    assert first.area_id == "AFTDECK"
    others = c0.with_deck_items(c0.deck_items[1:])
    async with app.run_test(size=(120, 40)) as pilot:
        app.screen.query_one(LoadBoard).select(("deck", 0))
        await pilot.press("enter", *["tab"] * 5)
        form = app.screen
        assert isinstance(form, ItemFormScreen) and form.focused.id == "item-area"
        assert form.focused.value == "AFTDECK"  # a whole id: no list until the officer retypes it
        await pilot.press(*["backspace"] * 7, *"aft")
        await pilot.pause()
        line = next(x for x in form.query_one("#area-picker", LinePanel).plain().splitlines() if "AFTDECK" in x)
        assert f"room {_area_room_t(others, aft):7.1f} t" in line
        assert f"on it {sum(d.mass_t for d in others.deck_items if d.area_id == 'AFTDECK'):6.1f} t" in line


async def test_a_blank_deck_area_stays_blank_unless_one_is_chosen(app, demo):
    """The area is optional: ⏎ on the blank field saves the item on no area; ↓ then ⏎ takes the
    area marked (and a second ⏎ saves)."""
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("a", *"Skiff", "tab", *"2", "tab", *"20", "tab", *"6", "tab", "tab", "enter")
        await pilot.pause()
        assert app.session.condition.deck_items[-1].name == "Skiff"
        assert app.session.condition.deck_items[-1].area_id is None
        await pilot.press("a", *"Raft", "tab", *"1", "tab", *"20", "tab", *"6", "tab", "tab", "down", "enter")
        await pilot.pause()
        assert isinstance(app.screen, ItemFormScreen) and fields(app)["item-area"] == "AFTDECK"
        await pilot.press("enter")
        await pilot.pause()
        assert app.session.condition.deck_items[-1].area_id == "AFTDECK"


@pytest.mark.parametrize("keys", [["v", "end"], ["question_mark", "end"]])
async def test_end_typed_as_a_page_opens_shows_the_pages_end(app, keys):
    """v (the verdict) or ? (the keys) and End typed at once: End is not lost while the page opens,
    and scrolls it to its last line, the caution."""
    from deckload.ui.dialogs import HelpScreen, TextScreen

    app.animation_level = "none"  # End jumps to the page's end instead of scrolling there for a second
    async with app.run_test(size=(80, 24)) as pilot:
        await type_fast(app, pilot, keys)
        await pilot.wait_for_scheduled_animations()
        assert isinstance(app.screen, (TextScreen, HelpScreen))
        assert "flag-State and class rules." in region_text(app, ".form")
