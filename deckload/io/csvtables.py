"""Profile tables kept in CSV files: read into the profile, and written out for comparison.

A table of a profile (``[hydrostatics]``, ``[cross_curves]``, ``[tank.calibration]``,
``[limit_curve]``, ``[downflooding]``, a ``[[hold]]``'s fill table) may name a CSV file
with ``csv = "file.csv"`` (relative to the profile).  The file has a header row of
the table's own TOML array keys (vessel_profiles/README.md, "Tables in CSV files");
each column becomes that array, exactly as if it had been written in the TOML, and
every check of :mod:`deckload.io.profiles` applies to it unchanged.  A problem in a
column is reported against the CSV file, its line and column, and the cell as
written (:attr:`deckload.io.tomlcheck.FileCheck.sources`).

Cross curves are one column per heel angle, named ``kn_`` + the angle (``kn_0``,
``kn_10``, … ``kn_12.5``), beside ``displacement_t``.
"""

from __future__ import annotations

import io
import re
from pathlib import Path
from typing import Any

from deckload.io.tomlcheck import MISSING, Table

NUMBER = re.compile(r"^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$", re.ASCII)
"""A number as a spreadsheet writes it: decimal point, optional exponent (no '1_000', 'nan', 'inf'),
digits 0–9 only (not those of other scripts or full-width ones, which ``float`` would also read)."""

KN_COLUMN = re.compile(r"^kn_(\d+(?:\.\d+)?)$", re.ASCII)


def _cell(text: str) -> Any:
    """A cell: a float when it reads as a number, else the text (the checks then name it)."""
    s = text.strip()
    return float(s) if NUMBER.match(s) else s


class CsvTable:
    """A CSV file read as header + rows, with the file line of every row."""

    def __init__(self, file: str, header: list[str], rows: list[list[Any]], lines: list[int], header_line: int,
                 texts: list[list[str]] | None = None):
        self.file = file
        self.header = header
        self.rows = rows
        self.lines = lines
        self.header_line = header_line
        self.texts = texts if texts is not None else [[str(c) for c in r] for r in rows]
        """Every cell's text as typed (stripped): the decimals printed, for a rounding allowance."""

    def column_label(self, j: int) -> str:
        return f"column {j + 1} {self.header[j]!r}"


def read_csv(t: Table, key: str = "csv") -> CsvTable | None:
    """The CSV file named by ``t``'s ``csv`` key, or None (problems reported on ``t``)."""
    name = t.text(key)
    if name is None:
        return None
    base = Path(t.ctx.file).parent
    path = base / name
    shown = str(path)
    from deckload.io.limits import MAX_TABLE_VALUES, MAX_TOML_BYTES, read_limited

    try:
        data = read_limited(path, MAX_TOML_BYTES, "a CSV table")
    except OSError as e:
        t.bad(key, name, f"cannot read the CSV file {shown}: {e.strerror or e}")
        return None
    try:
        text = data.decode("utf-8-sig")  # spreadsheets often start UTF-8 files with a BOM
    except UnicodeDecodeError as e:
        line = data[: e.start].count(b"\n") + 1
        t.ctx.problems.append(_problem(shown, line, t.key(key), None, f"not UTF-8 text (byte {e.start + 1}); save the CSV as UTF-8"))
        return None
    rows: list[list[Any]] = []
    texts: list[list[str]] = []
    lines: list[int] = []
    header: list[str] | None = None
    header_line = 1
    import csv  # only for a profile that keeps tables in CSV files

    reader = csv.reader(io.StringIO(text))
    ok = True
    read: list[tuple[int, list[str]]] = []
    try:
        for raw in reader:
            read.append((reader.line_num, raw))
            if len(read) > MAX_TABLE_VALUES:
                t.ctx.problems.append(_problem(shown, reader.line_num, t.key(key), None,
                                               f"more than the {MAX_TABLE_VALUES} rows allowed in one table"))
                return None
    except csv.Error as e:  # a field over the csv module's size limit, a NUL byte, …
        t.ctx.problems.append(_problem(shown, reader.line_num, t.key(key), None, f"not a readable CSV table ({e})"))
        return None
    for line, raw in read:
        cells = list(raw)
        while cells and not cells[-1].strip():  # trailing empty cells a spreadsheet may add
            cells.pop()
        if not cells:
            continue
        if header is None:
            header = [c.strip() for c in cells]
            header_line = line
            if len(header) == 1 and ";" in header[0]:
                t.ctx.problems.append(_problem(shown, line, t.key(key), repr(header[0]),
                                               "the cells are separated by ';': save the sheet as comma-separated "
                                               "CSV with a decimal point"))
                return None
            seen: set[str] = set()
            for j, h in enumerate(header):
                if not h:
                    t.ctx.problems.append(_problem(shown, line, t.key(key), None, f"header cell {j + 1} is empty: every column needs its name"))
                    ok = False
                elif h in seen:
                    t.ctx.problems.append(_problem(shown, line, t.key(key), repr(h), f"column name given twice (column {j + 1})"))
                    ok = False
                seen.add(h)
            continue
        if len(cells) != len(header):
            t.ctx.problems.append(_problem(shown, line, t.key(key), None,
                                           f"row has {len(cells)} cells but the header has {len(header)}: one cell per column"))
            ok = False
            continue
        rows.append([_cell(c) for c in cells])
        texts.append([c.strip() for c in cells])
        lines.append(line)
    if header is None:
        t.bad(key, name, f"the CSV file {shown} is empty: it needs a header row and the table's rows")
        return None
    return CsvTable(shown, header, rows, lines, header_line, texts) if ok else None


