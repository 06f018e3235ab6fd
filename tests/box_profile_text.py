"""A box-shaped vessel written as a profile file, every table from closed forms.

For the audit and booklet-condition tests, which need a *file* (to see file, line and key
in what ``deckload check`` prints) of any size.  Box L × B × D, table density 1.025 t/m³
(standards.md §6.1), analytic hydrostatics (checks.md §1.1, derived there):

    Δ = ρ·L·B·T,  LCB = LCF = L/2,  VCB = T/2,  KMt = T/2 + B²/(12·T),
    KML = T/2 + L²/(12·T),  TPC = ρ·L·B/100,  MCTC = Δ·BML/(100·L) = ρ·B·L²/1200,

KN from the exact section formulas in tests/vessel_factories.py (checks.md §1.2), and box
tanks l × b × h: V = l·b·s, centre fixed in x and y, VCG = bottom + s/2, i = l·b³/12.
The AP is the aft end of the box.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from vessel_factories import box_kn_m

RHO = 1.025


@dataclass(frozen=True)
class BoxTank:
    id: str
    x_m: tuple[float, float]
    y_m: tuple[float, float]
    z_m: tuple[float, float]
    kind: str = "ballast"
    density_t_m3: float = 1.025
    pair: str | None = None
    rows: int = 5

    @property
    def centre(self) -> tuple[float, float]:
        return (sum(self.x_m) / 2, sum(self.y_m) / 2)

    @property
    def l_b_h(self) -> tuple[float, float, float]:
        return (self.x_m[1] - self.x_m[0], self.y_m[1] - self.y_m[0], self.z_m[1] - self.z_m[0])


def _arr(xs) -> str:
    return "[" + ", ".join(repr(float(x)) for x in xs) + "]"


def box_profile_text(*, name: str, length_m: float, breadth_m: float, depth_m: float, drafts_m,
                     kn_drafts_m, heel_step_deg: float = 10.0, lightship=(100.0, None, 2.0),
                     tanks: tuple[BoxTank, ...] = (), extra: str = "") -> str:
    """The profile text.  ``lightship`` = (mass t, LCG from AP or None for L/2, VCG)."""
    L, B, D = length_m, breadth_m, depth_m
    T = [float(t) for t in drafts_m]
    disp = [RHO * L * B * t for t in T]
    heels = [heel_step_deg * k for k in range(int(round(90 / heel_step_deg)) + 1)]
    kn_rows = ["    " + _arr(box_kn_m(B, D, t, math.radians(h)) for h in heels) + "," for t in kn_drafts_m]
    mass, lcg, vcg = lightship
    out = [
        'format = "deckload-profile-1"', "",
        "[vessel]", f'name = "{name}"', f"lbp_m = {L!r}", f"breadth_m = {B!r}", f"depth_m = {D!r}",
        f"design_draft_m = {T[len(T) // 2]!r}", "table_density_t_m3 = 1.025", 'longitudinal_datum = "AP"', "",
        "[lightship]", f"mass_t = {mass!r}", f"lcg_m = {float(L / 2 if lcg is None else lcg)!r}",
        f"vcg_m = {vcg!r}", "tcg_m = 0.0", "",
        "[hydrostatics]",
        f"draft_m = {_arr(T)}",
        f"displacement_t = {_arr(disp)}",
        f"lcb_m = {_arr([L / 2] * len(T))}",
        f"lcf_m = {_arr([L / 2] * len(T))}",
        f"kmt_m = {_arr([t / 2 + B * B / (12 * t) for t in T])}",
        f"tpc_t_cm = {_arr([RHO * L * B / 100] * len(T))}",
        f"mctc_tm_cm = {_arr([RHO * B * L * L / 1200] * len(T))}",
        f"vcb_m = {_arr([t / 2 for t in T])}",
        f"kml_m = {_arr([t / 2 + L * L / (12 * t) for t in T])}", "",
        "[cross_curves]", 'trim_basis = "free trim"', f"heel_deg = {_arr(heels)}",
        f"displacement_t = {_arr([RHO * L * B * t for t in kn_drafts_m])}", "kn_m = [", *kn_rows, "]", "",
        "[[load_line]]", 'name = "summer"', f"draft_m = {T[len(T) // 2]!r}", "",
    ]
    for t in tanks:
        l, b, h = t.l_b_h
        s = [h * k / t.rows for k in range(t.rows + 1)]
        xc, yc = t.centre
        out += [
            "[[tank]]", f'id = "{t.id}"', f'name = "Tank {t.id}"', f'kind = "{t.kind}"',
            f"density_t_m3 = {t.density_t_m3!r}", f"capacity_m3 = {l * b * h!r}",
            *([f'pair = "{t.pair}"'] if t.pair else []), "",
            "  [tank.calibration]",
            f"  sounding_m = {_arr(s)}",
            f"  volume_m3 = {_arr([l * b * x for x in s])}",
            f"  lcg_m = {_arr([xc] * len(s))}",
            f"  vcg_m = {_arr([t.z_m[0] + x / 2 for x in s])}",
            f"  tcg_m = {_arr([yc] * len(s))}",
            f"  fsi_m4 = {_arr([l * b ** 3 / 12] * len(s))}", "",
        ]
    return "\n".join(out) + "\n" + extra


# A 22 m box "trawler" for the typing errors: L 22, B 6.5, D 3.0 m, tables 1.0–2.6 m.
FV22_TANKS = (
    BoxTank("AP1", (0.5, 2.5), (-2.0, 2.0), (0.5, 2.5), kind="fresh_water", density_t_m3=1.0),
    BoxTank("FO1P", (6.0, 10.0), (-3.0, -1.0), (0.0, 1.0), kind="fuel_oil", density_t_m3=0.85, pair="FO1S"),
    BoxTank("FO1S", (6.0, 10.0), (1.0, 3.0), (0.0, 1.0), kind="fuel_oil", density_t_m3=0.85, pair="FO1P"),
    BoxTank("FP", (19.5, 21.5), (-1.5, 1.5), (0.5, 2.5)),
)


def fv22_text(extra: str = "") -> str:
    return box_profile_text(
        name="FV-22 box trawler", length_m=22.0, breadth_m=6.5, depth_m=3.0,
        drafts_m=[1.0, 1.2, 1.4, 1.6, 1.8, 2.0, 2.2, 2.4, 2.6], kn_drafts_m=[1.0, 1.6, 2.2, 2.6],
        lightship=(150.0, 10.6, 2.4), tanks=FV22_TANKS, extra=extra,
    )
