"""``@frozen`` behaves as ``@dataclass(frozen=True)`` (deckload/core/frozen.py).

The reference is the standard library's ``dataclasses`` itself: each class below is made twice,
once by ``dataclass(frozen=True, …)`` and once by ``frozen(…)``, from the same body, and every
behaviour a caller can see is compared: equality with its ``NotImplemented`` for another class,
the hash, the repr (recursion included), the refusal to assign or delete a field, ``replace``,
``asdict``, pickling, the fields and ``__match_args__``, methods the body defines itself, and
``eq=False`` (identity).
"""

from __future__ import annotations

import dataclasses
import pickle
from dataclasses import field

import pytest

from deckload.core.frozen import frozen


def _both(body: dict, **kwargs):
    """The class made from ``body`` by dataclass (the reference) and by frozen, under one name."""
    made = []
    for deco in (lambda c: dataclasses.dataclass(c, frozen=True, **kwargs), lambda c: frozen(c, **kwargs)):
        ns = dict(body)
        ns.setdefault("__module__", __name__)
        ns.setdefault("__qualname__", "Sample")
        made.append(deco(type("Sample", (), ns)))
    return made


PLAIN = {"__annotations__": {"a": "float", "b": "str", "c": "tuple"}, "b": "x", "c": ()}
WITH_OPTIONS = {
    "__annotations__": {"a": "float", "hidden": "int", "skip": "list", "only_hash": "int"},
    "hidden": field(default=0, repr=False),
    "skip": field(default_factory=list, compare=False),
    "only_hash": field(default=3, compare=False, hash=True),
}
NO_FIELDS: dict = {"__annotations__": {}}
ONE_FIELD = {"__annotations__": {"a": "float"}}


@pytest.mark.parametrize("body", [PLAIN, WITH_OPTIONS, NO_FIELDS, ONE_FIELD], ids=["plain", "options", "none", "one"])
def test_equality_hash_and_repr_are_those_of_a_frozen_dataclass(body):
    ref, mine = _both(body)
    args = {"a": 1.5} if body["__annotations__"] else {}
    for cls in (ref, mine):
        x, y = cls(**args), cls(**args)
        assert x == y and not (x != y)
        assert x.__eq__(object()) is NotImplemented
    assert repr(ref(**args)) == repr(mine(**args))
    assert hash(ref(**args)) == hash(mine(**args))  # the same tuple of fields is hashed
    if "a" in args:
        assert (ref(a=1.5) == ref(a=2.5)) == (mine(a=1.5) == mine(a=2.5)) is False
    if body is WITH_OPTIONS:
        # a field with compare=False: equal either way; hash=True alone: in the hash only
        for cls in (ref, mine):
            assert cls(a=1.0, skip=[1]) == cls(a=1.0, skip=[2])
            assert cls(a=1.0, only_hash=1) == cls(a=1.0, only_hash=2)
        assert hash(ref(a=1.0, only_hash=1)) == hash(mine(a=1.0, only_hash=1))
        assert hash(ref(a=1.0, only_hash=1)) != hash(ref(a=1.0, only_hash=2))
        assert "hidden" not in repr(mine(a=1.0)) and repr(ref(a=1.0, hidden=4)) == repr(mine(a=1.0, hidden=4))


def test_another_class_with_the_same_fields_is_not_equal():
    ref_a, mine_a = _both(PLAIN)
    ref_b, mine_b = _both(PLAIN)
    assert ref_a(a=1.0) != ref_b(a=1.0) and mine_a(a=1.0) != mine_b(a=1.0)
    sub_ref = dataclasses.dataclass(frozen=True)(type("Sub", (ref_a,), {"__annotations__": {}}))
    sub_mine = frozen(type("Sub", (mine_a,), {"__annotations__": {}}))
    assert (ref_a(a=1.0) == sub_ref(a=1.0)) == (mine_a(a=1.0) == sub_mine(a=1.0)) is False


