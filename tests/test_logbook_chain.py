"""deckload.logbook.chain on its own: the hash chain checked on lines held in memory.

No files: the lines are built here the way an append builds them (records.FORMAT, each
``prev_sha256`` the SHA-256 of the line before, 64 zeros on line 1), so each test says
exactly which bytes were changed and where the check must point.
"""

from __future__ import annotations

import hashlib
import json

from deckload.logbook.chain import GENESIS_SHA256, find_anchor, head_disagreement, verify_lines
from deckload.logbook.records import FORMAT, _dumps


def chained(n: int, vessel: str = "Demo Islander") -> list[bytes]:
    """n valid lines, each recording the SHA-256 of the one before."""
    lines: list[bytes] = []
    prev = GENESIS_SHA256
    for seq in range(1, n + 1):
        line = _dumps({
            "format": FORMAT, "seq": seq, "utc": f"2026-12-01T22:00:0{seq}.000Z", "ship_clock": "+02:00",
            "vessel": vessel, "by": "JM", "kind": "remark", "change": f"noon {seq}", "change_data": {},
            "remark": "", "summary": None, "condition": None, "prev_sha256": prev,
        }).encode()
        lines.append(line)
        prev = hashlib.sha256(line).hexdigest()
    return lines


def head_of(lines: list[bytes], k: int | None = None) -> dict:
    """The head record naming line k (1-based; the last by default)."""
    k = len(lines) if k is None else k
    return {"format": "deckload-log-head-1", "seq": k, "sha256": hashlib.sha256(lines[k - 1]).hexdigest()}


def test_genesis_is_64_zeros():
    assert GENESIS_SHA256 == "0" * 64
    assert json.loads(chained(1)[0])["prev_sha256"] == "0" * 64


def test_an_intact_chain_verifies_and_gives_the_newest_hash():
    lines = chained(4)
    report = verify_lines(lines, b"", head_of(lines), "Demo Islander")
    assert report.ok and report.problems == [] and report.entries == 4
    assert report.last_sha256 == hashlib.sha256(lines[-1]).hexdigest()
    assert head_disagreement(head_of(lines), lines) is None


def test_an_edited_middle_line_is_named_by_the_line_after_it():
    lines = chained(4)
    lines[1] = lines[1].replace(b"noon 2", b"noon X")
    report = verify_lines(lines, b"", head_of(lines), "Demo Islander")
    assert not report.ok
    assert report.problems == ["line 2: edited — its SHA-256 is not the one line 3 records for it"]


def test_a_removed_line_breaks_numbering_and_chain_where_it_happened():
    lines = chained(4)
    del lines[1]
    report = verify_lines(lines, b"", head_of(chained(4)), "Demo Islander")
    assert report.problems[0].startswith("line 2: entry #3 follows entry #1")
    assert "hash chain breaks here too" in report.problems[0]


def test_a_head_behind_is_a_note_and_a_head_ahead_a_problem():
    lines = chained(4)
    behind = verify_lines(lines, b"", head_of(lines, 2), "Demo Islander")
    assert behind.ok and behind.notes and "2 entries behind" in behind.notes[0]
    assert head_disagreement(head_of(lines, 2), lines) is None
    ahead = verify_lines(lines[:3], b"", head_of(lines), "Demo Islander")
    assert not ahead.ok and "line 4: missing" in ahead.problems[0]
    assert "names entry #4 but the log ends with entry #3" in head_disagreement(head_of(lines), lines[:3])


def test_the_last_line_edited_is_caught_only_by_the_head():
    lines = chained(3)
    head = head_of(lines)
    lines[2] = lines[2].replace(b"noon 3", b"noon X")
    assert verify_lines(lines, b"", head, "Demo Islander").problems == [
        "line 3: its SHA-256 is not the one in the head record — line 3 was edited or replaced"]
    assert "does not match the head record" in head_disagreement(head, lines)


def test_a_torn_tail_is_a_problem_unless_a_writer_is_at_work():
    lines = chained(2)
    torn = verify_lines(lines, b'{"format":', head_of(lines), "Demo Islander")
    assert not torn.ok and torn.problems[0].startswith("line 3: incomplete last line (10 bytes")
    busy = verify_lines(lines, b'{"format":', head_of(lines), "Demo Islander", writer_active=True)
    assert busy.ok and busy.notes == ["line 3: incomplete — another process is writing the log right now"]


def test_a_deleted_head_is_suspected_tampering():
    lines = chained(2)
    assert "missing" in verify_lines(lines, b"", None, "Demo Islander").problems[0]
    assert head_disagreement(None, lines) is not None
    assert head_disagreement(None, []) is None


def test_find_anchor_by_prefix_and_number():
    lines = chained(3)
    sha2 = hashlib.sha256(lines[1]).hexdigest()
    assert find_anchor(lines, sha2[:12]) == (2, 2)
    assert find_anchor(lines, f"2:{sha2}") == (2, 2)
    assert find_anchor(lines, f"3:{sha2}") is None
