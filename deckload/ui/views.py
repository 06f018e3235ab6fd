"""Result → pre-formatted rich Text lines for each panel (no textual here).

The widgets only paint these lines, so the per-key cost is building a few dozen
short Texts.  Every state is spelled with a symbol or a word as well as a
colour: the screen reads the same with NO_COLOR or on a monochrome terminal.
"""

from __future__ import annotations

import functools

from rich.text import Span, Text

from deckload.core.deadweight import deadweight_by_kind
from deckload.core.free_surface import EXEMPT_RULE, tank_state
from deckload.core.frozen import frozen
from deckload.core.model import Condition, LIQUID_KINDS, Vessel
from deckload.core.result import CriterionResult, Result
from deckload.core.trimmed_tables import tables_basis
from deckload.report.verdict_format import STATED_DENSITY_MARK, flood_words, fmt_optional, never_positive
from deckload.ui.entry import held_m3, tank_density
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
          "ex small tank exempt (B 3.1.12), its moment at the actual level beside it, not counted  "
          "◆ density stated for this condition (delivery note), not the tank's default")

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


def _flood_cell(r: Result) -> tuple[str, str]:
    """θf's value and unit for the afloat panel: the angle, else 'unknown' (off the profile's curve)
    or 'none' (the profile gives none), as the report and calc word it in full."""
    if r.downflooding_angle_deg is None:
        return flood_words(r, short=True), ""
    return opt(r.downflooding_angle_deg, ".1f"), "°"


def pieces(style, first: str, *rest: tuple[str, object]) -> Text:
    """``Text(first, style)`` with each ``(text, style)`` of ``rest`` appended: the same Text (its
    plain text and spans), made in one step.  rich's ``Text.append`` strips control codes from each
    piece and keeps a list of the pieces to join; a panel line is a dozen of them, rebuilt on
    every key.  Here the pieces are joined once and stripped once (``Text.__init__``); should the
    stripping take anything out, the offsets of the spans would be wrong, so the line is then made
    by ``append`` itself."""
    spans = []
    at = len(first)
    for text, st in rest:
        end = at + len(text)
        if st and end > at:  # (append gives an empty piece, or one without a style, no span)
            spans.append(Span(at, end, st))
        at = end
    plain = first + "".join([text for text, _ in rest])
    line = Text(plain, style, spans=spans)
    if len(line) != at:  # a control code was taken out: rich's own way, piece by piece
        line = Text(first, style)
        for text, st in rest:
            line.append(text, st)
    return line


def opt(value: float | None, fmt: str) -> str:
    """A value the result may not have: 'n/a' when None or not finite."""
    return fmt_optional(value, fmt)


# --------------------------------------------------------------------------- the board


@frozen
class Row:
    """One line of the loading board, with the key of the item it shows."""

    key: tuple | None
    """('tank', id), ('hold', id), ('deck', i) or ('const', i); None for a heading line."""
    text: Text


_ROWS: dict[tuple, Row] = {}
"""Rows by their key and line (by identity: the lines are kept and shared, :func:`_tank_line`)."""


def _row(key: tuple | None, text: Text) -> Row:
    """``Row(key, text)``, the same Row for the same key and line: a key changes one or two of the
    board's lines, and every Row was made again (a frozen record: each field set by
    ``object.__setattr__``)."""
    got = _ROWS.get((key, id(text)))
    if got is None or got.text is not text:  # (the Row holds its line: an id is not reused while kept)
        if len(_ROWS) >= 4096:  # a bound: new lines come with new values
            _ROWS.clear()
        got = _ROWS[(key, id(text))] = Row(key, text)
    return got


RHO_COL_FROM = 56
"""Board width from which each tank's density has a column of its own."""
STATED_MARK = STATED_DENSITY_MARK
"""Beside a tank id: the density was stated for this condition (a bunker delivery note)."""
ID_MIN, ID_MAX = 5, 8
"""Cells for the tank id: at least five, more (up to eight) when the profile's ids are longer."""


@functools.lru_cache(maxsize=1024)
def fit(text: str, width: int) -> str:
    """``text`` in exactly ``width`` cells: padded, or shortened with '…' (never cut silently).
    Kept: the board fits the same names to the same widths on every key."""
    if width <= 0:
        return ""
    t = Text(text)
    t.truncate(width, overflow="ellipsis", pad=True)
    return t.plain


