"""``deckload tables``: the committed demo profile is exactly what the builder makes from the
committed geometry; hand-entered sections survive a refresh; bad input leaves files alone."""

from __future__ import annotations

import hashlib
import pickle
import shutil
import tomllib
from pathlib import Path

import numpy as np
import pytest

from deckload.cli.main import main
from deckload.cli.tables import build_profile_text
from deckload.io.profiles import load_profile
from tools.trimmed_tables_from_geometry import KN_ROUND, ROUND, trimmed_vessel

ROOT = Path(__file__).resolve().parent.parent
GEOMETRY = ROOT / "vessel_profiles" / "demo_islander.geometry.toml"
PROFILE = ROOT / "vessel_profiles" / "demo_islander.toml"
PACKAGED = ROOT / "deckload" / "data" / "demo_islander.toml"

HAND_SECTIONS = ("format", "lightship", "criteria", "free_surface", "load_line")


@pytest.fixture(scope="module", autouse=True)
def tables_built_once():
    """Computing the demo's tables from its geometry costs about 2.5 s of CPU, and four tests of
    this module need them (the byte-for-byte rebuild, the refresh, the output to stdout and the
    tables at trims read back).  The computation runs once: ``build_tables`` as ``deckload tables``
    calls it is replaced, for this module only, by a memo keyed on the SHA-256 of the pickled
    geometry, so a geometry that differs in any value is computed afresh.  A memo hit replays the
    progress messages of the real run.  What is computed is checked by
    ``test_committed_demo_profile_rebuilds_byte_for_byte`` (and the geometry tests); the other
    tests here check the command around it.

    The tables at each trim (``tables_at_trims``, about 0.25 s a trim, each trim computed on its
    own) are kept the same way, keyed on the pickled hull, grids and particulars and the trim,
    for the command and for the generator the read-back is compared with
    (tests/tools/trimmed_tables_from_geometry.py): the read-back test checks what the command
    writes and reads back against what it computed, and the trim 0 the command does not write at
    trims; the computation itself is checked against the direct calculation
    (tests/test_trimmed_tables_demo.py) and a box's closed forms (tests/test_tables_trims.py)."""
    import deckload.cli.tables as tables_cli
    import tools.trimmed_tables_from_geometry as generator

    compute = tables_cli.build_tables
    at_trims = tables_cli.tables_at_trims
    memo: dict[str, tuple[object, list[str]]] = {}
    trims_memo: dict[tuple[str, float], object] = {}

    def build_tables_once(geometry, progress=None):
        key = hashlib.sha256(pickle.dumps(geometry)).hexdigest()
        if key not in memo:
            said: list[str] = []
            memo[key] = (compute(geometry, said.append), said)
        tables, said = memo[key]
        for msg in said:
            if progress is not None:
                progress(msg)
        return tables

    def tables_at_trims_once(body, drafts_m, kn_displacement_t, kn_heel_deg, trims_m, *rest):
        key = hashlib.sha256(pickle.dumps((body, list(drafts_m), list(kn_displacement_t), list(kn_heel_deg),
                                           rest))).hexdigest()
        out = []
        for t in (float(x) for x in trims_m):
            if (key, t) not in trims_memo:
                (trims_memo[(key, t)],) = at_trims(body, drafts_m, kn_displacement_t, kn_heel_deg, [t], *rest)
            out.append(trims_memo[(key, t)])
        return tuple(out)

    with pytest.MonkeyPatch.context() as mp:
        mp.setattr(tables_cli, "build_tables", build_tables_once)
        mp.setattr(tables_cli, "tables_at_trims", tables_at_trims_once)
        mp.setattr(generator, "tables_at_trims", tables_at_trims_once)
        yield memo, trims_memo


@pytest.fixture(scope="module")
def rebuilt() -> str:
    text, notes = build_profile_text(GEOMETRY, PROFILE.read_text(encoding="utf-8"))
    assert not any(n.startswith("note:") for n in notes)
    assert "41 stations by Simpson's first rule" in notes[0]
    return text


@pytest.mark.long
def test_committed_demo_profile_rebuilds_byte_for_byte(rebuilt):
    assert rebuilt == PROFILE.read_text(encoding="utf-8"), (
        "vessel_profiles/demo_islander.toml differs from what `deckload tables` makes from "
        "demo_islander.geometry.toml: run `deckload tables vessel_profiles/demo_islander.geometry.toml "
        "-o vessel_profiles/demo_islander.toml` and copy it to deckload/data/"
    )


