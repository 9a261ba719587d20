"""3j symbols and Clebsch-Gordan coefficients, exactly (Condon-Shortley phase).

    <j1 m1; j2 m2 | J M> = (-1)**(j1 - j2 + M) * sqrt(2J + 1) * (j1 j2 J; m1 m2 -M)

The 3j comes from Racah's single-sum formula (Edmonds 1957, eq. 3.7.3).  The
ratio of consecutive terms is a ratio of small integers, so a Horner scheme
gives the sum as an integer over a product of factorials, and the square of
the value is reduced once at the end (intmath.reduce_square).  No float.

One cache (functools.lru_cache, CACHE_ENTRIES values) holds (sign, p, q) of
3j symbols with every j <= CACHE_MAX_J, keyed by a classical-symmetry image;
CG values come from it too.
"""

from __future__ import annotations

from functools import lru_cache
from math import gcd

from .. import intmath
from ..intmath import factorials_upto, reduce_square
from ..symmetry import threej_members
from ..triads import is_triad
from ..values import Surd
from . import Kind, Notation, Selection, ZeroRule
from ..spins import parse_j, parse_m
from .common import CACHE_ENTRIES, CACHE_MAX_J, check_count, first_triad_zero, projection_zero

__all__ = ["threej2", "cg2", "THREEJ", "CG", "CACHE_ENTRIES", "CACHE_MAX_J"]

_CACHE_MAX_TJ = 2 * CACHE_MAX_J

_ZERO = Surd._trusted(0, 0, 1)
_GCD_TOP = intmath.GCD_PATH_MAX


def _phase_doubled(t: int) -> int:
    """(-1)**(t/2) for even t: the phase of an integer combination of j's and m's."""
    return -1 if (t >> 1) & 1 else 1


def _threej_square(tj1: int, tj2: int, tj3: int, tm1: int, tm2: int, tm3: int) -> tuple[int, int, int]:
    """(sign, p, q) of an allowed 3j symbol (selection rules already checked)."""
    g = (tj1 + tj2 - tj3) >> 1  # j1 + j2 - j3
    d = (tj1 - tm1) >> 1  # j1 - m1
    e = (tj2 + tm2) >> 1  # j2 + m2
    al = (tj3 - tj2 + tm1) >> 1  # j3 - j2 + m1
    be = (tj3 - tj1 - tm2) >> 1  # j3 - j1 - m2
    kmin = max(0, -al, -be)
    kmax = min(g, d, e)
    if kmin > kmax:
        return 0, 0, 1
    # Horner from the last term down: H_k = 1 - P_k/Q_k * H_{k+1}
    num = den = 1
    for k in range(kmax - 1, kmin - 1, -1):
        q = (k + 1) * (al + k + 1) * (be + k + 1)
        num = q * den - (g - k) * (d - k) * (e - k) * num
        den *= q
    if not num:
        return 0, 0, 1
    sign = (-1 if kmin & 1 else 1) * (1 if num > 0 else -1) * _phase_doubled(tj1 - tj2 - tm3)
    top = (tj1 + tj2 + tj3 + 2) >> 1  # the largest factorial argument below
    if top <= _GCD_TOP:
        # the common small case, inlined: one gcd of multiplied-out factorials
        F = factorials_upto(top)
        n = F[kmax] * F[al + kmax] * F[be + kmax] * F[g - kmin] * F[d - kmin] * F[e - kmin]
        p = (
            num * num * F[g] * F[(tj1 - tj2 + tj3) >> 1] * F[(tj2 + tj3 - tj1) >> 1]
            * F[(tj1 + tm1) >> 1] * F[d] * F[e] * F[(tj2 - tm2) >> 1]
            * F[(tj3 + tm3) >> 1] * F[(tj3 - tm3) >> 1]
        )
        q = n * n * F[top]
        r = gcd(p, q)
        return sign, p // r, q // r
    up = [
        g,
        (tj1 - tj2 + tj3) >> 1,
        (tj2 + tj3 - tj1) >> 1,
        (tj1 + tm1) >> 1,
        d,
        e,
        (tj2 - tm2) >> 1,
        (tj3 + tm3) >> 1,
        (tj3 - tm3) >> 1,
    ]
    lower = [kmax, al + kmax, be + kmax, g - kmin, d - kmin, e - kmin]
    # value = +-num / prod(lower!) * sqrt(prod(up!) / top!)
    p, q = reduce_square(num, up, [top], (), lower)
    return sign, p, q


