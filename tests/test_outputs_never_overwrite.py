"""No output named on a command line replaces a file deckload reads or keeps (deckload/io/outputs.py).

Every command that writes a user-named file is held to it: ``log export -o``, ``report -o``,
``csv PROFILE FOLDER`` and ``tables -o`` (and the ``.bak`` it keeps).  Each target below is
the file itself, a symbolic link to it, a hard link to it or another spelling of its path; the
command must exit 1 (bad input), name the path, write nothing, and leave every byte as it was.
"""

from __future__ import annotations

import hashlib
import os
from pathlib import Path

import pytest

from deckload.cli.main import main
from demo_vessels import copy_of_demo


@pytest.fixture
def logdir(tmp_path, monkeypatch):
    d = tmp_path / "logs"
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(d))
    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path / "home"))
    return d


@pytest.fixture
def trawler(tmp_path) -> Path:
    """A copy of the demo trawler (profile, CSV tables, stock conditions) in a folder of its own."""
    return copy_of_demo(tmp_path / "vp", "demo_trawler")


@pytest.fixture
def islander(tmp_path) -> Path:
    """A copy of the demo islander with her hull geometry file and stock conditions."""
    return copy_of_demo(tmp_path / "vi", "demo_islander")


def snapshot(*folders: Path) -> dict[str, str]:
    """SHA-256 of every file under the folders (symbolic links as their target's name)."""
    out = {}
    for folder in folders:
        for p in sorted(folder.rglob("*")):
            if p.is_symlink():
                out[str(p)] = "-> " + os.readlink(p)
            elif p.is_file():
                out[str(p)] = hashlib.sha256(p.read_bytes()).hexdigest()
    return out


def record(logdir: Path) -> Path:
    assert main(["log", "--dir", str(logdir), "record", "demo", "departure", "--by", "JM"]) == 0
    return logdir / "demo-islander.log.jsonl"


def refused(capsys, shown: str) -> str:
    err = capsys.readouterr().err
    assert shown in err and "writing there would" in err, err
    return err


# ------------------------------------------------------------------ log export


@pytest.mark.parametrize("fmt", ["--csv", "--html"])
@pytest.mark.parametrize("target", ["log", "head", "lock", "symlink", "hardlink", "dotted", "new-vessel-log"])
def test_log_export_never_replaces_a_file_of_the_log(tmp_path, logdir, capsys, target, fmt):
    """Before: ``log export --csv -o logs/demo-islander.log.jsonl`` exited 0 and the hash-chained
    log was the CSV."""
    log = record(logdir)
    capsys.readouterr()
    out = {
        "log": log,
        "head": logdir / "demo-islander.log.head.json",
        "lock": logdir / "demo-islander.log.lock",
        "symlink": tmp_path / "link.csv",
        "hardlink": tmp_path / "hard.csv",
        "dotted": logdir / ".." / "logs" / "demo-islander.log.jsonl",
        "new-vessel-log": logdir / "demo-trawler.log.jsonl",  # not there yet: it would be a log that is not one
    }[target]
    if target == "symlink":
        out.symlink_to(log)
    if target == "hardlink":
        os.link(log, out)
    before = snapshot(logdir)
    assert main(["log", "--dir", str(logdir), "export", fmt, "-o", str(out)]) == 1
    refused(capsys, str(out))
    assert snapshot(logdir) == before
    assert not (logdir / "demo-trawler.log.jsonl").exists()
    assert main(["log", "--dir", str(logdir), "verify"]) == 0


def test_log_export_refuses_the_log_of_the_folder_in_use_when_another_is_given(tmp_path, logdir, capsys):
    """The log folder in use (DECKLOAD_LOG_DIR) is kept whichever folder ``--dir`` reads; a new file
    beside the log is written as ever."""
    log = record(logdir)
    other = tmp_path / "other-logs"
    other.mkdir()
    before = snapshot(logdir)
    assert main(["log", "--dir", str(other), "export", "--csv", "-o", str(log)]) == 1
    refused(capsys, str(log))
    assert snapshot(logdir) == before
    out = logdir / "export.csv"
    assert main(["log", "--dir", str(logdir), "export", "--csv", "-o", str(out)]) == 0
    assert out.read_text(encoding="utf-8").startswith("seq,utc,")
    assert main(["log", "--dir", str(logdir), "verify"]) == 0


# ------------------------------------------------------------------ report


@pytest.mark.parametrize("target", ["profile", "profile-dotted", "condition", "stock-condition", "csv-table",
                                    "csv-symlink", "csv-hardlink", "log", "log-head"])
