"""Loading conditions: validation against the vessel, lossless round trip, atomic save.

The vessel is the box barge of checks.md §1 (L=40, B=10, D=4),
``tests/broken_profiles/box_barge.toml``: two 50 m³ double-bottom ballast tanks
DB1P/DB1S (sounding 0–1 m), hold H1 of 600 m³, deck area DECK; hydrostatics for
Δ = 205–1435 t, KN curves for Δ = 410–1230 t.
"""

from __future__ import annotations

import os
import stat
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import deckload.io.atomicfile as atomicfile
import deckload.io.profiles as profiles
from deckload.cli.check import run_check
from deckload.core import model as m
from deckload.io.profiles import (
    Problem,
    ProfileError,
    dump_condition,
    load_condition,
    load_profile,
    parse_condition,
    save_condition,
)

HERE = Path(__file__).parent
PROFILE_PATH = HERE / "broken_profiles" / "box_barge.toml"
VESSEL = load_profile(PROFILE_PATH)

GOOD = """\
format = "deckload-condition-1"

[condition]
name = "Test departure"
remark = "ballast both sides"
water_density_t_m3 = 1.025
load_line = "summer"

[tanks.DB1S]
percent = 50.0

[tanks.DB1P]
sounding_m = 0.5

[holds.H1]
mass_t = 200.0
stowage_m3_t = 1.5
description = "bagged cement"

[[deck_item]]
name = "Excavator"
mass_t = 20.0
lcg_m = 20.0
vcg_m = 5.5
area = "DECK"
footprint_m2 = 8.0

[[constant]]
name = "Crew and effects"
mass_t = 1.2
lcg_m = 30.0
vcg_m = 6.0
"""


def edit(text: str, old: str, new: str) -> str:
    assert old in text, old
    return text.replace(old, new, 1)


def line_of(text: str, fragment: str) -> int:
    return next(i for i, line in enumerate(text.splitlines(), 1) if fragment in line)


def problems(text: str) -> list[Problem]:
    with pytest.raises(ProfileError) as ei:
        parse_condition(text, "c.condition.toml", VESSEL)
    return ei.value.problems


def only(text: str) -> Problem:
    ps = problems(text)
    assert len(ps) == 1, "\n".join(map(str, ps))
    assert ps[0].file == "c.condition.toml"
    return ps[0]


# --------------------------------------------------------------------------- reading


def test_good_condition_reads_in_file_order():
    c = parse_condition(GOOD, "c.toml", VESSEL)
    assert c.name == "Test departure" and c.water_density_t_m3 == 1.025
    assert c.tanks == (m.TankFill("DB1S", "percent", 50.0), m.TankFill("DB1P", "sounding_m", 0.5))
    assert c.holds == (m.HoldLoad("H1", 200.0, stowage_m3_t=1.5, description="bagged cement"),)
    assert c.deck_items == (m.DeckItem("Excavator", 20.0, 20.0, 5.5, 0.0, area_id="DECK", footprint_m2=8.0),)
    assert c.constants == (m.MassItem("Crew and effects", 1.2, 30.0, 6.0, 0.0),)
    assert c.fs_rule is None and c.gz_correction is None


# --------------------------------------------------------------------------- broken conditions


def test_unknown_tank_id():
    text = edit(GOOD, "[tanks.DB1S]", "[tanks.DB1X]")
    p = only(text)
    assert (p.key, p.line) == ("tanks.DB1X", line_of(text, "[tanks.DB1X]"))
    assert p.rule == "no tank with this id in the vessel profile (did you mean 'DB1S'?)"


def test_unknown_hold_and_deck_area():
    text = edit(GOOD, "[holds.H1]", "[holds.H2]")
    text = edit(text, 'area = "DECK"', 'area = "DEK"')
    ps = problems(text)
    assert [(p.key, p.line) for p in ps] == [
        ("holds.H2", line_of(text, "[holds.H2]")),
        ("deck_item[#1].area", line_of(text, 'area = "DEK"')),
    ]
    assert ps[0].rule == "no hold with this id in the vessel profile (it has H1)"
    assert ps[1].rule == "no deck area with this id in the vessel profile (did you mean 'DECK'?)"


def test_two_fill_quantities_for_one_tank():
    text = edit(GOOD, "percent = 50.0", "percent = 50.0\nmass_t = 20.0")
    p = only(text)
    assert (p.key, p.line, p.value) == ("tanks.DB1S", line_of(text, "[tanks.DB1S]"), None)
    assert p.rule == "states percent and mass_t: give exactly one quantity per tank"


