"""What the table builder hands on to the profile writer (core/geometry/builder.py → cli/tables.py),
on a box hull worked by hand.

Box 20 × 6 × 3 m (x 0…20 from the AP, half-breadth 3 m everywhere, deck 3 m), 5 equally spaced
stations (odd: Simpson's first rule), ρ = 1.025 t/m³, design draft T = 1.5 m (a table draft, so
no interpolation).  Box closed forms (checks.md §1, upright):

* ∇ = L·B·T = 180 m³, Δ = 184.5 t; TPC = ρ·L·B/100 = 1.23 t/cm;
* KB = T/2 = 0.75 m, BM = B²/(12·T) = 2.0 m, KMt = 2.75 m; LCB = LCF = L/2 = 10 m;
* Cb = Cw = 1.

The summary lines the command line prints read the design draft and the station count from the
geometry the tables were built from.  Values are printed to 1–3 decimals; the box is exact in
every rule used, so the text is compared exactly.
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from deckload.cli.tables import generated_sections, summary
from deckload.core.geometry.builder import build_tables
from deckload.core.geometry.spec import Geometry, HullOffsets, TableSpec, VesselSpec


def box_geometry() -> Geometry:
    xs = np.linspace(0.0, 20.0, 5)
    hull = HullOffsets(xs, np.array([0.0, 3.0]), np.full((5, 2), 3.0), np.full(5, 3.0))
    tables = TableSpec(draft_m=np.array([0.5, 1.0, 1.5, 2.0]), kn_displacement_t=np.array([184.5]),
                       kn_heel_deg=np.array([0.0, 30.0]), trim_basis="free trim",
                       trim_lcg_m=10.0, trim_vcg_m=2.0)
    return Geometry(VesselSpec("Invented box", 20.0, 6.0, 3.0, 1.5), hull, tables)


def test_summary_of_the_tables_built_for_a_box():
    vt = build_tables(box_geometry())
    assert summary(vt) == [
        "hull integrated along 5 stations by Simpson's first rule; KN at free trim",
        "at the design draft 1.5 m: displacement 184.5 t, KMt 2.750 m, LCB 10.000 m, LCF 10.000 m, "
        "TPC 1.230 t/cm, Cb 1.000, Cw 1.000",
    ]


def test_cross_curves_written_for_a_box_trimmed_by_the_head():
    """The same box with the free-trim reference centre at x_G = 11 m, z_G = 2 m, heels 0 and 10°.

    Upright, B is in line with G when t = (L/2 − x_G)/(L²/(12T) + z_B − z_G) with
    z_B = (T² + t²L²/12)/(2T) (a linear draft d(x) = T − (x − L/2)·t integrated over the length;
    cross_curves.py docstring for the condition): t = −0.047625 (by the head).  Heeled 10°, each
    section is wall-sided (B/2·tan 10° = 0.53 m < the smallest draft 1.02 m and < the freeboard
    at the bow 1.02 m) and, per metre (checks.md §1.2 case 1), A = B·d, y = B²·tanθ/(12d),
    z = d/2 + B²·tan²θ/(24d); integrated over the length:

        KN = B²·tanθ·cosθ/(12T) + sinθ·[(T² + t²L²/12)/(2T) + B²·tan²θ/(24T)] = 0.4873 m

    with the upright t.  At 10° the free-trim t is smaller by under 2 % (ζ_B − ζ_G changes with
    heel), which moves KN by < 2e-4 m: 5e-4 m allowed.  Upright KN = 0 (B on the centre line).
    The profile writer rounds displacements to 0.01 t and heels to 0.001°."""
    g = box_geometry()
    g = dataclasses.replace(g, tables=dataclasses.replace(g.tables, kn_heel_deg=np.array([0.0, 10.0]), trim_lcg_m=11.0))
    cc = generated_sections(build_tables(g))["cross_curves"]
    assert cc["trim_basis"] == "free trim"
    assert cc["reference_lcg_m"] == 11.0
    assert cc["displacement_t"] == [184.5]
    assert cc["heel_deg"] == [0.0, 10.0]
    B, T, L, t, th = 6.0, 1.5, 20.0, -0.047625, np.radians(10.0)
    kn = B**2 * np.tan(th) * np.cos(th) / (12 * T) + np.sin(th) * (
        (T**2 + t**2 * L**2 / 12) / (2 * T) + B**2 * np.tan(th) ** 2 / (24 * T))
    assert cc["kn_m"][0][0] == 0.0
    assert cc["kn_m"][0][1] == pytest.approx(kn, abs=5e-4)
