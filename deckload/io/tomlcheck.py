"""Reading TOML tables with checks: the toolkit behind every file deckload reads.

Vessel profiles and loading conditions (:mod:`deckload.io.profiles`) and geometry
files (:mod:`deckload.io.geometry_files`) are all read with it.  A :class:`FileCheck` is
one file being read; a :class:`Table` is one of its tables, read key by key with
typed getters (``num``, ``text``, ``array``, ``pair``, ``matrix``, ``table``,
``tables``) that check each value against its rules.  Every problem is collected
as a :class:`Problem` naming the file, the line (from the TOML parser for syntax
errors, else found by scanning the text for the key, its array row or its table
header), the dotted key, the offending value and the rule broken; the file is
rejected at the end with all of them at once (:meth:`FileCheck.fail_if_any`).

Keys nobody asked for are problems too: a misspelt optional key must never be
silently ignored, because its default would then be used without anyone knowing.

A table of a profile may come from a CSV file (:mod:`deckload.io.csvtables`): its columns
are put into the parsed data before the checks run, and :attr:`FileCheck.sources` sends
each problem in them to the CSV file, line and column (:attr:`Problem.column`).

How values read in messages is a :class:`Wording`: profiles write them as TOML
(``10.0``, ``"ballast"``), geometry files shorter (``10``, ``'ballast'``).
"""

from __future__ import annotations

import math
import re
import tomllib
from typing import Any, Callable

import numpy as np

from deckload.core.frozen import frozen
from deckload.io.limits import MAX_TABLE_VALUES
from deckload.io.textsafe import control_char, escape_breaks

ID_PATTERN = re.compile(r"^[A-Za-z0-9_-]+$")
"""Tank, hold and deck-area ids: letters, digits, '-' and '_' (typed by the user)."""

REL_TOL = 1e-9
"""Round-off allowance when a stated quantity meets a table end (e.g. 100 % as tonnes)."""


# =========================================================================== problems


@frozen
class Problem:
    """One thing wrong in a profile, condition or geometry file."""

    file: str
    """The file as the user named it."""
    line: int | None
    """1-based line, where known."""
    key: str
    """Dotted key, e.g. 'tank[DB2P].calibration.volume_m3'; '' for a syntax error."""
    value: str | None
    """The offending value as written (shortened), or None when the key is missing."""
    rule: str
    """The rule broken, in words."""
    column: str = ""
    """For a table read from a CSV file: the column, e.g. "column 4 'vcg_m'"; else ''."""

    def __str__(self) -> str:
        parts = [f"{self.file}:{self.line}" if self.line else self.file]
        if self.key:
            key = self.key if self.value is None else f"{self.key} = {self.value}"
            parts.append(f"{key} ({self.column})" if self.column else key)
        parts.append(self.rule)
        return ": ".join(parts)


class ProfileError(Exception):
    """A profile, condition or geometry file is unusable; ``problems`` lists everything wrong with it."""

    def __init__(self, problems: list[Problem]):
        self.problems = list(problems)
        super().__init__("\n".join(str(p) for p in self.problems))


# =========================================================================== line finder


def _split_key(s: str) -> tuple[str, ...]:
    """Split a TOML dotted key ('a."b c".d') into its parts, unquoted."""
    parts = re.findall(r'"(?:[^"\\]|\\.)*"|\'[^\']*\'|[^.\s]+', s)
    return tuple(p[1:-1] if p[:1] in "\"'" else p for p in parts)


def _skip_string(text: str, i: int) -> tuple[int, str | None]:
    """Index just past the string starting at ``text[i]``, or (len, delimiter) if it runs on."""
    n = len(text)
    for delim in ('"""', "'''"):
        if text.startswith(delim, i):
            j = text.find(delim, i + 3)
            return (n, delim) if j < 0 else (j + 3, None)
    if text[i] == "'":
        j = text.find("'", i + 1)
        return (n if j < 0 else j + 1), None
    i += 1
    while i < n and text[i] != '"':
        i += 2 if text[i] == "\\" else 1
    return i + 1, None


