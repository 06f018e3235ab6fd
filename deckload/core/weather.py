"""Severe wind and rolling: the weather criterion of IS Code 2008 Part A 2.3.

A pure module: numbers in, numbers out.  The procedure (standards.md §2.1, IS 2008
Part A 2.3.1 / A.749 3.2.2):

1. a steady beam wind gives the constant heeling lever
   ``lw1 = P·A·Z / (1000·g·Δ)`` (m); the ship settles at θ0, the first intercept of
   lw1 with the GZ curve.  θ0 must not exceed 16° or 80 % of the deck-edge immersion
   angle, whichever is less (IS 2008 A 2.3.1.2);
2. from θ0 the ship rolls to windward by ``θ1 = 109·k·X1·X2·√(r·s)`` degrees;
3. a gust gives the lever ``lw2 = 1.5·lw1`` (the 1.5 is from memory, standards.md §2.2);
4. area a lies between lw2 and the GZ curve from θ0 − θ1 up to the first intercept of
   lw2 with GZ; area b between GZ and lw2 from that intercept up to
   ``θ2 = min(θf, 50°, θc)``, θc the second intercept; b must be at least a
   (IS 2008 A 2.3.1.4, A.749 3.2.2.1.4).

Symbols (standards.md §2.2–2.3): P wind pressure (Pa), A projected lateral area above
the waterline (m²), Z from the centre of A to the centre of the underwater lateral
area, here approximately to half the mean draft (the half-draught option is marked
from memory), Δ displacement (t), g = 9.81 m/s² (value marked from memory);
B moulded breadth, d mean moulded draft, OG = KG − d (+ when G is above the
waterline), Cb block coefficient, Lwl waterline length, Ak total area of bilge keels
(or lateral projection of a bar keel, or the sum).

Angles to windward are negative.  The GZ curve on that side is the mirror of the
curve heeling the other way: GZ(−φ) = −GZ_other(φ).
"""

from __future__ import annotations

import math

import numpy as np

from deckload.core.frozen import frozen

G_M_S2 = 9.81
"""Gravity (m/s²) in the lever formula: standards.md §2.2, value marked from memory [M]."""

WIND_PRESSURE_PA = 504.0
"""P, IS 2008 Part A 2.3 / A.749 3.2.2.2 (standards.md §2.2 [C]; checks row 8)."""

GUST_FACTOR = 1.5
"""lw2 = 1.5·lw1: standards.md §2.2, the 1.5 factor is from memory [M]."""

THETA0_MAX_DEG = 16.0
DECK_EDGE_FRACTION = 0.8
"""θ0 ≤ min(16°, 0.8 × deck-edge immersion angle): IS 2008 A 2.3.1.2 (standards.md §2.1 [C])."""

THETA2_MAX_DEG = 50.0
"""θ2 = min(θf, 50°, θc): A.749 3.2.2.1 (standards.md §2.1 [C])."""

# Factor tables, standards.md §2.4.  EVERY ROW IS FROM MEMORY [M]: the tables are printed
# as images in the copies read (46 CFR Table 28.575 uses the same factors).  Linear
# interpolation; beyond the ends the end value is taken.
X1_TABLE: tuple[tuple[float, ...], tuple[float, ...]] = (
    (2.4, 2.5, 2.6, 2.7, 2.8, 2.9, 3.0, 3.1, 3.2, 3.3, 3.4, 3.5),
    (1.00, 0.98, 0.96, 0.95, 0.93, 0.91, 0.90, 0.88, 0.86, 0.84, 0.82, 0.80),
)
"""X1 against B/d — standards.md §2.4, [M] every row."""

X2_TABLE: tuple[tuple[float, ...], tuple[float, ...]] = (
    (0.45, 0.50, 0.55, 0.60, 0.65, 0.70),
    (0.75, 0.82, 0.89, 0.95, 0.97, 1.00),
)
"""X2 against Cb — standards.md §2.4, [M] every row."""

K_TABLE: tuple[tuple[float, ...], tuple[float, ...]] = (
    (0.0, 1.0, 1.5, 2.0, 2.5, 3.0, 3.5, 4.0),
    (1.00, 0.98, 0.95, 0.88, 0.79, 0.74, 0.72, 0.70),
)
"""k against Ak·100/(L·B) — standards.md §2.4, [M] every row."""