@lru_cache(maxsize=CACHE_ENTRIES)
def _threej_square_cached(tj1: int, tj2: int, tj3: int, tm1: int, tm2: int, tm3: int) -> tuple[int, int, int]:
    return _threej_square(tj1, tj2, tj3, tm1, tm2, tm3)


def _threej_lookup(tj1: int, tj2: int, tj3: int, tm1: int, tm2: int, tm3: int) -> tuple[int, int, int]:
    """(sign, p, q) through the cache, keyed by a classical-symmetry image.

    Odd column permutations and m -> -m each multiply a 3j by
    (-1)**(j1 + j2 + j3); the key flips m so that the first non-zero m is
    positive, then sorts the columns, and the phase is restored afterwards.
    """
    if tj1 > _CACHE_MAX_TJ or tj2 > _CACHE_MAX_TJ or tj3 > _CACHE_MAX_TJ:
        return _threej_square(tj1, tj2, tj3, tm1, tm2, tm3)
    odd = 0
    if tm1 < 0 or (tm1 == 0 and (tm2 < 0 or (tm2 == 0 and tm3 < 0))):
        tm1, tm2, tm3 = -tm1, -tm2, -tm3
        odd = 1
    a, b, c = (tj1, tm1), (tj2, tm2), (tj3, tm3)
    if a > b:
        a, b = b, a
        odd ^= 1
    if b > c:
        b, c = c, b
        odd ^= 1
        if a > b:
            a, b = b, a
            odd ^= 1
    sign, p, q = _threej_square_cached(a[0], b[0], c[0], a[1], b[1], c[1])
    if odd and (tj1 + tj2 + tj3) & 2:
        sign = -sign
    return sign, p, q


def threej2(tj1: int, tj2: int, tj3: int, tm1: int, tm2: int, tm3: int) -> Surd:
    """(j1 j2 j3; m1 m2 m3) from doubled arguments (2j, 2m), parities already valid."""
    if tm1 + tm2 + tm3 or abs(tm1) > tj1 or abs(tm2) > tj2 or abs(tm3) > tj3 or not is_triad(tj1, tj2, tj3):
        return _ZERO
    sign, p, q = _threej_lookup(tj1, tj2, tj3, tm1, tm2, tm3)
    return Surd._trusted(sign, p, q) if sign else _ZERO


