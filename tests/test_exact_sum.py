"""ExactSum, phase() and exact ordering against floats.

Outside references: sympy (exact arithmetic, as a reference only), mpmath at
high precision (only here, as the reference for rounding), the orthogonality
of CG coefficients (Condon & Shortley 1935, section 3.6; Edmonds 1957,
eq. 3.5.4) and the linear independence of square roots of distinct
square-free integers over the rationals (Besicovitch 1940), which is what
makes the canonical form unique.
"""

from __future__ import annotations

import pickle
import random
import subprocess
import sys
from decimal import Decimal
from fractions import Fraction
from pathlib import Path

import mpmath
import pytest
import sympy

from tablegen import ExactSum, Surd, cg, phase
from tablegen.kinds.threej import cg2

_SQUARE_FREE = [1, 2, 3, 5, 6, 7, 10, 11, 13, 14, 15, 17, 19, 21, 22, 23, 26, 29, 30, 31]


def _random_sum(rng: random.Random, terms: int = 3) -> ExactSum:
    pairs = [(rng.choice(_SQUARE_FREE) * rng.choice((1, 4, 9)), Fraction(rng.randrange(-40, 41), rng.randrange(1, 30)))
             for _ in range(terms)]
    return ExactSum(pairs)


def _reference(s: ExactSum):
    return sympy.Add(*(sympy.Rational(c.numerator, c.denominator) * sympy.sqrt(r) for r, c in s.terms))


def test_canonical_form_sorted_square_free_and_without_zero_terms():
    s = ExactSum([(8, 1), (3, Fraction(1, 2)), (2, -2), (12, 1), (1, 0), (0, 5)])
    # sqrt(8) = 2 sqrt(2) cancels -2 sqrt(2); sqrt(12) = 2 sqrt(3)
    assert s.terms == ((3, Fraction(5, 2)),)
    assert ExactSum([(50, 1), (2, 1)]) == ExactSum([(2, 6)])
    t = ExactSum([(7, 1), (2, 3), (1, Fraction(-1, 3))])
    assert [r for r, _ in t.terms] == [1, 2, 7]
    assert ExactSum() == 0 and not ExactSum() and ExactSum().terms == ()


def test_canonical_form_agrees_with_sympy():
    rng = random.Random(1)
    for _ in range(200):
        a, b = _random_sum(rng), _random_sum(rng, 2)
        for got, ref in ((a, _reference(a)), (a + b, _reference(a) + _reference(b)),
                         (a - b, _reference(a) - _reference(b)), (a * b, _reference(a) * _reference(b)),
                         (-a, -_reference(a))):
            assert sympy.expand(got.to_sympy() - ref) == 0
            # str is read back by sympy as the same number
            assert sympy.expand(sympy.sympify(str(got)) - ref) == 0, str(got)
            # equal sums have equal terms (Besicovitch 1940: the form is unique)
            assert (got == ExactSum(list(got.terms))) and hash(got) == hash(ExactSum(list(got.terms)))


def test_surd_plus_surd_is_an_exact_sum_equal_to_its_surd():
    a, b = Surd(1, 1, 2), Surd(1, 1, 3)
    s = a + b
    assert type(s) is ExactSum and s.terms == ((2, Fraction(1, 2)), (3, Fraction(1, 3)))
    assert type(a + a) is ExactSum and a + a == Surd(1, 2, 1) and hash(a + a) == hash(Surd(1, 2, 1))
    assert (a + a).as_surd() == Surd(1, 2, 1)
    assert a - a == 0 and hash(a - a) == hash(0)
    assert Surd(1, 1, 4) + Fraction(1, 2) == 1 and hash(Surd(1, 1, 4) + Fraction(1, 2)) == hash(1)
    assert Surd(1, 1, 4) + Surd(1, 1, 36) == Fraction(2, 3) and hash(Surd(1, 1, 4) + Surd(1, 1, 36)) == hash(Fraction(2, 3))
    assert 1 - Surd(1, 1, 1) == 0 and sum([a, b, -a]) == b
    with pytest.raises(ValueError):
        s.as_surd()
    with pytest.raises(TypeError):
        a + 1.5
    with pytest.raises(TypeError):
        s + "1"


