"""Text styles used inside pre-formatted lines (tcss cannot reach inside a rich Text).

Colour only reinforces: every state also has a symbol or a word (see views.py),
so the screen reads the same with NO_COLOR or on a monochrome terminal.
Our own palette: slate and sand, with teal for fluids and coral for trouble.
"""

from __future__ import annotations

from rich.style import Style

P: dict[str, Style] = {
    "title": Style(bold=True, color="#e8dcc0"),
    "head": Style(color="#8a9aa8", underline=True),
    "group": Style(bold=True, color="#c8b88a"),
    "label": Style(color="#9fb0bf"),
    "value": Style(color="#f0f0ea"),
    "unit": Style(color="#7f8c99"),
    "dim": Style(color="#6b7680"),
    "stale": Style(color="#6b7680", italic=True),
    "ok": Style(color="#7cc4a4"),
    "near": Style(color="#e6b450", bold=True),
    "fail": Style(color="#ff7a6b", bold=True, reverse=True),
    "caution": Style(color="#e6b450", bold=True),
    "danger": Style(color="#ff7a6b", bold=True),
    "bar.ballast": Style(color="#5fa8c8"),
    "bar.fuel": Style(color="#c89a5f"),
    "bar.water": Style(color="#7fc8e6"),
    "bar.other": Style(color="#a8a0c8"),
    "bar.empty": Style(color="#3a444d"),
    "bar.worst": Style(color="#ff7a6b"),
    "gz.curve": Style(color="#7cc4c4", bold=True),
    "gz.stale": Style(color="#6b7680"),
    "gz.axis": Style(color="#7f8c99"),
    "gz.mark": Style(color="#e6b450"),
    "gz.flood": Style(color="#ff7a6b"),
    "gz.level": Style(color="#c8b88a"),
    "gz.area": Style(color="#5f7f8f"),
    "gz.area.b": Style(color="#6f9f7f"),
}
