"""``deckload log …``: record a condition, show, export and verify the voyage log.

Exit codes: 0 done; 1 bad input (among it an export's output that is a file of a voyage log:
:mod:`deckload.io.outputs`), a log that fails verification, or a log held by another writer;
2 a file that cannot be read or written.
"""

from __future__ import annotations

import csv
import html as htmllib
import io
import os
import sys
import textwrap
from pathlib import Path

from deckload.report import verdict_format as vf
from deckload.io.atomicfile import write_atomic
from deckload.io.textsafe import escape_breaks, join_lines
from deckload.logbook import (
    KIND_LABELS,
    LogEntry,
    Logbook,
    LogLockedError,
    back_words,
    case_stray_words,
    case_strays,
    clock_back,
    clock_back_words,
    log_files,
)

CAUTION = vf.CAUTION

CSV_COLUMNS = (
    "seq", "utc", "ship_time", "ship_clock", "clock_back", "vessel", "by", "kind", "change", "remark", "condition_name",
    "displacement_t", "draft_fwd_m", "draft_aft_m", "draft_mean_m", "trim_m", "list_deg", "kg_fluid_m", "gm_fluid_m",
    "fsc_m", "criteria_pass", "criteria_failed", "criteria_sets", "criteria_not_assessable", "not_assessed",
    "verdict", "freeboard_m", "load_line_margin_m", "deck_edge_angle_deg", "smallest_margin_criterion", "smallest_margin",
    "smallest_margin_unit", "prev_sha256", "sha256",
)
"""Columns of ``deckload log export --csv`` (SI units, as in the log itself)."""


SHOW_WIDTH = 100
"""Columns ``log show`` wraps its own words within (an entry's change and remark stay on its row)."""


def _log_dir(args) -> Path:
    from deckload.io.paths import log_dir

    return Path(args.dir) if getattr(args, "dir", None) else log_dir()


def run_log(args) -> int:
    try:
        if args.log_command == "record":
            return _record(args)
        if args.log_command == "show":
            return _show(args)
        if args.log_command == "export":
            return _export(args)
        if args.log_command == "verify":
            return _verify(args)
    except BrokenPipeError:
        # The reader of standard output (e.g. `| head`) went away: what was printed is cut short.
        # ('record' catches it itself once the entry is on disk: see _record.)
        _stdout_gone()
        done = {"record": "; nothing was recorded",
                "export": "; the export is incomplete"}.get(args.log_command, "")
        print(f"deckload log {args.log_command}: output cut short: standard output was closed (broken pipe){done}",
              file=sys.stderr)
        return 2
    except OSError as e:
        done = {"record": "nothing was recorded", "export": "nothing was exported"}.get(args.log_command, "")
        where = e.filename or str(_log_dir(args))
        print(f"deckload: {where}: {e.strerror or e}" + (f"; {done}" if done else ""), file=sys.stderr)
        return 2
    print(f"deckload log: unknown command {args.log_command!r}", file=sys.stderr)
    return 2


def _stdout_gone() -> None:
    """Standard output's reader has gone: send what is left to /dev/null, so that Python's flush
    at exit does not fail on the closed pipe (and print a traceback-like line)."""
    sys.stdout = open(os.devnull, "w")


# --------------------------------------------------------------------------- record


