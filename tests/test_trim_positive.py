"""``trim_positive``: trims typed + by the head, as many booklets print them (io/conventions.py).

deckload counts trim + by the stern (draft aft − draft forward).  A booklet that counts it + by
the head is typed as printed with ``trim_positive = "head"`` in ``[vessel]`` or in the table that
holds the trims (vessel_profiles/README.md, "Trims"), and every trim is turned + by the stern where
it is read.  Before the key, a trim range typed as printed judged a limiting curve outside its
trims, and tables at trims typed + by the head refused every condition with a wrong reason.

The vessel is the box of tests/trimmed_box.py (L 40, B 8, D 10 m), its tables at trims from the
closed forms derived there (LCB(t) = L/2 − L·t/(12·T)), with the box tank DB1 of
tests/test_sounding_trim_columns.py and its trim corrections (−0.125·t m at every sounding,
derived there).  The same booklet typed + by the stern and + by the head with the key must give
the same vessel and the same result, number for number.
"""

from __future__ import annotations

import json
from pathlib import Path

import numpy as np
import pytest

from deckload.cli.main import main
from deckload.core.audit import ERROR, audit
from deckload.io.profiles import ProfileError, load_profile, parse_profile
from deckload.report.audit_findings import audit_profile
from test_trimmed_tables_profile import hydro_columns, hydro_toml, kn_toml, profile
from trimmed_box import L

TABLE_TRIMS = (-1.0, 1.0, 2.0)
CORR_TRIMS = (-1.0, -0.5, 0.5, 1.0)
SOUNDINGS = (0.3, 0.5, 0.7)
HEAD = 'trim_positive = "head"'


def _arr(xs) -> str:
    return "[" + ", ".join(repr(round(float(x), 9)) for x in xs) + "]"


def booklet(head: bool, where: str = "vessel") -> str:
    """The box's booklet typed + by the stern (``head`` False) or + by the head, the key in
    ``[vessel]`` (``where`` = "vessel") or in each table holding trims ("tables")."""
    s = -1.0 if head else 1.0
    key = HEAD + "\n" if head and where == "tables" else ""
    # entries in the order the booklet prints them: rising as typed
    trims = sorted(TABLE_TRIMS, key=lambda t: s * t)
    extra = "".join(hydro_toml(f"{key}trim_m = {s * t!r}", t) for t in trims)
    extra += "".join(kn_toml(f"{key}trim_m = {s * t!r}", t) for t in trims)
    # the limiting curve holds from 1.0 m by the head to 0.5 m by the stern
    rng = "[-1.0, 0.5]" if not head else "[-0.5, 1.0]"
    extra += ("\n[limit_curve]\ndisplacement_t = [1300.0, 2000.0]\nmax_kg_m = [4.0, 4.0]\n"
              f"trim_range_m = {rng}\n{key}")
    # the booklet's trim-correction columns: −0.125·t m at trim t (+ by the stern)
    typed = sorted(CORR_TRIMS, key=lambda t: s * t)
    rows = "".join("    " + _arr([-0.125 * t for t in typed]) + ",\n" for _ in SOUNDINGS)
    corr = (f"\n  [tank.trim_correction]\n  {key}trim_m = {_arr([s * t for t in typed])}\n"
            f"  sounding_m = {_arr(SOUNDINGS)}\n  sounding_correction_m = [\n{rows}]\n")
    text = profile(corr + extra)  # extra follows the [[tank]] DB1: its trim corrections first
    if head and where == "vessel":
        text = text.replace("[vessel]\n", f"[vessel]\n{HEAD}\n", 1)
    return text


