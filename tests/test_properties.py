"""Invariants of evaluate() that must hold for every loading, checked with hypothesis.

The vessel is the analytic box barge with a set of box tanks (tests/vessel_factories.py);
loadings are drawn at random within its tables.  Each property is a consequence of the
definitions in standards.md §4.3 and §6.3 (textbook): Δ = Σw, KG = Σw·z/Δ, TCG = Σw·y/Δ,
FSC = ΣFSM/Δ with FSM = ρ·i ≥ 0, GM = KM − KG_fluid, GZ(φ) = KN(φ) − KG_fluid·sinφ − TCG·cosφ.
"""

from __future__ import annotations

import dataclasses
import json
import math

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from deckload.core.model import Condition, DeckItem, MassItem, TankFill, frozen_array
from deckload.core.stability import evaluate
from vessel_factories import BARGE_L, barge_tanks, box_barge

SETTINGS = settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])

TANKS = barge_tanks()
VESSEL = box_barge(lightship_t=400.0, lightship_kg_m=3.0, tanks=TANKS)
TANK_IDS = [t.id for t in TANKS]
PAIRS = [("DB1P", "DB1S"), ("FO1P", "FO1S")]
CENTRELINE = ["FW1C", "LO1C", "CL1C"]

pct = st.floats(min_value=0.0, max_value=100.0, allow_nan=False)
mass = st.floats(min_value=0.0, max_value=60.0, allow_nan=False)
lcg = st.floats(min_value=2.0, max_value=BARGE_L - 2.0, allow_nan=False)
vcg = st.floats(min_value=0.5, max_value=6.0, allow_nan=False)
tcg = st.floats(min_value=-4.0, max_value=4.0, allow_nan=False)
rule = st.sampled_from(["is2008", "actual"])
correction = st.sampled_from(["constant", "transfer"])


@st.composite
def deck_items(draw, max_items=3, symmetric=False):
    n = draw(st.integers(min_value=0, max_value=max_items))
    return tuple(DeckItem(f"Item {k}", draw(mass), draw(lcg), draw(vcg), 0.0 if symmetric else draw(tcg))
                 for k in range(n))


@st.composite
def conditions(draw, symmetric=False):
    """A random loading of the barge: any subset of tanks at any fill, a few deck items and constants."""
    fills = []
    if symmetric:
        for p, s in PAIRS:
            x = draw(st.one_of(st.none(), pct))
            if x is not None:
                fills += [TankFill(p, "percent", x), TankFill(s, "percent", x)]
        ids = CENTRELINE
    else:
        ids = TANK_IDS
    for tid in ids:
        x = draw(st.one_of(st.none(), pct))
        if x is not None:
            fills.append(TankFill(tid, "percent", x))
    consts = tuple(MassItem(f"Const {k}", draw(mass), draw(lcg), draw(vcg), 0.0 if symmetric else draw(tcg))
                   for k in range(draw(st.integers(0, 2))))
    return Condition(name="random", tanks=tuple(fills), deck_items=draw(deck_items(symmetric=symmetric)),
                     constants=consts, fs_rule=draw(rule), gz_correction=draw(correction))


def numbers(r):
    """Every number of a result (scalars, GZ curves, tank results, criteria values)."""
    out = {}
    for f in dataclasses.fields(r):
        v = getattr(r, f.name)
        if isinstance(v, (int, float)) and not isinstance(v, bool):
            out[f.name] = float(v)
    out["gz"] = r.gz_m
    out["gz_port"] = r.gz_port_m
    out["tanks"] = tuple((t.id, t.mass_t, t.fsm_tm, t.state) for t in r.tanks)
    out["criteria"] = tuple((c.id, float(c.value), bool(c.passed)) for c in r.criteria)
    return out


