"""Geometry files (``*.geometry.toml``) → the validated, frozen geometry model.

The schema is described at the top of ``vessel_profiles/demo_islander.geometry.toml``
and in ``vessel_profiles/README.md`` ("Geometry files").  Every problem in a file
is collected and reported at once; each names the file, the line (found by
scanning the text for the key or its table header), the dotted key (tanks by id,
e.g. ``tank[DB1P].x_m``), the offending value and the rule broken::

    demo.geometry.toml:31: hull.station_x_m = [-1.6, 0.0, 0.0, …]: not strictly increasing (row 3: 0.0 after 0.0)
"""

from __future__ import annotations

import math
import os
from pathlib import Path
from typing import Any

import numpy as np

from deckload.core.geometry.body import immerse
from deckload.core.geometry.hull import compartment_body, compartment_polygon, hull_section_at, hull_sections
from deckload.core.geometry.sections import clip_to_box, polygon_area
from deckload.core.geometry.spec import (
    COMPARTMENT_SHAPES,
    CompartmentShape,
    DeckAreaSpec,
    Geometry,
    HoldSpec,
    HullOffsets,
    LateralProfile,
    OpeningSpec,
    TableSpec,
    TankSpec,
    VesselSpec,
)
from deckload.core.model import LIQUID_KINDS
from deckload.io.profiles import above_keel, liquid_density, water_density
from deckload.io.tomlcheck import (
    MISSING,
    FileCheck,
    Problem,
    ProfileError,
    Table,
    Wording,
    above,
    between,
    check_tank_pairs,
    claim_id,
)

GEOMETRY_FORMAT = "deckload-geometry-1"
OUTSIDE_TOLERANCE = 0.005
"""A box or prism tank may stick out of the hull by at most 0.5 % of its section area."""


GeometryProblem = Problem
"""One thing wrong in a geometry file: the same shape as a profile problem."""


class GeometryError(ProfileError):
    """One or more problems in a geometry file; ``problems`` lists them all."""


def _fmt(v: Any) -> str:
    """A value in a geometry message: numbers as short as they go (10, not 10.0), strings quoted '...'."""
    if isinstance(v, list):
        inner = ", ".join(_fmt(x) for x in v[:4])
        more = f", …{len(v)} values" if len(v) > 4 else ""
        return f"[{inner}{more}]"
    if isinstance(v, str):
        return repr(v)
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, float):
        return f"{v:g}"
    return str(v)


WORDING = Wording(value=_fmt, element="value", missing="missing (required)")
"""Geometry files word values and array elements their own way (the rules are shared with profiles)."""


def load_geometry(path: str | os.PathLike) -> Geometry:
    """Read and validate a geometry file; raises :class:`GeometryError` listing every problem."""
    p = Path(path)
    try:
        from deckload.io.limits import MAX_TOML_BYTES, read_limited

        text = read_limited(p, MAX_TOML_BYTES, "a geometry file").decode("utf-8")
    except OSError as e:
        raise GeometryError([GeometryProblem(str(path), None, "", None, f"cannot read the file: {e.strerror or e}")])
    except UnicodeDecodeError as e:
        raise GeometryError([GeometryProblem(str(path), None, "", None, f"not UTF-8 text ({e.reason})")])
    return parse_geometry(text, str(path))


