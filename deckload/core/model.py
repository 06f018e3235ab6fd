"""The validated, immutable vessel model and loading condition.

Conventions used throughout deckload (SI inside; degrees only at the edges):

* x (``lcg_m``, ``lcb_m``, ``lcf_m``): metres from the aft perpendicular, positive forward;
* y (``tcg_m``): metres from the centreline, positive to starboard;
* z (``vcg_m``, ``kg_m``): metres above the keel (baseline);
* trim: metres, positive by the stern (draft aft minus draft forward);
* heel and list: positive to starboard;
* masses in tonnes, densities in t/m³, free-surface moments in t·m, inertias in m⁴.

Everything here is a frozen dataclass.  The profile loader (``deckload.io.profiles``)
builds these objects only after validating every field, so the computation may
trust, for example, that every table's abscissa is strictly increasing.  An edit
to a condition builds a new :class:`Condition` (see its ``with_*`` methods).
"""

from __future__ import annotations

import dataclasses
from dataclasses import field
from typing import Literal

import numpy as np

from deckload.core.frozen import frozen
from deckload.core.geometry.body import Body

# --------------------------------------------------------------------------- kinds

LIQUID_KINDS: tuple[str, ...] = (
    "fuel_oil",
    "diesel",
    "lube_oil",
    "fresh_water",
    "ballast",
    "cargo_liquid",
    "other",
)
"""Liquid kinds a tank may hold.  The first four are consumables."""

USUAL_MAX_PCT: dict[str, float] = {
    "fuel_oil": 95.0,
    "diesel": 95.0,
    "lube_oil": 95.0,
    "fresh_water": 100.0,
    "ballast": 100.0,
    "cargo_liquid": 98.0,
    "other": 100.0,
}
"""The fill a tank of each kind is usually taken to (key f on the loading screen) when the profile
gives none in ``[usual_fill]``: oils to 95 % for expansion room, cargo liquids to 98 % (common
practice); water and ballast pressed full."""

CONSUMABLE_KINDS: frozenset[str] = frozenset({"fuel_oil", "diesel", "lube_oil", "fresh_water"})
"""Consumables: the IS Code 2008 Part B 3.1.3 'variable filling level' liquids."""

FILL_QUANTITIES: tuple[str, ...] = ("percent", "volume_m3", "mass_t", "sounding_m", "ullage_m")
"""The ways a watchkeeper may state a tank's contents: exactly one per tank.  A sounding is
read from the tank's sounding zero, an ullage from its ullage reference point (see :class:`Tank`)."""

LEVEL_QUANTITIES: frozenset[str] = frozenset({"sounding_m", "ullage_m"})
"""Quantities read as a level: refused for a tank known only by capacity and centre."""

FsCategory = Literal["fixed", "variable"]
FsRule = Literal["is2008", "actual"]
GzCorrection = Literal["constant", "transfer"]


def frozen_array(a) -> np.ndarray:
    """A read-only float array, so that tables inside frozen dataclasses stay unchanged."""
    arr = np.array(a, dtype=float)
    arr.setflags(write=False)
    return arr


# --------------------------------------------------------------------------- vessel


@frozen
class Particulars:
    """The vessel's main particulars, as the stability booklet gives them."""

    name: str
    """The vessel's name as shown on screens and reports."""
    lbp_m: float
    """Length between perpendiculars (m)."""
    breadth_m: float
    """Moulded breadth (m)."""
    depth_m: float
    """Moulded depth to the weather deck at side (m)."""
    design_draft_m: float
    """Design (summer) moulded draft (m)."""
    table_density_t_m3: float = 1.025
    """Water density the hydrostatic and cross-curve tables were made for (t/m³)."""
    longitudinal_datum: str = "aft perpendicular, positive forward"
    """How the profile's x coordinates were written (informative): the model's x are always
    from the AP, + forward, converted on load."""
    vessel_type: str = ""
    """Free text: the kind of vessel (e.g. 'coastal island-supply vessel')."""
    remark: str = ""
    """Free text shown on reports."""
    keel_thickness_m: float = 0.0
    """Extreme draft minus moulded draft (m); 0 when the booklet does not give it."""
    length_ll_m: float | None = None
    """The length L of the IS Code (its thresholds of 24, 45 and 70 m): the Load Line length of
    ICLL Annex I reg. 3 (m); None when not given, and LBP is then taken
    (:func:`deckload.core.criteria.code_length_m`)."""


