"""The plausibility audit's warnings on a profile reach every printout of its results.

A warning is a doubt about a booklet value that is possible but unusual (a lightship KG below
0.3 × the depth, a KMt above what the waterplane allows ...).  ``deckload check`` listed them and
the loading screen showed them once when it opened; ``calc``, ``report``, ``marks``, ``log record``
and a report printed from the screen computed and printed with no word of them, so a decimal slip
in the lightship KG (2.95 typed 0.295: GM 1.6 m too high) reached a signed printout as "Met".
Now each carries them: before the verdict in ``calc`` and the report, as a list in ``calc --json``,
on stderr for ``marks`` and ``log record``.  The doubt used here: the demo's lightship KG typed as
1.2 m for 3.8 m, below 0.3 × her 4.5 m depth (deckload.core.audit's own rule, common practice).
"""

from __future__ import annotations

import json
import re

import pytest

from deckload.cli.main import main
from demo_vessels import copy_of_demo

DOUBT = "lightship.vcg_m = 1.2 m above keel: below 0.3 × the depth"


@pytest.fixture
def doubted(tmp_path, monkeypatch):
    monkeypatch.setenv("DECKLOAD_LOG_DIR", str(tmp_path / "logs"))
    profile = copy_of_demo(tmp_path / "v", "demo_islander")
    text = profile.read_text(encoding="utf-8")
    assert "\nvcg_m = 3.8\n" in text  # the premise: the lightship's KG as the demo has it
    profile.write_text(text.replace("\nvcg_m = 3.8\n", "\nvcg_m = 1.2\n", 1), encoding="utf-8")
    return profile, profile.parent / "demo_islander.departure.condition.toml"


def test_calc_prints_the_doubt_before_the_verdict(doubted, capsys):
    profile, cond = doubted
    assert main(["check", str(profile)]) == 0 and DOUBT in capsys.readouterr().out  # a warning, not an error
    assert main(["calc", str(profile), str(cond)]) == 0
    out = capsys.readouterr().out
    assert "Profile plausibility audit: 1 warning" in out and DOUBT in out
    assert out.index(DOUBT) < out.index("Met: ")  # read before the verdict it may undo


def test_calc_json_lists_the_doubts_and_a_clean_profile_none(doubted, capsys):
    profile, cond = doubted
    assert main(["calc", "--json", str(profile), str(cond)]) == 0
    assert any(d.startswith(DOUBT) for d in json.loads(capsys.readouterr().out)["profile_audit_warnings"])
    assert main(["calc", "--json", "demo", "departure"]) == 0
    assert json.loads(capsys.readouterr().out)["profile_audit_warnings"] == []


@pytest.mark.parametrize("form", ["--txt", "--html"])
def test_the_report_carries_the_doubt(doubted, capsys, form):
    profile, cond = doubted
    assert main(["report", form, str(profile), str(cond)]) == 0
    out = re.sub(r"\s+", " ", capsys.readouterr().out)
    assert DOUBT in out and out.index(DOUBT) < out.index("Verdict: ")
    assert main(["report", form, "demo", "departure"]) == 0
    assert "plausibility audit" not in capsys.readouterr().out


def test_marks_and_log_record_say_it_on_stderr(doubted, capsys):
    profile, cond = doubted
    assert main(["marks", str(profile), str(cond)]) == 0
    assert DOUBT in capsys.readouterr().err
    assert main(["log", "record", str(profile), str(cond), "--by", "AB"]) == 0
    assert DOUBT in capsys.readouterr().err


def test_a_report_printed_from_the_screen_carries_the_doubt(doubted, tmp_path):
    from deckload.ui.conditions import print_session
    from deckload.ui.launch import create_app, load_inputs

    profile, cond = doubted
    start = load_inputs(profile, cond, tmp_path / "work")
    assert any(d.startswith(DOUBT) for d in start.doubts)
    app = create_app(start.vessel, start.condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs",
                     profile_path=profile, result=start.result, doubts=start.doubts)
    printed = print_session(app.session)
    assert DOUBT in re.sub(r"\s+", " ", printed.text_path.read_text(encoding="utf-8"))
