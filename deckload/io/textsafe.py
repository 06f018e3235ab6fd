"""Control characters never reach a terminal: they are escaped where text is shown, refused where typed.

A name or remark holding ESC sequences (``\\x1b[2J``), a carriage return, or a Unicode
direction override could rewrite or disguise what the officer reads.  Files and forms refuse
them (:func:`control_char`); text shown on the command line goes through
:class:`EscapingStream`, and text read back from the voyage log through :func:`escaped`, so
that a character that got in some other way is printed as a visible ``\\x1b`` escape.
Line feeds and tabs are ordinary text; a carriage return only as part of ``\\r\\n``.
"""

from __future__ import annotations

import re

_CONTROL = "\x00-\x08\x0b\x0c\x0e-\x1f\x7f-\x9f\u200e\u200f\u202a-\u202e\u2066-\u2069\u2028\u2029"
"""Every control character but tab (09), line feed (0a) and carriage return (0d)."""
_SHOWN = re.compile(f"\r(?!\n)|[{_CONTROL}]")
_TYPED = re.compile(f"[\r{_CONTROL}]")


def _esc(m: re.Match) -> str:
    c = m.group(0)
    n = ord(c)
    return f"\\x{n:02x}" if n < 0x100 else f"\\u{n:04x}"


def escaped(text: str) -> str:
    """``text`` with every control character (but line feed, tab and CR LF) written as an escape."""
    return _SHOWN.sub(_esc, text)


def control_char(text: str) -> str | None:
    """The first control character in ``text`` (tab and line feed allowed), as an escape; else None."""
    m = _TYPED.search(text)
    return None if m is None else _esc(m)


class EscapingStream:
    """A text stream that escapes control characters on their way to the terminal."""

    def __init__(self, stream):
        self._stream = stream

    def write(self, s: str) -> int:
        self._stream.write(escaped(s))
        return len(s)

    def __getattr__(self, name):
        return getattr(self._stream, name)
