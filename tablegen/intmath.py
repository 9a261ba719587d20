"""Integer kernels under the coefficient formulas: no floats, no dependencies.

Everything here works on Python ints.  The factorial table and the prime
sieve are the only caches; both grow on demand and are bounded by the largest
argument ever asked for, which the quantum-number size limit keeps finite
(see :data:`tablegen.spins.DEFAULT_MAX_J`): a table of n! for n <= N costs
about N**2 * 0.6 bytes (N = 4002 for j = 1000: ~10 MB).
"""

from __future__ import annotations

from math import isqrt

__all__ = [
    "GCD_PATH_MAX",
    "int_text",
    "is_probable_prime",
    "factorial",
    "factorials_upto",
    "primes_upto",
    "factorial_exponent",
    "reduce_square",
    "prime_exponents",
    "split_square",
]

_FACTORIALS: list[int] = [1]
_PRIMES: list[int] = []
_SIEVE_LIMIT = 1

#: Up to this largest factorial argument, one gcd of the multiplied-out integers
#: reduces p/q faster than prime exponents do (measured on CPython 3.11): the
#: formulas take that path themselves and call reduce_square only above it.
GCD_PATH_MAX = 400


def factorial(n: int) -> int:
    """n! from a growing table (n >= 0, already checked by the caller)."""
    table = _FACTORIALS
    if n >= len(table):
        value = table[-1]
        for i in range(len(table), n + 1):
            value *= i
            table.append(value)
    return table[n]


def factorials_upto(n: int) -> list[int]:
    """The factorial table, grown so that table[k] = k! for every k <= n.

    The list itself is returned (not a copy) for the formulas' inner loops:
    read it, never change it.
    """
    table = _FACTORIALS
    if n >= len(table):
        factorial(n)
    return table


def primes_upto(n: int) -> list[int]:
    """All primes <= n, from a sieve that is extended when needed."""
    global _PRIMES, _SIEVE_LIMIT
    if n > _SIEVE_LIMIT:
        limit = max(n, 2 * _SIEVE_LIMIT)
        flags = bytearray([1]) * (limit + 1)
        flags[0:2] = b"\x00\x00"
        for p in range(2, isqrt(limit) + 1):
            if flags[p]:
                flags[p * p :: p] = bytes(len(range(p * p, limit + 1, p)))
        _PRIMES = [i for i, f in enumerate(flags) if f]
        _SIEVE_LIMIT = limit
    if n >= _SIEVE_LIMIT:
        return _PRIMES
    from bisect import bisect_right  # here: a small lookup never factors (start-up time)

    return _PRIMES[: bisect_right(_PRIMES, n)]


def factorial_exponent(n: int, p: int) -> int:
    """Exponent of the prime p in n! (Legendre's formula)."""
    e = 0
    while n:
        n //= p
        e += n
    return e


