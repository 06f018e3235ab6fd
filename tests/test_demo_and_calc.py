"""The demo vessel's conditions and the ``deckload calc`` command.

The demo vessel is invented; these tests check that its shipped conditions are what the
README promises (all pass IS 2008 Part A 2.2, one has a slack tank in its worst band), that
the browsable copies equal the packaged ones, and that ``calc`` prints what it documents.
"""

import json
import subprocess
import sys
from pathlib import Path

import pytest

from deckload.cli.main import main
from deckload.core.stability import evaluate
from deckload.io.paths import DEMO_CONDITIONS, DEMO_PROFILE
from deckload.io.profiles import load_condition
from demo_vessels import demo_vessel

ROOT = Path(__file__).resolve().parents[1]

JSON_KEYS = {
    "displacement_t", "deadweight_t", "lcg_m", "kg_m", "tcg_m", "fsc_m", "kg_fluid_m", "km_m",
    "gm_solid_m", "gm_fluid_m", "draft_aft_m", "draft_fwd_m", "draft_mean_m", "trim_m", "list_deg",
    "gz", "criteria", "tanks", "warnings",
}


@pytest.fixture(scope="module")
def demo():
    vessel = demo_vessel()
    return vessel, {k: load_condition(p, vessel) for k, p in DEMO_CONDITIONS.items()}


def test_packaged_demo_files_equal_the_browsable_copies():
    for packaged in [DEMO_PROFILE, *DEMO_CONDITIONS.values()]:
        browsable = ROOT / "vessel_profiles" / packaged.name
        assert browsable.read_bytes() == packaged.read_bytes(), packaged.name


def test_every_demo_condition_meets_the_criteria(demo):
    vessel, conditions = demo
    assert set(conditions) == {"departure", "midvoyage", "arrival", "light"}
    for name, cond in conditions.items():
        r = evaluate(vessel, cond)
        failed = [c.id for c in r.criteria if not c.passed]
        assert failed == [], f"{name}: {failed}"
        assert not [w for w in r.warnings if w.severity == "danger"], name
        assert len(r.criteria) >= 6


def test_one_demo_condition_has_a_slack_tank_in_its_worst_band(demo):
    vessel, conditions = demo
    banded = {n: [t.id for t in evaluate(vessel, c).tanks if t.state == "worst_band"] for n, c in conditions.items()}
    assert banded["midvoyage"], banded
    r = evaluate(vessel, conditions["midvoyage"])
    assert any(w.code == "slack-worst-band" for w in r.warnings)


def test_arrival_has_ten_percent_consumables(demo):
    vessel, conditions = demo
    r = evaluate(vessel, conditions["arrival"])
    consumables = [t for t in r.tanks if t.kind in ("fuel_oil", "diesel", "fresh_water", "lube_oil")]
    assert consumables and all(abs(t.fill_pct - 10.0) < 1e-9 for t in consumables)


def test_midvoyage_ballast_transfer_keeps_the_ballast_mass(demo):
    """The fore peak's ballast went into the No.3 double-bottom pair: the mass aboard is the same."""
    vessel, conditions = demo
    dep = {t.id: t.mass_t for t in evaluate(vessel, conditions["departure"]).tanks if t.kind == "ballast"}
    mid = {t.id: t.mass_t for t in evaluate(vessel, conditions["midvoyage"]).tanks if t.kind == "ballast"}
    # The DB3 fills are typed to 0.1 % (57.9 %), so the pair holds the fore peak's mass to within one
    # unit of that digit: 0.1 % of the pair's full mass, 2·capacity·ρ/1000 ≈ 0.040 t (the difference is 0.022 t).
    step_t = sum(vessel.tank(k).capacity_m3 * vessel.tank(k).density_t_m3 for k in ("DB3P", "DB3S")) / 1000.0
    assert abs(sum(mid.values()) - sum(dep.values())) <= step_t
    assert mid["FPT"] == 0.0 and dep["FPT"] > 0.0


def test_calc_json_has_the_documented_keys(capsys, demo):
    code = main(["calc", str(DEMO_PROFILE), str(DEMO_CONDITIONS["departure"]), "--json"])
    assert code == 0
    data = json.loads(capsys.readouterr().out)
    assert JSON_KEYS <= set(data)
    assert data["gz"][0]["heel_deg"] == 0.0
    assert data["gz"][0]["gz_m"] == pytest.approx(-data["tcg_m"], abs=1e-12)
    assert {"id", "description", "value", "limit", "pass"} <= set(data["criteria"][0])
    assert {"id", "fill_pct", "volume_m3", "mass_t", "fsm_tm", "state"} <= set(data["tanks"][0])
    # a JSON copy leaves without the screen around it: it carries the caution (README, "Safety")
    assert data["caution"].startswith("deckload supports, and never replaces, the approved stability booklet")
    # The JSON carries the same numbers as the computation (rounding-free: floats written in full).
    vessel, conditions = demo
    r = evaluate(vessel, conditions["departure"])
    scalars = {k for k, x in data.items() if isinstance(x, float)}
    assert JSON_KEYS - {"gz", "criteria", "tanks", "warnings"} <= scalars
    for key in scalars:
        assert data[key] == getattr(r, key), key


