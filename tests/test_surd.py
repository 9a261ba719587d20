"""The exact value type Surd = sign * sqrt(p/q), checked against Fraction and sympy.

Fraction (the standard library) and sympy (a general-purpose computer algebra
system) serve as the outside references: every arithmetic result, text form
and LaTeX form is compared with the same number built independently there.
"""

from __future__ import annotations

import math
import pickle
import random
import re
from fractions import Fraction

import pytest
import sympy

from tablegen import Surd


def _random_surd(rng: random.Random, top: int = 600) -> Surd:
    return Surd(rng.choice((-1, 1)), rng.randint(1, top), rng.randint(1, top))


def _reference(s: Surd) -> sympy.Expr:
    """The same number built in sympy from the stored parts (canonical sympy form)."""
    return s.sign * sympy.sqrt(sympy.Rational(s.p, s.q))


# ---------------------------------------------------------------------------
# construction, reduction, zero
# ---------------------------------------------------------------------------
def test_construction_reduces_the_fraction():
    # reduction of p/q must not change the number: compared with Fraction (stdlib)
    rng = random.Random(11)
    for _ in range(2000):
        sign = rng.choice((-1, 1))
        p, q = rng.randint(1, 10**6), rng.randint(1, 10**6)
        s = Surd(sign, p, q)
        assert s.sign == sign
        assert math.gcd(s.p, s.q) == 1
        assert Fraction(s.p, s.q) == Fraction(p, q)


def test_construction_examples():
    s = Surd(-1, 10, 28)
    assert (s.sign, s.p, s.q) == (-1, 5, 14)
    assert repr(s) == "Surd(-1, 5, 14)"
    assert repr(Surd(1, 6, 8)) == "Surd(1, 3, 4)"


@pytest.mark.parametrize("args", [(), (0, 5, 3), (1, 0, 7), (-1, 0, 1), (0, 0, 1)])
def test_zero_is_canonical(args):
    z = Surd(*args)
    assert (z.sign, z.p, z.q) == (0, 0, 1)
    assert not z
    assert z == 0 and z == Fraction(0)
    assert hash(z) == hash(0)
    assert str(z) == "0"
    assert z.to_sympy() == 0
    assert z.squared() == 0


@pytest.mark.parametrize(
    "args, error",
    [
        ((2, 1, 1), ValueError),
        ((-2, 1, 1), ValueError),
        ((1, -1, 1), ValueError),
        ((1, 1, 0), ValueError),
        ((1, 1, -3), ValueError),
        ((1, 1.0, 1), TypeError),
        ((1, 1, 2.0), TypeError),
        ((True, 1, 1), TypeError),
        ((1, "2", 1), TypeError),
    ],
)
def test_construction_rejects_bad_parts(args, error):
    with pytest.raises(error):
        Surd(*args)


# ---------------------------------------------------------------------------
# immutability, hashing, equality with int and Fraction
# ---------------------------------------------------------------------------
@pytest.mark.parametrize("name", ["sign", "p", "q", "_sign", "_p", "_q", "extra"])
def test_immutable(name):
    s = Surd(1, 2, 3)
    with pytest.raises(AttributeError):
        setattr(s, name, 5)
    assert (s.sign, s.p, s.q) == (1, 2, 3)


def test_hashable_and_equal_when_built_differently():
    a, b = Surd(1, 2, 4), Surd(1, 7, 14)
    assert a == b and hash(a) == hash(b)
    assert len({a, b, Surd(1, 1, 2)}) == 1
    assert {a: "x"}[b] == "x"
    assert Surd(1, 1, 2) != Surd(-1, 1, 2)


def test_rational_values_equal_and_hash_like_fraction():
    # Python's numeric tower: x == y must imply hash(x) == hash(y)
    # (Python Language Reference, "object.__hash__"; common practice)
    two_thirds = Fraction(2, 3)
    a = Surd.from_rational(two_thirds)
    assert a == two_thirds and two_thirds == a
    assert hash(a) == hash(two_thirds)
    b = Surd(1, 4, 9)  # sqrt(4/9) = 2/3
    assert b == two_thirds and hash(b) == hash(two_thirds)
    assert a == b
    assert len({a, b, two_thirds}) == 1
    assert b.as_fraction() == two_thirds and b.is_rational()


