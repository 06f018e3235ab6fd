"""The printable report: its content, the GZ drawing and the A4 fit.

The numbers are the engine's (an analytic box barge from tests/vessel_factories);
these tests check that the report shows them faithfully, not that they are right —
the engine's own tests do that.
"""

from __future__ import annotations

import re
import xml.etree.ElementTree as ET
from html.parser import HTMLParser

import numpy as np
import pytest

from deckload.core.model import Condition, DeckItem, LimitCurve, MassItem, TankFill, frozen_array
from deckload.core.stability import evaluate
from deckload.report.condition_report import (
    CAUTION,
    CHAR_WIDTH_EM,
    LINE_HEIGHT,
    PAGE_HEIGHT_MM,
    PAGE_MARGIN_MM,
    PAGE_WIDTH_MM,
    PT_MM,
    SIGNATURE_ROW_MM,
    SVG_HEIGHT_MM,
    gz_svg,
    html_fits_a4,
    render_report_html,
    render_report_text,
)
from deckload.report.verdict_format import paragraph, set_title
from vessel_factories import barge_tanks, box_barge

SVG_NS = "{http://www.w3.org/2000/svg}"


def _condition(name="Departure, test") -> Condition:
    return Condition(
        name=name,
        remark="outbound to the islands",
        tanks=(TankFill("DB1P", "percent", 50.0), TankFill("FO1S", "percent", 98.5),
               TankFill("FW1C", "percent", 30.0)),
        deck_items=(DeckItem("Container of building materials", 18.0, 9.0, 5.5),),
        constants=(MassItem("Crew and effects", 1.2, 30.0, 6.0),),
    )


@pytest.fixture(scope="module")
def case():
    downflooding = LimitCurve(frozen_array([200.0, 1500.0]), frozen_array([38.0, 38.0]), "downflooding_deg")
    v = box_barge(tanks=barge_tanks(), downflooding=downflooding)
    c = _condition()
    return v, c, evaluate(v, c)


@pytest.fixture(scope="module")
def failing_case():
    v = box_barge(tanks=barge_tanks(), lightship_kg_m=7.5)
    c = _condition("Overloaded deck")
    return v, c, evaluate(v, c)