@frozen
class TankCols:
    """The board's columns: mark, id, ◆, fill bar, %, m³, t, (ρ), FSM, *.  Every row that has a
    mass ends it at ``t_end``, so tanks, group totals, holds, deck loads, constants and the
    deadweight read down one column."""

    bar: int
    rho: bool
    id_w: int = ID_MIN
    width: int = 0

    @staticmethod
    @functools.lru_cache(maxsize=64)
    def for_width(width: int, id_w: int = ID_MIN) -> "TankCols":
        rho = width >= RHO_COL_FROM
        id_w = max(ID_MIN, min(ID_MAX, id_w))
        # a longer id takes cells from the bar, never below four of them
        id_w = max(ID_MIN, min(id_w, width - TankCols._fixed(0, rho) - 4))
        return TankCols(bar=max(4, min(24, width - TankCols._fixed(id_w, rho))), rho=rho, id_w=id_w, width=width)

    @staticmethod
    def _fixed(id_w: int, rho: bool) -> int:
        return 1 + 1 + id_w + 1 + 1 + 6 + 8 + 8 + (6 if rho else 0) + 7 + 1

    @property
    def t_end(self) -> int:
        """The cell after the last of the t column."""
        return 1 + 1 + self.id_w + 1 + self.bar + 1 + 6 + 8 + 8

    @property
    def t_start(self) -> int:
        return self.t_end - 8

    @property
    def tail(self) -> int:
        """Cells after the t column (ρ, FSM and * on a tank's row)."""
        return max(0, self.width - self.t_end)


def board_rows(vessel: Vessel, condition: Condition, result: Result | None, stale: bool, width: int) -> list[Row]:
    """Every line of the loading board: tanks grouped by liquid kind (each group under a heading
    line of its own, with its total mass in the t column), then holds, deck loads, constants,
    and the deadweight by kind."""
    cols = TankCols.for_width(width, max((len(t.id) for t in vessel.tanks), default=ID_MIN))
    by_id = {t.id: t for t in result.tanks} if result is not None and not stale else {}
    fills: dict = {}
    for f in condition.tanks:  # Condition.tank_fill's answer for each tank, in one pass
        fills.setdefault(f.tank_id, f)
    rows: list[Row] = [_row(None, _board_head(cols))]
    for kind in BOARD_ORDER:
        tanks = [t for t in vessel.tanks if t.kind == kind]
        if not tanks:
            continue
        lines = []
        for tank in tanks:
            fill = fills.get(tank.id)
            tr = by_id.get(tank.id)
            stated = fill is not None and fill.density_t_m3 is not None
            if tr is not None:
                # An exempt slack tank shows "ex" with its moment at the actual level (not counted).
                fsm = exempt_fsm(tr.fsi_m4 * tr.density_t_m3) if tr.fs_rule == EXEMPT_RULE else tr.fsm_tm
                values = (tr.fill_pct, tr.volume_m3, tr.mass_t, tr.density_t_m3, fsm, tr.state,
                          tr.fs_rule.startswith(("assumed", "variable", "nominally full cargo")))
            else:  # stale: amounts from the condition itself, no FSM
                vol = held_m3(vessel, condition, tank)
                rho = tank_density(tank, fill)
                pct = 100 * vol / tank.capacity_m3
                # the state from the fill by the calculation's own rule, not guessed from 'holds some'
                state = tank_state(pct, tank, vessel.free_surface.empty_pct, vessel.free_surface.nominally_full_pct)
                values = (pct, vol, vol * rho, rho, None, state, False)
            lines.append((tank, stated, values))
        rows.append(_row(None, _group_line(KIND_TITLE.get(kind, kind), sum(v[2] for _, _, v in lines), cols)))
        for tank, stated, values in lines:
            rows.append(_row(("tank", tank.id), _tank_line(tank.id, stated, *values, kind, cols, stale)))
    rows.extend(_cargo_rows(vessel, condition, cols))
    if result is not None:
        rows.extend(deadweight_rows(result, stale, cols))
    return rows


@functools.lru_cache(maxsize=64)
def _board_head(cols: TankCols) -> Text:
    """The board's column heads (kept per layout of columns: shared, never modified)."""
    return Text(" " * (cols.id_w + 3) + "fill".ljust(cols.bar + 1) + "     %      m³       t"
                + ("     ρ" if cols.rho else "") + "    FSM", P["head"])


@functools.lru_cache(maxsize=1024)
def _group_line(title: str, total_t: float, cols: TankCols) -> Text:
    """' Fuel oil ……… Σ 21.28': the group's heading, its total under the tanks' t column (kept for
    the same values, as the tanks' lines are: shared, never modified)."""
    return Text(fit(f" {title}", cols.t_start - 1) + f" Σ{total_t:7.2f}", P["group"])