CONDITIONS = {
    # G 0.98 m abaft midships: 1.50 m by the stern (trimmed_box.exact_trim), outside the curve's trims
    "aft": "",
    # 45 t forward: about 0.9 m by the stern, between the curve's end (0.5 m) and 1.0 m by the stern,
    # where the range typed as printed but read + by the stern would hold the curve
    "forward": '[[constant]]\nname = "Forward load"\nmass_t = 45.0\nlcg_m = 34.0\nvcg_m = 6.0\ntcg_m = 0.0\n',
    # DB1 sounded 0.5 m while 0.8 m by the stern (the booklet's correction −0.1 m); 0.3 m by the
    # head, within the curve's trims
    "sounded": ('[tanks.DB1]\nsounding_m = 0.5\n'
                '[[constant]]\nname = "Forward load"\nmass_t = 120.0\nlcg_m = 36.0\nvcg_m = 6.0\ntcg_m = 0.0\n'),
}


def _condition(tmp_path: Path, name: str) -> Path:
    trim = "sounding_trim_m = 0.8\n" if name == "sounded" else ""
    f = tmp_path / f"{name}.condition.toml"
    f.write_text(f'format = "deckload-condition-1"\n[condition]\nname = "{name}"\nwater_density_t_m3 = 1.025\n'
                 f"{trim}{CONDITIONS[name]}", encoding="utf-8")
    return f


def _calc_json(capsys, prof: Path, cond: Path) -> dict:
    capsys.readouterr()
    rc = main(["--no-cache", "calc", str(prof), str(cond), "--json"])
    out = capsys.readouterr().out
    assert rc == 0, out
    return json.loads(out)


@pytest.mark.parametrize("where", ["vessel", "tables"])
def test_the_booklet_typed_by_the_head_gives_the_same_results(tmp_path, capsys, where):
    """Typed + by the head with the key, in [vessel] or in each table, the box gives calc --json equal
    to the same booklet typed + by the stern, for every condition: the trims the tables are found
    at, the curve judged or not by its trims, the sounding corrected by the booklet's columns."""
    stern, head = tmp_path / "stern.toml", tmp_path / "head.toml"
    stern.write_text(booklet(False), encoding="utf-8")
    head.write_text(booklet(True, where), encoding="utf-8")
    a, b = load_profile(stern), load_profile(head)
    assert list(b.trimmed.hydro_trim_m) == list(a.trimmed.hydro_trim_m) == [-1.0, 0.0, 1.0, 2.0]
    assert list(b.trimmed.kn_trim_m) == [-1.0, 0.0, 1.0, 2.0]
    for x, y in zip(a.trimmed.hydrostatics, b.trimmed.hydrostatics):
        assert np.array_equal(x.lcb_m, y.lcb_m)
    assert b.limit_curve.trim_range_m == a.limit_curve.trim_range_m == (-1.0, 0.5)
    ta, tb = a.tank("DB1").trim_correction, b.tank("DB1").trim_correction
    assert list(tb.trim_m) == list(ta.trim_m) == list(CORR_TRIMS) and np.array_equal(tb.value, ta.value)
    for name in CONDITIONS:
        cond = _condition(tmp_path, name)
        got, want = _calc_json(capsys, head, cond), _calc_json(capsys, stern, cond)
        assert got == want, name
    # what the conditions show (so that equal is not equally wrong): trims from the tables, the
    # curve not judged beyond 0.5 m by the stern, the sounding corrected (derived in the docstring)
    aft = _calc_json(capsys, head, _condition(tmp_path, "aft"))
    fwd = _calc_json(capsys, head, _condition(tmp_path, "forward"))
    snd = _calc_json(capsys, head, _condition(tmp_path, "sounded"))
    assert json.dumps(aft).count("outside the trims the limiting curve covers, -1.00 to +0.50 m") >= 1
    assert 0.5 < _trim(fwd) < 1.0 and "outside the trims the limiting curve covers" in json.dumps(fwd)
    assert _trim(snd) < 0 and "DB1 0.500 → 0.400 m (booklet trim correction)" in json.dumps(snd, ensure_ascii=False)


def _trim(result: dict) -> float:
    (t,) = [v for k, v in _walk(result) if k == "trim_m"][:1]
    return float(t)


def _walk(d):
    if isinstance(d, dict):
        for k, v in d.items():
            yield k, v
            yield from _walk(v)
    elif isinstance(d, list):
        for v in d:
            yield from _walk(v)


