"""The second demo vessel, Demo Trawler (invented), entered the way a crew enters a vessel from
her stability booklet: tables in CSV files, positions from midships, extreme drafts, KN only to
60°, tanks read by ullage or from a raised sounding zero, one-value FSM tanks, a capacity-only
tank, constants in the profile, and the booklet's own worked conditions.

Her booklet was invented from ``vessel_profiles/demo_trawler.geometry.toml`` by
``tests/tools/demo_trawler_booklet.py``; the booklet's printed results of its worked conditions were
computed by ``tests/tools/demo_trawler_booklet_conditions.py`` with trimesh (a general-purpose mesh
library) on the hull offsets — not from deckload's tables — so the acceptance test below is a
comparison with an independent reference, within the MSC.1/Circ.1229 / IACS UR L5 tolerances
(standards.md §5.3).
"""

from __future__ import annotations

import importlib.util
import json
import shutil
import tomllib
from pathlib import Path

import numpy as np
import pytest

from deckload.io import paths
from deckload.cli.main import main
from deckload.core.stability import evaluate
from deckload.io.profiles import load_condition, load_profile
from demo_vessels import demo_vessel, trawler_vessel

ROOT = Path(__file__).resolve().parents[1]
BROWSABLE = ROOT / "vessel_profiles"
PACKAGED = ROOT / "deckload" / "data"
CONDITIONS = ("departure", "grounds", "arrival")


def _tool(name: str):
    """A script of tests/tools/ as a module (tests/tools/ is not a package)."""
    spec = importlib.util.spec_from_file_location(name, ROOT / "tests" / "tools" / f"{name}.py")
    mod = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(mod)
    return mod


def _files(folder: Path) -> dict[str, bytes]:
    out = {p.name: p.read_bytes() for p in folder.glob("demo_trawler*.toml") if ".geometry." not in p.name}
    out.update({str(p.relative_to(folder)): p.read_bytes() for p in (folder / "demo_trawler").rglob("*.csv")})
    return out


@pytest.fixture(scope="module")
def trawler():
    vessel = trawler_vessel()
    return vessel, {k: load_condition(p, vessel) for k, p in paths.TRAWLER_CONDITIONS.items()}


def test_packaged_copies_equal_the_browsable_ones():
    browsable, packaged = _files(BROWSABLE), _files(PACKAGED)
    assert sorted(browsable) == sorted(packaged)
    assert len([k for k in browsable if k.endswith(".csv")]) >= 10  # hydrostatics, KN, flooding, hold, 8 tanks
    for name, data in browsable.items():
        assert packaged[name] == data, name


def test_pyproject_ships_the_csv_pages():
    """The CSV pages live two folders down in deckload/data; package-data must reach them."""
    import fnmatch

    globs = tomllib.loads((ROOT / "pyproject.toml").read_text(encoding="utf-8"))["tool"]["setuptools"]["package-data"]["deckload"]
    for p in (PACKAGED / "demo_trawler").rglob("*.csv"):
        rel = str(p.relative_to(ROOT / "deckload"))
        assert any(fnmatch.fnmatch(rel, g) and rel.count("/") == g.count("/") for g in globs), rel


def test_the_profile_works_without_any_geometry_file(tmp_path):
    """A crew has no hull model: the profile, its CSV pages and conditions alone are enough."""
    for name in [f"demo_trawler.{c}.condition.toml" for c in CONDITIONS] + ["demo_trawler.toml"]:
        shutil.copyfile(BROWSABLE / name, tmp_path / name)
    shutil.copytree(BROWSABLE / "demo_trawler", tmp_path / "demo_trawler")
    assert not list(tmp_path.rglob("*.geometry.toml"))
    v = load_profile(tmp_path / "demo_trawler.toml")
    r = evaluate(v, load_condition(tmp_path / "demo_trawler.arrival.condition.toml", v))
    assert 200.0 < r.displacement_t < 260.0


def test_the_profile_is_written_the_way_the_booklet_prints_it(trawler):
    vessel, _ = trawler
    raw = tomllib.loads(paths.TRAWLER_PROFILE.read_text(encoding="utf-8"))
    assert raw["vessel"]["longitudinal_datum"] == "midships" and raw["lightship"]["lcg_m"] < 0  # aft of midships
    assert raw["hydrostatics"]["draft_basis"] == "extreme" and raw["vessel"]["keel_thickness_m"] > 0
    assert float(vessel.cross_curves.heel_deg[-1]) == 60.0  # KN printed only to 60°
    tanks = {t["id"]: t for t in raw["tank"]}
    assert any("ullage_reference_m" in t for t in tanks.values())
    assert any(t.get("sounding_zero_m", 0) > 0 for t in tanks.values())
    assert any("max_fsm_tm" in t for t in tanks.values())
    assert [i for i, t in tanks.items() if "calibration" not in t] == ["HYD"]  # capacity and centre only
    assert {c.name for c in vessel.constants} == {"Crew (6) and effects", "Provisions and stores"}
    # the conversions land where the invented hull puts them (x from the AP)
    assert vessel.lightship.lcg_m == pytest.approx(22.0 / 2 - 1.60)
    fo1p = vessel.tank("FO1P")
    assert float(np.mean(fo1p.calibration.tcg_m[1:])) < 0 < float(np.mean(vessel.tank("FO1S").calibration.tcg_m[1:]))
    assert float(np.mean(vessel.tank("FO2P").calibration.tcg_m[1:])) < 0  # printed as distances, port side


