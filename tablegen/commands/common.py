"""What the extra commands share: their usage error, parser, argv order, JSON and field lines.

The commands here raise :class:`CommandLineError` (a TablegenError) for a
usage mistake, so that ``cli.main`` turns it into its one error line and exit
status 2 like every other error; they never print errors themselves.
"""

from __future__ import annotations

import argparse
import sys

from ..errors import TablegenError

__all__ = ["CommandLineError", "OneLineParser", "options_first", "print_json", "field", "FORMAT_VERSION",
           "check_digits_option"]

from . import JSON_FORMAT as FORMAT_VERSION  # one version for every JSON record of the command line


class CommandLineError(TablegenError, ValueError):
    """A usage mistake on the command line (unknown option, missing argument), one line."""


class OneLineParser(argparse.ArgumentParser):
    """argparse whose usage errors raise CommandLineError (no usage dump) instead of exiting."""

    def __init__(self, *args, **kwargs) -> None:
        from . import help_formatter

        kwargs.setdefault("formatter_class", help_formatter())
        super().__init__(*args, **kwargs)

    def error(self, message: str):  # type: ignore[override]
        raise CommandLineError(f"{self.prog}: {message}")


def options_first(tokens: list[str], with_value: tuple[str, ...]) -> list[str]:
    """Options first (each with its value joined by '='), positionals after '--'.

    So a projection '-1/2' is never read as an option, and an option value
    such as '--beta -pi/2' is never read as a second option.
    """
    options: list[str] = []
    positionals: list[str] = []
    it = iter(tokens)
    for token in it:
        if token == "--":  # accepted, not needed: a negative number is never taken for an option
            continue
        name = token.split("=", 1)[0]
        if name in with_value and "=" not in token:
            following = next(it, None)
            options.append(token if following is None else f"{token}={following}")
        elif token.startswith("--") or (len(token) > 1 and token[0] == "-" and not (token[1].isdigit() or token[1] == ".")):
            options.append(token)
        else:
            positionals.append(token)
    return [*options, "--", *positionals]


def check_digits_option(digits: int) -> int:
    from ..limits import MAX_DIGITS

    if not 1 <= digits <= MAX_DIGITS:
        raise CommandLineError(f"argument --digits = {digits}: must be from 1 to {MAX_DIGITS:,}")
    return digits


def field(name: str, value: str) -> str:
    """One indented 'name  value' line, names padded to one column."""
    return f"  {name:<10} {value}"


def print_json(record: dict) -> None:
    """One JSON object on one line, with the format version first."""
    import json

    from .. import __version__

    print(json.dumps({"format": FORMAT_VERSION, **record, "version": __version__}, ensure_ascii=False),
          file=sys.stdout)
