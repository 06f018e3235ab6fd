"""The verdict on the loading screen: the criteria panel, the whole-verdict page and the wind plot.

Result → pre-formatted rich Text lines, like :mod:`deckload.ui.views` (no textual here).
The panel never says 'met' without the sets it was met for, groups the criteria by
set with their paragraph, shows a criterion the data cannot decide as 'not
assessable' (never as a pass), and always lists what was not assessed.  A note wider
than the panel wraps onto indented lines below it (the θ0 note's A, Z and lw1 are what an
officer checks the weather criterion by); a line still too wide ends in '…' (widgets.fit_width),
and a set's title is shortened before its verdict word is.  When the panel is short, lines are
given up in this order: the wrapped lines of notes (an 'ok' criterion's first, the last first),
each note cut to one line, the notes, the column heading, the 'ok' criteria of the longest set
(counted on a line of their own); the set headings, every failed, near or unassessable
criterion (with the first line of its reason) and the not-assessed line stay.
"""

from __future__ import annotations

import functools
import re
import textwrap

from rich.text import Text

from deckload.report import verdict_format as vf
from deckload.core.result import CriterionResult, Result
from deckload.ui.gzplot import Area, GzChart, Level, Mark
from deckload.ui.palette import P
from deckload.ui.views import CMP, criterion_name, pieces, verdict

WORD_STYLE = {"met": "ok", "NOT MET": "danger", "met where assessable": "caution", "nothing assessed": "danger",
              "not assessable": "danger"}
VERDICT_KEY = "v"
"""Shown in the panel as the way to the whole verdict (declared in ui/commands.py)."""


def _criterion_line(c: CriterionResult, stale: bool, compact: bool) -> Text:
    d = vf.digits_of(c)
    limit = f"{CMP.get(c.comparison, c.comparison)}{c.limit:6.{d}f} "
    if not c.assessed:
        return _unassessed_line(criterion_name(c), limit, vf.paragraph(c, short=True), compact)
    word, style = verdict(c)
    return _assessed_line(criterion_name(c), f"{vf.fixed(c.value, d):>7} {limit}",
                          "" if compact else f"{c.margin:+8.{d}f} ", word, style,
                          "" if compact else vf.paragraph(c, short=True), stale, compact)


@functools.lru_cache(maxsize=1024)
def _assessed_line(name: str, value_limit: str, margin: str, word: str, style: str, paragraph: str,
                   stale: bool, compact: bool) -> Text:
    """A criterion's line from its printed words: kept for the same words (a key leaves most
    criteria as they were printed), so the Text is shared and never modified."""
    vs = P["stale"] if stale else P["value"]
    return pieces(P["label"], f" {name:<12.12}", (value_limit, vs), *(() if compact else ((margin, vs),)),
                  (f"{word:<4}", P["stale"] if stale else P[style]),
                  *(() if compact else ((f" {paragraph}", P["dim"]),)))


@functools.lru_cache(maxsize=256)
def _unassessed_line(name: str, limit: str, paragraph: str, compact: bool) -> Text:
    """An unassessable criterion's line (kept and shared as :func:`_assessed_line`'s)."""
    if compact:
        return pieces(P["label"], f" {name:<12.12}", (f"{vf.NOT_ASSESSABLE:>14} ", P["caution"]))
    return pieces(P["label"], f" {name:<12.12}", (f"{'n/a':>7} {limit}", P["caution"]),
                  (f"{'':>8}{'n/a':<4}", P["caution"]), (f" {paragraph}", P["dim"]))


def _wrap_words(words: list[str], first: str, width: int, sep: str = ",", last: str = "") -> list[str]:
    """``first`` then the words joined by ``sep``, then ``last``, wrapped on whole words to ``width``."""
    lines, cur = [], first
    pieces = [w + (sep if i < len(words) - 1 else "") for i, w in enumerate(words)] + ([last] if last else [])
    for piece in pieces:
        trial = cur + ("" if cur.endswith(" ") or not cur.strip() else " ") + piece
        if len(trial) > width and cur.strip():
            lines.append(cur)
            cur = "   " + piece
        else:
            cur = trial
    lines.append(cur)
    return lines


def _is_ok(c: CriterionResult) -> bool:
    return c.assessed and verdict(c)[0] == "ok"


