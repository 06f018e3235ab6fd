"""``deckload calc``: compute one condition and print it, as text or as one JSON object."""

from __future__ import annotations

import json
import sys
from pathlib import Path

from deckload.core.result import Result

CAUTION = (
    "deckload supports, and never replaces, the approved stability booklet, the master's "
    "judgement and flag-State and class rules."
)


def format_summary(r: Result) -> str:
    """A plain-text summary of a result, for the terminal."""
    side = "stbd" if r.list_deg >= 0 else "port"
    trim_word = "by the stern" if r.trim_m >= 0 else "by the head"
    lines = [
        f"{r.vessel_name} — {r.condition_name}  (water {r.water_density_t_m3:.3f} t/m³)",
        "",
        f"  Displacement   {r.displacement_t:10.1f} t      Deadweight   {r.deadweight_t:10.1f} t",
        f"  LCG from AP    {r.lcg_m:10.3f} m      TCG          {r.tcg_m:+10.3f} m",
        f"  KG solid       {r.kg_m:10.3f} m      ΣFSM         {r.fsm_total_tm:10.1f} t·m",
        f"  FSC (ΣFSM/Δ)   {r.fsc_m:10.3f} m      KG fluid     {r.kg_fluid_m:10.3f} m",
        f"  KMt            {r.km_m:10.3f} m      GM solid     {r.gm_solid_m:10.3f} m",
        f"  GM fluid       {r.gm_fluid_m:10.3f} m      List         {abs(r.list_deg):9.2f}° {side}",
        f"  Draft aft      {r.draft_aft_m:10.3f} m      Draft fwd    {r.draft_fwd_m:10.3f} m",
        f"  Draft midships {r.draft_mean_m:10.3f} m      Trim         {abs(r.trim_m):10.3f} m {trim_word}",
        f"  Max GZ         {r.max_gz_m:10.3f} m at {r.max_gz_angle_deg:4.1f}°"
        + (f"   vanishing {r.vanishing_angle_deg:.1f}°" if r.vanishing_angle_deg is not None
           else f"   vanishing beyond {r.gz_end_deg:g}°")
        + (f"   θf {r.downflooding_angle_deg:.1f}°" if r.downflooding_angle_deg is not None else ""),
        f"  Free surface: rule {r.fs_rule}, GZ correction {r.gz_correction}",
    ] + ([f"  GZ curve ends at {r.gz_end_deg:g}°, the last angle of the KN tables: nothing beyond is known"]
         if r.gz_end_deg < 90.0 else []) + [
        "",
        "  Criteria" + (f" (checked heeling to {r.criteria_side})" if r.tcg_m else ""),
    ]
    for c in r.criteria:
        mark = "pass" if c.passed else "FAIL"
        lines.append(
            f"    [{mark}] {c.description:<45} {c.value:9.3f} {c.comparison} {c.limit:7.3f} {c.unit:<5}"
            f" margin {c.margin:+.3f}   {c.source}"
        )
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
    lines += ["", "  " + ("All criteria met." if r.all_criteria_pass else "CRITERIA NOT MET."), "", CAUTION]
    return "\n".join(lines)


def load_and_evaluate(profile_path: Path, condition_path: Path):
    """Load a profile and a condition and evaluate them, for the commands that print results.

    Returns ``(vessel, condition, result)``, or the exit status after printing what is
    wrong to stderr: 1 for bad input (naming the file and key), 2 for an unreadable file.
    """
    from deckload.core.loading import LoadingError
    from deckload.core.stability import evaluate
    from deckload.core.tables import OutOfRangeError
    from deckload.profiles import ProfileError, load_condition, load_profile

    try:
        vessel = load_profile(profile_path)
        condition = load_condition(condition_path, vessel)
        return vessel, condition, evaluate(vessel, condition)
    except ProfileError as e:
        print(str(e), file=sys.stderr)
        return 1
    except (LoadingError, OutOfRangeError) as e:
        print(f"{condition_path}: {e}", file=sys.stderr)
        return 1
    except OSError as e:
        print(f"deckload: cannot read {e.filename}: {e.strerror}", file=sys.stderr)
        return 2


def run_calc(profile_path: Path, condition_path: Path, *, as_json: bool = False) -> int:
    """Load, evaluate and print; exit 0 when computed (pass or fail), non-zero on bad input."""
    loaded = load_and_evaluate(profile_path, condition_path)
    if isinstance(loaded, int):
        return loaded
    vessel, result = loaded[0], loaded[2]
    if as_json:
        print(json.dumps(result.to_json_dict(), indent=1, ensure_ascii=False, allow_nan=False))
    else:
        print(format_summary(result))
        keel = vessel.particulars.keel_thickness_m
        if keel > 0.0:
            # The draft marks read extreme drafts where the booklet gives a keel thickness.
            print(f"  Extreme drafts (moulded + keel {keel:.3f} m): aft {result.draft_aft_m + keel:.3f} m, "
                  f"midships {result.draft_mean_m + keel:.3f} m, fwd {result.draft_fwd_m + keel:.3f} m")
    return 0
