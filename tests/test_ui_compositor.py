"""The loading screen's partial updates write the same bytes as textual's own (ui/compositor.py).

``RowCompositor`` renders each widget only over the rows a key changed; textual's
``Compositor.render_partial_update`` renders every widget in the box around them, whole.  Both
are run on the same regions to repaint, after real keys (nudges, cursor moves, the message
line growing to two lines) and on regions chosen at random, and what each would write to the
terminal is compared byte for byte.  A panel that hands back its last strips (nothing marked
it dirty) must still show its current lines.
"""

from __future__ import annotations

import random

import pytest
from textual._compositor import Compositor
from textual.geometry import Region
from textual.widget import Widget

from deckload.io import paths
from deckload.io.profiles import load_condition
from deckload.ui.compositor import RowCompositor
from deckload.ui.launch import create_app
from deckload.ui.widgets import LinePanel
from demo_vessels import demo_vessel


@pytest.fixture
def app(tmp_path):
    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


def _random_regions(rng, width: int, height: int, most: int) -> set:
    """One to ``most`` regions within ``width`` × ``height``, each up to 3 rows high."""
    regions = set()
    for _ in range(rng.randrange(1, most + 1)):
        x, y = rng.randrange(width), rng.randrange(height)
        regions.add(Region(x, y, rng.randrange(1, width + 1 - x), rng.randrange(1, min(4, height - y) + 1)))
    return regions


def _both(comp: RowCompositor, regions, console) -> tuple[str, str]:
    """What RowCompositor and textual's compositor would write for ``regions`` (mine first: it
    meets the widgets' dirty lines as a real update does)."""
    comp._dirty_regions.clear()
    comp._dirty_regions.update(regions)
    mine = comp.render_partial_update()
    comp._dirty_regions.update(regions)
    theirs = Compositor.render_partial_update(comp)
    return (mine.render_segments(console) if mine else ""), (theirs.render_segments(console) if theirs else "")


def _shown(panel: LinePanel) -> list[str]:
    w, h = panel.size
    return [strip.text.rstrip() for strip in panel.render_lines(Region(0, 0, w, h))][:len(panel.lines)]


async def test_row_updates_write_what_textual_would(app):
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        screen = app.loading_screen
        comp = screen._compositor
        assert isinstance(comp, RowCompositor)
        seen: list[tuple[frozenset, str, str]] = []
        own = comp.render_partial_update

        def compared():  # every real update of the keys below, checked against textual's
            regions = frozenset(comp._dirty_regions)
            mine = own()
            comp._dirty_regions.update(regions)
            theirs = Compositor.render_partial_update(comp)
            seen.append((regions, mine.render_segments(app.console) if mine else "",
                         theirs.render_segments(app.console) if theirs else ""))
            return mine

        comp.render_partial_update = compared
        for key in ("plus", "plus", "minus", "down", "plus", "up", "minus"):
            await pilot.press(key)
            await pilot.pause()
        screen.say("a refusal long enough to take the second line of the message strip " * 3, ok=False)
        await pilot.pause()
        comp.render_partial_update = own
        assert len(seen) >= 7 and any(len(r) > 2 for r, _, _ in seen)  # real updates, several regions each
        for regions, mine, theirs in seen:
            assert mine == theirs, f"partial update differs for {sorted(regions)}"

        rng = random.Random(13)  # fixed seed: the same regions every run
        for _ in range(40):
            regions = set()
            for _ in range(rng.randrange(1, 5)):  # inside the screen, as textual clips its own
                x, y = rng.randrange(120), rng.randrange(40)
                regions.add(Region(x, y, rng.randrange(1, 121 - x), rng.randrange(1, min(4, 40 - y) + 1)))
            mine, theirs = _both(comp, regions, app.console)
            assert mine == theirs, f"partial update differs for {sorted(regions)}"

        for panel in screen.query(LinePanel):
            if panel.display and panel.size.area:
                assert _shown(panel) == [t.plain.rstrip()[:panel.size.width] for t in panel.lines], panel.id
                # The panels draw their lines without textual's per-line border and padding walk
                # (LinePanel._bare_lines): segment for segment what textual's own way gives.
                assert panel._plain_box(panel.size), panel.id
                w, h = panel.size
                for crop in (Region(0, 0, w, h), Region(3, 0, w - 5, h), Region(0, h - 1, w, 1)):
                    panel._painted = None
                    mine = [list(s) for s in panel.render_lines(crop)]
                    panel._styles_cache.clear()
                    theirs = [list(s) for s in Widget.render_lines(panel, crop)]
                    assert mine == theirs, (panel.id, crop)


