"""Line-API widgets that paint pre-formatted lines: cheap to repaint on every key.

A ``DataTable`` redraws every visible row on any update (about 110 ms for 60
rows here); these widgets only turn a few dozen ready-made Texts into strips.
"""

from __future__ import annotations

from rich.cells import cell_len
from rich.segment import Segment
from rich.style import Style
from rich.text import Text
from textual._border import get_box
from textual.binding import Binding
from textual.filter import ANSIToTruecolor
from textual.geometry import Region, Size
from textual.message import Message
from textual.scroll_view import ScrollView
from textual.strip import Strip
from textual.style import Style as VisualStyle
from textual.reactive import reactive
from textual.widget import Widget
from textual.widgets import Input

from deckload.core.model import Condition, Vessel
from deckload.core.result import Result
from deckload.ui import views


def _strip(text: Text, console) -> Strip:
    segments = [s for s in text.render(console) if s.text != "\n"]
    if not text.spans and text.style:
        # Text.render drops the base style of a line without spans (rich leaves it to the
        # console); our message and verdict lines are exactly that, so it is applied here.
        segments = list(Segment.apply_style(segments, console.get_style(text.style)))
    return Strip(segments, text.cell_len)


_NULL = Style.null()

_ONE_CELL = frozenset(chr(c) for c in range(0x20, 0x7F)) | frozenset(
    c for c in "°±²³µ¶·×ΔΣθρφ–—“”…›↑→↓−∠≈≤≥│┊┤─├┼█▉▊▋▌▍▎▏▕■▲▸▼◂◆✔✖"
    + "".join(map(chr, range(0x2800, 0x2900))) if cell_len(c) == 1)
"""Printable ASCII and the symbols our lines are drawn with (and braille, the GZ chart's dots) that
rich itself measures one cell wide (checked here, character by character, against rich's table)."""


def cells(text: str) -> int:
    """``rich.cells.cell_len(text)``: the cells ``text`` takes on the terminal.  A line of our own
    characters (:data:`_ONE_CELL`) takes one cell each; rich measures a line holding any character
    outside its short list of one-cell ranges (a "≥", a "…") character by character, each a
    function call and a cache lookup, for every line a key changes."""
    return len(text) if _ONE_CELL.issuperset(text) else cell_len(text)

_SUMS: dict[Style, dict[tuple[int, int], tuple[Style, Style, Style, bool]]] = {}
"""Per panel style ``own``: ``own + base + span`` of the palette styles (ui/palette.py) a line is
made of, keyed by the two styles' identities (the palette's objects live as long as the program;
each entry holds its two, so an id is never another style's while it is kept), with whether the
sum is :func:`_true_colour`.  rich's ``Style.__add__`` is a method call, type checks and a cache
lookup hashing both styles in Python each time; a line has a dozen of them."""


def _true_colour(style: Style) -> bool:
    """True when textual's ``ANSIToTruecolor`` line filter leaves ``style`` as it is: its colours
    are given as RGB (not a terminal's numbered or default colour) and it is not dim with a colour
    (``ANSIToTruecolor.truecolor_style``)."""
    color, bgcolor = style.color, style.bgcolor
    return ((color is None or color.triplet is not None) and (bgcolor is None or bgcolor.triplet is not None)
            and not (style.dim and color is not None))


def _sums(own: Style) -> dict[tuple[int, int], tuple[Style, Style, Style, bool]]:
    sums = _SUMS.get(own)
    if sums is None:
        if len(_SUMS) > 64:  # a bound, in case panel styles were made without end (themes, not keys)
            _SUMS.clear()
        sums = _SUMS[own] = {}
    return sums


