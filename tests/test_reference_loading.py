"""Hold cargo and tank soundings (core/loading.py) against closed forms.

Stepped hold (analytic, derived here): breadth 6 m, x 10–18 m, top at z = 3; the aft half
(x 10–14) has its floor at z = 1, the fore half (x 14–18) at z = 2.  Capacity 4·6·2 + 4·6·1
= 72 m³; full, its centroid is LCG (48·12 + 24·16)/72 = 13.3333, VCG (48·2 + 24·2.5)/72
= 2.16667 m.  Bulk cargo levelled at fill f (volume 0.72·f m³, level z):

* f ≤ 33.3 % fills the aft half only: z = 1 + v/24, LCG 12, VCG (1 + z)/2; at 25 %
  v = 18, z = 1.75, VCG 1.375;
* above, 24·(z − 1) + 24·(z − 2) = v; at 50 % v = 36, z = 2.25: 30 m³ aft at VCG 1.625 and
  6 m³ forward at VCG 2.125, so LCG (30·12 + 6·16)/36 = 12.6667, VCG (30·1.625 + 6·2.125)/36
  = 1.70833 m.

The hold's fill table carries those rows; the program interpolates linearly between rows
(tables.py), so a fill on a row is read exactly.  The barge (checks.md §1) carries it.
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.loading import LoadingError
from deckload.core.model import Condition, Hold, HoldLoad, TankFill, frozen_array
from deckload.core.stability import evaluate
from vessel_factories import box_barge, box_tank

FILLS = (0.0, 25.0, 50.0, 100.0)
VCG = (1.0, 1.375, 1.625 * 30 / 36 + 2.125 * 6 / 36, 2.0 * 48 / 72 + 2.5 * 24 / 72)
LCG = (12.0, 12.0, (30 * 12 + 6 * 16) / 36, (48 * 12 + 24 * 16) / 72)
EXACT = 1e-12  # round-off: every expected value is a closed form read on a table row


def hold(**kw) -> Hold:
    base = dict(id="H1", name="Hold 1", capacity_m3=72.0, lcg_m=LCG[-1], vcg_m=VCG[-1], tcg_m=0.0,
                fill_pct=frozen_array(FILLS), fill_vcg_m=frozen_array(VCG), fill_lcg_m=frozen_array(LCG))
    base.update(kw)
    return Hold(**base)


def item(r):
    return next(i for i in r.items if i.group == "hold")


def vessel(h: Hold | None = None):
    return dataclasses.replace(box_barge(), holds=(h or hold(),))


def test_stepped_hold_closed_forms():
    assert VCG[2] == pytest.approx(1.70833, abs=5e-6) and LCG[2] == pytest.approx(12.6667, abs=5e-5)
    assert VCG[3] == pytest.approx(2.16667, abs=5e-6) and LCG[3] == pytest.approx(13.3333, abs=5e-5)


def test_cargo_centroid_follows_the_fill():
    """30 t at 1.2 m³/t fill 36 m³ = 50 %: the centroid is the 50 % row, not the full-hold centroid."""
    r = evaluate(vessel(), Condition(holds=(HoldLoad("H1", 30.0, stowage_m3_t=1.2),)))
    it = item(r)
    assert (it.mass_t, it.lcg_m, it.vcg_m, it.tcg_m) == pytest.approx((30.0, LCG[2], VCG[2], 0.0), abs=EXACT)
    assert r.displacement_t == pytest.approx(400.0 + 30.0, abs=EXACT)
    assert r.kg_m == pytest.approx((400.0 * 3.0 + 30.0 * VCG[2]) / 430.0, abs=EXACT)


def test_between_rows_the_centroid_is_interpolated_linearly():
    """15 t at 1.2 m³/t = 18 m³ = 25 % (a row); 22.5 t = 27 m³ = 37.5 %, halfway between the 25 % and
    50 % rows: the program reads the mean of the two rows (tables.py, linear between rows)."""
    r = evaluate(vessel(), Condition(holds=(HoldLoad("H1", 22.5, stowage_m3_t=1.2),)))
    assert item(r).vcg_m == pytest.approx((VCG[1] + VCG[2]) / 2, abs=EXACT)
    assert item(r).lcg_m == pytest.approx((LCG[1] + LCG[2]) / 2, abs=EXACT)
    r = evaluate(vessel(), Condition(holds=(HoldLoad("H1", 15.0, stowage_m3_t=1.2),)))
    assert item(r).vcg_m == pytest.approx(1.375, abs=EXACT)


def test_without_stowage_or_fill_table_the_full_hold_centroid_is_used():
    """Common practice, conservative for KG: the full-hold centroid when the fill is not known."""
    r = evaluate(vessel(), Condition(holds=(HoldLoad("H1", 30.0),)))
    assert (item(r).lcg_m, item(r).vcg_m) == pytest.approx((LCG[3], VCG[3]), abs=EXACT)
    bare = hold(fill_pct=None, fill_vcg_m=None, fill_lcg_m=None)
    r = evaluate(vessel(bare), Condition(holds=(HoldLoad("H1", 30.0, stowage_m3_t=1.2),)))
    assert (item(r).lcg_m, item(r).vcg_m) == pytest.approx((LCG[3], VCG[3]), abs=EXACT)


def test_condition_overrides_win():
    r = evaluate(vessel(), Condition(holds=(HoldLoad("H1", 30.0, stowage_m3_t=1.2, lcg_m=11.0, vcg_m=2.9,
                                                     tcg_m=-0.5),)))
    assert (item(r).lcg_m, item(r).vcg_m, item(r).tcg_m) == (11.0, 2.9, -0.5)


def test_hold_filled_exactly_full_and_overfilled():
    """60 t at 1.2 m³/t is exactly 72 m³ (full, the 100 % row); 61 t needs 73.2 m³ and is refused,
    naming the hold, the amounts and the capacity."""
    r = evaluate(vessel(), Condition(holds=(HoldLoad("H1", 60.0, stowage_m3_t=1.2),)))
    assert item(r).vcg_m == pytest.approx(VCG[3], abs=EXACT)
    with pytest.raises(LoadingError) as e:
        evaluate(vessel(), Condition(holds=(HoldLoad("H1", 61.0, stowage_m3_t=1.2),)))
    assert str(e.value) == "hold H1: 61 t at 1.2 m³/t needs 73.2 m³, more than its 72.0 m³"
    # even 0.6 m³ (0.8 %) too much is refused: only round-off (1e-9 %) is forgiven
    with pytest.raises(LoadingError, match="needs 72.6 m³"):
        evaluate(vessel(), Condition(holds=(HoldLoad("H1", 60.5, stowage_m3_t=1.2),)))


@pytest.mark.parametrize("mass", [0.0, 0.5])
def test_small_and_zero_cargo_is_accepted(mass):
    r = evaluate(vessel(), Condition(holds=(HoldLoad("H1", mass, stowage_m3_t=1.2),)))
    assert item(r).mass_t == mass
    assert r.displacement_t == pytest.approx(400.0 + mass, abs=EXACT)


def test_negative_cargo_is_refused():
    with pytest.raises(LoadingError) as e:
        evaluate(vessel(), Condition(holds=(HoldLoad("H1", -1.0),)))
    assert str(e.value) == "hold H1: negative cargo mass -1 t"


def test_sounding_outside_the_tank_is_refused():
    """A sounding beyond the calibration table is refused, naming the tank, the value and the range."""
    v = box_barge(tanks=(box_tank("DB1C", length_m=6.0, breadth_m=4.0, height_m=2.0, lcg_m=20.0),))
    with pytest.raises(LoadingError) as e:
        evaluate(v, Condition(tanks=(TankFill("DB1C", "sounding_m", 2.5),)))
    assert str(e.value) == ("tank DB1C: sounding 2.5 m is outside the calibration table 0–2 m; "
                            "deckload does not extrapolate")
    r = evaluate(v, Condition(tanks=(TankFill("DB1C", "sounding_m", 0.5),)))
    assert r.tanks[0].volume_m3 == pytest.approx(6 * 4 * 0.5, abs=EXACT)  # v = l·b·s (checks.md §3.1)


@pytest.mark.parametrize("quantity, value, density, volume", [
    ("percent", 25.0, None, 12.0),        # 25 % of 48 m³
    ("volume_m3", 12.0, None, 12.0),
    ("mass_t", 12.3, None, 12.0),         # 12.3 t / 1.025 t/m³ (the tank's own density)
    ("mass_t", 12.0, 1.000, 12.0),        # fresh water in a ballast tank: 12 t / 1.000 t/m³
    ("sounding_m", 0.5, None, 12.0),      # v = l·b·s = 6·4·0.5 (checks.md §3.1)
])
def test_tank_contents_however_stated(quantity, value, density, volume):
    """Percent, m³, tonnes (÷ the liquid's density) and sounding all resolve to one volume."""
    v = box_barge(tanks=(box_tank("DB1C", length_m=6.0, breadth_m=4.0, height_m=2.0, lcg_m=20.0),))
    t = evaluate(v, Condition(tanks=(TankFill("DB1C", quantity, value, density_t_m3=density),))).tanks[0]
    assert t.volume_m3 == pytest.approx(volume, abs=EXACT)
    assert t.fill_pct == pytest.approx(25.0, abs=EXACT)
    assert t.mass_t == pytest.approx(volume * (density or 1.025), abs=EXACT)
    # the calibration row at that volume: sounding s = v/(l·b) = 0.5 m, LCG 20, VCG s/2, TCG 0, i = l·b³/12
    assert (t.sounding_m, t.lcg_m, t.vcg_m, t.tcg_m) == pytest.approx((0.5, 20.0, 0.25, 0.0), abs=EXACT)
    assert t.fsi_m4 == pytest.approx(6.0 * 4.0**3 / 12.0, abs=EXACT)


def test_tank_fill_above_100_percent_is_refused():
    v = box_barge(tanks=(box_tank("DB1C", length_m=6.0, breadth_m=4.0, height_m=2.0, lcg_m=20.0),))
    with pytest.raises(LoadingError) as e:
        evaluate(v, Condition(tanks=(TankFill("DB1C", "percent", 100.5),)))
    assert str(e.value) == "tank DB1C: 100.5 % is outside 0–100 %"


def test_hold_cargo_is_named_by_its_description_or_the_hold():
    r = evaluate(vessel(), Condition(holds=(HoldLoad("H1", 30.0, description="bagged cement"),)))
    assert item(r).name == "bagged cement"
    assert item(evaluate(vessel(), Condition(holds=(HoldLoad("H1", 30.0),)))).name == "Hold 1"


def test_volume_of_each_quantity_and_its_refusals():
    """loading.volume_of, the conversion the loading screen uses for a typed amount (box tank 6 × 4 × 2,
    48 m³, v = l·b·s): every way of stating an amount, and the clear refusals (DEVELOPERS: bad input
    names the value and the rule)."""
    from deckload.core.loading import volume_of

    tank = box_tank("DB1C", length_m=6.0, breadth_m=4.0, height_m=2.0, lcg_m=20.0)
    assert volume_of(tank, "sounding_m", 0.5, 1.025) == pytest.approx(12.0, abs=EXACT)
    assert volume_of(tank, "mass_t", 12.3, 1.025) == pytest.approx(12.0, abs=EXACT)
    assert volume_of(tank, "volume_m3", 0.0, 1.025) == 0.0
    assert volume_of(tank, "volume_m3", 0.5, 1.025) == 0.5
    assert volume_of(tank, "volume_m3", 48.0, 1.025) == 48.0
    # capacity and the table's top may differ by round-off (the profile loader allows 0.05 %): a full
    # tank is never asked of the table beyond its last row
    wide = dataclasses.replace(tank, capacity_m3=48.02)
    assert volume_of(wide, "volume_m3", 48.02, 1.025) == 48.0
    assert volume_of(wide, "percent", 100.0, 1.025) == 48.0
    refusals = [
        ("sounding_m", 2.5, "tank DB1C: sounding 2.5 m is outside the calibration table 0–2 m; "
                            "deckload does not extrapolate"),
        ("litres", 1.0, "tank DB1C: unknown quantity 'litres'"),
        ("volume_m3", -1.0, "tank DB1C: a negative amount (-1) cannot be loaded"),
        ("mass_t", 50.0, "tank DB1C: 48.78 m³ exceeds its capacity of 48.00 m³"),
        ("percent", -0.5, "tank DB1C: -0.5 % is outside 0–100 %"),
    ]
    for quantity, value, message in refusals:
        with pytest.raises(LoadingError) as e:
            volume_of(tank, quantity, value, 1.025)
        assert str(e.value) == message
