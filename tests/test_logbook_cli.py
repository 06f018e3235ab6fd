"""``deckload log …`` and ``deckload report`` from the command line, on the demo vessel."""

from __future__ import annotations

import csv
import io
import json
import re
from pathlib import Path

import pytest

from deckload.cli.main import main
from deckload.core.stability import evaluate
from deckload.logbook import Logbook, condition_of
from deckload.io.paths import DEMO_PROFILE
from deckload.io.profiles import load_condition
from demo_vessels import demo_vessel

CONDITION = """\
format = "deckload-condition-1"

[condition]
name = "Departure, test"
remark = "outbound"
water_density_t_m3 = 1.025

[tanks.FO1P]
percent = 80.0

[tanks.FO1S]
percent = 80.0

[tanks.FW1P]
percent = 55.0

[holds.H1]
mass_t = 100.0
description = "General cargo"

[[constant]]
name = "Crew and effects"
mass_t = 1.2
lcg_m = 30.0
vcg_m = 6.0
tcg_m = 0.0
"""


@pytest.fixture(scope="module")
def demo():
    if not DEMO_PROFILE.exists():
        pytest.fail(f"the demo vessel {DEMO_PROFILE} is missing")
    return demo_vessel()


@pytest.fixture
def cond_file(tmp_path) -> Path:
    p = tmp_path / "dep.condition.toml"
    p.write_text(CONDITION, encoding="utf-8")
    return p


def record(tmp_path, cond_file, *extra) -> int:
    return main(["log", "--dir", str(tmp_path / "logs"), "record", str(DEMO_PROFILE), str(cond_file), *extra])


def test_record_writes_the_evaluated_condition(tmp_path, cond_file, demo, capsys):
    assert record(tmp_path, cond_file, "--by", "jm", "--remark", "sailing 0600", "--ship-offset", "+10:00") == 0
    out = capsys.readouterr().out
    assert "Recorded entry #1" in out and "never replaces" in out
    condition = load_condition(cond_file, demo)
    r = evaluate(demo, condition)
    with Logbook.open(tmp_path / "logs", "Demo Islander", readonly=True) as book:
        (e,) = book.entries()
    assert (e.by, e.kind, e.remark, e.ship_clock) == ("JM", "condition", "sailing 0600", "+10:00")
    assert e.summary["gm_fluid_m"] == r.gm_fluid_m and e.summary["displacement_t"] == r.displacement_t
    assert e.summary["criteria_pass"] == r.all_criteria_pass
    assert condition_of(e, demo) == condition  # the stored condition restores exactly
    assert f"GM fluid {r.gm_fluid_m:.3f} m" in out
    # the entry carries the verdict: the sets assessed, what was not assessed and why, the angles
    assert e.summary["criteria_sets"] == [{"id": a.id, "title": a.title, "pass": a.passed} for a in r.criteria_sets]
    assert e.summary["not_assessed"] == [{"item": n.item, "reason": n.reason, "applies": n.applies}
                                         for n in r.not_assessed]
    assert e.summary["verdict"] == r.verdict_text() and "damage stability" in e.summary["verdict"]
    assert e.summary["weather"]["lw1_m"] == r.weather.lw1_m and e.summary["freeboard_m"] == r.freeboard_m
    assert e.summary["load_line_margin_m"] == r.load_line_margin_m
    assert e.summary["deck_edge_angle_deg"] == r.deck_edge_angle_deg
    assert "all criteria met" not in out.lower()
    assert " ".join(r.verdict_text().split()) in " ".join(out.split())


def test_record_refuses_bad_initials_and_a_held_lock(tmp_path, cond_file, capsys):
    assert record(tmp_path, cond_file, "--by", "J2") == 1
    assert "1 to 4 letters" in capsys.readouterr().err
    with Logbook.open(tmp_path / "logs", "Demo Islander") as holder:
        assert not holder.readonly
        assert record(tmp_path, cond_file, "--by", "AB") == 1
        err = capsys.readouterr().err
        assert "another deckload process" in err and "read-only" in err
    assert record(tmp_path, cond_file, "--by", "AB") == 0


