"""Booklet conventions: how a profile's numbers are measured, and their conversion to the model's.

A stability booklet measures x from the aft perpendicular, midships or the forward
perpendicular, with + forward or + aft; prints TCG signed or as "1.20 P"; gives
drafts moulded or extreme (vessel_profiles/README.md, "Booklet conventions and CSV
tables").  A :class:`Frame` is the convention in force for one table: the vessel's,
overridden by keys in the table (and, for a tank's calibration, by its tank).  The
conversion is affine and exact in the input:

    x_AP = x₀ + s·x,  x₀ = 0 (AP), LBP/2 (midships), LBP (FP);  s = +1 (+ forward), −1 (+ aft)
    y_stbd = ±y (plain numbers by ``transverse_positive``; "P"/"S" marks or ``tcg_side`` fix the side)
    t_stern = ±t (``trim_positive``: "stern", the model's, or "head": the sign reversed)

Every non-identity conversion is recorded in words (:meth:`Frame.describe_x`) so that
``deckload check`` can print it; :mod:`deckload.cli.csv_export` inverts it to write the
tables back as the booklet has them.
"""

from __future__ import annotations

import math
import re
from dataclasses import replace

import numpy as np

from deckload.core.frozen import frozen
from deckload.io.tomlcheck import MISSING, Table, is_number, num, toml_type

DATUMS = ("AP", "midships", "FP")
DATUM_WORDS = {"AP": "the aft perpendicular", "midships": "midships", "FP": "the forward perpendicular"}
SIDE = re.compile(r"^\s*(?P<num>[+-]?(?:\d+\.?\d*|\.\d+))\s*(?P<side>[PS])?\s*$", re.IGNORECASE | re.ASCII)
CENTRELINE = ("CL", "C/L", "C")


@frozen
class Frame:
    """The measuring convention of one table."""

    lbp_m: float
    datum: str = "AP"
    positive: str = "forward"
    transverse_positive: str = "starboard"
    tcg_side: str | None = None
    """'port' or 'starboard': plain TCGs are distances on that side; None: signed numbers."""
    draft_basis: str = "moulded"
    keel_thickness_m: float = 0.0
    trim_positive: str = "stern"
    """'stern' (the model's: draft aft − draft forward) or 'head': which way a positive trim points."""

    # ---- longitudinal
    @property
    def x0(self) -> float:
        return {"AP": 0.0, "midships": self.lbp_m / 2.0, "FP": self.lbp_m}[self.datum]

    @property
    def s(self) -> float:
        return 1.0 if self.positive == "forward" else -1.0

    @property
    def x_is_identity(self) -> bool:
        return self.datum == "AP" and self.positive == "forward"

    def x_to_ap(self, x):
        """x as written → metres from AP, + forward."""
        return self.x0 + self.s * np.asarray(x, dtype=float) if not np.isscalar(x) else self.x0 + self.s * float(x)

    def x_from_ap(self, x):
        """Inverse of :meth:`x_to_ap`, for writing tables back in this convention."""
        return (np.asarray(x, dtype=float) - self.x0) * self.s if not np.isscalar(x) else (float(x) - self.x0) * self.s

    def describe_x(self) -> str:
        op = f"{num(self.x0)} + x" if self.s > 0 else f"{num(self.x0)} − x"
        return (f"from {DATUM_WORDS[self.datum]}, + {self.positive} → from the AP, + forward "
                f"(x_AP = {op} m)")

    # ---- transverse
    @property
    def plain_sign(self) -> float:
        if self.tcg_side is not None:
            return 1.0 if self.tcg_side == "starboard" else -1.0
        return 1.0 if self.transverse_positive == "starboard" else -1.0

    @property
    def y_is_identity(self) -> bool:
        return self.tcg_side is None and self.transverse_positive == "starboard"

    def describe_y(self) -> str:
        if self.tcg_side is not None:
            return f"distances on the {self.tcg_side} side → + starboard"
        return "+ port → + starboard (sign reversed)"

    # ---- trims
    @property
    def trim_sign(self) -> float:
        return 1.0 if self.trim_positive == "stern" else -1.0

    @property
    def trim_is_identity(self) -> bool:
        return self.trim_positive == "stern"

    def trim_to_stern(self, t):
        """A trim as written → m, + by the stern (its own inverse: :meth:`trim_from_stern`)."""
        return self.trim_sign * np.asarray(t, dtype=float) if not np.isscalar(t) else self.trim_sign * float(t)

    trim_from_stern = trim_to_stern

    def trim_range_to_stern(self, pair: tuple[float, float]) -> tuple[float, float]:
        """A range [from, to] as written (from below to) → + by the stern, still from below to."""
        a, b = self.trim_to_stern(pair[0]), self.trim_to_stern(pair[1])
        return (min(a, b), max(a, b))

    @staticmethod
    def describe_trim() -> str:
        return "+ by the head → + by the stern (sign reversed)"

    # ---- drafts
    def draft_to_moulded(self, d):
        return np.asarray(d, dtype=float) - self.keel_thickness_m if self.draft_basis == "extreme" else np.asarray(d, dtype=float)

    def draft_from_moulded(self, d):
        return np.asarray(d, dtype=float) + self.keel_thickness_m if self.draft_basis == "extreme" else np.asarray(d, dtype=float)


TRIM_SIGNS = ("stern", "head")
"""Values of ``trim_positive``: a positive trim is by the stern (deckload's) or by the head."""


