"""Tables at several trims written in a profile: TOML and CSV keys, validation and the audit.

The vessel is the box of tests/test_reference_trimmed_tables.py (L 40, B 8, D 10 m), its
tables at trims from the closed forms derived there; the file is written by
tests/box_profile_text.py with the trimmed tables added as ``[[hydrostatics_at_trim]]`` and
``[[cross_curves_at_trim]]``.  Every bad input names the file, the line (or the CSV file, line
and column), the key and the value.
"""

from __future__ import annotations

import math
from pathlib import Path

import numpy as np
import pytest

from box_profile_text import BoxTank, box_profile_text
from deckload.report.audit_findings import audit_profile
from deckload.core.model import Condition
from deckload.core.stability import evaluate
from deckload.io.profiles import ProfileError, load_profile, parse_profile
from trimmed_box import B, D, L, RHO, exact_trim, hydro_at_trim
from vessel_factories import box_kn_m

DRAFTS = [4.0, 4.25, 4.5, 4.75, 5.0, 5.25, 5.5, 5.75, 6.0]
KN_DRAFTS = [4.5, 5.0, 5.5]
HEELS = [10.0 * k for k in range(10)]
HYDRO_KEYS = ("draft_m", "displacement_t", "lcb_m", "lcf_m", "kmt_m", "tpc_t_cm", "mctc_tm_cm", "vcb_m", "kml_m")


def _arr(xs) -> str:
    return "[" + ", ".join(repr(round(float(x), 9)) for x in xs) + "]"


def kn_row(T: float, t: float) -> list[float]:
    """The box's KN (exact section formula, tests/vessel_factories.py) plus the trim's KB term
    sinφ·t²/(24T) of the reference module's docstring."""
    return [box_kn_m(B, D, T, math.radians(h)) + math.sin(math.radians(h)) * t * t / (24 * T) for h in HEELS]


def hydro_columns(t: float) -> dict[str, list[float]]:
    h = hydro_at_trim(t)
    keep = np.isin(h.draft_m, DRAFTS)
    return {k: [float(x) for x in getattr(h, k)[keep]] for k in HYDRO_KEYS}


def hydro_toml(trim_line: str, t: float, **replace) -> str:
    cols = hydro_columns(t)
    cols.update(replace)
    return "\n".join(["[[hydrostatics_at_trim]]", trim_line, *(f"{k} = {_arr(v)}" for k, v in cols.items()), ""])


def kn_toml(trim_line: str, t: float, heels=HEELS) -> str:
    rows = ["    " + _arr(kn_row(T, t)[: len(heels)]) + "," for T in KN_DRAFTS]
    return "\n".join(["[[cross_curves_at_trim]]", trim_line, f"heel_deg = {_arr(heels)}",
                      f"displacement_t = {_arr([RHO * L * B * T for T in KN_DRAFTS])}", "kn_m = [", *rows, "]", ""])


def profile(extra: str, lightship=(RHO * L * B * 5.0, L / 2 - 0.98, 3.0)) -> str:
    return box_profile_text(name="Trimmed box", length_m=L, breadth_m=B, depth_m=D, drafts_m=DRAFTS,
                            kn_drafts_m=KN_DRAFTS, lightship=lightship,
                            tanks=(BoxTank("DB1", (15.0, 25.0), (-2.0, 2.0), (0.0, 1.0)),), extra=extra)


TRIMMED = "".join([hydro_toml("trim_m = -1.0", -1.0), hydro_toml("trim_m = 1.0", 1.0),
                   hydro_toml("trim_m = 2.0", 2.0), kn_toml("trim_m = -1.0", -1.0), kn_toml("trim_m = 1.0", 1.0),
                   kn_toml("trim_m = 2.0", 2.0)])


def test_trimmed_tables_in_the_toml_give_the_exact_trim():
    """Read from the file, the tables give the exact trim of the reference module (UR L5 1 %/5 cm,
    standards.md §5.3; within 2 mm as derived there).  The even-keel tables sit at trim 0 of each set."""
    v = parse_profile(profile(TRIMMED), "trimmed.toml")
    assert list(v.trimmed.hydro_trim_m) == [-1.0, 0.0, 1.0, 2.0]
    assert list(v.trimmed.kn_trim_m) == [-1.0, 0.0, 1.0, 2.0]
    assert v.trimmed.hydrostatics[1] is v.hydrostatics and v.trimmed.cross_curves[1] is v.cross_curves
    r = evaluate(v, Condition())
    t = exact_trim(5.0, 3.0, 0.98)
    assert abs(r.trim_m - t) < 2e-3
    assert not any(w.code in ("trim-beyond-tables", "kn-reference-lcg") for w in r.warnings)


