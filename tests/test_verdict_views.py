"""Every summary names the criteria sets it covers and lists what was not assessed (issue 9).

Screen (textual pilot), ``deckload calc`` text, ``deckload check`` and stored log summaries.
The demo vessel is evaluated by the engine (IS 2008 A 2.2 and A 2.3 assessed); the
hand-filled samples of ``verdict_samples`` give a failed weather criterion and a criterion
the data cannot decide, which the demo does not have.  These tests check what the views
show, not the numbers (the engine's tests do that).
"""

from __future__ import annotations

import re

import pytest

from deckload.io import paths
from deckload.report import verdict_format as vf
from deckload.cli.main import main
from deckload.io.profiles import load_condition
from deckload.ui.launch import create_app
from deckload.ui.dialogs import TextScreen
from deckload.ui.widgets import LinePanel
from verdict_samples import with_verdict
from demo_vessels import demo_vessel


def _app(tmp_path, name="departure"):
    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS[name], vessel)
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


def panel(app, name: str) -> str:
    return app.screen.query_one(f"#{name}", LinePanel).plain()


def _met_without_sets(text: str) -> bool:
    """The panel's heading (the lines before the first set) says 'met' but names no set; or any line
    says 'all … met'."""
    lines = text.splitlines()
    head = " ".join(lines[: next((i for i, x in enumerate(lines) if "▸" in x), len(lines))])
    if re.search(r"\bmet\b", head) and not re.search(r"A ?2\.\d", head):
        return True
    return any(re.search(r"\ball\b.*\bmet\b", x, re.I) for x in lines)


@pytest.fixture
def sample_evaluate(monkeypatch):
    """Make the screen's engine return the demo result with the verdict fields filled by hand."""
    import deckload.core.stability as st

    real = st.evaluate

    def use(**kw):
        monkeypatch.setattr(st, "evaluate", lambda v, c: with_verdict(real(v, c), **kw))

    return use


@pytest.mark.parametrize("size", [(120, 40), (80, 24)])
async def test_the_panel_names_the_sets_and_lists_what_was_not_assessed(tmp_path, size):
    app = _app(tmp_path)
    async with app.run_test(size=size) as pilot:
        # The panel is filled for the size it has; on the first frame the layout may not have given
        # it its final size yet (the next frame has): read it once two frames in a row agree.
        crit = None
        for _ in range(20):
            await pilot.pause()
            crit, before = panel(app, "criteria"), crit
            if crit == before:
                break
        r = app.session.result
        lines = crit.splitlines()
        assert lines[0].startswith(" Criteria met")
        assert "IS2008-A2.2" in crit or "IS2008 A2.2" in crit
        assert "A2.3" in crit
        assert not _met_without_sets(crit)
        assert "Not assessed:" in crit
        if size == (120, 40):  # wide: every item by name, and every criterion of both sets
            for n in r.not_assessed:
                assert vf.short_item(n.item) in " ".join(crit.split())
            assert "A 2.2 general criteria" in crit and "A 2.3 weather criterion" in crit
            assert "Wind heel θ0" in crit and "Wind b ≥ a" in crit
        # nothing else on the screen says the criteria are met without the sets
        assert not _met_without_sets(panel(app, "alerts"))
        # the panel fits its box: no line wider than the panel
        box = app.screen.query_one("#criteria")
        assert len(lines) <= box.size.height and all(len(x) <= box.size.width for x in lines)


async def test_a_failed_weather_set_and_an_unassessable_criterion_on_screen(tmp_path, sample_evaluate):
    sample_evaluate(weather_fails=True, unassessable=True)
    app = _app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        crit = panel(app, "criteria")
        assert crit.splitlines()[0].startswith(" Criteria NOT MET (1 failed)")
        row = next(x for x in crit.splitlines() if x.startswith(" GZ at ≥30°"))
        assert "n/a" in row and " ok" not in row  # not assessable: never shown as a pass
        assert "the KN tables end at 25°" in crit
        assert "met where assessable" in crit
        wind = next(x for x in crit.splitlines() if x.startswith(" Wind b ≥ a"))
        assert "FAIL" in wind


async def test_key_v_opens_the_whole_verdict(tmp_path):
    app = _app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("v")
        await pilot.pause()
        assert isinstance(app.screen, TextScreen)
        text = " ".join(app.screen.query_one("Static").render().plain.split())
        r = app.session.result
        assert " ".join(r.verdict_text().split()) in text
        for n in r.not_assessed:
            assert f"{n.item}: {n.reason}" in text
        for c in r.criteria:
            assert c.description in text
        await pilot.press("escape")


