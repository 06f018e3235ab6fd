"""``deckload check PROFILE [CONDITION]``: validate a vessel profile and, optionally, a condition.

Prints a short summary when everything is in order, otherwise every problem, one per
line, in the form ``file:line: dotted.key = value: rule``.  With a condition, the
condition is also computed once, so that a displacement or draft outside the
vessel's tables is reported here rather than on the loading screen.

After the profile's summary: the plausibility audit (deckload.core.audit: errors are
contradictions and fail the check, warnings are doubts), then the booklet's worked
conditions recomputed beside the booklet's results with the tolerance of every row
(deckload.core.booklet), or, when the profile lists none, a note of what only they can catch.

After an audit error neither the booklet conditions nor the condition are computed: the
loading screen, calc and report refuse such a profile, and check does not show a result
they could not.

Exit status: 0 no problems; 1 problems found (schema, audit error, booklet row outside tolerance); 2 a file could not be read;
3 an internal error (a bug: please report it with the files).
"""

from __future__ import annotations

import os
import sys
import textwrap
import traceback
from pathlib import Path

from deckload.report import verdict_format as vf
from deckload.core import model as m
from deckload.io.profiles import Problem, ProfileError, load_condition
from deckload.report.audit_findings import NO_BOOKLET_CONDITIONS as NO_BOOKLET_WORDS
from deckload.report.audit_findings import load_audited

CAUTION = vf.CAUTION

NOTE_WIDTH = 100
"""Columns the NOTE is folded to (it ran to 600 on one line; found in review)."""

NO_BOOKLET_NOTE = (
    f"NOTE: {NO_BOOKLET_WORDS}: the audit above cannot see a wrong "
    "number that agrees with every table, such as a lightship KG or LCG mistyped within the plausible "
    "range or taken from an older inclining, every position of the profile measured from the wrong datum "
    "or with the wrong sign, a tank page (or its FSM column) copied from another tank, the table density "
    "(1.000 typed for 1.025), or the whole hydrostatic table shifted one row against draft; only "
    "the booklet's worked conditions, recomputed beside its printed results, catch those. How to enter "
    "them: \"Booklet conditions\" in vessel_profiles/README.md")
"""Said (not an error: the exit status is unchanged) when the profile lists none of the booklet's
worked conditions: an audit that finds nothing is then no sign that the lightship and the datum
are right (found by an audit: a KG transposition, the whole profile's sign and a lightship LCG slip
were each caught by the worked conditions alone; a second audit added a tank page or FSM column copied
from another tank, the table density typed 1.000 for 1.025, the hydrostatic table shifted one row
against draft and a lightship from an older inclining)."""


def _plural(n: int, word: str, many: str | None = None) -> str:
    return f"{n} {word if n == 1 else (many or word + 's')}"


def _range(a, unit: str) -> str:
    sep = "" if unit == "°" else " "
    return f"{float(a[0]):.4g}–{float(a[-1]):.4g}{sep}{unit}"