def test_text_report_shows_every_number_of_the_result(case):
    v, c, r = case
    txt = render_report_text(r, v, c, stamp="2026-12-01 22:00 UTC", source="dep.condition.toml")
    assert v.particulars.name in txt and c.name in txt and c.remark in txt
    assert "2026-12-01 22:00 UTC" in txt and "dep.condition.toml" in txt
    for label, value in [
        ("Displacement Δ", f"{r.displacement_t:.1f} t"),
        ("Deadweight", f"{r.deadweight_t:.1f} t"),
        ("KG solid", f"{r.kg_m:.3f} m"),
        ("FSC = ΣFSM/Δ", f"{r.fsc_m:.3f} m"),
        ("KG fluid", f"{r.kg_fluid_m:.3f} m"),
        ("KMt", f"{r.km_m:.3f} m"),
        ("GM fluid", f"{r.gm_fluid_m:.3f} m"),
        ("Draft aft / mid / fwd", f"{r.draft_aft_m:.3f} / {r.draft_mean_m:.3f} / {r.draft_fwd_m:.3f} m"),
        ("Trim", f"{abs(r.trim_m):.3f} m by the {'stern' if r.trim_m > 0 else 'head'}"),
        ("Downflooding θf", "38.0°"),
    ]:
        assert re.search(re.escape(label) + r"\s+" + re.escape(value), txt), (label, value)
    # every item: lightship, non-empty tanks, deck, constants, with mass and centres
    for it in r.items:
        row = next(line for line in txt.splitlines() if it.name in line)
        assert f"{it.mass_t:.2f}" in row and f"{it.lcg_m:.3f}" in row and f"{it.vcg_m:.3f}" in row
    tank_rows = [t for t in r.tanks if t.mass_t > 0]
    assert {t.id for t in tank_rows} == {"DB1P", "FO1S", "FW1C"}
    for t in tank_rows:
        row = next(line for line in txt.splitlines() if line.startswith("Tank") and f"{t.id} " in line)
        assert f"{t.fill_pct:.1f}" in row and f"{t.mass_t:.2f}" in row and f"{t.vcg_m:.3f}" in row
    assert "empty: DB1S, FO1P, LO1C, CL1C" in txt
    assert re.search(r"Displacement\s+" + re.escape(f"{r.displacement_t:.2f}"), txt)
    # free-surface table: the rule used per tank, and the sum
    counted = [t for t in r.tanks if t.fsm_tm > 0]
    assert counted, "the case must have free surface to show"
    for t in counted:
        row = next(line for line in txt.splitlines() if line.startswith(t.id + " "))
        assert f"{t.fsm_tm:.2f}" in row and t.fs_rule[:20] in row
    for t in r.tanks:
        if t.fsm_tm == 0:  # grouped by the rule that left them at zero
            rule = "empty" if t.state == "empty" else t.fs_rule
            row = next(line for line in txt.splitlines() if line.startswith("—") and rule in line)
            assert re.search(rf"\b{t.id}\b", row)
    assert re.search(r"ΣFSM\s+" + re.escape(f"{r.fsm_total_tm:.2f}"), txt)
    # criteria: value, limit, margin, verdict
    for cr in r.criteria:
        d = 1 if cr.unit == "deg" else 3
        row = next(line for line in txt.splitlines() if line.startswith(cr.description))
        assert f"{cr.value:.{d}f}" in row and f"{cr.limit:.{d}f}" in row and f"{cr.margin:+.{d}f}" in row
        assert ("pass" if cr.passed else "FAIL") in row and paragraph(cr) in row
    # the verdict names the sets and what was not assessed; never 'all criteria met' alone
    assert "All criteria" not in txt and "all criteria" not in txt
    assert " ".join(("Verdict: " + r.verdict_text()).split()) in " ".join(txt.split())
    for s in r.criteria_sets:
        assert f"{set_title(s.title)}: met" in txt
    for n in r.not_assessed:
        assert n.item in " ".join(txt.split())
    # GZ values at 10° steps
    for h in (10.0, 30.0, 40.0):
        i = r.gz_heel_deg.index(h)
        assert f"{r.gz_m[i]:.3f}" in txt
    assert " ".join(CAUTION.split()) in " ".join(txt.split())
    assert re.search(r"^Officer:\s+_{20,}\s+Name: _+\s+Date/time: _+$", txt, re.M)
    assert re.search(r"^Master:\s+_{20,}\s+Name: _+\s+Date/time: _+$", txt, re.M)
    for w in r.warnings:  # long messages wrap at the report's width
        assert " ".join(w.message.split()) in " ".join(txt.split())


def test_failed_criteria_are_plain_in_the_report(failing_case):
    v, c, r = failing_case
    assert not r.all_criteria_pass
    txt = render_report_text(r, v, c)
    assert "Verdict: NOT MET" in txt and "All criteria" not in txt
    for cr in r.criteria:
        row = next(line for line in txt.splitlines() if line.startswith(cr.description))
        assert ("pass" if cr.passed else "FAIL") in row


class _Pre(HTMLParser):
    """Collects the text of each <pre> block and the document's CSS."""

    def __init__(self):
        super().__init__()
        self.blocks: list[tuple[str, str]] = []
        self.css = ""
        self._in: str | None = None
        self._style = False

    def handle_starttag(self, tag, attrs):
        if tag == "pre":
            self._in = dict(attrs).get("class", "")
            self.blocks.append((self._in, ""))
        if tag == "style":
            self._style = True

    def handle_endtag(self, tag):
        if tag == "pre":
            self._in = None
        if tag == "style":
            self._style = False

    def handle_data(self, data):
        if self._in is not None:
            cls, text = self.blocks[-1]
            self.blocks[-1] = (cls, text + data)
        if self._style:
            self.css += data


def test_html_report_has_the_content_and_print_css(case):
    v, c, r = case
    doc = render_report_html(r, v, c, stamp="2026-12-01 22:00 UTC")
    p = _Pre()
    p.feed(doc)
    text = "\n".join(t for _, t in p.blocks)
    assert [cls for cls, _ in p.blocks] == ["header", "summary", "items", "deadweight", "free-surface", "criteria", "closing"]
    assert text.count("LOADING CONDITION AND INTACT STABILITY") == 1  # each block exported once, not repeated
    assert f"{r.gm_fluid_m:.3f} m" in text and f"{r.displacement_t:.2f}" in text
    for cr in r.criteria:
        assert cr.description in text
    assert " ".join(CAUTION.split()) in " ".join(text.split())
    sig = re.search(r'<div class="signatures">(.*?)</div></div>', doc, re.S).group(1)
    assert re.findall(r'<span class="who">(\w+):</span><span class="line sign">', sig) == ["Officer", "Master"]
    assert re.search(r"@page\s*\{\s*size:\s*A4 portrait", p.css)
    assert doc.count("<svg") == 1


