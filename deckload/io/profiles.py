"""Vessel profiles and loading conditions: TOML ⇄ the frozen model, with all validation.

The schema is ``vessel_profiles/README.md``; this module is its only reader.  Nothing
reaches :mod:`deckload.core` before every field has been checked here, so the engine
may trust that tables are strictly increasing, arrays of one table have equal
length, densities are plausible and a condition only names compartments that exist.

Every problem found in a file is collected and reported at once, as a
:class:`Problem`: the file, the line (from the TOML parser for syntax errors, else
found by scanning the text for the key or its table header), the dotted key (tanks
named by id, e.g. ``tank[DB2P].calibration.sounding_m``), the offending value and
the rule broken::

    demo.toml:42: tank[DB2P].calibration.volume_m3 = [0.0, 4.1, 12.4, 12.0, …25 values]: not strictly increasing (row 4: 12.0 after 12.4)

A table entry without a usable id is named by its position: ``tank[#3]``.
Unknown keys are problems too: a misspelt optional key must never be silently
ignored, because its default would then be used without anyone knowing.

Conditions are written back with tomli-w (:func:`dump_condition`), losslessly, and
saved atomically (:func:`save_condition`): the old file survives any crash.
"""

from __future__ import annotations

import math
import os
from dataclasses import dataclass, replace
from dataclasses import field as dataclass_field
from pathlib import Path
from typing import Any

import numpy as np

from deckload.io.conventions import Frame, read_frame, tcg_array, tcg_num, trim_frame
from deckload.core import bounds
from deckload.core import model as m
from deckload.core import criteria as crit
from deckload.core.gz import STEP_DEG as GZ_STEP_DEG
from deckload.core.gz import grid_points
from deckload.core.loading import apart, reading_limits, reading_outside
from deckload.core.tables import interp
from deckload.io.csvtables import attach_csv, attach_kn_csv, attach_trim_csv
from deckload.io.limits import MAX_ITEM_NAME_CHARS, MAX_TABLES_AT_TRIMS
# Problem, ProfileError and ID_PATTERN are imported from here by other modules too
from deckload.io.tomlcheck import (
    ID_PATTERN,
    MISSING,
    REL_TOL,
    FileCheck,
    Problem,
    ProfileError,
    Rule,
    Table,
    at_most,
    between,
    check_tank_pairs,
    claim_id,
    non_negative,
    num,
    positive,
    printed_half_unit,
    suggest_id,
    toml_value,
)

PROFILE_FORMAT = "deckload-profile-1"
CONDITION_FORMAT = "deckload-condition-1"

from deckload.core.bounds import (  # noqa: E402  one set of ranges for files and the screen
    BEAM_DEPTH_RANGE_M,
    LBP_RANGE_M,
    LIQUID_DENSITY_RANGE_T_M3,
    WATER_DENSITY_RANGE_T_M3,
    hold_vcg_range,
    stowage_range,
    table_trim_range,
    waterline_length_range,
)

CAPACITY_TOLERANCE = 0.0005
"""A tank's capacity_m3 may differ from its last calibration volume by at most 0.05 % (round-off):
more would misjudge the 98 % 'nominally full' line or ask the table for a volume it does not hold.
It may differ by more only by the rounding of the decimals printed (CAPACITY_PRINTED_MAX_M3), and
the calibration's last volume is then the capacity."""

TABLE_TOP_PCT_RANGE = (90.0, 100.0)
"""A tank table printed short of full stops at 98 % of the tank (common practice for fuel tanks;
95 % is also seen); below 90 % no booklet's tank table stops (common practice)."""

CAPACITY_PRINTED_MAX_M3 = 0.5
"""The printing allowance on a capacity is at most half a cubic metre: a capacity printed to whole
cubic metres is the coarsest a booklet prints (common practice); a number typed as 2e1 is no
booklet's rounding."""


def _percent(x: float) -> str:
    """A percentage in a message: two decimals, or six significant digits when a typing error
    (a capacity of 1e300) would otherwise print hundreds of digits."""
    return f"{x:.2f}" if abs(x) < 1e6 else num(x)


# =========================================================================== vessel rules
# (generic rules such as ``positive`` and ``between`` live in deckload.io.tomlcheck)


def above_keel(x: float) -> str | None:
    return None if x >= 0 else "must not be negative (heights are above the keel)"


liquid_density = between(*LIQUID_DENSITY_RANGE_T_M3, "t/m³", "density of a liquid in a tank")
water_density = between(*WATER_DENSITY_RANGE_T_M3, "t/m³", "fresh water 1.000, sea water about 1.025")
percent_range = between(0.0, 100.0, "%")
heel_range = between(0.0, 90.0, "°")


# =========================================================================== profile


def load_profile(path: str | os.PathLike) -> m.Vessel:
    """Read and validate a vessel profile.  Raises OSError if unreadable, ProfileError if wrong."""
    return parse_profile(_read_text(path), str(path))


def read_profile(path: str | os.PathLike) -> tuple[m.Vessel, "Reading"]:
    """:func:`load_profile`, and how each table was written (for ``deckload csv``)."""
    reading = Reading()
    return parse_profile(_read_text(path), str(path), reading), reading


def _read_text(path: str | os.PathLike) -> str:
    from deckload.io.limits import MAX_TOML_BYTES, TooLargeError, read_limited

    try:
        data = read_limited(path, MAX_TOML_BYTES, "a profile or condition")
    except TooLargeError as e:
        raise ProfileError([Problem(str(path), None, "", None, str(e).split(": ", 1)[1])]) from None
    try:
        return data.decode("utf-8")
    except UnicodeDecodeError as e:
        line = data[: e.start].count(b"\n") + 1
        raise ProfileError([Problem(str(path), line, "", None, f"not UTF-8 text (byte {e.start + 1}); TOML files must be UTF-8")]) from None


@dataclass
class TableReading:
    """How one table of the profile was written: enough to write it back the same way."""

    frame: Frame
    csv: str | None = None
    tcg_marked: bool = False
    """TCGs were written "1.20 P" / "1.20 S"."""
    level: str = "sounding_m"
    """A calibration tabulated by 'sounding_m' or 'ullage_m'."""
    reversed: bool = False
    """Rows were written with the level falling (e.g. ullage rising)."""
    added_bottom_row: bool = False
    """A row 'level 0, volume 0' was added below the first written row."""
    fsm: str = "fsi_m4"
    """'fsi_m4', 'fsm_tm' (column in t·m at ``fsm_density_t_m3``) or '' (none per row)."""
    fsm_density_t_m3: float | None = None
    against: str = "displacement_t"
    """A curve tabulated against 'displacement_t' or 'draft_m'."""
    columns: tuple[str, ...] = ()
    """The CSV file's column order, to write the table back the same way (empty: our order)."""
    ignored: tuple[tuple[str, tuple[float, ...]], ...] = ()
    """Booklet columns read as numbers and not used (name, values in the rows' written order)."""
    added_upright: bool = False
    """Cross curves printed from a heel above 0°: the 0° column (KN 0) was added."""
    entry: int | None = None
    """A table at a trim: its place among the ``[[…_at_trim]]`` entries as written (the model holds
    them by rising trim + by the stern, which is not the written order when typed + by the head)."""


@dataclass
class Reading:
    """Conversions, assumptions and per-table conventions met while reading one profile."""

    conversions: list[str] = dataclass_field(default_factory=list)
    assumptions: list[str] = dataclass_field(default_factory=list)
    tables: dict[str, TableReading] = dataclass_field(default_factory=dict)
    free_surface: dict[str, list[str]] = dataclass_field(default_factory=dict)
    """How each tank's free surface was read (the words of :data:`FS_BASIS`, with a density where
    the booklet stated one) → the ids of the tanks read so, in profile order: ``check`` prints one
    line per basis, to be compared with the heading of each tank page's free-surface column."""
    booklet_conditions: int = 0
    """How many ``[[booklet_condition]]`` entries the profile lists (read by io.booklet_conditions):
    without any, ``calc`` and ``report`` say so once (report.audit_findings.booklet_note)."""

    def convert(self, where: str, keys: str, how: str) -> None:
        self.conversions.append(f"{where} {keys}: {how}")


FS_BASIS = {
    "fsi_m4": "inertia i (m⁴) per row × the liquid's density (fsi_m4)",
    "fsm_tm": "moment (t·m) per row at {rho} t/m³ (fsm_tm)",
    "max_fsi_m4": "one maximum inertia i (m⁴) × the liquid's density (max_fsi_m4)",
    "max_fsm_tm": "one maximum moment (t·m) at {rho} t/m³ (max_fsm_tm)",
    "none": "none given (nil at every level)",
}
"""How a tank's free surface was read, in ``check``'s words.  A page printing FSM in t·m typed as
``fsi_m4`` understates every moment by the factor ρ (15 % for diesel at 0.85): the officer compares
these lines with the booklet's column headings (found by the booklet-conventions audit)."""


def _fs_basis(t: Table, kw: dict[str, Any], tr: "TableReading | None") -> str:
    """The :data:`FS_BASIS` words for a tank read from ``t`` (its calibration's reading ``tr``)."""
    given = kw.get("fsi_given", "table")
    if given == "none":
        return FS_BASIS["none"]
    if given == "max":
        key = "max_fsm_tm" if t.has("max_fsm_tm") else "max_fsi_m4"
        rho = t.data.get("fsm_density_t_m3")
    else:
        key = "fsm_tm" if tr is not None and tr.fsm == "fsm_tm" else "fsi_m4"
        rho = tr.fsm_density_t_m3 if tr is not None else None
    return FS_BASIS[key].format(rho=num(float(rho)) if isinstance(rho, (int, float)) else "?")


def _csv_columns(t: Table) -> tuple[str, ...]:
    return tuple(t.ctx.csv_headers.get(t.raw, ()))


# Booklet columns read and not used (vessel_profiles/README.md, "Booklet columns read and not
# used"): quantities a booklet page prints beside the ones deckload reads, none of which the
# calculation needs.  A closed list, so that a misspelt column of a quantity deckload does use
# is still refused (its data would otherwise be dropped without anyone knowing).
HYDRO_IGNORED = ("displacement_fw_t", "volume_m3", "cb", "cp", "cm", "cw", "bmt_m", "bml_m",
                 "waterplane_area_m2", "wetted_surface_m2", "fwa_mm")
"""Fresh-water displacement, moulded volume, the form coefficients (block, prismatic, midship
section, waterplane), BMt and BMl (KMt and KMl are read), the waterplane and wetted areas,
the fresh-water allowance."""
KN_IGNORED = ("draft_m", "volume_m3", "displacement_fw_t")
"""The draft, volume or fresh-water displacement printed beside each displacement of the cross curves."""
CAL_IGNORED = ("mass_t", "fill_pct")
"""The tonnes at the tank's density and the percentage full printed beside each volume; also
``ullage_m`` beside ``sounding_m`` in one CSV file (the soundings are then the table's level)."""
HOLD_IGNORED = ("volume_m3",)
"""The volume printed beside each fill of a hold's fill table."""


def _written_falling(arr: np.ndarray | None) -> bool:
    """Whether a table's key column was typed falling (a booklet printing the deepest draft or the
    greatest displacement first): more of its steps go down than up.  The column is then held to
    be strictly decreasing, row by row as written, and the table read in reverse; a swapped or
    repeated row breaks that as it breaks a rising table."""
    if arr is None or len(arr) < 2:
        return False
    d = np.diff(arr)
    return int(np.count_nonzero(d < 0)) > int(np.count_nonzero(d > 0))


def _read_ignored(t: Table, where: str, rd: Reading) -> tuple[tuple[str, tuple[float, ...]], ...] | None:
    """The booklet columns of ``t``'s CSV file that are read and not used: each must still be
    numbers (a cell the spreadsheet mangled is reported like any other); the conversion notes
    name them.  None when one is not."""
    names = t.ctx.csv_ignored.get(t.raw, [])
    out, ok = [], True
    for k in names:
        arr = t.array(k, min_len=0)
        if arr is None:
            ok = False
            continue
        out.append((k, tuple(float(x) for x in arr)))
    if names:
        level = "; the soundings beside the ullages are the table's level" if "ullage_m" in names else ""
        rd.convert(where, ", ".join(names), f"read from {t.data.get('csv')} as numbers and not used "
                   f"(booklet quantities deckload does not need{level})")
    return tuple(out) if ok else None


SOUNDING_ULLAGE_TOLERANCE_M = 0.011
"""A page printing both readings: sounding + ullage is the same in every row (the ullage reference
above the sounding zero, derived), within the rounding of two values printed to the centimetre."""


def _soundings_beside_ullages(t: Table, soundings, ullages) -> None:
    """A row whose sounding and ullage do not add up to what the other rows' do is refused, naming
    it: one of the two readings is mistyped (the soundings are the table's level)."""
    if ullages is None or len(ullages) != len(soundings) or len(soundings) < 3:
        return
    sums = np.asarray(soundings, dtype=float) + np.asarray(ullages, dtype=float)
    usual = float(np.median(sums))
    for i, total in enumerate(sums):
        if abs(total - usual) > SOUNDING_ULLAGE_TOLERANCE_M:
            t.bad("ullage_m", t.data["ullage_m"], f"row {i + 1}: sounding {num(float(soundings[i]))} m + ullage "
                  f"{num(float(ullages[i]))} m = {num(float(total))} m, but {num(usual)} m in the other rows "
                  "(one of the two readings is mistyped)", (i,))
            return


