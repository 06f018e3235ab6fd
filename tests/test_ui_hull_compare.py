"""The loading screen's comparison with the hull: opens at once, fills in from a thread worker."""

from __future__ import annotations

from textual.widgets import Static

from deckload.core.model import Condition
from deckload.ui.hull_compare import HullCompareScreen
from deckload.ui.launch import create_app
from vessel_factories import box_barge
from demo_vessels import departure_app


def _body(app) -> str:
    return str(app.screen.query_one("#hull-compare-body", Static).render())


async def test_h_opens_the_comparison_and_the_worker_fills_it(tmp_path):
    app = departure_app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("h")
        assert isinstance(app.screen, HullCompareScreen)
        await app.workers.wait_for_complete()
        await pilot.pause()
        body = _body(app)
        assert "tables" in body and "direct" in body and "Draft aft" in body and "GZ at 30°" in body
        assert "judged on the tables" in body
        # the departure's GZ at 50° and 60° and area 30–θf are beyond UR L5 (standards.md §5.3): said first
        assert body.startswith("!! 3 of 17 rows beyond") and body.count("BEYOND") == 3
        await pilot.press("escape")
        assert not isinstance(app.screen, HullCompareScreen)


async def test_without_hull_geometry_it_says_so(tmp_path):
    app = create_app(box_barge(), Condition(name="Pilot"), work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("h")
        await pilot.pause()
        assert "names no hull geometry" in _body(app)


async def test_closing_at_once_leaves_the_loading_screen_live(tmp_path):
    """Esc right after the key closes the page whether or not the hull is done; a late result is
    dropped (nothing raises) and the loading screen takes keys again."""
    app = departure_app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("h")
        await pilot.pause()
        assert isinstance(app.screen, HullCompareScreen)
        await pilot.press("escape")
        await app.workers.wait_for_complete()
        await pilot.pause()
        assert not isinstance(app.screen, HullCompareScreen)
