"""The plausibility audit accepts exact tables: a box barge at light draft and a circular cylinder.

Found by an audit of exact cases: a box barge's exact KN with table drafts from 0.2 or 0.3 m were
refused ("KN ≈ KMt·sinφ … 53 % apart", "stands out of a smooth curve"), and a horizontal circular
cylinder's KN (R·sinθ at every draft) drew an error for every pair of rows.
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from box_profile_text import RHO, BoxTank, box_profile_text
from deckload.core.audit import ERROR, audit
from deckload.core.model import frozen_array
from deckload.io.profiles import parse_profile

L, B, D = 40.0, 10.0, 4.0
TANK = (BoxTank("T1", (10.0, 16.0), (-1.0, 1.0), (0.5, 1.5)),)
KN_CHECKS = ("kn-kmt", "kn-outlier", "kn-lone", "kn-row-repeat", "kn-row-swap", "kn-column-shift")


def light_barge(first_draft_m: float, heel_step_deg: float = 5.0):
    """The 40 × 10 × 4 m box barge of checks.md §1 with tables every 0.1 m from ``first_draft_m`` to
    3.8 m, KN exact (checks.md §1.2 [A]: the section clipped by the waterline, tests/vessel_factories).
    Its bilge emerges at tanφ = 2T/B (checks.md §1.1): 2.29° at 0.2 m, 3.43° at 0.3 m, before the
    first tabulated heel; its deck edge immerses at tanφ = 2(D − T)/B: 2.29° at 3.8 m.  The lightship
    (the box at 0.2 m less a little) puts every row within reach of a condition."""
    n = int(round((3.8 - first_draft_m) / 0.1)) + 1
    drafts = [round(first_draft_m + 0.1 * k, 3) for k in range(n)]
    text = box_profile_text(name="Light box barge", length_m=L, breadth_m=B, depth_m=D, drafts_m=drafts,
                            kn_drafts_m=drafts, heel_step_deg=heel_step_deg,
                            lightship=(RHO * L * B * 0.19, None, 2.5), tanks=TANK)
    return parse_profile(text, "light-barge.toml")


def kn_found(v):
    return [f for f in audit(v) if f.check in KN_CHECKS]


@pytest.mark.parametrize("first, step", [(0.2, 5.0), (0.3, 5.0), (0.2, 10.0), (0.3, 10.0), (0.4, 5.0)])
def test_exact_light_draft_box_tables_pass_the_audit(first, step):
    assert [f.text() for f in kn_found(light_barge(first, step))] == []


def test_the_light_barge_still_shows_a_decimal_slip_at_small_heel():
    """KN(5°) at 1.0 m typed ten times over (a decimal slip, audit.KN_SMALL_ANGLE_ERROR): the wall-sided
    relation holds there (bilge at 11.3°, deck edge at 31.0°), so it is an error as before."""
    v = light_barge(0.2)
    a = np.array(v.cross_curves.kn_m)
    i = int(np.argmin(np.abs(np.asarray(v.cross_curves.displacement_t) - RHO * L * B * 1.0)))
    a[i, 1] *= 10.0
    v2 = dataclasses.replace(v, cross_curves=dataclasses.replace(v.cross_curves, kn_m=frozen_array(a)))
    got = [(f.severity, f.path[2:]) for f in kn_found(v2) if f.check in ("kn-kmt", "kn-outlier")]
    assert (ERROR, (i, 1)) in got


def test_the_light_barge_still_shows_a_decimal_slip_past_the_bilge():
    """KN(10°) at 0.2 m typed twice over (3.41 → 6.82 m, near KMt·sinφ = 7.25 m, so the small-heel
    check cannot see it): past the bilge (2.29°) the box's KN runs smoothly on (checks.md §1.2 case 2
    from 5° to 15°), so the cell standing 112 % off the line through its neighbours along the heel
    is still an error (audit.KN_OUTLIER)."""
    v = light_barge(0.2)
    a = np.array(v.cross_curves.kn_m)
    a[0, 2] *= 2.0
    v2 = dataclasses.replace(v, cross_curves=dataclasses.replace(v.cross_curves, kn_m=frozen_array(a)))
    assert (ERROR, "kn-outlier") in {(f.severity, f.check) for f in kn_found(v2) if f.path[2:] == (0, 2)}


@pytest.mark.parametrize("draft, row", [
    (1.0, (1.55639, 2.68414, 3.19743, 3.45955, 3.47903, 3.29594, 2.96747, 2.52674, 2.00000)),
    (2.0, (0.90843, 1.86150, 2.58771, 2.85134, 2.90730, 2.82650, 2.63719, 2.35671, 2.00000)),
    (3.0, (0.75033, 1.35074, 1.73248, 2.01023, 2.18107, 2.25335, 2.24208, 2.15533, 2.00000))])
def test_the_audits_box_kn_is_the_exact_cross_curve(draft, row):
    """audit.box_kn (the allowance's reference hull) against checks.md §1.4 [A] (B 10, D 4 m, 10°–90°;
    printed to 1e-5), through every waterline regime of the section."""
    from deckload.core.audit import box_kn
    got = [box_kn(10.0, 4.0, draft, 10.0 * k)[0] for k in range(1, 10)]
    assert got == pytest.approx(list(row), abs=1e-5)


def cylinder(kn_rows=None, kmt=None):
    """A horizontal circular cylinder, R 5 m, L 40 m, drafts 2–8 m every 0.25 m (checks.md §2.2 [A]).
    Segment of half-angle α = arccos((R − T)/R): area A = R²(2α − sin 2α)/2, centroid height
    KB = R − 4R·sin³α/(3(2α − sin 2α)), waterline breadth w = 2√(T(2R − T)); the metacentre stays at
    the axis, so KMt = R and KN = R·sinφ at every draft and heel."""
    R, L = 5.0, 40.0
    T = np.round(np.arange(2.0, 8.001, 0.25), 3)
    two_a = 2.0 * np.arccos((R - T) / R)
    area = R * R * (two_a - np.sin(two_a)) / 2.0
    kb = R - 4.0 * R * np.sin(two_a / 2.0) ** 3 / (3.0 * (two_a - np.sin(two_a)))
    w = 2.0 * np.sqrt(T * (2.0 * R - T))
    heels = np.arange(0.0, 91.0, 5.0)
    rows = kn_rows if kn_rows is not None else np.tile(R * np.sin(np.radians(heels)), (len(T), 1))
    km = kmt if kmt is not None else np.full(len(T), R)

    def arr(xs):
        return "[" + ", ".join(repr(float(x)) for x in xs) + "]"

    text = "\n".join([
        'format = "deckload-profile-1"', "[vessel]", 'name = "Cylinder"', f"lbp_m = {L}", "breadth_m = 10.0",
        "depth_m = 10.0", "design_draft_m = 5.0", "table_density_t_m3 = 1.025", 'longitudinal_datum = "AP"',
        "[lightship]", "mass_t = 400.0", "lcg_m = 20.0", "vcg_m = 4.0", "tcg_m = 0.0",
        "[hydrostatics]", f"draft_m = {arr(T)}", f"displacement_t = {arr(RHO * L * area)}",
        f"lcb_m = {arr([20.0] * len(T))}", f"lcf_m = {arr([20.0] * len(T))}", f"kmt_m = {arr(km)}",
        f"tpc_t_cm = {arr(RHO * L * w / 100.0)}", f"mctc_tm_cm = {arr(RHO * w * L ** 3 / 12.0 / (100.0 * L))}",
        f"vcb_m = {arr(kb)}",
        "[cross_curves]", 'trim_basis = "free trim"', f"heel_deg = {arr(heels)}",
        f"displacement_t = {arr(RHO * L * area)}", "kn_m = [", *("  " + arr(r) + "," for r in rows), "]",
        "[criteria]", 'ship_type = "general"',
        "[[tank]]", 'id = "T1"', 'name = "T1"', 'kind = "ballast"', "density_t_m3 = 1.025", "capacity_m3 = 12.0",
        "[tank.calibration]", "sounding_m = [0.0, 0.5, 1.0]", "volume_m3 = [0.0, 6.0, 12.0]",
        "lcg_m = [13.0, 13.0, 13.0]", "vcg_m = [1.0, 1.25, 1.5]", "tcg_m = [0.0, 0.0, 0.0]",
        "fsi_m4 = [4.0, 4.0, 4.0]", ""])
    return parse_profile(text, "cylinder.toml")


def test_a_circular_cylinders_kn_table_gets_no_error():
    """Every row R·sinφ, KMt = R (checks.md §2.2 [A]): no row was copied; the table is the circle's."""
    v = cylinder()
    assert [f.text() for f in audit(v) if f.severity == ERROR] == []
    assert kn_found(v) == []