def profile_summary(path: Path, v: m.Vessel, sources: dict[str, str] | None = None,
                    free_surface: dict[str, list[str]] | None = None) -> list[str]:
    """A few lines saying what the profile holds and over which ranges its tables run, and
    (``free_surface``, from the reading) how each tank's free surface was read, one line per way."""
    h, k = v.hydrostatics, v.cross_curves
    rows = [len(t.calibration.sounding_m) for t in v.tanks if t.level_known]
    lines = [
        f"OK  {path}: {v.particulars.name!r}: {_plural(len(v.tanks), 'tank')}, {_plural(len(v.holds), 'hold')}, "
        f"{_plural(len(v.deck_areas), 'deck area')}, {_plural(len(v.load_lines), 'load line')}",
        f"    hydrostatics: draft {_range(h.draft_m, 'm')}, displacement {_range(h.displacement_t, 't')} "
        f"at {v.particulars.table_density_t_m3:g} t/m³ ({_plural(len(h.draft_m), 'row')})",
        f"    cross curves: displacement {_range(k.displacement_t, 't')}, heel {_range(k.heel_deg, '°')}, {k.trim_basis}",
    ]
    if v.trimmed is not None:
        tt = v.trimmed

        def trims(ts):
            return ", ".join("0" if x == 0 else f"{float(x):+g}" for x in ts) + " m"

        lines.append(f"    tables at trims (+ by the stern): hydrostatics {trims(tt.hydro_trim_m)}; "
                     f"KN {trims(tt.kn_trim_m)}; interpolated in trim, caution outside")
    if rows:
        lines.append(f"    tank calibrations: {min(rows)}–{max(rows)} rows each")
    corrected = [t.id for t in v.tanks if t.trim_correction is not None]
    if corrected:
        lines.append(f"    booklet trim corrections for soundings: {', '.join(corrected)}")
    if v.limit_curve is not None:
        lines.append(f"    limit curve ({v.limit_curve.kind}): displacement {_range(v.limit_curve.displacement_t, 't')}")
    if float(k.heel_deg[-1]) < 90.0:
        lines.append(f"    note: the KN tables end at {float(k.heel_deg[-1]):g}°: the GZ curve, its areas and plots stop "
                     "there; nothing is extrapolated")
    if sources:
        lines.append("    from CSV: " + ", ".join(f"{k} ← {f}" for k, f in sources.items()))
    # How the booklet's conventions were converted, and what was assumed (vessel_profiles/README.md).
    lines += [f"    converted: {c}" for c in v.conversions]
    lines += [f"    assumed:   {a}" for a in v.assumptions]
    # every tank, by how its free-surface column was read: compare each with the page's heading
    # (an FSM in t·m typed as fsi_m4 understates it by the factor ρ and is said nowhere else)
    for basis, ids in (free_surface or {}).items():  # folded: a vessel has dozens of tanks
        lines += textwrap.wrap(f"free surface read as {basis}: {', '.join(ids)}", NOTE_WIDTH,
                               initial_indent="    ", subsequent_indent="      ", break_on_hyphens=False)
    if v.constants:
        lines.append("    constants in every condition: " + ", ".join(f"{c.name} {c.mass_t:g} t" for c in v.constants))
    return lines


def _print_problems(problems: list[Problem], path: Path) -> None:
    for p in problems:
        print(p)
    print(f"{_plural(len(problems), 'problem')} in {path}")


def run_check(profile_path: Path, condition_path: Path | None = None) -> int:
    """Validate the profile (and the condition against it); print the outcome; return the exit status."""
    profile_path = Path(profile_path)
    try:
        profile = load_audited(profile_path)  # from the profile cache when its files are unchanged
        vessel, reading, found = profile.vessel, profile.reading, list(profile.found)
    except OSError as e:
        print(f"deckload: cannot read {profile_path}: {e.strerror or e}", file=sys.stderr)
        return 2
    except ProfileError as e:
        _print_problems(e.problems, profile_path)
        print("plausibility audit and booklet conditions: not run until these problems are put right")
        if condition_path is not None:
            print(f"{condition_path}: not checked: its vessel profile has problems")
        return 1
    sources = {k: tr.csv for k, tr in reading.tables.items() if tr.csv}
    summary = profile_summary(profile_path, vessel, sources, reading.free_surface)
    booklet = None if any(f.is_error for f in found) else _read_booklet(profile_path, vessel)
    if booklet is None or isinstance(booklet, (int, ProfileError)):
        # the schema is met but the numbers contradict each other, or a worked condition it names has
        # a problem printed below: not "OK" above it
        summary[0] = "ERR " + summary[0][4:]
    for line in summary:
        print(line)

    status = _audit(found)
    if status:
        # The screen, calc and report refuse a profile whose audit found a contradiction; a
        # result they could not produce must not come from check either.
        print("booklet conditions: not run until the audit's errors are put right")
        if condition_path is not None:
            print(f"{condition_path}: not computed: its vessel profile has audit errors")
        print(CAUTION)
        return status
    status = max(status, _booklet(profile_path, vessel, booklet))
    if condition_path is not None:
        status = max(status, _check_condition(Path(condition_path), vessel))
    print(CAUTION)
    return status