def _plus(sums: dict, own: Style, base: Style, span: Style) -> tuple[Style, bool]:
    """``own + base + span`` and whether it is :func:`_true_colour`, kept in ``sums`` (own's)."""
    got = sums.get((id(base), id(span)))
    if got is None or got[0] is not base or got[1] is not span:
        if len(sums) > 4096:  # a bound, in case styles were made without end (not our panels)
            sums.clear()
        total = own + base + span
        got = sums[(id(base), id(span))] = (base, span, total, _true_colour(total))
    return got[2], got[3]


def type_into(field, text: str) -> None:
    """``text`` typed into a textual ``Input`` as its own keys would be: at the cursor, or over the
    selection (Input's handling of a printable key and of a paste)."""
    if field.selection.is_empty:
        field.insert_text_at_cursor(text)
    else:
        field.replace(text, *field.selection)


def fit_width(text: Text, width: int) -> Text:
    """``text`` cut to ``width`` cells, never silently: a line too wide ends in "…", and a word or
    number the edge would split is left out whole (a cut "32.33" read "32", a cut "1234" "12").
    A file path is the exception: cut where the edge falls, "/work/logs/work…", its start says
    more than nothing would, and no one reads a cut path as a whole one.  A line that fits is
    returned as it is."""
    plain = text.plain
    if cells(plain) <= width:
        return text
    if width <= 1:
        return Text("…"[:width], style=text.style)
    cut, used = 0, 0
    while cut < len(plain) and used + cell_len(plain[cut]) <= width - 1:
        used += cell_len(plain[cut])
        cut += 1
    start = cut
    while start > 0 and not plain[start - 1].isspace() and start < len(plain) and not plain[start].isspace():
        start -= 1  # back to the start of the split word
    end = cut
    while end < len(plain) and not plain[end].isspace():
        end += 1
    if "/" not in plain[start:end]:
        cut = start
    out = text[:cut]
    out.pad_right(width - 1 - cell_len(out.plain))
    out.append("…")
    return out


def _line_strip(text: Text, width: int, own: Style, console) -> tuple[Strip, bool]:
    """``text`` as one line ``width`` cells wide on the panel's style ``own``: what
    ``_strip(text).crop_extend(0, width, None).apply_style(own)`` gives, made directly; and
    whether every style in it is :func:`_true_colour` (textual's colour filter would give
    the same line again).

    Our lines are a base style with side-by-side spans of ready-made styles (palette.P):
    each piece is cut from the plain text and styled ``own + base + span`` in one step.
    Anything else (overlapping spans, style names, a line wider than the panel) takes
    the general way above."""
    plain = text.plain
    n = cells(plain)
    if n > width:
        text = fit_width(text, width)
        plain = text.plain
        n = cells(plain)
    spans = text.spans
    base = text.style or _NULL  # Text's default style "" is the null style
    if not plain or n > width or not isinstance(base, Style):
        return _strip(text, console).crop_extend(0, width, None).apply_style(own), False
    sums = _sums(own)
    segments: list[Segment] = []
    add = segments.append
    own_base, true = _plus(sums, own, base, _NULL)
    if not spans:  # a line of one style ("✔ done", "no result"): its base style is its colour
        add(Segment(plain, own_base))
    else:
        pos = 0
        for span in spans:
            start, end, style = span
            if start < pos or not isinstance(style, Style):
                return _strip(text, console).crop_extend(0, width, None).apply_style(own), False
            if end <= start:
                continue
            if start > pos:
                add(Segment(plain[pos:start], own_base))
            styled, ok = _plus(sums, own, base, style)
            true = true and ok
            add(Segment(plain[start:end], styled))
            pos = end
        if pos < len(plain):
            add(Segment(plain[pos:], own_base))
    if n < width:
        own_only, ok = _plus(sums, own, _NULL, _NULL)
        true = true and ok
        add(Segment(" " * (width - n), own_only))
    return Strip(segments, width), true