S_TABLE: tuple[tuple[float, ...], tuple[float, ...]] = (
    (6.0, 7.0, 8.0, 12.0, 14.0, 16.0, 18.0, 20.0),
    (0.100, 0.098, 0.093, 0.065, 0.053, 0.044, 0.038, 0.035),
)
"""s against roll period T (s) — standards.md §2.4, [M] every row."""

K_SHARP_BILGE = 0.7
"""k for a sharp-bilged ship (46 CFR 28.575, standards.md §2.3 [C]); 1.0 for round bilge, no keels."""

FISHING_PRESSURE_TABLE: tuple[tuple[float, ...], tuple[float, ...]] = (
    (1.0, 2.0, 3.0, 4.0, 5.0, 6.0),
    (316.0, 386.0, 429.0, 460.0, 485.0, 504.0),
)
"""Fishing vessels 24–45 m, IS 2008 Part B 2.1.4: P (Pa) against the height h (m) of the
centre of the lateral area above the waterline — standards.md §2.5, [M] every row;
interpolated linearly, the end values beyond the ends."""

VALIDITY_NOTE_LIMITS = {"b_over_d": 3.5, "kg_over_d": (-0.3, 0.5), "period_s": 20.0}
"""Range the tables were derived for (standards.md §2.3, [M]): B/d < 3.5, KG/d − 1 (= OG/d)
between −0.3 and 0.5, T < 20 s."""


def table_value(table: tuple[tuple[float, ...], tuple[float, ...]], x: float) -> float:
    """Linear interpolation in a factor table, end values beyond the ends (standards.md §2.4)."""
    xs, ys = table
    return float(np.interp(x, xs, ys))


def wind_lever_m(pressure_pa: float, area_m2: float, lever_z_m: float, displacement_t: float) -> float:
    """lw1 = P·A·Z/(1000·g·Δ) (m): IS 2008 A 2.3.2.2 [C formula]; checks row 9."""
    return pressure_pa * area_m2 * lever_z_m / (1000.0 * G_M_S2 * displacement_t)


def roll_coefficient_c(breadth_m: float, draft_m: float, lwl_m: float) -> float:
    """C = 0.373 + 0.023·(B/d) − 0.043·(Lwl/100) (standards.md §2.3; last term [M])."""
    return 0.373 + 0.023 * (breadth_m / draft_m) - 0.043 * (lwl_m / 100.0)


def roll_period_s(breadth_m: float, draft_m: float, lwl_m: float, gm_m: float) -> float:
    """T = 2·C·B/√GM (s), GM corrected for free surface (standards.md §2.3, 46 CFR 28.575 metric)."""
    return 2.0 * roll_coefficient_c(breadth_m, draft_m, lwl_m) * breadth_m / math.sqrt(gm_m)


def k_factor(bilge_keel_area_m2: float, lwl_m: float, breadth_m: float, sharp_bilged: bool = False) -> float:
    """k: 0.7 sharp bilge; 1.0 round bilge without keels; else the k table at Ak·100/(L·B)."""
    if sharp_bilged:
        return K_SHARP_BILGE
    if bilge_keel_area_m2 <= 0.0:
        return 1.0
    return table_value(K_TABLE, bilge_keel_area_m2 * 100.0 / (lwl_m * breadth_m))


def r_factor(kg_m: float, draft_m: float) -> float:
    """r = 0.73 + 0.6·OG/d, OG = KG − d (+ above the waterline); 46 CFR 28.575 [C]."""
    return 0.73 + 0.6 * (kg_m - draft_m) / draft_m


def roll_angle_deg(k: float, x1: float, x2: float, r: float, s: float) -> float:
    """θ1 = 109·k·X1·X2·√(r·s) (degrees), IS 2008 A 2.3.2.2 / 46 CFR 28.575(c) [C structure]."""
    return 109.0 * k * x1 * x2 * math.sqrt(max(r * s, 0.0))


def fishing_wind_pressure_pa(height_above_wl_m: float) -> float:
    """IS 2008 Part B 2.1.4 (fishing vessels 24–45 m): P from the height of the centre of A [M]."""
    return table_value(FISHING_PRESSURE_TABLE, height_above_wl_m)


