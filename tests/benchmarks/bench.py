"""Engine recompute benchmark, run by hand: ``python -m tests.benchmarks.bench [--runs N] [--profile]``.

Times :func:`deckload.core.stability.evaluate` — the whole recompute after one edit —
for each demo condition and for synthetic vessels of 30, 100 and 300 loaded items,
and prints the medians side by side with the targets of issue 2 (≤ 1 ms median for a
demo condition, ≤ 5 ms at 300 items, cost growing linearly with the item count).
All figures come from one run on one machine, so the ratios between them are what
to read; absolute times depend on the machine and its load.

If a target is missed (or with ``--profile``) the slowest case is profiled with
cProfile and the functions where the time goes are printed.

Not a test: timing assertions in the test suite would fail on a busy machine.
The synthetic vessels are built by ``tests/vessel_factories.py`` (a checkout is needed
for them); the demo conditions are read through ``deckload.io.profiles``.
"""

from __future__ import annotations

import argparse
import cProfile
import gc
import io
import pstats
import statistics
import sys
import time
from pathlib import Path

from deckload.core.stability import evaluate

DEMO_TARGET_MS = 1.0
LARGE_TARGET_MS = 5.0
SIZES = (30, 100, 300)
CAUTION = ("deckload supports, and never replaces, the approved stability booklet, "
           "the master's judgement and flag-State and class rules.")


def median_ms(fn, runs: int, warmup: int = 20) -> tuple[float, float]:
    """Median and 90th-percentile wall time of ``fn()`` in ms over ``runs`` calls (GC off while timing)."""
    for _ in range(warmup):
        fn()
    times = []
    was = gc.isenabled()
    gc.disable()
    try:
        for _ in range(runs):
            t0 = time.perf_counter_ns()
            fn()
            times.append(time.perf_counter_ns() - t0)
    finally:
        if was:
            gc.enable()
    times.sort()
    return statistics.median(times) / 1e6, times[int(0.9 * (len(times) - 1))] / 1e6


def demo_cases() -> tuple[list[tuple[str, object, object]], str]:
    """(name, vessel, condition) for each demo condition, or an explanation of why there are none."""
    try:
        from deckload.io import paths
        from deckload.io import profiles
    except ImportError as e:
        return [], f"demo conditions not timed: deckload.io.profiles is missing ({e})"
    load_profile = getattr(profiles, "load_profile", None)
    load_condition = getattr(profiles, "load_condition", None)
    if load_profile is None or load_condition is None:
        return [], "demo conditions not timed: deckload.io.profiles has no load_profile/load_condition"
    if not paths.DEMO_PROFILE.is_file():
        return [], f"demo conditions not timed: {paths.DEMO_PROFILE} is missing"
    try:
        vessel = load_profile(paths.DEMO_PROFILE)
    except profiles.ProfileError as e:
        return [], f"demo conditions not timed: the demo profile does not load:\n{e}"
    cases = []
    missing = []
    for name, path in paths.DEMO_CONDITIONS.items():
        if not path.is_file():
            missing.append(path.name)
            continue
        try:
            cases.append((f"demo {name}", vessel, load_condition(path, vessel)))
        except profiles.ProfileError as e:
            missing.append(f"{path.name} (does not load: {e})")
    note = f"missing demo conditions: {', '.join(missing)}" if missing else ""
    return cases, note


def synthetic_cases() -> tuple[list[tuple[str, int, object, object]], str]:
    tests_dir = Path(__file__).resolve().parents[2] / "tests"
    if not (tests_dir / "vessel_factories.py").is_file():
        return [], "synthetic vessels not timed: tests/vessel_factories.py not found (run from a checkout)"
    sys.path.insert(0, str(tests_dir))
    try:
        from vessel_factories import synthetic_vessel
    finally:
        sys.path.remove(str(tests_dir))
    out = []
    for n in SIZES:
        v, c = synthetic_vessel(n)
        out.append((f"synthetic {n} items ({len(v.tanks)} tanks)", n, v, c))
    return out, ""


def profile(vessel, condition, runs: int, top: int = 18) -> str:
    """cProfile of ``runs`` evaluations: the functions by own time, then by cumulative time."""
    pr = cProfile.Profile()
    pr.enable()
    for _ in range(runs):
        evaluate(vessel, condition)
    pr.disable()
    buf = io.StringIO()
    st = pstats.Stats(pr, stream=buf).strip_dirs()
    st.sort_stats("tottime").print_stats(top)
    st.sort_stats("cumulative").print_stats(top)
    return buf.getvalue()


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(prog="python -m tests.benchmarks.bench", description=__doc__.split("\n\n")[0])
    ap.add_argument("--runs", type=int, default=400, help="timed runs per case (at least 200; default 400)")
    ap.add_argument("--profile", action="store_true", help="always print a cProfile of the slowest case")
    args = ap.parse_args(argv)
    runs = max(200, args.runs)

    print(f"deckload engine benchmark: evaluate(vessel, condition), median of {runs} runs, GC off while timing")
    print(CAUTION)
    print()
    rows = []  # (label, median, p90, target)
    demos, demo_note = demo_cases()
    for label, v, c in demos:
        med, p90 = median_ms(lambda: evaluate(v, c), runs)
        rows.append((label, med, p90, DEMO_TARGET_MS, (v, c)))
    synth, synth_note = synthetic_cases()
    per_size = {}
    for label, n, v, c in synth:
        med, p90 = median_ms(lambda: evaluate(v, c), runs)
        per_size[n] = med
        rows.append((label, med, p90, LARGE_TARGET_MS if n == max(SIZES) else None, (v, c)))

    w = max((len(r[0]) for r in rows), default=20)
    print(f"{'case':<{w}}  {'median ms':>9}  {'p90 ms':>7}  {'target ms':>9}  {'median/target':>13}  verdict")
    missed = []
    for label, med, p90, target, _ in rows:
        if target is None:
            print(f"{label:<{w}}  {med:9.3f}  {p90:7.3f}  {'—':>9}  {'—':>13}")
            continue
        ratio = med / target
        ok = ratio <= 1.0
        if not ok:
            missed.append(label)
        print(f"{label:<{w}}  {med:9.3f}  {p90:7.3f}  {target:9.1f}  {ratio:13.2f}  {'meets' if ok else 'MISSES'}")
    for note in (demo_note, synth_note):
        if note:
            print(note)

    if len(per_size) == len(SIZES):
        a, b, c3 = (per_size[n] for n in SIZES)
        slope = (c3 - a) / (SIZES[2] - SIZES[0])
        print()
        print("growth with item count (linear cost ⇒ time ≈ fixed + slope·n):")
        print(f"  slope {slope * 1000:.2f} µs per item; fixed part ≈ {a - slope * SIZES[0]:.3f} ms")
        predicted_100 = a + slope * (SIZES[1] - SIZES[0])
        print(f"  {SIZES[1]} items: measured {b:.3f} ms, straight line through {SIZES[0]} and {SIZES[2]} "
              f"predicts {predicted_100:.3f} ms (ratio {b / predicted_100:.2f}; 1.00 = linear)")
        print(f"  time ratio {SIZES[2]}/{SIZES[1]} items = {c3 / b:.2f} (item ratio {SIZES[2] / SIZES[1]:.2f})")

    if (missed or args.profile) and rows:
        slow = max(rows, key=lambda r: r[1] / (r[3] or LARGE_TARGET_MS))
        print()
        print(f"profile of {slow[0]} ({min(runs, 300)} runs):")
        print(profile(*slow[4], runs=min(runs, 300)))
    return 1 if missed else 0


if __name__ == "__main__":
    raise SystemExit(main())
