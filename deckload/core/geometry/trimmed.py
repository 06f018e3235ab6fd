"""Hydrostatics and KN at several trims from the hull geometry, as a booklet prints them.

Used by ``deckload tables GEOMETRY --trims …`` (deckload/cli/tables.py) and by the tests'
generator (tests/tools/trimmed_tables_from_geometry.py).  The tables at trim 0 are the
even-keel tables; the others are written as ``[[hydrostatics_at_trim]]`` /
``[[cross_curves_at_trim]]`` (vessel_profiles/README.md, "Hydrostatics and KN at several trims").

Formulas (body.py and hydrostatics_calc.py, derived there): the hull is cut by the plane
z = T − (x − LBP/2)·t/LBP, T the mean draft at midships and t the trim (+ by the stern),
upright; ∇, LCB and KB from the immersed sections, the waterplane's area A, centre LCF and
inertias I_T (about its centre line) and I_L (about its LCF) from the chords;
KMt = KB + I_T/∇, KML = KB + I_L/∇, TPC = ρ·A/100, MCTC = ρ·I_L/(100·LBP) (with BML, as
booklets make it).  KN at a fixed trim t: the hull heeled to each angle at that trim, sunk to
each displacement (:func:`~deckload.core.geometry.cross_curves.solve_floating` with tanψ held),
KN = η_B.  The cosψ factors of the tilted waterplane are left out (1 − cosψ < 5·10⁻⁴ for
t ≤ 1.2 m on 38 m).  KN at trims are fixed-trim KN (``trim_basis = "even keel"``): the
table at trim 0 must be made the same way for the interpolation in trim to be consistent.

Rows of a hydrostatic table at trim t: only the drafts T of the even-keel grid with both ends'
waterline between keel and deck, 0 < T ± |t|/2 < depth (the ends lie at T ± t/2, derived).
"""

from __future__ import annotations

import numpy as np

from deckload.core.frozen import frozen
from deckload.core.geometry.body import Body, immerse
from deckload.core.geometry.cross_curves import solve_floating
from deckload.core.geometry.hydrostatics_calc import waterplane
from deckload.core.model import CrossCurves, HydrostaticTable, frozen_array

MIN_ROWS = 2
"""A table needs two rows to interpolate in (nothing is extrapolated)."""


class TrimTableError(ValueError):
    """A table at a trim cannot be made: the trim leaves too few drafts between keel and deck."""


def hydrostatics_at_trim(body: Body, drafts_m, trim_m: float, density_t_m3: float, lbp_m: float) -> HydrostaticTable:
    """The hydrostatic table at mean drafts ``drafts_m`` (at midships) and trim ``trim_m`` (module docstring)."""
    d = np.asarray(drafts_m, dtype=float)
    im = immerse(body, np.ones_like(d), np.zeros_like(d), d, trim_m / lbp_m, lbp_m / 2.0)
    vol, awp, lcf, it, il = waterplane(im)
    kb = im.zeta_b_m
    return HydrostaticTable(
        draft_m=frozen_array(d), displacement_t=frozen_array(density_t_m3 * vol), lcb_m=frozen_array(im.x_b_m),
        lcf_m=frozen_array(lcf), kmt_m=frozen_array(kb + it / vol), tpc_t_cm=frozen_array(density_t_m3 * awp / 100.0),
        mctc_tm_cm=frozen_array(density_t_m3 * il / (100.0 * lbp_m)), vcb_m=frozen_array(kb),
        kml_m=frozen_array(kb + il / vol),
    )


def kn_at_trim(body: Body, displacement_t, heel_deg, trim_m: float, density_t_m3: float, lbp_m: float) -> CrossCurves:
    """KN (m) at each displacement and heel with the hull held at trim ``trim_m`` (fixed trim)."""
    disp = np.asarray(displacement_t, dtype=float)
    heel = np.asarray(heel_deg, dtype=float)
    vol = np.broadcast_to((disp / density_t_m3)[:, None], (len(disp), len(heel)))
    th = np.broadcast_to(np.radians(heel)[None, :], vol.shape)
    t = np.full(vol.shape, trim_m / lbp_m)
    c, t, _ = solve_floating(body, vol, th, "even keel", 0.0, 0.0, lbp_m / 2.0, t_start=t)
    ct = np.where(np.abs(np.cos(th)) < 1e-15, 0.0, np.cos(th))
    im = immerse(body, ct, np.sin(th), c, t, lbp_m / 2.0)
    return CrossCurves(heel_deg=frozen_array(heel), displacement_t=frozen_array(disp), kn_m=frozen_array(im.eta_b_m),
                       trim_basis="even keel")


def drafts_for_trim(drafts_m, trim_m: float, depth_m: float) -> np.ndarray:
    """The drafts of ``drafts_m`` with both ends' waterline between keel and deck at trim ``trim_m``."""
    d = np.asarray(drafts_m, dtype=float)
    return d[(d - abs(trim_m) / 2.0 > 0.0) & (d + abs(trim_m) / 2.0 < depth_m)]


@frozen
class TableAtTrim:
    """Hydrostatics and KN at one trim."""

    trim_m: float
    hydrostatics: HydrostaticTable
    cross_curves: CrossCurves


def tables_at_trims(body: Body, drafts_m, kn_displacement_t, kn_heel_deg, trims_m, density_t_m3: float,
                    lbp_m: float, depth_m: float) -> tuple[TableAtTrim, ...]:
    """Hydrostatics (on the drafts of :func:`drafts_for_trim`) and KN (on the even-keel KN grid)
    at each trim.  Raises :class:`TrimTableError` when a trim leaves fewer than two drafts."""
    out = []
    for trim in (float(x) for x in trims_m):
        drafts = drafts_for_trim(drafts_m, trim, depth_m)
        if len(drafts) < MIN_ROWS:
            raise TrimTableError(
                f"trim {trim:+g} m leaves {len(drafts)} of the table's drafts with both ends' waterline between "
                f"keel and deck (draft ± {abs(trim) / 2:g} m within 0…{depth_m:g} m); at least {MIN_ROWS} are needed")
        out.append(TableAtTrim(trim, hydrostatics_at_trim(body, drafts, trim, density_t_m3, lbp_m),
                               kn_at_trim(body, kn_displacement_t, kn_heel_deg, trim, density_t_m3, lbp_m)))
    return tuple(out)
