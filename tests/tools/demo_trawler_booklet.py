"""Write the Demo Trawler's booklet-style profile from her invented geometry.

Run by hand from the checkout root, with deckload importable (``pip install -e .`` or
``PYTHONPATH=.``): ``python tests/tools/demo_trawler_booklet.py``.

The Demo Trawler is invented (demo only).  A crew has no hull model: what they have
is the stability booklet.  To give deckload a second demo vessel entered the way a
crew would enter a real one, her "booklet" was invented here from
``vessel_profiles/demo_trawler.geometry.toml`` (written by
``tests/tools/demo_trawler_geometry.py``) with deckload's own table builder, and then
printed the way booklets print their pages:

* hydrostatic particulars against the EXTREME draft (moulded + 12 mm keel plate),
  longitudinal centres from MIDSHIPS, + forward, rounded as a booklet prints them;
* KN cross curves only to 60°, in 5° steps, at 20 t steps of displacement;
* tank tables: the engine-room wing fuel tanks by ULLAGE from the top of the sounding
  pipe, the others by sounding, one with its sounding zero (striker plate) 30 mm above
  the tank's lowest point; free-surface moments in t·m at the tank's density per row,
  or ONE maximum value per tank; transverse centres printed "1.234 P" / "1.234 S" or as
  distances with the side stated once; the hydraulic oil tank by capacity and centre only;
* the downflooding angle as a curve against the extreme draft;
* crew and stores as fixed constants of the profile.

The result is ``vessel_profiles/demo_trawler.toml`` and the CSV pages in
``vessel_profiles/demo_trawler/``.  Neither needs the geometry file: it is kept only
as the source the booklet was invented from.  The copies inside the package
(``deckload/data/``) are refreshed by the same run.
"""

from __future__ import annotations

import shutil
from pathlib import Path

import numpy as np

from deckload.core.geometry.builder import deck_area_tables, hold_tables, hull_body
from deckload.core.geometry.cross_curves import cross_curves, immersion_angle
from deckload.core.geometry.hull import compartment_body
from deckload.core.geometry.hydrostatics_calc import upright_hydrostatics
from deckload.core.geometry.tanks import calibrate
from deckload.core.geometry.windage import deck_edge_point, waterline_length_m, windage_above
from deckload.io.geometry_files import load_geometry

ROOT = Path(__file__).resolve().parents[2]
GEOMETRY = ROOT / "vessel_profiles" / "demo_trawler.geometry.toml"
PROFILE = ROOT / "vessel_profiles" / "demo_trawler.toml"
PAGES = ROOT / "vessel_profiles" / "demo_trawler"
PACKAGED = ROOT / "deckload" / "data"

BOOKLET_CONDITIONS = "# ---- booklet conditions:"
KEEL_M = 0.012  # flat keel plate: extreme draft = moulded draft + 12 mm
MID_M = 11.0  # midships = LBP/2 from the AP
BOOKLET_DRAFTS_EXTREME = np.round(np.arange(1.60, 3.601, 0.10), 2)
KN_DISPLACEMENTS = np.arange(100.0, 321.0, 20.0)
KN_HEELS = np.arange(0.0, 60.1, 5.0)
DOWNFLOODING_DRAFTS_EXTREME = np.round(np.arange(2.00, 3.401, 0.20), 2)
WINDAGE_DRAFTS_MOULDED = np.round(np.arange(2.00, 3.201, 0.20), 2)

#: How each tank is printed in the booklet.
#:   table: "sounding" | "ullage" | "capacity";  fsm: "rows" (t·m per row) | "max" (one value) | None
#:   zero: sounding zero above the lowest point (m); pipe: ullage reference above the tank top (m)
#:   side: how TCGs are printed: "letter" ("1.234 P") or "distance" (tcg_side stated once)
TANK_PAGES = {
    "FWP": dict(table="sounding", fsm="max", side="letter"),
    "FWS": dict(table="sounding", fsm="max", side="letter"),
    "FO1P": dict(table="ullage", fsm="rows", pipe=0.35, side="letter"),
    "FO1S": dict(table="ullage", fsm="rows", pipe=0.35, side="letter"),
    "HYD": dict(table="capacity", fsm=None),
    "FO2P": dict(table="sounding", fsm="max", side="distance"),
    "FO2S": dict(table="sounding", fsm="max", side="distance"),
    "FW2": dict(table="sounding", fsm="rows", zero=0.03, side="letter"),
    "FPT": dict(table="sounding", fsm="rows", side="letter"),
}


