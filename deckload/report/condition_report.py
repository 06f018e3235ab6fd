"""The printable loading-condition report: one A4 page, as plain text or HTML.

The report is drawn once with rich renderables into a recording console and
exported with rich's own ``export_text`` / ``export_html``; the GZ curve is an
inline SVG drawn here (:func:`gz_svg`) and placed beside the stability summary.
Nothing is recomputed: every number comes from the :class:`~deckload.core.result.Result`.

Contents: particulars; every weight item (lightship, tanks, holds, deck, constants)
with mass and centres; the free-surface table with the rule used for each tank; the
stability summary; the criteria table (value, limit, margin, pass); the GZ curve with
its 30°, 40° and θf marks; warnings; the caution; signature lines for the officer
and the master.

A4 fit (HTML, the printable form): the page is 297 mm high; with 10 mm margins
277 mm print.  The font size is the largest of :data:`FONT_SIZES_PT` whose line
count fits (line height = size × :data:`LINE_HEIGHT` × 0.3528 mm/pt);
:func:`html_fits_a4` says whether even the smallest does.  A condition with most
of its tanks slack can run onto a second page; ``deckload report`` then says so.
The text form is :data:`TEXT_WIDTH` columns, for terminals and plain printers.
"""

from __future__ import annotations

import html as htmllib
import io
import math

import numpy as np
from rich import box
from rich.console import Console, Group, RenderableType
from rich.table import Table
from rich.text import Text

from deckload.core.deadweight import deadweight_by_kind
from deckload.core.free_surface import EXEMPT_RULE, band_text, pct_text
from deckload.core.frozen import frozen
from deckload.report import verdict_format as vf
from deckload.core.model import Condition, Vessel
from deckload.core.result import Result
from deckload.core.trimmed_tables import tables_basis

CAUTION = (
    "CAUTION: deckload supports, and never replaces, the approved stability booklet, the master's "
    "judgement, and flag-State and classification society rules. Check this condition against the "
    "booklet before relying on it."
)

TEXT_WIDTH = 112
"""Characters per line of the text report and of the HTML report's text blocks."""

PAGE_HEIGHT_MM = 297.0
PAGE_WIDTH_MM = 210.0
PAGE_MARGIN_MM = 10.0
PT_MM = 25.4 / 72.0
LINE_HEIGHT = 1.2
"""CSS line-height of the report text (multiple of the font size)."""
CHAR_WIDTH_EM = 0.6
"""Advance of one monospace character (em): 0.6 for DejaVu Sans Mono / Liberation Mono."""
FONT_SIZES_PT = (7.5, 7.0, 6.5, 6.0)
SVG_WIDTH_MM = 78.0
SVG_HEIGHT_MM = 52.6
SIGNATURE_ROW_MM = 10.0
"""Height of each signature row in the HTML report: room for a handwritten signature."""
_COMPARISON = {">=": "≥", "<=": "≤"}
GROUP_TITLES = {"lightship": "Lightship", "hold": "Holds", "deck": "Deck", "constant": "Constants"}


# --------------------------------------------------------------------------- formatting


def _f(x: float | None, digits: int = 3) -> str:
    if x is None or (isinstance(x, float) and not math.isfinite(x)):
        return "—"
    return f"{x:.{digits}f}"


def _side(deg: float | None) -> str:
    """'0.2° port': angles to 0.1°; below that, upright; None: no position of equilibrium."""
    if deg is None:
        return vf.NO_EQUILIBRIUM
    if abs(deg) < 0.05:
        return "upright"
    return f"{abs(deg):.1f}° {'stbd' if deg > 0 else 'port'}"


def _row(table: Table, *cells) -> None:
    """Add a row; plain strings (names typed by users) become Text, so '[' is never markup."""
    table.add_row(*(Text(c) if isinstance(c, str) else c for c in cells))


def _trim(t: float) -> str:
    if abs(t) < 0.0005:
        return "even keel"
    return f"{abs(t):.3f} m {'by the stern' if t > 0 else 'by the head'}"


def _criteria_gz(result: Result) -> tuple[float, ...]:
    """The GZ curve the criteria were checked on (the side she lists to)."""
    return result.gz_port_m if result.criteria_side == "port" else result.gz_m


# --------------------------------------------------------------------------- sections


def _header(result: Result, vessel: Vessel, condition: Condition, stamp: str | None, source: str | None) -> Group:
    p = vessel.particulars
    t = Text()
    t.append("LOADING CONDITION AND INTACT STABILITY", style="bold")
    t.append(f" — {p.name}\n", style="bold")
    t.append(f"Condition: {result.condition_name}", style="bold")
    if condition.remark:
        t.append(f" — {condition.remark}")
    t.append("\n")
    if condition.modified_from:
        t.append(f"Modified from: {condition.modified_from} (edited on the loading screen, not saved under a name)\n")
    dims = (
        f"LBP {p.lbp_m:.2f} m, breadth {p.breadth_m:.2f} m, depth {p.depth_m:.2f} m, "
        f"design draft {p.design_draft_m:.3f} m"
    )
    t.append(f"Particulars: {p.vessel_type + '; ' if p.vessel_type else ''}{dims}\n")
    fs = {"is2008": "IS Code 2008 Part B 3.1", "actual": "actual levels"}.get(result.fs_rule, result.fs_rule)
    gzc = {
        "constant": "constant (G raised by ΣFSM/Δ)",
        "transfer": "actual moment of fluid transfer at each heel",
    }.get(result.gz_correction, result.gz_correction)
    t.append(
        f"Water density {result.water_density_t_m3:.3f} t/m³ (tables at {p.table_density_t_m3:.3f} t/m³); "
        f"load line: {condition.load_line}\n"
    )
    t.append(f"Free surface: {fs}; GZ correction: {gzc}\n")
    t.append(f"Tables: {tables_basis(vessel, result.trim_m).words}\n")
    # What the profile assumed where its booklet gave less than the model needs (said plainly).
    said = list(vessel.assumptions)
    if result.gz_end_deg < 90.0:
        said.append(f"KN tables end at {result.gz_end_deg:g}°: the GZ curve and its areas stop there")
    if said:
        t.append("Assumed from the profile: " + "; ".join(said) + "\n")
    where = []
    if stamp:
        where.append(f"Computed {stamp}")
    if source:
        where.append(f"Condition file {source}")
    if where:
        joined = "; ".join(where)
        t.append((joined if len(joined) <= TEXT_WIDTH else "\n".join(where)) + "\n")
    return Group(t)


