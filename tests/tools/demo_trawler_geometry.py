"""Write ``vessel_profiles/demo_trawler.geometry.toml``: the invented Demo Trawler's hull and spaces.

Run by hand from the checkout root: ``python tests/tools/demo_trawler_geometry.py``.

The Demo Trawler is an invented 24 m stern trawler (demo only, every figure made
up).  This file is the *source* from which her booklet-style profile was
invented: the offsets below are written from a formula (stated in the header of
the geometry file it writes), and ``tests/tools/demo_trawler_booklet.py`` turns the
tables deckload computes from them into the booklet pages a crew would have.
The profile itself (``vessel_profiles/demo_trawler.toml``) does not need this file.
"""

from __future__ import annotations

import math
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[2]
OUT = ROOT / "vessel_profiles" / "demo_trawler.geometry.toml"

LBP = 22.0
HALF_B = 3.6
DEPTH = 3.9
BILGE_Z = 2.3  # the section is wall-sided above this height
KEEL_HALF = 0.1  # half-width of the flat of keel

STATIONS = np.round(np.arange(-1.0, 23.0001, 0.5), 4)  # 49 stations, 0.5 m apart: Simpson applies
WATERLINES = np.array(
    [0.0, 0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.8, 1.0, 1.2, 1.4, 1.6, 1.8, 2.0, 2.2, 2.4, 2.6,
     2.8, 3.0, 3.2, 3.4, 3.6, 3.8, 4.0, 4.2, 4.4, 4.6, 4.8, 5.0, 5.2]
)


def midship_y(z: np.ndarray) -> np.ndarray:
    """Midship half-breadth: flat of keel, rising floor turning into the wall side at BILGE_Z."""
    u = np.clip(z / BILGE_Z, 0.0, 1.0)
    return KEEL_HALF + (HALF_B - KEEL_HALF) * (1.0 - (1.0 - u) ** 2.4)


def keel_rise(x: float) -> float:
    """Height of the underside of the hull above the baseline aft (rising run to the transom)."""
    return 1.9 * ((5.0 - x) / 6.0) ** 1.5 if x < 5.0 else 0.0


def stem_x(z: np.ndarray) -> np.ndarray:
    """Raked stem: x of the stem line at height z."""
    return 21.6 + 0.45 * (z - 2.7)


def half_breadths(x: float) -> np.ndarray:
    z = WATERLINES
    if x < 8.0:  # run: the keel rises and the waterlines narrow towards the broad transom
        zb = keel_rise(x)
        s = (8.0 - x) / 9.0
        narrow = 1.0 - (0.42 - 0.30 * np.minimum(z / DEPTH, 1.0)) * s**1.6
        y = np.where(z >= zb, midship_y(z - zb) * narrow, 0.0)
        if zb > 0.0:
            y = np.where(z > zb, y, 0.0)
        return y
    if x <= 11.0:  # short parallel middle body
        return midship_y(z)
    xs = stem_x(z)
    xi = np.clip((x - 11.0) / (xs - 11.0), 0.0, 1.0)
    p = 1.4 + 0.8 * np.minimum(z / DEPTH, 1.0)
    return np.where(x < xs, midship_y(z) * (1.0 - xi**p), 0.0)


def deck_z(x: float) -> float:
    """Sheer: the weather deck rises forward of midships."""
    return DEPTH + 1.0 * (max(x - 11.0, 0.0) / 12.0) ** 2


def fmt_row(values) -> str:
    return ", ".join(f"{v:.4f}" for v in values)


HEADER = '''\
# Demo Trawler: hull and compartment geometry (invented vessel, demo only).
#
# Written by tests/tools/demo_trawler_geometry.py.  This is the SOURCE the Demo Trawler's
# booklet-style profile (demo_trawler.toml and the CSV pages in demo_trawler/) was
# invented from: tests/tools/demo_trawler_booklet.py computes her tables from it with deckload's
# table builder and prints them the way a stability booklet does.  The profile does not need this file.
# The schema is that of demo_islander.geometry.toml (deckload-geometry-1).
#
# HULL FORMULA used to write the offsets (x from the AP, z above the keel, metres):
#   midship section: y0(z) = 0.1 + 3.5*(1 - (1 - min(z/2.3, 1))^2.4)   (rising floor, wall side)
#   run aft (x < 8): keel at z_b(x) = 1.9*((5 - x)/6)^1.5 for x < 5, else 0;
#                    y = y0(z - z_b)*(1 - (0.42 - 0.30*min(z/3.9, 1))*s^1.6), s = (8 - x)/9;
#                    broad transom at x = -1.0
#   parallel middle body from x = 8 to x = 11
#   entrance:        y = y0(z)*(1 - xi^p), xi = (x - 11)/(x_stem(z) - 11),
#                    p = 1.4 + 0.8*min(z/3.9, 1); raked stem x_stem(z) = 21.6 + 0.45*(z - 2.7)
#   sheer:           deck_z(x) = 3.9 + 1.0*(max(x - 11, 0)/12)^2
#   offsets rounded to 0.1 mm; 49 stations 0.5 m apart (Simpson's rule applies).
'''

