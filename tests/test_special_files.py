"""A pipe, device or socket among the files deckload reads is refused, never waited on
(deckload/io/limits.py ``open_regular``), and a sibling condition file that cannot be read or
parsed never stops the lookup by name (deckload/io/condition_files.py).

Opening a FIFO that nobody writes to blocks for ever, so every test here runs the program in this
process under a watchdog: an interval timer whose signal raises :class:`Hung` (a BaseException,
which the command's error boundary does not catch) into the blocked call, failing the test instead
of hanging the suite.
"""

from __future__ import annotations

import os
import signal
import socket
from contextlib import contextmanager
from pathlib import Path

import pytest

from deckload.cli.main import main
from demo_vessels import copy_of_demo

PROFILES = Path(__file__).resolve().parent.parent / "vessel_profiles"
LIMIT_S = 20.0
"""Far above what any command here takes (under a second with the profile cache)."""


class Hung(BaseException):
    """The watchdog went off: the program was waiting on a file."""


@contextmanager
def watchdog(seconds: float = LIMIT_S):
    def fire(signum, frame):
        raise Hung(f"still waiting after {seconds} s: a pipe was opened or read")

    old = signal.signal(signal.SIGALRM, fire)
    signal.setitimer(signal.ITIMER_REAL, seconds)
    try:
        yield
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, old)


def run(*argv: str) -> int:
    with watchdog():
        return main(list(argv))


@pytest.fixture(autouse=True)
def folders(tmp_path, monkeypatch):
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path / "logs"))
    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path / "home"))


@pytest.fixture
def trawler(tmp_path) -> Path:
    """A copy of the demo trawler (profile, CSV tables, stock conditions) in a folder of its own."""
    return copy_of_demo(tmp_path / "vp", "demo_trawler")


NOT_REGULAR = "is not a regular file but a pipe"


# ------------------------------------------------------------------ a FIFO among the inputs


def test_a_fifo_beside_the_profile_is_not_a_condition_and_the_lookup_by_name_goes_on(trawler, capsys):
    """Before: ``calc demo_trawler.toml grounds`` with ``demo_trawler.pipe.condition.toml`` a FIFO
    beside the profile waited for ever (the by-name lookup opened every sibling to read its name)."""
    os.mkfifo(trawler.parent / "demo_trawler.pipe.condition.toml")
    assert run("calc", str(trawler), "grounds") == 0
    assert "Demo Trawler" in capsys.readouterr().out
    assert run("calc", str(trawler), "On the grounds, hauling, 25 t catch aboard") == 0  # by its title
    capsys.readouterr()
    assert run("calc", str(trawler), "no-such-condition") == 2
    err = capsys.readouterr().err
    assert "grounds" in err and "pipe" not in err  # listed without the FIFO, which is no condition


@pytest.mark.parametrize("which", ["profile", "condition"])
def test_a_fifo_named_as_the_profile_or_the_condition_is_refused_naming_it(trawler, tmp_path, capsys, which):
    fifo = tmp_path / f"given.{which}.toml"
    os.mkfifo(fifo)
    args = [str(fifo), "x"] if which == "profile" else [str(trawler), str(fifo)]
    assert run("calc", *args) == 1
    out = capsys.readouterr()
    assert f"{fifo}: {NOT_REGULAR}" in out.out + out.err


def test_a_fifo_in_place_of_a_csv_table_is_a_problem_of_the_profile_even_with_the_profile_cached(trawler, capsys):
    """The first run caches the profile; the cache then hashes every file it was built from again,
    and the FIFO put in the KN table's place must be a miss, then a problem naming it."""
    assert run("calc", str(trawler), "grounds") == 0
    kn = trawler.parent / "demo_trawler" / "kn.csv"
    kn.unlink()
    os.mkfifo(kn)
    capsys.readouterr()
    assert run("check", str(trawler)) == 1
    out = capsys.readouterr().out
    assert f"{kn}: {NOT_REGULAR}" in out and "only a regular file is allowed for a CSV table" in out
    assert run("--no-cache", "calc", str(trawler), "grounds") == 1


@pytest.mark.parametrize("which", ["log", "head"])
def test_a_fifo_in_place_of_the_log_or_its_head_record_is_refused_naming_it(tmp_path, capsys, which):
    logs = tmp_path / "logs"
    assert run("log", "record", "trawler", "grounds", "--by", "JM") == 0
    target = logs / ("demo-trawler.log.jsonl" if which == "log" else "demo-trawler.log.head.json")
    target.unlink()
    os.mkfifo(target)
    capsys.readouterr()
    assert run("log", "verify") == 2
    assert f"{target}: {NOT_REGULAR}" in capsys.readouterr().err
    if which == "log":
        assert run("log", "show") == 2
        assert f"{target}: {NOT_REGULAR}" in capsys.readouterr().err