def _fit(text: Text, width: int) -> Text:
    """``text`` cut to ``width`` by the screen's one rule (widgets.fit_width: it ends in '…', no
    word or number split), the '…' put after the last word kept ("P 504 Pa, …") rather than at
    the panel's edge, so that it reads as words left out of this line."""
    from deckload.ui.widgets import fit_width  # here: this module builds lines without textual

    out = fit_width(text, width)
    if out is text or not out.plain.endswith("…"):
        return out
    kept = out.plain[:-1].rstrip()
    short = out[: len(kept)]
    short.append(" …" if kept.strip() else "…")
    return short if short.cell_len <= width else out


def _group_title(title: str, room: int) -> Text:
    """A set's heading in ``room`` cells (its verdict word follows): the title shortened by whole
    words, with '…' after the last one kept ("▸ B 2.1 fishing vessel …"), padded to ``room``."""
    h = _fit(Text(f" ▸ {title}", P["group"]), room)
    h.pad_right(room - h.cell_len)
    return h


@functools.lru_cache(maxsize=256)
def _group_heading(title: str, room: int, word: str, stale: bool) -> Text:
    """A set's heading (:func:`_group_title`) and its verdict word; kept for the same words, so the
    Text is shared and never modified."""
    h = _group_title(title, room)
    h.append(" " + word, P["stale"] if stale else P[WORD_STYLE.get(word, "caution")])
    return h


NOTE_INDENT, NOTE_MORE = "   ", "     "
"""A note under its criterion, and the lines it wraps onto, indented further."""


def _note_lines(note: str, width: int) -> list[Text]:
    """:func:`_wrapped_note`'s lines (a list of its own: the lines themselves are shared)."""
    return list(_wrapped_note(note, width))


@functools.lru_cache(maxsize=256)
def _wrapped_note(note: str, width: int) -> tuple[Text, ...]:
    """A criterion's note wrapped to ``width``, the lines after the first indented further: a clause
    (up to a comma or semicolon) that does not fit where the line stands starts the next line, so
    that "lw1 0.0626 m" stays on one; a clause too long for any line fills the line it starts on,
    word by word (it was put on a line of its own, leaving "passes," alone above it); a word wider
    than the line is cut with '…'."""
    lines: list[str] = []
    cur = NOTE_INDENT

    def join(line: str, text: str) -> str:
        return line + ("" if line.isspace() else " ") + text

    for clause in re.split(r"(?<=[,;]) ", note):
        if len(join(cur, clause)) <= width:
            cur = join(cur, clause)
        elif len(NOTE_MORE + clause) <= width and not cur.isspace():
            lines.append(cur)
            cur = NOTE_MORE + clause
        else:  # longer than any line: between words, from where the line stands
            for word in clause.split(" "):
                if len(join(cur, word)) <= width or cur.isspace():
                    cur = join(cur, word)
                else:
                    lines.append(cur)
                    cur = NOTE_MORE + word
    lines.append(cur)
    # kept for the same note and width (most notes are the same after a key): shared, never modified
    return tuple(_fit(Text(x.rstrip(), P["dim"]), width) for x in lines)


def _first_rows(notes: list[Text], rows: int, width: int) -> list[Text]:
    """The first ``rows`` lines of a wrapped note; when that leaves some out, the last line shown
    carries on the note's words and is cut with '…' at ``width``."""
    if rows >= len(notes):
        return notes
    if rows <= 0:
        return []
    joined = " ".join(n.plain.strip() for n in notes[rows - 1:])
    lead = NOTE_INDENT if rows == 1 else NOTE_MORE
    if len(lead) + len(joined) <= width:  # what is left fits whole on the last line given
        return notes[: rows - 1] + [Text(lead + joined, P["dim"])]
    # Cut after the last whole clause that fits ("…, P 504 Pa, …"), not inside one: a label kept
    # without its number ("P 504 Pa, A…") reads as a value left out of its place.
    ends = [m.end() for m in re.finditer(r"[,;](?= )", joined) if len(lead) + m.end() + 2 <= width]
    if ends:
        return notes[: rows - 1] + [Text(f"{lead}{joined[:ends[-1]]} …", P["dim"])]
    return notes[: rows - 1] + [_fit(Text(lead + joined, P["dim"]), width)]