def test_no_fill_quantity():
    text = edit(GOOD, "percent = 50.0", "density_t_m3 = 1.0")
    p = only(text)
    assert p.key == "tanks.DB1S"
    assert p.rule == "states no quantity: give exactly one of percent, volume_m3, mass_t, sounding_m, ullage_m"


def test_percent_above_100():
    text = edit(GOOD, "percent = 50.0", "percent = 120.0")
    p = only(text)
    assert (p.key, p.value, p.line) == ("tanks.DB1S.percent", "120.0", line_of(text, "percent = 120.0"))
    assert p.rule == "above 100 % (full)"


def test_negative_percent():
    p = only(edit(GOOD, "percent = 50.0", "percent = -5.0"))
    assert (p.key, p.rule) == ("tanks.DB1S.percent", "must not be negative")


def test_volume_above_capacity():
    p = only(edit(GOOD, "percent = 50.0", "volume_m3 = 50.5"))
    assert (p.key, p.rule) == ("tanks.DB1S.volume_m3", "above 50 m³, the tank's capacity")


def test_mass_above_capacity_uses_the_density_override():
    # capacity 50 m³ × 1.025 t/m³ = 51.25 t: 51 t fits the tank's default density ...
    parse_condition(edit(GOOD, "percent = 50.0", "mass_t = 51.0"), "c.toml", VESSEL)
    # ... but not fresh water: 50 m³ × 1.0 t/m³ = 50 t
    p = only(edit(GOOD, "percent = 50.0", "mass_t = 51.0\ndensity_t_m3 = 1.0"))
    assert (p.key, p.value) == ("tanks.DB1S.mass_t", "51.0")
    assert p.rule == "above 50 t, the tank's capacity 50 m³ × 1 t/m³"


def test_sounding_outside_calibration():
    text = edit(GOOD, "sounding_m = 0.5", "sounding_m = 1.2")
    p = only(text)
    assert (p.key, p.line) == ("tanks.DB1P.sounding_m", line_of(text, "sounding_m = 1.2"))
    assert p.rule == ("above 1 m: must be between 0 and 1 m (the soundings of the tank's calibration table, "
                      "from 0; nothing is extrapolated)")


def test_negative_mass_of_a_constant():
    """A constant is named by its number and its name, as a tank by its id (it was 'constant[#1]'
    alone; found by an audit)."""
    text = edit(GOOD, "mass_t = 1.2", "mass_t = -1.2")
    p = only(text)
    assert (p.key, p.value, p.rule) == ('constant[#1 "Crew and effects"].mass_t', "-1.2", "must not be negative")
    assert p.line == line_of(text, "mass_t = -1.2")


def test_water_density_says_which_bound():
    p = only(edit(GOOD, "water_density_t_m3 = 1.025", "water_density_t_m3 = 0.95"))
    assert p.key == "condition.water_density_t_m3"
    assert p.rule == "below 0.99 t/m³: must be between 0.99 and 1.04 t/m³ (fresh water 1.000, sea water about 1.025)"
    p = only(edit(GOOD, "water_density_t_m3 = 1.025", "water_density_t_m3 = 1.25"))
    assert p.rule.startswith("above 1.04 t/m³")


def test_tank_density_override_range():
    p = only(edit(GOOD, "percent = 50.0", "percent = 50.0\ndensity_t_m3 = 0.3"))
    assert p.key == "tanks.DB1S.density_t_m3"
    assert p.rule.startswith("below 0.5 t/m³")


def test_hold_cargo_volume_above_capacity():
    # 500 t × 1.5 m³/t = 750 m³ > 600 m³
    p = only(edit(GOOD, "mass_t = 200.0", "mass_t = 500.0"))
    assert p.key == "holds.H1.mass_t"
    assert p.rule == "× stowage_m3_t 1.5 = 750 m³, above the hold's capacity 600 m³"


def test_unknown_key_in_a_tank_entry():
    text = edit(GOOD, "percent = 50.0", "percent = 50.0\ndensity = 1.0")
    p = only(text)
    assert (p.key, p.line) == ("tanks.DB1S.density", line_of(text, "density = 1.0"))
    assert p.rule == "unknown key (did you mean 'density_t_m3'?)"


def test_unknown_load_line():
    p = only(edit(GOOD, 'load_line = "summer"', 'load_line = "winter"'))
    assert (p.key, p.rule) == ("condition.load_line", 'must be one of "summer"')