def parse_profile(text: str, filename: str = "<profile>", reading: "Reading | None" = None) -> m.Vessel:
    """Validate the text of a vessel profile and build the :class:`~deckload.core.model.Vessel`.

    Booklet conventions are converted on load (vessel_profiles/README.md, "Booklet
    conventions and CSV tables"); every conversion and assumption is listed in the
    vessel's ``conversions`` / ``assumptions``.  Tables may come from CSV files beside
    ``filename``.  Raises :class:`ProfileError` listing every problem found.
    """
    ctx = FileCheck(filename, text)
    root = ctx.root()
    root.file_format(PROFILE_FORMAT)
    rd = reading if reading is not None else Reading()

    particulars, frame = _read_particulars(root)
    lightship = _read_lightship(root, frame, rd)
    hydro = _read_hydrostatics(root, frame, rd)
    cross = _read_cross_curves(root, frame, rd)
    trimmed = _read_trimmed_tables(root, particulars, frame, rd, hydro, cross)
    fs = _read_free_surface(root, lightship)
    criteria = _read_criteria(root, particulars)
    extra = _read_extra_criteria(root, particulars)
    if criteria is not None and extra:
        criteria = replace(criteria, extra=extra)
    load_lines = _read_load_lines(root, hydro, frame, rd)
    limit = _read_limit_curve(root, hydro, frame, rd)
    downflooding = _read_downflooding(root, hydro, frame, rd)
    _check_kn_reach(root, cross, downflooding, lightship, particulars)
    windage = _read_windage(root, particulars)
    deck_edge = _read_deck_edge(root)
    passengers = _read_passengers(root, particulars, criteria)
    marks = _read_draft_marks(root, particulars, frame, rd)
    hull, tank_bodies = _read_hull_geometry(root, particulars, filename, rd)
    pipes = _read_sounding_pipes(root, particulars, frame, rd)
    usual = _read_usual_fill(root)

    ids: dict[str, str] = {}  # id -> display name of the first compartment using it
    depth = particulars.depth_m if particulars is not None else math.inf
    tanks = _read_tanks(root, fs, ids, frame, rd, depth,
                        table_trim_range(particulars) if particulars is not None else None)
    holds = _read_holds(root, ids, frame, rd)
    areas = _read_deck_areas(root, ids, frame, rd)
    constants = _read_profile_constants(root, frame, rd)
    if hull is not None:
        _check_sounding_pipes(root, pipes, tanks, tank_bodies)
    # [[booklet_condition]]: the booklet's worked conditions, read and compared by `deckload check`
    # (deckload.io.booklet_conditions) once the vessel exists; not part of the model.
    worked = root.get("booklet_condition", False)
    rd.booklet_conditions = len(worked) if isinstance(worked, list) else 0
    root.finish()
    ctx.fail_if_any()

    return _physical(ctx).check_vessel(ctx, m.Vessel(
        particulars=particulars,
        lightship=lightship,
        hydrostatics=hydro,
        cross_curves=cross,
        tanks=tuple(tanks),
        holds=tuple(holds),
        deck_areas=tuple(areas),
        load_lines=tuple(load_lines),
        limit_curve=limit,
        downflooding=downflooding,
        criteria=criteria,
        free_surface=fs,
        windage=windage,
        deck_edge=deck_edge,
        passengers=passengers,
        constants=tuple(constants),
        conversions=tuple(rd.conversions),
        assumptions=tuple(rd.assumptions),
        draft_marks=marks,
        trimmed=trimmed,
        usual_fill_pct=usual,
        hull=hull,
        tank_bodies=tank_bodies,
        sounding_pipes=pipes,
    ))


def _read_usual_fill(root: Table) -> tuple[tuple[str, float], ...]:
    """``[usual_fill]``: per liquid kind, the fill in % that key f takes a tank to (1–100)."""
    t = root.table("usual_fill", required=False)
    if t is None:
        return ()
    out = []
    for kind in m.LIQUID_KINDS:
        v = t.num(kind, between(1.0, 100.0, "%"), required=False)
        if v is not None:
            out.append((kind, float(v)))
    t.finish()
    return tuple(out)


def _read_particulars(root: Table) -> tuple[m.Particulars | None, Frame | None]:
    t = root.table("vessel")
    # Without usable particulars the profile is refused anyway; a stand-in frame lets every
    # other table still be checked, so that all problems are reported at once.
    stand_in = Frame(1.0)
    if t is None:
        return None, stand_in
    kw = dict(
        name=t.text("name"),
        vessel_type=t.text("vessel_type", required=False, empty_ok=True),
        # every other physical bound derives from these three (deckload.core.bounds)
        lbp_m=t.num("lbp_m", positive, between(*LBP_RANGE_M, "m", "a ship's length between perpendiculars")),
        breadth_m=t.num("breadth_m", positive, between(*BEAM_DEPTH_RANGE_M, "m", "a ship's moulded breadth")),
        depth_m=t.num("depth_m", positive, between(*BEAM_DEPTH_RANGE_M, "m", "a ship's moulded depth")),
        design_draft_m=t.num("design_draft_m", positive),
        table_density_t_m3=t.num("table_density_t_m3", water_density),
    )
    datum = True
    if not t.has("longitudinal_datum"):
        t.get("longitudinal_datum")  # reports it missing: the datum of every x must be stated
        datum = None
    kw["remark"] = t.text("remark", required=False, empty_ok=True)
    keel_rule = between(0.0, 0.1, "m", "a keel plate; extreme − moulded draft")
    kw["keel_thickness_m"] = t.num("keel_thickness_m", keel_rule, required=False, default=0.0)
    base = Frame(kw["lbp_m"] or 1.0, keel_thickness_m=kw["keel_thickness_m"] or 0.0)
    frame = read_frame(t, base, trims=True)
    # the IS Code's L (ICLL Load Line length): optional, else LBP (deckload.core.criteria.code_length_m)
    length_ll = t.num("length_ll_m", positive, required=False)
    if length_ll is not None and kw["lbp_m"] is not None:
        lo, hi = crit.LOAD_LINE_LENGTH_OVER_LBP
        if not lo * kw["lbp_m"] <= length_ll <= hi * kw["lbp_m"]:
            t.bad("length_ll_m", t.data["length_ll_m"],
                  f"outside {lo:g}–{hi:g} × LBP ({num(lo * kw['lbp_m'])}–{num(hi * kw['lbp_m'])} m): the Load Line "
                  "length (ICLL Annex I reg. 3, on the waterline at 85 % of the depth) is normally no less than "
                  "LBP and never far more; compare with her Load Line certificate")
            length_ll = None
    t.finish()
    if kw["design_draft_m"] is not None and kw["depth_m"] is not None and kw["design_draft_m"] > kw["depth_m"]:
        t.bad("design_draft_m", t.data["design_draft_m"], f"exceeds the depth {num(kw['depth_m'])} m")
        return None, frame or stand_in
    if datum is None or frame is None or any(v is None for v in kw.values()):
        return None, frame or stand_in
    words = f"{frame.datum} datum, + {frame.positive}" if frame.datum != "AP" else "aft perpendicular, positive forward"
    return m.Particulars(longitudinal_datum=words, length_ll_m=length_ll, **kw), frame


def _x(t: Table, k: str, frame: Frame | None) -> float | None:
    """One x position as written, converted to metres from AP, + forward."""
    v = t.num(k)
    if v is None or frame is None:
        return None
    return float(frame.x_to_ap(v))


def _note_frame(rd: Reading, where: str, frame: Frame | None, xkeys: str, ykeys: str, marked: bool) -> None:
    if frame is None:
        return
    if xkeys and not frame.x_is_identity:
        rd.convert(where, xkeys, frame.describe_x())
    if ykeys and not frame.y_is_identity:
        rd.convert(where, ykeys, frame.describe_y())
    if ykeys and marked:
        rd.convert(where, ykeys, "\"P\" / \"S\" marks → − port / + starboard")


def _read_mass_item(t: Table, name: str, *, mass_rule: Rule = non_negative, frame: Frame | None = None,
                    rd: Reading | None = None, where: str = "") -> m.MassItem | None:
    """A mass and its centre.  With ``frame`` (a profile table) its booklet convention applies."""
    if frame is None and rd is None:
        kw = dict(
            mass_t=t.num("mass_t", mass_rule),
            lcg_m=t.num("lcg_m"),
            vcg_m=t.num("vcg_m", above_keel),
            tcg_m=t.num("tcg_m", required=False, default=0.0),
        )
    else:
        f = read_frame(t, frame, sides=True)
        tcg, marked = tcg_num(t, "tcg_m", f)
        kw = dict(mass_t=t.num("mass_t", mass_rule), lcg_m=_x(t, "lcg_m", f),
                  vcg_m=t.num("vcg_m", above_keel), tcg_m=tcg)
        _note_frame(rd, where, f, "lcg_m", "tcg_m" if t.has("tcg_m") else "", marked)
    if any(v is None for v in kw.values()) or name is None:
        return None
    return m.MassItem(name=name, **kw)


def _read_lightship(root: Table, frame: Frame | None, rd: Reading) -> m.MassItem | None:
    t = root.table("lightship")
    if t is None:
        return None
    item = _read_mass_item(t, "Lightship", mass_rule=positive, frame=frame, rd=rd, where="lightship")
    t.finish()
    return item


def _read_profile_constants(root: Table, frame: Frame | None, rd: Reading) -> list[m.MassItem]:
    out, names = [], set()
    for t in root.tables("constant"):
        name = t.text("name")
        if name is not None:
            t.name = f"constant[{name}]"
            if name in names:
                t.bad("name", name, "duplicate constant name: a condition replaces a profile constant by its name")
                name = None
            names.add(name)
        item = _read_mass_item(t, name, frame=frame, rd=rd, where=t.name)
        t.finish()
        if item is not None:
            out.append(item)
    return out


HYDRO_COLUMNS = ("draft_m", "displacement_t", "lcb_m", "lcf_m", "kmt_m", "tpc_t_cm", "mctc_tm_cm", "vcb_m", "kml_m")


def _read_hydrostatics(root: Table, frame: Frame | None, rd: Reading) -> m.HydrostaticTable | None:
    t = root.table("hydrostatics")
    if t is None:
        return None
    return _read_hydro_table(t, frame, rd, "hydrostatics")


def _read_hydro_table(t: Table, frame: Frame | None, rd: Reading, where: str) -> m.HydrostaticTable | None:
    """One hydrostatic table: ``[hydrostatics]`` or an entry of ``[[hydrostatics_at_trim]]``."""
    if not attach_csv(t, HYDRO_COLUMNS, HYDRO_IGNORED):
        return None
    f = read_frame(t, frame, drafts=True)
    draft = t.array("draft_m", non_negative)
    falling = _written_falling(draft)
    cols = {
        "draft_m": t.increasing("draft_m", draft, decreasing=falling),
        "displacement_t": t.increasing("displacement_t", t.array("displacement_t", non_negative), decreasing=falling),
        "lcb_m": t.array("lcb_m"),
        "lcf_m": t.array("lcf_m"),
        "kmt_m": t.array("kmt_m", positive),
        "tpc_t_cm": t.array("tpc_t_cm", positive),
        "mctc_tm_cm": t.array("mctc_tm_cm", positive),
    }
    optional = {}
    for k, rule in (("vcb_m", above_keel), ("kml_m", positive)):
        if t.has(k):
            optional[k] = t.array(k, rule)
            cols[k] = optional[k]
        else:
            t.get(k, False)
    ignored = _read_ignored(t, where, rd)
    t.finish()
    if not t.same_length("draft_m", cols) or f is None or ignored is None:
        return None
    if falling:
        cols = {k: a[::-1].copy() for k, a in cols.items()}
        rd.convert(where, "rows", "typed deepest draft first → read in rising order")
    rd.tables[where] = TableReading(f, csv=t.data.get("csv"), columns=_csv_columns(t), reversed=falling,
                                    ignored=ignored)
    _note_frame(rd, where, f, "lcb_m, lcf_m", "", False)
    cols["lcb_m"] = f.x_to_ap(cols["lcb_m"])
    cols["lcf_m"] = f.x_to_ap(cols["lcf_m"])
    if f.draft_basis == "extreme":
        rd.convert(where, "draft_m", f"extreme → moulded (− keel {num(f.keel_thickness_m)} m)")
        cols["draft_m"] = f.draft_to_moulded(cols["draft_m"])
        if cols["draft_m"][0] < 0:
            t.bad("draft_m", t.data["draft_m"], f"the first extreme draft is less than the keel thickness {num(f.keel_thickness_m)} m")
            return None
    return m.HydrostaticTable(**{k: m.frozen_array(v) for k, v in cols.items()})


KN_MIN_END_DEG = 40.0
"""Cross curves must reach at least 40°: the IS 2008 Part A 2.2.1 areas run to 40° (or θf)."""

KN_MAX_FIRST_DEG = 15.0
"""Cross curves may start at a heel up to 15°: the reader adds the 0° column, KN 0 exactly (upright,
B lies on the centreline of a hull symmetric about it, so KN = y_B·cos0 + z_B·sin0 = 0: checks.md
conventions; derived).  The gap from upright to the first angle printed is then no wider than the
coarsest step booklets print KN at (15°: 15, 30, 45, …; common practice).  Beyond 15° the natural
spline would cross a wider gap over the part of the curve where GM, the list, the deck-edge angle
and most of the 0–30° area are read, and its error grows fast with the gap: on the box barge of
checks.md §1 at T = 1 m (bilge emerging at 11.3°) the 0–20° area from KN at 0, 10, 15, 20° is within
0.001 m·rad of the closed form, from 0, 15, 20° already 0.012 m·rad off, ten times UR L5's 0.0012
(derived, checks.md §1.2 closed forms against the spline).  So refused beyond 15°; a table printed
from 10° or 15° is compared at small heels with the booklet's worked conditions (README)."""


def _read_cross_curves(root: Table, frame: Frame | None, rd: Reading) -> m.CrossCurves | None:
    t = root.table("cross_curves")
    if t is None:
        return None
    if not attach_kn_csv(t, KN_IGNORED):
        return None
    basis = t.text("trim_basis", choices=("free trim", "even keel"))
    return _read_kn_table(t, frame, rd, basis)


def _read_kn_table(t: Table, frame: Frame | None, rd: Reading, basis: str | None,
                   even: m.CrossCurves | None = None) -> m.CrossCurves | None:
    """One KN table: ``[cross_curves]``, or an entry of ``[[cross_curves_at_trim]]`` (``even`` given:
    its basis and heels are the even-keel table's, and it has no reference LCG of its own)."""
    where = "cross_curves" if even is None else t.name
    heel = t.increasing("heel_deg", t.array("heel_deg", heel_range))
    upright_added = False
    if heel is not None and abs(float(heel[0])) > REL_TOL * max(1.0, abs(float(heel[-1]))):
        if heel[0] > KN_MAX_FIRST_DEG + 1e-9:
            t.bad("heel_deg", t.data["heel_deg"], f"must start at 0 (the upright condition), or at "
                  f"{num(KN_MAX_FIRST_DEG)}° at most (it starts at {num(float(heel[0]))}°): from upright to the first "
                  "angle printed the curve would be guessed, and the 0–30° area and the list are read there")
            heel = None
        else:
            upright_added = True
            heel = np.concatenate([[0.0], heel])
    if heel is not None and heel[-1] < KN_MIN_END_DEG - 1e-9:
        t.bad("heel_deg", t.data["heel_deg"], f"must reach at least {num(KN_MIN_END_DEG)}° (it ends at {num(heel[-1])}°): "
              "the IS 2008 A 2.2.1 areas run to 40°; nothing is extrapolated")
        heel = None
    if even is not None and heel is not None and not np.array_equal(heel, even.heel_deg):
        t.bad("heel_deg", t.data["heel_deg"], "must be the heel angles of [cross_curves] "
              f"({', '.join(num(float(x)) for x in even.heel_deg)}°): KN are interpolated in trim heel by heel")
        heel = None
    disp = t.array("displacement_t", positive)
    falling = _written_falling(disp)
    disp = t.increasing("displacement_t", disp, decreasing=falling)
    kn = t.matrix("kn_m", "displacement_t", t.raw_len("displacement_t"), "heel_deg", t.raw_len("heel_deg"))
    has_ref = even is None and t.has("reference_lcg_m")
    ref = t.num("reference_lcg_m", required=False) if even is None else None
    f = read_frame(t, frame) if even is None else frame
    ignored = _read_ignored(t, where, rd)
    t.finish()
    if (basis is None or heel is None or disp is None or kn is None or (has_ref and ref is None) or f is None
            or ignored is None):
        return None
    if upright_added:
        kn = np.hstack([np.zeros((kn.shape[0], 1)), kn])
        rd.convert(where, "kn_m", f"printed from {num(float(heel[1]))}°: KN 0 at 0° added (upright, B lies on the "
                   "centreline of a hull symmetric about it: KN = y_B·cos0 + z_B·sin0 = 0)")
    if falling:
        disp, kn = disp[::-1].copy(), kn[::-1].copy()
        rd.convert(where, "rows", "typed greatest displacement first → read in rising order")
    reading = TableReading(f, csv=t.data.get("csv"), columns=_csv_columns(t), reversed=falling, ignored=ignored,
                           added_upright=upright_added)
    if ref is not None:
        _note_frame(rd, "cross_curves", f, "reference_lcg_m", "", False)
        ref = float(f.x_to_ap(ref))
    rd.tables[where] = reading
    if even is not None:
        return m.CrossCurves(heel_deg=m.frozen_array(heel), displacement_t=m.frozen_array(disp),
                             kn_m=m.frozen_array(kn), trim_basis=basis)
    return m.CrossCurves(
        heel_deg=m.frozen_array(heel), displacement_t=m.frozen_array(disp), kn_m=m.frozen_array(kn), trim_basis=basis,
        reference_lcg_m=ref,
    )


