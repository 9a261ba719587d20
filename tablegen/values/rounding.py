"""Correctly rounded decimals of numbers known only through rigorous intervals.

A caller supplies ``bounds(prec)``: exact rational bounds (lo, hi) that contain
the value, computed with mpmath interval arithmetic at ``prec`` bits.  The
precision is raised until both bounds round to the same ``digits`` significant
digits (round half to even), which proves the rounding.  A value lying exactly
on a rounding boundary (or exactly zero) can never be decided this way; after
a bounded number of doublings an ArithmeticError says so.  Limits: no float is
used; the only approximation is mpmath's, and it is enclosed.
"""

from __future__ import annotations

from fractions import Fraction

TYPE_CHECKING = False  # typing is not imported: it would slow the start-up of `value d|D|Y`
if TYPE_CHECKING:  # pragma: no cover
    from collections.abc import Callable

from .decimals import DECIMAL_MAX_DIGITS, _format  # one decimal text format for every value type

__all__ = ["round_fraction", "decided_decimal", "mp_to_fraction"]

_MAX_DOUBLINGS = 7


def mp_to_fraction(raw) -> Fraction:
    """An mpmath raw mpf tuple (sign, man, exp, bc) as an exact Fraction."""
    sign, man, exp, _ = raw
    v = Fraction(man) * (Fraction(2) ** exp)
    return -v if sign else v


def round_fraction(f: Fraction, digits: int) -> tuple[int, int, int]:
    """(sign, mantissa, e10): f = sign * mantissa * 10**(e10 - digits + 1), half to even."""
    if not f:
        return 0, 0, 0
    sign, a = (1 if f > 0 else -1), abs(f)
    e10 = len(str(a.numerator)) - len(str(a.denominator))
    while a >= Fraction(10) ** (e10 + 1):
        e10 += 1
    while a < Fraction(10) ** e10:
        e10 -= 1
    m = round(a * Fraction(10) ** (digits - 1 - e10))  # Fraction.__round__: half to even
    if m == 10**digits:
        m, e10 = 10 ** (digits - 1), e10 + 1
    return sign, m, e10


def check_digits(digits: object) -> int:
    if not isinstance(digits, int) or isinstance(digits, bool) or not 1 <= digits <= DECIMAL_MAX_DIGITS:
        raise ValueError(f"argument digits = {digits!r}: must be a whole number from 1 to {DECIMAL_MAX_DIGITS}")
    return digits


def decided_decimal(bounds: Callable[[int], tuple[Fraction, Fraction]], digits: int) -> str:
    """Decimal text with `digits` significant digits, proved by interval bounds."""
    check_digits(digits)
    prec = (digits * 10) // 3 + 40  # bits: an int estimate
    for _ in range(_MAX_DOUBLINGS):
        lo, hi = bounds(prec)
        a, b = round_fraction(lo, digits), round_fraction(hi, digits)
        if a == b:
            sign, m, e10 = a
            return "0" if sign == 0 else _format(sign, str(m), e10)
        prec *= 2
    raise ArithmeticError(
        f"rounding to {digits} digits undecided at {prec // 2} bits: the value lies on a rounding boundary or is zero"
    )


def interval_bounds(interval_fn: Callable) -> Callable[[int], tuple[Fraction, Fraction]]:
    """bounds(prec) for decided_decimal from interval_fn(iv) -> mpmath interval, restoring iv's precision."""

    def bounds(prec: int) -> tuple[Fraction, Fraction]:
        from mpmath import iv

        saved = iv.prec
        iv.prec = prec
        try:
            v = interval_fn(iv)
        finally:
            iv.prec = saved
        return mp_to_fraction(v._mpi_[0]), mp_to_fraction(v._mpi_[1])

    return bounds
