"""The loading screen: the hub.  Widgets get data (attributes down), forms return values.

Layout (see deckload.tcss): a title line, the alert strip (always in view), the
loading board on the left, the 'Afloat' numbers, the criteria and the GZ curve on
the right, a message line and the footer.  Below 110 columns the right side
shows either the numbers or the GZ curve (key g).  Key b puts the weather
criterion on the curve panel (wind levers, θ0, θ1, θ2, areas a and b), key v
opens the whole verdict.
"""

from __future__ import annotations

import asyncio
import dataclasses

from rich.console import Console
from rich.text import Text
from textual.app import ComposeResult
from textual.containers import Horizontal, Vertical
from textual.screen import Screen

from deckload.core.model import Condition
from deckload.ui import entry, verdict, views
from deckload.ui.commands import bindings, footer_keys
from deckload.ui.compositor import RowCompositor
from deckload.ui.entry import EntryError, ItemForm
from deckload.ui.palette import P
from deckload.ui.session import Session
from deckload.ui.widgets import LinePanel, LoadBoard, SizedPanel, cells, fit_width

RUN_PAUSE_S = 4.0
"""A run of nudges or retypes of one item ends (and is logged as one entry) after this pause."""
NARROW_BELOW = 110
"""Screen width (cells) under which the right side shows numbers or curve, not both."""
MIN_CURVE_ROWS = 10
"""On a wide screen the criteria panel takes the rows it needs, leaving the curve at least this many."""
SIDE_COLS = 54
"""The right side's width on a wide screen (#side in deckload.tcss), where the board needs the rest."""
BOARD_FULL_COLS = 88
"""Cells the board needs to show every line whole: its widest line (a deck load's row with x, z,
side and deck area, 83 cells with a five-cell tank id, 86 with the longest, eight) with its
scrollbar gutter and right edge.  Beyond that the right side takes the screen (at 200 columns the
board got 146 cells, mostly empty, while the criteria panel cut its notes)."""


def side_width(screen_cols: int) -> int | None:
    """The right side's width on a screen ``screen_cols`` wide: None for the stylesheet's (54, or 34
    on a narrow screen), more where the board has all it needs and cells to spare."""
    if screen_cols < NARROW_BELOW or screen_cols - BOARD_FULL_COLS <= SIDE_COLS:
        return None
    return screen_cols - BOARD_FULL_COLS


def _forms():
    """The forms and pages module, loaded when the first form opens: start-up does not need it."""
    from deckload.ui import dialogs

    return dialogs


