"""Moment to change trim from the actual longitudinal metacentric height, and the trim it gives.

MCT 1 cm = Δ·GM_L/(100·LBP) with GM_L = KM_L − KG (standards.md §6.3, textbook;
Barrass & Derrett, *Ship Stability for Masters and Mates*, 5th ed., chapter on
MCTC).  A booklet's MCTC column cannot know KG: it is made with BM_L standing for
GM_L (common practice; checks.md §1.1 shows the size of it for a box barge,
13.2567 t·m/cm with GM_L against 13.6667 with BM_L), which makes the trim about
KG/BM_L too small — for a short, deep vessel several per cent.

Where the profile tabulates KM_L the moment is worked from the actual KG fluid:
GM_L = KM_L − KG_fluid, KM_L read at the table-equivalent displacement (the same
immersed volume, so the same KM_L whatever the water density) and Δ the actual
displacement.  Where it does not, the tabulated MCTC (scaled for density) is used
and the result carries a caution saying so.

The free-surface correction of KG is the transverse one (ΣFSM/Δ); using it for
the longitudinal height too lowers GM_L by FSC, a conservative choice (it makes
the trim slightly larger) whose size is FSC/GM_L, a fraction of a per cent for
any ship (common practice).
"""

from __future__ import annotations

from deckload.core.frozen import frozen
from deckload.core.hydrostatics import Upright
from deckload.core.loading import LoadingError
from deckload.core.model import CrossCurves, Vessel
from deckload.core.tables import bracket, lerp_row

BASIS_GML = "GML"
"""MCTC = Δ·(KML − KG fluid)/(100·LBP)."""
BASIS_TABLE = "table"
"""MCTC from the booklet's column (made with BML for GML)."""


class TrimError(LoadingError):
    """The condition has no longitudinal stability to trim with (KG above KM_L)."""


@frozen
class TrimMoment:
    """The moment to change trim used for a condition, and what it was taken from."""

    mctc_tm_cm: float
    """Moment to change trim 1 cm (t·m/cm) used for the trim."""
    basis: str
    """:data:`BASIS_GML` or :data:`BASIS_TABLE`."""
    kml_m: float | None
    """KM_L at the displacement (m) when the profile has it."""
    gml_m: float | None
    """GM_L = KM_L − KG fluid (m) when the profile has KM_L."""


def kml_at(vessel: Vessel, table_displacement_t: float) -> float | None:
    """KM_L (m) at a table-equivalent displacement, or None when the profile has no KM_L column."""
    h = vessel.hydrostatics
    if h.kml_m is None:
        return None
    i, f = bracket(h.displacement_t, table_displacement_t, "displacement (hydrostatic table, at table density)", "t")
    return float(lerp_row(h.kml_m, i, f))


def trim_moment(vessel: Vessel, hy: Upright, displacement_t: float, kg_fluid_m: float) -> TrimMoment:
    """MCT 1 cm for the actual KG where KM_L is known, else the tabulated one (module docstring)."""
    kml = kml_at(vessel, hy.table_displacement_t)
    if kml is None:
        return TrimMoment(hy.mctc_tm_cm, BASIS_TABLE, None, None)
    gml = kml - kg_fluid_m
    if not gml > 0.0:
        raise TrimError(f"KG fluid {kg_fluid_m:.6g} m is not below KML {kml:.3f} m: "
                        "no longitudinal stability, no trim can be computed")
    mctc = displacement_t * gml / (100.0 * vessel.particulars.lbp_m)
    return TrimMoment(mctc, BASIS_GML, kml, gml)


KN_REFERENCE_FRACTION = 0.01
"""G more than this fraction of LBP from the LCG the free-trim KN were made for draws a caution.

deckload's own threshold.  Free-trim cross curves hold B in line with one LCG at every
heel; with G elsewhere the vessel trims differently as she heels and her KN differ.
On the demo hull (38 m, by direct calculation from its geometry) 0.6 m (1.6 % of LBP)
moves KN by up to 9 mm and 1.6 m by up to 39 mm at 30°–45°, against UR L5's 5 cm."""


def kn_reference_note(cc: CrossCurves, lcg_m: float, lbp_m: float, trim_m: float) -> str | None:
    """A caution when G is far fore or aft of the LCG the free-trim KN were made for, else None.

    G off that LCG is what trims her, so the size of the error is that of the trim
    (:func:`kn_error_estimate_m`).  Curves that do not state their reference LCG
    (``cross_curves.reference_lcg_m``) cannot be judged and draw no note;
    vessel_profiles/README.md asks for the key.
    """
    if cc.trim_basis != "free trim" or cc.reference_lcg_m is None:
        return None
    off = lcg_m - cc.reference_lcg_m
    if abs(off) <= KN_REFERENCE_FRACTION * lbp_m:
        return None
    where = "forward of" if off > 0 else "abaft"
    size = max(1, round(100 * kn_error_estimate_m(trim_m, lbp_m)))
    return (f"G is {abs(off):.2f} m {where} the KN's free-trim LCG {cc.reference_lcg_m:.2f} m: "
            f"GZ may be off by up to about {size} cm")


