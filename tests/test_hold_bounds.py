"""A hold's stowage factor and cargo centre are bounded by physics, from a file and in the model.

The stowage factor lies between the specific volume of solid lead (1/11.34 = 0.0882 m³/t) and
that of air (1/0.0012 = 833 m³/t) — both densities from memory (deckload.core.bounds).  The
cargo's VCG lies between the hold's floor and top as its fill table gives them: the floor is the
centroid at 0 % fill and the top the level at 100 %, d(f·z̄)/df on the last segment (derived in
deckload.core.bounds.hold_floor_top_m).
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core import bounds
from deckload.core.loading import LoadingError, hold_item
from deckload.core.model import HoldLoad
from deckload.io import paths
from deckload.io.profiles import parse_condition
from deckload.io.tomlcheck import ProfileError
from demo_vessels import trawler_vessel

GROUNDS = paths.TRAWLER_CONDITIONS["grounds"].read_text(encoding="utf-8")
FILE = "demo_trawler.grounds.condition.toml"


def grounds(*, stowage: str = "2.2", extra: str = "", mass: str = "27.0") -> str:
    text = GROUNDS.replace("mass_t = 27.0\nstowage_m3_t = 2.2\n", f"mass_t = {mass}\nstowage_m3_t = {stowage}\n{extra}", 1)
    assert text != GROUNDS or (stowage, extra, mass) == ("2.2", "", "27.0")
    return text


def problem(text: str):
    with pytest.raises(ProfileError) as ei:
        parse_condition(text, FILE, trawler_vessel())
    ps = ei.value.problems
    assert len(ps) == 1, "\n".join(map(str, ps))
    return ps[0], str(ps[0])


@pytest.mark.parametrize("sf", ["1e-300", "0.01", "0.08"])
def test_a_stowage_factor_denser_than_solid_lead_is_refused(sf):
    """27 t at 0.01 m³/t (100 t/m³) was put at the hold's floor: KG 2.693 → 2.597 m, GM 0.858 → 0.955 m.
    Real cargo still passes: steel stows no denser than 0.127 m³/t (solid steel 7.85 t/m³, common
    practice), fish in ice at 2–2.5 m³/t (from memory)."""
    p, text = problem(grounds(stowage=sf))
    assert p.key == "holds.FH.stowage_m3_t" and p.file == FILE
    assert "must be between 0.0881834 and 833.333 m³/t" in text and "solid lead" in text
    for ok, mass in (("0.13", "27.0"), ("2.2", "27.0"), ("2.3", "55.0"), ("4.9", "27.0")):
        c = parse_condition(grounds(stowage=ok, mass=mass), FILE, trawler_vessel())
        assert c.holds[0].stowage_m3_t == float(ok)


def test_a_stowage_factor_lighter_than_air_is_refused():
    """0.1 t at 900 m³/t is 90 m³, inside the hold's 133.3 m³: only the air bound refuses it."""
    p, text = problem(grounds(stowage="900.0", mass="0.1"))
    assert p.key == "holds.FH.stowage_m3_t" and "above the physical limit" in text


def test_floor_and_top_of_the_fish_hold_from_its_fill_table():
    """Table rows 90 % 2.220 m and 100 % 2.372 m: top = 2.372 + 100·0.152/10 = 3.892 m (derived); the
    hull geometry the demo booklet was invented from puts the hold between z 0.7 and 3.9 m
    (vessel_profiles/demo_trawler.geometry.toml)."""
    floor, top = bounds.hold_floor_top_m(trawler_vessel().hold("FH"))
    assert floor == pytest.approx(0.700, abs=1e-12)
    assert top == pytest.approx(3.892, abs=1e-9)
    assert top == pytest.approx(3.9, abs=0.01)


