"""The GZ curve as braille dots: a small rich renderable (2×4 dots per character cell).

Vertical marks (30°, 40°, the downflooding angle θf) are drawn as dotted
columns and named on the axis line below, so they read without colour.
Horizontal levels (the wind heeling levers lw1 and lw2) are dashed rows named at
their right end; shaded areas (the weather criterion's areas a and b) are sparse dots
between the curve and a level, named by their letter inside.  The angle axis may
start below zero (rolled to windward).
"""

from __future__ import annotations

import numpy as np
from rich.console import Console, ConsoleOptions, RenderResult
from rich.style import Style
from rich.text import Span, Text

from deckload.core.frozen import frozen
from deckload.ui.palette import P

_DRAWN: dict[tuple, tuple[Text, ...]] = {}
"""The lines of the last charts of a curve alone, by the cells and names that decide them (see
:meth:`GzChart.lines`).  The Texts are shared, so they are never modified after they are made."""

# Braille dot bits by (column, row) inside a cell: Unicode 2800 block layout.
_BITS = ((0x01, 0x02, 0x04, 0x40), (0x08, 0x10, 0x20, 0x80))


@frozen
class Mark:
    """An angle marked on the GZ chart (θ0, the list, a flooding angle...), with its label."""

    angle_deg: float
    label: str
    style: str = "gz.mark"
    """A key of :data:`deckload.ui.palette.P`."""


@frozen
class Level:
    """A horizontal line at ``value_m`` (a heeling lever), named at its right end."""

    value_m: float
    label: str
    style: str = "gz.level"


@frozen
class Area:
    """Dots between the curve and ``level_m`` from ``from_deg`` to ``to_deg``, named by ``label``.

    ``where`` 'below': only where the curve is below the level (the weather criterion's area a);
    'above': only where it is above (area b)."""

    from_deg: float
    to_deg: float
    level_m: float
    label: str
    where: str = "above"
    style: str = "gz.area"


