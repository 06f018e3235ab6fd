"""Power-cut simulation: writers killed with SIGKILL at random moments lose nothing.

A writer process (tests/powercut_writer.py) saves a loading condition atomically
and appends a log entry, over and over, reporting each step only after it is
done.  It is killed with SIGKILL after a random delay of a few milliseconds,
200 times: a quarter timed from its start (to hit the open and the torn-line
recovery), the rest from its "ready" (to hit the loop), so the kill lands
anywhere: while opening the log or setting a torn line aside, inside a save
(temporary file, fsync, rename), inside an append (write, fsync, head-record
update), or between them.  The test checks that each phase was hit.  Twenty more writers leave a
torn last line behind (part of a line, or zero bytes), as a power cut can when
the disk kept only part of a write.

Afterwards (and, for the condition file, after every kill):
* every entry a writer reported done is in the log, byte for byte (same SHA-256);
* the chain verifies, once a writer has set aside the last torn line;
* every torn line went to a side file, byte for byte, and no complete entry did;
* the condition file always parses and is the last one reported saved or one
  whose save had begun (the kill may land after the rename but before the
  report) — never a mix, never corrupt.
"""

from __future__ import annotations

import hashlib
import json
import os
import random
import select
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from deckload.logbook import Logbook
from deckload.io.profiles import load_condition

sys.path.insert(0, str(Path(__file__).resolve().parent))
from powercut_writer import VESSEL_NAME, condition, vessel  # noqa: E402

from deckload.io.profiles import save_condition  # noqa: E402

KILLS = 200
TEARS = 20
READ_TIMEOUT_S = 30.0
ROOT = Path(__file__).resolve().parents[1]


class Server:
    def __init__(self, log_dir: Path, cond_path: Path, seed: int):
        # The server forks its writers: keep it single-threaded (no BLAS thread pool), since a
        # fork taken while another thread holds a lock can leave the child waiting for ever.
        env = {**os.environ, "OPENBLAS_NUM_THREADS": "1", "OMP_NUM_THREADS": "1", "MKL_NUM_THREADS": "1"}
        self.p = subprocess.Popen(
            [sys.executable, str(ROOT / "tests" / "powercut_writer.py"), str(log_dir), str(cond_path), str(seed)],
            stdin=subprocess.PIPE, stdout=subprocess.PIPE, cwd=ROOT, bufsize=0, env=env,
        )
        assert self.readline() == "server ready"

    def readline(self) -> str:
        ready, _, _ = select.select([self.p.stdout], [], [], READ_TIMEOUT_S)
        assert ready, f"no word from the writer in {READ_TIMEOUT_S} s: a writer is stuck"
        line = self.p.stdout.readline()
        assert line, "the writer server ended unexpectedly"
        return line.decode().rstrip("\n")

    def send(self, cmd: str) -> None:
        self.p.stdin.write((cmd + "\n").encode())
        self.p.stdin.flush()

    def until_exit(self, pid: int, lines: list[str]) -> int:
        while True:
            line = self.readline()
            if line.startswith(f"exit {pid} "):
                return int(line.split()[2])
            lines.append(line)

    def reap(self) -> None:
        self.send("reap")

    def until(self, pid: int, word: str, lines: list[str]) -> int | None:
        """Read until the child says ``word`` (None) or ends first (its exit code).

        The child may have said it already, before the server announced its pid.
        """
        if word in lines:
            return None
        while True:
            line = self.readline()
            if line.startswith(f"exit {pid} "):
                return int(line.split()[2])
            lines.append(line)
            if line == word:
                return None

    def close(self) -> None:
        self.p.stdin.close()
        self.p.wait(timeout=30)


def _phase(lines: list[str]) -> str:
    """Where the writer was when it was killed, from the last step it reported."""
    words = [line.split()[0] for line in lines if line]
    if "ready" not in words:
        return "opening"
    last = words[-1]
    return {"saving": "saving", "saved": "appending"}.get(last, "between")


