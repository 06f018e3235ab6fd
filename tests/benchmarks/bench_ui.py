"""Loading-screen benchmark, run by hand: ``python -m tests.benchmarks.bench_ui [--keys N] [--rounds R] [--paints P] [--size 120x40]``.

Each app runs in its own process on a pseudo-terminal (the real terminal driver,
not the headless one), side by side in one run:

* **bare**: a minimal textual app whose key updates one label (the floor on this machine);
* **deckload**: the loading screen on the demo vessel's departure condition; the key
  nudges a ballast tank by 1 % (alternately up and down), which re-evaluates the
  condition, repaints what changed and hands the save of the working condition to the
  writer thread once the frame is drawn.

Both apps run on two cores and then pinned to one core (``taskset -c 0``, or the same
affinity set directly where taskset is missing), R rounds each, bare and deckload
alternately so that a busy neighbour weighs on both alike.

Measured, per app:

* key → frame: from posting the key event (as the terminal driver does) to the end of
  the next ``App._display`` call, i.e. the compositor's update written to the terminal.
  Not ``pilot.pause``, which polls.  Median and 90th percentile over N keys × R rounds,
  a pause of 50 ms between keys.
* cold start → first paint: from just before the process is forked to the end of the
  first ``App._display`` whose screen has every shown widget laid out (interpreter
  start-up, imports, reading the profile and the first evaluation included).  Median
  of the R rounds and P more starts that stop at first paint (``--paints P``, default 5);
  for deckload also where that time went.
* save queue: N keys in a row (each as soon as the previous frame is drawn, no pause),
  then quit at once: how many condition-file saves the writer made for the N changes
  (queued saves coalesce: the newest condition wins) and how long quitting waited for
  the last one to be on disk.
* peak RSS: ``ru_maxrss`` of the process at the end.

"(CPU)" is the main thread's CPU time over the same key → frame span: what the key
costs this process, whatever the neighbours do.  deckload's sources are compiled to
bytecode first (into a private folder), as an install does.

``--profile FILE`` instead runs deckload alone, its paced keys under cProfile, writes the
statistics to FILE and prints the heaviest calls (times inflated by the profiler: read it for
where a key's time goes, not for how much).

Targets (issue 13): key → frame at most 3× and first paint at most 1.6× the bare app's,
on two cores and on one; (issue 4) median key → frame ≤ 30 ms at 120×40, peak RSS ≤ 80 MiB.
"""

from __future__ import annotations

import json
import os
import pty
import select
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
KEY_TARGET, PAINT_TARGET = 3.0, 1.6


# --------------------------------------------------------------------------- child side


def _child(which: str, width: int, height: int, keys: int, out: str, spawned_at: float) -> None:
    import fcntl
    import struct
    import termios

    marks = {"started": time.time()}
    fcntl.ioctl(sys.stdout.fileno(), termios.TIOCSWINSZ, struct.pack("HHHH", height, width, 0, 0))
    sys.path.insert(0, str(ROOT))
    if which == "deckload":  # as deckload's main() does first (deckload.cli.startup)
        from deckload.cli import startup

        startup.pause()
    import asyncio
    import resource

    from textual import events
    from textual.app import App

    frame = {"event": None, "first": None}
    original = App._display

    def display(self, screen, renderable):
        original(self, screen, renderable)
        if renderable is None:
            return
        if frame["first"] is None and _laid_out(screen):
            frame["first"] = time.time()
            if keys == 0:  # a start-up run: first paint is all it measures
                self.exit()
        if frame["event"] is not None:
            frame["event"].set()

    App._display = display
    app = _bare_app() if which == "bare" else _deckload_app(marks)
    samples: list[float] = []
    queue: dict = {}

    cpu: list[float] = []
    profile_to = os.environ.get("DECKLOAD_BENCH_PROFILE") if which == "deckload" else None
    profiler = None
    if profile_to:
        import cProfile
        profiler = cProfile.Profile()

    async def press(i: int, profiled: bool = False) -> float:
        key = "plus" if i % 2 == 0 else "minus"
        frame["event"] = asyncio.Event()
        t0, c0 = time.perf_counter(), time.thread_time()
        ev = events.Key(key, "+" if key == "plus" else "-")
        ev.set_sender(app)
        if profiled and profiler is not None:
            profiler.enable()
        app._driver.send_message(ev)
        await frame["event"].wait()
        if profiled and profiler is not None:
            profiler.disable()
        frame["event"] = None
        cpu.append((time.thread_time() - c0) * 1000.0)
        return (time.perf_counter() - t0) * 1000.0

    async def drive() -> None:
        await asyncio.sleep(1.0)  # let start-up settle
        for i in range(keys):
            samples.append(await press(i, profiled=True))
            await asyncio.sleep(0.05)
        del cpu[keys:]
        if profiler is not None:
            profiler.dump_stats(profile_to)
        session = getattr(app, "session", None)
        if session is not None:
            session.flush()  # the paced keys' writes are not part of the burst
            before = app.saves[0]
        for i in range(keys):  # the burst: each key as soon as the previous frame is out
            await press(i)
        if session is not None:
            t0 = time.perf_counter()
            session.flush()  # what quitting does first
            queue.update(saves=app.saves[0] - before, quit_wait_ms=(time.perf_counter() - t0) * 1000.0)
        app.exit()

    def start() -> None:
        app._bench_task = asyncio.get_running_loop().create_task(drive())

    if keys:
        app.call_later(start)
    app.run()
    if getattr(app, "bench_tmp", None) is not None:
        shutil.rmtree(app.bench_tmp, ignore_errors=True)
    Path(out).write_text(json.dumps({
        "samples_ms": samples,
        "cpu_ms": cpu[:keys],
        "first_paint_s": frame["first"] - spawned_at,
        "phases_s": {k: v - spawned_at for k, v in marks.items()} | {"first paint": frame["first"] - spawned_at},
        "queue": queue,
        "peak_rss_mib": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0,
    }))


