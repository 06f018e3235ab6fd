"""Which tables a result was taken from, as calc (text and JSON), the report and the screen say it.

The vessel is the trimmed box of tests/trimmed_box.py (closed forms derived in its docstring):
with G 0.98 m abaft midships at T = 5 m, KG 3 m she trims t = 1.497 m by the stern (exact
root there), between the tables at +1 and +2 m; with tables at −1…+1 m and G 1.25 m abaft,
t = 1.909 m, beyond the +1 m table.  The words are checked against the look-up the engine
made: changing a table the sentence names changes the result; changing one it does not name
leaves the result as it was.
"""

from __future__ import annotations

import dataclasses
import json

import pytest

from deckload.cli.main import main
from deckload.core.model import Condition, frozen_array
from deckload.core.stability import evaluate
from deckload.core.trimmed_tables import tables_basis
from deckload.io import paths
from deckload.io.profiles import load_profile
from deckload.report.condition_report import render_report_html, render_report_text
from deckload.ui.views import afloat_lines
from test_trimmed_tables_profile import TRIMMED, profile
from trimmed_box import TRIMS, box, exact_trim

BETWEEN = "hydrostatics and KN at trim 1.50 m by the stern, interpolated between the tables at +1.00 and +2.00 m"
EVEN = "even-keel hydrostatics and KN (the profile has no tables at trims)"


def _kmt_bumped(v, trim_m: float):
    """``v`` with the KMt of its hydrostatic table at ``trim_m`` raised 0.1 m."""
    tt = v.trimmed
    k = list(tt.hydro_trim_m).index(trim_m)
    h = tt.hydrostatics[k]
    tables = tt.hydrostatics[:k] + (dataclasses.replace(h, kmt_m=frozen_array(h.kmt_m + 0.1)),) + tt.hydrostatics[k + 1:]
    return dataclasses.replace(v, trimmed=dataclasses.replace(tt, hydrostatics=tables))


def test_between_two_tables_names_the_ones_the_engine_used():
    v = box(5.0, 3.0, 0.98)
    r = evaluate(v, Condition())
    assert abs(r.trim_m - exact_trim(5.0, 3.0, 0.98)) < 2e-3  # 1.497 m (tests/trimmed_box.py)
    b = tables_basis(v, r.trim_m)
    assert b.words == BETWEEN
    assert b.hydro_trims_m == (1.0, 2.0) and b.kn_trims_m == (1.0, 2.0) and not b.outside
    assert b.short == "at +1.50 m: +1.00…+2.00 m"
    # the named tables are the ones used: KMt of the +2 m table moves KMt, that of the −1 m table does not
    assert evaluate(_kmt_bumped(v, 2.0), Condition()).km_m > r.km_m + 0.01
    assert evaluate(_kmt_bumped(v, -1.0), Condition()).km_m == r.km_m


def test_at_a_table_outside_the_tables_and_sets_that_differ():
    v = box(5.0, 3.0, 0.98)
    assert tables_basis(v, 1.0).words == "hydrostatics and KN at trim 1.00 m by the stern, from the table at +1.00 m"
    assert tables_basis(v, 0.0).words == "hydrostatics and KN at even keel, from the table at 0.00 m"
    short = box(5.0, 3.0, 1.25, trims=(-1.0, 0.0, 1.0), kn_trims=(-1.0, 0.0, 1.0))
    r = evaluate(short, Condition())
    b = tables_basis(short, r.trim_m)
    assert b.words == ("hydrostatics and KN at trim 1.91 m by the stern, from the end table at +1.00 m "
                       "(the trim is outside the trims tabulated)")
    assert b.outside and b.as_dict()["outside_tabulated_trims"] is True
    mixed = box(5.0, 3.0, 0.98, trims=(0.0,), kn_trims=TRIMS)
    b = tables_basis(mixed, evaluate(mixed, Condition()).trim_m)
    assert b.words.startswith("at trim 1.5")
    assert b.words.endswith("hydrostatics from the even-keel table alone; "
                            "KN interpolated between the tables at +1.00 and +2.00 m")
    assert b.short.endswith("hyd even keel, KN +1.00…+2.00 m")


def test_even_keel_only():
    v = dataclasses.replace(box(5.0, 3.0, 0.98), trimmed=None)
    b = tables_basis(v, evaluate(v, Condition()).trim_m)
    assert b.words == EVEN and not b.trimmed and b.short == "even keel only"
    assert b.as_dict()["tables"] == "even keel"


@pytest.fixture
def files(tmp_path):
    prof = tmp_path / "trimmed.toml"
    prof.write_text(profile(TRIMMED), encoding="utf-8")
    cond = tmp_path / "c.condition.toml"
    cond.write_text('format = "deckload-condition-1"\n[condition]\nname = "Light"\nwater_density_t_m3 = 1.025\n', encoding="utf-8")
    return prof, cond


def test_calc_text_and_json_say_which_tables(files, capsys):
    prof, cond = files
    assert main(["calc", str(prof), str(cond)]) == 0
    out = capsys.readouterr().out
    assert f"  Tables: {BETWEEN}\n" in out
    assert main(["calc", "--json", str(prof), str(cond)]) == 0
    doc = json.loads(capsys.readouterr().out)
    tb = doc["tables_basis"]
    assert tb["tables"] == "at trims" and tb["hydrostatics_trims_m"] == [1.0, 2.0] and tb["kn_trims_m"] == [1.0, 2.0]
    assert tb["trim_m"] == doc["trim_m"] and tb["text"] == BETWEEN and tb["outside_tabulated_trims"] is False
    assert main(["calc", "--json", str(paths.DEMO_PROFILE), str(paths.DEMO_CONDITIONS["departure"])]) == 0
    assert json.loads(capsys.readouterr().out)["tables_basis"]["text"] == EVEN


def test_report_text_and_html_say_which_tables(files):
    prof, _ = files
    v = load_profile(prof)
    c = Condition()
    r = evaluate(v, c)
    assert f"Tables: {BETWEEN}" in render_report_text(r, v, c).replace("\n", " ").replace("  ", " ")
    assert f"Tables: {BETWEEN}" in " ".join(render_report_html(r, v, c).split())
    plain = dataclasses.replace(v, trimmed=None)
    assert f"Tables: {EVEN}" in " ".join(render_report_text(evaluate(plain, c), plain, c).split())


async def test_screen_afloat_panel_says_which_tables(files, tmp_path):
    from deckload.ui.launch import create_app
    from deckload.ui.widgets import LinePanel

    prof, _ = files
    v = load_profile(prof)
    c = Condition()
    r = evaluate(v, c)
    assert afloat_lines(v, c, r, False, 54)[-1].plain == " Tables at +1.50 m: +1.00…+2.00 m"
    assert afloat_lines(v, c, r, False, 34)[-1].plain == " Tables at +1.50 m: +1.00…+2.00 m"  # fits the narrow panel
    app = create_app(v, c, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        assert "Tables at +1.50 m: +1.00…+2.00 m" in app.screen.query_one("#afloat", LinePanel).plain()
