"""Command line: argument parsing; reads files, builds finished objects, hands them on.

Each sub-command's work lives in the module named beside it; imports are lazy so
that ``deckload calc`` does not pay for textual and the screen does not pay for
the report writer.
"""

from __future__ import annotations

import argparse
import os
import sys
from pathlib import Path

from deckload.cli import startup

COMMANDS = ("open", "calc", "check", "tables", "csv", "marks", "report", "log")
"""The sub-commands, as :func:`_parser` declares them."""


class _NotDeclared:
    """Stands for a sub-command's parser that this run does not need (see :func:`_parser`)."""

    def __getattr__(self, name):
        return lambda *args, **kwargs: self


def _parser(only: str | None = None) -> argparse.ArgumentParser:
    """The command line.  ``only``: the sub-command typed first, when it is one; the others are
    then not declared (argparse builds a help formatter and looks up its message translations
    for every argument: some 15 ms that ``deckload calc`` would spend on the other commands).
    Its help, usage and error messages are the same either way."""
    p = argparse.ArgumentParser(
        prog="deckload",
        description=(
            "Loading and intact-stability calculator. It supports, and never replaces, the "
            "approved stability booklet, the master's judgement and flag-state/class rules."
        ),
    )
    from deckload import __version__

    p.add_argument("--version", action="version", version=f"deckload {__version__}")
    p.add_argument("--no-cache", action="store_true",
                   help="read the profile from its files, not from the cache of validated profiles "
                        "(the same as setting DECKLOAD_NO_CACHE=1)")
    # The metavar argparse would make from every command, so that usage lines read the same when
    # only one is declared.
    sub = p.add_subparsers(dest="command", metavar="{" + ",".join(COMMANDS) + "}")

    def add(name: str, **kwargs):
        return sub.add_parser(name, **kwargs) if only is None or name == only else _NotDeclared()

    o = add("open", help="open the loading screen on a vessel (default: the demo vessel)")
    o.add_argument("profile", nargs="?", type=_path)
    o.add_argument("condition", nargs="?", type=_path)

    c = add("calc", help="compute a loading condition and print the result")
    c.add_argument("profile", type=_path)
    c.add_argument("condition", type=_path)
    c.add_argument("--json", action="store_true", help="print one JSON object (SI units)")
    c.add_argument("--direct", action="store_true",
                   help="also compute from the hull geometry and print both methods side by side")

    k = add("check", help="validate a vessel profile and, optionally, a loading condition")
    k.add_argument("profile", type=_path)
    k.add_argument("condition", nargs="?", type=_path)

    t = add("tables", help="compute hydrostatic, cross-curve and tank tables from hull geometry")
    t.add_argument("geometry", type=_path)
    t.add_argument("-o", "--output", type=_path, help="profile to write or refresh (default: print to stdout)")
    t.add_argument("--trims", metavar="T1,T2,...", type=_text,
                   help="also hydrostatics and KN at these trims (m, + by the stern, comma-separated, not 0)")

    x = add("csv", help="write a profile's tables as CSV files, in the booklet's conventions, to compare")
    x.add_argument("profile", type=_path)
    x.add_argument("folder", type=_path, help="folder to write the CSV files in (created if missing)")
    mk = add("marks", help="drafts at the marks; with readings, the displacement and LCG they imply")
    mk.add_argument("profile", type=_path)
    mk.add_argument("condition", type=_path)
    for where in ("aft", "mid", "fwd"):
        mk.add_argument(f"--{where}", nargs=2, type=_reading, metavar=("PORT", "STBD"),
                        help=f"{where} draft readings, port and starboard (m, extreme)")

    r = add("report", help="printable loading-condition report")
    r.add_argument("profile", type=_path)
    r.add_argument("condition", type=_path)
    fmt = r.add_mutually_exclusive_group()
    fmt.add_argument("--html", action="store_true")
    fmt.add_argument("--txt", action="store_true")
    r.add_argument("-o", "--output", type=_path)
    r.add_argument("--direct", action="store_true", help="add the direct calculation from the hull geometry")

    lg = add("log", help="the voyage loading log")
    lg.add_argument("--dir", type=_path, help="log folder (default: ./logs in a checkout, else per-user)")
    lsub = lg.add_subparsers(dest="log_command", required=True)
    rec = lsub.add_parser("record", help="record a loading condition in the log")
    rec.add_argument("profile", type=_path)
    rec.add_argument("condition", type=_path)
    rec.add_argument("--by", required=True, type=_text, help="initials of the officer recording it")
    rec.add_argument("--remark", default="", type=_text)
    rec.add_argument("--kind", default="condition", type=_text, help="event kind (default: condition)")
    rec.add_argument("--ship-offset", type=_text, help="ship's clock offset from UTC, +HH:MM (default: local timezone)")
    show = lsub.add_parser("show", help="print the log")
    show.add_argument("--vessel", type=_text, help="vessel name (default: every log in the folder)")
    exp = lsub.add_parser("export", help="export the log")
    efmt = exp.add_mutually_exclusive_group(required=True)
    efmt.add_argument("--csv", action="store_true")
    efmt.add_argument("--html", action="store_true")
    exp.add_argument("--vessel", type=_text)
    exp.add_argument("-o", "--output", type=_path)
    ver = lsub.add_parser("verify", help="check the log's hash chain")
    ver.add_argument("--vessel", type=_text)
    ver.add_argument("--recover", action="store_true",
                     help="first set aside a torn last line (takes the writer's lock)")
    ver.add_argument("--against", metavar="HASH", type=_text,
                     help="also check a paper copy's anchor: the SHA-256 (or its first 12+ hex digits, "
                          "optionally as N:HASH) printed on a report or export")
    return p


