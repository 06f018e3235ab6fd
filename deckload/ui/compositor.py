"""A textual compositor whose partial updates render only the rows each widget must repaint.

textual's partial update (``Compositor.render_partial_update``) renders every widget that
overlaps the box around all the regions to repaint, each widget whole, and then keeps only
the rows that changed.  A key on the loading screen changes the title (top row), the message
line (bottom row) and a few rows between, so every widget of the screen was rendered in full
for every key (about 250 lines), most of it thrown away.

:class:`RowCompositor` renders each widget only over the band of its rows, from the first to
the last, on which a region to repaint crosses the widget's columns; a widget no such region
crosses is not rendered, nor one whose columns on each of those rows the widgets in front of it
have already been rendered over (a container its children tile: the first strip for a cut wins).
What the terminal receives is the same: textual's update writes a row only inside the regions
to repaint, and inside them every cut still gets the front-most widget's strip (a widget covering
a cut there is rendered on that row, and textual renders a row of a widget the same whether the
crop asked for is the whole widget or the band).  A widget counts as rendered over a row only as
far as the strip it gave reaches (a strip shorter than the widget, or none, leaves the rest of the
row to the widgets behind, as in textual's update).  Full updates and ``render_strips`` take the
same way with every row whole.  ``tests/test_ui_compositor.py`` compares the updates byte for byte.

It uses textual's compositor internals (``_dirty_regions``, ``_regions_to_spans``,
``_render_chops``, ``visible_widgets``, ``cuts``), written for textual 8.2 (pyproject pins
``textual>=8.2,<9``); the comparison test fails if a textual release changes them.
"""

from __future__ import annotations

from bisect import bisect_left
from contextlib import contextmanager
from typing import Iterable

from textual._compositor import ChopsUpdate, Compositor, LayoutUpdate
from textual.geometry import Region, Size
from textual.strip import Strip


class RowCompositor(Compositor):
    """textual's compositor; a partial update renders each widget only over its changed rows, and
    no update renders a container its children tile."""

    def __init__(self) -> None:
        super().__init__()
        self._row_spans: dict[int, list[tuple[int, int]]] | None = None
        """Per screen row, the column spans to repaint, while a partial update renders."""

    def render_partial_update(self) -> ChopsUpdate | None:
        # textual's render_partial_update, with the spans handed to _get_renders.
        screen_region = self.size.region
        update_regions = self._dirty_regions.copy()
        self._dirty_regions.clear()
        if not update_regions:
            return None
        crop = Region.from_union(update_regions).intersection(screen_region)
        spans = list(self._regions_to_spans(update_regions))
        rows: dict[int, list[tuple[int, int]]] = {}
        for y, x1, x2 in spans:
            rows.setdefault(y, []).append((x1, x2))
        self._row_spans = rows
        try:
            chops = self._render_chops(crop, rows.__contains__)
        finally:
            self._row_spans = None
        chop_ends = [cut_set[1:] for cut_set in self.cuts]
        return ChopsUpdate(chops, spans, chop_ends)

    def render_full_update(self, simplify: bool = False) -> LayoutUpdate:
        # Every row whole: each widget rendered over all its rows, and the containers its children
        # tile not at all (the first frame of a screen, and every layout, is a full update).
        with self._every_row():
            return super().render_full_update(simplify)

    def render_strips(self, size: Size | None = None) -> list[Strip]:
        with self._every_row(size):
            return super().render_strips(size)

    @contextmanager
    def _every_row(self, size: Size | None = None):
        """Every row of the screen (or of ``size``) to be rendered whole, while the block runs."""
        width, height = size if size is not None else self.size
        self._row_spans = {y: [(0, width)] for y in range(height)}
        try:
            yield
        finally:
            self._row_spans = None

    def _get_renders(self, crop: Region | None = None) -> Iterable[tuple[Region, Region, list[Strip]]]:
        rows = self._row_spans
        if rows is None or crop is None:  # a full update, or one this class does not know
            yield from super()._get_renders(crop)
            return
        overlaps = crop.overlaps
        ys = sorted(rows)
        drawn: dict[int, list[tuple[int, int]]] = {}  # per row, the spans [x1, x2) rendered in front
        for widget, (region, clip) in list(self.visible_widgets.items()):  # front to back
            if not overlaps(clip):
                continue
            shown = region.intersection(clip)
            left, right = shown.x, shown.right
            # The rows to repaint inside the widget's rows that cross its columns; inclusive at
            # both ends: a span ending where the widget starts still takes it (renders a little
            # more than needed, never less).
            band = [y for y in ys[bisect_left(ys, shown.y):bisect_left(ys, shown.bottom)]
                    if any(x1 <= right and x2 >= left for x1, x2 in rows[y])]
            if not band or not shown.width:
                continue
            if all(_covered(drawn.get(y), left, right) for y in band):
                # A container whose children tile it: on each of these rows every cut of its
                # columns already has a strip from a widget in front, and the first strip wins.
                continue
            top, bottom = band[0], band[-1] + 1
            width = shown.width
            strips = widget.render_lines(Region(left - region.x, top - region.y, width, bottom - top))
            yield region, Region(left, top, width, bottom - top), strips
            # What the widget has now been rendered over: on each row it gave a strip for, its
            # columns, or, for a strip shorter than the widget, only the cuts the strip reaches
            for y, strip in zip(range(top, bottom), strips):
                if strip.cell_length >= width:
                    drawn.setdefault(y, []).append((left, right))
                else:
                    reach = _reach(self.cuts[y], left, strip.cell_length)
                    if reach > left:
                        drawn.setdefault(y, []).append((left, reach))


def _reach(cuts: list[int], left: int, length: int) -> int:
    """The column up to which a strip ``length`` cells long, drawn from column ``left``, gives
    its row's cuts a strip: textual's ``_render_chops`` divides it at the row's cuts after
    ``left``, ``Strip.divide`` drops every cut past the strip's end, and each piece goes to the
    cut it starts at.  So the cuts from ``left`` up to the last cut the strip reaches get a piece,
    and that cut and those after it are left to the widgets behind."""
    end = left + length
    reach = left
    for cut in cuts:
        if cut > end:
            break
        if cut > reach:
            reach = cut
    return reach


def _covered(spans: list[tuple[int, int]] | None, left: int, right: int) -> bool:
    """True when the spans [x1, x2) together cover the columns [left, right)."""
    if not spans:
        return False
    reach = left
    for x1, x2 in sorted(spans):
        if x1 > reach:
            return False
        reach = max(reach, x2)
        if reach >= right:
            return True
    return False
