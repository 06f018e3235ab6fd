"""Conditions as documents on the loading screen: name and save, open, print.

The forms here return values (``dismiss``); the loading screen does the change.
Files are found through :mod:`deckload.io.condition_files`; reports are written by
:mod:`deckload.report.print_screen`.
"""

from __future__ import annotations

from pathlib import Path
from typing import Callable

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical
from textual.widgets import Input, Label, OptionList, Static
from textual.widgets.option_list import Option

from deckload.io.condition_files import MAX_NAME_CHARS, WORKING_KEYS, Named, name_key
from deckload.io.textsafe import control_char
from deckload.ui.dialogs import Form
from deckload.ui.entry import EntryError
from deckload.ui.palette import P
from deckload.ui.widgets import SteadyInput


def check_name(text: str, stock_titles: set[str]) -> str:
    """A condition name of the officer's own: printable, 1–80 characters, not a stock one's."""
    name = " ".join(text.split())
    if not name:
        raise EntryError("Type a name for the condition, e.g. Sailing 2 Dec.")
    if len(name) > MAX_NAME_CHARS:
        raise EntryError(f"At most {MAX_NAME_CHARS} characters ({len(name)} typed).")
    if control_char(name) is not None:
        raise EntryError("Type plain text (no control characters).")
    if name_key(name) in {name_key(t) for t in stock_titles}:  # (the key is casefolded: it covers case too)
        raise EntryError(f"\u201c{name}\u201d is a stock condition of the vessel: choose a name of your own "
                         "(the stock file is never overwritten).")
    if name.casefold() in WORKING_KEYS:
        # the command line's name for the screen's working condition: a saved one would never be found by it
        raise EntryError(f"\u201c{name}\u201d names the working condition on the command line: choose another name.")
    return name


class SaveAsForm(Form):
    """The name to save the working condition under; a name already saved asks for a second ⏎."""

    def __init__(self, initial: str, folder: Path, stock_titles: set[str]):
        super().__init__()
        self._initial, self._folder, self._stock = initial, folder, stock_titles
        self._confirm: Path | None = None

    def compose(self) -> ComposeResult:
        with Vertical(classes="form"):
            yield Label("Save the working condition under a name", classes="form-title")
            yield Label(f"A new condition file in {self._folder} · ⏎ saves · Esc cancels", classes="form-hint")
            yield SteadyInput(value=self._initial, id="prompt-input", select_on_focus=True)
            yield Static("", id="form-message")

    def on_input_changed(self, event: Input.Changed) -> None:
        self._confirm = None

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        try:
            name = check_name(event.value, self._stock)
        except EntryError as exc:
            self.refuse(str(exc))
            return
        path = self._folder / f"{name_key(name)}.condition.toml"
        if path.exists() and self._confirm != path:
            self._confirm = path
            self.refuse(f"{path.name} already holds a saved condition: ⏎ again replaces it, or change the name.")
            return
        self.dismiss((name, path))


class OpenConditionScreen(Form):
    """Pick a stock, saved or working condition; ⏎ opens it as the working condition."""

    BINDINGS = [Binding("escape", "cancel", "Cancel")]

    def __init__(self, found: list[Named]):
        super().__init__()
        self._found = found

    def compose(self) -> ComposeResult:
        with Vertical(classes="form"):
            yield Label("Open a condition", classes="form-title")
            yield Label("↑ ↓ choose · ⏎ opens it as the working condition (undo returns) · Esc cancels",
                        classes="form-hint")
            yield OptionList(*(Option(Text.assemble((f"{n.origin:<6} ", P["dim"]), n.title), id=str(i))
                               for i, n in enumerate(self._found)), id="open-list")
            yield Static("", id="form-message")

    def on_option_list_option_selected(self, event: OptionList.OptionSelected) -> None:
        event.stop()
        self.dismiss(self._found[int(event.option.id)])