def _problem(file, line, key, value, rule):
    from deckload.io.tomlcheck import Problem

    return Problem(file, line, key, value, rule)


def _locator(c: CsvTable, j: int | None, matrix_cols: list[int] | None = None):
    """Maps an element path within an injected key to (file, line, column label, cell)."""

    def locate(at: tuple):
        if not at:
            return c.file, c.header_line, c.column_label(j) if j is not None else "", MISSING
        i = at[0]
        line = c.lines[i] if 0 <= i < len(c.lines) else c.header_line
        if matrix_cols is not None:
            if len(at) > 1 and 0 <= at[1] < len(matrix_cols):
                jj = matrix_cols[at[1]]
                cell = c.rows[i][jj] if 0 <= i < len(c.rows) else MISSING
                return c.file, line, c.column_label(jj), cell
            return c.file, line, "", MISSING
        cell = c.rows[i][j] if 0 <= i < len(c.rows) else MISSING
        return c.file, line, c.column_label(j), cell

    return locate


def _open_csv(t: Table):
    """The table's CSV file read, or None when it could not be (the problem is reported, and
    nothing else of the table is judged: its columns' absence would only repeat it)."""
    c = read_csv(t)
    if c is None:
        t.ctx.unread_csv.add(t.raw)
        for k in t.data:
            t.get(k, False)
    return c


def _ignored_words(ignored: tuple[str, ...]) -> str:
    """The refusal's list of the booklet columns that are read and not used."""
    return ("; booklet columns read (as numbers) and not used: " + ", ".join(ignored)) if ignored else ""


def _put_column(t: Table, c: CsvTable, j: int, h: str) -> None:
    t.data[h] = [row[j] for row in c.rows]
    t.ctx.sources[t.raw + (h,)] = _locator(c, j)
    t.ctx.csv_texts[t.raw + (h,)] = [row[j] for row in c.texts]


def attach_csv(t: Table, columns: tuple[str, ...], ignored: tuple[str, ...] = ()) -> bool:
    """If ``t`` names a CSV file, put its columns into ``t.data`` as arrays.

    ``columns`` are the names the table accepts from a CSV (its TOML array keys); ``ignored``
    the booklet quantities the table's page may also print that deckload does not use (a
    closed list: vessel_profiles/README.md, "Booklet columns read and not used"): they are put
    into ``t.data`` too and noted in ``t.ctx.csv_ignored``, for the reader to check as numbers
    (:func:`deckload.io.profiles._read_ignored`).  A column of another name, or one the TOML
    also gives, is a problem: a misspelt column must never drop its data silently.  False when
    the file could not be read (reported): the caller then reads nothing more of the table.
    """
    if not t.has("csv"):
        t.get("csv", False)
        return True
    c = _open_csv(t)
    if c is None:
        return False
    skipped: list[str] = []
    for j, h in enumerate(c.header):
        if h not in columns and h not in ignored:
            t.ctx.problems.append(_problem(c.file, c.header_line, t.key("csv"), repr(h),
                                           f"unknown column (column {j + 1}); this table's columns are "
                                           + ", ".join(columns) + _ignored_words(ignored)))
            continue
        if h in t.data:
            t.bad(h, t.data[h], f"given both in the TOML and as a column of {c.file}: give it once")
            continue
        _put_column(t, c, j, h)
        if h in ignored:
            skipped.append(h)
    t.ctx.csv_headers[t.raw] = list(c.header)
    if skipped:
        t.ctx.csv_ignored[t.raw] = skipped
    return True