def _read_table_trim(t: Table, p: m.Particulars | None, f: Frame) -> float | None:
    """A trimmed table's trim as written (m, in the sign ``f.trim_positive`` gives): ``trim_m``, or
    ``trim_pct_lbp`` (% of LBP).  The range rule is symmetric, so it holds in either sign."""
    has_m, has_pct = t.has("trim_m"), t.has("trim_pct_lbp")
    way = f"+ by the {f.trim_positive}"
    if has_m == has_pct:
        t.get("trim_m", False)
        t.get("trim_pct_lbp", False)
        t.bad("trim_m", t.data.get("trim_m", MISSING), f"give the table's trim once: trim_m (m, {way}) "
              f"or trim_pct_lbp (% of LBP, {way})")
        return None
    if p is None:
        t.get("trim_m" if has_m else "trim_pct_lbp", False)
        return None
    rng = table_trim_range(p)
    if has_m:
        return t.num("trim_m", lambda x: rng.rule(x))
    pct = t.num("trim_pct_lbp", lambda x: rng.rule(x * p.lbp_m / 100.0))
    return None if pct is None else pct * p.lbp_m / 100.0


def _read_trimmed_tables(root: Table, particulars: m.Particulars | None, frame: Frame | None, rd: Reading,
                         hydro: m.HydrostaticTable | None, cross: m.CrossCurves | None) -> m.TrimmedTables | None:
    """``[[hydrostatics_at_trim]]`` and ``[[cross_curves_at_trim]]`` beside the even-keel tables (trim 0).

    Trims strictly increasing in the order written (as typed, in the sign the entry's
    ``trim_positive`` gives), none 0 (that is the even-keel table), each within
    :func:`deckload.core.bounds.table_trim_range`, and turned + by the stern; the tables themselves
    pass every check of ``[hydrostatics]`` / ``[cross_curves]``, KN with the even-keel table's heels.
    """
    sets = []
    ok = True
    for key, what in (("hydrostatics_at_trim", "hydrostatics"), ("cross_curves_at_trim", "cross_curves")):
        entries = root.tables(key)
        if len(entries) > MAX_TABLES_AT_TRIMS:
            root.bad(key, MISSING, f"{len(entries)} tables at trims, more than the {MAX_TABLES_AT_TRIMS} allowed "
                     "(booklets print 4–10)")
            for t in entries:
                for k in list(t.data):
                    t.get(k, False)
            ok = False
            sets.append(([], []))
            continue
        trims, tables, head = [], [], []
        for entry, t in enumerate(entries):
            # the entry's trim_positive ([vessel]'s unless it says its own) applies to its trim only
            ef = trim_frame(t, frame)
            typed = _read_table_trim(t, particulars, ef or Frame(1.0))
            trim = None if typed is None or ef is None else float(ef.trim_to_stern(typed))
            trim_key = "trim_m" if t.has("trim_m") else "trim_pct_lbp"
            if trim is not None:
                t.name = f"{key}[{num(round(trim, 6))} m]"
            before = trims[-1] if trims and trims[-1] is not None else None
            if trim is not None and abs(trim) < 1e-9:
                t.bad(trim_key, t.data.get("trim_m", t.data.get("trim_pct_lbp")),
                      f"trim 0 is the even-keel [{what}] table; give only the other trims here")
                trim = None
            elif trim is not None and before is not None and typed <= ef.trim_from_stern(before):
                t.bad(trim_key, t.data.get("trim_m", t.data.get("trim_pct_lbp")),
                      f"trims must increase strictly from one [[{key}]] to the next, as typed "
                      f"(the one before is {num(round(float(ef.trim_from_stern(before)), 6))} m, + by the "
                      f"{ef.trim_positive})")
                trim = None
            elif trim is not None and any(x is not None and abs(x - trim) < 1e-9 for x in trims):
                t.bad(trim_key, t.data.get("trim_m", t.data.get("trim_pct_lbp")),
                      f"the same trim as an earlier [[{key}]] ({num(round(trim, 6))} m by the stern, "
                      "once trim_positive is applied): give each trim once")
                trim = None
            if trim is not None and not ef.trim_is_identity:
                head.append(num(round(float(typed), 6)))
            parent = ef or frame
            if what == "hydrostatics":
                table = _read_hydro_table(t, parent, rd, t.name)
            else:
                table = (_read_kn_table(t, parent, rd, cross.trim_basis, cross)
                         if cross is not None and attach_kn_csv(t, KN_IGNORED) else None)
                if cross is None:
                    for k in list(t.data):
                        t.get(k, False)
            if t.name in rd.tables:
                rd.tables[t.name].entry = entry
            ok &= trim is not None and table is not None
            trims.append(trim)
            tables.append(table)
        if head:
            rd.convert(key, "trim_m", f"{Frame.describe_trim()}: {', '.join(head)} m as typed")
        if key == "hydrostatics_at_trim" and entries and hydro is not None and hydro.vcb_m is None:
            entries[0].bad("trim_m" if entries[0].has("trim_m") else "trim_pct_lbp", MISSING,
                           "tables at trims need KB: give vcb_m in [hydrostatics] (each trimmed table may give its own)")
            ok = False
        sets.append((trims, tables))
    (ht, hs), (kt, ks) = sets
    if not (hs or ks) or not ok or hydro is None or cross is None:
        return None

    def with_even(trims, tables, even):
        pairs = sorted(zip(trims + [0.0], tables + [even]), key=lambda p: p[0])
        return m.frozen_array([p[0] for p in pairs]), tuple(p[1] for p in pairs)

    htr, htab = with_even(ht, hs, hydro)
    ktr, ktab = with_even(kt, ks, cross)
    return m.TrimmedTables(hydro_trim_m=htr, hydrostatics=htab, kn_trim_m=ktr, cross_curves=ktab)


def reachable_from_row(flood: m.LimitCurve, lightship: m.MassItem | None,
                       particulars: m.Particulars | None) -> int:
    """The first row of a downflooding curve a loading condition can use.

    θf is read at the displacement at table density, Δ·ρ_table/ρ (stability.stage_criteria), and a
    condition weighs at least the lightship in water no denser than the highest density a
    condition may state (bounds.WATER_DENSITY_RANGE_T_M3): so at least lightship·ρ_table/ρ_max.
    The curve is interpolated linearly between rows, so the row at or below that displacement
    still counts (the interval from it brackets the lightest condition); the rows below it are
    never read.  0 (every row) when the lightship or the table density is unknown."""
    if lightship is None or particulars is None:
        return 0
    lightest = lightship.mass_t * particulars.table_density_t_m3 / WATER_DENSITY_RANGE_T_M3[1]
    return max(0, int(np.searchsorted(flood.displacement_t, lightest, side="right")) - 1)


def _check_kn_reach(root: Table, cross: m.CrossCurves | None, flood: m.LimitCurve | None,
                    lightship: m.MassItem | None = None, particulars: m.Particulars | None = None) -> None:
    """The KN tables must reach every downflooding angle a condition can meet: the criteria look
    up to θf (the GZ ≥ 0.20 m range, the weather criterion's area b), and nothing is
    extrapolated.  Rows of the curve below the lightest displacement a condition can have
    (:func:`reachable_from_row`) are never read, so their angles do not count."""
    if cross is None or flood is None:
        return
    end = float(cross.heel_deg[-1])
    first = reachable_from_row(flood, lightship, particulars)
    angles = np.asarray(flood.value)[first:]
    worst = first + int(np.argmax(angles))
    top = float(flood.value[worst])
    grid_end = (grid_points(cross) - 1) * GZ_STEP_DEG  # the curve is worked on a 0.1° grid up to the end
    if top > grid_end + 1e-9:
        t = root.table("cross_curves")
        at = (f" at {num(float(flood.displacement_t[worst]))} t (a row a condition's θf is read from: lightship "
              f"{num(lightship.mass_t)} t)" if lightship is not None and particulars is not None else "")
        t.bad("heel_deg", t.data["heel_deg"], f"ends at {num(end)}°, before the downflooding angle {num(top)}°{at} "
              "in [downflooding]: the criteria look up to θf, and nothing is extrapolated")



def _band(t: Table, k: str, default: tuple[float, float] | None) -> tuple[float, float] | None:
    """A fill band [low, high] in %, 0 ≤ low < high ≤ 100."""
    if not t.has(k):
        t.get(k, False)
        return default
    return t.pair(k, percent_range, form="two fills [low, high] in %, low below high")


def _read_free_surface(root: Table, lightship: m.MassItem | None) -> m.FreeSurfaceSettings | None:
    d = m.FreeSurfaceSettings()
    t = root.table("free_surface", required=False)
    if t is None:
        if root.has("free_surface"):
            return None
        return d if lightship is None else m.FreeSurfaceSettings(min_operating_displacement_t=lightship.mass_t)
    kw = dict(
        rule=t.text("rule", required=False, default=d.rule, choices=("is2008", "actual")),
        gz_correction=t.text("gz_correction", required=False, default=d.gz_correction, choices=("constant", "transfer")),
        nominally_full_pct=t.num("nominally_full_pct", percent_range, required=False, default=d.nominally_full_pct),
        empty_pct=t.num("empty_pct", percent_range, required=False, default=d.empty_pct),
        small_tank_limit_m=t.num("small_tank_limit_m", non_negative, required=False, default=d.small_tank_limit_m),
        min_operating_displacement_t=t.num("min_operating_displacement_t", positive, required=False),
        default_worst_band_pct=_band(t, "default_worst_band_pct", d.default_worst_band_pct),
    )
    t.finish()
    ok = True
    if kw["nominally_full_pct"] is not None and kw["empty_pct"] is not None and kw["empty_pct"] >= kw["nominally_full_pct"]:
        t.bad("empty_pct", t.data.get("empty_pct", kw["empty_pct"]), f"must be below nominally_full_pct ({num(kw['nominally_full_pct'])} %)")
        ok = False
    dmin = kw["min_operating_displacement_t"]
    if lightship is not None:
        if dmin is None and "min_operating_displacement_t" not in t.data:
            kw["min_operating_displacement_t"] = lightship.mass_t
        elif dmin is not None and dmin < lightship.mass_t:
            t.bad("min_operating_displacement_t", t.data["min_operating_displacement_t"],
                  f"is below the lightship mass {num(lightship.mass_t)} t")
            ok = False
    if not ok or any(v is None for v in kw.values()):
        return None
    return m.FreeSurfaceSettings(**kw)


def _flag(t: Table, k: str) -> bool | None:
    """An optional true/false key (false when absent); None when it is not a boolean."""
    v = t.get(k, False)
    if v is MISSING:
        return False
    if not isinstance(v, bool):
        t.bad(k, v, "must be true or false")
        return None
    return v


FISHING_STANDARD_GM_M = 0.35
"""IS 2008 Part B 2.1 (from memory): GM0 ≥ 0.35 m; below it only with a complete superstructure or
L ≥ 70 m, never below 0.15 m (standards.md §3.2)."""


def _read_criteria(root: Table, particulars: m.Particulars | None) -> m.CriteriaSettings | None:
    t = root.table("criteria", required=False)
    if t is None:
        return None if root.has("criteria") else m.CriteriaSettings()
    code = t.text("code", required=False, default="IS2008-A2.2", choices=("IS2008-A2.2",))
    ship_type = t.text("ship_type", required=False, default="general", choices=m.SHIP_TYPES)
    has_gm = t.has("min_gm_m")
    gm = t.num("min_gm_m", positive, required=False)
    has_p = t.has("wind_pressure_pa")
    # Restricted service may lower P with the Administration's approval (standards.md §2.2);
    # a value beyond these bounds is a typing error, not a wind.
    pressure = t.num("wind_pressure_pa", between(100.0, 1500.0, "Pa", "504 Pa unrestricted, IS 2008 A 2.3"),
                     required=False)
    has_ak = t.has("bilge_keel_area_m2")
    ak = t.num("bilge_keel_area_m2", non_negative, required=False, default=0.0)
    sharp = _flag(t, "sharp_bilged")
    complete = _flag(t, "complete_superstructure")
    t.finish()
    ok = code is not None and ship_type is not None and sharp is not None and complete is not None
    ok &= not (has_gm and gm is None) and not (has_p and pressure is None) and not (has_ak and ak is None)
    if ok and t.has("code") and ship_type != "general":
        t.bad("code", t.data["code"], f"'IS2008-A2.2' is the old name of the general criteria: it cannot be "
              f"combined with ship_type {ship_type!r}; remove code")
        ok = False
    if ok and ship_type != "fishing":
        # keys that change nothing outside the fishing set are refused, not ignored in silence
        own, source = crit.own_gm_limit_m(ship_type)
        if gm is not None and gm < own:
            t.bad("min_gm_m", t.data["min_gm_m"], f"below the {own:g} m GM0 of ship_type {ship_type!r}, {source}: "
                  "it can only make GM0 stricter there and would be ignored; a reduced GM0 is for fishing vessels "
                  "(ship_type = \"fishing\", IS Code 2008 Part B 2.1)")
            ok = False
        if complete:
            t.bad("complete_superstructure", True, "applies to fishing vessels only (ship_type = \"fishing\": "
                  f"a reduced GM0, IS Code 2008 Part B 2.1); with ship_type {ship_type!r} it would be ignored: "
                  "remove it")
            ok = False
    if ok and particulars is not None and ak and ak > particulars.lbp_m * particulars.depth_m:
        t.bad("bilge_keel_area_m2", t.data["bilge_keel_area_m2"],
              f"above LBP × depth ({num(particulars.lbp_m * particulars.depth_m)} m²): not a bilge-keel area")
        ok = False
    if ok and ship_type == "fishing" and gm is not None and gm < FISHING_STANDARD_GM_M:
        length = crit.code_length_m(particulars) if particulars is not None else 0.0
        if gm < crit.FISHING_MIN_GM_FLOOR_M:
            t.bad("min_gm_m", t.data["min_gm_m"], "below 0.15 m: a fishing vessel's GM0 is never reduced below "
                  "0.15 m (IS Code 2008 Part B 2.1, from memory)")
            ok = False
        elif not complete and length < crit.FISHING_REDUCED_GM_LENGTH_M:
            here = f": {crit.code_length_words(particulars)}" if particulars is not None else ""
            t.bad("min_gm_m", t.data["min_gm_m"], "below 0.35 m: IS Code 2008 Part B 2.1 allows that only with a "
                  "complete superstructure (complete_superstructure = true) or L ≥ 70 m (from memory; L the Load "
                  f"Line length, [vessel] length_ll_m, else LBP{here})")
            ok = False
    if not ok:
        return None
    return m.CriteriaSettings(code=code, min_gm_m=gm, ship_type=ship_type, wind_pressure_pa=pressure,
                              bilge_keel_area_m2=ak, sharp_bilged=sharp, complete_superstructure=complete)


