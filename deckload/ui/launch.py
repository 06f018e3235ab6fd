"""`deckload` / `deckload open PROFILE [CONDITION]`: read the files, build the app, run it.

All file reading happens here; :func:`create_app` takes finished objects and is
the one factory the tests use too.
"""

from __future__ import annotations

import sys
import time
from contextlib import contextmanager
from pathlib import Path
from typing import TYPE_CHECKING, Callable, NamedTuple

from deckload.core.model import Condition, Vessel

if TYPE_CHECKING:
    from deckload.core.result import Result


class Start(NamedTuple):
    """What the screen starts from: the vessel, the condition, notices for the user, and the
    condition's result if start-up already evaluated it (so the screen need not evaluate it a
    second time; ``None`` when it did not, or when the condition lies outside the tables)."""

    vessel: Vessel
    condition: Condition
    notices: list[str]
    result: Result | None
    doubts: tuple[str, ...] = ()
    """The profile's plausibility-audit warnings, one line each (printed reports carry them)."""


def load_inputs(profile_path: Path | None, condition_path: Path | None, work_dir: Path) -> Start:
    """The vessel and the condition to start from, with notices for the user.

    Start-up order: the CONDITION argument if given; else the vessel's saved
    working condition; else (a packaged demo vessel) its departure condition, or an empty
    condition.  A condition counts as read only when it parses, fits the vessel and
    the calculation accepts it (a displacement outside the tables is accepted: the
    screen shows why).  An unusable working file is set aside with a notice, never
    overwritten; the good working file is set aside for a named condition only after
    that condition has been read successfully.  A profile that fails its plausibility
    audit raises :class:`deckload.report.audit_findings.AuditError`.
    """
    from deckload.io import paths
    from deckload.io.profiles import ProfileError, load_condition
    from deckload.ui.session import working_path

    from deckload.report.audit_findings import doubt_lines, load_audited, refuse_or_notice

    notices: list[str] = []
    profile = load_audited(profile_path or paths.DEMO_PROFILE)  # from the profile cache when unchanged
    vessel = profile.vessel
    # The plausibility audit before anything is shown: a contradiction refuses the profile
    # (AuditError, a ProfileError), a doubt becomes a notice.
    doubt = refuse_or_notice(profile_path or paths.DEMO_PROFILE, profile.found)
    if doubt:
        notices.append(doubt)
    doubts = doubt_lines(profile.found)
    saved = working_path(work_dir, vessel)
    notices += _tidy_working_folder(work_dir, saved, vessel)
    if condition_path is not None:
        condition = load_condition(condition_path, vessel)
        result = _usable(vessel, condition, condition_path)
        if saved.is_file():
            # The named condition becomes the working one; the old working file is kept.
            aside = paths.free_name(saved, ".previous")
            saved.replace(aside)
            notices.append(f"The previous working condition was kept as {aside}.")
        return Start(vessel, condition, notices, result, doubts)
    if saved.is_file():
        try:
            condition = load_condition(saved, vessel)
            return Start(vessel, condition, notices, _usable(vessel, condition, saved), doubts)
        except (ProfileError, OSError) as exc:
            aside = paths.free_name(saved, ".unreadable")
            saved.replace(aside)
            notices.append(f"Saved working condition could not be read and was moved to {aside}: {exc}")
    start = paths.demo_start_condition(profile_path)
    if start is not None:  # a packaged demo vessel opens on its departure condition
        return Start(vessel, load_condition(start, vessel), notices, None, doubts)
    return Start(vessel, Condition(name="Working condition"), notices, None, doubts)


def _usable(vessel: Vessel, condition: Condition, path: Path) -> Result | None:
    """The condition's result if the calculation accepts it; ``None`` if it lies outside the
    tables (accepted: the screen shows why); else :class:`ProfileError` naming the file and why."""
    from deckload.core.stability import evaluate
    from deckload.core.tables import OutOfRangeError
    from deckload.io.profiles import Problem, ProfileError

    try:
        return evaluate(vessel, condition)
    except OutOfRangeError:
        return None
    except ValueError as exc:
        raise ProfileError([Problem(str(path), None, "", None, f"cannot be computed: {exc}")]) from None


STALE_TEMP_S = 600.0
"""A save's temporary file untouched this long (s, by its modification time) has no live writer:
a condition (at most :data:`deckload.io.limits.MAX_TOML_BYTES`) is written, fsync'ed and renamed
in well under a second, each write moving the time on; only a disk that has stopped answering
holds one longer, and that save fails by itself.  Ten minutes is far beyond both (deckload's own
choice)."""


