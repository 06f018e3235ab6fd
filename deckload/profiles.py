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

import os
from pathlib import Path
from typing import Any

import numpy as np
import tomli_w

from deckload.atomicfile import write_atomic
from deckload.core import model as m
# Problem, ProfileError and ID_PATTERN are imported from here by other modules too
from deckload.tomlcheck import (
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
    suggest_id,
    toml_value,
)

PROFILE_FORMAT = "deckload-profile-1"
CONDITION_FORMAT = "deckload-condition-1"

LIQUID_DENSITY_RANGE_T_M3 = (0.5, 2.0)
"""Plausible densities of a tank's contents (t/m³): light oils ~0.8, heavy brines ~1.3."""

WATER_DENSITY_RANGE_T_M3 = (0.99, 1.04)
"""Plausible densities of the water a vessel floats in (t/m³): fresh 1.000, sea about 1.025."""

CAPACITY_TOLERANCE = 0.0005
"""A tank's capacity_m3 may differ from its last calibration volume by at most 0.05 % (round-off):
more would misjudge the 98 % 'nominally full' line or ask the table for a volume it does not hold."""


# =========================================================================== vessel rules
# (generic rules such as ``positive`` and ``between`` live in deckload.tomlcheck)


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


def _read_text(path: str | os.PathLike) -> str:
    data = Path(path).read_bytes()
    try:
        return data.decode("utf-8")
    except UnicodeDecodeError as e:
        line = data[: e.start].count(b"\n") + 1
        raise ProfileError([Problem(str(path), line, "", None, f"not UTF-8 text (byte {e.start + 1}); TOML files must be UTF-8")]) from None


def parse_profile(text: str, filename: str = "<profile>") -> m.Vessel:
    """Validate the text of a vessel profile and build the :class:`~deckload.core.model.Vessel`.

    Raises :class:`ProfileError` listing every problem found.
    """
    ctx = FileCheck(filename, text)
    root = ctx.root()
    root.text("format", choices=(PROFILE_FORMAT,))

    particulars = _read_particulars(root)
    lightship = _read_lightship(root)
    hydro = _read_hydrostatics(root)
    cross = _read_cross_curves(root)
    fs = _read_free_surface(root, lightship)
    criteria = _read_criteria(root)
    load_lines = _read_load_lines(root, hydro)
    limit = _read_limit_curve(root)
    downflooding = _read_downflooding(root)
    marks = _read_draft_marks(root, particulars)
    hull = _read_hull_geometry(root, particulars, filename)

    ids: dict[str, str] = {}  # id -> display name of the first compartment using it
    tanks = _read_tanks(root, fs, ids)
    holds = _read_holds(root, ids)
    areas = _read_deck_areas(root, ids)
    root.finish()
    ctx.fail_if_any()

    return m.Vessel(
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
        draft_marks=marks,
        hull=hull,
    )


def _read_particulars(root: Table) -> m.Particulars | None:
    t = root.table("vessel")
    if t is None:
        return None
    kw = dict(
        name=t.text("name"),
        vessel_type=t.text("vessel_type", required=False, empty_ok=True),
        lbp_m=t.num("lbp_m", positive),
        breadth_m=t.num("breadth_m", positive),
        depth_m=t.num("depth_m", positive),
        design_draft_m=t.num("design_draft_m", positive),
        table_density_t_m3=t.num("table_density_t_m3", water_density),
    )
    datum = t.text("longitudinal_datum", choices=("AP",))
    kw["remark"] = t.text("remark", required=False, empty_ok=True)
    t.finish()
    if kw["design_draft_m"] is not None and kw["depth_m"] is not None and kw["design_draft_m"] > kw["depth_m"]:
        t.bad("design_draft_m", t.data["design_draft_m"], f"exceeds the depth {num(kw['depth_m'])} m")
        return None
    if datum is None or any(v is None for v in kw.values()):
        return None
    return m.Particulars(longitudinal_datum="aft perpendicular, positive forward", **kw)


