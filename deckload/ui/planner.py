"""The ballast planner's form: what is wanted, which tanks may be used, the proposal with its
before/after (as the transfer preview shows it); ⏎ on a proposal returns it, and the loading
screen commits it as one transfer.  The search is :func:`deckload.core.ballast_plan.propose`.
"""

from __future__ import annotations

import math
from functools import partial

from rich.console import Console
from rich.text import Text
from textual.app import ComposeResult
from textual.containers import Horizontal, Vertical
from textual.widgets import Input, Label, Static

from deckload.core.ballast_plan import MAX_TRANSFERS, READING_TOLERANCE_T, Goal, NoPlan, Plan, as_shown, met, plan
from deckload.core.free_surface import band_text, pct_text
from deckload.core.trim import EVEN_KEEL_KN_LIMIT_FRACTION
from deckload.core.model import Condition, Vessel
from deckload.core.result import Result
from deckload.ui import entry, views
from textual.binding import Binding

from deckload.ui.dialogs import Form, TankPicking, preview_lines
from deckload.ui.entry import EntryError
from deckload.ui.palette import P
from deckload.ui.widgets import LinePanel, SteadyInput

TOLERANCE = {"list": 0.1, "trim": 0.01, "gm": 0.001}
"""How close a proposal must come: list 0.1°, trim 1 cm, GM at least the value (to the mm)."""


def goal_range(vessel: Vessel, quantity: str) -> tuple[float, float, str]:
    """The goals a vessel's own tables can reach: ``(lowest, highest, why)``.

    * list: within ± the KN table's last heel and never beyond 30° (common practice: no loading
      plan aims at a list beyond 30°; an equilibrium is found on the tabulated GZ curve only);
    * trim: within ± the hydrostatic table's greatest draft (derived: trim = T_aft − T_fwd with
      both ends between 0 and the greatest tabulated draft), and within what her KN tables can
      judge: ± EVEN_KEEL_KN_LIMIT_FRACTION of LBP with even-keel KN only (beyond it the criteria
      read off GZ are not assessable, core/trim.py), else the trims her KN tables are given at.
      A trim goal beyond is refused: a plan to it would leave her with no verdict;
    * GM (fluid, at least): above 0 and at most the greatest tabulated KMt (derived: GM fluid =
      KMt − KG − FSC, with KG and FSC positive).
    """
    if quantity == "list":
        end = min(30.0, float(vessel.cross_curves.heel_deg[-1]))
        return -end, end, f"±{end:g}° (the KN table ends at {float(vessel.cross_curves.heel_deg[-1]):g}°; 30° at most)"
    if quantity == "trim":
        top = float(vessel.hydrostatics.draft_m[-1])
        trims = vessel.trimmed.kn_trim_m if vessel.trimmed is not None else ()
        if len(trims) > 1:
            lo, hi = max(-top, float(min(trims))), min(top, float(max(trims)))
            return lo, hi, (f"{lo:+.2f} to {hi:+.2f} m (her KN tables are given at trims {float(min(trims)):+.2f} to "
                            f"{float(max(trims)):+.2f} m; the greatest tabulated draft is {top:.2f} m)")
        kn = EVEN_KEEL_KN_LIMIT_FRACTION * vessel.particulars.lbp_m
        if kn < top:
            return -kn, kn, (f"±{kn:.2f} m ({100 * EVEN_KEEL_KN_LIMIT_FRACTION:g} % of LBP: beyond it her even-keel KN "
                             "tables cannot judge the criteria read off the GZ curve)")
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
    """The tanks typed, as the profile spells them (matched without regard to case, an id that
    matches two differing only in case refused: entry.tank_id); each once, at least two, and two
    at least holding the same liquid (a transfer moves one kind only)."""
    words = [w.strip() for w in text.replace(",", " ").split() if w.strip()]
    ids, unknown = [], []
    for w in words:
        try:
            ids.append(entry.tank_id(vessel, w))
        except entry.AmbiguousId:
            raise
        except EntryError:
            unknown.append(w)
    if unknown:
        raise EntryError(f"Not tanks of {vessel.particulars.name}: {', '.join(unknown)}.")
    twice = sorted({i for i in ids if ids.count(i) > 1}, key=ids.index)
    if twice:
        raise EntryError(f"Named more than once: {', '.join(twice)}.  Name each tank once.")
    if len(ids) < 2:
        raise EntryError("Allow at least two tanks to pump between.")
    kinds = [vessel.tank(i).kind for i in ids]
    if len(set(kinds)) == len(kinds):
        held = ", ".join(f"{i} {k.replace('_', ' ')}" for i, k in zip(ids, kinds))
        raise EntryError(f"These tanks hold different liquids ({held}): a transfer moves one kind only; "
                         "allow two tanks or more of one liquid.")
    return ids


