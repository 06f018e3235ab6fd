"""The cyclic garbage collector is paused for start-up only (deckload/cli/startup.py).

``main`` pauses it first; the loading screen resumes it once its first frame is drawn (and
collects once); ``tables`` and ``log`` resume it before their work; ``main`` leaves it as it found
it, whatever the command did; a collector the caller had switched off is never switched on.
"""

from __future__ import annotations

import gc

import pytest

from deckload.cli import startup
from deckload.cli.main import main
from deckload.io import paths
from deckload.io.profiles import load_condition
from deckload.ui.launch import create_app
from demo_vessels import demo_vessel


@pytest.fixture
def collector():
    """The collector on before and after each test, whatever the test did."""
    was = gc.isenabled()
    gc.enable()
    yield
    startup.resume()
    (gc.enable if was else gc.disable)()


def test_main_pauses_the_collector_while_a_command_runs_and_leaves_it_as_it_was(collector, monkeypatch, capsys):
    seen = []
    import deckload.cli.calc as calc

    real = calc.run_calc
    monkeypatch.setattr(calc, "run_calc", lambda *a, **k: seen.append(gc.isenabled()) or real(*a, **k))
    assert main(["calc", "demo", "departure"]) == 0
    assert seen == [False] and gc.isenabled()
    capsys.readouterr()
    # a failing command: the collector is on again all the same
    assert main(["calc", "no-such-profile.toml", "no-such-condition.toml"]) != 0
    assert gc.isenabled()
    # switched off by the caller: main leaves it off
    gc.disable()
    assert main(["calc", "demo", "departure"]) == 0
    assert not gc.isenabled()
    capsys.readouterr()


@pytest.mark.parametrize("command, runner, module", [
    (["tables", "g.toml", "-o", "out.toml"], "run_tables", "deckload.cli.tables"),
    (["log", "verify"], "run_log", "deckload.cli.log"),
])
def test_the_long_commands_run_with_the_collector(collector, monkeypatch, command, runner, module):
    import importlib

    mod = importlib.import_module(module)
    seen = []
    monkeypatch.setattr(mod, runner, lambda *a, **k: seen.append(gc.isenabled()) or 0)
    assert main(command) == 0
    assert seen == [True]


async def test_the_screen_resumes_the_collector_after_its_first_frame(collector, tmp_path, monkeypatch):
    from textual.app import App

    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    at_frames: list[bool] = []
    display = App._display

    def spy(self, screen, renderable):
        display(self, screen, renderable)
        if renderable is not None:
            at_frames.append(gc.isenabled())

    monkeypatch.setattr(App, "_display", spy)
    collected, frozen = [], []
    monkeypatch.setattr(gc, "collect", lambda *a: collected.append(a) or 0)
    monkeypatch.setattr(gc, "freeze", lambda: frozen.append(len(collected)))
    startup.pause()
    assert not gc.isenabled()
    app = create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS",
                     after_first_frame=startup.resume_and_collect)
    async with app.run_test(size=(120, 40)) as pilot:
        for _ in range(3):
            await pilot.pause()
        assert at_frames and at_frames[0] is False  # the first frame was drawn during start-up
        assert gc.isenabled() and len(collected) == 1  # then the collector runs, after one collection
        assert frozen == [1]  # and what start-up left after it is frozen: no later collection walks it
