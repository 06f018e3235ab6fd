"""Benchmark, run by hand: ``python -m tests.benchmarks.bench_tables [--full]``.

Computes every table of the demo vessel (41 stations, i.e. 40 intervals:
hydrostatics at its 30 drafts, KN at 15 displacements 250–950 t × 19 heels with free
trim, and every tank's calibration, fluid transfer and worst band) with deckload's vectorised section clipping, and
the same quantities with an independent reference — trimesh slicing a closed
triangle mesh of the same offsets — in the same run, then prints both times, their
ratio, and how far the two results lie apart (the accuracy the ratio is bought at).

The reference's tank fluid-transfer tables are slow (one mesh slice per trial
level): by default they are computed for three tanks and the time is scaled to
all tanks (printed as such); ``--full`` computes them for every tank.

trimesh (with shapely, networkx and mapbox-earcut) is a test dependency only;
this module imports it lazily, and the tests reuse its mesh builder and reference
functions (``tests/test_geometry_trimesh.py``).
"""

from __future__ import annotations

import argparse
import math
import sys
import time
from pathlib import Path

import numpy as np

from deckload.core.geometry.spec import CompartmentShape, Geometry, HullOffsets

GEOMETRY = Path(__file__).resolve().parents[2] / "vessel_profiles" / "demo_islander.geometry.toml"


# --------------------------------------------------------------------------- meshes


def hull_mesh(hull: HullOffsets, subdivide: int = 4):
    """A closed, consistently wound triangle mesh of the offsets' hull, closed by the deck.

    Each station contributes the points (x, ±half-breadth, z) at every waterline
    (points above the deck are pulled down onto the deck edge) and the deck edge;
    neighbouring stations are joined by triangle strips.  The offsets vary linearly
    between stations, so each strip between two waterlines is a bilinear (twisted)
    surface; ``subdivide`` intermediate sections per station interval (offsets
    interpolated linearly, as deckload's model defines them) make the flat triangles
    follow it closely.  The port side is the exact mirror of the starboard side, so
    faces that collapse onto the centre plane (where the hull does not reach a
    waterline) cancel cleanly and are dropped, as checks.md §6 advises.
    """
    import trimesh

    xs0, zw, hb0, dk0 = hull.station_x_m, hull.waterline_z_m, hull.half_breadth_m, hull.deck_z_m
    f = np.linspace(0.0, 1.0, subdivide + 1)[:-1]
    xs = np.concatenate([xs0[i] + f * (xs0[i + 1] - xs0[i]) for i in range(len(xs0) - 1)] + [xs0[-1:]])
    hb = np.concatenate([hb0[i] + f[:, None] * (hb0[i + 1] - hb0[i]) for i in range(len(xs0) - 1)] + [hb0[-1:]])
    dk = np.interp(xs, xs0, dk0)
    pts = []
    for i, x in enumerate(xs):
        zc = np.minimum(zw, dk[i])
        yc = np.interp(zc, zw, hb[i])
        zc = np.append(zc, dk[i])
        yc = np.append(yc, np.interp(dk[i], zw, hb[i]))
        pts.append(np.c_[np.full(len(zc), x), yc, zc])
    k = len(pts[0])
    stb = np.vstack(pts)
    verts = np.vstack([stb, stb * np.array([1.0, -1.0, 1.0])])
    n = len(stb)
    faces = []
    s = len(xs)
    for i in range(s - 1):
        for j in range(k - 1):
            a0, a1, b0, b1 = i * k + j, i * k + j + 1, (i + 1) * k + j, (i + 1) * k + j + 1
            for t in ([a0, a1, b1], [a0, b1, b0]):
                faces.append(t)
                faces.append([t[0] + n, t[2] + n, t[1] + n])
        a, b = i * k + k - 1, (i + 1) * k + k - 1
        faces += [[a, a + n, b + n], [a, b + n, b]]  # deck
        a, b = i * k, (i + 1) * k
        faces += [[a, b + n, a + n], [a, b, b + n]]  # bottom
    extra = []
    for i, first in ((0, True), (s - 1, False)):
        # the end section, without the part of the centre line where the hull has no breadth
        # (those edges are already shared by the port and starboard strips)
        nz = np.flatnonzero(pts[i][:, 1] > 0.0)
        if len(nz) == 0:
            continue
        j0 = max(int(nz[0]) - 1, 0)
        ring = [i * k + j for j in range(j0, k)] + [i * k + j + n for j in range(k - 1, j0 - 1, -1)]
        if j0 == 0:
            pass
        else:
            ring = ring[:-1]  # the starboard and port points at the lowest level coincide
        c = len(verts) + len(extra)
        extra.append([xs[i], 0.0, float(pts[i][j0:, 2].mean())])
        for q in range(len(ring)):
            p1, p2 = ring[q], ring[(q + 1) % len(ring)]
            faces.append([c, p2, p1] if first else [c, p1, p2])
    verts = np.vstack([verts, np.array(extra)])
    m = trimesh.Trimesh(verts, np.array(faces), process=True)
    m.update_faces(m.nondegenerate_faces())
    on_centre = np.all(np.abs(m.vertices[m.faces][:, :, 1]) < 1e-12, axis=1)
    m.update_faces(~on_centre)
    m.remove_unreferenced_vertices()
    return m