def _summary(result: Result, vessel: Vessel) -> Table:
    r = result
    keel = vessel.particulars.keel_thickness_m
    g = Table(box=None, pad_edge=False, padding=(0, 1), title="Stability summary",
              title_justify="left", title_style="bold", show_header=False)
    g.add_column("quantity")
    g.add_column("value", justify="right")
    rows = [
        ("Displacement Δ", f"{r.displacement_t:.1f} t"),
        ("Deadweight", f"{r.deadweight_t:.1f} t"),
        ("LCG from AP", f"{r.lcg_m:.3f} m"),
        ("TCG", f"{r.tcg_m:+.3f} m"),
        ("KG solid", f"{r.kg_m:.3f} m"),
        ("ΣFSM", f"{r.fsm_total_tm:.1f} t·m"),
        ("FSC = ΣFSM/Δ", f"{r.fsc_m:.3f} m"),
        ("KG fluid", f"{r.kg_fluid_m:.3f} m"),
        ("KMt", f"{r.km_m:.3f} m"),
        ("GM solid", f"{r.gm_solid_m:.3f} m"),
        ("GM fluid", f"{r.gm_fluid_m:.3f} m"),
        ("Draft aft / mid / fwd", f"{r.draft_aft_m:.3f} / {r.draft_mean_m:.3f} / {r.draft_fwd_m:.3f} m"),
        # What the draft marks read (moulded + keel thickness); equal to the above when the keel is nil.
        (f"Extreme, keel {keel:.3f} m",
         f"{r.draft_aft_m + keel:.3f} / {r.draft_mean_m + keel:.3f} / {r.draft_fwd_m + keel:.3f} m"),
        ("Trim", _trim(r.trim_m)),
        ("List", _side(r.list_deg)),
        ("LCB / LCF from AP", f"{r.lcb_m:.3f} / {r.lcf_m:.3f} m"),
        ("TPC / MCTC", f"{r.tpc_t_cm:.2f} t/cm / {r.mctc_tm_cm:.2f} t·m/cm"),
        ("Max GZ", f"{r.max_gz_m:.3f} m at {r.max_gz_angle_deg:.1f}°"),
        ("Vanishing angle", vf.vanishing_words(r) + (" (the KN tables end there)" if r.vanishing_angle_deg is None
                                                     and r.gz_end_deg < 90 and not vf.never_positive(r) else "")),
        ("Downflooding θf", vf.flood_words(r)),
        ("Deck edge immersion", vf.fmt_optional(r.deck_edge_angle_deg, ".1f", "°")),
        ("Freeboard at midships", vf.fmt_optional(r.freeboard_m, ".3f", " m")),
        *_load_line_rows(r),
    ]
    for k, v in rows:
        _row(g, k, v)
    return g


def _load_line_rows(r: Result) -> list[tuple[str, str]]:
    """The mark in use, the dock-water allowance applied to it, the draft it allows in this water,
    and the margin of the midships draft below it (negative: over the mark)."""
    if r.load_line_mark is None:
        return [("Load line", "no marks in the profile")]
    return [
        ("Load line mark in use", f"{r.load_line_mark} {r.load_line_mark_draft_m:.3f} m"),
        (f"Dock-water allowance at ρ {r.water_density_t_m3:.3f}", vf.fmt_optional(r.dock_water_allowance_m, "+.3f", " m")),
        ("Allowed midships draft", vf.fmt_optional(r.load_line_allowed_draft_m, ".3f", " m")),
        ("Margin to the mark", vf.fmt_optional(r.load_line_margin_m, "+.3f", " m")),
    ]


def _deadweight(result: Result) -> Table:
    """The deadweight by kind, one column each, adding up to Δ − lightship."""
    t = Table(box=box.SIMPLE, show_edge=False, pad_edge=False, padding=(0, 1), title_justify="left",
              title_style="bold", title="Deadweight by kind (t)", caption_justify="left",
              caption=f"Cargo = holds, deck loads and liquid cargo.  Deadweight = Δ {result.displacement_t:.2f} − "
                      f"lightship {result.lightship_t:.2f} t.")
    lines = deadweight_by_kind(result)
    for d in lines:
        t.add_column(d.title, justify="right")
    t.add_column("Deadweight", justify="right")
    _row(t, *(f"{d.mass_t:.2f}" for d in lines), f"{result.deadweight_t:.2f}")
    return t


