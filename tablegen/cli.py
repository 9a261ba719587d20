"""The command line: ``tablegen value|build|verify``; ``main(argv) -> int`` is the whole interface.

This is the only place where errors become text and exit statuses:

* 0: done; 1: ``verify`` found a problem;
* 2: any error (a bad argument or recipe, a refused request, a file that
  cannot be read or written, a closed or full output), reported as one line
  ``tablegen: error: MESSAGE`` on stderr, never a traceback; with ``--json``
  the line is a JSON object ``{"format": 1, "error": {...}}``;
* 130: interrupted (Ctrl-C, SIGTERM during a build).

The subcommands live in :mod:`tablegen.commands`, one module each; only the
module of the command being run is imported, so ``tablegen value`` stays light
(no sympy, jinja2 or mpmath).  Options never take abbreviations, and an
option's value may start with '-' (``--cg -1..1`` is read as the value).
"""

from __future__ import annotations

import sys

__all__ = ["main", "EXIT_OK", "EXIT_FAILED", "EXIT_ERROR", "EXIT_INTERRUPTED"]

EXIT_OK = 0
EXIT_FAILED = 1
EXIT_ERROR = 2
EXIT_INTERRUPTED = 130


class UsageError(Exception):
    """A command-line mistake that argparse found (unknown option, missing value)."""


def main(argv: list[str] | None = None) -> int:
    """Run the command line; return the exit status."""
    _as_program = argv is None  # run as the program (not called by a test): it exits after this
    argv = list(sys.argv[1:] if argv is None else argv)
    as_json = "--json" in argv[: argv.index("--")] if "--" in argv else "--json" in argv
    from . import commands

    commands.AS_PROGRAM = _as_program  # a build restores signal handlers differently in a test
    try:
        routed = commands.route(argv)  # value d|D|Y, recouple, lsjj, value --from: their own parsers
        if routed is not None:
            return routed()
        ns = _parse(argv)
        if ns is None:
            return EXIT_ERROR
        return ns.run(ns)
    except KeyboardInterrupt:
        return _fail("interrupted", None, as_json, EXIT_INTERRUPTED)
    except SystemExit as exc:  # --help and --version end through argparse's exit
        return exc.code if isinstance(exc.code, int) else EXIT_OK
    except BaseException as exc:  # noqa: BLE001 - every error ends as one line
        return _fail(_message(exc), exc, as_json, EXIT_ERROR)


def _message(exc: BaseException) -> str:
    """The one-line text of an error: ours as they are, the system's with the file concerned."""
    from .errors import TablegenError

    if isinstance(exc, (TablegenError, UsageError)):
        return str(exc)
    if isinstance(exc, BrokenPipeError):
        _silence_stdout()
        return "output closed before everything was written (broken pipe)"
    if isinstance(exc, OSError):
        if exc.filename is None and exc.errno is not None:  # stdout itself (a full disk, /dev/full)
            _silence_stdout()
            return f"cannot write the output: {exc.strerror}"
        from .errors import _show

        where = f" {_show(str(exc.filename))}" if exc.filename is not None else ""
        return f"cannot use{where}: {exc.strerror or exc}"
    if isinstance(exc, MemoryError):
        return "out of memory (narrow the request)"
    if isinstance(exc, RecursionError):
        return "input nested too deeply"
    return f"internal error {type(exc).__name__}: {exc} (please report this)"


def _fail(message: str, exc: BaseException | None, as_json: bool, status: int) -> int:
    text = _short_line(message)
    from .commands import error_line

    fields = {}
    for field in ("argument", "key", "value", "rule", "path"):
        if as_json and exc is not None and hasattr(exc, field):
            value = getattr(exc, field)
            fields[field] = value if isinstance(value, (int, str)) or value is None else str(value)
    if isinstance(fields.get("value"), str):
        fields["value"] = _short_line(fields["value"], 60)
    line = error_line(text, as_json, **fields)
    try:
        print(line, file=sys.stderr, flush=True)
    except (OSError, ValueError):  # stderr closed too: nothing more can be said
        pass
    return status


def _short_line(text: str, limit: int = 300) -> str:
    text = "".join(c if c.isprintable() else repr(c)[1:-1] for c in str(text))
    return text if len(text) <= limit else text[: limit - 3] + "..."