def compartment_mesh(shape: CompartmentShape, hull_m):
    """Mesh of a tank or hold: a box, an extruded prism, or the hull mesh cut by six planes."""
    import shapely.geometry
    import trimesh

    if shape.shape == "box":
        ext = [shape.x_to_m - shape.x_from_m, shape.y_to_m - shape.y_from_m, shape.z_to_m - shape.z_from_m]
        centre = [(shape.x_from_m + shape.x_to_m) / 2, (shape.y_from_m + shape.y_to_m) / 2,
                  (shape.z_from_m + shape.z_to_m) / 2]
        return trimesh.creation.box(extents=ext, transform=trimesh.transformations.translation_matrix(centre))
    if shape.shape == "prism":
        poly = shapely.geometry.Polygon(np.c_[shape.section_y_m, shape.section_z_m])
        m = trimesh.creation.extrude_polygon(poly, shape.x_to_m - shape.x_from_m)
        # extruded along z with the polygon in (x, y): map (u, v, w) → (x = w + x_from, y = u, z = v)
        tf = np.array([[0, 0, 1, shape.x_from_m], [1, 0, 0, 0], [0, 1, 0, 0], [0, 0, 0, 1]], dtype=float)
        m.apply_transform(tf)
        return m
    m = hull_m.copy()
    for origin, normal in (
        ([shape.x_from_m, 0, 0], [1, 0, 0]), ([shape.x_to_m, 0, 0], [-1, 0, 0]),
        ([0, shape.y_from_m, 0], [0, 1, 0]), ([0, shape.y_to_m, 0], [0, -1, 0]),
        ([0, 0, shape.z_from_m], [0, 0, 1]), ([0, 0, shape.z_to_m], [0, 0, -1]),
    ):
        m = m.slice_plane(origin, normal, cap=True)
    return m


# --------------------------------------------------------------------------- reference computations


def _solve(f, lo: float, hi: float, tol: float = 1e-9, max_iter: int = 100) -> float:
    """Root of an increasing function on [lo, hi]: the Illinois variant of regula falsi
    (Dowell & Jarratt 1971) — no scipy."""
    flo, fhi = f(lo), f(hi)
    if flo > 0 or fhi < 0:
        raise ValueError("root not bracketed")
    side = 0
    x = lo
    for _ in range(max_iter):
        x = (lo * fhi - hi * flo) / (fhi - flo) if fhi != flo else 0.5 * (lo + hi)
        fx = f(x)
        if abs(fx) <= tol or hi - lo <= tol:
            return x
        if fx < 0:
            lo, flo = x, fx
            if side == -1:
                fhi /= 2
            side = -1
        else:
            hi, fhi = x, fx
            if side == 1:
                flo /= 2
            side = 1
    return x