def _record(args) -> int:
    from deckload.cli.calc import load_and_evaluate, print_doubts
    from deckload.logbook import KINDS, validate_initials

    try:
        by = validate_initials(args.by)
    except ValueError as e:
        print(f"deckload log record: --by: {e}", file=sys.stderr)
        return 1
    if args.kind not in KINDS:
        print(f"deckload log record: --kind {args.kind!r} is not one of: {', '.join(KINDS)}", file=sys.stderr)
        return 1
    loaded = load_and_evaluate(args.profile, args.condition)
    if isinstance(loaded, int):
        return loaded
    vessel, condition, result, doubts = loaded
    print_doubts(doubts, args.profile)
    directory = _log_dir(args)
    book = Logbook.open(directory, vessel.particulars.name, ship_offset=getattr(args, "ship_offset", None))
    try:
        if book.recovered_torn is not None:
            print(f"deckload: recovered: {book.recovered_torn}", file=sys.stderr)
        if book.restored_line_end is not None:
            print(f"deckload: repaired: {book.restored_note}", file=sys.stderr)
        if book.readonly:
            print(f"deckload: cannot record: {book.path}: {book.readonly_reason}", file=sys.stderr)
            return 1
        before = book.verify()  # (an append never repairs a broken chain: the officer must hear of it)
        if not before.ok:
            print(f"deckload: WARNING: {before.failing_words(book.path.name)}", file=sys.stderr)
        entry = book.append(
            kind=args.kind,
            by=by,
            change_text=f"{KIND_LABELS[args.kind]}: {condition.name}",
            change_data={"profile": str(args.profile), "condition_file": str(args.condition)},
            result=result,
            condition=condition,
            remark=join_lines(args.remark),
        )
    except (LogLockedError, ValueError) as e:
        print(f"deckload: cannot record: {e}", file=sys.stderr)
        return 1
    except OSError as e:
        # e.g. a full disk: the log was cut back to its last good line, nothing half-written stays
        print(f"deckload: cannot record in {book.path}: {e.strerror or e}; nothing was recorded", file=sys.stderr)
        return 2
    finally:
        book.close()
    if book.head_problem:
        print(f"deckload: warning: {book.head_path}: {book.head_problem} (the entry itself is recorded)",
              file=sys.stderr)
    if book.clock_back is not None:
        print(f"deckload: warning: {clock_back_words(entry.seq, *book.clock_back)}", file=sys.stderr)
    try:
        print(
            f"Recorded entry #{entry.seq} in {book.path} at {entry.utc:%Y-%m-%d %H:%M:%S} UTC by {entry.by}: "
            f"Δ {result.displacement_t:.1f} t, GM fluid {result.gm_fluid_m:.3f} m."
        )
        for line in vf.verdict_lines(result, 100, "  "):
            print(line)
        print(CAUTION)
        sys.stdout.flush()
        if not before.ok:  # said again last, where the eye ends
            print(f"deckload: WARNING: entry #{entry.seq} is recorded, but {before.failing_words(book.path.name)}",
                  file=sys.stderr)
    except OSError as e:
        # The entry is on disk: saying otherwise would invite a second, duplicate record.
        if isinstance(e, BrokenPipeError):
            _stdout_gone()
        print(f"deckload: entry #{entry.seq} was recorded in {book.path}; then printing its summary failed: "
              f"{e.strerror or e} (do not record it again)", file=sys.stderr)
        return 2 if not isinstance(e, BrokenPipeError) else 0
    return 0


# --------------------------------------------------------------------------- reading


def _books(args) -> list[Logbook]:
    """Read-only logs in the folder: the one for --vessel, or every log."""
    directory = _log_dir(args)
    vessel = getattr(args, "vessel", None)
    if vessel:
        book = Logbook.open(directory, vessel, readonly=True)
        if not book.path.exists():
            book.close()
            raise FileNotFoundError(2, f"no log for vessel {vessel!r}", str(book.path))
        return [book]
    # Each file found is read as itself, the log of the vessel its file name says: the name
    # written inside it chooses nothing (verify reports an entry that records another vessel).
    return [Logbook.open_file(p, readonly=True) for p in log_files(directory)]


def _fmt(x, digits: int = 3) -> str:
    if x is None:
        return ""
    if isinstance(x, (int, float)) and not isinstance(x, bool):
        return f"{x:.{digits}f}"
    return str(x)


