"""``deckload tables GEOMETRY [--trims T1,T2,...] [-o PROFILE]``: compute a vessel's tables from its geometry.

Reads a geometry file (``deckload.io.geometry_files``), computes every table
(``deckload.core.geometry.builder``) and writes the profile's generated sections
with tomli-w:

* ``[hydrostatics]``, ``[cross_curves]``;
* every ``[[tank]]`` named in the geometry (id, name, kind, density, pair,
  fs_category, capacity, worst band, calibration and fluid transfer);
* every ``[[hold]]`` named in the geometry (capacity, centroid, fill table);
* ``[[deck_area]]`` and ``[downflooding]`` when the geometry defines deck areas or
  openings;
* with ``--trims``: ``[[hydrostatics_at_trim]]`` and ``[[cross_curves_at_trim]]`` at those
  trims (m, + by the stern; ``deckload.core.geometry.trimmed``), and ``[cross_curves]`` made
  at fixed trim 0 like them (``trim_basis = "even keel"``) so that KN interpolate in trim
  consistently; without ``--trims`` tables at trims already in the profile are kept, with a note;
* in ``[vessel]``: lbp_m, breadth_m, depth_m and table_density_t_m3 (name,
  design_draft_m and longitudinal_datum only when the profile has none).

Everything else in an existing profile — format, the other ``[vessel]`` keys,
``[lightship]``, ``[criteria]``, ``[free_surface]``, ``[[load_line]]``,
``[limit_curve]``, remarks, and tanks or holds that the geometry does not name —
is kept as it is.  The file is replaced atomically; TOML comments cannot survive a
rewrite, so when the old file has any a copy is kept beside it as ``*.bak``, itself written
atomically (an earlier ``*.bak`` is replaced whole or not at all: on a full disk it stays as it
was).  A file that cannot be written is named with the reason, exit 2, nothing else changed.  The profile
written is never the geometry file read nor a file of the voyage log (nor is its ``*.bak``):
the command refuses before it computes (:mod:`deckload.io.outputs`).

Values are rounded to fixed decimals (0.1 mm for lengths, 0.01 t, 1e-4 m³ …), so
the output is deterministic and a rebuild of an unchanged geometry is
byte-for-byte identical.
"""

from __future__ import annotations

import re
import sys
import time
import tomllib
from pathlib import Path
from typing import Any

import numpy as np
import tomli_w

from deckload.io.atomicfile import write_atomic
from deckload.core.geometry.builder import TRANSFER_DECIMALS, TableRangeError, VesselTables, build_tables, hull_body
from deckload.core.geometry.cross_curves import NoEquilibriumError
from deckload.core.geometry.trimmed import TableAtTrim, TrimTableError, kn_at_trim, tables_at_trims
from deckload.core.bounds import table_trim_range
from deckload.core.model import Particulars
from deckload.io.limits import MAX_TABLES_AT_TRIMS
from deckload.io.geometry_files import GeometryError, load_geometry

PROFILE_FORMAT = "deckload-profile-1"

TOP_ORDER = (
    "format", "vessel", "lightship", "hydrostatics", "cross_curves", "hydrostatics_at_trim", "cross_curves_at_trim",
    "free_surface", "criteria",
    "load_line", "draft_marks", "sounding_pipes", "limit_curve", "downflooding", "deck_edge", "windage", "passengers",
    "extra_criterion", "tank", "hold", "deck_area",
)
"""Order of the top-level sections in a written profile; unknown keys follow in their own order."""


def _r(a: Any, decimals: int) -> Any:
    """Round to fixed decimals as plain Python floats (lists for arrays); −0.0 becomes 0.0."""
    arr = np.round(np.asarray(a, dtype=float), decimals) + 0.0
    return arr.tolist() if arr.ndim else float(arr)


def _hydro_section(h: Any) -> dict[str, Any]:
    """A hydrostatic table's columns, rounded (even keel or at a trim: the same decimals)."""
    return {
        "draft_m": _r(h.draft_m, 4),
        "displacement_t": _r(h.displacement_t, 2),
        "lcb_m": _r(h.lcb_m, 4),
        "lcf_m": _r(h.lcf_m, 4),
        "kmt_m": _r(h.kmt_m, 4),
        "tpc_t_cm": _r(h.tpc_t_cm, 4),
        "mctc_tm_cm": _r(h.mctc_tm_cm, 4),
        "vcb_m": _r(h.vcb_m, 4),
        "kml_m": _r(h.kml_m, 3),
    }