def test_booklet_pages_are_what_the_writer_makes_from_the_geometry(tmp_path):
    """The committed geometry, CSV pages and profile are reproducible from their scripts, byte for byte."""
    geometry = (BROWSABLE / "demo_trawler.geometry.toml").read_text(encoding="utf-8")
    assert _tool("demo_trawler_geometry").geometry_text() == geometry
    booklet = _tool("demo_trawler_booklet")
    text = booklet.booklet_text(tmp_path / "demo_trawler")
    committed = paths.TRAWLER_PROFILE.read_text(encoding="utf-8")
    assert committed.startswith(text)
    ours = {str(p.relative_to(tmp_path)): p.read_bytes() for p in tmp_path.rglob("*.csv")}
    theirs = {k: v for k, v in _files(BROWSABLE).items() if k.endswith(".csv")}
    assert ours == theirs


def test_the_three_conditions_meet_the_criteria_and_are_what_they_say(trawler):
    vessel, conds = trawler
    assert set(conds) == set(CONDITIONS)
    results = {k: evaluate(vessel, c) for k, c in conds.items()}
    for name, r in results.items():
        assert [c.id for c in r.criteria if not c.passed] == [], name
        # the weather criterion is assessed on a GZ curve that stops at 60° (it used to crash there)
        assert {"IS2008-A2.3-theta0", "IS2008-A2.3-area-b-a"} <= {c.id for c in r.criteria}, name
        assert not [w for w in r.warnings if w.severity == "danger"], name
        # every deck item states what it adds to the windage (the drum shows above the bulwark)
        assert not [w.message for w in r.warnings if "no windage given" in w.message], name
        summer = next(ll for ll in vessel.load_lines if ll.name == "summer")
        assert r.draft_mean_m < summer.draft_m, name
    fill = {k: {t.id: t.fill_pct for t in r.tanks} for k, r in results.items()}
    assert all(fill["departure"][t] >= 95.0 for t in ("FO1P", "FO1S", "FO2P", "FO2S", "FWP", "FWS", "FW2"))
    assert all(fill["arrival"][t] == pytest.approx(10.0) for t in ("FO1P", "FO1S", "FO2P", "FO2S", "FWP", "FWS", "FW2"))
    hold = {k: next(h.mass_t for h in c.holds if h.hold_id == "FH") for k, c in conds.items()}
    assert hold["departure"] < hold["grounds"] < hold["arrival"] == vessel.hold("FH").max_mass_t
    # the arrival's provisions constant replaces the profile's one
    prov = [i for i in results["arrival"].items if "Provisions" in i.name]
    assert [round(i.mass_t, 2) for i in prov] == [0.15]


def test_booklet_conditions_are_met_within_the_ur_l5_tolerances(trawler):
    """The acceptance test a surveyor makes (standards.md §5.4): each booklet condition recomputed
    by deckload from the booklet-style tables, against the booklet's results computed with trimesh
    (independent reference), row by row within MSC.1/Circ.1229 / UR L5 (standards.md §5.3)."""
    from deckload.io.booklet_conditions import load_booklet_conditions
    from deckload.core.booklet import compare

    vessel, _ = trawler
    cases = load_booklet_conditions(paths.TRAWLER_PROFILE, vessel)
    assert len(cases) >= 2
    for case in cases:
        rows = compare(evaluate(vessel, case.condition), case.expected, vessel.particulars.breadth_m)
        assert len(rows) >= 20, case.name  # Δ, weights, GM, drafts, GZ at four angles, areas
        bad = [(r.label, r.booklet, r.deckload, r.allowed) for r in rows if not r.passed]
        assert bad == [], (case.name, bad)


def test_check_passes_on_the_trawler_with_its_booklet_conditions(capsys):
    assert main(["check", "trawler"]) == 0
    out = capsys.readouterr().out
    assert "booklet conditions: 3 of 3 within" in out
    assert "plausibility audit: nothing suspicious found" in out
    assert "converted: hydrostatics lcb_m, lcf_m: from midships" in out