def test_products_differences_division_and_powers_stay_exact():
    r2, r3 = Surd(1, 2, 1), Surd(1, 3, 1)
    assert (r2 + r3) * (r2 - r3) == -1  # (a+b)(a-b) = a^2 - b^2
    assert (r2 + r3) ** 2 == 5 + 2 * Surd(1, 6, 1)
    assert (r2 + r3) * r2 == 2 + Surd(1, 6, 1)
    assert r2 * (r2 + r3) == (r2 + r3) * r2
    assert (r2 + r3) / r2 == 1 + Surd(1, 3, 2)
    assert (r2 + r3) / 2 == r2 * Fraction(1, 2) + r3 * Fraction(1, 2)
    with pytest.raises(ZeroDivisionError):
        (r2 + r3) / ExactSum()
    with pytest.raises(TypeError):
        1 / (r2 + r3)
    with pytest.raises(TypeError):
        (r2 + r3) / (r2 + r3)
    assert pickle.loads(pickle.dumps(r2 + r3)) == r2 + r3
    assert eval(repr(r2 + r3), {"ExactSum": ExactSum, "Fraction": Fraction}) == r2 + r3


def test_cg_matrix_is_orthogonal_with_exact_sums():
    # sum_{m1,m2} <j1 m1 j2 m2|J M><j1 m1 j2 m2|J' M'> = delta_JJ' delta_MM' and the
    # transposed relation (Condon & Shortley 1935, section 3.6; Edmonds 1957, eq. 3.5.4):
    # the CG matrix C (rows (m1, m2), columns (J, M)) has C^T C = C C^T = 1.
    for tj1, tj2 in ((1, 1), (2, 1), (2, 2), (3, 2), (4, 3)):
        rows = [(m1, m2) for m1 in range(-tj1, tj1 + 1, 2) for m2 in range(-tj2, tj2 + 1, 2)]
        cols = [(J, M) for J in range(abs(tj1 - tj2), tj1 + tj2 + 1, 2) for M in range(-J, J + 1, 2)]
        assert len(rows) == len(cols)
        c = [[cg2(tj1, m1, tj2, m2, J, M) for (J, M) in cols] for (m1, m2) in rows]
        n = len(rows)
        for i in range(n):
            for k in range(n):
                ctc = sum((c[r][i] * c[r][k] for r in range(n)), ExactSum())
                cct = sum((c[i][r] * c[k][r] for r in range(n)), ExactSum())
                assert ctc == (i == k) and cct == (i == k), (tj1, tj2, i, k)


def test_a_non_trivial_sum_of_square_roots_is_never_zero():
    # Besicovitch 1940: square roots of distinct square-free integers are linearly
    # independent over Q, so a sum with a non-zero term is non-zero; its sign is
    # decided exactly and agrees with a 60-digit evaluation.
    rng = random.Random(2)
    with mpmath.workdps(60):
        for _ in range(300):
            s = _random_sum(rng, rng.randrange(1, 6))
            ref = sum(mpmath.mpf(c.numerator) / c.denominator * mpmath.sqrt(r) for r, c in s.terms)
            assert bool(s) == bool(s.terms)
            assert s.sign() == (0 if not s.terms else (1 if ref > 0 else -1))
            assert (s > 0) == (ref > 0) and (s < 0) == (ref < 0)
    # a near-cancellation: sqrt(10**12 + 1) - 10**6 = 1/(sqrt(10**12 + 1) + 10**6), just below 5e-7
    tiny = ExactSum([(10**12 + 1, 1), (1, -(10**6))])
    assert tiny.sign() == 1 and Fraction(4, 10**7) < tiny < Fraction(5, 10**7)


def _reference_decimal(s, digits: int) -> Decimal:
    """The correctly rounded (half-even) value from a 'digits + 60' digit mpmath evaluation."""
    with mpmath.workdps(digits + 60):
        v = sum(mpmath.mpf(c.numerator) / c.denominator * mpmath.sqrt(r) for r, c in s.terms)
        e10 = int(mpmath.floor(mpmath.log10(abs(v))))
        a = int(mpmath.nint(abs(v) * mpmath.mpf(10) ** (digits - 1 - e10)))
    if a == 10**digits:
        a, e10 = 10 ** (digits - 1), e10 + 1
    return Decimal((0 if v > 0 else 1, tuple(int(x) for x in str(a)), e10 - digits + 1))


def test_decimal_is_correctly_rounded():
    rng = random.Random(3)
    for _ in range(150):
        s = _random_sum(rng, rng.randrange(2, 5))
        if not s:
            continue
        for digits in (1, 2, 15, 40):
            assert Decimal(s.decimal(digits)) == _reference_decimal(s, digits), (s, digits)
    tiny = ExactSum([(10001, 1), (1, -100)])  # about 0.005, much smaller than its terms
    assert Decimal(tiny.decimal(30)) == _reference_decimal(tiny, 30)
    assert ExactSum([(2, 1), (3, 1)]).decimal(20) == "3.1462643699419723423"  # sqrt2+sqrt3 (mpmath, 30 digits)
    assert (Surd(1, 1, 4) + Fraction(1, 4)).decimal(3) == "0.750"
    with pytest.raises(ValueError):
        ExactSum([(2, 1)]).decimal(0)