def below(mesh, normal, level: float) -> tuple[float, np.ndarray | None]:
    """Volume and centroid of the part of a closed mesh with normal·p ≤ level.

    trimesh slices the mesh (without a cap); the volume is then the sum of the signed
    tetrahedra from a point of the cutting plane to each remaining face (divergence
    theorem), to which the missing cap adds nothing because it lies in that plane.
    This avoids triangulating caps that fall apart into several polygons.
    """
    n = np.asarray(normal, dtype=float)
    n = n / np.linalg.norm(n)
    origin = n * level
    s = mesh.slice_plane(origin, -n, cap=False)
    if s is None or len(s.faces) == 0:
        return 0.0, None
    tri = s.triangles - origin
    v6 = np.einsum("ij,ij->i", tri[:, 0], np.cross(tri[:, 1], tri[:, 2]))
    vol = float(v6.sum()) / 6.0
    if vol <= 0.0:
        return 0.0, None
    cm = (tri.sum(axis=1) / 4.0 * v6[:, None]).sum(axis=0) / v6.sum() + origin
    return vol, cm


def volume_below(mesh, normal, level: float) -> float:
    return below(mesh, normal, level)[0]


def waterplane_moments(mesh, z: float) -> tuple[float, float, float, float, float]:
    """Area, centroid (x, y) and second moments about the centroid (I_T about a fore-and-aft
    axis, I_L about a transverse axis) of the horizontal section z = const (shoelace sums)."""
    sec = mesh.section(plane_origin=[0, 0, z], plane_normal=[0, 0, 1])
    a = sx = sy = ixx = iyy = 0.0
    if sec is None:
        return 0.0, 0.0, 0.0, 0.0, 0.0
    # each closed loop of the section (the waterplane has no holes), taken counter-clockwise
    for loop in sec.discrete:
        c = np.asarray(loop)[:, :2]
        if not np.allclose(c[0], c[-1]):
            c = np.vstack([c, c[:1]])
        x0, y0 = c[:-1, 0], c[:-1, 1]
        x1, y1 = c[1:, 0], c[1:, 1]
        cr = x0 * y1 - x1 * y0
        if np.sum(cr) < 0:
            cr = -cr
        a += cr.sum() / 2
        sx += (cr * (x0 + x1)).sum() / 6
        sy += (cr * (y0 + y1)).sum() / 6
        ixx += (cr * (y0 * y0 + y0 * y1 + y1 * y1)).sum() / 12  # ∬ y² dA
        iyy += (cr * (x0 * x0 + x0 * x1 + x1 * x1)).sum() / 12  # ∬ x² dA
    if a <= 0.0:
        return 0.0, 0.0, 0.0, 0.0, 0.0
    xc, yc = sx / a, sy / a
    return a, xc, yc, ixx - a * yc**2, iyy - a * xc**2


def ref_hydrostatics(mesh, draft_m: float, rho: float, lbp_m: float) -> dict[str, float]:
    vol, cm = below(mesh, [0, 0, 1], draft_m)
    a, xf, _, it, il = waterplane_moments(mesh, draft_m)
    return {
        "displacement_t": rho * vol, "lcb_m": float(cm[0]), "vcb_m": float(cm[2]), "lcf_m": xf,
        "kmt_m": float(cm[2]) + it / vol, "kml_m": float(cm[2]) + il / vol, "tpc_t_cm": rho * a / 100,
        "mctc_tm_cm": rho * il / (100 * lbp_m),
    }


def heeled(mesh, heel_deg: float):
    """The mesh in the heeled frame: (x, η, ζ) = (x, y·cosθ + z·sinθ, −y·sinθ + z·cosθ) (checks.md §6)."""
    import trimesh

    m = mesh.copy()
    m.apply_transform(trimesh.transformations.rotation_matrix(-math.radians(heel_deg), [1, 0, 0]))
    return m


def ref_kn(mesh, volume_m3: float, heel_deg: float, trim_basis: str = "even keel",
           lcg_m: float = 0.0, vcg_m: float = 0.0) -> tuple[float, float]:
    """KN (and tan ψ) by slicing: the volume found by regula falsi on the level; with free
    trim an outer regula falsi on tan ψ makes (x_B − x_G) − tanψ·(ζ_B − ζ_G) vanish."""
    m = heeled(mesh, heel_deg)
    zeta_g = vcg_m * math.cos(math.radians(heel_deg))

    def state(t: float):
        n = np.array([t, 0.0, 1.0])
        lev = m.vertices @ n / np.linalg.norm(n)
        level = _solve(lambda c: volume_below(m, n, c) - volume_m3, float(lev.min()), float(lev.max()),
                       tol=1e-9 * volume_m3)
        return below(m, n, level)[1]

    if trim_basis == "even keel":
        return float(state(0.0)[1]), 0.0

    def resid(t: float) -> float:
        cm = state(t)
        return -((cm[0] - lcg_m) - t * (cm[2] - zeta_g))  # increasing in t

    t = _solve(resid, -0.05, 0.05, tol=1e-8)
    return float(state(t)[1]), t