def test_rational_values_equal_and_hash_like_int():
    for n in range(-30, 31):
        s = Surd.from_rational(n)
        assert s == n and n == s and hash(s) == hash(n)
        assert Surd(1 if n > 0 else -1 if n < 0 else 0, n * n, 1) == n
    assert Surd(1, 9, 1) == 3 and Surd(-1, 9, 1) == -3
    assert Surd(1, 36, 4) == 3 and hash(Surd(1, 36, 4)) == hash(3)


def test_rational_values_random_against_fraction():
    rng = random.Random(5)
    for _ in range(1000):
        f = Fraction(rng.randint(-10**6, 10**6), rng.randint(1, 10**6))
        s = Surd.from_rational(f)
        assert s == f and hash(s) == hash(f)
        assert s.squared() == f * f and s.sign == (f > 0) - (f < 0)
        assert Surd.from_square(f * f, s.sign) == s
        assert str(s) == str(f)


def test_equal_to_sympy_rational():
    assert Surd(1, 4, 9) == sympy.Rational(2, 3)
    assert Surd(-1, 1, 4) == sympy.Rational(-1, 2)
    assert Surd(1, 2, 1) != sympy.Integer(1)


def test_not_equal_to_any_rational_when_irrational():
    s = Surd(1, 2, 1)  # sqrt(2) is irrational (Euclid; common practice, no source)
    assert not s.is_rational()
    with pytest.raises(ValueError):
        s.as_fraction()
    # continued-fraction convergents of sqrt(2) get close but are never equal
    n, d = 1, 1
    for _ in range(30):
        assert s != Fraction(n, d) and Fraction(n, d) != s
        n, d = n + 2 * d, n + d
    assert s != 1 and s != 2 and Surd(1, 1, 2) != Fraction(1, 2)


def test_equality_with_unrelated_types_is_false():
    s = Surd(1, 1, 2)
    assert s != "sqrt(1/2)"
    assert s != None  # noqa: E711
    assert s != (1, 1, 2)


# ---------------------------------------------------------------------------
# arithmetic, checked against sympy
# ---------------------------------------------------------------------------
def test_unary_minus_abs_plus():
    rng = random.Random(3)
    for _ in range(300):
        s = _random_surd(rng)
        assert (-s).to_sympy() == -_reference(s)
        assert -(-s) == s
        assert abs(s).to_sympy() == abs(_reference(s))
        assert +s == s
    assert -Surd() == Surd()


def test_products_and_quotients_of_surds_match_sympy():
    rng = random.Random(7)
    for _ in range(400):
        a, b = _random_surd(rng), _random_surd(rng)
        ra, rb = _reference(a), _reference(b)
        assert (a * b).to_sympy() == ra * rb
        assert (a / b).to_sympy() == ra / rb
        assert (b / a).to_sympy() == rb / ra
        prod = a * b
        assert math.gcd(prod.p, prod.q) == 1  # stays canonical


def test_products_and_quotients_with_ints_and_fractions_match_sympy():
    rng = random.Random(8)
    for _ in range(250):
        a = _random_surd(rng)
        ra = _reference(a)
        n = rng.choice([i for i in range(-12, 13) if i])
        f = Fraction(rng.randint(-50, 50) or 1, rng.randint(1, 50))
        rf = sympy.Rational(f.numerator, f.denominator)
        assert (a * n).to_sympy() == ra * n
        assert (n * a).to_sympy() == ra * n
        assert (a / n).to_sympy() == ra / n
        assert (n / a).to_sympy() == n / ra
        assert (a * f).to_sympy() == ra * rf
        assert (f * a).to_sympy() == ra * rf
        assert (a / f).to_sympy() == ra / rf
        assert (f / a).to_sympy() == rf / ra
        assert isinstance(f * a, Surd) and isinstance(n / a, Surd)


def test_multiplying_by_zero_and_dividing_by_zero():
    a = Surd(-1, 5, 14)
    assert a * 0 == 0 and (a * Surd()).sign == 0
    assert 0 * a == 0
    with pytest.raises(ZeroDivisionError):
        a / Surd()
    with pytest.raises(ZeroDivisionError):
        a / 0
    with pytest.raises(ZeroDivisionError):
        1 / Surd()