def parse_geometry(text: str, filename: str = "<geometry>") -> Geometry:
    """Validate the text of a geometry file; raises :class:`GeometryError` listing every problem."""
    ctx = FileCheck(filename, text, WORDING, GeometryError)
    root = ctx.root()
    root.file_format(GEOMETRY_FORMAT)
    vessel = _read_vessel(root)
    hull = _read_hull(root)
    tables = _read_tables(root, hull)
    ids: dict[str, str] = {}
    tanks = _read_tanks(root, hull, ids)
    holds = _read_holds(root, hull, ids)
    areas = _read_deck_areas(root, hull, ids)
    openings = _read_openings(root, hull)
    lateral = _read_lateral_profile(root, tables)
    root.finish()
    if vessel is not None and hull is not None:
        xs = hull.station_x_m
        if not (xs[0] <= 0.0 and vessel.lbp_m <= xs[-1]):
            t = Table(ctx, root.data["hull"], ("hull",), "hull")
            t.bad("station_x_m", t.data["station_x_m"],
                  f"must reach from the AP (x = 0) to the FP (x = lbp_m = {vessel.lbp_m:g})")
    ctx.fail_if_any()
    assert vessel is not None and hull is not None and tables is not None
    return Geometry(vessel=vessel, hull=hull, tables=tables, tanks=tuple(tanks), holds=tuple(holds),
                    deck_areas=tuple(areas), openings=tuple(openings), lateral_profile=lateral)


def _read_lateral_profile(root: Table, tables: TableSpec | None) -> LateralProfile | None:
    """``[lateral_profile]``: a closed outline (x_m, z_m) of the vessel seen from the side."""
    t = root.table("lateral_profile", required=False)
    if t is None:
        return None
    x = t.array("x_m", min_len=3)
    z = t.array("z_m", above_keel, min_len=3, length=None if x is None else len(x))
    t.finish()
    if x is None or z is None:
        return None
    if abs(polygon_area(x, z)) <= 0.0:
        t.bad("x_m", t.data["x_m"], "the outline (x_m, z_m) encloses no area")
        return None
    if tables is not None:
        from deckload.core.geometry.windage import windage_above

        for d in tables.draft_m:
            if windage_above(x, z, float(d))[0] <= 0.0:
                t.bad("z_m", t.data["z_m"], f"the outline has no area above the table draft {d:g} m")
                return None
    return LateralProfile(x_m=x, z_m=z)


def _read_vessel(root: Table) -> VesselSpec | None:
    t = root.table("vessel")
    if t is None:
        return None
    kw = dict(
        name=t.text("name"),
        lbp_m=t.num("lbp_m", above(0.0)),
        breadth_m=t.num("breadth_m", above(0.0)),
        depth_m=t.num("depth_m", above(0.0)),
        design_draft_m=t.num("design_draft_m", above(0.0)),
        table_density_t_m3=t.num("table_density_t_m3", water_density, required=False, default=1.025),
    )
    t.finish()
    if any(v is None for v in kw.values()):
        return None
    if kw["design_draft_m"] >= kw["depth_m"]:
        t.bad("design_draft_m", kw["design_draft_m"], f"must be below depth_m ({kw['depth_m']:g} m)")
        return None
    return VesselSpec(**kw)


def _read_hull(root: Table) -> HullOffsets | None:
    t = root.table("hull")
    if t is None:
        return None
    xs = t.increasing("station_x_m", t.array("station_x_m", min_len=3))
    zw = t.increasing("waterline_z_m", t.array("waterline_z_m", above_keel))
    deck = t.array("deck_z_m", min_len=1, length=None if xs is None else len(xs))
    hb_raw = t.get("half_breadth_m")
    t.finish()
    hb = None
    if hb_raw is not MISSING and xs is not None and zw is not None:
        if not isinstance(hb_raw, list) or len(hb_raw) != len(xs):
            t.bad("half_breadth_m", hb_raw, f"must have one row per station ({len(xs)} rows)")
        else:
            rows = []
            ok = True
            for i, row in enumerate(hb_raw):
                if not isinstance(row, list) or len(row) != len(zw) or not all(
                    isinstance(v, (int, float)) and not isinstance(v, bool) and math.isfinite(v) for v in row
                ):
                    t.bad("half_breadth_m", row,
                          f"row {i + 1} (station x = {xs[i]:g} m) must be {len(zw)} finite numbers, one per waterline")
                    ok = False
                    continue
                a = np.array(row, dtype=float)
                if np.any(a < 0):
                    j = int(np.argmax(a < 0))
                    t.bad("half_breadth_m", row,
                          f"negative half-breadth {a[j]:g} m at station x = {xs[i]:g} m, waterline z = {zw[j]:g} m")
                    ok = False
                rows.append(a)
            if ok:
                hb = np.array(rows)
    if deck is not None and zw is not None:
        lo_bad = deck <= zw[0]
        hi_bad = deck > zw[-1]
        if np.any(lo_bad | hi_bad):
            i = int(np.argmax(lo_bad | hi_bad))
            t.bad("deck_z_m", t.data["deck_z_m"],
                  f"deck height {deck[i]:g} m at station {i + 1} must lie above the lowest waterline "
                  f"and not above the highest ({zw[0]:g}–{zw[-1]:g} m)")
            deck = None
    if xs is None or zw is None or deck is None or hb is None:
        return None
    hull = HullOffsets(xs, zw, hb, deck)
    y, z = hull_sections(hull)
    areas = 0.5 * np.sum(y * np.roll(z, -1, axis=1) - np.roll(y, -1, axis=1) * z, axis=1)
    if not np.any(areas > 0):
        t.bad("half_breadth_m", t.data["half_breadth_m"], "all sections have zero area: there is no hull")
        return None
    return hull