def test_report_never_replaces_an_input_or_the_log(tmp_path, logdir, trawler, capsys, target):
    """Before: ``report PROFILE CONDITION -o`` wrote the report over whichever of these it was given."""
    record(logdir)
    vp = trawler.parent
    cond = vp / "demo_trawler.grounds.condition.toml"
    out = {
        "profile": trawler,
        "profile-dotted": vp / ".." / vp.name / trawler.name,
        "condition": cond,
        "stock-condition": vp / "demo_trawler.arrival.condition.toml",  # beside the profile, not the one read
        "csv-table": vp / "demo_trawler" / "kn.csv",
        "csv-symlink": tmp_path / "report-link.html",
        "csv-hardlink": tmp_path / "report-hard.html",
        "log": logdir / "demo-islander.log.jsonl",
        "log-head": logdir / "demo-islander.log.head.json",
    }[target]
    if target == "csv-symlink":
        out.symlink_to(vp / "demo_trawler" / "tanks" / "FO1P.csv")
    if target == "csv-hardlink":
        os.link(vp / "demo_trawler" / "hydrostatics.csv", out)
    before = snapshot(vp, logdir)
    capsys.readouterr()
    assert main(["report", str(trawler), str(cond), "--txt", "-o", str(out)]) == 1
    refused(capsys, str(out))
    assert snapshot(vp, logdir) == before


def test_report_never_replaces_the_hull_geometry_file_the_profile_reads(islander, logdir, capsys):
    geometry = islander.parent / "demo_islander.geometry.toml"
    before = snapshot(islander.parent)
    assert main(["report", str(islander), "departure", "--txt", "-o", str(geometry)]) == 1
    refused(capsys, str(geometry))
    assert snapshot(islander.parent) == before
    out = islander.parent / "departure-report.txt"  # a new file beside them is written as ever
    assert main(["report", str(islander), "departure", "--txt", "-o", str(out)]) == 0
    assert "Demo Islander" in out.read_text(encoding="utf-8")


# ------------------------------------------------------------------ csv


@pytest.mark.parametrize("how", ["the-folder", "a-symlink-to-it", "dotted"])
def test_csv_into_the_profiles_own_table_folder_is_refused_before_any_file_is_written(tmp_path, trawler, logdir,
                                                                                      capsys, how):
    """Before: the booklet CSVs the profile reads came back rewritten ("1.60" → "1.6",
    121.7123456789 → 121.7123457), the values as typed lost."""
    tables = trawler.parent / "demo_trawler"
    folder = {"the-folder": tables, "dotted": tables / "tanks" / "..", "a-symlink-to-it": tmp_path / "tables-link"}[how]
    if how == "a-symlink-to-it":
        folder.symlink_to(tables, target_is_directory=True)
    before = snapshot(trawler.parent)
    assert main(["csv", str(trawler), str(folder)]) == 1
    err = refused(capsys, "hydrostatics.csv")
    assert "no table written" in err and "another folder" in err
    assert snapshot(trawler.parent) == before  # no file changed, and none added
    # The tank tables live in tanks/ as FO1P.csv …; deckload csv names them tank_FO1P.csv: new files
    # beside the inputs, none of them one, are written.
    tanks = trawler.parent / "demo_trawler" / "tanks"
    assert main(["csv", str(trawler), str(tanks)]) == 0
    after = snapshot(trawler.parent)
    assert {k: v for k, v in after.items() if k in before} == before
    assert (tanks / "tank_FO1P.csv").is_file()


def test_csv_never_writes_over_a_file_of_the_log(tmp_path, trawler, logdir, capsys):
    """A CSV the command writes, linked to the log, is refused as the log's own file."""
    log = record(logdir)
    out = tmp_path / "out"
    out.mkdir()
    (out / "hydrostatics.csv").symlink_to(log)
    before = snapshot(logdir)
    assert main(["csv", str(trawler), str(out)]) == 1
    refused(capsys, "hydrostatics.csv")
    assert snapshot(logdir) == before


# ------------------------------------------------------------------ tables


@pytest.fixture
def no_computing(monkeypatch):
    """The refusal must come before the tables are computed (seconds of work): computing fails the test."""
    import deckload.cli.tables as tables_cli

    def computed(*args, **kwargs):
        raise AssertionError("the tables were computed: the output was not refused first")

    monkeypatch.setattr(tables_cli, "build_tables", computed)


def test_tables_never_writes_the_profile_over_its_geometry(islander, logdir, capsys, no_computing):
    geometry = islander.parent / "demo_islander.geometry.toml"
    before = snapshot(islander.parent)
    assert main(["tables", str(geometry), "-o", str(geometry)]) == 1
    refused(capsys, str(geometry))
    assert snapshot(islander.parent) == before


