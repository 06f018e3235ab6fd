"""A tank without a pair heeled to port: its own table of transfer to port, made from its shape.

The transfer tables give the volumetric moment of fluid transfer M(f, φ) heeled to starboard
(checks.md §3.2 definition; IS 2008 Part B 3.1, standards.md §4.1).  Heeled to port a tank moves its
liquid as its mirror image (y → −y) does heeled to starboard, the moment reversed:

    M'(f, φ) = −M(f, −φ) = M_mirror(f, φ)                                    (derived: reflection)

In a pair the mirror image is the partner, whose table serves (tests/test_stage_curve_transfer_pairs.py).
A tank without a pair is its own mirror image only if it is symmetric about its own centre plane
(a box); a wedge against the ship's side is not, and reading its starboard table for port heel made a
vessel with such a tank to port pass the area 0–30° criterion that her mirror image, with the tank
to starboard, failed (an invariance audit found it: 0.0557 against 0.0502 m·rad, limit 0.055).  So
``deckload tables`` writes ``moment_port_m4`` for an unpaired tank off the centreline or unlike
both ways, the reader takes it, and the GZ curve heeling to port uses it; a profile that gives an
unpaired tank off the centreline no port table gets a caution naming it.
"""

from __future__ import annotations

import dataclasses
import math
import tomllib

import numpy as np
import pytest
import tomli_w

from deckload.core.geometry.builder import tank_tables
from deckload.core.geometry.spec import CompartmentShape, TankSpec
from deckload.core.model import Condition, FluidTransfer, TankFill, frozen_array
from deckload.core.stability import evaluate
from deckload.io import paths
from deckload.io.profiles import ProfileError, parse_profile
from test_reference_geometry_builder import box_geometry
from test_stage_curve_transfer_pairs import expected_gz30, vessel
from vessel_factories import box_tank

# -------------------------------------------------------------------------------- the table builder

WEDGE_Y, WEDGE_Z = np.array([0.5, 2.5, 2.5]), np.array([0.5, 0.5, 2.5])
"""A right-angled wedge against the starboard side of the 6 m box (section counter-clockwise from aft)."""


def _tank(tid, shape, pair=None):
    return TankSpec(tid, tid, "ballast", 1.025, shape, pair)


def _wedge(sign=1.0):
    """The wedge at y > 0, or (sign −1) its mirror image at y < 0: y → −y reverses the polygon's
    sense, so the vertices are taken in reverse order to keep it counter-clockwise."""
    y, z = (WEDGE_Y, WEDGE_Z) if sign > 0 else (-WEDGE_Y[::-1], WEDGE_Z[::-1])
    return CompartmentShape("prism", 2.0, 8.0, section_y_m=y, section_z_m=z)


def test_an_unpaired_wedge_heeled_to_port_moves_as_its_mirror_image_heeled_to_starboard():
    """M'(f, φ) of the wedge at y > 0 equals M(f, φ) of its mirror image at y < 0, each computed
    heeled to starboard by the builder (module docstring, derived by reflection); to 1e-9 m⁴, the
    level solver's convergence.  And it is not the wedge's own starboard table: heeled towards its
    sloping face, the liquid moves otherwise than heeled towards its vertical wall (at 50 % and 30°
    the two differ by more than 10 %), which is why the starboard table could not serve."""
    g = box_geometry()
    heels = np.array([0.0, 15.0, 30.0, 45.0, 60.0, 90.0])
    own = tank_tables(_tank("W", _wedge(+1)), g, heels)
    mirror = tank_tables(_tank("M", _wedge(-1)), g, heels)
    assert own.transfer_port_m4 is not None
    np.testing.assert_allclose(own.transfer_port_m4, mirror.transfer.moment_m4, atol=1e-9)
    j = int(np.searchsorted(own.transfer.fill_pct, 50.0))
    stbd, port = own.transfer.moment_m4[j, 2], own.transfer_port_m4[j, 2]
    assert abs(port - stbd) > 0.10 * max(stbd, port)


