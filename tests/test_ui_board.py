"""The loading board on the demo vessel as it is painted: the IS-rule mark, group heading rows,
the deadweight breakdown by kind (textual pilot, App.run_test)."""

from __future__ import annotations

import re

from datetime import datetime, timezone
from types import SimpleNamespace

import pytest

from deckload.io import paths
from deckload.io.profiles import load_condition
from deckload.ui import views
from deckload.ui.launch import create_app
from deckload.ui.widgets import LoadBoard
from demo_vessels import demo_vessel


@pytest.fixture
def app(tmp_path):
    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


def painted(board: LoadBoard) -> list[str]:
    """The board's lines exactly as painted in its content region (what the officer sees)."""
    return ["".join(seg.text for seg in board.render_line(y)) for y in range(board.scrollable_content_region.height)]


def ruled_tanks(app) -> set[str]:
    """Tanks whose FSM the IS 2008 B 3.1 rule sets (assumed/maximum), not the actual level."""
    return {t.id for t in app.session.result.tanks
            if t.fs_rule.startswith(("assumed", "variable", "nominally full cargo"))}


@pytest.mark.parametrize("size", [(120, 40), (80, 24)])
async def test_the_rule_mark_survives_scrolling_and_narrow_screens(app, size):
    async with app.run_test(size=size) as pilot:
        board = app.screen.query_one(LoadBoard)
        ruled = ruled_tanks(app)
        assert {"FO1P", "CF2S"} <= ruled  # the demo's fuel (variable level) and cargo (nominally full) tanks
        seen: set[str] = set()
        await pilot.pause()  # the screen takes keys once it is laid out
        for key in ("home", *["pagedown"] * 6, "end"):  # every scroll position the keys reach
            await pilot.press(key)
            await pilot.pause()
            for line in painted(board):
                words = line[1:].split()
                if words and words[0] in ruled:
                    assert line.rstrip().endswith("*"), f"{size}: mark lost on {line!r}"
                    seen.add(words[0])
                elif words and words[0] in {t.id for t in app.session.vessel.tanks}:
                    assert not line.rstrip().endswith("*"), line
        assert seen == ruled  # every ruled tank was painted, with its mark, at some scroll position
        assert board.scroll_offset.y > 0 or size == (120, 40)  # 80×24 really scrolled


@pytest.mark.parametrize("size", [(120, 40), (80, 24)])
async def test_group_headings_stand_on_rows_of_their_own(app, size):
    """A group's total ("Fuel oil … Σ 21.28") is a heading line, never on a tank's line."""
    async with app.run_test(size=size) as pilot:
        await pilot.pause()
        rows = app.screen.query_one(LoadBoard).rows
        ids = {t.id for t in app.session.vessel.tanks}
        headings = [r for r in rows if "Σ" in r.text.plain]
        assert len(headings) == 7  # six liquid kinds of the demo and the deadweight total
        assert all(r.key is None or r.key == ("dwt", "total") for r in headings)
        for r in rows:
            if r.key is not None and r.key[0] == "tank":
                assert "Σ" not in r.text.plain
                assert not any(title in r.text.plain for title in views.KIND_TITLE.values())
        fuel = [r for r in rows if r.text.plain.startswith(" Fuel oil")]
        assert len(fuel) == 1 and fuel[0].key is None  # the kind is named once, on its heading
        by_hand = 2 * 0.95 * 13.1773 * 0.85  # FO1P/S at 95 % of 13.1773 m³ at 0.85 t/m³ (demo profile)
        assert f"Σ{by_hand:7.2f}" in fuel[0].text.plain and not any(tid in fuel[0].text.plain for tid in ids)


