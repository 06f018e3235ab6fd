"""Result → pre-formatted rich Text lines for each panel (no textual here).

The widgets only paint these lines, so the per-key cost is building a few dozen
short Texts.  Every state is spelled with a symbol or a word as well as a
colour: the screen reads the same with NO_COLOR or on a monochrome terminal.
"""

from __future__ import annotations

from dataclasses import dataclass

from rich.text import Text

from deckload.core.free_surface import EXEMPT_RULE
from deckload.core.model import Condition, LIQUID_KINDS, Vessel
from deckload.core.result import CriterionResult, Result
from deckload.core.trimmed_tables import tables_basis
from deckload.report.verdict_format import fmt_optional
from deckload.ui.entry import fill_volume_m3, tank_density
from deckload.ui.gzplot import GzChart, Mark
from deckload.ui.palette import P

KIND_TITLE = {
    "ballast": "Ballast water",
    "fuel_oil": "Fuel oil",
    "diesel": "Diesel oil",
    "lube_oil": "Lube oil",
    "fresh_water": "Fresh water",
    "cargo_liquid": "Liquid cargo",
    "other": "Other liquids",
}
KIND_BAR = {"ballast": "bar.ballast", "fresh_water": "bar.water", "fuel_oil": "bar.fuel", "diesel": "bar.fuel",
            "lube_oil": "bar.fuel"}

BOARD_ORDER = ("ballast", *(k for k in LIQUID_KINDS if k != "ballast"))
"""Ballast first: it is what the watch changes most."""

STATE_MARK = {"empty": " ", "slack": "≈", "worst_band": "▲", "full": "■"}
"""Tank state symbol: blank empty, ≈ slack, ▲ slack in its worst free-surface band, ■ nominally full."""
LEGEND = ("≈ slack  ▲ worst band  ■ full  * FSM taken by the IS 2008 B 3.1 rule, not at the actual level  "
          "ex small tank exempt (B 3.1.12), its moment at the actual level beside it, not counted")

NEAR_FRACTION = 0.10
"""A criterion whose margin is under 10 % of its limit is flagged 'near'."""

_EIGHTHS = " ▏▎▍▌▋▊▉█"


def fill_bar(pct: float, width: int) -> str:
    """A bar ``width`` cells long filled to ``pct`` % in eighths of a cell."""
    eighths = int(round(max(0.0, min(100.0, pct)) / 100.0 * width * 8))
    full, part = divmod(eighths, 8)
    bar = "█" * full + (_EIGHTHS[part] if part else "")
    return bar.ljust(width)


def num(value: float | None, fmt: str, width: int) -> str:
    return ("—" if value is None else format(value, fmt)).rjust(width)


def opt(value: float | None, fmt: str) -> str:
    """A value the result may not have: 'n/a' when None or not finite."""
    return fmt_optional(value, fmt)


# --------------------------------------------------------------------------- the board


@dataclass(frozen=True)
class Row:
    key: tuple | None
    """('tank', id), ('hold', id), ('deck', i) or ('const', i); None for a heading line."""
    text: Text


KIND_SHORT = {"ballast": "Ballast", "fuel_oil": "Fuel oil", "diesel": "Diesel", "lube_oil": "Lube oil",
              "fresh_water": "Fresh wtr", "cargo_liquid": "Cargo liq", "other": "Other"}
KIND_COL = 9
INLINE_KIND_FROM = 56
"""Board width from which the liquid kind has its own column instead of heading lines."""


@dataclass(frozen=True)
class TankCols:
    bar: int
    inline_kind: bool

    @staticmethod
    def for_width(width: int) -> "TankCols":
        inline = width >= INLINE_KIND_FROM
        fixed = 1 + 1 + 5 + 1 + (KIND_COL + 1 if inline else 0) + 1 + 6 + 8 + 8 + 7 + 1
        return TankCols(bar=max(4, min(24, width - fixed)), inline_kind=inline)