def test_an_unpaired_box_off_the_centreline_gets_a_port_table_equal_to_its_starboard_table():
    """A box is symmetric about its own centre plane: its mirror image is itself moved across, and M
    does not depend on where the tank lies (checks.md §3.2: M is the shift of the liquid's own
    centroid), so M' = M (to 1e-9 m⁴).  It is written all the same, as it lies off the centreline
    (1.5 m, beyond 1 % of B): a profile then never leaves an off-centre tank's port heel to doubt."""
    g = box_geometry()
    t = tank_tables(g.tanks[0], g, np.array([0.0, 30.0, 90.0]))
    assert t.transfer_port_m4 is not None
    np.testing.assert_allclose(t.transfer_port_m4, t.transfer.moment_m4, atol=1e-9)


def test_a_centreline_box_and_a_paired_tank_get_no_port_table():
    """A box across the centreline (y −1…1) is its own mirror image: the starboard table serves both
    ways and none is written.  A tank of a pair takes its partner's table (the pair's mirror image),
    so none is written for it either, whatever its shape."""
    g = box_geometry()
    heels = np.array([0.0, 30.0, 90.0])
    centre = CompartmentShape("box", 2.0, 8.0, -1.0, 1.0, 0.5, 1.5)
    assert tank_tables(_tank("C", centre), g, heels).transfer_port_m4 is None
    assert tank_tables(_tank("W", _wedge(+1), pair="M"), g, heels).transfer_port_m4 is None


# -------------------------------------------------------------------------------- the GZ curve


FILLS, HEELS = [0.0, 50.0, 100.0], [0.0, 29.0, 31.0, 90.0]


def _posed(m_at_50_pct):
    """Posed as in test_stage_curve_transfer_pairs: M = m at 50 % fill between 29° and 31°, 0 at
    0 % and 100 % (rows :data:`FILLS`, columns :data:`HEELS`), linear between the rows."""
    m = np.zeros((len(FILLS), len(HEELS)))
    m[1, 1:3] = m_at_50_pct
    return m


def _wing(tcg_m, port_table):
    t = box_tank("W1", length_m=10, breadth_m=5, height_m=2, lcg_m=50.0, tcg_m=tcg_m, kind="ballast",
                 density_t_m3=1.0)
    tr = FluidTransfer(frozen_array(FILLS), frozen_array(HEELS),
                       frozen_array(_posed(2.0)), None if port_table is None else frozen_array(_posed(port_table)))
    return dataclasses.replace(t, transfer=tr)


def test_the_port_curve_takes_an_unpaired_tanks_own_port_table():
    """Ballast W1 at y = +3 m, 50 % (50 t at VCG 0.5 m), starboard table 2 m⁴ and port table 8 m⁴ at
    50 %, 30°: GZ(30°) both ways by the formulas of test_stage_curve_transfer_pairs (IS 2008 B 3.1,
    standards.md §4.1), with M = 2 to starboard and M' = 8 to port; no caution."""
    r = evaluate(vessel([_wing(3.0, 8.0)]), Condition(tanks=(TankFill("W1", "percent", 50.0),), gz_correction="transfer"))
    stbd, port = expected_gz30(50.0, 0.5, 3.0, 1.0, 2.0, 8.0)
    assert r.gz_m[30] == pytest.approx(stbd, abs=1e-9)
    assert r.gz_port_m[30] == pytest.approx(port, abs=1e-9)
    assert not [w for w in r.warnings if w.code == "fs-port-as-starboard"]


