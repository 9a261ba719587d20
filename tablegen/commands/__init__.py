"""The subcommands of ``tablegen``: one small module each, listed explicitly in :data:`COMMANDS`.

A command module provides:

* ``DESCRIPTION``: the text of ``tablegen NAME --help``;
* ``add_arguments(parser)``: its options (an ``argparse`` parser; options
  that take a value take exactly one, so ``--opt -1..1`` works);
* ``run(ns) -> int``: does the work and returns the exit status.  It raises
  :class:`~tablegen.errors.TablegenError` for anything the user can fix and
  writes its output with :func:`emit` (one write, so a closed pipe or a full
  disk is reported once, as one line).

To add a command: write ``tablegen/commands/NAME.py`` with those three and add
one :class:`Command` line below.  Only the module of the command being run is
imported, so a heavy command costs nothing to ``tablegen value``.

A few commands read their own argv with a parser of their own and are found
by :func:`route` before the main parser runs: ``value d|D|Y`` (functions.py,
function-valued kinds), ``recouple`` (recouple.py), ``lsjj`` (lsjj.py) and
``value --from FILE`` (batch answers, tablegen/batch.py).
"""

from __future__ import annotations

import sys

TYPE_CHECKING = False  # not typing's: importing typing would slow every lookup's start-up
if TYPE_CHECKING:  # pragma: no cover
    from collections.abc import Callable

__all__ = ["Command", "COMMANDS", "command", "emit", "warn", "JSON_FORMAT", "route", "SUMMARIES", "help_formatter",
           "error_line"]

#: True when cli.main runs as the program (it exits afterwards); set by cli.main.
AS_PROGRAM = False

#: Version of every JSON record the command line writes (results and errors).
JSON_FORMAT = 1


def error_line(message: str, as_json: bool = False, **fields) -> str:
    """The one form of every error line: 'tablegen: error: MESSAGE', or with --json the
    object {"format": 1, "error": {"message": ..., **fields}} (fields such as argument, file, line)."""
    if not as_json:
        return f"tablegen: error: {message}"
    import json

    return json.dumps({"format": JSON_FORMAT, "error": {"message": message, **fields}}, ensure_ascii=True)


class Command:
    """One subcommand: its name, the module that implements it, and the one-line help."""

    __slots__ = ("name", "module", "help")

    def __init__(self, name: str, module: str, help: str) -> None:
        self.name = name
        self.module = module
        self.help = help

    def load(self):
        """The implementing module (imported now, not before; __import__, as importlib costs start-up time)."""
        return __import__(self.module, fromlist=["run"])


COMMANDS: tuple[Command, ...] = (
    Command("value", "tablegen.commands.value", "print one exact value"),
    Command("build", "tablegen.commands.build", "write the reference site"),
    Command("verify", "tablegen.commands.verify", "re-check a built site"),
    Command("check", "tablegen.commands.check", "compare another program's floating-point values with the exact ones"),
)
_BY_NAME = {c.name: c for c in COMMANDS}


def command(name: str) -> Command | None:
    """The Command called ``name``, or None."""
    return _BY_NAME.get(name)


def emit(text: str) -> None:
    """Write ``text`` (lines ending in a newline) to stdout and flush, so errors surface here."""
    sys.stdout.write(text)
    sys.stdout.flush()


def warn(text: str) -> None:
    """One warning line on stderr (the command still succeeds)."""
    print(f"tablegen: warning: {text}", file=sys.stderr)


_FORMATTER = None


def help_formatter():
    """argparse's help layout, measuring the terminal without importing shutil (start-up time).

    Every parser of the command line uses it: argparse builds a formatter for
    each option it adds, and its own would import shutil (and with it bz2 and
    lzma) to ask the terminal's width.
    """
    global _FORMATTER
    if _FORMATTER is None:
        import argparse

        class Formatter(argparse.HelpFormatter):
            def __init__(self, prog: str, **kwargs) -> None:
                if kwargs.get("width") is None:
                    import os

                    try:
                        columns = int(os.environ.get("COLUMNS", "0")) or os.get_terminal_size(1).columns
                    except (OSError, ValueError):
                        columns = 80
                    kwargs["width"] = max(columns, 40) - 2
                super().__init__(prog, **kwargs)

        _FORMATTER = Formatter
    return _FORMATTER


#: (command, one-line help) for the main parser's list of commands.
SUMMARIES = (
    ("recouple", "exact recoupling coefficient or matrix between two coupling trees"),
    ("lsjj", "two-particle LS <-> jj matrices, one per J"),
)

# options of `value` that take a value, so their value is not taken for the kind
_VALUE_OPTIONS = ("--digits", "--max-j", "--alpha", "--beta", "--gamma", "--theta", "--phi",
                  "--cos-beta", "--cos-theta")


def route(argv: list[str]) -> "Callable[[], int] | None":
    """The command for argv if it reads its own argv, else None (the main parser's commands)."""
    if not argv:
        return None
    if argv[0] == "value" and any(a == "--from" or a.startswith("--from=") for a in argv):
        from ..batch import main_from  # batch answers: own options, own error lines

        return lambda: main_from(argv[1:])
    if argv[0] == "recouple":
        from . import recouple

        return _piped(lambda: recouple.run(argv[1:]))
    if argv[0] == "lsjj":
        from . import lsjj

        return _piped(lambda: lsjj.run(argv[1:]))
    if argv[0] == "value":
        key = _value_kind(argv[1:])
        if key is None:
            return None
        from ..kinds import KIND_KEYS

        if key in KIND_KEYS:
            return None
        from ..kinds.angular import FUNCTION_KEYS

        if key in FUNCTION_KEYS:
            from . import functions

            return _piped(lambda: functions.run(key, argv[1:]))
    return None


def _value_kind(tokens: list[str]) -> "str | None":
    """The first positional token after `value` (the KIND), skipping options and their values."""
    skip = False
    for token in tokens:
        if skip:
            skip = False
        elif token == "--":
            continue
        elif token in _VALUE_OPTIONS:
            skip = True
        elif not token.startswith("-"):
            return token
    return None


#: Exit status when the reader of our output went away (as a shell reports SIGPIPE: 128 + 13).
EXIT_PIPE_CLOSED = 141


def _piped(run: "Callable[[], int]") -> "Callable[[], int]":
    """Run a command and flush its output; a reader that closed the pipe (| head) ends it
    quietly instead of with a traceback, now or at interpreter exit."""

    def guarded() -> int:
        import sys

        try:
            status = run()
            sys.stdout.flush()
            return status
        except BrokenPipeError:
            import os

            devnull = os.open(os.devnull, os.O_WRONLY)
            os.dup2(devnull, sys.stdout.fileno())  # nothing left to flush at exit
            return EXIT_PIPE_CLOSED

    return guarded
