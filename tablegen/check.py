"""``tablegen check FILE``: compare another program's floating-point values with the exact ones.

The file is CSV with a header row.  Columns (names case-insensitive, any order,
other columns ignored, rows whose first cell starts with ``#`` skipped):

* ``kind``: cg, 3j, 6j, w or 9j;
* the arguments, either in one column ``arguments`` (separated by spaces, in
  the order of the symbol, as ``tablegen value`` takes them) or in columns
  ``arg1`` ... ``arg9`` (a kind with six arguments leaves arg7..arg9 empty);
* ``value``: the other program's number as decimal text (``1.5e-3``; a
  Fortran exponent ``1.5D-3`` too; ``nan`` and ``inf`` are read as given
  results, which never agree).

Each row is judged against the exact value v, in this order:

* v = 0 by a selection rule and the given number is not 0 (the rule is named);
* v != 0 and the given number is 0;
* the sign differs;
* |given - v| > rtol * |v| (decided exactly, on squares of rationals).

Errors are also measured in units in the last place (the largest is reported
over the rows with the right sign and zero-ness; those wrong are listed apart): ulp(v) is the spacing of
doubles at v, 2**(e - 52) with 2**e <= |v| < 2**(e + 1) (2**-1074 below the
normal range).  |given - v| / ulp(v) is computed from the exact value in
integers (to 2**-60 ulp) and printed to three digits; a correctly rounded
double is within 0.5 ulp.

Exit status: 0 every row agrees, 1 a row disagrees, 2 bad input (a bad
header, an unreadable row: reported with its line number; the other rows are
still checked).
"""

from __future__ import annotations

import csv
import re
from dataclasses import dataclass, field
from fractions import Fraction
from math import isqrt

from .errors import TablegenError
from .kinds import KINDS, KIND_KEYS

__all__ = ["DEFAULT_RTOL", "CheckReport", "Disagreement", "Verdict", "check_rows", "judge", "ulp_exponent",
           "main_check", "report_record"]

#: Default relative tolerance: a double-precision code loses a few digits to
#: cancellation in the Racah sums; an error of 1e-10 is a real mistake.
DEFAULT_RTOL = "1e-12"
_ULP_BITS = 64  # fixed-point bits below one ulp in the error measurement
_FLOAT_TEXT = re.compile(r"[+-]?(?:\d+\.?\d*|\.\d+)(?:[eEdD][+-]?\d+)?\Z")
_NON_FINITE = {"nan": float("nan"), "+nan": float("nan"), "-nan": float("nan"), "inf": float("inf"),
               "+inf": float("inf"), "-inf": float("-inf"), "infinity": float("inf"),
               "+infinity": float("inf"), "-infinity": float("-inf")}


class BadRow(Exception):
    """A row that cannot be read; ``str()`` names the column, the value and the rule."""


@dataclass(frozen=True, slots=True)
class Verdict:
    """How one given number compares with the exact value.

    problem: None (agrees), "zero-rule", "nonzero", "sign", "tolerance" or "not-finite".
    ulps: |given - v| / ulp(v) as a Fraction (None when v = 0 or the given is not finite).
    """

    problem: "str | None"
    ulps: "Fraction | None"
    rule: str = ""


@dataclass
class _Tally:
    rows: int = 0
    agree: int = 0
    worst: "Fraction | None" = None
    worst_line: int = 0

    def add(self, line: int, verdict: Verdict) -> None:
        self.rows += 1
        self.agree += verdict.problem is None
        measured = verdict.problem in (None, "tolerance")  # a sign flip or a lost zero is listed apart
        if measured and verdict.ulps is not None and (self.worst is None or verdict.ulps > self.worst):
            self.worst, self.worst_line = verdict.ulps, line