DEMO_TRIMS = (-1.0, -0.5, 0.5, 1.0, 1.5)


@pytest.fixture(scope="module")
def demo_round_trip(tmp_path_factory):
    """``deckload tables`` with ``--trims`` on a copy of the demo's geometry, read back.  It lives
    in this module for the even-keel tables computed once above; the other tests of the command at
    trims are in tests/test_tables_trims.py."""
    d = tmp_path_factory.mktemp("demo")
    shutil.copy(GEOMETRY, d / GEOMETRY.name)
    text, notes = build_profile_text(d / GEOMETRY.name, PROFILE.read_text(encoding="utf-8"), trims=list(DEMO_TRIMS))
    (d / "demo.toml").write_text(text, encoding="utf-8")
    return load_profile(d / "demo.toml"), notes


@pytest.mark.long
def test_command_output_read_back_equals_the_generator(demo_round_trip, tables_built_once):
    """Read back by the profile reader, the command's tables at trims are the generator's
    (deckload/core/geometry/trimmed.py through tests/tools/trimmed_tables_from_geometry.py) to the
    decimals they are written with."""
    v, notes = demo_round_trip
    gen = trimmed_vessel(load_profile(PROFILE), sorted((0.0,) + DEMO_TRIMS)).trimmed
    # each trim computed once for the command and the generator (the same hull and grids), and 0
    assert sorted(t for _, t in tables_built_once[1]) == sorted((0.0,) + DEMO_TRIMS)
    tt = v.trimmed
    assert tt is not None
    assert list(tt.hydro_trim_m) == list(gen.hydro_trim_m) == [-1.0, -0.5, 0.0, 0.5, 1.0, 1.5]
    assert list(tt.kn_trim_m) == list(gen.kn_trim_m)
    assert len(tt.hydrostatics) == len(gen.hydrostatics) == 6 and len(tt.cross_curves) == len(gen.cross_curves)
    for got, ref in zip(tt.hydrostatics, gen.hydrostatics):
        assert len(got.draft_m) == len(ref.draft_m)
        for col, tol in ROUND.items():
            np.testing.assert_allclose(getattr(got, col), getattr(ref, col), rtol=0, atol=tol, err_msg=col)
    for got, ref in zip(tt.cross_curves, gen.cross_curves):
        np.testing.assert_allclose(got.kn_m, ref.kn_m, rtol=0, atol=KN_ROUND)
        assert got.trim_basis == "even keel"
    # the trim-0 KN are fixed-trim like the others, and the note says the geometry's free trim was not used
    assert v.cross_curves.trim_basis == "even keel" and v.cross_curves.reference_lcg_m is None
    assert any("fixed trim 0" in n and "'free trim'" in n for n in notes)


def test_packaged_copy_is_identical():
    assert PACKAGED.read_bytes() == PROFILE.read_bytes()


def test_demo_profile_loads_and_is_consistent():
    """The loader accepts the demo; its tables are mutually consistent (analytic relations):
    TPC = dΔ/dT/100 (Simpson vs. finite difference, 1 %), capacities equal last volumes."""
    v = load_profile(PROFILE)
    h = v.hydrostatics
    slope = np.gradient(h.displacement_t, h.draft_m) / 100.0
    np.testing.assert_allclose(h.tpc_t_cm[1:-1], slope[1:-1], rtol=0.01)
    assert 20 <= len(v.tanks) <= 30
    for t in v.tanks:
        assert t.capacity_m3 == pytest.approx(float(t.calibration.volume_m3[-1]))
        assert t.transfer is not None and t.transfer.moment_m4.shape == (21, 19)
        lo, hi = t.worst_band_pct
        assert 0.0 <= lo < hi <= 100.0
        if t.pair:
            assert v.tank(t.pair).worst_band_pct == t.worst_band_pct  # mirror images
    # lightship between 45 and 55 % of the summer displacement, KG below the depth (brief)
    summer = next(ll for ll in v.load_lines if ll.name == "summer")
    d_summer = float(np.interp(summer.draft_m, h.draft_m, h.displacement_t))
    assert 0.45 <= v.lightship.mass_t / d_summer <= 0.55
    assert v.lightship.vcg_m < v.particulars.depth_m