def board_rows(vessel: Vessel, condition: Condition, result: Result | None, stale: bool, width: int) -> list[Row]:
    """Every line of the loading board: tanks grouped by liquid kind, then holds, deck loads, constants.

    Wide boards name the kind in a column on the group's first line (its total mass on
    the second); narrow ones give each group a heading line.
    """
    cols = TankCols.for_width(width)
    by_id = {t.id: t for t in result.tanks} if result is not None and not stale else {}
    head = Text(" " * 9 + ("kind".ljust(KIND_COL + 1) if cols.inline_kind else "")
                + "fill".ljust(cols.bar + 1) + "     %      m³       t    FSM", P["head"])
    rows: list[Row] = [Row(None, head)]
    for kind in BOARD_ORDER:
        tanks = [t for t in vessel.tanks if t.kind == kind]
        if not tanks:
            continue
        lines = []
        for tank in tanks:
            fill = condition.tank_fill(tank.id)
            tr = by_id.get(tank.id)
            if tr is not None:
                # An exempt slack tank shows "ex" with its moment at the actual level (not counted).
                fsm = f" ex{tr.fsi_m4 * tr.density_t_m3:4.1f}" if tr.fs_rule == EXEMPT_RULE else tr.fsm_tm
                values = (tr.fill_pct, tr.volume_m3, tr.mass_t, fsm, tr.state,
                          tr.fs_rule.startswith(("assumed", "variable", "nominally full cargo")))
            else:  # stale: amounts from the condition itself, no FSM
                vol = fill_volume_m3(tank, fill)
                values = (100 * vol / tank.capacity_m3, vol, vol * tank_density(tank, fill), None,
                          "slack" if vol else "empty", False)
            lines.append((tank, values))
        total = sum(v[2] for _, v in lines)
        if not cols.inline_kind:
            rows.append(Row(None, Text(f" {KIND_TITLE.get(kind, kind)}  {total:.1f} t", P["group"])))
        for j, (tank, values) in enumerate(lines):
            cell = (KIND_SHORT.get(kind, kind) if j == 0 else f"Σ{total:6.1f} t" if j == 1 else "") if cols.inline_kind else None
            rows.append(Row(("tank", tank.id), _tank_line(tank.id, cell, *values, kind, cols, stale)))
    rows.extend(_cargo_rows(vessel, condition, width))
    return rows


def _tank_line(tid, kind_cell, pct, vol, mass, fsm, state, by_rule, kind, cols: TankCols, stale: bool) -> Text:
    worst = state == "worst_band"
    line = Text(STATE_MARK.get(state, "?"), P["danger"] if worst else P["label"])
    line.append(f" {tid:<5.5} ", P["value"])
    if kind_cell is not None:
        line.append(f"{kind_cell:<{KIND_COL}.{KIND_COL}} ", P["group"] if kind_cell and not kind_cell.startswith("Σ") else P["dim"])
    bar_style = P["bar.worst"] if worst else P[KIND_BAR.get(kind, "bar.other")]
    line.append(fill_bar(pct, cols.bar), P["stale"] if stale else bar_style)
    line.append("▕", P["bar.empty"])
    style = P["stale"] if stale else P["value"]
    line.append(f"{pct:6.1f}{vol:8.2f}{mass:8.2f}", style)
    if isinstance(fsm, str):
        line.append(f"{fsm:>7.7}", P["dim"])
    else:
        line.append(num(fsm, ".1f", 7), P["stale"] if fsm is None or stale else style)
    line.append("*" if by_rule else " ", P["label"])
    return line


def _cargo_rows(vessel: Vessel, condition: Condition, width: int) -> list[Row]:
    """Holds, deck loads and constants, each line tagged with its group (no heading: rows are precious)."""
    name_w = max(8, min(30, width - 38))
    rows: list[Row] = []
    loads = {h.hold_id: h for h in condition.holds}
    for hold in vessel.holds:
        load = loads.get(hold.id)
        line = Text(" hold  ", P["label"])
        line.append(f"{hold.id + ' ' + hold.name:<{name_w}.{name_w}}", P["value"])
        line.append(f"{(load.mass_t if load else 0.0):8.1f} t", P["value"])
        if hold.max_mass_t is not None:
            line.append(f"  of {hold.max_mass_t:g} t", P["dim"])
        if load and load.description:
            line.append(f"  {load.description}", P["dim"])
        rows.append(Row(("hold", hold.id), line))
    for i, item in enumerate(condition.deck_items):
        rows.append(Row(("deck", i), _item_line("deck ", item, getattr(item, "area_id", None), name_w)))
    for i, item in enumerate(condition.constants):
        rows.append(Row(("const", i), _item_line("const", item, None, name_w)))
    # The profile's fixed constants this condition does not replace (read-only here).
    own = {c.name for c in condition.constants}
    for i, item in enumerate(vessel.constants):
        if item.name not in own:
            rows.append(Row(("fixed", i), _item_line("fixed", item, None, name_w)))
    return rows


