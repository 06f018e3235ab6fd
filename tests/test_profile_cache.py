"""The cache of validated profiles (deckload.io.profile_cache; issue 13, start-up).

A hit must give the very model a fresh read gives, and the same printed output; any change to
any file the profile was built from must miss; a damaged, foreign or planted entry is ignored
and replaced; a data folder that cannot be written only means no cache.
"""

from __future__ import annotations

import dataclasses
import json
import os
import pickle
import shutil
from pathlib import Path

import numpy as np
import pytest

import deckload
from box_profile_text import fv22_text
from deckload.cli.main import main
from deckload.io import paths, profile_cache
from deckload.report import audit_findings
from deckload.report.audit_findings import AuditedProfile, load_audited, read_audited

DATA = paths.PACKAGE_DATA


@pytest.fixture(autouse=True)
def _cache_in_the_data_folder(monkeypatch):
    """These tests find the cache where the program keeps it by default, in the data folder; not
    in the folder tests/conftest.py gives the rest of the suite (DECKLOAD_CACHE_DIR)."""
    monkeypatch.delenv("DECKLOAD_CACHE_DIR", raising=False)


@pytest.fixture
def home(tmp_path, monkeypatch):
    """A data folder of the test's own, with the cache on."""
    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path / "home"))
    monkeypatch.delenv("DECKLOAD_NO_CACHE", raising=False)
    return tmp_path / "home"


@pytest.fixture
def builds(monkeypatch):
    """Counts reads from the files (cache misses)."""
    count = []

    def counting(path):
        count.append(path)
        return read_audited(path)

    monkeypatch.setattr(audit_findings, "read_audited", counting)
    return count


def entries(home: Path) -> list[Path]:
    folder = home / "cache" / "profiles"
    return sorted(folder.glob("*.cache")) if folder.is_dir() else []


def same(a, b, where="") -> None:
    """Deep equality of two models: dataclasses field by field, arrays value for value with the
    same dtype and shape (the model's array fields compare by identity, eq=False)."""
    assert type(a) is type(b), where
    if dataclasses.is_dataclass(a):
        for f in dataclasses.fields(a):
            same(getattr(a, f.name), getattr(b, f.name), f"{where}.{f.name}")
    elif isinstance(a, np.ndarray):
        assert a.dtype == b.dtype and a.shape == b.shape and np.array_equal(a, b, equal_nan=True), where
        assert a.flags.writeable == b.flags.writeable, where  # frozen arrays stay frozen
    elif isinstance(a, (tuple, list)):
        assert len(a) == len(b), where
        for i, (x, y) in enumerate(zip(a, b)):
            same(x, y, f"{where}[{i}]")
    elif isinstance(a, dict):
        assert a.keys() == b.keys(), where
        for k in a:
            same(a[k], b[k], f"{where}[{k!r}]")
    else:
        assert a == b, where


def copy_demo(tmp_path: Path, name: str) -> Path:
    """A demo profile and every file it reads, copied to a folder of the test's own."""
    folder = tmp_path / "vessel"
    folder.mkdir(exist_ok=True)
    for f in DATA.iterdir():
        if f.name.startswith(name):
            (shutil.copytree if f.is_dir() else shutil.copy)(f, folder / f.name)
    return folder / f"{name}.toml"


def edit_byte(path: Path, old: bytes, new: bytes) -> None:
    """Replace the first ``old`` by ``new`` (same length: a one-byte change of the file)."""
    data = path.read_bytes()
    assert len(old) == len(new) and old in data
    i = data.index(old)
    path.write_bytes(data[:i] + new + data[i + len(old):])


# --------------------------------------------------------------------------- hits


@pytest.mark.parametrize("profile", [DATA / "demo_islander.toml", DATA / "demo_trawler.toml"],
                         ids=["islander-hull-geometry", "trawler-csv-tables"])
def test_a_hit_gives_the_model_a_fresh_read_gives(home, builds, profile):
    fresh = read_audited(profile)
    cold = load_audited(profile)
    assert len(builds) == 1 and len(entries(home)) == 1
    warm = load_audited(profile)
    assert len(builds) == 1, "the second load must come from the cache"
    assert warm is not cold
    same(warm, fresh)
    same(cold, fresh)