@SETTINGS
@given(conditions(), st.sampled_from(["deck", "constant", "tank"]), lcg, vcg, tcg)
def test_adding_zero_mass_changes_nothing(cond, where, x, z, y):
    """Σw, Σw·x, Σw·z, Σw·y are unchanged by a zero mass anywhere, so every result is identical;
    an empty tank listed at 0 % is the same as an unlisted one."""
    base = evaluate(VESSEL, cond)
    if where == "deck":
        more = cond.with_deck_items(cond.deck_items + (DeckItem("Nothing", 0.0, x, z, y),))
    elif where == "constant":
        more = cond.with_constants(cond.constants + (MassItem("Nothing", 0.0, x, z, y),))
    else:
        listed = {f.tank_id for f in cond.tanks}
        free = [t for t in TANK_IDS if t not in listed]
        if not free:
            return
        more = cond.with_tank(TankFill(free[0], "percent", 0.0))
    assert numbers(evaluate(VESSEL, more)) == numbers(base)


@SETTINGS
@given(conditions(), st.floats(min_value=0.01, max_value=2.0), st.data())
def test_lowering_a_mass_never_lowers_gm(cond, drop, data):
    """Lowering any item (lightship, deck item, constant or a whole tank) by δ lowers KG by w·δ/Δ
    and leaves Δ, KM and every FSM unchanged, so
    GM fluid = KM − KG − FSC rises by exactly w·δ/Δ (never falls)."""
    items = [("lightship", None)] + [("deck", k) for k in range(len(cond.deck_items))] \
        + [("constant", k) for k in range(len(cond.constants))] + [("tank", t) for t in TANK_IDS]
    group, k = data.draw(st.sampled_from(items))
    vessel = VESSEL
    if group == "tank":
        # The whole tank (and so its contents at every sounding) sits δ lower.
        tank = VESSEL.tank(k)
        cal = dataclasses.replace(tank.calibration, vcg_m=frozen_array(tank.calibration.vcg_m - drop))
        lower_tank = dataclasses.replace(tank, calibration=cal)
        vessel = dataclasses.replace(VESSEL, tanks=tuple(lower_tank if t.id == k else t for t in VESSEL.tanks))
        fill = cond.tank_fill(k)
        w = 0.0 if fill is None else fill.value / 100 * tank.capacity_m3 * tank.density_t_m3
        lowered = cond
    elif group == "lightship":
        ls = vessel.lightship
        vessel = dataclasses.replace(vessel, lightship=dataclasses.replace(ls, vcg_m=ls.vcg_m - drop))
        w = ls.mass_t
        lowered = cond
    elif group == "deck":
        it = list(cond.deck_items)
        w = it[k].mass_t
        it[k] = dataclasses.replace(it[k], vcg_m=it[k].vcg_m - drop)
        lowered = cond.with_deck_items(tuple(it))
    else:
        it = list(cond.constants)
        w = it[k].mass_t
        it[k] = dataclasses.replace(it[k], vcg_m=it[k].vcg_m - drop)
        lowered = cond.with_constants(tuple(it))
    a = evaluate(VESSEL, cond)
    b = evaluate(vessel, lowered)
    assert b.gm_fluid_m >= a.gm_fluid_m - 1e-12
    assert b.gm_fluid_m - a.gm_fluid_m == pytest.approx(w * drop / a.displacement_t, abs=1e-9)
    assert b.fsm_total_tm == pytest.approx(a.fsm_total_tm, rel=1e-12, abs=1e-12)


@SETTINGS
@given(conditions(symmetric=True))
def test_symmetric_loading_has_no_list(cond):
    """Pairs at equal fill and every other weight on the centreline: TCG = Σw·y/Δ = 0, so no list
    and the GZ curve is the same heeling to port and to starboard."""
    r = evaluate(VESSEL, cond)
    assert r.tcg_m == pytest.approx(0.0, abs=1e-12)
    if r.gm_fluid_m > 0:
        assert r.list_deg == pytest.approx(0.0, abs=1e-9)
    for a, b in zip(r.gz_m, r.gz_port_m):
        assert a == pytest.approx(b, abs=1e-9)


@SETTINGS
@given(conditions())
def test_gz_at_zero_is_minus_tcg(cond):
    """GZ(0) = KN(0) − KG·0 − TCG·cos0 = −TCG heeling to starboard (+TCG heeling to port)."""
    r = evaluate(VESSEL, cond)
    assert r.gz_heel_deg[0] == 0.0
    assert r.gz_m[0] == pytest.approx(-r.tcg_m, abs=1e-12)
    assert r.gz_port_m[0] == pytest.approx(r.tcg_m, abs=1e-12)