class _ValueScanner:
    """Follows TOML values across lines, noting the line where each array element starts.

    An array value at path ``p`` records ``p + (i,)`` for its element ``i`` (and
    ``p + (i, j)`` inside a nested array), so a bad row of a multi-line table is
    reported on its own line.  Inline tables are followed only for their nesting.
    """

    def __init__(self, locs: dict[tuple, int]):
        self.locs = locs
        self.stack: list[list] = []  # ["[", path, expecting_element, count] or ["{"]
        self.in_ml: str | None = None
        self.pending: tuple | None = None

    @property
    def busy(self) -> bool:
        return bool(self.stack) or self.in_ml is not None

    def _value(self, text: str, i: int, path: tuple | None) -> int:
        c = text[i]
        if c == "[":
            self.stack.append(["[", path, True, 0])
            return i + 1
        if c == "{":
            self.stack.append(["{"])
            return i + 1
        if c in "\"'":
            i, self.in_ml = _skip_string(text, i)
            return i
        while i < len(text) and text[i] not in ",]}# \t":
            i += 1
        return i

    def feed(self, text: str, lineno: int) -> None:
        i, n = 0, len(text)
        while i < n:
            if self.in_ml is not None:
                j = text.find(self.in_ml, i)
                if j < 0:
                    return
                i, self.in_ml = j + 3, None
                continue
            c = text[i]
            if c in " \t\r":
                i += 1
                continue
            if c == "#":
                return
            top = self.stack[-1] if self.stack else None
            if top is None:
                if self.pending is None:
                    return
                path, self.pending = self.pending, None
                i = self._value(text, i, path)
            elif top[0] == "[":
                if c == ",":
                    top[2] = True
                    i += 1
                elif c == "]":
                    self.stack.pop()
                    i += 1
                elif top[2]:
                    path = None if top[1] is None else top[1] + (top[3],)
                    top[2], top[3] = False, top[3] + 1
                    if path is not None:
                        self.locs.setdefault(path, lineno)
                    i = self._value(text, i, path)
                else:
                    i += 1
            else:  # inside an inline table: nesting only
                if c in "\"'":
                    i, self.in_ml = _skip_string(text, i)
                    continue
                if c in "[{":
                    self.stack.append(["{"])
                elif c in "]}":
                    self.stack.pop()
                i += 1


def key_lines(text: str) -> dict[tuple, int]:
    """Map key paths to the line that defines them, best effort.

    Paths use the parsed document's shape: ``("tank", 2, "calibration", "fsi_m4")``
    for the third ``[[tank]]``'s table, ``(..., "fsi_m4", 4)`` for its fifth value.
    Table headers map to their own line, so a missing key can be reported at its
    table's header.
    """
    locs: dict[tuple, int] = {}
    aot: dict[tuple, int] = {}
    prefix: tuple = ()
    scan = _ValueScanner(locs)

    def resolve(plain: tuple[str, ...]) -> tuple:
        out: tuple = ()
        for k in range(1, len(plain) + 1):
            out += (plain[k - 1],)
            if plain[:k] in aot:
                out += (aot[plain[:k]] - 1,)
        return out

    for lineno, line in enumerate(text.splitlines(), 1):
        if scan.busy:
            scan.feed(line, lineno)
            continue
        s = line.strip()
        hm = re.match(r"^\[\[\s*(.+?)\s*\]\]", s) or re.match(r"^\[\s*(.+?)\s*\]", s)
        if hm:
            plain = _split_key(hm.group(1))
            if s.startswith("[["):
                aot[plain] = aot.get(plain, 0) + 1
            prefix = resolve(plain)
            locs.setdefault(prefix, lineno)
            continue
        km = re.match(r"^\s*((?:\"(?:[^\"\\]|\\.)*\"|'[^']*'|[A-Za-z0-9_\-.\s])+?)\s*=", line)
        if not km:
            continue
        path = prefix + _split_key(km.group(1))
        locs.setdefault(path, lineno)
        scan.pending = path
        scan.feed(line[km.end():], lineno)
        scan.pending = None
    return locs


# =========================================================================== values in words

MISSING = object()
"""What :meth:`Table.get` returns for a key the table does not have."""


def _qk(k: str) -> str:
    return k if ID_PATTERN.match(k) else '"' + k.replace("\\", "\\\\").replace('"', '\\"') + '"'