class LoadingScreen(Screen[None]):
    BINDINGS = bindings()

    def __init__(self, session: Session):
        super().__init__()
        self._compositor = RowCompositor()  # a key repaints only the rows it changed (ui/compositor.py)
        self.session = session
        self._settle_timer = None
        self._criteria_made: tuple | None = None
        self._said: tuple[str, bool | None] | None = None
        """The message line's last words and kind, fitted again when the width changes."""

    def compose(self) -> ComposeResult:
        yield SizedPanel(id="titlebar")
        yield SizedPanel(id="alerts")
        with Horizontal(id="body"):
            yield LoadBoard(id="board")
            with Vertical(id="side"):
                yield SizedPanel(id="afloat")
                yield SizedPanel(id="criteria")
                yield SizedPanel(id="gz")
        yield LinePanel(id="status")
        yield SizedPanel(id="keys")

    def on_mount(self) -> None:
        loop = asyncio.get_running_loop()
        # Writes go to the writer thread once the change's frame is drawn; the interval is a
        # backstop for a frame that never comes (the screen that was to draw it closed first).
        self.session.write_in_background(lambda p: loop.call_soon_threadsafe(self._report, p),
                                         lambda: loop.call_soon_threadsafe(self._save_landed),
                                         after_frame=self.call_after_refresh)
        self.set_interval(0.5, self.session.release_writes)
        self.query_one(LoadBoard).focus()
        # Before the first layout, so that the first frame drawn is laid out for this width.
        self.set_class(self.app.size.width < NARROW_BELOW, "-narrow")
        self.query_one("#side").styles.width = side_width(self.app.size.width)
        self.refresh_view()
        self.query_one("#keys", SizedPanel).show(lambda w, h: [self._key_line(w)])
        self.say("⏎ type an amount · + − nudge · t transfer · n name · p print · x plan · ? all keys", ok=None)

    def on_resize(self, event) -> None:
        self.set_class(event.size.width < NARROW_BELOW, "-narrow")
        self.query_one("#side").styles.width = side_width(event.size.width)  # None: the stylesheet's
        self.refresh_bindings()
        if self._said is not None and self.is_mounted:  # fitted to the width it was said at: fit it again
            self.say(*self._said, width=event.size.width)  # (self.size is not yet the new one here)

    def _key_line(self, width: int) -> Text:
        """The footer: the commands' keys that fit, ? (every key) and q always (ui/commands.footer_keys)."""
        narrow = width < NARROW_BELOW
        keys, _ = footer_keys(width, shown=lambda c: c.action != "toggle_gz" or narrow)
        sep = " " if sum(len(k) + len(label) + 3 for k, label in keys) > width else "  "
        line = Text(" ")
        for i, (key, label) in enumerate(keys):
            if i:
                line.append(sep)
            line.append(key, P["title"])
            line.append(" " + label, P["label"])
        return line

    def check_action(self, action: str, parameters: tuple) -> bool | None:
        """The numbers/curve switch exists only where the screen cannot show both."""
        if action == "toggle_gz":
            return self.has_class("-narrow")
        return True

    # ------------------------------------------------------------------ view

    def refresh_view(self) -> None:
        """Hand the current condition and result to every panel."""
        s = self.session
        v, c, r, stale = s.vessel, s.condition, s.result, s.stale
        self.query_one(LoadBoard).show(v, c, r, stale)
        alerts = views.alerts(r, stale, s.problem)
        self.query_one("#alerts", SizedPanel).show(lambda w, h: alert_lines(alerts, h, w))
        self.query_one("#afloat", SizedPanel).show(lambda w, h: views.afloat_lines(v, c, r, stale, w))
        criteria = self.query_one("#criteria", SizedPanel)
        criteria.show(lambda w, h: self._criteria_lines(r, stale, w, h),
                      rows_for=lambda w, room: len(self._wide_criteria(r, stale, w, room)))
        side = self.query_one("#side")
        if (not self.has_class("-narrow") and side.size.height
                and len(self._wide_criteria(r, stale, side.size.width, side.size.height)) != criteria.size.height):
            criteria.refresh(layout=True)  # this result's criteria take more or fewer lines
        self.query_one("#gz", SizedPanel).show(lambda w, h: self._curve_lines(r, stale, w, h))
        self.query_one("#titlebar", SizedPanel).show(lambda w, h: [self._title(w)])

    def _curve_lines(self, r, stale: bool, w: int, h: int) -> list[Text]:
        """The GZ curve, or with key b the weather criterion on it (or why there is none)."""
        if self.has_class("-wind"):
            if stale:  # the last a and b are not this condition's: no plot of them
                return verdict.weather_missing(None, w)
            chart = verdict.weather_chart(r, stale, w - 1, h - 1)
            if chart is None:
                return verdict.weather_missing(r, w)
            return [verdict.weather_caption(r, w), *chart.lines()]
        if stale:  # the grey curve is the last good condition's: its title says so, not its facts
            head = fit_lines(Text(" GZ curve of the last good condition, not this one", P["stale"]), w, 2)
            return [*head, *views.gz_chart(r, stale, w - 1, h - len(head)).lines()]
        head = gz_title_lines(r, w)  # every fact of the title, on two lines where one is too short
        return [*head, *views.gz_chart(r, stale, w - 1, h - len(head)).lines()]

    def _criteria_lines(self, r, stale: bool, w: int, h: int) -> list[Text]:
        """The criteria panel's lines at its size: wide, those :meth:`_wide_criteria` gives for the
        side panel's height (the panel is as tall as they are); narrow, those that fit ``h``."""
        if self.has_class("-narrow"):
            return verdict.criteria_lines(r, stale, w, h)
        return self._wide_criteria(r, stale, w, self.query_one("#side").size.height)

    def _wide_criteria(self, r, stale: bool, width: int, side_rows: int) -> list[Text]:
        """Wide screen: the criteria lines at ``width`` in a side panel ``side_rows`` tall, fitted
        to what the 'Afloat' numbers and MIN_CURVE_ROWS of curve leave.  The layout asks for their
        number (the panel's CSS height is auto) and the panel then draws them: the lines last made are
        kept, so that the count and the drawing share one build."""
        afloat = self.query_one("#afloat").styles.height  # fixed in deckload.tcss
        room = max(4, side_rows - (int(afloat.value) if afloat is not None and afloat.is_cells else 0)
                   - MIN_CURVE_ROWS)
        made = self._criteria_made
        if made is not None and made[0] is r and made[1:4] == (stale, width, room):
            return made[4]
        lines = verdict.criteria_lines(r, stale, max(1, width), room)
        self._criteria_made = (r, stale, width, room, lines)
        return lines

    def _title(self, width: int) -> Text:
        """Vessel, condition, whether changes are saved (NOT SAVING in a window that saves nothing,
        NOT SAVED while the newest condition is in no file) and logged, undo depth.  Shortened step by step until
        it fits (narrow screens start at the third step): the program's name goes, then the log
        and plan words are shortened, then 'modified from <name>' becomes '(modified)', then the
        condition's name ends in '…'."""
        level = 0 if width >= NARROW_BELOW else 3
        t = self._title_text(level, None)
        while cells(t.plain) > width and level < 3:
            level += 1
            t = self._title_text(level, None)
        if cells(t.plain) > width:
            name = self.session.condition.name
            t = self._title_text(level, views.fit(name, max(8, len(name) - (cells(t.plain) - width))))
        return cut(t, width)

    def _title_text(self, level: int, name: str | None) -> Text:
        s, j = self.session, self.session.journal
        t = []  # the pieces after the first (views.pieces: one Text made at the end)
        t.append((f"{s.vessel.particulars.name} │ {name or s.condition.name}", P["value"]))
        if s.condition.modified_from:
            t.append((f" (modified from {s.condition.modified_from})" if level < 3 else " (modified)", P["caution"]))
        words = level < 2
        # Before the log and undo words: a title too long for the screen is cut from its end.
        if s.not_saving:
            t.append((" │ ", P["value"]))
            t.append(("NOT SAVING: another deckload has this vessel" if words else "NOT SAVING", P["danger"]))
        elif s.unsaved:
            t.append((" │ ", P["value"]))
            t.append(("NOT SAVED: the last save failed" if words else "NOT SAVED", P["danger"]))
        t.append((" │ ", P["value"]))
        if j.writable and j.officer:
            t.append((f"watch {j.officer}, logged" if words else f"{j.officer} logged", P["dim"]))
        elif j.writable:
            t.append(("changes NOT logged: o to sign on" if words else "NOT logged (o)", P["caution"]))
        else:
            t.append((f"log off: {j.problem or 'no log'}" if words else "log off", P["caution"]))
        if s.planning:
            t.append((f" │ PLAN ({s.plan_steps}, not logged: x to apply or discard)" if words else " │ PLAN",
                      P["caution"]))
        t.append((f" │ undo {s.undo_depth} redo {s.redo_depth}", P["dim"]))
        if s.saves_pending:
            # The edit is on screen but not yet on disk: say so until the writer has saved it.
            t.append((" │ saving…" if level < 3 else " saving…", P["caution"]))
        return views.pieces(P["title"], " deckload │ " if level < 1 else " ", *t)

    def _save_landed(self) -> None:
        """A change reached the disk (or failed, which ``_report`` says): redraw the title."""
        if self.is_attached:
            self.query_one("#titlebar", SizedPanel).show(lambda w, h: [self._title(w)])
        self._say_clock_back("Logged")  # an edit logged with the clock set back: said as a record's would be

    def _say_clock_back(self, done: str) -> None:
        """Say, once, that the first entry logged since the last time was timed earlier than the
        newest before it (a clock set back): after an edit lands, a record, a sign-on or -off."""
        back = self.session.journal.take_clock_warning()
        if back:
            self.notify(f"{done}, but {back}", severity="warning", timeout=20, markup=False)

    def _report(self, problem: str) -> None:
        # A save or log failure replaces the message line, which must never still read as done.
        self.say(problem, ok=False)
        self.notify(problem, severity="error", timeout=8, markup=False)

    def say(self, message: str, ok: bool | None = True, width: int | None = None) -> None:
        """The message line: ✔ done, ✖ refused, or a plain hint; fitted to ``width`` (the screen's)."""
        style, mark = {True: (P["ok"], "✔ "), False: (P["danger"], "✖ "), None: (P["dim"], "")}[ok]
        panel = self.query_one("#status", LinePanel)
        # A result or refusal takes two lines where one would cut it (80 columns; the second ends in …
        # if even that is short); a hint (ok None) keeps one line, so the board keeps its rows.
        self._said = (message, ok)  # fitted again when the screen's width changes
        lines = fit_lines(Text(" " + mark + message, style), max(20, width or self.size.width),
                          1 if ok is None else STATUS_MAX_LINES)
        if panel.styles.height is None or panel.styles.height.value != len(lines):
            panel.styles.height = len(lines)
            self.call_after_refresh(self._cursor_in_view)  # the board lost or gained a row
        panel.set_lines(lines)

    def refuse_form(self, message: str) -> None:
        """Refuse a key that opens a form: say why, and drop what was typed for the form
        (:meth:`deckload.ui.app.DeckloadApp.drop_typeahead`)."""
        self.app.drop_typeahead()
        self.say(message + " (keys typed for it are ignored up to ⏎ or Esc)", ok=False)

    def _cursor_in_view(self) -> None:
        board = self.query_one(LoadBoard)
        if board.cursor_key is not None:
            board.select(board.cursor_key, announce=False)

    # ------------------------------------------------------------------ changes

    def commit(self, condition: Condition, label: str, kind: str = "edit", data: dict | None = None,
               *, mark: bool = True, run: tuple[str, str] | None = None) -> None:
        s = self.session
        gm_before = s.result.gm_fluid_m if s.result is not None and not s.stale else None
        tank_id = (data or {}).get("tank")
        if isinstance(tank_id, str):  # a tank emptied keeps a stated density: say so
            label += entry.density_kept_note(s.vessel, s.condition, condition, tank_id)
        try:
            problems = s.commit(condition, label, kind, data, mark=mark and kind != "restore", run=run)
        except EntryError as exc:
            self.say(str(exc), ok=False)
            return
        if self._settle_timer is not None:
            self._settle_timer.cancel()
            self._settle_timer = None
        if run is not None:
            # A run of nudges or retypes of one item is one log entry: it ends after a pause.  An
            # event-loop timer: every key of a run sets it again, and each of textual's timers is a
            # task of its own to make, and to wake only to cancel it.
            self._settle_timer = asyncio.get_running_loop().call_later(RUN_PAUSE_S, self.call_next, self._settle)
        self.refresh_view()
        # in a window that saves nothing, the confirmation says so itself, not only the title
        unsaved = " — not saved: this window saves nothing" if self.session.not_saving else ""
        self.say(label + self._gm_change(gm_before) + unsaved)
        for p in problems:
            self._report(p)

    def _gm_change(self, before: float | None) -> str:
        s = self.session
        if s.stale:
            return " — outside the tables, see the warning"
        if before is None or s.result is None:
            return ""
        return f" — GM fluid {before:.3f} → {s.result.gm_fluid_m:.3f} m"

    def _try(self, build, label: str, kind: str = "edit", data: dict | None = None,
             run: tuple[str, str] | None = None) -> None:
        """Build a new condition; refusal goes to the message line and nothing changes."""
        try:
            condition = build()
        except EntryError as exc:
            self.say(str(exc), ok=False)
            return
        self.commit(condition, label, kind, data, run=run)

    def on_unmount(self) -> None:
        if self._settle_timer is not None:  # the screen is going: quitting settles the run itself
            self._settle_timer.cancel()
            self._settle_timer = None

    def _settle(self) -> None:
        """The run of edits of one item has ended: its one log entry is written."""
        self._settle_timer = None
        for p in self.session.settle():
            self._report(p)

    def _kind(self, tank_id: str) -> str:
        return "ballast" if self.session.vessel.tank(tank_id).kind == "ballast" else "edit"

    @property
    def _key(self) -> tuple:
        return self.query_one(LoadBoard).cursor_key or (None, None)

    # ------------------------------------------------------------------ actions (one per command)

    def action_set_amount(self) -> None:
        what, ident = self._key
        if what == "tank":
            self._edit_tank(ident)
        elif what == "hold":
            self._edit_hold(ident)
        elif what in ("deck", "const"):
            self._edit_item(what == "deck", ident)
        elif what == "fixed":
            self.say("A fixed constant of the vessel profile: to change it for this condition, add a constant (c) of the same name.", ok=False)
        elif what == "dwt":
            self.say(DWT_HINT, ok=False)

    def _edit_tank(self, tank_id: str) -> None:
        s = self.session
        tank, fill = s.vessel.tank(tank_id), s.condition.tank_fill(tank_id)
        hint = entry.amount_hint(tank, fill)

        def build(text: str) -> tuple[Condition, str]:
            return entry.tank_from_text(s.condition, tank, text), text.strip()

        def done(r) -> None:
            if r:
                # Say what was understood, so a slip from m3 to m (sounding) is seen at once.
                got = entry.describe_fill(tank, r[0].tank_fill(tank.id), s.vessel, r[0])
                self.commit(r[0], f"{tank.id} set to {got}", self._kind(tank.id), {"tank": tank.id, "entered": r[1]},
                            run=("tank", tank.id))

        preview = lambda text: entry.amount_preview(s.condition, tank, text, s.vessel)  # noqa: E731
        self.app.push_screen(_forms().PromptForm(f"{tank.id}  {tank.name}", hint, entry.fill_text(fill), build, preview), done)

    def _edit_hold(self, hold_id: str) -> None:
        s = self.session
        hold = s.vessel.hold(hold_id)
        load = next((h for h in s.condition.holds if h.hold_id == hold_id), None)
        limit = f"; structural limit {hold.max_mass_t:g} t" if hold.max_mass_t is not None else ""

        def build(text: str) -> tuple[Condition, str]:
            return entry.hold_from_text(s.condition, hold, text, s.vessel), text.strip()

        def done(r) -> None:
            if r:
                mass = next((h.mass_t for h in r[0].holds if h.hold_id == hold.id), 0.0)
                self.commit(r[0], f"{hold.id} cargo set to {mass:g} t", "cargo", {"hold": hold.id, "entered": r[1]},
                            run=("hold", hold.id))

        form = _forms().PromptForm(f"{hold.id}  {hold.name}", f"Cargo mass in t (0 empties the hold){limit}",
                                   f"{load.mass_t:g}" if load else "", build)
        self.app.push_screen(form, done)

    def _edit_item(self, deck: bool, index: int | None) -> None:
        s = self.session
        items = s.condition.deck_items if deck else s.condition.constants
        noun = "deck load" if deck else "constant"
        at = len(items) if index is None else index
        form = entry.form_of(items[index]) if index is not None else ItemForm("", "", "", "", "0", "")

        def build(f: ItemForm) -> tuple[Condition, str]:
            item = entry.item_from_form(s.vessel, f, deck=deck, base=items[index] if index is not None else None)
            return self._with_items(deck, entry.replace_at(items, at, item)), item.name

        title = f"{'Edit' if index is not None else 'Add'} {noun}"
        # The area list's room must not count the item being edited: it is what the form replaces.
        others = s.condition if index is None else self._with_items(deck, items[:index] + items[index + 1:])
        self.app.push_screen(_forms().ItemFormScreen(title, form, build, deck=deck, vessel=s.vessel, condition=others),
                             lambda r: r and self.commit(r[0], f"{title}: {r[1]}", "cargo" if deck else "edit", {noun: r[1]}))

    def _with_items(self, deck: bool, items: tuple) -> Condition:
        c = self.session.condition
        return c.with_deck_items(items) if deck else c.with_constants(items)

    def action_nudge(self, step: int) -> None:
        what, ident = self._key
        s = self.session
        if what == "tank":
            tank = s.vessel.tank(ident)
            self._try(lambda: entry.nudge_tank(s.condition, tank, float(step), s.vessel),
                      f"{tank.id} {step:+d} %", self._kind(tank.id), {"tank": tank.id, "nudge_pct": step},
                      run=("tank", tank.id))
        elif what == "hold":
            hold = s.vessel.hold(ident)
            self._try(lambda: entry.nudge_hold(s.condition, hold, float(step), s.vessel),
                      f"{hold.id} {step:+d} t", "cargo", {"hold": hold.id, "nudge_t": step}, run=("hold", hold.id))
        elif what in ("deck", "const"):
            deck = what == "deck"
            items = s.condition.deck_items if deck else s.condition.constants
            item = items[ident]

            def build() -> Condition:
                new = dataclasses.replace(item, mass_t=entry.nudge_mass(item.mass_t, step, item.name, s.vessel, deck=deck))
                return self._with_items(deck, entry.replace_at(items, ident, new))

            self._try(build, f"{item.name} {step:+d} t", "cargo" if deck else "edit", {"item": item.name, "nudge_t": step})
        else:
            self.say("Put the cursor on a tank, hold or item to nudge it.", ok=False)

    def action_fill(self) -> None:
        what, ident = self._key
        if what != "tank":
            self.say("Full applies to tanks: put the cursor on a tank.", ok=False)
            return
        s = self.session
        tank = s.vessel.tank(ident)
        top = tank.table_top_pct  # 100, or the last row of a table printed short of full
        usual = min(s.vessel.usual_max_pct(tank.kind), top)
        now = 100.0 * entry.held_m3(s.vessel, s.condition, tank) / tank.capacity_m3
        # The first f takes the tank to its kind's usual maximum; a second f (already there) to 100 %.
        pct = top if now >= usual - 0.05 else usual
        if now >= top - 1e-9:
            self.say(f"{tank.id} is already full" + (f": {top:g} % is the top of its table." if tank.short_table
                                                     else "."), ok=False)
            return
        said = (f" (usual maximum; f again for {top:g} %)" if pct < top
                else " (the top of its table)" if tank.short_table else "")
        self._try(lambda: entry.set_tank(s.condition, tank, "percent", pct), f"{tank.id} filled to {pct:g} %{said}",
                  self._kind(tank.id), {"tank": tank.id, "fill_pct": pct})

    def action_empty(self) -> None:
        what, ident = self._key
        s = self.session
        c = s.condition
        if what == "tank":
            tank = s.vessel.tank(ident)
            if entry.held_m3(s.vessel, c, tank) <= entry.EMPTY_VOLUME_M3:
                self.say(f"{ident} is already empty.", ok=False)
                return
            self.commit(entry.empty_tank(c, tank), f"{ident} emptied", self._kind(ident), {"tank": ident, "fill_pct": 0.0})
        elif what == "hold":
            if not any(h.hold_id == ident for h in c.holds):
                self.say(f"{ident} is already empty.", ok=False)
                return
            self.commit(c.without_hold(ident), f"{ident} emptied", "cargo", {"hold": ident})
        elif what in ("deck", "const"):
            deck = what == "deck"
            items = c.deck_items if deck else c.constants
            name = items[ident].name
            self.commit(self._with_items(deck, entry.replace_at(items, ident, None)), f"Removed {name}", "cargo" if deck else "edit",
                        {"removed": name})
        else:
            self.say("Put the cursor on a tank, hold or item to empty or remove it.", ok=False)

    def action_transfer(self) -> None:
        s = self.session
        what, ident = self._key
        src = dst = ""
        if what == "tank":
            tank = s.vessel.tank(ident)
            if entry.held_m3(s.vessel, s.condition, tank) > 1e-6:
                src, dst = ident, entry.receiving_tank(s.vessel, s.condition, ident)
            else:  # an empty tank has nothing to give: the officer means to fill it, from a tank that holds some
                src, dst = entry.giving_tank(s.vessel, s.condition, ident), ident
        form = _forms().TransferForm(s.vessel, s.condition, None if s.stale else s.result, s.preview, src, dst)
        self.app.push_screen(form, lambda plan: plan and self.commit(
            plan.condition, plan.label, "transfer",
            {"from": plan.from_id, "to": plan.to_id, "mass_t": round(plan.mass_t, 3)}))

    def action_ballast_plan(self) -> None:
        from deckload.core.stability import evaluate
        from deckload.ui.planner import PlannerForm

        s = self.session
        if s.stale or s.result is None:
            self.refuse_form("The condition is outside the tables: the planner needs a result to start from.")
            return

        def done(p) -> None:
            if p is not None:
                from deckload.ui.planner import plan_words

                self.commit(p.condition, f"Planned: {plan_words(p)}", "transfer",
                            {"planned": True, "transfers": [{"from": t.from_id, "to": t.to_id, "mass_t": round(t.mass_t, 3)}
                                                            for t in p.transfers]})

        self.app.push_screen(PlannerForm(s.vessel, s.condition, s.result, evaluate), done)

    def action_add_deck(self) -> None:
        self._edit_item(True, None)

    def action_add_constant(self) -> None:
        self._edit_item(False, None)

    def action_density(self) -> None:
        s = self.session
        lo, hi = entry.WATER_DENSITY_RANGE_T_M3
        build = lambda text: entry.density_from_text(s.condition, text)  # noqa: E731
        self.app.push_screen(
            _forms().PromptForm("Water density", f"t/m³, {lo:.3f}–{hi:.3f} (sea water 1.025, fresh 1.000)",
                                f"{s.condition.water_density_t_m3:.3f}", build),
            lambda c: c and self.commit(c, f"Water density {c.water_density_t_m3:.3f} t/m³", "edit",
                                        {"water_density_t_m3": c.water_density_t_m3}))

    def action_tank_density(self) -> None:
        what, ident = self._key
        if what != "tank":
            self.say("Tank density applies to tanks: put the cursor on a tank (d sets the water she floats in).",
                     ok=False)
            return
        s = self.session
        tank = s.vessel.tank(ident)
        fill = s.condition.tank_fill(ident)
        lo, hi = entry.LIQUID_DENSITY_RANGE_T_M3
        now = entry.tank_density(tank, fill)
        build = lambda text: entry.set_tank_density(s.condition, tank, text)  # noqa: E731

        def done(c) -> None:
            if not c:
                return
            new = c.tank_fill(ident)
            rho = new.density_t_m3 if new is not None else None
            said = f"{rho:.3f} t/m³ (delivery note)" if rho is not None else f"{tank.density_t_m3:.3f} t/m³ (the tank's default)"
            self.commit(c, f"{ident} density {said}, was {now:.3f}", self._kind(ident),
                        {"tank": ident, "density_t_m3": rho})

        self.app.push_screen(
            _forms().PromptForm(f"Density in {tank.id} {tank.name}",
                                f"t/m³, {lo:.3f}–{hi:.3f}, from the delivery note; empty or 'default' for the tank's own "
                                f"{tank.density_t_m3:.3f}. The amount stays as stated.", f"{now:.4g}", build),
            done)

    def action_fs_rule(self) -> None:
        s = self.session
        new = "actual" if (s.condition.fs_rule or s.vessel.free_surface.rule) == "is2008" else "is2008"
        words = {"is2008": "IS Code 2008 Part B 3.1", "actual": "every slack tank at its actual level"}
        self.commit(s.condition.replace(fs_rule=new), f"Free-surface rule: {words[new]}", "edit", {"fs_rule": new})

    def action_gz_method(self) -> None:
        s = self.session
        new = "transfer" if (s.condition.gz_correction or s.vessel.free_surface.gz_correction) == "constant" \
            else "constant"
        words = {"constant": "constant rise of G (ΣFSM/Δ)", "transfer": "actual fluid transfer at each heel"}
        self.commit(s.condition.replace(gz_correction=new), f"GZ correction: {words[new]}", "edit",
                    {"gz_correction": new})

    def action_undo(self) -> None:
        self._history(self.session.undo)

    def action_redo(self) -> None:
        self._history(self.session.redo)

    def _history(self, move) -> None:
        try:
            label, problems = move()
        except EntryError as exc:
            self.say(str(exc), ok=False)
            return
        self.refresh_view()
        self.say(label)
        for p in problems:
            self._report(p)

    def action_toggle_gz(self) -> None:
        self.toggle_class("-gz")
        if self.has_class("-narrow") and not self.has_class("-gz") and self.has_class("-wind"):
            # Leaving the curve panel leaves the wind and roll plot too, so that the message line
            # never goes on naming a plot that is no longer on the screen.
            self.set_class(False, "-wind")
            self.refresh_view()
            self.say("Afloat and criteria panels: g for the GZ curve", ok=None)

    def action_wind_plot(self) -> None:
        """The curve panel between the plain GZ curve and the weather criterion (narrow: shows the curve)."""
        on = not self.has_class("-wind")
        self.set_class(on, "-wind")
        if self.has_class("-narrow"):
            self.set_class(on, "-gz")
        self.refresh_view()
        s = self.session
        if on and s.stale:  # s.result is the last good condition's, not this one's (as _curve_lines)
            self.say("Wind and roll: no result for this condition (outside the tables).", ok=None)
        elif on and (s.result is None or s.result.weather is None):
            self.say("Weather criterion not assessed for this condition: the panel says why.", ok=None)
        else:
            self.say("Wind and roll plot: b again for the plain GZ curve" if on else "GZ curve", ok=None)

    def action_verdict(self) -> None:
        s = self.session
        lines = verdict.verdict_page(None if s.stale else s.result, width=max(40, min(94, self.size.width - 6)))  # .form.help 100 − border, padding, scrollbar
        title = "Verdict" + (": none for this condition (outside the tables)" if s.stale else "")
        self.app.push_screen(_forms().TextScreen(title, lines))

    def action_record(self) -> None:
        j = self.session.journal
        if not j.writable:
            self.refuse_form(f"The voyage log cannot be written ({j.problem or 'no log'}); nothing recorded.")
            return

        def done(answer) -> None:
            if not answer:
                return
            stale = self.session.stale  # recorded without a result: the message must not read as a full record
            problems = self.session.record(*answer)
            for p in problems:
                self.notify(p, severity="error", timeout=8, markup=False)
            self._say_clock_back("Recorded")  # (this record's, or an edit's logged just before it)
            broken = j.broken()
            if broken and not problems:
                self.notify(f"Recorded, but {broken}", severity="warning", timeout=20, markup=False)
            if problems:
                self.say("Not recorded", ok=False)
            elif stale:
                self.say(f"Condition recorded in the log by {answer[0]} WITHOUT A RESULT: outside the tables, "
                         "no stability computed")
            else:
                self.say(f"Condition recorded in the log by {answer[0]}")

        self.app.push_screen(_forms().RecordForm(j.officer, None), done)

    def action_sign_on(self) -> None:
        j = self.session.journal
        if not j.writable:
            self.refuse_form(f"The voyage log cannot be written ({j.problem or 'no log'}).")
            return

        def build(text: str) -> str:
            by = text.strip().upper()
            if by == "-" and j.officer:
                return by
            if not (1 <= len(by) <= 4 and by.isalpha() and by.isascii()):
                raise EntryError("Initials: one to four letters A–Z, e.g. JS" + (", or - to sign off." if j.officer else "."))
            return by

        def done(by: str | None) -> None:
            if not by:
                return
            for p in self.session.flush():  # the outgoing officer's last run is logged under their initials
                self._report(p)
            was = j.officer
            if was:
                err = j.append(kind="remark", by=was, change_text=f"{was} signed off watch" +
                               (f", handing over to {by}" if by != "-" else ""), change_data={"signed_off": was},
                               result=None, condition=None)
                if err:
                    self._report(err)
            j.officer = "" if by == "-" else by
            if by != "-":
                err = j.append(kind="remark", by=by, change_text=f"{by} signed on as officer of the watch",
                               change_data={"signed_on": by}, result=None, condition=None)
                if err:
                    self._report(err)
            self.refresh_view()
            self.say(f"{was} signed off: changes are NOT logged until someone signs on (o)." if by == "-" else
                     f"{by} on watch: changes are logged under these initials.")
            self._say_clock_back("Logged")

        hint = "Your initials (1–4 letters)" + (f"; - signs {j.officer} off" if j.officer else "")
        self.app.push_screen(_forms().PromptForm("Officer of the watch", hint, j.officer, build), done)

    def action_plan(self) -> None:
        """Start trying a plan; during one, choose to apply it (one log entry) or discard it."""
        from deckload.ui.conditions import PlanEndForm

        s = self.session
        if not s.planning:
            for p in s.flush():
                self._report(p)
            s.start_plan()
            self.refresh_view()
            self.say("Plan: try changes freely; they enter the log only when applied (x again to apply or discard)")
            return

        def done(choice: str | None) -> None:
            if choice is None:
                return
            label, problems = s.apply_plan() if choice == "apply" else s.discard_plan()
            self.refresh_view()
            self.say(label)
            for p in problems:
                self._report(p)

        self.app.push_screen(PlanEndForm(s.plan_steps), done)

    def action_save_as(self) -> None:
        from deckload.ui.conditions import SaveAsForm, save_target

        folder, stock_titles = save_target(self.session)
        if folder is None:
            self.refuse_form("No working-conditions folder: this window cannot save conditions.")
            return
        c = self.session.condition
        initial = "" if c.modified_from else c.name

        def done(answer) -> None:
            if not answer:
                return
            name, path = answer
            try:
                problems = self.session.save_as(name, path)
            except (OSError, EntryError) as exc:
                self.say(f"NOT SAVED ({getattr(exc, 'strerror', None) or exc}): {path}", ok=False)
                return
            self.refresh_view()
            self.say(f"Saved as “{name}” in {path}")
            for p in problems:
                self._report(p)

        self.app.push_screen(SaveAsForm(initial, folder, stock_titles), done)

    def action_open_condition(self) -> None:
        from deckload.ui.conditions import OpenConditionScreen, known_conditions

        found = known_conditions(self.session)
        if not found:
            self.refuse_form("No stock or saved conditions of this vessel to open.")
            return

        def done(named) -> None:
            if named is None:
                return
            from deckload.io.profiles import ProfileError, load_condition

            try:
                condition = load_condition(named.path, self.session.vessel)
            except (ProfileError, OSError) as exc:
                self.say(f"Cannot open {named.path}: {getattr(exc, 'strerror', None) or exc}", ok=False)
                return
            self.replace_condition(condition, f"Opened “{condition.name}” ({named.origin}, {named.path.name})",
                                   "edit", {"opened": str(named.path)}, f"“{condition.name}” not opened")

        self.app.push_screen(OpenConditionScreen(found), done)

    def replace_condition(self, condition: Condition, label: str, kind: str, data: dict, not_done: str) -> None:
        """Make another condition the working one (opened, or restored from the log) as one
        undoable change, an edited working condition first kept beside the working file
        (:meth:`Session.keep_previous`); when it cannot be kept, nothing is replaced and the
        message line says so, beginning with ``not_done``."""
        try:
            kept = self.session.keep_previous()
        except OSError as exc:
            self.say(f"{not_done}: the edited working condition could not be kept "
                     f"({getattr(exc, 'strerror', None) or exc})", ok=False)
            return
        self.commit(condition, label + (f"; the edited one kept as {kept.name}" if kept else ""), kind, data,
                    mark=False)

    def action_print_report(self) -> None:
        from deckload.ui.conditions import ReportWritten, open_in_browser, print_session

        try:
            printed = print_session(self.session)
        except (OSError, EntryError) as exc:
            where = getattr(exc, "filename", None)
            self.say(f"Report NOT written{f': {where}' if where else ''}: {getattr(exc, 'strerror', None) or exc}",
                     ok=False)
            return
        self.say(f"Report written: {printed.html_path} (and .txt)")
        self.app.push_screen(ReportWritten(printed.html_path, printed.text_path, open_in_browser))

    def action_show_log(self) -> None:
        self.app.show_log()

    def action_alerts(self) -> None:
        s = self.session
        every = views.alerts(s.result, s.stale, s.problem)
        self.app.push_screen(_forms().TextScreen("Warnings", alert_lines(every, len(every) + 1)))  # whole, the page wraps

    def action_compare_hull(self) -> None:
        from deckload.ui.hull_compare import HullCompareScreen

        s = self.session
        if s.result is None or s.stale:
            self.notify("No current result to compare: fix the condition first.", severity="warning")
            return
        self.app.push_screen(HullCompareScreen(s.vessel, s.result))

    def action_help(self) -> None:
        self.app.push_screen(_forms().HelpScreen())

    async def action_quit(self) -> None:
        await self.app.action_quit()

    def on_load_board_cursor_moved(self, event: LoadBoard.CursorMoved) -> None:
        self._settle()
        what, ident = event.key or (None, None)
        if what == "tank":
            t = self.session.vessel.tank(ident)
            r = self.session.result
            why = next((x.fs_rule for x in r.tanks if x.id == ident), "") if r is not None else ""
            fill = self.session.condition.tank_fill(ident)
            rho = f" · ρ {fill.density_t_m3:.4g} stated (D)" if fill is not None and fill.density_t_m3 is not None else ""
            keys = " · ⏎ set · + − · f full · e empty · t transfer" if not self.has_class("-narrow") else ""
            short = f" (table to {t.table_top_pct:g} %)" if t.short_table else ""
            fsm = f" · FSM: {why}" if why else ""  # (no result yet: outside the tables from the start)
            self.say(f"{t.id} {t.name} · {t.capacity_m3:.1f} m³{short}{rho}{fsm}{keys}", ok=None)
        elif what == "hold":
            # the whole of what the board shortens with '…' (name, what is stowed, the limit)
            hold = self.session.vessel.hold(ident)
            load = next((h for h in self.session.condition.holds if h.hold_id == ident), None)
            limit = f" of {hold.max_mass_t:g} t" if hold.max_mass_t is not None else ""
            stowed = f" · {load.description}" if load is not None and load.description else ""
            keys = " · ⏎ cargo mass · + − 1 t · e empty" if not self.has_class("-narrow") else ""
            self.say(f"{ident} {hold.name} · {load.mass_t if load else 0.0:.2f} t{limit}{stowed}{keys}", ok=None)
        elif what in ("deck", "const"):
            items = self.session.condition.deck_items if what == "deck" else self.session.condition.constants
            keys = (" · ⏎ edit mass and position · + − 1 t · e remove · a add deck load · c add constant"
                    if not self.has_class("-narrow") else "")
            self.say(f"{item_summary(items[ident])}{keys}", ok=None)
        elif what == "fixed":
            self.say(f"{item_summary(self.session.vessel.constants[ident])} · a fixed constant of the vessel "
                     f"profile: to change it for this condition, add a constant (c) of the same name.", ok=None)
        elif what == "dwt":
            self.say(DWT_HINT if not self.has_class("-narrow") else DWT_HINT_NARROW, ok=None)


