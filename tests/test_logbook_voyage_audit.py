"""The voyage log against what a ship's PC and a copy to a USB stick do to it (found by an audit of
the log): a time zone beyond ±14:00, a copy without its final line end, Windows line endings or a
byte-order mark, a clock set back, recording into a log that fails verification, file names whose
case changed, a log folder that cannot be written, and the printout for signature."""

from __future__ import annotations

import tempfile
import time
from datetime import datetime, timedelta, timezone
from pathlib import Path

import pytest

from deckload.cli.main import main
from deckload.io.paths import DEMO_PROFILE
from deckload.logbook import Logbook

VESSEL = "Demo Islander"
LOG = "demo-islander.log.jsonl"
HEAD = "demo-islander.log.head.json"


@pytest.fixture
def logs(tmp_path) -> Path:
    return tmp_path / "logs"


@pytest.fixture
def time_zone(monkeypatch):
    """Set the PC's time zone (TZ) for the test; the process's own is put back afterwards."""
    def set_tz(tz: str) -> None:
        monkeypatch.setenv("TZ", tz)
        time.tzset()

    monkeypatch.delenv("DECKLOAD_SHIP_OFFSET", raising=False)
    yield set_tz
    monkeypatch.undo()
    time.tzset()


def record(logs: Path, condition: str = "departure", *extra: str) -> int:
    return main(["log", "--dir", str(logs), "record", str(DEMO_PROFILE), condition, "--by", "JM", *extra])


def files(logs: Path) -> dict[str, bytes]:
    return {p.name: p.read_bytes() for p in sorted(logs.iterdir()) if not p.name.endswith(".lock")}


# --------------------------------------------------------------------------- 1. offset beyond ±14:00


def test_a_time_zone_beyond_14_hours_is_refused_before_anything_is_written(logs, time_zone, capsys):
    """TZ=SHIP-15 (POSIX: 15 h east of UTC) gave '+15:00', which the reader refuses: the line and the
    head were written, then 'cannot record: line 2 …', and the log failed verification for ever."""
    assert record(logs) == 0
    before = files(logs)
    capsys.readouterr()
    time_zone("SHIP-15")
    assert record(logs, "arrival") == 1
    err = capsys.readouterr().err
    assert "TZ='SHIP-15'" in err and "+15:00" in err and "--ship-offset" in err and "Traceback" not in err
    assert files(logs) == before  # nothing written: neither the line nor the head
    assert record(logs, "arrival", "--ship-offset", "+10:00") == 0  # the way round it named works
    assert main(["log", "--dir", str(logs), "verify"]) == 0


def test_a_line_the_reader_would_refuse_is_never_written(logs):
    """Every entry is read back as verify reads it before it is written: a clock at the end of the
    calendar with the ship 14 h ahead is a ship's time past year 9999, which the reader refuses."""
    end = datetime(9999, 12, 31, 23, 0, tzinfo=timezone.utc)
    with Logbook.open(logs, VESSEL, ship_offset="+14:00", clock=lambda: end) as book:
        with pytest.raises(ValueError, match="beyond the calendar.*nothing was written"):
            book.append(kind="remark", by="JM", change_text="test", change_data={}, result=None, condition=None)
    assert (logs / LOG).read_bytes() == b""
    with Logbook.open(logs, VESSEL, readonly=True) as book:
        assert book.verify().ok


