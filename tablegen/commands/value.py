"""``tablegen value KIND ARG...``: one exact value, as text or as one JSON record.

Start-up matters here (a lookup should cost about as much as starting Python):
only the engine is imported, and json only for --json.  The kind's record
says how many arguments it takes, how to parse them and its one-value limit
(``Kind.max_j``: every value within it returns in about a second).

Extension points: :func:`lookup` gives the record of one value (a dict), and
:func:`text_lines` / :func:`json_line` format it, so a batch mode can reuse
them line by line.
"""

from __future__ import annotations

from . import JSON_FORMAT, emit, warn

__all__ = ["DESCRIPTION", "add_arguments", "run", "lookup", "text_lines", "json_line", "kind_of"]

DESCRIPTION = (
    "Print one value exactly and as a decimal (Clebsch-Gordan coefficients in the Condon-Shortley phase). KIND is one of {kinds}; "
    "the arguments follow the order of the symbol: {orders}. Quantum numbers are written with the "
    "ASCII digits 0-9 as 3/2, 1.5, -1/2 or 2 (no other digits, no '_', at most 40 characters). "
    "Each kind has a limit on j that keeps one value within about a second ({limits}); "
    "--max-j raises it, up to {ceiling:,}. Rotation functions and spherical harmonics: "
    "'tablegen value d|D|Y --help'; many values at once: 'tablegen value --from FILE'."
)


def description() -> str:
    """DESCRIPTION filled in from the kind records."""
    from ..kinds import KINDS as kinds  # every kind module: only for --help
    from ..limits import ENGINE_MAX_J

    return DESCRIPTION.format(
        kinds=", ".join(k.key for k in kinds),
        orders="; ".join(f"{k.key} {' '.join(k.arguments)}" for k in kinds),
        limits=", ".join(f"{k.key} {k.max_j:,}" for k in kinds),
        ceiling=ENGINE_MAX_J,
    )


def add_arguments(parser) -> None:
    from ..limits import MAX_DIGITS

    parser.add_argument("kind", metavar="KIND")
    parser.add_argument("args", nargs="*", metavar="ARG")
    parser.add_argument("--digits", default="15", metavar="N",
                        help=f"significant digits of the decimal, 1 to {MAX_DIGITS:,} (default 15)")
    parser.add_argument("--latex", action="store_true", help="also print the LaTeX (both root styles)")
    parser.add_argument("--json", action="store_true",
                        help=f"print one JSON object (format {JSON_FORMAT}); errors become a JSON object on stderr")
    parser.add_argument("--max-j", default=None, metavar="J",
                        help="raise the kind's limit on j (slower; warns about time and memory)")


def kind_of(text: str):
    """The Kind record named ``text`` (only its module is imported), or OptionError naming KIND and the choices."""
    from ..kinds import KIND_KEYS, kind

    if text in KIND_KEYS:
        return kind(text)
    from ..errors import OptionError

    raise OptionError("KIND", text, f"must be one of {', '.join(KIND_KEYS)}")


def run(ns) -> int:
    from ..limits import ENGINE_MAX_J, MAX_DIGITS
    from ..spins import count_from_text

    k = kind_of(ns.kind)
    digits = count_from_text(ns.digits, "--digits", 1, MAX_DIGITS)
    max_j = None if ns.max_j is None else count_from_text(ns.max_j, "--max-j", 0, ENGINE_MAX_J)
    record = lookup(k, ns.args, digits, max_j, latex=ns.latex)
    largest = max((record["_t"][i] for i in k.j_positions), default=0)
    if 2 * k.max_j < largest:
        warn(_slow_warning(k, largest))
    emit(json_line(record) if ns.json else text_lines(record))
    return 0


def lookup(k, texts, digits: int, max_j: int | None = None, latex: bool = False) -> dict:
    """The record of one value: kind, arguments, symbol, exact, sign/p/q, decimal, zero rule (, latex).

    Keys starting with '_' are for the caller only (``_t``: the doubled
    arguments) and are left out of the JSON.
    """
    from .. import __version__
    from ..errors import OptionError
    from ..spins import half_text

    if len(texts) != len(k.arguments):
        raise OptionError(
            "ARG", " ".join(texts),
            f"{k.key} takes {len(k.arguments)} arguments ({' '.join(k.arguments)}), got {len(texts)}",
        )
    t = k.parse(tuple(texts), k.max_j if max_j is None else max_j)
    value = k.doubled(*t)
    rule = None if value else k.zero_rule(t)
    record = {
        "format": JSON_FORMAT,
        "kind": k.key,
        "arguments": dict(zip(k.arguments, (half_text(x) for x in t))),
        "symbol": k.text(t),
        "exact": str(value),
        "sign": value.sign,  # value = sign * sqrt(p/q); p and q as text (they may exceed 2**53)
        "p": _int_text(value.p),
        "q": _int_text(value.q),
        "decimal": value.decimal(digits),
        "digits": digits,
        "zero_rule": None if rule is None else str(rule),
        "convention": k.convention or None,
        "version": __version__,
        "_t": t,
    }
    if latex:
        record["latex"] = {"root": value.latex("root"), "rational": value.latex("rational")}
    return record


def _int_text(n: int) -> str:
    """An integer as text, also beyond Python's 4300-digit str() limit (large j)."""
    from ..intmath import int_text

    return int_text(n)


def json_line(record: dict) -> str:
    import json

    return json.dumps({k: v for k, v in record.items() if not k.startswith("_")}, ensure_ascii=False) + "\n"


def text_lines(record: dict) -> str:
    lines = [record["symbol"], f"  exact    {record['exact']}", f"  decimal  {record['decimal']}"]
    if record["zero_rule"]:
        lines.append(f"  zero by  {record['zero_rule']}")
    if "latex" in record:
        lines.append(f"  latex    {record['latex']['root']}")
        lines.append(f"  latex    {record['latex']['rational']}  (rationalised)")
    return "\n".join(lines) + "\n"


def _slow_warning(k, largest_tj: int) -> str:
    """Time and memory to expect above the kind's one-value limit (a rough power law)."""
    from ..spins import half_text

    seconds = k.seconds_at_max_j * (largest_tj / (2 * k.max_j)) ** k.cost_power
    return (
        f"j = {half_text(largest_tj)} is above the {k.key} limit {k.max_j:,} (about a second per value); "
        f"expect about {_duration(seconds)} and memory growing like j log j"
    )


def _duration(seconds: float) -> str:
    if seconds < 120:
        return f"{seconds:.0f} s"
    if seconds < 7200:
        return f"{seconds / 60:.0f} min"
    return f"{seconds / 3600:,.0f} h"
