"""Commands beyond the coupling symbols: rotation functions, recoupling, LS<->jj.

    value d|D|Y ...   functions.py   (function-valued kinds, one record each)
    recouple ...      recouple.py    (coefficients, working and matrices between trees)
    lsjj L1 L2        lsjj.py        (two-particle LS<->jj matrices per J)

``cli.main`` asks :func:`route` first; it returns the command to run, or None
for everything else (the coupling symbols, build, verify).  Each command has
its own small parser and raises TablegenError subclasses; only ``cli.main``
turns errors into text.  Nothing heavy is imported before a command is chosen.
"""

from __future__ import annotations

from typing import Callable

__all__ = ["route", "SUMMARIES"]

#: (command, one-line help) for the main parser's list of commands.
SUMMARIES = (
    ("recouple", "exact recoupling coefficient or matrix between two coupling trees"),
    ("lsjj", "two-particle LS <-> jj matrices, one per J"),
)

# options of `value` that take a value, so their value is not taken for the kind
_VALUE_OPTIONS = ("--digits", "--max-j", "--alpha", "--beta", "--gamma", "--theta", "--phi",
                  "--cos-beta", "--cos-theta")


def route(argv: list[str]) -> "Callable[[], int] | None":
    """The command for argv if it is one of this package's, else None."""
    if not argv:
        return None
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