def _items(result: Result, condition: Condition) -> Table:
    t = Table(box=box.SIMPLE, show_edge=False, pad_edge=False, padding=(0, 1), title="Weights and centres",
              title_justify="left", title_style="bold", show_footer=True)
    t.add_column("Group", footer="Displacement")
    t.add_column("Item")
    t.add_column("Fill %", justify="right")
    t.add_column("Mass t", justify="right", footer=f"{result.displacement_t:.2f}")
    t.add_column("LCG m", justify="right", footer=f"{result.lcg_m:.3f}")
    t.add_column("VCG m", justify="right", footer=f"{result.kg_m:.3f}")
    t.add_column("TCG m", justify="right", footer=f"{result.tcg_m:+.3f}")
    t.add_column("ρ t/m³", justify="right")
    descr = {h.hold_id: h.description for h in condition.holds}
    stated = {f.tank_id for f in condition.tanks if f.density_t_m3 is not None}
    for it in result.items:
        if it.group == "lightship":
            _row(t, GROUP_TITLES["lightship"], it.name, "", f"{it.mass_t:.2f}", f"{it.lcg_m:.3f}",
                      f"{it.vcg_m:.3f}", f"{it.tcg_m:+.3f}", "")
    empty = []
    for tk in result.tanks:
        if tk.state == "empty" and tk.mass_t == 0:
            empty.append(tk.id)
            continue
        _row(t, "Tank", f"{tk.id} {tk.name}", f"{tk.fill_pct:.1f}", f"{tk.mass_t:.2f}", f"{tk.lcg_m:.3f}",
                  f"{tk.vcg_m:.3f}", f"{tk.tcg_m:+.3f}", f"{tk.density_t_m3:.3f}" + (vf.STATED_DENSITY_MARK if tk.id in stated else " "))
    if empty:
        _row(t, "Tank", "empty: " + ", ".join(empty), "0.0", "0.00", "", "", "", "")
    for group in ("hold", "deck", "constant"):
        for it in result.items:
            if it.group != group:
                continue
            name = it.name if it.group != "hold" else f"{it.id} {it.name}"
            if it.group == "hold" and descr.get(it.id) and descr[it.id] not in name:
                name += f" ({descr[it.id]})"
            _row(t, GROUP_TITLES[group], name, "", f"{it.mass_t:.2f}", f"{it.lcg_m:.3f}", f"{it.vcg_m:.3f}",
                      f"{it.tcg_m:+.3f}", "")
    if stated & {tk.id for tk in result.tanks if not (tk.state == "empty" and tk.mass_t == 0)}:
        t.caption = f"{vf.STATED_DENSITY_MARK} density stated for this condition (bunker delivery note), not the tank's default"
        t.caption_justify = "left"
    return t


def _free_surface(result: Result) -> Table:
    t = Table(box=box.SIMPLE, show_edge=False, pad_edge=False, padding=(0, 1), title="Free surface",
              title_justify="left", title_style="bold", show_footer=True)
    t.add_column("Tank", footer="ΣFSM")
    t.add_column("Fill %", justify="right")
    t.add_column("State")
    t.add_column("ρ t/m³", justify="right")
    t.add_column("FSM t·m", justify="right", footer=f"{result.fsm_total_tm:.2f}")
    t.add_column("Rule used", footer=f"FSC = ΣFSM/Δ = {result.fsc_m:.3f} m")
    # Tanks whose FSM counts are listed one by one; tanks left at zero are grouped by the
    # rule that left them there, so that a full condition still fits one page.
    zero: dict[str, list[str]] = {}
    for tk in result.tanks:
        if tk.fsm_tm == 0 and tk.fs_rule == EXEMPT_RULE:
            # Exempt, not free of free surface: its moment at the actual level is printed, not counted.
            _row(t, tk.id, f"{tk.fill_pct:.1f}", tk.state.replace("_", " "), f"{tk.density_t_m3:.3f}", "0.00",
                 f"small tank exempt (IS 2008 B 3.1.12); {tk.fsi_m4 * tk.density_t_m3:.2f} at level, uncounted")
            continue
        if tk.fsm_tm == 0:
            zero.setdefault("empty" if tk.state == "empty" else tk.fs_rule, []).append(tk.id)
            continue
        _row(t, tk.id, f"{tk.fill_pct:.1f}", tk.state.replace("_", " "), f"{tk.density_t_m3:.3f}",
                  f"{tk.fsm_tm:.2f}", tk.fs_rule)
    for rule, ids in zero.items():
        _row(t, "—", "", "", "", "0.00", f"{rule}: {', '.join(ids)}")
    return t


def _criteria(result: Result) -> Table:
    """Every criterion, grouped by the set it belongs to (a heading row per set with its outcome);
    a criterion the data cannot decide reads 'not assessable', never 'pass'."""
    t = Table(box=box.SIMPLE, show_edge=False, pad_edge=False, padding=(0, 1), title_justify="left", title_style="bold",
              title=f"Intact stability criteria by set (GZ heeling to {result.criteria_side}; paragraphs of "
                    f"IS Code 2008 unless named)")
    t.add_column("Criterion")  # the one column that wraps when the others need the room
    t.add_column("Value", justify="right", no_wrap=True)
    t.add_column("Limit", justify="right", no_wrap=True)
    t.add_column("Margin", justify="right", no_wrap=True)
    t.add_column("Unit", no_wrap=True)
    t.add_column("Result", no_wrap=True)
    t.add_column("Paragraph", no_wrap=True)
    for g in vf.grouped(result):
        head = Text(f"{vf.set_title(g.set.title)}: ", style="bold")
        head.append(g.word, style="bold red" if g.word == "NOT MET" else "bold")
        _row(t, head, "", "", "", "", "", "")
        for c in g.criteria:
            d = vf.digits_of(c)
            if c.assessed:
                verdict = Text("pass", style="green") if c.passed else Text("FAIL", style="bold red")
            else:
                verdict = Text(vf.NOT_ASSESSABLE, style="bold")
            _row(
                t,
                c.description + (" *" if c.note else ""),
                vf.value_text(c),
                f"{_COMPARISON.get(c.comparison, c.comparison)} {_f(c.limit, d)}",
                vf.margin_text(c),
                c.unit,
                verdict,
                vf.paragraph(c, short=True) + ("" if vf.paragraph(c, short=True) == vf.paragraph(c) else "†"),
            )
    return t


def _paragraphs_in_full(result: Result) -> list[str]:
    """Each paragraph the criteria table shortened ('B 2.1 †'), once, in full: the column is
    too narrow for a remark such as '(from memory: Part A 2.2.1–2.2.3 applied, GM0 0.35 m)',
    which it would cut or break word by word."""
    out: list[str] = []
    for c in result.criteria:
        full = vf.paragraph(c)
        if full != vf.paragraph(c, short=True) and full not in out:
            out.append(full)
    return out