@frozen
class MassItem:
    """A mass with its centre of gravity."""

    name: str
    """What the mass is."""
    mass_t: float
    """Mass (t)."""
    lcg_m: float
    """Longitudinal centre of gravity from AP, + forward (m)."""
    vcg_m: float
    """Vertical centre of gravity above keel (m)."""
    tcg_m: float = 0.0
    """Transverse centre of gravity from centreline, + starboard (m)."""


@frozen(eq=False)
class HydrostaticTable:
    """Upright hydrostatics at even keel, one row per mean draft, at the table density."""

    draft_m: np.ndarray
    """Mean moulded draft at even keel (m), strictly increasing."""
    displacement_t: np.ndarray
    """Displacement at the table density (t), strictly increasing."""
    lcb_m: np.ndarray
    """Longitudinal centre of buoyancy from AP (m)."""
    lcf_m: np.ndarray
    """Longitudinal centre of flotation from AP (m)."""
    kmt_m: np.ndarray
    """Transverse metacentre above keel (m)."""
    tpc_t_cm: np.ndarray
    """Tonnes per centimetre immersion at the table density (t/cm)."""
    mctc_tm_cm: np.ndarray
    """Moment to change trim one centimetre at the table density (t·m/cm)."""
    vcb_m: np.ndarray | None = None
    """Vertical centre of buoyancy above keel (m); optional."""
    kml_m: np.ndarray | None = None
    """Longitudinal metacentre above keel (m); optional."""

    def columns(self) -> dict[str, np.ndarray]:
        return {f.name: getattr(self, f.name) for f in dataclasses.fields(self) if getattr(self, f.name) is not None}


@frozen(eq=False)
class CrossCurves:
    """KN cross curves: KN (m) against displacement and heel, at the table density."""

    heel_deg: np.ndarray
    """Heel angles (degrees), strictly increasing, starting at 0, ending at ≤ 90."""
    displacement_t: np.ndarray
    """Displacements (t) at the table density, strictly increasing."""
    kn_m: np.ndarray
    """KN (m), shape (len(displacement_t), len(heel_deg))."""
    trim_basis: str = "free trim"
    """How trim was treated when the curves were made: 'free trim' or 'even keel'."""
    reference_lcg_m: float | None = None
    """Free trim: the LCG (m from AP) the curves were made for (B kept in line with it); None if not stated."""


@frozen(eq=False)
class TrimmedTables:
    """Hydrostatics and KN at several trims, as booklets print them (``[[hydrostatics_at_trim]]``,
    ``[[cross_curves_at_trim]]``).

    Trim in metres, + by the stern (draft aft − draft forward), as everywhere in the model.
    The even-keel ``Vessel.hydrostatics`` / ``Vessel.cross_curves`` are the tables at trim 0 and
    are included here in their place, so ``hydro_trim_m`` and ``kn_trim_m`` each contain 0.
    In a trimmed hydrostatic table ``draft_m`` is the mean moulded draft at midships
    ((T_aft + T_fwd)/2 at the perpendiculars), which is the even-keel draft at trim 0.
    Each KN table is for the vessel floating at that trim when upright (the booklet convention),
    on the basis ``Vessel.cross_curves.trim_basis`` states, with the even-keel table's heels.
    """

    hydro_trim_m: np.ndarray
    """Trims of the hydrostatic tables (m), strictly increasing, one of them 0."""
    hydrostatics: tuple["HydrostaticTable", ...]
    """One table per trim of ``hydro_trim_m``."""
    kn_trim_m: np.ndarray
    """Trims of the KN tables (m), strictly increasing, one of them 0."""
    cross_curves: tuple["CrossCurves", ...]
    """One table per trim of ``kn_trim_m``."""


