"""Many values in one process: ``tablegen value --from FILE`` (``-`` reads stdin).

Each input line holds a kind and its arguments as on the command line
(``cg 1/2 1/2 1/2 -1/2 1 0``); blank lines and ``#`` comments are skipped.
Every good line gives one record, in input order: the input line number, the
kind, the arguments (canonical text), the exact value, its LaTeX (root style),
its decimal and, for a zero, the selection rule that makes it zero.  Records
are CSV (default) or JSON lines.  A bad line is reported on the error stream
with its line number and rule; the other lines are still answered.  Input is
read and answered one line at a time, so a file of any length streams.

Speed comes from three bounded caches on top of the kinds' own value caches:
the number each argument token stands for (so a kind's parser takes its
int/Fraction fast path instead of reading text), whole answered lines (a
repeated line costs one dict lookup), and the text forms of each |value|
(exact, LaTeX, decimal), shared by both signs.  The caches only skip repeated
work: every answer is what ``tablegen value`` gives for the same line.
"""

from __future__ import annotations

import csv
from fractions import Fraction
from typing import IO, Iterable

from .errors import TablegenError
from .kinds import KINDS, KIND_KEYS
from .spins import half_text
from .values.decimals import surd_decimal
from .values.latex import surd_latex

__all__ = ["CSV_COLUMNS", "BadLine", "Answerer", "answer_stream"]

#: Columns of the CSV output, in order (the JSON records use the same names).
CSV_COLUMNS = ("line", "kind", "arguments", "exact", "latex", "decimal", "zero_rule")
#: Largest number of entries each cache of this module keeps (then it starts afresh).
CACHE_ENTRIES = 1 << 16


USAGE = """usage: tablegen value --from FILE [--json] [--digits N] [--max-j N]

Answer every line of FILE ('-': standard input). A line holds a kind and its
arguments as on the command line, e.g. 'cg 1/2 1/2 1/2 -1/2 1 0'; blank lines
and text after '#' are skipped. Output: CSV with the columns
line,kind,arguments,exact,latex,decimal,zero_rule (or, with --json, one JSON
object per line with the same names), in input order. A bad line is reported
on stderr with its line number; the others are still answered, and the exit
status is then 2."""


class BadLine(Exception):
    """A line that cannot be answered; ``str()`` names the argument, the value and the rule."""