def _read_tables(root: Table, hull: HullOffsets | None) -> TableSpec | None:
    t = root.table("tables")
    if t is None:
        return None
    draft = t.increasing("draft_m", t.array("draft_m", above(0.0)))
    if draft is not None and hull is not None and draft[-1] > float(np.min(hull.deck_z_m)):
        t.bad("draft_m", t.data["draft_m"],
              f"the deepest draft {draft[-1]:g} m is above the lowest deck at side ({float(np.min(hull.deck_z_m)):g} m)")
        draft = None
    disp = t.increasing("kn_displacement_t", t.array("kn_displacement_t", above(0.0)))
    heel = t.increasing("kn_heel_deg", t.array("kn_heel_deg"))
    if heel is not None and (heel[0] != 0.0 or heel[-1] != 90.0):
        t.bad("kn_heel_deg", t.data["kn_heel_deg"], "must start at 0 and end at 90 (the GZ curve runs 0–90°)")
        heel = None
    basis = t.text("trim_basis", choices=("free trim", "even keel"))
    lcg = t.num("trim_lcg_m", required=basis == "free trim", default=0.0)
    vcg = t.num("trim_vcg_m", above_keel, required=basis == "free trim", default=0.0)
    step = t.num("sounding_step_m", above(0.0), required=False, default=0.1)
    fstep = t.num("transfer_fill_step_pct", above(0.0), between(0.0, 50.0, "%"), required=False, default=5.0)
    if fstep is not None and abs(100.0 / fstep - round(100.0 / fstep)) > 1e-9:
        t.bad("transfer_fill_step_pct", fstep, "must divide 100")
        fstep = None
    theel = t.increasing("transfer_heel_deg", t.array("transfer_heel_deg", required=False))
    if theel is not None and (theel[0] != 0.0 or theel[-1] != 90.0):
        t.bad("transfer_heel_deg", t.data["transfer_heel_deg"], "must start at 0 and end at 90 (the GZ curve runs 0–90°)")
        theel = None
    t.finish()
    if basis == "free trim" and hull is not None and lcg is not None and not hull.station_x_m[0] < lcg < hull.station_x_m[-1]:
        t.bad("trim_lcg_m", lcg, "must lie between the end stations")
        lcg = None
    if any(v is None for v in (draft, disp, heel, basis, lcg, vcg, step, fstep)):
        return None
    return TableSpec(draft_m=draft, kn_displacement_t=disp, kn_heel_deg=heel, trim_basis=basis,
                     trim_lcg_m=lcg, trim_vcg_m=vcg, sounding_step_m=step, transfer_fill_step_pct=fstep,
                     transfer_heel_deg=theel)


