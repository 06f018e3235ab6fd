"""The load-line readout: freeboard, the mark in use, the dock-water allowance applied to it, the
allowed midships draft and the margin, on the screen, in the report and from calc.

Hand-worked example (box barge of tests/vessel_factories.py: L 40 m, B 10 m, D 4 m, wall-sided):

* Summer mark 2.600 m.  At the summer draft in sea water Δ = 1.025·40·10·2.6 = 1066.0 t and
  TPC = 1.025·40·10/100 = 4.100 t/cm.
* FWA = Δ/(4·TPC) mm = 1066.0/16.4 = 65.0 mm (standards.md §6.1: FWA = Δ/(40·TPC) cm, shipboard
  formula [C]; ICLL reg. 40(8) for the paragraph, from memory [M]).
* Dock water ρ = 1.010 t/m³: DWA = FWA·(1.025 − ρ)/0.025 = 65.0·0.6 = 39.0 mm (standards.md §6.1,
  textbook formula, from memory [M]), so the summer mark allows 2.600 + 0.039 = 2.639 m.
* Derivation of the exact allowance, to see what that formula approximates: at the mark in dock
  water she displaces the same Δ as at the mark in sea water only if the extra volume
  Δ(1/ρ − 1/1.025) lies in the layer above the mark, of area A = 100·TPC/1.025, so the sinkage is
  Δ(1.025 − ρ)/(ρ·100·TPC) m.  The textbook DWA is the same with 1.000 for ρ in the denominator:
  exact = DWA/ρ = 0.039/1.010 = 0.038614 m.  For the wall-sided box this is also T(1.025/ρ − 1)
  = 2.6·0.0148515 = 0.038614 m.  The program follows the textbook (the allowance as marked and
  surveyed); the exact figure only bounds its error here (0.39 mm).
* Loaded to T = 2.400 m in sea water (Δ = 984.0 t), she floats in the dock at
  T = 2.4·1.025/1.010 = 2.435644 m: freeboard = 4 − 2.435644 = 1.564356 m (depth − midships
  draft), margin = 2.639 − 2.435644 = 0.203356 m below the mark.
"""

from __future__ import annotations

import dataclasses
import re

import pytest

from deckload.cli.calc import format_summary
from deckload.core.model import Condition, LoadLine
from deckload.core.stability import evaluate
from deckload.report.condition_report import render_report_text
from deckload.ui import views
from vessel_factories import barge_at


def dock_barge():
    v, _ = barge_at(2.4, 3.0)  # all mass in the lightship: Δ = 1.025·40·10·2.4 = 984.0 t
    v = dataclasses.replace(v, load_lines=(LoadLine("summer", 2.6),))
    return v, Condition(name="In dock", water_density_t_m3=1.010, load_line="summer")


def test_dock_water_allowance_and_margin_by_hand():
    v, c = dock_barge()
    r = evaluate(v, c)
    assert r.load_line_mark == "summer" and r.load_line_mark_draft_m == 2.6
    assert r.dock_water_allowance_m == pytest.approx(0.039, abs=1e-9)  # 65.0 mm · 0.6 (docstring)
    assert r.load_line_allowed_draft_m == pytest.approx(2.639, abs=1e-9)
    exact = 2.6 * (1.025 / 1.010 - 1.0)  # derived in the docstring: sinkage of the wall-sided box
    assert r.dock_water_allowance_m / 1.010 == pytest.approx(exact, abs=1e-9)  # exact = DWA/ρ (derived)
    assert r.draft_mean_m == pytest.approx(2.4 * 1.025 / 1.010, abs=1e-6)  # interpolated hydrostatics: 1 µm
    assert r.freeboard_m == pytest.approx(1.564356, abs=1e-6)
    assert r.load_line_margin_m == pytest.approx(0.203356, abs=1e-6)


def test_sea_water_allows_the_mark_itself():
    """In sea water (1.025, the summer mark's own water) the allowance is nil (standards.md §6.1)."""
    v, c = dock_barge()
    r = evaluate(v, c.with_density(1.025))
    assert r.dock_water_allowance_m == pytest.approx(0.0, abs=1e-12)
    assert r.load_line_allowed_draft_m == pytest.approx(2.6, abs=1e-12)


def test_the_readout_on_the_panel_the_report_and_calc_says_the_same_in_one_wording():
    v, c = dock_barge()
    r = evaluate(v, c)
    panel = "\n".join(t.plain for t in views.afloat_lines(v, c, r, False, 54))
    assert re.search(r"Fbd\s+1\.564 m\s+Margin\s+\+0\.203 m", panel)
    assert re.search(r"Mark\s+2\.639 m S\s+DWA\s+\+0\.039 m", panel)  # S: the summer mark's letter (ICLL)
    narrow = "\n".join(t.plain for t in views.afloat_lines(v, c, r, False, 34))
    assert re.search(r"Marg\.\s+\+0\.203 m", narrow) and re.search(r"Mark\s+2\.639 m S", narrow)
    assert all(len(t.plain) <= 34 for t in views.afloat_lines(v, c, r, False, 34))
    text = render_report_text(r, v, c)
    for label, value in [("Freeboard at midships", "1.564 m"), ("Load line mark in use", "summer 2.600 m"),
                         ("Dock-water allowance at ρ 1.010", "+0.039 m"), ("Allowed midships draft", "2.639 m"),
                         ("Margin to the mark", "+0.203 m")]:
        assert re.search(re.escape(label) + r" +" + re.escape(value), text), label
    assert "sum" not in panel and "LL" not in panel  # not "LL 2.900 m sum", which read like a total
    calc = format_summary(r)
    assert re.search(r"Margin to the mark +\+0\.203 m", calc)
    assert "summer mark 2.600 m; in water of 1.010 t/m³ DWA +0.039 m, allowed midships draft 2.639 m" in calc


def test_angles_are_given_to_a_tenth_of_a_degree():
    """List 0.1° on the panel, in the report and from calc; θf as a value in the GZ caption."""
    v, c = dock_barge()
    r = dataclasses.replace(evaluate(v, c), list_deg=-0.26, downflooding_angle_deg=39.64)
    panel = "\n".join(t.plain for t in views.afloat_lines(v, c, r, False, 54))
    assert re.search(r"List\s+0\.3 ° P", panel) and "0.26" not in panel
    assert re.search(r"List +0\.3° port", render_report_text(r, v, c))
    assert "0.3° port" in format_summary(r)
    assert "θf 39.6°" in views.gz_caption(r, 54).plain and "θf 39.6°" in views.gz_caption(r, 34).plain
    still = dataclasses.replace(r, list_deg=0.04)  # below the printed tenth: upright, no side
    assert re.search(r"List\s+0\.0 ° ", "\n".join(t.plain for t in views.afloat_lines(v, c, still, False, 54)))
    assert re.search(r"List +upright", render_report_text(still, v, c))