class Answerer:
    """Answers one input line at a time: the record fields of its value, or BadLine."""

    def __init__(self, digits: int = 15, max_j: "int | None" = None, style: str = "root") -> None:
        self.digits = digits
        self.max_j = max_j
        self.style = style
        self._kinds = {k.key: k for k in KINDS}
        self._tokens: dict[str, object] = {}  # argument text -> int or Fraction of the same number
        self._canonical: dict[str, str] = {}  # argument text -> its canonical text ("1.5" -> "3/2")
        self._lines: dict[str, tuple[str, ...]] = {}  # line text -> answered fields
        self._texts: dict[tuple[int, int], tuple[str, str, str]] = {}  # (p, q) -> texts of |value|

    def answer(self, text: str) -> "tuple[str, ...] | None":
        """(kind, arguments, exact, latex, decimal, zero_rule) for a line; None for a blank or comment line."""
        hit = self._lines.get(text)
        if hit is not None:
            return hit
        body = text.split("#", 1)[0] if "#" in text else text
        tokens = body.split()
        if not tokens:
            return None
        fields = self._compute(tokens)
        if len(self._lines) >= CACHE_ENTRIES:
            self._lines.clear()
        self._lines[text] = fields
        return fields

    def _compute(self, tokens: list[str]) -> tuple[str, ...]:
        key, args = tokens[0], tokens[1:]
        k = self._kinds.get(key)
        if k is None:
            raise BadLine(f"kind = {key!r}: must be one of {', '.join(KIND_KEYS)}")
        if len(args) != len(k.arguments):
            raise BadLine(f"{key} needs {len(k.arguments)} arguments ({' '.join(k.arguments)}), got {len(args)}")
        known = self._tokens
        try:  # every token seen before: the parser's int/Fraction fast path
            t = k.parse([known[a] for a in args], self.max_j)
        except (KeyError, TablegenError, TypeError, ValueError):
            t = self._parse_text(k, args)
        value = k.doubled(*t)
        canonical = self._canonical
        arguments = " ".join([canonical[a] for a in args])
        sign = value.sign
        if not sign:
            return (key, arguments, "0", "0", "0", str(k.zero_rule(t)))
        exact, latex, decimal = self._value_texts(value)
        if sign < 0:
            return (key, arguments, "-" + exact, "-" + latex, "-" + decimal, "")
        return (key, arguments, exact, latex, decimal, "")

    def _parse_text(self, k, args: list[str]) -> tuple[int, ...]:
        """Doubled arguments read from the text by the kind's own parser (its rules and messages)."""
        try:
            t = k.parse(args, self.max_j)
        except (TablegenError, TypeError, ValueError) as exc:
            raise BadLine(str(exc)) from None
        known = self._tokens
        if len(known) >= CACHE_ENTRIES:
            known.clear()
            self._canonical.clear()
        for a, x in zip(args, t):  # the same text is the same number as a j and as an m
            known[a] = x >> 1 if not x & 1 else Fraction(x, 2)
            self._canonical[a] = half_text(x)
        return t

    def _value_texts(self, value) -> tuple[str, str, str]:
        """(exact, LaTeX, decimal) of |value|, cached by its reduced square p/q."""
        p, q = key = (value.p, value.q)
        hit = self._texts.get(key)
        if hit is None:
            exact = str(value)
            hit = (
                exact[1:] if value.sign < 0 else exact,
                surd_latex(1, p, q, self.style),
                surd_decimal(1, p, q, self.digits),
            )
            if len(self._texts) >= CACHE_ENTRIES:
                self._texts.clear()
            self._texts[key] = hit
        return hit


def answer_stream(
    lines: Iterable[bytes],
    out: IO[str],
    report_bad,
    *,
    digits: int = 15,
    max_j: "int | None" = None,
    as_json: bool = False,
) -> tuple[int, int]:
    """Answer every line of ``lines`` (bytes, UTF-8) into ``out``; return (answered, bad).

    ``report_bad(line_number, message)`` is called for each bad line, in order.
    Output errors (a closed pipe, a full disk) propagate as OSError.
    """
    answerer = Answerer(digits, max_j)
    answer = answerer.answer
    answered = bad = 0
    if as_json:
        import json

        names = {k.key: k.arguments for k in KINDS}
        dumps = json.dumps
        encoded: dict[tuple[str, ...], str] = {}

        def emit(n: int, fields: tuple[str, ...]) -> None:
            tail = encoded.get(fields)
            if tail is None:
                kind, args, exact, latex, decimal, rule = fields
                record = {
                    "kind": kind,
                    "arguments": dict(zip(names[kind], args.split(" "))),
                    "exact": exact,
                    "latex": latex,
                    "decimal": decimal,
                    "zero_rule": rule or None,
                }
                tail = dumps(record, ensure_ascii=False)[1:]
                if len(encoded) >= CACHE_ENTRIES:
                    encoded.clear()
                encoded[fields] = tail
            write(f'{{"line": {n}, {tail}\n')

        write = out.write
    else:
        writer = csv.writer(out, lineterminator="\n")
        writer.writerow(CSV_COLUMNS)
        writerow = writer.writerow

        def emit(n: int, fields: tuple[str, ...]) -> None:
            writerow((n, *fields))

    for n, raw in enumerate(lines, 1):
        try:
            text = raw.decode("utf-8")
        except UnicodeDecodeError as exc:
            bad += 1
            report_bad(n, f"not UTF-8 text (byte {exc.start + 1} of the line)")
            continue
        try:
            fields = answer(text)
        except BadLine as exc:
            bad += 1
            report_bad(n, str(exc))
            continue
        if fields is not None:
            emit(n, fields)
            answered += 1
    return answered, bad


