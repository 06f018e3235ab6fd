"""``deckload calc``: compute one condition and print it, as text or as one JSON object."""

from __future__ import annotations

import sys
import textwrap
from pathlib import Path

from deckload.report import verdict_format as vf
from deckload.core.result import Result
from deckload.core.trimmed_tables import tables_basis

CAUTION = vf.CAUTION


def format_summary(r: Result, tables: str | None = None, doubts: tuple[str, ...] = ()) -> str:
    """A plain-text summary of a result, for the terminal; ``tables`` is the sentence saying which
    hydrostatic and KN tables were used (:func:`deckload.core.trimmed_tables.tables_basis`);
    ``doubts`` the profile's plausibility-audit warnings, printed before the verdict they may undo."""
    # below the last printed decimal the words of the report: upright, even keel (not "0.00° stbd")
    if r.list_deg is None:
        list_text = f"{vf.NO_EQUILIBRIUM:>23}"
    else:
        side = "upright" if abs(r.list_deg) < 0.05 else "stbd" if r.list_deg > 0 else "port"
        list_text = f"{abs(r.list_deg):9.1f}° {side}"
    trim_word = "even keel" if abs(r.trim_m) < 0.0005 else "by the stern" if r.trim_m > 0 else "by the head"
    lines = [
        f"{r.vessel_name} — {r.condition_name}  (water {r.water_density_t_m3:.3f} t/m³)",
        "",
        f"  Displacement   {r.displacement_t:10.1f} t      Deadweight   {r.deadweight_t:10.1f} t",
        f"  LCG from AP    {r.lcg_m:10.3f} m      TCG          {r.tcg_m:+10.3f} m",
        f"  KG solid       {r.kg_m:10.3f} m      ΣFSM         {r.fsm_total_tm:10.1f} t·m",
        f"  FSC (ΣFSM/Δ)   {r.fsc_m:10.3f} m      KG fluid     {r.kg_fluid_m:10.3f} m",
        f"  KMt            {r.km_m:10.3f} m      GM solid     {r.gm_solid_m:10.3f} m",
        f"  GM fluid       {r.gm_fluid_m:10.3f} m      List         {list_text}",
        f"  Draft aft      {r.draft_aft_m:10.3f} m      Draft fwd    {r.draft_fwd_m:10.3f} m",
        f"  Draft midships {r.draft_mean_m:10.3f} m      Trim         {abs(r.trim_m):10.3f} m {trim_word}",
        f"  Max GZ         {r.max_gz_m:10.3f} m at {r.max_gz_angle_deg:4.1f}°"
        + ("   GZ never positive" if vf.never_positive(r) else f"   vanishing {vf.vanishing_words(r)}")
        + (f"   θf {r.downflooding_angle_deg:.1f}°" if r.downflooding_angle_deg is not None else ""),
        f"  Freeboard mid  {vf.fmt_optional(r.freeboard_m, '.3f', ' m'):>12}      "
        f"Margin to the mark {vf.fmt_optional(r.load_line_margin_m, '+.3f', ' m'):>9} (+ below it)",
        *([f"  Load line      {r.load_line_mark} mark {r.load_line_mark_draft_m:.3f} m; in water of "
           f"{r.water_density_t_m3:.3f} t/m³ DWA {vf.fmt_optional(r.dock_water_allowance_m, '+.3f', ' m')}, "
           f"allowed midships draft {vf.fmt_optional(r.load_line_allowed_draft_m, '.3f', ' m')}"]
          if r.load_line_mark is not None else []),
        f"  Deck edge in   {vf.fmt_optional(r.deck_edge_angle_deg, '.1f', '°'):>11}       "
        f"θf {vf.flood_words(r):>18}",
        f"  Free surface: rule {r.fs_rule}, GZ correction {r.gz_correction}",
    ] + ([f"  Tables: {tables}"] if tables else []) + ([f"  GZ curve ends at {r.gz_end_deg:g}°, the last angle of the KN tables: nothing beyond is known"]
         if r.gz_end_deg < 90.0 else []) + [
        "",
        "  Criteria" + (f" (checked heeling to {r.criteria_side})" if r.tcg_m else ""),
    ]
    for g in vf.grouped(r):
        lines.append(f"   {vf.set_title(g.set.title)} [{g.set.id}]: {g.word}")
        for c in g.criteria:
            if c.assessed:
                d = vf.digits_of(c)
                lines.append(
                    f"    [{vf.result_word(c)}] {c.description:<45} {vf.value_text(c, 9)} {c.comparison} "
                    f"{c.limit:7.{d}f} {c.unit:<5} margin {vf.margin_text(c)}   {c.source}"
                )
            else:
                lines.append(f"    [{vf.NOT_ASSESSABLE}] {c.description:<45} limit {c.comparison} "
                             f"{c.limit:.{vf.digits_of(c)}f} {c.unit}   {c.source}")
            if c.note:
                lines.append(f"           {c.note}")
    w = r.weather
    if w is not None:
        lines.append(
            f"    weather: wind {w.wind_pressure_pa:.0f} Pa on {w.windage_area_m2:.1f} m², lever {w.windage_lever_m:.2f} m; "
            f"lw1 {w.lw1_m:.4f} m, lw2 {w.lw2_m:.4f} m; θ0 {w.theta0_deg:.1f}° (limit {w.theta0_limit_deg:.1f}°), "
            f"θ1 {w.theta1_deg:.1f}°, θ2 {w.theta2_deg:.1f}°; a {w.area_a_mrad:.4f}, b {w.area_b_mrad:.4f} m·rad")
    lines += [""] + vf.not_assessed_lines(r, 100, "  ")
    lines += ["", "  Tanks"]
    for t in r.tanks:
        flag = {"worst_band": "▲", "slack": "≈", "full": "■", "empty": "·"}[t.state]
        lines.append(
            f"    {flag} {t.id:<7} {t.fill_pct:6.1f} % {t.volume_m3:8.2f} m³ {t.mass_t:8.2f} t"
            f"  FSM {t.fsm_tm:7.1f} t·m  {t.state:<10} {t.fs_rule}"
        )
    lines.append("    ▲ worst band  ≈ slack  ■ nominally full  · empty")
    if r.warnings:
        lines += ["", "  Warnings"]
        lines += [f"    ! {w.message}" for w in r.warnings]
    if doubts:
        lines += [""] + vf.doubts_block(doubts)
    lines += [""] + vf.verdict_lines(r, 100, "  ") + ["", CAUTION]
    return "\n".join(lines)