def _tidy_working_folder(work_dir: Path, saved: Path, vessel: Vessel) -> list[str]:
    """Clean up after earlier versions and interrupted saves; the notices to show.

    * A working file under the name earlier versions used (which some vessels shared) is
      moved to this vessel's own name, if it holds a condition that fits this vessel.
    * Temporary files of an interrupted save (a kill or power cut between writing and
      renaming) are removed; one of this vessel's working file that holds a complete
      condition is kept beside it, so an edit confirmed just before is not lost unseen.
      Only those last modified :data:`STALE_TEMP_S` or more ago are touched: the folder is
      shared by every vessel and every window, and a younger one may be another window's save
      in progress (removing it made that save fail).  A younger one is left for a later start.
    """
    from deckload.io import paths
    from deckload.io.atomicfile import leftover_temp_files
    from deckload.io.profiles import ProfileError, load_condition

    notices: list[str] = []
    if not work_dir.is_dir():
        return notices
    legacy = paths.legacy_working_file(work_dir, vessel.particulars.name)
    if legacy != saved and legacy.is_file() and not saved.exists():
        try:
            load_condition(legacy, vessel)
        except (ProfileError, OSError):
            pass  # another vessel's, or unreadable: left where it is
        else:
            legacy.replace(saved)
            notices.append(f"Working condition moved from {legacy.name} to {saved.name} (one file per vessel).")
    now = time.time()
    for tmp in leftover_temp_files(work_dir):
        try:
            age_s = now - tmp.stat().st_mtime
        except OSError:
            continue  # gone already: its save finished
        if age_s < STALE_TEMP_S:
            continue
        if tmp.name.startswith(f".{saved.name}."):
            try:
                load_condition(tmp, vessel)
            except (ProfileError, OSError):
                tmp.unlink(missing_ok=True)
                continue
            aside = paths.free_name(saved, ".interrupted")
            tmp.replace(aside)
            notices.append(f"A save was interrupted before it finished; its copy was kept as {aside}. The "
                           "condition shown is the last one saved completely: compare them.")
        else:
            tmp.unlink(missing_ok=True)
    return notices


def create_app(
    vessel: Vessel, condition: Condition, *, work_dir: Path | None, log_dir: Path | None,
    notices=(), officer: str = "", profile_path: Path | None = None, result: Result | None = None,
    after_first_frame: Callable[[], None] | None = None, doubts: tuple[str, ...] = (),
):
    """The app over a finished vessel and condition; saves to ``work_dir``, logs to ``log_dir``.

    ``officer``: initials of the officer of the watch, if known (else signed on with key o).
    ``result``: ``evaluate(vessel, condition)`` if the caller already has it (start-up's check,
    :attr:`Start.result`), so the screen does not evaluate the same condition twice.
    ``after_first_frame``: called once the screen's first frame is drawn (start-up is over).
    ``doubts``: the profile's plausibility-audit warnings (:attr:`Start.doubts`), which reports
    printed from the screen carry.
    """
    from deckload.ui.app import DeckloadApp
    from deckload.ui.session import Session, working_path

    journal = open_journal(log_dir, vessel.particulars.name)
    journal.officer = officer
    save_path = working_path(work_dir, vessel) if work_dir is not None else None
    extra = [n for n in (journal.problem, journal.notice) if n]
    not_saving = None
    if journal.logbook is not None and journal.logbook.readonly and save_path is not None:
        # Another deckload holds this vessel's log: it also owns the working condition,
        # so this window must not overwrite it.  The title line says so for as long as it is open.
        not_saving = f"this window saves nothing: another deckload has this vessel open and keeps {save_path}"
        save_path = None
        extra.append("This window does not save the working condition: another deckload has this vessel open. "
                     "Its title line reads NOT SAVING; what is changed here is lost when it closes.")
    session = Session(vessel, condition, save_path=save_path, journal=journal, result=result)
    session.not_saving = not_saving
    from deckload.io import paths

    session.profile_path = profile_path
    session.work_dir = work_dir
    session.reports_dir = paths.reports_dir(log_dir) if log_dir is not None else None
    session.profile_doubts = tuple(doubts)
    return DeckloadApp(session, notices=[*notices, *extra], after_first_frame=after_first_frame)


def open_journal(log_dir: Path | None, vessel_name: str):
    from deckload.ui.session import Journal

    if log_dir is None:
        return Journal(None, "no log folder")
    try:
        from deckload.logbook import Logbook

        book = Logbook.open(log_dir, vessel_name)
    except Exception as exc:  # a broken log must not stop the loading screen
        return Journal(None, f"voyage log not available: {exc}")
    problem = f"voyage log read-only: {book.readonly_reason}" if book.readonly else None
    journal = Journal(book, problem)
    if book.recovered_torn is not None:
        # A power cut left half a line at the end of the log: it was set aside, never dropped.
        journal.notice = f"voyage log recovered after an interrupted write: {book.recovered_torn}"
    elif book.restored_line_end is not None:
        journal.notice = f"voyage log repaired: {book.restored_note}"
    return journal


