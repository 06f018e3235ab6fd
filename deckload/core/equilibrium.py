"""Direct calculation from the hull: equilibrium free in trim and heel, drafts, and GZ for the actual G.

A second method beside the tables, for profiles that carry the hull geometry
(``hull_geometry``).  Nothing here is read from the hydrostatic or cross-curve tables:

1. The hull displaces ∇ = Δ/ρ_water.  At each heel θ of a grid (0–90° in
   :data:`HEEL_STEP_DEG` steps) the level and the trim are solved together so that the
   volume is ∇ and B lies on one vertical with the actual G: R = (x_B − LCG) −
   tanψ·(ζ_B − ζ_G) = 0, ζ_G = KG·cosθ (free trim for the actual LCG; the solver of
   :mod:`deckload.core.geometry.cross_curves`, whose derivation is there).  G's offset
   from the centreline enters this balance only through tanψ·TCG·sinθ, a fraction of a
   millimetre, and is left out of it.
2. KN(θ) = η_B at that equilibrium; KN on the engine's 0.1° grid by the natural cubic
   spline in heel that the table method uses (:mod:`deckload.core.gz`); GZ = KN −
   KG_fluid·sinφ − TCG·cosφ to starboard and KN − KG_fluid·sinφ + TCG·cosφ to port (the
   hull is symmetric: heeled to port it is the mirror image).
3. The list is where GZ on the low side rises through zero (as in the table method);
   at that heel the equilibrium is solved once more and the drafts are read on the
   centreline from the plane itself: T(x) = (c₀ − (x − x_ref)·tanψ)/cosθ — no small-angle
   assumption in trim or list.  Trim = T_AP − T_FP.
4. KMt at the upright, trimmed equilibrium: KB + I_T/∇, I_T the waterplane's transverse
   second moment about its centroid; GM fluid = KMt − KG fluid.

:func:`compare` judges each row against the stability-instrument tolerance of its quantity
(IACS UR L5 / MSC.1/Circ.1229, standards.md §5.3; the rows of :mod:`deckload.core.booklet`),
the tables' value as the base value (standards.md §5.2: the approved stability information).
"""

from __future__ import annotations

import math

import numpy as np

from deckload.core import booklet
from deckload.core import gz as gzmod
from deckload.core.frozen import frozen
from deckload.core.geometry.body import Body, immerse
from deckload.core.geometry.cross_curves import NoEquilibriumError, solve_floating
from deckload.core.tables import CubicSpline, OutOfRangeError
from deckload.core.trimmed_tables import kn_for

HEEL_STEP_DEG = 5.0
"""Heel grid of the direct calculation (deg), the step of the demo's cross curves: between grid
points GZ carries the same spline error as the table method (largest beside a sharp deck-edge
kink such as a box's), at them none."""

HEELS_DEG = np.round(np.arange(0.0, 90.0 + HEEL_STEP_DEG / 2, HEEL_STEP_DEG), 10)


class DirectError(ValueError):
    """The hull cannot float as asked (more displacement than the hull holds, no equilibrium)."""


@frozen
class DirectState:
    """Equilibrium and GZ by integrating the hull; same units and signs as the Result."""

    displacement_t: float
    draft_aft_m: float
    """At the AP, on the centreline, moulded (m)."""
    draft_fwd_m: float
    draft_mid_m: float
    trim_m: float
    """T_AP − T_FP (m), + by the stern."""
    list_deg: float
    """+ starboard; ±90 when GZ on the whole hull is negative to 90° (she lies on her side at
    least; the drafts are worked at 89°)."""
    kmt_m: float
    gm_fluid_m: float
    heel_deg: np.ndarray
    """The grid the hull was solved at (deg)."""
    kn_m: np.ndarray
    """KN at free trim for the actual LCG, on that grid (m)."""
    trim_grid_rad: np.ndarray
    """Trim angle ψ at each grid heel (rad, + by the stern)."""
    gz_stbd_m: np.ndarray
    """GZ on the engine's 0.1° grid, heeling to starboard (m)."""
    gz_port_m: np.ndarray
    """GZ heeling to port (m), the same grid."""