def x_mid(x_ap):
    """Booklet longitudinal position: from midships, + forward."""
    return np.asarray(x_ap, dtype=float) - MID_M


def fnum(v: float, dec: int) -> str:
    s = f"{v:.{dec}f}"
    return "0." + "0" * dec if s.startswith("-") and float(s) == 0.0 else s


def side(v: float, dec: int = 3) -> str:
    """A TCG as a booklet prints it: '1.234 P', '1.234 S' or '0.000'."""
    r = round(float(v), dec)
    if r == 0.0:
        return fnum(0.0, dec)
    return f"{abs(r):.{dec}f} {'S' if r > 0 else 'P'}"


def write_csv(path: Path, header: list[str], rows: list[list[str]]) -> None:
    path.parent.mkdir(parents=True, exist_ok=True)
    lines = [",".join(header)] + [",".join(r) for r in rows]
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")


def hydrostatics_page(body, g, pages: Path) -> None:
    rho = g.vessel.table_density_t_m3
    h = upright_hydrostatics(body, BOOKLET_DRAFTS_EXTREME - KEEL_M, rho, g.vessel.lbp_m, g.vessel.breadth_m)
    rows = []
    for i, d in enumerate(BOOKLET_DRAFTS_EXTREME):
        rows.append([
            fnum(d, 2), fnum(h.displacement_t[i], 1), fnum(x_mid(h.lcb_m[i]), 3), fnum(x_mid(h.lcf_m[i]), 3),
            fnum(h.vcb_m[i], 3), fnum(h.kmt_m[i], 3), fnum(h.kml_m[i], 2), fnum(h.tpc_t_cm[i], 3),
            fnum(h.mctc_tm_cm[i], 3),
        ])
    write_csv(pages / "hydrostatics.csv",
              ["draft_m", "displacement_t", "lcb_m", "lcf_m", "vcb_m", "kmt_m", "kml_m", "tpc_t_cm", "mctc_tm_cm"],
              rows)


def kn_page(body, g, pages: Path) -> None:
    ts = g.tables
    cc = cross_curves(body, KN_DISPLACEMENTS, KN_HEELS, g.vessel.table_density_t_m3, "free trim",
                      ts.trim_lcg_m, ts.trim_vcg_m)
    header = ["displacement_t"] + [f"kn_{h:g}" for h in KN_HEELS]
    rows = [[fnum(d, 1)] + [fnum(k, 3) for k in cc.kn_m[i]] for i, d in enumerate(KN_DISPLACEMENTS)]
    write_csv(pages / "kn.csv", header, rows)


def downflooding_page(body, g, pages: Path) -> str:
    rho = g.vessel.table_density_t_m3
    ts = g.tables
    h = upright_hydrostatics(body, DOWNFLOODING_DRAFTS_EXTREME - KEEL_M, rho, g.vessel.lbp_m, g.vessel.breadth_m)
    angles = np.array([
        immersion_angle(body, h.displacement_t, rho, (o.x_m, o.y_m, o.z_m), "free trim", ts.trim_lcg_m, ts.trim_vcg_m)
        for o in g.openings
    ])
    lowest = np.argmin(angles, axis=0)
    names = sorted({g.openings[int(i)].name for i in lowest})
    rows = [[fnum(d, 2), fnum(a, 1)] for d, a in zip(DOWNFLOODING_DRAFTS_EXTREME, np.min(angles, axis=0))]
    write_csv(pages / "downflooding.csv", ["draft_m", "angle_deg"], rows)
    return " / ".join(names)