def _repaint(widget: Widget, *regions: Region) -> None:
    """What ``widget.refresh(*regions)`` does for a repaint, with the screen told at once that the
    widget is to be repainted.

    textual hears of a repaint at the widget's next idle: ``refresh`` wakes the widget's message
    loop, which at its idle posts an ``Update`` to the screen, and the screen wakes again to take
    it: one round through the event loop for each panel a key changed.  Until the last of them
    lands the screen may look idle, and then it runs the callbacks meant for after the frame
    (``call_after_refresh``) before the frame: the session's writes (``Session.write_in_background``)
    went to the writer thread while the frame was still being drawn and took the interpreter from
    it.  Here the widget's caches are cleared and its regions marked as ``Widget.refresh`` does
    (textual 8.2), and the widget is added to the screen's repaint set as ``Screen._on_update``
    does: the frame waits for nothing and the callbacks for after it wait for it
    (``tests/test_ui_repaint.py``).  A widget not laid out on a screen, hidden or closing takes
    textual's own way.
    """
    if widget._is_mounted and widget.display and not widget._closing:
        screen = widget.screen
        if screen in screen._compositor:  # the condition Screen._on_update puts on an Update
            widget._layout_cache.clear()
            widget._set_dirty(*regions)
            widget.clear_cached_dimensions()
            widget._rich_style_cache.clear()
            screen._dirty_widgets.add(widget)
            screen.check_idle()
            return
    widget.refresh(*regions)


def _look(widget: Widget, read, *more) -> tuple:
    """The widget's look as ``read()`` gives it, kept in ``widget._look`` and read again only when
    :func:`_look_key` moves (a style it is made from changed), or any of ``more`` (the change
    counts of the component styles it also reads)."""
    key = _look_key(widget) + more
    kept = widget._look
    if kept is None or kept[0] != key:
        kept = widget._look = (key, read())
    return kept[1]


def _no_effects(widget: Widget) -> bool:
    """No outline, tint, hatch, opacity or text opacity: what both the panels' and the board's own
    drawing leave out (each checks its borders and padding itself)."""
    st = widget.styles
    return (not any(kind for kind, _ in st.outline) and not st.tint.a and st.text_opacity == 1.0
            and not st.has_rule("hatch") and widget.opacity == 1.0)


def _columns(strips: list[Strip], crop: Region, width: int) -> list[Strip]:
    """``strips`` cut to the columns of ``crop`` (as textual's line cache cuts them)."""
    x1, x2 = crop.column_span
    return strips if (x1, x2) == (0, width) else [strip.crop(x1, x2) for strip in strips]


def _look_key(widget: Widget) -> tuple:
    """What a widget's look (its rich style, background colours and box) is made from: each node
    from the widget up to the app, by identity, with textual's count of the changes to its styles
    (``RenderStyles._cache_key``: its CSS rules, inline styles and animated values each move it).
    A few attribute reads, against a walk through every style of every parent for each look."""
    key = []
    node = widget
    while node is not None:
        key.append(id(node))
        key.append(node.styles._cache_key)
        node = node._parent
    return tuple(key)