def test_html_report_fits_one_a4_page(case):
    """Height: Σ lines × size × line-height (+ half a line between blocks), the summary/GZ row
    (taller of the two) and the signature rows within 297 − 2·10 mm; width: longest line × 0.6 em
    within 210 − 2·10 mm."""
    v, c, r = case
    doc = render_report_html(r, v, c, stamp="2026-12-01 22:00 UTC", source="dep.condition.toml")
    p = _Pre()
    p.feed(doc)
    font_pt = float(re.search(r"pre \{ font-size: ([\d.]+)pt", p.css).group(1))
    line_mm = font_pt * LINE_HEIGHT * PT_MM
    heights = {cls: len(t.rstrip("\n").split("\n")) * line_mm for cls, t in p.blocks}
    summary_row = max(heights.pop("summary"), SVG_HEIGHT_MM)
    signatures = doc.count('<div class="sig">') * SIGNATURE_ROW_MM
    total = sum(heights.values()) + summary_row + len(p.blocks) * 0.5 * line_mm + signatures
    assert total <= PAGE_HEIGHT_MM - 2 * PAGE_MARGIN_MM
    widest = max(len(line) for _, t in p.blocks for line in t.split("\n"))
    assert widest * CHAR_WIDTH_EM * font_pt * PT_MM <= PAGE_WIDTH_MM - 2 * PAGE_MARGIN_MM
    assert html_fits_a4(doc)


def _svg_tree(svg: str) -> ET.Element:
    return ET.fromstring(svg)


def _axis_maps(root: ET.Element):
    """Linear maps heel→x and GZ→y recovered from the tick labels the drawing prints."""
    xt = [(float(t.text.rstrip("°")), float(t.get("x"))) for t in root.iter(SVG_NS + "text") if t.get("class") == "xt"]
    yt = [(float(t.text), float(t.get("y"))) for t in root.iter(SVG_NS + "text") if t.get("class") == "yt"]
    assert len(xt) >= 2 and len(yt) >= 2
    (h0, x0), (h1, x1) = xt[0], xt[-1]
    (g0, y0), (g1, y1) = yt[0], yt[-1]
    # every tick must lie on the same straight line: the axes are linear
    for h, x in xt:
        assert x == pytest.approx(x0 + (h - h0) * (x1 - x0) / (h1 - h0), abs=0.01)
    for g, y in yt:
        assert y == pytest.approx(y0 + (g - g0) * (y1 - y0) / (g1 - g0), abs=0.01)
    return (lambda h: x0 + (h - h0) * (x1 - x0) / (h1 - h0)), (lambda g: y0 + (g - g0) * (y1 - y0) / (g1 - g0))


def test_svg_polyline_points_are_the_gz_values(case):
    v, c, r = case
    root = _svg_tree(gz_svg(r))
    fx, fy = _axis_maps(root)
    (poly,) = [e for e in root.iter(SVG_NS + "polyline") if e.get("class") == "gz-curve"]
    pts = [tuple(map(float, p.split(","))) for p in poly.get("points").split()]
    gz = r.gz_port_m if r.criteria_side == "port" else r.gz_m
    assert len(pts) == len(r.gz_heel_deg)
    for (x, y), h, g in zip(pts, r.gz_heel_deg, gz):
        assert x == pytest.approx(fx(h), abs=0.002)
        assert y == pytest.approx(fy(g), abs=0.002)
    # y grows downwards: the larger GZ is drawn higher
    i_max = int(np.argmax(gz))
    assert pts[i_max][1] == min(y for _, y in pts)


