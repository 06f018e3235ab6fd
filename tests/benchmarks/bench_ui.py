"""Loading-screen benchmark, run by hand: ``python -m tests.benchmarks.bench_ui [--keys N] [--size 120x40]``.

Each app runs in its own process on a pseudo-terminal (the real terminal driver,
not the headless one), side by side in one run:

* **bare**: a minimal textual app whose key updates one label (the floor on this machine);
* **deckload**: the loading screen on the demo vessel's departure condition; the key
  nudges a ballast tank by 1 % (alternately up and down), which re-evaluates the
  condition, saves the working condition atomically, appends to the voyage log
  (fsync) and repaints every panel.

Measured, per app:

* key → frame: from posting the key event (as the terminal driver does) to the end of
  the next ``App._display`` call, i.e. the compositor's update written to the terminal.
  Not ``pilot.pause``, which polls.  Median and 90th percentile over N keys.
* cold start → first paint: from just before the process is forked to the end of the
  first ``App._display`` whose screen has every shown widget laid out (interpreter
  start-up, imports, reading the profile and the first evaluation included).
* peak RSS: ``ru_maxrss`` of the process at the end.

Targets (issue 4): median key → frame ≤ 30 ms at 120×40, first paint ≤ 1.2 s,
peak RSS ≤ 80 MiB.
"""

from __future__ import annotations

import json
import os
import pty
import select
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]


# --------------------------------------------------------------------------- child side


def _child(which: str, width: int, height: int, keys: int, out: str, spawned_at: float) -> None:
    import fcntl
    import struct
    import termios

    fcntl.ioctl(sys.stdout.fileno(), termios.TIOCSWINSZ, struct.pack("HHHH", height, width, 0, 0))
    sys.path.insert(0, str(ROOT))
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
        if frame["event"] is not None:
            frame["event"].set()

    App._display = display
    app = _bare_app() if which == "bare" else _deckload_app()
    samples: list[float] = []

    async def drive() -> None:
        await asyncio.sleep(1.0)  # let start-up settle
        for i in range(keys):
            key = "plus" if i % 2 == 0 else "minus"
            frame["event"] = asyncio.Event()
            t0 = time.perf_counter()
            ev = events.Key(key, "+" if key == "plus" else "-")
            ev.set_sender(app)
            app._driver.send_message(ev)
            await frame["event"].wait()
            samples.append((time.perf_counter() - t0) * 1000.0)
            frame["event"] = None
            await asyncio.sleep(0.05)
        app.exit()

    def start() -> None:
        app._bench_task = asyncio.get_running_loop().create_task(drive())

    app.call_later(start)
    app.run()
    Path(out).write_text(json.dumps({
        "samples_ms": samples,
        "first_paint_s": frame["first"] - spawned_at,
        "peak_rss_mib": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0,
    }))


def _laid_out(screen) -> bool:
    """True once every shown widget with an id (the app's own panels) has a size and the loading
    board its lines (built at its real width, after the first layout): the frame holds the screen."""
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


def _deckload_app():
    from deckload.io import paths
    from deckload.ui.launch import create_app, load_inputs

    tmp = Path(tempfile.mkdtemp(prefix="deckload-bench-"))
    vessel, condition, _ = load_inputs(None, paths.DEMO_CONDITIONS["departure"], tmp / "work")
    app = create_app(vessel, condition, work_dir=tmp / "work", log_dir=tmp / "logs", officer="BM")
    return app


# --------------------------------------------------------------------------- parent side


def _run(which: str, width: int, height: int, keys: int) -> dict:
    out = tempfile.mktemp(prefix=f"bench-{which}-", suffix=".json")
    spawned_at = time.time()
    pid, fd = pty.fork()
    if pid == 0:  # child: exec a fresh interpreter so start-up is measured cold
        os.execv(sys.executable, [sys.executable, __file__, "--child", which, str(width), str(height),
                                  str(keys), out, repr(spawned_at)])
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
    return json.loads(Path(out).read_text())


def main(argv: list[str]) -> int:
    if argv[:1] == ["--child"]:
        _child(argv[1], int(argv[2]), int(argv[3]), int(argv[4]), argv[5], float(argv[6]))
        return 0
    keys = int(argv[argv.index("--keys") + 1]) if "--keys" in argv else 60
    size = argv[argv.index("--size") + 1] if "--size" in argv else "120x40"
    width, height = (int(x) for x in size.split("x"))
    rev = subprocess.run(["git", "-C", str(ROOT), "rev-parse", "--short", "HEAD"], capture_output=True, text=True)
    print(f"deckload loading-screen benchmark, {width}×{height}, {keys} keys, {os.cpu_count()} CPUs, "
          f"commit {rev.stdout.strip() or 'none'}")
    rows = {w: _run(w, width, height, keys) for w in ("bare", "deckload")}
    print(f"{'':10}{'key→frame median':>18}{'p90':>8}{'first paint':>13}{'peak RSS':>11}")
    for which, r in rows.items():
        s = sorted(r["samples_ms"])
        p90 = s[int(0.9 * (len(s) - 1))]
        print(f"{which:10}{statistics.median(s):15.1f} ms{p90:6.1f} ms{r['first_paint_s']:11.2f} s"
              f"{r['peak_rss_mib']:8.1f} MiB")
    b, d = rows["bare"], rows["deckload"]
    print(f"{'ratio':10}{statistics.median(d['samples_ms']) / statistics.median(b['samples_ms']):16.2f}×"
          f"{'':8}{d['first_paint_s'] / b['first_paint_s']:11.2f}×{d['peak_rss_mib'] / b['peak_rss_mib']:10.2f}×")
    print("targets: key→frame median ≤ 30 ms, first paint ≤ 1.2 s, peak RSS ≤ 80 MiB")
    return 0


if __name__ == "__main__":
    raise SystemExit(main(sys.argv[1:]))
