"""One watch's editing session: the working condition, its result, undo and redo.

Plain Python, no textual.  Each change replaces the whole (frozen) condition,
re-evaluates it, saves it atomically and tells the journal; undo and redo are
two stacks of conditions.  A displacement outside the vessel's tables is not an
error of the edit: the condition is kept, the last good result stays on show
(greyed by the screen) and :attr:`Session.problem` says what is out of range.
"""

from __future__ import annotations

import threading
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Callable

from deckload.core.frozen import frozen
from deckload.core.model import Condition, Vessel
from deckload.core.result import Result
from deckload.core.tables import OutOfRangeError
from deckload.ui.entry import EntryError


def working_path(work_dir: Path, vessel: Vessel) -> Path:
    from deckload.io.paths import working_file

    return working_file(work_dir, vessel.particulars.name)


@dataclass
class Step:
    """One undoable change: the condition before it and its label."""

    before: Condition
    after: Condition
    label: str
    kind: str
    data: dict = field(default_factory=dict)


@dataclass
class _Run:
    """Nudges or retypes of one item, logged as one entry when the run settles."""

    key: tuple[str, str]
    kind: str
    before: tuple | None
    condition: Condition
    last_label: str
    result: Result | None
    steps: int = 1

    def extend(self, condition: Condition, label: str, result: Result | None) -> None:
        self.condition, self.last_label, self.result = condition, label, result
        self.steps += 1


@frozen
class _Write:
    """One change's save and/or log entry, waiting for the writer thread."""

    condition: Condition
    kind: str
    label: str
    data: dict
    result: Result | None
    save: bool
    log: bool


@dataclass
class _Plan:
    """A plan under way: the condition it started from, its title and the changes made in it."""

    base: Condition
    title: str
    labels: list[str] = field(default_factory=list)


def _counted(labels: list[str]) -> list[str]:
    """Repeated changes written once with their count: ['A', 'A', 'B'] → ['A ×2', 'B']."""
    out: list[list] = []
    for label in labels:
        if out and out[-1][0] == label:
            out[-1][1] += 1
        else:
            out.append([label, 1])
    return [f"{lab} ×{n}" if n > 1 else lab for lab, n in out]


def _pct(x: float) -> str:
    return f"{x:.1f}".removesuffix(".0")


def run_text(ident: str, before: tuple | None, after: tuple | None, last_label: str, steps: int) -> str:
    """'WB1P 12 % → 22 %, 7.1 t → 13.0 t (10 changes)': the values a run of edits reached."""
    n = f" ({steps} changes)" if steps > 1 else ""
    if before is None or after is None:
        return last_label + n
    parts = []
    if before[0] is not None and after[0] is not None:
        parts.append(f"{_pct(before[0])} % → {_pct(after[0])} %")
    parts.append(f"{before[1]:.1f} t → {after[1]:.1f} t")
    return f"{ident} " + ", ".join(parts) + n


def _state_data(state: tuple | None, prefix: str) -> dict:
    if state is None:
        return {}
    out = {f"{prefix}_t": round(state[1], 3)}
    if state[0] is not None:
        out[f"{prefix}_pct"] = round(state[0], 2)
    return out


def _tell(callback: Callable, *args) -> None:
    """Tell the screen from the writer thread; a screen already gone (quitting) is no reason to stop."""
    try:
        callback(*args)
    except Exception:  # e.g. the event loop closed: the write itself has landed
        pass