def _read_extra_criteria(root: Table, particulars: m.Particulars | None) -> tuple[m.ExtraCriterion, ...] | None:
    """``[[extra_criterion]]``: flag-State or class rules as data, each with its source."""
    breadth = particulars.breadth_m if particulars is not None else 100.0
    length_rule = between(0.0, breadth, "m", "at most the breadth")
    rules = {
        "min_gm": length_rule, "min_gz_at": length_rule, "min_max_gz": length_rule,
        "min_area": between(0.0, 2.0, "m·rad"),
        "min_angle_max_gz": between(0.0, 90.0, "°"), "min_range": between(0.0, 90.0, "°"),
        "max_static_heel": between(0.0, 90.0, "°"), "max_wind_heel": between(0.0, 90.0, "°"),
    }
    out, ok = [], True
    for t in root.tables("extra_criterion"):
        kind = t.text("kind", choices=m.EXTRA_KINDS)
        source = t.text("source")
        limit = t.num("limit", rules[kind]) if kind is not None else t.num("limit")
        kw: dict[str, float] = {}
        if kind == "min_area":
            lo = t.num("from_deg", heel_range)
            hi = t.num("to_deg", heel_range)
            if lo is not None and hi is not None and not lo < hi:
                t.bad("to_deg", t.data["to_deg"], f"must be above from_deg ({num(lo)}°)")
                hi = None
            kw = {"from_deg": lo, "to_deg": hi}
        elif kind == "min_gz_at":
            kw = {"at_deg": t.num("at_deg", heel_range)}
        t.finish()
        if kind is None or source is None or limit is None or any(v is None for v in kw.values()):
            ok = False
            continue
        out.append(m.ExtraCriterion(kind=kind, limit=limit, source=source, **kw))
    return tuple(out) if ok else None


def _read_windage(root: Table, particulars: m.Particulars | None) -> m.Windage | None:
    """``[windage]``: lateral area above the waterline, its centre's height above the waterline and
    the waterline length, against mean draft (booklet style, or made by ``deckload tables``)."""
    t = root.table("windage", required=False)
    if t is None:
        return None
    lbp = particulars.lbp_m if particulars is not None else None
    depth = particulars.depth_m if particulars is not None else None
    area_rules: tuple = (positive,)
    height_rules: tuple = (positive,)
    lwl_rules: tuple = (positive,)
    if lbp is not None and depth is not None:
        # bounds from the vessel's own size: superstructures rarely stand more than a few depths high
        area_rules += (at_most(1.5 * lbp * 10.0 * depth, "m² (1.5 × LBP × 10 × depth): not a lateral area"),)
        height_rules += (at_most(10.0 * depth, "m (10 × depth)"),)
        lwl_rules += (waterline_length_range(particulars).rule,)
    cols = {
        "draft_m": t.increasing("draft_m", t.array("draft_m", positive)),
        "lateral_area_m2": t.array("lateral_area_m2", *area_rules),
        "centroid_above_wl_m": t.array("centroid_above_wl_m", *height_rules),
        "waterline_length_m": t.array("waterline_length_m", *lwl_rules),
    }
    t.finish()
    if not t.same_length("draft_m", cols):
        return None
    if depth is not None and cols["draft_m"][-1] > depth:
        t.bad("draft_m", t.data["draft_m"], f"goes beyond the depth {num(depth)} m")
        return None
    return m.Windage(**{k: m.frozen_array(v) for k, v in cols.items()})


def _read_deck_edge(root: Table) -> m.LimitCurve | None:
    """``[deck_edge]``: deck-edge immersion angle against displacement (made by ``deckload tables``)."""
    t = root.table("deck_edge", required=False)
    if t is None:
        return None
    disp = t.increasing("displacement_t", t.array("displacement_t", positive))
    ang = t.array("angle_deg", between(0.0, 90.0, "°"))
    t.finish()
    if not t.same_length("displacement_t", {"displacement_t": disp, "angle_deg": ang}):
        return None
    return m.LimitCurve(displacement_t=m.frozen_array(disp), value=m.frozen_array(ang), kind="deck_edge_deg")


def _read_passengers(root: Table, particulars: m.Particulars | None,
                     criteria: m.CriteriaSettings | None) -> m.PassengerData | None:
    """``[passengers]``: the inputs of IS 2008 Part A 3.1 (passenger ships only)."""
    t = root.table("passengers", required=False)
    if t is None:
        return None
    half_b = particulars.breadth_m / 2.0 if particulars is not None else 100.0
    count = t.num("count", between(1.0, 10000.0))
    mass = t.num("mass_per_person_t", between(0.060, 0.150, "t", "75 kg each, not below 60 kg: A.749 3.5.2.6"))
    area = t.num("standing_area_m2", positive)
    # A centroid on the centreline, or no speed, would make a heeling lever of nil: never a pass.
    tcg = t.num("standing_tcg_m", positive, between(0.0, half_b, "m", "from the centreline, at most half the breadth"))
    outboard = t.num("standing_outboard_m", positive,
                     between(0.0, half_b, "m", "from the centreline, at most half the breadth"), required=False)
    speed = t.num("service_speed_kn", positive, between(0.0, 60.0, "kn"))
    t.finish()
    if outboard is not None and tcg is not None and outboard < tcg:
        t.bad("standing_outboard_m", t.data["standing_outboard_m"],
              f"the area's outboard edge must lie at or beyond its centroid (standing_tcg_m = {num(tcg)} m)")
        outboard = None
        tcg = None
    if count is not None and count != int(count):
        t.bad("count", t.data["count"], "must be a whole number of passengers")
        count = None
    if criteria is not None and criteria.ship_type != "passenger":
        t.bad("count", t.data.get("count", MISSING), f"[passengers] is for ship_type = \"passenger\" "
              f"(the profile says {criteria.ship_type!r})")
        return None
    if None in (count, mass, area, tcg, speed):
        return None
    return m.PassengerData(int(count), mass, area, tcg, speed, outboard)


def _read_load_lines(root: Table, hydro: m.HydrostaticTable | None, frame: Frame | None, rd: Reading) -> list[m.LoadLine]:
    out: list[m.LoadLine] = []
    seen: set[str] = set()
    for t in root.tables("load_line"):
        name = t.text("name")
        draft = t.num("draft_m", positive)
        f = read_frame(t, frame, drafts=True)
        t.finish()
        if name is not None:
            t.name = f"load_line[{name}]"
            if name in seen:
                t.bad("name", name, "duplicate load-line name")
                continue
            seen.add(name)
        if f is None:
            continue
        if draft is not None and f.draft_basis == "extreme":
            rd.convert(t.name, "draft_m", f"extreme → moulded (− keel {num(f.keel_thickness_m)} m)")
            draft = float(f.draft_to_moulded(draft))
        if draft is not None and hydro is not None and not hydro.draft_m[0] <= draft <= hydro.draft_m[-1]:
            t.bad("draft_m", t.data["draft_m"], f"outside the hydrostatic table's drafts {num(hydro.draft_m[0])}–{num(hydro.draft_m[-1])} m")
            continue
        if name is not None and draft is not None:
            out.append(m.LoadLine(name=name, draft_m=draft))
    return out


CURVE_DRAFT_AGREEMENT = 0.03
"""A curve printed against both draft and displacement: each row's displacement and the one its draft
gives through the hydrostatic table agree within 3 % (UR L5 allows 2 % on a displacement,
standards.md §5.3; 1 % more for the curve's own rounding of the draft)."""


def _abscissa(t: Table, hydro: m.HydrostaticTable | None, frame: Frame | None, rd: Reading,
              where: str) -> tuple[np.ndarray | None, str]:
    """A curve's abscissa: ``displacement_t``, or ``draft_m`` turned into the displacement of the
    hydrostatic table (table density, upright, even keel).  Returns (displacement, 'displacement_t' | 'draft_m')."""
    has_d, has_t = t.has("displacement_t"), t.has("draft_m")
    if has_d and has_t:
        # A booklet page printing both: the displacement is the curve's abscissa, and each row's
        # draft must give that displacement through [hydrostatics] (a row typed against the wrong
        # draft or displacement shows there).
        disp = t.increasing("displacement_t", t.array("displacement_t", positive))
        drafts = t.array("draft_m", positive)
        if disp is None or drafts is None or hydro is None or frame is None:
            return disp, "displacement_t"
        if len(drafts) != len(disp):
            t.bad("draft_m", t.data["draft_m"], f"{len(drafts)} drafts for {len(disp)} displacements")
            return None, "displacement_t"
        moulded = frame.draft_to_moulded(drafts)
        lo, hi = float(hydro.draft_m[0]), float(hydro.draft_m[-1])
        for i, (d, x) in enumerate(zip(moulded, disp)):
            if not lo - 1e-9 <= d <= hi + 1e-9:
                continue  # a draft off the table cannot be compared; the displacement is what is used
            at = interp(hydro.draft_m, hydro.displacement_t, float(d), "draft", "m")
            if abs(at - float(x)) > CURVE_DRAFT_AGREEMENT * float(x):
                t.bad("draft_m", t.data["draft_m"], f"row {i + 1}: draft {num(float(drafts[i]))} m gives {num(at)} t by "
                      f"[hydrostatics], but the row's displacement is {num(float(x))} t (more than "
                      f"{CURVE_DRAFT_AGREEMENT:.0%} apart: a row typed against the wrong draft or displacement?)", (i,))
                return None, "displacement_t"
        rd.convert(where, "draft_m", "both columns given: against displacement; every draft agrees with [hydrostatics]")
        return disp, "displacement_t"
    if not has_t:
        t.get("draft_m", False)
        return t.increasing("displacement_t", t.array("displacement_t", positive)), "displacement_t"
    drafts = t.increasing("draft_m", t.array("draft_m", positive))
    if drafts is None or hydro is None or frame is None:
        return None, "draft_m"
    moulded = frame.draft_to_moulded(drafts)
    lo, hi = float(hydro.draft_m[0]), float(hydro.draft_m[-1])
    for i, d in enumerate(moulded):
        if not lo - 1e-9 <= d <= hi + 1e-9:
            t.bad("draft_m", t.data["draft_m"], f"row {i + 1}: moulded draft {num(d)} m is outside the hydrostatic "
                  f"table's drafts {num(lo)}–{num(hi)} m (nothing is extrapolated)", (i,))
            return None, "draft_m"
    disp = np.array([interp(hydro.draft_m, hydro.displacement_t, float(d), "draft", "m") for d in moulded])
    basis = " (extreme → moulded first)" if frame.draft_basis == "extreme" else ""
    rd.convert(where, "draft_m", f"against draft → against displacement, through [hydrostatics]{basis}")
    return disp, "draft_m"


def _read_limit_curve(root: Table, hydro, frame: Frame | None, rd: Reading) -> m.LimitCurve | None:
    t = root.table("limit_curve", required=False)
    if t is None:
        return None
    if not attach_csv(t, ("displacement_t", "draft_m", "max_kg_m", "min_gm_m")):
        return None
    f = read_frame(t, frame, drafts=True, trims=True)
    disp, against = _abscissa(t, hydro, f, rd, "limit_curve")
    kinds = [k for k in ("max_kg_m", "min_gm_m") if t.has(k)]
    t.get("max_kg_m", False)
    t.get("min_gm_m", False)
    if len(kinds) != 1:
        t.bad("max_kg_m" if not kinds else "min_gm_m", t.data.get("min_gm_m", MISSING),
              "give exactly one of max_kg_m and min_gm_m" + (", not both" if kinds else ""))
        t.finish()
        return None
    kind = kinds[0]
    values = t.array(kind, above_keel) if kind == "max_kg_m" else t.array(kind)
    way = f"+ by the {f.trim_positive}" if f is not None else "+ by the stern"
    trims = t.pair("trim_range_m", required=False, form=f"two trims [from, to] in m ({way}), from below to")
    t.finish()
    if not t.same_length(against, {against: disp, kind: values}) or f is None:
        return None
    if trims is not None and not f.trim_is_identity:
        typed = trims
        trims = f.trim_range_to_stern(trims)
        rd.convert("limit_curve", "trim_range_m", f"{Frame.describe_trim()}: [{num(typed[0])}, {num(typed[1])}] "
                   f"→ [{num(trims[0])}, {num(trims[1])}] m")
    if trims is None and not t.has("trim_range_m"):
        # IS 2008 Part A 2.1.7: such curves must cover the operating trims; without them stated,
        # the curve is judged at whatever trim she floats at.
        rd.assumptions.append("limit_curve: no trim_range_m, so the curve is judged at any trim "
                              "(IS 2008 Part A 2.1.7: it must cover the operating trims; give the booklet's)")
    rd.tables["limit_curve"] = TableReading(f, csv=t.data.get("csv"), against=against, columns=_csv_columns(t))
    return m.LimitCurve(displacement_t=m.frozen_array(disp), value=m.frozen_array(values), kind=kind,
                        trim_range_m=trims)


def _read_downflooding(root: Table, hydro, frame: Frame | None, rd: Reading) -> m.LimitCurve | None:
    t = root.table("downflooding", required=False)
    if t is None:
        return None
    angle_rule = between(0.0, 90.0, "°")
    if t.has("angle_deg") and not isinstance(t.data["angle_deg"], list) and not t.has("csv"):
        # One angle at every displacement, as many booklets give it.
        ang = t.num("angle_deg", angle_rule)
        for k in ("displacement_t", "draft_m"):
            if t.has(k):
                t.bad(k, t.data[k], "a single angle_deg applies at every displacement: give no abscissa with it")
                ang = None
        t.finish()
        if ang is None or hydro is None:
            return None
        rd.assumptions.append(f"downflooding: one angle {num(ang)}° taken at every displacement of the hydrostatic "
                              f"table ({num(hydro.displacement_t[0])}–{num(hydro.displacement_t[-1])} t)")
        rd.tables["downflooding"] = TableReading(Frame(1.0), against="single")
        d = hydro.displacement_t
        return m.LimitCurve(displacement_t=m.frozen_array([d[0], d[-1]]), value=m.frozen_array([ang, ang]),
                            kind="downflooding_deg")
    if not attach_csv(t, ("displacement_t", "draft_m", "angle_deg")):
        return None
    f = read_frame(t, frame, drafts=True)
    disp, against = _abscissa(t, hydro, f, rd, "downflooding")
    ang = t.array("angle_deg", angle_rule)
    t.finish()
    if not t.same_length(against, {against: disp, "angle_deg": ang}) or f is None:
        return None
    rd.tables["downflooding"] = TableReading(f, csv=t.data.get("csv"), against=against, columns=_csv_columns(t))
    return m.LimitCurve(displacement_t=m.frozen_array(disp), value=m.frozen_array(ang), kind="downflooding_deg")


