"""Forms over the loading screen: each is a ModalScreen closed with ``dismiss(value)``.

A form checks its input with the builder it is given; refused input leaves the
form open with the reason shown and changes nothing.  Escape closes a form
without a change.
"""

from __future__ import annotations

from typing import Any, Callable

from rich.console import Group
from rich.table import Table
from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical, VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Input, Label, Static

from deckload.core.model import Condition, Vessel
from deckload.core.result import Result
from deckload.ui import views
from deckload.report.verdict_format import digits_of, value_text
from deckload.ui.commands import COMMANDS, NAVIGATION
from deckload.ui.entry import EntryError, ItemForm, TransferPlan, plan_transfer
from deckload.ui.palette import P
from deckload.ui.widgets import LinePanel


class Form(ModalScreen[Any]):
    """Base: a titled box, a message line, Escape cancels."""

    BINDINGS = [Binding("escape", "cancel", "Cancel")]

    def refuse(self, message: str) -> None:
        self.query_one("#form-message", Static).update(Text("✖ " + message, P["danger"]))

    def action_cancel(self) -> None:
        self.dismiss(None)


class PromptForm(Form):
    """One line of input; ``build(text)`` returns the result or raises EntryError."""

    def __init__(self, title: str, hint: str, initial: str, build: Callable[[str], Any]):
        super().__init__()
        self._title, self._hint, self._initial, self._build = title, hint, initial, build

    def compose(self) -> ComposeResult:
        with Vertical(classes="form"):
            yield Label(self._title, classes="form-title")
            yield Label(self._hint, classes="form-hint")
            yield Input(value=self._initial, id="prompt-input", select_on_focus=True)
            yield Static("", id="form-message")

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        if self._initial and event.value.strip() == self._initial.strip():
            # The shown value is rounded for reading: submitting it unchanged changes nothing.
            self.dismiss(None)
            return
        try:
            value = self._build(event.value)
        except EntryError as exc:
            self.refuse(str(exc))
            return
        self.dismiss(value)


class ItemFormScreen(Form):
    """Name, mass and position of a deck load or constant; Enter in any field saves."""

    FIELDS = (("name", "Name"), ("mass", "Mass (t)"), ("lcg", "LCG from AP, + fwd (m)"),
              ("vcg", "VCG above keel (m)"), ("tcg", "TCG, + starboard (m)"), ("area", "Deck area id (optional)"))

    def __init__(self, title: str, form: ItemForm, build: Callable[[ItemForm], Any], *, deck: bool):
        super().__init__()
        self._title, self._form, self._build, self._deck = title, form, build, deck

    def compose(self) -> ComposeResult:
        with Vertical(classes="form"):
            yield Label(self._title, classes="form-title")
            for name, label in self.FIELDS:
                if name == "area" and not self._deck:
                    continue
                yield Label(label, classes="field-label")
                yield Input(value=getattr(self._form, name), id=f"item-{name}", classes="field")
            yield Label("Enter saves · Tab next field · Esc cancels", classes="form-hint")
            yield Static("", id="form-message")

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        values = {n: self.query_one(f"#item-{n}", Input).value for n, _ in self.FIELDS if self._deck or n != "area"}
        try:
            value = self._build(ItemForm(**values))
        except EntryError as exc:
            self.refuse(str(exc))
            return
        self.dismiss(value)


class RecordForm(Form):
    """Initials and a remark for recording the working condition in the log."""

    def __init__(self, initials: str, log_note: str | None):
        super().__init__()
        self._initials, self._note = initials, log_note

    def compose(self) -> ComposeResult:
        with Vertical(classes="form"):
            yield Label("Record the working condition in the voyage log", classes="form-title")
            if self._note:
                yield Label(self._note, classes="form-hint")
            yield Label("Your initials", classes="field-label")
            yield Input(value=self._initials, id="record-by", classes="field")
            yield Label("Remark (optional)", classes="field-label")
            yield Input(id="record-remark", classes="field")
            yield Static("", id="form-message")

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        by = self.query_one("#record-by", Input).value.strip().upper()
        if not (1 <= len(by) <= 4 and by.isalpha() and by.isascii()):
            self.refuse("Initials: one to four letters A–Z, e.g. JS.")
            self.query_one("#record-by", Input).focus()
            return
        self.dismiss((by, self.query_one("#record-remark", Input).value.strip()))


