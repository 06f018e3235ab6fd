"""The condition reader refuses what the loading screen refuses, and accepts what it saves.

A condition file is what the screen saves and reads back at the next start (its working
condition); a value one side takes and the other refuses either loses the officer's condition
(moved aside as unreadable) or lets a file say what no one could type.  Each rule is asked of
both sides here: ``ui.entry`` (the screen's checks) and ``io.profiles.parse_condition`` (the
reader), on the demo vessels.
"""

from __future__ import annotations

import math

import pytest

from deckload.core.bounds import ROUND_OFF
from deckload.core.loading import reading_range, resolve_tank
from deckload.core.model import Condition, TankFill
from deckload.io.profiles import ProfileError, dump_condition, parse_condition
from deckload.ui.entry import EntryError, check_tank_amount, set_tank
from demo_vessels import demo_vessel, trawler_vessel

HEAD = 'format = "deckload-condition-1"\n\n[condition]\nname = "probe"\nwater_density_t_m3 = 1.025\n'


def cond_text(body: str, head: str = HEAD) -> str:
    return head + "\n" + body


def problems(text: str, vessel) -> list:
    try:
        parse_condition(text, "probe.condition.toml", vessel)
    except ProfileError as e:
        return e.problems
    return []


def line_of(text: str, needle: str) -> int:
    return next(i for i, line in enumerate(text.splitlines(), 1) if needle in line)


def screen_refuses(enter) -> bool:
    """Whether the screen's check (``enter()``, a ui.entry call) refuses the value."""
    try:
        enter()
    except EntryError:
        return True
    return False


def assert_alike(screen_refused: bool, refused: bool, text: str, vessel, key: str, rule: str) -> None:
    """The screen and the reader both refuse (``refused``) or both take the value; a file's refusal
    names the file, the line of ``mass_t`` and ``key``, with ``rule``."""
    found = problems(text, vessel)
    assert screen_refused == refused == bool(found)
    if refused:
        (p,) = found
        assert (p.file, p.line, p.key, p.rule) == ("probe.condition.toml", line_of(text, "mass_t"), key, rule)


# ----------------------------------------------------------------------------- tank amounts

def test_a_full_tank_stated_by_its_first_ullage_is_saved_and_read_back():
    """The trawler's FO1P booklet table (demo_trawler/tanks/FO1P.csv) starts at ullage 0.349 m, the
    tank full (11.560 m³).  ``reading_range`` gives 0.3490000000000002 (ref − (ref − 0.349) in
    floating point); the screen took 0.349 within its round-off and the reader refused the file it
    saved ('below 0.349 m: must be between 0.349 and 2.87 m'), so the next start set the working
    condition aside."""
    v = trawler_vessel()
    tank = v.tank("FO1P")
    assert reading_range(tank, "ullage_m")[0] != 0.349  # the round-off this is about
    cond = set_tank(Condition(name="probe"), tank, "ullage_m", 0.349)
    back = parse_condition(dump_condition(cond), "working.condition.toml", v)
    assert back.tank_fill("FO1P") == TankFill("FO1P", "ullage_m", 0.349)
    assert resolve_tank(tank, back.tank_fill("FO1P")).volume_m3 == pytest.approx(11.560, abs=1e-9)


def _amount_limits(tank, quantity):
    """(low, high) of each way of stating a tank's contents, as the screen's check words them."""
    if quantity in ("sounding_m", "ullage_m"):
        lo, hi = reading_range(tank, quantity)
        return max(lo, 0.0), hi  # no tape reads a negative length (test below)
    return 0.0, {"percent": 100.0, "volume_m3": tank.capacity_m3, "mass_t": tank.capacity_m3 * tank.density_t_m3}[quantity]


def _cases():
    for vessel in (demo_vessel, trawler_vessel):
        for tank in vessel().tanks:
            for q in ("percent", "volume_m3", "mass_t", "sounding_m", "ullage_m"):
                if q in ("sounding_m", "ullage_m") and not tank.level_known:
                    continue
                if q == "ullage_m" and tank.ullage_reference_m is None:
                    continue
                yield pytest.param(vessel, tank.id, q, id=f"{vessel.__name__}-{tank.id}-{q}")