def _undecodable(text: str, way_out: str) -> str | None:
    """Why ``text`` is not text, or None: Python hands over the bytes of an argument that are not
    valid in the terminal's encoding as lone surrogates, which no report, log or message can write
    ('surrogates not allowed' from deep inside, naming nothing)."""
    if not any("\udc80" <= ch <= "\udcff" for ch in text):
        return None
    raw = text.encode(sys.getfilesystemencoding(), "surrogateescape")
    bad = next(ord(ch) - 0xDC00 for ch in text if "\udc80" <= ch <= "\udcff")
    shown = raw.decode("ascii", "backslashreplace")
    return (f"'{shown}' is not valid {sys.getfilesystemencoding()} text (byte 0x{bad:02X}): {way_out}; "
            "reports and the log write text as UTF-8")


def _text(text: str) -> str:
    """A text argument: refused, naming the argument (argparse adds it), when it is not valid text."""
    why = _undecodable(text, "type it in the terminal's encoding")
    if why:
        raise argparse.ArgumentTypeError(why)
    return text


def _path(text: str) -> Path:
    """A file or folder argument: not empty (``Path("")`` is the current folder: ``-o ""`` tried to
    write over it), valid text (:func:`_undecodable`), and no name longer than the file system
    allows (``Path.exists`` raises on one; the error named nothing).  argparse names the argument."""
    import errno

    if not text.strip():
        raise argparse.ArgumentTypeError(f"an empty file name ({text!r}): name a file")
    why = _undecodable(text, "rename the file, or type its name in the terminal's encoding")
    if why:
        raise argparse.ArgumentTypeError(why)
    try:
        os.stat(text)
    except OSError as e:
        if e.errno == errno.ENAMETOOLONG:
            longest = max(len(part.encode("utf-8")) for part in text.split(os.sep))
            raise argparse.ArgumentTypeError(
                f"file name too long ({len(text)} characters, its longest part {longest} bytes; this file "
                "system allows 255 bytes a name on most systems): no file or condition has such a name") from None
    except ValueError:  # a NUL byte cannot reach here from a command line; refused as not a file name
        raise argparse.ArgumentTypeError(f"{text!r} is not a file name") from None
    return Path(text)


def _reading(text: str) -> float:
    """A draft reading in metres: a finite number (the vessel's own bounds are checked later)."""
    import math

    try:
        x = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a number of metres") from None
    if not math.isfinite(x) or x < 0.0:
        raise argparse.ArgumentTypeError(f"{text!r}: a draft reading must be a finite, non-negative number of metres")
    return x