async def test_a_panel_draws_terminal_colours_and_dim_text_as_textual_does():
    """A line all in RGB colours skips textual's ANSI-to-RGB colour filter (it would give the line
    back unchanged); a line with a terminal's numbered colour, its default colour or dim text must
    still go through it.  Each kind of line, and a blank line under them, drawn by the panel's own
    way and by textual's (``Widget.render_lines``): segment for segment the same."""
    from rich.style import Style
    from rich.text import Text
    from textual.app import App

    rgb = Style(color="#c8b88a", bgcolor="#1b2127")
    lines = [
        Text.assemble(("GM ", rgb), ("0.812 m", Style(color="#e6e2d6", bold=True))),  # RGB only
        Text.assemble(("list ", rgb), ("2.1° port", Style(color="red"))),  # a numbered colour
        Text.assemble(("trim ", rgb), ("0.30 m", Style(color="default"))),  # the terminal's default
        Text.assemble(("KG ", rgb), ("4.020 m", Style(color="#e6e2d6", dim=True))),  # dim, with a colour
        Text("flat", style=Style(bgcolor="color(4)")),  # a numbered background, no spans
    ]

    class One(App):
        CSS = "LinePanel { height: 7; background: #1b2127; color: #e6e2d6; }"

        def compose(self):
            yield LinePanel(id="p")

    app = One()
    async with app.run_test(size=(40, 9)) as pilot:
        panel = app.query_one(LinePanel)
        panel.set_lines(lines)
        await pilot.pause()
        w, h = panel.size
        for crop in (Region(0, 0, w, h), Region(2, 1, w - 4, 3)):
            panel._painted = None
            mine = [list(s) for s in panel.render_lines(crop)]
            panel._styles_cache.clear()
            theirs = [list(s) for s in Widget.render_lines(panel, crop)]
            assert mine == theirs, crop
        assert panel._true == {0}  # only the RGB line skipped the filter


async def test_the_board_draws_its_lines_as_textual_does(app):
    """The loading board draws its content lines, the scroll bar's gutter and its right border
    itself (LoadBoard._boxed_lines), without textual's per-line walk through every border, padding
    and outline rule: segment for segment what textual's own way (``Widget.render_lines``) gives,
    focused and not, scrolled and not, for the whole board and for bands of it; and kept finished
    lines after a nudge are still right."""
    from deckload.ui.widgets import LoadBoard

    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        board = app.loading_screen.query_one(LoadBoard)
        assert board._side_box(board._box_styles()) is not None  # the box deckload.tcss gives it takes the board's own way

        def same(where: str) -> None:
            w, h = board.region.size
            for crop in (Region(0, 0, w, h), Region(0, 3, w, 5), Region(2, h - 1, w - 4, 1), Region(0, 0, w - 1, 2)):
                mine = [list(s) for s in board.render_lines(crop)]
                board._styles_cache.clear()
                theirs = [list(s) for s in Widget.render_lines(board, crop)]
                assert mine == theirs, (where, crop)

        same("as opened, focused")
        await pilot.press("plus")
        await pilot.pause()
        same("after a nudge")
        board.blur()
        await pilot.pause()
        same("not focused")
        board.focus()
        await pilot.press("end")
        await pilot.pause()
        assert board.scroll_offset.y > 0  # the demo's board is longer than the screen
        same("scrolled to the end")


