"""``deckload check`` benchmark, run by hand: ``python -m tests.benchmarks.bench_check [--runs N] [PROFILE ...]``.

Times the whole check of each demo profile (every ``*.toml`` profile in
``vessel_profiles/`` of a checkout, else the packaged demo) in-process, and its parts:
reading and validating the profile, the plausibility audit (deckload.core.audit plus
locating the findings) and the booklet conditions; then the same check as a fresh
``python -m deckload check`` process (interpreter start and imports included), which
is what a user waits for.  Target (issue 8): under 0.5 s with the audit.  The ratios
printed (audit ÷ read, check ÷ target) are what to read; absolute times depend on the
machine and its load.

Not a test: timing assertions in the test suite would fail on a busy machine.
"""

from __future__ import annotations

import argparse
import contextlib
import io
import os
import statistics
import subprocess
import sys
import time
from pathlib import Path

TARGET_S = 0.5


def _median_s(fn, runs: int) -> float:
    fn()  # warm-up: imports and caches
    times = []
    for _ in range(runs):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def profiles() -> list[Path]:
    from deckload.io import paths

    folder = Path(__file__).resolve().parents[2] / "vessel_profiles"
    found = sorted(p for p in folder.glob("*.toml")
                   if not p.name.endswith((".condition.toml", ".geometry.toml"))) if folder.is_dir() else []
    return found or [Path(paths.DEMO_PROFILE)]


def bench(path: Path, runs: int) -> dict[str, float]:
    from deckload.report.audit_findings import audit_profile
    from deckload.io.booklet_conditions import load_booklet_conditions
    from deckload.cli.check import run_check
    from deckload.io.profiles import load_profile

    vessel = load_profile(path)

    def quiet_check():
        with contextlib.redirect_stdout(io.StringIO()):
            run_check(path)

    out = {
        "read": _median_s(lambda: load_profile(path), runs),
        "audit": _median_s(lambda: audit_profile(path, vessel), runs),
        "booklet": _median_s(lambda: load_booklet_conditions(path, vessel), runs),
        "check": _median_s(quiet_check, runs),
    }
    env = dict(os.environ, PYTHONPATH=str(Path(__file__).resolve().parents[2]))

    def wall(cmd):
        walls = []
        for _ in range(max(3, runs // 4)):
            t0 = time.perf_counter()
            subprocess.run([sys.executable, *cmd], env=env, stdout=subprocess.DEVNULL,
                           stderr=subprocess.DEVNULL, check=False)
            walls.append(time.perf_counter() - t0)
        return statistics.median(walls)

    out["process"] = wall(["-m", "deckload", "check", str(path)])
    # side by side: a bare interpreter that only imports numpy, which every check must do
    out["numpy"] = wall(["-c", "import numpy"])
    return out


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(prog="python -m tests.benchmarks.bench_check", description=__doc__.splitlines()[0])
    ap.add_argument("--runs", type=int, default=20)
    ap.add_argument("profile", nargs="*", type=Path)
    args = ap.parse_args(argv)
    paths = args.profile or profiles()
    print(f"deckload check timing, median of {args.runs} in-process runs; target {TARGET_S:g} s with the audit")
    print(f"{'profile':<30} {'read':>8} {'audit':>8} {'booklet':>9} {'check':>8} {'process':>8} {'numpy':>8} "
          f"{'audit/read':>10} {'check/target':>12} {'process/numpy':>13}")
    worst = 0.0
    for p in paths:
        r = bench(p, args.runs)
        worst = max(worst, r["check"])
        print(f"{p.name:<30} {r['read'] * 1e3:6.1f}ms {r['audit'] * 1e3:6.1f}ms {r['booklet'] * 1e3:7.1f}ms "
              f"{r['check'] * 1e3:6.1f}ms {r['process'] * 1e3:6.0f}ms {r['numpy'] * 1e3:6.0f}ms "
              f"{r['audit'] / r['read']:10.2f} {r['check'] / TARGET_S:12.2f} {r['process'] / r['numpy']:13.2f}")
    print("in-process check: target met" if worst < TARGET_S else
          f"in-process check: TARGET MISSED: {worst:.3f} s > {TARGET_S:g} s")
    print("process = a fresh `python -m deckload check`; numpy = a fresh `python -c 'import numpy'` "
          "(the floor of any check on this machine)")
    print("deckload supports, and never replaces, the approved stability booklet, "
          "the master's judgement and flag-State and class rules.")
    return 0


if __name__ == "__main__":
    sys.exit(main())