def _demo_shorthand(args: argparse.Namespace) -> str | None:
    """Let 'demo' or 'trawler' stand for a packaged demo profile and a condition's key for its file.

    Returns a message when the condition is neither one of that demo's keys nor a file
    ('deckload calc trawler light': 'light' is the other demo's), else None."""
    from deckload.io.paths import DEMO_VESSELS, exists_quietly, is_file_quietly

    profile = getattr(args, "profile", None)
    if profile is not None and str(profile) in DEMO_VESSELS and not is_file_quietly(profile):
        name = str(profile)
        args.profile, conditions = DEMO_VESSELS[name]
        cond = getattr(args, "condition", None)
        if cond is not None and str(cond) in conditions:
            args.condition = conditions[str(cond)]
        elif cond is not None and not exists_quietly(Path(cond)):
            # 'working', a stock condition's name, or one saved on the screen (deckload.io.condition_files)
            found = _resolve_name(args)
            if isinstance(found, Path):
                args.condition = found
                return None
            return (f"{str(cond)!r} is neither a file nor a condition of the demo vessel {name!r}: "
                    f"give one of {', '.join(conditions)}, working, a saved condition's name, or a condition file"
                    + (f"\n{found}" if found else ""))
    return None


def _resolve_name(args: argparse.Namespace) -> Path | str | None:
    """The file ``args.condition`` names (deckload.io.condition_files.resolve), else why not (None when
    the profile itself cannot be read: the command reports that)."""
    from deckload.io import paths
    from deckload.io.condition_files import ConditionNotFound, resolve
    from deckload.io.profiles import ProfileError
    from deckload.report.audit_findings import load_audited

    try:
        vessel = load_audited(args.profile).vessel
    except (ProfileError, OSError):
        return None
    try:
        return resolve(Path(args.profile), str(args.condition), vessel.particulars.name, paths.working_dir())
    except ConditionNotFound as exc:
        return str(exc)


def _named_condition(args: argparse.Namespace) -> str | None:
    """Let a condition be named as the officer knows it: ``working`` (the loading screen's), a
    stock condition's key or name, or a name saved on the screen (deckload.io.condition_files).
    Returns what to print when the name matches nothing (the message lists what exists)."""
    from deckload.io import paths

    cond = getattr(args, "condition", None)
    profile = getattr(args, "profile", None)
    if cond is None or profile is None or paths.is_file_quietly(Path(cond)) or not paths.is_file_quietly(Path(profile)):
        return None
    from deckload.io.condition_files import ConditionNotFound, resolve
    from deckload.io.profiles import ProfileError
    from deckload.report.audit_findings import load_audited

    try:
        vessel = load_audited(profile).vessel
    except (ProfileError, OSError):
        return None  # the command itself reports the profile's problem
    try:
        args.condition = resolve(Path(profile), str(cond), vessel.particulars.name, paths.working_dir())
    except ConditionNotFound as exc:
        return f"deckload: {exc}"
    return None


def main(argv: list[str] | None = None) -> int:
    """Run one command.  Its error boundary: whatever escapes becomes one paragraph and exit 3
    (deckload.cli.boundary); control characters never reach the terminal (deckload.io.textsafe)."""
    import warnings

    startup.pause()  # until start-up is over (deckload.cli.startup)
    from deckload.io.textsafe import EscapingStream

    # numpy's floating-point warnings are not for the officer: every non-finite number is
    # refused with a message where it is computed (deckload.core.bounds).
    warnings.simplefilter("ignore", RuntimeWarning)
    out, err = sys.stdout, sys.stderr
    if not isinstance(out, EscapingStream):
        sys.stdout, sys.stderr = EscapingStream(out), EscapingStream(err)
    try:
        return _main(argv)
    finally:
        startup.resume()
        if isinstance(sys.stdout, EscapingStream):  # not if a closed pipe replaced it
            sys.stdout = out
        if isinstance(sys.stderr, EscapingStream):
            sys.stderr = err


def _files(args: argparse.Namespace) -> list[str]:
    return [str(getattr(args, k)) for k in ("profile", "condition", "geometry", "output", "dir")
            if getattr(args, k, None) is not None]


def _join_trims(argv: list[str]) -> list[str]:
    """``--trims -1,1`` as ``--trims=-1,1``: argparse would take a list starting with a minus sign
    for an option."""
    out: list[str] = []
    i = 0
    while i < len(argv):
        if argv[i] == "--trims" and i + 1 < len(argv) and argv[i + 1].startswith("-") and argv[i + 1][1:2] in "0123456789.":
            out.append("--trims=" + argv[i + 1])
            i += 2
            continue
        out.append(argv[i])
        i += 1
    return out


