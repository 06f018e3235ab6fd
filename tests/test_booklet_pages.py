"""Booklet pages typed as printed: the shapes a correct booklet has that deckload used to refuse.

An independent typing of a correct booklet found five false alarms: an extra booklet column
(a block coefficient, a fresh-water displacement, the draft beside the KN, the tonnes beside a
tank's volumes, the ullage beside the soundings), KN printed from 5° or 10°, KN ending at 60°
against a downflooding angle that belongs to a displacement below the lightship, a capacity
printed to 0.1 m³, and tables printed deepest draft first.  Each case here is accepted and
read into the vessel the plainly typed page gives, and the typing error next to it is still
refused with the file, row and column.  The base is the analytic box barge of
``tests/broken_profiles/box_barge.toml`` (checks.md §1: L = 40, B = 10, D = 4 m, Δ = 410·T t;
two 10 × 5 × 1 m double-bottom tanks, V = 50·level), through the booklet-typed copy of
tests/test_booklet_input.py.
"""

from __future__ import annotations

import math
from pathlib import Path

import numpy as np
import pytest

from deckload.cli.main import main
from deckload.io.profiles import ProfileError, load_profile, parse_profile, read_profile
from deckload.report.audit_findings import read_audited
from test_booklet_input import (
    AP_VESSEL,
    BASE,
    HYDRO_CSV,
    KN60,
    KN_CSV,
    _cells,
    _write,
    booklet_profile,
    edit,
    problems,
)
from vessel_factories import box_kn_m

TABLES = "tables"


def _load_with(tmp_path: Path, page: str, text: str) -> Path:
    """The booklet-typed barge with one page (``tables/<page>``) replaced by ``text``."""
    path = booklet_profile(tmp_path)
    _write(tmp_path / TABLES / page, text)
    return path


def _column_added(csv_text: str, name: str, values: list[str]) -> str:
    lines = csv_text.strip("\n").split("\n")
    return "\n".join([lines[0] + "," + name] + [r + "," + v for r, v in zip(lines[1:], values)]) + "\n"


def _refused(path: Path) -> list:
    with pytest.raises(ProfileError) as ei:
        load_profile(path)
    return ei.value.problems


# =========================================================================== 1. booklet columns not used


SOUNDING_CSV = """sounding_m,volume_m3,lcg_m,vcg_m,tcg_m,fsi_m4,ullage_m,mass_t,fill_pct
0.0,0.0,-10,0.0,2.5,104.166667,1.0,0.0,0
0.5,25.0,-10,0.25,2.5,104.166667,0.5,25.63,50
1.0,50.0,-10,0.5,2.5,104.166667,0.0,51.25,100
"""
"""DB1S as a booklet prints it: soundings with the ullage from a 1.0 m pipe head beside them, the
tonnes at 1.025 t/m³ and the percentage full (derived: V = 50·s, mass = 1.025·V, % = 100·V/50)."""


def _with_sounding_page(tmp_path: Path) -> Path:
    path = booklet_profile(tmp_path)
    text = path.read_text(encoding="utf-8")
    start = text.index("sounding_m = [0.0, 0.5, 1.0]")
    end = text.index("[[hold]]", start)
    text = text[:start] + 'csv = "tables/DB1S.csv"\n\n' + text[end:]
    _write(tmp_path / TABLES / "DB1S.csv", SOUNDING_CSV)
    return _write(path, text)


