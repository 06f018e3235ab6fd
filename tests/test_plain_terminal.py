"""A terminal whose encoding lacks deckload's characters (a Latin-1 or ASCII locale, or
``PYTHONIOENCODING=ascii``): every printout is plain text, and the screen says what it needs.

Found by a real-terminal audit: ``calc``, ``check``, ``report``, ``marks`` and ``log`` ended in
"internal error … UnicodeEncodeError" (exit 3) on the first degree sign or Δ, and the screen
printed its box lines as the text "\\u2502".  Python takes the C and POSIX locales as UTF-8
(PEP 538), so only a locale or setting that really names another encoding gets here.
"""

from __future__ import annotations

import io
import os
import subprocess
import sys
from pathlib import Path

import pytest

from deckload.io.textsafe import PLAIN, EscapingStream, narrow_encoding

ROOT = Path(__file__).resolve().parent.parent


def run(args, encoding, tmp_path):
    env = {**os.environ, "PYTHONIOENCODING": encoding, "DECKLOAD_HOME": str(tmp_path / "home"),
           "DECKLOAD_LOG_DIR": str(tmp_path / "logs")}
    return subprocess.run([sys.executable, "-m", "deckload", *args], capture_output=True, cwd=ROOT, env=env,
                          timeout=120, stdin=subprocess.DEVNULL)


@pytest.mark.parametrize("encoding, commands", [
    ("ascii", (["calc", "demo", "departure"], ["check", "demo"], ["report", "--txt", "demo", "departure"], ["log", "show"])),
    ("latin-1", (["calc", "demo", "departure"],))])
def test_calc_check_and_report_print_plain_text(tmp_path, encoding, commands):
    for args in commands:
        out = run(args, encoding, tmp_path)
        assert out.returncode == 0, (args, out.stderr.decode(encoding))
        text = out.stdout.decode(encoding)  # every byte in the terminal's own encoding
        assert "internal error" not in out.stderr.decode(encoding)
        if args[0] == "calc":
            assert "GM fluid" in text and ("Δ" not in text) and ("deg" in text if encoding == "ascii" else "°" in text)


def test_the_screen_asks_for_a_utf8_terminal(tmp_path):
    out = run(["open"], "ascii", tmp_path)
    assert out.returncode == 2
    assert "needs a terminal that shows UTF-8" in out.stderr.decode("ascii") and out.stdout == b""


def test_every_stand_in_is_plain_and_anything_else_a_question_mark():
    assert narrow_encoding(io.TextIOWrapper(io.BytesIO(), encoding="utf-8")) is None
    raw = io.BytesIO()
    stream = io.TextIOWrapper(raw, encoding="ascii")
    assert narrow_encoding(stream) == "ascii"
    out = EscapingStream(stream)
    out.write("".join(PLAIN) + "ü\x1b")
    stream.flush()
    assert raw.getvalue().decode("ascii") == "".join(PLAIN.values()) + "?\\x1b"  # control characters still escaped
