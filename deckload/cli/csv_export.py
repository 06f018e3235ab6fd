"""``deckload csv PROFILE DIR``: write every table of a profile as CSV, as the booklet has it.

For side-by-side comparison with the approved stability booklet: each table is written
in the conventions the profile states for it (datum and sign of x, "P"/"S" marks or
signed TCGs, sounding or ullage readings, FSM in t·m or fsi in m⁴, extreme or moulded
drafts, against displacement or draft), with the column names of
vessel_profiles/README.md ("Tables in CSV files"), so that reading the files back gives
the same numbers.  A row that the loader added (level 0, volume 0 below a table that
starts above the bottom) is not written, nor the 0° column added to cross curves printed from
5° or 10°; tables typed deepest draft or greatest displacement first are written that way; the
booklet columns read and not used (``cb``, ``mass_t``, …) are written back as they were read.  Files are written atomically; a table without
rows in the profile (a capacity-only tank, a single downflooding angle) is named on
the screen instead.

A file the profile reads (its own CSV tables, when the folder given is theirs) or a file of the
voyage log is never written over: the command refuses before it writes any file, naming the
file (:mod:`deckload.io.outputs`).

Exit status: 0 written; 1 the profile has problems, or a file to write is one the profile reads
or the log keeps; 2 a file could not be read or written.
"""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np

from deckload.io.conventions import Frame, side_text
from deckload.core import model as m
from deckload.core.audit import trim_table_name
from deckload.core.tables import interp
from deckload.io.csvtables import write_csv
from deckload.io.profiles import ProfileError, Reading, TableReading, read_profile

CAUTION = ("Compare these tables with the approved stability booklet before relying on the profile: deckload "
           "supports, and never replaces, the booklet, the master's judgement and flag-State and class rules.")


def _draft_of(v: m.Vessel, disp: np.ndarray, frame: Frame) -> list[float]:
    """Displacements back to the drafts they were read from (inverse of the linear look-up), in the table's basis."""
    h = v.hydrostatics
    moulded = np.array([interp(h.displacement_t, h.draft_m, float(d), "displacement", "t") for d in disp])
    return [float(x) for x in frame.draft_from_moulded(moulded)]


def hydrostatics_rows(v: m.Vessel, tr: TableReading, h: m.HydrostaticTable | None = None) -> tuple[list[str], list[list]]:
    h, f = (v.hydrostatics if h is None else h), tr.frame
    cols = {"draft_m": f.draft_from_moulded(h.draft_m), "displacement_t": h.displacement_t,
            "lcb_m": f.x_from_ap(h.lcb_m), "lcf_m": f.x_from_ap(h.lcf_m), "kmt_m": h.kmt_m,
            "tpc_t_cm": h.tpc_t_cm, "mctc_tm_cm": h.mctc_tm_cm}
    if h.vcb_m is not None:
        cols["vcb_m"] = h.vcb_m
    if h.kml_m is not None:
        cols["kml_m"] = h.kml_m
    order = range(len(h.draft_m))
    return list(cols), [[float(cols[k][i]) for k in cols] for i in (reversed(order) if tr.reversed else order)]


def cross_curve_rows(v: m.Vessel, cc: m.CrossCurves | None = None,
                     tr: TableReading | None = None) -> tuple[list[str], list[list]]:
    from deckload.io.csvtables import fmt_number

    cc = v.cross_curves if cc is None else cc
    first = 1 if tr is not None and tr.added_upright else 0  # the 0° column the reader added
    header = ["displacement_t"] + [f"kn_{fmt_number(float(a))}" for a in cc.heel_deg[first:]]
    rows = [[float(d)] + [float(x) for x in row[first:]] for d, row in zip(cc.displacement_t, cc.kn_m)]
    return header, (rows[::-1] if tr is not None and tr.reversed else rows)


def calibration_rows(t: m.Tank, tr: TableReading) -> tuple[list[str], list[list]]:
    c, f = t.calibration, tr.frame
    level = np.asarray(c.sounding_m)
    if tr.level == "ullage_m":
        reading = t.ullage_reference_m - level
    else:
        reading = level - t.sounding_zero_m
    cols: dict[str, list] = {
        tr.level: [float(x) for x in reading],
        "volume_m3": [float(x) for x in c.volume_m3],
        "lcg_m": [float(x) for x in f.x_from_ap(c.lcg_m)],
        "vcg_m": [float(x) for x in c.vcg_m],
        "tcg_m": [side_text(float(y), f, tr.tcg_marked) for y in c.tcg_m],
    }
    if tr.fsm == "fsm_tm":
        cols["fsm_tm"] = [float(x) * tr.fsm_density_t_m3 for x in c.fsi_m4]
    elif tr.fsm == "fsi_m4":
        cols["fsi_m4"] = [float(x) for x in c.fsi_m4]
    n = len(level)
    order = list(range(1 if tr.added_bottom_row else 0, n))
    if tr.reversed:
        order.reverse()
    return list(cols), [[cols[k][i] for k in cols] for i in order]