def criteria_lines(result: Result | None, stale: bool, width: int, height: int = 10_000) -> list[Text]:
    """The criteria panel: the verdict with the sets it covers, each set with its criteria, and the
    not-assessed list; at most ``height`` lines (see the module docstring for what gives way)."""
    compact = width < 48
    if stale:  # no result for the condition on screen: no verdict word, no 'ok', not even greyed
        return no_verdict_lines(width, height)
    if result is None:
        return [Text(" Criteria", P["title"])]
    word = vf.verdict_word(result)
    n_failed = len(vf.failed(result))
    shown_word = (f"NOT MET ({n_failed})" if compact else f"NOT MET ({n_failed} failed)") if n_failed else word
    head = Text(" Criteria ", P["title"])
    head.append(shown_word, P["stale"] if stale else P[WORD_STYLE[word]])
    ids = vf.short_set_names(result) if compact else [s.id or s.title for s in result.criteria_sets]
    rest = _wrap_words(ids or ["no criteria set"], ":", width - head.cell_len + 1)
    if len(rest) > 1 or head.cell_len + len(rest[0]) > width:  # the sets on the lines below, named 'sets'
        rest = _wrap_words(ids or ["no criteria set"], "   sets", width)
        heads = [head] + [Text(x, P["value"]) for x in rest]
    else:
        head.append(rest[0], P["value"])
        heads = [head]
    colhead = Text("              value   limit" + ("" if compact else "   margin      ¶"), P["head"])

    groups: list[tuple[Text, list[tuple[CriterionResult, Text, list[Text]]]]] = []
    for g in vf.grouped(result):
        gw = g.word
        # the word ends where a criterion's line does (54 cells), not at the far edge of a wide panel
        h = _group_heading(vf.set_title(g.set.title), max(4, min(width, 54) - len(gw) - 2), gw, stale)
        rows = []
        for c in g.criteria:
            notes = _note_lines(c.note, width) if (c.note and not c.assessed) or (c.note and not compact) else []
            rows.append((c, _criterion_line(c, stale, compact), notes))
        groups.append((h, rows))
    # The notes in the order they give way: an 'ok' criterion's before a failed, near or
    # unassessable one's, and within each the one lower in the panel first.
    note_order = sorted(((gi, ri) for gi, (_, rows) in enumerate(groups) for ri, (_, _, n) in enumerate(rows) if n),
                        key=lambda k: (not _is_ok(groups[k[0]][1][k[1]][0]), -k[0], -k[1]))

    na_items = tuple(vf.short_item(n.item) for n in result.not_assessed)
    na_full = list(_not_assessed_lines(na_items, width)) if na_items else []
    na_short = [Text(f" Not assessed: {len(na_items)} items ({VERDICT_KEY})", P["caution"])] if na_items else []

    def build(with_notes: bool, with_colhead: bool, na: list[Text], keep_ok: dict[int, int],
              note_rows: dict[tuple[int, int], int] | None = None) -> list[Text]:
        """The panel's lines; ``note_rows`` (with notes) limits a note to so many lines (0: none)."""
        out = list(heads) + ([colhead] if with_colhead else [])
        for gi, (h, rows) in enumerate(groups):
            out.append(h)
            ok_budget = keep_ok.get(gi, len(rows))
            hidden = 0
            for ri, (c, line, notes) in enumerate(rows):
                if _is_ok(c):
                    if ok_budget <= 0:
                        hidden += 1
                        continue
                    ok_budget -= 1
                out.append(line)
                if with_notes:
                    out.extend(_first_rows(notes, (note_rows or {}).get((gi, ri), len(notes)), width))
                elif not c.assessed:  # an unassessable criterion keeps the first line of its reason
                    out.extend(_first_rows(notes, 1, width))
            if hidden:
                out.append(Text(f"   +{hidden} more ok ({VERDICT_KEY} lists all)", P["dim"]))
        return out + na

    out = build(True, True, na_full, {})
    if len(out) <= height:
        return out
    # Fold the notes a line at a time: first to one line each (cut with '…'), then away.  A note
    # given n of its lines takes exactly n (_first_rows), so each step takes one line off the count
    # and the panel is built once, at the fold that fits (built at every step, the search was most
    # of a key's cost on the loading screen).
    note_rows = {k: len(groups[k[0]][1][k[1]][2]) for k in note_order}
    lines = len(out)
    for floor in (1, 0):
        for k in note_order:
            if floor == 0 and not groups[k[0]][1][k[1]][0].assessed:
                continue  # the reason an unassessable criterion was not decided stays (one line)
            while note_rows[k] > floor:
                note_rows[k] -= 1
                lines -= 1
                if lines <= height:
                    return build(True, True, na_full, {}, note_rows)
    for args in ((False, True, na_full), (False, False, na_full), (False, False, na_short)):
        out = build(*args, {})
        if len(out) <= height:
            return out
    # Give up 'ok' lines of the longest sets first, one at a time, until it fits.
    keep = {gi: sum(1 for c, _, _ in rows if _is_ok(c)) for gi, (_, rows) in enumerate(groups)}
    while len(out) > height and any(keep.values()):
        gi = max(keep, key=keep.get)
        keep[gi] -= 1
        out = build(False, False, na_short, keep)
    return out[: max(1, height - len(na_short))] + na_short if len(out) > height else out