def cg2(tj1: int, tm1: int, tj2: int, tm2: int, tJ: int, tM: int) -> Surd:
    """<j1 m1; j2 m2 | J M> from doubled arguments, parities already valid."""
    if tm1 + tm2 != tM or abs(tm1) > tj1 or abs(tm2) > tj2 or abs(tM) > tJ or not is_triad(tj1, tj2, tJ):
        return _ZERO
    sign, p, q = _threej_lookup(tj1, tj2, tJ, tm1, tm2, -tM)
    if not sign:
        return _ZERO
    # times (-1)**(j1 - j2 + M) * sqrt(2J + 1)
    n = tJ + 1
    g = gcd(n, q)
    return Surd._trusted(sign * _phase_doubled(tj1 - tj2 + tM), p * (n // g), q // g)


# -- zero rules ------------------------------------------------------------------
_THREEJ_NAMES = ("j1", "j2", "j3", "m1", "m2", "m3")
_CG_NAMES = ("j1", "m1", "j2", "m2", "J", "M")
_THREEJ_RULES = Selection(triads=((0, 1, 2),), projections=((0, 3), (1, 4), (2, 5)), m_sum=(0, 0, 0, 1, 1, 1))
_CG_RULES = Selection(triads=((0, 2, 4),), projections=((0, 1), (2, 3), (4, 5)), m_sum=(0, 1, 0, 1, 0, -1))


def _threej_rule(t: tuple[int, ...]) -> "ZeroRule | None":
    """The rule that makes a 3j zero, checked in reading order (the cancellation last)."""
    tj1, tj2, tj3, tm1, tm2, tm3 = t
    rule = first_triad_zero(t, _THREEJ_NAMES, _THREEJ_RULES.triads) or projection_zero(
        ((tj1, tm1, "m1"), (tj2, tm2, "m2"), (tj3, tm3, "m3")), tm1 + tm2 + tm3, "m1 + m2 + m3 != 0"
    )
    odd = (tj1 + tj2 + tj3) & 2
    if rule is None and odd and tm1 == tm2 == tm3 == 0:
        rule = ZeroRule("parity", "all m are 0 and j1 + j2 + j3 is odd")
    if rule is None and odd and len({(tj1, tm1), (tj2, tm2), (tj3, tm3)}) < 3:
        rule = ZeroRule("symmetry", "two equal columns and j1 + j2 + j3 odd")
    if rule is None and not threej2(*t):
        rule = _CANCELLATION
    return rule


def _cg_rule(t: tuple[int, ...]) -> "ZeroRule | None":
    tj1, tm1, tj2, tm2, tJ, tM = t
    rule = first_triad_zero(t, _CG_NAMES, _CG_RULES.triads) or projection_zero(
        ((tj1, tm1, "m1"), (tj2, tm2, "m2"), (tJ, tM, "M")), tm1 + tm2 - tM, "m1 + m2 != M"
    )
    return rule or _threej_rule((tj1, tj2, tJ, tm1, tm2, -tM))


def _parse_cg(values, max_j=None) -> tuple[int, ...]:
    """Doubled (j1, m1, j2, m2, J, M): the j's first, then each m against its j."""
    check_count("cg", _CG_NAMES, values)
    j1, m1, j2, m2, J, M = values
    tj1 = parse_j(j1, "j1", max_j)
    tj2 = parse_j(j2, "j2", max_j)
    tJ = parse_j(J, "J", max_j)
    return (
        tj1, parse_m(m1, "m1", tj1, "j1", max_j),
        tj2, parse_m(m2, "m2", tj2, "j2", max_j),
        tJ, parse_m(M, "M", tJ, "J", max_j),
    )


def _parse_threej(values, max_j=None) -> tuple[int, ...]:
    """Doubled (j1, j2, j3, m1, m2, m3): the j's first, then each m against its j."""
    check_count("3j", _THREEJ_NAMES, values)
    j1, j2, j3, m1, m2, m3 = values
    tj1 = parse_j(j1, "j1", max_j)
    tj2 = parse_j(j2, "j2", max_j)
    tj3 = parse_j(j3, "j3", max_j)
    return (
        tj1, tj2, tj3,
        parse_m(m1, "m1", tj1, "j1", max_j),
        parse_m(m2, "m2", tj2, "j2", max_j),
        parse_m(m3, "m3", tj3, "j3", max_j),
    )


_CANCELLATION = ZeroRule("cancellation", "every selection rule holds, but the Racah sum is exactly 0")

# one value with every j <= 5000 takes at most ~0.5 s (3j(5000 5000 5000; 1 -1 0), measured),
# growing about like j**2
_LIMITS = {"max_j": 5000, "cost_power": 2, "seconds_at_max_j": 0.5}

CG = Kind(
    key="cg",
    convention="Condon-Shortley phase",
    title="Clebsch–Gordan coefficient",
    arguments=_CG_NAMES,
    j_positions=(0, 2, 4),
    parse=_parse_cg,
    doubled=cg2,
    zero_rule=_cg_rule,
    notation=Notation("braket", ((0, 1), (2, 3), (4, 5))),
    selection=_CG_RULES,
    **_LIMITS,
)
THREEJ = Kind(
    key="3j",
    convention="Condon-Shortley phase",
    title="Wigner 3j symbol",
    arguments=_THREEJ_NAMES,
    j_positions=(0, 1, 2),
    parse=_parse_threej,
    doubled=threej2,
    zero_rule=_threej_rule,
    notation=Notation("array", ((0, 1, 2), (3, 4, 5)), "()"),
    members=threej_members,
    selection=_THREEJ_RULES,
    **_LIMITS,
)