class ReportWritten(Form):
    """Where the report of the screen was written; ⏎ opens the HTML page, Esc closes."""

    BINDINGS = [Binding("escape,q", "cancel", "Close"), Binding("enter,o", "open", "Open")]

    def __init__(self, html_path: Path, text_path: Path, opener: Callable[[Path], str | None]):
        super().__init__()
        self._html, self._text, self._opener = html_path, text_path, opener

    def compose(self) -> ComposeResult:
        with Vertical(classes="form"):
            yield Label("Report of the screen written", classes="form-title")
            yield Static(Text(f"{self._html}\n{self._text}", P["value"]))
            yield Label("⏎ or o opens the HTML page to print · Esc closes", classes="form-hint")
            yield Static("", id="form-message")

    def action_open(self) -> None:
        problem = self._opener(self._html)
        if problem:
            self.refuse(problem)
            return
        self.dismiss(True)


def open_in_browser(path: Path) -> str | None:
    """Hand the page to the system's browser; the problem as text when there is none."""
    import webbrowser

    try:
        ok = webbrowser.open(path.resolve().as_uri())
    except Exception as exc:  # no browser on a headless PC: say so, the file is written
        return f"No browser could be started ({exc}): open {path} by hand."
    return None if ok else f"No browser found: open {path} by hand."


def save_target(session) -> tuple[Path | None, set[str]]:
    """The folder a name is saved in and the stock conditions' titles and short names (which it may
    not take: the command line finds a stock condition first by either)."""
    from deckload.io import paths
    from deckload.io.condition_files import stock

    if session.work_dir is None or session.save_path is None:
        return None, set()
    found = stock(session.profile_path) if session.profile_path is not None else []
    titles = {n.title for n in found} | {n.key for n in found}
    return paths.saved_conditions_dir(session.work_dir, session.vessel.particulars.name), titles


def known_conditions(session) -> list[Named]:
    """Stock conditions beside the profile and the ones saved under a name (not the working one:
    it is on the screen)."""
    from deckload.io import paths
    from deckload.io.condition_files import saved, stock

    found = stock(session.profile_path) if session.profile_path is not None else []
    if session.work_dir is not None:
        found += saved(paths.saved_conditions_dir(session.work_dir, session.vessel.particulars.name))
    return found


def print_session(session):
    """Write the report of the screen's condition and result; EntryError when there is nothing
    current to print (a condition outside the tables has no result of its own)."""
    from deckload.report.print_screen import print_result

    if session.result is None or session.stale:
        raise EntryError("the condition on screen is outside the tables: it has no result to print.")
    if session.reports_dir is None:
        raise EntryError("no reports folder (no log folder for this window).")
    session.flush()  # the log's newest entry is the one the paper copy names
    book = session.journal.logbook
    newest = book.newest if book is not None else None
    anchor = f" · voyage log at entry #{newest[0]}, SHA-256 {newest[1][:16]}" if newest else ""
    source = (session.save_path.name if session.save_path else "none") + " (the loading screen's working condition)"
    return print_result(session.result, session.vessel, session.condition, session.reports_dir,
                        source=source, log_anchor=anchor, doubts=session.profile_doubts)


class PlanEndForm(Form):
    """End a plan: ⏎ applies it (one log entry), d discards it (back to before), Esc keeps trying."""

    BINDINGS = [Binding("escape", "cancel", "Keep planning"), Binding("enter,a", "apply", "Apply"),
                Binding("d", "discard", "Discard")]

    def __init__(self, steps: int):
        super().__init__()
        self._steps = steps

    def compose(self) -> ComposeResult:
        with Vertical(classes="form"):
            yield Label(f"End the plan ({self._steps} change{'s' if self._steps != 1 else ''})", classes="form-title")
            yield Label("⏎ applies it: one log entry naming every change · d discards it: back to the condition "
                        "before the plan, nothing logged · Esc keeps planning", classes="form-hint")
            yield Static("", id="form-message")

    def action_apply(self) -> None:
        self.dismiss("apply")

    def action_discard(self) -> None:
        self.dismiss("discard")