async def test_a_panel_follows_a_change_of_its_own_or_a_parents_style():
    """A panel reads its look (rich style, background colours, plain box) again only when a style
    it is made from changed (LinePanel._look, keyed by textual's change counts of its styles and
    its parents').  A class on the parent that changes the parent's background, an inline
    background on the panel and inline padding (which takes textual's own way): after each, the
    panel draws what textual's own way gives, in the new colours."""
    from rich.text import Text
    from textual.app import App
    from textual.containers import Vertical

    class One(App):
        CSS = """
        Vertical { background: #1b2127; }
        Vertical.-alarm { background: #5a1e1e; }
        LinePanel { height: 3; color: #e6e2d6; background: 50%; }
        """

        def compose(self):
            with Vertical():
                yield LinePanel(id="p")

    def backgrounds(strips) -> set:
        return {seg.style.bgcolor.triplet for strip in strips for seg in strip if seg.style and seg.style.bgcolor}

    app = One()
    async with app.run_test(size=(30, 5)) as pilot:
        panel = app.query_one(LinePanel)
        panel.set_lines([Text("GM 0.812 m"), Text("list 0.0°")])
        await pilot.pause()
        w, h = panel.size
        crop = Region(0, 0, w, h)

        def drawn() -> list:
            panel._painted = None
            mine = panel.render_lines(crop)
            panel._styles_cache.clear()
            assert [list(s) for s in mine] == [list(s) for s in Widget.render_lines(panel, crop)]
            return mine

        calm = backgrounds(drawn())
        app.query_one(Vertical).add_class("-alarm")
        await pilot.pause()
        alarm = backgrounds(drawn())
        assert alarm != calm
        panel.styles.background = "#204060"
        await pilot.pause()
        inline = backgrounds(drawn())
        assert inline not in (calm, alarm)
        panel.styles.padding = (0, 1)
        await pilot.pause()
        assert not panel._plain_box(panel.size)
        drawn()


@pytest.mark.parametrize("size", [(120, 40), (80, 24)])
async def test_full_updates_write_what_textual_would(app, size):
    """A full update (the first frame, every layout) and ``render_strips`` render every row whole
    but leave out the containers their children tile (RowCompositor._every_row): what the
    terminal receives, and the screen's strips, are textual's own, as opened, after keys, and
    under a form."""
    async with app.run_test(size=size) as pilot:
        await pilot.pause()
        comp = app.loading_screen._compositor
        assert isinstance(comp, RowCompositor)
        for keys in ((), ("plus", "down", "down", "minus"), ("t",)):
            for key in keys:
                await pilot.press(key)
            await pilot.pause()
            mine = comp.render_full_update().render_segments(app.console)
            assert mine == Compositor.render_full_update(comp).render_segments(app.console), keys
            assert [list(s) for s in comp.render_strips()] == [list(s) for s in Compositor.render_strips(comp)]
        assert app.screen is not app.loading_screen  # the transfer form is open on top


def _written(update, console) -> str:
    """What an update would write to the terminal; a cut left without a strip (None where textual
    calls ``strip.render``) is what the officer saw as an internal error, here a difference."""
    if update is None:
        return ""
    try:
        return update.render_segments(console)
    except AttributeError as error:
        return f"not drawable: {error!r}"


async def test_updates_after_resizes_write_what_textual_would(app):
    """A resize lays the screen out again, and the first frame after it is drawn before the widgets
    hear of their new size (textual sends the Resize event after the frame): a widget may then
    give strips shorter than its new width.  textual's compositor lets the widget behind fill the
    rest of the row; RowCompositor had already counted the row as covered and left out the screen
    behind, so a cut had no strip and drawing it failed (an internal error ~0.6 s after the terminal
    was widened, found in a real terminal).  Every update, full and partial, through resizes
    wider, narrower, both, only taller, several in a row, with keys typed before the layout has
    caught up, must write what textual's own compositor writes; and so must random regions at
    each size."""
    from textual import events
    from textual.geometry import Size

    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.pause()
        comp = app.loading_screen._compositor
        assert isinstance(comp, RowCompositor)
        seen: list[tuple[str, Size, str, str]] = []
        own_full, own_partial = comp.render_full_update, comp.render_partial_update

        def full(simplify: bool = False):
            mine = own_full(simplify)
            theirs = Compositor.render_full_update(comp, simplify)
            seen.append(("full", comp.size, _written(mine, app.console), _written(theirs, app.console)))
            return mine

        def partial():
            regions = set(comp._dirty_regions)
            mine = own_partial()
            comp._dirty_regions.update(regions)
            theirs = Compositor.render_partial_update(comp)
            seen.append(("partial", comp.size, _written(mine, app.console), _written(theirs, app.console)))
            return mine

        def resize(width: int, height: int) -> None:
            # pilot.resize_terminal without its wait: the keys after it go in before the layout
            size = Size(width, height)
            app._driver._size = size
            app.post_message(events.Resize(size, size))

        comp.render_full_update, comp.render_partial_update = full, partial
        rng = random.Random(29)  # fixed seed: the same regions every run
        steps = [
            ([(100, 30)], ("plus",)),  # wider and taller
            ([(120, 30)], ("down", "plus")),  # wider only
            ([(121, 31)], ()),  # a column and a row
            ([(90, 31)], ("minus",)),  # narrower only
            ([(60, 20)], ("up", "plus")),  # narrower and shorter
            ([(200, 60), (81, 25), (150, 40)], ("plus", "minus")),  # several in a row
            ([(150, 50)], ("down",)),  # taller only
            ([(160, 30)], ("plus",)),  # wider and shorter
            ([(80, 24)], ()),  # back to where it began
        ]
        for sizes, keys in steps:
            start = len(seen)
            for size in sizes:
                resize(*size)
            for key in keys:
                await pilot.press(key)
            for _ in range(3):
                await pilot.pause(0.02)
            width, height = sizes[-1]
            assert comp.size == Size(width, height)
            assert any(kind == "full" and size == comp.size for kind, size, _, _ in seen[start:]), sizes
            for _ in range(8):
                regions = _random_regions(rng, width, height, 4)
                mine, theirs = _both(comp, regions, app.console)
                assert mine == theirs, (sizes, sorted(regions))
        comp.render_full_update, comp.render_partial_update = own_full, own_partial
        assert sum(kind == "partial" for kind, *_ in seen) >= 5  # the keys' updates were compared too
        for kind, size, mine, theirs in seen:
            assert not mine.startswith("not drawable"), (kind, size, mine)
            assert mine == theirs, (kind, size)