def _laid_out(screen) -> bool:
    """True once every shown widget with an id (the app's own panels) has a size and the loading
    board its lines (built at its real width when the layout's frame is drawn): the frame holds the
    screen (``tests/test_ui_repaint.py`` checks that this is the first frame drawn)."""
    widgets = [w for w in screen.query("*") if w.display and w.id]
    boards_filled = all(getattr(w, "rows", None) for w in widgets if type(w).__name__ == "LoadBoard")
    return bool(widgets) and boards_filled and all(w.size.area > 0 for w in widgets)


def _bare_app():
    from textual.app import App
    from textual.widgets import Label

    class Bare(App):
        BINDINGS = [("plus", "bump(1)", "+"), ("minus", "bump(-1)", "-")]
        n = 0

        def compose(self):
            yield Label("0", id="n")

        def action_bump(self, d: int) -> None:
            self.n += d
            self.query_one(Label).update(str(self.n))

    return Bare()


def _deckload_app(marks: dict):
    from deckload.io import paths
    from deckload.ui.launch import create_app, load_inputs

    marks["imports"] = time.time()
    tmp = Path(tempfile.mkdtemp(prefix="deckload-bench-"))
    start = load_inputs(None, paths.DEMO_CONDITIONS["departure"], tmp / "work")
    marks["profile and condition read"] = time.time()
    # As `deckload open` does: the screen starts from the result start-up's check made, and the
    # garbage collector paused for start-up runs again once the first frame is drawn.
    from deckload.cli import startup

    app = create_app(start.vessel, start.condition, work_dir=tmp / "work", log_dir=tmp / "logs", officer="BM",
                     result=start.result, after_first_frame=startup.resume_and_collect)
    marks["app made"] = time.time()
    app.bench_tmp = tmp
    save, app.saves = app.session._save, [0]

    def counted(path, condition):  # every condition-file save the session makes
        save(path, condition)
        app.saves[0] += 1

    app.session._save = counted
    return app


# --------------------------------------------------------------------------- parent side


def _compile(cache: Path) -> dict:
    """Compile deckload's sources into a private bytecode folder, as installing the package does,
    and return the environment that makes every child read it: first paint then measures start-up,
    not compiling ~100 source files (the bare app's textual is installed, compiled).  The checkout
    is not touched."""
    env = dict(os.environ, PYTHONPYCACHEPREFIX=str(cache))
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    subprocess.run([sys.executable, "-m", "compileall", "-q", str(ROOT / "deckload"), __file__], env=env, check=True)
    return env


def _run(which: str, width: int, height: int, keys: int, pinned: bool, env: dict) -> dict:
    out = tempfile.mktemp(prefix=f"bench-{which}-", suffix=".json")
    spawned_at = time.time()
    pid, fd = pty.fork()
    if pid == 0:  # child: exec a fresh interpreter so start-up is measured cold
        argv = [sys.executable, __file__, "--child", which, str(width), str(height), str(keys), out, repr(spawned_at)]
        if pinned:
            taskset = shutil.which("taskset")
            if taskset:
                os.execve(taskset, [taskset, "-c", "0", *argv], env)
            os.sched_setaffinity(0, {0})  # what taskset -c 0 does
        os.execve(sys.executable, argv, env)
    while True:  # drain the terminal output so the child never blocks on a full pty
        r, _, _ = select.select([fd], [], [], 0.5)
        if r:
            try:
                if not os.read(fd, 65536):
                    break
            except OSError:
                break
        done, status = os.waitpid(pid, os.WNOHANG)
        if done:
            break
    os.close(fd)
    try:
        return json.loads(Path(out).read_text())
    finally:
        Path(out).unlink(missing_ok=True)