def toml_value(v: Any, _depth: int = 0) -> str:
    """The value as it would read in TOML, shortened for one line (and to three levels of nesting)."""
    if _depth > 2 and isinstance(v, (list, tuple, dict)):
        return "[…]" if isinstance(v, (list, tuple)) else "{…}"
    if isinstance(v, int) and not isinstance(v, bool) and abs(v) >= 10 ** 20:
        digits = len(str(abs(v)))
        return f"{str(v)[:12]}…({digits} digits)"
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, str):
        # line breaks and tabs written as TOML writes them: the value stays on the message's line
        v = escape_breaks(v)
        s = v if len(v) <= 40 else v[:37] + "…"
        return '"' + s + '"'
    if isinstance(v, float):
        return repr(v)
    if isinstance(v, (list, tuple)):
        if len(v) <= 4:
            return "[" + ", ".join(toml_value(x, _depth + 1) for x in v) + "]"
        return "[" + ", ".join(toml_value(x, _depth + 1) for x in v[:4]) + f", …{len(v)} values]"
    if isinstance(v, dict):
        return "{…}"
    return str(v)


def num(x: float) -> str:
    """A number in a rule's text: six significant digits."""
    return f"{x:.6g}"


def toml_type(v: Any) -> str:
    if isinstance(v, bool):
        return "a boolean"
    if isinstance(v, str):
        return "a string"
    if isinstance(v, (int, float)):
        return "a number"
    if isinstance(v, list):
        return "an array"
    if isinstance(v, dict):
        return "a table"
    return "a date/time"


def is_number(v: Any) -> bool:
    return isinstance(v, (int, float)) and not isinstance(v, bool)


def finite_float(v: Any) -> float | None:
    """``v`` as a finite float, or None (an integer too large for a float, or inf/nan)."""
    try:
        x = float(v)
    except OverflowError:
        return None
    return x if math.isfinite(x) else None


def printed_half_unit(written: Any) -> float:
    """Half a unit of the last decimal a number was written with: the rounding it may carry.

    ``"24.1"`` → 0.05, ``"24.068"`` → 0.0005, ``24`` (a TOML integer) → 0.5; a TOML float by
    its shortest repr (``24.1`` → 0.05).  0 when it is not a plain number."""
    from decimal import Decimal, InvalidOperation

    if isinstance(written, bool):
        return 0.0
    if isinstance(written, float):
        s = repr(written)
    elif isinstance(written, (int, str)):
        s = str(written).strip()
    else:
        return 0.0
    try:
        exponent = Decimal(s).as_tuple().exponent
    except (InvalidOperation, ValueError):
        return 0.0
    return 0.5 * 10.0 ** exponent if isinstance(exponent, int) else 0.0


def suggest(word: str, choices) -> str:
    import difflib  # only for a misspelt key or value

    close = difflib.get_close_matches(word, list(choices), n=1, cutoff=0.6)
    return f" (did you mean {close[0]!r}?)" if close else ""


def suggest_id(word: str, ids) -> str:
    """A close id, else the whole (short) list of ids the vessel has."""
    hint = suggest(word, ids)
    ids = list(ids)
    if hint or not ids:
        return hint or " (it has none)"
    return f" (it has {', '.join(ids)})" if len(ids) <= 8 else ""


@frozen
class Wording:
    """How one kind of file words its problems (the rules themselves are shared)."""

    value: Callable[[Any], str] = toml_value
    """Writes an offending value, or an array element quoted in a rule."""
    element: str = "row"
    """What an array element is called: 'row 3: 12.0 after 12.4'."""
    missing: str = "required key is missing"
    """The rule for a required key that is absent."""


# =========================================================================== rules

# rules for single numbers: each returns None when satisfied, else the broken rule
Rule = Callable[[float], "str | None"]


def positive(x: float) -> str | None:
    return None if x > 0 else "must be greater than 0"


def non_negative(x: float) -> str | None:
    return None if x >= 0 else "must not be negative"


def above(lo: float) -> Rule:
    """Strictly greater than ``lo`` (geometry files word ``positive`` this way: 'must be above 0')."""
    def rule(x: float) -> str | None:
        return None if x > lo else f"must be above {num(lo)}"

    return rule


def between(lo: float, hi: float, unit: str = "", why: str = "") -> Rule:
    u = unit if unit in ("", "°") else f" {unit}"
    w = f" ({why})" if why else ""

    def rule(x: float) -> str | None:
        if x < lo:
            return f"below {num(lo)}{u}: must be between {num(lo)} and {num(hi)}{u}{w}"
        if x > hi:
            return f"above {num(hi)}{u}: must be between {num(lo)} and {num(hi)}{u}{w}"
        return None

    return rule


