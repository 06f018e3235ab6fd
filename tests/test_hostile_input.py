"""Mistaken and hostile files: every one refused with a named problem, never a traceback or a verdict.

Each test holds the triggering input of one case of issue 12 (physical bounds, huge and
deeply nested numbers, truncated profiles, size limits, strict JSON, finite results).
The demo vessel is invented: LBP 38 m, B 10 m, depth 4.5 m, lightship 400 t, hydrostatic
table to 1147.19 t and 3.9 m.
"""

from __future__ import annotations

import dataclasses
from pathlib import Path
import json
import math

import numpy as np
import pytest

from deckload.cli.main import main
from deckload.core import bounds
from deckload.core.stability import evaluate
from deckload.io.paths import DEMO_CONDITIONS, DEMO_PROFILE
from deckload.io.profiles import ProfileError, load_condition, load_profile, parse_condition, parse_profile
from demo_vessels import demo_vessel

DEPARTURE = DEMO_CONDITIONS["departure"].read_text(encoding="utf-8")
PROFILE_TEXT = DEMO_PROFILE.read_text(encoding="utf-8")


@pytest.fixture(scope="module")
def vessel():
    return demo_vessel()


EMPTY = 'format = "deckload-condition-1"\n[condition]\nname = "empty"\nwater_density_t_m3 = 1.025\n'


def with_item(lcg: str, mass: str = "10.0", vcg: str = "5.0", group: str = "deck_item", base: str = DEPARTURE) -> str:
    return base + f'\n[[{group}]]\nname = "far"\nmass_t = {mass}\nlcg_m = {lcg}\nvcg_m = {vcg}\n'


def with_demo_geometry(folder):
    """``folder`` with the files the demo profile names beside it (its hull geometry)."""
    import shutil

    for f in DEMO_PROFILE.parent.glob("*.geometry.toml"):
        shutil.copy(f, folder)
    return folder


def problems_of(text: str, vessel) -> list:
    with pytest.raises(ProfileError) as ei:
        parse_condition(text, "c.toml", vessel)
    return ei.value.problems


# ------------------------------------------------------------------ case 1: impossible positions


@pytest.mark.parametrize("lcg", ["1e6", "1e308", "-100.0", "45.61"])
def test_a_deck_item_beyond_the_vessels_length_is_refused_at_its_key(vessel, lcg):
    """x must lie in −0.2·LBP … 1.2·LBP = −7.6 … 45.6 m (the item form's rule, now the file's too)."""
    (p,) = problems_of(with_item(lcg), vessel)
    assert p.key == "deck_item[#5].lcg_m" and p.line == DEPARTURE.count("\n") + 5
    assert "between -7.6 and 45.6 m" in p.rule


def test_calc_and_check_refuse_the_far_item_with_exit_1(tmp_path, capsys):
    f = tmp_path / "far.condition.toml"
    f.write_text(with_item("1e6"), encoding="utf-8")
    assert main(["calc", str(DEMO_PROFILE), str(f)]) == 1
    assert main(["check", str(DEMO_PROFILE), str(f)]) == 1
    out = capsys.readouterr()
    assert "All criteria met" not in out.out and "OK  " + str(f) not in out.out
    assert "deck_item[#5].lcg_m = 1000000.0" in out.out + out.err


@pytest.mark.parametrize("key,value,rule", [
    ("vcg_m", "40.0", "between 0 and 34.5 m"),       # depth 4.5 m + 30 m
    ("mass_t", "800.0", "between 0 and 747.19 t"),    # 1147.19 t − lightship 400 t
])
def test_heights_and_masses_are_bounded_too(vessel, key, value, rule):
    kw = {"lcg": "10.0", "mass": "10.0", "vcg": "5.0"}
    kw[{"vcg_m": "vcg", "mass_t": "mass"}[key]] = value
    (p,) = problems_of(with_item(kw["lcg"], kw["mass"], kw["vcg"], group="constant"), vessel)
    assert p.key == f'constant[#4 "far"].{key}' and rule in p.rule  # by number and name


def test_a_legal_item_that_trims_her_beyond_her_tables_is_refused_not_called_compliant(vessel, tmp_path, capsys):
    """300 t at x = 45 m (inside the envelope) gives a trim of about −10.7 m and a negative
    draft aft: the even-keel tables cannot describe that, so there is no result to pass."""
    cond = parse_condition(with_item("45.0", mass="300.0", base=EMPTY), "c.toml", vessel)
    with pytest.raises(bounds.BeyondTablesError, match="draft aft .* outside 0–3.9 m"):
        evaluate(vessel, cond)
    f = tmp_path / "trimmed.condition.toml"
    f.write_text(with_item("45.0", mass="300.0", base=EMPTY), encoding="utf-8")
    assert main(["calc", str(DEMO_PROFILE), str(f)]) == 1
    assert main(["check", str(DEMO_PROFILE), str(f)]) == 1
    assert "cannot be assessed" in capsys.readouterr().out


