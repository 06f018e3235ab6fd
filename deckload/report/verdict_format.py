"""The verdict in words, for every printed or shown summary (calc, check, report, log, screen).

Nothing is computed here: the criteria, the sets they belong to and what was not
assessed all come from the :class:`~deckload.core.result.Result`.  These helpers only
group and word them, so that no view can say "all criteria met" on its own: every
summary names the sets that were assessed and lists what was not, and why.
"""

from __future__ import annotations

import math
import textwrap

from deckload.core.frozen import frozen
from deckload.core.loading import fixed  # (also the screen's, through this module)

# The caution every printed or shown output carries (README, "Safety").
CAUTION = (
    "deckload supports, and never replaces, the approved stability booklet, the master's "
    "judgement and flag-State and class rules."
)

from deckload.core.result import AssessedSet, CriterionResult, Result

NOT_ASSESSABLE = "not assessable"
"""How a criterion the data cannot decide (``assessed`` False) is shown: never as a pass."""

UNGROUPED = AssessedSet("", "criteria without a set", False)
"""Stands for a set id the result does not list (kept visible, never dropped)."""

_IS2008 = "IS Code 2008 "


@frozen
class SetGroup:
    """One criteria set with its criteria, for the views that list the verdict set by set."""

    set: AssessedSet
    criteria: tuple[CriterionResult, ...]

    @property
    def word(self) -> str:
        """'met', 'NOT MET' or 'met where assessable' for this set."""
        return outcome_word(self.criteria)


def grouped(result: Result) -> list[SetGroup]:
    """The criteria grouped by the set they belong to, sets in the result's order.

    A criterion whose ``set_id`` names no listed set is kept in a group of its own at the
    end (titled :data:`UNGROUPED`, or its own id), so that nothing is lost.
    """
    groups = [SetGroup(s, tuple(c for c in result.criteria if c.set_id == s.id)) for s in result.criteria_sets]
    known = {s.id for s in result.criteria_sets}
    stray: dict[str, list[CriterionResult]] = {}
    for c in result.criteria:
        if c.set_id not in known:
            stray.setdefault(c.set_id, []).append(c)
    for sid, cs in stray.items():
        title = sid if sid else UNGROUPED.title
        groups.append(SetGroup(AssessedSet(sid, title, False), tuple(cs)))
    return groups


def outcome_word(criteria) -> str:
    """'NOT MET' when any assessed criterion failed; 'not assessable' when none could be assessed
    ("met where assessable" would then claim what nothing showed); 'met where assessable' when some
    could not be assessed; 'met' only when every one was assessed and met; 'nothing assessed' when
    empty."""
    criteria = tuple(criteria)
    if not criteria:
        return "nothing assessed"
    if any(c.assessed and not c.passed for c in criteria):
        return "NOT MET"
    if not any(c.assessed for c in criteria):
        return "not assessable"
    if any(not c.assessed for c in criteria):
        return "met where assessable"
    return "met"


def verdict_word(result: Result) -> str:
    """The word for the whole verdict: :func:`outcome_word` of its criteria, but 'met where
    assessable' where a set that applies to her could not be assessed (no windage data, say)."""
    word = outcome_word(result.criteria)
    return "met where assessable" if word == "met" and result.sets_not_assessed else word


def set_names(result: Result) -> str:
    """The assessed sets by id, e.g. 'IS2008-A2.2, IS2008-A2.3' ('no criteria set' when none)."""
    return ", ".join(s.id or s.title for s in result.criteria_sets) or "no criteria set"


def short_set_names(result: Result) -> list[str]:
    """Set ids for a narrow place: 'IS2008-A2.2', 'IS2008-A2.3' → 'IS2008 A2.2', 'A2.3' (the
    standard named once, on the first of its sets); other ids as they are."""
    out, last = [], None
    for s in result.criteria_sets:
        sid = s.id or s.title
        std, sep, rest = sid.partition("-")
        if sep and std == last:
            out.append(rest)
        elif sep and std.startswith("IS"):
            out.append(f"{std} {rest}")
        else:
            out.append(sid)
        last = std if sep else None
    return out or ["no criteria set"]


def set_title(title: str) -> str:
    """A set's title without the standard's long name: 'IS Code 2008 Part A 2.2 general criteria'
    → 'A 2.2 general criteria'."""
    return title.removeprefix(_IS2008).removeprefix("Part ")


def paragraph(c: CriterionResult, short: bool = False) -> str:
    """The criterion's paragraph: 'IS Code 2008 Part A 2.2.1' → 'A 2.2.1'; other sources as given.
    ``short`` also leaves out a trailing parenthesis ('A 2.3.1.4 (A.749 …)' → 'A 2.3.1.4')."""
    src = c.source
    if src.startswith(_IS2008):
        src = src[len(_IS2008):]
        src = src.removeprefix("Part ")
    return src.split(" (")[0] if short else src