def at_most(limit: float, what: str) -> Rule:
    """At most ``limit`` (with round-off allowance); ``what`` follows the limit: its unit and meaning.
    A mass (``what`` in tonnes) far above it whose thousandth fits is said to look like kilograms
    (:func:`deckload.core.bounds.kilograms_hint`)."""
    from deckload.core.bounds import kilograms_hint

    def rule(x: float) -> str | None:
        if x > limit + REL_TOL * max(1.0, abs(limit)):
            kg = kilograms_hint(x, 0.0, limit) if what.startswith("t,") or what == "t" else ""
            return f"above {num(limit)} {what}{kg}"
        return None

    return rule


# =========================================================================== reading


class FileCheck:
    """One file being read: its name, its key→line map and the problems found.

    ``error`` is the exception raised with the problems (a :class:`ProfileError`).
    """

    def __init__(self, filename: str, text: str, wording: Wording = Wording(),
                 error: type[ProfileError] = ProfileError):
        self.file = filename
        self.text = text
        self.wording = wording
        self.error = error
        self.problems: list[Problem] = []
        self._lines: dict[tuple, int] | None = None
        self.sources: dict[tuple, "Callable[[tuple], tuple[str, int | None, str, Any]]"] = {}
        """Keys whose values came from another file (a CSV table): key path → locator.
        A locator maps the element path within the key ((row,) or (row, column)) to
        (file, line, column label, the cell as written) for the problem report."""
        self.csv_headers: dict[tuple, list[str]] = {}
        """Table path → the header of the CSV file it was read from (column order, for writing back)."""
        self.unread_csv: set[tuple] = set()
        """Tables whose CSV file could not be read: their missing columns are not reported again."""
        self.csv_texts: dict[tuple, list[str]] = {}
        """Key path → the cells of its CSV column as typed (the decimals printed)."""
        self.csv_ignored: dict[tuple, list[str]] = {}
        """Table path → the booklet columns its CSV file gave that are read as numbers and not used."""

    def fmt(self, v: Any) -> str:
        return self.wording.value(v)

    def line_of(self, raw: tuple) -> int | None:
        if self._lines is None:
            self._lines = key_lines(self.text)
        for k in range(len(raw), 0, -1):
            if raw[:k] in self._lines:
                return self._lines[raw[:k]]
        return None

    def add(self, raw: tuple, key: str, value: str | None, rule: str, line: int | None = None) -> None:
        for n in range(len(raw), 0, -1):
            locate = self.sources.get(raw[:n])
            if locate is not None:
                file, at_line, column, cell = locate(raw[n:])
                shown = value if cell is MISSING or value is None else self.fmt(cell)
                self.problems.append(Problem(file, at_line, key, shown, rule, column))
                return
        self.problems.append(Problem(self.file, line or self.line_of(raw), key, value, rule))

    def parse(self) -> dict:
        from deckload.io.limits import MAX_TOML_BYTES

        if len(self.text) > MAX_TOML_BYTES:
            raise self.error([Problem(self.file, None, "", None,
                                      f"longer than the {MAX_TOML_BYTES} characters allowed: refused unread")])
        if self.text.startswith("\ufeff"):
            # an editor's UTF-8 byte-order mark: TOML's reader takes it for a stray character and
            # said only "Invalid statement (column 1)"; profiles, conditions and geometry files alike
            raise self.error([Problem(self.file, 1, "", None,
                                      "starts with a byte-order mark (U+FEFF, the bytes EF BB BF), which the TOML reader does "
                                      "not take: save the file as UTF-8 without a byte-order mark")])
        try:
            return tomllib.loads(self.text)
        except RecursionError:
            raise self.error([Problem(self.file, None, "", None,
                                      "TOML: arrays or tables nested too deeply to be a vessel's data")]) from None
        except (OverflowError, MemoryError):
            raise self.error([Problem(self.file, None, "", None, "TOML: a value too large to read")]) from None
        except ValueError as e:
            if not isinstance(e, tomllib.TOMLDecodeError):
                # e.g. an integer of thousands of digits (Python's int conversion limit)
                raise self.error([Problem(self.file, None, "", None, f"TOML: a value that cannot be read ({e})")]) from None
            msg = str(e)
            mm = re.search(r"\s*\(at line (\d+), column (\d+)\)$", msg)
            line = None
            if mm:
                line = int(mm.group(1))
                msg = f"{msg[: mm.start()]} (column {mm.group(2)})"
            else:
                msg = msg.replace(" (at end of document)", " (at the end of the file)")
            raise self.error([Problem(self.file, line, "", None, f"TOML syntax: {msg}")]) from None

    def root(self) -> "Table":
        """The parsed file as its top-level table (raises on a syntax error)."""
        return Table(self, self.parse(), (), "")

    def fail_if_any(self) -> None:
        if self.problems:
            # in file order, so the list reads like the file; problems without a line last
            raise self.error(sorted(self.problems, key=lambda p: p.line if p.line else math.inf))