@pytest.mark.long
def test_sigkill_at_random_moments_loses_nothing(tmp_path):
    rng = random.Random(20261201)
    log_dir = tmp_path / "logs"
    cond_path = tmp_path / "working.condition.toml"
    v = vessel()
    save_condition(cond_path, condition(0))

    done: dict[int, str] = {}  # seq -> SHA-256 reported done
    saving = 0
    possible = {0}  # conditions the file may hold: the last one reported saved, and any save begun since
    torn: list[str] = []  # SHA-256 of each torn tail left behind
    readonly_lines: list[str] = []
    phases = {"opening": 0, "saving": 0, "appending": 0, "between": 0}
    kinds = ["run"] * KILLS + ["tear"] * TEARS
    rng.shuffle(kinds)
    t0 = time.monotonic()
    srv = Server(log_dir, cond_path, seed=rng.randrange(1 << 30))
    try:
        for cmd in kinds:
            srv.send(f"{cmd} {saving}")
            lines: list[str] = []
            while True:
                line = srv.readline()
                if line.startswith("pid "):
                    pid = int(line.split()[1])
                    break
                lines.append(line)
            code = None
            if cmd == "run":
                if rng.random() < 0.25:
                    time.sleep(rng.uniform(0.0, 0.010))  # aim at the open and the torn-line recovery
                else:
                    code = srv.until(pid, "ready", lines)  # aim at the save-append loop
                    time.sleep(rng.uniform(0.0, 0.030))
                try:
                    os.kill(pid, signal.SIGKILL)
                except ProcessLookupError:
                    pass
            if code is None:
                code = srv.until_exit(pid, lines)
            srv.reap()
            if cmd == "run":
                phases[_phase(lines)] += 1  # from everything it wrote before it died
            for line in lines:
                word, _, rest = line.partition(" ")
                assert word != "error", line
                if word == "done":
                    seq, sha = rest.split()
                    assert int(seq) not in done
                    done[int(seq)] = sha
                elif word == "saving":
                    saving = int(rest)
                    possible.add(saving)
                elif word == "saved":
                    possible = {int(rest)}
                elif word == "torn":
                    torn.append(rest.split()[1])
                elif word == "readonly":
                    readonly_lines.append(rest)
            # after every kill the condition file is whole: the old one or the new one
            got = load_condition(cond_path, v)
            k = int(got.name.split()[1])
            assert k in possible, (got.name, possible)
            assert got == condition(k)
            possible = {k}
    finally:
        srv.close()
    elapsed = time.monotonic() - t0

    assert readonly_lines == []  # the lock of a killed writer never outlives it
    assert len(torn) == TEARS
    # the kills landed in every phase, however fast or slow the machine is today
    assert min(phases["opening"], phases["saving"], phases["appending"]) >= 5, phases

    with Logbook.open(log_dir, VESSEL_NAME) as book:
        rep = book.verify()
        assert rep.ok, rep.problems
        entries = book.entries()
        assert book.skipped == []
    by_seq = {e.seq: e for e in entries}
    assert [e.seq for e in entries] == list(range(1, len(entries) + 1))
    for seq, sha in done.items():
        assert seq in by_seq, f"entry #{seq} was reported done but is not in the log"
        assert by_seq[seq].sha256 == sha
    # at most the one entry whose append was cut between fsync and the "done" report is unreported per kill
    assert len(entries) - len(done) <= KILLS
    # every torn tail was set aside (a writer killed between writing the side file and cutting
    # the log sets it aside again: duplicates are allowed); the only other side files are
    # appends a SIGKILL cut short (the kernel may stop a write() between pages): unfinished
    # lines, never a complete entry
    side_files = sorted(log_dir.glob("*.torn-*.txt"))
    set_aside = {hashlib.sha256(f.read_bytes()).hexdigest(): f.read_bytes() for f in side_files}
    assert set(torn) <= set(set_aside)
    cut_short = [c for h, c in set_aside.items() if h not in torn]
    for c in cut_short:
        assert b"\n" not in c and c.startswith(b'{"format":"deckload-log-1","seq":'), c[:80]
        with pytest.raises(json.JSONDecodeError):
            json.loads(c)
    print(f"\n{KILLS} kills + {TEARS} tears in {elapsed:.1f} s: {len(entries)} entries "
          f"({len(done)} reported done), {len(side_files)} side files ({len(cut_short)} appends cut short "
          f"by the kill itself), condition round {saving}; "
          f"killed while {phases}")