HULL_MATCH_TOLERANCE = 0.001
"""The geometry file's LBP and breadth must match the profile's within 0.1 %: a different hull
would give a 'second method' about another ship."""


def _read_hull_geometry(root: Table, particulars: m.Particulars | None, filename: str, rd: Reading):
    """``hull_geometry``: the geometry file (path relative to the profile) whose hull the direct
    calculation integrates and whose tank shapes correct soundings for trim and list.  Its
    problems are reported as the profile's, naming the file.  Returns (hull body, tank bodies).

    A file that is not there (a profile copied without it) is not an error of the profile,
    whose tables stand on their own: the vessel then has no hull, the assumption says so, and
    the direct calculation and trimmed-sounding corrections say so where they are asked for."""
    name = root.text("hull_geometry", required=False, default=None)
    if name is None:
        return None, {}
    from deckload.core.geometry.builder import hull_body
    from deckload.core.geometry.hull import compartment_body
    from deckload.io.geometry_files import load_geometry

    path = Path(name)
    if not path.is_absolute():
        path = Path(filename).parent / path
    if not path.is_file():
        from deckload.io.limits import note_absent

        note_absent(path)  # the profile cache must miss once the file is there
        rd.assumptions.append(f"hull_geometry {name!r} not found ({path}): no direct calculation from the hull, "
                              "soundings taken trimmed or listed are not corrected")
        return None, {}
    try:
        geometry = load_geometry(path)
    except ProfileError as e:
        root.bad("hull_geometry", name, "the geometry file has problems: " + "; ".join(str(p) for p in e.problems))
        return None, {}
    if particulars is not None:
        for key, ours, theirs in (("lbp_m", particulars.lbp_m, geometry.vessel.lbp_m),
                                  ("breadth_m", particulars.breadth_m, geometry.vessel.breadth_m)):
            if abs(ours - theirs) > HULL_MATCH_TOLERANCE * ours:
                root.bad("hull_geometry", name, f"its {key} {num(theirs)} m is not the profile's {num(ours)} m")
                return None, {}
    bodies = {t.id: compartment_body(t.shape, geometry.hull) for t in geometry.tanks}
    return hull_body(geometry), bodies


def _read_sounding_pipes(root: Table, particulars: m.Particulars | None, frame: Frame | None,
                         rd: Reading) -> dict[str, m.SoundingPipe]:
    """``[sounding_pipes]``: TANK_ID = { x_m, y_m }, where each tank's sounding is read.

    x in the vessel's (or this table's) longitudinal convention, within 20 % of LBP of the
    perpendiculars; y off the centreline (+ starboard), within half the breadth."""
    t = root.table("sounding_pipes", required=False)
    if t is None:
        return {}
    f = read_frame(t, frame)
    out: dict[str, m.SoundingPipe] = {}
    half_b = particulars.breadth_m / 2.0 if particulars is not None else math.inf
    for ident in [k for k in t.data if k not in ("longitudinal_datum", "longitudinal_positive",
                                                   "transverse_positive")]:
        sub = t.table(ident)
        if sub is None:
            continue
        x = _x(sub, "x_m", f)
        y = sub.num("y_m", between(-half_b, half_b, "m", "within the breadth"))
        sub.finish()
        if x is not None and particulars is not None and not -0.2 * particulars.lbp_m <= x <= 1.2 * particulars.lbp_m:
            sub.bad("x_m", sub.data["x_m"], f"is {num(x)} m from the AP: outside the vessel")
            continue
        if x is not None and y is not None:
            out[ident] = m.SoundingPipe(x, y)
    t.finish()
    _note_frame(rd, t.name, f, "x_m", "", False)
    return out


def _check_sounding_pipes(root: Table, pipes: dict[str, m.SoundingPipe], tanks: list[m.Tank],
                          bodies: dict[str, Any]) -> None:
    """Every sounding pipe names a tank of the profile whose shape the hull geometry holds.

    With no tanks read at all, the profile is refused for that (one problem), not once per pipe."""
    if not tanks:
        return
    known = {tk.id for tk in tanks}
    for ident in pipes:
        if ident not in known:
            root.bad("sounding_pipes", ident, "no tank with this id in the profile")
        elif ident not in bodies:
            root.bad("sounding_pipes", ident, "the hull geometry (hull_geometry) has no shape for this tank: "
                     "a trimmed sounding cannot be corrected without it")


def _read_draft_marks(root: Table, particulars: m.Particulars | None, frame: Frame | None,
                      rd: Reading) -> m.DraftMarks | None:
    """``[draft_marks]``: aft, midships, forward marks (x_m in the vessel's or the table's own
    longitudinal convention, y_m off the centreline).  They read extreme drafts: moulded plus
    ``[vessel] keel_thickness_m``.

    Bounds from the vessel: marks within 20 % of LBP beyond either perpendicular, no further
    off the centreline than half the breadth, aft < midships < forward with the aft and
    forward marks at least half the LBP apart (the trim is found from their difference).
    """
    t = root.table("draft_marks", required=False)
    if t is None:
        return None
    f = read_frame(t, frame)
    half_b = particulars.breadth_m / 2.0 if particulars is not None else None
    y_rule = between(0.0, half_b, "m", "between the centreline and the side") if half_b is not None else non_negative
    found: dict[str, m.DraftMark | None] = {}
    for where in ("aft", "midships", "forward"):
        sub = t.table(where)
        if sub is None:
            found[where] = None
            continue
        x = _x(sub, "x_m", f)
        y = sub.num("y_m", y_rule)
        sub.finish()
        if x is not None and particulars is not None and not -0.2 * particulars.lbp_m <= x <= 1.2 * particulars.lbp_m:
            sub.bad("x_m", sub.data["x_m"], f"is {num(x)} m from the AP: marks lie within 20 % of LBP of the perpendiculars")
            x = None
        found[where] = None if x is None or y is None else m.DraftMark(x, y)
    t.finish()
    _note_frame(rd, t.name, f, "x_m", "", False)
    if any(v is None for v in found.values()) or particulars is None:
        return None
    lbp = particulars.lbp_m
    a, mid, fw = found["aft"], found["midships"], found["forward"]
    if not a.x_m < mid.x_m < fw.x_m:
        t.bad("midships", t.data["midships"], "the marks must lie aft < midships < forward")
        return None
    if fw.x_m - a.x_m < 0.5 * lbp:
        t.bad("forward", t.data["forward"], f"only {num(fw.x_m - a.x_m)} m forward of the aft marks: they must be at "
              f"least half the LBP ({num(0.5 * lbp)} m) apart to give the trim")
        return None
    return m.DraftMarks(a, mid, fw)


def _read_tanks(root: Table, fs: m.FreeSurfaceSettings | None, ids: dict[str, str], frame: Frame | None,
                rd: Reading, depth_m: float, trim_range=None) -> list[m.Tank]:
    entries = []
    complete = True
    for t in root.tables("tank"):
        kw, ok_tank = _read_tank(t, fs, ids, frame, rd, depth_m, trim_range)
        entries.append((t, kw))
        complete &= ok_tank
    ok = check_tank_pairs([(t, kw["id"], kw.get("pair")) if kw is not None else (t, None, None) for t, kw in entries])
    if not ok or not complete:
        return []
    return [m.Tank(**kw) for _, kw in entries]


def _fsm_max(t: Table) -> tuple[float | None, str, bool]:
    """A tank's one maximum free-surface value as fsi (m⁴): (value, 'max'|'none', ok)."""
    has_i, has_m = t.has("max_fsi_m4"), t.has("max_fsm_tm")
    fi = t.num("max_fsi_m4", non_negative, required=False)
    fm = t.num("max_fsm_tm", non_negative, required=False)
    if has_i and has_m:
        t.bad("max_fsm_tm", t.data["max_fsm_tm"], "give max_fsi_m4 or max_fsm_tm, not both")
        return None, "max", False
    if has_i:
        return fi, "max", fi is not None
    if has_m:
        if not t.has("fsm_density_t_m3"):
            t.bad("fsm_density_t_m3", MISSING, "required with max_fsm_tm: the density the booklet's t·m are given for")
            t.get("fsm_density_t_m3", False)
            return None, "max", False
        rho = t.num("fsm_density_t_m3", liquid_density)
        if fm is None or rho is None:
            return None, "max", False
        return fm / rho, "max", True
    return None, "none", True


PIPE_HEAD_M = 2.0
"""How far a sounding-pipe head (an ullage reference) may stand above the deck (m): common practice."""


def _read_tank(t: Table, fs: m.FreeSurfaceSettings | None, ids: dict[str, str], frame: Frame | None,
               rd: Reading, depth_m: float, trim_range=None) -> tuple[dict | None, bool]:
    """The Tank's keyword arguments and whether they are complete (else only id and pair)."""
    ident = claim_id(t, "tank", ids)
    kw: dict[str, Any] = dict(id=ident, name=t.text("name"))
    kind = t.text("kind", choices=m.LIQUID_KINDS)
    kw["kind"] = kind
    kw["density_t_m3"] = t.num("density_t_m3", liquid_density)
    capacity = t.num("capacity_m3", positive)
    kw["capacity_m3"] = capacity
    top_pct = t.num("table_top_pct", between(*TABLE_TOP_PCT_RANGE, "%", "the fill of the calibration table's "
                    "last row, as a percent of the whole tank"), required=False, default=100.0)
    kw["table_top_pct"] = top_pct
    pair = t.text("pair", required=False, default=None)
    kw["pair"] = pair
    if t.has("pair") and pair is not None and not ID_PATTERN.match(pair):
        t.bad("pair", pair, "must be a tank id (letters, digits, '-' and '_')")
        kw["pair"] = pair = None
    default_cat = "variable" if kind in m.CONSUMABLE_KINDS else "fixed"
    kw["fs_category"] = t.text("fs_category", required=False, default=default_cat, choices=("fixed", "variable"))
    kw["worst_band_pct"] = _band(t, "worst_band_pct", None if fs is None else fs.default_worst_band_pct)
    f = read_frame(t, frame, sides=True)
    # Both are heights from the tank's lowest point, so within the vessel's depth; a sounding-pipe
    # head may stand above the deck (allowance PIPE_HEAD_M, common practice).
    zero_rule = between(-depth_m, depth_m, "m", "the sounding zero's height from the tank's lowest point, "
                        "within the vessel's depth")
    ref_rule = between(0.0, depth_m + PIPE_HEAD_M, "m", "the ullage reference's height above the tank's lowest point: "
                       f"within the depth plus {num(PIPE_HEAD_M)} m of sounding-pipe head")
    kw["sounding_zero_m"] = t.num("sounding_zero_m", zero_rule, required=False, default=0.0)
    kw["ullage_reference_m"] = t.num("ullage_reference_m", positive, ref_rule, required=False, default=None)
    bad_level = (t.has("sounding_zero_m") and kw["sounding_zero_m"] is None) or (t.has("ullage_reference_m") and kw["ullage_reference_m"] is None)
    max_fsi, fsi_given, fsm_ok = _fsm_max(t)
    where = t.name
    capacity_only = not t.has("calibration")
    if capacity_only:
        # A small tank known only by its capacity and centre (booklet's "capacity only" list).
        lcg = _x(t, "lcg_m", f)
        vcg = t.num("vcg_m", above_keel)
        tcg, marked = tcg_num(t, "tcg_m", f)
        t.get("calibration", False)
        for k in ("sounding_zero_m", "ullage_reference_m", "table_top_pct"):
            if t.has(k):
                t.bad(k, t.data[k], "a tank without a calibration table has no level: give [tank.calibration] or leave this out")
                bad_level = True
        kw["calibration"] = None
        if None not in (lcg, vcg, tcg, capacity, f) and fsm_ok and not bad_level:
            fsi = max_fsi if max_fsi is not None else 0.0
            kw["calibration"] = m.TankCalibration(
                sounding_m=m.frozen_array([0.0, 1.0]), volume_m3=m.frozen_array([0.0, capacity]),
                lcg_m=m.frozen_array([lcg, lcg]), vcg_m=m.frozen_array([vcg, vcg]), tcg_m=m.frozen_array([tcg, tcg]),
                fsi_m4=m.frozen_array([fsi, fsi]))
            kw["level_known"] = False
            kw["fsi_given"] = fsi_given
            if fsi_given == "none" and not t.has("worst_band_pct"):
                kw["worst_band_pct"] = (0.0, 0.0)  # no free surface, so no worst slack band to warn of
            fs_words = (f"free surface: the given maximum {num(fsi)} m⁴ at every slack fill" if fsi_given == "max"
                        else "no free surface given: counted as nil")
            rd.assumptions.append(f"{where}: capacity and centre only: centre fixed at every fill; {fs_words}; "
                                  "stated by %, m³ or t (no sounding or ullage)")
            _note_frame(rd, where, f, "lcg_m", "tcg_m" if t.has("tcg_m") else "", marked)
    else:
        for k in ("lcg_m", "vcg_m", "tcg_m"):
            if t.has(k):
                t.bad(k, t.data[k], "a tank with a calibration table takes its centres from the table; "
                      "lcg/vcg/tcg belong to a capacity-only tank")
                t.get(k, False)
        cal = t.table("calibration")
        kw["calibration"] = None
        if cal is not None:
            kw["calibration"] = _read_calibration(cal, capacity, t, f, rd, kw, max_fsi if fsi_given == "max" else None, fsm_ok)
            if bad_level:
                kw["calibration"] = None
    kw["trim_correction"] = None
    if t.has("trim_correction"):
        tc = t.table("trim_correction")
        if tc is not None:
            if kw["calibration"] is None or capacity_only:
                if capacity_only:
                    t.bad("trim_correction", MISSING, "a tank without a calibration table has no soundings to correct")
                for k in list(tc.data):
                    tc.get(k, False)
                kw["calibration"] = None
            else:
                kw["trim_correction"] = _read_trim_correction(tc, kw, trim_range, f, rd)
                if kw["trim_correction"] is None:
                    kw["calibration"] = None  # marks the tank unusable (the problem is reported)
    else:
        t.get("trim_correction", False)
    if t.has("transfer"):
        tr = t.table("transfer")
        kw["transfer"] = None if tr is None else _read_transfer(tr)
        if kw["transfer"] is None:
            kw["calibration"] = None  # marks the tank unusable
    else:
        t.get("transfer", False)
        kw["transfer"] = None
    t.finish()
    if kw["calibration"] is None or any(kw[k] is None for k in ("id", "name", "kind", "density_t_m3", "capacity_m3",
                                                                   "fs_category", "worst_band_pct", "table_top_pct")):
        return ({"id": ident, "pair": pair} if ident else None), False
    rd.free_surface.setdefault(_fs_basis(t, kw, rd.tables.get(f"{where}.calibration")), []).append(kw["id"])
    return kw, True