class Table:
    """A TOML table being read: remembers which keys were asked for, to catch unknown ones.

    ``raw`` is the table's path in the parsed document (for its line), ``name`` its
    dotted key in messages (entries of an array of tables by id once known).
    """

    def __init__(self, ctx: FileCheck, data: dict, raw: tuple, name: str):
        self.ctx = ctx
        self.data = data
        self.raw = raw
        self.name = name
        self.asked: list[str] = []

    def key(self, k: str) -> str:
        return f"{self.name}.{_qk(k)}" if self.name else _qk(k)

    def bad(self, k: str, value: Any, rule: str, at: tuple = ()) -> None:
        """Report a problem with key ``k``; ``at`` = (row,) or (row, column) locates it in an array."""
        self.ctx.add(self.raw + (k,) + at, self.key(k), None if value is MISSING else self.ctx.fmt(value), rule)

    def has(self, k: str) -> bool:
        return k in self.data

    def get(self, k: str, required: bool = True) -> Any:
        """The raw value of ``k`` (or :data:`MISSING`), marking the key as known."""
        if k not in self.asked:
            self.asked.append(k)
        if k not in self.data:
            if required and self.raw not in self.ctx.unread_csv:
                self.bad(k, MISSING, self.ctx.wording.missing)
            return MISSING
        return self.data[k]

    def _row(self, i: int) -> str:
        return f"{self.ctx.wording.element} {i + 1}"

    # -- scalars
    def num(self, k: str, *rules: Rule, required: bool = True, default: float | None = None) -> float | None:
        v = self.get(k, required)
        if v is MISSING:
            return default
        if not is_number(v):
            self.bad(k, v, f"must be a number, not {toml_type(v)}")
            return None
        x = finite_float(v)
        if x is None:
            self.bad(k, v, "must be a finite number")
            return None
        for r in rules:
            msg = r(x)
            if msg:
                self.bad(k, v, msg)
                return None
        return x

    def text(self, k: str, *, required: bool = True, default: str | None = "", choices=None, empty_ok: bool = False,
             one_line: bool = False, max_chars: int | None = None):
        """A string.  ``one_line``: no line feed or tab, as a one-line field of the screen takes it
        (a name printed on a line of its own could otherwise print lines that look like output:
        a false verdict).  ``max_chars``: at most that many characters (the screen's field's limit)."""
        v = self.get(k, required)
        if v is MISSING:
            return default
        if not isinstance(v, str):
            self.bad(k, v, f"must be a string, not {toml_type(v)}")
            return None
        if choices is not None and v not in choices:
            self.bad(k, v, "must be one of " + ", ".join(self.ctx.fmt(c) for c in choices) + suggest(v, choices))
            return None
        if not v.strip() and not empty_ok:
            self.bad(k, v, "must not be empty")
            return None
        if max_chars is not None and len(v) > max_chars:
            self.bad(k, v, f"at most {max_chars} characters ({len(v)} given)")
            return None
        if one_line and ("\n" in v or "\t" in v):
            what = "a line break" if "\n" in v else "a tab"
            self.bad(k, v, f"holds {what}: must be one line of text, as typed in the screen's one-line field")
            return None
        bad = control_char(v)
        if bad is not None:
            self.bad(k, v, f"holds the control character {bad}: text must be printable (tab and line feed allowed)")
            return None
        return v

    def file_format(self, expected: str) -> None:
        """The ``format`` key of a file's root: a file that names another format (a profile given
        where a geometry file is asked for, a condition for a profile) is refused on that alone.
        Read as the wrong kind, its every section would be one more "unknown key": a message of
        thousands of lines burying the one that matters."""
        self.text("format", choices=(expected,))
        if isinstance(self.data.get("format"), str) and self.data["format"] != expected:
            self.ctx.fail_if_any()

    # -- arrays
    def array(self, k: str, *rules: Rule, required: bool = True, min_len: int = 2,
              length: int | None = None) -> np.ndarray | None:
        """An array of finite numbers, at least ``min_len`` of them (exactly ``length`` if given)."""
        v = self.get(k, required)
        if v is MISSING:
            return None
        if not isinstance(v, list):
            self.bad(k, v, f"must be an array of numbers, not {toml_type(v)}")
            return None
        if len(v) < min_len:
            self.bad(k, v, f"needs at least {min_len} values, has {len(v)}")
            return None
        if len(v) > MAX_TABLE_VALUES:
            self.bad(k, MISSING, f"has {len(v)} values, more than the {MAX_TABLE_VALUES} allowed in one table")
            return None
        fmt = self.ctx.fmt
        for i, x in enumerate(v):
            if not is_number(x):
                self.bad(k, v, f"{self._row(i)}: {fmt(x)} is {toml_type(x)}, not a number", (i,))
                return None
            if finite_float(x) is None:
                self.bad(k, v, f"{self._row(i)}: {fmt(x)} is not a finite number", (i,))
                return None
        if length is not None and len(v) != length:
            self.bad(k, v, f"must have {length} values, has {len(v)}")
            return None
        arr = np.array(v, dtype=float)
        for r in rules:
            for i, x in enumerate(arr):
                msg = r(float(x))
                if msg:
                    self.bad(k, v, f"{msg} ({self._row(i)}: {fmt(v[i])})", (i,))
                    return None
        return arr

    def increasing(self, k: str, arr: np.ndarray | None, *, decreasing: bool = False) -> np.ndarray | None:
        """``arr`` if strictly increasing (``decreasing``: strictly decreasing), else reports the
        first offending row, numbered as written."""
        if arr is None:
            return None
        d = np.diff(arr) * (-1.0 if decreasing else 1.0)
        if np.all(d > 0):
            return arr
        i = int(np.argmax(d <= 0)) + 1
        fmt = self.ctx.fmt
        way = "decreasing" if decreasing else "increasing"
        self.bad(k, self.data[k], f"not strictly {way} ({self._row(i)}: {fmt(self.data[k][i])} after "
                 f"{fmt(self.data[k][i - 1])})", (i,))
        return None

    def written(self, k: str, i: int) -> Any:
        """Row ``i`` of ``k`` as typed: the CSV cell's text, or the TOML value (for its decimals)."""
        texts = self.ctx.csv_texts.get(self.raw + (k,))
        if texts is not None and 0 <= i < len(texts):
            return texts[i]
        v = self.data.get(k)
        return v[i] if isinstance(v, list) and -len(v) <= i < len(v) else v

    def starts_at(self, k: str, arr: np.ndarray | None, first: float, why: str) -> np.ndarray | None:
        if arr is None:
            return None
        if abs(float(arr[0]) - first) > REL_TOL * max(1.0, abs(float(arr[-1]))):
            self.bad(k, self.data[k], f"must start at {num(first)} ({why})")
            return None
        return arr

    def ends_at(self, k: str, arr: np.ndarray | None, last: float, why: str) -> np.ndarray | None:
        if arr is None:
            return None
        if abs(float(arr[-1]) - last) > REL_TOL * max(1.0, abs(last)):
            self.bad(k, self.data[k], f"must end at {num(last)} ({why})")
            return None
        return arr

    def pair(self, k: str, *rules: Rule, required: bool = True,
             form: str = "[from, to] with from below to") -> tuple[float, float] | None:
        """Two numbers, the first below the second; else the rule 'must be ``form``'."""
        arr = self.array(k, *rules, required=required)
        if arr is None:
            return None
        if len(arr) != 2 or not arr[0] < arr[1]:
            self.bad(k, self.data[k], f"must be {form}")
            return None
        return float(arr[0]), float(arr[1])

    def same_length(self, ref: str, arrays: dict[str, np.ndarray | None]) -> bool:
        """Every array of one table has one value per row of its abscissa ``ref``."""
        n = self.raw_len(ref)
        ok = arrays.get(ref) is not None
        for k, a in arrays.items():
            if a is None:
                ok = False
            elif k != ref and n is not None and len(a) != n:
                self.bad(k, self.data[k], f"has {len(a)} values but {ref} has {n}: one value per row")
                ok = False
        return ok

    def raw_len(self, k: str) -> int | None:
        """Number of values written for ``k`` (even if they are wrong), to check other arrays against."""
        v = self.data.get(k)
        return len(v) if isinstance(v, list) else None

    def matrix(self, k: str, rows_name: str, n_rows: int | None, cols_name: str, n_cols: int | None) -> np.ndarray | None:
        """A 2-D table of finite numbers, one row per ``rows_name`` value, one column per ``cols_name`` value."""
        v = self.get(k, True)
        if v is MISSING:
            return None
        if not isinstance(v, list) or not all(isinstance(r, list) for r in v):
            self.bad(k, v, f"must be an array of rows (arrays of numbers), one row per {rows_name} value")
            return None
        cells = sum(len(r) for r in v)
        if cells > MAX_TABLE_VALUES:
            self.bad(k, MISSING, f"has {cells} values, more than the {MAX_TABLE_VALUES} allowed in one table")
            return None
        for i, row in enumerate(v):
            for j, x in enumerate(row):
                if not is_number(x) or finite_float(x) is None:
                    self.bad(k, v, f"row {i + 1}, column {j + 1}: {self.ctx.fmt(x)} is not a finite number", (i, j))
                    return None
        if n_rows is None or n_cols is None:
            return None
        if len(v) != n_rows:
            self.bad(k, v, f"has {len(v)} rows but {rows_name} has {n_rows} values: one row per {rows_name} value")
            return None
        for i, row in enumerate(v):
            if len(row) != n_cols:
                self.bad(k, v, f"row {i + 1} has {len(row)} values but {cols_name} has {n_cols}: "
                         f"one column per {cols_name} value", (i,))
                return None
        return np.array(v, dtype=float)

    # -- tables
    def table(self, k: str, *, required: bool = True, name: str | None = None) -> "Table | None":
        v = self.get(k, required)
        if v is MISSING:
            return None
        if not isinstance(v, dict):
            self.bad(k, v, f"must be a table, not {toml_type(v)}")
            return None
        return Table(self.ctx, v, self.raw + (k,), name if name is not None else self.key(k))

    def tables(self, k: str) -> list["Table"]:
        """An array of tables ``[[k]]``, each named ``k[#n]`` until its id is known."""
        v = self.get(k, False)
        if v is MISSING:
            return []
        if not isinstance(v, list) or not all(isinstance(t, dict) for t in v):
            self.bad(k, v, f"must be an array of tables ([[{k}]] sections)")
            return []
        return [Table(self.ctx, t, self.raw + (k, i), f"{self.key(k)}[#{i + 1}]") for i, t in enumerate(v)]

    def finish(self) -> None:
        """Report every key nobody asked for: a misspelt key must not be ignored."""
        for k, v in self.data.items():
            if k not in self.asked:
                self.bad(k, v, "unknown key" + suggest(k, self.asked))


