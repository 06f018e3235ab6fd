"""Physical bounds and completeness of a read profile or condition, as Problems.

The readers (:mod:`deckload.io.profiles`) first check each value's form and its own rules;
then, with the whole model built, :func:`check_vessel` and :func:`check_condition` hold
every position, mass, level and table value against the vessel's own extent
(:mod:`deckload.core.bounds`, the same functions the screen's forms use) and make sure a
profile is complete.  Each problem names the file, the line, the dotted key, the value and
the rule, like every other problem of a file.
"""

from __future__ import annotations

from typing import Iterable

import numpy as np

from deckload.core import bounds as b
from deckload.core import model as m
from deckload.io.tomlcheck import FileCheck, num, toml_value


class _Checker:
    def __init__(self, ctx: FileCheck):
        self.ctx = ctx

    def one(self, raw: tuple, key: str, x: float | None, rng: b.Range) -> None:
        if x is None:
            return
        msg = rng.rule(float(x))
        if msg:
            self.ctx.add(raw, key, toml_value(float(x)), msg)

    def array(self, raw: tuple, key: str, xs, rng_of) -> None:
        """Each value of ``xs`` against ``rng_of(i)`` (a Range, or one Range for all); the first bad row only."""
        if xs is None:
            return
        arr = np.asarray(xs, dtype=float)
        for idx in np.ndindex(arr.shape):
            rng = rng_of(idx) if callable(rng_of) else rng_of
            msg = rng.rule(float(arr[idx]))
            if msg:
                where = ", ".join(f"{'row' if k == 0 else 'column'} {i + 1}" for k, i in enumerate(idx))
                self.ctx.add(raw + tuple(idx), key, toml_value(float(arr[idx])), f"{msg} ({where})")
                return

    def position(self, p: m.Particulars, raw: tuple, name: str, lcg=None, vcg=None, tcg=None,
                 keys: Iterable[str] = ("lcg_m", "vcg_m", "tcg_m")) -> None:
        kx, kz, ky = keys
        self.one(raw + (kx,), f"{name}.{kx}", lcg, b.x_range(p))
        self.one(raw + (kz,), f"{name}.{kz}", vcg, b.z_range(p))
        self.one(raw + (ky,), f"{name}.{ky}", tcg, b.y_range(p))


