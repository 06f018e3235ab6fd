"""The voyage loading log: append-only, hash-chained, one writer at a time.

File layout, in the log folder (``deckload.io.paths.log_dir``), per vessel:

* ``<slug>.log.jsonl`` — the log.  One JSON object per line, UTF-8, ``\\n``-terminated;
* ``<slug>.log.head.json`` — the head record: sequence number and SHA-256 of the newest
  complete line, rewritten atomically after each append.  It lets :meth:`Logbook.verify`
  notice that the newest entries were removed or the last one edited, which a hash chain
  alone cannot (nothing follows the last line to record its hash);
* ``<slug>.log.lock`` — the writer's lock file (``fcntl.flock``); it holds the writer's pid;
* ``<slug>.log.jsonl.torn-<UTC>.txt`` — a torn last line set aside at start;
* ``<slug>.log.jsonl.as-copied-<UTC>.bak`` — the log as a copy left it (a BOM before line 1, CR LF
  line ends), kept when ``log verify --recover`` takes them out (only when the entries are intact
  without them; until then nothing is recorded in it).

Each line holds (format ``deckload-log-1``)::

    seq          1, 2, 3 … — equal to the line number
    utc          ISO 8601 UTC time of the append, e.g. "2026-12-01T22:04:05.123Z"
    ship_clock   the ship's clock offset from UTC, "+HH:MM" (local timezone or configured)
    vessel, by, kind, change, change_data, remark
    summary      the computed summary of the Result (Δ, drafts, trim, list, GM fluid, FSC,
                 criteria passed/failed and the smallest margin, the criteria sets assessed,
                 what was not assessed and why, the verdict sentence, freeboard and its margin
                 to the load line, deck-edge and downflooding angles, the weather numbers), or null
    condition    the loading condition as written by deckload.io.profiles.dump_condition, or null
    prev_sha256  SHA-256 (hex) of the previous line's bytes, without its "\\n";
                 64 zeros on line 1

The package, by concern:

* :mod:`.records` — one line: its keys, :class:`LogEntry`, :func:`summarise`, the line's SHA-256;
* :mod:`.chain` — the hash chain and its verification (:func:`verify_lines`, the head check
  a writer makes before appending, :func:`find_anchor`);
* :mod:`.storage` — the files: append with fsync, torn-tail recovery, the head record, reading;
* :mod:`.lock` — one writer at a time (``fcntl.flock``), and the probe for a writer;
* :mod:`.clock` — the one place in deckload that reads the clock (:func:`utc_now`);
* :mod:`.book` — :class:`Logbook`, which puts them together, and :func:`anchor`.

Everything a caller needs is imported here: ``from deckload.logbook import Logbook``.
"""

from deckload.io.paths import vessel_slug
from deckload.logbook.clock import (
    ShipOffsetError,
    clock_stamp,
    format_offset,
    format_utc,
    local_offset,
    span_words,
    parse_offset,
    utc_now,
)
from deckload.logbook.records import (
    FORMAT,
    KIND_LABELS,
    KINDS,
    LogEntry,
    LogFormatError,
    _entry_from_line,
    condition_of,
    condition_record,
    filter_entries,
    sha256_hex,
    summarise,
    validate_initials,
)
from deckload.logbook.chain import (
    GENESIS_SHA256,
    VerifyReport,
    back_words,
    clock_back,
    clock_back_words,
    find_anchor,
    verify_lines,
)
from deckload.logbook.storage import (
    HEAD_FORMAT,
    TornRecovery,
    _split_lines,
    case_stray_words,
    case_strays,
    log_files,
    vessel_of_log,
)
from deckload.logbook.lock import LogLockedError
from deckload.logbook.book import Logbook, anchor

__all__ = [
    "FORMAT", "GENESIS_SHA256", "HEAD_FORMAT", "KINDS", "KIND_LABELS", "LogEntry", "LogFormatError",
    "LogLockedError", "Logbook", "ShipOffsetError", "case_stray_words", "case_strays", "TornRecovery", "VerifyReport", "anchor", "back_words", "clock_back", "clock_back_words", "clock_stamp",
    "condition_of", "condition_record", "filter_entries", "find_anchor", "format_offset", "format_utc",
    "local_offset", "log_files", "parse_offset", "sha256_hex", "span_words", "summarise", "utc_now", "validate_initials",
    "verify_lines", "vessel_of_log", "vessel_slug",
]