def exempt_fsm(fsm_tm: float) -> str:
    """'ex' and the exempt tank's moment at its actual level, in the FSM column's seven cells
    (whole t·m when a tenth would not fit: never cut)."""
    text = f" ex{fsm_tm:4.1f}"
    return text if len(text) <= 7 else f"ex{fsm_tm:.0f}".rjust(7)


@functools.lru_cache(maxsize=1024)
def _tank_line(tid, stated, pct, vol, mass, rho, fsm, state, by_rule, kind, cols: TankCols, stale: bool) -> Text:
    """One tank's line.  Kept for the same values (a key changes one or two tanks, not the 25 others):
    the Text is shared, so it is never modified after it is made."""
    worst = state == "worst_band"
    line = Text(STATE_MARK.get(state, "?"), P["danger"] if worst else P["label"])
    line.append(" " + fit(tid, cols.id_w), P["value"])
    line.append(STATED_MARK if stated else " ", P["caution"])
    bar_style = P["bar.worst"] if worst else P[KIND_BAR.get(kind, "bar.other")]
    line.append(fill_bar(pct, cols.bar), P["stale"] if stale else bar_style)
    line.append("▕", P["bar.empty"])
    style = P["stale"] if stale else P["value"]
    line.append(f"{pct:6.1f}{vol:8.2f}{mass:8.2f}", style)
    if cols.rho:
        line.append(f"{rho:6.3f}", style if stated else P["dim"])
    if isinstance(fsm, str):
        line.append(f"{fsm:>7.7}", P["dim"])
    else:
        line.append(num(fsm, ".1f", 7), P["stale"] if fsm is None or stale else style)
    line.append("*" if by_rule else " ", P["label"])
    return line


def deadweight_rows(result: Result, stale: bool, cols: TankCols) -> list[Row]:
    """The deadweight by kind (cargo, each liquid, stores and constants) under a heading, and the
    deadweight they add up to, each under the tanks' t column."""
    rows = [_row(None, _dwt_line(" Deadweight by kind" + (" (last good)" if stale else ""), None, "", stale, cols))]
    for line in deadweight_by_kind(result):
        rows.append(_row(("dwt", line.kind), _dwt_line(line.title, line.mass_t, " ", stale, cols)))
    rows.append(_row(("dwt", "total"), _dwt_line("Deadweight", result.deadweight_t, "Σ", stale, cols)))
    return rows


@functools.lru_cache(maxsize=1024)
def _dwt_line(title: str, mass_t: float | None, sign: str, stale: bool, cols: TankCols) -> Text:
    """A line of the deadweight by kind: the kind and its mass under the tanks' t column after
    ``sign``; without a mass, the heading (kept for the same values: shared, never modified)."""
    if mass_t is None:
        return Text(title, P["group"])
    text = Text("  " + fit(title, cols.t_start - 3), P["label"])
    text.append(f"{sign}{mass_t:8.2f} t", P["stale"] if stale else P["value"])
    return text


def _cargo_rows(vessel: Vessel, condition: Condition, cols: TankCols) -> list[Row]:
    """Holds, deck loads and constants, each line tagged with its group (no heading: rows are
    precious), the mass in the tanks' t column; what does not fit the name cells ends in '…' and
    the message line gives it whole when the cursor is on the row."""
    rows: list[Row] = []
    loads = {h.hold_id: h for h in condition.holds}
    for hold in vessel.holds:
        load = loads.get(hold.id)
        name = f"{hold.id} {hold.name}" + (f": {load.description}" if load and load.description else "")
        # the hold's limit: the first spelling that fits the cells after the mass
        limit = () if hold.max_mass_t is None else (f" of {hold.max_mass_t:g} t", f" of {hold.max_mass_t:g}")
        rows.append(_row(("hold", hold.id), _mass_line("hold", name, load.mass_t if load else 0.0, limit, cols, one=True)))
    for i, item in enumerate(condition.deck_items):
        rows.append(_row(("deck", i), _mass_line("deck", item.name, item.mass_t, _position(item, getattr(item, "area_id", None)), cols)))
    for i, item in enumerate(condition.constants):
        rows.append(_row(("const", i), _mass_line("const", item.name, item.mass_t, _position(item, None), cols)))
    # The profile's fixed constants this condition does not replace (read-only here).
    own = {c.name for c in condition.constants}
    for i, item in enumerate(vessel.constants):
        if item.name not in own:
            rows.append(_row(("fixed", i), _mass_line("fixed", item.name, item.mass_t, _position(item, None), cols)))
    return rows


