"""The GZ chart of a curve alone is kept by the cells and names that decide it (ui/gzplot.py).

An edit that moves the curve by less than one braille dot draws the same chart: the chart's lines
are kept by the dot rows of the curve, the y labels, the marks' columns and the chart's size, and
handed back for the next chart those decide alike.  These tests check that a kept chart is the
chart drawn afresh, that a move of a dot or more is drawn, that a caller cannot spoil a kept
chart, and that the weather chart (levels and areas) is always drawn afresh.

The curves are made up for the drawing (no outside reference: only the drawing's consistency with
itself is checked).
"""

from __future__ import annotations

import math

from deckload.ui import gzplot
from deckload.ui.gzplot import Area, GzChart, Level, Mark

HEEL = tuple(float(d) for d in range(0, 91))


def _curve(scale: float) -> tuple[float, ...]:
    """A GZ-like hump: 0 upright, largest near 35°, negative past 70°."""
    return tuple(scale * math.sin(math.radians(d) * 2.6) * math.cos(math.radians(d) * 0.4) for d in HEEL)


def _chart(gz, **kw) -> GzChart:
    return GzChart(HEEL, gz, (Mark(30.0, "30"), Mark(40.0, "40"), Mark(52.5, "θf", "gz.flood")), 48, 12, **kw)


def _plain(lines) -> list[tuple[str, list]]:
    return [(t.plain, list(t.spans), t.style) for t in lines]


def test_a_kept_chart_is_the_chart_drawn_afresh():
    gzplot._DRAWN.clear()
    first = _plain(_chart(_curve(0.40)).lines())
    kept = _plain(_chart(_curve(0.40)).lines())
    gzplot._DRAWN.clear()
    fresh = _plain(_chart(_curve(0.40)).lines())
    assert first == kept == fresh
    assert len(fresh) == 12 and any("⠀" < ch <= "⣿" for text, _, _ in fresh for ch in text)


def test_a_move_of_less_than_a_dot_keeps_the_chart_and_a_larger_one_draws_anew():
    """The y range is some tenths of a metre over 44 dot rows (11 rows of 4): a dot is of the
    order of a centimetre.  A curve at most 0.01 mm higher draws the same dots; one 5 % taller
    does not."""
    gzplot._DRAWN.clear()
    base = _chart(_curve(0.40)).lines()
    assert _plain(_chart(_curve(0.40 + 1e-5)).lines()) == _plain(base)
    taller = _chart(_curve(0.42)).lines()
    assert _plain(taller) != _plain(base)
    gzplot._DRAWN.clear()
    assert _plain(_chart(_curve(0.42)).lines()) == _plain(taller)


def test_a_caller_cannot_spoil_a_kept_chart():
    gzplot._DRAWN.clear()
    lines = _chart(_curve(0.40)).lines()
    expected = _plain(lines)
    lines.append(lines[0])  # the list is the caller's own
    lines.reverse()
    assert _plain(_chart(_curve(0.40)).lines()) == expected


def test_stale_and_size_are_part_of_what_decides_a_chart():
    gzplot._DRAWN.clear()
    fresh = _plain(_chart(_curve(0.40)).lines())
    stale = _plain(_chart(_curve(0.40), stale=True).lines())
    assert [t for t, _, _ in fresh] == [t for t, _, _ in stale] and fresh != stale  # same dots, other colour
    wide = GzChart(HEEL, _curve(0.40), (), 60, 12).lines()
    assert len(wide[0].plain) == 60 and len(_chart(_curve(0.40)).lines()[0].plain) == 48


def test_the_weather_chart_is_always_drawn_afresh():
    gzplot._DRAWN.clear()
    chart = GzChart(HEEL, _curve(0.40), (Mark(30.0, "30"),), 48, 12,
                    levels=(Level(0.10, "lw1"), Level(0.15, "lw2")),
                    areas=(Area(0.0, 20.0, 0.15, "a", "below"), Area(20.0, 50.0, 0.15, "b", "above")))
    once, twice = _plain(chart.lines()), _plain(chart.lines())
    assert once == twice and not gzplot._DRAWN