def check_vessel(ctx: FileCheck, v: m.Vessel) -> m.Vessel:
    """``v`` if every value is physically possible and the profile complete; else raise its ProfileError."""
    c = _Checker(ctx)
    p = v.particulars
    c.one(("vessel", "lbp_m"), "vessel.lbp_m", p.lbp_m, b.lbp_range())
    c.one(("vessel", "breadth_m"), "vessel.breadth_m", p.breadth_m, b.beam_range(p.lbp_m))
    c.one(("vessel", "depth_m"), "vessel.depth_m", p.depth_m, b.depth_range(p.lbp_m))
    ctx.fail_if_any()  # every other range is derived from these three

    # completeness: a profile cut short must not pass as a vessel without tanks or tables
    if not v.tanks:
        ctx.add(("format",), "tank", None, "no [[tank]] sections: a vessel profile must describe every tank "
                "(is the file cut short?)")
    h = v.hydrostatics
    if float(h.draft_m[-1]) < p.design_draft_m * (1 - 1e-9):
        ctx.add(("hydrostatics", "draft_m", len(h.draft_m) - 1), "hydrostatics.draft_m", toml_value(float(h.draft_m[-1])),
                f"the table ends below the design draft {num(p.design_draft_m)} m: it must reach it "
                "(is the table cut short?)")

    # LCB and LCF within the hull's length (the audit judges them more closely; a value beyond the
    # hull would otherwise reach it only through what it makes of the others, as "inf m away")
    for col in ("lcb_m", "lcf_m"):
        c.array(("hydrostatics", col), f"hydrostatics.{col}", getattr(h, col), b.x_range(p))
    ls = v.lightship
    c.one(("lightship", "mass_t"), "lightship.mass_t", ls.mass_t, b.lightship_mass_range(v))
    # the items' mass range (table's greatest displacement less the lightship) and the default
    # least operating displacement follow from the lightship: with it impossible they would
    # only echo it ("between 0 and 0 t", a key the file does not hold)
    ctx.fail_if_any()
    # Positions, hydrostatic rows, KN and tank tables of the profile are judged by the
    # plausibility audit (deckload.core.audit, on the same envelope), which every command
    # runs before it uses a profile (deckload.cli.calc.load_and_evaluate, check, open).
    for n, it in enumerate(getattr(v, "constants", ())):
        # by its name, as the reader names it (unique in a profile), as a tank by its id
        c.one(("constant", n, "mass_t"), f"constant[{it.name}].mass_t", it.mass_t, b.item_mass_range(v))
        c.position(p, ("constant", n), f"constant[{it.name}]", it.lcg_m, it.vcg_m, it.tcg_m)
    hi_disp = b.max_displacement_t(v)

    for n, t in enumerate(v.tanks):
        raw, name = ("tank", n), f"tank[{t.id}]"
        c.one(raw + ("capacity_m3",), f"{name}.capacity_m3", t.capacity_m3, b.volume_range(p))
        _calibration_surface(ctx, raw, name, t, p)
        if t.transfer is not None:
            c.array(raw + ("transfer", "moment_m4"), f"{name}.transfer.moment_m4", t.transfer.moment_m4,
                    b.transfer_moment_range(p, t.capacity_m3))
            if t.transfer.moment_port_m4 is not None:
                c.array(raw + ("transfer", "moment_port_m4"), f"{name}.transfer.moment_port_m4",
                        t.transfer.moment_port_m4, b.transfer_moment_range(p, t.capacity_m3))
    for n, hd in enumerate(v.holds):
        raw, name = ("hold", n), f"hold[{hd.id}]"
        c.one(raw + ("capacity_m3",), f"{name}.capacity_m3", hd.capacity_m3, b.volume_range(p))
        c.one(raw + ("max_mass_t",), f"{name}.max_mass_t", hd.max_mass_t, b.item_mass_range(v))
    for n, a in enumerate(v.deck_areas):
        c.one(("deck_area", n, "area_m2"), f"deck_area[{a.id}].area_m2", a.area_m2, b.deck_area_range(p))
        c.array(("deck_area", n, "x_m"), f"deck_area[{a.id}].x_m", a.x_extent_m, b.x_range(p))
        c.array(("deck_area", n, "y_m"), f"deck_area[{a.id}].y_m", a.y_extent_m, b.y_range(p))
    if v.limit_curve is not None and v.limit_curve.kind == "max_kg_m":
        c.array(("limit_curve", "max_kg_m"), "limit_curve.max_kg_m", v.limit_curve.value, b.z_range(p))
    elif v.limit_curve is not None:
        zr = b.z_max_m(p)
        c.array(("limit_curve", "min_gm_m"), "limit_curve.min_gm_m", v.limit_curve.value,
                b.Range(-zr, zr, "m", "within the vessel's height"))
    if v.limit_curve is not None and v.limit_curve.trim_range_m is not None:
        c.array(("limit_curve", "trim_range_m"), "limit_curve.trim_range_m", v.limit_curve.trim_range_m,
                b.table_trim_range(p))
    dmin = v.free_surface.min_operating_displacement_t
    c.one(("free_surface", "min_operating_displacement_t"), "free_surface.min_operating_displacement_t", dmin,
          b.Range(0.0, hi_disp, "t", "at most the greatest displacement in the hydrostatic table"))
    ctx.fail_if_any()
    return v


def item_key(group: str, n: int, name: str | None) -> str:
    """A condition's constant in a message: its number and, when known, its name
    (``constant[#1 "Crew, stores"]``); names may repeat in a condition, so the number stays."""
    return f'{group}[#{n + 1} "{name}"]' if name else f"{group}[#{n + 1}]"