def windage_toml(g) -> str:
    """[windage]: the booklet's wind-heeling page (area and lever against the moulded draft)."""
    lp = g.lateral_profile
    rows = [windage_above(lp.x_m, lp.z_m, float(d)) for d in WINDAGE_DRAFTS_MOULDED]
    lwl = [waterline_length_m(g.hull, float(d)) for d in WINDAGE_DRAFTS_MOULDED]
    return "\n".join([
        "[windage]                              # booklet: wind heeling, lateral area above the waterline",
        f"draft_m = [{', '.join(fnum(d, 2) for d in WINDAGE_DRAFTS_MOULDED)}]   # moulded, as this page prints it",
        f"lateral_area_m2 = [{', '.join(fnum(a, 1) for a, _ in rows)}]",
        f"centroid_above_wl_m = [{', '.join(fnum(h, 2) for _, h in rows)}]   # above the WATERLINE",
        f"waterline_length_m = [{', '.join(fnum(x, 2) for x in lwl)}]",
    ]) + "\n"


def deck_edge_toml(body, g) -> str:
    """[deck_edge]: heel at which the deck edge at midships immerses, same basis as the KN."""
    ts = g.tables
    edge = deck_edge_point(g.hull, 0.5 * g.vessel.lbp_m)
    ang = immersion_angle(body, KN_DISPLACEMENTS, g.vessel.table_density_t_m3, edge, "free trim",
                          ts.trim_lcg_m, ts.trim_vcg_m)
    return "\n".join([
        "[deck_edge]                            # booklet: angle of deck-edge immersion at midships",
        f"displacement_t = [{', '.join(fnum(d, 1) for d in KN_DISPLACEMENTS)}]",
        f"angle_deg = [{', '.join(fnum(a, 1) for a in ang)}]",
    ]) + "\n"


def tank_page(spec, g, pages: Path) -> dict:
    """Write one tank's page; return what the profile's [[tank]] needs."""
    page = TANK_PAGES[spec.id]
    body = compartment_body(spec.shape, g.hull)
    height = body.z_max_m - body.z_min_m
    rho = spec.density_t_m3
    fine = calibrate(body, np.linspace(0.0, height, 401))
    out: dict = {"capacity_m3": float(fine.volume_m3[-1]), "max_fsm_tm": float(np.max(fine.fsi_m4)) * rho}
    if page["table"] == "capacity":
        full = calibrate(body, np.array([height]))
        out.update(lcg=float(x_mid(full.lcg_m[0])), vcg=float(full.vcg_m[0]), tcg=float(full.tcg_m[0]))
        return out
    if page["table"] == "ullage":
        ref = round(height + page["pipe"], 2)
        ullages = np.concatenate([[ref - height], np.arange(np.ceil((ref - height) * 10 + 1e-9) / 10, ref - 1e-9, 0.10), [ref]])
        levels = np.clip(ref - ullages, 0.0, height)
        reading, col = ullages, "ullage_m"
        out["ullage_reference_m"] = ref
    else:
        zero = page.get("zero", 0.0)
        top = height - zero
        readings = np.concatenate([np.arange(0.0, top - 0.05, 0.10), [top]])
        levels = readings + zero
        reading, col = readings, "sounding_m"
        if zero:
            out["sounding_zero_m"] = zero
    cal = calibrate(body, levels)
    header = [col, "volume_m3", "lcg_m", "vcg_m", "tcg_m"]
    if page["fsm"] == "rows":
        header.append("fsm_tm")
    rows = []
    for i in range(len(levels)):
        tcg = side(cal.tcg_m[i]) if page["side"] == "letter" else fnum(abs(cal.tcg_m[i]), 3)
        r = [fnum(reading[i], 3 if col == "ullage_m" and i == 0 else 2), fnum(cal.volume_m3[i], 3),
             fnum(x_mid(cal.lcg_m[i]), 3), fnum(cal.vcg_m[i], 3), tcg]
        if page["fsm"] == "rows":
            r.append(fnum(cal.fsi_m4[i] * rho, 2))
        rows.append(r)
    write_csv(pages / "tanks" / f"{spec.id}.csv", header, rows)
    if page["side"] == "distance":
        out["tcg_side"] = "port" if float(np.mean(cal.tcg_m)) < 0 else "starboard"
    return out