def test_calc_json_is_identical_from_the_cache(home, builds, capsys):
    def calc(*extra):
        assert main([*extra, "calc", "demo", "departure", "--json"]) == 0
        return capsys.readouterr().out

    uncached = calc("--no-cache")
    os.environ.pop("DECKLOAD_NO_CACHE")  # --no-cache set it for the process; monkeypatch restores
    assert builds and not entries(home)
    cold = calc()
    assert len(builds) == 2 and len(entries(home)) == 1
    warm = calc()
    assert len(builds) == 2
    assert warm == cold == uncached
    assert json.loads(warm)["displacement_t"] > 0


@pytest.mark.parametrize("text_edit, expect", [
    (None, "plausibility audit: nothing suspicious found"),
    (("vcg_m = 2.4", "vcg_m = 5.0"), "WARNING lightship.vcg_m = 5 m above keel"),  # test_audit: a doubt
])
def test_check_prints_the_same_audit_from_the_cache(home, builds, tmp_path, capsys, text_edit, expect):
    """The audit's lines come out of the cache as the audit made them (file and line included)."""
    text = fv22_text()
    if text_edit:
        text = text.replace(*text_edit)
    f = tmp_path / "fv22.toml"
    f.write_text(text, encoding="utf-8")
    assert main(["check", str(f)]) == 0
    cold = capsys.readouterr().out
    assert main(["check", str(f)]) == 0
    warm = capsys.readouterr().out
    assert len(builds) == 1 and warm == cold and expect in warm


def test_check_prints_the_same_conversions_from_the_cache(home, builds, capsys):
    """The trawler is typed in her booklet's conventions: 'converted:' lines and CSV sources."""
    assert main(["check", "trawler"]) == 0
    cold = capsys.readouterr().out
    assert main(["check", "trawler"]) == 0
    warm = capsys.readouterr().out
    assert len(builds) == 1 and warm == cold
    assert "converted:" in warm and "from CSV:" in warm


def test_a_profile_failing_its_audit_is_refused_from_the_cache_too(home, builds, tmp_path, capsys):
    """KN 19.07 typed for 1.901 (test_audit.py): an audit error refuses the profile, cached or not."""
    f = tmp_path / "fv22.toml"
    f.write_text(fv22_text().replace("1.901373720451374", "19.07"), encoding="utf-8")
    cond = tmp_path / "empty.condition.toml"
    cond.write_text('format = "deckload-condition-1"\nname = "empty"\n', encoding="utf-8")
    assert main(["calc", str(f), str(cond)]) == 1
    cold = capsys.readouterr().err
    assert main(["calc", str(f), str(cond)]) == 1
    warm = capsys.readouterr().err
    assert len(builds) == 1 and warm == cold and "fails its plausibility audit" in warm


# --------------------------------------------------------------------------- misses


def test_a_one_byte_edit_of_the_profile_misses(home, builds, tmp_path):
    f = copy_demo(tmp_path, "demo_islander")
    before = load_audited(f)
    edit_byte(f, b'name = "Demo Islander"', b'name = "Demo Islandex"')
    after = load_audited(f)
    assert len(builds) == 2 and after.vessel.particulars.name == "Demo Islandex"
    assert before.vessel.particulars.name == "Demo Islander"
    load_audited(f)
    assert len(builds) == 2


def test_a_one_byte_edit_of_a_csv_table_misses(home, builds, tmp_path):
    f = copy_demo(tmp_path, "demo_trawler")
    before = load_audited(f).vessel
    edit_byte(tmp_path / "vessel" / "demo_trawler" / "tanks" / "FWP.csv", b"0.10,0.001,", b"0.10,0.002,")
    after = load_audited(f).vessel
    assert len(builds) == 2
    (a,) = [t for t in before.tanks if t.id == "FWP"]
    (b,) = [t for t in after.tanks if t.id == "FWP"]
    assert a.calibration.volume_m3[1] == pytest.approx(0.001) and b.calibration.volume_m3[1] == pytest.approx(0.002)


