"""Vessel-profile validation: each broken profile is rejected with its precise message.

The valid base is ``tests/broken_profiles/box_barge.toml``: the box barge L=40, B=10,
D=4 of checks.md §1 (analytic; the file's header derives its
tables).  Every broken case below is that text with one or more lines changed, so
the expected line number is found in the broken text itself.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from deckload.cli.check import run_check
from deckload.core import model as m
from deckload.io.profiles import Problem, ProfileError, load_profile, parse_profile

HERE = Path(__file__).parent
BASE_PATH = HERE / "broken_profiles" / "box_barge.toml"
BASE = BASE_PATH.read_text(encoding="utf-8")


def edit(text: str, old: str, new: str, nth: int = 1) -> str:
    """``text`` with the ``nth`` occurrence of ``old`` replaced by ``new``."""
    at = -1
    for _ in range(nth):
        at = text.index(old, at + 1)
    return text[:at] + new + text[at + len(old):]


def line_of(text: str, fragment: str, nth: int = 1) -> int:
    """1-based line of the ``nth`` line containing ``fragment``."""
    hits = [i for i, line in enumerate(text.splitlines(), 1) if fragment in line]
    return hits[nth - 1]


def problems(text: str, name: str = "broken.toml") -> list[Problem]:
    with pytest.raises(ProfileError) as ei:
        parse_profile(text, name)
    return ei.value.problems


def only(text: str) -> Problem:
    ps = problems(text)
    assert len(ps) == 1, "\n".join(map(str, ps))
    return ps[0]


# --------------------------------------------------------------------------- the valid base


def test_base_profile_loads_into_the_model():
    v = load_profile(BASE_PATH)
    assert v.particulars.name == "Test Box Barge"
    assert [t.id for t in v.tanks] == ["DB1P", "DB1S"]
    assert v.tank("DB1S").pair == "DB1P"
    # analytic, checks.md §1.1: KMt = T/2 + B²/(12T) at T = 2 m
    assert v.hydrostatics.kmt_m[3] == pytest.approx(2.0 / 2 + 10.0**2 / (12 * 2.0), abs=1e-6)
    assert v.cross_curves.kn_m.shape == (3, 10)
    assert v.tank("DB1P").max_fsi_m4 == pytest.approx(10.0 * 5.0**3 / 12, abs=1e-6)  # i = l·b³/12
    # every table is a read-only array
    assert not v.hydrostatics.draft_m.flags.writeable
    assert not v.tank("DB1P").calibration.fsi_m4.flags.writeable
    assert not v.cross_curves.kn_m.flags.writeable


def test_defaults_are_resolved_in_the_loader():
    v = parse_profile(BASE, "b.toml")
    # min_operating_displacement_t absent -> the lightship mass, so the engine gets a number
    assert v.free_surface.min_operating_displacement_t == 400.0
    assert v.tank("DB1P").worst_band_pct == (40.0, 60.0)
    assert v.tank("DB1P").fs_category == "fixed"  # ballast is not a consumable
    assert v.criteria == m.CriteriaSettings()


def test_consumables_default_to_variable_and_band_to_profile_default():
    text = edit(BASE, 'kind = "ballast"', 'kind = "fresh_water"')
    text = edit(text, 'kind = "ballast"', 'kind = "fresh_water"')
    text = edit(text, "density_t_m3 = 1.025\ncapacity", "density_t_m3 = 1.0\ncapacity")
    text = edit(text, "default_worst_band_pct = [40.0, 60.0]", "default_worst_band_pct = [35.0, 65.0]")
    text = edit(text, 'pair = "DB1P"', 'pair = "DB1P"\nworst_band_pct = [38.0, 62.0]\nfs_category = "fixed"')
    v = parse_profile(text, "b.toml")
    assert v.tank("DB1P").fs_category == "variable"
    assert v.tank("DB1P").worst_band_pct == (35.0, 65.0)
    assert v.tank("DB1S").fs_category == "fixed"
    assert v.tank("DB1S").worst_band_pct == (38.0, 62.0)
    assert v.tank("DB1P").density_t_m3 == 1.0


def test_optional_sections():
    text = BASE + (
        "\n[criteria]\ncode = \"IS2008-A2.2\"\nmin_gm_m = 0.35\n"
        "\n[limit_curve]\ndisplacement_t = [410.0, 1230.0]\nmax_kg_m = [4.0, 3.5]\n"
        "\n[downflooding]\ndisplacement_t = [410.0, 1230.0]\nangle_deg = [45.0, 35.0]\n"
    )
    text = edit(text, "[free_surface]", "[free_surface]\nmin_operating_displacement_t = 500.0")
    v = parse_profile(text, "b.toml")
    assert v.criteria.min_gm_m == 0.35
    assert v.limit_curve.kind == "max_kg_m" and list(v.limit_curve.value) == [4.0, 3.5]
    assert v.downflooding.kind == "downflooding_deg"
    assert v.free_surface.min_operating_displacement_t == 500.0


# --------------------------------------------------------------------------- broken profiles


def test_syntax_error_gives_the_parser_line():
    text = edit(BASE, "breadth_m = 10.0", "breadth_m = 10.0.0")
    p = only(text)
    assert p.file == "broken.toml"
    assert p.line == line_of(text, "breadth_m = 10.0.0")
    assert "TOML syntax" in p.rule and "column" in p.rule
    assert str(p).startswith(f"broken.toml:{p.line}: TOML syntax")


def test_missing_required_key_is_reported_at_its_table():
    text = edit(BASE, "breadth_m = 10.0\n", "")
    p = only(text)
    assert (p.key, p.value, p.line) == ("vessel.breadth_m", None, line_of(text, "[vessel]"))
    assert p.rule == "required key is missing"
    assert str(p) == f"broken.toml:{p.line}: vessel.breadth_m: required key is missing"


def test_missing_section():
    text = edit(BASE, "[lightship]\nmass_t = 400.0\nlcg_m = 20.0\nvcg_m = 2.5\ntcg_m = 0.0\n", "")
    p = only(text)
    assert (p.key, p.rule) == ("lightship", "required key is missing")


def test_wrong_type():
    text = edit(BASE, "lbp_m = 40.0", 'lbp_m = "40"')
    p = only(text)
    assert (p.key, p.value, p.line) == ("vessel.lbp_m", '"40"', line_of(text, 'lbp_m = "40"'))
    assert p.rule == "must be a number, not a string"


def test_boolean_is_not_a_number():
    p = only(edit(BASE, "depth_m = 4.0", "depth_m = true"))
    assert (p.key, p.rule) == ("vessel.depth_m", "must be a number, not a boolean")


def test_unknown_key_is_a_problem_with_a_suggestion():
    """A misspelt optional key must not silently leave its default in force."""
    text = edit(BASE, 'pair = "DB1S"', 'pair = "DB1S"\nworst_band_pc = [30.0, 70.0]')
    p = only(text)
    assert p.key == "tank[DB1P].worst_band_pc"
    assert p.rule == "unknown key (did you mean 'worst_band_pct'?)"
    assert p.line == line_of(text, "worst_band_pc =")


def test_misspelt_required_key_reports_both_sides():
    text = edit(BASE, "capacity_m3 = 50.0", "capacty_m3 = 50.0", nth=2)
    ps = problems(text)
    got = {(p.key, p.rule) for p in ps}
    assert ("tank[DB1S].capacity_m3", "required key is missing") in got
    assert ("tank[DB1S].capacty_m3", "unknown key (did you mean 'capacity_m3'?)") in got
    assert len(ps) == 2


def test_unknown_section():
    text = BASE + '\n[criterion]\ncode = "IS2008-A2.2"\n'
    p = only(text)
    assert (p.key, p.line) == ("criterion", line_of(text, "[criterion]"))
    assert p.rule == "unknown key (did you mean 'criteria'?)"


def test_wrong_format():
    p = only(edit(BASE, 'format = "deckload-profile-1"', 'format = "deckload-profile-2"'))
    assert p.key == "format" and p.value == '"deckload-profile-2"'
    assert 'must be one of "deckload-profile-1"' in p.rule


def test_negative_mass():
    text = edit(BASE, "mass_t = 400.0", "mass_t = -400.0")
    p = only(text)
    assert (p.key, p.value, p.rule) == ("lightship.mass_t", "-400.0", "must be greater than 0")
    assert p.line == line_of(text, "mass_t = -400.0")


def test_non_finite_number():
    text = edit(BASE, "vcg_m = 2.5", "vcg_m = nan")
    p = only(text)
    assert (p.key, p.rule, p.line) == ("lightship.vcg_m", "must be a finite number", line_of(text, "vcg_m = nan"))


def test_infinite_value_inside_a_table():
    text = edit(BASE, "kmt_m = [16.916667,", "kmt_m = [inf,")
    p = only(text)
    assert p.key == "hydrostatics.kmt_m"
    assert p.rule == "row 1: inf is not a finite number"


def test_calibration_volume_not_strictly_increasing():
    text = edit(BASE, "volume_m3 = [0.0, 25.0, 50.0]", "volume_m3 = [0.0, 25.0, 25.0]", nth=2)
    p = only(text)
    assert p.key == "tank[DB1S].calibration.volume_m3"
    assert p.value == "[0.0, 25.0, 25.0]"
    assert p.rule == "not strictly increasing (row 3: 25.0 after 25.0)"
    assert p.line == line_of(text, "volume_m3 = [0.0, 25.0, 25.0]")
    assert str(p) == (f"broken.toml:{p.line}: tank[DB1S].calibration.volume_m3 = [0.0, 25.0, 25.0]: "
                      "not strictly increasing (row 3: 25.0 after 25.0)")


def test_hydrostatic_displacement_not_increasing():
    text = edit(BASE, "[205.0, 410.0, 615.0, 820.0,", "[205.0, 410.0, 615.0, 600.0,")
    p = only(text)
    assert p.key == "hydrostatics.displacement_t"
    assert p.rule == "not strictly increasing (row 4: 600.0 after 615.0)"
    assert p.value == "[205.0, 410.0, 615.0, 600.0, …7 values]"


def test_unequal_lengths_in_one_table():
    text = edit(BASE, "tpc_t_cm = [4.1, 4.1, 4.1, 4.1, 4.1, 4.1, 4.1]", "tpc_t_cm = [4.1, 4.1, 4.1, 4.1, 4.1, 4.1]")
    p = only(text)
    assert p.key == "hydrostatics.tpc_t_cm"
    assert p.rule == "has 6 values but draft_m has 7: one value per row"
    assert p.line == line_of(text, "tpc_t_cm =")


def test_cross_curve_matrix_missing_a_row():
    text = edit(BASE, "    [0.0, 0.75033, 1.35074, 1.73248, 2.01023, 2.18107, 2.25335, 2.24208, 2.15533, 2.00000],\n", "")
    p = only(text)
    assert p.key == "cross_curves.kn_m"
    assert p.rule == "has 2 rows but displacement_t has 3 values: one row per displacement_t value"
    assert p.line == line_of(text, "kn_m = [")


def test_cross_curve_row_short_of_a_column():
    text = edit(BASE, "2.52674, 2.00000]", "2.52674]")
    p = only(text)
    assert p.rule == "row 1 has 9 values but heel_deg has 10: one column per heel_deg value"


def test_kn_heel_must_start_at_zero_and_end_by_ninety():
    # a first angle up to 15° gets the 0° column added (tests/test_booklet_pages.py); beyond, refused
    text = edit(BASE, "heel_deg = [0, 10,", "heel_deg = [16, 17,")
    p = only(text)
    assert p.key == "cross_curves.heel_deg"
    assert p.rule.startswith("must start at 0 (the upright condition), or at 15° at most (it starts at 16°)")
    text = edit(BASE, "70, 80, 90]", "70, 80, 95]")
    p = only(text)
    assert p.key == "cross_curves.heel_deg"
    assert p.rule == "above 90°: must be between 0 and 90° (row 10: 95)"


def test_sounding_must_start_at_zero():
    text = edit(BASE, "sounding_m = [0.0, 0.5, 1.0]", "sounding_m = [0.1, 0.5, 1.0]")
    p = only(text)
    assert p.key == "tank[DB1P].calibration.sounding_m" and p.rule.startswith("must start at 0 (the tank bottom)")
    assert p.line == line_of(text, "sounding_m = [0.1")


def test_capacity_must_equal_last_calibration_volume():
    text = edit(BASE, "capacity_m3 = 50.0", "capacity_m3 = 51.0")
    p = only(text)
    assert p.key == "tank[DB1P].capacity_m3" and p.value == "51.0"
    # (51 − 50)/50 = 2 %; and 50 is 98.04 % of 51, within the printing of a table stopped at 98 %
    assert p.rule == ("differs from the last calibration volume 50 m³ by 2.00 % (at most 0.05 % allowed, "
                      "or 0.1 m³, half a unit of the last decimals printed); the table's last row is 98 % of it: "
                      "if the booklet prints the table only to 98 % of the tank, say so with table_top_pct = 98")
    # 2 % below the table's top is no table stopped short: no such hint
    assert "table_top_pct" not in only(edit(BASE, "capacity_m3 = 50.0", "capacity_m3 = 49.0")).rule
    # 0.4 % would shift the 98 % 'nominally full' line: refused
    assert "0.40 %" in only(edit(BASE, "capacity_m3 = 50.0", "capacity_m3 = 50.2")).rule
    # 0.04 % is round-off: accepted, and 100 % then means the table's top, never beyond it
    vessel = parse_profile(edit(BASE, "capacity_m3 = 50.0", "capacity_m3 = 50.02"), "b.toml")
    from deckload.core.loading import volume_of

    assert volume_of(vessel.tank("DB1P"), "percent", 100.0, 1.025) == 50.0


def test_pair_must_name_it_back():
    text = edit(BASE, 'pair = "DB1P"', 'pair = "DB1X"')
    ps = problems(text)
    got = {(p.key, p.rule) for p in ps}
    assert ("tank[DB1P].pair", "tank DB1S does not name DB1P back as its pair (it names 'DB1X')") in got
    assert ("tank[DB1S].pair", "no tank with this id (did you mean 'DB1P'?)") in got
    assert len(ps) == 2
    byk = {p.key: p for p in ps}
    assert byk["tank[DB1S].pair"].line == line_of(text, 'pair = "DB1X"')


def test_duplicate_ids():
    text = edit(BASE, 'id = "DB1S"', 'id = "DB1P"')
    text = edit(text, 'pair = "DB1S"', "")
    text = edit(text, 'pair = "DB1P"', "")
    p = only(text)
    assert p.key == "tank[#2].id"
    assert p.rule == "duplicate id: already used by tank[#1]"
    assert p.line == line_of(text, 'id = "DB1P"', nth=2)


def test_hold_id_may_not_repeat_a_tank_id():
    p = only(edit(BASE, 'id = "H1"', 'id = "DB1P"'))
    assert (p.key, p.rule) == ("hold[#1].id", "duplicate id: already used by tank[#1]")


def test_unknown_liquid_kind():
    text = edit(BASE, 'kind = "ballast"', 'kind = "balast"')
    p = only(text)
    assert p.key == "tank[DB1P].kind" and p.value == '"balast"'
    assert p.rule.startswith('must be one of "fuel_oil", "diesel"')
    assert p.rule.endswith("(did you mean 'ballast'?)")


def test_density_outside_range():
    text = edit(BASE, "density_t_m3 = 1.025\ncapacity", "density_t_m3 = 2.6\ncapacity", nth=2)
    p = only(text)
    assert p.key == "tank[DB1S].density_t_m3"
    assert p.rule.startswith("above 2.5 t/m³: must be between 0.5 and 2.5 t/m³")


def test_limit_curve_with_both_kinds():
    text = BASE + "\n[limit_curve]\ndisplacement_t = [410.0, 1230.0]\nmax_kg_m = [4.0, 3.5]\nmin_gm_m = [0.3, 0.3]\n"
    p = only(text)
    assert p.key == "limit_curve.min_gm_m"
    assert p.rule == "give exactly one of max_kg_m and min_gm_m, not both"
    assert p.line == line_of(text, "min_gm_m = [0.3")


def test_load_line_outside_hydrostatic_table():
    p = only(edit(BASE, "\ndraft_m = 2.5", "\ndraft_m = 3.8"))
    assert (p.key, p.value) == ("load_line[summer].draft_m", "3.8")
    assert p.rule == "outside the hydrostatic table's drafts 0.5–3.5 m"


def test_tank_contents_centre_cannot_fall():
    p = only(edit(BASE, "vcg_m = [0.0, 0.25, 0.5]", "vcg_m = [0.0, 0.5, 0.25]"))
    assert p.key == "tank[DB1P].calibration.vcg_m"
    assert p.rule.startswith("falls as the tank fills (row 3: 0.25 after 0.5)")


def test_datum_must_be_a_known_one():
    p = only(edit(BASE, 'longitudinal_datum = "AP"', 'longitudinal_datum = "MS"'))
    assert (p.key, p.rule) == ("vessel.longitudinal_datum", 'must be one of "AP", "midships", "FP"')


def test_datum_other_than_ap_needs_its_sign_stated():
    """A booklet measuring from the FP says whether + is forward or aft; deckload never guesses."""
    p = only(edit(BASE, 'longitudinal_datum = "AP"', 'longitudinal_datum = "FP"'))
    assert p.key == "vessel.longitudinal_positive"
    assert p.rule.startswith('required with longitudinal_datum = "FP"')


def test_three_problems_are_all_reported_in_file_order():
    text = edit(BASE, "lbp_m = 40.0", "lbp_m = -40.0")
    text = edit(text, "vcg_m = [0.0, 0.25, 0.5]", "vcg_m = [0.0, 0.25]", nth=2)
    text = edit(text, 'kind = "ballast"', 'kind = "brine"')
    ps = problems(text)
    assert [(p.key, p.line) for p in ps] == [
        ("vessel.lbp_m", line_of(text, "lbp_m = -40.0")),
        ("tank[DB1P].kind", line_of(text, 'kind = "brine"')),
        ("tank[DB1S].calibration.vcg_m", line_of(text, "vcg_m = [0.0, 0.25]")),
    ]
    assert ps[0].rule == "must be greater than 0"
    assert ps[2].rule == "has 2 values but sounding_m has 3: one value per row"
    assert "must be one of" in ps[1].rule


def test_not_utf8(tmp_path):
    f = tmp_path / "latin1.toml"
    f.write_bytes(BASE.encode("utf-8").replace(b"Test Box Barge", "Test Bâteau".encode("latin-1")))
    with pytest.raises(ProfileError) as ei:
        load_profile(f)
    (p,) = ei.value.problems
    assert p.file == str(f) and "not UTF-8" in p.rule
    assert p.line == line_of(BASE, "Test Box Barge")


def test_error_message_lists_every_problem():
    text = edit(BASE, "lbp_m = 40.0", "lbp_m = -40.0")
    text = edit(text, "breadth_m = 10.0", "breadth_m = 0.0")
    with pytest.raises(ProfileError) as ei:
        parse_profile(text, "x.toml")
    assert str(ei.value).splitlines() == [str(p) for p in ei.value.problems]
    assert len(ei.value.problems) == 2


# --------------------------------------------------------------------------- deckload check


def test_check_ok(capsys):
    assert run_check(BASE_PATH) == 0
    out = capsys.readouterr().out
    assert out.startswith(f"OK  {BASE_PATH}: 'Test Box Barge': 2 tanks, 1 hold, 1 deck area, 1 load line")
    assert "draft 0.5–3.5 m, displacement 205–1435 t" in out
    assert "never replaces, the approved stability booklet" in out


def test_check_reports_every_problem_and_exits_1(tmp_path, capsys):
    text = edit(BASE, "lbp_m = 40.0", "lbp_m = -40.0")
    text = edit(text, 'kind = "ballast"', 'kind = "brine"')
    f = tmp_path / "bad.toml"
    f.write_text(text, encoding="utf-8")
    assert run_check(f) == 1
    lines = capsys.readouterr().out.splitlines()
    assert lines[0] == f"{f}:{line_of(text, 'lbp_m')}: vessel.lbp_m = -40.0: must be greater than 0"
    assert lines[1].startswith(f"{f}:{line_of(text, 'brine')}: tank[DB1P].kind = \"brine\": must be one of")
    assert lines[2] == f"2 problems in {f}"


def test_check_unreadable_file_exits_2(tmp_path, capsys):
    assert run_check(tmp_path / "missing.toml") == 2
    assert "cannot read" in capsys.readouterr().err


def test_check_does_not_read_a_condition_against_a_broken_profile(tmp_path, capsys):
    f = tmp_path / "bad.toml"
    f.write_text(edit(BASE, "lbp_m = 40.0", "lbp_m = -40.0"), encoding="utf-8")
    assert run_check(f, tmp_path / "c.condition.toml") == 1
    assert "not checked: its vessel profile has problems" in capsys.readouterr().out


# --------------------------------------------------------------------------- the demo vessel

DEMO_DIRS = [HERE.parent / "vessel_profiles", HERE.parent / "deckload" / "data"]
DEMO_CONDITIONS = ("departure", "midvoyage", "arrival", "light")


@pytest.mark.parametrize("folder", DEMO_DIRS, ids=["vessel_profiles", "package_data"])
def test_demo_profile_loads_and_checks(folder, capsys):
    demo = folder / "demo_islander.toml"
    v = load_profile(demo)
    assert v.particulars.name == "Demo Islander"
    assert 20 <= len(v.tanks) <= 30
    assert run_check(demo) == 0
    for name in DEMO_CONDITIONS:
        cond = folder / f"demo_islander.{name}.condition.toml"
        assert run_check(demo, cond) == 0, capsys.readouterr().out
        out = capsys.readouterr().out
        assert f"OK  {cond}:" in out


@pytest.mark.parametrize("name", DEMO_CONDITIONS)
def test_demo_conditions_round_trip(name):
    from deckload.io.profiles import dump_condition, load_condition, parse_condition

    folder = DEMO_DIRS[0]
    v = load_profile(folder / "demo_islander.toml")
    c = load_condition(folder / f"demo_islander.{name}.condition.toml", v)
    assert c.tanks, "a demo condition with no tank contents tests nothing"
    assert parse_condition(dump_condition(c), "rt.toml", v) == c


def test_hold_fill_table_must_cover_empty_to_full():
    hold = "\n[[hold]]\nid = \"H2\"\nname = \"Tween deck\"\ncapacity_m3 = 100.0\nlcg_m = 20.0\nvcg_m = 3.0\n"
    v = parse_profile(BASE + hold + "fill_pct = [0.0, 50.0, 100.0]\nfill_vcg_m = [2.0, 2.5, 3.0]\n", "b.toml")
    assert list(v.hold("H2").fill_vcg_m) == [2.0, 2.5, 3.0] and v.hold("H2").fill_lcg_m is None
    text = BASE + hold + "fill_pct = [10.0, 50.0, 100.0]\nfill_vcg_m = [2.0, 2.5, 3.0]\n"
    p = only(text)
    assert (p.key, p.rule) == ("hold[H2].fill_pct", "must run from 0 to 100 (empty to full)")
    assert p.line == line_of(text, "fill_pct = [10.0")
    p = only(BASE + hold + "fill_pct = [0.0, 100.0]\n")
    assert (p.key, p.rule) == ("hold[H2].fill_vcg_m", "required with fill_pct (centroid-against-fill table)")


def test_bad_row_of_a_multiline_table_is_reported_on_its_own_line():
    """Generated profiles (tomli-w) put one value per line: the line is the row's own."""
    import tomllib

    import tomli_w

    doc = tomllib.loads(BASE)
    doc["tank"][1]["calibration"]["fsi_m4"][2] = -1.0
    doc["cross_curves"]["kn_m"][2][4] = float("nan")
    text = tomli_w.dumps(doc)
    ps = problems(text)
    assert [(p.key, p.rule) for p in ps] == [
        ("cross_curves.kn_m", "row 3, column 5: nan is not a finite number"),
        ("tank[DB1S].calibration.fsi_m4", "must not be negative (row 3: -1.0)"),
    ]
    lines = text.splitlines()
    assert lines[ps[1].line - 1].strip() == "-1.0,"
    assert "nan" in lines[ps[0].line - 1]
    # and the kn_m row of the hand-written base
    text = edit(BASE, "2.52674, 2.00000]", "2.52674]")
    assert only(text).line == line_of(text, "2.52674]")


