"""`deckload open` as a process on a real terminal (a pseudo-terminal from the `pty` module):
closed by a signal, and refused where there is no terminal.

The screen holds a run of nudges or retypes back from the log for ``RUN_PAUSE_S`` (4 s), and
hands its saves to a writer thread: a signal's default action would end the process with the
run's entry never written and the terminal left in the screen's modes.  SIGTERM, SIGHUP and
SIGINT close it as ``q`` does, exiting with 128 + the signal's number (README, "Exit status").

Every process here runs under a deadline and is killed (its whole session) when the test ends,
so a screen that does not close fails the test instead of hanging the suite.
"""

from __future__ import annotations

import fcntl
import json
import os
import re
import select
import signal
import struct
import subprocess
import sys
import termios
import time
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
DEADLINE_S = 20.0
"""The longest any one step waits (the screen's start on a busy machine takes 1–3 s)."""

# The child makes the pseudo-terminal its controlling terminal (a session of its own), as a
# terminal window does, so that closing the terminal's side sends it SIGHUP.
_AS_TERMINAL = ("import fcntl, os, sys, termios; os.setsid(); fcntl.ioctl(0, termios.TIOCSCTTY, 0); "
                "os.execv(sys.executable, [sys.executable, '-m', 'deckload', *sys.argv[1:]])")


def _env(tmp_path: Path) -> dict[str, str]:
    return {**os.environ, "PYTHONPATH": str(ROOT), "DECKLOAD_HOME": str(tmp_path / "home"),
            "DECKLOAD_LOG_DIR": str(tmp_path / "logs"), "TERM": "xterm-256color", "LANG": "C.UTF-8"}


# As _AS_TERMINAL, with a disk that stops answering: once the file STUCK exists in the working
# folder, every atomic write (the working condition's save) waits for ever, as on a disk that
# hangs; and a second signal may leave after 0.5 s of that instead of deckload's 5 s.
_AS_TERMINAL_STUCK_DISK = """
import fcntl, os, sys, termios, threading
os.setsid(); fcntl.ioctl(0, termios.TIOCSCTTY, 0)
import deckload.io.atomicfile as atomic, deckload.ui.app as app
app.STUCK_CLOSE_S = 0.5
real = atomic.write_atomic
def hanging(path, data):
    if os.path.exists("STUCK"):
        threading.Event().wait()
    real(path, data)
atomic.write_atomic = hanging
from deckload.cli.main import main
sys.exit(main(sys.argv[1:]))
"""


class Terminal:
    """``deckload open`` on a 100×30 pseudo-terminal; what it draws is kept in :attr:`out`."""

    def __init__(self, tmp_path: Path, script: str = _AS_TERMINAL):
        self.master, slave = os.openpty()
        fcntl.ioctl(slave, termios.TIOCSWINSZ, struct.pack("HHHH", 30, 100, 0, 0))
        self.proc = subprocess.Popen([sys.executable, "-c", script, "open"], stdin=slave, stdout=slave,
                                     stderr=slave, cwd=tmp_path, env=_env(tmp_path), close_fds=True)
        os.close(slave)
        self.out = bytearray()

    def read(self, seconds: float) -> None:
        end = time.monotonic() + seconds
        while self.master >= 0 and (left := end - time.monotonic()) > 0:
            ready, _, _ = select.select([self.master], [], [], left)
            if not ready:
                continue
            try:
                data = os.read(self.master, 65536)
            except OSError:  # the screen's side is closed: it has gone
                return
            if not data:
                return
            self.out += data

    def until(self, done, what: str) -> None:
        end = time.monotonic() + DEADLINE_S
        while not done():
            assert time.monotonic() < end, f"no {what} after {DEADLINE_S} s; the screen showed: {bytes(self.out[-500:])!r}"
            assert self.proc.poll() is None, f"deckload ended ({self.proc.returncode}) before {what}: {bytes(self.out[-800:])!r}"
            self.read(0.05)

    def send(self, keys: str) -> None:
        os.write(self.master, keys.encode())

    def exit_status(self) -> int:
        end = time.monotonic() + DEADLINE_S
        while self.proc.poll() is None and time.monotonic() < end:
            self.read(0.05)
        self.read(0.1)
        assert self.proc.poll() is not None, f"deckload still running {DEADLINE_S} s after the signal"
        return self.proc.returncode

    def close(self) -> None:
        if self.proc.poll() is None:
            try:
                os.killpg(self.proc.pid, signal.SIGKILL)
            except ProcessLookupError:
                pass
            self.proc.wait(5)
        if self.master >= 0:
            os.close(self.master)
            self.master = -1


