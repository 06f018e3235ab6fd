"""Drafts at the marks, and the reverse: what six draft readings say she displaces.

Forward.  The moulded draft at x on the centreline is T(x) = T_F + t·(x_F − x)/LBP
(trim t about the LCF, standards.md §6.3).  Listed φ to starboard, the waterline in ship
axes is z = T(x) + y·tanφ, so a mark at y off the centreline reads T(x) + y·tanφ on the
starboard side and T(x) − y·tanφ on the port side; marks read from the underside of the
keel, so each reading is the moulded draft plus the keel thickness (extreme draft).
The centreline draft under a list is taken as the upright one — the tables know no
better (at large lists the ship's centreline draft differs; the direct calculation from
the hull has no such assumption).  The deepest point of a listed hull is bounded by a
square bilge: (T_max + keel)·cosφ + (B/2)·sinφ below the water.

Reverse (a draft survey; common practice, e.g. the UN/ECE Code of uniform standards
and procedures for draught surveys of coal cargoes, 1992 — from memory).

1. At each mark the mean of port and starboard is the centreline draft (exactly: the
   waterline is a plane); the list is atan((S − P)/(2y)).  A rigid hull lists alike at every
   mark: pairs that disagree beyond what misread marks of the size the hog/sag bound refuses
   would explain are refused (:func:`twist_bound`), and so is a list beyond the deck-edge
   immersion angle, where the upright tables no longer hold (:func:`_refuse_list`).
2. Less the keel thickness, the aft and forward drafts give the trim
   t = (T_a − T_f)·LBP/(x_f − x_a) and the drafts at the perpendiculars; the midships
   reading is carried along the same slope to LBP/2 (T_M).
3. Hog (+) or sag (−): (T_AP + T_FP)/2 − T_M.  The quarter-mean draft
   T_Q = (T_AP + 6·T_M + T_FP)/8 allows for it, weighting midships as the fuller
   waterplane there does (the 'mean of means of means' of draft surveys; on a box a
   parabolic deflection would call for (T_AP + 4·T_M + T_FP)/6 instead).  T_AP, T_M and
   T_FP must each lie in 0 … the table's greatest draft, as the forward calculation's end
   drafts must, and a hog or sag beyond LBP/100 is refused as a misread mark
   (:data:`MAX_DEFLECTION_FRACTION`); beyond 5 cm it is noted.
4. The draft at the LCF, T_Q + t·(LBP/2 − x_F)/LBP, read in the even-keel table gives the
   displacement with the first trim correction included (x_F from the table, iterated);
   the second (Nemoto) correction 50·t²·(MCTC(T+½) − MCTC(T−½))/LBP (t in m, MCTC in t·m/cm)
   allows for the LCF moving forward as she trims (within half a metre of a table end the span
   stops at the end: the slope dMCTC/dT taken over what the table has).
5. Table displacement × ρ_water/ρ_table is her displacement; the trim equation
   t = Δ·(LCB − LCG)/(100·MCTC) turned round gives the LCG the readings imply, MCTC from
   the actual GM_L (:mod:`deckload.core.trim`) when a KG is given and the profile has KM_L.
"""

from __future__ import annotations

import math

from deckload.core.frozen import frozen
from deckload.core.hydrostatics import draft_at, upright
from deckload.core.model import DraftMarks, Vessel
from deckload.core.tables import OutOfRangeError, interp
from deckload.core.trim import trim_moment

DEFLECTION_NOTE_M = 0.05
"""Hog or sag beyond this (m) is reported in words: the quarter-mean allows for a deflection only
approximately (deckload's own threshold, the UR L5 5 cm draught tolerance)."""


MAX_DEFLECTION_FRACTION = 0.01
"""Hog or sag beyond LBP/100 is refused as a misreading, not a hull: a hull girder in service
deflects by the order of LBP/1000 (common practice, from memory: a large ship's hog or sag is tens
of centimetres), so a bound ten times that passes every real ship and still refuses a mark read
a metre wrong (1.70 m of sag on a 38 m hull is LBP/22)."""


def twist_bound(lbp_m: float, y_a_m: float, y_b_m: float) -> float:
    """The greatest |tan φ_a − tan φ_b| accepted between the lists two pairs of marks give
    (off the centreline by y_a and y_b, both > 0).

    A rigid hull's waterline is a plane, so every pair reads the same list; the hull girder's
    torsion at rest is far below anything the marks can show (common practice).  A difference
    is then the readings': a pair's tan φ = (S − P)/(2y), so each of its two marks misread by e
    (in opposite senses) moves it by e/y, and the four marks of two pairs misread by e move
    tan φ_a − tan φ_b by at most e·(1/y_a + 1/y_b).  The hog/sag bound refuses the readings when
    the midships pair misread by LBP/100 (both marks alike: T_M moves by e, the deflection by e)
    would be needed; the same misreading here, e = :data:`MAX_DEFLECTION_FRACTION` × LBP, gives

        bound = (LBP/100)·(1/y_a + 1/y_b).

    Readings within the UR L5 5 cm tolerance always pass it on a hull longer than 5 m
    (e ≥ 0.05 m); a mark read a whole mark figure wrong at a narrow bow pair does not."""
    e = MAX_DEFLECTION_FRACTION * lbp_m
    return e * (1.0 / y_a_m + 1.0 / y_b_m)