def test_a_field_cannot_be_assigned_or_deleted():
    for cls in _both(PLAIN):
        x = cls(a=1.0)
        with pytest.raises(dataclasses.FrozenInstanceError):
            x.a = 2.0
        with pytest.raises(dataclasses.FrozenInstanceError):
            del x.b
        with pytest.raises(dataclasses.FrozenInstanceError):
            x.new = 1


def test_replace_asdict_pickle_fields_and_match_args_are_unchanged():
    ref, mine = _both(WITH_OPTIONS)
    x, y = ref(a=1.0, skip=[1, 2]), mine(a=1.0, skip=[1, 2])
    assert dataclasses.asdict(x) == dataclasses.asdict(y)
    assert dataclasses.replace(y, a=3.0) == mine(a=3.0, skip=[1, 2]) and dataclasses.replace(y, a=3.0).a == 3.0
    assert [f.name for f in dataclasses.fields(x)] == [f.name for f in dataclasses.fields(y)]
    assert ref.__match_args__ == mine.__match_args__
    assert dataclasses.is_dataclass(mine) and mine.__dataclass_params__.frozen
    assert ref.__init__.__doc__ == mine.__init__.__doc__


@frozen
class _Pickled:
    """A record at module level, where pickle can find it."""

    a: float
    b: tuple = ()


def test_a_record_pickles_and_unpickles_equal():
    x = _Pickled(1.0, (2, 3))
    assert pickle.loads(pickle.dumps(x)) == x and hash(pickle.loads(pickle.dumps(x))) == hash(x)


def test_a_record_inside_itself_is_shown_as_dots():
    body = {"__annotations__": {"items": "list"}}
    shown = []
    for cls in _both(body):
        x = cls([])
        x.items.append(x)
        shown.append(repr(x))
    assert shown[0] == shown[1] == "Sample(items=[...])"


def test_methods_the_body_defines_are_kept():
    body = {
        "__annotations__": {"a": "float"},
        "__eq__": lambda self, other: True,
        "__repr__": lambda self: "mine",
    }
    for cls in _both(body):
        assert cls(1.0) == cls(2.0) and repr(cls(1.0)) == "mine"
        # a body with __eq__ alone has __hash__ None; a frozen dataclass gives it one over the fields
        assert hash(cls(1.0)) == hash((1.0,))
    explicit = {"__annotations__": {"a": "float"}, "__hash__": lambda self: 7}
    for cls in _both(explicit):
        assert hash(cls(1.0)) == 7


def test_eq_false_compares_and_hashes_by_identity():
    for cls in _both(PLAIN, eq=False):
        x, y = cls(a=1.0), cls(a=1.0)
        assert x != y and x == x and hash(x) == object.__hash__(x)
    ref, mine = _both(PLAIN, eq=False)
    assert repr(ref(a=1.0)) == repr(mine(a=1.0))


def test_a_record_of_the_package_is_a_frozen_dataclass_with_its_behaviour():
    """The package's own records are made by frozen (spot check on the condition and the result)."""
    from deckload.core.model import Condition, TankFill
    from deckload.core.result import Result

    a = Condition(name="x", tanks=(TankFill("T1", "volume_m3", 1.0),))
    b = Condition(name="x", tanks=(TankFill("T1", "volume_m3", 1.0),))
    assert a == b and hash(a) == hash(b) and a != dataclasses.replace(a, name="y")
    assert repr(a).startswith("Condition(name='x'")
    assert dataclasses.is_dataclass(Result) and Result.__dataclass_params__.frozen
    with pytest.raises(dataclasses.FrozenInstanceError):
        a.name = "z"


INIT_KINDS = {
    "__annotations__": {"a": "float", "b": "list", "c": "int", "d": "dict", "e": "float", "total": "float"},
    "b": field(default_factory=list),
    "c": 4,
    "d": field(default_factory=dict, init=False),
    "e": field(default=0.5, init=False),
    "total": field(init=False, repr=False),
    "__post_init__": lambda self: object.__setattr__(self, "total", self.a + self.c + self.e),
}


