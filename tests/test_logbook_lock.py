"""deckload.logbook.lock on its own: one writer at a time, and the probe for a writer."""

from __future__ import annotations

import os
import subprocess
import sys
import textwrap
from pathlib import Path

from deckload.logbook.lock import WriterLock, writer_active

ROOT = Path(__file__).resolve().parents[1]


def test_the_first_takes_it_the_second_is_told_who_holds_it(tmp_path):
    path = tmp_path / "x.log.lock"
    first, second = WriterLock(path), WriterLock(path)
    assert not writer_active(path)
    assert first.acquire() is None and first.held
    assert path.read_text().startswith(f"pid {os.getpid()} since ")
    holder = second.acquire()
    assert holder is not None and holder.startswith(f"pid {os.getpid()}") and not second.held
    assert writer_active(path)
    first.release()
    assert not first.held and not writer_active(path)
    assert second.acquire() is None
    second.release()
    second.release()  # releasing twice does nothing


def test_probe_without_a_lock_file_is_false(tmp_path):
    assert writer_active(tmp_path / "none.log.lock") is False


def test_the_kernel_releases_the_lock_of_a_process_that_dies(tmp_path):
    path = tmp_path / "x.log.lock"
    code = textwrap.dedent(f"""
        import os, signal
        from pathlib import Path
        from deckload.logbook.lock import WriterLock
        assert WriterLock(Path({str(path)!r})).acquire() is None
        os.kill(os.getpid(), signal.SIGKILL)
    """)
    out = subprocess.run([sys.executable, "-c", code], cwd=ROOT, timeout=60,
                         env={**os.environ, "PYTHONPATH": str(ROOT)})
    assert out.returncode == -9
    assert not writer_active(path)
    lock = WriterLock(path)
    assert lock.acquire() is None
    lock.release()