def test_booklet_columns_deckload_does_not_use_are_read_and_noted(tmp_path):
    """cb and the fresh-water displacement beside the hydrostatics, the draft beside the KN, the
    ullage, tonnes and % beside a sounding table: read as numbers, not used — the vessel is the
    one the plain pages give — and each named in the conversion notes `check` prints."""
    plain = load_profile(booklet_profile(tmp_path / "plain"))
    path = _with_sounding_page(tmp_path)
    _write(tmp_path / TABLES / "hydrostatics.csv",
           _column_added(_column_added(HYDRO_CSV, "cb", ["1.00"] * 7), "displacement_fw_t",
                         [f"{410 * t / 1.025:.1f}" for t in (0.5, 1.0, 1.5, 2.0, 2.5, 3.0, 3.5)]))
    _write(tmp_path / TABLES / "kn.csv", _column_added(KN_CSV, "draft_m", ["1.00", "2.00", "3.00"]))
    v, rd = read_profile(path)
    for a, b in ((v.hydrostatics.displacement_t, plain.hydrostatics.displacement_t),
                 (v.hydrostatics.kmt_m, plain.hydrostatics.kmt_m),
                 (v.cross_curves.kn_m, plain.cross_curves.kn_m),
                 (v.tank("DB1S").calibration.stacked(), AP_VESSEL.tank("DB1S").calibration.stacked())):
        assert np.array_equal(a, b)
    notes = "\n".join(v.conversions)
    assert "hydrostatics cb, displacement_fw_t: read from tables/hydrostatics.csv as numbers and not used" in notes
    assert "cross_curves draft_m: read from tables/kn.csv as numbers and not used" in notes
    assert "tank[DB1S].calibration mass_t, fill_pct, ullage_m: read from tables/DB1S.csv as numbers and not used" in notes
    assert rd.tables["tank[DB1S].calibration"].level == "sounding_m"
    # in the TOML a table is still one reading or the other (only a CSV page may print both)
    (p,) = problems(edit(BASE, "sounding_m = [0.0, 0.5, 1.0]", "sounding_m = [0.0, 0.5, 1.0]\n  ullage_m = [1.0, 0.5, 0.0]"))
    assert p.rule == "give exactly one of sounding_m and ullage_m, not both"


def test_a_booklet_column_not_used_is_still_checked_as_numbers(tmp_path):
    path = _load_with(tmp_path, "hydrostatics.csv", _column_added(HYDRO_CSV, "cb", ["1.00", "1.00", "l.00"] + ["1.00"] * 4))
    (p,) = _refused(path)
    assert (p.file, p.line, p.column) == (str(tmp_path / TABLES / "hydrostatics.csv"), 4, "column 8 'cb'")
    assert p.key == "hydrostatics.cb" and p.rule == 'row 3: "l.00" is a string, not a number'


@pytest.mark.parametrize("page, base, column", [
    ("hydrostatics.csv", HYDRO_CSV, "kmt"),          # kmt_m misspelt: its KMt must not be dropped unseen
    ("hydrostatics.csv", HYDRO_CSV, "cb_"),
    ("kn.csv", KN_CSV, "draft"),
], ids=["kmt", "cb_", "kn-draft"])
def test_an_unknown_column_is_refused_naming_the_columns_read_and_not_used(tmp_path, page, base, column):
    n = base.count("\n") - 1
    path = _load_with(tmp_path, page, _column_added(base, column, ["1.0"] * n))
    (p,) = _refused(path)
    assert p.file == str(tmp_path / TABLES / page) and p.line == 1 and p.value == repr(column)
    assert p.rule.startswith(f"unknown column (column {base.split(chr(10))[0].count(',') + 2})")
    assert "booklet columns read (as numbers) and not used: " in p.rule
    assert ("displacement_fw_t, volume_m3, cb" if page == "hydrostatics.csv" else "draft_m, volume_m3") in p.rule


def test_an_unknown_column_of_a_tank_page_is_refused(tmp_path):
    path = _with_sounding_page(tmp_path)
    _write(tmp_path / TABLES / "DB1S.csv", SOUNDING_CSV.replace("mass_t", "mass"))
    (p,) = _refused(path)
    assert p.value == "'mass'" and "not used: mass_t, fill_pct" in p.rule


def test_deckload_csv_writes_the_columns_not_used_back_as_read(tmp_path, capsys):
    path = _with_sounding_page(tmp_path)
    _write(tmp_path / TABLES / "hydrostatics.csv", _column_added(HYDRO_CSV, "cb", ["1.00"] * 7))
    assert main(["csv", str(path), str(tmp_path / "out")]) == 0
    assert "[hydrostatics], 7 rows (x from midships, + forward, with cb as read)" in capsys.readouterr().out
    assert _cells(tmp_path / "out" / "hydrostatics.csv")[0] == HYDRO_CSV.split("\n")[0].split(",") + ["cb"]
    written = _cells(tmp_path / "out" / "tank_DB1S.csv")
    assert written[0] == SOUNDING_CSV.split("\n")[0].split(",")
    assert [float(x) for x in written[2]] == [0.5, 25.0, -10, 0.25, 2.5, 104.166667, 0.5, 25.63, 50]


# =========================================================================== 2. KN printed from 5° or 10°