@pytest.mark.parametrize("vessel, tank_id, quantity", list(_cases()))
def test_screen_and_reader_agree_at_both_ends_of_every_amount(vessel, tank_id, quantity):
    """At each end of every tank's range, in every quantity (percent, m³, t, sounding, ullage): the
    end itself, the end as printed to 3 decimals (what a booklet prints and an officer types), the
    end moved out by half the round-off allowance (bounds.ROUND_OFF·max(1, |end|): taken as the
    end) and by 1e-6 (refused).  The screen's check and the reader say the same every time, and a
    value both take the calculation reads."""
    v = vessel()
    tank = v.tank(tank_id)
    lo, hi = _amount_limits(tank, quantity)
    for end, out in ((lo, -1.0), (hi, 1.0)):
        allow = ROUND_OFF * max(1.0, abs(end))
        for value in (end, round(end, 3), end + out * 0.5 * allow, end + out * 1e-6):
            try:
                check_tank_amount(tank, quantity, value, tank.density_t_m3)
                screen = True
            except EntryError:
                screen = False
            text = cond_text(f"[tanks.{tank_id}]\n{quantity} = {value!r}\n")
            found = problems(text, v)
            assert screen == (not found), (value, screen, [str(p) for p in found])
            if screen:
                assert math.isfinite(resolve_tank(tank, TankFill(tank_id, quantity, value)).volume_m3)
            else:
                (p,) = found
                assert (p.key, p.line) == (f"tanks.{tank_id}.{quantity}", line_of(text, f"{quantity} = "))


def test_a_negative_sounding_is_refused_from_a_file_as_on_the_screen():
    """The trawler's FW2 has its sounding zero 30 mm above the bottom (sounding_zero_m = 0.03) and its
    booklet table starts at sounding 0.00 (0.016 m³, demo_trawler/tanks/FW2.csv); the row deckload
    adds below it ('level 0, volume 0') made the reader take soundings down to −0.03 m, which no tape
    reads and the screen refuses.  Both now read from 0: −0.02 is refused, naming file, line and key;
    0 is the booklet's first row."""
    v = trawler_vessel()
    tank = v.tank("FW2")
    assert reading_range(tank, "sounding_m")[0] == pytest.approx(-0.03, abs=1e-12)
    for value in (-0.02, -0.03):
        with pytest.raises(EntryError):
            check_tank_amount(tank, "sounding_m", value, 1.0)
        text = cond_text(f"[tanks.FW2]\nsounding_m = {value}\n")
        (p,) = problems(text, v)
        assert (p.file, p.line, p.key, p.value) == ("probe.condition.toml", line_of(text, "sounding_m"),
                                                   "tanks.FW2.sounding_m", repr(value))
        assert p.rule.startswith("below 0 m: must be between 0 and 0.97 m")
    back = parse_condition(cond_text("[tanks.FW2]\nsounding_m = 0.0\n"), "probe.condition.toml", v)
    assert resolve_tank(tank, back.tank_fill("FW2")).volume_m3 == pytest.approx(0.016, abs=1e-12)


@pytest.mark.parametrize("value, shown", [(0.3489, "0.349"), (0.3489999985, "0.349"), (2.8700001, "2.87")])
def test_a_refused_reading_never_reads_as_its_own_bound(value, shown):
    """The rule names the bound to as many digits as tell it from the value refused: the value is
    printed as written and never equals the bound's text."""
    text = cond_text(f"[tanks.FO1P]\nullage_m = {value!r}\n")
    (p,) = problems(text, trawler_vessel())
    side = "below" if value < 1 else "above"
    assert p.value == repr(value) and p.rule.startswith(f"{side} {shown} m: must be between 0.349 and 2.87 m")
    assert p.value != shown


# ----------------------------------------------------------------------------- text fields

