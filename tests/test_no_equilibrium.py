"""A condition whose GZ never becomes positive on the side she heels to: no position of
equilibrium up to the curve's last angle.  No number stands for the list there (a heel beyond
the last angle the tables know is not a number they can give): the result carries none, every
printout and the screen say "none: GZ never positive", the vanishing angle is not "beyond" the
curve, a limit on the static heel below the curve's end fails and one beyond it cannot be judged,
the draft marks are not predicted, and the ballast planner neither starts from such a condition
nor passes through one.

The premise of each case is checked first: GZ is below zero at every angle of the curve.
"""

from __future__ import annotations

import dataclasses
import json

import pytest

from deckload.cli.main import main
from deckload.core import ballast_plan
from deckload.core.model import ExtraCriterion
from deckload.core.stability import evaluate
from deckload.report import verdict_format as vf
from deckload.ui import entry
from demo_vessels import copy_of_demo
from vessel_factories import barge_at


@pytest.fixture
def capsizing_trawler(tmp_path):
    """The demo trawler on the grounds with 24 t hung 3.5 m to starboard 4 m above the keel: GM fluid
    stays positive (0.70 m) but the list the TCG asks for lies where GZ has already turned down, so GZ
    heeling to starboard is negative at every angle of her KN tables, which end at 60°."""
    copy_of_demo(tmp_path, "demo_islander")  # (for the marks: the trawler has none)
    copy_of_demo(tmp_path, "demo_trawler")
    cond = tmp_path / "demo_trawler.grounds.condition.toml"
    cond.write_text(cond.read_text(encoding="utf-8") + '\n[[deck_item]]\nname = "Test weight"\nmass_t = 24.0\n'
                    "lcg_m = 9.0\nvcg_m = 4.0\ntcg_m = 3.5\n", encoding="utf-8")
    return tmp_path / "demo_trawler.toml", cond


def test_calc_gives_no_list_and_no_vanishing_angle_beyond_the_curve(capsizing_trawler, capsys):
    profile, cond = capsizing_trawler
    assert main(["calc", str(profile), str(cond), "--json"]) == 0
    doc = json.loads(capsys.readouterr().out)
    assert doc["criteria_side"] == "starboard" and doc["gz_end_deg"] == 60.0  # the premise
    assert max(p["gz_m"] for p in doc["gz"]) < 0.0
    assert doc["gm_fluid_m"] > 0.0
    assert doc["list_deg"] is None and doc["vanishing_angle_deg"] is None
    assert "GZ never becomes positive heeling to starboard up to 60°: no position of equilibrium" in doc["warnings"]
    assert main(["calc", str(profile), str(cond)]) == 0
    text = capsys.readouterr().out
    assert "List         none: GZ never positive" in text and "90.0°" not in text
    assert "GZ never positive   θf" in text and "vanishing beyond" not in text


def test_the_report_says_none_for_the_list_and_the_vanishing_angle(capsizing_trawler, tmp_path):
    profile, cond = capsizing_trawler
    out = tmp_path / "report.txt"
    assert main(["report", str(profile), str(cond), "--txt", "-o", str(out)]) == 0
    lines = out.read_text(encoding="utf-8").splitlines()
    listed = next(line for line in lines if line.startswith("List "))
    vanishing = next(line for line in lines if line.startswith("Vanishing angle "))
    assert vf.NO_EQUILIBRIUM in listed and vf.NO_EQUILIBRIUM in vanishing and "beyond" not in vanishing


def test_the_marks_are_not_predicted(capsizing_trawler, capsys):
    """The demo islander (the trawler has no draft marks) at departure with 80 t 6 m above the keel
    and 4 m to starboard: GZ heeling to starboard is negative to 90°."""
    profile, cond = capsizing_trawler
    profile, cond = profile.parent / "demo_islander.toml", profile.parent / "islander.condition.toml"
    cond.write_text((profile.parent / "demo_islander.departure.condition.toml").read_text(encoding="utf-8")
                    + '\n[[deck_item]]\nname = "Test weight"\nmass_t = 80.0\nlcg_m = 17.0\nvcg_m = 6.0\n'
                    "tcg_m = 4.0\n", encoding="utf-8")
    assert main(["calc", str(profile), str(cond), "--json"]) == 0
    doc = json.loads(capsys.readouterr().out)
    assert max(p["gz_m"] for p in doc["gz"]) < 0.0 and doc["list_deg"] is None  # the premise
    assert main(["marks", str(profile), str(cond)]) == 1
    assert "no position of equilibrium: no reading at the marks can be predicted" in capsys.readouterr().err