async def test_a_widget_giving_short_strips_leaves_the_rest_of_its_row_to_the_one_behind():
    """A widget may give strips shorter than its region (lines kept from an older width) or fewer
    than the rows asked for.  textual's ``_render_chops`` divides a strip at the row's cuts and
    gives a piece only to the cuts before the last one the strip reaches; the others take the strip
    of the widget behind.  RowCompositor must leave out a container only where its children's
    strips really reach: full updates, ``render_strips`` and partial updates of random regions
    write what textual's own compositor writes, including over a widget in a layer in front whose
    edges cut the short rows."""
    from rich.segment import Segment
    from textual.app import App
    from textual.containers import Horizontal, Vertical
    from textual.screen import Screen
    from textual.strip import Strip

    class Short(Widget):
        """Strips ``short`` cells short of the widget's width on even rows, none on its last row."""

        def __init__(self, short: int, *, id: str) -> None:
            super().__init__(id=id)
            self.short = short

        def render_lines(self, crop: Region) -> list[Strip]:
            width, height = self.size
            strips = []
            for y in crop.line_range:
                if y == height - 1:
                    break
                cells = width - self.short if y % 2 == 0 else width
                strip = Strip([Segment(f"{self.id}{y}".ljust(cells, "·")[:cells])], cells)
                strips.append(strip.crop(crop.x, crop.right))
            return strips

    class Rows(Screen):
        CSS = """
        Rows { layers: base top; }
        Vertical { background: #1b2127; }
        #a { height: 5; }
        Horizontal { height: 4; background: #204060; }
        #b { width: 1fr; }
        #c { width: 12; }
        #pop { layer: top; width: 6; height: 2; offset: 9 1; background: #5a1e1e; }
        """

        def __init__(self) -> None:
            super().__init__()
            self._compositor = RowCompositor()

        def compose(self):
            with Vertical():
                yield Short(7, id="a")
                with Horizontal():
                    yield Short(25, id="b")
                    yield Short(3, id="c")
            yield Short(4, id="pop")

    class One(App):
        def on_mount(self) -> None:
            self.push_screen(Rows())

    app = One()
    async with app.run_test(size=(40, 12)) as pilot:
        await pilot.pause()
        comp = app.screen._compositor
        assert isinstance(comp, RowCompositor)
        for size in ((40, 12), (33, 12), (52, 14)):
            await pilot.resize_terminal(*size)
            for _ in range(50):  # a loaded machine may take more than one pause to lay the screen out again
                await pilot.pause()
                if tuple(comp.size) == size:
                    break
            assert tuple(comp.size) == size
            assert _written(comp.render_full_update(), app.console) == _written(
                Compositor.render_full_update(comp), app.console), size
            assert [list(s) for s in comp.render_strips()] == [list(s) for s in Compositor.render_strips(comp)], size
            width, height = size
            rng = random.Random(width)
            for _ in range(30):
                regions = _random_regions(rng, width, height, 3)
                mine, theirs = _both(comp, regions, app.console)
                assert mine == theirs, (size, sorted(regions))