def test_float_is_the_nearest_float():
    rng = random.Random(4)
    with mpmath.workprec(300):
        for _ in range(300):
            s = _random_sum(rng, rng.randrange(1, 5))
            ref = sum(mpmath.mpf(c.numerator) / c.denominator * mpmath.sqrt(r) for r, c in s.terms)
            assert float(s) == float(ref), s
        for _ in range(300):
            x = Surd(rng.choice((-1, 1)), rng.randrange(1, 10**40), rng.randrange(1, 10**40))
            assert float(x) == float(x.sign * mpmath.sqrt(mpmath.mpf(x.p) / x.q)), x


def test_ordering_against_floats_agrees_with_equality():
    half = Surd(1, 1, 2)  # sqrt(1/2) = 0.70710678118654752440...
    nearest = float(half)  # 0.70710678118654757... (the nearest double lies above)
    assert nearest == 0.7071067811865476 and half != nearest
    assert half < nearest and half <= nearest and not half > nearest and nearest > half
    assert Surd(1, 1, 4) == 0.5 and Surd(1, 1, 4) <= 0.5 and Surd(1, 1, 4) >= 0.5 and not Surd(1, 1, 4) < 0.5
    assert Surd(-1, 1, 4) < -0.4999999999999999 and Surd(-1, 1, 4) > -0.5000000000000001
    nan, inf = float("nan"), float("inf")
    assert not (half < nan or half > nan or half == nan or half <= nan)
    assert half < inf and half > -inf
    s = half + half  # sqrt(2) = 1.41421356237309504880...
    assert s < 1.4142135623730951 and s > 1.414213562373095 and s != 1.4142135623730951
    assert (Surd(1, 1, 4) + Surd(1, 1, 4)) == 1.0 and (Surd(1, 1, 4) + Surd(1, 1, 4)) <= 1.0
    assert not (s < nan or s >= nan) and s < inf and -inf < s
    rng = random.Random(5)
    for _ in range(200):
        x = Surd(rng.choice((-1, 1)), rng.randrange(1, 50), rng.randrange(1, 50))
        f = rng.choice((float(x), float(rng.randrange(-8, 9)) / 4))
        exact = Fraction(f)
        # sign * square is strictly increasing in the value (common practice, no source)
        assert (x < f) == (x.sign * x.squared() < exact * abs(exact))
        assert (x == f) == (x.sign * x.squared() == exact * abs(exact))


def test_phase_is_an_int_for_integers_and_refuses_the_rest():
    # (-1)**x for integer x (common practice, no source)
    assert phase(0) == 1 and phase(3) == -1 and phase(-3) == -1 and phase(10**30 + 1) == -1
    assert phase(Fraction(4, 2)) == 1 and phase(Fraction(-6, 2)) == -1
    assert phase("3") == -1 and phase("-4/2") == 1 and phase(" 2.0 ") == 1 and phase(2.0) == 1
    assert phase(sympy.Integer(5)) == -1 and phase(sympy.Rational(8, 2)) == 1
    l, lp = Fraction(5, 1), Fraction(2, 1)
    assert type(phase(l - lp)) is int and phase(l - lp) == -1
    assert type(phase(l - lp) * cg(1, 1, 1, -1, 0, 0)) is Surd
    for bad in (Fraction(1, 2), "1/2", 0.5, "x", True, None, 1 + 0j):
        with pytest.raises(ValueError, match="argument x = .*needs an integer x"):
            phase(bad)


def test_latex_of_a_sum():
    s = Surd(1, 1, 2) - Surd(1, 1, 3) + 1
    assert s.latex("rational") == "1 + \\frac{\\sqrt{2}}{2} - \\frac{\\sqrt{3}}{3}"
    assert s.latex("root") == "1 + \\sqrt{\\frac{1}{2}} - \\sqrt{\\frac{1}{3}}"
    assert s.latex("root", wrap=True).startswith("\\left(")
    assert ExactSum().latex() == "0"
    with pytest.raises(ValueError, match="argument style"):
        s.latex("fancy")


def test_decimals_and_floats_need_no_mpmath():
    code = (
        "import sys, tablegen\n"
        "a = tablegen.Surd(1, 2, 3); b = tablegen.cg(1, 1, 1, -1, 0, 0)\n"
        "a.decimal(60); float(a); s = a + b; s.decimal(60); float(s); s < 0.5\n"
        "assert 'mpmath' not in sys.modules and 'sympy' not in sys.modules, sorted(sys.modules)\n"
    )
    root = Path(__file__).resolve().parent.parent
    subprocess.run([sys.executable, "-c", code], check=True, cwd=root, env={"PYTHONPATH": str(root), "PATH": "/usr/bin:/bin"})