def test_tables_never_writes_the_profile_over_the_logs_lock(islander, logdir, capsys, no_computing):
    """The lock file is empty: it read as an (empty) TOML profile and would have been replaced."""
    record(logdir)
    lock = logdir / "demo-islander.log.lock"
    before = snapshot(logdir)
    assert main(["tables", str(islander.parent / "demo_islander.geometry.toml"), "-o", str(lock)]) == 1
    refused(capsys, str(lock))
    assert snapshot(logdir) == before


def test_tables_never_copies_the_old_profile_into_a_log_through_its_bak(tmp_path, islander, logdir, capsys,
                                                                         no_computing):
    """A profile with comments is first copied to PROFILE.bak: a .bak linked to the log would have
    had the profile copied into the log."""
    log = record(logdir)
    (islander.parent / "demo_islander.toml.bak").symlink_to(log)
    islander.write_text("# kept by hand\n" + islander.read_text(encoding="utf-8"), encoding="utf-8")
    before = snapshot(logdir)
    assert main(["tables", str(islander.parent / "demo_islander.geometry.toml"), "-o", str(islander)]) == 1
    refused(capsys, "demo_islander.toml.bak")
    assert snapshot(logdir) == before


# ------------------------------------------------------------------ the helper itself


def test_a_hard_link_a_symbolic_link_and_another_spelling_are_the_same_file(tmp_path, logdir):
    from deckload.io.outputs import OutputRefused, refuse_overwrite

    src = tmp_path / "table.csv"
    src.write_text("a,b\n1,2\n", encoding="utf-8")
    os.link(src, tmp_path / "hard.csv")
    (tmp_path / "soft.csv").symlink_to(src)
    (tmp_path / "sub").mkdir()
    for out in ("hard.csv", "soft.csv", "sub/../table.csv", "table.csv"):
        with pytest.raises(OutputRefused, match="a table read"):
            refuse_overwrite(tmp_path / out, [(src, "a table read")])
    refuse_overwrite(tmp_path / "other.csv", [(src, "a table read")])  # another file: nothing to refuse


# ------------------------------------------------------------------ wherever the log is; what is not a file


def test_report_never_replaces_a_voyage_log_kept_in_another_folder(tmp_path, logdir, capsys):
    """Before: ``report -o`` on the log of a folder named with ``log --dir`` (not the folder in use)
    printed 'report written to …/demo-islander.log.jsonl', exit 0, and the log was HTML.  A log is
    refused by its name anywhere, and by its first line (a log record) under any name."""
    ship_logs = tmp_path / "ship_logs"
    log = record(ship_logs)
    copy = tmp_path / "evidence.txt"
    copy.write_bytes(log.read_bytes())
    head = ship_logs / "demo-islander.log.head.json"
    head_copy = tmp_path / "head-kept.json"
    head_copy.write_bytes(head.read_bytes())
    before = snapshot(ship_logs) | {str(copy): copy.read_bytes().hex(), str(head_copy): head_copy.read_bytes().hex()}
    for out in (log, head, copy, head_copy):
        capsys.readouterr()
        assert main(["report", "demo", "departure", "--txt", "-o", str(out)]) == 1
        refused(capsys, str(out))
        assert main(["log", "--dir", str(logdir), "export", "--csv", "-o", str(out)]) == 1
        refused(capsys, str(out))
    assert snapshot(ship_logs) | {str(copy): copy.read_bytes().hex(), str(head_copy): head_copy.read_bytes().hex()} == before
    assert main(["log", "--dir", str(ship_logs), "verify"]) == 0
    plain = tmp_path / "report.txt"  # an ordinary file is written over as ever
    plain.write_text("an older report\n", encoding="utf-8")
    assert main(["report", "demo", "departure", "--txt", "-o", str(plain)]) == 0
    assert "Demo Islander" in plain.read_text(encoding="utf-8")


def test_the_log_format_pattern_is_the_logbooks():
    """outputs.LOG_FORMAT recognises what the logbook writes (io cannot import the logbook)."""
    from deckload.io.outputs import LOG_FORMAT
    from deckload.logbook.records import FORMAT
    from deckload.logbook.storage import HEAD_FORMAT

    assert LOG_FORMAT.fullmatch(FORMAT) and LOG_FORMAT.fullmatch(HEAD_FORMAT)