@frozen
class GzChart:
    """A GZ curve drawn in text cells: the points, the marks and the chart's size in cells."""

    heel_deg: tuple[float, ...]
    gz_m: tuple[float, ...]
    marks: tuple[Mark, ...] = ()
    width: int = 48
    height: int = 12
    stale: bool = False
    levels: tuple[Level, ...] = ()
    areas: tuple[Area, ...] = ()
    x_range_deg: tuple[float, float] | None = None
    """Angles shown (within the curve's own); the whole curve when None."""

    def lines(self) -> list[Text]:
        """``height`` lines of ``width`` cells: y labels, plot, then the angle axis."""
        label_w, rows = 6, max(2, self.height - 1)
        cols = max(8, self.width - label_w)
        heel = np.asarray(self.heel_deg, float)
        gz = np.asarray(self.gz_m, float)
        x_lo, x_hi = (float(heel[0]), float(heel[-1])) if len(heel) else (0.0, 90.0)
        if self.x_range_deg is not None:
            x_lo, x_hi = max(x_lo, self.x_range_deg[0]), min(x_hi, self.x_range_deg[1])
        if x_hi <= x_lo:
            x_hi = x_lo + 1.0
        shown = gz[(heel >= x_lo) & (heel <= x_hi)] if len(gz) else gz
        level_vals = [lv.value_m for lv in self.levels]
        top = max([float(shown.max()) if len(shown) else 1.0, *level_vals])
        hi = 1.08 * max(0.05, top)
        bottom = min(0.0, float(shown.min()) if len(shown) else 0.0)
        # Below zero only enough to see where the curve crosses (the positive part carries the
        # criteria), unless the chart starts to windward, where the negative part is area a.
        lo = bottom if x_lo < 0 else max(bottom, -0.5 * hi)
        step = _nice_step((hi - lo) / 5)
        pw, ph = cols * 2, rows * 4

        def px_of(deg: float) -> int:
            return int(round((deg - x_lo) / (x_hi - x_lo) * (pw - 1)))

        def py_of(v: float) -> int:
            return int(round((hi - v) / (hi - lo) * (ph - 1)))

        xs = np.linspace(x_lo, x_hi, pw)
        curve_arr = np.interp(xs, heel, gz)
        ys = np.clip(np.round((hi - curve_arr) / (hi - lo) * (ph - 1)).astype(int), -1, ph).tolist()
        zero_row = py_of(0.0) // 4
        mark_cols: dict[int, Mark] = {}
        for m in self.marks:  # earlier marks win a shared column
            if x_lo <= m.angle_deg <= x_hi:
                mark_cols.setdefault(px_of(m.angle_deg) // 2, m)
        labels: dict[int, str] = {}
        for k in range(int(np.ceil(lo / step)), int(np.floor(hi / step)) + 1):
            v = k * step
            labels.setdefault(int(round((hi - v) / (hi - lo) * (ph - 1))) // 4, f"{v:5.2f}┤")
        # A chart of the curve alone is decided by these cells and names: an edit that moves the
        # curve by less than a dot (about half of 1 % nudges of a tank on the demo vessel) draws
        # the same chart, kept here (with levels or areas, the weather chart, it is drawn afresh).
        key = None if self.levels or self.areas else (
            cols, rows, label_w, tuple(ys), zero_row, lo < 0, tuple(labels.items()), tuple(mark_cols.items()),
            x_lo, x_hi, self.stale)
        if key is not None and key in _DRAWN:
            return list(_DRAWN[key])
        # Plain lists, not arrays: the dots are set one at a time, where numpy's per-item cost dominates.
        grid = [[0] * cols for _ in range(rows)]
        layer = [[0] * cols for _ in range(rows)]  # 0 none, 1 area, 2 level, 3 curve: the highest names the style
        area_style: dict[tuple[int, int], str] = {}
        level_style: dict[tuple[int, int], str] = {}
        curve = curve_arr.tolist()

        def dot(px: int, py: int, kind: int, style: dict | None = None, name: str = "") -> None:
            if 0 <= py < ph and 0 <= px < pw:
                r, c = py // 4, px // 2
                grid[r][c] |= _BITS[px % 2][py % 4]
                if kind > layer[r][c]:
                    layer[r][c] = kind
                    if style is not None:
                        style[(r, c)] = name

        area_cols: dict[int, list[int]] = {}
        for n, area in enumerate(self.areas):  # sparse dots: every other dot column, every other dot row
            y_level = py_of(area.level_m)
            cols_in = area_cols.setdefault(n, [])
            for px in range(max(0, px_of(area.from_deg)), min(pw - 1, px_of(area.to_deg)) + 1):
                curve_above = curve[px] > area.level_m
                if curve_above != (area.where == "above"):
                    continue
                cols_in.append(px)
                if px % 2:
                    continue
                a, b = sorted((ys[px], y_level))
                for py in range(a + 1, b):
                    if py % 2 == 0:
                        dot(px, py, 1, area_style, area.style)
        for lv in self.levels:
            y = py_of(lv.value_m)
            for px in range(pw):
                if px % 4 < 2:
                    dot(px, y, 2, level_style, lv.style)
        prev = ys[0]
        for px, py in enumerate(ys):
            for y in range(max(0, min(prev, py)), min(ph - 1, max(prev, py)) + 1):  # join steep segments
                dot(px, y, 3)
            prev = py
        text_at: dict[tuple[int, int], tuple[str, str]] = {}
        by_row: dict[int, list[Level]] = {}
        for lv in self.levels:  # the levers' names at their right end; levels sharing a row share a name
            by_row.setdefault(py_of(lv.value_m) // 4, []).append(lv)
        for r, lvs in by_row.items():
            name = "/".join(lv.label for lv in lvs)
            if 0 <= r < rows:
                for i, ch in enumerate(name[:cols]):
                    text_at[(r, max(0, cols - len(name)) + i)] = (ch, lvs[0].style)
        for n, area in enumerate(self.areas):  # the area's letter in its middle, where there is room
            cols_in = area_cols.get(n, [])
            if len(cols_in) < 4:
                continue
            mid = cols_in[len(cols_in) // 2]
            r = ((ys[mid] + py_of(area.level_m)) // 2) // 4
            if 0 <= r < rows:
                text_at.setdefault((r, mid // 2), (area.label, area.style))
        curve_style = P["gz.stale"] if self.stale else P["gz.curve"]
        axis_style = P["gz.axis"]
        mark_styles = {c: P[m.style] for c, m in mark_cols.items()}
        out: list[Text] = []
        text_by_row: dict[int, list[tuple[int, str, str]]] = {}
        for (r, c), (ch, st) in text_at.items():
            text_by_row.setdefault(r, []).append((c, ch, st))
        for r in range(rows):
            # Laid down from the lowest priority up: zero line, mark columns, dots, then names.
            if r == zero_row and lo < 0:
                chars, styles = ["·"] * cols, [axis_style] * cols
            else:
                chars, styles = [" "] * cols, [None] * cols
            for c, st in mark_styles.items():
                if 0 <= c < cols:
                    chars[c], styles[c] = "┊", st
            layer_row = layer[r]
            for c, bits in enumerate(grid[r]):
                if bits:
                    kind = layer_row[c]
                    chars[c] = chr(0x2800 + bits)
                    styles[c] = curve_style if kind == 3 else P[(level_style if kind == 2 else area_style)[(r, c)]]
            for c, ch, st in text_by_row.get(r, ()):
                chars[c], styles[c] = ch, P[st]
            out.append(_runs(labels.get(r, "     │"), axis_style, chars, styles))
        out.append(self._axis(cols, label_w, x_lo, x_hi, mark_cols))
        if key is not None:
            if len(_DRAWN) >= 16:  # the last few charts are all a screen redraws
                _DRAWN.clear()
            _DRAWN[key] = tuple(out)
        return out

    def _axis(self, cols: int, label_w: int, x_lo: float, x_hi: float, mark_cols: dict[int, Mark]) -> Text:
        """Angle axis: mark labels under their columns, then 0/10/…/90 ticks where there is room."""
        chars = [" "] * cols
        styles = [P["gz.axis"]] * cols
        taken = [False] * cols
        for c, m in mark_cols.items():  # in priority order; a label that would overlap another is left out
            start = min(max(0, c - len(m.label) // 2), cols - len(m.label))
            if any(taken[max(0, start - 1) : start + len(m.label) + 1]):
                continue
            for i, ch in enumerate(m.label):
                chars[start + i], styles[start + i], taken[start + i] = ch, P[m.style], True
        for deg in range(int(np.ceil(x_lo / 10.0)) * 10, int(x_hi) + 1, 10):
            c = int(round((deg - x_lo) / (x_hi - x_lo) * (cols * 2 - 1))) // 2
            text = f"{deg}°" if deg == int(x_hi) else str(deg)
            c = min(c, cols - len(text))
            if not any(taken[max(0, c - 1) : c + len(text) + 1]):
                for i, ch in enumerate(text):
                    chars[c + i], taken[c + i] = ch, True
        return _runs(" " * label_w, P["gz.axis"], chars, styles)

    def __rich_console__(self, console: Console, options: ConsoleOptions) -> RenderResult:
        for line in self.lines():
            yield line
            yield Text("\n")


def _runs(prefix: str, base: Style, chars: list[str], styles: list) -> Text:
    """``prefix`` (in ``base``) then ``chars``, one span per run of cells of one style (``None``: the
    base style), made in one step: not one ``append`` per cell, nor per run (a chart line of 80
    cells is a handful of spans to build and to paint)."""
    spans = []
    n, off, start = len(chars), len(prefix), 0
    for c in range(1, n + 1):
        if c == n or styles[c] is not styles[start]:
            if styles[start] is not None:
                spans.append(Span(off + start, off + c, styles[start]))
            start = c
    return Text(prefix + "".join(chars), style=base, spans=spans)


def _nice_step(raw: float) -> float:
    """1, 2 or 5 × a power of ten, at least ``raw``."""
    raw = max(raw, 1e-6)
    mag = 10 ** np.floor(np.log10(raw))
    for f in (1, 2, 5, 10):
        if f * mag >= raw:
            return float(f * mag)
    return float(10 * mag)
