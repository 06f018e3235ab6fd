"""The textual App: receives a finished :class:`~deckload.ui.session.Session`, shows the loading screen.

Build it with :func:`deckload.ui.launch.create_app` (tests use the same factory).
"""

from __future__ import annotations

import time
from collections import deque
from functools import partial
from typing import Callable, Iterable

from textual import events
from textual.app import App, SystemCommand
from textual.screen import Screen
from textual.widgets import Input

from deckload.ui.commands import COMMANDS
from deckload.ui.main_screen import LoadingScreen
from deckload.ui.session import Session
from deckload.ui.widgets import type_into

STUCK_CLOSE_S = 5.0
"""How long a signal's closing waits on the writer thread before a second signal may leave
without it (deckload's own choice: a healthy disk saves in well under a second, and two
signals in quick succession, as a closing terminal and a shutdown send them, must not cost
the last entry)."""


KEY_WAIT_S = 1.0
"""The longest a typed key waits for the key before it, or for a screen to focus its first field."""


def screen_ready(screen: Screen) -> bool:
    """A screen takes keys once mounted with a widget focused (or with nothing to focus); a form
    says so itself (``Form.keys_ready``)."""
    ready = getattr(screen, "keys_ready", None)
    if ready is not None:
        return bool(ready)
    return screen.is_mounted and (screen.focused is not None or not screen.focus_chain)


class _Walk:
    """One step of :meth:`DeckloadApp._follow` at ``node``.  Its steps are bound methods posted as
    ``Callback`` messages: textual counts a callback's parameters with ``inspect.signature``
    unless the function has been seen before, which a bound method's function has (a closure or
    a ``call_later`` partial made for each key is new every time: some 20 signature reads a key)."""

    __slots__ = ("app", "node", "event", "walk")

    def __init__(self, app: "DeckloadApp", node, event: events.Key, walk: int) -> None:
        self.app, self.node, self.event, self.walk = app, node, event, walk

    def start(self) -> None:
        if self.node is self.app or not _post(self.node, self.again):
            self.done()

    def done(self) -> None:
        _post(self.app, self.finish)

    def finish(self) -> None:
        self.app._key_done(self.event, self.walk)

    def again(self) -> None:
        if self.event is self.app._key_in_flight and not _post(self.node, self.step):
            self.done()

    def step(self) -> None:
        if self.event is not self.app._key_in_flight:
            return
        parent = self.node.parent
        if parent is None or parent is self.app:
            self.done()
            return
        nxt = _Walk(self.app, parent, self.event, self.walk)
        if not _post(parent, nxt.start):
            self.done()


def _post(node, fn) -> bool:
    """``node.call_later(fn)`` without the per-call ``functools.partial`` (see :class:`_Walk`)."""
    return node.post_message(events.Callback(callback=fn))


def unsaved_warning(why: str, leaving: bool = False) -> str:
    """What quitting says when the condition on screen is in no file (:attr:`Session.unsaved`)."""
    if leaving:
        return f"The condition last shown was NOT SAVED ({why}); it was lost with the screen."
    # The way out first: on a narrow message line the file's path is what gets cut.
    return f"Condition on screen NOT SAVED: quit again to leave anyway and lose it ({why})."


