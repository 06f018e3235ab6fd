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
from deckload.ui import entry
from deckload.ui.entry import EntryError, ItemForm, TransferPlan, plan_transfer
from deckload.ui.palette import P
from deckload.ui.widgets import LinePanel, SteadyInput, type_into
from deckload.io.textsafe import join_lines


class Form(ModalScreen[Any]):
    """Base: a titled box, a message line, Escape cancels."""

    BINDINGS = [Binding("escape", "cancel", "Cancel")]

    def __init__(self) -> None:
        super().__init__()

    def fit_preview(self, need: int, hint: str, fields: int) -> None:
        """Give the before/after panel ``need`` rows, as far as the screen allows: the form's other
        rows are its border (2), title, hint (wrapped to the form's width), fields and message;
        on a short screen (under 30 rows) the blank row above the panel goes first."""
        inner = min(80, self.app.size.width) - 4  # .form.transfer: width 80, border and padding
        other = 2 + 1 + len(Text(hint).wrap(self.app.console, max(10, inner))) + fields + 1
        panel = self.query_one("#xfer-preview")
        if self.app.size.height < 30:
            panel.styles.margin = (0, 0, 0, 0)
        else:
            other += 1
        self.preview_room = self.app.size.height - other
        """The most rows the panel can have with a one-line message (a form whose message wraps
        gives the panel fewer: the planner's ``_show``)."""
        panel.styles.height = max(8, min(need, self.preview_room))

    @property
    def keys_ready(self) -> bool:
        """Mounted, with its field focused (a form without fields: mounted).  A form picks its
        field with ``set_focus`` in ``on_mount`` (at once, not later), so no key meets one field
        and the next another."""
        return self.is_mounted and (self.focused is not None or not self.focus_chain)

    def on_mount(self) -> None:
        # Runs after the form's own on_mount: a field has focus now; keys typed meanwhile go to it.
        if self.focused is None and self.focus_chain:
            self.set_focus(self.focus_chain[0])
        release = getattr(self.app, "release_keys", None)
        if release is not None:
            release()

    def refuse(self, message: str) -> None:
        self.query_one("#form-message", Static).update(Text("✖ " + message, P["danger"]))

    def action_cancel(self) -> None:
        self.dismiss(None)


class PromptForm(Form):
    """One line of input; ``build(text)`` returns the result or raises EntryError.  With
    ``preview(text)``, what the text comes to is shown as it is typed (EntryError: why ⏎ would
    refuse it, dimmed until ⏎)."""

    def __init__(self, title: str, hint: str, initial: str, build: Callable[[str], Any],
                 preview: Callable[[str], str] | None = None):
        super().__init__()
        self._title, self._hint, self._initial, self._build = title, hint, initial, build
        self._preview = preview

    def compose(self) -> ComposeResult:
        with Vertical(classes="form"):
            yield Label(self._title, classes="form-title", markup=False)
            yield Label(self._hint, classes="form-hint", markup=False)
            yield SteadyInput(value=self._initial, id="prompt-input", select_on_focus=True)
            if self._preview is not None:
                yield Static("", id="prompt-preview")
            yield Static("", id="form-message")

    def on_mount(self) -> None:
        self._show_preview(self._initial)

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        self._show_preview(event.value)

    def _show_preview(self, text: str) -> None:
        if self._preview is None:
            return
        if not text.strip():
            shown = Text("Type an amount: the volume, mass and level it comes to show here.", P["dim"])
        else:
            try:
                shown = Text(self._preview(text), P["value"])
            except EntryError as exc:
                shown = Text(str(exc), P["dim"])
        self.query_one("#prompt-preview", Static).update(shown)

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
            yield SteadyInput(value=self._initials, id="record-by", classes="field")
            yield Label("Remark (optional)", classes="field-label")
            yield RemarkInput(id="record-remark", classes="field")
            yield Static("", id="form-message")

    def on_input_submitted(self, event: Input.Submitted) -> None:
        from deckload.io.textsafe import control_char
        from deckload.logbook.book import MAX_TEXT_CHARS

        event.stop()
        by = self.query_one("#record-by", Input).value.strip().upper()
        if not (1 <= len(by) <= 4 and by.isalpha() and by.isascii()):
            self.refuse("Initials: one to four letters A–Z, e.g. JS.")
            self.query_one("#record-by", Input).focus()
            return
        remark = self.query_one("#record-remark", Input)
        text = remark.value.strip()
        # refused here, the text kept in the field to shorten or mend (the log would refuse it
        # after the form had closed, and the remark would be lost)
        bad = control_char(text)
        if len(text) > MAX_TEXT_CHARS or bad is not None:
            self.refuse(f"Remark: at most {MAX_TEXT_CHARS} characters (this one has {len(text)}); shorten it."
                        if bad is None else f"Remark: holds the control character {bad}; type plain text.")
            remark.focus()
            return
        self.dismiss((by, text))