# --------------------------------------------------------------------------- the limiting curve's trims

BARGE = (Path(__file__).parent / "broken_profiles" / "box_barge.toml").read_text(encoding="utf-8")
CURVE = "\n[limit_curve]\ndisplacement_t = [410.0, 1230.0]\nmax_kg_m = [4.0, 4.0]\n"


def test_a_curve_range_typed_by_the_head_is_read_as_the_booklet_means_it():
    """The booklet: "valid from 0.5 m by the stern to 1.0 m by the head", typed as printed (+ by the
    head) [-0.5, 1.0] with the key: −1.0 to +0.5 m by the stern.  The barge of
    tests/test_limit_curve_trims.py (Δ 820 t, MCTC 13.359 t·m/cm, LCB 20 m: trim = Δ·(LCB − LCG)/
    (100·MCTC), standards.md §6.3) with 420 t in the hold at LCG 17.07 m has LCG 18.50 m and trims
    820·1.499/1335.9 = 0.92 m by the stern: outside the curve's trims, so its check is not made
    ("Met where assessable"); read + by the stern it was judged and met."""
    from deckload.core.criteria import LIMIT_CURVE_SET, SET_TITLES
    from deckload.core.stability import evaluate
    from deckload.io.profiles import parse_condition

    v = parse_profile(BARGE + CURVE + f'trim_range_m = [-0.5, 1.0]\n{HEAD}\n', "barge.toml")
    assert v.limit_curve.trim_range_m == (-1.0, 0.5)
    assert "limit_curve trim_range_m: + by the head → + by the stern (sign reversed): [-0.5, 1] → [-1, 0.5] m" \
        in v.conversions
    c = parse_condition('format = "deckload-condition-1"\n[condition]\nname = "c"\nwater_density_t_m3 = 1.025\n'
                        "[holds.H1]\nmass_t = 420.0\nlcg_m = 17.07\nvcg_m = 2.5\n", "c.condition.toml", v)
    r = evaluate(v, c)
    assert r.trim_m == pytest.approx(0.92, abs=0.005)
    assert [x for x in r.criteria if x.set_id == LIMIT_CURVE_SET] == []
    [missing] = [n for n in r.not_assessed if n.item == SET_TITLES[LIMIT_CURVE_SET]]
    assert "outside the trims the limiting curve covers, -1.00 to +0.50 m" in missing.reason
    assert r.verdict_text().startswith("Met where assessable")


# --------------------------------------------------------------------------- a worked condition's trim

def test_a_worked_conditions_trim_typed_by_the_head(tmp_path, capsys):
    """The worked condition of tests/test_booklet_conditions.py trims 0.3085 m by the stern (derived
    there); printed + by the head it reads −0.309, and with the key it is compared as +0.309 and passes,
    the page's own trim = aft − forward holding.  Without the key the row fails (its tolerance is the
    two end drafts', 5 cm or less: standards.md §5.3)."""
    from deckload.cli.check import run_check
    from deckload.io.booklet_conditions import load_booklet_conditions
    from test_booklet_conditions import TRIM, booklet_values, inline
    from test_booklet_conditions import profile as barge_profile

    values = booklet_values(trim_m=-round(TRIM, 3))
    entry = inline("By the head", values).replace("  [booklet_condition.expected]\n",
                                                  f"  [booklet_condition.expected]\n  {HEAD}\n")
    f = barge_profile(tmp_path, entry)
    (case,) = load_booklet_conditions(f, load_profile(f))
    assert case.expected["trim_m"] == round(TRIM, 3) and case.expected["as_typed"]["trim_m"] == round(TRIM, 3)
    assert run_check(f) == 0
    out = capsys.readouterr().out
    assert "converted: booklet_condition[By the head].expected trim_m: + by the head → + by the stern" in out
    assert "disagree" not in out
    f = barge_profile(tmp_path, inline("By the head", values))
    assert run_check(f) == 1


# --------------------------------------------------------------------------- bad values