class DeckloadApp(App[None]):
    CSS_PATH = "deckload.tcss"
    TITLE = "deckload"

    def __init__(self, session: Session, *, notices: Iterable[str] = (),
                 after_first_frame: Callable[[], None] | None = None):
        super().__init__()
        self.session = session
        self.notices = tuple(notices)
        self._after_first_frame = after_first_frame
        self.loading_screen = LoadingScreen(session)
        self._quit_warned = None
        """The condition a quit was refused for (q again leaves; a further change warns again)."""
        self.closed_by_signal: int | None = None
        """The signal that is closing the screen (:meth:`close_on_signal`), or None."""
        self.exit_problems: list[str] = []
        """What could not be written when a signal closed the screen: printed after it has gone."""
        self._signal_scheduled = False
        self._closing_since: float | None = None
        """When the signal's closing began waiting for the writer (monotonic s), or None."""
        self._key_in_flight: events.Key | None = None
        self._key_sent_at = 0.0
        self._held_keys: deque[events.Key] = deque()
        self._release_pending = False
        self._held_watch = None
        self._key_returned = False
        self._hold_since: tuple[Screen, float] | None = None
        self._swallow_until: float | None = None

    def _print_error_renderables(self) -> None:
        """An unforeseen error is reported by the launcher in one paragraph, the details in a
        crash file (deckload.cli.boundary): never a traceback on the officer's terminal."""
        if self._exception is not None:
            self._exit_renderables.clear()
        super()._print_error_renderables()

    # ------------------------------------------------------------------ keys in typing order
    #
    # textual hands a key to the focused widget and goes on to the next key at once; the key's
    # binding (``t`` opens the transfer form) runs only when it has bubbled back to the app, and a
    # form's fields take focus only once it is mounted.  Keys typed quickly would meet the screen
    # they were not typed for, or a form with no field focused, and be lost or land in the wrong
    # field.  So the next key waits until the one before has been handled (consumed by a widget,
    # or back at the app, where its binding runs first) and until a form just opened has focused
    # its field.  Nothing waits longer than KEY_WAIT_S.

    async def on_event(self, event: events.Event) -> None:
        if isinstance(event, events.Key) and not event.is_forwarded:  # typed
            if self._swallowed(event):
                return
            if self._held_keys or self._must_hold():
                self._held_keys.append(event)
                self._watch_held()
                return
            await self._send_key(event)
            return
        await super().on_event(event)
        if event is self._key_in_flight and not self._key_returned:
            # Back at the app: its binding has run, and what the binding set off (a field's
            # Submitted, a form closing) starts again from the focused widget: follow that too.
            self._key_returned = True
            self._follow(self.focused or self.screen, event, 1)

    async def _send_key(self, event: events.Key) -> None:
        target = self.focused or self.screen  # where textual sends it
        self._key_in_flight, self._key_sent_at, self._key_returned = event, time.monotonic(), False
        await super().on_event(event)
        if not event.is_forwarded:  # taken by a priority binding (ctrl+q, ctrl+p): done already
            self._key_in_flight = None
            return
        self._follow(target, event)

    def _follow(self, node, event: events.Key, walk: int = 0) -> None:
        """Walk up the chain the key bubbles along, behind it in every queue: when this reaches
        the app, the key and what it set off along the way (a field's Submitted, the form closing
        on it) have been handled, and the next key may go.  At each widget the walk queues up
        twice: once behind the key, once behind what handling the key posted to the widget itself.
        ``walk`` 1 is the walk begun when the key came back to the app and its binding ran."""
        _Walk(self, node, event, walk).start()

    def _key_done(self, event: events.Key, walk: int) -> None:
        if event is self._key_in_flight and walk == int(self._key_returned):
            self._key_in_flight = None
            self.release_keys()

    def _must_hold(self) -> bool:
        now = time.monotonic()
        if self._key_in_flight is not None and now - self._key_sent_at > KEY_WAIT_S:
            self._key_in_flight = None  # lost with a widget removed meanwhile: never wait for ever
        if self._key_in_flight is not None:
            return True
        screen = self.screen_stack[-1] if self.screen_stack else None
        if screen is None or screen_ready(screen):
            self._hold_since = None
            return False
        if self._hold_since is None or self._hold_since[0] is not screen:
            self._hold_since = (screen, now)
        return now - self._hold_since[1] < KEY_WAIT_S

    def drop_typeahead(self) -> None:
        """A key that opens a form was refused: the keys typed for that form are dropped, not
        taken as the board's commands ('fuel received' typed after a refused ``s`` filled, undid
        and emptied tanks).  Dropped: the keys held behind it, and those that follow, each within
        KEY_WAIT_S of the one before, up to and including ⏎ or Esc (where the form would have
        ended)."""
        self._swallow_until = time.monotonic() + KEY_WAIT_S
        while self._held_keys and self._swallowed(self._held_keys[0]):
            self._held_keys.popleft()

    def _swallowed(self, event: events.Key) -> bool:
        if self._swallow_until is None:
            return False
        now = time.monotonic()
        if now > self._swallow_until:
            self._swallow_until = None
            return False
        self._swallow_until = None if event.key in ("enter", "escape") else now + KEY_WAIT_S
        return True

    def release_keys(self) -> None:
        """Send the keys held back, in order, as far as nothing holds them (called when a key has
        been handled and when a form has focused its field)."""
        if self._held_keys and not self._release_pending:
            self._release_pending = True
            self.call_later(self._release_keys)

    def _watch_held(self) -> None:
        """A check every 20 ms while keys are held, in case a key was handled where it is not seen."""
        if self._held_watch is None:
            self._held_watch = self.set_interval(0.02, self.release_keys)

    async def _release_keys(self) -> None:
        self._release_pending = False
        while self._held_keys and not self._must_hold():
            if self._type_run():
                continue
            await self._send_key(self._held_keys.popleft())
        if not self._held_keys and self._held_watch is not None:
            self._held_watch.stop()
            self._held_watch = None

    def _type_run(self) -> bool:
        """Held printable keys bound for a one-line field go in as one text (a paste the terminal
        sends as plain keys: one key at a time, each waiting for the one before, took 2000
        characters 18 s).  The field is textual's Input, which inserts a printable key at the
        cursor (over a selection) and stops it, so no binding sees it: one insertion of the run is
        what the keys one by one would make, with one Changed instead of one a key."""
        field = self.focused
        held = self._held_keys
        if not isinstance(field, Input) or len(held) < 2 or not (held[0].is_printable and held[0].character):
            return False
        chars = []
        while held and held[0].is_printable and held[0].character:
            chars.append(held.popleft().character)
        type_into(field, "".join(chars))
        return True

    def get_default_screen(self) -> Screen:
        return self.loading_screen

    async def action_quit(self) -> None:
        """Any way out (ctrl+q too) first writes changes not yet saved; a failure, or a condition
        on screen that is in no file (a save failed, or this window saves nothing), is shown, and
        asking again leaves anyway (once more after a further change)."""
        problems = self.session.flush()
        unsaved = self.session.unsaved
        if (problems or unsaved) and self._quit_warned is not self.session.condition:
            self._quit_warned = self.session.condition
            for p in problems:
                self.notify(p + " — quit again to leave anyway", severity="error", timeout=15, markup=False)
            if unsaved:
                warning = unsaved_warning(unsaved)
                self.notify(warning, severity="error", timeout=15, markup=False)
                if self.screen is self.loading_screen:
                    self.loading_screen.say(warning, ok=False)
            return
        await super().action_quit()

    # ------------------------------------------------------------------ closed by a signal

    def close_on_signal(self, signum: int) -> None:
        """SIGTERM, SIGHUP or SIGINT (``deckload.ui.launch.run_open`` installs the handler, which
        only calls this): close as ``q`` does, without asking, for nobody may be there to answer.
        Called from the signal handler on the event loop's own thread, between any two bytecodes:
        it only schedules :meth:`_close_on_signal` on the loop (or leaves it to :meth:`on_mount`
        when the loop has not started)."""
        if self.closed_by_signal is not None:
            # Already closing.  A second signal (a shutdown's SIGTERM after the terminal's SIGHUP)
            # changes nothing while the writes land; only once they have been stuck for
            # STUCK_CLOSE_S (a disk that does not answer) does it leave without them.
            since = self._closing_since
            if since is not None and time.monotonic() - since >= STUCK_CLOSE_S:
                self._leave_without_writing(signum)
            return
        self.closed_by_signal = signum
        loop = getattr(self, "_loop", None)  # textual's: set while the app runs
        if loop is not None:
            self._signal_scheduled = True
            loop.call_soon_threadsafe(self._close_on_signal)

    def _close_on_signal(self) -> None:
        """The run of edits in progress logged, every change saved and logged (the writer
        thread's queue drained), then the app exits with 128 + the signal's number; the terminal
        is restored as textual leaves, and what could not be written is printed after
        (:attr:`exit_problems`)."""
        signum = self.closed_by_signal
        self._closing_since = time.monotonic()
        try:
            problems = self.session.flush()
        except Exception as exc:  # leaving is what matters now; the reason is printed after
            problems = [f"pending changes not written: {exc}"]
        if self.session.unsaved:
            problems.append(unsaved_warning(self.session.unsaved, leaving=True))
        self.exit_problems = problems
        self.exit(return_code=128 + signum)

    def _leave_without_writing(self, signum: int) -> None:
        """Leave at once, from the signal handler, while the writer thread is stuck: the terminal
        given back, what is lost said on standard error, exit 128 + the signal's number.

        Nothing already on disk is lost: the working condition is written to a temporary file
        and renamed over the old (:mod:`deckload.io.atomicfile`), so the file holds the last
        condition saved, and a log line cut short is set aside at the next start, never dropped
        (:mod:`deckload.logbook.storage`)."""
        import os
        import sys

        pending = self.session.saves_pending
        driver = getattr(self, "_driver", None)
        try:
            if driver is not None:
                driver.stop_application_mode()
                driver.close()  # joins textual's output thread, so the restoring codes reach the terminal
        except Exception:  # leaving is what matters now; a terminal gone takes nothing more
            pass
        try:
            print(f"deckload: left without waiting for the disk (stuck for {STUCK_CLOSE_S:g} s or more after the "
                  f"first signal): {pending} change(s) shown on screen not saved or logged; the working file "
                  f"holds the last condition saved. File: {self.session.save_path}", file=sys.__stderr__, flush=True)
        except (OSError, ValueError, AttributeError):
            pass
        os._exit(128 + signum)

    def on_unmount(self) -> None:
        self.session.stop_writer()
        if self.session.journal.logbook is not None:
            self.session.journal.logbook.close()  # releases the writer's lock for the next start

    def on_mount(self) -> None:
        if self.closed_by_signal is not None and not self._signal_scheduled:  # came before the loop ran
            self.call_later(self._close_on_signal)
        if self._after_first_frame is not None:
            self.call_after_refresh(self._after_first_frame)
        for n in self.notices:
            self.notify(n, severity="warning", timeout=12, markup=False)
        if self.session.journal.writable:
            # After the first frame, not before it: the whole chain is read (0.4 s for 2000 entries
            # on the development machine), and the screen is of use while it is.  Recording goes on
            # after a broken chain, so the officer must hear of it (never silently).
            self.call_after_refresh(self._say_if_log_broken)

    def _say_if_log_broken(self) -> None:
        broken = self.session.journal.broken()
        if broken:
            self.notify(f"WARNING: {broken}", severity="warning", timeout=12, markup=False)

    def get_system_commands(self, screen: Screen) -> Iterable[SystemCommand]:
        """The command palette lists every command from the one table, with its key."""
        for c in COMMANDS:
            yield SystemCommand(c.palette_title, c.help, partial(self._run, c.action))
        # textual's own entries (Keys, Maximize, Screenshot, Theme, a second Quit) are left out:
        # every command of deckload is in the table above.

    async def _run(self, action: str) -> None:
        await self.run_action(action, self.loading_screen)

    def show_log(self) -> None:
        """Open the voyage log (the log module's screen); a restore it hands back is one undoable change."""
        from deckload.ui.log_screen import LogScreen

        j = self.session.journal
        if j.logbook is None:
            self.notify(f"No voyage log open: {j.problem or 'unknown reason'}", severity="error", markup=False)
            return

        def restored(req) -> None:
            if req is not None:
                self.loading_screen.replace_condition(req.condition, req.label, "restore", req.change_data,
                                                      "Not restored")

        self.push_screen(LogScreen(j.logbook, self.session.vessel), callback=restored)