def _row(i: int) -> str:
    return f"row {i + 1}"


CAL_COLUMNS = ("sounding_m", "ullage_m", "volume_m3", "lcg_m", "vcg_m", "tcg_m", "fsi_m4", "fsm_tm")


def _read_calibration(t: Table, capacity: float | None, tank: Table, tank_frame: Frame | None, rd: Reading,
                      kw: dict, max_fsi: float | None, fsm_ok: bool) -> m.TankCalibration | None:
    """A tank's calibration as the booklet prints it, converted to levels from the tank's lowest point.

    level = sounding + sounding_zero_m = ullage_reference_m − ullage; rows may run either
    way; FSM in t·m at a stated density becomes fsi = FSM/ρ; a table that starts above
    the bottom gets a row 'level 0, volume 0' with the first row's centres (conservative).
    """
    where = t.name
    if not attach_csv(t, CAL_COLUMNS, CAL_IGNORED):
        return None
    if all(t.raw + (k,) in t.ctx.csv_texts for k in ("sounding_m", "ullage_m")):
        # A page printing both readings: the soundings are the table's level, the ullages read along.
        t.ctx.csv_ignored.setdefault(t.raw, []).append("ullage_m")
    along = t.ctx.csv_ignored.get(t.raw, [])
    f = read_frame(t, tank_frame, sides=True)
    tr = TableReading(f or Frame(1.0), csv=t.data.get("csv"), columns=_csv_columns(t))
    levels_given = [k for k in ("sounding_m", "ullage_m") if t.has(k) and k not in along]
    if len(levels_given) != 1:
        t.bad("sounding_m", MISSING if not levels_given else t.data["sounding_m"],
              "give exactly one of sounding_m and ullage_m" + (", not both" if levels_given else ""))
        for k in ("sounding_m", "ullage_m"):
            t.get(k, False)
        level_key = None
        reading = None
    else:
        level_key = levels_given[0]
        reading = t.array(level_key)
    volume = t.array("volume_m3", non_negative)
    lcg = t.array("lcg_m")
    vcg = t.array("vcg_m", above_keel)
    tcg, marked = tcg_array(t, "tcg_m", f)
    # free surface: a column in m⁴ or t·m, or none (the tank's one maximum, or a capacity-only tank)
    fsm_keys = [k for k in ("fsi_m4", "fsm_tm") if t.has(k)]
    fsi = None
    fs_ok = True
    if len(fsm_keys) == 2:
        t.bad("fsm_tm", t.data["fsm_tm"], "give fsi_m4 or fsm_tm, not both")
        t.get("fsi_m4", False)
        fs_ok = False
    elif fsm_keys == ["fsi_m4"]:
        fsi = t.array("fsi_m4", non_negative)
        fs_ok = fsi is not None
        t.get("fsm_density_t_m3", False)
        if t.has("fsm_density_t_m3"):
            t.bad("fsm_density_t_m3", t.data["fsm_density_t_m3"], "belongs with fsm_tm (t·m), not fsi_m4 (m⁴)")
            fs_ok = False
    elif fsm_keys == ["fsm_tm"]:
        fsm = t.array("fsm_tm", non_negative)
        rho = t.num("fsm_density_t_m3", liquid_density, required=True)
        fs_ok = fsm is not None and rho is not None
        if fs_ok:
            fsi = fsm / rho
            tr.fsm, tr.fsm_density_t_m3 = "fsm_tm", rho
            rd.convert(where, "fsm_tm", f"t·m at {num(rho)} t/m³ → fsi_m4 (÷ {num(rho)})")
    else:
        t.get("fsi_m4", False)
        t.get("fsm_density_t_m3", False)
        tr.fsm = ""
        if max_fsi is None:
            if fsm_ok:
                t.bad("fsi_m4", MISSING, "give fsi_m4 or fsm_tm per row, or one max_fsi_m4 / max_fsm_tm for the tank")
            fs_ok = False
    if (max_fsi is not None) and fsm_keys:
        tank.bad("max_fsi_m4" if tank.has("max_fsi_m4") else "max_fsm_tm", tank.data.get("max_fsi_m4", tank.data.get("max_fsm_tm")),
                 "the calibration already gives free surface per row: give one or the other")
        fs_ok = False
    tr.ignored = _read_ignored(t, where, rd)
    if tr.ignored is not None and level_key == "sounding_m" and reading is not None:
        _soundings_beside_ullages(t, reading, dict(tr.ignored).get("ullage_m"))
    t.finish()
    if tr.ignored is None:
        return None
    cols = {"level": reading, "volume_m3": volume, "lcg_m": lcg, "vcg_m": vcg, "tcg_m": tcg}
    if level_key is None or not fs_ok or not fsm_ok or f is None:
        return None
    if fsi is None:
        fsi = np.full(len(volume) if volume is not None else 0, max_fsi)
    cols["fsi_m4"] = fsi
    n = t.raw_len(level_key)
    for k, a in cols.items():
        if a is None:
            return None
        if len(a) != n:
            key = level_key if k == "level" else k
            t.bad(key, t.data.get(key, MISSING), f"has {len(a)} values but {level_key} has {n}: one value per row")
            return None
    # the level above the tank's lowest point
    if level_key == "ullage_m":
        ref = kw.get("ullage_reference_m")
        if ref is None:
            tank.bad("ullage_reference_m", MISSING, "required with an ullage table: the height of the ullage "
                     "reference point above the tank's lowest point")
            return None
        level = ref - reading
        rd.convert(where, "ullage_m", f"ullage → level above the tank bottom (level = {num(ref)} − ullage)")
    else:
        z0 = kw.get("sounding_zero_m") or 0.0
        level = reading + z0
        if z0:
            rd.convert(where, "sounding_m", f"sounding zero {num(z0)} m above the tank bottom → level (sounding + {num(z0)})")
    # rows may be written with the level falling (ullage tables usually are): turn them round
    if len(level) >= 2 and np.all(np.diff(level) < 0):
        cols = {k: a[::-1].copy() for k, a in cols.items()}
        level = level[::-1].copy()
        tr.reversed = True
    cols["level"] = level
    for key, arr in ((level_key, level), ("volume_m3", cols["volume_m3"])):
        d = np.diff(arr)
        if np.any(d <= 0):
            i = int(np.argmax(d <= 0)) + 1
            row = n - 1 - i if tr.reversed else i
            prev = row + 1 if tr.reversed else row - 1
            way = "decreasing" if tr.reversed else "increasing"
            ullage = ""
            if key == "volume_m3" and level_key == "sounding_m" and np.all(d < 0):
                # every volume falls as the sounding rises: the column is the page's ullage
                ullage = ("; every volume falls as the sounding rises: is it an ullage table typed as sounding_m? "
                          "Name the column ullage_m and give the tank's ullage_reference_m")
            t.bad(key, t.data[key], f"not strictly {way} ({_row(row)}: {toml_value(t.data[key][row])} after "
                  f"{toml_value(t.data[key][prev])}){ullage}", (row,))
            return None
    if level[0] < -1e-9:
        row = n - 1 if tr.reversed else 0
        t.bad(level_key, t.data[level_key], f"row {row + 1} lies {num(-level[0])} m below the tank's lowest point "
              "(check sounding_zero_m / ullage_reference_m)", (row,))
        return None
    if cols["volume_m3"][0] == 0.0:
        if abs(level[0]) > 1e-9:
            row = n - 1 if tr.reversed else 0
            t.bad(level_key, t.data[level_key], f"must start at 0 (the tank bottom): the empty row (volume 0) is "
                  f"{num(level[0])} m above the tank's lowest point (where the reading's zero is not at the bottom, "
                  "give sounding_zero_m or ullage_reference_m)", (row,))
            return None
        cols["level"][0] = 0.0
    else:
        # The table starts above the bottom: add 'level 0, volume 0' with the first row's centres.
        cols = {k: np.concatenate([[a[0]], a]) for k, a in cols.items()}
        cols["level"][0] = 0.0
        cols["volume_m3"][0] = 0.0
        tr.added_bottom_row = True
        rd.assumptions.append(f"{where}: the table starts at {num(cols['volume_m3'][1])} m³; below it the contents' "
                              "centre and free surface are taken as at the first row (centre no lower: conservative for KG)")
    if not f.y_is_identity or marked or not f.x_is_identity:
        _note_frame(rd, where, f, "lcg_m", "tcg_m", marked)
    tr.level = level_key
    tr.tcg_marked = marked
    cols["lcg_m"] = f.x_to_ap(cols["lcg_m"])
    vcg = cols["vcg_m"]
    dv = np.diff(vcg)
    if np.any(dv < -1e-6):
        i = int(np.argmax(dv < -1e-6)) + 1
        row = i - (1 if tr.added_bottom_row else 0)
        row = n - 1 - row if tr.reversed else row
        prev = row + 1 if tr.reversed else row - 1
        t.bad("vcg_m", t.data["vcg_m"], f"falls as the tank fills (row {row + 1}: {toml_value(t.data['vcg_m'][row])} after "
              f"{toml_value(t.data['vcg_m'][prev])}); "
              "the contents' centre can only rise", (row,))
        return None
    top_pct = kw.get("table_top_pct")
    if capacity is not None and top_pct is not None:
        last = float(cols["volume_m3"][-1])
        # The booklet prints the capacity and the table each to its own decimals: each may carry
        # half a unit of its last decimal printed (24.1 for 24.068), up to a whole m³'s rounding.
        printed = min(CAPACITY_PRINTED_MAX_M3, printed_half_unit(tank.data["capacity_m3"])
                      + printed_half_unit(t.written("volume_m3", 0 if tr.reversed else n - 1)))
        allowed = max(CAPACITY_TOLERANCE * last, printed)
        # A table printed to 98 % of the tank (table_top_pct): the capacity may be typed as the
        # table's top, as printed beside it, or as the whole tank; either way the whole is the top
        # ÷ 0.98, so that the 98 % line falls exactly on the table's last row.
        whole = last * 100.0 / top_pct

        def fits(pct: float) -> bool:  # the capacity typed is the whole of a tank whose table ends at pct %
            return abs(last * 100.0 / pct - capacity) <= allowed * 100.0 / pct * (1.0 + 1e-9)

        if top_pct < 100.0 and (fits(top_pct) or fits(100.0)):
            kw["capacity_m3"] = whole
            typed = "the whole tank" if fits(top_pct) else "the table's top"
            rd.convert(tank.name, "capacity_m3", f"{num(capacity)} m³ as printed ({typed}) → {num(whole)} m³ at "
                       f"100 %, the calibration's last volume {num(last)} m³ being {num(top_pct)} % (table_top_pct)")
        elif not fits(100.0):
            if top_pct < 100.0:
                hint = (f"; with table_top_pct = {num(top_pct)} it must be the table's top or "
                        f"{num(whole)} m³, the whole tank")
            else:
                near = next((p for p in (98.0, 95.0) if fits(p)), None) if capacity > last else None
                hint = ("" if near is None else f"; the table's last row is {num(near)} % of it: if the booklet "
                        f"prints the table only to {num(near)} % of the tank, say so with table_top_pct = {num(near)}")
            tank.bad("capacity_m3", tank.data["capacity_m3"],
                     f"differs from the last calibration volume {num(last)} m³ by "
                     f"{_percent(100 * abs(capacity - last) / last)} % (at most {100 * CAPACITY_TOLERANCE:g} % allowed, "
                     f"or {num(printed)} m³, half a unit of the last decimals printed){hint}")
            return None
        elif abs(capacity - last) > CAPACITY_TOLERANCE * last:
            # Beyond round-off, within the printing: the table is what every fill is read from,
            # so its last volume is 100 % (never more than the table holds, never a slack top).
            kw["capacity_m3"] = last
            rd.convert(tank.name, "capacity_m3", f"{num(capacity)} m³ as printed → {num(last)} m³, the calibration's "
                       f"last volume (they differ by the rounding of the decimals printed, ±{num(printed)} m³)")
    if max_fsi is not None:
        kw["fsi_given"] = "max"
        rd.assumptions.append(f"{tank.name}: one free-surface value for the tank, {num(max_fsi)} m⁴, used at every "
                              "slack fill (a maximum: conservative)")
    rd.tables[where] = tr
    return m.TankCalibration(sounding_m=m.frozen_array(cols["level"]), volume_m3=m.frozen_array(cols["volume_m3"]),
                             lcg_m=m.frozen_array(cols["lcg_m"]), vcg_m=m.frozen_array(cols["vcg_m"]),
                             tcg_m=m.frozen_array(cols["tcg_m"]), fsi_m4=m.frozen_array(cols["fsi_m4"]))
TRIM_CORRECTION_REACH = 1.2
"""A tank is at most 1.2·LBP long (the audit's envelope): a trim t tilts its surface by at most 1.2·|t|."""


