"""A tank table printed only to 98 % of the tank (``table_top_pct``).

Many booklets print a tank's table, and the capacity beside it, only up to 98 % (common practice
for fuel tanks).  Typed as if its top were 100 %, a tank sounded at 97 % of its volume reads 99 %
of the typed capacity, is taken as nominally full and its free surface dropped: a booklet-conventions
audit found a NOT MET condition read Met that way (area 30–40° 0.032 against a true 0.024), with
neither ``check`` nor the worked conditions able to see it.  With ``table_top_pct = 98`` the
fills are percent of the whole tank again.

The vessel is the box barge of ``tests/broken_profiles/box_barge.toml`` (checks.md §1), whose two
double-bottom tanks are boxes 10 × 5 × 1 m (V = 50·s m³, i = l·b³/12 = 104.1667 m⁴ at every level,
derived in that file's header); here their tables stop at the 0.98 m sounding, 49 m³ = 98 %.
"""

from __future__ import annotations

import pytest

from deckload.core.loading import LoadingError, volume_of
from deckload.core.stability import evaluate
from deckload.io.profiles import ProfileError, parse_condition, parse_profile
from deckload.ui import entry
from test_profiles import BASE, edit

L_M, B_M, RHO = 10.0, 5.0, 1.025
I_BOX_M4 = L_M * B_M**3 / 12.0
"""A box tank's free-surface inertia about its own centre line, i = l·b³/12 (analytic)."""


def short(text: str = BASE, capacity: str = "49.0", key: str = "table_top_pct = 98\n") -> str:
    """The base profile with both double-bottom tables printed to the 0.98 m sounding (49 m³)."""
    for old, new in (("capacity_m3 = 50.0\n", f"capacity_m3 = {capacity}\n{key}"),
                     ("sounding_m = [0.0, 0.5, 1.0]", "sounding_m = [0.0, 0.5, 0.98]"),
                     ("volume_m3 = [0.0, 25.0, 50.0]", "volume_m3 = [0.0, 25.0, 49.0]"),
                     ("vcg_m = [0.0, 0.25, 0.5]", "vcg_m = [0.0, 0.25, 0.49]")):
        assert text.count(old) == 2
        text = text.replace(old, new)
    return text


def cond(vessel, body: str):
    text = 'format = "deckload-condition-1"\n[condition]\nname = "c"\nwater_density_t_m3 = 1.025\n' + body
    return parse_condition(text, "c.condition.toml", vessel)


def both_sounded(s_m: float) -> str:
    return f"[tanks.DB1P]\nsounding_m = {s_m}\n[tanks.DB1S]\nsounding_m = {s_m}\n"


def test_the_capacity_is_the_whole_tank_whether_typed_as_printed_at_98_or_at_100():
    for typed in ("49.0", "50.0"):
        v = parse_profile(short(capacity=typed), "b.toml")
        t = v.tank("DB1P")
        assert t.table_top_pct == 98.0 and t.short_table
        assert t.capacity_m3 == pytest.approx(50.0, rel=1e-12)  # 49 m³ ÷ 0.98
        assert t.fill_limit_m3 == 49.0


def test_a_tank_sounded_at_97_percent_of_its_volume_keeps_its_free_surface():
    """IS 2008 Part B 3.1.2 (standards.md §4.1): a tank below 98 % full is counted.  Sounded at
    0.97 m the box holds 48.5 m³, 97 % of its 50 m³; as a fixed-level ballast tank its moment is
    ρ·i at the actual level (B 3.1.3) = 1.025 × 104.1667 t·m each (analytic, i = l·b³/12)."""
    v = parse_profile(short(), "b.toml")
    r = evaluate(v, cond(v, both_sounded(0.97)))
    for t in r.tanks:
        assert t.fill_pct == pytest.approx(97.0, abs=1e-9)
        assert t.state != "full"
        assert t.fsm_tm == pytest.approx(RHO * I_BOX_M4, rel=1e-6)
    assert r.fsm_total_tm == pytest.approx(2 * RHO * I_BOX_M4, rel=1e-6)


def test_at_the_top_of_its_table_the_tank_is_nominally_full():
    """The table's last row is 98 % of the tank: nominally full, no correction for a ballast tank
    (IS 2008 Part B 3.1.2, standards.md §4.1)."""
    v = parse_profile(short(), "b.toml")
    r = evaluate(v, cond(v, both_sounded(0.98)))
    for t in r.tanks:
        assert t.fill_pct == pytest.approx(98.0, abs=1e-9)
        assert t.state == "full" and t.fsm_tm == 0.0
    r = evaluate(v, cond(v, "[tanks.DB1P]\npercent = 98\n[tanks.DB1S]\nvolume_m3 = 49.0\n"))
    assert [t.state for t in r.tanks] == ["full", "full"]


