"""Compute the Demo Trawler's "booklet conditions" independently of deckload's tables.

Run by hand from the checkout root (needs the test extra: trimesh, shapely, scipy):
``python tests/tools/demo_trawler_booklet_conditions.py``.  It rewrites the block of
``[[booklet_condition]]`` tables at the end of ``vessel_profiles/demo_trawler.toml``
(between the two marker lines) and copies the profile into ``deckload/data/``.

The Demo Trawler is invented.  Her "booklet" prints worked loading conditions with
their results; ``deckload check`` recomputes them from the profile's tables and
compares within the MSC.1/Circ.1229 / IACS UR L5 tolerances.  For that comparison
to mean anything, the booklet's results must NOT come from deckload's tables.

METHOD (the booklet's own calculation, all from the hull offsets of
``demo_trawler.geometry.toml`` through trimesh, a general-purpose mesh library):

* the hull is the closed triangle mesh of the offsets (``tests.benchmarks.bench_tables.hull_mesh``,
  the project's trimesh reference); tanks and the fish hold are that mesh cut by their
  bounding planes (or a box mesh), ``compartment_mesh``;
* weights: lightship and constants as the profile states them; each tank's contents
  (percent × the mesh's own capacity × density, or the stated mass) at the centroid of
  the liquid levelled upright at even keel (level found with scipy's brentq on the
  mesh volume below a plane); the capacity-only hydraulic tank at its stated fixed
  centre, as the booklet prints it; the fish hold's catch at mass × stowage factor,
  levelled; deck items as stated;
* free surface, IS 2008 Part B 3.1: a tank at or above 98 % has none (B 3.1.2); a slack
  consumable counts its largest moment ρ·i over the fill range (B 3.1.3), i the
  transverse second moment of the mesh's horizontal section about its centroid at 120
  levels, or the single maximum the booklet prints for that tank; for each consumable
  kind the pair or centreline tank with the largest moment is assumed slack even when
  full (B 3.1.4); ballast counts at its actual level; a tank whose wall-sided Mfs at
  30°, ρ·i_max·sin30°·(1 + ½tan²30°), is below 0.01·Δmin is left out (B 3.1.12; the
  0.01 m from memory, Δmin = lightship), a pair judged by its larger tank;
* equilibrium: the mesh floats free to trim with volume Δ/ρ and the centre of buoyancy
  on the vertical through G: (x_B − LCG) − tanψ·(z_B − KG) = 0 (brentq on tanψ, the
  volume level by brentq inside); drafts are read where that waterplane crosses the
  AP, midships and FP (moulded);
* KMt = z_B + I_T/∇ of the upright, even-keel waterplane at the same displacement (as a
  booklet reads KM from its hydrostatic particulars);
* GZ(φ) = KN(φ) − KG_fluid·sin φ with KN by ``tests.benchmarks.bench_tables.ref_kn`` (trimesh
  slicing of the heeled mesh, free trim about this condition's own LCG and KG), at
  0–60° in 5° steps; areas by Simpson's first rule on those ordinates; the maximum GZ
  from the parabola through the largest ordinate and its neighbours;
* the downflooding angle: the heel at which the lowest unprotected opening of the geometry
  file reaches the water, heeling towards it and floating free to trim about this
  condition's G (brentq on the opening's height above the waterplane).
"""

from __future__ import annotations

import math
import shutil
import tomllib
from pathlib import Path

import numpy as np
from scipy.optimize import brentq

from tests.benchmarks.bench_tables import below, compartment_mesh, heeled, hull_mesh, ref_kn, waterplane_moments
from deckload.io.geometry_files import load_geometry

ROOT = Path(__file__).resolve().parents[2]
GEOMETRY = ROOT / "vessel_profiles" / "demo_trawler.geometry.toml"
PROFILE = ROOT / "vessel_profiles" / "demo_trawler.toml"
PACKAGED = ROOT / "deckload" / "data" / "demo_trawler.toml"
MID_M = 11.0
LBP_M = 22.0
KEEL_M = 0.012  # the booklet's drafts are extreme: moulded + the keel plate
RHO_SW = 1.025
BEGIN = "# ---- booklet conditions: written by tests/tools/demo_trawler_booklet_conditions.py (do not edit by hand)"
END = "# ---- end of booklet conditions"

CONDITIONS = (
    ("Departure for the fishing grounds", "booklet condition 1", "demo_trawler.departure.condition.toml"),
    ("On the grounds, 25 t catch aboard", "booklet condition 2", "demo_trawler.grounds.condition.toml"),
    ("Arrival, full hold, 10 % consumables", "booklet condition 3", "demo_trawler.arrival.condition.toml"),
)
HEELS = np.arange(0.0, 60.1, 5.0)
PRINTED_GZ_HEELS = (10.0, 20.0, 30.0, 40.0)
CONSUMABLES = {"fuel_oil", "diesel", "lube_oil", "fresh_water"}
SMALL_TANK_LIMIT_M = 0.01  # IS 2008 B 3.1.12, the value from memory (standards.md §4.1)


