"""The command line names what exists: conditions by short name, `working`, clear errors, --version."""

from __future__ import annotations

import pytest

from deckload import __version__
from deckload.io import paths
from deckload.cli.main import main


@pytest.fixture(autouse=True)
def logs(tmp_path, monkeypatch):
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path / "logs"))
    return tmp_path / "logs"


def test_open_a_missing_profile_names_it_without_a_raw_errno(capsys, monkeypatch):
    monkeypatch.setattr("deckload.ui.launch.no_terminal", lambda: None)  # as on a terminal (checked first)
    assert main(["open", "nosuch"]) == 2
    err = capsys.readouterr().err
    assert "cannot read the profile nosuch" in err and "Errno" not in err and "demo" in err


def test_a_condition_that_matches_nothing_lists_the_vessels_conditions(capsys):
    assert main(["report", "demo", "nosuch", "--txt"]) == 2
    err = capsys.readouterr().err
    assert "'nosuch'" in err
    for key in paths.DEMO_CONDITIONS:
        assert key in err


def test_a_stock_condition_by_its_name_in_any_case(capsys):
    assert main(["calc", "demo", "Departure"]) == 0
    assert "Departure, full stores" in capsys.readouterr().out


def test_working_is_the_loading_screens_condition(logs, capsys):
    assert main(["calc", "demo", "working"]) == 2
    err = capsys.readouterr().err
    # when it comes to be: the screen writes it at its first change, not on opening (a trial read
    # 'open the loading screen once' with the screen open and unchanged)
    assert "no working condition yet" in err and "the loading screen writes it at its first change" in err
    w = paths.working_file(logs / "working", "Demo Islander")
    w.parent.mkdir(parents=True)
    w.write_text(paths.DEMO_CONDITIONS["light"].read_text(encoding="utf-8"), encoding="utf-8")
    assert main(["report", "demo", "working", "--txt"]) == 0
    out = capsys.readouterr().out
    assert "Condition: Light, to the repair yard" in out and w.name in out


def test_version(capsys):
    with pytest.raises(SystemExit) as e:
        main(["--version"])
    assert e.value.code == 0 and capsys.readouterr().out.strip() == f"deckload {__version__}"


def test_a_command_parsed_alone_reads_and_reports_as_with_every_command_declared(capsys):
    """`deckload calc ...` declares only the calc sub-command (start-up time): the same commands
    exist, and each one's help, and its errors, read the same as with every command declared."""
    from deckload.cli.main import COMMANDS, _parser

    full = _parser()
    declared = next(a for a in full._actions if a.dest == "command").choices
    assert tuple(declared) == COMMANDS
    for name in COMMANDS:
        alone = _parser(name)
        assert tuple(next(a for a in alone._actions if a.dest == "command").choices) == (name,)
        for argv in ([name, "--help"], [name, "--no-such-option"], [name], [name, "demo", "departure"]):
            said = []
            for parser in (full, alone):
                try:
                    got = ("parsed", vars(parser.parse_args(argv)))
                except SystemExit as stop:
                    got = ("exit", stop.code)
                out = capsys.readouterr()
                said.append((got, out.out, out.err))
            assert said[0] == said[1], (argv, said)