SPOOF = "Departure\\n\\n  MET: every criterion passed, GM fluid 2.000 m"
"""A name whose line feeds would print a verdict line of its own under calc, report --txt and log show."""

ITEM = "mass_t = 3.0\nlcg_m = 20.0\nvcg_m = 5.0\ntcg_m = 0.0\n"


def _with_text(where: str, text: str) -> tuple[str, str]:
    """A condition with ``text`` (TOML basic-string contents) in the field ``where``, and its dotted key."""
    if where == "name":
        return HEAD.replace('name = "probe"', f'name = "{text}"'), "condition.name"
    if where in ("remark", "modified_from"):
        return HEAD + f'{where} = "{text}"\n', f"condition.{where}"
    if where == "description":
        return cond_text(f'[holds.H1]\nmass_t = 10.0\ndescription = "{text}"\n'), "holds.H1.description"
    return cond_text(f'[[{where}]]\nname = "{text}"\n{ITEM}'), f"{where}[#1].name"


FIELDS = ["name", "remark", "modified_from", "description", "deck_item", "constant"]


@pytest.mark.parametrize("where", FIELDS)
@pytest.mark.parametrize("text, says", [(SPOOF, "holds a line break: must be one line"),
                                        ("crate\\r\\n  Verdict: met", "holds a line break: must be one line"),
                                        ("a\\tb", "holds a tab: must be one line")],
                         ids=["verdict-spoof", "crlf", "tab"])
def test_names_remarks_and_descriptions_are_one_line(where, text, says):
    """The screen's fields are one line (a condition's name, an item's name); the remark and a hold's
    cargo description have no field of several lines and are printed on one (the report's title
    line, the hold's row): a line feed or tab is refused with file, line and key, and the value is
    quoted with its line breaks written as escapes, so the message itself prints no false line."""
    body, key = _with_text(where, text)
    (p,) = problems(body, demo_vessel())
    assert (p.file, p.key, p.line) == ("probe.condition.toml", key, line_of(body, text[:5]))
    assert p.rule.startswith(says), p.rule
    assert "\n" not in str(p) and "\t" not in str(p)


@pytest.mark.parametrize("where, limit", [("name", 80), ("modified_from", 80), ("deck_item", 200), ("constant", 200),
                                          ("description", 200), ("remark", 2000)])
def test_file_text_is_bounded_as_the_screen_bounds_it(where, limit):
    """A condition's name: 80 characters, as the screen's save form takes it (condition_files.MAX_NAME_CHARS);
    an item's name: 200, the item form's limit (ui.entry.item_from_form, limits.MAX_ITEM_NAME_CHARS), a
    hold's cargo description the same; a remark: 2000, what the screen takes as the log's remark
    (logbook.book.MAX_TEXT_CHARS).  At the limit it is read; one more is refused, naming the count."""
    v = demo_vessel()
    body, key = _with_text(where, "x" * limit)
    assert problems(body, v) == []
    body, key = _with_text(where, "x" * (limit + 1))
    (p,) = problems(body, v)
    assert (p.key, p.line, p.rule) == (key, line_of(body, "x" * 10), f"at most {limit} characters ({limit + 1} given)")


def test_the_item_forms_name_limit_is_the_readers():
    """A name of 201 characters: refused by the screen's item form and by the reader alike; 200 by neither."""
    from deckload.ui.entry import ItemForm, item_from_form

    v = demo_vessel()
    for n, refused in ((200, False), (201, True)):
        try:
            item_from_form(v, ItemForm("x" * n, "3", "20", "5"), deck=False)
            screen = False
        except EntryError:
            screen = True
        body, _ = _with_text("constant", "x" * n)
        assert screen == refused == bool(problems(body, v))