def curve_rows(v: m.Vessel, curve: m.LimitCurve, tr: TableReading, value_key: str) -> tuple[list[str], list[list]]:
    if tr.against == "draft_m":
        x = _draft_of(v, curve.displacement_t, tr.frame)
    else:
        x = [float(d) for d in curve.displacement_t]
    return [tr.against, value_key], [[a, float(b)] for a, b in zip(x, curve.value)]


def hold_rows(h: m.Hold, tr: TableReading) -> tuple[list[str], list[list]]:
    cols = {"fill_pct": [float(x) for x in h.fill_pct], "fill_vcg_m": [float(x) for x in h.fill_vcg_m]}
    if h.fill_lcg_m is not None:
        cols["fill_lcg_m"] = [float(x) for x in tr.frame.x_from_ap(h.fill_lcg_m)]
    return list(cols), [[cols[k][i] for k in cols] for i in range(len(h.fill_pct))]


def in_order(table: tuple[list[str], list[list]], tr: TableReading | None) -> tuple[list[str], list[list]]:
    """The columns in the order of the CSV file the table was read from, where it was, with the
    booklet columns read and not used put back as they were read (rows in the written order)."""
    header, rows = table
    if tr is not None:
        for name, values in tr.ignored:
            if len(values) == len(rows) and name not in header:
                header = header + [name]
                rows = [r + [x] for r, x in zip(rows, values)]
    if tr is None or not tr.columns or sorted(tr.columns) != sorted(header):
        return header, rows
    idx = [header.index(c) for c in tr.columns]
    return list(tr.columns), [[r[i] for i in idx] for r in rows]


def profile_tables(v: m.Vessel, rd: Reading) -> list[tuple[str, str, str, list[str], list[list]]]:
    """(file name, what, key of its reading, header, rows) for every table of the profile that has rows."""
    out = []
    hy = rd.tables.get("hydrostatics")
    if hy is not None:
        out.append(("hydrostatics.csv", "[hydrostatics]", "hydrostatics", *hydrostatics_rows(v, hy)))
    out.append(("cross_curves.csv", "[cross_curves]", "cross_curves",
                *cross_curve_rows(v, tr=rd.tables.get("cross_curves"))))
    out += trimmed_tables(v, rd)
    for t in v.tanks:
        tr = rd.tables.get(f"tank[{t.id}].calibration")
        if t.level_known and tr is not None:
            key = f"tank[{t.id}].calibration"
            out.append((f"tank_{t.id}.csv", key, key, *calibration_rows(t, tr)))
        if t.trim_correction is not None:
            key = f"tank[{t.id}].trim_correction"
            out.append((f"tank_{t.id}_trim.csv", key, key, *trim_correction_rows(t, rd.tables.get(key))))
    if v.limit_curve is not None and "limit_curve" in rd.tables:
        out.append(("limit_curve.csv", "[limit_curve]", "limit_curve",
                    *curve_rows(v, v.limit_curve, rd.tables["limit_curve"], v.limit_curve.kind)))
    df = rd.tables.get("downflooding")
    if v.downflooding is not None and df is not None and df.against != "single":
        out.append(("downflooding.csv", "[downflooding]", "downflooding", *curve_rows(v, v.downflooding, df, "angle_deg")))
    for h in v.holds:
        tr = rd.tables.get(f"hold[{h.id}]")
        if h.fill_pct is not None and tr is not None:
            out.append((f"hold_{h.id}_fill.csv", f"hold[{h.id}] fill table", f"hold[{h.id}]", *hold_rows(h, tr)))
    return out


def trimmed_tables(v: m.Vessel, rd: Reading) -> list[tuple[str, str, str, list[str], list[list]]]:
    """The tables at trims other than 0 (``[[hydrostatics_at_trim]]``, ``[[cross_curves_at_trim]]``)."""
    tt = v.trimmed
    if tt is None:
        return []
    out = []

    def as_typed(trim, key) -> float:
        """The trim in the sign the table was typed in (its trim_positive)."""
        tr = rd.tables.get(key)
        return float(tr.frame.trim_from_stern(float(trim))) if tr is not None else float(trim)

    for trim, h in zip(tt.hydro_trim_m, tt.hydrostatics):
        key = trim_table_name("hydrostatics_at_trim", trim)
        if h is not v.hydrostatics and key in rd.tables:
            typed = as_typed(trim, key)
            out.append((f"hydrostatics_trim_{typed:+g}.csv", f"[[{key.split('[')[0]}]] trim_m = {typed:g}",
                        key, *hydrostatics_rows(v, rd.tables[key], h)))
    for trim, cc in zip(tt.kn_trim_m, tt.cross_curves):
        key = trim_table_name("cross_curves_at_trim", trim)
        if cc is not v.cross_curves:
            typed = as_typed(trim, key)
            out.append((f"kn_trim_{typed:+g}.csv", f"[[cross_curves_at_trim]] trim_m = {typed:g}", key,
                        *cross_curve_rows(v, cc, rd.tables.get(key))))
    return out