def test_the_writer_probe_does_not_wait_on_a_fifo_lock_file(tmp_path):
    from deckload.logbook.lock import writer_active

    lock = tmp_path / "x.log.lock"
    os.mkfifo(lock)
    with watchdog():
        assert writer_active(lock) is False  # nobody holds a lock on a pipe


def test_the_audit_line_finder_does_not_wait_on_a_fifo(tmp_path):
    """It re-reads the profile and the CSV a finding came from to give its line: a FIFO there
    only loses the line number."""
    from deckload.core.audit import Finding
    from deckload.report.audit_findings import _in_csv, audit_profile
    from demo_vessels import trawler_vessel

    fifo = tmp_path / "t.csv"
    os.mkfifo(fifo)
    finding = Finding("warning", "hydrostatics.kmt_m", ("hydrostatics", "kmt_m", 0), "1", "why", "look", "check")
    with watchdog():
        located = _in_csv(finding, fifo, trawler_vessel())
    assert located.line is None and located.file == str(fifo)
    import deckload.core.audit as core_audit

    with watchdog(), pytest.MonkeyPatch.context() as mp:
        mp.setattr(core_audit, "audit", lambda vessel: [finding])
        assert [x.line for x in audit_profile(fifo, trawler_vessel())] == [None]


def test_a_socket_is_refused_as_what_it_is_and_a_device_still_by_the_limits(tmp_path):
    from deckload.io.limits import NotRegularFileError, TooLargeError, read_limited

    sock_path = tmp_path / "s.toml"
    s = socket.socket(socket.AF_UNIX)
    try:
        s.bind(str(sock_path))
        with pytest.raises(NotRegularFileError, match="is not a regular file but a socket"):
            read_limited(sock_path, 100, "a test file")
    finally:
        s.close()
    with watchdog(), pytest.raises(TooLargeError, match="character device.*allowed"):
        read_limited("/dev/zero", 100, "a test file")


# ------------------------------------------------------------------ siblings that cannot be parsed


@pytest.mark.parametrize("hostile", [
    "x = " + "{a = " * 3000 + "1" + "}" * 3000 + "\n",  # RecursionError in the TOML reader
    "x = " + "9" * 10_000 + "\n",  # ValueError: Exceeds the limit (4300 digits) for integer string conversion
], ids=["nested-3000-deep", "integer-of-10000-digits"])
def test_a_sibling_condition_that_cannot_be_parsed_never_stops_the_lookup(trawler, capsys, hostile):
    """Before: a sibling nested 3000 deep or with a 10,000-digit integer crashed every lookup by
    name with a traceback, though it was not the condition asked for."""
    (trawler.parent / "demo_trawler.broken.condition.toml").write_text(hostile, encoding="utf-8")
    assert run("calc", str(trawler), "grounds") == 0
    assert "Traceback" not in capsys.readouterr().err
    assert run("calc", str(trawler), "no-such-condition") == 2
    assert "broken" in capsys.readouterr().err  # listed by its file name: it is not hidden


def test_an_interrupt_while_reading_a_siblings_name_still_stops_the_program(trawler, monkeypatch):
    """Any Exception of a sibling is a file that does not match; KeyboardInterrupt is not one.
    (And a sibling with a RecursionError does not match by the name it might have had.)"""
    import deckload.io.condition_files as cf

    (trawler.parent / "demo_trawler.deep.condition.toml").write_text(
        "x = " + "{a = " * 3000 + "1" + "}" * 3000 + "\n", encoding="utf-8")
    assert cf.title_of(trawler.parent / "demo_trawler.deep.condition.toml") == "demo_trawler.deep.condition.toml"

    def interrupted(*args, **kwargs):
        raise KeyboardInterrupt

    monkeypatch.setattr(cf.tomllib, "loads", interrupted)
    monkeypatch.setattr(cf.tomllib, "load", interrupted)
    with pytest.raises(KeyboardInterrupt):
        cf.title_of(trawler.parent / "demo_trawler.grounds.condition.toml")


def test_tables_does_not_wait_on_a_fifo_named_as_the_profile_to_refresh(tmp_path, capsys, monkeypatch):
    """``tables -o`` reads the profile it refreshes first: a FIFO there is refused before any table
    is computed (computing fails this test: the refusal must come first)."""
    import deckload.cli.tables as tables_cli

    def computed(*args, **kwargs):
        raise AssertionError("the tables were computed")

    monkeypatch.setattr(tables_cli, "build_tables", computed)
    fifo = tmp_path / "profile.toml"
    os.mkfifo(fifo)
    assert run("tables", str(PROFILES / "demo_islander.geometry.toml"), "-o", str(fifo)) == 1
    assert f"{fifo}: {NOT_REGULAR}" in capsys.readouterr().err
