"""Surd.decimal(digits) is correctly rounded, half to even.

Rounding rule: round to nearest, ties to even (IEEE 754-2008 §4.3.1,
roundTiesToEven; common practice, no source for applying it to decimal text).

Two references outside tablegen:

* an exact integer computation written here (``_exact_digits``): the floor of
  a square root by ``math.isqrt`` and an exact comparison with the midpoint;
* Python's ``decimal`` module, whose square root is correctly rounded with
  round-half-even (General Decimal Arithmetic Specification, "square-root";
  from memory), used where p/q is an exact decimal (q divides a power of 10).

The text format is tablegen's own: fixed notation for decimal exponents
-6 <= e < digits, scientific ("1.00e+7") otherwise.
"""

from __future__ import annotations

import decimal
import random
import re
from fractions import Fraction
from math import isqrt

import pytest

from tablegen import Surd
from tablegen.values.decimals import DECIMAL_MAX_DIGITS

_TEXT = re.compile(r"^(-?)(\d+)(?:\.(\d+))?(?:e([+-])([1-9]\d*))?$")


def _exponent10(p: int, q: int) -> int:
    """e with 10**e <= sqrt(p/q) < 10**(e+1), by exact integer comparisons."""
    e = (len(str(p)) - len(str(q))) // 2
    while True:
        # 10**(2e) <= p/q ?
        low = p * 10 ** max(0, -2 * e) >= q * 10 ** max(0, 2 * e)
        high = p * 10 ** max(0, -2 * e - 2) < q * 10 ** max(0, 2 * e + 2)
        if low and high:
            return e
        e += -1 if not low else 1