def _weather(result: Result) -> Table | None:
    """The numbers behind the weather criterion (IS Code 2008 Part A 2.3), as the Result holds them."""
    w = result.weather
    if w is None:
        return None
    t = Table(box=None, pad_edge=False, padding=(0, 1), show_header=False, title_justify="left", title_style="bold",
              title="Severe wind and rolling (IS Code 2008 Part A 2.3)")
    t.add_column("quantity")
    t.add_column("value", justify="right")
    rows = [
        ("Wind pressure P", f"{w.wind_pressure_pa:.0f} Pa"),
        ("Windage area A / lever Z", f"{w.windage_area_m2:.1f} m² / {w.windage_lever_m:.3f} m"),
        ("Steady wind lever lw1", f"{w.lw1_m:.4f} m"),
        ("Gust lever lw2 = 1.5·lw1", f"{w.lw2_m:.4f} m"),
        ("θ0 (limit)", f"{w.theta0_deg:.1f}° (≤ {w.theta0_limit_deg:.1f}°)"),
        ("Roll θ1 = 109·k·X1·X2·√(r·s)", f"{w.theta1_deg:.1f}°"),
        ("k, X1, X2, r, s", f"{w.k:.3f}, {w.x1:.3f}, {w.x2:.3f}, {w.r:.3f}, {w.s:.4f}"),
        ("Roll period T", f"{w.roll_period_s:.2f} s"),
        ("θ2 = min(θf, 50°, θc)", f"{w.theta2_deg:.1f}°"
         + ("" if w.theta_c_deg is None else f" (θc {w.theta_c_deg:.1f}°)")),
        ("Area a / area b", f"{w.area_a_mrad:.4f} / {w.area_b_mrad:.4f} m·rad"),
    ]
    for k, v in rows:
        _row(t, k, v)
    return t


def _gz_table(result: Result) -> Table:
    """GZ at each tabulated 10° step (every angle when the curve has no 10° steps), for the text report."""
    gz = _criteria_gz(result)
    pairs = [(h, g) for h, g in zip(result.gz_heel_deg, gz) if abs(h / 10.0 - round(h / 10.0)) < 1e-9]
    if len(pairs) < 2:
        pairs = list(zip(result.gz_heel_deg, gz))
    t = Table(box=box.SIMPLE, show_edge=False, pad_edge=False, padding=(0, 1), title_justify="left",
              title_style="bold", title=f"GZ, heeling {'port' if result.criteria_side == 'port' else 'stbd'}")
    t.add_column("Heel °", justify="right")
    t.add_column("GZ m", justify="right")
    t.add_column("")
    marks = {30.0: "30°", 40.0: "40°"}
    for h, g in pairs:
        note = marks.get(h, "")
        if result.downflooding_angle_deg is not None and abs(h - result.downflooding_angle_deg) < 5.0:
            note = (note + f" θf {result.downflooding_angle_deg:.1f}°").strip()
        _row(t, f"{h:.0f}", f"{g:.3f}", note)
    return t


def _closing(result: Result, doubts: tuple[str, ...] = ()) -> Group:
    t = Text()
    full = _paragraphs_in_full(result)
    if full:
        t.append("† in full: " + "; ".join(full) + "\n")
    for c in result.criteria:
        if c.note:
            t.append(f"* {c.description}: {c.note}\n")
    if result.warnings:
        t.append("Warnings\n", style="bold")
        worst = [w for w in result.warnings if w.code == "slack-worst-band"]
        for w in result.warnings:
            if len(worst) > 2 and w.code == "slack-worst-band":
                if w is worst[0]:
                    tanks = ", ".join(f"{tk.id} {pct_text(tk.fill_pct)} % ({band_text(tk.worst_band_pct)})"
                                      for tk in result.tanks if tk.state == "worst_band")
                    t.append(f"  caution: slack in the worst free-surface band: {tanks}\n")
                continue
            t.append(f"  {'DANGER' if w.severity == 'danger' else 'caution'}: {w.message}\n",
                     style="red" if w.severity == "danger" else "")
    for line in vf.doubts_block(doubts, TEXT_WIDTH - 2, indent=""):
        t.append(line + "\n", style="bold" if not line.startswith(" ") else "")
    failed = vf.failed(result)
    t.append("Verdict: " + result.verdict_text(), style="bold red" if failed else "bold")
    if failed:
        t.append(" Failed: " + ", ".join(c.description for c in failed) + ".", style="bold red")
    sm = min((c for c in result.criteria if c.assessed), key=lambda c: c.margin_fraction, default=None)
    if sm is not None:
        t.append(f" Smallest margin: {sm.description}, {sm.margin:+.{vf.digits_of(sm)}f} {sm.unit}.")
    t.append("\n\n" + CAUTION, style="bold")
    return Group(t)


SIGNATORIES = ("Officer", "Master")


def _direct(cmp) -> Table:
    """The direct calculation from the hull beside the tables' figures (``report --direct``), each row
    with its UR L5 / Circ.1229 tolerance and mark, and how many rows are beyond it."""
    from deckload.report import direct_format as df

    notes = [f"* {row.quantity}: {row.note}" for row in cmp.rows if row.note]
    caption = "\n".join([*notes, df.legend(cmp), ("!! " if cmp.beyond else "") + cmp.summary(),
                         "The criteria are judged on the tables."])
    t = Table(title="Second method, from the hull itself (free trim and heel, actual G)",
              caption=caption, title_justify="left", caption_justify="left",
              box=None, padding=(0, 1))
    for head, just in (("", "left"), ("tables", "right"), ("direct", "right"), ("difference", "right"), ("", "left"),
                       ("tolerance", "right"), ("", "left")):
        t.add_column(head, justify=just)
    for row in cmp.rows:
        a, b, diff, allowed, mark = df.cells(row)
        name = row.quantity + (" *" if row.note else "")
        t.add_row(name, a, b, diff, row.unit, allowed, mark, style="bold red" if row.within_tolerance is False else None)
    return t


