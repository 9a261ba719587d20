"""9j symbols, exactly.

The 9j is the sum over x of (-1)**(2x) (2x+1) times three 6j symbols
(Edmonds 1957, eq. 6.4.3).  In each product the x-dependent triangle factors
appear squared, so only the six row and column triads stay under the root
and the sum over x is a sum of rationals.
"""

from __future__ import annotations

from functools import lru_cache
from math import gcd

from ..intmath import factorials_upto
from ..symmetry import ninej_members
from ..triads import is_triad
from ..values import Surd
from . import Kind, Notation, Selection, ZeroRule
from .common import CACHE_ENTRIES, CACHE_MAX_J, first_triad_zero, parse_js
from .sixj import sixj_invariants, sixj_racah_sum

__all__ = ["ninej2", "NINEJ"]

_CACHE_MAX_TJ = 2 * CACHE_MAX_J
_ZERO = Surd._trusted(0, 0, 1)
#: argument positions of the rows, then the columns
_TRIADS = ((0, 1, 2), (3, 4, 5), (6, 7, 8), (0, 3, 6), (1, 4, 7), (2, 5, 8))


def _delta_square(ta: int, tb: int, tc: int, F: list[int]) -> tuple[int, int]:
    """The triangle factor squared of a triad, as (numerator, denominator) factorial products."""
    return (
        F[(ta + tb - tc) >> 1] * F[(ta - tb + tc) >> 1] * F[(tb + tc - ta) >> 1],
        F[(ta + tb + tc + 2) >> 1],
    )