def read_frame(t: Table, parent: Frame | None, *, sides: bool = False, drafts: bool = False,
               trims: bool = False) -> Frame | None:
    """The frame of table ``t``: ``parent`` overridden by the convention keys ``t`` holds.

    ``sides``: the table may hold ``tcg_side``; ``drafts``: it may hold ``draft_basis``;
    ``trims``: it may hold ``trim_positive`` (a table that holds trims, and ``[vessel]``).
    Returns None (problems reported) when a key is wrong or ``parent`` is unknown.
    """
    sign = read_trim_sign(t) if trims else None
    has_datum, has_pos = t.has("longitudinal_datum"), t.has("longitudinal_positive")
    datum = t.text("longitudinal_datum", required=False, default=None, choices=DATUMS)
    pos = t.text("longitudinal_positive", required=False, default=None, choices=("forward", "aft"))
    trans = t.text("transverse_positive", required=False, default=None, choices=("starboard", "port"))
    side = t.text("tcg_side", required=False, default=None, choices=("port", "starboard")) if sides else None
    basis = t.text("draft_basis", required=False, default=None, choices=("moulded", "extreme")) if drafts else None
    bad = (has_datum and datum is None) or (has_pos and pos is None) or (t.has("transverse_positive") and trans is None)
    bad |= sides and t.has("tcg_side") and side is None
    bad |= drafts and t.has("draft_basis") and basis is None
    bad |= trims and t.has("trim_positive") and sign is None
    if datum is not None and datum != "AP" and pos is None:
        t.bad("longitudinal_positive", MISSING, f"required with longitudinal_datum = {t.ctx.fmt(datum)}: "
              "say whether + is forward or aft, as the booklet states it")
        bad = True
    if bad or parent is None:
        return None
    f = parent
    if datum is not None:
        f = replace(f, datum=datum, positive=pos or "forward")
    elif pos is not None:
        f = replace(f, positive=pos)
    if trans is not None:
        f = replace(f, transverse_positive=trans)
    if side is not None:
        f = replace(f, tcg_side=side)
    if sign is not None:
        f = replace(f, trim_positive=sign)
    if basis is not None:
        if basis == "extreme" and f.keel_thickness_m <= 0.0:
            t.bad("draft_basis", basis, "extreme drafts need [vessel] keel_thickness_m (extreme − moulded draft)")
            return None
        f = replace(f, draft_basis=basis)
    return f


def read_trim_sign(t: Table) -> str | None:
    """``trim_positive`` of table ``t`` ("stern" or "head"); None when absent or wrong (reported)."""
    return t.text("trim_positive", required=False, default=None, choices=TRIM_SIGNS)


def trim_frame(t: Table, parent: Frame | None) -> Frame | None:
    """``parent`` with the ``trim_positive`` of ``t`` (a table holding trims and no other convention
    key); None when the key is wrong (reported) or ``parent`` is unknown."""
    sign = read_trim_sign(t)
    if (t.has("trim_positive") and sign is None) or parent is None:
        return None
    return parent if sign is None else replace(parent, trim_positive=sign)


def _side_value(v, frame: Frame) -> tuple[float | None, str | None, bool]:
    """(y + starboard, problem, marked) for one TCG as written: a number or "1.20 P" / "1.20 S" / "CL"."""
    if is_number(v):
        try:
            x = float(v)
        except OverflowError:  # an integer too large for a float
            x = math.inf
        if not math.isfinite(x):
            return None, "is not a finite number", False
        if frame.tcg_side is not None and x < 0:
            return None, (f"is negative, but tcg_side = {frame.tcg_side!r} says every TCG here is a distance on "
                          f"the {frame.tcg_side} side (≥ 0)"), False
        return frame.plain_sign * x, None, False
    if isinstance(v, str):
        s = v.strip()
        if s.upper() in CENTRELINE:
            return 0.0, None, True
        m = SIDE.match(s)
        if m:
            x = float(m.group("num"))
            letter = (m.group("side") or "").upper()
            if not letter:
                return frame.plain_sign * x, None, False
            if x < 0:
                return None, "a side-marked distance must not be negative (the letter gives the side)", True
            return (-x if letter == "P" else x), None, True
        return None, "is not a TCG: write a signed number, or a distance with its side, e.g. \"1.20 P\" or \"1.20 S\"", False
    return None, f"is {toml_type(v)}, not a TCG (a number or e.g. \"1.20 P\")", False


def tcg_num(t: Table, k: str, frame: Frame | None, *, required: bool = False, default: float = 0.0):
    """A single TCG (m, + starboard) as written in ``frame``; ``default`` when absent."""
    v = t.get(k, required)
    if v is MISSING:
        return default, False
    y, problem, marked = _side_value(v, frame or Frame(1.0))
    if problem:
        t.bad(k, v, problem)
        return None, marked
    return y, marked


def tcg_array(t: Table, k: str, frame: Frame | None, *, required: bool = True):
    """A TCG column (m, + starboard) and whether any cell was side-marked; None on a problem."""
    v = t.get(k, required)
    if v is MISSING:
        return None, False
    if not isinstance(v, list):
        t.bad(k, v, f"must be an array of TCGs, not {toml_type(v)}")
        return None, False
    if len(v) < 2:
        t.bad(k, v, f"needs at least 2 values, has {len(v)}")
        return None, False
    out, any_marked = [], False
    for i, x in enumerate(v):
        y, problem, marked = _side_value(x, frame or Frame(1.0))
        if problem:
            t.bad(k, v, f"row {i + 1}: {t.ctx.fmt(x)} {problem}", (i,))
            return None, False
        any_marked |= marked
        out.append(y)
    return np.array(out, dtype=float), any_marked


def side_text(y: float, frame: Frame, marked: bool):
    """A TCG (+ starboard) written back as the booklet had it: marked "1.2 P" or a plain number."""
    from deckload.io.csvtables import fmt_number

    if marked:
        if y == 0.0:
            return "0"
        return f"{fmt_number(abs(y))} {'P' if y < 0 else 'S'}"
    return frame.plain_sign * y