@frozen(eq=False)
class TrimCorrection:
    """A booklet's trim-correction columns for a tank's soundings (``[tank.trim_correction]``).

    ``value[i, j]`` belongs to the sounding ``sounding_m[i]`` read at the pipe (from the tank's
    sounding zero, as read on board) with the ship trimmed ``trim_m[j]`` (m, + by the stern).
    ``kind`` says what it is: ``"sounding_correction_m"`` — add it to the observed sounding to
    get the even-keel sounding of the same volume; ``"volume_m3"`` — the volume in the tank.
    Trim 0 is the calibration itself (correction 0) and is not a column.
    """

    trim_m: np.ndarray
    """Trims of the columns (m), strictly increasing, none 0."""
    sounding_m: np.ndarray
    """Observed soundings (m) from the sounding zero, strictly increasing."""
    value: np.ndarray
    """Shape (len(sounding_m), len(trim_m))."""
    kind: str
    """'sounding_correction_m' or 'volume_m3'."""


@frozen(eq=False)
class TankCalibration:
    """A tank's calibration table by sounding (from the tank bottom)."""

    sounding_m: np.ndarray
    """Level of the liquid above the lowest point of the tank (m), strictly increasing, from 0.
    (A sounding or ullage reading is turned into this level with the tank's
    ``sounding_zero_m`` / ``ullage_reference_m``.)  For a tank known only by capacity and
    centre (``Tank.level_known`` False) there is no level: this column is then the volume
    fraction 0…1 and is never shown."""
    volume_m3: np.ndarray
    """Volume at that sounding (m³), strictly increasing."""
    lcg_m: np.ndarray
    """Centroid of the contents, from AP (m)."""
    vcg_m: np.ndarray
    """Centroid of the contents above keel (m)."""
    tcg_m: np.ndarray
    """Centroid of the contents from centreline, + starboard (m)."""
    fsi_m4: np.ndarray
    """Transverse second moment of the free surface about its own centroid (m⁴)."""

    def stacked(self) -> np.ndarray:
        """Columns (sounding, volume, lcg, vcg, tcg, fsi) as one (n, 6) array."""
        return np.column_stack(
            [self.sounding_m, self.volume_m3, self.lcg_m, self.vcg_m, self.tcg_m, self.fsi_m4]
        )


@frozen(eq=False)
class FluidTransfer:
    """Actual moment of fluid transfer of a tank, from its geometry.

    ``moment_m4[j, k]`` is the volumetric heeling moment M (m⁴) at fill
    ``fill_pct[j]`` and heel ``heel_deg[k]``: the liquid's volume times the
    horizontal shift of its centroid, measured normal to gravity, relative to the
    upright centroid (checks.md §3.2 definition).  The heeling moment is ρ·M (t·m).
    """

    fill_pct: np.ndarray
    """Fill (% of capacity), strictly increasing from 0 to 100."""
    heel_deg: np.ndarray
    """Heel angles (degrees), strictly increasing from 0."""
    moment_m4: np.ndarray
    """Volumetric transfer moment (m⁴), shape (len(fill_pct), len(heel_deg))."""
    moment_port_m4: np.ndarray | None = None
    """The same heeled to port, the moment taken toward port (m⁴), same shape; None when the tank
    is taken as symmetric about its own centre plane (heeled to port it then moves its liquid as
    heeled to starboard) or, in a pair, as the mirror image of its partner."""


