"""The voyage log read back after it was edited by hand (found by an independent audit).

Held: a log found in the folder is read as the file it is, never by the vessel name written in
it; numbers deckload never writes (NaN, infinity, 1e308, text) are refused by verify and never
shown as numbers, even with the chain recomputed; one damaged line (a time beyond the calendar,
a summary field of the wrong type) is named with its file and line and the rest still shown,
on the command line and on the screen; recording refuses another vessel's log; a remark's line
feeds never reach the terminal raw; a broken pipe after recording says the entry was recorded;
the head record's note words one line as one line.
"""

from __future__ import annotations

import csv
import hashlib
import io
import json
import sys

import pytest
from textual.app import App

from deckload.cli.main import main
from deckload.logbook import Logbook
from deckload.ui.log_screen import LogScreen

LOG, HEAD = "demo-islander.log.jsonl", "demo-islander.log.head.json"


@pytest.fixture
def logdir(tmp_path, monkeypatch):
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path / "logs"))
    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path / "home"))
    return tmp_path / "logs"


def record(n: int = 3, *extra: str) -> None:
    for _ in range(n):
        assert main(["log", "record", "demo", "departure", "--by", "JM", *extra]) == 0


def lines(logdir) -> list[bytes]:
    return (logdir / LOG).read_bytes().split(b"\n")[:-1]


def rewrite(logdir, new_lines: list[bytes], rechain: bool) -> None:
    """Write the lines back; with ``rechain`` as a tamperer who knows the format would: every
    prev_sha256 and the head record recomputed, so that the hash chain alone holds."""
    if rechain:
        prev, out = "0" * 64, []
        for line in new_lines:
            old = json.loads(line, parse_constant=lambda c: 0.0)["prev_sha256"]
            line = line.replace(old.encode(), prev.encode(), 1)
            out.append(line)
            prev = hashlib.sha256(line).hexdigest()
        new_lines = out
        seq = json.loads(new_lines[-1], parse_constant=lambda c: 0.0)["seq"]
        (logdir / HEAD).write_text(json.dumps({"format": "deckload-log-head-1", "seq": seq, "sha256": prev}) + "\n")
    (logdir / LOG).write_bytes(b"".join(x + b"\n" for x in new_lines))


def edit(logdir, i: int, change, rechain: bool) -> None:
    ls = lines(logdir)
    obj = json.loads(ls[i])
    change(obj)
    ls[i] = json.dumps(obj, ensure_ascii=False, separators=(",", ":")).encode()
    rewrite(logdir, ls, rechain)


def run(capsys, *args: str) -> tuple[int, str, str]:
    capsys.readouterr()
    rc = main(["log", *args])
    out, err = capsys.readouterr()
    return rc, out, err


# ------------------------------------------------------------------ 1: the files found, as themselves


def _rename_line_1(logdir):
    edit(logdir, 0, lambda o: o.__setitem__("vessel", "Nobody"), rechain=False)


def _another_vessels_log(logdir):
    ls = lines(logdir)
    for i in range(len(ls)):
        obj = json.loads(ls[i])
        obj["vessel"] = "Demo Trawler"
        ls[i] = json.dumps(obj, ensure_ascii=False, separators=(",", ":")).encode()
    rewrite(logdir, ls, rechain=True)  # her own log, whole and chained, under this vessel's file name


@pytest.mark.parametrize("tamper,other", [(_rename_line_1, "Nobody"), (_another_vessels_log, "Demo Trawler")])
def test_a_log_is_read_as_the_file_found_and_checked_against_its_file_name(logdir, capsys, tamper, other):
    record(3)
    tamper(logdir)
    rc, out, _ = run(capsys, "verify")
    assert rc == 1 and "BROKEN" in out and "the log is empty" not in out
    assert f"line 1: vessel {other!r}, but the file {LOG}" in out
    rc, out, _ = run(capsys, "show")
    assert rc == 1 and f"vessel {other!r}" in out and out.count("condition recorded: Departure") == 3
    rc, out, err = run(capsys, "export", "--csv")
    assert rc == 1 and f"vessel {other!r}" in err and len(list(csv.DictReader(io.StringIO(out)))) == 3
    # --recover acts on the files found: nothing is made for a name read from inside one
    before = sorted(p.name for p in logdir.iterdir())
    rc, out, _ = run(capsys, "verify", "--recover")
    assert rc == 1
    assert not [p for p in logdir.iterdir() if not p.name.startswith("demo-islander.")], before


# ------------------------------------------------------------------ 2: numbers deckload never writes