def trimmed_sections(vt: VesselTables, at_trims: tuple[TableAtTrim, ...]) -> dict[str, Any]:
    """``[[hydrostatics_at_trim]]`` / ``[[cross_curves_at_trim]]`` entries, and the fixed-trim
    ``[cross_curves]`` at trim 0 they interpolate with (rounded as the even-keel tables)."""
    g = vt.geometry
    cc0 = kn_at_trim(hull_body(g), vt.cross_curves.displacement_t, vt.cross_curves.heel_deg, 0.0,
                     g.vessel.table_density_t_m3, g.vessel.lbp_m)
    return {
        "cross_curves": {"trim_basis": cc0.trim_basis, "heel_deg": _r(cc0.heel_deg, 3),
                         "displacement_t": _r(cc0.displacement_t, 2), "kn_m": _r(cc0.kn_m, 4)},
        "hydrostatics_at_trim": [{"trim_m": _r(a.trim_m, 4), **_hydro_section(a.hydrostatics)} for a in at_trims],
        "cross_curves_at_trim": [{"trim_m": _r(a.trim_m, 4), "heel_deg": _r(a.cross_curves.heel_deg, 3),
                                  "displacement_t": _r(a.cross_curves.displacement_t, 2),
                                  "kn_m": _r(a.cross_curves.kn_m, 4)} for a in at_trims],
    }


def generated_sections(vt: VesselTables) -> dict[str, Any]:
    """The generated parts of a profile as plain TOML-ready data (rounded)."""
    g = vt.geometry
    h = vt.hydrostatics
    out: dict[str, Any] = {}
    out["vessel"] = {
        "lbp_m": _r(g.vessel.lbp_m, 4),
        "breadth_m": _r(g.vessel.breadth_m, 4),
        "depth_m": _r(g.vessel.depth_m, 4),
        "table_density_t_m3": _r(g.vessel.table_density_t_m3, 4),
    }
    out["hydrostatics"] = _hydro_section(h)
    cc = vt.cross_curves
    out["cross_curves"] = {"trim_basis": cc.trim_basis}
    if cc.trim_basis == "free trim":
        # the LCG the free-trim curves hold B in line with: the engine warns when G is far from it
        out["cross_curves"]["reference_lcg_m"] = _r(g.tables.trim_lcg_m, 4)
    out["cross_curves"].update({
        "heel_deg": _r(cc.heel_deg, 3),
        "displacement_t": _r(cc.displacement_t, 2),
        "kn_m": _r(cc.kn_m, 4),
    })
    if vt.downflooding is not None:
        out["downflooding"] = {
            "displacement_t": _r(vt.downflooding.displacement_t, 2),
            "angle_deg": _r(vt.downflooding.angle_deg, 2),
        }
    if vt.deck_edge is not None:
        out["deck_edge"] = {
            "displacement_t": _r(vt.deck_edge.displacement_t, 2),
            "angle_deg": _r(vt.deck_edge.angle_deg, 2),
        }
    if vt.windage is not None:
        w = vt.windage
        out["windage"] = {
            "draft_m": _r(w.draft_m, 4),
            "lateral_area_m2": _r(w.lateral_area_m2, 2),
            "centroid_above_wl_m": _r(w.centroid_above_wl_m, 4),
            "waterline_length_m": _r(w.waterline_length_m, 3),
        }
    tanks = []
    for t in vt.tanks:
        s = t.spec
        d: dict[str, Any] = {"id": s.id, "name": s.name, "kind": s.kind, "density_t_m3": _r(s.density_t_m3, 4)}
        d["capacity_m3"] = _r(t.calibration.volume_m3[-1], 4)
        if s.pair is not None:
            d["pair"] = s.pair
        if s.fs_category is not None:
            d["fs_category"] = s.fs_category
        d["worst_band_pct"] = _r(t.worst_band_pct, 1)
        c = t.calibration
        d["calibration"] = {
            "sounding_m": _r(c.sounding_m, 4),
            "volume_m3": _r(c.volume_m3, 4),
            "lcg_m": _r(c.lcg_m, 4),
            "vcg_m": _r(c.vcg_m, 4),
            "tcg_m": _r(c.tcg_m, 4),
            "fsi_m4": _r(c.fsi_m4, 4),
        }
        d["transfer"] = {
            "fill_pct": _r(t.transfer.fill_pct, 3),
            "heel_deg": _r(t.transfer.heel_deg, 3),
            "moment_m4": _r(t.transfer.moment_m4, TRANSFER_DECIMALS),
        }
        if t.transfer_port_m4 is not None:
            d["transfer"]["moment_port_m4"] = _r(t.transfer_port_m4, TRANSFER_DECIMALS)
        tanks.append(d)
    out["tank"] = tanks
    holds = []
    for ht in vt.holds:
        d = {
            "id": ht.spec.id,
            "name": ht.spec.name,
            "capacity_m3": _r(ht.capacity_m3, 3),
            "lcg_m": _r(ht.lcg_m, 4),
            "vcg_m": _r(ht.vcg_m, 4),
            "tcg_m": _r(ht.tcg_m, 4),
        }
        if ht.spec.max_mass_t is not None:
            d["max_mass_t"] = _r(ht.spec.max_mass_t, 3)
        d["fill_pct"] = _r(ht.fill_pct, 3)
        d["fill_vcg_m"] = _r(ht.fill_vcg_m, 4)
        d["fill_lcg_m"] = _r(ht.fill_lcg_m, 4)
        holds.append(d)
    out["hold"] = holds
    if vt.deck_areas:
        areas = []
        for a in vt.deck_areas:
            d = {
                "id": a.spec.id,
                "name": a.spec.name,
                "area_m2": _r(a.area_m2, 3),
                "lcg_m": _r(a.lcg_m, 4),
                "deck_height_m": _r(a.deck_height_m, 4),
                "tcg_m": _r(a.tcg_m, 4),
            }
            if a.spec.max_load_t_m2 is not None:
                d["max_load_t_m2"] = _r(a.spec.max_load_t_m2, 4)
            areas.append(d)
        out["deck_area"] = areas
    return out