def test_a_one_byte_edit_of_the_geometry_file_misses(home, builds, tmp_path):
    f = copy_demo(tmp_path, "demo_islander")
    load_audited(f)
    geometry = tmp_path / "vessel" / "demo_islander.geometry.toml"
    geometry.write_bytes(geometry.read_bytes() + b"\n")
    load_audited(f)
    assert len(builds) == 2


def test_a_geometry_file_that_appears_or_goes_misses(home, builds, tmp_path):
    f = copy_demo(tmp_path, "demo_islander")
    geometry = tmp_path / "vessel" / "demo_islander.geometry.toml"
    aside = geometry.rename(tmp_path / "aside.toml")
    without = load_audited(f).vessel
    assert without.hull is None and any("not found" in a for a in without.assumptions)
    aside.rename(geometry)
    with_hull = load_audited(f).vessel
    assert with_hull.hull is not None and len(builds) == 2
    geometry.unlink()
    assert load_audited(f).vessel.hull is None and len(builds) == 3


def test_the_same_bytes_elsewhere_are_another_entry(home, builds, tmp_path):
    """Paths in messages and relative table files depend on where the profile is: the path is in the key."""
    f = copy_demo(tmp_path, "demo_trawler")
    load_audited(f)
    other = tmp_path / "other"
    shutil.copytree(f.parent, other)
    load_audited(other / f.name)
    assert len(builds) == 2 and len(entries(home)) == 2


def test_another_versions_entry_is_ignored(home, builds, monkeypatch):
    profile = DATA / "demo_trawler.toml"
    with monkeypatch.context() as mp:
        mp.setattr(deckload, "__version__", "0.0.1")
        load_audited(profile)
    assert deckload.__version__ != "0.0.1"
    load_audited(profile)
    assert len(builds) == 2 and len(entries(home)) == 2


def test_an_entry_whose_header_names_another_version_is_ignored(home, builds):
    profile = DATA / "demo_trawler.toml"
    load_audited(profile)
    (entry,) = entries(home)
    head, _, payload = entry.read_bytes().partition(b"\n")
    doc = json.loads(head)
    doc["version"] = "9.9.9"
    entry.write_bytes(json.dumps(doc).encode() + b"\n" + payload)
    load_audited(profile)
    assert len(builds) == 2
    assert json.loads(entry.read_bytes().partition(b"\n")[0])["version"] == deckload.__version__  # replaced


# --------------------------------------------------------------------------- damaged or planted entries


@pytest.mark.parametrize("damage", ["truncated", "flipped-byte", "garbage", "empty", "header-only"])
def test_a_damaged_entry_is_ignored_and_replaced(home, builds, damage):
    profile = DATA / "demo_trawler.toml"
    good = load_audited(profile)
    (entry,) = entries(home)
    data = entry.read_bytes()
    entry.write_bytes({
        "truncated": data[: len(data) - 100],
        "flipped-byte": data[:-50] + bytes([data[-50] ^ 0x01]) + data[-49:],
        "garbage": b"\x80\x04not a cache at all" * 50,
        "empty": b"",
        "header-only": data.partition(b"\n")[0],
    }[damage])
    again = load_audited(profile)
    assert len(builds) == 2
    same(again, good)
    assert entry.read_bytes() == data  # rewritten whole
    load_audited(profile)
    assert len(builds) == 2


def _plant(entry: Path, payload: bytes) -> None:
    """Put ``payload`` in the entry under a header that is right in every other way."""
    import hashlib

    head = json.loads(entry.read_bytes().partition(b"\n")[0])
    head["payload_bytes"] = len(payload)
    head["payload_sha256"] = hashlib.sha256(payload).hexdigest()
    entry.write_bytes(json.dumps(head).encode() + b"\n" + payload)


class _Planted:
    def __reduce__(self):
        return (os.system, (f"touch {self.target}",))


def test_a_planted_entry_naming_a_function_is_never_run(home, builds, tmp_path):
    profile = DATA / "demo_trawler.toml"
    load_audited(profile)
    (entry,) = entries(home)
    planted = _Planted()
    planted.target = tmp_path / "ran"
    _plant(entry, pickle.dumps(planted))
    assert isinstance(load_audited(profile), AuditedProfile)
    assert not (tmp_path / "ran").exists() and len(builds) == 2


