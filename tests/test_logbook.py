"""The voyage log's mechanics: chain, head record, lock, torn-line recovery, tampering.

These tests are about the log, not the numbers: the Result is built by hand
(``hand_result``) so that they run without a vessel profile.  The values in it are
arbitrary but distinct, so that a test can find each one in the stored summary.
"""

from __future__ import annotations

import json
import os
import subprocess
import sys
import textwrap
from datetime import datetime, timedelta, timezone
from pathlib import Path

import pytest

from deckload import logbook as lb
from deckload.core.model import Condition, MassItem, TankFill
from deckload.core.result import CriterionResult, ItemResult, Result, Warning
from deckload.logbook import GENESIS_SHA256, Logbook, LogLockedError, sha256_hex

ROOT = Path(__file__).resolve().parents[1]


def hand_result(gm_fluid_m: float = 0.812, displacement_t: float = 655.25) -> Result:
    """A Result built by hand for log-mechanics tests (not a computation)."""
    crit = (
        CriterionResult("IS2008-A2.2.1-area-0-30", "area under GZ 0–30°", 0.081, 0.055, "m·rad", ">=",
                        True, "IS 2008 Part A 2.2.1"),
        CriterionResult("IS2008-A2.2.4-gm0", "initial GM", gm_fluid_m, 0.15, "m", ">=", True,
                        "IS 2008 Part A 2.2.4"),
    )
    return Result(
        vessel_name="Demo Islander", condition_name="Test condition", water_density_t_m3=1.025,
        displacement_t=displacement_t, lightship_t=420.0, deadweight_t=displacement_t - 420.0,
        lcg_m=17.4, kg_m=3.1, tcg_m=0.0, fsm_total_tm=30.5, fsc_m=30.5 / displacement_t,
        kg_fluid_m=3.1 + 30.5 / displacement_t, draft_at_lcf_m=2.41, lcb_m=17.5, lcf_m=16.9,
        km_m=4.2, tpc_t_cm=3.7, mctc_tm_cm=8.1, gm_solid_m=gm_fluid_m + 30.5 / displacement_t,
        gm_fluid_m=gm_fluid_m, trim_m=0.37, draft_aft_m=2.61, draft_fwd_m=2.24, draft_mean_m=2.425,
        list_deg=0.3, gz_heel_deg=(0.0, 10.0, 20.0, 30.0), gz_m=(0.0, 0.14, 0.27, 0.33),
        gz_port_m=(0.0, 0.13, 0.26, 0.32), criteria_side="starboard", gz_correction="constant",
        fs_rule="is2008", max_gz_m=0.33, max_gz_angle_deg=30.0, vanishing_angle_deg=None,
        downflooding_angle_deg=None, area_0_30_mrad=0.081, area_0_40_mrad=0.12, area_30_40_mrad=0.039,
        criteria=crit, tanks=(), items=(ItemResult("lightship", "LS", "Lightship", 420.0, 17.2, 3.45, 0.0),),
        warnings=(Warning("slack-worst-band", "tank DB2P is slack in its worst band"),),
    )


def hand_condition(name: str = "Departure") -> Condition:
    return Condition(
        name=name,
        tanks=(TankFill("DB2P", "percent", 50.0),),
        constants=(MassItem("Crew and effects", 1.2, 30.0, 6.0),),
    )


class Clock:
    """A settable clock, one second per call."""

    def __init__(self) -> None:
        self.t = datetime(2026, 12, 1, 22, 0, 0, tzinfo=timezone.utc)

    def __call__(self) -> datetime:
        self.t += timedelta(seconds=1)
        return self.t


def fill(book: Logbook, n: int) -> None:
    for i in range(n):
        book.append(kind="condition", by="jm", change_text=f"condition {i + 1} recorded",
                    change_data={"i": i + 1}, result=hand_result(gm_fluid_m=0.5 + i / 100),
                    condition=hand_condition(f"C{i + 1}"), remark=f"remark {i + 1}")


@pytest.fixture
def book(tmp_path):
    b = Logbook.open(tmp_path, "Demo Islander", ship_offset="+02:00", clock=Clock())
    yield b
    b.close()