def _read_trim_correction(t: Table, kw: dict, trim_range, tank_frame: Frame | None = None,
                          rd: Reading | None = None) -> m.TrimCorrection | None:
    """``[tank.trim_correction]``: the booklet's trim corrections for soundings (model.TrimCorrection).

    ``trim_m`` (m, + by the stern, or + by the head with ``trim_positive = "head"`` here or in
    ``[vessel]``) strictly increasing as typed, none 0 (the calibration itself), each within the table-trim range; ``sounding_m`` strictly increasing,
    each a sounding the tank can show (its level within the calibration); and one of
    ``sounding_correction_m`` (|correction| at most the calibration's height) or ``volume_m3``
    (0 … capacity), one row per sounding and one column per trim.  Typed + by the head, the trims
    are turned + by the stern and the columns put in rising order, after every check on them as typed.
    """
    f = trim_frame(t, tank_frame or Frame(1.0))
    if not attach_trim_csv(t):
        return None
    cal: m.TankCalibration = kw["calibration"]
    zero = kw["sounding_zero_m"] or 0.0
    top = float(cal.sounding_m[-1])
    trims = t.increasing("trim_m", t.array("trim_m", lambda x: trim_range.rule(x) if trim_range else None, min_len=1))
    if trims is not None and np.any(np.abs(trims) < 1e-9):
        t.bad("trim_m", t.data["trim_m"], "trim 0 is the calibration table itself; give only the other trims")
        trims = None
    sound_rule = between(0.0 - zero, top - zero, "m", "a sounding the tank can show: its level within the calibration")
    sound = t.increasing("sounding_m", t.array("sounding_m", sound_rule))
    has_corr, has_vol = t.has("sounding_correction_m"), t.has("volume_m3")
    if has_corr == has_vol:
        t.get("sounding_correction_m", False)
        t.get("volume_m3", False)
        t.bad("sounding_correction_m", t.data.get("sounding_correction_m", MISSING),
              "give one of sounding_correction_m (m, added to the observed sounding) or volume_m3 (m³ at that "
              "sounding and trim)")
        t.finish()
        return None
    key = "sounding_correction_m" if has_corr else "volume_m3"
    val = t.matrix(key, "sounding_m", t.raw_len("sounding_m"), "trim_m", t.raw_len("trim_m"))
    t.finish()
    if trims is None or sound is None or val is None or f is None:
        return None
    cap = float(cal.volume_m3[-1])
    lo, hi = (-top, top) if has_corr else (0.0, cap * (1 + CAPACITY_TOLERANCE))
    bad = np.argwhere((val < lo) | (val > hi))
    if bad.size:
        i, j = (int(x) for x in bad[0])
        what = (f"a sounding correction must stay within ±{num(top)} m, the calibration's height" if has_corr
                else f"a volume must lie within 0–{num(cap)} m³, the tank's capacity")
        t.bad(key, t.data[key], f"row {i + 1}, column {j + 1}: {num(float(val[i, j]))} is outside the tank: {what}",
              (i, j))
        return None
    # The surface through the pipe reading tilts by t/LBP; over a tank no longer than the waterline
    # (1.2·LBP, as the audit's envelope) it lies within s ± 1.2·|t| of the reading, so the even-keel
    # level holding the same volume does too (the volume rises with the level): derived.
    reach = TRIM_CORRECTION_REACH * np.abs(trims)[None, :]
    if has_corr:
        bad = np.argwhere(np.abs(val) > reach + 1e-9)
    else:
        lev = sound[:, None] + zero
        lo_v = np.interp(np.clip(lev - reach, 0.0, top), cal.sounding_m, cal.volume_m3)
        hi_v = np.interp(np.clip(lev + reach, 0.0, top), cal.sounding_m, cal.volume_m3)
        bad = np.argwhere((val < lo_v * (1 - CAPACITY_TOLERANCE) - 1e-9) | (val > hi_v * (1 + CAPACITY_TOLERANCE) + 1e-9))
    if bad.size:
        i, j = (int(x) for x in bad[0])
        t.bad(key, t.data[key], f"row {i + 1}, column {j + 1}: {num(float(val[i, j]))} at trim {num(float(trims[j]))} m "
              f"is more than a surface tilted {num(float(trims[j]))} m over LBP can make (the level within "
              f"±{num(float(reach[0, j]))} m of the sounding read, 1.2 × the trim): a unit or column slip?", (i, j))
        return None
    if rd is not None:
        rd.tables[t.name] = TableReading(f, csv=t.data.get("csv"), columns=_csv_columns(t))
    if not f.trim_is_identity:
        if rd is not None:
            rd.convert(t.name, "trim_m", f"{Frame.describe_trim()}; columns put in rising order")
        trims, val = f.trim_to_stern(trims)[::-1].copy(), val[:, ::-1].copy()
    return m.TrimCorrection(trim_m=m.frozen_array(trims), sounding_m=m.frozen_array(sound),
                            value=m.frozen_array(val), kind=key)


def _read_transfer(t: Table) -> m.FluidTransfer | None:
    fill = t.increasing("fill_pct", t.array("fill_pct", percent_range))
    fill = t.starts_at("fill_pct", fill, 0.0, "empty")
    if fill is not None and fill[-1] != 100.0:
        t.bad("fill_pct", t.data["fill_pct"], "must end at 100 (full)")
        fill = None
    heel = t.increasing("heel_deg", t.array("heel_deg", heel_range))
    heel = t.starts_at("heel_deg", heel, 0.0, "upright")
    heel = t.ends_at("heel_deg", heel, 90.0, "the GZ curve runs 0–90°; nothing is extrapolated")
    mom = t.matrix("moment_m4", "fill_pct", t.raw_len("fill_pct"), "heel_deg", t.raw_len("heel_deg"))
    port = (t.matrix("moment_port_m4", "fill_pct", t.raw_len("fill_pct"), "heel_deg", t.raw_len("heel_deg"))
            if "moment_port_m4" in t.data else None)
    t.finish()
    if fill is None or heel is None or mom is None or ("moment_port_m4" in t.data and port is None):
        return None
    return m.FluidTransfer(fill_pct=m.frozen_array(fill), heel_deg=m.frozen_array(heel), moment_m4=m.frozen_array(mom),
                           moment_port_m4=None if port is None else m.frozen_array(port))


HOLD_FILL_COLUMNS = ("fill_pct", "fill_vcg_m", "fill_lcg_m")


def _read_holds(root: Table, ids: dict[str, str], frame: Frame | None, rd: Reading) -> list[m.Hold]:
    out, ok = [], True
    for t in root.tables("hold"):
        ident = claim_id(t, "hold", ids)
        fill_read = attach_csv(t, HOLD_FILL_COLUMNS, HOLD_IGNORED)
        f = read_frame(t, frame, sides=True)
        tcg, marked = tcg_num(t, "tcg_m", f)
        kw: dict[str, Any] = dict(
            id=ident,
            name=t.text("name"),
            capacity_m3=t.num("capacity_m3", positive),
            lcg_m=_x(t, "lcg_m", f),
            vcg_m=t.num("vcg_m", above_keel),
            tcg_m=tcg,
        )
        has_max = t.has("max_mass_t")
        kw["max_mass_t"] = t.num("max_mass_t", positive, required=False)
        fill_keys = HOLD_FILL_COLUMNS
        present = [k for k in fill_keys if t.has(k)]
        cols: dict[str, np.ndarray | None] = {}
        for k in fill_keys:
            if k in present:
                rules = (percent_range,) if k == "fill_pct" else (above_keel,) if k == "fill_vcg_m" else ()
                cols[k] = t.array(k, *rules)
            else:
                t.get(k, False)
        fill_ok = True
        if present:
            if "fill_pct" not in present or "fill_vcg_m" not in present:
                missing = "fill_pct" if "fill_pct" not in present else "fill_vcg_m"
                t.bad(missing, MISSING, "required with " + " and ".join(present) + " (centroid-against-fill table)")
                fill_ok = False
            else:
                fill = t.increasing("fill_pct", cols["fill_pct"])
                if fill is not None and (fill[0] != 0.0 or fill[-1] != 100.0):
                    # the engine interpolates at any fill from empty to full, never beyond the table
                    t.bad("fill_pct", t.data["fill_pct"], "must run from 0 to 100 (empty to full)")
                    fill = None
                cols["fill_pct"] = fill
                fill_ok = t.same_length("fill_pct", cols)
        ignored = _read_ignored(t, t.name, rd)
        ends_ok = _hold_ends(t, f, kw, cols.get("fill_lcg_m") if present else None)
        t.finish()
        fill_ok &= ignored is not None
        if (not fill_ok or not ends_ok or not fill_read or f is None
                or any(v is None for k, v in kw.items() if k not in ("max_mass_t", "x_extent_m"))
                or (has_max and kw["max_mass_t"] is None)):
            ok = False
            continue
        _note_frame(rd, t.name, f, "lcg_m" + (", fill_lcg_m" if "fill_lcg_m" in cols else ""),
                    "tcg_m" if t.has("tcg_m") else "", marked)
        if cols.get("fill_lcg_m") is not None:
            cols["fill_lcg_m"] = f.x_to_ap(cols["fill_lcg_m"])
        if present:
            rd.tables[t.name] = TableReading(f, csv=t.data.get("csv"), columns=_csv_columns(t), ignored=ignored)
        for k in fill_keys:
            kw[k] = m.frozen_array(cols[k]) if k in cols else None
        out.append(m.Hold(**kw))
    return out if ok else []


def _x_ends(t: Table, f: Frame | None, noun: str) -> tuple[bool, tuple[float, float] | None]:
    """A space's optional two ends ``x_m`` (in the table's datum) as metres from the AP, aft end first:
    (all well, the ends or None when not given)."""
    if not t.has("x_m"):
        return True, None
    xs = t.array("x_m", length=2)
    if xs is None or f is None:
        return False, None
    if xs[0] == xs[1]:
        t.bad("x_m", t.data["x_m"], f"the {noun}'s two ends must differ (aft end and forward end, in the table's datum)")
        return False, None
    a, b = sorted(float(v) for v in f.x_to_ap(xs))
    return True, (a, b)


def _centre_between_ends(t: Table, lcg: float | None, ends: tuple[float, float], noun: str) -> bool:
    """Whether the space's own centre ``lcg_m`` lies between its ends (within
    :data:`deckload.core.bounds.AREA_EDGE_TOLERANCE_M`); else the problem is reported."""
    tol = bounds.AREA_EDGE_TOLERANCE_M
    if lcg is None or ends[0] - tol <= lcg <= ends[1] + tol:
        return True
    t.bad("lcg_m", t.data["lcg_m"], f"the {noun}'s centre lies outside its own ends x_m ({num(ends[0])}–{num(ends[1])} m "
          "from the AP): the two are in the same datum (the table's)")
    return False


def _hold_ends(t: Table, f: Frame | None, kw: dict[str, Any], fill_lcg) -> bool:
    """A hold's optional ends (``x_m``, :func:`_x_ends`) into ``kw`` as ``x_extent_m``.  The hold's own
    centre, and every centre of its centroid-against-fill table, must lie between them (within
    :data:`deckload.core.bounds.AREA_EDGE_TOLERANCE_M`): a cargo centre stated in a condition is then
    held to them (:func:`deckload.core.bounds.off_span_x`), as a deck load is to its area's.  Returns
    whether all is well."""
    ok, ends = _x_ends(t, f, "hold")
    kw["x_extent_m"] = ends
    if not ok or ends is None:
        return ok
    if not _centre_between_ends(t, kw.get("lcg_m"), ends, "hold"):
        return False
    a, b = ends
    tol = bounds.AREA_EDGE_TOLERANCE_M
    if fill_lcg is not None:
        x = f.x_to_ap(np.asarray(fill_lcg, dtype=float))
        out = np.flatnonzero((x < a - tol) | (x > b + tol))
        if len(out):
            t.bad("fill_lcg_m", t.data["fill_lcg_m"], f"row {int(out[0]) + 1} lies outside the hold's ends x_m "
                  f"({num(a)}–{num(b)} m from the AP): the cargo's centre is inside the hold", (int(out[0]),))
            return False
    return True


def _read_deck_areas(root: Table, ids: dict[str, str], frame: Frame | None, rd: Reading) -> list[m.DeckArea]:
    out, ok = [], True
    for t in root.tables("deck_area"):
        ident = claim_id(t, "deck_area", ids)
        f = read_frame(t, frame, sides=True)
        tcg, marked = tcg_num(t, "tcg_m", f)
        kw: dict[str, Any] = dict(
            id=ident,
            name=t.text("name"),
            area_m2=t.num("area_m2", positive),
            lcg_m=_x(t, "lcg_m", f),
            deck_height_m=t.num("deck_height_m", above_keel),
            tcg_m=tcg,
        )
        has_max = t.has("max_load_t_m2")
        kw["max_load_t_m2"] = t.num("max_load_t_m2", positive, required=False)
        extent_ok, xs_marked = _deck_area_extent(t, f, kw)
        t.finish()
        if (f is None or not extent_ok or any(v is None for k, v in kw.items() if k not in _DECK_AREA_OPTIONAL)
                or (has_max and kw["max_load_t_m2"] is None)):
            ok = False
            continue
        _note_frame(rd, t.name, f, "lcg_m" + (", x_m" if t.has("x_m") else ""),
                    ", ".join(k for k in ("tcg_m", "y_m") if t.has(k)), marked or xs_marked)
        out.append(m.DeckArea(**kw))
    return out if ok else []


_DECK_AREA_OPTIONAL = ("max_load_t_m2", "x_extent_m", "y_extent_m")


def _deck_area_extent(t: Table, f: Frame | None, kw: dict[str, Any]) -> tuple[bool, bool]:
    """A deck area's optional ends (``x_m``, in the table's datum) and edges (``y_m``, its TCG
    convention, P/S marks allowed), into ``kw`` as ``x_extent_m`` (from AP, aft end first) and
    ``y_extent_m`` (+ starboard, port edge first).  The area's own centre must lie within them and
    its area within the rectangle they make (each within the edge allowance
    :data:`deckload.core.bounds.AREA_EDGE_TOLERANCE_M`): a deck load naming the area is then held
    to them (:func:`deckload.core.bounds.off_deck_area_x`).  Returns (all well, any P/S mark)."""
    kw["y_extent_m"] = None
    marked, tol = False, bounds.AREA_EDGE_TOLERANCE_M
    ok, kw["x_extent_m"] = _x_ends(t, f, "area")
    if t.has("y_m"):
        ys, marked = tcg_array(t, "y_m", f, required=False)
        if ys is None or f is None:
            ok = False
        elif len(ys) != 2 or ys[0] == ys[1]:
            t.bad("y_m", t.data["y_m"], "must be the area's two edges (port and starboard), two different values")
            ok = False
        else:
            kw["y_extent_m"] = (float(min(ys)), float(max(ys)))
    if not ok:
        return False, marked
    xe, ye = kw["x_extent_m"], kw["y_extent_m"]
    lcg, tcg = kw.get("lcg_m"), kw.get("tcg_m")
    if xe is not None and not _centre_between_ends(t, lcg, xe, "area"):
        ok = False
    if ye is not None and tcg is not None and not ye[0] - tol <= tcg <= ye[1] + tol:
        t.bad("tcg_m", t.data.get("tcg_m"), f"the area's centre lies outside its own edges y_m ({num(ye[0])} … "
              f"{num(ye[1])} m, + starboard): the two are in the same convention (the table's)")
        ok = False
    area = kw.get("area_m2")
    if xe is not None and area is not None:
        breadth = (ye[1] - ye[0]) if ye is not None else None
        if breadth is not None and area > (xe[1] - xe[0] + 2 * tol) * (breadth + 2 * tol):
            t.bad("area_m2", t.data["area_m2"], f"more than the rectangle its ends and edges make "
                  f"({num(xe[1] - xe[0])} m × {num(breadth)} m = {num((xe[1] - xe[0]) * breadth)} m²)")
            ok = False
    return ok, marked


# =========================================================================== condition


def load_condition(path: str | os.PathLike, vessel: m.Vessel) -> m.Condition:
    """Read a loading condition and validate it against ``vessel``.

    Raises OSError if unreadable, :class:`ProfileError` listing every problem otherwise.
    """
    return parse_condition(_read_text(path), str(path), vessel)