@pytest.mark.parametrize("raw,shown", [
    (b'"gm_fluid_m":NaN', "NaN"),
    (b'"gm_fluid_m":1e999', "1e999"),
    (b'"gm_fluid_m":1e308', "1e+308"),
    (b'"gm_fluid_m":"lots"', "'lots'"),
    (b'"displacement_t":[1,2]', "[1, 2]"),
    (b'"water_density_t_m3":7.5', "7.5"),
])
def test_a_number_deckload_never_writes_is_flagged_even_with_the_chain_recomputed(logdir, capsys, raw, shown):
    record(3)
    ls = lines(logdir)
    key = raw.split(b":")[0]
    start = ls[1].index(key)
    end = ls[1].index(b",", start)
    ls[1] = ls[1][:start] + raw + ls[1][end:]
    rewrite(logdir, ls, rechain=True)
    rc, out, _ = run(capsys, "verify")
    assert rc == 1 and "line 2:" in out and shown in out, out
    rc, out, _ = run(capsys, "show")
    assert rc == 1 and f"DAMAGED {LOG} line 2:" in out
    assert "1000000000" not in out and " nan " not in out.lower() and " inf" not in out
    rc, out, err = run(capsys, "export", "--csv")
    rows = list(csv.DictReader(io.StringIO(out)))
    assert rc == 1 and [r["seq"] for r in rows] == ["1", "3"] and f"{LOG} line 2:" in err


# ------------------------------------------------------------------ 3: one damaged line, the rest shown


DAMAGES = {
    "time beyond the calendar": lambda o: (o.__setitem__("utc", "9999-12-31T23:59:59.000+00:00"),
                                           o.__setitem__("ship_clock", "+14:00")),
    "summary field of the wrong type": lambda o: o["summary"].__setitem__("criteria_sets", 5),
}


@pytest.mark.parametrize("damage", DAMAGES)
def test_one_damaged_line_is_named_and_the_rest_still_shown(logdir, capsys, damage):
    record(3)
    edit(logdir, 1, DAMAGES[damage], rechain=False)
    rc, out, err = run(capsys, "show")
    assert rc == 1 and "internal error" not in out + err
    assert f"DAMAGED {LOG} line 2:" in out
    assert [ln.split()[0] for ln in out.splitlines() if "condition recorded: Departure" in ln] == ["1", "3"]
    for fmt in ("--csv", "--html"):
        rc, out, err = run(capsys, "export", fmt)
        assert rc == 1 and "internal error" not in err and f"{LOG} line 2:" in err
    assert f"{LOG} line 2:" in out  # (the HTML names it below the table too)


class Host(App):
    def __init__(self, book):
        super().__init__()
        self.book = book

    def on_mount(self):
        self.push_screen(LogScreen(self.book))


@pytest.mark.parametrize("damage", DAMAGES)
async def test_the_log_view_shows_a_damaged_line_and_stays_open(logdir, capsys, damage):
    record(3)
    edit(logdir, 1, DAMAGES[damage], rechain=True)
    with Logbook.open(logdir, "Demo Islander", readonly=True) as book:
        app = Host(book)
        async with app.run_test(size=(160, 50)) as pilot:
            await pilot.pause()
            screen = app.screen
            assert isinstance(screen, LogScreen)
            status = str(screen.query_one("#log-status").render())
            assert f"{LOG}: line 2 damaged" in status
            await pilot.press("up", "enter")
            await pilot.pause()
        assert app.return_code in (None, 0) and getattr(app, "_exception", None) is None


# ------------------------------------------------------------------ 4: recording into another vessel's log


def test_recording_refuses_a_log_whose_entries_are_another_vessels(logdir, capsys):
    with Logbook.open(logdir, "Demo Trawler") as book:
        book.append(kind="remark", by="JM", change_text="signed on", change_data={}, result=None, condition=None)
    for suffix in (".log.jsonl", ".log.head.json"):
        (logdir / f"demo-trawler{suffix}").rename(logdir / f"demo-islander{suffix}")
    before = (logdir / LOG).read_bytes()
    rc = main(["log", "record", "demo", "departure", "--by", "JM"])
    err = capsys.readouterr().err
    assert rc == 1 and LOG in err and "'Demo Trawler'" in err and "'Demo Islander'" in err
    assert (logdir / LOG).read_bytes() == before


# ------------------------------------------------------------------ 5: line feeds in a remark


