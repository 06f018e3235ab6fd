"""``[[booklet_condition]]`` entries of a profile: the booklet's worked conditions and results.

Read after the vessel (a loading is validated against it), by ``deckload check``.  Each
entry names its loading — a condition file beside the profile (``condition_file``) or the
keys of a condition file inline — and the booklet's results (``[booklet_condition.expected]``).
The schema is vessel_profiles/README.md, "Booklet conditions"; problems are reported
like every other file problem (file, line, dotted key, value, rule), all at once.
"""

from __future__ import annotations

import os
from dataclasses import field
from pathlib import Path

import tomli_w

from deckload.core import model as m
from deckload.core.frozen import frozen
from deckload.io.conventions import Frame, read_frame, tcg_num
from deckload.core.booklet import QUANTITIES
from deckload.io.profiles import CONDITION_FORMAT, _read_text, load_condition, parse_condition
from deckload.io.tomlcheck import MISSING, FileCheck, Problem, ProfileError, Table, between, non_negative

INLINE_KEYS = ("condition", "tanks", "holds", "deck_item", "constant")
"""The keys of a condition file (without ``format``) that may stand inline in an entry."""

_RULES = {
    "displacement_t": (non_negative,), "deadweight_t": (), "fsm_tm": (non_negative,), "fsc_m": (non_negative,),
    "list_deg": (between(-90.0, 90.0, "°"),), "downflooding_angle_deg": (between(0.0, 90.0, "°"),),
    "lw1_m": (non_negative,), "area_a_mrad": (non_negative,), "area_b_mrad": (non_negative,),
    "theta0_deg": (between(0.0, 90.0, "°"),), "theta1_deg": (between(0.0, 90.0, "°"),),
    "theta2_deg": (between(0.0, 90.0, "°"),),
}


@frozen
class BookletCase:
    name: str
    """As the booklet titles it."""
    page: str
    """Where the booklet prints it ('' if not given)."""
    condition: m.Condition
    expected: dict = field(hash=False)
    """The booklet's results: keys of deckload.core.booklet.QUANTITIES, ``gz`` = ((heel, gz), …), and
    ``as_typed`` = the numbers as typed before any conversion (int or float, for their decimals)."""
    source: str
    """Where the loading came from: the condition file, or 'inline'."""
    conversions: tuple[str, ...] = ()
    """How the booklet's printed values were converted (datum, sign, extreme drafts), one line each."""


def load_booklet_conditions(profile_path: str | os.PathLike, vessel: m.Vessel) -> list[BookletCase]:
    """Every booklet condition of the profile, validated.  Raises ProfileError listing every problem."""
    path = Path(profile_path)
    text = _read_text(path)
    if "booklet_condition" not in text:
        return []  # most profiles have none: spare check a second parse of a large file
    ctx = FileCheck(str(path), text)
    root = ctx.root()
    cases: list[BookletCase] = []
    names: set[str] = set()
    from deckload.io.condition_files import MAX_NAME_CHARS

    for idx, t in enumerate(root.tables("booklet_condition")):
        # one line, as a condition's name: it heads a printed comparison (a line feed would forge a row)
        name = t.text("name", one_line=True, max_chars=MAX_NAME_CHARS)
        if name is not None:
            t.name = f"booklet_condition[{name}]"
            if name in names:
                t.bad("name", name, "duplicate booklet-condition name")
            names.add(name)
        page = t.text("page", required=False, default="", empty_ok=True)
        expected, conversions = _read_expected(t, vessel)
        file_given = t.has("condition_file")
        inline = [k for k in INLINE_KEYS if t.has(k)]
        cfile = t.text("condition_file", required=False, default=None)
        for k in INLINE_KEYS:
            t.get(k, False)
        t.finish()
        if file_given == bool(inline):
            t.bad("condition_file", t.data.get("condition_file", MISSING),
                  "give exactly one of condition_file (a condition file beside the profile) and an inline "
                  "loading ([booklet_condition.condition] …)" + (", not both" if file_given else ""))
            continue
        if file_given and cfile is None:
            continue
        # the loading is validated even when the entry has other problems: every problem at once
        if file_given:
            cpath = path.parent / cfile
            try:
                condition = load_condition(cpath, vessel)
            except OSError as e:
                t.bad("condition_file", cfile, f"cannot read {cpath}: {e.strerror or e}")
                continue
            except ProfileError as e:
                ctx.problems.extend(e.problems)
                continue
            source = str(cpath)
        else:
            condition = _inline_condition(ctx, t, idx, name or "Booklet condition", vessel)
            if condition is None:
                continue
            source = "inline"
        if name is None or expected is None or page is None:
            continue
        cases.append(BookletCase(name, page or "", condition, expected, source, conversions))
    ctx.fail_if_any()
    return cases


DRAFT_KEYS = ("draft_aft_m", "draft_mid_m", "draft_fwd_m")