def _read_shape(t: Table, hull: HullOffsets | None) -> CompartmentShape | None:
    shape = t.text("shape", choices=COMPARTMENT_SHAPES)
    x = t.pair("x_m")
    if shape is None or x is None:
        for k in ("y_m", "z_m", "section_y_m", "section_z_m"):
            t.get(k, required=False)
        return None
    if hull is not None and not (hull.station_x_m[0] <= x[0] and x[1] <= hull.station_x_m[-1]):
        t.bad("x_m", t.data["x_m"], f"must lie within the hull's stations "
              f"({hull.station_x_m[0]:g} to {hull.station_x_m[-1]:g} m)")
        return None
    if shape == "prism":
        sy = t.array("section_y_m", min_len=3)
        sz = t.array("section_z_m", min_len=3, length=None if sy is None else len(sy))
        for k in ("y_m", "z_m"):
            if t.has(k):
                t.get(k)
                t.bad(k, t.data[k], "not used by a prism (give section_y_m and section_z_m)")
        if sy is None or sz is None:
            return None
        if abs(polygon_area(sy, sz)) <= 1e-9:
            t.bad("section_y_m", t.data["section_y_m"], "the section polygon has no area")
            return None
        return CompartmentShape("prism", x[0], x[1], section_y_m=sy, section_z_m=sz)
    y = t.pair("y_m")
    z = t.pair("z_m")
    for k in ("section_y_m", "section_z_m"):
        if t.has(k):
            t.get(k)
            t.bad(k, t.data[k], f"only a prism has a section polygon (shape is {shape!r})")
    if y is None or z is None:
        return None
    if z[0] < 0.0:
        t.bad("z_m", t.data["z_m"], "must not go below the keel (z = 0)")
        return None
    return CompartmentShape(shape, x[0], x[1], y[0], y[1], z[0], z[1])


def _check_inside(t: Table, shape: CompartmentShape, hull: HullOffsets | None) -> bool:
    """A hull-shaped compartment must contain some hull; a box or prism must lie inside it."""
    if hull is None:
        return False
    body = compartment_body(shape, hull)
    vol = float(immerse(body, 1.0, 0.0, body.z_max_m + 1.0).volume_m3)
    if vol <= 0.0:
        t.bad("x_m", t.data.get("x_m"), "the compartment lies outside the hull (no volume between its planes)")
        return False
    if shape.shape == "hull":
        return True
    for x in np.linspace(shape.x_from_m, shape.x_to_m, 9):
        py, pz = compartment_polygon(shape, hull, float(x))
        a = polygon_area(py, pz)
        hy, hz = hull_section_at(hull, float(x))
        # the part of the compartment section inside the hull section (hull is convex per side only
        # in general, so clip the compartment by the hull's bounding rows instead: use the hull
        # polygon clipped to the compartment's bounding box and compare areas)
        iy, iz = clip_to_box(hy, hz, float(py.min()), float(py.max()), float(pz.min()), float(pz.max()))
        inside = polygon_area(iy, iz)
        bbox = (py.max() - py.min()) * (pz.max() - pz.min())
        if shape.shape == "box" and inside < a * (1.0 - OUTSIDE_TOLERANCE):
            t.bad("y_m", t.data.get("y_m"), f"the box sticks out of the hull at x = {x:.2f} m "
                  f"({100 * (1 - inside / a):.1f} % of its section is outside the shell)")
            return False
        if shape.shape == "prism" and inside < bbox * (1.0 - OUTSIDE_TOLERANCE) and not _prism_inside(py, pz, hy, hz):
            t.bad("section_y_m", t.data.get("section_y_m"),
                  f"the prism's section sticks out of the hull at x = {x:.2f} m")
            return False
    return True