@frozen(eq=False)
class Tank:
    """A tank: its liquid, capacity, centres and calibration (sounding) table, and how its free surface is found."""

    id: str
    """Short unique identifier typed by the user, e.g. 'DB2P'."""
    name: str
    """Descriptive name."""
    kind: str
    """Liquid kind, one of :data:`LIQUID_KINDS`."""
    density_t_m3: float
    """Default density of the contents (t/m³)."""
    capacity_m3: float
    """Volume at 100 % (m³): the last calibration volume, or that volume ÷ (``table_top_pct``/100)
    where the booklet's table stops short of full."""
    calibration: TankCalibration
    """Calibration table by sounding."""
    pair: str | None = None
    """Id of the transverse partner tank, if this tank is one of a port/starboard pair."""
    fs_category: FsCategory = "fixed"
    """IS 2008 Part B 3.1.3: 'fixed' level (use actual) or 'variable' level (use max)."""
    transfer: FluidTransfer | None = None
    """Actual moment of fluid transfer, when the tank's geometry is known."""
    worst_band_pct: tuple[float, float] = (40.0, 60.0)
    """Fill band (%) in which the heeling moment at 30° is within 10 % of its maximum."""
    sounding_zero_m: float = 0.0
    """Height of the sounding zero above the tank's lowest point (m): level = sounding + this."""
    ullage_reference_m: float | None = None
    """Height of the ullage reference point above the tank's lowest point (m):
    level = this − ullage.  None: the tank cannot be stated by ullage."""
    level_known: bool = True
    """False for a tank known only by capacity and centre: no sounding or ullage, centre fixed."""
    trim_correction: TrimCorrection | None = None
    """The booklet's trim-correction columns for soundings, if the profile gives them."""
    fsi_given: str = "table"
    """Where ``calibration.fsi_m4`` comes from: 'table' (per row, as given), 'max' (one
    maximum value per tank, used at every level) or 'none' (no free surface given: nil)."""
    table_top_pct: float = 100.0
    """The fill (% of ``capacity_m3``) of the calibration table's last row: 100, or less where the
    booklet prints the table only to 98 % of the tank (common practice for fuel tanks).  Fills
    are percent of the whole tank, so the 98 % 'nominally full' line (IS 2008 B 3.1.2) falls where
    it does in the tank, and no fill above the table's top can be stated (:attr:`fill_limit_m3`)."""
    max_fsi_m4: float = field(init=False)
    """Largest free-surface inertia over the calibration (m⁴); derived."""
    table: np.ndarray = field(init=False, repr=False)
    """Calibration as one (n, 6) array: sounding, volume, lcg, vcg, tcg, fsi; derived."""

    def __post_init__(self) -> None:
        object.__setattr__(self, "max_fsi_m4", float(np.max(self.calibration.fsi_m4)))
        table = self.calibration.stacked()
        table.setflags(write=False)
        object.__setattr__(self, "table", table)

    @property
    def is_consumable(self) -> bool:
        return self.kind in CONSUMABLE_KINDS

    @property
    def short_table(self) -> bool:
        """True when the calibration table stops short of the full tank (``table_top_pct`` < 100)."""
        return self.table_top_pct < 100.0

    @property
    def fill_limit_m3(self) -> float:
        """The most the tank can be stated to hold (m³): its capacity, or the top of a table that
        stops short of full (nothing above a table's last row can be read from it)."""
        return float(self.table[-1, 1]) if self.short_table else self.capacity_m3

    @property
    def fill_limit_words(self) -> str:
        """The limit of :attr:`fill_limit_m3` in words, for messages."""
        if self.short_table:
            return (f"the top of its table, {self.fill_limit_m3:.2f} m³ ({self.table_top_pct:g} % of its "
                    f"capacity {self.capacity_m3:.2f} m³)")
        return f"its capacity of {self.capacity_m3:.2f} m³"


@frozen(eq=False)
class Hold:
    """A cargo hold: capacity, centroid (or centroid against fill) and mass limit."""

    id: str
    """Short unique identifier, e.g. 'H1'."""
    name: str
    """Descriptive name."""
    capacity_m3: float
    """Grain/bale capacity (m³)."""
    lcg_m: float
    """Centroid of the full hold from AP (m)."""
    vcg_m: float
    """Centroid of the full hold above keel (m)."""
    tcg_m: float = 0.0
    """Centroid of the full hold from centreline (m)."""
    max_mass_t: float | None = None
    """Structural limit of cargo mass (t), if the booklet gives one."""
    fill_pct: np.ndarray | None = None
    """Optional: fill (% of capacity) for a centroid-against-fill table."""
    fill_vcg_m: np.ndarray | None = None
    """Optional: VCG (m) of cargo filling the hold to each ``fill_pct``."""
    fill_lcg_m: np.ndarray | None = None
    """Optional: LCG (m) of cargo filling the hold to each ``fill_pct``."""
    x_extent_m: tuple[float, float] | None = None
    """Optional: the hold's aft and forward ends (m from AP, aft first): a cargo centre stated in a
    condition must lie between them (:func:`deckload.core.bounds.off_span_x`)."""