def test_show_export_and_verify(tmp_path, cond_file, capsys):
    logs = tmp_path / "logs"
    for by in ("AB", "CD", "EF"):
        assert record(tmp_path, cond_file, "--by", by) == 0
    capsys.readouterr()
    assert main(["log", "--dir", str(logs), "show"]) == 0
    out = capsys.readouterr().out
    assert re.search(r"^\s+3 .* EF\s+condition", out, re.M)
    # each entry names the sets it was assessed against and what was not assessed
    assert len(re.findall(r"\bmet A2\.2 A2\.3\b", out)) == 3
    assert len(re.findall(r"not assessed: damage stability, grain heeling .*?: not computed by deckload",
                          " ".join(out.split()))) == 3

    csv_path = tmp_path / "log.csv"
    assert main(["log", "--dir", str(logs), "export", "--csv", "-o", str(csv_path)]) == 0
    rows = list(csv.DictReader(io.StringIO(csv_path.read_text(encoding="utf-8"))))
    with Logbook.open(logs, "Demo Islander", readonly=True) as book:
        es = book.entries()
    assert [r["by"] for r in rows] == ["AB", "CD", "EF"]
    assert rows[2]["gm_fluid_m"] == f"{es[2].summary['gm_fluid_m']:.3f}"
    assert rows[2]["sha256"] == es[2].sha256 and rows[2]["prev_sha256"] == es[1].sha256

    assert rows[2]["criteria_sets"] == "IS2008-A2.2=pass IS2008-A2.3=pass"
    assert "damage stability: not computed by deckload" in rows[2]["not_assessed"]
    assert rows[2]["verdict"] == es[2].summary["verdict"]

    assert main(["log", "--dir", str(logs), "export", "--html"]) == 0
    html = capsys.readouterr().out
    assert html.count("<tr>") == 4 and "size: A4 landscape" in html and "never replaces" in html
    assert "<th>Sets assessed</th>" in html and "<th>Not assessed</th>" in html
    assert html.count("IS2008-A2.2=pass IS2008-A2.3=pass") == 3
    # what was not assessed is written once, under the table, and each row names it
    assert html.count("damage stability, grain heeling") == 1 and html.count("<td>[1]</td>") == 3

    assert main(["log", "--dir", str(logs), "verify"]) == 0
    assert "OK — 3 entries" in capsys.readouterr().out


def test_verify_names_the_tampered_line_and_recovers_a_torn_one(tmp_path, cond_file, capsys):
    logs = tmp_path / "logs"
    for by in ("AB", "CD", "EF"):
        assert record(tmp_path, cond_file, "--by", by) == 0
    path = logs / "demo-islander.log.jsonl"
    lines = path.read_bytes().split(b"\n")
    obj = json.loads(lines[1])
    obj["summary"]["gm_fluid_m"] += 0.1
    tampered = lines[:1] + [json.dumps(obj, ensure_ascii=False, separators=(",", ":")).encode()] + lines[2:]
    path.write_bytes(b"\n".join(tampered))
    capsys.readouterr()
    assert main(["log", "--dir", str(logs), "verify"]) == 1
    out = capsys.readouterr().out
    assert "BROKEN" in out and "line 2:" in out

    path.write_bytes(b"\n".join(lines) + b'{"format":"deckload-log-1","seq":4,')
    assert main(["log", "--dir", str(logs), "verify"]) == 1
    assert "line 4: incomplete" in capsys.readouterr().out
    assert main(["log", "--dir", str(logs), "verify", "--recover"]) == 0
    out = capsys.readouterr().out
    assert "torn line 4" in out and "OK — 3 entries" in out


def test_an_edited_line_is_marked_in_show_and_in_every_export(tmp_path, cond_file, capsys):
    """A line edited by hand (the officer's initials changed) still reads: the views and the paper
    copy must say the chain is broken before they show it, and exit 1 as 'log verify' does."""
    logs = tmp_path / "logs"
    for by in ("AB", "CD"):
        assert record(tmp_path, cond_file, "--by", by) == 0
    path = logs / "demo-islander.log.jsonl"
    assert main(["log", "--dir", str(logs), "show"]) == 0 and "BROKEN" not in capsys.readouterr().out
    path.write_bytes(path.read_bytes().replace(b'"by":"AB"', b'"by":"XY"', 1))
    assert main(["log", "--dir", str(logs), "show"]) == 1
    out = capsys.readouterr().out
    assert "LOG CHAIN BROKEN" in out and "line 1" in out and "XY" in out
    assert out.index("LOG CHAIN BROKEN") < out.index("XY")
    page = tmp_path / "log.html"
    assert main(["log", "--dir", str(logs), "export", "--html", "-o", str(page)]) == 1
    html = page.read_text(encoding="utf-8")
    assert html.index('class="broken"') < html.index("<table>") and "do not sign this copy" in html
    assert "LOG CHAIN BROKEN" in capsys.readouterr().err
    table = tmp_path / "log.csv"
    assert main(["log", "--dir", str(logs), "export", "--csv", "-o", str(table)]) == 1
    assert "LOG CHAIN BROKEN" in capsys.readouterr().err and "XY" in table.read_text(encoding="utf-8")


def test_an_empty_anchor_is_refused_not_taken_as_none(tmp_path, cond_file, capsys):
    """'--against ""' (a script whose anchor variable is empty) must not verify as OK."""
    logs = tmp_path / "logs"
    assert record(tmp_path, cond_file, "--by", "AB") == 0
    capsys.readouterr()
    assert main(["log", "--dir", str(logs), "verify", "--against", ""]) == 1
    assert "is not a SHA-256" in capsys.readouterr().err
    assert main(["log", "--dir", str(tmp_path / "none"), "verify", "--against", ""]) == 1