@pytest.mark.long
def test_booklet_results_are_reproduced_by_the_trimesh_script():
    """The printed booklet results of condition 2 (on the grounds) are what
    tests/tools/demo_trawler_booklet_conditions.py makes now from the condition file and the hull
    offsets (trimesh): Δ, LCG, KG, FSM, the free-trim drafts and GZ at 30°, to half a unit of the
    last printed decimal.  (All 23 rows of all three conditions take a minute: run the script.)"""
    pytest.importorskip("trimesh")
    pytest.importorskip("scipy")
    tool = _tool("demo_trawler_booklet_conditions")
    hull, meshes, tank_meshes = tool.reference_meshes()
    case = tomllib.loads(paths.TRAWLER_PROFILE.read_text(encoding="utf-8"))["booklet_condition"][1]
    assert case["condition_file"] == "demo_trawler.grounds.condition.toml"
    disp, lcg, kg, _, fsm = tool.weights(BROWSABLE / case["condition_file"], tool.profile_head(), meshes, tank_meshes)
    e = case["expected"]
    assert (disp, fsm) == pytest.approx((e["displacement_t"], e["fsm_tm"]), abs=0.0051)  # printed to 0.01
    # the booklet prints LCG from midships and extreme drafts, and the profile says so
    assert (e["longitudinal_datum"], e["longitudinal_positive"], e["draft_basis"]) == ("midships", "forward", "extreme")
    assert (lcg - 11.0, kg) == pytest.approx((e["lcg_m"], e["kg_m"]), abs=0.00051)  # printed to 0.001
    aft, mid, fwd = tool.equilibrium(hull, disp / tool.RHO_SW, lcg, kg)
    keel = 0.012
    assert (aft + keel, mid + keel, fwd + keel) == pytest.approx(
        (e["draft_aft_m"], e["draft_mid_m"], e["draft_fwd_m"]), abs=0.00051)
    kn30, _ = tool.ref_kn(hull, disp / tool.RHO_SW, 30.0, "free trim", lcg, kg)
    gz30 = kn30 - (kg + fsm / disp) * 0.5
    assert gz30 == pytest.approx(e["gz_m"][e["gz_heel_deg"].index(30)], abs=0.00051)


