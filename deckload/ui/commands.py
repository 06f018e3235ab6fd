"""Every user command, declared once: key, footer label, help text.

The main screen's bindings, the help screen and the command palette are all
built from :data:`COMMANDS`, so they cannot drift apart.
"""

from __future__ import annotations

from deckload.core.frozen import frozen

_KEY_SIGNS = {"plus": "+", "minus": "-", "enter": "⏎", "question_mark": "?", "ctrl+o": "ctrl+o"}


@frozen
class Command:
    """A command of the loading screen: its key, footer label, help text and palette title."""

    action: str
    """Action name on the loading screen (``action_<name>``)."""
    keys: str
    """Key(s) as textual names, comma-separated; the first is shown."""
    label: str
    """Footer label: one or two short words."""
    help: str
    """One sentence for the help screen and the command palette."""
    display: str | None = None
    """How the key is written in the footer and help, when not the key's own name."""
    footer: bool = True
    """Shown in the footer (all commands are in help and the palette)."""
    title: str = ""
    """Name in the command palette and help, when the footer label is too terse."""

    words: str = ""
    """Words a mate might type for it in the command palette (sounding, print, ballast...)."""
    rank: int = 3
    """Which footer keys stay on a narrow screen: lowest first (0: always; ? lists every key)."""
    first: bool = False
    """Taken by the loading screen before the widget in focus sees the key (a textual priority
    binding): only for keys no widget of that screen takes (the board uses the arrows, Home, End,
    Page up/down, j and k).  The key then runs at once instead of bubbling up from the board
    and being followed along the focus chain (``DeckloadApp._follow``): the nudge, typed most."""

    @property
    def name(self) -> str:
        return self.title or self.label

    @property
    def palette_title(self) -> str:
        """'Print report — report, print (key p)': the name, the words a mate would type, this one key."""
        return f"{self.name}{' — ' + self.words if self.words else ''}  (key {self.own_key})"

    @property
    def key_text(self) -> str:
        return self.display or self.keys.split(",")[0]

    @property
    def own_key(self) -> str:
        """This command's own first key, as the help page and the palette write it: the footer's
        shared form ("+ -") would read there as if both keys did this one thing."""
        first = self.keys.split(",")[0]
        return _KEY_SIGNS.get(first, first)