def test_every_row_alike_on_a_hull_whose_kmt_changes_is_one_error():
    """The same rows with KMt falling from 6 to 4 m (not a circle: checks.md §2.2) cannot all be right:
    one error naming every row, not one per pair of rows."""
    v = cylinder(kmt=np.linspace(6.0, 4.0, 25))
    (f,) = [f for f in kn_found(v) if f.check == "kn-row-repeat"]
    assert (f.severity, f.check, f.path[2:]) == (ERROR, "kn-row-repeat", (0, 1))
    assert "every row holds the same KN" in f.why and "her KMt runs from 4 m to 6 m" in f.why


def test_every_row_alike_off_the_circle_is_one_error():
    """Every row 0.9·R·sinφ with KMt = R: at 90° the rows hold 4.5 m, not KMt·sin 90° = 5 m (beyond the
    5 cm of UR L5 for cross curves, standards.md §5.3)."""
    heels = np.arange(0.0, 91.0, 5.0)
    v = cylinder(kn_rows=np.tile(0.9 * 5.0 * np.sin(np.radians(heels)), (25, 1)))
    got = [f for f in kn_found(v) if f.check == "kn-row-repeat"]
    assert len(got) == 1 and "at 90° the rows hold 4.5 m, not KMt·sinφ = 5 m" in got[0].why


