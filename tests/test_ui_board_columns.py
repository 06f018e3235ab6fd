"""The loading board as painted at 120×40 and 80×24 (textual pilot, App.run_test): every mass in
one column, names whole or ending in '…', the message and alert lines never cut silently, and a key
typed before the screen is first drawn moving the view like any other."""

from __future__ import annotations

import re

import pytest
from textual import events

from deckload.core.deadweight import deadweight_by_kind
from deckload.ui import views
from deckload.ui.launch import create_app
from deckload.ui.widgets import LoadBoard
from demo_vessels import demo_departure

SIZES = [(120, 40), (80, 24)]
PRINTED_T = 0.005
"""Masses are printed to 0.01 t: a shown value is within half of that of the one computed."""


@pytest.fixture
def app(tmp_path):
    vessel, condition = demo_departure()  # read once per process (tests/demo_vessels.py)
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


def painted_rows(board: LoadBoard) -> dict[int, str]:
    """Row index → the line as painted in the board's content region, at the current scroll."""
    top = int(board.scroll_offset.y)
    out = {}
    for y in range(board.scrollable_content_region.height):
        if y + top < len(board.rows):
            out[y + top] = "".join(seg.text for seg in board.render_line(y))
    return out


async def every_painted_row(pilot, board: LoadBoard) -> dict[int, str]:
    """Every row of the board as painted, scrolling through it with the keys."""
    seen: dict[int, str] = {}
    for key in ("home", *["pagedown"] * 6, "end"):
        await pilot.press(key)
        await pilot.pause()
        seen.update(painted_rows(board))
    assert set(seen) == set(range(len(board.rows)))
    return seen


def expected_masses(app) -> dict[tuple, float]:
    """What each massed row must show, from the result and the condition (not from the board)."""
    v, c, r = app.session.vessel, app.session.condition, app.session.result
    out: dict[tuple, float] = {("tank", t.id): t.mass_t for t in r.tanks}
    loads = {h.hold_id: h.mass_t for h in c.holds}
    out.update({("hold", h.id): loads.get(h.id, 0.0) for h in v.holds})
    out.update({("deck", i): d.mass_t for i, d in enumerate(c.deck_items)})
    out.update({("const", i): k.mass_t for i, k in enumerate(c.constants)})
    own = {k.name for k in c.constants}
    out.update({("fixed", i): k.mass_t for i, k in enumerate(v.constants) if k.name not in own})
    out.update({("dwt", line.kind): line.mass_t for line in deadweight_by_kind(r)})
    out[("dwt", "total")] = r.deadweight_t
    return out


@pytest.mark.parametrize("size", SIZES)
async def test_every_mass_reads_down_the_tanks_t_column(app, size):
    """Tanks, group totals, the hold, deck loads, constants and the deadweight lines each end their
    mass in the cell where the heading's 't' stands, and the number there is that row's mass."""
    async with app.run_test(size=size) as pilot:
        await pilot.pause()
        board = app.screen.query_one(LoadBoard)
        width = board.scrollable_content_region.width
        lines = await every_painted_row(pilot, board)
        head = lines[0]
        t_end = re.search(r"\st(?=\s|$)", head).end()  # the heading's own 't' over the tonnes
        want = expected_masses(app)
        kinds = {t.id: t.kind for t in app.session.vessel.tanks}
        groups: dict[str, float] = {}
        for key, mass in want.items():
            if key[0] == "tank":
                title = views.KIND_TITLE[kinds[key[1]]]
                groups[title] = groups.get(title, 0.0) + mass
        checked = set()
        for i, row in enumerate(board.rows):
            line = lines[i]
            assert row.text.cell_len <= width, f"{size}: row {i} runs past the board: {row.text.plain!r}"
            if row.key is None and "Σ" in line:  # a group's heading with its total
                title = line[:t_end].split("Σ")[0].strip()
                target = groups[title]
                checked.add(("group", title))
            elif row.key is not None and row.key in want:
                target = want[row.key]
                checked.add(row.key)
            else:
                continue
            assert line[t_end:t_end + 1] in ("", " "), f"{size}: {line!r} runs on past the t column"
            shown = line[:t_end].split()[-1].lstrip("Σ")
            assert float(shown) == pytest.approx(target, abs=PRINTED_T + 1e-9), f"{size}: {line!r}"
        assert {k for k in want} <= checked  # every massed row was found and read
        assert {("group", g) for g in groups} <= checked
        kinds_seen = {k[0] for k in checked}
        assert {"tank", "hold", "deck", "const", "dwt", "group"} <= kinds_seen


@pytest.mark.parametrize("size", SIZES)
async def test_names_are_whole_or_end_in_an_ellipsis_and_the_message_line_gives_them_whole(app, size):
    async with app.run_test(size=size) as pilot:
        await pilot.pause()
        board = app.screen.query_one(LoadBoard)
        v, c = app.session.vessel, app.session.condition
        load = {h.hold_id: h for h in c.holds}
        names = {("hold", h.id): f"{h.id} {h.name}" + (f": {load[h.id].description}" if h.id in load and
                                                      load[h.id].description else "") for h in v.holds}
        names.update({("deck", i): d.name for i, d in enumerate(c.deck_items)})
        names.update({("const", i): k.name for i, k in enumerate(c.constants)})
        lines = await every_painted_row(pilot, board)
        t_end = re.search(r"\st(?=\s|$)", lines[0]).end()
        shortened = whole = 0
        for i, row in enumerate(board.rows):
            if row.key not in names:
                continue
            shown = lines[i][7:t_end - 8].rstrip()  # after the tag, before the mass
            full = names[row.key]
            if shown == full:
                whole += 1
            else:
                assert shown.endswith("…") and full.startswith(shown[:-1]), f"{size}: {shown!r} for {full!r}"
                shortened += 1
            await pilot.pause()
            board.select(row.key)
            await pilot.pause()
            status = app.screen.query_one("#status").plain().strip()
            if row.key[0] == "hold":  # 'H1 Cargo hold · 50.00 t of 250 t · General cargo, palletised · …'
                head, _, stowed = full.partition(": ")
                assert status.startswith(head + " · ") and stowed in status
            else:
                assert status == full or status.startswith(full + " · ") or status.endswith("…")
        assert whole and shortened  # the demo has names that fit and names that do not, at both sizes
        hold_line = next(lines[i] for i, r in enumerate(board.rows) if r.key == ("hold", "H1"))
        assert "General c " not in hold_line + " "  # the cut of the issue: now "General cargo, pal…" or shorter with …