class Journal:
    """The voyage log as the screen uses it: never raises, reports problems as text."""

    def __init__(self, logbook: Any | None, problem: str | None = None):
        self.logbook = logbook
        self.problem = problem
        """Why the log cannot be written (read-only, unreadable), or None."""
        self.notice: str | None = None
        """Something the officer should read at start-up (e.g. a torn last line set aside)."""
        self.clock_warning: str | None = None
        """Set by an entry logged with the clock earlier than the newest entry's time, a record or an
        edit logged by the writer thread, until the screen takes it (:meth:`take_clock_warning`)."""
        self.officer = ""
        """Initials of the officer on watch (1–4 letters); edits are logged under them, and not
        logged until someone signs on (the title line says so)."""

    def take_clock_warning(self) -> str | None:
        """The clock warning of the first entry logged since the last call (None: none), cleared."""
        said, self.clock_warning = self.clock_warning, None
        return said

    @property
    def writable(self) -> bool:
        return self.logbook is not None and not self.logbook.readonly

    def broken(self) -> str | None:
        """What to say when the log fails verification (None: it verifies, or cannot be read here)."""
        try:
            rep = self.logbook.verify()
        except Exception:  # (reading it again failed: the record itself was reported already)
            return None
        return None if rep.ok else rep.failing_words(self.logbook.path.name)

    def append(self, **entry: Any) -> str | None:
        """Append an entry; return an error message instead of raising."""
        if not self.writable or not (entry.get("by") or self.officer):
            return None
        entry.setdefault("by", self.officer)
        try:
            done = self.logbook.append(**entry)
        except Exception as exc:  # the log must never take the screen down
            where = getattr(self.logbook, "path", "the voyage log")
            return f"NOT RECORDED in {where}: {getattr(exc, 'strerror', None) or exc}. Nothing was added to the log."
        back = getattr(self.logbook, "clock_back", None)
        if back is not None:
            from deckload.logbook import clock_back_words

            # the first since the screen last said one: it names where the clock went back
            self.clock_warning = self.clock_warning or clock_back_words(done.seq, *back)
        return None