def lines_of(path: Path) -> list[bytes]:
    return path.read_bytes().split(b"\n")[:-1]


def write_lines(path: Path, lines: list[bytes]) -> None:
    path.write_bytes(b"".join(line + b"\n" for line in lines))


# --------------------------------------------------------------------------- writing and reading


def test_append_writes_one_chained_json_line_per_entry(book):
    fill(book, 3)
    assert book.path.name == "demo-islander.log.jsonl"
    raw = lines_of(book.path)
    assert len(raw) == 3
    objs = [json.loads(r) for r in raw]
    assert [o["seq"] for o in objs] == [1, 2, 3]
    assert objs[0]["prev_sha256"] == GENESIS_SHA256
    assert objs[1]["prev_sha256"] == sha256_hex(raw[0])
    assert objs[2]["prev_sha256"] == sha256_hex(raw[1])
    o = objs[2]
    assert o["utc"] == "2026-12-01T22:00:03.000Z"  # the 3rd clock read, one second apart
    assert o["ship_clock"] == "+02:00"
    assert (o["vessel"], o["by"], o["kind"]) == ("Demo Islander", "JM", "condition")
    assert o["change"] == "condition 3 recorded" and o["change_data"] == {"i": 3}
    s = o["summary"]
    r = hand_result(gm_fluid_m=0.52)
    assert s["gm_fluid_m"] == r.gm_fluid_m
    assert s["displacement_t"] == r.displacement_t
    assert (s["draft_fwd_m"], s["draft_aft_m"], s["draft_mean_m"]) == (2.24, 2.61, 2.425)
    assert (s["trim_m"], s["list_deg"], s["fsc_m"]) == (r.trim_m, r.list_deg, r.fsc_m)
    assert s["criteria_pass"] is True and s["criteria_failed"] == []
    # the smallest margin relative to its limit: area 0.081 vs 0.055 (47 %) beats GM 0.52 vs 0.15
    assert s["smallest_margin"]["id"] == "IS2008-A2.2.1-area-0-30"
    assert s["smallest_margin"]["margin"] == pytest.approx(0.081 - 0.055)
    assert o["condition"] is not None


def test_entries_read_back_what_was_written(book):
    fill(book, 2)
    es = book.entries()
    assert [e.seq for e in es] == [1, 2]
    assert es[1].prev_sha256 == es[0].sha256
    assert es[1].ship_time == datetime(2026, 12, 2, 0, 0, 2)
    assert es[1].gm_fluid_m == 0.51 and es[1].criteria_pass is True
    assert book.verify().ok


def test_append_fsyncs_the_log_before_returning(tmp_path, monkeypatch):
    synced: list[str] = []
    real = os.fsync

    def spy(fd):
        synced.append(os.readlink(f"/proc/self/fd/{fd}"))
        return real(fd)

    monkeypatch.setattr(os, "fsync", spy)
    with Logbook.open(tmp_path, "Demo Islander") as b:
        synced.clear()
        b.append(kind="remark", by="AB", change_text="noon", change_data={}, result=None, condition=None)
        assert str(b.path) in synced


@pytest.mark.parametrize("by", ["", "ABCDE", "J.M", "J1", "  "])
def test_initials_must_be_one_to_four_letters(book, by):
    with pytest.raises(ValueError, match="1 to 4 letters"):
        book.append(kind="remark", by=by, change_text="x", change_data={}, result=None, condition=None)
    assert book.entries() == []


def test_unknown_kind_and_empty_change_are_refused(book):
    with pytest.raises(ValueError, match="kind 'party'"):
        book.append(kind="party", by="AB", change_text="x", change_data={}, result=None, condition=None)
    with pytest.raises(ValueError, match="change text"):
        book.append(kind="remark", by="AB", change_text=" ", change_data={}, result=None, condition=None)
    with pytest.raises(ValueError, match="JSON"):
        book.append(kind="remark", by="AB", change_text="x", change_data={"f": object()}, result=None,
                    condition=None)
    assert book.entries() == []


def test_non_finite_numbers_are_stored_as_text(book):
    book.append(kind="remark", by="AB", change_text="x", change_data={"v": float("inf")}, result=None,
                condition=None)
    assert book.entries()[0].change_data == {"v": "inf"}