def ref_tank(mesh, fills_pct, heels_deg, soundings_m):
    """Reference calibration (volume, VCG, fsi) and transfer moments of one tank mesh."""
    z0 = float(mesh.bounds[0, 2])
    cal = []
    for s in soundings_m:
        lvl = min(z0 + s, float(mesh.bounds[1, 2]) - 1e-7)
        v, cm = below(mesh, [0, 0, 1], lvl) if s > 0 else (0.0, None)
        vcg = z0 if cm is None else float(cm[2])
        _, _, _, it, _ = waterplane_moments(mesh, max(lvl, z0 + 1e-7))
        cal.append((v, vcg, it))
    full = float(mesh.volume)
    up_cm = {}
    mom = np.zeros((len(fills_pct), len(heels_deg)))
    for k, h in enumerate(heels_deg):
        m = heeled(mesh, h)
        lev = m.vertices[:, 2]
        for j, f in enumerate(fills_pct):
            v = f / 100 * full
            if v <= 0 or f >= 100:
                continue
            c = _solve(lambda c: volume_below(m, [0, 0, 1], c) - v, float(lev.min()), float(lev.max()), tol=1e-9 * full)
            cm = below(m, [0, 0, 1], c)[1]
            if h == 0:
                up_cm[f] = cm
            y0, z0c = up_cm[f][1], up_cm[f][2]
            th = math.radians(h)
            mom[j, k] = v * (cm[1] - (y0 * math.cos(th) + z0c * math.sin(th)))
    return np.array(cal), mom


# --------------------------------------------------------------------------- benchmark


