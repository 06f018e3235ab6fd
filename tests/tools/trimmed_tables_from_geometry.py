"""A loaded vessel given hydrostatics and KN at several trims from her own hull geometry.

The tables come from deckload/core/geometry/trimmed.py (formulas there), the same code as
``deckload tables GEOMETRY --trims …``; this only puts them into a :class:`Vessel` for the tests
(tests/test_trimmed_tables_demo.py, tests/test_tables_trims.py), with the table at trim 0 made the
same way (fixed trim), as the command writes it.
"""

from __future__ import annotations

import dataclasses

from deckload.core.geometry.trimmed import TableAtTrim, tables_at_trims
from deckload.core.model import TrimmedTables, Vessel, frozen_array

# The decimals ``deckload tables`` writes the tables at trims with (cli/tables.py
# ``_hydro_section``): half a unit of the last decimal, plus round-off.
ROUND = {"draft_m": 5e-5, "displacement_t": 5e-3, "lcb_m": 5e-5, "lcf_m": 5e-5, "kmt_m": 5e-5, "tpc_t_cm": 5e-5,
         "mctc_tm_cm": 5e-5, "vcb_m": 5e-5, "kml_m": 5e-4}
KN_ROUND = 5e-5


def tables_for(v: Vessel, trims, min_draft_m: float = 0.0) -> tuple[TableAtTrim, ...]:
    """Tables at ``trims`` (0 included or not) on the vessel's own draft and KN grids."""
    p, h, cc = v.particulars, v.hydrostatics, v.cross_curves
    return tables_at_trims(v.hull, h.draft_m[h.draft_m >= min_draft_m], cc.displacement_t, cc.heel_deg, trims,
                           p.table_density_t_m3, p.lbp_m, p.depth_m)


def trimmed_vessel(v: Vessel, trims, min_draft_m: float = 0.0) -> Vessel:
    """``v`` with tables at ``trims`` (which must include 0: it becomes the even-keel table)."""
    at = tables_for(v, trims, min_draft_m)
    zero = [a.trim_m for a in at].index(0.0)
    ts = frozen_array([a.trim_m for a in at])
    return dataclasses.replace(
        v, hydrostatics=at[zero].hydrostatics, cross_curves=at[zero].cross_curves,
        trimmed=TrimmedTables(ts, tuple(a.hydrostatics for a in at), ts, tuple(a.cross_curves for a in at)))
