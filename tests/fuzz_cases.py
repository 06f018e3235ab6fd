"""Seeded fuzzing of profiles, conditions and typed amounts: the generator and the oracle.

Used by the suite's short run (``tests/test_fuzz.py``, a few thousand cases) and by the
long run by hand (``python tests/fuzz_by_hand.py``, 100,000 cases).  Each case mutates a
valid input — a vessel profile (the analytic box barge of ``tests/broken_profiles``), a
loading condition of the demo vessel, or an amount, mass or position typed on the loading
screen — and runs it the way the program does (read, then evaluate).  The outcome is one of:

* **refused** — a :class:`ProfileError` naming the problem, an :class:`EntryError` on the
  screen, or a displacement/draft outside the tables (shown, never judged);
* **accepted** — a result, which must then be finite (strict JSON) and physically possible;
* **traceback** — any other exception (the program would have crashed or shown exit 3);
* **non-finite** — a result holding inf or NaN;
* **impossible accepted** — a result for an input no vessel could have (a position far
  outside her, a negative mass), or a result no vessel could show (a draft below the keel,
  a trim of more than a quarter of her length, a displacement beyond her hull box).

The physical oracle here is written independently of :mod:`deckload.core.bounds` and is
looser than it (e.g. 1.5·LBP, not 1.2·LBP): a failure means the reader let through
something clearly impossible, not that two copies of one rule disagree.
"""

from __future__ import annotations

import json
import random
import re
import traceback
from collections import Counter
from dataclasses import dataclass, field
from pathlib import Path

from deckload.core import model as m
from deckload.core.audit import audit, has_errors
from deckload.core.stability import evaluate
from deckload.core.tables import OutOfRangeError
from deckload.io.paths import DEMO_CONDITIONS
from deckload.io.profiles import ProfileError, parse_condition, parse_profile
from deckload.ui import entry
from demo_vessels import demo_vessel

HERE = Path(__file__).parent
BARGE_TEXT = (HERE / "broken_profiles" / "box_barge.toml").read_text(encoding="utf-8")
CURVES_TEXT = """
[limit_curve]
displacement_t = [410.0, 820.0, 1230.0]
max_kg_m = [4.5, 3.6, 2.7]

[downflooding]
displacement_t = [410.0, 1230.0]
angle_deg = [45.0, 35.0]
"""
"""Appended to the barge in a profile case half the time, so that the audit of a limiting curve
against the KN tables and the θf read from a curve meet mutated numbers too (invented values)."""
SHORT_TABLES = (("capacity_m3 = 50.0\n", "capacity_m3 = 49.0\ntable_top_pct = 98\n"),
                ("sounding_m = [0.0, 0.5, 1.0]", "sounding_m = [0.0, 0.5, 0.98]"),
                ("volume_m3 = [0.0, 25.0, 50.0]", "volume_m3 = [0.0, 25.0, 49.0]"),
                ("vcg_m = [0.0, 0.25, 0.5]", "vcg_m = [0.0, 0.25, 0.49]"))
"""The barge's tank tables printed only to 98 % of the tank (``table_top_pct``), a quarter of the
profile cases: the capacity read as the whole tank and fills up to the table's top meet mutated
numbers too."""
NEW_KEYS = (('longitudinal_datum = "AP"\n', 'longitudinal_datum = "AP"\nlength_ll_m = 41.0\n'),
            ('max_load_t_m2 = 5.0\n', 'max_load_t_m2 = 5.0\nx_m = [10.0, 30.0]\ny_m = [-5.0, 5.0]\n'),
            ('max_kg_m = [4.5, 3.6, 2.7]\n', 'max_kg_m = [4.5, 3.6, 2.7]\ntrim_range_m = [-0.5, 1.0]\n'
                                             'trim_positive = "head"\n'))
"""Keys of the Load Line length, a deck area's ends and edges and a limiting curve's trims typed
+ by the head, each in a quarter of the profile cases, so that their readers meet mutated numbers."""
CONDITION_TEXTS = [p.read_text(encoding="utf-8") for p in DEMO_CONDITIONS.values()]

_NUM = re.compile(r'(?<![\w."\-])-?\d+(?:\.\d+)?(?:[eE][+-]?\d+)?(?![\w"])')
_STR = re.compile(r'"[^"\n]*"')

