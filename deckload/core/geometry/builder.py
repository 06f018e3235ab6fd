"""All of a vessel's tables from its geometry: the one entry point of the table builder.

Pure computation; progress is reported through an optional callback so that the
command line can print it (the core itself never writes anywhere).
"""

from __future__ import annotations

from typing import Callable

import numpy as np

from deckload.core.frozen import frozen
from deckload.core.geometry.body import Body, immerse
from deckload.core.geometry.cross_curves import (
    CrossCurveResult,
    cross_curves,
    immersion_angle,
)
from deckload.core.geometry.hull import compartment_body, hull_sections, offsets_at
from deckload.core.geometry.hydrostatics_calc import (
    UprightHydrostatics,
    upright_hydrostatics,
)
from deckload.core.geometry.sections import simpson_weights
from deckload.core.geometry.spec import DeckAreaSpec, Geometry, HoldSpec, TankSpec
from deckload.core.geometry.tanks import calibrate, fill_centroids, sounding_levels
from deckload.core.geometry.transfer import TransferTable, transfer_moments, worst_band
from deckload.core.geometry.windage import deck_edge_point, waterline_length_m, windage_above
from deckload.core.model import TankCalibration
from deckload.core.bounds import off_centre

Progress = Callable[[str], None]

TRANSFER_DECIMALS = 4
"""Decimals of m⁴ the transfer tables are written to (``deckload tables``)."""


@frozen(eq=False)
class TankTables:
    spec: TankSpec
    capacity_m3: float
    calibration: TankCalibration
    transfer: TransferTable
    worst_band_pct: tuple[float, float]
    integration: str
    """'simpson' or 'trapezoid' along the tank."""
    transfer_port_m4: np.ndarray | None = None
    """M heeled to port (toward port), for a tank without a pair whose liquid moves otherwise
    than to starboard or that lies off the centreline; None: the starboard table serves both
    ways (a centreline tank symmetric to the table's rounding) or the partner's does (a pair)."""


@frozen(eq=False)
class HoldTables:
    spec: HoldSpec
    capacity_m3: float
    lcg_m: float
    vcg_m: float
    tcg_m: float
    fill_pct: np.ndarray
    fill_lcg_m: np.ndarray
    fill_vcg_m: np.ndarray


@frozen
class DeckAreaTables:
    spec: DeckAreaSpec
    area_m2: float
    lcg_m: float
    tcg_m: float
    deck_height_m: float


@frozen(eq=False)
class Downflooding:
    opening: str
    """Name of the opening that governs (the lowest angle), per displacement joined by '/' if several."""
    displacement_t: np.ndarray
    angle_deg: np.ndarray


@frozen(eq=False)
class WindageTable:
    """Windage against draft (even keel) from the lateral profile, and Lwl from the offsets."""

    draft_m: np.ndarray
    lateral_area_m2: np.ndarray
    centroid_above_wl_m: np.ndarray
    waterline_length_m: np.ndarray


@frozen(eq=False)
class DeckEdge:
    """Heel (deg) at which the deck edge at midships reaches the water, per displacement."""

    displacement_t: np.ndarray
    angle_deg: np.ndarray


@frozen(eq=False)
class VesselTables:
    geometry: Geometry
    hydrostatics: UprightHydrostatics
    cross_curves: CrossCurveResult
    tanks: tuple[TankTables, ...]
    holds: tuple[HoldTables, ...]
    deck_areas: tuple[DeckAreaTables, ...]
    downflooding: Downflooding | None
    hull_rule: str
    """Integration rule along the hull stations: 'simpson' or 'trapezoid'."""
    windage: WindageTable | None = None
    deck_edge: DeckEdge | None = None


class TableRangeError(ValueError):
    """A requested table point lies outside what the hull can float at."""


def hull_body(geometry: Geometry) -> Body:
    y, z = hull_sections(geometry.hull)
    return Body(geometry.hull.station_x_m, y, z)


def tank_tables(spec: TankSpec, geometry: Geometry, heel_deg: np.ndarray) -> TankTables:
    body = compartment_body(spec.shape, geometry.hull)
    height = body.z_max_m - body.z_min_m
    cal = calibrate(body, sounding_levels(height, geometry.tables.sounding_step_m))
    step = geometry.tables.transfer_fill_step_pct
    fills = np.linspace(0.0, 100.0, int(round(100.0 / step)) + 1)
    tr = transfer_moments(body, fills, heel_deg)
    band = worst_band(body)
    port = None
    if spec.pair is None:
        # heeled to port the tank moves its liquid as its mirror image heeled to starboard, the
        # moment reversed: M'(f, φ) = −M(f, −φ) (derived, as worst_band takes it)
        port = -transfer_moments(body, fills, -np.asarray(heel_deg, dtype=float)).moment_m4
        port = np.where(port == 0.0, 0.0, port)  # no −0.0 in the written table
        if not off_centre(cal.tcg_m, geometry.vessel.breadth_m) and np.array_equal(np.round(port, TRANSFER_DECIMALS), np.round(tr.moment_m4, TRANSFER_DECIMALS)):
            port = None
    return TankTables(spec, float(cal.volume_m3[-1]), cal, tr, band, body.rule, port)