def trim_correction_rows(t: m.Tank, tr: TableReading | None = None) -> tuple[list[str], list[list]]:
    """``[tank.trim_correction]``: sounding_m and one corr_<trim> / volume_<trim> column per trim,
    the trims in the sign the table was typed in (its trim_positive), rising as typed."""
    from deckload.io.csvtables import fmt_number

    tc = t.trim_correction
    prefix = "corr" if tc.kind == "sounding_correction_m" else "volume"
    sign = tr.frame.trim_sign if tr is not None else 1.0
    order = range(len(tc.trim_m)) if sign > 0 else range(len(tc.trim_m) - 1, -1, -1)
    header = ["sounding_m"] + [f"{prefix}_{fmt_number(sign * float(tc.trim_m[j]))}" for j in order]
    return header, [[float(s)] + [float(row[j]) for j in order] for s, row in zip(tc.sounding_m, tc.value)]


def describe(tr: TableReading | None, key: str = "") -> str:
    if tr is None:
        return ""
    f = tr.frame
    bits = []
    if not f.x_is_identity and tr.against == "displacement_t" and key not in ("limit_curve", "downflooding"):
        bits.append(f"x from {f.datum}, + {f.positive}")
    if tr.tcg_marked:
        bits.append("TCG marked P/S")
    elif not f.y_is_identity:
        bits.append(f"TCG {'on the ' + f.tcg_side + ' side' if f.tcg_side else '+ port'}")
    if tr.level == "ullage_m":
        bits.append("by ullage")
    if tr.fsm == "fsm_tm":
        bits.append(f"FSM t·m at {tr.fsm_density_t_m3:g} t/m³")
    if f.draft_basis == "extreme":
        bits.append("extreme drafts")
    if tr.against == "draft_m":
        bits.append("against draft")
    if tr.reversed and tr.level != "ullage_m":
        bits.append("rows greatest first, as typed")
    if tr.added_upright:
        bits.append("without the 0° column added on reading")
    if tr.ignored:
        bits.append("with " + ", ".join(name for name, _ in tr.ignored) + " as read")
    if not f.trim_is_identity and ("_at_trim[" in key or key.endswith(".trim_correction")):
        bits.append("trims + by the head")
    return f" ({', '.join(bits)})" if bits else ""


def _refused(profile_path: Path, targets: list[Path]) -> str | None:
    """Why the files would not be written, or None: one of them is a file the profile reads
    (its own CSV tables, typed from the booklet, would come back rewritten: "1.60" as "1.6",
    121.7123456789 as 121.7123457) or a file of the voyage log (:mod:`deckload.io.outputs`).
    Checked for every file before any is written; new files beside the profile's are fine."""
    from deckload.io.outputs import OutputRefused, profile_inputs, refuse_overwrites

    try:
        refuse_overwrites(targets, profile_inputs(profile_path))
    except OutputRefused as e:
        folder = targets[0].parent.name if targets else ""
        return (f"{e}: no table written.  The files the profile reads keep the values as typed from the "
                f"booklet: give another folder (e.g. {folder or 'tables'}-export) to write the tables in")
    return None


def run_csv(profile_path: Path, out_dir: Path) -> int:
    try:
        vessel, rd = read_profile(profile_path)
    except OSError as e:
        print(f"deckload: cannot read {profile_path}: {e.strerror or e}", file=sys.stderr)
        return 2
    except ProfileError as e:
        for p in e.problems:
            print(p)
        print(f"{len(e.problems)} problem{'s' if len(e.problems) != 1 else ''} in {profile_path}: no tables written")
        return 1
    out_dir = Path(out_dir)
    tables = profile_tables(vessel, rd)
    refused = _refused(profile_path, [out_dir / name for name, *_ in tables])
    if refused:
        print(f"deckload csv: {refused}", file=sys.stderr)
        return 1
    try:
        out_dir.mkdir(parents=True, exist_ok=True)
        for name, what, key, header, rows in tables:
            header, rows = in_order((header, rows), rd.tables.get(key))
            write_csv(out_dir / name, header, rows)
            print(f"wrote {out_dir / name}: {what}, {len(rows)} rows{describe(rd.tables.get(key), key)}")
    except BrokenPipeError:
        raise
    except OSError as e:
        print(f"deckload: cannot write in {out_dir}: {e.strerror or e}", file=sys.stderr)
        return 2
    for t in vessel.tanks:
        if not t.level_known:
            print(f"not written: tank[{t.id}] has no table (capacity {t.capacity_m3:g} m³ and centre only)")
    df = rd.tables.get("downflooding")
    if df is not None and df.against == "single":
        print(f"not written: [downflooding] is one angle, {float(vessel.downflooding.value[0]):g}°")
    print(CAUTION)
    return 0