def fitted_lines(before: Result | None, after: Result | None, notes: list[str], width: int,
                 rows: int) -> list[Text]:
    """The before/after rows (:func:`preview_lines`) and the plan's notes (⚠, wrapped to ``width``:
    never cut), in ``rows`` rows as far as they go.  When they do not, the less important rows give
    way, in this order: criteria that are ok before and after fold into one line saying how many;
    the three drafts share one line; then the notes move up above the criteria rows, so that what
    the plan leaves unsafe is read first and only criteria rows are left below the panel's edge
    (the form scrolls them: PgDn)."""
    full = preview_lines(before, after, None)
    noted: list[Text] = []
    console = Console(width=max(10, width))
    for n in notes:
        noted.extend(Text(f"⚠ {n}", P["caution"]).wrap(console, max(10, width)))
    if len(full) + len(noted) <= rows:
        return full + noted
    ref = before or after
    head, drafts, crit = full[:4], full[4:7], full[7:]
    if ref is None or len(crit) != len(ref.criteria):  # not the table this was written for: nothing folded
        return full + noted
    after_by_id = {c.id: c for c in after.criteria} if after is not None else {}

    def met(c) -> bool:  # c is before's (after's with no before): ok in every column shown
        shown = ([c] if before is not None else []) + ([after_by_id[c.id]] if c.id in after_by_id else [])
        return bool(shown) and all(views.verdict(x)[0] == "ok" for x in shown)

    kept = [line for line, c in zip(crit, ref.criteria) if not met(c)]
    folded = len(crit) - len(kept)
    if folded >= 2:
        both = "before and after" if before is not None and after is not None else "as she is"
        crit = kept + [Text(f"{'Criteria':<14}" + (f"all {folded} ok {both}" if not kept else f"{folded} more ok {both}")
                            + " (rows folded for room)", P["dim"])]
    if len(head) + len(drafts) + len(crit) + len(noted) <= rows:
        return head + drafts + crit + noted

    def draft(label: str, get) -> str:
        b, a = (get(r) if r is not None else None for r in (before, after))
        return f"{label} " + " → ".join(f"{x:.3f}" for x in (b, a) if x is not None)

    one = Text(f"{'Drafts, m':<14}", P["label"])
    one.append("  ".join((draft("aft", lambda r: r.draft_aft_m), draft("mid", lambda r: r.draft_mean_m),
                          draft("fwd", lambda r: r.draft_fwd_m))), P["value"])
    if len(head) + 1 + len(crit) + len(noted) <= rows:
        return head + [one] + crit + noted
    return head + [one] + noted + crit


PLANNER_HINT = (f"Goal: list 0 · trim 0.5 · gm 0.8 (at least).  Tanks: the ones you allow.  ⏎ proposes (one "
                f"transfer, or up to {MAX_TRANSFERS}), ⏎ again applies it as one step · Esc cancels")