@frozen
class DeckArea:
    """An area of deck that takes deck cargo: its extent, height and permissible load."""

    id: str
    """Short unique identifier, e.g. 'AFTDECK'."""
    name: str
    """Descriptive name."""
    area_m2: float
    """Usable area (m²)."""
    lcg_m: float
    """Centroid of the area from AP (m)."""
    deck_height_m: float
    """Height of the deck surface above keel (m)."""
    tcg_m: float = 0.0
    """Centroid of the area from centreline (m)."""
    max_load_t_m2: float | None = None
    """Permissible uniform deck load (t/m²)."""
    x_extent_m: tuple[float, float] | None = None
    """Its aft and forward ends from AP (m), where the profile gives them (``x_m``): a deck load
    standing on the area has its centre between them."""
    y_extent_m: tuple[float, float] | None = None
    """Its port and starboard edges from the centreline (m, + starboard), where given (``y_m``)."""


@frozen
class LoadLine:
    """A load-line mark and the draft it stands for."""

    name: str
    """Mark name, e.g. 'summer', 'tropical', 'winter', 'fresh'."""
    draft_m: float
    """Moulded draft at midships that the mark stands for, in sea water (m)."""


@frozen(eq=False)
class LimitCurve:
    """A curve against displacement: maximum KG (or minimum GM) or downflooding angle."""

    displacement_t: np.ndarray
    """Displacement (t), strictly increasing."""
    value: np.ndarray
    """The limit at each displacement (m, or degrees for a downflooding angle)."""
    kind: str
    """'max_kg_m', 'min_gm_m' or 'downflooding_deg'."""
    trim_range_m: tuple[float, float] | None = None
    """A limiting KG/GM curve's operating trims (m, + by the stern, from below to), as the booklet
    states them; None when the profile does not say (the curve is then judged at any trim)."""


SHIP_TYPES: tuple[str, ...] = ("general", "fishing", "passenger", "offshore_supply")
"""Vessel types that choose the criteria sets (see :data:`deckload.core.criteria.SETS_BY_TYPE`)."""

EXTRA_KINDS: tuple[str, ...] = (
    "min_gm", "min_area", "min_gz_at", "min_max_gz", "min_angle_max_gz",
    "min_range", "max_static_heel", "max_wind_heel",
)
"""What a flag-State or class criterion written in the profile may measure."""


@frozen
class ExtraCriterion:
    """A flag-State or class criterion written in the profile as data (no code change needed)."""

    kind: str
    """One of :data:`EXTRA_KINDS`: min_gm (GM0 fluid, m), min_area (area under GZ between
    ``from_deg`` and ``to_deg``, m·rad), min_gz_at (GZ at ``at_deg``, m), min_max_gz (m),
    min_angle_max_gz (deg), min_range (range of positive stability, deg), max_static_heel
    (the list, deg), max_wind_heel (θ0 under the steady wind lw1 of Part A 2.3, deg)."""
    limit: float
    """The limit in the kind's unit."""
    source: str
    """Where the rule comes from, e.g. 'Flag State notice 4/2021 para 3'."""
    from_deg: float = 0.0
    to_deg: float = 0.0
    at_deg: float = 0.0


@frozen
class PassengerData:
    """Inputs of the passenger-ship heel criteria, IS 2008 Part A 3.1."""

    count: int
    """Number of passengers."""
    mass_per_person_t: float
    """Mass of one passenger (t); 0.075 t (A.749 3.5.2.6), not below 0.060 t."""
    standing_area_m2: float
    """Deck area on one side where passengers may crowd (m²)."""
    standing_tcg_m: float
    """Distance of the centroid of that area from the centreline (m)."""
    service_speed_kn: float
    """Service speed (knots) for the heel when turning."""
    standing_outboard_m: float | None = None
    """Distance of the area's outboard edge from the centreline (m); None: the ship's side (B/2).
    Passengers too few to fill the area crowd its outboard part (:func:`crowding_tcg_m`)."""