def hull_capacity_m3(body: Body) -> float:
    """Volume of the whole closed hull (to its highest deck point): the most it can displace."""
    return float(immerse(body, 1.0, 0.0, body.z_max_m).volume_m3)


def direct_state(body: Body, lbp_m: float, displacement_t: float, water_density_t_m3: float,
                 lcg_m: float, kg_fluid_m: float, tcg_m: float) -> DirectState:
    """Equilibrium and the GZ curve of the hull itself (module docstring)."""
    vol = displacement_t / water_density_t_m3
    if not (math.isfinite(vol) and vol > 0.0):
        raise DirectError(f"displacement {displacement_t!r} t cannot float")
    cap = hull_capacity_m3(body)
    if vol >= cap:
        raise OutOfRangeError("displacement (hull geometry, volume)", vol, 0.0, cap, "m³")
    th = np.radians(HEELS_DEG)
    try:
        c, t, _ = solve_floating(body, np.full(th.shape, vol), th, "free trim", lcg_m, kg_fluid_m, lcg_m)
    except NoEquilibriumError as e:
        raise DirectError(str(e)) from None
    ct = np.where(np.abs(np.cos(th)) < 1e-15, 0.0, np.cos(th))
    im = immerse(body, ct, np.sin(th), c, t, lcg_m)
    kn = im.eta_b_m
    kn_fine = CubicSpline.fit(HEELS_DEG, kn)(gzmod.FINE_DEG)
    base = kn_fine - kg_fluid_m * gzmod.SIN
    gz_stbd = base - tcg_m * gzmod.COS
    gz_port = base + tcg_m * gzmod.COS
    side_curve = gz_port if tcg_m < 0 else gz_stbd
    eq = gzmod.facts(side_curve).equilibrium_deg
    if eq is None:  # GZ negative to 90° on the whole hull: she lies on her side at least
        eq = 90.0
    heel = eq if tcg_m >= 0 else -eq

    # drafts at the list, from the plane itself (the hull is symmetric: the port list mirrors)
    th_l = math.radians(min(abs(heel), 89.0))
    c_l, t_l, _ = solve_floating(body, np.array([vol]), np.array([th_l]), "free trim", lcg_m, kg_fluid_m, lcg_m,
                                 c_start=np.interp([th_l], th, c), t_start=np.interp([th_l], th, t))
    cos_l = math.cos(th_l)

    def draft(x: float) -> float:
        return float((c_l[0] - (x - lcg_m) * t_l[0]) / cos_l)

    t_ap, t_fp = draft(0.0), draft(lbp_m)
    # upright metacentre at the upright free-trim equilibrium (grid heel 0)
    up = immerse(body, 1.0, 0.0, c[0], t[0], lcg_m)
    a = float(up.wp_area_m2)
    ybar = float(up.wp_eta_m3) / a if a > 0 else 0.0
    i_t = float(up.wp_etaeta_m4) - a * ybar**2
    kmt = float(up.zeta_b_m) + i_t / vol
    return DirectState(
        displacement_t=displacement_t, draft_aft_m=t_ap, draft_fwd_m=t_fp, draft_mid_m=draft(lbp_m / 2.0),
        trim_m=t_ap - t_fp, list_deg=heel, kmt_m=kmt, gm_fluid_m=kmt - kg_fluid_m, heel_deg=HEELS_DEG.copy(),
        kn_m=kn, trim_grid_rad=np.arctan(t), gz_stbd_m=gz_stbd, gz_port_m=gz_port,
    )


MAX_GZ_ANGLE_NOTE = ("not an independent check: both angles are read off a natural cubic spline in heel "
                      "through KN points (the hull's every 5°, the tables' at their own heels): the hull checks "
                      "KN at those points, not where the spline puts the maximum between them; "
                      "standards.md §5.3 has no row for it")
"""The note of the angle-of-maximum-GZ row: the direct curve between its grid points is the same
natural spline as the tables' (:data:`HEEL_STEP_DEG`, :func:`deckload.core.gz.heel_curve`), and its
maximum is found by the same :func:`deckload.core.gz.facts`; on the box barge both read 28.8° where the
exact maximum is at 29.18° (checks.md §1.2)."""