def test_powers_match_sympy():
    rng = random.Random(9)
    for _ in range(300):
        a = _random_surd(rng, 60)
        for n in (-3, -2, -1, 0, 1, 2, 5):
            assert (a**n).to_sympy() == _reference(a) ** n


def test_unsupported_operand_types():
    a = Surd(1, 2, 3)
    with pytest.raises(TypeError):
        a * 1.5
    with pytest.raises(TypeError):
        a / "2"
    with pytest.raises(TypeError):
        a < "0.5"  # noqa: B015


def test_squared_is_the_true_square_and_the_sign_is_apart():
    assert Surd(-1, 5, 14).squared() == Fraction(5, 14) and Surd(-1, 5, 14).sign == -1
    assert Surd().squared() == 0 and Surd().sign == 0
    rng = random.Random(10)
    for _ in range(500):
        a = _random_surd(rng)
        r = _reference(a)  # sympy's own number, the outside reference
        sq = a.squared()
        assert isinstance(sq, Fraction) and sq >= 0
        assert sympy.Rational(sq.numerator, sq.denominator) == r**2
        assert a.sign == sympy.sign(r)
        assert Surd.from_square(sq, a.sign) == a


def test_float_is_the_nearest_double():
    # compared with sympy's evaluation at 60 digits, then rounded to a double
    rng = random.Random(12)
    for _ in range(500):
        a = _random_surd(rng, 10**9)
        expected = float(_reference(a).evalf(60))
        got = float(a)
        assert isinstance(got, float)
        assert abs(got - expected) <= math.ulp(expected) / 2 * 1.0000001
    assert float(Surd(1, 1, 4)) == 0.5
    assert float(Surd(-1, 9, 1)) == -3.0
    assert float(Surd()) == 0.0


def test_ordering_matches_sympy():
    rng = random.Random(13)
    values = list({_random_surd(rng, 40) for _ in range(200)} | {Surd(), Surd(1, 1, 1), Surd(-1, 1, 1)})
    by_surd = sorted(values)
    by_reference = sorted(values, key=lambda s: _reference(s).evalf(50))
    assert by_surd == by_reference
    for x, y in zip(by_surd, by_surd[1:]):
        assert x < y and x <= y and y > x and y >= x and not x > y


def test_ordering_against_int_and_fraction():
    s = Surd(1, 2, 1)  # 1.41421...
    assert 1 < s < 2 and s > Fraction(7, 5) and s < Fraction(3, 2)
    assert -s < -1 and -s > -2 and -s <= Fraction(-7, 5)
    assert Surd(1, 4, 9) <= Fraction(2, 3) and Surd(1, 4, 9) >= Fraction(2, 3)
    assert Surd(-1, 1, 4) < 0 < Surd(1, 1, 10**12)


# ---------------------------------------------------------------------------
# pickling, text forms, sympy
# ---------------------------------------------------------------------------
@pytest.mark.parametrize("protocol", range(pickle.HIGHEST_PROTOCOL + 1))
def test_pickle_round_trip(protocol):
    for s in (Surd(), Surd(-1, 5, 14), Surd(1, 4, 9), Surd(1, 10**40 + 1, 3**50)):
        back = pickle.loads(pickle.dumps(s, protocol=protocol))
        assert type(back) is Surd
        assert back == s and hash(back) == hash(s) and repr(back) == repr(s)


@pytest.mark.parametrize(
    "s, text",
    [
        (Surd(-1, 5, 14), "-sqrt(5/14)"),
        (Surd(1, 1, 3), "sqrt(1/3)"),
        (Surd(1, 2, 1), "sqrt(2)"),
        (Surd(1, 4, 9), "2/3"),
        (Surd(-1, 9, 1), "-3"),
        (Surd(1, 1, 1), "1"),
        (Surd(), "0"),
    ],
)
def test_str_examples(s, text):
    assert str(s) == text


def test_str_is_read_back_by_sympy_as_the_same_number():
    rng = random.Random(14)
    for _ in range(600):
        s = _random_surd(rng, 10**7)
        assert sympy.sympify(str(s)) == _reference(s)
    for s in (Surd(1, 49, 64), Surd(-1, 10**30, 1), Surd(1, 2, 10**30)):
        assert sympy.sympify(str(s)) == _reference(s)