def short_item(item: str) -> str:
    """A not-assessed item without its parenthesis, for narrow places: 'icing allowance (IS … B 6)' →
    'icing allowance' (the full item and its reason are on the verdict page)."""
    return item.split(" (")[0]


def failed(result: Result) -> list[CriterionResult]:
    return [c for c in result.criteria if c.assessed and not c.passed]


def unassessable(result: Result) -> list[CriterionResult]:
    return [c for c in result.criteria if not c.assessed]


def digits(unit: str, limit: float = 1.0) -> int:
    """Decimals shown for a value in ``unit``: degrees to 0.1°, lengths and areas to 0.001, and
    to 0.0001 when the limit itself is under 0.01 (the weather criterion's area a)."""
    if unit == "deg":
        return 1
    return 4 if 0 < abs(limit) < 0.01 else 3


MAX_DIGITS = 5
"""At most five decimals (0.00001 m·rad, m): finer than any table a criterion is judged from."""


def digits_of(c: CriterionResult) -> int:
    """Decimals for ``c``'s value, limit and margin: :func:`digits`, and more while a non-zero
    margin would round to zero (up to :data:`MAX_DIGITS`), so that a failed criterion never
    reads "0.064 ≥ 0.064, margin -0.000, FAIL" (area b 0.0638 against area a 0.0640)."""
    d = digits(c.unit, c.limit)
    margin = c.margin if c.assessed and math.isfinite(c.value) else 0.0
    while d < MAX_DIGITS and math.isfinite(margin) and margin != 0.0 and round(abs(margin), d) == 0.0:
        d += 1
    return d


def value_text(c: CriterionResult, width: int = 0) -> str:
    """The measured value, or 'n/a' when the criterion was not assessed."""
    if not c.assessed or not math.isfinite(c.value):
        return "n/a".rjust(width)
    return fixed(c.value, digits_of(c)).rjust(width)


def margin_text(c: CriterionResult, width: int = 0) -> str:
    if not c.assessed or not math.isfinite(c.value):
        return "".rjust(width)
    return f"{c.margin:+.{digits_of(c)}f}".rjust(width)


def result_word(c: CriterionResult) -> str:
    """'pass', 'FAIL' or 'not assessable'."""
    if not c.assessed:
        return NOT_ASSESSABLE
    return "pass" if c.passed else "FAIL"


def not_assessed_lines(result: Result, width: int, indent: str = "") -> list[str]:
    """'Not assessed:' then one line per item with its reason, wrapped to ``width``."""
    if not result.not_assessed:
        return []
    out = [indent + "Not assessed:"]
    for n in result.not_assessed:
        out += textwrap.wrap(f"{n.item}: {n.reason}", width, initial_indent=indent + "  - ",
                             subsequent_indent=indent + "    ")
    return out


def verdict_lines(result: Result, width: int, indent: str = "") -> list[str]:
    """:meth:`Result.verdict_text` wrapped to ``width`` (the one sentence-set every summary carries)."""
    return textwrap.wrap(result.verdict_text(), width, initial_indent=indent, subsequent_indent=indent)


STATED_DENSITY_MARK = "◆"
"""Beside a tank (board) or its density (report): the density was stated for this condition, from a
bunker delivery note, not the tank's default from the profile."""


NO_EQUILIBRIUM = "none: GZ never positive"
"""The list and the vanishing angle where GZ never becomes positive on the side she heels to: no
position of equilibrium up to the curve's last angle (a danger warning says so)."""


def never_positive(r: Result) -> bool:
    """GZ never becomes positive on the side she heels to: no list, no vanishing angle."""
    return r.list_deg is None or r.max_gz_m <= 0.0


def vanishing_words(r: Result) -> str:
    """The vanishing angle in words: the angle; ``beyond N°`` when GZ is still positive where the
    curve ends; :data:`NO_EQUILIBRIUM` when it is never positive (no angle vanishes)."""
    if r.vanishing_angle_deg is not None:
        return f"{r.vanishing_angle_deg:.1f}°"
    if never_positive(r):
        return NO_EQUILIBRIUM
    return f"beyond {r.gz_end_deg:g}°"


FLOOD_NOT_GIVEN = "not given: taken as none"
"""θf where the profile gives no downflooding angles: taken as none (the caution
``downflooding-not-given`` says what that means for the criteria)."""

FLOOD_UNKNOWN = "unknown: off its curve"
"""θf where the profile's downflooding angles do not reach this displacement: the criteria worked to
θf are not assessable (the danger ``downflooding-range`` says so)."""