async def test_the_loading_screen_says_so_and_stays_open(tmp_path, time_zone):
    """The screen's record (s) gets the same refusal as a message; the screen stays, nothing is written."""
    from vessel_factories import pilot_app

    app = pilot_app(tmp_path, log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        time_zone("SHIP-15")
        await pilot.press("s", "enter")
        await pilot.pause()
        said = " ".join(str(n.message) for n in app._notifications)
        assert "NOT RECORDED" in said and "TZ='SHIP-15'" in said and "--ship-offset" in said
        assert app.is_running and app.screen.id != "log-screen"
    with Logbook.open(tmp_path / "logs", app.session.vessel.particulars.name, readonly=True) as book:
        assert book.entries() == [] and book.verify().ok


# --------------------------------------------------------------------------- 2. no final line end


@pytest.fixture
def three(logs) -> Path:
    """A clean log of three entries recorded from the demo's stock conditions."""
    for c in ("departure", "midvoyage", "arrival"):
        assert record(logs, c) == 0
    return logs


def test_a_copy_without_its_final_line_end_is_intact_and_the_next_record_restores_it(three, capsys):
    """The last line whole (its SHA-256 the head's) but its '\\n' gone: verify said torn, show dropped
    the entry, record and verify --recover refused."""
    log = three / LOG
    whole = log.read_bytes()
    log.write_bytes(whole[:-1])
    capsys.readouterr()
    assert main(["log", "--dir", str(three), "verify"]) == 0
    out = capsys.readouterr().out
    assert "OK — 3 entries" in out and "note: line 3: complete, but the file ends without its line end" in out
    assert main(["log", "--dir", str(three), "show"]) == 0
    assert "condition recorded: Arrival" in capsys.readouterr().out
    with Logbook.open(three, VESSEL, readonly=True) as book:
        assert [e.seq for e in book.entries()] == [1, 2, 3]
        assert book.find(book.entries()[-1].sha256) == (3, 3)  # a paper copy's anchor is found
    assert main(["log", "--dir", str(three), "verify", "--recover"]) == 0
    out = capsys.readouterr().out
    assert "repaired: demo-islander.log.jsonl: line 3" in out and "OK — 3 entries" in out
    assert log.read_bytes() == whole  # just the line end back, nothing else
    log.write_bytes(whole[:-1])
    assert record(three, "departure") == 0
    assert "repaired" in capsys.readouterr().err
    assert log.read_bytes().startswith(whole) and log.read_bytes().count(b"\n") == 4
    assert main(["log", "--dir", str(three), "verify"]) == 0


def test_a_torn_last_line_is_still_torn(three, capsys):
    """Only the line the head names is taken whole: a line cut short is still set aside, not ended."""
    log = three / LOG
    whole = log.read_bytes()
    log.write_bytes(whole[:-300])
    assert main(["log", "--dir", str(three), "verify"]) == 1
    assert "incomplete last line" in capsys.readouterr().out
    with Logbook.open(three, VESSEL, readonly=True) as book:
        assert len(book.entries()) == 2


# --------------------------------------------------------------------------- 3. CR LF and BOM


def _crlf(data: bytes) -> bytes:
    return data.replace(b"\n", b"\r\n")


def _bom(data: bytes) -> bytes:
    return b"\xef\xbb\xbf" + data


@pytest.mark.parametrize("copy, said", [(_crlf, "Windows line ends (CR LF)"), (_bom, "byte-order mark (BOM)")])
def test_a_windows_copy_is_named_as_such_refused_for_recording_and_repaired(three, capsys, copy, said):
    """CR LF line ends read as every line edited, a BOM as line 1 not valid JSON; a BOM log was even
    recorded into (a line of another kind among them)."""
    log = three / LOG
    written = log.read_bytes()
    log.write_bytes(copy(written))
    capsys.readouterr()
    assert main(["log", "--dir", str(three), "verify"]) == 1
    out = capsys.readouterr().out
    assert "1 problem(s)" in out and "changed by a copy, not by an edit" in out and said in out
    assert "every entry is intact" in out and "verify --recover" in out
    assert "edited" not in out.replace("not by an edit", "") and "not valid JSON" not in out
    assert main(["log", "--dir", str(three), "show"]) == 1  # (the file is not as written until repaired)
    shown = capsys.readouterr().out
    assert "DAMAGED" not in shown and "condition recorded: Arrival" in shown
    assert record(three, "arrival") == 1
    assert said in capsys.readouterr().err and log.read_bytes() == copy(written)  # refused, untouched
    assert main(["log", "--dir", str(three), "verify", "--recover"]) == 0
    out = capsys.readouterr().out
    (kept,) = three.glob(f"{LOG}.as-copied-*.bak")
    assert f"repaired: {LOG}" in out and kept.name in out and "OK — 3 entries" in out
    assert log.read_bytes() == written and kept.read_bytes() == copy(written)
    assert record(three, "arrival") == 0 and main(["log", "--dir", str(three), "verify"]) == 0


def test_a_copy_that_also_lost_an_entry_is_not_rewritten(three, capsys):
    """With the CRs taken out, the other problems stand, and --recover rewrites nothing."""
    log = three / LOG
    lines = log.read_bytes().splitlines(keepends=True)
    damaged = _crlf(lines[0] + lines[2])  # entry #2 removed, then copied
    log.write_bytes(damaged)
    capsys.readouterr()
    assert main(["log", "--dir", str(three), "verify"]) == 1
    out = capsys.readouterr().out
    assert "changed by a copy" in out and "the problems below remain" in out
    assert "line 2: entry #3 follows entry #1" in out
    assert main(["log", "--dir", str(three), "verify", "--recover"]) == 1
    assert "not rewritten" in capsys.readouterr().out
    assert log.read_bytes() == damaged and not list(three.glob("*.bak"))


def test_the_loading_screen_does_not_record_into_a_windows_copy(three, tmp_path):
    from deckload.ui.launch import open_journal

    log = three / LOG
    log.write_bytes(_crlf(log.read_bytes()))
    journal = open_journal(three, VESSEL)
    try:
        assert not journal.writable and "CR LF" in journal.problem and "verify --recover" in journal.problem
    finally:
        journal.logbook.close()


# --------------------------------------------------------------------------- 4. the clock set back


class Clock:
    """A clock the test sets: the PC's clock as the officer left it."""

    def __init__(self, at: datetime):
        self.at = at

    def __call__(self) -> datetime:
        return self.at


@pytest.fixture
def clock(monkeypatch) -> Clock:
    c = Clock(datetime(2026, 12, 3, 12, 0, tzinfo=timezone.utc))
    monkeypatch.setattr("deckload.logbook.book.utc_now", c)
    monkeypatch.setenv("DECKLOAD_SHIP_OFFSET", "+02:00")
    return c


def test_a_clock_set_back_is_warned_at_record_noted_by_verify_and_marked_in_show_and_exports(logs, clock, capsys):
    """Recorded at 12:00, then with the clock an hour earlier, then a day earlier: all were taken
    without a word, verify said OK and show listed #3 before #1 in time unmarked."""
    assert record(logs, "departure") == 0
    clock.at = datetime(2026, 12, 3, 11, 0, tzinfo=timezone.utc)
    capsys.readouterr()
    assert record(logs, "midvoyage") == 0  # still recorded: the clock may have been wrong before
    err = capsys.readouterr().err
    assert "warning: the clock reads 1 h 00 min earlier than entry #1" in err
    clock.at = datetime(2026, 12, 2, 11, 30, tzinfo=timezone.utc)
    assert record(logs, "arrival") == 0
    assert "23 h 30 min earlier than entry #2" in capsys.readouterr().err
    clock.at = datetime(2026, 12, 2, 11, 31, tzinfo=timezone.utc)
    assert record(logs, "arrival") == 0
    assert "warning" not in capsys.readouterr().err  # later than the entry before: nothing to say

    assert main(["log", "--dir", str(logs), "verify"]) == 0  # a note, not a problem: the chain is intact
    out = capsys.readouterr().out
    assert "OK — 4 entries" in out
    assert "note: line 2: entry #2 is timed 1 h 00 min earlier than entry #1" in out
    assert "note: line 3: entry #3 is timed 23 h 30 min earlier than entry #2" in out
    assert "line 4: entry #4" not in out

    assert main(["log", "--dir", str(logs), "show"]) == 0
    shown = capsys.readouterr().out
    assert shown.count("◂ timed") == 2 and "◂ timed 1 h 00 min earlier than #1" in shown

    assert main(["log", "--dir", str(logs), "export", "--csv"]) == 0
    import csv
    import io

    rows = list(csv.DictReader(io.StringIO(capsys.readouterr().out)))
    assert [r["clock_back"].split(" before")[0] for r in rows] == [
        "", "timed 1 h 00 min earlier than #1", "timed 23 h 30 min earlier than #2", ""]
    assert main(["log", "--dir", str(logs), "export", "--html"]) == 0
    assert capsys.readouterr().out.count("◂ timed") == 2


async def test_the_loading_screen_warns_of_a_clock_set_back_and_marks_the_entry(tmp_path, clock):
    from deckload.ui.log_screen import LogScreen, _row
    from vessel_factories import pilot_app

    app = pilot_app(tmp_path, log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("s", "enter")
        await pilot.pause()
        clock.at -= timedelta(hours=1)
        await pilot.press("s", "enter")
        await pilot.pause()
        said = [(n.severity, str(n.message)) for n in app._notifications]
        assert any(sev == "warning" and "1 h 00 min earlier than entry #1" in m for sev, m in said), said
        book = app.session.journal.logbook
        screen = LogScreen(book)
        app.push_screen(screen)
        await pilot.pause()
        assert screen._back.keys() == {2}
        assert "◂" in str(_row(book.entries()[1], screen._back[2])[1]) and "◂" not in str(_row(book.entries()[0])[1])


# --------------------------------------------------------------------------- 5. recording into a broken log


def _duplicate_an_entry(logs: Path) -> None:
    log = logs / LOG
    lines = log.read_bytes().splitlines(keepends=True)
    log.write_bytes(b"".join([lines[0], lines[1], lines[1], *lines[2:]]))  # entry #2 twice, in the middle


def test_recording_into_a_log_that_fails_verification_warns_before_and_after(three, capsys):
    """An entry duplicated in the middle: 'log record' appended after it without a word."""
    _duplicate_an_entry(three)
    capsys.readouterr()
    assert record(three, "arrival") == 0  # recorded: a voyage's log cannot stop, and nothing is overwritten
    err = capsys.readouterr().err
    assert err.count("WARNING") == 2 and "this log fails verification (2 problem(s)" in err
    assert "entry #4 is recorded, but" in err and "run 'deckload log verify'" in err
    assert err.rstrip().splitlines()[-1].startswith("deckload: WARNING: entry #4 is recorded")  # said last
    assert record(three, "departure", "--remark", "x") == 0
    assert "WARNING" in capsys.readouterr().err  # every time, not once


def test_a_clean_log_records_without_a_warning(three, capsys):
    capsys.readouterr()
    assert record(three, "arrival") == 0
    assert "WARNING" not in capsys.readouterr().err


async def test_the_loading_screen_warns_after_its_first_frame_of_a_log_that_fails_verification(three, tmp_path):
    """The whole chain is read once the first frame is drawn (not before it: 0.4 s for 2000 entries),
    and a log that fails it is said in a warning; the journal's own check says the same."""
    from deckload.ui.launch import create_app
    from demo_vessels import demo_departure

    _duplicate_an_entry(three)
    v, c = demo_departure()
    app = create_app(v, c, work_dir=tmp_path / "work", log_dir=three, officer="JM")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        await pilot.pause()
        said = [str(n.message) for n in app._notifications]
        assert any(m.startswith("WARNING") and "fails verification (2 problem(s)" in m for m in said), said
        assert "fails verification (2 problem(s)" in app.session.journal.broken()


# --------------------------------------------------------------------------- 6. names whose case changed


def test_log_files_renamed_in_capitals_are_named_and_no_new_log_starts_beside_them(three, capsys):
    """DEMO-ISLANDER.LOG.JSONL (a copy that changed the case of names) was invisible: verify and show
    said 'no logs', and record started a new chain of entry #1 beside it."""
    for name in (LOG, HEAD):
        (three / name).rename(three / name.upper())
    before = files(three)
    capsys.readouterr()
    assert main(["log", "--dir", str(three), "verify"]) == 1
    out = capsys.readouterr().out
    assert "NOT READ: DEMO-ISLANDER.LOG.JSONL" in out and f"rename it {LOG}" in out
    assert "NOT READ: DEMO-ISLANDER.LOG.HEAD.JSON" in out
    assert main(["log", "--dir", str(three), "show"]) == 1
    assert "NOT READ: DEMO-ISLANDER.LOG.JSONL" in capsys.readouterr().out
    assert record(three, "arrival") == 1
    err = capsys.readouterr().err
    assert "DEMO-ISLANDER.LOG.JSONL" in err and "never this one" in err
    assert files(three) == before  # no new log beside them
    for name in (LOG, HEAD):  # renamed back, the log is whole
        (three / name.upper()).rename(three / name)
    assert main(["log", "--dir", str(three), "verify"]) == 0
    assert record(three, "arrival") == 0


# --------------------------------------------------------------------------- 7. a read-only log folder


@pytest.fixture
def folder_refuses(monkeypatch):
    """The log folder refuses new files (read-only), as a non-root user sees it: every file made in it
    (write_atomic's temporary, which renames over the head record) fails; the log itself still opens."""
    real = tempfile.mkstemp

    def refused(*a, dir=None, **k):
        if dir is not None and Path(dir).name == "logs":
            raise PermissionError(13, "Permission denied", str(dir))
        return real(*a, dir=dir, **k)

    return lambda: monkeypatch.setattr(tempfile, "mkstemp", refused)


def test_record_refuses_when_the_head_record_cannot_be_updated(three, folder_refuses, capsys):
    """With the folder read-only the entries went on and the head record silently stayed behind."""
    before = files(three)
    folder_refuses()
    capsys.readouterr()
    assert record(three, "arrival") == 2
    err = capsys.readouterr().err
    assert f"the head record {HEAD} cannot be updated" in err and "refuses a new file (Permission denied)" in err
    assert files(three) == before


def test_verify_names_a_folder_that_refuses_the_head_record_as_a_cause_of_it_being_behind(three, folder_refuses,
                                                                                           capsys):
    """A head record behind: verify blamed a power cut alone, when the folder could not take it."""
    lines = (three / LOG).read_bytes().splitlines(keepends=True)
    import hashlib
    import json

    (three / HEAD).write_text(json.dumps({"format": "deckload-log-head-1", "seq": 2,
                                         "sha256": hashlib.sha256(lines[1].rstrip(b"\n")).hexdigest()}))
    capsys.readouterr()
    assert main(["log", "--dir", str(three), "verify"]) == 0
    out = capsys.readouterr().out
    assert "head record is 1 entry behind" in out and "could not be rewritten" in out
    folder_refuses()
    assert main(["log", "--dir", str(three), "verify"]) == 0
    assert f"note: the log folder {three} refuses a new file now (Permission denied)" in capsys.readouterr().out


# --------------------------------------------------------------------------- 8. the printout for signature


def test_the_printout_for_signature_holds_what_a_signature_needs(logs, monkeypatch, capsys):
    """The HTML and CSV exports had no KG (stored in each entry), no signature lines, the ship's time
    without its offset, trim and list as bare signs, the vessel's name on the first page only, no page
    numbers, and the long 'not assessed' text on every row; show printed HH:MM alone."""
    import csv
    import io
    import json

    monkeypatch.setenv("DECKLOAD_SHIP_OFFSET", "+02:00")
    for c in ("departure", "midvoyage", "arrival"):
        assert record(logs, c) == 0
    with Logbook.open(logs, VESSEL, readonly=True) as book:
        es = book.entries()
    capsys.readouterr()
    assert main(["log", "--dir", str(logs), "export", "--html"]) == 0
    html = capsys.readouterr().out
    assert "<th>KG fluid m</th>" in html and f'<td class="n">{es[1].summary["kg_fluid_m"]:.3f}</td>' in html
    assert "Officer:" in html and "Master:" in html and "Date/time:" in html  # the condition report's lines
    assert html.index("Master:") > html.rindex("</table>")
    assert f"{es[0].ship_time:%Y-%m-%d %H:%M} (+02:00)" in html
    trim, heel = es[0].summary["trim_m"], es[0].summary["list_deg"]
    assert f"{abs(trim):.3f} m by the {'stern' if trim > 0 else 'head'}" in html
    for e in es:  # each entry's list as written: a side in words, or 0.0° alone when it rounds to nothing
        heel = e.summary["list_deg"]
        said = "0.0°" if round(abs(heel), 1) == 0 else f"{abs(heel):.1f}° to {'starboard' if heel > 0 else 'port'}"
        assert f'<td class="w">{said}</td>' in html, said
    assert '<tr class="running"><th colspan=' in html and "Voyage loading log — Demo Islander</th>" in html
    assert "counter(page)" in html and "counter(pages)" in html
    not_assessed = es[0].summary["not_assessed"][0]["reason"]
    assert html.count(not_assessed) == 1 and html.count("<td>[1]</td>") == 3

    assert main(["log", "--dir", str(logs), "export", "--csv"]) == 0
    rows = list(csv.DictReader(io.StringIO(capsys.readouterr().out)))
    assert [r["kg_fluid_m"] for r in rows] == [f"{e.summary['kg_fluid_m']:.3f}" for e in es]

    assert main(["log", "--dir", str(logs), "show"]) == 0
    out = capsys.readouterr().out
    assert f"   1  {es[0].ship_time:%Y-%m-%d %H:%M} (+02:00)  JM" in out
    # deckload's own words keep within 100 columns; an entry's change and remark stay on its row, unwrapped
    # (a wrapped remark could print a line that looks like an entry's row)
    rows_ = [ln for ln in out.splitlines()[1:] if ln[:4].strip().isdigit()]
    assert len(rows_) == 3 and all(ln.index("condition recorded") <= 80 for ln in rows_)
    assert max(len(ln) for ln in out.splitlines()[1:] if ln not in rows_) <= 100
    assert json.loads((logs / LOG).read_text().splitlines()[0])["ship_clock"] == "+02:00"


# --------------------------------------------------------------------------- 9. lesser


def test_verify_mentions_a_torn_line_set_aside(three, capsys):
    """After --recover set a torn line aside, verify said 'OK' and nothing of the side file."""
    log = three / LOG
    log.write_bytes(log.read_bytes() + b'{"format":"deckload-log-1","seq":4,')
    assert main(["log", "--dir", str(three), "verify", "--recover"]) == 0
    (side,) = three.glob(f"{LOG}.torn-*.txt")
    capsys.readouterr()
    assert main(["log", "--dir", str(three), "verify"]) == 0
    assert f"note: {side.name}: a torn last line set aside earlier (35 bytes)" in capsys.readouterr().out


def test_two_halves_joined_are_not_blamed_on_a_power_cut(three, capsys):
    """Lines 1–2 appended again after line 3: the head (entry #3) is 'behind', but not by a power cut."""
    log = three / LOG
    lines = log.read_bytes().splitlines(keepends=True)
    log.write_bytes(b"".join([*lines, lines[0], lines[1]]))
    capsys.readouterr()
    assert main(["log", "--dir", str(three), "verify"]) == 1
    out = capsys.readouterr().out
    assert "power cut" not in out.replace("not the trace of a power cut", "")
    assert "lines 4–5 after it do not chain from it" in out and "earlier than entry" not in out


# --------------------------------------------------------------------------- reading each line once


def test_verifying_again_reads_only_lines_not_read_before_and_still_sees_every_change(three, monkeypatch):
    """The screen verifies after each record; reading a line and checking its fields is nearly all of
    it, so a line read before (the same SHA-256 at the same line) is not read again
    (chain._CHAINED).  An edited line is a new line: it is read, and the edit is found."""
    from deckload.logbook import chain

    book = Logbook.open_file(three / LOG)
    assert book.verify().ok
    read = []
    real = chain._entry_from_line
    monkeypatch.setattr(chain, "_entry_from_line", lambda line, i: read.append(i) or real(line, i))
    assert book.verify().ok and read == []
    log = three / LOG
    lines = log.read_bytes().splitlines(keepends=True)
    edited = lines[1].replace(b'"by": "', b'"by": "X', 1) if b'"by": "' in lines[1] else lines[1].replace(b'"by":"', b'"by":"X', 1)
    assert edited != lines[1]
    log.write_bytes(b"".join([lines[0], edited, *lines[2:]]))
    rep = book.verify()
    assert read == [2] and not rep.ok and any("line 2: edited" in p for p in rep.problems), rep.problems


# --------------------------------------------------------------------------- exports of several logs


def test_an_export_of_two_logs_judges_each_clock_within_its_own_log(logs, monkeypatch, capsys):
    """The trawler's log at 08:00 and 09:00, the Islander's at 12:00 and 13:00: neither clock went back.
    Joined into one list, the second log's first entry was marked 'timed 5 h earlier … (clock set
    back?)' against the first log's last, and the marks were looked up by line number alone."""
    import csv
    import io

    at = [datetime(2026, 12, 3, 8, 0, tzinfo=timezone.utc)]
    monkeypatch.setattr("deckload.logbook.book.utc_now", lambda: at[0])
    monkeypatch.setenv("DECKLOAD_SHIP_OFFSET", "+00:00")
    trawler = DEMO_PROFILE.parent / "demo_trawler.toml"
    for hour, profile, cond in [(8, trawler, "departure"), (9, trawler, "grounds"),
                                (12, DEMO_PROFILE, "departure"), (13, DEMO_PROFILE, "midvoyage")]:
        at[0] = datetime(2026, 12, 3, hour, 0, tzinfo=timezone.utc)
        assert main(["log", "--dir", str(logs), "record", str(profile), cond, "--by", "JM"]) == 0
    capsys.readouterr()
    assert main(["log", "--dir", str(logs), "export", "--csv"]) == 0
    rows = list(csv.DictReader(io.StringIO(capsys.readouterr().out)))
    assert len(rows) == 4 and all(r["clock_back"] == "" for r in rows), rows
    assert main(["log", "--dir", str(logs), "export", "--html"]) == 0
    assert "clock set back" not in capsys.readouterr().out


def test_an_export_says_on_the_page_which_log_it_did_not_read_and_fails(three, capsys):
    """A log renamed in capitals by a copy: show and verify exit 1 and name it; export wrote a page for
    signature with no entries and no word of it (stderr only), exit 0."""
    for name in (LOG, HEAD):
        (three / name).rename(three / name.upper())
    capsys.readouterr()
    assert main(["log", "--dir", str(three), "export", "--html"]) == 1
    page = capsys.readouterr().out
    assert '<p class="broken">NOT READ: DEMO-ISLANDER.LOG.JSONL' in page
    assert main(["log", "--dir", str(three), "export", "--csv"]) == 1


async def test_the_screen_says_a_clock_set_back_when_an_edit_is_the_first_entry_after_it(tmp_path, monkeypatch):
    """Record at 12:00, the clock set back an hour, then edits: the first entry timed earlier is an
    edit logged by the writer thread.  Its warning was kept for the record action, which cleared it
    before recording: the officer never heard of it.  Now it is said once the edit is logged."""
    from vessel_factories import pilot_app

    at = [datetime(2026, 12, 3, 12, 0, tzinfo=timezone.utc)]
    monkeypatch.setattr("deckload.logbook.book.utc_now", lambda: at[0])
    monkeypatch.setenv("DECKLOAD_SHIP_OFFSET", "+02:00")
    app = pilot_app(tmp_path, log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("s", "enter")
        await pilot.pause()
        at[0] -= timedelta(hours=1)
        await pilot.press("plus")
        await pilot.press("down", "down", "plus")  # another tank: the first run of edits is logged now
        for _ in range(100):
            await pilot.pause(0.02)
            said = [str(n.message) for n in app._notifications]
            if any("earlier than entry #1" in m for m in said):
                break
        assert any(m.startswith("Logged, but the clock reads 1 h 00 min earlier than entry #1") for m in said), said
        await pilot.press("s", "enter")  # said once: the record after it repeats nothing
        await pilot.pause()
        said = [str(n.message) for n in app._notifications]
        assert sum("earlier than entry #1" in m for m in said) == 1, said


def test_verify_names_the_doubtful_lines_and_the_log_screen_marks_them(three, capsys):
    """Entry #2 duplicated in the middle showed on the log screen as a second '#2' like any other row;
    only the status line said the chain was broken.  Verify now gives the lines its problems name
    (the duplicate; an edited line itself, not the intact line after it), and the screen marks them."""
    from deckload.ui.log_screen import _row

    _duplicate_an_entry(three)  # lines 1, 2, 2 (the duplicate, line 3), 3
    book = Logbook.open_file(three / LOG)
    rep = book.verify()
    assert not rep.ok and 3 in rep.doubtful_lines and not {1, 2} & rep.doubtful_lines, (rep.doubtful_lines, rep.problems)
    entries = book.entries()
    marked = [str(_row(e, None, e.line_no in rep.doubtful_lines)[0]) for e in entries]
    assert marked == ["1", "2", "2 !", "3"], marked
    assert main(["log", "--dir", str(three), "show"]) == 1
    shown = capsys.readouterr().out
    assert shown.count("is named by verify") == 1 and "! line 3 is named by verify" in shown

    log = three / LOG
    lines = log.read_bytes().splitlines(keepends=True)
    edited = lines[1].replace(b'"JM"', b'"XY"', 1)  # the initials, as stored
    assert edited != lines[1]
    log.write_bytes(b"".join([lines[0], edited, *lines[3:]]))
    rep = Logbook.open_file(log).verify()  # line 2 edited (the duplicate taken out again)
    assert rep.doubtful_lines == frozenset({2}), (rep.doubtful_lines, rep.problems)