def test_ship_clock_from_environment(tmp_path, monkeypatch):
    monkeypatch.setenv("DECKLOAD_SHIP_OFFSET", "-03:30")
    with Logbook.open(tmp_path, "Demo Islander", clock=Clock()) as b:
        e = b.append(kind="remark", by="AB", change_text="x", change_data={}, result=None, condition=None)
    assert e.ship_clock == "-03:30"
    assert e.ship_time == (e.utc - timedelta(hours=3, minutes=30)).replace(tzinfo=None)


@pytest.mark.parametrize("text", ["+2:00", "0200", "+15:00", "+01:60"])
def test_bad_ship_offset_is_refused(tmp_path, text):
    with pytest.raises(ValueError, match="ship's clock offset"):
        Logbook.open(tmp_path, "Demo Islander", ship_offset=text)


def test_filter_by_kind_and_date(book):
    fill(book, 2)
    book.append(kind="ballast", by="AB", change_text="exchange", change_data={}, result=None, condition=None)
    es = book.entries()
    assert [e.seq for e in lb.filter_entries(es, kinds=["ballast"])] == [3]
    assert [e.seq for e in lb.filter_entries(es, date_from=es[1].utc)] == [2, 3]
    assert [e.seq for e in lb.filter_entries(es, date_to=es[1].utc)] == [1]


# --------------------------------------------------------------------------- one writer


def test_second_instance_in_this_process_is_read_only(book):
    fill(book, 1)
    other = Logbook.open(book.path.parent, "Demo Islander")
    try:
        assert other.readonly
        assert f"pid {os.getpid()}" in other.readonly_reason and "read-only" in other.readonly_reason
        with pytest.raises(LogLockedError, match="read-only"):
            other.append(kind="remark", by="AB", change_text="x", change_data={}, result=None, condition=None)
        assert [e.seq for e in other.entries()] == [1]
        assert other.verify().ok
    finally:
        other.close()
    book.close()
    again = Logbook.open(book.path.parent, "Demo Islander")
    assert not again.readonly
    again.close()


def test_second_instance_in_another_process_is_read_only(book):
    fill(book, 1)
    code = textwrap.dedent(f"""
        from pathlib import Path
        from deckload.logbook import Logbook
        b = Logbook.open(Path({str(book.path.parent)!r}), "Demo Islander")
        print(b.readonly, "|", b.readonly_reason)
    """)
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT, timeout=60)
    assert out.returncode == 0, out.stderr
    assert out.stdout.startswith("True |")
    assert f"pid {os.getpid()}" in out.stdout


def test_lock_is_released_when_the_writer_dies(tmp_path):
    code = textwrap.dedent(f"""
        import os, signal
        from pathlib import Path
        from deckload.logbook import Logbook
        b = Logbook.open(Path({str(tmp_path)!r}), "Demo Islander")
        assert not b.readonly
        os.kill(os.getpid(), signal.SIGKILL)
    """)
    out = subprocess.run([sys.executable, "-c", code], cwd=ROOT, timeout=60)
    assert out.returncode == -9
    with Logbook.open(tmp_path, "Demo Islander") as b:
        assert not b.readonly


# --------------------------------------------------------------------------- torn last line