def item_summary(item) -> str:
    """A deck load or constant in full, as the board cannot always show it: name, mass, centre of
    gravity (x from the aft perpendicular, z above keel, side as P/S) and deck area."""
    area = getattr(item, "area_id", None)
    side = "on the centreline" if round(abs(item.tcg_m), 2) == 0 else \
        f"{abs(item.tcg_m):.2f} m {'S' if item.tcg_m > 0 else 'P'}"
    return (f"{item.name} · {item.mass_t:.2f} t at x {item.lcg_m:.2f} m, z {item.vcg_m:.2f} m, {side}"
            + (f" · on {area}" if area else ""))


DWT_HINT_NARROW = "Deadweight by kind: sums of the lines above (cargo: holds, deck, liquid cargo)"
DWT_HINT = ("Deadweight by kind: the sum of the lines above it (cargo = holds, deck loads and liquid cargo); "
            "change the tanks and items themselves.")


STATUS_MAX_LINES = 2
"""The message line grows to this many lines on a narrow screen rather than cut a message."""

_WRAP_CONSOLE = Console(width=400, no_color=True, legacy_windows=False)


def cut(text: Text, width: int) -> Text:
    """``text`` if it fits in ``width`` cells, else a copy cut to fit, ending in "…"."""
    if cells(text.plain) <= width:
        return text
    out = text.copy()
    out.truncate(width, overflow="ellipsis")
    return out