def test_an_unpaired_tank_off_the_centreline_without_a_port_table_is_named_in_a_caution():
    """Without a port table the starboard table is read both ways (right for a tank symmetric about
    its own centre plane only), and a caution names the tank; a tank on the centreline (TCG 0) is
    taken as symmetric about it without a caution (common practice: a centreline tank is built
    alike both sides)."""
    r = evaluate(vessel([_wing(3.0, None)]), Condition(tanks=(TankFill("W1", "percent", 50.0),), gz_correction="transfer"))
    stbd, port = expected_gz30(50.0, 0.5, 3.0, 1.0, 2.0, 2.0)
    assert r.gz_port_m[30] == pytest.approx(port, abs=1e-9)
    notes = [(w.message, w.severity) for w in r.warnings if w.code == "fs-port-as-starboard"]
    assert notes == [("heeling to port, the transfer of W1 is taken from its starboard table (no port table and "
                      "no pair): right only for a tank symmetric about its own centre plane; give moment_port_m4, "
                      "or make the tables again with 'deckload tables' from the tank's shape", "caution")]
    centre = evaluate(vessel([_wing(0.0, None)]), Condition(tanks=(TankFill("W1", "percent", 50.0),),
                                                           gz_correction="transfer"))
    assert not [w for w in centre.warnings if w.code == "fs-port-as-starboard"]


def test_the_small_tank_bound_takes_the_side_that_moves_more():
    """IS 2008 B 3.1.12 exempts a tank whose Mfs at 30° is small; the bound (free_surface.mfs30_bound_m4)
    is the larger of the two sides' tables at 30°: 8 m⁴ here, not the starboard 2 m⁴."""
    from deckload.core.free_surface import mfs30_bound_m4

    assert mfs30_bound_m4(_wing(3.0, 8.0)) == pytest.approx(8.0, abs=1e-12)
    assert mfs30_bound_m4(_wing(3.0, None)) == pytest.approx(2.0, abs=1e-12)


# -------------------------------------------------------------------------------- the profile reader


def _demo_with_port_table(table):
    """The Demo Islander's profile with ``moment_port_m4 = table`` in tank APT's transfer table."""
    doc = tomllib.loads(paths.DEMO_PROFILE.read_text(encoding="utf-8"))
    apt = next(t for t in doc["tank"] if t["id"] == "APT")
    apt["transfer"]["moment_port_m4"] = table(apt["transfer"]["moment_m4"])
    return tomli_w.dumps(doc)


def test_the_reader_takes_a_port_table_beside_the_starboard_one():
    """Read as written (the same shape as moment_m4); the other tanks have none."""
    doubled = _demo_with_port_table(lambda m: [[2.0 * x for x in row] for row in m])
    v = parse_profile(doubled, "demo.toml")
    apt = v.tank("APT")
    np.testing.assert_array_equal(apt.transfer.moment_port_m4, 2.0 * apt.transfer.moment_m4)
    assert v.tank("LO1").transfer.moment_port_m4 is None


@pytest.mark.parametrize("table, words", [
    (lambda m: m[:-1], "tank[APT].transfer.moment_port_m4"),
    (lambda m: [row[:-1] for row in m], "tank[APT].transfer.moment_port_m4"),
    (lambda m: [[1e9 for _ in row] for row in m], "tank[APT].transfer.moment_port_m4"),
])
def test_a_port_table_of_the_wrong_shape_or_beyond_the_tank_is_refused_by_name(table, words):
    """A row short, a column short, or moments no tank of this capacity can make (the bound the
    starboard table has, core/bounds.transfer_moment_range): refused, naming the key."""
    with pytest.raises(ProfileError) as e:
        parse_profile(_demo_with_port_table(table), "demo.toml")
    assert any(words in str(p) for p in e.value.problems), "\n".join(map(str, e.value.problems))


def test_the_30_degree_knot_of_the_posed_tables():
    """Guard on the posed tables above: at 30°, half-way between the 29° and 31° columns, M is the
    posed value (linear in heel), so the GZ formulas read m itself."""
    from deckload.core.free_surface import transfer_moment_m4

    t = _wing(3.0, 8.0)
    assert transfer_moment_m4(t, "actual", 50.0, np.array([math.radians(30.0)]))[0] == pytest.approx(2.0)
    assert transfer_moment_m4(t, "actual", 50.0, np.array([math.radians(30.0)]), port=True)[0] == pytest.approx(8.0)