@frozen
class RollInputs:
    """What the angle of roll θ1 of IS 2008 Part A 2.3 is computed from."""

    breadth_m: float
    draft_m: float
    """Mean moulded draft d (m)."""
    lwl_m: float
    block_coefficient: float
    kg_m: float
    gm_m: float
    """GM corrected for free surface (m), > 0."""
    bilge_keel_area_m2: float = 0.0
    sharp_bilged: bool = False


@frozen
class Roll:
    """The angle of roll θ1 and the factors it was computed with (IS 2008 Part A 2.3)."""

    period_s: float
    k: float
    x1: float
    x2: float
    r: float
    s: float
    theta1_deg: float
    outside_validity: tuple[str, ...]
    """Which of the tables' validity limits (standards.md §2.3 [M]) this ship is outside."""


def roll(inp: RollInputs) -> Roll:
    """θ1 and its factors for one condition (standards.md §2.3–2.4)."""
    t = roll_period_s(inp.breadth_m, inp.draft_m, inp.lwl_m, inp.gm_m)
    b_d = inp.breadth_m / inp.draft_m
    x1 = table_value(X1_TABLE, b_d)
    x2 = table_value(X2_TABLE, inp.block_coefficient)
    k = k_factor(inp.bilge_keel_area_m2, inp.lwl_m, inp.breadth_m, inp.sharp_bilged)
    r = r_factor(inp.kg_m, inp.draft_m)
    s = table_value(S_TABLE, t)
    out = []
    if b_d >= VALIDITY_NOTE_LIMITS["b_over_d"]:
        out.append(f"B/d {b_d:.2f} ≥ 3.5")
    og_d = inp.kg_m / inp.draft_m - 1.0
    lo, hi = VALIDITY_NOTE_LIMITS["kg_over_d"]
    if not lo <= og_d <= hi:
        out.append(f"OG/d {og_d:+.2f} outside −0.3…0.5")
    if t >= VALIDITY_NOTE_LIMITS["period_s"]:
        out.append(f"T {t:.1f} s ≥ 20 s")
    return Roll(t, k, x1, x2, r, s, roll_angle_deg(k, x1, x2, r, s), tuple(out))


# --------------------------------------------------------------------------- the curve


@frozen
class Curve:
    """A GZ curve over −end…+end degrees: + towards the heel side, − to windward."""

    heel_deg: np.ndarray
    gz_m: np.ndarray

    @staticmethod
    def from_sides(heel_deg: np.ndarray, gz_lee_m: np.ndarray, gz_windward_m: np.ndarray) -> "Curve":
        """Join the curve heeling to leeward (the side checked) with the mirror of the other side.

        Heeling to windward by φ the righting lever is −GZ_windward(φ), GZ_windward being the
        curve for heel towards the windward side, so GZ(−φ) = −GZ_windward(φ)."""
        h = np.asarray(heel_deg, dtype=float)
        neg = -h[:0:-1]
        return Curve(np.concatenate([neg, h]),
                     np.concatenate([-np.asarray(gz_windward_m, dtype=float)[:0:-1], np.asarray(gz_lee_m, dtype=float)]))

    def at(self, angle_deg: float) -> float:
        return float(np.interp(angle_deg, self.heel_deg, self.gz_m))

    def _crossings(self, lever_m: float, rising: bool) -> np.ndarray:
        """Every angle where GZ − lever changes sign (rising: from below to above), in order,
        interpolated linearly between the curve's points."""
        d = self.gz_m - lever_m
        a, b = d[:-1], d[1:]
        idx = np.flatnonzero((a < 0.0) & (b >= 0.0) if rising else (a > 0.0) & (b <= 0.0))
        h0, h1 = self.heel_deg[idx], self.heel_deg[idx + 1]
        return h0 + (h1 - h0) * (-a[idx]) / (b[idx] - a[idx])

    def crossing(self, lever_m: float, start_deg: float, rising: bool) -> float | None:
        """First angle ≥ start where GZ − lever changes sign (rising: from below to above)."""
        x = self._crossings(lever_m, rising)
        ok = np.flatnonzero(x >= start_deg - 1e-12)
        return float(x[ok[0]]) if len(ok) else None

    def last_below(self, lever_m: float, end_deg: float, rising: bool) -> float | None:
        """Largest angle ≤ end where GZ − lever changes sign (searching towards windward): rising,
        an equilibrium under the lever; falling, to windward of it GZ exceeds the lever again."""
        x = self._crossings(lever_m, rising)
        ok = np.flatnonzero(x <= end_deg + 1e-12)
        return float(x[ok[-1]]) if len(ok) else None

    def area_between(self, lever_m: float, lo_deg: float, hi_deg: float) -> float:
        """∫ (GZ − lever) dφ from lo to hi (m·rad), trapezoidal on the curve's grid (exact ends)."""
        if hi_deg <= lo_deg:
            return 0.0
        inside = (self.heel_deg > lo_deg) & (self.heel_deg < hi_deg)
        x = np.concatenate([[lo_deg], self.heel_deg[inside], [hi_deg]])
        y = np.interp(x, self.heel_deg, self.gz_m) - lever_m
        return float(np.sum((y[1:] + y[:-1]) * 0.5 * np.radians(np.diff(x))))