def test_a_remark_with_line_feeds_is_joined_and_a_stored_one_never_printed_raw(logdir, capsys):
    fake_row = "   9  2026-12-01 00:00:00  00:00  XX    condition    9.999  met A2.2 A2.3   forged"
    record(1, "--remark", "first line\n" + fake_row)
    with Logbook.open(logdir, "Demo Islander", readonly=True) as book:
        assert book.entries()[0].remark == "first line " + fake_row.strip()
    # a line feed that got into the log some other way (an older deckload, an editor)
    with Logbook.open(logdir, "Demo Islander") as book:
        book.append(kind="remark", by="JM", change_text="noted", change_data={}, result=None, condition=None,
                    remark="ok\n" + fake_row + "\tend")
    rc, out, _ = run(capsys, "show")
    assert rc == 0 and not any(ln.lstrip().startswith("9  2026") for ln in out.splitlines())
    assert "ok\\n   9  2026" in out and "\\tend" in out


# ------------------------------------------------------------------ 6: a broken pipe after recording


class ClosedPipe(io.StringIO):
    def write(self, s):
        raise BrokenPipeError(32, "Broken pipe")


def test_a_broken_pipe_after_recording_says_the_entry_was_recorded(logdir, capsys, monkeypatch):
    monkeypatch.setattr(sys, "stdout", ClosedPipe())
    rc = main(["log", "record", "demo", "departure", "--by", "JM"])
    err = capsys.readouterr().err
    with Logbook.open(logdir, "Demo Islander", readonly=True) as book:
        assert len(book.entries()) == 1
    assert "nothing was recorded" not in err and "entry #1 was recorded" in err and rc == 0


def test_a_broken_pipe_while_verifying_says_the_output_was_cut_short(logdir, capsys, monkeypatch):
    record(1)
    monkeypatch.setattr(sys, "stdout", ClosedPipe())
    rc = main(["log", "verify"])
    err = capsys.readouterr().err
    assert rc == 2 and "output cut short" in err and str(logdir) not in err


# ------------------------------------------------------------------ 7: one line is one line


@pytest.mark.parametrize("fourth", ["readable", "unreadable"])
def test_a_head_record_one_behind_words_one_line(logdir, capsys, fourth):
    record(4)
    ls = lines(logdir)
    (logdir / HEAD).write_text(json.dumps({"format": "deckload-log-head-1", "seq": 3,
                                           "sha256": hashlib.sha256(ls[2]).hexdigest()}) + "\n")
    if fourth == "unreadable":
        rewrite(logdir, ls[:3] + [ls[3][:-9]], rechain=False)
    rc, out, _ = run(capsys, "verify")
    assert "4–4" not in out
    if fourth == "readable":
        assert rc == 0 and "line 4 chains correctly from it" in out
    else:
        assert rc == 1 and "line 4: not valid JSON" in out and "chains correctly" not in out


async def test_the_log_view_stays_open_on_a_duplicated_line(logdir):
    """Two lines with one entry number (a copied line) are two rows: the table's row keys are
    not the entries' numbers, which a copied line repeats."""
    record(2)
    rewrite(logdir, lines(logdir) + lines(logdir)[-1:], rechain=False)
    with Logbook.open(logdir, "Demo Islander", readonly=True) as book:
        app = Host(book)
        async with app.run_test(size=(160, 50)) as pilot:
            await pilot.pause()
            assert isinstance(app.screen, LogScreen) and len(app.screen.shown) == 3
            assert "CHAIN BROKEN" in str(app.screen.query_one("#log-status").render())


async def test_an_entry_the_view_cannot_format_is_shown_as_damaged(logdir):
    """Belt and braces behind the reader: an entry whose summary could not be worded (here a set
    list and warnings that are numbers, built past the reader) is a 'damaged' row, the view stays open."""
    import dataclasses

    record(2)

    class Bent(Logbook):
        def entries(self):
            es = super().entries()
            return [es[0], dataclasses.replace(es[1], summary={**es[1].summary, "criteria_sets": 5, "warnings": 5})]

    book = Bent._open(logdir, "demo-islander", "Demo Islander", readonly=True)
    try:
        app = Host(book)
        async with app.run_test(size=(160, 50)) as pilot:
            await pilot.pause()
            assert isinstance(app.screen, LogScreen)
            table = app.screen.query_one("#log-table")
            assert "line 2 damaged" in " ".join(str(c) for c in table.get_row_at(1))
            await pilot.press("enter")
            await pilot.pause()
            summary = app.screen.query_one("#log-entry-summary")
            assert "is damaged and cannot be shown" in str(summary.render()), (type(app.screen), summary.render())
    finally:
        book.close()