def entry_row(e: LogEntry, back: tuple[int, object] | None = None) -> dict[str, str]:
    """One entry as the CSV/HTML columns (:data:`CSV_COLUMNS`); ``back`` is what
    :func:`~deckload.logbook.clock_back` says of it (timed earlier than the entry before)."""
    s = e.summary or {}
    sm = s.get("smallest_margin") or {}
    return {
        "seq": str(e.seq),
        "utc": e.utc.strftime("%Y-%m-%dT%H:%M:%S.%f")[:-3] + "Z",
        "ship_time": e.ship_time.strftime("%Y-%m-%d %H:%M:%S"),
        "ship_clock": e.ship_clock,
        "clock_back": back_words(back),
        "vessel": e.vessel,
        "by": e.by,
        "kind": e.kind,
        "change": e.change_text,
        "remark": e.remark,
        "condition_name": s.get("condition_name", ""),
        "displacement_t": _fmt(s.get("displacement_t"), 2),
        "draft_fwd_m": _fmt(s.get("draft_fwd_m")),
        "draft_aft_m": _fmt(s.get("draft_aft_m")),
        "draft_mean_m": _fmt(s.get("draft_mean_m")),
        "trim_m": _fmt(s.get("trim_m")),
        "list_deg": _fmt(s.get("list_deg"), 1),  # angles to 0.1°, as every view gives them
        "kg_fluid_m": _fmt(s.get("kg_fluid_m")),
        "gm_fluid_m": _fmt(s.get("gm_fluid_m")),
        "fsc_m": _fmt(s.get("fsc_m")),
        "criteria_pass": {"": "", "met": "pass", "NOT MET": "FAIL", "met where assessable": "n/a"}[vf.stored_word(s)],
        "criteria_failed": " ".join(s.get("criteria_failed", [])),
        "criteria_sets": " ".join(f"{x.get('id')}={'pass' if x.get('pass') else 'FAIL'}"
                                  for x in s.get("criteria_sets") or []),
        "criteria_not_assessable": " ".join(str(x.get("id")) for x in s.get("criteria_not_assessable") or []),
        "not_assessed": "; ".join(f"{x.get('item')}: {x.get('reason')}" for x in s.get("not_assessed") or []),
        "verdict": s.get("verdict", ""),
        "freeboard_m": _fmt(s.get("freeboard_m")),
        "load_line_margin_m": _fmt(s.get("load_line_margin_m")),
        "deck_edge_angle_deg": _fmt(s.get("deck_edge_angle_deg"), 1),
        "smallest_margin_criterion": sm.get("id", ""),
        "smallest_margin": _fmt(sm.get("margin")),
        "smallest_margin_unit": sm.get("unit", ""),
        "prev_sha256": e.prev_sha256,
        "sha256": e.sha256,
    }


def broken_words(path: Path, problems: list[str]) -> str:
    """What a view or an export of a log says first when its chain does not verify: a line was
    edited, removed or damaged since it was written, so the entries shown may not be the ones
    recorded (``deckload log verify`` names each problem)."""
    return (f"LOG CHAIN BROKEN: {path} fails verification ({len(problems)} problem(s), the first: "
            f"{problems[0]}). The entries below may not be what was recorded: run 'deckload log verify'; "
            "do not sign this copy as the voyage record.")


def damaged_row(path: Path, problem: str) -> str:
    """A log line that cannot be shown, in its place among the entries: the file, the line and why."""
    return f"   !  DAMAGED {path.name} {problem} — left out (run 'deckload log verify')"


def _strays(args) -> list[str]:
    """A log's files found under names in other letters' case (never read): what to say of each."""
    from deckload.io.paths import vessel_slug

    vessel = getattr(args, "vessel", None)
    return [case_stray_words(*s) for s in case_strays(_log_dir(args), vessel_slug(vessel) if vessel else None)]


def _show(args) -> int:
    strays = _strays(args)
    for words in strays:
        print(f"  ! NOT READ: {words}")
    books = _books(args)
    if not books:
        print(f"no logs in {_log_dir(args)}")
        return 1 if strays else 0
    broken = len(strays)
    for book in books:
        try:
            entries = book.entries()
            rep = book.verify()
            if not rep.ok:
                broken += 1
                print(f"  ! {broken_words(book.path, rep.problems)}")
            print(f"{escape_breaks(book.vessel_name)} — {book.path} ({len(entries)} entries)")
            print(f"{'#':>4}  {'ship time (UTC offset)':<25}  {'by':<4}  {'kind':<9}  {'GM fl m':>7}  {'criteria':<14}  "
                  "change")
            damaged = list(book.skipped_lines)
            back = clock_back(entries)
            for e in entries:
                while damaged and damaged[0][0] < e.line_no:
                    print(damaged_row(book.path, damaged.pop(0)[1]))
                r = entry_row(e)
                # The ship's date and time with its offset from UTC (the UTC time follows from them).  The
                # change stays on its row, never wrapped: text typed or stored must not make a line that
                # looks like an entry's row of its own.
                print(f"{e.seq:>4}  {e.ship_time:%Y-%m-%d %H:%M} ({e.ship_clock})  {escape_breaks(e.by):<4}  "
                      f"{escape_breaks(e.kind):<9}  {r['gm_fluid_m']:>7}  {vf.stored_short(e.summary):<14}  "
                      f"{escape_breaks(e.change_text)}" + (f" — {escape_breaks(e.remark)}" if e.remark else ""))
                if e.line_no in back:
                    print(f"      ◂ {back_words(back[e.line_no])}")
                if e.line_no in rep.doubtful_lines:
                    print(f"      ! line {e.line_no} is named by verify (edited, moved, inserted, duplicated or another "
                          "vessel's): see the notice above")
                na = (e.summary or {}).get("not_assessed")
                if na:
                    text = "not assessed: " + vf.grouped_not_assessed((x.get("item"), x.get("reason")) for x in na)
                    print("\n".join(textwrap.wrap(text, SHOW_WIDTH, initial_indent=" " * 6, subsequent_indent=" " * 8)))
            for _, s in damaged:
                print(damaged_row(book.path, s))
            print()
        finally:
            book.close()
    print("\n".join(textwrap.wrap(CAUTION, SHOW_WIDTH)))
    return 1 if broken else 0  # (exit 1: a log that fails verification, as 'log verify')