class RemarkInput(SteadyInput):
    """A one-line field that takes a pasted text of several lines whole, its lines joined by a
    space (textual's Input keeps only the first line of a paste, and the rest was lost unseen)."""

    def _on_paste(self, event) -> None:
        if event.text:
            type_into(self, join_lines(event.text))
        event.stop()
        event.prevent_default()  # textual would call Input's own paste handler too, adding the first line again


def _cut(line: Text, width: int) -> Text:
    out = line.copy()
    out.truncate(width, overflow="ellipsis")
    return out


TRANSFER_HINT = "Amount in t, m³ or % of the from-tank's capacity; mass is conserved."


class TankPicking:
    """For a form with tank fields: while the text in the focused tank field is not a tank id,
    the preview panel lists the tanks that match what is typed (entry.tank_matches), ↑ ↓ choose
    and Tab or ⏎ take the one marked.  Focus stays where it is; it moves only on Tab (after
    taking a tank) or shift+Tab, as in any form.  A multi field (the planner's allowed tanks)
    picks its last word, and Tab there takes the tank and stays for the next.

    The form gives ``TANK_FIELDS`` {input id: multi}, ``_want(field)`` (the tanks that fit that
    field) and ``_update()`` (redraws the preview, calling ``_picker_lines`` first).  A form
    picking something else by id (the deck-item form's deck area) overrides ``_ids``,
    ``_matches``, ``_choice`` and ``_noun``."""

    TANK_FIELDS: dict[str, bool] = {}
    _vessel: Vessel
    _condition: Condition
    _pick = 0

    def _want(self, field: str):
        return None

    def _ids(self, field: str):
        """The ids ``field`` accepts (a text that is one needs no list)."""
        return self._vessel.tank_index

    def _known(self, field: str, typed: str) -> str | None:
        """The id ``typed`` names, as the profile spells it (case aside), or None."""
        return entry.tank_id_or_none(self._vessel, typed)

    def _matches(self, field: str, typed: str) -> list:
        return entry.tank_matches(self._vessel, typed, self._want(field))

    def _choice(self, field: str, item) -> str:
        return entry.tank_choice(self._condition, item)

    def _noun(self, field: str) -> str:
        return "tank"

    def _tank_field(self) -> Input | None:
        f = self.focused
        return f if isinstance(f, Input) and f.id in self.TANK_FIELDS else None

    def _typed_word(self, field: Input) -> str:
        words = field.value.split()
        multi = self.TANK_FIELDS[field.id]
        if multi:
            return "" if not words or field.value.endswith((" ", ",")) else words[-1].rstrip(",")
        return field.value.strip()

    def _choices(self) -> list | None:
        """The tanks offered for the focused field, or None when it holds a tank id already."""
        field = self._tank_field()
        if field is None:
            return None
        typed = self._typed_word(field)
        if self.TANK_FIELDS[field.id] and not typed:
            return None
        if self._known(field.id, typed):
            return None
        found = self._matches(field.id, typed)
        if self.TANK_FIELDS[field.id]:  # a tank already listed is not offered again
            listed = {self._known(field.id, w.strip(",")) for w in field.value.split()[:-1]}
            found = [t for t in found if t.id not in listed]
        return found

    def _picker_lines(self, height: int, width: int) -> list[Text] | None:
        """The tank list for the preview panel (``height`` × ``width`` cells), or None when no
        tank field is being picked."""
        found = self._choices()
        if found is None:
            return None
        field = self._tank_field()
        typed = self._typed_word(field)
        noun = self._noun(field.id)
        if not found and not typed and noun == "tank":  # e.g. the only tank of that liquid is the one to fill, and it is empty
            return [Text("No tank can serve here: none of that liquid holds any (to give) or has room (to take).",
                         P["caution"])]
        if not found:
            return [Text(f"No {noun} here matches {typed!r}: type part of an id or name"
                         f"{' or kind' if noun == 'tank' else ''}.", P["caution"])]
        self._pick = max(0, min(self._pick, len(found) - 1))
        head = Text(f"{noun.capitalize()}s{' matching ' + repr(typed) if typed else ''} · ↑ ↓ choose · Tab or ⏎ takes it",
                    P["head"])
        rows = max(1, height - 1)
        top = max(0, min(self._pick - rows + 1, len(found) - rows)) if self._pick >= rows else 0
        out = [head]
        for i, t in enumerate(found[top: top + rows], start=top):
            mark = "›" if i == self._pick else " "
            out.append(Text(f"{mark} " + self._choice(field.id, t), P["value"] if i == self._pick else P["label"]))
        return [line if line.cell_len <= width or width < 2 else _cut(line, width) for line in out]

    def action_pick(self, step: int) -> None:
        if self._choices():
            self._pick += step
            self._update()

    def _take(self) -> bool:
        """Put the marked tank in the focused field; False when nothing was offered."""
        found = self._choices()
        field = self._tank_field()
        if not found or field is None:
            return False
        tid = found[max(0, min(self._pick, len(found) - 1))].id
        if self.TANK_FIELDS[field.id]:
            words = field.value.split()
            field.value = " ".join([*words[:-1], tid]) + " "
        else:
            field.value = tid
        field.cursor_position = len(field.value)
        self._pick = 0
        self._update()
        return True

    def action_take_or_next(self) -> None:
        field = self._tank_field()
        if self._take() and field is not None and self.TANK_FIELDS[field.id]:
            return  # a multi field stays for the next tank
        self.focus_next()

    def on_descendant_focus(self, event) -> None:
        self._pick = 0
        self._update()