def _audit(found) -> int:
    """Print the plausibility audit's findings; 1 when it found a contradiction (an error)."""
    errors = sum(1 for f in found if f.is_error)
    for f in found:
        print(f)
    if not found:
        print("    plausibility audit: nothing suspicious found")
    else:
        print(f"plausibility audit: {_plural(errors, 'error')} (contradictions: put right before use), "
              f"{_plural(len(found) - errors, 'warning')} (doubts: compare with the booklet)")
    return 1 if errors else 0


def _cell(x: float, sign: str = "") -> str:
    """A number in the booklet comparison: four decimals, as the booklets print them; beyond
    1e6 (a profile whose audit already failed: a KN of 1e300) six significant digits, so that
    the row stays one line instead of three hundred digits."""
    return f"{x:{sign}.4f}" if abs(x) < 1e6 else f"{x:{sign}.6g}"


def _read_booklet(path: Path, vessel: m.Vessel):
    """The profile's booklet conditions (a list), the ProfileError listing their problems, or 2 when a
    file could not be read (said on stderr)."""
    from deckload.io.booklet_conditions import load_booklet_conditions

    try:
        return load_booklet_conditions(path, vessel)
    except OSError as e:
        print(f"deckload: cannot read {e.filename or path}: {e.strerror or e}", file=sys.stderr)
        return 2
    except ProfileError as e:
        return e


def _print_booklet_problems(problems: list[Problem], path: Path) -> None:
    """Every problem of the booklet conditions, then how many there are in each file: a worked
    condition's own file is named as the file with the problem (not the profile naming it)."""
    for p in problems:
        print(p)
    counts: dict[str, int] = {}
    for p in problems:
        counts[p.file or str(path)] = counts.get(p.file or str(path), 0) + 1
    for file, n in counts.items():
        if file == str(path):
            print(f"{_plural(n, 'problem')} in {path} (its [[booklet_condition]] entries)")
        else:
            print(f"{_plural(n, 'problem')} in {file} (the loading of a booklet condition of {path})")


def _booklet(path: Path, vessel: m.Vessel, cases) -> int:
    """Recompute the booklet's worked conditions (as :func:`_read_booklet` read them) and print them
    beside the booklet's results."""
    from deckload.core.booklet import compare, disagreements
    from deckload.core.stability import evaluate
    from deckload.core.tables import OutOfRangeError
    from deckload.io.tomlcheck import printed_half_unit

    if isinstance(cases, int):
        return cases
    if isinstance(cases, ProfileError):
        _print_booklet_problems(cases.problems, path)
        print("booklet conditions: not computed until these problems are put right")
        return 1
    if not cases:
        print(textwrap.fill(NO_BOOKLET_NOTE, NOTE_WIDTH, subsequent_indent="      ", break_on_hyphens=False))
        return 0
    passed = 0
    for case in cases:
        where = f" ({case.page})" if case.page else ""
        print(f"booklet condition {case.name!r}{where}, loading: {case.source}")
        for line in case.conversions:
            print(f"    {line}")
        # the page against itself first: a value typed wrong from the page shows there, and the
        # comparison with deckload below would only say a row is off, not that the page cannot be so
        own = disagreements(case.expected.get("as_typed", {}), printed_half_unit)
        if own:
            print(f"    FAIL: the booklet condition's own numbers disagree ({_plural(len(own), 'relation')} broken, "
                  "beyond the rounding of the decimals typed): a value typed from the booklet page is likely "
                  "wrong; compare these keys with the page:")
            for d in own:
                print(f"      {d.text} ({d.difference:+.4g} apart, rounding allows ±{d.allowed:.2g})")
        try:
            result = evaluate(vessel, case.condition)
        except (OutOfRangeError, ValueError) as e:
            print(f"    FAIL: cannot be computed: {e}")
            continue
        rows = compare(result, case.expected, vessel.particulars.breadth_m)
        print(f"    {'quantity':<27} {'booklet':>9} {'deckload':>9} {'difference':>10} {'tolerance':>13}  "
              f"{'rule (standards.md §5.3)':<38} result")
        for r in rows:
            got = "—" if r.deckload is None else _cell(r.deckload)
            diff = "—" if r.difference is None else _cell(r.difference, "+")
            label = f"{r.label} ({r.unit})"
            allowed = f"±{r.allowed:.3g} {r.unit}"
            verdict = "pass" if r.passed else "FAIL" + (f": {r.note}" if r.note else "")
            print(f"    {label:<27} {_cell(r.booklet):>9} {got:>9} {diff:>10} {allowed:>13}  {r.tolerance:<38} {verdict}")
        failed = [r for r in rows if not r.passed]
        for r in failed:
            hint = _datum_hint(r, case.expected, vessel.particulars)
            if hint:
                print(textwrap.fill(hint, NOTE_WIDTH, initial_indent="    hint: ", subsequent_indent="      ",
                                    break_on_hyphens=False))
        if failed:
            print(f"    FAIL: {_plural(len(failed), 'row')} outside tolerance: " + ", ".join(r.label for r in failed))
        if own:
            print("    FAIL: the booklet's own numbers disagree (above): "
                  + ", ".join(dict.fromkeys(k for d in own for k in d.keys)))
        if not failed and not own:
            passed += 1
            print(f"    pass: all {_plural(len(rows), 'row')} within tolerance")
    print(f"booklet conditions: {passed} of {len(cases)} within the MSC.1/Circ.1229 / IACS UR L5 tolerances "
          "(standards.md §5.3)")
    return 0 if passed == len(cases) else 1


