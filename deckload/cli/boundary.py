"""The error boundary of every entry point: no traceback ever reaches the officer.

Bad input is refused where it is read, with a message naming the file and key.  Anything
that still escapes (a bug in deckload, or a failure nobody foresaw) is caught here, once per
entry point (each command, the loading screen, the log): the officer reads one paragraph
naming the files involved and what to do, the details go to a crash file in the data folder
(``deckload.io.paths.data_home() / "crashes"``), and the exit status is :data:`INTERNAL_ERROR`.

Exit statuses of every ``deckload`` command (README "Exit status"):

* 0 — done (a condition was computed, whether or not its criteria are met);
* 1 — bad input: a file or value refused, a log that fails verification or is held;
* 2 — a file or folder that cannot be read or written, or a command line not understood;
* 3 — internal error (:data:`INTERNAL_ERROR`): a bug; the crash file has the details;
* 128 + the signal's number — stopped by a signal: 130 interrupted (SIGINT, Ctrl+C on the command
  line), 129 the terminal closed (SIGHUP), 143 told to stop (SIGTERM); the loading screen closes on
  each as on ``q`` (``deckload.ui.launch.closing_on_signals``).
"""

from __future__ import annotations

import os
import sys
import traceback
from pathlib import Path

INTERNAL_ERROR = 3


def crash_folder() -> Path:
    from deckload.io.paths import data_home

    return data_home() / "crashes"


def write_crash_file(exc: BaseException, context: str) -> Path | None:
    """Write the traceback and the context to a new crash file; its path, or None if it cannot be written."""
    from deckload.io.atomicfile import write_atomic
    from deckload.logbook import format_utc, utc_now

    folder = crash_folder()
    stamp = format_utc(utc_now()).replace(":", "").replace("-", "").replace(".", "")
    text = (f"deckload internal error at {format_utc(utc_now())} (pid {os.getpid()})\n{context}\n\n"
            + "".join(traceback.format_exception(type(exc), exc, exc.__traceback__)))
    try:
        folder.mkdir(parents=True, exist_ok=True)
        path = folder / f"crash-{stamp}-{os.getpid()}.txt"
        write_atomic(path, text)
        return path
    except Exception:
        return None


def internal_error(exc: BaseException, what: str, files: list[str]) -> int:
    """Tell the officer, in one paragraph, that deckload failed and what to do; return :data:`INTERNAL_ERROR`."""
    named = ", ".join(str(f) for f in files if f) or "no file"
    crash = write_crash_file(exc, f"while {what}; files: {named}; argv: {sys.argv!r}")
    where = f"The details are in {crash}." if crash is not None else "The details could not be saved."
    print(
        f"deckload: internal error while {what} ({named}): {type(exc).__name__}. This is a fault in deckload, not in your files: check the result "
        f"against the stability booklet by hand, and report it with the files named and the crash file. "
        f"{where}",
        file=sys.stderr,
    )
    if os.environ.get("DECKLOAD_DEBUG"):
        traceback.print_exception(type(exc), exc, exc.__traceback__)
    return INTERNAL_ERROR
