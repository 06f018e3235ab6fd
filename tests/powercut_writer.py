"""Writer process for the power-cut test (tests/test_powercut.py); not a test itself.

Run as ``python tests/powercut_writer.py LOG_DIR CONDITION_FILE``.  It imports
everything once, then serves commands read from stdin, one per line, so that
the test can kill 200 writers in well under a minute:

* ``run K`` — fork a writer.  The writer opens the log (setting aside any torn
  line), then loops: save loading condition K+1 atomically, append one entry,
  K+2, … until it is killed.  It reports each step on stdout *after* it is done
  (``saving K`` before the save starts, ``saved K`` after it returns, ``done SEQ
  SHA256`` after the append's fsync returned);
* ``tear K`` — fork a writer that opens the log, writes the first part of a
  line (or a run of zero bytes) with no line end and kills itself with SIGKILL:
  what a power cut can leave behind when the disk persisted only part of a write.
  It reports ``torn LEN SHA256`` of the bytes it left.
  (A SIGKILL can itself cut a long write() short between pages, so torn lines
  also occur by chance; ``tear`` makes sure the recovery is exercised every run.)

For each fork the server prints ``pid P`` first, and ``exit P CODE`` once the
child has ended (CODE is negative for a signal); it reaps the child only when the
test then sends ``reap``, so the pid is never reused while the test may signal it.  Lines are written with a single
``os.write`` each, so lines from server and child never interleave.
"""

from __future__ import annotations

import hashlib
import os
import random
import signal
import sys
import threading
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from deckload.core.model import Condition, MassItem, TankFill  # noqa: E402
from deckload.core.stability import evaluate  # noqa: E402
from deckload.logbook import Logbook  # noqa: E402
from deckload.io.profiles import save_condition  # noqa: E402
from vessel_factories import barge_tanks, box_barge  # noqa: E402

VESSEL_NAME = "Demo Islander"


def vessel():
    return box_barge(tanks=barge_tanks(), name=VESSEL_NAME)


def condition(k: int) -> Condition:
    """Loading condition number ``k``: its name and ballast fill both encode k."""
    return Condition(
        name=f"round {k}",
        remark=f"power-cut test condition {k}",
        tanks=(TankFill("DB1P", "percent", 5.0 + (k % 90)), TankFill("FW1C", "percent", 50.0)),
        constants=(MassItem("Crew and effects", 1.2, 30.0, 6.0),),
    )


def say(text: str) -> None:
    os.write(1, (text + "\n").encode())


def writer(log_dir: Path, cond_path: Path, k: int, v) -> None:
    book = Logbook.open(log_dir, VESSEL_NAME)
    if book.recovered_torn is not None:
        say(f"recovered {book.recovered_torn.line_no} {book.recovered_torn.n_bytes}")
    if book.readonly:
        say(f"readonly {book.readonly_reason}")
        return
    say("ready")
    for _ in range(100_000):
        k += 1
        c = condition(k)
        say(f"saving {k}")
        save_condition(cond_path, c)
        say(f"saved {k}")
        e = book.append(kind="condition", by="PC", change_text=f"round {k}", change_data={"k": k},
                        result=evaluate(v, c), condition=c)
        say(f"done {e.seq} {e.sha256}")


def tear(log_dir: Path, rng: random.Random) -> None:
    book = Logbook.open(log_dir, VESSEL_NAME)
    if book.recovered_torn is not None:
        say(f"recovered {book.recovered_torn.line_no} {book.recovered_torn.n_bytes}")
    data = book.path.read_bytes()
    last = data.rstrip(b"\n").rsplit(b"\n", 1)[-1] or b'{"format":"deckload-log-1","seq":1'
    part = b"\x00" * rng.randint(1, 4096) if rng.random() < 0.3 else last[: rng.randint(1, len(last) - 1)]
    fd = os.open(book.path, os.O_WRONLY | os.O_APPEND)
    os.write(fd, part)
    os.fsync(fd)
    say(f"torn {len(part)} {hashlib.sha256(part).hexdigest()}")
    os.kill(os.getpid(), signal.SIGKILL)


def main() -> int:
    if threading.active_count() != 1 or len(os.listdir("/proc/self/task")) != 1:
        say("error: the server must be single-threaded before it forks (set OPENBLAS_NUM_THREADS=1)")
        return 1
    log_dir, cond_path = Path(sys.argv[1]), Path(sys.argv[2])
    v = vessel()
    rng = random.Random(int(sys.argv[3]) if len(sys.argv) > 3 else 1)
    say("server ready")
    for line in sys.stdin:
        cmd, _, arg = line.strip().partition(" ")
        if cmd not in ("run", "tear"):
            say(f"unknown {cmd}")
            continue
        k = int(arg)
        pid = os.fork()
        if pid == 0:
            try:
                if cmd == "run":
                    writer(log_dir, cond_path, k, v)
                else:
                    tear(log_dir, rng)
            except BaseException as exc:  # report, so the test fails with the reason
                say(f"error {type(exc).__name__}: {exc}")
                os._exit(1)
            os._exit(0)
        rng.random()  # keep the parent's generator moving, so each tear differs
        say(f"pid {pid}")
        # Wait without reaping: the dead child keeps its pid until the test says "reap", so
        # a SIGKILL the test sends late can never reach some other process given that pid.
        info = os.waitid(os.P_PID, pid, os.WEXITED | os.WNOWAIT)
        code = -info.si_status if info.si_code in (os.CLD_KILLED, os.CLD_DUMPED) else info.si_status
        say(f"exit {pid} {code}")
        if sys.stdin.readline().strip() != "reap":
            say("expected reap")
        os.waitpid(pid, 0)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