def _stamp_model_conventions(new: dict[str, Any], gen: dict[str, Any], vessel: dict[str, Any]) -> None:
    """Generated tables are from the AP, + forward, + starboard.  Where the profile states another
    convention for its hand-entered tables (vessel_profiles/README.md, "Booklet conventions"),
    each generated table says its own, so that it is not read in the profile's.  Generated tables at
    trims are + by the stern: under a ``[vessel] trim_positive = "head"`` each says so itself."""
    if vessel.get("trim_positive", "stern") != "stern":
        for key in ("hydrostatics_at_trim", "cross_curves_at_trim"):
            if key in gen:
                for e in new.get(key, []):
                    e["trim_positive"] = "stern"
    x_other = vessel.get("longitudinal_datum", "AP") != "AP" or vessel.get("longitudinal_positive", "forward") != "forward"
    y_other = vessel.get("transverse_positive", "starboard") != "starboard"
    if not (x_other or y_other):
        return
    stamp: dict[str, Any] = {}
    if x_other:
        stamp.update(longitudinal_datum="AP", longitudinal_positive="forward")
    targets = [new[k] for k in ("hydrostatics", "cross_curves") if k in gen and x_other]
    targets += [e for e in new.get("hydrostatics_at_trim", []) if x_other and "hydrostatics_at_trim" in gen]
    for key in ("tank", "hold", "deck_area"):
        made = {e["id"] for e in gen.get(key, [])}
        targets += [e for e in new.get(key, []) if e.get("id") in made]
    for d in targets:
        d.update(stamp)
        if y_other and d is not new.get("hydrostatics") and d is not new.get("cross_curves") and "trim_m" not in d:
            d["transverse_positive"] = "starboard"