def _bench_ours(g: Geometry, drafts, disp, heels):
    from deckload.core.geometry.builder import hull_body, tank_tables
    from deckload.core.geometry.cross_curves import cross_curves
    from deckload.core.geometry.hydrostatics_calc import upright_hydrostatics

    t0 = time.perf_counter()
    body = hull_body(g)
    hyd = upright_hydrostatics(body, drafts, g.vessel.table_density_t_m3, g.vessel.lbp_m, g.vessel.breadth_m)
    t1 = time.perf_counter()
    cc = cross_curves(body, disp, heels, g.vessel.table_density_t_m3, g.tables.trim_basis,
                      g.tables.trim_lcg_m, g.tables.trim_vcg_m)
    t2 = time.perf_counter()
    tanks = [tank_tables(s, g, heels) for s in g.tanks]
    t3 = time.perf_counter()
    return hyd, cc, tanks, (t1 - t0, t2 - t1, t3 - t2)


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(prog="python -m tests.benchmarks.bench_tables", description=__doc__.split("\n\n")[0])
    ap.add_argument("--full", action="store_true", help="reference transfer tables for every tank")
    ap.add_argument("--geometry", type=Path, default=GEOMETRY)
    args = ap.parse_args(argv)
    from deckload.io.geometry_files import load_geometry

    g = load_geometry(args.geometry)
    rho = g.vessel.table_density_t_m3
    drafts = g.tables.draft_m  # the demo's 30 drafts, 1.0–3.9 m
    disp = np.linspace(250.0, 950.0, 15)
    heels = np.arange(0.0, 91.0, 5.0)
    print(f"deckload table builder benchmark — {len(g.hull.station_x_m)} stations, {len(drafts)} drafts, "
          f"KN {len(disp)} displacements × {len(heels)} heels ({g.tables.trim_basis}), {len(g.tanks)} tanks")
    ours_runs = [_bench_ours(g, drafts, disp, heels) for _ in range(3)]
    hyd, cc, tanks, _ = ours_runs[-1]
    ours_t = np.median(np.array([r[3] for r in ours_runs]), axis=0)

    print("reference (trimesh slicing) running; this takes a few minutes …", file=sys.stderr, flush=True)
    t0 = time.perf_counter()
    mesh = hull_mesh(g.hull)
    ref_h = [ref_hydrostatics(mesh, d, rho, g.vessel.lbp_m) for d in drafts]
    t1 = time.perf_counter()
    ref_kn_m = np.zeros((len(disp), len(heels)))
    for i, dsp in enumerate(disp):
        for j, h in enumerate(heels):
            ref_kn_m[i, j], _ = ref_kn(mesh, dsp / rho, h, g.tables.trim_basis, g.tables.trim_lcg_m, g.tables.trim_vcg_m)
        print(f"  KN row {i + 1}/{len(disp)} ({time.perf_counter() - t1:.0f} s)", file=sys.stderr, flush=True)
    t2 = time.perf_counter()
    fill_grid = np.linspace(0.0, 100.0, 21)
    n_tr = len(g.tanks) if args.full else 3
    tank_err_v = tank_err_fsi = tank_err_m = 0.0
    t_cal = t_tr = 0.0
    for k, (spec, ours) in enumerate(zip(g.tanks, tanks)):
        ta = time.perf_counter()
        tm = compartment_mesh(spec.shape, mesh)
        cal, _ = ref_tank(tm, [], [], ours.calibration.sounding_m)
        tb = time.perf_counter()
        t_cal += tb - ta
        v = ours.calibration.volume_m3
        tank_err_v = max(tank_err_v, float(np.max(np.abs(cal[:, 0] - v)) / v[-1]))
        fsi_ref = cal[:, 2]
        tank_err_fsi = max(tank_err_fsi, float(np.max(np.abs(fsi_ref - ours.calibration.fsi_m4)) / max(fsi_ref.max(), 1e-9)))
        if k < n_tr:
            _, mom = ref_tank(tm, fill_grid, heels, [])
            t_tr += time.perf_counter() - tb
            scale = max(float(np.max(np.abs(mom))), 1e-9)
            tank_err_m = max(tank_err_m, float(np.max(np.abs(mom - ours.transfer.moment_m4))) / scale)
    ref_tanks = t_cal + t_tr * (len(g.tanks) / n_tr)

    hyd_keys = ("displacement_t", "lcb_m", "vcb_m", "kmt_m", "tpc_t_cm")
    errs = {k: max(abs(getattr(hyd, k)[i] - ref_h[i][k]) for i in range(len(drafts))) for k in hyd_keys}
    ref_times = (t1 - t0, t2 - t1, ref_tanks)
    rows = ((f"hydrostatics ({len(drafts)} drafts)", 0), (f"KN {len(disp)} × {len(heels)}", 1), (f"{len(g.tanks)} tanks (calibration, transfer, band)", 2))
    print(f"{'part':44s} {'deckload':>10s} {'trimesh':>10s} {'ratio':>8s}")
    for name, i in rows:
        print(f"{name:44s} {ours_t[i]:9.3f}s {ref_times[i]:9.2f}s {ref_times[i] / ours_t[i]:7.1f}×")
    tot_o, tot_r = float(np.sum(ours_t)), float(np.sum(ref_times))
    print(f"{'all tables':44s} {tot_o:9.3f}s {tot_r:9.2f}s {tot_r / tot_o:7.1f}×")
    if n_tr < len(g.tanks):
        print(f"(reference transfer tables timed on {n_tr} tanks and scaled to {len(g.tanks)}; --full for all)")
    print("agreement with the reference (MSC.1/Circ.1229 / UR L5 tolerance in brackets):")
    print(f"  displacement {errs['displacement_t']:.3f} t (2 % of Δ), LCB {errs['lcb_m']:.4f} m (50 cm), "
          f"VCB {errs['vcb_m']:.4f} m, KMt {errs['kmt_m']:.4f} m (5 cm), TPC {errs['tpc_t_cm']:.4f} t/cm")
    print(f"  KN max |Δ| {float(np.max(np.abs(cc.kn_m - ref_kn_m))):.4f} m (5 cm)")
    print(f"  tank volume max {100 * tank_err_v:.3f} % of capacity (2 %), fsi max {100 * tank_err_fsi:.3f} % (2 %), "
          f"transfer moment max {100 * tank_err_m:.3f} % of the tank's largest")
    print(f"target: all tables under 5 s ({'met' if tot_o < 5 else 'NOT met'}), ≥ 10× the reference "
          f"({'met' if tot_r / tot_o >= 10 else 'NOT met'})")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
