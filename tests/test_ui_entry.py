"""What the watchkeeper types on the loading screen, checked without the UI.

Vessel: the analytic box barge with box tanks (tests/vessel_factories.py).  A box
tank's volume at sounding s is l·b·s exactly (analytic: prismatic tank), so the
expected volumes below are written as that formula.
"""

from __future__ import annotations

import pytest

from deckload.core.model import Condition, TankFill
from deckload.core.stability import evaluate
from deckload.ui.entry import (
    EntryError,
    ItemForm,
    density_from_text,
    hold_from_text,
    item_from_form,
    nudge_tank,
    parse_amount,
    parse_number,
    plan_transfer,
    tank_from_text,
)
from vessel_factories import barge_tanks, box_barge

RHO_SW = 1.025
DB1P_L, DB1P_B, DB1P_H = 8.0, 4.5, 0.8  # as built in barge_tanks()
TOL = 1e-9


@pytest.fixture(scope="module")
def vessel():
    return box_barge(tanks=barge_tanks())


def volume(vessel, condition, tank_id):
    return next(t for t in evaluate(vessel, condition).tanks if t.id == tank_id).volume_m3


@pytest.mark.parametrize(
    "text, expected",
    [
        ("55%", ("percent", 55.0)),
        (" 55 % ", ("percent", 55.0)),
        ("12.5m3", ("volume_m3", 12.5)),
        ("12.5 m³", ("volume_m3", 12.5)),
        ("10t", ("mass_t", 10.0)),
        ("10 T", ("mass_t", 10.0)),
        ("1.2m", ("sounding_m", 1.2)),
        (".5m", ("sounding_m", 0.5)),
    ],
)
def test_amount_with_unit_is_understood(text, expected):
    assert parse_amount(text) == expected


@pytest.mark.parametrize(
    "text, says",
    [
        ("55", "no unit"),
        ("5,5%", "decimal point"),
        ("-5%", "not an amount"),
        ("10kg", "not an amount"),
        ("lots", "not an amount"),
        ("", "Nothing typed"),
    ],
)
def test_bad_amount_is_refused_with_a_reason(text, says):
    with pytest.raises(EntryError, match=says):
        parse_amount(text)


def test_tank_set_by_each_quantity_gives_the_analytic_volume(vessel):
    """Box tank DB1P, l = 8, b = 4.5, h = 0.8 m: V(s) = l·b·s; capacity l·b·h (analytic)."""
    c0 = Condition()
    cap = DB1P_L * DB1P_B * DB1P_H
    cases = {
        "55%": 0.55 * cap,
        "12.5m3": 12.5,
        "10t": 10.0 / RHO_SW,
        "0.4m": DB1P_L * DB1P_B * 0.4,
    }
    for text, expected_m3 in cases.items():
        c1 = tank_from_text(c0, vessel.tank("DB1P"), text)
        assert volume(vessel, c1, "DB1P") == pytest.approx(expected_m3, abs=1e-9), text


@pytest.mark.parametrize("text, says", [("101%", "more than 100 %"), ("29m3", "capacity 28.80 m³"),
                                        ("30t", "capacity 29.52 t"), ("0.9m", "greatest sounding 0.800 m")])
def test_more_than_the_tank_holds_is_refused(vessel, text, says):
    with pytest.raises(EntryError, match=says):
        tank_from_text(Condition(), vessel.tank("DB1P"), text)


def test_density_override_is_kept_when_the_amount_changes(vessel):
    c0 = Condition(tanks=(TankFill("DB1P", "percent", 20.0, density_t_m3=1.0),))
    c1 = tank_from_text(c0, vessel.tank("DB1P"), "10t")
    assert c1.tank_fill("DB1P") == TankFill("DB1P", "mass_t", 10.0, 1.0)
    assert volume(vessel, c1, "DB1P") == pytest.approx(10.0 / 1.0)


