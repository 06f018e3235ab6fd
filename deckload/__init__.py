"""deckload: loading and intact-stability calculations for a ship's officer.

It supports, and never replaces, the approved stability booklet, the master's
judgement and the rules of the flag State and classification society.
"""

import os as _os

__version__ = "0.1.0"

# One thread for the linear algebra, set before numpy is first imported (numpy reads these when
# its BLAS library loads, never again).  The largest system deckload solves is a 17×17 spline
# (a KN table of 17 heels); a BLAS thread pool costs more to start and to wake than such a solve
# takes, and on an onboard PC of one or two cores its spinning threads compete with the screen
# (measured: 'deckload calc' used 0.85× the CPU with one thread).  setdefault: a user's own
# setting wins.
for _var in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    _os.environ.setdefault(_var, "1")
del _var