def side_offset(tcg_m: float) -> str:
    """'1.6S', '1.6P' or 'CL': a transverse position as magnitude and side (to 0.1 m)."""
    if round(abs(tcg_m), 1) == 0:
        return "CL"
    return f"{abs(tcg_m):.1f}{'S' if tcg_m > 0 else 'P'}"


def _position(item, area: str | None) -> tuple[str, ...]:
    """An item's centre of gravity (x from the aft perpendicular, z above keel, side), then its deck area."""
    parts = (f" x{item.lcg_m:5.1f} z{item.vcg_m:4.1f}", f" y {side_offset(item.tcg_m)}")
    return parts + ((f" {area}",) if area else ())


@functools.lru_cache(maxsize=1024)
def _mass_line(tag: str, name: str, mass_t: float, after: tuple[str, ...], cols: TankCols, one: bool = False) -> Text:
    """' deck  20 ft container, bu…   14.00  x  6.5 z 5.8': tag, name shortened with '…', the mass
    ending where the tanks' t column ends, then as many of ``after`` (in order) as fit the cells
    left (``one``: only the first of them that fits, they are spellings of one note).  Kept for the
    same values, as :func:`_tank_line` (a nudge of a tank changes no hold, deck or constant line):
    the Text is shared, so it is never modified after it is made."""
    line = Text(f" {tag:<5} ", P["label"])
    line.append(fit(name, cols.t_start - 8), P["value"])
    line.append(f" {mass_t:8.2f}", P["value"])
    room = cols.tail
    tail = ""
    if one:
        tail = next((a for a in after if len(a) <= room), "")
    else:
        for part in after:
            if len(tail) + len(part) > room:
                break
            tail += part
    if tail:
        line.append(tail, P["dim"])
    return line


# --------------------------------------------------------------------------- stability panel


COMPACT_LABEL = {"Margin": "Marg."}
"""Labels longer than the narrow panel's five columns, shortened there."""

MARK_LETTERS = {"summer": "S", "winter": "W", "tropical": "T", "fresh": "F", "tropical fresh": "TF",
                "winter north atlantic": "WNA"}
"""The letters of the load-line marks on the hull (ICLL: S, W, T, F, TF, WNA)."""


def mark_letters(name: str | None) -> str:
    """'S' for the summer mark; a mark the table does not know keeps its own name (three letters)."""
    if not name:
        return ""
    key = " ".join(name.replace("_", " ").lower().split())
    return MARK_LETTERS.get(key, name[:3])


def _pair(label: str, value: str, unit: str, stale: bool, compact: bool) -> tuple[tuple[str, object], ...]:
    """A label, its value and unit: the three pieces of a line (:func:`pieces`)."""
    return ((f"{label:<6}" if not compact else f"{COMPACT_LABEL.get(label, label):<5.5}", P["label"]),
            (f"{value:>8} " if not compact else f"{value:>7} ", P["stale"] if stale else P["value"]),
            (f"{unit:<5.5}" if not compact else f"{unit:<3.3}", P["unit"]))


@functools.lru_cache(maxsize=1024)
def _pair_line(left: tuple[str, str, str], right: tuple[str, str, str], stale: bool, compact: bool) -> Text:
    """A line of two pairs (:func:`_pair`).  Kept for the same words, as the board's lines are (a key
    leaves most of the numbers as they were printed): the Text is shared, so never modified."""
    return pieces("", " ", *_pair(*left, stale, compact), (" " if compact else "", None),
                  *_pair(*right, stale, compact))


