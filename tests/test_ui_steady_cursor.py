"""A form's text field keeps a steady cursor (ui/widgets.SteadyInput): nothing on screen changes
while the officer reads a preview.  A blinking cursor repainted the field twice a second, and a
screen captured on a busy machine showed it in either half of the blink (a snapshot of the
transfer preview failed that way when the machine was loaded)."""

from __future__ import annotations

from textual.widgets import Input

from demo_vessels import departure_app


async def test_the_transfer_form_looks_the_same_a_second_later(tmp_path):
    """WB2P → 5 t typed; two screenshots 0.6 s apart (more than the 0.5 s blink) are identical, and
    every field on the form is a steady one."""
    app = departure_app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        for key in ["down"] * 9 + ["t", "5", "t"]:
            await pilot.press(key)
        await pilot.pause()
        fields = list(app.screen.query(Input))
        assert fields and not any(f.cursor_blink for f in fields)
        first = app.export_screenshot()
        await pilot.pause(0.6)  # past one 0.5 s half of a blink
        assert app.export_screenshot() == first