def format_comparison(cmp) -> str:
    """The direct calculation beside the tables' result: one row per quantity, with the difference,
    its tolerance (UR L5 / Circ.1229) and a mark on every row beyond it; then how many are beyond."""
    from deckload.report import direct_format as df

    lines = [
        "",
        "  Second method: direct calculation from the hull geometry (free in trim and heel, for the actual G)",
        f"    {'':<24}{'tables':>11}{'direct':>11}{'difference':>12}       {'tolerance':>10}",
    ]
    for row in cmp.rows:
        a, b, diff, allowed, mark = df.cells(row)
        lines.append(f"    {row.quantity:<24}{a:>11}{b:>11}{diff:>12} {row.unit:<6}{allowed:>10}  {mark}")
        if row.note:
            lines += textwrap.wrap(row.note, 100, initial_indent="        ", subsequent_indent="        ")
    lines += textwrap.wrap(df.legend(cmp), 100, initial_indent="    ", subsequent_indent="      ")
    lines.append("")
    lines += textwrap.wrap(("!! " if cmp.beyond else "") + cmp.summary(), 100,
                           initial_indent="    ", subsequent_indent="       " if cmp.beyond else "    ")
    lines.append("    The criteria above are judged on the tables; the direct figures are for comparison.")
    return "\n".join(lines)


def load_and_evaluate(profile_path: Path, condition_path: Path, notes: list[str] | None = None):
    """Load a profile and a condition and evaluate them, for the commands that print results.

    Returns ``(vessel, condition, result, doubts)`` — ``doubts`` the plausibility audit's warnings
    on the profile, one line each (:func:`deckload.report.audit_findings.doubt_lines`), which every
    printout carries — or the exit status after printing what is wrong to stderr: 1 for bad input
    (naming the file and key), 2 for an unreadable file.  With ``notes`` (a list), the note of a
    profile without worked booklet conditions is added to it (:func:`audit_findings.booklet_note`).
    """
    from deckload.core.loading import LoadingError
    from deckload.core.stability import evaluate
    from deckload.core.tables import OutOfRangeError
    from deckload.io.profiles import ProfileError, load_condition

    from deckload.report.audit_findings import booklet_note, doubt_lines, load_audited, refuse_or_notice

    try:
        profile = load_audited(profile_path)  # from the profile cache when its files are unchanged
        vessel = profile.vessel
        # A profile whose numbers contradict each other (positions outside the vessel, a KN or an
        # inertia beyond her hull) is never used, by any command (issue 12: the screen already refused it).
        refuse_or_notice(profile_path, profile.found)
        condition = load_condition(condition_path, vessel)
        result = evaluate(vessel, condition)
        note = booklet_note(profile)
        if notes is not None and note:
            notes.append(note)
        return vessel, condition, result, doubt_lines(profile.found)
    except ProfileError as e:
        print(str(e), file=sys.stderr)
        return 1
    except (LoadingError, OutOfRangeError) as e:
        print(f"{condition_path}: {e}", file=sys.stderr)
        return 1
    except OSError as e:
        print(f"deckload: cannot read {e.filename}: {e.strerror}", file=sys.stderr)
        return 2


