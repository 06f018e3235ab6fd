"""Geometry files: the demo file loads; broken files are rejected with every problem named
(file, line, dotted key, value, rule), all at once."""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from deckload.io.geometry_files import GeometryError, load_geometry, parse_geometry

ROOT = Path(__file__).resolve().parent.parent
DEMO = ROOT / "vessel_profiles" / "demo_islander.geometry.toml"

SMALL = """\
format = "deckload-geometry-1"

[vessel]
name = "Test box"
lbp_m = 20.0
breadth_m = 6.0
depth_m = 3.0
design_draft_m = 1.5

[hull]
station_x_m = [0.0, 10.0, 20.0]
waterline_z_m = [0.0, 3.0]
deck_z_m = [3.0, 3.0, 3.0]
half_breadth_m = [
  [3.0, 3.0],
  [3.0, 3.0],
  [3.0, 3.0],
]

[tables]
draft_m = [0.5, 1.0, 1.5, 2.0]
kn_displacement_t = [100.0, 200.0]
kn_heel_deg = [0.0, 30.0, 60.0, 90.0]
trim_basis = "even keel"

[[tank]]
id = "T1P"
name = "Tank 1 port"
kind = "ballast"
density_t_m3 = 1.025
pair = "T1S"
shape = "hull"
x_m = [2.0, 6.0]
y_m = [-3.0, 0.0]
z_m = [0.0, 1.0]

[[tank]]
id = "T1S"
name = "Tank 1 starboard"
kind = "ballast"
density_t_m3 = 1.025
pair = "T1P"
shape = "box"
x_m = [2.0, 6.0]
y_m = [0.0, 3.0]
z_m = [0.0, 1.0]
"""


def problems(text: str) -> list[str]:
    with pytest.raises(GeometryError) as e:
        parse_geometry(text, "bad.geometry.toml")
    return [str(p) for p in e.value.problems]


def test_demo_geometry_loads():
    g = load_geometry(DEMO)
    assert g.vessel.name == "Demo Islander"
    assert 20 <= len(g.tanks) <= 30
    assert len(g.hull.station_x_m) == 41
    ids = {t.id for t in g.tanks}
    assert all(t.pair in ids for t in g.tanks if t.pair)


def test_small_file_loads():
    g = parse_geometry(SMALL, "ok.toml")
    assert [t.id for t in g.tanks] == ["T1P", "T1S"]
    assert g.tanks[1].shape.shape == "box"


def test_non_monotonic_stations_and_waterlines():
    text = SMALL.replace("station_x_m = [0.0, 10.0, 20.0]", "station_x_m = [0.0, 10.0, 10.0]").replace(
        "waterline_z_m = [0.0, 3.0]", "waterline_z_m = [3.0, 0.0]"
    )
    got = problems(text)
    assert any(re.match(r"bad\.geometry\.toml:11: hull\.station_x_m = \[0, 10, 10\]: not strictly increasing "
                        r"\(value 3: 10 after 10\)", p) for p in got), got
    assert any("bad.geometry.toml:12: hull.waterline_z_m = [3, 0]: not strictly increasing" in p for p in got), got


def test_negative_half_breadth_names_station_and_waterline():
    got = problems(SMALL.replace("  [3.0, 3.0],\n  [3.0, 3.0],\n  [3.0, 3.0],", "  [3.0, 3.0],\n  [3.0, -0.5],\n  [3.0, 3.0],"))
    assert any("hull.half_breadth_m" in p and "negative half-breadth -0.5 m at station x = 10 m, waterline z = 3 m" in p
               for p in got), got


def test_wrong_row_count_and_deck_above_waterlines():
    text = SMALL.replace("  [3.0, 3.0],\n  [3.0, 3.0],\n  [3.0, 3.0],", "  [3.0, 3.0],\n  [3.0, 3.0],").replace(
        "deck_z_m = [3.0, 3.0, 3.0]", "deck_z_m = [3.0, 3.5, 3.0]")
    got = problems(text)
    assert any("hull.half_breadth_m" in p and "one row per station (3 rows)" in p for p in got), got
    assert any(p.startswith("bad.geometry.toml:13: hull.deck_z_m") and "station 2" in p for p in got), got