class DraftMarksError(ValueError):
    """Readings that cannot be turned into a displacement (naming the reading and the rule)."""


class DraftsBeyondTablesError(DraftMarksError, OutOfRangeError):
    """The readings put the keel out of the water, or an end deeper than the table reaches, at a
    perpendicular or midships: the same range the forward calculation keeps
    (:func:`deckload.core.bounds.checked_result`)."""

    def __init__(self, message: str, quantity: str, value: float, low: float, high: float):
        OutOfRangeError.__init__(self, quantity, value, low, high, "m")
        self.args = (message,)


@frozen
class MarkReadings:
    """Extreme drafts read at the marks (m), port and starboard, aft, midships and forward."""

    aft_port_m: float
    aft_stbd_m: float
    mid_port_m: float
    mid_stbd_m: float
    fwd_port_m: float
    fwd_stbd_m: float

    def as_tuple(self) -> tuple[float, ...]:
        return (self.aft_port_m, self.aft_stbd_m, self.mid_port_m, self.mid_stbd_m, self.fwd_port_m, self.fwd_stbd_m)


@frozen
class ComputedMarks:
    """What the marks should read for a computed condition."""

    readings: MarkReadings
    extreme_aft_m: float
    """Extreme draft (moulded + keel) at the AP, on the centreline (m)."""
    extreme_fwd_m: float
    """Extreme draft at the FP, on the centreline (m)."""
    deepest_m: float
    """Depth of the lowest point of the hull below the water, square-bilge bound (m)."""


def marks_for(vessel: Vessel, draft_at_lcf_m: float, lcf_m: float, trim_m: float, list_deg: float) -> ComputedMarks:
    """Readings at the marks for drafts worked about the LCF, listed ``list_deg`` (+ starboard)."""
    dm = _marks(vessel)
    lbp = vessel.particulars.lbp_m
    k = vessel.particulars.keel_thickness_m
    tan_l = math.tan(math.radians(list_deg))

    def pair(x: float, y: float) -> tuple[float, float]:
        t = draft_at(x, draft_at_lcf_m, lcf_m, trim_m, lbp) + k
        return t - y * tan_l, t + y * tan_l

    ap, as_ = pair(dm.aft.x_m, dm.aft.y_m)
    mp, ms = pair(dm.midships.x_m, dm.midships.y_m)
    fp, fs = pair(dm.forward.x_m, dm.forward.y_m)
    t_ap = draft_at(0.0, draft_at_lcf_m, lcf_m, trim_m, lbp) + k
    t_fp = draft_at(lbp, draft_at_lcf_m, lcf_m, trim_m, lbp) + k
    phi = math.radians(abs(list_deg))
    deepest = max(t_ap, t_fp) * math.cos(phi) + vessel.particulars.breadth_m / 2.0 * math.sin(phi)
    return ComputedMarks(MarkReadings(ap, as_, mp, ms, fp, fs), t_ap, t_fp, deepest)


@frozen
class ObservedCondition:
    """What six readings imply (module docstring); drafts moulded unless named extreme."""

    list_deg: float
    """+ starboard, from the midships marks (the longest lever is not always there; all three are shown)."""
    list_at_marks_deg: tuple[float, float, float]
    """List from the aft, midships and forward pairs (deg)."""
    draft_ap_m: float
    draft_fp_m: float
    draft_mid_m: float
    """The midships reading carried to LBP/2 (m)."""
    trim_m: float
    deflection_m: float
    """+ hog, − sag (m)."""
    quarter_mean_m: float
    draft_at_lcf_m: float
    lcf_m: float
    second_trim_correction_t: float
    table_displacement_t: float
    displacement_t: float
    lcb_m: float
    mctc_tm_cm: float
    mctc_basis: str
    lcg_m: float
    notes: tuple[str, ...]