COMMANDS: tuple[Command, ...] = (
    Command("help", "question_mark,f1", "Help", "This list of keys and what each does.", display="?", rank=0),
    Command("set_amount", "enter", "Set", "Type an amount for the line under the cursor: tank 55% / 12.5m3 / 10t / "
            "1.2m (sounding), 0.85u (ullage); hold mass in t; a deck load or constant opens its form (mass, position).",
            display="⏎", title="Set amount", words="sounding, ullage, percent, volume, mass, bunker, tank level", rank=1),
    Command("nudge(1)", "plus,equals_sign", "±1%", "Raise the tank under the cursor by 1 % of capacity "
            "(a hold or item by 1 t).", display="+ -", title="Raise 1 %", rank=2, first=True),
    Command("nudge(-1)", "minus", "−1%", "Lower the tank under the cursor by 1 % of capacity (a hold or item by 1 t).",
            display="-", footer=False, title="Lower 1 %", first=True),
    Command("fill", "f", "Full", "Fill the tank under the cursor to its kind's usual maximum (the profile's [usual_fill]: oils 95 %, "
            "water and ballast 100 % unless it says otherwise); f again fills it to 100 %.", words="fill, full, top up", rank=3),
    Command("empty", "e", "Empty", "Empty the tank or hold under the cursor; remove the deck load or constant.", rank=3),
    Command("transfer", "t", "Transfer", "Pump between two tanks, with a before/after preview; commit is one undoable step.", words="ballast, pump, shift, transfer", rank=1),
    Command("ballast_plan", "i", "Planner", "Ballast planner: transfers (up to 4) between the tanks you allow that "
            "bring the list or trim to a value, or GM fluid above one, in amounts to 0.1 t checked 0.1 t either side; "
            "before/after shown, applied only on ⏎.",
            footer=False, title="Ballast planner", words="ballast, list, trim, GM, upright, plan"),
    Command("print_report", "p", "Print", "Print from the screen: write the report (HTML to print, and text) of "
            "exactly the condition on screen, say where, and offer to open it.", title="Print report", words="report, print, paper, HTML", rank=2),
    Command("add_deck", "a", "+Deck", "Add a deck load: name, mass and position (LCG, VCG, TCG), optional deck area.",
            title="Add deck load", words="deck cargo, container, deck item", rank=4),
    Command("add_constant", "c", "+Const", "Add a constant (crew, stores, provisions): name, mass and position.",
            footer=False, title="Add constant", words="constant, stores, crew, provisions"),
    Command("density", "d", "ρ", "Set the density of the water she floats in (t/m³).", title="Water density", words="density, dock water, fresh water, sea water", rank=4),
    Command("tank_density", "D", "ρ tank", "State the density of the liquid in the tank under the cursor (t/m³, from "
            "the bunker delivery note) for this condition; empty or 'default' returns to the tank's own. The amount "
            "stays as stated: a sounding or volume keeps the volume (mass = V·ρ), a mass keeps the mass.",
            display="D", footer=False, title="Tank density",
            words="density, delivery note, bunker note, BDN, specific gravity, tank density"),
    Command("undo", "u,ctrl+z", "Undo", "Undo the last change.", rank=1),
    Command("redo", "y,ctrl+y", "Redo", "Redo the last undone change.", rank=4),
    Command("fs_rule", "r", "FS rule", "Switch the free-surface rule between the IS Code 2008 Part B 3.1 "
            "treatment and every slack tank at its actual level (B 3.1.6, for liquid transfers); undoable.",
            footer=False, title="Free-surface rule"),
    Command("gz_method", "m", "GZ method", "Switch the GZ correction between a constant rise of G (ΣFSM/Δ) and "
            "the actual moment of fluid transfer of each tank at each heel; undoable.",
            footer=False, title="GZ correction method"),
    Command("toggle_gz", "g", "GZ", "Show the GZ curve or the numbers (only below 110 columns, where both do not fit).",
            title="GZ curve or numbers", rank=1),
    Command("compare_hull", "h", "Hull", "Compute the condition from the hull geometry itself (free in trim and heel, "
            "for the actual G) and show it beside the tables' figures, with the difference; the screen stays live.",
            footer=False, title="Compare with the hull"),
    Command("wind_plot", "b", "Wind", "Show the weather criterion (IS Code 2008 Part A 2.3) on the curve: GZ with the "
            "steady and gust wind levers lw1 and lw2, the angles θ0, θ1 and θ2, and the areas a and b; again for the "
            "plain GZ curve.", footer=False, title="Wind and roll plot"),
    Command("verdict", "v", "Verdict", "The whole verdict: every criteria set assessed, each criterion with its "
            "paragraph, value, limit and margin, and everything that was not assessed, with the reason.",
            footer=False, title="Whole verdict"),
    Command("alerts", "w", "Warn", "List every warning, when more are raised than the warning strip can show.",
            title="All warnings", rank=2),
    Command("sign_on", "o", "Watch", "Sign on as officer of the watch (initials): every change is then written "
            "to the voyage log under them; - signs off. Both are logged.", title="Sign on or off watch", words="watch, sign on, sign off, handover", rank=4),
    Command("record", "s", "Record", "Record the working condition in the voyage log, with your initials and a remark.", words="record, sign, log entry", rank=2),
    Command("show_log", "l", "Log", "Open the voyage log.", words="log, voyage log, history", rank=3),
    Command("plan", "x", "Plan", "Try a plan: changes are kept out of the log until the plan is applied, as one "
            "entry; x again applies or discards it.", footer=False, title="Plan (try without logging)", words="plan, try, what if"),
    Command("save_as", "n", "Name", "Name the working condition and save it as a condition file of its own "
            "(stock conditions are never overwritten).", footer=False, title="Name and save condition", words="save, name, rename, condition file"),
    Command("open_condition", "ctrl+o", "Open", "Open a stock or saved condition as the working one (undoable).",
            display="^o", footer=False, title="Open condition", words="open, load, condition, departure, arrival"),
    Command("quit", "q", "Quit", "Leave deckload; the working condition is already saved (when it is not, q warns and a second q leaves).", rank=0),
)

NAVIGATION: tuple[tuple[str, str], ...] = (
    ("↑ ↓ PgUp PgDn Home End", "move the cursor on the loading board"),
    ("ctrl+p", "command palette: every command by name"),
    ("Tab / shift+Tab", "move between fields in a form"),
    ("Esc", "close a form or this help without changing anything"),
)


def footer_keys(width: int, *, shown=lambda c: True) -> tuple[list[tuple[str, str]], bool]:
    """The key line at ``width`` cells: ``(key, label)`` pairs in the table's order, and whether
    any footer command was left out.  Every footer command when they fit; else the lowest
    ``rank`` first.  ``?`` (which lists every key) and ``q`` are always there; when some are left
    out the help key says so ("? all keys").  ``shown(command)`` drops commands that do not
    apply (the numbers/curve switch on a wide screen)."""
    cmds = [c for c in COMMANDS if c.footer and shown(c)]

    def cells(chosen, sep: int, cut: bool) -> int:
        return sum(len(c.key_text) + 1 + len(_label(c, cut)) for c in chosen) + sep * (len(chosen) - 1) + 1

    for sep in (2, 1):
        if cells(cmds, sep, False) <= width:
            return [(c.key_text, _label(c, False)) for c in cmds], False
    chosen = [c for c in cmds if c.rank == 0]
    for c in sorted((c for c in cmds if c.rank > 0), key=lambda c: c.rank):
        if cells([*chosen, c], 1, True) <= width:
            chosen.append(c)
    chosen.sort(key=cmds.index)
    return [(c.key_text, _label(c, True)) for c in chosen], True


def _label(c: Command, cut: bool) -> str:
    return "all keys" if cut and c.action == "help" else c.label


def bindings():
    """Textual bindings for :data:`COMMANDS` (imported lazily: this module stays textual-free)."""
    from textual.binding import Binding

    return [
        Binding(c.keys, c.action, c.label, show=c.footer, key_display=c.display, priority=c.first)
        for c in COMMANDS
    ]