def test_to_sympy():
    assert Surd(-1, 5, 14).to_sympy() == -sympy.sqrt(70) / 14
    assert Surd(1, 4, 9).to_sympy() == sympy.Rational(2, 3)
    rng = random.Random(15)
    for _ in range(300):
        s = _random_surd(rng)
        r = s.to_sympy()
        assert r == _reference(s)
        assert r**2 == sympy.Rational(s.squared().numerator, s.squared().denominator)


# ---------------------------------------------------------------------------
# LaTeX
# ---------------------------------------------------------------------------
class _LatexReader:
    """Reads the small LaTeX subset Surd.latex writes into a sympy number.

    Grammar: value := ['-'] atom ; atom := '\\left(' value '\\right)' | '(' value ')'
    | '\\frac{' value '}{' value '}' | digits '/' digits | [digits] ['\\sqrt{' value '}'].
    """

    def __init__(self, text: str) -> None:
        self.text, self.i = text, 0

    def read(self) -> sympy.Expr:
        value = self._value()
        assert self.i == len(self.text), f"trailing text in {self.text!r}"
        return value

    def _eat(self, token: str) -> bool:
        if self.text.startswith(token, self.i):
            self.i += len(token)
            return True
        return False

    def _value(self) -> sympy.Expr:
        if self._eat("-"):
            return -self._atom()
        return self._atom()

    def _atom(self) -> sympy.Expr:
        if self._eat("\\left("):
            v = self._value()
            assert self._eat("\\right)")
            return v
        if self._eat("("):
            v = self._value()
            assert self._eat(")")
            return v
        if self._eat("\\frac{"):
            num = self._value()
            assert self._eat("}{")
            den = self._value()
            assert self._eat("}")
            return num / den
        m = re.compile(r"\d+").match(self.text, self.i)
        factor = sympy.Integer(1)
        if m:
            factor = sympy.Integer(m.group())
            self.i = m.end()
            if self._eat("/"):
                d = re.compile(r"\d+").match(self.text, self.i)
                assert d, f"slash without a denominator in {self.text!r}"
                self.i = d.end()
                return factor / sympy.Integer(d.group())
        if self._eat("\\sqrt{"):
            inner = self._value()
            assert self._eat("}")
            return factor * sympy.sqrt(inner)
        assert m, f"unexpected text at {self.i} in {self.text!r}"
        return factor


def _read_latex(text: str) -> sympy.Expr:
    return _LatexReader(text).read()


@pytest.mark.parametrize(
    "s, root, rational",
    [
        (Surd(-1, 5, 14), "-\\sqrt{\\frac{5}{14}}", "-\\frac{\\sqrt{70}}{14}"),
        (Surd(1, 1, 3), "\\sqrt{\\frac{1}{3}}", "\\frac{\\sqrt{3}}{3}"),
        (Surd(1, 2, 1), "\\sqrt{2}", "\\sqrt{2}"),
        (Surd(1, 8, 1), "\\sqrt{8}", "2\\sqrt{2}"),
        (Surd(1, 1, 1), "1", "1"),
        (Surd(-1, 1, 4), "-\\frac{1}{2}", "-\\frac{1}{2}"),
        (Surd(1, 4, 9), "\\frac{2}{3}", "\\frac{2}{3}"),
        (Surd(), "0", "0"),
    ],
)
def test_latex_examples(s, root, rational):
    assert s.latex() == root
    assert s.latex("root") == root
    assert s.latex("rational") == rational


@pytest.mark.parametrize(
    "s, style, wrapped",
    [
        (Surd(-1, 5, 14), "root", "\\left(-\\sqrt{\\frac{5}{14}}\\right)"),
        (Surd(-1, 5, 14), "rational", "\\left(-\\frac{\\sqrt{70}}{14}\\right)"),
        (Surd(1, 1, 4), "root", "\\left(\\frac{1}{2}\\right)"),
        (Surd(1, 1, 3), "rational", "\\left(\\frac{\\sqrt{3}}{3}\\right)"),
        (Surd(-1, 1, 1), "root", "\\left(-1\\right)"),
        # positive integers and plain roots can be raised to a power as they are
        (Surd(1, 9, 1), "root", "3"),
        (Surd(1, 2, 1), "root", "\\sqrt{2}"),
        (Surd(1, 8, 1), "rational", "2\\sqrt{2}"),
        (Surd(), "root", "0"),
    ],
)
def test_latex_wrap(s, style, wrapped):
    assert s.latex(style, wrap=True) == wrapped


