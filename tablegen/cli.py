"""The command line: ``tablegen value|build|verify``.

``main(argv) -> int`` is the whole interface; tests call it directly.  This is
the only place where tablegen's errors become stderr text and exit codes:
user errors print one line and exit 2, never a traceback.

The ``value`` path imports only the engine (no sympy, no jinja2) so that a
one-value lookup starts about as fast as the interpreter itself.
"""

from __future__ import annotations

import sys

from . import __version__
from .coefficients import KINDS
from .errors import TablegenError
from .values.latex import LATEX_STYLES

__all__ = ["main"]

EXIT_OK = 0
EXIT_FAILED = 1
EXIT_USAGE = 2

_VALUE_FLAGS_WITH_ARG = ("--digits", "--max-j")
_VALUE_FLAGS = ("--latex", "--json", "-h", "--help")


class _UsageError(Exception):
    """A command-line usage mistake, reported in one line."""


def _build_parser():
    import argparse

    class _Parser(argparse.ArgumentParser):
        """argparse, but usage errors become one line (no usage dump) and exit 2."""

        def error(self, message: str):  # type: ignore[override]
            raise _UsageError(f"{self.prog}: {message}")

    parser = _Parser(
        prog="tablegen",
        description="Exact Clebsch-Gordan, 3j, 6j, Racah W and 9j values and reference tables "
        "(Condon-Shortley phase).",
    )
    parser.add_argument("--version", action="version", version=f"tablegen {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)

    value = sub.add_parser(
        "value",
        help="print one exact value",
        description="Print one coefficient exactly and as a decimal. KIND is cg, 3j, 6j, w or 9j "
        "(or d, D, Y for rotation functions and spherical harmonics: see 'tablegen value d --help'); "
        "the arguments follow the order of the symbol: cg j1 m1 j2 m2 J M; 3j j1 j2 j3 m1 m2 m3; "
        "6j j1 j2 j3 j4 j5 j6; w a b c d e f; 9j j11 j12 j13 j21 j22 j23 j31 j32 j33. "
        "Quantum numbers may be written 3/2, 1.5, -1/2 or 2.",
    )
    value.add_argument("kind", choices=KINDS, metavar="KIND")
    value.add_argument("args", nargs="*", metavar="ARG")
    value.add_argument("--digits", type=int, default=15, help="significant digits of the decimal (default 15)")
    value.add_argument("--latex", action="store_true", help="also print the LaTeX (both root styles)")
    value.add_argument("--json", action="store_true", help="print one JSON object instead of text")
    value.add_argument("--max-j", type=int, default=None, help="raise the size limit on j")

    build = sub.add_parser(
        "build",
        help="write the reference site",
        description="Write the offline reference site for a recipe (the built-in default recipe "
        "when no --recipe and no family option is given). Family options take a RANGE: MAX, "
        "MIN..MAX (e.g. 1/2..7/2) or 'none' to leave the family out.",
    )
    build.add_argument("--recipe", metavar="FILE", help="TOML recipe file")
    build.add_argument("--out", metavar="DIR", default="site", help="output folder (default: ./site)")
    for family in ("cg", "3j", "6j", "9j"):
        build.add_argument(f"--{family}", metavar="RANGE", dest=f"range_{family}", help=f"range of j for {family}")
    build.add_argument("--digits", type=int, help="significant digits of the decimals")
    build.add_argument("--latex-style", choices=LATEX_STYLES, help="LaTeX style of the values")
    build.add_argument("--title", help="title of the build")
    build.add_argument("--notes", help="notes shown on the index page")
    build.add_argument("--jobs", type=int, help="processes for computing (default: all cores)")
    build.add_argument("--allow-large", action="store_true", help="build even above the size guard")
    build.add_argument(
        "--discard-extra", action="store_true",
        help="replace an old site even if it holds files its SHA256SUMS does not list (they are deleted)",
    )
    build.add_argument("--quiet", action="store_true", help="no progress or summary output")
    build.set_defaults(run=_run_build)

    verify = sub.add_parser(
        "verify",
        help="re-check a built site",
        description="Check every file against SHA256SUMS, report missing and extra files, and "
        "recompute every value in the data files. Exit status 0 only when everything holds.",
    )
    verify.add_argument("folder", metavar="DIR")
    verify.set_defaults(run=_run_verify)
    from .commands import SUMMARIES  # listed here for --help; tablegen/commands/ runs them

    for name, summary in SUMMARIES:
        sub.add_parser(name, help=summary, add_help=False)
    return parser


def _reorder_value_argv(argv: list[str]) -> list[str]:
    """Put options first and quantum numbers after '--', so '-1/2' is not an option."""
    if not argv or argv[0] != "value":
        return argv
    options: list[str] = []
    positionals: list[str] = []
    tokens = iter(argv[1:])
    for token in tokens:
        name = token.split("=", 1)[0]
        if name in _VALUE_FLAGS_WITH_ARG:
            options.append(token)
            if "=" not in token:
                options.append(next(tokens, ""))
        elif token in _VALUE_FLAGS or (token.startswith("--") and token != "--"):
            options.append(token)
        elif token != "--" and len(token) > 1 and token[0] == "-" and not (token[1].isdigit() or token[1] == "."):
            options.append(token)  # '-x': an option (unknown ones are reported as such)
        elif token != "--":
            positionals.append(token)
    return ["value", *options, "--", *positionals]


def _quick_value_call(argv: list[str]):
    """The everyday ``value`` call, read without argparse (whose import costs start-up time).

    Returns None for anything unusual (help, an unknown option, a malformed
    number); argparse then reads the line and reports any mistake.
    """
    if not argv or argv[0] != "value":
        return None
    from types import SimpleNamespace

    ns = SimpleNamespace(command="value", kind=None, args=[], digits=15, latex=False, json=False, max_j=None)
    tokens = iter(argv[1:])
    for token in tokens:
        name, eq, text = token.partition("=")
        if token in ("--latex", "--json"):
            setattr(ns, token[2:], True)
        elif name in _VALUE_FLAGS_WITH_ARG:
            text = text if eq else next(tokens, "")
            if not text.isdigit():
                return None
            setattr(ns, name[2:].replace("-", "_"), int(text))
        elif token == "--":
            continue
        elif token.startswith("-") and not (len(token) > 1 and (token[1].isdigit() or token[1] == ".")):
            return None
        elif ns.kind is None:
            ns.kind = token
        else:
            ns.args.append(token)
    return ns if ns.kind in KINDS else None


def main(argv: list[str] | None = None) -> int:
    """Run the command line; return the exit status."""
    argv = list(sys.argv[1:] if argv is None else argv)
    try:
        command = _extra_command(argv)  # rotation functions, recouple, lsjj: tablegen/commands/
        if command is not None:
            return command()
        quick = _quick_value_call(argv)
        if quick is not None:
            return _run_value(quick)
        parser = _build_parser()
        ns = parser.parse_args(_reorder_value_argv(argv))
        if ns.command is None:
            parser.print_help()
            return EXIT_USAGE
        if ns.command == "value":
            return _run_value(ns)
        return ns.run(ns)
    except _UsageError as exc:
        print(str(exc), file=sys.stderr)
        return EXIT_USAGE
    except TablegenError as exc:
        print(f"tablegen: error: {exc}", file=sys.stderr)
        return EXIT_USAGE
    except KeyboardInterrupt:
        print("tablegen: interrupted", file=sys.stderr)
        return 130
    except SystemExit as exc:  # --help and --version end through argparse's exit
        return exc.code if isinstance(exc.code, int) else EXIT_OK


def _extra_command(argv: list[str]):
    from .commands import route

    return route(argv)


def _run_value(ns) -> int:
    from .coefficients import ARGUMENT_NAMES, DOUBLED, parse_arguments, why_zero_doubled
    from .values.decimals import MAX_DIGITS
    from .notation import symbol_text

    names = ARGUMENT_NAMES[ns.kind]
    if len(ns.args) != len(names):
        raise _UsageError(
            f"tablegen value {ns.kind}: needs {len(names)} arguments ({' '.join(names)}), got {len(ns.args)}"
        )
    if not 1 <= ns.digits <= MAX_DIGITS:
        raise _UsageError(f"tablegen value: argument --digits = {ns.digits}: must be from 1 to {MAX_DIGITS}")
    if ns.max_j is not None and ns.max_j < 0:
        raise _UsageError(f"tablegen value: argument --max-j = {ns.max_j}: must be >= 0")
    t = parse_arguments(ns.kind, ns.args, ns.max_j)
    value = DOUBLED[ns.kind](*t)
    zero_rule = why_zero_doubled(ns.kind, t) if not value else None
    symbol = symbol_text(ns.kind, t)
    exact = str(value)
    decimal = value.decimal(ns.digits)
    if ns.json:
        import json  # only here: the plain lookup stays as light as possible

        record = {
            "kind": ns.kind,
            "arguments": dict(zip(names, (_half(x) for x in t))),
            "symbol": symbol,
            "exact": exact,
            "square": str(value.squared()),
            "decimal": decimal,
            "digits": ns.digits,
            "zero_rule": zero_rule,
            "convention": "Condon-Shortley",
            "version": __version__,
        }
        if ns.latex:
            record["latex"] = {"root": value.latex("root"), "rational": value.latex("rational")}
        print(json.dumps(record, ensure_ascii=False))
        return EXIT_OK
    print(symbol)
    print(f"  exact    {exact}")
    print(f"  decimal  {decimal}")
    if zero_rule:
        print(f"  zero by  {zero_rule}")
    if ns.latex:
        print(f"  latex    {value.latex('root')}")
        print(f"  latex    {value.latex('rational')}  (rationalised)")
    return EXIT_OK


def _range_option(family: str, text: str) -> dict | bool:
    """'4' -> {max_j: '4'}; '1/2..7/2' -> {min_j, max_j}; 'none' -> False (leave out)."""
    text = text.strip()
    if text.lower() == "none":
        return False
    lo, sep, hi = text.partition("..")
    if sep:
        return {"min_j": lo.strip(), "max_j": hi.strip()}
    return {"max_j": text}


def _build_recipe(ns):
    from .errors import RecipeError
    from .recipe import DEFAULT_RECIPE, Recipe, load_recipe, recipe_from_mapping

    overrides: dict = {}
    for family in ("cg", "3j", "6j", "9j"):
        text = getattr(ns, f"range_{family}")
        if text is not None:
            overrides[family] = _range_option(family, text)
    for key in ("digits", "latex_style", "title", "notes"):
        value = getattr(ns, key)
        if value is not None:
            overrides[key] = value
    if ns.recipe:
        base = load_recipe(ns.recipe)
    elif any(f in overrides for f in ("cg", "3j", "6j", "9j")):
        base = Recipe(title=DEFAULT_RECIPE.title)  # only the families asked for
    else:
        base = DEFAULT_RECIPE
    try:
        recipe = recipe_from_mapping(overrides, base=base)
    except RecipeError as exc:  # only the options are checked here: name the option
        option = exc.key.split(".")[0].replace("_", "-")
        given = getattr(ns, f"range_{option}", None) if option in ("cg", "3j", "6j", "9j") else exc.value
        raise _UsageError(f"tablegen build: argument --{option} = {given!r}: {exc.rule}") from None
    if not recipe.families:
        raise _UsageError("tablegen build: the recipe tabulates no family (give --cg, --3j, --6j or --9j)")
    return recipe


def _run_build(ns) -> int:
    import signal

    from .build import build

    if ns.jobs is not None and ns.jobs < 1:
        raise _UsageError(f"tablegen build: argument --jobs = {ns.jobs}: must be >= 1")
    recipe = _build_recipe(ns)
    # a terminated build must clean its staging folder: turn SIGTERM into an exception
    previous = signal.signal(signal.SIGTERM, _raise_interrupt)
    try:
        return _build_with_progress(ns, recipe, build)
    except TablegenError:
        raise
    except OSError as exc:  # the file system, not the input: one line, nothing half-written
        where = f" {exc.filename!r}" if getattr(exc, "filename", None) else ""
        raise _UsageError(f"tablegen: error: cannot write{where}: {exc.strerror or exc}") from None
    finally:
        signal.signal(signal.SIGTERM, previous)


def _build_with_progress(ns, recipe, build) -> int:
    show = sys.stderr.isatty() and not ns.quiet

    def progress(stage: str, done: int, total: int) -> None:
        if total:
            text = f"{stage} {done:,}/{total:,} values"
        else:
            text = f"{stage} {done:,} files" if done else f"{stage}..."
        print(f"\rtablegen: {text}\033[K", end="", file=sys.stderr, flush=True)

    result = build(
        recipe, ns.out, jobs=ns.jobs, allow_large=ns.allow_large, discard_extra=ns.discard_extra,
        progress=progress if show else None,
    )
    if show:
        print("\r\033[K", end="", file=sys.stderr)
    if not ns.quiet:
        print(
            f"tablegen: wrote {result.out_dir}: {result.pages} pages, {result.files} files, "
            f"{result.values:,} values, {result.bytes / 1e6:.1f} MB in {result.seconds:.1f} s; "
            f"data digest {result.data_digest}"
        )
    return EXIT_OK


def _raise_interrupt(signum, frame):  # pragma: no cover - signal handler
    raise KeyboardInterrupt


def _run_verify(ns) -> int:
    from .verify import verify_site

    report = verify_site(ns.folder)
    print(report.summary())
    for problem in report.problems:
        print(f"  {problem}")
    return EXIT_OK if report.ok else EXIT_FAILED


def _half(t: int) -> str:
    from .spins import half_text

    return half_text(t)