def attach_kn_csv(t: Table, ignored: tuple[str, ...] = ()) -> bool:
    """Cross curves from a CSV: ``displacement_t`` and one ``kn_<angle>`` column per heel, and
    any of the ``ignored`` booklet columns (read as numbers and not used, as :func:`attach_csv`)."""
    if not t.has("csv"):
        t.get("csv", False)
        return True
    c = _open_csv(t)
    if c is None:
        return False
    kn_cols: list[int] = []
    heels: list[float] = []
    skipped: list[int] = []
    for j, h in enumerate(c.header):
        m = KN_COLUMN.match(h)
        if m:
            kn_cols.append(j)
            heels.append(float(m.group(1)))
        elif h in ignored:
            skipped.append(j)
        elif h != "displacement_t":
            t.ctx.problems.append(_problem(c.file, c.header_line, t.key("csv"), repr(h),
                                           f"unknown column (column {j + 1}); cross curves take displacement_t and "
                                           "one kn_<angle> column per heel angle, e.g. kn_0, kn_10, …, kn_60"
                                           + _ignored_words(ignored)))
            return False
    for j in skipped:
        if c.header[j] in t.data:
            t.bad(c.header[j], t.data[c.header[j]], f"given both in the TOML and as a column of {c.file}: give it once")
            return False
    for k in ("heel_deg", "displacement_t", "kn_m"):
        if k in t.data:
            t.bad(k, t.data[k], f"given both in the TOML and in {c.file}: give the table once")
            return
    if "displacement_t" not in c.header:
        t.ctx.problems.append(_problem(c.file, c.header_line, t.key("csv"), None, "needs a displacement_t column"))
        return
    jd = c.header.index("displacement_t")
    _put_column(t, c, jd, "displacement_t")
    for j in skipped:
        _put_column(t, c, j, c.header[j])
    if skipped:
        t.ctx.csv_ignored[t.raw] = [c.header[j] for j in skipped]
    t.ctx.csv_headers[t.raw] = list(c.header)
    t.data["heel_deg"] = heels
    t.ctx.sources[t.raw + ("heel_deg",)] = lambda at: (c.file, c.header_line,
                                                       c.column_label(kn_cols[at[0]]) if at and at[0] < len(kn_cols) else "",
                                                       MISSING)
    t.data["kn_m"] = [[row[j] for j in kn_cols] for row in c.rows]
    t.ctx.sources[t.raw + ("kn_m",)] = _locator(c, None, kn_cols)
    return True


TRIM_COLUMN = re.compile(r"^(corr|volume)_([+-]?\d+(?:\.\d+)?)$", re.ASCII)
TRIM_KINDS = {"corr": "sounding_correction_m", "volume": "volume_m3"}


def attach_trim_csv(t: Table) -> bool:
    """A tank's trim corrections from a CSV: ``sounding_m`` and one column per trim, named
    ``corr_<trim>`` (sounding corrections, m) or ``volume_<trim>`` (volumes, m³), trim in m,
    + by the stern unless the table's ``trim_positive`` says otherwise (``corr_-1.0``, ``corr_0.5``,
    ``corr_+1``); the reader turns them (profiles._read_trim_correction)."""
    if not t.has("csv"):
        t.get("csv", False)
        return True
    c = _open_csv(t)
    if c is None:
        return False
    cols: list[int] = []
    trims: list[float] = []
    kinds: set[str] = set()
    for j, h in enumerate(c.header):
        m = TRIM_COLUMN.match(h)
        if m:
            cols.append(j)
            trims.append(float(m.group(2)))
            kinds.add(m.group(1))
        elif h != "sounding_m":
            t.ctx.problems.append(_problem(c.file, c.header_line, t.key("csv"), repr(h),
                                           f"unknown column (column {j + 1}); trim corrections take sounding_m and "
                                           "one corr_<trim> (or volume_<trim>) column per trim, e.g. corr_-0.5, corr_1"))
            return False
    if len(kinds) != 1 or "sounding_m" not in c.header:
        t.ctx.problems.append(_problem(c.file, c.header_line, t.key("csv"), None,
                                       "needs a sounding_m column and corr_<trim> columns or volume_<trim> columns "
                                       "(one kind, not both)"))
        return False
    key = TRIM_KINDS[kinds.pop()]
    for k in ("sounding_m", "trim_m", key):
        if k in t.data:
            t.bad(k, t.data[k], f"given both in the TOML and in {c.file}: give the table once")
            return False
    js = c.header.index("sounding_m")
    t.data["sounding_m"] = [row[js] for row in c.rows]
    t.ctx.sources[t.raw + ("sounding_m",)] = _locator(c, js)
    t.data["trim_m"] = trims
    t.ctx.sources[t.raw + ("trim_m",)] = lambda at: (c.file, c.header_line,
                                                     c.column_label(cols[at[0]]) if at and at[0] < len(cols) else "",
                                                     MISSING)
    t.data[key] = [[row[j] for j in cols] for row in c.rows]
    t.ctx.sources[t.raw + (key,)] = _locator(c, None, cols)
    return True


# =========================================================================== writing


def fmt_number(x: float) -> str:
    """A number for a CSV cell: at most 10 significant digits, so that the round-off of a
    datum conversion (1.907 + 11.5 − 11.5) does not show, and trailing zeros dropped."""
    s = f"{x:.10g}"
    return "0" if s == "-0" else s


def write_csv(path: Path, header: list[str], rows: list[list[Any]]) -> None:
    import csv

    from deckload.io.atomicfile import write_atomic

    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(header)
    for r in rows:
        w.writerow([fmt_number(v) if isinstance(v, float) else v for v in r])
    write_atomic(path, buf.getvalue())