EVEN_KEEL_TRIM_FRACTION = 0.01
"""Trim beyond this fraction of LBP draws a caution: the tables are for even keel.

deckload's own threshold.  Hydrostatic tables and KN made at even keel assume the
waterplane of an upright, untrimmed ship; trimmed, the waterplane and the immersed
ends change and the tables' draft, LCF, KMt and KN drift from the ship's.  Booklets
that give trimmed tables do so for this reason (MSC.1/Circ.1229 4.5 lets pre-programmed
booklet data differ 'for trims outside the booklet', standards.md §5.2)."""

EVEN_KEEL_KN_LIMIT_FRACTION = 0.015
"""Beyond this trim (fraction of LBP) even-keel KN cannot support a verdict on the criteria read
off the GZ curve: they are not assessable, and KN at trims are needed.

deckload's own bound, derived by direct calculation (``deckload calc --direct``'s free-trim solver,
:mod:`deckload.core.equilibrium`) of the free-trim GZ for a shifted LCG against the even-keel
free-trim GZ, the largest difference from 0° to 40°, on two hulls:

=========================================  ======  ======  ======  ======
hull, displacement (freeboard)              1 % L   1.5 % L  2 % L   3 % L
=========================================  ======  ======  ======  ======
box 40 × 10 × 4 m, T 1 m (3 m), KG 4.0      1.4 cm  3.1     5.4     11.5
box, T 2 m (2 m), KG 4.3                    0.9     1.9     3.3     7.0
box, T 3 m (1 m), KG 3.6                    0.5     1.0     1.8     3.9
Demo Islander 38 m, 480 t (2.7 m)           2.4     3.6     4.8     7.2
Demo Islander, 781 t (1.7 m)                0.5     0.9     1.3     2.3
=========================================  ======  ======  ======  ======

(the worse of trim by the head and by the stern; the box's GZ at 30° and 40° for KG 4.3 at 5.6 %
agree with an independent 3-D free-trim solution to 1 mm.)  A box's error grows
as the square of the trim (its ends are alike), a ship's about linearly.  At 1.5 % of LBP every case
stays within 3.6 cm, inside UR L5's 5 cm on KN (standards.md §5.3) with room for hulls not examined;
at 2 % one case already exceeds it, and at 5.6 % (a box trimmed 2.25 m) GZ at 30° was 0.438 m from
the even-keel table against 0.217 m.  MSC.1/Circ.1229 4.5 allows instruments on booklet data to
differ only "for trims outside the booklet" (standards.md §5.2), and IS 2008 A 2.1.7 asks limiting
curves to cover the operating trims: beyond the bound the trim is outside what the tables cover."""

KN_ERROR_PER_PCT_TRIM_M = 0.025
"""The caution's size of the GZ error of even-keel KN: 2.5 cm per 1 % of LBP of trim, the largest
rate in the table of :data:`EVEN_KEEL_KN_LIMIT_FRACTION` up to that bound (Demo Islander at 480 t,
2.4 cm at 1 %; the boxes' quadratic growth stays below it to 1.5 %)."""


def kn_error_estimate_m(trim_m: float, lbp_m: float) -> float:
    """deckload's estimate of how far even-keel KN (and so GZ) may be off at a trim (m): 2.5 cm per
    1 % of LBP (:data:`KN_ERROR_PER_PCT_TRIM_M`)."""
    return KN_ERROR_PER_PCT_TRIM_M * 100.0 * abs(trim_m) / lbp_m


def even_keel_kn_limit(trim_m: float, lbp_m: float) -> str | None:
    """Why the criteria read off the GZ curve cannot be judged from even-keel KN at this trim, or None
    within :data:`EVEN_KEEL_KN_LIMIT_FRACTION` of LBP."""
    if abs(trim_m) <= EVEN_KEEL_KN_LIMIT_FRACTION * lbp_m:
        return None
    way = "by the stern" if trim_m > 0 else "by the head"
    return (f"trim {abs(trim_m):.2f} m {way} ({100 * abs(trim_m) / lbp_m:.1f} % of LBP) is beyond what "
            f"even-keel KN tables cover ({100 * EVEN_KEEL_KN_LIMIT_FRACTION:g} % of LBP): KN tables at trims "
            "are needed; not assessable")


def even_keel_note(trim_m: float, lbp_m: float) -> str | None:
    """A caution when the trim is more than 1 % of LBP from the even keel the tables were made at,
    with the size of the GZ error (:func:`kn_error_estimate_m`) up to the bound of
    :data:`EVEN_KEEL_KN_LIMIT_FRACTION`, beyond which the criteria read off GZ are not assessed.

    Profiles with tables at several trims are judged by :func:`deckload.core.trimmed_tables.coverage`
    instead (a caution outside the trims covered); this rule stays for a set with the even-keel table alone."""
    if abs(trim_m) <= EVEN_KEEL_TRIM_FRACTION * lbp_m:
        return None
    way = "by the stern" if trim_m > 0 else "by the head"
    head = f"trim {abs(trim_m):.2f} m {way} ({100 * abs(trim_m) / lbp_m:.1f} % of LBP): the tables are for even keel; "
    if abs(trim_m) > EVEN_KEEL_KN_LIMIT_FRACTION * lbp_m:
        return head + (f"beyond {100 * EVEN_KEEL_KN_LIMIT_FRACTION:g} % of LBP the criteria read off the GZ curve "
                       "are not assessed (KN tables at trims needed); drafts less certain")
    size = max(1, round(100 * kn_error_estimate_m(trim_m, lbp_m)))
    return head + f"drafts less certain, and GZ may be off by up to about {size} cm (UR L5 allows 5 cm on KN)"
