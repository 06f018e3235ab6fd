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
from textual.containers import VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Static

from deckload.ui.palette import P

TITLE = "Second method: from the hull itself (free trim and heel, actual G)"
KEYS = "↑↓ PgUp PgDn Home End scroll · Esc closes"
"""The page's keys, on its bottom edge: the rows and the legend run below an 80×24 screen."""


def comparison_text(cmp) -> Text:
    """How many rows are beyond their UR L5 / Circ.1229 tolerance, then rows 'quantity  tables  direct
    difference unit  ±tolerance mark', a row beyond it in the danger colour, and what the criteria are
    judged on."""
    from deckload.report import direct_format as df

    t = Text()
    # first, where a short terminal cannot hide it below the rows
    t.append(("!! " if cmp.beyond else "") + cmp.summary() + "\n\n", P["danger"] if cmp.beyond else P["ok"])
    # 74 columns with the longest mark ('not judged'): a row fits the page, beside its scroll bar,
    # on an 80-column terminal; each heading right over its column, a space before it
    t.append(f"{'':<21}{'tables':>8}{'direct':>9}{'difference':>11}{'':5}{'tolerance':>9}\n", P["dim"])
    for row in cmp.rows:
        a, b, diff, allowed, mark = df.cells(row)
        beyond = row.within_tolerance is False
        t.append(f"{row.quantity:<21}{a:>8}{b:>9}{diff:>11} {row.unit:<5}{allowed:>8} ",
                 P["danger"] if beyond else P["value"])
        t.append(f"{mark}\n", P["danger"] if beyond else P["dim"])
        if row.note:
            t.append(f"    {row.note}\n", P["dim"])
    t.append("\n" + df.legend(cmp) + "\n", P["dim"])
    t.append("\nThe criteria are judged on the tables; the direct figures are for comparison.", P["dim"])
    return t


class HullCompareScreen(ModalScreen[None]):
    """The comparison page; ``vessel`` and ``result`` are the loading screen's at the time of the key."""

    BINDINGS = [Binding("escape,q,enter", "close", "Close")]

    def __init__(self, vessel, result):
        super().__init__()
        self._vessel, self._result = vessel, result

    def compose(self) -> ComposeResult:
        # a scroll container takes focus, so the arrows and PgUp/PgDn/Home/End scroll it
        with VerticalScroll(classes="form help", id="hull-compare-page") as page:
            page.border_subtitle = KEYS
            yield Static(Text(TITLE + "\n", P["title"]))
            yield Static(Text("Integrating the hull …", P["dim"]), id="hull-compare-body")

    def on_mount(self) -> None:
        self.set_focus(self.query_one("#hull-compare-page", VerticalScroll))
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