def level_for(mesh, volume_m3: float) -> float:
    lo, hi = float(mesh.bounds[0, 2]), float(mesh.bounds[1, 2])
    if volume_m3 >= mesh.volume * (1 - 1e-9):
        return hi
    return brentq(lambda z: below(mesh, [0, 0, 1], z)[0] - volume_m3, lo + 1e-9, hi, xtol=1e-9)


def levelled_centroid(mesh, volume_m3: float) -> np.ndarray:
    if volume_m3 >= mesh.volume * (1 - 1e-9):
        return np.asarray(mesh.center_mass, dtype=float)
    return below(mesh, [0, 0, 1], level_for(mesh, volume_m3))[1]


def max_fsi_m4(mesh) -> float:
    lo, hi = float(mesh.bounds[0, 2]), float(mesh.bounds[1, 2])
    return max(waterplane_moments(mesh, z)[3] for z in np.linspace(lo + 1e-4, hi - 1e-4, 120))


def fsi_at_volume(mesh, volume_m3: float) -> float:
    return waterplane_moments(mesh, level_for(mesh, volume_m3))[3]


def side_value(v) -> float:
    """A TCG as the profile prints it ('1.20 P', '0.00' or a number) → signed, + starboard."""
    if isinstance(v, (int, float)):
        return float(v)
    s = v.strip().upper()
    if s in ("CL", ""):
        return 0.0
    if s.endswith("P"):
        return -float(s[:-1])
    if s.endswith("S"):
        return float(s[:-1])
    return float(s)


def floating(mesh, volume_m3: float, lcg: float, zeta_g: float) -> tuple[float, float]:
    """Level c and tanψ of the (heeled) mesh floating free to trim: volume below the plane
    n·p = c, n = (tanψ, 0, 1)/|…|, equals ``volume_m3`` and B lies on the vertical through G."""

    def level(t: float) -> float:
        n = np.array([t, 0.0, 1.0]) / math.hypot(t, 1.0)
        lev = mesh.vertices @ n
        return brentq(lambda c: below(mesh, n, c)[0] - volume_m3, float(lev.min()) + 1e-9, float(lev.max()), xtol=1e-10)

    def resid(t: float) -> float:
        n = np.array([t, 0.0, 1.0]) / math.hypot(t, 1.0)
        cm = below(mesh, n, level(t))[1]
        return (cm[0] - lcg) - t * (cm[2] - zeta_g)

    t = brentq(resid, -0.2, 0.2, xtol=1e-10)
    return level(t), t


def equilibrium(hull, volume_m3: float, lcg: float, kg: float) -> tuple[float, float, float]:
    """Drafts (aft, mid, fwd), moulded, upright and floating free to trim with B under G."""
    c, t = floating(hull, volume_m3, lcg, kg)
    z0 = c * math.hypot(t, 1.0)  # the waterplane: z = z0 − tanψ·x
    return z0, z0 - t * MID_M, z0 - t * LBP_M


def downflooding_angle(hull, volume_m3: float, lcg: float, kg: float, openings) -> float:
    """Heel (°) at which the lowest opening reaches the water, heeling towards it, floating free
    to trim about this condition's own G: brentq on the opening's height above the waterplane."""
    angles = []
    for o in openings:
        y, z = abs(o.y_m), o.z_m  # the hull is symmetric: heel towards the opening's side

        def margin(h: float) -> float:
            th = math.radians(h)
            c, t = floating(heeled(hull, h), volume_m3, lcg, kg * math.cos(th))
            p = np.array([o.x_m, y * math.cos(th) + z * math.sin(th), -y * math.sin(th) + z * math.cos(th)])
            return float(p @ (np.array([t, 0.0, 1.0]) / math.hypot(t, 1.0))) - c  # > 0: dry

        angles.append(brentq(margin, 0.0, 89.0, xtol=1e-3) if margin(89.0) < 0 else 90.0)
    return min(angles)