@pytest.fixture
def terminal(tmp_path):
    t = Terminal(tmp_path)
    yield t
    t.close()


def _log_entries(tmp_path: Path) -> list[dict]:
    log = tmp_path / "logs" / "demo-islander.log.jsonl"
    if not log.is_file():
        return []
    return [json.loads(line) for line in log.read_text(encoding="utf-8").splitlines() if line.strip()]


def _working_text(tmp_path: Path) -> str:
    found = list((tmp_path / "logs" / "working").glob("demo-islander-*.condition.toml"))
    return found[0].read_text(encoding="utf-8") if found else ""


def _nudge_then(terminal: Terminal, tmp_path: Path) -> None:
    """Sign on as AB, nudge DB1P (the second row) up three times, and wait until the working file
    holds the change: its one log entry is then held back for RUN_PAUSE_S."""
    terminal.until(lambda: b"Demo Islander" in terminal.out, "loading screen")
    terminal.send("o")
    terminal.send("AB\r")
    terminal.until(lambda: any("signed on" in e.get("change", "") for e in _log_entries(tmp_path)), "sign-on")
    terminal.send("\x1b[B+++")
    terminal.until(lambda: "[tanks.DB1P]" in _working_text(tmp_path), "DB1P saved in the working file")
    assert not any("DB1P" in e.get("change", "") for e in _log_entries(tmp_path)), \
        "the run's entry landed before the signal (its pause ran out): this test needs the signal within it"


def _run_entry(tmp_path: Path) -> list[str]:
    return [e["change"] for e in _log_entries(tmp_path) if "DB1P" in e.get("change", "")]


@pytest.mark.long
@pytest.mark.parametrize("sig, status", [(signal.SIGTERM, 143)])
def test_a_signal_closes_the_screen_as_q_does(terminal, tmp_path, sig, status):
    """Within the run's pause: the run's one entry is written, the working file holds the
    condition, the terminal is given back (the alternate screen and mouse reporting turned off
    after the last frame), and the exit status is 128 + the signal's number.  One signal here
    (the handlers are installed alike); SIGHUP by the terminal closing below, and each of the
    three in-process in tests/test_ui_quit_and_signals.py."""
    _nudge_then(terminal, tmp_path)
    drawn = len(terminal.out)
    os.kill(terminal.proc.pid, sig)
    assert terminal.exit_status() == status
    assert _run_entry(tmp_path) == ["DB1P 0 % → 3 %, 0.0 t → 1.0 t (3 changes)"]
    assert "[tanks.DB1P]" in _working_text(tmp_path)
    after = bytes(terminal.out[drawn:])
    assert b"\x1b[?1049l" in after and b"\x1b[?1000l" in after  # alternate screen and mouse off
    assert b"Traceback" not in bytes(terminal.out)
    assert not list((tmp_path / "home").glob("crashes/*"))