def hold_page(spec, g, pages: Path) -> dict:
    ht = hold_tables(spec, g)
    rows = [[fnum(f, 0), fnum(v, 3), fnum(x_mid(x), 3)] for f, v, x in zip(ht.fill_pct, ht.fill_vcg_m, ht.fill_lcg_m)]
    write_csv(pages / f"{spec.id.lower()}_fill.csv", ["fill_pct", "fill_vcg_m", "fill_lcg_m"], rows)
    return {"capacity_m3": ht.capacity_m3, "lcg": float(x_mid(ht.lcg_m)), "vcg": ht.vcg_m}


PROFILE_TEMPLATE = '''\
# Demo Trawler: an INVENTED 24 m stern trawler (demo only; every figure is made up).
#
# Entered the way a crew enters a vessel from her approved stability booklet: the tables
# are the booklet's pages typed into spreadsheet files (demo_trawler/*.csv), with the
# booklet's own conventions stated here and converted by deckload on load
# (`deckload check demo_trawler.toml` prints every conversion).  No hull model is needed.
# Written by tests/tools/demo_trawler_booklet.py from demo_trawler.geometry.toml, the source the
# booklet was invented from.
#
# deckload supports, and never replaces, the approved stability booklet, the master's
# judgement and flag-State and class rules.

format = "deckload-profile-1"

[vessel]
name = "Demo Trawler"
vessel_type = "stern trawler, single deck"
lbp_m = 22.0
breadth_m = 7.2
depth_m = 3.9
design_draft_m = 2.8
table_density_t_m3 = 1.025
keel_thickness_m = 0.012               # flat keel plate: extreme draft = moulded + 0.012 m
longitudinal_datum = "midships"        # the booklet measures every LCG, LCB and LCF from midships
longitudinal_positive = "forward"      # ... positive forward (so aft of midships is negative)
remark = "Invented demo vessel: every figure is made up for demonstration. deckload supports, and never replaces, the approved stability booklet, the master's judgement and flag-State and class rules."

[lightship]                            # booklet: inclining experiment (invented)
mass_t = 168.0
lcg_m = -1.60                          # 1.60 m aft of midships
vcg_m = 3.05
tcg_m = 0.0

# Fixed items of every condition (booklet: "constant weights"); a condition may replace one
# by giving a [[constant]] of the same name.
[[constant]]
name = "Crew (6) and effects"
mass_t = 0.7
lcg_m = 2.5
vcg_m = 5.2
tcg_m = 0.0

[[constant]]
name = "Provisions and stores"
mass_t = 1.5
lcg_m = 1.5
vcg_m = 4.3
tcg_m = 0.0

[hydrostatics]                         # booklet: hydrostatic particulars, even keel, SW 1.025
csv = "demo_trawler/hydrostatics.csv"
draft_basis = "extreme"                # drafts as read at the marks: moulded + keel plate

[cross_curves]                         # booklet: KN, free trim; printed only to 60 degrees
csv = "demo_trawler/kn.csv"
trim_basis = "free trim"

[downflooding]                         # booklet: angle of flooding against the extreme draft
csv = "demo_trawler/downflooding.csv"  # lowest opening: {opening}
draft_basis = "extreme"

[criteria]
ship_type = "fishing"                  # IS 2008 Part B 2.1 (GM0 >= 0.35 m, single deck) and Part A 2.3
bilge_keel_area_m2 = 3.5               # two bilge keels 7.0 m x 0.25 m

{windage}
{deck_edge}
[[load_line]]
name = "summer"
draft_m = 2.8                          # moulded (the booklet's freeboard plan)

{tanks}
{holds}
[[deck_area]]
id = "TRAWLDECK"
name = "Trawl deck aft"
area_m2 = {deck_area:.1f}
lcg_m = {deck_lcg:.2f}
deck_height_m = {deck_z:.2f}
tcg_m = 0.0
max_load_t_m2 = 1.5
'''


