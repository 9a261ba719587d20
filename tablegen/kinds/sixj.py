"""6j symbols and Racah W coefficients, exactly, and the one 6j <-> W mapping.

    W(a b c d; e f) = (-1)**(a + b + c + d) * {a b e; d c f}

The 6j comes from Racah's formula written with the four triad sums alpha and
the three quadrangle sums beta (Edmonds 1957, eq. 6.3.7).  The value depends
only on the multisets {alpha} and {beta}: that is the 144-element (Regge)
symmetry, no phase involved, and the cache keys on the sorted sums.
"""

from __future__ import annotations

from functools import lru_cache
from math import gcd

from .. import intmath
from ..intmath import factorials_upto, reduce_square
from ..symmetry import sixj_members
from ..triads import sixj_sums
from ..values import Surd
from . import Kind, Notation, Selection, ZeroRule
from .common import CACHE_ENTRIES, CACHE_MAX_J, first_triad_zero, parse_js

__all__ = [
    "sixj2",
    "racah_w2",
    "sixj_invariants",
    "sixj_racah_sum",
    "sixj_of_w",
    "w_of_sixj",
    "SIXJ",
    "RACAH_W",
]

_CACHE_MAX_TJ = 2 * CACHE_MAX_J
_ZERO = Surd._trusted(0, 0, 1)
_GCD_TOP = intmath.GCD_PATH_MAX


# -- the one 6j <-> W mapping ----------------------------------------------------
def sixj_of_w(t: tuple[int, ...]) -> tuple[tuple[int, ...], int]:
    """(6j arguments, sign) with W(a b c d; e f) = sign * {a b e; d c f}; doubled arguments."""
    a, b, c, d, e, f = t
    return (a, b, e, d, c, f), (-1 if (a + b + c + d) & 2 else 1)


def w_of_sixj(t: tuple[int, ...]) -> tuple[tuple[int, ...], int]:
    """(W arguments, sign) with {j1 j2 j3; j4 j5 j6} = sign * W(j1 j2 j5 j4; j3 j6); the inverse of sixj_of_w."""
    j1, j2, j3, j4, j5, j6 = t
    return (j1, j2, j5, j4, j3, j6), (-1 if (j1 + j2 + j5 + j4) & 2 else 1)