@frozen(eq=False)
class Windage:
    """Lateral windage against draft (even keel), for the weather criterion of IS 2008 Part A 2.3."""

    draft_m: np.ndarray
    """Mean moulded draft (m), strictly increasing."""
    lateral_area_m2: np.ndarray
    """A: projected lateral area of hull and superstructure above the waterline (m²)."""
    centroid_above_wl_m: np.ndarray
    """Height of the centre of A above the waterline (m)."""
    waterline_length_m: np.ndarray
    """Lwl: length of the waterline (m)."""


@frozen
class SoundingPipe:
    """Where a tank's sounding is read (the pipe's foot), for soundings taken trimmed or listed."""

    x_m: float
    """From AP, + forward (m)."""
    y_m: float
    """From the centreline, + starboard (m)."""


@frozen
class DraftMark:
    """Where one set of draft marks is cut in the shell, port and starboard alike."""

    x_m: float
    """Position of the marks from AP, + forward (m)."""
    y_m: float
    """Distance of the marks from the centreline (m): the starboard marks at +y, the port at −y."""


@frozen
class DraftMarks:
    """The draft marks aft, amidships and forward; they read from the underside of the keel
    (moulded draft + ``Particulars.keel_thickness_m``)."""

    aft: DraftMark
    midships: DraftMark
    forward: DraftMark


@frozen
class CriteriaSettings:
    """Which intact-stability criteria apply to the vessel, and any stricter values of the Administration."""

    code: str = "IS2008-A2.2"
    """Legacy key: 'IS2008-A2.2' (still accepted) means the general criteria."""
    min_gm_m: float | None = None
    """Stricter minimum GM0 (m) where the Administration requires one (e.g. 0.35 fishing)."""
    ship_type: str = "general"
    """One of :data:`SHIP_TYPES`: chooses the criteria sets."""
    wind_pressure_pa: float | None = None
    """Wind pressure P (Pa) for Part A 2.3 when the Administration allows another than 504 Pa."""
    bilge_keel_area_m2: float = 0.0
    """Ak: total area of bilge keels, or lateral projection of a bar keel, or the sum (m²); 0 = none."""
    sharp_bilged: bool = False
    """A sharp-bilged ship (k = 0.7 in the roll angle)."""
    complete_superstructure: bool = False
    """Fishing vessels: a complete superstructure (GM0 may then be below 0.35 m, never below 0.15 m)."""
    extra: tuple[ExtraCriterion, ...] = ()
    """Flag-State or class criteria written in the profile."""


@frozen
class FreeSurfaceSettings:
    """How free surface is taken: the IS 2008 Part B 3.1 treatment or actual levels, and how GZ is corrected."""

    rule: FsRule = "is2008"
    """'is2008' (Part B 3.1 treatment) or 'actual' (every tank at its actual level)."""
    gz_correction: GzCorrection = "constant"
    """'constant' (KG raised by ΣFSM/Δ) or 'transfer' (actual fluid transfer at each heel)."""
    nominally_full_pct: float = 98.0
    """Fill at or above which a tank is nominally full (IS 2008 B 3.1.2)."""
    empty_pct: float = 0.5
    """Fill at or below which a tank is taken as empty (its remainder is ignored)."""
    small_tank_limit_m: float = 0.01
    """Small-tank exemption: Mfs(30°)/Δmin below this (m) is left out (IS 2008 B 3.1.12)."""
    min_operating_displacement_t: float | None = None
    """Δmin for the small-tank exemption (t); lightship when not given."""
    default_worst_band_pct: tuple[float, float] = (40.0, 60.0)
    """Worst slack band for tanks whose shape is unknown (% fill)."""