def weights(cond_file: Path, profile: dict, meshes: dict, tank_meshes: dict) -> tuple[float, float, float, float, float]:
    """Δ (t), LCG from AP, KG, TCG (m) and the free-surface moment counted (t·m) of a loading."""
    cond = tomllib.loads(cond_file.read_text(encoding="utf-8"))
    ls = profile["lightship"]
    items = [(ls["mass_t"], ls["lcg_m"] + MID_M, ls["vcg_m"], side_value(ls.get("tcg_m", 0.0)))]
    # profile positions are from midships; condition files are from the AP
    consts = {c["name"]: dict(c, lcg_m=c["lcg_m"] + MID_M) for c in profile.get("constant", [])}
    for c in cond.get("constant", []):
        consts[c["name"]] = c
    for c in consts.values():
        items.append((c["mass_t"], c["lcg_m"], c["vcg_m"], side_value(c.get("tcg_m", 0.0))))
    for d in cond.get("deck_item", []):
        items.append((d["mass_t"], d["lcg_m"], d["vcg_m"], side_value(d.get("tcg_m", 0.0))))
    ptanks = {t["id"]: t for t in profile["tank"]}
    fills: dict[str, float] = {}
    for tid, spec in cond.get("tanks", {}).items():
        pt = ptanks[tid]
        rho = spec.get("density_t_m3", pt["density_t_m3"])
        m = tank_meshes[tid]
        if "calibration" not in pt:  # capacity and centre only: the booklet's fixed centre
            vol = spec["percent"] / 100.0 * pt["capacity_m3"]
            items.append((vol * rho, pt["lcg_m"] + MID_M, pt["vcg_m"], side_value(pt["tcg_m"])))
            fills[tid] = spec["percent"]
            continue
        vol = spec["percent"] / 100.0 * m.volume
        cm = levelled_centroid(m, vol)
        items.append((vol * rho, float(cm[0]), float(cm[2]), float(cm[1])))
        fills[tid] = spec["percent"]
    for hid, h in cond.get("holds", {}).items():
        m = meshes[hid]
        vol = h["mass_t"] * h["stowage_m3_t"]
        cm = levelled_centroid(m, vol)
        items.append((h["mass_t"], float(cm[0]), float(cm[2]), float(cm[1])))
    w = np.array(items)
    disp = float(w[:, 0].sum())
    lcg = float(w[:, 0] @ w[:, 1]) / disp
    kg = float(w[:, 0] @ w[:, 2]) / disp
    tcg = float(w[:, 0] @ w[:, 3]) / disp

    # free surface, IS 2008 Part B 3.1 (module docstring)
    dmin = float(ls["mass_t"])
    fsm_max: dict[str, float] = {}
    for tid, pt in ptanks.items():
        if "calibration" not in pt and "max_fsm_tm" not in pt:
            continue
        rho = pt["density_t_m3"]
        fsm_max[tid] = pt["max_fsm_tm"] if "max_fsm_tm" in pt else rho * max_fsi_m4(tank_meshes[tid])
    wall30 = 0.5 * (1.0 + 0.5 * math.tan(math.radians(30.0)) ** 2)

    def exempt(tid: str) -> bool:
        group = [tid] + ([ptanks[tid]["pair"]] if "pair" in ptanks[tid] else [])
        return max(fsm_max.get(t, 0.0) for t in group) * wall30 / dmin < SMALL_TANK_LIMIT_M

    counted: dict[str, float] = {}
    for kind in sorted({pt["kind"] for pt in ptanks.values()} & CONSUMABLES):
        groups, seen = [], set()
        for tid, pt in ptanks.items():
            if pt["kind"] != kind or tid in seen or tid not in fsm_max or exempt(tid):
                continue
            grp = [tid] + ([pt["pair"]] if "pair" in pt else [])
            seen.update(grp)
            groups.append(grp)
        if groups:
            worst = max(groups, key=lambda grp: sum(fsm_max[t] for t in grp))
            for t in worst:
                counted[t] = fsm_max[t]  # B 3.1.4: assumed slack at its largest
    for tid, pct in fills.items():
        pt = ptanks[tid]
        if tid in counted or tid not in fsm_max or exempt(tid) or pct >= 98.0 or pct <= 0.5:
            continue
        if pt["kind"] in CONSUMABLES:
            counted[tid] = fsm_max[tid]  # B 3.1.3: variable level, the largest
        else:
            m = tank_meshes[tid]
            counted[tid] = pt["density_t_m3"] * fsi_at_volume(m, pct / 100.0 * m.volume)  # fixed level: actual
    return disp, lcg, kg, tcg, sum(counted.values())