def test_trim_as_percent_of_lbp():
    """trim_pct_lbp = 2.5 on LBP 40 m is 1.0 m by the stern (2.5 % × 40 m)."""
    text = profile(hydro_toml("trim_pct_lbp = 2.5", 1.0) + kn_toml("trim_pct_lbp = -2.5", -1.0))
    v = parse_profile(text, "pct.toml")
    assert list(v.trimmed.hydro_trim_m) == [0.0, 1.0]
    assert list(v.trimmed.kn_trim_m) == [-1.0, 0.0]


def _write_csv(path: Path, header, rows) -> None:
    path.write_text(",".join(header) + "\n" + "\n".join(",".join(repr(round(float(x), 9)) for x in r) for r in rows)
                    + "\n", encoding="utf-8")


def test_trimmed_tables_from_csv_files_give_the_same_vessel(tmp_path):
    extra = []
    for t in (-1.0, 1.0):
        cols = hydro_columns(t)
        _write_csv(tmp_path / f"hyd_{t:+g}.csv", HYDRO_KEYS, list(zip(*(cols[k] for k in HYDRO_KEYS))))
        _write_csv(tmp_path / f"kn_{t:+g}.csv", ["displacement_t"] + [f"kn_{h:g}" for h in HEELS],
                   [[RHO * L * B * T] + kn_row(T, t) for T in KN_DRAFTS])
        extra += ["[[hydrostatics_at_trim]]", f"trim_m = {t}", f'csv = "hyd_{t:+g}.csv"', "",
                  "[[cross_curves_at_trim]]", f"trim_m = {t}", f'csv = "kn_{t:+g}.csv"', ""]
    (tmp_path / "p.toml").write_text(profile("\n".join(extra)), encoding="utf-8")
    v = load_profile(tmp_path / "p.toml")
    inline = parse_profile(profile(hydro_toml("trim_m = -1.0", -1.0) + hydro_toml("trim_m = 1.0", 1.0)
                                   + kn_toml("trim_m = -1.0", -1.0) + kn_toml("trim_m = 1.0", 1.0)), "i.toml")
    for a, b in zip(v.trimmed.hydrostatics, inline.trimmed.hydrostatics):
        assert np.allclose(a.lcb_m, b.lcb_m, rtol=0, atol=1e-9) and np.allclose(a.vcb_m, b.vcb_m, rtol=0, atol=1e-9)
    for a, b in zip(v.trimmed.cross_curves, inline.trimmed.cross_curves):
        assert np.allclose(a.kn_m, b.kn_m, rtol=0, atol=1e-9)

    # a bad cell in a trimmed table's CSV names that file, its line and column, the key and the value
    text = (tmp_path / "hyd_+1.csv").read_text(encoding="utf-8").splitlines()
    cells = text[3].split(",")
    cells[2] = "19.9x"
    text[3] = ",".join(cells)
    (tmp_path / "hyd_+1.csv").write_text("\n".join(text) + "\n", encoding="utf-8")
    with pytest.raises(ProfileError) as ei:
        load_profile(tmp_path / "p.toml")
    (p,) = ei.value.problems
    assert (p.file, p.line, p.column) == (str(tmp_path / "hyd_+1.csv"), 4, "column 3 'lcb_m'")
    assert p.key == "hydrostatics_at_trim[1 m].lcb_m" and p.value == '"19.9x"'


def _problems(extra: str) -> list:
    with pytest.raises(ProfileError) as ei:
        parse_profile(profile(extra), "bad.toml")
    return ei.value.problems


def _line_of(text: str, needle: str, nth: int = 1) -> int:
    lines = [i + 1 for i, s in enumerate(text.splitlines()) if s.strip() == needle]
    return lines[nth - 1]


def test_trims_must_increase_strictly():
    extra = hydro_toml("trim_m = 1.0", 1.0) + hydro_toml("trim_m = -1.0", -1.0)
    (p,) = _problems(extra)
    assert p.key == "hydrostatics_at_trim[-1 m].trim_m" and p.value == "-1.0"
    assert "must increase strictly" in p.rule and "1 m" in p.rule
    assert p.line == _line_of(profile(extra), "trim_m = -1.0")


def test_trim_zero_is_the_even_keel_table():
    (p,) = _problems(hydro_toml("trim_m = 0.0", 0.0))
    assert p.key.endswith(".trim_m") and "even-keel [hydrostatics]" in p.rule


def test_the_trim_is_given_once():
    (p,) = _problems(hydro_toml("trim_m = 1.0\ntrim_pct_lbp = 2.5", 1.0))
    assert p.key == "hydrostatics_at_trim[#1].trim_m" and "once" in p.rule


def test_a_trim_beyond_twice_the_depth_or_a_fifth_of_lbp_is_refused():
    """|trim| ≤ min(2·D, 0.2·LBP) = min(20, 8) = 8 m (core/bounds.table_trim_range): 9 m is refused."""
    (p,) = _problems(hydro_toml("trim_m = 9.0", 1.0))
    assert p.key == "hydrostatics_at_trim[#1].trim_m" and p.value == "9.0" and "fifth of LBP" in p.rule