def test_svg_marks_30_40_and_downflooding(case):
    v, c, r = case
    root = _svg_tree(gz_svg(r))
    fx, _ = _axis_maps(root)
    marks = {float(e.get("data-angle-deg")): float(e.get("x1")) for e in root.iter(SVG_NS + "line")
             if e.get("class") == "mark"}
    assert set(marks) == {30.0, 40.0, r.downflooding_angle_deg} and r.downflooding_angle_deg == 38.0
    for ang, x in marks.items():
        assert x == pytest.approx(fx(ang), abs=0.01)
    labels = [t.text for t in root.iter(SVG_NS + "text")]
    assert "┆ θf 38.0°" in labels


def test_svg_has_no_downflooding_mark_when_none_is_given(failing_case):
    _, _, r = failing_case
    assert r.downflooding_angle_deg is None
    root = _svg_tree(gz_svg(r))
    marks = {float(e.get("data-angle-deg")) for e in root.iter(SVG_NS + "line") if e.get("class") == "mark"}
    assert marks == {30.0, 40.0}


# --------------------------------------------------------------------------- the verdict and the weather criterion


@pytest.fixture(scope="module")
def demo_case():
    """The demo departure as the engine computes it: IS 2008 A 2.2 and A 2.3 assessed, weather numbers filled."""
    from verdict_samples import demo

    return demo("departure")


def test_report_names_the_sets_and_lists_what_was_not_assessed(demo_case):
    v, c, r = demo_case
    assert r.weather is not None and len(r.criteria_sets) == 2 and r.not_assessed
    txt = render_report_text(r, v, c)
    doc = render_report_html(r, v, c)
    flat_html = " ".join(re.sub(r"<[^>]+>", "", doc).split())
    for text in (" ".join(txt.split()), htmllib_unescape(flat_html)):
        assert "all criteria" not in text.lower()
        assert " ".join(("Verdict: " + r.verdict_text()).split()) in text
        for s in r.criteria_sets:
            assert set_title(s.title) in text
        for n in r.not_assessed:
            assert n.item in text and f"({n.reason})" in text
    # the weather criterion like the others: value, limit, margin, result
    for cr in r.criteria:
        if cr.set_id != "IS2008-A2.3":
            continue
        d = 1 if cr.unit == "deg" else 3
        row = next(line for line in txt.splitlines() if line.startswith(cr.description))
        assert f"{cr.value:.{d}f}" in row and f"{cr.limit:.{d}f}" in row and f"{cr.margin:+.{d}f}" in row
    w = r.weather
    for label, value in [("Steady wind lever lw1", f"{w.lw1_m:.4f} m"), ("Gust lever lw2", f"{w.lw2_m:.4f} m"),
                         ("Area a / area b", f"{w.area_a_mrad:.4f} / {w.area_b_mrad:.4f} m·rad")]:
        row = next(line for line in txt.splitlines() if line.startswith(label))
        assert value in row
    assert f"Deck edge immersion{'':1}" in txt and f"{r.deck_edge_angle_deg:.1f}°" in txt
    assert re.search(rf"Freeboard at midships +{r.freeboard_m:.3f} m", txt)
    assert re.search(r"Margin to the mark +" + re.escape(f"{r.load_line_margin_m:+.3f} m"), txt)


def htmllib_unescape(text: str) -> str:
    import html

    return html.unescape(text)


def test_an_unassessable_criterion_reads_not_assessable_never_pass():
    from verdict_samples import demo_with_verdict

    v, c, r = demo_with_verdict(unassessable=True)
    cr = next(x for x in r.criteria if not x.assessed)
    txt = render_report_text(r, v, c)
    row = next(line for line in txt.splitlines() if line.startswith(cr.description))
    assert "not assessable" in row and "pass" not in row and "n/a" in row
    assert f"{cr.description}: {cr.note}" in txt
    assert "met where assessable" in txt