@pytest.mark.parametrize("edit, key", [
    (("[vessel]\n", '[vessel]\ntrim_positive = "bow"\n'), "vessel.trim_positive"),
    (("[vessel]\n", "[vessel]\ntrim_positive = 1\n"), "vessel.trim_positive"),
    (("[limit_curve]\n", '[limit_curve]\ntrim_positive = "Head"\n'), "limit_curve.trim_positive"),
    (("[tank.trim_correction]\n", '[tank.trim_correction]\ntrim_positive = "aft"\n'),
     "tank[DB1].trim_correction.trim_positive"),
    (("[[hydrostatics_at_trim]]\n", '[[hydrostatics_at_trim]]\ntrim_positive = ""\n'),
     "hydrostatics_at_trim[-1 m].trim_positive"),
])
def test_a_bad_trim_sign_is_refused_naming_file_line_and_key(edit, key):
    text = booklet(False).replace(*edit, 1)
    with pytest.raises(ProfileError) as ei:
        parse_profile(text, "bad.toml")
    [p] = [p for p in ei.value.problems if p.key.endswith("trim_positive")]
    assert p.file == "bad.toml" and p.key.startswith(key.split("[")[0]) and p.line is not None
    assert text.splitlines()[p.line - 1].strip().startswith("trim_positive")
    assert ('"stern"' in p.rule and '"head"' in p.rule) or "string" in p.rule


def test_the_key_belongs_to_tables_that_hold_trims():
    """[hydrostatics] holds no trim: the key there is an unknown key, never silently ignored."""
    text = booklet(False).replace("[hydrostatics]\n", f"[hydrostatics]\n{HEAD}\n", 1)
    with pytest.raises(ProfileError) as ei:
        parse_profile(text, "bad.toml")
    assert [p.key for p in ei.value.problems] == ["hydrostatics.trim_positive"]


def test_tables_typed_by_the_head_rise_as_typed_and_each_trim_once():
    """Entries + by the head must rise as typed (−2, −1, 1 here); one typed falling is refused,
    and so is a trim given twice once the signs are turned (+1 by the stern and −1 by the head)."""
    text = booklet(True, "tables")
    ok = parse_profile(text, "ok.toml")
    assert list(ok.trimmed.hydro_trim_m) == [-1.0, 0.0, 1.0, 2.0]
    both = profile(hydro_toml("trim_m = 1.0", 1.0) + hydro_toml(f"{HEAD}\ntrim_m = -1.0", 1.0))
    with pytest.raises(ProfileError) as ei:
        parse_profile(both, "twice.toml")
    [p] = ei.value.problems
    assert p.key == "hydrostatics_at_trim[1 m].trim_m" and "must increase strictly" in p.rule
    both = profile(hydro_toml("trim_m = 1.0", 1.0) + hydro_toml(f"{HEAD}\ntrim_m = 0.5", -0.5)
                   + hydro_toml("trim_m = 2.0", 2.0) + hydro_toml(f"{HEAD}\ntrim_m = -1.0", 1.0))
    with pytest.raises(ProfileError) as ei:
        parse_profile(both, "twice.toml")
    [p] = ei.value.problems
    assert p.key == "hydrostatics_at_trim[1 m].trim_m" and "the same trim as an earlier" in p.rule


# --------------------------------------------------------------------------- the audit

def _trim_sign(v):
    return [f for f in audit(v) if f.check == "trim-sign"]