def test_kn_at_a_trim_need_the_even_keel_heels():
    (p,) = _problems(kn_toml("trim_m = 1.0", 1.0, heels=HEELS[:7]))
    assert p.key == "cross_curves_at_trim[1 m].heel_deg" and "heel angles of [cross_curves]" in p.rule


def test_trimmed_hydrostatics_need_kb():
    text = profile(hydro_toml("trim_m = 1.0", 1.0)).replace("vcb_m = [2.0,", "#vcb_m = [2.0,", 1)
    with pytest.raises(ProfileError) as ei:
        parse_profile(text, "nokb.toml")
    (p,) = ei.value.problems
    assert p.key.endswith(".trim_m") and "vcb_m in [hydrostatics]" in p.rule


def test_a_trimmed_table_is_checked_like_the_even_keel_one():
    """A trimmed table gets every check of [hydrostatics]: a draft column that falls is refused by the schema."""
    cols = hydro_columns(1.0)
    bad_drafts = list(cols["draft_m"])
    bad_drafts[3], bad_drafts[4] = bad_drafts[4], bad_drafts[3]
    problems = _problems(hydro_toml("trim_m = 1.0", 1.0, draft_m=bad_drafts))
    assert any(p.key == "hydrostatics_at_trim[1 m].draft_m" for p in problems)


def test_audit_finds_a_datum_slip_in_a_trimmed_table(tmp_path):
    """LCB of the +1 m table typed from midships (the AP values less L/2 = 20 m): outside 0.2–0.8
    × LBP (core/audit.LCB_ERROR_RANGE) — an audit error naming the trimmed table, at its line."""
    cols = hydro_columns(1.0)
    slipped = [x - L / 2 for x in cols["lcb_m"]]
    text = profile(hydro_toml("trim_m = 1.0", 1.0, lcb_m=slipped))
    f = tmp_path / "slip.toml"
    f.write_text(text, encoding="utf-8")
    found = audit_profile(f, load_profile(f))
    errors = [x for x in found if x.is_error]
    assert errors and errors[0].finding.key == "hydrostatics_at_trim[1 m].lcb_m"
    assert errors[0].finding.check == "hydro-lcb-range"
    lcb_line = [i + 1 for i, s in enumerate(text.splitlines()) if s.startswith("lcb_m = [-")][0]
    assert errors[0].line == lcb_line


def test_demo_like_clean_trimmed_box_audits_clean(tmp_path):
    """The exact tables at trims raise no audit error (their own checks hold on exact numbers)."""
    f = tmp_path / "clean.toml"
    f.write_text(profile(TRIMMED), encoding="utf-8")
    assert not [x for x in audit_profile(f, load_profile(f)) if x.is_error]



def test_deckload_csv_writes_the_trimmed_tables_back(tmp_path, capsys):
    """`deckload csv` writes every table at a trim; a profile reading them back has the same numbers
    (the CSV cells carry 10 significant digits: 1e-9 relative)."""
    from deckload.cli.csv_export import run_csv

    src = tmp_path / "p.toml"
    src.write_text(profile(TRIMMED), encoding="utf-8")
    assert run_csv(src, tmp_path / "out") == 0
    out = capsys.readouterr().out
    assert "hydrostatics_trim_+2.csv" in out and "kn_trim_-1.csv" in out
    back = [f"[[hydrostatics_at_trim]]\ntrim_m = {t}\ncsv = \"out/hydrostatics_trim_{t:+g}.csv\"\n" for t in (-1.0, 1.0, 2.0)]
    back += [f"[[cross_curves_at_trim]]\ntrim_m = {t}\ncsv = \"out/kn_trim_{t:+g}.csv\"\n" for t in (-1.0, 1.0, 2.0)]
    (tmp_path / "q.toml").write_text(profile("\n".join(back)), encoding="utf-8")
    a, b = load_profile(src), load_profile(tmp_path / "q.toml")
    for x, y in zip(a.trimmed.hydrostatics, b.trimmed.hydrostatics):
        assert np.allclose(x.lcb_m, y.lcb_m, rtol=1e-9, atol=0) and np.allclose(x.kml_m, y.kml_m, rtol=1e-9, atol=0)
    for x, y in zip(a.trimmed.cross_curves, b.trimmed.cross_curves):
        assert np.allclose(x.kn_m, y.kn_m, rtol=1e-9, atol=1e-12)


def test_too_many_tables_at_trims_are_refused():
    """More than MAX_TABLES_AT_TRIMS (40) entries: refused at the key, before any is read (io/limits.py)."""
    from deckload.io.limits import MAX_TABLES_AT_TRIMS

    extra = "".join(f"[[hydrostatics_at_trim]]\ntrim_m = {0.1 * (k + 1):.1f}\n" for k in range(MAX_TABLES_AT_TRIMS + 1))
    problems = _problems(extra)
    assert len(problems) == 1 and problems[0].key == "hydrostatics_at_trim" and "more than the 40" in problems[0].rule
