"""Correctly rounded decimal strings of exact values sign * sqrt(p/q).

mpmath proposes the significant digits; an exact integer comparison then
proves that they are the correctly rounded ones (round half to even), and
nudges them by one unit in the last place if a binary approximation ever sat
too close to a rounding boundary.  No float is involved.
"""

from __future__ import annotations

from .intmath import int_text

__all__ = ["surd_decimal", "MAX_DIGITS"]

MAX_DIGITS = 100_000


def _bracket(a: int, p: int, q: int, s: int) -> int:
    """Compare sqrt(p/q)*10**s with a +- 1/2: -1 below a-1/2, 1 at/above a+1/2, 0 inside.

    Uses 4*x versus (2a+-1)**2 with x = p*10**(2s)/q, all in integers.
    """
    if s >= 0:
        lhs_num, lhs_den = 4 * p * 10 ** (2 * s), q
    else:
        lhs_num, lhs_den = 4 * p, q * 10 ** (-2 * s)
    lo = (2 * a - 1) ** 2 * lhs_den
    hi = (2 * a + 1) ** 2 * lhs_den
    if lhs_num < lo:
        return -1
    if lhs_num > hi:
        return 1
    if lhs_num == hi:  # exact tie above: half to even
        return 0 if a % 2 == 0 else 1
    if lhs_num == lo:  # exact tie below
        return 0 if a % 2 == 0 else -1
    return 0


_FAST_LEN = 1 << 3000


def _log10_guess(p: int, q: int) -> int:
    """floor(log10(sqrt(p/q))) within one, from bit lengths (for huge p, q)."""
    return ((p.bit_length() - q.bit_length()) * 30103 // 100000) // 2


def surd_decimal(sign: int, p: int, q: int, digits: int) -> str:
    """Decimal text of sign*sqrt(p/q) with `digits` significant digits."""
    if not isinstance(digits, int) or isinstance(digits, bool) or not 1 <= digits <= MAX_DIGITS:
        raise ValueError(f"argument digits = {digits!r}: must be a whole number from 1 to {MAX_DIGITS}")
    if sign == 0:
        return "0"
    import mpmath

    # first guess of the decimal exponent from the integers' lengths; the exact
    # check below corrects it by one either way if needed
    e10 = (len(int_text(p)) - len(int_text(q))) // 2 if max(p, q) < _FAST_LEN else _log10_guess(p, q)
    low, high = 10 ** (digits - 1), 10**digits
    # settle the exponent exactly: low <= sqrt(p/q) * 10**s < high, s = digits-1-e10
    for _ in range(8):
        s = digits - 1 - e10
        num, den = (p * 10 ** (2 * s), q) if s >= 0 else (p, q * 10 ** (-2 * s))
        if num >= high * high * den:
            e10 += 1
        elif num < low * low * den:
            e10 -= 1
        else:
            break
    with mpmath.workdps(digits + 12):
        v = mpmath.sqrt(mpmath.mpf(p) / mpmath.mpf(q))
        a = int(mpmath.nint(v * mpmath.mpf(10) ** (digits - 1 - e10)))
    s = digits - 1 - e10
    # exact confirmation of the rounding (and repair, should mpmath ever be off)
    for _ in range(64):
        where = _bracket(a, p, q, s)
        if where == 0:
            break
        a += where
    else:  # pragma: no cover - would mean mpmath was wildly off
        raise ArithmeticError("decimal rounding did not converge")
    if a == high:  # rounding carried into the next power of ten
        a, e10 = low, e10 + 1
    elif a < low:  # pragma: no cover - repaired below a power of ten
        a, e10 = high - 1, e10 - 1
    return _format(sign, int_text(a), e10)


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