@pytest.mark.parametrize("obj", [{"vessel": None}, (1, 2, 3)], ids=["dict", "tuple"])
def test_an_entry_of_another_type_is_ignored(home, builds, obj):
    profile = DATA / "demo_trawler.toml"
    load_audited(profile)
    (entry,) = entries(home)
    _plant(entry, pickle.dumps(obj))
    assert isinstance(load_audited(profile), AuditedProfile) and len(builds) == 2


def test_an_entry_with_the_wrong_types_inside_is_ignored(home, builds):
    profile = DATA / "demo_trawler.toml"
    good = load_audited(profile)
    (entry,) = entries(home)
    _plant(entry, pickle.dumps(AuditedProfile(good.vessel, good.reading, ("not a finding",))))
    assert load_audited(profile).found == () and len(builds) == 2


@pytest.mark.parametrize("case", ["missing", "folder", "too-large", "not-toml", "audit-error"])
def test_a_profile_that_cannot_be_used_gives_the_same_message_with_the_cache(home, tmp_path, capsys, monkeypatch, case):
    """Nothing is cached for a file that cannot be read or validated, and the message and exit
    status are those of a read without the cache."""
    f = tmp_path / "p.toml"
    if case == "folder":
        f.mkdir()
    elif case == "too-large":
        from deckload.io import limits

        monkeypatch.setattr(limits, "MAX_TOML_BYTES", 100)
        f.write_text(fv22_text(), encoding="utf-8")
    elif case == "not-toml":
        f.write_text("format = \n", encoding="utf-8")
    elif case == "audit-error":
        f.write_text(fv22_text().replace("1.901373720451374", "19.07"), encoding="utf-8")
    cond = DATA / "demo_trawler.departure.condition.toml"
    results = []
    for argv in (["--no-cache", "calc", str(f), str(cond)], ["calc", str(f), str(cond)], ["calc", str(f), str(cond)]):
        results.append((main(argv), capsys.readouterr()))
        monkeypatch.setenv("DECKLOAD_NO_CACHE", "")
    assert results[0] == results[1] == results[2]
    assert results[0][0] in (1, 2) and results[0][1].err
    assert len(entries(home)) == (1 if case == "audit-error" else 0)


# --------------------------------------------------------------------------- no cache


def test_a_data_folder_that_cannot_be_written_still_works(tmp_path, monkeypatch, builds, capsys):
    """The data folder's parent is a file: nothing can be created there (as a read-only folder,
    but also when the tests run as root, whom permissions do not stop)."""
    blocker = tmp_path / "a-file"
    blocker.write_text("x")
    monkeypatch.setenv("DECKLOAD_HOME", str(blocker / "home"))
    monkeypatch.delenv("DECKLOAD_NO_CACHE", raising=False)
    assert main(["calc", "trawler", "departure"]) == 0
    assert main(["calc", "trawler", "departure"]) == 0
    out, err = capsys.readouterr()
    assert err == "" and "Demo Trawler" in out and len(builds) == 2


def test_a_read_only_data_folder_still_works(home, builds, capsys):
    folder = home / "cache" / "profiles"
    folder.mkdir(parents=True)
    folder.chmod(0o500)
    try:
        assert main(["calc", "trawler", "departure"]) == 0
        assert capsys.readouterr().err == ""
        if getattr(os, "geteuid", lambda: 0)() != 0:  # root writes regardless of permissions
            assert not entries(home)
    finally:
        folder.chmod(0o700)


@pytest.mark.parametrize("how", ["env", "option"])
def test_the_cache_can_be_turned_off(home, builds, monkeypatch, capsys, how):
    if how == "env":
        monkeypatch.setenv("DECKLOAD_NO_CACHE", "1")
        argv = ["calc", "trawler", "departure"]
    else:
        argv = ["--no-cache", "calc", "trawler", "departure"]
        monkeypatch.setenv("DECKLOAD_NO_CACHE", "")  # restored after the test; --no-cache sets it
    assert main(argv) == 0 and main(argv) == 0
    assert len(builds) == 2 and not entries(home)


