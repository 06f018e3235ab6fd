"""The voyage-log view: a textual Screen over an open :class:`~deckload.logbook.Logbook`.

How to construct and push it (from the App)::

    from deckload.ui.log_screen import LogScreen, RestoreRequest

    def _restored(req: RestoreRequest | None) -> None:
        if req is not None:   # the officer asked to restore req.condition
            session.commit(req.condition, req.label, kind="restore", data=req.change_data)

    app.push_screen(LogScreen(logbook, vessel), callback=_restored)

``vessel`` is needed to restore a past condition (its TOML is validated against the
profile); when omitted the screen takes ``app.session.vessel``.  The screen never
writes to the log: it reads entries, and a restore is handed back through
``dismiss(RestoreRequest)`` so the caller makes the change — and logs it with kind
``"restore"`` — like any other edit.  It closes with ``dismiss(None)`` on Escape or l.

Keys (shown in the footer): o or ⏎ open the entry read-only, r r restore its condition (asks once),
k next kind, d date filter, c clear filters, v verify the chain, l / Esc back.
Styles: ``log_screen.tcss`` beside this file.
"""

from __future__ import annotations

import os
from datetime import date
from typing import Iterable

from rich.text import Text
from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical, VerticalScroll
from textual.screen import ModalScreen, Screen
from textual.widgets import DataTable, Footer, Input, Static

from deckload.core.frozen import frozen
from deckload.io.textsafe import escape_breaks, escaped
from deckload.report import verdict_format as vf
from deckload.core.model import Condition, Vessel
from deckload.logbook import KIND_LABELS, KINDS, LogEntry, Logbook, back_words, clock_back, condition_of
from deckload.ui.widgets import SteadyInput

ALL_KINDS = "all"


@frozen
class RestoreRequest:
    """What the log screen hands back when the officer restores a past condition."""

    condition: Condition
    """The past condition, validated against the current vessel profile."""
    entry_seq: int
    """Sequence number of the log entry it came from."""
    label: str
    """A change text for the caller's own log entry, e.g. 'restored condition of entry #12'."""
    change_data: dict
    """Change data for that entry: which entry, its time and its SHA-256."""


def parse_day(text: str) -> date | None:
    """'2026-12-01' → date; '' → None; anything else raises ValueError naming the format."""
    text = text.strip()
    if not text:
        return None
    try:
        return date.fromisoformat(text)
    except ValueError:
        raise ValueError(f"date {text!r} is not of the form YYYY-MM-DD") from None


def select_entries(
    entries: Iterable[LogEntry], kind: str = ALL_KINDS, day_from: date | None = None, day_to: date | None = None
) -> list[LogEntry]:
    """Entries of ``kind`` whose ship's date lies in [day_from, day_to] (both inclusive, either open)."""
    out = []
    for e in entries:
        if kind != ALL_KINDS and e.kind != kind:
            continue
        d = e.ship_time.date()
        if day_from is not None and d < day_from:
            continue
        if day_to is not None and d > day_to:
            continue
        out.append(e)
    return out


def _num(x, digits: int = 3, unit: str = "") -> str:
    if isinstance(x, (int, float)) and not isinstance(x, bool):
        return f"{x:.{digits}f}{unit}"
    return "—"


def _short(text: str, n: int) -> str:
    return text if len(text) <= n else text[: n - 1] + "…"


