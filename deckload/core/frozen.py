"""``@frozen``: ``@dataclass(frozen=True)`` that compiles half as much when the class is made.

Python 3.11's ``dataclass`` writes each method it adds as source text and compiles it: six for a
frozen class (``__init__``, ``__repr__``, ``__eq__``, ``__hash__``, ``__setattr__``,
``__delattr__``), 0.4–2 ms a class with its other bookkeeping.  deckload has about 125 frozen
classes, and making them was the largest part of its own start-up (after numpy and textual): the
screen's start made 90 of them, ``calc`` 72.

``@frozen`` has ``dataclass`` write the three that must be written per class (``__init__`` and the
frozen ``__setattr__``/``__delattr__``) and gives the other three as small closures over one
``operator.attrgetter`` per class, with the behaviour ``dataclass`` writes (Python 3.11,
``dataclasses._process_class``):

* ``a == b``: ``NotImplemented`` unless ``b`` is of exactly ``a``'s class, else the tuples of the
  fields with ``compare=True`` are compared;
* ``hash(a)``: the hash of the tuple of the fields with ``hash=True``, or ``compare=True`` where
  ``hash`` is None (with ``eq=False``: the object's own hash, as ``dataclass`` leaves it);
* ``repr(a)``: ``QualName(field=value!r, …)`` over the fields with ``repr=True``, ``...`` for a
  record met again inside itself.

A method the class body defines itself is kept, as ``dataclass`` keeps it.  The class is a frozen
dataclass in every other way (``dataclasses.fields``, ``replace``, ``asdict``, pickling,
``FrozenInstanceError``).  ``tests/test_frozen.py`` compares each behaviour with
``dataclass(frozen=True)`` itself.
"""

from __future__ import annotations

import dataclasses
import operator
import reprlib
from typing import Any, Callable, TypeVar

T = TypeVar("T", bound=type)


def values_getter(names) -> Callable[[Any], tuple]:
    """The named attributes of an object as one tuple (``attrgetter`` gives a bare value for one name)."""
    if not names:
        return lambda obj: ()
    if len(names) == 1:
        one = operator.attrgetter(names[0])
        return lambda obj: (one(obj),)
    return operator.attrgetter(*names)


def _make(cls: T, eq: bool, kwargs: dict) -> T:
    """``cls`` made a frozen dataclass, with the shared ``__eq__``, ``__hash__`` and ``__repr__``."""
    own = cls.__dict__
    keys: dict[str, Any] = {}  # the field getters (and the repr's names), once the fields are known

    def __eq__(self, other):
        if other.__class__ is self.__class__:
            key = keys["compare"]
            return key(self) == key(other)
        return NotImplemented

    def __hash__(self):
        return hash(keys["hash"](self))

    @reprlib.recursive_repr()
    def __repr__(self):
        values = keys["repr"](self)
        return f"{self.__class__.__qualname__}(" + ", ".join(
            f"{name}={value!r}" for name, value in zip(keys["repr names"], values)) + ")"

    # dataclass's test for a __hash__ of the body's own: a body that defines __eq__ alone has
    # __hash__ None, which does not count (dataclass then adds one, as here).
    own_hash = own.get("__hash__", dataclasses.MISSING)
    explicit_hash = not (own_hash is dataclasses.MISSING or (own_hash is None and "__eq__" in own))
    if "__repr__" not in own:
        __repr__.__qualname__ = f"{cls.__qualname__}.__repr__"
        cls.__repr__ = __repr__
    if eq:
        if "__eq__" not in own:
            __eq__.__qualname__ = f"{cls.__qualname__}.__eq__"
            cls.__eq__ = __eq__
        if not explicit_hash:
            __hash__.__qualname__ = f"{cls.__qualname__}.__hash__"
            cls.__hash__ = __hash__
    made = dataclasses.dataclass(cls, frozen=True, eq=False, repr=False, **kwargs)
    fields = dataclasses.fields(made)
    keys["compare"] = values_getter([f.name for f in fields if f.compare])
    keys["hash"] = values_getter([f.name for f in fields if (f.compare if f.hash is None else f.hash)])
    keys["repr names"] = [f.name for f in fields if f.repr]
    keys["repr"] = values_getter(keys["repr names"])
    return made


def frozen(cls: T | None = None, /, *, eq: bool = True, **kwargs):
    """``@frozen`` or ``@frozen(eq=False, …)``: as ``@dataclass(frozen=True, eq=…, …)``."""
    if cls is None:
        return lambda c: _make(c, eq, kwargs)
    return _make(cls, eq, kwargs)