@lru_cache(maxsize=CACHE_ENTRIES)
def _ninej_square(*t: int) -> tuple[int, int, int]:
    """(sign, p, q) of a 9j whose six row and column triads all hold (doubled arguments).

    Why every term of the sum below is an allowed product, with no check:
    x runs from lo to hi in steps of 2, so each pair (tj11, tj33), (tj21, tj32),
    (tj12, tj23) forms a triangle with x.  The parities agree: rows and
    columns have even doubled sums, so tj11 + tj33 = (tj11 + tj12 + tj13) +
    (tj13 + tj23 + tj33) - tj12 - tj23 - 2*tj13 has the parity of tj12 + tj23,
    and likewise (column 1 and row 3) of tj21 + tj32; lo = |a - b| for one of
    these pairs, so lo + tj11 + tj33 is even and every x closes each triad.
    The twelve triads of the three 6j's are then those x-triads and the six
    row and column triads: {tj11 tj21 tj31; tj32 tj33 x} has (column 1),
    (tj11 tj33 x), (tj32 tj21 x), (row 3); {tj12 tj22 tj32; tj21 x tj23} has
    (column 2), (tj12 x tj23), (row 2), (tj21 x tj32); {tj13 tj23 tj33; x tj11
    tj12} has (column 3), (row 1), (x tj23 tj12), (x tj11 tj33).

    Each term is an integer over a product of factorials; the sum is kept as
    one integer fraction over the least common denominator so far (no
    Fraction objects on this path), reduced once at the end.
    """
    tj11, tj12, tj13, tj21, tj22, tj23, tj31, tj32, tj33 = t
    lo = max(abs(tj11 - tj33), abs(tj21 - tj32), abs(tj12 - tj23))
    hi = min(tj11 + tj33, tj21 + tj32, tj12 + tj23)
    # every factorial argument below is at most a quadrangle sum + 1 <= 2 * (largest doubled j) + 1
    F = factorials_upto(2 * max(max(t), hi) + 2)
    total_n, total_d = 0, 1
    for x in range(lo, hi + 1, 2):
        n, d = x + 1, 1
        for ta, tb in ((tj11, tj33), (tj21, tj32), (tj12, tj23)):
            dn, dd = _delta_square(ta, tb, x, F)
            n *= dn
            d *= dd
        for args in (
            (tj11, tj21, tj31, tj32, tj33, x),
            (tj12, tj22, tj32, tj21, x, tj23),
            (tj13, tj23, tj33, x, tj11, tj12),
        ):
            al, be = sixj_invariants(*args)
            rn, rd = _racah_part_cached(al, be) if be[2] <= _CACHE_MAX_TJ else _racah_part(al, be)
            if not rn:
                break
            n *= rn
            d *= rd
        else:
            if x & 1:
                n = -n
            g = gcd(total_d, d)  # add n/d over the least common denominator
            total_n = total_n * (d // g) + n * (total_d // g)
            total_d *= d // g
    if not total_n:
        return 0, 0, 1
    pre_n, pre_d = 1, 1
    for i, k, m in _TRIADS:
        dn, dd = _delta_square(t[i], t[k], t[m], F)
        pre_n *= dn
        pre_d *= dd
    p, q = pre_n * total_n * total_n, pre_d * total_d * total_d
    r = gcd(p, q)
    return (1 if total_n > 0 else -1), p // r, q // r


def _racah_part(al: tuple[int, ...], be: tuple[int, ...]) -> tuple[int, int]:
    """A 6j over its four triangle factors, as (numerator, denominator): its Racah sum with the factorials.

    Keyed by the 6j's invariants, so all 144 forms of one 6j share an entry:
    the 6j's inside the sums of a file of 9j symbols repeat often.
    """
    sign, num, up, down = sixj_racah_sum(al, be)
    F = factorials_upto(be[2] + 1)  # kmin + 1 <= min(beta) + 1 and every down term <= max(beta)
    return sign * num * _product(F, up), _product(F, down)


_racah_part_cached = lru_cache(maxsize=CACHE_ENTRIES)(_racah_part)


def _product(F: list[int], args: list[int]) -> int:
    out = 1
    for a in args:
        out *= F[a]
    return out


def ninej2(*t: int) -> Surd:
    """The 9j symbol from nine doubled arguments, rows in order."""
    if len(t) != 9:
        raise TypeError(f"ninej2 takes 9 doubled arguments, got {len(t)}")
    for i, k, n in _TRIADS:
        if not is_triad(t[i], t[k], t[n]):
            return _ZERO
    if max(t) <= _CACHE_MAX_TJ:
        sign, p, q = _ninej_square(*t)
    else:
        sign, p, q = _ninej_square.__wrapped__(*t)
    return Surd._trusted(sign, p, q) if sign else _ZERO


# -- zero rule ------------------------------------------------------------------------
_NAMES = ("j11", "j12", "j13", "j21", "j22", "j23", "j31", "j32", "j33")
_CANCELLATION = ZeroRule("cancellation", "every selection rule holds, but the Racah sum is exactly 0")
_ODD_SWAP = ZeroRule("symmetry", "two equal rows or columns and an odd sum of all nine j")


def _odd_swap_zero(t: tuple[int, ...]) -> bool:
    """A 9j with two equal rows (or columns) and an odd total is zero by symmetry."""
    if sum(t) & 2 == 0:
        return False
    rows = (t[0:3], t[3:6], t[6:9])
    cols = (t[0::3], t[1::3], t[2::3])
    return len(set(rows)) < 3 or len(set(cols)) < 3


def _ninej_rule(t: tuple[int, ...]) -> "ZeroRule | None":
    rule = first_triad_zero(t, _NAMES, _TRIADS)
    if rule is None and _odd_swap_zero(t):
        rule = _ODD_SWAP
    if rule is None and not ninej2(*t):
        rule = _CANCELLATION
    return rule


def _parse_ninej(values, max_j=None) -> tuple[int, ...]:
    return parse_js("9j", _NAMES, values, max_j)


NINEJ = Kind(
    key="9j",
    convention="no phase choice of its own: the recoupling of Condon-Shortley coupled states fixes it, sign included",
    title="Wigner 9j symbol",
    arguments=_NAMES,
    j_positions=tuple(range(9)),
    parse=_parse_ninej,
    doubled=ninej2,
    zero_rule=_ninej_rule,
    notation=Notation("array", ((0, 1, 2), (3, 4, 5), (6, 7, 8)), "{}"),
    members=ninej_members,
    selection=Selection(triads=_TRIADS),
    max_j=200,  # all nine j = 200 takes ~0.5 s (measured); time grows about like j**3
    cost_power=3,
    seconds_at_max_j=0.5,
)