@pytest.mark.long
def test_the_terminal_closing_closes_the_screen_as_q_does(terminal, tmp_path):
    """The terminal window closed (its side of the pseudo-terminal closed: the kernel sends SIGHUP,
    and nothing can be written to the terminal any more): the run's entry and the working
    condition are still written, and the status is 129, not Python's 120 for output it could
    not flush."""
    _nudge_then(terminal, tmp_path)
    os.close(terminal.master)
    terminal.master = -1
    end = time.monotonic() + DEADLINE_S
    while terminal.proc.poll() is None and time.monotonic() < end:
        time.sleep(0.05)
    assert terminal.proc.poll() == 129
    assert _run_entry(tmp_path) == ["DB1P 0 % → 3 %, 0.0 t → 1.0 t (3 changes)"]
    assert "[tanks.DB1P]" in _working_text(tmp_path)
    assert not list((tmp_path / "home").glob("crashes/*"))


@pytest.mark.long
def test_a_second_signal_leaves_when_the_disk_has_stopped_answering(tmp_path):
    """The first signal closes as q does and waits for the writer; with the disk hung the wait never
    ends.  A second signal, once the closing has waited STUCK_CLOSE_S (0.5 s here), leaves at once:
    exit 128 + its number, the terminal given back, and a message saying what was not written and
    that the working file holds the last condition saved (the atomic write never replaced it)."""
    terminal = Terminal(tmp_path, _AS_TERMINAL_STUCK_DISK)
    try:
        terminal.until(lambda: b"Demo Islander" in terminal.out, "loading screen")
        (tmp_path / "STUCK").write_text("", encoding="utf-8")
        before = _working_text(tmp_path)
        terminal.send("\x1b[B+")
        terminal.read(0.5)
        os.kill(terminal.proc.pid, signal.SIGTERM)
        terminal.read(1.0)
        assert terminal.proc.poll() is None  # the first signal waits for the disk
        drawn = len(terminal.out)
        os.kill(terminal.proc.pid, signal.SIGTERM)
        assert terminal.exit_status() == 143
        after = bytes(terminal.out[drawn:])
        assert b"\x1b[?1049l" in after and b"\x1b[?1000l" in after  # alternate screen and mouse off
        said = b" ".join(after.split()).decode("utf-8", "replace")
        assert "deckload: left without waiting for the disk" in said
        assert re.search(r"[1-9]\d* change\(s\) shown on screen not saved or logged", said), said
        assert "the working file holds the last condition saved" in said
        assert _working_text(tmp_path) == before and "[tanks.DB1P]" not in before
        assert b"Traceback" not in bytes(terminal.out)
    finally:
        terminal.close()


@pytest.mark.parametrize("where", ["stdin", "stdout", "stderr"])
def test_no_terminal_is_refused_at_once_naming_calc_and_report(tmp_path, where):
    """Input from /dev/null, or output to a pipe or file: the screen would draw into it for ever
    (and wait for keys nobody can type); it is refused with exit 2 before any file is read, and
    the message names the commands that work without a terminal."""
    master, slave = os.openpty()
    try:
        streams = {"stdin": slave, "stdout": slave, "stderr": slave}
        streams[where] = subprocess.DEVNULL if where == "stdin" else subprocess.PIPE
        err_to = tmp_path / "err.txt"
        with open(err_to, "wb") as err_file:
            if where == "stderr":
                streams["stderr"] = err_file
            proc = subprocess.run([sys.executable, "-m", "deckload", "open"], cwd=tmp_path, env=_env(tmp_path),
                                  timeout=DEADLINE_S, close_fds=True, **streams)
    finally:
        os.close(slave)
        os.set_blocking(master, False)
        try:
            on_terminal = os.read(master, 65536)
        except OSError:
            on_terminal = b""
        os.close(master)
    said = err_to.read_bytes() if where == "stderr" else on_terminal
    assert proc.returncode == 2
    names = {"stdin": b"standard input", "stdout": b"standard output", "stderr": b"standard error"}
    assert b"needs a terminal" in said and names[where] in said, said
    assert b"deckload calc PROFILE CONDITION" in said and b"deckload report PROFILE CONDITION --txt" in said
    assert b"\x1b[" not in said + (proc.stdout or b"")  # not one escape code drawn
    assert not (tmp_path / "logs").exists()  # nothing read, made or moved
