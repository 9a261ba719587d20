"""Quantum numbers: parsing j and m into doubled integers, and selection rules.

Inside tablegen every j and m is kept as twice its value (an int), so that
half-integers need no fractions.  Parsing accepts what people type or compute
with (int, "3/2", "-1/2", "1.5", Fraction, sympy Rational, Decimal, and floats
or numpy scalars that are exactly a multiple of 1/2) and rejects anything
else with a :class:`~tablegen.errors.QuantumNumberError`.

Selection rules are not errors: a triangle that fails, a triad whose sum is
not an integer, m's that do not add up or |m| > j make a coefficient exactly
zero (triads.py and kinds/ say which rule did it).
"""

from __future__ import annotations

import sys

from .errors import OptionError, QuantumNumberError

__all__ = [
    "DEFAULT_MAX_J",
    "parse_j",
    "parse_m",
    "half_text",
    "rational_from_text",
    "count_from_text",
    "MAX_LITERAL_CHARS",
    "MAX_EXPONENT",
]

#: Largest j accepted unless the caller raises the limit explicitly (max_j=...);
#: a typo such as 1e9 must not start a computation that never ends.
DEFAULT_MAX_J = 2000
_DEFAULT_TWICE_MAX = 2 * DEFAULT_MAX_J

RULE_NOT_NUMBER = "not a number"
RULE_NOT_FINITE = "NaN or infinity is not a quantum number"
RULE_NOT_HALF = "not a multiple of 1/2"
RULE_NEGATIVE_J = "j must be >= 0"
RULE_ASCII = "write numbers with the ASCII digits 0-9"
RULE_ZERO_DENOMINATOR = "not a number (division by zero)"

#: Longest number literal accepted anywhere (command line, recipe, data files); a
#: 5000-digit number or "1e99999999" is refused by its length or exponent, unconverted.
MAX_LITERAL_CHARS = 40
MAX_EXPONENT = 30
RULE_TOO_LONG = f"a number literal has at most {MAX_LITERAL_CHARS} characters"
RULE_EXPONENT = f"exponent beyond +-{MAX_EXPONENT}"


def _doubled(value: object, argument: str) -> int:
    """2*value as an int, or QuantumNumberError naming the argument."""
    t = type(value)
    if t is int:
        return 2 * value  # type: ignore[operator]
    if t is _fraction_type():
        n, d = value._numerator, value._denominator  # type: ignore[union-attr]
        if d == 1:
            return 2 * n
        if d == 2:
            return n
        raise QuantumNumberError(argument, value, RULE_NOT_HALF)
    if isinstance(value, bool):
        raise QuantumNumberError(argument, value, RULE_NOT_NUMBER)
    if isinstance(value, str):
        return _doubled_from_text(value, argument)
    import numbers  # here, not above: the command line passes text and never needs it

    if isinstance(value, numbers.Integral):
        return 2 * int(value)
    if isinstance(value, numbers.Rational):
        n, d = int(value.numerator), int(value.denominator)
        if (2 * n) % d:
            raise QuantumNumberError(argument, value, RULE_NOT_HALF)
        return 2 * n // d
    if isinstance(value, numbers.Real):  # float, numpy floating: exact binary value
        f = float(value)
        if f != f or f in (float("inf"), float("-inf")):
            raise QuantumNumberError(argument, value, RULE_NOT_FINITE)
        if not (2 * f).is_integer():
            raise QuantumNumberError(argument, value, RULE_NOT_HALF)
        return int(2 * f)
    # Decimal and other exact number types that Fraction understands
    if type(value).__name__ == "Decimal":
        if not value.is_finite():  # type: ignore[union-attr]
            raise QuantumNumberError(argument, value, RULE_NOT_FINITE)
        if abs(value.adjusted()) > MAX_EXPONENT:  # type: ignore[union-attr]  # 1E+99999999: never expanded
            raise QuantumNumberError(argument, value, RULE_EXPONENT)
        from fractions import Fraction

        return _doubled_fraction(Fraction(value), value, argument)  # type: ignore[arg-type]
    if getattr(value, "is_finite", None) is False or str(value) in ("nan", "oo", "-oo", "zoo"):
        raise QuantumNumberError(argument, value, RULE_NOT_FINITE)  # sympy's nan and infinities
    raise QuantumNumberError(argument, value, RULE_NOT_NUMBER)


def _fraction_type() -> type | None:
    """fractions.Fraction if anything imported it (else no value can be one): keeps start-up light."""
    module = sys.modules.get("fractions")
    return module.Fraction if module is not None else None


def _doubled_fraction(f, original: object, argument: str) -> int:
    """2f for an exact rational, reporting errors with the value as the user gave it."""
    if f.denominator == 1:
        return 2 * f.numerator
    if f.denominator == 2:
        return f.numerator
    raise QuantumNumberError(argument, original, RULE_NOT_HALF)


def _doubled_from_text(text: str, argument: str) -> int:
    """2x for the text of a number x, checked by length and exponent before any conversion."""
    n, d = rational_from_text(text, argument)
    if (2 * n) % d:
        raise QuantumNumberError(argument, text, RULE_NOT_HALF)
    return 2 * n // d