def _main(argv: list[str] | None) -> int:
    argv = _join_trims(list(sys.argv[1:] if argv is None else argv))
    args = _parser(argv[0] if argv and argv[0] in COMMANDS else None).parse_args(argv)
    if args.no_cache:
        os.environ["DECKLOAD_NO_CACHE"] = "1"  # for the screen too, which reads it where it loads
    cmd = args.command or "open"
    try:
        return _run(args, cmd)
    except KeyboardInterrupt:
        return 130
    except BrokenPipeError:
        # The reader (e.g. `| head`) went away: not an error of ours.
        sys.stdout = open(os.devnull, "w")
        return 0
    except Exception as e:
        from deckload.logbook import ShipOffsetError

        if isinstance(e, ShipOffsetError):
            print(f"deckload: {e}", file=sys.stderr)
            return 2
        from deckload.cli.boundary import internal_error

        what = {"open": "running the loading screen", "log": f"running 'log {getattr(args, 'log_command', '')}'"}
        return internal_error(e, what.get(cmd, f"running '{cmd}'"), _files(args))


def _run(args: argparse.Namespace, cmd: str) -> int:
    """The command ``cmd``, inside :func:`_main`'s error boundary: the lookup of a condition by its
    name reads the profile and every condition file beside it, and is as much the command as the
    command itself."""
    unknown = _demo_shorthand(args)
    if unknown:
        print(f"deckload: {unknown}", file=sys.stderr)
        return 2
    if cmd in ("open", "calc", "report", "marks", "check") or getattr(args, "log_command", None) == "record":
        missing = _named_condition(args)
        if missing:
            print(missing, file=sys.stderr)
            return 2
    if cmd == "open":
        from deckload.io.textsafe import narrow_encoding

        narrow = narrow_encoding(sys.__stderr__) or narrow_encoding(sys.__stdout__)  # textual draws on stderr
        if narrow is not None:
            # The screen draws its boxes, bars and curve in characters this terminal cannot show:
            # it would print them as "\u2502" and shift every column.
            print(f"deckload: the loading screen needs a terminal that shows UTF-8 (this one writes {narrow}): "
                  "set LANG or LC_ALL to a UTF-8 locale (e.g. C.UTF-8) and start it again; calc, report and "
                  "check print plain text in this terminal", file=sys.stderr)
            return 2
        from deckload.ui.launch import run_open

        return run_open(getattr(args, "profile", None), getattr(args, "condition", None),
                        after_first_frame=startup.resume_and_collect)
    if cmd == "calc":
        from deckload.cli.calc import run_calc

        return run_calc(args.profile, args.condition, as_json=args.json, direct=args.direct)
    if cmd == "check":
        from deckload.cli.check import run_check

        return run_check(args.profile, args.condition)
    if cmd == "tables":
        from deckload.cli.tables import run_tables

        startup.resume()  # a long computation: the collector runs (deckload.cli.startup)
        return run_tables(args.geometry, args.output, args.trims)
    if cmd == "csv":
        from deckload.cli.csv_export import run_csv

        return run_csv(args.profile, args.folder)
    if cmd == "marks":
        from deckload.cli.marks import run_marks

        given = [args.aft, args.mid, args.fwd]
        if any(g is not None for g in given) and not all(g is not None for g in given):
            print("deckload marks: give all six readings (--aft, --mid and --fwd, port and starboard each)",
                  file=sys.stderr)
            return 2
        readings = None if args.aft is None else [*args.aft, *args.mid, *args.fwd]
        return run_marks(args.profile, args.condition, readings)
    if cmd == "report":
        from deckload.cli.report import run_report

        return run_report(args.profile, args.condition, html=not args.txt, output=args.output, direct=args.direct)
    if cmd == "log":
        from deckload.cli.log import run_log

        startup.resume()  # a long log may be read: the collector runs (deckload.cli.startup)
        return run_log(args)
    print(f"deckload: unknown command {cmd!r}", file=sys.stderr)
    return 2


if __name__ == "__main__":
    raise SystemExit(main())