@frozen(eq=False)
class Vessel:
    """A whole vessel profile: particulars, lightship, tables, compartments and rules."""

    particulars: Particulars
    lightship: MassItem
    hydrostatics: HydrostaticTable
    cross_curves: CrossCurves
    tanks: tuple[Tank, ...]
    holds: tuple[Hold, ...] = ()
    deck_areas: tuple[DeckArea, ...] = ()
    load_lines: tuple[LoadLine, ...] = ()
    limit_curve: LimitCurve | None = None
    downflooding: LimitCurve | None = None
    criteria: CriteriaSettings = CriteriaSettings()
    windage: Windage | None = None
    """Lateral windage table for the weather criterion, if the profile has one."""
    deck_edge: LimitCurve | None = None
    """Deck-edge immersion angle against displacement (kind 'deck_edge_deg'), if the profile has one."""
    passengers: PassengerData | None = None
    """Passenger data for IS 2008 Part A 3.1 (passenger ships)."""
    free_surface: FreeSurfaceSettings = FreeSurfaceSettings()
    constants: tuple[MassItem, ...] = ()
    """Fixed constants (crew and effects, stores, provisions) in every condition; a
    condition's constant of the same name replaces one (see :func:`effective_constants`)."""
    conversions: tuple[str, ...] = ()
    """How the profile's booklet conventions were converted on load, one line each (for check)."""
    assumptions: tuple[str, ...] = ()
    """What was assumed where the booklet gives less than the model needs, one line each."""
    draft_marks: DraftMarks | None = None
    trimmed: TrimmedTables | None = None
    """Hydrostatics and KN at several trims (booklet tables), or None: even-keel tables only."""
    usual_fill_pct: tuple[tuple[str, float], ...] = ()
    """``[usual_fill]``: per liquid kind, the fill (%) key f takes a tank to (else :data:`USUAL_MAX_PCT`)."""
    hull: "Body | None" = None
    """The hull as sections (from the geometry file named by ``hull_geometry``), for the direct
    calculation beside the tables; None when the profile names no geometry."""
    tank_bodies: dict[str, "Body"] = field(default_factory=dict, repr=False, compare=False)
    """Tank shapes by tank id, from the same geometry file (those it defines)."""
    sounding_pipes: dict[str, SoundingPipe] = field(default_factory=dict, compare=False)
    """Sounding pipe of a tank by id, from ``[sounding_pipes]``."""
    tank_index: dict[str, int] = field(init=False, repr=False, compare=False)
    hold_index: dict[str, int] = field(init=False, repr=False, compare=False)
    area_index: dict[str, int] = field(init=False, repr=False, compare=False)

    def usual_max_pct(self, kind: str) -> float:
        """The fill (%) a tank of ``kind`` is usually taken to: the profile's, else the default."""
        return dict(self.usual_fill_pct).get(kind, USUAL_MAX_PCT.get(kind, 100.0))

    def __post_init__(self) -> None:
        object.__setattr__(self, "tank_index", {t.id: i for i, t in enumerate(self.tanks)})
        object.__setattr__(self, "hold_index", {h.id: i for i, h in enumerate(self.holds)})
        object.__setattr__(self, "area_index", {a.id: i for i, a in enumerate(self.deck_areas)})

    def tank(self, tank_id: str) -> Tank:
        return self.tanks[self.tank_index[tank_id]]

    def hold(self, hold_id: str) -> Hold:
        return self.holds[self.hold_index[hold_id]]

    def deck_area(self, area_id: str) -> DeckArea:
        return self.deck_areas[self.area_index[area_id]]


# --------------------------------------------------------------------------- condition


@frozen
class TankFill:
    """One tank's contents in a condition, as stated by the officer (percent, m³, t, sounding or ullage)."""

    tank_id: str
    """Which tank."""
    quantity: str
    """How the contents are stated: one of :data:`FILL_QUANTITIES`."""
    value: float
    """The stated amount in the unit of ``quantity``."""
    density_t_m3: float | None = None
    """Density override (t/m³); the tank's default when None."""


@frozen
class HoldLoad:
    """Cargo in one hold in a condition, with its stowage factor or centre where known."""

    hold_id: str
    """Which hold."""
    mass_t: float
    """Cargo mass (t)."""
    stowage_m3_t: float | None = None
    """Stowage factor (m³/t): with it, the centroid follows the fill table."""
    lcg_m: float | None = None
    """LCG override (m)."""
    vcg_m: float | None = None
    """VCG override (m)."""
    tcg_m: float | None = None
    """TCG override (m)."""
    description: str = ""
    """What is stowed."""


