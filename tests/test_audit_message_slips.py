"""Messages after a booklet-conventions slip name the slip, not its echoes (booklet-conventions audit).

A TPC typed per metre (×100) was named by the displacement-step check, then blamed on KMt
("below … (6.82367e+06 m)") and MCTC ("bounds 8.4e+03–4.45", an inverted range) at its first row;
an ullage column typed as ``sounding_m`` read only "volume_m3 … not strictly increasing".
"""

from __future__ import annotations

import dataclasses
import re
import shutil

from deckload.core.audit import audit
from deckload.core.model import frozen_array
from deckload.io import paths
from deckload.io.profiles import ProfileError, parse_profile
from demo_vessels import demo_vessel


def test_tpc_per_metre_is_named_once_and_kmt_mctc_are_not_blamed():
    """The demo islander's TPC ×100: the waterplane 100·TPC/ρ then exceeds her plan 1.2·LBP × B
    (derived: every waterplane lies within it)."""
    v = demo_vessel()
    h = dataclasses.replace(v.hydrostatics, tpc_t_cm=frozen_array(v.hydrostatics.tpc_t_cm * 100.0))
    found = audit(dataclasses.replace(v, hydrostatics=h))
    keys = [f.key for f in found if f.severity == "error"]
    assert "hydrostatics.tpc_t_cm" in keys
    assert "hydrostatics.kmt_m" not in keys and "hydrostatics.mctc_tm_cm" not in keys
    tpc = next(f for f in found if f.key == "hydrostatics.tpc_t_cm")
    assert "TPC typed in t per metre, not t per cm?" in tpc.why
    step = next(f for f in found if f.check == "hydro-tpc")
    assert "about 100 times the step" in step.why
    for f in found:
        assert not re.search(r"\d\.?\d*e[+-]\d", f.why), f.why  # no e-notation for ordinary magnitudes


def test_an_ullage_column_typed_as_sounding_names_the_ullage_key(tmp_path):
    """The trawler's FO1P page is an ullage table (ullage_m falling as the volume rises)."""
    folder = paths.TRAWLER_PROFILE.parent
    text = paths.TRAWLER_PROFILE.read_text(encoding="utf-8")
    csv = (folder / "demo_trawler" / "tanks" / "FO1P.csv").read_text(encoding="utf-8")
    assert csv.startswith("ullage_m,")
    tmp = tmp_path
    shutil.copytree(folder / "demo_trawler", tmp / "demo_trawler")
    (tmp / "demo_trawler" / "tanks" / "FO1P.csv").write_text(csv.replace("ullage_m,", "sounding_m,", 1), encoding="utf-8")
    try:
        parse_profile(text, str(tmp / "demo_trawler.toml"))
    except ProfileError as e:
        said = [str(p) for p in e.problems if "FO1P" in str(p)]
    else:
        said = []
    assert said and "an ullage table typed as sounding_m? Name the column ullage_m" in said[0]