def export_csv(books: list[tuple[str, list[LogEntry]]]) -> str:
    """The entries of each log in turn as CSV rows.  An entry timed earlier than the one before it is
    judged within its own log: two vessels' logs are two clocks (joined into one list, the first
    entry of the second log was marked as set back against the last of the first)."""
    buf = io.StringIO()
    w = csv.DictWriter(buf, fieldnames=CSV_COLUMNS, lineterminator="\r\n")
    w.writeheader()
    for _, entries in books:
        back = clock_back(entries)
        for e in entries:
            w.writerow(entry_row(e, back.get(e.line_no)))
    return buf.getvalue()


def export_html(books: list[tuple[str, list[LogEntry]]], broken: dict[str, str] | None = None,
                damaged: dict[str, list[str]] | None = None, not_read: list[str] = ()) -> str:
    """The log(s) as one printable HTML page (A4 landscape) for signature; ``broken`` maps a vessel to
    the words (:func:`broken_words`) printed above her table when her log fails verification,
    ``damaged`` to the lines of her log that could not be read (file, line and why), printed below it;
    ``not_read``: log files found under names in other letters' case, said first (their entries are
    not on the page).

    Every printed page repeats the vessel's name in the table's head and numbers the pages (CSS
    ``@page`` margin boxes, where the browser prints them); what was not assessed is written once
    under the table, each row naming its note; the signature lines of the condition report end it."""
    from deckload.report.condition_report import SIGNATURE_ROW_MM, signatures_html

    cols = ("seq", "ship_time", "utc", "by", "kind", "change", "remark", "displacement_t", "draft_fwd_m",
            "draft_aft_m", "trim", "list", "kg_fluid_m", "gm_fluid_m", "fsc_m", "freeboard_m", "criteria_pass",
            "criteria_sets", "not_assessed", "smallest_margin_criterion", "smallest_margin")
    heads = ("#", "Ship's time (UTC offset)", "UTC", "By", "Kind", "Change", "Remark", "Δ t", "T fwd m", "T aft m",
             "Trim", "List", "KG fluid m", "GM fluid m", "FSC m", "Freeboard m", "Criteria", "Sets assessed",
             "Not assessed", "Smallest margin", "Margin")
    out = [
        "<!DOCTYPE html>",
        '<html lang="en"><head><meta charset="utf-8"><title>Voyage loading log</title>',
        "<style>",
        "@page { size: A4 landscape; margin: 10mm 10mm 12mm;",
        '  @bottom-left { content: "deckload voyage loading log"; font: 7pt sans-serif; }',
        '  @bottom-right { content: "page " counter(page) " of " counter(pages); font: 7pt sans-serif; } }',
        "td.w { white-space: nowrap; }",
        "tr.running th { background: none; border: none; text-align: left; font-size: 9pt; padding: 0 0 2pt; }",
        ".legend { font-size: 7.5pt; } .legend dt { float: left; clear: left; font-weight: bold; width: 2.5em; }",
        ".legend dd { margin-left: 2.5em; }",
        ".signatures { font-family: sans-serif; margin-top: 6mm; break-inside: avoid; }",
        f".sig {{ display: flex; align-items: flex-end; height: {SIGNATURE_ROW_MM:g}mm; gap: 2mm; }}",
        ".sig .line { border-bottom: 0.4pt solid #000; height: 1em; }",
        ".sig .sign { flex: 3; } .sig .name { flex: 2; } .sig .when { flex: 1.3; }",
        "body { font-family: sans-serif; font-size: 8pt; }",
        "table { border-collapse: collapse; width: 100%; }",
        "th, td { border: 0.5pt solid #888; padding: 1pt 3pt; vertical-align: top; }",
        "th { background: #eee; } td.n { text-align: right; font-variant-numeric: tabular-nums; }",
        "tr { break-inside: avoid; } thead { display: table-header-group; }",
        ".fail { font-weight: bold; color: #b00; }",
        ".broken { font-weight: bold; font-size: 11pt; color: #b00; border: 2pt solid #b00; padding: 4pt; }",
        "</style></head><body>",
        *(f'<p class="broken">NOT READ: {htmllib.escape(words)}</p>' for words in not_read),
    ]
    numeric = {"seq", "displacement_t", "draft_fwd_m", "draft_aft_m", "kg_fluid_m", "gm_fluid_m", "fsc_m",
               "freeboard_m", "smallest_margin"}
    for vessel, entries in books:
        out.append(f"<h1>Voyage loading log — {htmllib.escape(vessel)}</h1>")
        if broken and vessel in broken:
            out.append(f'<p class="broken">{htmllib.escape(broken[vessel])}</p>')
        head = "".join(f"<th>{htmllib.escape(h)}</th>" for h in heads)
        running = (f'<tr class="running"><th colspan="{len(heads)}">Voyage loading log — {htmllib.escape(vessel)}'
                   + (" — LOG CHAIN BROKEN, see the notice above this vessel's table" if broken and vessel in broken
                      else "") + "</th></tr>")
        out.append(f"<table><thead>{running}<tr>{head}</tr></thead><tbody>")
        back = clock_back(entries)
        notes: dict[str, int] = {}  # what was not assessed, in words → its number in the legend
        for e in entries:
            r = entry_row(e, back.get(e.line_no))
            s = e.summary or {}
            r["ship_time"] = f"{e.ship_time:%Y-%m-%d %H:%M} ({e.ship_clock})"
            r["utc"] = f"{e.utc:%H:%M:%S}Z"  # (the date is the ship's, the offset beside it)
            r["trim"] = vf.sided(s.get("trim_m"), 3, " m", "by the stern", "by the head")
            r["list"] = vf.sided(s.get("list_deg"), 1, "°", "to starboard", "to port")
            na = s.get("not_assessed")
            if na:
                words = vf.grouped_not_assessed((x.get("item"), x.get("reason")) for x in na)
                r["not_assessed"] = f"[{notes.setdefault(words, len(notes) + 1)}]"
            cells = []
            for c in cols:
                cls = (' class="n"' if c in numeric else ' class="fail"' if r[c] == "FAIL"
                       else ' class="w"' if c in ("ship_time", "utc", "trim", "list") else "")
                mark = (f'<br><span class="fail">◂ {htmllib.escape(r["clock_back"])}</span>'
                        if c == "ship_time" and r["clock_back"] else "")
                cells.append(f"<td{cls}>{htmllib.escape(r[c])}{mark}</td>")
            out.append("<tr>" + "".join(cells) + "</tr>")
        out.append("</tbody></table>")
        if notes:
            out.append('<p class="legend"><strong>Not assessed</strong> (each row names its note):</p>'
                       '<dl class="legend">' + "".join(f"<dt>[{n}]</dt><dd>{htmllib.escape(words)}</dd>"
                                                       for words, n in notes.items()) + "</dl>")
        for words in (damaged or {}).get(vessel, []):
            out.append(f'<p class="broken">DAMAGED, left out: {htmllib.escape(words)}</p>')
        if entries:
            out.append(f"<p>Newest entry #{entries[-1].seq}, SHA-256 <code>{entries[-1].sha256}</code></p>")
    out.append(f"<p><strong>{htmllib.escape(CAUTION)}</strong></p>")
    out.append(signatures_html())
    out.append("</body></html>")
    return "\n".join(out) + "\n"