def test_missing_water_density():
    text = edit(GOOD, "water_density_t_m3 = 1.025\n", "")
    p = only(text)
    assert (p.key, p.line, p.rule) == ("condition.water_density_t_m3", line_of(text, "[condition]"), "required key is missing")


def test_three_problems_in_one_condition():
    text = edit(GOOD, "percent = 50.0", "percent = 150.0")
    text = edit(text, "sounding_m = 0.5", "sounding_m = 0.5\nvolume_m3 = 2.0")
    text = edit(text, "vcg_m = 6.0", 'vcg_m = "six"')
    ps = problems(text)
    assert [(p.key, p.line) for p in ps] == [
        ("tanks.DB1S.percent", line_of(text, "percent = 150.0")),
        ("tanks.DB1P", line_of(text, "[tanks.DB1P]")),
        ('constant[#1 "Crew and effects"].vcg_m', line_of(text, 'vcg_m = "six"')),
    ]


def test_condition_syntax_error():
    text = edit(GOOD, "percent = 50.0", "percent = 50.0 %")
    p = only(text)
    assert p.line == line_of(text, "percent = 50.0 %") and p.rule.startswith("TOML syntax")


# --------------------------------------------------------------------------- round trip


def test_round_trip_of_the_good_condition():
    c = parse_condition(GOOD, "c.toml", VESSEL)
    text = dump_condition(c)
    assert parse_condition(text, "d.toml", VESSEL) == c
    assert dump_condition(parse_condition(text, "d.toml", VESSEL)) == text
    # tanks keep their order (DB1S was entered first)
    assert text.index("[tanks.DB1S]") < text.index("[tanks.DB1P]")
    assert "[[deck_item]]" in text and "[[constant]]" in text


def test_round_trip_keeps_every_field():
    c = m.Condition(
        name='Arrival "light", 10 % stores',
        remark="Line one; line two — ünïcode",  # one line: a file refuses a line break (test_reader_parity)
        water_density_t_m3=1.0,
        tanks=(
            m.TankFill("DB1P", "mass_t", 0.1 + 0.2, density_t_m3=1.0),
            m.TankFill("DB1S", "volume_m3", 12.345678901234567),
        ),
        holds=(m.HoldLoad("H1", 150.0, stowage_m3_t=None, lcg_m=25.0, vcg_m=2.0, tcg_m=-0.25, description=""),),
        deck_items=(m.DeckItem("Box", 3.0, 10.0, 4.5, 1.0), m.DeckItem("Tank container", 30.0, 12.0, 5.3, -2.0, "DECK", 15.0)),
        constants=(m.MassItem("Stores", 2.0, 35.0, 5.0),),
        fs_rule="actual",
        gz_correction="transfer",
        load_line="summer",
    )
    assert parse_condition(dump_condition(c), "d.toml", VESSEL) == c


_finite = dict(allow_nan=False, allow_infinity=False)


@settings(max_examples=60, deadline=None)
@given(
    pct=st.floats(0.0, 100.0, **_finite),
    vol=st.floats(0.0, 50.0, **_finite),
    hold_t=st.floats(0.0, 400.0, **_finite),
    # names: any printable text (control, format and line/paragraph separators are refused by design)
    xs=st.lists(st.tuples(st.text(st.characters(blacklist_categories=("Cc", "Cs", "Cf", "Zl", "Zp")),
                                  min_size=1, max_size=20).filter(str.strip), st.floats(0.0, 50.0, **_finite),
                          st.floats(-5.0, 45.0, **_finite), st.floats(0.0, 12.0, **_finite),
                          st.floats(-5.0, 5.0, **_finite)), max_size=4),
    reverse=st.booleans(),
)
def test_round_trip_property(pct, vol, hold_t, xs, reverse):
    """parse(dump(c)) == c for arbitrary valid finite values: floats survive exactly."""
    fills = (m.TankFill("DB1P", "percent", pct), m.TankFill("DB1S", "volume_m3", vol))
    c = m.Condition(
        name="Property",
        tanks=fills[::-1] if reverse else fills,
        holds=(m.HoldLoad("H1", hold_t, stowage_m3_t=1.5),),
        # a deck load weighs more than 0 t (a constant may be 0 t)
        deck_items=tuple(m.DeckItem(x[0], x[1] if x[1] > 0.0 else 0.5, *x[2:]) for x in xs),
        constants=tuple(m.MassItem(*x) for x in xs),
    )
    assert parse_condition(dump_condition(c), "p.toml", VESSEL) == c


