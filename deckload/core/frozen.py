"""``@frozen``: ``@dataclass(frozen=True)`` that compiles nothing when the class is made.

Python 3.11's ``dataclass`` writes each method it adds as source text and compiles it: six for a
frozen class (``__init__``, ``__repr__``, ``__eq__``, ``__hash__``, ``__setattr__``,
``__delattr__``), 0.4–2 ms a class with its other bookkeeping.  deckload has about 125 frozen
classes, and making them was the largest part of its own start-up (after numpy and textual): the
screen's start made 90 of them, ``calc`` 72.

``@frozen`` has ``dataclass`` collect the fields and add nothing it would compile, and gives:

* ``a == b``: ``NotImplemented`` unless ``b`` is of exactly ``a``'s class, else the tuples of the
  fields with ``compare=True`` are compared;
* ``hash(a)``: the hash of the tuple of the fields with ``hash=True``, or ``compare=True`` where
  ``hash`` is None (with ``eq=False``: the object's own hash, as ``dataclass`` leaves it);
* ``repr(a)``: ``QualName(field=value!r, …)`` over the fields with ``repr=True``, ``...`` for a
  record met again inside itself;
* the frozen ``__setattr__``/``__delattr__``: ``FrozenInstanceError`` for any name on the class's
  own instances and for a field's name on a subclass's;

as small closures over one ``operator.attrgetter`` per class, with the behaviour ``dataclass``
writes (Python 3.11, ``dataclasses._process_class``); and ``__init__`` written and compiled as
``dataclass`` writes it for a frozen class (each field set with ``object.__setattr__``, defaults
and default factories, ``init=False`` fields, ``__post_init__``), but only when the class is
first instantiated: the records a start reads from the profile cache are unpickled, never made by
``__init__``, and many classes are never instantiated on a given path.

A method the class body defines itself is kept, as ``dataclass`` keeps it (an own
``__setattr__``/``__delattr__`` is refused, as ``dataclass`` refuses it).  The class is a frozen
dataclass in every other way (``dataclasses.fields``, ``replace``, ``asdict``, pickling,
``__dataclass_params__.frozen``).  A class with dataclass bases or other ``dataclass`` options
(``order``, ``slots``, …) is made by ``dataclass(frozen=True)`` itself, with the shared
``__eq__``, ``__hash__`` and ``__repr__``; ``kw_only`` and ``InitVar`` fields are refused.
``tests/test_frozen.py`` compares each behaviour with ``dataclass(frozen=True)`` itself.
"""

from __future__ import annotations

import dataclasses
import inspect
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
    if kwargs or any(dataclasses.is_dataclass(base) for base in cls.__mro__[1:]):
        made = dataclasses.dataclass(cls, frozen=True, eq=False, repr=False, **kwargs)
    else:
        for name in ("__setattr__", "__delattr__"):
            if name in own:  # as dataclass(frozen=True) refuses it
                raise TypeError(f"Cannot overwrite attribute {name} in class {cls.__name__}")
        documented = own.get("__doc__") is not None  # (dataclass gives the others one: see _make_frozen)
        made = dataclasses.dataclass(cls, init=False, frozen=False, eq=False, repr=False)
        _make_frozen(made, own, documented)
    fields = dataclasses.fields(made)
    keys["compare"] = values_getter([f.name for f in fields if f.compare])
    keys["hash"] = values_getter([f.name for f in fields if (f.compare if f.hash is None else f.hash)])
    keys["repr names"] = [f.name for f in fields if f.repr]
    keys["repr"] = values_getter(keys["repr names"])
    return made


class _Factory:
    """The default of an ``__init__`` parameter whose field has a default factory, shown as
    ``dataclass`` shows it (where a Python has no marker of its own to share)."""

    def __repr__(self) -> str:
        return "<factory>"


_HAS_DEFAULT_FACTORY = getattr(dataclasses, "_HAS_DEFAULT_FACTORY", None) or _Factory()
"""dataclass's own marker (Python 3.7–3.13), so that the signatures are equal, not only alike."""