def afloat_lines(vessel: Vessel, condition: Condition, result: Result | None, stale: bool, width: int = 54) -> list[Text]:
    """Displacement, deadweight, drafts, trim, list and deck-edge immersion angle; freeboard at
    midships and the margin to the load-line mark in use; that mark's allowed midships draft in
    the water she floats in (letters as on the hull, S W T F TF WNA) and the dock-water allowance
    applied to it; KG, θf, KG fluid, FSC, GM fluid, KM (two pairs a line; 'n/a' where the result
    has no value); the tables used (even keel, or the tables at trims the trim was interpolated
    between).  Lengths to the mm, angles to 0.1°.  ``stale`` (outside the tables: the numbers are the
    last good condition's): the title starts with LAST GOOD."""
    compact = width < 44
    # Outside the tables the numbers are the last good condition's: the mark comes first, short,
    # so that no width cuts it (at 80 columns "(last good, stale)" at the end read "(last …").
    title = Text(" LAST GOOD", P["caution"]).append(" Afloat", P["title"]) if stale else Text(" Afloat", P["title"])
    title.append(f"  ρ {condition.water_density_t_m3:.3f} t/m³", P["dim"])
    if result is None:
        return [title, Text(" no result: see the warning above", P["danger"])]
    r = result
    if not compact:
        rule = "IS2008" if r.fs_rule == "is2008" else "actual"
        title.append(f"  FS {rule} · GZ {'transfer' if r.gz_correction == 'transfer' else 'const'}", P["dim"])
    trim_word = "A" if r.trim_m > 0 else ("F" if r.trim_m < 0 else "")
    # below the last printed decimal (0.1°) she is upright: no side
    if r.list_deg is None:  # no position of equilibrium: no number (the danger warning says why)
        list_cell = ("List", "none", "GZ<0")
    else:
        list_word = "S" if r.list_deg >= 0.05 else ("P" if r.list_deg <= -0.05 else "")
        list_cell = ("List", f"{abs(r.list_deg):.1f}", f"° {list_word}")
    rows = [
        (("Δ", f"{r.displacement_t:.1f}", "t"), ("DWT", f"{r.deadweight_t:.1f}", "t")),
        (("T aft", f"{r.draft_aft_m:.3f}", "m"), ("T fwd", f"{r.draft_fwd_m:.3f}", "m")),
        (("T mid", f"{r.draft_mean_m:.3f}", "m"), ("Trim", f"{abs(r.trim_m):.3f}", f"m {trim_word}")),
        (list_cell, ("∠deck", opt(r.deck_edge_angle_deg, ".1f"), "°")),
        (("Fbd", opt(r.freeboard_m, ".3f"), "m"), ("Margin", opt(r.load_line_margin_m, "+.3f"), "m")),
        (("Mark", opt(r.load_line_allowed_draft_m, ".3f"), f"m {mark_letters(r.load_line_mark)}".strip()),
         ("DWA", opt(r.dock_water_allowance_m, "+.3f"), "m")),
        (("KG", f"{r.kg_m:.3f}", "m"), ("θf", *_flood_cell(r))),
        (("KG fl", f"{r.kg_fluid_m:.3f}", "m"), ("FSC", f"{r.fsc_m:.3f}", "m")),
        (("GM fl", f"{r.gm_fluid_m:.3f}", "m"), ("KM", f"{r.km_m:.3f}", "m")),
    ]
    out = [title]
    for left, right in rows:
        out.append(_pair_line(left, right, stale, compact))
    # which hydrostatic and KN tables: even keel, or at trims and between which
    out.append(_tables_line(tables_basis(vessel, r.trim_m).short))
    return out


@functools.lru_cache(maxsize=64)
def _tables_line(basis: str) -> Text:
    """' Tables even keel': which tables the numbers were read from (kept and shared, as :func:`_pair_line`)."""
    return Text(" Tables ", P["label"]) + Text(basis, P["dim"])


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


def gz_caption(result: Result | None, width: int | None = None) -> Text:
    """' GZ curve to port  θf 39.6°  max 0.407 m at 29.9°  zero at 55.9°', angles to 0.1°.  θf is
    given as a value (the plot only tags it on the axis); on a narrow panel the words that do not
    fit are left out, least needed first (the KN-end notes, the vanishing angle, "curve")."""
    t = Text(" GZ curve", P["title"])
    if result is None:
        return t
    side = f" to {result.criteria_side}"
    parts = [f"  max {result.max_gz_m:.3f} m at {result.max_gz_angle_deg:.1f}°"]
    if result.downflooding_angle_deg is not None:
        parts.insert(0, f"  θf {result.downflooding_angle_deg:.1f}°")
    zero = []
    if result.vanishing_angle_deg is not None:
        zero.append(f"  zero at {result.vanishing_angle_deg:.1f}°")
    elif never_positive(result):
        zero.append("  never positive")
    elif result.gz_end_deg < 90.0:
        zero.append(f"  zero beyond {result.gz_end_deg:g}° (KN end)")
    if result.vanishing_angle_deg is not None and result.gz_end_deg < 90.0:
        zero.append(f"  curve ends {result.gz_end_deg:g}° (KN end)")
    name = " GZ curve"
    while width is not None and zero and len(name + side + "".join(parts + zero)) > width:
        zero.pop()
    if width is not None and len(name + side + "".join(parts + zero)) > width:
        name = " GZ"
    if width is not None and len(name + side + "".join(parts + zero)) > width:
        parts[-1] = f"  max {result.max_gz_m:.3f} m"
    return pieces(P["title"], name, (side, P["title"]), *((p, P["dim"]) for p in parts + zero))


# --------------------------------------------------------------------------- warnings


@frozen
class Alert:
    """One line of the alert strip: a danger or a caution, in words."""

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