def test_nudge_moves_by_percent_of_capacity_and_stops_at_the_ends(vessel):
    tank = vessel.tank("DB1P")
    c1 = nudge_tank(Condition(tanks=(TankFill("DB1P", "mass_t", 14.76),)), tank, +1.0)
    start_pct = 100 * (14.76 / RHO_SW) / (DB1P_L * DB1P_B * DB1P_H)
    assert c1.tank_fill("DB1P").value == pytest.approx(start_pct + 1.0)
    with pytest.raises(EntryError, match="already empty"):
        nudge_tank(Condition(), tank, -1.0)
    with pytest.raises(EntryError, match="already full"):
        nudge_tank(Condition(tanks=(TankFill("DB1P", "percent", 100.0),)), tank, +1.0)


def test_transfer_conserves_mass_between_tanks_of_different_density(vessel):
    """5 t of sea water (1.025) from DB1P into DB1S holding 2 m³ at 1.000 t/m³: the pumped water
    keeps its density, so DB1S gains 5/1.025 m³ and its contents mix to (2·1.000 + 5)/(2 + 5/1.025)."""
    c0 = Condition(tanks=(TankFill("DB1P", "percent", 50.0), TankFill("DB1S", "volume_m3", 2.0, density_t_m3=1.0)))
    plan = plan_transfer(vessel, c0, "DB1P", "DB1S", "5t")
    cap = DB1P_L * DB1P_B * DB1P_H
    assert plan.mass_t == pytest.approx(5.0)
    assert volume(vessel, plan.condition, "DB1P") == pytest.approx(0.5 * cap - 5.0 / RHO_SW)
    assert volume(vessel, plan.condition, "DB1S") == pytest.approx(2.0 + 5.0 / RHO_SW)
    assert plan.condition.tank_fill("DB1S").density_t_m3 == pytest.approx((2.0 * 1.0 + 5.0) / (2.0 + 5.0 / RHO_SW))
    r0, r1 = evaluate(vessel, c0), evaluate(vessel, plan.condition)
    assert r1.displacement_t == pytest.approx(r0.displacement_t, abs=1e-9)


@pytest.mark.parametrize(
    "src, dst, amount, says",
    [
        ("DB1P", "DB1P", "1t", "same tank"),
        ("DB1P", "XX", "1t", "not a tank"),
        ("DB1P", "DB1S", "20t", "holds only"),
        ("DB1P", "DB1S", "0.2m", "not as a sounding"),
        ("DB1P", "FW1C", "10t", "one kind of liquid"),
    ],
)
def test_impossible_transfer_is_refused(vessel, src, dst, amount, says):
    c0 = Condition(tanks=(TankFill("DB1P", "mass_t", 14.0), TankFill("FW1C", "percent", 90.0)))
    with pytest.raises(EntryError, match=says):
        plan_transfer(vessel, c0, src, dst, amount)


def test_transfer_into_a_nearly_full_tank_is_refused(vessel):
    c0 = Condition(tanks=(TankFill("DB1P", "mass_t", 14.0), TankFill("DB1S", "percent", 95.0)))
    with pytest.raises(EntryError, match="room for only"):
        plan_transfer(vessel, c0, "DB1P", "DB1S", "10t")


def test_item_form_checks_every_field(vessel):
    ok = item_from_form(vessel, ItemForm("Crane", "12", "20", "6", "-1.5"), deck=True)
    assert (ok.mass_t, ok.lcg_m, ok.vcg_m, ok.tcg_m) == (12.0, 20.0, 6.0, -1.5)
    for form, says in [
        (ItemForm("", "12", "20", "6"), "Name"),
        (ItemForm("Crane", "-1", "20", "6"), "below"),
        (ItemForm("Crane", "12x", "20", "6"), "Mass"),
        (ItemForm("Crane", "12", "20", "6", "7"), "TCG"),
        (ItemForm("Crane", "12", "20", "6", "0", "NOWHERE"), "Deck area"),
    ]:
        with pytest.raises(EntryError, match=says):
            item_from_form(vessel, form, deck=True)


