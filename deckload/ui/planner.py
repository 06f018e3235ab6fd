"""The ballast planner's form: what is wanted, which tanks may be used, the proposal with its
before/after (as the transfer preview shows it); ⏎ on a proposal returns it, and the loading
screen commits it as one transfer.  The search is :func:`deckload.core.ballast_plan.propose`.
"""

from __future__ import annotations

from functools import partial

from rich.text import Text
from textual.app import ComposeResult
from textual.containers import Horizontal, Vertical
from textual.widgets import Input, Label, Static

from deckload.core.ballast_plan import MAX_TRANSFERS, Goal, NoPlan, Plan, plan
from deckload.core.model import Condition, Vessel
from deckload.core.result import Result
from deckload.ui import entry
from textual.binding import Binding

from deckload.ui.dialogs import Form, TankPicking, preview_lines
from deckload.ui.entry import EntryError
from deckload.ui.palette import P
from deckload.ui.widgets import LinePanel

TOLERANCE = {"list": 0.1, "trim": 0.01, "gm": 0.001}
"""How close a proposal must come: list 0.1°, trim 1 cm, GM at least the value (to the mm)."""


def goal_range(vessel: Vessel, quantity: str) -> tuple[float, float, str]:
    """The goals a vessel's own tables can reach: ``(lowest, highest, why)``.

    * list: within ± the KN table's last heel and never beyond 30° (common practice: no loading
      plan aims at a list beyond 30°; an equilibrium is found on the tabulated GZ curve only);
    * trim: within ± the hydrostatic table's greatest draft (derived: trim = T_aft − T_fwd with
      both ends between 0 and the greatest tabulated draft);
    * GM (fluid, at least): above 0 and at most the greatest tabulated KMt (derived: GM fluid =
      KMt − KG − FSC, with KG and FSC positive).
    """
    if quantity == "list":
        end = min(30.0, float(vessel.cross_curves.heel_deg[-1]))
        return -end, end, f"±{end:g}° (the KN table ends at {float(vessel.cross_curves.heel_deg[-1]):g}°; 30° at most)"
    if quantity == "trim":
        top = float(vessel.hydrostatics.draft_m[-1])
        return -top, top, f"±{top:.2f} m (the greatest tabulated draft)"
    top = float(max(vessel.hydrostatics.kmt_m))
    return 0.0, top, f"above 0 and at most {top:.3f} m (the greatest tabulated KMt)"


def parse_goal(text: str, vessel: Vessel) -> Goal:
    """'list 0', 'trim 0.5', 'gm 0.8' (GM fluid at least 0.8 m), within :func:`goal_range`."""
    words = text.replace("=", " ").split()
    if len(words) != 2 or words[0].lower() not in TOLERANCE:
        raise EntryError("Goal: list 0 (degrees, + stbd) · trim 0.5 (m, + by the stern) · gm 0.8 (GM fluid at least, m).")
    q = words[0].lower()
    # the one reader of typed numbers (entry.parse_number): '0_8', '1e1' or digits of another
    # script are refused here as in every other field, not read by Python's float() as 8, 10, 3
    value = entry.parse_number(words[1], f"{q} goal")
    low, high, why = goal_range(vessel, q)
    if not low <= value <= high or (q == "gm" and value <= 0.0):
        raise EntryError(f"A {q} of {value:g} is beyond what {vessel.particulars.name} can reach: "
                         f"a {q} goal is {why}.")
    return Goal(q, value, TOLERANCE[q])


def parse_tanks(vessel: Vessel, text: str) -> list[str]:
    ids = [w.strip().upper() for w in text.replace(",", " ").split() if w.strip()]
    unknown = [i for i in ids if i not in vessel.tank_index]
    if unknown:
        raise EntryError(f"Not tanks of {vessel.particulars.name}: {', '.join(unknown)}.")
    if len(ids) < 2:
        raise EntryError("Allow at least two tanks to pump between.")
    return ids


PLANNER_HINT = (f"Goal: list 0 · trim 0.5 · gm 0.8 (at least).  Tanks: the ones you allow.  ⏎ proposes (one "
                f"transfer, or up to {MAX_TRANSFERS}), ⏎ again applies it as one step · Esc cancels")