def test_init_sets_defaults_factories_and_fields_not_in_init_as_dataclass_does():
    """Defaults, default factories (a new object for each record), fields left out of ``__init__``
    with a default, a factory or neither (set by ``__post_init__``), and ``__post_init__`` itself."""
    ref, mine = _both(INIT_KINDS)
    for args, kwargs in (((1.0,), {}), ((1.0, [2]), {"c": 5}), ((), {"a": 2.0, "c": 1})):
        x, y = ref(*args, **kwargs), mine(*args, **kwargs)
        assert dataclasses.asdict(x) == dataclasses.asdict(y) and repr(x) == repr(y)
        assert y.total == y.a + y.c + y.e
    first, second = mine(1.0), mine(1.0)
    assert first.b is not second.b and first.d is not second.d  # each record its own list and dict


def test_a_wrong_call_is_refused_in_the_same_words():
    ref, mine = _both(PLAIN)
    for args, kwargs in (((), {}), ((1.0, "y", (), 4), {}), ((1.0,), {"z": 1}), ((1.0,), {"a": 2.0})):
        words = []
        for cls in (ref, mine):
            with pytest.raises(TypeError) as err:
                cls(*args, **kwargs)
            words.append(str(err.value))
        assert words[0] == words[1]


def test_signature_and_doc_are_those_of_a_frozen_dataclass_before_and_after_the_first_record():
    import inspect

    body = dict(INIT_KINDS)
    body.pop("__post_init__")
    ref, mine = _both(body)
    assert "__init__" in mine.__dict__  # not yet compiled: made on the first record
    assert inspect.signature(ref) == inspect.signature(mine) and ref.__doc__ == mine.__doc__, (ref.__doc__, mine.__doc__)
    first_init = mine.__dict__["__init__"]
    mine(1.0)
    assert mine.__dict__["__init__"] is not first_init  # the written __init__ took its place
    assert inspect.signature(ref) == inspect.signature(mine)
    assert ref.__init__.__annotations__ == mine.__init__.__annotations__
    assert ref.__init__.__qualname__ == mine.__init__.__qualname__


def test_what_dataclass_refuses_is_refused():
    bad_order = {"__annotations__": {"a": "float", "b": "int"}, "a": 1.0}
    own_setattr = {"__annotations__": {"a": "float"}, "__setattr__": lambda self, n, v: None}
    for body in (bad_order, own_setattr):
        for deco in (lambda c: dataclasses.dataclass(c, frozen=True), frozen):
            ns = dict(body, __module__=__name__, __qualname__="Sample")
            with pytest.raises(TypeError):
                deco(type("Sample", (), ns))


def test_keyword_only_fields_are_refused_with_the_way_out():
    ns = {"__annotations__": {"a": "float"}, "a": field(kw_only=True), "__module__": __name__, "__qualname__": "S"}
    with pytest.raises(TypeError, match="keyword-only; use @dataclass"):
        frozen(type("S", (), ns))


def test_a_frozen_subclass_of_a_frozen_record():
    """A subclass made by frozen of a class made by frozen (as DeckItem of MassItem): dataclass
    accepts the frozen base, the subclass is frozen, and both construct as dataclass's do."""
    ref_base, mine_base = _both(PLAIN)
    sub = {"__annotations__": {"d": "int"}, "d": 7}
    ref_sub = dataclasses.dataclass(frozen=True)(type("Sub", (ref_base,), dict(sub, __module__=__name__)))
    mine_sub = frozen(type("Sub", (mine_base,), dict(sub, __module__=__name__)))
    x, y = ref_sub(1.0, "z"), mine_sub(1.0, "z")
    assert dataclasses.asdict(x) == dataclasses.asdict(y) and mine_sub.__dataclass_params__.frozen
    for attr in ("a", "d", "new"):
        with pytest.raises(dataclasses.FrozenInstanceError):
            setattr(y, attr, 1)
    assert mine_base(a=1.0) != y  # another class: not equal, as dataclass's