def compute(cond_file: Path, profile: dict, hull, meshes: dict, tank_meshes: dict, openings=()) -> dict:
    """The booklet's printed results for one loading (module docstring)."""
    disp, lcg, kg, tcg, fsm = weights(cond_file, profile, meshes, tank_meshes)
    dmin = float(profile["lightship"]["mass_t"])
    fsc = fsm / disp
    kg_f = kg + fsc

    vol = disp / RHO_SW
    aft, mid, fwd = equilibrium(hull, vol, lcg, kg)
    z_ek = level_for(hull, vol)
    _, cb = below(hull, [0, 0, 1], z_ek)
    _, _, _, it, _ = waterplane_moments(hull, z_ek)
    km = float(cb[2]) + it / vol

    gz = np.array([ref_kn(hull, vol, h, "free trim", lcg, kg)[0] if h > 0 else 0.0 for h in HEELS])
    gz = gz - kg_f * np.sin(np.radians(HEELS))
    step = math.radians(5.0)

    def simpson(a: int, b: int) -> float:
        y = gz[a:b + 1]
        return step / 3.0 * (y[0] + y[-1] + 4 * y[1:-1:2].sum() + 2 * y[2:-1:2].sum())

    k = int(np.argmax(gz))
    y0, y1, y2 = gz[k - 1], gz[k], gz[k + 1]
    den = y0 - 2 * y1 + y2
    p = 0.5 * (y0 - y2) / den if den != 0 else 0.0
    gz_max = y1 - 0.25 * (y0 - y2) * p
    idx = [int(np.flatnonzero(HEELS == h)[0]) for h in PRINTED_GZ_HEELS]
    return {
        "displacement_t": round(disp, 2),
        "deadweight_t": round(disp - dmin, 2),
        "longitudinal_datum": "midships",  # printed as the booklet prints it: LCG from midships,
        "longitudinal_positive": "forward",  # + forward, and the drafts extreme (at the marks)
        "draft_basis": "extreme",
        "lcg_m": round(lcg - MID_M, 3),
        "tcg_m": round(tcg, 3) + 0.0,
        "kg_m": round(kg, 3),
        "fsm_tm": round(fsm, 2),
        "fsc_m": round(fsc, 3),
        "kg_fluid_m": round(kg_f, 3),
        "km_m": round(km, 3),
        "gm_solid_m": round(km - kg, 3),
        "gm_m": round(km - kg_f, 3),
        "draft_aft_m": round(aft + KEEL_M, 3),
        "draft_mid_m": round(mid + KEEL_M, 3),
        "draft_fwd_m": round(fwd + KEEL_M, 3),
        "trim_m": round(aft - fwd, 3),
        "gz_heel_deg": [int(h) for h in PRINTED_GZ_HEELS],
        "gz_m": [round(float(gz[i]), 3) for i in idx],
        "max_gz_m": round(float(gz_max), 3),
        "area_0_30_mrad": round(simpson(0, 6), 4),
        "area_0_40_mrad": round(simpson(0, 8), 4),
        "area_30_40_mrad": round(simpson(6, 8), 4),
        "downflooding_angle_deg": round(downflooding_angle(hull, vol, lcg, kg, openings), 1),
    }


def reference_meshes():
    """The hull mesh and the meshes of the holds and tanks, from the geometry file's offsets."""
    g = load_geometry(GEOMETRY)
    hull = hull_mesh(g.hull)
    return hull, {h.id: compartment_mesh(h.shape, hull) for h in g.holds}, {t.id: compartment_mesh(t.shape, hull) for t in g.tanks}


def profile_head() -> dict:
    """The profile as the booklet states it, without the booklet-condition block."""
    return tomllib.loads(PROFILE.read_text(encoding="utf-8").split(BEGIN)[0])


def toml_value(v) -> str:
    if isinstance(v, str):
        return f'"{v}"'
    if isinstance(v, list):
        return "[" + ", ".join(toml_value(x) for x in v) + "]"
    return f"{v}"


def main() -> int:
    text = PROFILE.read_text(encoding="utf-8")
    head = text.split(BEGIN)[0].rstrip("\n") + "\n"
    profile = tomllib.loads(head)
    hull, meshes, tank_meshes = reference_meshes()
    blocks = [BEGIN,
              "# The booklet's worked conditions and its printed results (invented booklet; method: the",
              "# docstring of tests/tools/demo_trawler_booklet_conditions.py — trimesh on the hull offsets, not",
              "# deckload's tables), typed as the booklet prints them: LCG from midships, extreme drafts.",
              ""]
    for name, page, fname in CONDITIONS:
        res = compute(PROFILE.parent / fname, profile, hull, meshes, tank_meshes, load_geometry(GEOMETRY).openings)
        print(f"{name}: " + ", ".join(f"{k} {v}" for k, v in res.items()))
        blocks += ["[[booklet_condition]]", f'name = "{name}"', f'page = "{page}"', f'condition_file = "{fname}"', "",
                   "  [booklet_condition.expected]"]
        blocks += [f"  {k} = {toml_value(v)}" for k, v in res.items()]
        blocks.append("")
    blocks.append(END)
    PROFILE.write_text(head + "\n" + "\n".join(blocks) + "\n", encoding="utf-8")
    shutil.copyfile(PROFILE, PACKAGED)
    print(f"wrote the booklet conditions into {PROFILE.relative_to(ROOT)} and {PACKAGED.relative_to(ROOT)}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