def fit_lines(text: Text, width: int, max_lines: int, indent: int = 2) -> list[Text]:
    """``text`` wrapped to ``width`` cells (lines after the first indented by ``indent``), at most
    ``max_lines``; the last line ends in "…" when anything is left out."""
    if cells(text.plain) <= width:
        return [text]
    first, *rest = text.wrap(_WRAP_CONSOLE, max(10, width - indent))
    lines = [first] + [Text(" " * indent).append_text(line) for line in rest]
    if len(lines) > max_lines:  # the last line shown carries the rest, cut with "…" where it overflows
        last = lines[max_lines - 1].copy()
        last.rstrip()
        for more in lines[max_lines:]:
            more = more[indent:]
            last.append(" ").append_text(more[len(more.plain) - len(more.plain.lstrip()):])
        lines = lines[: max_lines - 1] + [last]
    # fit_width's rule: a word or number the edge would split is left out whole ("z 5.8…" read 5.8)
    return [fit_width(ln, width) for ln in lines]


def gz_title_lines(result, width: int) -> list[Text]:
    """The curve's title (views.gz_caption) with every fact it holds: "GZ curve" becomes "GZ" where
    the line is too short, then it wraps to two lines; nothing is left out."""
    title = views.gz_caption(result)
    key = (title.plain, tuple(title.spans), title.style, width)
    lines = _GZ_TITLES.get(key)
    if lines is None:
        if len(_GZ_TITLES) >= 256:  # a bound: a caption holds numbers, each key may bring a new one
            _GZ_TITLES.clear()
        lines = _GZ_TITLES[key] = tuple(_gz_title_lines(title, width))
    return list(lines)