class LinePanel(Widget):
    """A fixed-size panel showing the lines it is given; an update repaints, no layout.

    The panel's own style (``rich_style``, a walk up the parents) is read once per render
    pass, not once per line; the finished lines are kept until their text, that style or the
    panel's width changes.

    textual's partial update renders every widget that overlaps the box around all the regions
    to repaint, each whole: after a key that changes the title and the message line that is every
    panel.  A panel nothing has marked dirty since its last render (textual's own line cache
    would give the same lines) hands back the strips it gave then: same crop, size, background
    and line filters, else it renders as usual.
    """

    def __init__(self, *, id: str | None = None, classes: str | None = None):
        super().__init__(id=id, classes=classes)
        self._lines: list[Text] = []
        self._strips: dict[int, Strip] = {}
        self._made: dict[int, tuple] = {}
        """Strips by the line they were made from (its identity; the entry holds it, so that an id is
        never another line's while kept), with the style and width they were made at: a kept line
        (shared and never modified, views._pair_line...) that comes back, to the same row or
        another, is not made again."""
        self._true: set[int] = set()
        """Lines whose kept strip textual's colour filter would give back as it is (see :func:`_line_strip`)."""
        self._style: Style | None = None
        self._width: int | None = None
        self._strips_width: int | None = None
        """The width the kept strips (``_strips``) were made at."""
        self._painted: tuple[tuple, list[Strip]] | None = None
        """(what the strips were rendered for, the strips) of the last render, until marked dirty."""
        self._look: tuple | None = None
        """(:func:`_look_key`, (rich style, background colours, plain styles)) as last read (:func:`_look`)."""

    @property
    def lines(self) -> list[Text]:
        return self._lines

    def set_lines(self, lines: list[Text], width: int | None = None) -> None:
        """Show ``lines``; only the lines that differ from those shown are repainted.  ``width``:
        the panel's width, when the caller has just read it (each read is a walk to the screen)."""
        old, self._lines = self._lines, lines
        if len(old) != len(lines):
            self._strips.clear()
            _repaint(self)
            return
        # (a line kept by its maker is the same object: rich's Text compares in Python)
        changed = [y for y, (a, b) in enumerate(zip(old, lines)) if a is not b and a != b]
        if changed:  # one refresh for all of them: each call is a walk through textual's bookkeeping
            if width is None:
                width = self.size.width
            for y in changed:
                self._strips.pop(y, None)
            _repaint(self, *[Region(0, y, width, 1) for y in changed])

    def plain(self) -> str:
        return "\n".join(t.plain for t in self._lines)

    def _set_dirty(self, *regions: Region) -> None:
        # Every repaint textual asks for comes here (refresh, scroll, style updates).
        self._painted = None
        super()._set_dirty(*regions)

    def render_lines(self, crop: Region) -> list[Strip]:
        return self._render_at(crop, self.size)  # (a walk through textual's geometry each time it is read)

    def _render_at(self, crop: Region, size: Size) -> list[Strip]:
        """:meth:`render_lines` at the panel's size ``size`` (read once by the caller)."""
        app = self.app
        # The panel's look (style, background colours, plain box) for as long as no style it is
        # made from changes: each is a walk up the parents through their styles.
        style, colours, plain_styles = _look(
            self, lambda: (self.rich_style, self.background_colors, self._plain_styles()))
        # (A change of theme restyles, and so marks dirty, every widget.)
        made_for = (crop, size, colours, tuple((f, f.enabled) for f in app._filters))
        painted = self._painted
        if painted is not None and painted[0] == made_for:
            return list(painted[1])
        # Style and width once for every line of this pass.
        self._width = size.width
        if style != self._style:
            self._style = style
            self._strips.clear()
        if size.width != self._strips_width:
            # textual draws a layout's frame before it sends the Resize event (see SizedPanel):
            # lines kept at the old width would leave the new columns to the screen behind.
            self._strips_width = size.width
            self._strips.clear()
        try:
            plain = plain_styles and self._plain_geometry(size)
            strips = self._bare_lines(crop, colours[1], size) if plain else super().render_lines(crop)
        finally:
            self._width = None
        self._painted = (made_for, strips)
        return list(strips)

    def _plain_styles(self) -> bool:
        """The part of :meth:`_plain_box` the styles decide: no border, padding, outline, tint,
        hatch, opacity or text opacity."""
        return not any(self.styles.gutter) and _no_effects(self)

    def _plain_box(self, size: Size) -> bool:
        """True when textual would put this panel's lines on the screen as they are: plain styles
        (:meth:`_plain_styles`, the panels' styles in deckload.tcss), no border title, no scroll
        bar and no link under the mouse."""
        return self._plain_styles() and self._plain_geometry(size)

    def _plain_geometry(self, size: Size) -> bool:
        """The part of :meth:`_plain_box` the styles do not decide, read at each render.  (``size``
        is the panel's size, its content region's: a border or padding is :meth:`_plain_styles`'s.)"""
        return (self._border_title is None and self._border_subtitle is None
                and not (self.auto_links and self.hover_style._link_id))

    def _bare_lines(self, crop: Region, background, size: Size) -> list[Strip]:
        """What textual's line cache (``StylesCache.render_widget``) gives for a plain box (see
        :meth:`_plain_box`): each content line as it is, through the app's line filters, cropped
        to the columns asked for; without its per-line walk through every border, padding and
        outline rule (most of the cost of a changed line).  The filters' results are kept on the
        finished strips, so an unchanged line is filtered once; a line all in RGB colours skips
        the ANSI-to-RGB colour filter, which would give it back unchanged (a copy to make and
        keep for every line a key changes)."""
        filters = self.app.get_line_filters()
        rgb_only = [f for f in filters if type(f) is not ANSIToTruecolor]
        true = self._true
        strips = []
        for y in crop.line_range:
            strip = self.render_line(y)
            for f in (rgb_only if y in true else filters):
                strip = strip.apply_filter(f, background)
            strips.append(strip)
        return _columns(strips, crop, size.width)

    def render_line(self, y: int) -> Strip:
        if self._width is None:  # called outside a render pass
            self._style, width = self.rich_style, self.size.width
            if width != self._strips_width:
                self._strips_width = width
                self._strips.clear()
        else:
            width = self._width
        style = self._style
        if y >= len(self._lines):
            self._true.discard(y)
            return Strip.blank(width, style)
        strip = self._strips.get(y)
        if strip is None:  # cached finished: cropped to the width and on the panel's own style
            text = self._lines[y]
            made = self._made.get(id(text))
            if made is not None and made[0] is text and made[1] is style and made[2] == width:
                strip, true = made[3], made[4]
            else:
                strip, true = _line_strip(text, width, style, self.app.console)
                if len(self._made) >= 256:  # a bound: lines with new words come on every key
                    self._made.clear()
                self._made[id(text)] = (text, style, width, strip, true)
            self._strips[y] = strip
            if true:
                self._true.add(y)
            else:
                self._true.discard(y)
        return strip