def _kn_box(draft_m: float, heel_deg: float) -> float:
    """KN of the box barge section B = 10, D = 4 m at draft T by the closed forms of checks.md §1.2
    (vessel_factories.box_kn_m); it reproduces the box's tabulated KN at 10° and 20° (checks.md §1.4)."""
    return box_kn_m(10.0, 4.0, draft_m, math.radians(heel_deg))


DRAFTS = ((410.0, 1.0), (820.0, 2.0), (1230.0, 3.0))
"""The KN page's displacements and their drafts: Δ = ρ·L·B·T = 410·T t (checks.md §1.1)."""


def _kn_page(heels: list[float]) -> str:
    """The box's KN page printed at ``heels``: the closed form below 30°, the tabulated KN from 30° on."""
    from deckload.io.csvtables import fmt_number

    printed = [float(name[len("kn_"):]) for name in KN_CSV.split("\n")[0].split(",")[1:]]
    table = {h: i for i, h in enumerate(printed)}
    body = [r.split(",") for r in KN_CSV.strip().split("\n")[1:]]
    out = ["displacement_t," + ",".join(f"kn_{fmt_number(h)}" for h in heels)]
    for (disp, draft), cells in zip(DRAFTS, body):
        vals = [cells[1 + table[h]] if h >= 30 else f"{_kn_box(draft, h):.6f}" for h in heels]
        out.append(f"{disp},{','.join(vals)}")
    return "\n".join(out) + "\n"


def test_kn_printed_from_10_degrees_gives_the_vessel_of_the_page_printed_from_0(tmp_path):
    """The 0° column is KN = 0 exactly (a hull symmetric about its centreline: y_B = 0 upright, so
    KN = y_B·cos0 + z_B·sin0 = 0, checks.md conventions): the page without it reads into the same
    vessel, and the conversion notes say the column was added."""
    plain = load_profile(booklet_profile(tmp_path / "plain"))
    from10 = "\n".join(",".join(c for i, c in enumerate(r.split(",")) if i != 1) for r in KN_CSV.strip().split("\n")) + "\n"
    assert from10.startswith("displacement_t,kn_10,")
    v = load_profile(_load_with(tmp_path, "kn.csv", from10))
    assert np.array_equal(v.cross_curves.heel_deg, plain.cross_curves.heel_deg)
    assert np.array_equal(v.cross_curves.kn_m, plain.cross_curves.kn_m)
    assert any(c.startswith("cross_curves kn_m: printed from 10°: KN 0 at 0° added") for c in v.conversions)


def test_kn_printed_from_5_degrees(tmp_path):
    """KN at 5° by the closed form (_kn_box): the page printed from 5° or from 0°, the same vessel."""
    for (_, draft), cells in zip(DRAFTS, [r.split(",") for r in KN_CSV.strip().split("\n")[1:]]):
        # the closed form gives the box's tabulated KN at 10° and 20° (checks.md §1.4)
        assert _kn_box(draft, 10.0) == pytest.approx(float(cells[2]), abs=1e-5)
        assert _kn_box(draft, 20.0) == pytest.approx(float(cells[3]), abs=1e-5)
    a = load_profile(_load_with(tmp_path / "a", "kn.csv", _kn_page([0, 5, 10, 20, 30, 40, 50, 60])))
    b = load_profile(_load_with(tmp_path / "b", "kn.csv", _kn_page([5, 10, 20, 30, 40, 50, 60])))
    assert np.array_equal(a.cross_curves.heel_deg, b.cross_curves.heel_deg)
    assert np.array_equal(a.cross_curves.kn_m, b.cross_curves.kn_m)
    assert b.cross_curves.heel_deg[:3].tolist() == [0.0, 5.0, 10.0]


def test_the_curve_from_upright_to_the_first_angle_printed(tmp_path):
    """Why 15° at most (profiles.KN_MAX_FIRST_DEG): on the box at T = 1 m, whose bilge emerges at
    tanθ = 2T/B = 0.2 (11.3°), the area under KN from 0 to 20° through the added 0° column against
    the closed form (_kn_box, trapezoidal on the 0.1° grid): KN printed from 10° (10, 15, 20, …)
    keeps within UR L5's 0.0012 m·rad on areas (standards.md §5.3) at every draft; from 15°
    (15, 20, …) it is accepted — the gap is a booklet's coarsest step — but already 0.012 m·rad off
    at T = 1 m, which is why a wider gap is refused."""
    from deckload.core.gz import FINE_DEG, FINE_RAD, kn_curve

    def area_error(v, disp, draft):
        n = int(round(20.0 / 0.1)) + 1
        err = kn_curve(v.cross_curves, disp)[:n] - np.array([_kn_box(draft, float(x)) for x in FINE_DEG[:n]])
        return abs(float(np.sum(err[1:] + err[:-1]) * 0.5 * (FINE_RAD[1] - FINE_RAD[0])))

    from10 = load_profile(_load_with(tmp_path / "10", "kn.csv", _kn_page([10, 15, 20, 30, 40, 50, 60])))
    from15 = load_profile(_load_with(tmp_path / "15", "kn.csv", _kn_page([15, 20, 30, 40, 50, 60])))
    assert max(area_error(from10, d, t) for d, t in DRAFTS) < 0.0012
    assert area_error(from15, 410.0, 1.0) > 0.01