class Session:
    """The working condition with its evaluation, history and persistence."""

    def __init__(
        self,
        vessel: Vessel,
        condition: Condition,
        *,
        save_path: Path | None,
        journal: Journal | None = None,
        evaluate: Callable[[Vessel, Condition], Result] | None = None,
        save: Callable[[Path, Condition], None] | None = None,
        result: Result | None = None,
    ):
        if evaluate is None:
            from deckload.core.stability import evaluate
        if save is None and save_path is not None:
            from functools import partial

            from deckload.io.profiles import save_condition

            save = partial(save_condition, vessel_name=vessel.particulars.name)
        self.vessel = vessel
        self.save_path = save_path
        self.profile_path: Path | None = None
        """The profile file (its stock conditions lie beside it), when known."""
        self.work_dir: Path | None = None
        """The working-conditions folder (saved conditions are kept in it), when known."""
        self.reports_dir: Path | None = None
        """Where reports printed from the screen go, when known."""
        self.profile_doubts: tuple[str, ...] = ()
        """The profile's plausibility-audit warnings (audit_findings.doubt_lines): printed reports carry them."""
        self.not_saving: str | None = None
        """Why this window saves no change at all (another deckload has the vessel open and owns
        her working file), or None; ``save_path`` is then None."""
        self.unsaved: str | None = None
        """Why the newest condition on screen is in no file, naming the file where one was tried
        (a save that failed, or :attr:`not_saving`); None once a save has landed.  Set by whoever
        saves (the writer thread), read by the screen after :meth:`flush`."""
        self.journal = journal or Journal(None)
        self._evaluate = evaluate
        self._save = save
        self.condition = condition
        self.result: Result | None = None
        """The last good result (may belong to an earlier condition when ``stale``)."""
        self.stale = False
        self.problem: str | None = None
        """Why the current condition could not be evaluated (outside the tables)."""
        self._run: _Run | None = None
        self._plan: _Plan | None = None
        self._plan_problems: list[str] = []
        self._undo: list[Step] = []
        self._redo: list[Step] = []
        self._writer = None
        self._after_frame: Callable[[Callable[[], None]], None] | None = None
        self._held: list[_Write] = []
        """Writes of changes whose frame is not drawn yet (UI thread only)."""
        self._queue: list[_Write] = []
        """Writes handed to the writer thread, not yet taken by it (under ``_cv``)."""
        self._outstanding = 0
        """Writes submitted and not yet landed: held, queued or being written (under ``_cv``)."""
        self._draining = False
        self._release_scheduled = False
        self._cv = threading.Condition()
        self.saves_written = 0
        """Condition-file saves the writer thread has made (queued saves coalesce: fewer than changes)."""
        self._report: Callable[[str], None] = lambda problem: None
        self._landed: Callable[[], None] = lambda: None
        self._recompute(result)  # ``result``: evaluate(vessel, condition), when the caller has it already

    # ------------------------------------------------------------------ queries

    @property
    def can_undo(self) -> bool:
        return bool(self._undo)

    @property
    def can_redo(self) -> bool:
        return bool(self._redo)

    @property
    def undo_depth(self) -> int:
        return len(self._undo)

    @property
    def redo_depth(self) -> int:
        return len(self._redo)

    @property
    def undo_label(self) -> str | None:
        return self._undo[-1].label if self._undo else None

    def preview(self, condition: Condition) -> tuple[Result | None, str | None]:
        """Evaluate a candidate condition without keeping it: (result, problem)."""
        try:
            return self._evaluate(self.vessel, condition), None
        except (OutOfRangeError, ValueError, KeyError) as exc:
            return None, str(exc)

    # ------------------------------------------------------------------ changes

    def commit(self, condition: Condition, label: str, kind: str = "edit", data: dict | None = None,
               *, mark: bool = True, run: tuple[str, str] | None = None) -> list[str]:
        """Make ``condition`` the working one as one undoable step.

        An edit of a condition as opened or saved marks it "modified from <its name>"
        (``Condition.modified_from``) unless ``mark`` is False (opening, saving, restoring).

        Raises :class:`EntryError` (and changes nothing) if the engine rejects the
        condition for any reason other than a displacement outside the tables.
        Returns problems to report (save or log failures); the change stands.  After
        :meth:`write_in_background`, saving and logging happen on the writer thread instead.

        ``run`` (``("tank", "WB1P")``, ``("hold", "H1")``) names the item a nudge or retype
        changes: a run of such changes of one item is logged as one entry carrying the values
        reached, when the run settles (:meth:`settle`: the cursor moves on, a pause, any other
        change, a record, quitting).  Each change is still one undo step and saved at once.
        """
        if condition == self.condition:
            raise EntryError("No change: the value is the same as before.")
        if mark and not condition.modified_from and condition.name == self.condition.name:
            # The first edit of a stock or saved condition: it is no longer that condition.
            condition = condition.replace(modified_from=self.condition.name)
        evaluated = self._check(condition)
        step = Step(self.condition, condition, label, kind, dict(data or {}))
        before = self._item_state(run, None if self.stale else self.result, self.condition) if run else None
        self._undo.append(step)
        self._redo.clear()
        return self._apply(condition, kind, label, step.data, evaluated, run=run, before=before)

    def undo(self) -> tuple[str, list[str]]:
        if not self._undo:
            raise EntryError("Nothing to undo.")
        step = self._undo.pop()
        self._redo.append(step)
        label = f"Undo: {step.label}"
        return label, self._apply(step.before, "edit", label, {"undone": step.kind, **step.data})

    def redo(self) -> tuple[str, list[str]]:
        if not self._redo:
            raise EntryError("Nothing to redo.")
        step = self._redo.pop()
        self._undo.append(step)
        label = f"Redo: {step.label}"
        return label, self._apply(step.after, step.kind, label, {"redone": step.kind, **step.data})

    @property
    def title(self) -> str:
        """The working condition's name, with "modified from" once it has been edited."""
        c = self.condition
        return f"{c.name} (modified from {c.modified_from})" if c.modified_from else c.name

    def keep_previous(self) -> Path | None:
        """Before the working condition gives way to another (opened, or restored from the log):
        an edited one (``modified_from`` set: it is in no file of its own) is written beside the
        working file as ``.previous`` (``.previous.2`` …), as ``deckload open`` keeps the working
        file it replaces.  Undo brings it back within the session; this keeps it after.  Returns
        the file written, or None when there is nothing to keep; OSError when it cannot be
        written (the caller then replaces nothing)."""
        if self.save_path is None or not self.condition.modified_from:
            return None
        from deckload.io.atomicfile import write_atomic
        from deckload.io.paths import free_name
        from deckload.io.profiles import dump_condition

        aside = free_name(self.save_path, ".previous")
        aside.parent.mkdir(parents=True, exist_ok=True)
        write_atomic(aside, dump_condition(self.condition, self.vessel.particulars.name))
        return aside

    def save_as(self, name: str, path: Path) -> list[str]:
        """Write the working condition under ``name`` to ``path`` (atomically) and make it the
        working one, as one undoable step: it is then that condition, unmodified.

        Raises OSError (nothing changed) when the file cannot be written."""
        from deckload.io.atomicfile import write_atomic
        from deckload.io.profiles import dump_condition

        named = self.condition.replace(name=name, modified_from="")
        path.parent.mkdir(parents=True, exist_ok=True)
        write_atomic(path, dump_condition(named, self.vessel.particulars.name))
        label = f"Condition saved as \u201c{name}\u201d ({path.name})"
        if named == self.condition:
            return self._apply(named, "edit", label, {"saved_as": name, "file": str(path)})
        return self.commit(named, label, "edit", {"saved_as": name, "file": str(path),
                                                   "was": self.title}, mark=False)

    # ------------------------------------------------------------------ runs and plans

    @property
    def planning(self) -> bool:
        return self._plan is not None

    @property
    def plan_steps(self) -> int:
        return len(self._plan.labels) if self._plan is not None else 0

    def start_plan(self) -> None:
        """Try things without logging them: changes are saved and undoable as usual, and enter the
        log only when the plan is applied (:meth:`apply_plan`), as one entry."""
        if self._plan is not None:
            raise EntryError("A plan is already being tried: apply or discard it first.")
        problems = self.settle()
        self._plan = _Plan(self.condition, self.title)
        self._plan_problems = problems

    def apply_plan(self) -> tuple[str, list[str]]:
        """End the plan: one log entry naming every change it made, with the condition reached."""
        plan = self._end_plan()
        if not plan.labels:
            return "Plan ended: no change was made", []
        label = f"Plan applied ({len(plan.labels)} change{'s' if len(plan.labels) != 1 else ''}): " + \
            "; ".join(_counted(plan.labels))
        if len(label) > 1900:
            label = label[:1890] + " …"
        data = {"plan": plan.labels[:100], "planned_from": plan.title}
        result = None if self.stale else self.result
        return label, self._submit(self.condition, "edit", label, data, result, save=False)

    def discard_plan(self) -> tuple[str, list[str]]:
        """End the plan and go back to the condition it started from; nothing is logged."""
        plan = self._end_plan()
        if self.condition == plan.base:
            return "Plan discarded: nothing had changed", []
        step = Step(self.condition, plan.base, "Plan discarded", "edit", {})
        self._undo.append(step)
        self._redo.clear()
        self.condition = plan.base
        self._recompute()
        return "Plan discarded: back to the condition before it", self._submit(plan.base, "edit", "", {}, None, log=False)

    def _end_plan(self) -> "_Plan":
        if self._plan is None:
            raise EntryError("No plan is being tried.")
        plan, self._plan = self._plan, None
        return plan

    def settle(self) -> list[str]:
        """Log the run of nudges or retypes in progress (if any) as one entry."""
        run, self._run = self._run, None
        if run is None:
            return []
        after = self._item_state(run.key, run.result, run.condition)
        label = run_text(run.key[1], run.before, after, run.last_label, run.steps)
        data = {run.key[0]: run.key[1], "steps": run.steps, **_state_data(run.before, "from"),
                **_state_data(after, "to")}
        return self._submit(run.condition, run.kind, label, data, run.result, save=False)

    @staticmethod
    def _item_state(key: tuple[str, str], result: Result | None, condition: Condition) -> tuple | None:
        """(fill %, mass t) of a tank from ``result``, (None, mass t) of a hold from ``condition``."""
        what, ident = key
        if what == "tank":
            if result is None:
                return None
            t = next((x for x in result.tanks if x.id == ident), None)
            return None if t is None else (t.fill_pct, t.mass_t)
        if what == "hold":
            load = next((h for h in condition.holds if h.hold_id == ident), None)
            return (None, load.mass_t if load else 0.0)
        return None

    def record(self, by: str, remark: str) -> list[str]:
        """Record the working condition in the log, signed with initials."""
        problems = self.flush()
        self.journal.officer = by
        err = self.journal.append(
            kind="condition", by=by, change_text=f"condition recorded: {self.title}", remark=remark,
            change_data={}, result=self.result if not self.stale else None, condition=self.condition,
        )
        return problems + ([err] if err else [])

    # ------------------------------------------------------------------ internals

    def _check(self, condition: Condition) -> Result | OutOfRangeError:
        """Evaluate a candidate: its result, or the out-of-range error (which is not a refusal)."""
        try:
            return self._evaluate(self.vessel, condition)
        except OutOfRangeError as exc:
            return exc
        except (ValueError, KeyError) as exc:
            raise EntryError(f"Refused by the calculation: {exc}") from exc

    def _recompute(self, evaluated: Result | OutOfRangeError | None = None) -> None:
        if evaluated is None:
            try:
                evaluated = self._evaluate(self.vessel, self.condition)
            except OutOfRangeError as exc:
                evaluated = exc
        if isinstance(evaluated, OutOfRangeError):
            self.stale, self.problem = True, str(evaluated)
        else:
            self.result, self.stale, self.problem = evaluated, False, None

    def _apply(self, condition: Condition, kind: str, label: str, data: dict,
               evaluated: Result | OutOfRangeError | None = None, *,
               run: tuple[str, str] | None = None, before=None) -> list[str]:
        self.condition = condition
        self._recompute(evaluated)
        result = None if self.stale else self.result
        if self._plan is not None:
            # Kept apart: saved (the screen's state), logged only when the plan is applied.
            self._plan.labels.append(label)
            return self._submit(condition, kind, label, data, result, log=False)
        if run is not None and self._run is not None and self._run.key == run:
            self._run.extend(condition, label, result)
            return self._submit(condition, kind, label, data, result, log=False)
        problems = self.settle()
        if run is not None:
            self._run = _Run(run, kind, before, condition, label, result)
            return problems + self._submit(condition, kind, label, data, result, log=False)
        return problems + self._submit(condition, kind, label, data, result)

    def _submit(self, condition: Condition, kind: str, label: str, data: dict, result: Result | None,
                *, save: bool = True, log: bool = True) -> list[str]:
        if self._writer is None:
            return self._persist(condition, kind, label, data, result, save=save, log=log)
        if not (save or log):
            return []
        # Held until the change's frame is drawn: the writer's work then never delays the repaint.
        self._held.append(_Write(condition, kind, label, data, result, save, log))
        with self._cv:
            self._outstanding += 1
        if not self._release_scheduled:
            self._release_scheduled = True
            self._after_frame(self.release_writes)
        return []

    @property
    def saves_pending(self) -> int:
        """Changes shown on screen whose save and log entry have not landed on disk yet."""
        with self._cv:
            return self._outstanding

    def write_in_background(self, report: Callable[[str], None],
                            landed: Callable[[], None] | None = None,
                            after_frame: Callable[[Callable[[], None]], None] | None = None) -> None:
        """Save and log changes on one writer thread, so a key's repaint never waits for fsync.

        ``after_frame(fn)`` is to call ``fn`` once the change's frame is drawn (the screen's
        ``call_after_refresh``): the writes are handed to the thread then.  Saves waiting there
        coalesce: only the newest condition is written (it holds every earlier change); every
        log entry is appended, in order, after the save.  ``report`` receives each problem and
        ``landed`` is told when writes are on disk (both are called on the writer thread)."""
        from concurrent.futures import ThreadPoolExecutor

        self._report = report
        self._landed = landed or (lambda: None)
        self._after_frame = after_frame or (lambda fn: fn())
        self._writer = ThreadPoolExecutor(max_workers=1, thread_name_prefix="deckload-writer")

    def release_writes(self) -> None:
        """Hand the held writes to the writer thread (idempotent; UI thread)."""
        self._release_scheduled = False
        if not self._held:
            return
        held, self._held = self._held, []
        with self._cv:
            self._queue.extend(held)
            start = not self._draining
            self._draining = True
        if start:
            self._writer.submit(self._drain)

    def _drain(self) -> None:
        """Writer thread: write what is queued, newest save only, until nothing is left."""
        try:
            while True:
                with self._cv:
                    batch, self._queue = self._queue, []
                    if not batch:
                        return
                try:
                    problems = self._write_batch(batch)
                finally:
                    with self._cv:
                        self._outstanding -= len(batch)
                        self._cv.notify_all()
                for p in problems:
                    _tell(self._report, p)
                _tell(self._landed)
        finally:
            with self._cv:  # whatever happened, flush must not wait for a writer that has stopped
                self._draining = bool(self._queue) and self._draining
                if self._queue:
                    self._writer.submit(self._drain)
                self._cv.notify_all()

    def _write_batch(self, batch: list[_Write]) -> list[str]:
        """The newest condition of ``batch`` saved once, then every log entry of it in order."""
        problems: list[str] = []
        newest = next((w for w in reversed(batch) if w.save), None)
        if newest is not None:
            try:
                problems += self._persist(newest.condition, newest.kind, newest.label, newest.data,
                                          newest.result, save=True, log=False)
            except Exception as exc:  # not an OSError (those _persist words itself): still never silent
                # The reason first: on a narrow message line a long path is what gets cut, not why.
                self.unsaved = f"{exc}; file {self.save_path}"
                problems.append(f"NOT SAVED ({exc}): the change is on screen only; the next change tries "
                                f"again. File: {self.save_path}")
        for w in batch:  # the log is a record: every entry, whatever became of the save
            if w.log:
                problems += self._persist(w.condition, w.kind, w.label, w.data, w.result, save=False, log=True)
        return problems

    def flush(self) -> list[str]:
        """Settle a run of edits, then wait until every change is saved and logged; problems not
        yet reported are returned.  A plan being tried stays unlogged."""
        problems: list[str] = self.settle()
        if self._writer is not None:
            self.release_writes()
            with self._cv:
                self._cv.wait_for(lambda: self._outstanding == 0 and not self._draining)
        return problems

    def stop_writer(self) -> list[str]:
        """:meth:`flush`, then end the writer thread (the screen is closing); a change after this
        is saved and logged at once on the caller's thread, as before :meth:`write_in_background`.
        The thread holds the closing app (through the stderr it was started with), so a writer left
        running would keep every app of the process alive."""
        problems = self.flush()
        if self._writer is not None:
            self._writer.shutdown(wait=True)
            self._writer = None
        return problems

    def _persist(self, condition: Condition, kind: str, label: str, data: dict, result: Result | None,
                 save: bool = True, log: bool = True) -> list[str]:
        problems = []
        if save and self.not_saving is not None:
            self.unsaved = self.not_saving
        if save and self.save_path is not None and self._save is not None:
            try:
                self.save_path.parent.mkdir(parents=True, exist_ok=True)
                self._save(self.save_path, condition)
                self.saves_written += 1
                self.unsaved = None
            except OSError as exc:
                self.unsaved = f"{exc.strerror or exc}; file {self.save_path}"
                problems.append(f"NOT SAVED ({exc.strerror or exc}): the change is on screen only (the file holds "
                                f"the last condition saved); the next change tries again. File: {self.save_path}")
        err = self.journal.append(kind=kind, change_text=label, change_data=data, result=result,
                                  condition=condition) if log else None
        if err:
            problems.append(err)
        return problems
