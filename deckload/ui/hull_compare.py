"""The direct calculation from the hull beside the tables' result, computed off the UI thread.

The loading screen shows the tables' result at once; this page opens at once too, says it
is working, and fills in when the hull has been integrated (a thread worker, a few tenths of
a second).  Any of Esc, q, Enter closes it at any time; a result that arrives after it closed
is dropped.  The work is :func:`deckload.core.equilibrium.compare`.
"""

from __future__ import annotations

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical
from textual.screen import ModalScreen
from textual.widgets import Static

from deckload.ui.palette import P

TITLE = "Second method: from the hull itself (free trim and heel, actual G)"


def comparison_text(cmp) -> Text:
    """Rows 'quantity  tables  direct  difference unit', and what the criteria are judged on."""
    t = Text()
    t.append(f"{'':<24}{'tables':>10}{'direct':>10}{'difference':>12}\n", P["dim"])
    for name, unit, a, b in cmp.rows:
        d = 1 if unit == "deg" else 4 if unit == "m·rad" else 3  # angles to 0.1°, as every view
        t.append(f"{name:<24}{a:10.{d}f}{b:10.{d}f}{b - a:+12.{d}f} {unit}\n", P["value"])
    t.append("\nThe criteria are judged on the tables; the direct figures are for comparison.", P["dim"])
    return t


class HullCompareScreen(ModalScreen[None]):
    """The comparison page; ``vessel`` and ``result`` are the loading screen's at the time of the key."""

    BINDINGS = [Binding("escape,q,enter", "close", "Close")]

    def __init__(self, vessel, result):
        super().__init__()
        self._vessel, self._result = vessel, result

    def compose(self) -> ComposeResult:
        with Vertical(classes="form help"):
            yield Static(Text(TITLE + "\n", P["title"]))
            yield Static(Text("Integrating the hull …", P["dim"]), id="hull-compare-body")

    def on_mount(self) -> None:
        if self._vessel.hull is None:
            self._show(Text("The profile names no hull geometry (hull_geometry), or its file is not there: "
                            "only the tables are available.",
                            P["dim"]))
            return
        self.run_worker(self._work, thread=True, exclusive=True, name="hull-compare")

    def _work(self) -> None:
        from deckload.core.equilibrium import DirectError, compare
        from deckload.core.tables import OutOfRangeError

        try:
            text = comparison_text(compare(self._vessel, self._result))
        except (DirectError, OutOfRangeError) as e:
            text = Text(f"The direct calculation could not be made: {e}", P["danger"])
        self.app.call_from_thread(self._show, text)

    def _show(self, text: Text) -> None:
        if self.is_attached:
            self.query_one("#hull-compare-body", Static).update(text)

    def action_close(self) -> None:
        self.dismiss(None)