def test_water_density_outside_fresh_to_sea_range_is_refused():
    assert density_from_text(Condition(), "1.000").water_density_t_m3 == 1.0
    with pytest.raises(EntryError, match="above"):
        density_from_text(Condition(), "1.25")
    with pytest.raises(EntryError, match="not a number"):
        density_from_text(Condition(), "sea")


def test_hold_mass_zero_empties_it():
    from deckload.core.model import Hold, HoldLoad

    hold = Hold("H1", "Hold", 300.0, 20.0, 2.0, max_mass_t=100.0)
    c1 = hold_from_text(Condition(), hold, "80t")
    assert c1.holds == (HoldLoad("H1", 80.0),)
    assert hold_from_text(c1, hold, "0").holds == ()
    with pytest.raises(EntryError, match="structural limit"):
        hold_from_text(c1, hold, "120")


def test_transfer_between_different_liquids_is_refused():
    """Fuel is never pumped into ballast: a transfer moves one kind of liquid only."""
    from deckload.core.model import Condition, TankFill
    from deckload.ui.entry import EntryError, plan_transfer
    from vessel_factories import barge_tanks, box_barge

    vessel = box_barge(tanks=barge_tanks())
    cond = Condition(tanks=(TankFill("FO1S", "percent", 80.0),))
    kinds = {t.id: t.kind for t in vessel.tanks}
    other = next(i for i, k in kinds.items() if k != kinds["FO1S"])
    with pytest.raises(EntryError, match="one kind of liquid"):
        plan_transfer(vessel, cond, "FO1S", other, "1t")


def test_transfer_keeps_the_pumped_liquids_density_and_conserves_mass():
    """The receiving tank gains the pumped volume v = m/ρ_from and takes the mixed density
    (m_to + m)/(v_to + v); mass is conserved (common practice: liquids keep their density)."""
    import dataclasses

    from deckload.core.model import Condition, TankFill
    from deckload.core.stability import evaluate
    from deckload.ui.entry import plan_transfer, tank_density
    from vessel_factories import barge_tanks, box_barge

    vessel = box_barge(tanks=barge_tanks())
    src = next(t for t in vessel.tanks if t.id == "FO1S")
    dst = next(t for t in vessel.tanks if t.kind == src.kind and t.id != "FO1S")
    rho_src, rho_dst = src.density_t_m3 + 0.05, dst.density_t_m3
    cond = Condition(tanks=(TankFill("FO1S", "volume_m3", 10.0, rho_src), TankFill(dst.id, "volume_m3", 4.0)))
    plan = plan_transfer(vessel, cond, "FO1S", dst.id, "3t")
    to = plan.condition.tank_fill(dst.id)
    v = 3.0 / rho_src
    assert to.value == pytest.approx(4.0 + v)
    assert tank_density(dst, to) == pytest.approx((4.0 * rho_dst + 3.0) / (4.0 + v))
    before = evaluate(vessel, cond).displacement_t
    after = evaluate(vessel, plan.condition).displacement_t
    assert after == pytest.approx(before, abs=1e-9)
    # into an empty tank the liquid keeps its own density
    empty = dataclasses.replace(cond, tanks=(TankFill("FO1S", "volume_m3", 10.0, rho_src),))
    to = plan_transfer(vessel, empty, "FO1S", dst.id, "3t").condition.tank_fill(dst.id)
    assert tank_density(dst, to) == pytest.approx(rho_src) and to.value == pytest.approx(v)