def parse_condition(text: str, filename: str, vessel: m.Vessel) -> m.Condition:
    """Validate the text of a loading condition against its vessel and build the Condition."""
    ctx = FileCheck(filename, text)
    root = ctx.root()
    root.file_format(CONDITION_FORMAT)

    head: dict[str, Any] = {}
    c = root.table("condition")
    if c is not None:
        from deckload.io.condition_files import MAX_NAME_CHARS
        from deckload.io.limits import MAX_REMARK_CHARS

        # one line and as long as the screen lets a condition be named (a longer one could not be
        # logged or saved by it; a line break could print a line that looks like a verdict)
        head["name"] = c.text("name", one_line=True, max_chars=MAX_NAME_CHARS)
        written_for = c.text("vessel", required=False, default=None, one_line=True, max_chars=MAX_ITEM_NAME_CHARS)
        if written_for is not None and written_for != vessel.particulars.name:
            # Tank ids like FO1P or WB1S recur from ship to ship: another vessel's condition could
            # otherwise be read, item for item, as if it were hers.
            c.bad("vessel", written_for, f"this condition was written for {written_for!r}, not for "
                  f"{vessel.particulars.name!r} (the profile it is read with)")
        head["remark"] = c.text("remark", required=False, empty_ok=True, one_line=True, max_chars=MAX_REMARK_CHARS)
        head["water_density_t_m3"] = c.num("water_density_t_m3", water_density)
        marks = [ll.name for ll in vessel.load_lines]
        default_mark = m.Condition().load_line if not marks or m.Condition().load_line in marks else marks[0]
        head["load_line"] = c.text("load_line", required=False, default=default_mark, choices=marks or None)
        head["fs_rule"] = c.text("fs_rule", required=False, default=None, choices=("is2008", "actual"))
        head["gz_correction"] = c.text("gz_correction", required=False, default=None, choices=("constant", "transfer"))
        head["modified_from"] = c.text("modified_from", required=False, default="", empty_ok=True, one_line=True,
                                       max_chars=MAX_NAME_CHARS)
        lbp = vessel.particulars.lbp_m
        head["sounding_trim_m"] = c.num("sounding_trim_m", between(-0.2 * lbp, 0.2 * lbp, "m", "a fifth of LBP either way"),
                                        required=False, default=0.0)
        head["sounding_list_deg"] = c.num("sounding_list_deg", between(-45.0, 45.0, "°"), required=False, default=0.0)
        c.finish()

    fills = _read_fills(root, vessel)
    loads = _read_hold_loads(root, vessel)
    items = _read_deck_items(root, vessel)
    consts = []
    for n, t in enumerate(root.tables("constant")):
        name = _item_name(t)
        t.name = _physical(ctx).item_key("constant", n, name)  # its other problems name it too
        item = _read_mass_item(t, name)
        t.finish()
        if item is not None:
            consts.append(item)
    root.finish()
    ctx.fail_if_any()
    cond = m.Condition(tanks=tuple(fills), holds=tuple(loads), deck_items=tuple(items), constants=tuple(consts), **head)
    return _physical(ctx).check_condition(ctx, vessel, cond)


def _item_name(t: Table) -> str | None:
    """A deck item's or constant's name: one line of at most as many characters as the screen's item
    form takes (limits.MAX_ITEM_NAME_CHARS)."""
    return t.text("name", one_line=True, max_chars=MAX_ITEM_NAME_CHARS)


def _keyed_tables(root: Table, group: str, known: dict[str, int], what: str) -> list[tuple[str, Table]]:
    """``[group.ID]`` tables, each ID checked against the vessel's ``known`` ids."""
    g = root.table(group, required=False)
    if g is None:
        return []
    out = []
    for ident, v in g.data.items():
        g.get(ident, False)
        if ident not in known:
            g.bad(ident, v, f"no {what} with this id in the vessel profile" + suggest_id(ident, known))
            continue
        sub = g.table(ident)
        if sub is not None:
            out.append((ident, sub))
    return out


def _read_fills(root: Table, vessel: m.Vessel) -> list[m.TankFill]:
    out = []
    for ident, t in _keyed_tables(root, "tanks", vessel.tank_index, "tank"):
        tank = vessel.tank(ident)
        given = [q for q in m.FILL_QUANTITIES if t.has(q)]
        dens = t.num("density_t_m3", liquid_density, required=False)
        bad_dens = t.has("density_t_m3") and dens is None
        rho = dens if dens is not None else tank.density_t_m3
        cap = tank.fill_limit_m3
        what = "the top of the tank's table" if tank.short_table else "the tank's capacity"
        rules: dict[str, tuple[Rule, ...]] = {
            "percent": (non_negative, at_most(tank.table_top_pct, "% (full)" if not tank.short_table else
                                              "%, the top of the tank's table (table_top_pct)")),
            "volume_m3": (non_negative, at_most(cap, f"m³, {what}")),
            "mass_t": (non_negative, at_most(cap * rho, f"t, {what} {num(cap)} m³ × {num(rho)} t/m³")),
            "sounding_m": _reading_rules(tank, "sounding_m"),
            "ullage_m": _reading_rules(tank, "ullage_m"),
        }
        values = {q: t.num(q, *rules[q], required=False) for q in m.FILL_QUANTITIES}
        t.finish()
        if len(given) != 1:
            rule = ("states no quantity: give exactly one of " + ", ".join(m.FILL_QUANTITIES) if not given
                    else "states " + " and ".join(given) + ": give exactly one quantity per tank")
            t.ctx.add(t.raw, t.name, None, rule)
            continue
        q = given[0]
        if values[q] is None or bad_dens:
            continue
        out.append(m.TankFill(tank_id=ident, quantity=q, value=values[q], density_t_m3=dens))
    return out


def _reading_rules(tank: m.Tank, quantity: str) -> tuple[Rule, ...]:
    """A sounding or ullage reading must fall within the tank's table (and the tank must have one)."""
    name = "sounding" if quantity == "sounding_m" else "ullage"
    if not tank.level_known:
        return (lambda x: f"tank {tank.id} is known only by capacity and centre: no {name}; give percent, volume_m3 or mass_t",)
    if quantity == "ullage_m" and tank.ullage_reference_m is None:
        return (lambda x: f"tank {tank.id} has no ullage_reference_m in the profile: give sounding_m, percent, volume_m3 or mass_t",)
    lo, hi = reading_limits(tank, quantity)

    def rule(x: float) -> str | None:
        # the loading screen's own test, round-off included (core.loading.reading_outside); the
        # bound written to as many digits as tell it from the value, so the two never read alike
        side = reading_outside(tank, quantity, x)
        if side is None:
            return None
        bound = apart(x, lo if side == "below" else hi, 6)[1]
        return (f"{side} {bound} m: must be between {num(lo)} and {num(hi)} m "
                f"(the {name}s of the tank's calibration table, from 0; nothing is extrapolated)")

    return (rule,)


def _read_hold_loads(root: Table, vessel: m.Vessel) -> list[m.HoldLoad]:
    out = []
    for ident, t in _keyed_tables(root, "holds", vessel.hold_index, "hold"):
        hold = vessel.hold(ident)
        # the structural limit refuses here as on the screen (ui.entry._hold_mass): a file over it
        # was read with only a danger warning
        limit = () if hold.max_mass_t is None else (
            at_most(hold.max_mass_t, "t, the hold's structural limit (max_mass_t in the profile)"),)
        kw: dict[str, Any] = dict(hold_id=ident, mass_t=t.num("mass_t", non_negative, *limit))
        # the stowage factor and the cargo's height by physics: a cargo no denser than solid lead,
        # its centre between the hold's floor and top (deckload.core.bounds)
        optional = {"stowage_m3_t": (positive, stowage_range().rule), "lcg_m": (),
                    "vcg_m": (above_keel, hold_vcg_range(vessel.particulars, hold).rule), "tcg_m": ()}
        bad = False
        for k, rules in optional.items():
            present = t.has(k)
            kw[k] = t.num(k, *rules, required=False)
            bad |= present and kw[k] is None
        desc = t.text("description", required=False, empty_ok=True, one_line=True, max_chars=MAX_ITEM_NAME_CHARS)
        kw["description"] = desc
        t.finish()
        if kw["mass_t"] is None or desc is None or bad:
            continue
        if kw["stowage_m3_t"] is not None:
            vol = kw["mass_t"] * kw["stowage_m3_t"]
            if vol > hold.capacity_m3 * (1 + REL_TOL):
                t.bad("mass_t", t.data["mass_t"], f"× stowage_m3_t {num(kw['stowage_m3_t'])} = {num(vol)} m³, "
                      f"above the hold's capacity {num(hold.capacity_m3)} m³")
                continue
        out.append(m.HoldLoad(**kw))
    return out


def _read_deck_items(root: Table, vessel: m.Vessel) -> list[m.DeckItem]:
    out = []
    for t in root.tables("deck_item"):
        base = _read_mass_item(t, _item_name(t))
        if base is not None and not base.mass_t > 0.0:
            # the screen's rule too (ui.entry.item_from_form): a deck load weighs something; a constant may be 0 t
            t.bad("mass_t", t.data["mass_t"], "a deck load must weigh more than 0 t: leave the item out instead")
            base = None
        area = t.text("area", required=False, default=None)
        if area is not None and area not in vessel.area_index:
            t.bad("area", area, "no deck area with this id in the vessel profile" + suggest_id(area, vessel.area_index))
            area = None
            base = None
        has_fp = t.has("footprint_m2")
        fp = t.num("footprint_m2", positive, required=False)
        wind, wind_ok = _deck_item_windage(t, vessel)
        t.finish()
        if base is None or (has_fp and fp is None) or (t.has("area") and area is None) or not wind_ok:
            continue
        out.append(m.DeckItem(area_id=area, footprint_m2=fp, **wind, **vars(base)))
    return out


def _physical(ctx: FileCheck):
    """Physical bounds and completeness, checked once the model is built (deckload.io.physcheck)."""
    from deckload.io import physcheck

    return physcheck


def _deck_item_windage(t: Table, vessel: m.Vessel) -> tuple[dict, bool]:
    """Optional windage of a deck item: ``windage_area_m2`` and ``windage_centroid_z_m``, both or neither."""
    keys = ("windage_area_m2", "windage_centroid_z_m")
    given = [k for k in keys if t.has(k)]
    p = vessel.particulars
    # bounds from the vessel's size (the screen's item form holds to the same: bounds.deck_windage_range)
    wr = bounds.deck_windage_range(p)
    area = t.num("windage_area_m2", non_negative, at_most(wr.high, f"m² ({wr.why})"), required=False)
    z = t.num("windage_centroid_z_m", between(0.0, p.depth_m + 30.0, "m", "above the keel, up to depth + 30 m"),
              required=False)
    if len(given) == 1:
        missing = keys[1] if given[0] == keys[0] else keys[0]
        t.bad(missing, MISSING, f"required with {given[0]} (the item's windage needs its area and its height)")
        return {}, False
    if given and (area is None or z is None):
        return {}, False
    return ({"windage_area_m2": area, "windage_centroid_z_m": z} if given else {}), True


# =========================================================================== writing


def condition_dict(c: m.Condition, vessel_name: str | None = None) -> dict:
    """The condition as plain TOML data in the README schema (optional keys left out when unset);
    ``vessel_name``: the vessel it is written for, which reading it back checks."""
    head: dict[str, Any] = {"name": c.name}
    if vessel_name:
        head["vessel"] = vessel_name
    if c.remark:
        head["remark"] = c.remark
    head["water_density_t_m3"] = float(c.water_density_t_m3)
    head["load_line"] = c.load_line
    if c.fs_rule is not None:
        head["fs_rule"] = c.fs_rule
    if c.gz_correction is not None:
        head["gz_correction"] = c.gz_correction
    if c.modified_from:
        head["modified_from"] = c.modified_from
    if c.sounding_trim_m:
        head["sounding_trim_m"] = float(c.sounding_trim_m)
    if c.sounding_list_deg:
        head["sounding_list_deg"] = float(c.sounding_list_deg)
    doc: dict[str, Any] = {"format": CONDITION_FORMAT, "condition": head}
    if c.tanks:
        doc["tanks"] = {}
        for f in c.tanks:
            d: dict[str, Any] = {f.quantity: float(f.value)}
            if f.density_t_m3 is not None:
                d["density_t_m3"] = float(f.density_t_m3)
            doc["tanks"][f.tank_id] = d
    if c.holds:
        doc["holds"] = {}
        for h in c.holds:
            d = {"mass_t": float(h.mass_t)}
            for k in ("stowage_m3_t", "lcg_m", "vcg_m", "tcg_m"):
                if getattr(h, k) is not None:
                    d[k] = float(getattr(h, k))
            if h.description:
                d["description"] = h.description
            doc["holds"][h.hold_id] = d
    if c.deck_items:
        doc["deck_item"] = []
        for it in c.deck_items:
            d = _mass_item_dict(it)
            if it.area_id is not None:
                d["area"] = it.area_id
            if it.footprint_m2 is not None:
                d["footprint_m2"] = float(it.footprint_m2)
            if it.windage_area_m2 is not None and it.windage_centroid_z_m is not None:
                d["windage_area_m2"] = float(it.windage_area_m2)
                d["windage_centroid_z_m"] = float(it.windage_centroid_z_m)
            doc["deck_item"].append(d)
    if c.constants:
        doc["constant"] = [_mass_item_dict(it) for it in c.constants]
    return doc


def _mass_item_dict(it: m.MassItem) -> dict:
    return {"name": it.name, "mass_t": float(it.mass_t), "lcg_m": float(it.lcg_m),
            "vcg_m": float(it.vcg_m), "tcg_m": float(it.tcg_m)}


def dump_condition(c: m.Condition, vessel_name: str | None = None) -> str:
    """The condition as TOML text; ``parse_condition(dump_condition(c), ...) == c``.  With
    ``vessel_name`` the file says which vessel it is for, and is refused for any other.

    Tanks and holds keep their order.  Sections are written one by one so that deck
    items and constants always appear as ``[[...]]`` sections, never inline.
    """
    import tomli_w  # the writer: reading a condition never needs it

    doc = condition_dict(c, vessel_name)
    out = ["# deckload loading condition (keys: vessel_profiles/README.md)\n",
           tomli_w.dumps({"format": doc["format"]}), "\n", tomli_w.dumps({"condition": doc["condition"]})]
    for group in ("tanks", "holds"):
        for ident, d in doc.get(group, {}).items():
            out += ["\n", tomli_w.dumps({group: {ident: d}})]
    for group in ("deck_item", "constant"):
        for d in doc.get(group, []):
            out += ["\n", f"[[{group}]]\n", tomli_w.dumps(d)]
    return "".join(out)


def save_condition(path: str | os.PathLike, condition: m.Condition, vessel_name: str | None = None) -> None:
    """Write the condition atomically: the old file is intact until the new one is complete.

    A temporary file in the same folder is written, flushed and fsync'ed, then moved
    over the target with ``os.replace`` (atomic on POSIX and Windows); the folder is
    fsync'ed so the rename itself survives a power cut.  On any failure the temporary
    file is removed and the old file is untouched.
    """
    from deckload.io.atomicfile import write_atomic

    write_atomic(path, dump_condition(condition, vessel_name))