@pytest.mark.parametrize("size", [(120, 40), (80, 24)])
async def test_key_b_shows_the_wind_and_roll_plot(tmp_path, size):
    app = _app(tmp_path)
    async with app.run_test(size=size) as pilot:
        await pilot.press("b")
        await pilot.pause()
        gz = app.screen.query_one("#gz")
        assert gz.display
        text = panel(app, "gz")
        w = app.session.result.weather
        assert text.startswith(" Wind")
        assert f"a {w.area_a_mrad:.4f} b {w.area_b_mrad:.4f} m·rad" in text
        axis = text.splitlines()[-1]
        for label in ("θ0", "θ1", "θ2"):
            assert label in axis
        assert "lw1" in text and "lw2" in text and " a" in text and "b" in text
        await pilot.press("b")
        await pilot.pause()
        if size == (120, 40):
            assert panel(app, "gz").startswith(" GZ ")  # the plain curve's title again
        else:  # narrow: b again goes back to the numbers
            assert not gz.display and app.screen.query_one("#criteria").display
            # b then g: g leaves the plot, and the message line no longer names it
            await pilot.press("b")
            await pilot.pause()
            await pilot.press("g")
            await pilot.pause()
            status = panel(app, "status")
            assert not gz.display and "Wind and roll plot" not in status and "criteria" in status
            await pilot.press("g")
            await pilot.pause()
            assert gz.display and panel(app, "gz").startswith(" GZ")  # the plain curve, not the wind plot


async def test_key_b_says_why_when_the_weather_criterion_was_not_assessed(tmp_path):
    from deckload.core.model import Condition
    from vessel_factories import box_barge

    app = create_app(box_barge(), Condition(name="Barge"), work_dir=None, log_dir=None)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("b")
        await pilot.pause()
        text = " ".join(panel(app, "gz").split())
        assert "IS Code 2008 Part A 2.3 weather criterion not assessed: the profile has no windage data" in text


async def test_afloat_shows_freeboard_its_margin_and_the_angles(tmp_path):
    app = _app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        r = app.session.result
        a = panel(app, "afloat")
        assert re.search(rf"Fbd\s+{r.freeboard_m:.3f} m", a)
        assert re.search(r"Margin\s+" + re.escape(f"{r.load_line_margin_m:+.3f}") + " m", a)
        assert re.search(rf"Mark\s+{r.load_line_allowed_draft_m:.3f} m S", a)  # S: the summer mark's letter (ICLL)
        assert re.search(r"DWA\s+" + re.escape(f"{r.dock_water_allowance_m:+.3f}") + " m", a)
        assert re.search(rf"∠deck\s+{r.deck_edge_angle_deg:.1f} °", a)
        assert re.search(rf"θf\s+{r.downflooding_angle_deg:.1f} °", a)


async def test_afloat_says_n_a_when_the_result_has_no_value(tmp_path, sample_evaluate, monkeypatch):
    import dataclasses

    import deckload.core.stability as st

    real = st.evaluate
    monkeypatch.setattr(st, "evaluate", lambda v, c: dataclasses.replace(
        real(v, c), freeboard_m=None, load_line_margin_m=None, deck_edge_angle_deg=None))
    app = _app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        a = panel(app, "afloat")
        assert re.search(r"Fbd\s+n/a m", a) and re.search(r"Margin\s+n/a m", a) and re.search(r"∠deck\s+n/a °", a)


# --------------------------------------------------------------------------- calc and check


def test_calc_text_names_the_sets_the_weather_numbers_and_what_was_not_assessed(capsys):
    assert main(["calc", str(paths.DEMO_PROFILE), str(paths.DEMO_CONDITIONS["departure"])]) == 0
    out = capsys.readouterr().out
    assert "all criteria met" not in out.lower()
    assert "A 2.2 general criteria [IS2008-A2.2]: met" in out and "A 2.3 weather criterion [IS2008-A2.3]: met" in out
    assert "Not assessed:" in out and "- damage stability: not computed by deckload" in out
    assert re.search(r"weather: wind 504 Pa on [\d.]+ m², lever [\d.]+ m; lw1 [\d.]+ m, lw2 [\d.]+ m; θ0", out)
    assert re.search(r"Freeboard mid\s+[\d.]+ m\s+Margin to the mark\s+\+[\d.]+ m", out)
    assert re.search(r"Deck edge in\s+[\d.]+°", out)
    flat = " ".join(out.split())
    assert "Met: IS Code 2008 Part A 2.2 general criteria, IS Code 2008 Part A 2.3 weather criterion." in flat