def test_a_confirmation_says_what_was_understood(vessel):
    """'2m' is a sounding, not 2 m³: the confirmation says so, with the volume it stands for."""
    from deckload.ui.entry import describe_fill

    tank = vessel.tank("DB1P")
    cap = tank.capacity_m3
    assert describe_fill(tank, TankFill("DB1P", "percent", 50.0)) == f"50 % = {0.5 * cap:.2f} m³"
    assert describe_fill(tank, TankFill("DB1P", "volume_m3", 3.0)) == "3.00 m³"
    assert describe_fill(tank, TankFill("DB1P", "sounding_m", 0.4)).startswith("sounding 0.4 m = ")
    assert describe_fill(tank, None) == "empty"


def test_decimal_comma_and_nudging_below_zero():
    from deckload.ui.entry import EntryError, nudge_mass, parse_number

    with pytest.raises(EntryError, match="decimal point"):
        parse_number("1,025", "Water density", "t/m³")
    assert nudge_mass(0.5, -1.0, "H1") == 0.0
    with pytest.raises(EntryError, match="already empty"):
        nudge_mass(0.0, -1.0, "H1")


def test_editing_a_deck_item_keeps_what_the_form_does_not_show(vessel):
    """The form shows name, mass, centres and the side (windage) area with its centre, filled from the
    item being edited (form_of); the footprint, which it does not show, must survive the edit, and so
    must the windage, or the weather criterion silently loses it."""
    import dataclasses

    from deckload.core.model import DeckItem
    from deckload.ui.entry import form_of, item_from_form

    base = DeckItem("Crane", 5.0, 10.0, 6.0, 0.0, footprint_m2=4.0, windage_area_m2=12.0, windage_centroid_z_m=7.5)
    form = dataclasses.replace(form_of(base), mass="6")
    got = item_from_form(vessel, form, deck=True, base=base)
    assert (got.mass_t, got.footprint_m2, got.windage_area_m2, got.windage_centroid_z_m) == (6.0, 4.0, 12.0, 7.5)


def test_the_giving_tank_for_an_empty_tank_is_its_partner_else_the_fullest_of_its_liquid():
    """Demo ballast: WB1P empty.  With WB1S holding some, WB1S gives (the partner); with WB1S empty
    too, the ballast tank holding most gives (DB2S 20 m³ over DB1P 10 m³); with none, ''."""
    from deckload.ui.entry import giving_tank
    from demo_vessels import demo_vessel

    v = demo_vessel()
    ballast = [t.id for t in v.tanks if t.kind == "ballast"]
    empty = Condition(name="Empty ballast", tanks=tuple(TankFill(i, "volume_m3", 0.0) for i in ballast))
    assert giving_tank(v, empty, "WB1P") == ""
    two = empty.with_tank(TankFill("DB1P", "volume_m3", 10.0)).with_tank(TankFill("DB2S", "volume_m3", 20.0))
    assert giving_tank(v, two, "WB1P") == "DB2S"
    assert giving_tank(v, two.with_tank(TankFill("WB1S", "volume_m3", 5.0)), "WB1P") == "WB1S"


def test_a_hold_mass_typed_in_kilograms_on_the_screen_says_so():
    """The screen's refusal adds the hint as a file's does (bounds.kilograms_hint): 2 100 000 t over
    the item bound of the box barge, 25 000 t over a 100 t limit (250 × it, a thousandth 25 t); 250 t
    (2.5 × the limit) is a mistyped load, told only the limit."""
    from deckload.core.model import Hold

    hold = Hold("H1", "Hold", 300.0, 20.0, 2.0, max_mass_t=100.0)
    with pytest.raises(EntryError, match=r"structural limit 100 t; it looks like kilograms: 25 t\?"):
        hold_from_text(Condition(), hold, "25000")
    with pytest.raises(EntryError, match=r"structural limit 100 t\.$"):
        hold_from_text(Condition(), hold, "250")
    with pytest.raises(EntryError, match=r"structural limit 100 t\.$"):
        hold_from_text(Condition(), hold, "120")
    with pytest.raises(EntryError, match=r"highest accepted value 1000 t; it looks like kilograms: 210 t\?"):
        parse_number("210000", "H1 cargo mass", "t", low=0.0, high=1000.0)
