"""Command-line arguments refused where they are read, naming the argument, exit 2 (deckload/cli/main.py
``_path``/``_text``): an empty file name, a name too long for any file system, bytes that are not text."""

from __future__ import annotations

import pytest

from deckload.cli.main import main


@pytest.fixture(autouse=True)
def folders(tmp_path, monkeypatch):
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path / "logs"))
    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path / "home"))


def refused(argv: list[str], capsys) -> str:
    capsys.readouterr()
    with pytest.raises(SystemExit) as e:
        main(argv)
    assert e.value.code == 2
    err = capsys.readouterr().err
    assert "internal error" not in err and "Traceback" not in err
    return err


def test_a_condition_name_too_long_for_a_file_is_refused_naming_it(capsys):
    """Before: ``calc demo xxx…`` (300 characters) was 'internal error … OSError', exit 3
    (Path.exists raised ENAMETOOLONG in the lookup by name)."""
    long = "x" * 300
    for argv in (["calc", "demo", long], ["calc", long, "departure"], ["report", "demo", "departure", "-o", long],
                 ["marks", "demo", long]):
        err = refused(argv, capsys)
        assert "file name too long (" in err and "argument " in err, argv


def test_the_lookup_by_name_takes_a_long_name_for_a_name(tmp_path):
    """condition_files.resolve itself: a name too long for a file is looked up as a condition's name."""
    from pathlib import Path

    from deckload.io.condition_files import ConditionNotFound, resolve
    from deckload.io.paths import DEMO_PROFILE

    with pytest.raises(ConditionNotFound, match="no condition file or condition named"):
        resolve(Path(DEMO_PROFILE), "y" * 300, "Demo Islander", tmp_path)


@pytest.mark.parametrize("argv", [["report", "demo", "departure", "-o", ""], ["log", "export", "--csv", "-o", ""],
                                  ["csv", "demo", ""], ["calc", "demo", ""], ["tables", ""]])
def test_an_empty_file_name_is_refused(argv, capsys):
    """Before: ``report -o ""`` said 'cannot write .: Device or resource busy' (Path("") is the current
    folder)."""
    err = refused(argv, capsys)
    assert "an empty file name" in err


def test_an_argument_that_is_not_text_is_refused_naming_it(tmp_path, capsys):
    """Before: ``log record --remark $'caf\\xe9'`` in a UTF-8 terminal said "cannot record: 'utf-8' codec
    can't encode character '\\udce9' … surrogates not allowed", naming no argument; a condition file so
    named made the report an internal error."""
    remark = b"caf\xe9".decode("utf-8", "surrogateescape")  # what Python makes of those argv bytes
    err = refused(["log", "record", "demo", "departure", "--by", "JM", "--remark", remark], capsys)
    assert "argument --remark:" in err and "'caf\\xe9'" in err and "(byte 0xE9)" in err
    assert not (tmp_path / "logs").exists() or not any((tmp_path / "logs").glob("*.jsonl"))
    name = b"dep\xe9.toml".decode("utf-8", "surrogateescape")
    err = refused(["report", "demo", name, "-o", str(tmp_path / "r.html")], capsys)
    assert "argument condition:" in err and "rename the file" in err
    err = refused(["log", "show", "--vessel", remark], capsys)
    assert "argument --vessel:" in err