# --------------------------------------------------------------------------- atomic save


def _cond(name: str) -> m.Condition:
    return parse_condition(edit(GOOD, 'name = "Test departure"', f'name = "{name}"'), "c.toml", VESSEL)


def test_save_and_load(tmp_path):
    f = tmp_path / "a.condition.toml"
    save_condition(f, _cond("first"))
    assert load_condition(f, VESSEL) == _cond("first")
    save_condition(f, _cond("second"))
    assert load_condition(f, VESSEL).name == "second"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["a.condition.toml"]


def test_save_keeps_the_file_mode(tmp_path):
    f = tmp_path / "a.condition.toml"
    save_condition(f, _cond("first"))
    os.chmod(f, 0o640)
    save_condition(f, _cond("second"))
    assert stat.S_IMODE(os.stat(f).st_mode) == 0o640


@pytest.mark.parametrize("where", ["write", "fsync", "replace"])
def test_failed_save_leaves_the_old_file_intact(tmp_path, monkeypatch, where):
    f = tmp_path / "a.condition.toml"
    save_condition(f, _cond("first"))
    before = f.read_bytes()

    def boom(*a, **k):
        raise OSError(28, "No space left on device")

    if where == "write":
        def half_then_boom(fh, data):
            fh.write(data[: len(data) // 2])  # a torn write, as on a full disk
            boom()
        monkeypatch.setattr(atomicfile, "_write_all", half_then_boom)
    elif where == "fsync":
        monkeypatch.setattr(profiles.os, "fsync", boom)
    else:
        monkeypatch.setattr(profiles.os, "replace", boom)

    with pytest.raises(OSError):
        save_condition(f, _cond("second"))
    monkeypatch.undo()
    assert f.read_bytes() == before
    assert load_condition(f, VESSEL).name == "first"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["a.condition.toml"]  # no temp file left


# --------------------------------------------------------------------------- deckload check with a condition


def _write(tmp_path, text: str) -> Path:
    f = tmp_path / "c.condition.toml"
    f.write_text(text, encoding="utf-8")
    return f


def test_check_condition_ok(tmp_path, capsys):
    f = _write(tmp_path, GOOD)
    assert run_check(PROFILE_PATH, f) == 0
    out = capsys.readouterr().out
    # Δ = 400 + 2 × 25 m³ × 1.025 + 200 + 20 + 1.2 t (the sum of the file's masses)
    assert f"OK  {f}: 'Test departure': valid, and computes to displacement {400 + 2 * 25 * 1.025 + 200 + 20 + 1.2:.1f} t" in out


def test_check_condition_problems(tmp_path, capsys):
    text = edit(GOOD, "percent = 50.0", "percent = 120.0")
    f = _write(tmp_path, text)
    assert run_check(PROFILE_PATH, f) == 1
    out = capsys.readouterr().out.splitlines()
    assert f"{f}:{line_of(text, 'percent = 120.0')}: tanks.DB1S.percent = 120.0: above 100 % (full)" in out
    assert f"1 problem in {f}" in out


@pytest.mark.parametrize("mass_t, table", [(900.0, "hydrostatic"), (650.0, "cross-curve")])
def test_check_turns_out_of_range_into_a_problem(tmp_path, capsys, mass_t, table):
    """Δ beyond the tables is a problem naming the condition file, never a traceback.

    900 t of deck cargo: Δ ≈ 1552 t > 1435 t, the last hydrostatic row;
    650 t: Δ ≈ 1302 t, inside the hydrostatics but beyond the KN curves' 1230 t.
    """
    f = _write(tmp_path, edit(GOOD, "mass_t = 20.0", f"mass_t = {mass_t}"))
    assert run_check(PROFILE_PATH, f) == 1
    cap = capsys.readouterr()
    lines = cap.out.splitlines()
    bad = [ln for ln in lines if ln.startswith(f"{f}: cannot be computed:")]
    assert len(bad) == 1, cap.out
    assert "outside the table range" in bad[0] and "extrapolate" in bad[0]
    assert "Traceback" not in cap.out + cap.err


def test_check_missing_condition_file(tmp_path, capsys):
    assert run_check(PROFILE_PATH, tmp_path / "nope.condition.toml") == 2
    assert "cannot read" in capsys.readouterr().err