@dataclass(frozen=True, slots=True)
class Disagreement:
    """A row whose number disagrees with the exact value (line: 1-based line of the file)."""

    line: int
    kind: str
    symbol: str
    verdict: Verdict
    given: str  # the float read from the file, as Python writes it back (repr)
    exact: str  # the exact value's canonical text
    explanation: str  # one sentence: what is wrong, with the exact value and its decimal

    def record(self) -> dict:
        """The JSON object of ``check --json``."""
        u = self.verdict.ulps
        return {"line": self.line, "kind": self.kind, "symbol": self.symbol, "problem": self.verdict.problem,
                "given": self.given, "exact": self.exact, "zero_rule": self.verdict.rule or None,
                "error_ulps": None if u is None else f"{float(u):.3g}", "explanation": self.explanation}


@dataclass
class CheckReport:
    """Counts per kind and overall, the rows that disagree and the bad rows ((line, message))."""

    rtol: Fraction
    kinds: dict[str, _Tally] = field(default_factory=dict)
    total: _Tally = field(default_factory=_Tally)
    disagreements: list[Disagreement] = field(default_factory=list)
    bad: list[tuple[int, str]] = field(default_factory=list)

    @property
    def status(self) -> int:
        return 2 if self.bad else 1 if self.disagreements else 0


# -- the exact judgement ---------------------------------------------------------------------
def ulp_exponent(p: int, q: int) -> int:
    """E with ulp(v) = 2**E for |v| = sqrt(p/q) > 0 (doubles: 52 fraction bits, normal from 2**-1022)."""
    b = p.bit_length() - q.bit_length()  # floor(log2(p/q)) is b or b - 1
    if (p << -b if b < 0 else p) < (q << b if b > 0 else q):
        b -= 1
    return max(b >> 1, -1022) - 52  # floor(log2 sqrt(p/q)) = floor(b / 2)