HOSTILE = [
    "1e308", "-1e308", "1e6", "-1e6", "0", "0.0", "-0.0", "-1", "1e-320", "1e3", "1e30",
    "1" + "0" * 29, "1" + "0" * 400, "1" + "0" * 5000, "nan", "inf", "-inf",
    "100.00000001", "100.000000001", "99.99999999", "1e-9", "0x7fffffffffffffff",
]


@dataclass
class Tally:
    cases: int = 0
    accepted: int = 0
    refused: int = 0
    tracebacks: int = 0
    nonfinite: int = 0
    impossible_accepted: int = 0
    by_kind: Counter = field(default_factory=Counter)
    examples: list = field(default_factory=list)

    def fail(self, what: str, case: str, detail: str) -> None:
        setattr(self, what, getattr(self, what) + 1)
        if len(self.examples) < 20:
            self.examples.append((what, case[-300:], detail[-2000:]))

    def merge(self, other: "Tally") -> None:
        for k in ("cases", "accepted", "refused", "tracebacks", "nonfinite", "impossible_accepted"):
            setattr(self, k, getattr(self, k) + getattr(other, k))
        self.by_kind.update(other.by_kind)
        self.examples += other.examples[: max(0, 20 - len(self.examples))]

    @property
    def failures(self) -> int:
        return self.tracebacks + self.nonfinite + self.impossible_accepted

    def summary(self) -> str:
        return (f"{self.cases} cases ({dict(self.by_kind)}): {self.accepted} accepted, {self.refused} refused; "
                f"{self.tracebacks} tracebacks, {self.nonfinite} non-finite, "
                f"{self.impossible_accepted} impossible accepted")


# --------------------------------------------------------------------------- mutations


def _scaled(tok: str, rng: random.Random) -> str:
    try:
        x = float(tok)
    except ValueError:
        return "1e308"
    return repr(rng.choice([x * 10 ** rng.randint(1, 12), -x, x + rng.uniform(-5, 5), x * 1.0000001,
                            x * rng.uniform(0.5, 2.0), -abs(x) - 1.0]))


def mutate(text: str, rng: random.Random) -> str:
    """``text`` with one to three hostile changes."""
    for _ in range(rng.choice((1, 1, 1, 2, 3))):
        op = rng.random()
        lines = text.splitlines(keepends=True)
        if op < 0.55:
            nums = list(_NUM.finditer(text))
            if nums:
                mm = rng.choice(nums)
                new = rng.choice(HOSTILE) if rng.random() < 0.5 else _scaled(mm.group(0), rng)
                text = text[: mm.start()] + new + text[mm.end():]
        elif op < 0.62 and lines:
            text = "".join(lines[: rng.randrange(len(lines) + 1)])
        elif op < 0.69 and lines:
            del lines[rng.randrange(len(lines))]
            text = "".join(lines)
        elif op < 0.75 and lines:
            i = rng.randrange(len(lines))
            lines.insert(i, lines[i])
            text = "".join(lines)
        elif op < 0.80:
            d = rng.choice((5, 200, 999, 3000))
            text += f"\nnest = {'[' * d}1{']' * d}\n"
        elif op < 0.87:
            strs = list(_STR.finditer(text))
            if strs:
                s = rng.choice(strs)
                bad = rng.choice(["\\u001b[2J", "\\u0007", "\\r", "\\u202e", "\\u009b", "x" * 5000])
                text = text[: s.start() + 1] + bad + text[s.start() + 1:]
        elif op < 0.93 and text:
            i = rng.randrange(len(text))
            text = text[:i] + rng.choice(["\x00", "]", "[", "=", "\"", "\n", "#", "[[deck_item]]\n", "é"]) + text[i:]
        else:
            extra = rng.choice([
                '\n[[deck_item]]\nname = "far"\nmass_t = {m}\nlcg_m = {x}\nvcg_m = {z}\n',
                '\n[[constant]]\nname = "c"\nmass_t = {m}\nlcg_m = {x}\nvcg_m = {z}\ntcg_m = {y}\n',
            ])
            text += extra.format(m=rng.choice(["10.0", "300.0", "1e6", "-5.0"]),
                                 x=rng.choice(["1e6", "45.0", "-7.0", "20.0", "1e308"]),
                                 z=rng.choice(["5.0", "-1.0", "40.0", "1e9"]),
                                 y=rng.choice(["0.0", "4.9", "-6.0", "1e5"]))
    return text