def entry_details(e: LogEntry, back: tuple | None = None, width: int | None = None) -> Text:
    """The entry's stored summary as it was computed when recorded (nothing recomputed); ``back``:
    what :func:`~deckload.logbook.clock_back` says of it (timed earlier than the entry before).  With
    ``width``, every line fits it: a line too long carries on under its own value (a row's under the
    value column, any other indented), so the view does not wrap it again at column 1."""
    t = Text()
    t.append(f"Entry #{e.seq}  ", style="bold")
    # (a date and its time joined by a no-break space: a narrow view wraps between them never)
    t.append(f"{e.ship_time:%Y-%m-%d\u00a0%H:%M} ship's time ({e.ship_clock}), {e.utc:%Y-%m-%d\u00a0%H:%M:%S} UTC\n")
    if back is not None:
        t.append(f"◂ {back_words(back)}\n", style="bold red")
    label = KIND_LABELS.get(e.kind, e.kind)
    said = e.change_text
    if said.lower().startswith(label.lower() + ":"):  # "condition recorded by TS: condition recorded: …" once
        said = said[len(label) + 1:].lstrip()
    t.append(f"{label} by {e.by}: {said}\n")
    if e.remark:
        t.append(f"Remark: {e.remark}\n")
    s = e.summary
    if s is None:
        t.append("No stability summary stored with this entry.\n", style="italic")
    else:
        t.append(f"\nCondition: {s.get('condition_name', '—')}  (water {_num(s.get('water_density_t_m3'))} t/m³)\n")
        rows = [
            ("Displacement", _num(s.get("displacement_t"), 1, " t")),
            ("Deadweight", _num(s.get("deadweight_t"), 1, " t")),
            ("Draft aft / mid / fwd",
             " / ".join(_num(s.get(k)) for k in ("draft_aft_m", "draft_mean_m", "draft_fwd_m")) + " m"),
            ("Trim", vf.sided(s.get("trim_m"), 3, " m", "by the stern", "by the head")),
            ("List", vf.sided(s.get("list_deg"), 1, "°", "S", "P")),
            ("KG fluid", _num(s.get("kg_fluid_m"), 3, " m")),
            ("FSC", _num(s.get("fsc_m"), 3, " m")),
            ("GM fluid", _num(s.get("gm_fluid_m"), 3, " m")),
        ]
        rows += [
            ("Freeboard midships", _num(s.get("freeboard_m"), 3, " m") if "freeboard_m" in s else "—"),
            ("Margin to the mark (+ below)", _num(s.get("load_line_margin_m"), 3, " m")),
            *([("Load line mark in use", f"{escaped(s['load_line_mark'])}, allows "
                                         f"{_num(s.get('load_line_allowed_draft_m'), 3, ' m')} in this water")]
              if isinstance(s.get("load_line_mark"), str) else []),
            ("Deck edge immersion", _num(s.get("deck_edge_angle_deg"), 1, "°")),
            ("Downflooding θf", _num(s.get("downflooding_angle_deg"), 1, "°")),
        ]
        # the value column after the longest label ('Margin to the mark (+ below)' ran into its value at 24)
        label_w = max(len(k) for k, _ in rows) + 2
        for k, v in rows:
            t.append(f"  {k:<{label_w}}{v}\n")
        dwt = s.get("deadweight_by_kind_t")
        if isinstance(dwt, dict) and dwt:  # entries written before it have none
            t.append(f"  {'Deadweight by kind':<{label_w}}" + " · ".join(f"{escaped(str(k))} {_num(m, 2, ' t')}" for k, m in dwt.items()) + "\n")
        word = vf.stored_word(s)
        style = "bold red" if word == "NOT MET" else "bold"
        for line in vf.stored_lines(s, width or 90):
            t.append(line + "\n", style=style)
        if not s.get("verdict"):  # an older entry: its sets one by one (a newer one's verdict names them)
            for x in s.get("criteria_sets") or []:
                t.append(f"    {x.get('title', x.get('id'))}: {'met' if x.get('pass') else 'NOT MET or not all assessable'}\n")
        for x in s.get("criteria_not_assessable") or []:
            t.append(f"    {x.get('id')}: not assessable — {x.get('note', '')}\n", style="bold")
        sm = s.get("smallest_margin")
        if sm:
            d = 1 if sm.get("unit") in ("deg", "°") else 3  # angles to 0.1°, as on every screen
            t.append(f"  Smallest margin: {sm.get('description', sm.get('id'))}: {_num(sm.get('value'), d)} against "
                     f"{_num(sm.get('limit'), d)} {sm.get('unit', '')} (margin {_num(sm.get('margin'), d)})\n")
        for w in s.get("warnings", []):
            t.append(f"  ! {w}\n")
    if e.change_data:
        t.append("\nChange data: ", style="bold")
        t.append(", ".join(f"{k} = {v}" for k, v in e.change_data.items()) + "\n")
    t.append(f"\nSHA-256 {e.sha256}\n", style="dim")
    if width is None:
        return t
    fitted = Text()
    for line in t.split("\n", allow_blank=True):
        for piece in _hanging(line, width, _hang_of(line.plain, label_w if s is not None else 0)):
            fitted.append_text(piece).append("\n")
    fitted.right_crop(1)
    return fitted


def _hang_of(plain: str, label_w: int) -> int:
    """Where a line's continuation starts: under the value of a labelled row ('  Label    value'),
    else two cells in from the line's own indent."""
    lead = len(plain) - len(plain.lstrip(" "))
    if label_w and lead == 2 and plain[2 + label_w - 2: 2 + label_w] == "  " and plain[2 + label_w:2 + label_w + 1] != " ":
        return 2 + label_w
    return lead + 2