@SETTINGS
@given(conditions())
def test_displacement_is_sum_of_masses(cond):
    """Δ = lightship + Σ tank contents (% × capacity × density) + deck items + constants; DWT = Δ − lightship."""
    r = evaluate(VESSEL, cond)
    tanks = sum(f.value / 100 * VESSEL.tank(f.tank_id).capacity_m3 * VESSEL.tank(f.tank_id).density_t_m3
                for f in cond.tanks)
    total = VESSEL.lightship.mass_t + tanks + sum(d.mass_t for d in cond.deck_items) \
        + sum(c.mass_t for c in cond.constants)
    assert r.displacement_t == pytest.approx(total, rel=1e-12)
    assert r.deadweight_t == pytest.approx(r.displacement_t - VESSEL.lightship.mass_t, abs=1e-9)


@SETTINGS
@given(conditions())
def test_free_surface_correction_is_never_negative(cond):
    """FSM = ρ·i ≥ 0 per tank, so FSC = ΣFSM/Δ ≥ 0 and KG fluid ≥ KG solid.  Every tank here is a box,
    i = l·b³/12 at every level (standards.md §4.3), so no tank can count more than ρ·l·b³/12 and the
    total is bounded by the sum of those (IS 2008 B 3.1: at most the largest correction of each tank)."""
    r = evaluate(VESSEL, cond)
    assert all(t.fsm_tm >= 0.0 for t in r.tanks)
    assert r.fsc_m >= 0.0
    bound = {t.id: t.density_t_m3 * float(t.calibration.fsi_m4[0]) for t in TANKS}
    fills = {f.tank_id: f for f in cond.tanks}
    for t in r.tanks:
        assert t.fsm_tm <= bound[t.id] * (1 + 1e-12), t.id  # conditions() never overrides a density
        if t.id not in fills and t.fsm_tm > 0.0:  # an unlisted (empty) tank counts only if assumed slack
            assert "B 3.1.4" in t.fs_rule, t.id
    assert r.fsc_m * r.displacement_t <= sum(bound.values()) * (1 + 1e-12)
    assert r.kg_fluid_m >= r.kg_m
    assert r.gm_fluid_m <= r.gm_solid_m


@SETTINGS
@given(conditions())
def test_mirror_image_loading_mirrors_the_result(cond):
    """Swapping port and starboard (y → −y, pairs exchanged) changes the sign of TCG and list and
    exchanges the starboard and port GZ curves; nothing else moves."""
    swap = {"DB1P": "DB1S", "DB1S": "DB1P", "FO1P": "FO1S", "FO1S": "FO1P"}
    mirrored = cond.replace(
        tanks=tuple(dataclasses.replace(f, tank_id=swap.get(f.tank_id, f.tank_id)) for f in cond.tanks),
        deck_items=tuple(dataclasses.replace(d, tcg_m=-d.tcg_m) for d in cond.deck_items),
        constants=tuple(dataclasses.replace(c, tcg_m=-c.tcg_m) for c in cond.constants),
    )
    a, b = evaluate(VESSEL, cond), evaluate(VESSEL, mirrored)
    assert b.tcg_m == pytest.approx(-a.tcg_m, abs=1e-12)
    assert b.list_deg == pytest.approx(-a.list_deg, abs=1e-9) or abs(a.tcg_m) < 1e-12
    assert b.gm_fluid_m == pytest.approx(a.gm_fluid_m, abs=1e-12)
    assert b.displacement_t == pytest.approx(a.displacement_t, rel=1e-12)
    for x, y in zip(a.gz_m, b.gz_port_m):
        assert x == pytest.approx(y, abs=1e-9)


@SETTINGS
@given(conditions())
def test_result_is_plain_json(cond):
    """Result.to_json_dict() promises plain JSON types (deckload calc --json): it must serialise
    and read back without loss."""
    r = evaluate(VESSEL, cond)
    d = r.to_json_dict()
    text = json.dumps(d, allow_nan=False)
    back = json.loads(text)
    assert back["displacement_t"] == r.displacement_t
    assert all(isinstance(c["pass"], bool) for c in back["criteria"])
    assert math.isfinite(back["gm_fluid_m"])