class SizedPanel(LinePanel):
    """A panel whose lines depend on its size: the owner gives a builder ``(width, height) -> lines``
    and, for a panel whose CSS height is ``auto``, how many lines it takes: ``(width, room) -> rows``
    at a width, in a container ``room`` rows tall."""

    def __init__(self, *, id: str | None = None, classes: str | None = None):
        super().__init__(id=id, classes=classes)
        self._builder = None
        self._rows_for = None
        self._built_for: Size | None = None
        """The size the lines were last built at."""

    def show(self, builder, rows_for=None) -> None:
        self._builder, self._rows_for = builder, rows_for
        # The lines shown were made by the builder before: built for no size now, so that a panel
        # hidden at this moment (size 0, nothing built) builds them when drawn again, even at the
        # size it had (else it showed the last condition's curve as this one's).
        self._built_for = None
        self._redraw()

    def get_content_height(self, container: Size, viewport: Size, width: int) -> int:
        # Asked by the layout (CSS height auto) before the panel is drawn at its new size.
        if self._rows_for is not None:
            return self._rows_for(width, container.height)
        return len(self._lines)

    def on_resize(self) -> None:
        if self._built_for != self.size:
            self._strips.clear()
            self._redraw()

    def _built(self, size: Size) -> list[Text] | None:
        """The builder's lines at ``size``, noted as built for it; None without a builder or a size."""
        if self._builder is None or size.width <= 0 or size.height <= 0:
            # Hidden (or not laid out): what it shows next is built when it is drawn again, from
            # the view as it is then (the builder reads the screen's classes, -wind...).
            self._built_for = None
            return None
        self._built_for = size
        return self._builder(size.width, size.height)

    def _redraw(self) -> None:
        size = self.size
        lines = self._built(size)
        if lines is not None:
            self.set_lines(lines, size.width)

    def render_lines(self, crop: Region) -> list[Strip]:
        # textual draws a layout before it tells the widgets their new size (the Resize event
        # comes after the frame): the lines are built here, at the size being drawn, so that the
        # first frame after a layout already holds them.
        size = self.size
        if self._built_for != size:
            lines = self._built(size)
            if lines is not None:
                self._lines = lines  # no repaint to ask for: this is the render
                self._strips.clear()
                self._painted = None  # the strips painted last were of the old lines
        return self._render_at(crop, size)