def _datum_hint(row, expected: dict, p: m.Particulars) -> str | None:
    """For a worked condition's LCG outside tolerance: the longitudinal convention in which the number
    as typed would agree with deckload, when it is not the one it was read in.  The expected values
    are read from the AP, + forward, unless ``[booklet_condition.expected]`` states its own datum
    (not the ``[vessel]``'s): a page printed from midships, typed as printed without the keys, fails
    by about LBP/2 and says nothing of why (found by a booklet-conventions audit)."""
    from deckload.core.booklet import QUANTITIES, within
    from deckload.io.conventions import DATUMS, Frame

    typed = expected.get("as_typed", {}).get(row.key)
    if row.key != "lcg_m" or row.deckload is None or typed is None:
        return None
    tolerance = QUANTITIES[row.key][2]
    for datum in DATUMS:
        for positive in ("forward", "aft"):
            x = Frame(p.lbp_m, datum, positive).x_to_ap(float(typed))
            if abs(x - row.booklet) > 1e-9 and within(row.deckload, x, tolerance.allowed(x, p.breadth_m)):
                return (f"{row.key} {typed:g} read from {datum}, + {positive}, would be {x:.4g} m from the AP, "
                        "within tolerance; [booklet_condition.expected] is read from the AP, + forward, unless "
                        f"it states its own: longitudinal_datum = \"{datum}\", longitudinal_positive = \"{positive}\"")
    return None


def _check_condition(path: Path, vessel: m.Vessel) -> int:
    try:
        condition = load_condition(path, vessel)
    except OSError as e:
        print(f"deckload: cannot read {path}: {e.strerror or e}", file=sys.stderr)
        return 2
    except ProfileError as e:
        _print_problems(e.problems, path)
        return 1

    from deckload.core.stability import evaluate
    from deckload.core.tables import OutOfRangeError

    try:
        result = evaluate(vessel, condition)
    except OutOfRangeError as e:
        _print_problems([Problem(str(path), None, "", None, f"cannot be computed: {e}")], path)
        return 1
    except ValueError as e:
        _print_problems([Problem(str(path), None, "", None, f"cannot be computed: {e}")], path)
        return 1
    except Exception as e:  # a bug in deckload, not in the file: say so, without a traceback
        print(f"deckload: internal error computing {path}: {type(e).__name__}: {e} "
              "(please report it with the profile and condition)", file=sys.stderr)
        if os.environ.get("DECKLOAD_DEBUG"):
            traceback.print_exc()
        return 3
    met = sum(1 for c in result.criteria if c.passed and c.assessed)
    print(
        f"OK  {path}: {condition.name!r}: valid, and computes to displacement {result.displacement_t:.1f} t, "
        f"mean draft {result.draft_mean_m:.3f} m, GM fluid {result.gm_fluid_m:.3f} m; "
        f"criteria met: {met} of {len(result.criteria)}"
    )
    for line in vf.verdict_lines(result, 100, "    "):
        print(line)
    for w in result.warnings:
        print(f"    {w.severity}: {w.message}")
    return 0