def test_a_cache_folder_of_its_own_is_used_and_the_data_folder_left_alone(home, builds, tmp_path, monkeypatch):
    monkeypatch.setenv("DECKLOAD_CACHE_DIR", str(tmp_path / "elsewhere"))
    argv = ["calc", "trawler", "departure"]
    assert main(argv) == 0 and main(argv) == 0
    assert len(builds) == 1, "the second calc must come from the cache"
    assert len(list((tmp_path / "elsewhere").glob("*.cache"))) == 1 and not entries(home)


def test_old_entries_and_stale_temporary_files_are_pruned(home, builds, tmp_path, monkeypatch):
    monkeypatch.setattr(profile_cache, "MAX_ENTRIES", 2)
    folder = home / "cache" / "profiles"
    folder.mkdir(parents=True)
    stale, fresh = folder / ".x.cache.abcd.tmp", folder / ".y.cache.efgh.tmp"
    stale.write_bytes(b"left by a killed write")
    fresh.write_bytes(b"another deckload writing now")
    os.utime(stale, (1, 1))
    f = copy_demo(tmp_path, "demo_trawler")
    for i in range(4):
        f.write_bytes(f.read_bytes() + b"\n")
        load_audited(f)
    assert len(entries(home)) == 2
    assert not stale.exists() and fresh.exists()


# --------------------------------------------------------------------------- what a start loads


def _child(code: str, home: Path, **env) -> str:
    import subprocess
    import sys

    root = Path(deckload.__file__).resolve().parent.parent
    e = {k: v for k, v in os.environ.items() if k not in ("DECKLOAD_NO_CACHE", "OPENBLAS_NUM_THREADS",
                                                         "OMP_NUM_THREADS", "MKL_NUM_THREADS")}
    e.update(PYTHONPATH=str(root), DECKLOAD_HOME=str(home), **env)
    return subprocess.run([sys.executable, "-c", code], env=e, cwd=root, capture_output=True, text=True,
                          check=True).stdout


def test_calc_from_the_cache_loads_neither_the_screen_nor_the_audit_nor_the_reader_of_geometry(home):
    """Issue 13: textual and rich never load for calc; with the profile cached, neither do the audit,
    the TOML writer, the geometry reader nor the direct calculation."""
    code = ("import contextlib, io, sys\n"
            "from deckload.cli.main import main\n"
            "with contextlib.redirect_stdout(io.StringIO()):\n"
            "    assert main(['calc', 'demo', 'departure']) == 0\n"
            "print(' '.join(sorted(m for m in sys.modules if m.split('.')[0] in "
            "('textual', 'rich', 'tomli_w', 'deckload'))))\n")
    cold = _child(code, home).split()
    warm = _child(code, home).split()
    for loaded in (cold, warm):
        assert not [m for m in loaded if m.split(".")[0] in ("textual", "rich", "tomli_w")]
        assert not [m for m in loaded if m.startswith(("deckload.ui", "deckload.core.equilibrium",
                                                         "deckload.report.condition_report"))]
    assert "deckload.core.audit" in cold and "deckload.io.geometry_files" in cold  # read from the files
    assert "deckload.core.audit" not in warm and "deckload.io.geometry_files" not in warm
    assert "deckload.core.geometry.builder" not in warm


def test_one_blas_thread_unless_the_user_says_otherwise(home):
    """Set before numpy loads (deckload/__init__.py); a user's own setting wins."""
    code = "import deckload, os, sys; print('numpy' in sys.modules, os.environ['OPENBLAS_NUM_THREADS'], " \
           "os.environ['OMP_NUM_THREADS'], os.environ['MKL_NUM_THREADS'])"
    assert _child(code, home).split() == ["False", "1", "1", "1"]
    assert _child(code, home, OPENBLAS_NUM_THREADS="4").split() == ["False", "4", "1", "1"]


@pytest.mark.skipif(not Path("/proc/self/task").is_dir(), reason="counts threads in /proc (Linux)")
def test_numpy_loaded_after_deckload_starts_no_blas_threads(home):
    """With one thread OpenBLAS starts no pool: the process has its main thread only."""
    code = "import deckload, numpy, os; print(len(os.listdir('/proc/self/task')))"
    assert _child(code, home) == "1\n"