NO_VERDICT = "no verdict for this condition"
NO_VERDICT_WHY = ("it is outside the vessel's tables, so nothing was assessed (see the warning). "
                  "The last good condition's criteria are not this one's and are not shown.")


@functools.lru_cache(maxsize=64)
def _not_assessed_lines(items: tuple[str, ...], width: int) -> tuple[Text, ...]:
    """' Not assessed: …' with every item, wrapped to ``width`` (kept for the same items and width:
    shared, never modified)."""
    return tuple(_fit(Text(y, P["caution"]), width)  # an item wider than the line wraps by words
                 for x in _wrap_words(list(items), " Not assessed:", width, last=f"({VERDICT_KEY}: why)")
                 for y in (textwrap.wrap(x, max(8, width), subsequent_indent=NOTE_MORE, break_long_words=False,
                                         break_on_hyphens=False) if len(x) > width else [x]))


def no_verdict_lines(width: int, height: int = 10_000) -> list[Text]:
    """The criteria panel while the condition on screen has no result (outside the tables): it
    says so in words, and shows no verdict word and no criterion, not even the last good ones
    greyed (a grey 'met' or 'ok' still reads as a pass)."""
    head = Text(" Criteria: ", P["title"])
    head.append(NO_VERDICT.upper() if head.cell_len + len(NO_VERDICT) <= width else "NO VERDICT", P["danger"])
    why = textwrap.wrap(NO_VERDICT_WHY[0].upper() + NO_VERDICT_WHY[1:], max(10, width - 2),
                        initial_indent=" ", subsequent_indent=" ")
    return ([head] + [Text(x, P["caution"]) for x in why])[: max(1, height)]


def verdict_page(result: Result | None, width: int = 96) -> list[Text]:
    """The whole verdict for the 'v' page: the verdict sentence, every set with its criteria,
    paragraph and note, and everything not assessed with the reason."""
    if result is None:
        return [Text("No result: the condition is outside the vessel's tables (see the warning).", P["danger"])]
    out = [Text(x, P["value"]) for x in vf.verdict_lines(result, width)]
    for g in vf.grouped(result):
        out.append(Text(""))
        h = Text(f"{vf.set_title(g.set.title)} ", P["group"])
        h.append(g.word, P[WORD_STYLE.get(g.word, "caution")])
        out.append(h)
        for c in g.criteria:
            if width >= 90 and len(c.description) <= 36:
                line = Text(f"  {vf.paragraph(c, short=True):<10.10} {c.description:<36} ", P["label"])
            elif width >= 90:  # a long description on its own line, never cut; the numbers under it
                out.append(Text(f"  {vf.paragraph(c, short=True):<10.10} {c.description}", P["label"]))
                line = Text(" " * 50)
            else:  # narrow: the criterion on its own line, the numbers under it
                out.append(Text(f"  {vf.paragraph(c)}  {c.description}", P["label"]))
                line = Text("      ")
            if c.assessed:
                line.append(f"{vf.value_text(c, 8)} {CMP.get(c.comparison, c.comparison)} "
                            f"{c.limit:.{vf.digits_of(c)}f} {c.unit}  margin {vf.margin_text(c)}  ", P["value"])
                word, style = verdict(c)
                line.append(word, P[style])
            else:
                line.append(f"{vf.NOT_ASSESSABLE} (limit {CMP.get(c.comparison, c.comparison)} "
                            f"{c.limit:.{vf.digits_of(c)}f} {c.unit})", P["caution"])
            out.append(line)
            full = width >= 90 and vf.paragraph(c, short=True) != vf.paragraph(c)  # the column holds the short form
            note = "; ".join(x for x in (c.note, f"¶ {vf.paragraph(c)}" if full else "") if x)
            if note:
                out += [Text(x, P["dim"]) for x in textwrap.wrap(note, width, initial_indent="      ",
                                                                 subsequent_indent="      ")]
    if result.not_assessed:
        out.append(Text(""))
        out.append(Text("Not assessed", P["caution"]))
        for n in result.not_assessed:
            out += [Text(x, P["label"]) for x in textwrap.wrap(f"{n.item}: {n.reason}", width,
                                                                initial_indent="  ", subsequent_indent="    ")]
    out.append(Text(""))
    out.append(Text("deckload supports, and never replaces, the approved stability booklet, the master's judgement "
                    "and flag-State and class rules.", P["dim"]))
    return out


