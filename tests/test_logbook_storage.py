"""deckload.logbook.storage on its own: appends that reach the disk, torn tails, the head record."""

from __future__ import annotations

import errno
import json
import os
from datetime import datetime, timezone

import pytest

from deckload.logbook import storage
from deckload.logbook.storage import HEAD_FORMAT, LogStore


@pytest.fixture
def store(tmp_path):
    s = LogStore(tmp_path / "x.log.jsonl", tmp_path / "x.log.head.json")
    yield s
    s.close()


def test_open_creates_the_file_once(store):
    assert store.open_for_append() is True
    store.close()
    assert store.open_for_append() is False
    assert store.path.read_bytes() == b""


def test_append_line_writes_the_line_and_its_end_and_fsyncs(store, monkeypatch):
    store.open_for_append()
    synced = []
    real = os.fsync
    monkeypatch.setattr(os, "fsync", lambda fd: (synced.append(fd), real(fd)))
    store.append_line(b'{"a":1}')
    store.append_line(b'{"a":2}')
    assert store.path.read_bytes() == b'{"a":1}\n{"a":2}\n'
    assert synced == [store.fd, store.fd]


def test_a_failed_write_is_cut_back_to_the_last_good_line(store, monkeypatch):
    store.open_for_append()
    store.append_line(b'{"a":1}')

    def full(fd, data):
        os.write(fd, data[:3])
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))

    monkeypatch.setattr(storage, "_write_all", full)
    with pytest.raises(OSError, match="No space left"):
        store.append_line(b'{"a":2}')
    assert store.path.read_bytes() == b'{"a":1}\n'


@pytest.mark.parametrize("tail, torn", [
    (b'{"a":', b'{"a":'),                        # cut short: no line end
    (b"\x00" * 50 + b"\n", b"\x00" * 50 + b"\n"),  # zero-filled block that happens to end in a newline
    (b"", b""),                                  # nothing torn
])
def test_scan_finds_the_torn_tail(store, tail, torn):
    store.path.write_bytes(b'{"a":1}\n{"a":2}\n' + tail)
    store.open_for_append()
    lines, got = store.scan()
    assert lines == [b'{"a":1}', b'{"a":2}']
    assert got == torn


def test_set_aside_keeps_the_torn_bytes_then_cuts_them(store):
    store.path.write_bytes(b'{"a":1}\n{"a":')
    store.open_for_append()
    lines, torn = store.scan()
    rec = store.set_aside_torn(torn, len(lines) + 1, datetime(2026, 12, 1, 22, 4, 5, tzinfo=timezone.utc))
    assert rec.side_path.name == "x.log.jsonl.torn-20261201T220405Z.txt"
    assert rec.side_path.read_bytes() == b'{"a":' and (rec.line_no, rec.n_bytes) == (2, 5)
    assert store.path.read_bytes() == b'{"a":1}\n'
    again = store.set_aside_torn(b"", 2, datetime(2026, 12, 1, 22, 4, 5, tzinfo=timezone.utc))
    assert again.side_path.name == "x.log.jsonl.torn-20261201T220405Z-2.txt"  # never overwrites a side file


def test_head_record_round_trip_and_damage(store):
    assert store.read_head() is None
    store.write_head(7, "ab" * 32)
    assert json.loads(store.head_path.read_text()) == {"format": HEAD_FORMAT, "seq": 7, "sha256": "ab" * 32}
    assert store.read_head()["seq"] == 7
    store.head_path.write_bytes(b"\x00\x01 not json")
    assert store.read_head() == {"damaged": True}
    store.head_path.write_text("[1, 2]")
    assert store.read_head() == {"damaged": True}


def test_read_is_empty_without_a_file(store):
    assert store.read() == b""