def _prism_inside(py: np.ndarray, pz: np.ndarray, hy: np.ndarray, hz: np.ndarray) -> bool:
    """Every vertex of the prism section inside (or on) the hull section (crossing-number test)."""
    for y0, z0 in zip(py, pz):
        inside = False
        n = len(hy)
        for i in range(n):
            y1, z1, y2, z2 = hy[i], hz[i], hy[(i + 1) % n], hz[(i + 1) % n]
            if (z1 > z0) != (z2 > z0):
                yc = y1 + (z0 - z1) * (y2 - y1) / (z2 - z1)
                if y0 <= yc + 1e-9:
                    inside = not inside
        on_edge = any(
            abs((hy[(i + 1) % n] - hy[i]) * (z0 - hz[i]) - (hz[(i + 1) % n] - hz[i]) * (y0 - hy[i])) < 1e-9
            and min(hy[i], hy[(i + 1) % n]) - 1e-9 <= y0 <= max(hy[i], hy[(i + 1) % n]) + 1e-9
            and min(hz[i], hz[(i + 1) % n]) - 1e-9 <= z0 <= max(hz[i], hz[(i + 1) % n]) + 1e-9
            for i in range(n)
        )
        if not inside and not on_edge:
            return False
    return True


def _read_tanks(root: Table, hull: HullOffsets | None, ids: dict[str, str]) -> list[TankSpec]:
    out: list[TankSpec] = []
    entries = []
    for t in root.tables("tank"):
        ident = claim_id(t, "tank", ids)
        name = t.text("name")
        kind = t.text("kind", choices=LIQUID_KINDS)
        dens = t.num("density_t_m3", liquid_density)
        pair = t.text("pair", required=False, default=None)
        cat = t.text("fs_category", required=False, default=None, choices=("fixed", "variable"))
        shape = _read_shape(t, hull)
        t.finish()
        ok = shape is not None and _check_inside(t, shape, hull)
        entries.append((t, ident, pair))
        if ok and None not in (ident, name, kind, dens):
            out.append(TankSpec(id=ident, name=name, kind=kind, density_t_m3=dens, shape=shape, pair=pair,
                                fs_category=cat))
    check_tank_pairs(entries)  # a bad pair is a problem, so the file is rejected
    return out


def _read_holds(root: Table, hull: HullOffsets | None, ids: dict[str, str]) -> list[HoldSpec]:
    out = []
    for t in root.tables("hold"):
        ident = claim_id(t, "hold", ids)
        name = t.text("name")
        mx = t.num("max_mass_t", above(0.0), required=False)
        has_mx = t.has("max_mass_t")
        shape = _read_shape(t, hull)
        t.finish()
        ok = shape is not None and _check_inside(t, shape, hull)
        if ok and ident is not None and name is not None and (mx is not None or not has_mx):
            out.append(HoldSpec(id=ident, name=name, shape=shape, max_mass_t=mx))
    return out


def _read_deck_areas(root: Table, hull: HullOffsets | None, ids: dict[str, str]) -> list[DeckAreaSpec]:
    out = []
    for t in root.tables("deck_area"):
        ident = claim_id(t, "deck_area", ids)
        name = t.text("name")
        x = t.pair("x_m")
        y = t.pair("y_m")
        has_mx = t.has("max_load_t_m2")
        mx = t.num("max_load_t_m2", above(0.0), required=False)
        t.finish()
        if x is not None and hull is not None and not (hull.station_x_m[0] <= x[0] and x[1] <= hull.station_x_m[-1]):
            t.bad("x_m", t.data["x_m"], "must lie within the hull's stations")
            x = None
        if None in (ident, name, x, y) or (has_mx and mx is None):
            continue
        out.append(DeckAreaSpec(ident, name, x[0], x[1], y[0], y[1], mx))
    return out


def _read_openings(root: Table, hull: HullOffsets | None) -> list[OpeningSpec]:
    out = []
    for t in root.tables("opening"):
        name = t.text("name", empty_ok=True)
        if name is not None:
            t.name = f"opening[{name}]"
        x = t.num("x_m")
        y = t.num("y_m")
        z = t.num("z_m", above_keel)
        t.finish()
        if x is not None and hull is not None and not hull.station_x_m[0] <= x <= hull.station_x_m[-1]:
            t.bad("x_m", x, "must lie within the hull's stations")
            x = None
        if None in (name, x, y, z):
            continue
        out.append(OpeningSpec(name, x, y, z))
    return out
