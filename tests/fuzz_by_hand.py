"""The long fuzz run, by hand (beside the benchmarks; not collected by pytest).

    python tests/fuzz_by_hand.py [CASES] [SEED]      # default 100,000 cases, seed 12

Runs CASES mutated profiles, conditions and typed amounts through the generator and oracle
of ``tests/fuzz_cases.py`` and prints the counts: accepted, refused, tracebacks, non-finite
outputs and impossible inputs accepted, with up to 20 failing cases in full.  Exit status 0
when there are no failures.  About 4 ms a case on one core: 100,000 take 7–10 minutes.
"""

from __future__ import annotations

import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))
sys.path.insert(0, str(Path(__file__).resolve().parent))

import fuzz_cases  # noqa: E402


def main(argv: list[str]) -> int:
    n = int(argv[0]) if argv else 100_000
    seed = int(argv[1]) if len(argv) > 1 else 12
    t0 = time.perf_counter()

    def progress(i: int, tally) -> None:
        if i % 10_000 == 0:
            print(f"  {i:>7} cases, {time.perf_counter() - t0:6.0f} s: {tally.failures} failures", flush=True)

    tally = fuzz_cases.run(n, seed, progress=progress)
    print(tally.summary())
    print(f"{time.perf_counter() - t0:.0f} s, {1000 * (time.perf_counter() - t0) / n:.2f} ms a case")
    for what, case, detail in tally.examples:
        print(f"--- {what}\n{case}\n{detail}")
    return 0 if tally.failures == 0 else 1


if __name__ == "__main__":
    raise SystemExit(main(sys.argv[1:]))
