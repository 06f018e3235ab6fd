"""``deckload report PROFILE CONDITION``: the printable report of one condition, HTML or text."""

from __future__ import annotations

import sys
from pathlib import Path

from deckload.report import condition_report


def _log_anchor_text(vessel_name: str) -> str:
    """' · voyage log at entry #N, SHA-256 1a2b…' : the newest log entry, so that a printed copy
    can be checked against the log later (``deckload log verify --against HASH``)."""
    from deckload.logbook import anchor
    from deckload.io.paths import log_dir

    a = anchor(log_dir(), vessel_name)
    return "" if a is None else f" · voyage log at entry #{a[0]}, SHA-256 {a[1][:16]}"


def run_report(profile_path: Path, condition_path: Path, html: bool, output: Path | None,
               direct: bool = False) -> int:
    """``deckload report``: load, evaluate, render; write to ``output`` or print.

    Exit 0 when written (whether or not the criteria pass), 1 on bad input (an ``output``
    that is one of the files read, or a file of the voyage log: :mod:`deckload.io.outputs`),
    2 when a file cannot be read or written.
    """
    from deckload.cli.calc import load_evaluate_compare
    from deckload.logbook import clock_stamp

    notes: list[str] = []
    loaded = load_evaluate_compare(profile_path, condition_path, direct, notes)
    if isinstance(loaded, int):
        return loaded
    if output is not None:
        from deckload.io.outputs import OutputRefused, profile_inputs, refuse_overwrite

        try:
            refuse_overwrite(output, [*profile_inputs(profile_path), (Path(condition_path), "the condition read")])
        except OutputRefused as e:
            print(f"deckload report: {e}: no report written; name another file", file=sys.stderr)
            return 1
    vessel, condition, result, doubts, comparison = loaded
    stamp = clock_stamp()
    source = Path(condition_path).name + _log_anchor_text(vessel.particulars.name)
    if html:
        doc = condition_report.render_report_html(result, vessel, condition, stamp=stamp, source=source, comparison=comparison,
                                                     doubts=doubts)
        if not condition_report.html_fits_a4(doc):
            print("deckload: note: this condition's report runs to more than one A4 page", file=sys.stderr)
    else:
        doc = condition_report.render_report_text(result, vessel, condition, stamp=stamp, source=source, comparison=comparison,
                                                     doubts=doubts)
    # as `calc --direct`: rows of the direct calculation beyond tolerance exit 1, once the report is out
    beyond = 1 if comparison is not None and comparison.beyond else 0
    if output is None:
        sys.stdout.write(doc)
    else:
        try:
            from deckload.io.atomicfile import write_atomic

            write_atomic(Path(output), doc.encode("utf-8"))
        except OSError as e:
            print(f"deckload: cannot write {output}: {e.strerror}", file=sys.stderr)
            return 2
        print(f"report written to {output}", file=sys.stderr)
    for note in notes:  # once, on the terminal: the page's layout is the report's own
        print(f"deckload: {note}", file=sys.stderr)
    if beyond:
        from deckload.report.direct_format import beyond_message

        print(beyond_message(profile_path, comparison), file=sys.stderr)
    return beyond