def run_open(profile_path: Path | None, condition_path: Path | None,
             after_first_frame: Callable[[], None] | None = None) -> int:
    """Read the files, build the app and run it; ``after_first_frame`` as for :func:`create_app`."""
    import signal

    from deckload.io import paths
    from deckload.io.profiles import ProfileError

    missing = no_terminal()
    if missing:
        # Before anything is read or moved aside: the screen cannot be used, and would draw for ever.
        print(f"deckload: the loading screen needs a terminal: its {missing} is not one (a pipe, a file or "
              "/dev/null). Without a terminal, compute a condition with deckload calc PROFILE CONDITION, or "
              "print it with deckload report PROFILE CONDITION --txt.", file=sys.stderr)
        return 2
    work_dir = paths.working_dir()
    try:
        start = load_inputs(profile_path, condition_path, work_dir)
    except ProfileError as exc:
        print(f"deckload: {exc}", file=sys.stderr)
        return 2
    except OSError as exc:
        what = "profile" if profile_path is not None and str(exc.filename) == str(profile_path) else "file"
        hint = " (give a profile file's path, or demo for the demo vessel)" if what == "profile" else ""
        print(f"deckload: cannot read the {what} {exc.filename or ''}: {exc.strerror or exc}{hint}", file=sys.stderr)
        return 2
    app = create_app(start.vessel, start.condition, work_dir=work_dir, log_dir=paths.log_dir(),
                     notices=start.notices, profile_path=profile_path or paths.DEMO_PROFILE,
                     result=start.result, after_first_frame=after_first_frame, doubts=start.doubts)
    with closing_on_signals(app):
        app.run()
    for problem in app.exit_problems:  # a signal closed the screen: what it could not write
        try:
            print(f"deckload: {problem}", file=sys.stderr, flush=True)
        except OSError:
            break  # the terminal has gone (SIGHUP): nobody left to tell
    if app.closed_by_signal is not None and app.closed_by_signal == getattr(signal, "SIGHUP", None):
        _terminal_gone()
    if getattr(app, "_exception", None) is not None:
        # The screen stopped on an error nobody foresaw: the boundary's message and crash file.
        from deckload.cli.boundary import internal_error

        return internal_error(app._exception, "running the loading screen",
                              [str(profile_path or paths.DEMO_PROFILE), str(app.session.save_path or "")])
    return app.return_code or 0


CLOSING_SIGNALS = ("SIGTERM", "SIGHUP", "SIGINT")
"""Signals that close the loading screen as ``q`` does, exiting with 128 + their number: SIGTERM
(a shutdown, ``kill``), SIGHUP (the terminal closed), SIGINT (``kill -INT``; ctrl+c is a key on
the screen).  Their default action would end the process with a run of edits held back from the
log (``main_screen.RUN_PAUSE_S``), changes still queued for the writer thread, and the terminal
left in the screen's modes."""


@contextmanager
def closing_on_signals(app):
    """While the screen runs, each of :data:`CLOSING_SIGNALS` calls ``app.close_on_signal``; the
    handlers before are put back after.  Python runs the handler on the main thread (the event
    loop's), and the app only schedules its closing there."""
    import signal

    before = {}
    for name in CLOSING_SIGNALS:
        number = getattr(signal, name, None)
        if number is not None:
            before[number] = signal.signal(number, lambda signum, frame: app.close_on_signal(signum))
    try:
        yield
    finally:
        for number, handler in before.items():
            signal.signal(number, handler)


def no_terminal() -> str | None:
    """The standard stream that is not a terminal (a pipe, a file, /dev/null), or None.  The
    screen reads keys from standard input and draws on standard error (textual's driver), and
    standard output is the officer's terminal too: with any of them elsewhere the screen would
    draw into a file or pipe for ever, or wait for keys nobody can type."""
    import os

    for name, stream in (("standard input", sys.__stdin__), ("standard output", sys.__stdout__),
                         ("standard error", sys.__stderr__)):
        try:
            ok = stream is not None and os.isatty(stream.fileno())
        except (OSError, ValueError):
            ok = False
        if not ok:
            return name
    return None


def _terminal_gone() -> None:
    """After SIGHUP the terminal may have gone: what is still buffered for it, flushed at exit,
    would fail (EIO) and turn the exit status into Python's 120.  Standard output and error go to
    /dev/null instead (anything for the officer has been written already, or could not be)."""
    import os

    for stream in (sys.stdout, sys.stderr):
        try:
            stream.flush()
        except (OSError, ValueError):
            pass
    try:
        null = os.open(os.devnull, os.O_WRONLY)
    except OSError:
        return
    for fd in (1, 2):
        try:
            os.dup2(null, fd)
        except OSError:
            pass
    os.close(null)