def _signatures_text() -> Text:
    line = "_" * 28
    t = Text()
    for who in SIGNATORIES:
        t.append(f"\n{who + ':':<9} {line}  Name: {'_' * 20}  Date/time: {'_' * 16}\n")
    return t


def signatures_html() -> str:
    rows = "".join(
        f'<div class="sig"><span class="who">{who}:</span><span class="line sign"></span>'
        f'<span class="who">Name:</span><span class="line name"></span>'
        f'<span class="who">Date/time:</span><span class="line when"></span></div>'
        for who in SIGNATORIES
    )
    return f'<div class="signatures">{rows}</div>'


@frozen
class _Parts:
    header: RenderableType
    summary: RenderableType
    body: tuple[RenderableType, ...]
    closing: RenderableType
    weather: RenderableType | None
    """The weather criterion's numbers, beside its diagram (None when it was not assessed)."""


def _parts(result: Result, vessel: Vessel, condition: Condition, stamp: str | None, source: str | None,
           comparison=None, doubts: tuple[str, ...] = ()) -> _Parts:
    body = (_items(result, condition), _deadweight(result), _free_surface(result), _criteria(result))
    if comparison is not None:
        body += (_direct(comparison),)
    return _Parts(
        header=_header(result, vessel, condition, stamp, source),
        summary=_summary(result, vessel),
        body=body,
        closing=_closing(result, doubts),
        weather=_weather(result),
    )


def _console(width: int = TEXT_WIDTH) -> Console:
    return Console(record=True, width=width, file=io.StringIO(), color_system="truecolor",
                   force_terminal=False, legacy_windows=False, emoji=False, highlight=False)


# --------------------------------------------------------------------------- text


def render_report_text(
    result: Result, vessel: Vessel, condition: Condition, *, stamp: str | None = None, source: str | None = None,
    comparison=None, doubts: tuple[str, ...] = (),
) -> str:
    """The report as plain text, :data:`TEXT_WIDTH` characters wide; with ``comparison``
    (:func:`deckload.core.equilibrium.compare`) the direct calculation is printed beside the tables;
    ``doubts``: the profile's plausibility-audit warnings, printed before the verdict."""
    p = _parts(result, vessel, condition, stamp, source, comparison, doubts)
    con = _console()
    con.print(p.header)
    side = Table.grid(padding=(0, 6))
    side.add_row(p.summary, _gz_table(result))
    con.print(side)
    con.print()
    for b in p.body:
        con.print(b)
        con.print()
    if p.weather is not None:
        con.print(p.weather)
        con.print()
    con.print(p.closing)
    con.print(_signatures_text())
    return con.export_text(styles=False)


# --------------------------------------------------------------------------- GZ as SVG


def _nice_step(span: float, target: int = 5) -> float:
    raw = span / max(target, 1)
    mag = 10 ** math.floor(math.log10(raw)) if raw > 0 else 1.0
    for k in (1.0, 2.0, 2.5, 5.0, 10.0):
        if raw <= k * mag:
            return k * mag
    return 10.0 * mag


@frozen
class SvgFrame:
    """Plot area and scales of the GZ drawing (SVG user units)."""

    left: float
    top: float
    width: float
    height: float
    x_max_deg: float
    y_min_m: float
    y_max_m: float

    def x(self, heel_deg: float) -> float:
        return self.left + heel_deg / self.x_max_deg * self.width

    def y(self, gz_m: float) -> float:
        return self.top + (self.y_max_m - gz_m) / (self.y_max_m - self.y_min_m) * self.height


