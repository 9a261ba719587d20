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
"""

from __future__ import annotations

import sys

__all__ = ["Command", "COMMANDS", "command", "emit", "warn", "JSON_FORMAT"]

#: Version of every JSON record the command line writes (results and errors).
JSON_FORMAT = 1


class Command:
    """One subcommand: its name, the module that implements it, and the one-line help."""

    __slots__ = ("name", "module", "help")

    def __init__(self, name: str, module: str, help: str) -> None:
        self.name = name
        self.module = module
        self.help = help

    def load(self):
        """The implementing module (imported now, not before)."""
        from importlib import import_module

        return import_module(self.module)


COMMANDS: tuple[Command, ...] = (
    Command("value", "tablegen.commands.value", "print one exact value"),
    Command("build", "tablegen.commands.build", "write the reference site"),
    Command("verify", "tablegen.commands.verify", "re-check a built site"),
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