def test_cli_check_uses_this_validator(tmp_path, capsys):
    from deckload.cli.main import main

    assert main(["check", str(BASE_PATH)]) == 0
    f = tmp_path / "bad.toml"
    f.write_text(edit(BASE, "lbp_m = 40.0", "lbp_m = -40.0"), encoding="utf-8")
    assert main(["check", str(f)]) == 1
    assert "vessel.lbp_m = -40.0: must be greater than 0" in capsys.readouterr().out


def test_length_is_checked_even_when_the_abscissa_is_also_wrong():
    text = edit(BASE, "draft_m = [0.5, 1.0, 1.5, 2.0,", "draft_m = [0.5, 1.0, 1.0, 2.0,")
    text = edit(text, "tpc_t_cm = [4.1, 4.1, 4.1, 4.1, 4.1, 4.1, 4.1]", "tpc_t_cm = [4.1, 4.1]")
    ps = problems(text)
    assert [(p.key, p.rule) for p in ps] == [
        ("hydrostatics.draft_m", "not strictly increasing (row 3: 1.0 after 1.0)"),
        ("hydrostatics.tpc_t_cm", "has 2 values but draft_m has 7: one value per row"),
    ]


def test_cross_curves_must_reach_40_degrees():
    """The IS 2008 A 2.2.1 areas run to 40°; a KN table ending before would need extrapolation, so it is refused.
    (Tables ending between 40° and 90° are accepted: tests/test_booklet_input.py.)"""
    text = edit(BASE, "heel_deg = [0, 10, 20, 30, 40, 50, 60, 70, 80, 90]", "heel_deg = [0, 5, 10, 15, 20, 25, 30, 33, 35, 38]")
    p = only(text)
    assert p.key == "cross_curves.heel_deg" and "must reach at least 40°" in p.rule
    assert p.line == line_of(text, "heel_deg = [0, 5, 10, 15, 20, 25, 30, 33, 35, 38]")


def test_fluid_transfer_table_must_reach_90_degrees():
    """np.interp would hold the last moment flat beyond the table: refused instead."""
    import tomllib

    import tomli_w

    doc = tomllib.loads(BASE)
    doc["tank"][0]["transfer"] = {
        "fill_pct": [0.0, 50.0, 100.0],
        "heel_deg": [0.0, 15.0, 30.0, 45.0],
        "moment_m4": [[0.0] * 4, [0.0, 1.0, 2.0, 2.5], [0.0] * 4],
    }
    ps = problems(tomli_w.dumps(doc))
    assert [(p.key, "must end at 90" in p.rule) for p in ps] == [("tank[DB1P].transfer.heel_deg", True)]