def claim_id(t: Table, kind: str, ids: dict[str, str]) -> str | None:
    """Read an entry's ``id``, check its form and uniqueness, and rename the entry after it.

    ``ids`` maps each id claimed so far to the name of the entry that claimed it,
    shared by all kinds of entry that must not use the same id.
    """
    ident = t.text("id", default=None)
    if ident is None:
        return None
    if not ID_PATTERN.match(ident):
        t.bad("id", ident, "must use only letters, digits, '-' and '_'")
        return None
    first = ids.get(ident)
    own = t.name
    t.name = f"{kind}[{ident}]"
    if first is not None:
        t.ctx.add(t.raw + ("id",), f"{own}.id", t.ctx.fmt(ident), f"duplicate id: already used by {first}")
        return None
    ids[ident] = own
    return ident


def check_tank_pairs(entries: list[tuple[Table, str | None, str | None]]) -> bool:
    """Each (entry, id, pair) names as its pair an existing entry that names it back."""
    by_id = {ident: pair for _, ident, pair in entries if ident is not None}
    ok = True
    for t, ident, p in entries:
        if ident is None or p is None:
            continue
        if p == ident:
            t.bad("pair", p, "a tank cannot be its own pair")
            ok = False
        elif p not in by_id:
            t.bad("pair", p, "no tank with this id" + suggest(p, [i for i in by_id if i != ident]))
            ok = False
        elif by_id[p] != ident:
            back = by_id[p]
            t.bad("pair", p, f"tank {p} does not name {ident} back as its pair "
                  + (f"(it names {back!r})" if back else "(it has no pair)"))
            ok = False
    return ok
