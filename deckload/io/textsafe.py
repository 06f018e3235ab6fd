"""Control characters never reach a terminal: they are escaped where text is shown, refused where typed.

A name or remark holding ESC sequences (``\\x1b[2J``), a carriage return, or a Unicode
direction override could rewrite or disguise what the officer reads.  Files and forms refuse
them (:func:`control_char`); text shown on the command line goes through
:class:`EscapingStream`, and text read back from the voyage log through :func:`escaped`, so
that a character that got in some other way is printed as a visible ``\\x1b`` escape.
Line feeds and tabs are ordinary text; a carriage return only as part of ``\\r\\n``.
"""

from __future__ import annotations

import codecs
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


def join_lines(text: str) -> str:
    """A pasted or typed multi-line text as one line: its non-blank lines stripped and joined by a
    space, tabs made spaces (the screen's remark field and ``log record --remark`` alike)."""
    return " ".join(part.strip() for part in text.replace("\t", " ").splitlines() if part.strip())


def escape_breaks(text: str) -> str:
    """``text`` for one printed line or cell: a line feed, carriage return or tab in it written as a
    visible escape (as TOML writes them), so that a stored name or remark never draws a line of its own."""
    return text.replace("\r", "\\r").replace("\n", "\\n").replace("\t", "\\t")


def control_char(text: str) -> str | None:
    """The first control character in ``text`` (tab and line feed allowed), as an escape; else None."""
    m = _TYPED.search(text)
    return None if m is None else _esc(m)


PLAIN = {
    "·": ".", "°": " deg", "−": "-", "θ": "th", "–": "-", "—": "-", "³": "3", "§": "par.", "Δ": "D",
    "²": "2", "φ": "phi", "×": "x", "…": "...", "ρ": "rho", "→": "->", "≥": ">=", "Σ": "sum ", "≤": "<=",
    "⁴": "4", "∇": "V", "±": "+/-", "ψ": "psi", "√": "sqrt", "₀": "0", "≈": "~", "∫": "int ", "δ": "d",
    "½": "1/2", "₁": "1", "†": "+", "π": "pi", "ζ": "zeta", "▲": "^", "■": "#", "←": "<-", "÷": "/",
    "ₙ": "n", "₋": "-", "∓": "-/+", "┆": "|", "●": "*", "◆": "*", "η": "eta", "“": '"', "”": '"',
    "⇄": "<->", "✔": "OK", "✖": "X", "’": "'", "‘": "'", "│": "|", "─": "-",
}
"""Plain-text stand-ins for the characters deckload prints, for a terminal whose encoding lacks
them (a Latin-1 or ASCII locale): the degree sign becomes " deg", Δ "D", ≥ ">=" and so on; any
other character a "?"."""


def _plain(err: UnicodeError):
    if not isinstance(err, UnicodeEncodeError):
        raise err
    return "".join(PLAIN.get(c, "?") for c in err.object[err.start:err.end]), err.end


codecs.register_error("deckload-plain", _plain)

SHOWN_CHARACTERS = "°Δ·θ—≥▲│✔"
"""Characters every printout and the screen use: a terminal encoding that lacks one of them is
narrow (:func:`narrow_encoding`)."""


def narrow_encoding(stream) -> str | None:
    """The stream's encoding when it cannot write what deckload prints (e.g. ``ascii`` or
    ``latin-1``: a terminal in a non-UTF-8 locale), else None."""
    encoding = getattr(stream, "encoding", None) or "utf-8"
    try:
        SHOWN_CHARACTERS.encode(encoding)
    except (UnicodeEncodeError, LookupError):
        return encoding
    return None


class EscapingStream:
    """A text stream that escapes control characters on their way to the terminal, and writes
    the characters its encoding lacks as plain text (:data:`PLAIN`) instead of failing."""

    def __init__(self, stream):
        self._stream = stream
        self._narrow = narrow_encoding(stream)

    def write(self, s: str) -> int:
        text = escaped(s)
        if self._narrow is not None:
            try:
                text = text.encode(self._narrow, "deckload-plain").decode(self._narrow)
            except LookupError:
                text = text.encode("ascii", "deckload-plain").decode("ascii")
        self._stream.write(text)
        return len(s)

    def __getattr__(self, name):
        return getattr(self._stream, name)
