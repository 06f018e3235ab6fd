"""One watch's editing session: the working condition, its result, undo and redo.

Plain Python, no textual.  Each change replaces the whole (frozen) condition,
re-evaluates it, saves it atomically and tells the journal; undo and redo are
two stacks of conditions.  A displacement outside the vessel's tables is not an
error of the edit: the condition is kept, the last good result stays on show
(greyed by the screen) and :attr:`Session.problem` says what is out of range.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Callable

from deckload.core.model import Condition, Vessel
from deckload.core.result import Result
from deckload.core.tables import OutOfRangeError
from deckload.ui.entry import EntryError


def working_path(work_dir: Path, vessel: Vessel) -> Path:
    from deckload.paths import working_file

    return working_file(work_dir, vessel.particulars.name)


@dataclass
class Step:
    """One undoable change: the condition before it and its label."""

    before: Condition
    after: Condition
    label: str
    kind: str
    data: dict = field(default_factory=dict)


class Journal:
    """The voyage log as the screen uses it: never raises, reports problems as text."""

    def __init__(self, logbook: Any | None, problem: str | None = None):
        self.logbook = logbook
        self.problem = problem
        """Why the log cannot be written (read-only, unreadable), or None."""
        self.notice: str | None = None
        """Something the officer should read at start-up (e.g. a torn last line set aside)."""
        self.officer = ""
        """Initials of the officer on watch (1–4 letters); edits are logged under them, and not
        logged until someone signs on (the title line says so)."""

    @property
    def writable(self) -> bool:
        return self.logbook is not None and not self.logbook.readonly

    def append(self, **entry: Any) -> str | None:
        """Append an entry; return an error message instead of raising."""
        if not self.writable or not (entry.get("by") or self.officer):
            return None
        entry.setdefault("by", self.officer)
        try:
            self.logbook.append(**entry)
        except Exception as exc:  # the log must never take the screen down
            where = getattr(self.logbook, "path", "the voyage log")
            return f"NOT RECORDED in {where}: {getattr(exc, 'strerror', None) or exc}. Nothing was added to the log."
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
    ):
        if evaluate is None:
            from deckload.core.stability import evaluate
        if save is None and save_path is not None:
            from deckload.profiles import save_condition as save
        self.vessel = vessel
        self.save_path = save_path
        self.journal = journal or Journal(None)
        self._evaluate = evaluate
        self._save = save
        self.condition = condition
        self.result: Result | None = None
        """The last good result (may belong to an earlier condition when ``stale``)."""
        self.stale = False
        self.problem: str | None = None
        """Why the current condition could not be evaluated (outside the tables)."""
        self._undo: list[Step] = []
        self._redo: list[Step] = []
        self._writer = None
        self._jobs: list = []
        self._report: Callable[[str], None] = lambda problem: None
        self._recompute()

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

    def commit(self, condition: Condition, label: str, kind: str = "edit", data: dict | None = None) -> list[str]:
        """Make ``condition`` the working one as one undoable step.

        Raises :class:`EntryError` (and changes nothing) if the engine rejects the
        condition for any reason other than a displacement outside the tables.
        Returns problems to report (save or log failures); the change stands.  After
        :meth:`write_in_background`, saving and logging happen on the writer thread instead.
        """
        if condition == self.condition:
            raise EntryError("No change: the value is the same as before.")
        evaluated = self._check(condition)
        step = Step(self.condition, condition, label, kind, dict(data or {}))
        self._undo.append(step)
        self._redo.clear()
        return self._apply(condition, kind, label, step.data, evaluated)

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

    def record(self, by: str, remark: str) -> list[str]:
        """Record the working condition in the log, signed with initials."""
        problems = self.flush()
        self.journal.officer = by
        err = self.journal.append(
            kind="condition", by=by, change_text=f"condition recorded: {self.condition.name}", remark=remark,
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
               evaluated: Result | OutOfRangeError | None = None) -> list[str]:
        self.condition = condition
        self._recompute(evaluated)
        result = None if self.stale else self.result
        if self._writer is None:
            return self._persist(condition, kind, label, data, result)
        self._jobs.append(self._writer.submit(self._persist_reporting, condition, kind, label, data, result))
        return []

    def write_in_background(self, report: Callable[[str], None]) -> None:
        """Save and log each change on one writer thread, in order, so a key's repaint never
        waits for fsync; ``report`` receives each problem (it is called on that thread)."""
        from concurrent.futures import ThreadPoolExecutor

        self._report = report
        self._writer = ThreadPoolExecutor(max_workers=1, thread_name_prefix="deckload-writer")

    def flush(self) -> list[str]:
        """Wait until every change is saved and logged; problems not yet reported are returned."""
        problems: list[str] = []
        while self._jobs:
            problems.extend(self._jobs.pop(0).result())
        return problems

    def _persist_reporting(self, *args) -> list[str]:
        problems = self._persist(*args)
        for p in problems:
            self._report(p)
        return []

    def _persist(self, condition: Condition, kind: str, label: str, data: dict, result: Result | None) -> list[str]:
        problems = []
        if self.save_path is not None and self._save is not None:
            try:
                self.save_path.parent.mkdir(parents=True, exist_ok=True)
                self._save(self.save_path, condition)
            except OSError as exc:
                problems.append(f"NOT SAVED: {self.save_path}: {exc.strerror or exc}. The change is on screen "
                                "only (the file holds the last condition saved); the next change tries again.")
        err = self.journal.append(kind=kind, change_text=label, change_data=data, result=result, condition=condition)
        if err:
            problems.append(err)
        return problems