def merge_profile(existing: dict[str, Any] | None, gen: dict[str, Any], vt: VesselTables) -> tuple[dict[str, Any], list[str]]:
    """The refreshed profile: generated sections replaced, everything else kept.  Returns notes."""
    notes: list[str] = []
    old = dict(existing or {})
    new: dict[str, Any] = {}
    new["format"] = old.get("format", PROFILE_FORMAT)
    vessel = dict(old.get("vessel", {})) if isinstance(old.get("vessel"), dict) else {}
    gv = vt.geometry.vessel
    if "name" not in vessel:
        vessel["name"] = gv.name
    for k, v in gen["vessel"].items():
        vessel[k] = v
    vessel.setdefault("design_draft_m", _r(gv.design_draft_m, 4))
    vessel.setdefault("longitudinal_datum", "AP")
    new["vessel"] = vessel
    for key in ("hydrostatics", "cross_curves", "hydrostatics_at_trim", "cross_curves_at_trim", "downflooding",
                "deck_edge", "windage"):
        if key in gen:
            new[key] = gen[key]
    for key in ("hydrostatics_at_trim", "cross_curves_at_trim"):
        if key not in gen and old.get(key):
            notes.append(f"note: the profile's [[{key}]] tables are kept as they were, not recomputed from the "
                         "geometry: give --trims to recompute them")
    for key, label in (("tank", "tank"), ("hold", "hold"), ("deck_area", "deck area")):
        if key not in gen:
            continue
        made = {e["id"] for e in gen[key]}
        kept = [e for e in old.get(key, []) if isinstance(e, dict) and e.get("id") not in made]
        for e in kept:
            notes.append(f"note: {label} {e.get('id')!r} is not in the geometry file: kept as it was")
        new[key] = list(gen[key]) + kept
    _stamp_model_conventions(new, gen, vessel)
    for key, value in old.items():
        if key not in new:
            new[key] = value
    ordered = {k: new[k] for k in TOP_ORDER if k in new}
    ordered.update({k: v for k, v in new.items() if k not in ordered})
    return ordered, notes


def render(doc: dict[str, Any]) -> str:
    return reflow_number_arrays(tomli_w.dumps(doc))


_NUMBER_ITEM = re.compile(r"^\s*(-?[0-9][0-9eE.+\-]*|[+-]?(?:inf|nan)),$")
_WIDTH = 100


def reflow_number_arrays(text: str) -> str:
    """Fold tomli-w's one-number-per-line arrays into rows of numbers, for a readable profile.

    tomli-w writes a long array one element per line, which makes a generated profile
    17,000 lines long.  Each run of lines holding only numbers between an opening ``[``
    and its closing bracket becomes one inline array, wrapped at about 100 columns; an
    array of such arrays (KN, transfer moments) keeps one row per line.  Only layout
    changes: the TOML parses to the same values.
    """
    lines = text.split("\n")
    out: list[str] = []
    i = 0
    while i < len(lines):
        line = lines[i]
        if line.endswith("["):
            j = i + 1
            while j < len(lines) and _NUMBER_ITEM.match(lines[j]):
                j += 1
            if j > i + 1 and j < len(lines) and lines[j].strip() in ("]", "],"):
                numbers = [lines[k].strip()[:-1] for k in range(i + 1, j)]
                out.extend(_wrap(line, numbers, lines[j].strip()))
                i = j + 1
                continue
        out.append(line)
        i += 1
    return "\n".join(out)


def _wrap(opening: str, numbers: list[str], closing: str) -> list[str]:
    """``opening`` + numbers + ``closing`` on as few lines as fit in :data:`_WIDTH` columns."""
    head = opening[:-1]
    one = f"{head}[{', '.join(numbers)}{closing}"
    if len(one) <= _WIDTH:
        return [one]
    indent = " " * (len(head) - len(head.lstrip()) + 4)
    rows, row = [opening], indent
    for n in numbers:
        piece = f"{n}, "
        if len(row) + len(piece) > _WIDTH and row.strip():
            rows.append(row.rstrip())
            row = indent
        row += piece
    rows.append(row.rstrip())
    rows.append(" " * (len(indent) - 4) + closing)
    return rows


def _has_comments(text: str) -> bool:
    return any(line.lstrip().startswith("#") for line in text.splitlines())