def check_condition(ctx: FileCheck, v: m.Vessel, cond: m.Condition) -> m.Condition:
    """``cond`` if every mass and position in it is physically possible on ``v``; else raise."""
    c = _Checker(ctx)
    p = v.particulars
    mass = b.item_mass_range(v)
    for h in cond.holds:
        raw, name = ("holds", h.hold_id), f"holds.{h.hold_id}"
        c.one(raw + ("mass_t",), f"{name}.mass_t", h.mass_t, mass)
        c.position(p, raw, name, h.lcg_m, h.vcg_m, h.tcg_m)
        hold = v.hold(h.hold_id) if h.hold_id in v.hold_index else None
        if hold is not None and h.lcg_m is not None and h.lcg_m in b.x_range(p):
            # the cargo's centre lies in its hold: an LCG from midships here is the deck load's slip
            why = b.off_span_x(hold.x_extent_m, f"hold {hold.id}", "hold", "cargo", p.lbp_m, h.lcg_m)
            if why:
                ctx.add(raw + ("lcg_m",), f"{name}.lcg_m", toml_value(float(h.lcg_m)), why)
    for group, items in (("deck_item", cond.deck_items), ("constant", cond.constants)):
        for n, it in enumerate(items):
            raw, name = (group, n), item_key(group, n, it.name) if group == "constant" else f"{group}[#{n + 1}]"
            c.one(raw + ("mass_t",), f"{name}.mass_t", it.mass_t, mass)
            c.position(p, raw, name, it.lcg_m, it.vcg_m, it.tcg_m)
            fp = getattr(it, "footprint_m2", None)
            area_id = getattr(it, "area_id", None)
            area = v.deck_area(area_id).area_m2 if area_id in v.area_index else None
            c.one(raw + ("footprint_m2",), f"{name}.footprint_m2", fp, b.footprint_range(p, area))
            if area_id in v.area_index and it.lcg_m in b.x_range(p) and it.tcg_m in b.y_range(p):
                # a load on a named area stands on it: the screen's deck-load form refuses the same
                # (ui.entry.item_from_form); an LCG from midships here moved the trim 0.2 → 3.3 m
                on = v.deck_area(area_id)
                for k, val, why in (("lcg_m", it.lcg_m, b.off_deck_area_x(on, p.lbp_m, it.lcg_m)),
                                    ("tcg_m", it.tcg_m, b.off_deck_area_y(on, it.tcg_m))):
                    if why:
                        ctx.add(raw + (k,), f"{name}.{k}", toml_value(float(val)), why)
    ctx.fail_if_any()
    return cond


def _calibration_surface(ctx: FileCheck, raw: tuple, name: str, t: m.Tank, p: m.Particulars) -> None:
    """The surface a calibration implies between two rows, ΔV/Δh (the mean plan area of the liquid
    between those levels: derived), must not exceed the hull's plan area 1.2·LBP × B
    (:func:`deckload.core.bounds.max_plan_area_m2`): a row at a sounding of 1e-300 m holding
    0.16 m³ would be a surface of 1.6e299 m² (levels from the tank's lowest point, rows as the
    reader ordered them, with any 'level 0, volume 0' row it added)."""
    cal = t.calibration
    if cal is None:
        return
    level = np.asarray(cal.sounding_m, dtype=float)
    vol = np.asarray(cal.volume_m3, dtype=float)
    if len(level) < 2:
        return
    top = b.max_plan_area_m2(p)
    dh, dv = np.diff(level), np.diff(vol)
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):  # (a step of 1e-320 m: inf, refused)
        surface = np.where(dh > 0, dv / dh, np.inf)
    bad = np.flatnonzero(~(surface <= top * (1 + 1e-9)))
    if bad.size:
        i = int(bad[0])
        ctx.add(raw + ("calibration", "volume_m3"), f"{name}.calibration.volume_m3", None,
                f"from level {level[i]:.6g} m to {level[i + 1]:.6g} m above the tank's lowest point the volume "
                f"rises {dv[i]:.6g} m³: a liquid surface of {surface[i]:.4g} m², larger than the hull's plan "
                f"area 1.2·LBP × breadth = {top:.6g} m² (check the soundings and volumes of these rows)")