async def test_a_deck_load_s_message_gives_its_mass_position_and_side():
    """What the 80-column board leaves out (the centre of gravity) is on the message line, side as P/S."""
    from deckload.core.model import DeckItem
    from deckload.ui.main_screen import item_summary

    item = DeckItem("Crated generator", 6.5, 12.25, 5.1, -1.6, area_id="AFTDECK")
    assert item_summary(item) == "Crated generator · 6.50 t at x 12.25 m, z 5.10 m, 1.60 m P · on AFTDECK"
    assert "on the centreline" in item_summary(DeckItem("Pipes", 6.0, 2.5, 4.9, 0.0))


@pytest.mark.parametrize("keys, key", [(["end"], ("dwt", "total")), (["pagedown", "pagedown", "pagedown"], None)])
async def test_keys_typed_before_the_screen_is_drawn_move_the_cursor_and_the_view(app, keys, key):
    """Keys typed while deckload starts wait in the queue and reach the board once it is shown:
    the cursor moves and the board scrolls to it (the view used to stay at the top, the cursor
    off screen, because the scroll bar did not exist yet when the key was handled)."""
    for k in keys:  # queued before the app runs, as a terminal hands over type-ahead
        app.post_message(events.Key(k, None))
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.pause()
        board = app.loading_screen.query_one(LoadBoard)
        if key is not None:
            assert board.cursor_key == key
        else:
            assert board.cursor >= 30  # three pages of ten, headings skipped
        top, height = int(board.scroll_offset.y), board.scrollable_content_region.height
        assert top <= board.cursor < top + height, (board.cursor, top, height)
        assert top > 0


async def test_the_first_key_after_the_screen_opens_is_taken_without_a_pause(app):
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.press("end")
        board = app.loading_screen.query_one(LoadBoard)
        await pilot.pause()
        assert board.cursor_key == ("dwt", "total")
        top, height = int(board.scroll_offset.y), board.scrollable_content_region.height
        assert top <= board.cursor < top + height
        assert any("Deadweight" in line and "Σ" in line for line in painted_rows(board).values())


@pytest.mark.parametrize("size", SIZES)
async def test_alerts_and_title_fit_their_line_or_end_in_an_ellipsis(app, size):
    async with app.run_test(size=size) as pilot:
        await pilot.pause()
        # WB1P filled, the double bottoms left empty: a list, and criteria failing by the dozen
        await pilot.press(*["down"] * 4, "f")
        await pilot.pause()
        await pilot.press(*["down"] * 8, "e")
        await pilot.pause()
        screen = app.loading_screen
        panel = screen.query_one("#alerts")
        every = views.alerts(app.session.result, app.session.stale, app.session.problem)
        assert len(every) > panel.size.height  # more than fit: the last line counts the rest
        for line in panel.lines:
            assert line.cell_len <= panel.size.width
        plains = [ln.plain.removesuffix("(w)") for ln in panel.lines]  # a cut alert ends "…(w)": w shows all
        cut = [p for p in plains if p.endswith("…")]
        full = {a.line().plain for a in every}
        for p in plains:
            text = p.split(") ", 1)[-1] if p.startswith("(+") else p
            assert text in full or (text.endswith("…") and any(f.startswith(text[:-1]) for f in full)), text
        assert cut or size == (120, 40)  # at 80 columns the long failures are shortened, visibly
        title = screen.query_one("#titlebar")
        assert title.lines[0].cell_len <= title.size.width
        assert "modified" in title.plain()


def test_a_long_tank_id_takes_cells_from_the_bar_and_is_never_cut_silently():
    """Row = mark 1 + space 1 + id + ◆ 1 + bar + ▕ 1 + % 6 + m³ 8 + t 8 (+ ρ 6) + FSM 7 + * 1."""
    wide = views.TankCols.for_width(64, 7)
    assert (wide.id_w, wide.bar) == (7, 64 - (1 + 1 + 7 + 1 + 1 + 6 + 8 + 8 + 6 + 7 + 1))
    narrow = views.TankCols.for_width(44, 8)  # 44 − 34 fixed cells − the bar's least 4 leaves 6 for the id
    assert (narrow.id_w, narrow.bar) == (6, 4)
    assert views.fit("DB10PS7", narrow.id_w) == "DB10P…" and views.fit("FO1P", 5) == "FO1P "
    assert views.exempt_fsm(10.34) == " ex10.3" and views.exempt_fsm(123.4) == "  ex123"  # never a cut decimal


async def test_the_help_page_prints_every_command_s_text_whole(app):
    """Brackets in a command's help ('the profile's [usual_fill]') are text, not markup that vanishes."""
    from deckload.ui.commands import COMMANDS

    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("question_mark")
        await pilot.pause()
        text = "".join(seg.text for strip in app.screen._compositor.render_strips() for seg in strip)
        fill = next(c for c in COMMANDS if c.action == "fill")
        assert "[usual_fill]" in fill.help and "[usual_fill]" in text