def condition_from_readings(vessel: Vessel, readings: MarkReadings, water_density_t_m3: float,
                            kg_fluid_m: float | None = None) -> ObservedCondition:
    """Displacement and LCG that the readings imply (module docstring, steps 1–5).

    Raises :class:`DraftMarksError` for readings that are not finite, below the keel or
    above the depth, :class:`DraftsBeyondTablesError` (also an OutOfRangeError) when the moulded
    draft at the AP, the FP or midships lies outside 0 … the table's greatest draft (the range
    the forward calculation keeps), :class:`DraftMarksError` for a hog or sag beyond
    :data:`MAX_DEFLECTION_FRACTION` × LBP (a misread mark), and
    :class:`~deckload.core.tables.OutOfRangeError` when the draft lies outside the hydrostatic table.
    """
    dm = _marks(vessel)
    p = vessel.particulars
    lbp = p.lbp_m
    names = ("aft port", "aft starboard", "midships port", "midships starboard", "forward port", "forward starboard")
    k = p.keel_thickness_m
    for name, r in zip(names, readings.as_tuple()):
        if not math.isfinite(r) or not k <= r <= p.depth_m + k:
            raise DraftMarksError(f"{name} reading {r!r} m: must be a draft between the keel "
                                  f"({k:g} m) and the depth plus keel ({p.depth_m + k:g} m)")

    def centre(port: float, stbd: float, y: float) -> tuple[float, float]:
        lst = math.degrees(math.atan2(stbd - port, 2.0 * y)) if y > 0 else 0.0
        return 0.5 * (port + stbd) - k, lst

    t_a, l_a = centre(readings.aft_port_m, readings.aft_stbd_m, dm.aft.y_m)
    t_m, l_m = centre(readings.mid_port_m, readings.mid_stbd_m, dm.midships.y_m)
    t_f, l_f = centre(readings.fwd_port_m, readings.fwd_stbd_m, dm.forward.y_m)
    said = (f"the readings (port/starboard) aft {_m(readings.aft_port_m)}/{_m(readings.aft_stbd_m)}, "
            f"midships {_m(readings.mid_port_m)}/{_m(readings.mid_stbd_m)}, "
            f"forward {_m(readings.fwd_port_m)}/{_m(readings.fwd_stbd_m)} m")
    pairs = [(w, lst, y) for w, lst, y in (("aft", l_a, dm.aft.y_m), ("midships", l_m, dm.midships.y_m),
                                           ("forward", l_f, dm.forward.y_m)) if y > 0]
    _refuse_twist(said, pairs, lbp)
    slope = (t_f - t_a) / (dm.forward.x_m - dm.aft.x_m)  # d(draft)/dx, − trim/LBP
    t_ap = t_a - slope * dm.aft.x_m
    t_fp = t_a + slope * (lbp - dm.aft.x_m)
    trim = t_ap - t_fp
    t_mid = t_m + slope * (lbp / 2.0 - dm.midships.x_m)
    deflection = 0.5 * (t_ap + t_fp) - t_mid
    t_q = (t_ap + 6.0 * t_mid + t_fp) / 8.0

    h = vessel.hydrostatics
    top = float(h.draft_m[-1])
    for where, d in (("at the AP", t_ap), ("midships", t_mid), ("at the FP", t_fp)):
        if not 0.0 <= d <= top * (1 + 1e-9):
            raise DraftsBeyondTablesError(
                f"{said} give a moulded draft {where} of {d:.3f} m, outside 0–{top:.4g} m (keel to the "
                "hydrostatic table's greatest draft): no hull in the water reads so; check the readings",
                f"moulded draft {where}", d, 0.0, top)
    most = MAX_DEFLECTION_FRACTION * lbp
    if abs(deflection) > most:
        raise DraftMarksError(
            f"{said} give a {'hog' if deflection > 0 else 'sag'} of {abs(deflection):.3f} m, more than "
            f"LBP/100 = {most:.3f} m: a hull in service does not bend so far; a mark is misread")
    x_f = interp(h.draft_m, h.lcf_m, t_q, "quarter-mean draft (hydrostatic table)", "m")
    t_lcf = t_q
    for _ in range(20):  # x_F depends on the draft at the LCF: a fixed point, settled in a few steps
        t_lcf = t_q + trim * (lbp / 2.0 - x_f) / lbp
        x_new = interp(h.draft_m, h.lcf_m, t_lcf, "draft at the LCF (hydrostatic table)", "m")
        if abs(x_new - x_f) < 1e-9:
            break
        x_f = x_new
    d_table = interp(h.draft_m, h.displacement_t, t_lcf, "draft at the LCF (hydrostatic table)", "m")
    _refuse_list(said, pairs, vessel, d_table, t_mid)
    # Nemoto's second trim correction: dMCTC/dz from MCTC half a metre either side; within half a
    # metre of a table end the span stops at the end, so the slope is one-sided there (at the end
    # itself too: a centred span shrunk to nothing dropped the correction).
    lo, hi = max(t_lcf - 0.5, float(h.draft_m[0])), min(t_lcf + 0.5, float(h.draft_m[-1]))
    m_hi = interp(h.draft_m, h.mctc_tm_cm, hi, "draft (MCTC)", "m")
    m_lo = interp(h.draft_m, h.mctc_tm_cm, lo, "draft (MCTC)", "m")
    stc = 50.0 * trim**2 * (m_hi - m_lo) / (hi - lo) / lbp
    d_table += stc
    disp = d_table * water_density_t_m3 / p.table_density_t_m3

    hy = upright(vessel, disp, water_density_t_m3)
    if kg_fluid_m is not None:
        mct = trim_moment(vessel, hy, disp, kg_fluid_m)
        mctc, basis = mct.mctc_tm_cm, mct.basis
    else:
        mctc, basis = hy.mctc_tm_cm, "table"
    lcg = hy.lcb_m - trim * 100.0 * mctc / disp
    notes = []
    if abs(deflection) > DEFLECTION_NOTE_M:
        notes.append(f"{'hogged' if deflection > 0 else 'sagged'} {abs(deflection):.3f} m: the quarter-mean "
                     "draft allows for it only approximately")
    if basis == "table":
        notes.append("LCG from the tabulated MCTC (no KML or no KG given)")
    return ObservedCondition(
        list_deg=l_m, list_at_marks_deg=(l_a, l_m, l_f), draft_ap_m=t_ap, draft_fp_m=t_fp, draft_mid_m=t_mid,
        trim_m=trim, deflection_m=deflection, quarter_mean_m=t_q, draft_at_lcf_m=t_lcf, lcf_m=x_f,
        second_trim_correction_t=stc, table_displacement_t=d_table, displacement_t=disp, lcb_m=hy.lcb_m,
        mctc_tm_cm=mctc, mctc_basis=basis, lcg_m=lcg, notes=tuple(notes),
    )