def test_kn_printed_from_beyond_15_degrees_is_refused():
    text = edit(edit(edit(edit(BASE, "heel_deg = [0, 10, 20,", "heel_deg = [20,"),
                          "[0.0, 1.55639, ", "["), "[0.0, 0.90843, ", "["), "[0.0, 0.75033, ", "[")
    (p,) = problems(text)
    assert p.key == "cross_curves.heel_deg"
    assert p.rule.startswith("must start at 0 (the upright condition), or at 15° at most (it starts at 20°)")
    # at 15°: accepted, KN 0 added at 0° (KN at 15° by the closed form, _kn_box)
    ok = edit(BASE, "heel_deg = [0, 10, 20,", "heel_deg = [15, 20,")
    for (_, draft), old in zip(DRAFTS, ("[0.0, 1.55639, ", "[0.0, 0.90843, ", "[0.0, 0.75033, ")):
        ok = edit(ok, old, f"[{_kn_box(draft, 15.0):.5f}, ")
    v = parse_profile(ok, "kn15.toml")
    assert v.cross_curves.heel_deg[:2].tolist() == [0.0, 15.0] and np.all(v.cross_curves.kn_m[:, 0] == 0.0)


# =========================================================================== 3. downflooding beyond the KN


def _flood(rows: list[tuple[float, float]]) -> str:
    d = ", ".join(repr(x) for x, _ in rows)
    a = ", ".join(repr(y) for _, y in rows)
    return edit(KN60, "[free_surface]", f"[downflooding]\ndisplacement_t = [{d}]\nangle_deg = [{a}]\n\n[free_surface]")


def test_a_downflooding_angle_below_any_condition_does_not_need_the_kn():
    """Lightship 400 t at table density 1.025: in water of 1.04 t/m³ (the densest a condition may
    state) the lightest condition reads its θf at 400·1.025/1.04 = 394.2 t (derived), between the
    rows of 390 and 820 t: the 71.2° of 200 t is never read, and KN to 60° serve."""
    v = parse_profile(_flood([(200.0, 71.2), (390.0, 59.0), (820.0, 50.0), (1230.0, 45.0)]), "df.toml")
    assert v.downflooding.value[0] == 71.2


def test_a_downflooding_angle_a_condition_can_read_still_needs_the_kn():
    """The row of 390 t at 61°: the lightest condition (394.2 t) interpolates between it and 820 t, at
    up to 61° > 60°: refused, naming the row."""
    (p,) = problems(_flood([(200.0, 71.2), (390.0, 61.0), (820.0, 50.0), (1230.0, 45.0)]))
    assert p.key == "cross_curves.heel_deg"
    assert p.rule.startswith("ends at 60°, before the downflooding angle 61° at 390 t")


def test_the_lightest_condition_is_taken_in_the_densest_water():
    """A row at 397 t lies below the lightship's 400 t but above 394.2 t (the lightship in water of
    1.04 t/m³, at table density 1.025): the interval 200–397 t can be read, so its 71.2° counts."""
    (p,) = problems(_flood([(200.0, 71.2), (397.0, 59.0), (820.0, 50.0), (1230.0, 45.0)]))
    assert p.rule.startswith("ends at 60°, before the downflooding angle 71.2° at 200 t")


# =========================================================================== 4. capacity printed to 0.1 m³


def _capacity(capacity: str, last_volume: str = "50.068") -> str:
    text = edit(BASE, "volume_m3 = [0.0, 25.0, 50.0]", f"volume_m3 = [0.0, 25.0, {last_volume}]")
    return edit(text, "capacity_m3 = 50.0", f"capacity_m3 = {capacity}")


