"""A limiting KG/GM curve holds only at the trims it was made for.

IS 2008 Part A 2.1.7 (standards.md §1): where curves or tables of minimum GM or maximum VCG are
used to prove compliance, they must cover the whole range of operating trims.  A booklet states
that range; ``[limit_curve] trim_range_m`` carries it, and at a trim outside it the curve's check
is not made (listed under "Not assessed"), never judged as if it held.

The vessel is the analytic box barge of ``tests/broken_profiles/box_barge.toml`` (checks.md §1:
L = 40, B = 10, D = 4 m; lightship 400 t at LCG 20 m, VCG 2.5 m) with 420 t in the hold at VCG
2.5 m: Δ = 820 t, T = 2 m, KG = 2.5 m, no slack tank, so KG fluid = 2.5 m against the curve's 4.0 m.

Trim (standards.md §6.3; the worked check is §8 row 24): t = Δ·(LCG − LCB)/(100·MCTC), with MCTC = Δ·GML/(100·L)
and GML = KML − KG = 67.6667 − 2.5 = 65.1667 m at T = 2 m, so MCTC = 820·65.1667/4000 = 13.359 t·m/cm.
With the hold's LCG at 21 m, LCG = (400·20 + 420·21)/820 = 20.5122 m, LCB = 20 m:
t = 820·0.5122/1335.9 = 0.314 m by the head (−0.314 m, deckload's sign: + by the stern).
"""

from __future__ import annotations

from pathlib import Path

import pytest

from deckload.cli.main import main
from deckload.core.criteria import LIMIT_CURVE_SET, SET_TITLES
from deckload.core.stability import evaluate
from deckload.io.profiles import ProfileError, parse_condition, parse_profile

HERE = Path(__file__).parent
BASE = (HERE / "broken_profiles" / "box_barge.toml").read_text(encoding="utf-8")
CURVE = "\n[limit_curve]\ndisplacement_t = [410.0, 1230.0]\nmax_kg_m = [4.0, 4.0]\n"
TRIM_BY_HEAD_M = -0.314
"""The module docstring's trim, hold at LCG 21 m."""


def profile(trims: str | None):
    extra = CURVE if trims is None else CURVE + f"trim_range_m = {trims}\n"
    return parse_profile(BASE + extra, "barge.toml")


def condition(vessel, hold_lcg_m: float):
    text = ('format = "deckload-condition-1"\n[condition]\nname = "c"\nwater_density_t_m3 = 1.025\n'
            f"[holds.H1]\nmass_t = 420.0\nlcg_m = {hold_lcg_m}\nvcg_m = 2.5\n")
    return parse_condition(text, "c.condition.toml", vessel)


def limit_rows(r):
    return [c for c in r.criteria if c.set_id == LIMIT_CURVE_SET]


def test_the_trims_are_read_and_the_curve_judged_within_them():
    v = profile("[-0.5, 1.0]")
    assert v.limit_curve.trim_range_m == (-0.5, 1.0)
    for lcg in (20.0, 21.0):  # even keel, and 0.314 m by the head: both within −0.5 to +1.0 m
        r = evaluate(v, condition(v, lcg))
        [row] = limit_rows(r)
        assert row.assessed and row.passed and row.value == pytest.approx(2.5, abs=1e-9)
        assert not [n for n in r.not_assessed if n.item == SET_TITLES[LIMIT_CURVE_SET]]
    assert evaluate(v, condition(v, 21.0)).trim_m == pytest.approx(TRIM_BY_HEAD_M, abs=0.002)


def test_a_trim_outside_the_curves_trims_leaves_its_check_not_made():
    v = profile("[0.0, 1.0]")
    r = evaluate(v, condition(v, 21.0))
    assert r.trim_m == pytest.approx(TRIM_BY_HEAD_M, abs=0.002)
    assert limit_rows(r) == []
    [missing] = [n for n in r.not_assessed if n.item == SET_TITLES[LIMIT_CURVE_SET]]
    assert missing.reason == f"trim {r.trim_m:+.3f} m is outside the trims the limiting curve covers, +0.00 to +1.00 m"
    [w] = [w for w in r.warnings if w.code == "limit-curve-range"]
    assert w.severity == "danger" and w.message == missing.reason + ": that check was not made"
    # the verdict names what it met and, beside it, the check it did not make and why
    # (the barge has no windage data either: A 2.3 is the other set not assessed)
    assert r.verdict_text().startswith("Met where assessable, 2 sets of criteria not assessed — assessed: "
                                       "IS Code 2008 Part A 2.2 general criteria. Not assessed:")
    assert f"{SET_TITLES[LIMIT_CURVE_SET]} ({missing.reason})" in r.verdict_text()
    assert LIMIT_CURVE_SET not in [s.id for s in r.criteria_sets]
    # at even keel, inside the range again, the curve is judged
    assert [c.passed for c in limit_rows(evaluate(v, condition(v, 20.0)))] == [True]


@pytest.mark.parametrize("trims, words", [
    ("[1.0, -0.5]", "must be two trims [from, to] in m (+ by the stern), from below to"),
    ("[0.5, 0.5]", "must be two trims [from, to] in m (+ by the stern), from below to"),
    ("[-0.5, 0.5, 1.0]", "must be two trims [from, to] in m (+ by the stern), from below to"),
    ("[-0.5, 50.0]", "must be between -8 and 8 m"),  # bounds.table_trim_range: |t| ≤ min(2·D, 0.2·LBP) = 8 m
    ('["-0.5", 1.0]', "number"),
])
def test_a_trim_range_that_cannot_be_is_refused_naming_the_key(trims, words):
    with pytest.raises(ProfileError) as ei:
        profile(trims)
    [p] = [p for p in ei.value.problems if p.key == "limit_curve.trim_range_m"]
    assert words in p.rule and p.line is not None


def test_check_notes_a_curve_without_its_trims(tmp_path, capsys):
    """Without trim_range_m the curve is judged at any trim, as before, and `check` says so."""
    for trims, said in ((None, True), ("[-0.5, 1.0]", False)):
        path = tmp_path / "barge.toml"
        path.write_text(BASE + CURVE + ("" if trims is None else f"trim_range_m = {trims}\n"), encoding="utf-8")
        assert main(["--no-cache", "check", str(path)]) == 0
        out = " ".join(capsys.readouterr().out.split())
        assert ("limit_curve: no trim_range_m, so the curve is judged at any trim" in out) is said