class ItemFormScreen(TankPicking, Form):
    """Name, mass and position of a deck load or constant; Enter in any field saves.  A deck
    load's area field lists the vessel's deck areas that match what is typed, with the load
    already on each and the room left under its permissible load (TankPicking); left blank,
    the item stands on no stated area."""

    BINDINGS = [Binding("up", "pick(-1)", "Previous area", show=False), Binding("down", "pick(1)", "Next area", show=False),
                Binding("tab", "take_or_next", "Take / next field", show=False)]
    FIELDS = (("name", "Name"), ("mass", "Mass (t)"), ("lcg", "LCG from AP, + fwd (m)"),
              ("vcg", "VCG above keel (m)"), ("tcg", "TCG, + starboard (m)"), ("area", "Deck area id (optional)"),
              ("windage", "Side area for the wind, m² (0 if hidden; blank: not known)"),
              ("windage_z", "Its centre above keel, m (blank: the VCG)"))
    DECK_ONLY = ("area", "windage", "windage_z")

    def __init__(self, title: str, form: ItemForm, build: Callable[[ItemForm], Any], *, deck: bool,
                 vessel: Vessel | None = None, condition: Condition | None = None):
        super().__init__()
        self._title, self._form, self._build, self._deck = title, form, build, deck
        self._vessel, self._condition = vessel, condition
        # Only a deck load with areas to choose from picks one; a blank area stays blank unless
        # ↑ ↓ chose one (it is optional), so Tab and ⏎ there never put one in unasked.
        self.TANK_FIELDS = {"item-area": False} if deck and vessel is not None and vessel.deck_areas else {}
        self._chosen = False

    def _ids(self, field: str):
        return self._vessel.area_index

    def _known(self, field: str, typed: str) -> str | None:
        try:
            return entry.deck_area_id(self._vessel, typed)
        except EntryError:
            return None

    def _matches(self, field: str, typed: str) -> list:
        return entry.area_matches(self._vessel, typed)

    def _choice(self, field: str, item) -> str:
        return entry.area_choice(self._condition, item)

    def _noun(self, field: str) -> str:
        return "deck area"

    def _take(self) -> bool:
        field = self._tank_field()
        if field is not None and not field.value.strip() and not self._chosen:
            return False
        self._chosen = False
        return super()._take()

    def action_pick(self, step: int) -> None:
        if self._choices():
            self._chosen = True
        super().action_pick(step)

    def on_descendant_focus(self, event) -> None:
        self._chosen = False
        super().on_descendant_focus(event)

    def compose(self) -> ComposeResult:
        with Vertical(classes="form"):
            yield Label(self._title, classes="form-title")
            for name, label in self.FIELDS:
                if name in self.DECK_ONLY and not self._deck:
                    continue
                yield Label(label, classes="field-label")
                yield SteadyInput(value=getattr(self._form, name), id=f"item-{name}", classes="field")
            yield Label("Enter saves · Tab next field · Esc cancels", classes="form-hint")
            if self.TANK_FIELDS:
                yield LinePanel(id="area-picker")
            yield Static("", id="form-message")

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        self._update()

    def _update(self) -> None:
        if not self.TANK_FIELDS or not self.is_mounted:
            return
        panel = self.query_one("#area-picker", LinePanel)
        picking = self._picker_lines(int(panel.styles.height.value) if panel.styles.height else 5, panel.size.width)
        panel.display = picking is not None
        if picking is not None:
            panel.set_lines(picking)

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        if self._take():  # ⏎ in the area field while one is being picked takes it; it saves nothing
            return
        values = {n: self.query_one(f"#item-{n}", Input).value for n, _ in self.FIELDS
                  if self._deck or n not in self.DECK_ONLY}
        try:
            value = self._build(ItemForm(**values))
        except EntryError as exc:
            self.refuse(str(exc))
            return
        self.dismiss(value)