_GZ_TITLES: dict[tuple, tuple[Text, ...]] = {}
"""The title's lines kept by the caption's text, spans and style and the width (a caption
cut into lines is rich's slicing, a few tens of µs a line): shared, never modified."""


def _gz_title_lines(title: Text, width: int) -> list[Text]:
    if cells(title.plain) > width and title.plain.startswith(" GZ curve"):
        title = Text(" GZ", P["title"]).append_text(title[len(" GZ curve"):])
    if cells(title.plain) <= width:
        return [title]
    # Lines broken between its parts (two spaces apart), never inside one ("max 0.374 | m at 29.2°"):
    # packed greedily into at most three lines; only a part wider than the panel is wrapped by words.
    text = title.plain
    breaks = [i for i in range(1, len(text)) if text.startswith("  ", i)] + [len(text)]
    lines, start = [], 0
    while start < len(text) and len(lines) < 3:
        fits = [b for b in breaks if start < b and b - start <= width]
        if not fits:
            return fit_lines(title, width, 2)
        end = fits[-1]
        lines.append(title[start:end])
        start = end + 1  # the next line keeps one of the two spaces as its margin
    return lines if start >= len(text) else fit_lines(title, width, 2)


def alert_lines(alerts: list[views.Alert], height: int, width: int | None = None) -> list[Text]:
    """The warning strip: dangers first.  Whole, wrapped to ``width``, when they fit in ``height``
    lines; else one line each, a cut one ending in "…", and the last line says that ``w`` lists
    them all (counting those left out).  ``width`` None: every alert, unwrapped (the w page)."""
    if not alerts:
        return [Text(" ✔ No warnings: no assessed criterion failed or within 10 %, no worst-band tank, list and "
                     "drafts within limits", P["ok"])]
    if width is None:
        return [a.line() for a in alerts]
    wrapped = [fit_lines(a.line(), width, height) for a in alerts]
    if sum(len(w) for w in wrapped) <= height and all(not w[-1].plain.endswith("…") for w in wrapped):
        return [ln for w in wrapped for ln in w]
    lines = [a.line() for a in alerts[:height]]
    if len(alerts) > height:
        lines[-1] = Text(f"(+{len(alerts) - height + 1} more: w) ", P["caution"]).append_text(lines[-1])
    # A line cut short ends in "…(w)": w shows every warning in full.
    return [ln if ln.cell_len <= width else cut(ln, width - 3).append("(w)", P["caution"]) for ln in lines]