BODY = '''
[tables]
draft_m = [{drafts}]
kn_displacement_t = [{kn_disp}]
kn_heel_deg = [0.0, 5.0, 10.0, 15.0, 20.0, 25.0, 30.0, 35.0, 40.0, 45.0, 50.0, 55.0, 60.0, 65.0, 70.0, 75.0, 80.0, 85.0, 90.0]
trim_basis = "free trim"
trim_lcg_m = 9.6      # about the LCG of her working conditions: B kept in line with it at every heel
trim_vcg_m = 3.0
sounding_step_m = 0.1
transfer_fill_step_pct = 5.0

# ---------------------------------------------------------------- tanks

[[tank]]
id = "FWP"
name = "Fresh water aft port"
kind = "fresh_water"
density_t_m3 = 1.0
pair = "FWS"
shape = "hull"
x_m = [0.0, 2.5]
y_m = [-4.0, -1.2]
z_m = [0.0, 2.6]

[[tank]]
id = "FWS"
name = "Fresh water aft starboard"
kind = "fresh_water"
density_t_m3 = 1.0
pair = "FWP"
shape = "hull"
x_m = [0.0, 2.5]
y_m = [1.2, 4.0]
z_m = [0.0, 2.6]

[[tank]]
id = "FO1P"
name = "No.1 fuel oil wing port (engine room)"
kind = "diesel"
density_t_m3 = 0.84
pair = "FO1S"
shape = "hull"
x_m = [3.0, 8.0]
y_m = [-4.0, -2.3]
z_m = [0.6, 3.3]

[[tank]]
id = "FO1S"
name = "No.1 fuel oil wing starboard (engine room)"
kind = "diesel"
density_t_m3 = 0.84
pair = "FO1P"
shape = "hull"
x_m = [3.0, 8.0]
y_m = [2.3, 4.0]
z_m = [0.6, 3.3]

[[tank]]
id = "HYD"
name = "Hydraulic oil (trawl winch)"
kind = "lube_oil"
density_t_m3 = 0.88
shape = "box"
x_m = [6.4, 7.4]
y_m = [-0.5, 0.5]
z_m = [2.2, 3.2]

[[tank]]
id = "FO2P"
name = "No.2 fuel oil double bottom port"
kind = "diesel"
density_t_m3 = 0.84
pair = "FO2S"
shape = "hull"
x_m = [8.0, 14.0]
y_m = [-4.0, 0.0]
z_m = [0.0, 0.7]

[[tank]]
id = "FO2S"
name = "No.2 fuel oil double bottom starboard"
kind = "diesel"
density_t_m3 = 0.84
pair = "FO2P"
shape = "hull"
x_m = [8.0, 14.0]
y_m = [0.0, 4.0]
z_m = [0.0, 0.7]

[[tank]]
id = "FW2"
name = "Fresh water fore (double bottom)"
kind = "fresh_water"
density_t_m3 = 1.0
shape = "hull"
x_m = [14.5, 17.5]
y_m = [-4.0, 4.0]
z_m = [0.0, 1.0]

[[tank]]
id = "FPT"
name = "Fore peak (ballast)"
kind = "ballast"
density_t_m3 = 1.025
shape = "hull"
x_m = [18.5, 22.6]
y_m = [-4.0, 4.0]
z_m = [0.0, 3.0]

# ---------------------------------------------------------------- hold, deck, openings

[[hold]]
id = "FH"
name = "Fish hold (insulated, chilled)"
shape = "hull"
x_m = [8.0, 14.5]
y_m = [-3.4, 3.4]
z_m = [0.7, 3.9]
max_mass_t = 55.0

[[deck_area]]
id = "TRAWLDECK"
name = "Trawl deck aft"
x_m = [0.0, 8.0]
y_m = [-3.2, 3.2]
max_load_t_m2 = 1.5

[[opening]]
name = "engine-room air intake (starboard, on the casing)"
x_m = 5.5
y_m = 2.7
z_m = 6.2

[[opening]]
name = "fish-hold ventilation head (port)"
x_m = 13.0
y_m = -3.0
z_m = 6.0

# the trawler seen from the side (hull, 1.0 m bulwarks, 1.2 m at the bow, the deckhouse
# x 9.0–15.5 m to 6.7 m, the wheelhouse x 10.5–14.5 m to 9.0 m, the stern gantry taken as
# solid x -0.5–0.5 m to 8.0 m): for the windage of the weather criterion
[lateral_profile]
x_m = [-1.0, 2.0, 5.0, 20.4, 22.6, 22.7, 18.0, 15.5, 15.5, 14.5, 14.5, 10.5, 10.5, 9.0, 9.0, 0.5, 0.5, -0.5, -0.5, -1.0]
z_m = [1.9, 0.67, 0.0, 0.0, 4.9, 6.1, 5.24, 5.04, 6.7, 6.7, 9.0, 9.0, 6.7, 6.7, 4.9, 4.9, 8.0, 8.0, 4.9, 4.9]
'''


def geometry_text() -> str:
    """The geometry file's text (deterministic: offsets rounded to 0.1 mm)."""
    rows = []
    for x in STATIONS:
        rows.append(f"  [{fmt_row(np.round(half_breadths(float(x)), 4))}],  # x = {x:g}")
    deck = ", ".join(f"{deck_z(float(x)):.4f}" for x in STATIONS)
    drafts = ", ".join(f"{d:.1f}" for d in np.arange(1.0, 3.81, 0.1))
    kn_disp = ", ".join(f"{d:.1f}" for d in np.arange(100.0, 321.0, 20.0))
    text = HEADER + f'''
format = "deckload-geometry-1"

[vessel]
name = "Demo Trawler"
lbp_m = {LBP}
breadth_m = {2 * HALF_B}
depth_m = {DEPTH}
design_draft_m = 2.7
table_density_t_m3 = 1.025

[hull]
station_x_m = [{", ".join(f"{x:g}" for x in STATIONS)}]
waterline_z_m = [{", ".join(f"{z:g}" for z in WATERLINES)}]
deck_z_m = [{deck}]
# one row per station (x in the comment), one column per waterline above
half_breadth_m = [
{chr(10).join(rows)}
]
''' + BODY.format(drafts=drafts, kn_disp=kn_disp)
    return text


def main() -> int:
    OUT.write_text(geometry_text(), encoding="utf-8")
    print(f"wrote {OUT.relative_to(ROOT)}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