def test_calc_text_shows_an_unassessable_criterion_as_such():
    from deckload.cli.calc import format_summary
    from verdict_samples import demo_with_verdict

    _, _, r = demo_with_verdict(unassessable=True, weather_fails=True)
    out = format_summary(r)
    row = next(x for x in out.splitlines() if "GZ at an angle of 30° or more" in x)
    assert row.strip().startswith("[not assessable]") and "pass" not in row
    assert "A 2.3 severe wind and rolling [IS2008-A2.3]: NOT MET" in out
    assert "NOT MET (1 failed)" in " ".join(out.split())


def test_check_summary_names_the_sets(capsys):
    assert main(["check", str(paths.DEMO_PROFILE), str(paths.DEMO_CONDITIONS["light"])]) == 0
    out = capsys.readouterr().out
    assert "criteria met: 8 of 8" in out
    flat = " ".join(out.split())
    assert "Met: IS Code 2008 Part A 2.2 general criteria, IS Code 2008 Part A 2.3 weather criterion." in flat
    assert re.search(r"Not assessed: damage stability[^;]*\(not computed by deckload\)", flat)


# --------------------------------------------------------------------------- stored log summaries


def test_a_stored_summary_is_worded_with_its_sets_and_older_entries_say_what_they_lack():
    new = {"criteria_pass": True, "criteria_failed": [], "criteria_not_assessable": [],
           "criteria_sets": [{"id": "IS2008-A2.2", "pass": True}, {"id": "IS2008-A2.3", "pass": True}],
           "verdict": "Met: A, B. Not assessed: damage stability (not computed by deckload)."}
    assert vf.stored_short(new) == "met A2.2 A2.3"
    assert vf.stored_lines(new, 200) == ["  Verdict: Met: A, B. Not assessed: damage stability (not computed by deckload)."]
    failed = dict(new, criteria_pass=False, criteria_failed=["IS2008-A2.3-area-b-a"])
    assert vf.stored_short(failed) == "NOT MET A2.2 A2.3"
    partly = dict(new, criteria_pass=False, criteria_not_assessable=[{"id": "x", "note": "y"}])
    assert vf.stored_short(partly) == "met, n/a A2.2 A2.3"
    old = {"criteria_pass": True, "criteria_failed": []}
    assert vf.stored_short(old) == "met (sets not recorded)"
    assert "predates the record of criteria sets" in vf.stored_lines(old)[0]
    assert vf.stored_short(None) == "" and vf.stored_lines(None) == []


def test_wind_plot_without_a_curve_says_what_the_assessed_criterion_found():
    """When GZ never reaches a wind lever the engine gives no WeatherResult but still judges the set:
    the plot panel then shows the criteria of the set with their notes, not 'not assessed'."""
    import dataclasses

    from deckload.ui.verdict import weather_missing
    from verdict_samples import demo_with_verdict

    _, _, r = demo_with_verdict(weather_fails=True)
    failed = dataclasses.replace(next(c for c in r.criteria if c.id.endswith("area-b-a")),
                                 note="GZ never reaches lw2 = 0.2000 m")
    r = dataclasses.replace(r, weather=None, criteria=tuple(failed if c.id == failed.id else c for c in r.criteria))
    text = " ".join(" ".join(t.plain for t in weather_missing(r, 54)).split())
    assert "No plot" in text and "FAIL Weather: area b at least area a: GZ never reaches lw2 = 0.2000 m" in text
    assert "not assessed" not in text


def test_the_verdict_names_a_shared_reason_once():
    """Things deckload never computes share one reason: the sentence names them together."""
    import dataclasses

    from deckload.core.result import NotAssessed
    from deckload.core.stability import evaluate

    v = demo_vessel()
    base = evaluate(v, load_condition(paths.DEMO_CONDITIONS["departure"], v))
    out = dataclasses.replace(base, not_assessed=(
        NotAssessed("damage stability", "not computed by deckload"),
        NotAssessed("weather criterion", "the profile has no windage data"),
        NotAssessed("icing", "not computed by deckload"),
    )).verdict_text()
    assert out.endswith("Not assessed: damage stability, icing (not computed by deckload); "
                        "weather criterion (the profile has no windage data).")