class TransferForm(Form):
    """From-tank, to-tank and amount, with a live before/after preview; Enter commits."""

    def __init__(
        self,
        vessel: Vessel,
        condition: Condition,
        before: Result | None,
        preview: Callable[[Condition], tuple[Result | None, str | None]],
        from_id: str = "",
        to_id: str = "",
    ):
        super().__init__()
        self._vessel, self._condition, self._before, self._preview = vessel, condition, before, preview
        self._from, self._to = from_id, to_id
        self.plan: TransferPlan | None = None

    def compose(self) -> ComposeResult:
        with Vertical(classes="form transfer"):
            yield Label("Transfer between tanks", classes="form-title")
            yield Label("Amount in t, m³ or % of the from-tank's capacity; mass is conserved.", classes="form-hint")
            for name, label, value, hint in (("from", "From tank", self._from, "tank id, e.g. DB2P"),
                                             ("to", "To tank", self._to, "tank id"),
                                             ("amount", "Amount", "", "10t, 5m3 or 20%")):
                with Horizontal(classes="xfer-row"):
                    yield Label(label, classes="xfer-label")
                    yield Input(value=value, id=f"xfer-{name}", placeholder=hint, classes="xfer-field")
            yield LinePanel(id="xfer-preview")
            yield Static("", id="form-message")

    def on_mount(self) -> None:
        # Room for every criterion of every set assessed (and a problem line), as far as the screen allows.
        need = len(preview_lines(self._before, None, None)) + 1
        self.query_one("#xfer-preview").styles.height = max(8, min(need, self.app.size.height - 10))
        first_empty = "from" if not self._from else "to" if not self._to else "amount"
        self.query_one(f"#xfer-{first_empty}", Input).focus()
        self._update()

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        self._update()

    def _update(self) -> None:
        get = lambda n: self.query_one(f"#xfer-{n}", Input).value.strip()  # noqa: E731
        message = self.query_one("#form-message", Static)
        self.plan = None
        if not get("amount"):
            message.update(Text("Type the amount to see the preview.", P["dim"]))
            self.query_one("#xfer-preview", LinePanel).set_lines(preview_lines(self._before, None, None))
            return
        try:
            plan = plan_transfer(self._vessel, self._condition, get("from").upper(), get("to").upper(), get("amount"))
        except EntryError as exc:
            self.refuse(str(exc))
            self.query_one("#xfer-preview", LinePanel).set_lines(preview_lines(self._before, None, None))
            return
        after, problem = self._preview(plan.condition)
        self.plan = plan
        self.query_one("#xfer-preview", LinePanel).set_lines(preview_lines(self._before, after, problem))
        message.update(Text(f"{plan.label}.  Enter commits · Esc cancels", P["value"]))

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        self._update()
        if self.plan is not None:
            self.dismiss(self.plan)