# --------------------------------------------------------------------------- the oracle


def impossible_input(v: m.Vessel, c: m.Condition) -> str | None:
    """An input no vessel could have (independent of deckload.core.bounds, and looser)."""
    p = v.particulars
    for group, items in (("deck item", c.deck_items), ("constant", c.constants)):
        for it in items:
            if not (-0.5 * p.lbp_m <= it.lcg_m <= 1.5 * p.lbp_m):
                return f"{group} {it.name!r} at x = {it.lcg_m} m, LBP {p.lbp_m} m"
            if abs(it.tcg_m) > p.breadth_m or not (0.0 <= it.vcg_m <= p.depth_m + 60):
                return f"{group} {it.name!r} at y = {it.tcg_m}, z = {it.vcg_m} m"
            if not (0.0 <= it.mass_t <= 10 * float(v.hydrostatics.displacement_t[-1])):
                return f"{group} {it.name!r} of {it.mass_t} t"
    for h in c.holds:
        for x in (h.lcg_m, h.vcg_m, h.tcg_m):
            if x is not None and abs(x) > 2 * p.lbp_m:
                return f"hold {h.hold_id} position {x}"
    return None


def impossible_result(v: m.Vessel, r) -> str | None:
    """A result no floating vessel could show."""
    p = v.particulars
    for name in ("draft_aft_m", "draft_fwd_m", "draft_mean_m"):
        d = getattr(r, name)
        if not (0.0 <= d <= 1.5 * p.depth_m + 1.0):
            return f"{name} {d}"
    if abs(r.trim_m) > p.lbp_m / 4:
        return f"trim {r.trim_m} m"
    if not (0 < r.displacement_t <= 1.2 * p.lbp_m * p.breadth_m * 1.5 * p.depth_m * 1.04):
        return f"displacement {r.displacement_t} t"
    if r.list_deg is None and not any(w.code == "no-equilibrium" and w.severity == "danger" for w in r.warnings):
        return "no list (no position of equilibrium) without its danger warning"
    if r.list_deg is not None and abs(r.list_deg) > r.gz_end_deg:
        return f"list {r.list_deg}° beyond the curve's end {r.gz_end_deg}°"
    if not (0.0 <= r.kg_m <= p.depth_m + 60) or abs(r.gm_fluid_m) > 100:
        return f"KG {r.kg_m}, GM {r.gm_fluid_m}, list {r.list_deg}"
    return None


def _judge(tally: Tally, v: m.Vessel, c: m.Condition, case: str) -> None:
    """Evaluate ``c`` on ``v`` and file the outcome."""
    try:
        r = evaluate(v, c)
    except OutOfRangeError:
        tally.refused += 1  # outside the tables: shown with the reason, never judged
        return
    except ValueError as exc:
        if type(exc).__name__ == "NonFiniteResultError":
            tally.refused += 1  # caught and refused with the quantity named: nothing non-finite shown
            return
        tally.fail("tracebacks", case, traceback.format_exc())
        return
    except Exception:
        tally.fail("tracebacks", case, traceback.format_exc())
        return
    try:
        json.dumps(r.to_json_dict(), allow_nan=False)
    except ValueError as exc:
        tally.fail("nonfinite", case, str(exc))
        return
    why = impossible_input(v, c) or impossible_result(v, r)
    if why:
        tally.fail("impossible_accepted", case, f"{why}; verdict met={r.all_criteria_pass}")
        return
    tally.accepted += 1


# --------------------------------------------------------------------------- the three kinds of case


def condition_case(tally: Tally, vessel: m.Vessel, rng: random.Random) -> None:
    text = mutate(rng.choice(CONDITION_TEXTS), rng)
    tally.cases += 1
    tally.by_kind["condition"] += 1
    try:
        c = parse_condition(text, "fuzz.condition.toml", vessel)
    except ProfileError:
        tally.refused += 1
        return
    except Exception:
        tally.fail("tracebacks", text, traceback.format_exc())
        return
    _judge(tally, vessel, c, text)