def _item_line(tag: str, item, area: str | None, name_w: int) -> Text:
    line = Text(f" {tag} ", P["label"])
    line.append(f"{item.name:<{name_w}.{name_w}}", P["value"])
    line.append(f"{item.mass_t:8.1f} t", P["value"])
    line.append(f"  x{item.lcg_m:5.1f} z{item.vcg_m:4.1f} y{item.tcg_m:+4.1f}", P["dim"])
    if area:
        line.append(f" {area}", P["dim"])
    return line


# --------------------------------------------------------------------------- stability panel


def _pair(line: Text, label: str, value: str, unit: str, stale: bool, compact: bool) -> None:
    line.append(f"{label:<6}" if not compact else f"{label:<5.5}", P["label"])
    line.append(f"{value:>8} " if not compact else f"{value:>7} ", P["stale"] if stale else P["value"])
    line.append(f"{unit:<5.5}" if not compact else f"{unit:<3.3}", P["unit"])


def afloat_lines(vessel: Vessel, condition: Condition, result: Result | None, stale: bool, width: int = 54) -> list[Text]:
    """Displacement, deadweight, drafts, trim, freeboard at midships and its margin to the load line
    in use (FWA/DWA applied by the engine), list, deck-edge immersion angle, KG, θf, KG fluid, FSC,
    GM fluid, KM (two pairs a line; 'n/a' where the result has no value), and the tables used
    (even keel, or the tables at trims the trim was interpolated between)."""
    compact = width < 44
    title = Text(" Afloat", P["title"])
    title.append(f"  ρ {condition.water_density_t_m3:.3f} t/m³", P["dim"])
    if stale:
        title.append("  (last good, stale)", P["stale"])
    if result is None:
        return [title, Text(" no result: see the warning above", P["danger"])]
    r = result
    if not compact:
        rule = "IS2008" if r.fs_rule == "is2008" else "actual"
        title.append(f"  FS {rule} · GZ {'transfer' if r.gz_correction == 'transfer' else 'const'}", P["dim"])
    trim_word = "A" if r.trim_m > 0 else ("F" if r.trim_m < 0 else "")
    list_word = "S" if r.list_deg > 0.005 else ("P" if r.list_deg < -0.005 else "")
    ll = condition.load_line[:3]
    margin = "n/a" if r.load_line_margin_m is None else f"{r.load_line_margin_m:+.3f}"
    rows = [
        (("Δ", f"{r.displacement_t:.1f}", "t"), ("DWT", f"{r.deadweight_t:.1f}", "t")),
        (("T aft", f"{r.draft_aft_m:.3f}", "m"), ("T fwd", f"{r.draft_fwd_m:.3f}", "m")),
        (("T mid", f"{r.draft_mean_m:.3f}", "m"), ("Trim", f"{abs(r.trim_m):.3f}", f"m {trim_word}")),
        (("Fbd", opt(r.freeboard_m, ".3f"), "m"), ("to LL", margin, "m" if compact else "m " + ll)),
        (("List", f"{abs(r.list_deg):.2f}", f"° {list_word}"), ("∠deck", opt(r.deck_edge_angle_deg, ".1f"), "°")),
        (("KG", f"{r.kg_m:.3f}", "m"), ("θf", opt(r.downflooding_angle_deg, ".1f"), "°")),
        (("KG fl", f"{r.kg_fluid_m:.3f}", "m"), ("FSC", f"{r.fsc_m:.3f}", "m")),
        (("GM fl", f"{r.gm_fluid_m:.3f}", "m"), ("KM", f"{r.km_m:.3f}", "m")),
    ]
    out = [title]
    for left, right in rows:
        line = Text(" ")
        _pair(line, *left, stale, compact)
        line.append(" " if compact else "")
        _pair(line, *right, stale, compact)
        out.append(line)
    # which hydrostatic and KN tables: even keel, or at trims and between which
    out.append(Text(" Tables ", P["label"]) + Text(tables_basis(vessel, r.trim_m).short, P["dim"]))
    return out