def gz_svg(result: Result, width: float = 344.0, height: float = 232.0) -> str:
    """The GZ curve as an inline SVG: polyline, axes with ticks, 30°/40°/θf marks, GM slope.

    Drawn for the side the criteria were checked on.  The GM slope line runs from the
    origin towards (1 rad = 57.3°, GM fluid), cut at the top of the frame: the GZ
    curve's tangent at the origin when the correction is constant (GZ ≈ GM·φ for
    small φ — common practice on GZ plots).
    """
    heel = list(result.gz_heel_deg)
    gz = list(_criteria_gz(result))
    x_max = max(heel) if heel and max(heel) > 0 else 90.0
    lo = min(0.0, min(gz, default=0.0))
    hi = max(0.0, max(gz, default=0.0))
    if hi - lo <= 0:
        hi = lo + 0.1
    step = _nice_step(hi - lo)
    y_min = math.floor(lo / step - 1e-9) * step
    y_max = math.ceil(hi / step + 1e-9) * step
    fr = SvgFrame(left=40.0, top=14.0, width=width - 52.0, height=height - 40.0, x_max_deg=x_max,
                  y_min_m=y_min, y_max_m=y_max)
    out: list[str] = []
    a = out.append
    a(f'<svg xmlns="http://www.w3.org/2000/svg" class="gz" viewBox="0 0 {width:g} {height:g}" '
      f'width="{SVG_WIDTH_MM}mm" height="{SVG_HEIGHT_MM}mm" font-family="sans-serif" font-size="9">')
    a(f'<title>GZ curve, heeling to {result.criteria_side}</title>')
    a(f'<text x="{fr.left:g}" y="9" font-weight="bold">GZ (m) against heel, heeling to '
      f'{htmllib.escape(result.criteria_side)}</text>')
    # grid and ticks
    x_step = 10.0 if x_max > 30 else 5.0
    k = 0
    while k * x_step <= x_max + 1e-9:
        h = k * x_step
        X = fr.x(h)
        a(f'<line x1="{X:.2f}" y1="{fr.top:.2f}" x2="{X:.2f}" y2="{fr.top + fr.height:.2f}" stroke="#ddd" '
          f'stroke-width="0.5"/>')
        a(f'<text class="xt" x="{X:.2f}" y="{fr.top + fr.height + 10:.2f}" text-anchor="middle">{h:g}°</text>')
        k += 1
    n = round((y_max - y_min) / step)
    for j in range(n + 1):
        v = round(y_min + j * step, 9) + 0.0  # no '-0.00' from round-off
        Y = fr.y(v)
        a(f'<line x1="{fr.left:.2f}" y1="{Y:.2f}" x2="{fr.left + fr.width:.2f}" y2="{Y:.2f}" stroke="#ddd" '
          f'stroke-width="0.5"/>')
        a(f'<text class="yt" x="{fr.left - 3:.2f}" y="{Y:.2f}" text-anchor="end" dominant-baseline="middle">'
          f'{v:.2f}</text>')
    # axes
    a(f'<line x1="{fr.left:.2f}" y1="{fr.top:.2f}" x2="{fr.left:.2f}" y2="{fr.top + fr.height:.2f}" '
      f'stroke="#000" stroke-width="0.8"/>')
    a(f'<line class="axis0" x1="{fr.left:.2f}" y1="{fr.y(0.0):.2f}" x2="{fr.left + fr.width:.2f}" '
      f'y2="{fr.y(0.0):.2f}" stroke="#000" stroke-width="0.8"/>')
    # angle marks: the tick labels name 30° and 40°; θf is named in the key below the axis
    marks = [(30.0, "#555"), (40.0, "#555")]
    if result.downflooding_angle_deg is not None:
        marks.append((result.downflooding_angle_deg, "#c00"))
    for ang, colour in marks:
        if 0 <= ang <= x_max:
            X = fr.x(ang)
            a(f'<line class="mark" data-angle-deg="{ang:g}" x1="{X:.2f}" y1="{fr.top:.2f}" x2="{X:.2f}" '
              f'y2="{fr.top + fr.height:.2f}" stroke="{colour}" stroke-width="0.9" stroke-dasharray="3 2"/>')
    key_y = fr.top + fr.height + 22
    key = []
    # GM slope: from the origin towards (57.3°, GM), cut at the top of the frame
    gm = result.gm_fluid_m
    if gm > 0:
        end_deg = min(math.degrees(1.0), math.degrees(y_max / gm), x_max)
        end_gz = gm * math.radians(end_deg)
        a(f'<line class="gm" x1="{fr.x(0):.2f}" y1="{fr.y(0):.2f}" x2="{fr.x(end_deg):.2f}" '
          f'y2="{fr.y(end_gz):.2f}" stroke="#07a" stroke-width="0.7" stroke-dasharray="1 2"/>')
        key.append(("#07a", f"··· GM {gm:.3f} m"))
    if result.downflooding_angle_deg is not None:
        key.append(("#c00", f"┆ θf {result.downflooding_angle_deg:.1f}°"))
    x_key = fr.left
    for colour, label in key:
        a(f'<text x="{x_key:.2f}" y="{key_y:.2f}" fill="{colour}">{htmllib.escape(label)}</text>')
        x_key += 6.0 * len(label) + 10.0
    pts = " ".join(f"{fr.x(h):.3f},{fr.y(g):.3f}" for h, g in zip(heel, gz))
    a(f'<polyline class="gz-curve" points="{pts}" fill="none" stroke="#000" stroke-width="1.4"/>')
    if heel:
        a(f'<circle cx="{fr.x(result.max_gz_angle_deg):.2f}" cy="{fr.y(result.max_gz_m):.2f}" r="2"/>')
        a(f'<text x="{x_key:.2f}" y="{key_y:.2f}">● max GZ {result.max_gz_m:.3f} m at '
          f'{result.max_gz_angle_deg:.1f}°</text>')
    a("</svg>")
    return "\n".join(out)


def weather_curve(result: Result) -> tuple[list[float], list[float]]:
    """The GZ curve from rolled to windward (negative angles) to heeled to leeward, as drawn for
    the weather criterion: leeward is the side the criteria were checked on; heeled to windward
    by φ the lever is −GZ(φ) of the other side (a sign change, nothing recomputed)."""
    lee = list(_criteria_gz(result))
    wind = list(result.gz_m if result.criteria_side == "port" else result.gz_port_m)
    heel = [-h for h in reversed(result.gz_heel_deg[1:])] + list(result.gz_heel_deg)
    return heel, [-g for g in reversed(wind[1:])] + lee