# --------------------------------------------------------------------------- the wind plot


def weather_chart(result: Result | None, stale: bool, width: int, height: int) -> GzChart | None:
    """GZ with the wind levers lw1 and lw2, θ0, θ1 (rolled to windward from θ0), θ2 and areas a, b.

    The curve to windward (negative angles) is the other side's curve, turned: heeling to
    windward by φ the lever is −GZ(φ) of that side.  None when there is no weather result.
    """
    if result is None or result.weather is None:
        return None
    w = result.weather
    lee = result.gz_port_m if result.criteria_side == "port" else result.gz_m
    wind = result.gz_m if result.criteria_side == "port" else result.gz_port_m
    heel = [-h for h in reversed(result.gz_heel_deg[1:])] + list(result.gz_heel_deg)
    gz = [-g for g in reversed(wind[1:])] + list(lee)
    roll_to = w.theta0_deg - w.theta1_deg
    right = max(w.theta2_deg, w.theta_c_deg or 0.0) + 10.0
    x_range = (min(roll_to, 0.0) - 3.0, min(result.gz_end_deg, right))
    marks = (Mark(w.theta0_deg, "θ0", "gz.level"), Mark(roll_to, "θ1", "gz.level"), Mark(w.theta2_deg, "θ2", "gz.flood"))
    levels = (Level(w.lw1_m, "lw1"), Level(w.lw2_m, "lw2"))
    areas = (Area(roll_to, w.theta2_deg, w.lw2_m, "a", "below", "gz.area"),
             Area(roll_to, w.theta2_deg, w.lw2_m, "b", "above", "gz.area.b"))
    return GzChart(tuple(heel), tuple(gz), marks, width, height, stale, levels, areas, x_range)


def weather_caption(result: Result | None, width: int = 60) -> Text:
    """The wind plot's title with areas a and b and the angles, shortened to ``width``."""
    t = Text(" Wind and roll" if width >= 50 else " Wind", P["title"])
    if result is None or result.weather is None:
        return t
    w = result.weather
    t.append(f"  a {w.area_a_mrad:.4f} b {w.area_b_mrad:.4f} m·rad", P["dim"])
    angles = f"  θ0 {w.theta0_deg:.1f}° θ1 {w.theta1_deg:.1f}° θ2 {w.theta2_deg:.1f}°"
    if t.cell_len + len(angles) <= width:
        t.append(angles, P["dim"])
    return t


def weather_missing(result: Result | None, width: int = 60) -> list[Text]:
    """What the wind plot shows when there is no weather result: why, from the not-assessed list."""
    out = [Text(" Wind and roll", P["title"])]
    if result is None:
        return out + [Text(" no result: see the warning above", P["danger"])]
    wrap = lambda text: textwrap.wrap(text, max(10, width - 2), initial_indent=" ", subsequent_indent="   ")  # noqa: E731
    assessed = [c for c in result.criteria if "2.3" in c.set_id or "weather" in c.set_id.lower()]
    if assessed:  # assessed, but there is no curve to draw: say why, and what was found
        # θf unknown, or area a or b beyond the KN tables: the ends of the areas are not all known
        open_ = any(not c.assessed for c in assessed) or (
            result.downflooding_given and result.downflooding_angle_deg is None)
        head = ("No plot: the angles that bound areas a and b are not all known." if open_
                else "No plot: the levers have no intercept with GZ to draw.")
        out += [Text(x, P["caution"]) for x in wrap(head)]
        for c in assessed:
            word = verdict(c)[0]
            out += [Text(x, P["danger"] if word == "FAIL" else P["label"]) for x in wrap(
                f"{word} {c.description}" + (f": {c.note}" if c.note else ""))]
        return out
    why = next((n for n in result.not_assessed if "weather" in n.item.lower() or "2.3" in n.item), None)
    text = f"{why.item} not assessed: {why.reason}" if why else "the weather criterion was not assessed for this condition"
    return out + [Text(x, P["caution"]) for x in wrap(text)]