def test_the_tables_deckload_builds_for_a_light_box_barge_pass_its_audit(tmp_path):
    """``deckload tables`` on the 40 × 10 × 4 m box's offsets with drafts from 0.2 m (its hydrostatics and
    KN by direct calculation) writes a profile that ``calc`` would read: no audit error.  Before, the
    profile it wrote was refused (KN at 0.2 m, 10°: "53 % apart" from KMt·sinφ)."""
    from deckload.cli.main import main
    from deckload.io.profiles import load_profile

    def arr(xs):
        return "[" + ", ".join(repr(float(x)) for x in xs) + "]"

    xs, zs = [4.0 * k for k in range(11)], [0.5 * k for k in range(9)]
    drafts = [round(0.2 + 0.2 * k, 3) for k in range(19)]
    geo = tmp_path / "barge.geometry.toml"
    geo.write_text("\n".join([
        'format = "deckload-geometry-1"', "[vessel]", 'name = "Light box barge"', f"lbp_m = {L}",
        f"breadth_m = {B}", f"depth_m = {D}", "design_draft_m = 3.0", "table_density_t_m3 = 1.025",
        "[hull]", f"station_x_m = {arr(xs)}", f"waterline_z_m = {arr(zs)}", f"deck_z_m = {arr([D] * len(xs))}",
        "half_breadth_m = [", *("  " + arr([B / 2] * len(zs)) + "," for _ in xs), "]",
        "[tables]", f"draft_m = {arr(drafts)}", f"kn_displacement_t = {arr([RHO * L * B * t for t in drafts])}",
        f"kn_heel_deg = {arr(range(0, 91, 5))}", 'trim_basis = "free trim"', f"trim_lcg_m = {L / 2}",
        "trim_vcg_m = 3.0", "sounding_step_m = 0.1", "transfer_fill_step_pct = 5.0",
        "[[tank]]", 'id = "T1"', 'name = "T1"', 'kind = "ballast"', "density_t_m3 = 1.025", 'shape = "box"',
        "x_m = [10.0, 16.0]", "y_m = [-1.0, 1.0]", "z_m = [2.0, 3.0]",
        "[lateral_profile]", f"x_m = [0.0, {L}, {L}, 0.0]", f"z_m = [0.0, 0.0, {D}, {D}]", ""]), encoding="utf-8")
    prof = tmp_path / "barge.toml"
    prof.write_text("\n".join([
        'format = "deckload-profile-1"', 'load_line = [ { name = "summer", draft_m = 3.0 } ]', "[vessel]",
        'name = "Light box barge"', f"lbp_m = {L}", f"breadth_m = {B}", f"depth_m = {D}", "design_draft_m = 3.0",
        "table_density_t_m3 = 1.025", 'longitudinal_datum = "AP"', "[lightship]", "mass_t = 80.0",
        "lcg_m = 20.0", "vcg_m = 2.5", "tcg_m = 0.0", "[criteria]", 'ship_type = "general"', ""]), encoding="utf-8")
    assert main(["tables", str(geo), "-o", str(prof)]) == 0
    v = load_profile(prof)
    assert float(v.cross_curves.displacement_t[0]) == pytest.approx(RHO * L * B * 0.2, rel=1e-3)
    assert [f.text() for f in audit(v) if f.severity == ERROR] == []