# -- the Racah sum -----------------------------------------------------------------
def sixj_invariants(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> tuple[tuple[int, ...], tuple[int, ...]]:
    """Sorted triad sums (4) and quadrangle sums (3) of a 6j, as integers (halves of the doubled sums)."""
    s = sixj_sums(ta, tb, tc, td, te, tf)
    return tuple(sorted((s[0] >> 1, s[1] >> 1, s[2] >> 1, s[3] >> 1))), tuple(sorted((s[4] >> 1, s[5] >> 1, s[6] >> 1)))


def sixj_racah_sum(al: tuple[int, ...], be: tuple[int, ...]) -> tuple[int, int, list[int], list[int]]:
    """The Racah sum of an allowed 6j as sign * num * prod(up!) / prod(down!)."""
    a1, a2, a3, a4 = al
    b1, b2, b3 = be
    kmin = max(al)
    kmax = min(be)
    num = den = 1
    for k in range(kmax - 1, kmin - 1, -1):
        q = (k + 1 - a1) * (k + 1 - a2) * (k + 1 - a3) * (k + 1 - a4)
        num = q * den - (k + 2) * (b1 - k) * (b2 - k) * (b3 - k) * num
        den *= q
    sign = -1 if kmin & 1 else 1
    up = [kmin + 1]
    down = [kmax - a1, kmax - a2, kmax - a3, kmax - a4, b1 - kmin, b2 - kmin, b3 - kmin]
    return sign, num, up, down


def _sixj_square(al: tuple[int, ...], be: tuple[int, ...]) -> tuple[int, int, int]:
    """(sign, p, q) of an allowed 6j from its invariants."""
    sign, num, up, down = sixj_racah_sum(al, be)
    if not num:
        return 0, 0, 1
    if num < 0:
        sign = -sign
    # prefactor: prod over triads of Delta^2 = prod_{i,j} (beta_j - alpha_i)! / prod_i (alpha_i + 1)!
    a1, a2, a3, a4 = al
    b1, b2, b3 = be
    if b3 <= _GCD_TOP:  # the common small case, inlined
        F = factorials_upto(b3 + 1)
        n = num * F[up[0]]
        d = F[down[0]] * F[down[1]] * F[down[2]] * F[down[3]] * F[down[4]] * F[down[5]] * F[down[6]]
        p = (
            n * n * F[b1 - a1] * F[b2 - a1] * F[b3 - a1] * F[b1 - a2] * F[b2 - a2] * F[b3 - a2]
            * F[b1 - a3] * F[b2 - a3] * F[b3 - a3] * F[b1 - a4] * F[b2 - a4] * F[b3 - a4]
        )
        q = d * d * F[a1 + 1] * F[a2 + 1] * F[a3 + 1] * F[a4 + 1]
        r = gcd(p, q)
        return sign, p // r, q // r
    pre_up = [b - a for a in al for b in be]
    pre_down = [a + 1 for a in al]
    p, q = reduce_square(num, pre_up, pre_down, up, down)
    return sign, p, q


def _sixj_value(al: tuple[int, ...], be: tuple[int, ...]) -> Surd:
    sign, p, q = _sixj_square(al, be)
    return Surd._trusted(sign, p, q) if sign else _ZERO


_sixj_value_cached = lru_cache(maxsize=CACHE_ENTRIES)(_sixj_value)


def sixj2(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> Surd:
    """{j1 j2 j3; j4 j5 j6} from doubled arguments."""
    s1, s2, s3, s4, b1, b2, b3 = sixj_sums(ta, tb, tc, td, te, tf)
    if (s1 | s2 | s3 | s4) & 1:
        return _ZERO
    al = tuple(sorted((s1 >> 1, s2 >> 1, s3 >> 1, s4 >> 1)))
    be = tuple(sorted((b1 >> 1, b2 >> 1, b3 >> 1)))
    if be[0] < al[3]:  # the triangle rule of all four triads (see triads.sixj_sums)
        return _ZERO
    if be[2] <= _CACHE_MAX_TJ:  # a beta is a sum of four j's, so all are small here
        return _sixj_value_cached(al, be)
    return _sixj_value(al, be)


def racah_w2(ta: int, tb: int, tc: int, td: int, te: int, tf: int) -> Surd:
    """W(a b c d; e f) from doubled arguments, through sixj_of_w."""
    args, sign = sixj_of_w((ta, tb, tc, td, te, tf))
    value = sixj2(*args)
    return -value if sign < 0 else value


# -- zero rules ---------------------------------------------------------------------
_SIXJ_NAMES = ("j1", "j2", "j3", "j4", "j5", "j6")
_W_NAMES = ("a", "b", "c", "d", "e", "f")
_SIXJ_TRIADS = ((0, 1, 2), (0, 4, 5), (3, 1, 5), (3, 4, 2))  # the triads of triads.sixj_sums, in its order
_CANCELLATION = ZeroRule("cancellation", "every selection rule holds, but the Racah sum is exactly 0")


def _sixj_rule(t: tuple[int, ...]) -> "ZeroRule | None":
    rule = first_triad_zero(t, _SIXJ_NAMES, _SIXJ_TRIADS)
    if rule is None and not sixj2(*t):
        rule = _CANCELLATION
    return rule


def _w_positions() -> tuple[tuple[int, int, int], ...]:
    """The 6j triads as W argument positions: W position of each 6j argument, via w_of_sixj."""
    w_args, _ = w_of_sixj(tuple(range(6)))  # w_args[k] = 6j position found at W position k
    where = {six: k for k, six in enumerate(w_args)}
    return tuple(tuple(where[i] for i in triad) for triad in _SIXJ_TRIADS)


_W_TRIADS = _w_positions()  # (a b e), (a c f), (d b f), (d c e)


def _w_rule(t: tuple[int, ...]) -> "ZeroRule | None":
    rule = first_triad_zero(t, _W_NAMES, _W_TRIADS)
    if rule is None and not racah_w2(*t):
        rule = _CANCELLATION
    return rule


def _parse_sixj(values, max_j=None) -> tuple[int, ...]:
    return parse_js("6j", _SIXJ_NAMES, values, max_j)


def _parse_w(values, max_j=None) -> tuple[int, ...]:
    return parse_js("w", _W_NAMES, values, max_j)


# one value with every j <= 5000 takes at most ~0.8 s (all six j = 5000, measured), about like j**2
_LIMITS = {"max_j": 5000, "cost_power": 2, "seconds_at_max_j": 0.8}

SIXJ = Kind(
    key="6j",
    convention="no phase choice of its own: the recoupling of Condon-Shortley coupled states fixes it, sign included",
    title="Wigner 6j symbol",
    arguments=_SIXJ_NAMES,
    j_positions=(0, 1, 2, 3, 4, 5),
    parse=_parse_sixj,
    doubled=sixj2,
    zero_rule=_sixj_rule,
    notation=Notation("array", ((0, 1, 2), (3, 4, 5)), "{}"),
    members=sixj_members,
    selection=Selection(triads=_SIXJ_TRIADS),
    **_LIMITS,
)
RACAH_W = Kind(
    key="w",
    convention="Racah's W(a b c d; e f) = (-1)^(a+b+c+d) {a b e; d c f}",
    title="Racah W coefficient",
    arguments=_W_NAMES,
    j_positions=(0, 1, 2, 3, 4, 5),
    parse=_parse_w,
    doubled=racah_w2,
    zero_rule=_w_rule,
    notation=Notation("function", ((0, 1, 2, 3), (4, 5)), name="W"),
    selection=Selection(triads=_W_TRIADS),
    **_LIMITS,
)