def test_refresh_keeps_hand_entered_sections(tmp_path, rebuilt):
    profile = tmp_path / "islander.toml"
    original = tomllib.loads(rebuilt)
    doc = dict(original)
    doc["hydrostatics"] = {"draft_m": [1.0, 2.0]}  # stale tables to be replaced
    doc["tank"] = [dict(original["tank"][0], capacity_m3=1.0), {"id": "EXTRA", "name": "kept"}]
    doc["lightship"] = dict(original["lightship"], mass_t=401.5)
    doc["vessel"] = dict(original["vessel"], remark="hand remark", lbp_m=99.0)
    import tomli_w

    old_text = "# hand notes that a rewrite cannot keep\n" + tomli_w.dumps(doc)
    profile.write_text(old_text, encoding="utf-8")
    assert main(["tables", str(GEOMETRY), "-o", str(profile)]) == 0
    assert (tmp_path / "islander.toml.bak").read_text(encoding="utf-8") == old_text  # comments kept aside
    new = tomllib.loads(profile.read_text(encoding="utf-8"))
    assert new["lightship"]["mass_t"] == 401.5
    assert new["vessel"]["remark"] == "hand remark"
    assert new["vessel"]["lbp_m"] == 38.0  # generated from the geometry
    assert new["hydrostatics"] == original["hydrostatics"]
    assert new["tank"][0] == original["tank"][0]
    assert new["tank"][-1] == {"id": "EXTRA", "name": "kept"}
    for k in HAND_SECTIONS:
        if k != "lightship":
            assert new[k] == original[k]


def test_stdout_without_output(capsys, rebuilt, tables_built_once):
    assert main(["tables", str(GEOMETRY)]) == 0
    assert len(tables_built_once[0]) == 1  # the demo's tables were computed once for the module
    out = capsys.readouterr()
    doc = tomllib.loads(out.out)
    assert doc["format"] == "deckload-profile-1"
    assert len(doc["cross_curves"]["kn_m"]) == len(doc["cross_curves"]["displacement_t"])
    assert "lightship" not in doc  # nothing invented for the hand-entered parts
    assert "tank 25/25" in out.err  # progress on stderr


def test_bad_geometry_leaves_profile_untouched(tmp_path, capsys):
    geo = tmp_path / "bad.geometry.toml"
    geo.write_text(GEOMETRY.read_text(encoding="utf-8").replace("lbp_m = 38.0", "lbp_m = -38.0"), encoding="utf-8")
    profile = tmp_path / "p.toml"
    profile.write_text("format = \"deckload-profile-1\"\n", encoding="utf-8")
    assert main(["tables", str(geo), "-o", str(profile)]) == 1
    err = capsys.readouterr().err
    assert "vessel.lbp_m = -38: must be above 0" in err
    assert profile.read_text(encoding="utf-8") == "format = \"deckload-profile-1\"\n"


def test_invalid_existing_profile_is_not_overwritten(tmp_path, capsys):
    profile = tmp_path / "p.toml"
    profile.write_text("format = = 1\n", encoding="utf-8")
    assert main(["tables", str(GEOMETRY), "-o", str(profile)]) == 1
    assert "left untouched" in capsys.readouterr().err
    assert profile.read_text(encoding="utf-8") == "format = = 1\n"


def test_number_arrays_are_folded_into_rows_without_changing_any_value():
    """Layout only: the folded TOML parses to exactly the values tomli-w wrote."""
    import tomllib

    import tomli_w

    from deckload.cli.tables import reflow_number_arrays

    doc = {
        "short": [1.0, 2.5, -3.0],
        "long": [round(0.1 * k, 4) for k in range(200)],
        "nested": {"kn_m": [[float(k + j) for j in range(19)] for k in range(4)]},
        "words": ["a", "b"] * 30,
        "mixed": [{"name": "summer", "draft_m": 2.9}],
    }
    plain = tomli_w.dumps(doc)
    folded = reflow_number_arrays(plain)
    assert tomllib.loads(folded) == doc
    assert len(folded.splitlines()) < len(plain.splitlines()) / 3  # the 60 strings stay one a line
    assert max(len(line) for line in folded.splitlines()) <= 100
    assert 'short = [1.0, 2.5, -3.0]' in folded
    # an array of strings is left as tomli-w wrote it
    assert '    "a",\n    "b",' in folded