class PlannerForm(TankPicking, Form):
    """Goal and allowed tanks; ⏎ searches; ⏎ again on a shown proposal applies it (returned).
    The tanks field offers the tanks that match the word being typed (TankPicking)."""

    BINDINGS = [Binding("up", "pick(-1)", "Previous tank", show=False), Binding("down", "pick(1)", "Next tank", show=False),
                Binding("tab", "take_or_next", "Take / next field", show=False),
                # the panel's rows below (or above) its edge, when it says there are some
                Binding("pagedown", "page(1)", "Rows below", show=False),
                Binding("pageup", "page(-1)", "Rows above", show=False)]
    TANK_FIELDS = {"plan-tanks": True}

    def __init__(self, vessel: Vessel, condition: Condition, before: Result | None, evaluate):
        super().__init__()
        self._vessel, self._condition, self._before, self._evaluate = vessel, condition, before, evaluate
        self.proposal: Plan | None = None
        self.searching = False
        self._asked: tuple[str, str] | None = None
        self._notes: list[str] = []
        self._message = Text("")
        self._offset = 0
        """The first of the panel's rows shown (PgDn/PgUp), when they are more than it has."""

    def compose(self) -> ComposeResult:
        ballast = " ".join(t.id for t in self._vessel.tanks if t.kind == "ballast")
        with Vertical(classes="form transfer"):
            yield Label("Ballast planner: transfers to reach a list, a trim or a GM", classes="form-title")
            yield Label(PLANNER_HINT, classes="form-hint")
            for name, label, value in (("goal", "Goal", "list 0"), ("tanks", "Tanks", ballast)):
                with Horizontal(classes="xfer-row"):
                    yield Label(label, classes="xfer-label")
                    yield SteadyInput(value=value, id=f"plan-{name}", classes="xfer-field")
            yield LinePanel(id="xfer-preview")
            yield Static("", id="form-message")

    def on_mount(self) -> None:
        # a row for each note a plan may bring (plan_notes: tanks left in a worst band or just full, criteria)
        self.fit_preview(len(preview_lines(self._before, None, None)) + 4, PLANNER_HINT, 2)
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
        self._show()

    def _say(self, message: Text) -> None:
        """The message under the panel, wrapped to as many lines as it needs; the panel gives up
        the rows it takes."""
        self._message = message
        self.query_one("#form-message", Static).update(message)
        self._show()

    def refuse(self, message: str) -> None:
        self._say(Text("✖ " + message, P["danger"]))

    def _show(self) -> None:
        """The before/after rows (and the notes of a proposal) in the rows left beside the message;
        rows beyond the panel's edge are said at the edge, with the key that shows them."""
        panel = self.query_one("#xfer-preview", LinePanel)
        width = min(80, self.app.size.width) - 4  # .form.transfer: width 80, border and padding
        said = max(1, len(self._message.wrap(self.app.console, max(10, width))))
        room = getattr(self, "preview_room", 14) + 1 - said  # the panel's and the message's rows, less the message
        after = self.proposal.result if self.proposal else None
        lines = fitted_lines(self._before, after, self._notes if self.proposal else [], width, max(5, room))
        height = max(5, min(max(int(panel.styles.height.value) if panel.styles.height else 0, len(lines)), room))
        panel.styles.height = height
        self._offset = max(0, min(self._offset, len(lines) - height + 1 if len(lines) > height else 0))
        if len(lines) > height:
            top = self._offset
            above = [Text(f"▲ {top} rows above: PgUp", P["caution"])] if top else []
            body = height - len(above) - 1
            if top + body + 1 >= len(lines):  # the last rows fit without a mark below
                body += 1
            below = len(lines) - top - body
            lines = above + lines[top:top + body] + (
                [Text(f"▼ {below} more rows below: PgDn (PgUp back)", P["caution"])] if below > 0 else [])
        panel.set_lines(lines)

    def action_page(self, step: int) -> None:
        panel = self.query_one("#xfer-preview", LinePanel)
        self._offset = max(0, self._offset + step * max(1, int(panel.styles.height.value) - 2))
        self._show()

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        self.proposal = None
        self._offset = 0
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
            self._say(Text("Still searching…  Esc cancels", P["dim"]))
            return
        # The search runs off the screen's thread (each step is a full calculation, a GM plan on
        # a loaded PC takes a second or so): the form stays live and says it is searching.
        self.searching, self._asked = True, asked
        self._say(Text("Searching…", P["dim"]))
        self.run_worker(partial(self._search, goal, tanks, asked), thread=True, exclusive=True, exit_on_error=False)

    def _search(self, goal: Goal, tanks: list[str], asked: tuple[str, str]) -> None:
        v = self._vessel
        try:
            move = partial(entry.planner_move, v)
            found = plan(v, self._condition, goal, tanks, move=move, room=partial(entry.planner_room, v),
                         evaluate=self._evaluate)
            if isinstance(found, Plan) and found.transfers:  # in the amounts shown, checked within the reading tolerance
                found = as_shown(v, self._condition, goal, found, move=move, evaluate=self._evaluate)
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
            self._say(Text("⏎ proposes for the goal and tanks as they are now.", P["dim"]))
            return
        if isinstance(found, Exception):
            self.refuse(f"The planner could not compute a step: {found}")
            return
        if isinstance(found, NoPlan):
            self.proposal = None
            self.refuse(no_plan_words(goal, found))
            return
        if not found.transfers:  # she already meets it: nothing to apply
            self.proposal = None
            self._say(Text(
                f"She already has {goal_words(goal, found.after)}: nothing to pump for this goal.", P["value"]))
            return
        self.proposal = found
        notes = self._notes = plan_notes(self._before, found)
        self._offset = 0
        self._say(Text(
            f"{found_words(goal, found)}  ⏎ applies · Esc cancels", P["value"] if found.robust and not notes else P["caution"]))


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


