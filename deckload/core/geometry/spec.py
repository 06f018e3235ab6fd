"""The validated, immutable geometry model: what ``deckload.io.geometry_files`` builds from a
geometry file and what the table builder consumes.

Coordinates as everywhere in deckload: x from the aft perpendicular (+ forward),
y from the centreline (+ starboard), z above the keel (baseline); metres.
"""

from __future__ import annotations

import numpy as np

from deckload.core.frozen import frozen

COMPARTMENT_SHAPES = ("box", "prism", "hull")
"""How a tank or hold is described: a box; a prism (one section polygon over a
length); or the inside of the hull between planes x, y and z."""


@frozen
class VesselSpec:
    name: str
    """Vessel name (copied into a new profile only)."""
    lbp_m: float
    """Length between perpendiculars (m); the FP is at x = lbp_m."""
    breadth_m: float
    """Moulded breadth (m)."""
    depth_m: float
    """Moulded depth to the weather deck at side, amidships (m)."""
    design_draft_m: float
    """Design (summer) draft (m)."""
    table_density_t_m3: float = 1.025
    """Water density for the hydrostatic and cross-curve tables (t/m³)."""


@frozen(eq=False)
class HullOffsets:
    """Offset table of a hull symmetric about the centreline.

    ``half_breadth_m[i, j]`` is the half-breadth at station ``station_x_m[i]`` and
    waterline ``waterline_z_m[j]``.  The section between waterlines is a straight
    line (the polygon the offsets define); between stations each offset varies
    linearly.  Each section is closed by a flat weather deck at ``deck_z_m[i]``.
    """

    station_x_m: np.ndarray
    """Station positions from AP, + forward (m), strictly increasing."""
    waterline_z_m: np.ndarray
    """Waterline heights above keel (m), strictly increasing, from the lowest point of the hull."""
    half_breadth_m: np.ndarray
    """Half-breadths (m), shape (stations, waterlines), ≥ 0."""
    deck_z_m: np.ndarray
    """Height of the weather deck at side at each station (m)."""


@frozen(eq=False)
class CompartmentShape:
    """Where a compartment is.  ``shape`` is one of :data:`COMPARTMENT_SHAPES`."""

    shape: str
    x_from_m: float
    """Aft end (m from AP)."""
    x_to_m: float
    """Forward end (m from AP)."""
    y_from_m: float = 0.0
    """Port limit (m, + starboard); box and hull shapes."""
    y_to_m: float = 0.0
    """Starboard limit (m); box and hull shapes."""
    z_from_m: float = 0.0
    """Lower limit above keel (m); box and hull shapes."""
    z_to_m: float = 0.0
    """Upper limit above keel (m); box and hull shapes."""
    section_y_m: np.ndarray | None = None
    """Prism: section polygon y (m), counter-clockwise seen from aft."""
    section_z_m: np.ndarray | None = None
    """Prism: section polygon z (m)."""


@frozen(eq=False)
class TankSpec:
    id: str
    name: str
    kind: str
    density_t_m3: float
    shape: CompartmentShape
    pair: str | None = None
    fs_category: str | None = None
    """'fixed' or 'variable' when given in the geometry file; else the profile default."""


@frozen(eq=False)
class HoldSpec:
    id: str
    name: str
    shape: CompartmentShape
    max_mass_t: float | None = None


@frozen
class DeckAreaSpec:
    """A rectangle on the weather deck, trimmed to the deck edge."""

    id: str
    name: str
    x_from_m: float
    x_to_m: float
    y_from_m: float
    y_to_m: float
    max_load_t_m2: float | None = None


@frozen
class OpeningSpec:
    """An unprotected opening (e.g. an engine-room vent) for the downflooding angle."""

    name: str
    x_m: float
    y_m: float
    """+ starboard; heel is taken towards the side the opening is on."""
    z_m: float


@frozen(eq=False)
class TableSpec:
    """Which tables to make."""

    draft_m: np.ndarray
    """Drafts of the hydrostatic table (m), strictly increasing."""
    kn_displacement_t: np.ndarray
    """Displacements of the cross curves (t), strictly increasing."""
    kn_heel_deg: np.ndarray
    """Heels of the cross curves (deg), from 0, strictly increasing, ≤ 90."""
    trim_basis: str = "free trim"
    """'free trim' (B in line with the reference centre below) or 'even keel'."""
    trim_lcg_m: float = 0.0
    """Free trim: LCG the centre of buoyancy is kept in line with (m from AP)."""
    trim_vcg_m: float = 0.0
    """Free trim: VCG of that centre (m); enters only through the trim angle."""
    sounding_step_m: float = 0.1
    """Largest step between calibration soundings (m)."""
    transfer_fill_step_pct: float = 5.0
    """Fill step of the fluid-transfer tables (%)."""
    transfer_heel_deg: np.ndarray | None = None
    """Heels of the fluid-transfer tables (deg); defaults to the cross-curve heels."""


@frozen(eq=False)
class LateralProfile:
    """The vessel's outline seen from the side (hull, bulwarks, superstructures), for windage."""

    x_m: np.ndarray
    """Outline x (m from AP), a closed polygon (the last point joins the first)."""
    z_m: np.ndarray
    """Outline z (m above keel)."""


@frozen(eq=False)
class Geometry:
    """A whole geometry file, validated."""

    vessel: VesselSpec
    hull: HullOffsets
    tables: TableSpec
    tanks: tuple[TankSpec, ...] = ()
    holds: tuple[HoldSpec, ...] = ()
    deck_areas: tuple[DeckAreaSpec, ...] = ()
    openings: tuple[OpeningSpec, ...] = ()
    lateral_profile: LateralProfile | None = None
    """Outline for the windage table of the weather criterion; None when not given."""