def test_a_condition_named_over_lines_is_listed_by_its_file_name(tmp_path):
    """The by-name lookup lists the conditions beside the profile by their titles: a file whose name the
    reader refuses is listed by its file name, not by lines the name would print."""
    from deckload.io import condition_files

    f = tmp_path / "spoof.condition.toml"
    f.write_text(HEAD.replace('name = "probe"', f'name = "{SPOOF}"'), encoding="utf-8")
    assert condition_files.title_of(f) == "spoof.condition.toml"
    f.write_text(HEAD.replace('name = "probe"', f'name = "{"n" * 81}"'), encoding="utf-8")
    assert condition_files.title_of(f) == "spoof.condition.toml"
    # a carriage return, which the reader refuses too, would rewrite the terminal's line
    f.write_text(HEAD.replace('name = "probe"', 'name = "Departure\\r  MET"'), encoding="utf-8")
    assert problems(f.read_text(encoding="utf-8"), demo_vessel())
    assert condition_files.title_of(f) == "spoof.condition.toml"
    f.write_text(HEAD, encoding="utf-8")
    assert condition_files.title_of(f) == "probe"


# ----------------------------------------------------------------------------- holds

@pytest.mark.parametrize("mass, refused", [(250.0, False), (250.0 + 1e-7, False), (250.001, True), (260.0, True)])
def test_a_hold_over_its_structural_limit_is_refused_from_a_file_as_on_the_screen(mass, refused):
    """The Demo Islander's H1 has max_mass_t = 250 t (demo_islander.toml).  The screen refused 260 t and
    a file was read with only a danger warning (audit case hold_over_struct.condition.toml); now the
    file is refused too, naming file, line and key.  At the limit, and within the round-off allowance
    (bounds.ROUND_OFF·250 = 2.5e-7 t), both take it."""
    from deckload.ui.entry import hold_from_text

    v = demo_vessel()
    screen = screen_refuses(lambda: hold_from_text(Condition(), v.hold("H1"), repr(mass), v))
    assert_alike(screen, refused, cond_text(f"[holds.H1]\nmass_t = {mass!r}\n"), v, "holds.H1.mass_t",
                 "above 250 t, the hold's structural limit (max_mass_t in the profile)")


# ----------------------------------------------------------------------------- byte-order mark

BOM_RULE = ("starts with a byte-order mark (U+FEFF, the bytes EF BB BF), which the TOML reader does not take: "
            "save the file as UTF-8 without a byte-order mark")


def test_a_byte_order_mark_is_named_in_a_condition_and_a_profile_alike(tmp_path):
    """An editor that starts UTF-8 files with a byte-order mark made the condition reader say 'TOML syntax:
    Invalid statement (column 1)'.  The profile reader refuses such a file too (Python's TOML reader
    does not take it), so both say what it is, on line 1; the CSV tables, read as spreadsheets write
    them, still take one (csvtables)."""
    from deckload.io.profiles import load_condition, parse_profile

    f = tmp_path / "bom.condition.toml"
    f.write_bytes(b"\xef\xbb\xbf" + cond_text("[tanks.FO1P]\npercent = 50\n").encode())
    with pytest.raises(ProfileError) as e:
        load_condition(f, demo_vessel())
    assert [(p.file, p.line, p.key, p.rule) for p in e.value.problems] == [(str(f), 1, "", BOM_RULE)]
    from deckload.io import paths

    with pytest.raises(ProfileError) as e:
        parse_profile("\ufeff" + paths.TRAWLER_PROFILE.read_text(encoding="utf-8"), "bom.toml")
    assert [(p.line, p.rule) for p in e.value.problems] == [(1, BOM_RULE)]


# ----------------------------------------------------------------------------- deck items

@pytest.mark.parametrize("mass, refused", [(0.0, True), (0.001, False)])
def test_a_deck_load_of_nothing_is_refused_from_a_file_as_on_the_screen(mass, refused):
    """The screen's item form refuses a deck load of 0 t ("remove it with e"); the reader took it.  Both
    now take 0.001 t and refuse 0 t, naming file, line and key.  (A constant may still be 0 t on both.)"""
    from deckload.ui.entry import ItemForm, item_from_form

    v = demo_vessel()
    screen = screen_refuses(lambda: item_from_form(v, ItemForm("Crate", repr(mass), "20.0", "4.0"), deck=True))
    text = cond_text(f'[[deck_item]]\nname = "Crate"\nmass_t = {mass!r}\nlcg_m = 20.0\nvcg_m = 4.0\n')
    assert_alike(screen, refused, text, v, "deck_item[#1].mass_t",
                 "a deck load must weigh more than 0 t: leave the item out instead")