def preview_lines(before: Result | None, after: Result | None, problem: str | None) -> list[Text]:
    """Before/after table for a transfer preview."""
    out = [Text(f"{'':14}{'before':>10}{'after':>12}{'change':>10}", P["head"])]

    def row(label: str, get: Callable[[Result], float], unit: str, fmt: str = ".3f") -> None:
        b = get(before) if before is not None else None
        a = get(after) if after is not None else None
        line = Text(f"{label:<14}", P["label"])
        line.append(views.num(b, fmt, 10) + views.num(a, fmt, 12), P["value"])
        line.append(views.num(a - b if a is not None and b is not None else None, "+" + fmt, 10), P["value"])
        line.append(f" {unit}", P["unit"])
        out.append(line)

    def sided(label: str, get: Callable[[Result], float], unit: str, digits: int, plus: str, minus: str) -> None:
        """Magnitudes with their side (P/S, A/F), the change as the distance moved towards a side."""
        def cell(x: float | None, w: int) -> str:
            if x is None:
                return f"{'—':>{w}}"
            side = "" if round(abs(x), digits) == 0 else (plus if x > 0 else minus)
            return f"{abs(x):.{digits}f} {side or ' '}".rjust(w)
        b = get(before) if before is not None else None
        a = get(after) if after is not None else None
        line = Text(f"{label:<14}", P["label"])
        line.append(cell(b, 10) + cell(a, 12) + cell(a - b if a is not None and b is not None else None, 10),
                    P["value"])
        line.append(f" {unit}", P["unit"])
        out.append(line)

    row("GM fluid", lambda r: r.gm_fluid_m, "m")
    sided("Trim", lambda r: r.trim_m, "m", 3, "A", "F")
    sided("List", lambda r: r.list_deg, "°", 1, "S", "P")
    row("Draft aft", lambda r: r.draft_aft_m, "m")
    row("Draft mid", lambda r: r.draft_mean_m, "m")
    row("Draft fwd", lambda r: r.draft_fwd_m, "m")
    if problem:
        out.append(Text(f"✖ after: {problem}", P["danger"]))
    ref = before or after
    if ref is None:
        return out
    after_by_id = {c.id: c for c in after.criteria} if after is not None else {}
    for c in ref.criteria:
        b = next((x for x in before.criteria if x.id == c.id), None) if before is not None else None
        a = after_by_id.get(c.id)
        line = Text(f"{views.criterion_name(c):<14.14}", P["label"])
        for x in (b, a):
            if x is None:
                line.append(f"{'—':>7}     ", P["dim"])
            else:
                word, style = views.verdict(x)
                line.append(value_text(x, 7) + " ", P["value"])
                line.append(f"{word:<4}", P[style])
                line.append(" ")
        line.append(f"  limit {views.CMP.get(c.comparison, c.comparison)} {c.limit:.{digits_of(c)}f} {c.unit}", P["dim"])
        out.append(line)
    return out


class TextScreen(ModalScreen[None]):
    """A read-only page of lines (all warnings); any of Esc, q, Enter closes it."""

    BINDINGS = [Binding("escape,q,enter", "close", "Close")]

    def __init__(self, title: str, lines: list[Text]):
        super().__init__()
        self._title, self._lines = title, lines

    def compose(self) -> ComposeResult:
        text = Text(self._title + "\n\n", P["title"])
        for line in self._lines:
            text.append_text(line)
            text.append("\n")
        with VerticalScroll(classes="form help"):  # scrolls by keys when longer than the screen
            yield Static(text)

    def action_close(self) -> None:
        self.dismiss(None)


class HelpScreen(ModalScreen[None]):
    """Every key, built from the command table."""

    BINDINGS = [Binding("escape,q,question_mark,f1", "close", "Close")]

    def compose(self) -> ComposeResult:
        with VerticalScroll(classes="form help"):
            yield Static(help_page())

    def action_close(self) -> None:
        self.dismiss(None)


def help_page() -> Group:
    """The help page, from the command table."""
    keys = Table.grid(padding=(0, 1))
    keys.add_column(justify="right", style=P["value"])
    keys.add_column(style=P["group"])
    keys.add_column(style=P["label"], ratio=1)
    for c in COMMANDS:
        keys.add_row(Text(c.key_text), Text(c.name), Text(c.help))  # Text: "[usual_fill]" is not markup
    notes = Text("\n" + "\n".join(f"{k}: {what}" for k, what in NAVIGATION), P["label"])
    notes.append("\nTank marks: " + views.LEGEND + ".  Criteria: ok, NEAR (margin under 10 % of the limit), "
                 "FAIL, n/a (not assessable: the data cannot decide it; never a pass).\nAmounts: 55% · 12.5m3 · 10t · 1.2m (sounding).  Nothing is extrapolated outside the "
                 "vessel's tables.\n", P["label"])
    notes.append("deckload supports, and never replaces, the approved stability booklet, the master's "
                 "judgement and flag-State and class rules.", P["dim"])
    return Group(Text("Keys", P["title"]), keys, notes)