def test_a_capacity_printed_to_a_tenth_is_accepted_and_the_table_gives_100_percent():
    """24.1 against 24.068 in the audit's coaster; here 50.1 against 50.068: 0.064 % > 0.05 %, within
    half a unit of the decimal printed (0.05 m³) plus the table's (0.0005 m³)."""
    from deckload.core.loading import volume_of

    v = parse_profile(_capacity("50.1"), "cap.toml")
    assert v.tank("DB1P").capacity_m3 == 50.068
    assert volume_of(v.tank("DB1P"), "percent", 100.0, 1.025) == 50.068
    assert any(c.startswith("tank[DB1P] capacity_m3: 50.1 m³ as printed → 50.068 m³") for c in v.conversions)
    assert parse_profile(_capacity("50"), "cap.toml").tank("DB1P").capacity_m3 == 50.068  # printed to whole m³
    # digits slipped (50.608, 50.098 for 50.068: beyond 0.05 % = 0.025 m³ and the 0.0005 m³ their three
    # decimals allow), or a tenth off (50.2, 50.12: beyond 0.05 + 0.0005 m³): still refused
    for typed in ("50.608", "50.098", "50.2", "50.12"):
        (p,) = problems(_capacity(typed))
        assert p.key == "tank[DB1P].capacity_m3" and p.value == typed
        assert p.rule.startswith("differs from the last calibration volume 50.068 m³ by "), p.rule


def test_a_calibration_printed_to_a_tenth_beside_a_finer_capacity(tmp_path):
    """The table's last volume typed "50.1" (CSV cell text, one decimal) against 50.068: accepted;
    "50.2" is refused."""
    path = _with_sounding_page(tmp_path)
    text = path.read_text(encoding="utf-8")
    _write(path, edit(text, "capacity_m3 = 50.0", "capacity_m3 = 50.068", 2))
    _write(tmp_path / TABLES / "DB1S.csv", SOUNDING_CSV.replace("1.0,50.0,", "1.0,50.1,"))
    assert load_profile(path).tank("DB1S").capacity_m3 == 50.1
    _write(tmp_path / TABLES / "DB1S.csv", SOUNDING_CSV.replace("1.0,50.0,", "1.0,50.2,"))
    (p,) = _refused(path)
    assert p.key == "tank[DB1S].capacity_m3"


# =========================================================================== 5. tables printed greatest first


def _descending(csv_text: str) -> str:
    lines = csv_text.strip("\n").split("\n")
    return "\n".join([lines[0]] + lines[:0:-1]) + "\n"


def test_hydrostatics_and_kn_printed_deepest_first_are_read_in_rising_order(tmp_path, capsys):
    plain = load_profile(booklet_profile(tmp_path / "plain"))
    path = booklet_profile(tmp_path)
    _write(tmp_path / TABLES / "hydrostatics.csv", _descending(HYDRO_CSV))
    _write(tmp_path / TABLES / "kn.csv", _descending(KN_CSV))
    v = load_profile(path)
    for name in ("draft_m", "displacement_t", "lcb_m", "kmt_m", "tpc_t_cm", "mctc_tm_cm"):
        assert np.array_equal(getattr(v.hydrostatics, name), getattr(plain.hydrostatics, name)), name
    assert np.array_equal(v.cross_curves.displacement_t, plain.cross_curves.displacement_t)
    assert np.array_equal(v.cross_curves.kn_m, plain.cross_curves.kn_m)
    assert "hydrostatics rows: typed deepest draft first → read in rising order" in v.conversions
    assert "cross_curves rows: typed greatest displacement first → read in rising order" in v.conversions
    # and `deckload csv` writes them back as typed, deepest first
    assert main(["csv", str(path), str(tmp_path / "out")]) == 0
    assert [r[0] for r in _cells(tmp_path / "out" / "hydrostatics.csv")[1:]] == ["3.5", "3", "2.5", "2", "1.5", "1", "0.5"]
    assert [r[0] for r in _cells(tmp_path / "out" / "cross_curves.csv")[1:]] == ["1230", "820", "410"]
    # a table neither rising nor falling is refused as before: 0.5, 2.5, 1.5, 2.0, 1.0, 3.0, 3.5 mostly rises
    lines = HYDRO_CSV.strip().split("\n")
    lines[2], lines[5] = lines[5], lines[2]
    ps = _refused(_load_with(tmp_path / "mixed", "hydrostatics.csv", "\n".join(lines) + "\n"))
    assert ps[0].rule == "not strictly increasing (row 3: 1.5 after 2.5)" and ps[0].line == 4