def test_a_sounding_of_nil_is_what_the_tanks_table_says_on_the_screen_as_in_a_file():
    """The Demo Trawler's FW2 booklet table starts at sounding 0.00 m with 0.016 m³ (its CSV), as a
    booklet's first row may sit above the bottom.  The screen emptied the tank on "0m" and a file's
    sounding_m = 0.0 read 0.016 m³; both now keep the reading and take the table's volume."""
    from deckload.ui.entry import fill_volume_m3

    v = trawler_vessel()
    tank = v.tank("FW2")
    screen = set_tank(Condition(), tank, "sounding_m", 0.0).tank_fill("FW2")
    text = cond_text("[tanks.FW2]\nsounding_m = 0.0\n")
    file = parse_condition(text, "probe.condition.toml", v).tank_fill("FW2")
    assert screen == file == TankFill("FW2", "sounding_m", 0.0)
    assert fill_volume_m3(tank, screen) == pytest.approx(0.016, abs=1e-12)
    # a zero amount still empties: nothing in her
    for q in ("percent", "volume_m3", "mass_t"):
        assert set_tank(Condition(), tank, q, 0.0).tank_fill("FW2") is None, q


def test_a_condition_written_for_another_vessel_is_refused_naming_both(tmp_path):
    """The demo trawler's grounds condition on the Islander's profile: FO1P, FO1S and FPT are ids of
    both, so without the vessel's name the file would read, tank for tank, as hers.  [condition]
    vessel names the vessel; with another profile the reader refuses it, naming file, line, key and
    both vessels.  The screen's saves write it, and read back with her own profile."""
    from deckload.io import paths
    from deckload.io.profiles import load_condition, save_condition

    islander, trawler = demo_vessel(), trawler_vessel()
    grounds = paths.TRAWLER_PROFILE.parent / "demo_trawler.grounds.condition.toml"
    assert not problems(grounds.read_text(encoding="utf-8"), trawler)
    # only tanks both vessels have: nothing but the vessel's name tells the file apart
    shared = HEAD.replace('name = "probe"\n', 'name = "probe"\nvessel = "Demo Trawler"\n') + \
        "\n[tanks.FO1P]\npercent = 80.0\n\n[tanks.FO1S]\npercent = 80.0\n\n[tanks.FPT]\npercent = 50.0\n"
    assert [(p.line, p.key, p.rule) for p in problems(shared, islander)] == [(
        line_of(shared, 'vessel = "Demo Trawler"'), "condition.vessel",
        "this condition was written for 'Demo Trawler', not for 'Demo Islander' (the profile it is read with)")]
    assert not problems(shared, trawler)
    assert not problems(shared.replace('vessel = "Demo Trawler"\n', ""), islander)  # hand-written: no key, read
    c = load_condition(grounds, trawler)
    saved = tmp_path / "w.condition.toml"
    save_condition(saved, c, trawler.particulars.name)
    assert 'vessel = "Demo Trawler"' in saved.read_text(encoding="utf-8")
    assert load_condition(saved, trawler) == c
    with pytest.raises(ProfileError):
        load_condition(saved, islander)


async def test_the_screens_working_file_names_its_vessel(tmp_path):
    """The loading screen's saves carry [condition] vessel (Session's save), so its working file
    cannot later be read with another vessel's profile."""
    from deckload.ui.launch import create_app

    v, c = demo_vessel(), Condition(name="Pilot", tanks=(TankFill("DB1P", "percent", 50.0),))
    app = create_app(v, c, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("plus")
        app.session.flush()
        await pilot.pause()
    text = app.session.save_path.read_text(encoding="utf-8")
    assert f'vessel = "{v.particulars.name}"' in text
    assert [p.key for p in problems(text, trawler_vessel())][:1] == ["condition.vessel"]