def hold_tables(spec: HoldSpec, geometry: Geometry) -> HoldTables:
    body = compartment_body(spec.shape, geometry.hull)
    fills = np.linspace(0.0, 100.0, 11)
    lcg, vcg, tcg, full = fill_centroids(body, fills)
    return HoldTables(spec, full, float(lcg[-1]), float(vcg[-1]), float(tcg[-1]), fills, lcg, vcg)


def deck_area_tables(spec: DeckAreaSpec, geometry: Geometry) -> DeckAreaTables:
    """Area, centroid and mean deck height of a deck rectangle trimmed to the deck edge.

    The deck edge half-breadth at x is the hull's half-breadth at the deck height there;
    integrated along x by Simpson's rule at spacing ≤ 0.1 m.
    """
    n = max(5, int(np.ceil((spec.x_to_m - spec.x_from_m) / 0.1)) + 1)
    n += 1 - n % 2
    xs = np.linspace(spec.x_from_m, spec.x_to_m, n)
    w, _ = simpson_weights(xs)
    width = np.zeros(n)
    mid = np.zeros(n)
    deck = np.zeros(n)
    for i, x in enumerate(xs):
        hb, dz = offsets_at(geometry.hull, float(x))
        half = float(np.interp(dz, geometry.hull.waterline_z_m, hb))
        lo, hi = max(spec.y_from_m, -half), min(spec.y_to_m, half)
        width[i] = max(0.0, hi - lo)
        mid[i] = 0.5 * (lo + hi)
        deck[i] = dz
    area = float(width @ w)
    if area <= 0.0:
        raise TableRangeError(f"deck area {spec.id} lies outside the deck")
    return DeckAreaTables(
        spec, area, float((width * xs) @ w / area), float((width * mid) @ w / area), float((width * deck) @ w / area)
    )


def build_tables(geometry: Geometry, progress: Progress | None = None) -> VesselTables:
    """Hydrostatics, cross curves, tank and hold tables and the downflooding angle."""
    say = progress or (lambda _msg: None)
    v = geometry.vessel
    ts = geometry.tables
    rho = v.table_density_t_m3
    body = hull_body(geometry)
    say(f"hydrostatics at {len(ts.draft_m)} drafts")
    hyd = upright_hydrostatics(body, ts.draft_m, rho, v.lbp_m, v.breadth_m)
    full_disp = float(immerse(body, 1.0, 0.0, float(np.min(geometry.hull.deck_z_m))).volume_m3) * rho
    if ts.kn_displacement_t[-1] > full_disp:
        raise TableRangeError(
            f"cross-curve displacement {ts.kn_displacement_t[-1]:g} t is more than the hull displaces "
            f"with the deck edge at the water ({full_disp:.1f} t)"
        )
    say(f"cross curves: {len(ts.kn_displacement_t)} displacements × {len(ts.kn_heel_deg)} heels ({ts.trim_basis})")
    cc = cross_curves(body, ts.kn_displacement_t, ts.kn_heel_deg, rho, ts.trim_basis, ts.trim_lcg_m, ts.trim_vcg_m)
    heel_tr = ts.transfer_heel_deg if ts.transfer_heel_deg is not None else ts.kn_heel_deg
    tanks = []
    for i, spec in enumerate(geometry.tanks):
        say(f"tank {i + 1}/{len(geometry.tanks)} {spec.id}")
        tanks.append(tank_tables(spec, geometry, heel_tr))
    holds = tuple(hold_tables(h, geometry) for h in geometry.holds)
    areas = tuple(deck_area_tables(a, geometry) for a in geometry.deck_areas)
    down = None
    if geometry.openings:
        say(f"downflooding angle for {len(geometry.openings)} opening(s)")
        angles = np.array([
            immersion_angle(body, ts.kn_displacement_t, rho, (o.x_m, o.y_m, o.z_m), ts.trim_basis,
                            ts.trim_lcg_m, ts.trim_vcg_m)
            for o in geometry.openings
        ])
        k = np.argmin(angles, axis=0)
        names = sorted({geometry.openings[int(i)].name for i in k})
        down = Downflooding(" / ".join(names), ts.kn_displacement_t, np.min(angles, axis=0))
    say("deck-edge immersion angle at midships")
    edge = deck_edge_point(geometry.hull, 0.5 * v.lbp_m)
    deck_edge = DeckEdge(ts.kn_displacement_t, immersion_angle(
        body, ts.kn_displacement_t, rho, edge, ts.trim_basis, ts.trim_lcg_m, ts.trim_vcg_m))
    wind = None
    if geometry.lateral_profile is not None:
        say("windage from the lateral profile")
        lp = geometry.lateral_profile
        rows = np.array([windage_above(lp.x_m, lp.z_m, float(d)) for d in ts.draft_m])
        lwl = np.array([waterline_length_m(geometry.hull, float(d)) for d in ts.draft_m])
        wind = WindageTable(ts.draft_m, rows[:, 0], rows[:, 1], lwl)
    return VesselTables(geometry, hyd, cc, tuple(tanks), holds, areas, down, body.rule, wind, deck_edge)