def test_the_audit_finds_tables_typed_by_the_head_without_the_key(tmp_path):
    """The box's tables typed + by the head without the key: every pair of trims has LCB further
    forward at the larger trim by the stern (L·δt/(12·T) = 0.74–1.11 m per metre of trim on these
    drafts, derived in tests/trimmed_box.py), an error naming the key, located at the first entry."""
    text = booklet(True).replace(f"[vessel]\n{HEAD}\n", "[vessel]\n", 1).replace(
        "trim_range_m = [-0.5, 1.0]\n", "", 1)
    f = tmp_path / "slip.toml"
    f.write_text(text, encoding="utf-8")
    v = load_profile(f)
    [e] = _trim_sign(v)
    assert e.severity == ERROR and e.key == "hydrostatics_at_trim.trim_m"
    assert "look typed + by the head" in e.why and 'trim_positive = "head"' in e.why
    assert "hydrostatics_at_trim[-2 m], hydrostatics_at_trim[-1 m], hydrostatics_at_trim[1 m]" in e.why
    [located] = [x for x in audit_profile(f, v) if x.finding.check == "trim-sign"]
    first = [i + 1 for i, s in enumerate(text.splitlines()) if s == "[[hydrostatics_at_trim]]"][0]
    assert located.is_error and located.line in (first, first + 1)
    # with the key, or typed + by the stern, nothing
    for head in (False, True):
        assert _trim_sign(parse_profile(booklet(head), "ok.toml")) == []


def test_the_audit_names_one_table_whose_trim_sign_slipped():
    """The −1 m table typed as +0.5 m (its rows are −1 m's): between 0 and +0.5 m LCB moves forward,
    elsewhere aft — an error naming that table alone."""
    text = profile(hydro_toml("trim_m = 0.5", -1.0) + hydro_toml("trim_m = 1.0", 1.0) + hydro_toml("trim_m = 2.0", 2.0))
    [e] = _trim_sign(parse_profile(text, "one.toml"))
    assert e.severity == ERROR and e.key == "hydrostatics_at_trim[0.5 m].trim_m"
    assert "this table's trim has the wrong sign" in e.why


def test_no_finding_where_the_data_do_not_allow_a_judgement():
    """One trimmed table whose displacements share none with the even-keel table's: not judged."""
    cols = hydro_columns(-1.0)
    far = {k: v for k, v in cols.items()}
    far["displacement_t"] = [x + 5000.0 for x in cols["displacement_t"]]
    far["draft_m"] = [x + 3.0 for x in cols["draft_m"]]
    v = parse_profile(profile(hydro_toml("trim_m = 1.0", -1.0, **far)), "far.toml")
    assert _trim_sign(v) == []


def test_the_demo_vessels_with_tables_at_trims_from_their_hulls_audit_clean():
    """Tables at trims made from the Demo Islander's hull and the Demo Trawler's geometry
    (core/geometry/trimmed.py, as `deckload tables --trims` makes them), beside the profiles' own
    even-keel tables: no trim-sign finding; and none on the demo profiles as shipped."""
    import dataclasses

    from deckload.core.geometry.builder import hull_body
    from deckload.core.geometry.trimmed import hydrostatics_at_trim
    from deckload.core.model import TrimmedTables, frozen_array
    from deckload.io.geometry_files import load_geometry
    from deckload.io.paths import DEMO_PROFILE

    here = Path(__file__).parent.parent / "vessel_profiles"
    islander, trawler = load_profile(DEMO_PROFILE), load_profile(here / "demo_trawler.toml")
    assert _trim_sign(islander) == [] and _trim_sign(trawler) == []
    for v, body, low in ((islander, islander.hull, 1.0),
                         (trawler, hull_body(load_geometry(here / "demo_trawler.geometry.toml")), 1.6)):
        p, h = v.particulars, v.hydrostatics
        trims = (-1.0, -0.5, 0.0, 0.5, 1.0)
        tables = tuple(h if t == 0 else hydrostatics_at_trim(body, h.draft_m[h.draft_m >= low], t,
                                                             p.table_density_t_m3, p.lbp_m) for t in trims)
        tt = TrimmedTables(frozen_array(trims), tables, frozen_array([0.0]), (v.cross_curves,))
        assert _trim_sign(dataclasses.replace(v, trimmed=tt)) == []
        # the same tables with their trims' sign turned: the error
        turned = TrimmedTables(frozen_array(trims), tables[::-1], frozen_array([0.0]), (v.cross_curves,))
        [e] = _trim_sign(dataclasses.replace(v, trimmed=turned))
        assert e.severity == ERROR and "look typed + by the head" in e.why