def _refuse_twist(said: str, pairs: list[tuple[str, float, float]], lbp_m: float) -> None:
    """Refuse pairs of marks whose lists disagree beyond :func:`twist_bound`, naming the two that
    disagree most for their bound (a pair on the centreline, y = 0, gives no list and is left out)."""
    worst = None
    for i, (wa, la, ya) in enumerate(pairs):
        for wb, lb, yb in pairs[i + 1:]:
            diff = abs(math.tan(math.radians(la)) - math.tan(math.radians(lb)))
            bound = twist_bound(lbp_m, ya, yb)
            if diff > bound and (worst is None or diff / bound > worst[0]):
                worst = (diff / bound, wa, la, wb, lb, diff, bound)
    if worst is not None:
        _, wa, la, wb, lb, diff, bound = worst
        raise DraftMarksError(
            f"{said} give a list of {la:+.2f}° at the {wa} marks and {lb:+.2f}° at the {wb} marks: a hull "
            f"lists alike along her length, and |tan φ| differing by {diff:.3f} is more than the "
            f"{bound:.3f} that marks misread by LBP/100 = {MAX_DEFLECTION_FRACTION * lbp_m:.3f} m would give; "
            "a mark is misread")


def _refuse_list(said: str, pairs: list[tuple[str, float, float]], vessel: Vessel, table_displacement_t: float,
                 draft_mid_m: float) -> None:
    """Refuse a list beyond the deck-edge immersion angle: past it the waterplane loses the deck
    edge's side, the upright hydrostatic table no longer gives her displacement and the mean of
    port and starboard is no longer read on the wall side (module docstring, step 1).  The list is
    the one of the pair farthest off the centreline (the longest lever, the best read); the angle
    is :func:`deckload.core.verdict.deck_edge_angle`'s (the profile's deck-edge table, else
    wall-sided at midships)."""
    from deckload.core.verdict import deck_edge_angle

    if not pairs:
        return
    where, lst, _ = max(pairs, key=lambda p: p[2])
    edge, _ = deck_edge_angle(vessel, table_displacement_t, draft_mid_m)
    if abs(lst) > edge:
        raise DraftMarksError(
            f"{said} give a list of {lst:+.2f}° (at the {where} marks), beyond the deck-edge immersion angle of "
            f"{edge:.1f}°: the upright hydrostatic tables do not hold with the deck edge under water, so no "
            "displacement is worked from these readings; check the readings, or take them upright")


def _m(x: float) -> str:
    return f"{x:.3f}".rstrip("0").rstrip(".") if math.isfinite(x) else repr(x)


def _marks(vessel: Vessel) -> DraftMarks:
    if vessel.draft_marks is None:
        raise DraftMarksError("the vessel profile has no [draft_marks]: their positions are needed")
    return vessel.draft_marks