def rational_from_text(text: str, argument: str) -> tuple[int, int]:
    """(numerator, denominator > 0) of a number written in ASCII, never converting a huge literal.

    Accepted: an optional sign (+, -, or U+2212), then digits ("2"), a ratio
    ("3/2", "6/4"), a decimal ("1.5", ".5", "2.") with an optional exponent
    ("1e3", "2.5E-1"); surrounding spaces are ignored.  Only the ASCII digits
    0-9 count (no "١", "１", no "1_0"), the whole literal has at most
    MAX_LITERAL_CHARS characters and the exponent at most MAX_EXPONENT in size,
    so that "1e99999999" or a 5000-digit number is refused at once.
    """
    if not isinstance(text, str):
        raise QuantumNumberError(argument, text, RULE_NOT_NUMBER)
    s = text.strip()
    if len(s) > MAX_LITERAL_CHARS:
        raise QuantumNumberError(argument, text, RULE_TOO_LONG)
    if s[:1] == "\u2212":
        s = "-" + s[1:]
    if s.lower().lstrip("+-") in ("nan", "inf", "infinity"):
        raise QuantumNumberError(argument, text, RULE_NOT_FINITE)
    sign = 1
    if s and s[0] in "+-":
        sign, s = (-1 if s[0] == "-" else 1), s[1:]
    if not s.isascii():
        rule = RULE_ASCII if any(c.isdigit() for c in s) else RULE_NOT_NUMBER
        raise QuantumNumberError(argument, text, rule)
    num, slash, den = s.partition("/")
    if slash:
        if not (num.isdigit() and den.isdigit()):
            raise QuantumNumberError(argument, text, RULE_NOT_NUMBER)
        if int(den) == 0:
            raise QuantumNumberError(argument, text, RULE_ZERO_DENOMINATOR)
        return sign * int(num), int(den)
    mantissa, e, exponent = s.lower().partition("e")
    whole, dot, frac = mantissa.partition(".")
    if not (whole or frac) or not (whole.isdigit() or not whole) or not (frac.isdigit() or not frac):
        raise QuantumNumberError(argument, text, RULE_NOT_NUMBER)
    power = 0
    if e:
        digits = exponent.lstrip("+-")
        if not digits.isdigit() or len(exponent) - len(digits) > 1:
            raise QuantumNumberError(argument, text, RULE_NOT_NUMBER)
        power = int(exponent)
        if abs(power) > MAX_EXPONENT:
            raise QuantumNumberError(argument, text, RULE_EXPONENT)
    value = int(whole + frac) if whole + frac else 0
    power -= len(frac)
    if power >= 0:
        return sign * value * 10**power, 1
    return sign * value, 10**-power


def count_from_text(text: object, argument: str, low: int, high: int) -> int:
    """A whole number in [low, high] from an option's text ("--digits 20"), same literal rules.

    Refuses, naming the option: anything but plain ASCII digits with an
    optional sign, a literal longer than MAX_LITERAL_CHARS, and values out of
    range.  "1_0", "١٠" and "1e3" are not counts.
    """
    s = text.strip() if isinstance(text, str) else ""
    rule = f"must be a whole number from {low:,} to {high:,}"
    body = s[1:] if s[:1] in "+-" else s
    if not (body.isascii() and body.isdigit()):
        raise OptionError(argument, text, rule)
    if len(s) > MAX_LITERAL_CHARS:
        raise OptionError(argument, text, f"{rule} (a literal of at most {MAX_LITERAL_CHARS} characters)")
    value = int(s)
    if not low <= value <= high:
        raise OptionError(argument, text, rule)
    return value


def _too_large_rule(max_j: int | None) -> str:
    limit = DEFAULT_MAX_J if max_j is None else max_j
    return f"j above the size limit {limit} (pass max_j=... or --max-j to allow it)"


def parse_j(value: object, argument: str, max_j: int | None = None) -> int:
    """2j for an angular momentum j >= 0 and <= max_j (DEFAULT_MAX_J if None)."""
    kind = type(value)
    if kind is int:
        tj = value + value
    else:
        tj = _doubled(value, argument)
    if tj < 0:
        raise QuantumNumberError(argument, value, RULE_NEGATIVE_J)
    if tj > (_DEFAULT_TWICE_MAX if max_j is None else 2 * max_j):
        raise QuantumNumberError(argument, value, _too_large_rule(max_j))
    return tj


def parse_m(value: object, argument: str, tj: int, j_argument: str, max_j: int | None = None) -> int:
    """2m for a projection m of a j already parsed as tj; j - m must be whole.

    |m| > j is a selection-rule zero, not an error, but |m| beyond the size
    limit is refused like a j would be (it can only be a typo).
    """
    kind = type(value)
    if kind is int:
        tm = value + value
    else:
        tm = _doubled(value, argument)
    if (tj - tm) & 1:
        raise QuantumNumberError(
            argument, value,
            f"{j_argument} - {argument} must be an integer ({j_argument} = {half_text(tj)})",
        )
    if abs(tm) > (_DEFAULT_TWICE_MAX if max_j is None else 2 * max_j):
        raise QuantumNumberError(argument, value, _too_large_rule(max_j))
    return tm


def half_text(t: int) -> str:
    """Text for t/2: '3/2', '-1/2', '2'."""
    return str(t // 2) if t % 2 == 0 else f"{t}/2"