def test_weather_svg_draws_the_levers_angles_and_areas(demo_case):
    """lw1 and lw2 are horizontal lines at their values; θ0, θ1 (at θ0 − θ1) and θ2 are marks at their
    angles; areas a and b are shaded; the curve runs from rolled to windward to past θ2."""
    from deckload.report.condition_report import weather_svg

    v, c, r = demo_case
    w = r.weather
    root = _svg_tree(weather_svg(r))
    fx, fy = _axis_maps(root)
    lines = {e.get("class"): e for e in root.iter(SVG_NS + "line") if e.get("class") in ("lw1", "lw2")}
    for cls, value in (("lw1", w.lw1_m), ("lw2", w.lw2_m)):
        e = lines[cls]
        assert float(e.get("y1")) == pytest.approx(fy(value), abs=0.01)  # coordinates are written to 0.01
        assert float(e.get("y2")) == float(e.get("y1"))
    marks = sorted(float(e.get("data-angle-deg")) for e in root.iter(SVG_NS + "line") if e.get("class") == "mark")
    assert marks == pytest.approx(sorted([w.theta0_deg, w.theta0_deg - w.theta1_deg, w.theta2_deg]), abs=1e-4)
    for e in root.iter(SVG_NS + "line"):
        if e.get("class") == "mark":
            assert float(e.get("x1")) == pytest.approx(fx(float(e.get("data-angle-deg"))), abs=0.01)
    areas = {e.get("class") for e in root.iter(SVG_NS + "polygon")}
    assert areas == {"area-a", "area-b"}
    (poly,) = [e for e in root.iter(SVG_NS + "polyline") if e.get("class") == "gz-curve"]
    xs = [float(p.split(",")[0]) for p in poly.get("points").split()]
    assert min(xs) <= fx(w.theta0_deg - w.theta1_deg) and max(xs) >= fx(w.theta2_deg)
    doc = render_report_html(r, v, c)
    assert doc.count("<svg") == 2 and 'class="weather"' in doc


def test_no_weather_diagram_when_the_weather_criterion_was_not_assessed(case):
    from deckload.report.condition_report import weather_svg

    v, c, r = case
    assert r.weather is None
    assert weather_svg(r) is None and render_report_html(r, v, c).count("<svg") == 1


def _deadweight_numbers(block: str) -> dict[str, float]:
    """Column title → mass from the printed 'Deadweight by kind (t)' table."""
    lines = [ln for ln in block.splitlines() if ln.strip()]
    at = next(i for i, ln in enumerate(lines) if ln.startswith("Deadweight by kind"))
    values = [float(x) for x in lines[at + 3].split()]  # title, column heads, rule, the masses
    heads = re.split(r"\s{2,}", lines[at + 1].strip())
    return dict(zip(heads, values, strict=True))


def test_report_gives_the_deadweight_by_kind_adding_up_to_the_deadweight(demo_case):
    """The demo departure by hand from its condition file and the profile (p % of capacity × ρ):
    cargo = hold 50 t + deck 14 + 13 + 3.5 + 6 t + CF1P/S, CF2P/S 4 × 0.98 × 43.2 m³ × 0.85 t/m³;
    fuel oil 2 × 0.95 × 13.1773 × 0.85; diesel 2 × 0.95 × 5.867 × 0.85; lube oil 0.90 × 1.575 × 0.90;
    stores and constants 1.2 + 2.0 + 3.0 t.  Deadweight = Δ − lightship (common practice)."""
    v, c, r = demo_case
    by_hand = {"Cargo": 50.0 + 36.5 + 4 * 0.98 * 43.2 * 0.85, "Fuel oil": 2 * 0.95 * 13.1773 * 0.85,
               "Diesel oil": 2 * 0.95 * 5.867 * 0.85, "Lube oil": 0.90 * 1.575 * 0.90,
               "Stores and constants": 6.2}
    for text in (render_report_text(r, v, c),
                 "".join(t for cls, t in _pre_blocks(render_report_html(r, v, c)) if cls == "deadweight")):
        shown = _deadweight_numbers(htmllib_unescape(text))
        assert set(shown) == {"Cargo", "Fuel oil", "Diesel oil", "Lube oil", "Fresh water", "Ballast water",
                              "Stores and constants", "Deadweight"}
        for title, mass in by_hand.items():
            assert shown[title] == pytest.approx(mass, abs=0.005 + 1e-9), title  # printed to 0.01 t
        assert shown["Deadweight"] == pytest.approx(r.displacement_t - r.lightship_t, abs=0.005 + 1e-9)
        parts = sum(m for t, m in shown.items() if t != "Deadweight")
        assert parts == pytest.approx(shown["Deadweight"], abs=7 * 0.005)  # seven entries rounded to 0.01 t


def _pre_blocks(doc: str) -> list[tuple[str, str]]:
    p = _Pre()
    p.feed(doc)
    return p.blocks