def test_calc_text_summary_names_the_criteria_and_the_caution(capsys):
    assert main(["calc", str(DEMO_PROFILE), str(DEMO_CONDITIONS["midvoyage"])]) == 0
    out = capsys.readouterr().out
    assert "IS Code 2008 Part A 2.2.1" in out
    assert "worst free-surface band" in out
    assert "never replaces, the approved stability booklet" in out


def test_calc_exits_nonzero_with_a_message_on_bad_input(tmp_path, capsys):
    bad = tmp_path / "bad.condition.toml"
    bad.write_text('format = "deckload-condition-1"\n[condition]\nname = "x"\n[tanks.NOPE]\npercent = 50\n')
    code = main(["calc", str(DEMO_PROFILE), str(bad)])
    err = capsys.readouterr().err
    assert code != 0
    assert "bad.condition.toml" in err and "NOPE" in err


def test_calc_exits_nonzero_when_displacement_leaves_the_tables(tmp_path, capsys):
    heavy = tmp_path / "heavy.condition.toml"
    heavy.write_text(
        'format = "deckload-condition-1"\n[condition]\nname = "overloaded"\nwater_density_t_m3 = 1.025\n'
        # two blocks, each within one item's bound (Δmax − lightship), together beyond the table
        + '[[deck_item]]\nname = "block"\nmass_t = 400.0\nlcg_m = 17.0\nvcg_m = 5.0\ntcg_m = 0.0\n' * 2
    )
    code = main(["calc", str(DEMO_PROFILE), str(heavy)])
    err = capsys.readouterr().err
    assert code != 0
    assert "outside the table range" in err and "heavy.condition.toml" in err


def test_console_script_runs_as_a_module():
    out = subprocess.run(
        [sys.executable, "-m", "deckload", "calc", str(DEMO_PROFILE), str(DEMO_CONDITIONS["arrival"]), "--json"],
        capture_output=True, text=True, timeout=60,
    )
    assert out.returncode == 0, out.stderr
    assert json.loads(out.stdout)["condition"].startswith("Arrival")


def test_light_condition_is_governed_by_the_weather_criterion(demo):
    """The invented 'light' condition: high in the water with a large windage area, the weather
    criterion (IS 2008 Part A 2.3) has the smallest margin of every criterion."""
    vessel, conditions = demo
    r = evaluate(vessel, conditions["light"])
    assert r.smallest_margin is not None and r.smallest_margin.set_id == "IS2008-A2.3"
    assert r.weather is not None and r.weather.area_b_mrad >= r.weather.area_a_mrad
    assert r.displacement_t >= vessel.free_surface.min_operating_displacement_t  # a real operating condition
    for name in ("departure", "midvoyage", "arrival"):
        assert evaluate(vessel, conditions[name]).smallest_margin.set_id != "IS2008-A2.3", name


def test_calc_json_has_the_weather_criterion_and_what_was_not_assessed(capsys):
    """Issue 9 'done when': the weather criterion among `criteria` with value, limit, margin and
    pass; `assessed` names both sets; `not_assessed` lists damage stability and the rest."""
    assert main(["calc", "demo", "departure", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    weather = [c for c in data["criteria"] if c["set"] == "IS2008-A2.3"]
    assert {c["id"] for c in weather} == {"IS2008-A2.3-theta0", "IS2008-A2.3-area-b-a"}
    for c in weather:
        assert c["assessed"] and c["pass"]
        assert c["margin"] == pytest.approx(c["value"] - c["limit"] if c["comparison"] == ">=" else c["limit"] - c["value"])
        assert "IS Code 2008 Part A 2.3" in c["source"]
    assert [a["id"] for a in data["assessed"]] == ["IS2008-A2.2", "IS2008-A2.3"]
    items = " ".join(n["item"] for n in data["not_assessed"])
    for word in ("damage stability", "grain", "icing", "longitudinal strength"):
        assert word in items
    assert "weather" not in items  # the demo has windage data
    assert data["weather"]["lw2_m"] == pytest.approx(1.5 * data["weather"]["lw1_m"])  # standards.md §2.2 [M] factor
    # freeboard = depth at side (4.5 m) − midships draft; the margin to the summer mark in sea water
    assert data["freeboard_m"] == pytest.approx(4.5 - data["draft_mean_m"], abs=1e-9)
    assert data["load_line_margin_m"] == pytest.approx(2.9 - data["draft_mean_m"], abs=1e-9)
    assert 10.0 < data["deck_edge_angle_deg"] < 25.0
    assert "All criteria met" not in data["verdict"] and "IS Code 2008 Part A 2.3" in data["verdict"]