def profile_case(tally: Tally, rng: random.Random) -> None:
    text = BARGE_TEXT + (CURVES_TEXT if rng.random() < 0.5 else "")
    if rng.random() < 0.25:
        for old, new in SHORT_TABLES:
            text = text.replace(old, new)
    for old, new in NEW_KEYS:
        if rng.random() < 0.25:
            text = text.replace(old, new)
    text = mutate(text, rng)
    tally.cases += 1
    tally.by_kind["profile"] += 1
    try:
        v = parse_profile(text, "fuzz.toml")
        if has_errors(audit(v)):  # as every command does before it uses a profile
            tally.refused += 1
            return
    except ProfileError:
        tally.refused += 1
        return
    except Exception:
        tally.fail("tracebacks", text, traceback.format_exc())
        return
    fills = tuple(m.TankFill(t.id, "percent", min(t.table_top_pct, rng.choice((0.0, 50.0, 97.0, 98.0, 100.0))))
                  for t in v.tanks)
    _judge(tally, v, m.Condition(name="fuzz", tanks=fills), text)


_UNITS = ["%", "m3", "m³", "t", "m", "", "T", "M3", "kg", "%%", " %"]


def typed_text(rng: random.Random) -> str:
    r = rng.random()
    if r < 0.6:
        num = rng.choice([
            f"{rng.uniform(0, 120):.{rng.randint(0, 12)}f}", str(rng.randint(0, 10 ** rng.randint(1, 40))),
            "100.000000001", "100.0000001", "1e308", "nan", "inf", "-5", ".5", "5.", "1,5", "0", "00000000",
            "9" * rng.randint(1, 400),
        ])
        return num + rng.choice(_UNITS)
    if r < 0.8:
        return "1" * rng.randint(1, 3000) + rng.choice(["!", "%", "x", ""])
    alphabet = "0123456789.%mt3³ -+e,!\x1b\t[]" + "é\u202e"
    return "".join(rng.choice(alphabet) for _ in range(rng.randint(0, 80)))


def amount_case(tally: Tally, vessel: m.Vessel, base: m.Condition, rng: random.Random) -> None:
    """One thing typed on the loading screen: a tank amount, a hold mass, or an item's form."""
    tally.cases += 1
    tally.by_kind["typed"] += 1
    kind = rng.random()
    case = ""
    try:
        if kind < 0.6:
            tank = rng.choice(vessel.tanks)
            text = typed_text(rng)
            case = f"tank {tank.id}: {text!r}"
            c = entry.tank_from_text(base, tank, text)
        elif kind < 0.75 and vessel.holds:
            hold = rng.choice(vessel.holds)
            text = typed_text(rng).rstrip("%m3³")
            case = f"hold {hold.id}: {text!r}"
            c = entry.hold_from_text(base, hold, text, vessel)
        else:
            fields = [typed_text(rng).rstrip("%m3³t") for _ in range(4)]
            name = rng.choice(["box", "x\x1b[2J", "", "y" * 300, "crate"])
            case = f"item {name!r} {fields!r}"
            item = entry.item_from_form(vessel, entry.ItemForm(name, *fields), deck=False)
            c = base.with_constants(base.constants + (item,))
    except entry.EntryError:
        tally.refused += 1
        return
    except Exception:
        tally.fail("tracebacks", case, traceback.format_exc())
        return
    _judge(tally, vessel, c, case)


def run(n: int, seed: int, *, progress=None) -> Tally:
    """``n`` cases from ``seed``: 35 % conditions, 15 % profiles, 50 % typed entries."""
    from deckload.io.profiles import load_condition

    rng = random.Random(seed)
    vessel = demo_vessel()
    bases = [load_condition(p, vessel) for p in DEMO_CONDITIONS.values()] + [m.Condition()]
    tally = Tally()
    for i in range(n):
        r = rng.random()
        if r < 0.35:
            condition_case(tally, vessel, rng)
        elif r < 0.50:
            profile_case(tally, rng)
        else:
            amount_case(tally, vessel, rng.choice(bases), rng)
        if progress is not None and (i + 1) % 1000 == 0:
            progress(i + 1, tally)
    return tally