def test_report_command_writes_the_report(tmp_path, cond_file, demo, capsys):
    r = evaluate(demo, load_condition(cond_file, demo))
    txt, html = tmp_path / "r.txt", tmp_path / "r.html"
    assert main(["report", str(DEMO_PROFILE), str(cond_file), "--txt", "-o", str(txt)]) == 0
    assert main(["report", str(DEMO_PROFILE), str(cond_file), "--html", "-o", str(html)]) == 0
    err = capsys.readouterr().err
    # the command says so exactly when the page layout does not fit one A4 sheet
    assert ("more than one A4 page" in err) == ('data-fits-a4="no"' in html.read_text(encoding="utf-8"))
    t = txt.read_text(encoding="utf-8")
    h = html.read_text(encoding="utf-8")
    for doc in (t, h):
        assert "Demo Islander" in doc and "Departure, test" in doc
        assert f"{r.gm_fluid_m:.3f} m" in doc and f"{r.displacement_t:.1f} t" in doc
        assert "dep.condition.toml" in doc and "UTC" in doc
    assert "<polyline" in h


def test_report_command_names_a_bad_condition(tmp_path, capsys):
    bad = tmp_path / "bad.condition.toml"
    bad.write_text(CONDITION.replace("percent = 55.0", "percent = 155.0"), encoding="utf-8")
    assert main(["report", str(DEMO_PROFILE), str(bad), "--txt"]) == 1
    err = capsys.readouterr().err
    assert "bad.condition.toml" in err and "FW1P" in err


def _height_mm(doc: str) -> float:
    import re

    return float(re.search(r'data-height-mm="([\d.]+)"', doc).group(1))


def test_report_of_a_full_departure_says_whether_it_fits_one_a4_page(demo):
    """19 of the 25 tanks loaded (6 of them slack with free surface), the hold, two deck
    loads and two constants.  With the weather criterion's numbers and diagram the demo's
    report runs past one A4 page (measured 368 mm of 277 mm at 6 pt); the layout note must
    then say 'no' (and ``deckload report`` says so), and every loaded tank is still listed."""
    from deckload.core.model import Condition, DeckItem, HoldLoad, MassItem, TankFill
    from deckload.report.condition_report import render_report_html

    fills = {"FO1P": 95, "FO1S": 95, "FW1P": 90, "FW1S": 90, "FW2P": 50, "FW2S": 50, "DO1P": 70, "DO1S": 70,
             "LO1": 60, "DB1P": 100, "DB1S": 100, "DB2P": 40, "DB2S": 40, "WB1P": 20, "WB1S": 20, "CF1P": 80,
             "CF1S": 80, "APT": 100, "FPT": 50}
    c = Condition(
        name="Departure, full",
        tanks=tuple(TankFill(k, "percent", float(v)) for k, v in fills.items()),
        holds=(HoldLoad("H1", 150.0, description="General cargo"),),
        deck_items=(DeckItem("20 ft container", 18.0, 9.0, 5.9, 0.0, "AFTDECK"),
                    DeckItem("Vehicle", 6.0, 14.0, 5.4, 1.0, "AFTDECK")),
        constants=(MassItem("Crew and effects", 1.2, 30.0, 6.0), MassItem("Provisions", 2.0, 28.0, 5.0)),
    )
    r = evaluate(demo, c)
    doc = render_report_html(r, demo, c, stamp="2026-12-01 22:00 UTC (ship's time 2026-12-02 08:00, +10:00)",
                             source="departure.condition.toml")
    assert ('data-fits-a4="yes"' in doc) == (_height_mm(doc) <= 297 - 2 * 10)
    for tk in r.tanks:
        if tk.mass_t > 0:
            assert f"{tk.mass_t:.2f}" in doc


@pytest.mark.parametrize("name", ["departure", "midvoyage", "arrival", "light"])
def test_report_of_each_demo_condition_says_whether_it_fits_one_a4_page(demo, name):
    from deckload.io.paths import DEMO_CONDITIONS
    from deckload.report.condition_report import render_report_html

    c = load_condition(DEMO_CONDITIONS[name], demo)
    doc = render_report_html(evaluate(demo, c), demo, c, stamp="2026-12-01 22:00 UTC (ship's time "
                             "2026-12-02 08:00, +10:00)", source=DEMO_CONDITIONS[name].name)
    assert ('data-fits-a4="yes"' in doc) == (_height_mm(doc) <= 297 - 2 * 10)
    assert doc.count("<svg") == 2  # the GZ curve and the weather criterion


@pytest.mark.parametrize("offset", ["+2", "+٠٣:٠٠"])  # (digits of another script are not 0–9)
def test_a_malformed_ship_offset_is_a_message_not_a_traceback(monkeypatch, capsys, offset):
    from deckload.cli.main import main

    monkeypatch.setenv("DECKLOAD_SHIP_OFFSET", offset)
    assert main(["report", "demo", "arrival", "--txt"]) == 2
    err = capsys.readouterr().err
    assert "DECKLOAD_SHIP_OFFSET" in err and "+HH:MM" in err and "Traceback" not in err


def test_vessel_names_in_any_script_name_a_log_file():
    from deckload.io.paths import vessel_slug

    assert vessel_slug("Demo Islander") == "demo-islander"
    assert vessel_slug("Øya 1") == "øya-1"
    assert vessel_slug("Нева") == "нева"
    assert vessel_slug("***").startswith("vessel-") and vessel_slug("***") == vessel_slug("***")