def _error_ulps(f: float, sign: int, p: int, q: int) -> Fraction:
    """|f - sign*sqrt(p/q)| / ulp, from integers: exact to 2**-(_ULP_BITS - 2) ulp."""
    E = ulp_exponent(p, q)
    fn, fd = f.as_integer_ratio()  # fd is a power of two
    shift = _ULP_BITS - E  # everything in units of 2**-_ULP_BITS ulp
    root = isqrt((p << (2 * shift)) // q) if shift >= 0 else isqrt(p // (q << (-2 * shift)))
    given = Fraction(fn << shift, fd) if shift >= 0 else Fraction(fn, fd << -shift)
    return abs(given - sign * root) / (1 << _ULP_BITS)


def judge(f: float, value, rtol: Fraction, rule: str = "") -> Verdict:
    """Compare a given float with an exact value sign*sqrt(p/q) (``rule``: why it is zero, if it is)."""
    sign, p, q = value.sign, value.p, value.q
    if f != f or f in (float("inf"), float("-inf")):
        return Verdict("not-finite", None, rule)
    if not sign:
        return Verdict(None if f == 0 else "zero-rule", None, rule)
    ulps = _error_ulps(f, sign, p, q)
    if f == 0:
        return Verdict("nonzero", ulps)
    if (f > 0) != (sign > 0):
        return Verdict("sign", ulps)
    # |f - v| <= rtol |v|  <=>  (1 - rtol)**2 <= f**2 / v**2 <= (1 + rtol)**2  (same signs)
    ratio = Fraction(f) ** 2 * q / p
    ok = (1 - rtol) ** 2 <= ratio <= (1 + rtol) ** 2
    return Verdict(None if ok else "tolerance", ulps)


# -- reading the file ------------------------------------------------------------------------
def read_float(text: str) -> float:
    """The given number as a float (BadRow unless decimal text, Fortran D exponents allowed)."""
    t = text.strip()
    if t.lower() in _NON_FINITE:
        return _NON_FINITE[t.lower()]
    if not _FLOAT_TEXT.match(t):
        raise BadRow(f"column value = {text!r}: not a decimal number")
    return float(t.replace("D", "e").replace("d", "e"))


class _Columns:
    """Where kind, arguments and value are in a header row."""

    def __init__(self, header: list[str]) -> None:
        names = [h.strip().lower() for h in header]
        for need in ("kind", "value"):
            if need not in names:
                raise BadRow(f"header {','.join(header)!r}: needs a column {need!r} (see 'tablegen check --help')")
        self.kind, self.value = names.index("kind"), names.index("value")
        if "arguments" in names:
            self.args: "int | list[int]" = names.index("arguments")
        else:
            found = [names.index(f"arg{i}") for i in range(1, 10) if f"arg{i}" in names]
            if not found or found != [names.index(f"arg{i}") for i in range(1, len(found) + 1)]:
                raise BadRow(f"header {','.join(header)!r}: needs a column 'arguments' or columns arg1, arg2, ...")
            self.args = found

    def read(self, row: list[str]) -> tuple[str, list[str], str]:
        def cell(i: int) -> str:
            return row[i] if i < len(row) else ""

        if isinstance(self.args, int):
            args = cell(self.args).split()
        else:
            args = [cell(i).strip() for i in self.args]
            while args and not args[-1]:
                args.pop()
        return cell(self.kind).strip(), args, cell(self.value)


def check_rows(rows, rtol: Fraction) -> CheckReport:
    """Judge every row of a CSV reader (the header first); rows stream, nothing is kept but the report."""
    from .notation import symbol_text

    kinds = {k.key: k for k in KINDS}
    report = CheckReport(rtol)
    columns = None
    for n, row in enumerate(rows, 1):
        if not row or not "".join(row).strip() or row[0].lstrip().startswith("#"):
            continue
        try:
            if columns is None:
                columns = _Columns(row)
                continue
            key, args, text = columns.read(row)
            k = kinds.get(key)
            if k is None:
                raise BadRow(f"column kind = {key!r}: must be one of {', '.join(KIND_KEYS)}")
            if len(args) != len(k.arguments):
                raise BadRow(f"{key} needs {len(k.arguments)} arguments ({' '.join(k.arguments)}), got {len(args)}")
            try:
                t = k.parse(args, None)
            except (TablegenError, TypeError, ValueError) as exc:
                raise BadRow(str(exc)) from None
            f = read_float(text)
        except BadRow as exc:
            report.bad.append((n, str(exc)))
            if columns is None:
                return report  # without a header nothing else can be read
            continue
        value = k.doubled(*t)
        rule = "" if value else str(k.zero_rule(t))
        verdict = judge(f, value, rtol, rule)
        report.kinds.setdefault(key, _Tally()).add(n, verdict)
        report.total.add(n, verdict)
        if verdict.problem is not None:
            report.disagreements.append(Disagreement(
                n, key, symbol_text(key, t), verdict, repr(f), str(value), _explain(verdict, f, value, rtol)))
    if columns is None:
        report.bad.append((1, "no header row (see 'tablegen check --help')"))
    return report


def _explain(v: Verdict, f: float, value, rtol: Fraction) -> str:
    given = repr(f)
    exact = f"{value} = {value.decimal(17)}" if value else "0"
    if v.problem == "zero-rule":
        return f"zero by {v.rule}, but given {given}"
    if v.problem == "nonzero":
        return f"given 0, but the value is {exact} (no selection rule makes it zero)"
    if v.problem == "not-finite":
        return f"given {given}, not a finite number; the value is {exact}"
    if v.problem == "sign":
        return f"sign wrong: given {given}, the value is {exact}"
    rel = float(abs(Fraction(f) - Fraction(float(value)))) / abs(float(value))  # display only
    return f"given {given}, the value is {exact}: relative error {rel:.2g} > rtol {_g(rtol)} ({_ulps_text(v.ulps)})"


def _count(n: int) -> str:
    return f"{n} value{'s' * (n != 1)}"


def _g(x: Fraction) -> str:
    return f"{float(x):.3g}"


def _ulps_text(u: "Fraction | None") -> str:
    if u is None:
        return "-"
    return f"{float(u):.3g} ulp"


def summary_lines(report: CheckReport, name: str) -> list[str]:
    """The report as text: overall, then per kind (registry order), then each row that disagrees."""
    t = report.total
    worst = "" if t.worst is None else f"; largest error {_ulps_text(t.worst)} (line {t.worst_line})"
    lines = [f"check {name}: {_count(t.rows)}, {t.agree} agree to rtol {_g(report.rtol)}, "
             f"{t.rows - t.agree} disagree{worst}"]
    for key in KIND_KEYS:
        k = report.kinds.get(key)
        if k is not None:
            w = "" if k.worst is None else f", largest error {_ulps_text(k.worst)} (line {k.worst_line})"
            lines.append(f"  {key:<3} {_count(k.rows)}, {k.agree} agree{w}")
    lines += [f"  disagrees: line {d.line}: {d.symbol}: {d.explanation}" for d in report.disagreements]
    return lines


# -- the command line: tablegen check FILE [--rtol X] ----------------------------------------
def parse_rtol(text: "str | None") -> Fraction:
    """The tolerance as an exact Fraction from its decimal text (BadRow unless 0 <= rtol < 1)."""
    t = DEFAULT_RTOL if text is None else text.strip()
    try:
        rtol = Fraction(t) if _FLOAT_TEXT.match(t) else None
    except (ValueError, ZeroDivisionError):
        rtol = None
    if rtol is None or not 0 <= rtol < 1:
        raise BadRow(f"argument --rtol = {text!r}: must be a decimal number from 0 up to (not including) 1")
    return rtol


def report_record(report: CheckReport, name: str) -> dict:
    """The report as one JSON-ready object (``check --json``): counts, largest errors, each disagreement.

    An error in ulps is a decimal text to three significant digits (it is a
    measurement, not a number to compute with); lines are 1-based line
    numbers of the file, as in the text report.
    """
    def tally(k: _Tally) -> dict:
        return {
            "values": k.rows,
            "agree": k.agree,
            "disagree": k.rows - k.agree,
            "largest_error_ulps": None if k.worst is None else f"{float(k.worst):.3g}",
            "largest_error_line": None if k.worst is None else k.worst_line,
        }

    from . import __version__
    from .commands import JSON_FORMAT

    return {
        "format": JSON_FORMAT,
        "file": name,
        "rtol": _g(report.rtol),
        **tally(report.total),
        "kinds": {key: tally(report.kinds[key]) for key in KIND_KEYS if key in report.kinds},
        "disagreements": [d.record() for d in report.disagreements],
        "bad_rows": len(report.bad),
        "version": __version__,
    }


def main_check(path: str, rtol_text: "str | None" = None, stdout=None, stderr=None, as_json: bool = False) -> int:
    """Run ``tablegen check``: the report on stdout (text, or one JSON object), bad rows on stderr.

    A bad --rtol or an unreadable FILE is an error for cli.main to report (one
    line, or a JSON object with --json; exit status 2).  Bad rows do not stop
    the check: each is reported on stderr (a JSON object each with --json) after
    the report, and the exit status is 2.
    """
    import sys

    from .errors import OptionError

    out = sys.stdout if stdout is None else stdout
    err = sys.stderr if stderr is None else stderr
    try:
        rtol = parse_rtol(rtol_text)
    except BadRow as exc:
        raise OptionError("--rtol", rtol_text, str(exc).split(": ", 1)[1]) from None
    try:
        # utf-8-sig: a spreadsheet's export may start with a byte-order mark
        stream = sys.stdin if path == "-" else open(path, encoding="utf-8-sig", newline="")  # noqa: SIM115
    except OSError as exc:
        raise OptionError("FILE", path, f"cannot read: {exc.strerror or exc}") from None
    try:
        report = check_rows(csv.reader(stream), rtol)
    except (OSError, UnicodeDecodeError, csv.Error) as exc:
        why = f"not UTF-8 text (byte {exc.start})" if isinstance(exc, UnicodeDecodeError) else (
            getattr(exc, "strerror", None) or str(exc))
        raise OptionError("FILE", path, f"cannot read: {why}") from None
    finally:
        if path != "-":
            stream.close()
    if as_json:
        import json

        out.write(json.dumps(report_record(report, path), ensure_ascii=False) + "\n")
    else:
        out.write("\n".join(summary_lines(report, path)) + "\n")
    out.flush()  # a closed or full output raises here: cli.main says so in one line
    from .commands import error_line

    for line, message in report.bad:
        text = message if as_json else f"{path} line {line}: {message}"
        print(error_line(text, as_json, file=path, line=line), file=err)
    return report.status