@frozen
class DirectRow:
    """One quantity by both methods, judged against its UR L5 / Circ.1229 tolerance."""

    quantity: str
    unit: str
    tables: float
    """The tables' value: the base value of the deviation (standards.md §5.2)."""
    direct: float
    allowed: float | None
    """Largest accepted |direct − tables| (same unit); None where standards.md §5.3 has no row for
    the quantity (it is then not judged)."""
    tolerance: str
    """The rule in words with its table row, e.g. '1 % / 0.05 m max (GMt)'."""
    within_tolerance: bool | None
    """None when not judged (no tolerance)."""
    note: str = ""

    @property
    def difference(self) -> float:
        """direct − tables."""
        return self.direct - self.tables


@frozen
class Comparison:
    """The table method's result and the direct calculation side by side."""

    direct: DirectState
    rows: tuple[DirectRow, ...]
    gz_direct_m: tuple[float, ...]
    """Direct GZ at whole degrees 0–90 on the side the criteria are checked (m)."""

    @property
    def beyond(self) -> tuple[DirectRow, ...]:
        """The rows whose difference exceeds their tolerance."""
        return tuple(r for r in self.rows if r.within_tolerance is False)

    @property
    def judged(self) -> int:
        return sum(r.within_tolerance is not None for r in self.rows)

    @property
    def source(self) -> str:
        return booklet.SOURCE

    def summary(self) -> str:
        """One sentence for every view: how many rows are beyond tolerance and what that means."""
        n = len(self.beyond)
        if n == 0:
            return (f"All {self.judged} rows judged are within the stability-instrument tolerances of {booklet.SOURCE}: "
                    "the tables and the hull geometry agree.")
        return (f"{n} of {self.judged} rows beyond the stability-instrument tolerances of {booklet.SOURCE}: "
                "the profile's tables and its hull geometry disagree with each other. One or both are wrong, "
                "or the condition is one the tables were not made for (their trim, the LCG of free-trim cross "
                "curves): check both against the approved booklet before relying on the verdict, which is read "
                "off the tables.")


def _judged(quantity: str, unit: str, tables: float, direct: float, allowed: float, words: str,
            note: str = "") -> DirectRow:
    return DirectRow(quantity, unit, float(tables), float(direct), float(allowed), words,
                     booklet.within(float(direct), float(tables), allowed), note)


def _by_row(quantity: str, unit: str, tables: float, direct: float, tol: booklet.Tolerance,
            breadth_m: float) -> DirectRow:
    """A row judged by its tolerance of standards.md §5.3, the tables' value as base."""
    return _judged(quantity, unit, tables, direct, tol.allowed(float(tables), breadth_m),
                   f"{tol.text(unit)} ({tol.row})")


