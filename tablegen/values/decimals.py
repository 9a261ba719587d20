"""Correctly rounded decimal text and floats of exact values, in integers only.

A surd sign*sqrt(p/q) is rounded directly: ``math.isqrt`` of the scaled
integer p*10**(2s)//q gives floor(sqrt(p/q)*10**s), and one exact comparison
decides the last digit (round half to even).  A value known only through
integer bounds (an exact sum of surds: see exact_sum.py) is rounded by
tightening the bounds until every point between them rounds the same way,
which always happens for an irrational value.  No float and no mpmath on
either path.
"""

from __future__ import annotations

from math import isqrt

from ..intmath import int_text

__all__ = ["DECIMAL_MAX_DIGITS", "check_digits", "surd_decimal", "surd_float", "bounded_decimal", "bounded_float"]

#: The most significant digits ``value.decimal(digits)`` computes (the library's own bound; the
#: command line and recipes stop at the smaller documented limits.MAX_DIGITS).
DECIMAL_MAX_DIGITS = 100_000

#: bounds(base, s) -> (low, high) integers with low <= |value| * base**s <= high
#: (a type alias written as text: importing typing would double the one-value start-up)
Bounds = "Callable[[int, int], tuple[int, int]]"


def check_digits(digits: object) -> None:
    """ValueError naming the argument unless 1 <= digits <= DECIMAL_MAX_DIGITS (an int)."""
    if not isinstance(digits, int) or isinstance(digits, bool) or not 1 <= digits <= DECIMAL_MAX_DIGITS:
        raise ValueError(f"argument digits = {digits!r}: must be a whole number from 1 to {DECIMAL_MAX_DIGITS}")


_FAST_LEN = 1 << 3000


def _log10_guess(p: int, q: int) -> int:
    """floor(log10(sqrt(p/q))) within one, from bit lengths (for huge p, q)."""
    return ((p.bit_length() - q.bit_length()) * 30103 // 100000) // 2


def surd_decimal(sign: int, p: int, q: int, digits: int) -> str:
    """Decimal text of sign*sqrt(p/q) with `digits` significant digits."""
    check_digits(digits)
    if sign == 0:
        return "0"
    # first guess of the decimal exponent from the integers' lengths; the exact
    # check below corrects it by one either way if needed
    e10 = (len(str(p)) - len(str(q))) // 2 if p < _FAST_LEN and q < _FAST_LEN else _log10_guess(p, q)
    pow10 = _POW10
    top = len(pow10)
    low2 = pow10[2 * digits - 2] if 2 * digits < top else 10 ** (2 * digits - 2)  # 10**(digits-1), squared
    high2 = low2 * 100  # 10**digits, squared
    # settle the exponent exactly: low <= sqrt(p/q) * 10**s < high, s = digits-1-e10
    for _ in range(8):
        s2 = 2 * (digits - 1 - e10)
        if s2 >= 0:
            num, den = p * (pow10[s2] if s2 < top else 10**s2), q
        else:
            num, den = p, q * (pow10[-s2] if -s2 < top else 10**-s2)
        if num >= high2 * den:
            e10 += 1
        elif num < low2 * den:
            e10 -= 1
        else:
            break
    else:  # pragma: no cover - the guess is never that far off
        raise ArithmeticError("decimal exponent did not settle")
    a = isqrt(num // den)  # floor(sqrt(num/den)), since isqrt(floor(x)) = floor(sqrt(x))
    # round half to even, decided exactly: sqrt(num/den) against a + 1/2
    lhs, mid = 4 * num, (2 * a + 1) ** 2 * den
    if lhs > mid or (lhs == mid and a & 1):
        a += 1
        if a * a == high2:  # rounding carried into the next power of ten
            a, e10 = a // 10, e10 + 1
    return _format(sign, int_text(a), e10)


_POW10 = [10**k for k in range(256)]


def surd_float(sign: int, p: int, q: int) -> float:
    """sign*sqrt(p/q) as the nearest float (ties to even), from integers only.

    m = floor(sqrt(p/q) * 2**k) with about 60 significant bits; the true value
    lies in [m, m+1), so 2m+1 (or 2m when exact) rounds to the same float as the
    value itself, and int / int true division is correctly rounded in CPython.
    """
    if not sign:
        return 0.0
    k = 60 - (p.bit_length() - q.bit_length()) // 2
    num, den = (p << (2 * k), q) if k >= 0 else (p, q << (-2 * k))
    m = isqrt(num // den)
    s = 2 * m + (0 if m * m * den == num else 1)
    e = k + 1
    value = s / (1 << e) if e >= 0 else float(s << -e)
    return value if sign > 0 else -value


def bounded_decimal(sign: int, bounds: Bounds, magnitude: int, digits: int) -> str:
    """Decimal text of an IRRATIONAL value with the given sign, known through integer bounds.

    magnitude: a guess of floor(log10|value|) (any int; only speed depends on it).
    Tightens the bounds (more digits) until the exponent and then the rounding
    are settled; an irrational value is never on a rounding boundary, so this ends.
    """
    check_digits(digits)
    e10 = magnitude
    guard = 4
    for _ in range(400):  # exponent: low and high agree on the number of digits
        lo, hi = bounds(10, digits - 1 - e10 + guard)
        if lo > 0 and len(int_text(lo)) == len(int_text(hi)):
            e10 = len(int_text(lo)) - 1 - (digits - 1 - e10 + guard)
            break
        if lo > 0:
            guard += guard
        else:  # the value is far below the guess: look lower
            e10 -= guard
            guard += 4
    else:  # pragma: no cover - only for a rational value passed by mistake
        raise ArithmeticError("decimal exponent did not settle")
    unit = 10**guard
    for _ in range(400):  # rounding: every point in [lo, hi] rounds to the same a
        lo, hi = bounds(10, digits - 1 - e10 + guard)
        a_lo, a_hi = (2 * lo + unit) // (2 * unit), (2 * hi + unit) // (2 * unit)
        if a_lo == a_hi:
            break
        guard += guard
        unit = 10**guard
    else:  # pragma: no cover
        raise ArithmeticError("decimal rounding did not settle")
    if a_lo == 10**digits:
        a_lo, e10 = 10 ** (digits - 1), e10 + 1
    return _format(sign, int_text(a_lo), e10)


def bounded_float(sign: int, bounds: Bounds, magnitude_bits: int) -> float:
    """The nearest float to an IRRATIONAL value known through integer bounds (base 2)."""
    k = 64 - magnitude_bits
    for _ in range(400):
        lo, hi = bounds(2, k)
        if lo > 0:
            f_lo = lo / (1 << k) if k >= 0 else float(lo << -k)
            f_hi = hi / (1 << k) if k >= 0 else float(hi << -k)
            if f_lo == f_hi:
                return f_lo if sign > 0 else -f_lo
            k += 32
        else:
            k += 64
    raise ArithmeticError("float rounding did not settle")  # pragma: no cover


def _format(sign: int, mantissa: str, e10: int) -> str:
    """Fixed notation for moderate exponents, scientific otherwise."""
    digits = len(mantissa)
    minus = "-" if sign < 0 else ""
    if -6 <= e10 < 0:
        return f"{minus}0.{'0' * (-e10 - 1)}{mantissa}"
    if 0 <= e10 < digits:
        whole, frac = mantissa[: e10 + 1], mantissa[e10 + 1 :]
        return f"{minus}{whole}.{frac}" if frac else f"{minus}{whole}"
    head = mantissa[0] + ("." + mantissa[1:] if digits > 1 else "")
    return f"{minus}{head}e{e10:+d}"