@pytest.mark.parametrize("z", ["0.0", "0.69", "3.95"])
def test_a_vcg_override_outside_the_hold_is_refused(z):
    """vcg_m 0.0 below the hold's 0.70 m floor gave KG 2.514 m, GM 1.04 m.  Inside the hold an
    override passes, even above the full hold's centroid 2.372 m (cargo on the top shelves of a
    part-filled hold)."""
    p, text = problem(grounds(extra=f"vcg_m = {z}\n"))
    assert p.key == "holds.FH.vcg_m" and p.file == FILE
    assert "must be between 0.7 and 3.892 m" in text and "hold FH" in text
    c = parse_condition(grounds(extra="vcg_m = 3.0\n"), FILE, trawler_vessel())
    assert c.holds[0].vcg_m == 3.0


def test_the_model_refuses_what_a_file_cannot_give():
    """A condition made in code is held to the same bounds in hold_item."""
    hold = trawler_vessel().hold("FH")
    with pytest.raises(LoadingError, match="hold FH: stowage factor 0.01 m³/t is below the physical limit"):
        hold_item(hold, HoldLoad("FH", 27.0, stowage_m3_t=0.01))
    with pytest.raises(LoadingError, match=r"hold FH: VCG 0 m is outside the hold, whose floor is at 0.7 m and top at 3.892 m"):
        hold_item(hold, HoldLoad("FH", 27.0, vcg_m=0.0))
    assert hold_item(hold, HoldLoad("FH", 27.0, vcg_m=3.0)).vcg_m == 3.0


def test_the_capacity_holds_without_a_fill_table_too():
    """27 t at 5 m³/t is 135 m³, more than the hold's 133.3 m³: refused with or without a fill table
    (before, a hold without one took any volume)."""
    bare = dataclasses.replace(trawler_vessel().hold("FH"), fill_pct=None, fill_vcg_m=None, fill_lcg_m=None)
    with pytest.raises(LoadingError, match="needs 135.0 m³, more than its 133.3 m³"):
        hold_item(bare, HoldLoad("FH", 27.0, stowage_m3_t=5.0))


def test_a_mass_typed_in_kilograms_is_said_to_look_like_kilograms():
    """The fish hold's 27 t typed in kg (27000) from a file: above the structural limit 55 t, and the
    message adds that it looks like kilograms (a hold of 2100 t typed 2 100 000 was told only that
    it exceeded the limit; found by an audit).  Rule (bounds.kilograms_hint, common practice): at
    least 20 times the limit, with its thousandth within the limit; 60 t is an overload one could
    mean, and is told only the limit."""
    p, text = problem(grounds(mass="27000.0"))
    assert p.key == "holds.FH.mass_t" and text.endswith(
        "above 55 t, the hold's structural limit (max_mass_t in the profile); it looks like kilograms: 27 t?")
    p, text = problem(grounds(mass="60.0"))  # 1.09 × the limit: an overload, not kilograms
    assert "structural limit" in text and "kilograms" not in text


@pytest.mark.parametrize("x, low, high, says", [
    (27000.0, 0.0, 55.0, "; it looks like kilograms: 27 t?"),
    (1100.0, 0.0, 55.0, "; it looks like kilograms: 1.1 t?"),   # exactly 20 times the limit
    (1099.9, 0.0, 55.0, ""),                                    # under 20 times: a mistyped load, not kg
    (110.0, 0.0, 55.0, ""),                                     # twice: an overload one could mean (review)
    (56000.0, 0.0, 55.0, ""),                                   # a thousandth, 56 t, is still over
    (1_300_000.0, 88.484, 4424.2, "; it looks like kilograms: 1300 t?"),  # a lightship
    (50_000.0, 88.484, 4424.2, ""),                             # 50 t: below the least lightship
    (float("inf"), 0.0, 55.0, ""),
])
def test_the_kilograms_hint_rule(x, low, high, says):
    assert bounds.kilograms_hint(x, low, high) == says


def test_a_physical_mass_bound_says_kilograms_too():
    """A mass bound of bounds.Range (tonnes) adds the hint; a bound in metres never does."""
    r = bounds.Range(0.0, 3124.2, "t", "at most the greatest displacement less the lightship")
    assert r.rule(150000.0).endswith("(at most the greatest displacement less the lightship); it looks like kilograms: 150 t?")
    assert "kilograms" not in bounds.Range(0.0, 31.0, "m", "within the hull").rule(15000.0)