def _pooled(runs: list[dict], starts: list[dict]) -> dict:
    samples = sorted(s for r in runs for s in r["samples_ms"])
    cpu = sorted(s for r in runs for s in r["cpu_ms"])
    phases = {k: statistics.median(r["phases_s"][k] for r in starts) for k in starts[0]["phases_s"]}
    return {
        "median": statistics.median(samples),
        "p90": samples[int(0.9 * (len(samples) - 1))],
        "cpu": statistics.median(cpu),
        "paint": statistics.median(r["first_paint_s"] for r in starts),
        "rss": max(r["peak_rss_mib"] for r in runs),
        "phases": phases,
        "queue": [r["queue"] for r in runs if r["queue"]],
    }


def main(argv: list[str]) -> int:
    if argv[:1] == ["--child"]:
        _child(argv[1], int(argv[2]), int(argv[3]), int(argv[4]), argv[5], float(argv[6]))
        return 0
    keys = int(argv[argv.index("--keys") + 1]) if "--keys" in argv else 60
    rounds = int(argv[argv.index("--rounds") + 1]) if "--rounds" in argv else 2
    paints = int(argv[argv.index("--paints") + 1]) if "--paints" in argv else 5
    size = argv[argv.index("--size") + 1] if "--size" in argv else "120x40"
    width, height = (int(x) for x in size.split("x"))
    if "--profile" in argv:  # one deckload run on two cores, its paced keys under cProfile
        to = Path(argv[argv.index("--profile") + 1]).resolve()
        env = dict(os.environ, DECKLOAD_BENCH_PROFILE=str(to))
        r = _run("deckload", width, height, keys, False, env)
        print(f"{keys} paced keys profiled (median {statistics.median(r['samples_ms']):.1f} ms a key under the "
              f"profiler): {to}")
        import pstats
        pstats.Stats(str(to)).sort_stats("cumulative").print_stats(40)
        return 0
    rev = subprocess.run(["git", "-C", str(ROOT), "rev-parse", "--short", "HEAD"], capture_output=True, text=True)
    print(f"deckload loading-screen benchmark, {width}×{height}, {keys} keys × {rounds} rounds, "
          f"first paint of {rounds + paints} starts, "
          f"{os.cpu_count()} CPUs, load {os.getloadavg()[0]:.1f}, commit {rev.stdout.strip() or 'none'}")
    print(f"{'':24}{'key→frame median':>17}{'p90':>9}{'(CPU)':>9}{'first paint':>13}{'peak RSS':>11}")
    verdicts = []
    pyc = tempfile.TemporaryDirectory(prefix="deckload-bench-pyc-")
    env = _compile(Path(pyc.name))
    for pinned, title in ((False, "two cores"), (True, "one core (taskset -c 0)")):
        runs: dict[str, list[dict]] = {"bare": [], "deckload": []}
        starts: dict[str, list[dict]] = {"bare": [], "deckload": []}
        for _ in range(rounds):
            for which in runs:
                runs[which].append(_run(which, width, height, keys, pinned, env))
                starts[which].append(runs[which][-1])
        for _ in range(paints):  # start-up only: more samples of first paint, still alternating
            for which in runs:
                starts[which].append(_run(which, width, height, 0, pinned, env))
        rows = {which: _pooled(r, starts[which]) for which, r in runs.items()}
        for which, r in rows.items():
            print(f"{title if which == 'bare' else '':24}{which:9}{r['median']:5.1f} ms{r['p90']:6.1f} ms"
                  f"{r['cpu']:6.1f} ms{r['paint']:10.2f} s{r['rss']:8.1f} MiB")
        b, d = rows["bare"], rows["deckload"]
        key_ratio, paint_ratio = d["median"] / b["median"], d["paint"] / b["paint"]
        print(f"{'':24}{'ratio':9}{key_ratio:5.2f}× (≤ {KEY_TARGET:g}×){d['cpu'] / b['cpu']:6.2f}×"
              f"{paint_ratio:6.2f}× (≤ {PAINT_TARGET:g}×){d['rss'] / b['rss']:6.2f}×")
        verdicts.append((title, key_ratio <= KEY_TARGET, paint_ratio <= PAINT_TARGET))
        phases = d["phases"]
        steps, last = [], 0.0
        for name, at in sorted(phases.items(), key=lambda kv: kv[1]):
            steps.append(f"{name} +{at - last:.2f} s")
            last = at
        print(f"{'':24}deckload's first paint: " + ", ".join(steps))
        for q in d["queue"]:
            print(f"{'':24}save queue, {keys} keys in a row: {q['saves']} saves written for {keys} changes, "
                  f"quitting waited {q['quit_wait_ms']:.0f} ms")
    for title, key_ok, paint_ok in verdicts:
        print(f"{title}: key→frame {'within' if key_ok else 'OVER'} {KEY_TARGET:g}×, first paint "
              f"{'within' if paint_ok else 'OVER'} {PAINT_TARGET:g}×")
    print("other targets: key→frame median ≤ 30 ms, peak RSS ≤ 80 MiB")
    pyc.cleanup()
    return 0


if __name__ == "__main__":
    raise SystemExit(main(sys.argv[1:]))