def test_a_finding_in_a_table_typed_by_the_head_is_located_at_its_entry(tmp_path):
    """Entries typed + by the head run the other way from the model's rising trims: a datum slip
    put into the table typed −1 m (+1 m by the stern) is located at that entry's lcb_m line."""
    cols = hydro_columns(1.0)
    slipped = [x - L / 2 for x in cols["lcb_m"]]
    extra = (hydro_toml(f"{HEAD}\ntrim_m = -2.0", 2.0) + hydro_toml(f"{HEAD}\ntrim_m = -1.0", 1.0, lcb_m=slipped)
             + hydro_toml(f"{HEAD}\ntrim_m = 1.0", -1.0))
    text = profile(extra)
    f = tmp_path / "slip.toml"
    f.write_text(text, encoding="utf-8")
    [x] = [x for x in audit_profile(f, load_profile(f)) if x.finding.check == "hydro-lcb-range"]
    assert x.finding.key == "hydrostatics_at_trim[1 m].lcb_m"
    assert x.line == [i + 1 for i, s in enumerate(text.splitlines()) if s.startswith("lcb_m = [-")][0]


# --------------------------------------------------------------------------- written back

def test_deckload_csv_writes_the_trims_as_typed(tmp_path, capsys):
    """`deckload csv` writes the tables at trims and the trim corrections in the sign they were typed
    in; a profile reading them back with the same key is the same vessel."""
    from deckload.cli.csv_export import run_csv

    src = tmp_path / "p.toml"
    src.write_text(booklet(True), encoding="utf-8")
    assert run_csv(src, tmp_path / "out") == 0
    out = capsys.readouterr().out
    assert "hydrostatics_trim_-2.csv" in out and "trims + by the head" in out
    header = (tmp_path / "out" / "tank_DB1_trim.csv").read_text(encoding="utf-8").splitlines()[0]
    assert header == "sounding_m,corr_-1,corr_-0.5,corr_0.5,corr_1"
    back = [f'[[hydrostatics_at_trim]]\ntrim_m = {t}\ncsv = "out/hydrostatics_trim_{t:+g}.csv"\n' for t in (-2.0, -1.0, 1.0)]
    corr = '\n  [tank.trim_correction]\n  csv = "out/tank_DB1_trim.csv"\n'
    (tmp_path / "q.toml").write_text(profile(corr + "\n".join(back)).replace("[vessel]\n", f"[vessel]\n{HEAD}\n", 1),
                                     encoding="utf-8")
    a, b = load_profile(src), load_profile(tmp_path / "q.toml")
    assert list(a.trimmed.hydro_trim_m) == list(b.trimmed.hydro_trim_m)
    for x, y in zip(a.trimmed.hydrostatics, b.trimmed.hydrostatics):
        assert np.allclose(x.lcb_m, y.lcb_m, rtol=1e-9, atol=0)
    ta, tb = a.tank("DB1").trim_correction, b.tank("DB1").trim_correction
    assert list(ta.trim_m) == list(tb.trim_m) and np.allclose(ta.value, tb.value, rtol=0, atol=1e-12)


def test_tables_made_by_the_command_say_they_are_by_the_stern():
    """`deckload tables --trims` writes trims + by the stern: under [vessel] trim_positive = "head"
    each table it makes says trim_positive = "stern", so that it is not read the other way."""
    from deckload.cli.tables import _stamp_model_conventions

    gen = {"hydrostatics_at_trim": [{"trim_m": 1.0}], "cross_curves_at_trim": [{"trim_m": 1.0}]}
    new = {k: [dict(e) for e in v] for k, v in gen.items()}
    _stamp_model_conventions(new, gen, {"trim_positive": "head", "longitudinal_datum": "AP"})
    assert [e["trim_positive"] for k in gen for e in new[k]] == ["stern", "stern"]
    new = {k: [dict(e) for e in v] for k, v in gen.items()}
    _stamp_model_conventions(new, gen, {"longitudinal_datum": "AP"})
    assert all("trim_positive" not in e for k in gen for e in new[k])