def test_tank_outside_the_hull_and_bad_pair_all_reported():
    text = SMALL.replace('y_m = [0.0, 3.0]', 'y_m = [0.0, 3.5]').replace('pair = "T1P"', 'pair = "T9"')
    got = problems(text)
    assert any(p.startswith("bad.geometry.toml:") and "tank[T1S].y_m = [0, 3.5]" in p and "sticks out of the hull" in p
               for p in got), got
    assert any("tank[T1S].pair = 'T9': no tank with this id" in p for p in got), got
    # T1P still names T1S, which no longer names it back: that is reported against T1P too.
    assert any(p.startswith("bad.geometry.toml:31: tank[T1P].pair = 'T1S'") and "does not name T1P back" in p
               and "'T9'" in p for p in got), got
    assert len(got) == 3, got


def test_hull_tank_with_no_volume():
    text = SMALL.replace('z_m = [0.0, 1.0]\n\n[[tank]]', 'z_m = [3.5, 4.0]\n\n[[tank]]')
    got = problems(text)
    assert any("tank[T1P]" in p and "outside the hull" in p for p in got), got


def test_unknown_key_missing_key_and_bad_kind():
    text = SMALL.replace('kind = "ballast"\ndensity_t_m3 = 1.025\npair = "T1S"',
                         'kind = "bilge"\npair = "T1S"\ncolour = "red"')
    got = problems(text)
    assert any("tank[T1P].kind = 'bilge': must be one of" in p for p in got), got
    assert any("tank[T1P].density_t_m3: missing (required)" in p for p in got), got
    assert any("tank[T1P].colour = 'red': unknown key" in p for p in got), got


def test_tables_checks():
    text = SMALL.replace("kn_heel_deg = [0.0, 30.0, 60.0, 90.0]", "kn_heel_deg = [5.0, 30.0, 60.0, 95.0]").replace(
        "draft_m = [0.5, 1.0, 1.5, 2.0]", "draft_m = [0.5, 1.0, 1.5, 3.5]")
    got = problems(text)
    assert any("tables.kn_heel_deg" in p and "must start at 0" in p for p in got), got
    assert any("tables.draft_m" in p and "above the lowest deck" in p for p in got), got


def test_syntax_error_names_the_line():
    got = problems(SMALL.replace("lbp_m = 20.0", "lbp_m = = 20.0"))
    assert len(got) == 1 and got[0].startswith("bad.geometry.toml:5:") and "TOML syntax" in got[0]


def test_missing_file(tmp_path):
    with pytest.raises(GeometryError) as e:
        load_geometry(tmp_path / "none.geometry.toml")
    assert "cannot read the file" in str(e.value)


PRISM = """
[[tank]]
id = "W1"
name = "Wedge"
kind = "fresh_water"
density_t_m3 = 1.0
shape = "prism"
x_m = [8.0, 12.0]
section_y_m = [0.0, 2.0, 0.0]
section_z_m = [0.5, 1.5, 1.5]
"""


def test_prism_tank_inside_and_outside():
    g = parse_geometry(SMALL + PRISM, "ok.toml")
    w = g.tanks[-1]
    assert w.shape.shape == "prism" and list(w.shape.section_y_m) == [0.0, 2.0, 0.0]
    got = problems(SMALL + PRISM.replace("section_y_m = [0.0, 2.0, 0.0]", "section_y_m = [0.0, 4.0, 0.0]"))
    assert any("tank[W1].section_y_m" in p and "sticks out of the hull" in p for p in got), got
    got = problems(SMALL + PRISM.replace('shape = "prism"', 'shape = "prism"\ny_m = [0.0, 1.0]'))
    assert any("tank[W1].y_m = [0, 1]: not used by a prism" in p for p in got), got


def test_an_empty_tank_name_is_refused_because_the_profile_would_not_load():
    """`deckload tables` must not write a profile that its own loader rejects."""
    from pathlib import Path

    import pytest

    from deckload.io.geometry_files import GeometryError, parse_geometry

    demo = Path(__file__).resolve().parents[1] / "vessel_profiles" / "demo_islander.geometry.toml"
    text = demo.read_text(encoding="utf-8")
    first = text.index("[[tank]]")
    name_at = text.index("name = ", first)
    end = text.index("\n", name_at)
    broken = text[:name_at] + 'name = ""' + text[end:]
    with pytest.raises(GeometryError) as e:
        parse_geometry(broken, "empty_name.geometry.toml")
    assert any(p.key.endswith(".name") and "must not be empty" in p.rule for p in e.value.problems)
