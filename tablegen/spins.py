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

import numbers
from fractions import Fraction

from .errors import QuantumNumberError

__all__ = [
    "DEFAULT_MAX_J",
    "parse_j",
    "parse_m",
    "half_text",
]

#: Largest j accepted unless the caller raises the limit explicitly (max_j=...);
#: a typo such as 1e9 must not start a computation that never ends.
DEFAULT_MAX_J = 2000
_DEFAULT_TWICE_MAX = 2 * DEFAULT_MAX_J

RULE_NOT_NUMBER = "not a number"
RULE_NOT_FINITE = "NaN or infinity is not a quantum number"
RULE_NOT_HALF = "not a multiple of 1/2"
RULE_NEGATIVE_J = "j must be >= 0"


def _doubled(value: object, argument: str) -> int:
    """2*value as an int, or QuantumNumberError naming the argument."""
    t = type(value)
    if t is int:
        return 2 * value  # type: ignore[operator]
    if t is Fraction:
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
    if isinstance(value, numbers.Integral):
        return 2 * int(value)
    if isinstance(value, numbers.Rational):
        return _doubled_fraction(Fraction(int(value.numerator), int(value.denominator)), value, argument)
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
        return _doubled_fraction(Fraction(value), value, argument)  # type: ignore[arg-type]
    if getattr(value, "is_finite", None) is False or str(value) in ("nan", "oo", "-oo", "zoo"):
        raise QuantumNumberError(argument, value, RULE_NOT_FINITE)  # sympy's nan and infinities
    raise QuantumNumberError(argument, value, RULE_NOT_NUMBER)


def _doubled_fraction(f: Fraction, original: object, argument: str) -> int:
    """2f for an exact rational, reporting errors with the value as the user gave it."""
    if f.denominator == 1:
        return 2 * f.numerator
    if f.denominator == 2:
        return f.numerator
    raise QuantumNumberError(argument, original, RULE_NOT_HALF)


def _doubled_from_text(text: str, argument: str) -> int:
    stripped = text.strip().replace("\u2212", "-")
    if stripped.lower().lstrip("+-") in ("nan", "inf", "infinity"):
        raise QuantumNumberError(argument, text, RULE_NOT_FINITE)
    if not stripped or "_" in stripped:
        raise QuantumNumberError(argument, text, RULE_NOT_NUMBER)
    try:
        f = Fraction(stripped)
    except (ValueError, ZeroDivisionError):
        raise QuantumNumberError(argument, text, RULE_NOT_NUMBER) from None
    return _doubled_fraction(f, text, argument)


def _too_large_rule(max_j: int | None) -> str:
    limit = DEFAULT_MAX_J if max_j is None else max_j
    return f"j above the size limit {limit} (pass max_j=... or --max-j to allow it)"


def parse_j(value: object, argument: str, max_j: int | None = None) -> int:
    """2j for an angular momentum j >= 0 and <= max_j (DEFAULT_MAX_J if None)."""
    kind = type(value)
    if kind is int:
        tj = value + value
    elif kind is Fraction and value._denominator <= 2:  # type: ignore[union-attr]
        tj = value._numerator * (2 // value._denominator)  # type: ignore[union-attr]
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
    elif kind is Fraction and value._denominator <= 2:  # type: ignore[union-attr]
        tm = value._numerator * (2 // value._denominator)  # type: ignore[union-attr]
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
