"""A vessel and her mirror image, through ``deckload tables`` and the calculation: an unpaired wedge
tank against the starboard side, and the same vessel with it against the port side.

A reflection y → −y changes the sign of every transverse position and of the list, and nothing else
(derived: the hull is symmetric, and every transverse moment changes sign with y).  So the curve
of one heeling to starboard is the curve of the other heeling to port, and the verdicts are the same.
With the transfer correction (IS 2008 Part B 3.1, standards.md §4.1) this needs each unpaired tank's
own table heeled to port (``moment_port_m4``, tests/test_transfer_port_tables.py): reading the
wedge's starboard table for port heel, the mirror image passed area 0–30° at 0.0557 m·rad where the
vessel failed at 0.0502 (limit 0.055; an invariance audit found it).

The vessel (invented): a box hull 40 × 8 × 4 m, lightship 400 t at VCG 3.5 m, a wedge-section ballast
tank W1 (corners y, z = (0.5, 0.1), (3.9, 0.1), (3.9, 3.9), x 6–34 m, no pair) half full, a centreline
box tank C1 half full, and a 30 t deck load on the far side (y = ∓3.5 m, z = 4 m).
"""

from __future__ import annotations

import tomllib

import pytest

from deckload.cli.main import main
from deckload.core.model import Condition, DeckItem, TankFill
from deckload.core.stability import evaluate
from deckload.io.profiles import load_profile


def _arr(xs) -> str:
    return "[" + ", ".join(repr(float(x)) for x in xs) + "]"


def _geometry(sign: float) -> str:
    ys, zs = [0.5, 3.9, 3.9], [0.1, 0.1, 3.9]
    if sign < 0:  # y → −y reverses the polygon's sense: the corners in reverse order keep it counter-clockwise
        ys, zs = [-y for y in ys][::-1], zs[::-1]
    stations = [2.0 * k for k in range(21)]
    return f'''format = "deckload-geometry-1"
[vessel]
name = "Mirror wedge"
lbp_m = 40.0
breadth_m = 8.0
depth_m = 4.0
design_draft_m = 2.0
table_density_t_m3 = 1.025
[hull]
station_x_m = {_arr(stations)}
waterline_z_m = [0.0, 1.0, 2.0, 3.0, 4.0]
deck_z_m = {_arr([4.0] * 21)}
half_breadth_m = [{", ".join(_arr([4.0] * 5) for _ in stations)}]
[tables]
draft_m = {_arr([0.5 + 0.25 * k for k in range(12)])}
kn_displacement_t = {_arr([1.025 * 320 * t for t in (0.75, 1.0, 1.5, 2.0, 2.5, 3.0)])}
kn_heel_deg = {_arr([5.0 * k for k in range(19)])}
trim_basis = "free trim"
trim_lcg_m = 20.0
trim_vcg_m = 2.5
sounding_step_m = 0.1
transfer_fill_step_pct = 5.0

[[tank]]
id = "W1"
name = "Wing wedge"
kind = "ballast"
density_t_m3 = 1.025
shape = "prism"
x_m = [6.0, 34.0]
section_y_m = {_arr(ys)}
section_z_m = {_arr(zs)}

[[tank]]
id = "C1"
name = "Centre"
kind = "ballast"
density_t_m3 = 1.025
shape = "box"
x_m = [22.0, 30.0]
y_m = [-1.0, 1.0]
z_m = [0.0, 1.0]
'''


HAND = '''[lightship]
mass_t = 400.0
lcg_m = 20.0
vcg_m = 3.5
tcg_m = 0.0

[[load_line]]
name = "summer"
draft_m = 2.0

[free_surface]
rule = "actual"
gz_correction = "transfer"
'''


@pytest.fixture(scope="module")
def mirrored(tmp_path_factory):
    """The vessel (sign +1) and her mirror image (−1), each made by ``deckload tables``."""
    folder = tmp_path_factory.mktemp("mirror")
    made = {}
    for sign in (1.0, -1.0):
        geo = folder / f"w{sign:+.0f}.geometry.toml"
        geo.write_text(_geometry(sign), encoding="utf-8")
        prof = folder / f"w{sign:+.0f}.toml"
        prof.write_text(HAND, encoding="utf-8")
        assert main(["tables", str(geo), "-o", str(prof)]) == 0
        made[sign] = prof
    return made


def test_tables_write_a_port_table_for_the_unpaired_wedge_and_none_for_the_centreline_box(mirrored):
    doc = tomllib.loads(mirrored[1.0].read_text(encoding="utf-8"))
    tanks = {t["id"]: t for t in doc["tank"]}
    assert "moment_port_m4" in tanks["W1"]["transfer"] and "moment_port_m4" not in tanks["C1"]["transfer"]


def test_the_vessel_and_her_mirror_image_heel_alike_and_get_the_same_verdict(mirrored):
    """Each vessel's curve heeling towards the tank equals the other's heeling towards hers, to 1e-9 m
    (the tables of the two are made from mirror-image shapes: the same numbers up to round-off); the
    list changes sign; the criteria and the verdict are the same."""
    results = {}
    for sign, prof in mirrored.items():
        v = load_profile(prof)
        deck = DeckItem("counterweight", 30.0, 20.0, 4.0, -3.5 * sign, windage_area_m2=0.0)
        results[sign] = evaluate(v, Condition(tanks=(TankFill("W1", "percent", 50.0), TankFill("C1", "percent", 50.0)),
                                              deck_items=(deck,), gz_correction="transfer"))
    a, b = results[1.0], results[-1.0]
    assert a.list_deg == pytest.approx(-b.list_deg, abs=1e-9) and abs(a.list_deg) > 1.0
    assert a.gz_m == pytest.approx(b.gz_port_m, abs=1e-9)
    assert a.gz_port_m == pytest.approx(b.gz_m, abs=1e-9)
    assert [(c.id, c.passed) for c in a.criteria] == [(c.id, c.passed) for c in b.criteria]
    assert [c.value for c in a.criteria] == pytest.approx([c.value for c in b.criteria], abs=1e-9)
    assert a.verdict_text() == b.verdict_text() and a.all_criteria_pass == b.all_criteria_pass