def _silence_stdout() -> None:
    """After a failed write, point stdout at /dev/null so the exit-time flush stays quiet."""
    import os

    if sys.stdout is not sys.__stdout__ or sys.stdout is None:
        return  # captured (tests): nothing is flushed at exit
    try:
        null = os.open(os.devnull, os.O_WRONLY)
        os.dup2(null, sys.stdout.fileno())
        os.close(null)
    except (OSError, ValueError):
        pass


# -- parsing -------------------------------------------------------------------
def _parse(argv: list[str]):
    """The namespace of the command line, with ``run`` set to the command's function.

    A known command gets a parser of its own ("tablegen value ..."), built
    alone: the other commands' parsers cost start-up time and are never used.
    No command, an unknown one, --help or --version go to the main parser.
    """
    from . import __version__
    from .commands import command

    wanted = command(argv[0]) if argv else None
    if wanted is None:
        parser = _main_parser(__version__)
        ns, extras = parser.parse_known_args(argv)
        if extras:
            raise UsageError(f"argument {extras[0]!r}: unknown option or extra argument (see tablegen --help)")
        parser.print_help(sys.stderr)  # no command given (a command name is parsed above)
        return None
    parser = _command_parser(wanted, prog=f"tablegen {wanted.name}")
    ns, extras = parser.parse_known_args(_normalise(parser, argv[1:]))
    if extras:
        raise UsageError(f"argument {extras[0]!r}: unknown option or extra argument (see tablegen {argv[0]} --help)")
    return ns


def _parser_classes():
    """argparse's parser and help formatter, adapted: imported when a command line is parsed."""
    import argparse

    class Parser(argparse.ArgumentParser):
        """argparse, but a mistake becomes one UsageError line (no usage dump), and the
        description may be a function, called only when the help is shown."""

        describe = None

        def error(self, message: str):  # type: ignore[override]
            raise UsageError(message)

        def format_help(self) -> str:
            if self.describe is not None:
                self.description = self.describe()
            return super().format_help()

    from .commands import help_formatter

    return Parser, help_formatter()


def _command_parser(c, prog: str):
    """The parser of one command, its options added and ``run`` set."""
    module = c.load()
    Parser, Formatter = _parser_classes()
    parser = Parser(prog=prog, allow_abbrev=False, formatter_class=Formatter)
    describe = getattr(module, "description", None)
    if describe is not None:
        parser.describe = describe
    else:
        parser.description = module.DESCRIPTION
    module.add_arguments(parser)
    parser.set_defaults(run=module.run)
    return parser


def _main_parser(version: str):
    """``tablegen`` with every command listed (for --help, --version and a missing or unknown command)."""
    from .commands import COMMANDS, SUMMARIES

    Parser, Formatter = _parser_classes()
    parser = Parser(
        prog="tablegen", allow_abbrev=False, formatter_class=Formatter,
        description="Exact Clebsch-Gordan, 3j, 6j, Racah W and 9j values and reference tables "
        "(Condon-Shortley phase).",
    )
    parser.add_argument("--version", action="version", version=f"tablegen {version}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=Parser)
    for c in COMMANDS:  # listed for help and for the choice of command, never parsed here
        sub.add_parser(c.name, help=c.help, allow_abbrev=False, formatter_class=Formatter)
    for name, summary in SUMMARIES:  # commands with parsers of their own (commands.route), listed for help
        sub.add_parser(name, help=summary, add_help=False)
    return parser


def _normalise(parser, args: list[str]) -> list[str]:
    """Options first (values glued on: '--cg=-1..1'), then '--', then every positional.

    A token that starts with one '-' and is not an option of the command is a
    value ('-1/2', '-inf', '-x'), so the command reports it as a bad value of
    the argument it fills, not as an unknown option.
    """
    takes_value, flags = set(), set()
    for action in parser._actions:  # the documented way to list a parser's options does not exist
        for name in action.option_strings:
            (takes_value if action.nargs is None and action.const is None else flags).add(name)
    options: list[str] = []
    positionals: list[str] = []
    tokens = iter(args)
    for token in tokens:
        if token == "--":
            positionals.extend(tokens)
            break
        name = token.split("=", 1)[0]
        if token in takes_value:
            value = next(tokens, None)
            options.append(token if value is None else f"{token}={value}")
        elif name in takes_value or token in flags:
            options.append(token)
        elif token.startswith("--") and len(token) > 2:
            options.append(token)  # unknown: argparse names it
        else:
            positionals.append(token)
    return [*options, "--", *positionals] if positionals else options
