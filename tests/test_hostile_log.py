"""The voyage log under tampering and faults (issue 12, cases 7 and 10).

Held inputs: the head file deleted (alone, and with the newest entry removed or edited), the
log deleted with its head kept, a paper copy's anchor checked against the log, a full disk
while recording, and a read-only working folder on the loading screen.
"""

from __future__ import annotations

import errno
import json
import os

import pytest

from deckload.cli.main import main
from deckload.logbook import Logbook
from demo_vessels import demo_vessel


@pytest.fixture
def logdir(tmp_path, monkeypatch):
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path / "logs"))
    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path / "home"))
    return tmp_path / "logs"


def record(n: int = 1) -> None:
    for _ in range(n):
        assert main(["log", "record", "demo", "departure", "--by", "JM"]) == 0


def files(logdir):
    return logdir / "demo-islander.log.jsonl", logdir / "demo-islander.log.head.json"


# ------------------------------------------------------------------ case 7: tampering with the head or the log


def test_a_new_log_has_its_head_record_from_the_start(logdir):
    with Logbook.open(logdir, "Demo Islander"):
        pass
    log, head = files(logdir)
    assert log.read_bytes() == b"" and json.loads(head.read_text())["seq"] == 0


@pytest.mark.parametrize("also", ["nothing", "remove newest", "edit newest"])
def test_a_deleted_head_record_is_tampering_and_blocks_recording(logdir, capsys, also):
    record(3)
    log, head = files(logdir)
    head.unlink()
    lines = log.read_bytes().splitlines(keepends=True)
    if also == "remove newest":
        log.write_bytes(b"".join(lines[:-1]))
    elif also == "edit newest":
        log.write_bytes(b"".join(lines[:-1]) + lines[-1].replace(b'"JM"', b'"XX"'))
    capsys.readouterr()
    assert main(["log", "verify"]) == 1
    assert "head record: missing" in capsys.readouterr().out
    # and the number of the removed entry is not reused: nothing is written at all
    before = log.read_bytes()
    assert main(["log", "record", "demo", "departure", "--by", "JM"]) == 1
    assert "head record is missing" in capsys.readouterr().err and log.read_bytes() == before


def test_a_deleted_log_with_its_head_kept_is_tampering(logdir, capsys):
    record(2)
    log, head = files(logdir)
    log.unlink()
    capsys.readouterr()
    assert main(["log", "verify"]) == 1
    out = capsys.readouterr().out
    assert "missing, but its head record" in out and "#2" in out
    assert main(["log", "record", "demo", "departure", "--by", "JM"]) == 1


def test_a_paper_copys_anchor_is_checked(logdir, capsys, tmp_path):
    record(2)
    assert main(["report", "demo", "departure", "--txt"]) == 0
    report = capsys.readouterr().out
    log, _ = files(logdir)
    newest = json.loads(log.read_bytes().splitlines()[-1])
    import hashlib

    sha = hashlib.sha256(log.read_bytes().splitlines()[-1]).hexdigest()
    assert f"voyage log at entry #{newest['seq']}, SHA-256 {sha[:16]}" in report
    assert main(["log", "verify", "--against", sha[:16]]) == 0
    assert "found" in capsys.readouterr().out
    assert main(["log", "verify", "--against", f"2:{sha}"]) == 0
    # the CSV export's last row is the anchor too
    assert main(["log", "export", "--csv"]) == 0
    last = capsys.readouterr().out.strip().splitlines()[-1]
    assert last.startswith("2,") and last.endswith(sha)
    # the log rewritten from scratch with the same content (new times): the anchor is gone
    log.unlink()
    files(logdir)[1].unlink()
    record(2)
    capsys.readouterr()
    assert main(["log", "verify", "--against", sha[:16]]) == 1
    assert "NOT FOUND" in capsys.readouterr().out
    assert main(["log", "verify", "--against", "not-a-hash"]) == 1


# ------------------------------------------------------------------ case 10: full disk, read-only folders


def test_a_full_disk_while_recording_names_the_file_and_says_nothing_was_recorded(logdir, capsys, monkeypatch):
    import deckload.logbook

    record(1)
    log, _ = files(logdir)
    before = log.read_bytes()

    def full(fd, data):
        os.write(fd, data[:10])
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))

    monkeypatch.setattr(deckload.logbook.storage, "_write_all", full)
    capsys.readouterr()
    assert main(["log", "record", "demo", "departure", "--by", "JM"]) == 2
    err = capsys.readouterr().err
    assert str(log) in err and "No space left on device" in err and "nothing was recorded" in err
    assert log.read_bytes() == before


def test_a_log_folder_that_cannot_be_made_names_it(tmp_path, capsys, monkeypatch):
    """A folder that cannot be created (here its parent is a file, which fails even for root,
    unlike permissions): the message names it and says nothing was recorded."""
    blocker = tmp_path / "not-a-folder"
    blocker.write_text("")
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(blocker / "logs"))
    assert main(["log", "record", "demo", "departure", "--by", "JM"]) == 2
    err = capsys.readouterr().err
    assert str(blocker / "logs") in err and "nothing was recorded" in err


async def test_the_status_line_never_says_saved_when_the_save_failed(tmp_path, monkeypatch):
    """The working condition's save fails (disk full): the message line says NOT SAVED, and why.

    The reason comes before the file's path, so that a long path (here over 100 characters) at
    80 columns cuts the path, never the reason."""
    from pathlib import Path

    from deckload.io import paths
    from deckload.io.profiles import load_condition
    from deckload.ui.launch import create_app

    vessel = demo_vessel()
    work = tmp_path / ("working-conditions-" * 5)
    app = create_app(vessel, load_condition(paths.DEMO_CONDITIONS["departure"], vessel), work_dir=work,
                     log_dir=None)

    def full(path, condition):
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC), str(path))

    app.session._save = full
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.press("plus")
        await pilot.pause(0.3)
        app.session.flush()
        await pilot.pause(0.3)
        text = " ".join(t.plain for t in app.loading_screen.query_one("#status").lines)
        assert "NOT SAVED" in text and "No space left on device" in text


def test_a_head_record_write_killed_before_its_rename_leaves_no_temp_file(tmp_path):
    """A kill between writing the head's temporary copy and renaming it: cleaned at the next open."""
    with Logbook.open(tmp_path, "Demo Islander") as book:
        head = book.head_path
    left = tmp_path / f".{head.name}.k1ll3d.tmp"
    left.write_text('{"format": "deckload-log-head-1", "seq": 9')
    other = tmp_path / ".someone-elses.toml.abc.tmp"
    other.write_text("x")
    with Logbook.open(tmp_path, "Demo Islander"):
        pass
    assert not left.exists() and other.exists()
