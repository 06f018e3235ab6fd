"""The invented 22 m box vessel of ``box_profile_text.fv22_text`` as the audit tests change it.

Shared by the ``test_audit_*`` files: the vessel read from its profile text, one of its tables
with columns replaced, and the findings of given checks.
"""

from __future__ import annotations

import dataclasses
import functools

import numpy as np

from box_profile_text import fv22_text
from deckload.core.audit import audit
from deckload.core.model import frozen_array
from deckload.io.profiles import parse_profile


@functools.cache
def vessel():
    """The box vessel, read once per process: the audit tests ask for it some 2000 times, and the
    model is immutable (frozen dataclasses, read-only arrays), so every test may share it."""
    return parse_profile(fv22_text(), "fv22.toml")


def with_hydro(v=None, **cols):
    """``v`` (the box vessel if None) with hydrostatic columns replaced; a column given as None
    is removed (an optional column left out of the booklet)."""
    v = v or vessel()
    return dataclasses.replace(v, hydrostatics=dataclasses.replace(
        v.hydrostatics, **{k: (None if a is None else frozen_array(np.asarray(a, dtype=float))) for k, a in cols.items()}))


def found(v, *checks):
    """The audit's findings of ``v`` made by the named checks, in the audit's order."""
    return [f for f in audit(v) if f.check in checks]