def tank_toml(spec, info: dict) -> str:
    page = TANK_PAGES[spec.id]
    lines = ["[[tank]]", f'id = "{spec.id}"', f'name = "{spec.name}"', f'kind = "{spec.kind}"',
             f"density_t_m3 = {spec.density_t_m3:.3f}", f"capacity_m3 = {info['capacity_m3']:.3f}"]
    if spec.pair:
        lines.append(f'pair = "{spec.pair}"')
    if page["table"] == "capacity":
        lines += [f"lcg_m = {info['lcg']:.2f}", f"vcg_m = {info['vcg']:.2f}", f'tcg_m = "{side(info["tcg"], 2)}"',
                  "# capacity and centre only: no level table; the booklet gives no free-surface moment",
                  "# (at most 0.07 t·m: far below the small-tank limit of IS 2008 B 3.1.12)"]
        return "\n".join(lines) + "\n"
    if "ullage_reference_m" in info:
        lines.append(f"ullage_reference_m = {info['ullage_reference_m']:.2f}   # top of the sounding pipe above the tank's lowest point")
    if "sounding_zero_m" in info:
        lines.append(f"sounding_zero_m = {info['sounding_zero_m']:.2f}      # striker plate above the tank's lowest point")
    if page["fsm"] == "max":
        # rounded UP to 0.1 t·m: a maximum is never less than the actual moment
        lines += [f"max_fsm_tm = {np.ceil(info['max_fsm_tm'] * 10 - 1e-9) / 10:.1f}     # booklet: one maximum free-surface moment",
                  f"fsm_density_t_m3 = {spec.density_t_m3:.3f}"]
    lines += ["", "  [tank.calibration]", f'  csv = "demo_trawler/tanks/{spec.id}.csv"']
    if page["fsm"] == "rows":
        lines.append(f"  fsm_density_t_m3 = {spec.density_t_m3:.3f}")
    if "tcg_side" in info:
        lines.append(f'  tcg_side = "{info["tcg_side"]}"      # the page prints distances from the centreline')
    return "\n".join(lines) + "\n"


def booklet_text(pages: Path) -> str:
    """Write the CSV pages into ``pages``; return the profile's text (without booklet conditions)."""
    g = load_geometry(GEOMETRY)
    body = hull_body(g)
    pages.mkdir(parents=True, exist_ok=True)
    hydrostatics_page(body, g, pages)
    kn_page(body, g, pages)
    opening = downflooding_page(body, g, pages)
    tanks = "\n".join(tank_toml(s, tank_page(s, g, pages)) for s in g.tanks)
    holds = []
    for h in g.holds:
        info = hold_page(h, g, pages)
        holds.append("\n".join([
            "[[hold]]", f'id = "{h.id}"', f'name = "{h.name}"', f"capacity_m3 = {info['capacity_m3']:.1f}",
            f"lcg_m = {info['lcg']:.3f}", f"vcg_m = {info['vcg']:.3f}", "tcg_m = 0.0",
            f"max_mass_t = {h.max_mass_t:.1f}", f'csv = "demo_trawler/{h.id.lower()}_fill.csv"   # centre against fill (levelled)',
        ]) + "\n")
    da = deck_area_tables(g.deck_areas[0], g)
    return PROFILE_TEMPLATE.format(opening=opening, tanks=tanks, holds="\n".join(holds),
                                   windage=windage_toml(g), deck_edge=deck_edge_toml(body, g),
                                   deck_area=da.area_m2, deck_lcg=float(x_mid(da.lcg_m)), deck_z=da.deck_height_m)


def main() -> int:
    text = booklet_text(PAGES)
    if PROFILE.exists():  # keep the booklet conditions (tests/tools/demo_trawler_booklet_conditions.py)
        old = PROFILE.read_text(encoding="utf-8")
        if BOOKLET_CONDITIONS in old:
            text += "\n" + BOOKLET_CONDITIONS + old.split(BOOKLET_CONDITIONS, 1)[1]
    PROFILE.write_text(text, encoding="utf-8")
    # the packaged copies: profile, its pages and its conditions
    shutil.copyfile(PROFILE, PACKAGED / PROFILE.name)
    for cond in sorted(PROFILE.parent.glob("demo_trawler.*.condition.toml")):
        shutil.copyfile(cond, PACKAGED / cond.name)
    if (PACKAGED / PAGES.name).exists():
        shutil.rmtree(PACKAGED / PAGES.name)
    shutil.copytree(PAGES, PACKAGED / PAGES.name)
    print(f"wrote {PROFILE.relative_to(ROOT)}, {PAGES.relative_to(ROOT)}/ and the copies in deckload/data/")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