def test_a_limit_on_the_static_heel_fails_below_the_curves_end_and_cannot_be_judged_beyond_it():
    """GZ negative at every heel to 90° (KG 15 m on a 4 m deep barge): a static heel of at most 10°
    fails, the value shown being the curve's end with the reason; at most 95° (beyond the curve's
    end) is not assessable."""
    v, c = barge_at(2.0, 15.0)
    v = dataclasses.replace(v, criteria=dataclasses.replace(v.criteria, extra=(
        ExtraCriterion("max_static_heel", 10.0, "Class rule 3.4"), ExtraCriterion("max_static_heel", 95.0, "r2"))))
    r = evaluate(v, c)
    assert max(r.gz_m[1:]) < 0.0 and r.list_deg is None  # the premise
    low, high = [k for k in r.criteria if k.id.endswith("max-static-heel")]
    assert (low.value, low.passed, low.assessed) == (90.0, False, True)
    assert low.note == "GZ never becomes positive up to 90°: she heels beyond it"
    assert (high.assessed, high.note) == (False, "GZ never becomes positive up to 90°, the curve's end")
    gm = [w.message for w in r.warnings if w.code == "negative-gm"]
    assert gm == [f"GM fluid {r.gm_fluid_m:.3f} m is not positive"]  # no angle of loll either


def test_the_planner_neither_starts_from_nor_passes_through_no_equilibrium(capsizing_trawler):
    from deckload.io.profiles import load_condition, load_profile

    profile, cond = capsizing_trawler
    v = load_profile(profile)
    c = load_condition(cond, v)
    assert evaluate(v, c).list_deg is None  # the premise
    goal = ballast_plan.Goal("list", 0.0, 0.1)
    tanks = [t.id for t in v.tanks if t.id.startswith("FO")]
    with pytest.raises(ValueError, match="no position of equilibrium as she is"):
        ballast_plan.plan(v, c, goal, tanks, move=lambda *a: entry.planner_move(v, *a),
                          room=lambda *a: entry.planner_room(v, *a), evaluate=evaluate)
    # a condition with no equilibrium has no list to give a list goal
    with pytest.raises(ValueError, match="no position of equilibrium"):
        ballast_plan.value_of(evaluate(v, c), goal)
    # passing through: the search takes a trial with no equilibrium as a step it cannot make,
    # whatever the goal (a GM goal has a value there: GM fluid stays positive, 0.70 m)
    fine = dataclasses.replace(c, deck_items=c.deck_items[:-1])
    gm = ballast_plan.Goal("gm", 0.5, 0.001)
    q0 = ballast_plan.value_of(evaluate(v, fine), gm)
    assert ballast_plan._search(v, gm, 1.0, q0, lambda m: c, evaluate) == (None, None)


def test_the_screen_shows_no_list_and_a_curve_never_positive(capsizing_trawler):
    """The loading screen's 'Afloat' lines and the GZ chart's caption, as drawn from the result."""
    from deckload.io.profiles import load_condition, load_profile
    from deckload.ui import views

    profile, cond = capsizing_trawler
    v = load_profile(profile)
    c = load_condition(cond, v)
    r = evaluate(v, c)
    afloat = "\n".join(t.plain for t in views.afloat_lines(v, c, r, False))
    listed = next(line for line in afloat.splitlines() if "List" in line)
    assert "none" in listed and "GZ<0" in listed and "90.0" not in afloat
    caption = views.gz_caption(r).plain
    assert "never positive" in caption and "beyond" not in caption
