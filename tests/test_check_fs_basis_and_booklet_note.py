"""``check`` says how every tank's free surface was read; ``calc`` and ``report`` say, once, when the
profile has no worked booklet conditions.

The booklet-conventions audit: an FSM printed in t·m typed under ``fsi_m4`` (read as an inertia, m⁴,
and multiplied by the density) understates every moment by the factor ρ (15 % for diesel at 0.85)
and turned a condition whose criteria were not met into one that met them, with no worked
conditions typed to catch it.  ``check`` listed a ``converted:`` line for each ``fsm_tm`` column and
nothing for an ``fsi_m4`` one: the officer had nothing to hold against the page's column heading.
Only ``check`` said that no worked conditions were entered.
"""

from __future__ import annotations

from deckload.cli.check import NO_BOOKLET_NOTE as CHECK_NOTE
from deckload.cli.main import main
from deckload.io import paths
from deckload.report.audit_findings import NO_BOOKLET_CONDITIONS


def test_check_lists_every_tank_by_how_its_free_surface_was_read(capsys):
    """The Demo Trawler's pages (demo_trawler.toml, its tanks/*.csv): FWP/FWS one maximum in t·m at
    1.000, FO1P/FO1S a t·m column at 0.84, HYD none, FO2P/FO2S one maximum in t·m at 0.84, FW2 a t·m
    column at 1.000, FPT at 1.025; one line per way, tanks in profile order."""
    main(["check", "trawler"])
    out = [s.strip() for s in capsys.readouterr().out.splitlines() if s.strip().startswith("free surface read as")]
    assert out == [
        "free surface read as one maximum moment (t·m) at 1 t/m³ (max_fsm_tm): FWP, FWS",
        "free surface read as moment (t·m) per row at 0.84 t/m³ (fsm_tm): FO1P, FO1S",
        "free surface read as none given (nil at every level): HYD",
        "free surface read as one maximum moment (t·m) at 0.84 t/m³ (max_fsm_tm): FO2P, FO2S",
        "free surface read as moment (t·m) per row at 1 t/m³ (fsm_tm): FW2",
        "free surface read as moment (t·m) per row at 1.025 t/m³ (fsm_tm): FPT",
    ]


def test_a_tank_typed_with_an_inertia_column_is_named_as_such(capsys):
    """The Demo Islander's tanks all give fsi_m4 (m⁴): one line names them all, so a page headed
    "FSM (t·m)" typed there shows up against its heading."""
    main(["check", "demo"])
    raw = capsys.readouterr().out
    lines = raw.splitlines()
    at = next(i for i, x in enumerate(lines) if x.startswith("    free surface read as"))
    assert lines[at + 1].startswith("      ") and all(len(x) <= 100 for x in lines[at:at + 3])  # folded to 100 columns
    out = [s.strip() for s in raw.replace("\n      ", " ").splitlines() if s.strip().startswith("free surface read as")]
    assert len(out) == 1
    assert out[0].startswith("free surface read as inertia i (m⁴) per row × the liquid's density (fsi_m4): APT, ")
    assert ", DO1P, DO1S, " in out[0]


def test_calc_and_report_say_once_that_no_worked_conditions_were_entered(capsys, tmp_path):
    """The demo islander's profile lists none, the trawler's three: the note appears once for the
    first, never for the second, in the words check uses (one source)."""
    assert CHECK_NOTE.startswith(f"NOTE: {NO_BOOKLET_CONDITIONS}: ")
    assert main(["calc", "demo", "departure"]) == 0
    cap = capsys.readouterr()
    assert (cap.out + cap.err).count(NO_BOOKLET_CONDITIONS) == 1
    assert main(["calc", "trawler", "departure"]) == 0
    cap = capsys.readouterr()
    assert NO_BOOKLET_CONDITIONS not in cap.out + cap.err
    assert main(["calc", "demo", "departure", "--json"]) == 0
    cap = capsys.readouterr()
    assert cap.err.count(NO_BOOKLET_CONDITIONS) == 1 and NO_BOOKLET_CONDITIONS not in cap.out
    assert main(["report", "demo", "departure", "--txt", "-o", str(tmp_path / "r.txt")]) == 0
    cap = capsys.readouterr()
    assert (cap.out + cap.err).count(NO_BOOKLET_CONDITIONS) == 1
    assert main(["report", str(paths.TRAWLER_PROFILE), "departure", "--txt", "-o", str(tmp_path / "t.txt")]) == 0
    cap = capsys.readouterr()
    assert NO_BOOKLET_CONDITIONS not in cap.out + cap.err