def _export(args) -> int:
    if args.output is not None:
        from deckload.io.outputs import OutputRefused, refuse_overwrite

        try:
            refuse_overwrite(args.output, log_dirs=[_log_dir(args)])
        except OutputRefused as e:
            print(f"deckload log export: {e}: nothing exported; name another file", file=sys.stderr)
            return 1
    strays = _strays(args)
    for words in strays:
        print(f"deckload: NOT READ: {words}", file=sys.stderr)
    books = _books(args)
    try:
        data = [(b.vessel_name, b.entries()) for b in books]
        skipped = [f"{b.path.name} {s}" for b in books for s in b.skipped]
        reports = [(b, b.verify()) for b in books]
    finally:
        for b in books:
            b.close()
    broken = {b.vessel_name: broken_words(b.path, rep.problems) for b, rep in reports if not rep.ok}
    for s in skipped:
        print(f"deckload: warning: unreadable log line left out: {s}", file=sys.stderr)
    for words in broken.values():  # (the CSV has no place for it: it goes to the terminal)
        print(f"deckload: {words}", file=sys.stderr)
    if args.csv:
        text = export_csv(data)
    else:
        text = export_html(data, broken, {b.vessel_name: [f"{b.path.name} {s}" for s in b.skipped]
                                          for b in books if b.skipped}, not_read=strays)
    failed = 1 if broken or strays else 0  # (as 'log show' and 'log verify': a page that lacks a log is no record)
    if args.output is None:
        sys.stdout.write(text)
        return failed
    write_atomic(Path(args.output), text.encode("utf-8"))
    n = sum(len(es) for _, es in data)
    print(f"{n} entries written to {args.output}", file=sys.stderr)
    return failed