@pytest.mark.parametrize("typed, rule", [
    # rows 2 and 3 swapped: 3.5, 2.5, 3.0, …
    ((3.5, 2.5, 3.0, 2.0, 1.5, 1.0, 0.5), "not strictly decreasing (row 3: 3.0 after 2.5)"),
    # row 2 typed twice: 3.5, 3.0, 3.0, 2.0, …
    ((3.5, 3.0, 3.0, 2.0, 1.5, 1.0, 0.5), "not strictly decreasing (row 3: 3.0 after 3.0)"),
])
def test_a_descending_table_with_a_swapped_or_repeated_row_is_refused(tmp_path, typed, rule):
    """Rows named by their draft (Δ = 410·T, derived): the third row as typed is on line 4."""
    rows = {float(r.split(",")[0]): r for r in HYDRO_CSV.strip().split("\n")[1:]}
    text = "\n".join([HYDRO_CSV.split("\n")[0]] + [rows[t] for t in typed]) + "\n"
    p = _refused(_load_with(tmp_path, "hydrostatics.csv", text))[0]
    assert (p.file, p.line, p.column) == (str(tmp_path / TABLES / "hydrostatics.csv"), 4, "column 1 'draft_m'")
    assert p.key == "hydrostatics.draft_m" and p.rule == rule


HYDRO_TOML_FALLING = """[hydrostatics]
draft_m = [3.5, 3.0, 2.5, 2.0, 1.5, 1.0, 0.5]
displacement_t = [1435.0, 1230.0, 1025.0, 820.0, 615.0, 410.0, 205.0]
lcb_m = [20.0, 20.0, 20.0, 20.0, 20.0, 20.0, 20.0]
lcf_m = [20.0, 20.0, 20.0, 20.0, 20.0, 20.0, 20.0]
kmt_m = [
    4.130952,
    4.277778,
    4.583333,
    5.166667,
    63.05556,
    8.833333,
    16.916667,
]
tpc_t_cm = [4.1, 4.1, 4.1, 4.1, 4.1, 4.1, 4.1]
mctc_tm_cm = [13.666667, 13.666667, 13.666667, 13.666667, 13.666667, 13.666667, 13.666667]
vcb_m = [1.75, 1.5, 1.25, 1.0, 0.75, 0.5, 0.25]
kml_m = [39.845238, 45.944444, 54.583333, 67.666667, 89.638889, 133.833333, 266.916667]

"""


def test_an_audit_finding_in_a_falling_toml_table_is_located_on_the_row_as_typed(tmp_path):
    """KMt 63.05556 typed for 6.305556 at T = 1.5 m (checks.md §1.1: KMt = T/2 + B²/(12T) = 6.3056):
    the model's row 3 (rising, from 1) is the fifth row as typed, and the finding names its line."""
    start, end = BASE.index("[hydrostatics]"), BASE.index("[cross_curves]")
    text = BASE[:start] + HYDRO_TOML_FALLING + BASE[end:]
    f = _write(tmp_path / "falling.toml", text)
    found = [x for x in read_audited(f).found if x.finding.key == "hydrostatics.kmt_m"]
    assert found, "the slipped KMt is found"
    typed = text.splitlines().index("    63.05556,") + 1
    assert {x.line for x in found} == {typed}


def test_a_sounding_and_ullage_that_do_not_add_up_are_refused_naming_the_row(tmp_path):
    """Both readings printed: sounding + ullage is the pipe head's height above the sounding zero in
    every row (1.0 m in SOUNDING_CSV, derived); the middle row's ullage typed 0.05 for 0.50 (a digit
    slipped) makes 0.55 m there.  The soundings are the table's level, so one of the two is wrong."""
    path = _with_sounding_page(tmp_path)
    assert read_profile(path)[0].tank("DB1S").capacity_m3 == 50.0  # the page as printed is accepted
    page = tmp_path / TABLES / "DB1S.csv"
    page.write_text(SOUNDING_CSV.replace("0.25,2.5,104.166667,0.5,", "0.25,2.5,104.166667,0.05,"), encoding="utf-8")
    (p,) = _refused(path)
    assert p.key.endswith("ullage_m") and "row 2: sounding 0.5 m + ullage 0.05 m = 0.55 m, but 1 m" in p.rule
