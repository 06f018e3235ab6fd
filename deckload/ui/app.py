"""The textual App: receives a finished :class:`~deckload.ui.session.Session`, shows the loading screen.

Build it with :func:`deckload.ui.launch.create_app` (tests use the same factory).
"""

from __future__ import annotations

from functools import partial
from typing import Iterable

from textual.app import App, SystemCommand
from textual.screen import Screen

from deckload.ui.commands import COMMANDS
from deckload.ui.main_screen import LoadingScreen
from deckload.ui.session import Session


class DeckloadApp(App[None]):
    CSS_PATH = "deckload.tcss"
    TITLE = "deckload"

    def __init__(self, session: Session, *, notices: Iterable[str] = ()):
        super().__init__()
        self.session = session
        self.notices = tuple(notices)
        self.loading_screen = LoadingScreen(session)
        self._quit_warned = False

    def _print_error_renderables(self) -> None:
        """An unforeseen error is reported by the launcher in one paragraph, the details in a
        crash file (deckload.cli.boundary): never a traceback on the officer's terminal."""
        if self._exception is not None:
            self._exit_renderables.clear()
        super()._print_error_renderables()

    def get_default_screen(self) -> Screen:
        return self.loading_screen

    async def action_quit(self) -> None:
        """Any way out (ctrl+q too) first writes changes not yet saved; a failure is shown, and
        asking again leaves anyway."""
        problems = self.session.flush()
        if problems and not self._quit_warned:
            self._quit_warned = True
            for p in problems:
                self.notify(p + " — quit again to leave anyway", severity="error", timeout=15, markup=False)
            return
        await super().action_quit()

    def on_unmount(self) -> None:
        self.session.flush()
        if self.session.journal.logbook is not None:
            self.session.journal.logbook.close()  # releases the writer's lock for the next start

    def on_mount(self) -> None:
        for n in self.notices:
            self.notify(n, severity="warning", timeout=12, markup=False)

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
                self.loading_screen.commit(req.condition, req.label, "restore", req.change_data)

        self.push_screen(LogScreen(j.logbook, self.session.vessel), callback=restored)