def reduce_square(
    num: int,
    once_up: list[int],
    once_down: list[int],
    twice_up: list[int] = (),
    twice_down: list[int] = (),
) -> tuple[int, int]:
    """Reduce a square of the form below to coprime (p, q).

        (num * prod(twice_up!) / prod(twice_down!))**2 * prod(once_up!) / prod(once_down!)

    The coefficient formulas end here for large arguments (above GCD_PATH_MAX;
    below it they multiply out and take one gcd themselves): the square of a
    value is the square of an integer Racah sum times a ratio of factorials,
    and working with prime exponents (Legendre's formula) never multiplies the
    huge factorials out in full.
    """
    top = max(max(once_up, default=0), max(once_down, default=0),
              max(twice_up, default=0), max(twice_down, default=0))
    num = abs(num)
    num_pos: list[int] = []
    den_pos: list[int] = []
    for prime in primes_upto(top):
        e = 0
        for k in once_up:
            e += factorial_exponent(k, prime)
        for k in once_down:
            e -= factorial_exponent(k, prime)
        for k in twice_up:
            e += 2 * factorial_exponent(k, prime)
        for k in twice_down:
            e -= 2 * factorial_exponent(k, prime)
        if e < 0 and num % prime == 0:
            # cancel factors of the Racah sum against the denominator
            num, k = _strip(num, prime, (1 - e) // 2)
            e += 2 * k
        if e > 0:
            num_pos.append(prime**e)
        elif e < 0:
            den_pos.append(prime ** (-e))
    return num * num * _tree_product(num_pos), _tree_product(den_pos)


def _strip(n: int, p: int, cap: int) -> tuple[int, int]:
    """Divide n by p as often as it goes, at most cap times; galloping chunks."""
    k = 0
    chunk = 1
    while cap > 0:
        c = min(chunk, cap)
        q, r = divmod(n, p**c)
        if r:
            if c == 1:
                break
            chunk = 1
            continue
        n, k, cap, chunk = q, k + c, cap - c, chunk * 2
    return n, k


def _tree_product(values: list[int]) -> int:
    """Product of many ints, pairing similar sizes (faster than a left fold)."""
    if not values:
        return 1
    while len(values) > 1:
        paired = [values[i] * values[i + 1] for i in range(0, len(values) - 1, 2)]
        if len(values) % 2:
            paired.append(values[-1])
        values = paired
    return values[0]


_TRIAL_BOUND = 20_011  # covers every prime of a factorial ratio within the kinds' one-value limits (j <= 5000: arguments up to 4j + 1)
_MR_BASES = (2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41)


def is_probable_prime(n: int) -> bool:
    """Miller-Rabin with the first 13 prime bases.

    Deterministic below 3.3e24; above that a composite passes with
    probability below 4**-13 (and never one with a repeated prime factor
    larger than the bases, in practice).
    """
    if n < 2:
        return False
    for p in _MR_BASES:
        if n % p == 0:
            return n == p
    d, s = n - 1, 0
    while not d & 1:
        d >>= 1
        s += 1
    for a in _MR_BASES:
        x = pow(a, d, n)
        if x in (1, n - 1):
            continue
        for _ in range(s - 1):
            x = x * x % n
            if x == n - 1:
                break
        else:
            return False
    return True


def _trial(n: int) -> tuple[dict[int, int], int]:
    """Small-prime part of n as {prime: exponent} and the cofactor left over."""
    out: dict[int, int] = {}
    for p in primes_upto(min(_TRIAL_BOUND, isqrt(n))):  # sieve no further than needed
        if p * p > n:
            break
        if n % p == 0:
            e = 0
            while n % p == 0:
                n //= p
                e += 1
            out[p] = e
    return out, n


def _cofactor_exponents(r: int) -> dict[int, int]:
    """Factor a cofactor with no prime below the trial bound.

    Perfect powers and primes are recognised directly; only a composite that
    is neither is handed to sympy (imported lazily).  The engine's values
    never need sympy: their large factors come from the square of the
    integer Racah sum, so the cofactor is a perfect square.
    """
    if r == 1:
        return {}
    if r < _TRIAL_BOUND * _TRIAL_BOUND or is_probable_prime(r):
        return {r: 1}
    root = isqrt(r)
    if root * root == r:
        return {p: 2 * e for p, e in _cofactor_exponents(root).items()}
    from sympy import factorint  # rare: a composite, non-square cofactor

    return {int(p): int(e) for p, e in factorint(r).items()}


def prime_exponents(n: int) -> dict[int, int]:
    """Prime factorisation of n >= 1 as {prime: exponent}, primes ascending.

    Trial division finds every factor a factorial ratio can contribute; what
    is left (only from the integer Racah sum) may take real factoring, which
    can be slow for symbols with j in the hundreds.
    """
    if n < 1:
        raise ValueError(f"prime_exponents needs n >= 1, got {n}")
    out, rest = _trial(n)
    for p, e in _cofactor_exponents(rest).items():
        out[p] = out.get(p, 0) + e
    return dict(sorted(out.items()))


def split_square(n: int) -> tuple[int, int]:
    """Write n >= 1 as a**2 * b with b square-free; return (a, b).

    Needs the square-free part only, so a large cofactor that is a perfect
    square or a prime is never factored further.
    """
    r = isqrt(n)
    if r * r == n:
        return r, 1
    small, rest = _trial(n)
    a = b = 1
    for p, e in small.items():
        a *= p ** (e // 2)
        if e % 2:
            b *= p
    root = isqrt(rest)
    if root * root == rest:
        return a * root, b
    if rest < _TRIAL_BOUND * _TRIAL_BOUND or is_probable_prime(rest):
        return a, b * rest
    for p, e in _cofactor_exponents(rest).items():
        a *= p ** (e // 2)
        if e % 2:
            b *= p
    return a, b


_STR_SAFE = 1 << 13000  # about 3,900 decimal digits: str() always accepts these


def int_text(n: int) -> str:
    """Decimal text of any int, also beyond CPython's 4300-digit str() limit."""
    if -_STR_SAFE < n < _STR_SAFE:
        return str(n)
    if n < 0:
        return "-" + int_text(-n)
    # divide and conquer on a power of ten of about half the length
    half = (n.bit_length() * 30103 // 100000) // 2
    high, low = divmod(n, 10**half)
    return int_text(high) + int_text(low).rjust(half, "0")