@pytest.mark.parametrize(
    "torn",
    [b'{"format":"deckload-log-1","seq":4,"utc":"2026-', b"\x00" * 4096, b"\x00" * 100 + b"\n"],
    ids=["cut-short", "zero-filled", "zero-filled-with-line-end"],
)
def test_torn_last_line_is_set_aside_and_reported(tmp_path, torn):
    with Logbook.open(tmp_path, "Demo Islander") as b:
        fill(b, 3)
        path = b.path
    good = path.read_bytes()
    with open(path, "ab") as f:
        f.write(torn)

    with Logbook.open(tmp_path, "Demo Islander", readonly=True) as ro:
        assert len(ro.entries()) == 3
        # a zero-filled line with a line end is complete but unreadable: named, not shown
        assert [s[:7] for s in ro.skipped] == (["line 4:"] if torn.endswith(b"\n") else [])
        rep = ro.verify()
        assert not rep.ok and any(p.startswith("line 4:") for p in rep.problems), rep.problems
        assert path.read_bytes() == good + torn  # a reader changes nothing

    with Logbook.open(tmp_path, "Demo Islander") as b:
        rec = b.recovered_torn
        assert rec is not None and rec.line_no == 4 and rec.n_bytes == len(torn)
        assert rec.side_path.read_bytes() == torn
        assert rec.side_path.name.startswith("demo-islander.log.jsonl.torn-")
        assert "torn line 4" in str(rec) and rec.side_path.name in str(rec)
        assert path.read_bytes() == good
        assert b.verify().ok
        e = b.append(kind="remark", by="AB", change_text="after", change_data={}, result=None, condition=None)
        assert e.seq == 4
    with Logbook.open(tmp_path, "Demo Islander", readonly=True) as ro:
        assert ro.verify().ok


def test_head_record_behind_by_a_power_cut_is_brought_forward(tmp_path):
    with Logbook.open(tmp_path, "Demo Islander") as b:
        fill(b, 3)
        head_path = b.head_path
    raw = lines_of(b.path)
    head_path.write_text(json.dumps({"format": lb.HEAD_FORMAT, "seq": 2, "sha256": sha256_hex(raw[1])}))
    with Logbook.open(tmp_path, "Demo Islander", readonly=True) as ro:
        rep = ro.verify()
        assert rep.ok and any("1 entry behind" in n for n in rep.notes), rep
    with Logbook.open(tmp_path, "Demo Islander") as b:
        assert not b.readonly
        assert json.loads(head_path.read_text())["seq"] == 3


# --------------------------------------------------------------------------- tampering


def tampered(tmp_path, change) -> lb.VerifyReport:
    with Logbook.open(tmp_path, "Demo Islander", clock=Clock()) as b:
        fill(b, 5)
        path = b.path
    lines = lines_of(path)
    assert Logbook.open(tmp_path, "Demo Islander", readonly=True).verify().ok
    change(path, lines)
    with Logbook.open(tmp_path, "Demo Islander", readonly=True) as ro:
        return ro.verify()


def names_line(rep: lb.VerifyReport, n: int) -> bool:
    return any(p.startswith(f"line {n}:") for p in rep.problems)


def _edit_number(line: bytes) -> bytes:
    assert b'"gm_fluid_m":0.52' in line
    return line.replace(b'"gm_fluid_m":0.52', b'"gm_fluid_m":0.62')


def test_changed_number_is_found(tmp_path):
    rep = tampered(tmp_path, lambda p, ls: write_lines(p, ls[:2] + [_edit_number(ls[2])] + ls[3:]))
    assert not rep.ok and names_line(rep, 3), rep.problems


def test_changed_number_in_the_last_line_is_found_by_the_head_record(tmp_path):
    def change(p, ls):
        write_lines(p, ls[:4] + [ls[4].replace(b'"gm_fluid_m":0.54', b'"gm_fluid_m":0.64')])

    rep = tampered(tmp_path, change)
    assert not rep.ok and names_line(rep, 5), rep.problems


def test_deleted_line_is_found(tmp_path):
    rep = tampered(tmp_path, lambda p, ls: write_lines(p, ls[:1] + ls[2:]))
    assert not rep.ok and names_line(rep, 2), rep.problems


def test_deleted_line_is_reported_once_where_it_happened_and_stays_on_record(tmp_path):
    rep = tampered(tmp_path, lambda p, ls: write_lines(p, ls[:1] + ls[2:]))
    assert [p[:8] for p in rep.problems] == ["line 2: "], rep.problems
    # the writer may go on appending (the head record still matches the newest entry) …
    with Logbook.open(tmp_path, "Demo Islander") as b:
        assert not b.readonly
        e = b.append(kind="remark", by="AB", change_text="x", change_data={}, result=None, condition=None)
        assert e.seq == 6
    # … and the deletion is still found in the same place
    with Logbook.open(tmp_path, "Demo Islander", readonly=True) as ro:
        assert [p[:8] for p in ro.verify().problems] == ["line 2: "]


