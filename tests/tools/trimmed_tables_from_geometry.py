"""Hydrostatics and KN at several trims from a vessel's own hull geometry, as a booklet prints them.

Used by tests/test_trimmed_tables_demo.py (the Demo Islander's tables at trims, from her own
geometry file), and run by hand to write such tables as CSV files for a profile that names
``hull_geometry``::

    python tests/tools/trimmed_tables_from_geometry.py PROFILE OUT_DIR -1 -0.5 0.5 1 1.5

It prints the ``[[hydrostatics_at_trim]]`` / ``[[cross_curves_at_trim]]`` entries to add to the
profile (vessel_profiles/README.md, "Hydrostatics and KN at several trims").  The profile's
own even-keel tables stay as they are: they are the tables at trim 0.

Formulas (deckload/core/geometry/body.py and hydrostatics_calc.py, derived there): the hull
is cut by the plane z = T − (x − LBP/2)·t/LBP, T the mean draft at midships and t the trim
(+ by the stern), upright; ∇, LCB and KB from the immersed sections, the waterplane's area A,
centre LCF and inertias I_T (about its centre line) and I_L (about its LCF) from the chords;
KMt = KB + I_T/∇, KML = KB + I_L/∇, TPC = ρ·A/100, MCTC = ρ·I_L/(100·LBP) (with BML, as
booklets make it).  KN at a fixed trim t: the hull heeled to each angle at that trim, sunk to
each displacement (``solve_floating`` on the even-keel basis with tanψ fixed), KN = η_B.
The cosψ factors of the tilted waterplane are left out (1 − cosψ < 5·10⁻⁴ for t ≤ 1.2 m on 38 m).
"""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np

from deckload.core.geometry.body import Body, immerse
from deckload.core.geometry.cross_curves import solve_floating
from deckload.core.model import CrossCurves, HydrostaticTable, frozen_array


def hydrostatics_at_trim(body: Body, drafts_m, trim_m: float, density_t_m3: float, lbp_m: float) -> HydrostaticTable:
    """The hydrostatic table at mean drafts ``drafts_m`` (at midships) and trim ``trim_m``."""
    d = np.asarray(drafts_m, dtype=float)
    im = immerse(body, np.ones_like(d), np.zeros_like(d), d, trim_m / lbp_m, lbp_m / 2.0)
    vol, awp = im.volume_m3, im.wp_area_m2
    lcf = im.wp_x_m3 / awp
    ybar = im.wp_eta_m3 / awp
    it = im.wp_etaeta_m4 - awp * ybar**2
    il = im.wp_xx_m4 - awp * lcf**2
    kb = im.zeta_b_m
    return HydrostaticTable(
        draft_m=frozen_array(d), displacement_t=frozen_array(density_t_m3 * vol), lcb_m=frozen_array(im.x_b_m),
        lcf_m=frozen_array(lcf), kmt_m=frozen_array(kb + it / vol), tpc_t_cm=frozen_array(density_t_m3 * awp / 100.0),
        mctc_tm_cm=frozen_array(density_t_m3 * il / (100.0 * lbp_m)), vcb_m=frozen_array(kb),
        kml_m=frozen_array(kb + il / vol),
    )


def kn_at_trim(body: Body, displacement_t, heel_deg, trim_m: float, density_t_m3: float, lbp_m: float) -> CrossCurves:
    """KN (m) at each displacement and heel with the hull held at trim ``trim_m``."""
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


def _fmt(x: float) -> str:
    return f"{x:.6g}"


def main(argv: list[str]) -> int:
    from deckload.io.profiles import load_profile

    if len(argv) < 3:
        print(__doc__)
        return 2
    v = load_profile(argv[0])
    out = Path(argv[1])
    if v.hull is None:
        print(f"{argv[0]}: the profile names no hull_geometry", file=sys.stderr)
        return 1
    out.mkdir(parents=True, exist_ok=True)
    p, h, cc = v.particulars, v.hydrostatics, v.cross_curves
    cols = ("draft_m", "displacement_t", "lcb_m", "lcf_m", "kmt_m", "tpc_t_cm", "mctc_tm_cm", "vcb_m", "kml_m")
    entries = []
    for trim in (float(a) for a in argv[2:]):
        drafts = h.draft_m[(h.draft_m - abs(trim) / 2.0 > 0.0) & (h.draft_m + abs(trim) / 2.0 < p.depth_m)]
        ht = hydrostatics_at_trim(v.hull, drafts, trim, p.table_density_t_m3, p.lbp_m)
        kt = kn_at_trim(v.hull, cc.displacement_t, cc.heel_deg, trim, p.table_density_t_m3, p.lbp_m)
        hf, kf = out / f"hydrostatics_trim_{trim:+g}.csv", out / f"kn_trim_{trim:+g}.csv"
        hf.write_text(",".join(cols) + "\n" + "".join(
            ",".join(_fmt(float(getattr(ht, c)[i])) for c in cols) + "\n" for i in range(len(drafts))), encoding="utf-8")
        kf.write_text("displacement_t," + ",".join(f"kn_{a:g}" for a in cc.heel_deg) + "\n" + "".join(
            _fmt(float(d)) + "," + ",".join(_fmt(float(x)) for x in row) + "\n"
            for d, row in zip(kt.displacement_t, kt.kn_m)), encoding="utf-8")
        entries.append(("hydrostatics_at_trim", trim, hf))
        entries.append(("cross_curves_at_trim", trim, kf))
    for key in ("hydrostatics_at_trim", "cross_curves_at_trim"):
        for k, trim, f in entries:
            if k == key:
                print(f'[[{key}]]\ntrim_m = {trim!r}\ncsv = "{f}"\n')
    return 0


if __name__ == "__main__":
    raise SystemExit(main(sys.argv[1:]))