# -- the command line: tablegen value --from FILE ----------------------------------------
def main_from(argv: list[str], stdout: "IO[str] | None" = None, stderr: "IO[str] | None" = None) -> int:
    """``tablegen value --from FILE [--json] [--digits N] [--max-j N]``; returns the exit status.

    0: every line answered; 2: a bad line (each reported), a usage mistake,
    an unreadable input or an output that cannot be written (one line each,
    never a traceback).
    """
    import sys

    out = sys.stdout if stdout is None else stdout
    err = sys.stderr if stderr is None else stderr
    if "-h" in argv or "--help" in argv:
        print(USAGE, file=out)
        return 0
    from .commands import error_line

    try:
        options = _options(argv)
    except BadLine as exc:
        print(error_line(str(exc), "--json" in argv), file=err)
        return 2
    source, as_json = options["source"], options["json"]
    name = "stdin" if source == "-" else source

    def fail(message: str, **fields) -> None:
        print(error_line(message, as_json, **fields), file=err)

    def report_bad(n: int, message: str) -> None:
        fail(message if as_json else f"{name} line {n}: {message}", file=name, line=n)

    try:
        stream = sys.stdin.buffer if source == "-" else open(source, "rb")  # noqa: SIM115
    except OSError as exc:
        fail(f"argument --from = {source!r}: cannot read: {exc.strerror or exc}", argument="--from")
        return 2
    try:
        answered, bad = answer_stream(
            _read_lines(stream), out, report_bad,
            digits=options["digits"], max_j=options["max_j"], as_json=as_json,
        )
        out.flush()
    except _InputError as exc:
        fail(f"argument --from = {source!r}: cannot read: {exc}", argument="--from")
        return 2
    except OSError as exc:  # a closed pipe or a full disk: say so once, leave quietly
        _silence(out)
        fail(f"cannot write the output: {exc.strerror or exc}")
        return 2
    finally:
        if source != "-":
            stream.close()
    if bad:
        fail(f"{bad} bad line{'s' * (bad != 1)}, {answered} answered", bad=bad, answered=answered)
        return 2
    return 0


class _InputError(Exception):
    """Reading the input failed (not writing the output)."""


def _read_lines(stream):
    """The input's lines as bytes; a read error becomes _InputError (told apart from output errors)."""
    it = iter(stream)
    while True:
        try:
            line = next(it)
        except StopIteration:
            return
        except OSError as exc:
            raise _InputError(exc.strerror or str(exc)) from None
        yield line


def _silence(out) -> None:
    """Point a broken stdout at /dev/null so the interpreter's last flush stays quiet."""
    import os
    import sys

    if out is sys.stdout:
        try:
            devnull = os.open(os.devnull, os.O_WRONLY)
            os.dup2(devnull, sys.stdout.fileno())
            os.close(devnull)
        except (OSError, ValueError):
            pass


def _options(argv: list[str]) -> dict:
    """Read ``--from FILE --json --digits N --max-j N`` (BadLine names the argument of a mistake)."""
    from .limits import MAX_DIGITS

    options: dict = {"source": None, "json": False, "digits": 15, "max_j": None}
    tokens = iter(argv)
    for token in tokens:
        name, eq, text = token.partition("=")
        if token == "--json":
            options["json"] = True
        elif name in ("--from", "--digits", "--max-j"):
            if not eq:
                text = next(tokens, None)
                if text is None:
                    what = "a file name or '-' for stdin" if name == "--from" else "a whole number"
                    raise BadLine(f"argument {name}: expected {what}")
            if name == "--from":
                options["source"] = text
                continue
            if not text.strip().isdigit():
                raise BadLine(f"argument {name} = {text!r}: must be a whole number")
            options[name[2:].replace("-", "_")] = int(text)
        else:
            raise BadLine(f"argument {token!r}: not an option of 'value --from' (KIND and arguments go in the file)")
    if not options["source"]:
        raise BadLine("argument --from: expected a file name or '-' for stdin")
    if not 1 <= options["digits"] <= MAX_DIGITS:
        raise BadLine(f"argument --digits = {options['digits']}: must be from 1 to {MAX_DIGITS:,}")
    return options