def _hanging(line: Text, width: int, hang: int) -> list[Text]:
    """``line`` broken between words into lines of ``width`` cells at most, the lines after the
    first indented by ``hang`` (styles kept); a list (items joined by ' · ') between its items where
    one ends within the line; a word longer than a line is split."""
    hang = hang if width - hang >= 20 else min(2, max(0, width - 10))
    plain, out, start = line.plain, [], 0
    while True:
        room = width - (hang if out else 0)
        if len(plain) - start <= room:
            piece = line[start:]
        else:
            cut = plain.rfind(" ", start, start + room + 1) - start
            item = plain.rfind(" · ", start, start + room - 1) - start  # a list's last '·' that fits
            if item > 0:  # a list breaks between its items, never inside one ('Lube oil 1.28' / 't')
                cut = item + 2
            elif cut <= 0 or not plain[start:start + cut].strip():
                cut = room
            elif plain.startswith(" · ", start + cut):  # a list's '·' ends its line, never starts one
                before = plain.rfind(" · ", start, start + cut)
                cut = cut + 2 if cut + 2 <= room else (before - start + 2 if before > start else cut)
            piece = line[start:start + cut]
            piece.rstrip()
        out.append(Text(" " * hang).append_text(piece) if out else piece)
        start += len(piece.plain)
        while start < len(plain) and plain[start] == " ":
            start += 1
        if start >= len(plain):
            return out


_SHOWING_FAILED = (TypeError, ValueError, OverflowError, AttributeError, KeyError)
"""What formatting a stored entry can raise if the reader let a malformed value through: the entry
is then shown as damaged, never the loading screen closed (records._entry_from_line checks first)."""


def _row(e: LogEntry, back: tuple | None = None, doubtful: bool = False) -> tuple[Text, ...]:
    """The entry's cells in the log table; a damaged entry's say so; one timed earlier than the entry
    before it (``back``) has its time marked ◂; one a problem of verify names (``doubtful``: edited,
    moved, inserted, duplicated) has its number marked '!'."""
    try:
        word = vf.stored_short(e.summary)
        when = Text(f"{e.ship_time:%m-%d %H:%M}" + (" ◂" if back is not None else ""),
                    style="bold red" if back is not None else "")
        seq = Text(f"{e.seq} !", style="bold red") if doubtful else Text(str(e.seq))
        return (seq, when,
                *(Text(c) for c in (e.kind, e.by, _short(escape_breaks(e.change_text), 30), _num(e.gm_fluid_m))),
                Text(word or "—", style="bold red" if word.startswith("NOT") else ""))
    except _SHOWING_FAILED:
        return (Text(str(e.seq)), Text("—"), Text("—"), Text("—"), Text(f"line {e.line_no} damaged", style="bold red"),
                Text("—"), Text("—"))


def _details_or_damage(e: LogEntry, back: tuple | None = None, width: int | None = None) -> Text:
    try:
        return entry_details(e, back, width)
    except _SHOWING_FAILED as exc:
        return Text(f"Line {e.line_no} (entry #{e.seq}) is damaged and cannot be shown ({type(exc).__name__}); "
                    "press v to verify the log.", style="bold red")


class _EntryDetails(Static):
    """An opened entry's summary made for the width it is shown at (:func:`entry_details`): made at
    90 columns and wrapped again by the box, its verdict fell into fragments and a long row went on
    at column 1."""

    def __init__(self, entry: LogEntry, back: tuple | None = None, **kwargs):
        super().__init__(**kwargs)
        self.entry = entry
        self.back = back

    def render(self) -> Text:
        return _details_or_damage(self.entry, self.back, self.size.width or None)

    def get_content_height(self, container, viewport, width: int) -> int:
        return len(_details_or_damage(self.entry, self.back, width or None).plain.split("\n"))


class EntryScreen(ModalScreen[None]):
    """One past entry, read-only: its stored summary and the condition as it was recorded."""

    CSS_PATH = "log_screen.tcss"
    BINDINGS = [
        Binding("escape,enter", "dismiss_entry", "Close"),
    ]

    def __init__(self, entry: LogEntry, back: tuple | None = None):
        super().__init__(id="log-entry-screen")
        self.entry = entry
        self.back = back

    def compose(self) -> ComposeResult:
        with VerticalScroll(id="log-entry-box"):
            yield _EntryDetails(self.entry, self.back, id="log-entry-summary")
            cond = self.entry.condition
            if cond is not None:
                yield Static(Text("Condition as recorded (read-only)", style="bold"), classes="log-entry-head")
                yield Static(Text(cond if isinstance(cond, str) else repr(cond)), id="log-entry-condition")
        yield Footer()

    def action_dismiss_entry(self) -> None:
        self.dismiss(None)