def summary(vt: VesselTables) -> list[str]:
    """A few lines for the user: integration rule and the particulars at the design draft."""
    g = vt.geometry
    h = vt.hydrostatics
    t = g.vessel.design_draft_m
    n = len(g.hull.station_x_m)
    rule = "Simpson's first rule" if vt.hull_rule == "simpson" else "the trapezoidal rule (stations not equally spaced and odd in number)"
    lines = [f"hull integrated along {n} stations by {rule}; KN at {vt.cross_curves.trim_basis}"]
    if h.draft_m[0] <= t <= h.draft_m[-1]:
        def at(a: np.ndarray) -> float:
            return float(np.interp(t, h.draft_m, a))

        lines.append(
            f"at the design draft {t:g} m: displacement {at(h.displacement_t):.1f} t, KMt {at(h.kmt_m):.3f} m, "
            f"LCB {at(h.lcb_m):.3f} m, LCF {at(h.lcf_m):.3f} m, TPC {at(h.tpc_t_cm):.3f} t/cm, "
            f"Cb {at(h.cb):.3f}, Cw {at(h.cw):.3f}"
        )
    return lines


def parse_trims(text: str) -> list[float]:
    """``--trims`` as given: comma-separated numbers (m, + by the stern).  Raises ValueError naming
    the value and the rule (finite, not 0, no repeats, at most MAX_TABLES_AT_TRIMS)."""
    parts = [p.strip() for p in text.split(",")]
    trims: list[float] = []
    for p in parts:
        try:
            t = float(p)
        except ValueError:
            raise ValueError(f"--trims: {p!r} is not a number (give trims in m, + by the stern, "
                             "separated by commas, e.g. -1,-0.5,0.5,1)") from None
        if not np.isfinite(t):
            raise ValueError(f"--trims: {p!r} must be a finite number of metres")
        if abs(t) < 0.0005:
            raise ValueError(f"--trims: {p!r}: trim 0 is the even-keel table, which is always written; "
                             "give only the other trims")
        if any(abs(t - u) < 0.0005 for u in trims):
            raise ValueError(f"--trims: {p!r} is given twice (trims are written to the millimetre)")
        trims.append(t)
    if len(trims) > MAX_TABLES_AT_TRIMS:
        raise ValueError(f"--trims: {len(trims)} trims, more than the {MAX_TABLES_AT_TRIMS} allowed "
                         "(booklets print 4–10)")
    return sorted(trims)


def check_trims(trims: list[float], lbp_m: float, depth_m: float) -> None:
    """Each trim within the vessel's bound, the profile reader's rule
    (:func:`deckload.core.bounds.table_trim_range`).  Raises ValueError naming the value."""
    rng = table_trim_range(Particulars("", lbp_m, 1.0, depth_m, 0.5 * depth_m))
    for t in trims:
        why = rng.rule(t)
        if why is not None:
            raise ValueError(f"--trims: {t:g} m is {why}")


def build_profile_text(geometry_path: Path, existing_text: str | None, progress=None,
                       trims: list[float] | None = None) -> tuple[str, list[str]]:
    """The full profile text for a geometry and (optionally) an existing profile's text, with
    tables at ``trims`` when given.

    Returns the text and notes for the user (tanks kept from the old profile, a summary).
    """
    geometry = load_geometry(geometry_path)
    extra: list[str] = []
    if trims:
        check_trims(trims, geometry.vessel.lbp_m, geometry.vessel.depth_m)
    vt = build_tables(geometry, progress)
    gen = generated_sections(vt)
    if trims:
        if progress is not None:
            progress(f"hydrostatics and KN at {len(trims)} trim(s)")
        g = geometry.vessel
        at = tables_at_trims(hull_body(geometry), vt.hydrostatics.draft_m, vt.cross_curves.displacement_t,
                             vt.cross_curves.heel_deg, trims, g.table_density_t_m3, g.lbp_m, g.depth_m)
        gen.update(trimmed_sections(vt, at))
        if vt.cross_curves.trim_basis != "even keel":
            extra.append(f"[cross_curves] written at fixed trim 0 (trim_basis \"even keel\"), not "
                         f"{vt.cross_curves.trim_basis!r} as the geometry asks: the KN at trims are fixed-trim KN "
                         "and are interpolated in trim with it")
        extra.append("hydrostatics and KN at trims " + ", ".join(f"{t:+g}" for t in trims) + " m (+ by the stern)")
    existing = tomllib.loads(existing_text) if existing_text is not None else None
    doc, notes = merge_profile(existing, gen, vt)
    return render(doc), notes + summary(vt) + extra


