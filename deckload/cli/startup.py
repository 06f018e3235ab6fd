"""Start-up without the cyclic garbage collector.

A start of the loading screen makes some 90,000 objects the collector tracks, 50,000 of which
live until the program ends: modules, classes, the vessel, the screen.  Python's cyclic collector
runs after every 700 new objects and walks the young ones again and again while they are made:
about 120 collections, 20–40 ms of a 0.4 s start on the test machine (measured 3 December 2026;
``tests/benchmarks/bench_ui.py``).  So :func:`pause` stops the collector from the first line of
``deckload.cli.main.main`` until start-up is over:

* the loading screen resumes it once its first frame is drawn, and collects once then: what
  start-up left (some 600 cycles) goes at a moment no key waits for
  (``create_app(after_first_frame=resume_and_collect)``); what is left lives until the end
  (modules, classes, the vessel, the screen) and is frozen (``gc.freeze``): the collector's
  oldest generation, which one key in about 125 sets off, walked all of it each time (about
  45 ms of that key's CPU on the test machine; 17 ms after, 3 December 2026, ``bench_ui``'s keys);
* ``tables`` and ``log``, which may run long over large inputs, resume it before their work;
* the other commands read one profile and one condition and end before it would matter;
* ``main`` resumes it when it returns, whatever happened (the tests call ``main`` in one process).

Only a pause made here is resumed here: a collector the caller had switched off stays off.
"""

from __future__ import annotations

import gc

_paused = False


def pause() -> None:
    """Stop the cyclic collector for start-up (if it runs)."""
    global _paused
    if gc.isenabled():
        gc.disable()
        _paused = True


def resume() -> None:
    """Start-up is over: the collector runs again, if :func:`pause` stopped it."""
    global _paused
    if _paused:
        _paused = False
        gc.enable()


def resume_and_collect() -> None:
    """:func:`resume`, one collection of what start-up left (the screen, after its first frame), and
    what is left frozen: the collector never walks it again."""
    if _paused:
        resume()
        gc.collect()
        gc.freeze()