def _make_frozen(cls: type, own, documented: bool) -> None:
    """Make a class ``dataclass`` processed with ``init=False, frozen=False`` a frozen dataclass:
    the frozen ``__setattr__``/``__delattr__``, the ``__init__`` written on first use (its
    signature known before), and the class's parameters marked frozen (what ``dataclass`` checks
    of a base class)."""
    fields = dataclasses.fields(cls)
    names = frozenset(f.name for f in fields)
    params = [inspect.Parameter("self", inspect.Parameter.POSITIONAL_OR_KEYWORD)]
    for f in fields:
        if f.kw_only:
            raise TypeError(f"@frozen: field {f.name!r} of {cls.__name__} is keyword-only; use @dataclass(frozen=True)")
        if not f.init:
            continue
        if f.default is not dataclasses.MISSING:
            default = f.default
        elif f.default_factory is not dataclasses.MISSING:
            default = _HAS_DEFAULT_FACTORY
        elif params[-1].default is not inspect.Parameter.empty:  # as dataclass refuses it
            raise TypeError(f"non-default argument {f.name!r} follows default argument")
        else:
            default = inspect.Parameter.empty
        params.append(inspect.Parameter(f.name, inspect.Parameter.POSITIONAL_OR_KEYWORD, default=default,
                                        annotation=f.type))
    for annotation in cls.__dict__.get("__annotations__", {}).values():
        if annotation is dataclasses.InitVar or isinstance(annotation, dataclasses.InitVar) \
                or str(annotation).startswith(("InitVar", "dataclasses.InitVar")):
            raise TypeError(f"@frozen: {cls.__name__} has an InitVar; use @dataclass(frozen=True)")

    def __setattr__(self, name, value):
        if type(self) is cls or name in names:
            raise dataclasses.FrozenInstanceError(f"cannot assign to field {name!r}")
        super(cls, self).__setattr__(name, value)

    def __delattr__(self, name):
        if type(self) is cls or name in names:
            raise dataclasses.FrozenInstanceError(f"cannot delete field {name!r}")
        super(cls, self).__delattr__(name)

    for fn in (__setattr__, __delattr__):
        fn.__qualname__ = f"{cls.__qualname__}.{fn.__name__}"
        setattr(cls, fn.__name__, fn)
    if "__init__" not in own:
        def __init__(self, *args, **kwargs):
            real = _init_of(cls, fields)
            if cls.__dict__.get("__init__") is __init__:
                cls.__init__ = real
            real(self, *args, **kwargs)

        __init__.__qualname__ = f"{cls.__qualname__}.__init__"
        __init__.__signature__ = inspect.Signature(params, return_annotation=None)
        cls.__init__ = __init__
        if not documented:  # what dataclass gives a class without a docstring (it had no __init__ to show yet)
            cls.__doc__ = cls.__name__ + str(inspect.signature(cls)).replace(" -> None", "")
    cls.__dataclass_params__.frozen = True


def _init_of(cls: type, fields) -> Callable:
    """The ``__init__`` ``dataclass`` writes for a frozen class with these fields (Python 3.11
    ``dataclasses._init_fn``): each init field a parameter (its default, or the default-factory
    marker), each field set with ``object.__setattr__``, a factory called when its parameter was
    not given, an ``init=False`` field set to its default or its factory's value, then
    ``__post_init__`` if the class has one."""
    ns: dict[str, Any] = {"__dataclass_builtins_object__": object, "_HAS_DEFAULT_FACTORY": _HAS_DEFAULT_FACTORY}
    params, body, annotations = ["self"], [], {}
    for f in fields:
        default = f"_dflt_{f.name}"
        if f.default_factory is not dataclasses.MISSING:
            ns[default] = f.default_factory
            if f.init:
                params.append(f"{f.name}=_HAS_DEFAULT_FACTORY")
                value = f"{default}() if {f.name} is _HAS_DEFAULT_FACTORY else {f.name}"
            else:
                value = f"{default}()"
        elif f.default is not dataclasses.MISSING:
            ns[default] = f.default
            if f.init:
                params.append(f"{f.name}={default}")
            value = f.name if f.init else default
        elif f.init:
            params.append(f.name)
            value = f.name
        else:
            continue
        if f.init:
            annotations[f.name] = f.type
        body.append(f"  __dataclass_builtins_object__.__setattr__(self, {f.name!r}, {value})")
    if hasattr(cls, "__post_init__"):
        body.append("  self.__post_init__()")
    exec(f"def __init__({', '.join(params)}):\n" + ("\n".join(body) or "  pass") + "\n", ns)
    init = ns["__init__"]
    init.__qualname__ = f"{cls.__qualname__}.__init__"
    init.__annotations__ = {**annotations, "return": None}
    return init


def frozen(cls: T | None = None, /, *, eq: bool = True, **kwargs):
    """``@frozen`` or ``@frozen(eq=False, …)``: as ``@dataclass(frozen=True, eq=…, …)``."""
    if cls is None:
        return lambda c: _make(c, eq, kwargs)
    return _make(cls, eq, kwargs)