def _read_expected(t: Table, vessel: m.Vessel) -> tuple[dict | None, tuple[str, ...]]:
    """The booklet's results, converted to deckload's conventions, and the conversions made.

    By default in deckload's conventions (x from the AP + forward, y + starboard, moulded drafts),
    as a condition file is; ``longitudinal_datum``/``longitudinal_positive``,
    ``transverse_positive``, ``draft_basis`` and ``trim_positive`` in the table let the values be
    typed as the booklet prints them (vessel_profiles/README.md, "Booklet conventions").
    """
    e = t.table("expected")
    if e is None:
        return None, ()
    p = vessel.particulars
    frame = read_frame(e, Frame(p.lbp_m, keel_thickness_m=p.keel_thickness_m), drafts=True, trims=True)
    out: dict = {}
    ok = frame is not None
    frame = frame or Frame(p.lbp_m)
    done: list[str] = []
    typed: dict = {}
    for key in QUANTITIES:
        present = e.has(key)
        if key == "tcg_m":
            x, _ = tcg_num(e, key, frame, default=None)
        else:
            x = e.num(key, *_RULES.get(key, ()), required=False)
        if not present:
            continue
        if x is None:
            ok = False
            continue
        raw = e.data.get(key)
        if isinstance(raw, (int, float)) and not isinstance(raw, bool):
            # as on the page, for the page's own relations (core.booklet.disagreements); a trim typed
            # + by the head is turned (exactly: a sign keeps its decimals) so that trim = aft − forward holds
            typed[key] = -raw if key == "trim_m" and not frame.trim_is_identity else raw
        if key == "lcg_m" and not frame.x_is_identity:
            x = float(frame.x_to_ap(x))
            done.append(f"lcg_m: {frame.describe_x()}")
        elif key in ("tcg_m", "list_deg") and not frame.y_is_identity:
            if key == "list_deg":
                x = frame.plain_sign * x
            done.append(f"{key}: {frame.describe_y()}")
        elif key == "trim_m" and not frame.trim_is_identity:
            x = float(frame.trim_to_stern(x))
            done.append(f"trim_m: {frame.describe_trim()}")
        elif key in DRAFT_KEYS and frame.draft_basis == "extreme":
            x = float(frame.draft_to_moulded(x))
            done.append(f"{key}: extreme → moulded (− keel {p.keel_thickness_m:g} m)")
        out[key] = x
    has_heel, has_gz = e.has("gz_heel_deg"), e.has("gz_m")
    heel = e.array("gz_heel_deg", between(0.0, 90.0, "°"), required=False, min_len=1)
    gz = e.array("gz_m", required=False, min_len=1)
    if has_heel != has_gz:
        e.bad("gz_m" if has_heel else "gz_heel_deg", MISSING, "gz_heel_deg and gz_m go together (one GZ per heel)")
        ok = False
    elif has_heel:
        if heel is None or gz is None:
            ok = False
        elif len(heel) != len(gz):
            e.bad("gz_m", e.data["gz_m"], f"has {len(gz)} values but gz_heel_deg has {len(heel)}: one GZ per heel")
            ok = False
        else:
            out["gz"] = tuple((float(h), float(g)) for h, g in zip(heel, gz))
    e.finish()
    if ok and not out:
        e.ctx.add(e.raw, e.name, None, "gives no booklet result to compare: at least one of "
                  + ", ".join(list(QUANTITIES)[:4]) + ", … (vessel_profiles/README.md)")
        return None, ()
    out["as_typed"] = typed
    return (out, tuple(f"converted: {t.name}.expected {d}" for d in done)) if ok else (None, ())


def _inline_condition(ctx: FileCheck, t: Table, idx: int, name: str, vessel: m.Vessel) -> m.Condition | None:
    """The inline loading, validated by the condition reader itself; its problems are placed in the profile."""
    doc = {"format": CONDITION_FORMAT}
    head = dict(t.data.get("condition", {})) if isinstance(t.data.get("condition"), dict) else t.data.get("condition")
    if isinstance(head, dict):
        head.setdefault("name", name)
    doc["condition"] = head if head is not None else {"name": name}
    for k in INLINE_KEYS[1:]:
        if k in t.data:
            doc[k] = t.data[k]
    try:
        text = tomli_w.dumps(doc)
    except (TypeError, ValueError) as e:  # a value TOML cannot write back (cannot happen for parsed TOML)
        t.bad("condition", t.data.get("condition", MISSING), f"cannot be read as a loading: {e}")
        return None
    if "condition" not in t.data:
        t.bad("condition", MISSING, "an inline loading needs [booklet_condition.condition] with water_density_t_m3")
        return None
    try:
        return parse_condition(text, ctx.file, vessel)
    except ProfileError as e:
        for p in e.problems:
            line = ctx.line_of(("booklet_condition", idx) + _key_path(p.key or "condition"))
            ctx.problems.append(Problem(ctx.file, line, f"{t.name}.{p.key}" if p.key else t.name, p.value, p.rule))
        return None


def _key_path(key: str) -> tuple:
    """'deck_item[#2].mass_t' → ('deck_item', 1, 'mass_t'): a condition problem's key as a document path."""
    out: list = []
    for part in key.split("."):
        name, _, rest = part.partition("[#")
        out.append(name.strip('"'))
        if rest.endswith("]") and rest[:-1].isdigit():
            out.append(int(rest[:-1]) - 1)
    return tuple(out)