def weather_svg(result: Result, width: float = 344.0, height: float = 232.0) -> str | None:
    """The weather criterion (IS Code 2008 Part A 2.3) as an inline SVG, or None when not assessed.

    GZ from θ0 − θ1 (rolled to windward) to past θ2; the steady and gust wind levers lw1 and
    lw2 as horizontal lines; θ0, θ1 (drawn at θ0 − θ1) and θ2 as marks; area a (lw2 above
    the curve, to windward) and area b (the curve above lw2, up to θ2) shaded.  The areas
    are one polygon between the curve and lw2, clipped above and below the lw2 line.
    """
    w = result.weather
    if w is None:
        return None
    heel, gz = weather_curve(result)
    roll_to = w.theta0_deg - w.theta1_deg
    x_lo = min(roll_to, 0.0) - 5.0
    x_hi = min(result.gz_end_deg, max(w.theta2_deg, w.theta_c_deg or 0.0) + 10.0)
    pts = [(h, g) for h, g in zip(heel, gz) if x_lo <= h <= x_hi]
    lo = min(0.0, min(g for _, g in pts))
    hi = max(w.lw2_m, max(g for _, g in pts))
    step = _nice_step(hi - lo)
    y_min = math.floor(lo / step - 1e-9) * step
    y_max = math.ceil(hi / step + 1e-9) * step
    x_step = 10.0
    x_min = math.floor(x_lo / x_step) * x_step
    fr = SvgFrame(left=40.0, top=14.0, width=width - 52.0, height=height - 40.0, x_max_deg=1.0,
                  y_min_m=y_min, y_max_m=y_max)

    def X(h: float) -> float:
        return fr.left + (h - x_min) / (x_hi - x_min) * fr.width

    out: list[str] = []
    a = out.append
    a(f'<svg xmlns="http://www.w3.org/2000/svg" class="weather" viewBox="0 0 {width:g} {height:g}" '
      f'width="{SVG_WIDTH_MM}mm" height="{SVG_HEIGHT_MM}mm" font-family="sans-serif" font-size="9">')
    a("<title>Weather criterion: GZ, wind heeling levers lw1 and lw2, areas a and b</title>")
    a(f'<text x="{fr.left:g}" y="9" font-weight="bold">Severe wind and rolling (IS 2008 A 2.3), GZ (m)</text>')
    k = 0
    while x_min + k * x_step <= x_hi + 1e-9:
        h = x_min + k * x_step
        a(f'<line x1="{X(h):.2f}" y1="{fr.top:.2f}" x2="{X(h):.2f}" y2="{fr.top + fr.height:.2f}" stroke="#ddd" '
          f'stroke-width="0.5"/>')
        a(f'<text class="xt" x="{X(h):.2f}" y="{fr.top + fr.height + 10:.2f}" text-anchor="middle">{h:g}°</text>')
        k += 1
    for j in range(round((y_max - y_min) / step) + 1):
        v = round(y_min + j * step, 9) + 0.0
        a(f'<line x1="{fr.left:.2f}" y1="{fr.y(v):.2f}" x2="{fr.left + fr.width:.2f}" y2="{fr.y(v):.2f}" '
          f'stroke="#ddd" stroke-width="0.5"/>')
        a(f'<text class="yt" x="{fr.left - 3:.2f}" y="{fr.y(v):.2f}" text-anchor="end" dominant-baseline="middle">'
          f'{v:.2f}</text>')
    a(f'<line x1="{fr.left:.2f}" y1="{fr.y(0.0):.2f}" x2="{fr.left + fr.width:.2f}" y2="{fr.y(0.0):.2f}" '
      f'stroke="#000" stroke-width="0.8"/>')
    # areas a and b: one polygon between the curve and lw2 from θ0 − θ1 to θ2, clipped at lw2
    y2 = fr.y(w.lw2_m)
    span = [(roll_to, float(np.interp(roll_to, heel, gz)))] + [(h, g) for h, g in zip(heel, gz)
                                                                if roll_to < h < w.theta2_deg]
    span.append((w.theta2_deg, float(np.interp(w.theta2_deg, heel, gz))))
    poly = " ".join(f"{X(h):.3f},{fr.y(g):.3f}" for h, g in span)
    poly += f" {X(w.theta2_deg):.3f},{y2:.3f} {X(roll_to):.3f},{y2:.3f}"
    a(f'<clipPath id="wx-above"><rect x="0" y="0" width="{width:g}" height="{y2:.3f}"/></clipPath>')
    a(f'<clipPath id="wx-below"><rect x="0" y="{y2:.3f}" width="{width:g}" height="{height - y2:.3f}"/></clipPath>')
    a(f'<polygon class="area-a" points="{poly}" fill="#e8a0a0" fill-opacity="0.6" clip-path="url(#wx-below)"/>')
    a(f'<polygon class="area-b" points="{poly}" fill="#9fc8a8" fill-opacity="0.6" clip-path="url(#wx-above)"/>')
    # the areas' letters, halfway between lw2 and the curve in the middle of each area
    split = w.theta_r_deg if getattr(w, "theta_r_deg", None) is not None else w.theta0_deg
    for name, ang in (("a", (roll_to + split) / 2), ("b", (split + w.theta2_deg) / 2)):
        mid = (float(np.interp(ang, heel, gz)) + w.lw2_m) / 2
        a(f'<text class="label-{name}" x="{X(ang):.2f}" y="{fr.y(mid):.2f}" text-anchor="middle" '
          f'dominant-baseline="middle" font-weight="bold" font-style="italic">{name}</text>')
    for cls, v, label, dash in (("lw1", w.lw1_m, "lw1", ""), ("lw2", w.lw2_m, "lw2", ' stroke-dasharray="4 2"')):
        a(f'<line class="{cls}" data-lever-m="{v:.6g}" x1="{fr.left:.2f}" y1="{fr.y(v):.2f}" '
          f'x2="{fr.left + fr.width:.2f}" y2="{fr.y(v):.2f}" stroke="#a05a00" stroke-width="0.8"{dash}/>')
        a(f'<text x="{fr.left + fr.width + 1:.2f}" y="{fr.y(v) + (3 if cls == "lw1" else -1):.2f}" '
          f'fill="#a05a00" font-size="7">{label}</text>')
    for ang, label in ((w.theta0_deg, "θ0"), (roll_to, "θ1"), (w.theta2_deg, "θ2")):
        a(f'<line class="mark" data-angle-deg="{ang:.6g}" x1="{X(ang):.2f}" y1="{fr.top:.2f}" x2="{X(ang):.2f}" '
          f'y2="{fr.top + fr.height:.2f}" stroke="#555" stroke-width="0.9" stroke-dasharray="3 2"/>')
        a(f'<text x="{X(ang) + 2:.2f}" y="{fr.top + 8:.2f}" fill="#555">{label}</text>')
    pts_s = " ".join(f"{X(h):.3f},{fr.y(g):.3f}" for h, g in pts)
    a(f'<polyline class="gz-curve" points="{pts_s}" fill="none" stroke="#000" stroke-width="1.4"/>')
    key_y = fr.top + fr.height + 22
    a(f'<text x="{fr.left:.2f}" y="{key_y:.2f}">a {w.area_a_mrad:.4f}  b {w.area_b_mrad:.4f} m·rad;  '
      f'θ0 {w.theta0_deg:.1f}°  θ1 {w.theta1_deg:.1f}°  θ2 {w.theta2_deg:.1f}°</text>')
    a("</svg>")
    return "\n".join(out)