SHORT_NAMES = {
    "area-0-30": "Area 0–30°",
    "area-0-40": "Area 0–40°",
    "area-30-40": "Area 30–40°",
    "gz-30": "GZ at ≥30°",
    "angle-max-gz": "∠ of GZ max",
    "gm0": "GM0 fluid",
    "area-b-a": "Wind b ≥ a",
    "theta0": "Wind heel θ0",
}


CMP = {">=": "≥", "<=": "≤"}


def criterion_name(c: CriterionResult) -> str:
    for tail, short in SHORT_NAMES.items():
        if c.id.endswith(tail):
            return short
    return c.description


def verdict(c: CriterionResult) -> tuple[str, str]:
    """'n/a' (not assessable: never a pass), 'FAIL', 'NEAR' (margin under 10 % of the limit) or 'ok',
    with its style key."""
    if not c.assessed:
        return "n/a", "caution"
    if not c.passed:
        return "FAIL", "fail"
    if c.margin_fraction < NEAR_FRACTION:
        return "NEAR", "near"
    return "ok", "ok"


def gz_chart(result: Result | None, stale: bool, width: int, height: int) -> GzChart:
    """The curve the criteria were checked on: heeling to the side she lists to."""
    if result is None:
        return GzChart((0.0, 90.0), (0.0, 0.0), (), width, height, stale=True)
    marks = [Mark(30.0, "30"), Mark(40.0, "40")]
    if result.downflooding_angle_deg is not None:  # first: it wins a shared column and label room
        marks.insert(0, Mark(result.downflooding_angle_deg, "θf", "gz.flood"))
    gz = result.gz_port_m if result.criteria_side == "port" else result.gz_m
    return GzChart(tuple(result.gz_heel_deg), tuple(gz), tuple(marks), width, height, stale)


def gz_caption(result: Result | None) -> Text:
    t = Text(" GZ curve", P["title"])
    if result is None:
        return t
    t.append(f" to {result.criteria_side}", P["title"])
    t.append(f"  max {result.max_gz_m:.3f} m at {result.max_gz_angle_deg:.0f}°", P["dim"])
    if result.vanishing_angle_deg is not None:
        t.append(f"  zero at {result.vanishing_angle_deg:.0f}°", P["dim"])
    elif result.gz_end_deg < 90.0:
        t.append(f"  zero beyond {result.gz_end_deg:g}° (KN end)", P["dim"])
    if result.vanishing_angle_deg is not None and result.gz_end_deg < 90.0:
        t.append(f"  curve ends {result.gz_end_deg:g}° (KN end)", P["dim"])
    if result.downflooding_angle_deg is not None:
        t.append(f"  θf {result.downflooding_angle_deg:.0f}°", P["dim"])
    return t


# --------------------------------------------------------------------------- warnings


@dataclass(frozen=True)
class Alert:
    severity: str
    """'danger' or 'caution'."""
    text: str

    def line(self) -> Text:
        sym = "✖ DANGER " if self.severity == "danger" else "! CAUTION "
        t = Text(sym, P[self.severity])
        t.append(self.text, P["value"])
        return t


def alerts(result: Result | None, stale: bool, problem: str | None) -> list[Alert]:
    """What the watch must see, dangers first: displacement outside the tables (the
    screen's own), then the engine's warnings (criteria failed or within 10 %, slack
    tanks in their worst band, draft over the load line, list beyond 2°, deck and
    hold limits, loll)."""
    out: list[Alert] = []
    if problem:
        out.append(Alert("danger", f"Outside the tables: {problem}. Numbers shown are the last good ones."))
    if result is not None:
        prefix = "(last good) " if stale else ""
        out.extend(Alert("danger" if w.severity == "danger" else "caution", prefix + w.message) for w in result.warnings)
    return sorted(out, key=lambda a: a.severity != "danger")