@pytest.mark.parametrize(
    "s, inline",
    [
        (Surd(-1, 5, 14), "-\\sqrt{5/14}"),
        (Surd(1, 1, 3), "\\sqrt{1/3}"),
        (Surd(1, 8, 1), "\\sqrt{8}"),
        (Surd(1, 4, 9), "2/3"),
        (Surd(-1, 9, 1), "-3"),
        (Surd(), "0"),
    ],
)
def test_latex_inline_style_has_no_built_up_fractions(s, inline):
    # running text: a root over a slashed fraction keeps the line height (common practice, no source)
    assert s.latex("inline") == inline
    assert "\\frac" not in s.latex("inline", wrap=True)


def test_latex_rejects_unknown_style():
    with pytest.raises(ValueError, match="style"):
        Surd(1, 1, 2).latex("fancy")


def test_latex_every_style_reads_back_as_the_same_number():
    rng = random.Random(16)
    for _ in range(600):
        s = _random_surd(rng, rng.choice((50, 5000, 10**9)))
        expected = _reference(s)
        for style in ("root", "rational", "inline"):
            for wrap in (False, True):
                assert _read_latex(s.latex(style, wrap)) == expected, (s, style, wrap)


def test_latex_rational_style_is_rationalised():
    # "rationalised": integer denominator, square-free radicand, lowest terms
    # (common practice, no source)
    pattern = re.compile(r"^-?(?:\\frac\{(\d*)\\sqrt\{(\d+)\}\}\{(\d+)\}|(\d*)\\sqrt\{(\d+)\})$")
    rng = random.Random(17)
    for _ in range(800):
        s = _random_surd(rng, 10**6)
        if s.is_rational():
            continue
        m = pattern.match(s.latex("rational"))
        assert m, s.latex("rational")
        coeff = m.group(1) if m.group(3) else m.group(4)
        radicand = int(m.group(2) or m.group(5))
        den = int(m.group(3) or 1)
        a = int(coeff) if coeff else 1
        assert radicand > 1 and all(e == 1 for e in sympy.factorint(radicand).values())
        assert math.gcd(a, den) == 1
        assert Fraction(a * a * radicand, den * den) == Fraction(s.p, s.q)


# ---------------------------------------------------------------------------
# prime exponents (the factorisation as data)
# ---------------------------------------------------------------------------
def test_prime_exponents_multiply_back():
    rng = random.Random(18)
    for _ in range(800):
        s = _random_surd(rng, 10**8)
        exps = s.prime_exponents()
        items = list(exps.items())
        primes = [pr for pr, _ in items]
        assert primes == sorted(set(primes))
        assert all(sympy.isprime(pr) and e != 0 for pr, e in items)
        value = Fraction(1)
        for pr, e in items:
            value *= Fraction(pr) ** e
        assert value == Fraction(s.p, s.q)
        # the same exponents as sympy's factorisation of p and q
        expected = dict(sympy.factorint(s.p))
        for pr, e in sympy.factorint(s.q).items():
            expected[pr] = expected.get(pr, 0) - e
        assert exps == {int(k): v for k, v in expected.items() if v}


def test_prime_exponents_examples():
    # -sqrt(5/14) = -sqrt(2**-1 * 5 * 7**-1), worked by hand
    assert Surd(-1, 5, 14).prime_exponents() == {2: -1, 5: 1, 7: -1}
    assert list(Surd(1, 5 * 3, 2 * 7).prime_exponents()) == [2, 3, 5, 7]  # primes ascending
    assert Surd(1, 1, 1).prime_exponents() == {}
    assert Surd().prime_exponents() == {}


def test_no_bracketed_prime_display():
    # the factorisation is data only: no method renders it as text
    assert not hasattr(Surd, "prime_form")