class TransferForm(TankPicking, Form):
    """From-tank, to-tank and amount, with a live before/after preview; Enter commits.  The tank
    fields offer the tanks that match as they are typed (TankPicking)."""

    BINDINGS = [Binding("up", "pick(-1)", "Previous tank", show=False), Binding("down", "pick(1)", "Next tank", show=False),
                Binding("tab", "take_or_next", "Take / next field", show=False)]
    TANK_FIELDS = {"xfer-from": False, "xfer-to": False}

    def _want(self, field: str):
        c = self._condition
        if field == "xfer-from":  # tanks that hold some, of the receiving tank's liquid once it is named
            dst = entry.tank_id_or_none(self._vessel, self.query_one("#xfer-to", Input).value)
            kind = self._vessel.tank(dst).kind if dst else None
            return lambda t: (kind is None or t.kind == kind) and t.id != dst and \
                entry.held_m3(self._vessel, c, t) > 1e-6
        src = entry.tank_id_or_none(self._vessel, self.query_one("#xfer-from", Input).value)
        kind = self._vessel.tank(src).kind if src else None
        return lambda t: (kind is None or t.kind == kind) and t.id != src and \
            t.fill_limit_m3 - entry.held_m3(self._vessel, c, t) > 1e-6

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
            yield Label(TRANSFER_HINT, classes="form-hint")
            for name, label, value, hint in (("from", "From tank", self._from, "tank id, e.g. DB2P"),
                                             ("to", "To tank", self._to, "tank id"),
                                             ("amount", "Amount", "", "10t, 5m3 or 20%")):
                with Horizontal(classes="xfer-row"):
                    yield Label(label, classes="xfer-label")
                    yield SteadyInput(value=value, id=f"xfer-{name}", placeholder=hint, classes="xfer-field")
            yield LinePanel(id="xfer-preview")
            yield Static("", id="form-message")

    def on_mount(self) -> None:
        # Room for every criterion of every set assessed (and a problem line), as far as the screen allows.
        self.fit_preview(len(preview_lines(self._before, None, None)) + 1, TRANSFER_HINT, 3)
        first_empty = "from" if not self._from else "to" if not self._to else "amount"
        self.set_focus(self.query_one(f"#xfer-{first_empty}", Input))
        self._update()

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        self._update()

    def _update(self) -> None:
        get = lambda n: self.query_one(f"#xfer-{n}", Input).value.strip()  # noqa: E731
        message = self.query_one("#form-message", Static)
        self.plan = None
        panel = self.query_one("#xfer-preview", LinePanel)
        picking = self._picker_lines(int(panel.styles.height.value) if panel.styles.height else 8, panel.size.width)
        if picking is not None:
            panel.set_lines(picking)
            message.update(Text("Choose the tank: ↑ ↓ and Tab or ⏎ · Esc cancels", P["dim"]))
            return
        if not get("amount"):
            message.update(Text("Type the amount to see the preview.", P["dim"]))
            self.query_one("#xfer-preview", LinePanel).set_lines(preview_lines(self._before, None, None))
            return
        try:
            plan = plan_transfer(self._vessel, self._condition, entry.tank_id(self._vessel, get("from"), "From-tank"),
                                 entry.tank_id(self._vessel, get("to"), "To-tank"), get("amount"))
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
        if self._take():  # ⏎ in a tank field still being picked takes the tank; it commits nothing
            return
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

    def sided(label: str, get: Callable[[Result], float], unit: str, digits: int, plus: str, minus: str,
              change_digits: int) -> None:
        """Magnitudes with their side (P/S, A/F); the change as the distance moved towards a side
        ("0.05 to S"), to ``change_digits`` so that two readings rounding alike (0.1 P, 0.1 P) never
        show a change that reads as a contradiction ("0.1 S").  The unit goes with the label, not
        after a side letter."""
        def cell(x: float | None, w: int, nd: int, to: str = "") -> str:
            if x is None:
                return f"{'—':>{w}}"
            side = "" if round(abs(x), nd) == 0 else (plus if x > 0 else minus)
            if to:
                return (f"{abs(x):.{nd}f} to {side}" if side else f"{0.0:.{nd}f}     ").rjust(w)
            return f"{abs(x):.{nd}f} {side or ' '}".rjust(w)
        b = get(before) if before is not None else None
        a = get(after) if after is not None else None
        line = Text(f"{label + ', ' + unit:<14}", P["label"])
        change = a - b if a is not None and b is not None else None
        line.append(cell(b, 10, digits) + cell(a, 12, digits) + cell(change, 15, change_digits, to="to"),
                    P["value"])
        out.append(line)

    row("GM fluid", lambda r: r.gm_fluid_m, "m")
    sided("Trim", lambda r: r.trim_m, "m", 3, "A", "F", 3)
    sided("List", lambda r: r.list_deg, "°", 1, "S", "P", 2)
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
        keys.add_row(Text(c.own_key), Text(c.name), Text(c.help))  # Text: "[usual_fill]" is not markup
    notes = Text("\n" + "\n".join(f"{k}: {what}" for k, what in NAVIGATION), P["label"])
    notes.append("\nTank marks: " + views.LEGEND + ".  Criteria: ok, NEAR (margin under 10 % of the limit), "
                 "FAIL, n/a (not assessable: the data cannot decide it; never a pass).\nAmounts: 55% · 12.5m3 · 10t · 1.2m (sounding) · 0.85u (ullage).  Nothing is extrapolated outside the "
                 "vessel's tables.\n", P["label"])
    notes.append("deckload supports, and never replaces, the approved stability booklet, the master's "
                 "judgement and flag-State and class rules.", P["dim"])
    return Group(Text("Keys", P["title"]), keys, notes)