def test_a_non_finite_computed_number_is_refused_naming_it(vessel):
    good = evaluate(vessel, load_condition(DEMO_CONDITIONS["departure"], vessel))
    for field, bad in (("gm_fluid_m", math.nan), ("gz_m", (0.0, math.inf))):
        with pytest.raises(bounds.NonFiniteResultError, match=field):
            bounds.checked_result(vessel, dataclasses.replace(good, **{field: bad}))
    # Deeper down (a tank's mass) and in an array: the quick pass must not let them through.
    tank = dataclasses.replace(good.tanks[1], mass_t=-math.inf)
    with pytest.raises(bounds.NonFiniteResultError, match=r"tanks\[1\]\.mass_t"):
        bounds.checked_result(vessel, dataclasses.replace(good, tanks=(good.tanks[0], tank, *good.tanks[2:])))
    with pytest.raises(bounds.NonFiniteResultError, match=r"gz_m\[2\]"):
        bounds.checked_result(vessel, dataclasses.replace(good, gz_m=np.array([0.0, 0.1, np.nan])))
    # The quick pass sums the floats it meets: +inf in one place and -inf in another sum to NaN,
    # a numpy scalar is a float too; each is still refused and named.
    with pytest.raises(bounds.NonFiniteResultError, match="gm_fluid_m"):
        bounds.checked_result(vessel, dataclasses.replace(good, gm_fluid_m=math.inf, gz_m=(0.0, -math.inf)))
    with pytest.raises(bounds.NonFiniteResultError, match="gm_fluid_m"):
        bounds.checked_result(vessel, dataclasses.replace(good, gm_fluid_m=np.float64("nan")))
    # Finite numbers whose sum overflows are no refusal (the slow pass clears the quick one's doubt).
    big = dataclasses.replace(good, gz_m=(1e308, 1e308, 1e308))
    assert bounds.checked_result(vessel, big) is big
    assert bounds.checked_result(vessel, good) is good


def test_json_output_is_strict(capsys):
    """JSON has no Infinity/NaN: the output parses with a parser that refuses them."""
    assert main(["calc", "demo", "arrival", "--json"]) == 0
    out = capsys.readouterr().out

    def refuse(token):
        raise ValueError(token)

    json.loads(out, parse_constant=refuse)


@pytest.mark.parametrize("old,new,key", [
    ("lbp_m = 38.0", "lbp_m = 1e9", "vessel.lbp_m"),
])
def test_profile_values_beyond_the_vessels_physics_are_refused(old, new, key):
    assert old in PROFILE_TEXT
    with pytest.raises(ProfileError) as ei:
        parse_profile(PROFILE_TEXT.replace(old, new, 1), str(DEMO_PROFILE))
    assert key in [p.key for p in ei.value.problems]


@pytest.mark.parametrize("old,new,key", [
    ("kmt_m = [\n    7.9088", "kmt_m = [\n    79088.0", "hydrostatics.kmt_m"),
    ("mass_t = 400.0\nlcg_m = 17.4", "mass_t = 400.0\nlcg_m = 1700.4", "lightship.lcg_m"),
])
def test_calc_refuses_a_profile_the_audit_finds_impossible(tmp_path, capsys, old, new, key):
    """Profile tables are judged by the plausibility audit, now before every command uses them."""
    f = with_demo_geometry(tmp_path) / "p.toml"
    f.write_text(PROFILE_TEXT.replace(old, new, 1), encoding="utf-8")
    cond = tmp_path / "c.toml"
    cond.write_text(DEPARTURE, encoding="utf-8")
    for cmd in ("calc", "report"):
        assert main([cmd, str(f), str(cond)] + (["--txt"] if cmd == "report" else [])) == 1
        err = capsys.readouterr().err
        assert key in err and "plausibility audit" in err


# ------------------------------------------------------------------ case 2: numbers the TOML reader chokes on


@pytest.mark.parametrize("value,rule", [
    ("1" + "0" * 29, "physical limit"),                 # 30 digits: a float, but far beyond the vessel
    ("1" + "0" * 400, "must be a finite number"),      # too large for a float: OverflowError before
    ("1" + "0" * 4999, "cannot be read"),              # beyond Python's integer conversion: ValueError before
])
def test_huge_integers_become_problems(vessel, value, rule):
    (p,) = problems_of(with_item("10.0", mass=value), vessel)
    assert rule in p.rule and len(str(p)) < 400