@frozen
class WeatherFacts:
    """The weather criterion's levers, angles and areas for one condition (IS 2008 Part A 2.3)."""

    lw1_m: float
    lw2_m: float
    theta0_deg: float | None
    """None when GZ never reaches lw1: the steady wind alone overturns her."""
    theta_r_deg: float | None
    """First intercept of lw2 with GZ (end of area a, start of area b)."""
    theta_c_deg: float | None
    theta2_deg: float | None
    area_a_mrad: float | None
    area_b_mrad: float | None
    windward_deg: float | None = None
    """Where the roll to windward θ0 − θ1 passes the windward intercept of lw2 with GZ, that
    intercept (deg, negative): beyond it GZ exceeds lw2, so the gust no longer brings her back and
    she heels on to windward; area a, taken as ∫(lw2 − GZ), is then partly negative and means
    nothing.  None when the roll stays inside it (the usual case)."""


def weather_areas(curve: Curve, lw1_m: float, theta1_deg: float | None, flood_deg: float | None,
                  end_deg: float = 90.0) -> WeatherFacts:
    """θ0, the intercepts of lw2 and the areas a and b on a GZ curve (standards.md §2.1).

    θ0 is the equilibrium nearest upright under lw1: where GZ rises through lw1, looked for
    from 0° to leeward; when GZ at 0° already exceeds lw1 (a list to windward larger than the
    wind heel) it lies to windward, the last rising crossing below 0°.  ``theta1_deg`` None
    (roll not computable) leaves the intercepts and areas None.  Areas in m·rad."""
    lw2 = GUST_FACTOR * lw1_m
    lo = float(curve.heel_deg[0])
    if curve.at(0.0) < lw1_m:
        theta0 = curve.crossing(lw1_m, 0.0, rising=True)
    else:
        theta0 = curve.last_below(lw1_m, 0.0, rising=True)
    if theta0 is None:
        return WeatherFacts(lw1_m, lw2, None, None, None, None, None, None)
    if theta1_deg is None:
        return WeatherFacts(lw1_m, lw2, theta0, None, None, None, None, None)
    start = max(theta0 - theta1_deg, lo)
    theta_r = curve.crossing(lw2, theta0, rising=True)
    if theta_r is None:
        # GZ never reaches the gust lever: nothing to the right of a, area b is nil.
        area_a = -curve.area_between(lw2, start, end_deg)
        return WeatherFacts(lw1_m, lw2, theta0, None, None, None, area_a, 0.0)
    theta_c = curve.crossing(lw2, theta_r + 1e-9, rising=False)
    top = min(THETA2_MAX_DEG, end_deg)
    if flood_deg is not None:
        top = min(top, flood_deg)
    if theta_c is not None:
        top = min(top, theta_c)
    area_a = -curve.area_between(lw2, start, theta_r) if theta_r > start else 0.0
    area_b = curve.area_between(lw2, theta_r, top) if top > theta_r else 0.0
    # Rolled back to θ0 − θ1 and struck by the gust there, she returns only while lw2 exceeds GZ
    # (the righting lever to windward is negative); past the windward intercept GZ − lw2 > 0 drives
    # her on to windward: the energy balance of areas a and b no longer describes her.
    windward = curve.last_below(lw2, theta0, rising=False)
    beyond = windward if windward is not None and start < windward - 1e-9 else None
    return WeatherFacts(lw1_m, lw2, theta0, theta_r, theta_c, top, area_a, area_b, beyond)