# --------------------------------------------------------------------------- HTML


def _export(renderable: RenderableType, width: int) -> tuple[str, int]:
    """One block as HTML (inline styles, no page around it) and its line count."""
    con = _console(width)
    con.print(renderable)
    text = con.export_text(styles=False, clear=False)
    body = con.export_html(inline_styles=True, code_format="{code}")
    return body, text.count("\n")


def _line_mm(font_pt: float) -> float:
    return font_pt * LINE_HEIGHT * PT_MM


def _page_lines_mm(blocks: list[int], summary_lines: int, font_pt: float, weather_lines: int | None = None) -> float:
    """Height (mm): text blocks, the summary/GZ row and the weather row (each the taller of its text
    and its diagram), gaps, signatures."""
    row = max(summary_lines * _line_mm(font_pt), SVG_HEIGHT_MM)
    rows = 1
    if weather_lines is not None:
        row += max(weather_lines * _line_mm(font_pt), SVG_HEIGHT_MM)
        rows += 1
    gaps = (len(blocks) + rows) * 0.5 * _line_mm(font_pt)
    return sum(blocks) * _line_mm(font_pt) + row + gaps + len(SIGNATORIES) * SIGNATURE_ROW_MM


def html_fits_a4(html_text: str) -> bool:
    """Whether the report's layout note (written by :func:`render_report_html`) says it fits one A4 page."""
    return 'data-fits-a4="yes"' in html_text


def render_report_html(
    result: Result, vessel: Vessel, condition: Condition, *, stamp: str | None = None, source: str | None = None,
    comparison=None, doubts: tuple[str, ...] = (),
) -> str:
    """The report as one self-contained HTML page with print CSS for A4 portrait (``doubts`` as
    for :func:`render_report_text`)."""
    p = _parts(result, vessel, condition, stamp, source, comparison, doubts)
    header, n_header = _export(p.header, TEXT_WIDTH)
    summary, n_summary = _export(p.summary, 52)
    body = [_export(b, TEXT_WIDTH) for b in p.body]
    closing, n_closing = _export(p.closing, TEXT_WIDTH)
    wx_svg = weather_svg(result)
    weather, n_weather = _export(p.weather, 52) if p.weather is not None else ("", 0)
    blocks = [n_header, *(n for _, n in body), n_closing]
    wx_lines = n_weather if wx_svg is not None else None
    printable_h = PAGE_HEIGHT_MM - 2 * PAGE_MARGIN_MM
    printable_w = PAGE_WIDTH_MM - 2 * PAGE_MARGIN_MM
    font = FONT_SIZES_PT[-1]
    for size in FONT_SIZES_PT:
        if _page_lines_mm(blocks, n_summary, size, wx_lines) <= printable_h:
            font = size
            break
    height = _page_lines_mm(blocks, n_summary, font, wx_lines)
    fits = height <= printable_h and TEXT_WIDTH * CHAR_WIDTH_EM * font * PT_MM <= printable_w
    svg = gz_svg(result)
    title = htmllib.escape(f"{vessel.particulars.name} — {result.condition_name}")
    pre = (f"margin:0 0 {0.5 * LINE_HEIGHT:.2f}em 0;font-family:'DejaVu Sans Mono','Liberation Mono',"
           f"Menlo,Consolas,monospace;")
    css = f"""
@page {{ size: A4 portrait; margin: {PAGE_MARGIN_MM:g}mm; }}
html, body {{ margin: 0; padding: 0; background: #fff; color: #000; }}
body {{ font-size: {font:g}pt; line-height: {LINE_HEIGHT:g}; }}
pre {{ font-size: {font:g}pt; line-height: {LINE_HEIGHT:g}; white-space: pre; {pre} }}
pre code {{ font-family: inherit; }}
.page {{ width: {printable_w:g}mm; margin: 0 auto; }}
.row {{ display: flex; gap: 4mm; align-items: flex-start; }}
.row pre {{ flex: 1; }}
.row svg {{ flex: none; }}
.signatures {{ font-family: sans-serif; }}
.sig {{ display: flex; align-items: flex-end; height: {SIGNATURE_ROW_MM:g}mm; gap: 2mm; }}
.sig .line {{ border-bottom: 0.4pt solid #000; height: 1em; }}
.sig .sign {{ flex: 3; }} .sig .name {{ flex: 2; }} .sig .when {{ flex: 1.3; }}
@media screen {{ .page {{ padding: {PAGE_MARGIN_MM:g}mm; box-shadow: 0 0 4px #888; margin: 8mm auto; }} }}
@media print {{ .page {{ width: auto; }} pre, svg, .row {{ break-inside: avoid; page-break-inside: avoid; }} }}
""".strip()
    parts = [
        "<!DOCTYPE html>",
        '<html lang="en">',
        "<head>",
        '<meta charset="utf-8">',
        f"<title>{title}</title>",
        f"<style>\n{css}\n</style>",
        "</head>",
        "<body>",
        f'<div class="page" data-fits-a4="{"yes" if fits else "no"}" data-height-mm="{height:.1f}">',
        f'<pre class="header">{header}</pre>',
        f'<div class="row"><pre class="summary">{summary}</pre>{svg}</div>',
        *([f'<div class="row"><pre class="weather">{weather}</pre>{wx_svg}</div>'] if wx_svg is not None else []),
        *(f'<pre class="{cls}">{b}</pre>' for cls, (b, _) in zip(("items", "deadweight", "free-surface", "criteria", "direct"),
                                                                   body)),
        f'<pre class="closing">{closing}</pre>',
        signatures_html(),
        "</div>",
        "</body>",
        "</html>",
    ]
    return "\n".join(parts) + "\n"