def test_no_command_puts_a_regular_file_in_the_place_of_a_pipe(tmp_path, logdir, trawler, islander, capsys,
                                                                 monkeypatch):
    """Before: a named pipe given as the output (and, as root, a device node) was replaced by a
    regular file by the atomic save.  Each command refuses, exit 1, and the pipe is still a pipe."""
    import stat

    import deckload.cli.tables as tables_cli

    monkeypatch.setattr(tables_cli, "build_tables", lambda *a, **k: (_ for _ in ()).throw(AssertionError("computed")))
    record(logdir)
    fifo = tmp_path / "out.txt"
    os.mkfifo(fifo)
    folder = tmp_path / "csv-out"
    folder.mkdir()
    os.mkfifo(folder / "hydrostatics.csv")
    runs = [
        (["report", "demo", "departure", "--txt", "-o", str(fifo)], fifo),
        (["log", "--dir", str(logdir), "export", "--html", "-o", str(fifo)], fifo),
        (["tables", str(islander.parent / "demo_islander.geometry.toml"), "-o", str(fifo)], fifo),
        (["csv", str(trawler), str(folder)], folder / "hydrostatics.csv"),
    ]
    for argv, target in runs:
        capsys.readouterr()
        assert main(argv) == 1, argv
        err = refused(capsys, str(target))
        assert "is not a regular file but a pipe" in err
        assert stat.S_ISFIFO(os.stat(target).st_mode)
    assert sorted(p.name for p in folder.iterdir()) == ["hydrostatics.csv"]


# ------------------------------------------------------------------ tables -o on a full disk


def _full_disk(monkeypatch):
    """Every write fills the disk half-way through and fails with ENOSPC: write_atomic's (its
    _write_all) and a plain copy's (shutil.copyfile truncates the target, then writes)."""
    import errno
    import shutil

    import deckload.io.atomicfile as atomicfile

    def write_half(fh, data):
        fh.write(data[: len(data) // 2])
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))

    def copy_half(src, dst, *a, **k):
        data = Path(src).read_bytes()
        Path(dst).write_bytes(data[: len(data) // 2])
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))

    monkeypatch.setattr(atomicfile, "_write_all", write_half)
    monkeypatch.setattr(shutil, "copyfile", copy_half)


def test_tables_on_a_full_disk_says_so_and_loses_neither_the_profile_nor_an_earlier_bak(islander, logdir, capsys,
                                                                                          monkeypatch):
    """Before: 'internal error … OSError', exit 3; the .bak copy (not atomic) had truncated the earlier
    .bak first, and left half a copy.  Now: 'cannot write FILE: No space left on device', exit 2, the
    profile and the earlier .bak as they were, no temporary file left."""
    import deckload.cli.tables as tables_cli

    profile = islander
    profile.write_text("# kept by hand\n" + profile.read_text(encoding="utf-8"), encoding="utf-8")
    bak = profile.with_name(profile.name + ".bak")
    bak.write_text("AN EARLIER BACKUP\n", encoding="utf-8")
    monkeypatch.setattr(tables_cli, "build_profile_text", lambda *a, **k: ('format = "deckload-profile-1"\n', []))
    before = snapshot(profile.parent)
    _full_disk(monkeypatch)
    capsys.readouterr()
    assert main(["tables", str(profile.parent / "demo_islander.geometry.toml"), "-o", str(profile)]) == 2
    err = capsys.readouterr().err
    assert f"cannot write {bak}: No space left on device" in err and "internal error" not in err
    assert snapshot(profile.parent) == before
    assert not [p for p in profile.parent.iterdir() if p.name.endswith(".tmp")]


def test_tables_on_a_full_disk_when_the_profile_itself_fails(islander, logdir, capsys, monkeypatch):
    """No comments, so no .bak: the profile's own write fails; exit 2 naming it, the profile intact."""
    import errno

    import deckload.cli.tables as tables_cli
    import deckload.io.atomicfile as atomicfile

    monkeypatch.setattr(tables_cli, "build_profile_text", lambda *a, **k: ('format = "deckload-profile-1"\n', []))
    profile = islander
    profile.write_text("\n".join(line for line in profile.read_text(encoding="utf-8").splitlines()
                                 if not line.lstrip().startswith("#")) + "\n", encoding="utf-8")
    before = snapshot(profile.parent)

    def read_only(fh, data):
        raise OSError(errno.EROFS, os.strerror(errno.EROFS))

    monkeypatch.setattr(atomicfile, "_write_all", read_only)
    capsys.readouterr()
    assert main(["tables", str(profile.parent / "demo_islander.geometry.toml"), "-o", str(profile)]) == 2
    assert f"cannot write {profile}: Read-only file system" in capsys.readouterr().err
    assert snapshot(profile.parent) == before
