"""The GZ curve as braille dots: a small rich renderable (2×4 dots per character cell).

Vertical marks (30°, 40°, the downflooding angle θf) are drawn as dotted
columns and named on the axis line below, so they read without colour.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from rich.console import Console, ConsoleOptions, RenderResult
from rich.text import Text

from deckload.ui.palette import P

# Braille dot bits by (column, row) inside a cell: Unicode 2800 block layout.
_BITS = ((0x01, 0x02, 0x04, 0x40), (0x08, 0x10, 0x20, 0x80))


@dataclass(frozen=True)
class Mark:
    angle_deg: float
    label: str
    style: str = "gz.mark"
    """A key of :data:`deckload.ui.palette.P`."""


@dataclass(frozen=True)
class GzChart:
    heel_deg: tuple[float, ...]
    gz_m: tuple[float, ...]
    marks: tuple[Mark, ...] = ()
    width: int = 48
    height: int = 12
    stale: bool = False

    def lines(self) -> list[Text]:
        """``height`` lines of ``width`` cells: y labels, plot, then the angle axis."""
        label_w, rows = 6, max(2, self.height - 1)
        cols = max(8, self.width - label_w)
        heel = np.asarray(self.heel_deg, float)
        gz = np.asarray(self.gz_m, float)
        x_max = float(heel[-1]) if len(heel) else 90.0
        hi = 1.08 * max(0.05, float(gz.max()) if len(gz) else 1.0)
        # Below zero only enough to see where the curve crosses: the positive part carries the criteria.
        lo = max(min(0.0, float(gz.min()) if len(gz) else 0.0), -0.5 * hi)
        step = _nice_step((hi - lo) / 5)
        pw, ph = cols * 2, rows * 4
        grid = np.zeros((rows, cols), dtype=np.int32)
        xs = np.linspace(0.0, x_max, pw)
        ys = np.round((hi - np.interp(xs, heel, gz)) / (hi - lo) * (ph - 1)).astype(int)
        prev = ys[0]
        for px, py in enumerate(ys):
            for y in range(max(0, min(prev, py)), min(ph - 1, max(prev, py)) + 1):  # join steep segments
                grid[y // 4, px // 2] |= _BITS[px % 2][y % 4]
            prev = py
        zero_row = int(round(hi / (hi - lo) * (ph - 1))) // 4
        mark_cols: dict[int, Mark] = {}
        for m in self.marks:  # earlier marks win a shared column
            if 0 <= m.angle_deg <= x_max:
                mark_cols.setdefault(int(round(m.angle_deg / x_max * (pw - 1))) // 2, m)
        curve_style = P["gz.stale"] if self.stale else P["gz.curve"]
        labels: dict[int, str] = {}
        for k in range(int(np.ceil(lo / step)), int(np.floor(hi / step)) + 1):
            v = k * step
            labels.setdefault(int(round((hi - v) / (hi - lo) * (ph - 1))) // 4, f"{v:5.2f}┤")
        out: list[Text] = []
        for r in range(rows):
            line = Text(labels.get(r, "     │"), style=P["gz.axis"])
            for c in range(cols):
                bits = int(grid[r, c])
                if bits:
                    line.append(chr(0x2800 + bits), curve_style)
                elif c in mark_cols:
                    line.append("┊", P[mark_cols[c].style])
                elif r == zero_row and lo < 0:
                    line.append("·", P["gz.axis"])
                else:
                    line.append(" ")
            out.append(line)
        out.append(self._axis(cols, label_w, x_max, mark_cols))
        return out

    def _axis(self, cols: int, label_w: int, x_max: float, mark_cols: dict[int, Mark]) -> Text:
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
        for deg in range(0, int(x_max) + 1, 10):
            c = int(round(deg / x_max * (cols * 2 - 1))) // 2
            text = f"{deg}°" if deg == int(x_max) else str(deg)
            c = min(c, cols - len(text))
            if not any(taken[max(0, c - 1) : c + len(text) + 1]):
                for i, ch in enumerate(text):
                    chars[c + i], taken[c + i] = ch, True
        line = Text(" " * label_w, style=P["gz.axis"])
        for ch, st in zip(chars, styles):
            line.append(ch, st)
        return line

    def __rich_console__(self, console: Console, options: ConsoleOptions) -> RenderResult:
        for line in self.lines():
            yield line
            yield Text("\n")


def _nice_step(raw: float) -> float:
    """1, 2 or 5 × a power of ten, at least ``raw``."""
    raw = max(raw, 1e-6)
    mag = 10 ** np.floor(np.log10(raw))
    for f in (1, 2, 5, 10):
        if f * mag >= raw:
            return float(f * mag)
    return float(10 * mag)
