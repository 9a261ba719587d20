"""9j symbols, exactly.

The 9j is the sum over x of (-1)**(2x) (2x+1) times three 6j symbols
(Edmonds 1957, eq. 6.4.3).  In each product the x-dependent triangle factors
appear squared, so only the six row and column triads stay under the root
and the sum over x is a sum of rationals.
"""

from __future__ import annotations

from functools import lru_cache

from ..intmath import factorial
from ..symmetry import ninej_members
from ..triads import is_triad
from ..values import Surd
from . import Kind, Notation, ZeroRule
from .common import first_triad_zero, parse_js
from .sixj import sixj_invariants, sixj_racah_sum
from .threej import CACHE_ENTRIES, CACHE_MAX_J

__all__ = ["ninej2", "NINEJ"]

_CACHE_MAX_TJ = 2 * CACHE_MAX_J
_ZERO = Surd._trusted(0, 0, 1)
#: argument positions of the rows, then the columns
_TRIADS = ((0, 1, 2), (3, 4, 5), (6, 7, 8), (0, 3, 6), (1, 4, 7), (2, 5, 8))


def _delta_square(ta: int, tb: int, tc: int) -> Fraction:
    from fractions import Fraction  # here, not at import: a cg or 6j lookup never needs it

    return Fraction(
        factorial((ta + tb - tc) >> 1) * factorial((ta - tb + tc) >> 1) * factorial((tb + tc - ta) >> 1),
        factorial((ta + tb + tc + 2) >> 1),
    )


def _racah_rational(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> Fraction:
    """The 6j divided by its four triangle factors: a rational number."""
    sign, num, up, down = sixj_racah_sum(*sixj_invariants(ta, tb, tc, td, te, tf))
    n = sign * num
    for x in up:
        n *= factorial(x)
    d = 1
    for x in down:
        d *= factorial(x)
    from fractions import Fraction

    return Fraction(n, d)


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
    """
    tj11, tj12, tj13, tj21, tj22, tj23, tj31, tj32, tj33 = t
    lo = max(abs(tj11 - tj33), abs(tj21 - tj32), abs(tj12 - tj23))
    hi = min(tj11 + tj33, tj21 + tj32, tj12 + tj23)
    from fractions import Fraction

    total = Fraction(0)
    for x in range(lo, hi + 1, 2):
        term = (
            _delta_square(tj11, tj33, x)
            * _delta_square(tj21, tj32, x)
            * _delta_square(tj12, tj23, x)
            * _racah_rational(tj11, tj21, tj31, tj32, tj33, x)
            * _racah_rational(tj12, tj22, tj32, tj21, x, tj23)
            * _racah_rational(tj13, tj23, tj33, x, tj11, tj12)
        )
        total += -(x + 1) * term if x & 1 else (x + 1) * term
    if not total:
        return 0, 0, 1
    pre = (
        _delta_square(tj11, tj12, tj13)
        * _delta_square(tj21, tj22, tj23)
        * _delta_square(tj31, tj32, tj33)
        * _delta_square(tj11, tj21, tj31)
        * _delta_square(tj12, tj22, tj32)
        * _delta_square(tj13, tj23, tj33)
    )
    square = pre * total * total
    return (1 if total > 0 else -1), square.numerator, square.denominator


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
    title="Wigner 9j symbol",
    arguments=_NAMES,
    j_positions=tuple(range(9)),
    parse=_parse_ninej,
    doubled=ninej2,
    zero_rule=_ninej_rule,
    notation=Notation("array", ((0, 1, 2), (3, 4, 5), (6, 7, 8)), "{}"),
    members=ninej_members,
    triads=_TRIADS,
    max_j=200,  # all nine j = 200 takes ~0.5 s (measured); time grows about like j**3
    cost_power=3,
    seconds_at_max_j=0.5,
)