def test_calc_report_and_log_work_on_the_trawler_shorthand(tmp_path, capsys, trawler):
    vessel, conds = trawler
    assert main(["calc", "trawler", "grounds", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["displacement_t"] == pytest.approx(evaluate(vessel, conds["grounds"]).displacement_t)
    assert {t["id"] for t in out["tanks"]} >= {"FO1P", "HYD", "FW2"}
    rep = tmp_path / "arrival.txt"
    assert main(["report", "trawler", "arrival", "--txt", "-o", str(rep)]) == 0
    text = rep.read_text(encoding="utf-8")
    assert "Demo Trawler" in text and "never replaces" in text
    assert "Weather: area b against area a" in text and "KN tables end at 60°" in text
    logs = tmp_path / "logs"
    assert main(["log", "--dir", str(logs), "record", "trawler", "departure", "--by", "JK",
                 "--ship-offset", "+00:00"]) == 0
    assert main(["log", "--dir", str(logs), "verify"]) == 0
    capsys.readouterr()
    assert main(["log", "--dir", str(logs), "show"]) == 0
    assert "Departure for the fishing grounds" in capsys.readouterr().out


def test_a_packaged_demo_vessel_opens_on_its_departure(tmp_path):
    from deckload.ui.launch import load_inputs

    cond = load_inputs(paths.TRAWLER_PROFILE, None, tmp_path / "work").condition
    assert cond.name == "Departure for the fishing grounds"
    cond = load_inputs(None, None, tmp_path / "work").condition
    assert cond.name == load_condition(paths.DEMO_CONDITIONS["departure"], demo_vessel()).name
    other = tmp_path / "copy.toml"  # any other profile starts from an empty condition
    assert paths.demo_start_condition(other) is None


async def test_the_screen_opens_on_the_trawler_and_takes_an_ullage(tmp_path, trawler):
    """Pilot: the screen on the trawler; an ullage typed for FO1P gives the volume of the booklet's
    ullage table (FO1P.csv row 'ullage 1.00 m'), read directly from the CSV page."""
    import csv

    from deckload.ui.launch import create_app, load_inputs
    from deckload.ui.widgets import LoadBoard

    start = load_inputs(paths.TRAWLER_PROFILE, None, tmp_path / "work")
    vessel, condition = start.vessel, start.condition
    app = create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs")
    with open(BROWSABLE / "demo_trawler" / "tanks" / "FO1P.csv", encoding="utf-8") as f:
        page = {float(r["ullage_m"]): float(r["volume_m3"]) for r in csv.DictReader(f)}
    async with app.run_test(size=(120, 40)) as pilot:
        assert app.session.result.displacement_t == pytest.approx(evaluate(vessel, condition).displacement_t)
        assert app.screen.query_one(LoadBoard).select(("tank", "FO1P"))
        await pilot.press("enter", *"1.00u", "enter")
        await pilot.pause()
        fill = next(t for t in app.session.condition.tanks if t.tank_id == "FO1P")
        assert (fill.quantity, fill.value) == ("ullage_m", 1.0)
        got = next(t for t in app.session.result.tanks if t.id == "FO1P")
        assert got.volume_m3 == pytest.approx(page[1.0], abs=5e-4)  # the page prints 1 litre


def _copy_without_geometry(tmp_path: Path) -> Path:
    for p in BROWSABLE.glob("demo_trawler*.toml"):
        if ".geometry." not in p.name:
            shutil.copyfile(p, tmp_path / p.name)
    shutil.copytree(BROWSABLE / "demo_trawler", tmp_path / "demo_trawler")
    return tmp_path / "demo_trawler.toml"


@pytest.mark.parametrize("slip, file, old, new, expect", [
    # the booklet's midships positions typed under the wrong datum
    ("datum", "demo_trawler.toml", 'longitudinal_datum = "midships"', 'longitudinal_datum = "AP"\n#',
     ["tanks/FWP.csv:2: ", "tank[FWP].calibration.lcg_m = -8.5"]),
    # a decimal point slipped in the KN page (1.880 typed 18.80)
    ("kn decimal", "demo_trawler/kn.csv", ",1.880,", ",18.80,", ["kn.csv:2: ERROR cross_curves.kn_m = 18.8 m"]),
    # the starboard wing tank's centres typed with the port mark
    ("pair side", "demo_trawler/tanks/FO1S.csv", " S,", " P,", ["ERROR tank[FO1P].calibration.tcg_m", "both centres are on the port side"]),
    # a constant typed in kilograms, named by its name as a tank by its id (it was 'constant[#2]')
    ("constant kg", "demo_trawler.toml", "mass_t = 1.5\n", "mass_t = 1500.0\n",
     ["demo_trawler.toml:45: constant[Provisions and stores].mass_t = 1500.0: above the physical limit"]),
])
def test_typing_slips_in_the_trawlers_booklet_pages_are_stopped_by_check(tmp_path, capsys, slip, file, old, new, expect):
    """Step 10 of "Setting up your vessel from the booklet": the slips a booklet invites, made on the
    worked example, make `check` fail and name the file, line and value (issue 8's list)."""
    profile = _copy_without_geometry(tmp_path)
    target = tmp_path / file
    text = target.read_text(encoding="utf-8")
    assert old in text
    target.write_text(text.replace(old, new, 1), encoding="utf-8")
    assert main(["check", str(profile)]) == 1
    out = capsys.readouterr().out
    for e in expect:
        assert e in out, (slip, e)


def test_the_trawlers_pages_round_trip_through_deckload_csv(tmp_path, capsys):
    """CSV → profile → CSV gives the same numbers (issue 8, done-when): `deckload csv` writes every
    page back in the booklet's own conventions, and each equals the page it was read from."""
    import csv

    def cells(path: Path) -> dict[str, list[float]]:
        def val(c: str) -> float:
            c = c.strip()
            return -float(c[:-1]) if c.endswith("P") else float(c[:-1]) if c.endswith("S") else float(c)

        with open(path, encoding="utf-8") as f:
            rows = list(csv.DictReader(f))
        return {k: [val(r[k]) for r in rows] for k in rows[0]}

    assert main(["csv", "trawler", str(tmp_path)]) == 0
    pages = BROWSABLE / "demo_trawler"
    pairs = {"hydrostatics.csv": "hydrostatics.csv", "kn.csv": "cross_curves.csv",
             "downflooding.csv": "downflooding.csv", "fh_fill.csv": "hold_FH_fill.csv"}
    pairs.update({f"tanks/{p.name}": f"tank_{p.name}" for p in (pages / "tanks").glob("*.csv")})
    for ours, written in pairs.items():
        a, b = cells(pages / ours), cells(tmp_path / written)
        assert sorted(a) == sorted(b), ours
        for col in a:
            np.testing.assert_allclose(b[col], a[col], atol=1e-9, err_msg=f"{ours} {col}")


@pytest.mark.parametrize("section", ["[hydrostatics]", "[cross_curves]", "  [tank.calibration]"])
def test_the_key_list_says_the_booklets_tables_may_be_typed(section):
    """The profile README's key list marked these sections "# generated" alone, as if a hull model
    were needed; the Trawler (above) is entered with none, so it says both ways (found by an audit)."""
    readme = (BROWSABLE / "README.md").read_text(encoding="utf-8")
    (line,) = [ln for ln in readme.splitlines() if ln.startswith(section + " ") and "#" in ln]
    assert "# generated by `tables`, or typed from the booklet" in line