class LoadBoard(ScrollView, can_focus=True):
    """Tanks grouped by liquid, holds, deck loads and constants, one line each, with a cursor."""

    COMPONENT_CLASSES = {"board--cursor"}
    BINDINGS = [
        Binding("up,k", "move(-1)", "Up", show=False),
        Binding("down,j", "move(1)", "Down", show=False),
        Binding("pageup", "move(-10)", "Page up", show=False),
        Binding("pagedown", "move(10)", "Page down", show=False),
        Binding("home", "move(-10000)", "First", show=False),
        Binding("end", "move(10000)", "Last", show=False),
    ]

    class CursorMoved(Message):
        """The cursor came to rest on another line."""

        def __init__(self, key: tuple | None) -> None:
            self.key = key
            super().__init__()

    def __init__(self, *, id: str | None = None):
        super().__init__(id=id)
        self.rows: list[views.Row] = []
        self.cursor = 0
        self._strips: dict[int, Strip] = {}
        self._data: tuple | None = None
        self._width = 0
        self._styles: tuple[Style, Style, bool] | None = None
        """(own style, cursor style, focused) read once per render pass; the cached lines were made with them."""
        self._place: tuple[int, int] | None = None
        """(first line shown, width) during a render pass."""
        self._boxed: dict[int, tuple[Strip, Strip]] = {}
        """Per board line: (its content strip, the finished line made from it) (see :meth:`_boxed_lines`)."""
        self._boxed_for: tuple | None = None
        self._look: tuple | None = None
        """(:func:`_look_key`, (rich style, :meth:`_box_styles`)) as last read (:func:`_look`)."""

    @property
    def cursor_key(self) -> tuple | None:
        return self.rows[self.cursor].key if self.rows else None

    def show(self, vessel: Vessel, condition: Condition, result: Result | None, stale: bool) -> None:
        """Take new data (attributes down); rebuild the lines at the current width."""
        self._data = (vessel, condition, result, stale)
        self._rebuild()

    def select(self, key: tuple, announce: bool = True) -> bool:
        """Put the cursor on the line with ``key``; False if there is none."""
        for i, row in enumerate(self.rows):
            if row.key == key:
                self._set_cursor(i, announce)
                return True
        return False

    def on_resize(self) -> None:
        if self.scrollable_content_region.width != self._width:
            self._rebuild()

    def _rebuild(self, repaint: bool = True) -> None:
        """Build the lines at the board's width; before the first layout (no width yet) nothing:
        the first render builds them at the width it draws (``repaint`` False: that render draws them)."""
        shown = self.scrollable_content_region.width
        if self._data is None or not shown:
            return
        key = self.cursor_key
        width = max(40, shown)
        old, self.rows = self.rows, views.board_rows(*self._data, width=width)
        if width != self._width or len(old) != len(self.rows):
            self._width = width
            self._strips.clear()
            self.virtual_size = Size(width, len(self.rows))
            if repaint:
                _repaint(self)
        else:  # repaint only the lines that changed
            # (most lines are kept by views.board_rows: the same Text under a new Row)
            self._refresh_rows(i for i, (a, b) in enumerate(zip(old, self.rows))
                               if not (a.text is b.text and a.key == b.key) and a != b)
        if not (key is not None and self.select(key, announce=False)):
            self._set_cursor(self.cursor, announce=key is None)

    def _refresh_rows(self, indices) -> None:
        top, width = int(self.scroll_offset.y), self.scrollable_content_region.width
        regions = []
        for i in indices:
            self._strips.pop(i, None)
            regions.append(Region(0, i - top, width, 1))
        if regions:
            _repaint(self, *regions)

    def action_move(self, delta: int) -> None:
        start = max(0, min(len(self.rows) - 1, self.cursor + delta))
        step = 1 if delta > 0 else -1
        # Headings are skipped in the direction of travel; at either end of the board
        # (Home onto a heading), the nearest selectable line the other way is taken.
        for direction in (step, -step):
            i = start
            while 0 <= i < len(self.rows) and self.rows[i].key is None:
                i += direction
            if 0 <= i < len(self.rows):
                self._set_cursor(i)
                return

    def _set_cursor(self, i: int, announce: bool = True) -> None:
        i = max(0, min(len(self.rows) - 1, i))
        if self.rows and self.rows[i].key is None:  # headings are not selectable
            i = next((j for j in range(i, len(self.rows)) if self.rows[j].key is not None), i)
        old, self.cursor = self.cursor, i
        if old != i:  # (a cursor that stays where it was is drawn as it was, unless its line changed)
            self._refresh_rows({old, i})
        top, height = int(self.scroll_offset.y), self.scrollable_content_region.height
        # force: a key typed ahead arrives before the first layout has shown the scroll bar, and
        # textual ignores a scroll while there is none (the cursor would stay off screen)
        if all(r.key is None for r in self.rows[:i]):
            # the first selectable line: the headings above it (the columns' names among them) come
            # back into view with it, as at start
            if top:
                self.scroll_to(y=0, animate=False, force=True)
        elif i < top + (1 if i > 1 else 0):
            self.scroll_to(y=max(0, i - 1), animate=False, force=True)
        elif height and i >= top + height:
            self.scroll_to(y=i - height + 1, animate=False, force=True)
        if announce:
            self.post_message(self.CursorMoved(self.cursor_key))

    def render_lines(self, crop: Region) -> list[Strip]:
        if self._data is not None and self._width == 0 and self.scrollable_content_region.width:
            self._rebuild(repaint=False)  # a layout's frame is drawn before its Resize event (see SizedPanel)
        # The board's own style and box for as long as no style they are made from changes (see
        # LinePanel.render_lines), and the cursor's: its component's styles over the board's
        # (textual's component node under the board), whose own change count joins the look's key.
        # The focus is read each time.
        own, box, cursor = _look(
            self, lambda: (self.rich_style, self._box_styles(), self.get_component_rich_style("board--cursor")),
            self._component_styles["board--cursor"]._cache_key)
        styles = (own, cursor, self.has_focus)
        if styles != self._styles:
            self._styles = styles
            self._strips.clear()
        self._place = (int(self.scroll_offset.y), self.scrollable_content_region.width)
        try:
            box = self._side_box(box)
            return super().render_lines(crop) if box is None else self._boxed_lines(crop, *box)
        finally:
            self._place = None

    def _box_styles(self) -> tuple | None:
        """The part of :meth:`_side_box` the styles decide: (whether there is a right border, the
        style of the cells after a short line, the border's segment or None, the background the
        filters are given); None when the styles give more than a right border."""
        st = self.styles
        (top, _), (right, right_colour), (bottom, _), (left, _) = st.border
        if top or bottom or left or any(st.padding) or not _no_effects(self):
            return None
        base_background, background = self.background_colors
        inner, outer = self._styles_cache.get_inner_outer(base_background, background)
        edge = None
        if right:  # as StylesCache.render_line draws a content line's right border
            edge = get_box(right, inner, outer, VisualStyle(foreground=base_background + right_colour))[1][2]
        return bool(right), inner.rich_style, edge, background

    def _side_box(self, box: tuple | None) -> tuple | None:
        """What textual adds around a content line when the board's box is its content, the
        scroll bar's gutter and at most a right border (deckload.tcss: ``border-right``), with no
        padding, outline, tint, hatch, opacity, border title or link under the mouse: (the content
        width, the style of the cells after a short line, the border's segment or None, the
        background the filters are given).  None for any other box: textual draws it its way.
        ``box`` is :meth:`_box_styles`; the rest is read here, at each render."""
        if (box is None or self._border_title is not None or self._border_subtitle is not None
                or (self.auto_links and self.hover_style._link_id)):
            return None
        right, inner, edge, background = box
        size, content = self.region.size, self.content_region.size
        if content.height != size.height or content.width + (1 if right else 0) != size.width:
            return None
        return content.width, inner, edge, background

    def _boxed_lines(self, crop: Region, content_w: int, inner: Style, edge: Segment | None, background) -> list[Strip]:
        """The lines textual's line cache (``StylesCache.render_widget``) gives for the box
        :meth:`_side_box` describes: each content line widened to the content width, the right
        border after it, through the app's line filters, cropped to the columns asked for; without
        its per-line walk through every border, padding and outline rule (about 85 µs a changed
        line, four or five of them a nudge).  A finished line is kept while its content line is
        the same object and the box, filters and background are the same."""
        filters = self.app.get_line_filters()
        made_for = (content_w, inner, edge, background, tuple(filters))  # (the filters that are on)
        if made_for != self._boxed_for:
            self._boxed_for = made_for
            self._boxed.clear()
        width = self.region.width
        top = self._place[0]
        strips = []
        for y in crop.line_range:
            line = self.render_line(y)
            kept = self._boxed.get(y + top)
            if kept is None or kept[0] is not line:
                done = line.adjust_cell_length(content_w, inner)
                if edge is not None:
                    done = Strip([*done, edge], width)
                for f in filters:
                    done = done.apply_filter(f, background)
                kept = self._boxed[y + top] = (line, done)
            strips.append(kept[1])
        return _columns(strips, crop, width)

    def render_line(self, y: int) -> Strip:
        if self._place is None:  # called outside a render pass
            self._styles = (self.rich_style, self.get_component_rich_style("board--cursor"), self.has_focus)
            top, width = int(self.scroll_offset.y), self.scrollable_content_region.width
        else:
            top, width = self._place
        idx = y + top
        own, cursor, focused = self._styles
        if idx >= len(self.rows):
            return Strip.blank(width, own)
        strip = self._strips.get(idx)
        if strip is None:
            if idx != self.cursor:
                strip, _ = _line_strip(self.rows[idx].text, width, own, self.app.console)
            elif focused:  # the cursor's colours win over the line's own
                # own + (piece + cursor) for each piece, as the line drawn, coloured, then put on
                # the board's style: rich adds styles associatively (each attribute, colour and
                # link is the last one set), so it is the finished line's own + piece, + cursor.
                strip, _ = _line_strip(self.rows[idx].text, width, own, self.app.console)
                strip = Strip([Segment(seg.text, seg.style + cursor) for seg in strip], width)
            else:
                strip = _strip(fit_width(self.rows[idx].text, width), self.app.console).crop_extend(0, width, None)
                strip = Strip.join([Strip([Segment("›")], 1), strip.crop(1, width)])
                strip = strip.apply_style(own)
            self._strips[idx] = strip
        return strip

    def on_focus(self) -> None:
        self._refresh_rows([self.cursor])

    def on_blur(self) -> None:
        self.on_focus()


class SteadyInput(Input):
    """A text field whose cursor stands still instead of blinking.

    A blinking cursor repaints its field twice a second for as long as a form stays open, work a
    low-power PC need not do; and a screen captured for the record (a printout, a snapshot test)
    then shows the cursor where it is rather than in whichever half of the blink it fell."""

    cursor_blink = reactive(False, init=False)