def test_no_fill_above_the_tables_top_is_taken_from_a_file_or_from_the_screen():
    v = parse_profile(short(), "b.toml")
    t = v.tank("DB1P")
    for body, said in (("percent = 99", "above 98 %, the top of the tank's table (table_top_pct)"),
                       ("volume_m3 = 49.5", "above 49 m³, the top of the tank's table"),
                       ("mass_t = 50.5", "above 50.225 t, the top of the tank's table 49 m³ × 1.025 t/m³")):
        with pytest.raises(ProfileError) as ei:
            cond(v, f"[tanks.DB1P]\n{body}\n")
        assert said in str(ei.value), str(ei.value)
    with pytest.raises(LoadingError, match=r"99 % is above the top of its table, 49.00 m³ \(98 % of its capacity"):
        volume_of(t, "percent", 99.0, RHO)
    with pytest.raises(LoadingError, match="exceeds the top of its table"):
        volume_of(t, "volume_m3", 49.5, RHO)
    c = cond(v, "")
    for typed, said in (("99%", "is more than 98 %, the top of its table"),
                        ("49.5m3", "is more than the top of its table 49.00 m³"),
                        ("50.5t", "is more than the top of its table 50.22 t")):
        with pytest.raises(entry.EntryError, match=said):
            entry.set_tank(c, t, *entry.parse_amount(typed))
    assert volume_of(t, "percent", 98.0, RHO) == pytest.approx(49.0, rel=1e-12)


def test_a_nudge_stops_and_a_transfer_fills_only_to_the_tables_top():
    v = parse_profile(short(), "b.toml")
    p, s = v.tank("DB1P"), v.tank("DB1S")
    c = entry.set_tank(cond(v, ""), p, "percent", 97.5)
    c = entry.nudge_tank(c, p, 1.0, v)
    assert c.tank_fill("DB1P").value == 98.0
    with pytest.raises(entry.EntryError, match="already full"):
        entry.nudge_tank(c, p, 1.0, v)
    c = entry.set_tank(c, s, "volume_m3", 10.0)
    # room in DB1P: 49 − 49 = 0; in DB1S 39 m³
    assert entry.planner_room(v, c, "DB1P", "DB1S") == pytest.approx(39.0 * RHO, rel=1e-6)
    assert entry.planner_room(v, c, "DB1S", "DB1P") == pytest.approx(0.0, abs=1e-6)
    with pytest.raises(entry.EntryError, match="room for only 0.00 m³"):
        entry.plan_transfer(v, c, "DB1S", "DB1P", "1m3")
    assert entry.receiving_tank(v, c, "DB1P") == "DB1S"
    assert entry.receiving_tank(v, entry.set_tank(c, s, "percent", 98.0), "DB1P") == ""


def test_a_capacity_two_percent_above_the_tables_top_suggests_the_key():
    with pytest.raises(ProfileError) as ei:
        parse_profile(short(capacity="50.0", key=""), "b.toml")
    (p, *_) = ei.value.problems
    assert p.key == "tank[DB1P].capacity_m3"
    assert ("the table's last row is 98 % of it: if the booklet prints the table only to 98 % of the tank, "
            "say so with table_top_pct = 98") in p.rule


@pytest.mark.parametrize("value", ["85", "100.5", "0"])
def test_a_table_top_outside_90_to_100_percent_is_refused(value):
    with pytest.raises(ProfileError) as ei:
        parse_profile(short(key=f"table_top_pct = {value}\n"), "b.toml")
    p = ei.value.problems[0]
    assert p.key == "tank[DB1P].table_top_pct" and "90" in p.rule and "100" in p.rule


def test_a_tank_known_only_by_capacity_takes_no_table_top():
    text = edit(BASE, "capacity_m3 = 50.0\n", "capacity_m3 = 50.0\ntable_top_pct = 98\nlcg_m = 10.0\nvcg_m = 0.5\n"
                "tcg_m = -2.5\n")
    at = text.index("  [tank.calibration]")
    end = text.index("[[tank]]", at)
    text = text[:at] + text[end:]
    with pytest.raises(ProfileError) as ei:
        parse_profile(text, "b.toml")
    assert any(p.key == "tank[DB1P].table_top_pct" and "without a calibration table" in p.rule for p in ei.value.problems)


async def test_the_screens_full_key_fills_to_the_tables_top(tmp_path):
    """f takes a tank to its kind's usual maximum, then to 100 %: for a table printed to 98 % both
    stop at its top (100 % would be refused as above the table)."""
    from deckload.core.model import Condition, TankFill
    from deckload.ui.launch import create_app

    v = parse_profile(short(), "b.toml")
    app = create_app(v, Condition(name="Pilot", tanks=(TankFill("DB1P", "percent", 50.0),)),
                     work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("f")
        assert app.session.condition.tank_fill("DB1P").value == 98.0
        assert app.session.problem is None
        assert [t.state for t in app.session.result.tanks if t.id == "DB1P"] == ["full"]
        await pilot.press("f")
        assert app.session.condition.tank_fill("DB1P").value == 98.0 and app.session.problem is None
        # (said so, not "No change: the value is the same as before")
        assert app.screen._said == ("DB1P is already full: 98 % is the top of its table.", False)


async def test_the_tank_hint_outside_the_tables_has_no_empty_free_surface_field(tmp_path):
    """Both tanks empty, the barge's 400 t lightship is below her KN table (410 t): no result at all
    from the start, so the tank hint on the message line has no free-surface rule to give; it said
    "FSM:  ·" (found by a real-terminal trial)."""
    from deckload.core.model import Condition
    from deckload.ui.launch import create_app

    v = parse_profile(short(), "b.toml")
    app = create_app(v, Condition(name="Light"), work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(160, 40)) as pilot:
        await pilot.press("down", "up")
        await pilot.pause()
        assert app.session.result is None
        said, _ = app.screen._said
        assert said.startswith("DB1P ") and "FSM:" not in said and "·  ·" not in said, said