@pytest.mark.parametrize("depth", [900, 3000])
def test_deep_nesting_becomes_a_problem(vessel, depth):
    text = DEPARTURE + "\nextra = " + "[" * depth + "1" + "]" * depth + "\n"
    (p,) = problems_of(text, vessel)
    assert "nested" in p.rule or "unknown key" in p.rule


# ------------------------------------------------------------------ case 8: a profile cut short


def test_the_demo_profile_cut_before_its_first_tank_is_refused_for_having_no_tanks():
    """The issue's cut after 170 lines fell just before the first [[tank]] of the demo profile
    of that day; the profile has grown since, so the cut is made at the same place by name."""
    lines = PROFILE_TEXT.splitlines(keepends=True)
    cut = "".join(lines[: lines.index("[[tank]]\n")])
    with pytest.raises(ProfileError) as ei:
        parse_profile(cut, str(DEMO_PROFILE))
    assert any(p.key == "tank" and "no [[tank]] sections" in p.rule for p in ei.value.problems)


def test_check_says_what_is_missing_for_a_profile_cut_before_its_cross_curves(tmp_path, capsys):
    cut = with_demo_geometry(tmp_path) / "cut.toml"
    lines = PROFILE_TEXT.splitlines(keepends=True)
    cut.write_text("".join(lines[: lines.index("[cross_curves]\n")]), encoding="utf-8")
    assert main(["check", str(cut)]) == 1
    out = capsys.readouterr().out
    assert "cross_curves: required key is missing" in out and "OK" not in out


def test_a_hydrostatic_table_that_stops_below_the_design_draft_is_refused():
    text = PROFILE_TEXT.replace("design_draft_m = 2.9", "design_draft_m = 4.2")
    with pytest.raises(ProfileError) as ei:
        parse_profile(text, str(DEMO_PROFILE))
    assert any(p.key == "hydrostatics.draft_m" and "design draft" in p.rule for p in ei.value.problems)


# ------------------------------------------------------------------ case 12: size limits