def _exact_digits(p: int, q: int, digits: int) -> tuple[int, int]:
    """(a, e): sqrt(p/q) ~ a * 10**(e - digits + 1), a with `digits` digits, half-even."""
    e = _exponent10(p, q)
    s = digits - 1 - e
    num, den = (p * 10 ** (2 * s), q) if s >= 0 else (p, q * 10 ** (-2 * s))
    a = isqrt(num // den)  # floor(sqrt(num/den)) == isqrt(floor(num/den))
    # compare sqrt(num/den) with a + 1/2, i.e. 4*num/den with (2a+1)**2
    lhs, rhs = 4 * num, (2 * a + 1) ** 2 * den
    if lhs > rhs or (lhs == rhs and a % 2 == 1):
        a += 1
    if a == 10**digits:
        a, e = 10 ** (digits - 1), e + 1
    return a, e


def _int_text(n: int) -> str:
    """Decimal text of n >= 0 in chunks, so Python's 4300-digit str() limit never applies."""
    chunks = []
    while n >= 10**1000:
        n, r = divmod(n, 10**1000)
        chunks.append(str(r).zfill(1000))
    chunks.append(str(n))
    return "".join(reversed(chunks))


def _parse(text: str) -> tuple[int, str, int, bool]:
    """(sign, significant digits, decimal exponent of the first digit, scientific?)."""
    m = _TEXT.match(text)
    assert m, f"not a decimal text: {text!r}"
    minus, whole, frac, esign, eabs = m.groups()
    frac = frac or ""
    sign = -1 if minus else 1
    if eabs is not None:
        assert len(whole) == 1 and whole != "0", text
        exp = int(eabs) * (-1 if esign == "-" else 1)
        return sign, whole + frac, exp, True
    if whole == "0":
        stripped = frac.lstrip("0")
        return sign, stripped, -(len(frac) - len(stripped)) - 1, False
    assert not whole.startswith("0"), text
    return sign, whole + frac, len(whole) - 1, False


def _check(sign: int, p: int, q: int, digits: int) -> str:
    """Assert that Surd(sign, p, q).decimal(digits) is the correctly rounded text."""
    s = Surd(sign, p, q)
    text = s.decimal(digits)
    tsign, mantissa, exp, scientific = _parse(text)
    a, e = _exact_digits(s.p, s.q, digits)
    assert tsign == s.sign, (s, digits, text)
    assert len(mantissa) == digits, (s, digits, text)
    assert (mantissa, exp) == (_int_text(a), e), (s, digits, text, a, e)
    # tablegen's notation rule
    assert scientific == (e < -6 or e >= digits), (s, digits, text)
    return text


def _decimal_module(p: int, q: int, digits: int) -> str:
    """sqrt(p/q) to `digits` significant digits by the decimal module (q | 10**k)."""
    exact = decimal.Context(prec=len(str(p)) + len(str(q)) + 50, traps=[decimal.Inexact])
    x = exact.divide(decimal.Decimal(p), decimal.Decimal(q))  # exact, else Inexact is raised
    return x.sqrt(decimal.Context(prec=digits, rounding=decimal.ROUND_HALF_EVEN))


# ---------------------------------------------------------------------------
# random values, compared with the exact integer reference
# ---------------------------------------------------------------------------
def test_random_values_all_digit_counts():
    rng = random.Random(20240)
    for i in range(3000):
        digits = 1 + i % 60
        size = rng.choice((10, 10**3, 10**8, 10**30))
        p, q = rng.randint(1, size), rng.randint(1, rng.choice((10, 10**3, 10**8, 10**30)))
        _check(rng.choice((-1, 1)), p, q, digits)


def test_random_values_against_decimal_module():
    # q = 2**a * 5**b makes p/q an exact decimal, so the decimal module's
    # correctly rounded sqrt is an independent reference
    rng = random.Random(77)
    for i in range(1500):
        digits = 1 + i % 60
        p = rng.randint(1, 10 ** rng.randint(1, 25))
        q = 2 ** rng.randint(0, 40) * 5 ** rng.randint(0, 40)
        s = Surd(1, p, q)
        expected = _decimal_module(s.p, s.q, digits)
        text = _check(1, p, q, digits)
        assert decimal.Decimal(text) == expected, (s, digits, text, expected)
        assert _check(-1, p, q, digits) == "-" + text


# ---------------------------------------------------------------------------
# values at and near rounding boundaries
# ---------------------------------------------------------------------------
def _tie(a: int, s: int) -> Fraction:
    """The midpoint (a + 1/2) * 10**-s between two neighbouring outputs."""
    return Fraction(2 * a + 1, 2) / Fraction(10) ** s


def test_near_ties_irrational():
    # p/q = T**2 * (1 +- 10**-K): sqrt(p/q) lies a relative ~10**-K/2 above or
    # below the midpoint T, far closer than any fixed working precision
    rng = random.Random(31)
    for i in range(1200):
        digits = 1 + i % 60
        a = rng.randint(10 ** (digits - 1), 10**digits - 2)
        s = rng.randint(-8, 12) + digits - 1  # puts the value's exponent in -12..8
        t2 = _tie(a, s) ** 2
        k = digits + rng.randint(5, 60)
        for above in (False, True):
            x = t2 * (1 + Fraction(1 if above else -1, 10**k))
            e = digits - 1 - s
            text = _check(1, x.numerator, x.denominator, digits)
            _, mantissa, exp, _ = _parse(text)
            # by construction: below the midpoint rounds down, above rounds up
            assert (int(mantissa), exp) == ((a + 1, e) if above else (a, e)), (a, s, k, above, text)


def test_near_ties_rational():
    # sqrt(p/q) = T +- 10**-(s + K) exactly: a rational square root next to the midpoint
    rng = random.Random(32)
    for i in range(600):
        digits = 1 + i % 40
        a = rng.randint(10 ** (digits - 1), 10**digits - 2)
        s = rng.randint(-5, 10) + digits - 1
        k = rng.randint(1, 40)
        for above in (False, True):
            v = _tie(a, s) + Fraction(1 if above else -1, 10 ** (s + k + 1))
            x = v * v
            text = _check(1, x.numerator, x.denominator, digits)
            assert int(_parse(text)[1]) == (a + 1 if above else a), (a, s, k, text)


def test_exact_ties_round_half_to_even():
    # sqrt(p/q) exactly a midpoint: round half to even (IEEE 754-2008 §4.3.1)
    rng = random.Random(33)
    for i in range(800):
        digits = 1 + i % 50
        a = rng.randint(10 ** (digits - 1), 10**digits - 2)
        s = rng.randint(-5, 10) + digits - 1
        x = _tie(a, s) ** 2
        for sign in (1, -1):
            text = _check(sign, x.numerator, x.denominator, digits)
            assert int(_parse(text)[1]) == (a if a % 2 == 0 else a + 1)


@pytest.mark.parametrize(
    "square, digits, text",
    [
        # half-even on exact ties (IEEE 754-2008 §4.3.1)
        (Fraction(1, 16), 1, "0.2"),  # sqrt = 0.25
        (Fraction(49, 400), 1, "0.4"),  # sqrt = 0.35
        (Fraction(25, 4), 1, "2"),  # sqrt = 2.5
        (Fraction(49, 4), 1, "4"),  # sqrt = 3.5
        (Fraction(625, 4), 2, "12"),  # sqrt = 12.5
        (Fraction(729, 4), 2, "14"),  # sqrt = 13.5
        (Fraction(1, 4), 1, "0.5"),  # exact, no rounding at all
        # sqrt(2) = 1.41421356237... (common practice, no source)
        (Fraction(2), 1, "1"),
        (Fraction(2), 5, "1.4142"),
        (Fraction(2), 6, "1.41421"),
        # carry into the next power of ten
        (Fraction(99999999, 10**6), 3, "10.0"),  # sqrt = 9.99999995...
        (Fraction(99999999, 10**8), 4, "1.000"),
    ],
)
def test_examples(square, digits, text):
    assert Surd.from_square(square).decimal(digits) == text
    assert Surd.from_square(square, -1).decimal(digits) == "-" + text


def test_powers_of_ten_and_the_notation_switch():
    # exact powers of ten: the mantissa is 1 followed by zeros
    for k in range(-12, 13):
        for digits in (1, 2, 3, 7, 15):
            x = Fraction(10) ** (2 * k)
            text = _check(1, x.numerator, x.denominator, digits)
            _, mantissa, exp, scientific = _parse(text)
            assert mantissa == "1" + "0" * (digits - 1) and exp == k
            assert scientific == (k < -6 or k >= digits)
    assert Surd(1, 10**14, 1).decimal(3) == "1.00e+7"
    assert Surd(1, 10**12, 1).decimal(7) == "1000000"
    assert Surd(1, 1, 10**12).decimal(1) == "0.000001"
    assert Surd(1, 1, 10**14).decimal(2) == "1.0e-7"
    assert Surd(-1, 10**20, 1).decimal(1) == "-1e+10"


def test_values_just_below_and_above_powers_of_ten():
    for k in range(-10, 11):
        for digits in (1, 2, 5, 20):
            for delta in (-1, 1):
                x = Fraction(10) ** (2 * k) * (1 + Fraction(delta, 10**30))
                _check(1, x.numerator, x.denominator, digits)
                _check(-1, x.numerator, x.denominator, digits)


def test_many_digits_of_sqrt2_against_decimal_module():
    text = Surd(1, 2, 1).decimal(2000)
    expected = decimal.Decimal(2).sqrt(decimal.Context(prec=2000, rounding=decimal.ROUND_HALF_EVEN))
    assert text == str(expected)
    assert len(text) == 2001


def test_thousands_of_digits_exact():
    for sign, p, q, digits in ((-1, 5, 14, 3000), (1, 10**50 + 7, 3**41, 1500), (1, 1, 7, 4300)):
        _check(sign, p, q, digits)


@pytest.mark.parametrize("digits", [4301, 10_000])
def test_more_than_4300_digits(digits):
    _check(-1, 5, 14, digits)


def test_zero():
    assert Surd().decimal(1) == "0"
    assert Surd().decimal(40) == "0"


@pytest.mark.parametrize("digits", [0, -1, DECIMAL_MAX_DIGITS + 1, True, 1.0, "5", None])
def test_bad_digit_counts(digits):
    with pytest.raises(ValueError, match="digits") as info:
        Surd(1, 2, 1).decimal(digits)
    assert "\n" not in str(info.value)


def test_default_is_15_digits():
    assert Surd(1, 1, 3).decimal() == Surd(1, 1, 3).decimal(15) == "0.577350269189626"