def test_deleted_first_line_is_found(tmp_path):
    rep = tampered(tmp_path, lambda p, ls: write_lines(p, ls[1:]))
    assert not rep.ok and names_line(rep, 1), rep.problems


def test_inserted_line_is_found(tmp_path):
    def change(p, ls):
        # a forged entry that even carries the right prev hash and sequence number
        forged = json.loads(ls[1])
        forged.update(seq=3, prev_sha256=sha256_hex(ls[1]), remark="forged")
        write_lines(p, ls[:2] + [json.dumps(forged, separators=(",", ":")).encode()] + ls[2:])

    rep = tampered(tmp_path, change)
    assert not rep.ok and names_line(rep, 4), rep.problems
    assert any("already appears on line 3" in p for p in rep.problems)


def test_swapped_lines_are_found(tmp_path):
    rep = tampered(tmp_path, lambda p, ls: write_lines(p, ls[:1] + [ls[2], ls[1]] + ls[3:]))
    assert not rep.ok and names_line(rep, 2) and names_line(rep, 3), rep.problems


def test_removed_last_line_is_found(tmp_path):
    rep = tampered(tmp_path, lambda p, ls: write_lines(p, ls[:4]))
    assert not rep.ok and names_line(rep, 5), rep.problems


def test_truncated_file_is_found(tmp_path):
    def change(p, ls):
        data = p.read_bytes()
        p.write_bytes(data[: len(data) - len(ls[4]) // 2])

    rep = tampered(tmp_path, change)
    assert not rep.ok and names_line(rep, 5), rep.problems


def test_writer_refuses_to_append_over_evidence_of_truncation(tmp_path):
    tampered(tmp_path, lambda p, ls: write_lines(p, ls[:3]))
    with Logbook.open(tmp_path, "Demo Islander") as b:
        assert b.readonly
        assert "head record names entry #5 but the log ends with entry #3" in b.readonly_reason
        with pytest.raises(LogLockedError):
            b.append(kind="remark", by="AB", change_text="x", change_data={}, result=None, condition=None)


def test_unreadable_middle_line_is_named(tmp_path):
    rep = tampered(tmp_path, lambda p, ls: write_lines(p, ls[:1] + [ls[1][:-5]] + ls[2:]))
    assert not rep.ok and names_line(rep, 2), rep.problems
    assert any("not valid JSON" in p for p in rep.problems)


def test_head_record_several_entries_behind_is_accepted_when_the_chain_holds(tmp_path):
    with Logbook.open(tmp_path, "Demo Islander") as b:
        fill(b, 5)
        head_path = b.head_path
    raw = lines_of(b.path)
    head_path.write_text(json.dumps({"format": lb.HEAD_FORMAT, "seq": 2, "sha256": sha256_hex(raw[1])}))
    with Logbook.open(tmp_path, "Demo Islander") as b:
        assert not b.readonly, b.readonly_reason
        assert json.loads(head_path.read_text())["seq"] == 5
    # … but not when a later line does not chain from the entry the head names
    head_path.write_text(json.dumps({"format": lb.HEAD_FORMAT, "seq": 2, "sha256": sha256_hex(raw[1])}))
    write_lines(b.path, raw[:2] + [_edit_number(raw[2])] + raw[3:])
    with Logbook.open(tmp_path, "Demo Islander") as b:
        assert b.readonly and "line 4 does not chain" in b.readonly_reason


def test_a_failed_head_update_does_not_lose_the_entry(tmp_path, monkeypatch):
    with Logbook.open(tmp_path, "Demo Islander") as b:
        fill(b, 2)

        def fail(*_a, **_k):
            raise OSError(28, "No space left on device")

        monkeypatch.setattr(b, "_write_head", fail)
        e = b.append(kind="remark", by="AB", change_text="x", change_data={}, result=None, condition=None)
        assert e.seq == 3 and "No space left" in b.head_problem
    monkeypatch.undo()
    with Logbook.open(tmp_path, "Demo Islander") as b:
        assert not b.readonly and [x.seq for x in b.entries()] == [1, 2, 3]
        assert b.verify().ok
