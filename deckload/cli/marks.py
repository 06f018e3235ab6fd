"""``deckload marks PROFILE CONDITION [--aft P S --mid P S --fwd P S]``: drafts at the marks.

Prints what the draft marks should read for the computed condition and, given the six
readings taken round the ship, the displacement and LCG they imply beside the computed
ones, with the difference (what a mate checks her arithmetic, and her constant, against).
The work is :mod:`deckload.core.draft_marks`; this module only reads and prints.
"""

from __future__ import annotations

import sys
from pathlib import Path

from deckload.cli.calc import CAUTION, load_and_evaluate, print_doubts


def format_marks(vessel, condition, result, observed_readings=None) -> str:
    from deckload.core.draft_marks import condition_from_readings, marks_for

    cm = marks_for(vessel, result.draft_at_lcf_m, result.lcf_m, result.trim_m, result.list_deg)
    dm = vessel.draft_marks
    rd = cm.readings
    lines = [
        f"{result.vessel_name} — {result.condition_name}  (water {result.water_density_t_m3:.3f} t/m³)",
        "",
        f"  Draft marks (extreme, from the underside of the keel; keel {vessel.particulars.keel_thickness_m * 1000:.0f} mm)",
        "                   x from AP      port      stbd",
        f"    aft          {dm.aft.x_m:9.2f} m {rd.aft_port_m:9.3f} {rd.aft_stbd_m:9.3f} m",
        f"    midships     {dm.midships.x_m:9.2f} m {rd.mid_port_m:9.3f} {rd.mid_stbd_m:9.3f} m",
        f"    forward      {dm.forward.x_m:9.2f} m {rd.fwd_port_m:9.3f} {rd.fwd_stbd_m:9.3f} m",
        f"  Extreme draft at AP {cm.extreme_aft_m:.3f} m, at FP {cm.extreme_fwd_m:.3f} m; "
        f"deepest point {cm.deepest_m:.3f} m below the water (square-bilge bound)",
        "  Computed with trim about the LCF and the list as a plane tilt of the upright waterline.",
    ]
    if observed_readings is not None:
        o = condition_from_readings(vessel, observed_readings, condition.water_density_t_m3, result.kg_fluid_m)
        d_disp = o.displacement_t - result.displacement_t
        lines += [
            "",
            "  From the readings                 observed    computed   difference",
            f"    Displacement (t)            {o.displacement_t:10.1f}  {result.displacement_t:10.1f}  {d_disp:+10.1f}"
            f"  ({100 * d_disp / result.displacement_t:+.2f} %)",
            f"    LCG from AP (m)             {o.lcg_m:10.3f}  {result.lcg_m:10.3f}  {o.lcg_m - result.lcg_m:+10.3f}",
            f"    Trim (m, + by the stern)    {o.trim_m:10.3f}  {result.trim_m:10.3f}  {o.trim_m - result.trim_m:+10.3f}",
            f"    List (°, + starboard)       {o.list_deg:10.2f}  {result.list_deg:10.2f}  "
            f"{o.list_deg - result.list_deg:+10.2f}",
            f"  Drafts at AP {o.draft_ap_m:.3f}, midships {o.draft_mid_m:.3f}, FP {o.draft_fp_m:.3f} m (moulded); "
            f"{'hog' if o.deflection_m >= 0 else 'sag'} {abs(o.deflection_m):.3f} m",
            f"  Quarter-mean {o.quarter_mean_m:.3f} m, at the LCF ({o.lcf_m:.2f} m) {o.draft_at_lcf_m:.3f} m; "
            f"second trim correction {o.second_trim_correction_t:+.1f} t; MCTC {o.mctc_tm_cm:.2f} t·m/cm "
            f"({'actual GML' if o.mctc_basis == 'GML' else 'table'})",
            "  The difference in displacement is the unknown weight aboard (the ship's constant) plus any error",
            "  in the readings, the density or the tank soundings.",
        ]
        lines += [f"    ! {n}" for n in o.notes]
    lines += ["", CAUTION]
    return "\n".join(lines)


def run_marks(profile_path: Path, condition_path: Path, readings: list[float] | None) -> int:
    from deckload.core.draft_marks import DraftMarksError, MarkReadings
    from deckload.core.tables import OutOfRangeError

    loaded = load_and_evaluate(profile_path, condition_path)
    if isinstance(loaded, int):
        return loaded
    vessel, condition, result, doubts = loaded
    print_doubts(doubts, profile_path)
    if vessel.draft_marks is None:
        print(f"{profile_path}: the profile has no [draft_marks] (see vessel_profiles/README.md)", file=sys.stderr)
        return 1
    if result.list_deg is None:
        print(f"deckload marks: {condition_path}: GZ never becomes positive, so she has no position of "
              "equilibrium: no reading at the marks can be predicted", file=sys.stderr)
        return 1
    observed = MarkReadings(*readings) if readings is not None else None
    try:
        print(format_marks(vessel, condition, result, observed))
    except (DraftMarksError, OutOfRangeError) as e:
        print(f"deckload marks: {e}", file=sys.stderr)
        return 1
    return 0