class PlannerForm(TankPicking, Form):
    """Goal and allowed tanks; ⏎ searches; ⏎ again on a shown proposal applies it (returned).
    The tanks field offers the tanks that match the word being typed (TankPicking)."""

    BINDINGS = [Binding("up", "pick(-1)", "Previous tank", show=False), Binding("down", "pick(1)", "Next tank", show=False),
                Binding("tab", "take_or_next", "Take / next field", show=False)]
    TANK_FIELDS = {"plan-tanks": True}

    def __init__(self, vessel: Vessel, condition: Condition, before: Result | None, evaluate):
        super().__init__()
        self._vessel, self._condition, self._before, self._evaluate = vessel, condition, before, evaluate
        self.proposal: Plan | None = None
        self.searching = False
        self._asked: tuple[str, str] | None = None

    def compose(self) -> ComposeResult:
        ballast = " ".join(t.id for t in self._vessel.tanks if t.kind == "ballast")
        with Vertical(classes="form transfer"):
            yield Label("Ballast planner: transfers to reach a list, a trim or a GM", classes="form-title")
            yield Label(PLANNER_HINT, classes="form-hint")
            for name, label, value in (("goal", "Goal", "list 0"), ("tanks", "Tanks", ballast)):
                with Horizontal(classes="xfer-row"):
                    yield Label(label, classes="xfer-label")
                    yield Input(value=value, id=f"plan-{name}", classes="xfer-field")
            yield LinePanel(id="xfer-preview")
            yield Static("", id="form-message")

    def on_mount(self) -> None:
        self.fit_preview(len(preview_lines(self._before, None, None)) + 1, PLANNER_HINT, 2)
        self.set_focus(self.query_one("#plan-goal", Input))
        self._update()

    def _update(self) -> None:
        """The preview panel: the tank list while a tank is being typed, else the proposal's
        before/after (or the condition before, with no proposal)."""
        panel = self.query_one("#xfer-preview", LinePanel)
        picking = self._picker_lines(int(panel.styles.height.value) if panel.styles.height else 8, panel.size.width)
        if picking is not None:
            panel.set_lines(picking)
            return
        panel.set_lines(preview_lines(self._before, self.proposal.result if self.proposal else None, None))

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        self.proposal = None
        self._update()

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        if self._take():  # ⏎ while a tank is being picked takes it; it searches nothing
            return
        asked = (self.query_one("#plan-goal", Input).value, self.query_one("#plan-tanks", Input).value)
        if self.proposal is not None and asked == self._asked:
            self.dismiss(self.proposal)
            return
        try:
            goal, tanks = parse_goal(asked[0], self._vessel), parse_tanks(self._vessel, asked[1])
        except EntryError as exc:
            self.refuse(str(exc))
            return
        if self.searching:
            self.query_one("#form-message", Static).update(Text("Still searching…  Esc cancels", P["dim"]))
            return
        # The search runs off the screen's thread (each step is a full calculation, a GM plan on
        # a loaded PC takes a second or so): the form stays live and says it is searching.
        self.searching, self._asked = True, asked
        self.query_one("#form-message", Static).update(Text("Searching…", P["dim"]))
        self.run_worker(partial(self._search, goal, tanks, asked), thread=True, exclusive=True, exit_on_error=False)

    def _search(self, goal: Goal, tanks: list[str], asked: tuple[str, str]) -> None:
        v = self._vessel
        try:
            found = plan(v, self._condition, goal, tanks, move=partial(entry.planner_move, v),
                         room=partial(entry.planner_room, v), evaluate=self._evaluate)
        except (ValueError, ArithmeticError) as exc:  # the calculation refused every step it was asked
            found = exc
        try:
            self.app.call_from_thread(self._found, goal, asked, found)
        except RuntimeError:  # the app closed while it searched: nobody to tell
            pass

    def _found(self, goal: Goal, asked: tuple[str, str], found) -> None:
        self.searching = False
        if not self.is_attached or asked != self._asked:
            return
        now = (self.query_one("#plan-goal", Input).value, self.query_one("#plan-tanks", Input).value)
        if now != asked:  # the fields changed while it searched: this answer is to another question
            self.query_one("#form-message", Static).update(Text("⏎ proposes for the goal and tanks as they are now.", P["dim"]))
            return
        if isinstance(found, Exception):
            self.refuse(f"The planner could not compute a step: {found}")
            return
        if isinstance(found, NoPlan):
            self.proposal = None
            self.query_one("#xfer-preview", LinePanel).set_lines(preview_lines(self._before, None, None))
            self.refuse(no_plan_words(goal, found))
            return
        if not found.transfers:  # she already meets it: nothing to apply
            self.proposal = None
            self.query_one("#xfer-preview", LinePanel).set_lines(preview_lines(self._before, None, None))
            self.query_one("#form-message", Static).update(Text(
                f"She already has {goal_words(goal, found.after)}: nothing to pump for this goal.", P["value"]))
            return
        self.proposal = found
        self.query_one("#xfer-preview", LinePanel).set_lines(preview_lines(self._before, found.result, None))
        self.query_one("#form-message", Static).update(Text(
            f"{plan_words(found)}: {goal_words(goal, found.after)}.  ⏎ applies · Esc cancels", P["value"]))


def transfers_words(transfers) -> str:
    """'Pump 16.6 t WB2P → DB3P, then 19.8 t FPT → DB3P'."""
    return "Pump " + ", then ".join(f"{t.mass_t:.1f} t {t.from_id} → {t.to_id}" for t in transfers)


def plan_words(p: Plan) -> str:
    return transfers_words(p.transfers)


def goal_words(goal: Goal, value: float) -> str:
    """The goal's quantity at ``value`` as the screens write it: list 0.1° P, trim 0.122 m A, GM fluid 0.944 m."""
    if goal.quantity == "list":
        return f"list {abs(value):.1f}°" + ("" if round(abs(value), 1) == 0 else " S" if value > 0 else " P")
    if goal.quantity == "trim":
        return f"trim {abs(value):.3f} m" + ("" if round(abs(value), 3) == 0 else " A" if value > 0 else " F")
    return f"GM fluid {value:.3f} m"


def no_plan_words(goal: Goal, why: NoPlan) -> str:
    """Why there is no plan, with the nearest the allowed tanks come and how."""
    want = (f"GM fluid at least {goal.target:.3f} m" if goal.quantity == "gm"
            else goal_words(goal, goal.target).replace(" m A", " m by the stern").replace(" m F", " m by the head"))
    how = f" after: {transfers_words(why.transfers).lower()}" if why.transfers else " (as she is)"
    upright = f", keeping the list within {why.list_limit_deg:.1f}°" if why.list_limit_deg is not None else ""
    return (f"No plan of up to {MAX_TRANSFERS} transfers between these tanks reaches {want}{upright}: the nearest "
            f"is {goal_words(goal, why.best)}{how}.  Allow other tanks or change the goal.")