def compare(vessel, result) -> Comparison:
    """Direct calculation for a computed :class:`~deckload.core.result.Result`, beside it.

    Same displacement, water, LCG, KG fluid and TCG.  The direct KN replace the tables' KN
    and nothing else: the free-surface treatment of the result (constant or actual transfer)
    is carried over as the difference between its GZ and KN − KG fluid·sinφ − TCG·cosφ, so the
    two curves differ only by what the tables and the hull say about the immersed volume.

    Each row is judged against its tolerance of standards.md §5.3 (UR L5 / Circ.1229) with the
    tables' value as base: draughts 1 % / 5 cm, trim the sum of the aft and forward draughts'
    (derived: the table has no trim row), list 1° (equilibrium angles), KMt and GM 1 % / 5 cm,
    GZ and its maximum 5 % / 5 cm, areas 5 % / 0.0012 m·rad.  The angle of maximum GZ has no row
    there and is not judged (:data:`MAX_GZ_ANGLE_NOTE`).
    """
    if vessel.hull is None:
        raise DirectError("the profile names no hull_geometry (or its file is not there): "
                          "the direct calculation needs the hull")
    d = direct_state(vessel.hull, vessel.particulars.lbp_m, result.displacement_t, result.water_density_t_m3,
                     result.lcg_m, result.kg_fluid_m, result.tcg_m)
    breadth = vessel.particulars.breadth_m
    rho_ratio = result.water_density_t_m3 / vessel.particulars.table_density_t_m3
    d_eq = result.displacement_t / rho_ratio
    # the KN the result was worked with: at its trim where the profile has tables at several trims
    kn_table = kn_for(vessel, d_eq, result.trim_m)
    if len(kn_table) < len(gzmod.FINE_DEG):
        # the rows and the carried-over correction are worked at whole degrees to 90° (GZ to 60°)
        raise DirectError(f"the KN tables stop at {float(gzmod.FINE_DEG[len(kn_table) - 1]):g}° of heel: "
                          "the side-by-side comparison with the hull needs them to 90°")
    whole = gzmod.WHOLE_DEGREES
    port = result.criteria_side == "port"
    gz_table_whole = np.array(result.gz_port_m if port else result.gz_m)
    sign = 1.0 if port else -1.0
    plain_whole = (kn_table - result.kg_fluid_m * gzmod.SIN + sign * result.tcg_m * gzmod.COS)[whole]
    # the result's free-surface treatment, beyond the constant KG fluid (zero for 'constant')
    extra = np.interp(gzmod.FINE_DEG, gzmod.FINE_DEG[whole], gz_table_whole - plain_whole)
    gz_direct = (d.gz_port_m if port else d.gz_stbd_m) + extra
    f = gzmod.facts(gz_direct)
    flood = result.downflooding_angle_deg
    top = min(40.0, flood) if flood is not None else 40.0
    a30 = gzmod.area_to(gz_direct, 30.0)
    a40 = gzmod.area_to(gz_direct, top)
    eq = f.equilibrium_deg
    rows = [
        _by_row("Draft aft", "m", result.draft_aft_m, d.draft_aft_m, booklet.DRAUGHT, breadth),
        _by_row("Draft forward", "m", result.draft_fwd_m, d.draft_fwd_m, booklet.DRAUGHT, breadth),
        _by_row("Draft midships", "m", result.draft_mean_m, d.draft_mid_m, booklet.DRAUGHT, breadth),
        _judged("Trim (+ by the stern)", "m", result.trim_m, d.trim_m,
                booklet.trim_allowed(result.draft_aft_m, result.draft_fwd_m, breadth), booklet.TRIM_WORDS),
    ]
    if result.list_deg is not None and eq is not None:  # (no list to compare where GZ is never positive)
        rows.append(_by_row("List (+ starboard)", "deg", result.list_deg, eq if not port else -eq,
                            booklet.EQUILIBRIUM_ANGLE, breadth))
    rows += [
        _by_row("KMt", "m", result.km_m, d.kmt_m, booklet.KMT, breadth),
        _by_row("GM fluid", "m", result.gm_fluid_m, d.gm_fluid_m, booklet.GMT, breadth),
    ]
    for deg in (10, 20, 30, 40, 50, 60):
        rows.append(_by_row(f"GZ at {deg}°", "m", float(gz_table_whole[deg]), float(gz_direct[deg * 10]),
                            booklet.GZ, breadth))
    rows += [
        _by_row("Max GZ", "m", result.max_gz_m, f.max_gz_m, booklet.GZ, breadth),
        DirectRow("Angle of max GZ", "deg", float(result.max_gz_angle_deg), float(f.max_gz_angle_deg), None,
                  "none in standards.md §5.3", None, MAX_GZ_ANGLE_NOTE),
        _by_row("Area 0–30°", "m·rad", result.area_0_30_mrad, a30, booklet.AREA, breadth),
        _by_row(f"Area 0–{top:.1f}°", "m·rad", result.area_0_40_mrad, a40, booklet.AREA, breadth),
        _by_row(f"Area 30–{top:.1f}°", "m·rad", result.area_30_40_mrad, a40 - a30 if top > 30.0 else 0.0,
                booklet.AREA, breadth),
    ]
    return Comparison(d, tuple(rows), tuple(float(x) for x in gz_direct[whole]))