def found_words(goal: Goal, p: Plan) -> str:
    """The plan in the amounts applied, what it gives, and what it gives with each amount
    READING_TOLERANCE_T less or more; said plainly when the goal holds at the shown amounts only."""
    lo, hi = p.spread if p.spread is not None else (p.after, p.after)
    if goal.quantity == "gm":
        # rounded down: "at least" must not print a floor higher than the value it stands for
        within = f"at least GM fluid {math.floor(lo * 1000.0 + 1e-9) / 1000.0:.3f} m"
    else:
        within = f"{goal_words(goal, lo)} to {goal_words(goal, hi)}"
    tol = f"with {READING_TOLERANCE_T:g} t less or more on any amount: {within}"
    head = f"{plan_words(p)}: {goal_words(goal, p.after)}"
    if p.robust:
        return f"{head} ({tol})."
    if goal.quantity == "gm" and lo < goal.target:
        return (f"{head} only at these amounts to the tenth of a tonne, NOT reliably: {tol}, below the "
                f"{goal.target:.3f} m wanted.")
    if not met(p.after, goal):
        return f"{head}, not within {goal.tolerance:g} of the goal at amounts to {READING_TOLERANCE_T:g} t; {tol}."
    return f"{head} at these amounts; {tol} (the goal ± {goal.tolerance:g} holds at the amounts shown only)."


def plan_notes(before: Result | None, p: Plan) -> list[str]:
    """What a plan leaves that the before/after rows do not show: each tank it pumps left in its
    worst free-surface band, or brought to nominally full (≥ 98 %, IS 2008 Part B 3.1: its free
    surface then not counted) and how far past that line; criteria that passed before and fail,
    or become not assessable, after."""
    out: list[str] = []
    used = list(dict.fromkeys(i for t in p.transfers for i in (t.from_id, t.to_id)))
    was = {t.id: t for t in before.tanks} if before is not None else {}
    for t in p.result.tanks:
        if t.id not in used:
            continue
        if t.state == "worst_band":
            out.append(f"{t.id} is left at {pct_text(t.fill_pct)} %, in its worst free-surface band "
                       f"({band_text(t.worst_band_pct)}).")
        elif t.state == "full" and (t.id not in was or was[t.id].state != "full") and t.fill_pct < 100.0 - 1e-6:
            past = (t.fill_pct - 98.0) / 100.0 * t.capacity_m3 * t.density_t_m3
            out.append(f"{t.id} is left nominally full at {t.fill_pct:.1f} % ({past:.1f} t past the 98 % line; "
                       "below it its free surface counts again).")
    if before is not None:
        old = {c.id: c for c in before.criteria}
        failed = [c for c in p.result.criteria if c.assessed and not c.passed and c.id in old and old[c.id].passed]
        open_ = [c for c in p.result.criteria if not c.assessed and c.id in old and old[c.id].assessed]
        if failed:
            out.append("After it the criteria are NOT MET: " + "; ".join(c.description for c in failed) + " fails.")
        if open_:
            why = next((c.note for c in open_ if c.note), "")
            out.append(f"After it {len(open_)} {'criterion is' if len(open_) == 1 else 'criteria are'} not assessable"
                       + (f" ({why})." if why else "."))
    return out


def no_plan_words(goal: Goal, why: NoPlan) -> str:
    """Why no plan was found, with the nearest the search came and how.  The search is not every
    possible pumping: single transfers, wing pairs (and a tank of no partner with a pair) pumped
    alike, and whole transfers chosen greedily, up to MAX_TRANSFERS; the words say so."""
    want = (f"GM fluid at least {goal.target:.3f} m" if goal.quantity == "gm"
            else goal_words(goal, goal.target).replace(" m A", " m by the stern").replace(" m F", " m by the head"))
    how = f" after: {transfers_words(why.transfers)}" if why.transfers else " (as she is)"
    upright = f", keeping the list within {why.list_limit_deg:.1f}°" if why.list_limit_deg is not None else ""
    return (f"The search found no plan reaching {want}{upright} between these tanks (it tries single transfers, "
            f"wing pairs pumped alike and whole transfers one at a time, up to {MAX_TRANSFERS}; not every "
            f"split of the pumping): the nearest it came is {goal_words(goal, why.best)}{how}.  "
            "Allow other tanks, change the goal, or work it by hand with t.")