def run_tables(geometry_path: Path, output_path: Path | None, trims_text: str | None = None) -> int:
    """The command: exit 0 when written, 1 on bad input, 2 when the profile (or its ``.bak``) cannot
    be written (message on stderr)."""
    start = time.perf_counter()
    trims = None
    if trims_text is not None:
        try:
            trims = parse_trims(trims_text)
        except ValueError as e:
            print(f"deckload tables: {e}", file=sys.stderr)
            return 1

    def progress(msg: str) -> None:
        print(f"deckload tables: {msg} ({time.perf_counter() - start:.1f} s)", file=sys.stderr, flush=True)

    existing_text = None
    existing_bytes = b""
    if output_path is not None:
        from deckload.io.outputs import OutputRefused, refuse_overwrites

        backup = output_path.with_name(output_path.name + ".bak")
        try:
            # the geometry read, a file of the voyage log; and the copy kept when comments are lost
            refuse_overwrites([output_path, backup], [(geometry_path, "the geometry file read")])
        except OutputRefused as e:
            print(f"deckload tables: {e}: nothing written; name another profile to write", file=sys.stderr)
            return 1
    from deckload.io.paths import exists_quietly

    if output_path is not None and exists_quietly(output_path):
        from deckload.io.limits import MAX_TOML_BYTES, read_limited

        try:
            existing_bytes = read_limited(output_path, MAX_TOML_BYTES, "a profile")
            existing_text = existing_bytes.decode("utf-8")
            tomllib.loads(existing_text)
        except (OSError, UnicodeDecodeError) as e:
            print(f"deckload tables: cannot read {output_path}: {e}", file=sys.stderr)
            return 1
        except tomllib.TOMLDecodeError as e:
            print(f"deckload tables: {output_path}: not valid TOML ({e}); the file was left untouched",
                  file=sys.stderr)
            return 1
        except (RecursionError, ValueError) as e:  # nesting too deep, an integer of too many digits
            print(f"deckload tables: {output_path}: cannot be read as TOML ({e or type(e).__name__}); "
                  "the file was left untouched", file=sys.stderr)
            return 1
    try:
        text, notes = build_profile_text(geometry_path, existing_text, progress, trims)
    except GeometryError as e:
        print(f"deckload tables: {len(e.problems)} problem(s) in the geometry file:", file=sys.stderr)
        for p in e.problems:
            print(f"  {p}", file=sys.stderr)
        return 1
    except (TableRangeError, NoEquilibriumError, TrimTableError, ValueError) as e:
        print(f"deckload tables: {geometry_path}: {e}", file=sys.stderr)
        return 1
    for n in notes:
        print(f"deckload tables: {n}", file=sys.stderr)
    if output_path is None:
        sys.stdout.write(text)
        return 0
    if existing_text == text:
        print(f"deckload tables: {output_path} is already up to date", file=sys.stderr)
        return 0
    if existing_text is not None and _has_comments(existing_text):
        # Atomic like the profile itself: a copy that fails half-way (a full disk) must not cost
        # the .bak kept from an earlier run.
        try:
            write_atomic(backup, existing_bytes)
        except OSError as e:
            print(f"deckload tables: cannot write {backup}: {e.strerror or e}; nothing written ({output_path} "
                  f"and {backup} are as they were)", file=sys.stderr)
            return 2
        print(f"deckload tables: {output_path} had comments, which a rewrite cannot keep; "
              f"the old file is saved as {backup}", file=sys.stderr)
    try:
        write_atomic(output_path, text)
    except OSError as e:
        print(f"deckload tables: cannot write {output_path}: {e.strerror or e}; it is as it was",
              file=sys.stderr)
        return 2
    print(f"deckload tables: wrote {output_path} ({time.perf_counter() - start:.1f} s). "
          "Check the tables against the approved stability booklet before relying on them.", file=sys.stderr)
    return 0
