"""Benchmark, run by hand: ``python -m tests.benchmarks.bench_direct [--heels N]``.

The direct calculation of :mod:`deckload.core.equilibrium` for the demo vessel's departure
condition — equilibrium free in trim and heel for the actual G and the GZ curve at 19
heels (0–90°, 5° steps), drafts at the list — timed beside the same free-trim KN computed
with an independent reference, trimesh slicing a closed mesh of the same offsets
(``tests.benchmarks.bench_tables.ref_kn``), in one run; prints both times, their ratio, and how
far the two KN lie apart.  Targets (issue 10): direct equilibrium + GZ under 150 ms, at
least 10× faster than trimesh.  ``--heels N`` times the reference at only the first N
heels and scales its time to all 19 (printed as such).
"""

from __future__ import annotations

import argparse
import statistics
import sys
import time

import numpy as np


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(prog="python -m tests.benchmarks.bench_direct")
    ap.add_argument("--heels", type=int, default=19, help="heels the trimesh reference computes (1–19)")
    ap.add_argument("--repeat", type=int, default=7, help="timed runs of the direct method (median shown)")
    args = ap.parse_args(argv)

    from tests.benchmarks.bench_tables import GEOMETRY, hull_mesh, ref_kn
    from deckload.core.equilibrium import HEELS_DEG, compare, direct_state
    from deckload.core.stability import evaluate
    from deckload.io.geometry_files import load_geometry
    from deckload.io.paths import DEMO_CONDITIONS, DEMO_PROFILE
    from deckload.io.profiles import load_condition, load_profile

    v = load_profile(DEMO_PROFILE)
    c = load_condition(DEMO_CONDITIONS["departure"], v)
    t0 = time.perf_counter()
    r = evaluate(v, c)
    t_table = time.perf_counter() - t0
    args_direct = (v.hull, v.particulars.lbp_m, r.displacement_t, r.water_density_t_m3, r.lcg_m, r.kg_fluid_m,
                   r.tcg_m)
    direct_state(*args_direct)  # warm-up (imports, caches)
    times, cpu = [], []
    for _ in range(max(1, args.repeat)):
        t0, c0 = time.perf_counter(), time.process_time()
        d = direct_state(*args_direct)
        times.append(time.perf_counter() - t0)
        cpu.append(time.process_time() - c0)
    t_direct, c_direct = statistics.median(times), statistics.median(cpu)
    t0 = time.perf_counter()
    compare(v, r)
    t_compare = time.perf_counter() - t0

    n = max(1, min(args.heels, len(HEELS_DEG)))
    print(f"reference (trimesh slicing) at {n} heel(s); this takes a while …", file=sys.stderr, flush=True)
    mesh = hull_mesh(load_geometry(GEOMETRY).hull)
    vol = r.displacement_t / r.water_density_t_m3
    t0, c0 = time.perf_counter(), time.process_time()
    kn_ref = [ref_kn(mesh, vol, float(h), "free trim", r.lcg_m, r.kg_fluid_m)[0] for h in HEELS_DEG[:n]]
    t_ref = (time.perf_counter() - t0) * len(HEELS_DEG) / n
    c_ref = (time.process_time() - c0) * len(HEELS_DEG) / n
    diff = float(np.max(np.abs(np.array(kn_ref) - d.kn_m[:n])))

    print(f"demo departure: Δ {r.displacement_t:.1f} t, LCG {r.lcg_m:.3f} m, KG fluid {r.kg_fluid_m:.3f} m")
    print("wall time is what a user waits on a busy machine; CPU time is the work done (it does not")
    print("grow when other processes share the processor)")
    print(f"{'part':50s} {'wall':>10s} {'CPU':>10s}")
    print(f"{'table method, whole evaluate()':50s} {t_table * 1000:8.1f} ms")
    print(f"{'direct: equilibrium + GZ, 19 heels (median of %d)' % len(times):50s} {t_direct * 1000:8.1f} ms"
          f" {c_direct * 1000:8.1f} ms")
    print(f"{'direct: compare() beside the tables':50s} {t_compare * 1000:8.1f} ms")
    scaled = "" if n == len(HEELS_DEG) else f" (scaled from {n})"
    print(f"{'trimesh: free-trim KN, 19 heels' + scaled:50s} {t_ref * 1000:8.1f} ms {c_ref * 1000:8.1f} ms")
    print(f"ratio trimesh / direct: {t_ref / t_direct:.1f}× wall, {c_ref / c_direct:.1f}× CPU   "
          "(target ≥ 10×; direct target < 150 ms)")
    print(f"largest KN difference direct − trimesh over {n} heel(s): {diff * 1000:.1f} mm (UR L5: 50 mm)")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