def _read_mass_item(t: Table, name: str, *, mass_rule: Rule = non_negative) -> m.MassItem | None:
    kw = dict(
        mass_t=t.num("mass_t", mass_rule),
        lcg_m=t.num("lcg_m"),
        vcg_m=t.num("vcg_m", above_keel),
        tcg_m=t.num("tcg_m", required=False, default=0.0),
    )
    if any(v is None for v in kw.values()) or name is None:
        return None
    return m.MassItem(name=name, **kw)


def _read_lightship(root: Table) -> m.MassItem | None:
    t = root.table("lightship")
    if t is None:
        return None
    item = _read_mass_item(t, "Lightship", mass_rule=positive)
    t.finish()
    return item


def _read_hydrostatics(root: Table) -> m.HydrostaticTable | None:
    t = root.table("hydrostatics")
    if t is None:
        return None
    cols = {
        "draft_m": t.increasing("draft_m", t.array("draft_m", non_negative)),
        "displacement_t": t.increasing("displacement_t", t.array("displacement_t", non_negative)),
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
    t.finish()
    if not t.same_length("draft_m", cols):
        return None
    return m.HydrostaticTable(**{k: m.frozen_array(v) for k, v in cols.items()})


def _read_cross_curves(root: Table) -> m.CrossCurves | None:
    t = root.table("cross_curves")
    if t is None:
        return None
    basis = t.text("trim_basis", choices=("free trim", "even keel"))
    heel = t.increasing("heel_deg", t.array("heel_deg", heel_range))
    heel = t.starts_at("heel_deg", heel, 0.0, "the upright condition")
    heel = t.ends_at("heel_deg", heel, 90.0, "the GZ curve runs 0–90°; nothing is extrapolated")
    disp = t.increasing("displacement_t", t.array("displacement_t", positive))
    kn = t.matrix("kn_m", "displacement_t", t.raw_len("displacement_t"), "heel_deg", t.raw_len("heel_deg"))
    has_ref = t.has("reference_lcg_m")
    ref = t.num("reference_lcg_m", required=False)
    t.finish()
    if basis is None or heel is None or disp is None or kn is None or (has_ref and ref is None):
        return None
    return m.CrossCurves(
        heel_deg=m.frozen_array(heel), displacement_t=m.frozen_array(disp), kn_m=m.frozen_array(kn), trim_basis=basis,
        reference_lcg_m=ref,
    )


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


def _read_criteria(root: Table) -> m.CriteriaSettings | None:
    t = root.table("criteria", required=False)
    if t is None:
        return None if root.has("criteria") else m.CriteriaSettings()
    code = t.text("code", required=False, default="IS2008-A2.2", choices=("IS2008-A2.2",))
    has_gm = t.has("min_gm_m")
    gm = t.num("min_gm_m", positive, required=False)
    t.finish()
    if code is None or (has_gm and gm is None):
        return None
    return m.CriteriaSettings(code=code, min_gm_m=gm)


def _read_load_lines(root: Table, hydro: m.HydrostaticTable | None) -> list[m.LoadLine]:
    out: list[m.LoadLine] = []
    seen: set[str] = set()
    for t in root.tables("load_line"):
        name = t.text("name")
        draft = t.num("draft_m", positive)
        t.finish()
        if name is not None:
            t.name = f"load_line[{name}]"
            if name in seen:
                t.bad("name", name, "duplicate load-line name")
                continue
            seen.add(name)
        if draft is not None and hydro is not None and not hydro.draft_m[0] <= draft <= hydro.draft_m[-1]:
            t.bad("draft_m", t.data["draft_m"], f"outside the hydrostatic table's drafts {num(hydro.draft_m[0])}–{num(hydro.draft_m[-1])} m")
            continue
        if name is not None and draft is not None:
            out.append(m.LoadLine(name=name, draft_m=draft))
    return out


def _read_limit_curve(root: Table) -> m.LimitCurve | None:
    t = root.table("limit_curve", required=False)
    if t is None:
        return None
    disp = t.increasing("displacement_t", t.array("displacement_t", positive))
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
    t.finish()
    if not t.same_length("displacement_t", {"displacement_t": disp, kind: values}):
        return None
    return m.LimitCurve(displacement_t=m.frozen_array(disp), value=m.frozen_array(values), kind=kind)


def _read_downflooding(root: Table) -> m.LimitCurve | None:
    t = root.table("downflooding", required=False)
    if t is None:
        return None
    disp = t.increasing("displacement_t", t.array("displacement_t", positive))
    ang = t.array("angle_deg", between(0.0, 90.0, "°"))
    t.finish()
    if not t.same_length("displacement_t", {"displacement_t": disp, "angle_deg": ang}):
        return None
    return m.LimitCurve(displacement_t=m.frozen_array(disp), value=m.frozen_array(ang), kind="downflooding_deg")


HULL_MATCH_TOLERANCE = 0.001
"""The geometry file's LBP and breadth must match the profile's within 0.1 %: a different hull
would give a 'second method' about another ship."""


def _read_hull_geometry(root: Table, particulars: m.Particulars | None, filename: str):
    """``hull_geometry``: the geometry file (path relative to the profile) whose hull the direct
    calculation integrates.  Its problems are reported as the profile's, naming the file."""
    name = root.text("hull_geometry", required=False, default=None)
    if name is None:
        return None
    from deckload.core.geometry.builder import hull_body
    from deckload.geometry_io import load_geometry

    path = Path(name)
    if not path.is_absolute():
        path = Path(filename).parent / path
    if not path.is_file():
        root.bad("hull_geometry", name, f"no such geometry file ({path})")
        return None
    try:
        geometry = load_geometry(path)
    except ProfileError as e:
        root.bad("hull_geometry", name, "the geometry file has problems: " + "; ".join(str(p) for p in e.problems))
        return None
    if particulars is not None:
        for key, ours, theirs in (("lbp_m", particulars.lbp_m, geometry.vessel.lbp_m),
                                  ("breadth_m", particulars.breadth_m, geometry.vessel.breadth_m)):
            if abs(ours - theirs) > HULL_MATCH_TOLERANCE * ours:
                root.bad("hull_geometry", name, f"its {key} {num(theirs)} m is not the profile's {num(ours)} m")
                return None
    return hull_body(geometry)


def _read_draft_marks(root: Table, particulars: m.Particulars | None) -> m.DraftMarks | None:
    """``[draft_marks]``: aft, midships, forward marks (x_m, y_m) and the keel thickness.

    Bounds from the vessel: marks within 20 % of LBP beyond either perpendicular, no further
    off the centreline than half the breadth, aft < midships < forward with the aft and
    forward marks at least half the LBP apart (the trim is found from their difference);
    keel thickness under a tenth of the depth.
    """
    t = root.table("draft_marks", required=False)
    if t is None:
        return None
    lbp = particulars.lbp_m if particulars is not None else None
    half_b = particulars.breadth_m / 2.0 if particulars is not None else None
    x_rule = (between(-0.2 * lbp, 1.2 * lbp, "m", "within 20 % of LBP of the perpendiculars")
              if lbp is not None else None)
    y_rule = between(0.0, half_b, "m", "between the centreline and the side") if half_b is not None else non_negative
    k_rule = (between(0.0, 0.1 * particulars.depth_m, "m", "a keel plate, under a tenth of the depth")
              if particulars is not None else non_negative)
    keel = t.num("keel_thickness_m", k_rule, required=False, default=0.0)
    bad_keel = t.has("keel_thickness_m") and keel is None
    found: dict[str, m.DraftMark | None] = {}
    for where in ("aft", "midships", "forward"):
        sub = t.table(where)
        if sub is None:
            found[where] = None
            continue
        x = sub.num("x_m", *((x_rule,) if x_rule else ()))
        y = sub.num("y_m", y_rule)
        sub.finish()
        found[where] = None if x is None or y is None else m.DraftMark(x, y)
    t.finish()
    if bad_keel or any(v is None for v in found.values()) or lbp is None:
        return None
    a, mid, f = found["aft"], found["midships"], found["forward"]
    if not a.x_m < mid.x_m < f.x_m:
        t.bad("midships", t.data["midships"], "the marks must lie aft < midships < forward (x_m from AP)")
        return None
    if f.x_m - a.x_m < 0.5 * lbp:
        t.bad("forward", t.data["forward"], f"only {num(f.x_m - a.x_m)} m forward of the aft marks: they must be at "
              f"least half the LBP ({num(0.5 * lbp)} m) apart to give the trim")
        return None
    return m.DraftMarks(a, mid, f, keel)


def _read_tanks(root: Table, fs: m.FreeSurfaceSettings | None, ids: dict[str, str]) -> list[m.Tank]:
    entries = []
    complete = True
    for t in root.tables("tank"):
        kw, ok_tank = _read_tank(t, fs, ids)
        entries.append((t, kw))
        complete &= ok_tank
    ok = check_tank_pairs([(t, kw["id"], kw.get("pair")) if kw is not None else (t, None, None) for t, kw in entries])
    if not ok or not complete:
        return []
    return [m.Tank(**kw) for _, kw in entries]


def _read_tank(t: Table, fs: m.FreeSurfaceSettings | None, ids: dict[str, str]) -> tuple[dict | None, bool]:
    """The Tank's keyword arguments and whether they are complete (else only id and pair)."""
    ident = claim_id(t, "tank", ids)
    kw: dict[str, Any] = dict(id=ident, name=t.text("name"))
    kind = t.text("kind", choices=m.LIQUID_KINDS)
    kw["kind"] = kind
    kw["density_t_m3"] = t.num("density_t_m3", liquid_density)
    capacity = t.num("capacity_m3", positive)
    kw["capacity_m3"] = capacity
    pair = t.text("pair", required=False, default=None)
    kw["pair"] = pair
    if t.has("pair") and pair is not None and not ID_PATTERN.match(pair):
        t.bad("pair", pair, "must be a tank id (letters, digits, '-' and '_')")
        kw["pair"] = pair = None
    default_cat = "variable" if kind in m.CONSUMABLE_KINDS else "fixed"
    kw["fs_category"] = t.text("fs_category", required=False, default=default_cat, choices=("fixed", "variable"))
    kw["worst_band_pct"] = _band(t, "worst_band_pct", None if fs is None else fs.default_worst_band_pct)

    cal = t.table("calibration")
    kw["calibration"] = None if cal is None else _read_calibration(cal, capacity, t)
    if t.has("transfer"):
        tr = t.table("transfer")
        kw["transfer"] = None if tr is None else _read_transfer(tr)
        if kw["transfer"] is None:
            kw["calibration"] = None  # marks the tank unusable
    else:
        t.get("transfer", False)
        kw["transfer"] = None
    t.finish()
    if kw["calibration"] is None or any(kw[k] is None for k in ("id", "name", "kind", "density_t_m3", "capacity_m3", "fs_category", "worst_band_pct")):
        return ({"id": ident, "pair": pair} if ident else None), False
    return kw, True


def _read_calibration(t: Table, capacity: float | None, tank: Table) -> m.TankCalibration | None:
    sounding = t.increasing("sounding_m", t.array("sounding_m", non_negative))
    sounding = t.starts_at("sounding_m", sounding, 0.0, "the tank bottom")
    volume = t.increasing("volume_m3", t.array("volume_m3", non_negative))
    volume = t.starts_at("volume_m3", volume, 0.0, "the tank is empty at sounding 0")
    cols = {
        "sounding_m": sounding,
        "volume_m3": volume,
        "lcg_m": t.array("lcg_m"),
        "vcg_m": t.array("vcg_m", above_keel),
        "tcg_m": t.array("tcg_m"),
        "fsi_m4": t.array("fsi_m4", non_negative),
    }
    t.finish()
    if not t.same_length("sounding_m", cols):
        return None
    vcg = cols["vcg_m"]
    d = np.diff(vcg)
    if np.any(d < -1e-6):
        i = int(np.argmax(d < -1e-6)) + 1
        t.bad("vcg_m", t.data["vcg_m"], f"falls as the tank fills (row {i + 1}: {toml_value(t.data['vcg_m'][i])} after "
              f"{toml_value(t.data['vcg_m'][i - 1])}); the contents' centre can only rise", (i,))
        return None
    if capacity is not None:
        last = float(volume[-1])
        if abs(capacity - last) > CAPACITY_TOLERANCE * last:
            tank.bad("capacity_m3", tank.data["capacity_m3"],
                     f"differs from the last calibration volume {num(last)} m³ by "
                     f"{100 * abs(capacity - last) / last:.2f} % (at most {100 * CAPACITY_TOLERANCE:g} % allowed)")
            return None
    return m.TankCalibration(**{k: m.frozen_array(v) for k, v in cols.items()})


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
    t.finish()
    if fill is None or heel is None or mom is None:
        return None
    return m.FluidTransfer(fill_pct=m.frozen_array(fill), heel_deg=m.frozen_array(heel), moment_m4=m.frozen_array(mom))


def _read_holds(root: Table, ids: dict[str, str]) -> list[m.Hold]:
    out, ok = [], True
    for t in root.tables("hold"):
        ident = claim_id(t, "hold", ids)
        kw: dict[str, Any] = dict(
            id=ident,
            name=t.text("name"),
            capacity_m3=t.num("capacity_m3", positive),
            lcg_m=t.num("lcg_m"),
            vcg_m=t.num("vcg_m", above_keel),
            tcg_m=t.num("tcg_m", required=False, default=0.0),
        )
        has_max = t.has("max_mass_t")
        kw["max_mass_t"] = t.num("max_mass_t", positive, required=False)
        fill_keys = ("fill_pct", "fill_vcg_m", "fill_lcg_m")
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
        t.finish()
        if not fill_ok or any(v is None for k, v in kw.items() if k != "max_mass_t") or (has_max and kw["max_mass_t"] is None):
            ok = False
            continue
        for k in fill_keys:
            kw[k] = m.frozen_array(cols[k]) if k in cols else None
        out.append(m.Hold(**kw))
    return out if ok else []


def _read_deck_areas(root: Table, ids: dict[str, str]) -> list[m.DeckArea]:
    out, ok = [], True
    for t in root.tables("deck_area"):
        ident = claim_id(t, "deck_area", ids)
        kw: dict[str, Any] = dict(
            id=ident,
            name=t.text("name"),
            area_m2=t.num("area_m2", positive),
            lcg_m=t.num("lcg_m"),
            deck_height_m=t.num("deck_height_m", above_keel),
            tcg_m=t.num("tcg_m", required=False, default=0.0),
        )
        has_max = t.has("max_load_t_m2")
        kw["max_load_t_m2"] = t.num("max_load_t_m2", positive, required=False)
        t.finish()
        if any(v is None for k, v in kw.items() if k != "max_load_t_m2") or (has_max and kw["max_load_t_m2"] is None):
            ok = False
            continue
        out.append(m.DeckArea(**kw))
    return out if ok else []


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
    root.text("format", choices=(CONDITION_FORMAT,))

    head: dict[str, Any] = {}
    c = root.table("condition")
    if c is not None:
        head["name"] = c.text("name")
        head["remark"] = c.text("remark", required=False, empty_ok=True)
        head["water_density_t_m3"] = c.num("water_density_t_m3", water_density)
        marks = [ll.name for ll in vessel.load_lines]
        default_mark = m.Condition().load_line if not marks or m.Condition().load_line in marks else marks[0]
        head["load_line"] = c.text("load_line", required=False, default=default_mark, choices=marks or None)
        head["fs_rule"] = c.text("fs_rule", required=False, default=None, choices=("is2008", "actual"))
        head["gz_correction"] = c.text("gz_correction", required=False, default=None, choices=("constant", "transfer"))
        c.finish()

    fills = _read_fills(root, vessel)
    loads = _read_hold_loads(root, vessel)
    items = _read_deck_items(root, vessel)
    consts = []
    for t in root.tables("constant"):
        item = _read_mass_item(t, t.text("name"))
        t.finish()
        if item is not None:
            consts.append(item)
    root.finish()
    ctx.fail_if_any()
    return m.Condition(tanks=tuple(fills), holds=tuple(loads), deck_items=tuple(items), constants=tuple(consts), **head)


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
        cal = tank.calibration
        cap = tank.capacity_m3
        rules: dict[str, tuple[Rule, ...]] = {
            "percent": (non_negative, at_most(100.0, "% (full)")),
            "volume_m3": (non_negative, at_most(cap, "m³, the tank's capacity")),
            "mass_t": (non_negative, at_most(cap * rho, f"t, the tank's capacity {num(cap)} m³ × {num(rho)} t/m³")),
            "sounding_m": (non_negative, at_most(float(cal.sounding_m[-1]),
                           f"m: outside the calibration table {num(cal.sounding_m[0])}–{num(cal.sounding_m[-1])} m")),
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


def _read_hold_loads(root: Table, vessel: m.Vessel) -> list[m.HoldLoad]:
    out = []
    for ident, t in _keyed_tables(root, "holds", vessel.hold_index, "hold"):
        hold = vessel.hold(ident)
        kw: dict[str, Any] = dict(hold_id=ident, mass_t=t.num("mass_t", non_negative))
        optional = {"stowage_m3_t": (positive,), "lcg_m": (), "vcg_m": (above_keel,), "tcg_m": ()}
        bad = False
        for k, rules in optional.items():
            present = t.has(k)
            kw[k] = t.num(k, *rules, required=False)
            bad |= present and kw[k] is None
        desc = t.text("description", required=False, empty_ok=True)
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
        base = _read_mass_item(t, t.text("name"))
        area = t.text("area", required=False, default=None)
        if area is not None and area not in vessel.area_index:
            t.bad("area", area, "no deck area with this id in the vessel profile" + suggest_id(area, vessel.area_index))
            area = None
            base = None
        has_fp = t.has("footprint_m2")
        fp = t.num("footprint_m2", positive, required=False)
        t.finish()
        if base is None or (has_fp and fp is None) or (t.has("area") and area is None):
            continue
        out.append(m.DeckItem(area_id=area, footprint_m2=fp, **vars(base)))
    return out


# =========================================================================== writing


def condition_dict(c: m.Condition) -> dict:
    """The condition as plain TOML data in the README schema (optional keys left out when unset)."""
    head: dict[str, Any] = {"name": c.name}
    if c.remark:
        head["remark"] = c.remark
    head["water_density_t_m3"] = float(c.water_density_t_m3)
    head["load_line"] = c.load_line
    if c.fs_rule is not None:
        head["fs_rule"] = c.fs_rule
    if c.gz_correction is not None:
        head["gz_correction"] = c.gz_correction
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
            doc["deck_item"].append(d)
    if c.constants:
        doc["constant"] = [_mass_item_dict(it) for it in c.constants]
    return doc


def _mass_item_dict(it: m.MassItem) -> dict:
    return {"name": it.name, "mass_t": float(it.mass_t), "lcg_m": float(it.lcg_m),
            "vcg_m": float(it.vcg_m), "tcg_m": float(it.tcg_m)}


def dump_condition(c: m.Condition) -> str:
    """The condition as TOML text; ``parse_condition(dump_condition(c), ...) == c``.

    Tanks and holds keep their order.  Sections are written one by one so that deck
    items and constants always appear as ``[[...]]`` sections, never inline.
    """
    doc = condition_dict(c)
    out = ["# deckload loading condition (keys: vessel_profiles/README.md)\n",
           tomli_w.dumps({"format": doc["format"]}), "\n", tomli_w.dumps({"condition": doc["condition"]})]
    for group in ("tanks", "holds"):
        for ident, d in doc.get(group, {}).items():
            out += ["\n", tomli_w.dumps({group: {ident: d}})]
    for group in ("deck_item", "constant"):
        for d in doc.get(group, []):
            out += ["\n", f"[[{group}]]\n", tomli_w.dumps(d)]
    return "".join(out)


def save_condition(path: str | os.PathLike, condition: m.Condition) -> None:
    """Write the condition atomically: the old file is intact until the new one is complete.

    A temporary file in the same folder is written, flushed and fsync'ed, then moved
    over the target with ``os.replace`` (atomic on POSIX and Windows); the folder is
    fsync'ed so the rename itself survives a power cut.  On any failure the temporary
    file is removed and the old file is untouched.
    """
    write_atomic(path, dump_condition(condition))


