"""``tablegen value d|D|Y ARGS [angles]``: rotation functions and spherical harmonics.

One code path for every function-valued kind: the options and the output come
from the records in :mod:`tablegen.kinds.angular` (its arguments, its angles,
which angle may be given by its cosine, its convention).  Without angles the
command prints the exact function (canonical text, which sympy reads back,
and LaTeX); with angles the exact value where the algebra allows, and the
decimal.  mpmath is imported only for a decimal that needs pi or a
trigonometric function; sympy and jinja2 never.
"""

from __future__ import annotations

from .common import CommandLineError, OneLineParser, check_digits_option, field, options_first, print_json

__all__ = ["run"]


def _option(angle: str) -> str:
    return "--" + angle.replace("_", "-")


def _parser(fk):
    args = " ".join(a.upper() for a in fk.kind.arguments)
    angles = ", ".join(_option(a) for a in fk.angles)
    parser = OneLineParser(
        prog=f"tablegen value {fk.key}",
        description=f"The {fk.kind.title} {fk.key} {args}: the exact function, or its value at the angles "
        f"{angles} (a multiple of pi such as pi/3, 2*pi/3, -pi/2, or radians such as 0.5; "
        f"--cos-{fk.polar} gives the {fk.polar} in [0, pi] by its exact cosine, such as 1/3). "
        f"Angles not given are 0. Convention: {fk.convention}.",
    )
    parser.add_argument("args", nargs="*", metavar="ARG")
    for angle in fk.angles:
        parser.add_argument(_option(angle), dest=angle, metavar="ANGLE", help=f"the angle {angle}")
    parser.add_argument(f"--cos-{fk.polar}", dest=f"cos_{fk.polar}", metavar="COS",
                        help=f"cos({fk.polar}) as an exact rational in [-1, 1]")
    parser.add_argument("--digits", type=int, default=15, help="significant digits of the decimal (default 15)")
    parser.add_argument("--latex", action="store_true", help="also print the LaTeX of an exact value (both root styles)")
    parser.add_argument("--json", action="store_true", help="print one JSON object instead of text")
    parser.add_argument("--max-j", type=int, default=None, help="raise the size limit on j")
    return parser


def run(key: str, tokens: list[str]) -> int:
    """Print one function or value; return the exit status (errors are raised, cli.main reports them)."""
    from ..kinds.angular import FUNCTION_KINDS, function_kind
    from ..spins import half_text

    fk = function_kind(key)
    own = tuple(_option(a) for a in fk.angles) + (f"--cos-{fk.polar}",)
    others = {_option(a) for other in FUNCTION_KINDS for a in (*other.angles, f"cos_{other.polar}")} - set(own)
    for token in tokens:
        if token.split("=", 1)[0] in others:
            raise CommandLineError(f"tablegen value {key}: argument {token.split('=', 1)[0]}: not an angle of "
                                   f"{key} (its angles: {', '.join(own)})")
    with_value = own + ("--digits", "--max-j")
    ns = _parser(fk).parse_args(options_first(tokens, with_value))
    if not ns.args or ns.args[0] != key:
        raise CommandLineError(f"tablegen value: the kind must come first, before its arguments (got {ns.args[:1]})")
    values = ns.args[1:]
    names = fk.kind.arguments
    if len(values) != len(names):
        raise CommandLineError(
            f"tablegen value {key}: needs {len(names)} arguments ({' '.join(names)}), got {len(values)}")
    check_digits_option(ns.digits)
    if ns.max_j is not None and ns.max_j < 0:
        raise CommandLineError(f"tablegen value: argument --max-j = {ns.max_j}: must be >= 0")
    t = fk.kind.parse(values, ns.max_j)
    given = {a: getattr(ns, a) for a in (*fk.angles, f"cos_{fk.polar}") if getattr(ns, a) is not None}
    shown = {a: given.get(a, "0") for a in fk.angles} if given else {}
    if f"cos_{fk.polar}" in given:
        shown[fk.polar] = f"arccos({given[f'cos_{fk.polar}']})"
    function = fk.function(t)
    record = {
        "kind": key,
        "title": fk.kind.title,
        "arguments": dict(zip(names, (half_text(x) for x in t))),
        "symbol": fk.symbol_text(t, shown),
        "function": str(function),
        "function_latex": function.latex(),
        "convention": fk.convention,
    }
    if given:
        evaluation = _evaluate(fk, t, given, ns.digits)
        exact = evaluation.exact
        record.update(
            angles=given,
            exact=None if exact is None else str(exact),
            decimal=evaluation.decimal,
            digits=ns.digits,
            zero_rule=None if evaluation.zero_rule is None else str(evaluation.zero_rule),
        )
        if ns.latex:
            record["latex"] = None if exact is None else {"root": exact.latex("root"), "rational": exact.latex("rational")}
    else:
        rule = fk.kind.zero_rule(t)
        record["zero_rule"] = None if rule is None else str(rule)
    if ns.json:
        print_json(record)
    else:
        _print_text(record)
    return 0


def _evaluate(fk, t, given, digits):
    from ..errors import QuantumNumberError

    try:
        return fk.at(t, given, digits)
    except QuantumNumberError as exc:  # name the option as it was typed
        if exc.argument in given:
            raise QuantumNumberError(_option(exc.argument), exc.value, exc.rule) from None
        raise
    except ZeroDivisionError:
        raise
    except ArithmeticError as exc:  # a value that may be exactly zero at an angle given only approximately
        raise CommandLineError(f"tablegen value {fk.key}: {exc}; give the angle by its exact cosine "
                               f"(--cos-{fk.polar}) to decide it") from None


def _print_text(record: dict) -> None:
    print(record["symbol"])
    if "decimal" in record:
        print(field("exact", record["exact"] if record["exact"] is not None else "(no exact form at these angles)"))
        print(field("decimal", record["decimal"]))
        if record["zero_rule"]:
            print(field("zero by", record["zero_rule"]))
        if record.get("latex"):
            print(field("latex", record["latex"]["root"]))
            print(field("latex", record["latex"]["rational"] + "  (rationalised)"))
        print(field("function", record["function"]))
    else:
        print(field("function", record["function"]))
        print(field("latex", record["function_latex"]))
        if record["zero_rule"]:
            print(field("zero by", record["zero_rule"]))
    print(field("convention", record["convention"]))