class LogScreen(Screen["RestoreRequest | None"]):
    """The voyage log: entries newest last, filters by kind and ship's date, open, restore."""

    CSS_PATH = "log_screen.tcss"
    BINDINGS = [
        Binding("o", "open_entry", "Open"),
        Binding("r", "restore", "Restore"),
        Binding("k", "next_kind", "Kind"),
        Binding("d", "edit_dates", "Dates"),
        Binding("c", "clear_filters", "Clear"),
        Binding("v", "verify", "Verify"),
        Binding("l,escape", "back", "Back"),
    ]

    def __init__(self, logbook: Logbook, vessel: Vessel | None = None):
        super().__init__(id="log-screen")
        self.logbook = logbook
        self.vessel = vessel
        self.kind = ALL_KINDS
        self.day_from: date | None = None
        self.day_to: date | None = None
        self.shown: list[LogEntry] = []
        self._restore_asked: int | None = None
        """Entry whose restore was asked for once; a second r on it restores."""
        self._chain: tuple[tuple, object] | None = None
        """The log's verification with the state of its files it was made on (see :meth:`_chain_report`)."""
        self._back: dict = {}
        """Entries timed earlier than the entry before them (:func:`~deckload.logbook.clock_back`)."""

    # ----------------------------------------------------------------- layout

    def compose(self) -> ComposeResult:
        yield Static(id="log-title")
        with Horizontal(id="log-filters"):
            yield Static("", id="log-kind")
            yield Static("ship's date from", classes="log-filter-label")
            yield SteadyInput(placeholder="YYYY-MM-DD", id="log-from", max_length=10)
            yield Static("to", classes="log-filter-label")
            yield SteadyInput(placeholder="YYYY-MM-DD", id="log-to", max_length=10)
        with Vertical(id="log-body"):
            yield DataTable(id="log-table", cursor_type="row", zebra_stripes=True)
            yield Static(id="log-detail")
        yield Static(id="log-status")
        yield Footer()

    def on_mount(self) -> None:
        table = self.query_one("#log-table", DataTable)
        table.add_columns("#", "ship's time", "kind", "by", "change", "GM fl m", "criteria")
        self.refresh_entries()
        table.focus()

    # ----------------------------------------------------------------- data

    def refresh_entries(self) -> None:
        """Re-read the log, apply the filters, fill the table (newest entry selected)."""
        entries = self.logbook.entries()
        self.shown = select_entries(entries, self.kind, self.day_from, self.day_to)
        self._back = clock_back(entries)  # (against the entry before in the log, whatever the filters show)
        doubtful = self._chain_report().doubtful_lines
        table = self.query_one("#log-table", DataTable)
        table.clear()
        for i, e in enumerate(self.shown):
            table.add_row(*_row(e, self._back.get(e.line_no), e.line_no in doubtful), key=str(i))
        if self.shown:
            table.move_cursor(row=len(self.shown) - 1)
        mode = "read-only" if self.logbook.readonly else "writing"
        title = Text()
        title.append(f"Voyage log — {self.logbook.vessel_name}", style="bold")
        title.append(f"   {self.logbook.path.name}, {len(entries)} entries, {mode}")
        self.query_one("#log-title", Static).update(title)
        kind = "all kinds" if self.kind == ALL_KINDS else KIND_LABELS.get(self.kind, self.kind)
        self.query_one("#log-kind", Static).update(Text(f"kind: {kind}  "))
        status = Text(f"{len(self.shown)} of {len(entries)} shown")
        damaged = [n for n, _ in self.logbook.skipped_lines]
        if damaged:
            where = ", ".join(map(str, damaged[:8])) + (", …" if len(damaged) > 8 else "")
            status.append(f"; {self.logbook.path.name}: line{'s' if len(damaged) > 1 else ''} {where} damaged, "
                          "left out — press v to verify", style="bold red")
        # An edited line still reads: only the chain shows it was changed since it was written.
        rep = self._chain_report()
        if not rep.ok:
            status.append(f"; CHAIN BROKEN ({len(rep.problems)} problem(s)): the entries may not be what was "
                          "recorded — press v", style="bold red")
        self.query_one("#log-status", Static).update(status)
        self._show_detail()

    def _chain_report(self):
        """``logbook.verify()``, made again only when the log or its head record has changed on
        disk: a filter key redraws the table, and re-reading and hashing a long voyage's log for
        it would make every such key wait."""
        def state(path) -> tuple | None:
            try:
                st = os.stat(path)
            except OSError:
                return None
            return st.st_size, st.st_mtime_ns, st.st_ino

        key = (state(self.logbook.path), state(self.logbook.head_path))
        if self._chain is None or self._chain[0] != key:
            self._chain = (key, self.logbook.verify())
        return self._chain[1]

    def current(self) -> LogEntry | None:
        table = self.query_one("#log-table", DataTable)
        if not self.shown or table.cursor_row is None or not (0 <= table.cursor_row < len(self.shown)):
            return None
        return self.shown[table.cursor_row]

    def _show_detail(self) -> None:
        e = self.current()
        detail = self.query_one("#log-detail", Static)
        detail.update(_details_or_damage(e, self._back.get(e.line_no)) if e is not None
                      else Text("No entries match the filters.", style="italic"))

    @on(DataTable.RowHighlighted, "#log-table")
    def _highlighted(self, _event: DataTable.RowHighlighted) -> None:
        self._show_detail()

    # ----------------------------------------------------------------- filters

    def action_next_kind(self) -> None:
        order = (ALL_KINDS, *KINDS)
        self.kind = order[(order.index(self.kind) + 1) % len(order)]
        self.refresh_entries()

    def action_edit_dates(self) -> None:
        self.query_one("#log-from", Input).focus()

    def action_clear_filters(self) -> None:
        self.kind = ALL_KINDS
        self.day_from = self.day_to = None
        self.query_one("#log-from", Input).value = ""
        self.query_one("#log-to", Input).value = ""
        self.refresh_entries()
        self.query_one("#log-table", DataTable).focus()

    @on(Input.Submitted, "#log-from, #log-to")
    def _dates_submitted(self, event: Input.Submitted) -> None:
        try:
            day_from = parse_day(self.query_one("#log-from", Input).value)
            day_to = parse_day(self.query_one("#log-to", Input).value)
        except ValueError as exc:
            self.notify(str(exc), severity="error", markup=False)
            return
        if day_from and day_to and day_to < day_from:
            self.notify("the 'to' date is before the 'from' date", severity="error")
            return
        self.day_from, self.day_to = day_from, day_to
        self.refresh_entries()
        if event.input.id == "log-from":
            self.query_one("#log-to", Input).focus()
        else:
            self.query_one("#log-table", DataTable).focus()

    # ----------------------------------------------------------------- actions

    @on(DataTable.RowSelected, "#log-table")
    def _selected(self, _event: DataTable.RowSelected) -> None:
        self.action_open_entry()

    def action_open_entry(self) -> None:
        e = self.current()
        if e is None:
            self.notify("No entry selected.", severity="warning")
            return
        self.app.push_screen(EntryScreen(e, self._back.get(e.line_no)))

    def _vessel(self) -> Vessel | None:
        if self.vessel is not None:
            return self.vessel
        session = getattr(self.app, "session", None)
        return getattr(session, "vessel", None)

    def action_restore(self) -> None:
        e = self.current()
        if e is None:
            self.notify("No entry selected.", severity="warning")
            return
        if e.condition is None:
            self.notify(f"Entry #{e.seq} ({e.kind}) holds no loading condition.", severity="warning")
            return
        vessel = self._vessel()
        if vessel is None:
            self.notify("No vessel profile to check the condition against; nothing restored.", severity="error")
            return
        try:
            condition = condition_of(e, vessel)
        except Exception as exc:  # a stored condition that no longer fits the profile
            self.notify(f"Entry #{e.seq} cannot be restored: {exc}", severity="error", timeout=10, markup=False)
            return
        if self._restore_asked != e.seq:
            # Replacing the working condition is one key away: ask once more.
            self._restore_asked = e.seq
            self.notify(f"Press r again to make entry #{e.seq}'s condition the working condition (undoable).",
                        severity="warning")
            return
        self._restore_asked = None
        self.dismiss(
            RestoreRequest(
                condition=condition,
                entry_seq=e.seq,
                label=f"restored the condition of log entry #{e.seq} ({e.ship_time:%Y-%m-%d %H:%M} ship's time)",
                change_data={"restored_entry": e.seq, "restored_utc": e.utc.isoformat(),
                             "restored_sha256": e.sha256},
            )
        )

    def action_verify(self) -> None:
        rep = self.logbook.verify()
        if rep.ok:
            self.notify(f"Chain intact: {rep.entries} entries. Newest SHA-256 {rep.last_sha256[:16]}…", timeout=8)
        else:
            shown = "\n".join(rep.problems[:6]) + (f"\n… {len(rep.problems) - 6} more" if len(rep.problems) > 6 else "")
            self.notify(f"Log chain BROKEN:\n{shown}", severity="error", timeout=20, markup=False)

    def action_back(self) -> None:
        if isinstance(self.focused, Input):
            self.query_one("#log-table", DataTable).focus()
            return
        self.dismiss(None)