async def test_deadweight_by_kind_adds_up_to_the_deadweight_by_hand(app):
    """Deadweight = Δ − lightship = everything aboard (common practice).  The hand sum takes the
    condition file's own numbers: a tank at p % holds p/100 · capacity · ρ; holds, deck loads and
    constants as stated."""
    async with app.run_test(size=(80, 24)) as pilot:
        v, c, r = app.session.vessel, app.session.condition, app.session.result
        tanks = {f.tank_id: f.value / 100.0 * v.tank(f.tank_id).capacity_m3 * v.tank(f.tank_id).density_t_m3
                 for f in c.tanks}
        assert all(f.quantity == "percent" for f in c.tanks)
        by_kind = {}
        for tid, mass in tanks.items():
            kind = v.tank(tid).kind
            by_kind[kind] = by_kind.get(kind, 0.0) + mass
        holds = sum(h.mass_t for h in c.holds)
        deck = sum(d.mass_t for d in c.deck_items)
        stores = sum(k.mass_t for k in c.constants) + sum(k.mass_t for k in v.constants)
        # Cargo by hand: hold 50 t + deck 14 + 13 + 3.5 + 6 t + four CF tanks at 98 % of 43.2 m³ at 0.85 t/m³.
        cargo = 50.0 + 36.5 + 4 * 0.98 * 43.2 * 0.85
        assert holds + deck + by_kind["cargo_liquid"] == pytest.approx(cargo, abs=1e-9)
        hand_total = sum(tanks.values()) + holds + deck + stores
        assert r.deadweight_t == pytest.approx(hand_total, abs=1e-6)  # float sums of ~30 terms
        await pilot.pause()  # the screen takes keys once it is laid out
        await pilot.press("end")
        await pilot.pause()
        shown = {}
        for line in painted(app.screen.query_one(LoadBoard)):
            for title in ("Cargo", "Fuel oil", "Diesel oil", "Lube oil", "Fresh water", "Ballast water",
                          "Stores and constants", "Deadweight"):
                if line.startswith(f"  {title} "):
                    shown[title] = float(line.split()[-2])
        expected = {"Cargo": cargo, "Fuel oil": by_kind["fuel_oil"], "Diesel oil": by_kind["diesel"],
                    "Lube oil": by_kind["lube_oil"], "Fresh water": by_kind["fresh_water"],
                    "Ballast water": by_kind["ballast"], "Stores and constants": stores, "Deadweight": hand_total}
        assert set(shown) == set(expected)
        for title, mass in expected.items():
            assert shown[title] == pytest.approx(mass, abs=0.005 + 1e-9), title  # printed to 0.01 t
        parts = sum(m for t, m in shown.items() if t != "Deadweight")
        assert parts == pytest.approx(shown["Deadweight"], abs=7 * 0.005)  # seven lines each rounded to 0.01 t


def test_every_liquid_kind_falls_in_one_deadweight_line():
    """No tank's mass can be left out of the breakdown: every kind a profile may give maps to a line."""
    from deckload.core import deadweight
    from deckload.core.model import LIQUID_KINDS

    lines = dict(deadweight.DWT_LINES)
    for kind in LIQUID_KINDS:
        assert deadweight._TANK_LINE.get(kind, kind) in lines, kind


def test_a_logged_condition_keeps_its_deadweight_by_kind_and_load_line():
    """The voyage log's summary carries the breakdown and the mark's allowed draft, shown in the
    entry's details; entries written before they existed show without them."""
    from deckload.core.stability import evaluate
    from deckload.io.profiles import load_condition
    from deckload.logbook.records import summarise
    from deckload.ui.log_screen import entry_details

    v = demo_vessel()
    r = evaluate(v, load_condition(paths.DEMO_CONDITIONS["departure"], v))
    s = summarise(r)
    assert sum(s["deadweight_by_kind_t"].values()) == pytest.approx(r.deadweight_t, abs=1e-9)  # same terms summed
    assert s["load_line_mark"] == "summer" and s["load_line_allowed_draft_m"] == r.load_line_allowed_draft_m

    when = datetime(2026, 12, 2, 21, 0, tzinfo=timezone.utc)
    entry = SimpleNamespace(seq=7, ship_time=when, ship_clock="+00:00", utc=when, kind="condition", by="TS",
                            change_text="condition recorded", remark="", summary=s, change_data={},
                            sha256="0" * 64)  # the fields it reads
    text = entry_details(entry).plain
    assert re.search(r"Deadweight by kind +Cargo 230\.44 t · Fuel oil 21\.28 t", text)  # in the value column
    assert f"summer, allows {r.load_line_allowed_draft_m:.3f} m in this water" in text
    entry.summary = {k: v for k, v in s.items() if k not in ("deadweight_by_kind_t", "load_line_mark")}
    assert "Deadweight by kind" not in entry_details(entry).plain


@pytest.mark.parametrize("keys", [("end", "home"), ("pagedown",) * 2 + ("pageup",) * 6, ("down",) * 40 + ("up",) * 40])
async def test_back_on_the_first_tank_the_column_names_are_in_view(app, keys):
    """Scrolled down and back by keys to the first tank, the board shows its first lines again, the
    columns' names among them, as at start (a real-terminal trial found them left scrolled away,
    only the mouse wheel bringing them back)."""
    async with app.run_test(size=(120, 30)) as pilot:
        await pilot.pause()
        board = app.screen.query_one(LoadBoard)
        first = painted(board)[0]
        assert "fill" in first and "FSM" in first
        await pilot.press(*keys)
        await pilot.pause()
        assert board.cursor_key == ("tank", app.session.vessel.tanks[0].id)
        assert int(board.scroll_offset.y) == 0 and painted(board)[0] == first