def print_doubts(doubts, profile_path: Path) -> None:
    """The profile's audit warnings on stderr, for the commands whose output has no place for them."""
    if doubts:
        print(f"deckload: {Path(profile_path).name}:", *vf.doubts_block(doubts), sep="\n", file=sys.stderr)


def direct_comparison(profile_path: Path, vessel, result: Result):
    """The table result beside the direct calculation from the hull, or exit status 1 with the
    reason printed (no hull geometry, or a condition outside what the hull can float)."""
    from deckload.core.equilibrium import DirectError, compare
    from deckload.core.tables import OutOfRangeError

    try:
        return compare(vessel, result)
    except (DirectError, OutOfRangeError) as e:
        print(f"{profile_path}: direct calculation: {e}", file=sys.stderr)
        return 1


def load_evaluate_compare(profile_path: Path, condition_path: Path, direct: bool, notes: list[str] | None = None):
    """:func:`load_and_evaluate` (``notes`` as there), then (with ``direct``) :func:`direct_comparison`: returns
    ``(vessel, condition, result, doubts, comparison or None)``, or the exit status of the first refusal."""
    loaded = load_and_evaluate(profile_path, condition_path, notes)
    if isinstance(loaded, int):
        return loaded
    vessel, condition, result, doubts = loaded
    cmp = direct_comparison(profile_path, vessel, result) if direct else None
    if isinstance(cmp, int):
        return cmp
    return vessel, condition, result, doubts, cmp


def run_calc(profile_path: Path, condition_path: Path, *, as_json: bool = False, direct: bool = False) -> int:
    """Load, evaluate and print; exit 0 when computed (pass or fail), non-zero on bad input.

    With ``direct`` the direct calculation from the hull geometry is printed beside the
    tables' result (the profile must name its ``hull_geometry``); when any of its rows is beyond
    its UR L5 / Circ.1229 tolerance everything is printed as usual and the exit status is 1 (as
    ``check``'s for a booklet row out of tolerance), with the reason on stderr."""
    notes: list[str] = []
    loaded = load_evaluate_compare(profile_path, condition_path, direct, notes)
    if isinstance(loaded, int):
        return loaded
    vessel, _, result, doubts, cmp = loaded
    basis = tables_basis(vessel, result.trim_m)
    if as_json:
        import json

        doc = result.to_json_dict()
        doc["tables_basis"] = basis.as_dict()
        # the profile's audit warnings travel with the numbers they may have made wrong
        doc["profile_audit_warnings"] = list(doubts)
        if cmp is not None:
            from deckload.report import direct_format as df

            doc["direct"] = {"method": "hull geometry, free trim and heel, actual G",
                             "tolerances": cmp.source,
                             "rows": [df.as_json(row) for row in cmp.rows],
                             "beyond_tolerance": len(cmp.beyond), "summary": cmp.summary(),
                             "gz_m": list(cmp.gz_direct_m)}
        # A JSON copy travels without the screen or the printout around it: it carries the caution.
        doc["caution"] = CAUTION
        print(json.dumps(doc, indent=1, ensure_ascii=False, allow_nan=False))
        for note in notes:  # the JSON's keys stay as documented: the note goes to the terminal
            print(f"deckload: {note}", file=sys.stderr)
    else:
        text = format_summary(result, basis.words, doubts)
        extra = []
        keel = vessel.particulars.keel_thickness_m
        if keel > 0.0:
            # The draft marks read extreme drafts where the booklet gives a keel thickness.
            extra.append(f"  Extreme drafts (moulded + keel {keel:.3f} m): aft {result.draft_aft_m + keel:.3f} m, "
                         f"midships {result.draft_mean_m + keel:.3f} m, fwd {result.draft_fwd_m + keel:.3f} m")
        if cmp is not None:
            extra.append(format_comparison(cmp))
        extra += [textwrap.fill(n, 100, initial_indent="  ", subsequent_indent="    ") for n in notes]
        if extra:
            # before the closing caution, which stays the last word of every printout
            head, sep, tail = text.rpartition("\n\n" + CAUTION)
            text = head + "\n" + "\n".join(extra) + sep + tail
        print(text)
    if cmp is not None and cmp.beyond:
        # exit 1, as `check` for a booklet row out of tolerance: the profile's data contradict each other
        from deckload.report.direct_format import beyond_message

        print(beyond_message(profile_path, cmp), file=sys.stderr)
        return 1
    return 0
