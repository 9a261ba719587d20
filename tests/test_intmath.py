"""The integer kernels against outside references: math.factorial, sympy's
factorint, isprime and primerange (general-purpose library functions).
"""

from __future__ import annotations

import math
import random
import sys
from fractions import Fraction

import pytest
import sympy

from tablegen import intmath


def test_factorial_and_table_match_math_factorial():
    for n in (0, 1, 2, 5, 17, 100, 523):
        assert intmath.factorial(n) == math.factorial(n)
    table = intmath.factorials_upto(700)
    assert len(table) > 700
    assert all(table[k] == math.factorial(k) for k in range(701))
    # the table only grows: asking for less returns the same, longer list
    assert intmath.factorials_upto(3) is table


def test_primes_upto_matches_sympy():
    for n in (0, 1, 2, 3, 10, 97, 100, 1000, 5000, 4999, 30):  # grows, then asks below the sieve limit
        assert intmath.primes_upto(n) == list(sympy.primerange(2, n + 1)), n


def test_factorial_exponent_is_legendre():
    # Legendre's formula against the factorisation of n! itself (sympy.factorint)
    for n in (1, 10, 57, 200):
        for p, e in sympy.factorint(math.factorial(n)).items():
            assert intmath.factorial_exponent(n, int(p)) == e


def test_prime_exponents_match_factorint():
    rng = random.Random(3)
    values = [1, 2, 360, 2**61 - 1, 10007 * 10009, (10007 * 10009) ** 2, math.factorial(30)]
    values += [rng.randrange(1, 10**12) for _ in range(50)]
    for n in values:
        assert intmath.prime_exponents(n) == {int(p): int(e) for p, e in sympy.factorint(n).items()}, n
    with pytest.raises(ValueError):
        intmath.prime_exponents(0)


def test_split_square_gives_the_square_free_part():
    rng = random.Random(4)
    values = [1, 2, 4, 12, 72, 10007**3, (2**61 - 1) * 9, 10007 * 10009 * 49]
    values += [rng.randrange(1, 10**15) for _ in range(60)]
    for n in values:
        a, b = intmath.split_square(n)
        assert a * a * b == n
        assert all(e == 1 for e in sympy.factorint(b).values()), (n, b)  # b square-free


def test_is_probable_prime_matches_isprime():
    rng = random.Random(5)
    values = list(range(0, 2000)) + [2**61 - 1, 2**89 - 1, 10007 * 10009, 561, 1105, 3215031751]
    values += [rng.randrange(1, 10**20) for _ in range(300)]
    for n in values:
        assert intmath.is_probable_prime(n) == sympy.isprime(n), n


def _reference_square(num, once_up, once_down, twice_up, twice_down) -> Fraction:
    f = math.factorial
    value = Fraction(num)
    for k in twice_up:
        value *= f(k)
    for k in twice_down:
        value /= f(k)
    value *= value
    for k in once_up:
        value *= f(k)
    for k in once_down:
        value /= f(k)
    return value


def test_reduce_square_matches_fractions():
    rng = random.Random(6)
    for _ in range(40):
        top = rng.choice((10, 50, 450, 900))
        args = [[rng.randrange(0, top) for _ in range(rng.randrange(0, 5))] for _ in range(4)]
        num = rng.choice((1, -1)) * rng.randrange(1, 10**30)
        p, q = intmath.reduce_square(num, *args)
        expected = _reference_square(num, *args)
        assert Fraction(p, q) == expected
        assert math.gcd(p, q) == 1


def test_int_text_beyond_the_str_limit():
    n = 7**20000 + 12345  # about 16,900 digits, above CPython's default 4300-digit str() limit
    old = sys.get_int_max_str_digits()
    sys.set_int_max_str_digits(0)
    try:
        expected = str(n)
    finally:
        sys.set_int_max_str_digits(old)
    assert intmath.int_text(n) == expected
    assert intmath.int_text(-n) == "-" + expected
    assert intmath.int_text(10**5000) == "1" + "0" * 5000