def test_a_huge_table_is_refused_quickly_with_the_limit_named(vessel, tmp_path):
    """10⁷ rows took 46 s and 2 GB; now the file size limit stops it before it is parsed."""
    from deckload.io.limits import MAX_TABLE_VALUES, MAX_TOML_BYTES

    big = tmp_path / "big.toml"
    with open(big, "w") as f:
        f.write(PROFILE_TEXT.replace("[hydrostatics]\n", "[hydrostatics]\nextra = [", 1)[:0])
        f.write(PROFILE_TEXT + "\n[extra]\nx = [" + "1.0, " * (MAX_TOML_BYTES // 5) + "]\n")
    with pytest.raises(ProfileError, match="larger than the 4 MiB allowed"):
        load_profile(big)
    rows = ", ".join(["1.0"] * (MAX_TABLE_VALUES + 1))
    text = PROFILE_TEXT.replace("heel_deg = [\n", f"heel_deg = [{rows}, \n", 1)
    with pytest.raises(ProfileError, match=f"more than the {MAX_TABLE_VALUES} allowed"):
        parse_profile(text, str(DEMO_PROFILE))


def test_a_device_named_as_a_profile_is_not_read_endlessly():
    with pytest.raises(ProfileError, match="allowed"):
        load_profile("/dev/zero")


# ------------------------------------------------------------------ case 12: CSV tables beside a profile


@pytest.mark.parametrize("hostile,rule", [
    ("draft_m,displacement_t\n" + "1." + "0" * 200_000 + ",2\n", "not a readable CSV table"),  # a 200 k field
    ("draft_m,displacement_t\n1.0,\x00\n", "needs at least 2 values"),  # a NUL cell is text, not a crash
    ("draft_m,displacement_t\n" + "1.0,2.0\n" * 20_001, "rows allowed in one table"),
    ("draft_m,displacement_t\n" + "1.0,2.0," + "9" * (5 * 1024 * 1024) + "\n", "larger than the 4 MiB allowed"),
])
def test_hostile_csv_tables_are_problems(tmp_path, hostile, rule):
    from test_booklet_input import booklet_profile

    profile = booklet_profile(tmp_path)
    load_profile(profile)  # the base reads
    (tmp_path / "tables" / "hydrostatics.csv").write_text(hostile, encoding="utf-8")
    with pytest.raises(ProfileError) as ei:
        load_profile(profile)
    assert any(rule in p.rule for p in ei.value.problems), ei.value


# ------------------------------------------------------------------ found by the long fuzz run


BARGE = (Path(__file__).parent / "broken_profiles" / "box_barge.toml").read_text(encoding="utf-8")


def test_a_400_digit_tcg_is_a_problem_not_an_overflow():
    """Found by tests/fuzz_by_hand.py: the TCG reader (port/starboard marks) converted it with float()."""
    text = BARGE.replace("lcg_m = 20.0\nvcg_m = 2.5\ntcg_m = 0.0", "lcg_m = 20.0\nvcg_m = 2.5\ntcg_m = 1" + "0" * 400, 1)
    assert text != BARGE
    with pytest.raises(ProfileError) as ei:
        parse_profile(text, "p.toml")
    assert any(p.key == "lightship.tcg_m" and "finite" in p.rule for p in ei.value.problems)


def test_a_hydrostatic_row_of_zero_displacement_does_not_break_the_audit():
    """Found by tests/fuzz_by_hand.py: the audit's MCTC check divided by Δ = 0."""
    from deckload.core.audit import audit

    text = BARGE.replace("draft_m = [0.5, 1.0,", "draft_m = [0.0, 1.0,", 1).replace(
        "displacement_t = [205.0, 410.0,", "displacement_t = [0.0, 410.0,", 1)
    audit(parse_profile(text, "p.toml"))  # findings, not an exception


@pytest.mark.parametrize("parse, text, expected", [
    ("profile", DEPARTURE, "deckload-profile-1"),
    ("condition", PROFILE_TEXT, "deckload-condition-1"),
    ("geometry", PROFILE_TEXT, "deckload-geometry-1"),
], ids=["condition-as-profile", "profile-as-condition", "profile-as-geometry"])
def test_a_file_of_another_kind_is_refused_on_its_format_alone(vessel, parse, text, expected):
    """A condition given as the profile, or the profile as a condition or as the hull geometry: one
    problem, the format, not one "unknown key" per section of the other kind of file (the profile
    read as a geometry file gave 130 kB of them)."""
    from deckload.io.geometry_files import GeometryError, parse_geometry

    read = {"profile": lambda: parse_profile(text, "x.toml"), "condition": lambda: parse_condition(text, "x.toml", vessel),
            "geometry": lambda: parse_geometry(text, "x.toml")}[parse]
    with pytest.raises((ProfileError, GeometryError)) as e:
        read()
    (problem,) = e.value.problems
    assert problem.key == "format" and expected in problem.rule and len(str(e.value)) < 300


def test_a_condition_name_longer_than_the_screen_allows_is_refused_naming_the_key(vessel):
    """The screen saves a condition under at most 80 characters (deckload.io.condition_files
    MAX_NAME_CHARS); a file's name of 100 000 characters passed calc and was refused only by the
    log, as "change text: at most 2000 characters", without naming the key."""
    from deckload.io.condition_files import MAX_NAME_CHARS

    ok = DEPARTURE.replace('name = "Departure, full stores"', f'name = "{"x" * MAX_NAME_CHARS}"', 1)
    assert parse_condition(ok, "c.toml", vessel).name == "x" * MAX_NAME_CHARS
    long = DEPARTURE.replace('name = "Departure, full stores"', f'name = "{"x" * 100_000}"', 1)
    with pytest.raises(ProfileError) as e:
        parse_condition(long, "c.toml", vessel)
    (problem,) = e.value.problems
    assert problem.key == "condition.name" and "at most 80 characters (100000 given)" in problem.rule


@pytest.mark.parametrize("column", ["lcb_m", "lcf_m"])
def test_an_lcb_or_lcf_beyond_the_hull_is_refused_where_it_is_read(column):
    """LCB and LCF lie within −0.2·LBP … 1.2·LBP (vessel_profiles/README.md, "Physical bounds"):
    1e308 in the first row is refused naming its key and row, not passed to the audit, where it
    came out as an LCB "inf m away" from the one the LCF column integrates to."""
    at = PROFILE_TEXT.index(f"{column} = [")
    first = PROFILE_TEXT.index("\n", at) + 1
    end = PROFILE_TEXT.index(",", first)
    text = PROFILE_TEXT[:first] + "    1e308" + PROFILE_TEXT[end:]
    with pytest.raises(ProfileError) as e:
        parse_profile(text, "p.toml")
    (problem,) = e.value.problems
    assert problem.key == f"hydrostatics.{column}" and "(row 1)" in problem.rule and "-7.6 and 45.6 m" in problem.rule
