"""`deckload` / `deckload open PROFILE [CONDITION]`: read the files, build the app, run it.

All file reading happens here; :func:`create_app` takes finished objects and is
the one factory the tests use too.
"""

from __future__ import annotations

import sys
from pathlib import Path

from deckload.core.model import Condition, Vessel


def load_inputs(profile_path: Path | None, condition_path: Path | None, work_dir: Path) -> tuple[Vessel, Condition, list[str]]:
    """The vessel and the condition to start from, with notices for the user.

    Start-up order: the CONDITION argument if given; else the vessel's saved
    working condition; else (a packaged demo vessel) its departure condition, or an empty
    condition.  An unreadable working file is set aside, never overwritten.  A profile that
    fails its plausibility audit raises :class:`deckload.audit_report.AuditError`.
    """
    from deckload import paths
    from deckload.profiles import ProfileError, load_condition, load_profile
    from deckload.ui.session import working_path

    from deckload.audit_report import audit_or_refuse

    notices: list[str] = []
    vessel = load_profile(profile_path or paths.DEMO_PROFILE)
    # The plausibility audit before anything is shown: a contradiction refuses the profile
    # (AuditError, a ProfileError), a doubt becomes a notice.
    doubt = audit_or_refuse(profile_path or paths.DEMO_PROFILE, vessel)
    if doubt:
        notices.append(doubt)
    saved = working_path(work_dir, vessel)
    if condition_path is not None:
        condition = load_condition(condition_path, vessel)
        if saved.is_file():
            # The named condition becomes the working one; the old working file is kept.
            aside = _free_name(saved, ".previous")
            saved.replace(aside)
            notices.append(f"The previous working condition was kept as {aside}.")
        return vessel, condition, notices
    if saved.is_file():
        try:
            return vessel, load_condition(saved, vessel), notices
        except ProfileError as exc:
            aside = _free_name(saved, ".unreadable")
            saved.replace(aside)
            notices.append(f"Saved working condition could not be read and was moved to {aside}: {exc}")
    start = paths.demo_start_condition(profile_path)
    if start is not None:  # a packaged demo vessel opens on its departure condition
        return vessel, load_condition(start, vessel), notices
    return vessel, Condition(name="Working condition"), notices


def _free_name(path: Path, suffix: str) -> Path:
    """``path`` + ``suffix``, or + ``suffix.2``, ``.3`` … : a name that holds nothing yet."""
    candidate = path.with_name(path.name + suffix)
    n = 1
    while candidate.exists():
        n += 1
        candidate = path.with_name(f"{path.name}{suffix}.{n}")
    return candidate


def create_app(
    vessel: Vessel, condition: Condition, *, work_dir: Path | None, log_dir: Path | None,
    notices=(), officer: str = "",
):
    """The app over a finished vessel and condition; saves to ``work_dir``, logs to ``log_dir``.

    ``officer``: initials of the officer of the watch, if known (else signed on with key o).
    """
    from deckload.ui.app import DeckloadApp
    from deckload.ui.session import Session, working_path

    journal = open_journal(log_dir, vessel.particulars.name)
    journal.officer = officer
    save_path = working_path(work_dir, vessel) if work_dir is not None else None
    extra = [n for n in (journal.problem, journal.notice) if n]
    if journal.logbook is not None and journal.logbook.readonly and save_path is not None:
        # Another deckload holds this vessel's log: it also owns the working condition,
        # so this window must not overwrite it.
        save_path = None
        extra.append("This window does not save the working condition: another deckload has this vessel open.")
    session = Session(vessel, condition, save_path=save_path, journal=journal)
    return DeckloadApp(session, notices=[*notices, *extra])


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
    return journal


def run_open(profile_path: Path | None, condition_path: Path | None) -> int:
    from deckload import paths
    from deckload.profiles import ProfileError

    work_dir = paths.working_dir()
    try:
        vessel, condition, notices = load_inputs(profile_path, condition_path, work_dir)
    except (ProfileError, OSError) as exc:
        print(f"deckload: {exc}", file=sys.stderr)
        return 2
    app = create_app(vessel, condition, work_dir=work_dir, log_dir=paths.log_dir(), notices=notices)
    app.run()
    return app.return_code or 0