def _verify(args) -> int:
    directory = _log_dir(args)
    if getattr(args, "recover", False):
        if getattr(args, "vessel", None):
            opened = [lambda: Logbook.open(directory, args.vessel, repair_copy=True)]
        else:  # the files found, each as itself: never a file named from what is written inside one
            opened = [lambda p=p: Logbook.open_file(p, readonly=False, repair_copy=True) for p in log_files(directory)]
        for open_one in opened:
            with open_one() as b:
                if b.recovered_torn is not None:
                    print(f"recovered: {b.recovered_torn}")
                if b.repaired_copy is not None:
                    changes, kept = b.repaired_copy
                    print(f"repaired: {b.path.name}: {changes} by a copy; {changes.them} taken out (the "
                          f"entries were intact without them); the file as found is kept as {kept.name}")
                if b.restored_line_end is not None:
                    print(f"repaired: {b.restored_note}")
                if b.readonly and not b.path.exists():
                    print(f"{b.path.name}: missing; nothing to recover")
                elif b.readonly:
                    print(f"{b.path.name}: not opened for writing: {b.readonly_reason}")
    strays = _strays(args)
    for words in strays:
        print(f"NOT READ: {words}")
    books = _books(args)
    against = getattr(args, "against", None)
    if not books:
        print(f"no logs in {directory}")
        return 1 if against is not None or strays else 0
    bad = len(strays)
    found = None
    for book in books:
        try:
            rep = book.verify()
            if against is not None:  # (an empty anchor is malformed, not absent: find refuses it)
                try:
                    at = book.find(against)
                except ValueError as e:
                    print(f"deckload log verify: --against: {e}", file=sys.stderr)
                    return 1
                if at is not None:
                    found = (book, at)
        finally:
            book.close()
        if rep.ok:
            print(f"{book.path}: OK — {rep.entries} entries, chain intact; newest SHA-256 {rep.last_sha256}")
        else:
            bad += 1
            print(f"{book.path}: BROKEN — {len(rep.problems)} problem(s):")
            for p in rep.problems:
                print(f"  {p}")
        for n in rep.notes:
            print(f"  note: {n}")
    if against is not None:
        if found is None:
            print(f"anchor {against}: NOT FOUND in any log in {directory} — the log was rewritten or replaced "
                  "since that copy was printed, or the copy belongs to another log")
            return 1
        book, (line, seq) = found
        print(f"anchor {against}: found — {book.path.name} line {line}, entry #{seq}; the printed copy matches "
              "the log up to that entry")
    return 1 if bad else 0
