"""Print from the loading screen: the report of exactly the condition and result on show.

Both forms of the report (HTML to print, plain text) are written side by side in the reports
folder (``paths.reports_dir``) under one name: vessel, condition and the UTC minute, so two
prints of one watch never overwrite each other.  The report is the one ``deckload report``
writes (:mod:`deckload.report.condition_report`), from the screen's own ``Result``: nothing is recomputed.
"""

from __future__ import annotations

from pathlib import Path

from deckload.core.frozen import frozen
from deckload.core.model import Condition, Vessel
from deckload.core.result import Result


@frozen
class Printed:
    html_path: Path
    text_path: Path


def report_stem(vessel_name: str, condition_name: str, utc_minute: str) -> str:
    """'demo-islander_sailing-2-dec_20261202-1904': vessel, condition, UTC minute."""
    from deckload.io.condition_files import name_key
    from deckload.io.paths import vessel_slug

    return f"{vessel_slug(vessel_name)[:40]}_{name_key(condition_name)[:40]}_{utc_minute}"


def _free(folder: Path, stem: str) -> str:
    """``stem``, or ``stem-2``, ``-3``…: a name whose .html and .txt hold nothing yet."""
    candidate, n = stem, 1
    while (folder / f"{candidate}.html").exists() or (folder / f"{candidate}.txt").exists():
        n += 1
        candidate = f"{stem}-{n}"
    return candidate


def print_result(result: Result, vessel: Vessel, condition: Condition, folder: Path, *,
                 source: str, log_anchor: str = "", doubts: tuple[str, ...] = ()) -> Printed:
    """Write the HTML and text reports of ``result`` to ``folder``; raises OSError if it cannot.
    ``doubts``: the profile's plausibility-audit warnings, which the reports carry."""
    from deckload.io.atomicfile import write_atomic
    from deckload.logbook import clock_stamp, utc_now
    from deckload.report.condition_report import render_report_html, render_report_text

    stamp = clock_stamp()
    where = source + log_anchor
    html = render_report_html(result, vessel, condition, stamp=stamp, source=where, doubts=doubts)
    text = render_report_text(result, vessel, condition, stamp=stamp, source=where, doubts=doubts)
    folder.mkdir(parents=True, exist_ok=True)
    stem = _free(folder, report_stem(vessel.particulars.name, condition.name, f"{utc_now():%Y%m%d-%H%M}"))
    html_path, text_path = folder / f"{stem}.html", folder / f"{stem}.txt"
    write_atomic(html_path, html.encode("utf-8"))
    write_atomic(text_path, text.encode("utf-8"))
    return Printed(html_path, text_path)