def flood_words(r: Result, short: bool = False) -> str:
    """θf in words: the angle to 0.1°; :data:`FLOOD_UNKNOWN` off the profile's curve;
    :data:`FLOOD_NOT_GIVEN` without one.  ``short`` keeps only the first word ('unknown', 'none')
    for a narrow cell."""
    if r.downflooding_angle_deg is not None:
        return f"{r.downflooding_angle_deg:.1f}°"
    if r.downflooding_given:
        return "unknown" if short else FLOOD_UNKNOWN
    return "none" if short else FLOOD_NOT_GIVEN


def fmt_optional(value: float | None, fmt: str, unit: str = "", none: str = "n/a") -> str:
    """A number with its unit, or 'n/a' when the result has none (or it is not finite)."""
    if value is None or not math.isfinite(value):
        return none
    return f"{format(value, fmt)}{unit}"


# --------------------------------------------------------------------------- a stored summary (log entries)


def _short_id(sid: str) -> str:
    std, sep, rest = sid.partition("-")
    return rest if sep and std.startswith("IS") else sid


def stored_word(summary: dict | None) -> str:
    """'met', 'NOT MET' or 'met where assessable' from a log entry's stored summary ('' without one)."""
    if not summary:
        return ""
    if summary.get("criteria_failed"):
        return "NOT MET"
    if summary.get("criteria_not_assessable") or any(
            isinstance(x, dict) and x.get("applies") for x in summary.get("not_assessed") or []):
        return "met where assessable"
    return "met" if summary.get("criteria_pass") else "NOT MET"


def stored_short(summary: dict | None) -> str:
    """A log-table cell: the outcome and the sets, e.g. 'met A2.2 A2.3', 'NOT MET A2.2 A2.3'.

    Entries recorded before the log stored the sets say so: 'met (sets not recorded)'."""
    word = stored_word(summary)
    if not word:
        return ""
    word = {"met where assessable": "met, n/a"}.get(word, word)
    sets = summary.get("criteria_sets")
    if sets is None:
        return f"{word} (sets not recorded)"
    return " ".join([word, *(_short_id(str(x.get("id", ""))) for x in sets)]) if sets else f"{word} (no set)"


def stored_lines(summary: dict | None, width: int = 100, indent: str = "  ") -> list[str]:
    """The verdict of a log entry as recorded: the sentence, or for older entries what they hold."""
    if not summary:
        return []
    if summary.get("verdict"):
        return textwrap.wrap("Verdict: " + summary["verdict"], width, initial_indent=indent,
                             subsequent_indent=indent + "  ")
    failed = summary.get("criteria_failed") or []
    head = f"Criteria: NOT MET — {', '.join(failed)}" if failed else "Criteria: met"
    return [indent + head + " (this entry predates the record of criteria sets and of what was not assessed)"]


def grouped_not_assessed(pairs) -> str:
    """(item, reason) pairs worded with each reason once: 'damage stability, icing: not computed by
    deckload; IS Code 2008 Part A 2.3 weather criterion: the profile has no windage data'."""
    by_reason: dict[str, list[str]] = {}
    for item, reason in pairs:
        by_reason.setdefault(str(reason), []).append(str(item))
    return "; ".join(f"{', '.join(items)}: {reason}" for reason, items in by_reason.items())


DOUBTS_HEADING = "compare with the booklet; deckload check lists them with their lines"
"""What the officer does with the profile's audit warnings, wherever they are printed."""


def doubts_block(doubts, width: int = 100, indent: str = "  ") -> list[str]:
    """The profile's plausibility-audit warnings (:func:`deckload.report.audit_findings.doubt_lines`)
    as printed lines under a heading, or no lines: a doubt about a booklet value (a KMt, a lightship
    KG) may have made every figure of the result wrong, so it is printed with the result, not only
    by ``deckload check``."""
    if not doubts:
        return []
    out = textwrap.wrap(f"Profile plausibility audit: {len(doubts)} warning{'s' if len(doubts) != 1 else ''} "
                        f"on the vessel's data ({DOUBTS_HEADING}):", width, initial_indent=indent,
                        subsequent_indent=indent)
    for d in doubts:
        out += textwrap.wrap(d, width, initial_indent=indent + "  - ", subsequent_indent=indent + "    ")
    return out


def sided(x, digits: int, unit: str, plus: str, minus: str) -> str:
    """A magnitude with its side in the caller's words ('0.2° to port', '0.2° P', '0.313 m by the
    stern'): signs only in JSON and CSV; '—' for no number (a stored summary may lack one)."""
    if not isinstance(x, (int, float)) or isinstance(x, bool):
        return "—"
    if round(abs(x), digits) == 0:
        return f"{0:.{digits}f}{unit}"
    return f"{abs(x):.{digits}f}{unit} {plus if x > 0 else minus}"