@frozen
class DeckItem(MassItem):
    """A deck load in a condition: a mass item on a deck area, with its footprint and windage."""

    area_id: str | None = None
    """Deck area the item stands on, for the deck-load check."""
    footprint_m2: float | None = None
    """Area the item bears on (m²), for the local deck-load check."""
    windage_area_m2: float | None = None
    """Lateral area the item adds to the wind (m²): its side as seen abeam, less what another
    item or the bulwark already hides; 0 when wholly hidden; None when not stated."""
    windage_centroid_z_m: float | None = None
    """Height of the centre of that area above the keel (m)."""


@frozen
class Condition:
    """A loading condition: what is aboard, where, and in what water.

    Tanks not listed are empty.  Nothing here is mutated: the ``with_*`` methods
    return a new condition.
    """

    name: str = "Working condition"
    """Short title."""
    remark: str = ""
    """Free text (voyage, port, officer's note)."""
    water_density_t_m3: float = 1.025
    """Density of the water she floats in (t/m³)."""
    tanks: tuple[TankFill, ...] = ()
    """Tank contents, at most one entry per tank."""
    holds: tuple[HoldLoad, ...] = ()
    """Hold cargo, at most one entry per hold."""
    deck_items: tuple[DeckItem, ...] = ()
    """Deck cargo and other items on deck."""
    constants: tuple[MassItem, ...] = ()
    """Crew and effects, provisions, stores and other constants."""
    fs_rule: FsRule | None = None
    """Free-surface rule for this condition; the profile's default when None."""
    gz_correction: GzCorrection | None = None
    """GZ correction method for this condition; the profile's default when None."""
    load_line: str = "summer"
    """Which load-line mark governs the draft check."""
    modified_from: str = ""
    """Name of the condition this one was edited from, until it is saved under a name of its
    own (empty: the condition as opened or saved)."""
    sounding_trim_m: float = 0.0
    """Trim (m, + by the stern) she had when the soundings were taken; 0 = even keel."""
    sounding_list_deg: float = 0.0
    """List (deg, + starboard) she had when the soundings were taken; 0 = upright."""

    def tank_fill(self, tank_id: str) -> TankFill | None:
        for f in self.tanks:
            if f.tank_id == tank_id:
                return f
        return None

    def with_tank(self, fill: TankFill) -> "Condition":
        """A new condition with ``fill`` replacing any entry for the same tank."""
        rest = tuple(f for f in self.tanks if f.tank_id != fill.tank_id)
        return dataclasses.replace(self, tanks=rest + (fill,))

    def without_tank(self, tank_id: str) -> "Condition":
        return dataclasses.replace(self, tanks=tuple(f for f in self.tanks if f.tank_id != tank_id))

    def with_hold(self, load: HoldLoad) -> "Condition":
        rest = tuple(h for h in self.holds if h.hold_id != load.hold_id)
        return dataclasses.replace(self, holds=rest + (load,))

    def without_hold(self, hold_id: str) -> "Condition":
        return dataclasses.replace(self, holds=tuple(h for h in self.holds if h.hold_id != hold_id))

    def with_deck_items(self, items: tuple[DeckItem, ...]) -> "Condition":
        return dataclasses.replace(self, deck_items=tuple(items))

    def with_constants(self, items: tuple[MassItem, ...]) -> "Condition":
        return dataclasses.replace(self, constants=tuple(items))

    def with_density(self, water_density_t_m3: float) -> "Condition":
        return dataclasses.replace(self, water_density_t_m3=water_density_t_m3)

    def replace(self, **changes) -> "Condition":
        return dataclasses.replace(self, **changes)


def effective_constants(vessel: Vessel, condition: Condition) -> tuple[MassItem, ...]:
    """The profile's fixed constants, each replaced by the condition's constant of the same
    name if it has one, then the condition's other constants."""
    own = {c.name for c in condition.constants}
    return tuple(c for c in vessel.constants if c.name not in own) + tuple(condition.constants)
