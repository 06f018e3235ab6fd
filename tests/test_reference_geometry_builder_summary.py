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

import numpy as np

from deckload.cli.tables import summary
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
        "hull integrated along 5 stations by Simpson's first rule; KN on a free trim basis",
        "at the design draft 1.5 m: displacement 184.5 t, KMt 2.750 m, LCB 10.000 m, LCF 10.000 m, "
        "TPC 1.230 t/cm, Cb 1.000, Cw 1.000",
    ]
